package threephase

import (
	"math"
	"math/cmplx"
	"slices"
	"strings"
	"testing"

	"gonum.org/v1/gonum/mat"

	"argand/calc"
)

const tol = 1e-9

func close(a, b complex128) bool {
	return cmplx.Abs(a-b) <= tol*math.Max(1, math.Max(cmplx.Abs(a), cmplx.Abs(b)))
}

func polar(m, deg float64) complex128 { return cmplx.Rect(m, deg*math.Pi/180) }

func V(v complex128) calc.Quantity { return calc.Q(v, calc.DimVoltage) }
func I(v complex128) calc.Quantity { return calc.Q(v, calc.DimCurrent) }
func Z(v complex128) calc.Quantity { return calc.Q(v, calc.DimImpedance) }
func W(x float64) calc.Quantity {
	return calc.Quantity{V: complex(x, 0), Dim: calc.DimPower, Kind: calc.KindActive}
}

func hasCaution(t *testing.T, steps []calc.Step) {
	t.Helper()
	for _, s := range steps {
		for _, c := range s.Cautions {
			if c.Topic == calc.CautionMains {
				return
			}
		}
	}
	t.Errorf("no caution note in %d steps", len(steps))
}

// 1 + a + a² = 0 with a = 1∠120° (common practice).
func TestOperatorA(t *testing.T) {
	a := A()
	if s := 1 + a + a*a; cmplx.Abs(s) > 1e-15 {
		t.Errorf("1 + a + a² = %v, want 0", s)
	}
	if !close(a, polar(1, 120)) {
		t.Errorf("a = %v, want 1∠120°", a)
	}
	if !close(a*a*a, 1) {
		t.Errorf("a³ = %v, want 1", a*a*a)
	}
}

// √3 ratios and ±30° shifts for both sequences (shared DESIGN.md; common
// practice): V_ab = √3·V_an∠+30° and I_a = √3·I_ab∠−30° for ABC, signs
// flipped for ACB. Each expected value is also formed directly from the
// phasors: V_ab = V_an − V_bn and I_a = I_ab − I_ca.
func TestLinePhase(t *testing.T) {
	tests := []struct {
		seq   Sequence
		shift float64 // Y voltage shift in degrees
	}{
		{ABC, 30},
		{ACB, -30},
	}
	for _, tt := range tests {
		van := polar(230, 10)
		set := phaseSet(van, tt.seq)
		direct := set[0] - set[1]
		want := polar(230*math.Sqrt(3), 10+tt.shift)
		if !close(direct, want) {
			t.Fatalf("%v: V_an − V_bn = %v, want %v", tt.seq, direct, want)
		}
		got, steps, err := PhaseToLine(V(van), Wye, tt.seq)
		if err != nil || !close(got.V, want) || got.Dim != calc.DimVoltage {
			t.Errorf("%v: PhaseToLine Y voltage = %v, %v; want %v", tt.seq, got, err, want)
		}
		hasCaution(t, steps)
		back, _, err := LineToPhase(got, Wye, tt.seq)
		if err != nil || !close(back.V, van) {
			t.Errorf("%v: LineToPhase Y voltage = %v, %v; want %v", tt.seq, back, err, van)
		}

		iab := polar(12, -40)
		cur := phaseSet(iab, tt.seq) // I_ab, I_bc, I_ca
		direct = cur[0] - cur[2]
		want = polar(12*math.Sqrt(3), -40-tt.shift)
		if !close(direct, want) {
			t.Fatalf("%v: I_ab − I_ca = %v, want %v", tt.seq, direct, want)
		}
		got, _, err = PhaseToLine(I(iab), Delta, tt.seq)
		if err != nil || !close(got.V, want) {
			t.Errorf("%v: PhaseToLine Δ current = %v, %v; want %v", tt.seq, got, err, want)
		}
		back, _, err = LineToPhase(got, Delta, tt.seq)
		if err != nil || !close(back.V, iab) {
			t.Errorf("%v: LineToPhase Δ current = %v, %v; want %v", tt.seq, back, err, iab)
		}
		// Y current and Δ voltage pass unchanged
		for _, q := range []struct {
			x    calc.Quantity
			conn Connection
		}{{I(iab), Wye}, {V(van), Delta}} {
			got, _, err := PhaseToLine(q.x, q.conn, tt.seq)
			if err != nil || got.V != q.x.V {
				t.Errorf("%v: PhaseToLine(%v, %v) = %v, %v; want unchanged", tt.seq, q.x, q.conn, got, err)
			}
		}
	}
}

