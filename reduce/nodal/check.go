package nodal

import (
	"fmt"
	"slices"
	"strings"

	"argand/reduce"
)

// maxElements bounds the size of a network the nodal solution accepts.
const maxElements = 1_000_000

// NetError reports a network that has no unique solution, or a malformed
// one, naming the nodes and elements concerned. Line is the worksheet line
// of the first element named (0 when unknown); Error returns Msg alone so
// that the caller can place the line as it prefers.
type NetError struct {
	Msg      string
	Nodes    []string
	Elements []string
	Line     int
}

func (e *NetError) Error() string { return e.Msg }

// list joins names for a message: "a", "a and b", "a, b and c"; long
// lists are cut short.
func list(names []string) string {
	const most = 12
	extra := 0
	if len(names) > most {
		extra = len(names) - most
		names = names[:most]
	}
	var s string
	switch len(names) {
	case 0:
		return ""
	case 1:
		s = names[0]
	default:
		s = strings.Join(names[:len(names)-1], ", ") + " and " + names[len(names)-1]
	}
	if extra > 0 {
		s += fmt.Sprintf(" (and %d more)", extra)
	}
	return s
}

func plural(n int, one, many string) string {
	if n == 1 {
		return one
	}
	return many
}

// unionFind is a disjoint-set forest with path halving and union by size.
type unionFind struct{ parent, size []int32 }

func newUnionFind(n int) *unionFind {
	u := &unionFind{parent: make([]int32, n), size: make([]int32, n)}
	for i := range u.parent {
		u.parent[i] = int32(i)
		u.size[i] = 1
	}
	return u
}

func (u *unionFind) find(x int32) int32 {
	for u.parent[x] != x {
		u.parent[x] = u.parent[u.parent[x]]
		x = u.parent[x]
	}
	return x
}

// union joins the sets of a and b and reports whether they were apart.
func (u *unionFind) union(a, b int32) bool {
	a, b = u.find(a), u.find(b)
	if a == b {
		return false
	}
	if u.size[a] < u.size[b] {
		a, b = b, a
	}
	u.parent[b] = a
	u.size[a] += u.size[b]
	return true
}

// topology is a checked network: nodes numbered, the reference found, and
// each element classed for the equations.
type topology struct {
	net   *reduce.Network
	nodes []string // all nodes, in order of first appearance
	index map[string]int32
	ref   int32
	from  []int32 // per element
	to    []int32
	short []bool // passive with Z = 0: an ideal short, given a current unknown
	self  []bool // passive joined to one node only: carries nothing
	notes []string
}

// finite reports whether both parts of v are finite: x − x is 0 for a
// finite x and NaN for an infinity or NaN.
func finite(v complex128) bool { return real(v)-real(v) == 0 && imag(v)-imag(v) == 0 }

// check validates n and finds, by graph search before any arithmetic,
// every reason the modified nodal equations could have no unique solution:
// a part with no path to the reference, a loop of voltage sources and
// ideal shorts, and a current source whose current has no path (a cut-set
// of current sources).
func check(n *reduce.Network) (*topology, error) {
	t, err := elements(n)
	if err != nil {
		return nil, err
	}
	if n.Reference == "" {
		return nil, &NetError{Msg: "no reference node is named"}
	}
	ref, ok := t.index[n.Reference]
	if !ok {
		return nil, &NetError{Msg: fmt.Sprintf("the reference node %s is not joined to any element", n.Reference), Nodes: []string{n.Reference}}
	}
	t.ref = ref
	if err := t.floating(); err != nil {
		return nil, err
	}
	if err := t.sourceLoops(); err != nil {
		return nil, err
	}
	if err := t.currentCuts(); err != nil {
		return nil, err
	}
	return t, nil
}

