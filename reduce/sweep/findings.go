package sweep

import (
	"fmt"
	"math"
	"math/cmplx"
	"sort"

	"argand/calc"
)

// Extreme is the smallest or the largest magnitude met by a sweep.
type Extreme struct {
	Freq     float64       // Hz
	Value    calc.Quantity // the swept value there
	Interior bool          // false at the first or last point of the sweep
	Refined  bool          // located between the points, not only sampled
}

// Crossing is a resonance read from a sweep: a frequency at which the
// angle of the value crosses zero (the value turns real and positive).
type Crossing struct {
	Freq    float64
	Value   calc.Quantity
	Peak    bool // the magnitude has a local maximum around it
	Dip     bool // the magnitude has a local minimum around it
	Refined bool // located by bisection on the evaluation, not by interpolation
}

// HalfPower is the half-power band around a peak or a dip of the
// magnitude. Around a peak the band edges are where |x| = peak/√2; around
// a dip (the impedance of a series resonance) where |x| = √2·minimum. An
// edge outside the swept range is not found (HasF1 or HasF2 false).
type HalfPower struct {
	Centre       float64 // Hz, the frequency of the peak or dip
	Level        float64 // |x| at the peak or dip
	Target       float64 // the magnitude at the band edges
	Dip          bool
	F1, F2       float64 // lower and upper band edges, Hz
	HasF1, HasF2 bool
	// Narrow reports a band that lies between two points of the sweep and
	// could not be evaluated there: neither edge is given.
	Narrow bool
}

// Bandwidth returns F2 − F1 and whether both edges were found.
func (h HalfPower) Bandwidth() (float64, bool) { return h.F2 - h.F1, h.HasF1 && h.HasF2 }

// Findings is what a sweep found: its extremes, its resonances and the
// half-power bands around its peaks and dips.
type Findings struct {
	Min, Max   Extreme
	HasExtreme bool // false when no point has a finite value
	Resonances []Crossing
	Bands      []HalfPower
	Notes      []string
}

// maxRefine bounds the evaluations spent locating one finding, and
// MaxResonances the resonances reported from one sweep, so the work of
// reading a sweep stays a bounded multiple of the sweep's own.
const (
	maxRefine     = 200
	MaxResonances = 20
)

