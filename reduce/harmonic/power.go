package harmonic

import (
	"fmt"
	"math"
	"math/cmplx"

	"argand/calc"
)

// Powers are the quantities of IEEE Std 1459-2010 for a single-phase
// voltage and current that are not sinusoids. Powers in W: P, P1, PH; in
// var: Q1, N, DI, DV, DH; in VA: S, S1, SN, SH.
type Powers struct {
	V, I, V1, I1, VH, IH float64 // RMS values: total, fundamental, harmonic
	S, S1, SN, SH        float64 // apparent: V·I, V1·I1, √(S² − S1²), VH·IH
	P, P1, PH            float64 // active: total, fundamental, P − P1
	Q1                   float64 // fundamental reactive power, V1·I1·sin θ1
	N                    float64 // non-active power √(S² − P²)
	DI, DV, DH           float64 // current, voltage and harmonic distortion power
	PF, PF1              float64 // true P/S and displacement P1/S1
	THDV, THDI           float64
}

// phasor returns the RMS phasor of order h, 0 when absent, and whether
// its angle is known.
func phasor(s Spectrum, h int) (complex128, bool) {
	for _, c := range s.Comps {
		if c.Order == h {
			return cmplx.Rect(c.RMS, c.Angle), c.HasAngle || h == 1 && c.RMS > 0
		}
	}
	return 0, true
}

// PowersOf computes the IEEE Std 1459-2010 quantities of a voltage
// spectrum v and a current spectrum i. At every order present in both,
// the angles of both must be known (the fundamental voltage without an
// angle is the reference, 0°); the fundamental current needs its angle.
//
// The non-active powers are differences of squares, S² − P², which lose
// every digit when P is close to S. They are computed instead as sums of
// squares (Lagrange's identity for complex vectors):
// |V|²·|I|² − (Re⟨V,I⟩)² = Σ_{h<k} |V_h·I_k − V_k·I_h|² + (Im⟨V,I⟩)²,
// with ⟨V,I⟩ = Σ V_h·I_h*.
func PowersOf(v, i Spectrum) (Powers, error) {
	if v.Dim != dimV || i.Dim != dimI {
		return Powers{}, fmt.Errorf("powers need a voltage spectrum in V first and a current spectrum in A second (not spectra of fractions)")
	}
	top := max(v.Max(), i.Max())
	vs := make([]complex128, top+1)
	is := make([]complex128, top+1)
	var missing []int
	for h := 1; h <= top; h++ {
		a, okA := phasor(v, h)
		b, okB := phasor(i, h)
		if h == 1 {
			okA = true
			if c := i.Comps[0]; !c.HasAngle {
				okB = false
			}
		}
		if a != 0 && b != 0 && (!okA || !okB) {
			missing = append(missing, h)
		}
		vs[h], is[h] = a, b
	}
	if len(missing) > 0 {
		return Powers{}, fmt.Errorf("%w: active power at each order needs the angle between its voltage and current; give the angles of order %s in both spectra (the fundamental current's angle is against the fundamental voltage at 0°)", ErrNoAngles, orderList(missing))
	}
	var p Powers
	p.V, p.I = v.RMS(), i.RMS()
	p.V1, p.I1 = v.Fundamental(), i.Fundamental()
	p.VH, p.IH = v.HarmonicRMS(), i.HarmonicRMS()
	p.S, p.S1, p.SH = p.V*p.I, p.V1*p.I1, p.VH*p.IH
	s1 := vs[1] * cmplx.Conj(is[1])
	p.P1, p.Q1 = real(s1), imag(s1)
	for h := 1; h <= top; h++ {
		p.P += real(vs[h] * cmplx.Conj(is[h]))
	}
	for h := 2; h <= top; h++ {
		p.PH += real(vs[h] * cmplx.Conj(is[h]))
	}
	p.N = math.Sqrt(nonActiveSq(vs, is, 1))
	p.DH = math.Sqrt(nonActiveSq(vs, is, 2))
	p.DI, p.DV = p.V1*p.IH, p.VH*p.I1
	p.SN = math.Hypot(math.Hypot(p.DI, p.DV), p.SH)
	if p.S > 0 {
		p.PF = p.P / p.S
	}
	if p.S1 > 0 {
		p.PF1 = p.P1 / p.S1
	}
	p.THDV, p.THDI = p.VH/p.V1, p.IH/p.I1
	return p, nil
}

var (
	dimV = calc.DimVoltage
	dimI = calc.DimCurrent
)

// nonActiveSq returns |V|²·|I|² − (Re Σ V_h·I_h*)² over orders from lo up,
// as a sum of non-negative terms (see PowersOf).
func nonActiveSq(vs, is []complex128, lo int) float64 {
	var sum, im float64
	for h := lo; h < len(vs); h++ {
		im += imag(vs[h] * cmplx.Conj(is[h]))
		for k := h + 1; k < len(vs); k++ {
			d := vs[h]*is[k] - vs[k]*is[h]
			sum += real(d)*real(d) + imag(d)*imag(d)
		}
	}
	return sum + im*im
}