// elements checks each element on its own (names, nodes, values) and
// numbers the nodes.
func elements(n *reduce.Network) (*topology, error) {
	if n == nil || len(n.Elements) == 0 {
		return nil, &NetError{Msg: "the network has no elements"}
	}
	if len(n.Elements) > maxElements {
		return nil, &NetError{Msg: fmt.Sprintf("the network has %d elements; at most %d are accepted", len(n.Elements), maxElements)}
	}
	t := &topology{net: n, index: make(map[string]int32, len(n.Elements)/2+1)}
	m := len(n.Elements)
	t.from, t.to = make([]int32, m), make([]int32, m)
	t.short, t.self = make([]bool, m), make([]bool, m)
	t.nodes = make([]string, 0, m/2+1)
	node := func(name string) int32 {
		if i, ok := t.index[name]; ok {
			return i
		}
		i := int32(len(t.nodes))
		t.index[name] = i
		t.nodes = append(t.nodes, name)
		return i
	}
	seen := make(map[string]int, m)
	for k, e := range n.Elements {
		bad := func(format string, args ...any) error {
			return &NetError{Msg: e.Name + ": " + fmt.Sprintf(format, args...), Elements: []string{e.Name}, Line: e.Line}
		}
		if e.Name == "" {
			return nil, &NetError{Msg: fmt.Sprintf("element %d has no name", k+1), Line: e.Line}
		}
		if j, dup := seen[e.Name]; dup {
			msg := fmt.Sprintf("element name %s is used twice", e.Name)
			if l := n.Elements[j].Line; l > 0 {
				msg += fmt.Sprintf(" (first on line %d)", l)
			}
			return nil, &NetError{Msg: msg, Elements: []string{e.Name}, Line: e.Line}
		}
		seen[e.Name] = k
		if e.From == "" || e.To == "" {
			return nil, bad("both nodes must be named")
		}
		if err := checkValue(e); err != nil {
			return nil, err
		}
		t.from[k], t.to[k] = node(e.From), node(e.To)
		if e.Kind.IsSource() {
			continue
		}
		if e.From == e.To {
			t.self[k] = true
			t.notes = append(t.notes, fmt.Sprintf("%s is joined to node %s at both ends and carries no current", e.Name, e.From))
			continue
		}
		t.short[k] = e.Z == 0
	}
	return t, nil
}

// checkValue checks the kind and value of one element whose nodes are
// named.
func checkValue(e reduce.Element) error {
	bad := func(format string, args ...any) error {
		return &NetError{Msg: e.Name + ": " + fmt.Sprintf(format, args...), Elements: []string{e.Name}, Line: e.Line}
	}
	if e.Kind > reduce.CurrentSource {
		return bad("unknown element kind")
	}
	if e.Kind.IsSource() {
		if !finite(e.Value) {
			return bad("the source value is not a finite number")
		}
		if e.From == e.To {
			return &NetError{
				Msg:   fmt.Sprintf("%s: the %s is joined to node %s at both ends", e.Name, e.Kind, e.From),
				Nodes: []string{e.From}, Elements: []string{e.Name}, Line: e.Line,
			}
		}
		return nil
	}
	if !finite(e.Z) {
		return bad("the impedance is not a finite number")
	}
	if e.Z == 0 && e.Raw != 0 {
		return bad("the impedance has not been worked out at a frequency (evaluate the network at a frequency first)")
	}
	return nil
}

// component returns the node and element names of the part of the graph
// (as grouped by u) that holds node x; keep says which elements count.
func (t *topology) component(u *unionFind, x int32, keep func(k int) bool) (nodes, elems []string, line int) {
	r := u.find(x)
	for i, name := range t.nodes {
		if u.find(int32(i)) == r {
			nodes = append(nodes, name)
		}
	}
	for k, e := range t.net.Elements {
		if keep(k) && u.find(t.from[k]) == r {
			elems = append(elems, e.Name)
			if line == 0 {
				line = e.Line
			}
		}
	}
	sortNatural(nodes)
	return nodes, elems, line
}

func (t *topology) floating() error {
	u := newUnionFind(len(t.nodes))
	for k := range t.net.Elements {
		u.union(t.from[k], t.to[k])
	}
	r := u.find(t.ref)
	for i := range t.nodes {
		if u.find(int32(i)) == r {
			continue
		}
		nodes, elems, line := t.component(u, int32(i), func(int) bool { return true })
		return &NetError{
			Msg: fmt.Sprintf("%s %s (%s %s) %s no path to the reference node %s: %s undetermined",
				plural(len(nodes), "node", "nodes"), list(nodes), plural(len(elems), "element", "elements"), list(elems),
				plural(len(nodes), "has", "have"), t.net.Reference, plural(len(nodes), "its voltage is", "their voltages are")),
			Nodes: nodes, Elements: elems, Line: line,
		}
	}
	return nil
}

