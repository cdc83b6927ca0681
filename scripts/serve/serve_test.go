package main

import (
	"bufio"
	"bytes"
	"compress/gzip"
	"context"
	"fmt"
	"io"
	"math/rand/v2"
	"net"
	"net/http"
	"net/http/httptest"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
	"time"

	"github.com/andybalholm/brotli"
)

const secret = "module secret-outside-dist\n"

// testSite writes a small built site to root/dist, with a file outside it
// (root/go.mod) that must never be served, and returns the dist path and
// the raw content of each file.
func testSite(t *testing.T) (string, map[string][]byte) {
	t.Helper()
	root := t.TempDir()
	dist := filepath.Join(root, "dist")
	if err := os.WriteFile(filepath.Join(root, "go.mod"), []byte(secret), 0o644); err != nil {
		t.Fatal(err)
	}
	long := strings.Repeat("setcard ", 200)
	// The wasm stand-in is larger than the server's write buffer, so its
	// Content-Length cannot come from buffering.
	big := make([]byte, 256<<10)
	rng := rand.New(rand.NewPCG(1, 2))
	for i := range big {
		big[i] = "setcard wasm"[rng.IntN(12)]
	}
	files := map[string][]byte{
		"index.html":                      []byte("<!doctype html><html><head><title>Setcard</title></head><body>" + long + "</body></html>"),
		"sw.js":                           []byte(`self.addEventListener("fetch",()=>{});// ` + long),
		"build.json":                      []byte(`{"version":"0123456789","files":[]}`),
		"app.0123456789.js":               []byte("console.log(1);// " + long),
		"app.abcdef0123.css":              []byte("body{margin:0}/* " + long + "*/"),
		"setcard.0a1b2c3d4e.wasm":         append([]byte("\x00asm\x01\x00\x00\x00"), big...),
		"manifest.0123456789.webmanifest": []byte(`{"name":"Setcard"}`),
		"icon.0123456789.svg":             []byte(`<svg xmlns="http://www.w3.org/2000/svg"/>`),
		"img/dot.0123456789.svg":          []byte(`<svg xmlns="http://www.w3.org/2000/svg"/>`),
		"notes.txt":                       []byte("plain"),
		".hidden":                         []byte("hidden"),
		"wasm_exec.fedcba9876.js":         []byte("globalThis.Go=class{};"),
	}
	compressed := map[string][]string{
		"index.html":              {".gz", ".br"},
		"sw.js":                   {".gz", ".br"},
		"app.0123456789.js":       {".gz", ".br"},
		"app.abcdef0123.css":      {".gz"},
		"setcard.0a1b2c3d4e.wasm": {".br"},
	}
	for name, data := range files {
		p := filepath.Join(dist, filepath.FromSlash(name))
		if err := os.MkdirAll(filepath.Dir(p), 0o755); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(p, data, 0o644); err != nil {
			t.Fatal(err)
		}
		for _, ext := range compressed[name] {
			var b bytes.Buffer
			var w io.WriteCloser
			if ext == ".gz" {
				w = gzip.NewWriter(&b)
			} else {
				w = brotli.NewWriter(&b)
			}
			if _, err := w.Write(data); err != nil {
				t.Fatal(err)
			}
			if err := w.Close(); err != nil {
				t.Fatal(err)
			}
			if err := os.WriteFile(p+ext, b.Bytes(), 0o644); err != nil {
				t.Fatal(err)
			}
		}
	}
	return dist, files
}

// testServer serves dir on 127.0.0.1 and returns a client that neither
// asks for nor decodes compression by itself.
func testServer(t *testing.T, dir string) (*httptest.Server, *http.Client) {
	t.Helper()
	h, err := newHandler(dir)
	if err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() { h.Close() })
	srv := httptest.NewServer(h)
	t.Cleanup(srv.Close)
	if host, _, _ := net.SplitHostPort(srv.Listener.Addr().String()); host != "127.0.0.1" {
		t.Fatalf("test server listens on %s, want 127.0.0.1", host)
	}
	tr := &http.Transport{DisableCompression: true}
	t.Cleanup(tr.CloseIdleConnections)
	return srv, &http.Client{Transport: tr}
}

