package chart

import (
	"fmt"
	"math"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"
	"unicode/utf8"

	"setcard/calc"
)

var papers = []Paper{A4, Letter}

// TestPaperSize checks the paper sizes: A4 is 297 × 210 mm (ISO 216) and
// US Letter 11 × 8.5 in (279.4 × 215.9 mm), both landscape.
func TestPaperSize(t *testing.T) {
	cases := []struct {
		p    Paper
		w, h float64
		ok   bool
	}{{A4, 297, 210, true}, {Letter, 279.4, 215.9, true}, {"", 297, 210, true}, {"a3", 0, 0, false}}
	for _, c := range cases {
		w, h, ok := PaperSize(c.p)
		if w != c.w || h != c.h || ok != c.ok {
			t.Errorf("PaperSize(%q) = %g, %g, %v, want %g, %g, %v", c.p, w, h, ok, c.w, c.h, c.ok)
		}
	}
}

// TestCardFits lays out the cards of several projects, crowded, hostile
// and random ones among them, on both papers: every text stays on the
// page, none covers another, and every number is finite.
func TestCardFits(t *testing.T) {
	wide := func(s string, size float64, bold bool) float64 { return 1.1 * SansMeasure(s, size, bold) }
	for k, p := range append(fileProjects(t), randomProjects(t, 30)...) {
		for _, paper := range papers {
			o := CardOptions{Paper: paper}
			if k%2 == 1 {
				o.Measure = wide // a renderer's wider font
			}
			l := Card(p.m, o)
			w, h, _ := PaperSize(paper)
			if l.W != w || l.H != h || l.Unit != "mm" {
				t.Errorf("%s: card is %g × %g %s, want %g × %g mm", p.name, l.W, l.H, l.Unit, w, h)
			}
			what := fmt.Sprintf("%s on %s", p.name, paper)
			checkTexts(t, what, l)
			checkFinite(t, what, l)
			checkInstructions(t, what, l)
		}
	}
}

// checkInstructions fails when the instructions or the cautions were cut
// short: only text typed by a user may end in an ellipsis.
func checkInstructions(t *testing.T, what string, l *Layout) {
	t.Helper()
	var last string
	for _, it := range l.Texts() {
		switch it.Role {
		case "instr", "instr-head", "instr-label", "sets-note", "caution", "table-note", "row-note", "criterion-head":
			if strings.HasSuffix(it.Text, ellipsis) {
				t.Errorf("%s: %s text %q is cut short", what, it.Role, it.Text)
			}
			if it.Role == "instr" {
				last = it.Text
			}
		}
	}
	if !strings.HasSuffix(last, "pile.") {
		t.Errorf("%s: last instruction line = %q, want the end of the instructions", what, last)
	}
}

// TestCardTableSize checks that no text of the criterion table is
// smaller than 12 pt (4.23 mm).
func TestCardTableSize(t *testing.T) {
	roles := []string{"criterion-head", "col", "drop", "set10", "set1", "no-set", "row-note", "table-note"}
	for _, p := range append(fileProjects(t), randomProjects(t, 30)...) {
		for _, paper := range papers {
			for _, it := range Card(p.m, CardOptions{Paper: paper}).Texts() {
				if slices.Contains(roles, it.Role) && it.Size < MinTableMm-1e-9 {
					t.Errorf("%s on %s: %s text %q is %.2f mm, want at least %.2f mm (12 pt)", p.name, paper, it.Role, it.Text, it.Size, MinTableMm)
				}
			}
		}
	}
}

// TestCardCriterion checks the criterion table against the calculation
// core: one row per drop in the project's order; for a drop that can
// prove the load, the set in 10 blows and per blow of the governing length
// exactly as TableRows gives them (rounded down there); for one that
// cannot, words saying so.
func TestCardCriterion(t *testing.T) {
	for _, p := range append(fileProjects(t), randomProjects(t, 30)...) {
		l := Card(p.m, CardOptions{})
		var drops, set10, set1, noSet []string
		for _, it := range l.Texts() {
			switch it.Role {
			case "drop":
				drops = append(drops, strings.TrimSuffix(it.Text, " *"))
			case "set10":
				set10 = append(set10, it.Text)
			case "set1":
				set1 = append(set1, it.Text)
			case "no-set":
				noSet = append(noSet, it.Text)
			}
		}
		var wantDrops, want10, want1 []string
		unreachable := 0
		for _, r := range p.m.TableRows() {
			if !r.Governs {
				continue
			}
			wantDrops = append(wantDrops, num(r.DropM, 3)+" m")
			if r.Achievable {
				want10 = append(want10, strconv.FormatFloat(*r.SetMmPer10Blows, 'f', 1, 64)+" mm")
				want1 = append(want1, strconv.FormatFloat(*r.SetMmPerBlow, 'f', 2, 64)+" mm")
			} else {
				unreachable++
			}
		}
		if !slices.Equal(drops, wantDrops) {
			t.Errorf("%s: drops = %v, want %v", p.name, drops, wantDrops)
		}
		if !slices.Equal(set10, want10) {
			t.Errorf("%s: sets in 10 blows = %v, want %v", p.name, set10, want10)
		}
		if !slices.Equal(set1, want1) {
			t.Errorf("%s: sets per blow = %v, want %v", p.name, set1, want1)
		}
		if len(noSet) != unreachable {
			t.Errorf("%s: rows saying the load cannot be proven = %d, want %d", p.name, len(noSet), unreachable)
		}
	}
}

