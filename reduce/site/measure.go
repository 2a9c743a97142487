package site

import (
	"math"
	"math/cmplx"

	"argand/calc"
)

// Components are the equivalent circuits implied by a measurement at one
// frequency. The series form is Z = Rs + jXs; the parallel form is Rs‖jXs
// replaced by Rp in parallel with jXp, drawing the same P and Q. A reactance
// is positive for an inductance (X = ωL) and negative for a capacitance
// (X = −1/(ωC)).
type Components struct {
	V, I   calc.Quantity // magnitudes, V and A (RMS)
	Phi    calc.Quantity // angle of V relative to I, positive when I lags
	P, Q   calc.Quantity // real power (W) and reactive power (var)
	S      calc.Quantity // apparent power |S| (VA)
	PF     calc.Quantity // power factor cos φ, a plain number
	Z      calc.Quantity // series equivalent impedance Rs + jXs
	Rs     calc.Quantity
	Xs     calc.Quantity
	Rp     calc.Quantity // zero when RpOpen
	Xp     calc.Quantity // zero when XpOpen
	RpOpen bool          // P = 0: the parallel resistance is an open circuit
	XpOpen bool          // Q = 0: the parallel reactance is an open circuit
	// Series and parallel L or C implied at the working frequency; each is
	// zero when the reactance is zero (or open) or of the other sign.
	Ls, Cs, Lp, Cp calc.Quantity
	Freq           calc.Quantity // working frequency, Hz
	Steps          []calc.Step
	Notes          []string
}

// Operands lists the results by name, skipping those that do not exist
// (an open parallel branch, an L where the load is capacitive).
func (c *Components) Operands() []calc.Operand {
	ops := []calc.Operand{op("Z", c.Z), op("Rs", c.Rs), op("Xs", c.Xs)}
	if !c.RpOpen {
		ops = append(ops, op("Rp", c.Rp))
	}
	if !c.XpOpen {
		ops = append(ops, op("Xp", c.Xp))
	}
	for _, o := range []calc.Operand{op("Ls", c.Ls), op("Cs", c.Cs), op("Lp", c.Lp), op("Cp", c.Cp)} {
		if o.Value.V != 0 {
			ops = append(ops, o)
		}
	}
	s := calc.Quantity{V: complex(real(c.P.V), real(c.Q.V)), Dim: calc.DimPower, Kind: calc.KindApparent}
	return append(ops, op("P", c.P), op("Q", c.Q), op("S", s), op("Sa", c.S), op("pf", c.PF), op("phi", c.Phi))
}

// FromVIAngle returns the equivalent components of a load from RMS readings
// of voltage v (V) and current i (A), the angle phi (radians) by which the
// voltage leads the current (positive for an inductive, lagging load), and
// the working frequency f (Hz). |phi| > 90° means the load delivers real
// power, which a passive load cannot: the error says so.
func FromVIAngle(v, i, phi, f float64) (Components, error) {
	if err := positive("V", v); err != nil {
		return Components{}, err
	}
	if err := positive("I", i); err != nil {
		return Components{}, err
	}
	if err := positive("frequency", f); err != nil {
		return Components{}, err
	}
	if err := finite([]string{"phase angle"}, phi); err != nil {
		return Components{}, err
	}
	phi = normRad(phi)
	if math.Abs(phi) > math.Pi/2 {
		return Components{}, errf("phase angle %.4g° is beyond ±90°: the load would deliver real power; check the CT or lead orientation", deg(phi))
	}
	s := v * i
	p := s * math.Cos(phi)
	q := s * math.Sin(phi)
	if math.Abs(phi) == math.Pi/2 {
		p = 0
	}
	st := calc.Step{
		Kind:    "measure",
		Rule:    "power from V, I and the phase angle",
		Formula: "S = V·I, P = V·I·cos φ, Q = V·I·sin φ",
		Inputs:  []calc.Operand{op("V", rq(v, calc.DimVoltage)), op("I", rq(i, calc.DimCurrent)), op("φ", angle(phi))},
		Results: []calc.Operand{op("P", power(p, calc.KindActive)), op("Q", power(q, calc.KindReactive)), op("S", power(s, calc.KindApparent))},
	}
	return components(v, i, p, q, f, []calc.Step{st}, nil)
}

