// Package nodal solves any linear network of resistors, inductors,
// capacitors, impedances and independent voltage and current sources in
// sinusoidal steady state by modified nodal analysis, and finds Thevenin
// and Norton equivalents between two nodes. Every result comes with its
// steps and with checks: Kirchhoff's current law at every node and the
// power balance of Tellegen's theorem.
//
// A network with no unique solution is reported as a *NetError naming the
// nodes and elements at fault, found by graph search before any arithmetic;
// no NaN or infinity is ever returned.
//
// Solve is Analyse followed by Plan.Solve. Analyse does the work that
// depends on the topology alone (the checks, the ordering of the equations
// and the symbolic analysis with its estimates of time and memory), and a
// Plan solves the network again with other values or at another frequency
// at the cost of a numeric refactorisation, as a sweep or a tolerance
// spread needs.
package nodal

import (
	"context"
	"fmt"
	"math"
	"math/cmplx"

	"argand/calc"
	"argand/reduce"
)

// pivotTol is the pivot size, relative to the largest entry of its column,
// below which the equations are taken as numerically singular: about 450
// times the float64 unit round-off.
const pivotTol = 1e-13

// noiseTol is the relative size below which a solved element voltage or
// current is rounding noise and shown as 0.
const noiseTol = 1e-13

// elvLimit is the upper bound of extra-low voltage for a.c., 50 V RMS
// (IEC 60449 voltage band I, from memory). Above it the steps carry the
// caution.
const elvLimit = 50.0

// Branch is the solved state of one element. V is V(From) − V(To) and I
// flows from From to To through the element (passive sign convention,
// IEC 60375); S is the complex power the element absorbs, V·I* for RMS
// phasors and ½·V·I* for peak phasors (IEEE Std 1459-2010). A source that
// delivers power has Re S < 0.
type Branch struct {
	Name     string
	Kind     reduce.ElementKind
	From, To string
	Z        complex128 // impedance of a passive element, Ω
	Value    complex128 // source value, V or A
	Line     int
	V, I, S  complex128
}

// Solution is a solved network.
type Solution struct {
	Basis     calc.Basis
	Reference string
	// Nodes lists every node in natural order (n2 before n10), the
	// reference included.
	Nodes []string
	// Voltage holds every node voltage against the reference (which is 0).
	Voltage map[string]complex128
	// Branches holds the elements in the network's order.
	Branches []Branch
	// KCL holds, per node, the sum of the element currents leaving it:
	// zero in exact arithmetic. MaxKCL is the largest modulus and MaxI the
	// largest branch current modulus, its natural scale.
	KCL    map[string]complex128
	MaxKCL float64
	MaxI   float64
	// PowerSum is Σ S over all elements, zero by Tellegen's theorem;
	// PowerAbs is Σ |S|, its natural scale.
	PowerSum complex128
	PowerAbs float64
	// Unknowns is the number of equations solved and Factor the number of
	// entries in their LU factors.
	Unknowns, Factor int
	// BackwardError is the normwise backward error of the solved
	// equations, ‖b − A·x‖∞ / (‖A‖∞·‖x‖∞ + ‖b‖∞), with |re|+|im| as the
	// modulus, after iterative refinement.
	BackwardError float64
	// LowImpedance names the passive elements given a current unknown of
	// their own because their impedance is so low beside the node
	// voltages that V/Z would lose their current to rounding.
	LowImpedance []string
	Notes        []string
}

// Solve finds every node voltage and every element's voltage, current and
// complex power by modified nodal analysis (C.-W. Ho, A. E. Ruehli and
// P. A. Brennan, "The modified nodal approach to network analysis", IEEE
// Trans. Circuits and Systems, 1975): Kirchhoff's current law at every node
// but the reference, with node voltages as unknowns, plus one equation and
// one current unknown for each voltage source and each ideal (0 Ω) short.
//
// The complex equations are solved by sparse LU factorisation with
// threshold partial pivoting after an approximate minimum degree ordering,
// followed by iterative refinement (see Analyse and Plan.Solve, of which
// Solve is the composition): the work grows with the fill of the factors,
// linearly for ladders, stars and other networks with few loops.
//
// Passive elements must carry their impedance Z at the working frequency
// (see reduce.Network.At). Sources are phasors on the given basis.
func Solve(n *reduce.Network, basis calc.Basis) (*Solution, error) {
	return SolveContext(context.Background(), n, basis)
}

// SolveContext is Solve under ctx: the numeric factorisation polls ctx,
// and when ctx ends before the solution is found SolveContext returns
// ctx.Err() (see Plan.SolveContext).
func SolveContext(ctx context.Context, n *reduce.Network, basis calc.Basis) (*Solution, error) {
	p, err := Analyse(n)
	if err != nil {
		return nil, err
	}
	// Analyse has checked every value of n, and n fits p
	return p.solve(ctx, n, basis, nil)
}

