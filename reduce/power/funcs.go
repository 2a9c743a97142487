package power

import (
	"fmt"
	"math"
	"math/cmplx"
	"strconv"
	"strings"

	"argand/calc"
	"argand/reduce/threephase"
)

// Funcs returns the worksheet functions of this package. Each checks the
// number and dimension of its arguments and names the argument in its
// errors.
func Funcs() []calc.Func {
	fs := funcs()
	rated := map[string]string{
		"motor":  "the nameplate output and line voltage",
		"rerate": "the capacitor's rating Qr at Vr and the system voltage V",
	}
	for i := range fs {
		fs[i].Call = checkArity(fs[i])
		if what, ok := rated[fs[i].Name]; ok {
			fs[i].Call = calc.RMSByDefinition(what, fs[i].Call)
		}
	}
	return fs
}

// checkArity wraps a function's Call so that a caller that skips the
// Min/Max check still gets an error rather than an index panic.
func checkArity(f calc.Func) func(*calc.Context, []calc.Arg) (calc.Result, error) {
	call := f.Call
	return func(c *calc.Context, args []calc.Arg) (calc.Result, error) {
		if len(args) < f.Min || (f.Max >= 0 && len(args) > f.Max) {
			want := fmt.Sprintf("%d", f.Min)
			switch {
			case f.Max < 0:
				want = fmt.Sprintf("at least %d", f.Min)
			case f.Max != f.Min:
				want = fmt.Sprintf("%d to %d", f.Min, f.Max)
			}
			return calc.Result{}, fmt.Errorf("%s%s takes %s arguments, got %d", f.Name, f.Args, want, len(args))
		}
		return call(c, args)
	}
}

