package site

import (
	"math"
	"math/cmplx"
	"strconv"

	"argand/calc"
)

// PUBase is a set of per-unit bases for a three-phase system: S_base (VA,
// three-phase) and V_base (V, line-to-line) give Z_base = V²/S and
// I_base = S/(√3·V).
type PUBase struct {
	S, V, Z, I calc.Quantity
	Step       calc.Step
}

// Bases returns the per-unit bases for a three-phase S_base and a
// line-to-line V_base.
func Bases(s, v float64) (PUBase, error) {
	if err := positive("S_base", s); err != nil {
		return PUBase{}, err
	}
	if err := positive("V_base", v); err != nil {
		return PUBase{}, err
	}
	b := PUBase{
		S: power(s, calc.KindApparent),
		V: rq(v, calc.DimVoltage),
		Z: kq(v*v/s, calc.DimImpedance, calc.KindMagnitude),
		I: rq(s/(math.Sqrt(3)*v), calc.DimCurrent),
	}
	b.Step = calc.Step{
		Kind:    "perunit",
		Rule:    "per-unit bases, three-phase S and line-to-line V (common practice)",
		Formula: "Z_base = V_base²/S_base, I_base = S_base/(√3·V_base)",
		Inputs:  []calc.Operand{op("S_base", b.S), op("V_base", b.V)},
		Results: []calc.Operand{op("Z_base", b.Z), op("I_base", b.I)},
	}
	return b, nil
}

// Rebase converts a per-unit impedance from one base to another:
// Z_new = Z_old·(V_old/V_new)²·(S_new/S_old) (common practice).
func Rebase(zpu complex128, sOld, vOld, sNew, vNew float64) (calc.Quantity, calc.Step, error) {
	if err := finiteC("Z (pu)", zpu); err != nil {
		return calc.Quantity{}, calc.Step{}, err
	}
	for _, p := range []struct {
		n string
		x float64
	}{{"S_old", sOld}, {"V_old", vOld}, {"S_new", sNew}, {"V_new", vNew}} {
		if err := positive(p.n, p.x); err != nil {
			return calc.Quantity{}, calc.Step{}, err
		}
	}
	r := vOld / vNew
	k := r * r * (sNew / sOld)
	z, err := calc.Number(zpu * complex(k, 0)).Check("base change")
	if err != nil {
		return calc.Quantity{}, calc.Step{}, err
	}
	st := calc.Step{
		Kind:    "perunit",
		Rule:    "change of per-unit base (common practice)",
		Formula: "Z_new = Z_old·(V_old/V_new)²·(S_new/S_old)",
		Inputs: []calc.Operand{op("Z_old", calc.Number(zpu)), op("S_old", power(sOld, calc.KindApparent)), op("V_old", rq(vOld, calc.DimVoltage)),
			op("S_new", power(sNew, calc.KindApparent)), op("V_new", rq(vNew, calc.DimVoltage))},
		Results: []calc.Operand{op("Z_new", z)},
	}
	return z, st, nil
}

// SectionKind says what a section of a radial system is.
type SectionKind uint8

const (
	SourceSection SectionKind = iota
	TransformerSection
	LineSection
	LoadSection
	// SeriesSection is a series impedance whose nature was not given (a
	// per-unit value or an impedance in Ω typed into a chain): it may be a
	// transformer, a line or a reactor, so it is not called any of them.
	SeriesSection
)

var sectionWords = [...]string{"source", "transformer", "line", "load", "series element"}

func (k SectionKind) String() string {
	if int(k) < len(sectionWords) {
		return sectionWords[k]
	}
	return "section"
}

// Section is one series element of a radial three-phase system, in order
// from the source towards the far end.
type Section struct {
	Name string
	Kind SectionKind
	// Z is the impedance: per unit on the section's own rating (SRated,
	// VRated) when PU is set, otherwise Ω per phase at the section's
	// voltage level.
	Z      complex128
	PU     bool
	SRated float64 // VA
	VRated float64 // V; for a transformer, the rated voltage of the side facing the source
	// A source may be given by its fault level (VA) and X/R instead of Z.
	FaultVA, XR float64
	// A transformer's rated voltages, source side V1 and far side V2: the
	// voltage base beyond it is scaled by V2/V1.
	V1, V2 float64
}

// Radial is a radial system solved in per unit.
type Radial struct {
	SBase    float64 // VA, three-phase
	VBase    float64 // V line-to-line at the source
	E        float64 // source voltage in pu; 0 means 1 pu
	Fault    bool    // a bolted three-phase fault at the far end; any load section is left out
	Sections []Section
}

// RadialResult gives each section's impedance on the system base and the
// current and voltages along the chain.
type RadialResult struct {
	Zpu   []calc.Quantity // each section on the system base
	Ztot  calc.Quantity   // pu
	Ipu   calc.Quantity   // the chain current, pu
	Steps []calc.Step     // the last step carries one row per section
}

// maxSections bounds a radial system.
const maxSections = 1000

