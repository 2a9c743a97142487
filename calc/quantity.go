package calc

import (
	"math"
	"math/cmplx"
)

// Kind is what a quantity is, carried beside its dimension: the dimension
// says V·A, the kind says whether that is an active power in W, a reactive
// power in var, a complex power S = P + jQ or an apparent power |S| in VA,
// or a plain product of two phasors that is none of them. The kind decides
// the unit shown, whether an angle is shown, and which sums are refused.
// See the package comment for how kinds combine.
type Kind uint8

const (
	// KindPlain is the kind a dimension implies: a phasor for V and A, a
	// complex impedance or admittance for Ω and S, a ratio or complex
	// number when dimensionless, a signed real for H, F, Hz, s, m.
	KindPlain    Kind = iota
	KindActive        // active power P, W: a signed real (or P in P + jQ)
	KindReactive      // reactive power Q, var: a signed real (or jQ in P + jQ)
	KindApparent      // complex power S = P + jQ in VA (IEEE Std 1459-2010)
	KindAngle         // a plane angle held in radians
	// KindTurn marks a product of an angle and a quantity that counts no
	// cycles, such as 2π·R·C: the angle is per cycle, so the product is
	// per cycle too (2π·R·C is a period) and 1/(2π·R·C) is in Hz.
	// Shown as a plain value.
	KindTurn
	// KindMagnitude is |x|, the size of a phasor or complex quantity with
	// its angle dropped: |I| in A, |V| in V, and for power the apparent
	// power |S| in VA. Shown as a number with its unit and no angle.
	KindMagnitude
	// KindSigned is a signed real part of a complex quantity: a reactance
	// X in Ω, a susceptance B in S, a signed voltage or current reading.
	KindSigned
	// KindResistive is a resistance R in Ω or a conductance G in S: real.
	KindResistive
	// KindCount is a whole number of things (turns, samples, sections).
	KindCount
	// KindProduct is V·I (or any product of two phasors) without the
	// conjugate: not a complex power; S = V·I* (IEEE Std 1459-2010).
	KindProduct
	// KindConj is the conjugate of a phasor, as in V·conj(I).
	KindConj
	// KindPercent is a ratio that a practitioner reads in per cent, such
	// as a voltage dip or a regulation: the value is the ratio (0.0312),
	// shown as 3.120 %, which reads back as the same value. It is a ratio
	// in arithmetic and in JSON.
	KindPercent
)

// noAngle reports kinds that are real numbers by meaning: they are shown as
// a signed number with a unit, never as a phasor at 0° or 180°.
func (k Kind) noAngle() bool {
	switch k {
	case KindActive, KindReactive, KindMagnitude, KindSigned, KindResistive, KindCount, KindPercent:
		return true
	}
	return false
}

// Scalar reports whether q is shown as a signed real number without an
// angle: a real value of a kind that is real by meaning, or a real value
// of a dimension whose angle means nothing (H, F, Hz, a ratio).
func (q Quantity) Scalar() bool {
	if !q.IsReal() {
		return false
	}
	return q.Kind.noAngle() || q.Kind == KindAngle || !phasorDim(q.Dim)
}

// HasAngle reports whether q is shown with an angle (and drawn as an
// arrow): a phasor or complex value that is not zero. A zero phasor has no
// direction, so ∠0° would claim one that no input gave it.
func (q Quantity) HasAngle() bool {
	return q.V != 0 && !q.Scalar()
}