func TestLinePhaseErrors(t *testing.T) {
	tests := []struct {
		x   calc.Quantity
		seq Sequence
	}{
		{Z(5), ABC},
		{V(complex(math.NaN(), 0)), ABC},
		{V(1), 0},
		{V(1), 2},
	}
	for _, tt := range tests {
		if _, _, err := PhaseToLine(tt.x, Wye, tt.seq); err == nil {
			t.Errorf("PhaseToLine(%v, seq %d): no error", tt.x, tt.seq)
		}
	}
}

// The sequence components of a balanced ABC set are (0, V, 0) and of a
// balanced ACB set (0, 0, V) (common practice); phases→sequence→phases
// returns the input.
func TestSymmetricalComponents(t *testing.T) {
	va := polar(100, 25)
	abc := phaseSet(va, ABC)
	acb := phaseSet(va, ACB)
	tests := []struct {
		name  string
		x     [3]complex128
		want  [3]complex128
		check bool
	}{
		{"balanced ABC", abc, [3]complex128{0, va, 0}, true},
		{"balanced ACB", acb, [3]complex128{0, 0, va}, true},
		{"all equal (pure zero sequence)", [3]complex128{va, va, va}, [3]complex128{va, 0, 0}, true},
		{"unbalanced", [3]complex128{100, polar(80, -110), polar(120, 135)}, [3]complex128{}, false},
		{"one phase only", [3]complex128{30, 0, 0}, [3]complex128{10, 10, 10}, true},
	}
	for _, tt := range tests {
		r, steps, err := ToSequence(V(tt.x[0]), V(tt.x[1]), V(tt.x[2]))
		if err != nil {
			t.Fatalf("%s: %v", tt.name, err)
		}
		hasCaution(t, steps)
		if tt.check {
			for k := range r {
				if cmplx.Abs(r[k].V-tt.want[k]) > tol*cmplx.Abs(va) {
					t.Errorf("%s: component %d = %v, want %v", tt.name, k, r[k].V, tt.want[k])
				}
			}
		}
		back, _, err := FromSequence(r[0], r[1], r[2])
		if err != nil {
			t.Fatalf("%s: %v", tt.name, err)
		}
		for k := range back {
			if !close(back[k].V, tt.x[k]) || back[k].Dim != calc.DimVoltage {
				t.Errorf("%s: round trip phase %d = %v, want %v", tt.name, k, back[k], tt.x[k])
			}
		}
	}
	if _, _, err := ToSequence(V(1), I(1), V(1)); err == nil {
		t.Error("ToSequence of mixed units: no error")
	}
}

// A hand-checkable balanced load: 400 V line (IEC 60038 nominal 230/400 V
// system) on 10 Ω per phase. In Y: I = 400/√3/10 A and P = 400²/10 W =
// 16 kW; in Δ: I_ph = 40 A, I_L = 40·√3 A and P = 3·400²/10 W = 48 kW
// (common practice: a Δ load takes three times the power of the same
// impedances in Y).
func TestBalancedHandChecked(t *testing.T) {
	tests := []struct {
		conn       Connection
		basis      calc.Basis
		p, il, iph float64
	}{
		{Wye, calc.RMS, 16000, 40 / math.Sqrt(3), 40 / math.Sqrt(3)},
		{Delta, calc.RMS, 48000, 40 * math.Sqrt(3), 40},
		{Wye, calc.Peak, 8000, 40 / math.Sqrt(3), 40 / math.Sqrt(3)},
	}
	for _, tt := range tests {
		for _, seq := range []Sequence{ABC, ACB} {
			b, steps, err := SolveBalanced(V(400), Z(10), tt.conn, seq, tt.basis)
			if err != nil {
				t.Fatal(err)
			}
			hasCaution(t, steps)
			if math.Abs(real(b.P.V)-tt.p) > tol*tt.p || math.Abs(real(b.Q.V)) > tol*tt.p {
				t.Errorf("%v %v %v: P, Q = %v, %v; want %v, 0", tt.conn, seq, tt.basis, b.P.V, b.Q.V, tt.p)
			}
			if math.Abs(b.ILine.Mag()-tt.il) > tol*tt.il || math.Abs(b.IPhase.Mag()-tt.iph) > tol*tt.iph {
				t.Errorf("%v %v: I_L, I_ph = %v, %v; want %v, %v", tt.conn, seq, b.ILine.Mag(), b.IPhase.Mag(), tt.il, tt.iph)
			}
			if b.P.Kind != calc.KindActive || b.Q.Kind != calc.KindReactive || b.S.Kind != calc.KindApparent {
				t.Errorf("power kinds: %v %v %v", b.P.Kind, b.Q.Kind, b.S.Kind)
			}
		}
	}
}

