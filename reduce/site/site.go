// Package site holds the checks made while troubleshooting and
// commissioning: whether a measurement is plausible given part tolerances
// and meter accuracy, components from meter and oscilloscope readings,
// phase rotation, preferred values, cable voltage drop, transformers, fault
// level, the per-unit system and instrument transformer ratios.
//
// Every function returns its results as named quantities together with the
// steps (calc.Step) that show the work. Angles are held in radians and shown
// in (−180°, 180°]; phasors are RMS; S = V·I* so Q > 0 is inductive.
package site

import (
	"errors"
	"fmt"
	"math"

	"argand/calc"
)

// ErrInconsistentPower reports a real power reading larger than V·I.
var ErrInconsistentPower = errors.New("inconsistent: P exceeds V·I (meter error or wrong wiring)")

// maxInput bounds input magnitudes so that products such as V² or S·Z
// cannot overflow.
const maxInput = 1e100

func errf(format string, a ...any) error { return fmt.Errorf(format, a...) }

// finite returns an error naming the first input that is NaN, infinite or
// absurdly large.
func finite(names []string, xs ...float64) error {
	for i, x := range xs {
		name := "input"
		if i < len(names) {
			name = names[i]
		}
		if math.IsNaN(x) || math.IsInf(x, 0) {
			return errf("%s is not a finite number", name)
		}
		if math.Abs(x) > maxInput {
			return errf("%s is too large (|%s| > 1e100)", name, name)
		}
	}
	return nil
}

// positive checks that x is finite and > 0.
func positive(name string, x float64) error {
	if err := finite([]string{name}, x); err != nil {
		return err
	}
	if x <= 0 {
		return errf("%s must be greater than zero (got %g)", name, x)
	}
	return nil
}

// finiteC checks a complex input.
func finiteC(name string, z complex128) error {
	return finite([]string{name + " (real part)", name + " (imaginary part)"}, real(z), imag(z))
}

// rq returns a real quantity. A voltage or current given as a real number
// here is a size (a reading, a rating, a drop), never a phasor at 0°.
func rq(x float64, d calc.Dim) calc.Quantity {
	if d == calc.DimVoltage || d == calc.DimCurrent {
		return calc.Magnitude(x, d)
	}
	return calc.Real(x, d)
}

// cq returns a complex quantity.
func cq(z complex128, d calc.Dim) calc.Quantity { return calc.Q(z, d) }

// num returns a plain number.
func num(x float64) calc.Quantity { return calc.Number(complex(x, 0)) }

// pct is a ratio given in per cent (a dip of 5.4), held as the ratio it
// is (0.054) and shown in per cent (5.400 %), so that it reads "dip =
// 5.400 %" and a worksheet computes with it as a ratio.
func pct(x float64) calc.Quantity {
	return calc.Quantity{V: complex(x/100, 0), Kind: calc.KindPercent}
}

// angle returns an angle quantity normalised to (−π, π].
func angle(rad float64) calc.Quantity { return calc.Angle(normRad(rad)) }

// normRad reduces an angle in radians to (−π, π].
func normRad(rad float64) float64 {
	return calc.NormDeg(rad*180/math.Pi) * math.Pi / 180
}

// deg converts radians to degrees.
func deg(rad float64) float64 { return rad * 180 / math.Pi }

// rad converts degrees to radians.
func rad(d float64) float64 { return d * math.Pi / 180 }

// kq returns a real quantity of dimension d and kind k: a magnitude, a
// resistance, a reactance.
func kq(x float64, d calc.Dim, k calc.Kind) calc.Quantity {
	return calc.Quantity{V: complex(x, 0), Dim: d, Kind: k}
}

// power returns a real power of kind k; an apparent power, given as
// KindApparent by older callers, is a magnitude |S|.
func power(x float64, k calc.Kind) calc.Quantity {
	if k == calc.KindApparent {
		k = calc.KindMagnitude
	}
	return calc.Quantity{V: complex(x, 0), Dim: calc.DimPower, Kind: k}
}

func op(name string, q calc.Quantity) calc.Operand { return calc.Operand{Name: name, Value: q} }

// checkOps returns an error if any operand holds NaN or an infinity, so no
// such value ever leaves the package.
func checkOps(ops []calc.Operand) error {
	for _, o := range ops {
		if _, err := o.Value.Check(o.Name); err != nil {
			return err
		}
	}
	return nil
}

// checkSteps checks every input and result of every step.
func checkSteps(steps []calc.Step) error {
	for i := range steps {
		if err := checkOps(steps[i].Inputs); err != nil {
			return err
		}
		if err := checkOps(steps[i].Results); err != nil {
			return err
		}
	}
	return nil
}

// sig formats x with a few significant figures for notes.
func sig(x float64) string { return fmt.Sprintf("%.4g", x) }
