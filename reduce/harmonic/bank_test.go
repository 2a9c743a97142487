package harmonic

import (
	"math"
	"math/cmplx"
	"testing"

	"argand/calc"
	"argand/reduce/power"
)

// TestDetuneCircuit checks a detuned bank against the circuit it describes:
// per phase of the star equivalent, the capacitor C and reactor L the
// sizing returns are put back in series across V/√3 and solved with
// complex arithmetic. Example data: 50 kvar at 400 V, 50 Hz, p = 7 %,
// capacitors rated 440 V.
func TestDetuneCircuit(t *testing.T) {
	const q, v, p, f, vr = 50e3, 400.0, 0.07, 50.0, 440.0
	d, err := Detune(q, v, p, f, vr, true)
	if err != nil {
		t.Fatal(err)
	}
	w := 2 * math.Pi * f
	z := complex(0, w*d.L-1/(w*d.C))
	i := complex(v/math.Sqrt(3), 0) / z
	uc := cmplx.Abs(i) / (w * d.C) * math.Sqrt(3) // line-to-line
	near(t, "effective output", 3*cmplx.Abs(i)*cmplx.Abs(i)*math.Abs(imag(z)), q, 1e-12)
	near(t, "line current", d.I, cmplx.Abs(i), 1e-12)
	near(t, "capacitor voltage", d.UC, uc, 1e-12)
	near(t, "voltage rise", d.Rise, uc/v, 1e-12)
	near(t, "capacitor output", d.QC, 3*cmplx.Abs(i)*cmplx.Abs(i)/(w*d.C), 1e-12)
	near(t, "reactor absorption", d.QL, 3*cmplx.Abs(i)*cmplx.Abs(i)*w*d.L, 1e-12)
	near(t, "tuned order", d.N, 1/(w*math.Sqrt(d.L*d.C)), 1e-12)
	near(t, "rating at V_r", d.QRated, 3*(vr/math.Sqrt(3))*(vr/math.Sqrt(3))*w*d.C, 1e-12)
	// the usual trade figures (common practice, from memory): a 7 % bank
	// is tuned to about 189 Hz on 50 Hz, a 14 % bank to about 134 Hz
	near(t, "7 % tuning", d.N*f, 189, 0.5/189)
	d14, err := Detune(q, v, 0.14, f, 0, false)
	if err != nil {
		t.Fatal(err)
	}
	near(t, "14 % tuning", d14.N*f, 134, 0.5/134)
	// single-phase: the same circuit across V
	d1, err := Detune(q, v, p, f, 0, false)
	if err != nil {
		t.Fatal(err)
	}
	z1 := complex(0, w*d1.L-1/(w*d1.C))
	i1 := complex(v, 0) / z1
	near(t, "single-phase output", cmplx.Abs(i1)*cmplx.Abs(i1)*math.Abs(imag(z1)), q, 1e-12)
	near(t, "single-phase current", d1.I, cmplx.Abs(i1), 1e-12)
}

// TestBankOutputCircuit rebuilds the capacitor from its rating and solves
// the branch at the supply voltage.
func TestBankOutputCircuit(t *testing.T) {
	const qr, vr, v, f = 60e3, 440.0, 400.0, 50.0
	w := 2 * math.Pi * f
	for _, p := range []float64{0, 0.0567, 0.07, 0.14} {
		o, err := BankOutput(qr, vr, v, p)
		if err != nil {
			t.Fatal(err)
		}
		c := qr / (w * vr * vr) // single-phase equivalent: Q_r = V_r²·ωC
		xc := 1 / (w * c)
		z := complex(0, p*xc-xc)
		i := complex(v, 0) / z
		near(t, "output", o.Q, cmplx.Abs(i)*cmplx.Abs(i)*math.Abs(imag(z)), 1e-12)
		near(t, "capacitor voltage", o.UC, cmplx.Abs(i)*xc, 1e-12)
		near(t, "capacitor output", o.QC, cmplx.Abs(i)*cmplx.Abs(i)*xc, 1e-12)
		if p == 0 {
			// the sinusoidal rerating already in argand agrees
			r, _, err := power.Rerate(vars(qr), calc.Real(v, calc.DimVoltage), calc.Real(vr, calc.DimVoltage))
			if err != nil {
				t.Fatal(err)
			}
			near(t, "rerate", o.Q, r.Mag(), 1e-12)
		}
	}
}

