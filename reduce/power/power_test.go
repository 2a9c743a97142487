package power

import (
	"math"
	"math/cmplx"
	"strings"
	"testing"

	"gonum.org/v1/gonum/integrate/quad"

	"argand/calc"
)

const tol = 1e-9

// near reports whether got agrees with want to tol relative (absolute
// when want is 0).
func near(got, want float64) bool {
	if want == 0 {
		return math.Abs(got) <= tol
	}
	return math.Abs(got-want) <= tol*math.Abs(want)
}

func nearC(got, want complex128) bool {
	m := cmplx.Abs(want)
	if m == 0 {
		return cmplx.Abs(got) <= tol
	}
	return cmplx.Abs(got-want) <= tol*m
}

func volt(v complex128) calc.Quantity { return calc.Q(v, calc.DimVoltage) }
func amp(v complex128) calc.Quantity  { return calc.Q(v, calc.DimCurrent) }
func watt(x float64) calc.Quantity {
	return calc.Quantity{V: complex(x, 0), Dim: calc.DimPower, Kind: calc.KindActive}
}
func va(v complex128) calc.Quantity {
	return calc.Quantity{V: v, Dim: calc.DimPower, Kind: calc.KindApparent}
}

// TestFromPhasors checks S = V·I*, P = Re S, Q = Im S and PF = P/|S| as
// IEEE Std 1459-2010 defines them for the sinusoidal case, on cases whose
// arithmetic is exact by hand.
func TestFromPhasors(t *testing.T) {
	cases := []struct {
		name       string
		v, i       complex128
		basis      calc.Basis
		s          complex128
		pf         float64
		sense      Sense
		delivering bool
	}{
		// IEEE Std 1459-2010: 230 V∠0, 10 A∠−36.87° (8 − j6 A):
		// S = 230·(8 + j6) = 1840 + j1380 VA, |S| = 2300 VA, PF 0.8 lagging.
		{"inductive", 230, 8 - 6i, calc.RMS, 1840 + 1380i, 0.8, Lagging, false},
		// IEEE Std 1459-2010: current leading, S = 1840 − j1380 VA.
		{"capacitive", 230, 8 + 6i, calc.RMS, 1840 - 1380i, 0.8, Leading, false},
		// IEEE Std 1459-2010: resistive, Q = 0, PF 1.
		{"resistive", 230, 10, calc.RMS, 2300, 1, Unity, false},
		// IEEE Std 1459-2010: pure inductance, P = 0, PF 0 lagging.
		{"reactive", 230, -10i, calc.RMS, 2300i, 0, Lagging, false},
		// passive sign convention (IEC 60375): current against the
		// voltage drop, P < 0, the element delivers; PF = P/|S| = −0.8.
		{"delivering", 230, -8 + 6i, calc.RMS, -1840 - 1380i, -0.8, Leading, true},
		// peak phasors: S = ½·V·I* (shared DESIGN.md), 100 V × (2 + j1) A / 2.
		{"peak", 100, 2 - 1i, calc.Peak, 100 + 50i, 100 / math.Sqrt(12500), Lagging, false},
		// rotated reference: 230 V∠90°, I = j(8 − j6) gives the same S.
		{"rotated", 230i, 6 + 8i, calc.RMS, 1840 + 1380i, 0.8, Lagging, false},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			p, steps, err := FromPhasors(volt(c.v), amp(c.i), c.basis)
			if err != nil {
				t.Fatal(err)
			}
			if !nearC(p.S.V, c.s) {
				t.Errorf("S = %v, want %v", p.S.V, c.s)
			}
			if !near(real(p.P.V), real(c.s)) || !near(real(p.Q.V), imag(c.s)) || !near(real(p.Apparent.V), cmplx.Abs(c.s)) {
				t.Errorf("P, Q, |S| = %v, %v, %v", p.P.V, p.Q.V, p.Apparent.V)
			}
			if p.P.Kind != calc.KindActive || p.Q.Kind != calc.KindReactive || p.S.Kind != calc.KindApparent || p.Apparent.Kind != calc.KindMagnitude { // |S| is a magnitude (IEEE Std 1459-2010)
				t.Errorf("kinds %v %v %v %v", p.P.Kind, p.Q.Kind, p.S.Kind, p.Apparent.Kind)
			}
			if !near(p.PF.Value, c.pf) || p.PF.Sense != c.sense {
				t.Errorf("PF = %v, want %v %v", p.PF, c.pf, c.sense)
			}
			if p.Delivering() != c.delivering {
				t.Errorf("delivering = %v", p.Delivering())
			}
			if len(steps) != 1 {
				t.Fatalf("%d steps", len(steps))
			}
			st := steps[0]
			wantF := "S = V·I*"
			if c.basis == calc.Peak {
				wantF = "S = ½·V·I*"
			}
			if !strings.HasPrefix(st.Formula, wantF) || st.Basis != c.basis {
				t.Errorf("formula %q basis %v", st.Formula, st.Basis)
			}
			joined := strings.Join(st.Notes, "\n")
			if c.delivering != strings.Contains(joined, "delivering") {
				t.Errorf("notes %q", joined)
			}
			if c.sense != Unity && !strings.Contains(joined, c.sense.String()) {
				t.Errorf("notes %q lack %q", joined, c.sense)
			}
		})
	}
}

