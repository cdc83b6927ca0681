package chart

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"setcard/calc"
)

// Paper is the size of the printed card.
type Paper string

// The papers of the card, both landscape.
const (
	A4     Paper = "a4"     // 297 × 210 mm
	Letter Paper = "letter" // 11 × 8.5 in, 279.4 × 215.9 mm
)

// PaperSize is the width and height in mm of a paper, landscape; ok is
// false for a paper that is not known.
func PaperSize(p Paper) (wMm, hMm float64, ok bool) {
	switch p {
	case A4, "":
		return 297, 210, true
	case Letter:
		return 279.4, 215.9, true
	}
	return 0, 0, false
}

// CardOptions shape Card. The zero value is an A4 card.
type CardOptions struct {
	// Paper is the page (default A4; an unknown paper is A4 too: check it
	// with PaperSize first).
	Paper Paper
	// Ultimate puts the ultimate resistance on the chart's x axis. The
	// model's ChartUltimate does the same.
	Ultimate bool
	// Measure is the width of text (default SansMeasure).
	Measure Measure
}

// Sizes on the card, in mm. MinTableMm is 12 pt: no text of the criterion
// table is smaller.
const (
	MinTableMm  = 12 * 25.4 / 72
	minInstrMm  = 2.5
	lastInstrMm = 2.1
	cardMargin  = 8.0
	chartTextMm = 2.9
)

// Card lays out the one-page site card of a model, in mm, on A4 or US
// Letter landscape: a title block (what the card assumes, and boxes for
// who prepared, checked and approved it), the chart, the criterion table
// for each drop in print no smaller than 12 pt, how to measure the set and
// when to stop and call the engineer, and the cautions.
//
// Everything is fitted to the page: text is wrapped and made smaller down
// to a floor, and what still does not fit (only ever long text typed by a
// user) is cut short with an ellipsis inside its box. The model must come
// from calc.Resolve.
func Card(m *calc.Model, o CardOptions) *Layout {
	if o.Measure == nil {
		o.Measure = SansMeasure
	}
	w, h, ok := PaperSize(o.Paper)
	if !ok {
		w, h, _ = PaperSize(A4)
	}
	b := &builder{measure: o.Measure}
	page := Rect{0, 0, w, h}
	b.rect(page, White, 0, White, "background")
	c := Rect{cardMargin, cardMargin, w - 2*cardMargin, h - 2*cardMargin}
	drops := governing(m, 0)

	// Header: what the card is, the project, and its reference boxes.
	const headH = 14.0
	metaW := math.Min(100, 0.36*c.W)
	header(b, m, Rect{c.X, c.Y, c.W - metaW - 3, headH})
	metaBoxes(b, m, Rect{c.X + c.W - metaW, c.Y, metaW, headH})

	// Body: the criterion and how to use it on the left, the full height
	// of the page; the chart, the basis of the card with its signatures,
	// and the cautions on the right.
	body := Rect{c.X, c.Y + headH + 3, c.W, c.H - headH - 3}
	lw := math.Round(0.41*c.W*10) / 10
	left := Rect{body.X, body.Y, lw, body.H}
	right := Rect{body.X + lw + 4, body.Y, body.W - lw - 4, body.H}

	// The criterion table takes what it needs of the left column, leaving
	// the instructions room to be printed at 3.4 mm if it can, at 3 mm,
	// or at least at the smallest size.
	ips := instructions(m, drops)
	var keeps []float64
	for _, s := range []float64{3.4, 3.0, minInstrMm} {
		_, _, need, _ := b.flow(ips, left.W, s)
		keeps = append(keeps, need+3)
	}
	used := criterion(b, m, drops, left, keeps)
	instr := Rect{left.X, left.Y + used + 3, left.W, left.H - used - 3}
	if _, _, h, _ := b.flow(ips, instr.W, minInstrMm); h > instr.H {
		// A crowded table: smaller print rather than lose a line.
		b.textBlock(ips, instr, minInstrMm, lastInstrMm, Ink)
	} else {
		b.textBlock(ips, instr, 4.4, minInstrMm, Ink)
	}

	const cautionH = 17.0
	const basisH = 50.0
	cautions(b, Rect{right.X, right.Y + right.H - cautionH, right.W, cautionH})
	chartR := Rect{right.X, right.Y, right.W, right.H - cautionH - 3 - basisH - 3}
	cardChart(b, m, o, drops, chartR)
	basis(b, m, Rect{right.X, chartR.Y + chartR.H + 3, right.W, basisH})

	l := &Layout{W: w, H: h, Unit: "mm", Title: Clean(m.Name), Items: b.items}
	l.Plot = b.plot
	return l
}

