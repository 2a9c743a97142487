package threephase

import (
	"fmt"

	"argand/calc"
)

// Funcs returns the three-phase functions of the expression language. They
// read the phase sequence and the basis from the context.
func Funcs() []calc.Func {
	return []calc.Func{
		{
			Name: "line2phase", Params: []calc.Param{{Name: "X", Kind: calc.ParamVoltageOrCurrent}, {Name: "conn", Kind: calc.ParamWord, Doc: "wye|delta"}},
			Args:    "(X, wye|delta)",
			Doc:     "phase voltage or current of a balanced set from the line value (angle kept; sequence from the setting)",
			Min:     2,
			Max:     2,
			Words:   []string{"wye", "delta"},
			Formula: "ABC: V_an = V_ab/(√3∠30°) in Y, I_ab = I_a/(√3∠−30°) in Δ; ACB: the angles change sign",
			Call:    callConvert(false),
		},
		{
			Name: "phase2line", Params: []calc.Param{{Name: "X", Kind: calc.ParamVoltageOrCurrent}, {Name: "conn", Kind: calc.ParamWord, Doc: "wye|delta"}},
			Args:    "(X, wye|delta)",
			Doc:     "line voltage or current of a balanced set from the phase value (angle kept; sequence from the setting)",
			Min:     2,
			Max:     2,
			Words:   []string{"wye", "delta"},
			Formula: "ABC: V_ab = √3·V_an∠30° in Y, I_a = √3·I_ab∠−30° in Δ; ACB: the angles change sign",
			Call:    callConvert(true),
		},
		{
			Name: "seq", Params: []calc.Param{{Name: "Xa", Kind: calc.ParamAny}, {Name: "Xb", Kind: calc.ParamAny}, {Name: "Xc", Kind: calc.ParamAny}},
			Args:    "(Xa, Xb, Xc)",
			Doc:     "symmetrical components of three phasors: value is the positive sequence; .zero, .pos, .neg",
			Min:     3,
			Max:     3,
			Formula: "X0 = (Xa+Xb+Xc)/3;  X1 = (Xa+a·Xb+a²·Xc)/3;  X2 = (Xa+a²·Xb+a·Xc)/3;  a = 1∠120°",
			Call:    callSeq,
		},
		{
			Name: "phases", Params: []calc.Param{{Name: "X0", Kind: calc.ParamAny}, {Name: "X1", Kind: calc.ParamAny}, {Name: "X2", Kind: calc.ParamAny}},
			Args:    "(X0, X1, X2)",
			Doc:     "phase phasors from zero, positive and negative sequence components: value is phase a; .a, .b, .c",
			Min:     3,
			Max:     3,
			Formula: "Xa = X0+X1+X2;  Xb = X0+a²·X1+a·X2;  Xc = X0+a·X1+a²·X2",
			Call:    callPhases,
		},
		{
			Name: "wye", Params: []calc.Param{{Name: "Vph", Kind: calc.ParamVoltage}, {Name: "Za", Kind: calc.ParamImpedanceOrAdmittance}, {Name: "Zb", Kind: calc.ParamImpedanceOrAdmittance}, {Name: "Zc", Kind: calc.ParamImpedanceOrAdmittance}, {Name: "neutral", Kind: calc.ParamWord, Doc: "neutral|floating"}},
			Args:    "(Vph, Za, Zb, Zc, neutral|floating)",
			Doc:     "unbalanced Y load on a balanced supply of phase voltage Vph: value is the neutral current (neutral) or the neutral-point shift (floating); .ia, .ib, .ic, .in, .vshift, .va, .vb, .vc, .s",
			Min:     5,
			Max:     5,
			Words:   []string{"neutral", "floating"},
			Formula: "neutral: I_k = V_kN/Z_k, I_N = ΣI_k;  floating: V_nN = ΣV_kN·Y_k/ΣY_k, I_k = (V_kN − V_nN)/Z_k",
			Call:    callWye,
		},
		{
			Name: "delta", Params: []calc.Param{{Name: "Vline", Kind: calc.ParamVoltage}, {Name: "Zab", Kind: calc.ParamImpedanceOrAdmittance}, {Name: "Zbc", Kind: calc.ParamImpedanceOrAdmittance}, {Name: "Zca", Kind: calc.ParamImpedanceOrAdmittance}},
			Args:    "(Vline, Zab, Zbc, Zca)",
			Doc:     "unbalanced Δ load on a balanced supply of line voltage Vline: value is I_a; .iab, .ibc, .ica, .ia, .ib, .ic, .s",
			Min:     4,
			Max:     4,
			Formula: "I_ab = V_ab/Z_ab ...;  I_a = I_ab − I_ca, I_b = I_bc − I_ab, I_c = I_ca − I_bc",
			Call:    callDelta,
		},
		{
			Name: "balanced", Params: []calc.Param{{Name: "Vline", Kind: calc.ParamVoltage}, {Name: "Zph", Kind: calc.ParamImpedanceOrAdmittance}, {Name: "conn", Kind: calc.ParamWord, Doc: "wye|delta"}},
			Args:    "(Vline, Zph, wye|delta)",
			Doc:     "balanced load of phase impedance Zph: value is the total complex power; .p, .q, .s, .il, .iph, .vph, .zy",
			Min:     3,
			Max:     3,
			Words:   []string{"wye", "delta"},
			Formula: "S = 3·V_ph·I_ph* (RMS; ½ of that for peak)",
			Call:    callBalanced,
		},
		{
			Name: "wattmeters", Params: []calc.Param{{Name: "Vline", Kind: calc.ParamVoltage}, {Name: "Iline", Kind: calc.ParamCurrent}, {Name: "pf", Kind: calc.ParamRatio}, {Name: "sense", Kind: calc.ParamWord, Doc: "lagging|leading"}},
			Args:    "(Vline, Iline, pf, lagging|leading)",
			Doc:     "two-wattmeter readings of a balanced load (current coils in lines a and b, voltage coils to line c): value is W1; .w1, .w2",
			Min:     4,
			Max:     4,
			Words:   []string{"lagging", "leading"},
			Formula: "W1 = V_L·I_L·cos(φ − 30°), W2 = V_L·I_L·cos(φ + 30°)  (ABC; the 30° shifts swap for ACB)",
			Call:    callWattmeters,
		},
		{
			Name: "fromwattmeters", Params: []calc.Param{{Name: "W1", Kind: calc.ParamActivePower}, {Name: "W2", Kind: calc.ParamActivePower}},
			Args:    "(W1, W2)",
			Doc:     "power of a balanced load from two wattmeter readings (wiring as for wattmeters): value is P; .p, .q, .s, .pf",
			Min:     2,
			Max:     2,
			Formula: "P = W1 + W2;  Q = √3·(W1 − W2)  (ABC; sign flips for ACB)",
			Call:    callFromWattmeters,
		},
	}
}

