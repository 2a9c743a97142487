package harmonic

import (
	"math"
	"math/cmplx"
	"strings"
	"testing"

	"argand/calc"
)

func q(v complex128, d calc.Dim) calc.Arg { return calc.Arg{Q: calc.Quantity{V: v, Dim: d}} }
func w(s string) calc.Arg                 { return calc.Arg{Word: s, Text: s} }
func plainArg(x float64) calc.Arg         { return calc.Arg{Q: calc.Number(complex(x, 0))} }
func powerArg(x float64, k calc.Kind) calc.Arg {
	return calc.Arg{Q: calc.Quantity{V: complex(x, 0), Dim: calc.DimPower, Kind: k}}
}

// testFuncs returns the functions bound to two example spectra.
func testFuncs(t *testing.T) map[string]calc.Func {
	t.Helper()
	sp := map[string]Spectrum{
		"Iload": build(t, calc.DimCurrent, cases["rectifier current"]),
		"Vbus":  build(t, calc.DimVoltage, cases["flat-top voltage"]),
	}
	noAngle, err := Build([]Entry{{Order: 1, Value: calc.Real(100, calc.DimCurrent)}, {Order: 5, Value: calc.Number(0.2), Percent: true}})
	if err != nil {
		t.Fatal(err)
	}
	sp["Inoangle"] = noAngle
	look := func(n string) (Spectrum, bool) { s, ok := sp[n]; return s, ok }
	out := map[string]calc.Func{}
	for _, f := range Funcs(look, []string{"Iload", "Vbus", "Inoangle"}) {
		out[f.Name] = f
	}
	return out
}

func ctx() *calc.Context {
	return &calc.Context{Freq: 50, Sequence: 1, Format: calc.Format{Digits: 4}}
}

func extra(r calc.Result, key string) (calc.Quantity, bool) {
	for _, x := range r.Extra {
		if x.Name == key {
			return x.Value, true
		}
	}
	return calc.Quantity{}, false
}

// TestCalls runs each function as the worksheet would and checks its
// value against the package's own tested computations, its kind, and the
// cautions beside capacitor-bank results.
func TestCalls(t *testing.T) {
	fs := testFuncs(t)
	iload := build(t, calc.DimCurrent, cases["rectifier current"])
	cs := []struct {
		fn      string
		args    []calc.Arg
		want    float64
		dim     calc.Dim
		kind    calc.Kind
		caution bool
	}{
		{"hrms", []calc.Arg{w("Iload")}, iload.RMS(), calc.DimCurrent, calc.KindMagnitude, false},
		{"thd", []calc.Arg{w("Iload")}, iload.THD(), calc.Dim{}, calc.KindPlain, false},
		{"tdd", []calc.Arg{w("Iload"), q(150, calc.DimCurrent)}, iload.HarmonicRMS() / 150, calc.Dim{}, calc.KindPlain, false},
		{"crest", []calc.Arg{w("Iload")}, iload.wave().Peak() / iload.RMS(), calc.Dim{}, calc.KindPlain, false},
		{"fhl", []calc.Arg{w("Iload")}, iload.FHL(), calc.Dim{}, calc.KindPlain, false},
		{"kfactor", []calc.Arg{w("Iload")}, iload.FHL(), calc.Dim{}, calc.KindPlain, false},
		{"kfactor", []calc.Arg{w("Iload"), q(120, calc.DimCurrent)}, iload.KFactor(120), calc.Dim{}, calc.KindPlain, false},
		{"avgmeter", []calc.Arg{w("Iload")}, SineFormFactor * iload.wave().RectifiedAverage(), calc.DimCurrent, calc.KindMagnitude, true},
		{"bankcheck", []calc.Arg{powerArg(10e6, calc.KindApparent), powerArg(400e3, calc.KindReactive), w("Iload")}, 5, calc.Dim{}, calc.KindPlain, true},
		{"bankcheck", []calc.Arg{powerArg(10e6, calc.KindApparent), powerArg(400e3, calc.KindReactive), w("Iload"), plainArg(0.07)},
			Bank{Ssc: 10e6, Q: 400e3, P: 0.07}.ResonanceOrder(), calc.Dim{}, calc.KindPlain, true},
		{"bankout", []calc.Arg{powerArg(60e3, calc.KindReactive), q(440, calc.DimVoltage), q(400, calc.DimVoltage), plainArg(0.07)},
			60e3 * (400.0 / 440) * (400.0 / 440) / 0.93, calc.DimPower, calc.KindReactive, true},
		{"bankscan", []calc.Arg{powerArg(10e6, calc.KindApparent), powerArg(400e3, calc.KindReactive), q(400, calc.DimVoltage), plainArg(0.07), plainArg(8), plainArg(15)},
			Bank{Ssc: 10e6, Q: 400e3, P: 0.07}.ResonanceOrder(), calc.Dim{}, calc.KindPlain, true},
	}
	for _, c := range cs {
		f := fs[c.fn]
		r, err := f.Call(ctx(), c.args)
		if err != nil {
			t.Errorf("%s: %v", c.fn, err)
			continue
		}
		if r.Value.Dim != c.dim || r.Value.Kind != c.kind || !r.Value.IsReal() {
			t.Errorf("%s: value %v in %v kind %d, want real in %v kind %d", c.fn, r.Value.V, r.Value.Dim, r.Value.Kind, c.dim, c.kind)
		}
		near(t, c.fn, real(r.Value.V), c.want, 1e-12)
		if len(r.Steps) == 0 || r.Steps[0].Rule == "" || r.Steps[0].Formula == "" {
			t.Errorf("%s: no step with rule and formula", c.fn)
		}
		notes := strings.Join(r.Notes, "\n")
		for _, x := range r.Cautions {
			notes += "\n" + x.Topic.Text()
		}
		if c.caution && (!strings.Contains(notes, calc.SafetyText) || strings.HasPrefix(c.fn, "bank") && !strings.Contains(notes, "lethal charge")) {
			t.Errorf("%s: cautions missing: %q", c.fn, notes)
		}
		for _, x := range append(r.Extra, calc.Operand{Value: r.Value}) {
			if _, err := x.Value.Check(c.fn); err != nil {
				t.Errorf("%s.%s: %v", c.fn, x.Name, err)
			}
		}
	}
}

func TestCallPowers(t *testing.T) {
	fs := testFuncs(t)
	r, err := fs["hpower"].Call(ctx(), []calc.Arg{w("Vbus"), w("Iload")})
	if err != nil {
		t.Fatal(err)
	}
	p, err := PowersOf(build(t, calc.DimVoltage, cases["flat-top voltage"]), build(t, calc.DimCurrent, cases["rectifier current"]))
	if err != nil {
		t.Fatal(err)
	}
	kinds := map[string]struct {
		v float64
		k calc.Kind
	}{
		"p": {p.P, calc.KindActive}, "p1": {p.P1, calc.KindActive}, "ph": {p.PH, calc.KindActive},
		"q1": {p.Q1, calc.KindReactive}, "n": {p.N, calc.KindReactive}, "di": {p.DI, calc.KindReactive},
		"dv": {p.DV, calc.KindReactive}, "dh": {p.DH, calc.KindReactive},
		"s1": {p.S1, calc.KindMagnitude}, "sn": {p.SN, calc.KindMagnitude}, "sh": {p.SH, calc.KindMagnitude},
		"pf": {p.PF, calc.KindPlain}, "pf1": {p.PF1, calc.KindPlain},
	}
	if r.Value.Kind != calc.KindMagnitude || real(r.Value.V) != p.S {
		t.Errorf("S = %v kind %d", r.Value.V, r.Value.Kind)
	}
	for key, want := range kinds {
		got, ok := extra(r, key)
		if !ok {
			t.Errorf(".%s missing", key)
			continue
		}
		if got.Kind != want.k || real(got.V) != want.v {
			t.Errorf(".%s = %v kind %d, want %v kind %d", key, got.V, got.Kind, want.v, want.k)
		}
	}
}

func TestCallErrors(t *testing.T) {
	fs := testFuncs(t)
	cs := []struct {
		fn   string
		c    *calc.Context
		args []calc.Arg
		want string
	}{
		{"thd", ctx(), []calc.Arg{q(3, calc.DimCurrent)}, "must be the name of a spectrum"},
		{"thd", ctx(), []calc.Arg{w("nothing")}, "no spectrum named"},
		{"tdd", ctx(), []calc.Arg{w("Vbus"), q(10, calc.DimCurrent)}, "not a current spectrum"},
		{"tdd", ctx(), []calc.Arg{w("Iload"), q(10, calc.DimVoltage)}, "argument 2 (IL)"},
		{"tdd", ctx(), []calc.Arg{w("Iload"), q(-10, calc.DimCurrent)}, "greater than 0"},
		{"tdd", ctx(), []calc.Arg{w("Iload"), q(cmplx.Rect(10, 1), calc.DimCurrent)}, "greater than 0"},
		{"crest", ctx(), []calc.Arg{w("Inoangle")}, "give the angle of order 5"},
		{"avgmeter", ctx(), []calc.Arg{w("Inoangle")}, "angle"},
		{"hpower", ctx(), []calc.Arg{w("Iload"), w("Vbus")}, "voltage spectrum in V first"},
		{"hpower", ctx(), []calc.Arg{w("Vbus"), w("Inoangle")}, "angle"},
		{"fhl", ctx(), []calc.Arg{w("Vbus")}, "voltage spectrum"},
		{"kfactor", ctx(), []calc.Arg{w("Iload"), q(0, calc.DimCurrent)}, "greater than 0"},
		{"detune", ctx(), []calc.Arg{powerArg(50e3, calc.KindReactive), q(400, calc.DimVoltage), plainArg(0), w("three")}, "argument 3 (p)"},
		{"detune", ctx(), []calc.Arg{powerArg(50e3, calc.KindReactive), q(400, calc.DimVoltage), plainArg(1.2), w("three")}, "argument 3 (p)"},
		{"detune", ctx(), []calc.Arg{powerArg(50e3, calc.KindReactive), q(400, calc.DimVoltage), plainArg(0.07), plainArg(3)}, "single or three"},
		{"detune", ctx(), []calc.Arg{q(50, calc.DimCurrent), q(400, calc.DimVoltage), plainArg(0.07), w("three")}, "argument 1 (Qc)"},
		{"bankout", ctx(), []calc.Arg{powerArg(60e3, calc.KindReactive), q(440, calc.DimVoltage), q(400, calc.DimVoltage), plainArg(-0.1)}, "argument 4 (p)"},
		{"bankscan", ctx(), []calc.Arg{powerArg(1e6, calc.KindApparent), powerArg(1e5, calc.KindReactive), q(400, calc.DimVoltage), plainArg(0), plainArg(0), plainArg(2.5)}, "whole number"},
		{"bankscan", ctx(), []calc.Arg{powerArg(1e6, calc.KindApparent), powerArg(1e5, calc.KindReactive), q(400, calc.DimVoltage), plainArg(0), plainArg(0), plainArg(1000)}, "whole number"},
		{"bankcheck", ctx(), []calc.Arg{powerArg(1e6, calc.KindApparent), powerArg(1e5, calc.KindReactive), q(1, calc.DimCurrent)}, "name of a spectrum"},
	}
	for _, c := range cs {
		_, err := fs[c.fn].Call(c.c, c.args)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s%v: error %v, want one containing %q", c.fn, c.args, err, c.want)
		}
	}
}

// TestPeakBasis: a spectrum holds RMS values by definition, so the
// results are the same on the peak basis and the step says why.
func TestPeakBasis(t *testing.T) {
	fs := testFuncs(t)
	peak := ctx()
	peak.Basis = calc.Peak
	for _, fn := range []string{"hrms", "crest", "avgmeter"} {
		a, err := fs[fn].Call(ctx(), []calc.Arg{w("Iload")})
		if err != nil {
			t.Fatal(err)
		}
		b, err := fs[fn].Call(peak, []calc.Arg{w("Iload")})
		if err != nil {
			t.Fatal(err)
		}
		if a.Value != b.Value || !strings.Contains(strings.Join(b.Notes, " "), "RMS by definition") {
			t.Errorf("%s on basis peak: %v (rms: %v), notes %q", fn, b.Value, a.Value, b.Notes)
		}
	}
}

// TestWarnings checks the resonance warning against the orders present.
func TestWarnings(t *testing.T) {
	fs := testFuncs(t)
	// 10 MVA and 400 kvar resonate at order 5 exactly, where Iload has 22 %
	r, err := fs["bankcheck"].Call(ctx(), []calc.Arg{powerArg(10e6, calc.KindApparent), powerArg(400e3, calc.KindReactive), w("Iload")})
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(strings.Join(r.Notes, "\n"), "WARNING: order 5 is present in Iload") {
		t.Errorf("no warning for order 5: %q", r.Notes)
	}
	// detuned at 7 %, the resonance moves down to 3.05, next to the 35 %
	// third harmonic of Iload, which lies below the tuned order 3.78
	r, err = fs["bankcheck"].Call(ctx(), []calc.Arg{powerArg(10e6, calc.KindApparent), powerArg(400e3, calc.KindReactive), w("Iload"), plainArg(0.07)})
	if err != nil {
		t.Fatal(err)
	}
	notes := strings.Join(r.Notes, "\n")
	if !strings.Contains(notes, "WARNING: order 3 is present") || !strings.Contains(notes, "order 3 lies below the tuned order") || strings.Contains(notes, "order 5 is present") {
		t.Errorf("detuned bank notes: %q", notes)
	}
	// at 14 % the resonance falls to about 2.6 and the tuned order 2.67
	// lies below every order present: no warning
	r, err = fs["bankcheck"].Call(ctx(), []calc.Arg{powerArg(10e6, calc.KindApparent), powerArg(400e3, calc.KindReactive), w("Iload"), plainArg(0.14)})
	if err != nil {
		t.Fatal(err)
	}
	notes = strings.Join(r.Notes, "\n")
	if strings.Contains(notes, "WARNING") || !strings.Contains(notes, "no order present in Iload lies within ±0.5") {
		t.Errorf("14 %% detuned bank notes: %q", notes)
	}
	// a delta-connected bank: the capacitor across the line voltage V_C,Δ =
	// √3·(V_C per phase) draws the same var with a third of the star C
	r, err = fs["detune"].Call(ctx(), []calc.Arg{powerArg(50e3, calc.KindReactive), q(400, calc.DimVoltage), plainArg(0.07), w("three")})
	if err != nil {
		t.Fatal(err)
	}
	cy, _ := extra(r, "c")
	cd, _ := extra(r, "cdelta")
	uc, _ := extra(r, "uc")
	qc, _ := extra(r, "qc")
	near(t, "delta capacitors' output", 3*real(uc.V)*real(uc.V)*2*math.Pi*50*real(cd.V), real(qc.V), 1e-12)
	near(t, "C_Δ = C_Y/3", real(cd.V), real(cy.V)/3, 1e-15)
	// capacitors rated below their working voltage
	r, err = fs["detune"].Call(ctx(), []calc.Arg{powerArg(50e3, calc.KindReactive), q(400, calc.DimVoltage), plainArg(0.07), w("three"), q(400, calc.DimVoltage)})
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(strings.Join(r.Notes, "\n"), "WARNING: the capacitors' rated voltage") {
		t.Errorf("no rated-voltage warning: %q", r.Notes)
	}
}

// TestNoNaN feeds extreme arguments to every function: each returns a
// finite value or an error, never NaN or Inf.
func TestNoNaN(t *testing.T) {
	fs := testFuncs(t)
	vals := []calc.Arg{plainArg(0), plainArg(1e-300), plainArg(1e300), plainArg(math.Inf(1)), plainArg(math.NaN()),
		q(1e300, calc.DimVoltage), q(1e-300, calc.DimVoltage), q(1e300, calc.DimCurrent), powerArg(1e300, calc.KindReactive),
		powerArg(1e-300, calc.KindApparent), w("Iload"), w("Vbus"), w("three")}
	for name, f := range fs {
		n := f.Max
		var rec func(args []calc.Arg)
		rec = func(args []calc.Arg) {
			if len(args) >= f.Min {
				r, err := f.Call(ctx(), args)
				if err == nil {
					for _, x := range append(r.Extra, calc.Operand{Name: "value", Value: r.Value}) {
						v := x.Value.V
						if math.IsNaN(real(v)) || math.IsInf(real(v), 0) || math.IsNaN(imag(v)) || math.IsInf(imag(v), 0) {
							t.Fatalf("%s%v: %s = %v", name, args, x.Name, v)
						}
					}
				}
			}
			if len(args) == n || len(args) >= 4 {
				return
			}
			for _, v := range vals {
				rec(append(append([]calc.Arg(nil), args...), v))
			}
		}
		rec(nil)
	}
}
