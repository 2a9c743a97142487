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
			Name: "l2l", Params: []calc.Param{{Name: "V", Kind: calc.ParamVoltage}},
			Args:    "(V)",
			Doc:     "marks V as a line-to-line voltage (between two lines, V_ab); three-phase functions check the marking and show both forms; .ln the line-to-neutral value",
			Min:     1,
			Max:     1,
			Formula: "V_an = V_ab/(√3∠30°) (ABC; ∠−30° for ACB)",
			Call:    callMark(calc.LineToLine),
		},
		{
			Name: "l2n", Params: []calc.Param{{Name: "V", Kind: calc.ParamVoltage}},
			Args:    "(V)",
			Doc:     "marks V as a line-to-neutral voltage (between a line and the neutral, V_an); three-phase functions check the marking and show both forms; .ll the line-to-line value",
			Min:     1,
			Max:     1,
			Formula: "V_ab = √3·V_an∠30° (ABC; ∠−30° for ACB)",
			Call:    callMark(calc.LineToNeutral),
		},
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
			Doc:     "symmetrical components of three phasors: value is the positive sequence; .zero, .pos, .neg; .vuf = |X2|/|X1| (voltage unbalance factor, IEC 61000-4-30), .vuf0 = |X0|/|X1|",
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
			Name: "wye", Params: []calc.Param{{Name: "VLN", Kind: calc.ParamVoltage, Doc: "line-to-neutral voltage V_aN"}, {Name: "Za", Kind: calc.ParamImpedanceOrAdmittance}, {Name: "Zb", Kind: calc.ParamImpedanceOrAdmittance}, {Name: "Zc", Kind: calc.ParamImpedanceOrAdmittance}, {Name: "neutral", Kind: calc.ParamWord, Doc: "neutral|floating|Zn (solid, open, or an impedance Z_N)"}},
			Args:    "(VLN, Za, Zb, Zc, neutral|floating|Zn)",
			Doc:     "unbalanced Y load on a balanced supply of line-to-neutral voltage VLN (V_aN): value is the neutral current (neutral) or the neutral-point shift (floating, or through Zn); .ia, .ib, .ic, .in, .vshift, .va, .vb, .vc (what each load sees), .s, .sn",
			Min:     5,
			Max:     5,
			Words:   []string{"neutral", "floating"},
			Formula: "neutral: I_k = V_kN/Z_k, I_N = ΣI_k;  floating or Zn: V_nN = ΣV_kN·Y_k/(ΣY_k + Y_N), I_k = (V_kN − V_nN)/Z_k",
			Call:    callWye,
		},
		{
			Name: "wyeunbal", Params: []calc.Param{{Name: "VaN", Kind: calc.ParamVoltage, Doc: "line-to-neutral"}, {Name: "VbN", Kind: calc.ParamVoltage, Doc: "line-to-neutral"}, {Name: "VcN", Kind: calc.ParamVoltage, Doc: "line-to-neutral"}, {Name: "Za", Kind: calc.ParamImpedanceOrAdmittance}, {Name: "Zb", Kind: calc.ParamImpedanceOrAdmittance}, {Name: "Zc", Kind: calc.ParamImpedanceOrAdmittance}, {Name: "neutral", Kind: calc.ParamWord, Doc: "neutral|floating|Zn (solid, open, or an impedance Z_N)"}},
			Args:    "(VaN, VbN, VcN, Za, Zb, Zc, neutral|floating|Zn)",
			Doc:     "unbalanced Y load on an unbalanced supply of three line-to-neutral voltages: value is the neutral current (neutral) or the neutral-point shift; fields as for wye",
			Min:     7,
			Max:     7,
			Words:   []string{"neutral", "floating"},
			Formula: "V_nN = ΣV_kN·Y_k/(ΣY_k + Y_N) (Y_N = 0 floating, V_nN = 0 neutral);  I_k = (V_kN − V_nN)/Z_k;  I_N = ΣI_k",
			Call:    callWyeSupply,
		},
		{
			Name: "delta", Params: []calc.Param{{Name: "VLL", Kind: calc.ParamVoltage, Doc: "line-to-line voltage V_ab"}, {Name: "Zab", Kind: calc.ParamImpedanceOrAdmittance}, {Name: "Zbc", Kind: calc.ParamImpedanceOrAdmittance}, {Name: "Zca", Kind: calc.ParamImpedanceOrAdmittance}},
			Args:    "(VLL, Zab, Zbc, Zca)",
			Doc:     "unbalanced Δ load on a balanced supply of line-to-line voltage VLL (V_ab): value is I_a; .iab, .ibc, .ica, .ia, .ib, .ic, .s",
			Min:     4,
			Max:     4,
			Formula: "I_ab = V_ab/Z_ab ...;  I_a = I_ab − I_ca, I_b = I_bc − I_ab, I_c = I_ca − I_bc",
			Call:    callDelta,
		},
		{
			Name: "deltaunbal", Params: []calc.Param{{Name: "Vab", Kind: calc.ParamVoltage, Doc: "line-to-line"}, {Name: "Vbc", Kind: calc.ParamVoltage, Doc: "line-to-line"}, {Name: "Vca", Kind: calc.ParamVoltage, Doc: "line-to-line"}, {Name: "Zab", Kind: calc.ParamImpedance}, {Name: "Zbc", Kind: calc.ParamImpedance}, {Name: "Zca", Kind: calc.ParamImpedance}},
			Args:    "(Vab, Vbc, Vca, Zab, Zbc, Zca)",
			Doc:     "unbalanced Δ load on an unbalanced supply of three line-to-line voltages (summing to zero): value is I_a; fields as for delta",
			Min:     6,
			Max:     6,
			Formula: "I_ab = V_ab/Z_ab ...;  I_a = I_ab − I_ca, I_b = I_bc − I_ab, I_c = I_ca − I_bc",
			Call:    callDeltaSupply,
		},
		{
			Name: "balanced", Params: []calc.Param{{Name: "VLL", Kind: calc.ParamVoltage, Doc: "line-to-line voltage V_ab"}, {Name: "Zph", Kind: calc.ParamImpedanceOrAdmittance}, {Name: "conn", Kind: calc.ParamWord, Doc: "wye|delta"}},
			Args:    "(VLL, Zph, wye|delta)",
			Doc:     "balanced load of phase impedance Zph on a supply of line-to-line voltage VLL (V_ab): value is the total complex power; .p, .q, .s, .il, .iph, .vph, .zy",
			Min:     3,
			Max:     3,
			Words:   []string{"wye", "delta"},
			Formula: "S = 3·V_ph·I_ph* (RMS; ½ of that for peak)",
			Call:    callBalanced,
		},
		{
			Name: "wattmeters", Params: []calc.Param{{Name: "VLL", Kind: calc.ParamVoltage, Doc: "line-to-line voltage V_ab"}, {Name: "Iline", Kind: calc.ParamCurrent}, {Name: "pf", Kind: calc.ParamRatio}, {Name: "sense", Kind: calc.ParamWord, Doc: "lagging|leading"}},
			Args:    "(VLL, Iline, pf, lagging|leading)",
			Doc:     "two-wattmeter readings from the line-to-line voltage VLL of a balanced load (current coils in lines a and b, voltage coils to line c): value is W1; .w1, .w2",
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
		// a Y voltage changes reference; a marking the other way round
		// means the value is already converted
		yv := x.Dim == calc.DimVoltage && conn == Wye
		from, to := calc.LineToLine, calc.LineToNeutral
		if toLine {
			from, to = to, from
		}
		if yv && x.Ref == to {
			return calc.Result{}, fmt.Errorf("the value is marked %s already: it needs no conversion", to)
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
		if yv {
			r.Ref = to
			steps[0].Rule += fmt.Sprintf(": %s %s = %s %s", short(x), from, short(r), to)
		}
		return calc.Result{Value: r, Steps: steps, Cautions: calc.CautionsOf(calc.CautionMains)}, nil
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
	if SequenceOf(c) == ACB {
		return []string{"components are taken with positive sequence = ABC rotation: a balanced ACB supply shows as negative sequence"}
	}
	return nil
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
	extra := []calc.Operand{op("zero", r[0]), op("pos", r[1]), op("neg", r[2])}
	notes := seqNote(c)
	if u, st, err := UnbalanceOf(r, SequenceOf(c)); err == nil {
		extra = append(extra, op("vuf", u.Neg), op("vuf0", u.Zero))
		steps = append(steps, st)
	} else {
		notes = append([]string{err.Error()}, notes...)
	}
	return calc.Result{Value: r[1], Extra: extra, Steps: steps, Notes: notes, Cautions: calc.CautionsOf(calc.CautionMains)}, nil
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
		Notes: seqNote(c), Cautions: calc.CautionsOf(calc.CautionMains),
	}, nil
}

