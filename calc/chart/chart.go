package chart

import (
	"math"
	"slices"
	"sort"

	"setcard/calc"
)

// ChartOptions shape Chart. The zero value is a chart 640 × 400 px with
// 12 px text.
type ChartOptions struct {
	// W and H are the size of the chart in layout units (default 640 × 400);
	// Unit names the units (default "px").
	W, H float64
	Unit string
	// TextSize is the size of the tick labels and axis titles, in layout
	// units (default 12). Labels on the curves are a little larger, and
	// every line width is in proportion to it.
	TextSize float64
	// Ultimate puts the ultimate resistance on the x axis instead of the
	// design capacity. The model's ChartUltimate does the same.
	Ultimate bool
	// Measure is the width of text (default SansMeasure).
	Measure Measure
	// CurvePoints is the number of points per curve (default 200, as
	// calc.CurveOptions). A screen chart redrawn while a control is dragged
	// may take fewer.
	CurvePoints int
	// Recycle, when not nil, is a layout from an earlier call that is no
	// longer used: its memory is reused and its contents overwritten. A
	// chart redrawn at the frame rate then allocates less.
	Recycle *Layout
}

func (o *ChartOptions) defaults() {
	if !(o.W > 0) || !(o.H > 0) || math.IsInf(o.W, 0) || math.IsInf(o.H, 0) {
		o.W, o.H = 640, 400
	}
	if o.Unit == "" {
		o.Unit = "px"
	}
	if !(o.TextSize > 0) || math.IsInf(o.TextSize, 0) {
		o.TextSize = 12
	}
	if o.Measure == nil {
		o.Measure = SansMeasure
	}
}

// drops are the governing requirement and the curve of each drop.
type dropData struct {
	req   calc.Requirement
	curve calc.Curve
}

// governing returns, for each drop of the model in order, the
// requirement of the length that governs and the curve at that length.
func governing(m *calc.Model, points int) []dropData {
	out := make([]dropData, len(m.DropsM))
	for _, q := range m.Table() {
		if q.Governs {
			i := slices.Index(m.DropsM, q.DropM)
			out[i].req = q
		}
	}
	// One call of Curves per distinct governing length.
	done := map[float64][]calc.Curve{}
	for i := range out {
		l := out[i].req.LengthM
		cs, ok := done[l]
		if !ok {
			cs = m.Curves(calc.CurveOptions{LengthM: l, Points: points})
			done[l] = cs
		}
		out[i].curve = cs[i]
	}
	return out
}

// Chart lays out the chart of required set against capacity for a model:
// one curve per drop, labelled on the curve; the easy, medium and hard
// driving zones as vertical bands, hatched and labelled; the design load as
// a vertical line, with the required set of each drop marked where its
// curve crosses it and written beside the mark in mm per 10 blows; and the
// band of sets below the minimum practical set marked as refusal.
//
// The y axis is mm per 10 blows (left) and mm per blow (right); the x axis
// is design capacity in kN, or ultimate when o.Ultimate or the model's
// ChartUltimate says so. Ticks are in steps of 1, 2 or 5 times a power of
// ten, as many as fit. Labels that would cover one another are moved or
// left out, never overlapped, and every text stays inside the chart. The
// model must come from calc.Resolve.
func Chart(m *calc.Model, o ChartOptions) *Layout {
	o.defaults()
	b := &builder{measure: o.Measure}
	if r := o.Recycle; r != nil && cap(r.Items) > 0 {
		clear(r.Items) // drop what the old items point to
		b.items = r.Items[:0]
		b.slab = r.slab[:0]
		*r = Layout{}
	} else {
		b.items = make([]Item, 0, 320)
	}
	b.boxes = make([]Rect, 0, 128)
	b.rect(Rect{0, 0, o.W, o.H}, White, 0, White, "background")
	p := chartInto(b, m, o, governing(m, o.CurvePoints))
	return &Layout{W: o.W, H: o.H, Unit: o.Unit, Title: Clean(m.Name), Items: b.items, Plot: p, slab: b.slab}
}

