// Package sheet is argand's worksheet interpreter: it runs statements of the
// worksheet language one line at a time, keeps the named quantities and
// networks, re-evaluates what depends on a changed value or frequency, and
// records every piece of work as a calc.Step. Expression statements and
// network statements plug into the same interpreter; the command line and
// the app both drive it.
package sheet

import (
	"fmt"
	"math"
	"slices"
	"sort"
	"strings"

	"argand/calc"
	"argand/reduce"
	"argand/reduce/harmonic"
)

// DefaultFreq is the working frequency of a new worksheet, in Hz.
const DefaultFreq = 50

// MaxNames bounds the named quantities of one worksheet, so that a
// generated or hostile file cannot exhaust memory unnoticed.
const MaxNames = 200000

// def is one named quantity and how it was made.
type def struct {
	name  string
	src   string // the statement as typed
	line  int
	expr  calc.Expr // nil for values set from outside (network results)
	value calc.Quantity
	deps  map[string]bool // names the expression reads, including "f"
	elem  *element        // non-nil for an element definition
	owner string          // for NAME.key extras: the defining name
	key   string
	// recalc recomputes a value made by a statement rather than an
	// expression (a Thevenin equivalent), with its extras.
	recalc func() (calc.Quantity, []calc.Operand, error)
}

// element remembers the component value of an element definition, so its
// impedance follows the working frequency.
type element struct {
	kind reduce.ElementKind
	raw  calc.Quantity // R, L, C, Z, or the source phasor
	from string        // nodes, inside a network block
	to   string
	net  string
	// expr is the value as written when it reads names (resistor R1 =
	// Rnom, voltage source V2 = Vf): raw is worked out from it again
	// whenever a name it reads changes, as any definition's value is.
	// nil for a value written as a number. src and line are the
	// statement it stands in, for the places of errors.
	expr calc.Expr
	src  string
	line int
}

// Settings are the worksheet settings, each set by a statement so that a
// worksheet replays to the same values.
type Settings struct {
	Freq     float64 // Hz
	Basis    calc.Basis
	Radians  bool
	Digits   int
	Sequence int     // 1 ABC, −1 ACB
	Budget   float64 // bound on a statement's estimated work, seconds
	Comma    bool    // the decimal comma, on input and in the values shown
}

// Sheet is a worksheet being run.
type Sheet struct {
	ctx    calc.Context
	defs   []*def
	byName map[string]*def
	funcs  map[string]*calc.Func
	nets   map[string]*network
	order  []string // network names in definition order
	open   *network // network block being written
	steps  []calc.Step
	stmts  []string // accepted statements, a replayable worksheet
	line   int
	pass   int
	fail   int
	sweeps []*SweepResult
	tols   map[string]float64 // relative tolerance of a named value
	// dry, when set, checks statements without the long computations
	// (sweeps, tolerance ranges): Validate runs on every keystroke.
	dry bool
	// lenient, when set, collects the definitions that fail to re-evaluate
	// instead of failing the propagation (used at sweep points).
	lenient map[string]error
	// lang is the language version the worksheet declared (0: none, read
	// as this build reads); since is the newest version whose reading the
	// current line used, and changedLine the last line whose reading
	// changed since lang.
	lang, since, changedLine int
	// changed lists those lines, for the session and the app.
	changed []int
	// shadow is the note for a new name that is also a unit symbol, said
	// on the line that defines it
	shadow string
	// autoNext is the next number to try for each letter of an automatic
	// name, so naming stays linear in a long worksheet.
	autoNext map[string]int
	// noteSeen holds the notes already recorded by the statement being
	// run, so a caution repeated by each part of one calculation is kept
	// once without reading back over the trail.
	noteSeen map[string]bool
	// cautionSeen holds the caution topics of the statement being run
	// (one of each topic a statement), and cautionFull those already
	// shown whole in this session, each a set of bits by topic: the
	// whole text is shown once per session, then its line.
	cautionSeen, cautionFull uint32
	// defined lists the names the statement being run defined or
	// redefined, in order, for Exec to return.
	defined []string
	// quiet marks a working copy that evaluates samples (sweep points,
	// tolerance samples): networks are solved again without steps.
	quiet bool
	// job is the running statement's cancellation and progress, or nil.
	job *Job
	// samples holds the maps of propagation a working copy reuses from
	// one sample to the next (see sampleMaps); nil elsewhere.
	samples *sampleMaps
	// snap is the worksheet as it was before the running statement
	// changed something already defined (see keep); nil otherwise.
	snap *Sheet
	// resolving is set while a change is carried through the worksheet
	// (propagate): the networks it feeds are solved again, and Thevenin
	// equivalents worked out again, on the worksheet itself, which a
	// stop part way would leave half changed: their factorisations then
	// run to the end.
	resolving bool
	// budget is the bound on a statement's estimated work, in seconds.
	budget float64
	// limits bound the worksheet's size and the budget it may set.
	limits Limits
	// spectra are the spectra defined by spectrum statements; a spectrum
	// never changes once built, so copies of the worksheet share them.
	spectra map[string]*spectrumDef
	// startComma is the decimal marker the first statement was read with:
	// saved worksheets state it after their language line.
	startComma bool
	// title is the job's title, from the title statement.
	title string
	// dir is the directory a relative file name in a statement (readings
	// FILE, spectrum NAME from FILE) starts from: the worksheet file's own
	// (SetDir), else "" for the working directory.
	dir string
}

