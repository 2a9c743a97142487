package calc

import "testing"

type testEnv struct {
	names map[string]Quantity
	ctx   Context
}

func (e *testEnv) Lookup(n string) (Quantity, bool) { q, ok := e.names[n]; return q, ok }
func (e *testEnv) Func(n string) (*Func, bool)      { return nil, false }
func (e *testEnv) Context() *Context                { return &e.ctx }

func evalString(t testing.TB, src string) (Quantity, *Error) {
	t.Helper()
	x, err := ParseExpr(src, 1)
	if err != nil {
		return Quantity{}, err
	}
	ev := &Evaluator{Env: &testEnv{ctx: Context{Freq: 50}}, Src: src, Line: 1}
	r, err := ev.Eval(x)
	return r.Value, err
}

func TestQuick(t *testing.T) {
	f := Format{}
	for _, s := range []string{"3+j4", "3+j4 ohm", "3-j4 kΩ", "230∠-30° V", "230∠-30 V", "230 V∠-30", "10 mH", "zl(10 mH)", "zc(100 nF)",
		"50 Hz * 10 mH", "1/0", "j10 || -j10", "0 || 5 ohm", "2^-1", "sqrt(-4)", "(3+j4)^2", "10 V / 2 ohm", "230 V * 10 A", "1e308*1e308", "5∠", "((1)", "10 m", "4.7 kohm", "314 rad/s", "3 + j4 ohm", "1 mS", "1 ms", "x", "sin(30)", "10 Ω/km", "12 V∠90"} {
		q, err := evalString(t, s)
		if err != nil {
			t.Logf("%-16s -> error col %d len %d: %s", s, err.Col, err.Len, err.Msg)
			continue
		}
		t.Logf("%-16s -> %s", s, f.Both(q, false))
	}
}
