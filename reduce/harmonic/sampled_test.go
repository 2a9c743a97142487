package harmonic

import (
	"math"
	"math/cmplx"
	"math/rand"
	"testing"

	"argand/calc"
)

// The checks in this file compare every result with an independent
// computation from the waveform itself: the test synthesises x(t) from
// its own list of orders, samples it at perPeriod points per period and
// computes RMS values, powers and distortion from the samples alone. A
// trigonometric polynomial of degree below perPeriod/2 is integrated
// exactly by the mean of equally spaced samples, so these agree with the
// closed forms to rounding; the tolerance is 1e-9 relative.

const (
	perPeriod = 10000
	tol       = 1e-9
)

// order is one harmonic as the tests write it: RMS value and angle in
// degrees of cos(h·ωt + φ).
type order struct {
	h   int
	rms float64
	deg float64
}

// synth evaluates x(θ) = Σ √2·X_h·cos(h·θ + φ_h) from the test's orders.
func synth(os []order, t float64) float64 {
	x := 0.0
	for _, o := range os {
		x += math.Sqrt2 * o.rms * math.Cos(float64(o.h)*t+o.deg*math.Pi/180)
	}
	return x
}

func sample(os []order) []float64 {
	xs := make([]float64, perPeriod)
	for k := range xs {
		xs[k] = synth(os, 2*math.Pi*float64(k)/perPeriod)
	}
	return xs
}

// rmsOf is √(mean x²) of the samples.
func rmsOf(xs []float64) float64 {
	s := 0.0
	for _, x := range xs {
		s += x * x
	}
	return math.Sqrt(s / float64(len(xs)))
}

// component returns the RMS phasor of order h from the samples (a single
// bin of the discrete Fourier transform, cos reference).
func component(xs []float64, h int) complex128 {
	var s complex128
	for k, x := range xs {
		s += complex(x, 0) * cmplx.Rect(1, -2*math.Pi*float64(h*k)/float64(len(xs)))
	}
	return s * complex(math.Sqrt2/float64(len(xs)), 0)
}

func build(t *testing.T, dim calc.Dim, os []order) Spectrum {
	t.Helper()
	var es []Entry
	for _, o := range os {
		es = append(es, Entry{Order: o.h, Value: calc.Quantity{V: cmplx.Rect(o.rms, o.deg*math.Pi/180), Dim: dim}, HasAngle: true})
	}
	s, err := Build(es)
	if err != nil {
		t.Fatalf("Build: %v", err)
	}
	return s
}

func near(t *testing.T, what string, got, want, rel float64) {
	t.Helper()
	if math.IsNaN(got) || math.IsInf(got, 0) {
		t.Fatalf("%s: got %v", what, got)
	}
	d := math.Abs(got - want)
	if d > rel*math.Max(math.Abs(want), 1e-300) {
		t.Errorf("%s = %.15g, want %.15g (relative difference %.3g)", what, got, want, d/math.Abs(want))
	}
}

// cases are invented example waveforms: a rectifier-like current, a
// flat-topped voltage, a waveform with high orders and one with a single
// order.
var cases = map[string][]order{
	"rectifier current": {{1, 100, -20}, {3, 35, 60}, {5, 22, 170}, {7, 12, -40}, {9, 6, 80}, {11, 4, 100}},
	"flat-top voltage":  {{1, 230, 0}, {3, 5.75, 150}, {5, 6.9, -60}, {7, 3.45, 30}},
	"high orders":       {{1, 10, 5}, {13, 0.9, -75}, {23, 0.5, 33}, {37, 0.2, 120}, {49, 0.1, -170}},
	"sine":              {{1, 7.5, 40}},
}

