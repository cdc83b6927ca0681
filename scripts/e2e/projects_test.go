//go:build !(js && wasm)

package e2e

import (
	"encoding/base64"
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"
	"unicode"

	"github.com/chromedp/chromedp"
)

// Autosave: a changed name and number are back after a reload, in the
// form, the project and the table.
func TestAutosave(t *testing.T) {
	srv := serve(t, distDir, "")
	b := newBrowser(t, 1280, 900)
	b.open(srv.URL)
	const name = "Jetty extension, pile group B (invented)"
	b.typeInto("f-name", name)
	b.typeInto("f-hammer-ram_kg", "720")
	b.waitFor("the typed name and ram", fmt.Sprintf(`window.setcard.state().project.name === %q && window.setcard.state().project.hammer.ram_kg === 720`, name), 10*time.Second)
	before := b.state()

	b.reload("after typing")
	after := b.state()
	if got := canon(after.Project); got != canon(before.Project) {
		t.Fatalf("after a reload the project is\n%s\nwant\n%s", got, canon(before.Project))
	}
	if !sameRows(after.Rows, coreRows(t, after.Project)) {
		t.Errorf("after a reload the rows are not the core's rows for the project")
	}
	if got := eval[string](b, `document.getElementById("f-name").value`); got != name {
		t.Errorf("after a reload the name field shows %q, want %q", got, name)
	}
	if got := eval[string](b, `document.getElementById("f-hammer-ram_kg").value`); got != "720" {
		t.Errorf("after a reload the ram field shows %q, want 720", got)
	}
	if got := eval[string](b, `document.getElementById("project-list").selectedOptions[0].textContent`); got != name {
		t.Errorf("after a reload the project list shows %q, want %q", got, name)
	}
	table := eval[string](b, `document.getElementById("set-table-body").innerText`)
	for _, s := range governingSets(after) {
		if !strings.Contains(table, s) {
			t.Errorf("after a reload the table lacks the criterion %s", s)
		}
	}
}

// lastMessage is the newest message at the top of the page.
func (b *browser) lastMessage() string {
	b.t.Helper()
	return eval[string](b, `(() => { const m = document.querySelector("#app-msg > :last-child"); return m ? m.querySelector("span").textContent : ""; })()`)
}

// openFile opens a file through the page's file input, as "Open file…"
// does, and waits for a new message.
func (b *browser) openFile(path string) string {
	b.t.Helper()
	b.js(`document.getElementById("app-msg").replaceChildren()`)
	b.do("choosing "+path, chromedp.SetUploadFiles(chromedp.ID("file-input"), []string{path}))
	b.waitFor("a message about "+filepath.Base(path), `document.getElementById("app-msg").children.length > 0`, 10*time.Second)
	return b.lastMessage()
}

