package sheet

import (
	"fmt"
	"math"
	"math/cmplx"
	"strconv"
	"strings"
	"unicode/utf8"

	"argand/calc"
	"argand/reduce/site"
)

// Default tolerances of a check statement with no "within": a hand
// calculation carried to four figures agrees to about 0.1 %.
const (
	defaultRelTol = 0.001
	defaultDegTol = 0.1
)

// stmtCheck runs
//
//	check EXPR is EXPR [within TOL [and ANGLE]]
//	check EXPR reads VALUE [within P% [+ N digits of RESOLUTION]]
//
// The first compares a result with a hand-calculated value: TOL written
// with % is relative to the expected magnitude, otherwise it is absolute
// in the value's unit (on the complex difference); ANGLE bounds the angle
// difference (degrees when bare). The second asks whether a meter reading,
// widened by its accuracy, overlaps the range the parts' tolerances allow.
func (s *Sheet) stmtCheck(p *calc.Parser) error {
	p.Next()
	if p.Peek().Tok == calc.TokEOF {
		return perr(p, "check needs a value: check NAME is VALUE within 1%%")
	}
	lhs := p.Expr()
	if p.Err() != nil {
		return p.Err()
	}
	if p.IsWord("reads") {
		return s.checkReading(p, lhs)
	}
	rhs, tolE, angE, err := readCheckIs(p)
	if err != nil {
		return err
	}
	got, err := s.eval(p, lhs)
	if err != nil {
		return err
	}
	want, err := s.eval(p, rhs)
	if err != nil {
		return err
	}
	g, w := got.Value, want.Value
	if err := s.comparable(p, rhs, g, w); err != nil {
		return err
	}
	tol, err := s.checkTolerance(p, tolE, angE, w)
	if err != nil {
		return err
	}
	out, err := s.judge(p, rhs, g, w, tol)
	if err != nil {
		return err
	}
	if out.Pass {
		s.pass++
	} else {
		s.fail++
	}
	st := calc.Step{Kind: "check", Source: p.Source(), Rule: "check against a hand-calculated value",
		Formula: "difference = got − expected", Inputs: []calc.Operand{{Name: p.Text(lhs), Value: g}}, Check: out}
	s.record(st)
	return nil
}

// readCheckIs reads the rest of "check EXPR is EXPR [within TOL [and
// ANGLE]]" after the first expression, to the end of the line, so that a
// typing error is reported before anything is evaluated.
func readCheckIs(p *calc.Parser) (rhs, tolE, angE calc.Expr, err error) {
	if !expectWord(p, "is", "check") {
		return nil, nil, nil, p.Err()
	}
	if p.Peek().Tok == calc.TokEOF {
		return nil, nil, nil, perr(p, "check: the expected value is missing after 'is'")
	}
	rhs = p.Expr()
	if p.Err() == nil && p.IsWord("within") {
		p.Next()
		if p.Peek().Tok == calc.TokEOF {
			return nil, nil, nil, perr(p, "check: the tolerance is missing after 'within'")
		}
		tolE = p.Expr()
		if p.Err() == nil && p.IsWord("and") {
			p.Next()
			if p.Peek().Tok == calc.TokEOF {
				return nil, nil, nil, perr(p, "check: the angle tolerance is missing after 'and'")
			}
			angE = p.Expr()
		}
	}
	p.ExpectEnd()
	if err := p.Err(); err != nil {
		return nil, nil, nil, err
	}
	return rhs, tolE, angE, nil
}

// comparable refuses a check between values of different units or, for
// powers, of different kinds: active, reactive and apparent power share a
// unit dimension but are not the same quantity, so comparing them would
// pass or fail by accident.
func (s *Sheet) comparable(p *calc.Parser, rhs calc.Expr, g, w calc.Quantity) error {
	if g.Dim != w.Dim {
		_, _, col := rhs.Span()
		return lineErr(s.line, col, width(p, rhs), "check compares %s with %s: the units differ", calc.DimName(g.Dim, false), calc.DimName(w.Dim, false))
	}
	if g.Dim == calc.DimPower && calc.QuantityName(g) != calc.QuantityName(w) {
		_, _, col := rhs.Span()
		return lineErr(s.line, col, width(p, rhs), "check compares %s with %s: the kinds differ (IEC 60050-131); compare like with like, as re(x) for P, im(x) for Q, mag(x) for |S|",
			calc.QuantityWord(g), calc.QuantityWord(w))
	}
	return nil
}

// checkTol is the tolerance of a check as it applies: relative (rel ≥ 0)
// or absolute (abs ≥ 0, rel < 0), and the angle bound in degrees.
type checkTol struct {
	rel, abs float64
	degTol   float64
	// angleGiven is set when the statement bounds the angle itself
	// (and ANGLE); angle when it has an angle tolerance expression.
	angleGiven, angle bool
	relGiven          bool // the tolerance was written, not the default
	text              string
}

