package sheet

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"argand/calc"
	"argand/reduce"
	"argand/reduce/nodal"
)

// DefaultBudget is the bound on a statement's estimated work, in seconds,
// until a budget statement sets another.
const DefaultBudget = 10

// MaxBudget is the largest budget a worksheet may set, in seconds.
const MaxBudget = 24 * 3600

// Costs of the parts of one sample, in nanoseconds, measured with the
// package's benchmarks on the development machine (2 shared cores). They
// turn a count of work into seconds only roughly: the bound is meant to
// catch work of minutes and hours before it starts, not to time it.
// BenchmarkEstimate compares them with sweeps as measured, from a
// 20-element ladder to a 2000-element mesh.
const (
	nsPerScan    = 30    // one definition looked at by a re-evaluation pass
	nsPerNode    = 250   // one node of an expression evaluated again
	nsPerElement = 1000  // one element of a network solved again
	nsPerSample  = 10000 // the fixed cost of a sample
	nsPerMulAdd  = 3     // one complex multiply-add of a numeric refactorisation
)

// work is an estimate of a statement's work.
type work struct {
	samples   int
	perSample float64 // seconds
}

func (w work) seconds() float64 { return float64(w.samples) * w.perSample }

// sampleCost estimates the seconds one sample takes when the named inputs
// change: every definition is looked at on each of about two passes, and
// what depends on the inputs, directly or through networks, is evaluated
// again, each network solved again; then e itself is evaluated.
//
// need, when not nil, is the part of the worksheet the sample re-evaluates
// (a restricted sampler, see restrict): the rest is neither looked at nor
// evaluated again.
func (s *Sheet) sampleCost(inputs []string, e calc.Expr, need map[string]bool) float64 {
	// readers[name] are the definitions and networks that read name
	readers := map[string][]string{}
	scanned := 0
	for _, d := range s.defs {
		if need != nil && !need[d.name] {
			continue
		}
		scanned++
		for k := range d.deps {
			readers[k] = append(readers[k], d.name)
		}
		if d.owner != "" {
			readers[d.owner] = append(readers[d.owner], d.name)
		}
		if d.elem != nil && d.elem.kind != reduce.Resistor {
			readers["f"] = append(readers["f"], d.name)
		}
	}
	for _, n := range s.order {
		if need != nil && !need["net:"+n] {
			continue
		}
		for k := range s.nets[n].deps {
			readers[k] = append(readers[k], "net:"+n)
		}
	}
	hit := map[string]bool{}
	queue := append([]string(nil), inputs...)
	for _, n := range inputs {
		hit[n] = true
	}
	nodes, elements, factor := size(e), 0, 0.0
	for len(queue) > 0 {
		n := queue[0]
		queue = queue[1:]
		if len(n) > 4 && n[:4] == "net:" {
			nw := s.nets[n[4:]]
			elements += len(nw.elems) + 1
			factor += s.factorWork(nw)
			for _, r := range nw.results {
				if !hit[r] {
					hit[r] = true
					queue = append(queue, r)
				}
			}
			if nw.compact != nil {
				// a compact network is reduced step by step at each
				// sample, its steps written out: about four times the
				// work of a node network of the same size
				elements += 4 * size(nw.compact)
			}
		} else if d, ok := s.byName[n]; ok {
			if d.expr != nil || d.elem != nil || d.recalc != nil {
				// a network's results are written by its solution,
				// counted with its elements: nothing is evaluated
				nodes += size(d.expr) + 1
			}
			if d.recalc != nil {
				// a Thevenin equivalent solves its network twice, with steps
				for k := range d.deps {
					if nw, ok := s.nets[strings.TrimPrefix(k, "net:")]; ok && strings.HasPrefix(k, "net:") {
						elements += 4 * (len(nw.elems) + 1)
					}
				}
			}
		}
		for _, r := range readers[n] {
			if !hit[r] {
				hit[r] = true
				queue = append(queue, r)
			}
		}
	}
	ns := nsPerSample + nsPerScan*2*float64(scanned) + nsPerNode*float64(nodes) + nsPerElement*float64(elements) + nsPerMulAdd*factor
	return ns * 1e-9
}

