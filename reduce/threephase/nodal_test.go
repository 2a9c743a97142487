package threephase

import (
	"fmt"
	"math/cmplx"
	"strings"
	"testing"

	"argand/calc"
	"argand/reduce"
	"argand/reduce/nodal"
)

// The floating star point from Millman's theorem agrees with argand's own
// nodal engine on the same network (a cross-check between two parts of the
// project; the gonum test above is the outside reference).
func TestWyeAgainstNodal(t *testing.T) {
	for _, zs := range unbalancedLoads {
		for _, seq := range []Sequence{ABC, ACB} {
			vph := polar(230, 20)
			set := phaseSet(vph, seq)
			w, _, err := SolveWye(V(vph), [3]calc.Quantity{Z(zs[0]), Z(zs[1]), Z(zs[2])}, false, seq, calc.RMS)
			if err != nil {
				t.Fatal(err)
			}
			n := &reduce.Network{Reference: "N", Elements: []reduce.Element{
				{Name: "Ea", Kind: reduce.VoltageSource, From: "N", To: "A", Value: set[0]},
				{Name: "Eb", Kind: reduce.VoltageSource, From: "N", To: "B", Value: set[1]},
				{Name: "Ec", Kind: reduce.VoltageSource, From: "N", To: "C", Value: set[2]},
				{Name: "Za", Kind: reduce.Impedance, From: "A", To: "n", Z: zs[0]},
				{Name: "Zb", Kind: reduce.Impedance, From: "B", To: "n", Z: zs[1]},
				{Name: "Zc", Kind: reduce.Impedance, From: "C", To: "n", Z: zs[2]},
			}}
			sol, err := nodal.Solve(n, calc.RMS)
			if err != nil {
				t.Fatal(err)
			}
			if got := sol.Voltage["n"]; cmplx.Abs(got-w.VShift.V) > tol*230 {
				t.Errorf("%v %v: V_nN = %v, nodal %v", zs, seq, w.VShift.V, got)
			}
		}
	}
}

// The neutral cases against argand's nodal engine (package nodal, modified
// nodal analysis through its public API): a Y load with its star point n
// joined to the supply's N solidly, through Z_N or not at all, on a
// balanced or an unbalanced supply. SolveWyeSupply works by Millman's
// theorem, the engine by an LU solve of the whole network: two different
// computations of the same circuit.
func TestNeutralCasesAgainstNodal(t *testing.T) {
	supplies := map[string][3]complex128{
		"balanced ABC":      phaseSet(polar(230, 0), ABC),
		"unbalanced":        {polar(240, 0), polar(220, -117), polar(231, 125)},
		"one phase lost":    {polar(230, 0), polar(230, -120), 0},
		"sag on b, ACB set": {polar(230, 15), polar(180, 135), polar(230, -105)},
	}
	links := []struct {
		name string
		l    Link
		zn   complex128 // element between n and N; -1 for none
	}{
		{"solid", Link{Kind: NeutralSolid}, 0},
		{"open", Link{Kind: NeutralOpen}, -1},
		{"Z_N 0.5 Ω", Link{Kind: NeutralThrough, Z: Z(0.5)}, 0.5},
		{"Z_N 3+j4 Ω", Link{Kind: NeutralThrough, Z: Z(complex(3, 4))}, complex(3, 4)},
		{"Z_N 200 Ω", Link{Kind: NeutralThrough, Z: Z(200)}, 200},
	}
	for sname, vs := range supplies {
		for _, zs := range unbalancedLoads {
			for _, lk := range links {
				name := sname + ", " + lk.name
				w, steps, err := SolveWyeSupply([3]calc.Quantity{V(vs[0]), V(vs[1]), V(vs[2])},
					[3]calc.Quantity{Z(zs[0]), Z(zs[1]), Z(zs[2])}, lk.l, ABC, calc.RMS)
				if err != nil {
					t.Fatalf("%s: %v", name, err)
				}
				hasCaution(t, steps)
				n := &reduce.Network{Reference: "N", Elements: []reduce.Element{
					{Name: "Ea", Kind: reduce.VoltageSource, From: "N", To: "A", Value: vs[0]},
					{Name: "Eb", Kind: reduce.VoltageSource, From: "N", To: "B", Value: vs[1]},
					{Name: "Ec", Kind: reduce.VoltageSource, From: "N", To: "C", Value: vs[2]},
					{Name: "Za", Kind: reduce.Impedance, From: "A", To: "n", Z: zs[0]},
					{Name: "Zb", Kind: reduce.Impedance, From: "B", To: "n", Z: zs[1]},
					{Name: "Zc", Kind: reduce.Impedance, From: "C", To: "n", Z: zs[2]},
				}}
				if lk.zn != -1 {
					n.Elements = append(n.Elements, reduce.Element{Name: "ZN", Kind: reduce.Impedance, From: "n", To: "N", Z: lk.zn})
				}
				sol, err := nodal.Solve(n, calc.RMS)
				if err != nil {
					t.Fatalf("%s: nodal: %v", name, err)
				}
				scale := 0.0
				for k := 0; k < 3; k++ {
					scale += cmplx.Abs(sol.Branches[3+k].I)
				}
				for k := 0; k < 3; k++ {
					if got, want := w.I[k].V, sol.Branches[3+k].I; cmplx.Abs(got-want) > tol*scale {
						t.Errorf("%s %v: I_%c = %v, nodal %v", name, zs, 'a'+k, got, want)
					}
					if got, want := w.VLoad[k].V, sol.Branches[3+k].V; cmplx.Abs(got-want) > tol*250 {
						t.Errorf("%s %v: V_%cn = %v, nodal %v", name, zs, 'a'+k, got, want)
					}
				}
				if got := sol.Voltage["n"]; cmplx.Abs(got-w.VShift.V) > tol*250 {
					t.Errorf("%s %v: V_nN = %v, nodal %v", name, zs, w.VShift.V, got)
				}
				var wantIN complex128
				if lk.zn != -1 {
					wantIN = sol.Branches[6].I
				}
				if cmplx.Abs(w.IN.V-wantIN) > tol*scale {
					t.Errorf("%s %v: I_N = %v, nodal %v", name, zs, w.IN.V, wantIN)
				}
				// the neutral impedance's power, against the engine's
				if lk.l.Kind == NeutralThrough {
					if got, want := w.SN.V, sol.Branches[6].S; cmplx.Abs(got-want) > tol*(cmplx.Abs(want)+1) {
						t.Errorf("%s %v: S_N = %v, nodal %v", name, zs, got, want)
					}
				}
			}
		}
	}
}

