package harmonic

import (
	"fmt"
	"math"
	"sort"
	"strconv"
	"strings"

	"argand/calc"
	"argand/reduce/threephase"
)

// Lookup finds a spectrum by name; the worksheet supplies it.
type Lookup func(name string) (Spectrum, bool)

// spectrumFuncs are the functions that take a spectrum by name.
var spectrumFuncs = map[string]bool{
	"hrms": true, "thd": true, "tdd": true, "crest": true, "fhl": true, "kfactor": true,
	"avgmeter": true, "hpower": true, "bankcheck": true,
}

// TakesSpectrum reports whether the function name takes a spectrum by
// name, so that the worksheet binds it to its spectra before a call.
func TakesSpectrum(name string) bool { return spectrumFuncs[name] }

// Funcs returns the worksheet functions of this package with the spectra
// named in names reachable through look. A worksheet builds them again
// when its spectra change; with no spectra (look nil) they exist for help
// and refuse to run.
func Funcs(look Lookup, names []string) []calc.Func {
	var words []string
	if len(names) > 0 {
		words = append([]string(nil), names...)
		sort.Strings(words)
	}
	sp := func(f calc.Func) calc.Func {
		f.Words = append(append([]string(nil), f.Words...), words...)
		if len(f.Words) == 0 {
			f.Words = nil
		}
		return f
	}
	k := kit{look: look}
	fs := []calc.Func{
		sp(calc.Func{Name: "hrms", Params: []calc.Param{{Name: "X", Kind: calc.ParamWord, Doc: "the name of a spectrum"}}, Args: "(X)", Min: 1, Max: 1,
			Doc:     "true RMS of spectrum X; .h1 fundamental, .hh RMS of the harmonics, .thd",
			Formula: "X = √(Σ X_h²)", Call: k.callRMS}),
		sp(calc.Func{Name: "thd", Params: []calc.Param{{Name: "X", Kind: calc.ParamWord, Doc: "the name of a spectrum"}}, Args: "(X)", Min: 1, Max: 1,
			Doc:     "total harmonic distortion of spectrum X relative to its fundamental (a ratio); .hh, .h1",
			Formula: "THD = √(Σ_{h≥2} X_h²) / X_1", Call: k.callTHD}),
		sp(calc.Func{Name: "tdd", Params: []calc.Param{{Name: "I", Kind: calc.ParamWord, Doc: "the name of a current spectrum"}, {Name: "IL", Kind: calc.ParamCurrent, Doc: "the maximum demand current"}}, Args: "(I, IL)", Min: 2, Max: 2,
			Doc:     "total demand distortion of current spectrum I against the maximum demand current IL (a ratio)",
			Formula: "TDD = √(Σ_{h≥2} I_h²) / I_L", Call: k.callTDD}),
		sp(calc.Func{Name: "crest", Params: []calc.Param{{Name: "X", Kind: calc.ParamWord, Doc: "the name of a spectrum with angles"}}, Args: "(X)", Min: 1, Max: 1,
			Doc:     "crest factor of spectrum X, peak over RMS (needs the angles); .peak, .rms",
			Formula: "CF = max|x(t)| / X,  x(t) = Σ √2·X_h·cos(h·ωt + φ_h)", Call: k.callCrest}),
		sp(calc.Func{Name: "fhl", Params: []calc.Param{{Name: "I", Kind: calc.ParamWord, Doc: "the name of a current spectrum"}}, Args: "(I)", Min: 1, Max: 1,
			Doc:     "harmonic loss factor F_HL of current spectrum I for transformer winding eddy-current loss (IEEE Std C57.110); .str the factor for other stray loss",
			Formula: "F_HL = Σ (I_h/I_1)²·h² / Σ (I_h/I_1)²;  F_HL-STR = Σ (I_h/I_1)²·h^0.8 / Σ (I_h/I_1)²", Call: k.callFHL}),
		sp(calc.Func{Name: "kfactor", Params: []calc.Param{{Name: "I", Kind: calc.ParamWord, Doc: "the name of a current spectrum"}, {Name: "IR", Kind: calc.ParamAny, Doc: "the rated current in A (a plain number for a spectrum of fractions)", Optional: true}}, Args: "(I[, IR])", Min: 1, Max: 2,
			Doc:     "K-factor of current spectrum I per unit of the rated current IR (UL 1561 definition); IR defaults to the RMS of I, where K = F_HL; .fhl",
			Formula: "K = Σ (I_h/I_R)²·h² = F_HL·(I/I_R)²", Call: k.callK}),
		sp(calc.Func{Name: "avgmeter", Params: []calc.Param{{Name: "X", Kind: calc.ParamWord, Doc: "the name of a spectrum with angles"}}, Args: "(X)", Min: 1, Max: 1,
			Doc:     "what an average-responding meter calibrated for sine waves reads on spectrum X (needs the angles); .rms true RMS, .avg rectified average, .error reading/RMS − 1, .ff form factor",
			Formula: "reading = π/(2√2)·mean|x(t)| ≈ 1.1107·mean|x(t)|", Call: k.callMeter}),
		sp(calc.Func{Name: "hpower", Params: []calc.Param{{Name: "V", Kind: calc.ParamWord, Doc: "the name of a voltage spectrum"}, {Name: "I", Kind: calc.ParamWord, Doc: "the name of a current spectrum"}}, Args: "(V, I)", Min: 2, Max: 2,
			Doc:     "IEEE Std 1459-2010 powers of voltage spectrum V and current spectrum I: S; .p .p1 .ph (W), .q1 .n .di .dv .dh (var), .s1 .sn .sh (VA), .pf true, .pf1 displacement, .thdv .thdi",
			Formula: "S = V·I;  P = Σ V_h·I_h·cos θ_h;  N = √(S² − P²);  D_I = V_1·I_H;  D_V = V_H·I_1;  D_H = √(S_H² − P_H²)", Call: k.callPower}),
		sp(calc.Func{Name: "bankcheck", Params: []calc.Param{{Name: "Ssc", Kind: calc.ParamApparentPower, Doc: "the supply's short-circuit power", Else: "a fault level is an apparent power in VA"}, {Name: "Qc", Kind: calc.ParamReactivePower, Doc: "the bank's output at the supply voltage"}, {Name: "X", Kind: calc.ParamWord, Doc: "the name of a spectrum"}, {Name: "p", Kind: calc.ParamRatio, Doc: "the reactor ratio X_L/X_C", Optional: true}}, Args: "(Ssc, Qc, X[, p])", Min: 3, Max: 4,
			Doc:     "resonance order of a capacitor bank (output Qc at the supply voltage, reactor ratio p) with a supply of short-circuit power Ssc, checked against the orders present in spectrum X; .f, .n tuned order",
			Formula: "h_r = 1/√(Q_c·(1 − p)/S_sc + p);  amplification = |Z_bank/(Z_supply + Z_bank)|", Call: k.callCheck}),
		{Name: "detune", Params: []calc.Param{{Name: "Qc", Kind: calc.ParamReactivePower, Doc: "the bank's output at the supply voltage", Else: "a capacitor bank is sized by its reactive power in var"}, {Name: "V", Kind: calc.ParamVoltage, Doc: "the supply voltage (line-to-line for three phases)"}, {Name: "p", Kind: calc.ParamRatio, Doc: "the reactor ratio X_L/X_C"}, {Name: "phases", Kind: calc.ParamWord, Doc: "single|three"}, {Name: "Vr", Kind: calc.ParamVoltage, Doc: "the capacitors' rated voltage (line-to-line for three phases)", Optional: true}}, Args: "(Qc, V, p, single|three[, Vr])", Min: 4, Max: 5, Words: []string{"single", "three"},
			Doc:     "detuned capacitor bank giving Qc at supply voltage V with reactor ratio p: the reactor's L per phase; .n tuned order, .fr, .rise, .uc capacitor voltage, .c (star), .cdelta, .xc, .xl, .qc, .ql, .i, .qr rating needed at Vr",
			Formula: "X_C − X_L = V²/Q_c;  X_L = p·X_C;  n = 1/√p;  U_C = V/(1 − p);  Q_r = Q_C·(V_r/U_C)²", Call: threephase.Voltages(calc.LineToLine, threephase.UnlessSingle, map[int]string{1: "V", 4: "Vr"}, callDetune)},
		{Name: "bankout", Params: []calc.Param{{Name: "Qr", Kind: calc.ParamReactivePower, Doc: "the capacitors' rated output", Else: "a capacitor is rated by its reactive power in var"}, {Name: "Vr", Kind: calc.ParamVoltage, Doc: "the capacitors' rated voltage (line-to-line for three phases)"}, {Name: "V", Kind: calc.ParamVoltage, Doc: "the supply voltage (line-to-line for three phases)"}, {Name: "p", Kind: calc.ParamRatio, Doc: "the reactor ratio X_L/X_C (0 without)", Optional: true}}, Args: "(Qr, Vr, V[, p])", Min: 3, Max: 4,
			Doc:     "output at supply voltage V of a bank of capacitors rated Qr at Vr, with reactor ratio p (0 without); .uc capacitor voltage, .qc, .ql",
			Formula: "Q = Q_r·(V/V_r)²/(1 − p);  U_C = V/(1 − p)", Call: threephase.Voltages(calc.LineToLine, threephase.WhenMarked, map[int]string{1: "Vr", 2: "V"}, callBankOut)},
		{Name: "bankscan", Gaps: true, Params: []calc.Param{{Name: "Ssc", Kind: calc.ParamApparentPower, Doc: "the supply's short-circuit power", Else: "a fault level is an apparent power in VA"}, {Name: "Qc", Kind: calc.ParamReactivePower, Doc: "the bank's output at the supply voltage"}, {Name: "V", Kind: calc.ParamVoltage, Doc: "the supply voltage (line-to-line for three phases)"}, {Name: "p", Kind: calc.ParamRatio, Doc: "the reactor ratio X_L/X_C (0 without)", Optional: true}, {Name: "xr", Kind: calc.ParamRatio, Doc: "the supply's X/R at the fundamental (0: lossless)", Optional: true}, {Name: "hmax", Kind: calc.ParamRatio, Doc: "the highest order (25)", Optional: true}}, Args: "(Ssc, Qc, V[, p[, X/R[, hmax]]])", Min: 3, Max: 6,
			Doc:     "table and plot of the supply's impedance alone and with a capacitor bank (output Qc at V, reactor ratio p) over harmonic order up to hmax (25); xr the supply's X/R (0 or left out: lossless); value: resonance order",
			Formula: "Z_s = V²/S_sc·(1/(X/R) + j·h);  Z_b = j·(h·X_L − X_C/h);  Z = Z_s·Z_b/(Z_s + Z_b)", Call: threephase.Voltages(calc.LineToLine, threephase.WhenMarked, map[int]string{2: "V"}, callScan)},
	}
	for i := range fs {
		// a spectrum holds what a harmonic analyser reports, the RMS value
		// of each order; a bank is given by its ratings and the supply by
		// its nominal voltage and fault level: all RMS by definition
		what := "the spectra's values (the RMS of each order)"
		if !spectrumFuncs[fs[i].Name] || fs[i].Name == "bankcheck" {
			what = "ratings, nominal voltages and fault levels"
		}
		fs[i].Call = calc.RMSByDefinition(what, fs[i].Call)
	}
	return fs
}

