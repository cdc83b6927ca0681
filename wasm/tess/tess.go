// Package tess is the geometry behind the canvas's painter: normals and
// mitres of polylines, dash runs, and the shelf packing of the glyph
// atlas. It has no Ebiten in it, so it is tested natively; the painter
// turns what it computes into vertices.
package tess

import "math"

// Vec is a point or a direction in device pixels, x right and y down.
type Vec struct{ X, Y float32 }

// Normal is the unit normal of the segment a→b, to its left on screen (y
// down): for a segment going right it points up. It is zero for a segment
// of no length.
func Normal(a, b Vec) Vec {
	dx, dy := b.X-a.X, b.Y-a.Y
	l := float32(math.Hypot(float64(dx), float64(dy)))
	if l == 0 {
		return Vec{}
	}
	return Vec{dy / l, -dx / l}
}

// MaxMiter bounds how far a sharp corner's mitre reaches, in half widths.
const MaxMiter = 4

// Miter is the offset direction at a corner between two segments with unit
// normals n0 and n1, scaled so that both edges keep their width: a point
// offset by Miter·w/2 lies w/2 from both segments' lines. Corners sharper
// than MaxMiter allows are cut short.
func Miter(n0, n1 Vec) Vec {
	m := Vec{n0.X + n1.X, n0.Y + n1.Y}
	l := float32(math.Hypot(float64(m.X), float64(m.Y)))
	if l < 1e-6 {
		return n0
	}
	m = Vec{m.X / l, m.Y / l}
	d := m.X*n0.X + m.Y*n0.Y // cos of half the turn
	if d < 1/float32(MaxMiter) {
		d = 1 / float32(MaxMiter)
	}
	return Vec{m.X / d, m.Y / d}
}

// Area2 is twice the signed area of a polygon: positive when its points go
// clockwise on screen (y down), where each edge's Normal points outwards.
func Area2(v []Vec) float32 {
	var s float32
	for i := range v {
		j := (i + 1) % len(v)
		s += v[i].X*v[j].Y - v[j].X*v[i].Y
	}
	return s
}

// Straight reports whether every segment of a polyline is horizontal or
// vertical.
func Straight(v []Vec) bool {
	for i := 1; i < len(v); i++ {
		if v[i].X != v[i-1].X && v[i].Y != v[i-1].Y {
			return false
		}
	}
	return true
}

// Dashes cuts a polyline into the runs that a dash pattern draws: the
// pattern's lengths, in layout units times scale, alternate on and off,
// starting with on. It reuses runs' memory and returns the runs.
func Dashes(v []Vec, dash []float64, scale float64, runs [][]Vec) [][]Vec {
	for i := range runs {
		runs[i] = runs[i][:0]
	}
	runs = runs[:0]
	if len(v) < 2 || len(dash) < 2 {
		return runs
	}
	for _, d := range dash {
		if !(d > 0) {
			return append(runs, append([]Vec(nil), v...)) // no usable pattern: solid
		}
	}
	newRun := func(start Vec) {
		if len(runs) < cap(runs) {
			runs = runs[:len(runs)+1]
			runs[len(runs)-1] = append(runs[len(runs)-1][:0], start)
		} else {
			runs = append(runs, []Vec{start})
		}
	}
	k, left, on := 0, float32(dash[0]*scale), true
	newRun(v[0])
	for i := 1; i < len(v); i++ {
		a, b := v[i-1], v[i]
		seg := float32(math.Hypot(float64(b.X-a.X), float64(b.Y-a.Y)))
		pos := float32(0)
		for pos < seg {
			step := min(left, seg-pos)
			pos += step
			left -= step
			at := Vec{a.X + (b.X-a.X)*pos/seg, a.Y + (b.Y-a.Y)*pos/seg}
			if on {
				runs[len(runs)-1] = append(runs[len(runs)-1], at)
			}
			if left <= 1e-4 {
				k = (k + 1) % len(dash)
				left, on = float32(dash[k]*scale), !on
				if on {
					newRun(at)
				}
			}
		}
	}
	if n := len(runs); n > 0 && len(runs[n-1]) < 2 {
		runs = runs[:n-1] // a run that started at the very end
	}
	return runs
}