// New returns an empty worksheet at the default settings with every
// function of argand's packages available.
func New() *Sheet {
	s := &Sheet{
		ctx:     calc.Context{Freq: DefaultFreq, Sequence: 1, Format: calc.Format{Digits: calc.DefaultDigits}},
		byName:  map[string]*def{},
		nets:    map[string]*network{},
		tols:    map[string]float64{},
		budget:  DefaultBudget,
		limits:  DefaultLimits(),
		spectra: map[string]*spectrumDef{},
	}
	return s
}

// funcTable returns the functions of argand's packages by name, made on
// first use: a worksheet of plain arithmetic (argand eval) never needs
// them. Copies of a worksheet share the table, which never changes.
func (s *Sheet) funcTable() map[string]*calc.Func {
	if s.funcs == nil {
		fs := allFuncs()
		s.funcs = make(map[string]*calc.Func, len(fs))
		for i := range fs {
			s.funcs[fs[i].Name] = &fs[i]
		}
	}
	return s.funcs
}

// Settings returns the current settings.
func (s *Sheet) Settings() Settings {
	return Settings{Freq: s.ctx.Freq, Basis: s.ctx.Basis, Radians: s.ctx.Format.Radians, Digits: s.ctx.Format.Digits, Sequence: s.ctx.Sequence, Budget: s.budget, Comma: s.ctx.Format.Comma}
}

// Context returns the evaluation context (settings) in force.
func (s *Sheet) Context() *calc.Context { return &s.ctx }

// Lookup finds a named quantity: a definition, a network result, or the
// working frequency f (Hz) and ω (w, rad/s).
func (s *Sheet) Lookup(name string) (calc.Quantity, bool) {
	switch name {
	case "f":
		return calc.Real(s.ctx.Freq, calc.DimFrequency), true
	case "w", "ω":
		return calc.Quantity{V: complex(s.ctx.Omega(), 0), Dim: calc.DimAngularFrequency, Kind: calc.KindAngle}, true
	}
	if d, ok := s.byName[name]; ok {
		return d.value, true
	}
	return calc.Quantity{}, false
}

// Func finds a function beyond the built-in ones.
func (s *Sheet) Func(name string) (*calc.Func, bool) {
	if harmonic.TakesSpectrum(name) {
		return s.spectrumFunc(name)
	}
	f, ok := s.funcTable()[name]
	return f, ok
}

// Steps returns the trail of the whole session, oldest first.
func (s *Sheet) Steps() []calc.Step { return s.steps }

// Statements returns the accepted statements in order: a worksheet that
// replays to the same values. A worksheet begun under the decimal comma
// starts with the statement that sets it, so it replays the same wherever
// it is run.
func (s *Sheet) Statements() []string {
	if s.startComma {
		return append([]string{DecimalLine(true)}, s.stmts...)
	}
	return append([]string(nil), s.stmts...)
}

