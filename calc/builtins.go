package calc

import (
	"fmt"
	"math"
	"math/cmplx"
)

func one(f func(c *Context, a Quantity) (Quantity, error)) func(c *Context, args []Arg) (Result, error) {
	return func(c *Context, args []Arg) (Result, error) {
		q, err := f(c, args[0].Q)
		return Result{Value: q}, err
	}
}

func needPlain(name string, a Quantity) error {
	if !a.Dim.IsDimensionless() {
		return fmt.Errorf("%s needs a plain number or an angle, not %s", name, DimName(a.Dim, false))
	}
	return nil
}

// inverseTrig is an inverse trigonometric function of a real plain number,
// giving an angle. acos and asin take −1 … 1; outside that range there is
// no real angle, which is said rather than returned as NaN.
func inverseTrig(name string, a Quantity, f func(float64) float64) (Quantity, error) {
	if !a.Dim.IsDimensionless() || a.Kind == KindAngle {
		return Quantity{}, fmt.Errorf("%s needs a plain number (a ratio such as a power factor), not %s", name, kindName(a))
	}
	if !a.IsReal() {
		return Quantity{}, fmt.Errorf("%s needs a real number", name)
	}
	x := real(a.V)
	if name != "atan" && (x < -1 || x > 1) {
		return Quantity{}, fmt.Errorf("%s takes a number from −1 to 1 (got %g): no real angle has that %s", name, x, map[string]string{"acos": "cosine", "asin": "sine"}[name])
	}
	return Angle(f(x)).Check(name)
}

func kindName(a Quantity) string {
	if a.Kind == KindAngle {
		return "an angle"
	}
	return DimName(a.Dim, false)
}

// trigArg is the angle in radians of a trigonometric argument: an angle as
// is, a plain number in the worksheet's angle unit (degrees by default).
func trigArg(c *Context, name string, a Quantity) (complex128, error) {
	if err := needPlain(name, a); err != nil {
		return 0, err
	}
	if a.Kind == KindAngle {
		return a.V, nil
	}
	if c.Format.Radians {
		return a.V, nil
	}
	return a.V * math.Pi / 180, nil
}

// partKind is the kind of the real (imag false) or imaginary part of a:
// P and Q of a power, R and X of an impedance, G and B of an admittance,
// a signed real of a phasor.
func partKind(a Quantity, imagPart bool) Kind {
	switch a.Dim {
	case DimPower:
		if imagPart {
			return KindReactive
		}
		return KindActive
	case DimImpedance, DimAdmittance:
		if imagPart {
			return KindSigned
		}
		return KindResistive
	case DimVoltage, DimCurrent:
		return KindSigned
	}
	if a.Kind == KindAngle || a.Kind == KindTurn {
		return a.Kind
	}
	return KindPlain
}

func needDim(name string, a Quantity, d Dim, what string) error {
	if a.Dim != d {
		return fmt.Errorf("%s needs %s in %s, got %s", name, what, UnitSymbol(d, KindPlain, false), DimName(a.Dim, false))
	}
	return nil
}

