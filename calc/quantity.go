package calc

import (
	"math"
	"math/cmplx"
)

// Kind refines how a quantity is displayed when one dimension has several
// names. Power has a single dimension (V·A) but an engineer reads real power
// in W, reactive power in var and apparent or complex power in VA. An angle
// is dimensionless but shown in the angle unit of the worksheet.
type Kind uint8

const (
	KindPlain    Kind = iota
	KindActive        // real power, W
	KindReactive      // reactive power, var
	KindApparent      // apparent or complex power, VA
	KindAngle         // a plane angle held in radians
	// KindTurn marks a product of an angle and a quantity that counts no
	// cycles, such as 2π·R·C: the angle is per cycle, so the product is
	// per cycle too (2π·R·C is a period) and 1/(2π·R·C) is in Hz.
	// Shown as a plain value.
	KindTurn
)

// Quantity is a complex value with a physical dimension. Phasors,
// impedances, admittances, powers and plain numbers are all quantities.
type Quantity struct {
	V    complex128
	Dim  Dim
	Kind Kind
}

// Q returns a quantity of dimension d.
func Q(v complex128, d Dim) Quantity { return Quantity{V: v, Dim: d} }

// Real returns a real quantity of dimension d.
func Real(x float64, d Dim) Quantity { return Quantity{V: complex(x, 0), Dim: d} }

// Number returns a dimensionless quantity.
func Number(v complex128) Quantity { return Quantity{V: v} }

// Angle returns a dimensionless quantity marked as an angle in radians.
func Angle(rad float64) Quantity { return Quantity{V: complex(rad, 0), Kind: KindAngle} }

// IsReal reports whether the imaginary part is exactly zero.
func (q Quantity) IsReal() bool { return imag(q.V) == 0 }

// Mag returns |q| as a real quantity of the same dimension.
func (q Quantity) Mag() float64 { return cmplx.Abs(q.V) }

// finite reports whether both parts are finite numbers.
func finite(v complex128) bool {
	return !math.IsNaN(real(v)) && !math.IsNaN(imag(v)) &&
		!math.IsInf(real(v), 0) && !math.IsInf(imag(v), 0)
}

// Check returns an error when q holds NaN or an infinity, so that no such
// value is ever shown. op names the operation for the message.
func (q Quantity) Check(op string) (Quantity, error) {
	if finite(q.V) && !math.IsInf(cmplx.Abs(q.V), 0) {
		if !q.Dim.fits() {
			return Quantity{}, errorf("%s: dimension exponent out of range", op)
		}
		return q, nil
	}
	if math.IsNaN(real(q.V)) || math.IsNaN(imag(q.V)) {
		return Quantity{}, errorf("%s: result is undefined (not a number)", op)
	}
	return Quantity{}, errorf("%s: overflow (result too large to represent)", op)
}

// sumKind is the display kind of a sum or difference.
func sumKind(a, b Kind) Kind {
	if a == b {
		return a
	}
	plain := func(k Kind) bool { return k == KindAngle || k == KindPlain || k == KindTurn }
	if plain(a) && plain(b) {
		return KindPlain
	}
	return KindApparent
}

// scaleKind is the display kind of a quantity multiplied or divided by a
// dimensionless factor: an angle stays an angle and a power keeps its kind,
// unless the factor is complex, which mixes real and reactive parts.
func scaleKind(k Kind, factor complex128) Kind {
	if imag(factor) != 0 {
		if k == KindActive || k == KindReactive {
			return KindApparent
		}
		if k == KindAngle {
			return KindPlain
		}
	}
	return k
}

// quadrature refuses a sum of a real power in W and a reactive power in
// var held as plain reals: they are at right angles, S = P + jQ (IEEE Std
// 1459-2010), so adding them as numbers (800 W + 600 var = 1400) would be
// a silent error.
func quadrature(a, b Quantity, op string) error {
	if !(a.Kind == KindActive && b.Kind == KindReactive || a.Kind == KindReactive && b.Kind == KindActive) {
		return nil
	}
	if !a.IsReal() || !b.IsReal() {
		return nil
	}
	return errorf("cannot %s W and var as plain numbers: real and reactive power are at right angles; write P + j·Q (S = P + jQ)", op)
}

