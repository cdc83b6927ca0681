# Setcard. `make serve` builds the site and serves it with the demo project;
# `make test` runs every test the project has.
GO ?= go
STATICCHECK ?= $(GO) run honnef.co/go/tools/cmd/staticcheck@v0.8.2
WASMPATH := $(shell $(GO) env GOROOT)/lib/wasm

.PHONY: test check unit wasmtest vet serve site bench clean

test: check unit wasmtest

check:
	@test -z "$$(gofmt -l .)" || { echo "gofmt needed:"; gofmt -l .; exit 1; }
	$(GO) vet ./...
	GOOS=js GOARCH=wasm $(GO) vet ./...
	$(STATICCHECK) ./...
	@! $(GO) list -deps ./calc/... | grep -q '\.' || { echo "calc must import only the standard library:"; $(GO) list -deps ./calc/... | grep '\.'; exit 1; }

unit:
	$(GO) test -count=1 ./...

wasmtest:
	PATH="$$PATH:$(WASMPATH)" GOOS=js GOARCH=wasm $(GO) test -count=1 ./calc/...

bench:
	$(GO) test -run '^$$' -bench . -benchmem ./calc/...

serve:
	$(GO) run ./scripts/setcard table testdata/demo.json

clean:
	rm -rf dist
