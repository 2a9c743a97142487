package reduce

import (
	"errors"
	"math"
	"math/cmplx"
	"math/rand/v2"
	"strings"
	"testing"

	"argand/calc"
)

const tol = 1e-9

func close(a, b complex128) bool {
	return cmplx.Abs(a-b) <= tol*math.Max(1, math.Max(cmplx.Abs(a), cmplx.Abs(b)))
}

func z(name string, v complex128) calc.Operand {
	return calc.Operand{Name: name, Value: calc.Q(v, calc.DimImpedance)}
}
func y(name string, v complex128) calc.Operand {
	return calc.Operand{Name: name, Value: calc.Q(v, calc.DimAdmittance)}
}
func volt(v complex128) calc.Operand {
	return calc.Operand{Name: "V", Value: calc.Q(v, calc.DimVoltage)}
}
func amp(v complex128) calc.Operand {
	return calc.Operand{Name: "I", Value: calc.Q(v, calc.DimCurrent)}
}

func randZ(r *rand.Rand) complex128 {
	return complex(r.Float64()*100, (r.Float64()-0.5)*200)
}

// checkStep asserts what every step must carry: a kind, a rule, a formula,
// named inputs and results, and no NaN or infinity.
func checkStep(t *testing.T, st calc.Step, kind string) {
	t.Helper()
	if st.Kind != kind || st.Rule == "" || st.Formula == "" || len(st.Results) == 0 || len(st.Inputs) == 0 {
		t.Errorf("step incomplete: %+v (want kind %q)", st, kind)
	}
	for _, o := range append(append([]calc.Operand(nil), st.Inputs...), st.Results...) {
		if o.Name == "" {
			t.Errorf("step %q: unnamed operand", kind)
		}
		if _, err := o.Value.Check("test"); err != nil {
			t.Errorf("step %q: %s is not finite", kind, o.Name)
		}
	}
}

func TestSeries(t *testing.T) {
	tests := []struct {
		name  string
		parts []calc.Operand
		want  calc.Quantity
		note  string
	}{
		// impedances in series add (common practice)
		{"RL", []calc.Operand{z("R", 3), z("L", 4i)}, calc.Q(3+4i, calc.DimImpedance), ""},
		{"three", []calc.Operand{z("", 1), z("", 2-1i), z("", 3+1i)}, calc.Q(6, calc.DimImpedance), ""},
		{"LC resonance", []calc.Operand{z("L", 10i), z("C", -10i)}, calc.Q(0, calc.DimImpedance), "series resonance"},
		// admittances in series: reciprocals add
		{"admittances", []calc.Operand{y("", 0.1), y("", 0.1)}, calc.Q(0.05, calc.DimAdmittance), ""},
		{"open admittance", []calc.Operand{y("Y1", 0), y("Y2", 0.1)}, calc.Q(0, calc.DimAdmittance), "open circuit"},
	}
	for _, tc := range tests {
		got, steps, err := Series(tc.parts...)
		if err != nil {
			t.Errorf("%s: %v", tc.name, err)
			continue
		}
		if got.Dim != tc.want.Dim || !close(got.V, tc.want.V) {
			t.Errorf("%s: got %v %v, want %v", tc.name, got.V, got.Dim, tc.want.V)
		}
		checkStep(t, steps[0], "series")
		if tc.note != "" && (len(steps[0].Notes) == 0 || !strings.Contains(steps[0].Notes[0], tc.note)) {
			t.Errorf("%s: notes %q lack %q", tc.name, steps[0].Notes, tc.note)
		}
	}
}

func TestParallel(t *testing.T) {
	// product over sum (common practice): 10 Ω ‖ 10 Ω = 5 Ω; 3 ‖ 6 = 2;
	// 6 ‖ 6 ‖ 6 = 2; j10 ‖ 10 = 5 + j5
	tests := []struct {
		name  string
		parts []calc.Operand
		want  complex128
		d     calc.Dim
	}{
		{"equal", []calc.Operand{z("", 10), z("", 10)}, 5, calc.DimImpedance},
		{"3 and 6", []calc.Operand{z("", 3), z("", 6)}, 2, calc.DimImpedance},
		{"three 6", []calc.Operand{z("", 6), z("", 6), z("", 6)}, 2, calc.DimImpedance},
		{"RL", []calc.Operand{z("", 10i), z("", 10)}, 5 + 5i, calc.DimImpedance},
		{"admittances add", []calc.Operand{y("", 0.1), y("", 0.2i)}, 0.1 + 0.2i, calc.DimAdmittance},
	}
	for _, tc := range tests {
		got, steps, err := Parallel(tc.parts...)
		if err != nil {
			t.Errorf("%s: %v", tc.name, err)
			continue
		}
		if got.Dim != tc.d || !close(got.V, tc.want) {
			t.Errorf("%s: got %v, want %v", tc.name, got.V, tc.want)
		}
		checkStep(t, steps[0], "parallel")
	}
}

