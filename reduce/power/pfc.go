package power

import (
	"errors"
	"fmt"
	"math"
	"strconv"

	"argand/calc"
)

// Target describes a power-factor correction: the load, the supply and the
// power factor wanted.
type Target struct {
	Load    calc.Quantity // complex power of the whole load, VA (see FromPF, Sum)
	PF      float64       // target power factor, 0 < PF ≤ 1
	Leading bool          // the target is leading; normally false (lagging or unity)
	V       calc.Quantity // supply voltage: single-phase voltage, or line voltage for three-phase (magnitude used)
	Freq    float64       // supply frequency, Hz
	Phases  Phases
}

// Correction is the result of a power-factor correction.
type Correction struct {
	// Needed is false when the load already meets the target or when
	// capacitors cannot reach it (the load is more leading than the
	// target); then Qc and the capacitances are zero and After = Before.
	Needed        bool
	Before, After Power
	Qc            calc.Quantity // reactive power the capacitors supply, var (≥ 0)
	C             calc.Quantity // single-phase capacitance, F (zero for three-phase)
	CY            calc.Quantity // three-phase: capacitance per phase of a Y-connected bank, F
	CDelta        calc.Quantity // three-phase: capacitance per phase of a Δ-connected bank, F
	I1, I2        calc.Quantity // line current before and after, A
	// Reactor is the inductive reactive power that would reach the target
	// when the load is more leading than the target, var; zero otherwise.
	Reactor  calc.Quantity
	Notes    []string // the verdict in words
	Cautions []calc.StepCaution
}

func varQ(x float64) calc.Quantity {
	return calc.Quantity{V: complex(x, 0), Dim: calc.DimPower, Kind: calc.KindReactive}
}

func number(x float64) calc.Quantity { return calc.Number(complex(x, 0)) }

// pfTol absorbs rounding in a power factor computed from P and Q, so that
// a load built from PF 0.95 meets a target of 0.95.
const pfTol = 1e-12

