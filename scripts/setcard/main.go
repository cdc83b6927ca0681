// Command setcard works out set criteria for driven piles from a setcard/1
// project file, for the office engineer who makes many charts and for
// scripts.
//
//	setcard solve -set-mm S [-length-m L] [-json] FILE
//	setcard table [-json | -csv] FILE
//	setcard drop -set-mm S [-json] FILE
//	setcard card [-o card.svg] [-paper a4|letter] FILE
//
// Exit status: 0 on success, 1 when the project is invalid (the message
// names the field), 2 on bad usage.
package main

import (
	"encoding/csv"
	"encoding/json"
	"errors"
	"flag"
	"fmt"
	"io"
	"math"
	"os"
	"strconv"
	"strings"
	"text/tabwriter"

	"setcard/calc"
)

func main() { os.Exit(run(os.Args[1:], os.Stdout, os.Stderr)) }

const usage = `usage:
  setcard solve -set-mm S [-length-m L] [-json] FILE   one blow at set S (mm per blow) for each drop
  setcard table [-json | -csv] FILE                     required set for the design load at each drop and length
  setcard drop -set-mm S [-json] FILE                   drop needed for the design load at set S
  setcard card [-o card.svg] [-paper a4|letter] FILE    the one-page site card as SVG

The Hiley formula is an aid to judgement: confirm capacities as local codes
require; a licensed engineer approves the set criterion.
`

// exit codes
const (
	exitOK      = 0
	exitInvalid = 1
	exitUsage   = 2
)

// usageError is bad usage of the command, as opposed to a bad project.
type usageError struct{ msg string }

func (e usageError) Error() string { return e.msg }

func run(args []string, stdout, stderr io.Writer) int {
	if len(args) == 0 {
		fmt.Fprint(stderr, usage)
		return exitUsage
	}
	var err error
	switch args[0] {
	case "solve":
		err = cmdSolve(args[1:], stdout, stderr)
	case "table":
		err = cmdTable(args[1:], stdout, stderr)
	case "drop":
		err = cmdDrop(args[1:], stdout, stderr)
	case "card":
		err = cmdCard(args[1:], stdout, stderr)
	case "-h", "-help", "--help", "help":
		fmt.Fprint(stdout, usage)
		return exitOK
	default:
		err = usageError{fmt.Sprintf("unknown command %q", args[0])}
	}
	var ue usageError
	switch {
	case err == nil:
		return exitOK
	case errors.As(err, &ue):
		fmt.Fprintf(stderr, "setcard: %s\n%s", ue.msg, usage)
		return exitUsage
	case errors.Is(err, flag.ErrHelp):
		return exitOK
	default:
		fmt.Fprintln(stderr, "setcard: "+strings.ReplaceAll(err.Error(), "setcard: ", ""))
		return exitInvalid
	}
}

// parse parses flags and returns the one file argument.
func parse(fs *flag.FlagSet, args []string, stderr io.Writer) (string, error) {
	fs.SetOutput(stderr)
	if err := fs.Parse(args); err != nil {
		if errors.Is(err, flag.ErrHelp) {
			return "", err
		}
		return "", usageError{err.Error()}
	}
	if fs.NArg() != 1 {
		return "", usageError{fmt.Sprintf("%s needs exactly one project FILE, got %d arguments", fs.Name(), fs.NArg())}
	}
	return fs.Arg(0), nil
}

// load reads, decodes and resolves a project file.
func load(path string) (*calc.Project, *calc.Model, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, nil, fmt.Errorf("setcard: cannot open project: %w", err)
	}
	defer f.Close()
	p, err := calc.Decode(f)
	if err != nil {
		return nil, nil, fmt.Errorf("%s: %w", path, err)
	}
	m, err := calc.Resolve(p)
	if err != nil {
		return nil, nil, fmt.Errorf("%s: invalid project:\n%w", path, err)
	}
	return p, m, nil
}

func writeJSON(w io.Writer, v any) error {
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	return enc.Encode(v)
}

