package sweep

import (
	"errors"
	"fmt"
	"math"
	"math/cmplx"
	"strings"
	"testing"

	"argand/calc"
)

func ohm(v complex128) calc.Quantity { return calc.Q(v, calc.DimImpedance) }
func henry(x float64) calc.Quantity  { return calc.Real(x, calc.DimInductance) }
func farad(x float64) calc.Quantity  { return calc.Real(x, calc.DimCapacitance) }
func volt(v complex128) calc.Quantity {
	return calc.Q(v, calc.DimVoltage)
}

func relClose(a, b, tol float64) bool {
	return math.Abs(a-b) <= tol*math.Max(math.Abs(a), math.Abs(b))
}

func TestPoints(t *testing.T) {
	tests := []struct {
		start, stop float64
		n           int
		log         bool
		want        []float64
	}{
		{0, 100, 5, false, []float64{0, 25, 50, 75, 100}},
		{10, 10000, 4, true, []float64{10, 100, 1000, 10000}},
		{50, 50, 1, false, []float64{50}},
		{1, 2, 2, true, []float64{1, 2}},
	}
	for _, tt := range tests {
		got, err := Points(tt.start, tt.stop, tt.n, tt.log)
		if err != nil {
			t.Fatalf("Points(%v, %v, %d, %v): %v", tt.start, tt.stop, tt.n, tt.log, err)
		}
		if len(got) != len(tt.want) {
			t.Fatalf("Points: %d points, want %d", len(got), len(tt.want))
		}
		for k := range got {
			if !relClose(got[k], tt.want[k], 1e-12) {
				t.Errorf("Points(%v, %v, %d, %v)[%d] = %v, want %v", tt.start, tt.stop, tt.n, tt.log, k, got[k], tt.want[k])
			}
		}
	}
	bad := []struct {
		start, stop float64
		n           int
		log         bool
	}{
		{0, 100, 10, true},
		{-1, 100, 10, false},
		{100, 10, 10, false},
		{1, 100, 0, false},
		{1, 100, MaxPoints + 1, false},
		{math.NaN(), 100, 10, false},
		{1, math.Inf(1), 10, true},
		{1, 1 + 1e-15, 1000, false},
	}
	for _, b := range bad {
		if _, err := Points(b.start, b.stop, b.n, b.log); err == nil {
			t.Errorf("Points(%v, %v, %d, %v): no error", b.start, b.stop, b.n, b.log)
		}
	}
}

// seriesZ is the impedance of a series RLC circuit, Z = R + jωL + 1/(jωC),
// written out directly (not through the package under test).
func seriesZ(r, l, c, f float64) complex128 {
	w := 2 * math.Pi * f
	return complex(r, w*l-1/(w*c))
}

// parallelZ is the impedance of R, L and C in parallel.
func parallelZ(r, l, c, f float64) complex128 {
	w := 2 * math.Pi * f
	return 1 / complex(1/r, w*c-1/(w*l))
}

// bisect finds a root of g between a and b (g(a), g(b) of opposite sign).
func bisect(g func(float64) float64, a, b float64) float64 {
	ga := g(a)
	for i := 0; i < 200 && b-a > 1e-13*b; i++ {
		m := (a + b) / 2
		if gm := g(m); (gm < 0) == (ga < 0) {
			a, ga = m, gm
		} else {
			b = m
		}
	}
	return (a + b) / 2
}