// A balanced load solved through its per-phase equivalent must agree with
// the same impedances solved phase by phase as an unbalanced load, and
// |S| = √3·V_L·I_L (common practice).
func TestBalancedAgreesWithPerPhase(t *testing.T) {
	zs := []complex128{complex(8, 6), complex(3, -4), complex(0, 5), 12}
	vl := V(polar(415, 15))
	for _, z := range zs {
		for _, seq := range []Sequence{ABC, ACB} {
			for _, conn := range []Connection{Wye, Delta} {
				b, _, err := SolveBalanced(vl, Z(z), conn, seq, calc.RMS)
				if err != nil {
					t.Fatal(err)
				}
				var s, ia complex128
				if conn == Wye {
					van, _, _ := LineToPhase(vl, Wye, seq)
					for _, neutral := range []bool{true, false} {
						w, _, err := SolveWye(van, [3]calc.Quantity{Z(z), Z(z), Z(z)}, neutral, seq, calc.RMS)
						if err != nil {
							t.Fatal(err)
						}
						s, ia = w.S.V, w.I[0].V
						if cmplx.Abs(w.IN.V) > tol*cmplx.Abs(ia) || cmplx.Abs(w.VShift.V) > tol*vl.Mag() {
							t.Errorf("balanced Y: I_N = %v, V_nN = %v; want 0", w.IN.V, w.VShift.V)
						}
					}
				} else {
					d, _, err := SolveDelta(vl, [3]calc.Quantity{Z(z), Z(z), Z(z)}, seq, calc.RMS)
					if err != nil {
						t.Fatal(err)
					}
					s, ia = d.S.V, d.ILine[0].V
				}
				if !close(s, b.S.V) || !close(ia, b.ILine.V) {
					t.Errorf("%v %v Z=%v: S, I_a = %v, %v; per phase %v, %v", conn, seq, z, b.S.V, b.ILine.V, s, ia)
				}
				if m := math.Sqrt(3) * vl.Mag() * b.ILine.Mag(); math.Abs(b.Apparent.Mag()-m) > tol*m {
					t.Errorf("|S| = %v, √3·V_L·I_L = %v", b.Apparent.Mag(), m)
				}
			}
		}
	}
}

// mna solves a network of ideal voltage sources from the reference to
// nodes and impedances between nodes by modified nodal analysis, written
// as the real 2n×2n system [Re −Im; Im Re] and solved with gonum's dense
// LU solver, an implementation independent of this package. Node −1 is
// the reference. It returns node voltages and the currents each source
// drives into its node.
type branch struct {
	from, to int
	z        complex128
}
type source struct {
	node int
	e    complex128
}

