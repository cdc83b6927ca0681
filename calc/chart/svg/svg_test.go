package svg

import (
	"bytes"
	"encoding/xml"
	"errors"
	"flag"
	"io"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"setcard/calc"
	"setcard/calc/chart"
)

var update = flag.Bool("update", false, "rewrite the golden SVGs under testdata/cards")

var root = filepath.Join("..", "..", "..", "testdata")

func load(t testing.TB, name string) *calc.Model {
	t.Helper()
	data, err := os.ReadFile(filepath.Join(root, name))
	if err != nil {
		t.Fatal(err)
	}
	p, err := calc.DecodeBytes(data)
	if err != nil {
		t.Fatalf("%s: %v", name, err)
	}
	m, err := calc.Resolve(p)
	if err != nil {
		t.Fatalf("%s: %v", name, err)
	}
	return m
}

func write(t testing.TB, l *chart.Layout) []byte {
	t.Helper()
	var buf bytes.Buffer
	if err := Write(&buf, l, Options{}); err != nil {
		t.Fatal(err)
	}
	return buf.Bytes()
}

// goldens are the golden SVGs: the demo card on both papers, a crowded
// card, a card with hostile text, and the demo's chart for a screen.
var goldens = []struct {
	file    string
	project string
	layout  func(*calc.Model) *chart.Layout
}{
	{"demo-a4.svg", "demo.json", func(m *calc.Model) *chart.Layout { return chart.Card(m, chart.CardOptions{Paper: chart.A4}) }},
	{"demo-letter.svg", "demo.json", func(m *calc.Model) *chart.Layout { return chart.Card(m, chart.CardOptions{Paper: chart.Letter}) }},
	{"crowded-a4.svg", "cards/crowded.json", func(m *calc.Model) *chart.Layout { return chart.Card(m, chart.CardOptions{}) }},
	{"hostile-letter.svg", "cards/hostile.json", func(m *calc.Model) *chart.Layout {
		return chart.Card(m, chart.CardOptions{Paper: chart.Letter})
	}},
	{"demo-chart.svg", "demo.json", func(m *calc.Model) *chart.Layout { return chart.Chart(m, chart.ChartOptions{W: 800, H: 500}) }},
}

// TestGolden compares each SVG with its golden file under testdata/cards
// (go test -update rewrites them). Numbers may differ by one in the last
// place, as floating-point results may between machines; nothing else.
func TestGolden(t *testing.T) {
	for _, g := range goldens {
		got := write(t, g.layout(load(t, g.project)))
		path := filepath.Join(root, "cards", g.file)
		if *update {
			if err := os.WriteFile(path, got, 0o644); err != nil {
				t.Fatal(err)
			}
			continue
		}
		want, err := os.ReadFile(path)
		if err != nil {
			t.Fatalf("%v (run go test -update to make it)", err)
		}
		if msg := sameSVG(got, want); msg != "" {
			t.Errorf("%s differs from the golden file: %s (run go test -update if the change is meant)", g.file, msg)
		}
	}
}

var numRE = regexp.MustCompile(`-?[0-9]+(\.[0-9]+)?`)

// sameSVG compares two documents, numbers within 0.011 of each other; it
// returns "" when they match, else where they first differ.
func sameSVG(a, b []byte) string {
	if bytes.Equal(a, b) {
		return ""
	}
	la, lb := strings.Split(string(a), "\n"), strings.Split(string(b), "\n")
	if len(la) != len(lb) {
		return "line count " + strconv.Itoa(len(la)) + ", golden " + strconv.Itoa(len(lb))
	}
	for i := range la {
		if la[i] == lb[i] {
			continue
		}
		if numRE.ReplaceAllString(la[i], "#") != numRE.ReplaceAllString(lb[i], "#") {
			return "line " + strconv.Itoa(i+1) + ": " + la[i] + "\ngolden: " + lb[i]
		}
		na, nb := numRE.FindAllString(la[i], -1), numRE.FindAllString(lb[i], -1)
		for k := range na {
			x, _ := strconv.ParseFloat(na[k], 64)
			y, _ := strconv.ParseFloat(nb[k], 64)
			if math.Abs(x-y) > 0.011 {
				return "line " + strconv.Itoa(i+1) + ": " + la[i] + "\ngolden: " + lb[i]
			}
		}
	}
	return ""
}