// header writes the kind of document and the project name.
func header(b *builder, m *calc.Model, r Rect) {
	b.text("SITE CARD · SET CRITERION FOR DRIVEN PILES", Point{r.X, r.Y + Ascent*3.4}, 3.4, true, Start, Ink, "kind")
	name := Clean(m.Name)
	if name == "" {
		name = "(project not named)"
	}
	nr := Rect{r.X, r.Y + 4.6, r.W, r.H - 4.6}
	b.textBlock([]para{{text: name, scale: 1, bold: true, role: "project"}}, nr, 6.5, 3.6, Ink)
}

// metaBoxes are the reference, revision, date and sheet of the card.
func metaBoxes(b *builder, m *calc.Model, r Rect) {
	fields := []struct {
		label, value string
		share        float64
	}{
		{"Reference", m.Card.Reference, 0.34},
		{"Revision", m.Card.Revision, 0.16},
		{"Date", m.Card.Date, 0.32},
		{"Sheet", "1 of 1", 0.18},
	}
	x := r.X
	for _, f := range fields {
		cw := r.W * f.share
		cell := Rect{x, r.Y, cw, r.H}
		b.frame(cell, 0.25, Ink)
		b.text(f.label, Point{x + 1.2, r.Y + 1 + Ascent*2.5}, 2.5, false, Start, Grey, "meta-label")
		v := Clean(f.value)
		if v != "" {
			vr := Rect{x + 1.2, r.Y + 4.6, cw - 2.4, r.H - 5.4}
			b.textBlock([]para{{text: v, scale: 1, bold: true, role: "meta"}}, vr, 4.2, 2.4, Ink)
		}
		x += cw
	}
}

// cautions are the warnings every card carries.
func cautions(b *builder, r Rect) {
	b.rect(r, White, 0.6, Ink, "caution-box")
	text := "The Hiley formula is an aid to judgement, not a measurement of capacity; it is least reliable at small sets and in soft clays. " +
		"Pile capacities must be confirmed as local codes require (for example by load tests). " +
		"A licensed engineer approves this set criterion: use the card only when it is signed as approved, with the hammer, drop and cap it states."
	b.textBlock([]para{{text: text, scale: 1, label: "CAUTION", role: "caution"}}, r.inset(1.6), 3.6, 2.6, Ink)
}

// row is one drop of the criterion table, ready to print.
type row struct {
	drop      string
	set10     string // "" when no set can be printed
	set1      string
	noSet     []string // what the set cells say instead, longest first
	notes     [3]string
	style     int
	flagged   bool // a warning marks the row
	governing float64
}

