package calc

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"
	"unicode/utf8"
)

// Env is what an expression is evaluated against: named quantities, the
// functions beyond the built-in ones, and the worksheet settings.
type Env interface {
	Lookup(name string) (Quantity, bool)
	Func(name string) (*Func, bool)
	Context() *Context
}

// Evaluator evaluates parsed expressions of one statement; src is the
// statement text, for operand names and error columns.
type Evaluator struct {
	Env  Env
	Src  string
	Line int
	// Steps collects the steps of function calls met on the way.
	Steps    []Step
	Notes    []string
	Cautions []StepCaution
	// Since is the newest language version whose reading the evaluation
	// used (a part value turned into its impedance), 0 if none.
	Since int
	// Seen, when set, is told the value of every part of the expression
	// as it is evaluated, so that a record of the work can show the
	// operands without evaluating them again.
	Seen func(e Expr, q Quantity)
}

// Eval evaluates e. A call at the root returns the function's whole result,
// with its extra named values; otherwise Result.Value is the value.
func (ev *Evaluator) Eval(e Expr) (Result, *Error) {
	if c, ok := e.(*Call); ok {
		r, err := ev.call(c)
		if err != nil {
			return Result{}, err
		}
		r.Steps = append(ev.Steps, r.Steps...)
		ev.Steps = nil
		r.Notes = append(ev.Notes, r.Notes...)
		r.Cautions = append(ev.Cautions, r.Cautions...)
		ev.Notes, ev.Cautions = nil, nil
		return r, nil
	}
	q, err := ev.eval(e)
	if err != nil {
		return Result{}, err
	}
	r := Result{Value: q, Steps: ev.Steps, Notes: append(ev.Notes, ev.kindNotes(e, q)...), Cautions: ev.Cautions}
	ev.Steps, ev.Notes, ev.Cautions = nil, nil, nil
	return r, nil
}

// kindNotes explains a result whose kind a reader could take for another:
// a product of sizes (|S|, not S), a product of phasors (not a power at
// all), a peak-basis V·I*, and the tell-tale units of a frequency typed
// without Hz.
func (ev *Evaluator) kindNotes(e Expr, q Quantity) []string {
	var notes []string
	f := ev.Env.Context().Format
	if q.Dim == DimPower {
		switch q.Kind {
		case KindProduct:
			notes = append(notes, "V·I of two phasors is a phasor product, not a complex power: S = V·I* (IEEE Std 1459-2010); use power(V, I) or V * conj(I)")
		case KindMagnitude:
			if b, ok := e.(*Binary); ok && b.Op == "*" {
				notes = append(notes, "a product of sizes is the apparent power |S| = |V|·|I|, with no angle; for the complex power use power(V, I) or V * conj(I)")
			}
		case KindApparent:
			hasConj := false
			Walk(e, func(x Expr) {
				if c, ok := x.(*Call); ok && c.Fun == "conj" {
					hasConj = true
				}
			})
			if hasConj && ev.Env.Context().Basis == Peak {
				notes = append(notes, "basis peak: S = ½·V·I* for peak phasors, so V * conj(I) here is 2·S; power(V, I) applies the ½")
			}
		}
	}
	if d, ok := frequencyIntent(q); ok {
		alt := Quantity{V: q.V, Dim: d, Kind: KindMagnitude}
		what := "a number here"
		Walk(e, func(x Expr) {
			// the bare number that is not the 2 of 2π nor a 1 over
			if l, ok := x.(*Lit); ok && !l.hasUnit && l.Val != 2 && l.Val != 1 && what == "a number here" {
				what = ev.text(l)
			}
		})
		notes = append(notes, what+" has no unit; with "+what+" Hz this is "+DimWord(d)+": "+f.Both(alt, false))
	}
	return notes
}

// frequencyIntent recognises the units a frequency typed without Hz
// leaves behind: 2π·50·L is in H (per cycle) where 2π·f·L is in Ω, and
// 1/(2π·50·C) in V·cycle/(A·s) where 1/(2π·f·C) is in Ω. It returns the
// dimension the result would have had.
func frequencyIntent(q Quantity) (Dim, bool) {
	if q.Kind == KindTurn && (q.Dim == DimInductance || q.Dim == DimCapacitance) {
		d := q.Dim
		d[BaseSecond]--
		return d, true
	}
	if q.Dim[BaseCycle] == 1 {
		d := q.Dim
		d[BaseCycle] = 0
		d[BaseSecond]++
		if d == DimImpedance || d == DimAdmittance {
			return d, true
		}
	}
	return Dim{}, false
}