func get(t *testing.T, c *http.Client, method, url, acceptEncoding string) (*http.Response, []byte) {
	t.Helper()
	req, err := http.NewRequest(method, url, nil)
	if err != nil {
		t.Fatal(err)
	}
	if acceptEncoding != "" {
		req.Header.Set("Accept-Encoding", acceptEncoding)
	}
	resp, err := c.Do(req)
	if err != nil {
		t.Fatal(err)
	}
	defer resp.Body.Close()
	body, err := io.ReadAll(resp.Body)
	if err != nil {
		t.Fatal(err)
	}
	return resp, body
}

func decode(t *testing.T, encoding string, body []byte) []byte {
	t.Helper()
	var r io.Reader = bytes.NewReader(body)
	switch encoding {
	case "gzip":
		zr, err := gzip.NewReader(r)
		if err != nil {
			t.Fatal(err)
		}
		r = zr
	case "br":
		r = brotli.NewReader(r)
	}
	data, err := io.ReadAll(r)
	if err != nil {
		t.Fatalf("decode %s: %v", encoding, err)
	}
	return data
}

func TestServeFiles(t *testing.T) {
	dir, files := testSite(t)
	srv, c := testServer(t, dir)
	tests := []struct {
		path, accept string
		file         string // raw file the body must decode to
		wantType     string
		wantEncoding string
		wantVary     bool
		wantCache    string
	}{
		{"/", "br, gzip", "index.html", "text/html; charset=utf-8", "br", true, "no-cache"},
		{"/index.html", "gzip, deflate", "index.html", "text/html; charset=utf-8", "gzip", true, "no-cache"},
		{"/index.html", "", "index.html", "text/html; charset=utf-8", "", true, "no-cache"},
		{"/index.html", "identity", "index.html", "text/html; charset=utf-8", "", true, "no-cache"},
		{"/index.html", "gzip;q=1, br;q=0", "index.html", "text/html; charset=utf-8", "gzip", true, "no-cache"},
		{"/index.html", "br;q=0.1, gzip;q=0.9", "index.html", "text/html; charset=utf-8", "br", true, "no-cache"},
		{"/index.html", "*", "index.html", "text/html; charset=utf-8", "br", true, "no-cache"},
		{"/index.html", "*;q=0", "index.html", "text/html; charset=utf-8", "", true, "no-cache"},
		{"/sw.js", "gzip, br", "sw.js", "text/javascript; charset=utf-8", "br", true, "no-cache"},
		{"/build.json", "br", "build.json", "application/json", "", false, "no-cache"},
		{"/app.0123456789.js", "br", "app.0123456789.js", "text/javascript; charset=utf-8", "br", true, cacheImmutable},
		{"/app.abcdef0123.css", "br, gzip", "app.abcdef0123.css", "text/css; charset=utf-8", "gzip", true, cacheImmutable},
		{"/app.abcdef0123.css", "br", "app.abcdef0123.css", "text/css; charset=utf-8", "", true, cacheImmutable},
		{"/setcard.0a1b2c3d4e.wasm", "gzip, deflate, br", "setcard.0a1b2c3d4e.wasm", "application/wasm", "br", true, cacheImmutable},
		{"/setcard.0a1b2c3d4e.wasm", "gzip", "setcard.0a1b2c3d4e.wasm", "application/wasm", "", true, cacheImmutable},
		{"/manifest.0123456789.webmanifest", "br", "manifest.0123456789.webmanifest", "application/manifest+json", "", false, cacheImmutable},
		{"/icon.0123456789.svg", "", "icon.0123456789.svg", "image/svg+xml", "", false, cacheImmutable},
		{"/img/dot.0123456789.svg", "", "img/dot.0123456789.svg", "image/svg+xml", "", false, cacheImmutable},
		{"/wasm_exec.fedcba9876.js", "", "wasm_exec.fedcba9876.js", "text/javascript; charset=utf-8", "", false, cacheImmutable},
		{"/notes.txt", "", "notes.txt", "text/plain; charset=utf-8", "", false, "no-cache"},
	}
	for _, tt := range tests {
		resp, body := get(t, c, http.MethodGet, srv.URL+tt.path, tt.accept)
		what := fmt.Sprintf("GET %s (Accept-Encoding %q)", tt.path, tt.accept)
		if resp.StatusCode != http.StatusOK {
			t.Errorf("%s: status = %d, want 200", what, resp.StatusCode)
			continue
		}
		if got := resp.Header.Get("Content-Type"); got != tt.wantType {
			t.Errorf("%s: Content-Type = %q, want %q", what, got, tt.wantType)
		}
		if got := resp.Header.Get("Content-Encoding"); got != tt.wantEncoding {
			t.Errorf("%s: Content-Encoding = %q, want %q", what, got, tt.wantEncoding)
		}
		if got := resp.Header.Get("Vary") == "Accept-Encoding"; got != tt.wantVary {
			t.Errorf("%s: Vary = %q, want Accept-Encoding %v", what, resp.Header.Get("Vary"), tt.wantVary)
		}
		if got := resp.Header.Get("Cache-Control"); got != tt.wantCache {
			t.Errorf("%s: Cache-Control = %q, want %q", what, got, tt.wantCache)
		}
		if got := resp.Header.Get("Content-Length"); got != fmt.Sprint(len(body)) {
			t.Errorf("%s: Content-Length = %q, body has %d bytes", what, got, len(body))
		}
		if got := decode(t, tt.wantEncoding, body); !bytes.Equal(got, files[tt.file]) {
			t.Errorf("%s: body decodes to %d bytes that differ from %s (%d bytes)", what, len(got), tt.file, len(files[tt.file]))
		}
		checkSecurityHeaders(t, what, resp.Header)
	}
}

