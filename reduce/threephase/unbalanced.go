package threephase

import (
	"errors"
	"fmt"

	"argand/calc"
	"argand/reduce"
	"argand/reduce/nodal"
)

// WyeLoad is the solution of an unbalanced Y load on a balanced supply.
// Index 0, 1, 2 stand for phases a, b, c.
type WyeLoad struct {
	Neutral bool
	Supply  [3]calc.Quantity // supply phase voltages V_aN, V_bN, V_cN
	VLoad   [3]calc.Quantity // voltage across each load impedance, V_an, V_bn, V_cn
	I       [3]calc.Quantity // line currents I_a, I_b, I_c, into the load
	IN      calc.Quantity    // neutral current from the star point back to the supply; 0 when floating
	VShift  calc.Quantity    // neutral-point shift V_nN; 0 when the neutral is connected
	S       calc.Quantity    // total complex power taken by the load
}

// SolveWye solves an unbalanced Y load z (phases a, b, c) on a balanced
// supply whose phase-a voltage is vPhase, the others following seq.
//
// With the neutral connected each phase sees its supply voltage, I_k =
// V_kN/Z_k, and the neutral carries I_N = I_a + I_b + I_c. With the star
// point floating its voltage follows from the one node equation of the
// star point (Millman's theorem): V_nN = Σ V_kN·Y_k / Σ Y_k, and
// I_k = (V_kN − V_nN)·Y_k; the line currents then sum to zero. A phase of
// zero impedance ties the star point to its line.
func SolveWye(vPhase calc.Quantity, z [3]calc.Quantity, neutral bool, seq Sequence, basis calc.Basis) (WyeLoad, []calc.Step, error) {
	var w WyeLoad
	if err := seq.check(); err != nil {
		return w, nil, err
	}
	if err := needDim(vPhase, calc.DimVoltage, "the phase voltage"); err != nil {
		return w, nil, err
	}
	names := [3]string{"Z_a", "Z_b", "Z_c"}
	for k := range z {
		if err := needDim(z[k], calc.DimImpedance, names[k]); err != nil {
			return w, nil, err
		}
	}
	w.Neutral = neutral
	vs := phaseSet(vPhase.V, seq)
	var cur [3]complex128
	var shift complex128
	inputs := []calc.Operand{op("V_aN", volt(vs[0])), op("V_bN", volt(vs[1])), op("V_cN", volt(vs[2])),
		op("Z_a", z[0]), op("Z_b", z[1]), op("Z_c", z[2])}
	var steps []calc.Step
	if neutral {
		for k := range z {
			if z[k].V == 0 {
				return w, nil, fmt.Errorf("%w: %s is zero with the neutral connected, so phase %c is shorted", errShort, names[k], 'a'+k)
			}
		}
		var err error
		if _, cur, err = starPoint(vs, z, true, basis); err != nil {
			return WyeLoad{}, nil, err
		}
		in := cur[0] + cur[1] + cur[2]
		w.IN = amp(in)
		steps = append(steps, calc.Step{
			Kind:    "unbalanced",
			Rule:    "unbalanced Y load, neutral connected, solved by modified nodal analysis: each phase takes its supply voltage; the neutral carries the sum (" + seq.String() + ")",
			Formula: "I_k = V_kN/Z_k;  I_N = I_a + I_b + I_c",
			Inputs:  inputs,
			Results: []calc.Operand{op("I_N", w.IN), op("I_a", amp(cur[0])), op("I_b", amp(cur[1])), op("I_c", amp(cur[2]))},
		})
	} else {
		var err error
		shift, cur, err = starPoint(vs, z, false, basis)
		if err != nil {
			return WyeLoad{}, nil, err
		}
		w.VShift = volt(shift)
		steps = append(steps, calc.Step{
			Kind:    "unbalanced",
			Rule:    "unbalanced Y load, star point floating, solved by modified nodal analysis: the node equation of the star point is Millman's theorem (" + seq.String() + ")",
			Formula: "V_nN = (V_aN·Y_a + V_bN·Y_b + V_cN·Y_c)/(Y_a + Y_b + Y_c);  I_k = (V_kN − V_nN)/Z_k",
			Inputs:  inputs,
			Results: []calc.Operand{op("V_nN", w.VShift), op("I_a", amp(cur[0])), op("I_b", amp(cur[1])), op("I_c", amp(cur[2]))},
			Notes:   []string{"the line currents sum to zero: there is no return path"},
		})
		w.IN = amp(0)
	}
	var s complex128
	for k := range z {
		w.Supply[k] = volt(vs[k])
		w.VLoad[k] = volt(vs[k] - shift)
		w.I[k] = amp(cur[k])
		s += w.VLoad[k].V * conj(cur[k])
	}
	s *= complex(basisFactor(basis), 0)
	w.S = calc.Quantity{V: s, Dim: calc.DimPower, Kind: calc.KindApparent}
	if err := checkAll("unbalanced Y load", append(append(append([]calc.Quantity{w.IN, w.VShift, w.S}, w.VLoad[:]...), w.I[:]...), w.Supply[:]...)...); err != nil {
		return WyeLoad{}, nil, err
	}
	sq, p, q, _ := powers(s)
	steps = append(steps, calc.Step{
		Kind:    "power",
		Rule:    "total power: sum over the three load impedances",
		Formula: powerFormula(basis, "") + " per phase;  S = S_a + S_b + S_c",
		Inputs:  []calc.Operand{op("V_an", w.VLoad[0]), op("V_bn", w.VLoad[1]), op("V_cn", w.VLoad[2])},
		Results: []calc.Operand{op("S", sq), op("P", p), op("Q", q)},
		Notes:   []string{pfNote(s), Caution},
	})
	for i := range steps {
		steps[i].Basis = basis
	}
	return w, steps, nil
}

