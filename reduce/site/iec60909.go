package site

import (
	"math"
	"math/cmplx"
	"strconv"

	"argand/calc"
)

// This file computes short-circuit currents in three-phase a.c. systems by
// the method of IEC 60909-0: an equivalent voltage source c·U_n/√3 at the
// fault location drives the current through the short-circuit impedance of
// the network, built from the impedances of its elements (network feeder,
// network transformers with their correction factor K_T, cables and
// lines). Motors, generators and power station units are not modelled.

// VoltageFactors holds the voltage factors c_max and c_min of IEC 60909-0
// for one nominal voltage, and the words that say where they come from.
type VoltageFactors struct {
	Max, Min float64
	Source   string
}

// The voltage factors of IEC 60909-0:2016, Table 1, from memory (the text
// was not at hand; the c_max values 1.05 for low voltage and 1.1 for high
// voltage agree with the IEC TR 60909-4 figures in the shared published
// examples):
//
//	low voltage, 100 V to 1000 V, tolerance +6 %:  c_max 1.05, c_min 0.95
//	low voltage, 100 V to 1000 V, tolerance +10 %: c_max 1.10, c_min 0.90
//	above 1 kV:                                    c_max 1.10, c_min 1.00
const (
	lvCMax6, lvCMin6   = 1.05, 0.95
	lvCMax10, lvCMin10 = 1.10, 0.90
	hvCMax, hvCMin     = 1.10, 1.00
)

// cTableSource is said in every step that takes c from the table.
const cTableSource = "IEC 60909-0 Table 1 (values recalled without the text at hand: check them, or give c)"

// VoltageFactorsFor returns c_max and c_min for a nominal system voltage un
// (line-to-line, V). tol10 selects the low-voltage systems whose voltage
// tolerance is +10 % instead of +6 %. The table starts at 100 V.
func VoltageFactorsFor(un float64, tol10 bool) (VoltageFactors, error) {
	if err := positive("U_n", un); err != nil {
		return VoltageFactors{}, err
	}
	switch {
	case un < 100:
		return VoltageFactors{}, errf("U_n = %s V: the voltage-factor table starts at 100 V; give c yourself", sig(un))
	case un <= 1000 && tol10:
		return VoltageFactors{lvCMax10, lvCMin10, "low voltage, tolerance +10 %, " + cTableSource}, nil
	case un <= 1000:
		return VoltageFactors{lvCMax6, lvCMin6, "low voltage, tolerance +6 %, " + cTableSource}, nil
	}
	return VoltageFactors{hvCMax, hvCMin, "above 1 kV, " + cTableSource}, nil
}

// ElementZ is the impedance of one element of a short-circuit path, on the
// voltage level of the fault, with the factor applied to it.
type ElementZ struct {
	Z      calc.Quantity // Ω per phase, positive sequence
	Factor calc.Quantity // the correction or division applied (K_T, c_Q, 1/n)
	Hot    calc.Quantity // a cable at the conductor temperature at the end of the fault; zero value when not asked
	Steps  []calc.Step
}

// Feeder is a network feeder (the supply at the connection point Q) given
// by its initial symmetrical short-circuit current or its fault level.
type Feeder struct {
	UnQ float64 // nominal voltage at Q, V line-to-line
	IkQ float64 // I"_kQ, A; or
	SkQ float64 // S"_kQ = √3·U_nQ·I"_kQ, VA
	// RX is R_Q/X_Q; RXKnown false takes 0.1, as IEC 60909-0 allows when
	// the ratio is not known.
	RX      float64
	RXKnown bool
	C       float64 // c_Q; 0 takes c_max of the table for U_nQ
	// UrHV, UrLV refer Z_Q through a transformer of rated voltages UrHV/UrLV
	// to its low-voltage side; both 0 leave it at U_nQ.
	UrHV, UrLV float64
}