// builtins are the functions every worksheet has. The impedance functions
// use X_L = ωL and X_C = −1/(ωC) with ω = 2π·f (common practice).
var builtins = [...]Func{
	{Name: "mag", Params: []Param{{Name: "z", Kind: ParamAny}}, Args: "(z)", Doc: "magnitude |z|", Formula: "|z| = √(re² + im²)", Min: 1, Max: 1,
		Call: one(func(c *Context, a Quantity) (Quantity, error) {
			if a.Kind == KindAngle {
				return Quantity{V: complex(cmplx.Abs(a.V), 0), Kind: KindAngle}.Check("mag")
			}
			return Quantity{V: complex(cmplx.Abs(a.V), 0), Dim: a.Dim, Kind: KindMagnitude}.Check("mag")
		})},
	{Name: "arg", Params: []Param{{Name: "z", Kind: ParamAny}}, Args: "(z)", Doc: "angle of z", Formula: "∠z = atan2(im, re)", Min: 1, Max: 1,
		Call: one(func(c *Context, a Quantity) (Quantity, error) {
			return Angle(Deg(a.V) * math.Pi / 180), nil
		})},
	{Name: "re", Params: []Param{{Name: "z", Kind: ParamAny}}, Args: "(z)", Doc: "real part", Formula: "re(z)", Min: 1, Max: 1,
		Call: one(func(c *Context, a Quantity) (Quantity, error) {
			return Quantity{V: complex(real(a.V), 0), Dim: a.Dim, Kind: partKind(a, false)}, nil
		})},
	{Name: "im", Params: []Param{{Name: "z", Kind: ParamAny}}, Args: "(z)", Doc: "imaginary part, as a real number", Formula: "im(z)", Min: 1, Max: 1,
		Call: one(func(c *Context, a Quantity) (Quantity, error) {
			return Quantity{V: complex(imag(a.V), 0), Dim: a.Dim, Kind: partKind(a, true)}, nil
		})},
	{Name: "conj", Params: []Param{{Name: "z", Kind: ParamAny}}, Args: "(z)", Doc: "complex conjugate", Formula: "z* = re − j·im", Min: 1, Max: 1,
		Call: one(func(c *Context, a Quantity) (Quantity, error) { return Conj(a), nil })},
	{Name: "recip", Params: []Param{{Name: "z", Kind: ParamAny}}, Args: "(z)", Doc: "reciprocal 1/z (impedance ↔ admittance)", Formula: "1/z", Min: 1, Max: 1,
		Call: one(func(c *Context, a Quantity) (Quantity, error) { return Recip(a) })},
	{Name: "sqrt", Params: []Param{{Name: "z", Kind: ParamAny}}, Args: "(z)", Doc: "principal square root", Formula: "√z", Min: 1, Max: 1,
		Call: one(func(c *Context, a Quantity) (Quantity, error) { return Sqrt(a) })},
	{Name: "sin", Params: []Param{{Name: "θ", Kind: ParamNumber, Doc: "an angle, or a plain number in the angle unit set"}}, Args: "(θ)", Doc: "sine; a bare number is in the angle unit set", Formula: "sin θ", Min: 1, Max: 1,
		Call: one(func(c *Context, a Quantity) (Quantity, error) {
			x, err := trigArg(c, "sin", a)
			if err != nil {
				return Quantity{}, err
			}
			return Number(exactTrig(cmplx.Sin, x, 0)).Check("sin")
		})},
	{Name: "cos", Params: []Param{{Name: "θ", Kind: ParamNumber, Doc: "an angle, or a plain number in the angle unit set"}}, Args: "(θ)", Doc: "cosine; a bare number is in the angle unit set", Formula: "cos θ", Min: 1, Max: 1,
		Call: one(func(c *Context, a Quantity) (Quantity, error) {
			x, err := trigArg(c, "cos", a)
			if err != nil {
				return Quantity{}, err
			}
			return Number(exactTrig(cmplx.Cos, x, 1)).Check("cos")
		})},
	{Name: "tan", Params: []Param{{Name: "θ", Kind: ParamNumber, Doc: "an angle, or a plain number in the angle unit set"}}, Args: "(θ)", Doc: "tangent; a bare number is in the angle unit set", Formula: "tan θ", Min: 1, Max: 1,
		Call: one(func(c *Context, a Quantity) (Quantity, error) {
			x, err := trigArg(c, "tan", a)
			if err != nil {
				return Quantity{}, err
			}
			if imag(x) == 0 && math.Abs(math.Cos(real(x))) < 1e-15 {
				return Quantity{}, fmt.Errorf("tan is infinite at ±90°")
			}
			return Number(exactTrig(cmplx.Tan, x, 2)).Check("tan")
		})},
	{Name: "asin", Params: []Param{{Name: "x", Kind: ParamRatio}}, Args: "(x)", Doc: "angle whose sine is x (−90° to 90°)", Formula: "θ = asin x", Min: 1, Max: 1,
		Call: one(func(c *Context, a Quantity) (Quantity, error) { return inverseTrig("asin", a, math.Asin) })},
	{Name: "acos", Params: []Param{{Name: "x", Kind: ParamRatio}}, Args: "(x)", Doc: "angle whose cosine is x (0° to 180°), such as acos(pf)", Formula: "θ = acos x", Min: 1, Max: 1,
		Call: one(func(c *Context, a Quantity) (Quantity, error) { return inverseTrig("acos", a, math.Acos) })},
	{Name: "atan", Params: []Param{{Name: "x", Kind: ParamRatio}}, Args: "(x)", Doc: "angle whose tangent is x (−90° to 90°)", Formula: "θ = atan x", Min: 1, Max: 1,
		Call: one(func(c *Context, a Quantity) (Quantity, error) { return inverseTrig("atan", a, math.Atan) })},
	{Name: "atan2", Params: []Param{{Name: "y", Kind: ParamAny}, {Name: "x", Kind: ParamAny}}, Args: "(y, x)", Doc: "angle of the point (x, y)", Formula: "atan2(y, x)", Min: 2, Max: 2,
		Call: func(c *Context, args []Arg) (Result, error) {
			y, x := args[0].Q, args[1].Q
			if x.Dim != y.Dim {
				return Result{}, &DimError{Op: ",", A: y.Dim, B: x.Dim}
			}
			if !x.IsReal() || !y.IsReal() {
				return Result{}, fmt.Errorf("atan2 needs real arguments")
			}
			return Value(Angle(Deg(complex(real(x.V), real(y.V))) * math.Pi / 180)), nil
		}},
	{Name: "exp", Params: []Param{{Name: "z", Kind: ParamNumber}}, Args: "(z)", Doc: "e to the power z", Formula: "eᶻ", Min: 1, Max: 1,
		Call: one(func(c *Context, a Quantity) (Quantity, error) {
			if err := needPlain("exp", a); err != nil {
				return Quantity{}, err
			}
			if real(a.V) > maxExp {
				return Quantity{}, errorf("overflow (result too large to represent)")
			}
			return Number(cmplx.Exp(a.V)).Check("exp")
		})},
	{Name: "ln", Params: []Param{{Name: "z", Kind: ParamNumber}}, Args: "(z)", Doc: "natural logarithm (principal)", Formula: "ln z", Min: 1, Max: 1,
		Call: one(func(c *Context, a Quantity) (Quantity, error) {
			if err := needPlain("ln", a); err != nil {
				return Quantity{}, err
			}
			if a.V == 0 {
				return Quantity{}, fmt.Errorf("the logarithm of 0 is undefined")
			}
			return Number(cmplx.Log(unsignZero(a.V))).Check("ln")
		})},
	{Name: "log10", Params: []Param{{Name: "z", Kind: ParamNumber}}, Args: "(z)", Doc: "common logarithm (principal)", Formula: "log₁₀ z", Min: 1, Max: 1,
		Call: one(func(c *Context, a Quantity) (Quantity, error) {
			if err := needPlain("log10", a); err != nil {
				return Quantity{}, err
			}
			if a.V == 0 {
				return Quantity{}, fmt.Errorf("the logarithm of 0 is undefined")
			}
			return Number(cmplx.Log10(unsignZero(a.V))).Check("log10")
		})},
	{Name: "deg", Params: []Param{{Name: "θ", Kind: ParamNumber}}, Args: "(θ)", Doc: "an angle (or a number of radians) as a plain number of degrees", Formula: "θ·180/π", Min: 1, Max: 1,
		Call: one(func(c *Context, a Quantity) (Quantity, error) {
			if err := needPlain("deg", a); err != nil {
				return Quantity{}, err
			}
			return Number(a.V * 180 / math.Pi).Check("deg")
		})},
	{Name: "rad", Params: []Param{{Name: "x", Kind: ParamNumber}}, Args: "(x)", Doc: "a number of degrees (or an angle) as a plain number of radians", Formula: "x·π/180", Min: 1, Max: 1,
		Call: one(func(c *Context, a Quantity) (Quantity, error) {
			if err := needPlain("rad", a); err != nil {
				return Quantity{}, err
			}
			if a.Kind == KindAngle {
				return Number(a.V), nil
			}
			return Number(a.V * math.Pi / 180).Check("rad")
		})},
	{Name: "omega", Params: []Param{{Name: "f", Kind: ParamFrequency, Else: "a frequency is written with Hz, as in 50 Hz"}}, Args: "(f)", Doc: "angular frequency of a frequency in Hz", Formula: "ω = 2π·f", Min: 1, Max: 1,
		Call: one(func(c *Context, a Quantity) (Quantity, error) {
			if err := needDim("omega", a, DimFrequency, "a frequency"); err != nil {
				return Quantity{}, err
			}
			return Quantity{V: complex(Context{Freq: real(a.V)}.Omega(), 0), Dim: DimAngularFrequency, Kind: KindAngle}.Check("omega")
		})},
	{Name: "zr", Params: []Param{{Name: "R", Kind: ParamResistance}}, Args: "(R)", Doc: "impedance of a resistor", Formula: "Z = R", Min: 1, Max: 1,
		Call: one(func(c *Context, a Quantity) (Quantity, error) {
			if err := needDim("zr", a, DimImpedance, "a resistance"); err != nil {
				return Quantity{}, err
			}
			return a, nil
		})},
	{Name: "zl", Params: []Param{{Name: "L", Kind: ParamInductance}}, Args: "(L)", Doc: "impedance of an inductor at the working frequency", Formula: "Z = jωL", Min: 1, Max: 1,
		Call: one(func(c *Context, a Quantity) (Quantity, error) {
			if err := needDim("zl", a, DimInductance, "an inductance"); err != nil {
				return Quantity{}, err
			}
			return InductorZ(a.V, c.Freq)
		})},
	{Name: "zc", Params: []Param{{Name: "C", Kind: ParamCapacitance}}, Args: "(C)", Doc: "impedance of a capacitor at the working frequency", Formula: "Z = 1/(jωC) = −j/(ωC)", Min: 1, Max: 1,
		Call: one(func(c *Context, a Quantity) (Quantity, error) {
			if err := needDim("zc", a, DimCapacitance, "a capacitance"); err != nil {
				return Quantity{}, err
			}
			return CapacitorZ(a.V, c.Freq)
		})},
}

