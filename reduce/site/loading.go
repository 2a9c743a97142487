package site

import (
	"math"
	"math/cmplx"

	"argand/calc"
)

// loadVoltage solves a load fed through a series impedance z from a fixed
// e.m.f. of magnitude e: the load draws |I| = im at the angle phi from its
// own voltage (phi < 0 lags). With the load voltage on the real axis and
// w = z·I, |V + w| = e gives |V| = −Re w + √(e² − (Im w)²). The phasors are
// returned turned so that the e.m.f. is at 0°.
func loadVoltage(e float64, z complex128, im, phi float64) (v, i complex128, err error) {
	i0 := cmplx.Rect(im, phi)
	w := z * i0
	disc := e*e - imag(w)*imag(w)
	if disc < 0 {
		return 0, 0, errf("no load voltage exists: the drop across the reactance exceeds the e.m.f. (the supply cannot carry this load)")
	}
	vr := -real(w) + math.Sqrt(disc)
	if vr <= 0 {
		return 0, 0, errf("no positive load voltage: the drop exceeds the e.m.f. (the supply cannot carry this load)")
	}
	es := complex(vr, 0) + w
	rot := cmplx.Conj(es) / complex(cmplx.Abs(es), 0)
	return complex(vr, 0) * rot, i0 * rot, nil
}

// pfAngle returns the angle of a load current from its voltage for a power
// factor: −acos(pf) lagging, +acos(pf) leading.
func pfAngle(pf float64, leading bool) (float64, error) {
	if err := positive("power factor", pf); err != nil {
		return 0, err
	}
	if pf > 1 {
		return 0, errf("power factor %g is above 1", pf)
	}
	if leading {
		return math.Acos(pf), nil
	}
	return -math.Acos(pf), nil
}

// XRFromLoss returns a transformer's X/R from its load loss Pk at rated
// current, as a test report gives it: u_r = 100·Pk/S, u_x = √(u_z² − u_r²),
// X/R = u_x/u_r (common practice; the form of IEC 60909-0 for R_T).
func XRFromLoss(s, pctZ, pk float64) (float64, error) {
	if err := positive("rating", s); err != nil {
		return 0, err
	}
	if err := positive("load loss", pk); err != nil {
		return 0, err
	}
	ur := 100 * pk / s
	if ur >= pctZ {
		var f calc.Format
		return 0, errf("a load loss of %s is %s %% of the rating %s, not below the impedance voltage of %s %%: check the loss (W) and the rating (VA)",
			f.Mag(pk, calc.DimPower, calc.KindActive), sig(ur), f.Mag(s, calc.DimPower, calc.KindMagnitude), sig(pctZ))
	}
	return math.Sqrt((pctZ-ur)*(pctZ+ur)) / ur, nil
}

// RegResult is a transformer's secondary voltage under load.
type RegResult struct {
	Vload          calc.Quantity // secondary voltage phasor, the no-load voltage at 0° (line-to-line when three-phase)
	I              calc.Quantity // secondary current phasor on the same reference
	Reg            float64       // (V_noload − |V_load|)/V_noload, per cent
	Approx, Second float64       // first-order approximation and with the second-order term, per cent
	Steps          []calc.Step
}

