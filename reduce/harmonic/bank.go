package harmonic

import (
	"errors"
	"fmt"
	"math"
	"math/cmplx"

	"argand/calc"
)

// Detuned is a capacitor bank with a series (detuning) reactor, sized for
// an effective output at the supply voltage. Reactances, capacitance and
// inductance are per phase of the star equivalent for a three-phase bank;
// voltages are line-to-line for a three-phase bank.
type Detuned struct {
	P      float64 // reactor ratio X_L/X_C at the fundamental
	N      float64 // tuned order 1/√p
	Rise   float64 // capacitor voltage over supply voltage, 1/(1 − p)
	UC     float64 // capacitor voltage at the fundamental, V/(1 − p)
	XC, XL float64 // Ω
	C, L   float64 // F, H
	QC, QL float64 // var: capacitor output at UC, reactor absorption
	I      float64 // line current, A
	QRated float64 // capacitor rating needed at its rated voltage; 0 when not asked
}

// reactorRatio checks a reactor ratio p: 0 ≤ p < 1 (0 for a bank without
// a reactor; zeroOK says whether that is allowed).
func reactorRatio(p float64, zeroOK bool) error {
	switch {
	case math.IsNaN(p) || p < 0 || p >= 1:
		return fmt.Errorf("the reactor ratio p = X_L/X_C must be from 0 up to (not including) 1, usually a few %%, got %g", p)
	case p == 0 && !zeroOK:
		return errors.New("the reactor ratio p = X_L/X_C must be greater than 0 for a detuned bank (usually a few %, such as 7 %)")
	}
	return nil
}

// Detune sizes a detuned capacitor bank that gives the reactive power q
// (var) at the supply voltage v (line-to-line for three phases) and
// frequency f, with reactor ratio p = X_L/X_C. vr, when above 0, is the
// capacitor's rated voltage, for the rating it must have there. Formulas
// (common practice): X_C − X_L = V²/Q; X_L = p·X_C; the tuned order
// n = 1/√p; the capacitor voltage V/(1 − p); its output Q/(1 − p) and the
// reactor's p·Q/(1 − p); the rating at V_r is Q_C·(V_r/U_C)².
func Detune(q, v, p, f, vr float64, three bool) (Detuned, error) {
	if err := reactorRatio(p, false); err != nil {
		return Detuned{}, err
	}
	if !(q > 0) || !(v > 0) || !(f > 0) {
		return Detuned{}, errors.New("the reactive power, the voltage and the working frequency must be greater than 0")
	}
	d := Detuned{P: p, N: 1 / math.Sqrt(p), Rise: 1 / (1 - p)}
	xeff := v / q * v
	d.XC = xeff / (1 - p)
	d.XL = p * d.XC
	w := calc.Context{Freq: f}.Omega()
	d.C = 1 / (w * d.XC)
	d.L = d.XL / w
	d.UC = v / (1 - p)
	d.QC = q / (1 - p)
	d.QL = p * d.QC
	d.I = v / xeff
	if three {
		d.I /= math.Sqrt(3)
	}
	if vr > 0 {
		d.QRated = d.QC * (vr / d.UC) * (vr / d.UC)
	}
	for _, x := range []float64{d.XC, d.XL, d.C, d.L, d.QC, d.QL, d.I, d.QRated, d.UC} {
		if math.IsInf(x, 0) || math.IsNaN(x) {
			return Detuned{}, errors.New("the result overflows: check the magnitudes given")
		}
	}
	return d, nil
}

// Output is a capacitor bank's output at the supply voltage.
type Output struct {
	Q  float64 // effective output at the supply voltage, var
	UC float64 // capacitor voltage at the fundamental
	QC float64 // capacitor output at UC, var
	QL float64 // reactor absorption, var
}

// BankOutput returns the effective output at supply voltage v of a bank
// whose capacitors are rated qr at vr, with reactor ratio p (0 for none):
// X_C = V_r²/Q_r; Q = V²/(X_C·(1 − p)) = Q_r·(V/V_r)²/(1 − p) (common
// practice).
func BankOutput(qr, vr, v, p float64) (Output, error) {
	if err := reactorRatio(p, true); err != nil {
		return Output{}, err
	}
	if !(qr > 0) || !(vr > 0) || !(v > 0) {
		return Output{}, errors.New("the rating, the rated voltage and the supply voltage must be greater than 0")
	}
	r := v / vr
	o := Output{Q: qr * r * r / (1 - p), UC: v / (1 - p)}
	rc := o.UC / vr
	o.QC = qr * rc * rc
	o.QL = p * o.QC
	if math.IsInf(o.Q, 0) || math.IsInf(o.QC, 0) {
		return Output{}, errors.New("the result overflows: check the magnitudes given")
	}
	return o, nil
}

