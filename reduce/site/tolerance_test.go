package site

import (
	"math"
	"math/cmplx"
	"testing"

	"argand/calc"
)

// bruteRange scans an n^m grid of the tolerance box: the independent
// reference for Range on small cases.
func bruteRange(params []Param, n int, f func([]calc.Quantity) (calc.Quantity, error), nomAng float64) (mmin, mmax, amin, amax float64) {
	mmin, mmax, amin, amax = math.Inf(1), math.Inf(-1), math.Inf(1), math.Inf(-1)
	m := len(params)
	idx := make([]int, m)
	vals := make([]calc.Quantity, m)
	for {
		for j, p := range params {
			t := -1 + 2*float64(idx[j])/float64(n-1)
			vals[j] = calc.Quantity{V: p.Nominal.V * complex(1+t*p.Tol/100, 0), Dim: p.Nominal.Dim}
		}
		if q, err := f(vals); err == nil {
			a := cmplx.Abs(q.V)
			mmin, mmax = math.Min(mmin, a), math.Max(mmax, a)
			d := calc.NormDeg(cmplx.Phase(q.V)*180/math.Pi - nomAng)
			amin, amax = math.Min(amin, d), math.Max(amax, d)
		}
		j := 0
		for ; j < m; j++ {
			idx[j]++
			if idx[j] < n {
				break
			}
			idx[j] = 0
		}
		if j == m {
			return mmin, mmax, amin + nomAng, amax + nomAng
		}
	}
}

func seriesRLC(w float64) func([]calc.Quantity) (calc.Quantity, error) {
	return func(v []calc.Quantity) (calc.Quantity, error) {
		r, l, c := real(v[0].V), real(v[1].V), real(v[2].V)
		return calc.Q(complex(r, w*l-1/(w*c)), calc.DimImpedance), nil
	}
}

func TestRangeInteriorResonance(t *testing.T) {
	// Series RLC whose resonance (ω0 = 1/√(LC)) lies inside the tolerance
	// box at 50 Hz: the minimum |Z| is R at its lower limit, reached in the
	// interior of the (L, C) face. Reference: |Z| = √(R² + (ωL − 1/(ωC))²)
	// (handbook formula for a series RLC), whose minimum over a box that
	// contains X = 0 is R_min.
	w := 2 * math.Pi * 50
	L := 0.1
	C := 1 / (w * w * L) // resonance at nominal
	params := []Param{
		{"R", calc.Real(10, calc.DimImpedance), 5},
		{"L", calc.Real(L, calc.DimInductance), 10},
		{"C", calc.Real(C, calc.DimCapacitance), 10},
	}
	f := seriesRLC(w)
	r, err := Range(params, f)
	if err != nil {
		t.Fatal(err)
	}
	if r.Evaluations > maxEvals {
		t.Errorf("evaluations %d exceed the bound %d", r.Evaluations, maxEvals)
	}
	if got, want := real(r.MagMin.V), 9.5; math.Abs(got-want) > 1e-9*want {
		t.Errorf("min |Z| = %.15g, want R_min = %g", got, want)
	}
	// Maximum at a corner: R max, and the largest |X| over the corners.
	var want float64
	for _, lf := range []float64{0.9, 1.1} {
		for _, cf := range []float64{0.9, 1.1} {
			x := w*L*lf - 1/(w*C*cf)
			want = math.Max(want, math.Hypot(10.5, x))
		}
	}
	if got := real(r.MagMax.V); math.Abs(got-want) > 1e-9*want {
		t.Errorf("max |Z| = %.15g, want %.15g", got, want)
	}
	// Against a brute-force 101³ grid: Range must be at least as extreme.
	bmin, bmax, bamin, bamax := bruteRange(params, 101, f, 0)
	if real(r.MagMin.V) > bmin*(1+1e-12) || real(r.MagMax.V) < bmax*(1-1e-12) {
		t.Errorf("Range [%g, %g] narrower than the grid [%g, %g]", real(r.MagMin.V), real(r.MagMax.V), bmin, bmax)
	}
	gotAmin, gotAmax := r.AngMin.V, r.AngMax.V
	if math.Abs(real(gotAmin)*180/math.Pi-bamin) > 1e-6 || math.Abs(real(gotAmax)*180/math.Pi-bamax) > 1e-6 {
		t.Errorf("angle range [%g, %g]°, grid [%g, %g]°", real(gotAmin)*180/math.Pi, real(gotAmax)*180/math.Pi, bamin, bamax)
	}
	if r.Steps[0].Notes[0] != SampledLabel {
		t.Errorf("first note %q, want the sampled label", r.Steps[0].Notes[0])
	}
}

