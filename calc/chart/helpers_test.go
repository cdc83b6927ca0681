package chart

import (
	"fmt"
	"math"
	"math/rand/v2"
	"os"
	"path/filepath"
	"testing"

	"setcard/calc"
)

// root is the repository's testdata directory.
var root = filepath.Join("..", "..", "testdata")

// load reads and resolves a project file under testdata.
func load(t testing.TB, name string) *calc.Model {
	t.Helper()
	data, err := os.ReadFile(filepath.Join(root, name))
	if err != nil {
		t.Fatal(err)
	}
	p, err := calc.DecodeBytes(data)
	if err != nil {
		t.Fatalf("%s: %v", name, err)
	}
	m, err := calc.Resolve(p)
	if err != nil {
		t.Fatalf("%s: %v", name, err)
	}
	return m
}

// named is a model with a name for test messages.
type named struct {
	name string
	m    *calc.Model
}

// fileProjects are the projects kept under testdata: the demo, a crowded
// one with twelve drops, and one with hostile text.
func fileProjects(t testing.TB) []named {
	var out []named
	for _, f := range []string{"demo.json", "cards/crowded.json", "cards/hostile.json"} {
		out = append(out, named{f, load(t, f)})
	}
	return out
}

// randomProjects are n valid projects drawn from a seeded source, covering
// every material, section, method, convention and chart basis, with one
// to twelve drops.
func randomProjects(t testing.TB, n int) []named {
	r := rand.New(rand.NewPCG(1, 1))
	var out []named
	for len(out) < n {
		p := randomProject(r)
		m, err := calc.Resolve(p)
		if err != nil {
			continue
		}
		out = append(out, named{fmt.Sprintf("random %d (%s, %d drops)", len(out), m.Material.ID, len(m.DropsM)), m})
	}
	return out
}

func randomProject(r *rand.Rand) *calc.Project {
	between := func(lo, hi float64) float64 { return lo + r.Float64()*(hi-lo) }
	round := func(v, step float64) float64 { return math.Round(v/step) * step }
	p := &calc.Project{Format: calc.FormatVersion, Name: fmt.Sprintf("Random project %d (invented)", r.IntN(1000))}
	mats := []string{"timber", "concrete", "steel"}
	mat := mats[r.IntN(3)]
	p.Pile.Material = mat
	switch mat {
	case "timber":
		p.Pile.DiameterMm = calc.F(round(between(150, 450), 10))
		p.Compression.Cap = []string{"timber-head"}
		if r.IntN(2) == 0 {
			p.Compression.Cap = append(p.Compression.Cap, "timber-dolly")
		}
	case "concrete":
		p.Pile.SideMm = calc.F(round(between(200, 500), 25))
		p.Compression.Cap = []string{"concrete-packing"}
	default:
		p.Pile.AreaMm2 = calc.F(round(between(4000, 30000), 100))
		p.Compression.Cap = []string{"steel-packed-cap"}
	}
	p.Pile.LengthM = calc.F(round(between(3, 20), 0.5))
	if r.IntN(2) == 0 {
		p.Pile.LengthMaxM = calc.F(*p.Pile.LengthM + round(between(1, 10), 0.5))
		if r.IntN(2) == 0 {
			p.Pile.LengthStepM = calc.F(1)
		}
	}
	p.Hammer.RamKg = calc.F(round(between(300, 6000), 50))
	n := 1 + r.IntN(12)
	seen := map[float64]bool{}
	for len(p.DropsM) < n {
		h := round(between(0.1, 3), 0.05)
		if !seen[h] {
			seen[h] = true
			p.DropsM = append(p.DropsM, h)
		}
	}
	switch r.IntN(3) {
	case 0:
		p.Compression.Method = "banded"
	case 1:
		p.Compression.Method = "given"
		p.Compression.Cap = nil
		p.Compression.CcMm = calc.F(round(between(0, 8), 0.5))
		p.Compression.CpMm = calc.F(round(between(0, 10), 0.5))
	}
	p.Compression.CqMm = calc.F(round(between(0.5, 5), 0.5))
	p.Design.LoadKN = calc.F(round(between(30, 1500), 10))
	if r.IntN(2) == 0 {
		p.Design.Phi = calc.F(round(between(0.4, 0.7), 0.05))
	} else {
		p.Design.FactorOfSafety = calc.F(round(between(2, 3), 0.5))
	}
	if r.IntN(4) == 0 {
		p.Design.Basis = "ultimate"
	}
	if r.IntN(3) == 0 {
		p.MinSetMm = calc.F(round(between(0, 3), 0.5))
	}
	return p
}

// checkTexts fails the test when two text boxes of the layout overlap, or
// a text box leaves the layout.
func checkTexts(t *testing.T, what string, l *Layout) {
	t.Helper()
	texts := l.Texts()
	page := Rect{0, 0, l.W, l.H}
	for i, a := range texts {
		if !a.Box.Inside(page, 1e-6) {
			t.Errorf("%s: text %q (%s) box %+v leaves the %g × %g layout", what, a.Text, a.Role, a.Box, l.W, l.H)
		}
		for _, b := range texts[i+1:] {
			if a.Box.inset(1e-6).Overlaps(b.Box.inset(1e-6)) {
				t.Errorf("%s: text %q (%s) box %+v overlaps %q (%s) box %+v", what, a.Text, a.Role, a.Box, b.Text, b.Role, b.Box)
			}
		}
	}
}

// checkFinite fails the test when a coordinate or size is not finite.
func checkFinite(t *testing.T, what string, l *Layout) {
	t.Helper()
	ok := func(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }
	for i, it := range l.Items {
		good := ok(it.Width) && ok(it.Size) && ok(it.At.X) && ok(it.At.Y) && ok(it.Box.X) && ok(it.Box.Y) && ok(it.Box.W) && ok(it.Box.H)
		for _, p := range it.Points {
			good = good && ok(p.X) && ok(p.Y)
		}
		for _, d := range it.Dash {
			good = good && ok(d) && d > 0
		}
		if !good {
			t.Errorf("%s: item %d (%s %q) has a coordinate that is not finite: %+v", what, i, it.Kind, it.Text, it)
		}
	}
}
