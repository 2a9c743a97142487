package site

import (
	"fmt"
	"math"
	"strings"

	"argand/calc"
	"argand/reduce/threephase"
)

// loadingFuncs are the worksheet functions for motor starting and for
// transformers under load.
func loadingFuncs() []calc.Func {
	return []calc.Func{
		{Name: "lrmultiple", Params: []calc.Param{{Name: "Ir", Kind: calc.ParamCurrent, Doc: "rated current"}, {Name: "k", Kind: calc.ParamRatio, Doc: "I_LR/I_r"}, {Name: "V", Kind: calc.ParamVoltage, Doc: "rated voltage, line-to-line"}}, Args: "(Ir, k, V)", Min: 3, Max: 3,
			Doc:     "locked-rotor current of a three-phase motor as k times its rated current Ir at rated line voltage V; .sa (starting |S|)",
			Formula: "I_LR = k·I_r, |S_LR| = √3·V·I_LR",
			Call:    threephase.Voltages(calc.LineToLine, threephase.Always, map[int]string{2: "V"}, lrCall("lrmultiple", "Ir", calc.DimCurrent, "k", LockedRotorFromMultiple))},
		{Name: "lrkva", Params: []calc.Param{{Name: "Pout", Kind: calc.ParamActivePower, Doc: "rated shaft output", Else: "the rated output is in W, kW, hp or hp_metric"}, {Name: "r", Kind: calc.ParamRatio, Doc: "locked-rotor VA per W, as 6 kVA/kW or 5 kVA/hp"}, {Name: "V", Kind: calc.ParamVoltage, Doc: "rated voltage, line-to-line"}}, Args: "(Pout, r, V)", Min: 3, Max: 3,
			Doc:     "locked-rotor current from the maker's starting apparent power per unit of rated output r (6 kVA/kW, 5 kVA/hp, 5 kVA/hp_metric); .sa",
			Formula: "|S_LR| = r·P_out, I_LR = |S_LR|/(√3·V)",
			Call:    threephase.Voltages(calc.LineToLine, threephase.Always, map[int]string{2: "V"}, lrCall("lrkva", "Pout", calc.DimPower, "r", LockedRotorFromKVA))},
		{Name: "motorstart", Params: []calc.Param{{Name: "Ilr", Kind: calc.ParamCurrent, Doc: "locked-rotor current at rated voltage"}, {Name: "pfLR", Kind: calc.ParamRatio, Doc: "locked-rotor power factor"}, {Name: "V", Kind: calc.ParamVoltage, Doc: "rated voltage, line-to-line"}, {Name: "Zs", Kind: calc.ParamPowerOrImpedance, Doc: "source: Ω per phase at V, or a fault level in VA"}, {Name: "Zt", Kind: calc.ParamImpedance, Doc: "transformer, Ω per phase at V"}, {Name: "Zc", Kind: calc.ParamImpedance, Doc: "cable, Ω per phase"}, {Name: "method", Kind: calc.ParamWord, Doc: "direct|stardelta|autotransformer|limit", Optional: true}, {Name: "setting", Kind: calc.ParamAny, Doc: "the tap (0.65 or 65 %) or the current limit in A", Optional: true}}, Args: "(Ilr, pfLR, V, Zs, Zt, Zc[, direct|stardelta|autotransformer|limit[, tap or Ilim]])", Min: 6, Max: 8,
			Words:   []string{"direct", "stardelta", "autotransformer", "limit"},
			Doc:     "voltage at the motor while a three-phase motor starts through source, transformer and cable (Ω per phase at the motor's voltage; Zs may be a fault level in VA); .dip .vbus .dipbus .vsupply .dipsupply .approx .approxbus .approxsupply (dips in per cent) .i .sa .torque .zeq",
			Formula: "I = (V/√3)/(Zs + Zt + Zc + m·Z_LR), m = 1, 3, 1/tap² or set by the limit; dip ≈ Σ|Z_up|/Σ|Z| (kVA method)",
			Call:    threephase.Voltages(calc.LineToLine, threephase.Always, map[int]string{2: "V"}, callMotorStart)},
		{Name: "xfmrreg", Params: []calc.Param{{Name: "S", Kind: calc.ParamApparentPower, Else: "a rating is an apparent power in VA"}, {Name: "V1", Kind: calc.ParamVoltage, Doc: "rated, line-to-line for three-phase"}, {Name: "V2", Kind: calc.ParamVoltage, Doc: "rated, line-to-line for three-phase"}, {Name: "z", Kind: calc.ParamRatio, Doc: "%Z"}, {Name: "xr", Kind: calc.ParamAny, Doc: "X/R, or the load loss Pk in W"}, {Name: "load", Kind: calc.ParamAny, Doc: "per unit (0.8 or 80 %), in A or in VA"}, {Name: "pf", Kind: calc.ParamRatio}, {Name: "sense", Kind: calc.ParamWord, Doc: "lagging|leading"}, {Name: "phases", Kind: calc.ParamWord, Doc: "single|three", Optional: true}}, Args: "(S, V1, V2, %Z, X/R or Pk, load, pf, lagging|leading[, single|three])", Min: 8, Max: 9,
			Words:   []string{"lagging", "leading", "single", "three"},
			Doc:     "regulation of a transformer at a load (per unit, %, A or VA) and power factor, primary at rated voltage; X/R, or the load loss Pk in W; value in per cent of the no-load voltage; .v .i .approx .second",
			Formula: "E = V_load + Z2·I (exact);  ε ≈ n·(u_r·cos φ + u_x·sin φ) [+ n²·(u_x·cos φ − u_r·sin φ)²/200]",
			Call:    threephase.Voltages(calc.LineToLine, threephase.UnlessSingle, map[int]string{1: "V1", 2: "V2"}, callXfmrReg)},
		{Name: "xfmreff", Params: []calc.Param{{Name: "S", Kind: calc.ParamApparentPower, Else: "a rating is an apparent power in VA"}, {Name: "P0", Kind: calc.ParamActivePower, Doc: "no-load loss", Else: "a loss is an active power in W"}, {Name: "Pk", Kind: calc.ParamActivePower, Doc: "load loss at rated current", Else: "a loss is an active power in W"}, {Name: "load", Kind: calc.ParamAny, Doc: "per unit (0.8 or 80 %) or in VA"}, {Name: "pf", Kind: calc.ParamRatio}}, Args: "(S, P0, Pk, load, pf)", Min: 5, Max: 5,
			Doc:     "efficiency of a transformer at a load (per unit, % or VA) from no-load loss P0 and load loss Pk at rated current; .nmax .smax .etamax .pout .loss",
			Formula: "η = n·S·PF/(n·S·PF + P0 + n²·Pk), n_max = √(P0/Pk)",
			Call:    callXfmrEff},
		{Name: "xfmrshare", Params: []calc.Param{{Name: "V2", Kind: calc.ParamVoltage, Doc: "rated LV voltage, line-to-line"}, {Name: "SA", Kind: calc.ParamApparentPower, Else: "a rating is an apparent power in VA"}, {Name: "zA", Kind: calc.ParamRatio, Doc: "%Z of A"}, {Name: "xrA", Kind: calc.ParamAny, Doc: "X/R of A, or its load loss in W"}, {Name: "SB", Kind: calc.ParamApparentPower, Else: "a rating is an apparent power in VA"}, {Name: "zB", Kind: calc.ParamRatio, Doc: "%Z of B"}, {Name: "xrB", Kind: calc.ParamAny, Doc: "X/R of B, or its load loss in W"}, {Name: "Sload", Kind: calc.ParamSPower, Doc: "the load at rated voltage", Else: "give the load as an apparent power in VA and its pf apart"}, {Name: "pf", Kind: calc.ParamRatio}, {Name: "sense", Kind: calc.ParamWord, Doc: "lagging|leading"}, {Name: "dv", Kind: calc.ParamRatio, Doc: "ΔV%: A's open-circuit voltage above B's", Optional: true}}, Args: "(V2, SA, %ZA, X/RA or PkA, SB, %ZB, X/RB or PkB, Sload, pf, lagging|leading[, ΔV%])", Min: 10, Max: 11,
			Words:   []string{"lagging", "leading"},
			Doc:     "load sharing of two three-phase transformers in parallel by their impedances, ΔV% = A's open-circuit voltage above B's; value S of A; .sb .pcta .pctb .approxa .approxb .ia .ib .il .ic .vbus",
			Formula: "I_k = (E_k − V_bus)/Z_k, I_c = (E_A − E_B)/(Z_A + Z_B);  S_A ≈ S_L·(S_rA/u_A)/(S_rA/u_A + S_rB/u_B)",
			Call:    threephase.Voltages(calc.LineToLine, threephase.Always, map[int]string{0: "V2"}, callXfmrShare)},
		{Name: "vgroup", Params: []calc.Param{{Name: "x", Kind: calc.ParamVoltageOrCurrent}, {Name: "clock", Kind: calc.ParamRatio, Doc: "clock number 0 to 11"}, {Name: "dir", Kind: calc.ParamWord, Doc: "tolv|tohv"}, {Name: "ratio", Kind: calc.ParamRatio, Doc: "V_HV/V_LV", Optional: true}, {Name: "seq", Kind: calc.ParamWord, Doc: "positive|negative sequence", Optional: true}}, Args: "(x, clock, tolv|tohv[, V_HV/V_LV][, positive|negative])", Min: 3, Max: 5,
			Words:   []string{"tolv", "tohv", "positive", "negative"},
			Doc:     "a voltage or current phasor referred across a transformer of vector-group clock number (Dyn11: 11); the LV phasor lags the HV one by clock·30° (IEC 60076-1); .turn",
			Formula: "x' = x·∠(−clock·30°) HV to LV, ∠(+clock·30°) LV to HV; opposite for the negative sequence",
			Call:    callVGroup},
	}
}

