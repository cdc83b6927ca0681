//go:build !(js && wasm)

package e2e

import (
	"fmt"
	"image"
	"slices"
	"strconv"
	"strings"
	"testing"
	"time"

	"setcard/calc"
)

// numField is a visible numeric field of the form.
type numField struct {
	ID       string `json:"id"`
	Path     string `json:"path"`
	Optional bool   `json:"optional"`
	Value    string `json:"value"`
	Label    string `json:"label"`
}

// numFields lists the numeric fields the user sees, in page order.
func (b *browser) numFields() []numField {
	b.t.Helper()
	return eval[[]numField](b, `Array.from(document.querySelectorAll('#project-form input[data-kind="num"]'))
		.filter((f) => !f.closest("[hidden]") && f.getClientRects().length > 0)
		.map((f) => ({id: f.id, path: f.dataset.path, optional: f.dataset.optional === "true", value: f.value, label: f.dataset.label || ""}))`)
}

// The numeric fields of the demo project, which every case below must
// cover: a new field must be added to the tables of this file.
var demoNumFields = []string{
	"f-hammer-ram_kg", "f-hammer-efficiency", "f-hammer-restitution",
	"f-drops_m-0", "f-drops_m-1", "f-drops_m-2", "f-drops_m-3",
	"f-pile-diameter_mm", "f-pile-length_m", "f-pile-length_max_m", "f-pile-length_step_m",
	"f-pile-density_kg_m3", "f-pile-modulus_mpa", "f-pile-mass_kg", "f-pile-mass_fraction",
	"f-pile-strength_mpa", "f-pile-limit_factor", "f-driven_parts_kg",
	"f-compression-cq_mm", "f-design-load_kn", "f-design-phi",
	"f-min_set_mm_per_blow", "f-zones-easy_below_mpa", "f-zones-hard_from_mpa",
}

func checkFieldList(t *testing.T, fields []numField) {
	t.Helper()
	var ids []string
	for _, f := range fields {
		ids = append(ids, f.ID)
	}
	if !slices.Equal(ids, demoNumFields) {
		t.Fatalf("the visible numeric fields are\n%v\nwant\n%v", ids, demoNumFields)
	}
}

