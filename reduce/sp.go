package reduce

import (
	"errors"
	"fmt"
	"math/cmplx"
	"sort"
	"strconv"
	"strings"

	"argand/calc"
)

// SPKind says whether a node of a series-parallel tree is an element, a
// series group or a parallel group.
type SPKind uint8

const (
	SPLeaf SPKind = iota
	SPSeries
	SPParallel
)

// SPNode is a node of a series-parallel tree. A leaf names one passive
// element; a group holds its parts in order.
//
// Each node has two ends, top and bottom; the tree's root is connected with
// its top to the source's To terminal. The parts of a series group run from
// the group's top to its bottom in order; the parts of a parallel group all
// join the group's top to its bottom. A leaf's element runs From the top To
// the bottom, so its voltage and current take the group's directions.
// Reversed turns a part upside down within its group: a reversed leaf is
// oriented From the bottom To the top. Trees built with Leaf, SeriesOf and
// ParallelOf are never reversed; SeriesParallel sets Reversed to keep each
// element's own orientation from the network.
type SPNode struct {
	Kind     SPKind
	Name     string    // element name, for a leaf
	Parts    []*SPNode // the parts of a group, in order
	Reversed bool
}

// Leaf returns a tree of one element.
func Leaf(name string) *SPNode { return &SPNode{Kind: SPLeaf, Name: name} }

// SeriesOf returns the series group of the given parts, in order.
func SeriesOf(parts ...*SPNode) *SPNode { return &SPNode{Kind: SPSeries, Parts: parts} }

// ParallelOf returns the parallel group of the given parts.
func ParallelOf(parts ...*SPNode) *SPNode { return &SPNode{Kind: SPParallel, Parts: parts} }

// Limits on series-parallel trees. Reduction and working back recurse once
// per level, so the depth is bounded; the node count bounds the work.
const (
	MaxSPDepth = 50000
	MaxSPNodes = 1000000
)

// Validate reports whether the tree can be reduced: no nil parts, every
// leaf named, every group with at least one part, no element twice, depth
// at most MaxSPDepth and at most MaxSPNodes nodes. It does not recurse, so
// it is safe on any input, even one with cycles.
func (n *SPNode) Validate() error {
	if n == nil {
		return errors.New("series-parallel tree: empty")
	}
	type item struct {
		n     *SPNode
		depth int
	}
	seen := make(map[string]bool)
	stack := []item{{n, 1}}
	count := 0
	for len(stack) > 0 {
		it := stack[len(stack)-1]
		stack = stack[:len(stack)-1]
		count++
		if count > MaxSPNodes {
			return fmt.Errorf("series-parallel tree: more than %d parts", MaxSPNodes)
		}
		if it.depth > MaxSPDepth {
			return fmt.Errorf("series-parallel tree: nested more than %d levels deep", MaxSPDepth)
		}
		switch it.n.Kind {
		case SPLeaf:
			if it.n.Name == "" {
				return errors.New("series-parallel tree: an element has no name")
			}
			if seen[it.n.Name] {
				return fmt.Errorf("series-parallel tree: element %s appears more than once", it.n.Name)
			}
			seen[it.n.Name] = true
		case SPSeries, SPParallel:
			if len(it.n.Parts) == 0 {
				return errors.New("series-parallel tree: a group has no parts")
			}
			for i := len(it.n.Parts) - 1; i >= 0; i-- {
				p := it.n.Parts[i]
				if p == nil {
					return errors.New("series-parallel tree: a group has an empty part")
				}
				stack = append(stack, item{p, it.depth + 1})
			}
		default:
			return errors.New("series-parallel tree: a node of unknown kind")
		}
	}
	return nil
}

// Elements returns the element names of the tree's leaves, left to right.
// The tree should have passed Validate.
func (n *SPNode) Elements() []string {
	var out []string
	stack := []*SPNode{n}
	for len(stack) > 0 && len(out) <= MaxSPNodes {
		x := stack[len(stack)-1]
		stack = stack[:len(stack)-1]
		if x == nil {
			continue
		}
		if x.Kind == SPLeaf {
			out = append(out, x.Name)
			continue
		}
		for i := len(x.Parts) - 1; i >= 0; i-- {
			stack = append(stack, x.Parts[i])
		}
	}
	return out
}

// maxStringLen bounds String's output, so that a huge or cyclic tree
// cannot exhaust memory.
const maxStringLen = 1 << 16

// String writes the tree in the compact nested form, such as
// "R1 + (L1 || (C1 + R2))": + joins parts in series, || in parallel, and
// a group inside another is in parentheses.
func (n *SPNode) String() string {
	var b strings.Builder
	n.write(&b, 0, false)
	if b.Len() > maxStringLen {
		return b.String()[:maxStringLen] + "…"
	}
	return b.String()
}