func mna(t *testing.T, nodes int, branches []branch, sources []source) ([]complex128, []complex128) {
	t.Helper()
	n := nodes + len(sources)
	a := make([]complex128, n*n)
	b := make([]complex128, n)
	add := func(i, j int, v complex128) {
		if i >= 0 && j >= 0 {
			a[i*n+j] += v
		}
	}
	for _, br := range branches {
		y := 1 / br.z
		add(br.from, br.from, y)
		add(br.to, br.to, y)
		add(br.from, br.to, -y)
		add(br.to, br.from, -y)
	}
	for k, s := range sources {
		row := nodes + k
		add(s.node, row, -1) // the source current enters its node
		add(row, s.node, 1)
		b[row] = s.e
	}
	m := mat.NewDense(2*n, 2*n, nil)
	rhs := mat.NewVecDense(2*n, nil)
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			v := a[i*n+j]
			m.Set(i, j, real(v))
			m.Set(i, n+j, -imag(v))
			m.Set(n+i, j, imag(v))
			m.Set(n+i, n+j, real(v))
		}
		rhs.SetVec(i, real(b[i]))
		rhs.SetVec(n+i, imag(b[i]))
	}
	var x mat.VecDense
	if err := x.SolveVec(m, rhs); err != nil {
		t.Fatalf("gonum solve: %v", err)
	}
	out := make([]complex128, n)
	for i := range out {
		out[i] = complex(x.AtVec(i), x.AtVec(n+i))
	}
	return out[:nodes], out[nodes:]
}

var unbalancedLoads = [][3]complex128{
	{complex(10, 0), complex(5, 5), complex(2, -8)},
	{complex(20, 15), complex(20, 15), complex(40, -10)},
	{complex(0.5, 0), complex(100, 0), complex(0, 30)},
	{complex(6, 8), complex(6, -8), complex(10, 0)},
}

// Unbalanced Y, neutral connected: the phase currents sum to the neutral
// current (Kirchhoff's current law at the star point), and every current
// agrees with a gonum dense solve of the same network. Floating star
// point: the line currents sum to zero and the shift and currents agree
// with the gonum solve.
func TestUnbalancedWyeAgainstGonum(t *testing.T) {
	for _, zs := range unbalancedLoads {
		for _, seq := range []Sequence{ABC, ACB} {
			for _, neutral := range []bool{true, false} {
				vph := polar(230, -5)
				set := phaseSet(vph, seq)
				w, steps, err := SolveWye(V(vph), [3]calc.Quantity{Z(zs[0]), Z(zs[1]), Z(zs[2])}, neutral, seq, calc.RMS)
				if err != nil {
					t.Fatal(err)
				}
				hasCaution(t, steps)
				// nodes A, B, C = 0, 1, 2; star point n = 3
				br := []branch{{0, 3, zs[0]}, {1, 3, zs[1]}, {2, 3, zs[2]}}
				src := []source{{0, set[0]}, {1, set[1]}, {2, set[2]}}
				if neutral {
					src = append(src, source{3, 0})
				}
				v, j := mna(t, 4, br, src)
				sum := w.I[0].V + w.I[1].V + w.I[2].V
				scale := w.I[0].Mag() + w.I[1].Mag() + w.I[2].Mag()
				for k := 0; k < 3; k++ {
					if cmplx.Abs(w.I[k].V-j[k]) > tol*scale {
						t.Errorf("%v %v neutral=%v: I_%c = %v, gonum %v", zs, seq, neutral, 'a'+k, w.I[k].V, j[k])
					}
				}
				if neutral {
					if cmplx.Abs(sum-w.IN.V) > tol*scale || cmplx.Abs(w.IN.V+j[3]) > tol*scale {
						t.Errorf("%v: ΣI = %v, I_N = %v, gonum %v", zs, sum, w.IN.V, -j[3])
					}
				} else {
					if cmplx.Abs(sum) > tol*scale {
						t.Errorf("%v floating: ΣI = %v, want 0", zs, sum)
					}
					if cmplx.Abs(w.VShift.V-v[3]) > tol*230 {
						t.Errorf("%v floating: V_nN = %v, gonum %v", zs, w.VShift.V, v[3])
					}
				}
			}
		}
	}
}