func basisOf(c *calc.Context) calc.Basis {
	if c == nil {
		return calc.RMS
	}
	return c.Basis
}

// quantity returns argument i as a quantity, refusing a bare word.
func quantity(args []calc.Arg, i int, what string) (calc.Quantity, error) {
	if i >= len(args) {
		return calc.Quantity{}, fmt.Errorf("missing %s", what)
	}
	if args[i].Word != "" {
		return calc.Quantity{}, fmt.Errorf("%s: expected a value, not the word %q", what, args[i].Word)
	}
	return args[i].Q, nil
}

// word returns argument i as one of two words: true for the first.
func word(args []calc.Arg, i int, first, second string) (bool, error) {
	if i >= len(args) {
		return false, fmt.Errorf("missing %s or %s", first, second)
	}
	switch args[i].Word {
	case first:
		return true, nil
	case second:
		return false, nil
	}
	return false, fmt.Errorf("argument %d must be the word %s or %s, not %q", i+1, first, second, args[i].Text)
}

func connection(args []calc.Arg, i int) (Connection, error) {
	wye, err := word(args, i, "wye", "delta")
	if err != nil {
		return Wye, err
	}
	if wye {
		return Wye, nil
	}
	return Delta, nil
}

func callConvert(toLine bool) func(*calc.Context, []calc.Arg) (calc.Result, error) {
	return func(c *calc.Context, args []calc.Arg) (calc.Result, error) {
		x, err := quantity(args, 0, "the line or phase value")
		if err != nil {
			return calc.Result{}, err
		}
		conn, err := connection(args, 1)
		if err != nil {
			return calc.Result{}, err
		}
		var r calc.Quantity
		var steps []calc.Step
		if toLine {
			r, steps, err = PhaseToLine(x, conn, SequenceOf(c))
		} else {
			r, steps, err = LineToPhase(x, conn, SequenceOf(c))
		}
		if err != nil {
			return calc.Result{}, err
		}
		return calc.Result{Value: r, Steps: steps, Notes: []string{Caution}}, nil
	}
}

