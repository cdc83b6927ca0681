package chart

import (
	"image/color"
	"strings"
	"unicode"
	"unicode/utf8"
)

// Clean makes user text safe to lay out as one paragraph: control and
// format characters (among them the bidirectional overrides and isolates,
// which could make a name read differently from what it is) are dropped,
// every run of white space becomes one space, and the ends are trimmed.
// Letters of any script, right-to-left ones included, are kept.
func Clean(s string) string {
	var b strings.Builder
	space := false
	for _, r := range s {
		switch {
		case r == '\uFFFD' || unicode.IsSpace(r):
			space = b.Len() > 0
		case unicode.IsControl(r), unicode.Is(unicode.Cf, r), r >= 0xD800 && r <= 0xDFFF, r == 0xFFFE, r == 0xFFFF:
		default:
			if space {
				b.WriteByte(' ')
				space = false
			}
			b.WriteRune(r)
		}
	}
	return b.String()
}

const ellipsis = "…"

// wrap breaks s into lines no wider than w at a size. It breaks at spaces
// (not at no-break spaces, which hold a number to its unit) and, inside a
// word too long for a line, between characters.
func (b *builder) wrap(s string, w, size float64, bold bool) []string {
	lines, _ := b.wrapWords(s, w, size, bold)
	return lines
}

// wrapWords is wrap, and reports whether a word had to be broken.
func (b *builder) wrapWords(s string, w, size float64, bold bool) (lines []string, broken bool) {
	cur := ""
	for _, word := range strings.FieldsFunc(s, func(r rune) bool { return r == ' ' }) {
		try := word
		if cur != "" {
			try = cur + " " + word
		}
		if b.measure(try, size, bold) <= w {
			cur = try
			continue
		}
		if cur != "" {
			lines = append(lines, cur)
			cur = ""
		}
		// The word alone: break it if it is too long.
		for b.measure(word, size, bold) > w {
			broken = true
			n := b.fitPrefix(word, w, size, bold, "")
			if n == 0 {
				n = len(string([]rune(word)[0])) // at least one character
			}
			lines = append(lines, word[:n])
			word = word[n:]
		}
		cur = word
	}
	if cur != "" {
		lines = append(lines, cur)
	}
	return lines, broken
}

// fitPrefix is the length in bytes of the longest prefix of s that, with
// tail after it, is no wider than w. It adds the widths of single
// characters, then checks the whole with one measure and steps back if a
// font's kerning makes the whole wider than the sum.
func (b *builder) fitPrefix(s string, w, size float64, bold bool, tail string) int {
	if b.measure(s+tail, size, bold) <= w {
		return len(s)
	}
	acc := b.measure(tail, size, bold)
	best := 0
	for i := 0; i < len(s); {
		_, n := utf8.DecodeRuneInString(s[i:])
		acc += b.measure(s[i:i+n], size, bold)
		if acc > w {
			break
		}
		i += n
		best = i
	}
	for best > 0 && b.measure(s[:best]+tail, size, bold) > w {
		_, n := utf8.DecodeLastRuneInString(s[:best])
		best -= n
	}
	return best
}

// truncate shortens s with an ellipsis until it is no wider than w.
func (b *builder) truncate(s string, w, size float64, bold bool) string {
	if b.measure(s, size, bold) <= w {
		return s
	}
	n := b.fitPrefix(s, w, size, bold, ellipsis)
	return strings.TrimRight(s[:n], " ") + ellipsis
}

// lineGap is the distance between baselines, in font sizes.
const lineGap = 1.22

// para is a paragraph of a text block.
type para struct {
	text  string
	scale float64 // size relative to the block's size
	bold  bool
	role  string
	space float64 // extra space above, in the block's sizes
	// label is drawn in bold at the left of the first line; the text
	// hangs beside it, in a column shared by the block's labels.
	label string
	// maxLines, when above 0, cuts the paragraph to that many lines, the
	// last ending with an ellipsis.
	maxLines int
}

