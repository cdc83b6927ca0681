package chart

import "testing"

// BenchmarkChartLayout lays out the chart of the demo at a screen size.
func BenchmarkChartLayout(b *testing.B) {
	m := load(b, "demo.json")
	for b.Loop() {
		Chart(m, ChartOptions{W: 800, H: 500})
	}
}

// BenchmarkCardLayout lays out the A4 card of the demo.
func BenchmarkCardLayout(b *testing.B) {
	m := load(b, "demo.json")
	for b.Loop() {
		Card(m, CardOptions{})
	}
}

// BenchmarkCardLayoutCrowded lays out the A4 card of twelve drops.
func BenchmarkCardLayoutCrowded(b *testing.B) {
	m := load(b, "cards/crowded.json")
	for b.Loop() {
		Card(m, CardOptions{})
	}
}
