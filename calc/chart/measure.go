package chart

import "unicode"

// Measure returns the advance width of s, one line of text, at a font size,
// in the same units as the size. A renderer that draws with a real font
// passes that font's measure, so that the layout keeps text in its boxes.
type Measure func(s string, size float64, bold bool) float64

// SansMeasure is the default Measure: an approximate advance-width table
// for a generic sans-serif face. The widths of printable ASCII, in
// thousandths of an em, are the larger of DejaVu Sans and Liberation Sans
// (measured from the fonts' horizontal metrics); DejaVu Sans, the default
// sans-serif of many Linux systems, is the wider of the two and wider than
// Arial and Helvetica, so the layout errs on the wide side wherever the
// SVG is shown. Other characters take 0.75 em (1 em when East Asian wide,
// nothing for combining marks), again erring wide.
func SansMeasure(s string, size float64, bold bool) float64 {
	tab := &regularWidths
	if bold {
		tab = &boldWidths
	}
	w := 0
	for _, r := range s {
		switch {
		case r >= 32 && r < 127:
			w += int(tab[r-32])
		case unicode.In(r, unicode.Mn, unicode.Me, unicode.Cf):
		case wide(r):
			w += 1000
		default:
			v, ok := otherWidths[r]
			if !ok {
				v = 750
			}
			if bold {
				v = v * 11 / 10
			}
			w += v
		}
	}
	return float64(w) / 1000 * size
}

// wide reports East Asian wide characters: CJK, kana, Hangul, full-width
// forms.
func wide(r rune) bool {
	return r >= 0x1100 && r <= 0x115F || r >= 0x2E80 && r <= 0xA4CF || r >= 0xAC00 && r <= 0xD7A3 ||
		r >= 0xF900 && r <= 0xFAFF || r >= 0xFE30 && r <= 0xFE4F || r >= 0xFF00 && r <= 0xFF60 ||
		r >= 0xFFE0 && r <= 0xFFE6 || r >= 0x20000 && r <= 0x3FFFD
}

// regularWidths and boldWidths are the advance widths of the characters
// from ' ' (32) to '~' (126), in thousandths of an em.
var regularWidths = [95]uint16{
	318, 401, 460, 838, 636, 950, 780, 275, 390, 390, 500, 838, 318, 361, 318, 337, // space to /
	636, 636, 636, 636, 636, 636, 636, 636, 636, 636, 337, 337, 838, 838, 838, 556, // 0 to ?
	1015, 684, 686, 722, 770, 667, 611, 778, 752, 295, 500, 667, 557, 863, 748, 787, // @ to O
	667, 787, 722, 667, 611, 732, 684, 989, 685, 667, 685, 390, 337, 390, 838, 556, // P to _
	500, 613, 635, 550, 635, 615, 352, 635, 634, 278, 278, 579, 278, 974, 634, 612, // ` to o
	635, 635, 411, 521, 392, 634, 592, 818, 592, 592, 525, 636, 337, 636, 838, // p to ~
}

var boldWidths = [95]uint16{
	348, 456, 521, 838, 696, 1002, 872, 306, 457, 457, 523, 838, 380, 415, 380, 365,
	696, 696, 696, 696, 696, 696, 696, 696, 696, 696, 400, 400, 838, 838, 838, 611,
	1000, 774, 762, 734, 830, 683, 683, 821, 837, 372, 556, 775, 637, 995, 837, 850,
	733, 850, 770, 720, 682, 812, 774, 1103, 771, 724, 725, 457, 365, 457, 838, 556,
	500, 675, 716, 593, 716, 678, 435, 716, 712, 343, 343, 665, 343, 1042, 712, 687,
	716, 716, 493, 595, 478, 712, 652, 924, 645, 652, 582, 712, 365, 712, 838,
}

// otherWidths are regular widths (DejaVu Sans) of characters outside ASCII
// that the card itself writes; bold adds 10 %.
var otherWidths = map[rune]int{
	'–': 500, '—': 1000, '×': 838, '÷': 838, 'φ': 660, '·': 318, '°': 500, '²': 401, '³': 401,
	'≤': 838, '≥': 838, '…': 1000, 'μ': 636, '→': 838, '‘': 318, '’': 318, '“': 518, '”': 518,
	'η': 634, 'ε': 541, '±': 838, '●': 873, '▲': 769, '■': 945, '✓': 838, 'é': 615, 'è': 615,
	'ü': 634, 'ö': 612, 'ä': 613, 'ç': 550, 'ñ': 634, '\u00a0': 318,
}
