package site

import (
	"fmt"
	"math"

	"argand/calc"
	"argand/reduce/threephase"
)

// shortFuncs are the short-circuit and earth-loop functions of the
// worksheet language.
func shortFuncs() []calc.Func {
	return []calc.Func{
		{Name: "zfeeder", Gaps: true, Params: []calc.Param{{Name: "UnQ", Kind: calc.ParamVoltage, Doc: "nominal system voltage, line-to-line"},
			{Name: "Ik", Kind: calc.ParamAny, Doc: "I\"_kQ in A, or the fault level S\"_kQ in VA"},
			{Name: "UrHV", Kind: calc.ParamAny, Optional: true, Doc: "transformer HV rating, V line-to-line (with UrLV: refer to the LV side)"},
			{Name: "UrLV", Kind: calc.ParamAny, Optional: true, Doc: "transformer LV rating, V line-to-line"},
			{Name: "rx", Kind: calc.ParamAny, Optional: true, Doc: "R_Q/X_Q, 0.1 when not given"},
			{Name: "c", Kind: calc.ParamAny, Optional: true, Doc: "c_Q, c_max of the table when not given"}},
			Args: "(UnQ, IkQ or SkQ[, UrHV, UrLV][, RQ/XQ[, cQ]])", Min: 2, Max: 6,
			Doc:     "network feeder impedance from its short-circuit current or fault level (IEC 60909-0), R_Q/X_Q 0.1 when not given, optionally referred to a transformer's LV side; .r .x .c",
			Formula: "Z_Q = c_Q·U_nQ/(√3·I\"_kQ) = c_Q·U_nQ²/S\"_kQ; X_Q = Z_Q/√(1 + (R/X)²); Z_Qt = Z_Q/t_r²",
			Call:    threephase.Voltages(calc.LineToLine, threephase.Always, map[int]string{0: "UnQ", 2: "UrHV", 3: "UrLV"}, callZFeeder)},
		{Name: "zxfmr", Gaps: true, Params: []calc.Param{{Name: "SrT", Kind: calc.ParamApparentPower, Else: "a rating is an apparent power in VA"},
			{Name: "UrHV", Kind: calc.ParamVoltage, Doc: "rated, line-to-line"}, {Name: "UrLV", Kind: calc.ParamVoltage, Doc: "rated, line-to-line"}, {Name: "ukr", Kind: calc.ParamRatio, Doc: "per cent"},
			{Name: "loss", Kind: calc.ParamAny, Optional: true, Doc: "P_krT in W, or u_Rr in per cent"},
			{Name: "cmax", Kind: calc.ParamRatio, Optional: true, Doc: "c_max of the LV side, from the table when not given"},
			{Name: "side", Kind: calc.ParamWord, Optional: true, Doc: "lv|hv"}},
			Args: "(SrT, UrHV, UrLV, ukr[, PkrT or uRr][, cmax][, lv|hv])", Min: 4, Max: 7, Words: []string{"lv", "hv"},
			Doc:     "network transformer impedance with the correction factor K_T (IEC 60909-0), on the LV side unless hv; ukr and uRr in per cent, PkrT in W; .kt .zt (uncorrected) .xt_pu",
			Formula: "Z_T = (u_kr/100)·U_rT²/S_rT; R_T = P_krT·U_rT²/S_rT²; K_T = 0.95·c_max/(1 + 0.6·x_T); Z_TK = K_T·Z_T",
			Call:    threephase.Voltages(calc.LineToLine, threephase.Always, map[int]string{1: "UrHV", 2: "UrLV"}, callZXfmr)},
		{Name: "zcable", Gaps: true, Params: []calc.Param{{Name: "Rlen", Kind: calc.ParamPerLength, Doc: "R' at 20 °C"}, {Name: "Xlen", Kind: calc.ParamPerLength},
			{Name: "length", Kind: calc.ParamLength}, {Name: "n", Kind: calc.ParamRatio, Optional: true, Doc: "runs in parallel"},
			{Name: "thetae", Kind: calc.ParamTemperature, Optional: true, Doc: "conductor temperature at the end of the fault"}},
			Args: "(R', X', length[, n][, θe])", Min: 3, Max: 5,
			Doc:     "cable or line impedance at 20 °C from R' and X' per length of one conductor, n runs in parallel; with θe (°C) also .hot at the end-of-fault temperature for the minimum current",
			Formula: "Z_L = (R' + jX')·l/n; R_L(θe) = [1 + 0.004·(θe − 20)]·R_L20",
			Call:    callZCable},
		{Name: "ik3", Params: []calc.Param{{Name: "Un", Kind: calc.ParamVoltage, Doc: "nominal system voltage, line-to-line"},
			{Name: "Z", Kind: calc.ParamAny, Doc: "the impedances of the path in Ω, then optionally c and max|min"}},
			Args: "(Un, Z1[, Z2, ...][, c][, max|min])", Min: 2, Max: 2 + maxPath,
			Words:   []string{"max", "min"},
			Doc:     "three-phase short-circuit current I\"_k (IEC 60909-0) through the series impedances given, c_max by default; .ip .kappa (max) .sk .zk .c",
			Formula: "I\"_k = c·U_n/(√3·|ΣZ|); i_p = κ·√2·I\"_k, κ = 1.02 + 0.98·e^(−3R/X); S\"_k = √3·U_n·I\"_k",
			Call:    threephase.Voltages(calc.LineToLine, threephase.Always, map[int]string{0: "Un"}, callIK3)},
		unsymFunc("ik1", LineToEarth, "line-to-earth short-circuit current I\"_k1 = |I_a| (phase a to earth through Zf)"),
		unsymFunc("ik2", LineToLine, "line-to-line short-circuit current I\"_k2 = |I_b| (phases b and c through Zf)"),
		unsymFunc("ik2e", LineLineEarth, "line-to-line short circuit with earth: earth current I\"_kE2E = |I_b + I_c| (phases b and c joined, to earth through Zf)"),
		{Name: "zsloop", Params: []calc.Param{{Name: "U0", Kind: calc.ParamVoltage, Doc: "nominal voltage to earth, line-to-neutral"},
			{Name: "Ze", Kind: calc.ParamImpedance}, {Name: "R12", Kind: calc.ParamPerLength, Doc: "(R1 + R2) per length at 20 °C"},
			{Name: "L", Kind: calc.ParamLength}, {Name: "theta", Kind: calc.ParamTemperature, Doc: "conductor operating temperature"},
			{Name: "limit", Kind: calc.ParamAny, Optional: true, Doc: "your maximum Z_s in Ω or minimum fault current in A"},
			{Name: "material", Kind: calc.ParamWord, Optional: true, Doc: "copper|aluminium"}},
			Args: "(U0, Ze, (R1+R2)', L, θ[, Zsmax or Imin][, copper|aluminium])", Min: 5, Max: 7,
			Words:   []string{"copper", "aluminium", "aluminum"},
			Doc:     "earth fault loop impedance of a final circuit, (R1+R2)' per length at 20 °C corrected to θ (°C), and the prospective fault current; compared with your Zsmax or Imin; .if .factor .r12 .ok",
			Formula: "Z_s = Z_e + (R1 + R2)·L·F, F = 1 + α20·(θ − 20); I_f = U0/|Z_s|",
			Call:    threephase.Voltages(calc.LineToNeutral, threephase.Always, map[int]string{0: "U0"}, callZsLoop)},
	}
}

