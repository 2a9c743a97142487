// Package power computes complex power, power factor, sums of loads,
// the peak, RMS and rectified average of a sinusoid, and power-factor
// correction with capacitors.
//
// Conventions follow shared DESIGN.md: complex power S = V·I* for RMS
// phasors (S = ½·V·I* for peak phasors), P = Re S, Q = Im S, power factor
// PF = P/|S| (IEEE Std 1459-2010, sinusoidal case); under the passive sign
// convention Q > 0 is inductive (lagging) and P < 0 means the element
// delivers active power. Every function returns its result together with
// the steps that show the work.
package power

import (
	"errors"
	"fmt"
	"math"
	"math/cmplx"
	"strconv"
	"strings"

	"argand/calc"
)

// cautions returns the cautions of capacitor work: stored charge,
// harmonic resonance and qualified installation, and the safety text.
func cautions() []calc.StepCaution {
	return calc.CautionsOf(calc.CautionCapacitor, calc.CautionMains)
}

// MaxLoads bounds the number of loads Sum accepts.
const MaxLoads = 10000

// unityTol is the relative size of Q below which a power factor is read as
// unity: rounding in V·I* must not turn a resistive load into "lagging".
const unityTol = 1e-12

// Sense says whether the current lags or leads the voltage.
type Sense uint8

const (
	Unity     Sense = iota // Q = 0
	Lagging                // Q > 0: inductive, current lags voltage
	Leading                // Q < 0: capacitive, current leads voltage
	Undefined              // S = 0: no power factor
)

func (s Sense) String() string {
	switch s {
	case Lagging:
		return "lagging"
	case Leading:
		return "leading"
	case Undefined:
		return "undefined"
	}
	return "unity"
}

// Phases says whether a supply is single- or three-phase.
type Phases uint8

const (
	SinglePhase Phases = 1
	ThreePhase  Phases = 3
)

func (p Phases) String() string {
	if p == ThreePhase {
		return "three-phase"
	}
	return "single-phase"
}

// Factor is a power factor with its sense. Value is P/|S| as IEEE Std
// 1459-2010 defines it, so it is negative for an element that delivers
// active power; it is 0 when Sense is Undefined.
type Factor struct {
	Value float64
	Sense Sense
}

// Defined reports whether the power factor exists (S ≠ 0).
func (f Factor) Defined() bool { return f.Sense != Undefined }

// String writes the power factor to four significant figures with its
// sense, such as "0.8 lagging", "1 (unity)" or "undefined (S = 0)".
func (f Factor) String() string {
	switch f.Sense {
	case Undefined:
		return "undefined (S = 0)"
	case Unity:
		return strconv.FormatFloat(f.Value, 'g', 4, 64) + " (unity)"
	}
	return strconv.FormatFloat(f.Value, 'g', 4, 64) + " " + f.Sense.String()
}

// FactorOf returns the power factor of complex power s: P/|S| with the
// sense read from the sign of Q (IEEE Std 1459-2010).
func FactorOf(s complex128) Factor {
	m := cmplx.Abs(s)
	if m == 0 {
		return Factor{Sense: Undefined}
	}
	p, q := real(s), imag(s)
	if math.Abs(q) <= unityTol*m {
		if p < 0 {
			return Factor{Value: -1, Sense: Unity}
		}
		return Factor{Value: 1, Sense: Unity}
	}
	v := p / m
	v = math.Max(-1, math.Min(1, v)) // rounding can overshoot by an ulp
	if q > 0 {
		return Factor{Value: v, Sense: Lagging}
	}
	return Factor{Value: v, Sense: Leading}
}

// Power is a complex power and the values read from it.
type Power struct {
	S        calc.Quantity // complex power P + jQ, VA
	P        calc.Quantity // active power, W
	Q        calc.Quantity // reactive power, var
	Apparent calc.Quantity // |S|, VA
	PF       Factor
}

// Delivering reports whether the element delivers active power (P < 0
// under the passive sign convention).
func (p Power) Delivering() bool { return real(p.S.V) < 0 }

// Phi returns the power-factor angle φ = arg S in radians, in (−π, π],
// 0 when S = 0.
func (p Power) Phi() float64 {
	if p.S.V == 0 {
		return 0
	}
	a := cmplx.Phase(p.S.V)
	if a == -math.Pi { // a negative zero imaginary part
		return math.Pi
	}
	return a
}

