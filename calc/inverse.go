package calc

import "fmt"

// Requirement is the set that the design load needs at one drop and one
// pile length: the criterion a crew drives to.
type Requirement struct {
	DropM   float64
	LengthM float64
	// SetMm is the required set per blow and SetMm10 per 10 blows. They are
	// the largest sets that still prove the load: stop driving when the set
	// is no more than this. When no set exists (the load is beyond the
	// hammer even at refusal) they are 0 and HasSet is false; a negative
	// set is never returned.
	SetMm   float64
	SetMm10 float64
	HasSet  bool
	// Achievable is false when no set exists or the set needed is below
	// the minimum practical set; Reason says why.
	Achievable bool
	Reason     string
	// UltimateKN is the ultimate resistance the design load needs;
	// RefusalKN the most this drop can prove, at the minimum practical set.
	UltimateKN float64
	DesignKN   float64
	RefusalKN  float64
	// The compressions at UltimateKN.
	CcMm, CpMm, CqMm, CMm float64
	HeadStressMPa         float64
	Zone                  Zone
	EfficiencyOfBlow      float64
	ImpactStressMPa       float64
	LimitMPa              float64
	Overstressed          bool // impact stress above the driving-stress limit
	// Governs marks, in a range of lengths, the length whose set is the
	// smallest at this drop: the conservative criterion.
	Governs  bool
	Warnings []Warning
}

// SetFor is the set per blow (mm) at which the formula gives the ultimate
// resistance R at a drop, in closed form:
//
//	s = e_f·W·h·η / R − c(R)/2
//
// with the compressions worked out at R itself, so no iteration is needed
// for any method. The result may be negative: then no set gives R.
func (m *Model) setFor(ultimateKN, dropM, lengthM float64) float64 {
	eta, _ := m.eta(lengthM)
	return m.setAt(m.energy(dropM)*eta, ultimateKN, lengthM)
}

// setAt is setFor given the energy delivered to the pile, E·η (kN·mm).
func (m *Model) setAt(energyEta, ultimateKN, lengthM float64) float64 {
	cc, cp, cq := m.Compressions(ultimateKN, lengthM)
	return energyEta/ultimateKN - (cc+cp+cq)/2
}

// Require works out the set that the design load needs at a drop and a
// pile length, and whether it can be reached.
func (m *Model) Require(dropM, lengthM float64) (Requirement, error) {
	if err := m.checkInputs(dropM, lengthM); err != nil {
		return Requirement{}, err
	}
	r := m.RequiredUltimateKN()
	q := Requirement{DropM: dropM, LengthM: lengthM, UltimateKN: r, DesignKN: m.LoadKN}
	q.CcMm, q.CpMm, q.CqMm = m.Compressions(r, lengthM)
	q.CMm = q.CcMm + q.CpMm + q.CqMm
	q.HeadStressMPa = m.stress(r)
	q.Zone = m.ZoneOf(q.HeadStressMPa)
	q.EfficiencyOfBlow, _ = m.eta(lengthM)
	q.ImpactStressMPa = m.ImpactStressMPa(dropM)
	q.LimitMPa = m.DrivingLimitMPa()
	q.Overstressed = q.ImpactStressMPa > q.LimitMPa
	q.RefusalKN = m.refusalKN(dropM, lengthM)
	q.Warnings = m.commonWarnings(dropM, q.HeadStressMPa, lengthM)

	s := m.setFor(r, dropM, lengthM)
	f := m.DesignFactor()
	switch {
	case s < 0:
		q.Reason = fmt.Sprintf("cannot reach the load: at %.2f m drop this hammer proves at most %.0f kN ultimate (%.0f kN design) even at refusal; %.0f kN ultimate is needed",
			dropM, q.RefusalKN, q.RefusalKN*f, r)
	case s < m.MinSetMm:
		q.SetMm, q.SetMm10, q.HasSet = s, 10*s, true
		q.Reason = fmt.Sprintf("needs a set of %.2f mm per blow, below the minimum practical set of %.2f mm: the load cannot be proven at this drop",
			s, m.MinSetMm)
	default:
		q.SetMm, q.SetMm10, q.HasSet, q.Achievable = s, 10*s, true, true
	}
	if !q.Achievable {
		q.Warnings = append(q.Warnings, Warning{WarnUnreachable, q.Reason})
	}
	return q, nil
}