// link reads argument i: the word neutral (solid), floating (open) or a
// neutral impedance.
func link(args []calc.Arg, i int) (Link, error) {
	if i >= len(args) {
		return Link{}, fmt.Errorf("missing the neutral: neutral, floating or an impedance Z_N")
	}
	switch args[i].Word {
	case "neutral":
		return Link{Kind: NeutralSolid}, nil
	case "floating":
		return Link{Kind: NeutralOpen}, nil
	case "":
		if args[i].Q.Dim != calc.DimImpedance {
			return Link{}, fmt.Errorf("argument %d is the neutral: the word neutral (solid), floating (open), or an impedance Z_N, not %s", i+1, calc.DimWord(args[i].Q.Dim))
		}
		return Link{Kind: NeutralThrough, Z: args[i].Q}, nil
	}
	return Link{}, fmt.Errorf("argument %d is the neutral: the word neutral (solid), floating (open), or an impedance Z_N, not %q", i+1, args[i].Text)
}

func wyeResult(w WyeLoad, steps []calc.Step) calc.Result {
	value := w.VShift
	if w.Link.Kind == NeutralSolid {
		value = w.IN
	}
	return calc.Result{
		Value: value,
		Extra: []calc.Operand{op("ia", w.I[0]), op("ib", w.I[1]), op("ic", w.I[2]), op("in", w.IN), op("vshift", w.VShift),
			op("va", w.VLoad[0]), op("vb", w.VLoad[1]), op("vc", w.VLoad[2]), op("s", w.S), op("sa", apparent(w.S)), op("sn", w.SN)},
		Steps:    steps,
		Cautions: calc.CautionsOf(calc.CautionMains),
	}
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
	l, err := link(args, 4)
	if err != nil {
		return calc.Result{}, err
	}
	v, pre, err := Voltage(v, calc.LineToNeutral, "VLN", SequenceOf(c), true)
	if err != nil {
		return calc.Result{}, err
	}
	if err := needDim(v, calc.DimVoltage, "the line-to-neutral voltage VLN"); err != nil {
		return calc.Result{}, err
	}
	vs := phaseSet(v.V, SequenceOf(c))
	w, steps, err := SolveWyeSupply([3]calc.Quantity{volt(vs[0]), volt(vs[1]), volt(vs[2])}, z, l, SequenceOf(c), basisOf(c))
	if err != nil {
		return calc.Result{}, err
	}
	return wyeResult(w, append(pre, steps...)), nil
}

