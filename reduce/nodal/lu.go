package nodal

import (
	"math"
)

// entry is one term of a sparse matrix in triplet form; terms at the same
// position add up.
type entry struct {
	i, j int32
	v    complex128
}

// maxBandStorage bounds the band storage (in complex numbers) that a solve
// may allocate: 4·10⁶ numbers take 64 MB. A network whose reordered matrix
// still needs more is refused rather than left to exhaust memory.
const maxBandStorage = 4_000_000

// rcmOrder returns a reverse Cuthill–McKee ordering of the symmetric
// pattern given by adjacency lists in compressed form (neighbours of i are
// adj[start[i]:start[i+1]]): order[new] = old. Each connected part starts
// from a pseudo-peripheral vertex found by repeated breadth-first search
// (Cuthill & McKee, "Reducing the bandwidth of sparse symmetric matrices",
// 1969; the reversal after George, 1971; the starting vertex as in George &
// Liu, "Computer Solution of Large Sparse Positive Definite Systems", 1981,
// from memory). Neighbours are visited in order of increasing degree.
func rcmOrder(n int, start, adj []int32) []int32 {
	deg := func(v int32) int32 { return start[v+1] - start[v] }
	order := make([]int32, 0, n)
	level := make([]int32, n)
	visited := make([]bool, n)
	var nb []int32

	// bfsLevels runs a breadth-first search from root over unvisited
	// vertices and returns the last level's vertices and the depth, using
	// level as scratch (−1 unvisited).
	mark := make([]int32, n)
	stamp := int32(0)
	bfs := func(root int32) (last []int32, depth int32) {
		stamp++
		queue := []int32{root}
		mark[root] = stamp
		level[root] = 0
		for h := 0; h < len(queue); h++ {
			v := queue[h]
			for _, w := range adj[start[v]:start[v+1]] {
				if visited[w] || mark[w] == stamp {
					continue
				}
				mark[w] = stamp
				level[w] = level[v] + 1
				queue = append(queue, w)
			}
		}
		depth = level[queue[len(queue)-1]]
		for i := len(queue) - 1; i >= 0 && level[queue[i]] == depth; i-- {
			last = append(last, queue[i])
		}
		return last, depth
	}

	for s := int32(0); int(s) < n; s++ {
		if visited[s] {
			continue
		}
		// The lowest-degree vertex of this part is a good first guess.
		root := s
		{
			stamp++
			queue := []int32{s}
			mark[s] = stamp
			for h := 0; h < len(queue); h++ {
				v := queue[h]
				if deg(v) < deg(root) {
					root = v
				}
				for _, w := range adj[start[v]:start[v+1]] {
					if !visited[w] && mark[w] != stamp {
						mark[w] = stamp
						queue = append(queue, w)
					}
				}
			}
		}
		// Pseudo-peripheral vertex: move to a minimum-degree vertex of the
		// deepest level while the depth grows (a few rounds suffice).
		last, depth := bfs(root)
		for round := 0; round < 8; round++ {
			cand := last[0]
			for _, v := range last {
				if deg(v) < deg(cand) {
					cand = v
				}
			}
			l2, d2 := bfs(cand)
			if d2 <= depth {
				break
			}
			root, last, depth = cand, l2, d2
		}
		// Cuthill–McKee from root.
		head := len(order)
		order = append(order, root)
		visited[root] = true
		for h := head; h < len(order); h++ {
			v := order[h]
			nb = nb[:0]
			for _, w := range adj[start[v]:start[v+1]] {
				if !visited[w] {
					visited[w] = true
					nb = append(nb, w)
				}
			}
			// insertion sort by degree: neighbour lists are short
			for i := 1; i < len(nb); i++ {
				for k := i; k > 0 && deg(nb[k]) < deg(nb[k-1]); k-- {
					nb[k], nb[k-1] = nb[k-1], nb[k]
				}
			}
			order = append(order, nb...)
		}
	}
	for i, j := 0, len(order)-1; i < j; i, j = i+1, j-1 {
		order[i], order[j] = order[j], order[i]
	}
	return order
}

