package nodal_test

import (
	"errors"
	"fmt"
	"math"
	"math/cmplx"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"

	"argand/calc"
	"argand/reduce"
	"argand/reduce/nodal"
)

// TestTheveninRandomLoads: for random networks, terminals and loads, the
// load current from the equivalent, I = V_th/(Z_th + Z_L), equals the
// current the full network drives through the load (Thevenin's theorem,
// common practice), to 1e-9 of the largest branch current of the loaded
// network. Norton's I_N·Z_th must give back V_th.
func TestTheveninRandomLoads(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 1459))
	for c := range 100 {
		n := randomNetwork(rng, 20)
		nodes := map[string]bool{}
		for _, e := range n.Elements {
			nodes[e.From], nodes[e.To] = true, true
		}
		names := make([]string, 0, len(nodes))
		for s := range nodes {
			names = append(names, s)
		}
		// map order is random: sort for a reproducible pick
		slices.Sort(names)
		a := names[rng.IntN(len(names))]
		b := names[rng.IntN(len(names))]
		if a == b {
			continue
		}
		t.Run(fmt.Sprintf("%d:%s-%s", c, a, b), func(t *testing.T) {
			vth, zth, steps, err := nodal.Thevenin(n, a, b, calc.RMS)
			if err != nil {
				t.Fatal(err)
			}
			if len(steps) < 2 {
				t.Errorf("%d steps", len(steps))
			}
			for range 3 {
				zl := cmplx.Rect(logUniform(rng, 0.1, 1e3), (rng.Float64()-0.5)*math.Pi*0.9)
				loaded := &reduce.Network{Reference: n.Reference, Elements: append(append([]reduce.Element(nil), n.Elements...), imp("LOAD", a, b, zl))}
				s := solve(t, loaded)
				got := vth / (zth + zl)
				want := branch(t, s, "LOAD").I
				if cmplx.Abs(got-want) > 1e-9*s.MaxI {
					t.Errorf("Z_L = %v: I from equivalent %v, full network %v (largest current %g)", zl, got, want, s.MaxI)
				}
			}
			in, yn, _, err := nodal.Norton(n, a, b, calc.RMS)
			if zth == 0 {
				if err == nil || !strings.Contains(err.Error(), "only the Thevenin form") {
					t.Errorf("Norton with Z_th = 0: %v", err)
				}
				return
			}
			if err != nil {
				t.Fatal(err)
			}
			if cmplx.Abs(in/yn-vth) > 1e-9*cmplx.Abs(vth)+1e-12 {
				t.Errorf("I_N/Y_N = %v, V_th = %v", in/yn, vth)
			}
		})
	}
}

// TestTheveninDivider: a source V behind Z1 with Z2 across the terminals
// gives V_th = V·Z2/(Z1+Z2) and Z_th = Z1‖Z2 (common practice).
func TestTheveninDivider(t *testing.T) {
	v, z1, z2 := complex(230, 0), complex(10, 20), complex(30, -5)
	n := network("0", vsrc("V1", "0", "s", v), imp("Z1", "s", "a", z1), imp("Z2", "a", "0", z2))
	vth, zth, steps, err := nodal.Thevenin(n, "a", "0", calc.RMS)
	if err != nil {
		t.Fatal(err)
	}
	wantV, wantZ := v*z2/(z1+z2), z1*z2/(z1+z2)
	if cmplx.Abs(vth-wantV) > 1e-12*cmplx.Abs(wantV) || cmplx.Abs(zth-wantZ) > 1e-12*cmplx.Abs(wantZ) {
		t.Errorf("V_th = %v, Z_th = %v; want %v, %v", vth, zth, wantV, wantZ)
	}
	if len(steps) != 2 || steps[0].Results[0].Value.Dim != calc.DimVoltage || steps[1].Results[0].Value.Dim != calc.DimImpedance {
		t.Errorf("steps %+v", steps)
	}
	in, yn, nsteps, err := nodal.Norton(n, "a", "0", calc.RMS)
	if err != nil {
		t.Fatal(err)
	}
	if cmplx.Abs(in-wantV/wantZ) > 1e-12*cmplx.Abs(in) || cmplx.Abs(yn-1/wantZ) > 1e-12*cmplx.Abs(yn) {
		t.Errorf("I_N = %v, Y_N = %v", in, yn)
	}
	last := nsteps[len(nsteps)-1]
	if last.Results[0].Value.Dim != calc.DimCurrent || last.Results[1].Value.Dim != calc.DimAdmittance {
		t.Errorf("Norton step %+v", last)
	}
}

