package calc

import (
	"fmt"
	"math"
)

// Zone is the head-stress zone that the chart shades and the command
// reports: easy below Model.EasyBelowMPa, hard from Model.HardFromMPa,
// medium between.
type Zone string

// The three zones.
const (
	Easy   Zone = "easy"
	Medium Zone = "medium"
	Hard   Zone = "hard"
)

// ZoneOf is the zone of a head stress.
func (m *Model) ZoneOf(stressMPa float64) Zone {
	switch {
	case stressMPa < m.EasyBelowMPa:
		return Easy
	case stressMPa < m.HardFromMPa:
		return Medium
	}
	return Hard
}

// CategoryOf is the column of the temporary-compression table whose nominal
// stress is nearest the head stress: column k covers stresses from the
// midpoint below its nominal stress to the midpoint above. This reading of
// the table's columns is common practice [P]; the table itself gives only
// the nominal stresses.
func (m *Model) CategoryOf(stressMPa float64) int {
	for k := range 3 {
		if stressMPa < (m.CategoryMPa[k]+m.CategoryMPa[k+1])/2 {
			return k
		}
	}
	return 3
}

// categoryEdgeMPa is the stress at which column k ends (k < 3).
func (m *Model) categoryEdgeMPa(k int) float64 {
	return (m.CategoryMPa[k] + m.CategoryMPa[k+1]) / 2
}

// Warning is something the user must know about one result.
type Warning struct {
	Code    string // stable, for programs: "below-min-set", "overstress", ...
	Message string // for people
}

// The warning codes.
const (
	WarnBelowMinSet  = "below-min-set"
	WarnOverstress   = "overstress"
	WarnHeadStress   = "head-stress"
	WarnBoundary     = "on-boundary"
	WarnLightRam     = "light-ram"
	WarnExtrapolated = "beyond-table"
	WarnUnreachable  = "unreachable"
)

// Blow is the result of one blow: the Hiley formula solved at one set.
type Blow struct {
	DropM   float64
	LengthM float64
	SetMm   float64 // set per blow used in the formula
	Capped  bool    // SetMm was raised to the minimum practical set
	// FormulaKN is what the formula gives at the set asked for, before the
	// cap; equal to UltimateKN when not Capped. Below the minimum practical
	// set it is not a capacity that may be claimed.
	FormulaKN float64
	RamKg     float64
	StruckKg  float64 // P as a mass
	// EfficiencyOfBlow is η and Branch the formula branch used.
	EfficiencyOfBlow float64
	Branch           Branch
	// EnergyKJ is the energy of the blow, e_f·W·h; NetEnergyKJ is that
	// times η, the energy that goes into the pile.
	EnergyKJ    float64
	NetEnergyKJ float64
	CcMm        float64
	CpMm        float64
	CqMm        float64
	CMm         float64 // Cc + Cp + Cq, the whole temporary compression
	// HeadStressMPa is R_u/A.
	HeadStressMPa float64
	Category      int // column of the compression table, 0 easy … 3 very hard
	// ColumnEdge is, for the banded method, the column k when the answer
	// straddles the edge between columns k and k+1 (no column is
	// consistent, and the edge is reported); -1 otherwise.
	ColumnEdge int
	Zone       Zone
	UltimateKN float64
	DesignKN   float64
	// ImpactStressMPa is ρ·c·v for a rigid ram striking the bare head: an
	// upper bound that ignores the cushion.
	ImpactStressMPa float64
	LimitMPa        float64
	Warnings        []Warning
}

// Energy returns e_f·W·h in kN·mm (= J) at a drop.
func (m *Model) energy(dropM float64) float64 {
	return m.Efficiency * m.RamKg * Gravity * dropM
}

// eta is the efficiency of blow for a pile of length L.
func (m *Model) eta(lengthM float64) (float64, Branch) {
	return EfficiencyOfBlow(m.RamKg, m.StruckMassKg(lengthM), m.Restitution)
}

// cpPerKN is the elastic shortening of the pile per kN of resistance,
// L/(A·E) in mm/kN: Cp = R·L/(A·E) [C].
func (m *Model) cpPerKN(lengthM float64) float64 {
	return 1e6 * lengthM / (m.AreaMm2 * m.ModulusMPa)
}

// Compressions returns Cc, Cp and Cq (mm) at an ultimate resistance R (kN)
// by the model's method. For Banded the column is the one that R's head
// stress falls in.
func (m *Model) Compressions(ultimateKN, lengthM float64) (cc, cp, cq float64) {
	switch m.Method {
	case Given:
		return m.CcMm, m.CpMm, m.CqMm
	case Banded:
		k := m.CategoryOf(m.stress(ultimateKN))
		return m.capColumn(k), ultimateKN * m.cpPerKN(lengthM), m.CqMm
	}
	return m.ccInterp(m.stress(ultimateKN)), ultimateKN * m.cpPerKN(lengthM), m.CqMm
}

func (m *Model) stress(ultimateKN float64) float64 { return ultimateKN * 1000 / m.AreaMm2 }

func (m *Model) capColumn(k int) float64 { return m.ccKnots[k+1][1] }