func TestSampledRMSAndDistortion(t *testing.T) {
	for name, os := range cases {
		t.Run(name, func(t *testing.T) {
			s := build(t, calc.DimCurrent, os)
			xs := sample(os)
			rms := rmsOf(xs)
			x1 := cmplx.Abs(component(xs, 1))
			xh := math.Sqrt(math.Max(rms*rms-x1*x1, 0))
			near(t, "RMS", s.RMS(), rms, tol)
			near(t, "fundamental", s.Fundamental(), x1, tol)
			if len(os) > 1 {
				near(t, "harmonic RMS", s.HarmonicRMS(), xh, tol)
				near(t, "THD", s.THD(), xh/x1, tol)
				// TDD against an invented maximum demand current
				il := 1.5 * x1
				near(t, "TDD", s.HarmonicRMS()/il, xh/il, tol)
			} else if s.THD() != 0 {
				t.Errorf("THD of a sine = %g, want 0", s.THD())
			}
			// F_HL and K from the samples' own spectrum; the definitions are
			// those of IEEE Std C57.110 (F_HL, F_HL-STR with exponent 0.8)
			// and UL 1561 (K per unit of the rated current), from memory:
			// neither text was at hand
			var num, den, numStr float64
			for h := 1; h <= 60; h++ {
				m := cmplx.Abs(component(xs, h)) / x1
				if m < 1e-12 {
					continue
				}
				num += m * m * float64(h*h)
				numStr += m * m * math.Pow(float64(h), 0.8)
				den += m * m
			}
			near(t, "F_HL", s.FHL(), num/den, tol)
			near(t, "F_HL-STR", s.FHLStray(), numStr/den, tol)
			ir := 1.2 * x1
			near(t, "K", s.KFactor(ir), num*x1*x1/(ir*ir), tol)
			// the relation K = F_HL·(I/I_R)² (UL 1561 and IEEE Std C57.110
			// definitions, from memory)
			near(t, "K = F_HL·(I/I_R)²", s.KFactor(ir), s.FHL()*(rms/ir)*(rms/ir), tol)
			near(t, "K at I_R = I equals F_HL", s.KFactor(s.RMS()), s.FHL(), tol)
		})
	}
}

// peakOf finds max |x| from the samples, then refines the best sample by
// golden-section search on the synthesised waveform within one sample
// either side (a different algorithm from the package's Newton steps).
func peakOf(os []order, xs []float64) float64 {
	best := 0
	for k, x := range xs {
		if math.Abs(x) > math.Abs(xs[best]) {
			best = k
		}
	}
	step := 2 * math.Pi / float64(len(xs))
	a, b := float64(best-1)*step, float64(best+1)*step
	f := func(t float64) float64 { return -math.Abs(synth(os, t)) }
	g := (math.Sqrt(5) - 1) / 2
	c, d := b-g*(b-a), a+g*(b-a)
	for i := 0; i < 200 && b-a > 1e-15; i++ {
		if f(c) < f(d) {
			b, d = d, c
			c = b - g*(b-a)
		} else {
			a, c = c, d
			d = a + g*(b-a)
		}
	}
	return math.Abs(synth(os, 0.5*(a+b)))
}

// meanAbs integrates |x| over a period from the samples: a sign change
// between two samples brackets a zero, found by bisection on the
// synthesised waveform; each piece between samples and zeros is
// integrated by 5-point Gauss–Legendre on the synthesised waveform.
func meanAbs(os []order, xs []float64) float64 {
	gx := []float64{0, -0.5384693101056831, 0.5384693101056831, -0.9061798459386640, 0.9061798459386640}
	gw := []float64{0.5688888888888889, 0.4786286704993665, 0.4786286704993665, 0.2369268850561891, 0.2369268850561891}
	gauss := func(a, b float64) float64 {
		m, r := 0.5*(a+b), 0.5*(b-a)
		s := 0.0
		for i := range gx {
			s += gw[i] * math.Abs(synth(os, m+r*gx[i]))
		}
		return s * r
	}
	n := len(xs)
	step := 2 * math.Pi / float64(n)
	sum := 0.0
	for k := 0; k < n; k++ {
		a, b := float64(k)*step, float64(k+1)*step
		xa, xb := xs[k], synth(os, b)
		if (xa > 0) != (xb > 0) && xa != 0 && xb != 0 {
			lo, hi := a, b
			for i := 0; i < 100; i++ {
				mid := 0.5 * (lo + hi)
				if (synth(os, mid) > 0) == (xa > 0) {
					lo = mid
				} else {
					hi = mid
				}
			}
			z := 0.5 * (lo + hi)
			sum += gauss(a, z) + gauss(z, b)
		} else {
			sum += gauss(a, b)
		}
	}
	return sum / (2 * math.Pi)
}

func TestSampledCrestAndMeter(t *testing.T) {
	for name, os := range cases {
		t.Run(name, func(t *testing.T) {
			s := build(t, calc.DimVoltage, os)
			xs := sample(os)
			w := s.wave()
			near(t, "peak", w.Peak(), peakOf(os, xs), tol)
			avg := meanAbs(os, xs)
			near(t, "rectified average", w.RectifiedAverage(), avg, tol)
			near(t, "meter reading", SineFormFactor*w.RectifiedAverage(), math.Pi/(2*math.Sqrt2)*avg, tol)
		})
	}
}

