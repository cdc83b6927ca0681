// Command serve serves the built Setcard site (dist/) for local use and
// testing, the way a static host should: precompressed files, long-lived
// caching of the content-hashed assets and the site's security headers.
//
// Usage, from the module root after `go run ./scripts/build`:
//
//	go run ./scripts/serve [-addr 127.0.0.1:8080] [-dir dist]
package main

import (
	"context"
	"errors"
	"flag"
	"fmt"
	"io"
	"log"
	"net"
	"net/http"
	"os"
	"os/signal"
	"syscall"
	"time"
)

func main() { os.Exit(run(os.Args[1:], os.Stdout, os.Stderr)) }

// Options are the command-line settings.
type Options struct {
	Addr string // address to listen on, host:port
	Dir  string // directory to serve
}

// shutdownTimeout bounds how long open requests may run once a stop is
// asked for.
const shutdownTimeout = 5 * time.Second

// run serves until SIGINT or SIGTERM and returns the exit code.
func run(args []string, stdout, stderr io.Writer) int {
	ctx, stop := signal.NotifyContext(context.Background(), os.Interrupt, syscall.SIGTERM)
	defer stop()
	return runContext(ctx, args, stdout, stderr)
}

// runContext serves until ctx is done and returns the exit code: 0 after a
// clean shutdown, 1 on failure, 2 for a usage error.
func runContext(ctx context.Context, args []string, stdout, stderr io.Writer) int {
	opts, err := parseFlags(args, stderr)
	if errors.Is(err, flag.ErrHelp) {
		return 0
	}
	if err != nil {
		return 2
	}
	h, err := newHandler(opts.Dir)
	if err != nil {
		fmt.Fprintf(stderr, "serve: %v\n", err)
		return 1
	}
	defer h.Close()
	ln, err := net.Listen("tcp", opts.Addr)
	if err != nil {
		fmt.Fprintf(stderr, "serve: %v\n", err)
		return 1
	}
	if err := serve(ctx, ln, h, stdout, stderr); err != nil {
		fmt.Fprintf(stderr, "serve: %v\n", err)
		return 1
	}
	return 0
}

// parseFlags reads the command line into Options.
func parseFlags(args []string, stderr io.Writer) (Options, error) {
	fs := flag.NewFlagSet("serve", flag.ContinueOnError)
	fs.SetOutput(stderr)
	var opts Options
	fs.StringVar(&opts.Addr, "addr", "127.0.0.1:8080", "`host:port` to listen on (port 0 picks a free one)")
	fs.StringVar(&opts.Dir, "dir", "dist", "`directory` to serve, as written by scripts/build")
	fs.Usage = func() {
		fmt.Fprintln(fs.Output(), "usage: go run ./scripts/serve [-addr 127.0.0.1:8080] [-dir dist]")
		fs.PrintDefaults()
	}
	if err := fs.Parse(args); err != nil {
		return opts, err
	}
	if fs.NArg() > 0 {
		err := fmt.Errorf("unexpected arguments: %q", fs.Args())
		fmt.Fprintf(stderr, "serve: %v\n", err)
		fs.Usage()
		return opts, err
	}
	return opts, nil
}

// serve announces the address of ln on stdout, then serves h on it until
// ctx is done and shuts down, letting open requests finish.
func serve(ctx context.Context, ln net.Listener, h http.Handler, stdout, stderr io.Writer) error {
	srv := &http.Server{
		Handler:           h,
		ReadHeaderTimeout: 10 * time.Second,
		IdleTimeout:       2 * time.Minute,
		ErrorLog:          log.New(stderr, "serve: ", 0),
	}
	errc := make(chan error, 1)
	go func() { errc <- srv.Serve(ln) }()
	fmt.Fprintf(stdout, "Setcard is being served at http://%s/\n", ln.Addr())
	select {
	case err := <-errc:
		return err
	case <-ctx.Done():
	}
	sctx, cancel := context.WithTimeout(context.Background(), shutdownTimeout)
	defer cancel()
	err := srv.Shutdown(sctx)
	if serr := <-errc; !errors.Is(serr, http.ErrServerClosed) && err == nil {
		err = serr
	}
	return err
}
