package sheet

import (
	"errors"
	"fmt"
	"strconv"
	"strings"
	"unicode/utf8"

	"argand/calc"
	"argand/reduce"
)

// Exec runs one statement as the next line of the worksheet and returns
// the steps it produced (they are also added to the trail) and the names
// it defined or redefined, in order (not those re-evaluated because they
// read one, nor the dotted results of a function or network). On error
// nothing of the statement is kept, and the returned error is a
// *calc.Error that names the line and column.
func (s *Sheet) Exec(src string) ([]calc.Step, []string, error) {
	s.line++
	return s.ExecLine(src, s.line)
}

// SetLine sets the number of the last line run: the next statement Exec
// runs is line n+1.
func (s *Sheet) SetLine(n int) { s.line = n }

// Line returns the number of the last line run.
func (s *Sheet) Line() int { return s.line }

// ExecLine runs one statement as line n, like Exec.
func (s *Sheet) ExecLine(src string, n int) ([]calc.Step, []string, error) {
	s.line = n
	s.noteSeen, s.cautionSeen, s.defined = nil, 0, nil
	if err := s.fits(len(src)); err != nil {
		return nil, nil, lineErr(n, 1, 1, "%v", err)
	}
	before, full := len(s.steps), s.cautionFull
	s.since, s.shadow = 0, ""
	s.snap = nil
	err := s.exec(src, n)
	snap := s.snap
	s.snap = nil
	if err != nil {
		if snap != nil {
			// what the refused statement changed before it failed is
			// undone (see keep)
			*s = *snap
		}
		s.steps, s.cautionFull, s.defined = s.steps[:before], full, nil
		var le *calc.Error
		if errors.As(err, &le) && s.lang > 0 && le.Since > s.lang {
			// refused by a rule newer than the worksheet (2,2 under the
			// decimal point): listed with the lines that read differently
			s.changedLine = n
			s.changed = append(s.changed, n)
			e := *le
			e.Msg += fmt.Sprintf(" (this line reads differently since language %d; the worksheet declares language %d)", le.Since, s.lang)
			return nil, nil, &e
		}
		return nil, nil, err
	}
	if s.lang > 0 && s.since > s.lang && len(s.steps) > before {
		// the worksheet was written for an older reading of input: say
		// that this line reads differently now, on its own step
		s.changedLine = n
		s.changed = append(s.changed, n)
		last := &s.steps[len(s.steps)-1]
		last.Notes = append(last.Notes, fmt.Sprintf("this line reads differently since language %d (the worksheet declares language %d; this argand reads language %d)", s.since, s.lang, calc.Language))
	}
	if s.shadow != "" && len(s.steps) > before {
		last := &s.steps[len(s.steps)-1]
		last.Notes = append(last.Notes, s.shadow)
	}
	switch {
	case isLanguageLine(src):
	case isDecimalLine(src) && len(s.stmts) == 0:
		// the marker the worksheet begins in, which Statements and
		// Worksheet state first
		s.startComma = s.ctx.Format.Comma
	default:
		s.stmts = append(s.stmts, src)
	}
	defined := s.defined
	s.defined = nil
	return s.steps[before:len(s.steps):len(s.steps)], defined, nil
}

// Changed returns the lines whose reading changed since the language
// version the worksheet declared.
func (s *Sheet) Changed() []int { return append([]int(nil), s.changed...) }

// Language returns the language version the worksheet declared, 0 if none.
func (s *Sheet) Language() int { return s.lang }

// LanguageLine is the first line of a saved or exported worksheet: the
// version of the input language it was written in.
func LanguageLine() string { return fmt.Sprintf("language %d", calc.Language) }

// isLanguageLine reports a "language N" statement, which a saved
// worksheet gets afresh rather than keeping the one it was read with.
func isLanguageLine(src string) bool {
	f := strings.Fields(src)
	return len(f) >= 1 && f[0] == "language"
}

// isDecimalLine reports a "decimal comma" or "decimal point" statement.
func isDecimalLine(src string) bool {
	f := strings.Fields(src)
	return len(f) >= 1 && f[0] == "decimal"
}

// stmtDecimal reads "decimal comma" or "decimal point": the decimal
// marker of the numbers typed and shown from here on. The SI Brochure (9th
// ed. §5.4.4) allows either on the line. Under the comma, ';' separates
// the arguments of a function.
func (s *Sheet) stmtDecimal(p *calc.Parser) error {
	return s.setting(p, []string{"comma", "point"}, func(w string) calc.Step {
		s.since = max(s.since, 3) // the statement is language 3's
		s.ctx.Format.Comma = w == "comma"
		if s.ctx.Format.Comma {
			return calc.Step{Rule: "decimal comma: numbers are typed and shown as 2,2 mH; arguments are separated by ';', as in parallel(2,2 kΩ; 4,7 kΩ)"}
		}
		return calc.Step{Rule: "decimal point: numbers are typed and shown as 2.2 mH; arguments are separated by ',', as in parallel(2.2 kΩ, 4.7 kΩ)"}
	})
}

