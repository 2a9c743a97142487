package nodal_test

import (
	"fmt"
	"testing"

	"argand/reduce"
)

// The network shapes below are invented example data: a long ladder
// closed by one bridging resistor, a square grid, and a star of many
// leaves on one hub. Their element values cycle through resistive,
// inductive and capacitive impedances so that the equations are complex.

// shapeZ is the impedance of element number k of a shape.
func shapeZ(k int) complex128 {
	switch k % 4 {
	case 0:
		return complex(10+float64(k%7), 0)
	case 1:
		return complex(4.7, 3+float64(k%5))
	case 2:
		return complex(22, -8-float64(k%3))
	}
	return complex(1+float64(k%11), 0.5)
}

// bridgedLadder is a ladder of series and shunt impedances fed by a
// voltage source, with one resistor bridging its first and last nodes:
// sections+3 unknowns.
func bridgedLadder(sections int) *reduce.Network {
	n := network("0", vsrc("V1", "0", "n0", 230))
	for i := range sections {
		a, b := fmt.Sprintf("n%d", i), fmt.Sprintf("n%d", i+1)
		n.Elements = append(n.Elements, imp(fmt.Sprintf("S%d", i+1), a, b, shapeZ(2*i)), imp(fmt.Sprintf("P%d", i+1), b, "0", shapeZ(2*i+1)*100))
	}
	n.Elements = append(n.Elements, res("RB", "n0", fmt.Sprintf("n%d", sections), 47))
	return n
}

// grid is a rows×cols grid of impedances fed at one corner by a voltage
// source and loaded to the reference at the opposite corner and at every
// seventh node: rows·cols + 1 unknowns.
func grid(rows, cols int) *reduce.Network {
	node := func(r, c int) string { return fmt.Sprintf("g%d_%d", r, c) }
	n := network("0", vsrc("V1", "0", node(0, 0), 230))
	k := 0
	for r := range rows {
		for c := range cols {
			if c+1 < cols {
				n.Elements = append(n.Elements, imp(fmt.Sprintf("H%d", k), node(r, c), node(r, c+1), shapeZ(k)))
			}
			if r+1 < rows {
				n.Elements = append(n.Elements, imp(fmt.Sprintf("W%d", k), node(r, c), node(r+1, c), shapeZ(k+1)))
			}
			if k%7 == 6 {
				n.Elements = append(n.Elements, imp(fmt.Sprintf("G%d", k), node(r, c), "0", shapeZ(k+2)*50))
			}
			k++
		}
	}
	n.Elements = append(n.Elements, res("RL", node(rows-1, cols-1), "0", 100))
	return n
}

// star is a hub fed by a voltage source through an impedance, with leaves
// each joined to the hub and to the reference: leaves+3 unknowns.
func star(leaves int) *reduce.Network {
	n := network("0", vsrc("V1", "0", "s", 230), imp("ZS", "s", "hub", complex(0.1, 0.3)))
	for i := range leaves {
		leaf := fmt.Sprintf("l%d", i)
		n.Elements = append(n.Elements, imp(fmt.Sprintf("A%d", i), "hub", leaf, shapeZ(i)), imp(fmt.Sprintf("B%d", i), leaf, "0", shapeZ(i+1)*30))
	}
	return n
}

// TestShapesAgainstGonum solves each shape at about 1000 unknowns and
// compares the node voltages with gonum's dense LU on the real 2n×2n form,
// ‖v − v_ref‖ ≤ 1e-9·‖v_ref‖, with KCL and Tellegen to 1e-9 (common
// practice). Larger sizes run in the benchmarks.
func TestShapesAgainstGonum(t *testing.T) {
	if testing.Short() {
		t.Skip("dense reference solves of 2000×2000 real systems")
	}
	shapes := []struct {
		name string
		net  *reduce.Network
	}{
		{"bridged ladder", bridgedLadder(997)},
		{"grid 31×32", grid(31, 32)},
		{"star of 997 leaves", star(997)},
	}
	for _, sh := range shapes {
		t.Run(sh.name, func(t *testing.T) {
			s := solve(t, sh.net)
			if s.Unknowns < 990 || s.Unknowns > 1000 {
				t.Fatalf("%d unknowns, want about 1000", s.Unknowns)
			}
			nodes, ref := referenceVoltages(t, sh.net)
			diff := make([]complex128, len(nodes))
			for i, name := range nodes {
				diff[i] = s.Voltage[name] - ref[i]
			}
			if norm(diff) > 1e-9*norm(ref) {
				t.Errorf("‖v − v_ref‖ = %g > 1e-9·‖v_ref‖ = %g", norm(diff), 1e-9*norm(ref))
			}
			checkBalance(t, s)
		})
	}
}