// Find reads a finished sweep. It is a pure function of the table's
// points; when eval is not nil it is called (at most a few hundred times
// per finding) to locate each finding between the points:
//
//   - extremes: golden-section search on |x| between the neighbours of the
//     sampled extreme;
//   - resonances: bisection on the sign of the angle between the two
//     points where it changes sign, with the real part positive (a jump
//     through ±180° is not a resonance);
//   - half-power edges: bisection on |x| − target between the points that
//     bracket the target.
//
// Without eval, or where eval fails, each is interpolated linearly between
// the bracketing points (in log f for a log sweep), and the step says so.
func Find(t *Table, eval func(hz float64) (calc.Quantity, error)) Findings {
	var fd Findings
	if t == nil || len(t.Points) == 0 {
		return fd
	}
	pts := t.Points
	n := len(pts)
	ok := func(k int) bool { return k >= 0 && k < n && pts[k].Mark == "" }
	mag := func(k int) float64 { return cmplx.Abs(pts[k].Value.V) }
	xOf := func(f float64) float64 {
		if t.Log && f > 0 {
			return math.Log(f)
		}
		return f
	}
	fOf := func(x float64) float64 {
		if t.Log {
			return math.Exp(x)
		}
		return x
	}
	at := func(f float64) (calc.Quantity, bool) {
		if eval == nil {
			return calc.Quantity{}, false
		}
		v, err := eval(f)
		if err != nil {
			return calc.Quantity{}, false
		}
		if v, err = v.Check("sweep"); err != nil || v.Dim != t.Dim {
			return calc.Quantity{}, false
		}
		return v, true
	}
	refineFailed := false

	lo, hi := -1, -1
	for k := range pts {
		if !ok(k) {
			continue
		}
		if lo < 0 || mag(k) < mag(lo) {
			lo = k
		}
		if hi < 0 || mag(k) > mag(hi) {
			hi = k
		}
	}
	if lo < 0 {
		fd.Notes = append(fd.Notes, "no point of the sweep has a finite value")
		return fd
	}
	fd.HasExtreme = true
	extreme := func(k int, max bool) Extreme {
		e := Extreme{Freq: pts[k].Freq, Value: pts[k].Value, Interior: k > 0 && k < n-1}
		if !e.Interior || eval == nil || !ok(k-1) || !ok(k+1) {
			return e
		}
		f, v, good := golden(xOf(pts[k-1].Freq), xOf(pts[k+1].Freq), fOf, at, max)
		if !good {
			refineFailed = true
			return e
		}
		better := cmplx.Abs(v.V) > cmplx.Abs(e.Value.V)
		if !max {
			better = cmplx.Abs(v.V) < cmplx.Abs(e.Value.V)
		}
		if better {
			e.Freq, e.Value = f, v
		}
		e.Refined = true
		return e
	}
	fd.Min = extreme(lo, false)
	fd.Max = extreme(hi, true)

	// resonances: the angle changes sign between two neighbours with a
	// positive real part on both sides, or is exactly zero at a point
	phased := false
	for k := range pts {
		if ok(k) && imag(pts[k].Value.V) != 0 {
			phased = true
			break
		}
	}
	if !phased {
		fd.Notes = append(fd.Notes, "the value has no phase (it is real at every point): no resonance is read from the angle")
	}
	more := 0
	for k := 0; phased && k < n; k++ {
		if !ok(k) {
			continue
		}
		if len(fd.Resonances) == MaxResonances {
			// count the rest without locating them
			v, w := pts[k].Value.V, complex(0, 0)
			if ok(k + 1) {
				w = pts[k+1].Value.V
			}
			if imag(v) == 0 && real(v) > 0 || ok(k+1) && real(v) > 0 && real(w) > 0 && imag(w) != 0 && (imag(v) > 0) != (imag(w) > 0) {
				more++
			}
			continue
		}
		v := pts[k].Value.V
		if imag(v) == 0 && real(v) > 0 {
			if k > 0 && ok(k-1) && imag(pts[k-1].Value.V) == 0 && real(pts[k-1].Value.V) > 0 {
				continue // the same zero, held over several points
			}
			c := Crossing{Freq: pts[k].Freq, Value: pts[k].Value, Refined: true}
			fd.Resonances = append(fd.Resonances, c)
			continue
		}
		if !ok(k + 1) {
			continue
		}
		w := pts[k+1].Value.V
		if real(v) <= 0 || real(w) <= 0 || imag(w) == 0 || (imag(v) > 0) == (imag(w) > 0) {
			continue
		}
		c := Crossing{}
		x0, x1 := xOf(pts[k].Freq), xOf(pts[k+1].Freq)
		if f, q, good := refineRoot(x0, x1, fOf, at, func(q complex128) float64 { return imag(q) * sign(imag(v)) }, func(q complex128) bool { return real(q) > 0 }); good {
			c.Freq, c.Value, c.Refined = f, q, true
		} else {
			if eval != nil {
				refineFailed = true
			}
			a0, a1 := cmplx.Phase(v), cmplx.Phase(w)
			s := a0 / (a0 - a1)
			c.Freq = fOf(x0 + s*(x1-x0))
			c.Value = calc.Quantity{V: v + complex(s, 0)*(w-v), Dim: t.Dim, Kind: t.Kind}
		}
		fd.Resonances = append(fd.Resonances, c)
	}

	if more > 0 {
		fd.Notes = append(fd.Notes, fmt.Sprintf("the angle crosses zero %d more times above the last resonance listed: sweep a narrower range to see them", more))
	}

	// a golden-section extreme is found to about √ε in frequency, so its
	// angle is off by as much; where a resonance sits on it (series and
	// parallel RLC) the bisected resonance is the truer point
	for _, e := range []*Extreme{&fd.Min, &fd.Max} {
		if !e.Refined {
			continue
		}
		for _, c := range fd.Resonances {
			m, mc := cmplx.Abs(e.Value.V), cmplx.Abs(c.Value.V)
			if c.Refined && math.Abs(c.Freq-e.Freq) <= 1e-6*c.Freq && math.Abs(mc-m) <= 1e-12*m {
				e.Freq, e.Value = c.Freq, c.Value
			}
		}
	}

	// classify each resonance by the sampled magnitudes around it, and
	// find the half-power band of each peak or dip
	centres := map[int]bool{}
	for i := range fd.Resonances {
		c := &fd.Resonances[i]
		k := nearest(pts, c.Freq)
		j, peak, dip := localExtreme(pts, k, ok, mag)
		c.Peak, c.Dip = peak, dip
		if (peak || dip) && !centres[j] {
			centres[j] = true
			if b, good := fd.band(t, j, dip, ok, mag, xOf, fOf, at, eval, &refineFailed); good {
				fd.Bands = append(fd.Bands, b)
			}
		}
	}
	if fd.Max.Interior && !centres[hi] {
		if b, good := fd.band(t, hi, false, ok, mag, xOf, fOf, at, eval, &refineFailed); good {
			fd.Bands = append(fd.Bands, b)
		}
	}
	if refineFailed {
		fd.Notes = append(fd.Notes, "some findings could not be evaluated between the points and are interpolated: read them to the spacing of the sweep")
	} else if eval == nil {
		fd.Notes = append(fd.Notes, "findings are interpolated between the points: read them to the spacing of the sweep")
	}
	return fd
}