// kit carries the spectrum lookup into the calls.
type kit struct{ look Lookup }

func (k kit) spectrum(fn string, args []calc.Arg, i int, name string) (Spectrum, string, error) {
	a := args[i]
	if a.Word == "" {
		return Spectrum{}, "", fmt.Errorf("%s: argument %d (%s) must be the name of a spectrum (made with: spectrum NAME h1 230 V, h5 4 %%), got %s", fn, i+1, name, shown(a))
	}
	if k.look == nil {
		return Spectrum{}, "", fmt.Errorf("%s: no spectrum named %q", fn, a.Word)
	}
	s, ok := k.look(a.Word)
	if !ok {
		return Spectrum{}, "", fmt.Errorf("%s: no spectrum named %q", fn, a.Word)
	}
	return s, a.Word, nil
}

func shown(a calc.Arg) string {
	if a.Text != "" {
		return a.Text
	}
	if a.Word != "" {
		return a.Word
	}
	return calc.Format{}.Rect(a.Q)
}

func argErr(fn string, i int, name, want string, a calc.Arg) error {
	return fmt.Errorf("%s: argument %d (%s) must be %s, got %s", fn, i+1, name, want, shown(a))
}

// positive returns argument i, a real quantity of dimension d above 0.
func positive(fn string, args []calc.Arg, i int, name string, d calc.Dim, want string) (float64, error) {
	a := args[i]
	if a.Word != "" || a.Q.Dim != d || a.Q.Kind == calc.KindAngle {
		return 0, argErr(fn, i, name, want, a)
	}
	if _, err := a.Q.Check(fn); err != nil {
		return 0, fmt.Errorf("%s: argument %d (%s): %w", fn, i+1, name, err)
	}
	x := a.Q.Mag()
	if !a.Q.IsReal() || real(a.Q.V) <= 0 || math.IsInf(x, 0) {
		return 0, argErr(fn, i, name, want+" greater than 0 (a magnitude, no angle)", a)
	}
	return x, nil
}