func funcs() []calc.Func {
	return []calc.Func{
		{
			Name: "power", Params: []calc.Param{{Name: "V", Kind: calc.ParamVoltage}, {Name: "I", Kind: calc.ParamCurrent}}, Args: "(V, I)", Min: 2, Max: 2,
			Doc:     "complex power of an element from its voltage and current phasors (passive sign convention); .p .q .s .pf",
			Formula: "S = V·I* (RMS) or S = ½·V·I* (peak); P = Re S; Q = Im S; PF = P/|S|",
			Call:    callPower,
		},
		{
			Name: "pf", Params: []calc.Param{{Name: "S", Kind: calc.ParamComplexPower, Else: "for a product of phasors use power(V, I) or V * conj(I): S = V·I*"}}, Args: "(S)", Min: 1, Max: 1,
			Doc:     "power factor P/|S| of a complex power; lagging when Q > 0",
			Formula: "PF = P/|S|",
			Call:    callPF,
		},
		{
			Name: "load", Params: []calc.Param{{Name: "P", Kind: calc.ParamActivePower, Else: "for an apparent power use loadva"}, {Name: "pf", Kind: calc.ParamRatio}, {Name: "sense", Kind: calc.ParamWord, Doc: "lagging|leading"}}, Args: "(P, pf, lagging|leading)", Min: 3, Max: 3, Words: []string{"lagging", "leading"},
			Doc:     "complex power of a load from its active power and power factor; .p .q .s .pf",
			Formula: "Q = ±P·tan φ; S = P + jQ",
			Call:    callLoad,
		},
		{
			Name: "loadva", Params: []calc.Param{{Name: "S", Kind: calc.ParamApparentPower, Else: "for an active power use load; a complex power already holds its pf"}, {Name: "pf", Kind: calc.ParamRatio}, {Name: "sense", Kind: calc.ParamWord, Doc: "lagging|leading"}}, Args: "(S, pf, lagging|leading)", Min: 3, Max: 3, Words: []string{"lagging", "leading"},
			Doc:     "complex power of a load from its apparent power and power factor; .p .q .s .pf",
			Formula: "P = |S|·PF; Q = ±|S|·√(1 − PF²)",
			Call:    callLoadVA,
		},
		{
			Name: "motor", Params: []calc.Param{{Name: "Pout", Kind: calc.ParamActivePower, Else: "a motor is rated by its output power in W, hp or hp_metric"}, {Name: "eff", Kind: calc.ParamRatio}, {Name: "pf", Kind: calc.ParamRatio}, {Name: "phases", Kind: calc.ParamWord, Doc: "single|three"}, {Name: "VLL", Kind: calc.ParamVoltage, Doc: "line-to-line voltage for three-phase"}}, Args: "(Pout, eff, pf, single|three, VLL)", Min: 5, Max: 5, Words: []string{"single", "three"},
			Doc:     "complex power and line current a machine draws from its nameplate (output in W, hp or hp_metric, lagging PF; VLL the line-to-line voltage for three-phase); .p .q .s .pf .i .pin",
			Formula: "P_in = P_out/η; |S| = P_in/PF; I = |S|/V or |S|/(√3·V_L)",
			Call:    callMotor,
		},
		{
			Name: "loads", Params: []calc.Param{{Name: "S", Kind: calc.ParamComplexPower, Else: "give each load as a complex power, as loadva(|S|, pf, lagging) does"}}, Args: "(S1, S2, ...)", Min: 1, Max: -1,
			Doc:     "total complex power of loads on one supply; .p .q .s .pf",
			Formula: "S = Σ S_k",
			Call:    callLoads,
		},
		{
			Name: "current", Params: []calc.Param{{Name: "S", Kind: calc.ParamSPower, Else: "for an active power give the load as load(P, pf, lagging)"}, {Name: "V", Kind: calc.ParamVoltage, Doc: "line-to-line for three-phase"}, {Name: "phases", Kind: calc.ParamWord, Doc: "single|three"}}, Args: "(S, V, single|three)", Min: 3, Max: 3, Words: []string{"single", "three"},
			Doc:     "line current drawn by a power from a supply (V is line-to-line for three-phase)",
			Formula: "I = (S/V)* where S and V have angles, else |I| = |S|/V; three-phase I_a = (S/(3·V_an))*, |I| = |S|/(√3·V_L); peak basis: twice these (S = ½·V·I*)",
			Call:    callCurrent,
		},
		{
			Name: "pfc", Params: []calc.Param{{Name: "P", Kind: calc.ParamActivePower, Else: "for a load given as a complex power use pfcload"}, {Name: "pf1", Kind: calc.ParamRatio}, {Name: "pf2", Kind: calc.ParamRatio}, {Name: "V", Kind: calc.ParamVoltage, Doc: "line-to-line for three-phase"}, {Name: "phases", Kind: calc.ParamWord, Doc: "single|three"}, {Name: "sense", Kind: calc.ParamWord, Doc: "lagging|leading", Optional: true}}, Args: "(P, pf1, pf2, V, single|three[, lagging|leading])", Min: 5, Max: 6,
			Words:   []string{"single", "three", "lagging", "leading"},
			Doc:     "capacitors to raise a lagging (inductive) load's power factor pf1 to pf2 at the working frequency (V line-to-line for three-phase); the optional word is the sense of the target pf2; for a load given as complex S (leading or lagging) use pfcload; .qc .c .cy .cdelta .i1 .i2",
			Formula: "Q_c = P·(tan φ₁ − tan φ₂); C = Q_c/(ω·V²); C_Y = Q_c/(ω·V_L²); C_Δ = Q_c/(3·ω·V_L²)",
			Call:    callPFC,
		},
		{
			Name: "pfcload", Params: []calc.Param{{Name: "S", Kind: calc.ParamComplexPower, Else: "for an apparent power give the load as loadva(|S|, pf, lagging)"}, {Name: "pf2", Kind: calc.ParamRatio}, {Name: "V", Kind: calc.ParamVoltage, Doc: "line-to-line for three-phase"}, {Name: "phases", Kind: calc.ParamWord, Doc: "single|three"}, {Name: "sense", Kind: calc.ParamWord, Doc: "lagging|leading", Optional: true}}, Args: "(S, pf2, V, single|three[, lagging|leading])", Min: 4, Max: 5,
			Words:   []string{"single", "three", "lagging", "leading"},
			Doc:     "capacitors to bring a load of complex power S to power factor pf2 at the working frequency (V line-to-line for three-phase); .qc .c .cy .cdelta .i1 .i2",
			Formula: "Q_c = Q₁ − P·tan φ₂; C = Q_c/(ω·V²); C_Y = Q_c/(ω·V_L²); C_Δ = Q_c/(3·ω·V_L²)",
			Call:    callPFCLoad,
		},
		{
			Name: "rerate", Params: []calc.Param{{Name: "Qr", Kind: calc.ParamReactivePower, Else: "a capacitor is rated by its reactive power in var"}, {Name: "V", Kind: calc.ParamVoltage, Doc: "line-to-line for three-phase"}, {Name: "Vr", Kind: calc.ParamVoltage, Doc: "rated, line-to-line for three-phase"}}, Args: "(Qr, V, Vr)", Min: 3, Max: 3,
			Doc:     "reactive power of a capacitor rated Qr at Vr when used at V",
			Formula: "Q = Q_r·(V/V_r)²",
			Call:    threephase.Voltages(calc.LineToLine, threephase.WhenMarked, map[int]string{1: "V", 2: "Vr"}, callRerate),
		},
		{
			Name: "harmonic", Params: []calc.Param{{Name: "Ssc", Kind: calc.ParamApparentPower, Else: "a fault level is an apparent power in VA"}, {Name: "Qc", Kind: calc.ParamReactivePower}}, Args: "(Ssc, Qc)", Min: 2, Max: 2,
			Doc:     "harmonic order at which a capacitor bank resonates with the supply; .f",
			Formula: "h ≈ √(S_sc/Q_c)",
			Call:    callHarmonic,
		},
		{
			Name: "discharge", Params: []calc.Param{{Name: "C", Kind: calc.ParamCapacitance}, {Name: "V0", Kind: calc.ParamVoltage}, {Name: "Vsafe", Kind: calc.ParamVoltage}, {Name: "t", Kind: calc.ParamTime}}, Args: "(C, V0, Vsafe, t)", Min: 4, Max: 4,
			Doc:     "discharge resistor that brings a capacitor from V0 to Vsafe within t",
			Formula: "R = t/(C·ln(V0/V_safe))",
			Call:    callDischarge,
		},
		{
			Name: "dischargetime", Params: []calc.Param{{Name: "R", Kind: calc.ParamResistance}, {Name: "C", Kind: calc.ParamCapacitance}, {Name: "V0", Kind: calc.ParamVoltage}, {Name: "Vsafe", Kind: calc.ParamVoltage}}, Args: "(R, C, V0, Vsafe)", Min: 4, Max: 4,
			Doc:     "time a resistor takes to discharge a capacitor from V0 to Vsafe",
			Formula: "t = R·C·ln(V0/V_safe)",
			Call:    callDischargeTime,
		},
		{
			Name: "rms", Params: []calc.Param{{Name: "Xpk", Kind: calc.ParamAny}}, Args: "(Xpk)", Min: 1, Max: 1,
			Doc:     "RMS value of a sinusoid from its peak; .peak .rms .avg",
			Formula: "X_rms = X_pk/√2",
			Call:    sineCall(SineFromPeak, "rms", "rms"),
		},
		{
			Name: "peak", Params: []calc.Param{{Name: "Xrms", Kind: calc.ParamAny}}, Args: "(Xrms)", Min: 1, Max: 1,
			Doc:     "peak value of a sinusoid from its RMS value; .peak .rms .avg",
			Formula: "X_pk = √2·X_rms",
			Call:    sineCall(SineFromRMS, "peak", "peak"),
		},
		{
			Name: "rectavg", Params: []calc.Param{{Name: "Xpk", Kind: calc.ParamAny}}, Args: "(Xpk)", Min: 1, Max: 1,
			Doc:     "rectified average of a sinusoid from its peak (the plain average is 0); .peak .rms .avg",
			Formula: "X_avg = 2·X_pk/π",
			Call:    sineCall(SineFromPeak, "rectavg", "avg"),
		},
		{
			Name: "rectpeak", Params: []calc.Param{{Name: "Xavg", Kind: calc.ParamAny}}, Args: "(Xavg)", Min: 1, Max: 1,
			Doc:     "peak value of a sinusoid from its rectified average; .peak .rms .avg",
			Formula: "X_pk = π·X_avg/2",
			Call:    sineCall(SineFromRectAvg, "rectpeak", "peak"),
		},
	}
}