// band finds the half-power band around the peak or dip at point j.
//
// The level is the extreme located between j's neighbours (golden-section
// search), not the sampled point: a band narrower than the point spacing
// puts every sampled point outside it. Each edge is then bracketed between
// the located extreme, which is inside the band, and the first point
// beyond the target on that side, so f1 < centre < f2 by construction.
// Without an evaluation a band whose both neighbours already lie beyond
// the target cannot be read from the points at all: it is narrower than
// the spacing, and is reported as that (Narrow) with no edges.
func (fd *Findings) band(t *Table, j int, dip bool, ok func(int) bool, mag func(int) float64,
	xOf, fOf func(float64) float64, at func(float64) (calc.Quantity, bool),
	eval func(float64) (calc.Quantity, error), failed *bool) (HalfPower, bool) {
	pts := t.Points
	h := HalfPower{Centre: pts[j].Freq, Level: mag(j), Dip: dip}
	located := false
	// a refined extreme gives a truer level than the sampled point
	for _, e := range []Extreme{fd.Max, fd.Min} {
		if e.Refined && nearest(pts, e.Freq) == j && (cmplx.Abs(e.Value.V) > h.Level) == !dip {
			h.Centre, h.Level, located = e.Freq, cmplx.Abs(e.Value.V), true
		}
	}
	if !located && eval != nil && ok(j-1) && ok(j+1) {
		if f, v, good := golden(xOf(pts[j-1].Freq), xOf(pts[j+1].Freq), fOf, at, !dip); good {
			if m := cmplx.Abs(v.V); (m > h.Level) == !dip || m == h.Level {
				h.Centre, h.Level = f, m
			}
			located = true
			// the bisected resonance on the extreme is the truer frequency
			for _, c := range fd.Resonances {
				mc := cmplx.Abs(c.Value.V)
				if c.Refined && math.Abs(c.Freq-h.Centre) <= 1e-6*c.Freq && math.Abs(mc-h.Level) <= 1e-12*h.Level {
					h.Centre = c.Freq
				}
			}
		} else {
			*failed = true
		}
	}
	if dip {
		if h.Level == 0 {
			fd.Notes = append(fd.Notes, fmt.Sprintf("the dip at %s reaches zero: it has no half-power band", freqLabel(h.Centre, false)))
			return h, false
		}
		h.Target = h.Level * math.Sqrt2
	} else {
		h.Target = h.Level / math.Sqrt2
	}
	beyond := func(k int) bool {
		if dip {
			return mag(k) >= h.Target
		}
		return mag(k) <= h.Target
	}
	g := func(q complex128) float64 {
		d := cmplx.Abs(q) - h.Target
		if dip {
			return -d
		}
		return d
	}
	// edge locates the target between an inner abscissa x0 with magnitude
	// m0 (inside the band) and the point outer (beyond it)
	edge := func(x0, m0 float64, outer int) (float64, bool) {
		x1 := xOf(pts[outer].Freq)
		if f, _, good := refineRoot(x0, x1, fOf, at, g, nil); good {
			return f, true
		}
		if eval != nil {
			*failed = true
		}
		m1 := mag(outer)
		if m1 == m0 {
			return 0, false
		}
		s := (h.Target - m0) / (m1 - m0)
		return fOf(x0 + s*(x1-x0)), true
	}
	if !located && ok(j-1) && ok(j+1) && beyond(j-1) && beyond(j+1) {
		// the sampled level is not the extreme's, and nothing between the
		// points can be evaluated: the band cannot be read honestly
		h.Narrow = true
		return h, true
	}
	xc := xOf(h.Centre)
	below := sort.Search(len(pts), func(i int) bool { return pts[i].Freq >= h.Centre }) - 1
	x0, m0 := xc, h.Level
	for k := below; k >= 0 && ok(k); k-- {
		if beyond(k) {
			h.F1, h.HasF1 = edge(x0, m0, k)
			break
		}
		x0, m0 = xOf(pts[k].Freq), mag(k)
	}
	above := sort.Search(len(pts), func(i int) bool { return pts[i].Freq > h.Centre })
	x0, m0 = xc, h.Level
	for k := above; k < len(pts) && ok(k); k++ {
		if beyond(k) {
			h.F2, h.HasF2 = edge(x0, m0, k)
			break
		}
		x0, m0 = xOf(pts[k].Freq), mag(k)
	}
	return h, true
}