func three(args []calc.Arg, names [3]string) ([3]calc.Quantity, error) {
	var q [3]calc.Quantity
	for i := range q {
		var err error
		if q[i], err = quantity(args, i, names[i]); err != nil {
			return q, err
		}
	}
	return q, nil
}

func seqNote(c *calc.Context) []string {
	notes := []string{Caution}
	if SequenceOf(c) == ACB {
		notes = append([]string{"components are taken with positive sequence = ABC rotation: a balanced ACB supply shows as negative sequence"}, notes...)
	}
	return notes
}

func callSeq(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	x, err := three(args, [3]string{"Xa", "Xb", "Xc"})
	if err != nil {
		return calc.Result{}, err
	}
	r, steps, err := ToSequence(x[0], x[1], x[2])
	if err != nil {
		return calc.Result{}, err
	}
	return calc.Result{
		Value: r[1],
		Extra: []calc.Operand{op("zero", r[0]), op("pos", r[1]), op("neg", r[2])},
		Steps: steps,
		Notes: seqNote(c),
	}, nil
}

func callPhases(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	x, err := three(args, [3]string{"X0", "X1", "X2"})
	if err != nil {
		return calc.Result{}, err
	}
	r, steps, err := FromSequence(x[0], x[1], x[2])
	if err != nil {
		return calc.Result{}, err
	}
	return calc.Result{
		Value: r[0],
		Extra: []calc.Operand{op("a", r[0]), op("b", r[1]), op("c", r[2])},
		Steps: steps,
		Notes: seqNote(c),
	}, nil
}

func callWye(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	v, err := quantity(args, 0, "the phase voltage")
	if err != nil {
		return calc.Result{}, err
	}
	z, err := three(args[1:], [3]string{"Za", "Zb", "Zc"})
	if err != nil {
		return calc.Result{}, err
	}
	neutral, err := word(args, 4, "neutral", "floating")
	if err != nil {
		return calc.Result{}, err
	}
	w, steps, err := SolveWye(v, z, neutral, SequenceOf(c), basisOf(c))
	if err != nil {
		return calc.Result{}, err
	}
	value := w.VShift
	if neutral {
		value = w.IN
	}
	return calc.Result{
		Value: value,
		Extra: []calc.Operand{op("ia", w.I[0]), op("ib", w.I[1]), op("ic", w.I[2]), op("in", w.IN), op("vshift", w.VShift),
			op("va", w.VLoad[0]), op("vb", w.VLoad[1]), op("vc", w.VLoad[2]), op("s", w.S), op("sa", apparent(w.S))},
		Steps: steps,
		Notes: []string{Caution},
	}, nil
}

