package sweep

import (
	"fmt"
	"math"
	"math/cmplx"
	"math/rand/v2"
	"strings"
	"testing"

	"argand/calc"
)

// rlcCase is a series or parallel RLC circuit with the closed forms of its
// resonance (common practice, any circuits text): f0 = 1/(2π·√(L·C));
// series Q = (1/R)·√(L/C), parallel Q = R·√(C/L); half-power edges
// f1,2 = f0·(√(1 + 1/(4Q²)) ∓ 1/(2Q)), so f2 − f1 = f0/Q.
type rlcCase struct {
	name     string
	r, l, c  float64
	parallel bool
	transfer bool // the ratio V_R/V_in of the series circuit instead of its impedance
}

func (rc rlcCase) eval(hz float64) (calc.Quantity, error) {
	w := 2 * math.Pi * hz
	zl, zc := complex(0, w*rc.l), complex(0, -1/(w*rc.c))
	switch {
	case rc.transfer:
		return calc.Number(complex(rc.r, 0) / (complex(rc.r, 0) + zl + zc)), nil
	case rc.parallel:
		return calc.Q(1/(1/complex(rc.r, 0)+1/zl+1/zc), calc.DimImpedance), nil
	}
	return calc.Q(complex(rc.r, 0)+zl+zc, calc.DimImpedance), nil
}

func (rc rlcCase) closed() (f0, q, f1, f2 float64) {
	f0 = 1 / (2 * math.Pi * math.Sqrt(rc.l*rc.c))
	q = math.Sqrt(rc.l/rc.c) / rc.r
	if rc.parallel {
		q = rc.r * math.Sqrt(rc.c/rc.l)
	}
	h := 1 / (2 * q)
	return f0, q, f0 * (math.Sqrt(1+h*h) - h), f0 * (math.Sqrt(1+h*h) + h)
}

var rlcCases = []rlcCase{
	{name: "series, Q 5", r: 20, l: 10e-3, c: 1e-6},
	{name: "series, Q 0.8", r: 125, l: 10e-3, c: 1e-6},
	{name: "parallel, Q 25", r: 2500, l: 10e-3, c: 1e-6, parallel: true},
	{name: "series transfer V_R/V_in, Q 10", r: 10, l: 10e-3, c: 1e-6, transfer: true},
}

// table sweeps the case over 301 points from f0/20 to 20·f0.
func (rc rlcCase) table(t *testing.T, f0 float64) *Table {
	t.Helper()
	pts, err := Points(f0/20, f0*20, 301, true)
	if err != nil {
		t.Fatal(err)
	}
	tab, err := Run(pts, rc.eval)
	if err != nil {
		t.Fatal(err)
	}
	return tab
}

func TestFindingsAgainstClosedForms(t *testing.T) {
	for _, rc := range rlcCases {
		f0, q, f1, f2 := rc.closed()
		tab := rc.table(t, f0)
		for _, refine := range []bool{true, false} {
			var ev func(float64) (calc.Quantity, error)
			// refined findings agree to 1e-9; interpolated ones to the
			// spacing of the sweep (about 2 % per step here)
			tol := 1e-3
			if refine {
				ev, tol = rc.eval, 1e-9
			}
			fd := Find(tab, ev)
			if len(fd.Resonances) != 1 {
				t.Fatalf("%s refine=%v: %d resonances, want 1", rc.name, refine, len(fd.Resonances))
			}
			r := fd.Resonances[0]
			if !relClose(r.Freq, f0, tol) {
				t.Errorf("%s refine=%v: resonance at %v Hz, want %v", rc.name, refine, r.Freq, f0)
			}
			// the value at resonance is R (impedances) or 1 (V_R/V_in)
			wantLevel := rc.r
			if rc.transfer {
				wantLevel = 1
			}
			if !relClose(real(r.Value.V), wantLevel, math.Max(tol, 1e-9)*10) && refine {
				t.Errorf("%s: value at resonance %v, want %v", rc.name, r.Value.V, wantLevel)
			}
			dip := !rc.parallel && !rc.transfer
			if r.Dip != dip || r.Peak == dip {
				t.Errorf("%s: peak %v dip %v, want dip %v", rc.name, r.Peak, r.Dip, dip)
			}
			ext := fd.Max
			if dip {
				ext = fd.Min
			}
			if !ext.Interior || (refine && !relClose(cmplx.Abs(ext.Value.V), wantLevel, 1e-9)) {
				t.Errorf("%s refine=%v: extreme %v at %v Hz, want |x| = %v", rc.name, refine, ext.Value.V, ext.Freq, wantLevel)
			}
			if len(fd.Bands) != 1 {
				t.Fatalf("%s: %d bands, want 1", rc.name, len(fd.Bands))
			}
			b := fd.Bands[0]
			if !b.HasF1 || !b.HasF2 || b.Dip != dip {
				t.Fatalf("%s: band %+v", rc.name, b)
			}
			if !relClose(b.F1, f1, tol) || !relClose(b.F2, f2, tol) {
				t.Errorf("%s refine=%v: band %v … %v Hz, want %v … %v", rc.name, refine, b.F1, b.F2, f1, f2)
			}
			if bw, _ := b.Bandwidth(); refine && !relClose(b.Centre/bw, q, 1e-7) {
				t.Errorf("%s: Q from the band %v, want %v", rc.name, b.Centre/bw, q)
			}
		}
	}
}