// physical returns the supply's and the bank's R, L, C (single-phase
// equivalent at voltage v) for a Bank, built from its definition.
func physical(b Bank, v, w float64) (rs, ls, c, lb float64) {
	xs := v * v / b.Ssc
	xc := v * v / (b.Q * (1 - b.P))
	if b.XR > 0 {
		rs = xs / b.XR
	}
	return rs, xs / w, 1 / (w * xc), b.P * xc / w
}

func TestResonanceAndScan(t *testing.T) {
	const v, f = 400.0, 50.0
	w := 2 * math.Pi * f
	for _, b := range []Bank{
		{Ssc: 10e6, Q: 400e3},
		{Ssc: 10e6, Q: 400e3, P: 0.07, XR: 8},
		{Ssc: 25e6, Q: 150e3, P: 0.14, XR: 5},
		{Ssc: 2e6, Q: 300e3, XR: 3},
	} {
		rs, ls, c, lb := physical(b, v, w)
		// parallel resonance: the loop reactance ωL_s + ωL_b − 1/(ωC)
		// crosses zero; bisection in the order
		loop := func(h float64) float64 { return h*w*(ls+lb) - 1/(h*w*c) }
		lo, hi := 0.5, 200.0
		for i := 0; i < 200; i++ {
			mid := 0.5 * (lo + hi)
			if loop(mid) < 0 {
				lo = mid
			} else {
				hi = mid
			}
		}
		near(t, "resonance order", b.ResonanceOrder(), 0.5*(lo+hi), 1e-9)
		if b.P == 0 {
			r, _, err := power.ResonanceOrder(va(b.Ssc), vars(b.Q))
			if err != nil {
				t.Fatal(err)
			}
			near(t, "resonance order as harmonic()", b.ResonanceOrder(), r.Order, 1e-12)
		}
		pts, err := b.Scan(v, 25, 0.25)
		if err != nil {
			t.Fatal(err)
		}
		if len(pts) != 97 || pts[0].H != 1 || pts[len(pts)-1].H != 25 {
			t.Fatalf("scan: %d points from %g to %g", len(pts), pts[0].H, pts[len(pts)-1].H)
		}
		for _, pt := range pts {
			zs := complex(rs, pt.H*w*ls)
			zb := complex(0, pt.H*w*lb-1/(pt.H*w*c))
			if pt.Inf {
				if cmplx.Abs(zs+zb) > 1e-9*cmplx.Abs(zs) {
					t.Errorf("order %g marked as a resonance, loop impedance %v", pt.H, zs+zb)
				}
				continue
			}
			zp := zs * zb / (zs + zb)
			near(t, "|Z supply|", cmplx.Abs(pt.Zs), cmplx.Abs(zs), 1e-9)
			near(t, "|Z with bank|", cmplx.Abs(pt.Zp), cmplx.Abs(zp), 1e-9)
			a, ok := b.Amplification(pt.H)
			if !ok {
				t.Fatalf("amplification at %g refused", pt.H)
			}
			near(t, "amplification", a, cmplx.Abs(zp)/cmplx.Abs(zs), 1e-9)
		}
	}
	// a lossless bank resonating exactly at an order is marked, never Inf
	b := Bank{Ssc: 10e6, Q: 400e3}
	pts, err := b.Scan(v, 10, 1)
	if err != nil {
		t.Fatal(err)
	}
	if !pts[4].Inf || pts[4].H != 5 {
		t.Errorf("order 5 of a bank resonating at 5: %+v", pts[4])
	}
	if _, ok := b.Amplification(5); ok {
		t.Error("amplification at a lossless resonance should be refused")
	}
}

func TestBankRefusals(t *testing.T) {
	if _, err := Detune(50e3, 400, 0, 50, 0, true); err == nil {
		t.Error("p = 0 accepted for a detuned bank")
	}
	if _, err := Detune(50e3, 400, 1, 50, 0, true); err == nil {
		t.Error("p = 1 accepted")
	}
	if _, err := Detune(50e3, 400, math.NaN(), 50, 0, true); err == nil {
		t.Error("p = NaN accepted")
	}
	if _, err := BankOutput(0, 440, 400, 0); err == nil {
		t.Error("zero rating accepted")
	}
	if _, err := (Bank{Ssc: 1e6, Q: 1e5}).Scan(400, 1, 0.1); err == nil {
		t.Error("hmax 1 accepted")
	}
	if _, err := (Bank{Ssc: 1e6, Q: 1e5}).Scan(400, 25, 1e-9); err == nil {
		t.Error("a scan of 10¹⁰ points accepted")
	}
	if _, err := Detune(1e300, 1e-300, 0.07, 50, 0, true); err == nil {
		t.Error("an overflowing size accepted")
	}
}
