package session

import (
	"bytes"
	"os"
	"testing"

	"setcard/calc"
)

func demo(t *testing.T) *Session {
	t.Helper()
	b, err := os.ReadFile("../../testdata/demo.json")
	if err != nil {
		t.Fatal(err)
	}
	p, err := calc.DecodeBytes(b)
	if err != nil {
		t.Fatal(err)
	}
	s, err := New(p, nil)
	if err != nil {
		t.Fatal(err)
	}
	s.Resize(1000, 640)
	return s
}

// The copy of the demo project that the browser program embeds is the
// demo project.
func TestEmbeddedDemoIsTestdataDemo(t *testing.T) {
	a, err := os.ReadFile("../demo.json")
	if err != nil {
		t.Fatal(err)
	}
	b, err := os.ReadFile("../../testdata/demo.json")
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(a, b) {
		t.Fatal("wasm/demo.json differs from testdata/demo.json: copy it again")
	}
}

func control(s *Session, n ControlName) (int, Control) {
	for i, c := range s.Controls() {
		if c.Name == n {
			return i, c
		}
	}
	panic("no control " + n)
}

func firstSet(s *Session) float64 { return *s.Rows()[len(s.Rows())-1].SetMmPerBlow }

// Dragging a handle to the right raises its value, and the required set
// moves the way the formula says: a heavier ram or a higher drop needs a
// larger set for the same load (more energy per blow), a longer pile a
// smaller one.
func TestDragMovesTableTheRightWay(t *testing.T) {
	for _, c := range []struct {
		name ControlName
		up   bool // whether the set rises with the value
	}{{Ram, true}, {Drop, true}, {Length, false}} {
		s := demo(t)
		before := firstSet(s)
		_, ctl := control(s, c.name)
		hx, hy := ctl.Handle.X+ctl.Handle.W/2, ctl.Handle.Y+ctl.Handle.H/2
		if !s.Press(hx, hy) {
			t.Fatalf("%s: press on the handle at (%g, %g) did not start a drag", c.name, hx, hy)
		}
		if !s.Move(hx+60, hy) {
			t.Fatalf("%s: drag did not change the project", c.name)
		}
		s.Release()
		_, after := control(s, c.name)
		if after.Value <= ctl.Value {
			t.Errorf("%s: value %g after dragging right, was %g", c.name, after.Value, ctl.Value)
		}
		got := firstSet(s)
		if c.up && !(got > before) || !c.up && !(got < before) {
			t.Errorf("%s: set of the last row %g after the drag, was %g", c.name, got, before)
		}
		if after.Handle.X <= ctl.Handle.X {
			t.Errorf("%s: handle did not follow: x %g, was %g", c.name, after.Handle.X, ctl.Handle.X)
		}
	}
}

func TestKeyboard(t *testing.T) {
	s := demo(t)
	if s.Selected() != 0 {
		t.Fatalf("selected %d at start, want 0", s.Selected())
	}
	ram := *s.Project().Hammer.RamKg
	if !s.Key(KeyUp) {
		t.Fatal("arrow did not change the ram")
	}
	if got := *s.Project().Hammer.RamKg; got != ram+10 {
		t.Errorf("ram after arrow = %g, want %g", got, ram+10)
	}
	s.Key(KeyNext)
	if s.Selected() != 1 {
		t.Errorf("Tab: selected %d, want 1", s.Selected())
	}
	s.Key(KeyPrev)
	s.Key(KeyPrev)
	if s.Selected() != 2 {
		t.Errorf("Shift+Tab twice from 1: selected %d, want 2", s.Selected())
	}
	s.Key(KeyMax)
	// The demo's range 6 m by 1.5 m steps may hold at most LimitLengths
	// lengths: the control stops at 6 + 1.5 × 23 = 40.5 m.
	if got := *s.Project().Pile.LengthMaxM; got != 40.5 {
		t.Errorf("End on length: %g, want 40.5", got)
	}
}

