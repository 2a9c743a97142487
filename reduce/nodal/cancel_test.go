package nodal_test

import (
	"context"
	"errors"
	"math/cmplx"
	"reflect"
	"slices"
	"testing"
	"time"

	"argand/calc"
	"argand/reduce"
	"argand/reduce/nodal"
)

// stopAfter is a context that cancels itself at its stopAt-th poll of
// Err, so that a test stops a factorisation part way through its columns
// without depending on how fast the machine is; polls counts the calls.
type stopAfter struct {
	context.Context
	cancel        context.CancelFunc
	polls, stopAt int
}

func newStopAfter(stopAt int) *stopAfter {
	ctx, cancel := context.WithCancel(context.Background())
	return &stopAfter{Context: ctx, cancel: cancel, stopAt: stopAt}
}

func (c *stopAfter) Err() error {
	c.polls++
	if c.polls == c.stopAt {
		c.cancel()
	}
	return c.Context.Err()
}

// cloneNetwork copies n deeply enough to tell whether a solution changed
// it.
func cloneNetwork(n *reduce.Network) *reduce.Network {
	c := *n
	c.Elements = slices.Clone(n.Elements)
	return &c
}

// solveWithin runs f in a goroutine and fails the test if it has not
// returned within a minute: a stall catch, not a timing test.
func solveWithin[T any](t *testing.T, f func() T) T {
	t.Helper()
	done := make(chan T, 1)
	go func() { done <- f() }()
	select {
	case v := <-done:
		return v
	case <-time.After(time.Minute):
		t.Fatal("the solution did not return within a minute")
		panic("unreachable")
	}
}

// TestCancelFactorisation stops the factorisation of a 200×200 grid
// (40 001 unknowns) part way through its columns, first when it chooses
// pivots and then when it reuses them for new values: the solution
// returns the context's error at the first poll after the cancel, the
// network is unchanged, and the same plan then solves, its checks holding,
// and after the second stop to within 1e-12 of a fresh solution.
func TestCancelFactorisation(t *testing.T) {
	if testing.Short() {
		t.Skip("a 40 001-unknown factorisation")
	}
	n := grid(200, 200)
	before := cloneNetwork(n)
	p, err := nodal.Analyse(n)
	if err != nil {
		t.Fatal(err)
	}
	type result struct {
		s   *nodal.Solution
		err error
	}
	stop := func(ctx *stopAfter, n *reduce.Network) {
		t.Helper()
		r := solveWithin(t, func() result {
			s, err := p.SolveContext(ctx, n, calc.RMS)
			return result{s, err}
		})
		if !errors.Is(r.err, context.Canceled) || r.s != nil {
			t.Fatalf("stopped solution: %v, %v; want context.Canceled", r.s, r.err)
		}
		if ctx.polls != ctx.stopAt {
			t.Errorf("%d polls of the context; want the solution to stop at poll %d, the one that cancelled it", ctx.polls, ctx.stopAt)
		}
	}
	check := func(got, want *nodal.Solution) {
		t.Helper()
		diff, size := 0.0, 0.0
		for name, v := range want.Voltage {
			diff = max(diff, cmplx.Abs(got.Voltage[name]-v))
			size = max(size, cmplx.Abs(v))
		}
		if diff > 1e-12*size {
			t.Errorf("after the stop the plan solves to within %g of a fresh solution", diff/size)
		}
	}

	// 40 001 columns are polled 626 times; stop at the 200th poll.
	stop(newStopAfter(200), n)
	if !reflect.DeepEqual(n, before) {
		t.Error("the network changed")
	}
	st := p.Stats()
	if st.Factorisations != 0 || st.Solves != 0 {
		t.Errorf("a stopped factorisation counted: %+v", st)
	}
	got, err := p.Solve(n, calc.RMS)
	if err != nil {
		t.Fatal(err)
	}
	checkBalance(t, got)

	// Now with the pivots kept: other values, stopped while refactorising.
	m := cloneNetwork(n)
	for k := range m.Elements {
		if !m.Elements[k].Kind.IsSource() {
			m.Elements[k].Z *= complex(1.5, 0.1)
		}
	}
	mBefore := cloneNetwork(m)
	st = p.Stats()
	stop(newStopAfter(300), m)
	if !reflect.DeepEqual(m, mBefore) {
		t.Error("the network changed")
	}
	if p.Stats() != st {
		t.Errorf("a stopped refactorisation counted: %+v, before %+v", p.Stats(), st)
	}
	if got, err = p.Solve(m, calc.RMS); err != nil {
		t.Fatal(err)
	}
	if after := p.Stats(); after.Refactorisations != st.Refactorisations+1 || after.Repivots != st.Repivots {
		t.Errorf("the solution after the stop did not refactorise on the kept pivots: %+v, before %+v", after, st)
	}
	want, err := nodal.Solve(m, calc.RMS)
	if err != nil {
		t.Fatal(err)
	}
	check(got, want)
}

// TestCancelBeforeStart: a context already ended stops the solution at
// its first poll, before any column is factorised.
func TestCancelBeforeStart(t *testing.T) {
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	n := grid(10, 10)
	if _, err := nodal.SolveContext(ctx, n, calc.RMS); !errors.Is(err, context.Canceled) {
		t.Fatalf("got %v, want context.Canceled", err)
	}
	if _, err := nodal.SolveContext(context.Background(), n, calc.RMS); err != nil {
		t.Fatal(err)
	}
}

// TestEquivalentStops: a Thevenin or Norton equivalent of a large network
// stops when its context ends part way through a factorisation, with the
// context's error, however many solutions it has still to make.
func TestEquivalentStops(t *testing.T) {
	n, err := nodal.GridRLC(120, 120).At(50)
	if err != nil {
		t.Fatal(err)
	}
	for name, f := range map[string]func(ctx context.Context) error{
		"thevenin": func(ctx context.Context) error {
			_, _, _, err := nodal.TheveninContext(ctx, n, "q60_60", "0", calc.RMS)
			return err
		},
		"norton": func(ctx context.Context) error {
			_, _, _, err := nodal.NortonContext(ctx, n, "q60_60", "0", calc.RMS)
			return err
		},
	} {
		ctx := newStopAfter(3)
		err := solveWithin(t, func() error { return f(ctx) })
		if !errors.Is(err, context.Canceled) {
			t.Errorf("%s: %v, want the context's error", name, err)
		}
		if ctx.polls != 3 {
			t.Errorf("%s: %d polls after the stop at the 3rd", name, ctx.polls)
		}
		// and with a context that never ends, the same call succeeds
		if err := f(context.Background()); err != nil {
			t.Errorf("%s: %v", name, err)
		}
	}
}