func checkSecurityHeaders(t *testing.T, what string, h http.Header) {
	t.Helper()
	if got := h.Get("X-Content-Type-Options"); got != "nosniff" {
		t.Errorf("%s: X-Content-Type-Options = %q, want nosniff", what, got)
	}
	if got := h.Get("Content-Security-Policy"); got != contentSecurityPolicy {
		t.Errorf("%s: Content-Security-Policy = %q, want %q", what, got, contentSecurityPolicy)
	}
	if got := h.Get("Cross-Origin-Opener-Policy"); got != "same-origin" {
		t.Errorf("%s: Cross-Origin-Opener-Policy = %q, want same-origin", what, got)
	}
	if got := h.Get("Cross-Origin-Embedder-Policy"); got != "require-corp" {
		t.Errorf("%s: Cross-Origin-Embedder-Policy = %q, want require-corp", what, got)
	}
}

func TestServeHead(t *testing.T) {
	dir, _ := testSite(t)
	srv, c := testServer(t, dir)
	for _, tt := range []struct {
		path, accept, file string
	}{
		{"/", "br", "index.html.br"},
		{"/app.0123456789.js", "gzip", "app.0123456789.js.gz"},
		{"/app.0123456789.js", "", "app.0123456789.js"},
		{"/setcard.0a1b2c3d4e.wasm", "br", "setcard.0a1b2c3d4e.wasm.br"},
	} {
		info, err := os.Stat(filepath.Join(dir, tt.file))
		if err != nil {
			t.Fatal(err)
		}
		resp, body := get(t, c, http.MethodHead, srv.URL+tt.path, tt.accept)
		if resp.StatusCode != http.StatusOK || len(body) != 0 {
			t.Errorf("HEAD %s = %d with %d body bytes, want 200 and none", tt.path, resp.StatusCode, len(body))
		}
		if got, want := resp.Header.Get("Content-Length"), fmt.Sprint(info.Size()); got != want {
			t.Errorf("HEAD %s (Accept-Encoding %q): Content-Length = %s, want %s", tt.path, tt.accept, got, want)
		}
		checkSecurityHeaders(t, "HEAD "+tt.path, resp.Header)
	}
}

