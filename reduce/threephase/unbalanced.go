package threephase

import (
	"fmt"
	"math/cmplx"

	"argand/calc"
)

// NeutralKind says how the star point of a Y load is joined to the
// supply's star point N.
type NeutralKind uint8

const (
	NeutralSolid   NeutralKind = iota // a wire of negligible impedance
	NeutralOpen                       // no connection: the star point floats (an open or broken neutral)
	NeutralThrough                    // through the impedance Link.Z
)

// Link is the connection of a Y load's star point n to the supply's N.
type Link struct {
	Kind NeutralKind
	Z    calc.Quantity // the neutral impedance, for NeutralThrough
}

func (l Link) String() string {
	switch l.Kind {
	case NeutralOpen:
		return "open neutral (star point floating)"
	case NeutralThrough:
		return "neutral through Z_N"
	}
	return "solid neutral"
}

// WyeLoad is the solution of an unbalanced Y load. Index 0, 1, 2 stand
// for phases a, b, c.
type WyeLoad struct {
	Neutral bool             // the star point is joined to N (solid or through Z_N)
	Link    Link             // how it is joined
	Supply  [3]calc.Quantity // supply phase voltages V_aN, V_bN, V_cN (line-to-neutral)
	VLoad   [3]calc.Quantity // voltage across each load impedance, V_an, V_bn, V_cn
	I       [3]calc.Quantity // line currents I_a, I_b, I_c, into the load
	IN      calc.Quantity    // neutral current from the star point back to the supply; 0 when open
	VShift  calc.Quantity    // neutral-point shift V_nN; 0 with a solid neutral
	S       calc.Quantity    // total complex power taken by the three load impedances
	SN      calc.Quantity    // complex power taken by the neutral impedance
}

// SolveWye solves an unbalanced Y load z (phases a, b, c) on a balanced
// supply whose phase-a voltage (line-to-neutral) is vPhase, the others
// following seq, with the neutral solid (neutral true) or open.
func SolveWye(vPhase calc.Quantity, z [3]calc.Quantity, neutral bool, seq Sequence, basis calc.Basis) (WyeLoad, []calc.Step, error) {
	if err := seq.check(); err != nil {
		return WyeLoad{}, nil, err
	}
	if err := needDim(vPhase, calc.DimVoltage, "the phase voltage"); err != nil {
		return WyeLoad{}, nil, err
	}
	vs := phaseSet(vPhase.V, seq)
	link := Link{Kind: NeutralOpen}
	if neutral {
		link.Kind = NeutralSolid
	}
	return SolveWyeSupply([3]calc.Quantity{volt(vs[0]), volt(vs[1]), volt(vs[2])}, z, link, seq, basis)
}

