package calc

import (
	"errors"
	"fmt"
	"math"
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
	Steps []Step
	Notes []string
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
		return r, nil
	}
	q, err := ev.eval(e)
	if err != nil {
		return Result{}, err
	}
	r := Result{Value: q, Steps: ev.Steps, Notes: ev.Notes}
	ev.Steps, ev.Notes = nil, nil
	return r, nil
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
	switch n := e.(type) {
	case *Lit:
		v := n.Val
		if n.hasUnit {
			v *= complex(n.scale, 0)
			q, err := Quantity{V: v, Dim: n.dim, Kind: n.kind}.Check("number")
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
		if k == KindActive || k == KindReactive {
			k = KindApparent
		}
		if k == KindAngle {
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
		return r.Value, nil
	}
	return Quantity{}, ev.errAt(e, fmt.Errorf("cannot evaluate this expression"))
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
	if len(c.Args) < f.Min || (f.Max >= 0 && len(c.Args) > f.Max) {
		want := fmt.Sprintf("%d", f.Min)
		if f.Max < 0 {
			want = fmt.Sprintf("at least %d", f.Min)
		} else if f.Max != f.Min {
			want = fmt.Sprintf("%d to %d", f.Min, f.Max)
		}
		return Result{}, nameErr("%s takes %s argument(s) %s, got %d", c.Fun, want, f.Args, len(c.Args))
	}
	args := make([]Arg, len(c.Args))
	for i, a := range c.Args {
		args[i].Text = ev.text(a)
		if nm, ok := a.(*Name); ok && f.Words != nil {
			if _, defined := ev.Env.Lookup(nm.Name); !defined {
				if w, ok := matchWord(nm.Name, f.Words); ok {
					args[i].Word = w
					continue
				}
				return Result{}, ev.errAt(a, fmt.Errorf("%s: %q is neither a defined name nor one of %v", c.Fun, nm.Name, f.Words))
			}
		}
		q, err := ev.eval(a)
		if err != nil {
			return Result{}, err
		}
		args[i].Q = q
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
