package main

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"mime"
	"net/http"
	"os"
	"path"
	"regexp"
	"strconv"
	"strings"
)

// contentSecurityPolicy is sent with every response; scripts/build puts the
// same policy in index.html.
const contentSecurityPolicy = "default-src 'self'; script-src 'self' 'wasm-unsafe-eval'; style-src 'self'; img-src 'self' data: blob:; connect-src 'self'; worker-src 'self'; manifest-src 'self'; object-src 'none'; base-uri 'none'; form-action 'none'"

const (
	cacheImmutable  = "public, max-age=31536000, immutable"
	cacheRevalidate = "no-cache"
)

// hashedAsset matches the names scripts/build gives to content-hashed
// files: name.<10 hex digits>.ext.
var hashedAsset = regexp.MustCompile(`\.[0-9a-f]{10}\.`)

// contentTypes fixes the media type of the site's file types, whatever the
// machine's MIME tables say.
var contentTypes = map[string]string{
	".html":        "text/html; charset=utf-8",
	".htm":         "text/html; charset=utf-8",
	".js":          "text/javascript; charset=utf-8",
	".mjs":         "text/javascript; charset=utf-8",
	".css":         "text/css; charset=utf-8",
	".json":        "application/json",
	".map":         "application/json",
	".webmanifest": "application/manifest+json",
	".wasm":        "application/wasm",
	".svg":         "image/svg+xml",
	".png":         "image/png",
	".ico":         "image/x-icon",
	".webp":        "image/webp",
	".woff2":       "font/woff2",
	".txt":         "text/plain; charset=utf-8",
	".xml":         "application/xml",
}

// contentType gives the media type for a file name.
func contentType(name string) string {
	ext := strings.ToLower(path.Ext(name))
	if t, ok := contentTypes[ext]; ok {
		return t
	}
	if t := mime.TypeByExtension(ext); t != "" {
		return t
	}
	return "application/octet-stream"
}

// encodings are the precompressed copies looked for, in order of
// preference, with the file suffix of each.
var encodings = []struct{ name, suffix string }{
	{"br", ".br"},
	{"gzip", ".gz"},
}

// fileHandler serves the files of one directory.
type fileHandler struct {
	root *os.Root
	fsys fs.FS
}

// newHandler serves dir. Files are opened through an os.Root, so neither
// ".." nor a symbolic link can reach outside dir. Close releases it.
func newHandler(dir string) (*fileHandler, error) {
	info, err := os.Stat(dir)
	if err != nil {
		if errors.Is(err, fs.ErrNotExist) {
			return nil, fmt.Errorf("%s does not exist; build the site first with: go run ./scripts/build", dir)
		}
		return nil, err
	}
	if !info.IsDir() {
		return nil, fmt.Errorf("%s is not a directory", dir)
	}
	root, err := os.OpenRoot(dir)
	if err != nil {
		return nil, err
	}
	return &fileHandler{root: root, fsys: root.FS()}, nil
}

// Close releases the directory.
func (h *fileHandler) Close() error { return h.root.Close() }

