package sheet

import (
	"fmt"
	"math/cmplx"
	"strconv"
	"unicode/utf8"

	"argand/calc"
	"argand/reduce/site"
	"argand/reduce/sweep"
)

// SweepResult is a finished sweep, kept for the app to draw.
type SweepResult struct {
	Source string
	Table  *sweep.Table
	DB     bool
	Ref    calc.Quantity // the dB reference when DB is set: levels are 20·log10(|x|/|Ref|)
}

// Sweeps returns the sweeps run so far.
func (s *Sheet) Sweeps() []*SweepResult { return s.sweeps }

// AtFrequency evaluates an expression with the working frequency set to
// hz, every frequency-dependent definition and network re-evaluated, and
// the worksheet itself unchanged.
//
// A definition the expression does not read may fail at this frequency (a
// tank elsewhere in the worksheet at its resonance) without failing the
// expression; one it does read passes its error on, with the cause kept
// (errors.Is(err, calc.ErrOpenCircuit)) so that a sweep can mark the point.
func (s *Sheet) AtFrequency(src string, e calc.Expr, hz float64) (calc.Quantity, error) {
	return s.Clone().evalAt(src, e, hz)
}

// evalAt sets the frequency of a copy of the worksheet (c must be a clone),
// re-evaluates what depends on it and evaluates e. A sweep reuses one copy
// for all its points: each point re-evaluates everything that depends on
// the frequency, so no value of the previous point survives.
func (c *Sheet) evalAt(src string, e calc.Expr, hz float64) (calc.Quantity, error) {
	c.ctx.Freq = hz
	c.lenient = map[string]error{}
	if _, err := c.propagate(map[string]bool{"f": true, "w": true, "ω": true}, ""); err != nil {
		return calc.Quantity{}, err
	}
	if err := c.broken(e); err != nil {
		return calc.Quantity{}, err
	}
	ev := c.evaluator(src, c.line)
	r, err := ev.Eval(e)
	if err != nil {
		return calc.Quantity{}, errPlain(err)
	}
	return r.Value, nil
}

// broken returns the error of a definition e reads, directly or through
// others, that failed to re-evaluate in a lenient propagation.
func (s *Sheet) broken(e calc.Expr) error {
	if len(s.lenient) == 0 {
		return nil
	}
	seen := map[string]bool{}
	for name := range depsOf(e) {
		if err := s.brokenUnder(name, 0, seen); err != nil {
			return err
		}
	}
	return nil
}

// brokenUnder returns the error of a definition that failed to re-evaluate
// in a lenient propagation, if name depends on one.
func (s *Sheet) brokenUnder(name string, depth int, seen map[string]bool) error {
	if err, ok := s.lenient[name]; ok && err != nil {
		return err
	}
	d, ok := s.byName[name]
	if !ok || depth > 10000 || seen[name] {
		return nil
	}
	seen[name] = true
	if d.owner != "" {
		if err := s.brokenUnder(d.owner, depth+1, seen); err != nil {
			return err
		}
	}
	for k := range d.deps {
		if k == name {
			continue
		}
		if err := s.brokenUnder(k, depth+1, seen); err != nil {
			return err
		}
	}
	return nil
}

// errPlain turns an evaluation error at a sweep point into a plain error
// that keeps its cause. The message already says the cause in words, so
// it is not repeated.
func errPlain(err *calc.Error) error {
	if err.Err != nil {
		return &pointError{msg: err.Msg, err: err.Err}
	}
	return err
}

// pointError is an evaluation error at one sweep point: its message, and
// its cause for errors.Is.
type pointError struct {
	msg string
	err error
}

func (e *pointError) Error() string { return e.msg }
func (e *pointError) Unwrap() error { return e.err }