// checkTolerance evaluates a check's tolerances against the expected
// value w, the defaults standing in for those not written.
func (s *Sheet) checkTolerance(p *calc.Parser, tolE, angE calc.Expr, w calc.Quantity) (checkTol, error) {
	tol := checkTol{rel: defaultRelTol, abs: -1, degTol: -1, text: "0.1% (default)", relGiven: tolE != nil, angle: angE != nil}
	if tolE != nil {
		t, err := s.eval(p, tolE)
		if err != nil {
			return tol, err
		}
		tol.text = p.Text(tolE)
		_, _, col := tolE.Span()
		q := t.Value
		if !q.IsReal() || real(q.V) < 0 {
			return tol, lineErr(s.line, col, width(p, tolE), "a tolerance is a real value of 0 or more")
		}
		if isPercent(tolE) {
			tol.rel = real(q.V)
		} else {
			if q.Dim != w.Dim {
				return tol, lineErr(s.line, col, width(p, tolE), "an absolute tolerance takes the unit of the value (%s); write a relative one with %%", calc.DimName(w.Dim, false))
			}
			tol.abs, tol.rel = real(q.V), -1
		}
	}
	if angE != nil {
		deg, err := s.angleTolerance(p, angE)
		if err != nil {
			return tol, err
		}
		tol.degTol = deg
		tol.text += " and " + p.Text(angE)
	}
	tol.angleGiven = tol.degTol >= 0
	if tol.degTol < 0 {
		// a relative tolerance alone bounds the angle alike: a phasor within
		// rel of the expected magnitude may turn by about rel radians
		tol.degTol = defaultDegTol
		if tol.rel >= 0 && tolE != nil {
			tol.degTol = tol.rel * 180 / math.Pi
		}
	}
	return tol, nil
}

// angleTolerance evaluates a check's angle tolerance in degrees: an angle
// with its unit, or a bare number in the worksheet's angle unit.
func (s *Sheet) angleTolerance(p *calc.Parser, angE calc.Expr) (float64, error) {
	t, err := s.eval(p, angE)
	if err != nil {
		return 0, err
	}
	_, _, col := angE.Span()
	q := t.Value
	if !q.Dim.IsDimensionless() || !q.IsReal() || real(q.V) < 0 {
		return 0, lineErr(s.line, col, width(p, angE), "an angle tolerance is an angle of 0 or more, such as 0.5°")
	}
	deg := real(q.V)
	if q.Kind == calc.KindAngle {
		deg = real(q.V) * 180 / math.Pi
	} else if s.ctx.Format.Radians {
		deg = real(q.V) * 180 / math.Pi
	}
	return deg, nil
}

// tolDescription says exactly what a check compares: a signed real by its
// value, a phasor by magnitude and angle, with the angle tolerance used
// and where it came from.
func tolDescription(tol checkTol, scalar bool, w calc.Quantity) string {
	switch {
	case scalar:
		return tol.text + " on the value (" + strings.ReplaceAll(calc.QuantityName(w), "-", " ") + ": no angle to compare)"
	case tol.rel >= 0 && !tol.angleGiven:
		how := "the default"
		if tol.relGiven {
			how = "the relative tolerance taken as radians"
		}
		return tol.text + " on the magnitude and ±" + strconv.FormatFloat(tol.degTol, 'g', 3, 64) + "° on the angle (" + how + ")"
	case tol.rel >= 0:
		return tol.text + " (magnitude, then angle)"
	case tol.angleGiven:
		return tol.text + " (|got − expected|, then angle)"
	}
	return tol.text + " on |got − expected|, which covers magnitude and angle together"
}

// judge compares got with the expected value under the tolerance. A
// relative tolerance of a zero expected value is refused: it would allow
// nothing but an exact zero.
func (s *Sheet) judge(p *calc.Parser, rhs calc.Expr, g, w calc.Quantity, tol checkTol) (*calc.CheckOutcome, error) {
	scalar := g.Scalar() && w.Scalar()
	mg, mw := cmplx.Abs(g.V), cmplx.Abs(w.V)
	diff := calc.Quantity{V: g.V - w.V, Dim: w.Dim, Kind: w.Kind}
	out := &calc.CheckOutcome{Got: g, Want: w, Diff: diff, Tolerance: tolDescription(tol, scalar, w)}
	if mw != 0 {
		out.RelMag = mg/mw - 1
	}
	out.DegDiff = calc.NormDeg(calc.Deg(g.V) - calc.Deg(w.V))
	angleOK := func() bool {
		// an angle means nothing at zero magnitude
		return mg == 0 || mw == 0 || math.Abs(out.DegDiff) <= tol.degTol*(1+1e-12)
	}
	zero := func() error {
		_, _, col := rhs.Span()
		return lineErr(s.line, col, width(p, rhs), "the expected value is 0: give an absolute tolerance, such as within 0.001 %s", calc.UnitSymbol(w.Dim, w.Kind, false))
	}
	switch {
	case scalar:
		d := math.Abs(real(g.V) - real(w.V))
		if tol.rel >= 0 {
			out.Pass = d <= tol.rel*math.Abs(real(w.V))*(1+1e-12)
			if w.V == 0 {
				return nil, zero()
			}
			out.RelMag = real(g.V)/real(w.V) - 1
		} else {
			out.Pass = d <= tol.abs*(1+1e-12)
		}
		out.DegDiff = 0
		out.Scalar = true
	case tol.rel >= 0:
		if mw == 0 {
			return nil, zero()
		}
		out.Pass = math.Abs(mg-mw) <= tol.rel*mw*(1+1e-12) && angleOK()
	default:
		out.Pass = cmplx.Abs(g.V-w.V) <= tol.abs*(1+1e-12) && (!tol.angle || angleOK())
	}
	return out, nil
}

