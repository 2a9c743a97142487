package threephase

import (
	"fmt"

	"argand/calc"
)

// LineToPhase converts a line quantity of a balanced set to the phase
// quantity of the same connection. A voltage in Y: V_an = V_ab/(√3∠s·30°);
// a current in Δ: I_ab = I_a/(√3∠−s·30°), with s = +1 for ABC and −1 for
// ACB. A Y current and a Δ voltage are the same on both sides. The angle
// of x is kept: a line voltage given as a real number is taken as V_ab∠0°.
func LineToPhase(x calc.Quantity, conn Connection, seq Sequence) (calc.Quantity, []calc.Step, error) {
	return convert(x, conn, seq, false)
}

// PhaseToLine is the inverse of LineToPhase: in Y, V_ab = √3·V_an∠s·30°;
// in Δ, I_a = √3·I_ab∠−s·30°.
func PhaseToLine(x calc.Quantity, conn Connection, seq Sequence) (calc.Quantity, []calc.Step, error) {
	return convert(x, conn, seq, true)
}

func convert(x calc.Quantity, conn Connection, seq Sequence, toLine bool) (calc.Quantity, []calc.Step, error) {
	if err := seq.check(); err != nil {
		return calc.Quantity{}, nil, err
	}
	if x.Dim != calc.DimVoltage && x.Dim != calc.DimCurrent {
		return calc.Quantity{}, nil, fmt.Errorf("line and phase conversion takes a voltage or a current, not %s", calc.DimWord(x.Dim))
	}
	if err := checkAll("line/phase conversion", x); err != nil {
		return calc.Quantity{}, nil, err
	}
	voltage := x.Dim == calc.DimVoltage
	g := seq.sign()
	// factor k maps phase to line: √3∠+s·30° for a Y voltage,
	// √3∠−s·30° for a Δ current, 1 otherwise.
	k := complex(1, 0)
	var formula, in, out, rule string
	switch {
	case voltage && conn == Wye:
		k = complex(sqrt3, 0) * shift30(g)
		formula = fmt.Sprintf("V_ab = √3·V_an∠%+.0f°", 30*g)
		in, out = "V_an", "V_ab"
		rule = fmt.Sprintf("Y: the line voltage is √3 times the phase voltage, shifted %+.0f°", 30*g)
	case !voltage && conn == Delta:
		k = complex(sqrt3, 0) * shift30(-g)
		formula = fmt.Sprintf("I_a = √3·I_ab∠%+.0f°", -30*g)
		in, out = "I_ab", "I_a"
		rule = fmt.Sprintf("Δ: the line current is √3 times the phase current, shifted %+.0f°", -30*g)
	case voltage:
		formula = "V_ab(line) = V_ab(phase)"
		in, out = "V_ab(phase)", "V_ab(line)"
		rule = "Δ: each phase sits between two lines, so line and phase voltage are the same"
	default:
		formula = "I_a(line) = I_a(phase)"
		in, out = "I_a(phase)", "I_a(line)"
		rule = "Y: each line feeds one phase, so line and phase current are the same"
	}
	r := calc.Quantity{V: x.V * k, Dim: x.Dim}
	if !toLine {
		r.V = x.V / k
		in, out = out, in
		rule = "line to phase, " + rule
	} else {
		rule = "phase to line, " + rule
	}
	r, err := checked(r, "line/phase conversion")
	if err != nil {
		return calc.Quantity{}, nil, err
	}
	st := calc.Step{
		Kind:     "phase-line",
		Rule:     rule + " (" + seq.String() + " sequence)",
		Formula:  formula,
		Inputs:   []calc.Operand{op(in, x)},
		Results:  []calc.Operand{op(out, r)},
		Cautions: calc.CautionsOf(calc.CautionMains),
	}
	return r, []calc.Step{st}, nil
}

// Balanced is the solution of a balanced load on a balanced supply. The
// phasors are those of phase a (line ab for line voltages).
type Balanced struct {
	Conn     Connection
	VLine    calc.Quantity // V_ab
	VPhase   calc.Quantity // V_an (Y) or V_ab (Δ)
	ILine    calc.Quantity // I_a
	IPhase   calc.Quantity // I_a (Y) or I_ab (Δ)
	ZY       calc.Quantity // per-phase Y equivalent impedance: Z (Y) or Z/3 (Δ)
	S        calc.Quantity // total complex power, VA
	P        calc.Quantity // total active power, W
	Q        calc.Quantity // total reactive power, var
	Apparent calc.Quantity // |S|, VA
}