// TestTheveninNoSources: a passive network has V_th = 0 and a finite Z_th,
// found by the test source (a short-circuit current would be 0/0).
func TestTheveninNoSources(t *testing.T) {
	n := network("0", res("R1", "a", "b", 10), res("R2", "b", "0", 20), res("R3", "a", "0", 30))
	vth, zth, steps, err := nodal.Thevenin(n, "a", "0", calc.RMS)
	if err != nil {
		t.Fatal(err)
	}
	want := complex(30.0*30/60, 0)
	if vth != 0 || cmplx.Abs(zth-want) > 1e-12*15 {
		t.Errorf("V_th = %v, Z_th = %v, want 0 and %v", vth, zth, want)
	}
	if !strings.Contains(steps[1].Rule, "test current source") {
		t.Errorf("Z_th step %q does not say it uses a test source", steps[1].Rule)
	}
}

// TestIdealForms: an ideal voltage source between the terminals has only
// a Thevenin form, an ideal current source only a Norton form, and the
// errors say which.
func TestIdealForms(t *testing.T) {
	vs := network("0", vsrc("V1", "0", "a", 12), res("R1", "a", "0", 4))
	vth, zth, steps, err := nodal.Thevenin(vs, "a", "0", calc.RMS)
	if err != nil || vth != 12 || zth != 0 {
		t.Errorf("Thevenin of an ideal source: %v, %v, %v", vth, zth, err)
	}
	if len(steps) < 2 || len(steps[1].Notes) == 0 || !strings.Contains(steps[1].Notes[0], "only the Thevenin form") {
		t.Errorf("Z_th step does not say only the Thevenin form exists: %+v", steps)
	}
	if _, _, _, err := nodal.Norton(vs, "a", "0", calc.RMS); err == nil || !strings.Contains(err.Error(), "only the Thevenin form") {
		t.Errorf("Norton of an ideal voltage source: %v", err)
	}

	// A current source feeding R1 whose far end joins the reference only
	// through the source: seen from a–0 an ideal current source.
	cs := network("0", isrc("I1", "0", "a", 3), res("R1", "a", "c", 4))
	if _, _, _, err := nodal.Thevenin(cs, "a", "0", calc.RMS); err == nil || !strings.Contains(err.Error(), "only the Norton form") {
		t.Errorf("Thevenin of an ideal current source: %v", err)
	}
	in, yn, steps, err := nodal.Norton(cs, "a", "0", calc.RMS)
	if err != nil || cmplx.Abs(in-3) > 1e-12 || yn != 0 {
		t.Errorf("Norton of an ideal current source: %v, %v, %v", in, yn, err)
	}
	if len(steps) == 0 {
		t.Error("no steps")
	}
}

// TestTheveninErrors: bad terminals and unjoined nodes are reported.
func TestTheveninErrors(t *testing.T) {
	n := network("0", vsrc("V1", "0", "a", 1), res("R1", "a", "0", 1), res("R2", "x", "y", 1))
	tests := []struct{ a, b, want string }{
		{"a", "a", "same node"},
		{"a", "q", "node q is not joined"},
		{"", "0", "named"},
		{"a", "x", "not joined by any path"},
	}
	for _, tt := range tests {
		_, _, _, err := nodal.Thevenin(n, tt.a, tt.b, calc.RMS)
		var ne *nodal.NetError
		if !errors.As(err, &ne) || !strings.Contains(ne.Msg, tt.want) {
			t.Errorf("%q–%q: %v, want a NetError saying %q", tt.a, tt.b, err, tt.want)
		}
	}
	// The part x–y floats, but the equivalent between x and y exists.
	if _, zth, _, err := nodal.Thevenin(n, "x", "y", calc.RMS); err != nil || zth != 1 {
		t.Errorf("x–y: Z_th = %v, %v", zth, err)
	}
}
