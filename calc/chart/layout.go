package chart

import (
	"image/color"
	"math"
)

// Kind is what an Item draws.
type Kind uint8

// The kinds of drawing primitive.
const (
	// Line is a straight segment from Points[0] to Points[1].
	Line Kind = iota + 1
	// Polyline is an open path through Points.
	Polyline
	// Area is a closed polygon through Points, filled with Fill, and
	// outlined with Stroke when Width > 0.
	Area
	// Text is one line of text, Text, drawn at At.
	Text
)

func (k Kind) String() string {
	switch k {
	case Line:
		return "line"
	case Polyline:
		return "polyline"
	case Area:
		return "area"
	case Text:
		return "text"
	}
	return "kind?"
}

// Anchor says which point of a line of text At is.
type Anchor uint8

// The text anchors, as SVG's text-anchor: At is the start, the middle or
// the end of the baseline.
const (
	Start Anchor = iota
	Middle
	End
)

func (a Anchor) String() string {
	switch a {
	case Middle:
		return "middle"
	case End:
		return "end"
	}
	return "start"
}

// Point is a position in layout units, x to the right and y down.
type Point struct{ X, Y float64 }

// Rect is an axis-aligned rectangle in layout units: X, Y its top-left
// corner.
type Rect struct{ X, Y, W, H float64 }

// Max is the bottom-right corner of r.
func (r Rect) Max() Point { return Point{r.X + r.W, r.Y + r.H} }

// Overlaps reports whether r and s share an area (touching edges do not
// count).
func (r Rect) Overlaps(s Rect) bool {
	return r.X < s.X+s.W && s.X < r.X+r.W && r.Y < s.Y+s.H && s.Y < r.Y+r.H
}

// Inside reports whether r lies within s, with a tolerance of eps.
func (r Rect) Inside(s Rect, eps float64) bool {
	return r.X >= s.X-eps && r.Y >= s.Y-eps && r.X+r.W <= s.X+s.W+eps && r.Y+r.H <= s.Y+s.H+eps
}

// Contains reports whether p lies within r.
func (r Rect) Contains(p Point) bool {
	return p.X >= r.X && p.X <= r.X+r.W && p.Y >= r.Y && p.Y <= r.Y+r.H
}

func (r Rect) inset(d float64) Rect { return Rect{r.X + d, r.Y + d, r.W - 2*d, r.H - 2*d} }

// Item is one drawing primitive. Which fields matter depends on Kind; the
// others are zero. Every coordinate and size is in the layout's units, so a
// renderer multiplies by one scale factor and does no other arithmetic.
type Item struct {
	Kind Kind
	// Points are the vertices of a Line (two), a Polyline or an Area.
	Points []Point
	// Stroke and Width are the colour and width of a Line or Polyline, and
	// of an Area's outline (no outline when Width is 0).
	Stroke color.RGBA
	Width  float64
	// Dash is the on and off lengths of a dashed stroke, starting with
	// on; nil draws a solid stroke.
	Dash []float64
	// Fill is the colour inside an Area, and the colour of a Text.
	Fill color.RGBA

	// Text is the string of a Text item: one line, already fitted, with
	// no control characters.
	Text string
	// At is the anchor point on the baseline (see Anchor). For a Vertical
	// text, the text is turned 90° counter-clockwise about At, so that it
	// reads from bottom to top.
	At       Point
	Size     float64 // the font size (em height)
	Bold     bool
	Anchor   Anchor
	Vertical bool
	// Box is the box the text covers, from Ascent above the baseline to
	// Descent below it, as wide as the layout's Measure says.
	Box Rect

	// Role names what the item shows, for tests, hit-testing and styling:
	// for example "set10" for a criterion in mm per 10 blows. Empty for
	// most items.
	Role string
}

// Ascent and Descent are the parts of the font size above and below the
// baseline that a text box covers. They are generous for capitals and
// descenders of common sans-serif faces.
const (
	Ascent  = 0.78
	Descent = 0.24
)