// A drop dragged onto another drop is refused by the core; the session
// keeps the last valid project.
func TestInvalidDragChangesNothing(t *testing.T) {
	s := demo(t)
	p := s.Project()
	p.DropsM = []float64{0.6, 0.61}
	if err := s.Apply(p); err != nil {
		t.Fatal(err)
	}
	// The drop control moves the last drop, 0.61; one step down is 0.56,
	// clear; set it straight to 0.6 through the control's setter instead.
	i, _ := control(s, Drop)
	if s.set(i, 0.6) {
		t.Fatal("a duplicate drop was accepted")
	}
	if got := s.Project().DropsM; got[1] != 0.61 {
		t.Errorf("drops %v after a refused change, want [0.6 0.61]", got)
	}
	bad := s.Project()
	bad.Hammer.RamKg = calc.F(-1)
	if err := s.Apply(bad); err == nil {
		t.Fatal("Apply accepted a negative ram")
	}
	if *s.Project().Hammer.RamKg != 500 {
		t.Error("a refused Apply changed the project")
	}
}

func TestCrosshairReadsNearestCurve(t *testing.T) {
	s := demo(t)
	pl := s.Chart().Plot
	if pl == nil || len(pl.Series) != 4 {
		t.Fatalf("plot %v, want 4 series", pl)
	}
	sr := pl.Series[2]
	k := len(sr.KN) / 2
	x, y := pl.XOf(sr.KN[k]), pl.YOf(sr.SetMm10[k])
	s.Hover(x, y+1)
	r := s.Reading()
	if r == nil {
		t.Fatal("no reading inside the plot")
	}
	if r.DropM != sr.DropM {
		t.Errorf("reading on drop %g, want %g", r.DropM, sr.DropM)
	}
	if d := r.SetMm10 - sr.SetMm10[k]; d > 0.01*sr.SetMm10[k] || d < -0.01*sr.SetMm10[k] {
		t.Errorf("reading set %g, want about %g", r.SetMm10, sr.SetMm10[k])
	}
	if r.SetMm*10 != r.SetMm10 {
		t.Errorf("per blow %g is not a tenth of per 10 blows %g", r.SetMm, r.SetMm10)
	}
	s.Hover(1, 1)
	if s.Reading() != nil {
		t.Error("reading outside the plot")
	}
}

func TestRecomputeOnlyOnChange(t *testing.T) {
	s := demo(t)
	s.Recompute()
	if s.Recompute() {
		t.Error("Recompute with no change laid out again")
	}
	s.Hover(500, 300)
	if s.Recompute() {
		t.Error("hover laid the chart out again")
	}
	s.Key(KeyUp)
	if !s.Dirty() && !s.Recompute() {
		t.Error("a change of ram did not lay out again")
	}
}

func TestOverlayFitsCanvas(t *testing.T) {
	for _, size := range [][2]float64{{1000, 640}, {400, 700}} {
		s := demo(t)
		s.Resize(size[0], size[1])
		for _, it := range s.Overlay() {
			for _, p := range it.Points {
				if p.X < 0 || p.X > size[0] || p.Y < 0 || p.Y > size[1] {
					t.Fatalf("%v: overlay point %v outside the canvas", size, p)
				}
			}
			if it.Text != "" && (it.Box.X < 0 || it.Box.X+it.Box.W > size[0]) {
				t.Errorf("%v: text %q overflows the canvas: %v", size, it.Text, it.Box)
			}
		}
		for _, c := range s.Controls() {
			if c.Handle.H < 24 || c.Handle.W < 20 {
				t.Errorf("%v: handle %v too small to touch", size, c.Handle)
			}
		}
	}
}

func BenchmarkDragRecompute(b *testing.B) {
	bs, _ := os.ReadFile("../../testdata/demo.json")
	p, _ := calc.DecodeBytes(bs)
	s, _ := New(p, nil)
	s.Resize(1200, 700)
	i, c := 0, s.Controls()[0]
	b.ReportAllocs()
	for b.Loop() {
		i++
		s.set(0, c.Value+float64(i%50)*5)
		s.Recompute()
		_ = s.Overlay()
	}
}
