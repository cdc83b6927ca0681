//go:build !(js && wasm)

package e2e

import (
	"bytes"
	"context"
	"encoding/json"
	"fmt"
	"image"
	"image/png"
	"os"
	"path/filepath"
	"strconv"
	"testing"
	"time"

	"github.com/chromedp/cdproto/cdp"
	"github.com/chromedp/cdproto/input"
	"github.com/chromedp/chromedp"
	"github.com/chromedp/chromedp/kb"

	"setcard/calc"
)

// state is window.setcard.state() as the test hook gives it.
type state struct {
	Project  json.RawMessage `json:"project"`
	Rows     []calc.TableRow `json:"rows"`
	Controls []struct {
		Name     string  `json:"name"`
		Value    float64 `json:"value"`
		X, Y     float64
		W, H     float64
		Selected bool `json:"selected"`
	} `json:"controls"`
	Timings map[string][]float64 `json:"timings"`
}

func (b *browser) state() state {
	b.t.Helper()
	return eval[state](b, "window.setcard.state()")
}

// coreRows is what the calculation core gives for a project.
func coreRows(t *testing.T, project []byte) []calc.TableRow {
	t.Helper()
	p, err := calc.DecodeBytes(project)
	if err != nil {
		t.Fatalf("the page's project does not decode: %v\n%s", err, project)
	}
	m, err := calc.Resolve(p)
	if err != nil {
		t.Fatalf("the page's project is invalid: %v", err)
	}
	return m.TableRows()
}

func demoJSON(t *testing.T) []byte {
	b, err := os.ReadFile(filepath.Join(root, "testdata", "demo.json"))
	if err != nil {
		t.Fatal(err)
	}
	return b
}

func sameRows(a, b []calc.TableRow) bool {
	x, _ := json.Marshal(a)
	y, _ := json.Marshal(b)
	return bytes.Equal(x, y)
}

// frameShot is a screenshot of the chart frame.
func (b *browser) frameShot() image.Image {
	b.t.Helper()
	ctx, cancel := context.WithTimeout(b.ctx, 30*time.Second)
	defer cancel()
	buf, err := chromedp.Run(ctx, chromedp.Screenshot(chromedp.CSS("#chart-frame")))
	if err != nil {
		b.t.Fatalf("screenshot of the chart: %v", err)
	}
	img, err := png.Decode(bytes.NewReader(buf))
	if err != nil {
		b.t.Fatal(err)
	}
	return img
}

// inked counts the pixels that are not near white, and the distinct
// colours, of an image.
func inked(img image.Image) (dark int, colours int) {
	seen := map[uint32]bool{}
	r := img.Bounds()
	for y := r.Min.Y; y < r.Max.Y; y++ {
		for x := r.Min.X; x < r.Max.X; x++ {
			cr, cg, cb, _ := img.At(x, y).RGBA()
			if cr+cg+cb < 3*0xd000 {
				dark++
			}
			seen[(cr>>12)<<8|(cg>>12)<<4|cb>>12] = true
		}
	}
	return dark, len(seen)
}

func differ(a, b image.Image) int {
	n := 0
	r := a.Bounds()
	if r != b.Bounds() {
		return r.Dx() * r.Dy()
	}
	for y := r.Min.Y; y < r.Max.Y; y++ {
		for x := r.Min.X; x < r.Max.X; x++ {
			if a.At(x, y) != b.At(x, y) {
				n++
			}
		}
	}
	return n
}

// First load: the canvas draws the demo chart, and the table is the
// core's table for the demo project.
func TestFirstLoad(t *testing.T) {
	srv := serve(t, distDir, "")
	b := newBrowser(t, 1280, 900)
	b.open(srv.URL)
	st := b.state()
	if !sameRows(st.Rows, coreRows(t, demoJSON(t))) {
		t.Errorf("rows on first load differ from the core's rows for testdata/demo.json:\n%+v", st.Rows)
	}
	if eval[bool](b, `!document.getElementById("chart-frame").hidden && getComputedStyle(document.getElementById("chart-frame")).display !== "none"`) == false {
		t.Fatal("the chart frame is hidden: WebGL (SwiftShader) was not found")
	}
	img := b.frameShot()
	dark, colours := inked(img)
	total := img.Bounds().Dx() * img.Bounds().Dy()
	if dark < total/100 || colours < 8 {
		t.Errorf("the canvas looks empty: %d of %d pixels inked, %d colours", dark, total, colours)
	}
	// The HTML table shows each criterion.
	text := eval[string](b, `document.getElementById("set-table").innerText`)
	for _, r := range st.Rows {
		if r.Governs && r.SetMmPer10Blows != nil {
			want := fmt.Sprintf("%.1f", *r.SetMmPer10Blows)
			if !bytes.Contains([]byte(text), []byte(want)) {
				t.Errorf("the table does not show %s mm per 10 blows for drop %g m:\n%s", want, r.DropM, text)
			}
		}
	}
	if len(st.Controls) != 3 {
		t.Fatalf("state().controls = %+v, want ram, drop and length", st.Controls)
	}
}