// TestCardFlags checks the crowded card: its drops that cannot prove the
// load say so in their rows, and its drops above the impact-stress limit
// are marked and explained.
func TestCardFlags(t *testing.T) {
	m := load(t, "cards/crowded.json")
	l := Card(m, CardOptions{})
	var marked []string
	var text strings.Builder
	for _, it := range l.Texts() {
		if it.Role == "drop" && strings.HasSuffix(it.Text, " *") {
			marked = append(marked, strings.TrimSuffix(it.Text, " *"))
		}
		if it.Role == "table-note" || it.Role == "row-note" {
			text.WriteString(it.Text + " ")
		}
	}
	var over []string
	for _, r := range m.TableRows() {
		if r.Governs && r.Overstressed {
			over = append(over, num(r.DropM, 3)+" m")
		}
	}
	if len(over) == 0 {
		t.Fatal("the crowded project has no overstressed drop: the test checks nothing")
	}
	notes := text.String()
	if len(marked) > 0 {
		if !slices.Equal(marked, over) {
			t.Errorf("marked drops = %v, want the overstressed %v", marked, over)
		}
		if !strings.Contains(notes, "Impact stress above the limit") {
			t.Errorf("notes %q do not explain the mark", notes)
		}
	} else if strings.Count(notes, "mpact stress") < len(over) {
		t.Errorf("notes %q do not flag the %d overstressed drops", notes, len(over))
	}
}

// TestCardCautions checks that every card carries the three cautions, the
// instructions for measuring the set, and what to do when it is not
// reached or reached early.
func TestCardCautions(t *testing.T) {
	for _, p := range fileProjects(t) {
		for _, paper := range papers {
			var all strings.Builder
			for _, it := range Card(p.m, CardOptions{Paper: paper}).Texts() {
				all.WriteString(it.Text + " ")
			}
			s := all.String()
			for _, want := range []string{
				"aid to judgement", "confirmed as local codes require", "licensed engineer approves",
				"Mark the pile", "10 blows", "two sets agree", "Stop and call the engineer",
				"not reached", "suspiciously early", "broken toe", "obstruction",
				"Prepared by", "Checked by", "Approved by",
			} {
				if !strings.Contains(s, want) {
					t.Errorf("%s on %s: the card does not say %q", p.name, paper, want)
				}
			}
		}
	}
}

// TestCardHostileText checks that long and hostile user text stays in its
// box: the project name left of the reference boxes and above the body,
// each signature name in its own cell, everything cut with an ellipsis
// rather than spilt.
func TestCardHostileText(t *testing.T) {
	m := load(t, "cards/hostile.json")
	long := strings.Repeat("Very long project name with words ", 15) // 525 characters
	word := strings.Repeat("W", 500)
	rtl := strings.Repeat("שלום עולם مرحبا بالعالم ", 20)
	for _, name := range []string{m.Name, long, word, rtl, "\u202e" + long} {
		m.Name = name
		m.Card.Notes = word + " " + long
		m.Card.PreparedBy, m.Card.CheckedBy, m.Card.ApprovedBy = word, rtl, long
		m.Card.Reference, m.Card.Date, m.Card.Revision = word, long, rtl
		for _, paper := range papers {
			l := Card(m, CardOptions{Paper: paper})
			what := fmt.Sprintf("name of %d characters on %s", utf8.RuneCountInString(name), paper)
			checkTexts(t, what, l)
			checkFinite(t, what, l)
			var metaX, bodyY = l.W, l.H
			var signX []float64
			for _, it := range l.Texts() {
				switch it.Role {
				case "meta-label":
					metaX = math.Min(metaX, it.Box.X)
				case "criterion-head":
					bodyY = math.Min(bodyY, it.Box.Y)
				case "sign-label":
					signX = append(signX, it.Box.X)
				}
			}
			signX = append(signX, l.W-cardMargin)
			cut := false
			for _, it := range l.Texts() {
				switch it.Role {
				case "project":
					if it.Box.X+it.Box.W > metaX || it.Box.Y+it.Box.H > bodyY {
						t.Errorf("%s: project line %q box %+v leaves its box (right %g, bottom %g)", what, it.Text, it.Box, metaX, bodyY)
					}
					cut = cut || strings.HasSuffix(it.Text, ellipsis)
				case "sign-name":
					i := 0
					for i+1 < len(signX) && signX[i+1] <= it.Box.X {
						i++
					}
					if it.Box.X+it.Box.W > signX[i+1] {
						t.Errorf("%s: signature name %q box %+v runs into the next cell at %g", what, it.Text, it.Box, signX[i+1])
					}
				}
			}
			if utf8.RuneCountInString(name) > 300 && !cut {
				t.Errorf("%s: the name is not cut short with an ellipsis", what)
			}
		}
	}
}