// Correct finds the capacitor reactive power that brings a load to a target
// power factor, Q_c = P·(tan φ₁ − tan φ₂) (common practice), with tan φ
// signed (negative when leading), and the capacitance that supplies it at
// the supply voltage and frequency: C = Q_c/(ω·V²) single-phase; for a
// three-phase bank per phase C_Y = Q_c/(ω·V_L²) in Y (each capacitor at
// V_L/√3) and C_Δ = Q_c/(3·ω·V_L²) in Δ (each at V_L), so C_Y = 3·C_Δ.
func Correct(t Target) (Correction, []calc.Step, error) {
	if err := wantDim("pfc", "the load", t.Load, calc.DimPower, "a power"); err != nil {
		return Correction{}, nil, err
	}
	if err := checkPF("pfc", "the target PF", t.PF, false); err != nil {
		return Correction{}, nil, err
	}
	if err := wantDim("pfc", "V", t.V, calc.DimVoltage, "a voltage"); err != nil {
		return Correction{}, nil, err
	}
	if !(t.Freq > 0) || math.IsInf(t.Freq, 0) {
		return Correction{}, nil, fmt.Errorf("pfc: the supply frequency must be above 0 Hz, got %s Hz", strconv.FormatFloat(t.Freq, 'g', -1, 64))
	}
	if t.Phases != SinglePhase && t.Phases != ThreePhase {
		return Correction{}, nil, errors.New("pfc: the supply must be single- or three-phase")
	}
	vm := t.V.Mag()
	if vm == 0 {
		return Correction{}, nil, errors.New("pfc: the supply voltage is 0")
	}
	before, err := Of(t.Load.V)
	if err != nil {
		return Correction{}, nil, fmt.Errorf("pfc: %w", err)
	}
	p := real(t.Load.V)
	if !(p > 0) {
		return Correction{}, nil, errors.New("pfc: the load must absorb active power (P > 0) for its power factor to be corrected")
	}
	q1 := imag(t.Load.V)
	tan2 := sinFromCos(t.PF) / t.PF
	if t.Leading {
		tan2 = -tan2
	}
	q2 := p * tan2
	if math.IsInf(q2, 0) {
		return Correction{}, nil, errors.New("pfc: the target power factor is too small to represent its reactive power")
	}
	target := Factor{Value: t.PF, Sense: Lagging}
	switch {
	case t.PF == 1:
		target.Sense = Unity
	case t.Leading:
		target.Sense = Leading
	}

	c := Correction{Before: before, After: before, Qc: varQ(0), Reactor: varQ(0)}
	var verdict string
	switch {
	case before.PF.Value >= t.PF-pfTol:
		verdict = "no correction needed: the power factor " + before.PF.String() + " already meets the target " + target.String()
	case q1 < q2:
		c.Reactor = varQ(q2 - q1)
		verdict = "capacitors cannot reach the target: the load (" + before.PF.String() + ") is more leading than " + target.String() +
			"; adding capacitance would make it worse, and reaching the target needs inductive compensation (a reactor) instead"
	default:
		c.Needed = true
		c.Qc = varQ(q1 - q2)
		// Build the corrected power from the target, not q1 − Qc, so that
		// the result meets the target to rounding of P·tan φ₂ alone.
		after, err := Of(complex(p, q2))
		if err != nil {
			return Correction{}, nil, fmt.Errorf("pfc: %w", err)
		}
		c.After = after
		verdict = "capacitors supplying Q_c raise the power factor from " + before.PF.String() + " to " + after.PF.String()
	}
	if _, err := c.Qc.Check("pfc"); err != nil {
		return Correction{}, nil, fmt.Errorf("pfc: %w", err)
	}
	c.Notes, c.Cautions = []string{verdict}, cautions()

	tan1 := q1 / p
	if math.IsInf(tan1, 0) {
		return Correction{}, nil, errors.New("pfc: the load's reactive power is too large against its active power to represent tan φ₁")
	}
	st := calc.Step{
		Kind:    "pfc",
		Rule:    "reactive power for power-factor correction with capacitors (common practice)",
		Formula: "Q_c = P·(tan φ₁ − tan φ₂); tan φ = ±√(1 − PF²)/PF (+ lagging, − leading)",
		Inputs: []calc.Operand{
			{Name: "P", Value: before.P},
			{Name: "Q₁", Value: before.Q},
		},
		Results: []calc.Operand{
			{Name: "Q_c", Value: c.Qc},
			{Name: "tan φ₁", Value: number(tan1)},
			{Name: "tan φ₂", Value: number(tan2)},
			{Name: "Q₂", Value: c.After.Q},
		},
		Notes: c.Notes, Cautions: c.Cautions,
	}
	if before.PF.Defined() {
		st.Inputs = append(st.Inputs, calc.Operand{Name: "PF₁", Value: number(before.PF.Value)})
	}
	st.Inputs = append(st.Inputs, calc.Operand{Name: "PF₂", Value: number(t.PF)})
	if c.Reactor.V != 0 {
		st.Results = append(st.Results, calc.Operand{Name: "Q_reactor", Value: c.Reactor})
	}
	steps := []calc.Step{st}

	w := calc.Context{Freq: t.Freq}.Omega()
	omega := calc.Quantity{V: complex(w, 0), Dim: calc.DimAngularFrequency, Kind: calc.KindAngle}
	capQ := func(x float64) (calc.Quantity, error) {
		return calc.Real(x, calc.DimCapacitance).Check("pfc capacitance")
	}
	cs := calc.Step{
		Kind:     "pfc",
		Inputs:   []calc.Operand{{Name: "Q_c", Value: c.Qc}, {Name: "ω", Value: omega}},
		Cautions: cautions(),
	}
	if t.Phases == SinglePhase {
		if c.C, err = capQ(c.Qc.Mag() / (w * vm * vm)); err != nil {
			return Correction{}, nil, err
		}
		cs.Rule = "single-phase capacitance for the reactive power (common practice)"
		cs.Formula = "C = Q_c/(ω·V²); ω = 2π·f"
		cs.Inputs = append(cs.Inputs, calc.Operand{Name: "V", Value: calc.Real(vm, calc.DimVoltage)})
		cs.Results = []calc.Operand{{Name: "C", Value: c.C}}
	} else {
		if c.CY, err = capQ(c.Qc.Mag() / (w * vm * vm)); err != nil {
			return Correction{}, nil, err
		}
		if c.CDelta, err = capQ(c.Qc.Mag() / (3 * w * vm * vm)); err != nil {
			return Correction{}, nil, err
		}
		c.C = calc.Real(0, calc.DimCapacitance)
		cs.Rule = "three-phase bank capacitance per phase, Y (at V_L/√3) and Δ (at V_L) (common practice)"
		cs.Formula = "C_Y = Q_c/(ω·V_L²); C_Δ = Q_c/(3·ω·V_L²); C_Y = 3·C_Δ; ω = 2π·f"
		cs.Inputs = append(cs.Inputs, calc.Operand{Name: "V_L", Value: calc.Real(vm, calc.DimVoltage)})
		cs.Results = []calc.Operand{{Name: "C_Y", Value: c.CY}, {Name: "C_Δ", Value: c.CDelta}}
	}
	steps = append(steps, cs)

	var st1 []calc.Step
	if c.I1, st1, err = LineCurrent(c.Before.S, t.V, t.Phases); err != nil {
		return Correction{}, nil, fmt.Errorf("pfc: %w", err)
	}
	if c.I2, _, err = LineCurrent(c.After.S, t.V, t.Phases); err != nil {
		return Correction{}, nil, fmt.Errorf("pfc: %w", err)
	}
	cur := calc.Step{
		Kind:     "pfc",
		Rule:     "line current before and after correction (common practice)",
		Formula:  st1[0].Formula,
		Inputs:   []calc.Operand{{Name: "|S₁|", Value: c.Before.Apparent}, {Name: "|S₂|", Value: c.After.Apparent}, st1[0].Inputs[1]},
		Results:  []calc.Operand{{Name: "I₁", Value: c.I1}, {Name: "I₂", Value: c.I2}},
		Cautions: cautions(),
	}
	steps = append(steps, cur)
	return c, steps, nil
}

