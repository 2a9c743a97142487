package power

import (
	"math"
	"strings"
	"testing"

	"argand/calc"
)

func q(v calc.Quantity) calc.Arg { return calc.Arg{Q: v} }
func w(word string) calc.Arg     { return calc.Arg{Word: word, Text: word} }
func num(x float64) calc.Arg     { return calc.Arg{Q: calc.Number(complex(x, 0))} }

func findFunc(t *testing.T, name string) calc.Func {
	t.Helper()
	for _, f := range Funcs() {
		if f.Name == name {
			return f
		}
	}
	t.Fatalf("no function %q", name)
	return calc.Func{}
}

func extra(r calc.Result, key string) (calc.Quantity, bool) {
	for _, o := range r.Extra {
		if o.Name == key {
			return o.Value, true
		}
	}
	return calc.Quantity{}, false
}

func TestFuncsTable(t *testing.T) {
	seen := map[string]bool{}
	for _, f := range Funcs() {
		if seen[f.Name] {
			t.Errorf("%s twice", f.Name)
		}
		seen[f.Name] = true
		if f.Args == "" || f.Doc == "" || f.Formula == "" || f.Call == nil {
			t.Errorf("%s: missing Args, Doc, Formula or Call", f.Name)
		}
		if f.Min < 0 || (f.Max != -1 && f.Max < f.Min) {
			t.Errorf("%s: Min %d Max %d", f.Name, f.Min, f.Max)
		}
	}
}

// TestFuncs runs each worksheet function on example data; the expected
// values are the hand calculations of power_test.go and pfc_test.go.
func TestFuncs(t *testing.T) {
	ctx := &calc.Context{Freq: 50, Basis: calc.RMS, Sequence: 1}
	cases := []struct {
		fn    string
		args  []calc.Arg
		value complex128
		extra map[string]float64
		note  string // a note the result must carry, "" for none
	}{
		// IEEE Std 1459-2010 definitions, exact by hand
		{"power", []calc.Arg{q(volt(230)), q(amp(8 - 6i))}, 1840 + 1380i, map[string]float64{"p": 1840, "q": 1380, "sa": 2300, "pf": 0.8}, "lagging"},
		{"pf", []calc.Arg{q(va(1840 - 1380i))}, 0.8, nil, "leading"},
		{"load", []calc.Arg{q(watt(10e3)), num(0.8), w("lagging")}, 10e3 + 7.5e3i, map[string]float64{"pf": 0.8}, ""},
		{"loadva", []calc.Arg{q(va(5e3)), num(0.6), w("leading")}, 3e3 - 4e3i, map[string]float64{"sa": 5e3}, ""},
		{"motor", []calc.Arg{q(watt(7500)), num(0.9), num(0.85), w("three"), q(volt(400))}, complex(8333.33333333333333, 5164.53615335918571),
			map[string]float64{"i": 14.1507418919025923, "pin": 8333.33333333333333}, "not a substitute"},
		{"loads", []calc.Arg{q(va(10e3 + 7.5e3i)), q(va(3e3 - 4e3i)), q(watt(2e3))}, 15e3 + 3.5e3i, map[string]float64{"pf": 0.973841209741793236}, ""},
		{"current", []calc.Arg{q(va(2300)), q(volt(230)), w("single")}, 10, nil, ""},
		{"pfc", []calc.Arg{q(watt(1840)), num(0.8), num(1), q(volt(230)), w("single")}, 1380,
			map[string]float64{"c": 83.0373616131627839e-6, "i1": 10, "i2": 8}, "lethal"},
		{"pfc", []calc.Arg{q(watt(100e3)), num(0.75), num(0.95), q(volt(400)), w("three"), w("lagging")}, 55323.2998509333800,
			map[string]float64{"cy": 1100.62207992889548e-6, "cdelta": 366.874026642965159e-6, "i1": 192.450089729875255, "i2": 151.934281365690991}, "resonance"},
		{"pfcload", []calc.Arg{q(va(1840 + 1380i)), num(1), q(volt(230)), w("single")}, 1380, map[string]float64{"c": 83.0373616131627839e-6}, "qualified"},
		{"rerate", []calc.Arg{q(varQ(50e3)), q(volt(400)), q(volt(440))}, 41322.3140495867769, nil, "lethal"},
		{"harmonic", []calc.Arg{q(va(10e6)), q(varQ(400e3))}, 5, map[string]float64{"f": 250}, "warning"},
		{"discharge", []calc.Arg{q(calc.Real(100e-6, calc.DimCapacitance)), q(volt(complex(math.Sqrt2*400, 0))), q(volt(50)), q(calc.Real(60, calc.DimTime))},
			247319.149866679441, nil, "√2·V_rms"},
		{"dischargetime", []calc.Arg{q(calc.Real(247319.149866679441, calc.DimImpedance)), q(calc.Real(100e-6, calc.DimCapacitance)), q(volt(complex(math.Sqrt2*400, 0))), q(volt(50))},
			60, nil, "lethal"},
		// common practice, hand calculation in 30-digit decimal arithmetic
		{"rms", []calc.Arg{q(volt(100))}, 70.7106781186547524, map[string]float64{"avg": 63.6619772367581343}, ""},
		{"peak", []calc.Arg{q(volt(230))}, 230 * math.Sqrt2, nil, ""},
		{"rectavg", []calc.Arg{q(volt(100))}, 63.6619772367581343, nil, ""},
		{"rectpeak", []calc.Arg{q(volt(63.6619772367581343))}, 100, nil, ""},
	}
	for _, c := range cases {
		f := findFunc(t, c.fn)
		if len(c.args) < f.Min || (f.Max >= 0 && len(c.args) > f.Max) {
			t.Errorf("%s: %d arguments outside %d..%d", c.fn, len(c.args), f.Min, f.Max)
		}
		r, err := f.Call(ctx, c.args)
		if err != nil {
			t.Errorf("%s: %v", c.fn, err)
			continue
		}
		if !nearC(r.Value.V, c.value) {
			t.Errorf("%s = %v, want %v", c.fn, r.Value.V, c.value)
		}
		for k, want := range c.extra {
			got, ok := extra(r, k)
			if !ok || !near(real(got.V), want) {
				t.Errorf("%s.%s = %v (%v), want %v", c.fn, k, got.V, ok, want)
			}
		}
		if c.note != "" && !hasNote(withCautions(r.Notes, r.Cautions), c.note) && !hasNote(stepNotes(r), c.note) {
			t.Errorf("%s: no note with %q: %q", c.fn, c.note, r.Notes)
		}
		if len(r.Steps) == 0 {
			t.Errorf("%s: no steps", c.fn)
		}
		for _, st := range r.Steps {
			if !strings.HasPrefix(st.Source, c.fn+"(") || st.Rule == "" || st.Formula == "" || st.Kind == "" {
				t.Errorf("%s: step %+v", c.fn, st)
			}
		}
	}
}

