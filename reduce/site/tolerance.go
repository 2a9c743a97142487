package site

import (
	"math"
	"math/cmplx"
	"strconv"

	"argand/calc"
)

// SampledLabel is attached to every tolerance range: the extremes are found
// by sampling and local search, so the true range may be a little wider.
const SampledLabel = "sampled, not a guaranteed bound"

// Param is a component value with a symmetric tolerance: its value lies in
// Nominal·(1 ± Tol/100).
type Param struct {
	Name    string
	Nominal calc.Quantity
	Tol     float64 // ± per cent, 0 for an exact value
}

// Accuracy is an instrument accuracy written the usual way for meters:
// ± Pct % of reading ± Digits counts, one count being Resolution in the
// reading's unit (the value of the last displayed digit on the range used).
type Accuracy struct {
	Pct        float64
	Digits     float64
	Resolution float64
}

// HalfWidth returns the half-width of the band a reading may lie in:
// Pct/100·|reading| + Digits·Resolution.
func (a Accuracy) HalfWidth(reading float64) (float64, error) {
	if err := finite([]string{"accuracy %", "digits", "resolution", "reading"}, a.Pct, a.Digits, a.Resolution, reading); err != nil {
		return 0, err
	}
	if a.Pct < 0 || a.Digits < 0 || a.Resolution < 0 {
		return 0, errf("an accuracy is written with non-negative per cent, digits and resolution")
	}
	return a.Pct/100*math.Abs(reading) + a.Digits*a.Resolution, nil
}

// RangeResult is the spread of a result over a tolerance box.
type RangeResult struct {
	Nominal        calc.Quantity
	MagMin, MagMax calc.Quantity // real, in the unit of the result
	// AngMin and AngMax bound the angle, each in (−180°, 180°]; the range
	// runs counter-clockwise from AngMin to AngMax and AngSpan is its
	// width. Wraps is set when it crosses ±180°, so AngMin > AngMax.
	AngMin, AngMax, AngSpan calc.Quantity
	Wraps                   bool
	// Values of the parameters at each extreme, in the order of params.
	AtMagMin, AtMagMax, AtAngMin, AtAngMax []calc.Quantity
	Evaluations                            int // calls of the function
	Failed                                 int // calls that returned an error; those points are skipped
	Steps                                  []calc.Step
}

// Operands lists the main results by name.
func (r *RangeResult) Operands() []calc.Operand {
	return []calc.Operand{op("nominal", r.Nominal), op("mag_min", r.MagMin), op("mag_max", r.MagMax),
		op("ang_min", r.AngMin), op("ang_max", r.AngMax), op("ang_span", r.AngSpan)}
}

// MaxEvaluations bounds the calls of the function one Range makes.
const MaxEvaluations = maxEvals

// Bounds on the search.
const (
	maxParams     = 12    // 2^12 corners
	maxEvals      = 20000 // every call of f, all phases together
	sampleBudget  = 12000 // corners and dense samples
	refineStarts  = 3     // best samples refined per objective
	goldenIters   = 24    // golden-section steps per line search
	maxSweeps     = 40    // coordinate sweeps per refinement run
	minBracket    = 1e-13 // stop a run when the bracket is this small
	objectiveKind = 4     // min |f|, max |f|, min angle, max angle
)

