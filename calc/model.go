package calc

import (
	"fmt"
	"math"
	"strconv"
	"strings"
	"unicode/utf8"
)

// Method is how the temporary compressions are found.
type Method string

// The compression methods.
const (
	// Interpolated takes Cc linear in head stress through the table points
	// (and through zero at zero stress), Cp = R·L/(A·E) exactly, and Cq as
	// entered. No standard is known to sanction interpolating the table: it
	// is a choice of this program, made so that every result is
	// self-consistent.
	Interpolated Method = "interpolated"
	// Banded is the hand method: one table column, chosen from the head
	// stress, re-solved until the column used is the column the answer
	// falls in.
	Banded Method = "banded"
	// Given takes Cc, Cp and Cq as entered.
	Given Method = "given"
)

// Section is how the pile's cross-section was given.
type Section string

// The ways to give a section.
const (
	Round  Section = "round"  // by diameter
	Square Section = "square" // by side
	ByArea Section = "area"   // by area, for steel H and tube sections
)

// Model is a validated project with every default filled in, ready to
// compute. Make one with Resolve; do not change it afterwards.
type Model struct {
	Name string

	HammerType      HammerType
	RamKg           float64
	Efficiency      float64 // e_f
	EfficiencyFrom  string  // "project" or the source of the table value
	Restitution     float64 // e
	RestitutionFrom string

	DropsM []float64

	Material      Material
	Section       Section
	SizeMm        float64 // diameter or side; 0 for ByArea
	AreaMm2       float64
	LengthsM      []float64 // one length, or the range from shortest to longest
	DensityKgM3   float64
	ModulusMPa    float64
	GivenMassKg   float64 // > 0 when the project gives the pile mass
	MassFraction  float64
	StrengthMPa   float64
	LimitFactor   float64
	DrivenPartsKg float64

	Method      Method
	Cap         []CapRow // rows present, values after overrides
	CategoryMPa [4]float64
	CqMm        float64
	CcMm        float64 // Given only
	CpMm        float64 // Given only

	LoadKN         float64
	Phi            float64 // > 0 when the φ convention is used
	FactorOfSafety float64 // > 0 when the factor-of-safety convention is used
	ChartUltimate  bool

	EasyBelowMPa float64
	HardFromMPa  float64
	MinSetMm     float64

	Card CardInfo

	// ccKnots are the (stress, Cc) points of the interpolated cap
	// compression, starting at (0, 0).
	ccKnots [5][2]float64
}

// Limits of every input, in the units of the project file. The site reads
// them for its controls, so a handle never offers a value that is refused.
var (
	LimitRamKg       = Range{50, 20000, "kg"}
	LimitEfficiency  = Range{0.3, 1, ""}
	LimitRestitution = Range{0, 0.9, ""}
	LimitDropM       = Range{0.05, 5, "m"}
	LimitDrops       = 12
	LimitDiameterMm  = Range{50, 3000, "mm"}
	LimitAreaMm2     = Range{500, 3e6, "mm²"}
	LimitLengthM     = Range{1, 80, "m"}
	LimitLengthStepM = Range{0.1, 80, "m"}
	LimitLengths     = 25
	LimitDensity     = Range{200, 9000, "kg/m³"}
	LimitModulusMPa  = Range{1000, 250000, "MPa"}
	LimitPileMassKg  = Range{1, 200000, "kg"}
	LimitMassFrac    = Range{0.25, 1, ""}
	LimitStrengthMPa = Range{1, 1000, "MPa"}
	LimitLimitFactor = Range{0.1, 3, ""}
	LimitPartsKg     = Range{0, 20000, "kg"}
	LimitCqMm        = Range{0, 10, "mm"}
	LimitCcMm        = Range{0, 50, "mm"}
	LimitCpMm        = Range{0, 100, "mm"}
	LimitCapRowMm    = Range{0, 50, "mm"}
	LimitCategoryMPa = Range{0.1, 500, "MPa"}
	LimitLoadKN      = Range{1, 50000, "kN"}
	LimitPhi         = Range{0.1, 1, ""}
	LimitFoS         = Range{1, 5, ""}
	LimitZoneMPa     = Range{0.1, 1000, "MPa"}
	LimitMinSetMm    = Range{0, 25, "mm"}
	LimitNameRunes   = 200
	LimitTextRunes   = 500
)