// got writes an argument for an error message: as typed when known.
func got(a calc.Arg) string {
	if a.Text != "" {
		return a.Text
	}
	if a.Word != "" {
		return a.Word
	}
	if m := a.Q.Mag(); math.IsInf(m, 0) || math.IsNaN(m) {
		// the formatter scales by the magnitude, which has overflowed
		s := strconv.FormatFloat(real(a.Q.V), 'g', 4, 64) + " + j" + strconv.FormatFloat(imag(a.Q.V), 'g', 4, 64)
		if u := calc.UnitSymbol(a.Q.Dim, a.Q.Kind, false); u != "" {
			s = "(" + s + ") " + u
		}
		return s
	}
	return calc.Format{}.Rect(a.Q)
}

func argErr(fn string, i int, name, want string, a calc.Arg) error {
	return fmt.Errorf("%s: argument %d (%s) must be %s, got %s", fn, i+1, name, want, got(a))
}

// quantity returns argument i, which must have dimension d.
func quantity(fn string, args []calc.Arg, i int, name string, d calc.Dim, want string) (calc.Quantity, error) {
	a := args[i]
	if a.Word != "" || a.Q.Dim != d {
		return calc.Quantity{}, argErr(fn, i, name, want, a)
	}
	if _, err := a.Q.Check(fn); err != nil {
		return calc.Quantity{}, fmt.Errorf("%s: argument %d (%s): %w", fn, i+1, name, err)
	}
	return a.Q, nil
}