// TestZeroPower: with S = 0 the power factor is undefined and said so
// (IEEE Std 1459-2010 defines PF = P/S, which has no value at S = 0).
func TestZeroPower(t *testing.T) {
	for _, vi := range [][2]complex128{{0, 5}, {230, 0}, {0, 0}} {
		p, steps, err := FromPhasors(volt(vi[0]), amp(vi[1]), calc.RMS)
		if err != nil {
			t.Fatal(err)
		}
		if p.PF.Defined() || p.PF.Value != 0 || p.PF.String() != "undefined (S = 0)" {
			t.Errorf("PF = %+v", p.PF)
		}
		if !strings.Contains(strings.Join(steps[0].Notes, " "), "undefined") {
			t.Errorf("notes %q", steps[0].Notes)
		}
		for _, o := range steps[0].Results {
			if o.Name == "PF" {
				t.Error("PF listed as a result at S = 0")
			}
		}
	}
}

func TestFromPhasorsErrors(t *testing.T) {
	cases := []struct {
		name string
		v, i calc.Quantity
		want string
	}{
		{"swapped", amp(1), volt(1), "V must be a voltage"},
		{"overflow", volt(1e200), amp(1e200), "overflow"},
		{"nan", volt(complex(math.NaN(), 0)), amp(1), "undefined"},
	}
	for _, c := range cases {
		_, _, err := FromPhasors(c.v, c.i, calc.RMS)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: err = %v, want %q", c.name, err, c.want)
		}
	}
}

func TestLoadForms(t *testing.T) {
	cases := []struct {
		name string
		run  func() (Power, error)
		s    complex128
	}{
		// tan φ = 0.6/0.8 = 0.75: 10 kW at 0.8 lagging is 10 + j7.5 kVA
		// (common practice, exact by hand).
		{"P pf lagging", func() (Power, error) { p, _, err := FromPF(watt(10e3), 0.8, Lagging); return p, err }, 10e3 + 7.5e3i},
		{"P pf leading", func() (Power, error) { p, _, err := FromPF(watt(10e3), 0.8, Leading); return p, err }, 10e3 - 7.5e3i},
		{"P unity", func() (Power, error) { p, _, err := FromPF(watt(2e3), 1, Unity); return p, err }, 2e3},
		// 5 kVA at 0.6 leading: P = 3 kW, Q = −4 kvar (hand calculation).
		{"S pf leading", func() (Power, error) { p, _, err := FromApparent(va(5e3), 0.6, Leading); return p, err }, 3e3 - 4e3i},
		{"S pf zero", func() (Power, error) { p, _, err := FromApparent(va(5e3), 0, Lagging); return p, err }, 5e3i},
		// 230 V, 10 A, current lagging by atan(3/4): 1840 + j1380 VA.
		{"V I angle", func() (Power, error) {
			p, _, err := FromVIAngle(volt(230), amp(10), math.Atan2(3, 4), calc.RMS)
			return p, err
		}, 1840 + 1380i},
		{"V I angle peak", func() (Power, error) {
			p, _, err := FromVIAngle(volt(230), amp(10), 0, calc.Peak)
			return p, err
		}, 1150},
	}
	for _, c := range cases {
		p, err := c.run()
		if err != nil {
			t.Errorf("%s: %v", c.name, err)
			continue
		}
		if !nearC(p.S.V, c.s) {
			t.Errorf("%s: S = %v, want %v", c.name, p.S.V, c.s)
		}
	}
}

func TestLoadFormErrors(t *testing.T) {
	cases := []struct {
		name string
		err  error
		want string
	}{
		{"pf 0", second(FromPF(watt(1), 0, Lagging)), "power factor above 0"},
		{"pf > 1", second(FromPF(watt(1), 1.2, Lagging)), "up to 1"},
		{"negative P", second(FromPF(watt(-1), 0.8, Lagging)), "must not be negative"},
		{"complex P", second(FromPF(va(1+1i), 0.8, Lagging)), "not complex"},
		{"sense", second(FromPF(watt(1), 0.8, Undefined)), "lagging or leading"},
		{"S volt", second(FromApparent(volt(1), 0.8, Lagging)), "must be an apparent power"},
	}
	for _, c := range cases {
		if c.err == nil || !strings.Contains(c.err.Error(), c.want) {
			t.Errorf("%s: err = %v, want %q", c.name, c.err, c.want)
		}
	}
}

