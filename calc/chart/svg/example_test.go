package svg_test

import (
	"bufio"
	"bytes"
	"fmt"
	"os"

	"setcard/calc"
	"setcard/calc/chart"
	"setcard/calc/chart/svg"
)

// A layout made by hand: a page 60 × 20 mm with a line and a text. Text
// is escaped, numbers have at most two decimals.
func ExampleWrite() {
	l := &chart.Layout{W: 60, H: 20, Unit: "mm", Title: "Pier 3 & 4", Items: []chart.Item{
		{Kind: chart.Line, Points: []chart.Point{{X: 5, Y: 15}, {X: 55, Y: 15}}, Width: 0.5, Stroke: chart.Ink},
		{Kind: chart.Text, Text: "set < 15 mm", At: chart.Point{X: 30, Y: 12}, Size: 4.2333, Bold: true, Anchor: chart.Middle, Fill: chart.Black},
	}}
	if err := svg.Write(os.Stdout, l, svg.Options{}); err != nil {
		fmt.Println(err)
	}
	// Output:
	// <?xml version="1.0" encoding="UTF-8"?>
	// <svg xmlns="http://www.w3.org/2000/svg" version="1.1" width="60mm" height="20mm" viewBox="0 0 60 20" font-family="sans-serif" stroke-linejoin="round">
	// <title>Pier 3 &amp; 4</title>
	// <line x1="5" y1="15" x2="55" y2="15" stroke="#191919" stroke-width="0.5"/>
	// <text x="30" y="12" font-size="4.23" font-weight="bold" text-anchor="middle">set &lt; 15 mm</text>
	// </svg>
}

// The site card of the demo project, as the command writes it.
func ExampleWrite_card() {
	data, err := os.ReadFile("../../../testdata/demo.json")
	if err != nil {
		fmt.Println(err)
		return
	}
	p, err := calc.DecodeBytes(data)
	if err != nil {
		fmt.Println(err)
		return
	}
	m, err := calc.Resolve(p)
	if err != nil {
		fmt.Println(err)
		return
	}
	var buf bytes.Buffer
	if err := svg.Write(&buf, chart.Card(m, chart.CardOptions{Paper: chart.A4}), svg.Options{}); err != nil {
		fmt.Println(err)
		return
	}
	sc := bufio.NewScanner(&buf)
	for i := 0; i < 3 && sc.Scan(); i++ {
		fmt.Println(sc.Text())
	}
	// Output:
	// <?xml version="1.0" encoding="UTF-8"?>
	// <svg xmlns="http://www.w3.org/2000/svg" version="1.1" width="297mm" height="210mm" viewBox="0 0 297 210" font-family="sans-serif" stroke-linejoin="round">
	// <title>Demo: lakeside boardwalk, timber bearing piles (invented)</title>
}