// plain returns argument i, a real plain number from lo (inclusive) to hi
// (exclusive when open).
func plain(fn string, args []calc.Arg, i int, name string, lo, hi float64, open bool, want string) (float64, error) {
	a := args[i]
	x := real(a.Q.V)
	if a.Word != "" || !a.Q.Dim.IsDimensionless() || a.Q.Kind == calc.KindAngle || imag(a.Q.V) != 0 ||
		math.IsNaN(x) || x < lo || x > hi || open && x == hi {
		return 0, argErr(fn, i, name, want, a)
	}
	return x, nil
}

// source writes the call as typed, for the steps it produces.
func source(fn string, args []calc.Arg) string {
	t := make([]string, 0, len(args))
	for _, a := range args {
		if !a.Absent {
			t = append(t, shown(a))
		}
	}
	return fn + "(" + strings.Join(t, ", ") + ")"
}

func num(x float64) calc.Quantity { return calc.Number(complex(x, 0)) }

// mag is a magnitude: an RMS value, a peak or a size, shown without angle.
func mag(x float64, d calc.Dim) calc.Quantity {
	return calc.Quantity{V: complex(x, 0), Dim: d, Kind: calc.KindMagnitude}
}
func watts(x float64) calc.Quantity {
	return calc.Quantity{V: complex(x, 0), Dim: calc.DimPower, Kind: calc.KindActive}
}
func vars(x float64) calc.Quantity {
	return calc.Quantity{V: complex(x, 0), Dim: calc.DimPower, Kind: calc.KindReactive}
}

// va is an apparent power |S| in VA: a magnitude, not a complex power.
func va(x float64) calc.Quantity {
	return calc.Quantity{V: complex(x, 0), Dim: calc.DimPower, Kind: calc.KindMagnitude}
}

func pct(f calc.Format, ratio float64) string {
	return f.Mag(ratio*100, calc.Dim{}, 0) + " %"
}

// spectrumInput names the spectrum an operation reads, for its step.
func spectrumInput(name string, s Spectrum) calc.Operand {
	return calc.Operand{Name: name + " (spectrum, RMS)", Value: mag(s.RMS(), s.Dim)}
}

// result gathers a function's value, extras and step, refusing any value
// that is not a finite number (an overflow from extreme arguments).
func result(v calc.Quantity, st calc.Step, extra ...calc.Operand) (calc.Result, error) {
	fn := st.Source
	if i := strings.IndexByte(fn, '('); i > 0 {
		fn = fn[:i]
	}
	all := append(append([]calc.Operand{{Name: "value", Value: v}}, extra...), st.Results...)
	for _, x := range all {
		if _, err := x.Value.Check(fn); err != nil {
			return calc.Result{}, fmt.Errorf("%w (%s); check the magnitudes given", err, x.Name)
		}
	}
	return calc.Result{Value: v, Extra: extra, Steps: []calc.Step{st}, Notes: st.Notes, Cautions: st.Cautions}, nil
}

func (k kit) callRMS(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	s, name, err := k.spectrum("hrms", args, 0, "X")
	if err != nil {
		return calc.Result{}, err
	}
	rms, h1, hh, thd := s.RMS(), s.Fundamental(), s.HarmonicRMS(), s.THD()
	st := calc.Step{Kind: "harmonic", Source: source("hrms", args),
		Rule:    "true RMS of a spectrum: the square root of the sum of the squares of every order",
		Formula: "X = √(Σ X_h²) = √(X_1² + X_H²)",
		Inputs:  []calc.Operand{spectrumInput(name, s)},
		Results: []calc.Operand{{Name: "X", Value: mag(rms, s.Dim)}, {Name: "X_1", Value: mag(h1, s.Dim)}, {Name: "X_H", Value: mag(hh, s.Dim)}, {Name: "THD", Value: num(thd)}},
	}
	return result(mag(rms, s.Dim), st, calc.Operand{Name: "h1", Value: mag(h1, s.Dim)}, calc.Operand{Name: "hh", Value: mag(hh, s.Dim)}, calc.Operand{Name: "thd", Value: num(thd)})
}

func (k kit) callTHD(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	s, name, err := k.spectrum("thd", args, 0, "X")
	if err != nil {
		return calc.Result{}, err
	}
	f := format(c)
	thd := s.THD()
	st := calc.Step{Kind: "harmonic", Source: source("thd", args),
		Rule:    "total harmonic distortion relative to the fundamental",
		Formula: "THD = X_H / X_1,  X_H = √(Σ_{h≥2} X_h²)",
		Inputs:  []calc.Operand{spectrumInput(name, s), {Name: "X_1", Value: mag(s.Fundamental(), s.Dim)}, {Name: "X_H", Value: mag(s.HarmonicRMS(), s.Dim)}},
		Results: []calc.Operand{{Name: "THD", Value: num(thd)}},
		Notes: []string{"THD = " + pct(f, thd) + " of the fundamental; relative to the total RMS instead it is THD/√(1 + THD²) = " +
			pct(f, thd/math.Sqrt(1+thd*thd))},
	}
	return result(num(thd), st, calc.Operand{Name: "hh", Value: mag(s.HarmonicRMS(), s.Dim)}, calc.Operand{Name: "h1", Value: mag(s.Fundamental(), s.Dim)})
}

func format(c *calc.Context) calc.Format {
	if c == nil {
		return calc.Format{Digits: calc.DefaultDigits}
	}
	return c.Format
}