// FeederZ returns the impedance of a network feeder:
// Z_Q = c_Q·U_nQ/(√3·I"_kQ) = c_Q·U_nQ²/S"_kQ, X_Q = Z_Q/√(1 + (R_Q/X_Q)²),
// R_Q = (R_Q/X_Q)·X_Q, referred to the low-voltage side of a transformer by
// 1/t_r², t_r = U_rTHV/U_rTLV (IEC 60909-0).
func FeederZ(f Feeder) (ElementZ, error) {
	if err := positive("U_nQ", f.UnQ); err != nil {
		return ElementZ{}, err
	}
	if err := finite([]string{"I\"_kQ", "S\"_kQ", "R_Q/X_Q", "c_Q", "U_rTHV", "U_rTLV"}, f.IkQ, f.SkQ, f.RX, f.C, f.UrHV, f.UrLV); err != nil {
		return ElementZ{}, err
	}
	if (f.IkQ > 0) == (f.SkQ > 0) {
		return ElementZ{}, errf("give the feeder's I\"_kQ in A or its fault level S\"_kQ in VA (one of them, positive)")
	}
	var notes []string
	rx := f.RX
	if !f.RXKnown {
		rx = 0.1
		notes = append(notes, "R_Q/X_Q not given: 0.1 taken, as IEC 60909-0 allows when the ratio is not known")
	}
	if rx < 0 {
		return ElementZ{}, errf("R_Q/X_Q must not be negative (got %s)", sig(rx))
	}
	c := f.C
	csrc := "c_Q as given"
	if c == 0 {
		vf, err := VoltageFactorsFor(f.UnQ, false)
		if err != nil {
			return ElementZ{}, err
		}
		c, csrc = vf.Max, "c_Q = c_max, "+vf.Source
	}
	if c < 0.5 || c > 1.5 {
		return ElementZ{}, errf("c_Q = %s is not a voltage factor (IEC 60909-0 values lie near 0.9 to 1.1)", sig(c))
	}
	refer := f.UrHV != 0 || f.UrLV != 0
	if refer {
		if err := positive("U_rTHV", f.UrHV); err != nil {
			return ElementZ{}, err
		}
		if err := positive("U_rTLV", f.UrLV); err != nil {
			return ElementZ{}, err
		}
	}
	var zq float64
	var in calc.Operand
	form := "Z_Q = c_Q·U_nQ/(√3·I\"_kQ)"
	if f.IkQ > 0 {
		zq = c * f.UnQ / (math.Sqrt(3) * f.IkQ)
		in = op("I\"_kQ", kq(f.IkQ, calc.DimCurrent, calc.KindMagnitude))
	} else {
		zq = c * f.UnQ * f.UnQ / f.SkQ
		in = op("S\"_kQ", power(f.SkQ, calc.KindApparent))
		form = "Z_Q = c_Q·U_nQ²/S\"_kQ"
	}
	xq := zq / math.Sqrt(1+rx*rx)
	z := complex(rx*xq, xq)
	form += ", X_Q = Z_Q/√(1 + (R_Q/X_Q)²), R_Q = (R_Q/X_Q)·X_Q"
	inputs := []calc.Operand{op("U_nQ", rq(f.UnQ, calc.DimVoltage)), in, op("c_Q", num(c)), op("R_Q/X_Q", num(rx))}
	results := []calc.Operand{op("Z_Q", cq(z, calc.DimImpedance))}
	rule := "network feeder impedance at the connection point (IEC 60909-0); " + csrc
	if refer {
		tr := f.UrHV / f.UrLV
		z /= complex(tr*tr, 0)
		form += "; Z_Qt = Z_Q/t_r², t_r = U_rTHV/U_rTLV"
		inputs = append(inputs, op("U_rTHV", rq(f.UrHV, calc.DimVoltage)), op("U_rTLV", rq(f.UrLV, calc.DimVoltage)))
		results = append(results, op("t_r", num(tr)), op("Z_Qt", cq(z, calc.DimImpedance)))
		rule += "; referred to the transformer's low-voltage side"
	}
	r := ElementZ{Z: cq(z, calc.DimImpedance), Factor: num(c)}
	r.Steps = []calc.Step{{Kind: "fault", Rule: rule, Formula: form, Inputs: inputs, Results: results, Notes: notes, Cautions: calc.CautionsOf(calc.CautionFault)}}
	if err := checkSteps(r.Steps); err != nil {
		return ElementZ{}, err
	}
	return r, nil
}