// Range returns the minimum and maximum of |f| and of the angle of f over
// the box where every parameter varies within its tolerance. f is called
// with the parameter values in the order of params.
//
// Extremes may lie inside the box (a series resonance within the tolerance
// range puts the minimum |Z| in the interior), so Range evaluates the
// corners, then a dense sample — a regular grid when it fits the budget,
// otherwise the corners plus a Halton sequence — and then refines the best
// samples of each objective by cyclic coordinate descent with a
// golden-section line search in a bracket of one sample spacing, halved on
// every sweep. At most 20 000 calls are made in all. Angles are measured
// relative to the nominal angle and unwrapped, so a range across ±180° is
// reported correctly as long as it is narrower than a full turn.
//
// The result is sampled, not a guaranteed bound: a sharp extreme between
// samples and outside every refined basin can be missed.
func Range(params []Param, f func(vals []calc.Quantity) (calc.Quantity, error)) (RangeResult, error) {
	if len(params) == 0 {
		return RangeResult{}, errf("a tolerance range needs at least one parameter")
	}
	if f == nil {
		return RangeResult{}, errf("a tolerance range needs a function to evaluate")
	}
	var free []int // indices of parameters with a tolerance
	for i, p := range params {
		if err := finiteC(p.Name, p.Nominal.V); err != nil {
			return RangeResult{}, err
		}
		if err := finite([]string{p.Name + " tolerance"}, p.Tol); err != nil {
			return RangeResult{}, err
		}
		if p.Tol < 0 || p.Tol >= 100 {
			return RangeResult{}, errf("tolerance of %s must be in [0, 100) per cent (got %g)", p.Name, p.Tol)
		}
		if p.Tol > 0 {
			free = append(free, i)
		}
	}
	if len(free) > maxParams {
		return RangeResult{}, errf("too many parameters with a tolerance (%d; at most %d)", len(free), maxParams)
	}
	s := &search{params: params, free: free, f: f, vals: make([]calc.Quantity, len(params))}
	nomU := make([]float64, len(free))
	nom, err := s.call(nomU)
	if err != nil {
		return RangeResult{}, errf("the nominal values give no result: %v", err)
	}
	s.nominal = nom
	s.nomAng = 0
	if nom.V != 0 {
		s.nomAng = deg(cmplx.Phase(nom.V))
	}
	s.consider(nomU, nom)

	m := len(free)
	method := "nominal only (no parameter has a tolerance)"
	spacing := 0.0
	if m > 0 {
		k := gridSize(m, sampleBudget)
		if k >= 3 {
			method = strconv.Itoa(pow(k, m)) + "-point grid (" + strconv.Itoa(k) + " per parameter, corners included)"
			spacing = 2 / float64(k-1)
			s.grid(k)
		} else {
			n := sampleBudget - pow(2, m)
			method = strconv.Itoa(pow(2, m)) + " corners and " + strconv.Itoa(n) + " Halton points"
			spacing = 2 / math.Pow(float64(sampleBudget), 1/float64(m))
			s.corners()
			s.halton(n)
		}
		s.refine(spacing)
	}
	if s.count == 0 {
		return RangeResult{}, errf("no point of the tolerance box gives a result")
	}
	return s.result(method)
}

// search holds the state of one Range call.
type search struct {
	params  []Param
	free    []int
	f       func([]calc.Quantity) (calc.Quantity, error)
	vals    []calc.Quantity
	nominal calc.Quantity
	nomAng  float64 // degrees
	evals   int
	failed  int
	count   int // successful evaluations
	hasAng  bool
	// best value of each objective and where it was found; objectives are
	// all minimised: |f|, −|f|, angle, −angle.
	best   [objectiveKind]float64
	bestAt [objectiveKind][]float64
	// the few best samples of each objective, for refinement
	starts [objectiveKind][]start
}

type start struct {
	u []float64
	v float64
}

// call evaluates f at box coordinates u ∈ [−1, 1]^m.
func (s *search) call(u []float64) (calc.Quantity, error) {
	for i, p := range s.params {
		s.vals[i] = p.Nominal
	}
	for j, i := range s.free {
		p := s.params[i]
		scale := 1 + u[j]*p.Tol/100
		s.vals[i] = calc.Quantity{V: p.Nominal.V * complex(scale, 0), Dim: p.Nominal.Dim, Kind: p.Nominal.Kind}
	}
	s.evals++
	q, err := s.f(s.vals)
	if err == nil {
		q, err = q.Check("tolerance range")
	}
	if err != nil {
		s.failed++
	}
	return q, err
}

// objectives returns the four minimised objectives of a value, and whether
// its angle is defined.
func (s *search) objectives(q calc.Quantity) ([objectiveKind]float64, bool) {
	m := cmplx.Abs(q.V)
	var a float64
	ok := q.V != 0
	if ok {
		a = calc.NormDeg(deg(cmplx.Phase(q.V)) - s.nomAng)
	}
	return [objectiveKind]float64{m, -m, a, -a}, ok
}

// consider records a successful evaluation.
func (s *search) consider(u []float64, q calc.Quantity) {
	obj, angOK := s.objectives(q)
	first := s.count == 0
	s.count++
	for k := range objectiveKind {
		if k >= 2 && !angOK {
			continue
		}
		if first || (k >= 2 && !s.hasAng) || obj[k] < s.best[k] {
			s.best[k] = obj[k]
			s.bestAt[k] = append(s.bestAt[k][:0], u...)
		}
	}
	if angOK {
		s.hasAng = true
	}
}