func (k kit) callTDD(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	s, name, err := k.spectrum("tdd", args, 0, "I")
	if err != nil {
		return calc.Result{}, err
	}
	if s.Dim != calc.DimCurrent {
		return calc.Result{}, fmt.Errorf("tdd: %s is not a current spectrum in A: total demand distortion is of a current against the maximum demand current", name)
	}
	il, err := positive("tdd", args, 1, "IL", calc.DimCurrent, "the maximum demand current in A")
	if err != nil {
		return calc.Result{}, err
	}
	f := format(c)
	ih := s.HarmonicRMS()
	tdd := ih / il
	notes := []string{"TDD = " + pct(f, tdd) + " of the maximum demand current; THD of the same current = " + pct(f, s.THD()) +
		" (TDD = THD·I_1/I_L: TDD is the smaller when the load is below its maximum demand)"}
	if il < s.Fundamental() {
		notes = append(notes, "I_L is below the fundamental of "+name+": a maximum demand current is normally at least the present load current")
	}
	st := calc.Step{Kind: "harmonic", Source: source("tdd", args),
		Rule:    "total demand distortion: harmonic current over the maximum demand load current",
		Formula: "TDD = I_H / I_L,  I_H = √(Σ_{h≥2} I_h²)",
		Inputs:  []calc.Operand{spectrumInput(name, s), {Name: "I_H", Value: mag(ih, calc.DimCurrent)}, {Name: "I_L", Value: mag(il, calc.DimCurrent)}},
		Results: []calc.Operand{{Name: "TDD", Value: num(tdd)}},
		Notes:   notes,
	}
	return result(num(tdd), st)
}

func (k kit) callCrest(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	s, name, err := k.spectrum("crest", args, 0, "X")
	if err != nil {
		return calc.Result{}, err
	}
	if err := needAngles("crest", s); err != nil {
		return calc.Result{}, err
	}
	pk := s.wave().Peak()
	rms := s.RMS()
	cf := pk / rms
	st := calc.Step{Kind: "harmonic", Source: source("crest", args),
		Rule:    "crest factor: the waveform's peak over its RMS (peak found by sampling and refining each maximum)",
		Formula: "CF = max|x(t)| / X,  x(t) = Σ √2·X_h·cos(h·ωt + φ_h)",
		Inputs:  []calc.Operand{spectrumInput(name, s)},
		Results: []calc.Operand{{Name: "CF", Value: num(cf)}, {Name: "peak", Value: mag(pk, s.Dim)}, {Name: "X", Value: mag(rms, s.Dim)}},
		Notes:   []string{"a sinusoid's crest factor is √2 ≈ 1.414; the peak depends on the angles of the orders, not only on their sizes"},
	}
	return result(num(cf), st, calc.Operand{Name: "peak", Value: mag(pk, s.Dim)}, calc.Operand{Name: "rms", Value: mag(rms, s.Dim)})
}

func (k kit) callFHL(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	s, name, err := k.spectrum("fhl", args, 0, "I")
	if err != nil {
		return calc.Result{}, err
	}
	if s.Dim == calc.DimVoltage {
		return calc.Result{}, fmt.Errorf("fhl: %s is a voltage spectrum: the harmonic loss factor is of the load current", name)
	}
	fhl, str := s.FHL(), s.FHLStray()
	st := calc.Step{Kind: "harmonic", Source: source("fhl", args),
		Rule:    "harmonic loss factor for winding eddy-current loss (IEEE Std C57.110), and for other stray loss",
		Formula: "F_HL = Σ (I_h/I_1)²·h² / Σ (I_h/I_1)²;  F_HL-STR = Σ (I_h/I_1)²·h^0.8 / Σ (I_h/I_1)²",
		Inputs:  []calc.Operand{spectrumInput(name, s)},
		Results: []calc.Operand{{Name: "F_HL", Value: num(fhl)}, {Name: "F_HL-STR", Value: num(str)}},
		Notes: []string{"the winding eddy-current loss at this load is F_HL times what the same RMS current would give as a sinusoid",
			"K-factor (UL 1561) = Σ (I_h/I_R)²·h² = F_HL·(I/I_R)², with I_R the rated current: the two agree when the load current equals the rated current; F_HL depends only on the shape of the current, K also on its size"},
	}
	return result(num(fhl), st, calc.Operand{Name: "str", Value: num(str)})
}

func (k kit) callK(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	s, name, err := k.spectrum("kfactor", args, 0, "I")
	if err != nil {
		return calc.Result{}, err
	}
	if s.Dim == calc.DimVoltage {
		return calc.Result{}, fmt.Errorf("kfactor: %s is a voltage spectrum: the K-factor is of the load current", name)
	}
	rms := s.RMS()
	ir := rms
	notes := []string{}
	if len(args) > 1 {
		want := "the rated current in A"
		if s.Dim.IsDimensionless() {
			want = "the rated current as a fraction of this spectrum's fundamental (a plain number)"
		}
		if ir, err = positive("kfactor", args, 1, "IR", s.Dim, want); err != nil {
			return calc.Result{}, err
		}
	} else {
		notes = append(notes, "I_R not given: taken as the RMS current of "+name+", so K equals F_HL")
	}
	kf, fhl := s.KFactor(ir), s.FHL()
	f := format(c)
	notes = append(notes, "K = F_HL·(I/I_R)² = "+f.Mag(fhl, calc.Dim{}, 0)+" × ("+f.Mag(rms/ir, calc.Dim{}, 0)+")²: F_HL (IEEE Std C57.110) depends only on the shape of the current, K also on its size against the rating")
	st := calc.Step{Kind: "harmonic", Source: source("kfactor", args),
		Rule:    "K-factor: each order per unit of the rated current, weighted by the square of its order (UL 1561 definition)",
		Formula: "K = Σ (I_h/I_R)²·h² = F_HL·(I/I_R)²",
		Inputs:  []calc.Operand{spectrumInput(name, s), {Name: "I_R", Value: mag(ir, s.Dim)}},
		Results: []calc.Operand{{Name: "K", Value: num(kf)}, {Name: "F_HL", Value: num(fhl)}},
		Notes:   notes,
	}
	return result(num(kf), st, calc.Operand{Name: "fhl", Value: num(fhl)})
}