// stmtLanguage reads "language N": the version of the input language the
// worksheet was written in. Lines read differently since then are noted.
func (s *Sheet) stmtLanguage(p *calc.Parser) error {
	p.Next()
	t := p.Peek()
	if t.Tok != calc.TokNumber {
		return perr(p, "language takes a whole number from 1 to %d", calc.Language)
	}
	p.Next()
	p.ExpectEnd()
	if err := p.Err(); err != nil {
		return err
	}
	v, err := strconv.Atoi(t.Text)
	if err != nil || v < 1 {
		p.Failf(t, "language takes a whole number from 1 to %d", calc.Language)
		return p.Err()
	}
	if v > calc.Language {
		p.Failf(t, "this worksheet is written in language %d; this argand reads up to language %d: use a newer argand", v, calc.Language)
		return p.Err()
	}
	s.lang = v
	rule := fmt.Sprintf("worksheet written in language %d", v)
	if v < calc.Language {
		rule += fmt.Sprintf("; this argand reads language %d, and lines that now read differently are noted", calc.Language)
	}
	s.record(calc.Step{Kind: "setting", Source: p.Source(), Rule: rule})
	return nil
}

// Validate checks one statement on a copy of the worksheet, without the
// long computations (sweeps, tolerance ranges), and returns its first
// error, for live feedback while typing; the worksheet is not changed.
func (s *Sheet) Validate(src string) *calc.Error {
	if !utf8.ValidString(src) || len(src) > calc.MaxLine {
		return s.execErr(src, 1)
	}
	c := s.Clone()
	c.line = 0
	c.dry = true
	if err := c.exec(src, 1); err != nil {
		if le, ok := err.(*calc.Error); ok {
			return le
		}
		return &calc.Error{Line: 1, Col: 1, Len: 1, Msg: err.Error()}
	}
	return nil
}

// execErr runs a statement and returns its error as a located
// *calc.Error, for Validate, whose callers place errors by line and
// column.
func (s *Sheet) execErr(src string, n int) *calc.Error {
	err := s.exec(src, n)
	if le, ok := err.(*calc.Error); ok {
		return le
	}
	if err != nil {
		return &calc.Error{Line: n, Col: 1, Len: 1, Msg: err.Error()}
	}
	return nil
}

// keep takes a copy of the worksheet, once per statement, before the
// statement gives something already defined a new value: a change that
// is then refused (Rnom = 1 A, refused by an element that reads Rnom)
// must not leave behind what it changed before it failed, which later
// lines of a run would read. Not on a copy the caller throws away on an
// error (a working copy, a live check, the app's statements).
func (s *Sheet) keep() {
	if s.snap != nil || s.dry || s.quiet || (s.job != nil && s.job.Copy) {
		return
	}
	s.snap = s.Clone()
}

// Clone returns a copy of the worksheet whose changes do not reach s.
func (s *Sheet) Clone() *Sheet {
	s.funcTable() // made once, so that copies share it
	c := *s
	c.defs = make([]*def, len(s.defs))
	c.byName = make(map[string]*def, len(s.byName))
	for i, d := range s.defs {
		nd := *d
		if d.elem != nil {
			e := *d.elem
			nd.elem = &e
		}
		c.defs[i] = &nd
		c.byName[nd.name] = &nd
	}
	c.nets = make(map[string]*network, len(s.nets))
	for k, v := range s.nets {
		nv := *v
		nv.elems = append([]string(nil), v.elems...)
		nv.solver, nv.elemDefs, nv.resultDefs = nil, nil, nil
		c.nets[k] = &nv
	}
	c.order = append([]string(nil), s.order...)
	c.samples = nil // a copy's propagations are its own
	c.snap = nil
	if s.open != nil {
		c.open = c.nets[s.open.name]
		if c.open == nil {
			o := *s.open
			o.elems = append([]string(nil), s.open.elems...)
			c.open = &o
		}
	}
	c.steps = s.steps[:len(s.steps):len(s.steps)]
	c.stmts = s.stmts[:len(s.stmts):len(s.stmts)]
	c.autoNext = make(map[string]int, len(s.autoNext))
	for k, v := range s.autoNext {
		c.autoNext[k] = v
	}
	c.tols = make(map[string]float64, len(s.tols))
	for k, v := range s.tols {
		c.tols[k] = v
	}
	c.sweeps = s.sweeps[:len(s.sweeps):len(s.sweeps)]
	c.noteSeen = nil
	c.spectra = make(map[string]*spectrumDef, len(s.spectra))
	for k, v := range s.spectra {
		c.spectra[k] = v
	}
	c.changed = s.changed[:len(s.changed):len(s.changed)]
	return &c
}

// exec runs one statement as line n. The line is parsed once: one parser
// reads it, the keyword table (lookupKeyword) tells a statement from an
// expression by its first tokens, and the statement reads on from there.
// Inside a network block only the table's block lines are allowed.
func (s *Sheet) exec(src string, n int) error {
	if len(src) > calc.MaxLine {
		return lineErr(n, 1, 1, "line too long: %d bytes (the limit is %d)", len(src), calc.MaxLine)
	}
	if !utf8.ValidString(src) {
		col := 1
		for i, r := range src {
			if r == utf8.RuneError {
				if _, w := utf8.DecodeRuneInString(src[i:]); w == 1 {
					break
				}
			}
			col++
		}
		return lineErr(n, col, 1, "invalid UTF-8 byte in the input")
	}
	body := src
	if i := strings.IndexByte(src, '#'); i >= 0 {
		body = src[:i]
	}
	if strings.TrimSpace(body) == "" {
		return nil
	}
	p := s.parser(body, n)
	defer func() { s.since = max(s.since, p.Since()) }()
	k := lookupKeyword(p)
	if s.open != nil && (k == nil || k.where&inBlock == 0) {
		p.Failf(p.Peek(), "inside network %s a line is an element (%s NAME = value from NODE to NODE) or end", s.open.name, blockForms())
		return p.Err()
	}
	if k != nil {
		return k.run(s, p)
	}
	return s.stmtAssignOrEval(p)
}

// perr returns the parser's error, or a new one at the current token.
func perr(p *calc.Parser, format string, a ...any) error {
	if err := p.Err(); err != nil {
		return err
	}
	p.Failf(p.Peek(), format, a...)
	return p.Err()
}

// expectWord consumes the identifier w or fails.
func expectWord(p *calc.Parser, w, context string) bool {
	if p.IsWord(w) {
		p.Next()
		return true
	}
	t := p.Peek()
	if t.Tok == calc.TokEOF {
		p.FailAt(t.Col, 1, "%s: expected %q, found the end of the line", context, w)
	} else {
		p.Failf(t, "%s: expected %q, found %q", context, w, t.Text)
	}
	return false
}

// word reads one identifier from a fixed choice.
func word(p *calc.Parser, context string, choices ...string) (string, bool) {
	t := p.Peek()
	for _, c := range choices {
		if t.Tok == calc.TokIdent && strings.EqualFold(t.Text, c) {
			p.Next()
			return c, true
		}
	}
	what := fmt.Sprintf("%q", t.Text)
	if t.Tok == calc.TokEOF {
		what = "nothing"
	}
	p.FailAt(t.Col, max(1, utf8.RuneCountInString(t.Text)), "%s takes %s, found %s", context, strings.Join(choices, " or "), what)
	return "", false
}

// eval evaluates an expression of the statement being run, noting the
// newest language version its reading used.
func (s *Sheet) eval(p *calc.Parser, e calc.Expr) (calc.Result, error) {
	ev := s.evaluator(p.Source(), s.line)
	r, err := ev.Eval(e)
	s.since = max(s.since, ev.Since)
	if err != nil {
		return calc.Result{}, err
	}
	return r, nil
}

// stmtFrequency runs: frequency F, in Hz or rad/s. Every value that
// depends on the frequency (a reactance, a network) is evaluated again at
// once, so the worksheet never shows values of two frequencies.
func (s *Sheet) stmtFrequency(p *calc.Parser) error {
	p.Next()
	if p.Peek().Tok == calc.TokEOF {
		return perr(p, "frequency needs a value, such as frequency 60 Hz")
	}
	e := p.Expr()
	p.ExpectEnd()
	if err := p.Err(); err != nil {
		return err
	}
	r, err := s.eval(p, e)
	if err != nil {
		return err
	}
	q := r.Value
	pos, end, col := e.Span()
	n := utf8.RuneCountInString(p.Source()[pos:end])
	var hz float64
	switch q.Dim {
	case calc.DimFrequency:
		hz = real(q.V)
	case calc.DimAngularFrequency:
		hz = calc.HzOf(real(q.V))
	case calc.Dimensionless:
		return lineErr(s.line, col, n, "frequency needs a unit: Hz or rad/s (as in frequency 60 Hz)")
	default:
		return lineErr(s.line, col, n, "frequency must be in Hz or rad/s, not %s", calc.DimName(q.Dim, false))
	}
	if !q.IsReal() {
		return lineErr(s.line, col, n, "frequency must be a real number")
	}
	if hz <= 0 || !finite(hz) {
		return lineErr(s.line, col, n, "frequency must be greater than 0 (got %s)", s.ctx.Format.Mag(real(q.V), q.Dim, 0))
	}
	if !finite(calc.Context{Freq: hz}.Omega()) {
		return lineErr(s.line, col, n, "frequency too large: ω = 2π·f would overflow the largest number argand holds, so no reactance could be computed at it")
	}
	old := s.ctx.Freq
	if old != hz {
		s.keep()
	}
	s.ctx.Freq = hz
	st := calc.Step{Kind: "setting", Source: p.Source(), Rule: "working frequency", Formula: "ω = 2π·f", Notes: r.Notes,
		Results: []calc.Operand{{Name: "f", Value: calc.Real(hz, calc.DimFrequency)}, {Name: "ω", Value: calc.Quantity{V: complex(s.ctx.Omega(), 0), Dim: calc.DimAngularFrequency, Kind: calc.KindAngle}}}}
	s.record(st)
	if old != hz {
		rs, err := s.propagate(map[string]bool{"f": true, "w": true, "ω": true}, "frequency changed from "+s.ctx.Format.Mag(old, calc.DimFrequency, 0)+" to "+s.ctx.Format.Mag(hz, calc.DimFrequency, 0))
		if err != nil {
			s.ctx.Freq = old
			return lineErr(s.line, 1, 1, "%v", err)
		}
		if rs != nil {
			s.record(*rs)
		}
	}
	return nil
}

// setting reads a settings statement that takes one word from a fixed
// choice, applies it, and records the step apply returns.
func (s *Sheet) setting(p *calc.Parser, choices []string, apply func(w string) calc.Step) error {
	kw := p.Next()
	w, ok := word(p, kw.Text, choices...)
	p.ExpectEnd()
	if !ok || p.Err() != nil {
		return p.Err()
	}
	st := apply(w)
	st.Kind, st.Source = "setting", p.Source()
	s.record(st)
	return nil
}

// stmtBasis runs: basis rms | peak, the basis phasors are read in, which
// decides the factor ½ in S = ½·V·I*.
func (s *Sheet) stmtBasis(p *calc.Parser) error {
	return s.setting(p, []string{"rms", "peak"}, func(w string) calc.Step {
		if w == "peak" {
			s.ctx.Basis = calc.Peak
			return calc.Step{Rule: "phasor basis peak", Formula: "S = ½·V·I* (peak phasors)"}
		}
		s.ctx.Basis = calc.RMS
		return calc.Step{Rule: "phasor basis rms", Formula: "S = V·I* (RMS phasors)"}
	})
}

// stmtAngles runs: angles deg | rad, the unit angles are shown in and a
// bare angle is read in.
func (s *Sheet) stmtAngles(p *calc.Parser) error {
	return s.setting(p, []string{"deg", "rad", "degrees", "radians"}, func(w string) calc.Step {
		s.ctx.Format.Radians = w == "rad" || w == "radians"
		if s.ctx.Format.Radians {
			return calc.Step{Rule: "angles shown and read in radians"}
		}
		return calc.Step{Rule: "angles shown and read in degrees"}
	})
}

// stmtDigits runs: digits N, the significant figures shown.
func (s *Sheet) stmtDigits(p *calc.Parser) error {
	p.Next()
	t := p.Peek()
	if t.Tok != calc.TokNumber {
		return perr(p, "digits takes a whole number from 1 to %d", calc.MaxDigits)
	}
	p.Next()
	p.ExpectEnd()
	if err := p.Err(); err != nil {
		return err
	}
	d, err := strconv.Atoi(t.Text)
	if err != nil || d < 1 || d > calc.MaxDigits {
		p.Failf(t, "digits takes a whole number from 1 to %d", calc.MaxDigits)
		return p.Err()
	}
	s.ctx.Format.Digits = d
	s.record(calc.Step{Kind: "setting", Source: p.Source(), Rule: "significant figures shown: " + t.Text})
	return nil
}

// stmtSequence runs: sequence abc | acb, the phase sequence, which
// decides the sign of the 30° between line and phase voltages.
func (s *Sheet) stmtSequence(p *calc.Parser) error {
	return s.setting(p, []string{"abc", "acb"}, func(w string) calc.Step {
		if w == "acb" {
			s.ctx.Sequence = -1
			return calc.Step{Rule: "phase sequence ACB (negative): V_ab = √3·V_an∠−30°"}
		}
		s.ctx.Sequence = 1
		return calc.Step{Rule: "phase sequence ABC (positive): V_ab = √3·V_an∠+30°"}
	})
}

