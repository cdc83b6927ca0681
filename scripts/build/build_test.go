package main

import (
	"bytes"
	"compress/gzip"
	"context"
	"encoding/json"
	"errors"
	"io"
	"io/fs"
	"os"
	"path"
	"path/filepath"
	"regexp"
	"slices"
	"sort"
	"strings"
	"testing"

	"github.com/andybalholm/brotli"
)

// fakeWasm stands in for the compiler: a WebAssembly header followed by
// enough repetitive bytes to be worth compressing.
func fakeWasm(_ context.Context, _ Options, out string) error {
	data := append([]byte("\x00asm\x01\x00\x00\x00"), bytes.Repeat([]byte("setcard wasm stand-in "), 400)...)
	return os.WriteFile(out, data, 0o644)
}

// fixtureSite copies testdata/site and the real service worker, manifest
// and icon from ../../site into a temporary directory and returns it.
func fixtureSite(t *testing.T) string {
	t.Helper()
	dir := filepath.Join(t.TempDir(), "site")
	if err := os.CopyFS(dir, os.DirFS("testdata/site")); err != nil {
		t.Fatal(err)
	}
	for _, name := range []string{swName, "manifest.webmanifest", "icon.svg"} {
		data, err := os.ReadFile(filepath.Join("..", "..", "site", name))
		if err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(filepath.Join(dir, name), data, 0o644); err != nil {
			t.Fatal(err)
		}
	}
	return dir
}

// buildSite builds site into a fresh directory with the fake compiler.
func buildSite(t *testing.T, site string) (*Result, string) {
	t.Helper()
	out := filepath.Join(t.TempDir(), "dist")
	res, err := Build(context.Background(), Options{SiteDir: site, OutDir: out, WasmPkg: "./wasm", CompileWasm: fakeWasm})
	if err != nil {
		t.Fatalf("Build(%s) error: %v", site, err)
	}
	return res, out
}

// distFiles lists the files in dir, slash-separated, without the .gz and
// .br copies.
func distFiles(t *testing.T, dir string) []string {
	t.Helper()
	var names []string
	err := fs.WalkDir(os.DirFS(dir), ".", func(name string, d fs.DirEntry, err error) error {
		if err != nil || d.IsDir() {
			return err
		}
		if !strings.HasSuffix(name, ".gz") && !strings.HasSuffix(name, ".br") {
			names = append(names, name)
		}
		return nil
	})
	if err != nil {
		t.Fatal(err)
	}
	sort.Strings(names)
	return names
}

func readDist(t *testing.T, dir, name string) []byte {
	t.Helper()
	data, err := os.ReadFile(filepath.Join(dir, filepath.FromSlash(name)))
	if err != nil {
		t.Fatal(err)
	}
	return data
}

var (
	attrRef  = regexp.MustCompile(`\s(?:src|href)="([^"]*)"`)
	cssRef   = regexp.MustCompile(`url\(\s*["']?([^"')]+)["']?\s*\)`)
	jsRef    = regexp.MustCompile("[\"'`]([^\"'`\\s]+\\.(?:js|css|wasm|svg|webmanifest|json))[\"'`]")
	hashedRe = regexp.MustCompile(`\.[0-9a-f]{10}\.`)
)