func (k kit) callMeter(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	s, name, err := k.spectrum("avgmeter", args, 0, "X")
	if err != nil {
		return calc.Result{}, err
	}
	if err := needAngles("avgmeter", s); err != nil {
		return calc.Result{}, err
	}
	avg := s.wave().RectifiedAverage()
	rms := s.RMS()
	if !(avg > 0) {
		return calc.Result{}, fmt.Errorf("avgmeter: %s has no rectified average (the waveform is zero)", name)
	}
	reading := SineFormFactor * avg
	e := reading/rms - 1
	ff := rms / avg
	f := format(c)
	word := "high"
	if e < 0 {
		word = "low"
	}
	st := calc.Step{Kind: "harmonic", Source: source("avgmeter", args),
		Rule:    "reading of an average-responding meter calibrated to show the RMS of a sine: it scales the rectified average by the sine's form factor",
		Formula: "reading = π/(2√2)·mean|x(t)|;  error = reading/X − 1;  form factor = X/mean|x(t)|",
		Inputs:  []calc.Operand{spectrumInput(name, s)},
		Results: []calc.Operand{{Name: "reading", Value: mag(reading, s.Dim)}, {Name: "true RMS", Value: mag(rms, s.Dim)},
			{Name: "rectified average", Value: mag(avg, s.Dim)}, {Name: "error", Value: num(e)}, {Name: "form factor", Value: num(ff)}},
		Notes:    []string{"the meter reads " + pct(f, math.Abs(e)) + " " + word + " against the true RMS; a sine's form factor is π/(2√2) ≈ 1.111, this waveform's is " + f.Mag(ff, calc.Dim{}, 0)},
		Cautions: calc.CautionsOf(calc.CautionMains),
	}
	return result(mag(reading, s.Dim), st, calc.Operand{Name: "rms", Value: mag(rms, s.Dim)}, calc.Operand{Name: "avg", Value: mag(avg, s.Dim)},
		calc.Operand{Name: "error", Value: num(e)}, calc.Operand{Name: "ff", Value: num(ff)})
}

func (k kit) callPower(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	v, vn, err := k.spectrum("hpower", args, 0, "V")
	if err != nil {
		return calc.Result{}, err
	}
	i, in, err := k.spectrum("hpower", args, 1, "I")
	if err != nil {
		return calc.Result{}, err
	}
	p, err := PowersOf(v, i)
	if err != nil {
		return calc.Result{}, fmt.Errorf("hpower: %w", err)
	}
	f := format(c)
	sense := "lagging (inductive)"
	switch {
	case p.Q1 < 0:
		sense = "leading (capacitive)"
	case p.Q1 == 0:
		sense = "in phase"
	}
	st := calc.Step{Kind: "harmonic", Source: source("hpower", args),
		Rule:    "power quantities of a non-sinusoidal single-phase voltage and current (IEEE Std 1459-2010)",
		Formula: "S = V·I;  S² = S_1² + S_N²;  S_N² = D_I² + D_V² + S_H²;  S_H² = P_H² + D_H²;  N = √(S² − P²);  PF = P/S;  PF_1 = P_1/S_1",
		Inputs: []calc.Operand{spectrumInput(vn, v), spectrumInput(in, i),
			{Name: "V_1", Value: mag(p.V1, calc.DimVoltage)}, {Name: "V_H", Value: mag(p.VH, calc.DimVoltage)},
			{Name: "I_1", Value: mag(p.I1, calc.DimCurrent)}, {Name: "I_H", Value: mag(p.IH, calc.DimCurrent)}},
		Results: []calc.Operand{
			{Name: "S", Value: va(p.S)}, {Name: "P", Value: watts(p.P)}, {Name: "N", Value: vars(p.N)},
			{Name: "S_1", Value: va(p.S1)}, {Name: "P_1", Value: watts(p.P1)}, {Name: "Q_1", Value: vars(p.Q1)},
			{Name: "S_N", Value: va(p.SN)}, {Name: "D_I", Value: vars(p.DI)}, {Name: "D_V", Value: vars(p.DV)},
			{Name: "S_H", Value: va(p.SH)}, {Name: "P_H", Value: watts(p.PH)}, {Name: "D_H", Value: vars(p.DH)},
			{Name: "PF", Value: num(p.PF)}, {Name: "PF_1", Value: num(p.PF1)},
			{Name: "THD_V", Value: num(p.THDV)}, {Name: "THD_I", Value: num(p.THDI)}},
		Notes: []string{"true power factor PF = " + f.Mag(p.PF, calc.Dim{}, 0) + "; displacement power factor PF_1 = " + f.Mag(p.PF1, calc.Dim{}, 0) + " " + sense +
			": capacitors correct only the displacement part (Q_1); the distortion powers need filtering"},
	}
	if p.PH < 0 {
		st.Notes = append(st.Notes, "P_H is negative: harmonic active power flows from the load back into the supply (the load is a source of harmonics)")
	}
	ex := []calc.Operand{{Name: "p", Value: watts(p.P)}, {Name: "p1", Value: watts(p.P1)}, {Name: "ph", Value: watts(p.PH)},
		{Name: "q1", Value: vars(p.Q1)}, {Name: "n", Value: vars(p.N)}, {Name: "di", Value: vars(p.DI)}, {Name: "dv", Value: vars(p.DV)}, {Name: "dh", Value: vars(p.DH)},
		{Name: "s1", Value: va(p.S1)}, {Name: "sn", Value: va(p.SN)}, {Name: "sh", Value: va(p.SH)},
		{Name: "pf", Value: num(p.PF)}, {Name: "pf1", Value: num(p.PF1)}, {Name: "thdv", Value: num(p.THDV)}, {Name: "thdi", Value: num(p.THDI)}}
	return result(va(p.S), st, ex...)
}

// bankCautions are the capacitor-bank cautions carried by every bank
// result.
func bankCautions() []calc.StepCaution {
	return calc.CautionsOf(calc.CautionCapacitor, calc.CautionMains)
}