// InputRanges maps each numeric field of the project file, by its path,
// to its allowed range. Zone thresholds and table overrides are included
// by their key; drops are under "drops_m".
func InputRanges() map[string]Range {
	return map[string]Range{
		"hammer.ram_kg":           LimitRamKg,
		"hammer.efficiency":       LimitEfficiency,
		"hammer.restitution":      LimitRestitution,
		"drops_m":                 LimitDropM,
		"pile.diameter_mm":        LimitDiameterMm,
		"pile.side_mm":            LimitDiameterMm,
		"pile.area_mm2":           LimitAreaMm2,
		"pile.length_m":           LimitLengthM,
		"pile.length_max_m":       LimitLengthM,
		"pile.length_step_m":      LimitLengthStepM,
		"pile.density_kg_m3":      LimitDensity,
		"pile.modulus_mpa":        LimitModulusMPa,
		"pile.mass_kg":            LimitPileMassKg,
		"pile.mass_fraction":      LimitMassFrac,
		"pile.strength_mpa":       LimitStrengthMPa,
		"pile.limit_factor":       LimitLimitFactor,
		"driven_parts_kg":         LimitPartsKg,
		"compression.cq_mm":       LimitCqMm,
		"compression.cc_mm":       LimitCcMm,
		"compression.cp_mm":       LimitCpMm,
		"design.load_kn":          LimitLoadKN,
		"design.phi":              LimitPhi,
		"design.factor_of_safety": LimitFoS,
		"zones.easy_below_mpa":    LimitZoneMPa,
		"zones.hard_from_mpa":     LimitZoneMPa,
		"min_set_mm_per_blow":     LimitMinSetMm,
	}
}

// Range is the allowed range of one input.
type Range struct {
	Min, Max float64
	Unit     string
}

func (r Range) String() string { return allowedRange(r.Min, r.Max, r.Unit) }

func (c *errs) in(field string, p *float64, r Range) (float64, bool) {
	return c.need(field, p, r.Min, r.Max, r.Unit)
}

func (c *errs) optIn(field string, p *float64, def float64, r Range) float64 {
	return c.opt(field, p, def, r.Min, r.Max, r.Unit)
}

func (c *errs) text(field, s string, maxRunes int) string {
	if n := utf8.RuneCountInString(s); n > maxRunes {
		c.add(field, strconv.Quote(string([]rune(s)[:20])+"…"), fmt.Sprintf("at most %d characters", maxRunes), "is too long")
		return ""
	}
	return s
}

