package threephase

import (
	"math/cmplx"
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
