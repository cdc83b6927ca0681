//go:build js && wasm

package main

import (
	"image"
	"image/color"
	"math"
	"slices"
	"sync"

	"github.com/hajimehoshi/ebiten/v2"
	"github.com/hajimehoshi/ebiten/v2/text/v2"
	"github.com/hajimehoshi/ebiten/v2/vector"
	"golang.org/x/image/font"
	"golang.org/x/image/font/gofont/goregular"
	"golang.org/x/image/font/opentype"

	"setcard/calc/chart"
)

// painter draws chart layouts with Ebiten. It does no layout arithmetic:
// every position comes from the layout and is multiplied by one scale.
//
// It ships one face, Go Regular: bold text is drawn twice, a small offset
// apart, which costs nothing in the download (a second face would add about
// 70 kB to the compressed program).
type painter struct {
	regular  *opentype.Font
	mu       sync.Mutex
	faces    map[faceKey]*text.GoXFace
	advances map[rune]float64
	labels   map[labelKey]*label
	frame    int // counts static redraws, for the label cache
	// draft turns anti-aliasing off: while a handle is dragged the chart
	// is redrawn every frame, and the smooth version follows on release.
	draft bool

	white *ebiten.Image
	vs    []ebiten.Vertex
	is    []uint16
}

type faceKey struct {
	px int // size in 1/8 px
}

func newPainter() *painter {
	reg, err := opentype.Parse(goregular.TTF)
	if err != nil {
		panic("setcard: shipped font does not parse: " + err.Error())
	}
	white := ebiten.NewImage(3, 3)
	white.Fill(color.White)
	return &painter{regular: reg, faces: map[faceKey]*text.GoXFace{}, advances: map[rune]float64{}, labels: map[labelKey]*label{},
		white: white.SubImage(image.Rect(1, 1, 2, 2)).(*ebiten.Image)}
}

// face returns the font face of a size in device pixels.
func (p *painter) face(sizePx float64) *text.GoXFace {
	k := faceKey{int(math.Round(sizePx * 8))}
	p.mu.Lock()
	defer p.mu.Unlock()
	if f, ok := p.faces[k]; ok {
		return f
	}
	xf, err := opentype.NewFace(p.regular, &opentype.FaceOptions{Size: float64(k.px) / 8, DPI: 72, Hinting: font.HintingNone})
	if err != nil {
		panic("setcard: font face: " + err.Error())
	}
	f := text.NewGoXFace(xf)
	p.faces[k] = f
	return f
}

// boldOffset is how far apart the two strokes of bold text are, as a part
// of the font size.
const boldOffset = 0.05

// measure is the width of a string in the size's own units, for layouts.
// Without hinting, advances scale with the size, so each rune's advance is
// read once from a 64 px face and kept: layouts measure hundreds of
// candidate labels, and reading the font each time is slow under
// WebAssembly. (Kerning is ignored; the Go fonts' pairs are small.)
func (p *painter) measure(s string, size float64, bold bool) float64 {
	w := 0.0
	for _, r := range s {
		w += p.advance64(r)
	}
	w *= size / 64
	if bold {
		w += boldOffset * size
	}
	return w
}

// advance64 is the advance of a rune at 64 px.
func (p *painter) advance64(r rune) float64 {
	p.mu.Lock()
	a, ok := p.advances[r]
	p.mu.Unlock()
	if ok {
		return a
	}
	a = text.Advance(string(r), p.face(64))
	p.mu.Lock()
	p.advances[r] = a
	p.mu.Unlock()
	return a
}

