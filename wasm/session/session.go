// Package session is the state of the interactive chart, free of Ebiten
// and of the browser: the current project, the on-canvas controls (ram
// mass, drop, pile length), pointer and keyboard input, the crosshair, and
// the screen layout (the chart of package chart plus the controls, as
// drawing primitives). The Ebiten program in package main only feeds it
// input and draws what it lays out, so all of this tests natively.
package session

import (
	"fmt"
	"math"
	"slices"

	"setcard/calc"
	"setcard/calc/chart"
)

// ControlName names an on-canvas control.
type ControlName string

// The three on-canvas controls.
const (
	Ram    ControlName = "ram"
	Drop   ControlName = "drop"
	Length ControlName = "length"
)

// Control is one on-canvas slider. Positions are in CSS pixels of the
// canvas.
type Control struct {
	Name  ControlName
	Label string
	Unit  string
	Value float64
	Min   float64
	Max   float64
	// Log is true for a logarithmic track.
	Log bool
	// Step is what an arrow key moves (shift: ten steps); Snap the
	// resolution of a dragged value.
	Step, Snap float64
	Track      chart.Rect
	Handle     chart.Rect
	// Box is the whole area of the control, label included: a press
	// anywhere in it starts a drag.
	Box chart.Rect
}

// pos is the track position (0 to 1) of a value.
func (c *Control) pos(v float64) float64 {
	if c.Log {
		return math.Log(v/c.Min) / math.Log(c.Max/c.Min)
	}
	return (v - c.Min) / (c.Max - c.Min)
}

// valueAt is the value at a track position, snapped and clamped.
func (c *Control) valueAt(t float64) float64 {
	t = min(max(t, 0), 1)
	var v float64
	if c.Log {
		v = c.Min * math.Pow(c.Max/c.Min, t)
	} else {
		v = c.Min + t*(c.Max-c.Min)
	}
	return c.clamp(math.Round(v/c.Snap) * c.Snap)
}

func (c *Control) clamp(v float64) float64 {
	return math.Round(min(max(v, c.Min), c.Max)*1e6) / 1e6
}

// Reading is what the crosshair reads off the nearest curve.
type Reading struct {
	X, Y       float64 // the pointer, CSS px
	DropM      float64
	KN         float64 // capacity on the chart's x axis
	SetMm10    float64
	SetMm      float64
	Zone       calc.Zone
	CurveIndex int
}

// Session is the interactive chart's state. The zero value is not usable;
// make one with New.
type Session struct {
	project *calc.Project
	model   *calc.Model

	w, h    float64 // canvas size, CSS px
	measure chart.Measure

	controls  []Control
	selected  int // the control that has keyboard focus
	dragging  int // the control being dragged, -1 when none
	dropIndex int // the drop that the drop control moves

	chartLayout *chart.Layout // recomputed when the project or size changes
	dirty       bool
	hover       *Reading

	// Version rises every time the drawing changes, so a renderer can
	// cache what it drew.
	Version int
}

// New starts a session on a project, which must be valid.
func New(p *calc.Project, measure chart.Measure) (*Session, error) {
	if measure == nil {
		measure = chart.SansMeasure
	}
	s := &Session{w: 800, h: 600, measure: measure, dragging: -1}
	if err := s.Apply(p); err != nil {
		return nil, err
	}
	s.dropIndex = len(s.model.DropsM) - 1
	return s, nil
}

// Apply replaces the project if it is valid; otherwise it returns the
// validation errors and changes nothing.
func (s *Session) Apply(p *calc.Project) error {
	m, err := calc.Resolve(p)
	if err != nil {
		return err
	}
	s.project, s.model = p.Clone(), m
	if s.dropIndex >= len(m.DropsM) {
		s.dropIndex = len(m.DropsM) - 1
	}
	s.invalidate()
	return nil
}

// Project returns a copy of the current project.
func (s *Session) Project() *calc.Project { return s.project.Clone() }

// Model is the current resolved project. Do not change it.
func (s *Session) Model() *calc.Model { return s.model }

// Rows is the required-set table of the current project.
func (s *Session) Rows() []calc.TableRow { return s.model.TableRows() }

// Resize sets the canvas size in CSS pixels.
func (s *Session) Resize(w, h float64) {
	if w == s.w && h == s.h {
		return
	}
	s.w, s.h = max(w, 200), max(h, 200)
	s.invalidate()
}

