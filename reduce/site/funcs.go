package site

import (
	"fmt"
	"math"
	"strings"

	"argand/calc"
	"argand/reduce/threephase"
)

// Funcs returns the worksheet functions of this package. Each checks the
// number, kind and unit of its arguments and names the argument in its
// errors. Tolerance ranges re-evaluate expressions, so they are reached
// through Range by the worksheet interpreter rather than as a function.
func Funcs() []calc.Func {
	fs := []calc.Func{
		radialFunc(),
		{Name: "fromvi", Params: []calc.Param{{Name: "V", Kind: calc.ParamVoltage}, {Name: "I", Kind: calc.ParamCurrent}, {Name: "φ", Kind: calc.ParamAngle}}, Args: "(V, I, φ)", Min: 3, Max: 3,
			Doc:     "equivalent series and parallel R and X, and the L or C they imply, from RMS readings of V, I and the angle by which V leads I; .rs .xs .rp .xp .ls .cs .lp .cp .p .q .s .pf",
			Formula: "Z = (V/I)∠φ; Rs = P/I², Xs = Q/I²; Rp = V²/P, Xp = V²/Q; L = X/ω, C = −1/(ω·X)",
			Call:    callFromVI},
		{Name: "fromvip", Params: []calc.Param{{Name: "V", Kind: calc.ParamVoltage}, {Name: "I", Kind: calc.ParamCurrent}, {Name: "P", Kind: calc.ParamActivePower}, {Name: "sense", Kind: calc.ParamWord, Doc: "lagging|leading"}}, Args: "(V, I, P, lagging|leading)", Min: 4, Max: 4, Words: []string{"lagging", "leading"},
			Doc:     "equivalent series and parallel R and X from RMS V, I and real power P; the sign of X as stated; .rs .xs .rp .xp .ls .cs .lp .cp .p .q .s .pf",
			Formula: "|Q| = √(S² − P²), S = V·I; Rs = P/I², Xs = Q/I²; Rp = V²/P, Xp = V²/Q",
			Call:    callFromVIP},
		{Name: "frompf", Params: []calc.Param{{Name: "P", Kind: calc.ParamActivePower}, {Name: "pf", Kind: calc.ParamRatio}, {Name: "V", Kind: calc.ParamVoltage}, {Name: "sense", Kind: calc.ParamWord, Doc: "lagging|leading"}}, Args: "(P, pf, V, lagging|leading)", Min: 4, Max: 4, Words: []string{"lagging", "leading"},
			Doc:     "equivalent series and parallel R and X from real power, power factor and RMS voltage; .rs .xs .rp .xp .ls .cs .lp .cp .i .q .s",
			Formula: "S = P/pf, I = S/V, |Q| = √(S² − P²); Rs = P/I², Xs = Q/I²",
			Call:    callFromPF},
		{Name: "pp2rms", Params: []calc.Param{{Name: "Xpp", Kind: calc.ParamAny}}, Args: "(Xpp)", Min: 1, Max: 1,
			Doc:     "RMS value of a sinusoid from an oscilloscope's peak-to-peak reading; .peak",
			Formula: "X_rms = X_pp/(2√2), X_pk = X_pp/2",
			Call:    callPP2RMS},
		{Name: "delay2phase", Params: []calc.Param{{Name: "dt", Kind: calc.ParamTime}, {Name: "f", Kind: calc.ParamFrequency, Optional: true}}, Args: "(Δt[, f])", Min: 1, Max: 2,
			Doc:     "phase angle by which trace 1 leads trace 2, from the time Δt by which trace 2 follows trace 1 (at f, or the working frequency)",
			Formula: "φ = 360°·f·Δt, reduced to (−180°, 180°]",
			Call:    callDelay},
		{Name: "rotation", Params: []calc.Param{{Name: "θA", Kind: calc.ParamAngle}, {Name: "θB", Kind: calc.ParamAngle}, {Name: "θC", Kind: calc.ParamAngle}}, Args: "(θA, θB, θC)", Min: 3, Max: 3,
			Doc:     "phase sequence from three measured phase angles: +1 for ABC, −1 for ACB; .erra .errb .errc from the ideal set with A as reference",
			Formula: "ABC: θB − θA ≈ −120°, θC − θA ≈ +120°; ACB: the signs swap",
			Call:    callRotation},
		{Name: "preferred", Params: []calc.Param{{Name: "x", Kind: calc.ParamAny}, {Name: "series", Kind: calc.ParamWord, Doc: "E6|E12|E24|E48|E96"}}, Args: "(x, E6|E12|E24|E48|E96)", Min: 2, Max: 2, Words: []string{"E6", "E12", "E24", "E48", "E96"},
			Doc:     "nearest IEC 60063 preferred value to x; .below .above with .errpct .belowpct .abovepct in per cent",
			Formula: "error = (preferred − x)/x",
			Call:    callPreferred},
		{Name: "cabledrop", Params: []calc.Param{{Name: "Vs", Kind: calc.ParamVoltage, Doc: "line-to-line for three-phase"}, {Name: "I", Kind: calc.ParamCurrent}, {Name: "pf", Kind: calc.ParamRatio}, {Name: "sense", Kind: calc.ParamWord, Doc: "lagging|leading"}, {Name: "Rlen", Kind: calc.ParamPerLength, Doc: "R' per length of one conductor"}, {Name: "Xlen", Kind: calc.ParamPerLength, Doc: "X' per length of one conductor"}, {Name: "length", Kind: calc.ParamLength}, {Name: "phases", Kind: calc.ParamWord, Doc: "single|three"}, {Name: "Vnom", Kind: calc.ParamVoltage, Doc: "line-to-line for three-phase", Optional: true}}, Args: "(Vs, I, pf, lagging|leading, R', X', length, single|three[, Vnom])", Min: 8, Max: 9,
			Words:   []string{"lagging", "leading", "single", "three"},
			Doc:     "voltage at the load end of a cable run (R', X' per length of one conductor; Vs and Vnom line-to-line for three-phase); .drop .pct .approx .diff .z",
			Formula: "Vs = Vload + Z·I (exact);  ΔV ≈ k·I·(R'·cos φ + X'·sin φ)·L, k = 2 single-phase, √3 three-phase",
			Call:    callCableDrop},
		{Name: "rtemp", Params: []calc.Param{{Name: "R1", Kind: calc.ParamAny, Doc: "a resistance, or a resistance per length"}, {Name: "T1", Kind: calc.ParamTemperature}, {Name: "T2", Kind: calc.ParamTemperature}, {Name: "metal", Kind: calc.ParamWord, Doc: "copper|aluminium"}}, Args: "(R1, T1, T2, copper|aluminium)", Min: 4, Max: 4, Words: []string{"copper", "aluminium", "aluminum"},
			Doc:     "conductor resistance at T2 (°C) from R1 at T1 (°C); α20 from IEC 60228 / IEC 60287-1-1",
			Formula: "R2 = R1·(1 + α20·(T2 − 20))/(1 + α20·(T1 − 20))",
			Call:    callRTemp},
		{Name: "refer", Params: []calc.Param{{Name: "x", Kind: calc.ParamAny}, {Name: "n", Kind: calc.ParamRatio, Doc: "turns ratio N1/N2"}, {Name: "side", Kind: calc.ParamWord, Doc: "primary|secondary"}}, Args: "(x, N1/N2, primary|secondary)", Min: 3, Max: 3, Words: []string{"primary", "secondary"},
			Doc:     "an impedance, voltage or current referred to the named side of an ideal transformer of turns ratio N1/N2",
			Formula: "to the primary: Z·a², V·a, I/a (a = N1/N2); to the secondary the inverse",
			Call:    callRefer},
		{Name: "xfmr", Params: []calc.Param{{Name: "S", Kind: calc.ParamApparentPower, Else: "a rating is an apparent power in VA"}, {Name: "V1", Kind: calc.ParamVoltage, Doc: "rated, line-to-line for three-phase"}, {Name: "V2", Kind: calc.ParamVoltage, Doc: "rated, line-to-line for three-phase"}, {Name: "z", Kind: calc.ParamRatio, Doc: "%Z"}, {Name: "xr", Kind: calc.ParamRatio, Doc: "X/R", Optional: true}, {Name: "phases", Kind: calc.ParamWord, Doc: "single|three", Optional: true}}, Args: "(S, V1, V2, %Z[, X/R][, single|three])", Min: 4, Max: 6, Words: []string{"single", "three"},
			Doc:     "transformer impedance referred to the secondary from its nameplate (V1, V2 rated line-to-line for three-phase); .z1 .zbase1 .zbase2 .i1 .i2 .isc1 .isc2",
			Formula: "Z_base = V²/S, Z = (%Z/100)·Z_base ∠ atan(X/R); I_sc = I_rated/(%Z/100)",
			Call:    callXfmr},
		{Name: "faultcurrent", Params: []calc.Param{{Name: "S", Kind: calc.ParamApparentPower, Else: "a rating is an apparent power in VA"}, {Name: "V1", Kind: calc.ParamVoltage, Doc: "rated, line-to-line for three-phase"}, {Name: "V2", Kind: calc.ParamVoltage, Doc: "rated, line-to-line for three-phase"}, {Name: "z", Kind: calc.ParamRatio, Doc: "%Z"}, {Name: "xr", Kind: calc.ParamRatio, Doc: "X/R"}, {Name: "source", Kind: calc.ParamPowerOrImpedance, Doc: "Ssc or Zs"}, {Name: "Rlen", Kind: calc.ParamPerLength, Optional: true}, {Name: "Xlen", Kind: calc.ParamPerLength, Optional: true}, {Name: "length", Kind: calc.ParamLength, Optional: true}, {Name: "phases", Kind: calc.ParamWord, Doc: "single|three", Optional: true}}, Args: "(S, V1, V2, %Z, X/R, Ssc or Zs[, R', X', length][, single|three])", Min: 6, Max: 10, Words: []string{"single", "three"},
			Doc:     "prospective symmetrical fault current at the end of a cable fed by a transformer (V1, V2 rated line-to-line for three-phase; Ssc = 0 for an infinite bus); .terminals .infinite .z",
			Formula: "I = V2/(k·|Zs/a² + Zt + Zc|), k = √3 three-phase, 1 single-phase (cable loop 2·Zc)",
			Call:    callFault},
		{Name: "pubase", Params: []calc.Param{{Name: "S", Kind: calc.ParamApparentPower, Else: "a rating is an apparent power in VA"}, {Name: "VLL", Kind: calc.ParamVoltage, Doc: "line-to-line base voltage"}}, Args: "(S, VLL)", Min: 2, Max: 2,
			Doc:     "per-unit impedance base for a three-phase S and line-to-line V; .ibase",
			Formula: "Z_base = V²/S, I_base = S/(√3·V)",
			Call:    callPUBase},
		{Name: "rebase", Params: []calc.Param{{Name: "Z", Kind: calc.ParamNumber, Doc: "per unit"}, {Name: "Sold", Kind: calc.ParamApparentPower, Else: "a rating is an apparent power in VA"}, {Name: "Vold", Kind: calc.ParamVoltage, Doc: "line-to-line"}, {Name: "Snew", Kind: calc.ParamApparentPower, Else: "a rating is an apparent power in VA"}, {Name: "Vnew", Kind: calc.ParamVoltage, Doc: "line-to-line"}}, Args: "(Z, Sold, Vold, Snew, Vnew)", Min: 5, Max: 5,
			Doc:     "per-unit impedance on a new base (three-phase bases: S total, Vold and Vnew line-to-line)",
			Formula: "Z_new = Z_old·(V_old/V_new)²·(S_new/S_old)",
			Call:    callRebase},
		{Name: "ct", Params: []calc.Param{{Name: "I", Kind: calc.ParamCurrent}, {Name: "Ip", Kind: calc.ParamCurrent}, {Name: "Is", Kind: calc.ParamCurrent}}, Args: "(I, Ip, Is)", Min: 3, Max: 3,
			Doc:     "primary current from a CT secondary reading, ratio Ip/Is",
			Formula: "I_primary = I·Ip/Is",
			Call:    ratioCall("ct", calc.DimCurrent, true)},
		{Name: "ctsec", Params: []calc.Param{{Name: "I", Kind: calc.ParamCurrent}, {Name: "Ip", Kind: calc.ParamCurrent}, {Name: "Is", Kind: calc.ParamCurrent}}, Args: "(I, Ip, Is)", Min: 3, Max: 3,
			Doc:     "CT secondary current for a primary current, ratio Ip/Is",
			Formula: "I_secondary = I·Is/Ip",
			Call:    ratioCall("ctsec", calc.DimCurrent, false)},
		{Name: "vt", Params: []calc.Param{{Name: "V", Kind: calc.ParamVoltage}, {Name: "Vp", Kind: calc.ParamVoltage}, {Name: "Vs", Kind: calc.ParamVoltage}}, Args: "(V, Vp, Vs)", Min: 3, Max: 3,
			Doc:     "primary voltage from a VT secondary reading, ratio Vp/Vs",
			Formula: "V_primary = V·Vp/Vs",
			Call:    ratioCall("vt", calc.DimVoltage, true)},
		{Name: "vtsec", Params: []calc.Param{{Name: "V", Kind: calc.ParamVoltage}, {Name: "Vp", Kind: calc.ParamVoltage}, {Name: "Vs", Kind: calc.ParamVoltage}}, Args: "(V, Vp, Vs)", Min: 3, Max: 3,
			Doc:     "VT secondary voltage for a primary voltage, ratio Vp/Vs",
			Formula: "V_secondary = V·Vs/Vp",
			Call:    ratioCall("vtsec", calc.DimVoltage, false)},
		{Name: "readcheck", Params: []calc.Param{{Name: "reading", Kind: calc.ParamAny}, {Name: "pct", Kind: calc.ParamRatio}, {Name: "digits", Kind: calc.ParamRatio}, {Name: "resolution", Kind: calc.ParamAny}, {Name: "min", Kind: calc.ParamAny}, {Name: "max", Kind: calc.ParamAny}}, Args: "(reading, pct, digits, resolution, min, max)", Min: 6, Max: 6,
			Doc:     "whether a reading ± (pct % of reading + digits × resolution) overlaps [min, max]; returns the miss (0 when it overlaps); .pct .low .high",
			Formula: "band = |x| ± (pct/100·|x| + digits·resolution)",
			Call:    callReadCheck},
	}
	fs = append(fs, loadingFuncs()...)
	rated := map[string]string{
		"xfmr":         "the nameplate S, V1, V2",
		"faultcurrent": "the nameplate S, V1, V2 and the fault level",
		"pubase":       "base power and voltage",
		"rebase":       "base powers and voltages",
		"radial":       "the base and the fault level",
		"fromvi":       "meter readings of V and I",
		"fromvip":      "meter readings of V, I and P",
		"frompf":       "the voltage reading",
		"zfeeder":      "the nominal voltage and the feeder's short-circuit current",
		"zxfmr":        "the transformer's rating",
		"ik3":          "the nominal voltage and the short-circuit currents",
		"zsloop":       "the nominal voltage to earth and the fault current",
		"lrmultiple":   "the rated current and voltage",
		"lrkva":        "the rated output and voltage",
		"motorstart":   "the locked-rotor current and the rated voltage",
		"xfmrreg":      "the nameplate S, V1, V2 and the load",
		"xfmreff":      "the rating, the losses and the load",
		"xfmrshare":    "the ratings, V2 and the load",
	}
	fs = append(fs, shortFuncs()...)
	for i := range fs {
		fs[i].Call = guard(fs[i])
		if what, ok := rated[fs[i].Name]; ok {
			fs[i].Call = calc.RMSByDefinition(what, fs[i].Call)
		}
	}
	return fs
}

