package nodal

import (
	"context"
	"math"
)

// entry is one term of a sparse matrix in triplet form; terms at the same
// position add up.
type entry struct {
	i, j int32
	v    complex128
}

// pivotThreshold is τ of threshold partial pivoting: a candidate pivot is
// accepted when its modulus is at least τ times the largest in its column
// of the active matrix, so no multiplier of L exceeds 1/τ = 10. The value
// 0.1 is the compromise between stability and keeping the pivots the
// ordering chose that I. S. Duff, A. M. Erisman and J. K. Reid recommend
// for sparse Gaussian elimination ("Direct Methods for Sparse Matrices",
// Oxford, 1986, from memory): small enough that the diagonal of a node
// equation is nearly always kept, so the fill stays as the ordering
// planned, and large enough that the growth of the entries, and with it
// the backward error, stays small; iterative refinement mops up the rest.
const pivotThreshold = 0.1

// reuseThreshold is the threshold a pivot must pass to be kept when the
// matrix is refactorised with other values (a sweep, a spread): τ/10,
// bounding the multipliers by 100. The gap between the two thresholds is
// hysteresis: a pivot chosen at 0.1 of its column is not given up at the
// next point of a sweep for drifting a little below it, which would cost a
// full factorisation, often for pivots much like the old ones. The
// backward error measured after every solution, with iterative
// refinement, guards the accuracy either way.
const reuseThreshold = pivotThreshold / 10

// pollColumns is how often the numeric factorisation asks its context
// whether to stop: every 64 columns. A call costs tens of nanoseconds, a
// column of a network's factors from a few to some hundred thousand
// multiply-adds, so the polls cost nothing to speak of and a stop comes
// within milliseconds even on the densest columns the work bounds allow.
const pollColumns = 64

// sparseLU is the LU factorisation P·B = L·U of a sparse complex matrix B
// held by columns, computed column by column by the left-looking method of
// J. R. Gilbert and T. Peierls ("Sparse partial pivoting in time
// proportional to arithmetic operations", SIAM J. Sci. Stat. Comput. 9(5),
// 1988): the pattern of column k of L and U is the set of rows reachable
// in the graph of the L found so far from the rows of B(:,k), found by
// depth-first search, which also yields the order in which the earlier
// columns update column k. Pivots are chosen by threshold partial pivoting
// (see pivotThreshold) with preference for the diagonal.
//
// Row indices of L and U are pivot positions: row i of P·B. The columns of
// U list their entries in an order in which the updates may be applied, so
// that refactor can repeat the elimination on new values of the same
// pattern without any search.
type sparseLU struct {
	n int
	// L, unit lower triangular, without its diagonal.
	lp []int32
	li []int32
	lx []complex128
	// U without its diagonal, and the reciprocals of the pivots. The
	// pattern is held by columns (up, ui), in the order refactor applies
	// the updates. factor leaves the values ux in that order; refactor,
	// which runs many times on one pattern, first adds the row form
	// (urp, urc; urow[p] is the place in a row of column entry p) and
	// writes ux in row order (byRows), so that back substitution gathers
	// each x[k] in a register from one row instead of scattering each
	// column over x, which chains the updates of an x[i] through memory.
	// factor does not make the row form itself: for one solution of a
	// large network it would cost more than it saves.
	up     []int32
	ui     []int32
	urp    []int32
	urc    []int32
	urow   []int32
	byRows bool
	// reach lists, in increasing order, the columns of L a forward
	// substitution from the rows given to solveSparse passes through;
	// reached tells that it is made for the present pattern.
	reach   []int32
	reached bool
	ux      []complex128
	dinv    []complex128
	// perm[k] is the row of B chosen as pivot k; pinv its inverse.
	perm, pinv []int32
	// singular is the first column whose pivot fell below pivotTol of
	// the column's largest entry, or −1.
	singular int
	// norm1 is ‖B‖₁, the largest column sum of moduli (abs1) of the B
	// last refactorised, found on the way for the backward error.
	norm1 float64
	// x is the dense work column, kept zero between columns.
	x []complex128
	// work space of factor
	xi, pstack, visited, pend []int32
}

