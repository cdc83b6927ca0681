# Setcard. `make serve` builds the site and serves it with the demo project;
# `make test` runs every test the project has.
GO ?= go
STATICCHECK := $(CURDIR)/.cache/bin/staticcheck
WASMPATH := $(shell $(GO) env GOROOT)/lib/wasm
UNIT_PKGS = $$($(GO) list ./... | grep -v /scripts/e2e)

.PHONY: test check unit wasmtest e2e serve site bench clean

# Every test: formatting and static checks, the Go tests natively and under
# WebAssembly, and the browser suite in Chromium.
test: check unit wasmtest e2e

check:
	@test -z "$$(gofmt -l .)" || { echo "gofmt needed:"; gofmt -l .; exit 1; }
	$(GO) vet ./...
	GOOS=js GOARCH=wasm $(GO) vet ./...
	GOBIN=$(CURDIR)/.cache/bin $(GO) install honnef.co/go/tools/cmd/staticcheck@v0.8.2
	$(STATICCHECK) ./...
	GOOS=js GOARCH=wasm $(STATICCHECK) ./wasm/...
	@! $(GO) list -deps ./calc/... | grep -q '\.' || { echo "calc must import only the standard library:"; $(GO) list -deps ./calc/... | grep '\.'; exit 1; }
	@cmp -s wasm/demo.json testdata/demo.json || { echo "wasm/demo.json differs from testdata/demo.json: cp testdata/demo.json wasm/"; exit 1; }

unit:
	$(GO) test -count=1 $(UNIT_PKGS)

wasmtest:
	PATH="$$PATH:$(WASMPATH)" GOOS=js GOARCH=wasm $(GO) test -count=1 ./calc/... ./wasm/session/ ./wasm/tess/

# The browser suite: builds the site, serves it on 127.0.0.1 and drives
# Chromium. It fails, saying how to install it, when Chromium is missing.
e2e:
	$(GO) test -count=1 -timeout 40m ./scripts/e2e/

site:
	$(GO) run ./scripts/build -o dist

serve: site
	$(GO) run ./scripts/serve -dir dist

bench:
	$(GO) test -run '^$$' -bench . -benchmem ./calc/... ./wasm/session/

clean:
	rm -rf dist test-evidence
