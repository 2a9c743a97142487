package nodal_test

import (
	"fmt"
	"math"
	"math/cmplx"
	"math/rand/v2"
	"strings"
	"testing"

	"argand/calc"
	"argand/reduce"
	"argand/reduce/nodal"
)

// TestRandomAgainstGonum solves 300 generated networks (bridges, several
// voltage and current sources, ideal shorts, up to 30 nodes) and compares
// the node voltages with gonum's dense LU on the equivalent real 2n×2n
// system, norm-wise so that nodes near 0 V do not fail spuriously:
// ‖v − v_ref‖ ≤ 1e-9·‖v_ref‖. Every solution must also satisfy KCL at every
// node and Tellegen's theorem to 1e-9 (common practice).
func TestRandomAgainstGonum(t *testing.T) {
	rng := rand.New(rand.NewPCG(20260101, 3))
	const count = 300
	for c := range count {
		n := randomNetwork(rng, 30)
		t.Run(fmt.Sprint(c), func(t *testing.T) {
			s := solve(t, n)
			nodes, ref := referenceVoltages(t, n)
			got := make([]complex128, len(nodes))
			diff := make([]complex128, len(nodes))
			for i, name := range nodes {
				got[i] = s.Voltage[name]
				diff[i] = got[i] - ref[i]
			}
			if norm(diff) > 1e-9*norm(ref) {
				t.Errorf("‖v − v_ref‖ = %g > 1e-9·‖v_ref‖ = %g (%d nodes)", norm(diff), 1e-9*norm(ref), len(nodes)+1)
			}
			if v := s.Voltage[n.Reference]; v != 0 {
				t.Errorf("reference voltage %v, want 0", v)
			}
			checkBalance(t, s)
		})
	}
}

// TestPeakBasis: on the peak basis S = ½·V·I* (IEEE Std 1459-2010 defines
// S for RMS phasors; the ½ follows from V_rms = V_peak/√2).
func TestPeakBasis(t *testing.T) {
	n := network("0", vsrc("V1", "0", "a", 10), res("R1", "a", "0", 5))
	s, err := nodal.Solve(n, calc.Peak)
	if err != nil {
		t.Fatal(err)
	}
	r := branch(t, s, "R1")
	if want := complex(10, 0); cmplx.Abs(r.S-want) > 1e-12 {
		t.Errorf("S(R1) peak = %v, want %v", r.S, want)
	}
	v := branch(t, s, "V1")
	// The source delivers: passive convention gives Re S < 0.
	if cmplx.Abs(v.S+10) > 1e-12 {
		t.Errorf("S(V1) = %v, want −10", v.S)
	}
}

// TestWheatstone: a balanced bridge (Z1·Z4 = Z2·Z3) carries no current in
// its middle element (common practice). Both resistive and complex arms.
func TestWheatstone(t *testing.T) {
	tests := []struct {
		name           string
		z1, z2, z3, z4 complex128
	}{
		{"resistive", 100, 200, 150, 300},
		{"complex", complex(10, 5), complex(3, -7), complex(20, 10), complex(6, -14)},
		{"reactive", complex(0, 40), complex(0, 80), complex(0, -5), complex(0, -10)},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			n := network("0",
				vsrc("V1", "0", "top", 230),
				imp("Z1", "top", "l", tt.z1), imp("Z2", "l", "0", tt.z2),
				imp("Z3", "top", "r", tt.z3), imp("Z4", "r", "0", tt.z4),
				res("G", "l", "r", 47))
			s := solve(t, n)
			if i := cmplx.Abs(branch(t, s, "G").I); i > 1e-12*s.MaxI {
				t.Errorf("middle current %g, want 0 (largest current %g)", i, s.MaxI)
			}
			checkBalance(t, s)
		})
	}
}

// ladder returns a ladder of sections series R then shunt R fed by a 1 V
// source; it has sections+2 nodes with the reference.
func ladder(sections int, r float64) *reduce.Network {
	n := network("0", vsrc("V1", "0", "n0", 1))
	for i := range sections {
		a, b := fmt.Sprintf("n%d", i), fmt.Sprintf("n%d", i+1)
		n.Elements = append(n.Elements, res("Rs"+fmt.Sprint(i+1), a, b, r), res("Rp"+fmt.Sprint(i+1), b, "0", r))
	}
	return n
}