func (ev *Evaluator) text(e Expr) string {
	pos, end, _ := e.Span()
	if pos < 0 || end > len(ev.Src) || pos > end {
		return ""
	}
	return ev.Src[pos:end]
}

func (ev *Evaluator) errAt(e Expr, err error) *Error {
	pos, end, col := e.Span()
	n := 1
	if pos >= 0 && end <= len(ev.Src) && pos < end {
		n = utf8.RuneCountInString(ev.Src[pos:end])
	}
	var le *Error
	if errors.As(err, &le) {
		return le
	}
	return &Error{Line: ev.Line, Col: col, Len: n, Msg: err.Error(), Err: err}
}

func (ev *Evaluator) errCol(col int, err error) *Error {
	return &Error{Line: ev.Line, Col: col, Len: 1, Msg: err.Error(), Err: err}
}

func (ev *Evaluator) eval(e Expr) (Quantity, *Error) {
	q, err := ev.evalNode(e)
	if err == nil && ev.Seen != nil {
		ev.Seen(e, q)
	}
	return q, err
}

func (ev *Evaluator) evalNode(e Expr) (Quantity, *Error) {
	switch n := e.(type) {
	case *Lit:
		v := n.Val
		if n.Note != "" {
			ev.note(n.Note)
		}
		if n.hasUnit {
			v = n.scaled()
			q, err := Quantity{V: v, Dim: n.dim, Kind: literalKind(n, v)}.Check("number")
			if err != nil {
				return Quantity{}, ev.errAt(n, err)
			}
			return q, nil
		}
		return Quantity{V: v}, nil
	case *Paren:
		return ev.eval(n.X)
	case *Name:
		switch n.Name {
		case "pi", "π":
			return Angle(math.Pi), nil
		case "e":
			return Number(complex(math.E, 0)), nil
		}
		if q, ok := ev.Env.Lookup(n.Name); ok {
			return q, nil
		}
		if _, ok := ev.Env.Func(n.Name); ok || builtin(n.Name) != nil {
			return Quantity{}, ev.errAt(n, fmt.Errorf("%s is a function: write %s(…)", n.Name, n.Name))
		}
		if IsUnit(n.Name) {
			return Quantity{}, ev.errAt(n, fmt.Errorf("unknown name %q (as a unit it follows a number: 1 %s)", n.Name, n.Name))
		}
		return Quantity{}, ev.errAt(n, fmt.Errorf("unknown name %q", n.Name))
	case *Unary:
		x, err := ev.eval(n.X)
		if err != nil {
			return Quantity{}, err
		}
		if n.Op == "-" {
			return Neg(x), nil
		}
		return x, nil
	case *Binary:
		x, err := ev.eval(n.X)
		if err != nil {
			return Quantity{}, err
		}
		y, err := ev.eval(n.Y)
		if err != nil {
			return Quantity{}, err
		}
		if n.Op == "+" || n.Op == "-" || n.Op == "||" {
			if x, y, err = ev.asImpedances(n, x, y); err != nil {
				return Quantity{}, err
			}
		}
		if n.Op == "+" || n.Op == "-" {
			x, y = writtenPQ(n, x, y)
		}
		var r Quantity
		var e2 error
		switch n.Op {
		case "+":
			r, e2 = Add(x, y)
		case "-":
			r, e2 = Sub(x, y)
		case "*":
			r, e2 = Mul(x, y)
		case "/":
			r, e2 = Div(x, y)
		case "^":
			r, e2 = Pow(x, y)
		case "||":
			r, e2 = Parallel(x, y)
		default:
			e2 = fmt.Errorf("unknown operator %s", n.Op)
		}
		if e2 != nil {
			if yb, ok := n.Y.(*Binary); ok && yb.Op == "||" && (n.Op == "+" || n.Op == "-") && isDimErr(e2) {
				// 3+j4 Ω || Z2 reads as 3 + (j4 Ω || Z2)
				e2 = fmt.Errorf("%v (|| binds tighter than + and −: write (%s) || …)", e2, ev.text(&Binary{span: spanOf(n.X, yb.X)}))
			} else if (n.Op == "+" || n.Op == "-") && isDimErr(e2) && (x.Dim.IsDimensionless() || y.Dim.IsDimensionless()) {
				e2 = fmt.Errorf("%v (give both a unit, as in 3+j4 Ω written without spaces)", e2)
			}
			return Quantity{}, ev.errCol(n.OpCol, e2)
		}
		return r, nil
	case *Polar:
		m, err := ev.eval(n.Mag)
		if err != nil {
			return Quantity{}, err
		}
		a, err := ev.eval(n.Ang)
		if err != nil {
			return Quantity{}, err
		}
		if !a.Dim.IsDimensionless() {
			return Quantity{}, ev.errAt(n.Ang, fmt.Errorf("an angle must be a plain number (degrees) or an angle, not %s", DimName(a.Dim, false)))
		}
		if !a.IsReal() {
			return Quantity{}, ev.errAt(n.Ang, fmt.Errorf("an angle must be real, not complex (write parentheses to add after ∠: (10∠30) + j4)"))
		}
		if !m.IsReal() {
			return Quantity{}, ev.errAt(n.Mag, fmt.Errorf("the magnitude before ∠ must be real"))
		}
		rad := real(a.V)
		if a.Kind != KindAngle {
			rad = ev.Env.Context().BareAngle(rad)
		}
		d, k := m.Dim, m.Kind
		if n.Unit != "" {
			if !m.Dim.IsDimensionless() {
				return Quantity{}, ev.errAt(n, fmt.Errorf("two units on one phasor"))
			}
			m.V *= complex(n.scale, 0)
			d, k = n.dim, n.kind
		}
		switch {
		case k == KindActive || k == KindReactive || k == KindMagnitude && d == DimPower:
			k = KindApparent // |S|∠φ is a complex power
		case k == KindAngle || k.noAngle() || k == KindConj:
			k = KindPlain
		}
		s, c := math.Sincos(rad)
		// exact axes: 10∠90 is j10, not 6.1e-16 + j10
		switch NormDeg(rad * 180 / math.Pi) {
		case 90:
			s, c = 1, 0
		case 180:
			s, c = 0, -1
		case -90:
			s, c = -1, 0
		case 0:
			s, c = 0, 1
		}
		q, e2 := Quantity{V: complex(real(m.V)*c, real(m.V)*s), Dim: d, Kind: k}.Check("phasor")
		if e2 != nil {
			return Quantity{}, ev.errAt(n, e2)
		}
		return q, nil
	case *Call:
		r, err := ev.call(n)
		if err != nil {
			return Quantity{}, err
		}
		ev.Steps = append(ev.Steps, r.Steps...)
		ev.Notes = append(ev.Notes, r.Notes...)
		ev.Cautions = append(ev.Cautions, r.Cautions...)
		return r.Value, nil
	}
	return Quantity{}, ev.errAt(e, fmt.Errorf("cannot evaluate this expression"))
}

