package site

import (
	"math"
	"math/cmplx"
	"strings"
	"testing"

	"argand/calc"
)

func q(x float64, d calc.Dim) calc.Arg { return calc.Arg{Q: calc.Real(x, d)} }
func w(s string) calc.Arg              { return calc.Arg{Word: s, Text: s} }
func n(x float64) calc.Arg             { return calc.Arg{Q: calc.Number(complex(x, 0))} }
func pw(x float64) calc.Arg            { return q(x, calc.DimPower) }

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

// TestFuncs checks each function on a case worked by hand from its stated
// formula (common practice): Z = (V/I)∠φ; V_rms = V_pp/(2√2); φ = 360°·f·Δt;
// R2 = R1·(1 + α20·ΔT) with α20 = 3.93e-3 /K for copper (IEC 60228, from
// memory); referral by a²; Z_base = V²/S; Z_new = Z_old·S_new/S_old at one
// voltage; CT and VT ratios; Z = %Z/100·V²/S and I_sc = I_rated/(%Z/100)
// for an infinite bus; a 1 mΩ/m cable at unity PF drops I·R·L·√3.
func TestFuncs(t *testing.T) {
	ctx := &calc.Context{Freq: 50, Sequence: 1}
	ohmPerM := calc.Dim{calc.BaseVolt: 1, calc.BaseAmpere: -1, calc.BaseMetre: -1}
	tests := []struct {
		name string
		args []calc.Arg
		want complex128
		dim  calc.Dim
	}{
		// 230 V, 2 A, 36.87°: Z = 115∠36.87° = 92 + j69 Ω.
		{"fromvi", []calc.Arg{q(230, calc.DimVoltage), q(2, calc.DimCurrent), n(math.Atan2(3, 4) * 180 / math.Pi)}, complex(92, 69), calc.DimImpedance},
		{"fromvip", []calc.Arg{q(230, calc.DimVoltage), q(2, calc.DimCurrent), pw(368), w("leading")}, complex(92, -69), calc.DimImpedance},
		{"frompf", []calc.Arg{pw(368), n(0.8), q(230, calc.DimVoltage), w("lagging")}, complex(92, 69), calc.DimImpedance},
		{"pp2rms", []calc.Arg{q(2*math.Sqrt2*230, calc.DimVoltage)}, 230, calc.DimVoltage},
		{"delay2phase", []calc.Arg{q(2.5e-3, calc.DimTime)}, complex(rad(45), 0), calc.Dimensionless},
		{"rotation", []calc.Arg{n(0), n(120), n(-120)}, -1, calc.Dimensionless},
		{"preferred", []calc.Arg{q(5000, calc.DimImpedance), w("E12")}, 4700, calc.DimImpedance},
		{"rtemp", []calc.Arg{q(1, calc.DimImpedance), n(20), n(70), w("copper")}, complex(1+3.93e-3*50, 0), calc.DimImpedance},
		{"refer", []calc.Arg{q(2, calc.DimImpedance), n(10), w("primary")}, 200, calc.DimImpedance},
		{"pubase", []calc.Arg{pw(100e6), q(11e3, calc.DimVoltage)}, 1.21, calc.DimImpedance},
		{"rebase", []calc.Arg{n(0.1), pw(50e6), q(132e3, calc.DimVoltage), pw(100e6), q(132e3, calc.DimVoltage)}, 0.2, calc.Dimensionless},
		{"ct", []calc.Arg{q(3.2, calc.DimCurrent), q(200, calc.DimCurrent), q(5, calc.DimCurrent)}, 128, calc.DimCurrent},
		{"ctsec", []calc.Arg{q(128, calc.DimCurrent), q(200, calc.DimCurrent), q(5, calc.DimCurrent)}, 3.2, calc.DimCurrent},
		{"vt", []calc.Arg{q(110, calc.DimVoltage), q(11e3, calc.DimVoltage), q(110, calc.DimVoltage)}, 11e3, calc.DimVoltage},
		{"vtsec", []calc.Arg{q(11e3, calc.DimVoltage), q(11e3, calc.DimVoltage), q(110, calc.DimVoltage)}, 110, calc.DimVoltage},
		{"readcheck", []calc.Arg{q(110, calc.DimImpedance), n(1), n(2), q(0.1, calc.DimImpedance), q(95, calc.DimImpedance), q(105, calc.DimImpedance)}, 3.7, calc.DimImpedance},
		{"xfmr", []calc.Arg{pw(1e6), q(11e3, calc.DimVoltage), q(415, calc.DimVoltage), n(5)}, complex(0, 0.05*415*415/1e6), calc.DimImpedance},
		{"faultcurrent", []calc.Arg{pw(1e6), q(11e3, calc.DimVoltage), q(415, calc.DimVoltage), n(5), n(6), pw(0)}, complex(1e6/(math.Sqrt(3)*415)/0.05, 0), calc.DimCurrent},
		{"cabledrop", []calc.Arg{q(400, calc.DimVoltage), q(100, calc.DimCurrent), n(1), w("lagging"), q(1e-3, ohmPerM), q(0, ohmPerM), q(100, calc.DimLength), w("three")}, 0, calc.DimVoltage},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			f := findFunc(t, tc.name)
			r, err := f.Call(ctx, tc.args)
			if err != nil {
				t.Fatal(err)
			}
			if r.Value.Dim != tc.dim {
				t.Errorf("unit %v, want %v", r.Value.Dim, tc.dim)
			}
			if tc.name == "cabledrop" {
				// pf 1, X = 0: exact drop √3·I·R·L = 17.32 V (by hand: the
				// current is in phase with both voltages).
				drop := 400 - cmplx.Abs(r.Value.V)
				if math.Abs(drop-math.Sqrt(3)*100*0.1) > 1e-9 {
					t.Errorf("drop %g", drop)
				}
				return
			}
			if cmplx.Abs(r.Value.V-tc.want) > 1e-9*math.Max(1, cmplx.Abs(tc.want)) {
				t.Errorf("got %v, want %v", r.Value.V, tc.want)
			}
			if len(r.Steps) == 0 {
				t.Error("no steps")
			}
		})
	}
}