// Resonance, Q and bandwidth of a series RLC circuit against a dense swept
// solution of the same circuit: the minimum of |Z| and the points where
// |Z| = √2·R (the current is 3 dB below its peak) found on a grid of
// 100 000 points agree with f0 = 1/(2π√(LC)), Q = (1/R)√(L/C) and
// B = f0/Q (common practice) within the grid step; refining the crossings
// by bisection agrees with the half-power frequencies to 1e-9.
func TestSeriesRLCAgainstSweep(t *testing.T) {
	tests := []struct{ r, l, c float64 }{
		{10, 10e-3, 1e-6}, // Q = 10
		{50, 0.1, 10e-9},  // Q ≈ 63
		{2, 1e-6, 1e-9},   // Q ≈ 15.8, 5 MHz
		{100, 1e-3, 1e-6}, // Q ≈ 0.316, a wide band
	}
	for _, tt := range tests {
		f0q, _, _, err := Resonance(henry(tt.l), farad(tt.c))
		if err != nil {
			t.Fatal(err)
		}
		qq, _, err := SeriesQ(ohm(complex(tt.r, 0)), henry(tt.l), farad(tt.c))
		if err != nil {
			t.Fatal(err)
		}
		band, _, err := Bandwidth(f0q, qq)
		if err != nil {
			t.Fatal(err)
		}
		f0, q, bw := real(f0q.V), real(qq.V), real(band.B.V)
		lo, hi := real(band.F1.V)/2, real(band.F2.V)*2
		pts, err := Points(lo, hi, MaxPoints, false)
		if err != nil {
			t.Fatal(err)
		}
		step := pts[1] - pts[0]
		tab, err := Run(pts, func(f float64) (calc.Quantity, error) {
			return ohm(seriesZ(tt.r, tt.l, tt.c, f)), nil
		})
		if err != nil {
			t.Fatal(err)
		}
		imin := 0
		for k, p := range tab.Points {
			if p.Value.Mag() < tab.Points[imin].Value.Mag() {
				imin = k
			}
		}
		if d := math.Abs(pts[imin] - f0); d > step {
			t.Errorf("R=%v L=%v C=%v: |Z| minimum at %v Hz, f0 = %v Hz (grid step %v)", tt.r, tt.l, tt.c, pts[imin], f0, step)
		}
		edge := math.Sqrt2 * tt.r
		var f1, f2 float64
		for k := 1; k < len(pts); k++ {
			a, b := tab.Points[k-1].Value.Mag(), tab.Points[k].Value.Mag()
			if a > edge && b <= edge {
				f1 = pts[k]
			}
			if a <= edge && b > edge {
				f2 = pts[k]
			}
		}
		if math.Abs(f1-real(band.F1.V)) > step || math.Abs(f2-real(band.F2.V)) > step {
			t.Errorf("R=%v: grid −3 dB points %v, %v Hz; formula %v, %v Hz", tt.r, f1, f2, real(band.F1.V), real(band.F2.V))
		}
		if math.Abs((f2-f1)-bw) > 2*step {
			t.Errorf("R=%v: grid bandwidth %v Hz, B = f0/Q = %v Hz", tt.r, f2-f1, bw)
		}
		if qg := f0 / (f2 - f1); math.Abs(qg-q) > q*2*step/bw {
			t.Errorf("R=%v: grid Q %v, formula %v", tt.r, qg, q)
		}
		g := func(f float64) float64 { return cmplx.Abs(seriesZ(tt.r, tt.l, tt.c, f)) - edge }
		if r1 := bisect(g, f1-step, f1); !relClose(r1, real(band.F1.V), 1e-9) {
			t.Errorf("R=%v: refined f1 %v, formula %v", tt.r, r1, real(band.F1.V))
		}
		if r2 := bisect(g, f2-step, f2); !relClose(r2, real(band.F2.V), 1e-9) {
			t.Errorf("R=%v: refined f2 %v, formula %v", tt.r, r2, real(band.F2.V))
		}
	}
}

