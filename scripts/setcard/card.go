package main

import (
	"bytes"
	"errors"
	"flag"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"

	"setcard/calc/chart"
	"setcard/calc/chart/svg"
)

// cmdCard writes the one-page site card as SVG, to the file named by -o or
// to stdout. Flags may come before or after the project file.
func cmdCard(args []string, stdout, stderr io.Writer) error {
	fs := flag.NewFlagSet("card", flag.ContinueOnError)
	out := fs.String("o", "", "write the card to this file (default: stdout)")
	paper := fs.String("paper", "a4", "paper size, landscape: a4 or letter")
	path, err := parseAnywhere(fs, args, stderr)
	if err != nil {
		return err
	}
	p := chart.Paper(strings.ToLower(*paper))
	if _, _, ok := chart.PaperSize(p); !ok || *paper == "" {
		return usageError{fmt.Sprintf("card: -paper %q is not a paper size; use a4 or letter", *paper)}
	}
	_, m, err := load(path)
	if err != nil {
		return err
	}
	var buf bytes.Buffer
	if err := svg.Write(&buf, chart.Card(m, chart.CardOptions{Paper: p}), svg.Options{}); err != nil {
		return fmt.Errorf("setcard: card: %w", err)
	}
	if *out == "" || *out == "-" {
		_, err := stdout.Write(buf.Bytes())
		return err
	}
	return writeFileAtomic(*out, buf.Bytes())
}

// parseAnywhere parses flags that may stand before or after the one
// positional argument, as in `card FILE -o card.svg`.
func parseAnywhere(fs *flag.FlagSet, args []string, stderr io.Writer) (string, error) {
	fs.SetOutput(stderr)
	var pos []string
	for {
		if err := fs.Parse(args); err != nil {
			if errors.Is(err, flag.ErrHelp) {
				return "", err
			}
			return "", usageError{err.Error()}
		}
		if fs.NArg() == 0 {
			break
		}
		pos = append(pos, fs.Arg(0))
		args = fs.Args()[1:]
	}
	if len(pos) != 1 {
		return "", usageError{fmt.Sprintf("%s needs exactly one project FILE, got %d arguments", fs.Name(), len(pos))}
	}
	return pos[0], nil
}

// writeFileAtomic writes data to a temporary file beside path and renames
// it into place, so that a failed write never leaves half a card.
func writeFileAtomic(path string, data []byte) error {
	f, err := os.CreateTemp(filepath.Dir(path), ".card-*.svg")
	if err != nil {
		return fmt.Errorf("setcard: card: %w", err)
	}
	_, werr := f.Write(data)
	cerr := f.Close()
	if werr == nil {
		werr = cerr
	}
	if werr == nil {
		werr = os.Chmod(f.Name(), 0o644)
	}
	if werr == nil {
		werr = os.Rename(f.Name(), path)
	}
	if werr != nil {
		os.Remove(f.Name())
		return fmt.Errorf("setcard: card: %w", werr)
	}
	return nil
}
