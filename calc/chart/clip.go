package chart

import "math"

// clipSegment clips the segment p–q to r (Liang–Barsky). It returns the
// part inside, with an end that was already inside returned unchanged, and
// ok false when no part is inside.
func clipSegment(p, q Point, r Rect) (Point, Point, bool) {
	if r.Contains(p) && r.Contains(q) {
		return p, q, true // most segments of a curve: nothing to clip
	}
	t0, t1 := 0.0, 1.0
	dx, dy := q.X-p.X, q.Y-p.Y
	for _, e := range [4][2]float64{
		{-dx, p.X - r.X}, {dx, r.X + r.W - p.X},
		{-dy, p.Y - r.Y}, {dy, r.Y + r.H - p.Y},
	} {
		pe, qe := e[0], e[1]
		if pe == 0 {
			if qe < 0 {
				return p, q, false
			}
			continue
		}
		t := qe / pe
		if pe < 0 {
			if t > t1 {
				return p, q, false
			}
			t0 = math.Max(t0, t)
		} else {
			if t < t0 {
				return p, q, false
			}
			t1 = math.Min(t1, t)
		}
	}
	a, b := p, q
	if t0 > 0 {
		a = Point{p.X + t0*dx, p.Y + t0*dy}
	}
	if t1 < 1 {
		b = Point{p.X + t1*dx, p.Y + t1*dy}
	}
	return a, b, true
}

// clipPolyline returns the runs of a polyline that lie inside r, taking
// each run's memory from room, which returns an empty slice with space for
// n points.
func clipPolyline(pts []Point, r Rect, room func(n int) []Point) [][]Point {
	var runs [][]Point
	var cur []Point
	flush := func() {
		if len(cur) >= 2 {
			runs = append(runs, cur)
		}
		cur = nil
	}
	for i := 1; i < len(pts); i++ {
		a, b, ok := clipSegment(pts[i-1], pts[i], r)
		if !ok {
			flush()
			continue
		}
		if len(cur) == 0 || cur[len(cur)-1] != a {
			flush()
			cur = append(room(len(pts)-i+1), a)
		}
		cur = append(cur, b)
	}
	flush()
	return runs
}

// crosses reports whether any segment of the runs passes through r.
func crosses(runs [][]Point, r Rect) bool {
	x1, y1 := r.X+r.W, r.Y+r.H
	for _, run := range runs {
		for i := 1; i < len(run); i++ {
			p, q := run[i-1], run[i]
			if p.X < r.X && q.X < r.X || p.X > x1 && q.X > x1 || p.Y < r.Y && q.Y < r.Y || p.Y > y1 && q.Y > y1 {
				continue // both ends on one side
			}
			if _, _, ok := clipSegment(p, q, r); ok {
				return true
			}
		}
	}
	return false
}

// Hatch directions.
const (
	hatchRising  = iota // "/" lines
	hatchFalling        // "\" lines
	hatchLevel          // horizontal lines
)

// hatch adds parallel lines spaced gap apart (measured across the lines)
// over r, clipped to it. The lines are placed on a grid fixed to the
// origin, so that neighbouring hatched areas line up.
func (b *builder) hatch(r Rect, dir int, gap, width float64, c rgba) {
	if r.W <= 0 || r.H <= 0 || !(gap > 0) {
		return
	}
	if dir == hatchLevel {
		for y := math.Ceil(r.Y/gap) * gap; y < r.Y+r.H; y += gap {
			if y > r.Y {
				b.line(Point{r.X, y}, Point{r.X + r.W, y}, width, c, nil)
			}
		}
		return
	}
	step := gap * math.Sqrt2
	// Rising lines are x + y = k; falling lines are x − y = k.
	var lo, hi float64
	if dir == hatchRising {
		lo, hi = r.X+r.Y, r.X+r.W+r.Y+r.H
	} else {
		lo, hi = r.X-(r.Y+r.H), r.X+r.W-r.Y
	}
	y1, y2 := r.Y-1, r.Y+r.H+1
	for k := math.Ceil(lo/step) * step; k < hi; k += step {
		var p, q Point
		if dir == hatchRising {
			p, q = Point{k - y1, y1}, Point{k - y2, y2}
		} else {
			p, q = Point{k + y1, y1}, Point{k + y2, y2}
		}
		if a, z, ok := clipSegment(p, q, r); ok && math.Hypot(z.X-a.X, z.Y-a.Y) > width {
			b.line(a, z, width, c, nil)
		}
	}
}