// NetTransformer is a two-winding network transformer's rating plate.
type NetTransformer struct {
	S          float64 // S_rT, VA
	UrHV, UrLV float64 // rated voltages, V line-to-line
	Ukr        float64 // u_kr, per cent
	// The resistive part: the load losses P_krT (W) or u_Rr (per cent),
	// one of them; both 0 take the transformer as a pure reactance.
	PkrT, URr float64
	HVSide    bool    // impedance referred to the high-voltage side; else the low-voltage side
	CMax      float64 // c_max of the network on the low-voltage side; 0 takes the table for U_rTLV
	Tol10     bool    // with CMax 0: a low-voltage network of tolerance +10 %
}

// TransformerZ returns the corrected impedance of a network transformer
// (IEC 60909-0): Z_T = (u_kr/100)·U_rT²/S_rT, R_T = P_krT·U_rT²/S_rT²
// (= (u_Rr/100)·U_rT²/S_rT), X_T = √(Z_T² − R_T²), and Z_TK = K_T·Z_T with
// K_T = 0.95·c_max/(1 + 0.6·x_T), x_T = X_T/(U_rT²/S_rT), where c_max is
// that of the network on the low-voltage side.
func TransformerZ(t NetTransformer) (ElementZ, error) {
	for _, p := range []struct {
		n string
		x float64
	}{{"S_rT", t.S}, {"U_rTHV", t.UrHV}, {"U_rTLV", t.UrLV}, {"u_kr", t.Ukr}} {
		if err := positive(p.n, p.x); err != nil {
			return ElementZ{}, err
		}
	}
	if err := finite([]string{"P_krT", "u_Rr", "c_max"}, t.PkrT, t.URr, t.CMax); err != nil {
		return ElementZ{}, err
	}
	if t.Ukr >= 100 {
		return ElementZ{}, errf("u_kr = %s %% is not a transformer's short-circuit voltage (below 100 %%)", sig(t.Ukr))
	}
	if t.PkrT < 0 || t.URr < 0 {
		return ElementZ{}, errf("P_krT and u_Rr must not be negative")
	}
	if t.PkrT > 0 && t.URr > 0 {
		return ElementZ{}, errf("give P_krT or u_Rr, not both")
	}
	cmax := t.CMax
	csrc := "c_max as given"
	if cmax == 0 {
		vf, err := VoltageFactorsFor(t.UrLV, t.Tol10)
		if err != nil {
			return ElementZ{}, err
		}
		cmax, csrc = vf.Max, "c_max of the low-voltage side, "+vf.Source
	}
	if cmax < 0.5 || cmax > 1.5 {
		return ElementZ{}, errf("c_max = %s is not a voltage factor", sig(cmax))
	}
	u := t.UrLV
	side := "low-voltage side"
	if t.HVSide {
		u, side = t.UrHV, "high-voltage side"
	}
	zb := u * u / t.S
	zt := t.Ukr / 100 * zb
	var rt float64
	var rIn calc.Operand
	rForm := "R_T = P_krT·U_rT²/S_rT²"
	var notes []string
	switch {
	case t.PkrT > 0:
		rt = t.PkrT * u * u / (t.S * t.S)
		rIn = op("P_krT", power(t.PkrT, calc.KindActive))
	case t.URr > 0:
		rt = t.URr / 100 * zb
		rIn = op("u_Rr (%)", num(t.URr))
		rForm = "R_T = (u_Rr/100)·U_rT²/S_rT"
	default:
		rIn = op("u_Rr (%)", num(0))
		rForm = "R_T = 0"
		notes = append(notes, "no load losses or u_Rr given: the transformer is taken as a pure reactance (the peak factor κ comes out high)")
	}
	if rt >= zt {
		return ElementZ{}, errf("the resistance from the load losses (%s Ω) is not below Z_T = %s Ω: check P_krT or u_Rr against u_kr", sig(rt), sig(zt))
	}
	xt := math.Sqrt(zt*zt - rt*rt)
	xpu := xt / zb
	kt := 0.95 * cmax / (1 + 0.6*xpu)
	z := complex(kt*rt, kt*xt)
	notes = append(notes, "K_T applies to a network transformer (IEC 60909-0); it is used for the maximum and the minimum currents alike here")
	r := ElementZ{Z: cq(z, calc.DimImpedance), Factor: num(kt)}
	r.Steps = []calc.Step{{
		Kind:    "fault",
		Rule:    "network transformer impedance with its correction factor K_T (IEC 60909-0), on the " + side + "; " + csrc,
		Formula: "Z_T = (u_kr/100)·U_rT²/S_rT; " + rForm + "; X_T = √(Z_T² − R_T²); x_T = X_T·S_rT/U_rT²; K_T = 0.95·c_max/(1 + 0.6·x_T); Z_TK = K_T·(R_T + jX_T)",
		Inputs: []calc.Operand{op("S_rT", power(t.S, calc.KindApparent)), op("U_rT", rq(u, calc.DimVoltage)), op("u_kr (%)", num(t.Ukr)), rIn,
			op("c_max", num(cmax))},
		Results: []calc.Operand{op("Z_T", cq(complex(rt, xt), calc.DimImpedance)), op("x_T", num(xpu)), op("K_T", num(kt)), op("Z_TK", r.Z)},
		Notes:   notes, Cautions: calc.CautionsOf(calc.CautionFault),
	}}
	if err := checkSteps(r.Steps); err != nil {
		return ElementZ{}, err
	}
	return r, nil
}

