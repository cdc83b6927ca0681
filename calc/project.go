package calc

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"reflect"
	"slices"
	"strconv"
	"strings"
)

// FormatVersion is the format tag of the project file this package reads
// and writes.
const FormatVersion = "setcard/1"

// Project is the project file: JSON with SI keys that carry their unit. It is
// the one format that the site, the command and the tests share. Optional
// numbers are pointers so that an absent value and a zero differ.
type Project struct {
	Format        string      `json:"format"`
	Name          string      `json:"name"`
	Hammer        Hammer      `json:"hammer"`
	DropsM        []float64   `json:"drops_m"`
	Pile          Pile        `json:"pile"`
	DrivenPartsKg *float64    `json:"driven_parts_kg,omitempty"`
	Compression   Compression `json:"compression"`
	Design        Design      `json:"design"`
	// MinSetMm is the minimum practical set per blow; smaller sets are
	// treated as refusal. Default DefaultMinSetMm.
	MinSetMm *float64  `json:"min_set_mm_per_blow,omitempty"`
	Zones    *Zones    `json:"zones,omitempty"`
	Tables   *Tables   `json:"tables,omitempty"`
	Card     *CardInfo `json:"card,omitempty"`
}

// Hammer is the ram and how it falls.
type Hammer struct {
	// Type is a row of HammerTypes; it gives the efficiency when
	// Efficiency is absent. Default "drop-winch".
	Type       string   `json:"type,omitempty"`
	RamKg      *float64 `json:"ram_kg,omitempty"`
	Efficiency *float64 `json:"efficiency,omitempty"`
	// Restitution is the coefficient of restitution e. When absent it comes
	// from Contact (a row of Contacts), else from the pile material.
	Restitution *float64 `json:"restitution,omitempty"`
	Contact     string   `json:"contact,omitempty"`
}

// Pile is the pile: material, one of three ways to give the section, length
// (or a range of lengths), and its mass.
type Pile struct {
	Material   string   `json:"material"`
	DiameterMm *float64 `json:"diameter_mm,omitempty"`
	SideMm     *float64 `json:"side_mm,omitempty"`
	AreaMm2    *float64 `json:"area_mm2,omitempty"`
	LengthM    *float64 `json:"length_m,omitempty"`
	// LengthMaxM makes the length a range from LengthM to LengthMaxM;
	// LengthStepM, if given, adds the lengths between.
	LengthMaxM  *float64 `json:"length_max_m,omitempty"`
	LengthStepM *float64 `json:"length_step_m,omitempty"`
	DensityKgM3 *float64 `json:"density_kg_m3,omitempty"`
	ModulusMPa  *float64 `json:"modulus_mpa,omitempty"`
	// MassKg replaces the mass worked out from density, area and length.
	MassKg *float64 `json:"mass_kg,omitempty"`
	// MassFraction is the part of the pile's mass counted in P for the
	// efficiency of blow (default 1; Chellis suggests about 0.5 for long
	// piles, via Venkatramaiah).
	MassFraction *float64 `json:"mass_fraction,omitempty"`
	// StrengthMPa and LimitFactor give the driving-stress limit
	// LimitFactor × StrengthMPa; defaults from Materials.
	StrengthMPa *float64 `json:"strength_mpa,omitempty"`
	LimitFactor *float64 `json:"limit_factor,omitempty"`
}

// Compression is how the temporary compressions are found.
type Compression struct {
	// Method is "interpolated" (default), "banded" or "given".
	Method string `json:"method,omitempty"`
	// Cap lists rows of CapRows present in the cap make-up (interpolated
	// and banded). An empty list means no cap compression.
	Cap  []string `json:"cap"`
	CqMm *float64 `json:"cq_mm,omitempty"`
	CcMm *float64 `json:"cc_mm,omitempty"`
	CpMm *float64 `json:"cp_mm,omitempty"`
}

// Design is the design load and the convention that turns an ultimate
// resistance into a design one: exactly one of Phi (R_d = φ·R_u) and
// FactorOfSafety (R_a = R_u / FS).
type Design struct {
	LoadKN         *float64 `json:"load_kn,omitempty"`
	Phi            *float64 `json:"phi,omitempty"`
	FactorOfSafety *float64 `json:"factor_of_safety,omitempty"`
	// Basis says which capacity the chart's x axis shows: "design"
	// (default) or "ultimate".
	Basis string `json:"chart_basis,omitempty"`
}

// Zones are the head-stress thresholds between easy, medium and hard
// driving. Defaults DefaultEasyBelowMPa and DefaultHardFromMPa [P].
type Zones struct {
	EasyBelowMPa *float64 `json:"easy_below_mpa,omitempty"`
	HardFromMPa  *float64 `json:"hard_from_mpa,omitempty"`
}