// sample evaluates a sample point and keeps it among the starts.
func (s *search) sample(u []float64) {
	q, err := s.call(u)
	if err != nil {
		return
	}
	s.consider(u, q)
	obj, angOK := s.objectives(q)
	for k := range objectiveKind {
		if k >= 2 && !angOK {
			continue
		}
		st := s.starts[k]
		if len(st) < refineStarts || obj[k] < st[len(st)-1].v {
			st = append(st, start{append([]float64(nil), u...), obj[k]})
			// keep sorted, dropping the worst
			for i := len(st) - 1; i > 0 && st[i].v < st[i-1].v; i-- {
				st[i], st[i-1] = st[i-1], st[i]
			}
			if len(st) > refineStarts {
				st = st[:refineStarts]
			}
			s.starts[k] = st
		}
	}
}

func pow(k, m int) int {
	r := 1
	for range m {
		r *= k
	}
	return r
}

// gridSize returns the largest k with k^m ≤ budget.
func gridSize(m, budget int) int {
	k := int(math.Pow(float64(budget), 1/float64(m)))
	for k > 1 && pow(k, m) > budget {
		k--
	}
	for pow(k+1, m) <= budget {
		k++
	}
	return k
}

// grid samples a k^m regular grid including the faces and corners.
func (s *search) grid(k int) {
	m := len(s.free)
	idx := make([]int, m)
	u := make([]float64, m)
	for {
		for j := range m {
			u[j] = -1 + 2*float64(idx[j])/float64(k-1)
		}
		s.sample(u)
		j := 0
		for ; j < m; j++ {
			idx[j]++
			if idx[j] < k {
				break
			}
			idx[j] = 0
		}
		if j == m {
			return
		}
	}
}

// corners samples the 2^m corners of the box.
func (s *search) corners() {
	m := len(s.free)
	u := make([]float64, m)
	for c := range pow(2, m) {
		for j := range m {
			u[j] = -1
			if c>>j&1 == 1 {
				u[j] = 1
			}
		}
		s.sample(u)
	}
}

var primes = [maxParams]float64{2, 3, 5, 7, 11, 13, 17, 19, 23, 29, 31, 37}

// halton samples n points of the Halton sequence, whose prime bases spread
// points evenly in many dimensions where a grid would be too coarse.
func (s *search) halton(n int) {
	m := len(s.free)
	u := make([]float64, m)
	for i := 1; i <= n; i++ {
		for j := range m {
			b := primes[j]
			x, fr := 0.0, 1.0
			for k := float64(i); k > 0; k = math.Floor(k / b) {
				fr /= b
				x += fr * math.Mod(k, b)
			}
			u[j] = 2*x - 1
		}
		s.sample(u)
	}
}

// refine runs cyclic coordinate descent with golden-section line searches
// from the best samples of each objective, sharing the remaining budget.
func (s *search) refine(spacing float64) {
	runs := 0
	for k := range objectiveKind {
		runs += len(s.starts[k])
	}
	if runs == 0 {
		return
	}
	per := (maxEvals - s.evals) / runs
	for k := range objectiveKind {
		for _, st := range s.starts[k] {
			s.descend(k, st.u, spacing, s.evals+per)
		}
	}
}

// value evaluates objective k at u, recording the point; failures count as
// +∞ so that the search walks away from them.
func (s *search) value(k int, u []float64) float64 {
	q, err := s.call(u)
	if err != nil {
		return math.Inf(1)
	}
	s.consider(u, q)
	obj, angOK := s.objectives(q)
	if k >= 2 && !angOK {
		return math.Inf(1)
	}
	return obj[k]
}