// impArg returns an impedance argument (complex allowed).
func impArg(fn, what string, a calc.Arg) (complex128, error) {
	if a.Word != "" {
		return 0, fmt.Errorf("%s: %s must be an impedance in Ω, not the word %q", fn, what, a.Word)
	}
	if a.Q.Dim != calc.DimImpedance {
		return 0, fmt.Errorf("%s: %s must be an impedance in Ω, got %s", fn, argName(a, what), calc.DimName(a.Q.Dim, false))
	}
	return a.Q.V, nil
}

func callZFeeder(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	const fn = "zfeeder"
	qs, words := split(args)
	if len(words) > 0 {
		return calc.Result{}, fmt.Errorf("%s takes values only: (UnQ, IkQ or SkQ[, UrHV, UrLV][, RQ/XQ[, cQ]])", fn)
	}
	var f Feeder
	var err error
	if f.UnQ, err = realArg(fn, "UnQ", qs[0], calc.DimVoltage); err != nil {
		return calc.Result{}, err
	}
	switch qs[1].Q.Dim {
	case calc.DimCurrent:
		f.IkQ, err = realArg(fn, "IkQ", qs[1], calc.DimCurrent)
	case calc.DimPower:
		if qs[1].Q.Kind == calc.KindActive || qs[1].Q.Kind == calc.KindReactive {
			return calc.Result{}, fmt.Errorf("%s: a fault level is an apparent power in VA, not %s", fn, qs[1].Text)
		}
		f.SkQ, err = realArg(fn, "SkQ", qs[1], calc.DimPower)
	default:
		err = fmt.Errorf("%s: argument 2 is the feeder's I\"_kQ in A or its fault level S\"_kQ in VA, got %s", fn, calc.DimName(qs[1].Q.Dim, false))
	}
	if err != nil {
		return calc.Result{}, err
	}
	// c named with rx skipped is c, whatever else is given; the other
	// values are told apart by their dimension, as in order
	cNamed := calc.Given(args, 5) && args[4].Absent
	var nums, volts []calc.Arg
	for k := 2; k < len(args); k++ {
		a := args[k]
		if a.Absent || cNamed && k == 5 {
			continue
		}
		switch a.Q.Dim {
		case calc.Dimensionless:
			nums = append(nums, a)
		case calc.DimVoltage:
			volts = append(volts, a)
		default:
			return calc.Result{}, fmt.Errorf("%s: %s is neither a ratio RQ/XQ, a factor cQ nor a transformer voltage", fn, a.Text)
		}
	}
	if len(nums) > 2 || (len(volts) != 0 && len(volts) != 2) {
		return calc.Result{}, fmt.Errorf("%s takes (UnQ, IkQ or SkQ[, UrHV, UrLV][, RQ/XQ[, cQ]]): the transformer needs both rated voltages", fn)
	}
	if cNamed {
		if len(nums) > 1 {
			return calc.Result{}, fmt.Errorf("%s: cQ is given by name and %s besides it: give RQ/XQ by name as well", fn, nums[1].Text)
		}
		if len(nums) == 0 {
			nums = []calc.Arg{{Absent: true}} // rx not given: 0.1
		}
		nums = append(nums, args[5])
	}
	if len(nums) > 0 && !nums[0].Absent {
		if f.RX, err = realArg(fn, "RQ/XQ", nums[0], calc.Dimensionless); err != nil {
			return calc.Result{}, err
		}
		f.RXKnown = true
	}
	if len(nums) > 1 {
		if f.C, err = realArg(fn, "cQ", nums[1], calc.Dimensionless); err != nil {
			return calc.Result{}, err
		}
	}
	if len(volts) == 2 {
		if f.UrHV, err = realArg(fn, "UrHV", volts[0], calc.DimVoltage); err != nil {
			return calc.Result{}, err
		}
		if f.UrLV, err = realArg(fn, "UrLV", volts[1], calc.DimVoltage); err != nil {
			return calc.Result{}, err
		}
	}
	r, err := FeederZ(f)
	if err != nil {
		return calc.Result{}, fmt.Errorf("%s: %v", fn, err)
	}
	return calc.Result{Value: r.Z, Steps: r.Steps, Cautions: calc.CautionsOf(calc.CautionFault), Extra: []calc.Operand{
		op("r", kq(real(r.Z.V), calc.DimImpedance, calc.KindResistive)), op("x", kq(imag(r.Z.V), calc.DimImpedance, calc.KindSigned)), op("c", r.Factor)}}, nil
}