// autoName gives a result typed without a name a name from its dimension,
// the letter an engineer would use (Z for an impedance, V, I, S, P, Q, Y,
// L, C; magV and magI for a magnitude |V| or |I|), numbered from 1 past
// any name already taken.
func (s *Sheet) autoName(q calc.Quantity) string {
	letter := "x"
	switch q.Dim {
	case calc.DimImpedance:
		letter = "Z"
	case calc.DimAdmittance:
		letter = "Y"
	case calc.DimVoltage:
		letter = "V"
	case calc.DimCurrent:
		letter = "I"
	case calc.DimPower:
		switch q.Kind {
		case calc.KindActive:
			letter = "P"
		case calc.KindReactive:
			letter = "Q"
		case calc.KindProduct:
			letter = "VI" // not a power: V·I without the conjugate
		case calc.KindMagnitude:
			letter = "Sa" // an apparent power |S|
		default:
			letter = "S"
		}
	case calc.DimInductance:
		letter = "L"
	case calc.DimCapacitance:
		letter = "C"
	case calc.DimFrequency:
		letter = "fr"
	case calc.DimTime:
		letter = "t"
	}
	if q.Kind == calc.KindMagnitude && (q.Dim == calc.DimVoltage || q.Dim == calc.DimCurrent) {
		// |V| or |I| has no angle: named after mag(), so that it is not
		// read as the phasor V1 or I1 (magI1 rather than |I|1, which
		// cannot be typed back as a name)
		letter = "mag" + letter
	}
	if q.Kind == calc.KindAngle && q.Dim.IsDimensionless() {
		letter = "ang" // typed on any keyboard, ASCII mode included
	}
	if q.Dim == calc.DimAngularFrequency && q.Kind == calc.KindAngle {
		letter = "w"
	}
	if s.autoNext == nil {
		s.autoNext = map[string]int{}
	}
	for k := max(1, s.autoNext[letter]); ; k++ {
		n := letter + strconv.Itoa(k)
		if _, taken := s.byName[n]; !taken {
			s.autoNext[letter] = k + 1
			return n
		}
	}
}

// depsOf lists the names an expression reads, so that it is evaluated
// again when one changes; ω and any call read the working frequency f.
func depsOf(e calc.Expr) map[string]bool {
	deps := map[string]bool{}
	calc.Walk(e, func(x calc.Expr) {
		switch n := x.(type) {
		case *calc.Name:
			deps[n.Name] = true
			if n.Name == "w" || n.Name == "ω" {
				deps["f"] = true
			}
		case *calc.Call:
			deps["f"] = true // a function may read the working frequency
		}
	})
	return deps
}

// stmtAssignOrEval runs a line that is no statement: NAME = EXPR, or an
// expression alone, which takes a name from its kind (autoName). A name
// given to an element changes the element's value, its kind kept.
func (s *Sheet) stmtAssignOrEval(p *calc.Parser) error {
	src := p.Source()
	var name string
	var nameTok calc.Item
	// NAME = EXPR: an '=' after a leading identifier
	if t, next := p.Peek(), p.PeekNext(); (t.Tok == calc.TokIdent || t.Tok == calc.TokImag) && next.Tok == calc.TokOp && next.Text == "=" {
		nameTok = p.Next()
		p.Next() // =
		if !s.validName(p, nameTok) {
			return p.Err()
		}
		name = nameTok.Text
		if p.Peek().Tok == calc.TokEOF {
			return perr(p, "nothing after '=': give %s a value", name)
		}
	}
	e := p.Expr()
	p.ExpectEnd()
	if err := p.Err(); err != nil {
		return err
	}
	// the operands' values are kept as the evaluation meets them, for
	// the step that describes it
	vals := map[calc.Expr]calc.Quantity{}
	ev := s.evaluator(p.Source(), s.line)
	ev.Seen = func(x calc.Expr, q calc.Quantity) { vals[x] = q }
	r, err := ev.Eval(e)
	s.since = max(s.since, ev.Since)
	if err != nil {
		return err
	}
	if name != "" {
		if d, ok := s.byName[name]; ok && d.elem != nil {
			return s.changeElement(p, d, r.Value, e)
		}
		if d, ok := s.byName[name]; ok && d.owner != "" {
			p.Failf(nameTok, "%q is a result of %s and cannot be assigned", name, d.owner)
			return p.Err()
		}
	}
	auto := name == ""
	if auto {
		name = s.autoName(r.Value)
	}
	d := &def{name: name, src: src, line: s.line, expr: e, value: r.Value, deps: depsOf(e)}
	_, existed := s.byName[name]
	if err := s.setValue(d); err != nil {
		p.Failf(nameTok, "%v", err)
		return p.Err()
	}
	extras := s.setExtras(name, src, r.Extra)
	st := s.describe(p, e, r, vals)
	st.Kind = "define"
	if auto {
		st.Kind = "eval"
	}
	st.Results = append([]calc.Operand{{Name: name, Value: r.Value}}, extras...)
	s.recordPart(p.Source(), r.Steps)
	s.record(st)
	if existed {
		if err := s.reevaluate(map[string]bool{name: true}, name+" redefined"); err != nil {
			return err
		}
	}
	return nil
}

// setExtras defines NAME.key for each extra value of a function result.
func (s *Sheet) setExtras(name, src string, extra []calc.Operand) []calc.Operand {
	var out []calc.Operand
	for _, x := range extra {
		n := name + "." + x.Name
		d := &def{name: n, src: src, line: s.line, value: x.Value, owner: name, key: x.Name, deps: map[string]bool{name: true}}
		if old, ok := s.byName[n]; ok {
			*old = *d
		} else {
			s.defs = append(s.defs, d)
			s.byName[n] = d
		}
		out = append(out, calc.Operand{Name: n, Value: x.Value})
	}
	return out
}