func (n *SPNode) write(b *strings.Builder, depth int, nested bool) {
	if b.Len() > maxStringLen {
		return
	}
	if depth > MaxSPDepth {
		b.WriteString("…")
		return
	}
	if n == nil {
		b.WriteString("?")
		return
	}
	if n.Kind == SPLeaf {
		b.WriteString(n.Name)
		return
	}
	if len(n.Parts) == 1 {
		n.Parts[0].write(b, depth+1, nested)
		return
	}
	sep := " + "
	if n.Kind == SPParallel {
		sep = " || "
	}
	if nested {
		b.WriteByte('(')
	}
	for i, p := range n.Parts {
		if i > 0 {
			b.WriteString(sep)
		}
		p.write(b, depth+1, true)
	}
	if nested {
		b.WriteByte(')')
	}
}

// SPCircuit is a network with one source whose passive part reduces to a
// series-parallel tree between the source's terminals.
type SPCircuit struct {
	Tree   *SPNode
	Source Element               // the one independent source; the tree's top is at Source.To
	Idle   []string              // elements that carry no current: hanging by one node, or with both ends on one node
	Z      map[string]complex128 // impedance of every passive element, by name
}

// Triangle is three parts of a network that form a Δ between three nodes;
// a Δ–Y conversion of them can make a bridge series-parallel.
type Triangle struct {
	Nodes [3]string
	Parts [3]string // each an element name, or a reduced group in the compact form
}

// NotSeriesParallelError reports a network whose passive part does not
// reduce to one impedance by series and parallel steps, as a bridge does.
type NotSeriesParallelError struct {
	Network   string
	Left      []string   // the elements still unreduced
	Triangles []Triangle // Δs that a Δ–Y conversion could break (at most 10)
}

func (e *NotSeriesParallelError) Error() string {
	var b strings.Builder
	b.WriteString("network ")
	if e.Network != "" {
		b.WriteString(e.Network + " ")
	}
	b.WriteString("is not series-parallel (a bridge): ")
	b.WriteString(strings.Join(e.Left, ", "))
	b.WriteString(" do not reduce by series and parallel steps")
	if len(e.Triangles) > 0 {
		b.WriteString("; a Δ–Y conversion of ")
		for i, t := range e.Triangles {
			if i > 0 {
				b.WriteString(" or of ")
			}
			fmt.Fprintf(&b, "the triangle %s, %s, %s (nodes %s, %s, %s)", t.Parts[0], t.Parts[1], t.Parts[2], t.Nodes[0], t.Nodes[1], t.Nodes[2])
		}
		b.WriteString(" would break it")
	}
	b.WriteString("; or use the nodal solution")
	return b.String()
}

type spEdge struct {
	u, v  int     // the tree's top is at node u, its bottom at v
	t     *SPNode // the part between them
	alive bool
	// pu and pv order the edge among the others at u and at v: the
	// order in which it joined each node's adjacency list.
	pu, pv int
}

// orient returns e's tree turned so that its top is at node top.
func (e *spEdge) orient(top int) *SPNode {
	if e.u != top {
		e.t.Reversed = !e.t.Reversed
		e.u, e.v = e.v, e.u
		e.pu, e.pv = e.pv, e.pu
	}
	return e.t
}

// at returns the order of e among the edges at node n.
func (e *spEdge) at(n int) int {
	if e.u == n {
		return e.pu
	}
	return e.pv
}

// join returns the group of kind k of a and b (each already oriented
// within the group), taking in the parts of a or b when they are groups of
// the same kind, so that a chain of series merges reads as one string.
func join(k SPKind, a, b *SPNode) *SPNode {
	g := &SPNode{Kind: k}
	for _, x := range []*SPNode{a, b} {
		if x.Kind != k {
			g.Parts = append(g.Parts, x)
			continue
		}
		if !x.Reversed {
			g.Parts = append(g.Parts, x.Parts...)
			continue
		}
		// turned over: each part turns over, and a string runs backwards
		for i := range x.Parts {
			p := x.Parts[i]
			if k == SPSeries {
				p = x.Parts[len(x.Parts)-1-i]
			}
			p.Reversed = !p.Reversed
			g.Parts = append(g.Parts, p)
		}
	}
	return g
}

