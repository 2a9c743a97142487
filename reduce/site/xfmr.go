package site

import (
	"math"
	"math/cmplx"

	"argand/calc"
)

// Refer moves a quantity across an ideal transformer of turns ratio
// a = N1/N2 (= V1/V2): to the primary an impedance is multiplied by a², a
// voltage by a and a current divided by a; to the secondary the inverse.
// An admittance goes as 1/a²; a power is unchanged.
func Refer(q calc.Quantity, a float64, toPrimary bool) (calc.Quantity, calc.Step, error) {
	if err := positive("turns ratio", a); err != nil {
		return calc.Quantity{}, calc.Step{}, err
	}
	if err := finiteC("value", q.V); err != nil {
		return calc.Quantity{}, calc.Step{}, err
	}
	k := a
	if !toPrimary {
		k = 1 / a
	}
	var f float64
	var formula string
	switch q.Dim {
	case calc.DimImpedance:
		f, formula = k*k, "Z' = a²·Z"
	case calc.DimAdmittance:
		f, formula = 1/(k*k), "Y' = Y/a²"
	case calc.DimVoltage:
		f, formula = k, "V' = a·V"
	case calc.DimCurrent:
		f, formula = 1/k, "I' = I/a"
	case calc.DimPower:
		f, formula = 1, "S' = S"
	default:
		return calc.Quantity{}, calc.Step{}, errf("only an impedance, admittance, voltage, current or power is referred across a transformer, not %s", calc.DimName(q.Dim, false))
	}
	r, err := calc.Quantity{V: q.V * complex(f, 0), Dim: q.Dim, Kind: q.Kind}.Check("referral")
	if err != nil {
		return calc.Quantity{}, calc.Step{}, err
	}
	side := "to the primary, a = N1/N2"
	if !toPrimary {
		side = "to the secondary, with a = N2/N1 (the ratio inverted)"
	}
	st := calc.Step{
		Kind:    "refer",
		Rule:    "referral across an ideal transformer " + side,
		Formula: formula,
		Inputs:  []calc.Operand{op("x", q), op("N1/N2", num(a))},
		Results: []calc.Operand{op("x'", r)},
	}
	return r, st, nil
}

// Nameplate is a transformer's rating plate.
type Nameplate struct {
	S           float64 // rated apparent power, VA (three-phase total unless SinglePhase)
	V1, V2      float64 // rated voltages, V (line-to-line unless SinglePhase)
	PctZ        float64 // impedance voltage, per cent
	XR          float64 // X/R ratio; ≤ 0 when not given, then Z is taken as a pure reactance
	SinglePhase bool
}

// XfmrResult is a transformer's impedance and ratings.
type XfmrResult struct {
	Ratio          calc.Quantity // V1/V2
	Zbase1, Zbase2 calc.Quantity // V²/S on each side
	Z1, Z2         calc.Quantity // per-phase impedance referred to each side
	I1, I2         calc.Quantity // rated currents
	Isc1, Isc2     calc.Quantity // prospective fault current at the terminals of each side, infinite bus
	Steps          []calc.Step
}

// Operands lists the results by name.
func (r *XfmrResult) Operands() []calc.Operand {
	return []calc.Operand{op("isc2", r.Isc2), op("z1", r.Z1), op("z2", r.Z2), op("zbase1", r.Zbase1), op("zbase2", r.Zbase2),
		op("i1", r.I1), op("i2", r.I2), op("isc1", r.Isc1), op("ratio", r.Ratio)}
}

func (n Nameplate) check() error {
	for _, p := range []struct {
		n string
		x float64
	}{{"rating", n.S}, {"V1", n.V1}, {"V2", n.V2}, {"%Z", n.PctZ}} {
		if err := positive(p.n, p.x); err != nil {
			return err
		}
	}
	if n.PctZ >= 100 {
		return errf("%%Z of %g is not a transformer impedance (it must be below 100 %%)", n.PctZ)
	}
	return finite([]string{"X/R"}, n.XR)
}

// zAngle returns the impedance angle from X/R; X/R ≤ 0 means not given.
func zAngle(xr float64) float64 {
	if xr <= 0 {
		return math.Pi / 2
	}
	return math.Atan(xr)
}

