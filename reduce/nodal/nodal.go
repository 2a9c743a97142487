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
package nodal

import (
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

// caution is the safety text shown beside results that involve dangerous
// voltages.
const caution = "argand is a calculation aid, not a substitute for measurement, isolation procedures or a qualified person. " +
	"Work on energised or mains equipment only if qualified, under local electrical codes and licensed practice. " +
	"Capacitors can hold a lethal charge after disconnection."

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
	// Unknowns and Band describe the equations solved: their number and
	// the half-bandwidth after reordering.
	Unknowns, Band int
	Notes          []string
}

// Solve finds every node voltage and every element's voltage, current and
// complex power by modified nodal analysis (C.-W. Ho, A. E. Ruehli and
// P. A. Brennan, "The modified nodal approach to network analysis", IEEE
// Trans. Circuits and Systems, 1975): Kirchhoff's current law at every node
// but the reference, with node voltages as unknowns, plus one equation and
// one current unknown for each voltage source and each ideal (0 Ω) short.
//
// The complex equations are solved by band LU factorisation with partial
// pivoting after a reverse Cuthill–McKee reordering, which keeps a ladder or
// a chain of meshes to a narrow band: the work grows linearly with the
// network size for such networks.
//
// Passive elements must carry their impedance Z at the working frequency
// (see reduce.Network.At). Sources are phasors on the given basis.
func Solve(n *reduce.Network, basis calc.Basis) (*Solution, error) {
	t, err := check(n)
	if err != nil {
		return nil, err
	}
	return t.solve(basis)
}

