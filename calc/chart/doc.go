// Package chart lays out Setcard's drawings once, as plain data, for every
// renderer to draw: the chart of required set against capacity, and the
// one-page site card that carries it.
//
// A Layout is a list of Items in drawing order (lines, polylines, filled
// areas and single lines of text) in the layout's own units: px for a
// screen, mm for a page. Text sizes are in the same units. A renderer
// multiplies every coordinate by one scale factor and does no other
// arithmetic: hatching is laid out as lines, already clipped; labels are
// already placed clear of one another and fitted to their boxes, with
// the widths that the Measure in the options gives (SansMeasure, an
// approximate table for a generic sans-serif face, by default; a renderer
// with a real font passes its own).
//
// The chart's Plot keeps the frame, the axes' ranges and the curves in
// data space, so that an interactive canvas can draw a crosshair and read
// the curves without laying out again.
//
// The numbers drawn come from the calculation core (package calc) and are
// not worked out again here: the criterion printed for a drop is its
// TableRow, rounded down there.
//
// The card carries the cautions of the method: the formula is an aid to
// judgement, capacities must be confirmed as local codes require, and a
// licensed engineer approves the criterion.
package chart