// describe builds the step of an evaluation: the rule and formula of the
// outermost operation and each of its operands with the value the
// evaluation found for it (vals), never evaluated a second time.
func (s *Sheet) describe(p *calc.Parser, e calc.Expr, r calc.Result, vals map[calc.Expr]calc.Quantity) calc.Step {
	st := calc.Step{Source: p.Source(), Notes: r.Notes, Cautions: r.Cautions}
	operand := func(x calc.Expr) {
		if v, ok := vals[x]; ok && !isLit(x) {
			st.Inputs = append(st.Inputs, calc.Operand{Name: p.Text(x), Value: v})
		}
	}
	inner := e
	for {
		if pe, ok := inner.(*calc.Paren); ok {
			inner = pe.X
			continue
		}
		break
	}
	switch n := inner.(type) {
	case *calc.Binary:
		if (n.Op == "+" || n.Op == "-") && isLit(n.X) && isLit(n.Y) {
			st.Rule = "value as entered (rectangular form)"
			break
		}
		st.Rule, st.Formula = binaryRule(n.Op, p.Text(n.X), p.Text(n.Y))
		operand(n.X)
		operand(n.Y)
	case *calc.Polar:
		st.Rule, st.Formula = "phasor from magnitude and angle", "m∠θ = m·(cos θ + j·sin θ)"
	case *calc.Unary:
		if isLit(n.X) {
			st.Rule = "value as entered"
			break
		}
		st.Rule = "negation"
		operand(n.X)
	case *calc.Call:
		if f := s.funcOf(n.Fun); f != nil {
			st.Rule, st.Formula = f.Doc, f.Formula
		}
		for _, a := range n.Args {
			if nm, ok := a.(*calc.Name); ok {
				if _, def := s.Lookup(nm.Name); !def {
					continue // a word argument
				}
			}
			operand(a)
		}
	case *calc.Name:
		st.Rule = "value of " + n.Name
	case *calc.Lit:
		st.Rule = "value as entered"
	}
	return st
}

// isLit reports a literal, signed or not: a value as typed, which a step
// does not list again among its inputs.
func isLit(x calc.Expr) bool {
	if u, ok := x.(*calc.Unary); ok {
		x = u.X
	}
	_, ok := x.(*calc.Lit)
	return ok
}

// binaryRule names a binary operation and writes its formula over the
// operands as typed (a and b), in the words of a hand calculation.
func binaryRule(op, a, b string) (rule, formula string) {
	switch op {
	case "+":
		return "sum", a + " + " + b
	case "-":
		return "difference (first minus second)", a + " − " + b
	case "*":
		return "product", a + " · " + b
	case "/":
		return "quotient (first over second)", a + " / " + b
	case "^":
		return "power (principal value)", group(a) + "^" + group(b)
	case "||":
		a, b = group(a), group(b)
		return "parallel: product over sum", a + "·" + b + " / (" + a + " + " + b + ")"
	}
	return "", ""
}

// group wraps an operand as typed in parentheses for a formula, unless
// one pair already encloses the whole of it, so that "(10 Ω + j5 Ω)"
// is not written with two.
func group(s string) string {
	if strings.HasPrefix(s, "(") {
		depth := 0
		for i, r := range s {
			switch r {
			case '(':
				depth++
			case ')':
				depth--
			}
			if depth == 0 {
				if i == len(s)-1 {
					return s
				}
				break
			}
		}
	}
	return "(" + s + ")"
}

// funcOf finds the function a call names, for its rule and formula: one
// of argand's packages, or a built-in (abs and angle being mag and arg).
func (s *Sheet) funcOf(name string) *calc.Func {
	f, ok := s.funcTable()[name]
	if !ok {
		for _, b := range calc.Builtins() {
			if b.Name == name || (name == "abs" && b.Name == "mag") || (name == "angle" && b.Name == "arg") {
				b := b
				f = &b
			}
		}
	}
	return f
}

// elementKind returns the kind of element a statement's first word
// defines. The kinds name themselves by the statements' words (resistor,
// voltage source), so no second list of element words is kept here.
func elementKind(word string) (reduce.ElementKind, bool) {
	for k := reduce.Resistor; k <= reduce.CurrentSource; k++ {
		if first, _, _ := strings.Cut(k.String(), " "); first == word {
			return k, true
		}
	}
	return 0, false
}

// elementDim is the unit dimension of an element kind's component value.
func elementDim(k reduce.ElementKind) calc.Dim {
	switch k {
	case reduce.Inductor:
		return calc.DimInductance
	case reduce.Capacitor:
		return calc.DimCapacitance
	case reduce.VoltageSource:
		return calc.DimVoltage
	case reduce.CurrentSource:
		return calc.DimCurrent
	}
	return calc.DimImpedance
}

// elementLine is an element statement as read: its keyword, kind, name,
// value and, inside a network block, the nodes it joins.
type elementLine struct {
	kw, name calc.Item
	kind     reduce.ElementKind
	e        calc.Expr
	from, to string
	fromTok  calc.Item
}

