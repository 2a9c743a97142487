package power

import (
	"testing"

	"argand/calc"
)

func BenchmarkFromPhasors(b *testing.B) {
	v, i := volt(230), amp(8-6i)
	for b.Loop() {
		if _, _, err := FromPhasors(v, i, calc.RMS); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkCorrect(b *testing.B) {
	t := Target{Load: va(100e3 + 88e3i), PF: 0.95, V: volt(400), Freq: 50, Phases: ThreePhase}
	for b.Loop() {
		if _, _, err := Correct(t); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkSum1000(b *testing.B) {
	loads := make([]calc.Quantity, 1000)
	for k := range loads {
		loads[k] = va(complex(float64(k), float64(k%7)))
	}
	for b.Loop() {
		if _, _, err := Sum(loads); err != nil {
			b.Fatal(err)
		}
	}
}
