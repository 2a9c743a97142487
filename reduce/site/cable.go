package site

import (
	"math"
	"math/cmplx"

	"argand/calc"
)

// Cable is a run of cable feeding a load.
type Cable struct {
	R, X       float64 // resistance and reactance per metre of one conductor, Ω/m, at the operating temperature
	Length     float64 // route length, m
	ThreePhase bool    // three-phase balanced: voltages are line-to-line; otherwise single-phase go and return
	Vs         float64 // sending-end voltage magnitude, V (line-to-line when three-phase)
	Vnom       float64 // nominal voltage for the % drop, V; 0 means Vs
	I          float64 // load current, A (line current when three-phase)
	PF         float64 // load power factor, 0 < PF ≤ 1
	Leading    bool    // the load current leads (capacitive); otherwise it lags
}

// CableResult is the voltage at the load end of a cable run.
type CableResult struct {
	Zloop   calc.Quantity // impedance in the current path: 2·(R + jX)·L single-phase, (R + jX)·L per phase three-phase
	Vload   calc.Quantity // load voltage phasor with the sending voltage at 0° (line-to-line when three-phase)
	Drop    calc.Quantity // |Vs| − |Vload|, V
	DropPct float64       // Drop as % of the nominal voltage
	Approx  calc.Quantity // I·(R·cos φ + X·sin φ)·L·k, k = 2 single-phase, √3 three-phase
	Diff    calc.Quantity // Drop − Approx
	Steps   []calc.Step
}

// Operands lists the results by name.
func (r *CableResult) Operands() []calc.Operand {
	return []calc.Operand{op("vload", r.Vload), op("drop", r.Drop), op("drop_pct", num(r.DropPct)),
		op("approx", r.Approx), op("diff", r.Diff), op("zloop", r.Zloop)}
}

// CableDrop returns the voltage at the load end of a cable run, exactly
// from the phasor equation Vs = Vload + Z·I per phase, with the load current
// at angle −φ (lagging) or +φ (leading) from the load voltage, and beside it
// the usual approximation ΔV ≈ k·I·(R·cos φ + X·sin φ)·L.
//
// With Vload on the real axis and w = Z·I, |Vload + w| = |Vs| gives
// |Vload| = −Re w + √(|Vs|² − (Im w)²); when |Vs| < |Im w| no load voltage
// exists and CableDrop reports that the run cannot carry the load.
func CableDrop(c Cable) (CableResult, error) {
	if err := finite([]string{"R per metre", "X per metre"}, c.R, c.X); err != nil {
		return CableResult{}, err
	}
	if c.R < 0 || c.X < 0 {
		return CableResult{}, errf("cable R and X per metre must not be negative")
	}
	for _, p := range []struct {
		n string
		x float64
	}{{"length", c.Length}, {"sending voltage", c.Vs}, {"load current", c.I}, {"power factor", c.PF}} {
		if err := positive(p.n, p.x); err != nil {
			return CableResult{}, err
		}
	}
	if c.PF > 1 {
		return CableResult{}, errf("power factor %g is above 1", c.PF)
	}
	vnom := c.Vnom
	if vnom == 0 {
		vnom = c.Vs
	}
	if err := positive("nominal voltage", vnom); err != nil {
		return CableResult{}, err
	}
	k, vph, path := 2.0, c.Vs, "single-phase: go and return, loop impedance 2·(R + jX)·L"
	if c.ThreePhase {
		k, vph, path = math.Sqrt(3), c.Vs/math.Sqrt(3), "three-phase balanced: per phase (R + jX)·L, line voltages √3 times phase voltages"
	}
	zc := complex(c.R, c.X) * complex(c.Length, 0)
	if !c.ThreePhase {
		zc *= 2
	}
	sinphi := math.Sqrt((1 - c.PF) * (1 + c.PF))
	if c.Leading {
		sinphi = -sinphi
	}
	iph := complex(c.I*c.PF, -c.I*sinphi) // current relative to the load voltage
	w := zc * iph
	disc := vph*vph - imag(w)*imag(w)
	if disc < 0 {
		return CableResult{}, errf("no load voltage exists: the cable's drop across its reactance exceeds the sending voltage (the run cannot carry this load)")
	}
	vr := -real(w) + math.Sqrt(disc)
	if vr <= 0 {
		return CableResult{}, errf("no positive load voltage: the cable's drop exceeds the sending voltage (the run cannot carry this load)")
	}
	// Rotate so that the sending voltage is the 0° reference.
	vsPh := complex(vr, 0) + w
	rot := cmplx.Conj(vsPh) / complex(cmplx.Abs(vsPh), 0)
	vload := complex(vr, 0) * rot
	vloadLine := vload
	if c.ThreePhase {
		vloadLine = vload * complex(math.Sqrt(3), 0)
	}
	drop := c.Vs - cmplx.Abs(vloadLine)
	approx := k * c.I * (c.R*c.PF + c.X*sinphi) * c.Length
	res := CableResult{
		Zloop:   cq(zc, calc.DimImpedance),
		Vload:   cq(vloadLine, calc.DimVoltage),
		Drop:    kq(drop, calc.DimVoltage, calc.KindSigned),
		DropPct: drop / vnom * 100,
		Approx:  kq(approx, calc.DimVoltage, calc.KindSigned),
		Diff:    kq(drop-approx, calc.DimVoltage, calc.KindSigned),
	}
	perM := calc.Dim{calc.BaseVolt: 1, calc.BaseAmpere: -1, calc.BaseMetre: -1}
	pf := "lagging"
	if c.Leading {
		pf = "leading"
	}
	inputs := []calc.Operand{op("R'", rq(c.R, perM)), op("X'", rq(c.X, perM)), op("L", rq(c.Length, calc.DimLength)),
		op("Vs", rq(c.Vs, calc.DimVoltage)), op("I", rq(c.I, calc.DimCurrent)), op("pf ("+pf+")", num(c.PF))}
	res.Steps = []calc.Step{
		{
			Kind:    "cable",
			Rule:    "cable impedance in the current path, " + path,
			Formula: "Z = k_z·(R' + jX')·L",
			Inputs:  inputs,
			Results: []calc.Operand{op("Z", res.Zloop)},
		},
		{
			Kind:    "cable",
			Rule:    "exact load voltage from the phasor equation, load voltage on the real axis, then turned so the sending voltage is at 0°",
			Formula: "Vs = Vload + Z·I,  |Vload| = −Re(Z·I) + √(|Vs|² − Im(Z·I)²)",
			Inputs:  []calc.Operand{op("Vs (phase)", rq(vph, calc.DimVoltage)), op("I", cq(iph, calc.DimCurrent)), op("Z", res.Zloop)},
			Results: []calc.Operand{op("Vload", res.Vload), op("drop", res.Drop), op("drop %", num(res.DropPct))},
			Notes:   []string{"drop = |Vs| − |Vload|; % of the nominal " + sig(vnom) + " V"},
		},
		{
			Kind:     "cable",
			Rule:     "the usual approximation beside the exact drop",
			Formula:  "ΔV ≈ k·I·(R'·cos φ + X'·sin φ)·L, k = 2 single-phase, √3 three-phase",
			Inputs:   []calc.Operand{op("k", num(k)), op("cos φ", num(c.PF)), op("sin φ", num(sinphi))},
			Results:  []calc.Operand{op("approx", res.Approx), op("exact − approx", res.Diff)},
			Cautions: calc.CautionsOf(calc.CautionCable, calc.CautionMains),
		},
	}
	if err := checkSteps(res.Steps); err != nil {
		return CableResult{}, err
	}
	return res, nil
}

