package calc

import (
	"fmt"
	"math"
	"strconv"
	"strings"
	"unicode/utf8"
)

// Parser reads expressions by recursive descent, one token of look-ahead,
// keeping the first error with its place. The worksheet's statement parser
// drives the same Parser, so statements and expressions share one scanner.
//
// Precedence, loosest first (each level binds tighter than the one above):
//
//	sums        a + b, a − b
//	parallel    a || b       (so a + b || c is a + (b || c))
//	products    a * b, a / b, and their forms · × ÷
//	sign        −a, +a
//	polar       m∠θ, m @ θ
//	powers      a ^ b        (right to left)
type Parser struct {
	src   string
	line  int
	s     *Scanner
	tok   Item
	depth int
	err   *Error
	since int // the newest language version whose reading a literal used
	comma bool
}

// Since returns the newest language version (see Language) whose reading
// of a number or unit the statement used so far, 0 when every version
// reads it alike.
func (p *Parser) Since() int { return max(p.since, p.s.since) }

// NewParser returns a parser over one statement, with the decimal point.
func NewParser(src string, line int) *Parser { return NewParserComma(src, line, false) }

// NewParserComma returns a parser over one statement that reads the
// decimal comma when comma is set: 2,2 mH, and ';' between arguments.
func NewParserComma(src string, line int, comma bool) *Parser {
	p := &Parser{src: src, line: line, comma: comma}
	if len(src) > MaxLine {
		p.err = &Error{Line: line, Col: 1, Len: 1, Msg: fmt.Sprintf("line too long: %d bytes (the limit is %d)", len(src), MaxLine)}
		p.s = NewScanner("", line)
		p.tok = Item{Tok: TokEOF, Col: 1}
		return p
	}
	p.s = NewScannerComma(src, line, comma)
	p.next()
	return p
}

// Err returns the first error, from the scanner or the parser.
func (p *Parser) Err() *Error {
	if p.err != nil {
		return p.err
	}
	return p.s.Err()
}

// Peek returns the current token without consuming it.
func (p *Parser) Peek() Item { return p.tok }

// PeekNext returns the token after the current one without consuming
// either: a statement that starts with a word tells a keyword (frequency
// 60 Hz) from a call (thevenin(…)) or a definition (frequency = 2) by the
// token that follows, without reading the line a second time.
func (p *Parser) PeekNext() Item {
	if p.tok.Tok == TokEOF {
		return p.tok
	}
	ahead := *p.s
	return ahead.Scan()
}

// Next consumes and returns the current token.
func (p *Parser) Next() Item {
	t := p.tok
	p.next()
	return t
}

func (p *Parser) next() { p.tok = p.s.Scan() }

// Text returns the source text of an expression.
func (p *Parser) Text(e Expr) string {
	pos, end, _ := e.Span()
	return p.src[pos:end]
}

// Source returns the statement being parsed.
func (p *Parser) Source() string { return p.src }

// Failf records an error at token t, unless one is already recorded.
func (p *Parser) Failf(t Item, format string, args ...any) {
	if p.Err() != nil {
		return
	}
	n := utf8.RuneCountInString(p.src[t.Off:t.End])
	if n == 0 {
		n = 1
	}
	p.err = &Error{Line: p.line, Col: t.Col, Len: n, Msg: fmt.Sprintf(format, args...)}
}

// FailAt records an error at a column.
func (p *Parser) FailAt(col, n int, format string, args ...any) {
	if p.Err() != nil {
		return
	}
	p.err = &Error{Line: p.line, Col: col, Len: n, Msg: fmt.Sprintf(format, args...)}
}

// Comma reports whether the parser reads the decimal comma.
func (p *Parser) Comma() bool { return p.comma }

// Sep is the separator of arguments as typed: ',' or, under the decimal
// comma, ';'.
func (p *Parser) Sep() string {
	if p.comma {
		return ";"
	}
	return ","
}

// IsOp reports whether the current token is the operator op.
func (p *Parser) IsOp(op string) bool { return p.tok.Tok == TokOp && p.tok.Text == op }

// IsWord reports whether the current token is the identifier w.
func (p *Parser) IsWord(w string) bool { return p.tok.Tok == TokIdent && p.tok.Text == w }

// EndCol returns the column just past the last token, for errors at the end.
func (p *Parser) EndCol() int {
	return utf8.RuneCountInString(p.src) + 1
}

// ParseExpr parses src as a single expression.
func ParseExpr(src string, line int) (Expr, *Error) { return ParseExprComma(src, line, false) }