// ccSegment returns the index i of the knot segment [i, i+1] holding the
// stress; the last segment is extended beyond the very hard column.
func (m *Model) ccSegment(stressMPa float64) int {
	for i := range 3 {
		if stressMPa < m.ccKnots[i+1][0] {
			return i
		}
	}
	return 3
}

// ccLine is Cc = a + b·σ on knot segment i.
func (m *Model) ccLine(i int) (a, b float64) {
	s0, c0 := m.ccKnots[i][0], m.ccKnots[i][1]
	s1, c1 := m.ccKnots[i+1][0], m.ccKnots[i+1][1]
	b = (c1 - c0) / (s1 - s0)
	return c0 - b*s0, b
}

// ccInterp is the cap compression interpolated in head stress: linear
// through (0, 0) and the four table points, extended beyond the last.
func (m *Model) ccInterp(stressMPa float64) float64 {
	a, b := m.ccLine(m.ccSegment(stressMPa))
	return a + b*stressMPa
}

// Ultimate solves the Hiley formula for R_u at a set per blow, with the
// compressions consistent with R_u. It returns the resistance and which
// table column (banded) or segment was used.
//
// With c = α + β·R on the piece of c(R) that holds the answer, the formula
// R·(s + c/2) = E is the quadratic (β/2)·R² + (s + α/2)·R − E = 0 and R is
// its positive root. R·(s + c(R)/2) rises strictly with R, so exactly one
// piece holds the root; it is found by evaluating the left side at the
// knots. For Banded, each column gives its own root, the roots fall as the
// column rises, and at most one is in its own column; when none is, the
// answer straddles the edge above column k, the edge's resistance is
// returned and edge is k. Otherwise edge is -1.
func (m *Model) ultimate(e, s, lengthM float64) (r float64, edge int, ok bool) {
	cpk := m.cpPerKN(lengthM)
	switch m.Method {
	case Given:
		c := m.CcMm + m.CpMm + m.CqMm
		den := s + c/2
		if !(den > 0) {
			return 0, -1, false
		}
		return e / den, -1, true
	case Banded:
		for k := range 4 {
			b := s + (m.capColumn(k)+m.CqMm)/2
			rk, ok := positiveRoot(cpk/2, b, e)
			if !ok {
				return 0, -1, false
			}
			if k == 3 || m.stress(rk) < m.categoryEdgeMPa(k) {
				return rk, -1, true
			}
			// rk wants a harder column. Does column k+1's answer fall back
			// below the edge? Then the answer straddles the edge.
			b1 := s + (m.capColumn(k+1)+m.CqMm)/2
			r1, ok := positiveRoot(cpk/2, b1, e)
			if !ok {
				return 0, -1, false
			}
			if m.stress(r1) < m.categoryEdgeMPa(k) {
				return m.categoryEdgeMPa(k) * m.AreaMm2 / 1000, k, true
			}
		}
	}
	// Interpolated: find the knot piece holding the root.
	f := func(r float64) float64 {
		cc, cp, cq := m.Compressions(r, lengthM)
		return r * (s + (cc+cp+cq)/2)
	}
	i := 3
	for j := 1; j <= 3; j++ {
		rj := m.ccKnots[j][0] * m.AreaMm2 / 1000
		if f(rj) >= e {
			i = j - 1
			break
		}
	}
	a, b := m.ccLine(i)
	alpha := a + m.CqMm
	beta := b*1000/m.AreaMm2 + cpk
	r, ok = positiveRoot(beta/2, s+alpha/2, e)
	return r, -1, ok
}

// BlowAt solves one blow at a drop, a set per blow and a pile length.
// Sets below the minimum practical set are raised to it, and the result
// says so: the capacity reported there is capped.
func (m *Model) BlowAt(dropM, setMm, lengthM float64) (Blow, error) {
	if err := m.checkInputs(dropM, lengthM); err != nil {
		return Blow{}, err
	}
	if !finite(setMm) || setMm < 0 || setMm > 1000 {
		return Blow{}, &FieldError{Field: "set_mm", Value: formatNum(setMm), Allowed: "0 to 1000 mm per blow", Problem: "is out of range"}
	}
	b := Blow{DropM: dropM, LengthM: lengthM, SetMm: setMm, RamKg: m.RamKg, StruckKg: m.StruckMassKg(lengthM), ColumnEdge: -1}
	if setMm < m.MinSetMm {
		b.SetMm, b.Capped = m.MinSetMm, true
		b.Warnings = append(b.Warnings, Warning{WarnBelowMinSet, fmt.Sprintf(
			"set %.2f mm per blow is below the minimum practical set of %.2f mm: treated as refusal, capacity capped at the minimum set", setMm, m.MinSetMm)})
	}
	b.EfficiencyOfBlow, b.Branch = m.eta(lengthM)
	b.EnergyKJ = m.energy(dropM) / 1000
	e := m.energy(dropM) * b.EfficiencyOfBlow
	b.NetEnergyKJ = e / 1000
	r, edge, ok := m.ultimate(e, b.SetMm, lengthM)
	if !ok {
		return Blow{}, &FieldError{Field: "set_mm", Value: formatNum(setMm), Allowed: "a set above 0 mm, or a temporary compression above 0 mm", Problem: "gives no finite resistance"}
	}
	b.ColumnEdge = edge
	m.fillBlow(&b, r)
	b.FormulaKN = r
	if b.Capped {
		if rf, _, ok := m.ultimate(e, setMm, lengthM); ok {
			b.FormulaKN = rf
		}
	}
	if edge >= 0 {
		b.Warnings = append(b.Warnings, Warning{WarnBoundary, fmt.Sprintf(
			"banded: the answer straddles the edge between the %s and %s columns at %.2f MPa; the edge is reported",
			Categories[edge], Categories[edge+1], m.categoryEdgeMPa(edge))})
	}
	return b, nil
}