// guard checks the argument count, so a caller that skips the Min/Max
// check gets an error rather than an index panic.
func guard(f calc.Func) func(*calc.Context, []calc.Arg) (calc.Result, error) {
	call := f.Call
	return func(c *calc.Context, args []calc.Arg) (calc.Result, error) {
		if len(args) < f.Min || (f.Max >= 0 && len(args) > f.Max) {
			return calc.Result{}, fmt.Errorf("%s%s takes %d to %d arguments, got %d", f.Name, f.Args, f.Min, f.Max, len(args))
		}
		if c == nil {
			c = &calc.Context{Freq: 50, Sequence: 1}
		}
		return call(c, args)
	}
}

// split separates bare words from quantities, keeping the order of each.
// lineVoltage reads a three-phase rating or supply voltage in place: every
// such parameter here is line-to-line. A value marked line-to-neutral
// (l2n) is converted by √3; the step shows both forms.
func lineVoltage(c *calc.Context, a *calc.Arg, what string) ([]calc.Step, error) {
	if a.Word != "" {
		return nil, nil
	}
	v, st, err := threephase.Voltage(a.Q, calc.LineToLine, what, threephase.SequenceOf(c), false)
	if err != nil {
		return nil, err
	}
	a.Q = v
	return st, nil
}

// ratedVoltages reads V1 and V2 of a three-phase transformer nameplate
// (arguments 1 and 2) as line-to-line ratings.
func ratedVoltages(c *calc.Context, fn string, qs []calc.Arg, words []string) ([]calc.Step, error) {
	if has(words, "single") {
		return nil, nil
	}
	var pre []calc.Step
	for _, k := range []int{1, 2} {
		st, err := lineVoltage(c, &qs[k], "V"+string(rune('0'+k)))
		if err != nil {
			return nil, fmt.Errorf("%s: %v", fn, err)
		}
		pre = append(pre, st...)
	}
	return pre, nil
}