// Worksheet returns the worksheet to save or export: the language line,
// the decimal marker the statements begin in, and the statements.
func (s *Sheet) Worksheet() []string {
	return append([]string{LanguageLine(), DecimalLine(s.startComma)}, s.stmts...)
}

// DecimalLine is the statement that sets the decimal marker.
func DecimalLine(comma bool) string {
	if comma {
		return "decimal comma"
	}
	return "decimal point"
}

// ChangeMarker rewrites a worksheet line typed under one decimal marker for
// the other (2.2 ↔ 2,2, and ',' ↔ ';' between arguments), its comment
// kept as it is. The decimal statement itself is swapped too, so that the
// rewritten worksheet reads the same.
func ChangeMarker(line string, fromComma bool) string {
	body, comment := line, ""
	if i := strings.IndexByte(line, '#'); i >= 0 {
		body, comment = line[:i], line[i:]
	}
	switch strings.TrimSpace(body) {
	case DecimalLine(fromComma):
		return DecimalLine(!fromComma) + comment
	}
	return calc.ChangeMarker(body, fromComma) + comment
}

// CommaAt reports whether the statement stmts[k] of a worksheet is read
// under the decimal comma: the last decimal statement before it says so.
func CommaAt(stmts []string, k int) bool {
	comma := false
	for _, st := range stmts[:min(k, len(stmts))] {
		if f := strings.Fields(st); len(f) == 2 && f[0] == "decimal" {
			comma = f[1] == "comma"
		}
	}
	return comma
}

// SetDecimalComma sets the decimal marker before the first statement (as
// the --decimal-comma flag does), without a step. Once statements have
// been run, the marker changes only by the decimal statement, which the
// worksheet keeps; then SetDecimalComma reports false and changes nothing.
func (s *Sheet) SetDecimalComma(comma bool) bool {
	if len(s.stmts) > 0 {
		return false
	}
	s.startComma, s.ctx.Format.Comma = comma, comma
	return true
}

// parser returns a parser over a statement with the worksheet's decimal
// marker.
func (s *Sheet) parser(src string, line int) *calc.Parser {
	return calc.NewParserComma(src, line, s.ctx.Format.Comma)
}

// Checks returns how many check statements passed and failed.
func (s *Sheet) Checks() (pass, fail int) { return s.pass, s.fail }

// Entry is a named quantity as the app lists it.
type Entry struct {
	Name   string
	Value  calc.Quantity
	Source string
	Line   int
	Kind   string // "value", or the element kind word
	Raw    *calc.Quantity
}

// Entries returns the named quantities in definition order, without the
// dotted extras of function results and networks.
func (s *Sheet) Entries() []Entry {
	var out []Entry
	for _, d := range s.defs {
		if d.owner != "" {
			continue
		}
		e := Entry{Name: d.name, Value: d.value, Source: d.src, Line: d.line, Kind: "value"}
		if d.elem != nil {
			e.Kind = d.elem.kind.String()
			r := d.elem.raw
			e.Raw = &r
		}
		out = append(out, e)
	}
	return out
}

// Names returns every name defined, dotted extras included, sorted.
func (s *Sheet) Names() []string {
	out := make([]string, 0, len(s.byName))
	for n := range s.byName {
		out = append(out, n)
	}
	sort.Strings(out)
	return out
}

// evaluator returns an evaluator over the worksheet's names and
// functions, its errors located in src at line.
func (s *Sheet) evaluator(src string, line int) *calc.Evaluator {
	return &calc.Evaluator{Env: s, Src: src, Line: line}
}

// readOnlyNames are the names the worksheet reads but never defines.
var readOnlyNames = map[string]string{
	"f": "the working frequency (set it with: frequency 60 Hz)", "w": "the working angular frequency ω",
	"ω": "the working angular frequency ω", "pi": "the constant π", "π": "the constant π", "e": "the constant e",
	"j": "the imaginary unit", "i": "the imaginary unit",
}

