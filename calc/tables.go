package calc

// Gravity is standard gravity, g = 9.80665 m/s² (ISO 80000-3, CGPM 1901).
const Gravity = 9.80665

// Mark says how sure a table value is.
type Mark string

// The confidence marks of the engineering reference.
const (
	MarkConfirmed Mark = "C" // checked in the named source
	MarkSecondary Mark = "S" // quoted by a secondary source
	MarkMemory    Mark = "M" // from memory, not confirmed
	MarkPractice  Mark = "P" // common practice, no single source
)

// Cited is where a value comes from.
type Cited struct {
	Source string
	Mark   Mark
}

// Categories are the four driving categories that head the columns of the
// temporary-compression table, named by the stress on the pile head during
// driving, R_u/A.
var Categories = []string{"easy", "medium", "hard", "very hard"}

// CategoryStressMPa is the nominal head stress of each category column:
// 3.5, 7, 10.5 and 14 MPa (500, 1000, 1500 and 2000 psi).
var CategoryStressMPa = [4]float64{3.5, 7, 10.5, 14}

// CategoryStressCited is the source of CategoryStressMPa.
var CategoryStressCited = Cited{"Chellis; Bowles (columns of the temporary-compression table)", MarkMemory}

// CapRow is one row of the table of temporary compression of the pile head
// and cap, Cc, in mm at each category column. The rows that are present in a
// cap make-up are added.
type CapRow struct {
	ID    string
	Label string
	Mm    [4]float64
	Cited
}

// CapRows is the table of Cc by driving category. The rows rise
// 1 : 2 : 3 : 4 with the column stresses, so they are close to proportional
// to head stress.
var CapRows = []CapRow{
	{"timber-head", "head of timber pile", [4]float64{1.3, 2.5, 3.8, 5.0}, Cited{"Chellis; Bowles; common practice 1.3 to 5 mm", MarkMemory}},
	{"timber-dolly", "short timber dolly in helmet", [4]float64{1.3, 2.5, 3.8, 5.0}, Cited{"Chellis; Bowles", MarkMemory}},
	{"concrete-packing", "concrete pile, 75–100 mm packing in cap", [4]float64{3, 6, 9, 13}, Cited{"Chellis; Bowles", MarkMemory}},
	{"concrete-pad", "concrete pile, 12–25 mm pad only", [4]float64{0.6, 1.3, 1.9, 2.5}, Cited{"Chellis; Bowles", MarkMemory}},
	{"steel-packed-cap", "steel pile, cap with wood packing", [4]float64{1, 2, 3, 4}, Cited{"Chellis; Bowles", MarkMemory}},
	{"steel-direct", "steel pile head, direct", [4]float64{0, 0, 0, 0}, Cited{"Chellis; Bowles", MarkMemory}},
}

// CapRowByID returns the row of CapRows with the given id.
func CapRowByID(id string) (CapRow, bool) {
	for _, r := range CapRows {
		if r.ID == id {
			return r, true
		}
	}
	return CapRow{}, false
}

// QuakeTypicalMm is the typical quake, Cq = 2.5 mm (0 to 5 mm).
var QuakeTypicalMm = 2.5

// QuakeCited is the source of QuakeTypicalMm. Common practice reads 1.3 to
// 3.8 mm from easy to very hard driving. Quake is a property of the ground,
// chosen by the engineer.
var QuakeCited = Cited{"typical 2.5 mm, 0 to 5 mm; common practice 1.3 to 3.8 mm", MarkMemory}

// Contact is a row of the table of coefficients of restitution.
type Contact struct {
	ID          string
	Label       string
	Restitution float64
	Cited
}

// Contacts is the table of coefficients of restitution e.
var Contacts = []Contact{
	{"steel-on-steel", "steel ram on steel anvil or steel pile head", 0.5, Cited{"Tomlinson-type table", MarkMemory}},
	{"hard-cushion", "plastic or hard cushion; concrete pile head with packing", 0.4, Cited{"Tomlinson-type table", MarkMemory}},
	{"wood-cushion-steel", "compact wood cushion on steel pile", 0.32, Cited{"Das gives 0.30–0.40", MarkConfirmed}},
	{"timber", "timber dolly or timber pile head", 0.25, Cited{"Das, wooden piles about 0.25; common practice", MarkConfirmed}},
	{"broomed", "deteriorated or broomed head", 0, Cited{"Tomlinson-type table", MarkMemory}},
}

