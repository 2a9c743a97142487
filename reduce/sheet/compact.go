package sheet

import (
	"errors"
	"fmt"
	"strings"

	"argand/calc"
	"argand/reduce"
)

// compactNetwork runs: network NAME = SP-EXPR [fed by EXPR], where SP-EXPR
// combines element names with + (series) and || (parallel). The keyword
// network is what tells this from arithmetic on the same names, which
// would give only the equivalent impedance.
func (s *Sheet) compactNetwork(p *calc.Parser, name string) error {
	p.Next() // =
	if p.Peek().Tok == calc.TokEOF {
		return perr(p, "network %s = needs a series-parallel form, such as R1 + (L1 || C1)", name)
	}
	e := p.Expr()
	var feed calc.Expr
	if p.Err() == nil && p.IsWord("fed") {
		p.Next()
		if !expectWord(p, "by", "network") {
			return p.Err()
		}
		if p.Peek().Tok == calc.TokEOF {
			return perr(p, "fed by needs a source value, such as fed by 230 V")
		}
		feed = p.Expr()
	}
	p.ExpectEnd()
	if err := p.Err(); err != nil {
		return err
	}
	tree, err := s.spTree(p, e, 0)
	if err != nil {
		return err
	}
	nw := &network{name: name, line: s.line, compact: e, tree: tree, src: p.Source(), feed: feed, deps: map[string]bool{"f": true}}
	for k := range depsOf(e) {
		nw.deps[k] = true
	}
	if feed != nil {
		for k := range depsOf(feed) {
			nw.deps[k] = true
		}
	}
	s.nets[name] = nw
	s.order = append(s.order, name)
	if err := s.solve(nw, "network "+name+" reduced"); err != nil {
		delete(s.nets, name)
		s.order = s.order[:len(s.order)-1]
		var le *calc.Error
		if errors.As(err, &le) {
			return le
		}
		_, _, col := e.Span()
		return lineErr(s.line, col, width(p, e), "network %s: %v", name, err)
	}
	return nil
}

// spTree turns a parsed compact form into a series-parallel tree over
// element names.
func (s *Sheet) spTree(p *calc.Parser, e calc.Expr, depth int) (*reduce.SPNode, error) {
	if depth > calc.MaxDepth {
		return nil, lineErr(s.line, 1, 1, "series-parallel form nested too deeply (more than %d levels of parentheses or alternating + and ||)", calc.MaxDepth)
	}
	_, _, col := e.Span()
	switch n := e.(type) {
	case *calc.Paren:
		return s.spTree(p, n.X, depth+1)
	case *calc.Name:
		d, ok := s.byName[n.Name]
		if !ok {
			return nil, lineErr(s.line, col, width(p, e), "unknown element %q: define it first (resistor %s = 10 Ω)", n.Name, n.Name)
		}
		if d.elem == nil || d.elem.kind.IsSource() {
			return nil, lineErr(s.line, col, width(p, e), "%s is not a passive element: a compact network combines resistor, inductor, capacitor and impedance names", n.Name)
		}
		return reduce.Leaf(n.Name), nil
	case *calc.Binary:
		if n.Op != "+" && n.Op != "||" {
			return nil, lineErr(s.line, n.OpCol, 1, "a compact network uses only + (series) and || (parallel), not %s", n.Op)
		}
		// a chain of one operator (R1 + R2 + … + R250) is one level, not
		// one per element: walk its left spine in a loop, so that only
		// real nesting (parentheses, a change of operator) counts
		var operands []calc.Expr
		x := calc.Expr(n)
		for {
			b, ok := x.(*calc.Binary)
			if !ok || b.Op != n.Op {
				break
			}
			operands = append(operands, b.Y)
			x = b.X
		}
		operands = append(operands, x)
		kind := reduce.SPSeries
		if n.Op == "||" {
			kind = reduce.SPParallel
		}
		var parts []*reduce.SPNode
		for i := len(operands) - 1; i >= 0; i-- {
			t, err := s.spTree(p, operands[i], depth+1)
			if err != nil {
				return nil, err
			}
			if t.Kind == kind {
				parts = append(parts, t.Parts...)
			} else {
				parts = append(parts, t)
			}
		}
		if kind == reduce.SPSeries {
			return reduce.SeriesOf(parts...), nil
		}
		return reduce.ParallelOf(parts...), nil
	}
	return nil, lineErr(s.line, col, width(p, e), "a compact network combines element names with + and ||; %q is not one", p.Text(e))
}

