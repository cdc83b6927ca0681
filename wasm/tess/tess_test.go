package tess

import (
	"math"
	"math/rand/v2"
	"testing"
)

func near(a, b, eps float64) bool { return math.Abs(a-b) <= eps }

// TestNormal: the left normal on screen (y down), by hand.
func TestNormal(t *testing.T) {
	for _, c := range []struct{ a, b, want Vec }{
		{Vec{0, 0}, Vec{5, 0}, Vec{0, -1}}, // going right: up
		{Vec{0, 0}, Vec{0, 3}, Vec{1, 0}},  // going down: right
		{Vec{2, 2}, Vec{2, 2}, Vec{}},      // no length
	} {
		if got := Normal(c.a, c.b); got != c.want {
			t.Errorf("Normal(%v, %v) = %v, want %v", c.a, c.b, got, c.want)
		}
	}
}

// TestMiterKeepsWidth checks the defining property of a mitre joint
// (plane geometry): the offset corner lies one half width from both
// segments' lines, for turns up to the limit; sharper turns are cut at
// MaxMiter half widths.
func TestMiterKeepsWidth(t *testing.T) {
	r := rand.New(rand.NewPCG(1, 2))
	checked := 0
	for range 2000 {
		a0 := r.Float64() * 2 * math.Pi
		turn := (r.Float64()*2 - 1) * math.Pi * 0.99
		d0 := Vec{float32(math.Cos(a0)), float32(math.Sin(a0))}
		d1 := Vec{float32(math.Cos(a0 + turn)), float32(math.Sin(a0 + turn))}
		n0 := Normal(Vec{}, d0)
		n1 := Normal(Vec{}, d1)
		m := Miter(n0, n1)
		length := math.Hypot(float64(m.X), float64(m.Y))
		if length > MaxMiter+1e-4 {
			t.Fatalf("turn %.3f rad: mitre %.3f half widths, over the limit %d", turn, length, MaxMiter)
		}
		if 1/math.Cos(turn/2) > MaxMiter {
			continue // cut short by design
		}
		e0 := float64(m.X*n0.X + m.Y*n0.Y)
		e1 := float64(m.X*n1.X + m.Y*n1.Y)
		if !near(e0, 1, 1e-4) || !near(e1, 1, 1e-4) {
			t.Fatalf("turn %.3f rad: offset corner is %.5f and %.5f half widths from the two edges, want 1 and 1", turn, e0, e1)
		}
		checked++
	}
	if checked < 1000 {
		t.Fatalf("only %d corners checked", checked)
	}
}

// TestArea2: the shoelace formula, by hand.
func TestArea2(t *testing.T) {
	cw := []Vec{{0, 0}, {4, 0}, {4, 3}, {0, 3}} // clockwise on screen
	if got := Area2(cw); got != 24 {
		t.Errorf("Area2(clockwise 4×3) = %v, want 24", got)
	}
	ccw := []Vec{{0, 0}, {0, 3}, {4, 3}, {4, 0}}
	if got := Area2(ccw); got != -24 {
		t.Errorf("Area2(counter-clockwise 4×3) = %v, want -24", got)
	}
	// Outward normals for clockwise polygons: the top edge's points up.
	if n := Normal(cw[0], cw[1]); n.Y >= 0 {
		t.Errorf("top edge of a clockwise rectangle: normal %v does not point out (up)", n)
	}
}

func TestStraight(t *testing.T) {
	if !Straight([]Vec{{0, 0}, {5, 0}, {5, 5}, {0, 5}}) {
		t.Error("a rectangle's outline is straight")
	}
	if Straight([]Vec{{0, 0}, {5, 1}}) {
		t.Error("a slanted segment is not straight")
	}
}

func runLength(run []Vec) float64 {
	l := 0.0
	for i := 1; i < len(run); i++ {
		l += math.Hypot(float64(run[i].X-run[i-1].X), float64(run[i].Y-run[i-1].Y))
	}
	return l
}

