package nodal

import (
	"context"
	"fmt"
	"math"
	"slices"
	"strings"
	"testing"
	"time"

	"argand/calc"
	"argand/reduce"
)

// MeshNetwork is a rows×cols mesh of series R–L sections with a shunt
// capacitor at every node and a resistive load at every fifth, fed at one
// corner by a 230 V source through a second source-side voltage source
// (two zero-diagonal rows): invented example data for sweeps. It is
// exported for the external tests of the package.
func MeshNetwork(rows, cols int) *reduce.Network {
	node := func(r, c int) string { return fmt.Sprintf("m%d_%d", r, c) }
	n := &reduce.Network{Name: "example data", Reference: "0", Elements: []reduce.Element{
		{Name: "V1", Kind: reduce.VoltageSource, From: "0", To: "s", Value: 230},
		{Name: "V2", Kind: reduce.VoltageSource, From: "s", To: node(0, 0), Value: complex(0, 5)},
	}}
	add := func(name string, k reduce.ElementKind, a, b string, raw float64) {
		n.Elements = append(n.Elements, reduce.Element{Name: name, Kind: k, From: a, To: b, Raw: complex(raw, 0)})
	}
	k := 0
	for r := range rows {
		for c := range cols {
			here := node(r, c)
			if c+1 < cols {
				mid := fmt.Sprintf("h%d", k)
				add("RH"+fmt.Sprint(k), reduce.Resistor, here, mid, 0.2+0.01*float64(k%13))
				add("LH"+fmt.Sprint(k), reduce.Inductor, mid, node(r, c+1), 1e-4*(1+float64(k%5)))
			}
			if r+1 < rows {
				add("RV"+fmt.Sprint(k), reduce.Resistor, here, node(r+1, c), 0.5+0.02*float64(k%7))
			}
			add("C"+fmt.Sprint(k), reduce.Capacitor, here, "0", 1e-7*(1+float64(k%3)))
			if k%5 == 4 {
				add("RL"+fmt.Sprint(k), reduce.Resistor, here, "0", 50+float64(k%11))
			}
			k++
		}
	}
	return n
}

// GridRLC is a rows×cols grid whose edges are resistors, inductors and
// capacitors in turn, with a capacitor to the reference at every third
// node, fed at one corner like MeshNetwork: invented example data for
// sweeps, with more fill than the mesh for the same number of nodes.
func GridRLC(rows, cols int) *reduce.Network {
	node := func(r, c int) string { return fmt.Sprintf("q%d_%d", r, c) }
	n := &reduce.Network{Name: "example data", Reference: "0", Elements: []reduce.Element{
		{Name: "V1", Kind: reduce.VoltageSource, From: "0", To: "s", Value: 230},
		{Name: "V2", Kind: reduce.VoltageSource, From: "s", To: node(0, 0), Value: complex(0, 5)},
	}}
	kinds := []reduce.ElementKind{reduce.Resistor, reduce.Inductor, reduce.Capacitor}
	raws := []float64{1.5, 2e-3, 50e-6}
	k := 0
	add := func(name string, a, b string) {
		j := k % 3
		n.Elements = append(n.Elements, reduce.Element{Name: name, Kind: kinds[j], From: a, To: b, Raw: complex(raws[j]*(1+0.1*float64(k%7)), 0)})
		k++
	}
	for r := range rows {
		for c := range cols {
			if c+1 < cols {
				add(fmt.Sprintf("E%d", k), node(r, c), node(r, c+1))
			}
			if r+1 < rows {
				add(fmt.Sprintf("E%d", k), node(r, c), node(r+1, c))
			}
			if (r*cols+c)%3 == 2 {
				n.Elements = append(n.Elements, reduce.Element{Name: fmt.Sprintf("C%d_%d", r, c), Kind: reduce.Capacitor, From: node(r, c), To: "0", Raw: 1e-6})
			}
		}
	}
	n.Elements = append(n.Elements, reduce.Element{Name: "RL", Kind: reduce.Resistor, From: node(rows-1, cols-1), To: "0", Raw: 10})
	return n
}