func (k kit) callCheck(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	ssc, err := positive("bankcheck", args, 0, "Ssc", calc.DimPower, "the supply's short-circuit power in VA")
	if err != nil {
		return calc.Result{}, err
	}
	q, err := positive("bankcheck", args, 1, "Qc", calc.DimPower, "the bank's output at the supply voltage in var")
	if err != nil {
		return calc.Result{}, err
	}
	s, name, err := k.spectrum("bankcheck", args, 2, "X")
	if err != nil {
		return calc.Result{}, err
	}
	p := 0.0
	if len(args) > 3 {
		if p, err = plain("bankcheck", args, 3, "p", 0, 1, true, "the reactor ratio X_L/X_C from 0 up to 1 (such as 7 %)"); err != nil {
			return calc.Result{}, err
		}
	}
	b := Bank{Ssc: ssc, Q: q, P: p}
	if err := b.check(); err != nil {
		return calc.Result{}, fmt.Errorf("bankcheck: %w", err)
	}
	f := format(c)
	hr := b.ResonanceOrder()
	st := calc.Step{Kind: "harmonic", Source: source("bankcheck", args),
		Rule:    "resonance of a capacitor bank with the supply, checked against the orders present in a spectrum (common practice)",
		Formula: "h_r = 1/√(Q_c·(1 − p)/S_sc + p);  amplification of order h = |Z_bank/(Z_supply + Z_bank)|",
		Inputs:  []calc.Operand{{Name: "S_sc", Value: va(ssc)}, {Name: "Q_c", Value: vars(q)}, {Name: "p", Value: num(p)}, spectrumInput(name, s)},
		Results: []calc.Operand{{Name: "h_r", Value: num(hr)}},
	}
	var warn, notes []string
	n := 0.0
	if p > 0 {
		n = 1 / math.Sqrt(p)
		st.Results = append(st.Results, calc.Operand{Name: "n (tuned order)", Value: num(n)})
	}
	h1 := s.Fundamental()
	for _, comp := range s.Comps[1:] {
		if comp.RMS == 0 {
			continue
		}
		h := float64(comp.Order)
		row := calc.Row{Name: "order " + strconv.Itoa(comp.Order), Values: []calc.Operand{{Name: "% of h1", Value: num(comp.RMS / h1 * 100)}}}
		a, ok := b.Amplification(h)
		if ok {
			row.Values = append(row.Values, calc.Operand{Name: "amplification", Value: num(a)})
		} else {
			row.Name += ": at the resonance (lossless: unbounded)"
		}
		st.Rows = append(st.Rows, row)
		near := math.Abs(h-hr) <= 0.5
		switch {
		case near || !ok:
			warn = append(warn, "WARNING: order "+strconv.Itoa(comp.Order)+" is present in "+name+" ("+pctText(comp.RMS/h1*100)+
				" of the fundamental) and lies within ±0.5 of the resonance order "+f.Mag(hr, calc.Dim{}, 0)+
				": the bank and the supply will amplify it; do not connect the bank as it is: detune it or change its size, after a harmonic study")
		case a > 2:
			warn = append(warn, "WARNING: the bank multiplies the voltage of order "+strconv.Itoa(comp.Order)+" (present in "+name+") by "+f.Mag(a, calc.Dim{}, 0))
		}
		if p > 0 && h < n {
			notes = append(notes, "order "+strconv.Itoa(comp.Order)+" lies below the tuned order "+f.Mag(n, calc.Dim{}, 0)+": the reactor does not protect against it (the bank is capacitive there)")
		}
	}
	if len(warn) == 0 {
		notes = append(notes, "no order present in "+name+" lies within ±0.5 of the resonance order, and none is amplified more than twofold")
	}
	if p > 0 {
		notes = append(notes, "with the reactor the bank is inductive above order "+f.Mag(n, calc.Dim{}, 0)+", so orders above it cannot resonate with the supply")
	}
	st.Notes, st.Cautions = append(warn, notes...), bankCautions()
	ex := []calc.Operand{}
	if c != nil && c.Freq > 0 {
		ex = append(ex, calc.Operand{Name: "f", Value: mag(hr*c.Freq, calc.DimFrequency)})
	}
	if p > 0 {
		ex = append(ex, calc.Operand{Name: "n", Value: num(n)})
	}
	return result(num(hr), st, ex...)
}

func phasesWord(fn string, args []calc.Arg, i int) (bool, error) {
	switch args[i].Word {
	case "single":
		return false, nil
	case "three":
		return true, nil
	}
	return false, argErr(fn, i, "single|three", "single or three", args[i])
}

func callDetune(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	q, err := positive("detune", args, 0, "Qc", calc.DimPower, "the bank's output at the supply voltage in var")
	if err != nil {
		return calc.Result{}, err
	}
	v, err := positive("detune", args, 1, "V", calc.DimVoltage, "the supply voltage (line-to-line for three phases)")
	if err != nil {
		return calc.Result{}, err
	}
	p, err := plain("detune", args, 2, "p", 0, 1, true, "the reactor ratio X_L/X_C, above 0 and below 1 (such as 7 %)")
	if err != nil {
		return calc.Result{}, err
	}
	if p == 0 {
		return calc.Result{}, argErr("detune", 2, "p", "the reactor ratio X_L/X_C, above 0 and below 1 (such as 7 %)", args[2])
	}
	three, err := phasesWord("detune", args, 3)
	if err != nil {
		return calc.Result{}, err
	}
	vr := 0.0
	if len(args) > 4 {
		if vr, err = positive("detune", args, 4, "Vr", calc.DimVoltage, "the capacitor's rated voltage"); err != nil {
			return calc.Result{}, err
		}
	}
	if c == nil || !(c.Freq > 0) {
		return calc.Result{}, fmt.Errorf("detune: the working frequency is not set")
	}
	d, err := Detune(q, v, p, c.Freq, vr, three)
	if err != nil {
		return calc.Result{}, fmt.Errorf("detune: %w", err)
	}
	f := format(c)
	ph := "single-phase"
	if three {
		ph = "three-phase: V line-to-line, X, C and L per phase of the star equivalent"
	}
	st := calc.Step{Kind: "harmonic", Source: source("detune", args),
		Rule:    "detuned capacitor bank from its reactor ratio (common practice), " + ph,
		Formula: "X_C − X_L = V²/Q_c;  X_L = p·X_C;  n = 1/√p;  U_C = V/(1 − p);  Q_C = Q_c/(1 − p);  Q_L = p·Q_C;  Q_r = Q_C·(V_r/U_C)²",
		Inputs:  []calc.Operand{{Name: "Q_c", Value: vars(q)}, {Name: "V", Value: mag(v, calc.DimVoltage)}, {Name: "p", Value: num(p)}, {Name: "f", Value: mag(c.Freq, calc.DimFrequency)}},
		Results: []calc.Operand{{Name: "L (reactor)", Value: mag(d.L, calc.DimInductance)}, {Name: "n (tuned order)", Value: num(d.N)},
			{Name: "f_n", Value: mag(d.N*c.Freq, calc.DimFrequency)}, {Name: "U_C/V = 1/(1 − p)", Value: num(d.Rise)},
			{Name: "U_C", Value: mag(d.UC, calc.DimVoltage)}, {Name: "C", Value: mag(d.C, calc.DimCapacitance)},
			{Name: "X_C", Value: mag(d.XC, calc.DimImpedance)}, {Name: "X_L", Value: mag(d.XL, calc.DimImpedance)},
			{Name: "Q_C (capacitors at U_C)", Value: vars(d.QC)}, {Name: "Q_L (reactor)", Value: vars(d.QL)}, {Name: "I", Value: mag(d.I, calc.DimCurrent)}},
	}
	var notes []string
	if vr > 0 {
		st.Inputs = append(st.Inputs, calc.Operand{Name: "V_r", Value: mag(vr, calc.DimVoltage)})
		st.Results = append(st.Results, calc.Operand{Name: "Q_r (rating at V_r)", Value: vars(d.QRated)})
		if vr < d.UC {
			notes = append(notes, "WARNING: the capacitors' rated voltage "+f.Mag(vr, calc.DimVoltage, 0)+" is below their working voltage "+f.Mag(d.UC, calc.DimVoltage, 0)+
				" (the reactor raises it by 1/(1 − p), and harmonic voltages add to it): choose capacitors rated above U_C")
		}
	}
	notes = append(notes, "tuned to order "+f.Mag(d.N, calc.Dim{}, 0)+": the bank is inductive above it and cannot resonate with the supply at the orders above ("+
		usual(d.N, true)+"); "+usual(d.N, false))
	st.Notes, st.Cautions = notes, bankCautions()
	ex := []calc.Operand{{Name: "n", Value: num(d.N)}, {Name: "fr", Value: mag(d.N*c.Freq, calc.DimFrequency)}, {Name: "rise", Value: num(d.Rise)},
		{Name: "uc", Value: mag(d.UC, calc.DimVoltage)}, {Name: "c", Value: mag(d.C, calc.DimCapacitance)}, {Name: "xc", Value: mag(d.XC, calc.DimImpedance)},
		{Name: "xl", Value: mag(d.XL, calc.DimImpedance)}, {Name: "qc", Value: vars(d.QC)}, {Name: "ql", Value: vars(d.QL)}, {Name: "i", Value: mag(d.I, calc.DimCurrent)}}
	if vr > 0 {
		ex = append(ex, calc.Operand{Name: "qr", Value: vars(d.QRated)})
	}
	if three {
		// capacitors connected in delta across the lines: a third of the
		// star capacitance gives the same output (common practice)
		cd := mag(d.C/3, calc.DimCapacitance)
		st.Results = append(st.Results, calc.Operand{Name: "C_Δ (capacitors in delta)", Value: cd})
		ex = append(ex, calc.Operand{Name: "cdelta", Value: cd})
	}
	return result(mag(d.L, calc.DimInductance), st, ex...)
}