func second(_ Power, _ []calc.Step, err error) error { return err }

// TestSum adds loads in their complex form (common practice: active and
// reactive powers add, apparent powers do not). Hand calculation: 10 kW at
// 0.8 lagging (10 + j7.5 kVA), 5 kVA at 0.6 leading (3 − j4 kVA) and a
// 2 kW heater: S = 15 + j3.5 kVA, |S| = √237.25 kVA = 15.402 921 800 749 kVA,
// PF = 15/√237.25 = 0.973 841 209 741 79 lagging; three-phase 400 V:
// I = |S|/(√3·400) = 22.232 202 619 923 5 A (formula evaluated in 30-digit
// decimal arithmetic).
func TestSum(t *testing.T) {
	a, _, _ := FromPF(watt(10e3), 0.8, Lagging)
	b, _, _ := FromApparent(va(5e3), 0.6, Leading)
	p, steps, err := Sum([]calc.Quantity{a.S, b.S, watt(2e3)})
	if err != nil {
		t.Fatal(err)
	}
	if !nearC(p.S.V, 15e3+3.5e3i) || !near(real(p.Apparent.V), 15402.9218007493630) {
		t.Errorf("S = %v, |S| = %v", p.S.V, p.Apparent.V)
	}
	if !near(p.PF.Value, 0.973841209741793236) || p.PF.Sense != Lagging {
		t.Errorf("PF = %v", p.PF)
	}
	if len(steps) != 1 || len(steps[0].Rows) != 3 {
		t.Errorf("steps %+v", steps)
	}
	i, _, err := LineCurrent(p.S, volt(400), ThreePhase)
	if err != nil || !near(real(i.V), 22.2322026199234999) {
		t.Errorf("I = %v, %v", i.V, err)
	}
	// single-phase: I = |S|/V
	i1, _, err := LineCurrent(va(2300), volt(230), SinglePhase)
	if err != nil || !near(real(i1.V), 10) {
		t.Errorf("I = %v, %v", i1.V, err)
	}
	if _, _, err := Sum(nil); err == nil {
		t.Error("empty sum accepted")
	}
	if _, _, err := Sum([]calc.Quantity{volt(1)}); err == nil || !strings.Contains(err.Error(), "S1 must be a power") {
		t.Errorf("err = %v", err)
	}
	if _, _, err := LineCurrent(va(1), volt(0), SinglePhase); err == nil {
		t.Error("zero voltage accepted")
	}
}

// TestMotor: hand calculation from a nameplate of example data, 7.5 kW
// output, η = 0.9, PF 0.85 lagging, three-phase 400 V: P_in = 8333.33 W,
// |S| = 9803.921 568 627 VA, Q = 5164.536 153 359 var,
// I = 14.150 741 891 902 6 A (formula evaluated in 30-digit decimal
// arithmetic).
func TestMotor(t *testing.T) {
	m, steps, err := Motor(Nameplate{Output: watt(7500), Efficiency: 0.9, PF: 0.85, Phases: ThreePhase, VLine: volt(400)})
	if err != nil {
		t.Fatal(err)
	}
	checks := []struct {
		name      string
		got, want float64
	}{
		{"P_in", real(m.Input.V), 8333.33333333333333},
		{"P", real(m.P.V), 8333.33333333333333},
		{"|S|", real(m.Apparent.V), 9803.92156862745098},
		{"Q", real(m.Q.V), 5164.53615335918571},
		{"I", real(m.Current.V), 14.1507418919025923},
	}
	for _, c := range checks {
		if !near(c.got, c.want) {
			t.Errorf("%s = %v, want %v", c.name, c.got, c.want)
		}
	}
	if len(steps) != 3 {
		t.Errorf("%d steps", len(steps))
	}
	if _, _, err := Motor(Nameplate{Output: watt(7500), Efficiency: 0, PF: 0.85, Phases: ThreePhase, VLine: volt(400)}); err == nil {
		t.Error("zero efficiency accepted")
	}
}

