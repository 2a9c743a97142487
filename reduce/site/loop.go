package site

import (
	"math/cmplx"

	"argand/calc"
)

// Loop is the earth fault loop of a final circuit: the loop impedance
// external to the circuit Z_e, and the circuit's line and protective
// conductors, R1 + R2 per length at 20 °C, over the route length.
type Loop struct {
	U0       float64    // nominal voltage to earth, V
	Ze       complex128 // Ω; a real value is a measured magnitude
	R12      float64    // (R1 + R2) per length at 20 °C, Ω/m
	Length   float64    // m
	Theta    float64    // conductor operating temperature, °C
	Material Conductor
	// The user's limit, one of them or neither: a maximum Z_s (Ω) or the
	// minimum fault current the protective device needs to disconnect
	// in time (A).
	MaxZs, MinI float64
}

// LoopResult is the loop impedance, the prospective fault current and the
// verdict against the user's limit.
type LoopResult struct {
	Factor calc.Quantity // temperature factor
	R12    calc.Quantity // (R1 + R2)·L at θ, Ω
	Zs     calc.Quantity // Ω
	If     calc.Quantity // U0/|Z_s|, A (a magnitude)
	// Within is 1 when the limit is met, 0 when not; Checked says a limit
	// was given.
	Within  bool
	Checked bool
	Verdict string // one line: met or not, for the summary of a call
	Steps   []calc.Step
}

// EarthLoop returns the earth fault loop impedance of a final circuit,
// Z_s = Z_e + (R1 + R2)·L·F with F = 1 + α20·(θ − 20 °C) the conductor
// temperature factor (α20 of IEC 60228 / IEC 60287-1-1, as in RTemp), and
// the prospective fault current I_f = U0/|Z_s| (common practice), then
// compares them with the user's maximum Z_s or minimum current.
func EarthLoop(l Loop) (LoopResult, error) {
	if err := positive("U0", l.U0); err != nil {
		return LoopResult{}, err
	}
	if err := finiteC("Z_e", l.Ze); err != nil {
		return LoopResult{}, err
	}
	if real(l.Ze) < 0 || imag(l.Ze) < 0 {
		return LoopResult{}, errf("Z_e must not have a negative part")
	}
	if err := positive("(R1 + R2) per length", l.R12); err != nil {
		return LoopResult{}, err
	}
	if err := positive("length", l.Length); err != nil {
		return LoopResult{}, err
	}
	if err := finite([]string{"θ", "maximum Z_s", "minimum current"}, l.Theta, l.MaxZs, l.MinI); err != nil {
		return LoopResult{}, err
	}
	if l.Theta < -50 || l.Theta > 250 {
		return LoopResult{}, errf("θ = %s °C is not a conductor operating temperature (−50 to 250 °C)", sig(l.Theta))
	}
	if l.MaxZs < 0 || l.MinI < 0 || (l.MaxZs > 0 && l.MinI > 0) {
		return LoopResult{}, errf("give one limit: a maximum Z_s in Ω or a minimum fault current in A")
	}
	m := l.Material
	if m.Alpha20 == 0 {
		m = Copper
	}
	f := 1 + m.Alpha20*(l.Theta-20)
	r12 := l.R12 * l.Length * f
	zs := l.Ze + complex(r12, 0)
	mag := cmplx.Abs(zs)
	ifault := l.U0 / mag
	zsq := cq(zs, calc.DimImpedance)
	if imag(zs) == 0 {
		zsq.Kind = calc.KindMagnitude // Z_e was a measured magnitude
	}
	r := LoopResult{Factor: num(f), R12: kq(r12, calc.DimImpedance, calc.KindResistive), Zs: zsq, If: kq(ifault, calc.DimCurrent, calc.KindMagnitude)}
	zeNote := "Z_e given as a magnitude: added arithmetically to R1 + R2, which slightly overstates Z_s (common practice)"
	if imag(l.Ze) != 0 {
		zeNote = "Z_e given as a complex impedance: added to R1 + R2 as a phasor"
	}
	steps := []calc.Step{
		{
			Kind: "loop",
			Rule: "earth fault loop impedance of a final circuit; conductor resistance from 20 °C to the operating temperature θ, " + m.Name +
				" α20 = " + sig(m.Alpha20) + " /K (IEC 60228 / IEC 60287-1-1, from memory)",
			Formula: "F = 1 + α20·(θ − 20 °C);  Z_s = Z_e + (R1 + R2)·L·F",
			Inputs: []calc.Operand{op("Z_e", cq(l.Ze, calc.DimImpedance)), op("(R1 + R2)/L at 20 °C", kq(l.R12, perMetre, calc.KindResistive)),
				op("L", rq(l.Length, calc.DimLength)), op("θ (°C)", num(l.Theta))},
			Results: []calc.Operand{op("F", r.Factor), op("(R1 + R2)·L·F", r.R12), op("Z_s", r.Zs)},
			Notes:   []string{zeNote},
		},
		{
			Kind:    "loop",
			Rule:    "prospective earth fault current at the end of the circuit (common practice)",
			Formula: "I_f = U0/|Z_s|",
			Inputs:  []calc.Operand{op("U0", rq(l.U0, calc.DimVoltage)), op("|Z_s|", kq(mag, calc.DimImpedance, calc.KindMagnitude))},
			Results: []calc.Operand{op("I_f", r.If)},
		},
	}
	last := &steps[1]
	switch {
	case l.MaxZs > 0:
		r.Checked, r.Within = true, mag <= l.MaxZs
		verdict := "|Z_s| = " + sig(mag) + " Ω is within the maximum " + sig(l.MaxZs) + " Ω you gave"
		if !r.Within {
			verdict = "|Z_s| = " + sig(mag) + " Ω EXCEEDS the maximum " + sig(l.MaxZs) + " Ω you gave"
		}
		r.Verdict = "verdict: limit met, |Z_s| ≤ your maximum Z_s"
		if !r.Within {
			r.Verdict = "verdict: limit NOT met, |Z_s| > your maximum Z_s"
		}
		last.Inputs = append(last.Inputs, op("Z_s max (yours)", kq(l.MaxZs, calc.DimImpedance, calc.KindMagnitude)))
		last.Notes = append(last.Notes, verdict)
	case l.MinI > 0:
		r.Checked, r.Within = true, ifault >= l.MinI
		verdict := "I_f = " + sig(ifault) + " A reaches the minimum " + sig(l.MinI) + " A you gave"
		if !r.Within {
			verdict = "I_f = " + sig(ifault) + " A is BELOW the minimum " + sig(l.MinI) + " A you gave"
		}
		r.Verdict = "verdict: limit met, I_f ≥ your minimum current"
		if !r.Within {
			r.Verdict = "verdict: limit NOT met, I_f < your minimum current"
		}
		last.Inputs = append(last.Inputs, op("I min (yours)", kq(l.MinI, calc.DimCurrent, calc.KindMagnitude)))
		last.Notes = append(last.Notes, verdict)
	default:
		last.Notes = append(last.Notes, "no limit given: nothing compared")
	}
	last.Cautions = calc.CautionsOf(calc.CautionLoop, calc.CautionFault, calc.CautionMains)
	r.Steps = steps
	if err := checkSteps(steps); err != nil {
		return LoopResult{}, err
	}
	return r, nil
}