// bandLU is the LU factorisation with partial pivoting of a complex band
// matrix with kl sub-diagonals and ku super-diagonals: Gaussian
// elimination restricted to the band, where row interchanges widen the
// upper band of U to kl+ku (Golub & Van Loan, "Matrix Computations",
// band Gaussian elimination with partial pivoting, from memory).
//
// Row i holds columns i−kl … i+kl+ku contiguously, so element (i, j) sits
// at a[i·w + j − i + kl] with w = 2kl+ku+1. The multipliers of L stay where
// they were computed and the interchanges are replayed on the right-hand
// side step by step.
type bandLU struct {
	n, kl, ku, w int
	a            []complex128
	piv          []int32
}

func newBand(n, kl, ku int) (*bandLU, bool) {
	w := 2*kl + ku + 1
	if n > 0 && w > maxBandStorage/n {
		return nil, false
	}
	return &bandLU{n: n, kl: kl, ku: ku, w: w, a: make([]complex128, n*w), piv: make([]int32, n)}, true
}

func (b *bandLU) add(i, j int, v complex128) { b.a[i*b.w+j-i+b.kl] += v }

// abs1 is |re|+|im|, the cheap modulus used for pivot choice.
func abs1(v complex128) float64 { return math.Abs(real(v)) + math.Abs(imag(v)) }

// factor overwrites the band with L and U. It returns the first column k
// whose pivot is zero or smaller than rtol times the largest entry of that
// column in the original matrix (colmax), or −1 when the matrix is
// numerically regular. A pivot found too small is replaced by that bound
// and the elimination goes on, so that a solve with the factors can still
// expose the null direction of a singular matrix (one step of inverse
// iteration).
func (b *bandLU) factor(colmax []float64, rtol float64) int {
	n, kl, w := b.n, b.kl, b.w
	off := kl // a[i][j] = a[i*w + off + j - i]
	first := -1
	for k := 0; k < n; k++ {
		last := min(n-1, k+kl)
		jmax := min(n-1, k+kl+b.ku)
		p, best := k, abs1(b.a[k*w+off])
		for i := k + 1; i <= last; i++ {
			if m := abs1(b.a[i*w+off+k-i]); m > best {
				p, best = i, m
			}
		}
		b.piv[k] = int32(p)
		rk := b.a[k*w+off-k : k*w+off-k+jmax+1] // row k indexed by column
		if p != k {
			rp := b.a[p*w+off-p : p*w+off-p+jmax+1]
			for j := k; j <= jmax; j++ {
				rk[j], rp[j] = rp[j], rk[j]
			}
		}
		if !(best > rtol*colmax[k]) || math.IsInf(best, 0) {
			if first < 0 {
				first = k
			}
			t := rtol * colmax[k]
			if !(t > 0) || math.IsInf(t, 0) {
				t = 1
			}
			rk[k] = complex(t, 0)
		}
		d := rk[k]
		for i := k + 1; i <= last; i++ {
			ri := b.a[i*w+off-i : i*w+off-i+jmax+1]
			if ri[k] == 0 {
				continue
			}
			l := ri[k] / d
			ri[k] = l
			for j := k + 1; j <= jmax; j++ {
				ri[j] -= l * rk[j]
			}
		}
	}
	return first
}

// solve overwrites x (the right-hand side) with the solution.
func (b *bandLU) solve(x []complex128) {
	n, kl, w := b.n, b.kl, b.w
	off := kl
	for k := 0; k < n; k++ {
		if p := int(b.piv[k]); p != k {
			x[k], x[p] = x[p], x[k]
		}
		xk := x[k]
		if xk == 0 {
			continue
		}
		for i := k + 1; i <= min(n-1, k+kl); i++ {
			x[i] -= b.a[i*w+off+k-i] * xk
		}
	}
	for i := n - 1; i >= 0; i-- {
		ri := b.a[i*w+off-i:]
		s := x[i]
		for j := i + 1; j <= min(n-1, i+kl+b.ku); j++ {
			s -= ri[j] * x[j]
		}
		x[i] = s / ri[i]
	}
}