// pctArg reads a per-cent figure written as a plain number of per cent
// (4.5) or with the per-cent sign (4.5 %, which the language reads as
// 0.045): both mean 4.5 per cent.
func pctArg(fn, what string, a calc.Arg) (float64, error) {
	x, err := realArg(fn, what, a, calc.Dimensionless)
	if err != nil {
		return 0, err
	}
	if strings.HasSuffix(strings.TrimSpace(a.Text), "%") {
		x *= 100
	}
	return x, nil
}

// xrArg reads a transformer's X/R, or its load loss in W from which X/R
// follows (XRFromLoss); the note says which.
func xrArg(fn, what string, a calc.Arg, s, pctZ float64) (float64, string, error) {
	if a.Word == "" && a.Q.Dim == calc.DimPower {
		if a.Q.Kind != calc.KindActive && a.Q.Kind != calc.KindPlain {
			return 0, "", fmt.Errorf("%s: %s is an X/R or a load loss in W, not %s", fn, what, a.Text)
		}
		pk, err := realArg(fn, what, a, calc.DimPower)
		if err != nil {
			return 0, "", err
		}
		xr, err := XRFromLoss(s, pctZ, pk)
		if err != nil {
			return 0, "", fmt.Errorf("%s: %v", fn, err)
		}
		return xr, "X/R = " + sig(xr) + " from the load loss " + a.Text + ": u_r = 100·Pk/S, u_x = √(u_z² − u_r²)", nil
	}
	xr, err := realArg(fn, what, a, calc.Dimensionless)
	return xr, "", err
}

