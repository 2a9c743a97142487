package site

import (
	"errors"
	"fmt"
	"math"
	"math/cmplx"
	"strconv"
	"testing"

	"argand/calc"
)

func near(got, want, rel float64) bool {
	return math.Abs(got-want) <= rel*math.Max(math.Abs(want), 1e-300)
}

func TestComponentsRoundTrip(t *testing.T) {
	// Components → meter readings (V = |Z|·I, P = R·I², Q = X·I²) →
	// components: the inversion must return Z to 1e-9 relative.
	f := 50.0
	w := 2 * math.Pi * f
	tests := []struct {
		name string
		z    complex128
		i    float64
	}{
		{"RL", complex(10, w*0.05), 3},
		{"RC", complex(47, -1/(w*22e-6)), 0.8},
		{"nearly resistive", complex(100, 0.01), 2},
		{"nearly reactive", complex(0.01, 300), 0.5},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			v, p, q := ImpedanceReadings(tc.z, tc.i)
			lag := q > 0
			check := func(how string, c Components) {
				t.Helper()
				if !near(real(c.Z.V), real(tc.z), 1e-9) || !near(imag(c.Z.V), imag(tc.z), 1e-9) {
					t.Errorf("%s: Z = %v, want %v", how, c.Z.V, tc.z)
				}
				// Parallel form draws the same P and Q across V.
				if !near(v*v/real(c.Rp.V), p, 1e-9) || !near(v*v/real(c.Xp.V), q, 1e-9) {
					t.Errorf("%s: parallel form does not draw P and Q", how)
				}
				if lag && !near(real(c.Ls.V)*w, imag(tc.z), 1e-9) {
					t.Errorf("%s: Ls = %g", how, real(c.Ls.V))
				}
				if !lag && !near(-1/(w*real(c.Cs.V)), imag(tc.z), 1e-9) {
					t.Errorf("%s: Cs = %g", how, real(c.Cs.V))
				}
				if len(c.Steps) == 0 {
					t.Errorf("%s: no steps", how)
				}
			}
			c, err := FromVIP(v, tc.i, p, lag, f)
			if err != nil {
				t.Fatal(err)
			}
			check("V, I, P", c)
			c, err = FromVIAngle(v, tc.i, cmplx.Phase(tc.z), f)
			if err != nil {
				t.Fatal(err)
			}
			check("V, I, angle", c)
			c, err = FromPF(p, p/(v*tc.i), v, lag, f)
			if err != nil {
				t.Fatal(err)
			}
			check("P, pf, V", c)
		})
	}
}

func TestComponentsErrors(t *testing.T) {
	if _, err := FromVIP(230, 1, 231, true, 50); !errors.Is(err, ErrInconsistentPower) {
		t.Errorf("P > V·I: got %v", err)
	}
	if _, err := FromVIP(230, 1, -5, true, 50); err == nil {
		t.Error("negative P accepted")
	}
	if _, err := FromVIAngle(230, 1, rad(120), 50); err == nil {
		t.Error("angle beyond 90° accepted")
	}
	if _, err := FromPF(100, 1.2, 230, true, 50); err == nil {
		t.Error("pf above 1 accepted")
	}
	if _, err := FromVIP(math.NaN(), 1, 1, true, 50); err == nil {
		t.Error("NaN accepted")
	}
	// A purely resistive reading: no L or C, and P = V·I exactly.
	c, err := FromVIP(230, 2, 460, true, 50)
	if err != nil {
		t.Fatal(err)
	}
	if !c.XpOpen || c.Ls.V != 0 || c.Cs.V != 0 || real(c.Rs.V) != 115 {
		t.Errorf("resistive: %+v", c)
	}
}

func TestPPToRMS(t *testing.T) {
	// Sinusoid: V_rms = V_pk/√2 = V_pp/(2√2) (handbook formula).
	rms, pk, _, err := PPToRMS(calc.Real(20, calc.DimVoltage))
	if err != nil {
		t.Fatal(err)
	}
	if !near(real(rms.V), 10/math.Sqrt2, 1e-15) || real(pk.V) != 10 || rms.Dim != calc.DimVoltage {
		t.Errorf("rms %v peak %v", rms, pk)
	}
	if _, _, _, err := PPToRMS(calc.Real(-1, calc.DimVoltage)); err == nil {
		t.Error("negative pp accepted")
	}
}

