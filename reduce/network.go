// Package reduce holds argand's circuit work: series and parallel
// combination, dividers, Thevenin and Norton equivalents, Δ–Y conversion,
// series-parallel stepping and the nodal solution of any linear network.
// Every operation returns its result together with the steps that led to
// it. The package knows quantities (package calc) and never the screen.
package reduce

// ElementKind says what an element is. The kind is always given by a word
// in the worksheet, never guessed from the element's name.
type ElementKind uint8

const (
	Resistor ElementKind = iota
	Inductor
	Capacitor
	Impedance
	VoltageSource
	CurrentSource
)

var kindWords = [...]string{"resistor", "inductor", "capacitor", "impedance", "voltage source", "current source"}

func (k ElementKind) String() string {
	if int(k) < len(kindWords) {
		return kindWords[k]
	}
	return "element"
}

// IsSource reports whether the element is an independent source.
func (k ElementKind) IsSource() bool { return k == VoltageSource || k == CurrentSource }

// Element is one two-terminal element of a network, oriented from node
// From to node To. For a passive element Z is its impedance at the working
// frequency (Ω); the voltage across it is V(From) − V(To) and its current
// flows from From to To through it (passive sign convention, IEC 60375).
// A voltage source raises the potential from From to To by Value
// (V(To) − V(From) = Value); a current source drives Value from From to To
// through itself, that is into node To.
type Element struct {
	Name     string
	Kind     ElementKind
	From, To string
	Z        complex128 // impedance for passive elements, Ω
	Value    complex128 // source phasor, V or A
	Line     int        // worksheet line that defined it, 0 if none
}

// Network is a set of elements joined at named nodes, with one node taken
// as the reference (0 V).
type Network struct {
	Name      string
	Reference string
	Elements  []Element
}