func split(args []calc.Arg) (qs []calc.Arg, words []string) {
	for _, a := range args {
		if a.Absent {
			continue // a parameter skipped by naming a later one
		}
		if a.Word != "" {
			words = append(words, strings.ToLower(a.Word))
		} else {
			qs = append(qs, a)
		}
	}
	return qs, words
}

func has(words []string, w string) bool {
	for _, x := range words {
		if x == w {
			return true
		}
	}
	return false
}

func argName(a calc.Arg, what string) string {
	if a.Text != "" {
		return what + " (" + a.Text + ")"
	}
	return what
}

// realArg returns a finite real argument of dimension d.
func realArg(fn, what string, a calc.Arg, d calc.Dim) (float64, error) {
	if a.Word != "" {
		return 0, fmt.Errorf("%s: %s must be a value, not the word %q", fn, what, a.Word)
	}
	if a.Q.Dim != d {
		u := calc.UnitSymbol(d, calc.KindPlain, false)
		if d.IsDimensionless() {
			u = "a plain number"
		}
		return 0, fmt.Errorf("%s: %s must be in %s, got %s", fn, argName(a, what), u, calc.DimName(a.Q.Dim, false))
	}
	if !a.Q.IsReal() {
		return 0, fmt.Errorf("%s: %s must be a real value (a reading, not a phasor)", fn, argName(a, what))
	}
	x := real(a.Q.V)
	if err := finite([]string{what}, x); err != nil {
		return 0, fmt.Errorf("%s: %v", fn, err)
	}
	return x, nil
}

// angleArg returns an angle in radians: an angle quantity as is, a plain
// number in the worksheet's angle unit.
func angleArg(c *calc.Context, fn, what string, a calc.Arg) (float64, error) {
	x, err := realArg(fn, what, a, calc.Dimensionless)
	if err != nil {
		return 0, err
	}
	if a.Q.Kind == calc.KindAngle || c.Format.Radians {
		return x, nil
	}
	return rad(x), nil
}

// wordArg returns the word at position i or an error listing the choices.
func wordArg(fn string, a calc.Arg, choices ...string) (string, error) {
	w := strings.ToLower(a.Word)
	for _, c := range choices {
		if w == strings.ToLower(c) {
			return w, nil
		}
	}
	return "", fmt.Errorf("%s: expected %s, got %q", fn, strings.Join(choices, " or "), a.Text)
}

func lower(ops []calc.Operand) []calc.Operand {
	out := make([]calc.Operand, len(ops))
	for i, o := range ops {
		out[i] = calc.Operand{Name: strings.ToLower(o.Name), Value: o.Value}
	}
	return out
}

func componentsResult(comp Components, err error) (calc.Result, error) {
	if err != nil {
		return calc.Result{}, err
	}
	ops := lower(comp.Operands())
	return calc.Result{Value: comp.Z, Extra: ops[1:], Steps: comp.Steps, Notes: comp.Notes, Cautions: calc.CautionsOf(calc.CautionMains)}, nil
}