func callWyeSupply(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	v, err := three(args, [3]string{"VaN", "VbN", "VcN"})
	if err != nil {
		return calc.Result{}, err
	}
	z, err := three(args[3:], [3]string{"Za", "Zb", "Zc"})
	if err != nil {
		return calc.Result{}, err
	}
	l, err := link(args, 6)
	if err != nil {
		return calc.Result{}, err
	}
	for k := range v {
		if v[k].Ref == calc.LineToLine {
			return calc.Result{}, fmt.Errorf("V%cN is marked line-to-line: wyeunbal takes the three line-to-neutral voltages, and one line-to-line value of an unbalanced set does not give a line-to-neutral one", 'a'+k)
		}
	}
	w, steps, err := SolveWyeSupply(v, z, l, SequenceOf(c), basisOf(c))
	if err != nil {
		return calc.Result{}, err
	}
	return wyeResult(w, steps), nil
}

func callDelta(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	v, err := quantity(args, 0, "the line-to-line voltage VLL")
	if err != nil {
		return calc.Result{}, err
	}
	z, err := three(args[1:], [3]string{"Zab", "Zbc", "Zca"})
	if err != nil {
		return calc.Result{}, err
	}
	v, pre, err := Voltage(v, calc.LineToLine, "VLL", SequenceOf(c), true)
	if err != nil {
		return calc.Result{}, err
	}
	d, steps, err := SolveDelta(v, z, SequenceOf(c), basisOf(c))
	if err != nil {
		return calc.Result{}, err
	}
	return deltaResult(d, append(pre, steps...)), nil
}