// fraction returns argument i, a real plain number in (0, 1] (or [0, 1]
// with zeroOK), such as a power factor or an efficiency.
func fraction(fn string, args []calc.Arg, i int, name string, zeroOK bool) (float64, error) {
	a := args[i]
	x := real(a.Q.V)
	bad := a.Word != "" || !a.Q.Dim.IsDimensionless() || a.Q.Kind == calc.KindAngle || imag(a.Q.V) != 0 ||
		!(x <= 1) || x < 0 || (x == 0 && !zeroOK)
	if bad {
		want := "a plain number between 0 and 1"
		if zeroOK {
			want = "a plain number from 0 to 1"
		}
		return 0, argErr(fn, i, name, want, a)
	}
	return x, nil
}

// word returns argument i, which must be one of choices.
func word(fn string, args []calc.Arg, i int, name string, choices ...string) (string, error) {
	a := args[i]
	for _, c := range choices {
		if a.Word == c {
			return c, nil
		}
	}
	return "", argErr(fn, i, name, strings.Join(choices, " or "), a)
}

func sense(fn string, args []calc.Arg, i int) (Sense, error) {
	w, err := word(fn, args, i, "lagging|leading", "lagging", "leading")
	if w == "leading" {
		return Leading, err
	}
	return Lagging, err
}

// lineVoltage reads a supply voltage for a three-phase load in place: it
// is line-to-line. A value marked line-to-neutral (l2n) is converted, by
// √3 and, where the phasor is used, the ±30° shift; the step shows both
// forms. A single-phase supply takes the value as given, whichever way it
// is marked.
func lineVoltage(c *calc.Context, v *calc.Quantity, ph Phases, what string, phasor bool) ([]calc.Step, error) {
	if ph != ThreePhase {
		return nil, nil
	}
	q, st, err := threephase.Voltage(*v, calc.LineToLine, what, threephase.SequenceOf(c), phasor)
	if err != nil {
		return nil, err
	}
	*v = q
	return st, nil
}

func phases(fn string, args []calc.Arg, i int) (Phases, error) {
	w, err := word(fn, args, i, "single|three", "single", "three")
	if w == "three" {
		return ThreePhase, err
	}
	return SinglePhase, err
}

// source writes the call as typed, for the steps it produces.
func source(fn string, args []calc.Arg) string {
	t := make([]string, len(args))
	for i, a := range args {
		t[i] = got(a)
	}
	return fn + "(" + strings.Join(t, ", ") + ")"
}

func withSource(steps []calc.Step, src string) []calc.Step {
	for i := range steps {
		if steps[i].Source == "" {
			steps[i].Source = src
		}
	}
	return steps
}

