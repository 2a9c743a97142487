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
	if c.samples == nil {
		c.samples = &sampleMaps{changed: map[string]bool{}, when: map[string]int{}, evaluated: map[*def]int{}}
	}
	changed := c.samples.changed
	clear(changed)
	changed["f"], changed["w"], changed["ω"] = true, true, true
	if _, err := c.propagate(changed, ""); err != nil {
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

// sweepSpec is a sweep statement as read: what to sweep, over which
// frequencies, and how to show it. Reading the whole line before
// evaluating anything lets a typing error be reported before any work.
type sweepSpec struct {
	e, from, to calc.Expr
	ref         calc.Expr // the dB reference, nil when not stated
	n           int       // points
	log         bool
	logGiven    bool // log or linear was written, not defaulted
	db          bool
}

// stmtSweep runs: sweep EXPR from F1 to F2 [points N] [log|linear] [db [ref R]].
// After the table it records what the sweep found (sweep.Find): extremes,
// resonances and half-power bands, each located between the points.
func (s *Sheet) stmtSweep(p *calc.Parser) error {
	sp, err := s.readSweep(p)
	if err != nil {
		return err
	}
	pts, err := s.sweepPoints(p, sp)
	if err != nil {
		return err
	}
	var ref calc.Quantity
	refText := ""
	if sp.ref != nil {
		r, err := s.eval(p, sp.ref)
		if err != nil {
			return err
		}
		ref, refText = r.Value, p.Text(sp.ref)
	}
	if s.dry {
		// the value at the working frequency stands for the sweep
		if _, err := s.eval(p, sp.e); err != nil {
			return err
		}
		return nil
	}
	src := p.Source()
	c := s.sampler()
	c.restrict(sp.e)
	tab, err := s.sweepTable(p, c, sp.e, pts)
	if err != nil {
		return err
	}
	var lv sweepLevels
	plotTab := tab
	if sp.db {
		if lv, err = s.sweepDecibels(p, sp, tab, ref, refText); err != nil {
			return err
		}
		ref, refText = lv.ref, lv.refText
		plotTab = relativeTo(tab, ref)
	}
	// read what the sweep found before changing the worksheet, so that a
	// cancelled search leaves it as it was
	fd := sweep.Find(tab, func(hz float64) (calc.Quantity, error) {
		if err := c.stopped(); err != nil {
			return calc.Quantity{}, err
		}
		return c.evalAt(src, sp.e, hz)
	})
	if err := c.stopped(); err != nil {
		return err
	}
	s.sweeps = append(s.sweeps, &SweepResult{Source: src, Table: tab, DB: sp.db, Ref: ref})
	s.record(s.sweepStep(p, sp, tab, plotTab, lv))
	s.record(fd.Step(src, s.ctx.Format))
	return nil
}

// readSweep reads a sweep statement up to the end of the line, the
// options in any order, without evaluating anything.
func (s *Sheet) readSweep(p *calc.Parser) (sweepSpec, error) {
	p.Next()
	if p.Peek().Tok == calc.TokEOF {
		return sweepSpec{}, perr(p, "sweep needs a value: sweep Zin from 10 Hz to 10 kHz")
	}
	sp := sweepSpec{n: 41, log: true}
	sp.e = p.Expr()
	if p.Err() != nil {
		return sp, p.Err()
	}
	if !expectWord(p, "from", "sweep") {
		return sp, p.Err()
	}
	sp.from = p.Expr()
	if p.Err() != nil || !expectWord(p, "to", "sweep") {
		return sp, p.Err()
	}
	sp.to = p.Expr()
	for p.Err() == nil && p.Peek().Tok != calc.TokEOF {
		if err := s.sweepOption(p, &sp); err != nil {
			return sp, err
		}
	}
	if err := p.Err(); err != nil {
		return sp, err
	}
	return sp, nil
}

// sweepOption reads one option of a sweep into sp: points N, log, linear
// or db [ref R].
func (s *Sheet) sweepOption(p *calc.Parser, sp *sweepSpec) error {
	switch {
	case p.IsWord("points"):
		p.Next()
		t := p.Next()
		k, err := strconv.Atoi(t.Text)
		if t.Tok != calc.TokNumber || err != nil || k < 2 || k > s.limits.Points {
			p.Failf(t, "points takes a whole number from 2 to %d", s.limits.Points)
			return p.Err()
		}
		sp.n = k
	case p.IsWord("log"):
		p.Next()
		sp.log, sp.logGiven = true, true
	case p.IsWord("linear"):
		p.Next()
		sp.log, sp.logGiven = false, true
	case p.IsWord("db"), p.IsWord("dB"):
		p.Next()
		sp.db = true
		if p.IsWord("ref") {
			p.Next()
			if sp.ref = p.Expr(); p.Err() != nil {
				return p.Err()
			}
		}
	default:
		return perr(p, "sweep options are points N, log, linear and db [ref R]; found %q", p.Peek().Text)
	}
	return nil
}

// sweepFreq evaluates an end of a sweep's range as a frequency in Hz: a
// sweep runs over frequencies, given in Hz or rad/s.
func (s *Sheet) sweepFreq(p *calc.Parser, x calc.Expr) (float64, error) {
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

// sweepPoints returns the frequencies a sweep visits, refusing a sweep
// whose estimated work is past the budget before any point is computed.
// A range from 0 Hz is linear unless log was asked for, so that the
// default does not refuse it.
func (s *Sheet) sweepPoints(p *calc.Parser, sp sweepSpec) ([]float64, error) {
	a, err := s.sweepFreq(p, sp.from)
	if err != nil {
		return nil, err
	}
	b, err := s.sweepFreq(p, sp.to)
	if err != nil {
		return nil, err
	}
	logScale := sp.log
	if !sp.logGiven && a <= 0 {
		logScale = false
	}
	pts, err := sweep.Points(a, b, sp.n, logScale)
	if err != nil {
		_, _, col := sp.from.Span()
		return nil, lineErr(s.line, col, width(p, sp.from), "%v", err)
	}
	if msg := s.overBudget("this sweep", work{samples: len(pts), perSample: s.sampleCost([]string{"f", "w", "ω"}, sp.e, s.needs(sp.e))}, "points", "use fewer points"); msg != "" {
		return nil, lineErr(s.line, 1, utf8.RuneCountInString(p.Source()), "%s", msg)
	}
	return pts, nil
}

// sweepTable evaluates e at every point on the working copy c, reporting
// progress and stopping when the statement is cancelled.
func (s *Sheet) sweepTable(p *calc.Parser, c *Sheet, e calc.Expr, pts []float64) (*sweep.Table, error) {
	src := p.Source()
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
		return nil, lineErr(s.line, col, width(p, e), "%v", err)
	}
	return tab, nil
}

// sweepLevels are a sweep's levels in dB and the reference they are
// taken to.
type sweepLevels struct {
	dbs     []float64
	has     []bool // a level exists (not at a marked point, not of zero)
	ref     calc.Quantity
	refText string
}

// sweepDecibels works out the levels of a db sweep. Without ref only a
// ratio has a level (to 1): a value with a unit needs its reference
// stated, or the dB figure would hide the unit it is relative to.
func (s *Sheet) sweepDecibels(p *calc.Parser, sp sweepSpec, tab *sweep.Table, ref calc.Quantity, refText string) (sweepLevels, error) {
	if sp.ref == nil {
		if !tab.Dim.IsDimensionless() {
			return sweepLevels{}, perr(p, "a level in dB is a ratio to a stated reference: write db ref 1 %s", calc.UnitSymbol(tab.Dim, tab.Kind, s.ctx.Format.ASCII))
		}
		ref, refText = calc.Number(1), "1"
	}
	dbs, has, err := tab.Decibels(ref)
	if err != nil {
		at := sp.e
		if sp.ref != nil {
			at = sp.ref
		}
		_, _, col := at.Span()
		return sweepLevels{}, lineErr(s.line, col, width(p, at), "%v", err)
	}
	return sweepLevels{dbs: dbs, has: has, ref: ref, refText: refText}, nil
}

// sweepStep is the step of a finished sweep: a row a point with its value
// (and level in dB), and the plot.
func (s *Sheet) sweepStep(p *calc.Parser, sp sweepSpec, tab, plotTab *sweep.Table, lv sweepLevels) calc.Step {
	st := calc.Step{Kind: "sweep", Source: p.Source(), Rule: "frequency sweep of " + p.Text(sp.e) + " (" + strconv.Itoa(len(tab.Points)) + " points)",
		Formula: "each point re-evaluates every frequency-dependent value at f"}
	if sp.db {
		st.Formula += ";  level = 20·log10(|x|/|" + lv.refText + "|) dB"
		st.Inputs = []calc.Operand{{Name: "dB reference", Value: lv.ref}}
	}
	for k, pt := range tab.Points {
		row := calc.Row{Name: s.ctx.Format.Mag(pt.Freq, calc.DimFrequency, 0), Key: calc.Operand{Name: "f", Value: calc.Real(pt.Freq, calc.DimFrequency)}}
		if pt.Mark != "" {
			row.Name += ": " + pt.Mark // no value to show
			row.Note = pt.Mark
		} else {
			row.Values = []calc.Operand{{Name: "value", Value: pt.Value}}
			if sp.db && lv.has[k] {
				row.Values = append(row.Values, calc.Operand{Name: "dB", Value: calc.Number(complex(lv.dbs[k], 0))})
			}
		}
		st.Rows = append(st.Rows, row)
	}
	head := "plot:\n"
	if sp.db {
		head = "plot (levels in dB re " + lv.refText + "):\n"
	}
	st.Notes = append(st.Notes, head+sweep.Plot(plotTab, 64, 10, sp.db, s.ctx.Format.ASCII))
	return st
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
		return c.sampleAt(names, vals, src, s.line, e)
	})
	if err == nil {
		err = c.stopped()
	}
	if err != nil {
		_, _, col := e.Span()
		return site.RangeResult{}, lineErr(s.line, col, width(p, e), "%v", err)
	}
	if warn := poleWarning(rr); warn != "" && len(rr.Steps) > 0 {
		last := &rr.Steps[len(rr.Steps)-1]
		last.Notes = append(last.Notes, warn)
	}
	return rr, nil
}