// TestLadderGoldenRatio: the input resistance of a long uniform ladder of
// series R and shunt R tends to R(1+√5)/2 (R_in = R + R‖R_in; common
// practice). The error shrinks by about φ⁴ ≈ 6.9 per section.
func TestLadderGoldenRatio(t *testing.T) {
	for _, r := range []float64{1, 47, 3.3e3} {
		s := solve(t, ladder(60, r))
		rin := 1 / real(branch(t, s, "V1").I)
		want := r * (1 + math.Sqrt(5)) / 2
		if math.Abs(rin-want) > 1e-12*want {
			t.Errorf("R = %g: R_in = %.15g, want %.15g", r, rin, want)
		}
		checkBalance(t, s)
	}
}

// TestLadderAgainstGonum checks a 500-node ladder, the benchmark case,
// against the independent dense solve.
func TestLadderAgainstGonum(t *testing.T) {
	n := ladder(250, 10)
	s := solve(t, n)
	nodes, ref := referenceVoltages(t, n)
	diff := make([]complex128, len(nodes))
	for i, name := range nodes {
		diff[i] = s.Voltage[name] - ref[i]
	}
	if norm(diff) > 1e-9*norm(ref) {
		t.Errorf("‖v − v_ref‖ = %g", norm(diff))
	}
	// A ladder is a chain: eliminated from its ends, it fills nothing,
	// so L and U hold no more than the matrix itself.
	if s.Factor > 4*s.Unknowns {
		t.Errorf("%d entries in the LU factors of %d unknowns, want a few per unknown", s.Factor, s.Unknowns)
	}
}

// TestShortedCurrentSource: a current source with an ideal short across it
// is legal; all its current flows in the short (common practice).
func TestShortedCurrentSource(t *testing.T) {
	n := network("0", isrc("I1", "0", "a", 2), imp("W", "a", "0", 0), res("R1", "a", "0", 10))
	s := solve(t, n)
	if i := branch(t, s, "W").I; cmplx.Abs(i-2) > 1e-12 {
		t.Errorf("short current %v, want 2 A", i)
	}
	if v := s.Voltage["a"]; v != 0 {
		t.Errorf("V(a) = %v, want 0", v)
	}
	checkBalance(t, s)
}

// TestSelfLoopPassive: a passive element joined to one node only carries
// nothing and is noted.
func TestSelfLoopPassive(t *testing.T) {
	n := network("0", vsrc("V1", "0", "a", 5), res("R1", "a", "0", 5), res("R9", "a", "a", 1))
	s := solve(t, n)
	if b := branch(t, s, "R9"); b.I != 0 || b.V != 0 {
		t.Errorf("R9: V = %v, I = %v, want 0", b.V, b.I)
	}
	if len(s.Notes) == 0 || !strings.Contains(s.Notes[0], "R9") {
		t.Errorf("notes %q do not mention R9", s.Notes)
	}
}

// TestSteps checks the shape of the steps: the method step with node
// voltages, one element step per element with v, i and s, and the balance
// step, with the right dimensions.
func TestSteps(t *testing.T) {
	n := network("0", vsrc("V1", "0", "a", 10), res("R1", "a", "b", 3), imp("X1", "b", "0", complex(0, 4)), isrc("I1", "0", "b", 1))
	s := solve(t, n)
	steps := s.Steps(calc.Format{})
	if len(steps) != 2+len(n.Elements) {
		t.Fatalf("%d steps, want %d", len(steps), 2+len(n.Elements))
	}
	head := steps[0]
	if head.Kind != "nodal" || !strings.Contains(head.Rule, "Ho, Ruehli & Brennan") {
		t.Errorf("head step %q: %q", head.Kind, head.Rule)
	}
	if len(head.Results) != 2 || head.Results[0].Name != "V(a)" || head.Results[0].Value.Dim != calc.DimVoltage {
		t.Errorf("node results %+v", head.Results)
	}
	for _, st := range steps[1 : len(steps)-1] {
		if st.Kind != "element" || len(st.Rows) != 1 || len(st.Rows[0].Values) != 3 {
			t.Fatalf("element step %+v", st)
		}
		v := st.Rows[0].Values
		if v[0].Name != "v" || v[1].Name != "i" || v[2].Name != "s" ||
			v[0].Value.Dim != calc.DimVoltage || v[1].Value.Dim != calc.DimCurrent || v[2].Value.Dim != calc.DimPower {
			t.Errorf("row %+v", st.Rows[0])
		}
	}
	bal := steps[len(steps)-1]
	if bal.Kind != "balance" || len(bal.Results) != 2 || bal.Results[1].Value.Dim != calc.DimPower {
		t.Errorf("balance step %+v", bal)
	}
	for _, st := range steps {
		for _, o := range append(st.Results, st.Inputs...) {
			if cmplx.IsNaN(o.Value.V) || cmplx.IsInf(o.Value.V) {
				t.Errorf("%s: %s is not finite", st.Kind, o.Name)
			}
		}
	}
}

