//go:build !(js && wasm)

package e2e

import (
	"bufio"
	"context"
	"fmt"
	"net/url"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"sync"
	"testing"
	"time"

	"github.com/chromedp/cdproto/cdp"
	"github.com/chromedp/cdproto/network"
	"github.com/chromedp/cdproto/runtime"
	"github.com/chromedp/chromedp"
)

// The suite's shared state, set up once in TestMain.
var (
	root     string // the repository
	distDir  string // the built site
	binDir   string // the built programs
	chromium string
)

func TestMain(m *testing.M) {
	os.Exit(setup(m))
}

func setup(m *testing.M) int {
	wd, err := os.Getwd()
	if err != nil {
		fmt.Fprintln(os.Stderr, err)
		return 1
	}
	root = filepath.Clean(filepath.Join(wd, "..", ".."))
	chromium = findChromium()
	if chromium == "" {
		fmt.Fprintln(os.Stderr, "e2e: Chromium is not installed. The browser suite needs it:\n"+
			"    apt-get update && apt-get install -y chromium poppler-utils\n"+
			"(or set CHROMIUM to its path)")
		return 1
	}
	tmp, err := os.MkdirTemp("", "setcard-e2e-")
	if err != nil {
		fmt.Fprintln(os.Stderr, err)
		return 1
	}
	defer os.RemoveAll(tmp)
	binDir = filepath.Join(tmp, "bin")
	distDir = filepath.Join(tmp, "dist")
	for _, prog := range []string{"build", "serve"} {
		cmd := exec.Command("go", "build", "-o", filepath.Join(binDir, prog), "./scripts/"+prog)
		cmd.Dir = root
		if out, err := cmd.CombinedOutput(); err != nil {
			fmt.Fprintf(os.Stderr, "e2e: building %s: %v\n%s", prog, err, out)
			return 1
		}
	}
	if err := buildSite(distDir, filepath.Join(root, "site")); err != nil {
		fmt.Fprintln(os.Stderr, "e2e:", err)
		return 1
	}
	return m.Run()
}

func findChromium() string {
	if p := os.Getenv("CHROMIUM"); p != "" {
		return p
	}
	for _, name := range []string{"chromium", "chromium-browser", "google-chrome"} {
		if p, err := exec.LookPath(name); err == nil {
			return p
		}
	}
	return ""
}

// buildSite runs scripts/build from a site folder into out.
func buildSite(out, site string) error {
	cmd := exec.Command(filepath.Join(binDir, "build"), "-o", out, "-site", site, "-wasm", "./wasm")
	cmd.Dir = root
	if b, err := cmd.CombinedOutput(); err != nil {
		return fmt.Errorf("building the site: %v\n%s", err, b)
	}
	return nil
}

// server is scripts/serve running on an unused loopback port.
type server struct {
	cmd  *exec.Cmd
	URL  string
	done chan struct{}
}

// serve starts scripts/serve on dir, on 127.0.0.1 and a port the system
// picks (or addr, to restart on the same port).
func serve(t testing.TB, dir, addr string) *server {
	t.Helper()
	if addr == "" {
		addr = "127.0.0.1:0"
	}
	cmd := exec.Command(filepath.Join(binDir, "serve"), "-addr", addr, "-dir", dir)
	stdout, err := cmd.StdoutPipe()
	if err != nil {
		t.Fatal(err)
	}
	cmd.Stderr = os.Stderr
	if err := cmd.Start(); err != nil {
		t.Fatal(err)
	}
	s := &server{cmd: cmd, done: make(chan struct{})}
	lines := bufio.NewScanner(stdout)
	found := make(chan string, 1)
	go func() {
		for lines.Scan() {
			if i := strings.Index(lines.Text(), "http://"); i >= 0 {
				select {
				case found <- strings.TrimSpace(lines.Text()[i:]):
				default:
				}
			}
		}
		close(s.done)
	}()
	select {
	case u := <-found:
		s.URL = u
	case <-time.After(30 * time.Second):
		_ = cmd.Process.Kill()
		t.Fatal("scripts/serve printed no address in 30 s")
	}
	t.Cleanup(s.stop)
	return s
}

func (s *server) stop() {
	if s.cmd.ProcessState != nil {
		return
	}
	_ = s.cmd.Process.Signal(os.Interrupt)
	select {
	case <-s.done:
	case <-time.After(5 * time.Second):
		_ = s.cmd.Process.Kill()
	}
	_ = s.cmd.Wait()
}

// Addr is the server's host:port.
func (s *server) Addr() string {
	u, _ := url.Parse(s.URL)
	return u.Host
}

// browser is one headless Chromium with a fresh profile, and what its
// pages said.
type browser struct {
	t        testing.TB
	ctx      context.Context
	cancel   context.CancelFunc
	mu       sync.Mutex
	console  []string
	requests []string
}