func callDelta(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	v, err := quantity(args, 0, "the line voltage")
	if err != nil {
		return calc.Result{}, err
	}
	z, err := three(args[1:], [3]string{"Zab", "Zbc", "Zca"})
	if err != nil {
		return calc.Result{}, err
	}
	d, steps, err := SolveDelta(v, z, SequenceOf(c), basisOf(c))
	if err != nil {
		return calc.Result{}, err
	}
	return calc.Result{
		Value: d.ILine[0],
		Extra: []calc.Operand{op("iab", d.IPhase[0]), op("ibc", d.IPhase[1]), op("ica", d.IPhase[2]),
			op("ia", d.ILine[0]), op("ib", d.ILine[1]), op("ic", d.ILine[2]), op("s", d.S), op("sa", apparent(d.S))},
		Steps: steps,
		Notes: []string{Caution},
	}, nil
}

func callBalanced(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	v, err := quantity(args, 0, "the line voltage")
	if err != nil {
		return calc.Result{}, err
	}
	z, err := quantity(args, 1, "the phase impedance")
	if err != nil {
		return calc.Result{}, err
	}
	conn, err := connection(args, 2)
	if err != nil {
		return calc.Result{}, err
	}
	b, steps, err := SolveBalanced(v, z, conn, SequenceOf(c), basisOf(c))
	if err != nil {
		return calc.Result{}, err
	}
	return calc.Result{
		Value: b.S,
		Extra: []calc.Operand{op("p", b.P), op("q", b.Q), op("s", b.S), op("sa", b.Apparent), op("il", b.ILine), op("iph", b.IPhase),
			op("vph", b.VPhase), op("zy", b.ZY)},
		Steps: steps,
		Notes: []string{Caution},
	}, nil
}

func callWattmeters(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	v, err := quantity(args, 0, "the line voltage")
	if err != nil {
		return calc.Result{}, err
	}
	i, err := quantity(args, 1, "the line current")
	if err != nil {
		return calc.Result{}, err
	}
	pf, err := quantity(args, 2, "the power factor")
	if err != nil {
		return calc.Result{}, err
	}
	if !pf.Dim.IsDimensionless() || imag(pf.V) != 0 {
		return calc.Result{}, fmt.Errorf("the power factor must be a plain real number between 0 and 1")
	}
	lagging, err := word(args, 3, "lagging", "leading")
	if err != nil {
		return calc.Result{}, err
	}
	w, steps, err := TwoWattmeterReadings(v, i, real(pf.V), lagging, SequenceOf(c), basisOf(c))
	if err != nil {
		return calc.Result{}, err
	}
	return calc.Result{
		Value: w.W1,
		Extra: []calc.Operand{op("w1", w.W1), op("w2", w.W2)},
		Steps: steps,
		Notes: []string{Caution},
	}, nil
}

func callFromWattmeters(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	w1, err := quantity(args, 0, "W1")
	if err != nil {
		return calc.Result{}, err
	}
	w2, err := quantity(args, 1, "W2")
	if err != nil {
		return calc.Result{}, err
	}
	r, steps, err := FromWattmeters(w1, w2, SequenceOf(c))
	if err != nil {
		return calc.Result{}, err
	}
	extra := []calc.Operand{op("p", r.P), op("q", r.Q), op("s", r.S), op("sa", apparent(r.S))}
	notes := []string{Caution}
	if r.PFDefined {
		extra = append(extra, op("pf", calc.Number(complex(r.PF, 0))))
	} else {
		notes = append([]string{"power factor undefined: S = 0"}, notes...)
	}
	return calc.Result{Value: r.P, Extra: extra, Steps: steps, Notes: notes}, nil
}

// apparent returns |S| of a complex power: the apparent power, a magnitude
// in VA (IEEE Std 1459-2010).
func apparent(s calc.Quantity) calc.Quantity {
	return calc.Quantity{V: complex(s.Mag(), 0), Dim: calc.DimPower, Kind: calc.KindMagnitude}
}