// powerResult is the result of every function whose value is a complex
// power: S with .p .q .s and, when defined, .pf.
func powerResult(p Power, steps []calc.Step, src string) calc.Result {
	extra := []calc.Operand{{Name: "p", Value: p.P}, {Name: "q", Value: p.Q}, {Name: "s", Value: p.S}, {Name: "sa", Value: p.Apparent}}
	if p.PF.Defined() {
		extra = append(extra, calc.Operand{Name: "pf", Value: number(p.PF.Value)})
	}
	return calc.Result{Value: p.S, Extra: extra, Steps: withSource(steps, src), Notes: p.notes()}
}

func basisOf(c *calc.Context) calc.Basis {
	if c == nil {
		return calc.RMS
	}
	return c.Basis
}

const powerWant = "a power (W, var or VA)"

func callPower(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	v, err := quantity("power", args, 0, "V", calc.DimVoltage, "a voltage")
	if err != nil {
		return calc.Result{}, err
	}
	i, err := quantity("power", args, 1, "I", calc.DimCurrent, "a current")
	if err != nil {
		return calc.Result{}, err
	}
	p, steps, err := FromPhasors(v, i, basisOf(c))
	if err != nil {
		return calc.Result{}, err
	}
	return powerResult(p, steps, source("power", args)), nil
}

func callPF(_ *calc.Context, args []calc.Arg) (calc.Result, error) {
	s, err := quantity("pf", args, 0, "S", calc.DimPower, powerWant)
	if err != nil {
		return calc.Result{}, err
	}
	p, err := Of(s.V)
	if err != nil {
		return calc.Result{}, fmt.Errorf("pf: %w", err)
	}
	if !p.PF.Defined() {
		return calc.Result{}, fmt.Errorf("pf: the power factor is undefined when S = 0 (no power flows)")
	}
	st := calc.Step{
		Kind:    "power",
		Source:  source("pf", args),
		Rule:    "power factor of a complex power (" + ieee + ")",
		Formula: "PF = P/|S|",
		Inputs:  []calc.Operand{{Name: "S", Value: p.S}},
		Results: []calc.Operand{{Name: "PF", Value: number(p.PF.Value)}, {Name: "P", Value: p.P}, {Name: "|S|", Value: p.Apparent}},
		Notes:   p.notes(),
	}
	return calc.Result{Value: number(p.PF.Value), Steps: []calc.Step{st}, Notes: p.notes()}, nil
}

func callLoad(_ *calc.Context, args []calc.Arg) (calc.Result, error) {
	p, err := quantity("load", args, 0, "P", calc.DimPower, "an active power in W")
	if err != nil {
		return calc.Result{}, err
	}
	pf, err := fraction("load", args, 1, "pf", false)
	if err != nil {
		return calc.Result{}, err
	}
	sn, err := sense("load", args, 2)
	if err != nil {
		return calc.Result{}, err
	}
	pw, steps, err := FromPF(p, pf, sn)
	if err != nil {
		return calc.Result{}, err
	}
	return powerResult(pw, steps, source("load", args)), nil
}

func callLoadVA(_ *calc.Context, args []calc.Arg) (calc.Result, error) {
	s, err := quantity("loadva", args, 0, "S", calc.DimPower, "an apparent power in VA")
	if err != nil {
		return calc.Result{}, err
	}
	pf, err := fraction("loadva", args, 1, "pf", true)
	if err != nil {
		return calc.Result{}, err
	}
	sn, err := sense("loadva", args, 2)
	if err != nil {
		return calc.Result{}, err
	}
	pw, steps, err := FromApparent(s, pf, sn)
	if err != nil {
		return calc.Result{}, err
	}
	return powerResult(pw, steps, source("loadva", args)), nil
}