func TestParallelCommutes(t *testing.T) {
	r := rand.New(rand.NewPCG(1, 2))
	for k := 0; k < 200; k++ {
		a, b, c := randZ(r), randZ(r), randZ(r)
		ab, _, err1 := Parallel(z("a", a), z("b", b))
		ba, _, err2 := Parallel(z("b", b), z("a", a))
		abc, _, err3 := Parallel(z("a", a), z("b", b), z("c", c))
		cab, _, err4 := Parallel(z("c", c), z("a", a), z("b", b))
		if err := errors.Join(err1, err2, err3, err4); err != nil {
			t.Fatal(err)
		}
		// product over sum and the summed admittances agree
		direct := 1 / (1/a + 1/b)
		if !close(ab.V, ba.V) || !close(ab.V, direct) || !close(abc.V, cab.V) {
			t.Errorf("%v ‖ %v: %v, %v, %v; three: %v, %v", a, b, ab.V, ba.V, direct, abc.V, cab.V)
		}
		// (a ‖ b) ‖ c = a ‖ b ‖ c
		nested, _, _ := Parallel(z("ab", ab.V), z("c", c))
		if !close(nested.V, abc.V) {
			t.Errorf("associativity: %v vs %v", nested.V, abc.V)
		}
	}
}

func TestParallelShortAndOpen(t *testing.T) {
	// 0 ‖ Z = 0: a short in parallel shorts the group (common practice)
	got, steps, err := Parallel(z("W", 0), z("R", 47))
	if err != nil || got.V != 0 || len(steps[0].Notes) == 0 || !strings.Contains(steps[0].Notes[0], "short") {
		t.Errorf("0 ‖ 47: %v %v %v", got, steps, err)
	}
	// j10 ‖ −j10: the admittances cancel, an open circuit
	for _, parts := range [][]calc.Operand{
		{z("L", 10i), z("C", -10i)},
		{z("L", 10i), z("C1", -20i), z("C2", -20i)},
	} {
		_, _, err := Parallel(parts...)
		if !errors.Is(err, calc.ErrOpenCircuit) {
			t.Errorf("%v: want ErrOpenCircuit, got %v", parts, err)
		}
	}
}

func TestAdmittance(t *testing.T) {
	yq, steps, err := ToAdmittance(z("Z", 3+4i))
	if err != nil || !close(yq.V, 1/(3+4i)) || yq.Dim != calc.DimAdmittance {
		t.Fatalf("1/(3+j4): %v %v", yq, err)
	}
	checkStep(t, steps[0], "admittance")
	back, _, err := ToImpedance(y("Y", yq.V))
	if err != nil || !close(back.V, 3+4i) || back.Dim != calc.DimImpedance {
		t.Errorf("round trip: %v %v", back, err)
	}
	if _, _, err := ToAdmittance(z("W", 0)); err == nil || !strings.Contains(err.Error(), "short") {
		t.Errorf("1/0 Ω: %v", err)
	}
	if _, _, err := ToImpedance(y("G", 0)); err == nil || !strings.Contains(err.Error(), "open") {
		t.Errorf("1/0 S: %v", err)
	}
}