// TestWellFormed decodes every token of every golden SVG with
// encoding/xml, and checks what a print must not hold: NaN or Inf, links,
// fonts other than the generic family, and unescaped markup.
func TestWellFormed(t *testing.T) {
	for _, g := range goldens {
		data := write(t, g.layout(load(t, g.project)))
		dec := xml.NewDecoder(bytes.NewReader(data))
		n := 0
		for {
			tok, err := dec.Token()
			if err == io.EOF {
				break
			}
			if err != nil {
				t.Fatalf("%s: not well-formed XML after %d tokens: %v", g.file, n, err)
			}
			n++
			if se, ok := tok.(xml.StartElement); ok {
				for _, a := range se.Attr {
					if a.Name.Local == "href" || a.Name.Space == "xlink" {
						t.Errorf("%s: <%s> has a link attribute %s", g.file, se.Name.Local, a.Name.Local)
					}
					if a.Name.Local == "font-family" && a.Value != "sans-serif" {
						t.Errorf("%s: font-family %q, want sans-serif", g.file, a.Value)
					}
				}
				switch se.Name.Local {
				case "svg", "title", "line", "polyline", "polygon", "text":
				default:
					t.Errorf("%s: unexpected element <%s>", g.file, se.Name.Local)
				}
			}
		}
		s := string(data)
		for _, bad := range []string{"NaN", "Inf", "url(", "@import", "<script", "<img", "<b>", "<ref>", "<notes>"} {
			if strings.Contains(s, bad) {
				t.Errorf("%s contains %q", g.file, bad)
			}
		}
	}
}

// TestPageSize checks the root element of a page: its size in mm and a
// view box in the layout's units.
func TestPageSize(t *testing.T) {
	m := load(t, "demo.json")
	for _, c := range []struct {
		paper chart.Paper
		want  string
	}{
		{chart.A4, `width="297mm" height="210mm" viewBox="0 0 297 210"`},
		{chart.Letter, `width="279.4mm" height="215.9mm" viewBox="0 0 279.4 215.9"`},
	} {
		if s := string(write(t, chart.Card(m, chart.CardOptions{Paper: c.paper}))); !strings.Contains(s, c.want) {
			t.Errorf("%s card root has not %s:\n%.300s", c.paper, c.want, s)
		}
	}
	if s := string(write(t, chart.Chart(m, chart.ChartOptions{W: 320, H: 240}))); !strings.Contains(s, `width="320" height="240" viewBox="0 0 320 240"`) {
		t.Errorf("chart root has not its size in px:\n%.300s", s)
	}
}

// svgText is a text element read back from an SVG.
type svgText struct {
	class string
	text  string
}

func readTexts(t *testing.T, data []byte) []svgText {
	t.Helper()
	var out []svgText
	dec := xml.NewDecoder(bytes.NewReader(data))
	var cur *svgText
	for {
		tok, err := dec.Token()
		if err == io.EOF {
			return out
		}
		if err != nil {
			t.Fatal(err)
		}
		switch e := tok.(type) {
		case xml.StartElement:
			if e.Name.Local == "text" {
				cur = &svgText{}
				for _, a := range e.Attr {
					if a.Name.Local == "class" {
						cur.class = a.Value
					}
				}
			}
		case xml.CharData:
			if cur != nil {
				cur.text += string(e)
			}
		case xml.EndElement:
			if e.Name.Local == "text" && cur != nil {
				out = append(out, *cur)
				cur = nil
			}
		}
	}
}

// TestCriterionReadBack reads the criterion numbers back out of the text
// elements of the SVG card and compares them with the calculation core's
// TableRows: for each drop, the governing length's set in 10 blows and
// per blow (which TableRows rounds down to 0.1 mm and 0.01 mm) are equal.
// The numbers written at the chart's crossings are the same.
func TestCriterionReadBack(t *testing.T) {
	for _, name := range []string{"demo.json", "cards/crowded.json", "cards/hostile.json"} {
		m := load(t, name)
		for _, paper := range []chart.Paper{chart.A4, chart.Letter} {
			texts := readTexts(t, write(t, chart.Card(m, chart.CardOptions{Paper: paper})))
			type got struct {
				drop, set10, set1 float64
				noSet             bool
			}
			var rows []got
			cross := map[float64]bool{}
			for _, x := range texts {
				v := func(suffix string) float64 {
					f, err := strconv.ParseFloat(strings.TrimSuffix(strings.TrimSuffix(x.text, " *"), suffix), 64)
					if err != nil {
						t.Fatalf("%s: %s text %q is not a number: %v", name, x.class, x.text, err)
					}
					return f
				}
				switch x.class {
				case "drop":
					rows = append(rows, got{drop: v(" m")})
				case "set10":
					rows[len(rows)-1].set10 = v(" mm")
				case "set1":
					rows[len(rows)-1].set1 = v(" mm")
				case "no-set":
					rows[len(rows)-1].noSet = true
				case "cross-set10":
					cross[v("")] = true
				}
			}
			i := 0
			for _, r := range m.TableRows() {
				if !r.Governs {
					continue
				}
				if i >= len(rows) {
					t.Fatalf("%s on %s: %d rows on the card, want more", name, paper, len(rows))
				}
				g := rows[i]
				i++
				if g.drop != r.DropM {
					t.Errorf("%s on %s: row %d drop = %g m, want %g m", name, paper, i, g.drop, r.DropM)
				}
				if !r.Achievable {
					if !g.noSet || g.set10 != 0 {
						t.Errorf("%s on %s: drop %g m cannot prove the load, but the card says %+v", name, paper, r.DropM, g)
					}
					continue
				}
				want10, want1 := *r.SetMmPer10Blows, *r.SetMmPerBlow
				if g.set10 != want10 {
					t.Errorf("%s on %s: drop %g m set in 10 blows = %g, want %g (TableRows)", name, paper, r.DropM, g.set10, want10)
				}
				if g.set1 != want1 {
					t.Errorf("%s on %s: drop %g m set per blow = %g, want %g (TableRows)", name, paper, r.DropM, g.set1, want1)
				}
				if !cross[want10] {
					t.Errorf("%s on %s: drop %g m: chart does not write %g at the design load", name, paper, r.DropM, want10)
				}
			}
			if i != len(rows) {
				t.Errorf("%s on %s: %d rows on the card, want %d", name, paper, len(rows), i)
			}
		}
	}
}