// Of returns the Power for complex power s (VA), or an error when s is not
// finite.
func Of(s complex128) (Power, error) {
	s = calc.Leftover(s, s) // a part below 1e-12 of the other is 0, in P and Q as on screen
	q, err := calc.Quantity{V: s, Dim: calc.DimPower, Kind: calc.KindApparent}.Check("complex power")
	if err != nil {
		return Power{}, err
	}
	// |S| can overflow where both parts are finite
	if _, err := calc.Real(cmplx.Abs(s), calc.DimPower).Check("apparent power"); err != nil {
		return Power{}, err
	}
	return Power{
		S:        q,
		P:        calc.Quantity{V: complex(real(s), 0), Dim: calc.DimPower, Kind: calc.KindActive},
		Q:        calc.Quantity{V: complex(imag(s), 0), Dim: calc.DimPower, Kind: calc.KindReactive},
		Apparent: calc.Quantity{V: complex(cmplx.Abs(s), 0), Dim: calc.DimPower, Kind: calc.KindMagnitude},
		PF:       FactorOf(s),
	}, nil
}

// operands lists S, P, Q, |S| and, when defined, the power factor.
func (p Power) operands() []calc.Operand {
	ops := []calc.Operand{
		{Name: "S", Value: p.S},
		{Name: "P", Value: p.P},
		{Name: "Q", Value: p.Q},
		{Name: "|S|", Value: p.Apparent},
	}
	if p.PF.Defined() {
		ops = append(ops, calc.Operand{Name: "PF", Value: calc.Number(complex(p.PF.Value, 0))})
	}
	return ops
}

// notes says in words what the power factor and sign of P mean.
func (p Power) notes() []string {
	var n []string
	switch p.PF.Sense {
	case Undefined:
		n = append(n, "S = 0: the power factor is undefined (no power flows)")
	case Lagging:
		n = append(n, "power factor "+p.PF.String()+": Q > 0, inductive, the current lags the voltage")
	case Leading:
		n = append(n, "power factor "+p.PF.String()+": Q < 0, capacitive, the current leads the voltage")
	case Unity:
		n = append(n, "power factor "+p.PF.String()+": Q = 0, resistive")
	}
	if p.Delivering() {
		n = append(n, "delivering: P < 0 under the passive sign convention, so the element delivers active power; PF = P/|S| is negative")
	}
	return n
}

// ieee is the rule text for the power definitions.
const ieee = "IEEE Std 1459-2010, sinusoidal case"

// FromPhasors returns the complex power of an element from its voltage and
// current phasors, taken with the passive sign convention: S = V·I* for
// RMS phasors and S = ½·V·I* for peak phasors.
func FromPhasors(v, i calc.Quantity, basis calc.Basis) (Power, []calc.Step, error) {
	if err := wantDim("power", "V", v, calc.DimVoltage, "a voltage"); err != nil {
		return Power{}, nil, err
	}
	if err := wantDim("power", "I", i, calc.DimCurrent, "a current"); err != nil {
		return Power{}, nil, err
	}
	s := v.V * cmplx.Conj(i.V)
	formula := "S = V·I*"
	if basis == calc.Peak {
		s /= 2
		formula = "S = ½·V·I* (peak phasors)"
	} else {
		formula += " (RMS phasors)"
	}
	p, err := Of(s)
	if err != nil {
		return Power{}, nil, fmt.Errorf("power: %w", err)
	}
	st := calc.Step{
		Kind:    "power",
		Rule:    "complex power from voltage and current phasors (" + ieee + ")",
		Formula: formula + "; P = Re S; Q = Im S; PF = P/|S|",
		Inputs:  []calc.Operand{{Name: "V", Value: v}, {Name: "I", Value: i}},
		Results: p.operands(),
		Basis:   basis,
		Notes:   p.notes(),
	}
	return p, []calc.Step{st}, nil
}