// sampleAt evaluates e on a working copy (c must be a sampler) with the
// toleranced names set to one sample's values: an element takes the
// sampled component value, so its impedance follows the frequency, and
// everything that reads them is evaluated again.
func (c *Sheet) sampleAt(names []string, vals []calc.Quantity, src string, line int, e calc.Expr) (calc.Quantity, error) {
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
	r, err := c.evaluator(src, line).Eval(e)
	if err != nil {
		return calc.Quantity{}, errPlain(err)
	}
	return r.Value, nil
}

// poleWarning returns the note for a range that is no bound: a pole
// inside the box (a parallel resonance, an open circuit) makes the sampled
// maximum meaningless, so it says so rather than quote it as a range.
func poleWarning(rr site.RangeResult) string {
	nom := cmplx.Abs(rr.Nominal.V)
	switch {
	case rr.Failed > 0:
		return fmt.Sprintf("%d of %d samples failed (an open circuit or a short inside the tolerance box): the value is unbounded there and the range above is not a bound", rr.Failed, rr.Evaluations)
	case nom > 0 && real(rr.MagMax.V) > 1e6*nom:
		return "the maximum is over a million times the nominal value: a resonance (pole) lies inside the tolerance box, the value is unbounded there and mag_max is not a bound"
	}
	return ""
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