// TestHostileEscaped checks that hostile text is escaped: the document
// holds no markup from it, and reading it back gives the text itself.
func TestHostileEscaped(t *testing.T) {
	m := load(t, "cards/hostile.json")
	data := write(t, chart.Card(m, chart.CardOptions{}))
	var doc struct {
		Title string `xml:"title"`
	}
	if err := xml.Unmarshal(data, &doc); err != nil {
		t.Fatal(err)
	}
	if doc.Title != chart.Clean(m.Name) {
		t.Errorf("title read back = %q, want %q", doc.Title, chart.Clean(m.Name))
	}
	var all strings.Builder
	for _, x := range readTexts(t, data) {
		all.WriteString(x.text + "\n")
	}
	for _, want := range []string{"<script>alert(1)</script>", `"Quotes" & 'apostrophes'`, "<img src=x onerror=alert(1)>", "'; DROP TABLE cards; --", "עברית", "العربي"} {
		if !strings.Contains(all.String(), want) {
			t.Errorf("text read back does not hold %q", want)
		}
	}
	s := string(data)
	for _, bad := range []string{"<script", "<img", "\u202e"} {
		if strings.Contains(s, bad) {
			t.Errorf("document holds %q unescaped", bad)
		}
	}
	if !strings.Contains(s, "&lt;script&gt;") {
		t.Error("document does not hold the escaped &lt;script&gt;")
	}
}

// TestDeterministic checks that two writes of the same card are the same
// bytes.
func TestDeterministic(t *testing.T) {
	m := load(t, "cards/crowded.json")
	a := write(t, chart.Card(m, chart.CardOptions{}))
	b := write(t, chart.Card(m, chart.CardOptions{}))
	if !bytes.Equal(a, b) {
		t.Error("two writes of one card differ")
	}
}

// failWriter fails every write after the first n bytes.
type failWriter struct{ n int }

var errDisk = errors.New("disk full")

func (w *failWriter) Write(p []byte) (int, error) {
	if len(p) > w.n {
		k := w.n
		w.n = 0
		return k, errDisk
	}
	w.n -= len(p)
	return len(p), nil
}

// TestWriterErrors checks that the writer's error is returned.
func TestWriterErrors(t *testing.T) {
	l := chart.Card(load(t, "demo.json"), chart.CardOptions{})
	for _, n := range []int{0, 10, 5000} {
		if err := Write(&failWriter{n}, l, Options{}); !errors.Is(err, errDisk) {
			t.Errorf("Write to a writer failing after %d bytes = %v, want %v", n, err, errDisk)
		}
	}
}

