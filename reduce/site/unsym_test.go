package site

import (
	"math"
	"math/cmplx"
	"math/rand/v2"
	"testing"

	"argand/calc"
	"argand/reduce"
	"argand/reduce/nodal"
	"argand/reduce/threephase"
)

// unsymCases are sequence impedances seen from a fault (invented example
// data): a low-voltage point behind a Dyn transformer, a high-voltage
// point with Z2 ≠ Z1, and a resistive fault.
var unsymCases = []struct {
	name           string
	un             float64
	z1, z2, z0, zf complex128
}{
	{"lv bolted", 400, complex(3.1, 11.0) * 1e-3, complex(3.1, 11.0) * 1e-3, complex(9.8, 14.5) * 1e-3, 0},
	{"hv z2≠z1", 20e3, complex(0.4, 3.8), complex(0.45, 4.1), complex(1.2, 9.5), 0},
	{"lv through 0.1 Ω", 400, complex(20, 45) * 1e-3, complex(20, 45) * 1e-3, complex(60, 110) * 1e-3, 0.1},
}

const seqTol = 1e-9

func closeC(a, b complex128, scale float64) bool { return cmplx.Abs(a-b) <= seqTol*scale }

// The sequence networks connected for each fault and solved by argand's
// nodal engine (its public API only): positive sequence E behind Z1,
// negative Z2, zero Z0, joined as the fault requires. The sequence
// currents and voltages must match UnsymFault, and the phase values must
// match those from threephase.FromSequence of the nodal sequence values.
func TestUnsymAgainstSequenceNetworks(t *testing.T) {
	for _, tc := range unsymCases {
		for _, ft := range []FaultType{LineToEarth, LineToLine, LineLineEarth} {
			r, err := UnsymFault(Unsym{Type: ft, Un: tc.un, Z1: tc.z1, Z2: tc.z2, Z0: tc.z0, Zf: tc.zf})
			if err != nil {
				t.Fatalf("%s %v: %v", tc.name, ft, err)
			}
			e := 1.05 * tc.un / math.Sqrt(3)
			if tc.un > 1000 {
				e = 1.1 * tc.un / math.Sqrt(3)
			}
			src := reduce.Element{Name: "E", Kind: reduce.VoltageSource, From: "0", To: "e", Value: complex(e, 0)}
			imp := func(name, from, to string, z complex128) reduce.Element {
				return reduce.Element{Name: name, Kind: reduce.Impedance, From: from, To: to, Z: z}
			}
			var net *reduce.Network
			// seq returns I0, I1, I2 (leaving each network at its fault
			// terminal) and V0, V1, V2 from the solution.
			var seq func(s *nodal.Solution) (i, v [3]complex128)
			cur := func(s *nodal.Solution, name string) complex128 {
				for _, b := range s.Branches {
					if b.Name == name {
						return b.I
					}
				}
				t.Fatalf("no branch %s", name)
				return 0
			}
			switch ft {
			case LineToEarth:
				// series loop 0 → E → Z1 → a → Z2 → b → Z0 → c → 3Zf → 0
				net = &reduce.Network{Reference: "0", Elements: []reduce.Element{src,
					imp("Z1", "e", "a", tc.z1), imp("Z2", "a", "b", tc.z2), imp("Z0", "b", "c", tc.z0), imp("Zf3", "c", "0", 3*tc.zf)}}
				seq = func(s *nodal.Solution) (i, v [3]complex128) {
					in := cur(s, "Z1")
					i = [3]complex128{in, in, in}
					v = [3]complex128{s.Voltage["c"] - s.Voltage["b"], s.Voltage["a"], s.Voltage["b"] - s.Voltage["a"]}
					return
				}
			case LineToLine:
				// 0 → E → Z1 → a → Zf → b → Z2 → 0; the zero network is dead
				net = &reduce.Network{Reference: "0", Elements: []reduce.Element{src,
					imp("Z1", "e", "a", tc.z1), imp("Zf", "a", "b", tc.zf), imp("Z2", "b", "0", tc.z2)}}
				seq = func(s *nodal.Solution) (i, v [3]complex128) {
					in := cur(s, "Z1")
					i = [3]complex128{0, in, -in}
					v = [3]complex128{0, s.Voltage["a"], s.Voltage["b"]}
					return
				}
			case LineLineEarth:
				// 0 → E → Z1 → a; a → Z2 → 0; a → 3Zf → c → Z0 → 0
				net = &reduce.Network{Reference: "0", Elements: []reduce.Element{src,
					imp("Z1", "e", "a", tc.z1), imp("Z2", "a", "0", tc.z2), imp("Zf3", "c", "a", 3*tc.zf), imp("Z0", "c", "0", tc.z0)}}
				seq = func(s *nodal.Solution) (i, v [3]complex128) {
					// I2 leaves the negative network at a: Z2 carries it from 0 to a
					// (its current a → 0 is −I2); likewise I0 from 0 to c.
					i = [3]complex128{-cur(s, "Z0"), cur(s, "Z1"), -cur(s, "Z2")}
					v = [3]complex128{s.Voltage["c"], s.Voltage["a"], s.Voltage["a"]}
					return
				}
			}
			sol, err := nodal.Solve(net, calc.RMS)
			if err != nil {
				t.Fatalf("%s %v: nodal: %v", tc.name, ft, err)
			}
			is, vs := seq(sol)
			iscale := cmplx.Abs(is[1])
			for k := range 3 {
				if !closeC(r.I012[k].V, is[k], iscale) || !closeC(r.V012[k].V, vs[k], e) {
					t.Errorf("%s %v seq %d: I %v V %v, nodal I %v V %v", tc.name, ft, k, r.I012[k].V, r.V012[k].V, is[k], vs[k])
				}
			}
			// phases from the nodal sequence values through threephase
			iabc, _, err := threephase.FromSequence(calc.Q(is[0], calc.DimCurrent), calc.Q(is[1], calc.DimCurrent), calc.Q(is[2], calc.DimCurrent))
			if err != nil {
				t.Fatal(err)
			}
			vabc, _, err := threephase.FromSequence(calc.Q(vs[0], calc.DimVoltage), calc.Q(vs[1], calc.DimVoltage), calc.Q(vs[2], calc.DimVoltage))
			if err != nil {
				t.Fatal(err)
			}
			for k := range 3 {
				if !closeC(r.Iabc[k].V, iabc[k].V, iscale) || !closeC(r.Vabc[k].V, vabc[k].V, e) {
					t.Errorf("%s %v phase %c: I %v V %v, via threephase I %v V %v", tc.name, ft, 'a'+k, r.Iabc[k].V, r.Vabc[k].V, iabc[k].V, vabc[k].V)
				}
			}
			// and back: threephase.ToSequence of argand's phase currents
			back, _, err := threephase.ToSequence(r.Iabc[0], r.Iabc[1], r.Iabc[2])
			if err != nil {
				t.Fatal(err)
			}
			for k := range 3 {
				if !closeC(back[k].V, r.I012[k].V, iscale) {
					t.Errorf("%s %v: ToSequence of the phase currents gives %v at %d, want %v", tc.name, ft, back[k].V, k, r.I012[k].V)
				}
			}
		}
	}
}

