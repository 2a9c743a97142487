package sweep

import (
	"fmt"
	"math"
	"math/cmplx"

	"argand/calc"
)

// positive checks that q is a real, finite, positive value of dimension d.
func positive(q calc.Quantity, d calc.Dim, what string) (float64, error) {
	if q.Dim != d {
		return 0, fmt.Errorf("%s must be in %s, not %s", what, calc.UnitSymbol(d, calc.KindPlain, false), calc.DimName(q.Dim, false))
	}
	if _, err := q.Check(what); err != nil {
		return 0, err
	}
	if imag(q.V) != 0 || real(q.V) <= 0 {
		return 0, fmt.Errorf("%s must be a real value above zero", what)
	}
	return real(q.V), nil
}

func op(name string, q calc.Quantity) calc.Operand { return calc.Operand{Name: name, Value: q} }

func hz(f float64) calc.Quantity  { return calc.Real(f, calc.DimFrequency) }
func num(x float64) calc.Quantity { return calc.Number(complex(x, 0)) }

func check(what string, qs ...calc.Quantity) error {
	for _, q := range qs {
		if _, err := q.Check(what); err != nil {
			return err
		}
	}
	return nil
}

// Resonance returns the resonant frequency of an inductance L and a
// capacitance C, f0 = 1/(2π·√(L·C)), and ω0 = 2π·f0 = 1/√(L·C): the
// frequency at which their reactances are equal.
func Resonance(l, c calc.Quantity) (f0, w0 calc.Quantity, steps []calc.Step, err error) {
	lv, cv, err := lc(l, c)
	if err != nil {
		return f0, w0, nil, err
	}
	w := 1 / math.Sqrt(lv*cv)
	w0 = calc.Quantity{V: complex(w, 0), Dim: calc.DimAngularFrequency, Kind: calc.KindAngle}
	f0 = hz(calc.HzOf(w))
	if err := check("resonant frequency", f0, w0); err != nil {
		return calc.Quantity{}, calc.Quantity{}, nil, err
	}
	st := calc.Step{
		Kind:    "resonance",
		Rule:    "resonance: the inductive and capacitive reactances are equal, ω0·L = 1/(ω0·C)",
		Formula: "f0 = 1/(2π·√(L·C));  ω0 = 1/√(L·C)",
		Inputs:  []calc.Operand{op("L", l), op("C", c)},
		Results: []calc.Operand{op("f0", f0), op("ω0", w0)},
	}
	return f0, w0, []calc.Step{st}, nil
}

// SeriesQ returns the quality factor of a series RLC circuit at
// resonance, Q = (1/R)·√(L/C) = ω0·L/R.
func SeriesQ(r, l, c calc.Quantity) (calc.Quantity, []calc.Step, error) {
	rv, err := positive(r, calc.DimImpedance, "R")
	if err != nil {
		return calc.Quantity{}, nil, fmt.Errorf("%w (a lossless series circuit has unbounded Q)", err)
	}
	lv, cv, err := lc(l, c)
	if err != nil {
		return calc.Quantity{}, nil, err
	}
	q := num(math.Sqrt(lv/cv) / rv)
	if err := check("series Q", q); err != nil {
		return calc.Quantity{}, nil, err
	}
	st := calc.Step{
		Kind:    "resonance",
		Rule:    "quality factor of a series RLC circuit: reactance of L (or C) at resonance over R",
		Formula: "Q = (1/R)·√(L/C) = ω0·L/R",
		Inputs:  []calc.Operand{op("R", r), op("L", l), op("C", c)},
		Results: []calc.Operand{op("Q", q)},
	}
	return q, []calc.Step{st}, nil
}

// ParallelQ returns the quality factor of a parallel RLC circuit at
// resonance, Q = R·√(C/L) = R/(ω0·L).
func ParallelQ(r, l, c calc.Quantity) (calc.Quantity, []calc.Step, error) {
	rv, err := positive(r, calc.DimImpedance, "R")
	if err != nil {
		return calc.Quantity{}, nil, err
	}
	lv, cv, err := lc(l, c)
	if err != nil {
		return calc.Quantity{}, nil, err
	}
	q := num(rv * math.Sqrt(cv/lv))
	if err := check("parallel Q", q); err != nil {
		return calc.Quantity{}, nil, err
	}
	st := calc.Step{
		Kind:    "resonance",
		Rule:    "quality factor of a parallel RLC circuit: R over the reactance of L (or C) at resonance",
		Formula: "Q = R·√(C/L) = R/(ω0·L)",
		Inputs:  []calc.Operand{op("R", r), op("L", l), op("C", c)},
		Results: []calc.Operand{op("Q", q)},
	}
	return q, []calc.Step{st}, nil
}