// loadArg reads a load as a fraction of the rating: a plain number (0.75
// or 75 %), an apparent power in VA over the rating sRated, or, when
// iRated > 0, a current in A over the rated current.
func loadArg(fn string, a calc.Arg, sRated, iRated float64) (float64, error) {
	if a.Word != "" {
		return 0, fmt.Errorf("%s: the load must be a value, not the word %q", fn, a.Word)
	}
	q := a.Q
	if !q.IsReal() {
		return 0, fmt.Errorf("%s: the load %s must be a real value (its magnitude); the power factor is a separate argument", fn, a.Text)
	}
	x := real(q.V)
	switch {
	case q.Dim.IsDimensionless():
		return x, nil
	case q.Dim == calc.DimPower && q.Kind == calc.KindActive:
		return 0, fmt.Errorf("%s: the load %s is in W; give it in VA, A or per unit (pf is separate)", fn, a.Text)
	case q.Dim == calc.DimPower:
		return x / sRated, nil
	case q.Dim == calc.DimCurrent && iRated > 0:
		return x / iRated, nil
	}
	want := "a per-unit load (0.75 or 75 %) or an apparent power in VA"
	if iRated > 0 {
		want = "a per-unit load (0.75 or 75 %), an apparent power in VA or a current in A"
	}
	return 0, fmt.Errorf("%s: the load %s must be %s, not %s", fn, a.Text, want, calc.QuantityWord(q))
}

