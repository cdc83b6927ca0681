package chart

import (
	"strings"
	"testing"
)

// TestClean checks the cleaning of user text (cases worked by hand).
func TestClean(t *testing.T) {
	cases := []struct{ in, want string }{
		{"  plain  text ", "plain text"},
		{"tab\tand\nnew line\r\n", "tab and new line"},
		{"bell\x07 and nul\x00", "bell and nul"},
		{"\u202ereversed\u202c", "reversed"},
		{"isolate \u2066x\u2069", "isolate x"},
		{"zero\u200bwidth", "zerowidth"},
		{"שלום عالم", "שלום عالم"},
		{"<script>&amp;", "<script>&amp;"}, // escaping is the writer's job
		{"bad \xff byte", "bad byte"},
		{"", ""},
	}
	for _, c := range cases {
		if got := Clean(c.in); got != c.want {
			t.Errorf("Clean(%q) = %q, want %q", c.in, got, c.want)
		}
	}
}

// TestWrap checks that wrapped lines never exceed the width, keep every
// word, and break only a word longer than a line.
func TestWrap(t *testing.T) {
	b := &builder{measure: SansMeasure}
	texts := []string{
		"Stop driving when the last 10 blows drive the pile no more than the set in the table",
		strings.Repeat("W", 80),
		"short",
		strings.Repeat("שלום عالم ", 12),
	}
	for _, s := range texts {
		for _, w := range []float64{10, 30, 100} {
			lines, broken := b.wrapWords(s, w, 3, false)
			for _, l := range lines {
				if got := b.measure(l, 3, false); got > w+1e-9 {
					t.Errorf("wrap(%q, %g): line %q is %g wide", s, w, l, got)
				}
			}
			if got := strings.ReplaceAll(strings.Join(lines, ""), " ", ""); got != strings.ReplaceAll(s, " ", "") {
				t.Errorf("wrap(%q, %g) lost text: %q", s, w, lines)
			}
			long := false
			for _, word := range strings.Fields(s) {
				long = long || b.measure(word, 3, false) > w
			}
			if broken != long {
				t.Errorf("wrap(%q, %g) broke a word = %v, want %v", s, w, broken, long)
			}
		}
	}
}

// TestTextBlock checks that a block too long for its box is cut with an
// ellipsis inside the box, at the smallest size.
func TestTextBlock(t *testing.T) {
	b := &builder{measure: SansMeasure}
	r := Rect{10, 10, 50, 12}
	size, used := b.textBlock([]para{{text: strings.Repeat("many words here ", 40), scale: 1}}, r, 5, 3, Ink)
	if size != 3 || used > r.H {
		t.Errorf("textBlock size = %g, used %g, want 3 and at most %g", size, used, r.H)
	}
	last := b.items[len(b.items)-1]
	if !strings.HasSuffix(last.Text, ellipsis) {
		t.Errorf("last line %q does not end with an ellipsis", last.Text)
	}
	for _, it := range b.items {
		if !it.Box.Inside(r, 1e-9) {
			t.Errorf("line %q box %+v leaves %+v", it.Text, it.Box, r)
		}
	}
	// A short text fits at the largest size.
	b = &builder{measure: SansMeasure}
	if size, _ := b.textBlock([]para{{text: "fits", scale: 1}}, r, 5, 3, Ink); size != 5 {
		t.Errorf("textBlock(short) size = %g, want 5", size)
	}
}
