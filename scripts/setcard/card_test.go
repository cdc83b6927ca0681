package main

import (
	"bytes"
	"encoding/xml"
	"io"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

var demo = filepath.Join("..", "..", "testdata", "demo.json")

// wellFormed fails the test unless data is well-formed XML.
func wellFormed(t *testing.T, data []byte) {
	t.Helper()
	dec := xml.NewDecoder(bytes.NewReader(data))
	for {
		_, err := dec.Token()
		if err == io.EOF {
			return
		}
		if err != nil {
			t.Fatalf("card is not well-formed XML: %v", err)
		}
	}
}

// TestCardCommand runs `setcard card` the ways the usage allows: to stdout,
// to a file with -o before or after the project, on both papers; and the
// ways it refuses: a bad paper or extra arguments (usage, exit 2), a
// missing project (exit 1).
func TestCardCommand(t *testing.T) {
	dir := t.TempDir()
	out := filepath.Join(dir, "card.svg")
	cases := []struct {
		args   []string
		code   int
		stdout string // a part of what stdout holds, when writing there
		file   string // a part of what the -o file holds
		stderr string
	}{
		{args: []string{"card", demo}, code: exitOK, stdout: `width="297mm"`},
		{args: []string{"card", "-paper", "letter", demo}, code: exitOK, stdout: `width="279.4mm"`},
		{args: []string{"card", "-paper", "LETTER", demo}, code: exitOK, stdout: `height="215.9mm"`},
		{args: []string{"card", demo, "-o", out}, code: exitOK, file: `width="297mm"`},
		{args: []string{"card", "-o", out, "-paper", "letter", demo}, code: exitOK, file: `width="279.4mm"`},
		{args: []string{"card", demo, "-o", "-"}, code: exitOK, stdout: "<svg"},
		{args: []string{"card", "-paper", "a3", demo}, code: exitUsage, stderr: `-paper "a3" is not a paper size`},
		{args: []string{"card", "-paper", "", demo}, code: exitUsage, stderr: "is not a paper size"},
		{args: []string{"card", demo, demo}, code: exitUsage, stderr: "exactly one project FILE"},
		{args: []string{"card"}, code: exitUsage, stderr: "exactly one project FILE"},
		{args: []string{"card", "-colour", demo}, code: exitUsage, stderr: "flag provided but not defined"},
		{args: []string{"card", filepath.Join(dir, "missing.json")}, code: exitInvalid, stderr: "cannot open project"},
		{args: []string{"card", demo, "-o", filepath.Join(dir, "no", "such", "dir", "card.svg")}, code: exitInvalid, stderr: "card:"},
	}
	for _, c := range cases {
		os.Remove(out)
		var stdout, stderr bytes.Buffer
		code := run(c.args, &stdout, &stderr)
		if code != c.code {
			t.Errorf("run(%q) = %d, want %d; stderr: %s", c.args, code, c.code, stderr.String())
			continue
		}
		if c.stdout != "" {
			if !strings.Contains(stdout.String(), c.stdout) {
				t.Errorf("run(%q) stdout does not hold %q", c.args, c.stdout)
			}
			wellFormed(t, stdout.Bytes())
		}
		if c.file != "" {
			data, err := os.ReadFile(out)
			if err != nil {
				t.Errorf("run(%q): %v", c.args, err)
				continue
			}
			if !strings.Contains(string(data), c.file) {
				t.Errorf("run(%q) file does not hold %q", c.args, c.file)
			}
			wellFormed(t, data)
			if stdout.Len() != 0 {
				t.Errorf("run(%q) wrote %d bytes to stdout as well as the file", c.args, stdout.Len())
			}
		}
		if c.stderr != "" && !strings.Contains(stderr.String(), c.stderr) {
			t.Errorf("run(%q) stderr = %q, want it to hold %q", c.args, stderr.String(), c.stderr)
		}
	}
	// A failed write leaves no temporary file behind.
	entries, err := os.ReadDir(dir)
	if err != nil {
		t.Fatal(err)
	}
	for _, e := range entries {
		if strings.HasPrefix(e.Name(), ".card-") {
			t.Errorf("temporary file %s left behind", e.Name())
		}
	}
}

// TestCardInvalidProject checks that an invalid project is refused with
// exit status 1 and a message naming the field.
func TestCardInvalidProject(t *testing.T) {
	path := filepath.Join(t.TempDir(), "bad.json")
	bad := `{"format": "setcard/1", "name": "x", "hammer": {"ram_kg": 500}, "drops_m": [9],
	  "pile": {"material": "timber", "diameter_mm": 250, "length_m": 6},
	  "compression": {"cap": [], "cq_mm": 2.5}, "design": {"load_kn": 100, "phi": 0.5}}`
	if err := os.WriteFile(path, []byte(bad), 0o644); err != nil {
		t.Fatal(err)
	}
	var stdout, stderr bytes.Buffer
	if code := run([]string{"card", path}, &stdout, &stderr); code != exitInvalid || !strings.Contains(stderr.String(), "drops_m[0]") {
		t.Errorf("run(card, bad project) = %d, stderr %q; want %d naming drops_m[0]", code, stderr.String(), exitInvalid)
	}
	if stdout.Len() != 0 {
		t.Errorf("run(card, bad project) wrote %d bytes to stdout", stdout.Len())
	}
}