// stmtSweep runs: sweep EXPR from F1 to F2 [points N] [log|linear] [db [ref R]].
// After the table it records what the sweep found (sweep.Find): extremes,
// resonances and half-power bands, each located between the points.
func (s *Sheet) stmtSweep(p *calc.Parser) error {
	p.Next()
	if p.Peek().Tok == calc.TokEOF {
		return perr(p, "sweep needs a value: sweep Zin from 10 Hz to 10 kHz")
	}
	e := p.Expr()
	if p.Err() != nil {
		return p.Err()
	}
	if !expectWord(p, "from", "sweep") {
		return p.Err()
	}
	f1E := p.Expr()
	if p.Err() != nil || !expectWord(p, "to", "sweep") {
		return p.Err()
	}
	f2E := p.Expr()
	n, logScale, db := 41, true, false
	given := false
	var refE calc.Expr
	for p.Err() == nil && p.Peek().Tok != calc.TokEOF {
		switch {
		case p.IsWord("points"):
			p.Next()
			t := p.Next()
			k, err := strconv.Atoi(t.Text)
			if t.Tok != calc.TokNumber || err != nil || k < 2 || k > s.limits.Points {
				p.Failf(t, "points takes a whole number from 2 to %d", s.limits.Points)
				return p.Err()
			}
			n = k
		case p.IsWord("log"):
			p.Next()
			logScale, given = true, true
		case p.IsWord("linear"):
			p.Next()
			logScale, given = false, true
		case p.IsWord("db"), p.IsWord("dB"):
			p.Next()
			db = true
			if p.IsWord("ref") {
				p.Next()
				if refE = p.Expr(); p.Err() != nil {
					return p.Err()
				}
			}
		default:
			return perr(p, "sweep options are points N, log, linear and db [ref R]; found %q", p.Peek().Text)
		}
	}
	if err := p.Err(); err != nil {
		return err
	}
	freq := func(x calc.Expr) (float64, error) {
		r, err := s.eval(p, x)
		if err != nil {
			return 0, err
		}
		_, _, col := x.Span()
		q := r.Value
		switch {
		case q.Dim == calc.DimFrequency && q.IsReal():
			return real(q.V), nil
		case q.Dim == calc.DimAngularFrequency && q.IsReal():
			return calc.HzOf(real(q.V)), nil
		}
		return 0, lineErr(s.line, col, width(p, x), "a sweep runs over frequencies in Hz or rad/s, not %s", calc.DimName(q.Dim, false))
	}
	a, err := freq(f1E)
	if err != nil {
		return err
	}
	b, err := freq(f2E)
	if err != nil {
		return err
	}
	if !given && a <= 0 {
		logScale = false
	}
	pts, err := sweep.Points(a, b, n, logScale)
	if err != nil {
		_, _, col := f1E.Span()
		return lineErr(s.line, col, width(p, f1E), "%v", err)
	}
	if msg := s.overBudget("this sweep", work{samples: len(pts), perSample: s.sampleCost([]string{"f", "w", "ω"}, e, s.needs(e))}, "points", "use fewer points"); msg != "" {
		return lineErr(s.line, 1, utf8.RuneCountInString(p.Source()), "%s", msg)
	}
	var ref calc.Quantity
	refText := ""
	if refE != nil {
		r, err := s.eval(p, refE)
		if err != nil {
			return err
		}
		ref, refText = r.Value, p.Text(refE)
	}
	if s.dry {
		// the value at the working frequency stands for the sweep
		if _, err := s.eval(p, e); err != nil {
			return err
		}
		return nil
	}
	src := p.Source()
	c := s.sampler()
	c.restrict(e)
	done := 0
	tab, err := sweep.Run(pts, func(hz float64) (calc.Quantity, error) {
		if err := c.stopped(); err != nil {
			return calc.Quantity{}, err
		}
		v, err := c.evalAt(src, e, hz)
		done++
		s.progress(done, len(pts))
		return v, err
	})
	if err != nil {
		_, _, col := e.Span()
		return lineErr(s.line, col, width(p, e), "%v", err)
	}
	var dbs []float64
	var hasDB []bool
	plotTab := tab
	if db {
		if refE == nil {
			if !tab.Dim.IsDimensionless() {
				return perr(p, "a level in dB is a ratio to a stated reference: write db ref 1 %s", calc.UnitSymbol(tab.Dim, tab.Kind, s.ctx.Format.ASCII))
			}
			ref, refText = calc.Number(1), "1"
		}
		if dbs, hasDB, err = tab.Decibels(ref); err != nil {
			at := e
			if refE != nil {
				at = refE
			}
			_, _, col := at.Span()
			return lineErr(s.line, col, width(p, at), "%v", err)
		}
		plotTab = relativeTo(tab, ref)
	}
	// read what the sweep found before changing the worksheet, so that a
	// cancelled search leaves it as it was
	fd := sweep.Find(tab, func(hz float64) (calc.Quantity, error) {
		if err := c.stopped(); err != nil {
			return calc.Quantity{}, err
		}
		return c.evalAt(src, e, hz)
	})
	if err := c.stopped(); err != nil {
		return err
	}
	s.sweeps = append(s.sweeps, &SweepResult{Source: src, Table: tab, DB: db, Ref: ref})
	st := calc.Step{Kind: "sweep", Source: src, Rule: "frequency sweep of " + p.Text(e) + " (" + strconv.Itoa(len(pts)) + " points)",
		Formula: "each point re-evaluates every frequency-dependent value at f"}
	if db {
		st.Formula += ";  level = 20·log10(|x|/|" + refText + "|) dB"
		st.Inputs = []calc.Operand{{Name: "dB reference", Value: ref}}
	}
	for k, pt := range tab.Points {
		row := calc.Row{Name: s.ctx.Format.Mag(pt.Freq, calc.DimFrequency, 0)}
		if pt.Mark != "" {
			row.Name += ": " + pt.Mark // no value to show
		} else {
			row.Values = []calc.Operand{{Name: "value", Value: pt.Value}}
			if db && hasDB[k] {
				row.Values = append(row.Values, calc.Operand{Name: "dB", Value: calc.Number(complex(dbs[k], 0))})
			}
		}
		st.Rows = append(st.Rows, row)
	}
	head := "plot:\n"
	if db {
		head = "plot (levels in dB re " + refText + "):\n"
	}
	st.Notes = append(st.Notes, head+sweep.Plot(plotTab, 64, 10, db, s.ctx.Format.ASCII))
	s.record(st)
	s.record(fd.Step(src, s.ctx.Format))
	return nil
}