// Reserved reports why name cannot name a quantity, or "" when it can.
// Constants, functions, statement keywords (from the keyword table),
// spectra, f and w/ω are reserved. Unit symbols are not: a unit only ever
// follows a number, so "10 S" is ten siemens whatever S names, and
// S = 230 V * 6.2 A reads as written.
func (s *Sheet) Reserved(name string) string {
	if why, ok := readOnlyNames[name]; ok {
		return why
	}
	for _, k := range keywords {
		// a keyword that needs a second word (voltage source) leaves the
		// first free for a name
		if k.word == name && k.second == "" {
			return "a statement keyword"
		}
	}
	if _, ok := s.spectra[name]; ok {
		return "a spectrum"
	}
	if _, ok := s.funcTable()[name]; ok {
		return "a function name"
	}
	for _, f := range calc.Builtins() {
		if f.Name == name {
			return "a function name"
		}
	}
	if name == "abs" || name == "angle" {
		return "a function name"
	}
	return ""
}

// validName checks a name being defined.
func (s *Sheet) validName(p *calc.Parser, t calc.Item) bool {
	if t.Tok != calc.TokIdent {
		if t.Tok == calc.TokImag {
			p.Failf(t, "%q reads as an imaginary number, not a name", p.Source()[t.Off:t.End])
		} else {
			p.Failf(t, "expected a name, found %q", t.Text)
		}
		return false
	}
	if why := s.Reserved(t.Text); why != "" {
		p.Failf(t, "%q is reserved (%s) and cannot be used as a name", t.Text, why)
		return false
	}
	if strings.Contains(t.Text, ".") {
		p.Failf(t, "a name cannot contain '.': dotted names are results (such as T1.z)")
		return false
	}
	if _, defined := s.byName[t.Text]; !defined && calc.IsUnit(t.Text) {
		s.shadow = fmt.Sprintf("%s is also a unit symbol: written after a number (10 %s) it is still the unit; alone it is this name", t.Text, t.Text)
	}
	return true
}

// lineErr builds an error located at line and column, n characters long.
func lineErr(line, col, n int, format string, a ...any) *calc.Error {
	if n < 1 {
		n = 1
	}
	return &calc.Error{Line: line, Col: col, Len: n, Msg: fmt.Sprintf(format, a...)}
}

// recordPart records the steps of a part of a statement's work (a
// function's own steps), headed by the statement as typed so that every
// step names the line it came from.
func (s *Sheet) recordPart(src string, steps []calc.Step) {
	for i := range steps {
		if steps[i].Source == "" {
			steps[i].Source = src
		}
	}
	s.record(steps...)
}

// record appends steps to the trail, stamping line and basis. A note
// already given by an earlier step of the same statement (a caution
// repeated by each part of one calculation) is not repeated. A working
// copy that evaluates samples records nothing.
func (s *Sheet) record(steps ...calc.Step) {
	if s.quiet || s.dry {
		// a working copy keeps no trail, and a live check's is thrown
		// away: appending to a copy's trail would copy all of it first
		return
	}
	if s.noteSeen == nil {
		s.noteSeen = map[string]bool{}
	}
	for i := range steps {
		var notes []string
		for _, n := range steps[i].Notes {
			if !s.noteSeen[n] {
				s.noteSeen[n] = true
				notes = append(notes, n)
			}
		}
		steps[i].Notes = notes
		steps[i].Cautions = s.cautions(steps[i].Cautions)
		steps[i].Source = strings.TrimRight(steps[i].Source, " \t")
		if steps[i].Line == 0 {
			steps[i].Line = s.line
		}
		steps[i].Basis = s.ctx.Basis
	}
	s.steps = append(s.steps, steps...)
}

// cautions returns a step's cautions in a new slice (a function's steps
// and result may share theirs), each topic once a statement, whole the
// first time in the session.
func (s *Sheet) cautions(in []calc.StepCaution) []calc.StepCaution {
	var out []calc.StepCaution
	for _, c := range in {
		bit := uint32(1) << c.Topic
		if s.cautionSeen&bit != 0 {
			continue
		}
		s.cautionSeen |= bit
		c.Full = s.cautionFull&bit == 0
		s.cautionFull |= bit
		out = append(out, c)
	}
	return out
}

