//go:build js && wasm

package main

import (
	"time"

	"github.com/hajimehoshi/ebiten/v2"
	"github.com/hajimehoshi/ebiten/v2/inpututil"

	"setcard/wasm/session"
)

// game is the Ebiten game: input and state in Update, drawing in Draw.
type game struct {
	s       *session.Session
	p       *painter
	scale   float64 // device pixels per CSS pixel
	touches []ebiten.TouchID
	touchID ebiten.TouchID
	touchOn bool
	lastX   int
	lastY   int

	changed func() // tells the page that a control changed the project
	first   func() // called after the first frame is drawn
	frames  int
	t       *timings

	// The page is told of a change at most every notifyEvery while a
	// control is dragged, and at once when the drag ends: its table and
	// autosave need not run at the frame rate.
	pending    bool
	lastNotify time.Time

	// shown is what the screen holds: with the screen not cleared every
	// frame, a frame with nothing new draws nothing, and Ebiten skips it.
	shown frameKey
}

const notifyEvery = 150 * time.Millisecond

type frameKey struct {
	version int
	w, h    int
}

func (g *game) Update() error {
	start := time.Now()
	defer func() { g.t.update.add(time.Since(start)) }()

	s := g.s
	changed := false
	sc := g.scale
	// Mouse.
	mx, my := ebiten.CursorPosition()
	x, y := float64(mx)/sc, float64(my)/sc
	switch {
	case inpututil.IsMouseButtonJustPressed(ebiten.MouseButtonLeft):
		s.Press(x, y)
	case inpututil.IsMouseButtonJustReleased(ebiten.MouseButtonLeft):
		s.Release()
	case ebiten.IsMouseButtonPressed(ebiten.MouseButtonLeft):
		changed = s.Move(x, y) || changed
	}
	if mx != g.lastX || my != g.lastY {
		g.lastX, g.lastY = mx, my
		if s.Dragging() < 0 {
			s.Hover(x, y)
		}
	}
	// Touch: the first finger acts as the mouse.
	g.touches = inpututil.AppendJustPressedTouchIDs(g.touches[:0])
	if len(g.touches) > 0 && !g.touchOn {
		g.touchID, g.touchOn = g.touches[0], true
		tx, ty := ebiten.TouchPosition(g.touchID)
		s.Press(float64(tx)/sc, float64(ty)/sc)
		s.Hover(float64(tx)/sc, float64(ty)/sc)
	} else if g.touchOn {
		if inpututil.IsTouchJustReleased(g.touchID) {
			g.touchOn = false
			s.Release()
		} else {
			tx, ty := ebiten.TouchPosition(g.touchID)
			changed = s.Move(float64(tx)/sc, float64(ty)/sc) || changed
			if s.Dragging() < 0 {
				s.Hover(float64(tx)/sc, float64(ty)/sc)
			}
		}
	}
	// Keyboard.
	shift := ebiten.IsKeyPressed(ebiten.KeyShift)
	if repeat(ebiten.KeyTab) {
		if shift {
			s.Key(session.KeyPrev)
		} else {
			s.Key(session.KeyNext)
		}
	}
	for _, k := range []struct {
		key       ebiten.Key
		step, big session.Key
	}{
		{ebiten.KeyArrowRight, session.KeyUp, session.KeyBigUp},
		{ebiten.KeyArrowUp, session.KeyUp, session.KeyBigUp},
		{ebiten.KeyArrowLeft, session.KeyDown, session.KeyBigDown},
		{ebiten.KeyArrowDown, session.KeyDown, session.KeyBigDown},
		{ebiten.KeyPageUp, session.KeyBigUp, session.KeyBigUp},
		{ebiten.KeyPageDown, session.KeyBigDown, session.KeyBigDown},
		{ebiten.KeyHome, session.KeyMin, session.KeyMin},
		{ebiten.KeyEnd, session.KeyMax, session.KeyMax},
	} {
		if repeat(k.key) {
			if shift {
				changed = s.Key(k.big) || changed
			} else {
				changed = s.Key(k.step) || changed
			}
		}
	}
	if inpututil.IsKeyJustPressed(ebiten.KeyEscape) {
		leaveCanvas()
	}
	// Recompute here, in Update, so Draw only draws.
	t0 := time.Now()
	if s.Recompute() {
		g.t.recompute.add(time.Since(t0))
	}
	g.pending = g.pending || changed
	if g.pending && g.changed != nil && (s.Dragging() < 0 || time.Since(g.lastNotify) >= notifyEvery) {
		g.pending, g.lastNotify = false, time.Now()
		// After Update returns: the page's work is not the game's.
		g.changed()
	}
	return nil
}

// repeat reports a key press and its auto-repeat.
func repeat(k ebiten.Key) bool {
	d := inpututil.KeyPressDuration(k)
	return d == 1 || d > 24 && d%4 == 0
}

// Draw draws the chart and the overlay straight onto the screen. Each is
// batched into one DrawTriangles call (see painter), so redrawing the chart
// costs about as much as copying a cached copy of it would.
func (g *game) Draw(screen *ebiten.Image) {
	w, h := screen.Bounds().Dx(), screen.Bounds().Dy()
	now := frameKey{g.s.Version, w, h}
	if now == g.shown {
		return
	}
	start := time.Now()
	// The chart's background and the controls' panel cover the canvas
	// between them, so the screen is not cleared first.
	g.p.draw(screen, g.s.Chart().Items, g.scale)
	g.p.draw(screen, g.s.Overlay(), g.scale)
	g.shown = now
	g.t.draw.add(time.Since(start))
	g.frames++
	if g.frames == 1 && g.first != nil {
		g.first()
	}
}

func (g *game) Layout(outsideW, outsideH int) (int, int) {
	panic("setcard: LayoutF is used")
}

func (g *game) LayoutF(outsideW, outsideH float64) (float64, float64) {
	g.scale = ebiten.Monitor().DeviceScaleFactor()
	if g.scale <= 0 {
		g.scale = 1
	}
	g.s.Resize(outsideW, outsideH)
	return outsideW * g.scale, outsideH * g.scale
}