// A hand-checkable resonance: L = 10 mH, C = 1 µF gives ω0 = 10⁴ rad/s
// and f0 = 10⁴/(2π) Hz; with R = 10 Ω, Q = 10 and B = f0/10 (common
// practice formulas).
func TestResonanceHandChecked(t *testing.T) {
	f0, w0, steps, err := Resonance(henry(10e-3), farad(1e-6))
	if err != nil || len(steps) != 1 {
		t.Fatal(err)
	}
	if !relClose(real(w0.V), 1e4, 1e-12) || !relClose(real(f0.V), 1e4/(2*math.Pi), 1e-12) {
		t.Errorf("f0, ω0 = %v, %v", f0.V, w0.V)
	}
	if f0.Dim != calc.DimFrequency || w0.Dim != calc.DimAngularFrequency {
		t.Errorf("dims %v %v", f0.Dim, w0.Dim)
	}
	q, _, _ := SeriesQ(ohm(10), henry(10e-3), farad(1e-6))
	if !relClose(real(q.V), 10, 1e-12) {
		t.Errorf("series Q = %v, want 10", q.V)
	}
	// parallel Q of the same parts with R = 1 kΩ: R·√(C/L) = 1000·0.01 = 10
	q, _, _ = ParallelQ(ohm(1000), henry(10e-3), farad(1e-6))
	if !relClose(real(q.V), 10, 1e-12) {
		t.Errorf("parallel Q = %v, want 10", q.V)
	}
	// bandwidth of a resonance given in rad/s stays in rad/s
	b, _, _ := Bandwidth(w0, num(10))
	if b.B.Dim != calc.DimAngularFrequency || !relClose(real(b.B.V), 1e3, 1e-12) {
		t.Errorf("bandwidth in rad/s = %v", b.B)
	}
	if !relClose(real(b.F1.V)*real(b.F2.V), 1e8, 1e-12) {
		t.Errorf("f1·f2 = %v, want ω0² = 1e8", real(b.F1.V)*real(b.F2.V))
	}
}

// Parallel RLC against a dense sweep: the maximum of |Z| sits at f0 and
// |Z| = R/√2 at the half-power frequencies of B = f0/Q with
// Q = R·√(C/L) (common practice).
func TestParallelRLCAgainstSweep(t *testing.T) {
	r, l, c := 5e3, 1e-3, 100e-9
	f0q, _, _, _ := Resonance(henry(l), farad(c))
	qq, _, err := ParallelQ(ohm(complex(r, 0)), henry(l), farad(c))
	if err != nil {
		t.Fatal(err)
	}
	band, _, _ := Bandwidth(f0q, qq)
	pts, _ := Points(real(band.F1.V)/2, real(band.F2.V)*2, MaxPoints, true)
	tab, err := Run(pts, func(f float64) (calc.Quantity, error) { return ohm(parallelZ(r, l, c, f)), nil })
	if err != nil {
		t.Fatal(err)
	}
	if !tab.Log {
		t.Error("log-spaced points not detected")
	}
	imax := 0
	for k, p := range tab.Points {
		if p.Value.Mag() > tab.Points[imax].Value.Mag() {
			imax = k
		}
	}
	ratio := pts[1] / pts[0] // the grid step on a log axis
	f0 := real(f0q.V)
	if pts[imax] > f0*ratio || pts[imax] < f0/ratio {
		t.Errorf("|Z| maximum at %v Hz, f0 = %v Hz", pts[imax], f0)
	}
	g := func(f float64) float64 { return cmplx.Abs(parallelZ(r, l, c, f)) - r/math.Sqrt2 }
	if f1 := bisect(g, real(band.F1.V)/1.5, f0); !relClose(f1, real(band.F1.V), 1e-9) {
		t.Errorf("f1 = %v, formula %v", f1, real(band.F1.V))
	}
	if f2 := bisect(g, f0, real(band.F2.V)*1.5); !relClose(f2, real(band.F2.V), 1e-9) {
		t.Errorf("f2 = %v, formula %v", f2, real(band.F2.V))
	}
}

