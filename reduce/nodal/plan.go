package nodal

import (
	"context"
	"errors"
	"fmt"
	"math"
	"math/cmplx"
	"slices"

	"argand/calc"
	"argand/reduce"
)

// refineTarget is the normwise backward error, measured with |re|+|im| as
// the modulus, below which a solution is not refined further: a few units
// of float64 round-off.
const refineTarget = 1e-15

// maxRefine bounds the steps of iterative refinement.
const maxRefine = 2

// Plan is the analysis of a network's topology: its checks, the unknowns
// of the modified nodal equations, their fill-reducing order and the
// symbolic analysis of their factorisation. It solves any network of the
// same topology, with other element values or at another frequency,
// refactorising numerically on the same pattern and reusing the pivots of
// the last factorisation while they pass the threshold test.
//
// A Plan keeps its matrix and factors between solutions and changes them
// in Solve: it may be used again and again by one goroutine at a time, but
// not by several at once (give each goroutine its own Plan). When a
// solution finds an element whose impedance is too low for its current to
// be found as V/Z (see currentTol), Solve re-plans with a current unknown
// for it, and Work changes accordingly.
type Plan struct {
	t       *topology
	ref     string
	names   []string // element names, kinds and nodes as analysed
	kinds   []reduce.ElementKind
	from    []string
	to      []string
	nodes   []string // in natural order
	nodeUnk []int32  // node → unknown, −1 for the reference
	unk     []int32  // unknown → node
	cur     []int    // current unknown → element
	curOf   []int32  // element → current unknown, or −1
	order   []int32  // order[new] = old unknown
	pos     []int32  // pos[old] = new
	b       csc      // the matrix in the new order; values rewritten by Solve
	direct  []bool   // passive elements given a current unknown for their low impedance
	work    Work
	maxNNZ  int

	// The scatter map, made by the symbolic analysis: what each
	// element's value writes (op) and where (slot: positions in bx, or
	// rows of rhs, with the spare last entry of each standing for the
	// reference node, which has no equation). base holds the entries
	// that do not depend on the values (the ±1 of current unknowns), so
	// that a restamp is a clear and one indexed write per entry.
	op   []stampOp
	slot [][4]int32
	base []constEntry
	// rhsRows are the rows of rhs a source writes to, in increasing
	// order: the only ones that can be non-zero.
	rhsRows []int32
	bx      []complex128 // b.x and the spare entry
	rhsx    []complex128 // rhs and the spare entry

	lu     *sparseLU
	colmax []float64
	rhs    []complex128
	x      []complex128
	r      []complex128
	d      []complex128
	keep   []complex128
	// normA is ‖A‖∞ of the last factorisation, found as ‖A‖₁: every
	// stamp is symmetric, so A = Aᵀ and the largest column sum of moduli
	// is the largest row sum.
	normA float64
	eta   float64 // backward error of the last solution
	stats Stats
}

// constEntry is a constant term of the matrix, at position q of b.x.
type constEntry struct {
	q int32
	v complex128
}

// stampOp says what an element's value writes into the equations.
type stampOp uint8

const (
	stampNone    stampOp = iota // nothing: joined to one node only, or an ideal short (its entries are constant)
	stampAdmit                  // admittance 1/Z at (a,a), (b,b), −1/Z at (a,b), (b,a)
	stampShunt                  // admittance 1/Z at (a,a) only: the other end is the reference
	stampImp                    // −Z at (c,c), the branch equation of a current unknown
	stampVolt                   // −Value on the right of the branch equation, row c
	stampCurrent                // −Value on the right of row a, +Value of row b
)

// Stats counts what a Plan's solutions have cost.
type Stats struct {
	// Solves counts solutions; Factorisations the factorisations that
	// chose pivots (the first, and any after a refused pivot), and
	// Refactorisations those that reused them.
	Solves, Factorisations, Refactorisations int
	// Repivots counts refactorisations abandoned because a reused
	// pivot failed its threshold test (see reuseThreshold); each is
	// followed by a factorisation that chooses new pivots.
	Repivots int
	// Refinements counts steps of iterative refinement.
	Refinements int
}