// Rerate returns the reactive power a capacitor rated qr at voltage vr
// delivers at voltage v: Q = Q_r·(V/V_r)² (common practice), since a
// capacitor's reactive power goes with the square of its voltage.
func Rerate(qr, v, vr calc.Quantity) (calc.Quantity, []calc.Step, error) {
	if err := wantDim("rerate", "Qr", qr, calc.DimPower, "a reactive power"); err != nil {
		return calc.Quantity{}, nil, err
	}
	if err := wantDim("rerate", "V", v, calc.DimVoltage, "a voltage"); err != nil {
		return calc.Quantity{}, nil, err
	}
	if err := wantDim("rerate", "Vr", vr, calc.DimVoltage, "a voltage"); err != nil {
		return calc.Quantity{}, nil, err
	}
	if vr.Mag() == 0 {
		return calc.Quantity{}, nil, errors.New("rerate: the rated voltage Vr must not be 0")
	}
	ratio := v.Mag() / vr.Mag()
	q, err := varQ(qr.Mag() * ratio * ratio).Check("rerate")
	if err != nil {
		return calc.Quantity{}, nil, fmt.Errorf("rerate: %w", err)
	}
	var notes []string
	if ratio > 1 {
		notes = []string{"the capacitor runs above its rated voltage: check its voltage rating and overvoltage limits before using it here"}
	}
	st := calc.Step{
		Kind:    "rerate",
		Rule:    "reactive power of a capacitor at a voltage other than its rating (common practice)",
		Formula: "Q = Q_r·(V/V_r)²",
		Inputs: []calc.Operand{
			{Name: "Q_r", Value: varQ(qr.Mag())},
			{Name: "V", Value: calc.Magnitude(v.Mag(), calc.DimVoltage)},
			{Name: "V_r", Value: calc.Magnitude(vr.Mag(), calc.DimVoltage)},
		},
		Results: []calc.Operand{{Name: "Q", Value: q}},
		Notes:   notes, Cautions: cautions(),
	}
	return q, []calc.Step{st}, nil
}