// nearest returns the index of the point whose frequency is closest to f;
// the points rise, so a binary search finds it.
func nearest(pts []Point, f float64) int {
	k := sort.Search(len(pts), func(i int) bool { return pts[i].Freq >= f })
	switch {
	case k == len(pts):
		return k - 1
	case k > 0 && f-pts[k-1].Freq < pts[k].Freq-f:
		return k - 1
	}
	return k
}

// localExtreme looks at point k and its neighbours for a sampled local
// maximum or minimum of the magnitude, and returns where it is.
func localExtreme(pts []Point, k int, ok func(int) bool, mag func(int) float64) (int, bool, bool) {
	isMax := func(j int) bool {
		return ok(j) && ok(j-1) && ok(j+1) && mag(j) >= mag(j-1) && mag(j) >= mag(j+1) && (mag(j) > mag(j-1) || mag(j) > mag(j+1))
	}
	isMin := func(j int) bool {
		return ok(j) && ok(j-1) && ok(j+1) && mag(j) <= mag(j-1) && mag(j) <= mag(j+1) && (mag(j) < mag(j-1) || mag(j) < mag(j+1))
	}
	for _, j := range []int{k, k - 1, k + 1} {
		if isMax(j) {
			return j, true, false
		}
		if isMin(j) {
			return j, false, true
		}
	}
	return k, false, false
}

func sign(x float64) float64 {
	if x < 0 {
		return -1
	}
	return 1
}