// criterion lays out the table of sets per drop at the top of the box r,
// leaving below it the first of keeps (in mm) that it can, and returns the
// height it used.
func criterion(b *builder, m *calc.Model, drops []dropData, r Rect, keeps []float64) float64 {
	f := m.DesignFactor()
	rows := make([]row, len(drops))
	var overs []string
	var noReach, inRefusal bool
	for i, d := range drops {
		q := d.req
		t := q.Row()
		rw := row{drop: num(q.DropM, 3) + " m", style: i, governing: q.LengthM}
		switch {
		case q.Achievable:
			// The core's rounded figures, printed as they are.
			rw.set10 = strconv.FormatFloat(*t.SetMmPer10Blows, 'f', 1, 64) + " mm"
			rw.set1 = strconv.FormatFloat(*t.SetMmPerBlow, 'f', 2, 64) + " mm"
		case !q.HasSet:
			rw.noSet = []string{"cannot reach the load", "cannot reach load"}
			full := fmt.Sprintf("At %s m this ram proves at most %s kN design (%s kN ultimate) even at refusal; %s kN ultimate is needed. Use a higher drop or a heavier ram.",
				num(q.DropM, 3), num(q.RefusalKN*f, 0), num(q.RefusalKN, 0), num(q.UltimateKN, 0))
			rw.notes = [3]string{full, "Even at refusal this drop proves less than the load: use a higher drop.", ""}
			noReach = true
		default:
			rw.noSet = []string{"set would be below refusal", "below refusal"}
			full := fmt.Sprintf("It would need %s mm per 10 blows, less than the %s mm per 10 blows taken as refusal: the load cannot be proven at this drop. Use a higher drop.",
				FormatSet10(q.SetMm10), FormatSet10(10*m.MinSetMm))
			rw.notes = [3]string{full, "The set needed is in the refusal band: use a higher drop.", ""}
			inRefusal = true
		}
		if q.Overstressed {
			rw.flagged = true
			full := fmt.Sprintf("Impact stress %s MPa at this drop (an upper bound, without the cushion) is above the %s MPa limit for the pile head: risk of damage. Use a lower drop or a heavier ram, or ask the engineer.",
				num(q.ImpactStressMPa, 1), num(q.LimitMPa, 1))
			short := "Impact stress above the limit for the pile head: use a lower drop."
			rw.notes[0] = strings.TrimSpace(rw.notes[0] + " " + full)
			rw.notes[1] = strings.TrimSpace(rw.notes[1] + " " + short)
			overs = append(overs, num(q.DropM, 3))
		}
		rows[i] = rw
	}
	// (The head stress at the design load does not depend on the drop: it
	// is for the engineer, and the basis of the card says it.)
	// With the notes grouped, the rows that cannot prove the load say so
	// themselves, a note says why, and the rows flagged for impact stress
	// carry a mark.
	grouped := []string{}
	if noReach {
		grouped = append(grouped, "Cannot reach the load: even at refusal that drop proves less than the load. Use a higher drop.")
	}
	if inRefusal {
		grouped = append(grouped, "Set would be below refusal: the set needed is less than "+FormatSet10(10*m.MinSetMm)+" mm in 10 blows. Use a higher drop.")
	}
	if len(overs) > 0 {
		grouped = append(grouped, "* Impact stress above the limit for the pile head: use a lower drop.")
	}

	// For each space to keep below, from the most generous: try the full
	// notes, then short ones, then notes grouped under the table, each
	// from a large size down to 12 pt.
	for _, keep := range keeps {
		for level := 0; level < 3; level++ {
			for size := 6.0; ; size = math.Max(MinTableMm, size*0.96) {
				t := tableLayout{rows: rows, level: level, grouped: grouped, size: size}
				if h, ok := t.height(b, r.W); ok && h <= r.H-keep {
					return t.draw(b, r)
				}
				if size <= MinTableMm {
					break
				}
			}
		}
	}
	// Nothing fits: draw at the floor, cut to the box.
	t := tableLayout{rows: rows, level: 2, grouped: grouped, size: MinTableMm}
	return t.draw(b, r)
}

// tableLayout is the criterion table at one size and level of detail.
type tableLayout struct {
	rows    []row
	level   int // 0 full notes, 1 short notes, 2 notes grouped below
	grouped []string
	size    float64
}

func (t *tableLayout) sizes() (head, drop, set10, set1, note float64) {
	s := t.size
	return math.Max(MinTableMm, 0.8*s), s, 1.2 * s, math.Max(MinTableMm, 0.82*s), math.Max(MinTableMm, 0.75*s)
}