// setValue stores a definition, new or replacing an old one in its place
// (so that what depends on it stays after it), and notes its name among
// those the statement defined. It refuses a circular redefinition and a
// worksheet past MaxNames; the caller re-evaluates what depends on it.
func (s *Sheet) setValue(d *def) error {
	old, exists := s.byName[d.name]
	if !exists && len(s.byName) >= s.limits.Names {
		return fmt.Errorf("too many names (the limit is %d)", s.limits.Names)
	}
	if d.owner == "" && !slices.Contains(s.defined, d.name) {
		s.defined = append(s.defined, d.name)
	}
	if exists {
		// a redefinition keeps its place, so dependents stay after it
		if cyc := s.cycle(d.name, d.deps); cyc != "" {
			return fmt.Errorf("circular definition: %s", cyc)
		}
		s.keep()
		*old = *d
	} else {
		s.defs = append(s.defs, d)
		s.byName[d.name] = d
	}
	return nil
}

// cycle reports a dependency path back to name, or "". A network's
// results depend on what the network reads (its elements, the
// frequency), so the path passes from a result, or from "net:NAME", to
// them: an element whose value reads a result of its own network, or of
// a network that reads it, closes a loop.
func (s *Sheet) cycle(name string, deps map[string]bool) string {
	seen := map[string]bool{}
	var ofResult map[string]*network // made at the first need
	netDeps := func(n string) map[string]bool {
		if nw, ok := s.nets[strings.TrimPrefix(n, "net:")]; ok && strings.HasPrefix(n, "net:") {
			return nw.deps
		}
		if ofResult == nil {
			ofResult = map[string]*network{}
			for _, nw := range s.nets {
				for _, r := range nw.results {
					ofResult[r] = nw
				}
			}
		}
		if nw := ofResult[n]; nw != nil {
			return nw.deps
		}
		return nil
	}
	var walk func(n string, path []string) string
	walk = func(n string, path []string) string {
		if n == name {
			return strings.Join(append(path, n), " → ")
		}
		if seen[n] || len(path) > 10000 {
			return ""
		}
		seen[n] = true
		next := netDeps(n)
		if d, ok := s.byName[n]; ok && len(d.deps) > 0 {
			next = d.deps
		}
		for k := range next {
			if c := walk(k, append(path, n)); c != "" {
				return c
			}
		}
		return ""
	}
	for k := range deps {
		if c := walk(k, []string{name}); c != "" {
			return c
		}
	}
	return ""
}

// sampleMaps are the maps of a propagation, kept by a working copy that
// evaluates many samples: a sample of a large network marks thousands of
// names changed, and maps made afresh for each would spend most of the
// sample growing them. clear keeps their storage. busy guards against a
// propagation within a propagation taking the same maps.
type sampleMaps struct {
	changed   map[string]bool
	when      map[string]int
	evaluated map[*def]int
	busy      bool
	// read holds every name a definition or a network reads, made at
	// the first sample: the definitions do not change between samples.
	// A network result nothing reads need not be marked changed, and
	// the thousands of results of a large network mostly are not.
	read map[string]bool
}

// reads reports whether some definition or network of s reads name.
func (m *sampleMaps) reads(s *Sheet, name string) bool {
	if m.read == nil {
		m.read = map[string]bool{}
		for _, d := range s.defs {
			for k := range d.deps {
				m.read[k] = true
			}
		}
		for _, nw := range s.nets {
			for k := range nw.deps {
				m.read[k] = true
			}
		}
	}
	return m.read[name]
}

// liveElements is the most network elements a live check (Validate)
// solves again: past it the re-solves of one key would take tens of
// milliseconds or more (about 1 µs an element, BenchmarkEstimate).
const liveElements = 5000

// networkElements counts the elements of all networks.
func (s *Sheet) networkElements() int {
	n := 0
	for _, nw := range s.nets {
		n += len(nw.elems)
	}
	return n
}

// propagation is one run of propagate. when[name] is the tick at which a
// name changed (the inputs at tick 0) and evaluated[d] the tick of d's
// last evaluation in this run: a definition is due when a name it reads
// changed after that.
type propagation struct {
	changed   map[string]bool
	when      map[string]int
	evaluated map[*def]int
	tick      int
	hits      int        // definitions whose value changed
	step      *calc.Step // lists each change, old and new
}