// An open neutral on a lightly and a heavily loaded phase: the load voltages
// against the nodal engine, and the step says what each load sees.
func TestOpenNeutralLoadVoltages(t *testing.T) {
	zs := [3]complex128{5, 50, 50} // invented example data
	vs := phaseSet(polar(230, 0), ABC)
	w, steps, err := SolveWyeSupply([3]calc.Quantity{V(vs[0]), V(vs[1]), V(vs[2])}, [3]calc.Quantity{Z(zs[0]), Z(zs[1]), Z(zs[2])}, Link{Kind: NeutralOpen}, ABC, calc.RMS)
	if err != nil {
		t.Fatal(err)
	}
	n := &reduce.Network{Reference: "N", Elements: []reduce.Element{
		{Name: "Ea", Kind: reduce.VoltageSource, From: "N", To: "A", Value: vs[0]},
		{Name: "Eb", Kind: reduce.VoltageSource, From: "N", To: "B", Value: vs[1]},
		{Name: "Ec", Kind: reduce.VoltageSource, From: "N", To: "C", Value: vs[2]},
		{Name: "Za", Kind: reduce.Impedance, From: "A", To: "n", Z: zs[0]},
		{Name: "Zb", Kind: reduce.Impedance, From: "B", To: "n", Z: zs[1]},
		{Name: "Zc", Kind: reduce.Impedance, From: "C", To: "n", Z: zs[2]},
	}}
	sol, err := nodal.Solve(n, calc.RMS)
	if err != nil {
		t.Fatal(err)
	}
	text := ""
	for _, st := range steps {
		text += strings.Join(st.Notes, "\n") + "\n"
	}
	for k := 0; k < 3; k++ {
		want := cmplx.Abs(sol.Branches[3+k].V)
		if !close(complex(w.VLoad[k].Mag(), 0), complex(want, 0)) {
			t.Errorf("|V_%cn| = %v, nodal %v", 'a'+k, w.VLoad[k].Mag(), want)
		}
		if !strings.Contains(text, fmt.Sprintf("phase %c load sees %s", 'a'+k, calc.Format{}.Mag(want, calc.DimVoltage, calc.KindPlain))) {
			t.Errorf("no line for phase %c in %q", 'a'+k, text)
		}
	}
	// the lightly loaded phases see more than the phase voltage: said so
	if w.VLoad[1].Mag() <= 230 || !strings.Contains(text, "up to the line-to-line voltage") {
		t.Errorf("open neutral: |V_bn| = %v, notes %q", w.VLoad[1].Mag(), text)
	}
}

