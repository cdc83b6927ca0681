package calc

import "math"

// TableRow is one row of the required-set table as the command's
// `table -json`, the site's HTML table, the card and the test hook give it.
// Sets are rounded down, so that a printed criterion is never larger than
// the computed one: per blow to 0.01 mm, per 10 blows to 0.1 mm (the same
// figure ×10). Other numbers are rounded to 0.001.
type TableRow struct {
	DropM           float64  `json:"drop_m"`
	LengthM         float64  `json:"length_m"`
	SetMmPerBlow    *float64 `json:"set_mm_per_blow"`
	SetMmPer10Blows *float64 `json:"set_mm_per_10_blows"`
	Achievable      bool     `json:"achievable"`
	Reason          string   `json:"reason"`
	Governs         bool     `json:"governs"`
	UltimateKN      float64  `json:"ultimate_kn"`
	DesignKN        float64  `json:"design_kn"`
	RefusalKN       float64  `json:"refusal_kn"`
	HeadStressMPa   float64  `json:"head_stress_mpa"`
	Zone            Zone     `json:"zone"`
	ImpactStressMPa float64  `json:"impact_stress_mpa"`
	LimitMPa        float64  `json:"limit_mpa"`
	Overstressed    bool     `json:"overstressed"`
	Warnings        []string `json:"warnings"`
}

// SolveRow is one row of the command's `solve -json`: one blow.
type SolveRow struct {
	DropM            float64  `json:"drop_m"`
	LengthM          float64  `json:"length_m"`
	SetMm            float64  `json:"set_mm"`
	EfficiencyOfBlow float64  `json:"efficiency_of_blow"`
	Branch           Branch   `json:"branch"`
	EnergyKJ         float64  `json:"energy_kj"`
	NetEnergyKJ      float64  `json:"net_energy_kj"`
	CcMm             float64  `json:"cc_mm"`
	CpMm             float64  `json:"cp_mm"`
	CqMm             float64  `json:"cq_mm"`
	CMm              float64  `json:"c_mm"`
	HeadStressMPa    float64  `json:"head_stress_mpa"`
	Category         string   `json:"category"`
	Zone             Zone     `json:"zone"`
	UltimateKN       float64  `json:"ultimate_kn"`
	DesignKN         float64  `json:"design_kn"`
	ImpactStressMPa  float64  `json:"impact_stress_mpa"`
	LimitMPa         float64  `json:"limit_mpa"`
	Capped           bool     `json:"capped"`
	FormulaKN        float64  `json:"formula_ultimate_kn"`
	Warnings         []string `json:"warnings"`
}

// roundTo rounds to places decimals; -0 becomes 0.
func roundTo(v float64, places int) float64 {
	p := math.Pow10(places)
	return math.Round(v*p)/p + 0
}

func r3(v float64) float64 { return roundTo(v, 3) }

// FloorTo rounds v down to places decimals, allowing for the binary
// representation of v (18.1 stays 18.1, not 18.09). Criteria are rounded
// down so that a printed set is never larger than the computed one.
func FloorTo(v float64, places int) float64 {
	p := math.Pow10(places)
	return math.Floor(v*p+1e-7)/p + 0
}

func messages(ws []Warning) []string {
	out := make([]string, len(ws))
	for i, w := range ws {
		out[i] = w.Message
	}
	return out
}

// Row turns a requirement into a table row.
func (q Requirement) Row() TableRow {
	t := TableRow{
		DropM: q.DropM, LengthM: q.LengthM, Achievable: q.Achievable, Reason: q.Reason, Governs: q.Governs,
		UltimateKN: r3(q.UltimateKN), DesignKN: r3(q.DesignKN), RefusalKN: r3(q.RefusalKN),
		HeadStressMPa: r3(q.HeadStressMPa), Zone: q.Zone, ImpactStressMPa: r3(q.ImpactStressMPa),
		LimitMPa: r3(q.LimitMPa), Overstressed: q.Overstressed, Warnings: messages(q.Warnings),
	}
	if q.HasSet {
		s := FloorTo(q.SetMm, 2)
		s10 := FloorTo(q.SetMm10, 1)
		t.SetMmPerBlow, t.SetMmPer10Blows = &s, &s10
	}
	return t
}

// TableRows is Table as rows.
func (m *Model) TableRows() []TableRow {
	qs := m.Table()
	out := make([]TableRow, len(qs))
	for i, q := range qs {
		out[i] = q.Row()
	}
	return out
}

// Row turns a blow into a solve row.
func (b Blow) Row() SolveRow {
	return SolveRow{
		DropM: b.DropM, LengthM: b.LengthM, SetMm: b.SetMm, EfficiencyOfBlow: roundTo(b.EfficiencyOfBlow, 4),
		Branch: b.Branch, EnergyKJ: r3(b.EnergyKJ), NetEnergyKJ: r3(b.NetEnergyKJ),
		CcMm: r3(b.CcMm), CpMm: r3(b.CpMm), CqMm: r3(b.CqMm), CMm: r3(b.CMm),
		HeadStressMPa: r3(b.HeadStressMPa), Category: Categories[b.Category], Zone: b.Zone,
		UltimateKN: r3(b.UltimateKN), DesignKN: r3(b.DesignKN), ImpactStressMPa: r3(b.ImpactStressMPa),
		LimitMPa: r3(b.LimitMPa), Capped: b.Capped, FormulaKN: r3(b.FormulaKN), Warnings: messages(b.Warnings),
	}
}