func callFromVI(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	v, err := realArg("fromvi", "V", args[0], calc.DimVoltage)
	if err != nil {
		return calc.Result{}, err
	}
	i, err := realArg("fromvi", "I", args[1], calc.DimCurrent)
	if err != nil {
		return calc.Result{}, err
	}
	phi, err := angleArg(c, "fromvi", "φ", args[2])
	if err != nil {
		return calc.Result{}, err
	}
	return componentsResult(FromVIAngle(v, i, phi, c.Freq))
}

func lagging(fn string, a calc.Arg) (bool, error) {
	w, err := wordArg(fn, a, "lagging", "leading")
	return w == "lagging", err
}

func callFromVIP(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	v, err := realArg("fromvip", "V", args[0], calc.DimVoltage)
	if err != nil {
		return calc.Result{}, err
	}
	i, err := realArg("fromvip", "I", args[1], calc.DimCurrent)
	if err != nil {
		return calc.Result{}, err
	}
	p, err := realArg("fromvip", "P", args[2], calc.DimPower)
	if err != nil {
		return calc.Result{}, err
	}
	lag, err := lagging("fromvip", args[3])
	if err != nil {
		return calc.Result{}, err
	}
	return componentsResult(FromVIP(v, i, p, lag, c.Freq))
}

func callFromPF(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	p, err := realArg("frompf", "P", args[0], calc.DimPower)
	if err != nil {
		return calc.Result{}, err
	}
	pf, err := realArg("frompf", "pf", args[1], calc.Dimensionless)
	if err != nil {
		return calc.Result{}, err
	}
	v, err := realArg("frompf", "V", args[2], calc.DimVoltage)
	if err != nil {
		return calc.Result{}, err
	}
	lag, err := lagging("frompf", args[3])
	if err != nil {
		return calc.Result{}, err
	}
	comp, err := FromPF(p, pf, v, lag, c.Freq)
	r, err := componentsResult(comp, err)
	if err == nil {
		r.Extra = append(r.Extra, op("i", comp.I))
	}
	return r, err
}

func callPP2RMS(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	if args[0].Word != "" {
		return calc.Result{}, fmt.Errorf("pp2rms: expected a value")
	}
	rms, pk, st, err := PPToRMS(args[0].Q)
	if err != nil {
		return calc.Result{}, fmt.Errorf("pp2rms: %v", err)
	}
	return calc.Result{Value: rms, Extra: []calc.Operand{op("peak", pk)}, Steps: []calc.Step{st}}, nil
}

func callDelay(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	dt, err := realArg("delay2phase", "Δt", args[0], calc.DimTime)
	if err != nil {
		return calc.Result{}, err
	}
	f := c.Freq
	if len(args) > 1 {
		if f, err = realArg("delay2phase", "f", args[1], calc.DimFrequency); err != nil {
			return calc.Result{}, err
		}
	}
	d, err := DelayToPhase(dt, f)
	if err != nil {
		return calc.Result{}, fmt.Errorf("delay2phase: %v", err)
	}
	return calc.Result{Value: d.Phi, Steps: []calc.Step{d.Step}, Notes: []string{d.Leads}}, nil
}

func callRotation(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	var th [3]float64
	for k, n := range []string{"θA", "θB", "θC"} {
		x, err := angleArg(c, "rotation", n, args[k])
		if err != nil {
			return calc.Result{}, err
		}
		th[k] = x
	}
	r, err := Rotation(th[0], th[1], th[2])
	if err != nil {
		return calc.Result{}, fmt.Errorf("rotation: %v", err)
	}
	res := calc.Result{Value: num(float64(r.Sequence)), Steps: []calc.Step{r.Step},
		Extra: []calc.Operand{op("erra", r.Errors[0]), op("errb", r.Errors[1]), op("errc", r.Errors[2])},
		Notes: []string{"rotation " + r.Name}}
	if c.Sequence != 0 && c.Sequence != r.Sequence {
		res.Notes = append(res.Notes, "the measured rotation differs from the worksheet's phase sequence setting")
	}
	return res, nil
}

func callPreferred(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	if args[0].Word != "" {
		return calc.Result{}, fmt.Errorf("preferred: the first argument is the value")
	}
	s, ok := SeriesByName(strings.ToUpper(args[1].Word))
	if !ok {
		return calc.Result{}, fmt.Errorf("preferred: the second argument is a series: E6, E12, E24, E48 or E96")
	}
	p, err := Nearest(args[0].Q, s)
	if err != nil {
		return calc.Result{}, fmt.Errorf("preferred: %v", err)
	}
	return calc.Result{Value: p.Nearest, Steps: []calc.Step{p.Step}, Extra: []calc.Operand{
		op("below", p.Below), op("above", p.Above), op("errpct", num(p.NearestErr)),
		op("belowpct", num(p.BelowErr)), op("abovepct", num(p.AboveErr))}}, nil
}

var perMetre = calc.Dim{calc.BaseVolt: 1, calc.BaseAmpere: -1, calc.BaseMetre: -1}

func callCableDrop(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	const fn = "cabledrop"
	qs, words := split(args)
	if len(qs) < 6 || len(qs) > 7 || len(words) != 2 {
		return calc.Result{}, fmt.Errorf("%s takes (Vs, I, pf, lagging|leading, R', X', length, single|three[, Vnom])", fn)
	}
	var cb Cable
	var err error
	var pre []calc.Step
	if has(words, "three") {
		for _, k := range []int{0, 6} {
			if k < len(qs) {
				st, err := lineVoltage(c, &qs[k], map[int]string{0: "Vs", 6: "Vnom"}[k])
				if err != nil {
					return calc.Result{}, fmt.Errorf("%s: %v", fn, err)
				}
				pre = append(pre, st...)
			}
		}
	}
	fields := []struct {
		p    *float64
		name string
		d    calc.Dim
	}{{&cb.Vs, "Vs", calc.DimVoltage}, {&cb.I, "I", calc.DimCurrent}, {&cb.PF, "pf", calc.Dimensionless},
		{&cb.R, "R' (per length)", perMetre}, {&cb.X, "X' (per length)", perMetre}, {&cb.Length, "length", calc.DimLength},
		{&cb.Vnom, "Vnom", calc.DimVoltage}}
	for k, q := range qs {
		if *fields[k].p, err = realArg(fn, fields[k].name, q, fields[k].d); err != nil {
			return calc.Result{}, err
		}
	}
	if has(words, "leading") == has(words, "lagging") || has(words, "single") == has(words, "three") {
		return calc.Result{}, fmt.Errorf("%s: give one of lagging|leading and one of single|three", fn)
	}
	cb.Leading = has(words, "leading")
	cb.ThreePhase = has(words, "three")
	var notes []string
	if c != nil && c.Basis == calc.Peak {
		// Vs and I are phasors on the peak basis, and the drop I·Z scales
		// with them; a nominal voltage is RMS by definition (IEC 60038), so
		// the per cent compares the drop with √2·Vnom
		if cb.Vnom != 0 {
			cb.Vnom *= math.Sqrt2
			notes = append(notes, "basis peak: Vs, I and the drop are peak values; Vnom is a nominal voltage, RMS by definition, so the per cent is of its peak √2·Vnom")
		} else {
			notes = append(notes, "basis peak: Vs, I and the drop are peak values; the per cent is of Vs, the same on either basis")
		}
	} else if cb.Vnom != 0 {
		notes = append(notes, "Vnom is a nominal voltage: RMS by definition (IEC 60038)")
	}
	r, err := CableDrop(cb)
	if err != nil {
		return calc.Result{}, fmt.Errorf("%s: %v", fn, err)
	}
	return calc.Result{Value: r.Vload, Steps: append(pre, r.Steps...), Notes: notes, Extra: []calc.Operand{
		op("drop", r.Drop), op("pct", num(r.DropPct)), op("approx", r.Approx), op("diff", r.Diff), op("z", r.Zloop)}}, nil
}

func callRTemp(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	const fn = "rtemp"
	r1 := args[0].Q
	if args[0].Word != "" || (r1.Dim != calc.DimImpedance && r1.Dim != perMetre) {
		return calc.Result{}, fmt.Errorf("%s: R1 must be a resistance (Ω or Ω/m)", fn)
	}
	t1, err := realArg(fn, "T1 (°C, a plain number)", args[1], calc.Dimensionless)
	if err != nil {
		return calc.Result{}, err
	}
	t2, err := realArg(fn, "T2 (°C, a plain number)", args[2], calc.Dimensionless)
	if err != nil {
		return calc.Result{}, err
	}
	w, err := wordArg(fn, args[3], "copper", "aluminium", "aluminum")
	if err != nil {
		return calc.Result{}, err
	}
	m := Copper
	if w != "copper" {
		m = Aluminium
	}
	r2, st, err := RTemp(r1, t1, t2, m)
	if err != nil {
		return calc.Result{}, fmt.Errorf("%s: %v", fn, err)
	}
	return calc.Result{Value: r2, Steps: []calc.Step{st}}, nil
}