// Type a valid value, different from the demo's, in each numeric field:
// the project takes it, the table is the core's table for the new project,
// and for some fields the canvas is seen to change.
func TestTypeValidValues(t *testing.T) {
	srv := serve(t, distDir, "")
	b := newBrowser(t, 1280, 900)
	b.open(srv.URL)
	checkFieldList(t, b.numFields())

	// In order: a value may depend on the ones before it (the pile mass
	// is given for one length only, so the range is removed first).
	steps := []struct {
		id, text string
		want     float64 // NaN: the key leaves the project
		canvas   bool    // the chart must be seen to change
	}{
		{"f-hammer-ram_kg", "650", 650, true},
		{"f-hammer-efficiency", "0.75", 0.75, false},
		{"f-hammer-restitution", "0.3", 0.3, false},
		{"f-drops_m-0", "0.5", 0.5, false},
		{"f-drops_m-1", "0.8", 0.8, false},
		{"f-drops_m-2", "1.1", 1.1, false},
		{"f-drops_m-3", "1.4", 1.4, true},
		{"f-pile-diameter_mm", "275", 275, false},
		{"f-pile-length_m", "5.5", 5.5, false},
		{"f-pile-length_max_m", "10", 10, true},
		{"f-pile-length_step_m", "1.25", 1.25, false},
		{"f-pile-density_kg_m3", "850", 850, false},
		{"f-pile-modulus_mpa", "10000", 10000, false},
		{"f-pile-mass_fraction", "0.8", 0.8, false},
		{"f-pile-strength_mpa", "30", 30, false},
		{"f-pile-limit_factor", "0.9", 0.9, false},
		{"f-driven_parts_kg", "60", 60, false},
		{"f-compression-cq_mm", "2", 2, false},
		{"f-design-load_kn", "120", 120, true},
		{"f-design-phi", "0.6", 0.6, false},
		{"f-min_set_mm_per_blow", "1", 1, false},
		{"f-zones-easy_below_mpa", "6", 6, false},
		{"f-zones-hard_from_mpa", "15", 15, false},
		{"f-pile-length_step_m", "", nan, false},
		{"f-pile-length_max_m", "", nan, false},
		{"f-pile-mass_kg", "320", 320, false},
	}
	covered := map[string]bool{}
	for _, s := range steps {
		covered[s.id] = true
	}
	for _, id := range demoNumFields {
		if !covered[id] {
			t.Errorf("no valid value is typed into %s", id)
		}
	}
	fields := map[string]numField{}
	for _, f := range b.numFields() {
		fields[f.ID] = f
	}
	for _, s := range steps {
		f := fields[s.id]
		before := b.state()
		var shot0 image.Image
		if s.canvas {
			shot0 = b.frameShot()
		}
		b.typeInto(s.id, s.text)
		cond := fmt.Sprintf(`(() => { const p = window.setcard.state().project; return String(JSON.stringify(%s)) })() === %q`, jsPath("p", f.Path), jsNum(s.want))
		if !b.poll(cond, 10*time.Second) {
			got, ok := at(b.state().Project, f.Path)
			t.Fatalf("typing %q into %s: the project's %s is %v (present %v), want %s; message: %q",
				s.text, s.id, f.Path, got, ok, jsNum(s.want), eval[string](b, fmt.Sprintf(`document.getElementById(%q).textContent`, s.id+"-msg")))
		}
		after := b.state()
		if !sameRows(after.Rows, coreRows(t, after.Project)) {
			t.Errorf("typing %q into %s: the rows are not the core's rows for the page's project\n%s", s.text, s.id, rowsJSON(after))
		}
		if sameRows(after.Rows, before.Rows) && s.canvas {
			t.Errorf("typing %q into %s did not change the table", s.text, s.id)
		}
		if msg := eval[string](b, `Array.from(document.querySelectorAll("#project-form .msg")).map((m) => m.textContent).join("")`); msg != "" {
			t.Errorf("typing %q into %s: the form shows %q", s.text, s.id, msg)
		}
		// The table on the page shows the new criteria.
		table := eval[string](b, `document.getElementById("set-table-body").innerText`)
		for _, v := range governingSets(after) {
			if !strings.Contains(table, v) {
				t.Errorf("typing %q into %s: the table does not show the criterion %s:\n%s", s.text, s.id, v, table)
			}
		}
		if s.canvas {
			changed := 0
			for deadline := time.Now().Add(5 * time.Second); time.Now().Before(deadline); time.Sleep(150 * time.Millisecond) {
				if changed = differ(shot0, b.frameShot()); changed >= 500 {
					break
				}
			}
			if changed < 500 {
				t.Errorf("typing %q into %s: the canvas changed in only %d pixels", s.text, s.id, changed)
			}
		}
	}
	// The form shows the project it holds.
	for _, s := range steps[len(steps)-3:] {
		if got := eval[string](b, fmt.Sprintf(`document.getElementById(%q).value`, s.id)); got != s.text {
			t.Errorf("%s shows %q, want %q", s.id, got, s.text)
		}
	}
}

// steadyFrameShot is a screenshot of the chart once two in a row agree.
func (b *browser) steadyFrameShot() image.Image {
	b.t.Helper()
	shot := b.frameShot()
	for range 20 {
		time.Sleep(150 * time.Millisecond)
		next := b.frameShot()
		if differ(shot, next) == 0 {
			return next
		}
		shot = next
	}
	b.t.Fatalf("the chart does not keep still")
	return nil
}

var nan = func() float64 { v, _ := strconv.ParseFloat("NaN", 64); return v }()

// jsPath is a JavaScript expression for a form path under obj.
func jsPath(obj, path string) string {
	p := obj
	for _, part := range strings.Split(path, ".") {
		if i := strings.Index(part, "["); i >= 0 {
			p += fmt.Sprintf("?.[%q]?.%s", part[:i], part[i:])
		} else {
			p += fmt.Sprintf("?.[%q]", part)
		}
	}
	return p
}

// jsNum is a number as JSON.stringify gives it; NaN stands for an absent
// key, which String(JSON.stringify(undefined)) gives as "undefined".
func jsNum(v float64) string {
	if v != v {
		return "undefined"
	}
	return strconv.FormatFloat(v, 'f', -1, 64)
}