// With Z1 = Z2 the source is a three-phase network of its own: each phase
// E_x behind Z1 to a star point, the star point to earth through
// Z_n = (Z0 − Z1)/3 (self impedance (Z0 + 2Z1)/3, mutual (Z0 − Z1)/3;
// common practice). The fault is then wired in the phases themselves and
// solved by the nodal engine, with no sequence quantities at all.
func TestUnsymAgainstPhaseNetwork(t *testing.T) {
	rng := rand.New(rand.NewPCG(14, 60909))
	for trial := range 40 {
		z1 := complex(0.5+rng.Float64()*5, 2+rng.Float64()*20) * 1e-3
		z0 := z1 + complex(rng.Float64()*10, rng.Float64()*30)*1e-3 // Z0 − Z1 passive
		zf := complex(rng.Float64()*50e-3, 0)
		if trial%4 == 0 {
			zf = 0
		}
		un := 400.0
		e := 1.05 * un / math.Sqrt(3)
		a := complex(-0.5, math.Sqrt(3)/2)
		ea, eb, ec := complex(e, 0), complex(e, 0)*a*a, complex(e, 0)*a
		for _, ft := range []FaultType{LineToEarth, LineToLine, LineLineEarth} {
			els := []reduce.Element{
				{Name: "Ea", Kind: reduce.VoltageSource, From: "0", To: "ea", Value: ea},
				{Name: "Eb", Kind: reduce.VoltageSource, From: "0", To: "eb", Value: eb},
				{Name: "Ec", Kind: reduce.VoltageSource, From: "0", To: "ec", Value: ec},
				{Name: "Zn", Kind: reduce.Impedance, From: "0", To: "s", Z: (z0 - z1) / 3},
			}
			// phase x: star point s → E_x → Z1 → terminal X
			for k := range 3 {
				els[k].From = "s"
			}
			els = append(els,
				reduce.Element{Name: "Za", Kind: reduce.Impedance, From: "ea", To: "A", Z: z1},
				reduce.Element{Name: "Zb", Kind: reduce.Impedance, From: "eb", To: "B", Z: z1},
				reduce.Element{Name: "Zc", Kind: reduce.Impedance, From: "ec", To: "C", Z: z1})
			var ia, ib, ic complex128
			switch ft {
			case LineToEarth:
				els = append(els, reduce.Element{Name: "F", Kind: reduce.Impedance, From: "A", To: "0", Z: zf},
					reduce.Element{Name: "Rb", Kind: reduce.Impedance, From: "B", To: "0", Z: 1e12},
					reduce.Element{Name: "Rc", Kind: reduce.Impedance, From: "C", To: "0", Z: 1e12})
			case LineToLine:
				els = append(els, reduce.Element{Name: "F", Kind: reduce.Impedance, From: "B", To: "C", Z: zf},
					reduce.Element{Name: "Ra", Kind: reduce.Impedance, From: "A", To: "0", Z: 1e12},
					reduce.Element{Name: "Rc", Kind: reduce.Impedance, From: "C", To: "0", Z: 1e12})
			case LineLineEarth:
				els = append(els, reduce.Element{Name: "Fbc", Kind: reduce.Impedance, From: "B", To: "C", Z: 0},
					reduce.Element{Name: "F", Kind: reduce.Impedance, From: "C", To: "0", Z: zf},
					reduce.Element{Name: "Ra", Kind: reduce.Impedance, From: "A", To: "0", Z: 1e12})
			}
			sol, err := nodal.Solve(&reduce.Network{Reference: "0", Elements: els}, calc.RMS)
			if err != nil {
				t.Fatalf("trial %d %v: %v", trial, ft, err)
			}
			for _, b := range sol.Branches {
				switch b.Name {
				case "Za":
					ia = b.I
				case "Zb":
					ib = b.I
				case "Zc":
					ic = b.I
				}
			}
			r, err := UnsymFault(Unsym{Type: ft, Un: un, Z1: z1, Z2: z1, Z0: z0, Zf: zf})
			if err != nil {
				t.Fatal(err)
			}
			// The 1 TΩ bleeders that keep the healthy phases tied to
			// earth carry about 1e-10 A against kiloamperes.
			scale := cmplx.Abs(r.Iabc[0].V) + cmplx.Abs(r.Iabc[1].V) + cmplx.Abs(r.Iabc[2].V)
			for k, want := range []complex128{ia, ib, ic} {
				if !closeC(r.Iabc[k].V, want, scale) {
					t.Errorf("trial %d %v: I%c = %v, phase network %v", trial, ft, 'a'+k, r.Iabc[k].V, want)
				}
			}
		}
	}
}

