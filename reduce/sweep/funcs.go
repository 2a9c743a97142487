package sweep

import (
	"fmt"

	"argand/calc"
)

// Funcs returns the resonance and gain functions of the expression
// language. The sweep itself is driven by the worksheet interpreter
// through Points and Run.
func Funcs() []calc.Func {
	return []calc.Func{
		{
			Name: "resonance", Params: []calc.Param{{Name: "L", Kind: calc.ParamInductance}, {Name: "C", Kind: calc.ParamCapacitance}}, Args: "(L, C)", Min: 2, Max: 2,
			Doc:     "resonant frequency of L and C in Hz; .w0 in rad/s",
			Formula: "f0 = 1/(2π·√(L·C))",
			Call:    callResonance,
		},
		{
			Name: "qseries", Params: []calc.Param{{Name: "R", Kind: calc.ParamResistance}, {Name: "L", Kind: calc.ParamInductance}, {Name: "C", Kind: calc.ParamCapacitance}}, Args: "(R, L, C)", Min: 3, Max: 3,
			Doc:     "quality factor of a series RLC circuit",
			Formula: "Q = (1/R)·√(L/C)",
			Call:    callQ(SeriesQ),
		},
		{
			Name: "qparallel", Params: []calc.Param{{Name: "R", Kind: calc.ParamResistance}, {Name: "L", Kind: calc.ParamInductance}, {Name: "C", Kind: calc.ParamCapacitance}}, Args: "(R, L, C)", Min: 3, Max: 3,
			Doc:     "quality factor of a parallel RLC circuit",
			Formula: "Q = R·√(C/L)",
			Call:    callQ(ParallelQ),
		},
		{
			Name: "bandwidth", Params: []calc.Param{{Name: "f0", Kind: calc.ParamFrequency}, {Name: "Q", Kind: calc.ParamRatio}}, Args: "(f0, Q)", Min: 2, Max: 2,
			Doc:     "−3 dB bandwidth of a resonance (f0 in Hz or rad/s); .f1, .f2 the half-power frequencies",
			Formula: "B = f0/Q;  f1 = f0·(√(1 + 1/(4Q²)) − 1/(2Q));  f2 = f0·(√(1 + 1/(4Q²)) + 1/(2Q))",
			Call:    callBandwidth,
		},
		{
			Name: "tank", Params: []calc.Param{{Name: "L", Kind: calc.ParamInductance}, {Name: "r", Kind: calc.ParamResistance}, {Name: "C", Kind: calc.ParamCapacitance}}, Args: "(L, r, C)", Min: 3, Max: 3,
			Doc:     "unity-power-factor frequency of C in parallel with L whose series resistance is r; .f0 = 1/(2π√(LC)), .z the impedance there",
			Formula: "f = f0·√(1 − r²·C/L);  Z = L/(r·C)",
			Call:    callTank,
		},
		{
			Name: "db", Params: []calc.Param{{Name: "H", Kind: calc.ParamNumber}}, Args: "(H)", Min: 1, Max: 1,
			Doc:     "gain in dB of a ratio H",
			Formula: "gain = 20·log10|H|",
			Call:    callDB,
		},
		{
			Name: "transfer", Params: []calc.Param{{Name: "Vout", Kind: calc.ParamAny}, {Name: "Vin", Kind: calc.ParamAny}}, Args: "(Vout, Vin)", Min: 2, Max: 2,
			Doc:     "transfer ratio H = Vout/Vin; .db the gain in dB (absent when the output is zero)",
			Formula: "H = Vout/Vin;  gain = 20·log10|H|",
			Call:    callTransfer,
		},
	}
}

func quantities(args []calc.Arg, names ...string) ([]calc.Quantity, error) {
	if len(args) != len(names) {
		return nil, fmt.Errorf("expected %d arguments, got %d", len(names), len(args))
	}
	q := make([]calc.Quantity, len(args))
	for i, a := range args {
		if a.Word != "" {
			return nil, fmt.Errorf("%s: expected a value, not the word %q", names[i], a.Word)
		}
		q[i] = a.Q
	}
	return q, nil
}

func callResonance(_ *calc.Context, args []calc.Arg) (calc.Result, error) {
	q, err := quantities(args, "L", "C")
	if err != nil {
		return calc.Result{}, err
	}
	f0, w0, steps, err := Resonance(q[0], q[1])
	if err != nil {
		return calc.Result{}, err
	}
	return calc.Result{Value: f0, Extra: []calc.Operand{op("w0", w0)}, Steps: steps}, nil
}

func callQ(fn func(r, l, c calc.Quantity) (calc.Quantity, []calc.Step, error)) func(*calc.Context, []calc.Arg) (calc.Result, error) {
	return func(_ *calc.Context, args []calc.Arg) (calc.Result, error) {
		q, err := quantities(args, "R", "L", "C")
		if err != nil {
			return calc.Result{}, err
		}
		v, steps, err := fn(q[0], q[1], q[2])
		if err != nil {
			return calc.Result{}, err
		}
		return calc.Result{Value: v, Steps: steps}, nil
	}
}

func callBandwidth(_ *calc.Context, args []calc.Arg) (calc.Result, error) {
	q, err := quantities(args, "f0", "Q")
	if err != nil {
		return calc.Result{}, err
	}
	b, steps, err := Bandwidth(q[0], q[1])
	if err != nil {
		return calc.Result{}, err
	}
	return calc.Result{Value: b.B, Extra: []calc.Operand{op("f1", b.F1), op("f2", b.F2)}, Steps: steps}, nil
}

func callTank(_ *calc.Context, args []calc.Arg) (calc.Result, error) {
	q, err := quantities(args, "L", "r", "C")
	if err != nil {
		return calc.Result{}, err
	}
	t, steps, err := SolveTank(q[0], q[1], q[2])
	if err != nil {
		return calc.Result{}, err
	}
	if !t.HasUnity {
		return calc.Result{}, fmt.Errorf("no unity-power-factor frequency exists: r²·C/L ≥ 1 (f0 = 1/(2π√(LC)) = %s)",
			calc.Format{}.Mag(real(t.F0.V), calc.DimFrequency, calc.KindPlain))
	}
	extra := []calc.Operand{op("f0", t.F0)}
	if t.HasDynamic {
		extra = append(extra, op("z", t.Dynamic))
	}
	return calc.Result{Value: t.Unity, Extra: extra, Steps: steps, Notes: steps[0].Notes}, nil
}

func callDB(_ *calc.Context, args []calc.Arg) (calc.Result, error) {
	q, err := quantities(args, "H")
	if err != nil {
		return calc.Result{}, err
	}
	g, steps, err := Gain(q[0])
	if err != nil {
		return calc.Result{}, err
	}
	return calc.Result{Value: g, Steps: steps}, nil
}

func callTransfer(_ *calc.Context, args []calc.Arg) (calc.Result, error) {
	q, err := quantities(args, "Vout", "Vin")
	if err != nil {
		return calc.Result{}, err
	}
	t, steps, err := Ratio(q[0], q[1])
	if err != nil {
		return calc.Result{}, err
	}
	r := calc.Result{Value: t.H, Steps: steps, Notes: steps[0].Notes}
	if t.HasDB {
		r.Extra = []calc.Operand{op("db", t.DB)}
	}
	return r, nil
}
