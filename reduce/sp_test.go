package reduce_test

import (
	"errors"
	"math"
	"math/cmplx"
	"math/rand/v2"
	"slices"
	"strconv"
	"strings"
	"testing"

	"argand/calc"
	"argand/reduce"
	"argand/reduce/nodal"
)

// tnode is the test's own series-parallel tree, evaluated directly, so the
// checks do not lean on the code under test.
type tnode struct {
	kind reduce.SPKind
	name string
	z    complex128
	kids []*tnode
}

type gen struct {
	r    *rand.Rand
	next int
}

func (g *gen) leaf() *tnode {
	g.next++
	return &tnode{kind: reduce.SPLeaf, name: "E" + strconv.Itoa(g.next),
		z: complex(1+g.r.Float64()*99, (g.r.Float64()-0.5)*200)}
}

// tree returns a random series-parallel tree with n leaves.
func (g *gen) tree(n int) *tnode {
	if n == 1 {
		return g.leaf()
	}
	k := 2 + g.r.IntN(min(n, 4)-1) // 2 to 4 parts
	kind := reduce.SPSeries
	if g.r.IntN(2) == 0 {
		kind = reduce.SPParallel
	}
	t := &tnode{kind: kind}
	left := n
	for i := 0; i < k; i++ {
		m := 1
		if i == k-1 {
			m = left
		} else if left-(k-1-i) > 1 {
			m = 1 + g.r.IntN(left-(k-1-i))
		}
		left -= m
		t.kids = append(t.kids, g.tree(m))
	}
	return t
}

func (t *tnode) impedance() complex128 {
	switch t.kind {
	case reduce.SPLeaf:
		return t.z
	case reduce.SPSeries:
		var s complex128
		for _, k := range t.kids {
			s += k.impedance()
		}
		return s
	}
	var y complex128
	for _, k := range t.kids {
		y += 1 / k.impedance()
	}
	return 1 / y
}

func (t *tnode) sp() *reduce.SPNode {
	if t.kind == reduce.SPLeaf {
		return reduce.Leaf(t.name)
	}
	parts := make([]*reduce.SPNode, len(t.kids))
	for i, k := range t.kids {
		parts[i] = k.sp()
	}
	if t.kind == reduce.SPSeries {
		return reduce.SeriesOf(parts...)
	}
	return reduce.ParallelOf(parts...)
}

func (t *tnode) values(m map[string]complex128) {
	if t.kind == reduce.SPLeaf {
		m[t.name] = t.z
	}
	for _, k := range t.kids {
		k.values(m)
	}
}

// network lays the tree out between nodes top and bottom, each element
// turned at random; flipped records which run bottom to top.
func (g *gen) network(t *tnode, top, bottom string, els *[]reduce.Element, flipped map[string]bool, nodes *int) {
	switch t.kind {
	case reduce.SPLeaf:
		e := reduce.Element{Name: t.name, Kind: reduce.Impedance, From: top, To: bottom, Z: t.z, Raw: t.z}
		if g.r.IntN(2) == 0 {
			e.From, e.To = bottom, top
			flipped[t.name] = true
		}
		*els = append(*els, e)
	case reduce.SPParallel:
		for _, k := range t.kids {
			g.network(k, top, bottom, els, flipped, nodes)
		}
	case reduce.SPSeries:
		at := top
		for i, k := range t.kids {
			next := bottom
			if i < len(t.kids)-1 {
				*nodes++
				next = "n" + strconv.Itoa(*nodes)
			}
			g.network(k, at, next, els, flipped, nodes)
			at = next
		}
	}
}

func near(a, b complex128, scale float64) bool {
	return cmplx.Abs(a-b) <= 1e-9*math.Max(scale, math.Max(cmplx.Abs(a), cmplx.Abs(b)))
}