// usual lists the usual harmonic orders (3 from single-phase loads and
// unbalance, 5, 7, 11, 13 from converters) above the tuned order n, or
// says which lie below it and are not protected.
func usual(n float64, up bool) string {
	var out []string
	for _, h := range []int{3, 5, 7, 11, 13} {
		if float64(h) > n == up {
			out = append(out, strconv.Itoa(h))
		}
	}
	switch {
	case up && len(out) == 0:
		return "none of the usual orders up to 13"
	case up:
		return strings.Join(out, ", ") + ", …"
	case len(out) == 0:
		return "every usual order from 3 up lies above it"
	}
	return "order " + strings.Join(out, ", ") + " lies below it and is not protected"
}

func callBankOut(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	qr, err := positive("bankout", args, 0, "Qr", calc.DimPower, "the capacitors' rated output in var")
	if err != nil {
		return calc.Result{}, err
	}
	vr, err := positive("bankout", args, 1, "Vr", calc.DimVoltage, "the capacitors' rated voltage")
	if err != nil {
		return calc.Result{}, err
	}
	v, err := positive("bankout", args, 2, "V", calc.DimVoltage, "the supply voltage")
	if err != nil {
		return calc.Result{}, err
	}
	p := 0.0
	if len(args) > 3 {
		if p, err = plain("bankout", args, 3, "p", 0, 1, true, "the reactor ratio X_L/X_C from 0 up to 1 (such as 7 %)"); err != nil {
			return calc.Result{}, err
		}
	}
	o, err := BankOutput(qr, vr, v, p)
	if err != nil {
		return calc.Result{}, fmt.Errorf("bankout: %w", err)
	}
	f := format(c)
	st := calc.Step{Kind: "harmonic", Source: source("bankout", args),
		Rule:    "output of a capacitor bank at the supply voltage, from its rating (common practice)",
		Formula: "X_C = V_r²/Q_r;  Q = V²/(X_C·(1 − p)) = Q_r·(V/V_r)²/(1 − p);  U_C = V/(1 − p)",
		Inputs:  []calc.Operand{{Name: "Q_r", Value: vars(qr)}, {Name: "V_r", Value: mag(vr, calc.DimVoltage)}, {Name: "V", Value: mag(v, calc.DimVoltage)}, {Name: "p", Value: num(p)}},
		Results: []calc.Operand{{Name: "Q", Value: vars(o.Q)}, {Name: "U_C", Value: mag(o.UC, calc.DimVoltage)}, {Name: "Q_C", Value: vars(o.QC)}, {Name: "Q_L", Value: vars(o.QL)}},
	}
	var notes []string
	if o.UC > vr*(1+1e-12) {
		notes = append(notes, "WARNING: the capacitors work at "+f.Mag(o.UC, calc.DimVoltage, 0)+", above their rated "+f.Mag(vr, calc.DimVoltage, 0)+
			"; harmonic voltages add to it: choose capacitors rated above U_C")
	}
	if p == 0 && v < vr {
		notes = append(notes, "a capacitor below its rated voltage gives less than its rating: output goes with the square of the voltage")
	}
	st.Notes, st.Cautions = notes, bankCautions()
	return result(vars(o.Q), st, calc.Operand{Name: "uc", Value: mag(o.UC, calc.DimVoltage)}, calc.Operand{Name: "qc", Value: vars(o.QC)}, calc.Operand{Name: "ql", Value: vars(o.QL)})
}

// scanRows is the number of plot rows of bankscan, and scanPerOrder the
// points per order it computes.
const (
	scanRows     = 12
	scanPerOrder = 20
)

