package calc

import "math"

func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }

// positiveRoot returns the positive root of a·x² + b·x − k = 0 for a ≥ 0,
// k > 0, written in the form 2k / (b + √(b² + 4ak)) that has no
// cancellation and holds at a = 0. ok is false when no positive finite root
// exists (a = 0 and b ≤ 0).
func positiveRoot(a, b, k float64) (x float64, ok bool) {
	d := b*b + 4*a*k
	den := b + math.Sqrt(d)
	if !(den > 0) {
		return 0, false
	}
	x = 2 * k / den
	return x, finite(x) && x > 0
}