// draw draws items scaled by scale onto dst. Consecutive single segments
// of one style (grid lines, ticks, hatching) go into one path and so one
// DrawTriangles call; every other item is one call of its own.
func (p *painter) draw(dst *ebiten.Image, items []chart.Item, scale float64) {
	p.frame++
	for i := 0; i < len(items); i++ {
		it := &items[i]
		switch it.Kind {
		case chart.Line:
			var path vector.Path
			j := i
			for ; j < len(items) && sameLineStyle(&items[j], it); j++ {
				addPath(&path, items[j].Points, it.Dash, scale, false)
			}
			i = j - 1
			// Segments are drawn without anti-aliasing: under a software
			// renderer it costs a pass, and they are mostly straight.
			p.strokePath(dst, &path, it.Width*scale, it.Stroke, false)
		case chart.Polyline:
			var path vector.Path
			addPath(&path, it.Points, it.Dash, scale, false)
			p.strokePath(dst, &path, it.Width*scale, it.Stroke, !straight(it.Points))
		case chart.Area:
			p.fill(dst, it.Points, it.Fill, scale)
			if it.Width > 0 {
				var path vector.Path
				addPath(&path, it.Points, nil, scale, true)
				p.strokePath(dst, &path, it.Width*scale, it.Stroke, !straight(it.Points))
			}
		case chart.Text:
			p.text(dst, it, scale)
		}
	}
}

func sameLineStyle(a, b *chart.Item) bool {
	return a.Kind == chart.Line && a.Stroke == b.Stroke && a.Width == b.Width && slices.Equal(a.Dash, b.Dash)
}

// addPath adds a polyline, dashed when asked, to a path.
func addPath(path *vector.Path, pts []chart.Point, dash []float64, scale float64, closed bool) {
	if len(pts) < 2 {
		return
	}
	if len(dash) >= 2 {
		dashed(path, pts, dash, scale)
		return
	}
	path.MoveTo(float32(pts[0].X*scale), float32(pts[0].Y*scale))
	for _, q := range pts[1:] {
		path.LineTo(float32(q.X*scale), float32(q.Y*scale))
	}
	if closed {
		path.Close()
	}
}

// strokePath strokes a path as one DrawTriangles call.
func (p *painter) strokePath(dst *ebiten.Image, path *vector.Path, width float64, c color.RGBA, antialias bool) {
	if width <= 0 || c.A == 0 {
		return
	}
	p.vs, p.is = path.AppendVerticesAndIndicesForStroke(p.vs[:0], p.is[:0], &vector.StrokeOptions{Width: float32(width), LineJoin: vector.LineJoinBevel, LineCap: vector.LineCapButt})
	if len(p.is) == 0 {
		return
	}
	p.triangles(dst, c, ebiten.FillRuleFillAll, antialias)
}

// dashed adds the on-segments of a dash pattern along a polyline.
func dashed(path *vector.Path, pts []chart.Point, dash []float64, scale float64) {
	k, left, on := 0, dash[0]*scale, true
	for i := 1; i < len(pts); i++ {
		ax, ay := pts[i-1].X*scale, pts[i-1].Y*scale
		bx, by := pts[i].X*scale, pts[i].Y*scale
		seg := math.Hypot(bx-ax, by-ay)
		pos := 0.0
		for pos < seg {
			step := math.Min(left, seg-pos)
			if on {
				t0, t1 := pos/seg, (pos+step)/seg
				path.MoveTo(float32(ax+(bx-ax)*t0), float32(ay+(by-ay)*t0))
				path.LineTo(float32(ax+(bx-ax)*t1), float32(ay+(by-ay)*t1))
			}
			pos += step
			left -= step
			if left <= 1e-9 {
				k = (k + 1) % len(dash)
				left, on = dash[k]*scale, !on
			}
		}
	}
}

// fill fills a polygon as one DrawTriangles call.
func (p *painter) fill(dst *ebiten.Image, pts []chart.Point, c color.RGBA, scale float64) {
	if len(pts) < 3 || c.A == 0 {
		return
	}
	var path vector.Path
	path.MoveTo(float32(pts[0].X*scale), float32(pts[0].Y*scale))
	for _, q := range pts[1:] {
		path.LineTo(float32(q.X*scale), float32(q.Y*scale))
	}
	path.Close()
	p.vs, p.is = path.AppendVerticesAndIndicesForFilling(p.vs[:0], p.is[:0])
	p.triangles(dst, c, ebiten.FillRuleNonZero, !straight(pts))
}

// straight reports whether every edge of a path is horizontal or vertical:
// such paths (grid, ticks, bands, hatch frames) need no anti-aliasing, which
// costs an extra pass under a software renderer.
func straight(pts []chart.Point) bool {
	for i := 1; i < len(pts); i++ {
		if pts[i].X != pts[i-1].X && pts[i].Y != pts[i-1].Y {
			return false
		}
	}
	return true
}

func (p *painter) triangles(dst *ebiten.Image, c color.RGBA, rule ebiten.FillRule, antialias bool) {
	r, g, b, a := float32(c.R)/255, float32(c.G)/255, float32(c.B)/255, float32(c.A)/255
	for i := range p.vs {
		p.vs[i].SrcX, p.vs[i].SrcY = 1.5, 1.5
		// Straight alpha: DrawTrianglesOptions' default colour-scale mode.
		p.vs[i].ColorR, p.vs[i].ColorG, p.vs[i].ColorB, p.vs[i].ColorA = r, g, b, a
	}
	op := &ebiten.DrawTrianglesOptions{FillRule: rule, AntiAlias: antialias && !p.draft}
	dst.DrawTriangles(p.vs, p.is, p.white, op)
}

// label is one line of text rendered once, white on transparent, to be
// tinted when drawn.
type label struct {
	img      *ebiten.Image
	w        float64 // advance width, device px
	ascent   float64 // from the top of img to the baseline, device px
	pad      float64
	lastUsed int
}

type labelKey struct {
	s    string
	px   int // size in 1/8 device px
	bold bool
}

// maxLabels bounds the label cache; when it is full, the labels not used
// in the last frames are dropped.
const maxLabels = 600

// label returns the rendered image of a line of text. Labels repeat from
// frame to frame (ticks, titles, zone names), so one DrawImage per label
// replaces one per glyph.
func (p *painter) label(s string, sizePx float64, bold bool) *label {
	k := labelKey{s, int(math.Round(sizePx * 8)), bold}
	if l, ok := p.labels[k]; ok {
		l.lastUsed = p.frame
		return l
	}
	if len(p.labels) >= maxLabels {
		for k, l := range p.labels {
			if l.lastUsed < p.frame-1 {
				l.img.Deallocate()
				delete(p.labels, k)
			}
		}
	}
	f := p.face(sizePx)
	m := f.Metrics()
	w := text.Advance(s, f)
	extra := 0.0
	if bold {
		extra = math.Max(1, math.Round(boldOffset*sizePx))
	}
	const pad = 2.0
	iw := int(math.Ceil(w+extra+2*pad)) + 1
	ih := int(math.Ceil(m.HAscent+m.HDescent+2*pad)) + 1
	img := ebiten.NewImage(max(iw, 1), max(ih, 1))
	op := &text.DrawOptions{}
	op.GeoM.Translate(pad, pad)
	text.Draw(img, s, f, op)
	if bold {
		op.GeoM.Translate(extra, 0)
		text.Draw(img, s, f, op)
	}
	l := &label{img: img, w: w + extra, ascent: m.HAscent + pad, pad: pad, lastUsed: p.frame}
	p.labels[k] = l
	return l
}

// text draws one line of text at its baseline anchor.
func (p *painter) text(dst *ebiten.Image, it *chart.Item, scale float64) {
	l := p.label(it.Text, it.Size*scale, it.Bold)
	x := -l.pad
	switch it.Anchor {
	case chart.Middle:
		x -= l.w / 2
	case chart.End:
		x -= l.w
	}
	op := &ebiten.DrawImageOptions{}
	op.GeoM.Translate(x, -l.ascent)
	if it.Vertical {
		op.GeoM.Rotate(-math.Pi / 2)
	}
	op.GeoM.Translate(it.At.X*scale, it.At.Y*scale)
	op.ColorScale.ScaleWithColor(it.Fill)
	op.Filter = ebiten.FilterLinear
	dst.DrawImage(l.img, op)
}