// TestRandomSpectra repeats the sampled checks on random spectra (fixed
// seed) up to order 40.
func TestRandomSpectra(t *testing.T) {
	rng := rand.New(rand.NewSource(16))
	for n := 0; n < 12; n++ {
		os := []order{{1, 1 + 100*rng.Float64(), 360*rng.Float64() - 180}}
		for h := 2; h <= 40; h++ {
			if rng.Float64() < 0.3 {
				os = append(os, order{h, os[0].rms * 0.3 * rng.Float64(), 360*rng.Float64() - 180})
			}
		}
		s := build(t, calc.DimCurrent, os)
		xs := sample(os)
		near(t, "RMS", s.RMS(), rmsOf(xs), tol)
		near(t, "peak", s.wave().Peak(), peakOf(os, xs), tol)
		near(t, "rectified average", s.wave().RectifiedAverage(), meanAbs(os, xs), tol)
	}
}

// TestClosedForms checks cases with a known answer.
func TestClosedForms(t *testing.T) {
	// a sine: crest factor √2 and form factor π/(2√2), so an
	// average-responding meter reads the RMS exactly (common practice)
	s := build(t, calc.DimVoltage, []order{{1, 230, 0}})
	near(t, "sine crest factor", s.wave().Peak()/s.RMS(), math.Sqrt2, 1e-12)
	near(t, "sine meter reading", SineFormFactor*s.wave().RectifiedAverage(), 230, 1e-12)
	near(t, "sine form factor", SineFormFactor, 1.1107207345395915, 1e-15)

	// sin θ + (1/6)·sin 3θ peaks at θ = 60° with √3/2 (flat top), and
	// sin θ − (1/6)·sin 3θ at θ = 90° with 7/6 (peaked): x' = 0 gives
	// cos²θ = (9a − 1)/(12a) for the first (worked by hand beside this
	// test). sin(hθ) is cos(hθ − 90°).
	a := 1 / 6.0
	flat := build(t, calc.DimVoltage, []order{{1, 1 / math.Sqrt2, -90}, {3, a / math.Sqrt2, -90}})
	near(t, "flat-top peak", flat.wave().Peak(), math.Sqrt(3)/2, 1e-12)
	peaked := build(t, calc.DimVoltage, []order{{1, 1 / math.Sqrt2, -90}, {3, a / math.Sqrt2, 90}})
	near(t, "peaked peak", peaked.wave().Peak(), 7.0/6, 1e-12)

	// an ideal six-pulse converter current with I_h = I_1/h at h = 6k ± 1
	// (common practice): F_HL = (number of orders) / Σ 1/h²
	var os []order
	cnt, inv := 0.0, 0.0
	for h := 1; h <= 49; h++ {
		if h == 1 || h%6 == 1 || h%6 == 5 {
			os = append(os, order{h, 100 / float64(h), 0})
			cnt++
			inv += 1 / float64(h*h)
		}
	}
	six := build(t, calc.DimCurrent, os)
	near(t, "six-pulse F_HL", six.FHL(), cnt/inv, 1e-12)

	// a triangle wave: Σ cos(h·θ)/h² over odd orders, form factor 2/√3
	// and crest factor √3, so the meter reads (π/(2√2))/(2/√3) ≈ 0.9619
	// of the RMS (common practice); the spectrum stops at order 99, which
	// leaves a truncation error near 1e-6
	os = nil
	for h := 1; h <= 99; h += 2 {
		os = append(os, order{h, 1 / float64(h*h), 0})
	}
	tri := build(t, calc.DimVoltage, os)
	w := tri.wave()
	near(t, "triangle form factor", tri.RMS()/w.RectifiedAverage(), 2/math.Sqrt(3), 1e-5)
	// all orders peak together at θ = 0, so the truncated series' peak is
	// √2·Σ 1/h² exactly (its limit, π²/8·√2, converges slowly)
	sum := 0.0
	for _, o := range os {
		sum += o.rms
	}
	near(t, "triangle peak", w.Peak(), math.Sqrt2*sum, 1e-12)
}