// Band is the −3 dB (half-power) band of a resonant circuit.
type Band struct {
	B      calc.Quantity // bandwidth, in the unit of f0
	F1, F2 calc.Quantity // lower and upper half-power frequencies
}

// Bandwidth returns the −3 dB bandwidth B = f0/Q of a resonance and the
// half-power frequencies f1,2 = f0·(√(1 + 1/(4Q²)) ∓ 1/(2Q)), exact for
// the series and the parallel RLC circuit, whose f1·f2 = f0². f0 may be in
// Hz or rad/s; Q is a plain number above zero.
func Bandwidth(f0, q calc.Quantity) (Band, []calc.Step, error) {
	var bd Band
	if f0.Dim != calc.DimFrequency && f0.Dim != calc.DimAngularFrequency {
		return bd, nil, fmt.Errorf("f0 must be a frequency in Hz or rad/s, not %s", calc.DimName(f0.Dim, false))
	}
	fv, err := positive(f0, f0.Dim, "f0")
	if err != nil {
		return bd, nil, err
	}
	qv, err := positive(q, calc.Dimensionless, "Q")
	if err != nil {
		return bd, nil, err
	}
	h := 1 / (2 * qv)
	root := math.Sqrt(1 + h*h)
	bd.B = calc.Quantity{V: complex(fv/qv, 0), Dim: f0.Dim, Kind: f0.Kind}
	bd.F1 = calc.Quantity{V: complex(fv*(root-h), 0), Dim: f0.Dim, Kind: f0.Kind}
	bd.F2 = calc.Quantity{V: complex(fv*(root+h), 0), Dim: f0.Dim, Kind: f0.Kind}
	if err := check("bandwidth", bd.B, bd.F1, bd.F2); err != nil {
		return Band{}, nil, err
	}
	st := calc.Step{
		Kind:    "bandwidth",
		Rule:    "−3 dB (half-power) bandwidth of a resonance",
		Formula: "B = f0/Q;  f1 = f0·(√(1 + 1/(4Q²)) − 1/(2Q));  f2 = f0·(√(1 + 1/(4Q²)) + 1/(2Q))",
		Inputs:  []calc.Operand{op("f0", f0), op("Q", q)},
		Results: []calc.Operand{op("B", bd.B), op("f1", bd.F1), op("f2", bd.F2)},
	}
	return bd, []calc.Step{st}, nil
}

// Tank is a parallel LC circuit whose inductor has series resistance r.
type Tank struct {
	F0       calc.Quantity // 1/(2π·√(L·C)), Hz
	Unity    calc.Quantity // unity-power-factor frequency, Hz; valid when HasUnity
	HasUnity bool          // false when r²·C/L ≥ 1
	// Dynamic is the impedance at the unity-PF frequency, L/(r·C), a
	// resistance; valid when HasDynamic (r > 0 and HasUnity).
	Dynamic    calc.Quantity
	HasDynamic bool
}

// SolveTank works a tank: L with series resistance r, in parallel with C.
// Setting the imaginary part of its admittance to zero gives the
// unity-power-factor frequency f = f0·√(1 − r²·C/L), below f0 =
// 1/(2π·√(L·C)); there the impedance is L/(r·C). When r²·C/L ≥ 1 no
// frequency gives unity power factor, and the step says so.
func SolveTank(l, r, c calc.Quantity) (Tank, []calc.Step, error) {
	var t Tank
	lv, cv, err := lc(l, c)
	if err != nil {
		return t, nil, err
	}
	if r.Dim != calc.DimImpedance || imag(r.V) != 0 || real(r.V) < 0 {
		return t, nil, fmt.Errorf("r must be a real resistance of 0 Ω or more")
	}
	if _, err := r.Check("r"); err != nil {
		return t, nil, err
	}
	rv := real(r.V)
	f0 := calc.HzOf(1 / math.Sqrt(lv*cv))
	t.F0 = hz(f0)
	k := rv * rv * cv / lv
	st := calc.Step{
		Kind:    "resonance",
		Rule:    "tank with a resistive inductor: unity power factor where the imaginary part of the admittance vanishes",
		Formula: "f0 = 1/(2π·√(L·C));  f = f0·√(1 − r²·C/L);  Z = L/(r·C) at f",
		Inputs:  []calc.Operand{op("L", l), op("r", r), op("C", c)},
		Results: []calc.Operand{op("f0", t.F0)},
	}
	if k < 1 {
		t.Unity = hz(f0 * math.Sqrt(1-k))
		t.HasUnity = true
		st.Results = append([]calc.Operand{op("f", t.Unity)}, st.Results...)
		if rv > 0 {
			t.Dynamic = calc.Real(lv/(rv*cv), calc.DimImpedance)
			t.HasDynamic = true
			st.Results = append(st.Results, op("Z(f)", t.Dynamic))
		} else {
			st.Notes = append(st.Notes, "r = 0: the unity-power-factor frequency is f0 and the impedance there is unbounded (open circuit)")
		}
	} else {
		st.Notes = append(st.Notes, fmt.Sprintf("r²·C/L = %.4g ≥ 1: no frequency gives unity power factor", k))
	}
	if err := check("tank", t.F0, t.Unity, t.Dynamic); err != nil {
		return Tank{}, nil, err
	}
	return t, []calc.Step{st}, nil
}

// Transfer is a transfer ratio H = Vout/Vin and its gain in dB.
type Transfer struct {
	H     calc.Quantity // plain number
	DB    calc.Quantity // 20·log10|H| as a plain number; valid when HasDB
	HasDB bool          // false when the output is zero
}

// Ratio returns H = out/in for two quantities of the same unit (the
// output and input voltages, or currents, at one frequency) and the gain
// 20·log10|H| in dB. A zero output has no gain in dB; the step says the
// output is zero instead.
func Ratio(out, in calc.Quantity) (Transfer, []calc.Step, error) {
	var tr Transfer
	if out.Dim != in.Dim {
		return tr, nil, fmt.Errorf("a transfer ratio needs output and input in the same unit, not %s and %s",
			calc.DimName(out.Dim, false), calc.DimName(in.Dim, false))
	}
	if err := check("transfer ratio", out, in); err != nil {
		return tr, nil, err
	}
	if in.V == 0 {
		return tr, nil, fmt.Errorf("the input is zero, so the transfer ratio is undefined")
	}
	tr.H = calc.Number(out.V / in.V)
	if err := check("transfer ratio", tr.H); err != nil {
		return Transfer{}, nil, err
	}
	st := calc.Step{
		Kind:    "transfer",
		Rule:    "transfer ratio of output to input, and its gain in dB",
		Formula: "H = Vout/Vin;  gain = 20·log10|H| dB",
		Inputs:  []calc.Operand{op("Vout", out), op("Vin", in)},
		Results: []calc.Operand{op("H", tr.H)},
	}
	if d, err := DB(cmplx.Abs(tr.H.V)); err == nil {
		tr.DB, tr.HasDB = num(d), true
		st.Results = append(st.Results, op("gain (dB)", tr.DB))
	} else {
		st.Notes = append(st.Notes, err.Error())
	}
	return tr, []calc.Step{st}, nil
}

// Gain returns 20·log10|h| in dB for a transfer ratio h (a plain number).
// A zero ratio is an error: the output is zero and has no value in dB.
func Gain(h calc.Quantity) (calc.Quantity, []calc.Step, error) {
	if !h.Dim.IsDimensionless() {
		return calc.Quantity{}, nil, fmt.Errorf("a gain in dB takes a ratio (a plain number), not %s", calc.DimName(h.Dim, false))
	}
	if _, err := h.Check("gain"); err != nil {
		return calc.Quantity{}, nil, err
	}
	d, err := DB(cmplx.Abs(h.V))
	if err != nil {
		return calc.Quantity{}, nil, err
	}
	g := num(d)
	st := calc.Step{
		Kind:    "transfer",
		Rule:    "gain in dB of a voltage (or current) ratio",
		Formula: "gain = 20·log10|H| dB",
		Inputs:  []calc.Operand{op("H", h)},
		Results: []calc.Operand{op("gain (dB)", g)},
	}
	return g, []calc.Step{st}, nil
}

// lc returns the values of a positive inductance and capacitance.
func lc(l, c calc.Quantity) (lv, cv float64, err error) {
	if lv, err = positive(l, calc.DimInductance, "L"); err != nil {
		return 0, 0, err
	}
	if cv, err = positive(c, calc.DimCapacitance, "C"); err != nil {
		return 0, 0, err
	}
	return lv, cv, nil
}