// refineRoot locates the root of g(eval(f)) between x0 and x1 (in the sweep's
// axis: f, or log f), where g is negative at x0's side and positive at
// x1's, or the reverse. keep, when not nil, must hold at every evaluated
// point (a resonance needs a positive real part). It reports false when
// there is no evaluation or it fails.
//
// The method is Brent's (R. P. Brent, Algorithms for Minimization without
// Derivatives, 1973, ch. 4): inverse quadratic or secant steps inside the
// bracket, bisection where they would not shrink it enough, so it never
// takes more steps than bisection and on a smooth g takes a handful. It
// stops when the bracket is 1e-14 of the frequency wide.
func refineRoot(x0, x1 float64, fOf func(float64) float64, at func(float64) (calc.Quantity, bool),
	g func(complex128) float64, keep func(complex128) bool) (float64, calc.Quantity, bool) {
	va, good := at(fOf(x0))
	if !good {
		return 0, calc.Quantity{}, false
	}
	vb, good := at(fOf(x1))
	if !good {
		return 0, calc.Quantity{}, false
	}
	a, b := x0, x1
	fa, fb := g(va.V), g(vb.V)
	if fa == 0 {
		return fOf(a), va, true
	}
	if fb == 0 {
		return fOf(b), vb, true
	}
	if (fa > 0) == (fb > 0) {
		return 0, calc.Quantity{}, false
	}
	// axis units per relative change of frequency: 1 on a log axis, f on
	// a linear one
	scale := math.Abs(x1-x0) / math.Abs(fOf(x1)-fOf(x0)) * math.Abs(fOf(x1))
	if math.IsNaN(scale) || math.IsInf(scale, 0) || scale == 0 {
		scale = math.Max(math.Abs(x0), math.Abs(x1))
	}
	c, fc, vc := a, fa, va
	d := b - a
	e := d
	for i := 0; i < maxRefine; i++ {
		if (fb > 0) == (fc > 0) {
			c, fc, vc = a, fa, va
			d = b - a
			e = d
		}
		if math.Abs(fc) < math.Abs(fb) {
			a, fa, va = b, fb, vb
			b, fb, vb = c, fc, vc
			c, fc, vc = a, fa, va
		}
		tol := 2*2.220446049250313e-16*math.Abs(b) + 0.25e-14*scale
		m := (c - b) / 2
		if math.Abs(m) <= tol || fb == 0 {
			return fOf(b), vb, true
		}
		if math.Abs(e) < tol || math.Abs(fa) <= math.Abs(fb) {
			d, e = m, m
		} else {
			var p, q float64
			s := fb / fa
			if a == c {
				p, q = 2*m*s, 1-s // secant
			} else {
				q0, r := fa/fc, fb/fc // inverse quadratic
				p = s * (2*m*q0*(q0-r) - (b-a)*(r-1))
				q = (q0 - 1) * (r - 1) * (s - 1)
			}
			if p > 0 {
				q = -q
			} else {
				p = -p
			}
			if 2*p < 3*m*q-math.Abs(tol*q) && p < math.Abs(e*q/2) {
				e, d = d, p/q
			} else {
				d, e = m, m
			}
		}
		a, fa, va = b, fb, vb
		if math.Abs(d) > tol {
			b += d
		} else if m > 0 {
			b += tol
		} else {
			b -= tol
		}
		if vb, good = at(fOf(b)); !good || keep != nil && !keep(vb.V) {
			return 0, calc.Quantity{}, false
		}
		fb = g(vb.V)
	}
	return fOf(b), vb, true
}