func (t *topology) solve(basis calc.Basis) (*Solution, error) {
	els := t.net.Elements
	// Unknowns: non-reference node voltages, then branch currents.
	nodeUnk := make([]int32, len(t.nodes)) // node → unknown, −1 for the reference
	var unk []int32                        // unknown → node
	for i := range t.nodes {
		if int32(i) == t.ref {
			nodeUnk[i] = -1
			continue
		}
		nodeUnk[i] = int32(len(unk))
		unk = append(unk, int32(i))
	}
	var cur []int // current unknown → element
	curOf := make([]int32, len(els))
	for k, e := range els {
		curOf[k] = -1
		if e.Kind == reduce.VoltageSource || t.short[k] {
			curOf[k] = int32(len(unk) + len(cur))
			cur = append(cur, k)
		}
	}
	N := len(unk) + len(cur)
	rhs := make([]complex128, N)
	ent := make([]entry, 0, 4*len(els))
	put := func(i, j int32, v complex128) {
		if i >= 0 && j >= 0 {
			ent = append(ent, entry{i, j, v})
		}
	}
	for k, e := range els {
		if t.self[k] {
			continue
		}
		a, b := nodeUnk[t.from[k]], nodeUnk[t.to[k]]
		switch {
		case e.Kind == reduce.CurrentSource:
			// Value leaves From and enters To.
			if a >= 0 {
				rhs[a] -= e.Value
			}
			if b >= 0 {
				rhs[b] += e.Value
			}
		case curOf[k] >= 0:
			// KCL: the branch current leaves a and enters b; the branch
			// equation V(a) − V(b) = −Value keeps the matrix symmetric.
			c := curOf[k]
			put(a, c, 1)
			put(b, c, -1)
			put(c, a, 1)
			put(c, b, -1)
			if e.Kind == reduce.VoltageSource {
				rhs[c] = -e.Value
			}
		default:
			y := 1 / e.Z
			if !finite(y) {
				return nil, &NetError{Msg: fmt.Sprintf("%s: the admittance 1/Z is too large to represent", e.Name), Elements: []string{e.Name}, Line: e.Line}
			}
			put(a, a, y)
			put(b, b, y)
			put(a, b, -y)
			put(b, a, -y)
		}
	}

	// Symmetric pattern in compressed form for the ordering.
	start := make([]int32, N+1)
	for _, x := range ent {
		if x.i != x.j {
			start[x.i+1]++
		}
	}
	for i := 0; i < N; i++ {
		start[i+1] += start[i]
	}
	adj := make([]int32, start[N])
	fill := make([]int32, N)
	copy(fill, start[:N])
	for _, x := range ent {
		if x.i != x.j {
			adj[fill[x.i]] = x.j
			fill[x.i]++
		}
	}
	order := rcmOrder(N, start, adj)
	pos := make([]int32, N)
	for newI, old := range order {
		pos[old] = int32(newI)
	}
	band := 0
	for _, x := range ent {
		d := int(pos[x.i] - pos[x.j])
		if d < 0 {
			d = -d
		}
		band = max(band, d)
	}
	lu, ok := newBand(N, band, band)
	if !ok {
		return nil, &NetError{Msg: fmt.Sprintf("the network is too large for the nodal solution: %d unknowns with a band of %d after reordering", N, band)}
	}
	colmax := make([]float64, N)
	for _, x := range ent {
		lu.add(int(pos[x.i]), int(pos[x.j]), x.v)
	}
	for _, x := range ent {
		j := pos[x.j]
		colmax[j] = max(colmax[j], abs1(lu.a[int(pos[x.i])*lu.w+int(j)-int(pos[x.i])+lu.kl]))
	}
	x := make([]complex128, N)
	if k := lu.factor(colmax, pivotTol); k >= 0 {
		// Inverse iteration from a fixed start: the solution is dominated
		// by the null direction, whose large entries show where the
		// trouble lies.
		for i := range x {
			x[i] = complex(1, 0.5*float64(i%3))
		}
		lu.solve(x)
		big := 0.0
		for _, v := range x {
			if finite(v) {
				big = math.Max(big, cmplx.Abs(v))
			}
		}
		var culprits []int
		for newI, v := range x {
			if !finite(v) || cmplx.Abs(v) >= 0.01*big {
				culprits = append(culprits, int(order[newI]))
			}
		}
		if len(culprits) == 0 {
			culprits = []int{int(order[k])}
		}
		return nil, t.singular(culprits, unk, cur)
	}
	for i := range rhs {
		x[pos[i]] = rhs[i]
	}
	lu.solve(x)

	s := &Solution{
		Basis:     basis,
		Reference: t.net.Reference,
		Voltage:   make(map[string]complex128, len(t.nodes)),
		KCL:       make(map[string]complex128, len(t.nodes)),
		Unknowns:  N,
		Band:      band,
		Notes:     append([]string(nil), t.notes...),
	}
	v := make([]complex128, len(t.nodes))
	for i := range t.nodes {
		if u := nodeUnk[i]; u >= 0 {
			v[i] = x[pos[u]]
		}
		if !finite(v[i]) {
			return nil, &NetError{Msg: fmt.Sprintf("the voltage of node %s is too large to represent", t.nodes[i]), Nodes: []string{t.nodes[i]}}
		}
		s.Voltage[t.nodes[i]] = v[i]
	}
	s.Nodes = append([]string(nil), t.nodes...)
	sortNatural(s.Nodes)
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
	for name, x := range s.Voltage {
		if cmplx.Abs(x) <= noiseTol*vScale {
			s.Voltage[name] = 0
		}
	}
	s.Branches = make([]Branch, len(els))
	for k, e := range els {
		br := Branch{Name: e.Name, Kind: e.Kind, From: e.From, To: e.To, Line: e.Line}
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
		s.Branches[k] = br
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
			"solved by band LU with partial pivoting after reverse Cuthill–McKee ordering",
		Formula: "[Y B; B^T 0]·[v; i] = [j; e]",
		Basis:   s.Basis,
		Notes: append([]string{
			fmt.Sprintf("reference node %s at 0 V; %d unknowns, half-bandwidth %d after reordering", s.Reference, s.Unknowns, s.Band),
		}, s.Notes...),
	}
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
		head.Notes = append(head.Notes, caution)
	}
	steps := []calc.Step{head}
	for _, b := range s.Branches {
		st := calc.Step{Kind: "element", Line: b.Line, Basis: s.Basis}
		vq := calc.Q(b.V, calc.DimVoltage)
		iq := calc.Q(b.I, calc.DimCurrent)
		sq := calc.Quantity{V: b.S, Dim: calc.DimPower, Kind: calc.KindApparent}
		v := "V = V(" + b.From + ") − V(" + b.To + ")"
		switch {
		case b.Kind == reduce.VoltageSource:
			st.Rule = b.Name + ": voltage source; its current comes from the solution"
			st.Formula = v + ", " + sFormula
			st.Inputs = []calc.Operand{{Name: b.Name, Value: calc.Q(b.Value, calc.DimVoltage)}}
		case b.Kind == reduce.CurrentSource:
			st.Rule = b.Name + ": current source; its voltage comes from the node voltages"
			st.Formula = v + ", I = " + b.Name + ", " + sFormula
			st.Inputs = []calc.Operand{{Name: b.Name, Value: calc.Q(b.Value, calc.DimCurrent)}}
		case b.From == b.To:
			st.Rule = b.Name + ": joined to one node only, it carries nothing"
			st.Inputs = []calc.Operand{{Name: "Z(" + b.Name + ")", Value: calc.Q(b.Z, calc.DimImpedance)}}
		case b.Z == 0:
			st.Rule = b.Name + ": ideal short (0 Ω); its current comes from the solution"
			st.Formula = v + ", " + sFormula
			st.Inputs = []calc.Operand{{Name: "Z(" + b.Name + ")", Value: calc.Q(b.Z, calc.DimImpedance)}}
		default:
			st.Rule = b.Name + ": Ohm's law"
			st.Formula = v + ", I = V/Z, " + sFormula
			st.Inputs = []calc.Operand{{Name: "Z(" + b.Name + ")", Value: calc.Q(b.Z, calc.DimImpedance)}}
		}
		st.Rows = []calc.Row{{Name: b.Name, Values: []calc.Operand{{Name: "v", Value: vq}, {Name: "i", Value: iq}, {Name: "s", Value: sq}}}}
		steps = append(steps, st)
	}
	bal := calc.Step{
		Kind:    "balance",
		Rule:    "checks: Kirchhoff's current law at every node, and Tellegen's theorem (the complex powers of all elements sum to zero)",
		Formula: "max |Σ I| at a node ≈ 0;  Σ S ≈ 0",
		Basis:   s.Basis,
		Results: []calc.Operand{
			{Name: "max KCL residual", Value: calc.Q(complex(s.MaxKCL, 0), calc.DimCurrent)},
			{Name: "ΣS", Value: calc.Quantity{V: s.PowerSum, Dim: calc.DimPower, Kind: calc.KindApparent}},
		},
	}
	for _, name := range s.Nodes {
		bal.Rows = append(bal.Rows, calc.Row{Name: name, Values: []calc.Operand{{Name: "kcl", Value: calc.Q(s.KCL[name], calc.DimCurrent)}}})
	}
	if s.MaxI > 0 {
		bal.Notes = append(bal.Notes, fmt.Sprintf("largest KCL residual is %.1e of the largest branch current (%s)",
			s.MaxKCL/s.MaxI, f.Mag(s.MaxI, calc.DimCurrent, calc.KindPlain)))
	}
	if s.PowerAbs > 0 {
		bal.Notes = append(bal.Notes, fmt.Sprintf("|ΣS| is %.1e of Σ|S| (%s)",
			cmplx.Abs(s.PowerSum)/s.PowerAbs, f.Mag(s.PowerAbs, calc.DimPower, calc.KindApparent)))
	}
	return append(steps, bal)
}