func TestBuildReferencesResolve(t *testing.T) {
	res, out := buildSite(t, fixtureSite(t))
	files := distFiles(t, out)
	exists := make(map[string]bool)
	for _, f := range files {
		exists[f] = true
	}
	for plain, hashed := range res.Assets {
		if !hashedRe.MatchString(path.Base(hashed)) {
			t.Errorf("asset %s built as %s, want name.<10 hex>.ext", plain, hashed)
		}
		if !exists[hashed] {
			t.Errorf("asset %s: %s not in dist", plain, hashed)
		}
		if exists[plain] {
			t.Errorf("asset %s also present under its plain name", plain)
		}
	}
	for _, want := range []string{"app.css", "app.js", "icon.svg", "img/dot.svg", "manifest.webmanifest", wasmName, wasmExecName} {
		if _, ok := res.Assets[want]; !ok {
			t.Errorf("Assets has no %s", want)
		}
	}

	checked := 0
	for _, name := range files {
		var re *regexp.Regexp
		switch path.Ext(name) {
		case ".html":
			re = attrRef
		case ".css":
			re = cssRef
		case ".js":
			if strings.HasPrefix(name, "wasm_exec.") || name == swName {
				continue
			}
			re = jsRef
		case ".webmanifest":
			re = jsRef
		default:
			continue
		}
		data := readDist(t, out, name)
		for _, m := range re.FindAllSubmatch(data, -1) {
			ref := string(m[1])
			if strings.HasPrefix(ref, "data:") {
				continue
			}
			target := path.Clean(path.Join(path.Dir(name), ref))
			if !exists[target] {
				t.Errorf("%s refers to %q, which is not in dist", name, ref)
			}
			if target != indexName && target != swName && !hashedRe.MatchString(path.Base(target)) {
				t.Errorf("%s refers to %q, want a hashed name", name, ref)
			}
			checked++
		}
	}
	// index.html: manifest, 2 icons, css, 2 scripts; css: 2 urls; js: wasm,
	// sw.js, css, svg; manifest: icon.
	if checked < 13 {
		t.Errorf("checked %d references, want at least 13", checked)
	}
	if sw := readDist(t, out, "app."+strings.Split(res.Assets["app.js"], ".")[1]+".js"); !bytes.Contains(sw, []byte(`"sw.js"`)) {
		t.Errorf("app.js lost its plain reference to sw.js")
	}
}

func TestBuildCompressedCopies(t *testing.T) {
	res, out := buildSite(t, fixtureSite(t))
	if len(res.Files) == 0 {
		t.Fatal("no files in result")
	}
	for _, f := range res.Files {
		raw := readDist(t, out, f.Name)
		if int64(len(raw)) != f.Raw {
			t.Errorf("%s: Raw = %d, want %d", f.Name, f.Raw, len(raw))
		}
		t.Run(f.Name, func(t *testing.T) {
			if typeOf(f.Name).compress && len(raw) > 300 {
				if f.Gzip == 0 || f.Brotli == 0 {
					t.Errorf("%s (%d bytes): gzip %d, brotli %d; want both copies", f.Name, len(raw), f.Gzip, f.Brotli)
				}
			}
			for _, c := range []struct {
				ext  string
				size int64
				open func(io.Reader) (io.Reader, error)
			}{
				{".gz", f.Gzip, func(r io.Reader) (io.Reader, error) { return gzip.NewReader(r) }},
				{".br", f.Brotli, func(r io.Reader) (io.Reader, error) { return brotli.NewReader(r), nil }},
			} {
				z, err := os.ReadFile(filepath.Join(out, filepath.FromSlash(f.Name)) + c.ext)
				if c.size == 0 {
					if !errors.Is(err, fs.ErrNotExist) {
						t.Errorf("%s%s exists but the result says it was skipped", f.Name, c.ext)
					}
					continue
				}
				if err != nil {
					t.Fatal(err)
				}
				if int64(len(z)) != c.size || len(z) >= len(raw) {
					t.Errorf("%s%s: %d bytes, result says %d, raw %d", f.Name, c.ext, len(z), c.size, len(raw))
				}
				r, err := c.open(bytes.NewReader(z))
				if err != nil {
					t.Fatal(err)
				}
				got, err := io.ReadAll(r)
				if err != nil {
					t.Fatalf("%s%s: %v", f.Name, c.ext, err)
				}
				if !bytes.Equal(got, raw) {
					t.Errorf("%s%s decompresses to %d bytes that differ from the %d raw bytes", f.Name, c.ext, len(got), len(raw))
				}
			}
		})
	}
}

var precacheList = regexp.MustCompile(`\["\./"[^\]]*\]`)