// columns are the widths of the columns: line sample, drop, set per 10
// blows, set per blow.
func (t *tableLayout) columns(b *builder) (sample, drop, set10, set1 float64) {
	_, ds, s10, s1, _ := t.sizes()
	sample = 2.2 * t.size
	drop = b.measure("Drop", ds, true)
	for _, r := range t.rows {
		drop = math.Max(drop, b.measure(r.drop+" *", ds, true))
		set10 = math.Max(set10, b.measure(r.set10, s10, true))
		set1 = math.Max(set1, b.measure(r.set1, s1, false))
	}
	set10 = math.Max(set10, b.measure("000.0 mm", s10, true))
	set1 = math.Max(set1, b.measure("00.00 mm", s1, false))
	return sample, drop + 0.6*t.size, set10 + 0.8*t.size, set1
}

func (t *tableLayout) notesFor(r row) string {
	if t.level < 2 {
		return r.notes[t.level]
	}
	return ""
}

// height is the height of the table in width w; ok is false when its
// columns do not fit the width.
func (t *tableLayout) height(b *builder, w float64) (float64, bool) {
	hs, _, _, _, ns := t.sizes()
	c0, c1, c2, c3 := t.columns(b)
	if c0+c1+c2+c3 > w-2 {
		return 0, false
	}
	h := 1.5 // padding
	h += float64(len(b.wrap(headText, w-2, hs, true))) * lineGap * hs
	h += lineGap*hs + 1 // column heads
	for _, r := range t.rows {
		h += t.rowHeight(r)
		if r.set10 == "" && b.measure(r.noSet[len(r.noSet)-1], ns, true) > c2+c3 {
			return 0, false
		}
		if n := t.notesFor(r); n != "" {
			h += float64(len(b.wrap(n, w-2-c0, ns, false)))*lineGap*ns + 0.6
		}
	}
	h += 1
	for _, g := range t.foot() {
		h += float64(len(b.wrap(g, w-2, ns, false))) * lineGap * ns
	}
	return h + 1.5, true
}

// rowHeight is the height of a row without its notes.
func (t *tableLayout) rowHeight(r row) float64 {
	_, ds, s10, _, ns := t.sizes()
	if r.set10 == "" {
		return 1.3 * max(ds, ns)
	}
	return 1.25 * s10
}

func (t *tableLayout) foot() []string {
	if t.level == 2 {
		return t.grouped
	}
	return nil
}

const headText = "Stop driving when the last 10 blows drive the pile no more than:"