// Layout is a drawing laid out once, in its own units, for any renderer to
// draw in order: later items cover earlier ones. It is plain data.
type Layout struct {
	// W and H are the size of the drawing; Unit is "mm" for a page and
	// "px" for a screen.
	W, H float64
	Unit string
	// Title names the drawing (the project name), for a renderer's
	// document title.
	Title string
	Items []Item
	// Plot is the chart's plot, for crosshairs and hit-testing; nil when
	// the layout has no chart.
	Plot *Plot

	// slab is the block the short point lists (lines, rectangles, discs)
	// were cut from, kept for ChartOptions.Recycle.
	slab []Point
}

// Texts returns the text items of the layout, in drawing order.
func (l *Layout) Texts() []Item {
	var out []Item
	for _, it := range l.Items {
		if it.Kind == Text {
			out = append(out, it)
		}
	}
	return out
}

// translate moves every item and the plot by (dx, dy).
func (l *Layout) translate(dx, dy float64) {
	for i := range l.Items {
		it := &l.Items[i]
		for j := range it.Points {
			it.Points[j].X += dx
			it.Points[j].Y += dy
		}
		if it.Kind == Text {
			it.At.X += dx
			it.At.Y += dy
			it.Box.X += dx
			it.Box.Y += dy
		}
	}
	if l.Plot != nil {
		l.Plot.Frame.X += dx
		l.Plot.Frame.Y += dy
	}
}

type rgba = color.RGBA

// Colours. All are opaque, so that drawing order alone decides what is
// seen, and all read in a greyscale copy.
var (
	Black     = color.RGBA{0, 0, 0, 255}
	White     = color.RGBA{255, 255, 255, 255}
	Ink       = color.RGBA{25, 25, 25, 255}
	Grey      = color.RGBA{110, 110, 110, 255}
	GridGrey  = color.RGBA{205, 205, 205, 255}
	HatchGrey = color.RGBA{150, 150, 150, 255}
	TintLight = color.RGBA{244, 244, 244, 255}
	TintMid   = color.RGBA{230, 230, 230, 255}
	TintDark  = color.RGBA{214, 214, 214, 255}
)

// curveStyles are the colours of the curves: dark, so that each prints
// near black in greyscale; the dash patterns tell them apart there, with
// the labels on the curves. Six colours and four dashes give twelve
// distinct pairs, the most drops a project may have.
var curveColours = []color.RGBA{
	{20, 20, 20, 255},   // near black
	{0, 70, 160, 255},   // blue
	{170, 40, 20, 255},  // red
	{0, 110, 50, 255},   // green
	{110, 40, 140, 255}, // purple
	{150, 90, 0, 255},   // brown
}

// CurveStyle is the colour and dash pattern (in units of the text size s)
// of the curve of the i-th drop. The chart and the card's table use it, so
// that a row of the table shows the line of its curve.
func CurveStyle(i int, s float64) (color.RGBA, []float64) {
	c := curveColours[i%len(curveColours)]
	switch i % 4 {
	case 1:
		return c, []float64{1.1 * s, 0.45 * s}
	case 2:
		return c, []float64{0.3 * s, 0.3 * s}
	case 3:
		return c, []float64{1.1 * s, 0.35 * s, 0.25 * s, 0.35 * s}
	}
	return c, nil
}

// builder collects items and the boxes of the texts placed so far, so that
// a new label can be refused when it would cover one.
type builder struct {
	items   []Item
	boxes   []Rect
	measure Measure
	plot    *Plot
	// slab is where short point lists are cut from, so that a chart's
	// hundreds of grid lines and ticks are not as many allocations.
	slab []Point
}

func (b *builder) add(it Item) { b.items = append(b.items, it) }

// points returns room for n points cut from the slab, capped so that an
// append cannot run into the next list.
func (b *builder) points(n int) []Point {
	if len(b.slab)+n > cap(b.slab) {
		b.slab = make([]Point, 0, max(2*cap(b.slab), 512, n))
	}
	k := len(b.slab)
	b.slab = b.slab[:k+n]
	return b.slab[k : k+n : k+n]
}