func TestServeConditionalAndRange(t *testing.T) {
	dir, files := testSite(t)
	srv, c := testServer(t, dir)

	resp, _ := get(t, c, http.MethodGet, srv.URL+"/", "br")
	lastModified := resp.Header.Get("Last-Modified")
	if lastModified == "" {
		t.Fatalf("GET / has no Last-Modified")
	}
	req, err := http.NewRequest(http.MethodGet, srv.URL+"/", nil)
	if err != nil {
		t.Fatal(err)
	}
	req.Header.Set("Accept-Encoding", "br")
	req.Header.Set("If-Modified-Since", lastModified)
	resp, err = c.Do(req)
	if err != nil {
		t.Fatal(err)
	}
	resp.Body.Close()
	if resp.StatusCode != http.StatusNotModified {
		t.Errorf("GET / If-Modified-Since %s: status = %d, want 304", lastModified, resp.StatusCode)
	}
	if resp.Header.Get("Cache-Control") != "no-cache" || resp.Header.Get("Vary") != "Accept-Encoding" {
		t.Errorf("304 headers = %v, want Cache-Control no-cache and Vary", resp.Header)
	}
	checkSecurityHeaders(t, "304 for /", resp.Header)

	req, err = http.NewRequest(http.MethodGet, srv.URL+"/setcard.0a1b2c3d4e.wasm", nil)
	if err != nil {
		t.Fatal(err)
	}
	req.Header.Set("Range", "bytes=0-7")
	resp, err = c.Do(req)
	if err != nil {
		t.Fatal(err)
	}
	body, _ := io.ReadAll(resp.Body)
	resp.Body.Close()
	if want := files["setcard.0a1b2c3d4e.wasm"][:8]; resp.StatusCode != http.StatusPartialContent || !bytes.Equal(body, want) || resp.Header.Get("Content-Length") != "8" {
		t.Errorf("GET wasm Range 0-7 = %d %q (Content-Length %s), want 206 %q", resp.StatusCode, body, resp.Header.Get("Content-Length"), want)
	}
}

func TestServeNotFound(t *testing.T) {
	dir, _ := testSite(t)
	srv, c := testServer(t, dir)
	tests := []struct {
		method, path string
		want         int
	}{
		{http.MethodGet, "/missing.js", http.StatusNotFound},
		{http.MethodGet, "/img", http.StatusNotFound},
		{http.MethodGet, "/img/", http.StatusNotFound},
		{http.MethodGet, "/.hidden", http.StatusNotFound},
		{http.MethodGet, "/index.html.br", http.StatusNotFound},
		{http.MethodGet, "/app.0123456789.js.gz", http.StatusNotFound},
		{http.MethodGet, "/index.html/", http.StatusNotFound},
		{http.MethodHead, "/missing.js", http.StatusNotFound},
		{http.MethodPost, "/index.html", http.StatusMethodNotAllowed},
		{http.MethodDelete, "/", http.StatusMethodNotAllowed},
	}
	for _, tt := range tests {
		resp, _ := get(t, c, tt.method, srv.URL+tt.path, "br, gzip")
		what := tt.method + " " + tt.path
		if resp.StatusCode != tt.want {
			t.Errorf("%s: status = %d, want %d", what, resp.StatusCode, tt.want)
		}
		if got := resp.Header.Get("Content-Encoding"); got != "" {
			t.Errorf("%s: Content-Encoding = %q on an error", what, got)
		}
		checkSecurityHeaders(t, what, resp.Header)
	}
}

