package nodal_test

import (
	"fmt"
	"math"
	"math/cmplx"
	"math/rand/v2"
	"slices"
	"testing"

	"gonum.org/v1/gonum/mat"

	"argand/calc"
	"argand/reduce"
	"argand/reduce/nodal"
)

// Shorthand constructors. Passive elements get Z and Raw alike, which is
// what Network.At gives for resistors and impedances.
func res(name, from, to string, r float64) reduce.Element {
	return reduce.Element{Name: name, Kind: reduce.Resistor, From: from, To: to, Z: complex(r, 0), Raw: complex(r, 0)}
}

func imp(name, from, to string, z complex128) reduce.Element {
	return reduce.Element{Name: name, Kind: reduce.Impedance, From: from, To: to, Z: z, Raw: z}
}

func vsrc(name, from, to string, v complex128) reduce.Element {
	return reduce.Element{Name: name, Kind: reduce.VoltageSource, From: from, To: to, Value: v}
}

func isrc(name, from, to string, i complex128) reduce.Element {
	return reduce.Element{Name: name, Kind: reduce.CurrentSource, From: from, To: to, Value: i}
}

func network(ref string, els ...reduce.Element) *reduce.Network {
	return &reduce.Network{Name: "example data", Reference: ref, Elements: els}
}

// logUniform draws from [lo, hi] evenly in the logarithm.
func logUniform(rng *rand.Rand, lo, hi float64) float64 {
	return math.Exp(math.Log(lo) + rng.Float64()*(math.Log(hi)-math.Log(lo)))
}

func randPhasor(rng *rand.Rand, scale float64) complex128 {
	return cmplx.Rect(scale*(0.1+rng.Float64()), (rng.Float64()*2-1)*math.Pi)
}

// randomNetwork builds a connected network of up to maxNodes nodes
// (reference "0" included): a random spanning tree of passive elements,
// extra passive elements that make bridges, several voltage and current
// sources and now and then an ideal short, never closing a loop of voltage
// sources and shorts. The values are invented example data.
func randomNetwork(rng *rand.Rand, maxNodes int) *reduce.Network {
	nn := 3 + rng.IntN(maxNodes-2)
	name := func(i int) string {
		if i == 0 {
			return "0"
		}
		return fmt.Sprintf("n%d", i)
	}
	n := &reduce.Network{Name: "example data", Reference: "0"}
	count := 0
	passive := func(a, b int) {
		count++
		nm := fmt.Sprintf("Z%d", count)
		var z complex128
		switch rng.IntN(5) {
		case 0, 1:
			z = complex(logUniform(rng, 0.1, 1e4), 0)
		case 2:
			z = complex(logUniform(rng, 0.01, 10), logUniform(rng, 0.1, 1e3))
		case 3:
			z = complex(logUniform(rng, 0.01, 10), -logUniform(rng, 0.1, 1e3))
		default:
			z = cmplx.Rect(logUniform(rng, 0.1, 1e3), (rng.Float64()-0.5)*math.Pi*0.98)
		}
		n.Elements = append(n.Elements, imp(nm, name(a), name(b), z))
	}
	for i := 1; i < nn; i++ {
		passive(rng.IntN(i), i)
	}
	for range rng.IntN(2 * nn) {
		a, b := rng.IntN(nn), rng.IntN(nn)
		if a != b {
			passive(a, b)
		}
	}
	// Voltage sources and shorts: keep them a forest.
	parent := make([]int, nn)
	for i := range parent {
		parent[i] = i
	}
	var find func(int) int
	find = func(x int) int {
		for parent[x] != x {
			x = parent[x]
		}
		return x
	}
	nv := 1 + rng.IntN(3)
	for k := 0; k < nv+2; k++ {
		a, b := rng.IntN(nn), rng.IntN(nn)
		if a == b || find(a) == find(b) {
			continue
		}
		parent[find(a)] = find(b)
		if k < nv {
			n.Elements = append(n.Elements, vsrc(fmt.Sprintf("V%d", k+1), name(a), name(b), randPhasor(rng, 230)))
		} else if rng.IntN(3) == 0 {
			n.Elements = append(n.Elements, imp(fmt.Sprintf("S%d", k+1), name(a), name(b), 0))
		}
	}
	for k := range rng.IntN(4) {
		a, b := rng.IntN(nn), rng.IntN(nn)
		if a != b {
			n.Elements = append(n.Elements, isrc(fmt.Sprintf("I%d", k+1), name(a), name(b), randPhasor(rng, 5)))
		}
	}
	rng.Shuffle(len(n.Elements), func(i, j int) { n.Elements[i], n.Elements[j] = n.Elements[j], n.Elements[i] })
	return n
}