func callMotor(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	var n Nameplate
	var err error
	if n.Output, err = quantity("motor", args, 0, "Pout", calc.DimPower, "a power (W or hp)"); err != nil {
		return calc.Result{}, err
	}
	if n.Efficiency, err = fraction("motor", args, 1, "eff", false); err != nil {
		return calc.Result{}, err
	}
	if n.PF, err = fraction("motor", args, 2, "pf", false); err != nil {
		return calc.Result{}, err
	}
	if n.Phases, err = phases("motor", args, 3); err != nil {
		return calc.Result{}, err
	}
	if n.VLine, err = quantity("motor", args, 4, "VLL", calc.DimVoltage, "a voltage"); err != nil {
		return calc.Result{}, err
	}
	pre, err := lineVoltage(c, &n.VLine, n.Phases, "VLL", false)
	if err != nil {
		return calc.Result{}, fmt.Errorf("motor: %v", err)
	}
	m, steps, err := Motor(n)
	if err != nil {
		return calc.Result{}, err
	}
	r := powerResult(m.Power, append(pre, steps...), source("motor", args))
	r.Extra = append(r.Extra, calc.Operand{Name: "i", Value: m.Current}, calc.Operand{Name: "pin", Value: m.Input})
	r.Cautions = append(r.Cautions, calc.CautionsOf(calc.CautionMains)...)
	return r, nil
}

func callLoads(_ *calc.Context, args []calc.Arg) (calc.Result, error) {
	if len(args) > MaxLoads {
		return calc.Result{}, fmt.Errorf("loads: at most %d loads, got %d", MaxLoads, len(args))
	}
	ls := make([]calc.Quantity, len(args))
	for i := range args {
		q, err := quantity("loads", args, i, fmt.Sprintf("S%d", i+1), calc.DimPower, powerWant)
		if err != nil {
			return calc.Result{}, err
		}
		ls[i] = q
	}
	p, steps, err := Sum(ls)
	if err != nil {
		return calc.Result{}, err
	}
	return powerResult(p, steps, source("loads", args)), nil
}

func callCurrent(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	s, err := quantity("current", args, 0, "S", calc.DimPower, powerWant)
	if err != nil {
		return calc.Result{}, err
	}
	v, err := quantity("current", args, 1, "V", calc.DimVoltage, "a voltage")
	if err != nil {
		return calc.Result{}, err
	}
	ph, err := phases("current", args, 2)
	if err != nil {
		return calc.Result{}, err
	}
	seq := 1
	if c != nil && c.Sequence < 0 {
		seq = -1
	}
	pre, err := lineVoltage(c, &v, ph, "V", true)
	if err != nil {
		return calc.Result{}, fmt.Errorf("current: %v", err)
	}
	i, steps, err := Current(s, v, ph, basisOf(c), seq)
	if err != nil {
		return calc.Result{}, err
	}
	// the peak basis doubles the current: a size near the float limit
	// overflows there, and is refused rather than shown as Inf
	if _, err := i.Check("current"); err != nil {
		return calc.Result{}, err
	}
	r := calc.Result{Value: i, Steps: withSource(append(pre, steps...), source("current", args))}
	if ph == ThreePhase {
		r.Cautions = calc.CautionsOf(calc.CautionMains)
	}
	return r, nil
}

// correctionResult runs Correct and shapes its result for the worksheet.
func correctionResult(c *calc.Context, fn string, args []calc.Arg, t Target, pre []calc.Step) (calc.Result, error) {
	if c == nil || !(c.Freq > 0) {
		return calc.Result{}, fmt.Errorf("%s: set the working frequency first: the capacitance depends on ω = 2π·f", fn)
	}
	t.Freq = c.Freq
	peak := c.Basis == calc.Peak
	if peak {
		// a peak phasor V is √2·V_rms: the capacitor's Q_c = ω·C·V_rms² and
		// the line currents work in RMS, then the currents go back to peak
		t.V.V /= complex(math.Sqrt2, 0)
	}
	k, steps, err := Correct(t)
	if err != nil {
		return calc.Result{}, err
	}
	if peak {
		k.I1.V *= complex(math.Sqrt2, 0)
		k.I2.V *= complex(math.Sqrt2, 0)
		for _, q := range []calc.Quantity{k.I1, k.I2} {
			if _, err := q.Check(fn + ": the peak line current"); err != nil {
				return calc.Result{}, err
			}
		}
		k.Notes = append([]string{"basis peak: V is read as a peak value, so V_rms = V/√2 sets C (Q_c = ω·C·V_rms²); P, Q and |S| are the usual (RMS) powers; the currents .i1 and .i2 are shown as peak values (√2·I_rms)"}, k.Notes...)
		if len(steps) > 0 {
			steps[0].Notes = append(steps[0].Notes, "basis peak: V_rms = V/√2 = "+c.Format.Mag(cmplx.Abs(t.V.V), calc.DimVoltage, calc.KindMagnitude))
		}
	}
	extra := []calc.Operand{{Name: "qc", Value: k.Qc}}
	if t.Phases == SinglePhase {
		extra = append(extra, calc.Operand{Name: "c", Value: k.C})
	} else {
		extra = append(extra, calc.Operand{Name: "cy", Value: k.CY}, calc.Operand{Name: "cdelta", Value: k.CDelta})
	}
	extra = append(extra,
		calc.Operand{Name: "i1", Value: k.I1}, calc.Operand{Name: "i2", Value: k.I2},
		calc.Operand{Name: "p", Value: k.Before.P}, calc.Operand{Name: "q1", Value: k.Before.Q}, calc.Operand{Name: "q2", Value: k.After.Q})
	if k.After.PF.Defined() {
		extra = append(extra, calc.Operand{Name: "pf2", Value: number(k.After.PF.Value)})
	}
	return calc.Result{
		Value: k.Qc,
		Extra: extra,
		Steps: withSource(append(pre, steps...), source(fn, args)),
		Notes: k.Notes, Cautions: k.Cautions,
	}, nil
}