// Add returns a+b; both must have the same dimension.
func Add(a, b Quantity) (Quantity, error) {
	if a.Dim != b.Dim {
		return Quantity{}, &DimError{Op: "+", A: a.Dim, B: b.Dim}
	}
	if err := quadrature(a, b, "add"); err != nil {
		return Quantity{}, err
	}
	return Quantity{V: cancel(a.V+b.V, a.V, b.V), Dim: a.Dim, Kind: sumKind(a.Kind, b.Kind)}.Check("addition")
}

// cancel returns s, the sum of a and b, or 0 when the terms cancel to
// within rounding: j1 Ω + (−j0.9999999999999997 Ω) at series resonance is a
// short, not 333e-18 Ω. Four units in the last place of the larger term
// are below anything the inputs can tell.
func cancel(s, a, b complex128) complex128 {
	const ulps = 4 * 2.220446049250313e-16
	if cmplx.Abs(s) <= ulps*math.Max(cmplx.Abs(a), cmplx.Abs(b)) {
		return 0
	}
	return s
}

// Sub returns a−b; both must have the same dimension.
func Sub(a, b Quantity) (Quantity, error) {
	if a.Dim != b.Dim {
		return Quantity{}, &DimError{Op: "−", A: a.Dim, B: b.Dim}
	}
	if err := quadrature(a, b, "subtract"); err != nil {
		return Quantity{}, err
	}
	return Quantity{V: cancel(a.V-b.V, a.V, b.V), Dim: a.Dim, Kind: sumKind(a.Kind, b.Kind)}.Check("subtraction")
}

// Mul returns a·b.
func Mul(a, b Quantity) (Quantity, error) {
	if r, ok := turns(a, b); ok {
		return r.Check("multiplication")
	}
	if r, ok := turns(b, a); ok {
		return r.Check("multiplication")
	}
	if err := cycleMix(a.Dim, b.Dim, "×"); err != nil {
		return Quantity{}, err
	}
	r := Quantity{V: a.V * b.V, Dim: a.Dim.Mul(b.Dim)}
	r.Kind = productKind(a, b, r.Dim)
	return r.Check("multiplication")
}

// perCycle reports a factor that counts per cycle: an angle (2π is one
// turn, in rad per cycle) or a product already marked KindTurn.
func perCycle(q Quantity) bool {
	return q.IsReal() && (q.Kind == KindTurn || q.Kind == KindAngle && q.Dim.IsDimensionless())
}

// turns multiplies a per-cycle factor (see perCycle) by x. Against a
// quantity that counts cycles the cycle goes and what is left is angular:
// 2π·f in Hz is ω in rad/s, 360°·f·Δt is a phase angle. Against anything
// else the product stays per cycle (KindTurn), so that 2π·R·C is a period
// and its reciprocal a frequency in Hz.
func turns(angle, x Quantity) (Quantity, bool) {
	if !perCycle(angle) || x.Kind == KindAngle || x.Kind == KindTurn {
		return Quantity{}, false
	}
	d := angle.Dim.Mul(x.Dim)
	switch {
	case x.Dim[BaseCycle] > 0:
		d[BaseCycle]--
		k := KindPlain
		if d.IsDimensionless() || d == DimAngularFrequency {
			k = KindAngle
		}
		return Quantity{V: angle.V * x.V, Dim: d, Kind: k}, true
	case x.Dim[BaseCycle] == 0 && !x.Dim.IsDimensionless():
		return Quantity{V: angle.V * x.V, Dim: d, Kind: KindTurn}, true
	}
	return Quantity{}, false
}

// Div returns a/b. Division by an exact zero is an error.
func Div(a, b Quantity) (Quantity, error) {
	if b.V == 0 {
		return Quantity{}, errorf("division by zero")
	}
	// over a per-cycle factor cycles are counted again: ω/2π = f, and
	// 1/(2π·R·C) = 1/(a period) is a frequency in Hz
	if perCycle(b) && a.Kind != KindTurn && (a.Kind == KindAngle && !a.Dim.IsDimensionless() || b.Kind == KindTurn && b.Dim[BaseSecond] > 0) {
		d := a.Dim.Div(b.Dim)
		d[BaseCycle]++
		return Quantity{V: a.V / b.V, Dim: d}.Check("division")
	}
	if err := cycleMix(a.Dim, b.Dim.Pow(-1), "÷"); err != nil {
		return Quantity{}, err
	}
	r := Quantity{V: a.V / b.V, Dim: a.Dim.Div(b.Dim)}
	switch {
	case b.Dim.IsDimensionless() && b.Kind != KindAngle:
		r.Kind = scaleKind(a.Kind, b.V)
	case r.Dim == DimPower:
		r.Kind = KindApparent
	}
	return r.Check("division")
}