func TestBuildServiceWorker(t *testing.T) {
	res, out := buildSite(t, fixtureSite(t))
	sw := readDist(t, out, swName)
	if bytes.Contains(sw, []byte("__SETCARD_")) {
		t.Errorf("sw.js still has a placeholder:\n%s", sw)
	}
	m := precacheList.Find(sw)
	if m == nil {
		t.Fatalf("no file list in sw.js:\n%s", sw)
	}
	var list []string
	if err := json.Unmarshal(m, &list); err != nil {
		t.Fatalf("file list %s: %v", m, err)
	}
	want := []string{"./"}
	for _, f := range distFiles(t, out) {
		if f != swName && f != buildJSON {
			want = append(want, f)
		}
	}
	got := slices.Clone(list)
	sort.Strings(got)
	sort.Strings(want)
	if !slices.Equal(got, want) {
		t.Errorf("sw.js file list = %q, want %q", got, want)
	}
	if !slices.Equal(list, res.Precache) {
		t.Errorf("sw.js file list = %q, Result.Precache = %q", list, res.Precache)
	}

	var bj buildManifest
	if err := json.Unmarshal(readDist(t, out, buildJSON), &bj); err != nil {
		t.Fatal(err)
	}
	if bj.Version != res.Version || len(bj.Version) != hashLen {
		t.Errorf("build.json version = %q, Result.Version = %q", bj.Version, res.Version)
	}
	if cache := `"setcard-` + res.Version + `"`; !bytes.Contains(sw, []byte(cache)) {
		t.Errorf("sw.js has no cache name %s:\n%s", cache, sw)
	}
	wantFiles := slices.DeleteFunc(distFiles(t, out), func(f string) bool { return f == buildJSON })
	if !slices.Equal(bj.Files, wantFiles) {
		t.Errorf("build.json files = %q, want %q", bj.Files, wantFiles)
	}
	for _, api := range []string{"skipWaiting", "clients.claim", "caches.delete", "addAll", `"navigate"`, `"index.html"`} {
		if !bytes.Contains(sw, []byte(api)) {
			t.Errorf("sw.js does not use %s", api)
		}
	}
	if bytes.Contains(sw, []byte("http:")) || bytes.Contains(sw, []byte("https:")) {
		t.Errorf("sw.js names another origin:\n%s", sw)
	}
}

func TestBuildVersionFollowsContent(t *testing.T) {
	site := fixtureSite(t)
	res1, _ := buildSite(t, site)
	p := filepath.Join(site, "index.html")
	data, err := os.ReadFile(p)
	if err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(p, bytes.Replace(data, []byte("Loading"), []byte("Starting"), 1), 0o644); err != nil {
		t.Fatal(err)
	}
	res2, _ := buildSite(t, site)
	if res1.Version == res2.Version {
		t.Errorf("version %s did not change with index.html", res1.Version)
	}
	if res1.Assets["app.css"] != res2.Assets["app.css"] {
		t.Errorf("app.css name changed from %s to %s though the file did not", res1.Assets["app.css"], res2.Assets["app.css"])
	}

	p = filepath.Join(site, "img", "dot.svg")
	if err := os.WriteFile(p, []byte(`<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 16 16"><circle cx="8" cy="8" r="7" fill="#000"/></svg>`), 0o644); err != nil {
		t.Fatal(err)
	}
	res3, _ := buildSite(t, site)
	// dot.svg changed; app.css names it and app.js names app.css.
	for _, name := range []string{"img/dot.svg", "app.css", "app.js"} {
		if res2.Assets[name] == res3.Assets[name] {
			t.Errorf("%s kept the name %s after it or a file it names changed", name, res3.Assets[name])
		}
	}
}

func TestBuildCSP(t *testing.T) {
	meta := `<meta http-equiv="Content-Security-Policy" content="` + contentSecurityPolicy + `">`
	tests := []struct {
		name   string
		change func(string) string
	}{
		{"inserted", func(s string) string { return s }},
		{"kept", func(s string) string {
			return strings.Replace(s, `<meta charset="utf-8">`, `<meta charset="utf-8">`+"\n  "+meta, 1)
		}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			site := fixtureSite(t)
			p := filepath.Join(site, indexName)
			data, err := os.ReadFile(p)
			if err != nil {
				t.Fatal(err)
			}
			if err := os.WriteFile(p, []byte(tt.change(string(data))), 0o644); err != nil {
				t.Fatal(err)
			}
			_, out := buildSite(t, site)
			s, err := scanPage(readDist(t, out, indexName))
			if err != nil {
				t.Fatal(err)
			}
			if len(s.csp) != 1 || s.csp[0] != contentSecurityPolicy {
				t.Errorf("built index.html CSP = %q, want exactly [%q]", s.csp, contentSecurityPolicy)
			}
		})
	}
}