// FromVIAngle returns the complex power of a load from the magnitudes of
// its voltage and current and the angle phi (radians) by which the current
// lags the voltage: S = |V|·|I|∠φ, halved for peak values.
func FromVIAngle(v, i calc.Quantity, phi float64, basis calc.Basis) (Power, []calc.Step, error) {
	if err := wantDim("load", "V", v, calc.DimVoltage, "a voltage"); err != nil {
		return Power{}, nil, err
	}
	if err := wantDim("load", "I", i, calc.DimCurrent, "a current"); err != nil {
		return Power{}, nil, err
	}
	if math.IsNaN(phi) || math.IsInf(phi, 0) {
		return Power{}, nil, errors.New("load: the angle must be a finite number")
	}
	m := v.Mag() * i.Mag()
	formula := "S = |V|·|I|∠φ"
	if basis == calc.Peak {
		m /= 2
		formula = "S = ½·|V|·|I|∠φ (peak values)"
	}
	p, err := Of(cmplx.Rect(m, phi))
	if err != nil {
		return Power{}, nil, fmt.Errorf("load: %w", err)
	}
	st := calc.Step{
		Kind:    "load",
		Rule:    "load power from voltage, current and the angle by which the current lags (" + ieee + ")",
		Formula: formula + "; φ = θ_V − θ_I",
		Inputs:  []calc.Operand{{Name: "|V|", Value: calc.Magnitude(v.Mag(), calc.DimVoltage)}, {Name: "|I|", Value: calc.Magnitude(i.Mag(), calc.DimCurrent)}, {Name: "φ", Value: calc.Angle(phi)}},
		Results: p.operands(),
		Basis:   basis,
		Notes:   p.notes(),
	}
	return p, []calc.Step{st}, nil
}

// sinFromCos returns √(1 − pf²) computed as √((1 − pf)(1 + pf)), which
// keeps its digits when pf is near 1.
func sinFromCos(pf float64) float64 { return math.Sqrt((1 - pf) * (1 + pf)) }

// checkPF reports an error unless 0 < pf ≤ 1 (0 ≤ pf ≤ 1 with zeroOK).
func checkPF(fn, name string, pf float64, zeroOK bool) error {
	if math.IsNaN(pf) || pf > 1 || pf < 0 || (pf == 0 && !zeroOK) {
		lo := "above 0"
		if zeroOK {
			lo = "from 0"
		}
		return fmt.Errorf("%s: %s must be a power factor %s up to 1, got %s", fn, name, lo, strconv.FormatFloat(pf, 'g', -1, 64))
	}
	return nil
}

// signOf turns a sense into the sign of Q; unity counts as lagging since
// with pf = 1 the sign multiplies zero.
func signOf(fn string, s Sense) (float64, error) {
	switch s {
	case Lagging, Unity:
		return 1, nil
	case Leading:
		return -1, nil
	}
	return 0, fmt.Errorf("%s: the sense must be lagging or leading", fn)
}

// FromPF returns the complex power of a load from its active power p
// (W, not negative) and power factor pf (0 < pf ≤ 1) with its sense:
// Q = ±P·tan φ with tan φ = √(1 − pf²)/pf.
func FromPF(p calc.Quantity, pf float64, sense Sense) (Power, []calc.Step, error) {
	if err := wantReal("load", "P", p, calc.DimPower, "an active power"); err != nil {
		return Power{}, nil, err
	}
	if real(p.V) < 0 {
		return Power{}, nil, errors.New("load: P must not be negative (a load absorbs active power; use power(V, I) for an element that delivers)")
	}
	if err := checkPF("load", "PF", pf, false); err != nil {
		return Power{}, nil, err
	}
	sg, err := signOf("load", sense)
	if err != nil {
		return Power{}, nil, err
	}
	pw := real(p.V)
	q := sg * pw * sinFromCos(pf) / pf
	pp, err := Of(complex(pw, q))
	if err != nil {
		return Power{}, nil, fmt.Errorf("load: %w", err)
	}
	st := calc.Step{
		Kind:    "load",
		Rule:    "load power from active power and power factor (" + ieee + ")",
		Formula: "Q = ±P·tan φ, tan φ = √(1 − PF²)/PF (+ lagging, − leading); S = P + jQ",
		Inputs:  []calc.Operand{{Name: "P", Value: pp.P}, {Name: "PF", Value: calc.Number(complex(pf, 0))}},
		Results: pp.operands(),
		Notes:   pp.notes(),
	}
	return pp, []calc.Step{st}, nil
}

