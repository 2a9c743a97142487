package power

import (
	"math"
	"math/cmplx"
	"strings"
	"testing"

	"argand/calc"
)

func hasNote(notes []string, sub string) bool {
	for _, n := range notes {
		if strings.Contains(n, sub) {
			return true
		}
	}
	return false
}

// withCautions adds the whole text of each caution to the notes.
func withCautions(notes []string, cs []calc.StepCaution) []string {
	out := append([]string(nil), notes...)
	for _, c := range cs {
		out = append(out, c.Topic.Text())
	}
	return out
}

// cautionsIn checks a PFC result's notes for the three cautions: stored
// charge, harmonic resonance and qualified installation, and the safety
// text of shared DESIGN.md.
func cautionsIn(t *testing.T, what string, notes []string) {
	t.Helper()
	for _, sub := range []string{"lethal charge", "resonance", "qualified", "local electrical codes", "not a substitute for measurement"} {
		if !hasNote(notes, sub) {
			t.Errorf("%s: no caution mentioning %q in %q", what, sub, notes)
		}
	}
}

func TestCorrect(t *testing.T) {
	cases := []struct {
		name    string
		p, pf1  float64
		lead1   bool
		pf2     float64
		lead2   bool
		v       float64
		ph      Phases
		needed  bool
		qc      float64 // var
		c       float64 // single-phase C, F
		cy, cd  float64 // three-phase per-phase C, F
		i1, i2  float64
		verdict string
	}{
		// Hand calculation: 1840 W at 0.8 lagging on 230 V 50 Hz corrected
		// to unity: Q_c = 1840·0.75 = 1380 var; C = 1380/(2π·50·230²) =
		// 83.037 361 613 163 µF; I: 2300/230 = 10 A → 1840/230 = 8 A
		// (formula evaluated in 30-digit decimal arithmetic).
		{"single to unity", 1840, 0.8, false, 1, false, 230, SinglePhase, true, 1380, 83.0373616131627839e-6, 0, 0, 10, 8, "raise"},
		// Hand calculation: 100 kW at 0.75 lagging on 400 V 50 Hz
		// three-phase to 0.95 lagging: tan φ₁ = 0.881 917 103 688 197,
		// tan φ₂ = 0.328 684 105 178 863, Q_c = 55 323.299 850 933 var,
		// C_Y = 1100.622 079 928 9 µF, C_Δ = 366.874 026 642 97 µF,
		// I₁ = 192.450 089 729 875 A, I₂ = 151.934 281 365 691 A
		// (formula evaluated in 30-digit decimal arithmetic).
		{"three-phase 0.75 to 0.95", 100e3, 0.75, false, 0.95, false, 400, ThreePhase, true, 55323.2998509333800, 0,
			1100.62207992889548e-6, 366.874026642965159e-6, 192.450089729875255, 151.934281365690991, "raise"},
		// target below the present PF: nothing to do (common practice)
		{"already better", 1000, 0.95, false, 0.9, false, 230, SinglePhase, false, 0, 0, 0, 0, 1000 / 0.95 / 230, 1000 / 0.95 / 230, "no correction needed"},
		{"equal", 1000, 0.9, false, 0.9, false, 230, SinglePhase, false, 0, 0, 0, 0, 1000 / 0.9 / 230, 1000 / 0.9 / 230, "no correction needed"},
		// a leading load and a lagging target: capacitors make it worse
		{"leading load", 1000, 0.8, true, 0.9, false, 230, SinglePhase, false, 0, 0, 0, 0, 1250.0 / 230, 1250.0 / 230, "reactor"},
		// lagging load to a leading target: Q_c = P·(0.75 + tan φ₂)
		{"to leading", 1000, 0.8, false, 0.9, true, 230, SinglePhase, true, 1000 * (0.75 + math.Sqrt(1-0.81)/0.9),
			1000 * (0.75 + math.Sqrt(1-0.81)/0.9) / (2 * math.Pi * 50 * 230 * 230), 0, 0, 1250.0 / 230, 1000 / 0.9 / 230, "raise"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			s1 := c.lead1
			sense := Lagging
			if s1 {
				sense = Leading
			}
			load, _, err := FromPF(watt(c.p), c.pf1, sense)
			if err != nil {
				t.Fatal(err)
			}
			k, steps, err := Correct(Target{Load: load.S, PF: c.pf2, Leading: c.lead2, V: volt(complex(c.v, 0)), Freq: 50, Phases: c.ph})
			if err != nil {
				t.Fatal(err)
			}
			if k.Needed != c.needed {
				t.Errorf("needed = %v", k.Needed)
			}
			got := []struct {
				name      string
				got, want float64
			}{
				{"Qc", real(k.Qc.V), c.qc}, {"C", real(k.C.V), c.c}, {"CY", real(k.CY.V), c.cy}, {"CΔ", real(k.CDelta.V), c.cd},
				{"I1", real(k.I1.V), c.i1}, {"I2", real(k.I2.V), c.i2},
			}
			for _, g := range got {
				if !near(g.got, g.want) {
					t.Errorf("%s = %.15g, want %.15g", g.name, g.got, g.want)
				}
			}
			if k.Qc.Kind != calc.KindReactive || k.Qc.Dim != calc.DimPower {
				t.Errorf("Qc kind %v", k.Qc.Kind)
			}
			if !hasNote(k.Notes, c.verdict) {
				t.Errorf("notes %q lack %q", k.Notes, c.verdict)
			}
			cautionsIn(t, "Correction.Notes", withCautions(k.Notes, k.Cautions))
			for _, st := range steps {
				cautionsIn(t, "step "+st.Rule, withCautions(st.Notes, st.Cautions))
			}
			if len(steps) != 3 {
				t.Errorf("%d steps", len(steps))
			}
		})
	}
}

