package calc

import (
	"bytes"
	"errors"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// Every error names the field, the value and the allowed range.
func TestDecodeErrors(t *testing.T) {
	base, err := os.ReadFile("../testdata/demo.json")
	if err != nil {
		t.Fatal(err)
	}
	cases := []struct {
		name, from, to string
		field, want    string
	}{
		{"unknown top field", `"name":`, `"nmae": "x", "name":`, "nmae", "not a field"},
		{"unknown nested field", `"diameter_mm": 250`, `"diameter_mm": 250, "diamter": 3`, "pile.diamter", "not a field"},
		{"wrong type", `"ram_kg": 500`, `"ram_kg": "heavy"`, "hammer.ram_kg", "wrong type"},
		{"future format", `"setcard/1"`, `"setcard/2"`, "format", "newer version"},
		{"other format", `"setcard/1"`, `"pilecalc"`, "format", "not a format"},
	}
	for _, c := range cases {
		src := strings.Replace(string(base), c.from, c.to, 1)
		if src == string(base) {
			t.Fatalf("%s: replacement did not apply", c.name)
		}
		_, err := DecodeBytes([]byte(src))
		var fe *FieldError
		if !errors.As(err, &fe) {
			t.Fatalf("%s: DecodeBytes error = %v, want a *FieldError", c.name, err)
		}
		if fe.Field != c.field || !strings.Contains(fe.Error(), c.want) {
			t.Errorf("%s: error %q (field %q), want field %q and %q", c.name, fe, fe.Field, c.field, c.want)
		}
	}
	for _, bad := range []string{"", "{", "[]", `{"format":"setcard/1"} {}`, "nul"} {
		if _, err := DecodeBytes([]byte(bad)); err == nil {
			t.Errorf("DecodeBytes(%q) = nil error, want one", bad)
		}
	}
}

func TestResolveRanges(t *testing.T) {
	cases := []struct {
		name    string
		edit    func(p *Project)
		field   string
		allowed string
	}{
		{"ram zero", func(p *Project) { p.Hammer.RamKg = F(0) }, "hammer.ram_kg", "50 to 20000 kg"},
		{"ram missing", func(p *Project) { p.Hammer.RamKg = nil }, "hammer.ram_kg", "50 to 20000 kg"},
		{"ram NaN", func(p *Project) { p.Hammer.RamKg = F(math.NaN()) }, "hammer.ram_kg", "50 to 20000 kg"},
		{"ram Inf", func(p *Project) { p.Hammer.RamKg = F(math.Inf(1)) }, "hammer.ram_kg", "50 to 20000 kg"},
		{"efficiency", func(p *Project) { p.Hammer.Efficiency = F(1.2) }, "hammer.efficiency", "0.3 to 1"},
		{"drop", func(p *Project) { p.DropsM = []float64{0.6, 9} }, "drops_m[1]", "0.05 to 5 m"},
		{"drop twice", func(p *Project) { p.DropsM = []float64{0.6, 0.6} }, "drops_m[1]", "each drop once"},
		{"no drops", func(p *Project) { p.DropsM = nil }, "drops_m", "1 to 12 drops"},
		{"two sections", func(p *Project) { p.Pile.SideMm = F(200) }, "pile.diameter_mm", "exactly one of"},
		{"material", func(p *Project) { p.Pile.Material = "bamboo" }, "pile.material", "timber, concrete or steel"},
		{"range reversed", func(p *Project) { p.Pile.LengthMaxM = F(3) }, "pile.length_max_m", "more than pile.length_m"},
		{"cap row", func(p *Project) { p.Compression.Cap = []string{"rubber"} }, "compression.cap[0]", "timber-head"},
		{"cap missing", func(p *Project) { p.Compression.Cap = nil }, "compression.cap", "or [] for none"},
		{"method", func(p *Project) { p.Compression.Method = "guess" }, "compression.method", "interpolated, banded or given"},
		{"phi and fs", func(p *Project) { p.Design.FactorOfSafety = F(2) }, "design.phi", "one of"},
		{"no factor", func(p *Project) { p.Design.Phi = nil }, "design.phi", "one of"},
		{"zones", func(p *Project) { p.Zones = &Zones{EasyBelowMPa: F(10), HardFromMPa: F(8)} }, "zones.hard_from_mpa", "more than"},
		{"override length", func(p *Project) { p.Tables = &Tables{CapRowsMm: map[string][]float64{"timber-head": {1, 2}}} }, "tables.cap_rows_mm.timber-head", "4 values"},
		{"override falls", func(p *Project) { p.Tables = &Tables{CapRowsMm: map[string][]float64{"timber-head": {3, 2, 4, 5}}} }, "tables.cap_rows_mm.timber-head[1]", "no less than"},
		{"long name", func(p *Project) { p.Name = strings.Repeat("x", 300) }, "name", "at most 200"},
	}
	for _, c := range cases {
		p := demo(t)
		c.edit(p)
		_, err := Resolve(p)
		var es Errors
		if !errors.As(err, &es) {
			t.Fatalf("%s: Resolve error = %v, want Errors", c.name, err)
		}
		found := false
		for _, e := range es {
			if e.Field == c.field && strings.Contains(e.Allowed, c.allowed) {
				found = true
			}
		}
		if !found {
			t.Errorf("%s: errors %q, want field %q allowing %q", c.name, es, c.field, c.allowed)
		}
	}
}

func TestDemoRoundTrip(t *testing.T) {
	p := demo(t)
	var buf bytes.Buffer
	if err := p.Encode(&buf); err != nil {
		t.Fatal(err)
	}
	q, err := DecodeBytes(buf.Bytes())
	if err != nil {
		t.Fatalf("re-decoding the encoded demo: %v", err)
	}
	m1, m2 := mustResolve(t, p), mustResolve(t, q)
	a, b := m1.TableRows(), m2.TableRows()
	if len(a) != len(b) || *a[0].SetMmPerBlow != *b[0].SetMmPerBlow {
		t.Errorf("round trip changed the table: %+v vs %+v", a[0], b[0])
	}
}

// Fuzz the decoder and the solver: an error or a finite answer, never a
// panic or a NaN.
func FuzzProject(f *testing.F) {
	seeds, _ := filepath.Glob("../testdata/*.json")
	for _, s := range seeds {
		b, err := os.ReadFile(s)
		if err == nil {
			f.Add(b, 3.0)
		}
	}
	f.Add([]byte(`{"format":"setcard/1","hammer":{"ram_kg":1e308}}`), 0.0)
	f.Fuzz(func(t *testing.T, data []byte, set float64) {
		p, err := DecodeBytes(data)
		if err != nil {
			return
		}
		m, err := Resolve(p)
		if err != nil {
			return
		}
		for _, q := range m.Table() {
			if !finite(q.SetMm) || !finite(q.RefusalKN) || !finite(q.UltimateKN) {
				t.Fatalf("not finite: %+v", q)
			}
		}
		b, err := m.BlowAt(m.DropsM[0], set, m.LengthsM[0])
		if err == nil && (!finite(b.UltimateKN) || !finite(b.HeadStressMPa) || b.UltimateKN <= 0) {
			t.Fatalf("BlowAt(%g) = %+v", set, b)
		}
		for _, c := range m.Curves(CurveOptions{Points: 20}) {
			for _, pt := range c.Points {
				if !finite(pt.SetMm) || !finite(pt.UltimateKN) {
					t.Fatalf("curve point %+v", pt)
				}
			}
		}
	})
}

func BenchmarkBlow(b *testing.B) {
	m := mustResolve(b, demo(b))
	b.ReportAllocs()
	for i := 0; b.Loop(); i++ {
		_, _ = m.BlowAt(1.2, 3+float64(i%10), 7.5)
	}
}

// BenchmarkCard is the arithmetic of a whole card: 8 drops × 200 sets ×
// 3 lengths, the curves and the table.
func BenchmarkCard(b *testing.B) {
	p := demo(b)
	p.DropsM = []float64{0.3, 0.45, 0.6, 0.75, 0.9, 1.05, 1.2, 1.5}
	m := mustResolve(b, p)
	b.ReportAllocs()
	for b.Loop() {
		for _, l := range m.LengthsM {
			_ = m.Curves(CurveOptions{Points: 200, LengthM: l})
		}
		_ = m.Table()
	}
}

// Fuzz the solver over its numeric inputs: a valid project gives finite
// answers everywhere, an invalid one an error; never a panic or a NaN.
func FuzzSolve(f *testing.F) {
	f.Add(500.0, 0.8, 0.25, 1.2, 250.0, 9.0, 45.0, 2.5, 100.0, 3.0, uint8(0))
	f.Add(3059.0, 1.0, 0.36, 0.9, 300.0, 10.0, 0.0, 0.0, 300.0, 15.0, uint8(2))
	f.Add(50.0, 0.3, 0.0, 0.05, 3000.0, 80.0, 20000.0, 10.0, 50000.0, 0.0, uint8(1))
	f.Fuzz(func(t *testing.T, ram, eff, e, drop, dia, length, parts, cq, load, set float64, method uint8) {
		p := &Project{
			Format: FormatVersion, Hammer: Hammer{RamKg: F(ram), Efficiency: F(eff), Restitution: F(e)},
			DropsM: []float64{drop}, Pile: Pile{Material: "timber", DiameterMm: F(dia), LengthM: F(length)},
			DrivenPartsKg: F(parts), Design: Design{LoadKN: F(load), Phi: F(0.5)},
		}
		switch method % 3 {
		case 0:
			p.Compression = Compression{Method: "interpolated", Cap: []string{"timber-head"}, CqMm: F(cq)}
		case 1:
			p.Compression = Compression{Method: "banded", Cap: []string{"timber-head", "timber-dolly"}, CqMm: F(cq)}
		default:
			p.Compression = Compression{Method: "given", CcMm: F(cq), CpMm: F(cq / 2), CqMm: F(cq)}
		}
		m, err := Resolve(p)
		if err != nil {
			return
		}
		b, err := m.BlowAt(drop, set, length)
		if err == nil {
			for _, v := range []float64{b.UltimateKN, b.DesignKN, b.CMm, b.HeadStressMPa, b.ImpactStressMPa, b.FormulaKN} {
				if !finite(v) {
					t.Fatalf("BlowAt(%g) has %v: %+v", set, v, b)
				}
			}
		}
		q, err := m.Require(drop, length)
		if err != nil || !finite(q.SetMm) || q.SetMm < 0 || !finite(q.RefusalKN) {
			t.Fatalf("Require = %+v, %v", q, err)
		}
		if h, _, _ := m.DropFor(set, length); !finite(h) {
			t.Fatalf("DropFor(%g) = %v", set, h)
		}
	})
}
