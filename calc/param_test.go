package calc

import (
	"strings"
	"testing"
)

// paramEnv adds one function with parameters of several kinds to the test
// environment: a made-up rating function that echoes what it got, so the
// binding of named arguments can be read back.
type paramEnv struct{ *testEnv }

var ratingFunc = Func{
	Name: "rating", Min: 3, Max: 5, Words: []string{"single", "three"},
	Params: []Param{
		{Name: "S", Kind: ParamApparentPower, Else: "for an active power use another function"},
		{Name: "V1", Kind: ParamVoltage},
		{Name: "z", Kind: ParamRatio},
		{Name: "xr", Kind: ParamRatio, Optional: true},
		{Name: "phases", Kind: ParamWord, Doc: "single|three", Optional: true},
	},
	Call: func(c *Context, args []Arg) (Result, error) {
		var texts []string
		for _, a := range args {
			if a.Word != "" {
				texts = append(texts, a.Word)
			} else {
				texts = append(texts, a.Text)
			}
		}
		return Result{Value: Number(complex(float64(len(args)), 0)), Notes: []string{strings.Join(texts, ";")}}, nil
	},
}

func (e paramEnv) Func(name string) (*Func, bool) {
	switch name {
	case "rating":
		f := ratingFunc
		return &f, true
	case "run":
		f := runFunc
		return &f, true
	case "grouped":
		f := runFunc
		f.Name, f.Gaps = "grouped", false
		return &f, true
	}
	return nil, false
}

// runFunc is a made-up function with three optional parameters that may be
// skipped (Gaps): it echoes each argument, "-" for one skipped.
var runFunc = Func{
	Name: "run", Min: 1, Max: 5, Gaps: true, Words: []string{"hot", "cold"},
	Params: []Param{
		{Name: "l", Kind: ParamLength},
		{Name: "n", Kind: ParamRatio, Optional: true},
		{Name: "theta", Kind: ParamTemperature, Optional: true},
		{Name: "state", Kind: ParamWord, Doc: "hot|cold", Optional: true},
		{Name: "r", Kind: ParamImpedance, Optional: true},
	},
	Call: func(c *Context, args []Arg) (Result, error) {
		var texts []string
		for i, a := range args {
			switch {
			case a.Absent:
				if Given(args, i) {
					return Result{}, errorf("Given(%d) for an absent argument", i)
				}
				texts = append(texts, "-")
			case a.Word != "":
				texts = append(texts, a.Word)
			default:
				texts = append(texts, a.Text)
			}
		}
		return Result{Value: Number(complex(float64(len(args)), 0)), Notes: []string{strings.Join(texts, ";")}}, nil
	},
}

// TestNamedArgumentsSkip: a call may leave out optional parameters by
// naming a later one; the function is told which were skipped and the
// arguments keep their parameters' places. A function whose optional
// parameters go together refuses the gap with the name it needs.
func TestNamedArgumentsSkip(t *testing.T) {
	tests := []struct{ src, want string }{
		{"run(10 m)", "10 m"},
		{"run(10 m, theta = 70)", "10 m;-;70"},
		{"run(theta = 70, l = 10 m)", "10 m;-;70"},
		{"run(10 m, r = 2 Ω)", "10 m;-;-;-;2 Ω"},
		{"run(10 m, 2, r = 2 Ω)", "10 m;2;-;-;2 Ω"},
		{"run(10 m, state = hot, n = 3)", "10 m;3;-;hot"},
		{"run(10 m, hot)", "10 m;-;-;hot"},
		{"run(10 m, 2, 70, cold, 1 Ω)", "10 m;2;70;cold;1 Ω"},
		{"grouped(10 m, 2, 70)", "10 m;2;70"},
		{"grouped(10 m, hot)", "10 m;hot"},
	}
	checkBound(t, tests)
	errs := []bindError{
		{"run(n = 2)", 1, "argument l (a length in m) is missing"},
		{"run(10 m, thetae = 70)", 11, `run has no parameter "thetae"; its parameters are l, n, theta, state, r`},
		{"run(10 m, theta = 1 m)", 19, "theta takes a temperature in °C (a plain number), got"},
		{"grouped(10 m, theta = 70)", 15, "grouped: theta needs n as well (give both, by name or in order)"},
	}
	checkBindErrors(t, errs)
}

// bindError is a call whose arguments cannot be bound: the column and a
// part of the message.
type bindError struct {
	src  string
	col  int
	want string
}