// abs1 is |re|+|im|, the cheap modulus used for pivot choice.
func abs1(v complex128) float64 { return math.Abs(real(v)) + math.Abs(imag(v)) }

// csc is a square sparse matrix by columns: the rows of column j are
// i[p[j]:p[j+1]], in increasing order, with values x.
type csc struct {
	n int
	p []int32
	i []int32
	x []complex128
}

// colMax returns the largest entry modulus (abs1) of each column.
func (b *csc) colMax() []float64 {
	m := make([]float64, b.n)
	for j := 0; j < b.n; j++ {
		for q := b.p[j]; q < b.p[j+1]; q++ {
			m[j] = math.Max(m[j], abs1(b.x[q]))
		}
	}
	return m
}

// capacityError is returned when the factors outgrow the bound set from
// the symbolic analysis.
type capacityError struct{ nnz int }

func (e *capacityError) Error() string { return "factor too large" }

// factor computes P·B = L·U from scratch, choosing pivots. colmax holds
// the largest entry of each column of B; a pivot below pivotTol times it
// marks the matrix numerically singular (see singular) and is replaced by
// that bound so that the factors stay usable for inverse iteration.
// capHint sizes the storage; maxNNZ bounds the entries of L and U. The
// storage of old, when not nil, is reused: a sweep that must choose new
// pivots then allocates nothing. ctx, when not nil, is polled every
// pollColumns columns; when it ends factor returns ctx.Err(), and old is
// left unusable.
func factor(b *csc, colmax []float64, capHint, maxNNZ int, old *sparseLU, ctx context.Context) (*sparseLU, error) {
	n := b.n
	f := old
	if f == nil || f.n != n {
		// capHint counts L and U with one diagonal: each holds about
		// (capHint − n)/2 entries off it. An eighth of n more leaves
		// room for the few off-diagonal pivots; past it they grow.
		half := max(capHint-n, 0)/2 + n/8 + 16
		f = &sparseLU{
			n:    n,
			lp:   make([]int32, n+1),
			up:   make([]int32, n+1),
			dinv: make([]complex128, n),
			perm: make([]int32, n),
			pinv: make([]int32, n),
			x:    make([]complex128, n),
			li:   make([]int32, 0, half),
			lx:   make([]complex128, 0, half),
			ui:   make([]int32, 0, half),
			ux:   make([]complex128, 0, half),
			// Depth-first search state: the reach is written at the
			// top of xi (xi[top:n]), the stack at its bottom; pstack
			// keeps each node's position in its list; visited[v] is
			// k+1 once row v is reached for column k; pend[j] ends the
			// part of L(:,j) the search must follow (symmetric pruning,
			// see below).
			xi:      make([]int32, 2*n),
			pstack:  make([]int32, n),
			visited: make([]int32, n),
			pend:    make([]int32, n),
		}
	}
	f.singular = -1
	f.byRows, f.reached = false, false
	f.li, f.lx, f.ui, f.ux = f.li[:0], f.lx[:0], f.ui[:0], f.ux[:0]
	clear(f.x)
	clear(f.visited)
	for i := range f.pinv {
		f.pinv[i] = -1
	}
	x, xi, pstack, visited, pend := f.x, f.xi, f.pstack, f.visited, f.pend
	cand := make([]int32, 0, 16)
	free := 0 // rows below free are all pivotal: the search for a spare row starts here

	for k := 0; k < n; k++ {
		if ctx != nil && k%pollColumns == 0 {
			if err := ctx.Err(); err != nil {
				clear(x)
				return nil, err
			}
		}
		stamp := int32(k + 1)
		// Reach of B(:,k) in the graph of L: row i (of B) leads on to
		// the rows of column pinv[i] of L when it is already pivotal.
		top := n
		for q := b.p[k]; q < b.p[k+1]; q++ {
			r := b.i[q]
			if visited[r] == stamp {
				continue
			}
			// iterative depth-first search from r
			head := 0
			xi[0] = r
			for head >= 0 {
				v := xi[head]
				j := f.pinv[v]
				if visited[v] != stamp {
					visited[v] = stamp
					if j >= 0 {
						pstack[head] = f.lp[j]
					}
				}
				done := true
				if j >= 0 {
					end := pend[j]
					for p := pstack[head]; p < end; p++ {
						w := f.li[p]
						if visited[w] == stamp {
							continue
						}
						pstack[head] = p + 1
						head++
						xi[head] = w
						done = false
						break
					}
				}
				if done {
					head--
					top--
					xi[top] = v
				}
			}
		}
		reach := xi[top:n]
		// Numeric: scatter B(:,k) and apply the updates in order.
		for q := b.p[k]; q < b.p[k+1]; q++ {
			x[b.i[q]] += b.x[q]
		}
		for _, v := range reach {
			j := f.pinv[v]
			if j < 0 {
				continue
			}
			if xj := x[v]; xj != 0 {
				axpy(x, f.li[f.lp[j]:f.lp[j+1]], f.lx[f.lp[j]:f.lp[j+1]], xj)
			}
		}
		// Pivot among the rows not yet pivotal.
		cand = cand[:0]
		best, ipiv := -1.0, int32(-1)
		for _, v := range reach {
			if f.pinv[v] >= 0 {
				continue
			}
			cand = append(cand, v)
			if a := abs1(x[v]); a > best {
				best, ipiv = a, v
			}
		}
		// Prefer the diagonal, the row the ordering placed with k.
		if f.pinv[k] < 0 && visited[k] == stamp && abs1(x[k]) >= pivotThreshold*best {
			ipiv = int32(k)
		}
		if ipiv < 0 {
			// Structurally no candidate: take a spare row so that the
			// factors stay square; the pivot is then 0 and replaced.
			for free < n && f.pinv[free] >= 0 {
				free++
			}
			ipiv = int32(free)
			cand = append(cand, ipiv)
			best = 0
		}
		piv := x[ipiv]
		if tol := pivotTol * colmax[k]; !(best > tol) || math.IsInf(best, 0) {
			if f.singular < 0 {
				f.singular = k
			}
			if !(tol > 0) || math.IsInf(tol, 0) {
				tol = 1
			}
			piv = complex(tol, 0)
		}
		f.perm[k] = ipiv
		f.pinv[ipiv] = int32(k)
		d := 1 / piv
		f.dinv[k] = d
		// U(:,k): the pivotal rows reached, in update order.
		for _, v := range reach {
			if j := f.pinv[v]; j >= 0 && j != int32(k) {
				f.ui = append(f.ui, j)
				f.ux = append(f.ux, x[v])
				x[v] = 0
			}
		}
		f.up[k+1] = int32(len(f.ui))
		// L(:,k): the other candidates over the pivot; rows stay B rows
		// until the end.
		for _, v := range cand {
			if v != ipiv {
				f.li = append(f.li, v)
				f.lx = append(f.lx, x[v]*d)
			}
			x[v] = 0
		}
		f.lp[k+1] = int32(len(f.li))
		pend[k] = f.lp[k+1]
		// Symmetric pruning (S. C. Eisenstat and J. W. H. Liu,
		// "Exploiting structural symmetry in a sparse partial pivoting
		// code", SIAM J. Sci. Comput. 14(1), 1993): when U(j,k) ≠ 0 and
		// the pivot row of k lies in L(:,j), every row of L(:,j) not yet
		// pivotal is also in L(:,k), so a later search reaches it through
		// k and need not follow it from j. Such rows move to the end of
		// L(:,j), past pend[j]; the numeric updates still use them all.
		for q := f.up[k]; q < f.up[k+1]; q++ {
			j := f.ui[q]
			if pend[j] != f.lp[j+1] {
				continue // pruned already
			}
			lo, hi := f.lp[j], f.lp[j+1]
			found := false
			for p := lo; p < hi; p++ {
				if f.li[p] == ipiv {
					found = true
					break
				}
			}
			if !found {
				continue
			}
			for p := lo; p < hi; p++ {
				if f.pinv[f.li[p]] >= 0 {
					f.li[p], f.li[lo] = f.li[lo], f.li[p]
					f.lx[p], f.lx[lo] = f.lx[lo], f.lx[p]
					lo++
				}
			}
			pend[j] = lo
		}
		if len(f.li)+len(f.ui) > maxNNZ {
			return nil, &capacityError{len(f.li) + len(f.ui)}
		}
	}
	for p := range f.li {
		f.li[p] = f.pinv[f.li[p]]
	}
	return f, nil
}

