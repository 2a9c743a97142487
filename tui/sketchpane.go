package tui

import (
	"fmt"
	"strings"

	"argand/calc"
	"argand/tui/sketch"
)

// sketchPane draws the marked rows (or the selected one) as arrows, and
// one complex power on its own as its power triangle. It has no keys: the
// parent sets what it draws (SetValues) and its size; View draws it.
type sketchPane struct {
	th            theme
	markKey       string // the entries table's key that marks a row
	width, height int
	values        []namedValue
	marked        bool // the values are the marked rows, not the selection
	comma         bool
	c             *sketchCache
}

// namedValue is a row drawn: its name and value.
type namedValue struct {
	name string
	q    calc.Quantity
}

// sketchCache keeps the last drawing: the sketch is redrawn only when
// what it shows changes.
type sketchCache struct {
	key   string
	lines []string
}

func newSketchPane(km KeyMap, th theme) sketchPane {
	return sketchPane{th: th, markKey: firstKey(km.Table.Mark), width: 30, height: 10, c: &sketchCache{}}
}

// SetSize sets the pane's size, its heading included.
func (p *sketchPane) SetSize(w, h int) { p.width, p.height = w, h }

// SetValues sets the rows drawn; marked says they are the marked rows
// rather than the selected one. comma writes numbers with the decimal
// comma.
func (p *sketchPane) SetValues(vs []namedValue, marked, comma bool) {
	p.values, p.marked, p.comma = vs, marked, comma
}

// View draws the pane.
func (p sketchPane) View() string {
	k := fmt.Sprintf("%v|%v|%d|%d|%v|%v", p.values, p.marked, p.width, p.height, p.th.ascii, p.comma)
	if k != p.c.key {
		p.c.key, p.c.lines = k, p.draw()
	}
	return strings.Join(p.c.lines, "\n")
}

// triangle returns the complex power drawn as its power triangle: one
// on its own.
func (p sketchPane) triangle() (namedValue, bool) {
	if len(p.values) == 1 {
		if v := p.values[0]; v.q.Dim == calc.DimPower && v.q.Kind == calc.KindApparent && v.q.V != 0 {
			return v, true
		}
	}
	return namedValue{}, false
}

// Heading is the pane's title and what it shows, for a layout that
// writes its own heading line.
func (p sketchPane) Heading() (title, info string) {
	if v, ok := p.triangle(); ok {
		return "power triangle", p.th.tr(v.name + ": P, Q and S")
	}
	what := "marked rows"
	if !p.marked && len(p.values) > 0 {
		what = "selected row; " + p.markKey + " marks more"
	}
	return "sketch", p.th.tr(what)
}

// draw draws the pane's lines.
func (p sketchPane) draw() []string {
	w, h := p.width, p.height
	opt := sketch.Options{ASCII: p.th.ascii, Comma: p.comma}
	title, info := p.Heading()
	if v, ok := p.triangle(); ok {
		out := []string{p.th.section(title, info, w)}
		return append(out, sketch.Triangle(real(v.q.V), imag(v.q.V), w, h-1, opt)...)
	}
	items := make([]sketch.Item, 0, len(p.values))
	var skipped []string
	for _, v := range p.values {
		if !drawable(v.q) {
			// a magnitude, a signed real or a count has no angle: an
			// arrow at 0° would claim one
			skipped = append(skipped, v.name)
			continue
		}
		items = append(items, sketch.Item{Label: v.name, V: sketchValue(v.q), Unit: calc.UnitSymbol(v.q.Dim, v.q.Kind, p.th.ascii)})
	}
	out := []string{p.th.section(title, info, w)}
	rows := h - 1
	var note string
	if len(skipped) > 0 {
		note = p.th.tr(strings.Join(skipped, ", ") + ": no angle, not drawn")
		if len([]rune(note)) > w {
			note = string([]rune(note)[:w])
		}
		rows--
	}
	if len(items) == 0 {
		out = append(out, p.th.dim.Render("nothing to draw"))
	} else {
		out = append(out, sketch.Render(items, w, rows, opt)...)
	}
	if note != "" {
		out = append(out, p.th.dim.Render(note))
	}
	return out
}

// drawable reports a quantity that has a direction in the complex plane:
// a phasor or complex quantity that is not zero. A real number of a kind
// that is real by meaning (an active or reactive power, a resistance, a
// magnitude) or a zero phasor has no angle, and an arrow along an axis
// would claim one.
func drawable(q calc.Quantity) bool {
	return q.HasAngle() && q.Kind != calc.KindAngle
}

// sketchValue is where a quantity is drawn in the complex plane. A
// reactive power kept as a real number of var is the imaginary part of
// S = P + jQ, so it is drawn as j·Q; an active power stays on the real
// axis, where P lies.
func sketchValue(q calc.Quantity) complex128 {
	if q.Dim == calc.DimPower && q.Kind == calc.KindReactive && imag(q.V) == 0 {
		return complex(0, real(q.V))
	}
	return q.V
}
