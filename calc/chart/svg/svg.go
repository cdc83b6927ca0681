// Package svg writes a chart.Layout as an SVG document: the print of the
// site card and of the chart.
//
// The output is deterministic (coordinates at a fixed precision, nothing
// that depends on the time or the machine), self-contained (no links, no
// fonts or images from elsewhere: text asks for the generic sans-serif
// family) and safe to open: every text is escaped, and a coordinate that is
// not a finite number is refused with an error rather than written. A page
// layout (units "mm") gets its size in millimetres, so that it prints at
// its true size.
package svg

import (
	"bytes"
	"encoding/xml"
	"fmt"
	"image/color"
	"io"
	"math"
	"strconv"

	"setcard/calc/chart"
)

// Options shape Write. The zero value is the default.
type Options struct {
	// Decimals is the number of decimals of coordinates and sizes
	// (default 2: a hundredth of a millimetre on a page).
	Decimals int
	// Boxes outlines the box of every text, for checking a layout by eye.
	Boxes bool
}

// Write writes the layout l to w as an SVG document. It returns the first
// error of w, or an error naming the item when a coordinate or size is not
// a finite number; then nothing is written.
func Write(w io.Writer, l *chart.Layout, o Options) error {
	if o.Decimals <= 0 {
		o.Decimals = 2
	}
	e := &enc{dec: o.Decimals}
	if err := e.document(l, o); err != nil {
		return err
	}
	_, err := w.Write(e.buf.Bytes())
	return err
}

type enc struct {
	buf bytes.Buffer
	dec int
	err error
}

// NotFiniteError reports a layout with a coordinate or size that is NaN or
// infinite: a broken layout, never written.
type NotFiniteError struct {
	Item  int // index in Layout.Items, or -1 for the layout's size
	Kind  chart.Kind
	Field string
}

func (e *NotFiniteError) Error() string {
	if e.Item < 0 {
		return fmt.Sprintf("svg: layout %s is not a finite number", e.Field)
	}
	return fmt.Sprintf("svg: item %d (%s): %s is not a finite number", e.Item, e.Kind, e.Field)
}

func (e *enc) document(l *chart.Layout, o Options) error {
	for _, v := range []float64{l.W, l.H} {
		if !finite(v) || v <= 0 {
			return &NotFiniteError{Item: -1, Field: "size"}
		}
	}
	b := &e.buf
	unit := ""
	if l.Unit == "mm" || l.Unit == "in" || l.Unit == "cm" {
		unit = l.Unit
	}
	b.WriteString(`<?xml version="1.0" encoding="UTF-8"?>` + "\n")
	b.WriteString(`<svg xmlns="http://www.w3.org/2000/svg" version="1.1" width="`)
	e.num(l.W)
	b.WriteString(unit + `" height="`)
	e.num(l.H)
	b.WriteString(unit + `" viewBox="0 0 `)
	e.num(l.W)
	b.WriteByte(' ')
	e.num(l.H)
	b.WriteString(`" font-family="sans-serif" stroke-linejoin="round">` + "\n")
	if l.Title != "" {
		b.WriteString("<title>")
		e.escape(l.Title)
		b.WriteString("</title>\n")
	}
	for i, it := range l.Items {
		if err := e.item(i, it); err != nil {
			return err
		}
	}
	if o.Boxes {
		for i, it := range l.Items {
			if it.Kind == chart.Text {
				r := it.Box
				b.WriteString(`<rect fill="none" stroke="#ff00ff" stroke-width="0.1" x="`)
				e.num(r.X)
				b.WriteString(`" y="`)
				e.num(r.Y)
				b.WriteString(`" width="`)
				e.num(r.W)
				b.WriteString(`" height="`)
				e.num(r.H)
				b.WriteString(`"/>` + "\n")
				if e.err != nil {
					return &NotFiniteError{Item: i, Kind: it.Kind, Field: "box"}
				}
			}
		}
	}
	b.WriteString("</svg>\n")
	return nil
}

