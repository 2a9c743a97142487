package nodal

import (
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
	slot    [][5]int32
	direct  []bool // passive elements given a current unknown for their low impedance
	work    Work
	maxNNZ  int

	lu     *sparseLU
	colmax []float64
	rowAbs []float64
	rhs    []complex128
	x      []complex128
	r      []complex128
	d      []complex128
	w      []complex128
	eta    float64 // backward error of the last solution
	stats  Stats
}

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
	for j := 0; j < N; j++ {
		col := rows[colCount[j]:colCount[j+1]]
		slices.Sort(col)
		col = slices.Compact(col)
		p.b.i = append(p.b.i, col...)
		p.b.p[j+1] = int32(len(p.b.i))
	}
	p.b.x = make([]complex128, len(p.b.i))
	find := func(i, j int32) int32 {
		if i < 0 || j < 0 {
			return -1
		}
		ni, nj := p.pos[i], p.pos[j]
		col := p.b.i[p.b.p[nj]:p.b.p[nj+1]]
		q, _ := slices.BinarySearch(col, ni)
		return p.b.p[nj] + int32(q)
	}
	p.slot = make([][5]int32, len(els))
	for k, e := range els {
		p.slot[k] = [5]int32{-1, -1, -1, -1, -1}
		if t.self[k] || e.Kind == reduce.CurrentSource {
			continue
		}
		a, b := p.nodeUnk[t.from[k]], p.nodeUnk[t.to[k]]
		if c := p.curOf[k]; c >= 0 {
			p.slot[k] = [5]int32{find(a, c), find(b, c), find(c, a), find(c, b), -1}
			if direct[k] {
				p.slot[k][4] = find(c, c)
			}
		} else {
			p.slot[k] = [5]int32{find(a, a), find(b, b), find(a, b), find(b, a), -1}
		}
	}

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
	if why := p.differs(n); why != "" {
		return nil, &NetError{Msg: "the network does not fit the analysed topology: " + why + "; analyse it afresh"}
	}
	for _, e := range n.Elements {
		if err := checkValue(e); err != nil {
			return nil, err
		}
	}
	t := p.t.with(n)
	if err := p.factorSolve(n, t); err != nil {
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
		if err := p.factorSolve(n, t); err != nil {
			return nil, err
		}
	}
	p.stats.Solves++
	return p.solution(t, basis)
}