// TestServeTraversal sends raw request lines so that no client cleans the
// path first.
func TestServeTraversal(t *testing.T) {
	dir, _ := testSite(t)
	srv, _ := testServer(t, dir)
	if err := os.Symlink(filepath.Join(dir, "..", "go.mod"), filepath.Join(dir, "link.txt")); err != nil {
		t.Logf("no symlink test: %v", err)
	}
	for _, target := range []string{
		"/../go.mod",
		"/%2e%2e/go.mod",
		"/%2e%2e/",
		"/..%2fgo.mod",
		"/%2e%2e%2fgo.mod",
		"/img/../../go.mod",
		"/img/%2e%2e/%2e%2e/go.mod",
		"/..\\go.mod",
		"/%5c..%5cgo.mod",
		"//go.mod",
		"/link.txt",
	} {
		conn, err := net.Dial("tcp", srv.Listener.Addr().String())
		if err != nil {
			t.Fatal(err)
		}
		conn.SetDeadline(time.Now().Add(5 * time.Second))
		fmt.Fprintf(conn, "GET %s HTTP/1.1\r\nHost: 127.0.0.1\r\nConnection: close\r\n\r\n", target)
		resp, err := http.ReadResponse(bufio.NewReader(conn), nil)
		if err != nil {
			conn.Close()
			t.Fatalf("GET %s: %v", target, err)
		}
		body, _ := io.ReadAll(resp.Body)
		resp.Body.Close()
		conn.Close()
		if resp.StatusCode != http.StatusNotFound && resp.StatusCode != http.StatusBadRequest {
			t.Errorf("GET %s: status = %d, want 404 or 400", target, resp.StatusCode)
		}
		if bytes.Contains(body, []byte("secret")) {
			t.Errorf("GET %s: served the file outside the directory: %q", target, body)
		}
	}
}

func TestResolve(t *testing.T) {
	tests := []struct {
		in     string
		want   string
		wantOK bool
	}{
		{"/", "index.html", true},
		{"/app.js", "app.js", true},
		{"/img/dot.svg", "img/dot.svg", true},
		{"/img/", "img/index.html", true},
		{"", "", false},
		{"app.js", "", false},
		{"/../go.mod", "", false},
		{"/a/../b", "", false},
		{"/./a", "", false},
		{"//a", "", false},
		{"/a\\b", "", false},
		{"/.git/config", "", false},
		{"/app.js.br", "", false},
		{"/app.js.gz", "", false},
	}
	for _, tt := range tests {
		got, ok := resolve(tt.in)
		if got != tt.want || ok != tt.wantOK {
			t.Errorf("resolve(%q) = %q, %v, want %q, %v", tt.in, got, ok, tt.want, tt.wantOK)
		}
	}
}

func TestAcceptedEncodings(t *testing.T) {
	tests := []struct {
		in       string
		br, gzip bool
	}{
		{"", false, false},
		{"br", true, false},
		{"gzip, deflate, br, zstd", true, true},
		{"GZIP", false, true},
		{"x-gzip", false, true},
		{"br;q=0, gzip;q=0.5", false, true},
		{"br; q=0.0", false, false},
		{"*", true, true},
		{"*;q=0, gzip", false, true},
		{"br;q=bad", false, false},
		{"identity", false, false},
	}
	for _, tt := range tests {
		got := acceptedEncodings(tt.in)
		if got["br"] != tt.br || got["gzip"] != tt.gzip {
			t.Errorf("acceptedEncodings(%q) = %v, want br %v gzip %v", tt.in, got, tt.br, tt.gzip)
		}
	}
}

func TestContentType(t *testing.T) {
	tests := []struct{ name, want string }{
		{"setcard.0123456789.wasm", "application/wasm"},
		{"app.0123456789.js", "text/javascript; charset=utf-8"},
		{"manifest.0123456789.webmanifest", "application/manifest+json"},
		{"icon.svg", "image/svg+xml"},
		{"app.css", "text/css; charset=utf-8"},
		{"build.json", "application/json"},
		{"index.html", "text/html; charset=utf-8"},
		{"INDEX.HTML", "text/html; charset=utf-8"},
		{"blob", "application/octet-stream"},
	}
	for _, tt := range tests {
		if got := contentType(tt.name); got != tt.want {
			t.Errorf("contentType(%q) = %q, want %q", tt.name, got, tt.want)
		}
	}
}