// Unbalanced Δ: line currents agree with a gonum solve of the same network
// and sum to zero.
func TestUnbalancedDeltaAgainstGonum(t *testing.T) {
	for _, zs := range unbalancedLoads {
		for _, seq := range []Sequence{ABC, ACB} {
			vab := polar(400, 30)
			d, steps, err := SolveDelta(V(vab), [3]calc.Quantity{Z(zs[0]), Z(zs[1]), Z(zs[2])}, seq, calc.RMS)
			if err != nil {
				t.Fatal(err)
			}
			hasCaution(t, steps)
			// a balanced supply with the line voltages V_ab etc.
			van := vab / (complex(math.Sqrt(3), 0) * shift30(seq.sign()))
			set := phaseSet(van, seq)
			br := []branch{{0, 1, zs[0]}, {1, 2, zs[1]}, {2, 0, zs[2]}}
			_, j := mna(t, 3, br, []source{{0, set[0]}, {1, set[1]}, {2, set[2]}})
			scale := d.ILine[0].Mag() + d.ILine[1].Mag() + d.ILine[2].Mag()
			for k := 0; k < 3; k++ {
				if cmplx.Abs(d.ILine[k].V-j[k]) > tol*scale {
					t.Errorf("%v %v: I_%c = %v, gonum %v", zs, seq, 'a'+k, d.ILine[k].V, j[k])
				}
			}
			if s := d.ILine[0].V + d.ILine[1].V + d.ILine[2].V; cmplx.Abs(s) > tol*scale {
				t.Errorf("ΣI_line = %v", s)
			}
		}
	}
}

func TestUnbalancedEdgeCases(t *testing.T) {
	v := V(230)
	// one phase shorted with a floating star point: the star point sits on
	// that line and the other phases take line voltage
	w, _, err := SolveWye(v, [3]calc.Quantity{Z(0), Z(10), Z(10)}, false, ABC, calc.RMS)
	if err != nil {
		t.Fatal(err)
	}
	set := phaseSet(230, ABC)
	if !close(w.VShift.V, set[0]) || !close(w.I[1].V, (set[1]-set[0])/10) {
		t.Errorf("shorted phase: V_nN = %v, I_b = %v", w.VShift.V, w.I[1].V)
	}
	if s := w.I[0].V + w.I[1].V + w.I[2].V; cmplx.Abs(s) > 1e-9 {
		t.Errorf("shorted phase: ΣI = %v", s)
	}
	errs := []struct {
		name    string
		z       [3]complex128
		neutral bool
	}{
		{"zero impedance with neutral", [3]complex128{0, 1, 1}, true},
		{"two zero impedances", [3]complex128{0, 0, 1}, false},
		// Y_a + Y_b + Y_c = −j + j/2 + j/2 = 0
		{"admittances cancel", [3]complex128{complex(0, 1), complex(0, -2), complex(0, -2)}, false},
	}
	for _, e := range errs {
		if _, _, err := SolveWye(v, [3]calc.Quantity{Z(e.z[0]), Z(e.z[1]), Z(e.z[2])}, e.neutral, ABC, calc.RMS); err == nil {
			t.Errorf("%s: no error", e.name)
		}
	}
	if _, _, err := SolveDelta(v, [3]calc.Quantity{Z(1), Z(0), Z(1)}, ABC, calc.RMS); err == nil {
		t.Error("Δ with a zero impedance: no error")
	}
	if _, _, err := SolveWye(I(1), [3]calc.Quantity{Z(1), Z(1), Z(1)}, true, ABC, calc.RMS); err == nil {
		t.Error("SolveWye with a current for voltage: no error")
	}
	if _, _, err := SolveBalanced(V(400), Z(0), Wye, ABC, calc.RMS); err == nil {
		t.Error("SolveBalanced with Z = 0: no error")
	}
}