func callRefer(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	if args[0].Word != "" {
		return calc.Result{}, fmt.Errorf("refer: the first argument is the value to refer")
	}
	a, err := realArg("refer", "N1/N2", args[1], calc.Dimensionless)
	if err != nil {
		return calc.Result{}, err
	}
	w, err := wordArg("refer", args[2], "primary", "secondary")
	if err != nil {
		return calc.Result{}, err
	}
	q, st, err := Refer(args[0].Q, a, w == "primary")
	if err != nil {
		return calc.Result{}, fmt.Errorf("refer: %v", err)
	}
	return calc.Result{Value: q, Steps: []calc.Step{st}}, nil
}

// nameplateArgs reads S, V1, V2, %Z and optionally X/R from quantities.
func nameplateArgs(fn string, qs []calc.Arg, words []string) (Nameplate, error) {
	var n Nameplate
	var err error
	if n.S, err = realArg(fn, "S", qs[0], calc.DimPower); err != nil {
		return n, err
	}
	if n.V1, err = realArg(fn, "V1", qs[1], calc.DimVoltage); err != nil {
		return n, err
	}
	if n.V2, err = realArg(fn, "V2", qs[2], calc.DimVoltage); err != nil {
		return n, err
	}
	if n.PctZ, err = pctArg(fn, "%Z", qs[3]); err != nil {
		return n, err
	}
	if len(qs) > 4 {
		if n.XR, err = realArg(fn, "X/R", qs[4], calc.Dimensionless); err != nil {
			return n, err
		}
	}
	if has(words, "single") && has(words, "three") {
		return n, fmt.Errorf("%s: single or three, not both", fn)
	}
	n.SinglePhase = has(words, "single")
	return n, nil
}

func callXfmr(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	qs, words := split(args)
	if len(qs) < 4 || len(qs) > 5 {
		return calc.Result{}, fmt.Errorf("xfmr takes (S, V1, V2, %%Z[, X/R][, single|three])")
	}
	pre, err := ratedVoltages(c, "xfmr", qs, words)
	if err != nil {
		return calc.Result{}, err
	}
	n, err := nameplateArgs("xfmr", qs, words)
	if err != nil {
		return calc.Result{}, err
	}
	x, err := Transformer(n)
	if err != nil {
		return calc.Result{}, fmt.Errorf("xfmr: %v", err)
	}
	return calc.Result{Value: x.Z2, Steps: append(pre, x.Steps...), Cautions: calc.CautionsOf(calc.CautionFault), Extra: []calc.Operand{
		op("z1", x.Z1), op("zbase1", x.Zbase1), op("zbase2", x.Zbase2), op("i1", x.I1), op("i2", x.I2),
		op("isc1", x.Isc1), op("isc2", x.Isc2), op("ratio", x.Ratio)}}, nil
}

func callFault(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	const fn = "faultcurrent"
	qs, words := split(args)
	if len(qs) != 6 && len(qs) != 9 {
		return calc.Result{}, fmt.Errorf("%s takes (S, V1, V2, %%Z, X/R, Ssc or Zs[, R', X', length][, single|three])", fn)
	}
	pre, err := ratedVoltages(c, fn, qs, words)
	if err != nil {
		return calc.Result{}, err
	}
	n, err := nameplateArgs(fn, qs[:5], words)
	if err != nil {
		return calc.Result{}, err
	}
	f := Fault{Xfmr: n}
	src := qs[5]
	switch src.Q.Dim {
	case calc.DimPower:
		if f.SourceVA, err = realArg(fn, "Ssc", src, calc.DimPower); err != nil {
			return calc.Result{}, err
		}
	case calc.DimImpedance:
		f.SourceZ = src.Q.V
	default:
		return calc.Result{}, fmt.Errorf("%s: the supply is a fault level in VA (0 for an infinite bus) or an impedance in Ω, got %s", fn, calc.DimName(src.Q.Dim, false))
	}
	if len(qs) == 9 {
		if f.CableR, err = realArg(fn, "R' (per length)", qs[6], perMetre); err != nil {
			return calc.Result{}, err
		}
		if f.CableX, err = realArg(fn, "X' (per length)", qs[7], perMetre); err != nil {
			return calc.Result{}, err
		}
		if f.CableLength, err = realArg(fn, "length", qs[8], calc.DimLength); err != nil {
			return calc.Result{}, err
		}
	}
	r, err := FaultLevel(f)
	if err != nil {
		return calc.Result{}, fmt.Errorf("%s: %v", fn, err)
	}
	return calc.Result{Value: r.IscEnd, Steps: append(pre, r.Steps...), Cautions: calc.CautionsOf(calc.CautionFault), Extra: []calc.Operand{
		op("terminals", r.IscTerminals), op("infinite", r.IscInfinite), op("z", r.Ztotal),
		op("zsource", r.Zsource), op("zxfmr", r.Zxfmr), op("zcable", r.Zcable)}}, nil
}

