package calc

import (
	"math"
	"os"
	"testing"
)

// close reports whether got is within tol (relative) of want.
func near(got, want, tol float64) bool {
	if want == 0 {
		return math.Abs(got) <= tol
	}
	return math.Abs(got-want) <= tol*math.Abs(want)
}

// kgForKN is the mass whose weight is f kN.
func kgForKN(f float64) float64 { return f * 1000 / Gravity }

func mustResolve(t testing.TB, p *Project) *Model {
	t.Helper()
	m, err := Resolve(p)
	if err != nil {
		t.Fatalf("Resolve: %v", err)
	}
	return m
}

func demo(t testing.TB) *Project {
	t.Helper()
	b, err := os.ReadFile("../testdata/demo.json")
	if err != nil {
		t.Fatal(err)
	}
	p, err := DecodeBytes(b)
	if err != nil {
		t.Fatal(err)
	}
	return p
}

// givenProject is a project that uses the given compressions, with P given
// as a mass, for textbook cases.
func givenProject(ramKg, pileKg, eff, e, dropM, cc, cp, cq, loadKN float64) *Project {
	return &Project{
		Format:      FormatVersion,
		Name:        "textbook case",
		Hammer:      Hammer{RamKg: F(ramKg), Efficiency: F(eff), Restitution: F(e)},
		DropsM:      []float64{dropM},
		Pile:        Pile{Material: "concrete", SideMm: F(300), LengthM: F(10), MassKg: F(pileKg)},
		Compression: Compression{Method: "given", CcMm: F(cc), CpMm: F(cp), CqMm: F(cq)},
		Design:      Design{LoadKN: F(loadKN), Phi: F(1)},
		MinSetMm:    F(0),
	}
}