func (b *builder) line(p, q Point, width float64, c color.RGBA, dash []float64) {
	pts := b.points(2)
	pts[0], pts[1] = p, q
	b.add(Item{Kind: Line, Points: pts, Width: width, Stroke: c, Dash: dash})
}

func (b *builder) polyline(pts []Point, width float64, c color.RGBA, dash []float64, role string) {
	if len(pts) < 2 {
		return
	}
	b.add(Item{Kind: Polyline, Points: pts, Width: width, Stroke: c, Dash: dash, Role: role})
}

func (b *builder) rect(r Rect, fill color.RGBA, width float64, stroke color.RGBA, role string) {
	pts := b.points(4)
	pts[0], pts[1], pts[2], pts[3] = Point{r.X, r.Y}, Point{r.X + r.W, r.Y}, Point{r.X + r.W, r.Y + r.H}, Point{r.X, r.Y + r.H}
	b.add(Item{Kind: Area, Points: pts,
		Fill: fill, Width: width, Stroke: stroke, Role: role})
}

// frame outlines r without filling it.
func (b *builder) frame(r Rect, width float64, c color.RGBA) {
	b.polyline([]Point{{r.X, r.Y}, {r.X + r.W, r.Y}, {r.X + r.W, r.Y + r.H}, {r.X, r.Y + r.H}, {r.X, r.Y - width/2}}, width, c, nil, "")
}

// dot is a filled disc, as a polygon.
func (b *builder) dot(c Point, r float64, fill color.RGBA, width float64, stroke color.RGBA, role string) {
	const n = 20
	pts := b.points(n)
	for k := range n {
		a := 2 * math.Pi * float64(k) / n
		pts[k] = Point{c.X + r*math.Cos(a), c.Y + r*math.Sin(a)}
	}
	b.add(Item{Kind: Area, Points: pts, Fill: fill, Width: width, Stroke: stroke, Role: role})
}

// textBox is the box a text would cover.
func (b *builder) textBox(s string, at Point, size float64, bold bool, a Anchor, vertical bool) Rect {
	return TextBox(b.measure, s, at, size, bold, a, vertical)
}

// TextBox is the box that a line of text covers when drawn at the anchor
// point at (on its baseline), from Ascent above the baseline to Descent
// below, as wide as measure says. Layouts outside this package (the
// canvas's controls and crosshair) use it so that every text box is worked
// out one way.
func TextBox(measure Measure, s string, at Point, size float64, bold bool, a Anchor, vertical bool) Rect {
	w := measure(s, size, bold)
	off := 0.0
	switch a {
	case Middle:
		off = w / 2
	case End:
		off = w
	}
	if vertical {
		return Rect{at.X - Ascent*size, at.Y - w + off, (Ascent + Descent) * size, w}
	}
	return Rect{at.X - off, at.Y - Ascent*size, w, (Ascent + Descent) * size}
}

// text adds a text item and records its box.
func (b *builder) text(s string, at Point, size float64, bold bool, a Anchor, c color.RGBA, role string) Rect {
	return b.textV(s, at, size, bold, a, false, c, role)
}

func (b *builder) textV(s string, at Point, size float64, bold bool, a Anchor, vertical bool, c color.RGBA, role string) Rect {
	box := b.textBox(s, at, size, bold, a, vertical)
	b.add(Item{Kind: Text, Text: s, At: at, Size: size, Bold: bold, Anchor: a, Vertical: vertical, Fill: c, Box: box, Role: role})
	b.boxes = append(b.boxes, box)
	return box
}

// free reports whether r, grown by pad, covers no text placed so far.
func (b *builder) free(r Rect, pad float64) bool {
	g := r.inset(-pad)
	for _, o := range b.boxes {
		if g.Overlaps(o) {
			return false
		}
	}
	return true
}

// block reserves r as if it were text, so that no label is put there.
func (b *builder) block(r Rect) { b.boxes = append(b.boxes, r) }