// Random series-parallel networks: the stepped reduction agrees with direct
// evaluation of the tree and with the nodal solution (modified nodal
// analysis, a separate solver in package nodal); KCL holds at every node;
// the powers balance (Tellegen's theorem).
func TestRandomSPNetworks(t *testing.T) {
	r := rand.New(rand.NewPCG(11, 12))
	for trial := 0; trial < 300; trial++ {
		g := &gen{r: r}
		tree := g.tree(1 + r.IntN(25))
		basis := calc.RMS
		if trial%3 == 0 {
			basis = calc.Peak
		}
		src := reduce.Element{Name: "S1", Kind: reduce.VoltageSource, From: "0", To: "top",
			Value: complex(r.Float64()*400-200, r.Float64()*400-200)}
		if trial%2 == 1 {
			src.Kind = reduce.CurrentSource
			src.Value = complex(r.Float64()*10-5, r.Float64()*10-5)
		}
		zs := map[string]complex128{}
		tree.values(zs)
		zdirect := tree.impedance()

		red, err := reduce.Reduce(tree.sp(), zs, basis, src)
		if err != nil {
			t.Fatalf("trial %d: %v", trial, err)
		}
		if !near(red.Z.V, zdirect, 0) {
			t.Errorf("trial %d: Z = %v, direct %v", trial, red.Z.V, zdirect)
		}

		var els []reduce.Element
		flipped := map[string]bool{}
		nodes := 0
		g.network(tree, "top", "0", &els, flipped, &nodes)
		net := &reduce.Network{Name: "random", Reference: "0", Elements: append(els, src)}
		rn, err := reduce.ReduceNetwork(net, basis)
		if err != nil {
			t.Fatalf("trial %d: %v\n%s", trial, err, tree.sp())
		}
		if !near(rn.Z.V, zdirect, 0) {
			t.Errorf("trial %d: network Z = %v, direct %v", trial, rn.Z.V, zdirect)
		}
		sol, err := nodal.Solve(net, basis)
		if err != nil {
			t.Fatalf("trial %d: nodal: %v", trial, err)
		}
		scaleI, scaleV := sol.MaxI, 0.0
		for _, b := range sol.Branches {
			scaleV = math.Max(scaleV, cmplx.Abs(b.V))
		}
		byName := map[string]reduce.ElementResult{}
		for _, e := range rn.Elements {
			byName[e.Name] = e
		}
		treeRes := map[string]reduce.ElementResult{}
		for _, e := range red.Elements {
			treeRes[e.Name] = e
		}
		for _, b := range sol.Branches {
			if b.Kind.IsSource() {
				if !near(rn.Source.V.V, b.V, scaleV) || !near(rn.Source.I.V, b.I, scaleI) {
					t.Errorf("trial %d: source V %v I %v, nodal %v %v", trial, rn.Source.V.V, rn.Source.I.V, b.V, b.I)
				}
				continue
			}
			e, ok := byName[b.Name]
			if !ok {
				t.Errorf("trial %d: %s missing", trial, b.Name)
				continue
			}
			if !near(e.V.V, b.V, scaleV) || !near(e.I.V, b.I, scaleI) || !near(e.S.V, b.S, scaleV*scaleI) {
				t.Errorf("trial %d: %s V %v I %v, nodal V %v I %v", trial, b.Name, e.V.V, e.I.V, b.V, b.I)
			}
			// the tree path runs every element top to bottom
			te := treeRes[b.Name]
			sign := complex(1, 0)
			if flipped[b.Name] {
				sign = -1
			}
			if !near(sign*te.V.V, b.V, scaleV) || !near(sign*te.I.V, b.I, scaleI) {
				t.Errorf("trial %d: tree path %s V %v I %v, nodal V %v I %v", trial, b.Name, te.V.V, te.I.V, b.V, b.I)
			}
		}
		// KCL at every node, from the stepped solution
		kcl := map[string]complex128{}
		maxI := 0.0
		all := append(slices.Clone(net.Elements[:len(net.Elements)-1]), src)
		for _, e := range all {
			res := byName[e.Name]
			if e.Kind.IsSource() {
				res = rn.Source
			}
			kcl[e.From] += res.I.V
			kcl[e.To] -= res.I.V
			maxI = math.Max(maxI, cmplx.Abs(res.I.V))
		}
		for n, s := range kcl {
			if cmplx.Abs(s) > 1e-9*maxI {
				t.Errorf("trial %d: KCL at %s: %v", trial, n, s)
			}
		}
		// power balance, with the basis stated
		sum, abs := rn.Source.S.V, cmplx.Abs(rn.Source.S.V)
		for _, e := range rn.Elements {
			sum += e.S.V
			abs += cmplx.Abs(e.S.V)
		}
		if cmplx.Abs(sum) > 1e-9*abs {
			t.Errorf("trial %d: ΣS = %v of %v", trial, sum, abs)
		}
		checkSteps(t, red)
	}
}