// alpha60909 is the temperature coefficient IEC 60909-0 uses for the
// resistance of copper, aluminium and aluminium-alloy conductors at the end
// of a short circuit, 0.004 /K (from memory).
const alpha60909 = 0.004

// Run is a cable or overhead line: n identical conductors in parallel per
// phase, each of R' + jX' per length at 20 °C.
type Run struct {
	R, X     float64 // Ω/m at 20 °C
	Length   float64 // m
	Parallel int     // runs in parallel; 0 means 1
	// ThetaE is the conductor temperature at the end of the short circuit
	// (°C), used for the minimum current; HasThetaE says it was given.
	ThetaE    float64
	HasThetaE bool
}

// RunZ returns the impedance of a cable or line, Z_L = (R' + jX')·l/n at
// 20 °C, and, with θ_e, the resistance for the minimum short-circuit
// current R_L = [1 + 0.004/K·(θ_e − 20 °C)]·R_L20 (IEC 60909-0).
func RunZ(c Run) (ElementZ, error) {
	if err := finite([]string{"R'", "X'", "length", "θ_e"}, c.R, c.X, c.Length, c.ThetaE); err != nil {
		return ElementZ{}, err
	}
	if c.R < 0 || c.X < 0 {
		return ElementZ{}, errf("R' and X' of a cable or line must not be negative")
	}
	if err := positive("length", c.Length); err != nil {
		return ElementZ{}, err
	}
	n := c.Parallel
	if n == 0 {
		n = 1
	}
	if n < 0 || n > 1000 {
		return ElementZ{}, errf("the number of runs in parallel must be a whole number from 1 to 1000 (got %d)", n)
	}
	if c.R == 0 && c.X == 0 {
		return ElementZ{}, errf("a cable or line of zero impedance adds nothing: give R' and X'")
	}
	z := complex(c.R, c.X) * complex(c.Length/float64(n), 0)
	r := ElementZ{Z: cq(z, calc.DimImpedance), Factor: num(1 / float64(n))}
	st := calc.Step{
		Kind:    "fault",
		Rule:    "cable or line impedance at 20 °C, " + strconv.Itoa(n) + " run(s) in parallel (IEC 60909-0)",
		Formula: "Z_L = (R' + jX')·l/n",
		Inputs: []calc.Operand{op("R'", rq(c.R, perMetre)), op("X'", rq(c.X, perMetre)), op("l", rq(c.Length, calc.DimLength)),
			op("n", kq(float64(n), calc.Dimensionless, calc.KindCount))},
		Results:  []calc.Operand{op("Z_L", r.Z)},
		Cautions: calc.CautionsOf(calc.CautionFault),
	}
	r.Steps = []calc.Step{st}
	if c.HasThetaE {
		if c.ThetaE < 20 || c.ThetaE > 400 {
			return ElementZ{}, errf("θ_e = %s °C: the conductor temperature at the end of a short circuit lies from 20 °C up to a few hundred °C", sig(c.ThetaE))
		}
		f := 1 + alpha60909*(c.ThetaE-20)
		zh := complex(real(z)*f, imag(z))
		r.Hot = cq(zh, calc.DimImpedance)
		r.Steps = append(r.Steps, calc.Step{
			Kind:     "fault",
			Rule:     "the same run at the conductor temperature at the end of the short circuit, for the minimum current (IEC 60909-0)",
			Formula:  "R_L = [1 + α·(θ_e − 20 °C)]·R_L20, α = 0.004 /K (copper, aluminium, aluminium alloy)",
			Inputs:   []calc.Operand{op("Z_L (20 °C)", r.Z), op("θ_e (°C)", num(c.ThetaE)), op("α (/K)", num(alpha60909))},
			Results:  []calc.Operand{op("factor", num(f)), op("Z_L (θ_e)", r.Hot)},
			Cautions: calc.CautionsOf(calc.CautionFault),
		})
	}
	if err := checkSteps(r.Steps); err != nil {
		return ElementZ{}, err
	}
	return r, nil
}