func TestBuildRejectsInlineScript(t *testing.T) {
	tests := []struct {
		name    string
		snippet string
		wantErr bool
	}{
		{"inline script", `<script>console.log("hi")</script>`, true},
		{"inline module", "<script type=\"module\">\nimport './app.js';\n</script>", true},
		{"import map", `<script type="importmap">{"imports":{}}</script>`, true},
		{"event handler", `<button onclick="go()">Go</button>`, true},
		{"javascript URL", `<a href="javascript:void 0">x</a>`, true},
		{"external script", `<script src="app.js"></script>`, false},
		{"external script with blank body", "<script src=\"app.js\">\n  </script>", false},
		{"script word in text", `<p>onclick &lt;script&gt; is not markup here</p>`, false},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			site := fixtureSite(t)
			p := filepath.Join(site, indexName)
			data, err := os.ReadFile(p)
			if err != nil {
				t.Fatal(err)
			}
			data = bytes.Replace(data, []byte("</main>"), []byte(tt.snippet+"\n</main>"), 1)
			if err := os.WriteFile(p, data, 0o644); err != nil {
				t.Fatal(err)
			}
			_, err = Build(context.Background(), Options{SiteDir: site, OutDir: filepath.Join(t.TempDir(), "dist"), CompileWasm: fakeWasm})
			if (err != nil) != tt.wantErr {
				t.Errorf("Build with %s: error = %v, want error %v", tt.snippet, err, tt.wantErr)
			}
		})
	}
}

func TestBuildDeterministic(t *testing.T) {
	site := fixtureSite(t)
	_, out1 := buildSite(t, site)
	_, out2 := buildSite(t, site)
	read := func(dir string) map[string][]byte {
		files := make(map[string][]byte)
		err := fs.WalkDir(os.DirFS(dir), ".", func(name string, d fs.DirEntry, err error) error {
			if err != nil || d.IsDir() {
				return err
			}
			files[name] = readDist(t, dir, name)
			return nil
		})
		if err != nil {
			t.Fatal(err)
		}
		return files
	}
	a, b := read(out1), read(out2)
	if len(a) != len(b) {
		t.Errorf("builds have %d and %d files", len(a), len(b))
	}
	for name, data := range a {
		if !bytes.Equal(data, b[name]) {
			t.Errorf("%s differs between two builds of the same sources", name)
		}
	}
}

func TestBuildKeepsDocumentTags(t *testing.T) {
	_, out := buildSite(t, fixtureSite(t))
	index := readDist(t, out, indexName)
	for _, tag := range []string{"<html", "<head>", "</head>", "<body>", "</body>", "</html>", "</p>", "</main>", `lang="en"`, `<meta charset="utf-8">`} {
		if !bytes.Contains(index, []byte(tag)) {
			t.Errorf("built index.html lacks %s:\n%s", tag, index)
		}
	}
	if !bytes.HasPrefix(bytes.ToLower(index), []byte("<!doctype html>")) {
		t.Errorf("built index.html does not start with a doctype:\n%s", index)
	}
	src, err := os.ReadFile("testdata/site/index.html")
	if err != nil {
		t.Fatal(err)
	}
	if len(index) >= len(src)+len(contentSecurityPolicy)+60 {
		t.Errorf("built index.html has %d bytes, not minified (source %d)", len(index), len(src))
	}
}