// rangeText is how a message names the allowed range of a field.
func rangeText(path string) string {
	key := path
	if i := strings.Index(key, "["); i >= 0 {
		key = key[:i]
	}
	r, ok := calc.InputRanges()[key]
	if !ok {
		return " to "
	}
	s := strconv.FormatFloat(r.Min, 'f', -1, 64) + " to " + strconv.FormatFloat(r.Max, 'f', -1, 64)
	if r.Unit != "" {
		s += " " + r.Unit
	}
	return s
}

// Bad input in each numeric field: the message beside the field names the
// allowed range, the typed text stays, the project, the table and the
// chart stay as they were; a valid value clears the message.
func TestBadInput(t *testing.T) {
	srv := serve(t, distDir, "")
	b := newBrowser(t, 1280, 900)
	b.open(srv.URL)
	fields := b.numFields()
	checkFieldList(t, fields)
	base := b.state()
	baseProject := canon(base.Project)
	baseTable := eval[string](b, `document.getElementById("set-table-body").innerText`)

	for _, f := range fields {
		bad := []string{"-1", "abc", "1e9", "NaN", "1,5"}
		if !f.Optional {
			bad = append([]string{""}, bad...)
		}
		msgJS := fmt.Sprintf(`document.getElementById(%q).textContent`, f.ID+"-msg")
		var shot image.Image
		if f.ID == "f-hammer-ram_kg" || f.ID == "f-design-load_kn" {
			shot = b.steadyFrameShot()
		}
		for _, text := range bad {
			// In one input event: typing "1e9" key by key would show the
			// page the valid "1" on the way.
			b.pasteInto(f.ID, text)
			seen := fmt.Sprintf("%q", text)
			if text == "" {
				seen = "required"
			}
			if !b.poll(fmt.Sprintf(`%s.includes(%q)`, msgJS, seen), 5*time.Second) {
				t.Errorf("%s = %q: the message beside the field is %q, want one that quotes the input (the field's other bad values are not tried)", f.ID, text, eval[string](b, msgJS))
				break
			}
			msg := eval[string](b, msgJS)
			if want := rangeText(f.Path); !strings.Contains(msg, want) {
				t.Errorf("%s = %q: the message %q does not name the allowed range %q", f.ID, text, msg, want)
			}
			if got := eval[string](b, fmt.Sprintf(`document.getElementById(%q).value`, f.ID)); got != text {
				t.Errorf("%s = %q: the field now holds %q", f.ID, text, got)
			}
			// Only that field is marked.
			others := eval[[]string](b, fmt.Sprintf(`Array.from(document.querySelectorAll("#project-form .msg")).filter((m) => m.id !== %q && m.textContent !== "").map((m) => m.id + ": " + m.textContent)`, f.ID+"-msg"))
			if len(others) > 0 {
				t.Errorf("%s = %q: other messages shown: %q", f.ID, text, others)
			}
			if eval[string](b, `document.getElementById("form-status").textContent`) == "" {
				t.Errorf("%s = %q: the form does not say that the input was not applied", f.ID, text)
			}
			st := b.state()
			if got := canon(st.Project); got != baseProject {
				t.Errorf("%s = %q: the project changed:\n%s\nwas\n%s", f.ID, text, got, baseProject)
			}
			if !sameRows(st.Rows, base.Rows) {
				t.Errorf("%s = %q: the rows changed", f.ID, text)
			}
			if got := eval[string](b, `document.getElementById("set-table-body").innerText`); got != baseTable {
				t.Errorf("%s = %q: the table on the page changed:\n%s", f.ID, text, got)
			}
		}
		if shot != nil {
			time.Sleep(300 * time.Millisecond)
			if n := differ(shot, b.frameShot()); n > 0 {
				t.Errorf("after bad input in %s the chart changed in %d pixels", f.ID, n)
			}
		}
		// The valid value back: the message goes, the project is as before.
		b.pasteInto(f.ID, f.Value)
		if !b.poll(msgJS+` === "" && document.getElementById("form-status").textContent === ""`, 5*time.Second) {
			t.Errorf("%s back to %q: the message stays: %q", f.ID, f.Value, eval[string](b, msgJS))
		}
		if got := canon(b.state().Project); got != baseProject {
			t.Errorf("%s back to %q: the project is\n%s\nwas\n%s", f.ID, f.Value, got, baseProject)
		}
	}
}