// A phase of zero impedance ties the star point to its line; with a
// neutral impedance the neutral then carries V_aN/Z_N. Against the nodal
// engine, where the shorted phase is a 0 Ω element.
func TestShortedPhaseWithNeutralImpedance(t *testing.T) {
	vs := [3]complex128{polar(235, 3), polar(228, -118), polar(231, 121)}
	zs := [3]complex128{complex(12, 4), 0, complex(30, -10)}
	zn := complex(1.5, 0.5)
	w, _, err := SolveWyeSupply([3]calc.Quantity{V(vs[0]), V(vs[1]), V(vs[2])}, [3]calc.Quantity{Z(zs[0]), Z(zs[1]), Z(zs[2])},
		Link{Kind: NeutralThrough, Z: Z(zn)}, ABC, calc.RMS)
	if err != nil {
		t.Fatal(err)
	}
	n := &reduce.Network{Reference: "N", Elements: []reduce.Element{
		{Name: "Ea", Kind: reduce.VoltageSource, From: "N", To: "A", Value: vs[0]},
		{Name: "Eb", Kind: reduce.VoltageSource, From: "N", To: "B", Value: vs[1]},
		{Name: "Ec", Kind: reduce.VoltageSource, From: "N", To: "C", Value: vs[2]},
		{Name: "Za", Kind: reduce.Impedance, From: "A", To: "n", Z: zs[0]},
		{Name: "Zb", Kind: reduce.Impedance, From: "B", To: "n", Z: zs[1]},
		{Name: "Zc", Kind: reduce.Impedance, From: "C", To: "n", Z: zs[2]},
		{Name: "ZN", Kind: reduce.Impedance, From: "n", To: "N", Z: zn},
	}}
	sol, err := nodal.Solve(n, calc.RMS)
	if err != nil {
		t.Fatal(err)
	}
	for k := 0; k < 3; k++ {
		if got, want := w.I[k].V, sol.Branches[3+k].I; cmplx.Abs(got-want) > tol*cmplx.Abs(want) {
			t.Errorf("I_%c = %v, nodal %v", 'a'+k, got, want)
		}
	}
	if got, want := w.IN.V, sol.Branches[6].I; cmplx.Abs(got-want) > tol*cmplx.Abs(want) {
		t.Errorf("I_N = %v, nodal %v", got, want)
	}
	if !close(w.VShift.V, vs[1]) {
		t.Errorf("V_nN = %v, want V_bN %v", w.VShift.V, vs[1])
	}
}

// An unbalanced Δ load on an unbalanced supply against the nodal engine:
// the supply is three Y sources of unequal phase voltages, so its line
// voltages V_ab = V_aN − V_bN etc. are unbalanced and sum to zero.
func TestDeltaSupplyAgainstNodal(t *testing.T) {
	vs := [3]complex128{polar(240, 0), polar(220, -117), polar(231, 125)}
	vl := [3]complex128{vs[0] - vs[1], vs[1] - vs[2], vs[2] - vs[0]}
	for _, zs := range unbalancedLoads {
		d, steps, err := SolveDeltaSupply([3]calc.Quantity{V(vl[0]), V(vl[1]), V(vl[2])}, [3]calc.Quantity{Z(zs[0]), Z(zs[1]), Z(zs[2])}, ABC, calc.RMS)
		if err != nil {
			t.Fatal(err)
		}
		hasCaution(t, steps)
		n := &reduce.Network{Reference: "N", Elements: []reduce.Element{
			{Name: "Ea", Kind: reduce.VoltageSource, From: "N", To: "A", Value: vs[0]},
			{Name: "Eb", Kind: reduce.VoltageSource, From: "N", To: "B", Value: vs[1]},
			{Name: "Ec", Kind: reduce.VoltageSource, From: "N", To: "C", Value: vs[2]},
			{Name: "Zab", Kind: reduce.Impedance, From: "A", To: "B", Z: zs[0]},
			{Name: "Zbc", Kind: reduce.Impedance, From: "B", To: "C", Z: zs[1]},
			{Name: "Zca", Kind: reduce.Impedance, From: "C", To: "A", Z: zs[2]},
		}}
		sol, err := nodal.Solve(n, calc.RMS)
		if err != nil {
			t.Fatal(err)
		}
		scale := d.ILine[0].Mag() + d.ILine[1].Mag() + d.ILine[2].Mag()
		for k := 0; k < 3; k++ {
			if got, want := d.IPhase[k].V, sol.Branches[3+k].I; cmplx.Abs(got-want) > tol*scale {
				t.Errorf("%v: phase current %d = %v, nodal %v", zs, k, got, want)
			}
			// the line current into corner k is what source k delivers:
			// the engine's element current flows from → to through it,
			// here from N through the source into the line
			if got, want := d.ILine[k].V, sol.Branches[k].I; cmplx.Abs(got-want) > tol*scale {
				t.Errorf("%v: I_%c = %v, nodal %v", zs, 'a'+k, got, want)
			}
		}
	}
	if _, _, err := SolveDeltaSupply([3]calc.Quantity{V(400), V(400), V(400)}, [3]calc.Quantity{Z(1), Z(1), Z(1)}, ABC, calc.RMS); err == nil || !strings.Contains(err.Error(), "sum to zero") {
		t.Errorf("line voltages that do not close: %v", err)
	}
}