// factorWork is the number of complex multiply-adds of one numeric
// factorisation of a node network, from the solver's symbolic analysis;
// the per-element cost above misses the fill of meshed networks (a grid
// factorises in far more operations than it has elements). 0 for a
// compact network or one that cannot be analysed (its error comes when it
// is solved).
func (s *Sheet) factorWork(nw *network) float64 {
	if nw.compact != nil {
		return 0
	}
	if nw.solver != nil && nw.solver.plan != nil {
		return nw.solver.plan.Work().MultiplyAdds
	}
	net, err := s.build(nw)
	if err != nil {
		return 0
	}
	p, err := nodal.Analyse(net)
	if err != nil {
		return 0
	}
	return p.Work().MultiplyAdds
}

// size counts the nodes of an expression.
func size(e calc.Expr) int {
	n := 0
	calc.Walk(e, func(calc.Expr) { n++ })
	return n
}

// overBudget returns the refusal of work that exceeds the budget, naming
// the estimate, the budget and how to reduce the one or raise the other,
// or "" when the work fits.
func (s *Sheet) overBudget(what string, w work, unit, fewer string) string {
	t := w.seconds()
	if t <= s.budget {
		return ""
	}
	fit := int(s.budget / w.perSample)
	msg := fmt.Sprintf("%s needs about %s of work (%d %s at about %s each), more than the budget of %s: ",
		what, seconds(t), w.samples, unit, seconds(w.perSample), seconds(s.budget))
	if fewer != "" && fit >= 2 {
		msg += fmt.Sprintf("%s (about %d fit), ", fewer, fit)
	}
	raise := math.Min(s.limits.Budget, math.Ceil(t*1.5/10)*10)
	if raise <= s.budget {
		// the budget is already at the largest allowed here
		if fewer != "" && fit >= 2 {
			return strings.TrimSuffix(msg, ", ")
		}
		return msg + "the budget is at its limit here (" + seconds(s.limits.Budget) + ")"
	}
	return msg + "or raise the budget with: budget " + strconv.FormatFloat(raise, 'f', -1, 64) + " s"
}

// seconds writes a duration for a person: 45 s, 2.5 min, 1.2 h, 3.1 ms.
func seconds(t float64) string {
	switch {
	case t >= 3600:
		return strconv.FormatFloat(t/3600, 'f', 1, 64) + " h"
	case t >= 120:
		return strconv.FormatFloat(t/60, 'f', 1, 64) + " min"
	case t >= 1:
		return strconv.FormatFloat(t, 'f', 0, 64) + " s"
	case t >= 1e-3:
		return strconv.FormatFloat(t*1e3, 'f', 1, 64) + " ms"
	}
	return strconv.FormatFloat(t*1e6, 'f', 1, 64) + " µs"
}

// stmtBudget runs: budget TIME — the bound on a statement's estimated work.
func (s *Sheet) stmtBudget(p *calc.Parser) error {
	p.Next()
	if p.Peek().Tok == calc.TokEOF {
		return perr(p, "budget needs a time, such as budget 60 s")
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
	_, _, col := e.Span()
	q := r.Value
	if q.Dim != calc.DimTime || !q.IsReal() {
		return lineErr(s.line, col, width(p, e), "budget takes a time in seconds, such as budget 60 s")
	}
	t := real(q.V)
	if !finite(t) || t < 0.1 || t > s.limits.Budget {
		if s.limits.Budget < MaxBudget {
			return lineErr(s.line, col, width(p, e), "a budget lies from 0.1 s to %s here", seconds(s.limits.Budget))
		}
		return lineErr(s.line, col, width(p, e), "a budget lies from 0.1 s to %d s (24 h)", MaxBudget)
	}
	s.budget = t
	s.record(calc.Step{Kind: "setting", Source: p.Source(), Rule: "statements whose estimated work exceeds " + seconds(t) + " are refused before they start",
		Results: []calc.Operand{{Name: "budget", Value: calc.Real(t, calc.DimTime)}}})
	return nil
}