// writtenPQ reads P ± jQ, an active power and a reactive power written
// with j (as in 10 W + j0 var), as the complex power S = P + jQ (IEEE Std
// 1459-2010) it was written as: the j-literal is j·Q on the imaginary axis
// even when Q is zero, so the sum is not refused as W plus var held as
// plain numbers.
func writtenPQ(n *Binary, x, y Quantity) (Quantity, Quantity) {
	if x.Dim != DimPower || y.Dim != DimPower {
		return x, y
	}
	jq := func(e Expr, q Quantity) bool {
		l := litOf(e)
		return l != nil && l.imag && q.Kind == KindReactive
	}
	switch {
	case x.Kind == KindActive && jq(n.Y, y):
		y.Kind = KindApparent
	case y.Kind == KindActive && jq(n.X, x):
		x.Kind = KindApparent
	}
	return x, y
}

// literalKind is the kind of a number written with a unit: a real value
// in Ω or S is a resistance or conductance (a reactance is written with j),
// a real value in VA an apparent power |S|; a real value in V or A is a
// reference phasor at 0°, the kind its dimension implies.
func literalKind(n *Lit, v complex128) Kind {
	d, k := n.dim, n.kind
	if imag(v) != 0 || n.distrib {
		return k // the real part of 3+j4 Ω is part of one impedance
	}
	switch {
	case (d == DimImpedance || d == DimAdmittance) && k == KindPlain:
		return KindResistive
	case d == DimPower && k == KindApparent:
		return KindMagnitude
	}
	return k
}