// checkSteps asserts that every step is complete and every value finite,
// and that the merges point at reduction steps.
func checkSteps(t *testing.T, red *reduce.Reduction) {
	t.Helper()
	for _, st := range red.Steps {
		if st.Kind == "" || st.Rule == "" || (st.Formula == "" && st.Kind != "elements") {
			t.Fatalf("incomplete step %+v", st)
		}
		for _, o := range append(slices.Clone(st.Inputs), st.Results...) {
			if _, err := o.Value.Check("test"); err != nil || o.Name == "" {
				t.Fatalf("step %s: operand %q: %v", st.Kind, o.Name, err)
			}
		}
	}
	for _, m := range red.Merges {
		st := red.Steps[m.Step]
		if st.Kind != "series" && st.Kind != "parallel" {
			t.Fatalf("merge %s points at a %s step", m.Name, st.Kind)
		}
		if r, _ := st.Result(); r.Name != m.Name || len(m.Parts) < 2 || len(m.Elements) < 2 {
			t.Fatalf("merge %+v, step result %s", m, r.Name)
		}
	}
}

func TestReduceOrderAndNames(t *testing.T) {
	// the tree the worksheet builds from R1 + (L1 || (C1 + R2))
	tree := reduce.SeriesOf(reduce.Leaf("R1"), reduce.ParallelOf(reduce.Leaf("L1"), reduce.SeriesOf(reduce.Leaf("C1"), reduce.Leaf("R2"))))
	if got := tree.String(); got != "R1 + (L1 || (C1 + R2))" {
		t.Errorf("String: %q", got)
	}
	zs := map[string]complex128{"R1": 10, "L1": 20i, "C1": -10i, "R2": 10}
	red, err := reduce.Reduce(tree, zs, calc.RMS, reduce.Element{Name: "V1", Kind: reduce.VoltageSource, Value: 100})
	if err != nil {
		t.Fatal(err)
	}
	want := []reduce.Merge{
		{Step: 0, Name: "Zeq1", Parts: []string{"C1", "R2"}, Elements: []string{"C1", "R2"}},
		{Step: 1, Name: "Zeq2", Parts: []string{"L1", "Zeq1"}, Elements: []string{"L1", "C1", "R2"}},
		{Step: 2, Name: "Zeq3", Parts: []string{"R1", "Zeq2"}, Elements: []string{"R1", "L1", "C1", "R2"}},
	}
	if len(red.Merges) != len(want) {
		t.Fatalf("merges %+v", red.Merges)
	}
	for i, m := range red.Merges {
		if m.Step != want[i].Step || m.Name != want[i].Name || !slices.Equal(m.Parts, want[i].Parts) || !slices.Equal(m.Elements, want[i].Elements) {
			t.Errorf("merge %d: %+v, want %+v", i, m, want[i])
		}
	}
	// by hand: C1 + R2 = 10 − j10; j20 ‖ (10 − j10) = (200 + j200)/(10 + j10)
	// = 20; + R1 = 30 Ω; I = 100/30 A
	if !near(red.Z.V, 30, 0) {
		t.Errorf("Z = %v, want 30", red.Z.V)
	}
	if len(red.Steps[0].Results) == 0 || red.Steps[0].Formula != "Zeq1 = C1 + R2" {
		t.Errorf("first step formula %q", red.Steps[0].Formula)
	}
	byName := map[string]reduce.ElementResult{}
	for _, e := range red.Elements {
		byName[e.Name] = e
	}
	i := complex(100.0/30, 0)
	if !near(byName["R1"].I.V, i, 0) || !near(byName["L1"].V.V, 20*i, 0) || !near(byName["L1"].I.V, 20*i/20i, 0) {
		t.Errorf("R1 %+v L1 %+v", byName["R1"], byName["L1"])
	}
	if got := []string{red.Elements[0].Name, red.Elements[1].Name, red.Elements[2].Name, red.Elements[3].Name}; !slices.Equal(got, []string{"R1", "L1", "C1", "R2"}) {
		t.Errorf("element order %v", got)
	}
	last := red.Steps[len(red.Steps)-1]
	if last.Kind != "elements" || len(last.Rows) != 5 || last.Rows[4].Name != "V1" {
		t.Errorf("table %+v", last)
	}
	for _, st := range red.Steps {
		if st.Kind == "balance" && !strings.Contains(st.Formula, "RMS") {
			t.Errorf("balance formula does not state the basis: %q", st.Formula)
		}
	}
}

