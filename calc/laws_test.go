package calc

import (
	"math"
	"math/rand/v2"
	"testing"
)

// randomProject draws a valid project from a seeded source, across the
// materials, methods and conventions.
func randomProject(r *rand.Rand) *Project {
	u := func(lo, hi float64) float64 { return lo + (hi-lo)*r.Float64() }
	mats := []string{"timber", "concrete", "steel"}
	p := &Project{
		Format: FormatVersion,
		Name:   "random",
		Hammer: Hammer{RamKg: F(u(200, 5000)), Efficiency: F(u(0.5, 1)), Restitution: F(u(0, 0.6))},
		DropsM: []float64{u(0.2, 1), u(1.01, 2.5)},
		Pile: Pile{Material: mats[r.IntN(3)], DiameterMm: F(u(150, 600)), LengthM: F(u(3, 20)),
			LengthMaxM: nil, DensityKgM3: F(u(600, 7850)), ModulusMPa: F(u(8000, 210000))},
		DrivenPartsKg: F(u(0, 300)),
		Compression:   Compression{Method: []string{"interpolated", "banded", "given"}[r.IntN(3)], CqMm: F(u(0, 5))},
		Design:        Design{LoadKN: F(u(20, 1500)), Phi: F(u(0.4, 0.8))},
		MinSetMm:      F(u(0, 3)),
	}
	if p.Compression.Method == "given" {
		p.Compression.CcMm, p.Compression.CpMm = F(u(0, 10)), F(u(0, 10))
		*p.Compression.CqMm += 0.5
	} else {
		ids := capIDs()
		p.Compression.Cap = []string{ids[r.IntN(len(ids))]}
	}
	if r.IntN(2) == 0 {
		p.Design.Phi, p.Design.FactorOfSafety = nil, F(u(1.5, 3))
	}
	return p
}

// The inverse and the forward solution agree: the set that the required
// resistance needs gives back that resistance. Seeded, as gonum's
// mathext tests are.
func TestInverseMatchesForward(t *testing.T) {
	r := rand.New(rand.NewPCG(1, 1))
	checked := 0
	for range 2000 {
		p := randomProject(r)
		p.MinSetMm = F(0)
		m := mustResolve(t, p)
		for _, h := range m.DropsM {
			q, err := m.Require(h, m.LongestM())
			if err != nil {
				t.Fatal(err)
			}
			if !q.HasSet {
				continue
			}
			if q.SetMm > 1000 {
				continue // beyond any real set; BlowAt refuses it
			}
			b, err := m.BlowAt(h, q.SetMm, m.LongestM())
			if err != nil {
				t.Fatal(err)
			}
			checked++
			if !near(b.UltimateKN, q.UltimateKN, 1e-9) {
				t.Fatalf("%s, drop %v: forward at set %g gives %g kN, want %g kN", m.Method, h, q.SetMm, b.UltimateKN, q.UltimateKN)
			}
			// And the drop for that set is the drop.
			if d, ok, _ := m.DropFor(q.SetMm, m.LongestM()); ok && !near(d, h, 1e-9) {
				t.Fatalf("%s: DropFor(%g) = %g, want %g", m.Method, q.SetMm, d, h)
			}
		}
	}
	if checked < 500 {
		t.Fatalf("only %d cases had a set; the generator is too narrow", checked)
	}
}