// golden locates the largest (max) or smallest magnitude between x0 and
// x1 by Brent's method (R. P. Brent, Algorithms for Minimization without
// Derivatives, 1973, ch. 5): parabolic steps through the three best
// points, golden-section steps where a parabola does not help. The
// magnitude is flat at its extreme, so the frequency is found to about
// the square root of the rounding error (the search stops at 1e-9 of the
// frequency) while the magnitude there is found to the rounding error.
func golden(x0, x1 float64, fOf func(float64) float64, at func(float64) (calc.Quantity, bool), max bool) (float64, calc.Quantity, bool) {
	cost := func(v calc.Quantity) float64 {
		if max {
			return -cmplx.Abs(v.V)
		}
		return cmplx.Abs(v.V)
	}
	const cgold = 0.3819660112501051 // (3 − √5)/2
	a, b := math.Min(x0, x1), math.Max(x0, x1)
	scale := (b - a) / math.Abs(fOf(b)-fOf(a)) * math.Abs(fOf(b))
	if math.IsNaN(scale) || math.IsInf(scale, 0) || scale == 0 {
		scale = math.Max(math.Abs(a), math.Abs(b))
	}
	x := a + cgold*(b-a)
	vx, good := at(fOf(x))
	if !good {
		return 0, calc.Quantity{}, false
	}
	fx := cost(vx)
	w, v, fw, fv := x, x, fx, fx
	var d, e float64
	for i := 0; i < maxRefine; i++ {
		m := (a + b) / 2
		tol := 1.4901161193847656e-08*math.Abs(x) + 0.25e-9*scale
		t2 := 2 * tol
		if math.Abs(x-m) <= t2-(b-a)/2 {
			break
		}
		var p, q, r float64
		if math.Abs(e) > tol {
			r = (x - w) * (fx - fv)
			q = (x - v) * (fx - fw)
			p = (x-v)*q - (x-w)*r
			q = 2 * (q - r)
			if q > 0 {
				p = -p
			} else {
				q = -q
			}
			r, e = e, d
		}
		if math.Abs(p) < math.Abs(q*r/2) && p > q*(a-x) && p < q*(b-x) {
			d = p / q // a parabolic step
			if u := x + d; u-a < t2 || b-u < t2 {
				d = tol
				if x >= m {
					d = -tol
				}
			}
		} else {
			e = b - x // a golden-section step
			if x >= m {
				e = a - x
			}
			d = cgold * e
		}
		u := x + d
		if math.Abs(d) < tol {
			u = x + math.Copysign(tol, d)
		}
		vu, good := at(fOf(u))
		if !good {
			return 0, calc.Quantity{}, false
		}
		fu := cost(vu)
		if fu <= fx {
			if u < x {
				b = x
			} else {
				a = x
			}
			v, fv, w, fw = w, fw, x, fx
			x, fx, vx = u, fu, vu
			continue
		}
		if u < x {
			a = u
		} else {
			b = u
		}
		if fu <= fw || w == x {
			v, fv, w, fw = w, fw, u, fu
		} else if fu <= fv || v == x || v == w {
			v, fv = u, fu
		}
	}
	return fOf(x), vx, true
}

// Decibels returns 20·log10(|x|/|ref|) at each point of the sweep, and
// whether the point has a value in dB (a marked point or a zero magnitude
// has none). The reference must be a nonzero value in the unit of the
// sweep: a level in dB is a ratio to a stated reference.
func (t *Table) Decibels(ref calc.Quantity) ([]float64, []bool, error) {
	if t == nil {
		return nil, nil, fmt.Errorf("no sweep to read in dB")
	}
	if ref.Dim != t.Dim {
		return nil, nil, fmt.Errorf("the dB reference must be in the unit of the swept value (%s), not %s",
			calc.DimName(t.Dim, false), calc.DimName(ref.Dim, false))
	}
	if _, err := ref.Check("dB reference"); err != nil {
		return nil, nil, err
	}
	r := cmplx.Abs(ref.V)
	if r == 0 {
		return nil, nil, fmt.Errorf("the dB reference is zero: a level in dB needs a nonzero reference")
	}
	db := make([]float64, len(t.Points))
	has := make([]bool, len(t.Points))
	for k, p := range t.Points {
		if p.Mark != "" {
			continue
		}
		if d, err := DB(cmplx.Abs(p.Value.V) / r); err == nil && finite(d) {
			db[k], has[k] = d, true
		}
	}
	return db, has, nil
}