// RLCLadder is a chain of sections series R – series L – shunt C fed by a
// 230 V source and loaded by 10 Ω at its end: 2·sections + 2 unknowns, a
// tridiagonal matrix whose factors have no fill at all. Invented example
// data for sweeps.
func RLCLadder(sections int) *reduce.Network {
	n := &reduce.Network{Name: "example data", Reference: "0", Elements: []reduce.Element{
		{Name: "V1", Kind: reduce.VoltageSource, From: "0", To: "n0", Value: 230},
	}}
	for i := range sections {
		a, m, b := fmt.Sprintf("n%d", i), fmt.Sprintf("m%d", i), fmt.Sprintf("n%d", i+1)
		n.Elements = append(n.Elements,
			reduce.Element{Name: fmt.Sprintf("R%d", i), Kind: reduce.Resistor, From: a, To: m, Raw: complex(0.1+0.01*float64(i%7), 0)},
			reduce.Element{Name: fmt.Sprintf("L%d", i), Kind: reduce.Inductor, From: m, To: b, Raw: complex(1e-4*(1+float64(i%5)), 0)},
			reduce.Element{Name: fmt.Sprintf("C%d", i), Kind: reduce.Capacitor, From: b, To: "0", Raw: complex(1e-7*(1+float64(i%3)), 0)})
	}
	n.Elements = append(n.Elements, reduce.Element{Name: "RL", Kind: reduce.Resistor, From: fmt.Sprintf("n%d", sections), To: "0", Raw: 10})
	return n
}

// sweepPoints is the frequency of each of count points spread evenly in
// the logarithm from 10 Hz to 100 kHz.
func sweepPoints(count int) []float64 {
	f := make([]float64, count)
	for k := range f {
		f[k] = 10 * math.Pow(10, 4*float64(k)/float64(count-1))
	}
	return f
}

// sweepNets evaluates n at each frequency.
func sweepNets(tb testing.TB, n *reduce.Network, freqs []float64) []*reduce.Network {
	out := make([]*reduce.Network, len(freqs))
	for k, f := range freqs {
		nf, err := n.At(f)
		if err != nil {
			tb.Fatal(err)
		}
		out[k] = nf
	}
	return out
}

// BenchmarkSweepPoint measures one point of a 1000-point sweep over a
// mesh of about 1000 nodes with the symbolic analysis reused: the numeric
// refactorisation alone ("refactor"), a numeric factorisation choosing
// its pivots ("factor"), and the whole point: writing the new values into
// the matrix, refactorising and solving with refinement, the residual
// behind the reported backward error included
// ("restamp+refactor+solve"), and the point and the refactorisation timed
// in turn for their ratio ("point/refactor"). "refactor" is the same call
// the point makes when the pivots pass: it finds the column maxima and
// ‖A‖₁ on its way.
//
// Before each point the values of that point are written into one
// network, untimed, as the worksheet's sweep does (sheet.solveAgain
// writes every element's value, then solves), so the point reads them
// from cache. The "cold" variants visit 1000 separate networks in turn
// instead, so that every restamp reads its element values from memory:
// the cost of a caller that keeps a network per point. The Solution with
// its maps of names is not built here; BenchmarkSweepPlan in the external
// tests times that.
//
// The three networks have about 1000 unknowns each and differ in fill:
// the grid's factors hold 22 entries per column, the mesh's 12 and the
// ladder's 3. Restamp, solve and residual cost in proportion to the
// entries of the matrix and of its factors, the refactorisation in
// proportion to its multiply-adds, which grow faster than the entries
// with the fill; so the ratio of a point to a refactorisation falls as
// the fill rises, and on the ladder, whose factorisation is hardly more
// work than a solve, it is well above the grid's.
func BenchmarkSweepPoint(b *testing.B) {
	for _, net := range []struct {
		name string
		n    *reduce.Network
	}{{"mesh-20x26", MeshNetwork(20, 26)}, {"grid-32x32", GridRLC(32, 32)}, {"ladder-500", RLCLadder(500)}} {
		b.Run(net.name, func(b *testing.B) { benchSweepPoint(b, net.n) })
	}
}

// sweepBench holds a plan and the networks of a sweep's points.
type sweepBench struct {
	p    *Plan
	nets []*reduce.Network
	live *reduce.Network // the one network the warm points are written into
	k    int
}

// next returns the network of the next point: live with that point's
// values written in, or for a cold point the point's own network.
func (s *sweepBench) next(cold bool) *reduce.Network {
	n := s.nets[s.k%len(s.nets)]
	s.k++
	if cold {
		return n
	}
	for i := range s.live.Elements {
		e, v := &s.live.Elements[i], &n.Elements[i]
		e.Raw, e.Z, e.Value = v.Raw, v.Z, v.Value
	}
	return s.live
}

// point does what a sweep point does in this package.
func (s *sweepBench) point(tb testing.TB, n *reduce.Network) {
	if err := s.p.stamp(n); err != nil {
		tb.Fatal(err)
	}
	if err := s.p.factorise(context.Background()); err != nil {
		tb.Fatal(err)
	}
	s.p.solveRefined()
}

// refactor refactorises the matrix last stamped.
func (s *sweepBench) refactor(tb testing.TB) {
	if ok, err := s.p.lu.refactor(&s.p.b, s.p.colmax, context.Background()); !ok || err != nil {
		tb.Fatal("pivot refused", err)
	}
}