func callZXfmr(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	const fn = "zxfmr"
	qs, words := split(args)
	if len(qs) < 4 || len(qs) > 6 {
		return calc.Result{}, fmt.Errorf("%s takes (SrT, UrHV, UrLV, ukr[, PkrT or uRr][, cmax][, lv|hv])", fn)
	}
	if has(words, "lv") && has(words, "hv") {
		return calc.Result{}, fmt.Errorf("%s: lv or hv, not both", fn)
	}
	t := NetTransformer{HVSide: has(words, "hv")}
	var err error
	if t.S, err = realArg(fn, "SrT", qs[0], calc.DimPower); err != nil {
		return calc.Result{}, err
	}
	if qs[0].Q.Kind == calc.KindActive || qs[0].Q.Kind == calc.KindReactive {
		return calc.Result{}, fmt.Errorf("%s: SrT is the rated apparent power in VA, not %s", fn, qs[0].Text)
	}
	if t.UrHV, err = realArg(fn, "UrHV", qs[1], calc.DimVoltage); err != nil {
		return calc.Result{}, err
	}
	if t.UrLV, err = realArg(fn, "UrLV", qs[2], calc.DimVoltage); err != nil {
		return calc.Result{}, err
	}
	if t.UrHV < t.UrLV {
		return calc.Result{}, fmt.Errorf("%s: UrHV (%s) is below UrLV (%s): give the high voltage first", fn, qs[1].Text, qs[2].Text)
	}
	if t.Ukr, err = realArg(fn, "ukr (%)", qs[3], calc.Dimensionless); err != nil {
		return calc.Result{}, err
	}
	// the arguments keep their parameters' places (Gaps): loss is 5th,
	// cmax 6th, either one skipped when the other is named
	if calc.Given(args, 4) {
		loss := args[4]
		switch loss.Q.Dim {
		case calc.DimPower:
			if loss.Q.Kind == calc.KindApparent || loss.Q.Kind == calc.KindReactive {
				return calc.Result{}, fmt.Errorf("%s: PkrT is the load loss, an active power in W, not %s", fn, loss.Text)
			}
			t.PkrT, err = realArg(fn, "PkrT", loss, calc.DimPower)
		case calc.Dimensionless:
			t.URr, err = realArg(fn, "uRr (%)", loss, calc.Dimensionless)
		default:
			err = fmt.Errorf("%s: argument 5 is the load loss PkrT in W or uRr in per cent, got %s", fn, calc.DimName(loss.Q.Dim, false))
		}
		if err != nil {
			return calc.Result{}, err
		}
	}
	if calc.Given(args, 5) {
		if t.CMax, err = realArg(fn, "cmax", args[5], calc.Dimensionless); err != nil {
			return calc.Result{}, err
		}
	}
	r, err := TransformerZ(t)
	if err != nil {
		return calc.Result{}, fmt.Errorf("%s: %v", fn, err)
	}
	kt := real(r.Factor.V)
	st := r.Steps[0]
	return calc.Result{Value: r.Z, Steps: r.Steps, Cautions: calc.CautionsOf(calc.CautionFault), Extra: []calc.Operand{
		op("kt", r.Factor), op("zt", cq(r.Z.V/complex(kt, 0), calc.DimImpedance)), op("xt_pu", st.Results[1].Value)}}, nil
}