// Analyse checks the topology of n and prepares its solution: every reason
// the equations could have no unique solution (see Solve), the unknowns,
// an approximate minimum degree ordering of the equations (amdOrder) and
// the symbolic analysis that estimates the work (see Work). A network
// whose estimates exceed the bounds (about 1 GiB of memory, 10¹¹
// multiply-adds) is refused with a message that states them.
func Analyse(n *reduce.Network) (*Plan, error) {
	t, err := check(n)
	if err != nil {
		return nil, err
	}
	return analyse(t, make([]bool, len(n.Elements)))
}

// analyse plans the checked topology t; the passive elements marked in
// direct get a current unknown of their own.
func analyse(t *topology, direct []bool) (*Plan, error) {
	n := t.net
	els := n.Elements
	p := &Plan{t: t, ref: n.Reference, direct: direct}
	p.names = make([]string, len(els))
	p.kinds = make([]reduce.ElementKind, len(els))
	p.from = make([]string, len(els))
	p.to = make([]string, len(els))
	for k, e := range els {
		p.names[k], p.kinds[k], p.from[k], p.to[k] = e.Name, e.Kind, e.From, e.To
	}
	// Unknowns: non-reference node voltages, then branch currents.
	p.nodeUnk = make([]int32, len(t.nodes))
	for i := range t.nodes {
		if int32(i) == t.ref {
			p.nodeUnk[i] = -1
			continue
		}
		p.nodeUnk[i] = int32(len(p.unk))
		p.unk = append(p.unk, int32(i))
	}
	p.curOf = make([]int32, len(els))
	for k, e := range els {
		p.curOf[k] = -1
		if e.Kind == reduce.VoltageSource || t.short[k] || direct[k] {
			p.curOf[k] = int32(len(p.unk) + len(p.cur))
			p.cur = append(p.cur, k)
		}
	}
	N := len(p.unk) + len(p.cur)

	// The pattern: each element's four positions (old numbering).
	type pair struct{ i, j int32 }
	ent := make([]pair, 0, 4*len(els)+len(p.cur))
	put := func(i, j int32) {
		if i >= 0 && j >= 0 {
			ent = append(ent, pair{i, j})
		}
	}
	for k, e := range els {
		if t.self[k] || e.Kind == reduce.CurrentSource {
			continue
		}
		a, b := p.nodeUnk[t.from[k]], p.nodeUnk[t.to[k]]
		if c := p.curOf[k]; c >= 0 {
			put(a, c)
			put(b, c)
			put(c, a)
			put(c, b)
			if direct[k] {
				put(c, c)
			}
		} else {
			put(a, a)
			put(b, b)
			put(a, b)
			put(b, a)
		}
	}
	// Symmetric adjacency for the ordering.
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
	fill := slices.Clone(start[:N])
	for _, x := range ent {
		if x.i != x.j {
			adj[fill[x.i]] = x.j
			fill[x.i]++
		}
	}
	p.order = amdOrder(N, start, adj)
	p.pos = make([]int32, N)
	for newI, old := range p.order {
		p.pos[old] = int32(newI)
	}

	// The matrix by columns in the new order, duplicates merged.
	colCount := make([]int32, N+1)
	for _, x := range ent {
		colCount[p.pos[x.j]+1]++
	}
	for j := 0; j < N; j++ {
		colCount[j+1] += colCount[j]
	}
	rows := make([]int32, len(ent))
	at := slices.Clone(colCount[:N])
	for _, x := range ent {
		j := p.pos[x.j]
		rows[at[j]] = p.pos[x.i]
		at[j]++
	}
	p.b.n = N
	p.b.p = make([]int32, N+1)
	p.b.i = rows[:0] // columns merged in place: each moves down, never up
	for j := 0; j < N; j++ {
		col := rows[colCount[j]:colCount[j+1]]
		slices.Sort(col)
		col = slices.Compact(col)
		p.b.i = append(p.b.i, col...)
		p.b.p[j+1] = int32(len(p.b.i))
	}
	p.b.i = slices.Clip(p.b.i)
	nnz := int32(len(p.b.i))
	p.bx = make([]complex128, nnz+1)
	p.b.x = p.bx[:nnz]
	constant := func(q int32, v complex128) {
		if q != nnz {
			p.base = append(p.base, constEntry{q, v})
		}
	}
	p.rhsx = make([]complex128, N+1)
	p.rhs = p.rhsx[:N]
	find := func(i, j int32) int32 {
		if i < 0 || j < 0 {
			return nnz // the spare entry
		}
		ni, nj := p.pos[i], p.pos[j]
		col := p.b.i[p.b.p[nj]:p.b.p[nj+1]]
		q, _ := slices.BinarySearch(col, ni)
		return p.b.p[nj] + int32(q)
	}
	row := func(i int32) int32 {
		if i < 0 {
			return int32(N) // the spare entry
		}
		return p.pos[i]
	}
	p.op = make([]stampOp, len(els))
	p.slot = make([][4]int32, len(els))
	for k, e := range els {
		if t.self[k] {
			continue
		}
		a, b := p.nodeUnk[t.from[k]], p.nodeUnk[t.to[k]]
		c := p.curOf[k]
		switch {
		case e.Kind == reduce.CurrentSource:
			p.op[k] = stampCurrent
			p.slot[k] = [4]int32{row(a), row(b)}
		case c >= 0:
			// KCL: the branch current leaves From and enters To; the
			// branch equation V(From) − V(To) = −Value for a source, and
			// V(From) − V(To) − Z·I = 0 for a passive element, keeps the
			// matrix symmetric.
			constant(find(a, c), 1)
			constant(find(b, c), -1)
			constant(find(c, a), 1)
			constant(find(c, b), -1)
			switch {
			case e.Kind == reduce.VoltageSource:
				p.op[k] = stampVolt
				p.slot[k] = [4]int32{row(c)}
			case direct[k]:
				p.op[k] = stampImp
				p.slot[k] = [4]int32{find(c, c)}
			}
		case a < 0 && b >= 0 || b < 0 && a >= 0:
			// One write instead of three more to the spare entry: a
			// shunt to the reference at every node would otherwise chain
			// the whole stamp through that one memory location.
			p.op[k] = stampShunt
			p.slot[k] = [4]int32{find(max(a, b), max(a, b))}
		default:
			p.op[k] = stampAdmit
			p.slot[k] = [4]int32{find(a, a), find(b, b), find(a, b), find(b, a)}
		}
	}

	for k, op := range p.op {
		var rows []int32
		switch op {
		case stampVolt:
			rows = p.slot[k][:1]
		case stampCurrent:
			rows = p.slot[k][:2]
		}
		for _, r := range rows {
			if r != int32(N) {
				p.rhsRows = append(p.rhsRows, r)
			}
		}
	}
	slices.Sort(p.rhsRows)
	p.rhsRows = slices.Compact(p.rhsRows)

	p.nodes = slices.Clone(t.nodes)
	sortNatural(p.nodes)
	p.work = symbolic(&p.b)
	if err := p.work.check(maxBytes, maxMultiplyAdds); err != nil {
		return nil, err
	}
	// The factorisation may outgrow the estimate (off-diagonal pivots),
	// but not by far and never past the memory bound.
	p.maxNNZ = int(min(int64(4*p.work.Factor+1_000_000), (maxBytes-p.work.Bytes+20*int64(p.work.Factor))/20))
	return p, nil
}

