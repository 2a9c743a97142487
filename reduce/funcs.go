package reduce

import (
	"fmt"

	"argand/calc"
)

// Funcs returns the circuit operations of this package as functions of the
// worksheet expression language. Each call's result carries the steps of
// the operation it runs.
func Funcs() []calc.Func {
	return []calc.Func{
		{
			Name: "series", Params: []calc.Param{{Name: "Z", Kind: calc.ParamImpedanceOrAdmittance}}, Args: "(Z1, Z2, ...)",
			Doc: "impedances in series (or admittances in series, all in S)",
			Min: 2, Max: -1,
			Formula: "Z = Z₁ + Z₂ + …",
			Call:    callList(Series),
		},
		{
			Name: "parallel", Params: []calc.Param{{Name: "Z", Kind: calc.ParamImpedanceOrAdmittance}}, Args: "(Z1, Z2, ...)",
			Doc: "impedances in parallel (or admittances in parallel, all in S); 0 Ω shorts the group, cancelling admittances are an open circuit",
			Min: 2, Max: -1,
			Formula: "Z = Z₁·Z₂/(Z₁+Z₂);  Z = 1/(1/Z₁ + 1/Z₂ + …)",
			Call:    callList(Parallel),
		},
		{
			Name: "admittance", Params: []calc.Param{{Name: "Z", Kind: calc.ParamImpedanceOrAdmittance}}, Args: "(Z)",
			Doc: "admittance of an impedance",
			Min: 1, Max: 1,
			Formula: "Y = 1/Z",
			Call: func(_ *calc.Context, args []calc.Arg) (calc.Result, error) {
				if err := need("admittance", args, 1); err != nil {
					return calc.Result{}, err
				}
				q, steps, err := ToAdmittance(operand(args[0]))
				if err != nil {
					return calc.Result{}, err
				}
				return calc.Result{Value: q, Steps: steps}, nil
			},
		},
		{
			Name: "vdiv", Params: []calc.Param{{Name: "V", Kind: calc.ParamVoltage}, {Name: "Zk", Kind: calc.ParamImpedanceOrAdmittance}, {Name: "Z", Kind: calc.ParamImpedanceOrAdmittance}}, Args: "(V, Zk, Z2, ...)",
			Doc: "voltage across Zk in a series string Zk, Z2, ... fed by V",
			Min: 3, Max: -1,
			Formula: "V_k = V·Z_k/ΣZ",
			Call: func(_ *calc.Context, args []calc.Arg) (calc.Result, error) {
				if err := need("vdiv", args, 3); err != nil {
					return calc.Result{}, err
				}
				ops := operands(args)
				q, steps, err := VoltageDivider(ops[0], ops[1], ops[2:]...)
				if err != nil {
					return calc.Result{}, err
				}
				return calc.Result{Value: q, Steps: steps}, nil
			},
		},
		{
			Name: "idiv", Params: []calc.Param{{Name: "I", Kind: calc.ParamCurrent}, {Name: "Zk", Kind: calc.ParamImpedanceOrAdmittance}, {Name: "Z", Kind: calc.ParamImpedanceOrAdmittance}}, Args: "(I, Zk, Z2, ...)",
			Doc: "current in branch Zk of a parallel group Zk, Z2, ... fed by I; give the branches all as impedances (Ω) or all as admittances (S)",
			Min: 3, Max: -1,
			Formula: "I_k = I·Y_k/ΣY",
			Call: func(_ *calc.Context, args []calc.Arg) (calc.Result, error) {
				if err := need("idiv", args, 3); err != nil {
					return calc.Result{}, err
				}
				ops := operands(args)
				q, steps, err := CurrentDivider(ops[0], ops[1], ops[2:]...)
				if err != nil {
					return calc.Result{}, err
				}
				return calc.Result{Value: q, Steps: steps}, nil
			},
		},
		{
			Name: "thevenin", Params: []calc.Param{{Name: "V", Kind: calc.ParamVoltage}, {Name: "Zseries", Kind: calc.ParamImpedanceOrAdmittance}, {Name: "Zshunt", Kind: calc.ParamImpedanceOrAdmittance}}, Args: "(V, Zseries, Zshunt)",
			Doc: "Thevenin voltage across Zshunt of a source V feeding Zseries then Zshunt; .z is Z_th, .i the Norton current",
			Min: 3, Max: 3,
			Formula: "V_th = V·Z₂/(Z₁+Z₂), Z_th = Z₁‖Z₂, I_N = V/Z₁",
			Call: func(_ *calc.Context, args []calc.Arg) (calc.Result, error) {
				if err := need("thevenin", args, 3); err != nil {
					return calc.Result{}, err
				}
				ops := operands(args)
				eq, steps, err := Thevenin(ops[0], ops[1], ops[2])
				if err != nil {
					return calc.Result{}, err
				}
				res := calc.Result{Value: eq.V, Steps: steps, Extra: []calc.Operand{{Name: "z", Value: eq.Z}}}
				if eq.NoNorton {
					res.Notes = []string{"Z_th = 0: an ideal voltage source, which has no Norton form, so there is no .i"}
				} else {
					res.Extra = append(res.Extra, calc.Operand{Name: "i", Value: eq.I})
				}
				return res, nil
			},
		},
		{
			Name: "norton", Params: []calc.Param{{Name: "Vth", Kind: calc.ParamVoltage}, {Name: "Zth", Kind: calc.ParamImpedanceOrAdmittance}}, Args: "(Vth, Zth)",
			Doc: "Norton current of a Thevenin source (Zth in Ω or as an admittance in S); .y is Y_N, .z is Z_N",
			Min: 2, Max: 2,
			Formula: "I_N = V_th/Z_th, Y_N = 1/Z_th",
			Call: func(_ *calc.Context, args []calc.Arg) (calc.Result, error) {
				if err := need("norton", args, 2); err != nil {
					return calc.Result{}, err
				}
				ops := operands(args)
				eq, steps, err := TheveninToNorton(ops[0], ops[1])
				if err != nil {
					return calc.Result{}, err
				}
				return calc.Result{Value: eq.I, Steps: steps,
					Extra: []calc.Operand{{Name: "y", Value: eq.Y}, {Name: "z", Value: eq.Z}}}, nil
			},
		},
		{
			Name: "delta2y", Params: []calc.Param{{Name: "Zab", Kind: calc.ParamImpedanceOrAdmittance}, {Name: "Zbc", Kind: calc.ParamImpedanceOrAdmittance}, {Name: "Zca", Kind: calc.ParamImpedanceOrAdmittance}}, Args: "(Zab, Zbc, Zca)",
			Doc: "Y arms of a Δ of sides Zab, Zbc, Zca; the value is Za, with .a, .b, .c",
			Min: 3, Max: 3,
			Formula: "Z_a = Z_ab·Z_ca/ΣZ, Z_b = Z_bc·Z_ab/ΣZ, Z_c = Z_ca·Z_bc/ΣZ",
			Call: func(_ *calc.Context, args []calc.Arg) (calc.Result, error) {
				if err := need("delta2y", args, 3); err != nil {
					return calc.Result{}, err
				}
				ops := operands(args)
				a, b, c, steps, err := DeltaToY(ops[0], ops[1], ops[2])
				if err != nil {
					return calc.Result{}, err
				}
				return calc.Result{Value: a, Steps: steps,
					Extra: []calc.Operand{{Name: "a", Value: a}, {Name: "b", Value: b}, {Name: "c", Value: c}}}, nil
			},
		},
		{
			Name: "y2delta", Params: []calc.Param{{Name: "Za", Kind: calc.ParamImpedanceOrAdmittance}, {Name: "Zb", Kind: calc.ParamImpedanceOrAdmittance}, {Name: "Zc", Kind: calc.ParamImpedanceOrAdmittance}}, Args: "(Za, Zb, Zc)",
			Doc: "Δ sides of a Y of arms Za, Zb, Zc; the value is Zab, with .ab, .bc, .ca",
			Min: 3, Max: 3,
			Formula: "Z_ab = P/Z_c, Z_bc = P/Z_a, Z_ca = P/Z_b, P = Z_a·Z_b + Z_b·Z_c + Z_c·Z_a",
			Call: func(_ *calc.Context, args []calc.Arg) (calc.Result, error) {
				if err := need("y2delta", args, 3); err != nil {
					return calc.Result{}, err
				}
				ops := operands(args)
				ab, bc, ca, steps, err := YToDelta(ops[0], ops[1], ops[2])
				if err != nil {
					return calc.Result{}, err
				}
				return calc.Result{Value: ab, Steps: steps,
					Extra: []calc.Operand{{Name: "ab", Value: ab}, {Name: "bc", Value: bc}, {Name: "ca", Value: ca}}}, nil
			},
		},
	}
}

// operand names an argument by its text as written, so that the steps
// show the worksheet's own names.
func operand(a calc.Arg) calc.Operand { return calc.Operand{Name: a.Text, Value: a.Q} }

func operands(args []calc.Arg) []calc.Operand {
	out := make([]calc.Operand, len(args))
	for i, a := range args {
		out[i] = operand(a)
	}
	return out
}

func callList(f func(...calc.Operand) (calc.Quantity, []calc.Step, error)) func(*calc.Context, []calc.Arg) (calc.Result, error) {
	return func(_ *calc.Context, args []calc.Arg) (calc.Result, error) {
		if len(args) == 0 {
			return calc.Result{}, fmt.Errorf("no arguments given")
		}
		q, steps, err := f(operands(args)...)
		if err != nil {
			return calc.Result{}, err
		}
		return calc.Result{Value: q, Steps: steps}, nil
	}
}

// need guards a call made with fewer arguments than the function takes;
// the interpreter checks Min first, but Call must not fail badly if not.
func need(name string, args []calc.Arg, n int) error {
	if len(args) < n {
		return fmt.Errorf("%s needs at least %d arguments, got %d", name, n, len(args))
	}
	return nil
}