func benchSweepPoint(b *testing.B, n *reduce.Network) {
	nets := sweepNets(b, n, sweepPoints(1000))
	p, err := Analyse(nets[0])
	if err != nil {
		b.Fatal(err)
	}
	if _, err := p.Solve(nets[0], calc.RMS); err != nil {
		b.Fatal(err)
	}
	live := *nets[0]
	live.Elements = slices.Clone(live.Elements)
	s := &sweepBench{p: p, nets: nets, live: &live}
	b.Run("refactor", func(b *testing.B) {
		// pivots chosen for these values, so that all are reused
		p.lu = nil
		if err := p.stamp(nets[500]); err != nil {
			b.Fatal(err)
		}
		if err := p.factorise(nil); err != nil {
			b.Fatal(err)
		}
		cpu := StartCPU()
		for b.Loop() {
			s.refactor(b)
		}
		cpu.Report(b, b.N)
		b.ReportMetric(float64(p.b.n), "unknowns")
		b.ReportMetric(float64(p.lu.nnz()), "nnzLU")
	})
	b.Run("factor", func(b *testing.B) {
		if err := p.stamp(nets[500]); err != nil {
			b.Fatal(err)
		}
		colmax := p.b.colMax()
		cpu := StartCPU()
		for b.Loop() {
			if _, err := factor(&p.b, colmax, p.work.Factor, p.maxNNZ, nil, nil); err != nil {
				b.Fatal(err)
			}
		}
		cpu.Report(b, b.N)
	})
	for _, cold := range []bool{false, true} {
		suffix := ""
		if cold {
			suffix = "/cold"
		}
		b.Run("restamp+refactor+solve"+suffix, func(b *testing.B) {
			before := p.stats
			k := 0
			var t time.Duration
			for b.Loop() {
				n := s.next(cold)
				t0 := time.Now()
				s.point(b, n)
				t += time.Since(t0)
				k++
			}
			b.ReportMetric(float64(t.Nanoseconds())/float64(k), "point-ns")
			b.ReportMetric(float64(p.stats.Repivots-before.Repivots)/float64(k), "repivots/point")
			b.ReportMetric(float64(p.stats.Refinements-before.Refinements)/float64(k), "refinements/point")
		})
		b.Run("point/refactor"+suffix, func(b *testing.B) {
			// The two timed in turn, so that a machine shared with
			// other work slows both alike: the ratio is the figure,
			// the time per op that of the pair.
			var tRefactor, tPoint time.Duration
			k := 0
			for b.Loop() {
				n := s.next(cold)
				t0 := time.Now()
				s.refactor(b)
				t1 := time.Now()
				s.point(b, n)
				tRefactor += t1.Sub(t0)
				tPoint += time.Since(t1)
				k++
			}
			b.ReportMetric(float64(tPoint)/float64(tRefactor), "point/refactor")
			b.ReportMetric(float64(tRefactor.Nanoseconds())/float64(k), "refactor-ns")
			b.ReportMetric(float64(tPoint.Nanoseconds())/float64(k), "point-ns")
		})
	}
}

// TestWorkLimits: a network whose estimated work exceeds the bounds is
// refused with a message stating the estimates. The bounds are lowered
// here so that a small network crosses them.
func TestWorkLimits(t *testing.T) {
	n, err := MeshNetwork(4, 4).At(50)
	if err != nil {
		t.Fatal(err)
	}
	p, err := Analyse(n)
	if err != nil {
		t.Fatal(err)
	}
	w := p.Work()
	if w.Unknowns != p.b.n || w.Factor < w.Unknowns || w.MultiplyAdds <= 0 || w.Bytes <= 0 {
		t.Fatalf("estimates %+v", w)
	}
	if err := w.check(w.Bytes-1, w.MultiplyAdds*2); err == nil || !containsAll(err.Error(), "too large", "entries in the LU factors", "multiply-adds", "memory", "at most") {
		t.Errorf("memory bound: %v", err)
	}
	if err := w.check(w.Bytes*2, w.MultiplyAdds/2); err == nil {
		t.Error("work bound not enforced")
	}
	if err := w.check(w.Bytes, w.MultiplyAdds); err != nil {
		t.Errorf("at the bounds: %v", err)
	}
}

func containsAll(s string, words ...string) bool {
	for _, w := range words {
		if !strings.Contains(s, w) {
			return false
		}
	}
	return true
}

// TestCount: the figures in messages use SI prefixes, never e-notation
// (SI Brochure 9th ed., prefixes k, M, G).
func TestCount(t *testing.T) {
	tests := []struct {
		x    float64
		want string
	}{
		{0, "0"}, {999, "999"}, {1000, "1.00 k"}, {12345, "12.3 k"}, {999_499, "999 k"},
		{999_500, "1.00 M"}, {4.5e6, "4.50 M"}, {1 << 30, "1.07 G"}, {1e11, "100 G"},
	}
	for _, tt := range tests {
		if got := count(tt.x); got != tt.want {
			t.Errorf("count(%g) = %q, want %q", tt.x, got, tt.want)
		}
	}
	if got := byteSize(560); got != "560 B" {
		t.Errorf("byteSize(560) = %q", got)
	}
	if got := byteSize(12.3e6); got != "12.3 MB" {
		t.Errorf("byteSize(12.3e6) = %q", got)
	}
}

