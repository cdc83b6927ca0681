package chart

import (
	"fmt"
	"math"
	"reflect"
	"slices"
	"strconv"
	"strings"
	"testing"
)

// sizes are chart sizes from a small phone panel to a page, in their
// units, with their text sizes.
var sizes = []ChartOptions{
	{W: 320, H: 240, TextSize: 10},
	{W: 320, H: 240},
	{W: 480, H: 320},
	{},
	{W: 1024, H: 640, TextSize: 14},
	{W: 1600, H: 1000, TextSize: 16},
	{W: 160, H: 105, TextSize: 2.9, Unit: "mm"},
	{W: 143, H: 115, TextSize: 2.9, Unit: "mm"},
}

// TestChartTextsDoNotOverlap checks every pair of text boxes of the charts
// of several projects, crowded ones with twelve drops among them, at every
// size: none overlaps another or leaves the chart.
func TestChartTextsDoNotOverlap(t *testing.T) {
	ps := append(fileProjects(t), randomProjects(t, 40)...)
	// A renderer's font may be wider or narrower than the default table.
	wide := func(s string, size float64, bold bool) float64 { return 1.3 * SansMeasure(s, size, bold) }
	narrow := func(s string, size float64, bold bool) float64 { return 0.8 * SansMeasure(s, size, bold) }
	for k, p := range ps {
		for _, o := range sizes {
			switch k % 3 {
			case 1:
				o.Measure = wide
			case 2:
				o.Measure = narrow
			}
			l := Chart(p.m, o)
			what := fmt.Sprintf("%s at %g × %g", p.name, l.W, l.H)
			checkTexts(t, what, l)
			checkFinite(t, what, l)
		}
	}
}

// TestChartCrowded checks that a twelve-drop chart still labels its
// curves, zones and crossings at a usual screen size.
func TestChartCrowded(t *testing.T) {
	m := load(t, "cards/crowded.json")
	l := Chart(m, ChartOptions{W: 800, H: 500})
	count := map[string]int{}
	for _, it := range l.Texts() {
		count[it.Role]++
	}
	reachable := 0
	for _, s := range l.Plot.Series {
		if s.Reachable {
			reachable++
		}
	}
	if got := count["curve-label"]; got != len(m.DropsM) {
		t.Errorf("curve labels = %d, want %d (one per drop)", got, len(m.DropsM))
	}
	if got := count["cross-set10"]; got != reachable {
		t.Errorf("crossing labels = %d, want %d (one per reachable drop)", got, reachable)
	}
	if got := count["zone"]; got != 3 {
		t.Errorf("zone labels = %d, want 3", got)
	}
	if count["refusal"] != 1 || count["load"] != 1 {
		t.Errorf("refusal labels = %d, load labels = %d, want 1 and 1", count["refusal"], count["load"])
	}
}

// TestChartDemo checks the chart of the demo against the calculation core:
// one series per drop, the required sets written at the crossings equal to
// the table's (rounded down to 0.1 mm), the load line at the design load.
func TestChartDemo(t *testing.T) {
	m := load(t, "demo.json")
	l := Chart(m, ChartOptions{})
	p := l.Plot
	if len(p.Series) != len(m.DropsM) {
		t.Fatalf("series = %d, want %d", len(p.Series), len(m.DropsM))
	}
	if p.LoadKN != m.LoadKN || p.Ultimate {
		t.Errorf("plot load = %g kN (ultimate %v), want %g kN design", p.LoadKN, p.Ultimate, m.LoadKN)
	}
	var want []string
	for _, r := range m.TableRows() {
		if r.Governs && r.Achievable {
			want = append(want, FormatSet10(*r.SetMmPer10Blows))
		}
	}
	var got []string
	for _, it := range l.Texts() {
		if it.Role == "cross-set10" {
			got = append(got, it.Text)
		}
	}
	slices.Sort(want)
	slices.Sort(got)
	if !slices.Equal(got, want) {
		t.Errorf("crossing labels = %v, want %v (from TableRows)", got, want)
	}
	// The marks sit on the load line at the sets of the table.
	var dots int
	for _, it := range l.Items {
		if it.Role != "cross" {
			continue
		}
		dots++
		cx, cy := 0.0, 0.0
		for _, q := range it.Points {
			cx += q.X / float64(len(it.Points))
			cy += q.Y / float64(len(it.Points))
		}
		if math.Abs(p.KNAt(cx)-m.LoadKN) > 1e-6 {
			t.Errorf("mark at %g kN, want the design load %g kN", p.KNAt(cx), m.LoadKN)
		}
		s := p.SetAt(cy)
		found := false
		for _, w := range want {
			v, _ := strconv.ParseFloat(w, 64)
			found = found || math.Abs(s-v) < 0.1
		}
		if !found {
			t.Errorf("mark at %g mm per 10 blows, want one of %v", s, want)
		}
	}
	if dots != len(want) {
		t.Errorf("marks = %d, want %d", dots, len(want))
	}
}