// real1 names one real argument for readReals: where its value goes,
// its name in messages and its dimension.
type real1 struct {
	p    *float64
	name string
	d    calc.Dim
}

// readReals reads args[k] into specs[k] in order, stopping at the first
// argument of the wrong kind.
func readReals(fn string, args []calc.Arg, specs ...real1) error {
	for k, s := range specs {
		x, err := realArg(fn, s.name, args[k], s.d)
		if err != nil {
			return err
		}
		*s.p = x
	}
	return nil
}

// lrCall is a locked-rotor function of (rating, figure, V): the rating is a
// current or an output power as dim says.
func lrCall(fn, rating string, dim calc.Dim, figure string, solve func(a, b, v float64) (LockedRotor, error)) func(*calc.Context, []calc.Arg) (calc.Result, error) {
	return func(c *calc.Context, args []calc.Arg) (calc.Result, error) {
		if dim == calc.DimPower && args[0].Word == "" && args[0].Q.Dim == calc.DimPower && args[0].Q.Kind != calc.KindActive && args[0].Q.Kind != calc.KindPlain {
			return calc.Result{}, fmt.Errorf("%s: %s is the rated shaft output in W, kW, hp or hp_metric, not %s", fn, rating, args[0].Text)
		}
		var a, b, v float64
		if err := readReals(fn, args, real1{&a, rating, dim}, real1{&b, figure, calc.Dimensionless}, real1{&v, "V", calc.DimVoltage}); err != nil {
			return calc.Result{}, err
		}
		r, err := solve(a, b, v)
		if err != nil {
			return calc.Result{}, fmt.Errorf("%s: %v", fn, err)
		}
		return calc.Result{Value: r.I, Steps: []calc.Step{r.Step}, Cautions: calc.CautionsOf(calc.CautionMotor),
			Extra: []calc.Operand{op("sa", r.S)}}, nil
	}
}