// width is the length in characters of an expression as typed, at least
// 1, for an error that underlines it.
func width(p *calc.Parser, e calc.Expr) int {
	pos, end, _ := e.Span()
	return max(1, utf8.RuneCountInString(p.Source()[pos:end]))
}

// isPercent reports a tolerance written with the % sign.
func isPercent(e calc.Expr) bool {
	if pe, ok := e.(*calc.Paren); ok {
		return isPercent(pe.X)
	}
	l, ok := e.(*calc.Lit)
	return ok && l.Unit == "%"
}

// checkReading handles: check EXPR reads VALUE [within P% [+ N digits of RES]].
func (s *Sheet) checkReading(p *calc.Parser, lhs calc.Expr) error {
	readE, acc, resE, err := readMeter(p)
	if err != nil {
		return err
	}
	reading, err := s.eval(p, readE)
	if err != nil {
		return err
	}
	if resE != nil {
		r, err := s.eval(p, resE)
		if err != nil {
			return err
		}
		if r.Value.Dim != reading.Value.Dim || !r.Value.IsReal() {
			_, _, col := resE.Span()
			return lineErr(s.line, col, width(p, resE), "the resolution is a real value in the reading's unit (%s)", calc.DimName(reading.Value.Dim, false))
		}
		acc.Resolution = real(r.Value.V)
	}
	if s.dry {
		if _, err := s.eval(p, lhs); err != nil {
			return err
		}
		return nil
	}
	rr, err := s.spreadOf(p, lhs)
	if err != nil {
		return err
	}
	ov, err2 := site.CheckReading(reading.Value, acc, rr)
	if err2 != nil {
		_, _, col := readE.Span()
		return lineErr(s.line, col, width(p, readE), "%v", err2)
	}
	s.recordPart(p.Source(), rr.Steps)
	s.record(s.readingStep(p, reading.Value, rr, ov))
	return nil
}

// readMeter reads "reads VALUE [within P% [+ N digits of RES]]" to the
// end of the line: the reading, the meter's accuracy, and the resolution
// still to be evaluated.
func readMeter(p *calc.Parser) (readE calc.Expr, acc site.Accuracy, resE calc.Expr, err error) {
	p.Next() // reads
	if p.Peek().Tok == calc.TokEOF {
		return nil, acc, nil, perr(p, "check … reads: the meter reading is missing")
	}
	readE = p.Expr()
	if p.Err() == nil && p.IsWord("within") {
		p.Next()
		t := p.Next()
		if t.Tok != calc.TokNumber || !p.IsWord("%") {
			p.Failf(t, "a meter accuracy is written P%% [+ N digits of RESOLUTION], as in within 1%% + 2 digits of 0.1 V")
			return nil, acc, nil, p.Err()
		}
		p.Next()
		acc.Pct, _ = strconv.ParseFloat(t.Text, 64)
		if p.IsOp("+") {
			p.Next()
			d := p.Next()
			if d.Tok != calc.TokNumber {
				p.Failf(d, "expected a number of digits (counts) after +")
				return nil, acc, nil, p.Err()
			}
			acc.Digits, _ = strconv.ParseFloat(d.Text, 64)
			if !expectWord(p, "digits", "accuracy") || !expectWord(p, "of", "accuracy") {
				return nil, acc, nil, p.Err()
			}
			resE = p.Expr()
		}
	}
	p.ExpectEnd()
	if err := p.Err(); err != nil {
		return nil, acc, nil, err
	}
	return readE, acc, resE, nil
}

// readingStep is the step of a reading check, counted as passed when the
// reading, widened by the meter's accuracy, overlaps the parts' range.
func (s *Sheet) readingStep(p *calc.Parser, reading calc.Quantity, rr site.RangeResult, ov site.Overlap) calc.Step {
	st := ov.Step
	st.Source = p.Source()
	if st.Kind == "" {
		st.Kind = "check"
	}
	if ov.Overlaps {
		s.pass++
	} else {
		s.fail++
	}
	st.Check = &calc.CheckOutcome{Pass: ov.Overlaps, MagOnly: true, Got: ov.Reading, Want: rr.Nominal, Diff: ov.Miss,
		Tolerance: fmt.Sprintf("parts' tolerance range %s … %s (%s)", s.ctx.Format.Mag(real(rr.MagMin.V), rr.MagMin.Dim, rr.MagMin.Kind), s.ctx.Format.Mag(real(rr.MagMax.V), rr.MagMax.Dim, rr.MagMax.Kind), site.SampledLabel)}
	if rr.Nominal.V != 0 {
		st.Check.RelMag = cmplx.Abs(reading.V)/cmplx.Abs(rr.Nominal.V) - 1
	}
	return st
}