// Transformer returns the impedance of a transformer on either side from
// its nameplate: Z_base = V²/S, Z = (%Z/100)·Z_base at angle atan(X/R),
// and the prospective short-circuit current at its terminals fed from an
// infinite bus, I_sc = I_rated/(%Z/100) (common practice).
func Transformer(n Nameplate) (XfmrResult, error) {
	if err := n.check(); err != nil {
		return XfmrResult{}, err
	}
	th := zAngle(n.XR)
	pu := n.PctZ / 100
	zb1, zb2 := n.V1*n.V1/n.S, n.V2*n.V2/n.S
	k := math.Sqrt(3)
	if n.SinglePhase {
		k = 1
	}
	i1, i2 := n.S/(k*n.V1), n.S/(k*n.V2)
	r := XfmrResult{
		Ratio:  num(n.V1 / n.V2),
		Zbase1: kq(zb1, calc.DimImpedance, calc.KindMagnitude),
		Zbase2: kq(zb2, calc.DimImpedance, calc.KindMagnitude),
		Z1:     cq(cmplx.Rect(pu*zb1, th), calc.DimImpedance),
		Z2:     cq(cmplx.Rect(pu*zb2, th), calc.DimImpedance),
		I1:     rq(i1, calc.DimCurrent),
		I2:     rq(i2, calc.DimCurrent),
		Isc1:   rq(i1/pu, calc.DimCurrent),
		Isc2:   rq(i2/pu, calc.DimCurrent),
	}
	phase := "three-phase: S total, V line-to-line, Z per phase (star equivalent), I = S/(√3·V)"
	if n.SinglePhase {
		phase = "single-phase: I = S/V"
	}
	notes := []string{}
	if n.XR <= 0 {
		notes = append(notes, "X/R not given: the impedance is taken as a pure reactance")
	}
	r.Steps = []calc.Step{
		{
			Kind:    "xfmr",
			Rule:    "transformer impedance from the nameplate, " + phase,
			Formula: "Z_base = V²/S, Z = (%Z/100)·Z_base ∠ atan(X/R)",
			Inputs: []calc.Operand{op("S", power(n.S, calc.KindMagnitude)), op("V1", rq(n.V1, calc.DimVoltage)), op("V2", rq(n.V2, calc.DimVoltage)),
				op("%Z", pct(n.PctZ)), op("X/R", num(n.XR))},
			Results: []calc.Operand{op("Z1", r.Z1), op("Z2", r.Z2), op("Zbase1", r.Zbase1), op("Zbase2", r.Zbase2), op("ratio", r.Ratio)},
			Notes:   notes,
		},
		{
			Kind:    "fault",
			Rule:    "rated currents, and the prospective fault current at the terminals from an infinite bus (common practice)",
			Formula: "I_sc = I_rated/(%Z/100)",
			Inputs:  []calc.Operand{op("I1 rated", r.I1), op("I2 rated", r.I2), op("%Z", pct(n.PctZ))},
			Results: []calc.Operand{op("Isc2", r.Isc2), op("Isc1", r.Isc1)},
			Notes:   []string{"no voltage factor applied (c = 1); an infinite bus gives the highest current the transformer alone allows"}, Cautions: calc.CautionsOf(calc.CautionFault, calc.CautionMains),
		},
	}
	if err := checkSteps(r.Steps); err != nil {
		return XfmrResult{}, err
	}
	return r, nil
}

// Fault describes a bolted fault on the secondary side of a transformer,
// at its terminals and, when a cable is given, at the end of the cable.
type Fault struct {
	Xfmr Nameplate
	// The supply at the primary: either its fault level SourceVA (VA, with
	// X/R SourceXR, ≤ 0 for a pure reactance), or an impedance SourceZ per
	// phase in Ω on the primary side. Neither given is an infinite bus.
	SourceVA float64
	SourceXR float64
	SourceZ  complex128
	// Cable from the secondary terminals to the fault: Ω/m per conductor
	// and route length in m; a zero length puts the fault at the terminals.
	CableR, CableX, CableLength float64
}

