package chart

import (
	"math"
	"slices"
	"strconv"
	"testing"
)

// TestNiceStep checks the 1, 2, 5 series of tick steps (common practice
// for chart axes), worked by hand.
func TestNiceStep(t *testing.T) {
	cases := []struct {
		span float64
		n    int
		want float64
	}{
		{100, 5, 20}, {100, 10, 10}, {100, 4, 50}, {100, 3, 50}, {100, 2, 50}, {100, 1, 100},
		{180, 9, 20}, {175, 8, 50}, {1, 4, 0.5}, {0.3, 6, 0.05}, {900, 9, 100}, {1234, 6, 500},
		{0, 5, 1}, {-3, 5, 1}, {10, 0, 1}, {math.Inf(1), 5, 1}, {math.NaN(), 5, 1},
	}
	for _, c := range cases {
		if got := NiceStep(c.span, c.n); math.Abs(got-c.want) > 1e-12 {
			t.Errorf("NiceStep(%g, %d) = %g, want %g", c.span, c.n, got, c.want)
		}
	}
}

// TestTicks checks the multiples of a step between two values.
func TestTicks(t *testing.T) {
	cases := []struct {
		lo, hi, step float64
		want         []float64
	}{
		{0, 100, 20, []float64{0, 20, 40, 60, 80, 100}},
		{0, 90, 20, []float64{0, 20, 40, 60, 80, 100}},
		{0, 0.3, 0.1, []float64{0, 0.1, 0.2, 0.3}},
		{0, 1, 0, nil},
		{5, 1, 1, nil},
	}
	for _, c := range cases {
		if got := Ticks(c.lo, c.hi, c.step); !slices.Equal(got, c.want) {
			t.Errorf("Ticks(%g, %g, %g) = %v, want %v", c.lo, c.hi, c.step, got, c.want)
		}
	}
}

// TestFormatSet checks that sets are rounded down, never up, and that a
// value whose binary form falls just short of its decimal (18.1) is not
// rounded down a step. Values worked by hand.
func TestFormatSet(t *testing.T) {
	for _, c := range []struct {
		v    float64
		want string
	}{{18.03, "18.0"}, {25.86, "25.8"}, {18.1, "18.1"}, {0.29, "0.2"}, {116.85, "116.8"}, {0, "0.0"}, {150, "150.0"}} {
		if got := FormatSet10(c.v); got != c.want {
			t.Errorf("FormatSet10(%g) = %q, want %q", c.v, got, c.want)
		}
	}
	for _, c := range []struct {
		v    float64
		want string
	}{{1.803, "1.80"}, {2.586, "2.58"}, {0.29, "0.29"}, {11.685, "11.68"}} {
		if got := FormatSet1(c.v); got != c.want {
			t.Errorf("FormatSet1(%g) = %q, want %q", c.v, got, c.want)
		}
	}
}

// TestFormatTick checks the decimals of tick labels.
func TestFormatTick(t *testing.T) {
	for _, c := range []struct {
		v, step float64
		want    string
	}{{20, 20, "20"}, {1.5, 0.5, "1.5"}, {2, 0.5, "2.0"}, {0.05, 0.05, "0.05"}, {math.Copysign(0, -1), 1, "0"}} {
		if got := formatTick(c.v, c.step); got != c.want {
			t.Errorf("formatTick(%g, %g) = %q, want %q", c.v, c.step, got, c.want)
		}
	}
}

// TestFormatTickAsStrconv checks the integer fast path of formatTick
// against the standard library's strconv.FormatFloat (the reference) on
// every tick of many axes, negative ones and fractional steps included.
func TestFormatTickAsStrconv(t *testing.T) {
	n := 0
	for _, span := range []float64{0.0007, 0.013, 0.9, 1, 7.3, 12, 95, 180, 1234, 56789, 4.2e6, 3e9} {
		for parts := 1; parts <= 40; parts++ {
			step := NiceStep(span, parts)
			for _, v := range Ticks(-span, span, step) {
				want := strconv.FormatFloat(v+0, 'f', decimals(step), 64)
				if got := formatTick(v, step); got != want {
					t.Fatalf("formatTick(%v, %v) = %q, strconv gives %q", v, step, got, want)
				}
				n++
			}
		}
	}
	if n < 10000 {
		t.Fatalf("only %d ticks checked", n)
	}
}

// TestDecimalsAsLog checks decimals against its definition,
// ⌈−log10(step) − 1e-9⌉ but not below 0, computed with math.Log10, over
// the 1, 2, 5 steps from 1e-12 to 1e12 and random steps.
func TestDecimalsAsLog(t *testing.T) {
	want := func(step float64) int { return max(int(math.Ceil(-math.Log10(step)-1e-9)), 0) }
	var steps []float64
	for e := -12; e <= 12; e++ {
		for _, m := range []float64{1, 2, 5} {
			steps = append(steps, m*math.Pow10(e))
		}
	}
	for k := range 5000 {
		steps = append(steps, math.Pow(10, float64(k%240)/10-12)*(1+float64(k%7)/7))
	}
	for _, s := range steps {
		if got, w := decimals(s), want(s); got != w {
			t.Fatalf("decimals(%v) = %d, want %d", s, got, w)
		}
	}
}