// FromApparent returns the complex power of a load from its apparent power
// s (VA, its magnitude is used) and power factor pf (0 ≤ pf ≤ 1) with its
// sense: P = |S|·PF, Q = ±|S|·√(1 − PF²).
func FromApparent(s calc.Quantity, pf float64, sense Sense) (Power, []calc.Step, error) {
	if err := wantDim("loadva", "S", s, calc.DimPower, "an apparent power"); err != nil {
		return Power{}, nil, err
	}
	if err := checkPF("loadva", "PF", pf, true); err != nil {
		return Power{}, nil, err
	}
	sg, err := signOf("loadva", sense)
	if err != nil {
		return Power{}, nil, err
	}
	m := s.Mag()
	pp, err := Of(complex(m*pf, sg*m*sinFromCos(pf)))
	if err != nil {
		return Power{}, nil, fmt.Errorf("loadva: %w", err)
	}
	st := calc.Step{
		Kind:    "load",
		Rule:    "load power from apparent power and power factor (" + ieee + ")",
		Formula: "P = |S|·PF; Q = ±|S|·√(1 − PF²) (+ lagging, − leading)",
		Inputs:  []calc.Operand{{Name: "|S|", Value: calc.Quantity{V: complex(m, 0), Dim: calc.DimPower, Kind: calc.KindMagnitude}}, {Name: "PF", Value: calc.Number(complex(pf, 0))}},
		Results: pp.operands(),
		Notes:   pp.notes(),
	}
	return pp, []calc.Step{st}, nil
}

// Nameplate is the rating of a motor or other machine as printed on it.
type Nameplate struct {
	Output     calc.Quantity // rated shaft output, W (a value in hp is converted on input)
	Efficiency float64       // 0 < η ≤ 1
	PF         float64       // 0 < PF ≤ 1
	Leading    bool          // false for the usual lagging power factor of an induction motor
	Phases     Phases
	VLine      calc.Quantity // line voltage; for single-phase, the supply voltage
}

// Machine is the power a machine draws from its supply.
type Machine struct {
	Power
	Input   calc.Quantity // active power drawn, P_out/η, W
	Current calc.Quantity // line current magnitude, A
}

// Motor returns the power and line current a machine draws at its rating:
// P_in = P_out/η, |S| = P_in/PF, and I = |S|/V (single-phase) or
// |S|/(√3·V_L) (three-phase).
func Motor(n Nameplate) (Machine, []calc.Step, error) {
	if err := wantReal("motor", "Pout", n.Output, calc.DimPower, "a power (W or hp)"); err != nil {
		return Machine{}, nil, err
	}
	if real(n.Output.V) < 0 {
		return Machine{}, nil, errors.New("motor: the rated output must not be negative")
	}
	if math.IsNaN(n.Efficiency) || n.Efficiency <= 0 || n.Efficiency > 1 {
		return Machine{}, nil, fmt.Errorf("motor: the efficiency must be above 0 up to 1 (100 %%), got %s", strconv.FormatFloat(n.Efficiency, 'g', -1, 64))
	}
	sense := Lagging
	if n.Leading {
		sense = Leading
	}
	pin := calc.Quantity{V: complex(real(n.Output.V)/n.Efficiency, 0), Dim: calc.DimPower, Kind: calc.KindActive}
	if _, err := pin.Check("motor input power"); err != nil {
		return Machine{}, nil, fmt.Errorf("motor: %w", err)
	}
	pp, st1, err := FromPF(pin, n.PF, sense)
	if err != nil {
		return Machine{}, nil, err
	}
	i, st2, err := LineCurrent(pp.S, n.VLine, n.Phases)
	if err != nil {
		return Machine{}, nil, fmt.Errorf("motor: %w", err)
	}
	st0 := calc.Step{
		Kind:    "motor",
		Rule:    "input power from rated output and efficiency (common practice)",
		Formula: "P_in = P_out/η",
		Inputs:  []calc.Operand{{Name: "P_out", Value: n.Output}, {Name: "η", Value: calc.Number(complex(n.Efficiency, 0))}},
		Results: []calc.Operand{{Name: "P_in", Value: pin}},
	}
	steps := append([]calc.Step{st0}, st1...)
	steps = append(steps, st2...)
	return Machine{Power: pp, Input: pin, Current: i}, steps, nil
}