// propagate re-evaluates every definition that depends on a changed name
// (a new frequency changes the names f, w and ω), in definition order,
// repeating until nothing more changes, and re-solves networks that use
// them. It returns one step listing what changed, or nil when nothing did
// or the worksheet is a quiet working copy; reason heads that step.
//
// A definition is evaluated again only when a name it reads changed after
// its own last evaluation: definitions stand in dependency order, so one
// pass usually settles them, and a later pass touches only what reads a
// re-solved network.
func (s *Sheet) propagate(changed map[string]bool, reason string) (*calc.Step, error) {
	if s.dry && s.networkElements() > liveElements {
		// A live check while typing: carrying the change through the
		// networks of a large worksheet would hold up every key. The
		// statement itself is checked; what it changes is worked out,
		// and its errors shown, when it runs.
		return nil, nil
	}
	// A Thevenin equivalent evaluated again solves its network too: on
	// the worksheet itself that runs to its end, as a re-solve does.
	was := s.resolving
	s.resolving = true
	defer func() { s.resolving = was }()
	pr := &propagation{
		changed: changed,
		tick:    1,
		step:    &calc.Step{Kind: "recompute", Source: reason, Rule: "re-evaluated what depends on the change"},
	}
	if m := s.samples; m != nil && !m.busy {
		m.busy = true
		defer func() { m.busy = false }()
		clear(m.when)
		clear(m.evaluated)
		pr.when, pr.evaluated = m.when, m.evaluated
	} else {
		pr.when, pr.evaluated = make(map[string]int, len(changed)), map[*def]int{}
	}
	for k := range changed {
		pr.when[k] = 0
	}
	for pass := 0; pass <= len(s.defs)+1; pass++ {
		if err := s.stopped(); err != nil {
			return nil, err
		}
		more, err := s.propagatePass(pr, pass)
		if err != nil {
			return nil, err
		}
		nets, err := s.resolveNets(changed, pr.when, &pr.tick)
		if err != nil {
			return nil, err
		}
		if nets {
			more = true
		}
		if !more {
			break
		}
	}
	if pr.hits == 0 || s.quiet {
		return nil, nil
	}
	return pr.step, nil
}

// propagatePass evaluates again, in definition order, each definition due
// in this pass, and reports whether any value changed. In a lenient run a
// definition that fails is set aside with its error instead of failing
// the whole.
func (s *Sheet) propagatePass(pr *propagation, pass int) (bool, error) {
	more := false
	for _, d := range s.defs {
		if !pr.due(d, pass) {
			continue
		}
		pr.evaluated[d] = pr.tick
		pr.tick++
		nv, extra, err := s.reeval(d)
		if err != nil {
			if s.lenient != nil {
				s.lenient[d.name] = err
				continue
			}
			return false, fmt.Errorf("while re-evaluating %s (line %d): %w", d.name, d.line, err)
		}
		if s.noteChange(pr, d, nv) {
			more = true
		}
		// the NAME.key results of a function follow their owner, and
		// what reads them follows in turn
		for _, x := range extra {
			if e, ok := s.byName[d.name+"."+x.Name]; ok && s.noteChange(pr, e, x.Value) {
				more = true
			}
		}
	}
	return more, nil
}

// due reports whether d must be evaluated again: it is computed (not a
// value set from outside), and a name it reads, or for a reactive element
// the frequency, changed since its last evaluation. A changed input is
// not evaluated over in the first pass, which would undo the change.
func (pr *propagation) due(d *def, pass int) bool {
	if d.expr == nil && d.elem == nil && d.recalc == nil {
		return false
	}
	last, seen := pr.evaluated[d]
	if !seen {
		last = -1
	}
	hit := false
	for k := range d.deps {
		if t, ok := pr.when[k]; ok && t > last {
			hit = true
			break
		}
	}
	if d.elem != nil && d.elem.kind != reduce.Resistor {
		if t, ok := pr.when["f"]; ok && t > last {
			hit = true
		}
	}
	return hit && !(pr.changed[d.name] && d.owner == "" && pass == 0 && d.expr == nil)
}