// ParseExprComma parses src as a single expression, with the decimal
// comma when comma is set.
func ParseExprComma(src string, line int, comma bool) (Expr, *Error) {
	p := NewParserComma(src, line, comma)
	e := p.Expr()
	p.ExpectEnd()
	if err := p.Err(); err != nil {
		return nil, err
	}
	return e, nil
}

// ExpectEnd records an error if tokens remain.
func (p *Parser) ExpectEnd() {
	if p.Err() != nil || p.tok.Tok == TokEOF {
		return
	}
	t := p.tok
	t.Text = p.src[t.Off:t.End] // as typed: j4 may have been written 4j
	switch {
	case t.Tok == TokOp && t.Text == ")":
		p.Failf(t, "unbalanced parentheses: ')' without a matching '('")
	case t.Tok == TokIdent && IsUnit(t.Text):
		p.Failf(t, "unit %q must follow a number (as in 10 %s)", t.Text, t.Text)
	case t.Tok == TokIdent && prefixes[t.Text] != 0:
		p.Failf(t, "prefix %q must follow the number directly (as in 10%s) or come before a unit (as in 10 %sΩ)", t.Text, t.Text, t.Text)
	case t.Tok == TokIdent || t.Tok == TokNumber || t.Tok == TokImag || t.Tok == TokRect:
		p.Failf(t, "unexpected %q: missing operator? (write * to multiply)", t.Text)
	default:
		p.Failf(t, "unexpected %q", t.Text)
	}
}

func (p *Parser) enter() bool {
	p.depth++
	if p.depth > MaxDepth {
		p.Failf(p.tok, "expression nested too deeply (more than %d levels)", MaxDepth)
		return false
	}
	return true
}

func (p *Parser) leave() { p.depth-- }

// bad is a placeholder node after an error, so callers never see nil.
func (p *Parser) bad(t Item) Expr {
	return &Lit{span: span{t.Off, t.End, t.Col}, Val: 0}
}

// Expr parses an expression.
func (p *Parser) Expr() Expr {
	if !p.enter() {
		return p.bad(p.tok)
	}
	defer p.leave()
	return p.sum()
}

func spanOf(a, b Expr) span {
	pa, _, ca := a.Span()
	_, eb, _ := b.Span()
	return span{pa, eb, ca}
}

func (p *Parser) sum() Expr {
	x := p.parallel()
	for p.Err() == nil && (p.IsOp("+") || p.IsOp("-")) {
		op := p.Next()
		if op.Text == "-" && p.tok.Tok == TokRect {
			t := p.tok
			p.Failf(t, "ambiguous: write − (%s) to subtract the complex number, or put spaces around its sign", t.Text)
			return x
		}
		y := p.parallel()
		distribute(x, y)
		x = &Binary{span: spanOf(x, y), Op: op.Text, X: x, Y: y, OpCol: op.Col}
	}
	return x
}

// distribute gives the unit of the imaginary part of a rectangular literal
// to its bare real part, so "3+j4 Ω" is one impedance and "3+j4 kΩ" scales
// both parts. It applies only when the left operand is a bare real number
// literal: anything else keeps its own unit and a mismatch is an error, so
// the rule can never change a value silently.
func distribute(x, y Expr) {
	yl, ok := y.(*Lit)
	if !ok || !yl.hasUnit || real(yl.Val) != 0 {
		return
	}
	var xl *Lit
	switch n := x.(type) {
	case *Lit:
		xl = n
	case *Unary:
		xl, _ = n.X.(*Lit)
	}
	if xl == nil || xl.hasUnit || imag(xl.Val) != 0 {
		return
	}
	// both parts of the rectangular literal are one complex value, so
	// neither is read as a lone real of its unit (j0 VA is not an |S|)
	xl.hasUnit, xl.distrib, yl.distrib = true, true, true
	xl.Unit, xl.scale, xl.dim, xl.kind = yl.Unit, yl.scale, yl.dim, yl.kind
}

func (p *Parser) parallel() Expr {
	x := p.product()
	for p.Err() == nil && p.IsOp("||") {
		op := p.Next()
		y := p.product()
		x = &Binary{span: spanOf(x, y), Op: "||", X: x, Y: y, OpCol: op.Col}
	}
	return x
}

func (p *Parser) product() Expr {
	x := p.unary()
	for p.Err() == nil && (p.IsOp("*") || p.IsOp("/")) {
		op := p.Next()
		if p.tok.Tok == TokRect {
			p.Failf(p.tok, "ambiguous after %s: write (%s) for the complex number, or put spaces around its sign", op.Text, p.tok.Text)
			return x
		}
		y := p.unary()
		x = &Binary{span: spanOf(x, y), Op: op.Text, X: x, Y: y, OpCol: op.Col}
	}
	return x
}

func (p *Parser) unary() Expr {
	if p.IsOp("-") || p.IsOp("+") {
		if !p.enter() {
			return p.bad(p.tok)
		}
		defer p.leave()
		op := p.Next()
		if op.Text == "-" && p.tok.Tok == TokRect {
			// -3-j4 is the number −3 − j4: the sign belongs to the real part
			t := p.Next()
			e := p.literal(t)
			if l, ok := e.(*Lit); ok {
				l.Val = complex(-real(l.Val), imag(l.Val))
				l.pos, l.col = op.Off, op.Col
			}
			return p.polarAfter(e)
		}
		x := p.unary()
		_, end, _ := x.Span()
		return &Unary{span: span{op.Off, end, op.Col}, Op: op.Text, X: x}
	}
	return p.polar()
}

func (p *Parser) polar() Expr {
	return p.polarAfter(p.power())
}

// polarAfter reads an optional ∠angle after the magnitude x.
func (p *Parser) polarAfter(x Expr) Expr {
	if p.Err() != nil || !p.IsOp("∠") {
		return x
	}
	op := p.Next()
	if p.tok.Tok == TokEOF {
		p.Failf(op, "angle missing after %s", "∠")
		return x
	}
	ang := p.unary()
	n := &Polar{span: spanOf(x, ang), Mag: x, Ang: ang, OpCol: op.Col}
	// a physical unit written on the angle literal ("230∠-30 V") belongs
	// to the whole phasor
	if l := litOf(ang); l != nil && l.hasUnit && !l.bare && l.kind != KindAngle {
		n.Unit, n.scale, n.dim, n.kind = l.Unit, l.scale, l.dim, l.kind
		l.hasUnit, l.Unit, l.scale, l.dim, l.kind = false, "", 1, Dimensionless, KindPlain
	}
	// and so does one written after the angle's degree sign ("230∠-30° V")
	if p.tok.Tok == TokIdent {
		if u, ok := lookupUnit(p.tok.Text); ok && u.kind != KindAngle {
			t := p.Next()
			if n.Unit != "" {
				p.Failf(t, "two units on one phasor: %s and %s", n.Unit, t.Text)
				return n
			}
			n.Unit, n.scale, n.dim, n.kind = t.Text, u.scale, u.dim, u.kind
			n.end = t.End
		}
	}
	if n.Unit != "" {
		if l := litOf(x); l != nil && l.hasUnit && !l.bare {
			p.FailAt(n.col, utf8.RuneCountInString(p.src[n.pos:n.end]), "two units on one phasor: %s and %s", l.Unit, n.Unit)
		}
	}
	if p.IsOp("∠") {
		p.Failf(p.tok, "a phasor takes one angle: second ∠")
	}
	return n
}

// litOf returns the literal at the root of e, looking through a sign.
func litOf(e Expr) *Lit {
	switch n := e.(type) {
	case *Lit:
		return n
	case *Unary:
		return litOf(n.X)
	}
	return nil
}

func (p *Parser) power() Expr {
	x := p.primary()
	if p.Err() == nil && p.IsOp("^") {
		if !p.enter() {
			return x
		}
		defer p.leave()
		op := p.Next()
		if p.tok.Tok == TokRect {
			p.Failf(p.tok, "ambiguous after ^: write (%s) for the complex number, or put spaces around its sign", p.tok.Text)
			return x
		}
		y := p.unary() // right-assoc, and 2^-1 reads as expected
		return &Binary{span: spanOf(x, y), Op: "^", X: x, Y: y, OpCol: op.Col}
	}
	return x
}

func (p *Parser) primary() Expr {
	t := p.tok
	switch t.Tok {
	case TokNumber, TokImag, TokRect:
		p.next()
		return p.literal(t)
	case TokIdent:
		p.next()
		// a unit symbol standing alone is a name: units only ever follow
		// a number, so V, A, S and C are free for quantities
		if p.IsOp("(") {
			return p.call(t)
		}
		return &Name{span: span{t.Off, t.End, t.Col}, Name: t.Text}
	case TokOp:
		if t.Text == "(" {
			if !p.enter() {
				return p.bad(t)
			}
			defer p.leave()
			p.next()
			if p.IsOp(")") {
				p.Failf(p.tok, "empty parentheses")
				return p.bad(t)
			}
			x := p.sum()
			if !p.IsOp(")") {
				if p.tok.Tok == TokEOF {
					p.Failf(t, "unbalanced parentheses: '(' is never closed")
				} else {
					p.Failf(p.tok, "expected ')' to close the '(' at column %d, found %q", t.Col, p.src[p.tok.Off:p.tok.End])
				}
				return x
			}
			c := p.Next()
			return wrapParen(x, span{t.Off, c.End, t.Col})
		}
		if t.Tok == TokOp && t.Text == ")" {
			p.Failf(t, "unbalanced parentheses: ')' without a matching '('")
			return p.bad(t)
		}
	case TokEOF:
		if p.src == "" || len(p.src) == 0 {
			p.Failf(t, "empty input: nothing to evaluate")
		} else {
			p.FailAt(t.Col, 1, "expression ends too early: an operand is missing")
		}
		return p.bad(t)
	case TokIllegal:
		p.next()
		return p.bad(t)
	}
	p.Failf(t, "unexpected %q: an operand is missing", p.src[t.Off:t.End])
	p.next()
	return p.bad(t)
}

// Paren keeps the parentheses of a sub-expression, so that its text (as
// shown in steps) includes them and a rectangular literal inside stays one.
type Paren struct {
	span
	X Expr
}

func wrapParen(x Expr, s span) Expr { return &Paren{span: s, X: x} }

func isConstant(name string) bool {
	switch name {
	case "pi", "π", "e":
		return true
	}
	return false
}

func (p *Parser) call(name Item) Expr {
	if !p.enter() {
		return p.bad(name)
	}
	defer p.leave()
	open := p.Next() // (
	c := &Call{Fun: name.Text}
	if !p.IsOp(")") {
		for {
			// NAME = EXPR names the parameter the argument binds to
			label := ""
			if p.tok.Tok == TokIdent {
				sc := *p.s
				if nt := sc.Scan(); nt.Tok == TokOp && nt.Text == "=" {
					t := p.Next()
					p.next()
					label = t.Text
					c.Named = append(c.Named, NamedArg{Index: len(c.Args), Name: t.Text, Col: t.Col, Len: utf8.RuneCountInString(t.Text)})
				}
			}
			if label == "" && len(c.Named) > 0 {
				p.Failf(p.tok, "a positional argument cannot follow a named one in %s(…): name it too, or move it before %s =", name.Text, c.Named[0].Name)
				return c.finish(name, open)
			}
			c.Args = append(c.Args, p.sum())
			if p.Err() != nil {
				return c.finish(name, open)
			}
			if p.IsOp(",") {
				p.next()
				continue
			}
			break
		}
	}
	if !p.IsOp(")") {
		if p.tok.Tok == TokEOF {
			p.Failf(open, "unbalanced parentheses: '(' of %s( is never closed", name.Text)
		} else {
			p.Failf(p.tok, "expected '%s' or ')' in the arguments of %s, found %q", p.Sep(), name.Text, p.src[p.tok.Off:p.tok.End])
		}
		return c.finish(name, open)
	}
	closeTok := p.Next()
	c.span = span{name.Off, closeTok.End, name.Col}
	return c
}

func (c *Call) finish(name, open Item) Expr {
	c.span = span{name.Off, open.End, name.Col}
	return c
}

// literal finishes a number: its value and the unit written after it. A
// word directly after a number is its unit; so is a word after a space when
// it reads as a unit. "10 m" is ten metres; a prefix alone is no unit.
func (p *Parser) literal(t Item) Expr {
	l := &Lit{span: span{t.Off, t.End, t.Col}, scale: 1}
	text := t.Text
	if t.Tok == TokRect {
		re, im, ok := splitRect(text)
		if !ok {
			p.Failf(t, "malformed number %q", t.Text)
			return l
		}
		l.Val = complex(re, im)
		if math.IsInf(re, 0) || math.IsInf(im, 0) {
			p.Failf(t, "number too large: %s", t.Text)
		}
		return p.unit(l)
	}
	if t.Tok == TokImag {
		text = text[1:]
		if len(text) > 0 && text[len(text)-1] == 'j' {
			text = text[:len(text)-1]
		}
		if text == "" {
			text = "1"
		}
	}
	x, err := strconv.ParseFloat(text, 64)
	if err != nil {
		if ne, ok := err.(*strconv.NumError); ok && ne.Err == strconv.ErrRange {
			if x == 0 {
				x = 0 // underflow reads as zero
			} else {
				p.Failf(t, "number too large: %s", t.Text)
				return l
			}
		} else {
			p.Failf(t, "malformed number %q", t.Text)
			return l
		}
	}
	if t.Tok == TokImag {
		l.Val = complex(0, x)
		l.imag = true
	} else {
		l.Val = complex(x, 0)
	}
	l.num = text
	return p.unit(l)
}

// splitRect reads the two parts of a rectangular literal: 3+j4, 3-4j.
func splitRect(text string) (re, im float64, ok bool) {
	k := -1
	for i := 1; i < len(text); i++ {
		if (text[i] == '+' || text[i] == '-') && text[i-1] != 'e' && text[i-1] != 'E' {
			k = i
			break
		}
	}
	if k < 0 {
		return 0, 0, false
	}
	imText := strings.NewReplacer("j", "", "i", "").Replace(text[k+1:])
	var err1, err2 error
	re, err1 = strconv.ParseFloat(text[:k], 64)
	im, err2 = strconv.ParseFloat(imText, 64)
	if text[k] == '-' {
		im = -im
	}
	if e, ok := err1.(*strconv.NumError); ok && e.Err == strconv.ErrRange {
		err1 = nil
	}
	if e, ok := err2.(*strconv.NumError); ok && e.Err == strconv.ErrRange {
		err2 = nil
	}
	return re, im, err1 == nil && err2 == nil
}

// unit reads the unit written after a number, if any.
func (p *Parser) unit(l *Lit) Expr {
	defer func() { p.since = max(p.since, l.since) }()
	if p.IsOp("/") {
		// "50 /s": a unit word after a slash is a unit, since no name can
		// be a unit word; this is how a rate per second is written back
		sc := *p.s
		nt := sc.Scan()
		if u, ok := lookupUnit(nt.Text); ok && nt.Tok == TokIdent && !nt.Space {
			p.next()
			p.next()
			l.hasUnit, l.Unit, l.scale, l.dim, l.kind = true, "/"+nt.Text, 1/u.scale, u.dim.Pow(-1), KindPlain
			l.end = nt.End
			return l
		}
	}
	if p.tok.Tok != TokIdent {
		return l
	}
	word := p.tok
	num := p.src[l.pos:l.end]
	if _, exact := lookupUnit(word.Text); !exact && !word.Space {
		if p.code(l, num, word) || p.barePrefix(l, num, word) {
			return l
		}
		if p.Err() != nil {
			return l
		}
	}
	u, sym, rd, refuse, ok := readUnit(word.Text)
	if refuse != "" {
		p.Failf(word, "%s", refuse)
		return l
	}
	if !ok {
		if !word.Space {
			p.Failf(word, "%s", unknownUnit(num, word.Text))
		}
		return l
	}
	p.next()
	l.hasUnit, l.Unit, l.scale, l.dim, l.kind = true, word.Text, u.scale, u.dim, u.kind
	l.end = word.End
	if rd.since > 0 {
		l.Unit, l.since = sym, rd.since
		l.Note = readNote(p.src[l.pos:l.end], num, sym, rd.why)
	}
	// compound units: Ω/km, rad/s, V·A
	for (p.IsOp("/") || p.IsOp("*")) && p.Err() == nil {
		save := p.tok
		// look past the operator without consuming it
		sc := *p.s
		nt := sc.Scan()
		if nt.Tok != TokIdent || nt.Space {
			break
		}
		u2, ok := lookupUnit(nt.Text)
		if !ok {
			break
		}
		p.next()
		p.next()
		if save.Text == "/" {
			l.scale /= u2.scale
			l.dim = l.dim.Div(u2.dim)
		} else {
			l.scale *= u2.scale
			l.dim = l.dim.Mul(u2.dim)
		}
		switch {
		case l.kind == KindAngle && save.Text == "/" && u2.kind == KindPlain:
			// rad/s is an angular rate: it stays marked as angular
		case l.kind != u2.kind || save.Text == "/":
			l.kind = KindPlain
		}
		l.Unit += save.Text + nt.Text
		l.end = nt.End
	}
	return l
}

// readNote is the line a step shows for a number read other than exactly
// as written, such as: read "230 v" as 230 V.
func readNote(typed, num, sym, why string) string {
	n := fmt.Sprintf("read %q as %s %s", typed, num, sym)
	if why != "" {
		n += " (" + why + ")"
	}
	return n
}

// code reads a letter-and-digit code written directly after whole digits
// (IEC 60062): 4K7 is 4.7 kΩ, 0R1 is 0.1 Ω, 4n7 is 4.7 nF.
func (p *Parser) code(l *Lit, num string, word Item) bool {
	if !allDigits(num) {
		return false
	}
	scale, pre, sym, frac, ok := readCode(word.Text)
	if !ok {
		return false
	}
	text := num
	if frac != "" {
		text += "." + frac
	}
	x, err := strconv.ParseFloat(text, 64)
	if err != nil {
		p.Failf(word, "malformed code %q", num+word.Text)
		return true
	}
	p.next()
	l.Val, l.num = complex(x, 0), text
	l.hasUnit, l.Unit, l.scale, l.kind, l.end, l.since = true, pre+sym, scale, KindPlain, word.End, 2
	l.dim = DimImpedance
	if sym == "F" {
		l.dim = DimCapacitance
	}
	l.Note = fmt.Sprintf("read %q as %s %s%s (IEC 60062 code)", num+word.Text, text, pre, sym)
	return true
}

// barePrefix reads a prefix written directly after a number with no unit:
// 4.7k is 4700, a plain number. Written "1.2k ohm", the unit after a space
// completes it: 1.2 kΩ.
func (p *Parser) barePrefix(l *Lit, num string, word Item) bool {
	f, ok := bareOK[word.Text]
	if !ok {
		return false
	}
	p.next()
	l.end = word.End
	l.since = 2
	if p.tok.Tok == TokIdent && p.tok.Space {
		if u, sym, _, refuse, ok := readUnit(p.tok.Text); ok && refuse == "" && u.prefixable {
			ut := p.Next()
			l.hasUnit, l.Unit, l.scale, l.dim, l.kind, l.end = true, word.Text+sym, u.scale*f, u.dim, u.kind, ut.End
			pre := word.Text
			if pre == "u" {
				pre = "µ"
			}
			l.Note = readNote(p.src[l.pos:l.end], num, pre+symbolOf(sym), "")
			return true
		}
	}
	l.hasUnit, l.bare, l.Unit, l.scale, l.dim, l.kind = true, true, word.Text, f, Dimensionless, KindPlain
	// a reader may have meant 4.7 kΩ: say it is a plain number, until a
	// unit it takes (from a parameter, an element or an impedance beside
	// it) replaces this note with that reading
	l.Note = fmt.Sprintf("read %q as %s×10^%d, a plain number", num+word.Text, num, int(math.Round(math.Log10(f))))
	return true
}

// Renote replaces, in notes, the note of a number scaled by a prefix alone
// (the e of AsUnit) with note, the unit it was then given, so the step
// says how it was read in one line; note is added if e had none.
func Renote(notes []string, e Expr, note string) []string {
	if l := litOf(e); l != nil && l.bare && l.Note != "" {
		for i, n := range notes {
			if n == l.Note {
				out := append([]string(nil), notes[:i]...)
				out = append(out, note)
				return append(out, notes[i+1:]...)
			}
		}
	}
	return append(notes, note)
}

func allDigits(s string) bool {
	for i := 0; i < len(s); i++ {
		if !isDigit(rune(s[i])) {
			return false
		}
	}
	return s != ""
}

// unknownUnit explains a word written straight after a number that reads
// as nothing.
func unknownUnit(num, w string) string {
	switch w {
	case "R":
		return fmt.Sprintf("R after a number is the code letter for Ω (IEC 60062), written where the decimal sign goes: write %s Ω or a code such as 4R7", num)
	case "K":
		return fmt.Sprintf("K is no SI prefix: write %sk for kilo (a plain number), %s kΩ, or a code such as 4K7", num, num)
	case "a", "z", "y", "r", "q", "E", "P", "Z", "Y", "Q":
		return fmt.Sprintf("%q is not read as a prefix on input (only f p n u µ m k M G T are): write the power of ten, as in %se3", w, num)
	}
	if _, ok := prefixes[w[:1]]; ok {
		if _, sym, _, _, ok := readUnit(w[1:]); ok {
			return fmt.Sprintf("unit %q cannot take a prefix (write the value in %s)", w[1:], sym)
		}
	}
	return fmt.Sprintf("unknown unit %q", w)
}
