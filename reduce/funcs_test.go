package reduce

import (
	"strings"
	"testing"

	"argand/calc"
)

func arg(text string, v complex128, d calc.Dim) calc.Arg {
	return calc.Arg{Text: text, Q: calc.Q(v, d)}
}

func TestFuncs(t *testing.T) {
	fs := map[string]calc.Func{}
	for _, f := range Funcs() {
		if f.Doc == "" || f.Args == "" || f.Formula == "" || f.Call == nil || f.Min < 1 {
			t.Errorf("%s: incomplete", f.Name)
		}
		fs[f.Name] = f
	}
	om := calc.DimImpedance
	ctx := &calc.Context{Freq: 50}
	tests := []struct {
		name  string
		args  []calc.Arg
		want  complex128
		dim   calc.Dim
		extra map[string]complex128
		kind  string
	}{
		// hand-checked values (common practice)
		{"series", []calc.Arg{arg("R", 3, om), arg("X", 4i, om)}, 3 + 4i, om, nil, "series"},
		{"parallel", []calc.Arg{arg("R1", 3, om), arg("R2", 6, om)}, 2, om, nil, "parallel"},
		{"parallel", []calc.Arg{arg("Y1", 0.1, calc.DimAdmittance), arg("Y2", 0.2, calc.DimAdmittance)}, 0.3, calc.DimAdmittance, nil, "parallel"},
		{"admittance", []calc.Arg{arg("Z", 3+4i, om)}, 0.12 - 0.16i, calc.DimAdmittance, nil, "admittance"},
		{"vdiv", []calc.Arg{arg("V", 120, calc.DimVoltage), arg("R1", 30, om), arg("R2", 90, om)}, 30, calc.DimVoltage, nil, "divider"},
		{"idiv", []calc.Arg{arg("I", 6, calc.DimCurrent), arg("R1", 10, om), arg("R2", 20, om)}, 4, calc.DimCurrent, nil, "current-divider"},
		{"idiv", []calc.Arg{arg("I", 6, calc.DimCurrent), arg("G1", 0.1, calc.DimAdmittance), arg("G2", 0.05, calc.DimAdmittance)}, 4, calc.DimCurrent, nil, "current-divider"},
		{"thevenin", []calc.Arg{arg("V", 12, calc.DimVoltage), arg("R1", 4, om), arg("R2", 12, om)}, 9, calc.DimVoltage, map[string]complex128{"z": 3, "i": 3}, "thevenin"},
		{"norton", []calc.Arg{arg("Vth", 9, calc.DimVoltage), arg("Zth", 3, om)}, 3, calc.DimCurrent, map[string]complex128{"z": 3, "y": 1.0 / 3}, "norton"},
		{"delta2y", []calc.Arg{arg("Zab", 10, om), arg("Zbc", 20, om), arg("Zca", 30, om)}, 5, om, map[string]complex128{"a": 5, "b": 10.0 / 3, "c": 10}, "delta-y"},
		{"y2delta", []calc.Arg{arg("Za", 5, om), arg("Zb", 10.0/3, om), arg("Zc", 10, om)}, 10, om, map[string]complex128{"ab": 10, "bc": 20, "ca": 30}, "y-delta"},
	}
	for _, tc := range tests {
		f, ok := fs[tc.name]
		if !ok {
			t.Errorf("%s: missing", tc.name)
			continue
		}
		res, err := f.Call(ctx, tc.args)
		if err != nil {
			t.Errorf("%s: %v", tc.name, err)
			continue
		}
		if res.Value.Dim != tc.dim || !close(res.Value.V, tc.want) {
			t.Errorf("%s: %v %v, want %v", tc.name, res.Value.V, res.Value.Dim, tc.want)
		}
		got := map[string]complex128{}
		for _, e := range res.Extra {
			got[e.Name] = e.Value.V
		}
		for k, v := range tc.extra {
			if g, ok := got[k]; !ok || !close(g, v) {
				t.Errorf("%s.%s = %v, want %v", tc.name, k, g, v)
			}
		}
		if len(res.Steps) == 0 || res.Steps[0].Kind != tc.kind {
			t.Errorf("%s: steps %+v", tc.name, res.Steps)
			continue
		}
		// the steps name the arguments as written
		if res.Steps[0].Inputs[0].Name != tc.args[0].Text {
			t.Errorf("%s: first input named %q, want %q", tc.name, res.Steps[0].Inputs[0].Name, tc.args[0].Text)
		}
	}
}

func TestFuncErrors(t *testing.T) {
	fs := map[string]calc.Func{}
	for _, f := range Funcs() {
		fs[f.Name] = f
	}
	om := calc.DimImpedance
	tests := []struct {
		name string
		args []calc.Arg
		want string
	}{
		{"series", []calc.Arg{arg("V", 1, calc.DimVoltage), arg("R", 1, om)}, "impedance (Ω) or an admittance (S)"},
		{"parallel", []calc.Arg{arg("L", 10i, om), arg("C", -10i, om)}, "open circuit"},
		{"vdiv", []calc.Arg{arg("V", 1, calc.DimVoltage), arg("L", 5i, om), arg("C", -5i, om)}, "series resonance"},
		{"norton", []calc.Arg{arg("V", 1, calc.DimVoltage), arg("Z", 0, om)}, "no Norton form"},
		{"norton", []calc.Arg{arg("I", 1, calc.DimCurrent), arg("Z", 1, om)}, "a voltage (V) is needed"},
		{"thevenin", []calc.Arg{arg("V", 1, calc.DimVoltage)}, "needs at least 3"},
		{"idiv", []calc.Arg{arg("I", 1, calc.DimCurrent), arg("Z", 1, om), arg("Y", 1, calc.DimAdmittance)}, "all of them in Ω or all in S"},
		{"y2delta", []calc.Arg{arg("Za", 0, om), arg("Zb", 1, om), arg("Zc", 1, om)}, "open"},
		{"admittance", nil, "needs at least 1"},
	}
	for _, tc := range tests {
		_, err := fs[tc.name].Call(&calc.Context{Freq: 50}, tc.args)
		if err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("%s%v: %v, want %q", tc.name, tc.args, err, tc.want)
		}
	}
	// thevenin of an ideal source says there is no Norton current
	res, err := fs["thevenin"].Call(&calc.Context{Freq: 50}, []calc.Arg{arg("V", 10, calc.DimVoltage), arg("Z1", 0, om), arg("Z2", 5, om)})
	if err != nil || len(res.Notes) == 0 || !strings.Contains(res.Notes[0], "no Norton form") {
		t.Errorf("ideal source: %+v %v", res, err)
	}
}