func num(v float64, places int) string { return strconv.FormatFloat(v, 'f', places, 64) }

func cmdSolve(args []string, stdout, stderr io.Writer) error {
	fs := flag.NewFlagSet("solve", flag.ContinueOnError)
	set := fs.Float64("set-mm", -1, "set per blow in mm")
	length := fs.Float64("length-m", 0, "pile length in m (default: every length of the project)")
	asJSON := fs.Bool("json", false, "write JSON")
	path, err := parse(fs, args, stderr)
	if err != nil {
		return err
	}
	if *set < 0 {
		return usageError{"solve needs -set-mm, the set per blow in mm (0 or more)"}
	}
	_, m, err := load(path)
	if err != nil {
		return err
	}
	lengths := m.LengthsM
	if *length > 0 {
		lengths = []float64{*length}
	}
	rows := []calc.SolveRow{}
	for _, h := range m.DropsM {
		for _, l := range lengths {
			b, err := m.BlowAt(h, *set, l)
			if err != nil {
				return err
			}
			rows = append(rows, b.Row())
		}
	}
	if *asJSON {
		return writeJSON(stdout, map[string]any{"rows": rows})
	}
	tw := tabwriter.NewWriter(stdout, 0, 0, 2, ' ', tabwriter.AlignRight)
	fmt.Fprintf(tw, "drop m\tlength m\tset mm\tη\tenergy kJ\tCc mm\tCp mm\tCq mm\tc mm\tR/A MPa\tzone\tultimate kN\tdesign kN\t\n")
	for _, r := range rows {
		fmt.Fprintf(tw, "%s\t%s\t%s\t%s\t%s\t%s\t%s\t%s\t%s\t%s\t%s\t%s\t%s\t\n",
			num(r.DropM, 2), num(r.LengthM, 2), num(r.SetMm, 2), num(r.EfficiencyOfBlow, 4), num(r.EnergyKJ, 2),
			num(r.CcMm, 2), num(r.CpMm, 2), num(r.CqMm, 2), num(r.CMm, 2), num(r.HeadStressMPa, 2), r.Zone,
			num(r.UltimateKN, 1), num(r.DesignKN, 1))
	}
	if err := tw.Flush(); err != nil {
		return err
	}
	return writeWarnings(stdout, rows, func(r calc.SolveRow) (string, []string) {
		return fmt.Sprintf("drop %s m, length %s m", num(r.DropM, 2), num(r.LengthM, 2)), r.Warnings
	})
}

func writeWarnings[T any](w io.Writer, rows []T, f func(T) (string, []string)) error {
	for _, r := range rows {
		where, ws := f(r)
		for _, msg := range ws {
			if _, err := fmt.Fprintf(w, "warning: %s: %s\n", where, msg); err != nil {
				return err
			}
		}
	}
	return nil
}