// Regulation returns the fall of a transformer's secondary voltage from
// no load to a load of n times the rated current at a power factor, with
// the primary held at rated voltage: exactly, from the series equivalent
// circuit referred to the secondary (the magnetising branch, on the
// primary side, does not change the secondary voltage when the primary
// voltage is held), and by the usual approximation
// ε ≈ n·(u_r·cos φ + u_x·sin φ), with the second-order term
// n²·(u_x·cos φ − u_r·sin φ)²/200 beside it (common practice; both in per
// cent of the no-load voltage, φ > 0 lagging).
func Regulation(n Nameplate, load, pf float64, leading bool) (RegResult, error) {
	t, err := Transformer(n)
	if err != nil {
		return RegResult{}, err
	}
	if err := positive("load (per unit of rated current)", load); err != nil {
		return RegResult{}, err
	}
	if load > 10 {
		return RegResult{}, errf("a load of %g times the rated current is beyond any transformer's rating: give it per unit (0.75), in per cent (75 %%), in A or in VA", load)
	}
	phi, err := pfAngle(pf, leading)
	if err != nil {
		return RegResult{}, err
	}
	k := math.Sqrt(3)
	if n.SinglePhase {
		k = 1
	}
	e := n.V2 / k
	im := load * real(t.I2.V)
	v, i, err := loadVoltage(e, t.Z2.V, im, phi)
	if err != nil {
		return RegResult{}, err
	}
	th := zAngle(n.XR)
	ur, ux := n.PctZ*math.Cos(th), n.PctZ*math.Sin(th)
	c, s := pf, -math.Sin(phi) // s > 0 lagging
	a1 := load * (ur*c + ux*s)
	b1 := load * (ux*c - ur*s)
	r := RegResult{
		Vload:  cq(v*complex(k, 0), calc.DimVoltage),
		I:      cq(i, calc.DimCurrent),
		Reg:    dipPct(cmplx.Abs(v), e),
		Approx: a1,
		Second: a1 + b1*b1/200,
	}
	sense := "lagging"
	if leading {
		sense = "leading"
	}
	phase := "three-phase, per phase: E = V2/√3"
	if n.SinglePhase {
		phase = "single-phase: E = V2"
	}
	r.Steps = append(t.Steps[:1:1],
		calc.Step{
			Kind:    "regulation",
			Rule:    "secondary voltage under load from the equivalent circuit referred to the secondary, primary at rated voltage (" + phase + ")",
			Formula: "E = V_load + Z2·I,  I = n·I2 at −acos PF (lagging) or +acos PF (leading) from V_load;  ε = (E − |V_load|)/E",
			Inputs: []calc.Operand{op("E (no load, phase)", magq(e, calc.DimVoltage)), op("Z2", t.Z2), op("n", num(load)),
				op("I2 rated", magq(real(t.I2.V), calc.DimCurrent)), op("PF ("+sense+")", num(pf))},
			Results: []calc.Operand{op("V_load", r.Vload), op("I", r.I), op("regulation", pct(r.Reg))},
			Notes:   []string{"per cent of the no-load voltage; a positive value is a fall, a negative one a rise (as a leading load can give)"},
		},
		calc.Step{
			Kind:    "regulation",
			Rule:    "the usual approximation beside it, from the resistive and reactive parts of the impedance voltage (common practice)",
			Formula: "ε ≈ n·(u_r·cos φ + u_x·sin φ)  [+ n²·(u_x·cos φ − u_r·sin φ)²/200]",
			Inputs:  []calc.Operand{op("u_r", pct(ur)), op("u_x", pct(ux)), op("cos φ", num(c)), op("sin φ", num(s))},
			Results: []calc.Operand{op("first order", pct(r.Approx)), op("with the second-order term", pct(r.Second)),
				op("exact − first order (points)", pct(r.Reg-r.Approx))},
			Cautions: calc.CautionsOf(calc.CautionTransformer, calc.CautionMains),
		})
	if err := checkSteps(r.Steps); err != nil {
		return RegResult{}, err
	}
	return r, nil
}

// EffResult is a transformer's efficiency at a load and its maximum.
type EffResult struct {
	Eta          float64 // at the given load, per unit
	Pout, Losses calc.Quantity
	NMax         float64       // load of maximum efficiency, per unit of rating
	SMax         calc.Quantity // the same in VA
	EtaMax       float64       // the maximum efficiency at the given power factor
	Steps        []calc.Step
}

// Efficiency returns a transformer's efficiency at n times its rating and
// a power factor from its no-load loss P0 and its load loss Pk at rated
// current: η = n·S·PF/(n·S·PF + P0 + n²·Pk). The load losses grow as the
// square of the current and the no-load losses not at all, so η is
// greatest where the two are equal, at n = √(P0/Pk) (common practice).
func Efficiency(s, p0, pk, load, pf float64) (EffResult, error) {
	if err := positive("rating", s); err != nil {
		return EffResult{}, err
	}
	if err := positive("no-load loss", p0); err != nil {
		return EffResult{}, err
	}
	if err := positive("load loss", pk); err != nil {
		return EffResult{}, err
	}
	if p0+pk >= s {
		var f calc.Format
		return EffResult{}, errf("losses of %s at a rating of %s: check that the rating is in VA and the losses in W",
			f.Mag(p0+pk, calc.DimPower, calc.KindActive), f.Mag(s, calc.DimPower, calc.KindMagnitude))
	}
	if err := positive("load (per unit of rating)", load); err != nil {
		return EffResult{}, err
	}
	if load > 10 {
		return EffResult{}, errf("a load of %g times the rating is beyond any transformer's rating: give it per unit (0.75), in per cent (75 %%), in A or in VA", load)
	}
	if _, err := pfAngle(pf, false); err != nil {
		return EffResult{}, err
	}
	pout := load * s * pf
	loss := p0 + load*load*pk
	nmax := math.Sqrt(p0 / pk)
	pmax := nmax * s * pf
	r := EffResult{
		Eta:    pout / (pout + loss),
		Pout:   power(pout, calc.KindActive),
		Losses: power(loss, calc.KindActive),
		NMax:   nmax,
		SMax:   power(nmax*s, calc.KindApparent),
		EtaMax: pmax / (pmax + 2*p0),
	}
	r.Steps = []calc.Step{
		{
			Kind:    "efficiency",
			Rule:    "efficiency from the no-load loss and the load loss at rated current (common practice)",
			Formula: "η = n·S·PF/(n·S·PF + P0 + n²·Pk)",
			Inputs: []calc.Operand{op("S rated", power(s, calc.KindApparent)), op("P0", power(p0, calc.KindActive)), op("Pk", power(pk, calc.KindActive)),
				op("n", num(load)), op("PF", num(pf))},
			Results: []calc.Operand{op("η", num(r.Eta)), op("P out", r.Pout), op("losses", r.Losses)},
		},
		{
			Kind:    "efficiency",
			Rule:    "load of maximum efficiency: where the load loss equals the no-load loss (common practice)",
			Formula: "n_max = √(P0/Pk),  η_max = n_max·S·PF/(n_max·S·PF + 2·P0)",
			Inputs:  []calc.Operand{op("P0", power(p0, calc.KindActive)), op("Pk", power(pk, calc.KindActive))},
			Results: []calc.Operand{op("n_max", num(r.NMax)), op("|S| at n_max", r.SMax), op("η_max", num(r.EtaMax))},
			Notes:   []string{"losses at the reference temperature of the test report; the load loss grows with winding temperature"},
		},
	}
	if nmax > 1 {
		r.Steps[1].Notes = append(r.Steps[1].Notes, "the maximum lies above the rating: the unit is at its best efficiency only in overload")
	}
	if err := checkSteps(r.Steps); err != nil {
		return EffResult{}, err
	}
	return r, nil
}

// Unit is one of two transformers in parallel: its rating and impedance.
type Unit struct {
	S    float64 // VA
	PctZ float64 // per cent on its own rating
	XR   float64 // ≤ 0 for a pure reactance
}

// Parallel is two transformers sharing a load on a common secondary bus.
type Parallel struct {
	V2     float64 // rated secondary voltage, line-to-line (three-phase), V
	A, B   Unit
	Load   float64 // apparent power of the load at rated voltage, VA
	PF     float64
	Lead   bool
	DeltaV float64 // open-circuit secondary voltage of A above that of B, per cent of V2 (ratios that differ)
}