// Size is the canvas size in CSS pixels.
func (s *Session) Size() (w, h float64) { return s.w, s.h }

func (s *Session) invalidate() {
	s.dirty = true
	s.Version++
}

// Dirty reports whether the next Layout call lays out again.
func (s *Session) Dirty() bool { return s.dirty }

// stripHeight is the height of the controls strip at the bottom.
func (s *Session) stripHeight() float64 {
	if s.w >= 560 {
		return 64
	}
	return 3 * 56
}

// Recompute lays out the chart and the controls if anything changed, and
// reports whether it did.
func (s *Session) Recompute() bool {
	if !s.dirty {
		return false
	}
	s.dirty = false
	sh := s.stripHeight()
	// Nothing keeps the old layout once the new one is made (Chart's
	// callers take it afresh), so its memory is recycled.
	s.chartLayout = chart.Chart(s.model, chart.ChartOptions{W: s.w, H: s.h - sh, Measure: s.measure, CurvePoints: 120, Recycle: s.chartLayout})
	s.layoutControls(s.h-sh, sh)
	if s.hover != nil {
		s.Hover(s.hover.X, s.hover.Y)
	}
	return true
}

// Chart is the chart's layout (the top part of the canvas).
func (s *Session) Chart() *chart.Layout {
	s.Recompute()
	return s.chartLayout
}

// layoutControls places the three sliders in the strip starting at y0.
func (s *Session) layoutControls(y0, sh float64) {
	m := s.model
	lenCtl := Control{Name: Length, Label: "Pile length", Unit: "m", Value: m.LengthsM[0],
		Min: calc.LimitLengthM.Min, Max: calc.LimitLengthM.Max, Log: true, Step: 0.5, Snap: 0.1}
	if len(m.LengthsM) > 1 {
		lenCtl.Label = "Longest pile"
		lenCtl.Value = m.LongestM()
		lenCtl.Min = m.LengthsM[0] + 0.1
		if st := s.project.Pile.LengthStepM; st != nil {
			// Keep within the number of lengths the core accepts.
			lenCtl.Max = min(lenCtl.Max, m.LengthsM[0]+*st*float64(calc.LimitLengths-2))
		}
	}
	s.controls = []Control{
		{Name: Ram, Label: "Ram mass", Unit: "kg", Value: m.RamKg, Min: calc.LimitRamKg.Min, Max: calc.LimitRamKg.Max,
			Log: true, Step: 10, Snap: 5},
		{Name: Drop, Label: fmt.Sprintf("Drop %d of %d", s.dropIndex+1, len(m.DropsM)), Unit: "m", Value: m.DropsM[s.dropIndex],
			Min: calc.LimitDropM.Min, Max: calc.LimitDropM.Max, Step: 0.05, Snap: 0.01},
		lenCtl,
	}
	const pad, handleW, handleH = 16.0, 22.0, 28.0
	cols, rowH := 3, sh
	if s.w < 560 {
		cols, rowH = 1, sh/3
	}
	colW := (s.w - pad) / float64(cols)
	for i := range s.controls {
		c := &s.controls[i]
		col, row := i%cols, i/cols
		x := pad + float64(col)*colW
		y := y0 + float64(row)*rowH
		c.Box = chart.Rect{X: x, Y: y, W: colW - pad, H: rowH}
		trackY := y + rowH - handleH/2 - 8
		c.Track = chart.Rect{X: x + handleW/2, Y: trackY - 2, W: colW - pad - handleW, H: 4}
		hx := c.Track.X + c.pos(c.Value)*c.Track.W
		c.Handle = chart.Rect{X: hx - handleW/2, Y: trackY - handleH/2, W: handleW, H: handleH}
	}
}

// Controls returns the controls as laid out.
func (s *Session) Controls() []Control {
	s.Recompute()
	return slices.Clone(s.controls)
}

// Selected is the index of the control with keyboard focus.
func (s *Session) Selected() int { return s.selected }

// set changes one control's value in the project. It reports whether the
// project changed; a value the core refuses (a drop equal to another drop)
// changes nothing.
func (s *Session) set(i int, v float64) bool {
	c := s.controls[i]
	v = c.clamp(v)
	p := s.project.Clone()
	switch c.Name {
	case Ram:
		p.Hammer.RamKg = calc.F(v)
	case Drop:
		p.DropsM[s.dropIndex] = v
	case Length:
		if p.Pile.LengthMaxM != nil {
			p.Pile.LengthMaxM = calc.F(v)
		} else {
			p.Pile.LengthM = calc.F(v)
		}
	}
	if v == c.Value {
		return false
	}
	if err := s.Apply(p); err != nil {
		return false
	}
	return true
}

