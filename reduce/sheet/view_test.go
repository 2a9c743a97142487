package sheet

import (
	"math"
	"math/cmplx"
	"slices"
	"testing"
)

// A compact network is viewed with its elements (the user's report: it
// said "no elements"), their solved values and the reduction the sheet
// made. Checked by hand (common practice): R2 + C1 in parallel with L1,
// then in series with R1, fed by 24 V at 50 Hz.
func TestNetworkViewCompact(t *testing.T) {
	s := New()
	for _, l := range []string{"resistor R1 = 10 Ω", "inductor L1 = 10 mH", "resistor R2 = 4.7 Ω", "capacitor C1 = 100 µF",
		"network ckt = R1 + (L1 || (R2 + C1)) fed by 24 V"} {
		if _, _, err := s.Exec(l); err != nil {
			t.Fatalf("%s: %v", l, err)
		}
	}
	v, err := s.NetworkView("ckt")
	if err != nil {
		t.Fatal(err)
	}
	var names []string
	for _, e := range v.Elements {
		names = append(names, e.Name)
	}
	if want := []string{"R1", "L1", "R2", "C1", "source"}; !slices.Equal(names, want) {
		t.Fatalf("elements %v, want %v", names, want)
	}
	w := 2 * math.Pi * 50
	zl := complex(0, w*10e-3)
	zb := complex(4.7, -1/(w*100e-6))
	z := 10 + zl*zb/(zl+zb)
	if cmplx.Abs(v.Z.V-z) > 1e-9*cmplx.Abs(z) {
		t.Errorf("Z = %v, want %v", v.Z.V, z)
	}
	i := 24 / z
	r1 := v.Elements[0]
	if !r1.Solved || cmplx.Abs(r1.I.V-i) > 1e-9*cmplx.Abs(i) {
		t.Errorf("I(R1) = %v (solved %v), want %v", r1.I.V, r1.Solved, i)
	}
	// two merges: R2 with C1, then that with L1, then R1 in series
	merges := 0
	for _, st := range v.Steps {
		if st.Merge != nil {
			merges++
			if len(st.Hot) == 0 {
				t.Errorf("merge %s picks out no elements", st.Merge.Name)
			}
		}
	}
	if merges != 3 {
		t.Errorf("%d merges, want 3", merges)
	}
	if last := v.Steps[len(v.Steps)-1]; last.Merge != nil {
		t.Errorf("a fed network's view ends in a merge, not the work back")
	}
	if got := s.NetworkNames(); !slices.Equal(got, []string{"ckt"}) {
		t.Errorf("names %v", got)
	}
}

// A node block that is not series-parallel says why and has no steps.
func TestNetworkViewBridge(t *testing.T) {
	s := New()
	for _, l := range []string{"network br reference gnd", "voltage source V1 = 10 V from gnd to a",
		"resistor Ra = 1 Ω from a to b", "resistor Rb = 1 Ω from a to c", "resistor Rc = 1 Ω from b to c",
		"resistor Rd = 1 Ω from b to gnd", "resistor Re = 2 Ω from c to gnd", "end"} {
		if _, _, err := s.Exec(l); err != nil {
			t.Fatalf("%s: %v", l, err)
		}
	}
	v, err := s.NetworkView("br")
	if err != nil {
		t.Fatal(err)
	}
	if len(v.Steps) != 0 || v.Why == "" {
		t.Errorf("bridge: %d steps, why %q", len(v.Steps), v.Why)
	}
	if len(v.Elements) != 6 || !slices.Equal(v.Nodes, []string{"a", "b", "c", "gnd"}) {
		t.Errorf("bridge: %d elements, nodes %v", len(v.Elements), v.Nodes)
	}
}