// Resolve validates a project and fills in its defaults. The error, when
// not nil, is Errors: every problem found, each naming its field.
func Resolve(p *Project) (*Model, error) {
	var c errs
	m := &Model{}
	if p.Format != FormatVersion {
		if err := checkFormat(p.Format); err != nil {
			c.list = append(c.list, err.(*FieldError))
		}
	}
	m.Name = c.text("name", p.Name, LimitNameRunes)

	// Hammer.
	ht := p.Hammer.Type
	if ht == "" {
		ht = "drop-winch"
	}
	if t, ok := HammerTypeByID(ht); ok {
		m.HammerType = t
	} else {
		c.add("hammer.type", strconv.Quote(ht), choices(hammerIDs()), "is not a hammer type")
		m.HammerType, _ = HammerTypeByID("drop-winch")
	}
	m.RamKg, _ = c.in("hammer.ram_kg", p.Hammer.RamKg, LimitRamKg)
	if p.Hammer.Efficiency != nil {
		m.Efficiency = c.optIn("hammer.efficiency", p.Hammer.Efficiency, m.HammerType.Efficiency, LimitEfficiency)
		m.EfficiencyFrom = "project"
	} else {
		m.Efficiency = m.HammerType.Efficiency
		m.EfficiencyFrom = m.HammerType.Source + " [" + string(m.HammerType.Mark) + "]"
	}

	// Pile material first: it gives defaults.
	mat, ok := MaterialByID(p.Pile.Material)
	if !ok {
		c.add("pile.material", strconv.Quote(p.Pile.Material), "timber, concrete or steel", "is not a pile material")
		mat, _ = MaterialByID("timber")
	}
	m.Material = mat

	switch {
	case p.Hammer.Restitution != nil:
		m.Restitution = c.optIn("hammer.restitution", p.Hammer.Restitution, mat.Restitution, LimitRestitution)
		m.RestitutionFrom = "project"
	case p.Hammer.Contact != "":
		if ct, ok := ContactByID(p.Hammer.Contact); ok {
			m.Restitution = ct.Restitution
			m.RestitutionFrom = ct.Label + ": " + ct.Source + " [" + string(ct.Mark) + "]"
		} else {
			c.add("hammer.contact", strconv.Quote(p.Hammer.Contact), choices(contactIDs()), "is not a contact of the restitution table")
		}
	default:
		m.Restitution = mat.Restitution
		m.RestitutionFrom = "default for " + mat.ID + ": " + restitutionSource(mat.Restitution)
	}
	if p.Hammer.Restitution != nil && p.Hammer.Contact != "" {
		c.add("hammer.contact", strconv.Quote(p.Hammer.Contact), "either restitution or contact", "is given with hammer.restitution")
	}

	// Drops.
	if len(p.DropsM) == 0 {
		c.add("drops_m", "", fmt.Sprintf("1 to %d drops, each %s", LimitDrops, LimitDropM), "is required")
	} else if len(p.DropsM) > LimitDrops {
		c.add("drops_m", fmt.Sprintf("%d drops", len(p.DropsM)), fmt.Sprintf("1 to %d drops", LimitDrops), "has too many drops")
	} else {
		for i, h := range p.DropsM {
			f := "drops_m[" + strconv.Itoa(i) + "]"
			if c.rng(f, h, LimitDropM.Min, LimitDropM.Max, LimitDropM.Unit) {
				for _, prev := range m.DropsM {
					if prev == h {
						c.add(f, formatNum(h), "each drop once", "is listed twice")
					}
				}
				m.DropsM = append(m.DropsM, h)
			}
		}
	}

	// Section.
	n := 0
	for _, q := range []*float64{p.Pile.DiameterMm, p.Pile.SideMm, p.Pile.AreaMm2} {
		if q != nil {
			n++
		}
	}
	switch {
	case n != 1:
		c.add("pile.diameter_mm", "", "exactly one of pile.diameter_mm, pile.side_mm, pile.area_mm2", fmt.Sprintf("and the other section keys are given %d times", n))
	case p.Pile.DiameterMm != nil:
		if d, ok := c.in("pile.diameter_mm", p.Pile.DiameterMm, LimitDiameterMm); ok {
			m.Section, m.SizeMm, m.AreaMm2 = Round, d, math.Pi*d*d/4
		}
	case p.Pile.SideMm != nil:
		if d, ok := c.in("pile.side_mm", p.Pile.SideMm, LimitDiameterMm); ok {
			m.Section, m.SizeMm, m.AreaMm2 = Square, d, d*d
		}
	default:
		if a, ok := c.in("pile.area_mm2", p.Pile.AreaMm2, LimitAreaMm2); ok {
			m.Section, m.AreaMm2 = ByArea, a
		}
	}

	// Lengths.
	l1, ok1 := c.in("pile.length_m", p.Pile.LengthM, LimitLengthM)
	if ok1 {
		m.LengthsM = []float64{l1}
	}
	if p.Pile.LengthMaxM != nil {
		l2, ok2 := c.in("pile.length_max_m", p.Pile.LengthMaxM, LimitLengthM)
		if ok1 && ok2 {
			if l2 <= l1 {
				c.add("pile.length_max_m", formatNum(l2), fmt.Sprintf("more than pile.length_m (%s m)", formatNum(l1)), "is not longer than the shortest length")
			} else {
				m.LengthsM = lengthSteps(l1, l2, &c, p.Pile.LengthStepM)
			}
		}
		if p.Pile.MassKg != nil {
			c.add("pile.mass_kg", formatNum(*p.Pile.MassKg), "pile.mass_kg for one length, or density for a range", "cannot be given with a range of lengths")
		}
	} else if p.Pile.LengthStepM != nil {
		c.add("pile.length_step_m", formatNum(*p.Pile.LengthStepM), "only with pile.length_max_m", "is given without a range")
	}
	m.DensityKgM3 = c.optIn("pile.density_kg_m3", p.Pile.DensityKgM3, mat.DensityKgM3, LimitDensity)
	m.ModulusMPa = c.optIn("pile.modulus_mpa", p.Pile.ModulusMPa, mat.ModulusMPa, LimitModulusMPa)
	if p.Pile.MassKg != nil {
		m.GivenMassKg = c.optIn("pile.mass_kg", p.Pile.MassKg, 0, LimitPileMassKg)
	}
	m.MassFraction = c.optIn("pile.mass_fraction", p.Pile.MassFraction, 1, LimitMassFrac)
	m.StrengthMPa = c.optIn("pile.strength_mpa", p.Pile.StrengthMPa, mat.StrengthMPa, LimitStrengthMPa)
	m.LimitFactor = c.optIn("pile.limit_factor", p.Pile.LimitFactor, mat.LimitFactor, LimitLimitFactor)
	m.DrivenPartsKg = c.optIn("driven_parts_kg", p.DrivenPartsKg, 0, LimitPartsKg)

	// Tables and compressions.
	m.CategoryMPa = CategoryStressMPa
	var over map[string][]float64
	if t := p.Tables; t != nil {
		over = t.CapRowsMm
		if t.CategoryStressMPa != nil {
			if len(t.CategoryStressMPa) != 4 {
				c.add("tables.category_stress_mpa", fmt.Sprintf("%d values", len(t.CategoryStressMPa)), "4 rising stresses (easy, medium, hard, very hard)", "has the wrong length")
			} else {
				okAll := true
				for i, v := range t.CategoryStressMPa {
					okAll = c.rng(fmt.Sprintf("tables.category_stress_mpa[%d]", i), v, LimitCategoryMPa.Min, LimitCategoryMPa.Max, "MPa") && okAll
					if okAll && i > 0 && v <= t.CategoryStressMPa[i-1] {
						c.add(fmt.Sprintf("tables.category_stress_mpa[%d]", i), formatNum(v), "more than the column before", "does not rise")
						okAll = false
					}
				}
				if okAll {
					copy(m.CategoryMPa[:], t.CategoryStressMPa)
				}
			}
		}
		for _, id := range sortedKeys(anyMap(over)) {
			f := "tables.cap_rows_mm." + id
			if _, ok := CapRowByID(id); !ok {
				c.add(f, "", choices(capIDs()), "is not a row of the cap table")
				continue
			}
			vals := over[id]
			if len(vals) != 4 {
				c.add(f, fmt.Sprintf("%d values", len(vals)), "4 values (easy, medium, hard, very hard)", "has the wrong length")
				continue
			}
			for i, v := range vals {
				if c.rng(fmt.Sprintf("%s[%d]", f, i), v, LimitCapRowMm.Min, LimitCapRowMm.Max, "mm") && i > 0 && v < vals[i-1] {
					c.add(fmt.Sprintf("%s[%d]", f, i), formatNum(v), "no less than the column before", "falls as driving gets harder")
				}
			}
		}
	}

	meth := p.Compression.Method
	if meth == "" {
		meth = string(Interpolated)
	}
	m.Method = Method(meth)
	switch m.Method {
	case Interpolated, Banded:
		if p.Compression.Cap == nil {
			c.add("compression.cap", "", choices(capIDs())+", or [] for none", "is required for method "+meth)
		}
		seen := map[string]bool{}
		for i, id := range p.Compression.Cap {
			f := "compression.cap[" + strconv.Itoa(i) + "]"
			row, ok := CapRowByID(id)
			switch {
			case !ok:
				c.add(f, strconv.Quote(id), choices(capIDs()), "is not a row of the cap table")
			case seen[id]:
				c.add(f, strconv.Quote(id), "each row once", "is listed twice")
			default:
				seen[id] = true
				if v, ok := over[id]; ok && len(v) == 4 {
					row.Mm = [4]float64(v)
					row.Cited = Cited{"project override", MarkPractice}
				}
				m.Cap = append(m.Cap, row)
			}
		}
		if p.Compression.CcMm != nil || p.Compression.CpMm != nil {
			c.add("compression.cc_mm", "", "cc_mm and cp_mm only with method \"given\"", "is given with method "+meth)
		}
		m.CqMm, _ = c.in("compression.cq_mm", p.Compression.CqMm, LimitCqMm)
	case Given:
		if len(p.Compression.Cap) > 0 {
			c.add("compression.cap", fmt.Sprintf("%d rows", len(p.Compression.Cap)), "no cap rows with method \"given\"", "is given with method given")
		}
		m.CcMm, _ = c.in("compression.cc_mm", p.Compression.CcMm, LimitCcMm)
		m.CpMm, _ = c.in("compression.cp_mm", p.Compression.CpMm, LimitCpMm)
		m.CqMm, _ = c.in("compression.cq_mm", p.Compression.CqMm, LimitCqMm)
	default:
		c.add("compression.method", strconv.Quote(meth), "interpolated, banded or given", "is not a compression method")
	}

	// Design.
	m.LoadKN, _ = c.in("design.load_kn", p.Design.LoadKN, LimitLoadKN)
	switch {
	case p.Design.Phi != nil && p.Design.FactorOfSafety != nil:
		c.add("design.phi", formatNum(*p.Design.Phi), "one of design.phi and design.factor_of_safety", "is given with design.factor_of_safety")
	case p.Design.Phi != nil:
		m.Phi, _ = c.in("design.phi", p.Design.Phi, LimitPhi)
	case p.Design.FactorOfSafety != nil:
		m.FactorOfSafety, _ = c.in("design.factor_of_safety", p.Design.FactorOfSafety, LimitFoS)
	default:
		c.add("design.phi", "", "one of design.phi ("+LimitPhi.String()+") and design.factor_of_safety ("+LimitFoS.String()+")", "is required: the program never picks a factor silently")
	}
	switch p.Design.Basis {
	case "", "design":
	case "ultimate":
		m.ChartUltimate = true
	default:
		c.add("design.chart_basis", strconv.Quote(p.Design.Basis), "design or ultimate", "is not a chart basis")
	}

	// Zones and refusal.
	m.EasyBelowMPa, m.HardFromMPa = DefaultEasyBelowMPa, DefaultHardFromMPa
	if z := p.Zones; z != nil {
		m.EasyBelowMPa = c.optIn("zones.easy_below_mpa", z.EasyBelowMPa, DefaultEasyBelowMPa, LimitZoneMPa)
		m.HardFromMPa = c.optIn("zones.hard_from_mpa", z.HardFromMPa, DefaultHardFromMPa, LimitZoneMPa)
		if m.HardFromMPa <= m.EasyBelowMPa {
			c.add("zones.hard_from_mpa", formatNum(m.HardFromMPa), fmt.Sprintf("more than zones.easy_below_mpa (%s MPa)", formatNum(m.EasyBelowMPa)), "is not above the easy threshold")
		}
	}
	m.MinSetMm = c.optIn("min_set_mm_per_blow", p.MinSetMm, DefaultMinSetMm, LimitMinSetMm)

	if p.Card != nil {
		m.Card = CardInfo{
			Reference:  c.text("card.reference", p.Card.Reference, LimitNameRunes),
			Date:       c.text("card.date", p.Card.Date, LimitNameRunes),
			Revision:   c.text("card.revision", p.Card.Revision, LimitNameRunes),
			PreparedBy: c.text("card.prepared_by", p.Card.PreparedBy, LimitNameRunes),
			CheckedBy:  c.text("card.checked_by", p.Card.CheckedBy, LimitNameRunes),
			ApprovedBy: c.text("card.approved_by", p.Card.ApprovedBy, LimitNameRunes),
			Notes:      c.text("card.notes", p.Card.Notes, LimitTextRunes),
		}
	}

	if len(c.list) > 0 {
		return nil, c.list
	}
	m.buildKnots()
	// A model that cannot give a finite resistance at refusal is refused
	// here, so that no computation downstream meets a division by zero.
	if m.Method == Given && m.CcMm+m.CpMm+m.CqMm == 0 && m.MinSetMm == 0 {
		return nil, Errors{{Field: "compression.cq_mm", Value: "0", Allowed: "a total temporary compression above 0 mm, or a minimum set above 0", Problem: "with cc_mm and cp_mm 0 gives an infinite resistance at refusal"}}
	}
	return m, nil
}