func TestBuildMinifiesWasmExec(t *testing.T) {
	res, out := buildSite(t, fixtureSite(t))
	src, err := readWasmExec("")
	if err != nil {
		t.Fatal(err)
	}
	got := readDist(t, out, res.Assets[wasmExecName])
	if err := checkWasmExec(got); err != nil {
		t.Errorf("built wasm_exec.js: %v", err)
	}
	if len(got) >= len(src) {
		t.Errorf("built wasm_exec.js has %d bytes, source %d: not minified", len(got), len(src))
	}
	icon := readDist(t, out, res.Assets["icon.svg"])
	if !bytes.Contains(icon, []byte(`xmlns="http://www.w3.org/2000/svg"`)) {
		t.Errorf("built icon.svg lost its namespace: %s", icon)
	}
	var manifest map[string]any
	if err := json.Unmarshal(readDist(t, out, res.Assets["manifest.webmanifest"]), &manifest); err != nil {
		t.Errorf("built manifest is not JSON: %v", err)
	}
}

func TestCheckWasmExec(t *testing.T) {
	tests := []struct {
		in      string
		wantErr bool
	}{
		{`"use strict";(()=>{globalThis.Go=class{run(){}}})();`, false},
		{``, true},
		{`globalThis.Go = class {`, true},
		{`globalThis.Other = 1;`, true},
	}
	for _, tt := range tests {
		if err := checkWasmExec([]byte(tt.in)); (err != nil) != tt.wantErr {
			t.Errorf("checkWasmExec(%q) = %v, want error %v", tt.in, err, tt.wantErr)
		}
	}
}

func TestHashedName(t *testing.T) {
	data := []byte("body{}")
	tests := []struct {
		name, want string
	}{
		{"app.css", "app.H.css"},
		{"wasm_exec.js", "wasm_exec.H.js"},
		{"manifest.webmanifest", "manifest.H.webmanifest"},
		{"img/dot.svg", "img/dot.H.svg"},
		{"lib.min.js", "lib.min.H.js"},
		{"LICENSE", "LICENSE.H"},
	}
	for _, tt := range tests {
		got := hashedName(tt.name, data)
		// Replace the hash by H so the table stays readable.
		gotH := hashInName.ReplaceAllString(got, ".H")
		if gotH != tt.want {
			t.Errorf("hashedName(%q) = %q, want %q", tt.name, got, tt.want)
		}
	}
	if hashedName("a.js", []byte("1")) == hashedName("a.js", []byte("2")) {
		t.Errorf("hashedName gives the same name to different contents")
	}
}

var hashInName = regexp.MustCompile(`\.[0-9a-f]{10}`)

func TestFindRefs(t *testing.T) {
	assets := map[string]bool{"app.js": true, "icon.svg": true, "img/icon.svg": true, "app.css": true}
	tests := []struct {
		k    kind
		in   string
		want []string
	}{
		{kindJS, `fetch("app.js")`, []string{"app.js"}},
		{kindJS, `x = './app.css';`, []string{"app.css"}},
		{kindJS, "u = `icon.svg`", []string{"icon.svg"}},
		{kindJS, `o.app.js = 1; // app.js`, nil},
		{kindJS, `"myapp.js" "app.json" "app.js.map"`, nil},
		{kindJS, `"img/icon.svg" "../img/icon.svg" "x/icon.svg"`, []string{"img/icon.svg", "img/icon.svg", "icon.svg"}},
		{kindCSS, `a{background:url(icon.svg)} b{background:url("img/icon.svg")}`, []string{"icon.svg", "img/icon.svg"}},
		{kindCSS, `.icon.svg{color:red}`, nil},
		{kindHTML, `<link href="app.css"><script src=app.js></script><img srcset="icon.svg 1x,img/icon.svg 2x">`, []string{"app.css", "app.js", "icon.svg", "img/icon.svg"}},
		{kindJSON, `{"src":"icon.svg","name":"app.js"}`, []string{"icon.svg", "app.js"}},
		{kindBinary, `"app.js"`, nil},
	}
	for _, tt := range tests {
		var got []string
		for _, r := range findRefs(tt.k, []byte(tt.in), assets) {
			if tt.in[r.Start:r.End] != r.Name {
				t.Errorf("findRefs(%q): ref %+v covers %q", tt.in, r, tt.in[r.Start:r.End])
			}
			got = append(got, r.Name)
		}
		if !slices.Equal(got, tt.want) {
			t.Errorf("findRefs(%d, %q) = %q, want %q", tt.k, tt.in, got, tt.want)
		}
	}
}

