package sheet

import (
	"context"
	"errors"
	"fmt"
	"sort"
	"strings"

	"argand/calc"
	"argand/reduce"
	"argand/reduce/nodal"
)

// network is a network defined in the worksheet: a node block, or a
// compact series-parallel form over element names.
type network struct {
	name    string
	ref     string
	line    int
	elems   []string // element names, in order
	compact calc.Expr
	src     string // statement of a compact network
	feed    calc.Expr
	deps    map[string]bool
	sol     *nodal.Solution
	results []string  // names this network defined
	tri     *triangle // a network derived by a Δ–Y conversion
	// tree is a compact network's series-parallel form, read once when
	// it is defined; red is the reduction of the latest solution, kept
	// for the app's view of the network, or why says why there is none.
	tree *reduce.SPNode
	red  *reduce.Reduction
	why  string
	// A working copy that evaluates samples keeps one built network and
	// changes only its values: solver holds it, elemDefs the definitions
	// its elements come from and resultDefs those its results go to, in
	// the order of results. Clone drops them, so no copy shares them.
	solver     *netSolver
	elemDefs   []*def
	resultDefs []*def
}

// netSolver solves one built network as its element values change. It is
// the one place the worksheet asks for a nodal solution, so that a solver
// which analyses a network's structure once and then refactorises for
// each change of values can take its place.
type netSolver struct {
	net  *reduce.Network
	plan *nodal.Plan // the symbolic analysis, made at the first solve
	// last is the solution of the last sample, whose maps and branches
	// the next one is written into: the worksheet has read its values.
	last *nodal.Solution
}

// solve solves the network at its present element values. The ordering
// and symbolic analysis are made once and kept, so a sweep or a spread
// pays per sample only for a numeric refactorisation and a solve. The
// factorisation stops with ctx's error when ctx ends.
func (v *netSolver) solve(ctx context.Context, basis calc.Basis) (*nodal.Solution, error) {
	if v.plan == nil || !v.plan.Fits(v.net) {
		p, err := nodal.Analyse(v.net)
		if err != nil {
			return nil, err
		}
		v.plan = p
	}
	sol, err := v.plan.SolveReuse(ctx, v.net, basis, v.last)
	v.last = sol // nil after an error: prev is then unusable
	return sol, err
}

// NetworkInfo describes a defined network for the app.
type NetworkInfo struct {
	Name      string
	Reference string
	Line      int
	Elements  []reduce.Element
	Compact   string // the compact form as written, "" for a node block
}

// Networks returns the defined networks in definition order.
func (s *Sheet) Networks() []NetworkInfo {
	var out []NetworkInfo
	for _, n := range s.order {
		nw := s.nets[n]
		info := NetworkInfo{Name: nw.name, Reference: nw.ref, Line: nw.line}
		if nw.compact != nil {
			info.Compact = nw.src
		}
		if net, err := s.build(nw); err == nil {
			info.Elements = net.Elements
		}
		out = append(out, info)
	}
	return out
}

// Network returns the network of that name with impedances at the
// working frequency, for stepping through it in the app.
func (s *Sheet) Network(name string) (*reduce.Network, error) {
	nw, ok := s.nets[name]
	if !ok {
		return nil, fmt.Errorf("no network named %s", name)
	}
	return s.build(nw)
}

// stmtNetwork runs: network NAME [reference NODE], which opens a node
// block (its elements follow, one a line, until end), or network NAME =
// EXPR fed by SOURCE, a compact series-parallel network on one line.
func (s *Sheet) stmtNetwork(p *calc.Parser) error {
	p.Next()
	nameTok := p.Next()
	if !s.validName(p, nameTok) {
		return p.Err()
	}
	name := nameTok.Text
	if _, ok := s.nets[name]; ok {
		p.Failf(nameTok, "network %s is already defined", name)
		return p.Err()
	}
	if _, ok := s.byName[name]; ok {
		p.Failf(nameTok, "%s is already a named value", name)
		return p.Err()
	}
	if p.IsOp("=") {
		return s.compactNetwork(p, name)
	}
	nw := &network{name: name, line: s.line}
	if p.IsWord("reference") {
		p.Next()
		nw.ref = nodeName(p)
	}
	p.ExpectEnd()
	if err := p.Err(); err != nil {
		return err
	}
	s.open = nw
	s.record(calc.Step{Kind: "network", Source: p.Source(), Rule: "network " + name + " begins: elements follow, one a line, until end"})
	return nil
}