// descend minimises objective k from u0 until the bracket is tiny, no sweep
// improves, or the evaluation limit is reached.
func (s *search) descend(k int, u0 []float64, h float64, limit int) {
	m := len(s.free)
	if s.evals >= limit {
		return
	}
	u := append([]float64(nil), u0...)
	fu := s.value(k, u)
	const g = 0.6180339887498949 // (√5 − 1)/2
	for sweep := 0; sweep < maxSweeps && h > minBracket; sweep++ {
		before := fu
		for j := range m {
			if s.evals+goldenIters+4 > limit {
				return
			}
			lo, hi := math.Max(-1, u[j]-h), math.Min(1, u[j]+h)
			x := append([]float64(nil), u...)
			at := func(t float64) float64 { x[j] = t; return s.value(k, x) }
			// The ends are tried too: many extremes sit on a face of the box.
			bestT, bestF := u[j], fu
			for _, t := range []float64{lo, hi} {
				if v := at(t); v < bestF {
					bestT, bestF = t, v
				}
			}
			a, b := lo, hi
			c, d := b-g*(b-a), a+g*(b-a)
			fc, fd := at(c), at(d)
			for range goldenIters {
				if fc < fd {
					b, d, fd = d, c, fc
					c = b - g*(b-a)
					fc = at(c)
				} else {
					a, c, fc = c, d, fd
					d = a + g*(b-a)
					fd = at(d)
				}
			}
			for _, p := range [][2]float64{{c, fc}, {d, fd}} {
				if p[1] < bestF {
					bestT, bestF = p[0], p[1]
				}
			}
			u[j], fu = bestT, bestF
		}
		if fu >= before && sweep > 0 {
			h /= 4
		} else {
			h /= 2
		}
	}
}

// result assembles the range and its step.
func (s *search) result(method string) (RangeResult, error) {
	d, kind := s.nominal.Dim, s.nominal.Kind
	if kind == calc.KindAngle {
		kind = calc.KindPlain
	}
	r := RangeResult{
		Nominal:     s.nominal,
		MagMin:      calc.Quantity{V: complex(s.best[0], 0), Dim: d, Kind: magKind(kind)},
		MagMax:      calc.Quantity{V: complex(-s.best[1], 0), Dim: d, Kind: magKind(kind)},
		Evaluations: s.evals,
		Failed:      s.failed,
	}
	at := func(u []float64) []calc.Quantity {
		out := make([]calc.Quantity, len(s.params))
		for i, p := range s.params {
			out[i] = p.Nominal
		}
		for j, i := range s.free {
			p := s.params[i]
			out[i] = calc.Quantity{V: p.Nominal.V * complex(1+u[j]*p.Tol/100, 0), Dim: p.Nominal.Dim, Kind: p.Nominal.Kind}
		}
		return out
	}
	r.AtMagMin, r.AtMagMax = at(s.bestAt[0]), at(s.bestAt[1])
	notes := []string{SampledLabel,
		strconv.Itoa(s.evals) + " evaluations: " + method + ", then coordinate-wise golden-section refinement of the best samples"}
	if s.hasAng {
		lo, hi := s.best[2], -s.best[3]
		r.AngMin = angle(rad(s.nomAng + lo))
		r.AngMax = angle(rad(s.nomAng + hi))
		r.AngSpan = calc.Angle(rad(hi - lo))
		r.Wraps = s.nomAng+lo <= -180 || s.nomAng+hi > 180
		r.AtAngMin, r.AtAngMax = at(s.bestAt[2]), at(s.bestAt[3])
		if r.Wraps {
			notes = append(notes, "the angle range crosses ±180°: it runs from ang_min up through 180° to ang_max")
		}
		if hi-lo > 170 {
			notes = append(notes, "the angle spreads widely; a spread near a full turn cannot be told apart from a wrap")
		}
	} else {
		notes = append(notes, "the result is zero everywhere sampled: no angle")
	}
	if s.failed > 0 {
		notes = append(notes, strconv.Itoa(s.failed)+" points gave no result and were skipped")
	}
	st := calc.Step{
		Kind:    "tolerance",
		Rule:    "range of the magnitude and angle over the tolerance box (corners, dense sample, local refinement)",
		Formula: "value = nominal·(1 + t/100), −tol ≤ t ≤ +tol for each parameter",
		Results: []calc.Operand{op("nominal", r.Nominal), op("mag_min", r.MagMin), op("mag_max", r.MagMax)},
		Notes:   notes,
	}
	if s.hasAng {
		st.Results = append(st.Results, op("ang_min", r.AngMin), op("ang_max", r.AngMax), op("ang_span", r.AngSpan))
	}
	for _, p := range s.params {
		st.Inputs = append(st.Inputs, op(p.Name, p.Nominal), op(p.Name+" tol %", num(p.Tol)))
	}
	rows := []struct {
		name string
		v    []calc.Quantity
	}{{"at mag_min", r.AtMagMin}, {"at mag_max", r.AtMagMax}, {"at ang_min", r.AtAngMin}, {"at ang_max", r.AtAngMax}}
	for _, row := range rows {
		if row.v == nil {
			continue
		}
		cr := calc.Row{Name: row.name}
		for i, p := range s.params {
			cr.Values = append(cr.Values, op(p.Name, row.v[i]))
		}
		st.Rows = append(st.Rows, cr)
	}
	r.Steps = []calc.Step{st}
	if err := checkSteps(r.Steps); err != nil {
		return RangeResult{}, err
	}
	return r, nil
}