// TestSeriesCrossTheLoad checks that each reachable curve, read off at the
// design load, gives the required set of the table: the curves and the
// table come from the same engine, so they agree to the curve's sampling
// (200 points, common practice).
func TestSeriesCrossTheLoad(t *testing.T) {
	for _, p := range append(fileProjects(t), randomProjects(t, 20)...) {
		l := Chart(p.m, ChartOptions{})
		for _, s := range l.Plot.Series {
			if !s.Reachable || s.SetMm10[0] < s.RequiredMm10 {
				// Curves start at the largest set Curves samples (at most
				// 100 mm per blow); a larger required set is off the curve.
				continue
			}
			got, ok := s.SetAt(l.Plot.LoadKN)
			if !ok {
				t.Errorf("%s: drop %g m: curve does not reach the load %g kN", p.name, s.DropM, l.Plot.LoadKN)
				continue
			}
			if tol := 0.01*s.RequiredMm10 + 0.05; math.Abs(got-s.RequiredMm10) > tol {
				t.Errorf("%s: Series(%g m).SetAt(%g) = %g, want %g ± %g", p.name, s.DropM, l.Plot.LoadKN, got, s.RequiredMm10, tol)
			}
		}
	}
}

// TestPlotTransforms checks that the transforms of the plot invert each
// other and map the data range onto the frame.
func TestPlotTransforms(t *testing.T) {
	l := Chart(load(t, "demo.json"), ChartOptions{W: 500, H: 300})
	p := l.Plot
	f := p.Frame
	if got := p.XOf(p.XMinKN); math.Abs(got-f.X) > 1e-9 {
		t.Errorf("XOf(%g) = %g, want %g", p.XMinKN, got, f.X)
	}
	if got := p.XOf(p.XMaxKN); math.Abs(got-(f.X+f.W)) > 1e-9 {
		t.Errorf("XOf(%g) = %g, want %g", p.XMaxKN, got, f.X+f.W)
	}
	if got := p.YOf(p.YMinMm10); math.Abs(got-(f.Y+f.H)) > 1e-9 {
		t.Errorf("YOf(%g) = %g, want %g", p.YMinMm10, got, f.Y+f.H)
	}
	if got := p.YOf(p.YMaxMm10); math.Abs(got-f.Y) > 1e-9 {
		t.Errorf("YOf(%g) = %g, want %g", p.YMaxMm10, got, f.Y)
	}
	for _, kn := range []float64{0, 12.5, 100, 173} {
		if got := p.KNAt(p.XOf(kn)); math.Abs(got-kn) > 1e-9 {
			t.Errorf("KNAt(XOf(%g)) = %g, want %g", kn, got, kn)
		}
	}
	for _, s := range []float64{0, 15, 83.9} {
		if got := p.SetAt(p.YOf(s)); math.Abs(got-s) > 1e-9 {
			t.Errorf("SetAt(YOf(%g)) = %g, want %g", s, got, s)
		}
	}
	if !p.Contains(f.X+1, f.Y+1) || p.Contains(f.X-1, f.Y+1) {
		t.Errorf("Contains does not follow the frame %+v", f)
	}
}

