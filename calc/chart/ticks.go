package chart

import (
	"math"
	"strconv"
	"strings"

	"setcard/calc"
)

// NiceStep is the smallest step of the 1, 2, 5 series (…, 0.5, 1, 2, 5, 10,
// 20, …) that divides span into no more than n intervals. It is 1 when span
// is not positive or n is less than 1.
func NiceStep(span float64, n int) float64 {
	if !(span > 0) || n < 1 || math.IsInf(span, 0) {
		return 1
	}
	raw := span / float64(n)
	p := math.Pow(10, math.Floor(math.Log10(raw)))
	for _, k := range []float64{1, 2, 5} {
		if k*p >= raw*(1-1e-9) {
			return k * p
		}
	}
	return 10 * p
}

// Ticks are the multiples of step from lo to hi inclusive (lo and hi are
// rounded out to multiples of step first).
func Ticks(lo, hi, step float64) []float64 {
	if !(step > 0) || !(hi >= lo) {
		return nil
	}
	a := math.Floor(lo/step + 1e-9)
	z := math.Ceil(hi/step - 1e-9)
	out := make([]float64, 0, int(z-a)+1)
	places := decimals(step) + 1
	for k := a; k <= z; k++ {
		out = append(out, roundTo(k*step, places))
	}
	return out
}

// decimals is the number of decimals that labels at multiples of step need.
func decimals(step float64) int {
	if !(step > 0) {
		return 0
	}
	// The smallest d ≥ 0 with step·10^d ≥ 1, give or take 1e-9 in the
	// exponent: ⌈−log10(step) − 1e-9⌉, without a logarithm (slow under
	// WebAssembly, and asked for every tick).
	d := 0
	for p := step; p < 1-2.3e-9 && d < 400; p *= 10 {
		d++
	}
	return d
}

// formatTick writes a tick value with the decimals its step needs.
func formatTick(v float64, step float64) string {
	d := decimals(step)
	// Ticks are whole multiples of 10^-d, so the common case is an integer
	// count of them, written with integer formatting (FormatFloat is
	// several times slower, and layouts format every tick more than once).
	if n := math.Round(v * math.Pow10(d)); d <= 6 && math.Abs(n) < 1e15 && n/math.Pow10(d) == v {
		return fixedPoint(int64(n), d)
	}
	return strconv.FormatFloat(v+0, 'f', d, 64)
}

// fixedPoint writes n × 10^-d with d decimals.
func fixedPoint(n int64, d int) string {
	neg := n < 0
	if neg {
		n = -n
	}
	s := strconv.FormatInt(n, 10)
	if d > 0 {
		if len(s) <= d {
			s = strings.Repeat("0", d-len(s)+1) + s
		}
		s = s[:len(s)-d] + "." + s[len(s)-d:]
	}
	if neg {
		s = "-" + s
	}
	return s
}

func roundTo(v float64, places int) float64 {
	p := math.Pow10(places)
	return math.Round(v*p)/p + 0
}

// FormatSet10 writes a set per 10 blows as the card and the chart print
// it: in mm, rounded down to 0.1 mm (calc.FloorTo), as TableRow rounds it,
// so that a printed criterion is never larger than the computed one.
func FormatSet10(mm float64) string { return strconv.FormatFloat(calc.FloorTo(mm, 1), 'f', 1, 64) }

// FormatSet1 writes a set per blow as the card prints it: in mm, rounded
// down to 0.01 mm.
func FormatSet1(mm float64) string { return strconv.FormatFloat(calc.FloorTo(mm, 2), 'f', 2, 64) }

// num writes v with the fewest decimals, up to places, that show it.
func num(v float64, places int) string {
	s := strconv.FormatFloat(roundTo(v, places), 'f', -1, 64)
	return s
}
