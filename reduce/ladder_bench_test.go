package reduce_test

import (
	"fmt"
	"syscall"
	"testing"
	"time"

	"argand/calc"
	"argand/reduce"
)

// ladderNet is a one-source ladder of n nodes besides the reference: a
// series resistor into each node and a shunt capacitor from it to the
// reference, impedances at 50 Hz (invented example data).
func ladderNet(n int) *reduce.Network {
	net := &reduce.Network{Name: "ladder", Reference: "0",
		Elements: []reduce.Element{{Name: "V1", Kind: reduce.VoltageSource, From: "0", To: "n0", Value: 230}}}
	for k := 0; k < n; k++ {
		a, b := fmt.Sprintf("n%d", k), fmt.Sprintf("n%d", k+1)
		net.Elements = append(net.Elements,
			reduce.Element{Name: fmt.Sprintf("R%d", k), Kind: reduce.Resistor, From: a, To: b, Z: complex(1+float64(k%7), 0)},
			reduce.Element{Name: fmt.Sprintf("C%d", k), Kind: reduce.Capacitor, From: b, To: "0", Z: complex(0, -300-float64(k%5))})
	}
	return net
}

// BenchmarkLadderStepping steps ladders of 10³ to 10⁴ nodes by series and
// parallel reduction, from the network to every element's results.
func BenchmarkLadderStepping(b *testing.B) {
	for _, n := range []int{1000, 3000, 10000} {
		net := ladderNet(n)
		b.Run(fmt.Sprint(n), func(b *testing.B) {
			cpu := cpuTime()
			for b.Loop() {
				if _, err := reduce.ReduceNetwork(net, calc.RMS); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N*n), "ns/node")
			b.ReportMetric(float64((cpuTime()-cpu).Nanoseconds())/float64(b.N*n), "cpu-ns/node")
		})
	}
}

// cpuTime is the processor time of the process so far: on a machine
// shared with other work it measures the work better than the clock.
func cpuTime() time.Duration {
	var ru syscall.Rusage
	if syscall.Getrusage(syscall.RUSAGE_SELF, &ru) != nil {
		return 0
	}
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano())
}