// mnaSystem assembles the modified nodal equations of n independently of
// the package: the non-reference nodes in sorted order, then one current
// unknown for each voltage source and ideal short (flowing from its From
// node to its To node through it), in the network's order. It returns the
// dense complex matrix and right-hand side and the node names. The
// passive elements named in direct also get a current unknown, with the
// branch equation V(To) − V(From) + Z·I = 0.
func mnaSystem(n *reduce.Network, direct ...string) (A [][]complex128, rhs []complex128, nodes []string, extra []int) {
	set := map[string]bool{}
	for _, e := range n.Elements {
		set[e.From], set[e.To] = true, true
	}
	delete(set, n.Reference)
	for s := range set {
		nodes = append(nodes, s)
	}
	slices.Sort(nodes)
	idx := map[string]int{n.Reference: -1}
	for i, s := range nodes {
		idx[s] = i
	}
	for k, e := range n.Elements {
		if e.Kind == reduce.VoltageSource || (!e.Kind.IsSource() && (e.Z == 0 || slices.Contains(direct, e.Name)) && e.From != e.To) {
			extra = append(extra, k)
		}
	}
	N := len(nodes) + len(extra)
	A = make([][]complex128, N)
	for i := range A {
		A[i] = make([]complex128, N)
	}
	rhs = make([]complex128, N)
	add := func(i, j int, v complex128) {
		if i >= 0 && j >= 0 {
			A[i][j] += v
		}
	}
	row := len(nodes)
	for _, e := range n.Elements {
		a, b := idx[e.From], idx[e.To]
		switch {
		case e.From == e.To:
		case e.Kind == reduce.CurrentSource:
			if a >= 0 {
				rhs[a] -= e.Value
			}
			if b >= 0 {
				rhs[b] += e.Value
			}
		case e.Kind == reduce.VoltageSource || e.Z == 0 || slices.Contains(direct, e.Name):
			add(a, row, 1)
			add(b, row, -1)
			add(row, a, -1)
			add(row, b, 1)
			if e.Kind == reduce.VoltageSource {
				rhs[row] = e.Value // V(b) − V(a) = Value
			} else {
				add(row, row, e.Z) // V(b) − V(a) + Z·I = 0
			}
			row++
		default:
			y := 1 / e.Z
			add(a, a, y)
			add(b, b, y)
			add(a, b, -y)
			add(b, a, -y)
		}
	}
	return A, rhs, nodes, extra
}