// Work returns the estimates of the symbolic analysis.
func (p *Plan) Work() Work { return p.work }

// Stats returns the counts of the work done by the plan so far.
func (p *Plan) Stats() Stats { return p.stats }

// Fits reports whether n has the topology the plan was made for: the same
// reference, the same elements in the same order with the same names,
// kinds and nodes, and the same passive elements at 0 Ω (ideal shorts).
func (p *Plan) Fits(n *reduce.Network) bool { return p.differs(n) == "" }

// differs says how n differs from the analysed topology, or "".
func (p *Plan) differs(n *reduce.Network) string {
	if n == nil || len(n.Elements) != len(p.names) {
		return "it has a different number of elements"
	}
	if n.Reference != p.ref {
		return "its reference node differs"
	}
	for k, e := range n.Elements {
		if e.Name != p.names[k] || e.Kind != p.kinds[k] || e.From != p.from[k] || e.To != p.to[k] {
			return fmt.Sprintf("element %d (%s) differs", k+1, e.Name)
		}
		if !e.Kind.IsSource() && e.From != e.To && (e.Z == 0) != p.t.short[k] {
			if e.Z == 0 {
				return fmt.Sprintf("%s has become an ideal short (0 Ω)", e.Name)
			}
			return fmt.Sprintf("%s is no longer an ideal short (0 Ω)", e.Name)
		}
	}
	return ""
}