// solution builds the Solution from the solved unknowns p.x.
func (p *Plan) solution(t *topology, basis calc.Basis, prev *Solution) (*Solution, error) {
	els := t.net.Elements
	nodeUnk, pos, curOf, x := p.nodeUnk, p.pos, p.curOf, p.x
	N := p.b.n
	s := &Solution{
		Basis:         basis,
		Reference:     t.net.Reference,
		Unknowns:      N,
		Factor:        p.lu.nnz(),
		BackwardError: p.eta,
		Notes:         append([]string(nil), t.notes...),
	}
	if prev != nil && len(prev.Branches) == len(els) && prev.Voltage != nil && prev.KCL != nil {
		// every entry and branch is written below
		clear(prev.Voltage)
		clear(prev.KCL)
		s.Voltage, s.KCL, s.Branches, s.Nodes = prev.Voltage, prev.KCL, prev.Branches, prev.Nodes[:0]
		*prev = *s
		s = prev
	} else {
		s.Voltage = make(map[string]complex128, len(t.nodes))
		s.KCL = make(map[string]complex128, len(t.nodes))
		s.Branches = make([]Branch, len(els))
	}
	for k, d := range p.direct {
		if d {
			s.LowImpedance = append(s.LowImpedance, els[k].Name)
		}
	}
	if len(s.LowImpedance) > 0 {
		s.Notes = append(s.Notes, fmt.Sprintf("%s: impedance so low beside the node voltages that %s solved for directly, not found as V/Z",
			list(s.LowImpedance), plural(len(s.LowImpedance), "its current is", "their currents are")))
	}
	v := make([]complex128, len(t.nodes))
	for i := range t.nodes {
		if u := nodeUnk[i]; u >= 0 {
			v[i] = x[pos[u]]
		}
		if !finite(v[i]) {
			return nil, &NetError{Msg: fmt.Sprintf("the voltage of node %s is too large to represent", t.nodes[i]), Nodes: []string{t.nodes[i]}}
		}
	}
	s.Nodes = append(s.Nodes, p.nodes...)
	half := 1.0
	if basis == calc.Peak {
		half = 0.5
	}
	// Rounding leaves specks such as 1e-17 A in a source with nowhere to
	// drive current, or across a balanced bridge. An element voltage below
	// noiseTol of the largest node voltage is such a speck, and so is a
	// current below noiseTol of the largest current that is not: a source
	// current or a passive current whose voltage is no speck. Specks are
	// shown as 0. A current is never dropped for its voltage alone, so a
	// jumper of 1 pΩ keeps its current.
	vScale, iScale := 0.0, 0.0
	for _, x := range v {
		vScale = math.Max(vScale, cmplx.Abs(x))
	}
	for i, x := range v {
		if cmplx.Abs(x) <= noiseTol*vScale {
			x = 0
		}
		s.Voltage[t.nodes[i]] = x
	}
	for k := range els {
		// filled in place: a network of many elements would otherwise
		// copy each branch, pointers and all, into the fresh slice
		e, br := &els[k], &s.Branches[k]
		br.Name, br.Kind, br.From, br.To, br.Line = e.Name, e.Kind, e.From, e.To, e.Line
		br.Value, br.Z, br.V, br.I = 0, 0, 0, 0 // a reused branch holds the last values
		if e.Kind.IsSource() {
			br.Value = e.Value
		} else {
			br.Z = e.Z
		}
		if !t.self[k] {
			br.V = v[t.from[k]] - v[t.to[k]]
			switch {
			case e.Kind == reduce.CurrentSource:
				br.I = e.Value
			case curOf[k] >= 0:
				br.I = x[pos[curOf[k]]]
			default:
				br.I = br.V / e.Z
			}
			if e.Kind == reduce.CurrentSource || (curOf[k] < 0 && cmplx.Abs(br.V) > noiseTol*vScale) {
				iScale = math.Max(iScale, cmplx.Abs(br.I))
			}
		}
		if !finite(br.I) {
			return nil, &NetError{Msg: fmt.Sprintf("%s: the current is too large to represent", e.Name), Elements: []string{e.Name}, Line: e.Line}
		}
	}
	kcl := make([]complex128, len(t.nodes))
	for k := range s.Branches {
		br := &s.Branches[k]
		if cmplx.Abs(br.V) <= noiseTol*vScale {
			br.V = 0
		}
		if br.Kind != reduce.CurrentSource && (iScale == 0 || cmplx.Abs(br.I) <= noiseTol*iScale) {
			br.I = 0
		}
		br.S = complex(half, 0) * br.V * cmplx.Conj(br.I)
		if !finite(br.S) {
			return nil, &NetError{Msg: fmt.Sprintf("%s: the power is too large to represent", br.Name), Elements: []string{br.Name}, Line: br.Line}
		}
		kcl[t.from[k]] += br.I
		kcl[t.to[k]] -= br.I
		s.MaxI = math.Max(s.MaxI, cmplx.Abs(br.I))
		s.PowerSum += br.S
		s.PowerAbs += cmplx.Abs(br.S)
	}
	for i, name := range t.nodes {
		s.KCL[name] = kcl[i]
		s.MaxKCL = math.Max(s.MaxKCL, cmplx.Abs(kcl[i]))
	}
	if !finite(s.PowerSum) || math.IsInf(s.PowerAbs, 0) {
		return nil, &NetError{Msg: "the total power is too large to represent"}
	}
	return s, nil
}

