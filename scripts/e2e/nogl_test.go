//go:build !(js && wasm)

package e2e

import (
	"strings"
	"testing"

	"github.com/chromedp/chromedp"
)

// Without WebGL the page says so in one line and draws the same chart as
// SVG from the shared layout; the table and the form still work.
func TestNoWebGL(t *testing.T) {
	srv := serve(t, distDir, "")
	b := newBrowser(t, 1280, 900, chromedp.Flag("disable-3d-apis", true), chromedp.Flag("disable-webgl", true))
	b.open(srv.URL)
	notice := eval[string](b, `(() => { const n = document.getElementById("chart-notice"); return n && !n.hidden && getComputedStyle(n).display !== "none" ? n.textContent : ""; })()`)
	if !strings.Contains(strings.ToLower(notice), "webgl") {
		t.Fatalf("no visible notice about WebGL; #chart-notice says %q", notice)
	}
	if n := strings.Count(strings.TrimSpace(notice), "\n"); n > 0 {
		t.Errorf("the notice is %d lines, want one: %q", n+1, notice)
	}
	svgText := eval[string](b, `(() => { const s = document.querySelector("#chart-svg svg"); return s ? s.textContent : ""; })()`)
	st := b.state()
	if !sameRows(st.Rows, coreRows(t, demoJSON(t))) {
		t.Errorf("rows without WebGL differ from the core's rows")
	}
	for _, r := range st.Rows {
		if r.Governs && r.SetMmPer10Blows != nil {
			want := strings.TrimSuffix(strings.TrimRight(formatSet(*r.SetMmPer10Blows), "0"), ".")
			if !strings.Contains(svgText, formatSet(*r.SetMmPer10Blows)) && !strings.Contains(svgText, want) {
				t.Errorf("the SVG chart does not show %s mm per 10 blows for drop %g m", formatSet(*r.SetMmPer10Blows), r.DropM)
			}
		}
	}
	// A typed value redraws the SVG chart.
	before := svgText
	b.typeValue("f-design-load_kn", "80")
	b.waitFor("the SVG chart to follow", `(() => { const s = document.querySelector("#chart-svg svg"); return s && s.textContent !== `+jsString(before)+`; })()`, 20e9)
	if got := eval[float64](b, `window.setcard.state().project.design.load_kn`); got != 80 {
		t.Errorf("design load after typing 80: %g", got)
	}
}