func TestHashOrder(t *testing.T) {
	tests := []struct {
		name    string
		files   map[string]string
		want    []string
		wantErr bool
	}{
		{
			name: "dependencies first",
			files: map[string]string{
				"index.html": `<link href="app.css"><script src="app.js"></script>`,
				"sw.js":      `"app.js"`,
				"app.js":     `fetch("setcard.wasm");x="app.css"`,
				"app.css":    `a{background:url(icon.svg)}`,
				"icon.svg":   `<svg/>`,
				"b.wasm":     "\x00asm",
			},
			want: []string{"b.wasm", "icon.svg", "app.css", "app.js"},
		},
		{
			name: "self reference is not a cycle",
			files: map[string]string{
				"index.html": ``,
				"sw.js":      ``,
				"a.js":       `new URL("a.js", import.meta.url)`,
			},
			want: []string{"a.js"},
		},
		{
			name: "cycle",
			files: map[string]string{
				"index.html": ``,
				"sw.js":      ``,
				"a.js":       `import "./b.js"`,
				"b.js":       `import "./a.js"`,
			},
			wantErr: true,
		},
	}
	for _, tt := range tests {
		files := make(map[string][]byte)
		for k, v := range tt.files {
			files[k] = []byte(v)
		}
		got, err := hashOrder(files)
		if (err != nil) != tt.wantErr {
			t.Errorf("%s: hashOrder error = %v, want error %v", tt.name, err, tt.wantErr)
			continue
		}
		if !tt.wantErr && !slices.Equal(got, tt.want) {
			t.Errorf("%s: hashOrder = %q, want %q", tt.name, got, tt.want)
		}
	}
}

func TestFillServiceWorker(t *testing.T) {
	tests := []struct {
		src     string
		want    string
		wantErr bool
	}{
		{`const C = "__SETCARD_CACHE__", F = ["__SETCARD_FILES__"];`, `const C = "setcard-abc", F = ["./","index.html"];`, false},
		{`const F = ["__SETCARD_FILES__"];`, ``, true},
		{`const C = "__SETCARD_CACHE__";`, ``, true},
		{`"__SETCARD_CACHE__" "__SETCARD_CACHE__" ["__SETCARD_FILES__"]`, ``, true},
	}
	for _, tt := range tests {
		got, err := fillServiceWorker([]byte(tt.src), "setcard-abc", []string{"./", "index.html"})
		if (err != nil) != tt.wantErr {
			t.Errorf("fillServiceWorker(%q) error = %v, want error %v", tt.src, err, tt.wantErr)
			continue
		}
		if string(got) != tt.want {
			t.Errorf("fillServiceWorker(%q) = %q, want %q", tt.src, got, tt.want)
		}
	}
}

func TestCheckOutDir(t *testing.T) {
	root := t.TempDir()
	site := filepath.Join(root, "site")
	stranger := filepath.Join(root, "stranger")
	previous := filepath.Join(root, "previous")
	empty := filepath.Join(root, "empty")
	for _, d := range []string{site, stranger, previous, empty} {
		if err := os.MkdirAll(d, 0o755); err != nil {
			t.Fatal(err)
		}
	}
	if err := os.WriteFile(filepath.Join(stranger, "notes.txt"), []byte("keep me"), 0o644); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(filepath.Join(previous, buildJSON), []byte("{}"), 0o644); err != nil {
		t.Fatal(err)
	}
	tests := []struct {
		out     string
		wantErr bool
	}{
		{filepath.Join(root, "dist"), false},
		{empty, false},
		{previous, false},
		{stranger, true},
		{site, true},
		{root, true},
		{filepath.Join(site, "dist"), true},
	}
	for _, tt := range tests {
		if err := checkOutDir(tt.out, site); (err != nil) != tt.wantErr {
			t.Errorf("checkOutDir(%s) = %v, want error %v", tt.out, err, tt.wantErr)
		}
	}
}