// TestCorrectIdentities checks the common-practice relations on a grid of
// loads and targets: Q_c = P·(tan φ₁ − tan φ₂); C_Y = 3·C_Δ; the corrected
// power is the load plus the capacitors' −jQ_c; its PF equals the target.
func TestCorrectIdentities(t *testing.T) {
	for _, pf1 := range []float64{0.3, 0.5, 0.7, 0.8, 0.85} {
		for _, pf2 := range []float64{0.9, 0.95, 0.98, 1} {
			for _, ph := range []Phases{SinglePhase, ThreePhase} {
				for _, f := range []float64{50, 60} {
					const p = 37e3
					load, _, _ := FromPF(watt(p), pf1, Lagging)
					k, _, err := Correct(Target{Load: load.S, PF: pf2, V: volt(415), Freq: f, Phases: ph})
					if err != nil {
						t.Fatal(err)
					}
					tan := func(pf float64) float64 { return math.Sqrt(1-pf*pf) / pf }
					if !near(real(k.Qc.V), p*(tan(pf1)-tan(pf2))) {
						t.Errorf("pf %v→%v: Qc %v", pf1, pf2, k.Qc.V)
					}
					if !nearC(load.S.V-complex(0, real(k.Qc.V)), k.After.S.V) {
						t.Errorf("S₂ = %v, S₁ − jQc = %v", k.After.S.V, load.S.V-complex(0, real(k.Qc.V)))
					}
					if !near(k.After.PF.Value, pf2) {
						t.Errorf("PF after %v, want %v", k.After.PF.Value, pf2)
					}
					w := 2 * math.Pi * f
					if ph == ThreePhase {
						if !near(real(k.CY.V), 3*real(k.CDelta.V)) {
							t.Errorf("CY %v ≠ 3·CΔ %v", k.CY.V, k.CDelta.V)
						}
						// Δ: each of three capacitors at V_L supplies Q_c/3 =
						// ω·C_Δ·V_L²; Y: each at V_L/√3 supplies ω·C_Y·V_L²/3.
						if !near(3*w*real(k.CDelta.V)*415*415, real(k.Qc.V)) || !near(w*real(k.CY.V)*415*415, real(k.Qc.V)) {
							t.Errorf("bank reactive power does not give back Qc")
						}
					} else if !near(w*real(k.C.V)*415*415, real(k.Qc.V)) {
						t.Errorf("ω·C·V² = %v, want %v", w*real(k.C.V)*415*415, k.Qc.V)
					}
				}
			}
		}
	}
}