// draw lays the table out at the top of r and returns its height.
func (t *tableLayout) draw(b *builder, r Rect) float64 {
	hs, ds, s10, s1, ns := t.sizes()
	c0, c1, c2, _ := t.columns(b)
	in := Rect{r.X + 1, r.Y, r.W - 2, r.H}
	y := r.Y + 1.5
	for _, line := range b.wrap(headText, in.W, hs, true) {
		b.text(line, Point{in.X, y + (0.1+Ascent)*hs}, hs, true, Start, Ink, "criterion-head")
		y += lineGap * hs
	}
	// Column heads.
	x1, x2, x3 := in.X+c0, in.X+c0+c1, in.X+c0+c1+c2
	base := y + (0.1+Ascent)*hs
	b.text("Drop", Point{x1, base}, hs, false, Start, Grey, "col")
	b.text("in 10 blows", Point{x2, base}, hs, false, Start, Grey, "col")
	b.text("per blow", Point{x3, base}, hs, false, Start, Grey, "col")
	y += lineGap*hs + 1
	b.line(Point{r.X, y - 0.5}, Point{r.X + r.W, y - 0.5}, 0.3, Ink, nil)
	for i, rw := range t.rows {
		rh := t.rowHeight(rw)
		note := t.notesFor(rw)
		var lines []string
		if note != "" {
			lines = b.wrap(note, in.W-c0, ns, false)
		}
		full := rh
		if len(lines) > 0 {
			full += float64(len(lines))*lineGap*ns + 0.6
		}
		if y+full > r.Y+r.H-1.5 {
			break
		}
		if i%2 == 1 {
			b.rect(Rect{r.X + 0.3, y, r.W - 0.6, full}, TintLight, 0, White, "stripe")
		}
		mid := y + rh/2
		col, dash := CurveStyle(rw.style, chartTextMm)
		b.line(Point{in.X + 0.3, mid}, Point{in.X + c0 - 0.3*t.size, mid}, 0.16*chartTextMm, col, dash)
		drop := rw.drop
		if rw.flagged && t.level == 2 {
			drop += " *"
		}
		b.text(drop, Point{x1, mid + (Ascent-Descent)/2*ds}, ds, true, Start, Ink, "drop")
		if rw.set10 != "" {
			b.text(rw.set10, Point{x2, mid + (Ascent-Descent)/2*s10}, s10, true, Start, Ink, "set10")
			b.text(rw.set1, Point{x3, mid + (Ascent-Descent)/2*s1}, s1, false, Start, Ink, "set1")
		} else {
			for _, s := range rw.noSet {
				if b.measure(s, ns, true) <= in.X+in.W-x2 {
					b.text(s, Point{x2, mid + (Ascent-Descent)/2*ns}, ns, true, Start, Ink, "no-set")
					break
				}
			}
		}
		y += rh
		for _, line := range lines {
			b.text(line, Point{in.X + c0, y + (0.1+Ascent)*ns}, ns, false, Start, Ink, "row-note")
			y += lineGap * ns
		}
		if len(lines) > 0 {
			y += 0.6
		}
	}
	var ps []para
	for _, g := range t.foot() {
		ps = append(ps, para{text: g, scale: 1, role: "table-note"})
	}
	y += 1
	if len(ps) > 0 {
		b.line(Point{r.X, y - 0.5}, Point{r.X + r.W, y - 0.5}, 0.3, Ink, nil)
		_, used := b.textBlock(ps, Rect{in.X, y, in.W, r.Y + r.H - y - 1.5}, ns, ns, Ink)
		y += used
	}
	y += 1.5
	b.frame(Rect{r.X, r.Y, r.W, y - r.Y}, 0.7, Ink)
	return y - r.Y
}

// instructions say what the sets hold for, how to measure the set and
// when to stop.
func instructions(m *calc.Model, drops []dropData) []para {
	var ps []para
	lengths := ""
	if len(m.LengthsM) > 1 && len(drops) > 0 {
		same := true
		for _, d := range drops {
			same = same && d.req.LengthM == drops[0].req.LengthM
		}
		span := num(m.LengthsM[0], 2) + " to " + num(m.LongestM(), 2) + " m"
		if same {
			lengths = fmt.Sprintf("The sets hold for piles %s long: each is for the %s m length, which needs the smallest set. ", span, num(drops[0].req.LengthM, 2))
		} else {
			lengths = fmt.Sprintf("The sets hold for piles %s long: each is for the length needing the smallest set at its drop. ", span)
		}
	}
	ps = append(ps, para{text: lengths + "Sets are rounded down.", scale: 1, bold: true, role: "sets-note"})
	refusalWords := "the pile stops going down (refusal)"
	if m.MinSetMm > 0 {
		refusalWords = "the set falls below " + FormatSet10(10*m.MinSetMm) + " mm in 10 blows (refusal)"
	}
	ps = append(ps,
		para{text: "How to measure the set", scale: 1.15, bold: true, role: "instr-head", space: 0.5},
		para{text: "Mark the pile against a fixed reference clear of it (a straight edge on stakes, or a level).", scale: 1, label: "1", role: "instr", space: 0.15},
		para{text: "Drive 10 blows at one drop from the table, the ram falling freely.", scale: 1, label: "2", role: "instr"},
		para{text: "Measure how far the mark went down: that is the set in 10 blows.", scale: 1, label: "3", role: "instr"},
		para{text: "Repeat until two sets agree; compare with the table for that drop.", scale: 1, label: "4", role: "instr"},
		para{text: "Hammer, drop, helmet, dolly and packing must be as on this card.", scale: 1, label: "5", role: "instr"},
		para{text: "Stop and call the engineer when", scale: 1.15, bold: true, role: "instr-head", space: 0.5},
		para{text: "the set is not reached at the planned toe level or the full pile length;", scale: 1, label: "•", role: "instr", space: 0.15},
		para{text: "the set is reached suspiciously early, or the resistance rises suddenly: possible broken toe or an obstruction;", scale: 1, label: "•", role: "instr"},
		para{text: refusalWords + ", the head splits or brooms, or the pile drifts off line.", scale: 1, label: "•", role: "instr"},
		para{text: "Record the toe level and the final set of every pile.", scale: 1, role: "instr", space: 0.3},
	)
	return ps
}