// TestChartUltimate checks the ultimate basis: x is R_u, the load line at
// the ultimate resistance the design load needs, the zone edges at the
// thresholds' resistances.
func TestChartUltimate(t *testing.T) {
	m := load(t, "demo.json")
	for _, l := range []*Layout{Chart(m, ChartOptions{Ultimate: true})} {
		p := l.Plot
		if !p.Ultimate || p.LoadKN != m.RequiredUltimateKN() {
			t.Errorf("ultimate plot load = %g kN (ultimate %v), want %g", p.LoadKN, p.Ultimate, m.RequiredUltimateKN())
		}
		e, h := m.ZoneEdgesKN()
		if p.EasyEdgeKN != e || p.HardEdgeKN != h {
			t.Errorf("ultimate zone edges = %g, %g, want %g, %g", p.EasyEdgeKN, p.HardEdgeKN, e, h)
		}
	}
	d := Chart(m, ChartOptions{}).Plot
	e, _ := m.ZoneEdgesKN()
	if want := e * m.DesignFactor(); math.Abs(d.EasyEdgeKN-want) > 1e-9 {
		t.Errorf("design easy edge = %g kN, want %g (ultimate edge × φ)", d.EasyEdgeKN, want)
	}
}

// TestChartTicks checks the tick labels of the x and left y axes: they
// start at 0, step evenly by 1, 2 or 5 times a power of ten, and reach the
// ends of the plot.
func TestChartTicks(t *testing.T) {
	for _, p := range append(fileProjects(t), randomProjects(t, 10)...) {
		for _, o := range sizes {
			l := Chart(p.m, o)
			for _, role := range []string{"tick-x", "tick-y"} {
				var vs []float64
				for _, it := range l.Texts() {
					if it.Role == role {
						v, err := strconv.ParseFloat(it.Text, 64)
						if err != nil {
							t.Fatalf("%s: tick %q: %v", p.name, it.Text, err)
						}
						vs = append(vs, v)
					}
				}
				if len(vs) < 2 || vs[0] != 0 {
					t.Errorf("%s %g × %g: %s ticks %v, want at least 2 from 0", p.name, l.W, l.H, role, vs)
					continue
				}
				step := vs[1] - vs[0]
				if !isNice(step) {
					t.Errorf("%s: %s step %g is not 1, 2 or 5 times a power of ten", p.name, role, step)
				}
				for k := 1; k < len(vs); k++ {
					if math.Abs(vs[k]-vs[k-1]-step) > 1e-9*step {
						t.Errorf("%s: %s ticks %v are not evenly spaced", p.name, role, vs)
						break
					}
				}
				end := l.Plot.XMaxKN
				if role == "tick-y" {
					end = l.Plot.YMaxMm10
				}
				if math.Abs(vs[len(vs)-1]-end) > 1e-9*end {
					t.Errorf("%s: last %s tick %g, want the end of the axis %g", p.name, role, vs[len(vs)-1], end)
				}
			}
		}
	}
}

func isNice(step float64) bool {
	p := math.Pow(10, math.Floor(math.Log10(step)))
	k := step / p
	for _, n := range []float64{1, 2, 5, 10} {
		if math.Abs(k-n) < 1e-9 {
			return true
		}
	}
	return false
}

// TestHatchInsideBands checks that the hatching is clipped to the zone
// bands and the refusal band: no hatch line leaves the plot frame.
func TestHatchInsideBands(t *testing.T) {
	for _, p := range fileProjects(t) {
		l := Chart(p.m, ChartOptions{})
		f := l.Plot.Frame
		n := 0
		for _, it := range l.Items {
			if it.Kind != Line || it.Stroke != GridGrey && it.Stroke != HatchGrey {
				continue
			}
			n++
			for _, q := range it.Points {
				if !f.inset(-1e-9).Contains(q) {
					t.Errorf("%s: hatch or grid line point %+v outside the frame %+v", p.name, q, f)
				}
			}
		}
		if n == 0 {
			t.Errorf("%s: no hatch lines", p.name)
		}
	}
}

