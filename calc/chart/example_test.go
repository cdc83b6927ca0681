package chart_test

import (
	"fmt"
	"os"

	"setcard/calc"
	"setcard/calc/chart"
)

// demo reads the demo project.
func demo() (*calc.Model, error) {
	data, err := os.ReadFile("../../testdata/demo.json")
	if err != nil {
		return nil, err
	}
	p, err := calc.DecodeBytes(data)
	if err != nil {
		return nil, err
	}
	return calc.Resolve(p)
}

// A chart for a screen: the layout is plain data, drawn by any renderer
// with one scale factor; its plot gives the axes and the curves.
func ExampleChart() {
	m, err := demo()
	if err != nil {
		fmt.Println(err)
		return
	}
	l := chart.Chart(m, chart.ChartOptions{W: 640, H: 400})
	p := l.Plot
	fmt.Printf("%g × %g %s\n", l.W, l.H, l.Unit)
	fmt.Printf("x: %g to %g kN design; y: %g to %g mm per 10 blows\n", p.XMinKN, p.XMaxKN, p.YMinMm10, p.YMaxMm10)
	for _, s := range p.Series {
		fmt.Printf("drop %s: stop at %s mm per 10 blows\n", s.Label, chart.FormatSet10(s.RequiredMm10))
	}
	// Output:
	// 640 × 400 px
	// x: 0 to 200 kN design; y: 0 to 180 mm per 10 blows
	// drop 0.6 m: stop at 18.0 mm per 10 blows
	// drop 0.9 m: stop at 50.9 mm per 10 blows
	// drop 1.2 m: stop at 83.9 mm per 10 blows
	// drop 1.5 m: stop at 116.8 mm per 10 blows
}

// A crosshair: turn a pointer position into capacity and set, and read
// each curve at that capacity, without laying the chart out again.
func ExamplePlot_KNAt() {
	m, err := demo()
	if err != nil {
		fmt.Println(err)
		return
	}
	p := chart.Chart(m, chart.ChartOptions{}).Plot
	x, y := p.XOf(100), p.YOf(50)
	fmt.Printf("pointer at %.0f kN, %.0f mm per 10 blows\n", p.KNAt(x), p.SetAt(y))
	if set, ok := p.Series[1].SetAt(p.KNAt(x)); ok {
		fmt.Printf("drop %s proves %.0f kN at %.0f mm per 10 blows\n", p.Series[1].Label, p.KNAt(x), set)
	}
	// Output:
	// pointer at 100 kN, 50 mm per 10 blows
	// drop 0.9 m proves 100 kN at 51 mm per 10 blows
}

// The card is a page in millimetres, A4 or US Letter landscape.
func ExampleCard() {
	m, err := demo()
	if err != nil {
		fmt.Println(err)
		return
	}
	l := chart.Card(m, chart.CardOptions{Paper: chart.Letter})
	fmt.Printf("%g × %g %s\n", l.W, l.H, l.Unit)
	for _, it := range l.Texts() {
		if it.Role == "drop" || it.Role == "set10" {
			fmt.Print(it.Text, "  ")
		}
		if it.Role == "set1" {
			fmt.Println(it.Text, "per blow")
		}
	}
	// Output:
	// 279.4 × 215.9 mm
	// 0.6 m  18.0 mm  1.80 mm per blow
	// 0.9 m  50.9 mm  5.09 mm per blow
	// 1.2 m  83.9 mm  8.39 mm per blow
	// 1.5 m  116.8 mm  11.68 mm per blow
}

func ExampleNiceStep() {
	fmt.Println(chart.NiceStep(180, 9), chart.NiceStep(175, 8), chart.NiceStep(1, 4))
	fmt.Println(chart.Ticks(0, 175, chart.NiceStep(175, 8)))
	// Output:
	// 20 50 0.5
	// [0 50 100 150 200]
}

// Sets are printed rounded down, so that the card never asks for a set
// larger than the one computed.
func ExampleFormatSet10() {
	fmt.Println(chart.FormatSet10(25.86), chart.FormatSet1(2.586))
	// Output: 25.8 2.58
}

func ExampleClean() {
	fmt.Printf("%q\n", chart.Clean(" Pier\t3 \u202eright-to-left override\u202c\n"))
	// Output: "Pier 3 right-to-left override"
}

func ExamplePaperSize() {
	for _, p := range []chart.Paper{chart.A4, chart.Letter, "a3"} {
		w, h, ok := chart.PaperSize(p)
		fmt.Println(p, w, h, ok)
	}
	// Output:
	// a4 297 210 true
	// letter 279.4 215.9 true
	// a3 0 0 false
}

func ExampleSansMeasure() {
	fmt.Printf("%.2f %.2f\n", chart.SansMeasure("116.8 mm", 5, true), chart.SansMeasure("116.8 mm", 5, false))
	// Output: 27.98 25.64
}
