//go:build !(js && wasm)

package e2e

import (
	"fmt"
	"testing"
	"time"
)

// box is the bounding rectangle of an element the user sees, in CSS px of
// the page.
type box struct {
	Name       string `json:"name"`
	X, Y, W, H float64
}

// layoutBoxes are the page's main regions and each visible control of the
// form and the tool bar, with its label.
const layoutBoxes = `(() => {
	const out = [];
	const add = (name, e) => {
		if (!e || e.closest("[hidden]") || getComputedStyle(e).visibility === "hidden") return;
		const r = e.getBoundingClientRect();
		if (r.width < 2 || r.height < 2) return; // the visually hidden file input
		out.push({name, x: r.left + scrollX, y: r.top + scrollY, w: r.width, h: r.height});
	};
	add("chart frame", document.getElementById("chart-frame"));
	add("set table", document.querySelector(".table-wrap"));
	for (const f of document.querySelectorAll("#tools input, #tools select, #tools button, #project-form input, #project-form select, #project-form textarea, #project-form button")) {
		add(f.tagName.toLowerCase() + "#" + f.id, f);
		if (f.id) {
			for (const l of document.querySelectorAll('label[for="' + f.id + '"]')) add("label for " + f.id, l);
		}
	}
	return out;
})()`

// overlap is the area two boxes share.
func overlap(a, b box) float64 {
	w := min(a.X+a.W, b.X+b.W) - max(a.X, b.X)
	h := min(a.Y+a.H, b.Y+b.H) - max(a.Y, b.Y)
	if w <= 0.5 || h <= 0.5 {
		return 0
	}
	return w * h
}

// A narrow tablet: no field, label, chart or table lies over another,
// nothing is wider than the screen, and the chart's controls can still be
// dragged with the mouse and with a finger.
func TestNarrowTablet(t *testing.T) {
	srv := serve(t, distDir, "")
	for _, vp := range []struct{ w, h int }{{600, 1000}, {800, 1100}} {
		t.Run(fmt.Sprintf("%dx%d", vp.w, vp.h), func(t *testing.T) {
			b := newBrowser(t, vp.w, vp.h)
			b.open(srv.URL)
			if got := eval[float64](b, "innerWidth"); int(got) != vp.w {
				t.Fatalf("the viewport is %g px wide, want %d", got, vp.w)
			}
			if sw := eval[float64](b, "document.documentElement.scrollWidth"); sw > float64(vp.w) {
				t.Errorf("the page is %g px wide in a %d px viewport: it scrolls sideways", sw, vp.w)
			}
			boxes := eval[[]box](b, layoutBoxes)
			if len(boxes) < 60 {
				t.Fatalf("only %d boxes measured: %+v", len(boxes), boxes)
			}
			for i, a := range boxes {
				if a.X < -0.5 || a.X+a.W > float64(vp.w)+0.5 {
					t.Errorf("%s reaches past the screen: x %.1f to %.1f of %d", a.Name, a.X, a.X+a.W, vp.w)
				}
				for _, c := range boxes[i+1:] {
					if o := overlap(a, c); o > 0 {
						t.Errorf("%s (%.0f,%.0f %.0f×%.0f) overlaps %s (%.0f,%.0f %.0f×%.0f) by %.0f px²",
							a.Name, a.X, a.Y, a.W, a.H, c.Name, c.X, c.Y, c.W, c.H, o)
					}
				}
			}
			// The chart still takes drags.
			b.js(`document.getElementById("chart-frame").scrollIntoView({block: "center"})`)
			time.Sleep(300 * time.Millisecond)
			for _, c := range []struct {
				name  string
				touch bool
			}{{"ram", false}, {"drop", true}} {
				st := b.state()
				var x, y, v float64
				found := false
				for _, k := range st.Controls {
					if k.Name == c.name {
						x, y, v, found = k.X+k.W/2, k.Y+k.H/2, k.Value, true
					}
				}
				if !found {
					t.Fatalf("no %s control: %+v", c.name, st.Controls)
				}
				if x < 0 || y < 0 || x > float64(vp.w) || y > float64(vp.h) {
					t.Fatalf("the %s handle is off the screen at (%g, %g)", c.name, x, y)
				}
				if c.touch {
					b.touchDrag(x, y, x+40, y)
				} else {
					b.mouseDrag(x, y, x+40, y)
				}
				b.waitFor(c.name+" to move", fmt.Sprintf(`window.setcard.state().controls.find((c) => c.name === %q).value > %g`, c.name, v), 10*time.Second)
				after := b.state()
				if !sameRows(after.Rows, coreRows(t, after.Project)) {
					t.Errorf("after dragging %s the rows are not the core's rows", c.name)
				}
			}
		})
	}
}