// chartInto lays the chart into b at (0, 0) and returns its plot.
func chartInto(b *builder, m *calc.Model, o ChartOptions, drops []dropData) *Plot {
	ts := o.TextSize
	ult := o.Ultimate || m.ChartUltimate
	f := m.DesignFactor()
	basis := f
	if ult {
		basis = 1
	}
	easy, hard := m.ZoneEdgesKN()
	p := &Plot{
		Ultimate: ult, DesignFactor: f, LoadKN: m.LoadKN, MinSetMm10: 10 * m.MinSetMm,
		EasyEdgeKN: easy * basis, HardEdgeKN: hard * basis,
	}
	if ult {
		p.LoadKN = m.RequiredUltimateKN()
	}

	// Data ranges.
	yTop := math.Max(3*p.MinSetMm10, 10)
	xRight := 0.0
	for i, d := range drops {
		q := d.req
		if q.Achievable {
			yTop = math.Max(yTop, 1.5*q.SetMm10)
		}
		xRight = math.Max(xRight, 1.05*d.curve.MinSetKN*basis)
		s := Series{DropM: q.DropM, LengthM: q.LengthM, Label: num(q.DropM, 3) + " m",
			RequiredMm10: q.SetMm10, Reachable: q.Achievable}
		s.Colour, s.Dash = CurveStyle(i, ts)
		s.KN = make([]float64, 0, len(d.curve.Points))
		s.SetMm10 = make([]float64, 0, len(d.curve.Points))
		for _, pt := range d.curve.Points {
			s.KN = append(s.KN, pt.UltimateKN*basis)
			s.SetMm10 = append(s.SetMm10, 10*pt.SetMm)
		}
		p.Series = append(p.Series, s)
	}
	xRight = math.Min(math.Max(xRight, 1.25*p.LoadKN), 2.2*p.LoadKN)

	// Margins, in text sizes.
	lh := (Ascent + Descent) * ts // height of a line of text
	top := 0.25*ts + 1.9*ts       // the strip of zone labels
	key := o.H >= 24*ts
	bottom := 0.35*ts + 0.3*ts + lh + 0.45*ts + lh + 0.25*ts
	if key {
		bottom += 0.35*ts + lh
	}
	plotH := math.Max(o.H-top-bottom, 2*ts)

	// y ticks: labels at least 2.2 text sizes apart.
	ny := max(1, int(plotH/(2.2*ts)))
	ystep := NiceStep(yTop, ny)
	p.YMinMm10, p.YMaxMm10 = 0, math.Ceil(yTop/ystep-1e-9)*ystep
	yt := Ticks(0, p.YMaxMm10, ystep)
	wl, wr := 0.0, 0.0
	for _, v := range yt {
		wl = math.Max(wl, b.measure(formatTick(v, ystep), ts, false))
		wr = math.Max(wr, b.measure(formatTick(v/10, ystep/10), ts, false))
	}
	left := 0.2*ts + lh + 0.4*ts + wl + 0.25*ts + 0.35*ts
	right := 0.35*ts + 0.25*ts + wr + 0.4*ts + lh + 0.2*ts
	plotW := math.Max(o.W-left-right, 2*ts)
	p.Frame = Rect{left, top, plotW, plotH}

	// x ticks: as many as fit with a gap of 1.2 text sizes between labels.
	var xt []float64
	var xstep float64
	for nx, tried := max(1, int(plotW/(2*ts))), 0.0; ; nx-- {
		xstep = NiceStep(xRight, nx)
		if xstep == tried && nx > 1 {
			continue // many counts give the same step, already rejected
		}
		tried = xstep
		xmax := math.Ceil(xRight/xstep-1e-9) * xstep
		xt = Ticks(0, xmax, xstep)
		widest := 0.0
		for _, v := range xt {
			widest = math.Max(widest, b.measure(formatTick(v, xstep), ts, false))
		}
		if nx <= 1 || (widest+1.2*ts)*float64(len(xt)-1) <= plotW {
			p.XMinKN, p.XMaxKN = 0, xmax
			break
		}
	}
	fr := p.Frame

	// Zone bands, hatched so that they read without colour.
	xe, xh := p.XOf(p.EasyEdgeKN), p.XOf(p.HardEdgeKN)
	band := func(x0, x1 float64) Rect {
		x0, x1 = math.Max(x0, fr.X), math.Min(x1, fr.X+fr.W)
		return Rect{x0, fr.Y, math.Max(0, x1-x0), fr.H}
	}
	bands := []Rect{band(fr.X, xe), band(xe, xh), band(xh, fr.X+fr.W)}
	b.rect(fr, White, 0, White, "plot")
	if r := bands[1]; r.W > 0 {
		b.rect(r, TintLight, 0, White, "zone-medium")
		b.hatch(r, hatchRising, 1.1*ts, 0.07*ts, HatchGrey)
	}
	if r := bands[2]; r.W > 0 {
		b.rect(r, TintMid, 0, White, "zone-hard")
		b.hatch(r, hatchRising, 0.75*ts, 0.06*ts, HatchGrey)
		b.hatch(r, hatchFalling, 0.75*ts, 0.06*ts, HatchGrey)
	}
	// The refusal band, with level hatching unlike the zones'.
	yr := p.YOf(p.MinSetMm10)
	refusal := Rect{fr.X, yr, fr.W, fr.Y + fr.H - yr}
	if refusal.H > 0 {
		b.rect(refusal, TintDark, 0, White, "refusal")
		b.hatch(refusal, hatchLevel, 0.4*ts, 0.05*ts, HatchGrey)
		b.line(Point{fr.X, yr}, Point{fr.X + fr.W, yr}, 0.1*ts, Ink, nil)
	}

	// Grid.
	for _, v := range yt[1:] {
		y := p.YOf(v)
		if math.Abs(y-yr) > 0.05*ts {
			b.line(Point{fr.X, y}, Point{fr.X + fr.W, y}, 0.04*ts, GridGrey, nil)
		}
	}
	for _, v := range xt[1:] {
		x := p.XOf(v)
		b.line(Point{x, fr.Y}, Point{x, fr.Y + fr.H}, 0.04*ts, GridGrey, nil)
	}
	for _, x := range []float64{xe, xh} {
		if x > fr.X && x < fr.X+fr.W {
			b.line(Point{x, fr.Y}, Point{x, fr.Y + fr.H}, 0.08*ts, Grey, []float64{0.5 * ts, 0.3 * ts})
		}
	}

	// The design load: a broad grey line under the curves.
	xl := p.XOf(p.LoadKN)
	loadIn := xl >= fr.X && xl <= fr.X+fr.W
	if loadIn {
		b.line(Point{xl, fr.Y}, Point{xl, fr.Y + fr.H}, 0.3*ts, Grey, nil)
	}

	// Curves: solid above the refusal band, thin and dotted in it.
	runs := make([][][]Point, len(p.Series))
	for i, s := range p.Series {
		above := b.points(len(s.KN) + 1)[:0]
		below := b.points(len(s.KN) + 1)[:0]
		for k := range s.KN {
			pt := Point{p.XOf(s.KN[k]), p.YOf(s.SetMm10[k])}
			if k > 0 && (s.SetMm10[k-1] >= p.MinSetMm10) != (s.SetMm10[k] >= p.MinSetMm10) {
				// Split at the edge of the band.
				t := (p.MinSetMm10 - s.SetMm10[k-1]) / (s.SetMm10[k] - s.SetMm10[k-1])
				kn := s.KN[k-1] + t*(s.KN[k]-s.KN[k-1])
				e := Point{p.XOf(kn), yr}
				above = append(above, e)
				below = append(below, e)
			}
			if s.SetMm10[k] >= p.MinSetMm10 {
				above = append(above, pt)
			} else {
				below = append(below, pt)
			}
		}
		room := func(n int) []Point { return b.points(n)[:0] }
		for _, r := range clipPolyline(below, fr, room) {
			b.polyline(r, 0.07*ts, s.Colour, []float64{0.15 * ts, 0.25 * ts}, "curve-refusal")
		}
		runs[i] = clipPolyline(above, fr, room)
		for _, r := range runs[i] {
			b.polyline(r, 0.2*ts, s.Colour, s.Dash, "curve")
		}
	}
	b.frame(fr, 0.1*ts, Ink)

	// Axes: ticks, tick labels and titles.
	tick := 0.35 * ts
	yb := fr.Y + fr.H
	for _, v := range xt {
		x := p.XOf(v)
		b.line(Point{x, yb}, Point{x, yb + tick}, 0.08*ts, Ink, nil)
		b.text(formatTick(v, xstep), Point{x, yb + tick + 0.3*ts + Ascent*ts}, ts, false, Middle, Ink, "tick-x")
	}
	for _, v := range yt {
		y := p.YOf(v)
		base := y + (Ascent-Descent)/2*ts
		b.line(Point{fr.X - tick, y}, Point{fr.X, y}, 0.08*ts, Ink, nil)
		b.line(Point{fr.X + fr.W, y}, Point{fr.X + fr.W + tick, y}, 0.08*ts, Ink, nil)
		b.text(formatTick(v, ystep), Point{fr.X - tick - 0.25*ts, base}, ts, false, End, Ink, "tick-y")
		b.text(formatTick(v/10, ystep/10), Point{fr.X + fr.W + tick + 0.25*ts, base}, ts, false, Start, Ink, "tick-y1")
	}
	titleY := yb + tick + 0.3*ts + lh + 0.45*ts + Ascent*ts
	var xTitle []string
	switch {
	case ult:
		xTitle = []string{"ultimate capacity, kN", "ultimate, kN", "kN"}
	case m.Phi > 0:
		xTitle = []string{"design capacity (φ × ultimate), kN", "design capacity, kN", "kN"}
	default:
		xTitle = []string{"allowable load (ultimate ÷ FS), kN", "allowable load, kN", "kN"}
	}
	all := Rect{0, 0, o.W, o.H}
	b.firstFit(xTitle, style{size: ts, bold: true, colour: Ink, role: "title-x", bounds: all}, func(string) spot {
		return spot{at: Point{fr.X + fr.W/2, titleY}, anchor: Middle, ok: true}
	})
	midY := fr.Y + fr.H/2
	b.firstFit([]string{"required set, mm per 10 blows", "mm per 10 blows", "mm/10 blows"},
		style{size: ts, bold: true, colour: Ink, role: "title-y", bounds: all}, func(string) spot {
			return spot{at: Point{0.2*ts + Ascent*ts, midY}, anchor: Middle, vertical: true, ok: true}
		})
	b.firstFit([]string{"required set, mm per blow", "mm per blow", "mm/blow"},
		style{size: ts, bold: true, colour: Ink, role: "title-y1", bounds: all}, func(string) spot {
			return spot{at: Point{o.W - 0.2*ts - Descent*ts, midY}, anchor: Middle, vertical: true, ok: true}
		})
	if key {
		ky := titleY + 0.35*ts + lh
		r := 0.32 * ts
		kx := fr.X
		label := "required set at the design load, mm per 10 blows"
		if w := b.measure(label, ts, false); kx+3.2*r+w <= o.W-0.2*ts {
			b.dot(Point{kx + r, ky - (Ascent-Descent)/2*ts}, r, Ink, 0, Ink, "key")
			b.text(label, Point{kx + 3.2*r, ky}, ts, false, Start, Ink, "key")
		}
	}

	// Labels inside the frame keep clear of its edge.
	inner := fr.inset(0.15 * ts)

	// Zone labels over their bands, in the strip above the plot, and the
	// design load's label: first with the load's label in full at the top
	// of its line; if that leaves a band without a label, again with the
	// zone labels first and the load's label where it then fits.
	zoneNames := [3][]string{
		{"easy driving, below " + num(m.EasyBelowMPa, 2) + " MPa", "easy driving", "easy"},
		{"medium driving, " + num(m.EasyBelowMPa, 2) + " to " + num(m.HardFromMPa, 2) + " MPa", "medium driving", "medium"},
		{"hard driving, " + num(m.HardFromMPa, 2) + " MPa and over", "hard driving", "hard"},
	}
	strip := Rect{fr.X, 0, fr.W, fr.Y - 0.1*ts}
	sy := fr.Y - 0.55*ts // baseline of the strip
	zoneStyle := style{size: ts, bold: true, colour: Ink, role: "zone", bounds: strip}
	var labelled [3]bool
	zones := func() bool {
		labelled = [3]bool{}
		for k, r := range bands {
			if r.W <= 0 {
				continue
			}
			var clear, over []cand
			for _, n := range zoneNames[k] {
				w := b.measure(n, ts, true)
				for _, a := range []Anchor{Middle, Start, End} {
					x := r.X + r.W/2
					switch a {
					case Start:
						x = r.X + 0.3*ts
					case End:
						x = r.X + r.W - 0.3*ts
					}
					c := cand{n, spot{at: Point{x, sy}, anchor: a, ok: w <= r.W-0.6*ts}}
					bx := b.textBox(n, c.at, ts, true, a, false)
					if loadIn && bx.X-ts < xl && xl < bx.X+bx.W+ts {
						over = append(over, c)
					} else {
						clear = append(clear, c)
					}
				}
			}
			labelled[k] = b.place(append(clear, over...), zoneStyle)
		}
		// A band too narrow for any of its names: the shortest, over the
		// band and beyond it, its bracket showing where the band is.
		for k, r := range bands {
			if labelled[k] || r.W <= 0 {
				continue
			}
			n := zoneNames[k][len(zoneNames[k])-1]
			labelled[k] = b.place([]cand{
				{n, spot{at: Point{r.X + r.W/2, sy}, anchor: Middle, ok: true}},
				{n, spot{at: Point{r.X + r.W, sy}, anchor: End, ok: true}},
				{n, spot{at: Point{r.X, sy}, anchor: Start, ok: true}},
			}, zoneStyle)
		}
		for k, r := range bands {
			if r.W > 0 && !labelled[k] {
				return false
			}
		}
		return true
	}
	mark := len(b.items) // the brackets go here, under the labels
	loadStyle := style{size: ts, bold: true, colour: Ink, role: "load", bounds: Rect{0, 0, o.W, fr.Y + fr.H}, halo: true}
	if loadIn {
		v := num(p.LoadKN, 1)
		names := []string{"design load " + v + " kN", "load " + v + " kN", v + " kN"}
		if ult {
			d := num(m.LoadKN, 1)
			names = []string{v + " kN ultimate for the design load " + d + " kN", "ultimate " + v + " kN", v + " kN"}
		}
		ni, nb := len(b.items), len(b.boxes)
		if !b.place([]cand{{names[0], spot{at: Point{xl, sy}, anchor: Middle, ok: true}}}, loadStyle) || !zones() {
			b.items, b.boxes = b.items[:ni], b.boxes[:nb]
			zones()
			top := fr.Y + 0.4*ts + Ascent*ts
			var cs []cand
			for _, n := range names {
				cs = append(cs, cand{n, spot{at: Point{xl, sy}, anchor: Middle, ok: true}})
			}
			for _, n := range names {
				cs = append(cs, cand{n, spot{at: Point{xl + 0.4*ts, top}, anchor: Start, ok: true}},
					cand{n, spot{at: Point{xl - 0.4*ts, top}, anchor: End, ok: true}})
			}
			b.place(cs, loadStyle)
		}
	} else {
		zones()
	}
	// Brackets above the plot show the extent of each labelled band.
	var brackets []Item
	for k, r := range bands {
		if labelled[k] {
			by := fr.Y - 0.3*ts
			x0, x1 := r.X+math.Min(0.15*ts, r.W/4), r.X+r.W-math.Min(0.15*ts, r.W/4)
			brackets = append(brackets, Item{Kind: Polyline, Points: []Point{{x0, by - 0.3*ts}, {x0, by}, {x1, by}, {x1, by - 0.3*ts}},
				Width: 0.08 * ts, Stroke: Grey, Role: "bracket"})
		}
	}
	b.items = slices.Insert(b.items, mark, brackets...)

	// The required sets at the design load.
	if loadIn {
		crossings(b, p, xl, inner, ts)
	}

	// The refusal band's label: in the band, or just above it when the
	// band is thin, at the end away from the design load if it fits there.
	if refusal.H > 0 && yr > fr.Y {
		v := FormatSet10(p.MinSetMm10)
		names := []string{
			"refusal: set below " + v + " mm per 10 blows",
			"refusal: below " + v + " mm / 10 blows",
			"refusal",
		}
		y := yr + (refusal.H+(Ascent-Descent)*ts)/2 // centred in the band
		if refusal.H < lh+0.3*ts {
			y = yr - 0.25*ts - Descent*ts // just above it
		}
		ends := []cand{{"", spot{at: Point{inner.X + inner.W - 0.3*ts, y}, anchor: End, ok: true}},
			{"", spot{at: Point{inner.X + 0.3*ts, y}, anchor: Start, ok: true}}}
		if xl > fr.X+fr.W/2 {
			ends[0], ends[1] = ends[1], ends[0]
		}
		var cs []cand
		for _, n := range names {
			for _, e := range ends {
				e.text = n
				cs = append(cs, e)
			}
		}
		b.place(cs, style{size: ts, bold: true, colour: Ink, role: "refusal", bounds: inner, halo: true})
	}

	// Curve labels, on the curves.
	for i, s := range p.Series {
		curveLabel(b, s, i, runs, xl, inner, ts)
	}
	return p
}

