//go:build js && wasm

package main

import _ "embed"

// demoJSON is testdata/demo.json, copied here by `make` (go:embed cannot
// reach outside the package's folder); a test checks that the copies agree.
//
//go:embed demo.json
var demoJSON []byte