// singular reports numerically singular equations; culprits are the
// unknowns (original numbering) that carry the null direction. It names
// their nodes and the elements at those nodes or carrying those currents.
func (t *topology) singular(culprits []int, unk []int32, cur []int) error {
	nodeHit := make([]bool, len(t.nodes))
	elemHit := make([]bool, len(t.net.Elements))
	for _, u := range culprits {
		if u < len(unk) {
			nodeHit[unk[u]] = true
		} else {
			elemHit[cur[u-len(unk)]] = true
		}
	}
	var nodes, elems []string
	for i, name := range t.nodes {
		if nodeHit[i] {
			nodes = append(nodes, name)
		}
	}
	line := 0
	for k, e := range t.net.Elements {
		if elemHit[k] || nodeHit[t.from[k]] || nodeHit[t.to[k]] {
			elems = append(elems, e.Name)
			if line == 0 {
				line = e.Line
			}
		}
	}
	sortNatural(nodes)
	where := "in elements " + list(elems)
	if len(nodes) > 0 {
		where = fmt.Sprintf("around %s %s (elements %s)", plural(len(nodes), "node", "nodes"), list(nodes), list(elems))
	}
	return &NetError{
		Msg: "the network equations are singular " + where +
			": no unique solution, or none that float64 arithmetic can resolve; look for inductance and capacitance whose impedances cancel (resonance), other impedances that cancel, or impedances some 13 orders of magnitude apart",
		Nodes: nodes, Elements: elems, Line: line,
	}
}