func lengthSteps(l1, l2 float64, c *errs, step *float64) []float64 {
	if step == nil {
		return []float64{l1, l2}
	}
	st, ok := c.in("pile.length_step_m", step, LimitLengthStepM)
	if !ok {
		return []float64{l1, l2}
	}
	n := int(math.Floor((l2-l1)/st + 1e-9))
	if n+2 > LimitLengths {
		c.add("pile.length_step_m", formatNum(st), fmt.Sprintf("a step giving at most %d lengths", LimitLengths), "gives too many lengths")
		return []float64{l1, l2}
	}
	out := []float64{l1}
	for i := 1; i <= n; i++ {
		v := math.Round((l1+float64(i)*st)*1e6) / 1e6
		if v < l2-1e-9 {
			out = append(out, v)
		}
	}
	return append(out, l2)
}

func anyMap(m map[string][]float64) map[string]any {
	out := make(map[string]any, len(m))
	for k, v := range m {
		out[k] = v
	}
	return out
}

func choices(ids []string) string { return "one of " + strings.Join(ids, ", ") }

func capIDs() []string {
	out := make([]string, len(CapRows))
	for i, r := range CapRows {
		out[i] = r.ID
	}
	return out
}

func hammerIDs() []string {
	out := make([]string, len(HammerTypes))
	for i, r := range HammerTypes {
		out[i] = r.ID
	}
	return out
}