// stmtElement defines an element: a named component value that remembers
// its kind, so its impedance follows the working frequency. Inside a
// network block it also joins two nodes.
func (s *Sheet) stmtElement(p *calc.Parser, net *network) error {
	el, err := s.readElement(p, net)
	if err != nil {
		return err
	}
	raw, notes, err := s.elementRaw(p, el)
	if err != nil {
		return err
	}
	pos, end, col := el.e.Span()
	n := utf8.RuneCountInString(p.Source()[pos:end])
	elem := &element{kind: el.kind, raw: raw, from: el.from, to: el.to}
	if net != nil {
		elem.net = net.name
		if lim := s.limits.Elements; lim > 0 && len(net.elems) >= lim {
			p.Failf(el.name, "network %s has %d elements, the most allowed here", net.name, lim)
			return p.Err()
		}
	}
	v, err2 := s.elementValue(elem)
	if err2 != nil {
		return lineErr(s.line, col, n, "%v", err2)
	}
	if old, ok := s.byName[el.name.Text]; ok {
		if old.elem == nil || net != nil {
			p.Failf(el.name, "%s is already defined (line %d)", el.name.Text, old.line)
			return p.Err()
		}
	}
	d := &def{name: el.name.Text, src: p.Source(), line: s.line, value: v, elem: elem}
	d.deps, elem.expr = elementDeps(el.kind, el.e)
	elem.src, elem.line = p.Source(), s.line
	_, existed := s.byName[d.name]
	if err := s.setValue(d); err != nil {
		return lineErr(s.line, el.name.Col, 1, "%v", err)
	}
	s.record(s.elementStep(p, el.kind, d.name, raw, v, notes))
	if net != nil {
		net.elems = append(net.elems, d.name)
	}
	if existed {
		if err := s.reevaluate(map[string]bool{d.name: true}, d.name+" changed"); err != nil {
			return err
		}
	}
	return nil
}

// readElement reads an element statement to the end of the line and
// checks that it stands where it may: nodes and sources inside a network
// block only, and no element there without its nodes.
func (s *Sheet) readElement(p *calc.Parser, net *network) (elementLine, error) {
	el := elementLine{kw: p.Next()}
	kind, ok := elementKind(el.kw.Text)
	if !ok {
		p.Failf(el.kw, "%q does not start an element", el.kw.Text)
		return el, p.Err()
	}
	el.kind = kind
	if el.kind.IsSource() {
		p.Next() // source
	}
	el.name = p.Next()
	if !s.validName(p, el.name) {
		return el, p.Err()
	}
	if !p.IsOp("=") {
		return el, perr(p, "expected '=' after the element name %s", el.name.Text)
	}
	p.Next()
	if p.Peek().Tok == calc.TokEOF {
		return el, perr(p, "%s %s needs a value", el.kind, el.name.Text)
	}
	el.e = p.Expr()
	if p.Err() == nil && p.IsWord("from") {
		p.Next()
		el.fromTok = p.Peek()
		el.from = nodeName(p)
		if !expectWord(p, "to", el.kind.String()+" "+el.name.Text) {
			return el, p.Err()
		}
		el.to = nodeName(p)
	}
	p.ExpectEnd()
	if err := p.Err(); err != nil {
		return el, err
	}
	if net == nil && el.from != "" {
		p.Failf(el.fromTok, "nodes (from … to …) belong inside a network block: start one with network NAME reference NODE")
		return el, p.Err()
	}
	if net != nil && el.from == "" {
		p.FailAt(p.EndCol(), 1, "an element inside a network joins two nodes: add from NODE to NODE")
		return el, p.Err()
	}
	if el.kind.IsSource() && net == nil {
		p.Failf(el.kw, "a source belongs inside a network block (network NAME reference NODE … end)")
		return el, p.Err()
	}
	return el, nil
}

// elementRaw evaluates an element's component value and checks it fits
// the kind. A number scaled by a prefix alone (2.2 m) takes the
// element's unit, with a note saying so; a resistor, inductor or
// capacitor takes a real value, a complex one being an impedance.
func (s *Sheet) elementRaw(p *calc.Parser, el elementLine) (calc.Quantity, []string, error) {
	r, err := s.eval(p, el.e)
	if err != nil {
		return calc.Quantity{}, nil, err
	}
	kind, want := el.kind, elementDim(el.kind)
	pos, end, col := el.e.Span()
	n := utf8.RuneCountInString(p.Source()[pos:end])
	if q, ok := calc.AsUnit(el.e, r.Value, want, calc.KindPlain); ok {
		r.Value = q
		r.Notes = calc.Renote(r.Notes, el.e, fmt.Sprintf("read %q as %s (the unit of %s %s)", p.Source()[pos:end], s.ctx.Format.Rect(q), article(kind.String()), kind))
		s.since = max(s.since, 2)
	}
	if r.Value.Dim != want {
		return calc.Quantity{}, nil, lineErr(s.line, col, n, "%s %s takes a value in %s, got %s%s", article(kind.String()), kind, calc.UnitSymbol(want, 0, false), calc.DimName(r.Value.Dim, false), metreHint(r.Value, want))
	}
	if (kind == reduce.Resistor || kind == reduce.Inductor || kind == reduce.Capacitor) && !r.Value.IsReal() {
		return calc.Quantity{}, nil, lineErr(s.line, col, n, "%s %s takes a real value; use impedance for a complex one", article(kind.String()), kind)
	}
	return r.Value, r.Notes, nil
}