// SolveRadial solves a radial chain (source, transformers, lines, load) in
// per unit: each section's impedance is put on the system base — a
// transformer by the base change from its rating, a line or load in Ω by
// Z/Z_base of its voltage zone, a source from its fault level as
// S_base/S_sc — the series sum gives the current I = E/ΣZ, and the voltage
// after each section is E − I·(the impedances up to it). Values in amperes
// and volts use the bases of each zone; the voltage base is scaled by
// V2/V1 across each transformer. With Fault set, the far end is shorted.
func SolveRadial(sys Radial) (RadialResult, error) {
	if len(sys.Sections) == 0 {
		return RadialResult{}, errf("a radial system needs at least one section")
	}
	if len(sys.Sections) > maxSections {
		return RadialResult{}, errf("too many sections (at most %d)", maxSections)
	}
	base, err := Bases(sys.SBase, sys.VBase)
	if err != nil {
		return RadialResult{}, err
	}
	e := sys.E
	if e == 0 {
		e = 1
	}
	if err := positive("E", e); err != nil {
		return RadialResult{}, err
	}
	steps := []calc.Step{base.Step}
	vb := sys.VBase
	var zs []complex128
	var zones []float64
	var used []Section
	for i, s := range sys.Sections {
		if s.Kind == LoadSection && sys.Fault {
			continue
		}
		name := s.Name
		if name == "" {
			name = s.Kind.String() + " " + strconv.Itoa(i+1)
		}
		var z complex128
		st := calc.Step{Kind: "perunit", Rule: name + " (" + s.Kind.String() + ") on the system base"}
		switch {
		case s.Kind == SourceSection && s.FaultVA > 0:
			if err := finite([]string{name + " fault level", name + " X/R"}, s.FaultVA, s.XR); err != nil {
				return RadialResult{}, err
			}
			z = cmplx.Rect(sys.SBase/s.FaultVA, zAngle(s.XR))
			st.Formula = "Z = (S_base/S_sc) ∠ atan(X/R)"
			st.Inputs = []calc.Operand{op("S_sc", power(s.FaultVA, calc.KindApparent)), op("X/R", num(s.XR))}
		case s.PU:
			vr := s.VRated
			if s.Kind == TransformerSection && vr == 0 {
				vr = s.V1
			}
			zz, rs, err := Rebase(s.Z, s.SRated, vr, sys.SBase, vb)
			if err != nil {
				return RadialResult{}, errf("%s: %v", name, err)
			}
			z = zz.V
			st.Formula = rs.Formula
			st.Inputs = rs.Inputs
		default:
			if err := finiteC(name+" Z", s.Z); err != nil {
				return RadialResult{}, err
			}
			zb := vb * vb / sys.SBase
			z = s.Z / complex(zb, 0)
			st.Formula = "Z_pu = Z/Z_base, Z_base = V_base²/S_base"
			st.Inputs = []calc.Operand{op("Z", cq(s.Z, calc.DimImpedance)), op("Z_base", kq(zb, calc.DimImpedance, calc.KindMagnitude))}
		}
		if s.Kind == TransformerSection {
			if err := positive(name+" V1", s.V1); err != nil {
				return RadialResult{}, err
			}
			if err := positive(name+" V2", s.V2); err != nil {
				return RadialResult{}, err
			}
			vb = vb * s.V2 / s.V1
			st.Notes = append(st.Notes, "the voltage base beyond is V_base·V2/V1 = "+sig(vb)+" V")
		}
		st.Results = []calc.Operand{op("Z_pu", calc.Number(z))}
		steps = append(steps, st)
		zs = append(zs, z)
		zones = append(zones, vb)
		used = append(used, s)
	}
	var ztot complex128
	for _, z := range zs {
		ztot += z
	}
	if ztot == 0 {
		return RadialResult{}, errf("the total impedance is zero: the current is unbounded")
	}
	ipu := complex(e, 0) / ztot
	r := RadialResult{Ztot: calc.Number(ztot), Ipu: calc.Number(ipu)}
	what := "current with the load at the far end"
	if sys.Fault {
		what = "bolted three-phase fault at the far end"
	}
	chain := calc.Step{
		Kind:    "perunit",
		Rule:    "series chain solved in per unit: " + what,
		Formula: "I = E/ΣZ, V_k = E − I·(Z_1 + … + Z_k); actual I = I_pu·S_base/(√3·V_base), V = V_pu·V_base of each zone",
		Inputs:  []calc.Operand{op("E", calc.Number(complex(e, 0))), op("ΣZ", r.Ztot)},
		Results: []calc.Operand{op("I_pu", r.Ipu)},
	}
	acc := complex(0, 0)
	for i, z := range zs {
		acc += z
		v := complex(e, 0) - ipu*acc
		if cmplx.Abs(v) < 1e-12*e {
			v = 0 // rounding noise at a bolted fault
		}
		ib := sys.SBase / (math.Sqrt(3) * zones[i])
		r.Zpu = append(r.Zpu, calc.Number(z))
		name := used[i].Name
		if name == "" {
			name = used[i].Kind.String()
		}
		chain.Rows = append(chain.Rows, calc.Row{Name: name, Values: []calc.Operand{
			op("z_pu", calc.Number(z)),
			op("i", cq(ipu*complex(ib, 0), calc.DimCurrent)),
			op("v_pu", calc.Number(v)),
			op("v", cq(v*complex(zones[i], 0), calc.DimVoltage)),
		}})
	}
	chain.Results = append(chain.Results, op("I (far zone)", cq(ipu*complex(sys.SBase/(math.Sqrt(3)*zones[len(zones)-1]), 0), calc.DimCurrent)))
	chain.Notes = []string{"voltages and currents of a transformer row are given in the zone beyond it; v is line-to-line"}
	chain.Cautions = calc.CautionsOf(calc.CautionFault, calc.CautionMains)
	steps = append(steps, chain)
	r.Steps = steps
	if err := checkSteps(steps); err != nil {
		return RadialResult{}, err
	}
	for _, row := range chain.Rows {
		if err := checkOps(row.Values); err != nil {
			return RadialResult{}, err
		}
	}
	return r, nil
}
