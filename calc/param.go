package calc

import (
	"fmt"
	"strings"
)

// Param is one parameter of a function: the name a named argument uses,
// the kind of quantity it takes, and a short description for help. A
// function's help line and its checks are both generated from its Params,
// so what help promises is what the call enforces.
type Param struct {
	Name     string
	Kind     ParamKind
	Doc      string
	Optional bool
	// Else says what to use instead when the argument has the wrong kind,
	// such as "for an apparent power use loadva".
	Else string
}

// ParamKind is the kind of quantity a parameter takes: a dimension and,
// where one dimension carries several kinds (W, var and VA), the kind.
type ParamKind uint8

const (
	ParamAny                   ParamKind = iota // any quantity; the function checks it
	ParamNumber                                 // a plain number, real or complex
	ParamRatio                                  // a plain real number: a power factor, an efficiency, a per cent, X/R
	ParamAngle                                  // an angle, or a plain number in the worksheet's angle unit
	ParamWord                                   // one of the function's words, written bare
	ParamVoltage                                // a voltage, phasor or magnitude
	ParamCurrent                                // a current, phasor or magnitude
	ParamVoltageOrCurrent                       // a voltage or a current
	ParamImpedance                              // an impedance in Ω, complex or real
	ParamImpedanceOrAdmittance                  // an impedance in Ω or an admittance in S
	ParamResistance                             // a resistance: a real value in Ω
	ParamInductance                             // H
	ParamCapacitance                            // F
	ParamFrequency                              // Hz, or rad/s for an angular frequency
	ParamTime                                   // s
	ParamLength                                 // m
	ParamPerLength                              // Ω/m, a cable's resistance or reactance per length
	ParamActivePower                            // W
	ParamReactivePower                          // var
	ParamApparentPower                          // |S| in VA
	ParamComplexPower                           // S = P + jQ in VA, or a W or var alone
	ParamPower                                  // any power: W, var, VA
	ParamSPower                                 // an apparent power |S| or a complex power S, in VA
	ParamPowerOrImpedance                       // a fault level in VA or a source impedance in Ω
	ParamTemperature                            // a temperature in °C, written as a plain number
	numParamKinds
)

// paramWords name each parameter kind in messages and help.
var paramWords = [numParamKinds]string{
	ParamAny:                   "any quantity",
	ParamNumber:                "a plain number",
	ParamRatio:                 "a plain real number",
	ParamAngle:                 "an angle (a plain number is in the angle unit set)",
	ParamWord:                  "a word",
	ParamVoltage:               "a voltage in V",
	ParamCurrent:               "a current in A",
	ParamVoltageOrCurrent:      "a voltage in V or a current in A",
	ParamImpedance:             "an impedance in Ω",
	ParamImpedanceOrAdmittance: "an impedance in Ω or an admittance in S",
	ParamResistance:            "a resistance (a real value in Ω)",
	ParamInductance:            "an inductance in H",
	ParamCapacitance:           "a capacitance in F",
	ParamFrequency:             "a frequency in Hz",
	ParamTime:                  "a time in s",
	ParamLength:                "a length in m",
	ParamPerLength:             "an impedance per length in Ω/m",
	ParamActivePower:           "an active power in W",
	ParamReactivePower:         "a reactive power in var",
	ParamApparentPower:         "an apparent power in VA",
	ParamComplexPower:          "a complex power in VA (P + jQ), or a W or var alone",
	ParamPower:                 "a power in W, var or VA",
	ParamSPower:                "an apparent power |S| or a complex power S in VA",
	ParamPowerOrImpedance:      "a fault level in VA or an impedance in Ω",
	ParamTemperature:           "a temperature in °C (a plain number)",
}

// String names the kind for messages, as in "an active power in W".
func (k ParamKind) String() string {
	if k < numParamKinds {
		return paramWords[k]
	}
	return "a quantity"
}

var dimPerLength = Dim{BaseVolt: 1, BaseAmpere: -1, BaseMetre: -1}