func contactIDs() []string {
	out := make([]string, len(Contacts))
	for i, r := range Contacts {
		out[i] = r.ID
	}
	return out
}

func restitutionSource(e float64) string {
	for _, ct := range Contacts {
		if ct.Restitution == e {
			return ct.Label + ", " + ct.Source + " [" + string(ct.Mark) + "]"
		}
	}
	return "material default"
}

// buildKnots sums the cap rows into the interpolation knots.
func (m *Model) buildKnots() {
	for k := range 4 {
		sum := 0.0
		for _, r := range m.Cap {
			sum += r.Mm[k]
		}
		m.ccKnots[k+1] = [2]float64{m.CategoryMPa[k], sum}
	}
}

// DesignFactor is the number that multiplies R_u to give the design (or
// allowable) resistance: φ, or 1/FS.
func (m *Model) DesignFactor() float64 {
	if m.Phi > 0 {
		return m.Phi
	}
	return 1 / m.FactorOfSafety
}

// RequiredUltimateKN is the ultimate resistance that the design load
// needs: load/φ or load·FS.
func (m *Model) RequiredUltimateKN() float64 { return m.LoadKN / m.DesignFactor() }

// Convention describes the design convention in words, for prints.
func (m *Model) Convention() string {
	if m.Phi > 0 {
		return fmt.Sprintf("design resistance = φ × ultimate, φ = %s", formatNum(m.Phi))
	}
	return fmt.Sprintf("allowable load = ultimate ÷ FS, FS = %s", formatNum(m.FactorOfSafety))
}

// PileMassKg is the mass of a pile of length lengthM.
func (m *Model) PileMassKg(lengthM float64) float64 {
	if m.GivenMassKg > 0 {
		return m.GivenMassKg
	}
	return m.DensityKgM3 * m.AreaMm2 * 1e-6 * lengthM
}

// StruckMassKg is P as a mass: the part of the pile counted
// (MassFraction) plus helmet, dolly, packing and anvil.
func (m *Model) StruckMassKg(lengthM float64) float64 {
	return m.MassFraction*m.PileMassKg(lengthM) + m.DrivenPartsKg
}

// DrivingLimitMPa is the driving-stress limit of the pile material.
func (m *Model) DrivingLimitMPa() float64 { return m.LimitFactor * m.StrengthMPa }

// LongestM is the longest pile length of the project.
func (m *Model) LongestM() float64 { return m.LengthsM[len(m.LengthsM)-1] }