func callPUBase(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	s, err := realArg("pubase", "S", args[0], calc.DimPower)
	if err != nil {
		return calc.Result{}, err
	}
	pre, err := lineVoltage(c, &args[1], "VLL")
	if err != nil {
		return calc.Result{}, fmt.Errorf("pubase: %v", err)
	}
	v, err := realArg("pubase", "VLL", args[1], calc.DimVoltage)
	if err != nil {
		return calc.Result{}, err
	}
	b, err := Bases(s, v)
	if err != nil {
		return calc.Result{}, fmt.Errorf("pubase: %v", err)
	}
	return calc.Result{Value: b.Z, Steps: append(pre, b.Step), Extra: []calc.Operand{op("ibase", b.I)}}, nil
}

func callRebase(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	const fn = "rebase"
	if args[0].Word != "" || !args[0].Q.Dim.IsDimensionless() {
		return calc.Result{}, fmt.Errorf("%s: Z must be a per-unit value (a plain number)", fn)
	}
	var x [4]float64
	var pre []calc.Step
	for _, k := range []int{2, 4} {
		st, err := lineVoltage(c, &args[k], map[int]string{2: "Vold", 4: "Vnew"}[k])
		if err != nil {
			return calc.Result{}, fmt.Errorf("%s: %v", fn, err)
		}
		pre = append(pre, st...)
	}
	for k, spec := range []struct {
		n string
		d calc.Dim
	}{{"Sold", calc.DimPower}, {"Vold", calc.DimVoltage}, {"Snew", calc.DimPower}, {"Vnew", calc.DimVoltage}} {
		var err error
		if x[k], err = realArg(fn, spec.n, args[k+1], spec.d); err != nil {
			return calc.Result{}, err
		}
	}
	z, st, err := Rebase(args[0].Q.V, x[0], x[1], x[2], x[3])
	if err != nil {
		return calc.Result{}, fmt.Errorf("%s: %v", fn, err)
	}
	return calc.Result{Value: z, Steps: append(pre, st)}, nil
}

func ratioCall(fn string, d calc.Dim, up bool) func(*calc.Context, []calc.Arg) (calc.Result, error) {
	return func(c *calc.Context, args []calc.Arg) (calc.Result, error) {
		if args[0].Word != "" || args[0].Q.Dim != d {
			return calc.Result{}, fmt.Errorf("%s: the reading must be in %s", fn, calc.UnitSymbol(d, calc.KindPlain, false))
		}
		p, err := realArg(fn, "primary rating", args[1], d)
		if err != nil {
			return calc.Result{}, err
		}
		s, err := realArg(fn, "secondary rating", args[2], d)
		if err != nil {
			return calc.Result{}, err
		}
		var q calc.Quantity
		var st calc.Step
		if up {
			q, st, err = ToPrimary(args[0].Q, p, s)
		} else {
			q, st, err = ToSecondary(args[0].Q, p, s)
		}
		if err != nil {
			return calc.Result{}, fmt.Errorf("%s: %v", fn, err)
		}
		return calc.Result{Value: q, Steps: []calc.Step{st}}, nil
	}
}

func callReadCheck(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	const fn = "readcheck"
	x := args[0].Q
	if args[0].Word != "" {
		return calc.Result{}, fmt.Errorf("%s: the first argument is the reading", fn)
	}
	var acc Accuracy
	var err error
	if acc.Pct, err = realArg(fn, "pct", args[1], calc.Dimensionless); err != nil {
		return calc.Result{}, err
	}
	if acc.Digits, err = realArg(fn, "digits", args[2], calc.Dimensionless); err != nil {
		return calc.Result{}, err
	}
	if acc.Resolution, err = realArg(fn, "resolution", args[3], x.Dim); err != nil {
		return calc.Result{}, err
	}
	lo, err := realArg(fn, "min", args[4], x.Dim)
	if err != nil {
		return calc.Result{}, err
	}
	hi, err := realArg(fn, "max", args[5], x.Dim)
	if err != nil {
		return calc.Result{}, err
	}
	if lo < 0 || hi < lo {
		return calc.Result{}, fmt.Errorf("%s: the allowed range needs 0 ≤ min ≤ max", fn)
	}
	r := RangeResult{MagMin: calc.Quantity{V: complex(lo, 0), Dim: x.Dim, Kind: magKind(x.Kind)},
		MagMax: calc.Quantity{V: complex(hi, 0), Dim: x.Dim, Kind: magKind(x.Kind)}}
	o, err := CheckReading(x, acc, r)
	if err != nil {
		return calc.Result{}, fmt.Errorf("%s: %v", fn, err)
	}
	// The range here is given, not sampled: drop that remark.
	o.Step.Notes = o.Step.Notes[:1]
	return calc.Result{Value: o.Miss, Steps: []calc.Step{o.Step}, Notes: o.Step.Notes, Extra: []calc.Operand{
		op("pct", num(o.MissPct)), op("low", o.Low), op("high", o.High), op("overlaps", num(b2f(o.Overlaps)))}}, nil
}

func b2f(b bool) float64 {
	if b {
		return 1
	}
	return 0
}