// ParallelResult is the sharing of a load.
type ParallelResult struct {
	SA, SB     calc.Quantity // complex power each unit delivers
	IA, IB, IL calc.Quantity // secondary currents, phasors with B's e.m.f. at 0°
	Ic         calc.Quantity // circulating current at no load, phasor
	Vbus       calc.Quantity // line-to-line
	PctA, PctB float64       // |S| of each unit as per cent of its rating
	ApproxA    float64       // the usual approximation of A's share, per cent of its rating
	ApproxB    float64
	Steps      []calc.Step
}

// ShareLoad returns how two three-phase transformers in parallel share a
// load: each is an e.m.f. behind its impedance, Z_k = (u_k/100)·V2²/S_k
// ∠ atan(X/R)_k referred to the secondary; B's e.m.f. is V2/√3 ∠0° and A's
// is (1 + ΔV/100) times it when the ratios differ. The bus is the
// Thevenin equivalent E_th = (E_A·Z_B + E_B·Z_A)/(Z_A + Z_B),
// Z_th = Z_A‖Z_B feeding the load current |I_L| = S_L/(√3·V2) at its power
// factor from the bus voltage, and I_k = (E_k − V_bus)/Z_k. The circulating
// current is I_c = (E_A − E_B)/(Z_A + Z_B). The usual approximation beside
// it shares the load in inverse proportion to the ohmic impedance
// magnitudes, S_A/S_B = (S_rA/u_A)/(S_rB/u_B), and ignores the ratio
// difference (common practice).
func ShareLoad(p Parallel) (ParallelResult, error) {
	if err := positive("V2", p.V2); err != nil {
		return ParallelResult{}, err
	}
	zs := [2]complex128{}
	for k, u := range []Unit{p.A, p.B} {
		name := [2]string{"A", "B"}[k]
		if err := positive("rating of "+name, u.S); err != nil {
			return ParallelResult{}, err
		}
		if err := positive("%Z of "+name, u.PctZ); err != nil {
			return ParallelResult{}, err
		}
		if u.PctZ >= 100 {
			return ParallelResult{}, errf("%%Z of %s of %g is not a transformer impedance (it must be below 100 %%)", name, u.PctZ)
		}
		if err := finite([]string{"X/R of " + name}, u.XR); err != nil {
			return ParallelResult{}, err
		}
		zs[k] = cmplx.Rect(u.PctZ/100*p.V2*p.V2/u.S, zAngle(u.XR))
	}
	if err := positive("load", p.Load); err != nil {
		return ParallelResult{}, err
	}
	if err := finite([]string{"ratio difference"}, p.DeltaV); err != nil {
		return ParallelResult{}, err
	}
	if math.Abs(p.DeltaV) >= 20 {
		return ParallelResult{}, errf("a ratio difference of %g %% is far beyond what may be paralleled: give it in per cent of V2", p.DeltaV)
	}
	phi, err := pfAngle(p.PF, p.Lead)
	if err != nil {
		return ParallelResult{}, err
	}
	za, zb := zs[0], zs[1]
	e := p.V2 / math.Sqrt(3)
	eb := complex(e, 0)
	ea := eb * complex(1+p.DeltaV/100, 0)
	eth := (ea*zb + eb*za) / (za + zb)
	zth := za * zb / (za + zb)
	il := p.Load / (math.Sqrt(3) * p.V2)
	v, i, err := loadVoltage(cmplx.Abs(eth), zth, il, phi)
	if err != nil {
		return ParallelResult{}, err
	}
	turn := eth / complex(cmplx.Abs(eth), 0)
	v, i = v*turn, i*turn
	ia := (ea - v) / za
	ib := (eb - v) / zb
	ic := (ea - eb) / (za + zb)
	sa := 3 * v * cmplx.Conj(ia)
	sb := 3 * v * cmplx.Conj(ib)
	ya, yb := p.A.S/p.A.PctZ, p.B.S/p.B.PctZ
	r := ParallelResult{
		SA:      cq(sa, calc.DimPower),
		SB:      cq(sb, calc.DimPower),
		IA:      cq(ia, calc.DimCurrent),
		IB:      cq(ib, calc.DimCurrent),
		IL:      cq(i, calc.DimCurrent),
		Ic:      cq(ic, calc.DimCurrent),
		Vbus:    cq(v*complex(math.Sqrt(3), 0), calc.DimVoltage),
		PctA:    cmplx.Abs(sa) / p.A.S * 100,
		PctB:    cmplx.Abs(sb) / p.B.S * 100,
		ApproxA: p.Load * ya / (ya + yb) / p.A.S * 100,
		ApproxB: p.Load * yb / (ya + yb) / p.B.S * 100,
	}
	r.SA.Kind, r.SB.Kind = calc.KindApparent, calc.KindApparent
	sense := "lagging"
	if p.Lead {
		sense = "leading"
	}
	notes := []string{"three-phase, per phase; the load is a current |I_L| = S_L/(√3·V2) at its power factor from the bus voltage",
		"the e.m.f.s are in phase: the vector groups must have the same clock number (IEC 60076-1)"}
	if p.DeltaV != 0 {
		notes = append(notes, "the circulating current flows at no load too and adds to one unit's load and takes from the other's")
	}
	r.Steps = []calc.Step{
		{
			Kind:    "parallel",
			Rule:    "each unit's impedance referred to the secondary from its own rating",
			Formula: "Z_k = (u_k/100)·V2²/S_k ∠ atan(X/R)_k",
			Inputs: []calc.Operand{op("V2", magq(p.V2, calc.DimVoltage)), op("S_A", power(p.A.S, calc.KindApparent)), op("u_A", pct(p.A.PctZ)),
				op("X/R A", num(p.A.XR)), op("S_B", power(p.B.S, calc.KindApparent)), op("u_B", pct(p.B.PctZ)), op("X/R B", num(p.B.XR))},
			Results: []calc.Operand{op("Z_A", cq(za, calc.DimImpedance)), op("Z_B", cq(zb, calc.DimImpedance))},
		},
		{
			Kind:    "parallel",
			Rule:    "the two units as e.m.f.s behind their impedances feeding one bus, solved as a network (B's e.m.f. at 0°)",
			Formula: "E_A = (1 + ΔV/100)·E_B;  V_bus = E_th − Z_th·I_L;  I_k = (E_k − V_bus)/Z_k;  S_k = 3·V_bus·I_k*;  I_c = (E_A − E_B)/(Z_A + Z_B)",
			Inputs: []calc.Operand{op("E_B (phase)", magq(e, calc.DimVoltage)), op("ΔV", pct(p.DeltaV)), op("S_L", power(p.Load, calc.KindApparent)),
				op("PF ("+sense+")", num(p.PF))},
			Results: []calc.Operand{op("S_A", r.SA), op("S_B", r.SB), op("load of A", pct(r.PctA)), op("load of B", pct(r.PctB)),
				op("I_A", r.IA), op("I_B", r.IB), op("I_L", r.IL), op("I_c (no load)", r.Ic), op("V_bus", r.Vbus)},
			Notes: notes,
		},
		{
			Kind:     "parallel",
			Rule:     "the usual approximation beside it: shares in inverse proportion to |Z|, ratios equal (common practice)",
			Formula:  "S_A ≈ S_L·(S_rA/u_A)/(S_rA/u_A + S_rB/u_B)",
			Results:  []calc.Operand{op("load of A (approx)", pct(r.ApproxA)), op("load of B (approx)", pct(r.ApproxB))},
			Cautions: calc.CautionsOf(calc.CautionTransformer, calc.CautionMains),
		},
	}
	if err := checkSteps(r.Steps); err != nil {
		return ParallelResult{}, err
	}
	return r, nil
}

