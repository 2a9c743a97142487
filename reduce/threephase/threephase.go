// Package threephase works three-phase circuits in sinusoidal steady state:
// line and phase quantities of balanced Y and Δ connections, symmetrical
// components, unbalanced Y and Δ loads on a balanced supply, and the
// two-wattmeter method. Every operation returns its results with the steps
// that show the work, and every result carries the caution of shared
// DESIGN.md, since three-phase supplies can kill.
//
// Conventions (shared DESIGN.md): a = 1∠120°; for the ABC (positive)
// sequence the phase voltages are V_a, V_b = V_a∠−120°, V_c = V_a∠+120°,
// the line voltage V_ab = √3·V_an∠+30° and, in Δ, the line current
// I_a = √3·I_ab∠−30°; for ACB both signs flip. Phasors are RMS unless the
// basis says peak, and S = V·I* (½·V·I* for peak).
package threephase

import (
	"errors"
	"fmt"
	"math"
	"math/cmplx"

	"argand/calc"
)

// Sequence is the phase sequence: ABC (positive) or ACB (negative).
type Sequence int

const (
	ABC Sequence = 1
	ACB Sequence = -1
)

func (s Sequence) String() string {
	if s == ACB {
		return "ACB"
	}
	return "ABC"
}

// SequenceOf reads the phase sequence of a context; an unset (zero)
// sequence is ABC, the default of shared DESIGN.md.
func SequenceOf(c *calc.Context) Sequence {
	if c != nil && c.Sequence < 0 {
		return ACB
	}
	return ABC
}

func (s Sequence) check() error {
	if s != ABC && s != ACB {
		return fmt.Errorf("phase sequence must be ABC (+1) or ACB (−1), not %d", int(s))
	}
	return nil
}

// sign is +1 for ABC and −1 for ACB.
func (s Sequence) sign() float64 { return float64(s) }

// Connection is how the three phases of a load are joined.
type Connection uint8

const (
	Wye Connection = iota
	Delta
)

func (c Connection) String() string {
	if c == Delta {
		return "Δ"
	}
	return "Y"
}

var sqrt3 = math.Sqrt(3)

// a is the operator 1∠120°, written from its exact parts so that
// 1 + a + a² vanishes to rounding.
var (
	opA  = complex(-0.5, math.Sqrt(3)/2)
	opA2 = complex(-0.5, -math.Sqrt(3)/2)
)

// A returns the operator a = 1∠120°.
func A() complex128 { return opA }

// shift30 returns 1∠(sign·30°).
func shift30(sign float64) complex128 { return complex(sqrt3/2, sign*0.5) }

// rot120 returns 1∠(sign·120°): a for +1, a² for −1.
func rot120(sign float64) complex128 {
	if sign < 0 {
		return opA2
	}
	return opA
}

// phaseSet returns the supply phase voltages (or line voltages) of a
// balanced set from the first: for ABC, X_b = X_a∠−120°, X_c = X_a∠+120°.
func phaseSet(x complex128, s Sequence) [3]complex128 {
	g := s.sign()
	return [3]complex128{x, x * rot120(-g), x * rot120(g)}
}

// basisFactor is the factor in S = k·V·I*: 1 for RMS, ½ for peak.
func basisFactor(b calc.Basis) float64 {
	if b == calc.Peak {
		return 0.5
	}
	return 1
}

func powerFormula(b calc.Basis, n string) string {
	if b == calc.Peak {
		if n == "" {
			return "S = ½·V·I* (peak phasors)"
		}
		return "S = " + n + "·½·V_ph·I_ph* (peak phasors)"
	}
	if n == "" {
		return "S = V·I* (RMS phasors)"
	}
	return "S = " + n + "·V_ph·I_ph* (RMS phasors)"
}

// powers splits a complex power into P (W), Q (var) and |S| (VA).
// A part below 1e-12 of the other is a rounding leftover and is 0, in the
// fields as on the screen (calc.Leftover, relative to |S|).
func powers(s complex128) (sq, p, q, mag calc.Quantity) {
	s = calc.Leftover(s, s)
	sq = calc.Quantity{V: s, Dim: calc.DimPower, Kind: calc.KindApparent}
	p = calc.Quantity{V: complex(real(s), 0), Dim: calc.DimPower, Kind: calc.KindActive}
	q = calc.Quantity{V: complex(imag(s), 0), Dim: calc.DimPower, Kind: calc.KindReactive}
	mag = calc.Quantity{V: complex(cmplx.Abs(s), 0), Dim: calc.DimPower, Kind: calc.KindMagnitude}
	return
}

// pfNote describes the power factor of S under IEEE Std 1459-2010.
func pfNote(s complex128) string {
	m := cmplx.Abs(s)
	if m == 0 {
		return "power factor undefined: S = 0"
	}
	pf := real(s) / m
	word := "unity"
	switch {
	case imag(s) > 1e-12*m:
		word = "lagging (inductive)"
	case imag(s) < -1e-12*m:
		word = "leading (capacitive)"
	}
	note := fmt.Sprintf("power factor %.4g %s", math.Abs(pf), word)
	if pf < 0 {
		note += "; P < 0: the load is delivering power"
	}
	return note
}

func checked(q calc.Quantity, what string) (calc.Quantity, error) {
	r, err := q.Check(what)
	if err != nil {
		return calc.Quantity{}, err
	}
	return r, nil
}

func checkAll(what string, qs ...calc.Quantity) error {
	for _, q := range qs {
		if _, err := q.Check(what); err != nil {
			return err
		}
	}
	return nil
}

func needDim(q calc.Quantity, d calc.Dim, what string) error {
	if q.Dim != d {
		return fmt.Errorf("%s must be %s, not %s", what, calc.DimWord(d), calc.DimWord(q.Dim))
	}
	if _, err := q.Check(what); err != nil {
		return err
	}
	return nil
}

// errShort is returned when a zero impedance shorts the supply.
var errShort = errors.New("short circuit")

func op(name string, q calc.Quantity) calc.Operand { return calc.Operand{Name: name, Value: q} }

func volt(v complex128) calc.Quantity { return calc.Q(v, calc.DimVoltage) }
func amp(v complex128) calc.Quantity  { return calc.Q(v, calc.DimCurrent) }