// The closed forms of IEC 60909-0 for bolted faults (from memory):
// I"_k1 = √3·c·U_n/|Z1 + Z2 + Z0|, I"_k2 = c·U_n/|Z1 + Z2|,
// I"_kE2E = √3·c·U_n·|Z2|/|Z1·Z2 + Z1·Z0 + Z2·Z0|.
func TestUnsymClosedForms(t *testing.T) {
	for _, tc := range unsymCases[:2] {
		c := 1.05
		if tc.un > 1000 {
			c = 1.1
		}
		want := map[FaultType]float64{
			LineToEarth:   math.Sqrt(3) * c * tc.un / cmplx.Abs(tc.z1+tc.z2+tc.z0),
			LineToLine:    c * tc.un / cmplx.Abs(tc.z1+tc.z2),
			LineLineEarth: math.Sqrt(3) * c * tc.un * cmplx.Abs(tc.z2) / cmplx.Abs(tc.z1*tc.z2+tc.z1*tc.z0+tc.z2*tc.z0),
		}
		for ft, w := range want {
			r, err := UnsymFault(Unsym{Type: ft, Un: tc.un, Z1: tc.z1, Z2: tc.z2, Z0: tc.z0})
			if err != nil {
				t.Fatal(err)
			}
			if got := real(r.Ik.V); math.Abs(got-w) > 1e-12*w {
				t.Errorf("%s %v: I\"_k = %.12g, want %.12g", tc.name, ft, got, w)
			}
		}
		// minimum: c_min
		r, err := UnsymFault(Unsym{Type: LineToEarth, Un: tc.un, Z1: tc.z1, Z2: tc.z2, Z0: tc.z0, Min: true})
		if err != nil {
			t.Fatal(err)
		}
		cmin := 0.95
		if tc.un > 1000 {
			cmin = 1
		}
		if w := math.Sqrt(3) * cmin * tc.un / cmplx.Abs(tc.z1+tc.z2+tc.z0); math.Abs(real(r.Ik.V)-w) > 1e-12*w {
			t.Errorf("%s: I\"_k1min = %g, want %g", tc.name, real(r.Ik.V), w)
		}
	}
	// A bolted line-to-earth fault leaves phase a at exactly 0 V and the
	// healthy phases carry exactly no current.
	r, err := UnsymFault(Unsym{Type: LineToEarth, Un: 400, Z1: 1e-2i, Z2: 1e-2i, Z0: 3e-2i})
	if err != nil {
		t.Fatal(err)
	}
	if r.Vabc[0].V != 0 || r.Iabc[1].V != 0 || r.Iabc[2].V != 0 {
		t.Errorf("bolted L-E: Va %v Ib %v Ic %v, want 0", r.Vabc[0].V, r.Iabc[1].V, r.Iabc[2].V)
	}
	// ACB swaps the labels b and c.
	abc, _ := UnsymFault(Unsym{Type: LineToLine, Un: 400, Z1: 1e-2i, Z2: 1e-2i, Z0: 3e-2i})
	acb, _ := UnsymFault(Unsym{Type: LineToLine, Un: 400, Z1: 1e-2i, Z2: 1e-2i, Z0: 3e-2i, ACB: true})
	if abc.Iabc[1].V != acb.Iabc[2].V || abc.Vabc[2].V != acb.Vabc[1].V {
		t.Error("ACB does not swap b and c")
	}
}

func TestUnsymErrors(t *testing.T) {
	for _, u := range []Unsym{
		{Type: LineToEarth, Un: 400},
		{Type: LineToLine, Un: 400, Z0: 1},
		{Type: LineLineEarth, Un: 400, Z1: 1i},
		{Type: LineToEarth, Un: 400, Z1: complex(-1, 1), Z2: 1, Z0: 1},
		{Type: LineToEarth, Un: math.Inf(1), Z1: 1, Z2: 1, Z0: 1},
		{Type: LineToEarth, Un: 400, Z1: cmplx.NaN(), Z2: 1, Z0: 1},
		{Type: LineToEarth, Un: 400, Z1: 1, Z2: 1, Z0: 1, C: 7},
		{Type: FaultType(9), Un: 400, Z1: 1, Z2: 1, Z0: 1},
	} {
		if _, err := UnsymFault(u); err == nil {
			t.Errorf("%+v: no error", u)
		}
	}
}