// Two-wattmeter method on a balanced load (common practice): P = W1 + W2
// and Q = √3·(W1 − W2). The readings are computed directly from phasors
// for the wiring documented on Wattmeters, W1 = Re(V_ac·I_a*) and
// W2 = Re(V_bc·I_b*), and compared with TwoWattmeterReadings and with
// the total power 3·V_an·I_a*.
func TestTwoWattmeter(t *testing.T) {
	zs := []complex128{complex(8, 6), complex(8, -6), 10, complex(1, 5), complex(0.2, -9), complex(0, 4)}
	for _, z := range zs {
		for _, seq := range []Sequence{ABC, ACB} {
			van := polar(230, 0)
			vs := phaseSet(van, seq)
			var is [3]complex128
			for k := range vs {
				is[k] = vs[k] / z
			}
			w1 := real((vs[0] - vs[2]) * cmplx.Conj(is[0]))
			w2 := real((vs[1] - vs[2]) * cmplx.Conj(is[1]))
			s := 3 * van * cmplx.Conj(is[0])
			scale := cmplx.Abs(s)
			if math.Abs(w1+w2-real(s)) > tol*scale {
				t.Errorf("%v %v: W1 + W2 = %v, P = %v", z, seq, w1+w2, real(s))
			}
			q := math.Sqrt(3) * (w1 - w2)
			if seq == ACB {
				q = -q
			}
			if math.Abs(q-imag(s)) > tol*scale {
				t.Errorf("%v %v: ±√3(W1 − W2) = %v, Q = %v", z, seq, q, imag(s))
			}

			pf := math.Cos(cmplx.Phase(z))
			r, steps, err := TwoWattmeterReadings(V(van*complex(math.Sqrt(3), 0)), I(is[0]), pf, imag(z) >= 0, seq, calc.RMS)
			if err != nil {
				t.Fatal(err)
			}
			hasCaution(t, steps)
			if math.Abs(real(r.W1.V)-w1) > tol*scale || math.Abs(real(r.W2.V)-w2) > tol*scale {
				t.Errorf("%v %v: readings %v, %v; from phasors %v, %v", z, seq, r.W1.V, r.W2.V, w1, w2)
			}
			back, _, err := FromWattmeters(W(w1), W(w2), seq)
			if err != nil {
				t.Fatal(err)
			}
			if cmplx.Abs(back.S.V-s) > tol*scale {
				t.Errorf("%v %v: FromWattmeters S = %v, want %v", z, seq, back.S.V, s)
			}
			if math.Abs(back.PF-pf) > 1e-9 || back.Lagging != (imag(s) > tol*scale) {
				t.Errorf("%v %v: pf %v lagging %v; want %v", z, seq, back.PF, back.Lagging, pf)
			}
		}
	}
}

func TestWattmeterErrors(t *testing.T) {
	for _, pf := range []float64{-0.1, 1.1, math.NaN()} {
		if _, _, err := TwoWattmeterReadings(V(400), I(10), pf, true, ABC, calc.RMS); err == nil {
			t.Errorf("pf %v: no error", pf)
		}
	}
	if _, _, err := FromWattmeters(W(1), calc.Q(complex(1, 1), calc.DimPower), ABC); err == nil {
		t.Error("complex reading: no error")
	}
	r, _, err := FromWattmeters(W(0), W(0), ABC)
	if err != nil || r.PFDefined {
		t.Errorf("zero readings: %v, %v; want pf undefined", r, err)
	}
}

func arg(q calc.Quantity) calc.Arg { return calc.Arg{Q: q, Text: "x"} }
func wd(w string) calc.Arg         { return calc.Arg{Word: w, Text: w} }
func num(x float64) calc.Arg       { return arg(calc.Number(complex(x, 0))) }