func productKind(a, b Quantity, d Dim) Kind {
	switch {
	case (a.Kind == KindAngle || b.Kind == KindAngle) && d.IsDimensionless() && a.Kind != b.Kind && imag(a.V) == 0 && imag(b.V) == 0:
		return KindAngle // ω·t is an angle
	case a.Dim.IsDimensionless() && a.Kind != KindAngle:
		return scaleKind(b.Kind, a.V)
	case b.Dim.IsDimensionless() && b.Kind != KindAngle:
		return scaleKind(a.Kind, b.V)
	case d == DimPower:
		return KindApparent
	}
	return KindPlain
}

// cycleMix rejects products that multiply a frequency in Hz by an inductance
// or capacitance (or their reciprocals): f·L looks like a reactance but is
// off by 2π, the most common slip in reactance work.
func cycleMix(a, b Dim, op string) error {
	r := a.Mul(b)
	if r[BaseCycle] == 0 || (a[BaseCycle] == 0) == (b[BaseCycle] == 0) {
		return nil
	}
	// a product with the cycle that lands on an electrical dimension
	c := r
	c[BaseCycle] = 0
	switch c {
	case DimImpedance, DimAdmittance:
		return &CycleError{Op: op, A: a, B: b}
	}
	return nil
}

// Neg returns −a. A zero part stays +0: −(4+0i) is −4+0i, not −4−0i,
// which would put it on the other side of the branch cut of √ and ln.
func Neg(a Quantity) Quantity { return Quantity{V: unsignZero(-a.V), Dim: a.Dim, Kind: a.Kind} }

// unsignZero turns a −0 part into +0 (−0 + 0 is +0 in IEEE 754), so the
// principal branch of √, ln and powers does not depend on the sign of a
// zero that no one can see: √(−4) is j2, never −j2.
func unsignZero(v complex128) complex128 { return complex(real(v)+0, imag(v)+0) }

// Conj returns the complex conjugate.
func Conj(a Quantity) Quantity {
	k := a.Kind
	return Quantity{V: cmplx.Conj(a.V), Dim: a.Dim, Kind: k}
}

// Recip returns 1/a.
func Recip(a Quantity) (Quantity, error) {
	if a.V == 0 {
		return Quantity{}, errorf("division by zero (reciprocal of 0)")
	}
	r, err := Div(Number(1), a)
	if err != nil {
		return Quantity{}, err
	}
	r.Kind = KindPlain
	return r, nil
}

