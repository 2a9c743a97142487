package tui

import (
	"fmt"
	"testing"

	"argand/reduce/sheet"
)

// sweepSizes are the point counts the sweep benchmarks run at: the cost
// of a sweep is linear in them on both paths.
var sweepSizes = []int{2000, 20000}

// BenchmarkSweepApp runs a sweep the way the app does: on a working copy
// of the session's worksheet, in a goroutine, under a job with progress
// and cancel.
func BenchmarkSweepApp(b *testing.B) {
	for _, n := range sweepSizes {
		b.Run(fmt.Sprint(n), func(b *testing.B) {
			m := newModel(b, Options{})
			if _, _, err := m.s.exec(sheet.Job{}, "resistor Rf = 1 kΩ", "capacitor Cf = 1 µF", "Zrc = Rf + Cf"); err != nil {
				b.Fatal(err)
			}
			stmt := fmt.Sprintf("sweep Zrc from 10 Hz to 100 kHz points %d log", n)
			b.ResetTimer()
			for i := 0; i < b.N; i++ {
				if !m.startJob("", nil, stmt) {
					b.Fatalf("%s: %s", stmt, m.msg)
				}
				b.StopTimer()
				m.s.doUndo()
				b.StartTimer()
			}
		})
	}
}

// BenchmarkSweepRun runs the same sweep the way argand run does: on a
// fresh worksheet, in the caller's goroutine.
func BenchmarkSweepRun(b *testing.B) {
	for _, n := range sweepSizes {
		b.Run(fmt.Sprint(n), func(b *testing.B) {
			stmt := fmt.Sprintf("sweep Zrc from 10 Hz to 100 kHz points %d log", n)
			for i := 0; i < b.N; i++ {
				sh := sheet.New()
				for _, s := range []string{"resistor Rf = 1 kΩ", "capacitor Cf = 1 µF", "Zrc = Rf + Cf", stmt} {
					if _, _, err := sh.Exec(s); err != nil {
						b.Fatalf("%s: %v", s, err)
					}
				}
			}
		})
	}
}