// The voltages across the impedances of a string add up to the supply
// (Kirchhoff's voltage law), and each is in proportion to its impedance
// (the voltage divider, common practice).
func TestVoltageDivider(t *testing.T) {
	r := rand.New(rand.NewPCG(3, 4))
	for k := 0; k < 100; k++ {
		v := complex(r.Float64()*400-200, r.Float64()*400-200)
		zs := []complex128{randZ(r), randZ(r), randZ(r), randZ(r)}
		var sum complex128
		var total complex128
		for _, x := range zs {
			total += x
		}
		for i := range zs {
			ops := []calc.Operand{z("Zk", zs[i])}
			for j := range zs {
				if j != i {
					ops = append(ops, z("", zs[j]))
				}
			}
			vk, steps, err := VoltageDivider(volt(v), ops[0], ops[1:]...)
			if err != nil {
				t.Fatal(err)
			}
			checkStep(t, steps[0], "divider")
			if !close(vk.V, v*zs[i]/total) {
				t.Errorf("V_k = %v, want %v", vk.V, v*zs[i]/total)
			}
			sum += vk.V
		}
		if !close(sum, v) {
			t.Errorf("ΣV_k = %v, want %v", sum, v)
		}
	}
	// 120 V across 30 Ω and 90 Ω: 30 V across the 30 Ω (common practice)
	vk, _, _ := VoltageDivider(volt(120), z("R1", 30), z("R2", 90))
	if !close(vk.V, 30) {
		t.Errorf("120·30/120 = %v", vk.V)
	}
	_, _, err := VoltageDivider(volt(10), z("L", 5i), z("C", -5i))
	if err == nil || !strings.Contains(err.Error(), "series resonance: the string's impedances sum to 0") {
		t.Errorf("resonant string: %v", err)
	}
}

// The branch currents of a parallel group add up to the feed (Kirchhoff's
// current law), and impedance and admittance forms agree (common practice).
func TestCurrentDivider(t *testing.T) {
	r := rand.New(rand.NewPCG(5, 6))
	for k := 0; k < 100; k++ {
		i := complex(r.Float64()*20-10, r.Float64()*20-10)
		zs := []complex128{randZ(r), randZ(r), randZ(r)}
		var sum complex128
		for n := range zs {
			ops := []calc.Operand{z("Zk", zs[n])}
			yops := []calc.Operand{y("Yk", 1/zs[n])}
			for m := range zs {
				if m != n {
					ops = append(ops, z("", zs[m]))
					yops = append(yops, y("", 1/zs[m]))
				}
			}
			ik, steps, err := CurrentDivider(amp(i), ops[0], ops[1:]...)
			if err != nil {
				t.Fatal(err)
			}
			checkStep(t, steps[0], "current-divider")
			iy, _, err := CurrentDivider(amp(i), yops[0], yops[1:]...)
			if err != nil || !close(ik.V, iy.V) {
				t.Errorf("Ω form %v, S form %v, %v", ik.V, iy.V, err)
			}
			sum += ik.V
		}
		if !close(sum, i) {
			t.Errorf("ΣI_k = %v, want %v", sum, i)
		}
	}
	// 6 A into 10 Ω ‖ 20 Ω: 4 A in the 10 Ω (common practice)
	ik, _, _ := CurrentDivider(amp(6), z("R1", 10), z("R2", 20))
	if !close(ik.V, 4) {
		t.Errorf("6·20/30 = %v", ik.V)
	}
	// a short takes the whole current
	ik, _, err := CurrentDivider(amp(6), z("W", 0), z("R", 20))
	if err != nil || ik.V != 6 {
		t.Errorf("short branch: %v %v", ik.V, err)
	}
	ik, _, err = CurrentDivider(amp(6), z("R", 20), z("W", 0))
	if err != nil || ik.V != 0 {
		t.Errorf("beside a short: %v %v", ik.V, err)
	}
	if _, _, err := CurrentDivider(amp(6), z("W1", 0), z("W2", 0)); err == nil {
		t.Error("two shorts: no error")
	}
	if _, _, err := CurrentDivider(amp(1), z("L", 10i), z("C", -10i)); !errors.Is(err, calc.ErrOpenCircuit) {
		t.Errorf("resonant tank: %v", err)
	}
}