// Step records the findings for a person and a program: each finding a
// result (its frequency and the value there), and a note in words.
func (fd Findings) Step(source string, f calc.Format) calc.Step {
	st := calc.Step{
		Kind:    "sweep-findings",
		Source:  source,
		Rule:    "what the sweep found: smallest and largest magnitude, resonances (the angle crosses zero) and half-power bands",
		Formula: "resonance: ∠x = 0;  band around a peak: |x| = peak/√2;  around a dip: |x| = √2·minimum;  Q = f_centre/(f2 − f1)",
	}
	if !fd.HasExtreme {
		st.Notes = append(st.Notes, fd.Notes...)
		return st
	}
	hz := func(x float64) calc.Quantity { return calc.Real(x, calc.DimFrequency) }
	add := func(name string, q calc.Quantity) {
		st.Results = append(st.Results, calc.Operand{Name: name, Value: q})
	}
	where := func(e Extreme) string {
		s := "at " + trimZeros(f.Mag(e.Freq, calc.DimFrequency, calc.KindPlain))
		if !e.Interior {
			s += ", an end of the range"
		}
		return s
	}
	add("f(min)", hz(fd.Min.Freq))
	add("x(min)", fd.Min.Value)
	add("f(max)", hz(fd.Max.Freq))
	add("x(max)", fd.Max.Value)
	st.Notes = append(st.Notes,
		"smallest |x| = "+f.Mag(cmplx.Abs(fd.Min.Value.V), fd.Min.Value.Dim, fd.Min.Value.Kind)+" "+where(fd.Min),
		"largest |x| = "+f.Mag(cmplx.Abs(fd.Max.Value.V), fd.Max.Value.Dim, fd.Max.Value.Kind)+" "+where(fd.Max))
	if len(fd.Resonances) == 0 && len(fd.Notes) == 0 {
		st.Notes = append(st.Notes, "no resonance in the range: the angle does not cross zero")
	}
	for i, c := range fd.Resonances {
		n := fmt.Sprint(i + 1)
		add("f_r"+n, hz(c.Freq))
		add("x(f_r"+n+")", c.Value)
		shape := ""
		switch {
		case c.Peak:
			shape = ", at a peak of |x|"
		case c.Dip:
			shape = ", at a dip of |x|"
		}
		st.Notes = append(st.Notes, "resonance "+n+" at "+trimZeros(f.Mag(c.Freq, calc.DimFrequency, calc.KindPlain))+
			": the angle crosses zero, x = "+f.Mag(real(c.Value.V), c.Value.Dim, c.Value.Kind)+shape)
	}
	for i, b := range fd.Bands {
		n := fmt.Sprint(i + 1)
		lvl := func(x float64) string { return f.Mag(x, fd.Max.Value.Dim, fd.Max.Value.Kind) }
		rule := "peak/√2"
		if b.Dip {
			rule = "√2·minimum"
		}
		line := fmt.Sprintf("half-power band %s around %s: |x| = %s = %s", n,
			trimZeros(f.Mag(b.Centre, calc.DimFrequency, calc.KindPlain)), rule, lvl(b.Target))
		if b.Narrow {
			st.Notes = append(st.Notes, line+", narrower than the point spacing: its edges cannot be read from these points (sweep more points or a narrower range around it)")
			continue
		}
		if b.HasF1 {
			add("f1_"+n, hz(b.F1))
			line += ", f1 = " + trimZeros(f.Mag(b.F1, calc.DimFrequency, calc.KindPlain))
		} else {
			line += ", f1 lies below the start of the sweep"
		}
		if b.HasF2 {
			add("f2_"+n, hz(b.F2))
			line += ", f2 = " + trimZeros(f.Mag(b.F2, calc.DimFrequency, calc.KindPlain))
		} else {
			line += ", f2 lies above the end of the sweep"
		}
		if bw, ok := b.Bandwidth(); ok && bw > 0 {
			add("B_"+n, hz(bw))
			add("Q_"+n, calc.Number(complex(b.Centre/bw, 0)))
			line += ", B = f2 − f1 = " + trimZeros(f.Mag(bw, calc.DimFrequency, calc.KindPlain)) +
				fmt.Sprintf(", Q = f/B = %.4g", b.Centre/bw)
		}
		st.Notes = append(st.Notes, line)
	}
	st.Notes = append(st.Notes, fd.Notes...)
	return st
}