func callZCable(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	const fn = "zcable"
	var run Run
	var err error
	if run.R, err = realArg(fn, "R' (per length)", args[0], perMetre); err != nil {
		return calc.Result{}, err
	}
	if run.X, err = realArg(fn, "X' (per length)", args[1], perMetre); err != nil {
		return calc.Result{}, err
	}
	if run.Length, err = realArg(fn, "length", args[2], calc.DimLength); err != nil {
		return calc.Result{}, err
	}
	if calc.Given(args, 3) {
		n, err := realArg(fn, "n (runs in parallel)", args[3], calc.Dimensionless)
		if err != nil {
			return calc.Result{}, err
		}
		if n != math.Trunc(n) || n < 1 || n > 1000 {
			return calc.Result{}, fmt.Errorf("%s: n, the runs in parallel, is a whole number from 1 to 1000, got %s", fn, args[3].Text)
		}
		run.Parallel = int(n)
	}
	if calc.Given(args, 4) {
		if run.ThetaE, err = realArg(fn, "θe (°C, a plain number)", args[4], calc.Dimensionless); err != nil {
			return calc.Result{}, err
		}
		run.HasThetaE = true
	}
	r, err := RunZ(run)
	if err != nil {
		return calc.Result{}, fmt.Errorf("%s: %v", fn, err)
	}
	out := calc.Result{Value: r.Z, Steps: r.Steps, Cautions: calc.CautionsOf(calc.CautionFault)}
	if run.HasThetaE {
		out.Extra = append(out.Extra, op("hot", r.Hot))
	}
	return out, nil
}

// faultOptions reads the trailing options of a fault function: an
// optional plain-number c and the word max or min.
func faultOptions(fn string, rest []calc.Arg, words []string) (c float64, min bool, err error) {
	if has(words, "max") && has(words, "min") {
		return 0, false, fmt.Errorf("%s: max or min, not both", fn)
	}
	for _, a := range rest {
		if a.Q.Dim != calc.Dimensionless {
			return 0, false, fmt.Errorf("%s: %s is neither an impedance in Ω nor a voltage factor c", fn, a.Text)
		}
		if c != 0 {
			return 0, false, fmt.Errorf("%s: give the voltage factor c once", fn)
		}
		if c, err = realArg(fn, "c", a, calc.Dimensionless); err != nil {
			return 0, false, err
		}
		if c == 0 {
			return 0, false, fmt.Errorf("%s: c = 0 is not a voltage factor", fn)
		}
	}
	return c, has(words, "min"), nil
}