// A bad file or link: a message says what is wrong, and the current
// project stays as it was.
func TestBadFilesAndLinks(t *testing.T) {
	srv := serve(t, distDir, "")
	b := newBrowser(t, 1280, 900)
	b.open(srv.URL)
	b.typeInto("f-hammer-ram_kg", "610") // a project of the user's, not the demo
	b.waitFor("the typed ram", `window.setcard.state().project.hammer.ram_kg === 610`, 10*time.Second)
	base := b.state()
	baseProject := canon(base.Project)
	baseList := eval[string](b, `Array.from(document.getElementById("project-list").options).map((o) => o.value + "=" + o.textContent).join("|")`)

	unchanged := func(what string) {
		t.Helper()
		st := b.state()
		if got := canon(st.Project); got != baseProject {
			t.Errorf("%s: the project changed to\n%s\nwas\n%s", what, got, baseProject)
		}
		if !sameRows(st.Rows, base.Rows) {
			t.Errorf("%s: the rows changed", what)
		}
		if got := eval[string](b, `document.getElementById("f-hammer-ram_kg").value`); got != "610" {
			t.Errorf("%s: the ram field shows %q", what, got)
		}
		if got := eval[string](b, `Array.from(document.getElementById("project-list").options).map((o) => o.value + "=" + o.textContent).join("|")`); got != baseList {
			t.Errorf("%s: the project list changed to %s, was %s", what, got, baseList)
		}
	}

	dir := t.TempDir()
	var demo map[string]any
	if err := json.Unmarshal(demoJSON(t), &demo); err != nil {
		t.Fatal(err)
	}
	future := map[string]any{}
	for k, v := range demo {
		future[k] = v
	}
	future["format"] = "setcard/2"
	future["name"] = "From a future version"
	futureJSON, _ := json.Marshal(future)
	outOfRange := map[string]any{}
	for k, v := range demo {
		outOfRange[k] = v
	}
	outOfRange["hammer"] = map[string]any{"type": "drop-winch", "ram_kg": 1e9}
	outOfRangeJSON, _ := json.Marshal(outOfRange)

	for _, c := range []struct {
		file, body string
		says       []string // what the message must say
	}{
		{"broken.json", `{"format": "setcard/1", "name": "cut short", "hammer": {"ram_kg": 5`, []string{"broken.json", "not valid JSON", "unchanged"}},
		{"future.json", string(futureJSON), []string{"future.json", "setcard/2", "newer version", "unchanged"}},
		{"heavy.json", string(outOfRangeJSON), []string{"heavy.json", "hammer.ram_kg", "out of range", "50 to 20000", "unchanged"}},
		{"list.json", `[1, 2, 3]`, []string{"list.json", "not a setcard/1 project", "unchanged"}},
	} {
		path := filepath.Join(dir, c.file)
		if err := os.WriteFile(path, []byte(c.body), 0o644); err != nil {
			t.Fatal(err)
		}
		msg := b.openFile(path)
		for _, s := range c.says {
			if !strings.Contains(msg, s) {
				t.Errorf("opening %s: the message %q does not say %q", c.file, msg, s)
			}
		}
		unchanged("opening " + c.file)
	}

	// Share links: tampered, of a newer version, and carrying a project
	// out of range.
	enc := func(s string) string { return base64.RawURLEncoding.EncodeToString([]byte(s)) }
	for _, c := range []struct {
		what, hash string
		says       []string
	}{
		{"a tampered link", "#p=1.garbage", []string{"share link", "unchanged"}},
		{"a link with a bad character", "#p=1.eyJmb3Jt!!", []string{"share link", "damaged", "unchanged"}},
		{"a cut link", "#p=1." + enc(string(futureJSON))[:40], []string{"share link", "unchanged"}},
		{"a newer link", "#p=2." + enc(string(demoJSON(t))), []string{"share link", "newer version", "unchanged"}},
		{"a link out of range", "#p=1." + enc(string(outOfRangeJSON)), []string{"share link", "hammer.ram_kg", "out of range", "unchanged"}},
	} {
		if c.what == "a tampered link" {
			// Opened in a new tab: the page loads with the link.
			b.do("leaving the page", chromedp.Navigate("about:blank"))
			b.open(srv.URL + c.hash)
		} else {
			// Pasted into the address bar of the open page.
			b.js(`document.getElementById("app-msg").replaceChildren()`)
			b.js(fmt.Sprintf(`location.href = %q`, srv.URL+c.hash))
		}
		b.waitFor("a message about "+c.what, `document.getElementById("app-msg").children.length > 0`, 10*time.Second)
		msg := b.lastMessage()
		for _, s := range c.says {
			if !strings.Contains(msg, s) {
				t.Errorf("%s: the message %q does not say %q", c.what, msg, s)
			}
		}
		if h := eval[string](b, "location.hash"); h != "" {
			t.Errorf("%s: the address still holds %q", c.what, h)
		}
		unchanged(c.what)
	}

	// A good link still opens, as a new project: the checks above are not
	// refusing everything.
	good := map[string]any{}
	for k, v := range demo {
		good[k] = v
	}
	good["name"] = "Shared good link (invented)"
	goodJSON, _ := json.Marshal(good)
	b.js(fmt.Sprintf(`location.href = %q`, srv.URL+"#p=1."+enc(string(goodJSON))))
	b.waitFor("the shared project", `window.setcard.state().project.name === "Shared good link (invented)"`, 10*time.Second)
}