// SeriesParallel turns a network with exactly one independent source into
// a series-parallel tree of its passive part, seen from the source's
// terminals. Passive elements must carry their impedance Z at the working
// frequency (see Network.At).
//
// The algorithm merges repeatedly, visiting nodes from a work queue in the
// order they first appear in the element list: two parts between the same
// pair of nodes merge in parallel; a node other than the source's that
// joins exactly two parts merges them in series; a part hanging from a
// node of no other connection, or joining a node to itself, carries no
// current and is set aside as idle. When the passive part does not reduce
// to one part between the source's nodes, the error is a
// *NotSeriesParallelError listing the Δs a Δ–Y conversion could break.
func SeriesParallel(net *Network) (SPCircuit, error) {
	if net == nil || len(net.Elements) == 0 {
		return SPCircuit{}, errors.New("series-parallel: the network has no elements")
	}
	if len(net.Elements) > MaxSPNodes {
		return SPCircuit{}, fmt.Errorf("series-parallel: more than %d elements", MaxSPNodes)
	}
	var sources []Element
	idx := make(map[string]int)
	var nodeNames []string
	node := func(s string) int {
		if i, ok := idx[s]; ok {
			return i
		}
		idx[s] = len(nodeNames)
		nodeNames = append(nodeNames, s)
		return len(nodeNames) - 1
	}
	zs := make(map[string]complex128)
	names := make(map[string]bool)
	var edges []*spEdge
	for _, e := range net.Elements {
		if e.Name == "" {
			return SPCircuit{}, elemErr(e, "an element has no name")
		}
		if names[e.Name] {
			return SPCircuit{}, elemErr(e, "element "+e.Name+" is defined twice")
		}
		names[e.Name] = true
		if e.From == "" || e.To == "" {
			return SPCircuit{}, elemErr(e, "element "+e.Name+" needs two nodes")
		}
		if e.Kind.IsSource() {
			sources = append(sources, e)
			continue
		}
		if e.Kind > CurrentSource {
			return SPCircuit{}, elemErr(e, "element "+e.Name+" is of an unknown kind")
		}
		if cmplx.IsNaN(e.Z) || cmplx.IsInf(e.Z) {
			return SPCircuit{}, elemErr(e, "element "+e.Name+" has no finite impedance")
		}
		zs[e.Name] = e.Z
		u, v := node(e.From), node(e.To)
		edges = append(edges, &spEdge{u: u, v: v, t: Leaf(e.Name), alive: true})
	}
	if len(sources) != 1 {
		list := make([]string, len(sources))
		for i, s := range sources {
			list[i] = s.Name
		}
		msg := "none"
		if len(list) > 0 {
			msg = strconv.Itoa(len(list)) + " (" + strings.Join(list, ", ") + ")"
		}
		return SPCircuit{}, fmt.Errorf("series-parallel stepping needs exactly one independent source, and this network has %s; use the nodal solution", msg)
	}
	src := sources[0]
	if src.From == src.To {
		return SPCircuit{}, elemErr(src, "source "+src.Name+" has both ends on node "+src.From)
	}
	if cmplx.IsNaN(src.Value) || cmplx.IsInf(src.Value) {
		return SPCircuit{}, elemErr(src, "source "+src.Name+" has no finite value")
	}
	top, bottom := node(src.To), node(src.From)
	adj := make([][]int, len(nodeNames))
	seq := 0 // order of joining an adjacency list, over all nodes
	for i, e := range edges {
		adj[e.u] = append(adj[e.u], i)
		e.pu, e.pv = seq, seq
		seq++
		if e.v != e.u {
			adj[e.v] = append(adj[e.v], i)
			e.pv = seq
			seq++
		}
	}
	// A visit of a node merges its parallel parts, sets its self-loops
	// aside and, when it joins only one or two other nodes, merges in
	// series. A node joining many parts (the reference of a ladder) is
	// visited again after every merge beside it, so a visit must not
	// read all its parts: live counts the live parts at a node that join
	// it to another node, pairs lists the live parts between two nodes,
	// dirty the node pairs at a node that may hold parallel parts, and
	// loops the self-loops at a node.
	live := make([]int, len(nodeNames))
	loops := make([][]int, len(nodeNames))
	dirty := make([][]uint64, len(nodeNames))
	pairs := make(map[uint64][]int, len(edges))
	key := func(u, v int) uint64 {
		if u > v {
			u, v = v, u
		}
		return uint64(u)<<32 | uint64(v)
	}
	attach := func(ei int) {
		e := edges[ei]
		if e.u == e.v {
			loops[e.u] = append(loops[e.u], ei)
			return
		}
		live[e.u]++
		live[e.v]++
		k := key(e.u, e.v)
		pairs[k] = append(pairs[k], ei)
		if len(pairs[k]) == 2 {
			dirty[e.u] = append(dirty[e.u], k)
			dirty[e.v] = append(dirty[e.v], k)
		}
	}
	detach := func(ei int) {
		e := edges[ei]
		if e.u == e.v {
			return // a self-loop leaves its list when it is set aside
		}
		live[e.u]--
		live[e.v]--
		k := key(e.u, e.v)
		list := pairs[k]
		for i, x := range list {
			if x == ei {
				list = append(list[:i], list[i+1:]...)
				break
			}
		}
		if len(list) == 0 {
			delete(pairs, k)
		} else {
			pairs[k] = list
		}
	}
	for i := range edges {
		attach(i)
	}
	var idle []string
	setAside := func(ei int) {
		e := edges[ei]
		detach(ei)
		e.alive = false
		idle = append(idle, e.t.Elements()...)
	}
	queue := make([]int, 0, len(nodeNames))
	queued := make([]bool, len(nodeNames))
	push := func(n int) {
		if !queued[n] {
			queued[n] = true
			queue = append(queue, n)
		}
	}
	for n := range nodeNames {
		push(n)
	}
	var later []int // parts at a node that merge into an earlier parallel one
	for len(queue) > 0 {
		n := queue[0]
		queue = queue[1:]
		queued[n] = false
		// self-loops carry no current: set them aside in the order of
		// the node's list
		if len(loops[n]) > 0 {
			ls := loops[n]
			loops[n] = nil
			sort.Slice(ls, func(i, j int) bool { return edges[ls[i]].pu < edges[ls[j]].pu })
			for _, ei := range ls {
				if edges[ei].alive {
					setAside(ei)
				}
			}
		}
		// parallel parts: the first at this node takes in the others, in
		// the order of the node's list
		later = later[:0]
		for _, k := range dirty[n] {
			list := pairs[k]
			if len(list) < 2 {
				continue
			}
			sort.Slice(list, func(i, j int) bool { return edges[list[i]].at(n) < edges[list[j]].at(n) })
			later = append(later, list[1:]...)
		}
		dirty[n] = dirty[n][:0]
		if len(later) > 0 {
			sort.SliceStable(later, func(i, j int) bool { return edges[later[i]].at(n) < edges[later[j]].at(n) })
			for _, ei := range later {
				e := edges[ei]
				if !e.alive {
					continue // listed twice
				}
				other := e.u + e.v - n
				list := pairs[key(n, other)]
				f := edges[list[0]]
				detach(ei)
				f.t = join(SPParallel, f.t, e.orient(f.u))
				e.alive = false
				push(other)
			}
		}
		if n == top || n == bottom || live[n] > 2 {
			continue
		}
		kept := adj[n][:0]
		for _, ei := range adj[n] {
			if edges[ei].alive {
				kept = append(kept, ei)
			}
		}
		adj[n] = kept
		switch len(kept) {
		case 1:
			e := edges[kept[0]]
			setAside(kept[0])
			adj[n] = adj[n][:0]
			push(e.u + e.v - n)
		case 2:
			e1, e2 := edges[kept[0]], edges[kept[1]]
			a, b := e1.u+e1.v-n, e2.u+e2.v-n
			detach(kept[0])
			detach(kept[1])
			t1 := e1.orient(a)
			t2 := e2.orient(n)
			e1.t = join(SPSeries, t1, t2)
			e1.u, e1.v = a, b
			e2.alive = false
			adj[n] = adj[n][:0]
			if a != b {
				adj[b] = append(adj[b], kept[0])
				e1.pv = seq
				seq++
			} else {
				e1.pv = e1.pu
			}
			attach(kept[0])
			push(a)
			push(b)
		}
	}
	var left []*spEdge
	for _, e := range edges {
		if e.alive {
			left = append(left, e)
		}
	}
	c := SPCircuit{Source: src, Idle: idle, Z: zs}
	switch {
	case len(left) == 1 && (left[0].u == top && left[0].v == bottom || left[0].u == bottom && left[0].v == top):
		c.Tree = left[0].orient(top)
		return c, nil
	case len(left) == 0:
		return SPCircuit{}, fmt.Errorf("series-parallel: the source %s sees an open circuit: no passive path joins nodes %s and %s", src.Name, src.From, src.To)
	}
	return SPCircuit{}, notSP(net.Name, left, nodeNames, net.Elements)
}

