//go:build !(js && wasm)

package e2e

import (
	"fmt"
	"slices"
	"strings"
	"testing"
	"time"

	"github.com/chromedp/chromedp"
	"github.com/chromedp/chromedp/kb"
)

// focusDesc names an element for the focus walk: its id, "radio:<name>"
// for a radio button (a group is one tab stop), or tag.class.
const focusDesc = `(e) => !e || e === document.body ? "(body)" : e.type === "radio" ? "radio:" + e.name : e.id || e.tagName.toLowerCase() + "." + e.className`

// Keyboard only: from the top of the page, Tab reaches every visible field
// and button and the chart; on the chart, Tab picks each control and the
// arrows move it, and the table follows; Escape gives the keyboard back to
// the page; a field takes a typed value; Enter on the print button prints.
func TestKeyboardOnly(t *testing.T) {
	srv := serve(t, distDir, "")
	b := newBrowser(t, 1280, 900)
	b.open(srv.URL)
	b.stubPrint()

	// Every control a keyboard user must reach: what is visible, enabled
	// and in the tab order.
	want := eval[[]string](b, `(() => {
		const desc = `+focusDesc+`;
		const all = Array.from(document.querySelectorAll("a[href], button, input, select, textarea, iframe, [tabindex]"))
			.filter((n) => !n.disabled && n.tabIndex >= 0 && !n.closest("[hidden]") && n.getClientRects().length > 0 && getComputedStyle(n).visibility !== "hidden");
		return Array.from(new Set(all.map(desc)));
	})()`)
	for _, id := range []string{"project-list", "file-open", "print-button", "chart-frame", "f-hammer-ram_kg", "f-design-load_kn", "f-card-notes"} {
		if !slices.Contains(want, id) {
			t.Fatalf("the list of controls to reach lacks %s: %v", id, want)
		}
	}

	// The chart keeps Tab for its handles, so it must say how to leave it.
	if hint := eval[string](b, `document.getElementById(document.getElementById("chart-frame").getAttribute("aria-describedby")).textContent`); !strings.Contains(hint, "Escape") {
		t.Errorf("the chart's description %q does not say that Escape leaves it", hint)
	}

	active := func() string { return eval[string](b, "("+focusDesc+")(document.activeElement)") }
	inCanvas := `document.activeElement.id === "chart-frame" && document.getElementById("chart-frame").contentDocument.activeElement.tagName === "CANVAS"`
	selected := func() string {
		return eval[string](b, `(window.setcard.state().controls.find((c) => c.selected) || {}).name || ""`)
	}
	ctlValue := func(name string) float64 {
		return eval[float64](b, fmt.Sprintf(`window.setcard.state().controls.find((c) => c.name === %q).value`, name))
	}

	b.js(`document.activeElement && document.activeElement.blur(); window.scrollTo(0, 0)`)
	var seen []string
	chartDone, typed := false, false
	for i := 0; i < 200; i++ {
		b.key(kb.Tab)
		a := active()
		if a == "(body)" || len(seen) > 0 && a == seen[0] {
			break // round the page once
		}
		seen = append(seen, a)
		switch {
		case a == "chart-frame" && !chartDone:
			chartDone = true
			if !b.poll(inCanvas, 5*time.Second) {
				t.Fatalf("Tab reached the chart frame but not its canvas")
			}
			// Tab on the canvas picks each control in turn.
			names := []string{selected()}
			for range 3 {
				prev := names[len(names)-1]
				if !b.holdKey(kb.Tab, fmt.Sprintf(`(window.setcard.state().controls.find((c) => c.selected) || {}).name !== %q`, prev)) {
					t.Fatalf("Tab on the canvas did not move the selection from %s", prev)
				}
				names = append(names, selected())
			}
			if got := strings.Join(names, " "); got != "ram drop length ram" {
				t.Errorf("Tab on the canvas selected %q, want ram drop length ram", got)
			}
			if eval[string](b, "document.activeElement.id") != "chart-frame" {
				t.Fatalf("Tab on the canvas left the chart (focus on %s)", active())
			}
			// The arrow moves the ram up one step: the table follows.
			before := b.state()
			table := eval[string](b, `document.getElementById("set-table-body").innerText`)
			ram := ctlValue("ram")
			if !b.holdKey(kb.ArrowRight, fmt.Sprintf(`window.setcard.state().controls.find((c) => c.name === "ram").value > %g`, ram)) {
				t.Fatalf("ArrowRight on the canvas did not move the ram from %g kg", ram)
			}
			after := b.state()
			if got, _ := at(after.Project, "hammer.ram_kg"); !(got > ram) {
				t.Errorf("after ArrowRight the project's ram is %g kg, was %g", got, ram)
			}
			if !(lastSet(after.Rows) > lastSet(before.Rows)) {
				t.Errorf("after a heavier ram the set per blow is %g, was %g", lastSet(after.Rows), lastSet(before.Rows))
			}
			if !sameRows(after.Rows, coreRows(t, after.Project)) {
				t.Errorf("rows after ArrowRight are not the core's rows for the page's project")
			}
			if !b.poll(fmt.Sprintf(`document.getElementById("set-table-body").innerText !== %q`, table), 5*time.Second) {
				t.Errorf("the table did not change after ArrowRight on the canvas")
			}
			// Escape gives the keyboard back: the canvas loses focus and
			// the next Tab leaves the chart.
			if !b.holdKey(kb.Escape, "!("+inCanvas+")") {
				t.Fatalf("Escape did not take the focus off the canvas")
			}
		case a == "f-design-load_kn" && !typed:
			typed = true
			b.key("a", chromedp.ModifierCtrl) // Ctrl+A selects the text
			b.key("125")
			b.waitFor("the typed design load", `window.setcard.state().project.design.load_kn === 125`, 10*time.Second)
			st := b.state()
			if !sameRows(st.Rows, coreRows(t, st.Project)) {
				t.Errorf("rows after typing a design load are not the core's rows")
			}
			if got := eval[string](b, "document.activeElement.id"); got != "f-design-load_kn" {
				t.Errorf("typing moved the focus to %s", got)
			}
		}
	}
	t.Logf("Tab order: %s", strings.Join(seen, " "))
	if !chartDone {
		t.Fatalf("Tab never reached the chart; order: %v", seen)
	}
	if !typed {
		t.Errorf("Tab never reached the design load")
	}
	if i := slices.Index(seen, "chart-frame"); i+1 >= len(seen) || seen[i+1] == "chart-frame" {
		t.Errorf("after Escape, Tab did not move past the chart: %v", seen)
	}
	for _, id := range want {
		if !slices.Contains(seen, id) {
			t.Errorf("Tab never reached %s", id)
		}
	}

	// Enter on the print button prints the card.
	for range len(want) + 2 {
		if active() == "print-button" {
			break
		}
		b.key(kb.Tab)
	}
	if a := active(); a != "print-button" {
		t.Fatalf("Tab did not come back to the print button (focus on %s)", a)
	}
	b.key(kb.Enter)
	b.waitFor("the print", "window.__printed === 1", 10*time.Second)
	if n := eval[int](b, `document.querySelectorAll("#print-area > svg").length`); n != 1 {
		t.Errorf("after Enter on the print button the print area holds %d SVG cards, want 1", n)
	}
	text := eval[string](b, `document.querySelector("#print-area").textContent`)
	for _, s := range governingSets(b.state()) {
		if !strings.Contains(text, s) {
			t.Errorf("the printed card does not show the criterion %s", s)
		}
	}
}
