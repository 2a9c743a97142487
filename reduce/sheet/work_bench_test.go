package sheet

import (
	"fmt"
	"strings"
	"syscall"
	"testing"
	"time"
)

// cpuTime is the processor time of the process so far: on a machine
// shared with other work it measures the work better than the clock.
func cpuTime() time.Duration {
	var ru syscall.Rusage
	if syscall.Getrusage(syscall.RUSAGE_SELF, &ru) != nil {
		return 0
	}
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano())
}

// perUnit reports the clock and processor time per unit of work.
func perUnit(b *testing.B, cpu time.Duration, units int, unit string) {
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N*units), "ns/"+unit)
	b.ReportMetric(float64((cpuTime()-cpu).Nanoseconds())/float64(b.N*units), "cpu-ns/"+unit)
}

// runLines runs worksheet lines on a fresh sheet, failing on an error.
func runLines(tb testing.TB, s *Sheet, lines ...string) {
	tb.Helper()
	for _, l := range lines {
		if _, _, err := s.Exec(l); err != nil {
			tb.Fatalf("%s: %v", l, err)
		}
	}
}

// tolNetwork is a node-block network with four toleranced parts
// (invented example data).
var tolNetwork = []string{
	"frequency 50 Hz",
	"network sp reference gnd",
	"voltage source Vs = 10 V from a to gnd",
	"resistor Ra = 100 Ω from a to b",
	"inductor La = 100 mH from b to c",
	"resistor Rb = 220 Ω from c to gnd",
	"capacitor Cb = 10 µF from c to gnd",
	"end",
	"tolerance Ra 5%",
	"tolerance La 10%",
	"tolerance Rb 5%",
	"tolerance Cb 20%",
}

// BenchmarkSpreadNetwork is a spread over a network with four toleranced
// parts: about 20 000 solutions of the network.
func BenchmarkSpreadNetwork(b *testing.B) {
	s := New()
	runLines(b, s, tolNetwork...)
	for b.Loop() {
		c := s.Clone()
		runLines(b, c, "spread vc = sp.Cb.v")
	}
}

// BenchmarkReadingCheckNetwork is a reading check over the same network.
func BenchmarkReadingCheckNetwork(b *testing.B) {
	s := New()
	runLines(b, s, tolNetwork...)
	for b.Loop() {
		c := s.Clone()
		runLines(b, c, "check sp.Cb.v reads 5.5 V within 1% + 2 digits of 0.01 V")
	}
}

// sweepNetwork is a 20-element node-block ladder (invented example data).
func sweepNetwork() []string {
	lines := []string{"network lad reference gnd", "voltage source V1 = 1 V from n0 to gnd"}
	for k := 0; k < 10; k++ {
		lines = append(lines,
			fmt.Sprintf("resistor R%d = %d Ω from n%d to n%d", k, 10+k, k, k+1),
			fmt.Sprintf("capacitor C%d = %d µF from n%d to gnd", k, 1+k, k+1))
	}
	return append(lines, "end")
}

func benchSweep(b *testing.B, points int) {
	s := New()
	runLines(b, s, sweepNetwork()...)
	src := fmt.Sprintf("sweep lad.n10.v from 10 Hz to 100 kHz points %d", points)
	cpu := cpuTime()
	for b.Loop() {
		c := s.Clone()
		runLines(b, c, src)
	}
	perUnit(b, cpu, points, "point")
}

// BenchmarkSweep sweeps a 20-element network over 250, 1000 and 4000
// points: the time per point should not grow with the points.
func BenchmarkSweep(b *testing.B) {
	for _, n := range []int{250, 1000, 4000} {
		b.Run(fmt.Sprint(n), func(b *testing.B) { benchSweep(b, n) })
	}
}

// blockNetwork is a node-block network of n elements: a ladder of
// resistors and capacitors fed by one source (invented example data).
func blockNetwork(n int) string {
	var w strings.Builder
	w.WriteString("network big reference gnd\nvoltage source Vs = 230 V from n0 to gnd\n")
	for k := 0; k < n-1; k++ {
		if k%2 == 0 {
			fmt.Fprintf(&w, "resistor R%d = %d Ω from n%d to n%d\n", k, 1+k%7, k/2, k/2+1)
		} else {
			fmt.Fprintf(&w, "capacitor C%d = %d µF from n%d to gnd\n", k, 1+k%5, k/2+1)
		}
	}
	w.WriteString("end\n")
	return w.String()
}