func elemErr(e Element, msg string) error {
	if e.Line > 0 {
		return fmt.Errorf("line %d: %s", e.Line, msg)
	}
	return errors.New(msg)
}

// notSP builds the error for a network that stopped reducing, finding the
// triangles among the parts left.
func notSP(name string, left []*spEdge, nodeNames []string, elems []Element) error {
	err := &NotSeriesParallelError{Network: name}
	inLeft := make(map[string]bool)
	type pair struct{ a, b int }
	between := make(map[pair]*spEdge)
	nbrs := make(map[int][]int)
	for _, e := range left {
		for _, el := range e.t.Elements() {
			inLeft[el] = true
		}
		a, b := e.u, e.v
		if a > b {
			a, b = b, a
		}
		if _, ok := between[pair{a, b}]; !ok {
			between[pair{a, b}] = e
			nbrs[a] = append(nbrs[a], b)
			nbrs[b] = append(nbrs[b], a)
		}
	}
	for _, e := range elems {
		if inLeft[e.Name] {
			err.Left = append(err.Left, e.Name)
		}
	}
	label := func(t *SPNode) string {
		if t.Kind == SPLeaf {
			return t.Name
		}
		return "(" + t.String() + ")"
	}
	seen := make(map[[3]int]bool)
	for _, e := range left {
		a, b := e.u, e.v
		for _, c := range nbrs[a] {
			if c == b {
				continue
			}
			x, y := b, c
			if x > y {
				x, y = y, x
			}
			ebc, ok := between[pair{x, y}]
			if !ok {
				continue
			}
			tri := [3]int{a, b, c}
			sort.Ints(tri[:])
			if seen[tri] {
				continue
			}
			seen[tri] = true
			p, q := a, c
			if p > q {
				p, q = q, p
			}
			eca := between[pair{p, q}]
			err.Triangles = append(err.Triangles, Triangle{
				Nodes: [3]string{nodeNames[a], nodeNames[b], nodeNames[c]},
				Parts: [3]string{label(e.t), label(ebc.t), label(eca.t)},
			})
			if len(err.Triangles) == 10 {
				return err
			}
		}
	}
	return err
}

