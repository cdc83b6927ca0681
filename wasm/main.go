//go:build js && wasm

// Command wasm is Setcard in the browser: the calculation core, an Ebiten
// canvas that draws the chart and its on-canvas controls, and a small
// bridge (globalThis.setcardCore) for the page around it. It runs inside
// the page's chart frame (chart.html), because Ebiten takes the whole
// document it runs in.
package main

import (
	"syscall/js"

	"github.com/hajimehoshi/ebiten/v2"

	"setcard/calc"
	"setcard/wasm/session"
)

func main() {
	p := newPainter()
	s, err := session.New(demoProject(), p.measure)
	if err != nil {
		panic("setcard: the built-in demo project is invalid: " + err.Error())
	}
	g := &game{s: s, p: p, scale: 1, t: newTimings()}
	b := &bridge{g: g}
	g.changed = b.notifyChanged
	g.first = func() { host("firstDraw") }
	b.register()
	host("coreReady")

	if js.Global().Get("setcardNoGL").Truthy() {
		// No WebGL: the page draws the chart as SVG through the bridge.
		select {}
	}
	ebiten.SetWindowTitle("Setcard chart")
	ebiten.SetRunnableOnUnfocused(true)
	ebiten.SetScreenClearedEveryFrame(false)
	if err := ebiten.RunGameWithOptions(g, &ebiten.RunGameOptions{InitUnfocused: true}); err != nil {
		js.Global().Get("console").Call("error", "setcard: canvas: "+err.Error())
		host("noCanvas", err.Error())
		select {}
	}
}

// host calls a method of the page's setcardHost, if the page has one.
func host(method string, args ...any) {
	parent := js.Global().Get("parent")
	if !parent.Truthy() {
		return
	}
	h := parent.Get("setcardHost")
	if !h.Truthy() || h.Get(method).Type() != js.TypeFunction {
		return
	}
	h.Call(method, args...)
}

// leaveCanvas gives the keyboard back to the page (Escape on the canvas).
func leaveCanvas() {
	if el := js.Global().Get("document").Get("activeElement"); el.Truthy() {
		el.Call("blur")
	}
	host("leaveCanvas")
}

// demoProject is the project shown before the page sends one.
func demoProject() *calc.Project {
	p, err := calc.DecodeBytes(demoJSON)
	if err != nil {
		panic("setcard: the built-in demo project does not decode: " + err.Error())
	}
	return p
}
