//go:build js && wasm

package main

import (
	"bytes"
	"encoding/json"
	"errors"
	"slices"
	"syscall/js"
	"time"

	"setcard/calc"
	"setcard/calc/chart"
	"setcard/calc/chart/svg"
)

// bridge is globalThis.setcardCore: the page's way into the core. Every
// argument and result is a string or a number; JSON travels as strings.
// Nothing it does bypasses validation.
type bridge struct {
	g     *game
	later js.Func
}

func (b *bridge) register() {
	core := js.Global().Get("Object").New()
	fn := func(name string, f func(args []js.Value) any) {
		core.Set(name, js.FuncOf(func(this js.Value, args []js.Value) (out any) {
			defer func() {
				if r := recover(); r != nil {
					out = errorJSON("internal error: please report it", nil)
				}
			}()
			return f(args)
		}))
	}
	fn("limits", func([]js.Value) any { return limitsJSON })
	fn("check", func(a []js.Value) any { return b.check(arg(a, 0), false) })
	fn("apply", func(a []js.Value) any { return b.check(arg(a, 0), true) })
	fn("project", func([]js.Value) any { return b.projectJSON() })
	fn("rows", func([]js.Value) any { return mustJSON(map[string]any{"rows": b.g.s.Rows()}) })
	fn("cardSVG", func(a []js.Value) any { return b.cardSVG(arg(a, 0)) })
	fn("chartSVG", func(a []js.Value) any { return b.chartSVG(num(a, 0, 800), num(a, 1, 500)) })
	fn("controls", func([]js.Value) any { return b.controls() })
	fn("timings", func([]js.Value) any { return b.g.t.json() })
	fn("frames", func([]js.Value) any { return b.g.frames })
	js.Global().Set("setcardCore", core)
}

func arg(a []js.Value, i int) string {
	if i < len(a) && a[i].Type() == js.TypeString {
		return a[i].String()
	}
	return ""
}

func num(a []js.Value, i int, def float64) float64 {
	if i < len(a) && a[i].Type() == js.TypeNumber {
		if v := a[i].Float(); v > 0 && v < 20000 {
			return v
		}
	}
	return def
}

type fieldError struct {
	Field   string `json:"field"`
	Value   string `json:"value"`
	Allowed string `json:"allowed"`
	Problem string `json:"problem"`
	Message string `json:"message"`
}

type checkResult struct {
	OK     bool            `json:"ok"`
	Errors []fieldError    `json:"errors"`
	Rows   []calc.TableRow `json:"rows,omitempty"`
}

func errorJSON(msg string, fes []fieldError) string {
	if fes == nil {
		fes = []fieldError{{Field: "(file)", Problem: msg, Message: msg}}
	}
	return mustJSON(checkResult{Errors: fes})
}

// check validates a project; when apply is true and it is valid, the
// canvas takes it.
func (b *bridge) check(src string, apply bool) string {
	p, err := calc.DecodeBytes([]byte(src))
	if err == nil {
		_, err = calc.Resolve(p)
	}
	if err != nil {
		return errorJSON("", fieldErrors(err))
	}
	res := checkResult{OK: true, Errors: []fieldError{}}
	if apply {
		t0 := time.Now()
		if err := b.g.s.Apply(p); err != nil {
			return errorJSON("", fieldErrors(err))
		}
		b.g.s.Recompute()
		b.g.t.recompute.add(time.Since(t0))
		res.Rows = b.g.s.Rows()
	}
	return mustJSON(res)
}

func fieldErrors(err error) []fieldError {
	var es calc.Errors
	var fe *calc.FieldError
	var list []*calc.FieldError
	switch {
	case errors.As(err, &es):
		list = es
	case errors.As(err, &fe):
		list = []*calc.FieldError{fe}
	default:
		return []fieldError{{Field: "(file)", Problem: err.Error(), Message: err.Error()}}
	}
	out := make([]fieldError, len(list))
	for i, e := range list {
		out[i] = fieldError{e.Field, e.Value, e.Allowed, e.Problem, e.Error()}
	}
	return out
}

func (b *bridge) projectJSON() string {
	var buf bytes.Buffer
	if err := b.g.s.Project().Encode(&buf); err != nil {
		return "{}"
	}
	return buf.String()
}

// notifyChanged tells the page that a control changed the project. The
// page is called from a timer, after the frame, so its table and autosave
// do not run inside the game's Update.
func (b *bridge) notifyChanged() {
	if !b.later.Truthy() {
		b.later = js.FuncOf(func(js.Value, []js.Value) any {
			host("controlChanged", b.projectJSON())
			return nil
		})
	}
	js.Global().Call("setTimeout", b.later, 0)
}

func (b *bridge) cardSVG(paper string) string {
	var buf bytes.Buffer
	l := chart.Card(b.g.s.Model(), chart.CardOptions{Paper: chart.Paper(paper)})
	if err := svg.Write(&buf, l, svg.Options{}); err != nil {
		return ""
	}
	return buf.String()
}

func (b *bridge) chartSVG(w, h float64) string {
	var buf bytes.Buffer
	l := chart.Chart(b.g.s.Model(), chart.ChartOptions{W: w, H: h})
	if err := svg.Write(&buf, l, svg.Options{}); err != nil {
		return ""
	}
	return buf.String()
}

type controlJSON struct {
	Name     string  `json:"name"`
	Label    string  `json:"label"`
	Value    float64 `json:"value"`
	Unit     string  `json:"unit"`
	Min      float64 `json:"min"`
	Max      float64 `json:"max"`
	X        float64 `json:"x"`
	Y        float64 `json:"y"`
	W        float64 `json:"w"`
	H        float64 `json:"h"`
	Selected bool    `json:"selected"`
}

func (b *bridge) controls() string {
	cs := b.g.s.Controls()
	out := make([]controlJSON, len(cs))
	for i, c := range cs {
		out[i] = controlJSON{string(c.Name), c.Label, c.Value, c.Unit, c.Min, c.Max,
			c.Handle.X, c.Handle.Y, c.Handle.W, c.Handle.H, i == b.g.s.Selected()}
	}
	return mustJSON(out)
}

func mustJSON(v any) string {
	bs, err := json.Marshal(v)
	if err != nil {
		return `{"ok":false,"errors":[{"field":"(file)","message":"internal error"}]}`
	}
	return string(bs)
}

// limitsJSON is every numeric input's allowed range, for the form.
var limitsJSON = func() string {
	type lim struct {
		Min  float64 `json:"min"`
		Max  float64 `json:"max"`
		Unit string  `json:"unit"`
	}
	m := map[string]lim{}
	for path, r := range calc.InputRanges() {
		m[path] = lim{r.Min, r.Max, r.Unit}
	}
	return mustJSON(m)
}()

// timings keeps the recent Update, Draw and recompute times.
type timings struct {
	update, draw, recompute ring
}

func newTimings() *timings { return &timings{} }

type ring struct {
	v []float64
	i int
}

const ringSize = 600

func (r *ring) add(d time.Duration) {
	ms := float64(d.Nanoseconds()) / 1e6
	if len(r.v) < ringSize {
		r.v = append(r.v, ms)
		return
	}
	r.v[r.i] = ms
	r.i = (r.i + 1) % ringSize
}

func (r *ring) ordered() []float64 {
	out := slices.Clone(r.v[r.i:])
	return append(out, r.v[:r.i]...)
}

func (t *timings) json() string {
	return mustJSON(map[string][]float64{
		"update_ms": t.update.ordered(), "draw_ms": t.draw.ordered(), "recompute_ms": t.recompute.ordered(),
	})
}