// Merge records one reduction step: which parts were combined into which
// equivalent, so that a display can highlight them.
type Merge struct {
	Step     int      // index of the step in Reduction.Steps
	Name     string   // the equivalent's name, such as "Zeq3"
	Parts    []string // the parts combined: element names or earlier equivalents
	Elements []string // every element inside the equivalent, left to right
}

// ElementResult is one element of a solved network: its impedance (zero
// for a source), voltage and current by the passive sign convention (the
// voltage V(From) − V(To), the current from From to To through it) and the
// complex power it takes in, S = V·I* for RMS phasors or ½·V·I* for peak.
// A source's S is negative when it delivers power.
type ElementResult struct {
	Name       string
	Z, V, I, S calc.Quantity
}

// Reduction is a series-parallel network reduced and solved step by step.
type Reduction struct {
	Basis    calc.Basis
	Z        calc.Quantity   // the equivalent impedance the source feeds
	Steps    []calc.Step     // reductions, the source, the work back, powers, balance, table
	Merges   []Merge         // one per reduction step, in order
	Elements []ElementResult // passive elements, left to right in the tree, then idle ones
	Source   ElementResult   // the source, by the passive sign convention
	// Subjects holds, for each step, the element or equivalent whose
	// values it finds ("" for a step over the whole network), so that a
	// view can pick out what a step works on without reading its text.
	Subjects []string
}

// add appends a step about subject.
func (r *spReducer) add(subject string, st calc.Step) {
	r.out.Steps = append(r.out.Steps, st)
	r.out.Subjects = append(r.out.Subjects, subject)
}

type spWork struct {
	name     string
	z        complex128
	parts    []*spWork
	kind     SPKind
	reversed bool
	lo, hi   int // leaves of the subtree: leafNames[lo:hi]
	v, i     complex128
}

type spReducer struct {
	z         map[string]complex128
	basis     calc.Basis
	used      map[string]bool
	leafNames []string
	next      int
	out       *Reduction
	results   map[string]*ElementResult
}

// Reduce reduces a series-parallel tree fed by one source and works back
// to every element's voltage, current and power. z holds each element's
// impedance in Ω; src is a voltage or current source whose To terminal
// meets the tree's top and whose From terminal meets its bottom (so a
// voltage source of value V puts V across the tree, top positive, and a
// current source of value I drives I into the top).
//
// Order: the tree is reduced depth-first, innermost groups first, parts
// left to right (post-order); each group becomes one equivalent named
// Zeq1, Zeq2, ... in that order (skipping names of elements). A group of
// one part is that part and takes no step. The work back runs the other
// way (pre-order): the source gives the whole network's current (or
// voltage), then each group shares it among its parts, a series group by
// its common current and Ohm's law (the voltage divider), a parallel group
// by its common voltage and Ohm's law (the current divider). Then each
// element's complex power, the power balance and a table of every element.
//
// A 0 Ω part in a parallel group shorts the group; parallel branches whose
// admittances cancel are an open circuit, reported as an error wrapping
// calc.ErrOpenCircuit; a voltage source feeding 0 Ω is an error.
func Reduce(tree *SPNode, z map[string]complex128, basis calc.Basis, src Element) (*Reduction, error) {
	return reduceTree(tree, z, basis, src, nil)
}

// ReduceNetwork turns a network with one source into a series-parallel
// tree (see SeriesParallel) and reduces it (see Reduce). Elements that
// carry no current are listed with zero voltage, current and power.
func ReduceNetwork(net *Network, basis calc.Basis) (*Reduction, error) {
	c, err := SeriesParallel(net)
	if err != nil {
		return nil, err
	}
	return reduceTree(c.Tree, c.Z, basis, c.Source, c.Idle)
}