// Sum returns the total complex power of several loads, the complex sum of
// their powers (each a power quantity; real values count as active power).
func Sum(loads []calc.Quantity) (Power, []calc.Step, error) {
	if len(loads) == 0 {
		return Power{}, nil, errors.New("loads: give at least one load")
	}
	if len(loads) > MaxLoads {
		return Power{}, nil, fmt.Errorf("loads: at most %d loads, got %d", MaxLoads, len(loads))
	}
	var total complex128
	rows := make([]calc.Row, 0, len(loads))
	for k, l := range loads {
		if err := wantDim("loads", "S"+strconv.Itoa(k+1), l, calc.DimPower, "a power"); err != nil {
			return Power{}, nil, err
		}
		total += l.V
		lp, err := Of(l.V)
		if err != nil {
			return Power{}, nil, err
		}
		rows = append(rows, calc.Row{Name: "load " + strconv.Itoa(k+1), Values: []calc.Operand{
			{Name: "s", Value: lp.S}, {Name: "p", Value: lp.P}, {Name: "q", Value: lp.Q},
		}})
	}
	p, err := Of(total)
	if err != nil {
		return Power{}, nil, fmt.Errorf("loads: %w", err)
	}
	st := calc.Step{
		Kind:    "sum",
		Rule:    "total power of loads on one supply: the complex sum (" + ieee + ")",
		Formula: "S = Σ S_k; P = Σ P_k; Q = Σ Q_k; PF = P/|S|",
		Rows:    rows,
		Results: p.operands(),
		Notes:   append(p.notes(), "apparent powers |S_k| do not add unless the loads share one power factor"),
	}
	return p, []calc.Step{st}, nil
}

// LineCurrent returns the line current magnitude drawn by power s from a
// supply of voltage v (its magnitude is used): I = |S|/V for single-phase
// and I = |S|/(√3·V_L) for three-phase with v the line voltage.
func LineCurrent(s, v calc.Quantity, ph Phases) (calc.Quantity, []calc.Step, error) {
	if err := wantDim("current", "S", s, calc.DimPower, "a power"); err != nil {
		return calc.Quantity{}, nil, err
	}
	if err := wantDim("current", "V", v, calc.DimVoltage, "a voltage"); err != nil {
		return calc.Quantity{}, nil, err
	}
	vm := v.Mag()
	if vm == 0 {
		return calc.Quantity{}, nil, errors.New("current: the supply voltage is 0, so no current follows from the power")
	}
	var i float64
	formula := "I = |S|/V"
	switch ph {
	case SinglePhase:
		i = s.Mag() / vm
	case ThreePhase:
		i = s.Mag() / (math.Sqrt(3) * vm)
		formula = "I = |S|/(√3·V_L)"
	default:
		return calc.Quantity{}, nil, errors.New("current: the supply must be single- or three-phase")
	}
	q, err := calc.Quantity{V: complex(i, 0), Dim: calc.DimCurrent, Kind: calc.KindMagnitude}.Check("line current")
	if err != nil {
		return calc.Quantity{}, nil, fmt.Errorf("current: %w", err)
	}
	vname := "V"
	if ph == ThreePhase {
		vname = "V_L"
	}
	st := calc.Step{
		Kind:    "current",
		Rule:    ph.String() + " line current from apparent power (common practice)",
		Formula: formula,
		Inputs: []calc.Operand{
			{Name: "|S|", Value: calc.Quantity{V: complex(s.Mag(), 0), Dim: calc.DimPower, Kind: calc.KindMagnitude}},
			{Name: vname, Value: calc.Quantity{V: complex(vm, 0), Dim: calc.DimVoltage, Kind: calc.KindMagnitude}},
		},
		Results: []calc.Operand{{Name: "|I|", Value: q}},
	}
	if ph == ThreePhase {
		st.Cautions = calc.CautionsOf(calc.CautionMains)
	}
	return q, []calc.Step{st}, nil
}