// checkBound checks how each call's arguments are bound (evalNotes).
func checkBound(t *testing.T, tests []struct{ src, want string }) {
	t.Helper()
	for _, tt := range tests {
		got, err := evalNotes(tt.src)
		if err != nil {
			t.Errorf("%s: %v", tt.src, err)
			continue
		}
		if got != tt.want {
			t.Errorf("%s: bound %q, want %q", tt.src, got, tt.want)
		}
	}
}

// checkBindErrors checks that each call is refused at its column with
// its message.
func checkBindErrors(t *testing.T, tests []bindError) {
	t.Helper()
	for _, tt := range tests {
		_, err := evalNotes(tt.src)
		if err == nil {
			t.Errorf("%s: no error, want %q", tt.src, tt.want)
			continue
		}
		if !strings.Contains(err.Msg, tt.want) || err.Col != tt.col {
			t.Errorf("%s: error at col %d %q, want col %d %q", tt.src, err.Col, err.Msg, tt.col, tt.want)
		}
	}
}

func evalNotes(src string) (string, *Error) {
	x, err := ParseExpr(src, 1)
	if err != nil {
		return "", err
	}
	ev := &Evaluator{Env: paramEnv{newTestEnv()}, Src: src, Line: 1}
	r, err := ev.Eval(x)
	if err != nil {
		return "", err
	}
	return strings.Join(r.Notes, "|"), nil
}

// TestNamedArguments: named arguments bind by name in any order after the
// positional ones; a bare word skips optional parameters that are not
// words. The arguments reach the function in parameter order.
func TestNamedArguments(t *testing.T) {
	tests := []struct{ src, want string }{
		{"rating(500 kVA, 11 kV, 4.5%)", "500 kVA;11 kV;4.5%"},
		{"rating(S = 500 kVA, V1 = 11 kV, z = 4.5%, xr = 6)", "500 kVA;11 kV;4.5%;6"},
		{"rating(z = 4.5%, xr = 6, V1 = 11 kV, S = 500 kVA)", "500 kVA;11 kV;4.5%;6"},
		{"rating(500 kVA, 11 kV, xr = 6, z = 4.5%)", "500 kVA;11 kV;4.5%;6"},
		{"rating(500 kVA, 11 kV, 4.5%, three)", "500 kVA;11 kV;4.5%;three"},
		{"rating(500 kVA, 11 kV, 4.5%, phases = three)", "500 kVA;11 kV;4.5%;three"},
		{"rating(V1 = 11 kV, S = 500 kVA, z = 4.5%, phases = single, xr = 6)", "500 kVA;11 kV;4.5%;6;single"},
	}
	checkBound(t, tests)
}

// TestNamedArgumentErrors: a missing, unknown or repeated name, a
// positional argument after a named one, and a wrong kind each get one
// message at the place it went wrong.
func TestNamedArgumentErrors(t *testing.T) {
	tests := []bindError{
		{"rating(S = 500 kVA, V1 = 11 kV)", 1, "argument z (a plain real number) is missing"},
		{"rating(S = 500 kVA, V1 = 11 kV, z = 4.5%, zz = 1)", 43, `no parameter "zz"; its parameters are S, V1, z, xr, phases`},
		{"rating(500 kVA, 11 kV, 4.5%, S = 1 kVA)", 30, "S is given twice"},
		{"rating(S = 500 kVA, 11 kV, 4.5%)", 21, "a positional argument cannot follow a named one"},
		{"rating(500 kW, 11 kV, 4.5%)", 8, "S takes an apparent power in VA, got an active power in W; for an active power use another function"},
		{"rating(500 kVA, 11 A, 4.5%)", 17, "V1 takes a voltage in V, got a phasor in A"},
		{"mag(z = 3 V, z = 4 V)", 14, "z is given twice"},
		{"mag(y = 3 V)", 5, `mag has no parameter "y"`},
	}
	checkBindErrors(t, tests)
}

// TestArgList: help's argument list comes from the parameters.
func TestArgList(t *testing.T) {
	f := ratingFunc
	if got, want := f.ArgList(), "(S, V1, z[, xr][, phases: single|three])"; got != want {
		t.Errorf("ArgList = %q, want %q", got, want)
	}
	for _, b := range Builtins() {
		if len(b.Params) == 0 {
			t.Errorf("built-in %s has no Params", b.Name)
		}
	}
}
