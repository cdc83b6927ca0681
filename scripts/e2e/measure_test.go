//go:build !(js && wasm)

package e2e

import (
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"
	"time"

	"github.com/chromedp/chromedp"
)

// BenchmarkDragInBrowser measures, in the page under Chromium's software
// renderer, the Go time per Update and per Draw and the recompute time
// while the ram handle is dragged back and forth for four seconds, and
// reports their medians and 99th percentiles. Run it with
//
//	go test -run '^$' -bench DragInBrowser ./scripts/e2e/
//
// It also reports the sizes of the built .wasm (raw, gzip, brotli).
func BenchmarkDragInBrowser(b *testing.B) {
	srv := serve(b, distDir, "")
	br := newBrowser(b, 1280, 900)
	br.open(srv.URL)
	var st state
	for range b.N {
		st = br.state()
		var ctl = st.Controls[0]
		x, y := ctl.X+ctl.W/2, ctl.Y+ctl.H/2
		br.do("press", chromedp.MouseEvent(chromedp.MouseMoved, x, y), chromedp.MouseEvent(chromedp.MousePressed, x, y, chromedp.ButtonLeft))
		start := time.Now()
		for i := 0; time.Since(start) < 4*time.Second; i++ {
			dx := float64(i%60) * 2
			if (i/60)%2 == 1 {
				dx = 120 - dx
			}
			br.do("move", chromedp.MouseEvent(chromedp.MouseMoved, x+dx, y, chromedp.ButtonLeft), chromedp.Sleep(8*time.Millisecond))
		}
		br.do("release", chromedp.MouseEvent(chromedp.MouseReleased, x, y, chromedp.ButtonLeft))
		st = br.state()
	}
	for _, k := range []string{"update_ms", "draw_ms", "recompute_ms"} {
		v := slices.Clone(st.Timings[k])
		if len(v) == 0 {
			b.Fatalf("no %s recorded", k)
		}
		slices.Sort(v)
		name := strings.TrimSuffix(k, "_ms")
		b.ReportMetric(v[len(v)/2], name+"-median-ms")
		b.ReportMetric(v[min(len(v)-1, len(v)*99/100)], name+"-p99-ms")
		b.ReportMetric(float64(len(v)), name+"-samples")
	}
	ms, _ := filepath.Glob(filepath.Join(distDir, "setcard.*.wasm*"))
	for _, m := range ms {
		if fi, err := os.Stat(m); err == nil {
			ext := filepath.Ext(m)
			if ext == ".wasm" {
				ext = ".raw"
			}
			b.ReportMetric(float64(fi.Size())/1e6, "wasm"+ext+"-MB")
		}
	}
}