// TestCardSignatures checks the signature boxes: names from the project
// when given, empty boxes to sign otherwise.
func TestCardSignatures(t *testing.T) {
	m := load(t, "demo.json")
	var names []string
	labels := 0
	for _, it := range Card(m, CardOptions{}).Texts() {
		switch it.Role {
		case "sign-name":
			names = append(names, it.Text)
		case "sign-label":
			labels++
		}
	}
	if labels != 3 || !slices.Equal(names, []string{m.Card.PreparedBy}) {
		t.Errorf("signature labels = %d, names = %q, want 3 and [%q] (the demo is prepared, not checked or approved)", labels, names, m.Card.PreparedBy)
	}
}

// TestCardPlot checks that the card exposes the chart's plot, in page
// units, inside the page.
func TestCardPlot(t *testing.T) {
	l := Card(load(t, "demo.json"), CardOptions{Paper: Letter})
	if l.Plot == nil {
		t.Fatal("card has no plot")
	}
	if !l.Plot.Frame.Inside(Rect{0, 0, l.W, l.H}, 0) || l.Plot.Frame.W < 100 {
		t.Errorf("card plot frame %+v, want a frame at least 100 mm wide on the page", l.Plot.Frame)
	}
}

// TestCardWorstCase crowds the table as much as a project can: twelve
// drops, some that cannot reach the load, one whose set would be in the
// refusal band, every one above the impact-stress limit, the head stress
// at the design load above the limit too, a range of lengths, and the
// longest texts allowed. The card must still fit, whole, on both papers.
func TestCardWorstCase(t *testing.T) {
	data, err := os.ReadFile(filepath.Join(root, "cards", "crowded.json"))
	if err != nil {
		t.Fatal(err)
	}
	p, err := calc.DecodeBytes(data)
	if err != nil {
		t.Fatal(err)
	}
	p.Pile.StrengthMPa = calc.F(10) // limit 8.5 MPa, below the head stress of 10 MPa
	p.Name = strings.Repeat("Worst case name ", 13)[:calc.LimitNameRunes]
	p.Card.Notes = strings.Repeat("Long note. ", 46)[:calc.LimitTextRunes]
	m, err := calc.Resolve(p)
	if err != nil {
		t.Fatal(err)
	}
	kinds := map[string]bool{}
	for _, r := range m.TableRows() {
		if !r.Governs {
			continue
		}
		kinds["overstressed"] = kinds["overstressed"] || r.Overstressed
		kinds["no set"] = kinds["no set"] || r.SetMmPer10Blows == nil
		kinds["below refusal"] = kinds["below refusal"] || r.SetMmPer10Blows != nil && !r.Achievable
		kinds["head stress"] = kinds["head stress"] || r.HeadStressMPa > r.LimitMPa
	}
	if len(kinds) != 4 || len(m.DropsM) != calc.LimitDrops {
		t.Fatalf("worst case has %v and %d drops, want all four kinds of flag and %d drops", kinds, len(m.DropsM), calc.LimitDrops)
	}
	wide := func(s string, size float64, bold bool) float64 { return 1.1 * SansMeasure(s, size, bold) }
	for k, o := range []CardOptions{{Paper: A4}, {Paper: Letter}, {Paper: A4, Measure: wide}, {Paper: Letter, Measure: wide}} {
		l := Card(m, o)
		what := fmt.Sprintf("worst case on %s, measure %d", o.Paper, k/2)
		checkTexts(t, what, l)
		checkFinite(t, what, l)
		checkInstructions(t, what, l)
		rows := 0
		var basis strings.Builder
		for _, it := range l.Texts() {
			if it.Role == "drop" {
				rows++
			}
			if it.Role == "basis" {
				basis.WriteString(it.Text + " ")
			}
		}
		if rows != len(m.DropsM) {
			t.Errorf("%s: %d rows, want %d", what, rows, len(m.DropsM))
		}
		if !strings.Contains(basis.String(), "head stress at the design load") {
			t.Errorf("%s: the basis does not flag the head stress: %q", what, basis.String())
		}
	}
}
