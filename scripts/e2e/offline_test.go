//go:build !(js && wasm)

package e2e

import (
	"fmt"
	"net/http"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"
	"time"

	"github.com/chromedp/chromedp"
)

// siteCaches are the service worker's caches the page sees.
func (b *browser) siteCaches() []string {
	b.t.Helper()
	return eval[[]string](b, `caches.keys().then((k) => k.filter((n) => n.startsWith("setcard-")))`)
}

// reload reloads the page and waits for its first chart; when says in
// what state, for the failure message.
func (b *browser) reload(when string) {
	b.t.Helper()
	b.do("reloading "+when, chromedp.Reload())
	b.waitFor("the first chart after a reload", "window.setcard && window.setcard.ready", 90*time.Second)
}

// works checks that the page shows the chart and the table of its project.
func (b *browser) works(t *testing.T, when string) {
	t.Helper()
	st := b.state()
	if len(st.Rows) == 0 {
		t.Fatalf("%s: the page has no rows", when)
	}
	if !sameRows(st.Rows, coreRows(t, st.Project)) {
		t.Errorf("%s: the rows are not the core's rows for the page's project", when)
	}
	if n := eval[int](b, `document.querySelectorAll("#set-table-body tr").length`); n != len(st.Rows) {
		t.Errorf("%s: the table shows %d rows, want %d", when, n, len(st.Rows))
	}
	img := b.frameShot()
	if dark, colours := inked(img); dark < img.Bounds().Dx()*img.Bounds().Dy()/100 || colours < 8 {
		t.Errorf("%s: the canvas looks empty (%d pixels inked, %d colours)", when, dark, colours)
	}
}

// builtFile is the content-hashed name the build gave a site file.
func builtFile(t *testing.T, dist, base, ext string) string {
	t.Helper()
	m, _ := filepath.Glob(filepath.Join(dist, base+".*."+ext))
	if len(m) != 1 {
		t.Fatalf("%s holds %d files %s.*.%s, want 1", dist, len(m), base, ext)
	}
	return filepath.Base(m[0])
}

// Offline: after one visit the site works with the server gone; a new
// build, once online again, replaces the old cache whole.
func TestOffline(t *testing.T) {
	// The second build takes a while: start it now.
	newSite, newDist := filepath.Join(t.TempDir(), "site"), filepath.Join(t.TempDir(), "dist")
	built := make(chan error, 1)
	go func() {
		if err := os.CopyFS(newSite, os.DirFS(filepath.Join(root, "site"))); err != nil {
			built <- err
			return
		}
		css := filepath.Join(newSite, "app.css")
		f, err := os.OpenFile(css, os.O_APPEND|os.O_WRONLY, 0)
		if err == nil {
			_, err = fmt.Fprint(f, "\n/* the next build */\n.e2e-next-build { color: inherit; }\n")
			if cerr := f.Close(); err == nil {
				err = cerr
			}
		}
		if err != nil {
			built <- err
			return
		}
		built <- buildSite(newDist, newSite)
	}()

	srv := serve(t, distDir, "")
	b := newBrowser(t, 1280, 900)
	b.open(srv.URL)
	if !b.poll("navigator.serviceWorker.controller", 20*time.Second) {
		b.reload("for the service worker to take control")
		b.waitFor("the service worker to control the page", "navigator.serviceWorker.controller", 30*time.Second)
	}
	old := b.siteCaches()
	if len(old) != 1 {
		t.Fatalf("after the first visit the caches are %v, want one setcard- cache", old)
	}
	oldCSS := builtFile(t, distDir, "app", "css")

	// The server goes away; the site still opens and works.
	srv.stop()
	if resp, err := http.Get(srv.URL); err == nil {
		resp.Body.Close()
		t.Fatalf("the server still answers after stop")
	}
	b.reload("with the server stopped (offline)")
	b.works(t, "offline")
	if !eval[bool](b, fmt.Sprintf(`document.querySelector('link[rel="stylesheet"]').href.endsWith(%q)`, oldCSS)) {
		t.Errorf("offline, the page does not use the cached %s", oldCSS)
	}

	// A new build on the same address replaces the old cache whole.
	select {
	case err := <-built:
		if err != nil {
			t.Fatalf("building the next site: %v", err)
		}
	case <-time.After(10 * time.Minute):
		t.Fatal("building the next site took more than 10 minutes")
	}
	newCSS := builtFile(t, newDist, "app", "css")
	if newCSS == oldCSS {
		t.Fatalf("the next build kept the name %s: its change did not reach app.css", newCSS)
	}
	serve(t, newDist, srv.Addr())
	var now []string
	for try := 0; try < 3; try++ {
		b.reload("with the new build served")
		if b.poll(fmt.Sprintf(`caches.keys().then((k) => { const s = k.filter((n) => n.startsWith("setcard-")); return s.length === 1 && s[0] !== %q; })`, old[0]), 20*time.Second) {
			break
		}
	}
	now = b.siteCaches()
	if len(now) != 1 || slices.Contains(now, old[0]) {
		t.Fatalf("after the new build the caches are %v, want one setcard- cache other than %s", now, old[0])
	}
	b.reload("after the update")
	b.works(t, "after the update")
	href := eval[string](b, `document.querySelector('link[rel="stylesheet"]').href`)
	if !strings.HasSuffix(href, newCSS) {
		t.Errorf("after the update the page uses %s, want the new build's %s", href, newCSS)
	}
	if !eval[bool](b, `Array.from(document.styleSheets).some((s) => Array.from(s.cssRules).some((r) => r.selectorText === ".e2e-next-build"))`) {
		t.Errorf("after the update the page's style sheet is not the new build's")
	}
	// The new cache holds the new build's files.
	cached := eval[[]string](b, fmt.Sprintf(`caches.open(%q).then((c) => c.keys()).then((r) => r.map((q) => new URL(q.url).pathname.slice(1)))`, now[0]))
	for _, f := range []string{newCSS, builtFile(t, newDist, "app", "js"), builtFile(t, newDist, "setcard", "wasm")} {
		if !slices.Contains(cached, f) {
			t.Errorf("the new cache %s lacks %s: %v", now[0], f, cached)
		}
	}
	if slices.Contains(cached, oldCSS) {
		t.Errorf("the new cache %s holds the old %s", now[0], oldCSS)
	}
}