// elementStep is the step of an element definition: for an inductor or a
// capacitor, the formula and the frequency its impedance was taken at.
func (s *Sheet) elementStep(p *calc.Parser, kind reduce.ElementKind, name string, raw, v calc.Quantity, notes []string) calc.Step {
	st := calc.Step{Kind: "element", Source: p.Source(), Rule: kind.String(), Notes: notes}
	switch kind {
	case reduce.Inductor:
		st.Formula = "Z = jωL, ω = 2π·f"
	case reduce.Capacitor:
		st.Formula = "Z = 1/(jωC) = −j/(ωC), ω = 2π·f"
	case reduce.Resistor:
		st.Formula = "Z = R"
	}
	if kind == reduce.Inductor || kind == reduce.Capacitor {
		st.Inputs = []calc.Operand{{Name: "value", Value: raw}, {Name: "f", Value: calc.Real(s.ctx.Freq, calc.DimFrequency)}}
	}
	st.Results = []calc.Operand{{Name: name, Value: v}}
	return st
}

// reevaluate re-evaluates what depends on the changed names and records
// the one step that lists what changed.
func (s *Sheet) reevaluate(changed map[string]bool, reason string) error {
	rs, err := s.propagate(changed, reason)
	if err != nil {
		return lineErr(s.line, 1, 1, "%v", err)
	}
	if rs != nil {
		s.record(*rs)
	}
	return nil
}

// changeElement gives an element a new component value (R1 = 120 Ω), keeping
// its kind and nodes, and re-solves what uses it.
func (s *Sheet) changeElement(p *calc.Parser, d *def, v calc.Quantity, e calc.Expr) error {
	want := d.elem.raw.Dim
	pos, end, col := e.Span()
	n := utf8.RuneCountInString(p.Source()[pos:end])
	var notes []string
	if q, ok := calc.AsUnit(e, v, want, calc.KindPlain); ok {
		v = q
		notes = append(notes, fmt.Sprintf("read %q as %s (the unit of %s %s)", p.Source()[pos:end], s.ctx.Format.Rect(q), article(d.elem.kind.String()), d.elem.kind))
		s.since = max(s.since, 2)
	}
	if v.Dim != want {
		return lineErr(s.line, col, n, "%s is a %s: its value is in %s, got %s%s", d.name, d.elem.kind, calc.UnitSymbol(want, 0, false), calc.DimName(v.Dim, false), metreHint(v, want))
	}
	el := *d.elem
	el.raw = v
	z, err := s.elementValue(&el)
	if err != nil {
		return lineErr(s.line, col, n, "%v", err)
	}
	// the new value follows what it reads, as the first one did
	deps, expr := elementDeps(el.kind, e)
	if cyc := s.cycle(d.name, deps); cyc != "" {
		return lineErr(s.line, col, n, "circular definition: %s", cyc)
	}
	s.keep()
	d.deps, el.expr = deps, expr
	el.src, el.line = p.Source(), s.line
	*d.elem = el
	d.value = z
	s.record(calc.Step{Kind: "element", Source: p.Source(), Rule: d.elem.kind.String() + " value changed", Results: []calc.Operand{{Name: d.name, Value: z}}, Notes: notes})
	if err := s.reevaluate(map[string]bool{d.name: true}, d.name+" changed"); err != nil {
		return err
	}
	return nil
}

// metreHint explains a length where a part value was wanted: m straight
// after a number is the metre, an exact unit, not milli.
func metreHint(q calc.Quantity, want calc.Dim) string {
	if q.Dim != calc.DimLength || want == calc.DimLength {
		return ""
	}
	return fmt.Sprintf(" (m after a number is the metre: for milli write the unit too, as in 2.2 m%s)", calc.UnitSymbol(want, 0, false))
}

// nodeName reads a node name: an identifier or a whole number.
func nodeName(p *calc.Parser) string {
	t := p.Peek()
	switch t.Tok {
	case calc.TokIdent, calc.TokNumber:
		p.Next()
		return t.Text
	case calc.TokImag:
		p.Next()
		return p.Source()[t.Off:t.End]
	}
	if t.Tok == calc.TokEOF {
		p.FailAt(t.Col, 1, "expected a node name, found the end of the line")
	} else {
		p.Failf(t, "expected a node name, found %q", t.Text)
	}
	return ""
}

// article returns "an" before a vowel sound and "a" otherwise.
func article(word string) string {
	if word != "" && strings.ContainsRune("aeiou", rune(word[0])) {
		return "an"
	}
	return "a"
}