// S = V·I* for RMS phasors and ½·V·I* for peak phasors (IEEE Std 1459-2010
// defines S = V·I* with RMS values; the ½ for peak is common practice).
func TestPowerBasis(t *testing.T) {
	for _, tc := range []struct {
		basis calc.Basis
		want  complex128
		word  string
	}{{calc.RMS, 20, "RMS"}, {calc.Peak, 10, "½·"}} {
		red, err := reduce.Reduce(reduce.Leaf("R"), map[string]complex128{"R": 5}, tc.basis,
			reduce.Element{Name: "V", Kind: reduce.VoltageSource, Value: 10})
		if err != nil {
			t.Fatal(err)
		}
		if !near(red.Elements[0].S.V, tc.want, 0) || !near(red.Source.S.V, -tc.want, 0) {
			t.Errorf("%v: S = %v, source %v", tc.basis, red.Elements[0].S.V, red.Source.S.V)
		}
		found := false
		for _, st := range red.Steps {
			if st.Kind == "power" && strings.Contains(st.Formula, tc.word) {
				found = true
			}
		}
		if !found {
			t.Errorf("%v: no power step states the basis", tc.basis)
		}
	}
}

// The Wheatstone bridge (common practice) is not series-parallel: it is
// reported with its two triangles, R1–R5–R2 at the top and R3–R5–R4 below.
func TestBridgeIsNotSP(t *testing.T) {
	net := &reduce.Network{Name: "bridge", Reference: "0", Elements: []reduce.Element{
		{Name: "V1", Kind: reduce.VoltageSource, From: "0", To: "a", Value: 10},
		{Name: "R1", Kind: reduce.Resistor, From: "a", To: "b", Z: 100},
		{Name: "R2", Kind: reduce.Resistor, From: "a", To: "c", Z: 200},
		{Name: "R3", Kind: reduce.Resistor, From: "b", To: "0", Z: 300},
		{Name: "R4", Kind: reduce.Resistor, From: "c", To: "0", Z: 400},
		{Name: "R5", Kind: reduce.Resistor, From: "b", To: "c", Z: 500},
	}}
	_, err := reduce.ReduceNetwork(net, calc.RMS)
	var nsp *reduce.NotSeriesParallelError
	if !errors.As(err, &nsp) {
		t.Fatalf("got %v", err)
	}
	if !slices.Equal(nsp.Left, []string{"R1", "R2", "R3", "R4", "R5"}) {
		t.Errorf("left %v", nsp.Left)
	}
	var got []string
	for _, tr := range nsp.Triangles {
		p := tr.Parts[:]
		slices.Sort(p)
		got = append(got, strings.Join(p, ","))
	}
	slices.Sort(got)
	if !slices.Equal(got, []string{"R1,R2,R5", "R3,R4,R5"}) {
		t.Errorf("triangles %v", got)
	}
	msg := err.Error()
	for _, w := range []string{"not series-parallel", "Δ–Y", "nodal"} {
		if !strings.Contains(msg, w) {
			t.Errorf("message lacks %q: %s", w, msg)
		}
	}
	// with a series resistor added at the source, the bridge is still found
	net.Elements[0].To = "s"
	net.Elements = append(net.Elements, reduce.Element{Name: "R6", Kind: reduce.Resistor, From: "s", To: "a", Z: 1})
	if _, err := reduce.ReduceNetwork(net, calc.RMS); !errors.As(err, &nsp) || len(nsp.Triangles) != 2 {
		t.Errorf("bridge behind R6: %v", err)
	}
}