// SolveWyeSupply solves a Y load z on a supply of any three phase
// voltages vs (line-to-neutral: V_aN, V_bN, V_cN, balanced or not), its
// star point n joined to the supply's N as link says.
//
// The one node equation at n (Millman's theorem, with the neutral as a
// fourth branch of admittance Y_N) gives the neutral-point shift
//
//	V_nN = (V_aN·Y_a + V_bN·Y_b + V_cN·Y_c)/(Y_a + Y_b + Y_c + Y_N)
//
// with Y_N = 1/Z_N, 0 for an open neutral; a solid neutral holds V_nN = 0.
// Then I_k = (V_kN − V_nN)·Y_k and I_N = V_nN·Y_N = I_a + I_b + I_c. A
// phase of zero impedance ties the star point to its line.
func SolveWyeSupply(vs [3]calc.Quantity, z [3]calc.Quantity, link Link, seq Sequence, basis calc.Basis) (WyeLoad, []calc.Step, error) {
	var w WyeLoad
	if err := seq.check(); err != nil {
		return w, nil, err
	}
	supplyNames := [3]string{"V_aN", "V_bN", "V_cN"}
	names := [3]string{"Z_a", "Z_b", "Z_c"}
	for k := range z {
		if err := needDim(vs[k], calc.DimVoltage, supplyNames[k]+" (line-to-neutral)"); err != nil {
			return w, nil, err
		}
		if err := needDim(z[k], calc.DimImpedance, names[k]); err != nil {
			return w, nil, err
		}
	}
	switch link.Kind {
	case NeutralThrough:
		if err := needDim(link.Z, calc.DimImpedance, "the neutral impedance Z_N"); err != nil {
			return w, nil, err
		}
		if link.Z.V == 0 {
			link.Kind = NeutralSolid
		}
	case NeutralSolid, NeutralOpen:
	default:
		return w, nil, fmt.Errorf("unknown neutral connection %d", link.Kind)
	}
	w.Link = link
	w.Neutral = link.Kind != NeutralOpen
	v := [3]complex128{vs[0].V, vs[1].V, vs[2].V}
	shift, cur, in, err := starPoint(v, [3]complex128{z[0].V, z[1].V, z[2].V}, link)
	if err != nil {
		return WyeLoad{}, nil, err
	}
	inputs := []calc.Operand{op("V_aN", vs[0]), op("V_bN", vs[1]), op("V_cN", vs[2]),
		op("Z_a", z[0]), op("Z_b", z[1]), op("Z_c", z[2])}
	w.VShift, w.IN = volt(shift), amp(in)
	var steps []calc.Step
	curOps := []calc.Operand{op("I_a", amp(cur[0])), op("I_b", amp(cur[1])), op("I_c", amp(cur[2]))}
	switch link.Kind {
	case NeutralSolid:
		steps = append(steps, calc.Step{
			Kind:    "unbalanced",
			Rule:    "unbalanced Y load, solid neutral: each phase takes its supply voltage; the neutral carries the sum (" + seq.String() + ")",
			Formula: "I_k = V_kN/Z_k;  I_N = I_a + I_b + I_c",
			Inputs:  inputs,
			Results: append([]calc.Operand{op("I_N", w.IN)}, curOps...),
		})
	case NeutralOpen:
		steps = append(steps, calc.Step{
			Kind:    "unbalanced",
			Rule:    "unbalanced Y load, open neutral: the star point floats; its node equation is Millman's theorem (" + seq.String() + ")",
			Formula: "V_nN = (V_aN·Y_a + V_bN·Y_b + V_cN·Y_c)/(Y_a + Y_b + Y_c);  I_k = (V_kN − V_nN)/Z_k",
			Inputs:  inputs,
			Results: append([]calc.Operand{op("V_nN", w.VShift)}, curOps...),
			Notes:   []string{"the line currents sum to zero: there is no return path"},
		})
	default:
		steps = append(steps, calc.Step{
			Kind:    "unbalanced",
			Rule:    "unbalanced Y load, neutral through an impedance: the node equation at the star point, with the neutral as a fourth branch (" + seq.String() + ")",
			Formula: "V_nN = (V_aN·Y_a + V_bN·Y_b + V_cN·Y_c)/(Y_a + Y_b + Y_c + Y_N);  I_k = (V_kN − V_nN)/Z_k;  I_N = V_nN/Z_N",
			Inputs:  append(inputs, op("Z_N", link.Z)),
			Results: append([]calc.Operand{op("V_nN", w.VShift), op("I_N", w.IN)}, curOps...),
		})
	}
	var s complex128
	var terms float64
	for k := range z {
		w.Supply[k] = vs[k]
		w.VLoad[k] = volt(v[k] - shift)
		w.I[k] = amp(cur[k])
		sk := w.VLoad[k].V * conj(cur[k])
		s += sk
		terms += cmplx.Abs(sk)
	}
	// P and Q each cancel to rounding on their own (resistive phases
	// leave a femto-var of Q)
	s = complex(real(cancelled(complex(real(s), 0), terms)), real(cancelled(complex(imag(s), 0), terms)))
	k := complex(basisFactor(basis), 0)
	s *= k
	w.S = calc.Quantity{V: s, Dim: calc.DimPower, Kind: calc.KindApparent}
	w.SN = calc.Quantity{V: k * shift * conj(in), Dim: calc.DimPower, Kind: calc.KindApparent}
	if err := checkAll("unbalanced Y load", append(append(append([]calc.Quantity{w.IN, w.VShift, w.S, w.SN}, w.VLoad[:]...), w.I[:]...), w.Supply[:]...)...); err != nil {
		return WyeLoad{}, nil, err
	}
	if link.Kind != NeutralSolid {
		steps = append(steps, loadVoltageStep(w))
	}
	sq, p, q, _ := powers(s)
	pst := calc.Step{
		Kind:    "power",
		Rule:    "total power: sum over the three load impedances",
		Formula: powerFormula(basis, "") + " per phase;  S = S_a + S_b + S_c",
		Inputs:  []calc.Operand{op("V_an", w.VLoad[0]), op("V_bn", w.VLoad[1]), op("V_cn", w.VLoad[2])},
		Results: []calc.Operand{op("S", sq), op("P", p), op("Q", q)},
		Notes:   []string{pfNote(s)}, Cautions: calc.CautionsOf(calc.CautionMains),
	}
	if link.Kind == NeutralThrough {
		pst.Results = append(pst.Results, op("S_N (neutral impedance)", w.SN))
	}
	steps = append(steps, pst)
	for i := range steps {
		steps[i].Basis = basis
	}
	return w, steps, nil
}

