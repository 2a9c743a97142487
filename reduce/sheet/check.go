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
	kw := p.Next()
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
	if !expectWord(p, "is", "check") {
		return p.Err()
	}
	if p.Peek().Tok == calc.TokEOF {
		return perr(p, "check: the expected value is missing after 'is'")
	}
	rhs := p.Expr()
	var tolE, angE calc.Expr
	if p.Err() == nil && p.IsWord("within") {
		p.Next()
		if p.Peek().Tok == calc.TokEOF {
			return perr(p, "check: the tolerance is missing after 'within'")
		}
		tolE = p.Expr()
		if p.Err() == nil && p.IsWord("and") {
			p.Next()
			if p.Peek().Tok == calc.TokEOF {
				return perr(p, "check: the angle tolerance is missing after 'and'")
			}
			angE = p.Expr()
		}
	}
	p.ExpectEnd()
	if err := p.Err(); err != nil {
		return err
	}
	_ = kw
	got, err := s.eval(p, lhs)
	if err != nil {
		return err
	}
	want, err := s.eval(p, rhs)
	if err != nil {
		return err
	}
	g, w := got.Value, want.Value
	if g.Dim != w.Dim {
		_, _, col := rhs.Span()
		return lineErr(s.line, col, width(p, rhs), "check compares %s with %s: the units differ", calc.DimName(g.Dim, false), calc.DimName(w.Dim, false))
	}
	if g.Dim == calc.DimPower && calc.QuantityName(g) != calc.QuantityName(w) {
		_, _, col := rhs.Span()
		return lineErr(s.line, col, width(p, rhs), "check compares %s with %s: the kinds differ (IEC 60050-131); compare like with like, as re(x) for P, im(x) for Q, mag(x) for |S|",
			calc.QuantityWord(g), calc.QuantityWord(w))
	}
	scalar := g.Scalar() && w.Scalar()
	rel, abs := defaultRelTol, -1.0
	tolText := "0.1% (default)"
	degTol := -1.0
	if tolE != nil {
		t, err := s.eval(p, tolE)
		if err != nil {
			return err
		}
		tolText = p.Text(tolE)
		_, _, col := tolE.Span()
		q := t.Value
		if !q.IsReal() || real(q.V) < 0 {
			return lineErr(s.line, col, width(p, tolE), "a tolerance is a real value of 0 or more")
		}
		if isPercent(tolE) {
			rel = real(q.V)
		} else {
			if q.Dim != w.Dim {
				return lineErr(s.line, col, width(p, tolE), "an absolute tolerance takes the unit of the value (%s); write a relative one with %%", calc.DimName(w.Dim, false))
			}
			abs, rel = real(q.V), -1
		}
	}
	if angE != nil {
		t, err := s.eval(p, angE)
		if err != nil {
			return err
		}
		_, _, col := angE.Span()
		q := t.Value
		if !q.Dim.IsDimensionless() || !q.IsReal() || real(q.V) < 0 {
			return lineErr(s.line, col, width(p, angE), "an angle tolerance is an angle of 0 or more, such as 0.5°")
		}
		degTol = real(q.V)
		if q.Kind == calc.KindAngle {
			degTol = real(q.V) * 180 / math.Pi
		} else if s.ctx.Format.Radians {
			degTol = real(q.V) * 180 / math.Pi
		}
		tolText += " and " + p.Text(angE)
	}
	angleGiven := degTol >= 0
	if degTol < 0 {
		// a relative tolerance alone bounds the angle alike: a phasor within
		// rel of the expected magnitude may turn by about rel radians
		degTol = defaultDegTol
		if rel >= 0 && tolE != nil {
			degTol = rel * 180 / math.Pi
		}
	}
	// say exactly what is compared: a signed real by its value, a phasor
	// by magnitude and angle, with the angle tolerance used and where it
	// came from
	switch {
	case scalar:
		tolText += " on the value (" + strings.ReplaceAll(calc.QuantityName(w), "-", " ") + ": no angle to compare)"
	case rel >= 0 && !angleGiven:
		how := "the default"
		if tolE != nil {
			how = "the relative tolerance taken as radians"
		}
		tolText += " on the magnitude and ±" + strconv.FormatFloat(degTol, 'g', 3, 64) + "° on the angle (" + how + ")"
	case rel >= 0:
		tolText += " (magnitude, then angle)"
	case angleGiven:
		tolText += " (|got − expected|, then angle)"
	default:
		tolText += " on |got − expected|, which covers magnitude and angle together"
	}
	mg, mw := cmplx.Abs(g.V), cmplx.Abs(w.V)
	diff := calc.Quantity{V: g.V - w.V, Dim: w.Dim, Kind: w.Kind}
	out := &calc.CheckOutcome{Got: g, Want: w, Diff: diff, Tolerance: tolText}
	if mw != 0 {
		out.RelMag = mg/mw - 1
	}
	out.DegDiff = calc.NormDeg(calc.Deg(g.V) - calc.Deg(w.V))
	angleOK := func() bool {
		// an angle means nothing at zero magnitude
		return mg == 0 || mw == 0 || math.Abs(out.DegDiff) <= degTol*(1+1e-12)
	}
	if scalar {
		d := math.Abs(real(g.V) - real(w.V))
		if rel >= 0 {
			out.Pass = d <= rel*math.Abs(real(w.V))*(1+1e-12)
			if w.V == 0 {
				_, _, col := rhs.Span()
				return lineErr(s.line, col, width(p, rhs), "the expected value is 0: give an absolute tolerance, such as within 0.001 %s", calc.UnitSymbol(w.Dim, w.Kind, false))
			}
			out.RelMag = real(g.V)/real(w.V) - 1
		} else {
			out.Pass = d <= abs*(1+1e-12)
		}
		out.DegDiff = 0
		out.Scalar = true
	} else if rel >= 0 {
		if mw == 0 {
			_, _, col := rhs.Span()
			return lineErr(s.line, col, width(p, rhs), "the expected value is 0: give an absolute tolerance, such as within 0.001 %s", calc.UnitSymbol(w.Dim, w.Kind, false))
		}
		out.Pass = math.Abs(mg-mw) <= rel*mw*(1+1e-12) && angleOK()
	} else {
		out.Pass = cmplx.Abs(g.V-w.V) <= abs*(1+1e-12) && (angE == nil || angleOK())
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
	p.Next() // reads
	if p.Peek().Tok == calc.TokEOF {
		return perr(p, "check … reads: the meter reading is missing")
	}
	readE := p.Expr()
	var acc site.Accuracy
	var resE calc.Expr
	if p.Err() == nil && p.IsWord("within") {
		p.Next()
		t := p.Next()
		if t.Tok != calc.TokNumber || !p.IsWord("%") {
			p.Failf(t, "a meter accuracy is written P%% [+ N digits of RESOLUTION], as in within 1%% + 2 digits of 0.1 V")
			return p.Err()
		}
		p.Next()
		acc.Pct, _ = strconv.ParseFloat(t.Text, 64)
		if p.IsOp("+") {
			p.Next()
			d := p.Next()
			if d.Tok != calc.TokNumber {
				p.Failf(d, "expected a number of digits (counts) after +")
				return p.Err()
			}
			acc.Digits, _ = strconv.ParseFloat(d.Text, 64)
			if !expectWord(p, "digits", "accuracy") || !expectWord(p, "of", "accuracy") {
				return p.Err()
			}
			resE = p.Expr()
		}
	}
	p.ExpectEnd()
	if err := p.Err(); err != nil {
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
	st.Check = &calc.CheckOutcome{Pass: ov.Overlaps, MagOnly: true, Got: reading.Value, Want: rr.Nominal, Diff: ov.Miss,
		Tolerance: fmt.Sprintf("parts' tolerance range %s … %s (%s)", s.ctx.Format.Mag(real(rr.MagMin.V), rr.MagMin.Dim, rr.MagMin.Kind), s.ctx.Format.Mag(real(rr.MagMax.V), rr.MagMax.Dim, rr.MagMax.Kind), site.SampledLabel)}
	if rr.Nominal.V != 0 {
		st.Check.RelMag = cmplx.Abs(reading.Value.V)/cmplx.Abs(rr.Nominal.V) - 1
	}
	s.record(st)
	return nil
}
