package site

import (
	"math"
	"math/cmplx"

	"argand/calc"
)

// magq returns a magnitude: a real, non-negative value whose angle means
// nothing (a current read on a meter, a voltage on a rating plate).
func magq(x float64, d calc.Dim) calc.Quantity { return kq(x, d, calc.KindMagnitude) }

// LockedRotor is a motor's locked-rotor (starting) current at rated
// voltage, three-phase.
type LockedRotor struct {
	I    calc.Quantity // |I_LR|, A, line current at rated voltage
	S    calc.Quantity // |S_LR| = √3·V·I_LR, VA
	Step calc.Step
}

// LockedRotorFromMultiple returns the locked-rotor current as a multiple
// k of the rated current: I_LR = k·I_r, and the starting apparent power
// √3·V·I_LR at the rated line voltage V (common practice).
func LockedRotorFromMultiple(ir, k, v float64) (LockedRotor, error) {
	if err := positive("rated current", ir); err != nil {
		return LockedRotor{}, err
	}
	if err := positive("multiple k", k); err != nil {
		return LockedRotor{}, err
	}
	if err := positive("rated voltage", v); err != nil {
		return LockedRotor{}, err
	}
	if k < 1 || k > 20 {
		return LockedRotor{}, errf("a locked-rotor current of %g times the rated current is outside 1 to 20 times: check the multiple", k)
	}
	ilr := k * ir
	r := LockedRotor{I: magq(ilr, calc.DimCurrent), S: power(math.Sqrt(3)*v*ilr, calc.KindApparent)}
	r.Step = calc.Step{
		Kind:    "motor",
		Rule:    "locked-rotor current as a multiple of the rated current, three-phase (common practice)",
		Formula: "I_LR = k·I_r,  |S_LR| = √3·V·I_LR",
		Inputs:  []calc.Operand{op("I_r", magq(ir, calc.DimCurrent)), op("k", num(k)), op("V (line, rated)", magq(v, calc.DimVoltage))},
		Results: []calc.Operand{op("I_LR", r.I), op("|S_LR|", r.S)},
		Notes:   []string{"at rated voltage; the current falls in proportion to the voltage the motor actually sees"}, Cautions: calc.CautionsOf(calc.CautionMotor),
	}
	return r, checkSteps([]calc.Step{r.Step})
}

// LockedRotorFromKVA returns the locked-rotor current from a starting
// apparent power per unit of rated output, r = |S_LR|/P_out (such as
// 6 kVA/kW, or a value per horsepower the user takes from the maker's
// data): |S_LR| = r·P_out and I_LR = |S_LR|/(√3·V) (common practice).
func LockedRotorFromKVA(pout, ratio, v float64) (LockedRotor, error) {
	if err := positive("rated output", pout); err != nil {
		return LockedRotor{}, err
	}
	if err := positive("locked-rotor VA per W of output", ratio); err != nil {
		return LockedRotor{}, err
	}
	if err := positive("rated voltage", v); err != nil {
		return LockedRotor{}, err
	}
	if ratio < 1 || ratio > 40 {
		return LockedRotor{}, errf("%g VA of locked-rotor power per W of output is outside 1 to 40: write it with its units, such as 6 kVA/kW or 5 kVA/hp", ratio)
	}
	s := ratio * pout
	ilr := s / (math.Sqrt(3) * v)
	r := LockedRotor{I: magq(ilr, calc.DimCurrent), S: power(s, calc.KindApparent)}
	r.Step = calc.Step{
		Kind:    "motor",
		Rule:    "locked-rotor current from the starting apparent power per unit of rated output, three-phase (common practice)",
		Formula: "|S_LR| = r·P_out,  I_LR = |S_LR|/(√3·V)",
		Inputs: []calc.Operand{op("P_out", power(pout, calc.KindActive)), op("r (VA per W)", num(ratio)),
			op("V (line, rated)", magq(v, calc.DimVoltage))},
		Results:  []calc.Operand{op("I_LR", r.I), op("|S_LR|", r.S)},
		Notes:    []string{"r is the maker's figure; a value per horsepower converts through the unit: 5 kVA/hp = 5 kVA per 745.7 W, 5 kVA/hp_metric per 735.5 W"},
		Cautions: calc.CautionsOf(calc.CautionMotor),
	}
	return r, checkSteps([]calc.Step{r.Step})
}