func TestDelayToPhase(t *testing.T) {
	// φ = 360°·f·Δt (definition of phase from time delay), reduced to
	// (−180°, 180°].
	tests := []struct {
		dt, f, deg float64
		leads      string
	}{
		{1e-3, 50, 18, "trace 1 leads"},
		{-1e-3, 50, -18, "trace 2 leads"},
		{10e-3, 50, 180, "antiphase"},
		{15e-3, 50, -90, "trace 2 leads"},
		{0, 60, 0, "in phase"},
		{20e-3, 50, 0, "in phase"},
	}
	for _, tc := range tests {
		d, err := DelayToPhase(tc.dt, tc.f)
		if err != nil {
			t.Fatal(err)
		}
		got := deg(real(d.Phi.V))
		if math.Abs(got-tc.deg) > 1e-9 || d.Leads != tc.leads {
			t.Errorf("Δt %g: %g° %q, want %g° %q", tc.dt, got, d.Leads, tc.deg, tc.leads)
		}
	}
}

func TestRotation(t *testing.T) {
	tests := []struct {
		a, b, c float64
		seq     int
		eb, ec  float64
	}{
		{0, -120, 120, 1, 0, 0},
		{0, 120, -120, -1, 0, 0},
		{30, -88, 152, 1, 2, 2},  // ABC, each lagging/leading 2° off
		{-170, 75, -50, 1, 5, 0}, // relative to A: B at −115°, C at +120°
		{179, 59, -61, 1, 0, 0},  // wraps across ±180°
	}
	for _, tc := range tests {
		r, err := Rotation(rad(tc.a), rad(tc.b), rad(tc.c))
		if err != nil {
			t.Fatal(err)
		}
		eb, ec := deg(real(r.Errors[1].V)), deg(real(r.Errors[2].V))
		if r.Sequence != tc.seq || math.Abs(eb-tc.eb) > 1e-9 || math.Abs(ec-tc.ec) > 1e-9 {
			t.Errorf("%v: %s errors %g %g, want %d %g %g", tc, r.Name, eb, ec, tc.seq, tc.eb, tc.ec)
		}
	}
	if _, err := Rotation(0, 0, 0); err == nil {
		t.Error("three equal angles accepted as a rotation")
	}
}

func TestSeriesTables(t *testing.T) {
	// IEC 60063:2015, from memory: E6/E12/E24 with 2 figures, E48/E96
	// with 3 figures; E48 every other E96 value.
	for _, s := range []struct {
		s Series
		n int
	}{{E6, 6}, {E12, 12}, {E24, 24}, {E48, 48}, {E96, 96}} {
		if s.s.Len() != s.n {
			t.Errorf("%s has %d values, want %d", s.s.Name, s.s.Len(), s.n)
		}
		for i := 1; i < s.s.Len(); i++ {
			if s.s.Value(i) <= s.s.Value(i-1) {
				t.Errorf("%s not sorted at %d", s.s.Name, i)
			}
		}
		if s.s.Value(0) != 1 || s.s.Value(s.n-1) >= 10 {
			t.Errorf("%s does not span one decade", s.s.Name)
		}
	}
	for i := range 48 {
		if E48.values[i] != E96.values[2*i] {
			t.Errorf("E48[%d] = %d, E96[%d] = %d", i, E48.values[i], 2*i, E96.values[2*i])
		}
	}
	// E48 and E96 are 10^(i/n) rounded to three figures.
	for _, s := range []Series{E48, E96} {
		n := s.Len()
		for i := range n {
			want := int(math.Round(100 * math.Pow(10, float64(i)/float64(n))))
			if s.values[i] != want {
				t.Errorf("%s[%d] = %d, 10^(%d/%d) rounds to %d", s.Name, i, s.values[i], i, n, want)
			}
		}
	}
	// E24 keeps the historical values: these differ from 10^(i/24)
	// rounded to two figures (IEC 60063, from memory).
	var odd []int
	for i := range 24 {
		if want := int(math.Round(10 * math.Pow(10, float64(i)/24))); E24.values[i] != want {
			odd = append(odd, E24.values[i])
		}
	}
	want := []int{27, 30, 33, 36, 39, 43, 47, 82}
	if len(odd) != len(want) {
		t.Fatalf("E24 exceptions %v, want %v", odd, want)
	}
	for i := range want {
		if odd[i] != want[i] {
			t.Errorf("E24 exceptions %v, want %v", odd, want)
		}
	}
	// E6 and E12 are subsets of E24 (every 4th and every 2nd value).
	for i := range 12 {
		if E12.values[i] != E24.values[2*i] || (i < 6 && E6.values[i] != E24.values[4*i]) {
			t.Errorf("E6/E12 not subsets of E24 at %d", i)
		}
	}
}