// For any load, the current from the Thevenin equivalent equals the
// current in the full circuit (Thevenin's theorem, common practice), and
// the Norton form gives the same: V_th = I_N·Z_th.
func TestThevenin(t *testing.T) {
	r := rand.New(rand.NewPCG(7, 8))
	for k := 0; k < 200; k++ {
		v := complex(r.Float64()*400-200, r.Float64()*400-200)
		z1, z2, zl := randZ(r), randZ(r), randZ(r)
		eq, steps, err := Thevenin(volt(v), z("Z1", z1), z("Z2", z2))
		if err != nil {
			t.Fatal(err)
		}
		for _, st := range steps {
			checkStep(t, st, st.Kind)
		}
		// full circuit: Z1 in series with Z2 ‖ ZL
		zp := z2 * zl / (z2 + zl)
		is := v / (z1 + zp)
		il := (v - is*z1) / zl
		if got := eq.V.V / (eq.Z.V + zl); !close(got, il) {
			t.Errorf("load current %v, full circuit %v", got, il)
		}
		if !close(eq.I.V*eq.Z.V, eq.V.V) || !close(eq.Y.V*eq.Z.V, 1) {
			t.Errorf("Norton: I·Z = %v, V = %v", eq.I.V*eq.Z.V, eq.V.V)
		}
		n, _, err := TheveninToNorton(calc.Operand{Name: "Vth", Value: eq.V}, calc.Operand{Name: "Zth", Value: eq.Z})
		if err != nil || !close(n.I.V, eq.I.V) {
			t.Errorf("Thevenin→Norton %v, %v", n.I.V, err)
		}
		th, _, err := NortonToThevenin(calc.Operand{Name: "In", Value: n.I}, calc.Operand{Name: "Yn", Value: n.Y})
		if err != nil || !close(th.V.V, eq.V.V) || !close(th.Z.V, eq.Z.V) {
			t.Errorf("round trip %v %v, %v", th.V.V, th.Z.V, err)
		}
		th2, _, err := NortonToThevenin(calc.Operand{Name: "In", Value: n.I}, calc.Operand{Name: "Zn", Value: n.Z})
		if err != nil || !close(th2.V.V, eq.V.V) {
			t.Errorf("Norton with Z in Ω: %v, %v", th2.V.V, err)
		}
	}
	// 12 V behind 4 Ω with a 12 Ω shunt: V_th = 9 V, Z_th = 3 Ω, I_N = 3 A
	// (common practice)
	eq, _, err := Thevenin(volt(12), z("R1", 4), z("R2", 12))
	if err != nil || !close(eq.V.V, 9) || !close(eq.Z.V, 3) || !close(eq.I.V, 3) {
		t.Errorf("12 V, 4 Ω, 12 Ω: %+v %v", eq, err)
	}
}

func TestIdealSources(t *testing.T) {
	// no series impedance: an ideal voltage source, with no Norton form
	eq, _, err := Thevenin(volt(10), z("Z1", 0), z("Z2", 5))
	if err != nil || !eq.NoNorton || eq.V.V != 10 || eq.Z.V != 0 {
		t.Errorf("ideal voltage source: %+v %v", eq, err)
	}
	_, _, err = TheveninToNorton(volt(10), z("Z", 0))
	if !errors.Is(err, ErrIdealVoltageSource) || !strings.Contains(err.Error(), "voltage source") {
		t.Errorf("Z = 0: %v", err)
	}
	_, _, err = NortonToThevenin(amp(2), y("Y", 0))
	if !errors.Is(err, ErrIdealCurrentSource) || !strings.Contains(err.Error(), "current source") {
		t.Errorf("Y = 0: %v", err)
	}
	// a current source shorted by its shunt is a 0 V source
	eq, _, err = NortonToThevenin(amp(2), z("Z", 0))
	if err != nil || eq.V.V != 0 || !eq.NoNorton {
		t.Errorf("shorted current source: %+v %v", eq, err)
	}
	if _, _, err := Thevenin(volt(10), z("L", 5i), z("C", -5i)); err == nil || !strings.Contains(err.Error(), "series resonance") {
		t.Errorf("resonant divider: %v", err)
	}
}

