//go:build !(js && wasm)

package e2e

import (
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"
)

// ringSize is how many recent samples of each timing the page keeps
// (wasm/bridge.go).
const ringSize = 600

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
	// scripts/serve isolates the page, so performance.now, and with it Go's
	// clock, runs to 5 µs rather than 100 µs.
	if !eval[bool](br, `document.getElementById("chart-frame").contentWindow.crossOriginIsolated`) {
		b.Log("the chart frame is not cross-origin isolated: timings are to 0.1 ms only")
	}
	var st state
	before := map[string]int{}
	for range b.N {
		for k, v := range br.state().Timings {
			before[k] = len(v)
		}
		// Drag the ram handle with mouse events dispatched on the canvas
		// from the frame's own animation loop, one move a frame for four
		// seconds: the browser, not the test's round trips, sets the pace.
		frames := eval[int](br, `(async () => {
			const w = document.getElementById("chart-frame").contentWindow;
			const c = w.document.querySelector("canvas");
			const ctl = JSON.parse(w.setcardCore.controls())[0];
			const x = ctl.x + ctl.w / 2, y = ctl.y + ctl.h / 2;
			const ev = (type, dx) => c.dispatchEvent(new w.MouseEvent(type, {clientX: x + dx, clientY: y, button: 0, buttons: type === "mouseup" ? 0 : 1, bubbles: true}));
			const frame = () => new Promise((r) => w.requestAnimationFrame(r));
			ev("mousemove", 0); await frame();
			ev("mousedown", 0); await frame();
			const t0 = performance.now();
			let i = 0;
			while (performance.now() - t0 < 4000) {
				const k = i % 120;
				ev("mousemove", k < 60 ? 2 * k : 240 - 2 * k);
				await frame();
				i++;
			}
			ev("mouseup", 0);
			return i;
		})()`)
		b.ReportMetric(float64(frames)/4, "frames/s")
		st = br.state()
	}
	for _, k := range []string{"update_ms", "draw_ms", "recompute_ms"} {
		// Only the samples of the drag: those past the count before it,
		// unless the ring has filled (then all it holds, mostly the drag's).
		v := st.Timings[k]
		if n := len(v); n < ringSize {
			v = v[min(n, before[k]):]
		}
		v = slices.Clone(v)
		if len(v) == 0 {
			b.Fatalf("no %s recorded during the drag", k)
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
