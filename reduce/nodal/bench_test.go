package nodal_test

import (
	"context"
	"fmt"
	"math"
	"testing"

	"argand/calc"
	"argand/reduce"
	"argand/reduce/nodal"
)

// BenchmarkLadder solves ladders of series R and shunt R with 10, 100 and
// 500 nodes (the reference included), from the network description to
// every branch current and the checks.
func BenchmarkLadder(b *testing.B) {
	for _, nodes := range []int{10, 100, 500} {
		n := ladder(nodes-2, 10)
		b.Run(fmt.Sprintf("nodes=%d", nodes), func(b *testing.B) {
			for b.Loop() {
				if _, err := nodal.Solve(n, calc.RMS); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// sweepNetwork is a 20-node RLC network (example data): a chain of series
// R–L sections with shunt capacitors, and bridging resistors every few
// nodes, fed by a voltage source.
func sweepNetwork() *reduce.Network {
	n := &reduce.Network{Name: "example data", Reference: "0",
		Elements: []reduce.Element{{Name: "V1", Kind: reduce.VoltageSource, From: "0", To: "n1", Value: 230}}}
	add := func(name string, k reduce.ElementKind, a, b string, raw float64) {
		n.Elements = append(n.Elements, reduce.Element{Name: name, Kind: k, From: a, To: b, Raw: complex(raw, 0)})
	}
	for i := 1; i < 19; i++ {
		a, b := fmt.Sprintf("n%d", i), fmt.Sprintf("n%d", i+1)
		add(fmt.Sprintf("R%d", i), reduce.Resistor, a, b, 0.5)
		add(fmt.Sprintf("L%d", i), reduce.Inductor, a, b, 1e-3)
		add(fmt.Sprintf("C%d", i), reduce.Capacitor, b, "0", 2e-6)
		if i%3 == 0 {
			add(fmt.Sprintf("RB%d", i), reduce.Resistor, fmt.Sprintf("n%d", i-2), b, 47)
		}
	}
	add("RL", reduce.Resistor, "n19", "0", 100)
	return n
}

// BenchmarkSweep re-solves a 20-node network at 1000 frequencies from
// 10 Hz to 100 kHz, evaluating every impedance at each frequency.
func BenchmarkSweep(b *testing.B) {
	n := sweepNetwork()
	for b.Loop() {
		for k := range 1000 {
			f := 10 * math.Pow(10, 4*float64(k)/999)
			nf, err := n.At(f)
			if err != nil {
				b.Fatal(err)
			}
			if _, err := nodal.Solve(nf, calc.RMS); err != nil {
				b.Fatal(err)
			}
		}
	}
}

// TestSweepNetwork makes sure the benchmark network solves, with its
// checks, across the band.
func TestSweepNetwork(t *testing.T) {
	n := sweepNetwork()
	for _, f := range []float64{10, 1e3, 1e5} {
		nf, err := n.At(f)
		if err != nil {
			t.Fatal(err)
		}
		checkBalance(t, solve(t, nf))
	}
}

// BenchmarkShapes solves the shapes of shapes_test.go at several sizes,
// from the network description to every branch current and the checks.
// Stats after one solution go with the figures: unknowns, entries of the
// LU factors and the estimate of the symbolic analysis.
func BenchmarkShapes(b *testing.B) {
	shapes := []struct {
		name string
		make func() *reduce.Network
	}{
		{"ladder-bridged/unknowns=1000", func() *reduce.Network { return bridgedLadder(997) }},
		{"ladder-bridged/unknowns=10000", func() *reduce.Network { return bridgedLadder(9997) }},
		{"grid/32x32", func() *reduce.Network { return grid(32, 32) }},
		{"grid/100x100", func() *reduce.Network { return grid(100, 100) }},
		{"grid/316x316", func() *reduce.Network { return grid(316, 316) }},
		{"star/leaves=1000", func() *reduce.Network { return star(1000) }},
		{"star/leaves=5000", func() *reduce.Network { return star(5000) }},
		{"star/leaves=50000", func() *reduce.Network { return star(50000) }},
	}
	for _, sh := range shapes {
		b.Run(sh.name, func(b *testing.B) {
			n := sh.make()
			var s *nodal.Solution
			cpu := nodal.StartCPU()
			for b.Loop() {
				var err error
				if s, err = nodal.Solve(n, calc.RMS); err != nil {
					b.Fatal(err)
				}
			}
			cpu.Report(b, b.N)
			p, err := nodal.Analyse(n)
			if err != nil {
				b.Fatal(err)
			}
			w := p.Work()
			b.ReportMetric(float64(s.Unknowns), "unknowns")
			b.ReportMetric(float64(s.Factor), "nnzLU")
			b.ReportMetric(float64(w.Factor), "nnzLU-est")
			b.ReportMetric(w.MultiplyAdds, "madds-est")
			b.ReportMetric(s.BackwardError/0x1p-52, "backward-error/u")
		})
	}
}

// BenchmarkSweepPlan is the end-to-end cost of a 1000-point sweep from
// 10 Hz to 100 kHz over a mesh of about 1000 nodes (MeshNetwork 20×26):
// each point evaluates every impedance at its frequency and solves to a
// full Solution, either with one Plan for the whole sweep ("plan"; with
// each solution written into the last one's maps and branches,
// "plan+reuse", as the worksheet's sweeps do) or with a fresh analysis at
// every point ("solve"). The counts of reused
// and refused pivots go with the figures.
func BenchmarkSweepPlan(b *testing.B) {
	n := nodal.MeshNetwork(20, 26)
	freqs := make([]float64, 1000)
	for k := range freqs {
		freqs[k] = 10 * math.Pow(10, 4*float64(k)/999)
	}
	for _, reuse := range []bool{false, true} {
		name := "plan"
		if reuse {
			name = "plan+reuse"
		}
		b.Run(name, func(b *testing.B) {
			var st nodal.Stats
			cpu := nodal.StartCPU()
			for b.Loop() {
				var p *nodal.Plan
				var last *nodal.Solution
				for _, f := range freqs {
					nf, err := n.At(f)
					if err != nil {
						b.Fatal(err)
					}
					if p == nil {
						if p, err = nodal.Analyse(nf); err != nil {
							b.Fatal(err)
						}
					}
					var s *nodal.Solution
					if reuse {
						s, err = p.SolveReuse(context.Background(), nf, calc.RMS, last)
					} else {
						s, err = p.Solve(nf, calc.RMS)
					}
					if err != nil {
						b.Fatal(err)
					}
					last = s
				}
				st = p.Stats()
			}
			cpu.Report(b, b.N)
			b.ReportMetric(float64(st.Refactorisations), "refactorisations")
			b.ReportMetric(float64(st.Repivots), "repivots")
			b.ReportMetric(float64(st.Refinements), "refinements")
		})
	}
	b.Run("solve", func(b *testing.B) {
		cpu := nodal.StartCPU()
		for b.Loop() {
			for _, f := range freqs {
				nf, err := n.At(f)
				if err != nil {
					b.Fatal(err)
				}
				if _, err := nodal.Solve(nf, calc.RMS); err != nil {
					b.Fatal(err)
				}
			}
		}
		cpu.Report(b, b.N)
	})
}
