//go:build js && wasm

package main

import (
	"image"
	"image/color"
	"math"
	"sync"

	"github.com/hajimehoshi/ebiten/v2"
	"golang.org/x/image/font"
	"golang.org/x/image/font/gofont/goregular"
	"golang.org/x/image/font/opentype"
	"golang.org/x/image/math/fixed"

	"setcard/calc/chart"
	"setcard/wasm/tess"
)

// painter draws chart layouts with Ebiten. It does no layout arithmetic:
// every position comes from the layout and is multiplied by one scale.
//
// Everything a layout holds (fills, strokes and text) becomes triangles in
// one vertex buffer that samples one texture, the painter's atlas: a white
// patch for solid colour and the glyphs rasterised so far. A whole chart
// is then one DrawTriangles call, which Ebiten turns into one draw call,
// with no stencil passes and no off-screen anti-aliasing passes: under a
// software renderer every extra pass over the canvas costs milliseconds.
// Edges that need smoothing get a one-pixel fringe fading to transparent,
// drawn in the same call.
//
// It ships one face, Go Regular: bold text is drawn twice, a small offset
// apart, which costs nothing in the download (a second face would add about
// 70 kB to the compressed program).
type painter struct {
	regular *opentype.Font
	mu      sync.Mutex
	faces   map[int]font.Face // by size in 1/8 px
	// ascii holds the advances at 64 px of the runes below 256, read once;
	// others are read on demand into advances.
	ascii    [256]float64
	advances map[rune]float64

	atlas  *ebiten.Image
	glyphs map[glyphKey]glyph
	shelf  tess.Shelf
	pix    []byte

	vs []ebiten.Vertex
	is []uint16
	// pts and runs are scratch space for strokes and dashes.
	pts  []tess.Vec
	runs [][]tess.Vec
	tris []int
}

// The atlas: a white patch in its top-left corner, glyphs after it. When
// it is full, it is cleared and glyphs are rasterised again as needed.
const (
	atlasSize = 1024
	whiteSize = 4
	// fringe is the width of the smoothing fringe in device pixels.
	fringe = 1.0
	// phases is how many horizontal sub-pixel positions a glyph is
	// rasterised at, so that text keeps its spacing without blurring.
	phases = 4
)

// The centre of the white patch: solid colour samples it.
const whiteUV = whiteSize / 2

type glyphKey struct {
	r     rune
	px    int // size in 1/8 px
	phase uint8
}

// glyph is a rasterised glyph: where it is in the atlas, and its offset
// from the pen position (whole pixels plus the phase) to its top-left.
type glyph struct {
	src    image.Rectangle
	dx, dy int
}

func newPainter() *painter {
	reg, err := opentype.Parse(goregular.TTF)
	if err != nil {
		panic("setcard: shipped font does not parse: " + err.Error())
	}
	p := &painter{regular: reg, faces: map[int]font.Face{}, advances: map[rune]float64{}, glyphs: map[glyphKey]glyph{}}
	f := p.face(64)
	for r := range rune(len(p.ascii)) {
		p.ascii[r] = advanceOf(f, r)
	}
	return p
}

func advanceOf(f font.Face, r rune) float64 {
	a, ok := f.GlyphAdvance(r)
	if !ok {
		a, _ = f.GlyphAdvance('\ufffd')
	}
	return float64(a) / 64
}

// face returns the font face of a size in device pixels.
func (p *painter) face(sizePx float64) font.Face {
	k := int(math.Round(sizePx * 8))
	p.mu.Lock()
	defer p.mu.Unlock()
	if f, ok := p.faces[k]; ok {
		return f
	}
	f, err := opentype.NewFace(p.regular, &opentype.FaceOptions{Size: float64(k) / 8, DPI: 72, Hinting: font.HintingNone})
	if err != nil {
		panic("setcard: font face: " + err.Error())
	}
	p.faces[k] = f
	return f
}

// boldOffset is how far apart the two strokes of bold text are, as a part
// of the font size.
const boldOffset = 0.05

// measure is the width of a string in the size's own units, for layouts.
// Without hinting, advances scale with the size, so each rune's advance is
// read once at 64 px and kept: layouts measure hundreds of candidate
// labels. Kerning is ignored, here and when drawing, so that text is drawn
// as wide as it was measured.
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
	if r >= 0 && int(r) < len(p.ascii) {
		return p.ascii[r]
	}
	p.mu.Lock()
	a, ok := p.advances[r]
	p.mu.Unlock()
	if ok {
		return a
	}
	a = advanceOf(p.face(64), r)
	p.mu.Lock()
	p.advances[r] = a
	p.mu.Unlock()
	return a
}

