package threephase

import (
	"fmt"
	"strings"

	"argand/calc"
)

// Marking a voltage as line-to-line or line-to-neutral guards against the
// commonest slip on a three-phase supply: a factor of √3. Every
// three-phase voltage parameter says which it takes; a value marked with
// l2l or l2n is checked against it, and every step shows both forms.

// Mark returns v marked as stated between two lines or between a line and
// the neutral. Only a voltage can be marked.
func Mark(v calc.Quantity, b calc.Between) (calc.Quantity, []calc.Step, error) {
	if b != calc.LineToLine && b != calc.LineToNeutral {
		return calc.Quantity{}, nil, fmt.Errorf("a voltage is marked line-to-line or line-to-neutral")
	}
	if v.Dim != calc.DimVoltage {
		return calc.Quantity{}, nil, fmt.Errorf("only a voltage is line-to-line or line-to-neutral, not %s", calc.DimWord(v.Dim))
	}
	if _, err := v.Check("marked voltage"); err != nil {
		return calc.Quantity{}, nil, err
	}
	if v.Ref != calc.Unmarked && v.Ref != b {
		return calc.Quantity{}, nil, fmt.Errorf("this voltage is already marked %s: to convert it use %s", v.Ref, convertHint(v.Ref))
	}
	v.Ref = b
	return v, nil, nil
}

func convertHint(b calc.Between) string {
	if b == calc.LineToLine {
		return "line2phase(V, wye)"
	}
	return "phase2line(V, wye)"
}

// other returns the other reference.
func other(b calc.Between) calc.Between {
	if b == calc.LineToLine {
		return calc.LineToNeutral
	}
	return calc.LineToLine
}

// convertRef turns a balanced-set voltage from one reference to the other.
// As a phasor (Y of a balanced set, shared DESIGN.md): V_ab = √3·V_an∠s·30°
// with s = +1 for ABC, −1 for ACB. As a magnitude (a rating, or a
// parameter that uses |V| only) the angle is kept and only √3 applies.
func convertRef(v complex128, from calc.Between, seq Sequence, phasor bool) complex128 {
	k := complex(sqrt3, 0)
	if phasor {
		k *= shift30(seq.sign())
	}
	if from == calc.LineToLine {
		return v / k
	}
	return v * k
}

// Voltage reads a three-phase voltage argument for a parameter that takes
// want (line-to-line or line-to-neutral). An unmarked value is taken as
// the parameter says; a value marked the other way is converted, and the
// step says so. The step shows both forms either way ("400 V line-to-line
// = 230.9 V line-to-neutral"). phasor says whether the parameter uses the
// phasor (the ±30° shift applies) or only the magnitude. The value
// returned carries the marking want. A quantity that is not a voltage is
// returned unchanged, with no step, for the caller's own check.
func Voltage(v calc.Quantity, want calc.Between, what string, seq Sequence, phasor bool) (calc.Quantity, []calc.Step, error) {
	if v.Dim != calc.DimVoltage {
		return v, nil, nil
	}
	if err := seq.check(); err != nil {
		return calc.Quantity{}, nil, err
	}
	if want != calc.LineToLine && want != calc.LineToNeutral {
		return calc.Quantity{}, nil, fmt.Errorf("%s: a three-phase voltage parameter is line-to-line or line-to-neutral", what)
	}
	if _, err := v.Check(what); err != nil {
		return calc.Quantity{}, nil, err
	}
	if v.Kind == calc.KindMagnitude {
		phasor = false // a size has no angle to shift
	}
	st := calc.Step{Kind: "line-neutral"}
	given := v
	if v.Ref != calc.Unmarked && v.Ref != want {
		v = calc.Quantity{V: convertRef(v.V, v.Ref, seq, phasor), Dim: calc.DimVoltage, Kind: v.Kind}
		st.Notes = []string{fmt.Sprintf("%s was marked %s; %s is the %s voltage, so it is converted", short(given), given.Ref, what, want)}
		st.Inputs = []calc.Operand{op("given ("+given.Ref.String()+")", given)}
	}
	v.Ref = want
	alt := calc.Quantity{V: convertRef(v.V, want, seq, phasor), Dim: calc.DimVoltage, Kind: v.Kind, Ref: other(want)}
	if _, err := alt.Check(what); err != nil {
		return calc.Quantity{}, nil, err
	}
	ll, ln := v, alt
	if want == calc.LineToNeutral {
		ll, ln = alt, v
	}
	st.Rule = fmt.Sprintf("%s is the %s voltage: %s line-to-line = %s line-to-neutral", what, want, short(ll), short(ln))
	if phasor {
		st.Formula = fmt.Sprintf("V_ab = √3·V_an∠%+.0f° (%s, balanced set)", 30*seq.sign(), seq)
	} else {
		st.Formula = "|V_LL| = √3·|V_LN|"
	}
	if !phasor {
		// only the sizes enter: show them as magnitudes, not as phasors at 0°
		ll = calc.Quantity{V: complex(ll.Mag(), 0), Dim: calc.DimVoltage, Kind: calc.KindMagnitude, Ref: calc.LineToLine}
		ln = calc.Quantity{V: complex(ln.Mag(), 0), Dim: calc.DimVoltage, Kind: calc.KindMagnitude, Ref: calc.LineToNeutral}
		st.Formula = "|V_LL| = √3·|V_LN|"
	}
	st.Results = []calc.Operand{op("|V_LL|", ll), op("|V_LN|", ln)}
	if phasor {
		st.Results = []calc.Operand{op("V_LL", ll), op("V_LN", ln)}
	}
	return v, []calc.Step{st}, nil
}