// TestNaturalNodeOrder: nodes are listed with digit runs by value.
func TestNaturalNodeOrder(t *testing.T) {
	n := network("0", vsrc("V1", "0", "n10", 1), res("R1", "n10", "n2", 1), res("R2", "n2", "n1", 1), res("R3", "n1", "0", 1))
	s := solve(t, n)
	want := []string{"0", "n1", "n2", "n10"}
	if fmt.Sprint(s.Nodes) != fmt.Sprint(want) {
		t.Errorf("nodes %v, want %v", s.Nodes, want)
	}
}

// TestImpedanceAt checks X_L = ωL and X_C = −1/(ωC) with ω = 2πf (common
// practice) and the errors for bad frequencies and values.
func TestImpedanceAt(t *testing.T) {
	w := 2 * math.Pi * 50
	tests := []struct {
		e    reduce.Element
		f    float64
		want complex128
		err  string
	}{
		{reduce.Element{Name: "R1", Kind: reduce.Resistor, Raw: 100}, 50, 100, ""},
		{reduce.Element{Name: "L1", Kind: reduce.Inductor, Raw: 0.1}, 50, complex(0, w*0.1), ""},
		{reduce.Element{Name: "C1", Kind: reduce.Capacitor, Raw: 10e-6}, 50, complex(0, -1/(w*10e-6)), ""},
		{reduce.Element{Name: "Z1", Kind: reduce.Impedance, Raw: complex(3, 4)}, 60, complex(3, 4), ""},
		{reduce.Element{Name: "L0", Kind: reduce.Inductor, Raw: 0}, 50, 0, ""},
		{reduce.Element{Name: "C0", Kind: reduce.Capacitor, Raw: 0}, 50, 0, "open circuit"},
		{reduce.Element{Name: "C1", Kind: reduce.Capacitor, Raw: 1e-6}, 0, 0, "positive"},
		{reduce.Element{Name: "C1", Kind: reduce.Capacitor, Raw: 1e-6}, -50, 0, "positive"},
		{reduce.Element{Name: "C1", Kind: reduce.Capacitor, Raw: 1e-6}, math.NaN(), 0, "positive"},
		{reduce.Element{Name: "L1", Kind: reduce.Inductor, Raw: complex(1, 1)}, 50, 0, "real"},
		{reduce.Element{Name: "V1", Kind: reduce.VoltageSource, Value: 1}, 50, 0, "no impedance"},
		{reduce.Element{Name: "C9", Kind: reduce.Capacitor, Raw: 1e-320}, 1e-10, 0, "too large"},
	}
	for _, tt := range tests {
		z, err := tt.e.ImpedanceAt(tt.f)
		switch {
		case tt.err != "":
			if err == nil || !strings.Contains(err.Error(), tt.err) {
				t.Errorf("%s at %g Hz: error %v, want one saying %q", tt.e.Name, tt.f, err, tt.err)
			}
		case err != nil:
			t.Errorf("%s at %g Hz: %v", tt.e.Name, tt.f, err)
		case cmplx.Abs(z-tt.want) > 1e-12*cmplx.Abs(tt.want):
			t.Errorf("%s at %g Hz: Z = %v, want %v", tt.e.Name, tt.f, z, tt.want)
		}
	}
}

// TestAtThenSolve: a series RLC at its resonance f₀ = 1/(2π√(LC)) draws
// V/R (common practice), through Network.At.
func TestAtThenSolve(t *testing.T) {
	L, C, R := 0.1, 10e-6, 22.0
	f0 := 1 / (2 * math.Pi * math.Sqrt(L*C))
	n := network("0", vsrc("V1", "0", "a", 230),
		reduce.Element{Name: "R1", Kind: reduce.Resistor, From: "a", To: "b", Raw: complex(R, 0)},
		reduce.Element{Name: "L1", Kind: reduce.Inductor, From: "b", To: "c", Raw: complex(L, 0)},
		reduce.Element{Name: "C1", Kind: reduce.Capacitor, From: "c", To: "0", Raw: complex(C, 0)})
	if _, err := nodal.Solve(n, calc.RMS); err == nil || !strings.Contains(err.Error(), "frequency") {
		t.Errorf("solve before At: %v, want an error about the frequency", err)
	}
	nf, err := n.At(f0)
	if err != nil {
		t.Fatal(err)
	}
	if n.Elements[1].Z != 0 {
		t.Error("At modified the receiver")
	}
	s := solve(t, nf)
	if i := branch(t, s, "R1").I; cmplx.Abs(i-complex(230/R, 0)) > 1e-9*230/R {
		t.Errorf("current at resonance %v, want %g A", i, 230/R)
	}
}