// The unity-power-factor frequency of a tank whose inductor has series
// resistance r, f0·√(1 − r²C/L) (common practice), against the zero of the
// imaginary part of its impedance found by bisection, and the impedance
// there against L/(r·C) (common practice).
func TestTank(t *testing.T) {
	tests := []struct{ l, r, c float64 }{
		{10e-3, 20, 1e-6},
		{1e-3, 1, 100e-9},
		{1e-6, 0.05, 1e-9},
	}
	for _, tt := range tests {
		tk, steps, err := SolveTank(henry(tt.l), ohm(complex(tt.r, 0)), farad(tt.c))
		if err != nil || !tk.HasUnity || !tk.HasDynamic || len(steps) != 1 {
			t.Fatalf("%v: %v %v", tt, tk, err)
		}
		z := func(f float64) complex128 {
			w := 2 * math.Pi * f
			zl := complex(tt.r, w*tt.l)
			zc := 1 / complex(0, w*tt.c)
			return zl * zc / (zl + zc)
		}
		f0 := real(tk.F0.V)
		fu := bisect(func(f float64) float64 { return imag(z(f)) }, f0/2, f0*0.999999999999)
		if !relClose(fu, real(tk.Unity.V), 1e-9) {
			t.Errorf("%v: Im Z = 0 at %v Hz, formula %v Hz", tt, fu, real(tk.Unity.V))
		}
		if !relClose(real(z(fu)), real(tk.Dynamic.V), 1e-8) {
			t.Errorf("%v: Z there %v, L/(rC) = %v", tt, z(fu), tk.Dynamic.V)
		}
		if real(tk.Unity.V) >= f0 {
			t.Errorf("%v: unity-PF frequency %v not below f0 %v", tt, tk.Unity.V, f0)
		}
	}
	// r²C/L = 100²·1e-6/1e-3 = 10 ≥ 1: no unity-PF frequency
	tk, steps, err := SolveTank(henry(1e-3), ohm(100), farad(1e-6))
	if err != nil || tk.HasUnity || len(steps[0].Notes) == 0 || !strings.Contains(steps[0].Notes[0], "no frequency") {
		t.Errorf("lossy tank: %v %v %v", tk, steps, err)
	}
	// r = 0: unity at f0, impedance unbounded
	tk, _, err = SolveTank(henry(1e-3), ohm(0), farad(1e-6))
	if err != nil || !tk.HasUnity || tk.HasDynamic || tk.Unity.V != tk.F0.V {
		t.Errorf("lossless tank: %v %v", tk, err)
	}
}

func TestRLCErrors(t *testing.T) {
	if _, _, _, err := Resonance(farad(1), farad(1)); err == nil {
		t.Error("Resonance(F, F): no error")
	}
	if _, _, _, err := Resonance(henry(0), farad(1)); err == nil {
		t.Error("Resonance(L = 0): no error")
	}
	if _, _, _, err := Resonance(henry(-1), farad(1)); err == nil {
		t.Error("Resonance(L < 0): no error")
	}
	if _, _, _, err := Resonance(henry(math.Inf(1)), farad(1)); err == nil {
		t.Error("Resonance(L = Inf): no error")
	}
	if _, _, err := SeriesQ(ohm(0), henry(1), farad(1)); err == nil {
		t.Error("SeriesQ(R = 0): no error")
	}
	if _, _, err := Bandwidth(calc.Real(1, calc.DimTime), num(1)); err == nil {
		t.Error("Bandwidth of a time: no error")
	}
	if _, _, err := Bandwidth(calc.Real(1e3, calc.DimFrequency), num(0)); err == nil {
		t.Error("Bandwidth(Q = 0): no error")
	}
	if _, _, err := SolveTank(henry(1), ohm(-1), farad(1)); err == nil {
		t.Error("SolveTank(r < 0): no error")
	}
	// the underflowing product must not give an infinite frequency
	if _, _, _, err := Resonance(henry(1e-300), farad(1e-300)); err == nil {
		t.Error("Resonance(1e-300, 1e-300): no error")
	}
}