// Half-power levels: peak/√2 around a peak, √2·minimum around a dip.
func TestHalfPowerTargets(t *testing.T) {
	for _, rc := range rlcCases[:3] {
		pts, _ := Points(100, 100e3, 201, true)
		tab, err := Run(pts, rc.eval)
		if err != nil {
			t.Fatal(err)
		}
		fd := Find(tab, rc.eval)
		b := fd.Bands[0]
		want := rc.r * math.Sqrt2
		if rc.parallel {
			want = rc.r / math.Sqrt2
		}
		if !relClose(b.Target, want, 1e-9) {
			t.Errorf("%s: target %v, want %v", rc.name, b.Target, want)
		}
		for _, f := range []float64{b.F1, b.F2} {
			v, _ := rc.eval(f)
			if !relClose(cmplx.Abs(v.V), want, 1e-9) {
				t.Errorf("%s: |x(%v Hz)| = %v, want %v", rc.name, f, cmplx.Abs(v.V), want)
			}
		}
	}
}

func TestFindingsEdges(t *testing.T) {
	// a first-order low-pass R–C: no resonance, largest at the start
	lp := func(hz float64) (calc.Quantity, error) {
		return calc.Number(1 / complex(1, 2*math.Pi*hz*1e3*1e-6)), nil
	}
	pts, _ := Points(1, 10e3, 101, true)
	tab, err := Run(pts, lp)
	if err != nil {
		t.Fatal(err)
	}
	fd := Find(tab, lp)
	if len(fd.Resonances) != 0 || len(fd.Bands) != 0 || fd.Max.Interior || fd.Max.Freq != 1 || fd.Min.Freq != 10e3 {
		t.Errorf("low-pass: %+v", fd)
	}
	st := fd.Step("sweep H", calc.Format{})
	if !strings.Contains(strings.Join(st.Notes, "\n"), "no resonance in the range") {
		t.Errorf("notes: %q", st.Notes)
	}
	// the peak of a series circuit whose band runs past the end of the sweep
	rc := rlcCases[1]
	f0, _, _, _ := rc.closed()
	pts, _ = Points(f0*0.9, f0*3, 101, false)
	tab, _ = Run(pts, rc.eval)
	fd = Find(tab, rc.eval)
	if len(fd.Bands) != 1 || fd.Bands[0].HasF1 || !fd.Bands[0].HasF2 {
		t.Fatalf("band past the start: %+v", fd.Bands)
	}
	st = fd.Step("sweep Z", calc.Format{})
	if !strings.Contains(strings.Join(st.Notes, "\n"), "f1 lies below the start") {
		t.Errorf("notes: %q", st.Notes)
	}
	// a real-valued sweep has no angle to read
	pts, _ = Points(1, 10, 10, false)
	tab, _ = Run(pts, func(hz float64) (calc.Quantity, error) { return calc.Real(hz, calc.DimImpedance), nil })
	fd = Find(tab, nil)
	if len(fd.Resonances) != 0 || !strings.Contains(strings.Join(fd.Notes, " "), "no phase") {
		t.Errorf("real sweep: %+v", fd)
	}
	// an ideal tank at its resonance: the marked point is skipped, the
	// angle jumps through ±90° and no resonance is claimed
	tank := func(hz float64) (calc.Quantity, error) {
		w := 2 * math.Pi * hz
		y := complex(0, w*1e-6) + 1/complex(0, w*1e-3)
		if y == 0 {
			return calc.Quantity{}, calc.ErrOpenCircuit
		}
		return calc.Q(1/y, calc.DimImpedance), nil
	}
	tab, _ = Run([]float64{1000, 5032.921210448704, 10000}, tank)
	fd = Find(tab, tank)
	for _, r := range fd.Resonances {
		if real(r.Value.V) <= 0 {
			t.Errorf("resonance with a non-positive real part: %+v", r)
		}
	}
	// nothing finite
	fd = Find(&Table{Points: []Point{{Freq: 1, Mark: Open}}}, nil)
	if fd.HasExtreme {
		t.Errorf("a sweep of marked points has no extreme")
	}
}