// cardChart lays the chart into r.
func cardChart(b *builder, m *calc.Model, o CardOptions, drops []dropData, r Rect) {
	cb := &builder{measure: b.measure}
	p := chartInto(cb, m, ChartOptions{W: r.W, H: r.H, Unit: "mm", TextSize: chartTextMm, Ultimate: o.Ultimate, Measure: o.Measure}, drops)
	l := &Layout{Items: cb.items, Plot: p}
	l.translate(r.X, r.Y)
	b.items = append(b.items, l.Items...)
	for _, bx := range cb.boxes {
		bx.X += r.X
		bx.Y += r.Y
		b.boxes = append(b.boxes, bx)
	}
	b.plot = p
	b.frame(r, 0.25, Ink)
}

// basis is the title block: what the card assumes, and who prepared,
// checked and approved it.
func basis(b *builder, m *calc.Model, r Rect) {
	const sigH = 15.0
	info := Rect{r.X, r.Y, r.W, r.H - sigH}
	b.frame(r, 0.25, Ink)
	ps := []para{{text: "Basis of this card", scale: 1.15, bold: true, role: "basis-head"}}
	for _, f := range basisFields(m) {
		p := para{text: f[1], scale: 1, label: f[0], role: "basis"}
		if f[0] == "Notes" {
			p.maxLines = 2
		}
		ps = append(ps, p)
	}
	b.textBlock(ps, info.inset(1.2), 3.0, 2.1, Ink)

	// Signature boxes.
	sy := r.Y + r.H - sigH
	b.line(Point{r.X, sy}, Point{r.X + r.W, sy}, 0.25, Ink, nil)
	who := []struct{ label, name string }{
		{"Prepared by", m.Card.PreparedBy},
		{"Checked by", m.Card.CheckedBy},
		{"Approved by (licensed engineer)", m.Card.ApprovedBy},
	}
	cw := r.W / 3
	for i, wv := range who {
		x := r.X + float64(i)*cw
		if i > 0 {
			b.line(Point{x, sy}, Point{x, r.Y + r.H}, 0.25, Ink, nil)
		}
		cell := Rect{x + 1.2, sy + 0.8, cw - 2.4, sigH - 1.6}
		lb := b.truncate(wv.label, cell.W, 2.5, false)
		b.text(lb, Point{cell.X, cell.Y + Ascent*2.5}, 2.5, false, Start, Grey, "sign-label")
		if n := Clean(wv.name); n != "" {
			b.textBlock([]para{{text: n, scale: 1, bold: true, role: "sign-name"}}, Rect{cell.X, cell.Y + 3.4, cell.W, 4.2}, 3.2, 2.4, Ink)
		}
		b.text("signature and date", Point{cell.X, cell.Y + cell.H - Descent*2.2}, 2.2, false, Start, Grey, "sign-line")
	}
}