// spot is where a label would go: its anchor point and anchor, whether it
// is turned to read upwards, and whether it can go there at all.
type spot struct {
	at       Point
	anchor   Anchor
	vertical bool
	ok       bool
}

// style is how a label is drawn and where it may go.
type style struct {
	size   float64
	bold   bool
	colour rgba
	role   string
	bounds Rect // the box must lie within bounds
	halo   bool // a white box under the text hides the lines below it
}

// firstFit places the first of names that fits: where gives its spot; the
// text box must lie within the style's bounds and cover no text placed so
// far. It reports whether one was placed.
func (b *builder) firstFit(names []string, st style, where func(string) spot) bool {
	cs := make([]cand, len(names))
	for i, s := range names {
		cs[i] = cand{s, where(s)}
	}
	return b.place(cs, st)
}

// cand is a text and a spot for it.
type cand struct {
	text string
	spot
}

// place places the first candidate that fits, as firstFit.
func (b *builder) place(cs []cand, st style) bool {
	for _, c := range cs {
		if !c.ok {
			continue
		}
		box := b.textBox(c.text, c.at, st.size, st.bold, c.anchor, c.vertical)
		if !box.Inside(st.bounds, 1e-9) || !b.free(box, 0.1*st.size) {
			continue
		}
		if st.halo {
			b.rect(box.inset(-0.12*st.size), White, 0, White, "halo")
		}
		b.textV(c.text, c.at, st.size, st.bold, c.anchor, c.vertical, st.colour, st.role)
		return true
	}
	return false
}

