package site

import (
	"math"
	"math/cmplx"
	"testing"

	"argand/calc"
)

// TestRangeInteriorAngle checks an interior maximum of the angle against a
// brute-force 121³ grid of the same box.
func TestRangeInteriorAngle(t *testing.T) {
	// R2 in series with R1‖C: the angle of Z is 0 at C = 0 and as C → ∞,
	// and most negative near ω·C·R1 = √(1 + R1/R2), which lies inside the
	// box in C.
	w := 2 * math.Pi * 50
	params := []Param{
		{"R1", calc.Real(1000, calc.DimImpedance), 5},
		{"R2", calc.Real(100, calc.DimImpedance), 5},
		{"C", calc.Real(math.Sqrt(11)/(w*1000), calc.DimCapacitance), 30},
	}
	f := func(v []calc.Quantity) (calc.Quantity, error) {
		r1, r2, c := v[0].V, v[1].V, real(v[2].V)
		return calc.Q(r2+r1/(1+complex(0, w*c)*r1), calc.DimImpedance), nil
	}
	r, err := Range(params, f)
	if err != nil {
		t.Fatal(err)
	}
	nom, _ := f([]calc.Quantity{params[0].Nominal, params[1].Nominal, params[2].Nominal})
	if c := real(r.AtAngMin[2].V); c <= real(params[2].Nominal.V)*0.7*(1+1e-9) || c >= real(params[2].Nominal.V)*1.3*(1-1e-9) {
		t.Errorf("the angle minimum should be interior in C, found at C = %g", c)
	}
	bmin, bmax, bamin, bamax := bruteRange(params, 121, f, cmplx.Phase(nom.V)*180/math.Pi)
	// Range refines beyond the grid: at least as extreme, and within the
	// grid's resolution.
	for _, c := range []struct {
		name      string
		got, grid float64
		outward   float64 // +1 when larger is more extreme
	}{
		{"mag min", real(r.MagMin.V), bmin, -1},
		{"mag max", real(r.MagMax.V), bmax, 1},
		{"ang min", real(r.AngMin.V) * 180 / math.Pi, bamin, -1},
		{"ang max", real(r.AngMax.V) * 180 / math.Pi, bamax, 1},
	} {
		if (c.got-c.grid)*c.outward < -1e-9*math.Abs(c.grid) {
			t.Errorf("%s: Range %.12g is inside the grid's %.12g", c.name, c.got, c.grid)
		}
		if math.Abs(c.got-c.grid) > 1e-3*math.Abs(c.grid) {
			t.Errorf("%s: Range %.12g far from the grid's %.12g", c.name, c.got, c.grid)
		}
	}
}

func TestRangeSkipsFailures(t *testing.T) {
	// 1/(x − 1) fails where x = 1 exactly; the grid hits that point.
	params := []Param{{"x", calc.Number(1), 50}}
	f := func(v []calc.Quantity) (calc.Quantity, error) {
		return calc.Recip(calc.Number(v[0].V - 1))
	}
	if _, err := Range(params, f); err == nil {
		t.Error("a failing nominal must be an error")
	}
	params = []Param{{"x", calc.Number(2), 50}}
	r, err := Range(params, f)
	if err != nil {
		t.Fatal(err)
	}
	if r.Failed == 0 {
		t.Error("the failing point was not counted")
	}
}

func BenchmarkRangeRLC(b *testing.B) {
	w := 2 * math.Pi * 50
	params := []Param{
		{"R", calc.Real(10, calc.DimImpedance), 5},
		{"L", calc.Real(0.1, calc.DimInductance), 10},
		{"C", calc.Real(1/(w*w*0.1), calc.DimCapacitance), 10},
	}
	f := seriesRLC(w)
	for b.Loop() {
		if _, err := Range(params, f); err != nil {
			b.Fatal(err)
		}
	}
}