// FromVIP returns the equivalent components from RMS voltage v (V), current
// i (A) and real power p (W). These give only |Q| = √(S² − P²), so the user
// states whether the current lags (inductive) or leads (capacitive).
// P > V·I is reported as ErrInconsistentPower.
func FromVIP(v, i, p float64, lagging bool, f float64) (Components, error) {
	if err := positive("V", v); err != nil {
		return Components{}, err
	}
	if err := positive("I", i); err != nil {
		return Components{}, err
	}
	if err := positive("frequency", f); err != nil {
		return Components{}, err
	}
	if err := finite([]string{"P"}, p); err != nil {
		return Components{}, err
	}
	if p < 0 {
		return Components{}, errf("P is negative (%g W): the load would deliver real power; check the wattmeter connections", p)
	}
	s := v * i
	var notes []string
	// A reading equal to V·I within rounding is a resistive load; anything
	// clearly above is a wrong reading.
	if p > s {
		if p > s*(1+1e-12) {
			return Components{}, ErrInconsistentPower
		}
		p = s
	}
	// (S − P)(S + P) keeps accuracy when P is close to S.
	q := math.Sqrt((s - p) * (s + p))
	if !lagging {
		q = -q
	}
	dir := "lagging (inductive), as stated"
	if !lagging {
		dir = "leading (capacitive), as stated"
	}
	st := calc.Step{
		Kind:    "measure",
		Rule:    "reactive power from V, I and P; the sign of Q is " + dir,
		Formula: "S = V·I, |Q| = √((S − P)·(S + P))",
		Inputs:  []calc.Operand{op("V", rq(v, calc.DimVoltage)), op("I", rq(i, calc.DimCurrent)), op("P", power(p, calc.KindActive))},
		Results: []calc.Operand{op("Q", power(q, calc.KindReactive)), op("S", power(s, calc.KindApparent))},
		Notes:   []string{"V, I and P fix only |Q|; the sign comes from the stated lagging or leading"},
	}
	return components(v, i, p, q, f, []calc.Step{st}, notes)
}

// FromPF returns the equivalent components from real power p (W), power
// factor pf (0 < pf ≤ 1) and RMS voltage v (V), lagging or leading.
func FromPF(p, pf, v float64, lagging bool, f float64) (Components, error) {
	if err := positive("P", p); err != nil {
		return Components{}, err
	}
	if err := positive("power factor", pf); err != nil {
		return Components{}, err
	}
	if pf > 1 {
		if pf > 1+1e-12 {
			return Components{}, errf("power factor %g is above 1: a power factor lies in (0, 1]", pf)
		}
		pf = 1
	}
	if err := positive("V", v); err != nil {
		return Components{}, err
	}
	if err := positive("frequency", f); err != nil {
		return Components{}, err
	}
	s := p / pf
	i := s / v
	q := math.Sqrt((s - p) * (s + p))
	if !lagging {
		q = -q
	}
	st := calc.Step{
		Kind:    "measure",
		Rule:    "apparent power and current from P, power factor and V",
		Formula: "S = P/pf, I = S/V, |Q| = √(S² − P²)",
		Inputs:  []calc.Operand{op("P", power(p, calc.KindActive)), op("pf", num(pf)), op("V", rq(v, calc.DimVoltage))},
		Results: []calc.Operand{op("S", power(s, calc.KindApparent)), op("I", rq(i, calc.DimCurrent)), op("Q", power(q, calc.KindReactive))},
	}
	return components(v, i, p, q, f, []calc.Step{st}, nil)
}