func (e *enc) item(i int, it chart.Item) error {
	b := &e.buf
	e.err = nil
	field := "points"
	switch it.Kind {
	case chart.Line:
		if len(it.Points) != 2 {
			return fmt.Errorf("svg: item %d (line) has %d points, want 2", i, len(it.Points))
		}
		b.WriteString(`<line x1="`)
		e.num(it.Points[0].X)
		b.WriteString(`" y1="`)
		e.num(it.Points[0].Y)
		b.WriteString(`" x2="`)
		e.num(it.Points[1].X)
		b.WriteString(`" y2="`)
		e.num(it.Points[1].Y)
		b.WriteString(`"`)
		e.stroke(it)
		b.WriteString("/>\n")
	case chart.Polyline, chart.Area:
		if len(it.Points) < 2 {
			return nil
		}
		if it.Kind == chart.Polyline {
			b.WriteString(`<polyline fill="none"`)
			e.stroke(it)
		} else {
			b.WriteString(`<polygon fill="`)
			b.WriteString(hex(it.Fill))
			b.WriteString(`"`)
			if it.Width > 0 {
				e.stroke(it)
			}
		}
		e.role(it.Role)
		b.WriteString(` points="`)
		for k, p := range it.Points {
			if k > 0 {
				b.WriteByte(' ')
			}
			e.num(p.X)
			b.WriteByte(',')
			e.num(p.Y)
		}
		b.WriteString(`"/>` + "\n")
	case chart.Text:
		field = "text position or size"
		if !(it.Size > 0) {
			e.err = errNotFinite
		}
		b.WriteString(`<text x="`)
		e.num(it.At.X)
		b.WriteString(`" y="`)
		e.num(it.At.Y)
		b.WriteString(`" font-size="`)
		e.num(it.Size)
		b.WriteString(`"`)
		if it.Bold {
			b.WriteString(` font-weight="bold"`)
		}
		if it.Anchor != chart.Start {
			b.WriteString(` text-anchor="` + it.Anchor.String() + `"`)
		}
		if it.Fill != (color.RGBA{0, 0, 0, 255}) {
			b.WriteString(` fill="` + hex(it.Fill) + `"`)
		}
		if it.Vertical {
			b.WriteString(` transform="rotate(-90 `)
			e.num(it.At.X)
			b.WriteByte(' ')
			e.num(it.At.Y)
			b.WriteString(`)"`)
		}
		e.role(it.Role)
		b.WriteByte('>')
		e.escape(it.Text)
		b.WriteString("</text>\n")
	default:
		return fmt.Errorf("svg: item %d has unknown kind %d", i, it.Kind)
	}
	if e.err != nil {
		return &NotFiniteError{Item: i, Kind: it.Kind, Field: field}
	}
	return nil
}

var errNotFinite = fmt.Errorf("not finite")

func (e *enc) stroke(it chart.Item) {
	b := &e.buf
	b.WriteString(` stroke="` + hex(it.Stroke) + `" stroke-width="`)
	e.num(it.Width)
	b.WriteString(`"`)
	if len(it.Dash) > 0 {
		b.WriteString(` stroke-dasharray="`)
		for k, d := range it.Dash {
			if k > 0 {
				b.WriteByte(' ')
			}
			e.num(d)
		}
		b.WriteString(`"`)
	}
}

func (e *enc) role(r string) {
	if r == "" {
		return
	}
	e.buf.WriteString(` class="`)
	e.escape(r)
	e.buf.WriteString(`"`)
}

// num writes v at the encoder's precision without trailing zeros; a value
// that is not finite is not written and is remembered as an error.
func (e *enc) num(v float64) {
	if !finite(v) {
		e.err = errNotFinite
		e.buf.WriteByte('0')
		return
	}
	var tmp [32]byte
	s := strconv.AppendFloat(tmp[:0], v, 'f', e.dec, 64)
	if bytes.IndexByte(s, '.') >= 0 {
		s = bytes.TrimRight(s, "0")
		s = bytes.TrimSuffix(s, []byte("."))
	}
	if string(s) == "-0" {
		s = s[1:]
	}
	e.buf.Write(s)
}

func (e *enc) escape(s string) {
	// EscapeText writes to a bytes.Buffer, which never fails.
	_ = xml.EscapeText(&e.buf, []byte(s))
}

func hex(c color.RGBA) string {
	const digits = "0123456789abcdef"
	return string([]byte{'#', digits[c.R>>4], digits[c.R&15], digits[c.G>>4], digits[c.G&15], digits[c.B>>4], digits[c.B&15]})
}

func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }
