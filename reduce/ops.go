package reduce

import (
	"errors"
	"fmt"
	"math"
	"math/cmplx"
	"strconv"
	"strings"

	"argand/calc"
)

// The operations in this file take their operands as calc.Operand so that
// every step can name what it combined. An operand with an empty name is
// shown as Z1, Z2, ... (or Y1, V, I, ... as fits the operation), numbered by
// position.
//
// Every operation checks dimensions first: impedances are in Ω, admittances
// in S, voltages in V and currents in A. A wrong dimension is an error that
// names the operand and what was expected. No operation returns NaN or an
// infinity: where the arithmetic has no finite answer the error says why.

// ErrIdealVoltageSource reports a Thevenin form with Z = 0: an ideal voltage
// source has no Norton form, since its short-circuit current is unbounded.
var ErrIdealVoltageSource = errors.New("an ideal voltage source (Z = 0) has no Norton form: its short-circuit current would be unbounded")

// ErrIdealCurrentSource reports a Norton form with Y = 0 (Z infinite): an
// ideal current source has no Thevenin form, since its open-circuit voltage
// is unbounded.
var ErrIdealCurrentSource = errors.New("an ideal current source (Y = 0, Z infinite) has no Thevenin form: its open-circuit voltage would be unbounded")

// cancelTol is the relative size, per term, below which a sum of
// impedances or admittances counts as cancelled. Rounding in a sum of n
// terms is about n·ε of the largest term; a few ε more keeps results that
// are pure rounding noise from passing as huge finite values.
const cancelTol = 4 * 2.220446049250313e-16

// cancelled reports whether sum is rounding noise compared with the terms
// it was made of (largest magnitude max, n terms).
func cancelled(sum complex128, max float64, n int) bool {
	return sum == 0 || cmplx.Abs(sum) <= cancelTol*float64(n)*max
}

// checked turns a complex value into a quantity of dimension d, or an error
// when it is NaN or infinite.
func checked(v complex128, d calc.Dim, op string) (calc.Quantity, error) {
	return calc.Quantity{V: v, Dim: d}.Check(op)
}

// combined is checked for the result of a series or parallel group: a
// group of resistances (or conductances) alone is a resistance, shown like
// R1 + R2 without an angle; any complex part makes it an impedance.
func combined(v complex128, d calc.Dim, op string, parts []calc.Operand) (calc.Quantity, error) {
	q, err := checked(v, d, op)
	if err != nil || imag(v) != 0 {
		return q, err
	}
	for _, o := range parts {
		if o.Value.Kind != calc.KindResistive {
			return q, nil
		}
	}
	q.Kind = calc.KindResistive
	return q, nil
}

func power(v complex128, op string) (calc.Quantity, error) {
	return calc.Quantity{V: v, Dim: calc.DimPower, Kind: calc.KindApparent}.Check(op)
}

// named returns the operands with empty names filled in as prefix1,
// prefix2, ... by position.
func named(ops []calc.Operand, prefix string) []calc.Operand {
	out := make([]calc.Operand, len(ops))
	for i, o := range ops {
		if o.Name == "" {
			o.Name = prefix + strconv.Itoa(i+1)
		}
		out[i] = o
	}
	return out
}

func nameOr(o calc.Operand, def string) calc.Operand {
	if o.Name == "" {
		o.Name = def
	}
	return o
}

// wantDim returns an error unless o has dimension d.
func wantDim(op string, o calc.Operand, d calc.Dim) error {
	if o.Value.Dim != d {
		return fmt.Errorf("%s: %s is %s, but %s is needed", op, o.Name, calc.DimWord(o.Value.Dim), calc.DimWord(d))
	}
	return nil
}

// sameDim checks that every operand is an impedance, or every operand is
// an admittance, and returns which.
func sameDim(op string, ops []calc.Operand) (calc.Dim, error) {
	if len(ops) == 0 {
		return calc.Dim{}, fmt.Errorf("%s: no operands", op)
	}
	d := ops[0].Value.Dim
	if d != calc.DimImpedance && d != calc.DimAdmittance {
		return d, fmt.Errorf("%s: %s is %s, but an impedance (Ω) or an admittance (S) is needed", op, ops[0].Name, calc.DimWord(d))
	}
	for _, o := range ops[1:] {
		if o.Value.Dim != d {
			return d, fmt.Errorf("%s: %s is %s but %s is %s; give all of them in Ω or all in S", op, ops[0].Name, calc.DimWord(d), o.Name, calc.DimWord(o.Value.Dim))
		}
	}
	return d, nil
}

func joinNames(ops []calc.Operand, sep string) string {
	names := make([]string, len(ops))
	for i, o := range ops {
		names[i] = o.Name
	}
	return strings.Join(names, sep)
}

// sumMax returns Σv and the largest |v|.
func sumMax(ops []calc.Operand) (complex128, float64) {
	var s complex128
	var m float64
	for _, o := range ops {
		s += o.Value.V
		m = math.Max(m, cmplx.Abs(o.Value.V))
	}
	return s, m
}

// Series returns the equivalent of impedances (Ω) in series, Z = ΣZ_k, or
// of admittances (S) in series, Y = 1/Σ(1/Y_k). A zero admittance is an
// open circuit and makes the whole string open (Y = 0).
func Series(parts ...calc.Operand) (calc.Quantity, []calc.Step, error) {
	return series("Z", parts)
}

func series(result string, parts []calc.Operand) (calc.Quantity, []calc.Step, error) {
	const op = "series"
	if len(parts) == 0 {
		return calc.Quantity{}, nil, errors.New("series: no impedances given")
	}
	d, err := sameDim(op, parts)
	if err != nil {
		return calc.Quantity{}, nil, err
	}
	step := calc.Step{Kind: "series"}
	if d == calc.DimImpedance {
		parts = named(parts, "Z")
		s, m := sumMax(parts)
		if len(parts) > 1 && m > 0 && cancelled(s, m, len(parts)) {
			// a resonant string: what is left of the sum is rounding noise
			s = 0
			step.Notes = append(step.Notes, "series resonance: the impedances sum to 0 Ω, so the string is a short")
		}
		q, err := combined(s, d, op, parts)
		if err != nil {
			return calc.Quantity{}, nil, err
		}
		step.Rule = "series: the impedances add"
		step.Formula = result + " = " + joinNames(parts, " + ")
		step.Inputs = parts
		step.Results = []calc.Operand{{Name: result, Value: q}}
		return q, []calc.Step{step}, nil
	}
	parts = named(parts, "Y")
	if result == "Z" {
		result = "Y"
	}
	step.Rule = "series of admittances: the reciprocals add"
	step.Formula = result + " = 1/(1/" + joinNames(parts, " + 1/") + ")"
	step.Inputs = parts
	var zs complex128
	for _, o := range parts {
		if o.Value.V == 0 {
			step.Notes = append(step.Notes, o.Name+" is 0 S, an open circuit, so no current flows in the string")
			q := calc.Quantity{Dim: d}
			step.Results = []calc.Operand{{Name: result, Value: q}}
			return q, []calc.Step{step}, nil
		}
		zs += 1 / o.Value.V
	}
	if zs == 0 {
		return calc.Quantity{}, nil, errors.New("series resonance: the string's impedances sum to 0, so its admittance is infinite (a short)")
	}
	q, err := combined(1/zs, d, op, parts)
	if err != nil {
		return calc.Quantity{}, nil, err
	}
	step.Results = []calc.Operand{{Name: result, Value: q}}
	return q, []calc.Step{step}, nil
}

// Parallel returns the equivalent of impedances (Ω) in parallel: for two,
// product over sum, Z = Z₁·Z₂/(Z₁+Z₂); for more, the admittances add,
// Z = 1/Σ(1/Z_k). Admittances (S) in parallel simply add.
//
// A 0 Ω branch shorts the group: the result is 0 Ω and the step says so.
// Branches whose admittances cancel (parallel resonance) make an open
// circuit: the error wraps calc.ErrOpenCircuit, so errors.Is(err,
// calc.ErrOpenCircuit) tells it from other failures.
func Parallel(parts ...calc.Operand) (calc.Quantity, []calc.Step, error) {
	return parallel("Z", parts)
}

func parallel(result string, parts []calc.Operand) (calc.Quantity, []calc.Step, error) {
	const op = "parallel"
	if len(parts) == 0 {
		return calc.Quantity{}, nil, errors.New("parallel: no impedances given")
	}
	d, err := sameDim(op, parts)
	if err != nil {
		return calc.Quantity{}, nil, err
	}
	step := calc.Step{Kind: "parallel"}
	if d == calc.DimAdmittance {
		parts = named(parts, "Y")
		if result == "Z" {
			result = "Y"
		}
		s, _ := sumMax(parts)
		q, err := combined(s, d, op, parts)
		if err != nil {
			return calc.Quantity{}, nil, err
		}
		step.Rule = "parallel: the admittances add"
		step.Formula = result + " = " + joinNames(parts, " + ")
		step.Inputs = parts
		step.Results = []calc.Operand{{Name: result, Value: q}}
		return q, []calc.Step{step}, nil
	}
	parts = named(parts, "Z")
	step.Inputs = parts
	for _, o := range parts {
		if o.Value.V == 0 {
			step.Rule = "parallel with a short: a 0 Ω branch shorts the whole group"
			step.Formula = result + " = 0"
			step.Notes = append(step.Notes, o.Name+" is 0 Ω (a short), so the group is a short and the other branches carry no current")
			q := calc.Quantity{Dim: d}
			step.Results = []calc.Operand{{Name: result, Value: q}}
			return q, []calc.Step{step}, nil
		}
	}
	var z complex128
	if len(parts) == 2 {
		a, b := parts[0].Value.V, parts[1].Value.V
		s := a + b
		if cancelled(s, math.Max(cmplx.Abs(a), cmplx.Abs(b)), 2) {
			return calc.Quantity{}, nil, openError(parts)
		}
		step.Rule = "parallel of two: product over sum"
		step.Formula = fmt.Sprintf("%s = %s·%s/(%s + %s)", result, parts[0].Name, parts[1].Name, parts[0].Name, parts[1].Name)
		z = a * b / s
		if cmplx.IsInf(z) || cmplx.IsNaN(z) {
			// the product overflowed; the admittance form does not
			z = 1 / (1/a + 1/b)
		}
	} else {
		var ys complex128
		var m float64
		for _, o := range parts {
			y := 1 / o.Value.V
			ys += y
			m = math.Max(m, cmplx.Abs(y))
		}
		if cancelled(ys, m, len(parts)) {
			return calc.Quantity{}, nil, openError(parts)
		}
		step.Rule = "parallel: the admittances add"
		step.Formula = result + " = 1/(1/" + joinNames(parts, " + 1/") + ")"
		z = 1 / ys
	}
	q, err := combined(z, d, op, parts)
	if err != nil {
		return calc.Quantity{}, nil, err
	}
	step.Results = []calc.Operand{{Name: result, Value: q}}
	return q, []calc.Step{step}, nil
}

func openError(parts []calc.Operand) error {
	return fmt.Errorf("parallel %s: %w", joinNames(parts, " ‖ "), calc.ErrOpenCircuit)
}

// ToAdmittance returns Y = 1/Z for an impedance in Ω. A 0 Ω short has no
// finite admittance and is an error.
func ToAdmittance(z calc.Operand) (calc.Quantity, []calc.Step, error) {
	z = nameOr(z, "Z")
	if err := wantDim("admittance", z, calc.DimImpedance); err != nil {
		return calc.Quantity{}, nil, err
	}
	if z.Value.V == 0 {
		return calc.Quantity{}, nil, fmt.Errorf("admittance: %s is 0 Ω, a short, whose admittance is infinite", z.Name)
	}
	q, err := checked(1/z.Value.V, calc.DimAdmittance, "admittance")
	if err != nil {
		return calc.Quantity{}, nil, err
	}
	return q, []calc.Step{{
		Kind: "admittance", Rule: "admittance is the reciprocal of impedance", Formula: "Y = 1/" + z.Name,
		Inputs: []calc.Operand{z}, Results: []calc.Operand{{Name: "Y", Value: q}},
	}}, nil
}

// ToImpedance returns Z = 1/Y for an admittance in S. A 0 S open circuit
// has no finite impedance and is an error.
func ToImpedance(y calc.Operand) (calc.Quantity, []calc.Step, error) {
	y = nameOr(y, "Y")
	if err := wantDim("impedance", y, calc.DimAdmittance); err != nil {
		return calc.Quantity{}, nil, err
	}
	if y.Value.V == 0 {
		return calc.Quantity{}, nil, fmt.Errorf("impedance: %s is 0 S, an open circuit, whose impedance is infinite", y.Name)
	}
	q, err := checked(1/y.Value.V, calc.DimImpedance, "impedance")
	if err != nil {
		return calc.Quantity{}, nil, err
	}
	return q, []calc.Step{{
		Kind: "admittance", Rule: "impedance is the reciprocal of admittance", Formula: "Z = 1/" + y.Name,
		Inputs: []calc.Operand{y}, Results: []calc.Operand{{Name: "Z", Value: q}},
	}}, nil
}

// VoltageDivider returns the voltage across zk, one impedance of a series
// string zk, rest... fed by v: V_k = V·Z_k/ΣZ. A string whose impedances
// sum to 0 (series resonance) is an error saying so.
func VoltageDivider(v, zk calc.Operand, rest ...calc.Operand) (calc.Quantity, []calc.Step, error) {
	const op = "voltage divider"
	v = nameOr(v, "V")
	if err := wantDim(op, v, calc.DimVoltage); err != nil {
		return calc.Quantity{}, nil, err
	}
	all := named(append([]calc.Operand{zk}, rest...), "Z")
	for _, o := range all {
		if err := wantDim(op, o, calc.DimImpedance); err != nil {
			return calc.Quantity{}, nil, err
		}
	}
	s, m := sumMax(all)
	if cancelled(s, m, len(all)) {
		return calc.Quantity{}, nil, errors.New("series resonance: the string's impedances sum to 0, so its current is unbounded")
	}
	q, err := checked(v.Value.V*(all[0].Value.V/s), calc.DimVoltage, op)
	if err != nil {
		return calc.Quantity{}, nil, err
	}
	name := "V(" + all[0].Name + ")"
	return q, []calc.Step{{
		Kind: "divider", Rule: "voltage divider: the voltage splits in proportion to the impedances",
		Formula: name + " = " + v.Name + "·" + all[0].Name + "/(" + joinNames(all, " + ") + ")",
		Inputs:  append([]calc.Operand{v}, all...),
		Results: []calc.Operand{{Name: name, Value: q}},
	}}, nil
}

// CurrentDivider returns the current in branch k of a parallel group fed
// by i: I_k = I·Y_k/ΣY. The branches are given either all as impedances (Ω)
// or all as admittances (S); the first is branch k.
//
// A 0 Ω branch takes the whole current and leaves the others none; two or
// more 0 Ω branches split it in a way the circuit does not determine, which
// is an error. Admittances that sum to 0 (parallel resonance: an open
// circuit fed by a current) are an error wrapping calc.ErrOpenCircuit.
func CurrentDivider(i, branch calc.Operand, others ...calc.Operand) (calc.Quantity, []calc.Step, error) {
	const op = "current divider"
	i = nameOr(i, "I")
	if err := wantDim(op, i, calc.DimCurrent); err != nil {
		return calc.Quantity{}, nil, err
	}
	all := append([]calc.Operand{branch}, others...)
	d, err := sameDim(op, all)
	if err != nil {
		return calc.Quantity{}, nil, err
	}
	prefix := "Z"
	if d == calc.DimAdmittance {
		prefix = "Y"
	}
	all = named(all, prefix)
	name := "I(" + all[0].Name + ")"
	step := calc.Step{Kind: "current-divider", Inputs: append([]calc.Operand{i}, all...)}
	var ys []complex128
	if d == calc.DimImpedance {
		var shorts []string
		for _, o := range all {
			if o.Value.V == 0 {
				shorts = append(shorts, o.Name)
			}
		}
		switch {
		case len(shorts) > 1:
			return calc.Quantity{}, nil, fmt.Errorf("current divider: %s are all 0 Ω shorts in parallel; how the current splits between them is not determined", strings.Join(shorts, ", "))
		case len(shorts) == 1:
			q := calc.Quantity{Dim: calc.DimCurrent}
			step.Rule = "current divider with a short: a 0 Ω branch takes the whole current"
			if all[0].Value.V == 0 {
				q = calc.Quantity{V: i.Value.V, Dim: calc.DimCurrent}
				step.Formula = name + " = " + i.Name
			} else {
				step.Formula = name + " = 0"
			}
			step.Notes = []string{shorts[0] + " is 0 Ω (a short) and carries the whole current"}
			step.Results = []calc.Operand{{Name: name, Value: q}}
			return q, []calc.Step{step}, nil
		}
		for _, o := range all {
			ys = append(ys, 1/o.Value.V)
		}
		step.Formula = name + " = " + i.Name + "·(1/" + all[0].Name + ")/(1/" + joinNames(all, " + 1/") + ")"
	} else {
		for _, o := range all {
			ys = append(ys, o.Value.V)
		}
		step.Formula = name + " = " + i.Name + "·" + all[0].Name + "/(" + joinNames(all, " + ") + ")"
	}
	var s complex128
	var m float64
	for _, y := range ys {
		s += y
		m = math.Max(m, cmplx.Abs(y))
	}
	if cancelled(s, m, len(ys)) {
		return calc.Quantity{}, nil, fmt.Errorf("current divider: the parallel admittances sum to 0 (parallel resonance): %w", calc.ErrOpenCircuit)
	}
	q, err := checked(i.Value.V*(ys[0]/s), calc.DimCurrent, op)
	if err != nil {
		return calc.Quantity{}, nil, err
	}
	step.Rule = "current divider: the current splits in proportion to the admittances"
	step.Results = []calc.Operand{{Name: name, Value: q}}
	return q, []calc.Step{step}, nil
}

// Equivalent is a two-terminal source equivalent in both forms: Thevenin
// (V in series with Z) and Norton (I in parallel with Y = 1/Z).
// An ideal voltage source (Z = 0) has only the Thevenin form and an ideal
// current source (Y = 0) only the Norton form; NoNorton and NoThevenin say
// so, and the missing fields are zero.
type Equivalent struct {
	V          calc.Quantity // open-circuit (Thevenin) voltage, V
	Z          calc.Quantity // equivalent impedance, Ω
	I          calc.Quantity // short-circuit (Norton) current, A
	Y          calc.Quantity // equivalent admittance, S
	NoNorton   bool          // ideal voltage source: Z = 0
	NoThevenin bool          // ideal current source: Y = 0
}

// Thevenin returns the Thevenin equivalent, seen across zshunt, of a source
// v feeding a series impedance zseries and a shunt impedance zshunt:
// V_th = V·Z₂/(Z₁+Z₂), Z_th = Z₁‖Z₂ = Z₁·Z₂/(Z₁+Z₂), and the Norton
// current I_N = V_th/Z_th = V/Z₁ where Z_th ≠ 0. With Z₁ = 0 or Z₂ = 0 the
// equivalent is an ideal voltage source and NoNorton is set.
func Thevenin(v, zseries, zshunt calc.Operand) (Equivalent, []calc.Step, error) {
	const op = "Thevenin"
	v, z1, z2 := nameOr(v, "V"), nameOr(zseries, "Z1"), nameOr(zshunt, "Z2")
	if err := wantDim(op, v, calc.DimVoltage); err != nil {
		return Equivalent{}, nil, err
	}
	for _, z := range []calc.Operand{z1, z2} {
		if err := wantDim(op, z, calc.DimImpedance); err != nil {
			return Equivalent{}, nil, err
		}
	}
	a, b := z1.Value.V, z2.Value.V
	s := a + b
	if cancelled(s, math.Max(cmplx.Abs(a), cmplx.Abs(b)), 2) {
		return Equivalent{}, nil, fmt.Errorf("series resonance: %s + %s sum to 0, so the source is shorted and the Thevenin voltage is undefined", z1.Name, z2.Name)
	}
	vth, err := checked(v.Value.V*(b/s), calc.DimVoltage, op)
	if err != nil {
		return Equivalent{}, nil, err
	}
	zth, err := checked(a*(b/s), calc.DimImpedance, op)
	if err != nil {
		return Equivalent{}, nil, err
	}
	eq := Equivalent{V: vth, Z: zth, Y: calc.Quantity{Dim: calc.DimAdmittance}, I: calc.Quantity{Dim: calc.DimCurrent}}
	steps := []calc.Step{
		{Kind: "thevenin", Rule: "Thevenin voltage: the open-circuit voltage across the shunt, by the voltage divider",
			Formula: "V_th = " + v.Name + "·" + z2.Name + "/(" + z1.Name + " + " + z2.Name + ")",
			Inputs:  []calc.Operand{v, z1, z2}, Results: []calc.Operand{{Name: "V_th", Value: vth}}},
		{Kind: "thevenin", Rule: "Thevenin impedance: the source set to zero (shorted), the two impedances are in parallel",
			Formula: "Z_th = " + z1.Name + "·" + z2.Name + "/(" + z1.Name + " + " + z2.Name + ")",
			Inputs:  []calc.Operand{z1, z2}, Results: []calc.Operand{{Name: "Z_th", Value: zth}}},
	}
	if zth.V == 0 {
		eq.NoNorton = true
		steps[1].Notes = []string{"Z_th = 0: the equivalent is an ideal voltage source, which has no Norton form"}
		return eq, steps, nil
	}
	in, err := checked(v.Value.V/a, calc.DimCurrent, op)
	if err != nil {
		return Equivalent{}, nil, err
	}
	y, err := checked(1/zth.V, calc.DimAdmittance, op)
	if err != nil {
		return Equivalent{}, nil, err
	}
	eq.I, eq.Y = in, y
	steps = append(steps, calc.Step{Kind: "norton",
		Rule:    "Norton current: the short-circuit current, which flows through the series impedance alone",
		Formula: "I_N = V_th/Z_th = " + v.Name + "/" + z1.Name,
		Inputs:  []calc.Operand{v, z1}, Results: []calc.Operand{{Name: "I_N", Value: in}, {Name: "Y_N", Value: y}}})
	return eq, steps, nil
}

// TheveninToNorton converts a Thevenin form (vth in series with zth) to
// the Norton form: I_N = V_th/Z_th, Y_N = 1/Z_th. zth may be given in Ω or
// as an admittance in S. Z = 0 is an ideal voltage source with no Norton
// form: the error wraps ErrIdealVoltageSource.
func TheveninToNorton(vth, zth calc.Operand) (Equivalent, []calc.Step, error) {
	const op = "Norton"
	vth, zth = nameOr(vth, "V_th"), nameOr(zth, "Z_th")
	if err := wantDim(op, vth, calc.DimVoltage); err != nil {
		return Equivalent{}, nil, err
	}
	var z, y complex128
	switch zth.Value.Dim {
	case calc.DimImpedance:
		if zth.Value.V == 0 {
			return Equivalent{}, nil, fmt.Errorf("Norton: %s is 0 Ω: %w", zth.Name, ErrIdealVoltageSource)
		}
		z, y = zth.Value.V, 1/zth.Value.V
	case calc.DimAdmittance:
		if zth.Value.V == 0 {
			return Equivalent{}, nil, fmt.Errorf("Norton: %s is 0 S, an open circuit in series with the source, which then has no Thevenin form to convert", zth.Name)
		}
		z, y = 1/zth.Value.V, zth.Value.V
	default:
		return Equivalent{}, nil, fmt.Errorf("Norton: %s is %s, but an impedance (Ω) or an admittance (S) is needed", zth.Name, calc.DimWord(zth.Value.Dim))
	}
	in, err := checked(vth.Value.V*y, calc.DimCurrent, op)
	if err != nil {
		return Equivalent{}, nil, err
	}
	zq, err := checked(z, calc.DimImpedance, op)
	if err != nil {
		return Equivalent{}, nil, err
	}
	yq, err := checked(y, calc.DimAdmittance, op)
	if err != nil {
		return Equivalent{}, nil, err
	}
	formula := "I_N = " + vth.Name + "/" + zth.Name + ", Y_N = 1/" + zth.Name
	if zth.Value.Dim == calc.DimAdmittance {
		formula = "I_N = " + vth.Name + "·" + zth.Name + ", Y_N = " + zth.Name
	}
	return Equivalent{V: vth.Value, Z: zq, I: in, Y: yq}, []calc.Step{{Kind: "norton",
		Rule:    "Thevenin to Norton: the short-circuit current in parallel with the same impedance",
		Formula: formula, Inputs: []calc.Operand{vth, zth},
		Results: []calc.Operand{{Name: "I_N", Value: in}, {Name: "Y_N", Value: yq}, {Name: "Z_N", Value: zq}}}}, nil
}

// NortonToThevenin converts a Norton form (in in parallel with y) to the
// Thevenin form: V_th = I_N/Y_N = I_N·Z_N. y may be an admittance in S or
// an impedance in Ω. Y = 0 (Z infinite) is an ideal current source with no
// Thevenin form: the error wraps ErrIdealCurrentSource. A 0 Ω shunt shorts
// the current source, which then is a 0 V Thevenin source with Z = 0.
func NortonToThevenin(in, y calc.Operand) (Equivalent, []calc.Step, error) {
	const op = "Thevenin"
	in, y = nameOr(in, "I_N"), nameOr(y, "Y_N")
	if err := wantDim(op, in, calc.DimCurrent); err != nil {
		return Equivalent{}, nil, err
	}
	var z complex128
	var yv complex128
	formula := "V_th = " + in.Name + "/" + y.Name + ", Z_th = 1/" + y.Name
	switch y.Value.Dim {
	case calc.DimAdmittance:
		if y.Value.V == 0 {
			return Equivalent{}, nil, fmt.Errorf("Thevenin: %s is 0 S: %w", y.Name, ErrIdealCurrentSource)
		}
		z, yv = 1/y.Value.V, y.Value.V
	case calc.DimImpedance:
		z = y.Value.V
		if z != 0 {
			yv = 1 / z
		}
		formula = "V_th = " + in.Name + "·" + y.Name + ", Z_th = " + y.Name
	default:
		return Equivalent{}, nil, fmt.Errorf("Thevenin: %s is %s, but an admittance (S) or an impedance (Ω) is needed", y.Name, calc.DimWord(y.Value.Dim))
	}
	v, err := checked(in.Value.V*z, calc.DimVoltage, op)
	if err != nil {
		return Equivalent{}, nil, err
	}
	zq, err := checked(z, calc.DimImpedance, op)
	if err != nil {
		return Equivalent{}, nil, err
	}
	yq, err := checked(yv, calc.DimAdmittance, op)
	if err != nil {
		return Equivalent{}, nil, err
	}
	step := calc.Step{Kind: "thevenin",
		Rule:    "Norton to Thevenin: the open-circuit voltage in series with the same impedance",
		Formula: formula, Inputs: []calc.Operand{in, y},
		Results: []calc.Operand{{Name: "V_th", Value: v}, {Name: "Z_th", Value: zq}}}
	eq := Equivalent{V: v, Z: zq, I: in.Value, Y: yq}
	if z == 0 {
		eq.NoNorton = true
		eq.I = calc.Quantity{Dim: calc.DimCurrent}
		step.Notes = []string{y.Name + " is 0 Ω and shorts the current source: the result is a 0 V ideal voltage source"}
	}
	return eq, []calc.Step{step}, nil
}