func callMotorStart(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	const fn = "motorstart"
	var st Start
	err := readReals(fn, args, real1{&st.ILR, "Ilr", calc.DimCurrent}, real1{&st.PFLR, "pfLR", calc.Dimensionless}, real1{&st.V, "V", calc.DimVoltage})
	if err != nil {
		return calc.Result{}, err
	}
	var notes []string
	for k, z := range []*complex128{&st.Zs, &st.Zt, &st.Zc} {
		a := args[3+k]
		what := [3]string{"Zs", "Zt", "Zc"}[k]
		if a.Word != "" {
			return calc.Result{}, fmt.Errorf("%s: %s must be an impedance, not the word %q", fn, what, a.Word)
		}
		switch {
		case a.Q.Dim == calc.DimImpedance:
			*z = a.Q.V
		case k == 0 && a.Q.Dim == calc.DimPower && a.Q.IsReal() && real(a.Q.V) > 0 && a.Q.Kind != calc.KindActive && a.Q.Kind != calc.KindReactive:
			*z = complex(0, st.V*st.V/real(a.Q.V))
			notes = append(notes, "the source is taken from its fault level as a pure reactance Zs = j·V²/S_sc at the motor's voltage")
		default:
			want := "an impedance in Ω per phase at the motor's voltage"
			if k == 0 {
				want += " or a fault level in VA"
			}
			return calc.Result{}, fmt.Errorf("%s: %s must be %s, got %s", fn, argName(a, what), want, calc.QuantityWord(a.Q))
		}
	}
	if len(args) > 6 {
		w, err := wordArg(fn, args[6], "direct", "stardelta", "autotransformer", "limit")
		if err != nil {
			return calc.Result{}, err
		}
		switch w {
		case "stardelta":
			st.Method = StarDelta
		case "autotransformer":
			st.Method = AutoTransformer
		case "limit":
			st.Method = CurrentLimit
		}
		need := st.Method == AutoTransformer || st.Method == CurrentLimit
		if need != (len(args) == 8) {
			if st.Method == AutoTransformer {
				return calc.Result{}, fmt.Errorf("%s: autotransformer needs the tap after it, such as 0.65 or 65 %%", fn)
			}
			if need {
				return calc.Result{}, fmt.Errorf("%s: limit needs the current limit after it, in A", fn)
			}
			return calc.Result{}, fmt.Errorf("%s: %s takes no value after it", fn, w)
		}
		switch st.Method {
		case AutoTransformer:
			if st.Tap, err = realArg(fn, "tap", args[7], calc.Dimensionless); err != nil {
				return calc.Result{}, err
			}
		case CurrentLimit:
			if st.Limit, err = realArg(fn, "Ilim", args[7], calc.DimCurrent); err != nil {
				return calc.Result{}, err
			}
		}
	}
	r, err := MotorStart(st)
	if err != nil {
		return calc.Result{}, fmt.Errorf("%s: %v", fn, err)
	}
	if len(notes) > 0 {
		r.Steps[0].Notes = append(notes, r.Steps[0].Notes...)
	}
	return calc.Result{Value: r.Vmotor, Steps: r.Steps, Cautions: calc.CautionsOf(calc.CautionMotor), Extra: []calc.Operand{
		op("dip", pct(r.Dip)), op("vbus", r.Vbus), op("dipbus", pct(r.DipBus)), op("vsupply", r.Vsupply), op("dipsupply", pct(r.DipSup)),
		op("approx", pct(r.Approx)), op("approxbus", pct(r.ApproxBus)), op("approxsupply", pct(r.ApproxSup)),
		op("i", r.I), op("sa", r.S), op("torque", num(r.Torque)), op("zeq", r.Zeq)}}, nil
}