func TestNearest(t *testing.T) {
	tests := []struct {
		x            float64
		s            Series
		below, above float64
		nearest      float64
	}{
		{4600, E24, 4300, 4700, 4700},
		{4700, E24, 4700, 4700, 4700},
		{9.6e-9, E12, 8.2e-9, 10e-9, 10e-9},
		{0.0123, E96, 0.0121, 0.0124, 0.0124},
		{1000, E6, 1000, 1000, 1000},
		{999.9, E6, 680, 1000, 1000},
		{3.49, E48, 3.48, 3.65, 3.48},
	}
	for _, tc := range tests {
		p, err := Nearest(calc.Real(tc.x, calc.DimImpedance), tc.s)
		if err != nil {
			t.Fatal(err)
		}
		if !near(real(p.Below.V), tc.below, 1e-12) || !near(real(p.Above.V), tc.above, 1e-12) || !near(real(p.Nearest.V), tc.nearest, 1e-12) {
			t.Errorf("%g %s: %g %g %g, want %g %g %g", tc.x, tc.s.Name, real(p.Below.V), real(p.Above.V), real(p.Nearest.V), tc.below, tc.above, tc.nearest)
		}
		if !near(p.NearestErr, (tc.nearest-tc.x)/tc.x*100, 1e-9) && tc.nearest != tc.x {
			t.Errorf("%g: error %g %%", tc.x, p.NearestErr)
		}
	}
	if _, err := Nearest(calc.Real(-1, calc.DimImpedance), E24); err == nil {
		t.Error("negative value accepted")
	}
	if _, err := Nearest(calc.Real(math.Inf(1), calc.DimImpedance), E24); err == nil {
		t.Error("infinity accepted")
	}
}

func TestRTemp(t *testing.T) {
	// α20 = 3.93e-3 /K copper and 4.03e-3 /K aluminium (IEC 60228 /
	// IEC 60287-1-1, from memory); R2 = R1·(1 + α20·(T2 − 20)) from 20 °C.
	tests := []struct {
		m      Conductor
		t1, t2 float64
		want   float64
	}{
		{Copper, 20, 70, 1 + 3.93e-3*50},
		{Aluminium, 20, 90, 1 + 4.03e-3*70},
		{Copper, 70, 20, 1 / (1 + 3.93e-3*50)},
		{Copper, 20, 20, 1},
	}
	for _, tc := range tests {
		r, _, err := RTemp(calc.Real(1, calc.DimImpedance), tc.t1, tc.t2, tc.m)
		if err != nil {
			t.Fatal(err)
		}
		if !near(real(r.V), tc.want, 1e-12) {
			t.Errorf("%s %g→%g: %g, want %g", tc.m.Name, tc.t1, tc.t2, real(r.V), tc.want)
		}
	}
	if _, _, err := RTemp(calc.Real(1, calc.DimImpedance), 20, -300, Copper); err == nil {
		t.Error("−300 °C accepted")
	}
}