// StartMethod is how a motor is started.
type StartMethod uint8

const (
	DirectOnLine StartMethod = iota
	StarDelta
	AutoTransformer
	CurrentLimit
)

var startWords = [...]string{"direct on line", "star-delta", "autotransformer", "current limit"}

func (m StartMethod) String() string {
	if int(m) < len(startWords) {
		return startWords[m]
	}
	return "start"
}

// Start is a three-phase motor start fed through a radial supply. The
// supply impedances are per phase (star equivalent) and referred to the
// motor's voltage; the source e.m.f. is the rated line voltage V.
type Start struct {
	ILR  float64 // locked-rotor line current at rated voltage, direct on line, A
	PFLR float64 // locked-rotor power factor (lagging), 0 < PF < 1
	V    float64 // rated line voltage of the motor = the open-circuit supply voltage, V
	// Zs, Zt, Zc are the source (referred through the transformer), the
	// transformer and the cable, Ω per phase.
	Zs, Zt, Zc complex128
	Method     StartMethod
	Tap        float64 // autotransformer tap, motor voltage/line voltage, 0 < tap < 1
	Limit      float64 // current limit, A, line current
}

// StartResult is the state of the supply during a start.
type StartResult struct {
	Vmotor, Vbus, Vsupply calc.Quantity // line-to-line phasors, the source e.m.f. at 0°
	I                     calc.Quantity // line current phasor
	S                     calc.Quantity // |S| drawn at the motor's starter, VA
	Dip, DipBus, DipSup   float64       // exact dips, per cent of V
	Approx, ApproxBus     float64       // the scalar (kVA method) approximation, per cent
	ApproxSup             float64
	Torque                float64 // starting torque as a fraction of the locked-rotor torque at rated voltage, direct on line
	Zeq                   calc.Quantity
	Steps                 []calc.Step
}

