//go:build !(js && wasm)

package e2e

import (
	"context"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/chromedp/cdproto/cdp"
	"github.com/chromedp/cdproto/page"
	"github.com/chromedp/chromedp"
)

// printPDF prints the page as Chromium would to paper, with the page size
// the page's CSS asks for.
func (b *browser) printPDF() []byte {
	b.t.Helper()
	ctx, cancel := context.WithTimeout(b.ctx, 60*time.Second)
	defer cancel()
	pdf, err := chromedp.Run(ctx, chromedp.Action[[]byte](func(ctx context.Context, tg *chromedp.Target) ([]byte, error) {
		res, err := cdp.Call(ctx, tg, page.PrintToPDF, page.PrintToPDFParams{
			PreferCSSPageSize: new(true),
			PrintBackground:   new(true),
		})
		if err != nil {
			return nil, err
		}
		return res.Data, nil
	}))
	if err != nil {
		b.t.Fatalf("Page.printToPDF: %v (evidence: %s)", err, b.evidenceDir())
	}
	return pdf
}

// poppler runs pdfinfo or pdftotext on a PDF file.
func poppler(t *testing.T, tool string, args ...string) string {
	t.Helper()
	out, err := exec.Command(tool, args...).CombinedOutput()
	if err != nil {
		if _, lerr := exec.LookPath(tool); lerr != nil {
			t.Fatalf("%s is not installed; the browser suite needs poppler-utils: apt-get install -y poppler-utils", tool)
		}
		t.Fatalf("%s %v: %v\n%s", tool, args, err, out)
	}
	return string(out)
}

// Print: the card prints on exactly one page of the chosen paper, in
// landscape, and the page's text holds every criterion of the table.
func TestPrintPDF(t *testing.T) {
	srv := serve(t, distDir, "")
	b := newBrowser(t, 1280, 900)
	b.open(srv.URL)
	st := b.state()
	if len(governingSets(st)) == 0 {
		t.Fatalf("the demo project has no governing criterion:\n%s", rowsJSON(st))
	}
	dir := t.TempDir()
	for i, paper := range []struct {
		value string
		w, h  float64 // pt, landscape
	}{{"a4", 841.89, 595.28}, {"letter", 792, 612}} {
		b.stubPrint()
		b.js(fmt.Sprintf(`(() => { const s = document.getElementById("print-paper"); s.value = %q; s.dispatchEvent(new Event("change", {bubbles: true})); })()`, paper.value))
		b.click("print-button")
		b.waitFor("the print call", "window.__printed === 1", 10*time.Second)
		if !eval[bool](b, fmt.Sprintf(`document.body.classList.contains("print-%s") && document.querySelectorAll("#print-area > svg").length === 1`, paper.value)) {
			t.Fatalf("%s: the print area does not hold one card for that paper", paper.value)
		}
		file := filepath.Join(dir, fmt.Sprintf("card-%d-%s.pdf", i, paper.value))
		if err := os.WriteFile(file, b.printPDF(), 0o644); err != nil {
			t.Fatal(err)
		}
		info := poppler(t, "pdfinfo", file)
		if m := regexp.MustCompile(`(?m)^Pages:\s+(\d+)`).FindStringSubmatch(info); m == nil || m[1] != "1" {
			t.Errorf("%s: the card prints on more or less than one page:\n%s", paper.value, info)
		}
		m := regexp.MustCompile(`(?m)^Page size:\s+([\d.]+) x ([\d.]+) pts`).FindStringSubmatch(info)
		if m == nil {
			t.Errorf("%s: pdfinfo gives no page size:\n%s", paper.value, info)
		} else {
			w, _ := strconv.ParseFloat(m[1], 64)
			h, _ := strconv.ParseFloat(m[2], 64)
			if abs(w-paper.w) > 2 || abs(h-paper.h) > 2 {
				t.Errorf("%s: the page is %g × %g pt, want %g × %g (landscape)", paper.value, w, h, paper.w, paper.h)
			}
		}
		text := poppler(t, "pdftotext", "-layout", file, "-")
		// Each criterion on its drop's line: "0.9 m   50.9 mm".
		for _, r := range st.Rows {
			if !r.Governs || r.SetMmPer10Blows == nil {
				continue
			}
			line := regexp.MustCompile(`(?m)^\s*` + regexp.QuoteMeta(strconv.FormatFloat(r.DropM, 'f', -1, 64)) + ` m\s+` + regexp.QuoteMeta(fmt.Sprintf("%.1f", *r.SetMmPer10Blows)) + ` mm\b`)
			if !line.MatchString(text) {
				t.Errorf("%s: the printed card does not show the criterion %.1f mm per 10 blows for the drop %g m:\n%s", paper.value, *r.SetMmPer10Blows, r.DropM, text)
			}
		}
		name := eval[string](b, "window.setcard.state().project.name")
		if !strings.Contains(strings.Join(strings.Fields(text), " "), strings.Join(strings.Fields(name), " ")[:20]) {
			t.Errorf("%s: the printed card does not name the project %q:\n%s", paper.value, name, text)
		}
	}
}

func abs(x float64) float64 {
	if x < 0 {
		return -x
	}
	return x
}