func callDeltaSupply(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	v, err := three(args, [3]string{"Vab", "Vbc", "Vca"})
	if err != nil {
		return calc.Result{}, err
	}
	z, err := three(args[3:], [3]string{"Zab", "Zbc", "Zca"})
	if err != nil {
		return calc.Result{}, err
	}
	for k, n := range [3]string{"Vab", "Vbc", "Vca"} {
		if v[k].Ref == calc.LineToNeutral {
			return calc.Result{}, fmt.Errorf("%s is marked line-to-neutral: deltaunbal takes the three line-to-line voltages, and one line-to-neutral value of an unbalanced set does not give a line-to-line one", n)
		}
	}
	d, steps, err := SolveDeltaSupply(v, z, SequenceOf(c), basisOf(c))
	if err != nil {
		return calc.Result{}, err
	}
	return deltaResult(d, steps), nil
}

func deltaResult(d DeltaLoad, steps []calc.Step) calc.Result {
	return calc.Result{
		Value: d.ILine[0],
		Extra: []calc.Operand{op("iab", d.IPhase[0]), op("ibc", d.IPhase[1]), op("ica", d.IPhase[2]),
			op("ia", d.ILine[0]), op("ib", d.ILine[1]), op("ic", d.ILine[2]), op("s", d.S), op("sa", apparent(d.S))},
		Steps:    steps,
		Cautions: calc.CautionsOf(calc.CautionMains),
	}
}

func callBalanced(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	v, err := quantity(args, 0, "the line-to-line voltage VLL")
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
	v, pre, err := Voltage(v, calc.LineToLine, "VLL", SequenceOf(c), true)
	if err != nil {
		return calc.Result{}, err
	}
	b, steps, err := SolveBalanced(v, z, conn, SequenceOf(c), basisOf(c))
	if err != nil {
		return calc.Result{}, err
	}
	steps = append(pre, steps...)
	return calc.Result{
		Value: b.S,
		Extra: []calc.Operand{op("p", b.P), op("q", b.Q), op("s", b.S), op("sa", b.Apparent), op("il", b.ILine), op("iph", b.IPhase),
			op("vph", b.VPhase), op("zy", b.ZY)},
		Steps:    steps,
		Cautions: calc.CautionsOf(calc.CautionMains),
	}, nil
}

func callWattmeters(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	v, err := quantity(args, 0, "the line-to-line voltage VLL")
	if err != nil {
		return calc.Result{}, err
	}
	v, pre, err := Voltage(v, calc.LineToLine, "VLL", SequenceOf(c), false)
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
	steps = append(pre, steps...)
	return calc.Result{
		Value:    w.W1,
		Extra:    []calc.Operand{op("w1", w.W1), op("w2", w.W2)},
		Steps:    steps,
		Cautions: calc.CautionsOf(calc.CautionMains),
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
	var notes []string
	if r.PFDefined {
		extra = append(extra, op("pf", calc.Number(complex(r.PF, 0))))
	} else {
		notes = append([]string{"power factor undefined: S = 0"}, notes...)
	}
	return calc.Result{Value: r.P, Extra: extra, Steps: steps, Notes: notes, Cautions: calc.CautionsOf(calc.CautionMains)}, nil
}

// apparent returns |S| of a complex power: the apparent power, a magnitude
// in VA (IEEE Std 1459-2010).
func apparent(s calc.Quantity) calc.Quantity {
	return calc.Quantity{V: complex(s.Mag(), 0), Dim: calc.DimPower, Kind: calc.KindMagnitude}
}
