package power

import (
	"math"
	"math/cmplx"
	"strings"
	"testing"

	"pgregory.net/rapid"

	"argand/calc"
)

// TestPropCorrectReachesTarget: the corrected power S₁ − jQ_c has the
// target power factor within 1e-9 (Q_c = P·(tan φ₁ − tan φ₂), common
// practice), for lagging and leading targets.
func TestPropCorrectReachesTarget(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		p := rapid.Float64Range(1e-3, 1e9).Draw(t, "P")
		pf1 := rapid.Float64Range(0.01, 0.99).Draw(t, "pf1")
		pf2 := rapid.Float64Range(math.Min(pf1+1e-6, 1), 1).Draw(t, "pf2")
		lead := rapid.Bool().Draw(t, "leading")
		v := rapid.Float64Range(1, 1e6).Draw(t, "V")
		f := rapid.Float64Range(1, 1e3).Draw(t, "f")
		ph := SinglePhase
		if rapid.Bool().Draw(t, "three") {
			ph = ThreePhase
		}
		load, _, err := FromPF(watt(p), pf1, Lagging)
		if err != nil {
			t.Fatal(err)
		}
		k, _, err := Correct(Target{Load: load.S, PF: pf2, Leading: lead, V: volt(complex(v, 0)), Freq: f, Phases: ph})
		if err != nil {
			t.Fatal(err)
		}
		if !k.Needed {
			t.Fatalf("no correction for %v → %v", pf1, pf2)
		}
		after := FactorOf(load.S.V - complex(0, real(k.Qc.V)))
		if math.Abs(after.Value-pf2) > 1e-9 {
			t.Fatalf("PF after %v, want %v", after.Value, pf2)
		}
		wantSense := Lagging
		switch {
		case pf2 == 1:
			wantSense = Unity
		case lead:
			wantSense = Leading
		}
		if pf2 < 1-1e-9 && after.Sense != wantSense {
			t.Fatalf("sense %v, want %v", after.Sense, wantSense)
		}
		if real(k.I2.V) > real(k.I1.V)*(1+1e-12) && !lead {
			t.Fatalf("current rose: %v → %v", k.I1.V, k.I2.V)
		}
	})
}

// TestPropDelivering: an element whose current flows against its voltage
// drop (Re V·I* < 0, passive sign convention, IEC 60375) delivers power:
// P < 0, PF = P/|S| < 0, and the notes say "delivering".
func TestPropDelivering(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		vm := rapid.Float64Range(1e-3, 1e6).Draw(t, "|V|")
		im := rapid.Float64Range(1e-3, 1e6).Draw(t, "|I|")
		tv := rapid.Float64Range(-math.Pi, math.Pi).Draw(t, "θV")
		// φ = θV − θI beyond ±90° (with a margin for rounding)
		phi := rapid.Float64Range(math.Pi/2+1e-6, 3*math.Pi/2-1e-6).Draw(t, "φ")
		v := cmplx.Rect(vm, tv)
		i := cmplx.Rect(im, tv-phi)
		p, steps, err := FromPhasors(volt(v), amp(i), calc.RMS)
		if err != nil {
			t.Fatal(err)
		}
		if !p.Delivering() || !(p.PF.Value < 0) || !p.PF.Defined() {
			t.Fatalf("S = %v, PF %+v", p.S.V, p.PF)
		}
		if !strings.Contains(strings.Join(steps[0].Notes, " "), "delivering") {
			t.Fatalf("notes %q", steps[0].Notes)
		}
	})
}

// finiteQ reports whether both parts of q are finite.
func finiteQ(q calc.Quantity) bool {
	return !cmplx.IsNaN(q.V) && !cmplx.IsInf(q.V)
}