// NamedZ is one element of a short-circuit path as the user named it.
type NamedZ struct {
	Name string
	Z    complex128
}

// Short is a balanced three-phase short circuit at a point of nominal
// voltage Un fed through the series elements Path.
type Short struct {
	Un    float64
	Path  []NamedZ
	Min   bool    // the minimum current (c_min); else the maximum (c_max)
	C     float64 // the voltage factor; 0 takes it from the table
	Tol10 bool    // with C 0: a low-voltage system of tolerance +10 %
}

// ShortResult is the three-phase short-circuit current at the fault.
type ShortResult struct {
	Zk    calc.Quantity // Σ Z of the path, Ω
	C     calc.Quantity
	Ik    calc.Quantity // I"_k, A (a magnitude)
	Sk    calc.Quantity // S"_k = √3·U_n·I"_k, VA
	Kappa calc.Quantity // κ (maximum only)
	Ip    calc.Quantity // i_p = κ·√2·I"_k, A, an instantaneous value (maximum only)
	Steps []calc.Step
}

// maxPath bounds the elements of a short-circuit path.
const maxPath = 1000

// ThreePhaseShort returns the initial symmetrical short-circuit current of
// a balanced three-phase fault by IEC 60909-0: I"_k = c·U_n/(√3·|Z_k|) with
// Z_k the sum of the path's impedances, the short-circuit power
// S"_k = √3·U_n·I"_k and, for the maximum, the peak current
// i_p = κ·√2·I"_k with κ = 1.02 + 0.98·e^(−3R/X) from R/X of Z_k (the
// series path of a non-meshed network).
func ThreePhaseShort(s Short) (ShortResult, error) {
	if err := positive("U_n", s.Un); err != nil {
		return ShortResult{}, err
	}
	if len(s.Path) == 0 {
		return ShortResult{}, errf("a short-circuit path needs at least one impedance")
	}
	if len(s.Path) > maxPath {
		return ShortResult{}, errf("too many elements in the path (at most %d)", maxPath)
	}
	c, csrc, err := factorFor(s.Un, s.C, s.Min, s.Tol10)
	if err != nil {
		return ShortResult{}, err
	}
	var zk complex128
	sum := calc.Step{Kind: "fault", Rule: "short-circuit impedance at the fault: the elements in series, positive sequence, on the fault's voltage level",
		Formula: "Z_k = Σ Z = Σ R + jΣ X"}
	for _, e := range s.Path {
		if err := finiteC(e.Name, e.Z); err != nil {
			return ShortResult{}, err
		}
		if real(e.Z) < 0 {
			return ShortResult{}, errf("%s has a negative resistance (%s Ω): not a passive element", e.Name, sig(real(e.Z)))
		}
		zk += e.Z
		sum.Rows = append(sum.Rows, calc.Row{Name: e.Name, Values: []calc.Operand{
			op("z", cq(e.Z, calc.DimImpedance)), op("r", kq(real(e.Z), calc.DimImpedance, calc.KindResistive)), op("x", kq(imag(e.Z), calc.DimImpedance, calc.KindSigned))}})
	}
	if cmplx.Abs(zk) == 0 {
		return ShortResult{}, errf("the short-circuit impedance is zero: the current is unbounded")
	}
	if imag(zk) < 0 {
		return ShortResult{}, errf("the short-circuit impedance %s is capacitive: not a supply path", sig(cmplx.Abs(zk)))
	}
	sum.Results = []calc.Operand{op("Z_k", cq(zk, calc.DimImpedance))}
	ik := c * s.Un / (math.Sqrt(3) * cmplx.Abs(zk))
	sk := math.Sqrt(3) * s.Un * ik
	which, cname := "maximum", "c_max"
	if s.Min {
		which, cname = "minimum", "c_min"
	}
	r := ShortResult{Zk: cq(zk, calc.DimImpedance), C: num(c), Ik: kq(ik, calc.DimCurrent, calc.KindMagnitude), Sk: power(sk, calc.KindApparent)}
	cur := calc.Step{
		Kind:    "fault",
		Rule:    which + " initial symmetrical short-circuit current, three-phase (IEC 60909-0, equivalent voltage source at the fault); " + csrc,
		Formula: "I\"_k = " + cname + "·U_n/(√3·|Z_k|);  S\"_k = √3·U_n·I\"_k",
		Inputs:  []calc.Operand{op("U_n", rq(s.Un, calc.DimVoltage)), op(cname, r.C), op("Z_k", r.Zk)},
		Results: []calc.Operand{op("I\"_k", r.Ik), op("S\"_k", r.Sk)},
	}
	notes := []string{"motors, generators and power station units do not feed this fault here: add their contribution where they do"}
	if s.Min {
		notes = append(notes, "for the minimum current give cables and lines at the conductor temperature at the end of the short circuit (zcable with θ_e, its .hot), and the feeder at its minimum fault level")
	}
	steps := []calc.Step{sum, cur}
	if !s.Min {
		// X > 0 here, or X = 0 (purely resistive), where R/X is infinite
		// and κ takes its limit 1.02
		kappa := 1.02
		if imag(zk) > 0 {
			kappa = 1.02 + 0.98*math.Exp(-3*real(zk)/imag(zk))
		}
		ip := kappa * math.Sqrt2 * ik
		r.Kappa, r.Ip = num(kappa), kq(ip, calc.DimCurrent, calc.KindMagnitude)
		steps = append(steps, calc.Step{
			Kind:    "fault",
			Rule:    "peak short-circuit current, κ from R/X of Z_k at the fault (IEC 60909-0, a non-meshed network: one series path)",
			Formula: "κ = 1.02 + 0.98·e^(−3R/X);  i_p = κ·√2·I\"_k",
			Inputs:  []calc.Operand{op("R_k", kq(real(zk), calc.DimImpedance, calc.KindResistive)), op("X_k", kq(imag(zk), calc.DimImpedance, calc.KindSigned)), op("I\"_k", r.Ik)},
			Results: []calc.Operand{op("κ", r.Kappa), op("i_p", r.Ip)},
		})
	}
	last := &steps[len(steps)-1]
	last.Notes, last.Cautions = notes, calc.CautionsOf(calc.CautionFault, calc.CautionMains)
	r.Steps = steps
	if err := checkSteps(steps); err != nil {
		return ShortResult{}, err
	}
	for _, row := range sum.Rows {
		if err := checkOps(row.Values); err != nil {
			return ShortResult{}, err
		}
	}
	return r, nil
}

// factorFor returns the voltage factor for a fault at nominal voltage un:
// the given c, or c_max or c_min of the table.
func factorFor(un, given float64, min, tol10 bool) (float64, string, error) {
	if err := finite([]string{"c"}, given); err != nil {
		return 0, "", err
	}
	if given != 0 {
		if given < 0.5 || given > 1.5 {
			return 0, "", errf("c = %s is not a voltage factor (IEC 60909-0 values lie near 0.9 to 1.1)", sig(given))
		}
		return given, "c = " + sig(given) + " as given", nil
	}
	vf, err := VoltageFactorsFor(un, tol10)
	if err != nil {
		return 0, "", err
	}
	if min {
		return vf.Min, "c_min = " + sig(vf.Min) + ", " + vf.Source, nil
	}
	return vf.Max, "c_max = " + sig(vf.Max) + ", " + vf.Source, nil
}
