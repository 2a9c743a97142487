package threephase

import (
	"fmt"
	"math"

	"argand/calc"
)

// Wattmeters are the readings of the two-wattmeter method on a three-wire
// supply. The wiring assumed throughout: wattmeter 1 has its current coil
// in line a and its voltage coil from line a to line c; wattmeter 2 has its
// current coil in line b and its voltage coil from line b to line c. So
//
//	W1 = Re(V_ac·I_a*),  W2 = Re(V_bc·I_b*)
//
// (times ½ for peak phasors). For a balanced load of phase angle φ
// (φ > 0 lagging) on an ABC supply, V_ac = √3·V_an∠−30° and V_bc lies 30°
// ahead of V_bn, so W1 = V_L·I_L·cos(φ − 30°) and W2 = V_L·I_L·cos(φ + 30°);
// for ACB the ±30° swap. Hence P = W1 + W2 for any load on three wires
// (Blondel's theorem), and for a balanced load Q = √3·(W1 − W2) on ABC,
// Q = √3·(W2 − W1) on ACB. With the common alternative wiring (current
// coils in lines a and c, voltage coils to line b) the meter in line c
// reads what W1 reads here.
type Wattmeters struct {
	W1, W2 calc.Quantity // W
}

// TwoWattmeterReadings returns the two readings for a balanced load given
// the line voltage and line current (magnitudes are used), the power
// factor pf in [0, 1] and whether it lags:
// W1 = V_L·I_L·cos(φ − s·30°), W2 = V_L·I_L·cos(φ + s·30°), with
// s = +1 for ABC and −1 for ACB, and the factor ½ for peak values.
func TwoWattmeterReadings(vLine, iLine calc.Quantity, pf float64, lagging bool, seq Sequence, basis calc.Basis) (Wattmeters, []calc.Step, error) {
	var w Wattmeters
	if err := seq.check(); err != nil {
		return w, nil, err
	}
	if err := needDim(vLine, calc.DimVoltage, "the line voltage"); err != nil {
		return w, nil, err
	}
	if err := needDim(iLine, calc.DimCurrent, "the line current"); err != nil {
		return w, nil, err
	}
	if math.IsNaN(pf) || pf < 0 || pf > 1 {
		return w, nil, fmt.Errorf("the power factor must lie between 0 and 1, not %g", pf)
	}
	phi := math.Acos(pf)
	if !lagging {
		phi = -phi
	}
	g := seq.sign()
	vi := vLine.Mag() * iLine.Mag() * basisFactor(basis)
	d30 := math.Pi / 6
	// cos(φ ± 30°) = cos φ·cos 30° ∓ sin φ·sin 30°: terms no larger than
	// V_L·I_L, so a reading below 1e-12 of that is a leftover (calc.Leftover)
	w.W1 = calc.Quantity{V: complex(calc.LeftoverReal(vi*math.Cos(phi-g*d30), vi), 0), Dim: calc.DimPower, Kind: calc.KindActive}
	w.W2 = calc.Quantity{V: complex(calc.LeftoverReal(vi*math.Cos(phi+g*d30), vi), 0), Dim: calc.DimPower, Kind: calc.KindActive}
	if err := checkAll("two-wattmeter readings", w.W1, w.W2); err != nil {
		return Wattmeters{}, nil, err
	}
	k := ""
	if basis == calc.Peak {
		k = "½·"
	}
	st := calc.Step{
		Kind: "wattmeters",
		Rule: "two-wattmeter readings of a balanced load; meter 1: current coil in line a, voltage coil a to c; meter 2: current coil in line b, voltage coil b to c (" + seq.String() + ")",
		Formula: fmt.Sprintf("W1 = %sV_L·I_L·cos(φ %s 30°);  W2 = %sV_L·I_L·cos(φ %s 30°)",
			k, signWord(-g), k, signWord(g)),
		Inputs: []calc.Operand{op("V_L", calc.Quantity{V: complex(vLine.Mag(), 0), Dim: calc.DimVoltage, Kind: calc.KindMagnitude}), op("I_L", calc.Quantity{V: complex(iLine.Mag(), 0), Dim: calc.DimCurrent, Kind: calc.KindMagnitude}),
			op("φ", calc.Angle(phi))},
		Results:  []calc.Operand{op("W1", w.W1), op("W2", w.W2)},
		Basis:    basis,
		Cautions: calc.CautionsOf(calc.CautionMains),
	}
	if w.W1.V != 0 && w.W2.V != 0 && (real(w.W1.V) < 0) != (real(w.W2.V) < 0) {
		st.Notes = append([]string{"one meter reads negative (power factor below 0.5): reverse its voltage coil to read it, and count the reading as negative"}, st.Notes...)
	}
	return w, []calc.Step{st}, nil
}