// relativeTo returns the sweep divided by a reference, for a plot in dB
// of the ratio to that reference.
func relativeTo(t *sweep.Table, ref calc.Quantity) *sweep.Table {
	r := complex(cmplx.Abs(ref.V), 0)
	out := &sweep.Table{Points: make([]sweep.Point, len(t.Points)), Log: t.Log}
	for k, pt := range t.Points {
		out.Points[k] = sweep.Point{Freq: pt.Freq, Mark: pt.Mark, Value: calc.Number(pt.Value.V / r)}
	}
	return out
}

// stmtTolerance runs: tolerance NAME P% — the named value may lie within
// ±P % of its nominal value.
func (s *Sheet) stmtTolerance(p *calc.Parser) error {
	p.Next()
	nameTok := p.Next()
	d, ok := s.byName[nameTok.Text]
	if nameTok.Tok != calc.TokIdent || !ok {
		p.Failf(nameTok, "tolerance names a defined value, as in tolerance R1 5%%")
		return p.Err()
	}
	t := p.Next()
	if t.Tok != calc.TokNumber || !p.IsWord("%") {
		p.Failf(t, "a tolerance is written as a percentage, as in tolerance %s 5%%", nameTok.Text)
		return p.Err()
	}
	p.Next()
	p.ExpectEnd()
	if err := p.Err(); err != nil {
		return err
	}
	v, err := strconv.ParseFloat(t.Text, 64)
	if err != nil || v < 0 || v >= 100 {
		p.Failf(t, "a tolerance lies from 0%% to below 100%%")
		return p.Err()
	}
	s.tols[d.name] = v
	s.record(calc.Step{Kind: "tolerance", Source: p.Source(), Rule: d.name + " may lie within ±" + t.Text + " % of its nominal value",
		Results: []calc.Operand{{Name: d.name, Value: d.value}}})
	return nil
}