// refusalKN is the ultimate resistance at the minimum practical set (or at
// zero set when the minimum is zero): the most a drop can prove.
func (m *Model) refusalKN(dropM, lengthM float64) float64 {
	eta, _ := m.eta(lengthM)
	r, _, ok := m.ultimate(m.energy(dropM)*eta, m.MinSetMm, lengthM)
	if !ok {
		return 0
	}
	return r
}

// DropFor is the drop (m) at which the design load is proven at a set per
// blow, in closed form:
//
//	h = R·(s + c(R)/2) / (e_f·W·η)
//
// ok is false, with the reason, when the set is below the minimum practical
// set or the drop is outside the allowed range of drops.
func (m *Model) DropFor(setMm, lengthM float64) (dropM float64, ok bool, reason string) {
	if !finite(setMm) || setMm < 0 || setMm > 1000 {
		return 0, false, fmt.Sprintf("set %s mm per blow is outside 0 to 1000 mm", formatNum(setMm))
	}
	if setMm < m.MinSetMm {
		return 0, false, fmt.Sprintf("set %.2f mm per blow is below the minimum practical set of %.2f mm", setMm, m.MinSetMm)
	}
	r := m.RequiredUltimateKN()
	eta, _ := m.eta(lengthM)
	cc, cp, cq := m.Compressions(r, lengthM)
	h := r * (setMm + (cc+cp+cq)/2) / (m.Efficiency * m.RamKg * Gravity * eta)
	if h > LimitDropM.Max {
		return h, false, fmt.Sprintf("needs a drop of %.2f m, above the largest allowed drop of %s m", h, formatNum(LimitDropM.Max))
	}
	if h < LimitDropM.Min {
		return h, false, fmt.Sprintf("needs a drop of %.3f m, below the smallest allowed drop of %s m", h, formatNum(LimitDropM.Min))
	}
	return h, true, ""
}

// Table is the required set at every drop and every length of the
// project, drops outer, lengths inner. In a range of lengths the row whose
// set is smallest at each drop is marked Governs; an unreachable row
// governs over any reachable one.
func (m *Model) Table() []Requirement {
	out := make([]Requirement, 0, len(m.DropsM)*len(m.LengthsM))
	for _, h := range m.DropsM {
		first := len(out)
		for _, l := range m.LengthsM {
			q, err := m.Require(h, l)
			if err != nil {
				panic("calc: a resolved model refused its own drop or length: " + err.Error())
			}
			out = append(out, q)
		}
		g := first
		for i := first + 1; i < len(out); i++ {
			if lessConservative(out[g], out[i]) {
				g = i
			}
		}
		out[g].Governs = true
	}
	return out
}

// lessConservative reports whether b is a stricter criterion than a.
func lessConservative(a, b Requirement) bool {
	if a.Achievable != b.Achievable {
		return a.Achievable
	}
	if a.HasSet != b.HasSet {
		return a.HasSet
	}
	return b.SetMm < a.SetMm
}

// Envelope is the conservative requirement over the project's lengths at
// one drop: the one marked Governs in Table.
func (m *Model) Envelope(dropM float64) (Requirement, error) {
	var best Requirement
	for i, l := range m.LengthsM {
		q, err := m.Require(dropM, l)
		if err != nil {
			return Requirement{}, err
		}
		if i == 0 || lessConservative(best, q) {
			best = q
		}
	}
	best.Governs = true
	return best, nil
}