func callIK3(ctx *calc.Context, args []calc.Arg) (calc.Result, error) {
	const fn = "ik3"
	qs, words := split(args)
	if len(qs) < 2 {
		return calc.Result{}, fmt.Errorf("%s takes (Un, Z1[, Z2, ...][, c][, max|min])", fn)
	}
	s := Short{}
	var err error
	if s.Un, err = realArg(fn, "Un", qs[0], calc.DimVoltage); err != nil {
		return calc.Result{}, err
	}
	var rest []calc.Arg
	for i, a := range qs[1:] {
		if a.Q.Dim != calc.DimImpedance {
			rest = append(rest, a)
			continue
		}
		if len(rest) > 0 {
			return calc.Result{}, fmt.Errorf("%s: the impedances come before c", fn)
		}
		name := a.Text
		if name == "" {
			name = fmt.Sprintf("Z%d", i+1)
		}
		s.Path = append(s.Path, NamedZ{Name: name, Z: a.Q.V})
	}
	if s.C, s.Min, err = faultOptions(fn, rest, words); err != nil {
		return calc.Result{}, err
	}
	r, err := ThreePhaseShort(s)
	if err != nil {
		return calc.Result{}, fmt.Errorf("%s: %v", fn, err)
	}
	out := calc.Result{Value: r.Ik, Steps: r.Steps, Notes: []string{"U_n, I\"_k and S\"_k are RMS values by definition, whatever the worksheet's basis; i_p is the instantaneous peak"}, Cautions: calc.CautionsOf(calc.CautionFault)}
	if !s.Min {
		out.Extra = append(out.Extra, op("ip", r.Ip), op("kappa", r.Kappa))
	}
	out.Extra = append(out.Extra, op("sk", r.Sk), op("zk", r.Zk), op("c", r.C))
	return out, nil
}

func unsymFunc(name string, ft FaultType, doc string) calc.Func {
	return calc.Func{Name: name, Gaps: true, Params: []calc.Param{{Name: "Un", Kind: calc.ParamVoltage, Doc: "nominal system voltage, line-to-line"},
		{Name: "Z1", Kind: calc.ParamImpedance}, {Name: "Z2", Kind: calc.ParamImpedance}, {Name: "Z0", Kind: calc.ParamImpedance},
		{Name: "Zf", Kind: calc.ParamAny, Optional: true, Doc: "fault impedance in Ω, 0 when not given"},
		{Name: "c", Kind: calc.ParamAny, Optional: true, Doc: "voltage factor, from the table when not given"},
		{Name: "limit", Kind: calc.ParamWord, Optional: true, Doc: "max|min"}},
		Args: "(Un, Z1, Z2, Z0[, Zf][, c][, max|min])", Min: 4, Max: 7,
		Words: []string{"max", "min"},
		Doc:   doc + ", from the sequence impedances at the fault (IEC 60909-0 voltage source); .ia .ib .ic .va .vb .vc .i0 .i1 .i2 .ie .c",
		Formula: map[FaultType]string{
			LineToEarth:   "I1 = I2 = I0 = E/(Z1 + Z2 + Z0 + 3Zf), E = c·U_n/√3; I_a = 3·I0",
			LineToLine:    "I1 = −I2 = E/(Z1 + Z2 + Zf), E = c·U_n/√3; I_b = −j√3·I1",
			LineLineEarth: "I1 = E/(Z1 + Z2∥(Z0 + 3Zf)), E = c·U_n/√3; I_E = 3·I0",
		}[ft],
		Call: threephase.Voltages(calc.LineToLine, threephase.Always, map[int]string{0: "Un"}, func(ctx *calc.Context, args []calc.Arg) (calc.Result, error) {
			qs, words := split(args)
			if len(qs) < 4 {
				return calc.Result{}, fmt.Errorf("%s takes (Un, Z1, Z2, Z0[, Zf][, c][, max|min])", name)
			}
			u := Unsym{Type: ft, ACB: ctx.Sequence == -1}
			var err error
			if u.Un, err = realArg(name, "Un", qs[0], calc.DimVoltage); err != nil {
				return calc.Result{}, err
			}
			zs := []*complex128{&u.Z1, &u.Z2, &u.Z0}
			for k, w := range []string{"Z1", "Z2", "Z0"} {
				if *zs[k], err = impArg(name, w, qs[k+1]); err != nil {
					return calc.Result{}, err
				}
			}
			rest := qs[4:]
			if len(rest) > 0 && rest[0].Q.Dim == calc.DimImpedance {
				if u.Zf, err = impArg(name, "Zf", rest[0]); err != nil {
					return calc.Result{}, err
				}
				rest = rest[1:]
			}
			if u.C, u.Min, err = faultOptions(name, rest, words); err != nil {
				return calc.Result{}, err
			}
			r, err := UnsymFault(u)
			if err != nil {
				return calc.Result{}, fmt.Errorf("%s: %v", name, err)
			}
			notes := []string{"U_n and I\"_k are RMS values by definition, whatever the worksheet's basis"}
			// The phasors follow the worksheet's basis; the steps show RMS.
			k := complex(1, 0)
			if ctx.Basis == calc.Peak {
				k = complex(math.Sqrt2, 0)
				notes = append(notes, "basis peak: the phasors .ia … .ie are the steps' RMS values times √2")
			}
			ph := func(name string, q calc.Quantity) calc.Operand {
				return op(name, calc.Quantity{V: q.V * k, Dim: q.Dim, Kind: q.Kind})
			}
			return calc.Result{Value: r.Ik, Steps: r.Steps, Notes: notes, Cautions: calc.CautionsOf(calc.CautionFault), Extra: []calc.Operand{
				ph("ia", r.Iabc[0]), ph("ib", r.Iabc[1]), ph("ic", r.Iabc[2]),
				ph("va", r.Vabc[0]), ph("vb", r.Vabc[1]), ph("vc", r.Vabc[2]),
				ph("i0", r.I012[0]), ph("i1", r.I012[1]), ph("i2", r.I012[2]), ph("ie", r.Ie), op("c", r.C)}}, nil
		})}
}