// BenchmarkNetworkBuild runs a node block of 10³ to 10⁵ elements.
func BenchmarkNetworkBuild(b *testing.B) {
	for _, n := range []int{1000, 10000, 30000, 100000} {
		b.Run(fmt.Sprint(n), func(b *testing.B) {
			ws := blockNetwork(n)
			cpu := cpuTime()
			for b.Loop() {
				s := New()
				sum, err := s.Run(strings.NewReader(ws), nil)
				if err != nil || sum.Err != nil {
					b.Fatalf("%v %v", err, sum.Err)
				}
			}
			perUnit(b, cpu, n, "element")
		})
	}
}

// meshSheet is the node block of a rows×cols mesh of series R–L sections
// with a capacitor to the reference at every node, fed at one corner and
// loaded at the other: invented example data, the worksheet form of the
// mesh the nodal package's sweep benchmarks solve (about 1000 unknowns
// at 20×26).
func meshSheet(rows, cols int) []string {
	lines := []string{"network m reference gnd", "voltage source V1 = 230 V from gnd to m0_0"}
	k := 0
	for r := range rows {
		for c := range cols {
			if c+1 < cols {
				lines = append(lines, fmt.Sprintf("resistor RH%d = %g Ω from m%d_%d to h%d", k, 0.2+0.01*float64(k%13), r, c, k),
					fmt.Sprintf("inductor LH%d = %g mH from h%d to m%d_%d", k, 0.1*(1+float64(k%5)), k, r, c+1))
			}
			if r+1 < rows {
				lines = append(lines, fmt.Sprintf("resistor RV%d = %g Ω from m%d_%d to m%d_%d", k, 0.5+0.02*float64(k%7), r, c, r+1, c))
			}
			lines = append(lines, fmt.Sprintf("capacitor C%d = %g µF from m%d_%d to gnd", k, 0.1*(1+float64(k%3)), r, c))
			k++
		}
	}
	return append(lines, fmt.Sprintf("resistor RL = 10 Ω from m%d_%d to gnd", rows-1, cols-1), "end")
}

// BenchmarkSweepMesh is a 200-point worksheet sweep over the 20×26 mesh
// (1023 unknowns, 2120 elements): the end-to-end cost of a sweep point,
// re-evaluating every element at the frequency, solving on the kept
// symbolic analysis and writing every node voltage and branch result.
func BenchmarkSweepMesh(b *testing.B) {
	s := New()
	runLines(b, s, meshSheet(20, 26)...)
	src := "sweep m.RL.v from 10 Hz to 100 kHz points 200"
	cpu := cpuTime()
	for b.Loop() {
		c := s.Clone()
		runLines(b, c, src)
	}
	perUnit(b, cpu, 200, "point")
}

// BenchmarkEstimate sets the work estimate of a 200-point sweep (the
// figure the budget is held against) beside the time the sweep takes, per
// point, for worksheets from a 20-element ladder to the 2000-element
// mesh: the estimate should stay within a small factor of the time, on
// the side of more.
func BenchmarkEstimate(b *testing.B) {
	for _, c := range []struct {
		name, expr string
		lines      []string
	}{
		{"ladder-20", "lad.n10.v", sweepNetwork()},
		{"mesh-8x10", "m.RL.v", meshSheet(8, 10)},
		{"mesh-20x26", "m.RL.v", meshSheet(20, 26)},
	} {
		b.Run(c.name, func(b *testing.B) {
			s := New()
			runLines(b, s, c.lines...)
			e := s.parser(c.expr, 1).Expr()
			est := s.sampleCost([]string{"f", "w", "ω"}, e, s.needs(e))
			src := fmt.Sprintf("sweep %s from 10 Hz to 100 kHz points 200", c.expr)
			for b.Loop() {
				runLines(b, s.Clone(), src)
			}
			per := float64(b.Elapsed().Nanoseconds()) / float64(b.N*200)
			b.ReportMetric(est*1e9, "estimate-ns/point")
			b.ReportMetric(per, "ns/point")
			b.ReportMetric(est*1e9/per, "estimate/time")
		})
	}
}
