package session

import (
	"fmt"
	"image/color"
	"strconv"

	"setcard/calc/chart"
)

// Colours of the controls and the crosshair: dark on light, so they read
// in greyscale too.
var (
	ink       = color.RGBA{0x1f, 0x29, 0x33, 0xff}
	trackGrey = color.RGBA{0xb0, 0xb8, 0xc0, 0xff}
	focusBlue = color.RGBA{0x0b, 0x5c, 0xad, 0xff}
	paper     = color.RGBA{0xff, 0xff, 0xff, 0xff}
	panel     = color.RGBA{0xf2, 0xf4, 0xf6, 0xff}
	labelBack = color.RGBA{0xff, 0xff, 0xff, 0xf0}
)

// Overlay lays out what is drawn over the chart: the controls strip and
// the crosshair. It is cheap, so it is laid out every frame; the chart
// itself is laid out only when the project or the size changes.
func (s *Session) Overlay() []chart.Item {
	s.Recompute()
	var items []chart.Item
	sh := s.stripHeight()
	items = append(items, area(chart.Rect{X: 0, Y: s.h - sh, W: s.w, H: sh}, panel))
	for i, c := range s.controls {
		active := i == s.selected
		col := ink
		if active {
			col = focusBlue
		}
		label := fmt.Sprintf("%s: %s %s", c.Label, formatValue(c), c.Unit)
		if active {
			label = "» " + label
		}
		items = append(items, s.text(label, chart.Point{X: c.Box.X, Y: c.Box.Y + 18}, 14, active, chart.Start, col, "control-label"))
		items = append(items, area(c.Track, trackGrey))
		// The filled part of the track, up to the handle.
		fill := c.Track
		fill.W = c.Handle.X + c.Handle.W/2 - c.Track.X
		items = append(items, area(fill, col))
		h := c.Handle
		items = append(items, chart.Item{Kind: chart.Area, Points: rectPoints(h), Fill: paper, Stroke: col, Width: 2, Role: "handle-" + string(c.Name)})
		if i == s.dragging || active {
			in := chart.Rect{X: h.X + 5, Y: h.Y + 5, W: h.W - 10, H: h.H - 10}
			items = append(items, area(in, col))
		}
	}
	if r := s.hover; r != nil && s.chartLayout.Plot != nil {
		items = append(items, s.crosshair(r)...)
	}
	return items
}

func formatValue(c Control) string {
	switch c.Name {
	case Ram:
		return strconv.FormatFloat(c.Value, 'f', 0, 64)
	case Drop:
		return strconv.FormatFloat(c.Value, 'f', 2, 64)
	}
	return strconv.FormatFloat(c.Value, 'f', 1, 64)
}

func (s *Session) crosshair(r *Reading) []chart.Item {
	pl := s.chartLayout.Plot
	f := pl.Frame
	x, y := pl.XOf(r.KN), pl.YOf(r.SetMm10)
	dash := []float64{4, 3}
	items := []chart.Item{
		{Kind: chart.Line, Points: []chart.Point{{X: x, Y: f.Y}, {X: x, Y: f.Y + f.H}}, Stroke: ink, Width: 1, Dash: dash, Role: "crosshair"},
		{Kind: chart.Line, Points: []chart.Point{{X: f.X, Y: y}, {X: f.X + f.W, Y: y}}, Stroke: ink, Width: 1, Dash: dash, Role: "crosshair"},
		{Kind: chart.Area, Points: rectPoints(chart.Rect{X: x - 4, Y: y - 4, W: 8, H: 8}), Fill: ink, Role: "crosshair"},
	}
	basis := "design"
	if pl.Ultimate {
		basis = "ultimate"
	}
	lines := []string{
		fmt.Sprintf("Drop %s m", strconv.FormatFloat(r.DropM, 'f', 2, 64)),
		fmt.Sprintf("Set %s mm / 10 blows (%s mm / blow)", strconv.FormatFloat(r.SetMm10, 'f', 1, 64), strconv.FormatFloat(r.SetMm, 'f', 2, 64)),
		fmt.Sprintf("Capacity %s kN %s", strconv.FormatFloat(r.KN, 'f', 0, 64), basis),
		fmt.Sprintf("Zone: %s driving", r.Zone),
	}
	const size, lh, pad = 13.0, 17.0, 6.0
	w := 0.0
	for _, l := range lines {
		w = max(w, s.measure(l, size, false))
	}
	bw, bh := w+2*pad, float64(len(lines))*lh+2*pad-4
	bx, by := x+12, y-bh-12
	if bx+bw > f.X+f.W {
		bx = x - 12 - bw
	}
	if by < f.Y {
		by = y + 12
	}
	items = append(items, chart.Item{Kind: chart.Area, Points: rectPoints(chart.Rect{X: bx, Y: by, W: bw, H: bh}), Fill: labelBack, Stroke: ink, Width: 1, Role: "crosshair"})
	for i, l := range lines {
		items = append(items, s.text(l, chart.Point{X: bx + pad, Y: by + pad + 12 + float64(i)*lh}, size, i == 1, chart.Start, ink, "reading"))
	}
	return items
}

func (s *Session) text(str string, at chart.Point, size float64, bold bool, a chart.Anchor, c color.RGBA, role string) chart.Item {
	return chart.Item{Kind: chart.Text, Text: str, At: at, Size: size, Bold: bold, Anchor: a, Fill: c, Role: role,
		Box: chart.TextBox(s.measure, str, at, size, bold, a, false)}
}

func rectPoints(r chart.Rect) []chart.Point {
	return []chart.Point{{X: r.X, Y: r.Y}, {X: r.X + r.W, Y: r.Y}, {X: r.X + r.W, Y: r.Y + r.H}, {X: r.X, Y: r.Y + r.H}}
}

func area(r chart.Rect, c color.RGBA) chart.Item {
	return chart.Item{Kind: chart.Area, Points: rectPoints(r), Fill: c}
}
