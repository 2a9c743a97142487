// Package reduce holds argand's circuit work: series and parallel
// combination, dividers, Thevenin and Norton equivalents, Δ–Y conversion,
// series-parallel stepping and the nodal solution of any linear network.
// Every operation returns its result together with the steps that led to
// it. The package knows quantities (package calc) and never the screen.
package reduce

import (
	"fmt"
	"math"
	"math/cmplx"

	"argand/calc"
)

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
//
// Raw is the component value as written: resistance (Ω) for a resistor,
// inductance (H) for an inductor, capacitance (F) for a capacitor and
// impedance (Ω) for an impedance. Z follows from Raw and the frequency
// (see ImpedanceAt and Network.At).
type Element struct {
	Name     string
	Kind     ElementKind
	From, To string
	Z        complex128 // impedance for passive elements, Ω
	Value    complex128 // source phasor, V or A
	Line     int        // worksheet line that defined it, 0 if none
	Raw      complex128 // component value: R in Ω, L in H, C in F, Z in Ω
}

// Network is a set of elements joined at named nodes, with one node taken
// as the reference (0 V).
type Network struct {
	Name      string
	Reference string
	Elements  []Element
}

// ImpedanceAt returns the impedance of a passive element at freqHz from its
// raw value: Z = R for a resistor, Z = jωL for an inductor, Z = 1/(jωC) =
// −j/(ωC) for a capacitor and Z as given for an impedance, with ω = 2π·f
// (common practice). The frequency must be a positive finite number of
// hertz; an inductance or capacitance must be real and a capacitance
// non-zero (0 F is an open circuit, which has no finite impedance).
func (e Element) ImpedanceAt(freqHz float64) (complex128, error) {
	if e.Kind.IsSource() {
		return 0, fmt.Errorf("%s is a %s and has no impedance", e.Name, e.Kind)
	}
	if math.IsNaN(freqHz) || math.IsInf(freqHz, 0) || freqHz <= 0 {
		return 0, fmt.Errorf("frequency %g Hz: must be a positive finite number", freqHz)
	}
	if cmplx.IsNaN(e.Raw) || cmplx.IsInf(e.Raw) {
		return 0, fmt.Errorf("%s: value is not a finite number", e.Name)
	}
	w := calc.Context{Freq: freqHz}.Omega()
	var z complex128
	switch e.Kind {
	case Resistor:
		if imag(e.Raw) != 0 {
			return 0, fmt.Errorf("%s: a resistance must be real (use an impedance for a complex value)", e.Name)
		}
		z = e.Raw
	case Impedance:
		z = e.Raw
	case Inductor:
		if imag(e.Raw) != 0 {
			return 0, fmt.Errorf("%s: an inductance must be real", e.Name)
		}
		z = complex(0, w*real(e.Raw))
	case Capacitor:
		if imag(e.Raw) != 0 {
			return 0, fmt.Errorf("%s: a capacitance must be real", e.Name)
		}
		if real(e.Raw) == 0 {
			return 0, fmt.Errorf("%s: a capacitance of 0 F is an open circuit (no finite impedance)", e.Name)
		}
		z = complex(0, -1/(w*real(e.Raw)))
	default:
		return 0, fmt.Errorf("%s: unknown element kind", e.Name)
	}
	if cmplx.IsNaN(z) || cmplx.IsInf(z) {
		return 0, fmt.Errorf("%s: impedance at %g Hz is too large to represent", e.Name, freqHz)
	}
	return z, nil
}

// At returns a copy of the network with Z of every passive element set to
// its impedance at freqHz (see Element.ImpedanceAt). Sources are copied
// unchanged. The receiver is not modified.
func (n *Network) At(freqHz float64) (*Network, error) {
	c := *n
	c.Elements = make([]Element, len(n.Elements))
	copy(c.Elements, n.Elements)
	for i := range c.Elements {
		e := &c.Elements[i]
		if e.Kind.IsSource() {
			continue
		}
		z, err := e.ImpedanceAt(freqHz)
		if err != nil {
			return nil, err
		}
		e.Z = z
	}
	return &c, nil
}