// starPoint solves a Y load on a supply of phase voltages vs by the nodal
// engine (package nodal, modified nodal analysis): the supply's star point
// N is the reference, each phase a voltage source from N to its line node,
// each load impedance from its line node to the load's star point n. With
// the neutral connected a 0 Ω wire joins n to N; floating, the engine's one
// node equation at n is Millman's theorem. It returns the neutral-point
// shift V_nN and the line currents, which flow from the line into the load.
func starPoint(vs [3]complex128, z [3]calc.Quantity, neutral bool, basis calc.Basis) (complex128, [3]complex128, error) {
	var cur [3]complex128
	lines := [3]string{"A", "B", "C"}
	net := &reduce.Network{Name: "Y load", Reference: "N"}
	for k := range vs {
		net.Elements = append(net.Elements, reduce.Element{Name: "V_" + string(rune('a'+k)) + "N", Kind: reduce.VoltageSource,
			From: "N", To: lines[k], Value: vs[k]})
	}
	for k := range z {
		net.Elements = append(net.Elements, reduce.Element{Name: "Z_" + string(rune('a'+k)), Kind: reduce.Impedance,
			From: lines[k], To: "n", Z: z[k].V, Raw: z[k].V})
	}
	if neutral {
		net.Elements = append(net.Elements, reduce.Element{Name: "neutral", Kind: reduce.Impedance, From: "n", To: "N"})
	}
	sol, err := nodal.Solve(net, basis)
	if err != nil {
		var ne *nodal.NetError
		if errors.As(err, &ne) {
			return 0, cur, fmt.Errorf("%w: %s", errShort, ne.Msg)
		}
		return 0, cur, fmt.Errorf("the star-point voltage is undefined (%v)", err)
	}
	for k := range z {
		cur[k] = sol.Branches[3+k].I
	}
	return sol.Voltage["n"], cur, nil
}

// DeltaLoad is the solution of an unbalanced Δ load on a balanced supply.
type DeltaLoad struct {
	VLine  [3]calc.Quantity // V_ab, V_bc, V_ca
	IPhase [3]calc.Quantity // I_ab, I_bc, I_ca through Z_ab, Z_bc, Z_ca
	ILine  [3]calc.Quantity // I_a, I_b, I_c
	S      calc.Quantity
}