// loadVoltageStep shows the voltage each phase load sees when the star
// point is not held at N, beside its supply phase voltage.
func loadVoltageStep(w WyeLoad) calc.Step {
	st := calc.Step{
		Kind:    "unbalanced",
		Rule:    "the voltage each phase load sees: its supply phase voltage less the neutral-point shift",
		Formula: "V_kn = V_kN − V_nN",
		Inputs:  []calc.Operand{op("V_nN", w.VShift)},
		Results: []calc.Operand{op("V_an", w.VLoad[0]), op("V_bn", w.VLoad[1]), op("V_cn", w.VLoad[2])},
	}
	f := calc.Format{}
	over := false
	for k := range w.VLoad {
		sup, got := w.Supply[k].Mag(), w.VLoad[k].Mag()
		line := fmt.Sprintf("phase %c load sees %s", 'a'+k, f.Mag(got, calc.DimVoltage, calc.KindPlain))
		if sup > 0 {
			line += fmt.Sprintf(", %.1f %% of its supply phase voltage %s", 100*got/sup, f.Mag(sup, calc.DimVoltage, calc.KindPlain))
			if got > 1.1*sup {
				over = true
			}
		}
		st.Notes = append(st.Notes, line)
	}
	if over {
		st.Notes = append(st.Notes, "a shifted star point puts more than the phase voltage across the lightly loaded phases (up to the line-to-line voltage): single-phase equipment there can be damaged, and exposed parts may become live; find and repair the neutral under local electrical codes and licensed practice")
	}
	return st
}

// starPoint solves the node equation of a Y load's star point n, with the
// supply's star point N as reference (Millman's theorem with the neutral
// as a fourth branch). It returns the shift V_nN, the line currents (from
// each line into the load) and the neutral current from n back to N.
func starPoint(vs, z [3]complex128, link Link) (complex128, [3]complex128, complex128, error) {
	var cur [3]complex128
	zeroAt := -1
	for k := range z {
		if z[k] != 0 {
			continue
		}
		if link.Kind == NeutralSolid {
			return 0, cur, 0, fmt.Errorf("%w: Z_%c is zero with a solid neutral, so phase %c is shorted", errShort, 'a'+k, 'a'+k)
		}
		if zeroAt >= 0 {
			return 0, cur, 0, fmt.Errorf("%w: Z_%c and Z_%c are both zero, so lines %c and %c are shorted together", errShort, 'a'+zeroAt, 'a'+k, 'A'+zeroAt, 'A'+k)
		}
		zeroAt = k
	}
	var yn complex128
	if link.Kind == NeutralThrough {
		yn = 1 / link.Z.V
	}
	var shift complex128
	switch {
	case link.Kind == NeutralSolid:
		shift = 0
	case zeroAt >= 0:
		// the star point sits on the shorted phase's line
		shift = vs[zeroAt]
	default:
		var num, den complex128
		var terms float64
		for k := range z {
			y := 1 / z[k]
			num += vs[k] * y
			terms += cmplx.Abs(vs[k] * y)
			den += y
		}
		// a sum that cancels to rounding is 0: a balanced load has no
		// shift, not femtovolts
		num = cancelled(num, terms)
		den += yn
		scale := cmplx.Abs(1/z[0]) + cmplx.Abs(1/z[1]) + cmplx.Abs(1/z[2]) + cmplx.Abs(yn)
		if cmplx.Abs(den) <= 1e-12*scale {
			return 0, cur, 0, fmt.Errorf("the star-point voltage is unbounded: the admittances at the star point sum to zero (a resonance between the phases)")
		}
		shift = num / den
	}
	var sum complex128
	var terms float64
	for k := range z {
		if k == zeroAt {
			continue
		}
		cur[k] = (vs[k] - shift) / z[k]
		sum += cur[k]
		terms += cmplx.Abs(cur[k])
	}
	sum = cancelled(sum, terms)
	in := shift * yn
	if link.Kind == NeutralSolid {
		in = sum
	}
	if zeroAt >= 0 {
		// KCL at the star point: what enters by the shorted phase leaves
		// by the neutral or the other phases
		cur[zeroAt] = in - sum
	}
	for _, c := range append(cur[:], shift, in) {
		if cmplx.IsNaN(c) || cmplx.IsInf(c) {
			return 0, cur, 0, fmt.Errorf("the star-point voltage is undefined for these impedances")
		}
	}
	return shift, cur, in, nil
}