// Resistance rises with drop and ram mass and falls with set; the required
// set rises with drop and falls with pile length.
func TestMonotonicLaws(t *testing.T) {
	r := rand.New(rand.NewPCG(2, 3))
	for range 1000 {
		p := randomProject(r)
		m := mustResolve(t, p)
		l := m.LongestM()
		s := m.MinSetMm + 0.5 + 10*r.Float64()
		b1, _ := m.BlowAt(m.DropsM[0], s, l)
		b2, _ := m.BlowAt(m.DropsM[1], s, l)
		if b2.UltimateKN < b1.UltimateKN*(1-1e-12) {
			t.Fatalf("%s: R(drop %g) = %g > R(drop %g) = %g", m.Method, m.DropsM[0], b1.UltimateKN, m.DropsM[1], b2.UltimateKN)
		}
		b3, _ := m.BlowAt(m.DropsM[0], s*1.5, l)
		if b3.UltimateKN > b1.UltimateKN*(1+1e-12) {
			t.Fatalf("%s: R(set %g) = %g < R(set %g) = %g", m.Method, s, b1.UltimateKN, s*1.5, b3.UltimateKN)
		}
		heavier := p.Clone()
		*heavier.Hammer.RamKg *= 1.3
		mh := mustResolve(t, heavier)
		b4, _ := mh.BlowAt(m.DropsM[0], s, l)
		if b4.UltimateKN < b1.UltimateKN*(1-1e-12) {
			t.Fatalf("%s: heavier ram gives %g kN < %g kN", m.Method, b4.UltimateKN, b1.UltimateKN)
		}
		if m.Method != Given {
			longer := p.Clone()
			longer.Pile.LengthMaxM = F(*p.Pile.LengthM + 5)
			ml := mustResolve(t, longer)
			qs, _ := ml.Require(m.DropsM[1], ml.LengthsM[0])
			ql, _ := ml.Require(m.DropsM[1], ml.LengthsM[1])
			if qs.HasSet && ql.HasSet && ql.SetMm > qs.SetMm+1e-9 {
				t.Fatalf("%s: longer pile needs a larger set: %g > %g", m.Method, ql.SetMm, qs.SetMm)
			}
		}
	}
}

// The two branches of the efficiency of blow meet at W = e·P.
func TestEfficiencyBranchesMeet(t *testing.T) {
	r := rand.New(rand.NewPCG(4, 5))
	for range 1000 {
		e := 0.05 + 0.9*r.Float64()
		p := 1 + 100*r.Float64()
		w := e * p
		above, b1 := EfficiencyOfBlow(w*(1+1e-12), p, e)
		below, b2 := EfficiencyOfBlow(w*(1-1e-12), p, e)
		if b1 != HeavyRam || b2 != LightRam {
			t.Fatalf("branches at W = eP: %s, %s", b1, b2)
		}
		if math.Abs(above-below) > 1e-9 {
			t.Fatalf("EfficiencyOfBlow at W = eP (e %g, P %g): %g above, %g below", e, p, above, below)
		}
	}
}

// The banded result's column is the column its head stress falls in, or,
// when it straddles an edge, it sits on that edge and says so.
func TestBandedColumnIsConsistent(t *testing.T) {
	r := rand.New(rand.NewPCG(6, 7))
	edges := 0
	for range 3000 {
		p := randomProject(r)
		p.Compression = Compression{Method: "banded", Cap: []string{"concrete-packing"}, CqMm: F(2.5)}
		p.Pile.Material = "concrete"
		m := mustResolve(t, p)
		s := m.MinSetMm + 8*r.Float64()
		b, err := m.BlowAt(m.DropsM[r.IntN(2)], s, m.LongestM())
		if err != nil {
			t.Fatal(err)
		}
		if b.ColumnEdge >= 0 {
			if !near(b.HeadStressMPa, m.categoryEdgeMPa(b.ColumnEdge), 1e-12) {
				t.Fatalf("banded: on edge %d but head stress %g MPa", b.ColumnEdge, b.HeadStressMPa)
			}
			edges++
			continue
		}
		k := m.CategoryOf(b.HeadStressMPa)
		if b.CcMm != m.capColumn(k) {
			t.Fatalf("banded: head stress %g MPa is in column %d (Cc %g), result used Cc %g", b.HeadStressMPa, k, m.capColumn(k), b.CcMm)
		}
		lhs := b.UltimateKN * (b.SetMm + b.CMm/2)
		if !near(lhs, b.NetEnergyKJ*1000, 1e-9) {
			t.Fatalf("banded: R(s + c/2) = %g, want %g: %+v", lhs, b.NetEnergyKJ*1000, b)
		}
	}
	t.Logf("%d results straddled a column edge", edges)
}