// QuantityName names the kind of q as JSON's "quantity" field does and
// the README lists: phasor, impedance, admittance, resistance, conductance,
// reactance, susceptance, complex-power, active-power, reactive-power,
// apparent-power, phasor-product, magnitude, signed-real, ratio,
// complex-ratio, angle, count.
func QuantityName(q Quantity) string {
	d := q.Dim
	switch q.Kind {
	case KindAngle:
		if d.IsDimensionless() && q.IsReal() {
			return "angle"
		}
	case KindCount:
		return "count"
	case KindProduct:
		return "phasor-product"
	}
	if d == DimPower {
		switch q.Kind {
		case KindActive:
			if q.IsReal() {
				return "active-power"
			}
		case KindReactive:
			if q.IsReal() {
				return "reactive-power"
			}
		case KindMagnitude:
			return "apparent-power"
		}
		return "complex-power"
	}
	switch q.Kind {
	case KindMagnitude:
		return "magnitude"
	case KindSigned:
		switch d {
		case DimImpedance:
			return "reactance"
		case DimAdmittance:
			return "susceptance"
		}
		return "signed-real"
	case KindResistive:
		switch d {
		case DimImpedance:
			return "resistance"
		case DimAdmittance:
			return "conductance"
		}
		return "signed-real"
	}
	switch d {
	case DimVoltage, DimCurrent:
		return "phasor"
	case DimImpedance:
		return "impedance"
	case DimAdmittance:
		return "admittance"
	}
	if d.IsDimensionless() {
		if q.IsReal() {
			return "ratio"
		}
		return "complex-ratio"
	}
	if q.IsReal() {
		return "signed-real"
	}
	return "complex"
}

// Quantity is a complex value with a physical dimension. Phasors,
// impedances, admittances, powers and plain numbers are all quantities.
type Quantity struct {
	V    complex128
	Dim  Dim
	Kind Kind
	Ref  Between // set only by a marking function; arithmetic drops it
}

// Between marks which two points of a three-phase supply a voltage was
// stated between, when the user said so with a marking function (l2l and
// l2n of package reduce/threephase). Three-phase functions check it
// against their parameter and convert or refuse a mismatch. Arithmetic
// drops it: the marking describes a value as entered, and 1.1·V or V/2 is
// a new value whose meaning the user states afresh.
type Between uint8

const (
	Unmarked      Between = iota
	LineToLine            // between two lines: V_ab
	LineToNeutral         // between a line and the neutral or star point: V_an
)

func (b Between) String() string {
	switch b {
	case LineToLine:
		return "line-to-line"
	case LineToNeutral:
		return "line-to-neutral"
	}
	return "unmarked"
}

// Q returns a quantity of dimension d.
func Q(v complex128, d Dim) Quantity { return Quantity{V: v, Dim: d} }

// Real returns a real quantity of dimension d.
func Real(x float64, d Dim) Quantity { return Quantity{V: complex(x, 0), Dim: d} }

// Magnitude returns the size |x| of a quantity of dimension d: shown as a
// number with its unit and no angle.
func Magnitude(x float64, d Dim) Quantity {
	return Quantity{V: complex(x, 0), Dim: d, Kind: KindMagnitude}
}

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

// sumKind is the kind of a sum or difference a ± b of one dimension, or
// an error for a sum that has no meaning as written. Power follows
// IEC 60050-131 and IEEE Std 1459-2010: W and var are at right angles and
// meet only as S = P + jQ; an apparent power |S| is a magnitude and adds to
// nothing but another |S|; V·I without the conjugate is no power at all.
// Impedance likewise: a resistance and a reactance held as reals meet only
// as Z = R + jX.
func sumKind(a, b Quantity, op string) (Kind, error) {
	ka, kb := a.Kind, b.Kind
	if a.Dim == DimPower {
		switch {
		case ka == KindProduct || kb == KindProduct:
			if ka == kb {
				return KindProduct, nil
			}
			return 0, errorf("cannot %s a phasor product V·I and a power: V·I without the conjugate is not a complex power; use power(V, I) or V * conj(I) (S = V·I*)", op)
		case ka == KindMagnitude || kb == KindMagnitude:
			if ka == kb {
				return KindMagnitude, nil
			}
			return 0, errorf("cannot %s an apparent power |S| in VA and %s: |S| is a magnitude with no angle; give the load as a complex power (loadva(|S|, pf, lagging) or |S|∠φ) and add those", op, QuantityWord(otherOf(a, b, KindMagnitude)))
		case ka == kb:
			if ka == KindActive || ka == KindReactive {
				return ka, quadrature(a, b, op)
			}
			return ka, nil
		}
		if err := quadrature(a, b, op); err != nil {
			return 0, err
		}
		// a var held as a real number added to S would land on the P axis
		for _, x := range []Quantity{a, b} {
			if x.Kind == KindReactive && real(x.V) != 0 {
				return 0, errorf("cannot %s a reactive power given as a real number and %s: Q adds as j·Q (S = P + jQ)", op, QuantityWord(otherOf(a, b, KindReactive)))
			}
			if x.Kind == KindActive && imag(x.V) != 0 {
				return 0, errorf("cannot %s an active power with an imaginary part: P is real (S = P + jQ)", op)
			}
		}
		return KindApparent, nil
	}
	if a.Dim == DimImpedance || a.Dim == DimAdmittance {
		switch {
		case ka == kb && (ka == KindResistive || ka == KindSigned || ka == KindMagnitude):
			return ka, nil
		case ka == KindSigned || kb == KindSigned:
			what := "a reactance X"
			if a.Dim == DimAdmittance {
				what = "a susceptance B"
			}
			return 0, errorf("cannot %s %s held as a real number and %s: it lies on the imaginary axis; write j·X (Z = R + jX)", op, what, QuantityWord(otherOf(a, b, KindSigned)))
		}
	}
	switch {
	case ka == kb:
		if ka == KindConj {
			return KindPlain, nil
		}
		return ka, nil
	}
	return KindPlain, nil
}