// Resonance is the harmonic order at which a capacitor bank resonates with
// the supply's inductance.
type Resonance struct {
	Order float64 // h ≈ √(S_sc/Q_c)
	Near  int     // a characteristic harmonic (5, 7, 11 or 13) within ±0.5 of Order, else 0
}

// warnOrders are the characteristic harmonics of six-pulse converters,
// which a bank should not resonate near (common practice).
var warnOrders = [...]int{5, 7, 11, 13}

// ResonanceOrder returns the harmonic order of parallel resonance between a
// capacitor bank of reactive power qc and a supply of short-circuit power
// ssc: h ≈ √(S_sc/Q_c) (common practice).
func ResonanceOrder(ssc, qc calc.Quantity) (Resonance, []calc.Step, error) {
	if err := wantDim("harmonic", "Ssc", ssc, calc.DimPower, "a power (the supply's short-circuit power)"); err != nil {
		return Resonance{}, nil, err
	}
	if err := wantDim("harmonic", "Qc", qc, calc.DimPower, "a reactive power"); err != nil {
		return Resonance{}, nil, err
	}
	if qc.Mag() == 0 {
		return Resonance{}, nil, errors.New("harmonic: Qc is 0: with no capacitance there is no resonance")
	}
	h := math.Sqrt(ssc.Mag() / qc.Mag())
	if _, err := calc.Number(complex(h, 0)).Check("harmonic"); err != nil {
		return Resonance{}, nil, fmt.Errorf("harmonic: %w", err)
	}
	r := Resonance{Order: h}
	for _, n := range warnOrders {
		if math.Abs(h-float64(n)) <= 0.5 {
			r.Near = n
		}
	}
	notes := []string{"harmonic orders near 5, 7, 11 and 13 (the usual converter harmonics) are a warning sign: a bank resonating there can amplify harmonic voltage and currents; detuning reactors are the usual remedy"}
	if r.Near != 0 {
		notes = append([]string{"warning: the resonance order lies within ±0.5 of harmonic " + strconv.Itoa(r.Near)}, notes...)
	}
	st := calc.Step{
		Kind:    "harmonic",
		Rule:    "harmonic order of resonance between a capacitor bank and the supply (common practice)",
		Formula: "h ≈ √(S_sc/Q_c)",
		Inputs: []calc.Operand{
			{Name: "S_sc", Value: calc.Quantity{V: complex(ssc.Mag(), 0), Dim: calc.DimPower, Kind: calc.KindMagnitude}},
			{Name: "Q_c", Value: varQ(qc.Mag())},
		},
		Results: []calc.Operand{{Name: "h", Value: number(h)}},
		Notes:   notes, Cautions: cautions(),
	}
	return r, []calc.Step{st}, nil
}

// dischargeArgs checks C, V0 and Vsafe and returns ln(V0/Vsafe).
func dischargeArgs(fn string, c, v0, vs calc.Quantity) (float64, error) {
	if err := wantReal(fn, "C", c, calc.DimCapacitance, "a capacitance"); err != nil {
		return 0, err
	}
	if err := wantDim(fn, "V0", v0, calc.DimVoltage, "a voltage"); err != nil {
		return 0, err
	}
	if err := wantDim(fn, "Vsafe", vs, calc.DimVoltage, "a voltage"); err != nil {
		return 0, err
	}
	if !(real(c.V) > 0) {
		return 0, fmt.Errorf("%s: C must be above 0 F", fn)
	}
	a, b := v0.Mag(), vs.Mag()
	if b == 0 {
		return 0, fmt.Errorf("%s: Vsafe is 0 V, which an RC discharge never reaches; give a safe voltage above 0", fn)
	}
	if b >= a {
		return 0, fmt.Errorf("%s: Vsafe (%s V) must be below the starting voltage V0 (%s V)", fn,
			strconv.FormatFloat(b, 'g', 6, 64), strconv.FormatFloat(a, 'g', 6, 64))
	}
	// log(a) − log(b) rather than log(a/b): the quotient can overflow
	return math.Log(a) - math.Log(b), nil
}

