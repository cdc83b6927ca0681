package main

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"setcard/calc"
)

func runCmd(args ...string) (code int, out, errOut string) {
	var o, e bytes.Buffer
	code = run(args, &o, &e)
	return code, o.String(), e.String()
}

func TestExitCodes(t *testing.T) {
	dir := t.TempDir()
	bad := filepath.Join(dir, "bad.json")
	if err := os.WriteFile(bad, []byte(`{"format":"setcard/1","hammer":{"ram_kg":5}}`), 0o644); err != nil {
		t.Fatal(err)
	}
	cases := []struct {
		args []string
		code int
		want string
	}{
		{[]string{"table", "../../testdata/demo.json"}, exitOK, "set mm/10 blows"},
		{[]string{"table"}, exitUsage, "exactly one project FILE"},
		{[]string{"frobnicate"}, exitUsage, "unknown command"},
		{nil, exitUsage, "usage"},
		{[]string{"solve", "../../testdata/demo.json"}, exitUsage, "-set-mm"},
		{[]string{"table", "-json", "-csv", "../../testdata/demo.json"}, exitUsage, "not both"},
		{[]string{"table", "-nope", "../../testdata/demo.json"}, exitUsage, "flag provided but not defined"},
		{[]string{"table", bad}, exitInvalid, "hammer.ram_kg = 5 is out of range; allowed: 50 to 20000 kg"},
		{[]string{"table", filepath.Join(dir, "missing.json")}, exitInvalid, "cannot open project"},
	}
	for _, c := range cases {
		code, out, errOut := runCmd(c.args...)
		if code != c.code || !strings.Contains(out+errOut, c.want) {
			t.Errorf("setcard %v: exit %d, output %q%q; want exit %d and %q", c.args, code, out, errOut, c.code, c.want)
		}
		if strings.Contains(errOut, "goroutine") || strings.Contains(errOut, "panic") {
			t.Errorf("setcard %v: stack trace in output", c.args)
		}
	}
}

// The table rows the command writes are the core's rows.
func TestTableJSONIsCoreRows(t *testing.T) {
	code, out, errOut := runCmd("table", "-json", "../../testdata/demo.json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	var got struct{ Rows []calc.TableRow }
	if err := json.Unmarshal([]byte(out), &got); err != nil {
		t.Fatal(err)
	}
	b, _ := os.ReadFile("../../testdata/demo.json")
	p, _ := calc.DecodeBytes(b)
	m, err := calc.Resolve(p)
	if err != nil {
		t.Fatal(err)
	}
	want := m.TableRows()
	if len(got.Rows) != len(want) {
		t.Fatalf("%d rows, want %d", len(got.Rows), len(want))
	}
	for i := range want {
		g, w := got.Rows[i], want[i]
		if g.DropM != w.DropM || g.LengthM != w.LengthM || *g.SetMmPer10Blows != *w.SetMmPer10Blows || g.Governs != w.Governs {
			t.Errorf("row %d = %+v, want %+v", i, g, w)
		}
	}
	for _, key := range []string{"drop_m", "length_m", "set_mm_per_blow", "set_mm_per_10_blows", "achievable", "reason"} {
		if !strings.Contains(out, `"`+key+`"`) {
			t.Errorf("table -json lacks key %q", key)
		}
	}
}

func TestSolveJSONKeys(t *testing.T) {
	code, out, errOut := runCmd("solve", "-set-mm", "4", "-json", "../../testdata/demo.json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	var got struct{ Rows []map[string]any }
	if err := json.Unmarshal([]byte(out), &got); err != nil {
		t.Fatal(err)
	}
	if len(got.Rows) != 4*3 {
		t.Fatalf("%d rows, want 12 (4 drops × 3 lengths)", len(got.Rows))
	}
	for _, key := range []string{"drop_m", "efficiency_of_blow", "energy_kj", "cc_mm", "cp_mm", "cq_mm", "c_mm", "head_stress_mpa", "zone", "ultimate_kn", "design_kn", "warnings"} {
		if _, ok := got.Rows[0][key]; !ok {
			t.Errorf("solve -json row lacks %q", key)
		}
	}
}

func TestCSVAndDrop(t *testing.T) {
	code, out, _ := runCmd("table", "-csv", "../../testdata/demo.json")
	if code != 0 || !strings.HasPrefix(out, "drop_m,length_m,set_mm_per_blow") || strings.Count(out, "\n") != 13 {
		t.Errorf("table -csv: exit %d, output %q", code, out)
	}
	code, out, _ = runCmd("drop", "-set-mm", "5", "../../testdata/demo.json")
	if code != 0 || !strings.Contains(out, "drop") {
		t.Errorf("drop: exit %d, output %q", code, out)
	}
}