// asImpedances brings the operands of + − || to impedances where one of
// them is an impedance: a number scaled by a prefix alone (10k) takes Ω,
// and an inductance or capacitance becomes its impedance at the working
// frequency (X_L = ωL, X_C = −1/(ωC), common practice). Each reading is
// said in a note. Two inductances or two capacitances add as they are.
func (ev *Evaluator) asImpedances(n *Binary, x, y Quantity) (Quantity, Quantity, *Error) {
	bare := func(e Expr, q Quantity) bool {
		l := litOf(e)
		return l != nil && l.bare && q.Dim.IsDimensionless()
	}
	part := func(q Quantity) bool { return q.Dim == DimInductance || q.Dim == DimCapacitance }
	zish := func(q Quantity) bool { return q.Dim == DimImpedance || part(q) }
	if bare(n.Y, y) && zish(x) || bare(n.X, x) && zish(y) {
		ev.Since = max(ev.Since, 2)
	}
	if bare(n.Y, y) && zish(x) {
		y, _ = AsUnit(n.Y, y, DimImpedance, KindPlain) // 10k is a resistance
		ev.renote(n.Y, fmt.Sprintf("read %q as %s (combined with an impedance)", ev.text(n.Y), ev.Env.Context().Format.Rect(y)))
	}
	if bare(n.X, x) && zish(y) {
		x, _ = AsUnit(n.X, x, DimImpedance, KindPlain) // 10k is a resistance
		ev.renote(n.X, fmt.Sprintf("read %q as %s (combined with an impedance)", ev.text(n.X), ev.Env.Context().Format.Rect(x)))
	}
	var err *Error
	if (part(x) || part(y)) && (x.Dim == DimImpedance || y.Dim == DimImpedance) {
		ev.Since = max(ev.Since, 2)
	}
	if part(x) && y.Dim == DimImpedance {
		x, err = ev.partZ(n.X, x)
	} else if part(y) && x.Dim == DimImpedance {
		y, err = ev.partZ(n.Y, y)
	}
	return x, y, err
}

// partZ is the impedance of an inductance or capacitance at the working
// frequency, with a note that shows it.
func (ev *Evaluator) partZ(e Expr, q Quantity) (Quantity, *Error) {
	z, note, err := PartImpedance(ev.Env.Context(), q)
	if err != nil {
		if c := ev.Env.Context(); c.Freq <= 0 {
			err = fmt.Errorf("%s is a part value: %v", ev.text(e), err)
		}
		return Quantity{}, ev.errAt(e, err)
	}
	ev.note(note)
	return z, nil
}

// PartImpedance is the impedance of an inductance or capacitance at the
// working frequency (X_L = ωL, X_C = −1/(ωC), common practice), with the
// note a step shows for it, such as "10.00 µF at 50.00 Hz: -j318.3 Ω".
// With no working frequency it says to set one.
func PartImpedance(c *Context, q Quantity) (Quantity, string, error) {
	if c.Freq <= 0 {
		return Quantity{}, "", fmt.Errorf("set a working frequency to use its impedance (as in frequency 50 Hz)")
	}
	if !q.IsReal() {
		return Quantity{}, "", fmt.Errorf("a part value must be real to give an impedance")
	}
	var z Quantity
	var err error
	switch q.Dim {
	case DimInductance:
		z, err = InductorZ(q.V, c.Freq)
	case DimCapacitance:
		z, err = CapacitorZ(q.V, c.Freq)
	default:
		return Quantity{}, "", fmt.Errorf("%s is not a part value (H or F)", DimName(q.Dim, false))
	}
	if err != nil {
		return Quantity{}, "", err
	}
	return z, fmt.Sprintf("%s at %s: %s", c.Format.Rect(q), c.Format.Mag(c.Freq, DimFrequency, KindPlain), c.Format.Rect(z)), nil
}