// lastSet is the governing set per blow of the last drop.
func lastSet(rows []calc.TableRow) float64 {
	for i := len(rows) - 1; i >= 0; i-- {
		if rows[i].Governs && rows[i].SetMmPerBlow != nil {
			return *rows[i].SetMmPerBlow
		}
	}
	return -1
}

// Drag each on-canvas control to the right, with the mouse and with a
// finger: the value rises, the table moves the right way and the canvas
// changes.
func TestDragControls(t *testing.T) {
	srv := serve(t, distDir, "")
	for _, touch := range []bool{false, true} {
		b := newBrowser(t, 1280, 900)
		b.open(srv.URL)
		for _, c := range []struct {
			name string
			up   bool // the required set rises with the value
		}{{"ram", true}, {"drop", true}, {"length", false}} {
			before := b.state()
			shot := b.frameShot()
			var ctl = before.Controls[0]
			for _, k := range before.Controls {
				if k.Name == c.name {
					ctl = k
				}
			}
			x, y := ctl.X+ctl.W/2, ctl.Y+ctl.H/2
			if touch {
				b.touchDrag(x, y, x+50, y)
			} else {
				b.mouseDrag(x, y, x+50, y)
			}
			b.waitFor(c.name+" to change", fmt.Sprintf(`window.setcard.state().controls.find(c => c.name === %q).value > %g`, c.name, ctl.Value), 10*time.Second)
			after := b.state()
			s0, s1 := lastSet(before.Rows), lastSet(after.Rows)
			if c.up && !(s1 > s0) || !c.up && !(s1 < s0) {
				t.Errorf("touch=%v %s: set per blow %g after the drag, was %g", touch, c.name, s1, s0)
			}
			if !sameRows(after.Rows, coreRows(t, after.Project)) {
				t.Errorf("touch=%v %s: rows after the drag are not the core's rows for the page's project", touch, c.name)
			}
			time.Sleep(200 * time.Millisecond)
			if n := differ(shot, b.frameShot()); n < 500 {
				t.Errorf("touch=%v %s: the canvas changed in only %d pixels", touch, c.name, n)
			}
		}
	}
}

func (b *browser) mouseDrag(x0, y0, x1, y1 float64) {
	b.t.Helper()
	steps := []chromedp.Action[chromedp.Void]{
		chromedp.MouseEvent(chromedp.MouseMoved, x0, y0),
		chromedp.MouseEvent(chromedp.MousePressed, x0, y0, chromedp.ButtonLeft),
	}
	for i := 1; i <= 10; i++ {
		f := float64(i) / 10
		steps = append(steps, chromedp.MouseEvent(chromedp.MouseMoved, x0+(x1-x0)*f, y0+(y1-y0)*f, chromedp.ButtonLeft), chromedp.Sleep(20*time.Millisecond))
	}
	steps = append(steps, chromedp.MouseEvent(chromedp.MouseReleased, x1, y1, chromedp.ButtonLeft))
	b.do("mouse drag", steps...)
}

func (b *browser) touchDrag(x0, y0, x1, y1 float64) {
	b.t.Helper()
	touch := func(typ input.DispatchTouchEventType, pts ...*input.TouchPoint) chromedp.Action[chromedp.Void] {
		return chromedp.Func(func(ctx context.Context, tg *chromedp.Target) error {
			_, err := cdp.Call(ctx, tg, input.DispatchTouchEvent, input.DispatchTouchEventParams{Type: typ, TouchPoints: pts})
			return err
		})
	}
	steps := []chromedp.Action[chromedp.Void]{touch(input.DispatchTouchEventTypeTouchStart, &input.TouchPoint{X: x0, Y: y0}), chromedp.Sleep(50 * time.Millisecond)}
	for i := 1; i <= 10; i++ {
		f := float64(i) / 10
		steps = append(steps, touch(input.DispatchTouchEventTypeTouchMove, &input.TouchPoint{X: x0 + (x1-x0)*f, Y: y0 + (y1-y0)*f}), chromedp.Sleep(20*time.Millisecond))
	}
	steps = append(steps, touch(input.DispatchTouchEventTypeTouchEnd))
	b.do("touch drag", steps...)
}

// formatSet writes a set per 10 blows as the page and the card print it.
func formatSet(v float64) string { return strconv.FormatFloat(v, 'f', 1, 64) }

// jsString quotes s as a JavaScript string literal.
func jsString(s string) string {
	b, _ := json.Marshal(s)
	return string(b)
}

// typeValue replaces the text of the input with the given id by typing, as a
// user would: focus, select all, type.
func (b *browser) typeValue(id, text string) {
	b.t.Helper()
	eval[bool](b, `(() => { const e = document.getElementById(`+jsString(id)+`); e.focus(); e.select(); return true; })()`)
	if text == "" {
		b.do("clearing #"+id, chromedp.KeyEvent(kb.Delete))
		return
	}
	b.do("typing into #"+id, chromedp.KeyEvent(text))
}