// spreadOf finds the range of an expression over the tolerances of the
// values it depends on.
func (s *Sheet) spreadOf(p *calc.Parser, e calc.Expr) (site.RangeResult, error) {
	var params []site.Param
	var names []string
	for _, n := range s.tolerancesUnder(e) {
		d := s.byName[n]
		nominal := d.value
		if d.elem != nil {
			nominal = d.elem.raw
		}
		params = append(params, site.Param{Name: n, Nominal: nominal, Tol: s.tols[n]})
		names = append(names, n)
	}
	w := work{samples: site.MaxEvaluations, perSample: s.sampleCost(names, e, nil)}
	if msg := s.overBudget("this tolerance range", w, "samples", ""); msg != "" {
		return site.RangeResult{}, lineErr(s.line, 1, utf8.RuneCountInString(p.Source()), "%s", msg)
	}
	src := p.Source()
	// one copy serves every sample: each sample sets every toleranced
	// value and re-evaluates all that depends on them
	c := s.sampler()
	done := 0
	for _, n := range names {
		if d := c.byName[n]; d.elem == nil {
			d.expr = nil // held at the sampled value
		}
	}
	rr, err := site.Range(params, func(vals []calc.Quantity) (calc.Quantity, error) {
		if err := c.stopped(); err != nil {
			return calc.Quantity{}, err
		}
		done++
		s.progress(done, site.MaxEvaluations)
		c.lenient = map[string]error{}
		changed := map[string]bool{}
		for i, n := range names {
			d := c.byName[n]
			if d.elem != nil {
				d.elem.raw = vals[i]
				z, err := c.elementValue(d.elem)
				if err != nil {
					return calc.Quantity{}, err
				}
				d.value = z
			} else {
				d.value = vals[i]
			}
			changed[n] = true
		}
		if _, err := c.propagate(changed, ""); err != nil {
			return calc.Quantity{}, err
		}
		if err := c.broken(e); err != nil {
			return calc.Quantity{}, err
		}
		r, err := c.evaluator(src, s.line).Eval(e)
		if err != nil {
			return calc.Quantity{}, errPlain(err)
		}
		return r.Value, nil
	})
	if err == nil {
		err = c.stopped()
	}
	if err != nil {
		_, _, col := e.Span()
		return site.RangeResult{}, lineErr(s.line, col, width(p, e), "%v", err)
	}
	// a pole inside the box (a parallel resonance, an open circuit) makes
	// the sampled maximum meaningless: say so rather than quote it as a range
	nom := cmplx.Abs(rr.Nominal.V)
	var warn string
	switch {
	case rr.Failed > 0:
		warn = fmt.Sprintf("%d of %d samples failed (an open circuit or a short inside the tolerance box): the value is unbounded there and the range above is not a bound", rr.Failed, rr.Evaluations)
	case nom > 0 && real(rr.MagMax.V) > 1e6*nom:
		warn = "the maximum is over a million times the nominal value: a resonance (pole) lies inside the tolerance box, the value is unbounded there and mag_max is not a bound"
	}
	if warn != "" && len(rr.Steps) > 0 {
		last := &rr.Steps[len(rr.Steps)-1]
		last.Notes = append(last.Notes, warn)
	}
	return rr, nil
}

// tolerancesUnder lists the toleranced names an expression depends on,
// directly or through other definitions and networks.
func (s *Sheet) tolerancesUnder(e calc.Expr) []string {
	seen := map[string]bool{}
	var out []string
	var visit func(name string, depth int)
	visit = func(name string, depth int) {
		if seen[name] || depth > 10000 {
			return
		}
		seen[name] = true
		if _, ok := s.tols[name]; ok {
			out = append(out, name)
		}
		if d, ok := s.byName[name]; ok {
			for k := range d.deps {
				visit(k, depth+1)
			}
			if d.owner != "" {
				if nw, ok := s.nets[d.owner]; ok {
					for k := range nw.deps {
						visit(k, depth+1)
					}
				}
				visit(d.owner, depth+1)
			}
		}
	}
	for k := range depsOf(e) {
		visit(k, 0)
	}
	sortStrings(out)
	return out
}

// stmtSpread runs: spread [NAME =] EXPR — the range of EXPR's magnitude and
// angle over the tolerances of the values it depends on.
func (s *Sheet) stmtSpread(p *calc.Parser) error {
	p.Next()
	var name string
	if t, next := p.Peek(), p.PeekNext(); t.Tok == calc.TokIdent && next.Tok == calc.TokOp && next.Text == "=" {
		nt := p.Next()
		p.Next()
		if !s.validName(p, nt) {
			return p.Err()
		}
		name = nt.Text
	}
	if p.Peek().Tok == calc.TokEOF {
		return perr(p, "spread needs a value: spread Zin")
	}
	e := p.Expr()
	p.ExpectEnd()
	if err := p.Err(); err != nil {
		return err
	}
	if s.dry {
		_, err := s.eval(p, e)
		return err
	}
	rr, err := s.spreadOf(p, e)
	if err != nil {
		return err
	}
	st := calc.Step{Kind: "spread", Source: p.Source(), Rule: "range over the tolerances (" + site.SampledLabel + ")", Results: rr.Operands()}
	if n := len(rr.Steps); n > 0 {
		// the range's own last step is the summary: head it with the statement
		st = rr.Steps[n-1]
		st.Kind, st.Source = "spread", p.Source()
		s.recordPart(p.Source(), rr.Steps[:n-1])
	}
	if name != "" {
		d := &def{name: name, src: p.Source(), line: s.line, value: rr.Nominal, deps: map[string]bool{}}
		if err := s.setValue(d); err != nil {
			return lineErr(s.line, 1, 1, "%v", err)
		}
		st.Results = append([]calc.Operand{{Name: name, Value: rr.Nominal}}, s.setExtras(name, p.Source(), rr.Operands())...)
	}
	s.record(st)
	return nil
}