// short writes a voltage's magnitude for a rule in words.
func short(v calc.Quantity) string {
	return calc.Format{}.Mag(v.Mag(), calc.DimVoltage, calc.KindPlain)
}

func callMark(b calc.Between) func(*calc.Context, []calc.Arg) (calc.Result, error) {
	return func(c *calc.Context, args []calc.Arg) (calc.Result, error) {
		v, err := quantity(args, 0, "the voltage")
		if err != nil {
			return calc.Result{}, err
		}
		m, _, err := Mark(v, b)
		if err != nil {
			return calc.Result{}, err
		}
		_, steps, err := Voltage(m, b, "the marked value", SequenceOf(c), true)
		if err != nil {
			return calc.Result{}, err
		}
		steps[0].Rule = "marked " + b.String() + strings.TrimPrefix(steps[0].Rule, "the marked value is the "+b.String()+" voltage")
		alt := steps[0].Results[1]
		if b == calc.LineToNeutral {
			alt = steps[0].Results[0]
		}
		key := "ln"
		if b == calc.LineToNeutral {
			key = "ll"
		}
		return calc.Result{Value: m, Extra: []calc.Operand{op(key, alt.Value)}, Steps: steps, Cautions: calc.CautionsOf(calc.CautionMains)}, nil
	}
}

// VoltageArgs is the help text shared by the functions that take a
// three-phase voltage.
const VoltageArgs = "mark a value l2l(400 V) or l2n(230 V) to have it checked; a value marked the other way is converted, with a note"

// When says when Voltages reads a function's voltage arguments as
// three-phase voltages.
type When uint8

const (
	// Always: the function is three-phase by definition (a rating, a
	// nominal system voltage, a motor's rated voltage).
	Always When = iota
	// UnlessSingle: three-phase unless the word single is among the
	// arguments, which takes the values as given.
	UnlessSingle
	// WhenMarked: the values may as well be single-phase ones (only their
	// ratio enters, or a single-phase supply is as likely): they are
	// taken as given unless one of them is marked, and then all are read.
	WhenMarked
)

// Voltages wraps a function whose voltage arguments at the places given
// (argument index to parameter name) are three-phase voltages of one kind
// (want): each is read by Voltage before call runs, so a value marked the
// other way (l2l, l2n) is converted by √3 and an unmarked one is stated in
// both forms, and the result begins with those steps. Only the sizes
// enter: the functions wrapped take ratings and nominal voltages.
func Voltages(want calc.Between, when When, places map[int]string, call func(*calc.Context, []calc.Arg) (calc.Result, error)) func(*calc.Context, []calc.Arg) (calc.Result, error) {
	return func(c *calc.Context, args []calc.Arg) (calc.Result, error) {
		voltage := func(a calc.Arg) bool { return !a.Absent && a.Word == "" && a.Q.Dim == calc.DimVoltage }
		read := true
		switch when {
		case UnlessSingle:
			for _, a := range args {
				if strings.EqualFold(a.Word, "single") {
					read = false
				}
			}
		case WhenMarked:
			read = false
			for i, a := range args {
				if _, ok := places[i]; ok && voltage(a) && a.Q.Ref != calc.Unmarked {
					read = true
				}
			}
		}
		if !read {
			return call(c, args)
		}
		args = append([]calc.Arg(nil), args...)
		var pre []calc.Step
		for i := range args {
			name, ok := places[i]
			if !ok || !voltage(args[i]) {
				continue
			}
			v, st, err := Voltage(args[i].Q, want, name, SequenceOf(c), false)
			if err != nil {
				return calc.Result{}, err
			}
			args[i].Q = v
			pre = append(pre, st...)
		}
		r, err := call(c, args)
		if err != nil {
			return r, err
		}
		r.Steps = append(pre, r.Steps...)
		return r, nil
	}
}