func TestPowersSampled(t *testing.T) {
	pairs := []struct {
		name string
		v, i []order
	}{
		{"distorted bus and rectifier load", cases["flat-top voltage"], cases["rectifier current"]},
		{"harmonic in one only", []order{{1, 400, 0}, {5, 12, 40}}, []order{{1, 80, -30}, {7, 9, 100}, {11, 5, -20}}},
		{"shared orders", []order{{1, 230, 0}, {3, 9, 20}, {5, 7, -110}}, []order{{1, 40, -10}, {3, 14, -160}, {5, 9, 30}}},
	}
	for _, c := range pairs {
		t.Run(c.name, func(t *testing.T) {
			v := build(t, calc.DimVoltage, c.v)
			i := build(t, calc.DimCurrent, c.i)
			p, err := PowersOf(v, i)
			if err != nil {
				t.Fatal(err)
			}
			vs, is := sample(c.v), sample(c.i)
			var pSum float64
			for k := range vs {
				pSum += vs[k] * is[k]
			}
			P := pSum / perPeriod
			V, I := rmsOf(vs), rmsOf(is)
			V1, I1 := component(vs, 1), component(is, 1)
			S1c := V1 * cmplx.Conj(I1)
			S := V * I
			VH := math.Sqrt(V*V - cmplx.Abs(V1)*cmplx.Abs(V1))
			IH := math.Sqrt(I*I - cmplx.Abs(I1)*cmplx.Abs(I1))
			SH := VH * IH
			PH := P - real(S1c)
			near(t, "S", p.S, S, tol)
			near(t, "P", p.P, P, tol)
			near(t, "P1", p.P1, real(S1c), tol)
			near(t, "Q1", p.Q1, imag(S1c), tol)
			near(t, "S1", p.S1, cmplx.Abs(S1c), tol)
			near(t, "N", p.N, math.Sqrt(S*S-P*P), tol)
			near(t, "SN", p.SN, math.Sqrt(S*S-cmplx.Abs(S1c)*cmplx.Abs(S1c)), tol)
			near(t, "DI", p.DI, cmplx.Abs(V1)*IH, tol)
			near(t, "DV", p.DV, VH*cmplx.Abs(I1), tol)
			near(t, "SH", p.SH, SH, tol)
			if math.Abs(PH) > 1e-9*S {
				near(t, "PH", p.PH, PH, 1e-6) // a small difference of large sums
			}
			near(t, "DH", p.DH, math.Sqrt(SH*SH-PH*PH), tol)
			near(t, "PF", p.PF, P/S, tol)
			near(t, "PF1", p.PF1, real(S1c)/cmplx.Abs(S1c), tol)
			// IEEE Std 1459-2010 decomposition (from memory):
			// S² = S1² + SN², SN² = DI² + DV² + SH², S² = P² + N²
			near(t, "S² = P² + N²", p.S*p.S, p.P*p.P+p.N*p.N, tol)
			near(t, "SN² = DI² + DV² + SH²", p.SN*p.SN, p.DI*p.DI+p.DV*p.DV+p.SH*p.SH, tol)
		})
	}
}

// TestPowersSinusoidal checks that for sinusoids the quantities reduce to
// P, Q and S: Kuphaldt, Lessons In Electric Circuits Vol. II, 6th ed.,
// §11.3: 120 V, 60 Hz across 60 Ω in series with 160 mH prints P =
// 119.365 W, Q = 119.998 var, S = 169.256 VA, PF = 0.705.
func TestPowersSinusoidal(t *testing.T) {
	z := complex(60, 2*math.Pi*60*0.160)
	i := complex(120, 0) / z
	v := build(t, calc.DimVoltage, []order{{1, 120, 0}})
	cur := build(t, calc.DimCurrent, []order{{1, cmplx.Abs(i), cmplx.Phase(i) * 180 / math.Pi}})
	p, err := PowersOf(v, cur)
	if err != nil {
		t.Fatal(err)
	}
	near(t, "P", p.P, 119.365, 0.0005/119.365)
	near(t, "Q1", p.Q1, 119.998, 0.0005/119.998)
	near(t, "N (= Q for a sinusoid)", p.N, 119.998, 0.0005/119.998)
	near(t, "S", p.S, 169.256, 0.0005/169.256)
	near(t, "PF", p.PF, 0.705, 0.0005/0.705)
	if p.DI != 0 || p.DV != 0 || p.SH != 0 || p.DH != 0 {
		t.Errorf("distortion powers of sinusoids: DI %g DV %g SH %g DH %g, want 0", p.DI, p.DV, p.SH, p.DH)
	}
	near(t, "PF = PF1", p.PF, p.PF1, 1e-15)
}