// VectorShift turns a phasor across a transformer of vector-group clock
// number h: the LV phasor lags the HV phasor by h·30° (IEC 60076-1), so
// from HV to LV the phasor turns by −h·30° and from LV to HV by +h·30°.
// The clock is defined for the positive sequence of an ABC system;
// negative-sequence quantities, or positive-sequence ones in an ACB
// system, turn the other way. A voltage ratio V_HV/V_LV (line-to-line,
// rated) scales a voltage by 1/ratio and a current by ratio towards LV
// when given (> 0).
func VectorShift(x calc.Quantity, clock int, toLV, negative bool, seq int, ratio float64) (calc.Quantity, calc.Step, error) {
	if clock < 0 || clock > 11 {
		return calc.Quantity{}, calc.Step{}, errf("clock number %d is not one of 0 to 11", clock)
	}
	if x.Dim != calc.DimVoltage && x.Dim != calc.DimCurrent {
		return calc.Quantity{}, calc.Step{}, errf("a vector group turns a voltage or a current phasor, not %s (an impedance or a power keeps its angle: use refer)", calc.QuantityWord(x))
	}
	if err := finiteC("value", x.V); err != nil {
		return calc.Quantity{}, calc.Step{}, err
	}
	if err := finite([]string{"ratio"}, ratio); err != nil {
		return calc.Quantity{}, calc.Step{}, err
	}
	if ratio < 0 {
		return calc.Quantity{}, calc.Step{}, errf("the voltage ratio must be positive (got %g)", ratio)
	}
	sign := -1.0 // HV → LV: lag
	if !toLV {
		sign = 1
	}
	rev := negative != (seq < 0)
	if rev {
		sign = -sign
	}
	d := sign * 30 * float64(clock)
	scale := 1.0
	formula := "x' = x·∠(−h·30°) HV to LV, x·∠(+h·30°) LV to HV"
	if ratio > 0 {
		switch {
		case x.Dim == calc.DimVoltage && toLV, x.Dim == calc.DimCurrent && !toLV:
			scale = 1 / ratio
		default:
			scale = ratio
		}
		formula += ",  V' = V/a, I' = I·a towards LV (a = V_HV/V_LV)"
	}
	turn := complex(scale, 0) * clockTurn(int(d/30))
	r, err := calc.Quantity{V: x.V * turn, Dim: x.Dim, Kind: x.Kind}.Check("vector group")
	if err != nil {
		return calc.Quantity{}, calc.Step{}, err
	}
	dir := "HV to LV"
	if !toLV {
		dir = "LV to HV"
	}
	notes := []string{"zero-sequence quantities do not pass a delta winding and follow the winding connections, not the clock"}
	if rev {
		notes = append(notes, "negative sequence (or an ACB system): the phasor turns the other way, by "+sig(d)+"°")
	}
	inputs := []calc.Operand{op("x", x), op("clock h", num(float64(clock)))}
	if ratio > 0 {
		inputs = append(inputs, op("a = V_HV/V_LV", num(ratio)))
	}
	st := calc.Step{
		Kind:    "vectorgroup",
		Rule:    "referred " + dir + " across vector-group clock " + sig(float64(clock)) + ": the LV phasor lags the HV phasor by h·30° (IEC 60076-1)",
		Formula: formula,
		Inputs:  inputs,
		Results: []calc.Operand{op("x'", r), op("turned by", angle(rad(d)))},
		Notes:   notes, Cautions: calc.CautionsOf(calc.CautionTransformer),
	}
	return r, st, nil
}

// clockTurn returns 1∠(k·30°) with the parts that are 0, ±½ or ±1 exact,
// so that a turn by 90° or 180° leaves no rounding residue.
func clockTurn(k int) complex128 {
	k = ((k % 12) + 12) % 12
	h := math.Sqrt(3) / 2
	c := [12]float64{1, h, 0.5, 0, -0.5, -h, -1, -h, -0.5, 0, 0.5, h}
	return complex(c[k], c[(k+9)%12])
}