// dB against a stated reference: 20·log10(|x|/|ref|) (IEC 60027-3, from
// memory: a level in dB names its reference).
func TestDecibels(t *testing.T) {
	tab := &Table{Dim: calc.DimVoltage, Points: []Point{
		{Freq: 1, Value: calc.Q(10, calc.DimVoltage)},
		{Freq: 2, Value: calc.Q(complex(0, 0.1), calc.DimVoltage)},
		{Freq: 3, Value: calc.Q(0, calc.DimVoltage)},
		{Freq: 4, Mark: Short},
	}}
	db, has, err := tab.Decibels(calc.Q(1, calc.DimVoltage))
	if err != nil {
		t.Fatal(err)
	}
	want := []float64{20, -20}
	for k, w := range want {
		if !has[k] || math.Abs(db[k]-w) > 1e-12 {
			t.Errorf("point %d: %v dB (%v), want %v", k, db[k], has[k], w)
		}
	}
	if has[2] || has[3] {
		t.Errorf("a zero or a marked point has no dB value")
	}
	if _, _, err := tab.Decibels(calc.Q(1, calc.DimCurrent)); err == nil {
		t.Errorf("a reference in A for a sweep in V must be refused")
	}
	if _, _, err := tab.Decibels(calc.Q(0, calc.DimVoltage)); err == nil {
		t.Errorf("a zero reference must be refused")
	}
}

// A value whose angle turns many times lists a bounded number of
// resonances and says how many more there are.
func TestFindingsBounded(t *testing.T) {
	ev := func(hz float64) (calc.Quantity, error) {
		return calc.Q(cmplx.Rect(1+hz/1e4, 2*math.Pi*hz/100), calc.DimVoltage), nil
	}
	pts, _ := Points(1, 1e4, 20001, false)
	tab, err := Run(pts, ev)
	if err != nil {
		t.Fatal(err)
	}
	fd := Find(tab, ev)
	if len(fd.Resonances) != MaxResonances {
		t.Fatalf("%d resonances, want %d", len(fd.Resonances), MaxResonances)
	}
	// the angle is zero at every multiple of 100 Hz: 100 of them up to 10 kHz
	for i, r := range fd.Resonances {
		if want := float64(100 * (i + 1)); math.Abs(r.Freq-want) > 1e-9*want {
			t.Errorf("resonance %d at %v Hz, want %v", i+1, r.Freq, want)
		}
	}
	if !strings.Contains(strings.Join(fd.Notes, " "), "80 more times") {
		t.Errorf("notes: %q", fd.Notes)
	}
}

// The reading of a sweep costs a bounded number of evaluations plus a scan
// of the points: time per point falls as the sweep grows.
func BenchmarkFind(b *testing.B) {
	rc := rlcCases[0]
	for _, n := range []int{250, 1000, 4000, 16000} {
		pts, _ := Points(100, 100e3, n, true)
		tab, err := Run(pts, rc.eval)
		if err != nil {
			b.Fatal(err)
		}
		b.Run(fmt.Sprint(n), func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				Find(tab, rc.eval)
			}
		})
	}
}

// A band narrower than the point spacing puts every sampled point outside
// it; the edges must still come out against the closed forms (common
// practice: f0 = 1/(2π√(LC)), series B = R/(2πL), parallel B = 1/(2πRC)).
// The tolerances are the refinement's: bisection to about 1e-14 in f for
// the edges, golden-section search to about √ε for the centre.
func TestHalfPowerSparse(t *testing.T) {
	tests := []struct {
		rc       rlcCase
		lo, hi   float64
		n        int
		wantNote bool
	}{
		// the README example: 61 log points from 1 kHz to 20 kHz, about
		// 5 % per step against a band of about 3 %
		{rc: rlcCase{name: "series 10 Ω 10 mH 100 nF, 61 points", r: 10, l: 10e-3, c: 100e-9}, lo: 1e3, hi: 20e3, n: 61},
		{rc: rlcCase{name: "series 10 Ω 10 mH 100 nF, 201 points", r: 10, l: 10e-3, c: 100e-9}, lo: 1e3, hi: 20e3, n: 201},
		{rc: rlcCase{name: "series Q 100, 11 points", r: 1, l: 10e-3, c: 100e-9}, lo: 1e3, hi: 20e3, n: 11},
		{rc: rlcCase{name: "parallel Q 100, 21 linear points", r: 31622.7766, l: 10e-3, c: 100e-9, parallel: true}, lo: 1e3, hi: 20e3, n: 21},
	}
	for _, tc := range tests {
		for _, log := range []bool{true, false} {
			if tc.rc.parallel && log {
				continue
			}
			f0, q, f1, f2 := tc.rc.closed()
			pts, err := Points(tc.lo, tc.hi, tc.n, log || !tc.rc.parallel)
			if err != nil {
				t.Fatal(err)
			}
			tab, err := Run(pts, tc.rc.eval)
			if err != nil {
				t.Fatal(err)
			}
			fd := Find(tab, tc.rc.eval)
			if len(fd.Bands) != 1 {
				t.Fatalf("%s: %d bands, want 1", tc.rc.name, len(fd.Bands))
			}
			b := fd.Bands[0]
			if b.Narrow || !b.HasF1 || !b.HasF2 {
				t.Fatalf("%s: band %+v not located", tc.rc.name, b)
			}
			if !(b.F1 < f0 && f0 < b.F2) {
				t.Errorf("%s: f1 %v, f0 %v, f2 %v out of order", tc.rc.name, b.F1, f0, b.F2)
			}
			if !relClose(b.F1, f1, 1e-9) || !relClose(b.F2, f2, 1e-9) {
				t.Errorf("%s: band %v … %v Hz, want %v … %v", tc.rc.name, b.F1, b.F2, f1, f2)
			}
			bw, _ := b.Bandwidth()
			if !relClose(bw, f0/q, 1e-7) || !relClose(b.Centre/bw, q, 1e-7) {
				t.Errorf("%s: B %v Q %v, want %v %v", tc.rc.name, bw, b.Centre/bw, f0/q, q)
			}
		}
	}
}