// Steps returns the solution as steps: the method with every node voltage
// ("nodal"), one step per element with its v, i and s ("element"), and the
// checks ("balance"). f formats the numbers quoted in notes.
func (s *Solution) Steps(f calc.Format) []calc.Step {
	sFormula := "S = V·I*"
	if s.Basis == calc.Peak {
		sFormula = "S = ½·V·I*"
	}
	head := calc.Step{
		Kind: "nodal",
		Rule: "modified nodal analysis (Ho, Ruehli & Brennan, IEEE Trans. Circuits and Systems, 1975): " +
			"Kirchhoff's current law at every node but the reference, plus one equation per voltage source and ideal short; " +
			"solved by sparse LU with threshold partial pivoting after approximate minimum degree ordering",
		Formula: "[Y B; B^T 0]·[v; i] = [j; e]",
		Basis:   s.Basis,
		Notes: append([]string{
			fmt.Sprintf("reference node %s at 0 V; %d unknowns, %d entries in the LU factors", s.Reference, s.Unknowns, s.Factor),
		}, s.Notes...),
	}
	head.Results = make([]calc.Operand, 0, len(s.Nodes))
	for _, name := range s.Nodes {
		if name == s.Reference {
			continue
		}
		head.Results = append(head.Results, calc.Operand{Name: "V(" + name + ")", Value: calc.Q(s.Voltage[name], calc.DimVoltage)})
	}
	// The largest voltage anywhere is the largest between two nodes.
	lo, hi := math.Inf(1), math.Inf(-1)
	loI, hiI := math.Inf(1), math.Inf(-1)
	for _, v := range s.Voltage {
		lo, hi = math.Min(lo, real(v)), math.Max(hi, real(v))
		loI, hiI = math.Min(loI, imag(v)), math.Max(hiI, imag(v))
	}
	span := math.Hypot(hi-lo, hiI-loI)
	if s.Basis == calc.Peak {
		span /= math.Sqrt2
	}
	if span > elvLimit {
		head.Cautions = calc.CautionsOf(calc.CautionMains)
	}
	// One block each for the steps, their inputs, rows and row values:
	// a network of many elements would otherwise make a few small
	// allocations per element and grow the list of steps by copying.
	steps := make([]calc.Step, 1, len(s.Branches)+2)
	steps[0] = head
	inputs := make([]calc.Operand, len(s.Branches))
	rows := make([]calc.Row, len(s.Branches))
	values := make([]calc.Operand, 3*len(s.Branches))
	direct := map[string]bool{}
	for _, name := range s.LowImpedance {
		direct[name] = true
	}
	for k, b := range s.Branches {
		st := calc.Step{Kind: "element", Line: b.Line, Basis: s.Basis}
		vq := calc.Q(b.V, calc.DimVoltage)
		iq := calc.Q(b.I, calc.DimCurrent)
		sq := calc.Quantity{V: b.S, Dim: calc.DimPower, Kind: calc.KindApparent}
		v := "V = V(" + b.From + ") − V(" + b.To + ")"
		var in calc.Operand
		switch {
		case b.Kind == reduce.VoltageSource:
			st.Rule = b.Name + ": voltage source; its current comes from the solution"
			st.Formula = v + ", " + sFormula
			in = calc.Operand{Name: b.Name, Value: calc.Q(b.Value, calc.DimVoltage)}
		case b.Kind == reduce.CurrentSource:
			st.Rule = b.Name + ": current source; its voltage comes from the node voltages"
			st.Formula = v + ", I = " + b.Name + ", " + sFormula
			in = calc.Operand{Name: b.Name, Value: calc.Q(b.Value, calc.DimCurrent)}
		case b.From == b.To:
			st.Rule = b.Name + ": joined to one node only, it carries nothing"
			in = calc.Operand{Name: "Z(" + b.Name + ")", Value: calc.Q(b.Z, calc.DimImpedance)}
		case b.Z == 0:
			st.Rule = b.Name + ": ideal short (0 Ω); its current comes from the solution"
			st.Formula = v + ", " + sFormula
			in = calc.Operand{Name: "Z(" + b.Name + ")", Value: calc.Q(b.Z, calc.DimImpedance)}
		case direct[b.Name]:
			st.Rule = b.Name + ": impedance so low that its current comes from the solution"
			st.Formula = v + ", V = Z·I, " + sFormula
			in = calc.Operand{Name: "Z(" + b.Name + ")", Value: calc.Q(b.Z, calc.DimImpedance)}
		default:
			st.Rule = b.Name + ": Ohm's law"
			st.Formula = v + ", I = V/Z, " + sFormula
			in = calc.Operand{Name: "Z(" + b.Name + ")", Value: calc.Q(b.Z, calc.DimImpedance)}
		}
		inputs[k] = in
		st.Inputs = inputs[k : k+1 : k+1]
		vs := values[3*k : 3*k+3 : 3*k+3]
		vs[0], vs[1], vs[2] = calc.Operand{Name: "v", Value: vq}, calc.Operand{Name: "i", Value: iq}, calc.Operand{Name: "s", Value: sq}
		rows[k] = calc.Row{Name: b.Name, Values: vs}
		st.Rows = rows[k : k+1 : k+1]
		steps = append(steps, st)
	}
	bal := calc.Step{
		Kind:    "balance",
		Rule:    "checks: Kirchhoff's current law at every node, and Tellegen's theorem (the complex powers of all elements sum to zero)",
		Formula: "max |Σ I| at a node ≈ 0;  Σ S ≈ 0",
		Basis:   s.Basis,
		Results: []calc.Operand{
			{Name: "max KCL residual", Value: calc.Magnitude(s.MaxKCL, calc.DimCurrent)},
			{Name: "ΣS", Value: calc.Quantity{V: s.PowerSum, Dim: calc.DimPower, Kind: calc.KindApparent}},
		},
	}
	bal.Rows = make([]calc.Row, 0, len(s.Nodes))
	kcl := make([]calc.Operand, len(s.Nodes))
	for _, name := range s.Nodes {
		kv := kcl[len(bal.Rows) : len(bal.Rows)+1 : len(bal.Rows)+1]
		kv[0] = calc.Operand{Name: "|kcl|", Value: calc.Magnitude(cmplx.Abs(s.KCL[name]), calc.DimCurrent)}
		bal.Rows = append(bal.Rows, calc.Row{Name: name, Values: kv})
	}
	if s.MaxI > 0 {
		bal.Notes = append(bal.Notes, fmt.Sprintf("largest KCL residual is %s of the largest branch current (%s)",
			calc.SmallRatio(s.MaxKCL/s.MaxI), f.Mag(s.MaxI, calc.DimCurrent, calc.KindPlain)))
	}
	if s.PowerAbs > 0 {
		bal.Notes = append(bal.Notes, fmt.Sprintf("|ΣS| is %s of Σ|S| (%s)",
			calc.SmallRatio(cmplx.Abs(s.PowerSum)/s.PowerAbs), f.Mag(s.PowerAbs, calc.DimPower, calc.KindApparent)))
	}
	return append(steps, bal)
}