// cancelled returns 0 for a sum whose magnitude is below 1e-12 of the sum
// of its terms' magnitudes: what is left there is rounding.
func cancelled(sum complex128, terms float64) complex128 {
	if cmplx.Abs(sum) <= 1e-12*terms {
		return 0
	}
	return sum
}

// DeltaLoad is the solution of an unbalanced Δ load on a balanced supply.
type DeltaLoad struct {
	VLine  [3]calc.Quantity // V_ab, V_bc, V_ca
	IPhase [3]calc.Quantity // I_ab, I_bc, I_ca through Z_ab, Z_bc, Z_ca
	ILine  [3]calc.Quantity // I_a, I_b, I_c
	S      calc.Quantity
}

// SolveDelta solves an unbalanced Δ load (Z_ab, Z_bc, Z_ca) on a balanced
// supply of line-to-line voltage vLine (taken as V_ab; V_bc and V_ca follow
// seq). See SolveDeltaSupply.
func SolveDelta(vLine calc.Quantity, z [3]calc.Quantity, seq Sequence, basis calc.Basis) (DeltaLoad, []calc.Step, error) {
	if err := seq.check(); err != nil {
		return DeltaLoad{}, nil, err
	}
	if err := needDim(vLine, calc.DimVoltage, "the line voltage"); err != nil {
		return DeltaLoad{}, nil, err
	}
	vl := phaseSet(vLine.V, seq)
	return SolveDeltaSupply([3]calc.Quantity{volt(vl[0]), volt(vl[1]), volt(vl[2])}, z, seq, basis)
}

// SolveDeltaSupply solves an unbalanced Δ load on any three line-to-line
// voltages V_ab, V_bc, V_ca (balanced or not). Around the three lines
// Kirchhoff's voltage law holds, V_ab + V_bc + V_ca = 0, so a set that
// breaks it is refused. Each impedance takes its line voltage,
// I_ab = V_ab/Z_ab, and the line currents follow from the node equations
// at the corners: I_a = I_ab − I_ca, I_b = I_bc − I_ab, I_c = I_ca − I_bc.
func SolveDeltaSupply(v [3]calc.Quantity, z [3]calc.Quantity, seq Sequence, basis calc.Basis) (DeltaLoad, []calc.Step, error) {
	var d DeltaLoad
	if err := seq.check(); err != nil {
		return d, nil, err
	}
	lineNames := [3]string{"V_ab", "V_bc", "V_ca"}
	var vl [3]complex128
	var scale float64
	for k := range v {
		if err := needDim(v[k], calc.DimVoltage, lineNames[k]+" (line-to-line)"); err != nil {
			return d, nil, err
		}
		vl[k] = v[k].V
		scale += cmplx.Abs(vl[k])
	}
	if sum := vl[0] + vl[1] + vl[2]; cmplx.Abs(sum) > 1e-6*scale {
		return d, nil, fmt.Errorf("the line-to-line voltages must sum to zero around the three lines (V_ab + V_bc + V_ca = 0), but they sum to %s; from two readings take V_ca = −(V_ab + V_bc)",
			calc.Format{}.Polar(volt(sum)))
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
		Notes:   []string{pfNote(s)}, Cautions: calc.CautionsOf(calc.CautionMains),
	}}
	return d, steps, nil
}