func dischargeNotes() []string {
	return []string{
		"a capacitor disconnected from an AC supply can hold up to the peak voltage √2·V_rms: use that as V0",
		"the resistor discharges exponentially; verify the voltage with a meter before touching",
	}
}

// DischargeResistance returns the resistor that discharges capacitance c
// from v0 to vsafe in time t: from t = R·C·ln(V0/V_safe), R = t/(C·ln(V0/V_safe))
// (common practice).
func DischargeResistance(c, v0, vsafe, t calc.Quantity) (calc.Quantity, []calc.Step, error) {
	ln, err := dischargeArgs("discharge", c, v0, vsafe)
	if err != nil {
		return calc.Quantity{}, nil, err
	}
	if err := wantReal("discharge", "t", t, calc.DimTime, "a time"); err != nil {
		return calc.Quantity{}, nil, err
	}
	if !(real(t.V) > 0) {
		return calc.Quantity{}, nil, errors.New("discharge: t must be above 0 s")
	}
	r, err := calc.Quantity{V: complex(real(t.V)/(real(c.V)*ln), 0), Dim: calc.DimImpedance, Kind: calc.KindResistive}.Check("discharge")
	if err != nil {
		return calc.Quantity{}, nil, fmt.Errorf("discharge: %w", err)
	}
	st := calc.Step{
		Kind:    "discharge",
		Rule:    "discharge resistor for a capacitor to reach a safe voltage in a given time (common practice)",
		Formula: "R = t/(C·ln(V0/V_safe)), from t = R·C·ln(V0/V_safe)",
		Inputs: []calc.Operand{
			{Name: "C", Value: c}, {Name: "V0", Value: calc.Magnitude(v0.Mag(), calc.DimVoltage)},
			{Name: "V_safe", Value: calc.Magnitude(vsafe.Mag(), calc.DimVoltage)}, {Name: "t", Value: t},
		},
		Results: []calc.Operand{{Name: "R", Value: r}},
		Notes:   append([]string{"the largest resistance that meets the time: a smaller resistor discharges faster"}, dischargeNotes()...), Cautions: cautions(),
	}
	return r, []calc.Step{st}, nil
}

// DischargeTime returns the time resistance r takes to discharge
// capacitance c from v0 to vsafe: t = R·C·ln(V0/V_safe) (common practice).
func DischargeTime(r, c, v0, vsafe calc.Quantity) (calc.Quantity, []calc.Step, error) {
	ln, err := dischargeArgs("dischargetime", c, v0, vsafe)
	if err != nil {
		return calc.Quantity{}, nil, err
	}
	if err := wantReal("dischargetime", "R", r, calc.DimImpedance, "a resistance"); err != nil {
		return calc.Quantity{}, nil, err
	}
	if !(real(r.V) > 0) {
		return calc.Quantity{}, nil, errors.New("dischargetime: R must be above 0 Ω")
	}
	t, err := calc.Real(real(r.V)*real(c.V)*ln, calc.DimTime).Check("dischargetime")
	if err != nil {
		return calc.Quantity{}, nil, fmt.Errorf("dischargetime: %w", err)
	}
	st := calc.Step{
		Kind:    "discharge",
		Rule:    "time for a resistor to discharge a capacitor to a safe voltage (common practice)",
		Formula: "t = R·C·ln(V0/V_safe)",
		Inputs: []calc.Operand{
			{Name: "R", Value: r}, {Name: "C", Value: c}, {Name: "V0", Value: calc.Magnitude(v0.Mag(), calc.DimVoltage)},
			{Name: "V_safe", Value: calc.Magnitude(vsafe.Mag(), calc.DimVoltage)},
		},
		Results: []calc.Operand{{Name: "t", Value: t}},
		Notes:   dischargeNotes(), Cautions: cautions(),
	}
	return t, []calc.Step{st}, nil
}