// newBrowser starts Chromium with the flags DEVELOPERS.md lists, any extra
// options, and a viewport of w × h CSS px.
func newBrowser(t testing.TB, w, h int, extra ...chromedp.ExecAllocatorOption) *browser {
	t.Helper()
	profile := t.TempDir()
	opts := []chromedp.ExecAllocatorOption{
		chromedp.ExecPath(chromium),
		chromedp.UserDataDir(profile),
		chromedp.NoFirstRun,
		chromedp.NoDefaultBrowserCheck,
		chromedp.Headless,
		chromedp.Flag("no-sandbox", true),
		chromedp.Flag("disable-background-networking", true),
		chromedp.Flag("disable-component-update", true),
		chromedp.Flag("disable-sync", true),
		chromedp.Flag("disable-quic", true),
		chromedp.Flag("use-angle", "swiftshader"),
		chromedp.Flag("enable-unsafe-swiftshader", true),
		chromedp.Flag("disable-dev-shm-usage", true),
		chromedp.WindowSize(w, h),
	}
	opts = append(opts, extra...)
	actx, acancel := chromedp.NewExecAllocator(context.Background(), opts...)
	b := &browser{t: t}
	ctx, cancel := chromedp.NewContext(actx, chromedp.WithListener(b.listen))
	b.ctx = ctx
	b.cancel = func() { cancel(); acancel() }
	if err := chromedp.Do(ctx, chromedp.Func(func(ctx context.Context, tg *chromedp.Target) error {
		_, err := cdp.Call(ctx, tg, network.Enable, network.EnableParams{})
		return err
	}), chromedp.EmulateViewport(int64(w), int64(h))); err != nil {
		b.cancel()
		t.Fatalf("starting Chromium (%s): %v", chromium, err)
	}
	t.Cleanup(func() {
		if t.Failed() {
			b.evidence()
		}
		b.cancel()
	})
	return b
}

func (b *browser) listen(ev any) {
	switch e := ev.(type) {
	case *runtime.EventConsoleAPICalled:
		var parts []string
		for _, a := range e.Args {
			parts = append(parts, string(a.Value))
		}
		b.log(fmt.Sprintf("console.%s: %s", e.Type, strings.Join(parts, " ")))
	case *runtime.EventExceptionThrown:
		b.log(fmt.Sprintf("exception: %s", e.ExceptionDetails.Text))
	case *network.EventRequestWillBeSent:
		b.mu.Lock()
		b.requests = append(b.requests, e.Request.URL)
		b.mu.Unlock()
	}
}

func (b *browser) log(s string) {
	b.mu.Lock()
	b.console = append(b.console, s)
	b.mu.Unlock()
}

// evidenceDir is where a failing test leaves its screenshot and console.
func (b *browser) evidenceDir() string {
	return filepath.Join(root, "test-evidence", strings.ReplaceAll(b.t.Name(), "/", "_"))
}

// evidence writes a screenshot and the console to test-evidence/<test>/.
func (b *browser) evidence() {
	dir := b.evidenceDir()
	if err := os.MkdirAll(dir, 0o755); err != nil {
		b.t.Logf("evidence: %v", err)
		return
	}
	ctx, cancel := context.WithTimeout(b.ctx, 10*time.Second)
	defer cancel()
	if png, err := chromedp.Run(ctx, chromedp.FullScreenshot(100)); err == nil {
		_ = os.WriteFile(filepath.Join(dir, "screenshot.png"), png, 0o644)
	}
	b.mu.Lock()
	text := strings.Join(b.console, "\n") + "\n\nrequests:\n" + strings.Join(b.requests, "\n") + "\n"
	b.mu.Unlock()
	_ = os.WriteFile(filepath.Join(dir, "console.txt"), []byte(text), 0o644)
	b.t.Logf("evidence (screenshot, console, requests) written to %s", dir)
}

// do runs actions with a time limit, failing the test on error.
func (b *browser) do(what string, actions ...chromedp.Action[chromedp.Void]) {
	b.t.Helper()
	ctx, cancel := context.WithTimeout(b.ctx, 60*time.Second)
	defer cancel()
	if err := chromedp.Do(ctx, actions...); err != nil {
		b.t.Fatalf("%s: %v (evidence: %s)", what, err, b.evidenceDir())
	}
}

// eval evaluates a JavaScript expression in the page, awaiting a promise,
// and decodes its value.
func eval[T any](b *browser, expr string) T {
	b.t.Helper()
	ctx, cancel := context.WithTimeout(b.ctx, 60*time.Second)
	defer cancel()
	v, err := chromedp.Run(ctx, chromedp.Evaluate[T](expr, chromedp.EvalAwaitPromise))
	if err != nil {
		b.t.Fatalf("evaluating %s: %v (evidence: %s)", expr, err, b.evidenceDir())
	}
	return v
}

// waitFor polls a JavaScript condition until it is true.
func (b *browser) waitFor(what, cond string, timeout time.Duration) {
	b.t.Helper()
	deadline := time.Now().Add(timeout)
	for {
		ctx, cancel := context.WithTimeout(b.ctx, 10*time.Second)
		ok, err := chromedp.Run(ctx, chromedp.Evaluate[bool]("Promise.resolve("+cond+").then(v => !!v)", chromedp.EvalAwaitPromise))
		cancel()
		if err == nil && ok {
			return
		}
		if time.Now().After(deadline) {
			b.t.Fatalf("waiting for %s (%s): not true after %v (last error %v; evidence: %s)", what, cond, timeout, err, b.evidenceDir())
		}
		time.Sleep(100 * time.Millisecond)
	}
}

// open loads the page and waits for the first chart.
func (b *browser) open(u string) {
	b.t.Helper()
	b.do("loading "+u, chromedp.Navigate(u))
	b.waitFor("the first chart", "window.setcard && window.setcard.ready", 90*time.Second)
}

// Requests are the URLs the pages asked for.
func (b *browser) Requests() []string {
	b.mu.Lock()
	defer b.mu.Unlock()
	return append([]string(nil), b.requests...)
}