// crossings marks where each reachable curve crosses the design load and
// writes its set beside the mark, spreading the numbers apart where they
// would overlap, on one or both sides of the line.
func crossings(b *builder, p *Plot, xl float64, inner Rect, ts float64) {
	type mark struct {
		y     float64 // the mark
		label string
		w     float64
	}
	var ms []mark
	fs := 1.1 * ts
	for _, s := range p.Series {
		if !s.Reachable || s.RequiredMm10 > p.YMaxMm10 {
			continue
		}
		lab := FormatSet10(s.RequiredMm10)
		ms = append(ms, mark{p.YOf(s.RequiredMm10), lab, b.measure(lab, fs, true)})
	}
	sort.Slice(ms, func(i, j int) bool { return ms[i].y < ms[j].y })
	r := 0.3 * ts
	for _, mk := range ms {
		b.dot(Point{xl, mk.y}, r, Ink, 0.06*ts, White, "cross")
		b.block(Rect{xl - r, mk.y - r, 2 * r, 2 * r})
	}
	h := 1.25 * fs // the pitch of the numbers
	lo, hi := inner.Y+h/2, inner.Y+inner.H-h/2
	wmax := 0.0
	for _, mk := range ms {
		wmax = math.Max(wmax, mk.w)
	}
	gap := 0.7 * ts
	rightOK := xl+gap+wmax+0.2*ts <= inner.X+inner.W
	leftOK := xl-gap-wmax-0.2*ts >= inner.X
	want := make([]float64, len(ms))
	for i, mk := range ms {
		want[i] = mk.y
	}
	// Try one side, then both sides alternately.
	side := make([]int, len(ms)) // +1 right, −1 left, 0 left out
	pos := make([]float64, len(ms))
	assign := func(idx []int) bool {
		ys := make([]float64, len(idx))
		for k, i := range idx {
			ys[k] = want[i]
		}
		out, ok := spread(ys, h, lo, hi)
		if !ok {
			return false
		}
		for k, i := range idx {
			pos[i] = out[k]
		}
		return true
	}
	all := make([]int, len(ms))
	for i := range all {
		all[i] = i
	}
	placed := false
	for _, sd := range []int{+1, -1} {
		if (sd > 0 && !rightOK) || (sd < 0 && !leftOK) || !assign(all) {
			continue
		}
		moved := 0.0
		for i := range ms {
			moved = math.Max(moved, math.Abs(pos[i]-want[i]))
		}
		if moved <= 1.5*h {
			for i := range side {
				side[i] = sd
			}
			placed = true
			break
		}
	}
	if !placed && rightOK && leftOK {
		var ev, od []int
		for i := range ms {
			if i%2 == 0 {
				ev = append(ev, i)
			} else {
				od = append(od, i)
			}
		}
		if assign(ev) && assign(od) {
			for _, i := range ev {
				side[i] = +1
			}
			for _, i := range od {
				side[i] = -1
			}
			placed = true
		}
	}
	if !placed {
		// Thin: every other number, on the side with room.
		sd := +1
		if !rightOK {
			sd = -1
		}
		if rightOK || leftOK {
			for step := 2; step <= len(ms); step++ {
				var idx []int
				for i := 0; i < len(ms); i += step {
					idx = append(idx, i)
				}
				if assign(idx) {
					for _, i := range idx {
						side[i] = sd
					}
					break
				}
			}
		}
	}
	for i, mk := range ms {
		if side[i] == 0 {
			continue
		}
		base := pos[i] + (Ascent-Descent)/2*fs
		x, a := xl+gap, Start
		if side[i] < 0 {
			x, a = xl-gap, End
		}
		box := b.textBox(mk.label, Point{x, base}, fs, true, a, false)
		if !box.Inside(inner, 1e-9) || !b.free(box, 0.1*ts) {
			continue
		}
		edge := box.X - 0.1*ts
		if side[i] < 0 {
			edge = box.X + box.W + 0.1*ts
		}
		if math.Abs(pos[i]-mk.y) > 0.2*h {
			b.line(Point{xl + float64(side[i])*r, mk.y}, Point{edge, pos[i]}, 0.06*ts, Ink, nil)
		}
		b.rect(box.inset(-0.1*ts), White, 0, White, "halo")
		b.text(mk.label, Point{x, base}, fs, true, a, Ink, "cross-set10")
	}
}

