package threephase

import (
	"math/cmplx"

	"fmt"

	"argand/calc"
)

// ToSequence resolves three phase phasors into symmetrical components
// (C. L. Fortescue, 1918), in the order zero, positive, negative, with
// a = 1∠120°:
//
//	X0 = (Xa + Xb + Xc)/3
//	X1 = (Xa + a·Xb + a²·Xc)/3
//	X2 = (Xa + a²·Xb + a·Xc)/3
//
// Positive sequence means the ABC rotation whatever the worksheet's
// sequence setting, so a balanced ACB set resolves to a pure negative
// sequence. The three inputs must share a dimension.
func ToSequence(xa, xb, xc calc.Quantity) ([3]calc.Quantity, []calc.Step, error) {
	var r [3]calc.Quantity
	if err := sameDim(xa, xb, xc); err != nil {
		return r, nil, err
	}
	a, b, c := xa.V, xb.V, xc.V
	d := xa.Dim
	r[0] = calc.Q((a+b+c)/3, d)
	r[1] = calc.Q((a+opA*b+opA2*c)/3, d)
	r[2] = calc.Q((a+opA2*b+opA*c)/3, d)
	// a component that cancels to rounding is 0: the zero and negative
	// sequences of a balanced set are nothing, not femtovolts
	scale := cmplx.Abs(a) + cmplx.Abs(b) + cmplx.Abs(c)
	for k := range r {
		if cmplx.Abs(r[k].V) <= 8*2.220446049250313e-16*scale {
			r[k].V = 0
		}
	}
	if err := checkAll("symmetrical components", r[:]...); err != nil {
		return [3]calc.Quantity{}, nil, err
	}
	st := calc.Step{
		Kind:     "components",
		Rule:     "phase to symmetrical components (Fortescue), a = 1∠120°, positive sequence = ABC rotation",
		Formula:  "X0 = (Xa + Xb + Xc)/3;  X1 = (Xa + a·Xb + a²·Xc)/3;  X2 = (Xa + a²·Xb + a·Xc)/3",
		Inputs:   []calc.Operand{op("Xa", xa), op("Xb", xb), op("Xc", xc)},
		Results:  []calc.Operand{op("X0 (zero)", r[0]), op("X1 (positive)", r[1]), op("X2 (negative)", r[2])},
		Cautions: calc.CautionsOf(calc.CautionMains),
	}
	return r, []calc.Step{st}, nil
}

// Unbalance is the ratio of the negative- and zero-sequence components to
// the positive-sequence component of three phasors.
type Unbalance struct {
	Neg, Zero calc.Quantity // |X2|/|X1| and |X0|/|X1|, plain numbers
}

// UnbalanceOf returns the unbalance factors of sequence components r (zero,
// positive, negative, as ToSequence returns them): u2 = |X2|/|X1| and
// u0 = |X0|/|X1|. For voltages u2 is the voltage unbalance factor as
// IEC 61000-4-30 defines it (negative- over positive-sequence magnitude,
// usually given in per cent; from memory). It fails when the positive
// sequence is zero, where the ratio has no value.
//
// The components are always taken with positive sequence = ABC rotation;
// on a supply whose own rotation is ACB (seq ACB) the roles of X1 and X2
// swap, so the factor is |X1|/|X2|.
func UnbalanceOf(r [3]calc.Quantity, seq Sequence) (Unbalance, calc.Step, error) {
	own, other, formula := r[1], r[2], "u2 = |X2|/|X1|;  u0 = |X0|/|X1|"
	if seq == ACB {
		own, other, formula = r[2], r[1], "ACB supply: u2 = |X1|/|X2|;  u0 = |X0|/|X2|"
	}
	p := cmplx.Abs(own.V)
	if p == 0 {
		return Unbalance{}, calc.Step{}, fmt.Errorf("the component of the supply's own rotation (%s) is zero: no unbalance factor", seq)
	}
	u := Unbalance{Neg: calc.Number(complex(cmplx.Abs(other.V)/p, 0)), Zero: calc.Number(complex(cmplx.Abs(r[0].V)/p, 0))}
	if err := checkAll("unbalance factor", u.Neg, u.Zero); err != nil {
		return Unbalance{}, calc.Step{}, err
	}
	word := "unbalance factor"
	if r[1].Dim == calc.DimVoltage {
		word = "voltage unbalance factor"
	}
	st := calc.Step{
		Kind:    "components",
		Rule:    word + ": negative- (and zero-) sequence magnitude over positive-sequence magnitude (IEC 61000-4-30)",
		Formula: formula,
		Inputs:  []calc.Operand{op("X0", r[0]), op("X1", r[1]), op("X2", r[2])},
		Results: []calc.Operand{op("u2", u.Neg), op("u0", u.Zero)},
		Notes: []string{fmt.Sprintf("u2 = %.4g %%, u0 = %.4g %%", 100*real(u.Neg.V), 100*real(u.Zero.V)),
			"other definitions of unbalance (the largest deviation of a line voltage from the mean of the three, over that mean) give different figures: say which one a limit uses"},
	}
	return u, st, nil
}

// FromSequence is the inverse of ToSequence:
//
//	Xa = X0 + X1 + X2
//	Xb = X0 + a²·X1 + a·X2
//	Xc = X0 + a·X1 + a²·X2
func FromSequence(x0, x1, x2 calc.Quantity) ([3]calc.Quantity, []calc.Step, error) {
	var r [3]calc.Quantity
	if err := sameDim(x0, x1, x2); err != nil {
		return r, nil, err
	}
	z, p, n := x0.V, x1.V, x2.V
	d := x0.Dim
	r[0] = calc.Q(z+p+n, d)
	r[1] = calc.Q(z+opA2*p+opA*n, d)
	r[2] = calc.Q(z+opA*p+opA2*n, d)
	if err := checkAll("phases from sequence components", r[:]...); err != nil {
		return [3]calc.Quantity{}, nil, err
	}
	st := calc.Step{
		Kind:     "components",
		Rule:     "symmetrical components to phases (Fortescue), a = 1∠120°, positive sequence = ABC rotation",
		Formula:  "Xa = X0 + X1 + X2;  Xb = X0 + a²·X1 + a·X2;  Xc = X0 + a·X1 + a²·X2",
		Inputs:   []calc.Operand{op("X0", x0), op("X1", x1), op("X2", x2)},
		Results:  []calc.Operand{op("Xa", r[0]), op("Xb", r[1]), op("Xc", r[2])},
		Cautions: calc.CautionsOf(calc.CautionMains),
	}
	return r, []calc.Step{st}, nil
}

func sameDim(x ...calc.Quantity) error {
	for _, q := range x[1:] {
		if q.Dim != x[0].Dim {
			return fmt.Errorf("the three phasors must share a unit: %s and %s differ",
				calc.DimName(x[0].Dim, false), calc.DimName(q.Dim, false))
		}
	}
	return checkAll("symmetrical components", x...)
}
