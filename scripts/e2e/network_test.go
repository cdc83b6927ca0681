//go:build !(js && wasm)

package e2e

import (
	"net/url"
	"strings"
	"testing"
	"time"
)

// Network: in a whole session (load, drag, type, print), every request the
// page and its chart frame make goes to the local server.
func TestOnlyLocalRequests(t *testing.T) {
	srv := serve(t, distDir, "")
	b := newBrowser(t, 1280, 900)
	b.open(srv.URL)
	b.stubPrint()

	// Drag the ram, type a load, print, reload (the service worker now
	// answers), drag again.
	st := b.state()
	for _, c := range st.Controls {
		if c.Name == "ram" {
			x, y := c.X+c.W/2, c.Y+c.H/2
			b.mouseDrag(x, y, x+40, y)
			b.waitFor("the ram to move", "window.setcard.state().project.hammer.ram_kg !== 500", 10*time.Second)
		}
	}
	b.typeInto("f-design-load_kn", "140")
	b.waitFor("the typed load", "window.setcard.state().project.design.load_kn === 140", 10*time.Second)
	b.click("print-button")
	b.waitFor("the print", "window.__printed === 1 && document.querySelector('#print-area > svg')", 10*time.Second)
	b.click("share-copy")
	// Copied, or shown for copying by hand where the clipboard is refused.
	b.waitFor("the share link", `document.getElementById("app-msg").textContent.includes("link")`, 10*time.Second)
	b.reload("after printing")
	st = b.state()
	for _, c := range st.Controls {
		if c.Name == "drop" {
			x, y := c.X+c.W/2, c.Y+c.H/2
			b.touchDrag(x, y, x+40, y)
		}
	}
	time.Sleep(time.Second)

	// What the page and its frame fetched, as Chromium saw it and as the
	// pages themselves record it.
	seen := b.Requests()
	seen = append(seen, eval[[]string](b, `[window, document.getElementById("chart-frame").contentWindow]
		.flatMap((w) => w.performance.getEntriesByType("resource").concat(w.performance.getEntriesByType("navigation")).map((e) => e.name))`)...)
	origin, err := url.Parse(srv.URL)
	if err != nil {
		t.Fatal(err)
	}
	local, wasm := 0, false
	for _, r := range seen {
		u, err := url.Parse(r)
		if err != nil {
			t.Errorf("a request to an address that does not parse: %q", r)
			continue
		}
		switch {
		case u.Scheme == "data" || u.Scheme == "blob" || r == "about:blank":
		case u.Scheme == origin.Scheme && u.Host == origin.Host:
			local++
			wasm = wasm || strings.HasSuffix(u.Path, ".wasm")
		default:
			t.Errorf("the page asked for %s, which is not the local server %s", r, srv.URL)
		}
	}
	if local < 10 || !wasm {
		t.Errorf("only %d requests to the local server were seen (the .wasm among them: %v): the watch missed the page's requests\n%s", local, wasm, strings.Join(seen, "\n"))
	}
}