// targetTail reads V, single|three and the optional target sense starting
// at argument i. For three-phase, V is line-to-line; the step that shows
// both forms is returned.
func targetTail(c *calc.Context, fn string, args []calc.Arg, i int, t *Target) ([]calc.Step, error) {
	var err error
	if t.V, err = quantity(fn, args, i, "V", calc.DimVoltage, "a voltage"); err != nil {
		return nil, err
	}
	if t.Phases, err = phases(fn, args, i+1); err != nil {
		return nil, err
	}
	if len(args) > i+2 {
		s, err := sense(fn, args, i+2)
		if err != nil {
			return nil, err
		}
		t.Leading = s == Leading
	}
	pre, err := lineVoltage(c, &t.V, t.Phases, "V", false)
	if err != nil {
		return nil, fmt.Errorf("%s: %v", fn, err)
	}
	return pre, nil
}

func callPFC(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	p, err := quantity("pfc", args, 0, "P", calc.DimPower, "an active power in W")
	if err != nil {
		return calc.Result{}, err
	}
	if imag(p.V) != 0 {
		return calc.Result{}, argErr("pfc", 0, "P", "a real active power in W (use pfcload for a complex S)", args[0])
	}
	pf1, err := fraction("pfc", args, 1, "pf1", false)
	if err != nil {
		return calc.Result{}, err
	}
	var t Target
	if t.PF, err = fraction("pfc", args, 2, "pf2", false); err != nil {
		return calc.Result{}, err
	}
	vsteps, err := targetTail(c, "pfc", args, 3, &t)
	if err != nil {
		return calc.Result{}, err
	}
	load, pre, err := FromPF(p, pf1, Lagging)
	if err != nil {
		return calc.Result{}, fmt.Errorf("pfc: %w", err)
	}
	t.Load = load.S
	return correctionResult(c, "pfc", args, t, append(vsteps, pre...))
}

func callPFCLoad(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	var t Target
	var err error
	if t.Load, err = quantity("pfcload", args, 0, "S", calc.DimPower, "a complex power in VA"); err != nil {
		return calc.Result{}, err
	}
	if t.PF, err = fraction("pfcload", args, 1, "pf2", false); err != nil {
		return calc.Result{}, err
	}
	vsteps, err := targetTail(c, "pfcload", args, 2, &t)
	if err != nil {
		return calc.Result{}, err
	}
	return correctionResult(c, "pfcload", args, t, vsteps)
}

func callRerate(_ *calc.Context, args []calc.Arg) (calc.Result, error) {
	qr, err := quantity("rerate", args, 0, "Qr", calc.DimPower, "a reactive power in var")
	if err != nil {
		return calc.Result{}, err
	}
	v, err := quantity("rerate", args, 1, "V", calc.DimVoltage, "a voltage")
	if err != nil {
		return calc.Result{}, err
	}
	vr, err := quantity("rerate", args, 2, "Vr", calc.DimVoltage, "a voltage")
	if err != nil {
		return calc.Result{}, err
	}
	q, steps, err := Rerate(qr, v, vr)
	if err != nil {
		return calc.Result{}, err
	}
	return calc.Result{Value: q, Steps: withSource(steps, source("rerate", args)), Notes: steps[0].Notes, Cautions: steps[0].Cautions}, nil
}

