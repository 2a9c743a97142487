package nodal

import (
	"fmt"
	"math"
)

// Bounds on one solution, checked against the estimates of the symbolic
// analysis before any arithmetic: about 1 GiB for the matrix, the factors
// and their work space, and 10¹¹ complex multiply-adds for one
// factorisation (minutes of work on one core).
const (
	maxBytes        = 1 << 30
	maxMultiplyAdds = 1e11
)

// Work describes the cost of solving a network, estimated by the symbolic
// analysis from the pattern of the equations and the fill-reducing
// ordering, before any arithmetic.
type Work struct {
	// Unknowns is the number of equations; Nonzeros the number of
	// entries in their matrix.
	Unknowns, Nonzeros int
	// Factor is the estimated number of entries in L and U together.
	Factor int
	// MultiplyAdds is the estimated number of complex multiply-adds in
	// one numeric factorisation.
	MultiplyAdds float64
	// Bytes is the estimated memory for the matrix, its factors and the
	// work space of one solution.
	Bytes int64
}

// String states the estimates for a message, in plain numbers with SI
// prefixes.
func (w Work) String() string {
	return fmt.Sprintf("%s unknowns, about %s entries in the LU factors, %s complex multiply-adds and %s of memory",
		count(float64(w.Unknowns)), count(float64(w.Factor)), count(w.MultiplyAdds), byteSize(float64(w.Bytes)))
}

// check refuses work beyond the given bounds, stating the estimates.
func (w Work) check(maxB int64, maxF float64) error {
	if w.Bytes <= maxB && w.MultiplyAdds <= maxF {
		return nil
	}
	return &NetError{Msg: fmt.Sprintf("the network is too large for the nodal solution: %s; at most %s of memory and %s multiply-adds are allowed",
		w, byteSize(float64(maxB)), count(maxF))}
}

// byteSize writes a size in bytes with an SI prefix: 560 B, 12.3 MB.
func byteSize(x float64) string {
	if x < 1000 {
		return fmt.Sprintf("%.0f B", x)
	}
	return count(x) + "B"
}

// count writes a non-negative number with three significant figures and
// an SI prefix: 950, 12.3 k, 4.50 M.
func count(x float64) string {
	if x < 1000 {
		return fmt.Sprintf("%.0f", x)
	}
	prefixes := []string{"k", "M", "G", "T", "P", "E"}
	e := 0
	for x >= 999.5 && e < len(prefixes) {
		x /= 1000
		e++
	}
	switch {
	case x >= 99.95:
		return fmt.Sprintf("%.0f %s", x, prefixes[e-1])
	case x >= 9.995:
		return fmt.Sprintf("%.1f %s", x, prefixes[e-1])
	}
	return fmt.Sprintf("%.2f %s", x, prefixes[e-1])
}

// symbolic estimates the work of factorising a matrix whose pattern is
// structurally symmetric, given by columns in b (in the chosen order), as
// if every pivot were taken on the diagonal: then L has the pattern of the
// Cholesky factor of the pattern and U its transpose. The elimination tree
// comes from J. W. H. Liu's algorithm with path compression, and the
// column counts from the row subtrees of that tree ("The role of
// elimination trees in sparse factorization", SIAM J. Matrix Anal. Appl.
// 11(1), 1990): row i of L holds exactly the nodes on the tree paths from
// each j < i with b(j, i) ≠ 0 up to i. The cost is proportional to the
// entries of L. Pivots taken off the diagonal (voltage-source rows, whose
// diagonal is zero) can change the fill a little either way, so the
// figures are estimates; the factorisation itself stops if it outgrows
// them by far.
func symbolic(b *csc) Work {
	n := b.n
	w := Work{Unknowns: n, Nonzeros: len(b.i)}
	parent := make([]int32, n)
	anc := make([]int32, n)
	for k := 0; k < n; k++ {
		parent[k], anc[k] = -1, -1
		for q := b.p[k]; q < b.p[k+1]; q++ {
			i := b.i[q]
			for i >= 0 && int(i) < k {
				up := anc[i]
				anc[i] = int32(k)
				if up < 0 {
					parent[i] = int32(k)
					break
				}
				i = up
			}
		}
	}
	cc := make([]int64, n)
	mark := make([]int32, n)
	for i := range mark {
		mark[i] = -1
	}
	for k := 0; k < n; k++ {
		mark[k] = int32(k)
		cc[k]++ // the diagonal
		for q := b.p[k]; q < b.p[k+1]; q++ {
			for j := b.i[q]; j >= 0 && int(j) < k && mark[j] != int32(k); j = parent[j] {
				mark[j] = int32(k)
				cc[j]++
			}
		}
	}
	var nnzL int64
	for _, c := range cc {
		nnzL += c
		off := float64(c - 1)
		w.MultiplyAdds += off + off*off
	}
	w.Factor = int(min(2*nnzL-int64(n), math.MaxInt32))
	// Matrix and factors: a complex value and an int32 index per entry;
	// about 150 bytes per unknown of vectors and work space besides.
	w.Bytes = 20*int64(len(b.i)) + 20*(2*nnzL-int64(n)) + 150*int64(n)
	return w
}
