package main

import (
	"bytes"
	"fmt"
	"io"
	"path"
	"regexp"
	"strings"

	"github.com/tdewolff/minify/v2"
	"github.com/tdewolff/minify/v2/css"
	"github.com/tdewolff/minify/v2/html"
	"github.com/tdewolff/minify/v2/js"
	"github.com/tdewolff/minify/v2/json"
	"github.com/tdewolff/minify/v2/svg"
	"github.com/tdewolff/parse/v2"
	jsparse "github.com/tdewolff/parse/v2/js"
)

// kind says how references to other assets are found in a file.
type kind int

const (
	kindBinary kind = iota // never rewritten
	kindHTML               // HTML and SVG: attribute values, url()
	kindCSS                // url() and @import strings
	kindJS                 // string literals
	kindJSON               // string values
)

// fileType is what the build knows about one file extension.
type fileType struct {
	mime     string // media type given to the minifier; "" for none
	kind     kind
	compress bool // worth a .gz and .br copy
}

var fileTypes = map[string]fileType{
	".html":        {"text/html", kindHTML, true},
	".htm":         {"text/html", kindHTML, true},
	".css":         {"text/css", kindCSS, true},
	".js":          {"text/javascript", kindJS, true},
	".mjs":         {"text/javascript", kindJS, true},
	".json":        {"application/json", kindJSON, true},
	".webmanifest": {"application/manifest+json", kindJSON, true},
	".svg":         {"image/svg+xml", kindHTML, true},
	".wasm":        {"", kindBinary, true},
	".txt":         {"", kindBinary, true},
	".xml":         {"", kindBinary, true},
	".ico":         {"", kindBinary, true},
}

func typeOf(name string) fileType {
	return fileTypes[strings.ToLower(path.Ext(name))]
}

// newMinifier registers the minifiers for every text type the site uses.
// The HTML options keep the page a complete, valid document.
func newMinifier() *minify.M {
	m := minify.New()
	m.Add("text/html", &html.Minifier{
		KeepDocumentTags:    true,
		KeepEndTags:         true,
		KeepQuotes:          true,
		KeepDefaultAttrVals: true,
	})
	m.AddFunc("text/css", css.Minify)
	m.AddFunc("image/svg+xml", svg.Minify)
	m.AddFuncRegexp(regexp.MustCompile(`^(application|text)/(x-)?(java|ecma)script$`), js.Minify)
	m.AddFunc("module", js.Minify)
	m.AddFuncRegexp(regexp.MustCompile(`^application/(.+\+)?json$`), json.Minify)
	return m
}

// minifyFile minifies data according to the extension of name; files of
// other types are returned unchanged.
func minifyFile(m *minify.M, name string, data []byte) ([]byte, error) {
	t := typeOf(name)
	if t.mime == "" {
		return data, nil
	}
	return m.Bytes(t.mime, data)
}

// minifyWasmExec minifies the Go runtime's wasm_exec.js, keeping the
// original when the result does not parse or no longer defines
// globalThis.Go.
func minifyWasmExec(m *minify.M, src []byte, logw io.Writer) []byte {
	out, err := m.Bytes("text/javascript", src)
	if err == nil {
		err = checkWasmExec(out)
	}
	if err != nil {
		fmt.Fprintf(logw, "build: keeping %s unminified: %v\n", wasmExecName, err)
		return src
	}
	return out
}

// checkWasmExec reports whether data is JavaScript that defines the Go
// class the page needs.
func checkWasmExec(data []byte) error {
	if len(bytes.TrimSpace(data)) == 0 {
		return fmt.Errorf("empty")
	}
	if !bytes.Contains(data, []byte("globalThis.Go")) {
		return fmt.Errorf("no globalThis.Go")
	}
	if _, err := jsparse.Parse(parse.NewInputBytes(data), jsparse.Options{}); err != nil {
		return fmt.Errorf("does not parse: %w", err)
	}
	return nil
}
