package nodal_test

import (
	"flag"
	"fmt"
	"os"
	"runtime"
	"strings"
	"testing"

	"argand/calc"
	"argand/reduce/nodal"
	"argand/reduce/sheet"
)

var gridSheet = flag.String("gridsheet", "", "write the 100×100 grid worksheet of BenchmarkGridWorksheet to this file, for measuring `argand run` on it")

// gridWorksheet writes a rows×cols grid of resistors, inductors and
// capacitors at 50 Hz as a worksheet (invented example data): a 230 V
// source at one corner, a load at the other and a leak to the reference
// at every seventh node.
func gridWorksheet(rows, cols int) string {
	var b strings.Builder
	b.WriteString("frequency 50 Hz\nnetwork g reference gnd\nvoltage source V1 = 230 V from gnd to g0_0\n")
	node := func(r, c int) string { return fmt.Sprintf("g%d_%d", r, c) }
	el := func(k int, name, a, z string) {
		switch k % 4 {
		case 0:
			fmt.Fprintf(&b, "resistor %s = %d Ω from %s to %s\n", name, 10+k%7, a, z)
		case 1:
			fmt.Fprintf(&b, "inductor %s = %d mH from %s to %s\n", name, 1+k%5, a, z)
		case 2:
			fmt.Fprintf(&b, "capacitor %s = %d µF from %s to %s\n", name, 100+k%3, a, z)
		default:
			fmt.Fprintf(&b, "resistor %s = %d Ω from %s to %s\n", name, 4+k%11, a, z)
		}
	}
	k := 0
	for r := range rows {
		for c := range cols {
			if c+1 < cols {
				el(k, fmt.Sprintf("H%d", k), node(r, c), node(r, c+1))
			}
			if r+1 < rows {
				el(k+1, fmt.Sprintf("W%d", k), node(r, c), node(r+1, c))
			}
			if k%7 == 6 {
				fmt.Fprintf(&b, "resistor G%d = %d Ω from %s to gnd\n", k, 500+k%3, node(r, c))
			}
			k++
		}
	}
	fmt.Fprintf(&b, "resistor RL = 100 Ω from %s to gnd\nend\n", node(rows-1, cols-1))
	return b.String()
}

// TestGridWorksheet runs a 12×12 grid worksheet through the worksheet
// interpreter and compares every node voltage it defines with gonum's
// dense solve of the same network (referenceVoltages), to 1e-9 norm-wise.
func TestGridWorksheet(t *testing.T) {
	s := sheet.New()
	sum, err := s.Run(strings.NewReader(gridWorksheet(12, 12)), nil)
	if err != nil || sum.Err != nil {
		t.Fatalf("run: %v %v", err, sum.Err)
	}
	n, err := s.Network("g")
	if err != nil {
		t.Fatal(err)
	}
	nodes, ref := referenceVoltages(t, n)
	diff := make([]complex128, len(nodes))
	for i, name := range nodes {
		q, ok := s.Lookup("g." + name + ".v")
		if !ok {
			t.Fatalf("g.%s.v is not defined", name)
		}
		diff[i] = q.V - ref[i]
	}
	if norm(diff) > 1e-9*norm(ref) {
		t.Errorf("‖v − v_ref‖ = %g > 1e-9·‖v_ref‖ = %g", norm(diff), 1e-9*norm(ref))
	}
}

// BenchmarkGridWorksheet runs the 100×100 grid worksheet (10 001
// unknowns) through the worksheet interpreter, as `argand run` does
// without the printing, and reports the live heap afterwards. Peak memory
// of the program itself is measured on the file written with -gridsheet:
//
//	go test -run '^$' -bench GridWorksheet -benchtime 1x ./reduce/nodal -gridsheet /tmp/grid.argand
//	/usr/bin/time -v argand run /tmp/grid.argand > /dev/null
func BenchmarkGridWorksheet(b *testing.B) {
	text := gridWorksheet(100, 100)
	if *gridSheet != "" {
		if err := os.WriteFile(*gridSheet, []byte(text), 0o644); err != nil {
			b.Fatal(err)
		}
	}
	var live uint64
	cpu := nodal.StartCPU()
	for b.Loop() {
		s := sheet.New()
		sum, err := s.Run(strings.NewReader(text), func([]calc.Step) {})
		if err != nil || sum.Err != nil {
			b.Fatalf("run: %v %v", err, sum.Err)
		}
		runtime.GC()
		var ms runtime.MemStats
		runtime.ReadMemStats(&ms)
		live = ms.HeapAlloc
		runtime.KeepAlive(s)
	}
	cpu.Report(b, b.N)
	b.ReportMetric(float64(live)/1e6, "live-heap-MB")
}