// SolveBalanced solves a balanced load of phase impedance z in connection
// conn on a balanced supply of line voltage vLine (taken as V_ab; a real
// value is V_ab∠0°). The work goes through the per-phase Y equivalent
// (Z_Y = Z_Δ/3) and the total power is S = 3·V_ph·I_ph* for RMS phasors
// (3·½·V_ph·I_ph* for peak).
func SolveBalanced(vLine, z calc.Quantity, conn Connection, seq Sequence, basis calc.Basis) (Balanced, []calc.Step, error) {
	var b Balanced
	if err := seq.check(); err != nil {
		return b, nil, err
	}
	if err := needDim(vLine, calc.DimVoltage, "the line voltage"); err != nil {
		return b, nil, err
	}
	if err := needDim(z, calc.DimImpedance, "the phase impedance"); err != nil {
		return b, nil, err
	}
	if z.V == 0 {
		return b, nil, fmt.Errorf("%w: the phase impedance is zero, so the supply is shorted", errShort)
	}
	g := seq.sign()
	b.Conn = conn
	b.VLine = vLine
	van := vLine.V / (complex(sqrt3, 0) * shift30(g))
	var steps []calc.Step
	switch conn {
	case Wye:
		b.VPhase = volt(van)
		b.ZY = z
		b.IPhase = amp(van / z.V)
		b.ILine = b.IPhase
		steps = append(steps, calc.Step{
			Kind:    "balanced",
			Rule:    "Y load: phase voltage from line voltage, then Ohm's law per phase (" + seq.String() + ")",
			Formula: fmt.Sprintf("V_an = V_ab/(√3∠%+.0f°);  I_a = V_an/Z", 30*g),
			Inputs:  []calc.Operand{op("V_ab", vLine), op("Z", z)},
			Results: []calc.Operand{op("V_an", b.VPhase), op("I_a", b.ILine)},
		})
	default:
		b.VPhase = vLine
		b.ZY = calc.Quantity{V: z.V / 3, Dim: calc.DimImpedance}
		b.IPhase = amp(vLine.V / z.V)
		b.ILine = amp(b.IPhase.V * complex(sqrt3, 0) * shift30(-g))
		steps = append(steps, calc.Step{
			Kind:    "balanced",
			Rule:    "Δ load: each phase takes the line voltage; line current from phase current (" + seq.String() + ")",
			Formula: fmt.Sprintf("I_ab = V_ab/Z;  I_a = √3·I_ab∠%+.0f°;  per-phase Y equivalent Z_Y = Z/3", -30*g),
			Inputs:  []calc.Operand{op("V_ab", vLine), op("Z", z)},
			Results: []calc.Operand{op("I_ab", b.IPhase), op("I_a", b.ILine), op("Z_Y", b.ZY), op("V_an", volt(van))},
		})
	}
	s := 3 * complex(basisFactor(basis), 0) * b.VPhase.V * conj(b.IPhase.V)
	// each part of V·I* is a sum of products no larger than |V|·|I|
	s = calc.Leftover(s, complex(3*basisFactor(basis)*b.VPhase.Mag()*b.IPhase.Mag(), 0))
	b.S, b.P, b.Q, b.Apparent = powers(s)
	if err := checkAll("balanced load", b.VPhase, b.IPhase, b.ILine, b.ZY, b.S, b.Apparent); err != nil {
		return Balanced{}, nil, err
	}
	steps = append(steps, calc.Step{
		Kind:    "power",
		Rule:    "total power of a balanced load: three equal phases",
		Formula: powerFormula(basis, "3") + ";  " + apparentFormula(basis),
		Inputs:  []calc.Operand{op("V_ph", b.VPhase), op("I_ph", b.IPhase)},
		Results: []calc.Operand{op("S", b.S), op("P", b.P), op("Q", b.Q), op("|S|", b.Apparent)},
		Basis:   basis,
		Notes:   []string{pfNote(s)}, Cautions: calc.CautionsOf(calc.CautionMains),
	})
	for i := range steps {
		steps[i].Basis = basis
	}
	return b, steps, nil
}

func conj(v complex128) complex128 { return complex(real(v), -imag(v)) }

// apparentFormula is |S| of a balanced three-phase load from line values,
// on the basis in use: √3·V_L·I_L for RMS phasors, half that for peak ones
// (S = ½·V·I*, IEEE Std 1459-2010).
func apparentFormula(basis calc.Basis) string {
	if basis == calc.Peak {
		return "|S| = (√3/2)·V_L·I_L (peak phasors)"
	}
	return "|S| = √3·V_L·I_L (RMS)"
}
