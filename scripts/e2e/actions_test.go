//go:build !(js && wasm)

package e2e

import (
	"bytes"
	"context"
	"encoding/json"
	"fmt"
	"strconv"
	"strings"
	"time"

	"github.com/chromedp/cdproto/cdp"
	"github.com/chromedp/cdproto/input"
	"github.com/chromedp/chromedp"
	"github.com/chromedp/chromedp/kb"
)

// What a user does with the keyboard and the form, shared by the cases of
// this suite.

// key presses and releases keys on the page, as a user would: key down,
// the character, key up.
func (b *browser) key(keys string, mods ...chromedp.Modifier) {
	b.t.Helper()
	b.do(fmt.Sprintf("pressing %q", keys), chromedp.KeyEvent(keys, chromedp.KeyModifiers(mods...)))
}

// holdKey presses one key and holds it until the JavaScript condition
// until is true (or 10 s pass), then releases it. The chart program reads
// the keyboard once per frame, and the software renderer may draw only a
// few frames a second, so a press and release within one frame would be
// missed; holding it until its effect shows keeps the test exact without
// letting the key auto-repeat. It reports whether the condition came true.
func (b *browser) holdKey(k string, until string) bool {
	b.t.Helper()
	var down, up []*input.DispatchKeyEventParams
	for _, e := range kb.Encode([]rune(k)[0]) {
		if e.Type == kb.KeyUp {
			up = append(up, e)
		} else {
			down = append(down, e)
		}
	}
	send := func(evs []*input.DispatchKeyEventParams) {
		b.t.Helper()
		for _, e := range evs {
			e := *e
			b.do("key "+e.Key, chromedp.Func(func(ctx context.Context, tg *chromedp.Target) error {
				_, err := cdp.Call(ctx, tg, input.DispatchKeyEvent, e)
				return err
			}))
		}
	}
	send(down)
	ok := b.poll(until, 10*time.Second)
	send(up)
	return ok
}

// poll reports whether a JavaScript condition, or the promise it gives,
// comes true within timeout.
func (b *browser) poll(cond string, timeout time.Duration) bool {
	deadline := time.Now().Add(timeout)
	for {
		ctx, cancel := context.WithTimeout(b.ctx, 10*time.Second)
		ok, err := chromedp.Run(ctx, chromedp.Evaluate[bool]("Promise.resolve(("+cond+")).then((v) => !!v)", chromedp.EvalAwaitPromise))
		cancel()
		if err == nil && ok {
			return true
		}
		if time.Now().After(deadline) {
			return false
		}
		time.Sleep(40 * time.Millisecond)
	}
}

// typeInto selects the text of a field and types text over it with the
// keyboard (Backspace first, so that typing nothing empties the field).
func (b *browser) typeInto(id, text string) {
	b.t.Helper()
	b.do("focusing #"+id, chromedp.Evaluate[chromedp.Void](fmt.Sprintf(
		`(() => { const f = document.getElementById(%q); f.scrollIntoView({block: "center"}); f.focus(); f.select(); })()`, id)))
	b.key(kb.Backspace)
	if text != "" {
		b.key(text)
	}
}

// pasteInto selects the text of a field and replaces it with text in one
// input event, as pasting does, so that no value on the way (the "1" of
// "1e9") is ever seen by the page; an empty text deletes the selection.
func (b *browser) pasteInto(id, text string) {
	b.t.Helper()
	b.do("focusing #"+id, chromedp.Evaluate[chromedp.Void](fmt.Sprintf(
		`(() => { const f = document.getElementById(%q); f.scrollIntoView({block: "center"}); f.focus(); f.select(); })()`, id)))
	if text == "" {
		b.key(kb.Backspace)
		return
	}
	b.do(fmt.Sprintf("pasting %q into #%s", text, id), chromedp.Func(func(ctx context.Context, tg *chromedp.Target) error {
		_, err := cdp.Call(ctx, tg, input.InsertText, input.InsertTextParams{Text: text})
		return err
	}))
}

// stubPrint replaces window.print, which in headless Chromium would spoil
// later printToPDF calls, by a counter in window.__printed.
func (b *browser) stubPrint() {
	b.t.Helper()
	b.do("replacing window.print", chromedp.Evaluate[chromedp.Void](
		`window.__printed = 0; window.print = () => { window.__printed = (window.__printed || 0) + 1; }`))
}

// click clicks an element by id with the mouse, as a user would.
func (b *browser) click(id string) {
	b.t.Helper()
	b.do("clicking #"+id, chromedp.Click(chromedp.ID(id)))
}

// js runs a statement in the page.
func (b *browser) js(stmt string) {
	b.t.Helper()
	b.do("running "+stmt, chromedp.Evaluate[chromedp.Void](stmt))
}

// canon is a JSON value with its object keys sorted, for comparing
// projects.
func canon(raw []byte) string {
	var v any
	if err := json.Unmarshal(raw, &v); err != nil {
		return "invalid JSON: " + err.Error()
	}
	out, _ := json.Marshal(v)
	return string(out)
}

// at reads a number from a project by a form path such as "hammer.ram_kg"
// or "drops_m[2]"; ok is false when it is absent.
func at(project []byte, path string) (float64, bool) {
	var v any
	if err := json.Unmarshal(project, &v); err != nil {
		return 0, false
	}
	for _, part := range strings.Split(path, ".") {
		idx := -1
		if i := strings.Index(part, "["); i >= 0 {
			n, err := strconv.Atoi(strings.TrimSuffix(part[i+1:], "]"))
			if err != nil {
				return 0, false
			}
			part, idx = part[:i], n
		}
		m, ok := v.(map[string]any)
		if !ok {
			return 0, false
		}
		if v, ok = m[part]; !ok {
			return 0, false
		}
		if idx >= 0 {
			a, ok := v.([]any)
			if !ok || idx >= len(a) {
				return 0, false
			}
			v = a[idx]
		}
	}
	f, ok := v.(float64)
	return f, ok
}

// governingSets are the criteria a user reads off the table and the card:
// each governing row's set per 10 blows, as %.1f.
func governingSets(st state) []string {
	var out []string
	for _, r := range st.Rows {
		if r.Governs && r.SetMmPer10Blows != nil {
			out = append(out, fmt.Sprintf("%.1f", *r.SetMmPer10Blows))
		}
	}
	return out
}

// rowsJSON is the rows as JSON, for messages.
func rowsJSON(st state) string {
	var buf bytes.Buffer
	_ = json.NewEncoder(&buf).Encode(st.Rows)
	return buf.String()
}