// noteChange stores a re-evaluated value and, when it differs, marks the
// name changed now and lists it on the step (once, with the value before).
// It reports whether the value changed.
func (s *Sheet) noteChange(pr *propagation, d *def, nv calc.Quantity) bool {
	old := d.value
	if nv.V == old.V && nv.Dim == old.Dim {
		return false
	}
	d.value = nv
	pr.when[d.name] = pr.tick
	pr.tick++
	if !pr.changed[d.name] {
		pr.changed[d.name] = true
		pr.hits++
		if !s.quiet {
			pr.step.Inputs = append(pr.step.Inputs, calc.Operand{Name: d.name + " (before)", Value: old})
			pr.step.Results = append(pr.step.Results, calc.Operand{Name: d.name, Value: nv})
		}
	}
	return true
}

// reeval computes a definition's value again from its expression or
// element value.
func (s *Sheet) reeval(d *def) (calc.Quantity, []calc.Operand, error) {
	if d.elem != nil {
		if d.elem.expr != nil {
			raw, err := s.elementRawAgain(d)
			if err != nil {
				return calc.Quantity{}, nil, err
			}
			d.elem.raw = raw
		}
		q, err := s.elementValue(d.elem)
		return q, nil, err
	}
	if d.recalc != nil {
		return d.recalc()
	}
	if d.owner != "" {
		return d.value, nil, nil
	}
	ev := s.evaluator(d.src, d.line)
	r, err := ev.Eval(d.expr)
	if err != nil {
		return calc.Quantity{}, nil, err
	}
	return r.Value, r.Extra, nil
}

// elementRawAgain evaluates the value expression of element d again,
// by the rules elementRaw applied when it was defined: a plain number
// takes the element's unit, and the value must be in that unit (and real
// for a resistor, an inductor or a capacitor).
func (s *Sheet) elementRawAgain(d *def) (calc.Quantity, error) {
	el := d.elem
	r, err := s.evaluator(el.src, el.line).Eval(el.expr)
	if err != nil {
		return calc.Quantity{}, err
	}
	want := elementDim(el.kind)
	v := r.Value
	if q, ok := calc.AsUnit(el.expr, v, want, calc.KindPlain); ok {
		v = q
	}
	if v.Dim != want {
		return calc.Quantity{}, fmt.Errorf("%s is %s %s: its value is in %s, got %s", d.name, article(el.kind.String()), el.kind, calc.UnitSymbol(want, 0, false), calc.DimName(v.Dim, false))
	}
	if (el.kind == reduce.Resistor || el.kind == reduce.Inductor || el.kind == reduce.Capacitor) && !v.IsReal() {
		return calc.Quantity{}, fmt.Errorf("%s is %s %s and takes a real value; use impedance for a complex one", d.name, article(el.kind.String()), el.kind)
	}
	return v, nil
}

// elementDeps returns what an element whose value is written as e reads:
// the names in e, and the frequency for an inductor or a capacitor; nil
// when it reads nothing. The expression is kept (element.expr) only when
// it reads names: a number never changes.
func elementDeps(kind reduce.ElementKind, e calc.Expr) (map[string]bool, calc.Expr) {
	// A value that reads only the frequency (resistor Rf = f·1 Ω/Hz)
	// must be kept too: testing the names without f would fix it at
	// its first frequency.
	deps := depsOf(e)
	var expr calc.Expr
	if len(deps) > 0 {
		expr = e
	}
	if kind == reduce.Inductor || kind == reduce.Capacitor {
		deps["f"] = true
	}
	if len(deps) == 0 {
		return nil, nil // a resistor of a number reads nothing: no map
	}
	return deps, expr
}

// elementValue is the quantity an element name stands for: its impedance
// at the working frequency, or its source phasor.
func (s *Sheet) elementValue(e *element) (calc.Quantity, error) {
	switch e.kind {
	case reduce.Resistor, reduce.Impedance, reduce.VoltageSource, reduce.CurrentSource:
		return e.raw, nil
	case reduce.Inductor:
		return calc.InductorZ(e.raw.V, s.ctx.Freq)
	case reduce.Capacitor:
		return calc.CapacitorZ(e.raw.V, s.ctx.Freq)
	}
	return calc.Quantity{}, fmt.Errorf("unknown element kind")
}

// finite reports a usable float.
func finite(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }
