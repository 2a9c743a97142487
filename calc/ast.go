package calc

// Expr is a node of a parsed expression. Pos and End are byte offsets of
// the node's text in the statement; Col is its 1-based column.
type Expr interface {
	Span() (pos, end, col int)
}

type span struct{ pos, end, col int }

func (s span) Span() (int, int, int) { return s.pos, s.end, s.col }

// Lit is a number with an optional unit: 4.7 kΩ, j12 V, 30°.
type Lit struct {
	span
	Val     complex128 // the number as written, before the unit's scale
	Unit    string     // the unit as written, "" when none
	scale   float64
	dim     Dim
	kind    Kind
	hasUnit bool
	distrib bool // unit given by the imaginary part of a rectangular literal
	// imag marks a number written with j (j0, j600): its value lies on the
	// imaginary axis as written, even when that value is zero.
	imag bool
	// bare marks a number scaled by a prefix alone (4.7k): a plain number
	// that takes Ω when combined with an impedance.
	bare bool
	// Note says how the number was read when not exactly as written;
	// since is the language version that introduced that reading.
	Note  string
	since int
	// num is the number as written (digits, point, exponent), so that a
	// power-of-ten scale is applied in decimal rather than by a binary
	// multiplication: 333.33333333333331 mΩ is the float64 nearest that
	// decimal value, as 17 digits shown promise.
	num string
}

// Since returns the language version that introduced the reading of the
// literal, 0 when it reads as every version reads it.
func (l *Lit) Since() int { return l.since }

// Name is a reference to a named quantity or constant.
type Name struct {
	span
	Name string
}

// Unary is −x or +x.
type Unary struct {
	span
	Op string
	X  Expr
}

// Binary is x op y for + − * / ^ ||.
type Binary struct {
	span
	Op    string
	X, Y  Expr
	OpCol int // column of the operator, where errors point
}

// Polar is mag∠angle. A bare number as angle is in the worksheet's angle
// unit; a value marked as an angle (30°, 0.5 rad, arg(z)) is used as is.
type Polar struct {
	span
	Mag, Ang Expr
	OpCol    int
	Unit     string // a unit written after the angle, applying to the whole
	scale    float64
	dim      Dim
	kind     Kind
}

// Call is f(args). Args are in the order written; Named marks those
// written as NAME = EXPR, which follow any positional ones.
type Call struct {
	span
	Fun   string
	Args  []Expr
	Named []NamedArg
}

// NamedArg is the name written before an argument: Args[Index] of its
// call, named Name at column Col.
type NamedArg struct {
	Index    int
	Name     string
	Col, Len int
}

// Walk calls fn for e and each node below it, depth first.
func Walk(e Expr, fn func(Expr)) {
	if e == nil {
		return
	}
	fn(e)
	switch n := e.(type) {
	case *Unary:
		Walk(n.X, fn)
	case *Binary:
		Walk(n.X, fn)
		Walk(n.Y, fn)
	case *Polar:
		Walk(n.Mag, fn)
		Walk(n.Ang, fn)
	case *Paren:
		Walk(n.X, fn)
	case *Call:
		for _, a := range n.Args {
			Walk(a, fn)
		}
	}
}