// Solve solves n, which must have the topology the plan was made for (see
// Fits) but may have other element values or impedances at another
// frequency: it writes the new values into the matrix, refactorises on the
// same pattern reusing the pivots while each passes the threshold test
// (choosing new pivots when one fails), solves, refines the solution by at
// most two steps of iterative refinement until the normwise backward error
// is a few units of round-off, and returns the same Solution as the
// package's Solve.
func (p *Plan) Solve(n *reduce.Network, basis calc.Basis) (*Solution, error) {
	return p.SolveContext(context.Background(), n, basis)
}

// SolveContext is Solve under ctx: the numeric factorisation polls ctx
// every few columns (see pollColumns), and when ctx ends before the
// solution is found SolveContext returns ctx.Err(). Neither n nor the
// plan's fitness for it is changed by a stopped solution; the plan's next
// solution refactorises afresh.
func (p *Plan) SolveContext(ctx context.Context, n *reduce.Network, basis calc.Basis) (*Solution, error) {
	return p.SolveReuse(ctx, n, basis, nil)
}

// SolveReuse is SolveContext writing the solution into the maps and the
// branches of prev, a solution of this plan that its caller no longer
// needs, and returning prev, or a new solution when prev is nil or of
// another network. A sweep that reads each point's values before the
// next then allocates its maps and branches once, not at every point.
// On an error prev is left unusable.
func (p *Plan) SolveReuse(ctx context.Context, n *reduce.Network, basis calc.Basis, prev *Solution) (*Solution, error) {
	if why := p.differs(n); why != "" {
		return nil, &NetError{Msg: "the network does not fit the analysed topology: " + why + "; analyse it afresh"}
	}
	for _, e := range n.Elements {
		if err := checkValue(e); err != nil {
			return nil, err
		}
	}
	return p.solve(ctx, n, basis, prev)
}

// solve is SolveReuse for a network known to fit the plan and to have
// valid values: the one just analysed.
func (p *Plan) solve(ctx context.Context, n *reduce.Network, basis calc.Basis, prev *Solution) (*Solution, error) {
	t := p.t.with(n)
	if err := p.factorSolve(ctx, n, t); err != nil {
		return nil, err
	}
	if low := p.imprecise(n); low != nil {
		// Re-plan with a current unknown for each such element; the
		// topology checks stand.
		q, err := analyse(p.t, low)
		if err != nil {
			return nil, err
		}
		q.stats = p.stats
		*p = *q
		if err := p.factorSolve(ctx, n, t); err != nil {
			return nil, err
		}
	}
	p.stats.Solves++
	return p.solution(t, basis, prev)
}

// factorSolve stamps n's values, factorises numerically and solves with
// refinement; a numerically singular matrix is reported by the unknowns
// that carry its null direction, and the factors are dropped.
func (p *Plan) factorSolve(ctx context.Context, n *reduce.Network, t *topology) error {
	if err := p.stamp(n); err != nil {
		return err
	}
	if err := p.factorise(ctx); err != nil {
		return err
	}
	if p.lu.singular >= 0 {
		err := p.singular(t)
		p.lu = nil
		return err
	}
	p.solveRefined()
	return nil
}

// currentTol bounds the rounding error of a passive element's current
// computed as I = (V(From) − V(To))/Z, relative to the largest current in
// the network. Node voltages carry errors of the order of the float64
// round-off u times their size, so an element of very low impedance
// between nodes at high voltage (a 1 µΩ link at 230 V) has a current
// known only to u·|V|/|Z|: Kirchhoff's current law could then not be
// checked to better than that. Such an element gets a current unknown of
// its own, V(From) − V(To) − Z·I = 0, as modified nodal analysis allows
// for any element (Ho, Ruehli and Brennan, 1975), and its current comes
// straight from the solution.
const currentTol = 1e-11