// Conductor is a conductor material with its resistance temperature
// coefficient at 20 °C.
type Conductor struct {
	Name    string
	Alpha20 float64 // per kelvin
}

// Conductor materials. IEC 60228 / IEC 60287-1-1 give α20 = 3.93e-3 /K for
// copper and 4.03e-3 /K for aluminium (from memory).
var (
	Copper    = Conductor{"copper", 3.93e-3}
	Aluminium = Conductor{"aluminium", 4.03e-3}
)

// RTemp returns the resistance at temperature t2 (°C) of a conductor whose
// resistance is r1 at t1 (°C), from the linear law R(T) = R20·(1 +
// α20·(T − 20)): R2 = R1·(1 + α20·(T2 − 20))/(1 + α20·(T1 − 20)), which is
// R1·(1 + α20·(T2 − T1)) when T1 = 20 °C. r1 may be a resistance or a
// resistance per length.
func RTemp(r1 calc.Quantity, t1, t2 float64, m Conductor) (calc.Quantity, calc.Step, error) {
	if !r1.IsReal() || real(r1.V) <= 0 {
		return calc.Quantity{}, calc.Step{}, errf("a conductor resistance is a positive real value")
	}
	if err := finite([]string{"resistance", "T1", "T2"}, real(r1.V), t1, t2); err != nil {
		return calc.Quantity{}, calc.Step{}, err
	}
	d1, d2 := 1+m.Alpha20*(t1-20), 1+m.Alpha20*(t2-20)
	if d1 <= 0 || d2 <= 0 {
		return calc.Quantity{}, calc.Step{}, errf("temperature below the range of the linear law (%s: above %.4g °C)", m.Name, 20-1/m.Alpha20)
	}
	r2 := calc.Quantity{V: complex(real(r1.V)*d2/d1, 0), Dim: r1.Dim, Kind: r1.Kind}
	st := calc.Step{
		Kind:    "rtemp",
		Rule:    "conductor resistance at another temperature, " + m.Name + " α20 = " + sig(m.Alpha20) + " /K",
		Formula: "R2 = R1·(1 + α20·(T2 − 20))/(1 + α20·(T1 − 20))  (= R1·(1 + α20·(T2 − T1)) for T1 = 20 °C)",
		Inputs:  []calc.Operand{op("R1", r1), op("T1 (°C)", num(t1)), op("T2 (°C)", num(t2)), op("α20 (/K)", num(m.Alpha20))},
		Results: []calc.Operand{op("R2", r2)},
		Notes:   []string{"α20 per IEC 60228 / IEC 60287-1-1 (3.93e-3 /K copper, 4.03e-3 /K aluminium), from memory"},
	}
	return r2, st, nil
}