// onLength is the inked length of a two-part dash pattern along a path of
// length total, counted period by period.
func onLength(total, on, off float64) float64 {
	p := on + off
	n := math.Floor(total / p)
	return n*on + math.Min(on, total-n*p)
}

// TestDashes checks the runs of a dash pattern along straight and bent
// paths: each run is one dash long (the last may be short), and the inked
// length is the pattern's share of the path, counted independently.
func TestDashes(t *testing.T) {
	var runs [][]Vec
	// A straight line 100 long, 6 on and 4 off: ten dashes of 6.
	runs = Dashes([]Vec{{0, 0}, {100, 0}}, []float64{3, 2}, 2, runs)
	if len(runs) != 10 {
		t.Fatalf("100 px of 6 on / 4 off: %d dashes, want 10", len(runs))
	}
	for i, r := range runs {
		if l := runLength(r); !near(l, 6, 1e-3) {
			t.Errorf("dash %d is %.4f long, want 6", i, l)
		}
		if want := float32(10 * i); !near(float64(r[0].X), float64(want), 1e-3) {
			t.Errorf("dash %d starts at %v, want x = %v", i, r[0], want)
		}
	}
	// Bent paths: a dash goes round corners, so lengths add up along the
	// path.
	rnd := rand.New(rand.NewPCG(3, 4))
	for k := range 200 {
		pts := []Vec{{0, 0}}
		total := 0.0
		for range 2 + rnd.IntN(30) {
			last := pts[len(pts)-1]
			next := Vec{last.X + float32(rnd.Float64()*40-10), last.Y + float32(rnd.Float64()*40-20)}
			total += math.Hypot(float64(next.X-last.X), float64(next.Y-last.Y))
			pts = append(pts, next)
		}
		on, off := 1+rnd.Float64()*8, 1+rnd.Float64()*8
		runs = Dashes(pts, []float64{on, off}, 1, runs)
		got := 0.0
		for _, r := range runs {
			if len(r) < 2 {
				t.Fatalf("path %d: a run of %d points", k, len(r))
			}
			l := runLength(r)
			if l > on+1e-2 {
				t.Fatalf("path %d: a dash %.3f long, longer than %.3f", k, l, on)
			}
			got += l
		}
		if want := onLength(total, on, off); !near(got, want, 1e-3*total+1e-2) {
			t.Fatalf("path %d (%.1f long, %.2f on / %.2f off): inked %.3f, want %.3f", k, total, on, off, got, want)
		}
	}
}

// TestDashesBadPattern: a pattern with a zero or negative length is
// drawn solid rather than looping for ever.
func TestDashesBadPattern(t *testing.T) {
	for _, d := range [][]float64{{0, 2}, {3, -1}, {math.NaN(), 1}} {
		runs := Dashes([]Vec{{0, 0}, {10, 0}}, d, 1, nil)
		if len(runs) != 1 || runLength(runs[0]) != 10 {
			t.Errorf("pattern %v: runs %v, want the whole line", d, runs)
		}
	}
}

// TestShelf packs many random rectangles: every one placed lies inside the
// area and overlaps no other. With rectangles of one height, as glyphs of
// one size nearly are, only the ends of the shelves go to waste, so the
// area is nearly full when Place first refuses.
func TestShelf(t *testing.T) {
	type rect struct{ x, y, w, h int }
	r := rand.New(rand.NewPCG(5, 6))
	for _, sameHeight := range []bool{false, true} {
		s := Shelf{W: 256, H: 256, X: 5, ShelfH: 5}
		placed := []rect{{0, 0, 5, 5}} // the kept corner
		area := 25
		for range 5000 {
			w, h := 1+r.IntN(20), 1+r.IntN(30)
			if sameHeight {
				h = 16
			}
			x, y, ok := s.Place(w, h)
			if !ok {
				break
			}
			n := rect{x, y, w, h}
			if x < 0 || y < 0 || x+w > s.W || y+h > s.H {
				t.Fatalf("%v lies outside the %d×%d area", n, s.W, s.H)
			}
			for _, o := range placed {
				if n.x < o.x+o.w && o.x < n.x+n.w && n.y < o.y+o.h && o.y < n.y+n.h {
					t.Fatalf("%v overlaps %v", n, o)
				}
			}
			placed = append(placed, n)
			area += w * h
		}
		if sameHeight && area < 256*256*85/100 {
			t.Errorf("rectangles of one height: full after filling only %d of %d pixels", area, 256*256)
		}
		if len(placed) < 100 {
			t.Errorf("only %d rectangles placed", len(placed))
		}
		if _, _, ok := s.Place(300, 1); ok {
			t.Error("a rectangle wider than the area was placed")
		}
	}
}