// Every function returns finite values, the caution, and the extras it
// documents; a few values are checked against the direct API.
func TestFuncs(t *testing.T) {
	fs := map[string]calc.Func{}
	for _, f := range Funcs() {
		if f.Doc == "" || f.Args == "" || f.Formula == "" || f.Call == nil {
			t.Errorf("%s: incomplete documentation", f.Name)
		}
		fs[f.Name] = f
	}
	tests := []struct {
		name  string
		args  []calc.Arg
		extra []string
		want  complex128
	}{
		{"line2phase", []calc.Arg{arg(V(400)), wd("wye")}, nil, 400 / (complex(math.Sqrt(3), 0) * shift30(1))},
		{"phase2line", []calc.Arg{arg(I(10)), wd("delta")}, nil, 10 * complex(math.Sqrt(3), 0) * shift30(-1)},
		{"seq", []calc.Arg{arg(V(100)), arg(V(polar(100, -120))), arg(V(polar(100, 120)))}, []string{"zero", "pos", "neg"}, 100},
		{"phases", []calc.Arg{arg(V(0)), arg(V(100)), arg(V(0))}, []string{"a", "b", "c"}, 100},
		{"wye", []calc.Arg{arg(V(230)), arg(Z(10)), arg(Z(10)), arg(Z(10)), wd("neutral")}, []string{"ia", "ib", "ic", "in", "vshift"}, 0},
		{"wye", []calc.Arg{arg(V(230)), arg(Z(10)), arg(Z(20)), arg(Z(30)), wd("floating")}, []string{"ia", "ib", "ic", "in", "vshift"}, 0},
		{"delta", []calc.Arg{arg(V(400)), arg(Z(10)), arg(Z(10)), arg(Z(10))}, []string{"iab", "ibc", "ica", "ia", "ib", "ic", "s"}, 40 * complex(math.Sqrt(3), 0) * shift30(-1)},
		{"balanced", []calc.Arg{arg(V(400)), arg(Z(10)), wd("wye")}, []string{"p", "q", "s", "il", "iph"}, 16000},
		{"wattmeters", []calc.Arg{arg(V(400)), arg(I(10)), num(1), wd("lagging")}, []string{"w1", "w2"}, complex(4000*math.Sqrt(3)/2, 0)},
		{"fromwattmeters", []calc.Arg{arg(W(3000)), arg(W(1000))}, []string{"p", "q", "pf"}, 4000},
	}
	for _, tt := range tests {
		f, ok := fs[tt.name]
		if !ok {
			t.Fatalf("no function %s", tt.name)
		}
		if len(tt.args) < f.Min || len(tt.args) > f.Max {
			t.Fatalf("%s: %d args outside [%d, %d]", tt.name, len(tt.args), f.Min, f.Max)
		}
		r, err := f.Call(&calc.Context{Freq: 50, Sequence: 1}, tt.args)
		if err != nil {
			t.Errorf("%s: %v", tt.name, err)
			continue
		}
		if tt.want != 0 && !close(r.Value.V, tt.want) {
			t.Errorf("%s: value %v, want %v", tt.name, r.Value.V, tt.want)
		}
		if !slices.ContainsFunc(r.Cautions, func(c calc.StepCaution) bool { return c.Topic == calc.CautionMains }) {
			t.Errorf("%s: no caution", tt.name)
		}
		if len(r.Steps) == 0 {
			t.Errorf("%s: no steps", tt.name)
		}
		names := map[string]bool{}
		for _, e := range r.Extra {
			names[e.Name] = true
			if _, err := e.Value.Check("extra"); err != nil {
				t.Errorf("%s.%s: %v", tt.name, e.Name, err)
			}
		}
		for _, e := range tt.extra {
			if !names[e] {
				t.Errorf("%s: no extra %q", tt.name, e)
			}
		}
	}
	// a quantity where a word belongs, and a word where a quantity belongs
	if _, err := fs["balanced"].Call(&calc.Context{}, []calc.Arg{arg(V(400)), arg(Z(10)), arg(V(1))}); err == nil {
		t.Error("balanced with a value for the connection: no error")
	}
	if _, err := fs["seq"].Call(&calc.Context{}, []calc.Arg{wd("wye"), arg(V(1)), arg(V(1))}); err == nil {
		t.Error("seq with a word: no error")
	}
	// ACB from the context flips the shift
	r, err := fs["phase2line"].Call(&calc.Context{Sequence: -1}, []calc.Arg{arg(V(100)), wd("wye")})
	if err != nil || !close(r.Value.V, polar(100*math.Sqrt(3), -30)) {
		t.Errorf("phase2line ACB = %v, %v", r.Value.V, err)
	}
}