// HammerType is a row of the table of hammer efficiencies e_f.
type HammerType struct {
	ID         string
	Label      string
	Efficiency float64
	Cited
}

// HammerTypes is the table of hammer efficiency e_f. For a diesel hammer the
// range is 0.6 to 0.8; the table gives the lower end.
var HammerTypes = []HammerType{
	{"drop-trigger", "drop hammer, trigger release", 1.0, Cited{"Tomlinson", MarkSecondary}},
	{"drop-winch", "drop hammer, winch and rope", 0.8, Cited{"Tomlinson; common practice when the rig gives nothing better", MarkSecondary}},
	{"single-acting", "single-acting air or steam hammer", 0.9, Cited{"Tomlinson", MarkSecondary}},
	{"diesel", "diesel hammer (0.6 to 0.8)", 0.6, Cited{"secondary sources give 0.6 to 0.8", MarkSecondary}},
}

// HammerTypeByID returns the row of HammerTypes with the given id.
func HammerTypeByID(id string) (HammerType, bool) {
	for _, h := range HammerTypes {
		if h.ID == id {
			return h, true
		}
	}
	return HammerType{}, false
}

// ContactByID returns the row of Contacts with the given id.
func ContactByID(id string) (Contact, bool) {
	for _, c := range Contacts {
		if c.ID == id {
			return c, true
		}
	}
	return Contact{}, false
}

// Material holds the defaults for one pile material.
type Material struct {
	ID string
	// DensityKgM3 and ModulusMPa are used when the project gives none.
	DensityKgM3 float64
	ModulusMPa  float64
	// StrengthMPa is the strength that the driving-stress limit is a
	// fraction of: characteristic compressive strength parallel to the grain
	// for timber, f'c for concrete, f_y for steel.
	StrengthMPa float64
	// LimitFactor times StrengthMPa is the driving-stress limit.
	LimitFactor float64
	// Restitution is the default coefficient of restitution.
	Restitution float64
	Cited
}

// Materials is the table of pile materials.
//
// Driving stress in timber may reach 0.8 × the characteristic compressive
// strength parallel to the grain (BS EN 12699, via Tomlinson & Woodward,
// pp. 16–17) [C]; the strength 21 MPa is that of strength class C24 in
// EN 338, from memory [M]. Concrete 0.85·f'c and steel 0.9·f_y are from
// memory [M]; the strengths 40 MPa and 355 MPa are common grades [P].
// Timber density 800–1000 kg/m³ and E 8–10.3 GPa [M]; concrete and steel
// properties are common practice.
var Materials = []Material{
	{"timber", 900, 10000, 21, 0.8, 0.25, Cited{"BS EN 12699 via Tomlinson & Woodward pp. 16–17 (limit 0.8 f_c,0,k); EN 338 C24 strength from memory", MarkMemory}},
	{"concrete", 2400, 30000, 40, 0.85, 0.4, Cited{"limit 0.85 f'c from memory; f'c 40 MPa a common grade", MarkMemory}},
	{"steel", 7850, 210000, 355, 0.9, 0.5, Cited{"limit 0.9 f_y from memory; S355 a common grade", MarkMemory}},
}

// MaterialByID returns the row of Materials with the given id.
func MaterialByID(id string) (Material, bool) {
	for _, m := range Materials {
		if m.ID == id {
			return m, true
		}
	}
	return Material{}, false
}

// Defaults for the zones that the chart shades and the command reports.
// Common practice reads below about 7 MPa head stress as easy driving and
// above about 14 MPa as very hard driving [P].
const (
	DefaultEasyBelowMPa = 7.0
	DefaultHardFromMPa  = 14.0
)

// DefaultMinSetMm is the minimum practical set per blow: 10 blows per 25 mm
// is often treated as refusal [C] (a state highway geotechnical manual).
const DefaultMinSetMm = 2.5