// flowed is a paragraph broken into lines at one size.
type flowed struct {
	lines []string
	size  float64
}

// flow breaks paragraphs into lines at size, in a box w wide. Labelled
// paragraphs share one column for their labels, labelW wide. It returns
// the lines, the label column's width and the total height.
func (b *builder) flow(ps []para, w, size float64) (out []flowed, labelW, total float64, broken bool) {
	for _, p := range ps {
		if p.label != "" {
			labelW = max(labelW, b.measure(p.label, size*p.scale, true)+0.5*size)
		}
	}
	out = make([]flowed, len(ps))
	for i, p := range ps {
		sz := size * p.scale
		iw := w
		if p.label != "" {
			iw -= labelW
		}
		lines, br := b.wrapWords(p.text, iw, sz, p.bold)
		broken = broken || br
		if p.maxLines > 0 && len(lines) > p.maxLines {
			lines = lines[:p.maxLines]
			last := lines[len(lines)-1]
			n := b.fitPrefix(last, iw, sz, p.bold, ellipsis)
			lines[len(lines)-1] = strings.TrimRight(last[:n], " ") + ellipsis
		}
		h := float64(len(lines)) * lineGap * sz
		if i > 0 {
			h += p.space * size
		}
		out[i] = flowed{lines, sz}
		total += h
	}
	return out, labelW, total, broken
}

// textBlock lays paragraphs into box r at the largest size from max down
// to min (in steps of 4 %) at which they fit without breaking a word. At
// min, lines that do not fit
// are dropped and the last line kept ends with an ellipsis. It returns the
// size used and the height taken.
func (b *builder) textBlock(ps []para, r Rect, maxSize, minSize float64, c color.RGBA) (size, used float64) {
	// The largest size at which the block fits without breaking a word;
	// failing that, the largest at which it fits; failing that, min.
	size = minSize
	fitted := false
	for s := maxSize; ; s = max(minSize, s*0.96) {
		_, _, h, broken := b.flow(ps, r.W, s)
		if h <= r.H+1e-9 {
			if !broken {
				size = s
				break
			}
			if !fitted {
				size, fitted = s, true
			}
		}
		if s <= minSize {
			break
		}
	}
	fl, labelW, _, _ := b.flow(ps, r.W, size)
	y := r.Y
	last := -1 // index in b.items of the last line drawn
	for i, p := range ps {
		f := fl[i]
		if i > 0 {
			y += p.space * size
		}
		x := r.X
		if p.label != "" {
			x += labelW
		}
		for j, line := range f.lines {
			if y+lineGap*f.size > r.Y+r.H+1e-9 {
				b.ellipsize(last, r.X+r.W)
				return size, r.H
			}
			base := y + (0.1+Ascent)*f.size
			if j == 0 && p.label != "" {
				b.text(p.label, Point{r.X, base}, f.size, true, Start, c, p.role+"-label")
			}
			b.text(line, Point{x, base}, f.size, p.bold, Start, c, p.role)
			last = len(b.items) - 1
			y += lineGap * f.size
		}
	}
	return size, y - r.Y
}

// ellipsize ends text item i with an ellipsis, keeping its box left of
// right.
func (b *builder) ellipsize(i int, right float64) {
	if i < 0 {
		return
	}
	it := &b.items[i]
	if strings.HasSuffix(it.Text, ellipsis) {
		return
	}
	avail := right - it.Box.X
	n := b.fitPrefix(it.Text, avail, it.Size, it.Bold, ellipsis)
	it.Text = strings.TrimRight(it.Text[:n], " ") + ellipsis
	box := b.textBox(it.Text, it.At, it.Size, it.Bold, it.Anchor, it.Vertical)
	for k := range b.boxes {
		if b.boxes[k] == it.Box {
			b.boxes[k] = box
		}
	}
	it.Box = box
}