// rowsOfU makes the row form of U's pattern from its column form, by a
// counting sort on the rows. The values are not moved: refactor writes
// every one of them anew, in row order.
func (f *sparseLU) rowsOfU() {
	n, nu := f.n, len(f.ui)
	f.urp = resize(f.urp, n+1)
	f.urc = resize(f.urc, nu)
	f.urow = resize(f.urow, nu)
	clear(f.urp)
	for _, j := range f.ui {
		f.urp[j+1]++
	}
	for j := 0; j < n; j++ {
		f.urp[j+1] += f.urp[j]
	}
	next := f.pstack[:n] // scratch of factor, free between factorisations
	copy(next, f.urp[:n])
	for k := 0; k < n; k++ {
		for p := f.up[k]; p < f.up[k+1]; p++ {
			j := f.ui[p]
			f.urow[p] = next[j]
			f.urc[next[j]] = int32(k)
			next[j]++
		}
	}
	f.byRows = true
}

// resize returns s with length n, reusing its storage when large enough.
func resize(s []int32, n int) []int32 {
	if cap(s) >= n {
		return s[:n]
	}
	return make([]int32, n)
}

// refactor repeats the factorisation on new values of B with the same
// pattern, keeping the pivot order, and writes the largest entry modulus
// (abs1) of each column of B into colmax on the way, for the singularity
// test, and ‖B‖₁ into norm1. It reports false, leaving the factors unusable, when some pivot
// fails the threshold test against its column (or the singularity test
// against colmax, which an entry too large to represent also fails): the
// caller then factorises afresh, choosing new pivots. ctx, when not nil,
// is polled every pollColumns columns; when it ends refactor returns
// ctx.Err(), and the factors, whose pattern and pivots are intact, must
// be refactorised before use.
func (f *sparseLU) refactor(b *csc, colmax []float64, ctx context.Context) (bool, error) {
	n := f.n
	if !f.byRows {
		f.rowsOfU()
	}
	x := f.x
	pinv := f.pinv[:n]
	colmax = colmax[:n]
	norm1 := 0.0
	for k := 0; k < n; k++ {
		if ctx != nil && k%pollColumns == 0 {
			if err := ctx.Err(); err != nil {
				clear(x)
				return false, err
			}
		}
		lo, hi := b.p[k], b.p[k+1]
		cm, sum := 0.0, 0.0
		for q, i := range b.i[lo:hi] {
			v := b.x[lo+int32(q)]
			a := abs1(v)
			if a > cm {
				cm = a
			}
			sum += a
			x[pinv[i]] += v
		}
		colmax[k] = cm
		if sum > norm1 {
			norm1 = sum
		}
		for p := f.up[k]; p < f.up[k+1]; p++ {
			j := f.ui[p]
			xj := x[j]
			if xj != 0 {
				axpy(x, f.li[f.lp[j]:f.lp[j+1]], f.lx[f.lp[j]:f.lp[j+1]], xj)
			}
			f.ux[f.urow[p]] = xj
			x[j] = 0
		}
		piv := x[k]
		x[k] = 0
		d := 1 / piv
		f.dinv[k] = d
		// L(:,k) over the pivot, finding the largest entry below it
		big := 0.0
		llo, lhi := f.lp[k], f.lp[k+1]
		lx := f.lx[llo:lhi]
		for q, i := range f.li[llo:lhi] {
			v := x[i]
			if m := abs1(v); m > big {
				big = m
			}
			lx[q] = v * d
			x[i] = 0
		}
		if a := abs1(piv); !(a >= reuseThreshold*big) || !(a > pivotTol*cm) || math.IsInf(a, 0) {
			// clear the rest of x: every later column starts from zero
			clear(x)
			return false, nil
		}
	}
	f.norm1 = norm1
	return true, nil
}