func TestCableDrop(t *testing.T) {
	tests := []struct {
		name string
		c    Cable
	}{
		{"single-phase lagging", Cable{R: 1.83e-3, X: 0.1e-3, Length: 40, Vs: 230, I: 20, PF: 0.85}},
		{"three-phase lagging", Cable{R: 0.387e-3, X: 0.08e-3, Length: 120, ThreePhase: true, Vs: 400, I: 150, PF: 0.8}},
		{"three-phase leading", Cable{R: 0.387e-3, X: 0.08e-3, Length: 120, ThreePhase: true, Vs: 400, I: 150, PF: 0.9, Leading: true}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			r, err := CableDrop(tc.c)
			if err != nil {
				t.Fatal(err)
			}
			c := tc.c
			// Check the phasor equation itself per phase: Vs∠0 = Vload + Z·I,
			// with I at −φ (lagging) or +φ (leading) from Vload.
			vl := r.Vload.V
			vs := complex(c.Vs, 0)
			if c.ThreePhase {
				vl /= complex(math.Sqrt(3), 0)
				vs /= complex(math.Sqrt(3), 0)
			}
			phi := math.Acos(c.PF)
			if c.Leading {
				phi = -phi
			}
			i := cmplx.Rect(c.I, cmplx.Phase(vl)-phi)
			if got := vl + r.Zloop.V*i; cmplx.Abs(got-vs) > 1e-9*c.Vs {
				t.Errorf("Vload + Z·I = %v, want %v", got, vs)
			}
			// Approximation by hand: k·I·(R cos φ + X sin φ)·L.
			k := 2.0
			if c.ThreePhase {
				k = math.Sqrt(3)
			}
			want := k * c.I * (c.R*c.PF + c.X*math.Sin(phi)) * c.Length
			if !near(real(r.Approx.V), want, 1e-12) {
				t.Errorf("approx %g, want %g", real(r.Approx.V), want)
			}
			// For small drops the approximation is within a few per cent of
			// the exact drop (common practice).
			if math.Abs(real(r.Diff.V)) > 0.05*math.Abs(real(r.Drop.V)) {
				t.Errorf("exact %g vs approx %g", real(r.Drop.V), real(r.Approx.V))
			}
			if !near(r.DropPct, real(r.Drop.V)/c.Vs*100, 1e-12) {
				t.Errorf("drop %% %g", r.DropPct)
			}
		})
	}
	if _, err := CableDrop(Cable{R: 1, X: 1, Length: 1000, Vs: 230, I: 100, PF: 0.5}); err == nil {
		t.Error("impossible load accepted")
	}
	if _, err := CableDrop(Cable{R: 1e-3, Length: 10, Vs: 230, I: 10, PF: 1.5}); err == nil {
		t.Error("pf 1.5 accepted")
	}
}

func TestTransformerAndFault(t *testing.T) {
	// Hand calculation: 1000 kVA, 11 kV/415 V, 5 %: I_rated = 1e6/(√3·415)
	// = 1391.2 A, I_sc = I_rated/(%Z/100) (common practice) = 27 824 A.
	n := Nameplate{S: 1e6, V1: 11e3, V2: 415, PctZ: 5, XR: 6}
	x, err := Transformer(n)
	if err != nil {
		t.Fatal(err)
	}
	irated := 1e6 / (math.Sqrt(3) * 415)
	if !near(real(x.I2.V), irated, 1e-12) || !near(real(x.Isc2.V), irated/0.05, 1e-12) {
		t.Errorf("I2 %g Isc2 %g", real(x.I2.V), real(x.Isc2.V))
	}
	if !near(cmplx.Abs(x.Z2.V), 0.05*415*415/1e6, 1e-12) || !near(imag(x.Z2.V)/real(x.Z2.V), 6, 1e-12) {
		t.Errorf("Z2 %v", x.Z2.V)
	}
	if !near(cmplx.Abs(x.Z1.V)/cmplx.Abs(x.Z2.V), (11e3/415)*(11e3/415), 1e-12) {
		t.Error("Z1/Z2 is not a²")
	}
	// Infinite bus through FaultLevel agrees with I_rated/(%Z/100).
	fr, err := FaultLevel(Fault{Xfmr: n})
	if err != nil {
		t.Fatal(err)
	}
	if !near(real(fr.IscTerminals.V), irated/0.05, 1e-12) {
		t.Errorf("terminals %g", real(fr.IscTerminals.V))
	}
	// With a 250 MVA supply (pure reactance) and 50 m of cable, by hand in
	// ohms on the 415 V side.
	f := Fault{Xfmr: n, SourceVA: 250e6, CableR: 0.125e-3, CableX: 0.07e-3, CableLength: 50}
	fr, err = FaultLevel(f)
	if err != nil {
		t.Fatal(err)
	}
	zs := complex(0, 415*415/250e6)
	zt := cmplx.Rect(0.05*415*415/1e6, math.Atan(6))
	zc := complex(0.125e-3, 0.07e-3) * 50
	if want := 415 / (math.Sqrt(3) * cmplx.Abs(zs+zt+zc)); !near(real(fr.IscEnd.V), want, 1e-12) {
		t.Errorf("cable end %g, want %g", real(fr.IscEnd.V), want)
	}
	if want := 415 / (math.Sqrt(3) * cmplx.Abs(zs+zt)); !near(real(fr.IscTerminals.V), want, 1e-12) {
		t.Errorf("terminals %g, want %g", real(fr.IscTerminals.V), want)
	}
	// The same system solved in per unit on a 100 MVA, 11 kV base must give
	// the same current at the cable end (two independent routes).
	rr, err := SolveRadial(Radial{SBase: 100e6, VBase: 11e3, Fault: true, Sections: []Section{
		{Name: "grid", Kind: SourceSection, FaultVA: 250e6},
		{Name: "T1", Kind: TransformerSection, Z: cmplx.Rect(0.05, math.Atan(6)), PU: true, SRated: 1e6, V1: 11e3, V2: 415},
		{Name: "cable", Kind: LineSection, Z: zc},
		{Name: "motor", Kind: LoadSection, Z: 10},
	}})
	if err != nil {
		t.Fatal(err)
	}
	last := rr.Steps[len(rr.Steps)-1]
	if len(last.Rows) != 3 {
		t.Fatalf("%d rows, want 3 (the load is left out under a fault)", len(last.Rows))
	}
	iend := cmplx.Abs(last.Rows[2].Values[1].Value.V)
	if !near(iend, real(fr.IscEnd.V), 1e-9) {
		t.Errorf("per-unit chain %g A, ohmic %g A", iend, real(fr.IscEnd.V))
	}
	// Bolted fault: the far-end voltage is zero.
	if v := cmplx.Abs(last.Rows[2].Values[2].Value.V); v > 1e-12 {
		t.Errorf("far-end voltage %g pu", v)
	}
	if _, err := Transformer(Nameplate{S: 1e6, V1: 11e3, V2: 415, PctZ: 0}); err == nil {
		t.Error("0 %Z accepted")
	}
}

