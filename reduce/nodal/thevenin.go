package nodal

import (
	"context"
	"fmt"
	"math"
	"math/cmplx"

	"argand/calc"
	"argand/reduce"
)

// equivalent is the two-terminal equivalent between nodes a and b.
type equivalent struct {
	vth, zth, in complex128
	zZero, zInf  bool
	steps        []calc.Step
}

// part returns a copy of n with reference b that keeps only the elements
// joined (through any elements) to node b, and reports whether node a is
// among them. Parts not joined to b cannot change anything seen between a
// and b.
func part(n *reduce.Network, a, b string) (*reduce.Network, bool) {
	idx := map[string]int32{}
	id := func(s string) int32 {
		if i, ok := idx[s]; ok {
			return i
		}
		idx[s] = int32(len(idx))
		return idx[s]
	}
	for _, e := range n.Elements {
		id(e.From)
		id(e.To)
	}
	id(a)
	id(b)
	u := newUnionFind(len(idx))
	for _, e := range n.Elements {
		u.union(idx[e.From], idx[e.To])
	}
	rb := u.find(idx[b])
	c := &reduce.Network{Name: n.Name, Reference: b}
	for _, e := range n.Elements {
		if u.find(idx[e.From]) == rb {
			c.Elements = append(c.Elements, e)
		}
	}
	return c, u.find(idx[a]) == rb
}

// freeName returns a name not used by any element of n.
func freeName(n *reduce.Network, base string) string {
	used := map[string]bool{}
	for _, e := range n.Elements {
		used[e.Name] = true
	}
	name := base
	for i := 2; used[name]; i++ {
		name = fmt.Sprintf("%s %d", base, i)
	}
	return name
}