// FaultResult holds the impedances on the secondary side and the fault
// currents.
type FaultResult struct {
	Zsource, Zxfmr, Zcable, Ztotal calc.Quantity // Ω, secondary side
	IscInfinite                    calc.Quantity // at the terminals, infinite bus
	IscTerminals                   calc.Quantity // at the terminals, with the source
	IscEnd                         calc.Quantity // at the cable end (the terminals when there is no cable)
	Steps                          []calc.Step
}

// Operands lists the results by name.
func (r *FaultResult) Operands() []calc.Operand {
	return []calc.Operand{op("isc_end", r.IscEnd), op("isc_terminals", r.IscTerminals), op("isc_infinite", r.IscInfinite),
		op("zsource", r.Zsource), op("zxfmr", r.Zxfmr), op("zcable", r.Zcable), op("ztotal", r.Ztotal)}
}

// FaultLevel returns the prospective symmetrical fault current on the
// secondary side of a transformer: the source impedance (V1²/S_sc at
// atan(X/R), or as given) referred to the secondary by 1/a², plus the
// transformer impedance, plus the cable — per phase, (R + jX)·L, for a
// three-phase fault, or the loop 2·(R + jX)·L for a single-phase
// transformer — and I = V2/(√3·|Z|) (three-phase) or V2/|Z| (single-phase),
// with no voltage factor (c = 1).
func FaultLevel(f Fault) (FaultResult, error) {
	t, err := Transformer(f.Xfmr)
	if err != nil {
		return FaultResult{}, err
	}
	n := f.Xfmr
	if err := finite([]string{"source fault level", "source X/R", "cable R", "cable X", "cable length"},
		f.SourceVA, f.SourceXR, f.CableR, f.CableX, f.CableLength); err != nil {
		return FaultResult{}, err
	}
	if err := finiteC("source impedance", f.SourceZ); err != nil {
		return FaultResult{}, err
	}
	if f.SourceVA < 0 || f.CableR < 0 || f.CableX < 0 || f.CableLength < 0 || real(f.SourceZ) < 0 {
		return FaultResult{}, errf("fault level, cable values and source resistance must not be negative")
	}
	a := n.V1 / n.V2
	var zs1 complex128
	var srcNotes []string
	src := "infinite bus (no source impedance)"
	switch {
	case f.SourceVA > 0:
		if f.SourceXR <= 0 {
			srcNotes = append(srcNotes, "the source fault level is taken as a pure reactance (X/R infinite) and c = 1; "+
				"for the IEC 60909-0 method with R_Q/X_Q and the voltage factor c use zfeeder and ik3")
		}
		zs1 = cmplx.Rect(n.V1*n.V1/f.SourceVA, zAngle(f.SourceXR))
		src = "source from its fault level: Zs = V1²/S_sc ∠ atan(X/R)"
		if n.SinglePhase {
			src = "source from its fault level: Zs = V1²/S_sc ∠ atan(X/R) (single-phase)"
		}
	case f.SourceZ != 0:
		zs1 = f.SourceZ
		src = "source impedance as given, on the primary side"
	}
	zs2 := zs1 / complex(a*a, 0)
	zt := t.Z2.V
	zc := complex(f.CableR, f.CableX) * complex(f.CableLength, 0)
	cablePath := "per phase (R + jX)·L for a three-phase symmetrical fault"
	k := math.Sqrt(3)
	if n.SinglePhase {
		zc *= 2
		cablePath = "loop 2·(R + jX)·L, single-phase"
		k = 1
	}
	zterm := zs2 + zt
	ztot := zterm + zc
	if ztot == 0 || zterm == 0 {
		return FaultResult{}, errf("zero fault impedance: the fault current is unbounded")
	}
	r := FaultResult{
		Zsource:      cq(zs2, calc.DimImpedance),
		Zxfmr:        cq(zt, calc.DimImpedance),
		Zcable:       cq(zc, calc.DimImpedance),
		Ztotal:       cq(ztot, calc.DimImpedance),
		IscInfinite:  t.Isc2,
		IscTerminals: rq(n.V2/(k*cmplx.Abs(zterm)), calc.DimCurrent),
		IscEnd:       rq(n.V2/(k*cmplx.Abs(ztot)), calc.DimCurrent),
	}
	vform := "I = V2/(√3·|Z|)"
	if n.SinglePhase {
		vform = "I = V2/|Z|"
	}
	r.Steps = append(t.Steps,
		calc.Step{
			Kind:    "fault",
			Rule:    "impedances on the secondary side: " + src + ", referred by 1/a²; transformer; cable " + cablePath,
			Formula: "Z = Zs/a² + Zt + Zc,  a = V1/V2",
			Inputs:  []calc.Operand{op("Zs (primary)", cq(zs1, calc.DimImpedance)), op("a", num(a)), op("Zt", r.Zxfmr), op("Zc", r.Zcable)},
			Results: []calc.Operand{op("Zs (secondary)", r.Zsource), op("Z total", r.Ztotal)},
			Notes:   srcNotes,
		},
		calc.Step{
			Kind:     "fault",
			Rule:     "prospective symmetrical fault current at the terminals and at the cable end, voltage factor c = 1",
			Formula:  vform,
			Inputs:   []calc.Operand{op("V2", rq(n.V2, calc.DimVoltage)), op("Z terminals", cq(zterm, calc.DimImpedance)), op("Z end", r.Ztotal)},
			Results:  []calc.Operand{op("Isc end", r.IscEnd), op("Isc terminals", r.IscTerminals), op("Isc infinite bus", r.IscInfinite)},
			Cautions: calc.CautionsOf(calc.CautionFault, calc.CautionMains),
		})
	if err := checkSteps(r.Steps); err != nil {
		return FaultResult{}, err
	}
	return r, nil
}