// DeltaToY converts three impedances in Δ to the equivalent Y (star).
// Labelling: the Δ sides are Z_ab (between nodes a and b), Z_bc and Z_ca;
// the Y arms Z_a, Z_b, Z_c run from nodes a, b, c to the star point. Then
// Z_a = Z_ab·Z_ca/ΣZ, Z_b = Z_bc·Z_ab/ΣZ, Z_c = Z_ca·Z_bc/ΣZ with
// ΣZ = Z_ab + Z_bc + Z_ca (common practice). A Δ whose sides sum to 0
// (resonant loop) has no Y equivalent, which is an error.
func DeltaToY(zab, zbc, zca calc.Operand) (za, zb, zc calc.Quantity, steps []calc.Step, err error) {
	const op = "Δ→Y"
	zab, zbc, zca = nameOr(zab, "Z_ab"), nameOr(zbc, "Z_bc"), nameOr(zca, "Z_ca")
	in := []calc.Operand{zab, zbc, zca}
	for _, o := range in {
		if err := wantDim(op, o, calc.DimImpedance); err != nil {
			return za, zb, zc, nil, err
		}
	}
	s, m := sumMax(in)
	if cancelled(s, m, 3) {
		return za, zb, zc, nil, fmt.Errorf("Δ→Y: the Δ sides %s + %s + %s sum to 0 (a resonant loop), so there is no Y equivalent", zab.Name, zbc.Name, zca.Name)
	}
	ab, bc, ca := zab.Value.V, zbc.Value.V, zca.Value.V
	vals := [3]complex128{ab * (ca / s), bc * (ab / s), ca * (bc / s)}
	var q [3]calc.Quantity
	for k, v := range vals {
		if q[k], err = checked(v, calc.DimImpedance, op); err != nil {
			return za, zb, zc, nil, err
		}
	}
	sum := zab.Name + " + " + zbc.Name + " + " + zca.Name
	steps = []calc.Step{{Kind: "delta-y",
		Rule: "Δ to Y: each arm is the product of the two Δ sides at its node over the sum of all three",
		Formula: "Z_a = " + zab.Name + "·" + zca.Name + "/(" + sum + "), Z_b = " + zbc.Name + "·" + zab.Name + "/(" + sum +
			"), Z_c = " + zca.Name + "·" + zbc.Name + "/(" + sum + ")",
		Inputs:  in,
		Results: []calc.Operand{{Name: "Z_a", Value: q[0]}, {Name: "Z_b", Value: q[1]}, {Name: "Z_c", Value: q[2]}}}}
	return q[0], q[1], q[2], steps, nil
}

// YToDelta converts three impedances in Y (star) to the equivalent Δ, with
// the labelling of DeltaToY: Z_ab = P/Z_c, Z_bc = P/Z_a, Z_ca = P/Z_b where
// P = Z_a·Z_b + Z_b·Z_c + Z_c·Z_a (common practice). An arm of 0 Ω puts the
// star point on a node, which leaves the opposite Δ side open (infinite):
// that has no three-sided Δ and is an error, unless all three arms are 0.
func YToDelta(za, zb, zc calc.Operand) (zab, zbc, zca calc.Quantity, steps []calc.Step, err error) {
	const op = "Y→Δ"
	za, zb, zc = nameOr(za, "Z_a"), nameOr(zb, "Z_b"), nameOr(zc, "Z_c")
	in := []calc.Operand{za, zb, zc}
	for _, o := range in {
		if err := wantDim(op, o, calc.DimImpedance); err != nil {
			return zab, zbc, zca, nil, err
		}
	}
	a, b, c := za.Value.V, zb.Value.V, zc.Value.V
	p := a*b + b*c + c*a
	opposite := map[int]string{0: "Z_bc", 1: "Z_ca", 2: "Z_ab"}
	allZero := a == 0 && b == 0 && c == 0
	for k, o := range in {
		if o.Value.V == 0 && !allZero {
			return zab, zbc, zca, nil, fmt.Errorf("Y→Δ: the arm %s is 0 Ω, so the star point sits on its node and the opposite side %s would be infinite (open): this Y has no three-sided Δ", o.Name, opposite[k])
		}
	}
	var vals [3]complex128
	if p != 0 {
		vals = [3]complex128{p / c, p / a, p / b}
	}
	var q [3]calc.Quantity
	for k, v := range vals {
		if q[k], err = checked(v, calc.DimImpedance, op); err != nil {
			return zab, zbc, zca, nil, err
		}
	}
	pf := za.Name + "·" + zb.Name + " + " + zb.Name + "·" + zc.Name + " + " + zc.Name + "·" + za.Name
	step := calc.Step{Kind: "y-delta",
		Rule:    "Y to Δ: each side is the sum of the pairwise products of the arms over the arm at the opposite node",
		Formula: "P = " + pf + "; Z_ab = P/" + zc.Name + ", Z_bc = P/" + za.Name + ", Z_ca = P/" + zb.Name,
		Inputs:  in,
		Results: []calc.Operand{{Name: "Z_ab", Value: q[0]}, {Name: "Z_bc", Value: q[1]}, {Name: "Z_ca", Value: q[2]}}}
	if p == 0 {
		step.Notes = []string{"the pairwise products sum to 0, so every Δ side is 0 Ω (a short)"}
	}
	return q[0], q[1], q[2], []calc.Step{step}, nil
}
