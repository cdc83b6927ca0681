package calc

import (
	"math"
	"slices"
)

// CurvePoint is one point of a set–resistance curve.
type CurvePoint struct {
	SetMm      float64 // per blow
	UltimateKN float64
	DesignKN   float64
}

// Crossing is where a curve meets a head-stress threshold or the design
// load, computed directly: the threshold fixes R = σ·A, and the set there
// follows in closed form.
type Crossing struct {
	StressMPa  float64
	UltimateKN float64
	DesignKN   float64
	SetMm      float64
}

// Curve is the resistance against set for one drop and one length.
type Curve struct {
	DropM   float64
	LengthM float64
	Points  []CurvePoint // resistance rising, set falling
	// RefusalKN is the resistance at zero set, the end of the curve;
	// MinSetKN the resistance at the minimum practical set.
	RefusalKN float64
	MinSetKN  float64
	// EasyEdge and HardEdge are where the curve crosses the zone
	// thresholds; nil when the curve does not reach them.
	EasyEdge *Crossing
	HardEdge *Crossing
	// Required is the criterion for the design load at this drop.
	Required Requirement
}

// CurveOptions shape Curves. The zero value is the default.
type CurveOptions struct {
	// Points is the number of samples per curve (default 200).
	Points int
	// MaxSetMm is the largest set per blow the curve starts from
	// (default: 4 × the largest required set, at least 5 × the minimum
	// practical set, at least 10 mm).
	MaxSetMm float64
	// LengthM is the pile length (default the longest of the project).
	LengthM float64
}

// Curves returns one curve per drop. Points are spaced evenly in
// resistance between the resistance at MaxSetMm and the resistance at zero
// set, so they are even along the chart's capacity axis; the knots where
// the compressions change slope (interpolated) or jump (banded) are added
// so that the polyline is exact there.
func (m *Model) Curves(o CurveOptions) []Curve {
	if o.Points < 2 {
		o.Points = 200
	}
	if !(o.LengthM > 0) {
		o.LengthM = m.LongestM()
	}
	if !(o.MaxSetMm > 0) {
		o.MaxSetMm = m.DefaultMaxSetMm()
	}
	out := make([]Curve, len(m.DropsM))
	for i, h := range m.DropsM {
		out[i] = m.curve(h, o)
	}
	return out
}

// DefaultMaxSetMm is the top of the set axis used when none is given.
func (m *Model) DefaultMaxSetMm() float64 {
	top := math.Max(10, 5*m.MinSetMm)
	for _, h := range m.DropsM {
		q, err := m.Require(h, m.LongestM())
		if err == nil && q.HasSet {
			top = math.Max(top, 4*q.SetMm)
		}
	}
	return math.Min(top, 100)
}

func (m *Model) curve(dropM float64, o CurveOptions) Curve {
	l := o.LengthM
	c := Curve{DropM: dropM, LengthM: l}
	eta, _ := m.eta(l)
	e := m.energy(dropM) * eta
	rLo, _, ok1 := m.ultimate(e, o.MaxSetMm, l)
	r0, _, ok2 := m.ultimate(e, 0, l)
	if !ok2 {
		// Zero total compression: no finite refusal resistance. Stop
		// the curve at the minimum set, which Resolve guarantees is > 0.
		r0, _, ok2 = m.ultimate(e, m.MinSetMm, l)
	}
	if !ok1 || !ok2 {
		return c
	}
	c.RefusalKN = r0
	c.MinSetKN, _, _ = m.ultimate(e, m.MinSetMm, l)
	rs := make([]float64, 0, o.Points+8)
	for k := range o.Points {
		rs = append(rs, rLo+(r0-rLo)*float64(k)/float64(o.Points-1))
	}
	if m.Method != Given {
		for k := 1; k <= 4; k++ {
			var sk float64
			if m.Method == Interpolated {
				sk = m.ccKnots[k][0]
			} else if k < 4 {
				sk = m.categoryEdgeMPa(k - 1)
			} else {
				continue
			}
			if r := sk * m.AreaMm2 / 1000; r > rLo && r < r0 {
				rs = insertSorted(rs, r)
				if m.Method == Banded {
					rs = insertSorted(rs, math.Nextafter(r, 0))
				}
			}
		}
	}
	f := m.DesignFactor()
	c.Points = make([]CurvePoint, 0, len(rs))
	for _, r := range rs {
		s := m.setAt(e, r, l)
		if s < 0 {
			// Banded: just past a column edge the set can fall below zero
			// before the end of the curve; clip at refusal.
			s = 0
		}
		c.Points = append(c.Points, CurvePoint{SetMm: s, UltimateKN: r, DesignKN: r * f})
	}
	c.Points[len(c.Points)-1].SetMm = 0
	cross := func(t float64) *Crossing {
		r := t * m.AreaMm2 / 1000
		if r < rLo || r > r0 {
			return nil
		}
		s := math.Max(0, m.setAt(e, r, l))
		return &Crossing{StressMPa: t, UltimateKN: r, DesignKN: r * f, SetMm: s}
	}
	c.EasyEdge = cross(m.EasyBelowMPa)
	c.HardEdge = cross(m.HardFromMPa)
	c.Required, _ = m.Require(dropM, l)
	return c
}

// ZoneEdgesKN are the ultimate resistances at which head stress R/A meets
// the easy and hard thresholds: the zone bands are vertical on a chart of
// set against capacity.
func (m *Model) ZoneEdgesKN() (easyKN, hardKN float64) {
	return m.EasyBelowMPa * m.AreaMm2 / 1000, m.HardFromMPa * m.AreaMm2 / 1000
}

// insertSorted inserts v into the ascending slice s, keeping it ascending.
func insertSorted(s []float64, v float64) []float64 {
	i, _ := slices.BinarySearch(s, v)
	return slices.Insert(s, i, v)
}