// Press starts a drag when (x, y) is on a control, and reports whether it
// was. A press on the chart near a curve makes that curve's drop the one
// the drop control moves.
func (s *Session) Press(x, y float64) bool {
	s.Recompute()
	for i, c := range s.controls {
		if c.Box.Contains(chart.Point{X: x, Y: y}) || c.Handle.Contains(chart.Point{X: x, Y: y}) {
			s.dragging, s.selected = i, i
			s.Move(x, y)
			s.Version++
			return true
		}
	}
	if r := s.read(x, y); r != nil && r.CurveIndex != s.dropIndex {
		s.dropIndex = r.CurveIndex
		s.selected = 1
		s.invalidate()
		return true
	}
	return false
}

// Move continues a drag, and reports whether the project changed.
func (s *Session) Move(x, y float64) bool {
	if s.dragging < 0 {
		return false
	}
	c := &s.controls[s.dragging]
	t := (x - c.Track.X) / c.Track.W
	return s.set(s.dragging, c.valueAt(t))
}

// Release ends a drag.
func (s *Session) Release() {
	if s.dragging >= 0 {
		s.dragging = -1
		s.Version++
	}
}

// Dragging is the index of the control being dragged, or -1.
func (s *Session) Dragging() int { return s.dragging }

// Key is a keyboard action on the canvas.
type Key int

// The keyboard actions.
const (
	KeyNext  Key = iota + 1 // Tab
	KeyPrev                 // Shift+Tab
	KeyUp                   // arrow right or up
	KeyDown                 // arrow left or down
	KeyBigUp                // Shift+arrow or Page Up
	KeyBigDown
	KeyMin // Home
	KeyMax // End
)

// Press a key; it reports whether the project changed.
func (s *Session) Key(k Key) bool {
	s.Recompute()
	n := len(s.controls)
	c := s.controls[s.selected]
	switch k {
	case KeyNext:
		s.selected = (s.selected + 1) % n
		s.Version++
		return false
	case KeyPrev:
		s.selected = (s.selected + n - 1) % n
		s.Version++
		return false
	case KeyUp:
		return s.set(s.selected, c.Value+c.Step)
	case KeyDown:
		return s.set(s.selected, c.Value-c.Step)
	case KeyBigUp:
		return s.set(s.selected, c.Value+10*c.Step)
	case KeyBigDown:
		return s.set(s.selected, c.Value-10*c.Step)
	case KeyMin:
		return s.set(s.selected, c.Min)
	case KeyMax:
		return s.set(s.selected, c.Max)
	}
	return false
}

// Hover moves the crosshair to (x, y); outside the plot it hides it.
func (s *Session) Hover(x, y float64) {
	r := s.read(x, y)
	if (r == nil) != (s.hover == nil) || r != nil && *r != *s.hover {
		s.Version++
	}
	s.hover = r
}

// Leave hides the crosshair.
func (s *Session) Leave() {
	if s.hover != nil {
		s.hover = nil
		s.Version++
	}
}

// Reading is the crosshair's reading, nil when hidden.
func (s *Session) Reading() *Reading { return s.hover }

// read finds the curve nearest (x, y) in the plot.
func (s *Session) read(x, y float64) *Reading {
	s.Recompute()
	pl := s.chartLayout.Plot
	if pl == nil || !pl.Contains(x, y) {
		return nil
	}
	kN := pl.KNAt(x)
	best, bestD := -1, math.Inf(1)
	var bestSet float64
	for i := range pl.Series {
		set, ok := pl.Series[i].SetAt(kN)
		if !ok {
			continue
		}
		if d := math.Abs(pl.YOf(set) - y); d < bestD {
			best, bestD, bestSet = i, d, set
		}
	}
	if best < 0 {
		return nil
	}
	zone := calc.Medium
	switch {
	case kN < pl.EasyEdgeKN:
		zone = calc.Easy
	case kN >= pl.HardEdgeKN:
		zone = calc.Hard
	}
	return &Reading{X: x, Y: y, DropM: pl.Series[best].DropM, KN: kN, SetMm10: bestSet, SetMm: bestSet / 10, Zone: zone, CurveIndex: best}
}
