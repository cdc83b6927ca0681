package calc

import (
	"strconv"
	"strings"
)

// FieldError is bad input that the user can fix: it names the field (its
// path in the project file, such as "pile.length_m"), the value given and
// what is allowed.
type FieldError struct {
	Field   string // path in the project file, e.g. "drops_m[2]"
	Value   string // the value as given, "" when missing
	Allowed string // the allowed range or choices, e.g. "0.05 to 5 m"
	Problem string // what is wrong, e.g. "is out of range"
}

func (e *FieldError) Error() string {
	var b strings.Builder
	b.WriteString("setcard: ")
	b.WriteString(e.Field)
	if e.Value != "" {
		b.WriteString(" = ")
		b.WriteString(e.Value)
	}
	b.WriteString(" ")
	b.WriteString(e.Problem)
	if e.Allowed != "" {
		b.WriteString("; allowed: ")
		b.WriteString(e.Allowed)
	}
	return b.String()
}

// Errors is every problem found in one project. It is returned as a whole
// so that a form can mark each field at once.
type Errors []*FieldError

func (es Errors) Error() string {
	if len(es) == 0 {
		return "setcard: no errors"
	}
	msgs := make([]string, len(es))
	for i, e := range es {
		msgs[i] = e.Error()
	}
	return strings.Join(msgs, "\n")
}

// Unwrap lets errors.As find each *FieldError.
func (es Errors) Unwrap() []error {
	out := make([]error, len(es))
	for i, e := range es {
		out[i] = e
	}
	return out
}

// formatNum writes a number as a person would type it back.
func formatNum(v float64) string {
	return strconv.FormatFloat(v, 'g', -1, 64)
}

// errs collects field errors during validation.
type errs struct{ list Errors }

func (c *errs) add(field, value, allowed, problem string) {
	c.list = append(c.list, &FieldError{Field: field, Value: value, Allowed: allowed, Problem: problem})
}

// rng checks lo ≤ v ≤ hi and that v is finite. The message is built only
// when the check fails: formatting is slow under WebAssembly, and this runs
// for every field of every project a drag produces.
func (c *errs) rng(field string, v, lo, hi float64, unit string) bool {
	switch {
	case !finite(v):
		c.add(field, formatNum(v), allowedRange(lo, hi, unit), "is not a finite number")
		return false
	case v < lo || v > hi:
		c.add(field, formatNum(v), allowedRange(lo, hi, unit), "is out of range")
		return false
	}
	return true
}

func allowedRange(lo, hi float64, unit string) string {
	return formatNum(lo) + " to " + formatNum(hi) + unitSuffix(unit)
}

// need reports a missing required number.
func (c *errs) need(field string, p *float64, lo, hi float64, unit string) (float64, bool) {
	if p == nil {
		c.add(field, "", allowedRange(lo, hi, unit), "is required")
		return 0, false
	}
	return *p, c.rng(field, *p, lo, hi, unit)
}

// opt checks an optional number, returning def when it is absent.
func (c *errs) opt(field string, p *float64, def, lo, hi float64, unit string) float64 {
	if p == nil {
		return def
	}
	if !c.rng(field, *p, lo, hi, unit) {
		return def
	}
	return *p
}

func unitSuffix(unit string) string {
	if unit == "" {
		return ""
	}
	return " " + unit
}