func TestIdleAndShorts(t *testing.T) {
	// R9 hangs from node a, R8 has both ends on node b: neither carries
	// current. W1 is a 0 Ω short across R2.
	net := &reduce.Network{Name: "example", Reference: "0", Elements: []reduce.Element{
		{Name: "V1", Kind: reduce.VoltageSource, From: "0", To: "a", Value: 10},
		{Name: "R1", Kind: reduce.Resistor, From: "a", To: "b", Z: 5},
		{Name: "R2", Kind: reduce.Resistor, From: "b", To: "0", Z: 10},
		{Name: "W1", Kind: reduce.Impedance, From: "0", To: "b", Z: 0},
		{Name: "R9", Kind: reduce.Resistor, From: "a", To: "x", Z: 7},
		{Name: "R8", Kind: reduce.Resistor, From: "b", To: "b", Z: 7},
	}}
	red, err := reduce.ReduceNetwork(net, calc.RMS)
	if err != nil {
		t.Fatal(err)
	}
	want := map[string][2]complex128{"R1": {10, 2}, "R2": {0, 0}, "W1": {0, -2}, "R9": {0, 0}, "R8": {0, 0}}
	for _, e := range red.Elements {
		w, ok := want[e.Name]
		if !ok || !near(e.V.V, w[0], 1) || !near(e.I.V, w[1], 1) {
			t.Errorf("%s: V %v I %v, want %v", e.Name, e.V.V, e.I.V, w)
		}
		delete(want, e.Name)
	}
	if len(want) > 0 {
		t.Errorf("missing %v", want)
	}
	checkSteps(t, red)
}

func TestReduceErrors(t *testing.T) {
	vs := reduce.Element{Name: "V1", Kind: reduce.VoltageSource, Value: 1}
	is := reduce.Element{Name: "I1", Kind: reduce.CurrentSource, Value: 1}
	deep := reduce.Leaf("R")
	for i := 0; i < reduce.MaxSPDepth+1; i++ {
		deep = reduce.SeriesOf(deep, reduce.Leaf("R"+strconv.Itoa(i)))
	}
	cyc := reduce.SeriesOf(reduce.Leaf("A"))
	cyc.Parts = append(cyc.Parts, cyc)
	tests := []struct {
		name string
		tree *reduce.SPNode
		z    map[string]complex128
		src  reduce.Element
		want string
		is   error
	}{
		{"resonant tank", reduce.ParallelOf(reduce.Leaf("L"), reduce.Leaf("C")), map[string]complex128{"L": 10i, "C": -10i}, is, "open circuit", calc.ErrOpenCircuit},
		{"shorted voltage source", reduce.ParallelOf(reduce.Leaf("W"), reduce.Leaf("R")), map[string]complex128{"W": 0, "R": 1}, vs, "short-circuited", nil},
		{"missing value", reduce.SeriesOf(reduce.Leaf("A"), reduce.Leaf("B")), map[string]complex128{"A": 1}, vs, "no impedance given for element B", nil},
		{"twice", reduce.SeriesOf(reduce.Leaf("A"), reduce.Leaf("A")), map[string]complex128{"A": 1}, vs, "more than once", nil},
		{"deep", deep, nil, vs, "levels deep", nil},
		{"cycle", cyc, map[string]complex128{"A": 1}, vs, "", nil},
		{"nil", nil, nil, vs, "empty", nil},
		{"not a source", reduce.Leaf("A"), map[string]complex128{"A": 1}, reduce.Element{Name: "R", Kind: reduce.Resistor}, "not a source", nil},
		{"NaN", reduce.Leaf("A"), map[string]complex128{"A": cmplx.NaN()}, vs, "finite", nil},
		{"two shorts", reduce.ParallelOf(reduce.Leaf("W1"), reduce.Leaf("W2")), map[string]complex128{"W1": 0, "W2": 0}, is, "not determined", nil},
	}
	for _, tc := range tests {
		_, err := reduce.Reduce(tc.tree, tc.z, calc.RMS, tc.src)
		if err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("%s: %v, want %q", tc.name, err, tc.want)
		}
		if tc.is != nil && !errors.Is(err, tc.is) {
			t.Errorf("%s: %v is not %v", tc.name, err, tc.is)
		}
	}
	// a tree 9 800 levels deep reduces (recursion stays within its bound)
	ok := reduce.Leaf("R")
	zs := map[string]complex128{"R": 1}
	for i := 0; i < 4900; i++ {
		n := "R" + strconv.Itoa(i)
		ok = reduce.ParallelOf(reduce.SeriesOf(ok, reduce.Leaf(n)), reduce.Leaf("P"+n))
		zs[n], zs["P"+n] = 1, 1e6
	}
	if _, err := reduce.Reduce(ok, zs, calc.RMS, vs); err != nil {
		t.Errorf("9 800 levels: %v", err)
	}
}