// Pow returns a^b for a dimensionless exponent b, using the principal
// branch. A dimensioned base needs a real exponent whose result keeps whole
// exponents: an integer, or 1/n where every exponent divides by n.
func Pow(a, b Quantity) (Quantity, error) {
	if !b.Dim.IsDimensionless() {
		return Quantity{}, errorf("an exponent must be dimensionless, not %s", DimName(b.Dim, false))
	}
	d := Dimensionless
	if !a.Dim.IsDimensionless() {
		if imag(b.V) != 0 {
			return Quantity{}, errorf("a quantity with a unit (%s) cannot be raised to a complex power", DimName(a.Dim, false))
		}
		e := real(b.V)
		switch {
		case e == math.Trunc(e):
			// check the exponents in int: Dim.Pow works in int8 and would wrap
			for _, x := range a.Dim {
				if math.Abs(float64(x)*e) > 60 {
					return Quantity{}, errorf("the power %g of %s is out of range: unit exponents are limited to ±60", e, DimName(a.Dim, false))
				}
			}
			d = a.Dim.Pow(int(e))
		case math.Abs(e) <= 0.5 && math.Abs(1/e-math.Round(1/e)) < 1e-12 && math.Abs(1/e) <= 60:
			// a root 1/n with 2 ≤ |n| ≤ 60; a tiny e (1/n rounding to 0) fails the last test
			n := int(math.Round(1 / e))
			var ok bool
			if n > 0 {
				d, ok = a.Dim.Root(n)
			} else {
				d, ok = a.Dim.Pow(-1).Root(-n)
			}
			if !ok {
				return Quantity{}, errorf("the power %g of %s has no whole unit", e, DimName(a.Dim, false))
			}
		default:
			return Quantity{}, errorf("the power %g of %s has no whole unit", e, DimName(a.Dim, false))
		}
	}
	if a.V == 0 {
		if real(b.V) > 0 {
			return Quantity{V: 0, Dim: d}, nil
		}
		if b.V == 0 {
			return Quantity{V: 1, Dim: d}, nil
		}
		return Quantity{}, errorf("division by zero (0 raised to a negative power)")
	}
	// |a^b| = exp(re(b)·ln|a| − im(b)·arg a): beyond the float64 range the
	// result is an overflow, which the arithmetic would show as NaN
	if lm := real(b.V)*math.Log(cmplx.Abs(a.V)) - imag(b.V)*cmplx.Phase(unsignZero(a.V)); lm > maxExp {
		return Quantity{}, errorf("power: overflow (result too large to represent)")
	}
	var v complex128
	if imag(b.V) == 0 && real(b.V) == math.Trunc(real(b.V)) && math.Abs(real(b.V)) <= 64 {
		v = ipow(a.V, int(real(b.V)))
	} else {
		v = cmplx.Pow(unsignZero(a.V), b.V)
	}
	if !finite(v) {
		// finite operands: a NaN here is Inf·0 inside an overflowing product
		return Quantity{}, errorf("power: overflow (result too large to represent)")
	}
	return Quantity{V: v, Dim: d}.Check("power")
}

// maxExp is ln of the largest float64, about 709.78: e^x overflows above it.
const maxExp = 709.782712893384

// ipow computes integer powers by repeated squaring so that (3+j4)^2 is
// exact rather than going through logarithms.
func ipow(z complex128, n int) complex128 {
	if n < 0 {
		return 1 / ipow(z, -n)
	}
	r := complex(1, 0)
	for n > 0 {
		if n&1 == 1 {
			r *= z
		}
		z *= z
		n >>= 1
	}
	return r
}

// Sqrt returns the principal square root.
func Sqrt(a Quantity) (Quantity, error) {
	d, ok := a.Dim.Root(2)
	if !ok {
		return Quantity{}, errorf("the square root of %s has no whole unit", DimName(a.Dim, false))
	}
	return Quantity{V: cmplx.Sqrt(unsignZero(a.V)), Dim: d}.Check("square root")
}

// Parallel returns a‖b = a·b/(a+b) for two impedances (or any like
// quantities). A zero branch is a short and gives 0; branches whose
// admittances cancel give an open circuit, reported as ErrOpenCircuit.
func Parallel(a, b Quantity) (Quantity, error) {
	// a bare 0 is a short whatever the other branch's unit
	if a.V == 0 && a.Dim.IsDimensionless() {
		return Quantity{V: 0, Dim: b.Dim}, nil
	}
	if b.V == 0 && b.Dim.IsDimensionless() {
		return Quantity{V: 0, Dim: a.Dim}, nil
	}
	if a.Dim != b.Dim {
		return Quantity{}, &DimError{Op: "||", A: a.Dim, B: b.Dim}
	}
	if a.V == 0 || b.V == 0 {
		return Quantity{V: 0, Dim: a.Dim}, nil
	}
	// a‖b = a/(1 + a/b) with |a| ≤ |b|: no product to overflow or
	// underflow, so 1e-300 Ω ‖ 1e-300 Ω is 5e-301 Ω and 1e200 ‖ 1e200 is
	// 5e199; 1 + a/b near 0 is the admittances cancelling
	x, y := a.V, b.V
	if cmplx.Abs(x) > cmplx.Abs(y) {
		x, y = y, x
	}
	den := 1 + x/y
	if cmplx.Abs(den) <= 4*2.220446049250313e-16 {
		return Quantity{}, ErrOpenCircuit
	}
	return Quantity{V: x / den, Dim: a.Dim}.Check("parallel")
}