// fillBlow completes a blow from its ultimate resistance.
func (m *Model) fillBlow(b *Blow, r float64) {
	b.UltimateKN = r
	b.DesignKN = r * m.DesignFactor()
	b.CcMm, b.CpMm, b.CqMm = m.Compressions(r, b.LengthM)
	b.HeadStressMPa = m.stress(r)
	b.Category = m.CategoryOf(b.HeadStressMPa)
	if b.ColumnEdge >= 0 {
		// On an edge: the lower column's Cc is reported; no column is
		// consistent there.
		b.Category = b.ColumnEdge
		b.CcMm = m.capColumn(b.ColumnEdge)
	}
	b.CMm = b.CcMm + b.CpMm + b.CqMm
	b.Zone = m.ZoneOf(b.HeadStressMPa)
	b.ImpactStressMPa = m.ImpactStressMPa(b.DropM)
	b.LimitMPa = m.DrivingLimitMPa()
	b.Warnings = append(b.Warnings, m.commonWarnings(b.DropM, b.HeadStressMPa, b.LengthM)...)
}

// commonWarnings are the warnings that any result at this drop, head stress
// and length carries.
func (m *Model) commonWarnings(dropM, stressMPa, lengthM float64) []Warning {
	var w []Warning
	lim := m.DrivingLimitMPa()
	if imp := m.ImpactStressMPa(dropM); imp > lim {
		w = append(w, Warning{WarnOverstress, fmt.Sprintf(
			"impact stress %.1f MPa for a rigid ram at %.2f m drop exceeds the driving-stress limit %.1f MPa (upper bound, ignores the cushion): use a lower drop or a heavier ram", imp, dropM, lim)})
	}
	if stressMPa > lim {
		w = append(w, Warning{WarnHeadStress, fmt.Sprintf(
			"head stress %.1f MPa at this resistance exceeds the driving-stress limit %.1f MPa", stressMPa, lim)})
	}
	for _, t := range []float64{m.EasyBelowMPa, m.HardFromMPa} {
		if math.Abs(stressMPa-t) <= 0.02*t {
			w = append(w, Warning{WarnBoundary, fmt.Sprintf(
				"head stress %.2f MPa sits on the %.1f MPa zone boundary: the zone may be either", stressMPa, t)})
		}
	}
	if m.Method != Given && stressMPa > m.CategoryMPa[3] {
		w = append(w, Warning{WarnExtrapolated, fmt.Sprintf(
			"head stress %.1f MPa is beyond the very hard column (%.1f MPa): cap compression extrapolated", stressMPa, m.CategoryMPa[3])})
	}
	if m.RamKg < m.PileMassKg(lengthM)+m.DrivenPartsKg {
		w = append(w, Warning{WarnLightRam, fmt.Sprintf(
			"ram %.0f kg is lighter than the pile and driven parts (%.0f kg): drop-hammer rams are commonly 1 to 1.5 times the pile weight", m.RamKg, m.PileMassKg(lengthM)+m.DrivenPartsKg)})
	}
	return w
}

// ImpactStressMPa is the stress at the pile head when a rigid ram strikes
// it directly at the velocity of the drop:
//
//	σ = ρ·c·v = v·√(E·ρ),   v = √(2·g·h·e_f)
//
// [C] F = Z·v with Z = E·A/c (University of Florida course notes; Deeks &
// Randolph 1993). A cushion lowers the peak, so this is an upper bound.
func (m *Model) ImpactStressMPa(dropM float64) float64 {
	v := math.Sqrt(2 * Gravity * dropM * m.Efficiency)
	return v * math.Sqrt(m.ModulusMPa*1e6*m.DensityKgM3) / 1e6
}

func (m *Model) checkInputs(dropM, lengthM float64) error {
	if !finite(dropM) || dropM < LimitDropM.Min || dropM > LimitDropM.Max {
		return &FieldError{Field: "drop_m", Value: formatNum(dropM), Allowed: LimitDropM.String(), Problem: "is out of range"}
	}
	if !finite(lengthM) || lengthM < LimitLengthM.Min || lengthM > LimitLengthM.Max {
		return &FieldError{Field: "length_m", Value: formatNum(lengthM), Allowed: LimitLengthM.String(), Problem: "is out of range"}
	}
	return nil
}