// Current returns the line current drawn by power s from a supply of
// voltage v on the given phasor basis. Where both are known with their
// angles (a complex power and a voltage phasor) the current is a phasor:
// I = (S/V)* for RMS phasors and I = 2·(S/V)* for peak ones, from
// S = V·I* and S = ½·V·I* (IEEE Std 1459-2010); three-phase uses the phase
// voltage V_an = V_L/(√3∠±30°) and a third of S. Otherwise only |I| is
// known, and the result is that magnitude.
func Current(s, v calc.Quantity, ph Phases, basis calc.Basis, seq int) (calc.Quantity, []calc.Step, error) {
	if s.Kind != calc.KindApparent || v.Kind == calc.KindMagnitude {
		q, st, err := LineCurrent(s, v, ph)
		if err != nil || basis == calc.RMS {
			return q, st, err
		}
		// peak phasors: |S| = ½·V·I, so I = 2·|S|/V
		q.V *= 2
		if _, err := q.Check("current"); err != nil {
			return calc.Quantity{}, nil, err
		}
		st[0].Formula = strings.Replace(st[0].Formula, "I = |S|/", "I = 2·|S|/", 1) + " (peak basis: |S| = ½·V·I)"
		st[0].Results[0].Value = q
		return q, st, nil
	}
	if err := wantDim("current", "V", v, calc.DimVoltage, "a voltage"); err != nil {
		return calc.Quantity{}, nil, err
	}
	if v.V == 0 {
		return calc.Quantity{}, nil, errors.New("current: the supply voltage is 0, so no current follows from the power")
	}
	k := complex(1, 0)
	if basis == calc.Peak {
		k = 2
	}
	var i complex128
	formula := "I = (S/V)*"
	vname := "V"
	switch ph {
	case SinglePhase:
		i = k * cmplx.Conj(s.V/v.V)
	case ThreePhase:
		sg := 1.0
		if seq < 0 {
			sg = -1
		}
		van := v.V / cmplx.Rect(math.Sqrt(3), sg*math.Pi/6)
		i = k * cmplx.Conj(s.V/(3*van))
		formula = "I_a = (S/(3·V_an))*, V_an = V_L/(√3∠30°)"
		if sg < 0 {
			formula = "I_a = (S/(3·V_an))*, V_an = V_L/(√3∠−30°) (ACB)"
		}
		vname = "V_L"
	default:
		return calc.Quantity{}, nil, errors.New("current: the supply must be single- or three-phase")
	}
	if basis == calc.Peak {
		formula = strings.Replace(formula, "= (", "= 2·(", 1) + " (peak basis: S = ½·V·I*)"
	}
	q, err := calc.Q(i, calc.DimCurrent).Check("line current")
	if err != nil {
		return calc.Quantity{}, nil, fmt.Errorf("current: %w", err)
	}
	st := calc.Step{
		Kind:    "current",
		Rule:    ph.String() + " line current phasor from the complex power and the voltage phasor (" + ieee + ")",
		Formula: formula,
		Inputs:  []calc.Operand{{Name: "S", Value: s}, {Name: vname, Value: v}},
		Results: []calc.Operand{{Name: "I", Value: q}},
		Basis:   basis,
	}
	if ph == ThreePhase {
		st.Cautions = calc.CautionsOf(calc.CautionMains)
	}
	return q, []calc.Step{st}, nil
}

// wantDim reports an error unless q has dimension d and finite parts.
func wantDim(fn, name string, q calc.Quantity, d calc.Dim, what string) error {
	if q.Dim != d {
		return fmt.Errorf("%s: %s must be %s, got a quantity in %s", fn, name, what, calc.DimName(q.Dim, false))
	}
	if _, err := q.Check(fn); err != nil {
		return fmt.Errorf("%s: %s: %w", fn, name, err)
	}
	if math.IsInf(q.Mag(), 0) {
		return fmt.Errorf("%s: %s is too large: its magnitude overflows", fn, name)
	}
	return nil
}

// wantReal is wantDim for a quantity that must also be real.
func wantReal(fn, name string, q calc.Quantity, d calc.Dim, what string) error {
	if err := wantDim(fn, name, q, d, what); err != nil {
		return err
	}
	if imag(q.V) != 0 {
		return fmt.Errorf("%s: %s must be a real number (%s), not complex", fn, name, what)
	}
	return nil
}