func reduceTree(tree *SPNode, z map[string]complex128, basis calc.Basis, src Element, idle []string) (*Reduction, error) {
	if err := tree.Validate(); err != nil {
		return nil, err
	}
	if !src.Kind.IsSource() {
		return nil, fmt.Errorf("reduce: %s is a %s, not a source", src.Name, src.Kind)
	}
	if src.Name == "" {
		src.Name = "source"
	}
	if cmplx.IsNaN(src.Value) || cmplx.IsInf(src.Value) {
		return nil, fmt.Errorf("reduce: source %s has no finite value", src.Name)
	}
	r := &spReducer{z: z, basis: basis, used: make(map[string]bool), out: &Reduction{Basis: basis},
		results: make(map[string]*ElementResult)}
	for _, name := range tree.Elements() {
		zv, ok := z[name]
		if !ok {
			return nil, fmt.Errorf("reduce: no impedance given for element %s", name)
		}
		if cmplx.IsNaN(zv) || cmplx.IsInf(zv) {
			return nil, fmt.Errorf("reduce: element %s has no finite impedance", name)
		}
		if name == src.Name {
			return nil, fmt.Errorf("reduce: %s is both the source and an element of the tree", name)
		}
		r.used[name] = true
	}
	for _, name := range idle {
		r.used[name] = true
	}
	r.used[src.Name] = true
	// a step per group, per part, per element, plus a few: growing the
	// slice of large step records as they come costs more than the work
	leaves := len(tree.Elements())
	r.out.Steps = make([]calc.Step, 0, 4*leaves+len(idle)*2+4)
	r.out.Subjects = make([]string, 0, cap(r.out.Steps))
	r.out.Elements = make([]ElementResult, 0, leaves+len(idle))
	r.leafNames = make([]string, 0, leaves)
	root, err := r.down(tree, 0)
	if err != nil {
		return nil, err
	}
	r.out.Z = calc.Quantity{V: root.z, Dim: calc.DimImpedance}
	if err := r.feed(root, src); err != nil {
		return nil, err
	}
	if err := r.back(root, root.reversed, 0); err != nil {
		return nil, err
	}
	for _, name := range idle {
		zv := z[name]
		er := ElementResult{Name: name, Z: calc.Quantity{V: zv, Dim: calc.DimImpedance},
			V: calc.Quantity{Dim: calc.DimVoltage}, I: calc.Quantity{Dim: calc.DimCurrent},
			S: calc.Quantity{Dim: calc.DimPower, Kind: calc.KindApparent}}
		r.out.Elements = append(r.out.Elements, er)
		r.add(name, calc.Step{Kind: "idle", Basis: basis,
			Source:  name + " carries no current",
			Rule:    "a part joined to the rest at one node only (or with both ends on one node) carries no current, so Ohm's law gives it no voltage",
			Formula: "I(" + name + ") = 0, V(" + name + ") = 0",
			Results: []calc.Operand{{Name: "V(" + name + ")", Value: er.V}, {Name: "I(" + name + ")", Value: er.I}}})
	}
	if err := r.powers(src, root); err != nil {
		return nil, err
	}
	return r.out, nil
}

func (r *spReducer) newName() string {
	for {
		r.next++
		n := "Zeq" + strconv.Itoa(r.next)
		if !r.used[n] {
			r.used[n] = true
			return n
		}
	}
}

// zq marks a real impedance as a resistance, so that a resistor in a step
// reads as R in Ω, never as a phasor at 0°.
func zq(v complex128) calc.Quantity {
	if imag(v) == 0 {
		return calc.Quantity{V: v, Dim: calc.DimImpedance, Kind: calc.KindResistive}
	}
	return calc.Quantity{V: v, Dim: calc.DimImpedance}
}

// down reduces the subtree n, innermost first, and returns its equivalent.
func (r *spReducer) down(n *SPNode, depth int) (*spWork, error) {
	if depth > MaxSPDepth {
		return nil, fmt.Errorf("series-parallel tree: nested more than %d levels deep", MaxSPDepth)
	}
	if n.Kind == SPLeaf {
		w := &spWork{name: n.Name, z: r.z[n.Name], kind: SPLeaf, reversed: n.Reversed, lo: len(r.leafNames)}
		r.leafNames = append(r.leafNames, n.Name)
		w.hi = len(r.leafNames)
		return w, nil
	}
	w := &spWork{kind: n.Kind, reversed: n.Reversed, lo: len(r.leafNames)}
	for _, p := range n.Parts {
		c, err := r.down(p, depth+1)
		if err != nil {
			return nil, err
		}
		w.parts = append(w.parts, c)
	}
	w.hi = len(r.leafNames)
	if len(w.parts) == 1 {
		w.name, w.z = w.parts[0].name, w.parts[0].z
		return w, nil
	}
	w.name = r.newName()
	ops := make([]calc.Operand, len(w.parts))
	names := make([]string, len(w.parts))
	for i, c := range w.parts {
		ops[i] = calc.Operand{Name: c.name, Value: zq(c.z)}
		names[i] = c.name
	}
	var (
		q     calc.Quantity
		steps []calc.Step
		err   error
		sep   = " + "
	)
	if n.Kind == SPSeries {
		q, steps, err = series(w.name, ops)
	} else {
		sep = " ‖ "
		q, steps, err = parallel(w.name, ops)
	}
	if err != nil {
		return nil, fmt.Errorf("%s = %s: %w", w.name, strings.Join(names, sep), err)
	}
	w.z = q.V
	st := steps[0]
	st.Source = w.name + " = " + strings.Join(names, sep)
	st.Basis = r.basis
	r.out.Merges = append(r.out.Merges, Merge{Step: len(r.out.Steps), Name: w.name, Parts: names,
		Elements: r.leafNames[w.lo:w.hi:w.hi]})
	r.add(w.name, st)
	return w, nil
}