// solveCompact reduces a compact network step by step and, when it is fed,
// works back to every element's voltage, current and power.
func (s *Sheet) solveCompact(nw *network, reason string) error {
	tree := nw.tree
	z := map[string]complex128{}
	for _, n := range tree.Elements() {
		z[n] = s.byName[n].value.V
	}
	src := reduce.Element{Name: "source", Kind: reduce.VoltageSource, From: "bottom", To: "top"}
	fed := false
	if nw.feed != nil {
		r, err := s.evaluator(nw.src, nw.line).Eval(nw.feed)
		if err != nil {
			return err
		}
		switch r.Value.Dim {
		case calc.DimVoltage:
		case calc.DimCurrent:
			src.Kind = reduce.CurrentSource
		default:
			_, _, col := nw.feed.Span()
			return lineErr(nw.line, col, 1, "fed by takes a voltage or a current, not %s", calc.DimName(r.Value.Dim, false))
		}
		src.Value = r.Value.V
		fed = true
	}
	red, err := reduce.Reduce(tree, z, s.ctx.Basis, src)
	if err != nil {
		return err
	}
	steps := red.Steps
	if !fed {
		// without a source only the reduction means anything
		last := -1
		for _, m := range red.Merges {
			last = max(last, m.Step)
		}
		steps = steps[:last+1]
		red.Steps, red.Subjects = steps, red.Subjects[:last+1]
	}
	nw.red, nw.why = red, ""
	if len(steps) > 0 {
		steps[0].Notes = append(steps[0].Notes, reason)
	}
	s.recordPart(nw.src, steps)
	var names []string
	from := nw.source()
	set := func(name string, q calc.Quantity) { names = append(names, s.setResult(nw, from, name, q)) }
	set(nw.name+".z", red.Z)
	if fed {
		for _, e := range append(red.Elements, red.Source) {
			set(nw.name+"."+e.Name+".v", e.V)
			set(nw.name+"."+e.Name+".i", e.I)
			set(nw.name+"."+e.Name+".s", e.S)
		}
	}
	nw.results = names
	return nil
}

// spSteps reduces a node network step by step when it is series-parallel
// with one source, and otherwise says why the nodal solution is used.
func (s *Sheet) spSteps(net *reduce.Network) ([]calc.Step, *reduce.Reduction, string) {
	sources := 0
	for _, e := range net.Elements {
		if e.Kind.IsSource() {
			sources++
		}
	}
	if sources != 1 {
		return []calc.Step{{Kind: "method", Source: "network " + net.Name,
				Rule: fmt.Sprintf("%d sources: superposition is not stepped; the network is solved by modified nodal analysis", sources)}}, nil,
			fmt.Sprintf("%d sources: the values come from the nodal solution", sources)
	}
	red, err := reduce.ReduceNetwork(net, s.ctx.Basis)
	if err != nil {
		var nsp *reduce.NotSeriesParallelError
		st := calc.Step{Kind: "method", Source: "network " + net.Name}
		if errors.As(err, &nsp) {
			st.Rule = "not series-parallel: solved by modified nodal analysis"
			st.Notes = []string{nsp.Error()}
			if len(nsp.Triangles) > 0 {
				t := nsp.Triangles[0]
				st.Notes = append(st.Notes, "to step it by series and parallel, convert a triangle: deltay "+net.Name+"y = "+net.Name+" triangle "+strings.Join(t.Parts[:], " "))
			}
		} else {
			st.Rule = "series-parallel stepping not possible (" + err.Error() + "): solved by modified nodal analysis"
		}
		return []calc.Step{st}, nil, err.Error()
	}
	return red.Steps, red, ""
}