// InductorZ returns jωL at frequency f in Hz (X_L = ωL, common practice).
func InductorZ(l complex128, f float64) (Quantity, error) {
	w := Context{Freq: f}.Omega()
	return Quantity{V: complex(0, w) * l, Dim: DimImpedance}.Check("inductor impedance")
}

// CapacitorZ returns 1/(jωC) at frequency f in Hz (X_C = −1/(ωC), common
// practice). A zero capacitance is an open circuit, reported as such.
func CapacitorZ(c complex128, f float64) (Quantity, error) {
	if c == 0 {
		return Quantity{}, openCircuit("a capacitance of 0 F is an open circuit: its impedance is infinite")
	}
	w := Context{Freq: f}.Omega()
	return Quantity{V: 1 / (complex(0, w) * c), Dim: DimImpedance}.Check("capacitor impedance")
}

// exactTrig returns exact values at multiples of 90° so that cos 90° is 0
// rather than 6.1e-17. which selects the function: 0 sin, 1 cos, 2 tan.
func exactTrig(f func(complex128) complex128, x complex128, which int) complex128 {
	if imag(x) == 0 {
		d := NormDeg(real(x) * 180 / math.Pi)
		q := map[float64]int{0: 0, 90: 1, 180: 2, -90: 3}
		if k, ok := q[d]; ok && math.Abs(real(x)) < 1e6 {
			sin := [4]float64{0, 1, 0, -1}[k]
			cos := [4]float64{1, 0, -1, 0}[k]
			switch which {
			case 0:
				return complex(sin, 0)
			case 1:
				return complex(cos, 0)
			case 2:
				return complex(sin/cos, 0)
			}
		}
	}
	return f(x)
}

// builtin returns the built-in function of that name, or nil.
func builtin(name string) *Func {
	switch name {
	case "abs":
		name = "mag"
	case "angle":
		name = "arg"
	}
	for i := range builtins {
		if builtins[i].Name == name {
			f := builtins[i]
			return &f
		}
	}
	return nil
}

// Builtins returns the built-in functions, for help and for the reserved
// word list.
func Builtins() []Func {
	out := make([]Func, len(builtins))
	copy(out, builtins[:])
	return out
}