func vq(v complex128) calc.Quantity { return calc.Quantity{V: v, Dim: calc.DimVoltage} }
func iq(v complex128) calc.Quantity { return calc.Quantity{V: v, Dim: calc.DimCurrent} }

// feed finds the voltage across and the current into the whole tree.
func (r *spReducer) feed(root *spWork, src Element) error {
	st := calc.Step{Kind: "source", Basis: r.basis, Inputs: []calc.Operand{{Name: root.name, Value: zq(root.z)}}}
	vn, in := "V("+root.name+")", "I("+root.name+")"
	if src.Kind == VoltageSource {
		if root.z == 0 {
			return fmt.Errorf("reduce: the voltage source %s is short-circuited: the network it feeds reduces to 0 Ω", src.Name)
		}
		root.v = src.Value
		i, err := checked(src.Value/root.z, calc.DimCurrent, "source current")
		if err != nil {
			return err
		}
		root.i = i.V
		st.Source = "current drawn from " + src.Name
		st.Rule = "Ohm's law for the whole network: the source voltage over the equivalent impedance"
		st.Formula = in + " = " + src.Name + "/" + root.name
		st.Inputs = append([]calc.Operand{{Name: src.Name, Value: vq(src.Value)}}, st.Inputs...)
	} else {
		root.i = src.Value
		v, err := checked(src.Value*root.z, calc.DimVoltage, "source voltage")
		if err != nil {
			return err
		}
		root.v = v.V
		st.Source = "voltage across " + src.Name
		st.Rule = "Ohm's law for the whole network: the source current times the equivalent impedance"
		st.Formula = vn + " = " + src.Name + "·" + root.name
		st.Inputs = append([]calc.Operand{{Name: src.Name, Value: iq(src.Value)}}, st.Inputs...)
	}
	st.Results = []calc.Operand{{Name: vn, Value: vq(root.v)}, {Name: in, Value: iq(root.i)}}
	if src.Kind == VoltageSource {
		st.Results[0], st.Results[1] = st.Results[1], st.Results[0]
	}
	r.add(root.name, st)
	return nil
}

// back shares w's known voltage and current among its parts, pre-order.
// flip is whether w's leaves, if w is one, run against the tree direction.
func (r *spReducer) back(w *spWork, flip bool, depth int) error {
	if depth > MaxSPDepth {
		return fmt.Errorf("series-parallel tree: nested more than %d levels deep", MaxSPDepth)
	}
	if w.kind == SPLeaf {
		v, i := w.v, w.i
		if flip {
			v, i = -v, -i
		}
		r.out.Elements = append(r.out.Elements, ElementResult{Name: w.name, Z: zq(w.z), V: vq(v), I: iq(i)})
		return nil
	}
	if len(w.parts) == 1 {
		c := w.parts[0]
		c.v, c.i = w.v, w.i
		return r.back(c, flip != c.reversed, depth+1)
	}
	vn, in := "V("+w.name+")", "I("+w.name+")"
	var shorts []*spWork
	if w.kind == SPParallel && w.z == 0 {
		for _, c := range w.parts {
			if c.z == 0 {
				shorts = append(shorts, c)
			}
		}
		if len(shorts) > 1 && w.i != 0 {
			names := make([]string, len(shorts))
			for k, c := range shorts {
				names[k] = c.name
			}
			return fmt.Errorf("reduce: %s are 0 Ω shorts in parallel; how the current splits between them is not determined", strings.Join(names, ", "))
		}
	}
	for _, c := range w.parts {
		st := calc.Step{Basis: r.basis, Source: "share of " + c.name + " in " + w.name}
		cv, ci := "V("+c.name+")", "I("+c.name+")"
		if w.kind == SPSeries {
			c.i = w.i
			v, err := checked(c.z*w.i, calc.DimVoltage, "voltage")
			if err != nil {
				return err
			}
			c.v = v.V
			st.Kind = "divider"
			st.Rule = "series: the same current flows through each part, and Ohm's law gives its voltage (the voltage divider)"
			st.Formula = ci + " = " + in + ", " + cv + " = " + c.name + "·" + in
			st.Inputs = []calc.Operand{{Name: in, Value: iq(w.i)}, {Name: c.name, Value: zq(c.z)}}
		} else {
			c.v = w.v
			st.Kind = "current-divider"
			st.Inputs = []calc.Operand{{Name: vn, Value: vq(w.v)}, {Name: c.name, Value: zq(c.z)}}
			switch {
			case len(shorts) > 0:
				c.v = 0
				st.Rule = "parallel with a short: the 0 Ω branch takes the whole current and the others none"
				if c == shorts[0] && len(shorts) == 1 {
					c.i = w.i
					st.Formula = cv + " = 0, " + ci + " = " + in
					st.Inputs = []calc.Operand{{Name: in, Value: iq(w.i)}, {Name: c.name, Value: zq(c.z)}}
				} else {
					c.i = 0
					st.Formula = cv + " = 0, " + ci + " = 0"
				}
			default:
				i, err := checked(w.v/c.z, calc.DimCurrent, "current")
				if err != nil {
					return err
				}
				c.i = i.V
				st.Rule = "parallel: the same voltage is across each branch, and Ohm's law gives its current (the current divider)"
				st.Formula = cv + " = " + vn + ", " + ci + " = " + vn + "/" + c.name
			}
		}
		cflip := flip != c.reversed
		ov, oi := c.v, c.i
		if c.kind == SPLeaf && cflip {
			ov, oi = -ov, -oi
			st.Notes = []string{c.name + " is connected the other way round in its group, so its voltage and current (in its own From → To direction) change sign"}
		}
		st.Results = []calc.Operand{{Name: cv, Value: vq(ov)}, {Name: ci, Value: iq(oi)}}
		r.add(c.name, st)
		if err := r.back(c, cflip, depth+1); err != nil {
			return err
		}
	}
	return nil
}