func TestCorrectErrors(t *testing.T) {
	ok := Target{Load: va(1000 + 750i), PF: 0.95, V: volt(230), Freq: 50, Phases: SinglePhase}
	cases := []struct {
		name string
		mod  func(*Target)
		want string
	}{
		{"target 0", func(t *Target) { t.PF = 0 }, "target PF"},
		{"target > 1", func(t *Target) { t.PF = 1.01 }, "target PF"},
		{"no freq", func(t *Target) { t.Freq = 0 }, "frequency"},
		{"zero V", func(t *Target) { t.V = volt(0) }, "voltage is 0"},
		{"V current", func(t *Target) { t.V = amp(1) }, "V must be a voltage"},
		{"delivering", func(t *Target) { t.Load = va(-1000 + 750i) }, "P > 0"},
		{"phases", func(t *Target) { t.Phases = 2 }, "single- or three-phase"},
	}
	for _, c := range cases {
		tg := ok
		c.mod(&tg)
		_, _, err := Correct(tg)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: err = %v, want %q", c.name, err, c.want)
		}
	}
}

// TestRerate: Q ∝ V² for a capacitor (common practice). Hand calculation:
// 50 kvar rated at 440 V gives 50·(400/440)² = 41.322 314 049 586 8 kvar at
// 400 V.
func TestRerate(t *testing.T) {
	cases := []struct {
		qr, v, vr, want float64
		above           bool
	}{
		{50e3, 400, 440, 41322.3140495867769, false},
		{10e3, 460, 230, 40e3, true},
		{10e3, 230, 230, 10e3, false},
	}
	for _, c := range cases {
		q, steps, err := Rerate(varQ(c.qr), volt(complex(c.v, 0)), volt(complex(c.vr, 0)))
		if err != nil {
			t.Fatal(err)
		}
		if !near(real(q.V), c.want) || q.Kind != calc.KindReactive {
			t.Errorf("Q = %v, want %v", q.V, c.want)
		}
		cautionsIn(t, "rerate", withCautions(steps[0].Notes, steps[0].Cautions))
		if hasNote(steps[0].Notes, "above its rated voltage") != c.above {
			t.Errorf("overvoltage note: %q", steps[0].Notes)
		}
	}
	if _, _, err := Rerate(varQ(1), volt(1), volt(0)); err == nil {
		t.Error("Vr = 0 accepted")
	}
}

// TestResonanceOrder: h ≈ √(S_sc/Q_c) (common practice).
func TestResonanceOrder(t *testing.T) {
	cases := []struct {
		ssc, qc, h float64
		near       int
	}{
		{10e6, 400e3, 5, 5},  // √25
		{20e6, 200e3, 10, 0}, // √100, between 7 and 11
		{49e6, 1e6, 7, 7},    // √49
		{13.5 * 13.5 * 1e5, 1e5, 13.5, 13},
	}
	for _, c := range cases {
		r, steps, err := ResonanceOrder(va(complex(c.ssc, 0)), varQ(c.qc))
		if err != nil {
			t.Fatal(err)
		}
		if !near(r.Order, c.h) || r.Near != c.near {
			t.Errorf("h = %v near %d, want %v near %d", r.Order, r.Near, c.h, c.near)
		}
		if hasNote(steps[0].Notes, "warning: the resonance order") != (c.near != 0) {
			t.Errorf("warning note %q", steps[0].Notes)
		}
		cautionsIn(t, "harmonic", withCautions(steps[0].Notes, steps[0].Cautions))
	}
	if _, _, err := ResonanceOrder(va(1e6), varQ(0)); err == nil {
		t.Error("Qc = 0 accepted")
	}
}

// TestDischarge: t = R·C·ln(V0/V_safe) (common practice), both ways.
// Hand calculation: 100 µF charged to the peak of 400 V rms (565.685 V),
// to 50 V in 60 s: R = 60/(1e-4·ln(565.685/50)) = 247 319.149 866 68 Ω
// (formula evaluated in 30-digit decimal arithmetic).
func TestDischarge(t *testing.T) {
	c := calc.Real(100e-6, calc.DimCapacitance)
	v0 := volt(complex(math.Sqrt2*400, 0))
	r, steps, err := DischargeResistance(c, v0, volt(50), calc.Real(60, calc.DimTime))
	if err != nil {
		t.Fatal(err)
	}
	if !near(real(r.V), 247319.149866679441) || r.Dim != calc.DimImpedance {
		t.Errorf("R = %v", r.V)
	}
	cautionsIn(t, "discharge", withCautions(steps[0].Notes, steps[0].Cautions))
	if !hasNote(steps[0].Notes, "√2·V_rms") {
		t.Errorf("no peak note: %q", steps[0].Notes)
	}
	tt, steps, err := DischargeTime(r, c, v0, volt(50))
	if err != nil || !near(real(tt.V), 60) {
		t.Errorf("t = %v, %v", tt.V, err)
	}
	cautionsIn(t, "dischargetime", withCautions(steps[0].Notes, steps[0].Cautions))

	bad := []struct {
		name            string
		c, v0, vs, time calc.Quantity
		want            string
	}{
		{"safe above", c, volt(50), volt(60), calc.Real(1, calc.DimTime), "must be below"},
		{"safe equal", c, volt(50), volt(50), calc.Real(1, calc.DimTime), "must be below"},
		{"safe zero", c, volt(50), volt(0), calc.Real(1, calc.DimTime), "never reaches"},
		{"no C", calc.Real(0, calc.DimCapacitance), volt(50), volt(5), calc.Real(1, calc.DimTime), "C must be above 0"},
		{"no t", c, volt(50), volt(5), calc.Real(0, calc.DimTime), "t must be above 0"},
		{"C in H", calc.Real(1, calc.DimInductance), volt(50), volt(5), calc.Real(1, calc.DimTime), "C must be a capacitance"},
	}
	for _, b := range bad {
		_, _, err := DischargeResistance(b.c, b.v0, b.vs, b.time)
		if err == nil || !strings.Contains(err.Error(), b.want) {
			t.Errorf("%s: err = %v, want %q", b.name, err, b.want)
		}
	}
}

// TestPFCBasis: the capacitor for one correction does not depend on how
// the voltage phasor is written: V on the peak basis is √2 times V on the
// RMS basis and gives the same C and Q_c (Q_c = ω·C·V_rms², common
// practice); the currents follow the basis (I_pk = √2·I_rms).
func TestPFCBasis(t *testing.T) {
	call := func(b calc.Basis, v float64) calc.Result {
		t.Helper()
		c := &calc.Context{Freq: 50, Basis: b, Sequence: 1}
		var f calc.Func
		for _, x := range Funcs() {
			if x.Name == "pfc" {
				f = x
			}
		}
		args := []calc.Arg{{Q: calc.Quantity{V: 10e3, Dim: calc.DimPower, Kind: calc.KindActive}}, {Q: calc.Number(0.7)}, {Q: calc.Number(0.95)},
			{Q: calc.Real(v, calc.DimVoltage)}, {Word: "single"}}
		r, err := f.Call(c, args)
		if err != nil {
			t.Fatal(err)
		}
		return r
	}
	rms, pk := call(calc.RMS, 230), call(calc.Peak, 230*math.Sqrt2)
	get := func(r calc.Result, k string) complex128 {
		for _, o := range r.Extra {
			if o.Name == k {
				return o.Value.V
			}
		}
		t.Fatalf("no .%s", k)
		return 0
	}
	if !near(real(get(rms, "c")), real(get(pk, "c"))) || !near(real(rms.Value.V), real(pk.Value.V)) {
		t.Errorf("C %v vs %v, Qc %v vs %v", get(rms, "c"), get(pk, "c"), rms.Value.V, pk.Value.V)
	}
	if !near(cmplx.Abs(get(pk, "i1")), math.Sqrt2*cmplx.Abs(get(rms, "i1"))) {
		t.Errorf("peak i1 %v, want √2 × %v", get(pk, "i1"), get(rms, "i1"))
	}
}

// TestPeakCurrentOverflow: on the peak basis the line currents are √2
// times the RMS ones; a current near the largest float must give an error,
// never an infinity (found by TestPropFuncsFinite).
func TestPeakCurrentOverflow(t *testing.T) {
	var f calc.Func
	for _, x := range Funcs() {
		if x.Name == "pfcload" {
			f = x
		}
	}
	c := &calc.Context{Freq: 50, Basis: calc.Peak, Sequence: 1}
	args := []calc.Arg{{Q: calc.Quantity{V: complex(1, math.MaxFloat64), Dim: calc.DimPower, Kind: calc.KindApparent}},
		{Q: calc.Number(1)}, {Q: calc.Real(1, calc.DimVoltage)}, {Word: "three"}}
	r, err := f.Call(c, args)
	if err == nil {
		for _, o := range r.Extra {
			if cmplx.IsInf(o.Value.V) || cmplx.IsNaN(o.Value.V) {
				t.Fatalf(".%s = %v: not finite and no error", o.Name, o.Value.V)
			}
		}
	}
}