// spread moves labels of height h, wanted at centres ys (rising), apart so
// that none overlaps the next, each as near its wish as it can be, within
// [lo, hi] (the range of centres). It fails when they cannot fit.
func spread(ys []float64, h, lo, hi float64) ([]float64, bool) {
	n := len(ys)
	if n == 0 {
		return nil, true
	}
	if float64(n-1)*h > hi-lo+1e-9 {
		return nil, false
	}
	type cluster struct {
		first, n int
		top      float64 // centre of the first label
	}
	var cs []cluster
	place := func(c *cluster) {
		sum := 0.0
		for k := range c.n {
			sum += ys[c.first+k] - float64(k)*h
		}
		c.top = sum / float64(c.n)
		c.top = math.Max(lo, math.Min(c.top, hi-float64(c.n-1)*h))
	}
	for i := range n {
		c := cluster{first: i, n: 1}
		place(&c)
		cs = append(cs, c)
		for len(cs) > 1 {
			a, z := cs[len(cs)-2], cs[len(cs)-1]
			if a.top+float64(a.n)*h <= z.top+1e-9 {
				break
			}
			a.n += z.n
			place(&a)
			cs = cs[:len(cs)-1]
			cs[len(cs)-1] = a
		}
	}
	out := make([]float64, 0, n)
	for _, c := range cs {
		for k := range c.n {
			out = append(out, c.top+float64(k)*h)
		}
	}
	return out, true
}

