package harmonic

import (
	"math"
)

// SineFormFactor is the ratio of RMS to rectified average of a sinusoid,
// π/(2√2) ≈ 1.1107: an average-responding meter multiplies the rectified
// average it measures by this factor so that it reads the RMS of a sine
// (common practice).
const SineFormFactor = math.Pi / (2 * math.Sqrt2)

// wave is the waveform x(θ) = Σ a_h·cos(h·θ + φ_h), θ = ωt, with
// a_h = √2·X_h the peak of each order.
type wave struct {
	h   []float64
	a   []float64
	phi []float64
}

func (s Spectrum) wave() wave {
	var w wave
	for _, c := range s.Comps {
		if c.RMS == 0 {
			continue
		}
		w.h = append(w.h, float64(c.Order))
		w.a = append(w.a, math.Sqrt2*c.RMS)
		w.phi = append(w.phi, c.Angle)
	}
	return w
}

// at returns x(θ), x'(θ) and x”(θ).
func (w wave) at(t float64) (x, d1, d2 float64) {
	for k, h := range w.h {
		s, c := math.Sincos(h*t + w.phi[k])
		x += w.a[k] * c
		d1 -= h * w.a[k] * s
		d2 -= h * h * w.a[k] * c
	}
	return
}

// prim returns the antiderivative Σ (a_h/h)·sin(h·θ + φ_h).
func (w wave) prim(t float64) float64 {
	var f float64
	for k, h := range w.h {
		f += w.a[k] / h * math.Sin(h*t+w.phi[k])
	}
	return f
}

// grid is the number of samples per period used to bracket extremes and
// zero crossings: 64 per cycle of the highest order, at least 1024.
func (w wave) grid() int {
	top := 1.0
	for _, h := range w.h {
		top = math.Max(top, h)
	}
	return max(1024, 64*int(top))
}

// Peak returns the largest |x(θ)| over a period. Algorithm: sample the
// period on a grid fine enough to bracket every extreme, then refine each
// local maximum of |x| by Newton's method on x'(θ) = 0, kept inside its
// bracket (a bisection step whenever Newton leaves it).
func (w wave) Peak() float64 {
	n := w.grid()
	step := 2 * math.Pi / float64(n)
	xs := make([]float64, n)
	for k := range xs {
		xs[k], _, _ = w.at(float64(k) * step)
	}
	best := 0.0
	for k := 0; k < n; k++ {
		prev, next := math.Abs(xs[(k+n-1)%n]), math.Abs(xs[(k+1)%n])
		m := math.Abs(xs[k])
		best = math.Max(best, m)
		if m < prev || m < next {
			continue
		}
		best = math.Max(best, w.refineMax(float64(k-1)*step, float64(k+1)*step))
	}
	return best
}

// refineMax finds the extreme of x inside [lo, hi] where x' changes sign
// and returns |x| there; without a sign change it returns the larger end.
func (w wave) refineMax(lo, hi float64) float64 {
	_, dlo, _ := w.at(lo)
	_, dhi, _ := w.at(hi)
	if dlo == 0 || dhi == 0 || (dlo > 0) == (dhi > 0) {
		xlo, _, _ := w.at(lo)
		xhi, _, _ := w.at(hi)
		return math.Max(math.Abs(xlo), math.Abs(xhi))
	}
	t := 0.5 * (lo + hi)
	for i := 0; i < 100; i++ {
		_, d1, d2 := w.at(t)
		if d1 == 0 {
			break
		}
		if (d1 > 0) == (dlo > 0) {
			lo = t
		} else {
			hi = t
		}
		nt := t - d1/d2
		if d2 == 0 || !(nt > lo && nt < hi) {
			nt = 0.5 * (lo + hi)
		}
		if math.Abs(nt-t) <= 1e-15*math.Max(1, math.Abs(t)) {
			t = nt
			break
		}
		t = nt
	}
	x, _, _ := w.at(t)
	return math.Abs(x)
}

// zeros returns the zero crossings of x in [0, 2π), ascending. Algorithm:
// a sign change between grid samples brackets a crossing, refined by
// bisection to the last bit.
func (w wave) zeros() []float64 {
	n := w.grid()
	step := 2 * math.Pi / float64(n)
	var out []float64
	x0, _, _ := w.at(0)
	prev := x0
	for k := 1; k <= n; k++ {
		t := float64(k) * step
		x, _, _ := w.at(t)
		if prev == 0 {
			out = append(out, float64(k-1)*step)
		} else if x != 0 && (x > 0) != (prev > 0) {
			lo, hi, flo := float64(k-1)*step, t, prev
			for i := 0; i < 200 && hi-lo > 0; i++ {
				mid := 0.5 * (lo + hi)
				if mid <= lo || mid >= hi {
					break
				}
				fm, _, _ := w.at(mid)
				if fm == 0 {
					lo, hi = mid, mid
					break
				}
				if (fm > 0) == (flo > 0) {
					lo, flo = mid, fm
				} else {
					hi = mid
				}
			}
			out = append(out, 0.5*(lo+hi))
		}
		prev = x
	}
	return out
}

// RectifiedAverage returns the mean of |x(θ)| over a period: the period is
// cut at the zero crossings of x, and each piece integrated exactly with
// the antiderivative.
func (w wave) RectifiedAverage() float64 {
	z := w.zeros()
	if len(z) == 0 {
		// a waveform without a constant term changes sign every period;
		// none found means it is zero
		return 0
	}
	sum := 0.0
	for k := range z {
		a := z[k]
		b := 2*math.Pi + z[0]
		if k+1 < len(z) {
			b = z[k+1]
		}
		sum += math.Abs(w.prim(b) - w.prim(a))
	}
	return sum / (2 * math.Pi)
}
