package site

import (
	"math"

	"argand/calc"
)

// PPToRMS converts a peak-to-peak reading of a sinusoid (a voltage or a
// current) to peak and RMS: peak = pp/2, RMS = pp/(2√2). It holds for a pure
// sinusoid only; the step says so.
func PPToRMS(pp calc.Quantity) (rms, peak calc.Quantity, st calc.Step, err error) {
	if !pp.IsReal() || real(pp.V) <= 0 {
		return rms, peak, st, errf("a peak-to-peak reading is a positive real value")
	}
	if err := finite([]string{"peak-to-peak"}, real(pp.V)); err != nil {
		return rms, peak, st, err
	}
	x := real(pp.V)
	peak = calc.Quantity{V: complex(x/2, 0), Dim: pp.Dim, Kind: pp.Kind}
	rms = calc.Quantity{V: complex(x/(2*math.Sqrt2), 0), Dim: pp.Dim, Kind: pp.Kind}
	st = calc.Step{
		Kind:    "scope",
		Rule:    "peak-to-peak to RMS for a sinusoid",
		Formula: "peak = pp/2, RMS = pp/(2√2)",
		Inputs:  []calc.Operand{op("pp", pp)},
		Results: []calc.Operand{op("rms", rms), op("peak", peak)},
		Notes:   []string{"valid for a pure sinusoid only; a distorted waveform needs a true-RMS measurement"},
	}
	return rms, peak, st, nil
}

// Delay is a time delay between two oscilloscope traces turned into a phase
// angle.
type Delay struct {
	// Phi is the angle by which trace 1 leads trace 2, in (−π, π]:
	// φ = 360°·f·Δt, reduced to (−180°, 180°].
	Phi   calc.Quantity
	Leads string // "trace 1 leads", "trace 2 leads", "in phase" or "antiphase"
	Step  calc.Step
}

// DelayToPhase returns the phase angle between two traces from the time dt
// (s) by which a feature of trace 2 (such as its rising zero crossing)
// follows the same feature of trace 1, at frequency f (Hz). A positive dt
// means trace 2 comes later, so trace 1 leads by φ = 360°·f·dt.
func DelayToPhase(dt, f float64) (Delay, error) {
	if err := finite([]string{"time delay"}, dt); err != nil {
		return Delay{}, err
	}
	if err := positive("frequency", f); err != nil {
		return Delay{}, err
	}
	cycles := f * dt
	// Reduce whole cycles first so that the angle keeps its precision.
	frac := cycles - math.Round(cycles)
	phiDeg := calc.NormDeg(360 * frac)
	d := Delay{Phi: angle(rad(phiDeg))}
	switch {
	case phiDeg == 0:
		d.Leads = "in phase"
	case phiDeg == 180:
		d.Leads = "antiphase"
	case phiDeg > 0:
		d.Leads = "trace 1 leads"
	default:
		d.Leads = "trace 2 leads"
	}
	d.Step = calc.Step{
		Kind:    "scope",
		Rule:    "time delay to phase angle; Δt is how much later trace 2 crosses than trace 1",
		Formula: "φ = 360°·f·Δt, reduced to (−180°, 180°]",
		Inputs:  []calc.Operand{op("Δt", rq(dt, calc.DimTime)), op("f", rq(f, calc.DimFrequency))},
		Results: []calc.Operand{op("φ", d.Phi)},
		Notes:   []string{d.Leads + phaseText(phiDeg)},
	}
	if math.Abs(cycles) > 0.5 {
		d.Step.Notes = append(d.Step.Notes, "the delay is more than half a period: only its fraction of a period shows as phase, and the reading could be a period off")
	}
	return d, nil
}

func phaseText(phiDeg float64) string {
	switch {
	case phiDeg == 0 || phiDeg == 180:
		return ""
	default:
		return " by " + sig(math.Abs(phiDeg)) + "°"
	}
}

// RotationResult is the phase sequence found from three measured angles.
type RotationResult struct {
	Sequence int    // 1 for ABC, −1 for ACB
	Name     string // "ABC" or "ACB"
	// Errors of the angles of A, B and C from the ideal set of that
	// sequence, taking A as the reference (so the error of A is 0):
	// (0°, −120°, +120°) for ABC and (0°, +120°, −120°) for ACB.
	Errors [3]calc.Quantity
	Step   calc.Step
}

// Rotation finds the phase sequence from the measured phase angles (radians)
// of phases A, B and C. The sequence whose ideal set fits best is chosen;
// when even that one is 60° or more off, the angles are not a three-phase
// set and Rotation returns an error.
func Rotation(a, b, c float64) (RotationResult, error) {
	if err := finite([]string{"angle A", "angle B", "angle C"}, a, b, c); err != nil {
		return RotationResult{}, err
	}
	rb := calc.NormDeg(deg(b) - deg(a))
	rc := calc.NormDeg(deg(c) - deg(a))
	fit := func(ib, ic float64) (eb, ec, worst float64) {
		eb = calc.NormDeg(rb - ib)
		ec = calc.NormDeg(rc - ic)
		return eb, ec, math.Max(math.Abs(eb), math.Abs(ec))
	}
	eb1, ec1, w1 := fit(-120, 120)
	eb2, ec2, w2 := fit(120, -120)
	r := RotationResult{Sequence: 1, Name: "ABC"}
	eb, ec, w := eb1, ec1, w1
	ideal := "(0°, −120°, +120°)"
	if w2 < w1 {
		r = RotationResult{Sequence: -1, Name: "ACB"}
		eb, ec, w = eb2, ec2, w2
		ideal = "(0°, +120°, −120°)"
	}
	if w >= 60 {
		return RotationResult{}, errf("cannot tell the rotation: B and C sit at %.4g° and %.4g° from A, not near ±120° (a missing phase or two leads on one phase?)", rb, rc)
	}
	r.Errors = [3]calc.Quantity{angle(0), angle(rad(eb)), angle(rad(ec))}
	r.Step = calc.Step{
		Kind:    "rotation",
		Rule:    "phase sequence from three angles, A as reference; errors from the ideal set " + ideal,
		Formula: "θB − θA ≈ −120° and θC − θA ≈ +120° for ABC; the signs swap for ACB",
		Inputs:  []calc.Operand{op("θA", angle(a)), op("θB", angle(b)), op("θC", angle(c))},
		Results: []calc.Operand{op("errA", r.Errors[0]), op("errB", r.Errors[1]), op("errC", r.Errors[2])},
		Notes:   []string{"rotation " + r.Name}, Cautions: calc.CautionsOf(calc.CautionMains),
	}
	return r, nil
}