// basisFields are the label and value of each line of the title block.
func basisFields(m *calc.Model) [][2]string {
	var pile []string
	pile = append(pile, m.Material.ID)
	switch m.Section {
	case calc.Round:
		pile = append(pile, num(m.SizeMm, 1)+" mm diameter")
	case calc.Square:
		pile = append(pile, num(m.SizeMm, 1)+" mm square")
	default:
		pile = append(pile, "section area "+num(m.AreaMm2, 0)+" mm²")
	}
	if len(m.LengthsM) > 1 {
		ls := make([]string, len(m.LengthsM))
		for i, l := range m.LengthsM {
			ls[i] = num(l, 2)
		}
		s := num(m.LengthsM[0], 2) + " to " + num(m.LongestM(), 2) + " m long"
		if len(ls) > 2 && len(ls) <= 8 {
			s += " (" + strings.Join(ls, ", ") + " m)"
		}
		pile = append(pile, s)
	} else {
		pile = append(pile, num(m.LengthsM[0], 2)+" m long")
	}
	pile = append(pile, "E "+num(m.ModulusMPa, 0)+" MPa")
	if m.GivenMassKg > 0 {
		pile = append(pile, "mass "+num(m.GivenMassKg, 0)+" kg")
	} else {
		pile = append(pile, num(m.DensityKgM3, 0)+" kg/m³")
	}
	if m.MassFraction != 1 {
		pile = append(pile, num(m.MassFraction, 2)+" of its weight counted in the efficiency of blow")
	}

	drops := make([]string, len(m.DropsM))
	for i, d := range m.DropsM {
		drops[i] = num(d, 3)
	}
	hammer := fmt.Sprintf("ram %s\u00a0kg; %s; efficiency %s; drops %s\u00a0m", num(m.RamKg, 0), m.HammerType.Label, num(m.Efficiency, 3), strings.Join(drops, ", "))

	var capRows []string
	for _, c := range m.Cap {
		capRows = append(capRows, c.Label)
	}
	capText := "none listed"
	if len(capRows) > 0 {
		capText = strings.Join(capRows, " + ")
	}
	if m.Method == calc.Given {
		capText = "not used (compressions given)"
	}
	if m.DrivenPartsKg > 0 {
		capText += "; helmet, dolly and packing " + num(m.DrivenPartsKg, 0) + " kg"
	}

	var comp string
	switch m.Method {
	case calc.Interpolated:
		comp = "interpolated: cap Cc from the table by head stress R/A, pile Cp = R·L/(A·E), quake Cq " + num(m.CqMm, 2) + " mm"
	case calc.Banded:
		comp = "banded (hand method): cap Cc from the table column of the head stress, pile Cp = R·L/(A·E), quake Cq " + num(m.CqMm, 2) + " mm"
	default:
		comp = "given: cap Cc " + num(m.CcMm, 2) + " mm, pile Cp " + num(m.CpMm, 2) + " mm, quake Cq " + num(m.CqMm, 2) + " mm"
	}
	design := fmt.Sprintf("design load %s kN; %s; ultimate needed %s kN", num(m.LoadKN, 1), m.Convention(), num(m.RequiredUltimateKN(), 1))
	refusal := fmt.Sprintf("sets below %s mm per blow (%s mm in 10 blows) are refusal", num(m.MinSetMm, 2), FormatSet10(10*m.MinSetMm))
	if m.MinSetMm == 0 {
		refusal = "no minimum practical set given: refusal is a set of 0"
	}
	refusal += fmt.Sprintf("; zones by head stress R/A: easy below %s MPa, hard from %s MPa", num(m.EasyBelowMPa, 2), num(m.HardFromMPa, 2))
	var out [][2]string
	if q, err := m.Require(m.DropsM[0], m.LongestM()); err == nil && q.HeadStressMPa > q.LimitMPa {
		// First, so that it is never the line cut for want of room.
		out = append(out, [2]string{"Check", fmt.Sprintf("the head stress at the design load, %s MPa, is above the %s MPa driving limit of the pile: the engineer must review the pile before this card is used",
			num(q.HeadStressMPa, 1), num(q.LimitMPa, 1))})
	}
	out = append(out, [][2]string{
		{"Pile", strings.Join(pile, ", ")},
		{"Hammer", hammer},
		{"Cap", capText},
		{"Restitution", "coefficient of restitution e = " + num(m.Restitution, 3)},
		{"Compression", comp},
		{"Design", design},
		{"Refusal", refusal},
	}...)
	if n := Clean(m.Card.Notes); n != "" {
		out = append(out, [2]string{"Notes", n})
	}
	return out
}