// TestWideRange: impedances nine orders of magnitude apart still solve.
// The limit is float64 itself, not the solver: the assembled node
// admittance 10³ S + 10⁻⁶ S keeps the smaller term only to about 1e-7, and
// R1's current comes from a voltage difference 10⁻⁹ of the node voltages.
// So the bounds here are looser than elsewhere, and stated: V(a) to 1e-8 of
// the closed form V(a) = I·(R2‖(R1+R3)) (common practice), I(R1) to 1e-6,
// KCL to 1e-6 of the largest branch current.
func TestWideRange(t *testing.T) {
	r1, r2, r3 := 1e-3, 1e6, 1e6
	n := network("0", isrc("I1", "0", "a", 1), res("R1", "a", "b", r1), res("R2", "a", "0", r2), res("R3", "b", "0", r3))
	s := solve(t, n)
	want := r2 * (r1 + r3) / (r1 + r2 + r3)
	if got := s.Voltage["a"]; cmplx.Abs(got-complex(want, 0)) > 1e-8*want {
		t.Errorf("V(a) = %v, want %.15g", got, want)
	}
	wantI := r2 / (r1 + r2 + r3)
	if got := branch(t, s, "R1").I; cmplx.Abs(got-complex(wantI, 0)) > 1e-6*wantI {
		t.Errorf("I(R1) = %v, want %.15g", got, wantI)
	}
	if s.MaxKCL > 1e-6*s.MaxI {
		t.Errorf("KCL residual %g", s.MaxKCL)
	}
}

// TestCaution: above extra-low voltage (50 V a.c. RMS, IEC 60449 band I,
// from memory) the method step carries the safety caution; below it, not.
func TestCaution(t *testing.T) {
	tests := []struct {
		v     complex128
		basis calc.Basis
		want  bool
	}{
		{230, calc.RMS, true},
		{24, calc.RMS, false},
		{60, calc.Peak, false}, // 42 V RMS
		{325, calc.Peak, true},
	}
	for _, tt := range tests {
		n := network("0", vsrc("V1", "0", "a", tt.v), res("R1", "a", "0", 100))
		s, err := nodal.Solve(n, tt.basis)
		if err != nil {
			t.Fatal(err)
		}
		head := s.Steps(calc.Format{})[0]
		got := len(head.Cautions) == 1 && head.Cautions[0].Topic == calc.CautionMains
		if got != tt.want {
			t.Errorf("%v V %v: caution %v, want %v", tt.v, tt.basis, got, tt.want)
		}
	}
}

// TestTinyNetworks: the smallest networks solve without fuss: a lone
// voltage source (no current, nothing to drive), and a passive element
// joined to the reference at both ends (no unknowns at all).
func TestTinyNetworks(t *testing.T) {
	s := solve(t, network("0", vsrc("V1", "0", "a", 5)))
	if s.Voltage["a"] != 5 || branch(t, s, "V1").I != 0 {
		t.Errorf("lone source: V(a) = %v, I = %v", s.Voltage["a"], branch(t, s, "V1").I)
	}
	s = solve(t, network("0", res("R1", "0", "0", 5)))
	if s.Unknowns != 0 || len(s.Nodes) != 1 || s.PowerSum != 0 {
		t.Errorf("self loop at the reference: %+v", s)
	}
	if st := s.Steps(calc.Format{}); len(st) != 3 {
		t.Errorf("%d steps", len(st))
	}
}

// TestSpecks: rounding specks are shown as 0 (the middle of a balanced
// bridge), but a tiny jumper keeps its real current: 230 V over 23 Ω in
// series with a 1 pΩ jumper drives 10 A through both (Ohm's law).
func TestSpecks(t *testing.T) {
	n := network("0", vsrc("V1", "0", "top", 230),
		res("R1", "top", "l", 100), res("R2", "l", "0", 200), res("R3", "top", "r", 150), res("R4", "r", "0", 300), res("G", "l", "r", 47))
	if i := branch(t, solve(t, n), "G").I; i != 0 {
		t.Errorf("balanced bridge: middle current %v, want exactly 0", i)
	}
	n = network("0", vsrc("V1", "0", "a", 230), res("R1", "a", "b", 23), res("J1", "b", "0", 1e-12))
	if i := branch(t, solve(t, n), "J1").I; cmplx.Abs(i-10) > 1e-9*10 {
		t.Errorf("jumper current %v, want 10 A", i)
	}
}