// Shelf places rectangles in rows ("shelves"), left to right and top to
// bottom, in a W × H area. Start the first shelf at X with height H0 to
// keep a corner free.
type Shelf struct {
	W, H   int
	X      int // the next free spot on the current shelf
	ShelfH int // the current shelf's height so far
	Top    int // the current shelf's top
}

// Place returns the top-left corner for a w × h rectangle, or false when
// it does not fit in what is left.
func (s *Shelf) Place(w, h int) (x, y int, ok bool) {
	if w <= 0 || h <= 0 || w > s.W || h > s.H {
		return 0, 0, false
	}
	if s.X+w > s.W {
		s.Top += s.ShelfH
		s.X, s.ShelfH = 0, 0
	}
	if s.Top+h > s.H {
		return 0, 0, false
	}
	x, y = s.X, s.Top
	s.X += w
	s.ShelfH = max(s.ShelfH, h)
	return x, y, true
}

// Convex reports whether a polygon is convex: every corner turns the same
// way (straight corners allowed).
func Convex(v []Vec) bool {
	n := len(v)
	sign := float32(0)
	for i := range n {
		a, b, c := v[i], v[(i+1)%n], v[(i+2)%n]
		cross := (b.X-a.X)*(c.Y-b.Y) - (b.Y-a.Y)*(c.X-b.X)
		if cross == 0 {
			continue
		}
		if sign == 0 {
			sign = cross
		} else if sign*cross < 0 {
			return false
		}
	}
	return true
}

// Triangulate appends to out the indices (into v) of triangles that fill a
// simple polygon: a fan when it is convex, ear clipping otherwise.
func Triangulate(v []Vec, out []int) []int {
	n := len(v)
	if n < 3 {
		return out
	}
	if Convex(v) {
		for i := 2; i < n; i++ {
			out = append(out, 0, i-1, i)
		}
		return out
	}
	orient := float32(1)
	if Area2(v) < 0 {
		orient = -1
	}
	idx := make([]int, n)
	for i := range idx {
		idx[i] = i
	}
	for guard := 0; len(idx) > 3 && guard < n*n; guard++ {
		m := len(idx)
		clipped := false
		for k := range m {
			i0, i1, i2 := idx[(k+m-1)%m], idx[k], idx[(k+1)%m]
			a, b, c := v[i0], v[i1], v[i2]
			cross := (b.X-a.X)*(c.Y-b.Y) - (b.Y-a.Y)*(c.X-b.X)
			if cross*orient <= 0 {
				continue // a reflex or flat corner is no ear
			}
			ear := true
			for _, j := range idx {
				if j != i0 && j != i1 && j != i2 && inTriangle(v[j], a, b, c) {
					ear = false
					break
				}
			}
			if ear {
				out = append(out, i0, i1, i2)
				idx = append(idx[:k], idx[k+1:]...)
				clipped = true
				break
			}
		}
		if !clipped {
			break // not a simple polygon: leave the rest unfilled
		}
	}
	if len(idx) == 3 {
		out = append(out, idx[0], idx[1], idx[2])
	}
	return out
}

// inTriangle reports whether p lies inside or on the triangle abc.
func inTriangle(p, a, b, c Vec) bool {
	d1 := (b.X-a.X)*(p.Y-a.Y) - (b.Y-a.Y)*(p.X-a.X)
	d2 := (c.X-b.X)*(p.Y-b.Y) - (c.Y-b.Y)*(p.X-b.X)
	d3 := (a.X-c.X)*(p.Y-c.Y) - (a.Y-c.Y)*(p.X-c.X)
	neg := d1 < 0 || d2 < 0 || d3 < 0
	pos := d1 > 0 || d2 > 0 || d3 > 0
	return !(neg && pos)
}