// closeBlock runs end: the open network block is closed and solved.
func (s *Sheet) closeBlock(p *calc.Parser) error {
	if s.open == nil {
		p.Failf(p.Next(), "'end' without an open network block")
		return p.Err()
	}
	p.Next()
	p.ExpectEnd()
	if err := p.Err(); err != nil {
		return err
	}
	return s.closeNetwork(p)
}

// closeNetwork solves the open block and keeps it as a network. Without a
// reference written, a node called gnd, 0, ground, N or n is taken, as
// schematics commonly name it. A block that fails to solve is not kept,
// nor are its elements, so the worksheet stays as before the block.
func (s *Sheet) closeNetwork(p *calc.Parser) error {
	nw := s.open
	if len(nw.elems) == 0 {
		p.FailAt(1, 3, "network %s has no elements", nw.name)
		return p.Err()
	}
	ref, deps := nw.ref, nw.deps
	if nw.ref == "" {
		nodes := map[string]bool{}
		for _, e := range nw.elems {
			el := s.byName[e].elem
			nodes[el.from], nodes[el.to] = true, true
		}
		for _, c := range []string{"gnd", "0", "ground", "N", "n"} {
			if nodes[c] {
				nw.ref = c
				break
			}
		}
		if nw.ref == "" {
			return lineErr(nw.line, 1, 7, "network %s has no reference node: write network %s reference NODE, or use a node called gnd", nw.name, nw.name)
		}
	}
	nw.deps = map[string]bool{"f": true}
	for _, e := range nw.elems {
		nw.deps[e] = true
	}
	s.open = nil
	s.nets[nw.name] = nw
	s.order = append(s.order, nw.name)
	if err := s.solve(nw, "network "+nw.name+" solved"); err != nil {
		delete(s.nets, nw.name)
		s.order = s.order[:len(s.order)-1]
		if errors.Is(err, context.Canceled) || errors.Is(err, context.DeadlineExceeded) {
			// stopped, not failed: the block stays open as it was
			nw.ref, nw.deps = ref, deps
			s.open = nw
			return err
		}
		// the block is not kept: its elements go with it
		s.dropElements(nw.elems)
		var ne *nodal.NetError
		if errors.As(err, &ne) && ne.Line > 0 {
			return lineErr(ne.Line, 1, 1, "network %s: %s", nw.name, ne.Msg)
		}
		return lineErr(s.line, 1, 3, "network %s: %v", nw.name, err)
	}
	return nil
}

// dropElements removes the named elements, those of a block that was not
// kept.
func (s *Sheet) dropElements(names []string) {
	drop := map[string]bool{}
	for _, n := range names {
		drop[n] = true
	}
	s.dropNames(func(d *def) bool { return drop[d.name] })
}

// build makes the reduce.Network of a worksheet network at the working
// frequency.
func (s *Sheet) build(nw *network) (*reduce.Network, error) {
	out := &reduce.Network{Name: nw.name, Reference: nw.ref}
	for _, name := range nw.elems {
		d, ok := s.byName[name]
		if !ok || d.elem == nil {
			return nil, fmt.Errorf("element %s is not defined", name)
		}
		el := d.elem
		e := reduce.Element{Name: name, Kind: el.kind, From: el.from, To: el.to, Raw: el.raw.V, Line: d.line}
		if el.kind.IsSource() {
			e.Value = el.raw.V
		} else {
			e.Z = d.value.V
		}
		out.Elements = append(out.Elements, e)
	}
	return out, nil
}