// imprecise returns the elements whose current, computed from the node
// voltages, would be less precise than currentTol of the largest current,
// together with those already given a current unknown; or nil when there
// are none new.
func (p *Plan) imprecise(n *reduce.Network) []bool {
	// Moduli as |re|+|im| (within √2 of |z|): the bound is a margin, not
	// a measurement.
	const u = 0x1p-52
	volt := func(node int32) complex128 {
		if q := p.nodeUnk[node]; q >= 0 {
			return p.x[p.pos[q]]
		}
		return 0
	}
	maxI := 0.0
	for k, e := range n.Elements {
		if p.t.self[k] {
			continue
		}
		var i float64
		switch {
		case e.Kind == reduce.CurrentSource:
			i = abs1(e.Value)
		case p.curOf[k] >= 0:
			i = abs1(p.x[p.pos[p.curOf[k]]])
		default:
			i = abs1(volt(p.t.from[k])-volt(p.t.to[k])) / abs1(e.Z)
		}
		if i > maxI && !math.IsInf(i, 0) {
			maxI = i
		}
	}
	var low []bool
	for k, e := range n.Elements {
		if p.t.self[k] || e.Kind.IsSource() || p.curOf[k] >= 0 {
			continue
		}
		scale := math.Max(abs1(volt(p.t.from[k])), abs1(volt(p.t.to[k])))
		if u*scale > currentTol*maxI*abs1(e.Z) {
			if low == nil {
				low = slices.Clone(p.direct)
			}
			low[k] = true
		}
	}
	return low
}

// with returns the topology t read with the values of n, which has the
// same elements.
func (t *topology) with(n *reduce.Network) *topology {
	c := *t
	c.net = n
	return &c
}

// stamp writes the values of n into the matrix and the right-hand side
// through the scatter map: a copy of the constant entries, then one
// indexed write per entry an element's value reaches. It allocates
// nothing after the first call.
func (p *Plan) stamp(n *reduce.Network) error {
	N := p.b.n
	if p.x == nil {
		p.x = make([]complex128, N)
		p.r = make([]complex128, N)
		p.colmax = make([]float64, N)
	}
	x, rhs := p.bx, p.rhsx
	clear(x)
	clear(rhs)
	for _, c := range p.base {
		x[c.q] += c.v
	}
	els := n.Elements[:len(p.op)]
	for k, op := range p.op {
		s := &p.slot[k]
		switch op {
		case stampAdmit, stampShunt:
			y := recip(els[k].Z)
			if !finite(y) {
				e := &els[k]
				return &NetError{Msg: fmt.Sprintf("%s: the admittance 1/Z is too large to represent", e.Name), Elements: []string{e.Name}, Line: e.Line}
			}
			x[s[0]] += y
			if op == stampAdmit {
				x[s[1]] += y
				x[s[2]] -= y
				x[s[3]] -= y
			}
		case stampImp:
			x[s[0]] -= els[k].Z
		case stampVolt:
			rhs[s[0]] -= els[k].Value
		case stampCurrent:
			// Value leaves From and enters To.
			v := els[k].Value
			rhs[s[0]] -= v
			rhs[s[1]] += v
		}
	}
	return nil
}

// factorise factorises the stamped matrix, reusing the pivots of the last
// factorisation when they pass the threshold test. It polls ctx, when not
// nil, every pollColumns columns; when ctx ends it returns ctx.Err(), and
// the plan stays usable: factors cut short are refactorised, or dropped
// and made afresh, at the next solution.
func (p *Plan) factorise(ctx context.Context) error {
	if p.lu != nil {
		ok, err := p.lu.refactor(&p.b, p.colmax, ctx)
		if err != nil {
			return err
		}
		if ok {
			p.normA = p.lu.norm1
			p.stats.Refactorisations++
			return nil
		}
		p.stats.Repivots++
	}
	// Column maxima for the singularity test, ‖A‖₁ for the backward
	// error, and a check that every value is finite (refactor fails on
	// one that is not).
	p.normA = 0
	for j := 0; j < p.b.n; j++ {
		m, sum := 0.0, 0.0
		for _, v := range p.b.x[p.b.p[j]:p.b.p[j+1]] {
			a := abs1(v)
			if a > m {
				m = a
			}
			sum += a
		}
		if math.IsInf(m, 0) {
			return &NetError{Msg: "the network equations hold a value too large to represent"}
		}
		p.colmax[j] = m
		p.normA = max(p.normA, sum)
	}
	lu, err := factor(&p.b, p.colmax, p.work.Factor, p.maxNNZ, p.lu, ctx)
	if err != nil {
		// factor wrote over the old factors' storage
		p.lu = nil
		var ce *capacityError
		if errors.As(err, &ce) {
			return &NetError{Msg: fmt.Sprintf("the network is too large for the nodal solution: its LU factors grew past %s entries, far beyond the estimate (%s)", count(float64(ce.nnz)), p.work)}
		}
		return err
	}
	p.lu = lu
	p.stats.Factorisations++
	return nil
}