// Without an evaluation between the points a band narrower than the
// spacing cannot be read: it is reported as such, with no edges.
func TestHalfPowerNarrowUnrefined(t *testing.T) {
	rc := rlcCase{name: "series 10 Ω 10 mH 100 nF", r: 10, l: 10e-3, c: 100e-9}
	pts, _ := Points(1e3, 20e3, 61, true)
	tab, err := Run(pts, rc.eval)
	if err != nil {
		t.Fatal(err)
	}
	fd := Find(tab, nil)
	if len(fd.Bands) != 1 || !fd.Bands[0].Narrow || fd.Bands[0].HasF1 || fd.Bands[0].HasF2 {
		t.Fatalf("bands %+v, want one narrow band without edges", fd.Bands)
	}
	st := fd.Step("Z", calc.Format{})
	if s := strings.Join(st.Notes, "\n"); !strings.Contains(s, "narrower than the point spacing") || strings.Contains(s, "f2 =") {
		t.Errorf("notes do not say the band is narrower than the spacing:\n%s", s)
	}
}

// Property: over random series and parallel RLC circuits and point counts,
// the refined band satisfies f1 < f0 < f2 and agrees with the closed forms
// (common practice) to the refinement's tolerance.
func TestHalfPowerProperty(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 11))
	for i := 0; i < 300; i++ {
		rc := rlcCase{
			r:        math.Pow(10, -1+4*rng.Float64()),
			l:        math.Pow(10, -6+4*rng.Float64()),
			c:        math.Pow(10, -10+5*rng.Float64()),
			parallel: rng.IntN(2) == 1,
		}
		f0, q, f1, f2 := rc.closed()
		if q < 0.75 || q > 1e4 {
			continue // a wide band runs off any sweep; a Q above 1e4 is beyond the parts
		}
		n := 5 + rng.IntN(200)
		lo, hi := f1/(2+8*rng.Float64()), f2*(2+8*rng.Float64())
		log := rng.IntN(2) == 1
		rc.name = fmt.Sprintf("case %d: R %.4g L %.4g C %.4g parallel %v, %d points log %v", i, rc.r, rc.l, rc.c, rc.parallel, n, log)
		pts, err := Points(lo, hi, n, log)
		if err != nil {
			t.Fatal(err)
		}
		tab, err := Run(pts, rc.eval)
		if err != nil {
			t.Fatal(err)
		}
		fd := Find(tab, rc.eval)
		if len(fd.Bands) != 1 {
			t.Errorf("%s: %d bands, want 1", rc.name, len(fd.Bands))
			continue
		}
		b := fd.Bands[0]
		if b.Narrow || !b.HasF1 || !b.HasF2 {
			t.Errorf("%s: band %+v not located", rc.name, b)
			continue
		}
		if !(b.F1 < f0 && f0 < b.F2) {
			t.Errorf("%s: f1 %v, f0 %v, f2 %v out of order", rc.name, b.F1, f0, b.F2)
		}
		if !relClose(b.F1, f1, 1e-9) || !relClose(b.F2, f2, 1e-9) {
			t.Errorf("%s: band %v … %v Hz, want %v … %v", rc.name, b.F1, b.F2, f1, f2)
		}
		if bw, _ := b.Bandwidth(); !relClose(b.Centre/bw, q, 1e-6) {
			t.Errorf("%s: Q %v, want %v", rc.name, b.Centre/bw, q)
		}
	}
}