// scaled is the literal's value times its unit's scale. A power-of-ten
// scale (a prefix, %) is applied to the decimal text, so the value is the
// float64 nearest the decimal number written, as exact as without a unit.
func (l *Lit) scaled() complex128 {
	v := l.Val * complex(l.scale, 0)
	if l.num == "" || real(l.Val) != 0 && imag(l.Val) != 0 {
		return v
	}
	k, ok := pow10(l.scale)
	if !ok {
		return v
	}
	mant, exp := l.num, 0
	if i := strings.IndexAny(mant, "eE"); i >= 0 {
		e, err := strconv.Atoi(mant[i+1:])
		if err != nil || e > 1000 || e < -1000 {
			return v
		}
		mant, exp = mant[:i], e
	}
	x, err := strconv.ParseFloat(mant+"e"+strconv.Itoa(exp+k), 64)
	if err != nil && !errors.Is(err, strconv.ErrRange) || math.IsInf(x, 0) {
		return v
	}
	if imag(l.Val) != 0 {
		return complex(0, x)
	}
	return complex(x, 0)
}

// pow10 reports whether s is 10^k for a whole k within the prefixes' reach.
func pow10(s float64) (int, bool) {
	for k := -30; k <= 30; k++ {
		if math.Pow10(k) == s {
			return k, true
		}
	}
	return 0, false
}

// note adds a remark to the statement's step once.
func (ev *Evaluator) note(s string) {
	for _, n := range ev.Notes {
		if n == s {
			return
		}
	}
	ev.Notes = append(ev.Notes, s)
}

// renote says how a number scaled by a prefix alone was read once it took
// a unit, in place of the note that called it a plain number.
func (ev *Evaluator) renote(e Expr, s string) {
	for _, n := range ev.Notes {
		if n == s {
			return
		}
	}
	ev.Notes = Renote(ev.Notes, e, s)
}

func isDimErr(err error) bool {
	var d *DimError
	return errors.As(err, &d)
}

func (ev *Evaluator) call(c *Call) (Result, *Error) {
	f, ok := ev.Env.Func(c.Fun)
	if !ok {
		f = builtin(c.Fun)
	}
	nameErr := func(msg string, a ...any) *Error {
		return &Error{Line: ev.Line, Col: c.col, Len: utf8.RuneCountInString(c.Fun), Msg: fmt.Sprintf(msg, a...)}
	}
	if f == nil {
		if _, ok := ev.Env.Lookup(c.Fun); ok {
			return Result{}, nameErr("%s is a value, not a function: write %s*(…) to multiply", c.Fun, c.Fun)
		}
		return Result{}, nameErr("unknown function %q", c.Fun)
	}
	exprs, params, berr := ev.bind(f, c)
	if berr != nil {
		return Result{}, berr
	}
	if len(exprs) < f.Min || (f.Max >= 0 && len(exprs) > f.Max) {
		want := fmt.Sprintf("%d", f.Min)
		if f.Max < 0 {
			want = fmt.Sprintf("at least %d", f.Min)
		} else if f.Max != f.Min {
			want = fmt.Sprintf("%d to %d", f.Min, f.Max)
		}
		return Result{}, nameErr("%s takes %s argument(s) %s, got %d", c.Fun, want, f.ArgList(), len(exprs))
	}
	args := make([]Arg, len(exprs))
	for i, a := range exprs {
		if a == nil {
			args[i] = Arg{Absent: true, Text: params[i].Name + " not given"}
			continue
		}
		args[i].Text = ev.text(a)
		if w, ok := ev.word(f, a); ok {
			args[i].Word = w
			continue
		}
		if nm, ok := a.(*Name); ok && f.Words != nil {
			if _, defined := ev.Env.Lookup(nm.Name); !defined {
				return Result{}, ev.errAt(a, fmt.Errorf("%s: %q is neither a defined name nor one of %v", c.Fun, nm.Name, f.Words))
			}
		}
		q, err := ev.eval(a)
		if err != nil {
			return Result{}, err
		}
		if params[i] != nil {
			if q, err = ev.asParam(a, q, *params[i]); err != nil {
				return Result{}, err
			}
		}
		args[i].Q = q
		if params[i] != nil {
			if e2 := checkParam(f, *params[i], args[i]); e2 != nil {
				return Result{}, ev.errAt(a, e2)
			}
		}
	}
	r, err := f.Call(ev.Env.Context(), args)
	if err != nil {
		var le *Error
		if errors.As(err, &le) {
			return Result{}, le
		}
		msg := err.Error()
		if !strings.HasPrefix(msg, c.Fun+" ") && !strings.HasPrefix(msg, c.Fun+":") {
			msg = c.Fun + ": " + msg
		}
		e := nameErr("%s", msg)
		e.Err = err
		return Result{}, e
	}
	if _, e2 := r.Value.Check(c.Fun); e2 != nil {
		return Result{}, nameErr("%s: %v", c.Fun, e2)
	}
	for _, x := range r.Extra {
		if _, e2 := x.Value.Check(c.Fun); e2 != nil {
			return Result{}, nameErr("%s (%s): %v", c.Fun, x.Name, e2)
		}
	}
	return r, nil
}