// curveLabel writes the drop on its curve: at the first place along the
// curve, from the middle outwards, where the label covers no text, and
// preferably no other curve and not the design-load line.
func curveLabel(b *builder, s Series, i int, runs [][][]Point, xl float64, inner Rect, ts float64) {
	// The longest run of the curve carries the label.
	var run []Point
	for _, r := range runs[i] {
		if len(r) > len(run) {
			run = r
		}
	}
	if len(run) < 2 {
		return
	}
	cum := make([]float64, len(run))
	for k := 1; k < len(run); k++ {
		cum[k] = cum[k-1] + math.Hypot(run[k].X-run[k-1].X, run[k].Y-run[k-1].Y)
	}
	total := cum[len(cum)-1]
	at := func(t float64) Point {
		d := t * total
		k := sort.SearchFloat64s(cum, d)
		if k == 0 {
			return run[0]
		}
		k = min(k, len(run)-1)
		u := (d - cum[k-1]) / math.Max(cum[k]-cum[k-1], 1e-12)
		return Point{run[k-1].X + u*(run[k].X-run[k-1].X), run[k-1].Y + u*(run[k].Y-run[k-1].Y)}
	}
	fs := 1.05 * ts
	names := []string{"drop " + s.Label, s.Label}
	// Places along the curve, as fractions of its length: the middle first.
	along := []float64{0.5, 0.42, 0.58, 0.34, 0.66, 0.26, 0.74, 0.18, 0.82, 0.12, 0.88, 0.06, 0.94}
	for _, name := range names {
		best, bestTier := Rect{}, 4
		var bestAt Point
		for _, t := range along {
			c := at(t)
			base := c.Y + (Ascent-Descent)/2*fs
			box := b.textBox(name, Point{c.X, base}, fs, true, Middle, false)
			halo := box.inset(-0.12 * ts)
			if !halo.Inside(inner, 1e-9) || !b.free(halo, 0.25*ts) {
				continue
			}
			tier := 1
			for j := range runs {
				if j != i && crosses(runs[j], halo) {
					tier = 3
					break
				}
			}
			if tier == 1 && xl >= halo.X && xl <= halo.X+halo.W {
				tier = 2
			}
			if tier < bestTier {
				best, bestTier, bestAt = box, tier, Point{c.X, base}
				if tier == 1 {
					break
				}
			}
		}
		if bestTier < 4 {
			// Black text reads in a grey copy; the frame in the curve's
			// colour ties it to its curve on screen.
			b.rect(best.inset(-0.12*ts), White, 0.1*ts, s.Colour, "halo")
			b.text(name, bestAt, fs, true, Middle, Ink, "curve-label")
			return
		}
	}
}