// solve solves a node network and defines its results as names:
// NET.ELEM.v, NET.ELEM.i, NET.ELEM.s and NET.NODE.v.
func (s *Sheet) solve(nw *network, reason string) error {
	if nw.compact != nil {
		return s.solveCompact(nw, reason)
	}
	if s.quiet && nw.tri == nil {
		return s.solveAgain(nw)
	}
	net, err := s.build(nw)
	if err != nil {
		return err
	}
	var pre []calc.Step
	if nw.tri != nil {
		if pre, err = s.yArms(nw.tri, net); err != nil {
			return err
		}
	}
	sol, err := (&netSolver{net: net}).solve(s.jobCtx(), s.ctx.Basis)
	if err != nil {
		return err
	}
	nw.sol = sol
	if s.quiet {
		s.defineSolution(nw, sol)
		return nil
	}
	sp, red, why := s.spSteps(net)
	nw.red, nw.why = red, why
	if s.job != nil && s.job.NoTrail {
		// its steps are printed below; only the app's view of the
		// network reads the reduction again, and a run has no app
		nw.red, nw.why = nil, "not kept by a run that keeps no trail"
	}
	stepped := red != nil
	all := sol.Steps(s.ctx.Format)
	steps := make([]calc.Step, 0, len(pre)+len(sp)+len(all)) // sized once
	steps = append(append(steps, pre...), sp...)
	for _, st := range all {
		// a network reduced step by step has its element table already
		if stepped && st.Kind == "element" {
			continue
		}
		steps = append(steps, st)
	}
	for i := range steps {
		if steps[i].Source == "" {
			steps[i].Source = "network " + nw.name
		}
	}
	if n := len(steps); n > 0 {
		steps[n-1].Notes = append(steps[n-1].Notes, s.sourceNotes(sol)...)
	}
	if len(steps) > 0 {
		steps[0].Notes = append(steps[0].Notes, reason)
	}
	s.record(steps...)
	s.defineSolution(nw, sol)
	return nil
}

// solveAgain solves a node network of a working copy at its present
// element values without steps, reusing one built network: only the
// values change from one sample to the next, and the results are written
// to the definitions found at the first solution.
func (s *Sheet) solveAgain(nw *network) error {
	if nw.solver == nil {
		net, err := s.build(nw)
		if err != nil {
			return err
		}
		nw.solver = &netSolver{net: net}
		nw.elemDefs = make([]*def, len(nw.elems))
		for i, name := range nw.elems {
			nw.elemDefs[i] = s.byName[name]
		}
	} else {
		for i, d := range nw.elemDefs {
			e := &nw.solver.net.Elements[i]
			e.Raw = d.elem.raw.V
			if e.Kind.IsSource() {
				e.Value = d.elem.raw.V
			} else {
				e.Z = d.value.V
			}
		}
	}
	sol, err := nw.solver.solve(s.jobCtx(), s.ctx.Basis)
	if err != nil {
		return err
	}
	nw.sol = sol
	want := 3*len(sol.Branches) + len(sol.Nodes)
	if len(nw.resultDefs) != want {
		s.defineSolution(nw, sol)
		nw.resultDefs = make([]*def, len(nw.results))
		for i, r := range nw.results {
			nw.resultDefs[i] = s.byName[r]
		}
		return nil
	}
	k := 0
	for _, b := range sol.Branches {
		nw.resultDefs[k].value = calc.Q(b.V, calc.DimVoltage)
		nw.resultDefs[k+1].value = calc.Q(b.I, calc.DimCurrent)
		nw.resultDefs[k+2].value = calc.Quantity{V: b.S, Dim: calc.DimPower, Kind: calc.KindApparent}
		k += 3
	}
	for _, n := range sol.Nodes {
		nw.resultDefs[k].value = calc.Q(sol.Voltage[n], calc.DimVoltage)
		k++
	}
	return nil
}

// defineSolution defines a solved network's results as names
// (NET.E.v, NET.E.i, NET.E.s for each element, and the node voltages), so
// that expressions can read them.
func (s *Sheet) defineSolution(nw *network, sol *nodal.Solution) {
	names := make([]string, 0, 3*len(sol.Branches)+len(sol.Nodes))
	src := nw.source() // one string for all the results
	set := func(name string, q calc.Quantity) { names = append(names, s.setResult(nw, src, name, q)) }
	for _, b := range sol.Branches {
		set(nw.name+"."+b.Name+".v", calc.Q(b.V, calc.DimVoltage))
		set(nw.name+"."+b.Name+".i", calc.Q(b.I, calc.DimCurrent))
		set(nw.name+"."+b.Name+".s", calc.Quantity{V: b.S, Dim: calc.DimPower, Kind: calc.KindApparent})
	}
	for _, n := range sol.Nodes {
		set(nw.name+"."+n+".v", calc.Q(sol.Voltage[n], calc.DimVoltage))
	}
	nw.results = names
}