// paramUnit is the unit a parameter kind expects, for a number scaled by
// a prefix alone (10k) given to it; ok is false where the kind has no one
// unit (a ratio, a power of any kind).
func paramUnit(k ParamKind) (d Dim, kind Kind, ok bool) {
	switch k {
	case ParamVoltage:
		return DimVoltage, KindPlain, true
	case ParamCurrent:
		return DimCurrent, KindPlain, true
	case ParamImpedance, ParamImpedanceOrAdmittance, ParamResistance:
		return DimImpedance, KindPlain, true
	case ParamInductance:
		return DimInductance, KindPlain, true
	case ParamCapacitance:
		return DimCapacitance, KindPlain, true
	case ParamFrequency:
		return DimFrequency, KindPlain, true
	case ParamTime:
		return DimTime, KindPlain, true
	case ParamLength:
		return DimLength, KindPlain, true
	case ParamActivePower:
		return DimPower, KindActive, true
	case ParamReactivePower:
		return DimPower, KindReactive, true
	case ParamApparentPower, ParamSPower:
		return DimPower, KindApparent, true
	}
	return Dimensionless, KindPlain, false
}

// AsUnit gives a number scaled by a prefix alone (10k, 100n) the unit d
// that an element or a parameter expects of it; ok is false for any other
// expression, which keeps its own unit.
func AsUnit(e Expr, q Quantity, d Dim, k Kind) (Quantity, bool) {
	l := litOf(e)
	if l == nil || !l.bare || !q.Dim.IsDimensionless() {
		return q, false
	}
	l2 := *l
	l2.dim, l2.kind = d, k
	return Quantity{V: q.V, Dim: d, Kind: literalKind(&l2, q.V)}, true
}

// asParam reads an argument as its parameter expects: a number scaled by a
// prefix alone takes the parameter's unit (series(10k, 4K7) is in Ω,
// zc(100n) in F), and a part value given for an impedance becomes its
// impedance at the working frequency. Each reading is said in a note.
func (ev *Evaluator) asParam(a Expr, q Quantity, p Param) (Quantity, *Error) {
	if d, k, ok := paramUnit(p.Kind); ok {
		if q2, ok := AsUnit(a, q, d, k); ok {
			q = q2
			ev.Since = max(ev.Since, 2)
			ev.renote(a, fmt.Sprintf("read %q as %s (the unit %s takes)", ev.text(a), ev.Env.Context().Format.Rect(q), p.Name))
			return q, nil
		}
	}
	if (p.Kind == ParamImpedance || p.Kind == ParamImpedanceOrAdmittance) && (q.Dim == DimInductance || q.Dim == DimCapacitance) {
		ev.Since = max(ev.Since, 2)
		return ev.partZ(a, q)
	}
	return q, nil
}

// word reports an argument written as one of the function's bare words
// (and not a defined name), and which word.
func (ev *Evaluator) word(f *Func, a Expr) (string, bool) {
	nm, ok := a.(*Name)
	if !ok || f.Words == nil {
		return "", false
	}
	if _, defined := ev.Env.Lookup(nm.Name); defined {
		return "", false
	}
	return matchWord(nm.Name, f.Words)
}