// magKind is the display kind of a magnitude: |S| of a complex power is
// an apparent power.
func magKind(k calc.Kind) calc.Kind {
	if k == calc.KindAngle {
		return k
	}
	return calc.KindMagnitude
}

// Overlap is the verdict on a measured value against a tolerance range.
type Overlap struct {
	Overlaps bool
	// Reading is the meter's reading as what a meter shows: a magnitude
	// (an RMS value, or peak under peak basis) with no angle.
	Reading   calc.Quantity
	Low, High calc.Quantity // the band the true value may lie in, from the reading and the accuracy
	// Miss is the gap between that band and the range the parts allow,
	// zero when they overlap; MissPct is the gap in per cent of the
	// nearer range limit.
	Miss    calc.Quantity
	MissPct float64
	Step    calc.Step
}

// CheckReading asks whether a reading, widened by its instrument accuracy,
// overlaps the magnitude range r allows, and by how much it misses. The
// reading's magnitude is compared; its unit must match the range's.
func CheckReading(reading calc.Quantity, acc Accuracy, r RangeResult) (Overlap, error) {
	if reading.Dim != r.MagMin.Dim {
		return Overlap{}, errf("the reading is in %s but the range is in %s", calc.DimName(reading.Dim, false), calc.DimName(r.MagMin.Dim, false))
	}
	if err := finiteC("reading", reading.V); err != nil {
		return Overlap{}, err
	}
	m := cmplx.Abs(reading.V)
	hw, err := acc.HalfWidth(m)
	if err != nil {
		return Overlap{}, err
	}
	lo, hi := math.Max(0, m-hw), m+hw
	rmin, rmax := real(r.MagMin.V), real(r.MagMax.V)
	k := magKind(reading.Kind)
	o := Overlap{
		Reading: calc.Quantity{V: complex(m, 0), Dim: reading.Dim, Kind: k},
		Low:     calc.Quantity{V: complex(lo, 0), Dim: reading.Dim, Kind: k},
		High:    calc.Quantity{V: complex(hi, 0), Dim: reading.Dim, Kind: k},
	}
	var gap, ref float64
	switch {
	case hi < rmin:
		gap, ref = rmin-hi, rmin
	case lo > rmax:
		gap, ref = lo-rmax, rmax
	default:
		o.Overlaps = true
	}
	o.Miss = calc.Quantity{V: complex(gap, 0), Dim: reading.Dim, Kind: k}
	if gap > 0 && ref > 0 {
		o.MissPct = gap / ref * 100
	}
	verdict := "the reading band overlaps the range the parts allow"
	if !o.Overlaps {
		side := "below"
		if lo > rmax {
			side = "above"
		}
		verdict = "the reading band lies " + side + " the range the parts allow, missing by " + calc.Format{}.Mag(gap, reading.Dim, k) + " (" + sig(o.MissPct) + " % of the nearer limit)"
	}
	o.Step = calc.Step{
		Kind:    "tolerance",
		Rule:    "does the reading, with its instrument accuracy, overlap the allowed range?",
		Formula: "band = |reading| ± (pct/100·|reading| + digits·resolution); compare with [mag_min, mag_max]",
		Inputs: []calc.Operand{op("reading", o.Reading), op("accuracy %", num(acc.Pct)), op("digits", num(acc.Digits)),
			op("resolution", rq(acc.Resolution, reading.Dim)), op("mag_min", r.MagMin), op("mag_max", r.MagMax)},
		Results: []calc.Operand{op("miss", o.Miss), op("low", o.Low), op("high", o.High), op("miss %", num(o.MissPct))},
		Notes:   []string{verdict, "the allowed range is " + SampledLabel},
	}
	return o, nil
}