// A balanced Δ of Z is equivalent to a Y of Z/3 (common practice), and
// Δ→Y→Δ and Y→Δ→Y return the starting impedances.
func TestDeltaY(t *testing.T) {
	for _, zz := range []complex128{30, 12 + 9i, -6i} {
		a, b, c, steps, err := DeltaToY(z("", zz), z("", zz), z("", zz))
		if err != nil {
			t.Fatal(err)
		}
		checkStep(t, steps[0], "delta-y")
		for _, got := range []calc.Quantity{a, b, c} {
			if !close(got.V, zz/3) {
				t.Errorf("Δ of %v: arm %v, want %v", zz, got.V, zz/3)
			}
		}
		ab, bc, ca, steps, err := YToDelta(z("", zz/3), z("", zz/3), z("", zz/3))
		if err != nil {
			t.Fatal(err)
		}
		checkStep(t, steps[0], "y-delta")
		for _, got := range []calc.Quantity{ab, bc, ca} {
			if !close(got.V, zz) {
				t.Errorf("Y of %v: side %v, want %v", zz/3, got.V, zz)
			}
		}
	}
	// an unbalanced example: Δ of 10, 20, 30 Ω (ab, bc, ca) gives
	// Z_a = 10·30/60 = 5, Z_b = 20·10/60 = 10/3, Z_c = 30·20/60 = 10
	a, b, c, _, _ := DeltaToY(z("", 10), z("", 20), z("", 30))
	if !close(a.V, 5) || !close(b.V, 10.0/3) || !close(c.V, 10) {
		t.Errorf("Δ 10, 20, 30: %v %v %v", a.V, b.V, c.V)
	}
	r := rand.New(rand.NewPCG(9, 10))
	for k := 0; k < 200; k++ {
		d := [3]complex128{randZ(r), randZ(r), randZ(r)}
		a, b, c, _, err := DeltaToY(z("ab", d[0]), z("bc", d[1]), z("ca", d[2]))
		if err != nil {
			t.Fatal(err)
		}
		ab, bc, ca, _, err := YToDelta(calc.Operand{Name: "a", Value: a}, calc.Operand{Name: "b", Value: b}, calc.Operand{Name: "c", Value: c})
		if err != nil {
			t.Fatal(err)
		}
		if !close(ab.V, d[0]) || !close(bc.V, d[1]) || !close(ca.V, d[2]) {
			t.Errorf("Δ→Y→Δ %v → %v %v %v", d, ab.V, bc.V, ca.V)
		}
		// the impedance between two nodes with the third open is the same
		// both ways: Z_a + Z_b = Z_ab ‖ (Z_bc + Z_ca)
		want := d[0] * (d[1] + d[2]) / (d[0] + d[1] + d[2])
		if !close(a.V+b.V, want) {
			t.Errorf("terminal impedance a–b: Y %v, Δ %v", a.V+b.V, want)
		}
	}
	if _, _, _, _, err := YToDelta(z("", 0), z("", 5), z("", 5)); err == nil || !strings.Contains(err.Error(), "open") {
		t.Errorf("Y with a 0 Ω arm: %v", err)
	}
	if _, _, _, _, err := DeltaToY(z("", 10i), z("", -5i), z("", -5i)); err == nil {
		t.Error("resonant Δ: no error")
	}
}

func TestDimensionErrors(t *testing.T) {
	bad := []struct {
		name string
		run  func() error
		want string
	}{
		{"series of V and Ω", func() error { _, _, err := Series(volt(1), z("R", 1)); return err }, "impedance (Ω) or an admittance (S)"},
		{"series of Ω and S", func() error { _, _, err := Series(z("R", 1), y("G", 1)); return err }, "all of them in Ω or all in S"},
		{"parallel of A", func() error { _, _, err := Parallel(amp(1), amp(1)); return err }, "a current (A)"},
		{"divider of A", func() error { _, _, err := VoltageDivider(amp(1), z("R", 1), z("R2", 1)); return err }, "a voltage (V) is needed"},
		{"divider of S", func() error { _, _, err := VoltageDivider(volt(1), y("G", 1), z("R2", 1)); return err }, "an impedance (Ω) is needed"},
		{"current divider of V", func() error { _, _, err := CurrentDivider(volt(1), z("R", 1), z("R2", 1)); return err }, "a current (A) is needed"},
		{"Norton of A", func() error { _, _, err := TheveninToNorton(amp(1), z("R", 1)); return err }, "a voltage (V) is needed"},
		{"Norton of V and V", func() error { _, _, err := TheveninToNorton(volt(1), volt(1)); return err }, "impedance (Ω) or an admittance (S)"},
		{"Thevenin form of V", func() error { _, _, err := NortonToThevenin(volt(1), y("G", 1)); return err }, "a current (A) is needed"},
		{"Δ of S", func() error { _, _, _, _, err := DeltaToY(y("", 1), z("", 1), z("", 1)); return err }, "an impedance (Ω) is needed"},
		{"admittance of V", func() error { _, _, err := ToAdmittance(volt(1)); return err }, "an impedance (Ω) is needed"},
	}
	for _, tc := range bad {
		err := tc.run()
		if err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("%s: got %v, want an error containing %q", tc.name, err, tc.want)
		}
	}
}

func TestOverflowIsAnError(t *testing.T) {
	if _, _, err := Series(z("", 1e308), z("", 1e308)); err == nil {
		t.Error("1e308 + 1e308: no error")
	}
	if q, _, err := Parallel(z("", 1e300), z("", 1e300)); err != nil || !close(q.V, 5e299) {
		t.Errorf("1e300 ‖ 1e300: %v %v", q.V, err)
	}
	if _, _, err := VoltageDivider(volt(1e308), z("", 1e10), z("", -9.9e9)); err == nil {
		t.Error("divider overflow: no error")
	}
}