// referenceVoltages solves the modified nodal equations of n (mnaSystem)
// with gonum's dense LU on the equivalent real system
// [[Re A, −Im A], [Im A, Re A]]: an independent assembly and an
// independent solver. It returns the node voltages of the non-reference
// nodes in sorted order.
func referenceVoltages(t *testing.T, n *reduce.Network) ([]string, []complex128) {
	t.Helper()
	A, rhs, nodes, _ := mnaSystem(n)
	N := len(A)
	R := mat.NewDense(2*N, 2*N, nil)
	rv := mat.NewVecDense(2*N, nil)
	for i := 0; i < N; i++ {
		for j := 0; j < N; j++ {
			R.Set(i, j, real(A[i][j]))
			R.Set(i, j+N, -imag(A[i][j]))
			R.Set(i+N, j, imag(A[i][j]))
			R.Set(i+N, j+N, real(A[i][j]))
		}
		rv.SetVec(i, real(rhs[i]))
		rv.SetVec(i+N, imag(rhs[i]))
	}
	var lu mat.LU
	lu.Factorize(R)
	var x mat.VecDense
	if err := lu.SolveVecTo(&x, false, rv); err != nil {
		t.Fatalf("gonum LU: %v", err)
	}
	v := make([]complex128, len(nodes))
	for i := range nodes {
		v[i] = complex(x.AtVec(i), x.AtVec(i+N))
	}
	return nodes, v
}

// backwardError is the normwise backward error of a solution of n,
// ‖b − A·x‖∞ / (‖A‖∞·‖x‖∞ + ‖b‖∞) with the complex modulus (J. L. Rigal
// and J. Gaches, J. ACM 14(3), 1967; N. J. Higham, "Accuracy and
// Stability of Numerical Algorithms", 2nd ed., 2002, Theorem 7.1), on the
// equations of mnaSystem, in the form the solution says it solved, with x
// read from the solution: node voltages, and the currents of voltage
// sources, ideal shorts and elements of very low impedance.
func backwardError(n *reduce.Network, s *nodal.Solution) float64 {
	A, rhs, nodes, extra := mnaSystem(n, s.LowImpedance...)
	x := make([]complex128, len(A))
	for i, name := range nodes {
		x[i] = s.Voltage[name]
	}
	for r, k := range extra {
		x[len(nodes)+r] = s.Branches[k].I
	}
	normA, normX, normB, normR := 0.0, 0.0, 0.0, 0.0
	for i := range A {
		r := rhs[i]
		row := 0.0
		for j, a := range A[i] {
			r -= a * x[j]
			row += cmplx.Abs(a)
		}
		normA = math.Max(normA, row)
		normX = math.Max(normX, cmplx.Abs(x[i]))
		normB = math.Max(normB, cmplx.Abs(rhs[i]))
		normR = math.Max(normR, cmplx.Abs(r))
	}
	return normR / (normA*normX + normB)
}

func norm(v []complex128) float64 {
	s := 0.0
	for _, x := range v {
		s += real(x)*real(x) + imag(x)*imag(x)
	}
	return math.Sqrt(s)
}

// checkBalance asserts Kirchhoff's current law at every node and
// Tellegen's theorem (Σ V·I* = 0 over all elements, passive sign
// convention; common practice) on a solution.
func checkBalance(t *testing.T, s *nodal.Solution) {
	t.Helper()
	for node, r := range s.KCL {
		if cmplx.Abs(r) > 1e-9*s.MaxI {
			t.Errorf("KCL residual %g at node %s exceeds 1e-9 of the largest branch current %g", cmplx.Abs(r), node, s.MaxI)
		}
	}
	if cmplx.Abs(s.PowerSum) > 1e-9*s.PowerAbs {
		t.Errorf("Tellegen: |ΣS| = %g exceeds 1e-9·Σ|S| = %g", cmplx.Abs(s.PowerSum), 1e-9*s.PowerAbs)
	}
}

// solve solves n on the RMS basis and fails the test on error.
func solve(t *testing.T, n *reduce.Network) *nodal.Solution {
	t.Helper()
	s, err := nodal.Solve(n, calc.RMS)
	if err != nil {
		t.Fatalf("Solve: %v", err)
	}
	return s
}

// branch returns the solved element called name.
func branch(t *testing.T, s *nodal.Solution, name string) nodal.Branch {
	t.Helper()
	for _, b := range s.Branches {
		if b.Name == name {
			return b
		}
	}
	t.Fatalf("no element %s in the solution", name)
	return nodal.Branch{}
}
