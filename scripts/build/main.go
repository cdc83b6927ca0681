// Command build turns the Setcard sources into the static site in dist/:
// it compiles the WebAssembly core, minifies the text files, gives every
// asset a content-hashed name, fills in the service worker's file list and
// writes precompressed .gz and .br copies.
//
// Usage, from the module root:
//
//	go run ./scripts/build [-o dist] [-site site] [-wasm ./wasm]
package main

import (
	"context"
	"errors"
	"flag"
	"fmt"
	"io"
	"os"
	"os/signal"
	"syscall"
	"text/tabwriter"
)

func main() { os.Exit(run(os.Args[1:], os.Stdout, os.Stderr)) }

// run parses the flags, builds the site and prints a summary. It returns
// the process exit code: 0 on success, 1 when the build fails, 2 for a
// usage error.
func run(args []string, stdout, stderr io.Writer) int {
	opts, err := parseFlags(args, stderr)
	if errors.Is(err, flag.ErrHelp) {
		return 0
	}
	if err != nil {
		return 2
	}
	ctx, stop := signal.NotifyContext(context.Background(), os.Interrupt, syscall.SIGTERM)
	defer stop()
	res, err := Build(ctx, opts)
	if err != nil {
		fmt.Fprintf(stderr, "build: %v\n", err)
		return 1
	}
	if err := writeSummary(stdout, res); err != nil {
		fmt.Fprintf(stderr, "build: %v\n", err)
		return 1
	}
	return 0
}

// parseFlags reads the command line into Options.
func parseFlags(args []string, stderr io.Writer) (Options, error) {
	fs := flag.NewFlagSet("build", flag.ContinueOnError)
	fs.SetOutput(stderr)
	opts := Options{Log: stderr}
	fs.StringVar(&opts.OutDir, "o", "dist", "output `directory`, emptied first (only if it is empty or holds a previous build)")
	fs.StringVar(&opts.SiteDir, "site", "site", "`directory` of the site sources (index.html, sw.js, ...)")
	fs.StringVar(&opts.WasmPkg, "wasm", "./wasm", "Go `package` of the WebAssembly main")
	fs.BoolVar(&opts.KeepNames, "names", false, "keep Go function names in the .wasm, for profiling in the browser")
	fs.Usage = func() {
		fmt.Fprintln(fs.Output(), "usage: go run ./scripts/build [-o dist] [-site site] [-wasm ./wasm] [-names]")
		fs.PrintDefaults()
	}
	if err := fs.Parse(args); err != nil {
		return opts, err
	}
	if fs.NArg() > 0 {
		err := fmt.Errorf("unexpected arguments: %q", fs.Args())
		fmt.Fprintf(stderr, "build: %v\n", err)
		fs.Usage()
		return opts, err
	}
	return opts, nil
}

// writeSummary prints every built file with its raw, gzip and brotli sizes,
// and what a first visit transfers with brotli.
func writeSummary(w io.Writer, res *Result) error {
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintf(tw, "file\traw\tgzip\tbrotli\t\n")
	for _, f := range res.Files {
		fmt.Fprintf(tw, "%s\t%d\t%s\t%s\t\n", f.Name, f.Raw, sizeOrDash(f.Gzip), sizeOrDash(f.Brotli))
	}
	if err := tw.Flush(); err != nil {
		return err
	}
	_, err := fmt.Fprintf(w, "version %s: %d files in %s; first visit transfers %d bytes with brotli (%d files cached by the service worker)\n",
		res.Version, len(res.Files), res.OutDir, res.FirstVisit, len(res.Precache))
	return err
}

func sizeOrDash(n int64) string {
	if n == 0 {
		return "-"
	}
	return fmt.Sprint(n)
}