// powers adds each element's complex power, the source's, the balance and
// the final table.
func (r *spReducer) powers(src Element, root *spWork) error {
	half, formulaTail := complex(1, 0), " (RMS phasors)"
	if r.basis == calc.Peak {
		half, formulaTail = 0.5, " (peak phasors)"
	}
	pre := ""
	if half != 1 {
		pre = "½·"
	}
	var total complex128
	for k := range r.out.Elements {
		e := &r.out.Elements[k]
		s, err := power(half*e.V.V*cmplx.Conj(e.I.V), "power of "+e.Name)
		if err != nil {
			return err
		}
		e.S = s
		total += s.V
		r.add(e.Name, calc.Step{Kind: "power", Basis: r.basis, Source: "power in " + e.Name,
			Rule:    "complex power taken in by an element: voltage times the conjugate of current",
			Formula: "S(" + e.Name + ") = " + pre + "V(" + e.Name + ")·I(" + e.Name + ")*" + formulaTail,
			Inputs:  []calc.Operand{{Name: "V(" + e.Name + ")", Value: e.V}, {Name: "I(" + e.Name + ")", Value: e.I}},
			Results: []calc.Operand{{Name: "S(" + e.Name + ")", Value: s}}})
	}
	// the source by the passive sign convention: its voltage From → To is
	// minus the tree's, and its current From → To is the tree's
	sv, si := -root.v, root.i
	ss, err := power(half*sv*cmplx.Conj(si), "power of "+src.Name)
	if err != nil {
		return err
	}
	delivered := calc.Quantity{V: -ss.V, Dim: calc.DimPower, Kind: calc.KindApparent}
	r.out.Source = ElementResult{Name: src.Name, Z: zq(0), V: vq(sv), I: iq(si), S: ss}
	tq, err := power(total, "total power")
	if err != nil {
		return err
	}
	r.add("", calc.Step{Kind: "balance", Basis: r.basis, Source: "power balance",
		Rule:    "power balance (Tellegen's theorem): the elements take in what the source delivers",
		Formula: "ΣS(elements) = S delivered by " + src.Name + " = " + pre + "V(" + root.name + ")·I(" + root.name + ")*" + formulaTail,
		Inputs:  []calc.Operand{{Name: "V(" + root.name + ")", Value: vq(root.v)}, {Name: "I(" + root.name + ")", Value: iq(root.i)}},
		Results: []calc.Operand{{Name: "ΣS(elements)", Value: tq}, {Name: "S delivered by " + src.Name, Value: delivered}}})
	table := calc.Step{Kind: "elements", Basis: r.basis, Source: "every element",
		Rule: "each element's voltage, current and complex power, by the passive sign convention; a source's power is negative when it delivers"}
	rows := append(append([]ElementResult(nil), r.out.Elements...), r.out.Source)
	for _, e := range rows {
		table.Rows = append(table.Rows, calc.Row{Name: e.Name, Values: []calc.Operand{{Name: "v", Value: e.V}, {Name: "i", Value: e.I}, {Name: "s", Value: e.S}}})
	}
	r.add("", table)
	return nil
}