func callHarmonic(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	ssc, err := quantity("harmonic", args, 0, "Ssc", calc.DimPower, "a power (the supply's short-circuit power in VA)")
	if err != nil {
		return calc.Result{}, err
	}
	qc, err := quantity("harmonic", args, 1, "Qc", calc.DimPower, "a reactive power in var")
	if err != nil {
		return calc.Result{}, err
	}
	r, steps, err := ResonanceOrder(ssc, qc)
	if err != nil {
		return calc.Result{}, err
	}
	res := calc.Result{Value: number(r.Order), Steps: withSource(steps, source("harmonic", args)), Notes: steps[0].Notes, Cautions: steps[0].Cautions}
	if c != nil && c.Freq > 0 {
		f, err := calc.Real(r.Order*c.Freq, calc.DimFrequency).Check("harmonic")
		if err == nil {
			res.Extra = []calc.Operand{{Name: "f", Value: f}}
		}
	}
	return res, nil
}

func callDischarge(_ *calc.Context, args []calc.Arg) (calc.Result, error) {
	var q [4]calc.Quantity
	specs := [4]struct {
		name, want string
		d          calc.Dim
	}{
		{"C", "a capacitance", calc.DimCapacitance},
		{"V0", "a voltage", calc.DimVoltage},
		{"Vsafe", "a voltage", calc.DimVoltage},
		{"t", "a time", calc.DimTime},
	}
	for i, s := range specs {
		var err error
		if q[i], err = quantity("discharge", args, i, s.name, s.d, s.want); err != nil {
			return calc.Result{}, err
		}
	}
	r, steps, err := DischargeResistance(q[0], q[1], q[2], q[3])
	if err != nil {
		return calc.Result{}, err
	}
	return calc.Result{Value: r, Steps: withSource(steps, source("discharge", args)), Notes: steps[0].Notes, Cautions: steps[0].Cautions}, nil
}

func callDischargeTime(_ *calc.Context, args []calc.Arg) (calc.Result, error) {
	var q [4]calc.Quantity
	specs := [4]struct {
		name, want string
		d          calc.Dim
	}{
		{"R", "a resistance", calc.DimImpedance},
		{"C", "a capacitance", calc.DimCapacitance},
		{"V0", "a voltage", calc.DimVoltage},
		{"Vsafe", "a voltage", calc.DimVoltage},
	}
	for i, s := range specs {
		var err error
		if q[i], err = quantity("dischargetime", args, i, s.name, s.d, s.want); err != nil {
			return calc.Result{}, err
		}
	}
	t, steps, err := DischargeTime(q[0], q[1], q[2], q[3])
	if err != nil {
		return calc.Result{}, err
	}
	return calc.Result{Value: t, Steps: withSource(steps, source("dischargetime", args)), Notes: steps[0].Notes, Cautions: steps[0].Cautions}, nil
}

// sineCall wraps one of the sinusoid conversions as a worksheet function
// fn whose value is the field named by main: "peak", "rms" or "avg".
func sineCall(conv func(calc.Quantity) (Sine, []calc.Step, error), fn, main string) func(*calc.Context, []calc.Arg) (calc.Result, error) {
	return func(_ *calc.Context, args []calc.Arg) (calc.Result, error) {
		a := args[0]
		if a.Word != "" || a.Q.Kind == calc.KindAngle {
			return calc.Result{}, argErr(fn, 0, "X", "the size of a sinusoid (a voltage, current or number)", a)
		}
		s, steps, err := conv(a.Q)
		if err != nil {
			return calc.Result{}, err
		}
		v := s.Peak
		switch main {
		case "rms":
			v = s.RMS
		case "avg":
			v = s.RectAvg
		}
		return calc.Result{
			Value: v,
			Extra: []calc.Operand{{Name: "peak", Value: s.Peak}, {Name: "rms", Value: s.RMS}, {Name: "avg", Value: s.RectAvg}},
			Steps: withSource(steps, source(fn, args)),
		}, nil
	}
}