func signWord(g float64) string {
	if g < 0 {
		return "−"
	}
	return "+"
}

// TwoWattmeterPower is the power read from two wattmeters.
type TwoWattmeterPower struct {
	P, Q, S    calc.Quantity // W, var, VA (S complex)
	PF         float64       // |P|/|S|; meaningless when PFDefined is false
	PFDefined  bool          // false when S = 0
	Lagging    bool          // Q > 0 beyond rounding
	Delivering bool          // P < 0
}

// FromWattmeters returns the power of a balanced load from the readings
// of the wiring described on Wattmeters: P = W1 + W2 and
// Q = s·√3·(W1 − W2) with s = +1 for ABC and −1 for ACB. P holds for any
// load on three wires; Q only for a balanced one.
func FromWattmeters(w1, w2 calc.Quantity, seq Sequence) (TwoWattmeterPower, []calc.Step, error) {
	var r TwoWattmeterPower
	if err := seq.check(); err != nil {
		return r, nil, err
	}
	for i, w := range []calc.Quantity{w1, w2} {
		if err := needDim(w, calc.DimPower, fmt.Sprintf("wattmeter reading W%d", i+1)); err != nil {
			return r, nil, err
		}
		if imag(w.V) != 0 {
			return r, nil, fmt.Errorf("wattmeter reading W%d must be a real number of watts", i+1)
		}
	}
	g := seq.sign()
	p := real(w1.V) + real(w2.V)
	q := g * sqrt3 * (real(w1.V) - real(w2.V))
	s := complex(p, q)
	r.S, r.P, r.Q, _ = powers(s)
	if err := checkAll("power from two wattmeters", r.S, r.P, r.Q); err != nil {
		return TwoWattmeterPower{}, nil, err
	}
	formula := "P = W1 + W2;  Q = √3·(W1 − W2)"
	if g < 0 {
		formula = "P = W1 + W2;  Q = √3·(W2 − W1)"
	}
	st := calc.Step{
		Kind:    "wattmeters",
		Rule:    "power of a balanced load from two wattmeters (wiring: current coils in lines a and b, voltage coils to line c; " + seq.String() + ")",
		Formula: formula + ";  pf = P/√(P² + Q²)",
		Inputs:  []calc.Operand{op("W1", w1), op("W2", w2)},
		Results: []calc.Operand{op("P", r.P), op("Q", r.Q), op("S", r.S)},
		Notes:   []string{pfNote(s), "Q from two wattmeters holds for a balanced load only; P holds for any load on three wires"}, Cautions: calc.CautionsOf(calc.CautionMains),
	}
	if m := math.Hypot(p, q); m > 0 {
		r.PFDefined = true
		r.PF = math.Abs(p) / m
		// a reactive part at rounding level is unity power factor
		r.Lagging = q > 1e-12*m
		r.Delivering = p < 0
		st.Results = append(st.Results, op("pf", calc.Number(complex(r.PF, 0))))
	}
	return r, []calc.Step{st}, nil
}