// source is the statement a network's results are said to come from: a
// compact network's own line, or the block's first.
func (nw *network) source() string {
	if nw.src == "" {
		return "network " + nw.name
	}
	return nw.src
}

// setResult defines or updates one result of a network as a name owned by
// the network, made by the statement src, and returns the name. A result
// reads nothing itself (its network does), so it has no deps map: a
// network of 10⁵ elements has some 3.5·10⁵ results.
func (s *Sheet) setResult(nw *network, src, name string, q calc.Quantity) string {
	if d, ok := s.byName[name]; ok {
		d.value = q
		return name
	}
	d := &def{name: name, src: src, line: nw.line, value: q, owner: nw.name}
	s.defs = append(s.defs, d)
	s.byName[name] = d
	return name
}

// resolveNets re-solves the networks that read a name changed after their
// last solution (when holds the tick of each change, and tick counts on);
// it marks their changed results and reports whether any changed.
//
// It stops after the first network whose changed results something
// reads: a later network may be fed by them through definitions (a source
// set to Vf = net1.C1.v), which the next pass of propagate evaluates
// before this is called again. Solving on would solve that network with
// its old inputs first, and record results that never held.
func (s *Sheet) resolveNets(changed map[string]bool, when map[string]int, tick *int) (bool, error) {
	was := s.resolving
	s.resolving = true
	defer func() { s.resolving = was }()
	any := false
	for _, n := range s.order {
		nw := s.nets[n]
		last, solved := when["net:"+n]
		if !solved {
			last = -1
		}
		hit := false
		for k := range nw.deps {
			if t, ok := when[k]; ok && t > last {
				hit = true
				break
			}
		}
		if !hit {
			continue
		}
		if err := s.stopped(); err != nil {
			return false, err
		}
		changed["net:"+n] = true
		when["net:"+n] = *tick
		*tick++
		old := make([]calc.Quantity, len(nw.results))
		for i, d := range s.resultsOf(nw) {
			old[i] = d.value
		}
		reason := ""
		if !s.quiet {
			var why []string
			for k := range nw.deps {
				if changed[k] && k != "w" && k != "ω" {
					why = append(why, k)
				}
			}
			sort.Strings(why)
			reason = "re-solved because " + strings.Join(why, ", ") + " changed"
		}
		if err := s.solve(nw, reason); err != nil {
			if s.lenient != nil {
				// its results are unusable here; what reads them fails
				for _, r := range nw.results {
					s.lenient[r] = fmt.Errorf("network %s: %w", n, err)
				}
				continue
			}
			return false, fmt.Errorf("network %s: %w", n, err)
		}
		after := s.resultsOf(nw)
		for i, r := range nw.results {
			if d := after[i]; d != nil && (i >= len(old) || d.value.V != old[i].V) {
				if s.samples != nil && !s.samples.reads(s, r) {
					continue // a sample's result that nothing reads
				}
				changed[r] = true
				when[r] = *tick
				*tick++
				any = true
			}
		}
		if any {
			return true, nil
		}
	}
	return any, nil
}

// resultsOf returns the definitions of nw's results, in the order of
// nw.results: those a working copy keeps, or looked up.
func (s *Sheet) resultsOf(nw *network) []*def {
	if len(nw.resultDefs) == len(nw.results) {
		return nw.resultDefs
	}
	out := make([]*def, len(nw.results))
	for i, r := range nw.results {
		out[i] = s.byName[r]
	}
	return out
}

// someOf lists the first n of names, and how many more there are: a
// message that names the nodes of a network of thousands stays a line.
func someOf(names []string, n int) string {
	if len(names) <= n {
		return strings.Join(names, ", ")
	}
	return fmt.Sprintf("%s and %d more", strings.Join(names[:n], ", "), len(names)-n)
}

// theveninLine is a thevenin statement as read: the name to define, the
// network and the two nodes, with their tokens for errors.
type theveninLine struct {
	name, netTok, aTok, bTok calc.Item
	nw                       *network
	a, b                     string
}