// TestSine checks V_rms = V_pk/√2 and the rectified average 2·V_pk/π
// (common practice) against numerical integration of sin over a cycle with
// gonum's Gauss–Legendre quadrature, an independent solver.
func TestSine(t *testing.T) {
	const n = 64
	ms := quad.Fixed(func(x float64) float64 { s := math.Sin(x); return s * s }, 0, 2*math.Pi, n, quad.Legendre{}, 0) / (2 * math.Pi)
	rmsRatio := math.Sqrt(ms)
	// |sin| is smooth on a half cycle, where it equals sin
	avgRatio := quad.Fixed(math.Sin, 0, math.Pi, n, quad.Legendre{}, 0) / math.Pi
	plain := quad.Fixed(math.Sin, 0, 2*math.Pi, n, quad.Legendre{}, 0) / (2 * math.Pi)
	if math.Abs(plain) > 1e-12 {
		t.Errorf("plain average %v", plain)
	}
	for _, pk := range []float64{100, 325.2691193458119, 1e-6, 7e5} {
		s, steps, err := SineFromPeak(volt(complex(pk, 0)))
		if err != nil {
			t.Fatal(err)
		}
		if !near(real(s.RMS.V), pk*rmsRatio) || !near(real(s.RectAvg.V), pk*avgRatio) {
			t.Errorf("pk %v: rms %v avg %v", pk, s.RMS.V, s.RectAvg.V)
		}
		if !strings.Contains(strings.Join(steps[0].Notes, " "), "plain average of a sinusoid over a whole cycle is 0") {
			t.Errorf("notes %q", steps[0].Notes)
		}
		back, _, err := SineFromRMS(s.RMS)
		if err != nil || !nearC(back.Peak.V, complex(pk, 0)) {
			t.Errorf("peak from rms: %v %v", back.Peak.V, err)
		}
		back, _, err = SineFromRectAvg(s.RectAvg)
		if err != nil || !nearC(back.Peak.V, complex(pk, 0)) || !nearC(back.RMS.V, s.RMS.V) {
			t.Errorf("peak from avg: %v %v", back.Peak.V, err)
		}
	}
	// hand calculation (30-digit decimal): 100/√2 = 70.710 678 118 654 75,
	// 200/π = 63.661 977 236 758 13
	s, _, _ := SineFromPeak(volt(100))
	if !near(real(s.RMS.V), 70.7106781186547524) || !near(real(s.RectAvg.V), 63.6619772367581343) {
		t.Errorf("rms %v avg %v", s.RMS.V, s.RectAvg.V)
	}
	// a phasor keeps its angle through peak ↔ RMS
	s, _, _ = SineFromPeak(volt(cmplx.Rect(100, 0.5)))
	if !near(cmplx.Phase(s.RMS.V), 0.5) || s.RectAvg.V != complex(real(s.RectAvg.V), 0) {
		t.Errorf("phasor: %v %v", s.RMS.V, s.RectAvg.V)
	}
	if _, _, err := SineFromPeak(calc.Angle(1)); err == nil {
		t.Error("angle accepted")
	}
}

func TestPhiRange(t *testing.T) {
	// angles in (−180°, 180°] (shared DESIGN.md): −1840 − j0 VA is at +π
	p, err := Of(complex(-1840, math.Copysign(0, -1)))
	if err != nil || p.Phi() != math.Pi {
		t.Errorf("Phi = %v, %v", p.Phi(), err)
	}
	p, _ = Of(1840 + 1380i)
	if !near(p.Phi(), math.Atan2(3, 4)) {
		t.Errorf("Phi = %v", p.Phi())
	}
}

// TestCurrentBasis: the current from S and V satisfies S = V·I* on the
// RMS basis and S = ½·V·I* on the peak basis (IEEE Std 1459-2010); from a
// magnitude |S| only |I| is known, and it is named a magnitude.
func TestCurrentBasis(t *testing.T) {
	s := calc.Quantity{V: 8000 + 6000i, Dim: calc.DimPower, Kind: calc.KindApparent}
	v := volt(230)
	for _, b := range []calc.Basis{calc.RMS, calc.Peak} {
		half := 1.0
		if b == calc.Peak {
			half = 0.5
		}
		i, _, err := Current(s, v, SinglePhase, b, 1)
		if err != nil {
			t.Fatal(err)
		}
		if got := complex(half, 0) * v.V * cmplx.Conj(i.V); !near(real(got), 8000) || !near(imag(got), 6000) {
			t.Errorf("%v: V·I* = %v, want 8000+j6000", b, got)
		}
		// three-phase: S = 3·V_an·I_a* with V_an = V_L/(√3∠30°) for ABC (common practice)
		i3, _, err := Current(s, volt(400), ThreePhase, b, 1)
		if err != nil {
			t.Fatal(err)
		}
		van := 400 / cmplx.Rect(math.Sqrt(3), math.Pi/6)
		if got := complex(3*half, 0) * van * cmplx.Conj(i3.V); !near(real(got), 8000) || !near(imag(got), 6000) {
			t.Errorf("%v three-phase: 3·V_an·I_a* = %v, want 8000+j6000", b, got)
		}
		m, _, err := Current(calc.Quantity{V: 10e3, Dim: calc.DimPower, Kind: calc.KindMagnitude}, volt(230), SinglePhase, b, 1)
		if err != nil {
			t.Fatal(err)
		}
		if m.Kind != calc.KindMagnitude || !near(real(m.V), 10e3/230/half) {
			t.Errorf("%v: from |S|: %v kind %v, want |I| = %g", b, m.V, m.Kind, 10e3/230/half)
		}
	}
}