func TestRangeSmallCases(t *testing.T) {
	w := 2 * math.Pi * 50
	tests := []struct {
		name   string
		params []Param
		f      func([]calc.Quantity) (calc.Quantity, error)
	}{
		{"RL series", []Param{{"R", calc.Real(100, calc.DimImpedance), 5}, {"L", calc.Real(0.2, calc.DimInductance), 10}},
			func(v []calc.Quantity) (calc.Quantity, error) {
				return calc.Q(complex(real(v[0].V), w*real(v[1].V)), calc.DimImpedance), nil
			}},
		{"divider ratio", []Param{{"R1", calc.Real(1000, calc.DimImpedance), 1}, {"R2", calc.Real(2200, calc.DimImpedance), 1}},
			func(v []calc.Quantity) (calc.Quantity, error) {
				return calc.Number(v[1].V / (v[0].V + v[1].V)), nil
			}},
		{"RC parallel", []Param{{"R", calc.Real(1000, calc.DimImpedance), 10}, {"C", calc.Real(2e-6, calc.DimCapacitance), 20}},
			func(v []calc.Quantity) (calc.Quantity, error) {
				zc := 1 / complex(0, w*real(v[1].V))
				return calc.Q(v[0].V*zc/(v[0].V+zc), calc.DimImpedance), nil
			}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			r, err := Range(tc.params, tc.f)
			if err != nil {
				t.Fatal(err)
			}
			nom, _ := tc.f([]calc.Quantity{tc.params[0].Nominal, tc.params[1].Nominal})
			bmin, bmax, bamin, bamax := bruteRange(tc.params, 401, tc.f, cmplx.Phase(nom.V)*180/math.Pi)
			// These are monotone in each parameter, so the grid with its
			// corners is exact: agree to 1e-9 relative.
			for _, c := range []struct{ got, want float64 }{
				{real(r.MagMin.V), bmin}, {real(r.MagMax.V), bmax},
				{real(r.AngMin.V) * 180 / math.Pi, bamin}, {real(r.AngMax.V) * 180 / math.Pi, bamax},
			} {
				if math.Abs(c.got-c.want) > 1e-9*math.Max(1e-9, math.Abs(c.want)) {
					t.Errorf("got %.15g, want %.15g", c.got, c.want)
				}
			}
		})
	}
}

func TestRangeAngleAcross180(t *testing.T) {
	// −R + jX with X small: the angle sits near 180° and the range crosses
	// to −180°. Reference: atan2 at the corners (the angle is monotone in X
	// and in R here).
	params := []Param{{"R", calc.Real(100, calc.DimImpedance), 10}, {"X", calc.Real(0.5, calc.DimImpedance), 5000 / 100 * 1.9}}
	f := func(v []calc.Quantity) (calc.Quantity, error) {
		return calc.Q(complex(-real(v[0].V), real(v[1].V)), calc.DimImpedance), nil
	}
	// X runs 0.5·(1 ± 0.95): always positive, so no wrap yet.
	r, err := Range(params, f)
	if err != nil {
		t.Fatal(err)
	}
	if r.Wraps {
		t.Errorf("no wrap expected, got [%g, %g]", real(r.AngMin.V), real(r.AngMax.V))
	}
	// Now with a negative-going X: a complex nominal −100 + j0.5 scaled in
	// R only, plus an offset that swings the imaginary part through zero.
	params = []Param{{"R", calc.Real(100, calc.DimImpedance), 10}, {"k", calc.Number(1), 90}}
	f = func(v []calc.Quantity) (calc.Quantity, error) {
		x := 5 * (real(v[1].V) - 1) // −4.5 … +4.5
		return calc.Q(complex(-real(v[0].V), x+0.1), calc.DimImpedance), nil
	}
	r, err = Range(params, f)
	if err != nil {
		t.Fatal(err)
	}
	if !r.Wraps {
		t.Fatalf("expected a wrap across ±180°, got [%g, %g]", real(r.AngMin.V), real(r.AngMax.V))
	}
	// Extremes: largest angle below 180 at R = 90, x = +4.6; the most
	// negative at R = 90, x = −4.4.
	wantMax := cmplx.Phase(complex(-90, -4.4)) * 180 / math.Pi // −177.2°
	wantMin := cmplx.Phase(complex(-90, 4.6)) * 180 / math.Pi  // +177.1°
	gotMin, gotMax := real(r.AngMin.V)*180/math.Pi, real(r.AngMax.V)*180/math.Pi
	if math.Abs(gotMin-wantMin) > 1e-9*180 || math.Abs(gotMax-wantMax) > 1e-9*180 {
		t.Errorf("angle range [%.12g, %.12g]°, want [%.12g, %.12g]°", gotMin, gotMax, wantMin, wantMax)
	}
	if span := real(r.AngSpan.V) * 180 / math.Pi; math.Abs(span-(wantMax+360-wantMin)) > 1e-9*180 {
		t.Errorf("span %g°", span)
	}
	for _, q := range []calc.Quantity{r.AngMin, r.AngMax} {
		if d := real(q.V) * 180 / math.Pi; d <= -180 || d > 180 {
			t.Errorf("angle %g° outside (−180°, 180°]", d)
		}
	}
}