func triArea(a, b, c Vec) float64 {
	return math.Abs(float64((b.X-a.X)*(c.Y-a.Y)-(b.Y-a.Y)*(c.X-a.X))) / 2
}

// TestTriangulate fills convex and non-convex polygons (an L, a star, a
// comb, random star-shaped ones): the triangles' areas add up to the
// polygon's (shoelace formula), which they could not if any overlapped or
// fell outside, and every triangle turns the polygon's way.
func TestTriangulate(t *testing.T) {
	polys := map[string][]Vec{
		"square": {{0, 0}, {4, 0}, {4, 4}, {0, 4}},
		"L":      {{0, 0}, {6, 0}, {6, 2}, {2, 2}, {2, 6}, {0, 6}},
		"comb":   {{0, 0}, {10, 0}, {10, 5}, {8, 5}, {8, 1}, {6, 1}, {6, 5}, {4, 5}, {4, 1}, {2, 1}, {2, 5}, {0, 5}},
	}
	star := []Vec{}
	for k := range 10 {
		r := 10.0
		if k%2 == 1 {
			r = 4
		}
		a := float64(k) * math.Pi / 5
		star = append(star, Vec{float32(r * math.Cos(a)), float32(r * math.Sin(a))})
	}
	polys["star"] = star
	rnd := rand.New(rand.NewPCG(7, 8))
	for k := range 50 {
		var p []Vec
		n := 3 + rnd.IntN(25)
		for i := range n {
			a := 2 * math.Pi * (float64(i) + 0.3*rnd.Float64()) / float64(n)
			r := 2 + 8*rnd.Float64()
			p = append(p, Vec{float32(r * math.Cos(a)), float32(r * math.Sin(a))})
		}
		polys["random "+string(rune('a'+k%26))+string(rune('0'+k/26))] = p
	}
	nonConvex := 0
	for name, p := range polys {
		for _, rev := range []bool{false, true} {
			q := append([]Vec(nil), p...)
			if rev {
				for i, j := 0, len(q)-1; i < j; i, j = i+1, j-1 {
					q[i], q[j] = q[j], q[i]
				}
			}
			if !Convex(q) {
				nonConvex++
			}
			tris := Triangulate(q, nil)
			if len(tris) != 3*(len(q)-2) {
				t.Fatalf("%s: %d triangles, want %d", name, len(tris)/3, len(q)-2)
			}
			sum := 0.0
			sign := Area2(q)
			for i := 0; i < len(tris); i += 3 {
				a, b, c := q[tris[i]], q[tris[i+1]], q[tris[i+2]]
				if cr := (b.X-a.X)*(c.Y-a.Y) - (b.Y-a.Y)*(c.X-a.X); cr*sign < 0 {
					t.Fatalf("%s: triangle %v %v %v turns against the polygon", name, a, b, c)
				}
				sum += triArea(a, b, c)
			}
			if want := math.Abs(float64(sign)) / 2; !near(sum, want, 1e-3*want) {
				t.Fatalf("%s (reversed %v): triangles cover %.4f, the polygon is %.4f", name, rev, sum, want)
			}
		}
	}
	if nonConvex < 10 {
		t.Fatalf("only %d non-convex polygons tried", nonConvex)
	}
}