// A hostile project name is shown as text on the page, in the messages and
// on the printed card, and never runs.
func TestHostileName(t *testing.T) {
	srv := serve(t, distDir, "")
	b := newBrowser(t, 1280, 900)
	b.open(srv.URL)
	b.stubPrint()
	imgs := eval[int](b, `document.querySelectorAll("img").length`)
	const name = `<img src=x onerror="window.__pwned=1"> 'it''s' "q" & amp; ` + "\u202etfel-ot-thgir\u202c" + ` שלום`
	var p map[string]any
	if err := json.Unmarshal(demoJSON(t), &p); err != nil {
		t.Fatal(err)
	}
	p["name"] = name
	raw, _ := json.Marshal(p)
	file := filepath.Join(t.TempDir(), "hostile.json")
	if err := os.WriteFile(file, raw, 0o644); err != nil {
		t.Fatal(err)
	}
	msg := b.openFile(file)
	if !strings.Contains(msg, name) {
		t.Errorf("the message after opening does not show the name as text: %q", msg)
	}
	b.waitFor("the hostile project", fmt.Sprintf(`window.setcard.state().project.name === %q`, name), 10*time.Second)

	// And through Rename…, the way a user types a name.
	renamed := name + " <script>window.__pwned=2</script>"
	b.js(fmt.Sprintf(`window.prompt = () => %q`, renamed))
	b.click("project-rename")
	b.waitFor("the renamed project", fmt.Sprintf(`window.setcard.state().project.name === %q`, renamed), 10*time.Second)

	b.click("print-button")
	b.waitFor("the print call", "window.__printed === 1", 10*time.Second)
	time.Sleep(500 * time.Millisecond) // time for an injected handler to run

	if got := eval[int](b, `document.querySelectorAll("img").length`); got != imgs {
		t.Errorf("the page has %d <img> elements, had %d: the name became markup", got, imgs)
	}
	if eval[bool](b, `window.__pwned !== undefined`) {
		t.Errorf("the name's markup ran: window.__pwned = %v", eval[any](b, "window.__pwned"))
	}
	if got := eval[int](b, `document.querySelectorAll("script:not([src])").length`); got != 0 {
		t.Errorf("the page holds %d inline scripts", got)
	}
	if got := eval[string](b, `document.getElementById("f-name").value`); got != renamed {
		t.Errorf("the name field shows %q, want %q", got, renamed)
	}
	if got := eval[string](b, `document.getElementById("project-list").selectedOptions[0].textContent`); !strings.HasPrefix(renamed, strings.TrimSuffix(got, "…")) {
		t.Errorf("the project list shows %q, want the name as text", got)
	}
	if got := eval[string](b, `document.title`); !strings.Contains(got, renamed) {
		t.Errorf("the title is %q, want the name as text", got)
	}
	// The card: one SVG, the name in its text, no markup from it.
	card := eval[struct {
		Text   string `json:"text"`
		Bad    int    `json:"bad"`
		Events int    `json:"events"`
	}](b, `(() => {
		const svg = document.querySelector("#print-area > svg");
		if (!svg) return {text: "", bad: -1, events: 0};
		let events = 0;
		for (const n of svg.querySelectorAll("*")) for (const a of n.attributes) if (a.name.startsWith("on")) events++;
		return {text: svg.textContent, bad: svg.querySelectorAll("img, script, foreignObject, image").length, events};
	})()`)
	if card.Bad != 0 || card.Events != 0 {
		t.Errorf("the printed card holds %d img/script/foreignObject/image elements and %d event attributes", card.Bad, card.Events)
	}
	// The card leaves out format characters such as the right-to-left
	// override (calc/chart/text.go), so that they cannot reorder it.
	if !strings.Contains(strings.Join(strings.Fields(card.Text), " "), strings.Join(strings.Fields(withoutFormat(renamed)), " ")) {
		t.Errorf("the printed card does not show the name as text:\n%s", card.Text)
	}
	if strings.ContainsRune(card.Text, '\u202e') {
		t.Errorf("the printed card keeps the right-to-left override")
	}
}

// withoutFormat drops control and format characters (Cc, Cf).
func withoutFormat(s string) string {
	return strings.Map(func(r rune) rune {
		if unicode.IsControl(r) || unicode.Is(unicode.Cf, r) {
			return -1
		}
		return r
	}, s)
}