// Every step and function text turns into pure ASCII for --ascii output.
func TestASCIIText(t *testing.T) {
	var steps []calc.Step
	add := func(s []calc.Step, err error) {
		if err != nil {
			t.Fatal(err)
		}
		steps = append(steps, s...)
	}
	for _, seq := range []Sequence{ABC, ACB} {
		for _, conn := range []Connection{Wye, Delta} {
			_, s, err := PhaseToLine(V(100), conn, seq)
			add(s, err)
			_, s, err = LineToPhase(I(10), conn, seq)
			add(s, err)
			_, s, err = SolveBalanced(V(400), Z(complex(3, 4)), conn, seq, calc.Peak)
			add(s, err)
		}
		zs := [3]calc.Quantity{Z(1), Z(2), Z(complex(0, 3))}
		_, s, err := SolveWye(V(230), zs, true, seq, calc.RMS)
		add(s, err)
		_, s, err = SolveWye(V(230), zs, false, seq, calc.RMS)
		add(s, err)
		_, s, err = SolveDelta(V(400), zs, seq, calc.RMS)
		add(s, err)
		_, s, err = TwoWattmeterReadings(V(400), I(10), 0.3, false, seq, calc.Peak)
		add(s, err)
		_, s, err = FromWattmeters(W(100), W(-30), seq)
		add(s, err)
	}
	_, s, err := ToSequence(V(1), V(2), V(3))
	add(s, err)
	_, s, err = FromSequence(V(1), V(2), V(3))
	add(s, err)
	for _, st := range steps {
		txt := st.Text(calc.Format{ASCII: true}, true)
		for i := 0; i < len(txt); i++ {
			if txt[i] >= 0x80 {
				t.Fatalf("non-ASCII byte %#x in\n%s", txt[i], txt)
			}
		}
	}
	for _, f := range Funcs() {
		for _, s := range []string{f.Doc, f.Args, f.Formula} {
			a := calc.ASCIIText(s)
			for i := 0; i < len(a); i++ {
				if a[i] >= 0x80 {
					t.Errorf("%s: non-ASCII after ASCIIText: %q", f.Name, a)
					break
				}
			}
		}
	}
}

// The voltage unbalance factor u2 = |V2|/|V1| read from the symmetrical
// components agrees with the closed form from the three line-to-line
// magnitudes alone (IEC 61000-4-30, from memory):
//
//	β = (U12⁴ + U23⁴ + U31⁴)/(U12² + U23² + U31²)²,  u2 = √((1 − √(3 − 6β))/(1 + √(3 − 6β)))
//
// The line voltages of any set hold no zero sequence, so the two must
// agree for any supply. The closed form loses half its digits near balance
// (a square root of a difference near zero), hence the absolute 1e-7.
func TestVoltageUnbalanceFactor(t *testing.T) {
	sets := [][3]complex128{
		{polar(230, 0), polar(225, -118), polar(236, 121)},
		{polar(230, 0), polar(230, -120), polar(230, 120)},
		{polar(240, 0), polar(200, -125), polar(220, 118)},
		{polar(230, 10), polar(115, -110), polar(230, 130)},
	}
	for _, ph := range sets {
		l := [3]complex128{ph[0] - ph[1], ph[1] - ph[2], ph[2] - ph[0]}
		r, _, err := ToSequence(V(l[0]), V(l[1]), V(l[2]))
		if err != nil {
			t.Fatal(err)
		}
		u, st, err := UnbalanceOf(r, ABC)
		if err != nil {
			t.Fatal(err)
		}
		var s2, s4 float64
		for _, v := range l {
			m2 := real(v)*real(v) + imag(v)*imag(v)
			s2 += m2
			s4 += m2 * m2
		}
		beta := s4 / (s2 * s2)
		root := math.Sqrt(math.Max(0, 3-6*beta))
		want := math.Sqrt(math.Max(0, (1-root)/(1+root)))
		if math.Abs(real(u.Neg.V)-want) > 1e-7 {
			t.Errorf("%v: u2 = %v, from line magnitudes %v", ph, real(u.Neg.V), want)
		}
		if real(u.Zero.V) != 0 {
			t.Errorf("%v: line voltages have zero sequence %v", ph, u.Zero.V)
		}
		if !strings.Contains(st.Rule, "IEC 61000-4-30") {
			t.Errorf("the step names no source: %q", st.Rule)
		}
		// an ACB supply: the same set with b and c swapped has the same
		// unbalance when read in its own rotation
		ra, _, _ := ToSequence(V(l[0]), V(l[2]), V(l[1]))
		ua, _, err := UnbalanceOf(ra, ACB)
		if err != nil || math.Abs(real(ua.Neg.V)-real(u.Neg.V)) > 1e-12 {
			t.Errorf("ACB: %v, %v; want %v", ua.Neg.V, err, u.Neg.V)
		}
	}
	if _, _, err := UnbalanceOf([3]calc.Quantity{V(1), V(0), V(1)}, ABC); err == nil {
		t.Error("no positive sequence: no error")
	}
}