// components finishes the work shared by the three entry points: the series
// equivalent Rs = P/I², Xs = Q/I²; the parallel equivalent Rp = V²/P,
// Xp = V²/Q; and the inductance or capacitance each reactance implies.
func components(v, i, p, q, f float64, steps []calc.Step, notes []string) (Components, error) {
	w := calc.Context{Freq: f}.Omega()
	s := math.Hypot(p, q)
	phi := math.Atan2(q, p)
	c := Components{
		V:    kq(v, calc.DimVoltage, calc.KindMagnitude),
		I:    kq(i, calc.DimCurrent, calc.KindMagnitude),
		Phi:  angle(phi),
		P:    power(p, calc.KindActive),
		Q:    power(q, calc.KindReactive),
		S:    power(s, calc.KindApparent),
		PF:   num(p / s),
		Freq: rq(f, calc.DimFrequency),
	}
	i2 := i * i
	rs, xs := p/i2, q/i2
	c.Rs = kq(rs, calc.DimImpedance, calc.KindResistive)
	c.Xs = kq(xs, calc.DimImpedance, calc.KindSigned)
	c.Z = cq(complex(rs, xs), calc.DimImpedance)
	steps = append(steps, calc.Step{
		Kind:    "measure",
		Rule:    "series equivalent: the resistance and reactance that carry I and take P and Q",
		Formula: "Rs = P/I², Xs = Q/I², Z = Rs + jXs (|Z| = V/I)",
		Inputs:  []calc.Operand{op("P", c.P), op("Q", c.Q), op("I", c.I)},
		Results: []calc.Operand{op("Z", c.Z), op("Rs", c.Rs), op("Xs", c.Xs)},
	})
	par := calc.Step{
		Kind:    "measure",
		Rule:    "parallel equivalent: the resistance and reactance that, across V, take P and Q",
		Formula: "Rp = V²/P, Xp = V²/Q",
		Inputs:  []calc.Operand{op("V", c.V), op("P", c.P), op("Q", c.Q)},
	}
	v2 := v * v
	if p == 0 {
		c.RpOpen = true
		par.Notes = append(par.Notes, "P = 0: no parallel resistance (open circuit)")
	} else {
		c.Rp = kq(v2/p, calc.DimImpedance, calc.KindResistive)
		par.Results = append(par.Results, op("Rp", c.Rp))
	}
	if q == 0 {
		c.XpOpen = true
		par.Notes = append(par.Notes, "Q = 0: no parallel reactance (open circuit)")
	} else {
		c.Xp = kq(v2/q, calc.DimImpedance, calc.KindSigned)
		par.Results = append(par.Results, op("Xp", c.Xp))
	}
	steps = append(steps, par)
	lc := calc.Step{
		Kind:    "measure",
		Rule:    "inductance or capacitance implied by each reactance at the working frequency",
		Formula: "X = ωL → L = X/ω;  X = −1/(ωC) → C = −1/(ω·X);  ω = 2π·f",
		Inputs:  []calc.Operand{op("f", c.Freq), op("Xs", c.Xs)},
	}
	if !c.XpOpen {
		lc.Inputs = append(lc.Inputs, op("Xp", c.Xp))
	}
	switch {
	case q > 0:
		c.Ls = rq(xs/w, calc.DimInductance)
		c.Lp = rq(v2/q/w, calc.DimInductance)
		lc.Results = []calc.Operand{op("Ls", c.Ls), op("Lp", c.Lp)}
		lc.Notes = []string{"inductive: the current lags the voltage"}
	case q < 0:
		c.Cs = rq(-1/(w*xs), calc.DimCapacitance)
		c.Cp = rq(-q/(w*v2), calc.DimCapacitance)
		lc.Results = []calc.Operand{op("Cs", c.Cs), op("Cp", c.Cp)}
		lc.Notes = []string{"capacitive: the current leads the voltage"}
	default:
		lc.Notes = []string{"purely resistive: no L or C"}
	}
	steps = append(steps, lc)
	c.Steps = steps
	c.Notes = notes
	if err := checkSteps(steps); err != nil {
		return Components{}, err
	}
	if err := checkOps(c.Operands()); err != nil {
		return Components{}, err
	}
	return c, nil
}

// ImpedanceReadings returns the voltage, current, real and reactive power a
// meter would read with an RMS current i (A) through impedance z (Ω): the
// forward direction of FromVIP, for checks and round trips.
func ImpedanceReadings(z complex128, i float64) (v, p, q float64) {
	return cmplx.Abs(z) * i, real(z) * i * i, imag(z) * i * i
}