// twoTerminal finds the equivalent seen between nodes a and b. Z_th comes
// from a 1 A test current source with every independent source set to zero
// (voltage sources become shorts, current sources opens), which works
// whether or not the network holds sources; V_th is the open-circuit
// voltage. When no path joins a and b with the sources set to zero, Z_th is
// infinite and the short-circuit current is found instead.
//
// Each of its solutions polls ctx (see SolveContext); when ctx ends it
// returns ctx.Err().
func twoTerminal(ctx context.Context, n *reduce.Network, a, b string, basis calc.Basis) (*equivalent, error) {
	if n == nil || len(n.Elements) == 0 {
		return nil, &NetError{Msg: "the network has no elements"}
	}
	if a == "" || b == "" {
		return nil, &NetError{Msg: "both terminals of the equivalent must be named"}
	}
	if a == b {
		return nil, &NetError{Msg: fmt.Sprintf("the terminals of the equivalent are the same node %s", a), Nodes: []string{a}}
	}
	known := map[string]bool{}
	for _, e := range n.Elements {
		known[e.From], known[e.To] = true, true
	}
	for _, x := range []string{a, b} {
		if !known[x] {
			return nil, &NetError{Msg: fmt.Sprintf("node %s is not joined to any element", x), Nodes: []string{x}}
		}
	}
	// Catch malformed networks (duplicate names, missing values) once,
	// whatever part the terminals lie in.
	if _, err := elements(n); err != nil {
		return nil, err
	}
	p, joined := part(n, a, b)
	if !joined {
		return nil, &NetError{Msg: fmt.Sprintf("nodes %s and %s are not joined by any path: the equivalent is an open circuit with nothing behind it", a, b), Nodes: []string{a, b}}
	}
	eq := &equivalent{}
	pair := a + "–" + b

	// Z_th with the sources set to zero.
	dead := &reduce.Network{Name: p.Name, Reference: b}
	for _, e := range p.Elements {
		switch e.Kind {
		case reduce.CurrentSource:
			continue
		case reduce.VoltageSource:
			e.Value = 0
		}
		dead.Elements = append(dead.Elements, e)
	}
	zst := calc.Step{
		Kind:    "thevenin",
		Rule:    fmt.Sprintf("impedance seen between %s and %s with every independent source set to zero (voltage sources shorted, current sources opened)", a, b),
		Formula: "Z_th = V_test / I_test",
		Basis:   basis,
	}
	dead, joined = part(dead, a, b)
	switch {
	case !joined:
		eq.zInf = true
		zst.Rule = fmt.Sprintf("with every independent source set to zero no element joins %s and %s: Z_th is infinite", a, b)
		zst.Formula = "Z_th = ∞"
		zst.Notes = []string{"an ideal current source between " + pair + ": only the Norton form exists (the Thevenin voltage would be infinite)"}
	case shortPath(dead, a, b):
		eq.zZero = true
		zst.Rule = fmt.Sprintf("with every independent source set to zero, %s and %s are joined by voltage sources and ideal shorts only: Z_th = 0", a, b)
		zst.Formula = "Z_th = 0"
		zst.Results = []calc.Operand{{Name: "Z_th", Value: calc.Q(0, calc.DimImpedance)}}
		zst.Notes = []string{"an ideal voltage source between " + pair + ": only the Thevenin form exists (the Norton current would be infinite)"}
	default:
		test := freeName(dead, "test source")
		dead.Elements = append(dead.Elements, reduce.Element{Name: test, Kind: reduce.CurrentSource, From: b, To: a, Value: 1})
		sol, err := SolveContext(ctx, dead, basis)
		if err != nil {
			return nil, err
		}
		eq.zth = sol.Voltage[a]
		zst.Rule += fmt.Sprintf(", driven by a 1 A test current source into %s", a)
		zst.Inputs = []calc.Operand{{Name: "I_test", Value: calc.Q(1, calc.DimCurrent)}}
		zst.Results = []calc.Operand{{Name: "Z_th", Value: calc.Q(eq.zth, calc.DimImpedance)}}
		if eq.zth == 0 {
			eq.zZero = true
			zst.Notes = []string{"Z_th works out to 0: only the Thevenin form exists (the Norton current would be infinite)"}
		}
	}

	if eq.zInf {
		// Short-circuit current through a short joined from a to b.
		sc := &reduce.Network{Name: p.Name, Reference: b, Elements: append([]reduce.Element(nil), p.Elements...)}
		short := freeName(sc, "test short")
		sc.Elements = append(sc.Elements, reduce.Element{Name: short, Kind: reduce.Impedance, From: a, To: b})
		sol, err := SolveContext(ctx, sc, basis)
		if err != nil {
			return nil, err
		}
		eq.in = sol.Branches[len(sol.Branches)-1].I
		ist := calc.Step{
			Kind:    "thevenin",
			Rule:    fmt.Sprintf("short-circuit current: join %s to %s by an ideal short and solve; the current in it from %s to %s is the Norton current", a, b, a, b),
			Formula: "I_N = I_sc",
			Basis:   basis,
			Results: []calc.Operand{
				{Name: "I_N", Value: calc.Q(eq.in, calc.DimCurrent)},
				{Name: "Y_N", Value: calc.Q(0, calc.DimAdmittance)},
			},
		}
		eq.steps = []calc.Step{zst, ist}
		return eq, nil
	}

	sol, err := SolveContext(ctx, p, basis)
	if err != nil {
		return nil, err
	}
	eq.vth = sol.Voltage[a]
	vst := calc.Step{
		Kind:    "thevenin",
		Rule:    fmt.Sprintf("open-circuit voltage: solve the network as it stands, nothing joined between %s and %s", a, b),
		Formula: "V_th = V(" + a + ") − V(" + b + ")",
		Basis:   basis,
		Results: []calc.Operand{{Name: "V_th", Value: calc.Q(eq.vth, calc.DimVoltage)}},
	}
	rms := cmplx.Abs(eq.vth)
	if basis == calc.Peak {
		rms /= math.Sqrt2
	}
	if rms > elvLimit {
		vst.Cautions = calc.CautionsOf(calc.CautionMains)
	}
	eq.steps = []calc.Step{vst, zst}
	if !eq.zZero {
		eq.in = eq.vth / eq.zth
		if !finite(eq.in) {
			return nil, &NetError{Msg: "the Norton current is too large to represent", Nodes: []string{a, b}}
		}
	}
	return eq, nil
}