// solve overwrites y, the right-hand side in B's row order, with B⁻¹·y in
// B's column order; w is scratch of length n.
func (f *sparseLU) solve(y, w []complex128) {
	f.solveTo(w, y)
	copy(y, w)
}

// solveTo sets x to B⁻¹·b, for b in B's row order and x in its column
// order, leaving b as it was: the rows of b are placed in pivot order in
// x, and the substitutions run in place there.
//
// It returns max abs1(b[i]), found on the way, for the backward error.
func (f *sparseLU) solveTo(x, b []complex128) (normB float64) {
	n := f.n
	x = x[:n]
	pinv := f.pinv[:len(b)]
	// The right-hand side of a network is mostly zeros (the rows of its
	// sources); the forward substitution starts at its first non-zero.
	clear(x)
	first := n
	for i, v := range b {
		if v != 0 {
			k := int(pinv[i])
			x[k] = v
			first = min(first, k)
			if a := abs1(v); a > normB {
				normB = a
			}
		}
	}
	// The loop runs over the index arrays as a whole, column after
	// column, rather than slicing them per column: columns here hold a
	// few entries each, and the slicing would cost as much as they do.
	li, lx := f.li, f.lx[:len(f.li)]
	lp := f.lp[:n+1]
	for j := first; j < n; j++ {
		if xj := x[j]; xj != 0 {
			for q := int(lp[j]); q < int(lp[j+1]); q++ {
				x[li[q]] -= lx[q] * xj
			}
		}
	}
	f.backTo(x)
	return normB
}