func (h *fileHandler) ServeHTTP(w http.ResponseWriter, r *http.Request) {
	hdr := w.Header()
	hdr.Set("X-Content-Type-Options", "nosniff")
	hdr.Set("Content-Security-Policy", contentSecurityPolicy)
	// Cross-origin isolation: the site loads nothing from elsewhere, and
	// an isolated page gets a fine clock (performance.now to 5 µs instead
	// of 100 µs), which the canvas's timings need to be worth reading.
	hdr.Set("Cross-Origin-Opener-Policy", "same-origin")
	hdr.Set("Cross-Origin-Embedder-Policy", "require-corp")
	if r.Method != http.MethodGet && r.Method != http.MethodHead {
		hdr.Set("Allow", "GET, HEAD")
		httpError(w, http.StatusMethodNotAllowed)
		return
	}
	name, ok := resolve(r.URL.Path)
	if !ok || !h.isFile(name) {
		httpError(w, http.StatusNotFound)
		return
	}

	served := name
	var encoding string
	accepted := acceptedEncodings(r.Header.Get("Accept-Encoding"))
	for _, e := range encodings {
		if !h.isFile(name + e.suffix) {
			continue
		}
		hdr.Set("Vary", "Accept-Encoding")
		if encoding == "" && accepted[e.name] {
			served, encoding = name+e.suffix, e.name
		}
	}

	f, err := h.fsys.Open(served)
	if err != nil {
		httpError(w, http.StatusNotFound)
		return
	}
	defer f.Close()
	info, err := f.Stat()
	if err != nil {
		httpError(w, http.StatusInternalServerError)
		return
	}
	content, ok := f.(io.ReadSeeker)
	if !ok {
		data, err := io.ReadAll(f)
		if err != nil {
			httpError(w, http.StatusInternalServerError)
			return
		}
		content = bytes.NewReader(data)
	}

	hdr.Set("Content-Type", contentType(name))
	if encoding != "" {
		hdr.Set("Content-Encoding", encoding)
		// ServeContent leaves Content-Length out when Content-Encoding is
		// set (it assumes on-the-fly compression); these bytes are the
		// stored ones. It still replaces the length for a range request
		// and drops it for 304 and error answers.
		hdr.Set("Content-Length", strconv.FormatInt(info.Size(), 10))
	}
	if hashedAsset.MatchString(path.Base(name)) {
		hdr.Set("Cache-Control", cacheImmutable)
	} else {
		hdr.Set("Cache-Control", cacheRevalidate)
	}
	// ServeContent answers HEAD, ranges and If-Modified-Since.
	http.ServeContent(w, r, name, info.ModTime(), content)
}

// isFile reports whether name is a regular file in the served directory.
func (h *fileHandler) isFile(name string) bool {
	info, err := fs.Stat(h.fsys, name)
	return err == nil && info.Mode().IsRegular()
}

// resolve turns a request path into a file name in the served directory:
// "/" and any path ending in "/" mean its index.html. It refuses ".." and
// "." segments, empty segments, hidden files, backslashes and the
// precompressed copies, which are only served in place of their original.
func resolve(p string) (string, bool) {
	if !strings.HasPrefix(p, "/") || strings.ContainsAny(p, "\\\x00") {
		return "", false
	}
	name := p[1:]
	if name == "" || strings.HasSuffix(name, "/") {
		name += "index.html"
	}
	if !fs.ValidPath(name) {
		return "", false
	}
	for _, seg := range strings.Split(name, "/") {
		if strings.HasPrefix(seg, ".") {
			return "", false
		}
	}
	for _, e := range encodings {
		if strings.HasSuffix(name, e.suffix) {
			return "", false
		}
	}
	return name, true
}

// acceptedEncodings parses an Accept-Encoding header into the set of
// content codings with a non-zero quality. A "*" stands for every coding
// not named otherwise.
func acceptedEncodings(header string) map[string]bool {
	q := make(map[string]float64)
	for _, part := range strings.Split(header, ",") {
		coding, params, _ := strings.Cut(part, ";")
		coding = strings.ToLower(strings.TrimSpace(coding))
		if coding == "" {
			continue
		}
		if coding == "x-gzip" {
			coding = "gzip"
		}
		weight := 1.0
		for _, param := range strings.Split(params, ";") {
			k, v, ok := strings.Cut(param, "=")
			if ok && strings.EqualFold(strings.TrimSpace(k), "q") {
				if f, err := strconv.ParseFloat(strings.TrimSpace(v), 64); err == nil {
					weight = f
				} else {
					weight = 0
				}
			}
		}
		q[coding] = weight
	}
	accepted := make(map[string]bool)
	for _, e := range encodings {
		w, ok := q[e.name]
		if !ok {
			w, ok = q["*"]
		}
		accepted[e.name] = ok && w > 0
	}
	return accepted
}

// httpError answers with a short plain-text error that is not cached.
func httpError(w http.ResponseWriter, code int) {
	hdr := w.Header()
	hdr.Del("Content-Encoding")
	hdr.Del("Vary")
	hdr.Set("Cache-Control", "no-store")
	http.Error(w, http.StatusText(code), code)
}