// shortPath reports whether a and b are joined by voltage sources and
// ideal shorts alone.
func shortPath(n *reduce.Network, a, b string) bool {
	idx := map[string]int32{a: 0, b: 1}
	for _, e := range n.Elements {
		for _, s := range []string{e.From, e.To} {
			if _, ok := idx[s]; !ok {
				idx[s] = int32(len(idx))
			}
		}
	}
	u := newUnionFind(len(idx))
	for _, e := range n.Elements {
		if e.Kind == reduce.VoltageSource || (!e.Kind.IsSource() && e.Z == 0) {
			u.union(idx[e.From], idx[e.To])
		}
	}
	return u.find(0) == u.find(1)
}

// Thevenin returns the Thevenin equivalent seen between nodes a and b: the
// open-circuit voltage V_th = V(a) − V(b) and the impedance Z_th seen into
// the network with its independent sources set to zero, found with a test
// current source. Steps show the open-circuit solve and Z_th.
//
// When Z_th is infinite (a and b joined only through current sources) the
// Thevenin form does not exist and the error says so; use Norton.
func Thevenin(n *reduce.Network, a, b string, basis calc.Basis) (vth, zth complex128, steps []calc.Step, err error) {
	return TheveninContext(context.Background(), n, a, b, basis)
}

// TheveninContext is Thevenin under ctx: its solutions poll ctx, and when
// ctx ends before the equivalent is found it returns ctx.Err().
func TheveninContext(ctx context.Context, n *reduce.Network, a, b string, basis calc.Basis) (vth, zth complex128, steps []calc.Step, err error) {
	eq, err := twoTerminal(ctx, n, a, b, basis)
	if err != nil {
		return 0, 0, nil, err
	}
	if eq.zInf {
		return 0, 0, nil, &NetError{
			Msg:   fmt.Sprintf("between %s and %s the network is an ideal current source (Z_th infinite): only the Norton form exists, I_N = %s", a, b, calc.Format{}.Polar(calc.Q(eq.in, calc.DimCurrent))),
			Nodes: []string{a, b},
		}
	}
	return eq.vth, eq.zth, eq.steps, nil
}

// Norton returns the Norton equivalent seen between nodes a and b: the
// current I_N that flows from a to b through a short joined between them,
// in parallel with the admittance Y_N = 1/Z_th. I_N = V_th/Z_th unless Z_th
// is infinite, when I_N comes from a short-circuit solve and Y_N is 0.
//
// When Z_th is 0 (a and b joined by voltage sources and shorts only) the
// Norton form does not exist and the error says so; use Thevenin.
func Norton(n *reduce.Network, a, b string, basis calc.Basis) (in, yn complex128, steps []calc.Step, err error) {
	return NortonContext(context.Background(), n, a, b, basis)
}

// NortonContext is Norton under ctx: its solutions poll ctx, and when ctx
// ends before the equivalent is found it returns ctx.Err().
func NortonContext(ctx context.Context, n *reduce.Network, a, b string, basis calc.Basis) (in, yn complex128, steps []calc.Step, err error) {
	eq, err := twoTerminal(ctx, n, a, b, basis)
	if err != nil {
		return 0, 0, nil, err
	}
	if eq.zZero {
		return 0, 0, nil, &NetError{
			Msg:   fmt.Sprintf("between %s and %s the network is an ideal voltage source (Z_th = 0): only the Thevenin form exists, V_th = %s", a, b, calc.Format{}.Polar(calc.Q(eq.vth, calc.DimVoltage))),
			Nodes: []string{a, b},
		}
	}
	if eq.zInf {
		return eq.in, 0, eq.steps, nil
	}
	yn = 1 / eq.zth
	if !finite(yn) {
		return 0, 0, nil, &NetError{Msg: "the Norton admittance is too large to represent", Nodes: []string{a, b}}
	}
	st := calc.Step{
		Kind:    "thevenin",
		Rule:    "Norton current and admittance from the Thevenin equivalent",
		Formula: "I_N = V_th / Z_th,  Y_N = 1 / Z_th",
		Basis:   basis,
		Inputs: []calc.Operand{
			{Name: "V_th", Value: calc.Q(eq.vth, calc.DimVoltage)},
			{Name: "Z_th", Value: calc.Q(eq.zth, calc.DimImpedance)},
		},
		Results: []calc.Operand{
			{Name: "I_N", Value: calc.Q(eq.in, calc.DimCurrent)},
			{Name: "Y_N", Value: calc.Q(yn, calc.DimAdmittance)},
		},
	}
	return eq.in, yn, append(eq.steps, st), nil
}