func TestDefaultAddrIsLoopback(t *testing.T) {
	opts, err := parseFlags(nil, io.Discard)
	if err != nil {
		t.Fatal(err)
	}
	host, port, err := net.SplitHostPort(opts.Addr)
	if err != nil {
		t.Fatalf("default -addr %q: %v", opts.Addr, err)
	}
	if ip := net.ParseIP(host); ip == nil || !ip.IsLoopback() {
		t.Errorf("default -addr = %q, want a loopback address", opts.Addr)
	}
	if opts.Addr != "127.0.0.1:8080" || port != "8080" {
		t.Errorf("default -addr = %q, want 127.0.0.1:8080", opts.Addr)
	}
	if opts.Dir != "dist" {
		t.Errorf("default -dir = %q, want dist", opts.Dir)
	}
}

var announce = regexp.MustCompile(`^Setcard is being served at http://127\.0\.0\.1:(\d+)/$`)

// TestRunServesAndStops runs the command on a free port, fetches the page
// and stops it as a signal would.
func TestRunServesAndStops(t *testing.T) {
	dir, files := testSite(t)
	ctx, cancel := context.WithCancel(context.Background())
	defer cancel()
	pr, pw := io.Pipe()
	var stderr bytes.Buffer
	done := make(chan int, 1)
	go func() {
		done <- runContext(ctx, []string{"-addr", "127.0.0.1:0", "-dir", dir}, pw, &stderr)
		pw.Close()
	}()
	line, err := bufio.NewReader(pr).ReadString('\n')
	if err != nil {
		t.Fatalf("reading the announcement: %v", err)
	}
	line = strings.TrimSuffix(line, "\n")
	m := announce.FindStringSubmatch(line)
	if m == nil || m[1] == "0" {
		t.Fatalf("announcement = %q, want %s with the real port", line, announce)
	}
	c := &http.Client{Transport: &http.Transport{DisableCompression: true}, Timeout: 5 * time.Second}
	resp, body := get(t, c, http.MethodGet, "http://127.0.0.1:"+m[1]+"/", "")
	if resp.StatusCode != http.StatusOK || !bytes.Equal(body, files["index.html"]) {
		t.Errorf("GET / = %d, %d bytes; want 200 and index.html", resp.StatusCode, len(body))
	}
	c.CloseIdleConnections()
	cancel()
	select {
	case code := <-done:
		if code != 0 {
			t.Errorf("runContext after cancel = %d, want 0 (stderr %s)", code, stderr.String())
		}
	case <-time.After(10 * time.Second):
		t.Fatal("runContext did not return after cancel")
	}
}

func TestRunErrors(t *testing.T) {
	dir, _ := testSite(t)
	tests := []struct {
		args []string
		want int
	}{
		{[]string{"-h"}, 0},
		{[]string{"-nosuchflag"}, 2},
		{[]string{"extra"}, 2},
		{[]string{"-addr", "127.0.0.1:0", "-dir", filepath.Join(dir, "missing")}, 1},
		{[]string{"-addr", "127.0.0.1:0", "-dir", filepath.Join(dir, "index.html")}, 1},
		{[]string{"-addr", "127.0.0.1:notaport", "-dir", dir}, 1},
	}
	for _, tt := range tests {
		var stdout, stderr bytes.Buffer
		if got := runContext(context.Background(), tt.args, &stdout, &stderr); got != tt.want {
			t.Errorf("runContext(%q) = %d, want %d (stderr %s)", tt.args, got, tt.want, stderr.String())
		}
	}
}
