package chart

import (
	"image/color"
	"sort"
)

// Plot is the data area of a chart: its frame in layout units, the data
// ranges of its axes, and the curves in data space, so that an interactive
// canvas can draw a crosshair and read values off the curves without
// laying out again.
//
// The x axis is capacity in kN: design (or allowable) capacity, φ·R_u or
// R_u/FS, unless Ultimate is set, when it is the ultimate resistance R_u.
// The y axis is the set in mm per 10 blows, rising upwards; the right-hand
// scale is the same set in mm per blow (a tenth of it).
type Plot struct {
	Frame Rect
	// XMinKN to XMaxKN span the frame from left to right; YMinMm10 to
	// YMaxMm10 from bottom to top.
	XMinKN, XMaxKN     float64
	YMinMm10, YMaxMm10 float64
	// Ultimate is true when x is the ultimate resistance; DesignFactor is
	// the factor that turns an ultimate resistance into a design one.
	Ultimate     bool
	DesignFactor float64
	// LoadKN is the design load on the x axis (the ultimate it needs when
	// Ultimate is true).
	LoadKN float64
	// MinSetMm10 is the top of the refusal band, the minimum practical set
	// in mm per 10 blows.
	MinSetMm10 float64
	// EasyEdgeKN and HardEdgeKN are the zone edges on the x axis.
	EasyEdgeKN, HardEdgeKN float64
	// Series are the curves, one per drop, in the project's order.
	Series []Series
}

// Series is the curve of one drop in data space.
type Series struct {
	DropM   float64
	LengthM float64 // the pile length of the curve: the one that governs
	Label   string  // as printed on the chart, e.g. "1.2 m"
	Colour  color.RGBA
	Dash    []float64
	// KN and SetMm10 are the points of the curve, capacity rising.
	KN      []float64
	SetMm10 []float64
	// RequiredMm10 is the set per 10 blows at the design load, when
	// Reachable.
	RequiredMm10 float64
	Reachable    bool
}

// XOf is the x position of a capacity (kN).
func (p *Plot) XOf(kN float64) float64 {
	return p.Frame.X + (kN-p.XMinKN)/(p.XMaxKN-p.XMinKN)*p.Frame.W
}

// YOf is the y position of a set in mm per 10 blows.
func (p *Plot) YOf(setMm10 float64) float64 {
	return p.Frame.Y + p.Frame.H - (setMm10-p.YMinMm10)/(p.YMaxMm10-p.YMinMm10)*p.Frame.H
}

// KNAt is the capacity (kN) at x position x; the inverse of XOf.
func (p *Plot) KNAt(x float64) float64 {
	return p.XMinKN + (x-p.Frame.X)/p.Frame.W*(p.XMaxKN-p.XMinKN)
}

// SetAt is the set in mm per 10 blows at y position y; the inverse of YOf.
func (p *Plot) SetAt(y float64) float64 {
	return p.YMinMm10 + (p.Frame.Y+p.Frame.H-y)/p.Frame.H*(p.YMaxMm10-p.YMinMm10)
}

// Contains reports whether the position (x, y) is inside the frame.
func (p *Plot) Contains(x, y float64) bool { return p.Frame.Contains(Point{x, y}) }

// SetAt is the set in mm per 10 blows of the curve at a capacity, by
// linear interpolation between its points; ok is false outside the curve.
func (s *Series) SetAt(kN float64) (setMm10 float64, ok bool) {
	n := len(s.KN)
	if n == 0 || kN < s.KN[0] || kN > s.KN[n-1] {
		return 0, false
	}
	i := sort.SearchFloat64s(s.KN, kN)
	if i == 0 {
		return s.SetMm10[0], true
	}
	k0, k1 := s.KN[i-1], s.KN[i]
	if k1 == k0 {
		return s.SetMm10[i], true
	}
	t := (kN - k0) / (k1 - k0)
	return s.SetMm10[i-1] + t*(s.SetMm10[i]-s.SetMm10[i-1]), true
}