func cmdTable(args []string, stdout, stderr io.Writer) error {
	fs := flag.NewFlagSet("table", flag.ContinueOnError)
	asJSON := fs.Bool("json", false, "write JSON")
	asCSV := fs.Bool("csv", false, "write CSV")
	path, err := parse(fs, args, stderr)
	if err != nil {
		return err
	}
	if *asJSON && *asCSV {
		return usageError{"table takes -json or -csv, not both"}
	}
	_, m, err := load(path)
	if err != nil {
		return err
	}
	rows := m.TableRows()
	switch {
	case *asJSON:
		return writeJSON(stdout, map[string]any{"rows": rows})
	case *asCSV:
		cw := csv.NewWriter(stdout)
		_ = cw.Write([]string{"drop_m", "length_m", "set_mm_per_blow", "set_mm_per_10_blows", "achievable", "reason", "governs", "ultimate_kn", "design_kn", "head_stress_mpa", "zone", "impact_stress_mpa", "limit_mpa", "overstressed"})
		for _, r := range rows {
			_ = cw.Write([]string{num(r.DropM, 3), num(r.LengthM, 3), optNum(r.SetMmPerBlow), optNum(r.SetMmPer10Blows),
				strconv.FormatBool(r.Achievable), r.Reason, strconv.FormatBool(r.Governs), num(r.UltimateKN, 3), num(r.DesignKN, 3),
				num(r.HeadStressMPa, 3), string(r.Zone), num(r.ImpactStressMPa, 3), num(r.LimitMPa, 3), strconv.FormatBool(r.Overstressed)})
		}
		cw.Flush()
		return cw.Error()
	}
	fmt.Fprintf(stdout, "%s\nDesign load %s kN; %s; ultimate needed %s kN.\n\n", m.Name, num(m.LoadKN, 1), m.Convention(), num(m.RequiredUltimateKN(), 1))
	tw := tabwriter.NewWriter(stdout, 0, 0, 2, ' ', tabwriter.AlignRight)
	fmt.Fprintf(tw, "drop m\tlength m\tset mm/blow\tset mm/10 blows\tR/A MPa\tzone\timpact MPa\t \t\n")
	for _, r := range rows {
		mark := ""
		if r.Governs && len(m.LengthsM) > 1 {
			mark = "governs"
		}
		if !r.Achievable {
			mark = "NOT REACHABLE"
		}
		if r.Overstressed {
			mark += " OVERSTRESS"
		}
		fmt.Fprintf(tw, "%s\t%s\t%s\t%s\t%s\t%s\t%s\t%s\t\n", num(r.DropM, 2), num(r.LengthM, 2), optNum2(r.SetMmPerBlow), optNum2(r.SetMmPer10Blows),
			num(r.HeadStressMPa, 2), r.Zone, num(r.ImpactStressMPa, 1), strings.TrimSpace(mark))
	}
	if err := tw.Flush(); err != nil {
		return err
	}
	return writeWarnings(stdout, rows, func(r calc.TableRow) (string, []string) {
		return fmt.Sprintf("drop %s m, length %s m", num(r.DropM, 2), num(r.LengthM, 2)), r.Warnings
	})
}

func optNum(p *float64) string {
	if p == nil {
		return ""
	}
	return num(*p, 2)
}

func optNum2(p *float64) string {
	if p == nil {
		return "none"
	}
	return num(*p, 2)
}

func cmdDrop(args []string, stdout, stderr io.Writer) error {
	fs := flag.NewFlagSet("drop", flag.ContinueOnError)
	set := fs.Float64("set-mm", -1, "set per blow in mm")
	asJSON := fs.Bool("json", false, "write JSON")
	path, err := parse(fs, args, stderr)
	if err != nil {
		return err
	}
	if *set < 0 {
		return usageError{"drop needs -set-mm, the set per blow in mm (0 or more)"}
	}
	_, m, err := load(path)
	if err != nil {
		return err
	}
	type row struct {
		LengthM    float64 `json:"length_m"`
		SetMm      float64 `json:"set_mm"`
		DropM      float64 `json:"drop_m"`
		Achievable bool    `json:"achievable"`
		Reason     string  `json:"reason"`
	}
	rows := []row{}
	for _, l := range m.LengthsM {
		h, ok, why := m.DropFor(*set, l)
		rows = append(rows, row{l, *set, roundTo(h, 4), ok, why})
	}
	if *asJSON {
		return writeJSON(stdout, map[string]any{"rows": rows})
	}
	for _, r := range rows {
		if r.Achievable {
			fmt.Fprintf(stdout, "length %s m: drop %s m proves %s kN design at %s mm per blow\n", num(r.LengthM, 2), num(r.DropM, 3), num(m.LoadKN, 1), num(r.SetMm, 2))
		} else {
			fmt.Fprintf(stdout, "length %s m: %s\n", num(r.LengthM, 2), r.Reason)
		}
	}
	return nil
}

func roundTo(v float64, places int) float64 {
	p := math.Pow10(places)
	return math.Round(v*p) / p
}
