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
		Kind:    "components",
		Rule:    "phase to symmetrical components (Fortescue), a = 1∠120°, positive sequence = ABC rotation",
		Formula: "X0 = (Xa + Xb + Xc)/3;  X1 = (Xa + a·Xb + a²·Xc)/3;  X2 = (Xa + a²·Xb + a·Xc)/3",
		Inputs:  []calc.Operand{op("Xa", xa), op("Xb", xb), op("Xc", xc)},
		Results: []calc.Operand{op("X0 (zero)", r[0]), op("X1 (positive)", r[1]), op("X2 (negative)", r[2])},
		Notes:   []string{Caution},
	}
	return r, []calc.Step{st}, nil
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
		Kind:    "components",
		Rule:    "symmetrical components to phases (Fortescue), a = 1∠120°, positive sequence = ABC rotation",
		Formula: "Xa = X0 + X1 + X2;  Xb = X0 + a²·X1 + a·X2;  Xc = X0 + a·X1 + a²·X2",
		Inputs:  []calc.Operand{op("X0", x0), op("X1", x1), op("X2", x2)},
		Results: []calc.Operand{op("Xa", r[0]), op("Xb", r[1]), op("Xc", r[2])},
		Notes:   []string{Caution},
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
