package calc

import (
	"math"
	"math/cmplx"
	"testing"
)

// testEnv is a small environment for evaluating expressions in tests: a few
// named quantities and the working frequency.
type testEnv struct {
	names map[string]Quantity
	ctx   Context
}

func newTestEnv() *testEnv {
	return &testEnv{
		names: map[string]Quantity{
			"Z":  Q(3+4i, DimImpedance),
			"Z2": Q(10-5i, DimImpedance),
			"Vs": Q(230, DimVoltage),
			"L1": Real(10e-3, DimInductance),
			"C1": Real(1e-6, DimCapacitance),
			"fq": Real(50, DimFrequency),
		},
		ctx: Context{Freq: 50, Sequence: 1, Format: Format{Digits: DefaultDigits}},
	}
}

func (e *testEnv) Lookup(name string) (Quantity, bool) {
	switch name {
	case "f":
		return Real(e.ctx.Freq, DimFrequency), true
	case "w", "ω":
		return Real(e.ctx.Omega(), DimAngularFrequency), true
	}
	q, ok := e.names[name]
	return q, ok
}

func (e *testEnv) Func(name string) (*Func, bool) { return nil, false }
func (e *testEnv) Context() *Context              { return &e.ctx }

// evalString parses and evaluates src against env.
func evalString(env Env, src string) (Quantity, *Error) { return evalStringComma(env, src, false) }

// evalStringComma parses src with the decimal comma when comma is set and
// evaluates it against env.
func evalStringComma(env Env, src string, comma bool) (Quantity, *Error) {
	x, err := ParseExprComma(src, 1, comma)
	if err != nil {
		return Quantity{}, err
	}
	ev := &Evaluator{Env: env, Src: src, Line: 1}
	r, err := ev.Eval(x)
	if err != nil {
		return Quantity{}, err
	}
	return r.Value, nil
}

func mustEval(t *testing.T, src string) Quantity {
	t.Helper()
	q, err := evalString(newTestEnv(), src)
	if err != nil {
		t.Fatalf("%s: unexpected error %v", src, err)
	}
	return q
}

// closeC reports whether a and b agree to rel relative to the larger
// magnitude (absolute when both are tiny).
func closeC(a, b complex128, rel float64) bool {
	if a == b {
		return true
	}
	m := math.Max(cmplx.Abs(a), cmplx.Abs(b))
	if m < 1e-300 {
		return true
	}
	return cmplx.Abs(a-b) <= rel*m
}