func allFinite(t *rapid.T, what string, r calc.Result) {
	if !finiteQ(r.Value) {
		t.Fatalf("%s: value %v", what, r.Value.V)
	}
	for _, o := range r.Extra {
		if !finiteQ(o.Value) {
			t.Fatalf("%s: .%s = %v", what, o.Name, o.Value.V)
		}
	}
	for _, s := range r.Steps {
		for _, ops := range [][]calc.Operand{s.Inputs, s.Results} {
			for _, o := range ops {
				if !finiteQ(o.Value) {
					t.Fatalf("%s: step operand %s = %v", what, o.Name, o.Value.V)
				}
			}
		}
		for _, row := range s.Rows {
			for _, o := range row.Values {
				if !finiteQ(o.Value) {
					t.Fatalf("%s: row %s %s = %v", what, row.Name, o.Name, o.Value.V)
				}
			}
		}
		for _, n := range s.Notes {
			if strings.Contains(n, "NaN") || strings.Contains(n, "Inf") {
				t.Fatalf("%s: note %q", what, n)
			}
		}
	}
}

// argSpec says what a worksheet function expects at one position: a
// quantity of dimension dim, a fraction in [0, 1], or one of words.
type argSpec struct {
	dim      calc.Dim
	fraction bool
	words    []string
}

var (
	aV     = argSpec{dim: calc.DimVoltage}
	aI     = argSpec{dim: calc.DimCurrent}
	aP     = argSpec{dim: calc.DimPower}
	aC     = argSpec{dim: calc.DimCapacitance}
	aT     = argSpec{dim: calc.DimTime}
	aR     = argSpec{dim: calc.DimImpedance}
	aFrac  = argSpec{fraction: true}
	aPh    = argSpec{words: []string{"single", "three"}}
	aSense = argSpec{words: []string{"lagging", "leading"}}
)

// signature gives what each worksheet function expects, so that most
// drawn calls get past the checks and reach the arithmetic.
var signature = map[string][]argSpec{
	"power":         {aV, aI},
	"pf":            {aP},
	"load":          {aP, aFrac, aSense},
	"loadva":        {aP, aFrac, aSense},
	"motor":         {aP, aFrac, aFrac, aPh, aV},
	"loads":         {aP, aP, aP},
	"current":       {aP, aV, aPh},
	"pfc":           {aP, aFrac, aFrac, aV, aPh, aSense},
	"pfcload":       {aP, aFrac, aV, aPh, aSense},
	"rerate":        {aP, aV, aV},
	"harmonic":      {aP, aP},
	"discharge":     {aC, aV, aV, aT},
	"dischargetime": {aR, aC, aV, aV},
	"rms":           {aV},
	"peak":          {aI},
	"rectavg":       {aV},
	"rectpeak":      {aV},
}

// drawArg draws any argument a worksheet could pass: usually what the
// function expects at that position, with parts anywhere in the float64
// range, near the edges of the valid ranges, or exactly 0 or 1; sometimes
// a wrong dimension or a stray word.
func drawArg(t *rapid.T, label string, spec []argSpec, pos int, words []string) calc.Arg {
	dims := []calc.Dim{calc.Dimensionless, calc.DimVoltage, calc.DimCurrent, calc.DimPower,
		calc.DimCapacitance, calc.DimTime, calc.DimImpedance, calc.DimFrequency}
	sp := aP // extra arguments of loads(...)
	if pos < len(spec) {
		sp = spec[pos]
	}
	if rapid.IntRange(0, 19).Draw(t, label+" stray?") == 0 {
		if len(words) > 0 && rapid.Bool().Draw(t, label+" stray word?") {
			return calc.Arg{Word: rapid.SampledFrom(words).Draw(t, label+" word")}
		}
		sp = argSpec{dim: rapid.SampledFrom(dims).Draw(t, label+" dim")}
	}
	if len(sp.words) > 0 {
		return calc.Arg{Word: rapid.SampledFrom(sp.words).Draw(t, label+" word")}
	}
	if sp.fraction && rapid.IntRange(0, 4).Draw(t, label+" in range?") > 0 {
		x := rapid.OneOf(rapid.Float64Range(0, 1), rapid.SampledFrom([]float64{0, 1, 1e-300, math.SmallestNonzeroFloat64, 1 - 1e-16})).Draw(t, label+" fraction")
		return calc.Arg{Q: calc.Number(complex(x, 0))}
	}
	// ordinary positive values weigh most, so that calls reach the
	// arithmetic as well as the checks
	ordinary := rapid.Float64Range(1e-3, 1e6)
	part := rapid.OneOf(
		ordinary, ordinary, ordinary,
		rapid.Float64(),
		rapid.Float64Range(0, 1e6),
		rapid.Float64Range(-2, 2),
		rapid.SampledFrom([]float64{0, 1, -1, 1e-300, 1e300, math.SmallestNonzeroFloat64, math.MaxFloat64}),
	)
	re := part.Draw(t, label+" re")
	im := 0.0
	if rapid.IntRange(0, 3).Draw(t, label+" complex?") == 0 {
		im = part.Draw(t, label+" im")
	}
	kind := calc.KindPlain
	if sp.dim == calc.DimPower {
		kind = rapid.SampledFrom([]calc.Kind{calc.KindActive, calc.KindReactive, calc.KindApparent}).Draw(t, label+" kind")
	}
	return calc.Arg{Q: calc.Quantity{V: complex(re, im), Dim: sp.dim, Kind: kind}}
}