func TestFuncsHostile(t *testing.T) {
	// Every function, called with too few, wrong or hostile arguments,
	// returns an error or a finite value; it never panics.
	ctx := &calc.Context{Freq: 50, Sequence: 1}
	junk := []calc.Arg{
		{Q: calc.Number(complex(math.NaN(), 0))},
		{Q: calc.Real(math.Inf(1), calc.DimVoltage)},
		w("lagging"),
		{Q: calc.Q(complex(1, 1), calc.DimCurrent)},
		{Q: calc.Real(-1, calc.DimPower)},
		{Q: calc.Number(0)},
	}
	seen := map[string]bool{}
	for _, f := range Funcs() {
		if seen[f.Name] {
			t.Errorf("duplicate function %q", f.Name)
		}
		seen[f.Name] = true
		if f.Doc == "" || f.Formula == "" || !strings.HasPrefix(f.Args, "(") {
			t.Errorf("%s: missing Doc, Formula or Args", f.Name)
		}
		for k := 0; k <= 10; k++ {
			for _, j := range junk {
				args := make([]calc.Arg, k)
				for i := range args {
					args[i] = j
				}
				r, err := f.Call(ctx, args)
				if err == nil {
					if _, cerr := r.Value.Check(f.Name); cerr != nil {
						t.Errorf("%s: %v", f.Name, cerr)
					}
				}
			}
		}
	}
}

// TestCableDropBasis: the per cent drop of a cable run is the same whether
// its phasors are written RMS or peak, with the nominal voltage RMS by
// definition (IEC 60038) under either basis; the drop itself follows the
// basis (ΔV = I·Z, common practice).
func TestCableDropBasis(t *testing.T) {
	var f calc.Func
	for _, x := range Funcs() {
		if x.Name == "cabledrop" {
			f = x
		}
	}
	per := calc.Dim{calc.BaseVolt: 1, calc.BaseAmpere: -1, calc.BaseMetre: -1}
	run := func(b calc.Basis, k float64) (float64, float64) {
		args := []calc.Arg{{Q: calc.Real(230*k, calc.DimVoltage)}, {Q: calc.Real(32*k, calc.DimCurrent)}, {Q: calc.Number(0.9)}, {Word: "lagging"},
			{Q: calc.Real(1.83e-3, per)}, {Q: calc.Real(0.09e-3, per)}, {Q: calc.Real(45, calc.DimLength)}, {Word: "single"}, {Q: calc.Real(230, calc.DimVoltage)}}
		r, err := f.Call(&calc.Context{Freq: 50, Basis: b, Sequence: 1}, args)
		if err != nil {
			t.Fatal(err)
		}
		var drop, pct float64
		for _, o := range r.Extra {
			switch o.Name {
			case "drop":
				drop = real(o.Value.V)
			case "pct":
				pct = real(o.Value.V)
			}
		}
		return drop, pct
	}
	d1, p1 := run(calc.RMS, 1)
	d2, p2 := run(calc.Peak, math.Sqrt2)
	if math.Abs(p1-p2) > 1e-9*p1 || math.Abs(d2-math.Sqrt2*d1) > 1e-9*d2 {
		t.Errorf("RMS: drop %g, %g %%; peak: drop %g, %g %%", d1, p1, d2, p2)
	}
}