// stmtThevenin runs: thevenin NAME = NETWORK between NODE and NODE. NAME
// is the open-circuit voltage, with NAME.vth, NAME.zth and NAME.in; a
// port with an ideal current source across it has only the Norton form,
// NAME being I_N with NAME.in and NAME.yn. Either follows the network
// when its values change.
func (s *Sheet) stmtThevenin(p *calc.Parser) error {
	tl, err := s.readThevenin(p)
	if err != nil {
		return err
	}
	net, err := s.theveninNet(p, tl)
	if err != nil {
		return err
	}
	if s.dry && len(net.Elements) > liveElements {
		// a live check while typing: theveninNet has checked its
		// terminals; the two solutions are made when it runs (see
		// propagate)
		return nil
	}
	vth, zth, steps, err := nodal.TheveninContext(s.jobCtx(), net, tl.a, tl.b, s.ctx.Basis)
	deps := map[string]bool{"f": true, "net:" + tl.nw.name: true}
	for k := range tl.nw.deps {
		deps[k] = true
	}
	if err != nil {
		return s.defineNorton(p, tl, net, deps, err)
	}
	s.recordPart(p.Source(), steps)
	nw, a, b, name := tl.nw, tl.a, tl.b, tl.name.Text
	d := &def{name: name, src: p.Source(), line: s.line, value: calc.Q(vth, calc.DimVoltage), deps: deps}
	d.recalc = func() (calc.Quantity, []calc.Operand, error) {
		net, err := s.build(nw)
		if err != nil {
			return calc.Quantity{}, nil, err
		}
		vth, zth, _, err := nodal.TheveninContext(s.jobCtx(), net, a, b, s.ctx.Basis)
		return calc.Q(vth, calc.DimVoltage), theveninExtras(vth, zth), err
	}
	if e := s.setValue(d); e != nil {
		return lineErr(s.line, tl.name.Col, 1, "%v", e)
	}
	st := calc.Step{Kind: "thevenin", Source: p.Source(), Rule: "Thevenin equivalent of " + nw.name + " between " + a + " and " + b,
		Formula: "V_th = V(" + a + ") − V(" + b + ") open-circuit; Z_th with sources set to zero"}
	if zth != 0 {
		st.Formula += "; I_N = V_th/Z_th"
	} else {
		st.Notes = append(st.Notes, "Z_th = 0: an ideal voltage source between these nodes has no Norton form")
	}
	st.Results = append([]calc.Operand{{Name: name, Value: d.value}}, s.setExtras(name, p.Source(), theveninExtras(vth, zth))...)
	s.record(st)
	return nil
}

// theveninExtras are the NAME.key results of a Thevenin equivalent: I_N
// only where Z_th is not zero, an ideal voltage source having no Norton
// form.
func theveninExtras(vth, zth complex128) []calc.Operand {
	extra := []calc.Operand{{Name: "vth", Value: calc.Q(vth, calc.DimVoltage)}, {Name: "zth", Value: calc.Q(zth, calc.DimImpedance)}}
	if zth != 0 {
		extra = append(extra, calc.Operand{Name: "in", Value: calc.Q(vth/zth, calc.DimCurrent)})
	}
	return extra
}

// readThevenin reads a thevenin statement to the end of the line.
func (s *Sheet) readThevenin(p *calc.Parser) (theveninLine, error) {
	var tl theveninLine
	p.Next()
	tl.name = p.Next()
	if !s.validName(p, tl.name) {
		return tl, p.Err()
	}
	if !p.IsOp("=") {
		return tl, perr(p, "expected '=': thevenin NAME = NETWORK between NODE and NODE")
	}
	p.Next()
	tl.netTok = p.Next()
	nw, ok := s.nets[tl.netTok.Text]
	if !ok {
		p.Failf(tl.netTok, "no network named %q", tl.netTok.Text)
		return tl, p.Err()
	}
	tl.nw = nw
	if !expectWord(p, "between", "thevenin") {
		return tl, p.Err()
	}
	tl.aTok = p.Peek()
	tl.a = nodeName(p)
	if !expectWord(p, "and", "thevenin") {
		return tl, p.Err()
	}
	tl.bTok = p.Peek()
	tl.b = nodeName(p)
	p.ExpectEnd()
	if err := p.Err(); err != nil {
		return tl, err
	}
	return tl, nil
}