// draw draws items scaled by scale onto dst, in order, in as few
// DrawTriangles calls as the vertex limit allows.
func (p *painter) draw(dst *ebiten.Image, items []chart.Item, scale float64) {
	p.ensureAtlas()
	for i := range items {
		it := &items[i]
		switch it.Kind {
		case chart.Line, chart.Polyline:
			p.strokeItem(dst, it.Points, it.Dash, it.Width*scale, it.Stroke, scale, false)
		case chart.Area:
			p.fill(dst, it.Points, it.Fill, scale)
			if it.Width > 0 {
				p.strokeItem(dst, it.Points, nil, it.Width*scale, it.Stroke, scale, true)
			}
		case chart.Text:
			p.text(dst, it, scale)
		}
	}
	p.flush(dst)
}

// flush draws the buffered triangles.
func (p *painter) flush(dst *ebiten.Image) {
	if len(p.is) > 0 {
		dst.DrawTriangles(p.vs, p.is, p.atlas, &ebiten.DrawTrianglesOptions{})
	}
	p.vs, p.is = p.vs[:0], p.is[:0]
}

// reserve makes room for n more vertices in the buffer, drawing what it
// holds first if they would not fit in one call (indices are 16-bit).
func (p *painter) reserve(dst *ebiten.Image, n int) {
	if len(p.vs)+n > math.MaxUint16 {
		p.flush(dst)
	}
}

// vertex adds a vertex of solid colour c at alpha a (0 to 1).
func (p *painter) vertex(v tess.Vec, c color.RGBA, a float32) uint16 {
	p.vs = append(p.vs, ebiten.Vertex{
		DstX: v.X, DstY: v.Y, SrcX: whiteUV, SrcY: whiteUV,
		ColorR: float32(c.R) / 255, ColorG: float32(c.G) / 255, ColorB: float32(c.B) / 255,
		ColorA: float32(c.A) / 255 * a,
	})
	return uint16(len(p.vs) - 1)
}

// quadIdx adds the two triangles of the quad a b c d (in order round it).
func (p *painter) quadIdx(a, b, c, d uint16) { p.is = append(p.is, a, b, c, a, c, d) }

// scaled converts layout points to device pixels into p.pts, dropping
// repeated points.
func (p *painter) scaled(pts []chart.Point, scale float64) []tess.Vec {
	p.pts = p.pts[:0]
	for _, q := range pts {
		v := tess.Vec{X: float32(q.X * scale), Y: float32(q.Y * scale)}
		if n := len(p.pts); n > 0 && p.pts[n-1] == v {
			continue
		}
		p.pts = append(p.pts, v)
	}
	return p.pts
}

// fill fills a simple polygon (the layouts' areas are rectangles and
// discs, which a fan fills); a fringe smooths the edge of any that is not
// made of straight edges.
func (p *painter) fill(dst *ebiten.Image, pts []chart.Point, c color.RGBA, scale float64) {
	if c.A == 0 {
		return
	}
	v := p.scaled(pts, scale)
	if n := len(v); n > 1 && v[0] == v[n-1] {
		v = v[:n-1]
	}
	n := len(v)
	if n < 3 {
		return
	}
	smooth := !tess.Straight(append(v, v[0]))
	p.reserve(dst, 2*n)
	base := uint16(len(p.vs))
	for _, q := range v {
		p.vertex(q, c, 1)
	}
	p.tris = tess.Triangulate(v, p.tris[:0])
	for _, k := range p.tris {
		p.is = append(p.is, base+uint16(k))
	}
	if !smooth {
		return
	}
	// The fringe: each vertex pushed out along its mitre, fading to 0.
	// Normals point to the left of each edge, which is outwards when the
	// polygon runs clockwise on screen.
	orient := float32(1)
	if tess.Area2(v) < 0 {
		orient = -1
	}
	outer := uint16(len(p.vs))
	for i := range v {
		prev, next := v[(i+n-1)%n], v[(i+1)%n]
		m := tess.Miter(tess.Normal(prev, v[i]), tess.Normal(v[i], next))
		p.vertex(tess.Vec{X: v[i].X + orient*m.X*fringe, Y: v[i].Y + orient*m.Y*fringe}, c, 0)
	}
	for i := range n {
		j := (i + 1) % n
		p.quadIdx(base+uint16(i), base+uint16(j), outer+uint16(j), outer+uint16(i))
	}
}

// strokeItem strokes a polyline of width w device px, dashed when asked.
func (p *painter) strokeItem(dst *ebiten.Image, pts []chart.Point, dash []float64, w float64, c color.RGBA, scale float64, closed bool) {
	if w <= 0 || c.A == 0 || len(pts) < 2 {
		return
	}
	v := p.scaled(pts, scale)
	if len(dash) >= 2 {
		if closed {
			v = append(v, v[0])
		}
		for _, run := range p.dashRuns(v, dash, scale) {
			p.stroke(dst, run, float32(w), c, false)
		}
		return
	}
	p.stroke(dst, v, float32(w), c, closed)
}

// stroke strokes a polyline of width w as one strip of triangles with
// mitred corners (butt ends), smoothed by a fringe unless every segment is
// horizontal or vertical.
func (p *painter) stroke(dst *ebiten.Image, v []tess.Vec, w float32, c color.RGBA, closed bool) {
	n := len(v)
	if closed && n > 1 && v[0] == v[n-1] {
		v, n = v[:n-1], n-1
	}
	if n < 2 {
		return
	}
	smooth := !tess.Straight(v) || closed && !tess.Straight([]tess.Vec{v[n-1], v[0]})
	alpha := float32(1)
	core, outer := w/2, w/2
	if smooth {
		if w < fringe {
			// A hairline: one pixel wide, fainter.
			alpha, w = w/fringe, fringe
		}
		core, outer = (w-fringe)/2, (w+fringe)/2
	}
	per := 2
	if smooth {
		per = 4
	}
	// A strip is drawn in one piece, so split very long ones.
	const maxPts = 4096
	if n > maxPts {
		for i := 0; i < n-1; i += maxPts - 1 {
			p.stroke(dst, v[i:min(n, i+maxPts)], w, c, false)
		}
		if closed {
			p.stroke(dst, []tess.Vec{v[n-1], v[0]}, w, c, false)
		}
		return
	}
	p.reserve(dst, per*(n+1))
	first := uint16(len(p.vs))
	for i := range n {
		var m tess.Vec
		switch {
		case closed:
			m = tess.Miter(tess.Normal(v[(i+n-1)%n], v[i]), tess.Normal(v[i], v[(i+1)%n]))
		case i == 0:
			m = tess.Normal(v[0], v[1])
		case i == n-1:
			m = tess.Normal(v[n-2], v[n-1])
		default:
			m = tess.Miter(tess.Normal(v[i-1], v[i]), tess.Normal(v[i], v[i+1]))
		}
		at := v[i]
		if smooth {
			p.vertex(tess.Vec{X: at.X + m.X*outer, Y: at.Y + m.Y*outer}, c, 0)
		}
		p.vertex(tess.Vec{X: at.X + m.X*core, Y: at.Y + m.Y*core}, c, alpha)
		p.vertex(tess.Vec{X: at.X - m.X*core, Y: at.Y - m.Y*core}, c, alpha)
		if smooth {
			p.vertex(tess.Vec{X: at.X - m.X*outer, Y: at.Y - m.Y*outer}, c, 0)
		}
	}
	segs := n - 1
	if closed {
		segs = n
	}
	for s := range segs {
		a := first + uint16(per*s)
		b := first + uint16(per*((s+1)%n))
		for k := range uint16(per - 1) {
			p.quadIdx(a+k, b+k, b+k+1, a+k+1)
		}
	}
}

// text draws one line of text at its baseline anchor, glyph by glyph from
// the atlas, advancing by the same widths the layout measured.
func (p *painter) text(dst *ebiten.Image, it *chart.Item, scale float64) {
	if it.Fill.A == 0 || it.Text == "" {
		return
	}
	size := it.Size * scale
	px := int(math.Round(size * 8))
	w := p.measure(it.Text, size, it.Bold)
	x := 0.0
	switch it.Anchor {
	case chart.Middle:
		x = -w / 2
	case chart.End:
		x = -w
	}
	// Horizontal text sits on a whole-pixel baseline; vertical text turns
	// about a whole-pixel anchor, so its glyphs stay on the pixel grid.
	ox, oy := it.At.X*scale, math.Round(it.At.Y*scale)
	if it.Vertical {
		ox, oy = math.Round(it.At.X*scale), math.Round(it.At.Y*scale)
	}
	bold := 0.0
	if it.Bold {
		bold = math.Max(1, math.Round(boldOffset*size))
	}
	f := size / 64
	r, g, b, a := float32(it.Fill.R)/255, float32(it.Fill.G)/255, float32(it.Fill.B)/255, float32(it.Fill.A)/255
	for _, ru := range it.Text {
		adv := p.advance64(ru) * f
		for pass := range 2 {
			if pass == 1 && bold == 0 {
				break
			}
			pen := x + float64(pass)*bold
			if !it.Vertical {
				pen += ox
			}
			whole := math.Floor(pen)
			phase := uint8(math.Floor((pen - whole) * phases))
			gl, ok := p.glyph(dst, ru, px, phase)
			if !ok {
				continue
			}
			sw, sh := float32(gl.src.Dx()), float32(gl.src.Dy())
			// The glyph's top-left, as an offset along the baseline (u)
			// and down from it (v).
			u, vv := float32(whole)+float32(gl.dx), float32(gl.dy)
			corners := [4][2]float32{{u, vv}, {u + sw, vv}, {u + sw, vv + sh}, {u, vv + sh}}
			srcs := [4][2]float32{
				{float32(gl.src.Min.X), float32(gl.src.Min.Y)}, {float32(gl.src.Max.X), float32(gl.src.Min.Y)},
				{float32(gl.src.Max.X), float32(gl.src.Max.Y)}, {float32(gl.src.Min.X), float32(gl.src.Max.Y)},
			}
			p.reserve(dst, 4)
			base := uint16(len(p.vs))
			for k, cn := range corners {
				var dx, dy float32
				if it.Vertical {
					// Turned 90° counter-clockwise about the anchor.
					dx, dy = float32(ox)+cn[1], float32(oy)-cn[0]
				} else {
					dx, dy = cn[0], float32(oy)+cn[1]
				}
				p.vs = append(p.vs, ebiten.Vertex{DstX: dx, DstY: dy, SrcX: srcs[k][0], SrcY: srcs[k][1], ColorR: r, ColorG: g, ColorB: b, ColorA: a})
			}
			p.quadIdx(base, base+1, base+2, base+3)
		}
		x += adv
	}
}

