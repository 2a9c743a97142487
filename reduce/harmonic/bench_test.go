package harmonic

import (
	"fmt"
	"math/rand"
	"testing"

	"argand/calc"
)

// benchSpectrum is a random current spectrum with every order up to top.
func benchSpectrum(b *testing.B, top int) Spectrum {
	rng := rand.New(rand.NewSource(int64(top)))
	os := []order{{1, 100, 0}}
	for h := 2; h <= top; h++ {
		os = append(os, order{h, 10 * rng.Float64(), 360 * rng.Float64()})
	}
	var es []Entry
	for _, o := range os {
		es = append(es, Entry{Order: o.h, Value: calc.Real(o.rms, calc.DimCurrent), HasAngle: true})
	}
	s, err := Build(es)
	if err != nil {
		b.Fatal(err)
	}
	return s
}

// The peak and the rectified average evaluate every order at a grid of
// 64 points per cycle of the highest order: the work grows as the square
// of the highest order (orders × points), which these sizes show.
func BenchmarkPeak(b *testing.B) {
	for _, top := range []int{5, 25, 50, 100} {
		s := benchSpectrum(b, top)
		b.Run(fmt.Sprintf("orders=%d", top), func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				s.wave().Peak()
			}
		})
	}
}

func BenchmarkRectifiedAverage(b *testing.B) {
	for _, top := range []int{5, 25, 50, 100} {
		s := benchSpectrum(b, top)
		b.Run(fmt.Sprintf("orders=%d", top), func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				s.wave().RectifiedAverage()
			}
		})
	}
}

func BenchmarkPowers(b *testing.B) {
	for _, top := range []int{5, 25, 50, 100} {
		v, i := benchSpectrum(b, top), benchSpectrum(b, top)
		v.Dim = calc.DimVoltage
		b.Run(fmt.Sprintf("orders=%d", top), func(b *testing.B) {
			for k := 0; k < b.N; k++ {
				if _, err := PowersOf(v, i); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

func BenchmarkScan(b *testing.B) {
	bank := Bank{Ssc: 10e6, Q: 400e3, P: 0.07, XR: 8}
	for _, top := range []int{25, 50, 100} {
		b.Run(fmt.Sprintf("hmax=%d", top), func(b *testing.B) {
			for k := 0; k < b.N; k++ {
				if _, err := bank.Scan(400, top, 0.05); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