// otherOf returns the operand of a ± b that is not of kind k.
func otherOf(a, b Quantity, k Kind) Quantity {
	if a.Kind == k {
		return b
	}
	return a
}

// scaleKind is the kind of a quantity multiplied or divided by a
// dimensionless factor: an angle stays an angle and a power keeps its kind
// under a real factor; a complex factor turns a real-by-meaning quantity
// into a complex one (|S|·1∠30° is a complex power).
func scaleKind(k Kind, factor complex128, d Dim) Kind {
	if imag(factor) != 0 {
		switch k {
		case KindActive, KindReactive:
			return KindApparent
		case KindMagnitude:
			if d == DimPower {
				return KindApparent
			}
			return KindPlain
		case KindAngle, KindSigned, KindResistive, KindCount, KindConj, KindPercent:
			return KindPlain
		}
		return k
	}
	switch {
	case k == KindMagnitude && real(factor) < 0 && d != DimPower:
		return KindSigned
	case k == KindCount && real(factor) != math.Trunc(real(factor)):
		return KindPlain
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
	k, err := sumKind(a, b, "add")
	if err != nil {
		return Quantity{}, err
	}
	return Quantity{V: Leftover(a.V+b.V, a.V, b.V), Dim: a.Dim, Kind: k}.Check("addition")
}

// Leftover applies argand's one rule for rounding leftovers to a sum s of
// the given terms (all of one dimension): a part of s (real or imaginary)
// is 0 when it is below 1e-12 of the largest magnitude among the terms, so
// j1 Ω + (−j0.9999999999999997 Ω) at series resonance is a short, not
// 333e-18 Ω. Parts small beside the other part of s itself are dropped by
// the display (Tiny), which is the same rule for a single value. A value
// that is small because its inputs are small keeps its figures:
// (1 mV)²/10 GΩ is 1e-16 W.
func Leftover(s complex128, terms ...complex128) complex128 {
	var big float64
	for _, t := range terms {
		big = math.Max(big, cmplx.Abs(t))
	}
	re, im := real(s), imag(s)
	if math.Abs(re) < Tiny*big {
		re = 0
	}
	if math.Abs(im) < Tiny*big {
		im = 0
	}
	return complex(re+0, im+0)
}

// LeftoverReal is Leftover for a real sum of real terms.
func LeftoverReal(s float64, terms ...float64) float64 {
	var big float64
	for _, t := range terms {
		big = math.Max(big, math.Abs(t))
	}
	if math.Abs(s) < Tiny*big {
		return 0
	}
	return s
}

// Sub returns a−b; both must have the same dimension.
func Sub(a, b Quantity) (Quantity, error) {
	if a.Dim != b.Dim {
		return Quantity{}, &DimError{Op: "−", A: a.Dim, B: b.Dim}
	}
	k, err := sumKind(a, b, "subtract")
	if err != nil {
		return Quantity{}, err
	}
	return Quantity{V: Leftover(a.V-b.V, a.V, b.V), Dim: a.Dim, Kind: k}.Check("subtraction")
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
	r := Quantity{V: Quot(a.V, b.V), Dim: a.Dim.Div(b.Dim)}
	r.Kind = quotientKind(a, b, r.Dim)
	return r.Check("division")
}

// magLike reports a quantity that stands for a size: a magnitude, or a
// real value of a phasor dimension written as a reference at 0° (230 V).
func magLike(q Quantity) bool {
	if !q.IsReal() {
		return false
	}
	return q.Kind == KindMagnitude || q.Kind == KindPlain && (q.Dim == DimVoltage || q.Dim == DimCurrent)
}

// quotientKind is the kind of a/b: V²/R is an active power, V²/X a
// reactive power (Q = V²/X for a reactance X, common practice), |V|²/|Z|
// an apparent power; |V|²/Z is S* and so a phasor product, not S.
func quotientKind(a, b Quantity, d Dim) Kind {
	if a.Kind == KindPercent && b.Kind == KindPercent {
		return KindPlain // 5 %/10 % is a plain number
	}
	if b.Dim.IsDimensionless() && b.Kind != KindAngle {
		return scaleKind(a.Kind, b.V, a.Dim)
	}
	if d == DimPower {
		switch {
		case a.Dim == DimEnergy && b.Dim == DimTime:
			return KindActive
		case a.Kind == KindMagnitude && a.Dim == DimVoltage.Pow(2) && b.Dim == DimImpedance:
			switch b.Kind {
			case KindResistive:
				return KindActive
			case KindSigned:
				return KindReactive
			case KindMagnitude:
				return KindMagnitude
			}
		}
		return KindProduct
	}
	if a.Kind == KindMagnitude && (b.Kind == KindMagnitude || b.Kind == KindResistive) {
		return KindMagnitude
	}
	return KindPlain
}

// powerProduct is the kind of a product of dimension V·A: |I|²·R is an
// active power, |I|²·X a reactive power, |I|²·Z a complex power (common
// practice; IEEE Std 1459-2010); V·I* is a complex power, V·I without the
// conjugate a phasor product; a product of two sizes (230 V × 10 A) an
// apparent power |S|.
func powerProduct(a, b Quantity) Kind {
	for _, p := range [][2]Quantity{{a, b}, {b, a}} {
		sq, z := p[0], p[1]
		if sq.Kind == KindMagnitude && sq.Dim == DimCurrent.Pow(2) && z.Dim == DimImpedance ||
			sq.Kind == KindMagnitude && sq.Dim == DimVoltage.Pow(2) && z.Dim == DimAdmittance && z.Kind == KindResistive {
			switch z.Kind {
			case KindResistive:
				return KindActive
			case KindSigned:
				return KindReactive
			case KindMagnitude:
				return KindMagnitude
			case KindPlain:
				if sq.Dim == DimCurrent.Pow(2) {
					return KindApparent
				}
			}
			return KindProduct
		}
		v, i := p[0], p[1]
		if v.Dim == DimVoltage && i.Dim == DimCurrent {
			switch {
			case i.Kind == KindConj && v.Kind != KindConj:
				return KindApparent
			case magLike(v) && magLike(i) && real(v.V)*real(i.V) >= 0:
				return KindMagnitude
			}
		}
	}
	return KindProduct
}

func productKind(a, b Quantity, d Dim) Kind {
	switch {
	case a.Kind == KindPercent && b.Kind == KindPercent:
		return KindPlain // a ratio of ratios is read as a plain number
	case a.Kind == KindPercent && b.Kind == KindPlain && d.IsDimensionless():
		return scaleKind(a.Kind, b.V, d) // 2 × 5 % is 10 %
	case b.Kind == KindPercent && a.Kind == KindPlain && d.IsDimensionless():
		return scaleKind(b.Kind, a.V, d)
	case (a.Kind == KindAngle || b.Kind == KindAngle) && d.IsDimensionless() && a.Kind != b.Kind && imag(a.V) == 0 && imag(b.V) == 0:
		return KindAngle // ω·t is an angle
	case a.Dim.IsDimensionless() && a.Kind != KindAngle:
		return scaleKind(b.Kind, a.V, b.Dim)
	case b.Dim.IsDimensionless() && b.Kind != KindAngle:
		return scaleKind(a.Kind, b.V, a.Dim)
	case d == DimPower:
		return powerProduct(a, b)
	case (a.Kind == KindMagnitude || a.Kind == KindResistive) && (b.Kind == KindMagnitude || b.Kind == KindResistive) && (a.Kind == KindMagnitude || b.Kind == KindMagnitude):
		return KindMagnitude // |I|·R is |V_R|
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
func Neg(a Quantity) Quantity {
	return Quantity{V: unsignZero(-a.V), Dim: a.Dim, Kind: scaleKind(a.Kind, -1, a.Dim)}
}

// unsignZero turns a −0 part into +0 (−0 + 0 is +0 in IEEE 754), so the
// principal branch of √, ln and powers does not depend on the sign of a
// zero that no one can see: √(−4) is j2, never −j2.
func unsignZero(v complex128) complex128 { return complex(real(v)+0, imag(v)+0) }

// Conj returns the complex conjugate.
func Conj(a Quantity) Quantity {
	k := a.Kind
	switch {
	case k == KindConj:
		k = KindPlain
	case k == KindPlain && (a.Dim == DimVoltage || a.Dim == DimCurrent):
		k = KindConj // so that V·conj(I) is known for a complex power
	}
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
	if a.Kind == KindResistive || a.Kind == KindMagnitude {
		r.Kind = a.Kind // 1/R is a conductance, 1/|Z| is |Y|
	}
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
	return Quantity{V: v, Dim: d, Kind: powKind(a, b)}.Check("power")
}

// powKind: a real quantity with a unit raised to an even whole power is a
// squared size (|I|², |V|²), and a power of a size is a size, so |I|²·R
// can be known for an active power.
func powKind(a, b Quantity) Kind {
	if a.Dim.IsDimensionless() || !a.IsReal() || !b.IsReal() {
		return KindPlain
	}
	e := real(b.V)
	if a.Kind == KindMagnitude || e == math.Trunc(e) && math.Mod(e, 2) == 0 {
		return KindMagnitude
	}
	return KindPlain
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

// Quot returns a/b with both scaled first by the larger part of b, so that
// a quotient that fits in float64 is not lost to an overflow of |b|² inside
// the division: (1e308+j1e308)/(1e308+j1e308) is 1, not NaN.
func Quot(a, b complex128) complex128 {
	s := math.Max(math.Abs(real(b)), math.Abs(imag(b)))
	if s == 0 || math.IsInf(s, 0) || math.IsNaN(s) {
		return a / b
	}
	return (a / complex(s, 0)) / (b / complex(s, 0))
}

// Sqrt returns the principal square root.
func Sqrt(a Quantity) (Quantity, error) {
	d, ok := a.Dim.Root(2)
	if !ok {
		return Quantity{}, errorf("the square root of %s has no whole unit", DimName(a.Dim, false))
	}
	k := KindPlain
	if a.Kind == KindMagnitude {
		k = KindMagnitude // √(P² + Q²) is |S|
	}
	return Quantity{V: cmplx.Sqrt(unsignZero(a.V)), Dim: d, Kind: k}.Check("square root")
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
	ax, ay := cmplx.Abs(x), cmplx.Abs(y)
	// a fixed order, also between branches of equal size, so that a‖b
	// and b‖a round alike
	if ax > ay || ax == ay && (real(x) > real(y) || real(x) == real(y) && imag(x) > imag(y)) {
		x, y = y, x
	}
	den := 1 + Quot(x, y)
	if cmplx.Abs(den) <= 4*2.220446049250313e-16 {
		return Quantity{}, ErrOpenCircuit
	}
	return Quantity{V: Quot(x, den), Dim: a.Dim, Kind: combinedKind(a, b)}.Check("parallel")
}

// combinedKind is the kind of two branches in parallel: resistances (or
// conductances) alone give a resistance, shown like R1 + R2 without an
// angle; any other branch makes the result complex.
func combinedKind(a, b Quantity) Kind {
	if a.Kind == KindResistive && b.Kind == KindResistive {
		return KindResistive
	}
	return KindPlain
}