// Bank is a capacitor bank on a supply, in per unit of V²: the supply's
// short-circuit power Ssc (VA), the bank's effective output Q at the
// supply voltage (var), its reactor ratio p and the supply's X/R at the
// fundamental (0 for a lossless supply).
type Bank struct {
	Ssc, Q, P, XR float64
}

func (b Bank) check() error {
	if err := reactorRatio(b.P, true); err != nil {
		return err
	}
	if !(b.Ssc > 0) || !(b.Q > 0) {
		return errors.New("the short-circuit power and the bank's output must be greater than 0")
	}
	if math.IsNaN(b.XR) || b.XR < 0 {
		return errors.New("the supply's X/R must be 0 (lossless) or more")
	}
	return nil
}

// ResonanceOrder returns the order of parallel resonance between the bank
// and the supply's inductance: h = 1/√(X_s/X_C + p) with X_s/X_C =
// Q·(1 − p)/S_sc, which is √(S_sc/Q) without a reactor (common practice).
func (b Bank) ResonanceOrder() float64 {
	return 1 / math.Sqrt(b.Q*(1-b.P)/b.Ssc+b.P)
}

// impedances returns the supply's and the supply-plus-bank impedance at
// order h, in units where V² = 1 (multiply by V² for ohms). inf reports
// a lossless resonance at exactly h, where the parallel impedance is
// unbounded.
func (b Bank) impedances(h float64) (zs, zp complex128, inf bool) {
	xs := 1 / b.Ssc
	xc := 1 / (b.Q * (1 - b.P))
	rs := 0.0
	if b.XR > 0 {
		rs = xs / b.XR
	}
	zs = complex(rs, h*xs)
	zb := complex(0, h*b.P*xc-xc/h)
	sum := zs + zb
	if cmplx.Abs(sum) <= 1e-14*(cmplx.Abs(zs)+cmplx.Abs(zb)) {
		return zs, 0, true
	}
	return zs, zs * zb / sum, false
}

// Amplification returns |Z_parallel/Z_supply| at order h: how many times
// the bank multiplies the harmonic voltage a harmonic current of that
// order produces. ok is false at a lossless resonance (unbounded).
func (b Bank) Amplification(h float64) (float64, bool) {
	zs, zp, inf := b.impedances(h)
	if inf {
		return 0, false
	}
	return cmplx.Abs(zp) / cmplx.Abs(zs), true
}

// ScanPoint is the supply and supply-plus-bank impedance at one order.
type ScanPoint struct {
	H      float64
	Zs, Zp complex128 // Ω
	Inf    bool       // lossless resonance at exactly this order
}

// MaxScanOrder bounds an impedance scan.
const MaxScanOrder = MaxOrder

// Scan returns the impedance of the supply and of the supply in parallel
// with the bank at orders from 1 to hmax in steps of step, at supply
// voltage v (line-to-line for three phases; the impedances are then per
// phase of the star equivalent).
func (b Bank) Scan(v float64, hmax int, step float64) ([]ScanPoint, error) {
	if err := b.check(); err != nil {
		return nil, err
	}
	if !(v > 0) {
		return nil, errors.New("the supply voltage must be greater than 0")
	}
	if hmax < 2 || hmax > MaxScanOrder {
		return nil, fmt.Errorf("the highest order must be from 2 to %d", MaxScanOrder)
	}
	if !(step > 0) || float64(hmax-1)/step > 100000 {
		return nil, errors.New("the scan step is too small")
	}
	v2 := complex(v*v, 0)
	n := int(math.Round(float64(hmax-1)/step)) + 1
	out := make([]ScanPoint, 0, n)
	for k := 0; k < n; k++ {
		h := 1 + float64(k)*step
		if k == n-1 {
			h = float64(hmax)
		}
		zs, zp, inf := b.impedances(h)
		pt := ScanPoint{H: h, Zs: zs * v2, Zp: zp * v2, Inf: inf}
		if inf {
			pt.Zp = 0
		}
		if math.IsInf(cmplx.Abs(pt.Zs), 0) || math.IsInf(cmplx.Abs(pt.Zp), 0) {
			return nil, errors.New("the impedances overflow: check the magnitudes given")
		}
		out = append(out, pt)
	}
	return out, nil
}