// theveninNet builds the network a thevenin statement names and checks
// its two nodes: a compact network has no named nodes, and an error for a
// node not there lists those that are.
func (s *Sheet) theveninNet(p *calc.Parser, tl theveninLine) (*reduce.Network, error) {
	nw := tl.nw
	net, err := s.build(nw)
	if err != nil {
		return nil, lineErr(s.line, tl.netTok.Col, len(tl.netTok.Text), "%v", err)
	}
	if nw.compact != nil {
		p.Failf(tl.netTok, "%s is a compact series-parallel network and has no named nodes: write it as a node block (network %s reference NODE … end) to take a Thevenin equivalent", nw.name, nw.name)
		return nil, p.Err()
	}
	known := map[string]bool{}
	var nodes []string
	for _, e := range net.Elements {
		for _, n := range []string{e.From, e.To} {
			if !known[n] {
				known[n] = true
				nodes = append(nodes, n)
			}
		}
	}
	for _, t := range []calc.Item{tl.aTok, tl.bTok} {
		if !known[t.Text] {
			p.Failf(t, "network %s has no node %q (its nodes: %s)", nw.name, t.Text, someOf(nodes, 12))
			return nil, p.Err()
		}
	}
	if tl.a == tl.b {
		p.Failf(tl.bTok, "the two nodes must differ")
		return nil, p.Err()
	}
	return net, nil
}

// defineNorton defines the Norton equivalent where the Thevenin one does
// not exist (thErr says why): an ideal current source across the port has
// no finite Z_th, but its I_N and Y_N are defined.
func (s *Sheet) defineNorton(p *calc.Parser, tl theveninLine, net *reduce.Network, deps map[string]bool, thErr error) error {
	nw, a, b, name := tl.nw, tl.a, tl.b, tl.name.Text
	in, yn, nsteps, nerr := nodal.NortonContext(s.jobCtx(), net, a, b, s.ctx.Basis)
	if nerr != nil {
		return lineErr(s.line, 1, 8, "%v", thErr)
	}
	s.recordPart(p.Source(), nsteps)
	d := &def{name: name, src: p.Source(), line: s.line, value: calc.Q(in, calc.DimCurrent), deps: deps}
	d.recalc = func() (calc.Quantity, []calc.Operand, error) {
		net, err := s.build(nw)
		if err != nil {
			return calc.Quantity{}, nil, err
		}
		in, yn, _, err := nodal.NortonContext(s.jobCtx(), net, a, b, s.ctx.Basis)
		return calc.Q(in, calc.DimCurrent), []calc.Operand{{Name: "in", Value: calc.Q(in, calc.DimCurrent)}, {Name: "yn", Value: calc.Q(yn, calc.DimAdmittance)}}, err
	}
	if e := s.setValue(d); e != nil {
		return lineErr(s.line, tl.name.Col, 1, "%v", e)
	}
	ex := s.setExtras(name, p.Source(), []calc.Operand{{Name: "in", Value: calc.Q(in, calc.DimCurrent)}, {Name: "yn", Value: calc.Q(yn, calc.DimAdmittance)}})
	s.record(calc.Step{Kind: "norton", Source: p.Source(), Rule: "Norton equivalent only: " + thErr.Error(), Results: ex})
	return nil
}

// sourceNotes says for each source whether it delivers or takes in power:
// under the passive sign convention a source that delivers has P < 0
// (IEEE Std 1459-2010 power, IEC 60375 reference directions).
func (s *Sheet) sourceNotes(sol *nodal.Solution) []string {
	f := s.ctx.Format
	var out []string
	for _, b := range sol.Branches {
		if !b.Kind.IsSource() {
			continue
		}
		p, q := real(b.S), imag(b.S)
		switch {
		case p < 0:
			out = append(out, fmt.Sprintf("%s delivering %s and %s (P < 0 by the passive sign convention)", b.Name,
				f.Mag(-p, calc.DimPower, calc.KindActive), f.Mag(-q, calc.DimPower, calc.KindReactive)))
		case p > 0:
			out = append(out, fmt.Sprintf("%s taking in %s and %s (P > 0: it is being driven by the rest of the network)", b.Name,
				f.Mag(p, calc.DimPower, calc.KindActive), f.Mag(q, calc.DimPower, calc.KindReactive)))
		case q != 0:
			out = append(out, fmt.Sprintf("%s exchanging reactive power only: Q = %s, no active power", b.Name,
				f.Mag(q, calc.DimPower, calc.KindReactive)))
		}
	}
	return out
}