func stepNotes(r calc.Result) []string {
	var n []string
	for _, s := range r.Steps {
		n = append(n, withCautions(s.Notes, s.Cautions)...)
	}
	return n
}

// TestFuncsPFCCaution: every power-factor-correction function carries the
// cautions on its result.
func TestFuncsPFCCaution(t *testing.T) {
	ctx := &calc.Context{Freq: 60}
	calls := map[string][]calc.Arg{
		"pfc":       {q(watt(1000)), num(0.7), num(0.95), q(volt(480)), w("three")},
		"pfcload":   {q(va(1000 + 500i)), num(0.95), q(volt(120)), w("single")},
		"rerate":    {q(varQ(1000)), q(volt(400)), q(volt(415))},
		"harmonic":  {q(va(1e6)), q(varQ(1e4))},
		"discharge": {q(calc.Real(1e-6, calc.DimCapacitance)), q(volt(100)), q(volt(10)), q(calc.Real(1, calc.DimTime))},
	}
	for fn, args := range calls {
		r, err := findFunc(t, fn).Call(ctx, args)
		if err != nil {
			t.Fatalf("%s: %v", fn, err)
		}
		cautionsIn(t, fn, withCautions(r.Notes, r.Cautions))
	}
}

func TestFuncErrors(t *testing.T) {
	ctx := &calc.Context{Freq: 50}
	v230 := calc.Arg{Q: volt(230), Text: "230 V"}
	cases := []struct {
		fn   string
		args []calc.Arg
		want string
	}{
		{"pfc", []calc.Arg{q(watt(1000)), v230, num(0.95), v230, w("single")},
			"pfc: argument 2 (pf1) must be a plain number between 0 and 1, got 230 V"},
		{"pfc", []calc.Arg{q(watt(1000)), num(0.7), num(0.95), q(amp(5)), w("single")},
			"pfc: argument 4 (V) must be a voltage, got 5.000 A"},
		{"pfc", []calc.Arg{q(watt(1000)), num(0.7), num(0.95), v230, w("lagging")},
			"pfc: argument 5 (single|three) must be single or three, got lagging"},
		{"pfc", []calc.Arg{q(watt(1000)), num(0.7), num(1.5), v230, w("single")},
			"pfc: argument 3 (pf2) must be a plain number between 0 and 1, got 1.500"},
		{"pfc", []calc.Arg{q(va(1000 + 1i)), num(0.7), num(0.9), v230, w("single")},
			"pfc: argument 1 (P) must be a real active power"},
		{"power", []calc.Arg{q(amp(1)), q(amp(1))}, "power: argument 1 (V) must be a voltage"},
		{"power", []calc.Arg{v230, w("three")}, "power: argument 2 (I) must be a current, got three"},
		{"pf", []calc.Arg{q(va(0))}, "pf: the power factor is undefined when S = 0"},
		{"load", []calc.Arg{q(watt(1)), num(0.8), w("three")}, "load: argument 3 (lagging|leading) must be lagging or leading"},
		{"load", []calc.Arg{q(watt(1)), q(calc.Angle(0.5)), w("lagging")}, "load: argument 2 (pf) must be a plain number"},
		{"motor", []calc.Arg{q(watt(1)), num(0), num(0.8), w("single"), v230}, "motor: argument 2 (eff)"},
		{"loads", []calc.Arg{q(va(1)), v230}, "loads: argument 2 (S2) must be a power"},
		{"current", []calc.Arg{q(va(1)), q(volt(0)), w("single")}, "supply voltage is 0"},
		{"discharge", []calc.Arg{q(calc.Real(1e-6, calc.DimCapacitance)), q(volt(10)), q(volt(100)), q(calc.Real(1, calc.DimTime))}, "must be below"},
		{"discharge", []calc.Arg{q(calc.Real(1e-6, calc.DimCapacitance)), q(volt(100)), q(volt(10)), q(calc.Real(1, calc.DimFrequency))}, "argument 4 (t) must be a time"},
		{"harmonic", []calc.Arg{q(va(1e6)), q(volt(1))}, "harmonic: argument 2 (Qc)"},
		{"rms", []calc.Arg{w("three")}, "rms: argument 1 (X)"},
	}
	for _, c := range cases {
		_, err := findFunc(t, c.fn).Call(ctx, c.args)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: err = %v, want %q", c.fn, err, c.want)
		}
	}
	// no working frequency: the capacitance cannot be found
	_, err := findFunc(t, "pfc").Call(&calc.Context{}, []calc.Arg{q(watt(1000)), num(0.7), num(0.95), v230, w("single")})
	if err == nil || !strings.Contains(err.Error(), "working frequency") {
		t.Errorf("err = %v", err)
	}
}

// TestFuncPowerPeak: with peak phasors the formula shown says ½·V·I*
// (shared DESIGN.md).
func TestFuncPowerPeak(t *testing.T) {
	r, err := findFunc(t, "power").Call(&calc.Context{Basis: calc.Peak}, []calc.Arg{q(volt(100)), q(amp(2 - 1i))})
	if err != nil {
		t.Fatal(err)
	}
	if !nearC(r.Value.V, 100+50i) || !strings.Contains(r.Steps[0].Formula, "½·V·I*") {
		t.Errorf("S = %v, formula %q", r.Value.V, r.Steps[0].Formula)
	}
	// S = 0 leaves .pf out and says why
	r, err = findFunc(t, "power").Call(nil, []calc.Arg{q(volt(0)), q(amp(1))})
	if err != nil {
		t.Fatal(err)
	}
	if _, ok := extra(r, "pf"); ok || !hasNote(r.Notes, "undefined") {
		t.Errorf("extra %v notes %q", r.Extra, r.Notes)
	}
}