func TestBuildRefusesGeneratedNames(t *testing.T) {
	site := fixtureSite(t)
	if err := os.WriteFile(filepath.Join(site, wasmName), []byte("\x00asm"), 0o644); err != nil {
		t.Fatal(err)
	}
	_, err := Build(context.Background(), Options{SiteDir: site, OutDir: filepath.Join(t.TempDir(), "dist"), CompileWasm: fakeWasm})
	if err == nil {
		t.Errorf("Build with site/%s: error = nil, want an error", wasmName)
	}
}

func TestRunFlags(t *testing.T) {
	tests := []struct {
		args []string
		want int
	}{
		{[]string{"-h"}, 0},
		{[]string{"-nosuchflag"}, 2},
		{[]string{"extra"}, 2},
	}
	for _, tt := range tests {
		var stdout, stderr bytes.Buffer
		if got := run(tt.args, &stdout, &stderr); got != tt.want {
			t.Errorf("run(%q) = %d, want %d (stderr %s)", tt.args, got, tt.want, stderr.String())
		}
	}
	opts, err := parseFlags(nil, io.Discard)
	if err != nil {
		t.Fatal(err)
	}
	if opts.OutDir != "dist" || opts.SiteDir != "site" || opts.WasmPkg != "./wasm" {
		t.Errorf("parseFlags(nil) = %+v, want -o dist -site site -wasm ./wasm", opts)
	}
}

func TestWriteSummary(t *testing.T) {
	res, _ := buildSite(t, fixtureSite(t))
	var b bytes.Buffer
	if err := writeSummary(&b, res); err != nil {
		t.Fatal(err)
	}
	out := b.String()
	for _, want := range []string{indexName, res.Assets[wasmName], "brotli", res.Version} {
		if !strings.Contains(out, want) {
			t.Errorf("summary lacks %q:\n%s", want, out)
		}
	}
	var total int64
	for _, f := range res.Files {
		if f.Name == swName || f.Name == buildJSON {
			continue
		}
		if f.Brotli > 0 {
			total += f.Brotli
		} else {
			total += f.Raw
		}
	}
	if res.FirstVisit != total {
		t.Errorf("FirstVisit = %d, want %d", res.FirstVisit, total)
	}
}

// TestGoCompileWasm compiles a tiny throwaway main with the real toolchain.
func TestGoCompileWasm(t *testing.T) {
	if testing.Short() {
		t.Skip("compiles for js/wasm")
	}
	dir := t.TempDir()
	if err := os.WriteFile(filepath.Join(dir, "go.mod"), []byte("module tiny\n\ngo 1.26\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(filepath.Join(dir, "main.go"), []byte("package main\n\nfunc main() { println(\"tiny\") }\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	out := filepath.Join(t.TempDir(), wasmName)
	var log bytes.Buffer
	t.Setenv("GOWORK", "off")
	t.Setenv("GOFLAGS", "-mod=mod")
	if err := GoCompileWasm(context.Background(), Options{WasmPkg: ".", WasmDir: dir, Log: &log}, out); err != nil {
		t.Fatalf("GoCompileWasm: %v\n%s", err, log.String())
	}
	data, err := os.ReadFile(out)
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.HasPrefix(data, []byte("\x00asm")) {
		t.Errorf("GoCompileWasm wrote %d bytes without the wasm magic", len(data))
	}
}

// TestBuildRealSite builds the project's own site/ with the fake compiler,
// once its page exists.
func TestBuildRealSite(t *testing.T) {
	site := filepath.Join("..", "..", "site")
	if _, err := os.Stat(filepath.Join(site, indexName)); err != nil {
		t.Skip("site/index.html not written yet")
	}
	res, out := buildSite(t, site)
	index := readDist(t, out, indexName)
	for _, m := range attrRef.FindAllSubmatch(index, -1) {
		ref := path.Clean(string(m[1]))
		if strings.Contains(ref, ":") || strings.HasPrefix(ref, "#") {
			continue
		}
		if _, err := os.Stat(filepath.Join(out, filepath.FromSlash(ref))); err != nil {
			t.Errorf("built index.html refers to %q, not in dist", m[1])
		}
	}
	if len(res.Precache) < 3 {
		t.Errorf("Precache = %q, want the page's assets", res.Precache)
	}
}
