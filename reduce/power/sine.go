package power

import (
	"fmt"
	"math"
	"math/cmplx"

	"argand/calc"
)

// Sine holds the peak, RMS and rectified average of one sinusoid. Peak and
// RMS keep the phase angle of a phasor given as input; the rectified
// average is a real magnitude.
type Sine struct {
	Peak    calc.Quantity // amplitude
	RMS     calc.Quantity // Peak/√2
	RectAvg calc.Quantity // mean of |x(t)| over a cycle, 2·|Peak|/π
}

// sineNotes are the remarks every sinusoid step carries.
var sineNotes = [...]string{
	"the plain average of a sinusoid over a whole cycle is 0; the rectified average is the mean of its absolute value",
	"these ratios hold for a pure sinusoid only, not for distorted waveforms",
}

func sineFromPeak(pk calc.Quantity) (Sine, error) {
	s := Sine{
		Peak:    pk,
		RMS:     calc.Quantity{V: pk.V / complex(math.Sqrt2, 0), Dim: pk.Dim, Kind: pk.Kind},
		RectAvg: calc.Quantity{V: complex(2*cmplx.Abs(pk.V)/math.Pi, 0), Dim: pk.Dim, Kind: pk.Kind},
	}
	for _, q := range []calc.Quantity{s.Peak, s.RMS, s.RectAvg} {
		if _, err := q.Check("sinusoid"); err != nil {
			return Sine{}, err
		}
	}
	return s, nil
}

func sineStep(rule, formula string, in calc.Operand, s Sine) []calc.Step {
	return []calc.Step{{
		Kind:    "sine",
		Rule:    rule + " (common practice)",
		Formula: formula,
		Inputs:  []calc.Operand{in},
		Results: []calc.Operand{{Name: "peak", Value: s.Peak}, {Name: "rms", Value: s.RMS}, {Name: "rectified average", Value: s.RectAvg}},
		Notes:   sineNotes[:],
	}}
}

func sineCheck(fn string, x calc.Quantity) error {
	if x.Kind == calc.KindAngle {
		return fmt.Errorf("%s: the argument is an angle, not the size of a sinusoid", fn)
	}
	if _, err := x.Check(fn); err != nil {
		return fmt.Errorf("%s: %w", fn, err)
	}
	return nil
}

// SineFromPeak returns the RMS value V_pk/√2 and rectified average
// 2·V_pk/π of a sinusoid of amplitude pk.
func SineFromPeak(pk calc.Quantity) (Sine, []calc.Step, error) {
	if err := sineCheck("rms", pk); err != nil {
		return Sine{}, nil, err
	}
	s, err := sineFromPeak(pk)
	if err != nil {
		return Sine{}, nil, fmt.Errorf("rms: %w", err)
	}
	return s, sineStep("RMS and rectified average of a sinusoid from its peak", "X_rms = X_pk/√2; X_avg = 2·X_pk/π", calc.Operand{Name: "peak", Value: pk}, s), nil
}

// SineFromRMS returns the peak √2·V_rms and rectified average of a
// sinusoid of RMS value rms.
func SineFromRMS(rms calc.Quantity) (Sine, []calc.Step, error) {
	if err := sineCheck("peak", rms); err != nil {
		return Sine{}, nil, err
	}
	s, err := sineFromPeak(calc.Quantity{V: rms.V * complex(math.Sqrt2, 0), Dim: rms.Dim, Kind: rms.Kind})
	if err != nil {
		return Sine{}, nil, fmt.Errorf("peak: %w", err)
	}
	s.RMS = rms // exact as given, not through √2 and back
	return s, sineStep("peak and rectified average of a sinusoid from its RMS value", "X_pk = √2·X_rms; X_avg = 2·X_pk/π", calc.Operand{Name: "rms", Value: rms}, s), nil
}

// SineFromRectAvg returns the peak π·V_avg/2 and RMS value of a sinusoid
// whose rectified average is avg (its magnitude is used).
func SineFromRectAvg(avg calc.Quantity) (Sine, []calc.Step, error) {
	if err := sineCheck("rectpeak", avg); err != nil {
		return Sine{}, nil, err
	}
	a := cmplx.Abs(avg.V)
	s, err := sineFromPeak(calc.Quantity{V: complex(a*math.Pi/2, 0), Dim: avg.Dim, Kind: avg.Kind})
	if err != nil {
		return Sine{}, nil, fmt.Errorf("rectpeak: %w", err)
	}
	s.RectAvg = calc.Quantity{V: complex(a, 0), Dim: avg.Dim, Kind: avg.Kind}
	return s, sineStep("peak and RMS value of a sinusoid from its rectified average", "X_pk = π·X_avg/2; X_rms = X_pk/√2", calc.Operand{Name: "rectified average", Value: s.RectAvg}, s), nil
}