func callZsLoop(ctx *calc.Context, args []calc.Arg) (calc.Result, error) {
	const fn = "zsloop"
	qs, words := split(args)
	if len(qs) < 5 || len(qs) > 6 || len(words) > 1 {
		return calc.Result{}, fmt.Errorf("%s takes (U0, Ze, (R1+R2)', L, θ[, Zsmax or Imin][, copper|aluminium])", fn)
	}
	var l Loop
	var err error
	if l.U0, err = realArg(fn, "U0", qs[0], calc.DimVoltage); err != nil {
		return calc.Result{}, err
	}
	if l.Ze, err = impArg(fn, "Ze", qs[1]); err != nil {
		return calc.Result{}, err
	}
	if l.R12, err = realArg(fn, "(R1+R2)' (per length)", qs[2], perMetre); err != nil {
		return calc.Result{}, err
	}
	if l.Length, err = realArg(fn, "L", qs[3], calc.DimLength); err != nil {
		return calc.Result{}, err
	}
	if l.Theta, err = realArg(fn, "θ (°C, a plain number)", qs[4], calc.Dimensionless); err != nil {
		return calc.Result{}, err
	}
	if len(qs) == 6 {
		switch qs[5].Q.Dim {
		case calc.DimImpedance:
			l.MaxZs, err = realArg(fn, "Zsmax", qs[5], calc.DimImpedance)
		case calc.DimCurrent:
			l.MinI, err = realArg(fn, "Imin", qs[5], calc.DimCurrent)
		default:
			err = fmt.Errorf("%s: the limit is a maximum Z_s in Ω or a minimum fault current in A, got %s", fn, calc.DimName(qs[5].Q.Dim, false))
		}
		if err != nil {
			return calc.Result{}, err
		}
		if l.MaxZs <= 0 && l.MinI <= 0 {
			return calc.Result{}, fmt.Errorf("%s: the limit %s must be positive", fn, qs[5].Text)
		}
	}
	notes := []string{}
	l.Material = Copper
	switch {
	case has(words, "aluminium") || has(words, "aluminum"):
		l.Material = Aluminium
	case len(words) == 0:
		notes = append(notes, "conductor material not given: copper taken")
	}
	r, err := EarthLoop(l)
	if err != nil {
		return calc.Result{}, fmt.Errorf("%s: %v", fn, err)
	}
	if r.Checked {
		// the verdict leads, so it is seen before the cautions
		notes = append([]string{r.Verdict}, notes...)
	}
	out := calc.Result{Value: r.Zs, Steps: r.Steps, Notes: notes, Cautions: calc.CautionsOf(calc.CautionLoop, calc.CautionFault), Extra: []calc.Operand{
		op("if", r.If), op("factor", r.Factor), op("r12", r.R12)}}
	if r.Checked {
		out.Extra = append(out.Extra, op("ok", kq(b2f(r.Within), calc.Dimensionless, calc.KindCount)))
	}
	return out, nil
}