// Accepts reports whether q can stand for a parameter of kind k. Powers are
// told apart by kind as well as dimension: an apparent power is not an
// active power, though both are V·A (IEC 60050-131, IEEE Std 1459-2010).
func (k ParamKind) Accepts(q Quantity) bool {
	d := q.Dim
	switch k {
	case ParamAny, ParamWord:
		return true
	case ParamNumber:
		return d.IsDimensionless()
	case ParamRatio, ParamTemperature:
		return d.IsDimensionless() && q.IsReal() && q.Kind != KindAngle
	case ParamAngle:
		return d.IsDimensionless() && q.IsReal()
	case ParamVoltage:
		return d == DimVoltage
	case ParamCurrent:
		return d == DimCurrent
	case ParamVoltageOrCurrent:
		return d == DimVoltage || d == DimCurrent
	case ParamImpedance:
		return d == DimImpedance
	case ParamImpedanceOrAdmittance:
		return d == DimImpedance || d == DimAdmittance
	case ParamResistance:
		return d == DimImpedance && q.IsReal()
	case ParamInductance:
		return d == DimInductance
	case ParamCapacitance:
		return d == DimCapacitance
	case ParamFrequency:
		return d == DimFrequency || d == DimAngularFrequency
	case ParamTime:
		return d == DimTime
	case ParamLength:
		return d == DimLength
	case ParamPerLength:
		return d == dimPerLength
	case ParamActivePower:
		return d == DimPower && q.Kind == KindActive
	case ParamReactivePower:
		return d == DimPower && q.Kind == KindReactive
	case ParamApparentPower:
		return d == DimPower && q.Kind == KindMagnitude
	case ParamComplexPower:
		return d == DimPower && (q.Kind == KindApparent || q.Kind == KindActive || q.Kind == KindReactive)
	case ParamPower:
		return d == DimPower && q.Kind != KindProduct
	case ParamSPower:
		return d == DimPower && (q.Kind == KindMagnitude || q.Kind == KindApparent)
	case ParamPowerOrImpedance:
		return d == DimImpedance || d == DimPower && q.Kind != KindProduct
	}
	return false
}

// paramFor returns the parameter that the i-th argument binds to, the last
// one repeating for a function that takes any number of arguments.
func (f *Func) paramFor(i int) (Param, bool) {
	if i < len(f.Params) {
		return f.Params[i], true
	}
	if n := len(f.Params); n > 0 && (f.Max < 0 || f.Max > n) {
		return f.Params[n-1], true
	}
	return Param{}, false
}

// ArgList writes the argument list for help from the parameters, as in
// "(P, pf, lagging|leading)"; optional parameters are in brackets. A
// function without Params keeps its Args text.
func (f *Func) ArgList() string {
	if len(f.Params) == 0 {
		return f.Args
	}
	var b strings.Builder
	b.WriteByte('(')
	for i, p := range f.Params {
		name := p.Name
		if p.Kind == ParamWord && len(f.Words) > 0 {
			name = p.Name + ": " + wordsOf(f, p)
		}
		switch {
		case i == 0 && p.Optional:
			b.WriteString("[" + name + "]")
		case p.Optional:
			b.WriteString("[, " + name + "]")
		case i == 0:
			b.WriteString(name)
		default:
			b.WriteString(", " + name)
		}
	}
	if f.Max < 0 || f.Max > len(f.Params) {
		b.WriteString(", ...")
	}
	b.WriteByte(')')
	return b.String()
}

// wordsOf lists the words a word parameter takes: those named in its Doc
// as "a|b", else all of the function's words.
func wordsOf(f *Func, p Param) string {
	if i := strings.IndexByte(p.Doc, '|'); i >= 0 {
		if w := strings.Fields(p.Doc); len(w) > 0 {
			for _, x := range w {
				if strings.Contains(x, "|") {
					return strings.Trim(x, ",;.()")
				}
			}
		}
	}
	return strings.Join(f.Words, "|")
}

// checkParam refuses an argument of the wrong kind with a message that
// names the parameter, the kind it takes and the kind it got.
func checkParam(f *Func, p Param, a Arg) error {
	if a.Word != "" || p.Kind.Accepts(a.Q) {
		return nil
	}
	msg := fmt.Sprintf("%s: %s takes %s, got %s", f.Name, p.Name, p.Kind, QuantityWord(a.Q))
	if p.Else != "" {
		msg += "; " + p.Else
	}
	return errorf("%s", msg)
}

// QuantityWord names a quantity's kind for messages, such as "an apparent
// power in VA" or "a plain number".
func QuantityWord(q Quantity) string {
	name := QuantityName(q)
	unit := UnitSymbol(q.Dim, q.Kind, false)
	art := "a "
	if strings.IndexAny(name[:1], "aeiou") == 0 {
		art = "an "
	}
	w := art + strings.ReplaceAll(name, "-", " ")
	if unit != "" {
		w += " in " + unit
	}
	return w
}