// CPUMeter reports the CPU time per iteration of a benchmark as the
// metric cpu-ns/op, beside the wall time.
type CPUMeter struct {
	start int64
	ok    bool
}

// StartCPU begins measuring; call Report after the loop.
func StartCPU() CPUMeter {
	t, ok := CPUTime()
	return CPUMeter{t, ok}
}

// Report adds the metric for n iterations.
func (m CPUMeter) Report(b *testing.B, n int) {
	if t, ok := CPUTime(); ok && m.ok && n > 0 {
		b.ReportMetric(float64(t-m.start)/float64(n), "cpu-ns/op")
	}
}

// TestRefinement: iterative refinement in working precision converges
// when the factors are only approximate (N. J. Higham, "Accuracy and
// Stability of Numerical Algorithms", 2nd ed., 2002, §12.1): with every
// multiplier of L perturbed by 1e-7 relative, at most two steps bring the
// backward error below 1e-14 and the solution back to that of the exact
// factors.
func TestRefinement(t *testing.T) {
	n, err := MeshNetwork(4, 5).At(1e3)
	if err != nil {
		t.Fatal(err)
	}
	p, err := Analyse(n)
	if err != nil {
		t.Fatal(err)
	}
	if _, err := p.Solve(n, calc.RMS); err != nil {
		t.Fatal(err)
	}
	want := append([]complex128(nil), p.x...)
	for q := range p.lu.lx {
		p.lu.lx[q] *= 1 + 1e-7
	}
	before := p.stats.Refinements
	p.solveRefined()
	if got := p.stats.Refinements - before; got < 1 || got > maxRefine {
		t.Errorf("%d steps of refinement, want 1 to %d", got, maxRefine)
	}
	if p.eta > 1e-14 {
		t.Errorf("backward error %g after refinement", p.eta)
	}
	diff, size := 0.0, 0.0
	for i := range want {
		diff = math.Max(diff, abs1(p.x[i]-want[i]))
		size = math.Max(size, abs1(want[i]))
	}
	if diff > 1e-10*size {
		t.Errorf("refined solution differs by %g of its size", diff/size)
	}
}

// TestStampSymmetric: every stamp writes symmetric entries, so the matrix
// equals its transpose and ‖A‖∞ may be found as ‖A‖₁ (see Plan.normA).
// The network has every kind of stamp: admittances, voltage and current
// sources, an ideal short, a low impedance given a current unknown and an
// element joined to one node only (example data).
func TestStampSymmetric(t *testing.T) {
	n, err := MeshNetwork(4, 5).At(1e3)
	if err != nil {
		t.Fatal(err)
	}
	n.Elements = append(n.Elements,
		reduce.Element{Name: "I9", Kind: reduce.CurrentSource, From: "m1_1", To: "m3_2", Value: complex(0.5, -0.25)},
		reduce.Element{Name: "S9", Kind: reduce.Impedance, From: "m2_2", To: "m2_3"},
		reduce.Element{Name: "R9", Kind: reduce.Resistor, From: "m0_1", To: "m3_4", Z: 1e-9, Raw: 1e-9},
		reduce.Element{Name: "Z9", Kind: reduce.Impedance, From: "m1_3", To: "m1_3", Z: 5, Raw: 5})
	p, err := Analyse(n)
	if err != nil {
		t.Fatal(err)
	}
	s, err := p.Solve(n, calc.RMS)
	if err != nil {
		t.Fatal(err)
	}
	if len(s.LowImpedance) == 0 {
		t.Fatal("no element was given a current unknown for its low impedance")
	}
	at := func(i, j int32) complex128 {
		col := p.b.i[p.b.p[j]:p.b.p[j+1]]
		for q, r := range col {
			if r == i {
				return p.b.x[p.b.p[j]+int32(q)]
			}
		}
		return 0
	}
	rows := make([]float64, p.b.n)
	for j := int32(0); j < int32(p.b.n); j++ {
		for q := p.b.p[j]; q < p.b.p[j+1]; q++ {
			i := p.b.i[q]
			rows[i] += abs1(p.b.x[q])
			if v, w := p.b.x[q], at(j, i); v != w {
				t.Errorf("A(%d,%d) = %v but A(%d,%d) = %v", i, j, v, j, i, w)
			}
		}
	}
	if want := slices.Max(rows); p.normA != want {
		t.Errorf("‖A‖ = %g, largest row sum %g", p.normA, want)
	}
}