// TestNotFinite checks that a layout holding NaN or an infinity is refused
// with an error naming the item, and that nothing is written.
func TestNotFinite(t *testing.T) {
	base := func() *chart.Layout {
		return &chart.Layout{W: 100, H: 50, Unit: "px", Items: []chart.Item{
			{Kind: chart.Line, Points: []chart.Point{{X: 0, Y: 0}, {X: 10, Y: 10}}, Width: 1},
			{Kind: chart.Text, Text: "x", At: chart.Point{X: 5, Y: 5}, Size: 3},
			{Kind: chart.Area, Points: []chart.Point{{X: 0, Y: 0}, {X: 10, Y: 0}, {X: 10, Y: 10}}},
		}}
	}
	nan, inf := math.NaN(), math.Inf(1)
	cases := []struct {
		name string
		edit func(l *chart.Layout)
		item int
	}{
		{"line point", func(l *chart.Layout) { l.Items[0].Points[1].X = nan }, 0},
		{"line width", func(l *chart.Layout) { l.Items[0].Width = inf }, 0},
		{"text position", func(l *chart.Layout) { l.Items[1].At.Y = nan }, 1},
		{"text size", func(l *chart.Layout) { l.Items[1].Size = nan }, 1},
		{"area point", func(l *chart.Layout) { l.Items[2].Points[0].Y = -inf }, 2},
		{"dash", func(l *chart.Layout) { l.Items[0].Dash = []float64{1, nan} }, 0},
		{"size", func(l *chart.Layout) { l.W = nan }, -1},
	}
	for _, c := range cases {
		l := base()
		c.edit(l)
		var buf bytes.Buffer
		err := Write(&buf, l, Options{})
		var nf *NotFiniteError
		if !errors.As(err, &nf) || nf.Item != c.item {
			t.Errorf("Write(%s not finite) = %v, want a NotFiniteError for item %d", c.name, err, c.item)
		}
		if buf.Len() != 0 {
			t.Errorf("Write(%s not finite) wrote %d bytes, want none", c.name, buf.Len())
		}
	}
	if err := Write(io.Discard, base(), Options{}); err != nil {
		t.Errorf("Write(finite layout) = %v, want nil", err)
	}
}

// TestNumbers checks the formatting of numbers: fixed decimals, no
// trailing zeros, no negative zero.
func TestNumbers(t *testing.T) {
	cases := []struct {
		v    float64
		dec  int
		want string
	}{{1.5, 2, "1.5"}, {2, 2, "2"}, {0.005, 2, "0.01"}, {-0.001, 2, "0"}, {123.456, 2, "123.46"}, {1.23456, 3, "1.235"}, {100, 2, "100"}}
	for _, c := range cases {
		e := &enc{dec: c.dec}
		e.num(c.v)
		if got := e.buf.String(); got != c.want {
			t.Errorf("num(%g, %d) = %q, want %q", c.v, c.dec, got, c.want)
		}
	}
}

// FuzzCardText lays out and writes a card whose user text is anything:
// the SVG must parse, and every text must stay on the page, clear of the
// others.
func FuzzCardText(f *testing.F) {
	m := load(f, "cards/hostile.json")
	f.Add(m.Name, m.Card.Notes, m.Card.PreparedBy)
	f.Add("", "", "")
	f.Add(strings.Repeat("W", 200), strings.Repeat("x ", 250), "\u202e\x00<&>")
	f.Fuzz(func(t *testing.T, name, notes, who string) {
		mm := *m
		mm.Name, mm.Card.Notes, mm.Card.PreparedBy, mm.Card.Reference = name, notes, who, who
		l := chart.Card(&mm, chart.CardOptions{})
		texts := l.Texts()
		for i, a := range texts {
			if !a.Box.Inside(chart.Rect{W: l.W, H: l.H}, 1e-6) {
				t.Fatalf("text %q box %+v leaves the page", a.Text, a.Box)
			}
			for _, b := range texts[i+1:] {
				if shrink(a.Box).Overlaps(shrink(b.Box)) {
					t.Fatalf("text %q overlaps %q", a.Text, b.Text)
				}
			}
		}
		data := write(t, l)
		dec := xml.NewDecoder(bytes.NewReader(data))
		for {
			_, err := dec.Token()
			if err == io.EOF {
				break
			}
			if err != nil {
				t.Fatalf("not well-formed: %v", err)
			}
		}
	})
}

func shrink(r chart.Rect) chart.Rect {
	return chart.Rect{X: r.X + 1e-6, Y: r.Y + 1e-6, W: r.W - 2e-6, H: r.H - 2e-6}
}

// BenchmarkCard lays out the demo's A4 card and writes it as SVG.
func BenchmarkCard(b *testing.B) {
	m := load(b, "demo.json")
	for b.Loop() {
		if err := Write(io.Discard, chart.Card(m, chart.CardOptions{}), Options{}); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkChart lays out the demo's chart at 800 × 500 px and writes it as
// SVG.
func BenchmarkChart(b *testing.B) {
	m := load(b, "demo.json")
	for b.Loop() {
		if err := Write(io.Discard, chart.Chart(m, chart.ChartOptions{W: 800, H: 500}), Options{}); err != nil {
			b.Fatal(err)
		}
	}
}
