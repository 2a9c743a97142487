package site

import (
	"math"
	"math/cmplx"

	"argand/calc"
)

// FaultType is an unsymmetrical short circuit.
type FaultType uint8

const (
	// LineToEarth is phase a to earth through Z_f.
	LineToEarth FaultType = iota
	// LineToLine is phase b to phase c through Z_f, no earth.
	LineToLine
	// LineLineEarth is phases b and c joined and to earth through Z_f.
	LineLineEarth
)

var faultWords = [...]string{"line-to-earth (phase a)", "line-to-line (phases b and c)", "line-to-line with earth (phases b and c)"}

func (f FaultType) String() string {
	if int(f) < len(faultWords) {
		return faultWords[f]
	}
	return "fault"
}

// Unsym is an unsymmetrical short circuit at a point of nominal voltage
// Un whose sequence impedances, seen from the fault, are Z1, Z2 and Z0.
type Unsym struct {
	Type       FaultType
	Un         float64
	Z1, Z2, Z0 complex128 // Ω per phase
	Zf         complex128 // fault impedance, Ω; 0 for a bolted fault
	Min        bool       // c_min; else c_max
	C          float64    // the voltage factor; 0 takes it from the table
	Tol10      bool
	// ACB labels the phases for the ACB rotation: b and c swap.
	ACB bool
}

// UnsymResult holds the sequence and phase currents and voltages at the
// fault, phase a of the equivalent source E = c·U_n/√3 being the reference.
type UnsymResult struct {
	E          calc.Quantity
	C          calc.Quantity
	I012, V012 [3]calc.Quantity // zero, positive, negative
	Iabc, Vabc [3]calc.Quantity // phases a, b, c; V to earth
	Ie         calc.Quantity    // current to earth, 3·I0 (a phasor)
	Ik         calc.Quantity    // the IEC 60909-0 current: |I_a|, |I_b| or |I_E| (a magnitude)
	Steps      []calc.Step
}