// TestCurveStylesDistinct checks that twelve drops (the most a project may
// have) get twelve different pairs of colour and dash.
func TestCurveStylesDistinct(t *testing.T) {
	seen := map[string]int{}
	for i := range 12 {
		c, d := CurveStyle(i, 1)
		k := fmt.Sprint(c, d)
		if j, ok := seen[k]; ok {
			t.Errorf("CurveStyle(%d) = CurveStyle(%d) = %s", i, j, k)
		}
		seen[k] = i
	}
}

// TestChartDegenerateSizes checks that a zero, negative or infinite size
// falls back to the default rather than producing NaN.
func TestChartDegenerateSizes(t *testing.T) {
	m := load(t, "demo.json")
	for _, o := range []ChartOptions{{W: -1, H: 10}, {W: math.Inf(1), H: 100}, {W: math.NaN(), H: math.NaN()}, {TextSize: math.NaN()}} {
		l := Chart(m, o)
		if l.W != 640 || l.H != 400 {
			t.Errorf("Chart(%+v) size = %g × %g, want 640 × 400", o, l.W, l.H)
		}
		checkFinite(t, fmt.Sprint(o), l)
	}
}

// TestSpread checks the spreading of labels against hand-worked cases.
func TestSpread(t *testing.T) {
	cases := []struct {
		ys     []float64
		h      float64
		lo, hi float64
		want   []float64
		ok     bool
	}{
		{[]float64{10, 50}, 5, 0, 100, []float64{10, 50}, true},        // apart already
		{[]float64{10, 12}, 5, 0, 100, []float64{8.5, 13.5}, true},     // pushed apart about their mean
		{[]float64{1, 2}, 5, 0, 100, []float64{0, 5}, true},            // held at the top
		{[]float64{99, 100}, 5, 0, 100, []float64{95, 100}, true},      // held at the bottom
		{[]float64{10, 11, 12}, 5, 0, 100, []float64{6, 11, 16}, true}, // a cluster of three
		{[]float64{10, 11, 12, 13}, 40, 0, 100, nil, false},            // too many
		{[]float64{}, 5, 0, 100, nil, true},                            // none
		{[]float64{10, 12, 40, 41}, 5, 0, 100, []float64{8.5, 13.5, 38, 43}, true},
	}
	for _, c := range cases {
		got, ok := spread(c.ys, c.h, c.lo, c.hi)
		if ok != c.ok || len(got) != len(c.want) {
			t.Errorf("spread(%v, %g) = %v, %v, want %v, %v", c.ys, c.h, got, ok, c.want, c.ok)
			continue
		}
		for i := range got {
			if math.Abs(got[i]-c.want[i]) > 1e-9 {
				t.Errorf("spread(%v, %g) = %v, want %v", c.ys, c.h, got, c.want)
				break
			}
		}
	}
}

// TestCleanedTitle checks that the layout's title is the cleaned name.
func TestCleanedTitle(t *testing.T) {
	m := load(t, "cards/hostile.json")
	l := Chart(m, ChartOptions{})
	if strings.ContainsRune(l.Title, '\u202e') || l.Title != Clean(m.Name) {
		t.Errorf("Chart title = %q, want %q", l.Title, Clean(m.Name))
	}
}

// TestChartRecycle checks that a chart laid out in a recycled layout is the
// chart laid out afresh, across projects and sizes that grow and shrink the
// number of items.
func TestChartRecycle(t *testing.T) {
	ps := append(fileProjects(t), randomProjects(t, 10)...)
	var old *Layout
	n := 0
	for _, p := range ps {
		for _, o := range sizes {
			want := Chart(p.m, o)
			o.Recycle = old
			got := Chart(p.m, o)
			g, w := *got, *want
			g.slab, w.slab = nil, nil // the memory they were cut from may differ
			if !reflect.DeepEqual(g, w) {
				t.Fatalf("%s at %g × %g: the recycled layout differs from a fresh one", p.name, o.W, o.H)
			}
			if old != nil && len(old.Items) != 0 {
				t.Fatalf("the recycled layout still holds %d items", len(old.Items))
			}
			old = got
			n++
		}
	}
	if n < 20 {
		t.Fatalf("only %d charts compared", n)
	}
}
