package nodal

import (
	"cmp"
	"math"
	"slices"
)

// amdOrder returns a fill-reducing ordering of the symmetric pattern given
// by adjacency lists in compressed form (the neighbours of i are
// adj[start[i]:start[i+1]], without i itself): order[new] = old.
//
// The method is approximate minimum degree (P. R. Amestoy, T. A. Davis and
// I. S. Duff, "An approximate minimum degree ordering algorithm", SIAM J.
// Matrix Anal. Appl. 17(4), 1996): elimination on the quotient graph of
// variables and elements, where each step eliminates a variable of least
// approximate external degree, forms the new element L_p from its
// neighbours, absorbs the elements it covers, and bounds the degree of each
// variable of L_p by
//
//	d_i ≤ min(n − k, d_i' + |L_p \ i|, |A_i \ i| + |L_p \ i| + Σ_{e ∈ E_i \ p} |L_e \ L_p|)
//
// with |L_e \ L_p| found for all e in one pass over L_p. Elements with
// L_e ⊆ L_p are absorbed on the way (aggressive absorption), variables left
// with p as their only neighbour are eliminated with it (mass elimination),
// and variables with the same neighbours are merged into one supervariable
// (indistinguishable nodes, found by a hash of their lists, as in the same
// paper). Variables of very high degree, more than max(16, 10·√n), are held
// back and ordered last, as the authors' later description of the method
// advises (Amestoy, Davis and Duff, "Algorithm 837: AMD", ACM Trans. Math.
// Software 30(3), 2004): a hub joined to every other node would otherwise
// cost quadratic time and gains nothing from being ordered earlier.
func amdOrder(n int, start, adj []int32) []int32 {
	order := make([]int32, 0, n)
	if n == 0 {
		return order
	}
	const (
		variable = iota
		element  // eliminated, still live as an element
		absorbed // an element absorbed into another, or a variable merged or eliminated
		dense    // held back to the end
	)
	status := make([]uint8, n)
	nv := make([]int32, n) // supervariable size; 0 once merged into another
	deg := make([]int32, n)
	adjV := make([][]int32, n)  // A_i: variables adjacent to i
	adjE := make([][]int32, n)  // E_i: elements adjacent to i
	elems := make([][]int32, n) // L_e for an element e
	esize := make([]int32, n)   // |L_e|, counted with supervariable sizes
	member := make([]int32, n)  // next variable merged into the same supervariable, −1 at the end
	for i := range member {
		member[i] = -1
		nv[i] = 1
	}

	limit := int32(max(16, int(10*math.Sqrt(float64(n)))))
	for i := 0; i < n; i++ {
		if start[i+1]-start[i] > limit {
			status[i] = dense
		}
	}
	// The lists live in two arenas, so that the ordering allocates a
	// few large blocks rather than a few per variable. A_i only shrinks.
	// E_i grows by one, p, only when i joins L_p, and then A_i loses p
	// or E_i loses the elements p absorbs: |A_i| + |E_i| never exceeds
	// i's first degree, which is therefore room enough for E_i. Elements'
	// lists L_e are carved from chunks of a third arena.
	seen := make([]int32, n) // tag: member of the list being built or compared
	arenaV := make([]int32, len(adj))
	arenaE := make([]int32, len(adj))
	used := 0
	remaining := int32(0)
	for i := 0; i < n; i++ {
		if status[i] == dense {
			continue
		}
		remaining++
		a := arenaV[used:used]
		for _, j := range adj[start[i]:start[i+1]] {
			// repeats (parallel elements) are dropped by the stamp
			if int(j) != i && status[j] != dense && seen[j] != int32(i)+1 {
				seen[j] = int32(i) + 1
				a = append(a, j)
			}
		}
		end := used + len(a)
		adjV[i] = arenaV[used:end:end]
		adjE[i] = arenaE[used:used:end]
		used = end
		deg[i] = int32(len(a))
	}
	var chunk []int32
	newList := func(from []int32) []int32 {
		k := len(from)
		if cap(chunk)-len(chunk) < k {
			chunk = make([]int32, 0, max(k, 2*cap(chunk), 1024))
		}
		l := len(chunk)
		chunk = append(chunk, from...)
		return chunk[l : l+k : l+k]
	}

	// Degree lists: doubly linked, head[d] is the first variable of
	// approximate degree d.
	head := make([]int32, n+1)
	next := make([]int32, n)
	prev := make([]int32, n)
	for d := range head {
		head[d] = -1
	}
	insert := func(i int32) {
		d := deg[i]
		next[i], prev[i] = head[d], -1
		if head[d] >= 0 {
			prev[head[d]] = i
		}
		head[d] = i
	}
	remove := func(i int32) {
		if prev[i] >= 0 {
			next[prev[i]] = next[i]
		} else {
			head[deg[i]] = next[i]
		}
		if next[i] >= 0 {
			prev[next[i]] = prev[i]
		}
	}
	for i := n - 1; i >= 0; i-- {
		if status[i] == variable {
			insert(int32(i))
		}
	}

	mark := make([]int32, n) // stamp: i belongs to the L_p being formed
	wmark := make([]int32, n)
	w := make([]int32, n) // |L_e \ L_p| while wmark[e] is the current stamp
	hash := make([]uint32, n)
	stamp := int32(0)
	mindeg := int32(0)
	var lp, ext, byHash []int32
	tag := int32(n) + 1 // above the tags used while building the lists

	emit := func(p int32) {
		for v := p; v >= 0; v = member[v] {
			order = append(order, v)
		}
	}

	for remaining > 0 {
		for mindeg <= int32(n) && head[mindeg] < 0 {
			mindeg++
		}
		p := head[mindeg]
		remove(p)
		stamp++

		// Form L_p from A_p and the elements of E_p, which it absorbs.
		lp = lp[:0]
		mark[p] = stamp
		size := int32(0)
		for _, e := range adjE[p] {
			if status[e] != element {
				continue
			}
			for _, i := range elems[e] {
				if nv[i] > 0 && status[i] == variable && mark[i] != stamp {
					mark[i] = stamp
					lp = append(lp, i)
					size += nv[i]
				}
			}
			status[e] = absorbed
			elems[e] = nil
		}
		for _, i := range adjV[p] {
			if nv[i] > 0 && status[i] == variable && mark[i] != stamp {
				mark[i] = stamp
				lp = append(lp, i)
				size += nv[i]
			}
		}
		status[p] = element
		adjV[p], adjE[p] = nil, nil
		remaining -= nv[p]
		emit(p)

		// |L_e \ L_p| for every element next to L_p.
		for _, i := range lp {
			remove(i)
			for _, e := range adjE[i] {
				if status[e] != element || e == p {
					continue
				}
				if wmark[e] != stamp {
					wmark[e] = stamp
					w[e] = esize[e]
				}
				w[e] -= nv[i]
			}
		}

		// Prune the lists of each variable of L_p and sum its external
		// degree outside L_p; deg holds the sum for now, d' stays in ext.
		ext = ext[:0]
		for _, i := range lp {
			es := adjE[i][:0]
			sum := int32(0)
			h := uint32(p)
			for _, e := range adjE[i] {
				if status[e] != element || e == p {
					continue
				}
				if wmark[e] == stamp && w[e] <= 0 {
					// L_e ⊆ L_p: absorbed into p.
					status[e] = absorbed
					elems[e] = nil
					continue
				}
				sum += w[e]
				es = append(es, e)
				h += uint32(e)
			}
			es = append(es, p)
			adjE[i] = es
			as := adjV[i][:0]
			for _, j := range adjV[i] {
				if nv[j] > 0 && status[j] == variable && mark[j] != stamp {
					as = append(as, j)
					sum += nv[j]
					h += uint32(j)
				}
			}
			adjV[i] = as
			hash[i] = h
			ext = append(ext, sum)
		}

		// Mass elimination: a variable whose only neighbour is p goes
		// with p.
		live := lp[:0]
		extLive := ext[:0]
		for k, i := range lp {
			if len(adjV[i]) == 0 && len(adjE[i]) == 1 {
				size -= nv[i]
				remaining -= nv[i]
				status[i] = absorbed
				adjE[i] = nil
				emit(i)
				continue
			}
			live = append(live, i)
			extLive = append(extLive, ext[k])
		}
		lp, ext = live, extLive

		// Supervariables: variables of L_p with the same lists are merged.
		// Sorting by hash brings candidates together.
		byHash = append(byHash[:0], lp...)
		slices.SortFunc(byHash, func(a, b int32) int { return cmp.Compare(hash[a], hash[b]) })
		for a := 0; a < len(byHash); a++ {
			i := byHash[a]
			if nv[i] == 0 {
				continue
			}
			for b := a + 1; b < len(byHash) && hash[byHash[b]] == hash[i]; b++ {
				j := byHash[b]
				if nv[j] == 0 || len(adjV[j]) != len(adjV[i]) || len(adjE[j]) != len(adjE[i]) {
					continue
				}
				tag++
				if !sameSet(adjV[i], adjV[j], seen, tag) || !sameSet(adjE[i], adjE[j], seen, tag) {
					continue
				}
				// j joins i: i's external degree loses j.
				nv[i] += nv[j]
				nv[j] = 0
				status[j] = absorbed
				adjV[j], adjE[j] = nil, nil
				last := i
				for member[last] >= 0 {
					last = member[last]
				}
				member[last] = j
			}
		}

		// Approximate degrees.
		esize[p] = size
		elems[p] = newList(lp)
		for k, i := range lp {
			if nv[i] == 0 {
				continue
			}
			outside := size - nv[i]
			d := min(deg[i]+outside, ext[k]+outside, remaining-nv[i])
			if d < 0 {
				d = 0
			}
			deg[i] = d
			insert(i)
			mindeg = min(mindeg, d)
		}
	}
	for i := 0; i < n; i++ {
		if status[i] == dense {
			order = append(order, int32(i))
		}
	}
	return order
}

// sameSet reports whether lists a and b, of equal length and without
// repeats, hold the same members, marking a's members in seen with tag.
func sameSet(a, b []int32, seen []int32, tag int32) bool {
	for _, x := range a {
		seen[x] = tag
	}
	for _, x := range b {
		if seen[x] != tag {
			return false
		}
	}
	return true
}