func TestCheckReading(t *testing.T) {
	r := RangeResult{MagMin: calc.Real(95, calc.DimImpedance), MagMax: calc.Real(105, calc.DimImpedance)}
	// Reading 110 Ω, ±1 % ± 2 digits of 0.1 Ω: band 110 ± 1.3.
	tests := []struct {
		reading  float64
		overlaps bool
		miss     float64
	}{
		{100, true, 0},
		{106, true, 0},    // 106 − 1.26 = 104.74 ≤ 105
		{110, false, 3.7}, // 108.7 − 105
		{80, false, 95 - 81},
	}
	for _, tc := range tests {
		o, err := CheckReading(calc.Real(tc.reading, calc.DimImpedance), Accuracy{1, 2, 0.1}, r)
		if err != nil {
			t.Fatal(err)
		}
		if o.Overlaps != tc.overlaps || math.Abs(real(o.Miss.V)-tc.miss) > 1e-9 {
			t.Errorf("reading %g: overlaps %v miss %g, want %v %g", tc.reading, o.Overlaps, real(o.Miss.V), tc.overlaps, tc.miss)
		}
	}
	if _, err := CheckReading(calc.Real(1, calc.DimVoltage), Accuracy{}, r); err == nil {
		t.Error("a reading in volts against a range in ohms must fail")
	}
}

func TestRangeErrors(t *testing.T) {
	f := func(v []calc.Quantity) (calc.Quantity, error) { return v[0], nil }
	for _, p := range [][]Param{
		nil,
		{{"R", calc.Real(1, calc.DimImpedance), -1}},
		{{"R", calc.Real(1, calc.DimImpedance), 100}},
		{{"R", calc.Real(math.NaN(), calc.DimImpedance), 1}},
	} {
		if _, err := Range(p, f); err == nil {
			t.Errorf("%v: no error", p)
		}
	}
	// Thirteen free parameters exceed the bound.
	many := make([]Param, 13)
	for i := range many {
		many[i] = Param{"p", calc.Number(1), 1}
	}
	if _, err := Range(many, f); err == nil {
		t.Error("13 free parameters accepted")
	}
	// Twelve go through the Halton path within the evaluation bound.
	r, err := Range(many[:12], func(v []calc.Quantity) (calc.Quantity, error) {
		s := complex(0, 0)
		for _, x := range v {
			s += x.V
		}
		return calc.Number(s), nil
	})
	if err != nil {
		t.Fatal(err)
	}
	if r.Evaluations > maxEvals || math.Abs(real(r.MagMin.V)-12*0.99) > 1e-9 || math.Abs(real(r.MagMax.V)-12*1.01) > 1e-9 {
		t.Errorf("12 parameters: %d evals, [%g, %g]", r.Evaluations, real(r.MagMin.V), real(r.MagMax.V))
	}
}