// A straddle: with a very stiff cap row the column edge at 5.25 MPa holds
// the answer for a range of sets, reported as the edge with a warning.
func TestBandedStraddle(t *testing.T) {
	p := givenProject(2000, 1000, 0.8, 0.4, 1, 0, 0, 0, 100)
	p.Pile = Pile{Material: "concrete", SideMm: F(300), LengthM: F(10)}
	p.Compression = Compression{Method: "banded", Cap: []string{"concrete-packing"}, CqMm: F(0)}
	p.Tables = &Tables{CapRowsMm: map[string][]float64{"concrete-packing": {1, 40, 41, 42}}}
	m := mustResolve(t, p)
	edgeKN := 5.25 * 300 * 300 / 1000
	found := false
	for s := 0.0; s < 20; s += 0.1 {
		b, err := m.BlowAt(1, s, 10)
		if err != nil {
			t.Fatal(err)
		}
		if b.ColumnEdge >= 0 {
			if !near(b.UltimateKN, edgeKN, 1e-12) || b.ColumnEdge != 0 {
				t.Fatalf("set %g: on edge %d at %g kN, want edge 0 at %g kN", s, b.ColumnEdge, b.UltimateKN, edgeKN)
			}
			found = true
			hasWarning := false
			for _, w := range b.Warnings {
				hasWarning = hasWarning || w.Code == WarnBoundary
			}
			if !hasWarning {
				t.Fatalf("set %g: result on the edge without a boundary warning", s)
			}
		}
	}
	if !found {
		t.Fatal("no set gave a result on the easy/medium column edge")
	}
}

// Nothing that leaves the package is NaN or infinite.
func TestNoNaNInTablesOrCurves(t *testing.T) {
	r := rand.New(rand.NewPCG(8, 9))
	for range 300 {
		m := mustResolve(t, randomProject(r))
		for _, q := range m.Table() {
			for _, v := range []float64{q.SetMm, q.SetMm10, q.UltimateKN, q.RefusalKN, q.CMm, q.HeadStressMPa, q.ImpactStressMPa} {
				if !finite(v) {
					t.Fatalf("Table has %v: %+v", v, q)
				}
			}
		}
		for _, c := range m.Curves(CurveOptions{Points: 50}) {
			for _, pt := range c.Points {
				if !finite(pt.SetMm) || !finite(pt.UltimateKN) || pt.SetMm < 0 {
					t.Fatalf("curve point %+v", pt)
				}
			}
		}
	}
}

// Curves: points rise in resistance, fall in set, end at refusal, and the
// zone crossings lie on the curve.
func TestCurves(t *testing.T) {
	m := mustResolve(t, demo(t))
	easyKN, hardKN := m.ZoneEdgesKN()
	for _, c := range m.Curves(CurveOptions{}) {
		if len(c.Points) < 200 {
			t.Fatalf("curve has %d points, want at least 200", len(c.Points))
		}
		for i := 1; i < len(c.Points); i++ {
			a, b := c.Points[i-1], c.Points[i]
			if b.UltimateKN < a.UltimateKN || b.SetMm > a.SetMm+1e-12 {
				t.Fatalf("drop %v: points %d and %d out of order: %+v %+v", c.DropM, i-1, i, a, b)
			}
		}
		last := c.Points[len(c.Points)-1]
		if last.SetMm != 0 || !near(last.UltimateKN, c.RefusalKN, 1e-12) {
			t.Errorf("drop %v: curve ends at %+v, want set 0 at %g kN", c.DropM, last, c.RefusalKN)
		}
		for _, x := range []*Crossing{c.EasyEdge, c.HardEdge} {
			if x == nil {
				continue
			}
			if x.UltimateKN != easyKN && x.UltimateKN != hardKN {
				t.Errorf("crossing at %g kN is not a zone edge (%g, %g)", x.UltimateKN, easyKN, hardKN)
			}
			b, _ := m.BlowAt(c.DropM, x.SetMm, c.LengthM)
			if x.SetMm >= m.MinSetMm && !near(b.UltimateKN, x.UltimateKN, 1e-9) {
				t.Errorf("drop %v: crossing at set %g says %g kN, forward gives %g", c.DropM, x.SetMm, x.UltimateKN, b.UltimateKN)
			}
		}
	}
}