// ToPrimary returns the primary value of an instrument transformer (CT or
// VT) from a secondary reading: x·(primary/secondary), for ratings such as
// 200/5 A or 11000/110 V. An ideal transformer keeps the angle; ratio and
// phase errors of the accuracy class are not included.
func ToPrimary(reading calc.Quantity, primary, secondary float64) (calc.Quantity, calc.Step, error) {
	return ratio(reading, primary, secondary, true)
}

// ToSecondary returns the secondary value for a primary value: the inverse
// of ToPrimary.
func ToSecondary(value calc.Quantity, primary, secondary float64) (calc.Quantity, calc.Step, error) {
	return ratio(value, primary, secondary, false)
}

func ratio(x calc.Quantity, p, s float64, up bool) (calc.Quantity, calc.Step, error) {
	if err := positive("primary rating", p); err != nil {
		return calc.Quantity{}, calc.Step{}, err
	}
	if err := positive("secondary rating", s); err != nil {
		return calc.Quantity{}, calc.Step{}, err
	}
	if x.Dim != calc.DimCurrent && x.Dim != calc.DimVoltage {
		return calc.Quantity{}, calc.Step{}, errf("a CT or VT ratio applies to a current or a voltage, not %s", calc.DimName(x.Dim, false))
	}
	k, formula, rule := p/s, "x_primary = x_secondary·(primary/secondary)", "primary value from a secondary reading"
	if !up {
		k, formula, rule = s/p, "x_secondary = x_primary·(secondary/primary)", "secondary value from a primary value"
	}
	r, err := calc.Quantity{V: x.V * complex(k, 0), Dim: x.Dim, Kind: x.Kind}.Check("ratio")
	if err != nil {
		return calc.Quantity{}, calc.Step{}, err
	}
	what := "CT"
	if x.Dim == calc.DimVoltage {
		what = "VT"
	}
	st := calc.Step{
		Kind:    "ratio",
		Rule:    what + " " + rule + ", ideal ratio " + sig(p) + "/" + sig(s),
		Formula: formula,
		Inputs:  []calc.Operand{op("x", x), op("primary", rq(p, x.Dim)), op("secondary", rq(s, x.Dim))},
		Results: []calc.Operand{op("result", r)},
		Notes:   []string{"ratio and phase errors of the accuracy class are not included"},
	}
	if what == "CT" {
		st.Cautions = calc.CautionsOf(calc.CautionCT, calc.CautionMains)
	}
	return r, st, nil
}