// ensureAtlas makes the atlas and its white patch.
func (p *painter) ensureAtlas() {
	if p.atlas != nil {
		return
	}
	p.atlas = ebiten.NewImageWithOptions(image.Rect(0, 0, atlasSize, atlasSize), &ebiten.NewImageOptions{Unmanaged: true})
	p.resetAtlas()
}

// resetAtlas empties the atlas but for its white patch.
func (p *painter) resetAtlas() {
	p.atlas.Clear()
	p.atlas.SubImage(image.Rect(0, 0, whiteSize, whiteSize)).(*ebiten.Image).Fill(color.White)
	clear(p.glyphs)
	p.shelf = tess.Shelf{W: atlasSize, H: atlasSize, X: whiteSize + 1, ShelfH: whiteSize + 1}
}

// glyph returns a glyph from the atlas, rasterising it there first if
// need be. It reports false for a glyph with no ink (a space).
func (p *painter) glyph(dst *ebiten.Image, r rune, px int, phase uint8) (glyph, bool) {
	k := glyphKey{r, px, phase}
	if g, ok := p.glyphs[k]; ok {
		return g, g.src.Dx() > 0
	}
	f := p.face(float64(px) / 8)
	dot := fixed.Point26_6{X: fixed.Int26_6(int(phase) * 64 / phases)}
	dr, mask, mp, _, ok := f.Glyph(dot, r)
	if !ok {
		dr, mask, mp, _, ok = f.Glyph(dot, '\ufffd')
	}
	if !ok || dr.Empty() {
		p.glyphs[k] = glyph{}
		return glyph{}, false
	}
	// One pixel of clear space round each glyph, so that neighbours never
	// bleed into each other.
	w, h := dr.Dx(), dr.Dy()
	ax, ay, fits := p.shelf.Place(w+2, h+2)
	if !fits {
		// Full: draw what uses the old glyphs, then start again.
		p.flush(dst)
		p.resetAtlas()
		if ax, ay, fits = p.shelf.Place(w+2, h+2); !fits {
			p.glyphs[k] = glyph{}
			return glyph{}, false
		}
	}
	src := image.Rect(ax+1, ay+1, ax+1+w, ay+1+h)
	p.pix = p.pix[:0]
	alpha, isAlpha := mask.(*image.Alpha)
	for y := range h {
		for x := range w {
			var v byte
			if isAlpha {
				v = alpha.AlphaAt(mp.X+x, mp.Y+y).A
			} else {
				_, _, _, a := mask.At(mp.X+x, mp.Y+y).RGBA()
				v = byte(a >> 8)
			}
			p.pix = append(p.pix, v, v, v, v)
		}
	}
	p.atlas.SubImage(src).(*ebiten.Image).WritePixels(p.pix)
	g := glyph{src: src, dx: dr.Min.X, dy: dr.Min.Y}
	p.glyphs[k] = g
	return g, true
}

// dashRuns cuts a polyline into the runs its dash pattern draws, in the
// painter's scratch space.
func (p *painter) dashRuns(v []tess.Vec, dash []float64, scale float64) [][]tess.Vec {
	p.runs = tess.Dashes(v, dash, scale, p.runs)
	return p.runs
}