// Gain in dB, 20·log10|H| (common practice): a ratio of 10 is 20 dB, 1/√2
// is −3.0103 dB; a zero output has no dB value.
func TestGain(t *testing.T) {
	tests := []struct {
		h    complex128
		want float64
	}{
		{10, 20},
		{complex(0, 0.1), -20},
		{complex(1/math.Sqrt2, 0), -3.0102999566398120},
		{1, 0},
	}
	for _, tt := range tests {
		g, _, err := Gain(calc.Number(tt.h))
		if err != nil || math.Abs(real(g.V)-tt.want) > 1e-9 {
			t.Errorf("Gain(%v) = %v, %v; want %v", tt.h, g.V, err, tt.want)
		}
	}
	if _, _, err := Gain(num(0)); err == nil || !strings.Contains(err.Error(), "output is zero") {
		t.Errorf("Gain(0): %v", err)
	}
	if _, _, err := Gain(volt(1)); err == nil {
		t.Error("Gain(1 V): no error")
	}
	tr, steps, err := Ratio(volt(complex(0, 5)), volt(10))
	if err != nil || !tr.HasDB || math.Abs(real(tr.DB.V)+6.0205999132796239) > 1e-9 || tr.H.V != complex(0, 0.5) {
		t.Errorf("Ratio(j5, 10) = %v, %v", tr, err)
	}
	if len(steps) != 1 {
		t.Errorf("Ratio: %d steps", len(steps))
	}
	tr, steps, err = Ratio(volt(0), volt(10))
	if err != nil || tr.HasDB || len(steps[0].Notes) == 0 {
		t.Errorf("Ratio(0, 10) = %v, %v; want no dB and a note", tr, err)
	}
	if _, _, err := Ratio(volt(1), volt(0)); err == nil {
		t.Error("Ratio(1, 0): no error")
	}
	if _, _, err := Ratio(volt(1), calc.Real(1, calc.DimCurrent)); err == nil {
		t.Error("Ratio(V, A): no error")
	}
}

// A point exactly at resonance is recorded with a mark, not an error: the
// lossless parallel LC (L = 1 H, C = 1 F, ω0 = 1 rad/s) is an open
// circuit at f0, and a division by zero is marked as a short.
func TestRunMarksResonance(t *testing.T) {
	f0, _, _, _ := Resonance(henry(1), farad(1))
	pts := []float64{0.1, real(f0.V), 0.3}
	tab, err := Run(pts, func(f float64) (calc.Quantity, error) {
		w := 2 * math.Pi * f
		return calc.Parallel(ohm(complex(0, w)), ohm(complex(0, -1/w)))
	})
	if err != nil {
		t.Fatal(err)
	}
	if tab.Points[1].Mark != Open || tab.Points[0].Mark != "" || tab.Points[2].Mark != "" {
		t.Errorf("marks %q %q %q", tab.Points[0].Mark, tab.Points[1].Mark, tab.Points[2].Mark)
	}
	if tab.Dim != calc.DimImpedance || tab.Points[1].Value.Dim != calc.DimImpedance || tab.Points[1].Value.V != 0 {
		t.Errorf("table dim %v, marked value %v", tab.Dim, tab.Points[1].Value)
	}

	tab, err = Run([]float64{1, 2, 3}, func(f float64) (calc.Quantity, error) {
		if f == 2 {
			return calc.Div(volt(1), ohm(0))
		}
		if f == 3 {
			return calc.Quantity{}, fmt.Errorf("wrapped: %w", ErrShort)
		}
		return calc.Div(volt(1), ohm(complex(f, 0)))
	})
	if err != nil {
		t.Fatal(err)
	}
	if tab.Points[1].Mark != Short || tab.Points[2].Mark != Short {
		t.Errorf("marks %q %q, want short", tab.Points[1].Mark, tab.Points[2].Mark)
	}
	st := tab.Step("sweep I")
	if len(st.Rows) != 3 || len(st.Notes) != 2 {
		t.Errorf("step: %d rows, %d notes", len(st.Rows), len(st.Notes))
	}
	if s := tab.Text(calc.Format{}, true); !strings.Contains(s, "(short)") {
		t.Errorf("text lacks the mark:\n%s", s)
	}
}