// SolveDelta solves an unbalanced Δ load (Z_ab, Z_bc, Z_ca) on a balanced
// supply of line voltage vLine (taken as V_ab; V_bc and V_ca follow seq).
// Each impedance takes its line voltage, I_ab = V_ab/Z_ab, and the line
// currents follow from the node equations at the corners:
// I_a = I_ab − I_ca, I_b = I_bc − I_ab, I_c = I_ca − I_bc.
func SolveDelta(vLine calc.Quantity, z [3]calc.Quantity, seq Sequence, basis calc.Basis) (DeltaLoad, []calc.Step, error) {
	var d DeltaLoad
	if err := seq.check(); err != nil {
		return d, nil, err
	}
	if err := needDim(vLine, calc.DimVoltage, "the line voltage"); err != nil {
		return d, nil, err
	}
	names := [3]string{"Z_ab", "Z_bc", "Z_ca"}
	for k := range z {
		if err := needDim(z[k], calc.DimImpedance, names[k]); err != nil {
			return d, nil, err
		}
		if z[k].V == 0 {
			return d, nil, fmt.Errorf("%w: %s is zero, so the supply is shorted between two lines", errShort, names[k])
		}
	}
	vl := phaseSet(vLine.V, seq)
	var ip [3]complex128
	var s complex128
	for k := range z {
		ip[k] = vl[k] / z[k].V
		s += vl[k] * conj(ip[k])
		d.VLine[k] = volt(vl[k])
		d.IPhase[k] = amp(ip[k])
	}
	d.ILine = [3]calc.Quantity{amp(ip[0] - ip[2]), amp(ip[1] - ip[0]), amp(ip[2] - ip[1])}
	s *= complex(basisFactor(basis), 0)
	sq, p, q, _ := powers(s)
	d.S = sq
	if err := checkAll("unbalanced Δ load", append(append(append([]calc.Quantity{d.S}, d.VLine[:]...), d.IPhase[:]...), d.ILine[:]...)...); err != nil {
		return DeltaLoad{}, nil, err
	}
	steps := []calc.Step{{
		Kind:    "unbalanced",
		Rule:    "unbalanced Δ load: each impedance takes its line voltage (" + seq.String() + ")",
		Formula: "I_ab = V_ab/Z_ab, I_bc = V_bc/Z_bc, I_ca = V_ca/Z_ca",
		Inputs: []calc.Operand{op("V_ab", d.VLine[0]), op("V_bc", d.VLine[1]), op("V_ca", d.VLine[2]),
			op("Z_ab", z[0]), op("Z_bc", z[1]), op("Z_ca", z[2])},
		Results: []calc.Operand{op("I_ab", d.IPhase[0]), op("I_bc", d.IPhase[1]), op("I_ca", d.IPhase[2])},
		Basis:   basis,
	}, {
		Kind:    "unbalanced",
		Rule:    "line currents from the node equation at each corner of the Δ",
		Formula: "I_a = I_ab − I_ca;  I_b = I_bc − I_ab;  I_c = I_ca − I_bc",
		Inputs:  []calc.Operand{op("I_ab", d.IPhase[0]), op("I_bc", d.IPhase[1]), op("I_ca", d.IPhase[2])},
		Results: []calc.Operand{op("I_a", d.ILine[0]), op("I_b", d.ILine[1]), op("I_c", d.ILine[2])},
		Basis:   basis,
	}, {
		Kind:    "power",
		Rule:    "total power: sum over the three load impedances",
		Formula: powerFormula(basis, "") + " per phase;  S = S_ab + S_bc + S_ca",
		Results: []calc.Operand{op("S", sq), op("P", p), op("Q", q)},
		Basis:   basis,
		Notes:   []string{pfNote(s), Caution},
	}}
	return d, steps, nil
}