// bind puts the arguments of a call in the order of the function's
// parameters: positional ones first as written, a bare word skipping
// optional parameters that are not words, then named ones by name. It
// returns, for each argument, the parameter it binds to (nil where the
// function declares none).
func (ev *Evaluator) bind(f *Func, c *Call) ([]Expr, []*Param, *Error) {
	npos := len(c.Args)
	if len(c.Named) > 0 {
		npos = c.Named[0].Index
	}
	at := func(n NamedArg, format string, a ...any) *Error {
		return &Error{Line: ev.Line, Col: n.Col, Len: n.Len, Msg: fmt.Sprintf(format, a...)}
	}
	if len(c.Named) > 0 && len(f.Params) == 0 {
		return nil, nil, at(c.Named[0], "%s takes no named arguments: write them in order %s", f.Name, f.ArgList())
	}
	slot := make([]int, len(f.Params))
	for i := range slot {
		slot[i] = -1
	}
	var extra []int // positional arguments past the last parameter
	pi := 0
	for i := 0; i < npos; i++ {
		if pi >= len(f.Params) {
			extra = append(extra, i)
			continue
		}
		if _, isWord := ev.word(f, c.Args[i]); isWord {
			for j := pi; j < len(f.Params); j++ {
				if f.Params[j].Kind == ParamWord {
					pi = j
					break
				}
				if !f.Params[j].Optional {
					break
				}
			}
		}
		slot[pi] = i
		pi++
	}
	for _, n := range c.Named {
		k := -1
		for j, p := range f.Params {
			if p.Name == n.Name {
				k = j
				break
			}
		}
		if k < 0 {
			for j, p := range f.Params {
				if equalFold(p.Name, n.Name) {
					k = j
					break
				}
			}
		}
		if k < 0 {
			return nil, nil, at(n, "%s has no parameter %q; its parameters are %s", f.Name, n.Name, paramNames(f))
		}
		if slot[k] >= 0 {
			return nil, nil, at(n, "%s: %s is given twice", f.Name, f.Params[k].Name)
		}
		slot[k] = n.Index
	}
	// exprs holds nil for a parameter skipped in a function that takes
	// gaps (Func.Gaps): the argument list then keeps the parameters' places
	var exprs []Expr
	var params []*Param
	gap := -1
	var skipped []int // parameters skipped since the last one given
	for j := range f.Params {
		if slot[j] < 0 {
			if !f.Params[j].Optional {
				if len(c.Named) == 0 {
					continue // the count check reports it, as before
				}
				col := c.col
				return nil, nil, &Error{Line: ev.Line, Col: col, Len: utf8.RuneCountInString(c.Fun),
					Msg: fmt.Sprintf("%s: argument %s (%s) is missing", f.Name, f.Params[j].Name, f.Params[j].Kind)}
			}
			if gap < 0 {
				gap = j
			}
			skipped = append(skipped, j)
			continue
		}
		switch {
		case f.Gaps:
			for _, k := range skipped {
				exprs = append(exprs, nil)
				params = append(params, &f.Params[k])
			}
			skipped = skipped[:0]
		case gap >= 0 && f.Params[j].Kind != ParamWord:
			return nil, nil, at(namedAt(c, slot[j]), "%s: %s needs %s as well (give both, by name or in order)", f.Name, f.Params[j].Name, f.Params[gap].Name)
		}
		exprs = append(exprs, c.Args[slot[j]])
		params = append(params, &f.Params[j])
	}
	for _, i := range extra {
		exprs = append(exprs, c.Args[i])
		if p, ok := f.paramFor(len(exprs) - 1); ok {
			params = append(params, &p)
		} else {
			params = append(params, nil)
		}
	}
	if len(f.Params) == 0 {
		params = make([]*Param, len(exprs))
	}
	return exprs, params, nil
}

// namedAt returns the name written before argument i, or a mark at the
// call when it was positional.
func namedAt(c *Call, i int) NamedArg {
	for _, n := range c.Named {
		if n.Index == i {
			return n
		}
	}
	_, _, col := c.Args[i].Span()
	return NamedArg{Col: col, Len: 1}
}

// paramNames lists a function's parameter names for messages.
func paramNames(f *Func) string {
	names := make([]string, len(f.Params))
	for i, p := range f.Params {
		names[i] = p.Name
	}
	return strings.Join(names, ", ")
}

// matchWord finds w among words, ignoring case.
func matchWord(w string, words []string) (string, bool) {
	for _, x := range words {
		if equalFold(w, x) {
			return x, true
		}
	}
	return "", false
}

func equalFold(a, b string) bool {
	if len(a) != len(b) {
		return false
	}
	for i := 0; i < len(a); i++ {
		x, y := a[i], b[i]
		if 'A' <= x && x <= 'Z' {
			x += 'a' - 'A'
		}
		if 'A' <= y && y <= 'Z' {
			y += 'a' - 'A'
		}
		if x != y {
			return false
		}
	}
	return true
}