// sourceLoops finds a loop made only of voltage sources and ideal shorts.
// Such a loop fixes its own voltage sum and leaves its circulating current
// undetermined: the equations are singular whatever the values.
func (t *topology) sourceLoops() error {
	u := newUnionFind(len(t.nodes))
	type arc struct {
		to   int32
		elem int
	}
	forest := make(map[int32][]arc)
	for k, e := range t.net.Elements {
		if e.Kind != reduce.VoltageSource && !t.short[k] {
			continue
		}
		a, b := t.from[k], t.to[k]
		if u.union(a, b) {
			forest[a] = append(forest[a], arc{b, k})
			forest[b] = append(forest[b], arc{a, k})
			continue
		}
		// The loop is k plus the forest path from b back to a.
		prev := map[int32]arc{b: {-1, -1}}
		queue := []int32{b}
		for h := 0; h < len(queue) && queue[h] != a; h++ {
			v := queue[h]
			for _, w := range forest[v] {
				if _, ok := prev[w.to]; !ok {
					prev[w.to] = arc{v, w.elem}
					queue = append(queue, w.to)
				}
			}
		}
		loop := []int{k}
		nodeSet := []int32{a}
		for v := a; v != b; {
			p := prev[v]
			loop = append(loop, p.elem)
			v = p.to
			nodeSet = append(nodeSet, v)
		}
		slices.Sort(loop) // name the elements in the network's order
		var sources, shorts, names []string
		line := 0
		for _, j := range loop {
			ej := t.net.Elements[j]
			names = append(names, ej.Name)
			if line == 0 {
				line = ej.Line
			}
			if ej.Kind == reduce.VoltageSource {
				sources = append(sources, ej.Name)
			} else {
				shorts = append(shorts, ej.Name)
			}
		}
		var nodes []string
		for _, v := range nodeSet {
			nodes = append(nodes, t.nodes[v])
		}
		sortNatural(nodes)
		var msg string
		switch {
		case len(shorts) == 0:
			msg = fmt.Sprintf("voltage sources %s form a loop (through nodes %s): the loop current is undetermined, and unless the voltages sum to zero they contradict each other",
				list(sources), list(nodes))
		case len(sources) == 0:
			msg = fmt.Sprintf("ideal shorts (0 Ω) %s form a loop (through nodes %s): the current that circulates in it is undetermined",
				list(shorts), list(nodes))
		default:
			msg = fmt.Sprintf("%s %s %s across voltage %s %s (through nodes %s): the source would drive an unlimited current",
				plural(len(shorts), "an ideal short (0 Ω)", "ideal shorts (0 Ω)"), list(shorts), plural(len(shorts), "lies", "lie"),
				plural(len(sources), "source", "sources"), list(sources), list(nodes))
		}
		return &NetError{Msg: msg, Nodes: nodes, Elements: names, Line: line}
	}
	return nil
}

// currentCuts finds a current source whose ends are joined only through
// other current sources: Kirchhoff's current law at the part they cut off
// then either contradicts the source values or leaves the part's voltage
// undetermined. A current source with a short (or any path) across it is
// fine.
func (t *topology) currentCuts() error {
	u := newUnionFind(len(t.nodes))
	for k, e := range t.net.Elements {
		if e.Kind != reduce.CurrentSource {
			u.union(t.from[k], t.to[k])
		}
	}
	r := u.find(t.ref)
	for k, e := range t.net.Elements {
		if e.Kind != reduce.CurrentSource {
			continue
		}
		a, b := u.find(t.from[k]), u.find(t.to[k])
		if a == b {
			continue
		}
		side := t.from[k]
		if a == r {
			side = t.to[k]
		}
		nodes, _, _ := t.component(u, side, func(int) bool { return false })
		s := u.find(side)
		var cut []string
		for j, ej := range t.net.Elements {
			if ej.Kind == reduce.CurrentSource && (u.find(t.from[j]) == s) != (u.find(t.to[j]) == s) {
				cut = append(cut, ej.Name)
			}
		}
		return &NetError{
			Msg: fmt.Sprintf("current source %s has no path for its current: %s %s %s joined to the rest of the network only through current %s %s",
				e.Name, plural(len(nodes), "node", "nodes"), list(nodes), plural(len(nodes), "is", "are"),
				plural(len(cut), "source", "sources"), list(cut)),
			Nodes: nodes, Elements: cut, Line: e.Line,
		}
	}
	return nil
}

// sortNatural sorts names so that digit runs compare by value: n2 before
// n10.
func sortNatural(s []string) {
	slices.SortFunc(s, func(a, b string) int {
		switch {
		case lessNatural(a, b):
			return -1
		case lessNatural(b, a):
			return 1
		}
		return 0
	})
}

func isDigit(c byte) bool { return '0' <= c && c <= '9' }

// lessNatural compares a and b with runs of digits taken as numbers.
func lessNatural(a, b string) bool {
	i, j := 0, 0
	for i < len(a) && j < len(b) {
		if isDigit(a[i]) && isDigit(b[j]) {
			si, sj := i, j
			for i < len(a) && isDigit(a[i]) {
				i++
			}
			for j < len(b) && isDigit(b[j]) {
				j++
			}
			da := strings.TrimLeft(a[si:i], "0")
			db := strings.TrimLeft(b[sj:j], "0")
			if len(da) != len(db) {
				return len(da) < len(db)
			}
			if da != db {
				return da < db
			}
			continue
		}
		if a[i] != b[j] {
			return a[i] < b[j]
		}
		i++
		j++
	}
	if len(a)-i != len(b)-j {
		return len(a)-i < len(b)-j
	}
	return a < b
}