func callScan(c *calc.Context, args []calc.Arg) (calc.Result, error) {
	ssc, err := positive("bankscan", args, 0, "Ssc", calc.DimPower, "the supply's short-circuit power in VA")
	if err != nil {
		return calc.Result{}, err
	}
	q, err := positive("bankscan", args, 1, "Qc", calc.DimPower, "the bank's output at the supply voltage in var")
	if err != nil {
		return calc.Result{}, err
	}
	v, err := positive("bankscan", args, 2, "V", calc.DimVoltage, "the supply voltage (line-to-line for three phases)")
	if err != nil {
		return calc.Result{}, err
	}
	b := Bank{Ssc: ssc, Q: q}
	hmax := 25
	if calc.Given(args, 3) {
		if b.P, err = plain("bankscan", args, 3, "p", 0, 1, true, "the reactor ratio X_L/X_C from 0 up to 1 (0 without a reactor)"); err != nil {
			return calc.Result{}, err
		}
	}
	if calc.Given(args, 4) {
		if b.XR, err = plain("bankscan", args, 4, "X/R", 0, 1e6, false, "the supply's X/R at the fundamental, 0 (lossless) or more"); err != nil {
			return calc.Result{}, err
		}
	}
	if calc.Given(args, 5) {
		h, err := plain("bankscan", args, 5, "hmax", 2, MaxScanOrder, false, fmt.Sprintf("a whole number from 2 to %d", MaxScanOrder))
		if err != nil {
			return calc.Result{}, err
		}
		if h != math.Trunc(h) {
			return calc.Result{}, argErr("bankscan", 5, "hmax", fmt.Sprintf("a whole number from 2 to %d", MaxScanOrder), args[5])
		}
		hmax = int(h)
	}
	fine, err := b.Scan(v, hmax, 1.0/scanPerOrder)
	if err != nil {
		return calc.Result{}, fmt.Errorf("bankscan: %w", err)
	}
	f := format(c)
	hr := b.ResonanceOrder()
	st := calc.Step{Kind: "harmonic", Source: source("bankscan", args),
		Rule:    "impedance seen from the bus over harmonic order: the supply alone (Zs) and in parallel with the bank (Z) (common practice)",
		Formula: "Z_s = V²/S_sc·(1/(X/R) + j·h);  Z_b = j·(h·p − 1/h)·X_C, X_C = V²/(Q_c·(1 − p));  Z = Z_s·Z_b/(Z_s + Z_b)",
		Inputs: []calc.Operand{{Name: "S_sc", Value: va(ssc)}, {Name: "Q_c", Value: vars(q)}, {Name: "V", Value: mag(v, calc.DimVoltage)},
			{Name: "p", Value: num(b.P)}, {Name: "X/R", Value: num(b.XR)}},
		Results: []calc.Operand{{Name: "h_r (resonance order)", Value: num(hr)}},
	}
	for _, pt := range fine {
		if math.Abs(pt.H-math.Round(pt.H)) > 1e-9 {
			continue
		}
		row := calc.Row{Name: "order " + strconv.Itoa(int(math.Round(pt.H)))}
		if pt.Inf {
			row.Name += ": resonance (lossless: unbounded)"
		} else {
			row.Values = []calc.Operand{{Name: "Zs", Value: calc.Q(pt.Zs, calc.DimImpedance)}, {Name: "Z", Value: calc.Q(pt.Zp, calc.DimImpedance)},
				{Name: "|Z|/|Zs|", Value: num(cmplxAbs(pt.Zp) / cmplxAbs(pt.Zs))}}
		}
		st.Rows = append(st.Rows, row)
	}
	ascii := c != nil && c.Format.ASCII
	notes := []string{"plot:\n" + PlotScan(fine, 64, scanRows, ascii)}
	for _, h := range []int{5, 7, 11, 13} {
		if math.Abs(float64(h)-hr) <= 0.5 {
			notes = append(notes, "WARNING: the resonance order "+f.Mag(hr, calc.Dim{}, 0)+" lies within ±0.5 of order "+strconv.Itoa(h)+", a usual converter harmonic")
		}
	}
	if b.XR == 0 {
		notes = append(notes, "lossless supply (X/R not given): the peak at the resonance is bounded only by resistance; give X/R for a finite peak")
	}
	st.Notes, st.Cautions = notes, bankCautions()
	ex := []calc.Operand{}
	if c != nil && c.Freq > 0 {
		ex = append(ex, calc.Operand{Name: "f", Value: mag(hr*c.Freq, calc.DimFrequency)})
	}
	return result(num(hr), st, ex...)
}

// Describe is the step of a spectrum statement: a row per order with its
// value and share of the fundamental, the RMS and THD, and the bar plot.
func Describe(src, name string, s Spectrum, c *calc.Context) calc.Step {
	f := format(c)
	st := calc.Step{Kind: "spectrum", Source: src,
		Rule:    "spectrum " + name + ": the RMS value of each order (and its angle where given)",
		Formula: "x(t) = Σ √2·X_h·cos(h·ωt + φ_h);  X = √(Σ X_h²);  THD = √(Σ_{h≥2} X_h²)/X_1",
	}
	h1 := s.Fundamental()
	for _, comp := range s.Comps {
		row := calc.Row{Name: "h" + strconv.Itoa(comp.Order)}
		switch {
		case comp.HasAngle || comp.Order == 1 && !s.Dim.IsDimensionless():
			// the fundamental without an angle is the reference, at 0°
			row.Values = append(row.Values, calc.Operand{Name: "X", Value: calc.Quantity{V: complex(comp.RMS*math.Cos(comp.Angle), comp.RMS*math.Sin(comp.Angle)), Dim: s.Dim}})
		case !s.Dim.IsDimensionless():
			// a magnitude with no angle is not a phasor at 0°: say so
			row.Name += " " + f.Mag(comp.RMS, s.Dim, 0) + ", angle not given"
		}
		row.Values = append(row.Values, calc.Operand{Name: "% of h1", Value: num(comp.RMS / h1 * 100)})
		st.Rows = append(st.Rows, row)
	}
	if !s.Dim.IsDimensionless() {
		st.Results = append(st.Results, calc.Operand{Name: "X (RMS)", Value: mag(s.RMS(), s.Dim)})
	}
	st.Results = append(st.Results, calc.Operand{Name: "THD", Value: num(s.THD())})
	st.Notes = append(st.Notes, "THD = "+pct(f, s.THD())+" of the fundamental; functions that read a spectrum: hrms thd tdd crest fhl kfactor avgmeter hpower bankcheck")
	if c != nil && c.Basis == calc.Peak {
		st.Notes = append(st.Notes, "the worksheet's phasor basis is peak, but a spectrum holds the RMS value of each order, as entered")
	}
	if m := s.missingAngles(); len(m) > 0 {
		st.Notes = append(st.Notes, "no angle at order "+orderList(m)+": RMS, THD, TDD, F_HL and K need none; crest, avgmeter and hpower do")
	}
	ascii := c != nil && c.Format.ASCII
	st.Notes = append(st.Notes, "plot:\n"+PlotSpectrum(s, ascii))
	return st
}
