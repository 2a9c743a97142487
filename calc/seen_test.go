package calc

import (
	"math/cmplx"
	"testing"
)

// Seen hears every part of an expression once, with the value the
// evaluation used, so that a record of the work can list operands without
// evaluating them again. (Z + Z2)·2 by hand: Z + Z2 = 13 − j1 Ω.
func TestEvaluatorSeen(t *testing.T) {
	src := "(Z + Z2) * 2"
	x, perr := ParseExpr(src, 1)
	if perr != nil {
		t.Fatal(perr)
	}
	heard := map[string]int{}
	vals := map[string]complex128{}
	ev := &Evaluator{Env: newTestEnv(), Src: src, Line: 1}
	ev.Seen = func(e Expr, q Quantity) {
		pos, end, _ := e.Span()
		heard[src[pos:end]]++
		vals[src[pos:end]] = q.V
	}
	r, err := ev.Eval(x)
	if err != nil {
		t.Fatal(err)
	}
	if cmplx.Abs(r.Value.V-(26-2i)) > 1e-12 {
		t.Errorf("value %v", r.Value.V)
	}
	for part, want := range map[string]complex128{"Z": 3 + 4i, "Z2": 10 - 5i, "Z + Z2": 13 - 1i, "(Z + Z2)": 13 - 1i, "2": 2} {
		if heard[part] != 1 || vals[part] != want {
			t.Errorf("%s heard %d times, value %v, want once with %v", part, heard[part], vals[part], want)
		}
	}
}