func TestRebase(t *testing.T) {
	// Z_new = Z_old·(V_old/V_new)²·(S_new/S_old) (common practice), by hand:
	// 0.1 pu on 50 MVA, 132 kV → 100 MVA, 138 kV = 0.2·(132/138)².
	z, _, err := Rebase(complex(0, 0.1), 50e6, 132e3, 100e6, 138e3)
	if err != nil {
		t.Fatal(err)
	}
	want := 0.2 * (132.0 / 138) * (132.0 / 138)
	if !near(imag(z.V), want, 1e-12) || real(z.V) != 0 {
		t.Errorf("rebase %v, want j%g", z.V, want)
	}
	// Round trip through actual ohms: Z_pu·Z_base is the same impedance.
	if !near(0.1*132e3*132e3/50e6, imag(z.V)*138e3*138e3/100e6, 1e-12) {
		t.Error("the ohmic value changed under a base change")
	}
	b, err := Bases(100e6, 11e3)
	if err != nil {
		t.Fatal(err)
	}
	if !near(real(b.Z.V), 1.21, 1e-12) || !near(real(b.I.V), 100e6/(math.Sqrt(3)*11e3), 1e-12) {
		t.Errorf("bases %v %v", b.Z.V, b.I.V)
	}
}

func TestRadialLoad(t *testing.T) {
	// Source 1 pu behind j0.1, line 0.02 + j0.05, load 1 pu resistive, all
	// on the system base: I = 1/(1.02 + j0.15) by hand.
	rr, err := SolveRadial(Radial{SBase: 10e6, VBase: 11e3, Sections: []Section{
		{Name: "src", Kind: SourceSection, Z: complex(0, 0.1), PU: true, SRated: 10e6, VRated: 11e3},
		{Name: "line", Kind: LineSection, Z: complex(0.02, 0.05) * 12.1},
		{Name: "load", Kind: LoadSection, Z: complex(12.1, 0)},
	}})
	if err != nil {
		t.Fatal(err)
	}
	want := 1 / complex(1.02, 0.15)
	if cmplx.Abs(rr.Ipu.V-want) > 1e-12 {
		t.Errorf("I = %v, want %v", rr.Ipu.V, want)
	}
}