// factorSolve stamps n's values, factorises numerically and solves with
// refinement; a numerically singular matrix is reported by the unknowns
// that carry its null direction, and the factors are dropped.
func (p *Plan) factorSolve(n *reduce.Network, t *topology) error {
	if err := p.stamp(n); err != nil {
		return err
	}
	if err := p.factorise(); err != nil {
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

// stamp writes the values of n into the matrix and the right-hand side.
func (p *Plan) stamp(n *reduce.Network) error {
	N := p.b.n
	if p.rhs == nil {
		p.rhs = make([]complex128, N)
		p.x = make([]complex128, N)
		p.r = make([]complex128, N)
		p.d = make([]complex128, N)
		p.w = make([]complex128, N)
		p.rowAbs = make([]float64, N)
	}
	clear(p.b.x)
	clear(p.rhs)
	for k, e := range n.Elements {
		if p.t.self[k] {
			continue
		}
		s := &p.slot[k]
		switch {
		case e.Kind == reduce.CurrentSource:
			// Value leaves From and enters To.
			if a := p.nodeUnk[p.t.from[k]]; a >= 0 {
				p.rhs[p.pos[a]] -= e.Value
			}
			if b := p.nodeUnk[p.t.to[k]]; b >= 0 {
				p.rhs[p.pos[b]] += e.Value
			}
		case p.curOf[k] >= 0:
			// KCL: the branch current leaves From and enters To; the
			// branch equation V(From) − V(To) = −Value for a source, and
			// V(From) − V(To) − Z·I = 0 for a passive element, keeps the
			// matrix symmetric.
			p.add(s[0], 1)
			p.add(s[1], -1)
			p.add(s[2], 1)
			p.add(s[3], -1)
			if e.Kind == reduce.VoltageSource {
				p.rhs[p.pos[p.curOf[k]]] = -e.Value
			} else {
				p.add(s[4], -e.Z)
			}
		default:
			y := recip(e.Z)
			if !finite(y) {
				return &NetError{Msg: fmt.Sprintf("%s: the admittance 1/Z is too large to represent", e.Name), Elements: []string{e.Name}, Line: e.Line}
			}
			p.add(s[0], y)
			p.add(s[1], y)
			p.add(s[2], -y)
			p.add(s[3], -y)
		}
	}
	return nil
}

func (p *Plan) add(q int32, v complex128) {
	if q >= 0 {
		p.b.x[q] += v
	}
}

// factorise factorises the stamped matrix, reusing the pivots of the last
// factorisation when they pass the threshold test.
func (p *Plan) factorise() error {
	// Column maxima for the singularity test and row sums for the norm
	// of the matrix, in one pass.
	if p.colmax == nil {
		p.colmax = make([]float64, p.b.n)
	}
	clear(p.rowAbs)
	for j := 0; j < p.b.n; j++ {
		m := 0.0
		for q := p.b.p[j]; q < p.b.p[j+1]; q++ {
			a := abs1(p.b.x[q])
			if a > m {
				m = a
			}
			p.rowAbs[p.b.i[q]] += a
		}
		if math.IsInf(m, 0) {
			return &NetError{Msg: "the network equations hold a value too large to represent"}
		}
		p.colmax[j] = m
	}
	if p.lu != nil {
		if p.lu.refactor(&p.b, p.colmax) {
			p.stats.Refactorisations++
			return nil
		}
		p.stats.Repivots++
	}
	lu, err := factor(&p.b, p.colmax, p.work.Factor, p.maxNNZ, p.lu)
	if err != nil {
		var ce *capacityError
		if errors.As(err, &ce) {
			return &NetError{Msg: fmt.Sprintf("the network is too large for the nodal solution: its LU factors grew past %s entries, far beyond the estimate (%s)", count(float64(ce.nnz)), p.work)}
		}
		p.lu = nil
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
// x ← x + d, while the normwise backward error
// ‖r‖∞ / (‖A‖∞·‖x‖∞ + ‖b‖∞) (J. L. Rigal and J. Gaches, J. ACM 14(3),
// 1967) exceeds refineTarget, at most maxRefine times.
func (p *Plan) solveRefined() {
	copy(p.x, p.rhs)
	p.lu.solve(p.x, p.w)
	normA, normB := 0.0, 0.0
	for i, v := range p.rowAbs {
		normA = math.Max(normA, v)
		normB = math.Max(normB, abs1(p.rhs[i]))
	}
	eta := p.residual(normA, normB)
	for step := 0; step < maxRefine && eta > refineTarget; step++ {
		copy(p.d, p.r)
		p.lu.solve(p.d, p.w)
		keep := slices.Clone(p.x)
		for i := range p.x {
			p.x[i] += p.d[i]
		}
		p.stats.Refinements++
		e := p.residual(normA, normB)
		if !(e < eta) {
			copy(p.x, keep)
			break
		}
		eta = e
	}
	p.eta = eta
}

// residual sets p.r = b − A·x and returns the normwise backward error.
func (p *Plan) residual(normA, normB float64) float64 {
	copy(p.r, p.rhs)
	normX := 0.0
	for j := 0; j < p.b.n; j++ {
		xj := p.x[j]
		normX = math.Max(normX, abs1(xj))
		if xj == 0 {
			continue
		}
		for q := p.b.p[j]; q < p.b.p[j+1]; q++ {
			p.r[p.b.i[q]] -= p.b.x[q] * xj
		}
	}
	normR := 0.0
	for _, v := range p.r {
		normR = math.Max(normR, abs1(v))
	}
	den := normA*normX + normB
	if den == 0 || math.IsInf(den, 0) || math.IsNaN(normR) {
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