// Tables overrides values of the shipped tables.
type Tables struct {
	// CapRowsMm replaces the four column values of named rows of CapRows.
	CapRowsMm map[string][]float64 `json:"cap_rows_mm,omitempty"`
	// CategoryStressMPa replaces CategoryStressMPa.
	CategoryStressMPa []float64 `json:"category_stress_mpa,omitempty"`
}

// CardInfo is what the printed card says about itself.
type CardInfo struct {
	Reference  string `json:"reference,omitempty"`
	Date       string `json:"date,omitempty"`
	Revision   string `json:"revision,omitempty"`
	PreparedBy string `json:"prepared_by,omitempty"`
	CheckedBy  string `json:"checked_by,omitempty"`
	ApprovedBy string `json:"approved_by,omitempty"`
	Notes      string `json:"notes,omitempty"`
}

// MaxFileBytes is the largest project file Decode reads.
const MaxFileBytes = 1 << 20

// Decode reads one project file strictly: the format tag must be
// FormatVersion, an unknown field is an error naming its path, and nothing
// may follow the object. It does not validate the values; call Resolve.
func Decode(r io.Reader) (*Project, error) {
	data, err := io.ReadAll(io.LimitReader(r, MaxFileBytes+1))
	if err != nil {
		return nil, fmt.Errorf("setcard: reading project: %w", err)
	}
	if len(data) > MaxFileBytes {
		return nil, &FieldError{Field: "(file)", Allowed: "at most 1 MiB", Problem: "is too large"}
	}
	return DecodeBytes(data)
}

// DecodeBytes is Decode for a byte slice.
func DecodeBytes(data []byte) (*Project, error) {
	var raw any
	dec := json.NewDecoder(bytes.NewReader(data))
	dec.UseNumber()
	if err := dec.Decode(&raw); err != nil {
		return nil, syntaxError(data, err)
	}
	if dec.More() {
		return nil, &FieldError{Field: "(file)", Problem: "has more than one JSON value", Allowed: "one project object"}
	}
	obj, ok := raw.(map[string]any)
	if !ok {
		return nil, &FieldError{Field: "(file)", Problem: "is not a JSON object", Allowed: "a setcard/1 project object"}
	}
	if err := checkFormat(obj["format"]); err != nil {
		return nil, err
	}
	if err := unknownFields(raw, reflect.TypeOf(Project{}), ""); err != nil {
		return nil, err
	}
	var p Project
	if err := json.Unmarshal(data, &p); err != nil {
		var te *json.UnmarshalTypeError
		if errors.As(err, &te) {
			return nil, &FieldError{Field: te.Field, Value: te.Value, Allowed: jsonKind(te.Type), Problem: "has the wrong type"}
		}
		return nil, fmt.Errorf("setcard: %w", err)
	}
	return &p, nil
}

func syntaxError(data []byte, err error) error {
	var se *json.SyntaxError
	if errors.As(err, &se) {
		line := 1 + bytes.Count(data[:min(int(se.Offset), len(data))], []byte("\n"))
		return &FieldError{Field: "(file)", Problem: fmt.Sprintf("is not valid JSON at line %d: %v", line, se), Allowed: "a setcard/1 project object"}
	}
	if errors.Is(err, io.EOF) || errors.Is(err, io.ErrUnexpectedEOF) {
		return &FieldError{Field: "(file)", Problem: "is empty or cut short", Allowed: "a setcard/1 project object"}
	}
	return &FieldError{Field: "(file)", Problem: "is not valid JSON: " + err.Error(), Allowed: "a setcard/1 project object"}
}

func checkFormat(v any) error {
	s, ok := v.(string)
	if !ok {
		return &FieldError{Field: "format", Value: fmt.Sprint(v), Allowed: strconv.Quote(FormatVersion), Problem: "is missing or not a string"}
	}
	if s == FormatVersion {
		return nil
	}
	if rest, found := strings.CutPrefix(s, "setcard/"); found {
		if n, err := strconv.Atoi(rest); err == nil && n > 1 {
			return &FieldError{Field: "format", Value: strconv.Quote(s), Allowed: strconv.Quote(FormatVersion), Problem: "is from a newer version of Setcard than this one"}
		}
	}
	return &FieldError{Field: "format", Value: strconv.Quote(s), Allowed: strconv.Quote(FormatVersion), Problem: "is not a format this version reads"}
}

func jsonKind(t reflect.Type) string {
	for t.Kind() == reflect.Pointer {
		t = t.Elem()
	}
	switch t.Kind() {
	case reflect.Float64, reflect.Float32, reflect.Int:
		return "a number"
	case reflect.String:
		return "a string"
	case reflect.Slice, reflect.Array:
		return "a list"
	case reflect.Map, reflect.Struct:
		return "an object"
	}
	return t.String()
}