func TestRatioAndRefer(t *testing.T) {
	// CT 200/5 A: 3.2 A on the secondary is 128 A on the primary.
	p, _, err := ToPrimary(calc.Real(3.2, calc.DimCurrent), 200, 5)
	if err != nil || !near(real(p.V), 128, 1e-15) {
		t.Errorf("CT: %v %v", p, err)
	}
	s, _, err := ToSecondary(calc.Real(11e3, calc.DimVoltage), 11000, 110)
	if err != nil || !near(real(s.V), 110, 1e-15) {
		t.Errorf("VT: %v %v", s, err)
	}
	if _, _, err := ToPrimary(calc.Real(1, calc.DimImpedance), 200, 5); err == nil {
		t.Error("impedance through a CT accepted")
	}
	// Ideal transformer, a = 10: Z×a², V×a, I÷a to the primary.
	for _, tc := range []struct {
		q    calc.Quantity
		want float64
	}{
		{calc.Real(2, calc.DimImpedance), 200},
		{calc.Real(2, calc.DimVoltage), 20},
		{calc.Real(2, calc.DimCurrent), 0.2},
	} {
		r, _, err := Refer(tc.q, 10, true)
		if err != nil || !near(real(r.V), tc.want, 1e-15) {
			t.Errorf("refer %v: %v %v", tc.q, r, err)
		}
		back, _, _ := Refer(r, 10, false)
		if !near(real(back.V), real(tc.q.V), 1e-15) {
			t.Errorf("refer back %v", back)
		}
	}
}

func TestNoNaN(t *testing.T) {
	// Hostile inputs give errors, never NaN or a panic.
	bad := []float64{math.NaN(), math.Inf(1), math.Inf(-1), 0, -1, 1e300}
	for _, x := range bad {
		s := strconv.FormatFloat(x, 'g', -1, 64)
		if _, err := FromVIAngle(x, 1, 0, 50); err == nil {
			t.Errorf("FromVIAngle V=%s", s)
		}
		if _, err := FromPF(1, 0.9, x, true, 50); err == nil {
			t.Errorf("FromPF V=%s", s)
		}
		if _, err := DelayToPhase(1e-3, x); err == nil {
			t.Errorf("DelayToPhase f=%s", s)
		}
		if _, err := Bases(x, 11e3); err == nil {
			t.Errorf("Bases S=%s", s)
		}
		if _, err := CableDrop(Cable{R: 1e-3, Length: x, Vs: 230, I: 1, PF: 1}); err == nil {
			t.Errorf("CableDrop L=%s", s)
		}
	}
}

// IEC 60063:2015 preferred number series as tabulated in the eseries
// package on the Python registry (MIT licence), which follows IEC 60063;
// recorded in published-examples.md. E24 is the published list; E12 is
// every second E24 value and E6 every second E12 value; E24 cannot be
// generated by rounding 10^(i/24), which gives 26, 29, 32, 35, 38, 42, 46
// and 83 where the table has 27, 30, 33, 36, 39, 43, 47 and 82; E96 equals
// round(100·10^(i/96)).
func TestSeriesPublished(t *testing.T) {
	e24 := []int{10, 11, 12, 13, 15, 16, 18, 20, 22, 24, 27, 30, 33, 36, 39, 43, 47, 51, 56, 62, 68, 75, 82, 91}
	if len(E24.values) != len(e24) {
		t.Fatalf("E24 has %d values, published 24", len(E24.values))
	}
	for i, v := range e24 {
		if E24.values[i] != v {
			t.Errorf("E24[%d] = %d, published %d", i, E24.values[i], v)
		}
		if i%2 == 0 && E12.values[i/2] != v {
			t.Errorf("E12[%d] = %d, published (every second E24) %d", i/2, E12.values[i/2], v)
		}
		if i%4 == 0 && E6.values[i/4] != v {
			t.Errorf("E6[%d] = %d, published (every second E12) %d", i/4, E6.values[i/4], v)
		}
	}
	var rounded []int
	for i, v := range e24 {
		if r := int(math.Round(10 * math.Pow(10, float64(i)/24))); r != v {
			rounded = append(rounded, r)
		}
	}
	if want := []int{26, 29, 32, 35, 38, 42, 46, 83}; fmt.Sprint(rounded) != fmt.Sprint(want) {
		t.Errorf("rounding 10^(i/24) differs from the table at %v, published %v", rounded, want)
	}
	for i := range 96 {
		if want := int(math.Round(100 * math.Pow(10, float64(i)/96))); E96.values[i] != want {
			t.Errorf("E96[%d] = %d, published round(100·10^(i/96)) = %d", i, E96.values[i], want)
		}
	}
	// nearest values through the function: 2.87 kΩ lies between E24's
	// 2.7 kΩ and 3.0 kΩ
	p, err := Nearest(calc.Real(2870, calc.DimImpedance), E24)
	if err != nil {
		t.Fatal(err)
	}
	if real(p.Below.V) != 2700 || real(p.Above.V) != 3000 {
		t.Errorf("E24 around 2.87 kΩ: %v and %v, want 2.7 kΩ and 3 kΩ", p.Below.V, p.Above.V)
	}
}