// UnsymFault returns the currents and voltages at an unsymmetrical fault
// by symmetrical components (C. L. Fortescue, 1918) with the equivalent
// voltage source of IEC 60909-0, E = c·U_n/√3 in the positive-sequence
// network, and the sequence networks connected for the fault:
//
//	line-to-earth:           I1 = I2 = I0 = E/(Z1 + Z2 + Z0 + 3Zf)
//	line-to-line:            I1 = −I2 = E/(Z1 + Z2 + Zf), I0 = 0
//	line-to-line with earth: I1 = E/(Z1 + Z2∥(Z0 + 3Zf)),
//	                         I2 = −I1·(Z0 + 3Zf)/(Z2 + Z0 + 3Zf), I0 = −I1·Z2/(Z2 + Z0 + 3Zf)
//
// with V1 = E − Z1·I1, V2 = −Z2·I2, V0 = −Z0·I0 and the phase values
// Xa = X0 + X1 + X2, Xb = X0 + a²X1 + aX2, Xc = X0 + aX1 + a²X2.
func UnsymFault(u Unsym) (UnsymResult, error) {
	if err := positive("U_n", u.Un); err != nil {
		return UnsymResult{}, err
	}
	for _, z := range []struct {
		n string
		z complex128
	}{{"Z1", u.Z1}, {"Z2", u.Z2}, {"Z0", u.Z0}, {"Z_f", u.Zf}} {
		if err := finiteC(z.n, z.z); err != nil {
			return UnsymResult{}, err
		}
		if real(z.z) < 0 {
			return UnsymResult{}, errf("%s has a negative resistance: not a passive impedance", z.n)
		}
	}
	c, csrc, err := factorFor(u.Un, u.C, u.Min, u.Tol10)
	if err != nil {
		return UnsymResult{}, err
	}
	e := complex(c*u.Un/math.Sqrt(3), 0)
	z1, z2, z0, zf := u.Z1, u.Z2, u.Z0, u.Zf
	var i0, i1, i2 complex128
	var form, conn string
	switch u.Type {
	case LineToEarth:
		d := z1 + z2 + z0 + 3*zf
		if cmplx.Abs(d) == 0 {
			return UnsymResult{}, errf("Z1 + Z2 + Z0 + 3Z_f is zero: the current is unbounded")
		}
		i1 = e / d
		i2, i0 = i1, i1
		form = "I1 = I2 = I0 = E/(Z1 + Z2 + Z0 + 3Z_f)"
		conn = "the three sequence networks in series, with 3Z_f"
	case LineToLine:
		d := z1 + z2 + zf
		if cmplx.Abs(d) == 0 {
			return UnsymResult{}, errf("Z1 + Z2 + Z_f is zero: the current is unbounded")
		}
		i1 = e / d
		i2 = -i1
		form = "I1 = −I2 = E/(Z1 + Z2 + Z_f), I0 = 0"
		conn = "positive and negative sequence networks in parallel through Z_f; no zero sequence"
	case LineLineEarth:
		z03 := z0 + 3*zf
		s := z2 + z03
		if cmplx.Abs(s) == 0 {
			return UnsymResult{}, errf("Z2 + Z0 + 3Z_f is zero: the sequence networks cannot be joined")
		}
		d := z1 + z2*z03/s
		if cmplx.Abs(d) == 0 {
			return UnsymResult{}, errf("Z1 + Z2∥(Z0 + 3Z_f) is zero: the current is unbounded")
		}
		i1 = e / d
		i2 = -i1 * z03 / s
		i0 = -i1 * z2 / s
		form = "I1 = E/(Z1 + Z2∥(Z0 + 3Z_f)), I2 = −I1·(Z0 + 3Z_f)/(Z2 + Z0 + 3Z_f), I0 = −I1·Z2/(Z2 + Z0 + 3Z_f)"
		conn = "positive, negative and zero (with 3Z_f) sequence networks in parallel"
	default:
		return UnsymResult{}, errf("unknown fault type")
	}
	v1, v2, v0 := e-z1*i1, -z2*i2, -z0*i0
	ia, ib, ic := phases(i0, i1, i2)
	va, vb, vc := phases(v0, v1, v2)
	if u.ACB {
		ib, ic = ic, ib
		vb, vc = vc, vb
	}
	ie := snap(ia+ib+ic, cmplx.Abs(ia)+cmplx.Abs(ib)+cmplx.Abs(ic))
	var ik float64
	var ikName string
	switch u.Type {
	case LineToEarth:
		ik, ikName = cmplx.Abs(ia), "I\"_k1 = |I_a|"
	case LineToLine:
		ik, ikName = cmplx.Abs(ib), "I\"_k2 = |I_b| = |I_c|"
	default:
		ik, ikName = cmplx.Abs(ie), "I\"_kE2E = |I_b + I_c| (to earth)"
	}
	cur := func(z complex128) calc.Quantity { return cq(z, calc.DimCurrent) }
	vol := func(z complex128) calc.Quantity { return cq(z, calc.DimVoltage) }
	r := UnsymResult{
		E: vol(e), C: num(c),
		I012: [3]calc.Quantity{cur(i0), cur(i1), cur(i2)},
		V012: [3]calc.Quantity{vol(v0), vol(v1), vol(v2)},
		Iabc: [3]calc.Quantity{cur(ia), cur(ib), cur(ic)},
		Vabc: [3]calc.Quantity{vol(va), vol(vb), vol(vc)},
		Ie:   cur(ie),
		Ik:   kq(ik, calc.DimCurrent, calc.KindMagnitude),
	}
	which := "c_max"
	if u.Min {
		which = "c_min"
	}
	seqNote := "phase sequence ABC, a = 1∠120°; the fault is on " + u.Type.String()
	if u.ACB {
		seqNote = "phase sequence ACB: computed for ABC with b and c swapped in the results; the fault is on " + u.Type.String()
	}
	r.Steps = []calc.Step{
		{
			Kind:    "fault",
			Rule:    u.Type.String() + " short circuit: " + conn + "; equivalent voltage source E = c·U_n/√3 (IEC 60909-0), " + csrc,
			Formula: "E = " + which + "·U_n/√3;  " + form + ";  V1 = E − Z1·I1, V2 = −Z2·I2, V0 = −Z0·I0",
			Inputs: []calc.Operand{op("U_n", rq(u.Un, calc.DimVoltage)), op(which, r.C), op("E", r.E),
				op("Z1", cq(z1, calc.DimImpedance)), op("Z2", cq(z2, calc.DimImpedance)), op("Z0", cq(z0, calc.DimImpedance)), op("Z_f", cq(zf, calc.DimImpedance))},
			Results: []calc.Operand{op("I0", r.I012[0]), op("I1", r.I012[1]), op("I2", r.I012[2]),
				op("V0", r.V012[0]), op("V1", r.V012[1]), op("V2", r.V012[2])},
		},
		{
			Kind:    "fault",
			Rule:    "phase currents and voltages to earth at the fault (symmetrical components to phases)",
			Formula: "Xa = X0 + X1 + X2;  Xb = X0 + a²·X1 + a·X2;  Xc = X0 + a·X1 + a²·X2;  I_E = Ia + Ib + Ic = 3·I0;  " + ikName,
			Results: []calc.Operand{op("Ia", r.Iabc[0]), op("Ib", r.Iabc[1]), op("Ic", r.Iabc[2]),
				op("Va", r.Vabc[0]), op("Vb", r.Vabc[1]), op("Vc", r.Vabc[2]), op("I_E", r.Ie), op("I\"_k", r.Ik)},
			Notes: []string{seqNote, "Z1, Z2, Z0 are the sequence impedances seen from the fault, on its voltage level; motors and generators are included only as far as they are in them"}, Cautions: calc.CautionsOf(calc.CautionFault, calc.CautionMains),
		},
	}
	if err := checkSteps(r.Steps); err != nil {
		return UnsymResult{}, err
	}
	return r, nil
}

// phases returns Xa, Xb, Xc from X0, X1, X2 (ABC rotation), with parts that
// cancel to rounding set to 0.
func phases(x0, x1, x2 complex128) (xa, xb, xc complex128) {
	a := complex(-0.5, math.Sqrt(3)/2)
	a2 := complex(-0.5, -math.Sqrt(3)/2)
	scale := cmplx.Abs(x0) + cmplx.Abs(x1) + cmplx.Abs(x2)
	return snap(x0+x1+x2, scale), snap(x0+a2*x1+a*x2, scale), snap(x0+a*x1+a2*x2, scale)
}

// snap returns 0 for a value that is rounding noise against scale: a
// bolted fault's voltage or a healthy phase's current is nothing, not
// femtoamperes.
func snap(z complex128, scale float64) complex128 {
	if cmplx.Abs(z) <= 1e-12*scale {
		return 0
	}
	re, im := real(z), imag(z)
	if math.Abs(re) <= 1e-12*scale {
		re = 0
	}
	if math.Abs(im) <= 1e-12*scale {
		im = 0
	}
	return complex(re, im)
}