// unknownFields walks the decoded JSON beside the Go type and reports the
// first key that the type does not have, by its path.
func unknownFields(v any, t reflect.Type, path string) error {
	for t.Kind() == reflect.Pointer {
		t = t.Elem()
	}
	switch t.Kind() {
	case reflect.Struct:
		obj, ok := v.(map[string]any)
		if !ok {
			return nil // a type error, reported by Unmarshal with its path
		}
		fields := map[string]reflect.StructField{}
		for i := range t.NumField() {
			f := t.Field(i)
			name, _, _ := strings.Cut(f.Tag.Get("json"), ",")
			fields[name] = f
		}
		for _, k := range sortedKeys(obj) {
			f, ok := fields[k]
			if !ok {
				return &FieldError{Field: join(path, k), Problem: "is not a field of a setcard/1 project", Allowed: "the fields listed in README.md"}
			}
			if err := unknownFields(obj[k], f.Type, join(path, k)); err != nil {
				return err
			}
		}
	case reflect.Slice, reflect.Array:
		if list, ok := v.([]any); ok {
			for i, e := range list {
				if err := unknownFields(e, t.Elem(), fmt.Sprintf("%s[%d]", path, i)); err != nil {
					return err
				}
			}
		}
	case reflect.Map:
		if obj, ok := v.(map[string]any); ok {
			for _, k := range sortedKeys(obj) {
				if err := unknownFields(obj[k], t.Elem(), join(path, k)); err != nil {
					return err
				}
			}
		}
	}
	return nil
}

func join(path, k string) string {
	if path == "" {
		return k
	}
	return path + "." + k
}

func sortedKeys(m map[string]any) []string {
	keys := make([]string, 0, len(m))
	for k := range m {
		keys = append(keys, k)
	}
	slices.Sort(keys)
	return keys
}

// Encode writes the project as indented JSON.
func (p *Project) Encode(w io.Writer) error {
	b, err := json.MarshalIndent(p, "", "  ")
	if err != nil {
		return err
	}
	b = append(b, '\n')
	_, err = w.Write(b)
	return err
}

// Clone returns a deep copy of p.
func (p *Project) Clone() *Project {
	q := *p
	q.Hammer.RamKg = cp(p.Hammer.RamKg)
	q.Hammer.Efficiency = cp(p.Hammer.Efficiency)
	q.Hammer.Restitution = cp(p.Hammer.Restitution)
	q.DropsM = slices.Clone(p.DropsM)
	pl := &q.Pile
	for _, f := range []**float64{&pl.DiameterMm, &pl.SideMm, &pl.AreaMm2, &pl.LengthM, &pl.LengthMaxM, &pl.LengthStepM,
		&pl.DensityKgM3, &pl.ModulusMPa, &pl.MassKg, &pl.MassFraction, &pl.StrengthMPa, &pl.LimitFactor} {
		*f = cp(*f)
	}
	q.DrivenPartsKg = cp(p.DrivenPartsKg)
	q.Compression.Cap = slices.Clone(p.Compression.Cap)
	q.Compression.CqMm = cp(p.Compression.CqMm)
	q.Compression.CcMm = cp(p.Compression.CcMm)
	q.Compression.CpMm = cp(p.Compression.CpMm)
	q.Design.LoadKN = cp(p.Design.LoadKN)
	q.Design.Phi = cp(p.Design.Phi)
	q.Design.FactorOfSafety = cp(p.Design.FactorOfSafety)
	q.MinSetMm = cp(p.MinSetMm)
	if p.Zones != nil {
		z := Zones{EasyBelowMPa: cp(p.Zones.EasyBelowMPa), HardFromMPa: cp(p.Zones.HardFromMPa)}
		q.Zones = &z
	}
	if p.Tables != nil {
		t := Tables{CategoryStressMPa: slices.Clone(p.Tables.CategoryStressMPa)}
		if p.Tables.CapRowsMm != nil {
			t.CapRowsMm = make(map[string][]float64, len(p.Tables.CapRowsMm))
			for k, v := range p.Tables.CapRowsMm {
				t.CapRowsMm[k] = slices.Clone(v)
			}
		}
		q.Tables = &t
	}
	if p.Card != nil {
		c := *p.Card
		q.Card = &c
	}
	return &q
}

func cp(v *float64) *float64 {
	if v == nil {
		return nil
	}
	w := *v
	return &w
}

// F returns a pointer to v, for filling optional fields.
func F(v float64) *float64 { return &v }
