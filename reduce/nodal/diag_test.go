package nodal_test

import (
	"errors"
	"fmt"
	"math/cmplx"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"

	"argand/calc"
	"argand/reduce"
	"argand/reduce/nodal"
)

// lined gives each element a worksheet line, 10 for the first.
func lined(n *reduce.Network) *reduce.Network {
	for i := range n.Elements {
		n.Elements[i].Line = 10 + i
	}
	return n
}

// TestDiagnostics: every network without a unique solution, and every
// malformed one, gets a *NetError naming what is at fault, never NaN.
func TestDiagnostics(t *testing.T) {
	tests := []struct {
		name  string
		net   *reduce.Network
		words []string // all must appear in the message
		elems []string // must be among Elements
		nodes []string // must be among Nodes
		line  bool     // a worksheet line is expected
	}{
		{"no elements", network("0"), []string{"no elements"}, nil, nil, false},
		{"nil network", nil, []string{"no elements"}, nil, nil, false},
		{"floating part",
			network("0", vsrc("V1", "0", "a", 1), res("R1", "a", "0", 1), res("R2", "x", "y", 1), res("R3", "y", "z", 1)),
			[]string{"no path to the reference", "x", "y", "z", "R2", "R3"}, []string{"R2", "R3"}, []string{"x", "y", "z"}, true},
		{"isolated node behind a self loop",
			network("0", vsrc("V1", "0", "a", 1), res("R1", "a", "0", 1), res("R2", "q", "q", 1)),
			[]string{"no path to the reference", "q", "R2"}, []string{"R2"}, []string{"q"}, true},
		{"loop of voltage sources",
			network("0", vsrc("V1", "0", "a", 10), res("R1", "a", "b", 1), vsrc("V2", "a", "b", 3), vsrc("V3", "b", "0", 7)),
			[]string{"voltage sources", "form a loop", "V1", "V2", "V3"}, []string{"V1", "V2", "V3"}, []string{"0", "a", "b"}, true},
		{"parallel voltage sources",
			network("0", vsrc("V1", "0", "a", 10), vsrc("V2", "0", "a", 10), res("R1", "a", "0", 1)),
			[]string{"voltage sources", "V1", "V2", "loop"}, []string{"V1", "V2"}, nil, true},
		{"0 V source across a voltage source",
			network("0", vsrc("V1", "0", "a", 10), vsrc("V0", "a", "0", 0), res("R1", "a", "0", 1)),
			[]string{"V1", "V0", "loop"}, []string{"V1", "V0"}, nil, true},
		{"ideal short across a voltage source",
			network("0", vsrc("V1", "0", "a", 10), res("R1", "a", "0", 1), imp("W1", "a", "b", 0), imp("W2", "b", "0", 0)),
			[]string{"ideal short", "W1", "W2", "V1"}, []string{"V1", "W1", "W2"}, []string{"a", "b"}, true},
		{"loop of shorts",
			network("0", vsrc("V1", "0", "a", 10), res("R1", "a", "b", 1), imp("W1", "b", "0", 0), imp("W2", "b", "0", 0)),
			[]string{"ideal shorts", "W1", "W2", "loop"}, []string{"W1", "W2"}, nil, true},
		{"current source with no path",
			network("0", vsrc("V1", "0", "a", 1), res("R1", "a", "0", 1), isrc("I1", "0", "b", 2), res("R2", "b", "c", 5)),
			[]string{"current source I1 has no path", "b", "c"}, []string{"I1"}, []string{"b", "c"}, true},
		{"current sources in series",
			network("0", vsrc("V1", "0", "a", 1), res("R1", "a", "0", 1), isrc("I1", "a", "m", 2), isrc("I2", "m", "0", 2)),
			[]string{"no path for its current", "I1", "I2", "m"}, []string{"I1", "I2"}, []string{"m"}, true},
		{"voltage source on one node",
			network("0", vsrc("V1", "a", "a", 1), res("R1", "a", "0", 1)),
			[]string{"V1", "both ends", "a"}, []string{"V1"}, []string{"a"}, true},
		{"current source on one node",
			network("0", isrc("I1", "a", "a", 1), res("R1", "a", "0", 1)),
			[]string{"I1", "both ends"}, []string{"I1"}, []string{"a"}, true},
		{"unknown reference",
			network("gnd", vsrc("V1", "0", "a", 1), res("R1", "a", "0", 1)),
			[]string{"reference node gnd"}, nil, []string{"gnd"}, false},
		{"no reference",
			network("", vsrc("V1", "0", "a", 1), res("R1", "a", "0", 1)),
			[]string{"no reference"}, nil, nil, false},
		{"duplicate names",
			network("0", vsrc("V1", "0", "a", 1), res("R1", "a", "0", 1), res("R1", "a", "0", 2)),
			[]string{"R1", "twice", "line 11"}, []string{"R1"}, nil, true},
		{"unnamed element",
			network("0", vsrc("V1", "0", "a", 1), res("", "a", "0", 1)),
			[]string{"no name"}, nil, nil, true},
		{"unnamed node",
			network("0", vsrc("V1", "0", "a", 1), res("R1", "a", "", 1)),
			[]string{"R1", "nodes"}, []string{"R1"}, nil, true},
		{"impedance not worked out",
			network("0", vsrc("V1", "0", "a", 1), reduce.Element{Name: "L1", Kind: reduce.Inductor, From: "a", To: "0", Raw: 0.1}),
			[]string{"L1", "frequency"}, []string{"L1"}, nil, true},
		{"resonance (numerically singular)",
			network("0", vsrc("V1", "0", "a", 1), imp("L1", "a", "m", complex(0, 10)), imp("C1", "m", "0", complex(0, -10))),
			[]string{"singular", "resonance", "m", "L1", "C1"}, []string{"L1", "C1"}, []string{"m"}, true},
		{"cancelling resistances",
			network("0", isrc("I1", "0", "a", 1), res("R1", "a", "0", 5), res("R2", "a", "0", -5)),
			[]string{"singular", "a"}, []string{"R1", "R2"}, []string{"a"}, true},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			net := tt.net
			if net != nil {
				net = lined(net)
			}
			s, err := nodal.Solve(net, calc.RMS)
			if err == nil {
				t.Fatalf("no error; solution %+v", s)
			}
			var ne *nodal.NetError
			if !errors.As(err, &ne) {
				t.Fatalf("error %T %v, want *nodal.NetError", err, err)
			}
			for _, w := range tt.words {
				if !strings.Contains(ne.Msg, w) {
					t.Errorf("message %q lacks %q", ne.Msg, w)
				}
			}
			for _, e := range tt.elems {
				if !slices.Contains(ne.Elements, e) {
					t.Errorf("elements %v lack %s", ne.Elements, e)
				}
			}
			for _, n := range tt.nodes {
				if !slices.Contains(ne.Nodes, n) {
					t.Errorf("nodes %v lack %s", ne.Nodes, n)
				}
			}
			if tt.line && ne.Line == 0 {
				t.Errorf("no worksheet line in %+v", ne)
			}
			if strings.Contains(ne.Msg, "NaN") || strings.Contains(ne.Msg, "Inf") {
				t.Errorf("message shows a non-number: %q", ne.Msg)
			}
		})
	}
}

// TestNoPanicOnOddInput feeds odd values through Solve: huge and tiny
// impedances, non-finite values, unknown kinds. It must return an error or
// a finite solution, never panic.
func TestNoPanicOnOddInput(t *testing.T) {
	inf := cmplx.Inf()
	nan := cmplx.NaN()
	cases := []*reduce.Network{
		network("0", vsrc("V1", "0", "a", inf), res("R1", "a", "0", 1)),
		network("0", vsrc("V1", "0", "a", nan), res("R1", "a", "0", 1)),
		network("0", vsrc("V1", "0", "a", 1), imp("Z1", "a", "0", inf)),
		network("0", vsrc("V1", "0", "a", 1e300), res("R1", "a", "0", 1e-300)),
		network("0", vsrc("V1", "0", "a", 1), res("R1", "a", "0", 5e-324)),
		network("0", vsrc("V1", "0", "a", 1), reduce.Element{Name: "X", Kind: 99, From: "a", To: "0", Z: 1}),
	}
	for i, n := range cases {
		s, err := nodal.Solve(n, calc.RMS)
		if err == nil {
			for _, b := range s.Branches {
				for _, v := range []complex128{b.V, b.I, b.S} {
					if cmplx.IsNaN(v) || cmplx.IsInf(v) {
						t.Errorf("case %d: %s has a non-finite value %v", i, b.Name, v)
					}
				}
			}
		}
	}
}

// TestWildNetworks throws 2000 random networks with no care for sense at
// Solve: sources and shorts anywhere, loose parts, one-node elements. Each
// must give either a *NetError with a message or a solution that meets
// KCL and Tellegen, and never panic.
func TestWildNetworks(t *testing.T) {
	rng := rand.New(rand.NewPCG(99, 60375))
	solved, refused := 0, 0
	for c := range 2000 {
		nn := 2 + rng.IntN(6)
		n := network("n0")
		for k := range 1 + rng.IntN(10) {
			a, b := fmt.Sprintf("n%d", rng.IntN(nn)), fmt.Sprintf("n%d", rng.IntN(nn))
			name := fmt.Sprintf("E%d", k)
			switch rng.IntN(6) {
			case 0:
				n.Elements = append(n.Elements, vsrc(name, a, b, randPhasor(rng, 10)))
			case 1:
				n.Elements = append(n.Elements, isrc(name, a, b, randPhasor(rng, 1)))
			case 2:
				n.Elements = append(n.Elements, imp(name, a, b, 0))
			default:
				n.Elements = append(n.Elements, imp(name, a, b, randPhasor(rng, 100)))
			}
		}
		s, err := nodal.Solve(n, calc.RMS)
		if err != nil {
			var ne *nodal.NetError
			if !errors.As(err, &ne) || ne.Msg == "" {
				t.Fatalf("network %d: error %T %v", c, err, err)
			}
			refused++
			continue
		}
		solved++
		if s.MaxKCL > 1e-9*s.MaxI || cmplx.Abs(s.PowerSum) > 1e-9*s.PowerAbs {
			t.Errorf("network %d: KCL %g of %g, ΣS %v of %g", c, s.MaxKCL, s.MaxI, s.PowerSum, s.PowerAbs)
		}
	}
	t.Logf("%d solved, %d refused", solved, refused)
	if solved < 100 || refused < 100 {
		t.Errorf("%d solved, %d refused: the generator should produce plenty of both", solved, refused)
	}
}