func callXfmrReg(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	const fn = "xfmrreg"
	var note string
	qs, words := split(args)
	if len(qs) != 7 {
		return calc.Result{}, fmt.Errorf("%s takes (S, V1, V2, %%Z, X/R or Pk, load, pf, lagging|leading[, single|three])", fn)
	}
	if has(words, "lagging") == has(words, "leading") {
		return calc.Result{}, fmt.Errorf("%s: give one of lagging or leading", fn)
	}
	n, err := nameplateArgs(fn, qs[:4], words)
	if err != nil {
		return calc.Result{}, err
	}
	if n.PctZ, err = pctArg(fn, "%Z", qs[3]); err != nil {
		return calc.Result{}, err
	}
	n.XR, note, err = xrArg(fn, "X/R", qs[4], n.S, n.PctZ)
	if err != nil {
		return calc.Result{}, err
	}
	k := math.Sqrt(3)
	if n.SinglePhase {
		k = 1
	}
	load, err := loadArg(fn, qs[5], n.S, n.S/(k*n.V2))
	if err != nil {
		return calc.Result{}, err
	}
	pf, err := realArg(fn, "pf", qs[6], calc.Dimensionless)
	if err != nil {
		return calc.Result{}, err
	}
	r, err := Regulation(n, load, pf, has(words, "leading"))
	if err != nil {
		return calc.Result{}, fmt.Errorf("%s: %v", fn, err)
	}
	if note != "" {
		r.Steps[0].Notes = append([]string{note}, r.Steps[0].Notes...)
	}
	if qs[5].Q.Dim == calc.DimPower {
		r.Steps[1].Notes = append([]string{"the load in VA is taken at rated voltage: n = |S|/S_rated"}, r.Steps[1].Notes...)
	}
	return calc.Result{Value: pct(r.Reg), Steps: r.Steps, Cautions: calc.CautionsOf(calc.CautionTransformer), Extra: []calc.Operand{
		op("v", r.Vload), op("i", r.I), op("approx", pct(r.Approx)), op("second", pct(r.Second))}}, nil
}

func callXfmrEff(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	const fn = "xfmreff"
	if args[0].Word == "" && args[0].Q.Dim == calc.DimPower && args[0].Q.Kind == calc.KindActive {
		return calc.Result{}, fmt.Errorf("%s: the rating S is an apparent power in VA, not %s", fn, args[0].Text)
	}
	s, err := realArg(fn, "S", args[0], calc.DimPower)
	if err != nil {
		return calc.Result{}, err
	}
	var p [2]float64
	for k, what := range []string{"P0", "Pk"} {
		a := args[1+k]
		if a.Word == "" && a.Q.Dim == calc.DimPower && a.Q.Kind != calc.KindActive && a.Q.Kind != calc.KindPlain {
			return calc.Result{}, fmt.Errorf("%s: %s is a loss, an active power in W, not %s", fn, what, a.Text)
		}
		if p[k], err = realArg(fn, what, a, calc.DimPower); err != nil {
			return calc.Result{}, err
		}
	}
	load, err := loadArg(fn, args[3], s, 0)
	if err != nil {
		return calc.Result{}, err
	}
	pf, err := realArg(fn, "pf", args[4], calc.Dimensionless)
	if err != nil {
		return calc.Result{}, err
	}
	r, err := Efficiency(s, p[0], p[1], load, pf)
	if err != nil {
		return calc.Result{}, fmt.Errorf("%s: %v", fn, err)
	}
	return calc.Result{Value: num(r.Eta), Steps: r.Steps, Extra: []calc.Operand{
		op("nmax", num(r.NMax)), op("smax", r.SMax), op("etamax", num(r.EtaMax)), op("pout", r.Pout), op("loss", r.Losses)}}, nil
}