// TestPropFuncsFinite: every worksheet function, given any finite
// arguments (right or wrong in number, dimension or range), returns an
// error or a result with only finite values, and never panics. Enough
// calls must succeed for the check to mean something.
func TestPropFuncsFinite(t *testing.T) {
	fs := Funcs()
	ok := map[string]int{}
	// several rounds, so that at the default 100 checks a round every
	// function still meets enough valid argument lists
	for range 40 {
		rapid.Check(t, funcsFiniteProp(fs, ok))
	}
	t.Logf("calls that succeeded, by function: %v", ok)
	for _, f := range fs {
		if ok[f.Name] == 0 {
			t.Errorf("%s never succeeded on drawn arguments", f.Name)
		}
	}
}

func funcsFiniteProp(fs []calc.Func, ok map[string]int) func(*rapid.T) {
	return func(t *rapid.T) {
		f := rapid.SampledFrom(fs).Draw(t, "func")
		hi := f.Max
		if hi < 0 {
			hi = f.Min + 4
		}
		n := rapid.IntRange(f.Min, hi).Draw(t, "n")
		if rapid.IntRange(0, 19).Draw(t, "bad arity?") == 0 {
			n = rapid.IntRange(0, hi+1).Draw(t, "n bad")
		}
		args := make([]calc.Arg, n)
		for i := range args {
			args[i] = drawArg(t, "arg", signature[f.Name], i, f.Words)
		}
		ctx := &calc.Context{
			Freq:  rapid.SampledFrom([]float64{0, 50, 60, 1e-300, 1e300}).Draw(t, "freq"),
			Basis: rapid.SampledFrom([]calc.Basis{calc.RMS, calc.Peak}).Draw(t, "basis"),
		}
		r, err := f.Call(ctx, args)
		if err != nil {
			if strings.Contains(err.Error(), "NaN") || strings.Contains(err.Error(), "Inf") {
				t.Fatalf("%s: error %v", f.Name, err)
			}
			return
		}
		ok[f.Name]++
		allFinite(t, f.Name, r)
	}
}

// TestPropPowerFinite: for any finite V and I the complex power is either
// an error (overflow) or finite with a PF in [−1, 1].
func TestPropPowerFinite(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		v := complex(rapid.Float64().Draw(t, "vr"), rapid.Float64().Draw(t, "vi"))
		i := complex(rapid.Float64().Draw(t, "ir"), rapid.Float64().Draw(t, "ii"))
		p, _, err := FromPhasors(volt(v), amp(i), calc.RMS)
		if err != nil {
			return
		}
		for _, q := range []calc.Quantity{p.S, p.P, p.Q, p.Apparent} {
			if !finiteQ(q) {
				t.Fatalf("V %v I %v: %v", v, i, q.V)
			}
		}
		if math.IsNaN(p.PF.Value) || math.Abs(p.PF.Value) > 1 {
			t.Fatalf("PF %v", p.PF.Value)
		}
		if (p.S.V == 0) == p.PF.Defined() {
			t.Fatalf("S %v PF defined %v", p.S.V, p.PF.Defined())
		}
	})
}