// solveSparse is solveTo for a b that is zero outside rows, which must be
// the same rows at every call between two factorisations (a network's
// right-hand side has its non-zeros at the rows of its sources, and
// refactor keeps the pattern). The forward substitution then visits
// only the columns of L those rows reach, found at the first call as in
// the symbolic step of Gilbert and Peierls (see sparseLU): column j is
// reached when row j is one of rows or some reached column of L has an
// entry in row j. Scanning the columns in increasing order finds them in
// an order the substitution may follow, L being lower triangular.
func (f *sparseLU) solveSparse(x, b []complex128, rows []int32) (normB float64) {
	n := f.n
	x = x[:n]
	pinv := f.pinv[:len(b)]
	if !f.reached {
		mark := f.visited[:n] // scratch of factor, free between factorisations
		clear(mark)
		for _, i := range rows {
			mark[pinv[i]] = 1
		}
		f.reach = f.reach[:0]
		for j := range n {
			if mark[j] != 0 {
				f.reach = append(f.reach, int32(j))
				for _, i := range f.li[f.lp[j]:f.lp[j+1]] {
					mark[i] = 1
				}
			}
		}
		f.reached = true
	}
	clear(x)
	for _, i := range rows {
		v := b[i]
		x[pinv[i]] = v
		if a := abs1(v); a > normB {
			normB = a
		}
	}
	li, lx := f.li, f.lx[:len(f.li)]
	lp := f.lp[:n+1]
	for _, j := range f.reach {
		if xj := x[j]; xj != 0 {
			for q := int(lp[j]); q < int(lp[j+1]); q++ {
				x[li[q]] -= lx[q] * xj
			}
		}
	}
	f.backTo(x)
	return normB
}

// backTo finishes solveTo by back substitution with U, by rows when
// refactor has put U's values in row order, else by columns.
func (f *sparseLU) backTo(x []complex128) {
	n := f.n
	x = x[:n]
	if !f.byRows {
		for k := n - 1; k >= 0; k-- {
			xk := x[k] * f.dinv[k]
			x[k] = xk
			if xk != 0 {
				axpy(x, f.ui[f.up[k]:f.up[k+1]], f.ux[f.up[k]:f.up[k+1]], xk)
			}
		}
		return
	}
	urc, ux := f.urc, f.ux[:len(f.urc)]
	dinv := f.dinv[:n]
	q := int(f.urp[n])
	for k := n - 1; k >= 0; k-- {
		acc := x[k]
		lo := int(f.urp[k])
		for q > lo {
			q--
			acc -= ux[q] * x[urc[q]]
		}
		x[k] = acc * dinv[k]
	}
}

// nnz is the number of entries of L and U, diagonal included.
func (f *sparseLU) nnz() int { return len(f.li) + len(f.ui) + f.n }

// axpy subtracts v times the sparse vector (idx, val) from x.
func axpy(x []complex128, idx []int32, val []complex128, v complex128) {
	val = val[:len(idx)]
	for q, i := range idx {
		x[i] -= val[q] * v
	}
}
