package chart

import (
	"math"
	"testing"
)

// TestSansMeasure checks the width table. The widths of '0' and 'W' are
// DejaVu Sans's advance widths, 1303 and 2025 units of 2048 (read from the
// font's hmtx table: 0.636 and 0.989 em); 'i' is 570 units (0.278 em); the
// bold '0' is 1425 units (0.696 em).
func TestSansMeasure(t *testing.T) {
	cases := []struct {
		s    string
		size float64
		bold bool
		want float64
	}{
		{"0", 10, false, 6.36},
		{"W", 10, false, 9.89},
		{"i", 1, false, 0.278},
		{"0", 10, true, 6.96},
		{"00", 10, false, 12.72},
		{"", 10, false, 0},
		{"e\u0301", 1, false, 0.615}, // a combining accent takes no width
		{"中", 2, false, 2},           // East Asian wide: 1 em
		{"\u05e9", 1, false, 0.75},   // not in the table: 0.75 em
		{"…", 1, false, 1},
	}
	for _, c := range cases {
		if got := SansMeasure(c.s, c.size, c.bold); math.Abs(got-c.want) > 1e-9 {
			t.Errorf("SansMeasure(%q, %g, %v) = %g, want %g", c.s, c.size, c.bold, got, c.want)
		}
	}
}

// TestSansMeasureLaws checks that widths add up, scale with the size, and
// are no narrower in bold (within 2 %: '@' is the widest in the regular
// face of one font and in the bold of the other), over every printable
// ASCII character.
func TestSansMeasureLaws(t *testing.T) {
	for r := rune(32); r < 127; r++ {
		s := string(r)
		w := SansMeasure(s, 1, false)
		if w <= 0 {
			t.Errorf("SansMeasure(%q) = %g, want > 0", s, w)
		}
		if got := SansMeasure(s+s+s, 3, false); math.Abs(got-9*w) > 1e-9 {
			t.Errorf("SansMeasure(%q, 3) = %g, want %g", s+s+s, got, 9*w)
		}
		if b := SansMeasure(s, 1, true); b < 0.98*w {
			t.Errorf("SansMeasure(%q, bold) = %g, narrower than regular %g", s, b, w)
		}
	}
}