func TestRunErrors(t *testing.T) {
	ok := func(f float64) (calc.Quantity, error) { return volt(1), nil }
	if _, err := Run(nil, ok); err == nil {
		t.Error("no points: no error")
	}
	if _, err := Run([]float64{1, 1}, ok); err == nil {
		t.Error("repeated point: no error")
	}
	if _, err := Run([]float64{1, math.NaN()}, ok); err == nil {
		t.Error("NaN point: no error")
	}
	if _, err := Run(make([]float64, MaxPoints+1), ok); err == nil {
		t.Error("too many points: no error")
	}
	other := errors.New("unknown name x")
	_, err := Run([]float64{1, 2}, func(f float64) (calc.Quantity, error) { return calc.Quantity{}, other })
	if !errors.Is(err, other) || !strings.Contains(err.Error(), "Hz") {
		t.Errorf("other error: %v", err)
	}
	_, err = Run([]float64{1, 2}, func(f float64) (calc.Quantity, error) {
		if f == 1 {
			return volt(1), nil
		}
		return ohm(1), nil
	})
	if err == nil {
		t.Error("unit change: no error")
	}
	tab, err := Run([]float64{1}, func(f float64) (calc.Quantity, error) { return volt(complex(math.Inf(1), 0)), nil })
	if err != nil || tab.Points[0].Mark != Undefined {
		t.Errorf("infinite value: %v, %v", tab, err)
	}
}

func sweepSeries(t testing.TB, n int, log bool) *Table {
	pts, err := Points(100, 10e3, n, log)
	if err != nil {
		t.Fatal(err)
	}
	tab, err := Run(pts, func(f float64) (calc.Quantity, error) {
		return calc.Q(10/seriesZ(10, 10e-3, 1e-6, f), calc.Dimensionless), nil
	})
	if err != nil {
		t.Fatal(err)
	}
	return tab
}

func TestPlot(t *testing.T) {
	tests := []struct {
		n, width, height int
		log, dB, ascii   bool
	}{
		{200, 72, 12, true, true, true},
		{200, 72, 12, true, false, false},
		{7, 50, 6, false, true, true},
		{1, 40, 5, false, false, true},
		{1000, 2000, 1000, true, true, false}, // clamped
		{50, 0, 0, false, false, true},        // clamped
	}
	for _, tt := range tests {
		tab := sweepSeries(t, tt.n, tt.log)
		out := Plot(tab, tt.width, tt.height, tt.dB, tt.ascii)
		for _, bad := range []string{"NaN", "Inf", "inf"} {
			if strings.Contains(out, bad) {
				t.Errorf("plot contains %q:\n%s", bad, out)
			}
		}
		if !strings.Contains(out, "Hz") || !strings.Contains(out, "*") {
			t.Errorf("plot lacks axis labels or curve:\n%s", out)
		}
		if tt.dB && !strings.Contains(out, "dB") {
			t.Errorf("dB plot lacks dB:\n%s", out)
		}
		w := clamp(tt.width, minWidth, maxWidth)
		for _, line := range strings.Split(out, "\n") {
			if n := len([]rune(line)); n > w+10 {
				t.Errorf("line of %d columns, width %d: %q", n, w, line)
			}
		}
		if tt.ascii {
			for i := 0; i < len(out); i++ {
				if out[i] >= 0x80 {
					t.Fatalf("ASCII plot has byte %#x:\n%s", out[i], out)
				}
			}
		} else if !strings.Contains(out, "°") {
			t.Errorf("plot lacks the degree sign:\n%s", out)
		}
	}
	// marked points and zero magnitudes are listed, never drawn as numbers
	tab, _ := Run([]float64{1, 2, 3, 4}, func(f float64) (calc.Quantity, error) {
		switch f {
		case 2:
			return calc.Quantity{}, calc.ErrOpenCircuit
		case 3:
			return calc.Number(0), nil
		}
		return calc.Number(complex(f, 1)), nil
	})
	out := Plot(tab, 60, 8, true, true)
	if !strings.Contains(out, "open circuit at 2 Hz") || !strings.Contains(out, "zero magnitude") {
		t.Errorf("marks not listed:\n%s", out)
	}
	if Plot(nil, 60, 8, false, true) == "" {
		t.Error("empty plot")
	}
}