func TestNetworkErrors(t *testing.T) {
	el := func(name string, k reduce.ElementKind, from, to string) reduce.Element {
		return reduce.Element{Name: name, Kind: k, From: from, To: to, Z: 1, Value: 1}
	}
	tests := []struct {
		name string
		els  []reduce.Element
		want string
	}{
		{"empty", nil, "no elements"},
		{"no source", []reduce.Element{el("R1", reduce.Resistor, "a", "0")}, "exactly one independent source, and this network has none"},
		{"two sources", []reduce.Element{el("V1", reduce.VoltageSource, "0", "a"), el("I1", reduce.CurrentSource, "0", "a"), el("R1", reduce.Resistor, "a", "0")}, "2 (V1, I1)"},
		{"duplicate", []reduce.Element{el("V1", reduce.VoltageSource, "0", "a"), el("R1", reduce.Resistor, "a", "0"), el("R1", reduce.Resistor, "a", "0")}, "defined twice"},
		{"open", []reduce.Element{el("V1", reduce.VoltageSource, "0", "a"), el("R1", reduce.Resistor, "a", "b")}, "open circuit"},
		{"one node", []reduce.Element{el("V1", reduce.VoltageSource, "0", "a"), el("R1", reduce.Resistor, "a", "")}, "needs two nodes"},
	}
	for _, tc := range tests {
		_, err := reduce.ReduceNetwork(&reduce.Network{Reference: "0", Elements: tc.els}, calc.RMS)
		if err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("%s: %v, want %q", tc.name, err, tc.want)
		}
	}
}

func benchTree(n int) (*reduce.SPNode, map[string]complex128) {
	g := &gen{r: rand.New(rand.NewPCG(1, 1))}
	tr := g.tree(n)
	zs := map[string]complex128{}
	tr.values(zs)
	return tr.sp(), zs
}

func BenchmarkReduce1000(b *testing.B) {
	tree, zs := benchTree(1000)
	src := reduce.Element{Name: "V1", Kind: reduce.VoltageSource, Value: 230}
	for b.Loop() {
		if _, err := reduce.Reduce(tree, zs, calc.RMS, src); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkReduceNetwork1000(b *testing.B) {
	g := &gen{r: rand.New(rand.NewPCG(1, 1))}
	tr := g.tree(1000)
	var els []reduce.Element
	nodes := 0
	g.network(tr, "top", "0", &els, map[string]bool{}, &nodes)
	els = append(els, reduce.Element{Name: "V1", Kind: reduce.VoltageSource, From: "0", To: "top", Value: 230})
	net := &reduce.Network{Reference: "0", Elements: els}
	for b.Loop() {
		if _, err := reduce.ReduceNetwork(net, calc.RMS); err != nil {
			b.Fatal(err)
		}
	}
}
