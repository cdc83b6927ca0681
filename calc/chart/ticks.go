package chart

import (
	"math"
	"strconv"

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
	for k := a; k <= z; k++ {
		out = append(out, roundTo(k*step, decimals(step)+1))
	}
	return out
}

// decimals is the number of decimals that labels at multiples of step need.
func decimals(step float64) int {
	if !(step > 0) {
		return 0
	}
	d := int(math.Ceil(-math.Log10(step) - 1e-9))
	return max(d, 0)
}

// formatTick writes a tick value with the decimals its step needs.
func formatTick(v float64, step float64) string {
	return strconv.FormatFloat(v+0, 'f', decimals(step), 64)
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