func TestFuncs(t *testing.T) {
	fs := map[string]calc.Func{}
	for _, f := range Funcs() {
		if f.Doc == "" || f.Args == "" || f.Formula == "" || f.Call == nil {
			t.Errorf("%s: incomplete documentation", f.Name)
		}
		fs[f.Name] = f
	}
	a := func(q calc.Quantity) calc.Arg { return calc.Arg{Q: q, Text: "x"} }
	tests := []struct {
		name  string
		args  []calc.Arg
		want  float64
		extra []string
	}{
		{"resonance", []calc.Arg{a(henry(10e-3)), a(farad(1e-6))}, 1e4 / (2 * math.Pi), []string{"w0"}},
		{"qseries", []calc.Arg{a(ohm(10)), a(henry(10e-3)), a(farad(1e-6))}, 10, nil},
		{"qparallel", []calc.Arg{a(ohm(1000)), a(henry(10e-3)), a(farad(1e-6))}, 10, nil},
		{"bandwidth", []calc.Arg{a(calc.Real(1000, calc.DimFrequency)), a(num(10))}, 100, []string{"f1", "f2"}},
		{"tank", []calc.Arg{a(henry(1e-3)), a(ohm(0)), a(farad(1e-6))}, 1 / (2 * math.Pi * math.Sqrt(1e-9)), []string{"f0"}},
		{"db", []calc.Arg{a(num(100))}, 40, nil},
		{"transfer", []calc.Arg{a(volt(1)), a(volt(10))}, 0.1, []string{"db"}},
	}
	for _, tt := range tests {
		f := fs[tt.name]
		if len(tt.args) < f.Min || len(tt.args) > f.Max {
			t.Fatalf("%s: arg count", tt.name)
		}
		r, err := f.Call(&calc.Context{Freq: 50}, tt.args)
		if err != nil {
			t.Errorf("%s: %v", tt.name, err)
			continue
		}
		if !relClose(real(r.Value.V), tt.want, 1e-9) {
			t.Errorf("%s = %v, want %v", tt.name, r.Value.V, tt.want)
		}
		if len(r.Steps) == 0 {
			t.Errorf("%s: no steps", tt.name)
		}
		have := map[string]bool{}
		for _, e := range r.Extra {
			have[e.Name] = true
		}
		for _, e := range tt.extra {
			if !have[e] {
				t.Errorf("%s: no extra %q", tt.name, e)
			}
		}
	}
	if _, err := fs["tank"].Call(nil, []calc.Arg{a(henry(1e-3)), a(ohm(100)), a(farad(1e-6))}); err == nil ||
		!strings.Contains(err.Error(), "no unity-power-factor frequency") {
		t.Errorf("tank with r²C/L ≥ 1: %v", err)
	}
	if _, err := fs["db"].Call(nil, []calc.Arg{a(num(0))}); err == nil {
		t.Error("db(0): no error")
	}
	if _, err := fs["resonance"].Call(nil, []calc.Arg{{Word: "wye", Text: "wye"}, a(farad(1))}); err == nil {
		t.Error("resonance(word): no error")
	}
}