func callXfmrShare(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	const fn = "xfmrshare"
	qs, words := split(args)
	if len(qs) < 9 || len(qs) > 10 || len(words) != 1 {
		return calc.Result{}, fmt.Errorf("%s takes (V2, SA, %%ZA, X/RA or PkA, SB, %%ZB, X/RB or PkB, Sload, pf, lagging|leading[, ΔV%%])", fn)
	}
	var p Parallel
	var err error
	var notes []string
	if p.V2, err = realArg(fn, "V2", qs[0], calc.DimVoltage); err != nil {
		return calc.Result{}, err
	}
	for k, u := range []*Unit{&p.A, &p.B} {
		name := [2]string{"A", "B"}[k]
		b := qs[1+3*k:]
		if u.S, err = realArg(fn, "S"+name, b[0], calc.DimPower); err != nil {
			return calc.Result{}, err
		}
		if u.PctZ, err = pctArg(fn, "%Z"+name, b[1]); err != nil {
			return calc.Result{}, err
		}
		var note string
		if u.XR, note, err = xrArg(fn, "X/R"+name, b[2], u.S, u.PctZ); err != nil {
			return calc.Result{}, err
		}
		if note != "" {
			notes = append(notes, name+": "+note)
		}
	}
	if qs[7].Q.Dim == calc.DimPower && qs[7].Q.Kind == calc.KindActive {
		return calc.Result{}, fmt.Errorf("%s: Sload %s is an active power; give the apparent power in VA, the power factor is a separate argument", fn, qs[7].Text)
	}
	if p.Load, err = realArg(fn, "Sload", qs[7], calc.DimPower); err != nil {
		return calc.Result{}, err
	}
	if p.PF, err = realArg(fn, "pf", qs[8], calc.Dimensionless); err != nil {
		return calc.Result{}, err
	}
	if len(qs) == 10 {
		if p.DeltaV, err = pctArg(fn, "ΔV%", qs[9]); err != nil {
			return calc.Result{}, err
		}
	}
	p.Lead = has(words, "leading")
	if !p.Lead && !has(words, "lagging") {
		return calc.Result{}, fmt.Errorf("%s: give lagging or leading", fn)
	}
	r, err := ShareLoad(p)
	if err != nil {
		return calc.Result{}, fmt.Errorf("%s: %v", fn, err)
	}
	r.Steps[0].Notes = append(notes, r.Steps[0].Notes...)
	return calc.Result{Value: r.SA, Steps: r.Steps, Cautions: calc.CautionsOf(calc.CautionTransformer), Extra: []calc.Operand{
		op("sb", r.SB), op("pcta", pct(r.PctA)), op("pctb", pct(r.PctB)), op("approxa", pct(r.ApproxA)), op("approxb", pct(r.ApproxB)),
		op("ia", r.IA), op("ib", r.IB), op("il", r.IL), op("ic", r.Ic), op("vbus", r.Vbus)}}, nil
}

func callVGroup(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	const fn = "vgroup"
	qs, words := split(args)
	if len(qs) < 2 || len(qs) > 3 {
		return calc.Result{}, fmt.Errorf("%s takes (x, clock, tolv|tohv[, V_HV/V_LV][, positive|negative])", fn)
	}
	if has(words, "tolv") == has(words, "tohv") {
		return calc.Result{}, fmt.Errorf("%s: give one of tolv or tohv", fn)
	}
	if qs[0].Q.Dim != calc.DimVoltage && qs[0].Q.Dim != calc.DimCurrent {
		return calc.Result{}, fmt.Errorf("%s: %s must be a voltage or a current phasor, got %s", fn, argName(qs[0], "x"), calc.QuantityWord(qs[0].Q))
	}
	h, err := realArg(fn, "clock", qs[1], calc.Dimensionless)
	if err != nil {
		return calc.Result{}, err
	}
	if h != math.Trunc(h) || h < 0 || h > 11 {
		return calc.Result{}, fmt.Errorf("%s: the clock number must be a whole number from 0 to 11 (Dyn11 is 11), got %s", fn, qs[1].Text)
	}
	ratio := 0.0
	if len(qs) == 3 {
		if ratio, err = realArg(fn, "V_HV/V_LV", qs[2], calc.Dimensionless); err != nil {
			return calc.Result{}, err
		}
		if ratio <= 0 {
			return calc.Result{}, fmt.Errorf("%s: the ratio V_HV/V_LV must be positive, got %s", fn, qs[2].Text)
		}
	}
	seq := c.Sequence
	if seq == 0 {
		seq = 1
	}
	x, st, err := VectorShift(qs[0].Q, int(h), has(words, "tolv"), has(words, "negative"), seq, ratio)
	if err != nil {
		return calc.Result{}, fmt.Errorf("%s: %v", fn, err)
	}
	return calc.Result{Value: x, Steps: []calc.Step{st}, Cautions: calc.CautionsOf(calc.CautionTransformer), Extra: []calc.Operand{op("turn", st.Results[1].Value)}}, nil
}