// solveRefined solves for p.x (new order) from p.rhs with iterative
// refinement in working precision (R. D. Skeel, "Iterative refinement
// implies numerical stability for Gaussian elimination", Math. Comp.
// 35(151), 1980; N. J. Higham, "Accuracy and Stability of Numerical
// Algorithms", 2nd ed., SIAM, 2002, ch. 12): r = b − A·x, solve A·d = r,
// x ← x + d. The residual of the first solution is always computed, since
// its normwise backward error ‖r‖∞ / (‖A‖∞·‖x‖∞ + ‖b‖∞) (J. L. Rigal and
// J. Gaches, J. ACM 14(3), 1967) is reported with the solution; a step of
// refinement is taken only while that error exceeds refineTarget, at most
// maxRefine times, and kept only if it lowers the error. It allocates
// only at the plan's first step of refinement.
func (p *Plan) solveRefined() {
	normB := p.lu.solveSparse(p.x, p.rhs, p.rhsRows)
	eta := p.residual(normB)
	for step := 0; step < maxRefine && eta > refineTarget; step++ {
		if p.d == nil {
			// made at the first refinement, kept for the next
			p.d = make([]complex128, len(p.x))
			p.keep = make([]complex128, len(p.x))
		}
		p.lu.solveTo(p.d, p.r)
		copy(p.keep, p.x)
		for i, d := range p.d {
			p.x[i] += d
		}
		p.stats.Refinements++
		e := p.residual(normB)
		if !(e < eta) {
			copy(p.x, p.keep)
			break
		}
		eta = e
	}
	p.eta = eta
}

// residual sets p.r = b − A·x and returns the normwise backward error.
// ‖A‖∞ is p.normA, found by factorise. A = Aᵀ (every stamp is symmetric,
// TestStampSymmetric), so row i of A is read as column i: each r[i] is
// summed in a register rather than scattered to column by column.
func (p *Plan) residual(normB float64) float64 {
	b := &p.b
	n := b.n
	r, x, rhs := p.r[:n], p.x[:n], p.rhs[:n]
	bi, bx := b.i, b.x[:len(b.i)]
	ends := b.p[1 : n+1]
	normX, normR := 0.0, 0.0
	nan := false
	q := int(b.p[0])
	for i, end := range ends {
		acc := rhs[i]
		for ; q < int(end); q++ {
			acc -= bx[q] * x[bi[q]]
		}
		r[i] = acc
		if a := abs1(acc); a > normR {
			normR = a
		} else if a != a {
			nan = true
		}
		if a := abs1(x[i]); a > normX {
			normX = a
		} else if a != a {
			nan = true
		}
	}
	den := p.normA*normX + normB
	if den == 0 || math.IsInf(den, 0) || nan {
		return 0
	}
	return normR / den
}

// singular reports numerically singular equations. Inverse iteration from
// a fixed start: the solution is dominated by the null direction, whose
// large entries show where the trouble lies.
func (p *Plan) singular(t *topology) error {
	N := p.b.n
	x := make([]complex128, N)
	for i := range x {
		x[i] = complex(1, 0.5*float64(i%3))
	}
	p.lu.solve(x, make([]complex128, N))
	big := 0.0
	for _, v := range x {
		if finite(v) {
			big = math.Max(big, cmplx.Abs(v))
		}
	}
	var culprits []int
	for newI, v := range x {
		if !finite(v) || cmplx.Abs(v) >= 0.01*big {
			culprits = append(culprits, int(p.order[newI]))
		}
	}
	if len(culprits) == 0 {
		culprits = []int{int(p.order[p.lu.singular])}
	}
	return t.singular(culprits, p.unk, p.cur)
}

// recip returns 1/z, rounded once for a purely real or purely imaginary z
// (resistors, inductors and capacitors), by the general complex division
// otherwise.
func recip(z complex128) complex128 {
	switch {
	case imag(z) == 0:
		return complex(1/real(z), 0)
	case real(z) == 0:
		return complex(0, -1/imag(z))
	}
	return 1 / z
}