// MotorStart solves a motor start as a per-phase network: the stalled
// motor is the constant impedance Z_LR = (V/√3)/I_LR ∠ acos(PF_LR) (star
// equivalent), which the starter presents to the line as Z_eq = m·Z_LR —
// m = 1 direct on line, 3 in star for a motor that runs in delta, 1/tap²
// behind an ideal autotransformer, and for a current limit the m for which
// the line current is the limit at the locked-rotor power factor. The
// current is I = E/(Zs + Zt + Zc + Z_eq) with E = V/√3 ∠0°; the voltages
// are the e.m.f. less the drop up to each point: the supply point (after
// Zs), the transformer's secondary terminals (after Zt) and the motor.
//
// Beside the phasor solution it gives the usual approximation that adds
// the impedance magnitudes as scalars (the kVA method: a dip of
// |Z_upstream|/(|Z_sys| + |Z_eq|), that is S_start/(S_sc + S_start) at the
// motor), which is close when the angles of the supply and the stalled
// motor are near one another.
func MotorStart(st Start) (StartResult, error) {
	if err := positive("locked-rotor current", st.ILR); err != nil {
		return StartResult{}, err
	}
	if err := positive("locked-rotor power factor", st.PFLR); err != nil {
		return StartResult{}, err
	}
	if st.PFLR >= 1 {
		return StartResult{}, errf("a locked-rotor power factor of %g is not below 1 (a stalled induction motor lags)", st.PFLR)
	}
	if err := positive("rated voltage", st.V); err != nil {
		return StartResult{}, err
	}
	for _, z := range []struct {
		n string
		z complex128
	}{{"source impedance", st.Zs}, {"transformer impedance", st.Zt}, {"cable impedance", st.Zc}} {
		if err := finiteC(z.n, z.z); err != nil {
			return StartResult{}, err
		}
		if real(z.z) < 0 {
			return StartResult{}, errf("the %s has a negative resistance (%g Ω)", z.n, real(z.z))
		}
	}
	e := st.V / math.Sqrt(3)
	th := math.Acos(st.PFLR)
	zlr := cmplx.Rect(e/st.ILR, th)
	zsys := st.Zs + st.Zt + st.Zc
	var m float64
	var rule, formula string
	notes := []string{}
	torque := 1.0 // of the locked-rotor torque, before the voltage at the motor is counted
	switch st.Method {
	case DirectOnLine:
		m, rule, formula = 1, "direct on line", "Z_eq = Z_LR"
	case StarDelta:
		m, rule, formula = 3, "star-delta: the windings in star draw a third of the line current they draw in delta", "Z_eq = 3·Z_LR"
		torque = 1.0 / 3
		notes = append(notes, "the motor must be rated to run in delta at V; each winding sees V/√3 during the start")
	case AutoTransformer:
		if err := positive("autotransformer tap", st.Tap); err != nil {
			return StartResult{}, err
		}
		if st.Tap >= 1 {
			return StartResult{}, errf("an autotransformer tap of %g is not below 1 (write 0.65 or 65 %%)", st.Tap)
		}
		m = 1 / (st.Tap * st.Tap)
		rule, formula = "autotransformer at tap t (ideal): the motor sees t·V and the line carries t² of the direct-on-line current", "Z_eq = Z_LR/t²"
		torque = st.Tap * st.Tap
		notes = append(notes, "the autotransformer's own impedance and magnetising current are left out")
	case CurrentLimit:
		if err := positive("current limit", st.Limit); err != nil {
			return StartResult{}, err
		}
		// Solve |Zsys + r·u| = E/I_lim for r > 0, u = e^{jθ}: a quadratic
		// in r whose larger root is the physical one.
		u := cmplx.Rect(1, th)
		k := e / st.Limit
		b := real(zsys * cmplx.Conj(u))
		zs2 := real(zsys)*real(zsys) + imag(zsys)*imag(zsys)
		disc := b*b - zs2 + k*k
		r := -b + math.Sqrt(math.Max(disc, 0))
		if disc < 0 || r <= 0 {
			var f calc.Format
			return StartResult{}, errf("a current limit of %s is more than the supply can deliver into a short circuit at the motor (%s)",
				f.Mag(st.Limit, calc.DimCurrent, calc.KindMagnitude), f.Mag(e/cmplx.Abs(zsys), calc.DimCurrent, calc.KindMagnitude))
		}
		m = r / cmplx.Abs(zlr)
		if m < 1 {
			// the limit is above the direct-on-line current: it never acts
			m = 1
			notes = append(notes, "the limit is above the direct-on-line current, so it does not act: the result is a direct-on-line start")
		}
		rule, formula = "current limit: the starter holds the line current at the limit, at the locked-rotor power factor", "|E/(Z_sys + Z_eq)| = I_lim, Z_eq ∠ Z_LR"
		notes = append(notes, "the starter is taken as a constant impedance at the locked-rotor angle; the harmonic currents of a thyristor starter are left out")
	default:
		return StartResult{}, errf("unknown starting method")
	}
	zeq := zlr * complex(m, 0)
	ztot := zsys + zeq
	i := complex(e, 0) / ztot
	vm := i * zeq
	vsup := complex(e, 0) - i*st.Zs
	vbus := vsup - i*st.Zt
	k3 := complex(math.Sqrt(3), 0)
	// Line-to-line phasors are shown at the phase angle of their
	// star-equivalent phase voltage times √3: the ∠+30° of V_ab is left
	// out so that the e.m.f. is the 0° reference (the dip is a magnitude).
	res := StartResult{
		Vmotor:  cq(vm*k3, calc.DimVoltage),
		Vbus:    cq(vbus*k3, calc.DimVoltage),
		Vsupply: cq(vsup*k3, calc.DimVoltage),
		I:       cq(i, calc.DimCurrent),
		S:       power(3*cmplx.Abs(vm)*cmplx.Abs(i), calc.KindApparent),
		Dip:     dipPct(cmplx.Abs(vm), e),
		DipBus:  dipPct(cmplx.Abs(vbus), e),
		DipSup:  dipPct(cmplx.Abs(vsup), e),
		Zeq:     cq(zeq, calc.DimImpedance),
	}
	// torque ∝ (voltage on the winding)²: the voltage ratio at the motor
	// scales the torque the method leaves.
	vr := cmplx.Abs(vm) / e
	if st.Method == CurrentLimit {
		torque = (cmplx.Abs(i) / st.ILR) * (cmplx.Abs(i) / st.ILR)
	} else {
		torque *= vr * vr
	}
	res.Torque = torque
	den := cmplx.Abs(st.Zs) + cmplx.Abs(st.Zt) + cmplx.Abs(st.Zc) + cmplx.Abs(zeq)
	res.Approx = (cmplx.Abs(st.Zs) + cmplx.Abs(st.Zt) + cmplx.Abs(st.Zc)) / den * 100
	res.ApproxBus = (cmplx.Abs(st.Zs) + cmplx.Abs(st.Zt)) / den * 100
	res.ApproxSup = cmplx.Abs(st.Zs) / den * 100
	vop := func(name string, x float64) calc.Operand { return op(name, magq(x, calc.DimVoltage)) }
	res.Steps = []calc.Step{
		{
			Kind:    "motorstart",
			Rule:    "stalled motor as a constant impedance (star equivalent, three-phase), seen from the line through the starter: " + rule,
			Formula: "Z_LR = (V/√3)/I_LR ∠ acos(PF_LR);  " + formula,
			Inputs: []calc.Operand{op("I_LR (rated V, direct)", magq(st.ILR, calc.DimCurrent)), op("PF_LR", num(st.PFLR)),
				vop("V (line, rated)", st.V)},
			Results: []calc.Operand{op("Z_LR", cq(zlr, calc.DimImpedance)), op("Z_eq", res.Zeq)},
			Notes:   notes,
		},
		{
			Kind:    "motorstart",
			Rule:    "the start solved as a network: e.m.f. E = V/√3 ∠0° behind the source, transformer and cable in series with Z_eq",
			Formula: "I = E/(Zs + Zt + Zc + Z_eq);  V_supply = E − I·Zs,  V_bus = V_supply − I·Zt,  V_motor = I·Z_eq (line-to-line ×√3)",
			Inputs:  []calc.Operand{op("Zs", cq(st.Zs, calc.DimImpedance)), op("Zt", cq(st.Zt, calc.DimImpedance)), op("Zc", cq(st.Zc, calc.DimImpedance)), op("Z_eq", res.Zeq)},
			Results: []calc.Operand{op("V_motor", res.Vmotor), op("I", res.I), op("V_bus", res.Vbus), op("V_supply", res.Vsupply),
				op("dip at the motor", pct(res.Dip)), op("dip at the bus", pct(res.DipBus)), op("dip at the supply point", pct(res.DipSup)),
				op("|S| at the starter", res.S), op("torque / T_LR", num(res.Torque))},
			Notes: []string{"line-to-line values are √3 times the phase values and shown at the phase angle, so the e.m.f. is the 0° reference",
				"dips are per cent of V, the no-load voltage before the start; loads already on the bus and the source's own regulation are left out",
				"torque is the fraction of the locked-rotor torque at rated voltage direct on line, T proportional to (winding voltage)² (common practice)"},
		},
		{
			Kind:    "motorstart",
			Rule:    "the usual approximation beside it: impedance magnitudes added as scalars (the kVA method, S_start/(S_sc + S_start) at the motor)",
			Formula: "dip_k ≈ (|Zs| + … up to k)/(|Zs| + |Zt| + |Zc| + |Z_eq|)",
			Inputs: []calc.Operand{op("|Zs| + |Zt| + |Zc|", magq(cmplx.Abs(st.Zs)+cmplx.Abs(st.Zt)+cmplx.Abs(st.Zc), calc.DimImpedance)),
				op("|Z_eq|", magq(cmplx.Abs(zeq), calc.DimImpedance))},
			Results: []calc.Operand{op("dip at the motor (approx)", pct(res.Approx)), op("dip at the bus (approx)", pct(res.ApproxBus)),
				op("dip at the supply point (approx)", pct(res.ApproxSup)), op("exact − approx at the motor (points)", pct(res.Dip-res.Approx))},
			Cautions: calc.CautionsOf(calc.CautionMotor, calc.CautionMains),
		},
	}
	if err := checkSteps(res.Steps); err != nil {
		return StartResult{}, err
	}
	return res, nil
}

// dipPct returns the fall of v below e in per cent of e, with a
// difference at the level of rounding (a stiff supply) shown as 0.
func dipPct(v, e float64) float64 {
	d := (e - v) / e
	if math.Abs(d) < 1e-12 {
		return 0
	}
	return d * 100
}