// BenchmarkSweep1000 sweeps the impedance of a series RLC circuit, built
// with package calc's checked arithmetic, over 1000 log-spaced points.
func BenchmarkSweep1000(b *testing.B) {
	pts, _ := Points(10, 100e3, 1000, true)
	r, l, c := ohm(10), henry(10e-3), farad(1e-6)
	eval := func(f float64) (calc.Quantity, error) {
		w := calc.Real(2*math.Pi*f, calc.DimAngularFrequency)
		j := calc.Number(1i)
		jw, _ := calc.Mul(j, w)
		zl, err := calc.Mul(jw, l)
		if err != nil {
			return calc.Quantity{}, err
		}
		yc, _ := calc.Mul(jw, c)
		zc, err := calc.Recip(yc)
		if err != nil {
			return calc.Quantity{}, err
		}
		s, _ := calc.Add(r, zl)
		return calc.Add(s, zc)
	}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := Run(pts, eval); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkPlot1000 draws a 1000-point sweep at 100 × 20 cells.
func BenchmarkPlot1000(b *testing.B) {
	tab := sweepSeries(b, 1000, true)
	b.ReportAllocs()
	for b.Loop() {
		_ = Plot(tab, 100, 20, true, true)
	}
}

// Step and function texts turn into pure ASCII for --ascii output.
func TestASCIIText(t *testing.T) {
	var steps []calc.Step
	_, _, s, _ := Resonance(henry(1e-3), farad(1e-6))
	steps = append(steps, s...)
	_, s, _ = SeriesQ(ohm(1), henry(1e-3), farad(1e-6))
	steps = append(steps, s...)
	_, s, _ = ParallelQ(ohm(1), henry(1e-3), farad(1e-6))
	steps = append(steps, s...)
	_, s, _ = Bandwidth(calc.Real(1e3, calc.DimFrequency), num(5))
	steps = append(steps, s...)
	for _, r := range []float64{0, 1, 100} {
		_, s, _ = SolveTank(henry(1e-3), ohm(complex(r, 0)), farad(1e-6))
		steps = append(steps, s...)
	}
	_, s, _ = Ratio(volt(0), volt(1))
	steps = append(steps, s...)
	_, s, _ = Gain(num(2))
	steps = append(steps, s...)
	steps = append(steps, sweepSeries(t, 5, true).Step("sweep"))
	for _, st := range steps {
		txt := st.Text(calc.Format{ASCII: true}, true)
		for i := 0; i < len(txt); i++ {
			if txt[i] >= 0x80 {
				t.Fatalf("non-ASCII byte %#x in\n%s", txt[i], txt)
			}
		}
	}
	for _, f := range Funcs() {
		a := calc.ASCIIText(f.Doc + f.Args + f.Formula)
		for i := 0; i < len(a); i++ {
			if a[i] >= 0x80 {
				t.Errorf("%s: non-ASCII after ASCIIText: %q", f.Name, a)
				break
			}
		}
	}
}

// Plot never panics or prints a non-number on extreme tables.
func TestPlotExtremes(t *testing.T) {
	tables := []*Table{
		{Points: []Point{{Freq: 1, Value: calc.Number(1e-300)}, {Freq: 2, Value: calc.Number(1e300)}}},
		{Points: []Point{{Freq: 0, Value: calc.Number(0)}, {Freq: 5, Value: calc.Number(0)}}, Log: true},
		{Points: []Point{{Freq: 3, Mark: Open}, {Freq: 4, Mark: Short}}},
		{Points: []Point{{Freq: math.NaN(), Value: calc.Number(1)}}},
		{Points: []Point{{Freq: 1, Value: calc.Number(-1)}, {Freq: 1e9, Value: calc.Number(complex(-1, -1e-20))}}, Log: true},
	}
	for i, tab := range tables {
		for _, dB := range []bool{false, true} {
			out := Plot(tab, 40, 5, dB, true)
			if strings.Contains(out, "NaN") || strings.Contains(out, "Inf") {
				t.Errorf("table %d: %s", i, out)
			}
		}
	}
}
