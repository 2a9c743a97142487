package calc

import (
	"fmt"
	"strings"
	"unicode"
	"unicode/utf8"
)

// Token kinds.
type Token uint8

const (
	TokEOF     Token = iota
	TokIllegal       // a character that starts no token
	TokNumber        // 12, 4.7e3, .5
	TokImag          // j4, 4j, i2.5, j (alone: the imaginary unit)
	TokIdent         // a name, a unit word, a keyword; also ° and %
	TokOp            // + - * / ^ ( ) , = ∠ || and their Unicode forms; ";" reads "," under the decimal comma
	TokRect          // 3+j4, 3-j4, 3+4j written without spaces: one complex number
)

// MaxLine is the longest statement argand reads, in bytes. Longer input is
// an error rather than a silent cut.
const MaxLine = 1 << 16

// MaxDepth bounds the nesting of parentheses, calls and unary operators,
// so that hostile input cannot exhaust the stack.
const MaxDepth = 200

// Item is one scanned token with its place. Off and End are byte offsets in
// the source; Col is the 1-based column counted in characters.
type Item struct {
	Tok  Token
	Text string // operators are normalised: "−" and "-" both read "-"
	Off  int
	End  int
	Col  int
	// Space reports white space before the token, which decides whether a
	// letter after a number is a unit ("4.7k") or a separate word.
	Space bool
}

// Scanner splits one statement into tokens. Like go/scanner it is
// hand-written, tracks positions and keeps the first error.
type Scanner struct {
	src  string
	off  int
	col  int
	line int
	err  *Error
	// comma selects the decimal comma: ',' marks the decimal and ';'
	// separates arguments (SI Brochure 9th ed. §5.4.4 allows either marker)
	comma bool
	// parens counts the parentheses open, so that a refused "2,2" inside
	// a call can also say how to write two arguments
	parens int
	// since is the newest language version whose reading a token used:
	// 3 for a decimal comma or a ';' between arguments (see Language)
	since int
}

// NewScanner returns a scanner over src, reporting errors on the given
// line, with the decimal point.
func NewScanner(src string, line int) *Scanner {
	return &Scanner{src: src, col: 1, line: line}
}

// NewScannerComma returns a scanner over src that reads the decimal comma
// when comma is set: 2,2 is two point two and ';' separates arguments.
func NewScannerComma(src string, line int, comma bool) *Scanner {
	return &Scanner{src: src, col: 1, line: line, comma: comma}
}

// mark returns the decimal marker the scanner reads, and the other one.
func (s *Scanner) mark() (own, other byte) {
	if s.comma {
		return ',', '.'
	}
	return '.', ','
}

// Err returns the first error met, or nil.
func (s *Scanner) Err() *Error { return s.err }

func (s *Scanner) fail(col, n int, msg string) {
	if s.err == nil {
		s.err = &Error{Line: s.line, Col: col, Len: n, Msg: msg}
	}
}

func (s *Scanner) peekRune(at int) (rune, int) {
	if at >= len(s.src) {
		return -1, 0
	}
	return utf8.DecodeRuneInString(s.src[at:])
}

// isIdentStart reports letters, including Ω, µ and π, and '_'.
func isIdentStart(r rune) bool {
	return r == '_' || unicode.IsLetter(r)
}

func isIdentPart(r rune) bool {
	return isIdentStart(r) || unicode.IsDigit(r) || r == '.'
}

func isDigit(r rune) bool { return r >= '0' && r <= '9' }

// Scan returns the next token. At the end it returns TokEOF repeatedly.
func (s *Scanner) Scan() Item {
	space := false
	for s.off < len(s.src) {
		r, w := s.peekRune(s.off)
		if isSpace(r) {
			s.off += w
			s.col++
			space = true
			continue
		}
		break
	}
	start, col := s.off, s.col
	item := func(t Token, text string) Item {
		return Item{Tok: t, Text: text, Off: start, End: s.off, Col: col, Space: space}
	}
	if s.off >= len(s.src) {
		return item(TokEOF, "")
	}
	r, w := s.peekRune(s.off)
	if r == utf8.RuneError && w == 1 {
		s.fail(col, 1, "invalid UTF-8 byte in the input")
		s.off++
		s.col++
		return item(TokIllegal, "\ufffd")
	}
	adv := func(n int) {
		for i := 0; i < n; i++ {
			_, w := s.peekRune(s.off)
			s.off += w
			s.col++
		}
	}
	own, _ := s.mark()
	switch {
	case isDigit(r) || (r == rune(own) && s.digitAt(s.off+1)):
		s.number()
		s.timesTen()
		if s.otherAt(s.off) {
			return s.otherMark(start, col, space, s.off)
		}
		text := s.numText(s.src[start:s.off])
		// 4j or 4.5i: an imaginary literal, unless a longer word follows.
		// The text is normalised to the j4 form, which the parser reads.
		if c, w := s.peekRune(s.off); (c == 'j' || c == 'i') && !s.identPartAt(s.off+w) {
			s.off += w
			s.col++
			return item(TokImag, "j"+text)
		}
		if s.rect() {
			if s.otherAt(s.off) {
				return s.otherMark(start, col, space, s.off)
			}
			return item(TokRect, s.numText(s.src[start:s.off]))
		}
		return item(TokNumber, text)
	case s.comma && r == '.' && s.digitAt(s.off+1):
		// .5 under the decimal comma
		return s.otherMark(start, col, space, s.off)
	case (r == 'j' || r == 'i') && (s.digitAt(s.off+1) || (s.byteAt(s.off+1) == own && s.digitAt(s.off+2))):
		s.off++
		s.col++
		s.number()
		s.timesTen()
		if s.otherAt(s.off) {
			return s.otherMark(start, col, space, s.off)
		}
		return item(TokImag, "j"+s.numText(s.src[start+1:s.off]))
	case isIdentStart(r):
		for s.off < len(s.src) {
			c, w := s.peekRune(s.off)
			if !isIdentPart(c) {
				break
			}
			s.off += w
			s.col++
		}
		text := s.src[start:s.off]
		if text == "j" || text == "i" {
			return item(TokImag, "j1")
		}
		// U+2126 OHM SIGN, which phones and older programs send, reads as
		// the letter omega (Unicode gives it as the canonical equivalent)
		text = strings.ReplaceAll(text, "\u2126", "\u03a9")
		return item(TokIdent, text)
	}
	switch r {
	case '°', '%':
		adv(1)
		return item(TokIdent, string(r))
	case '(':
		s.parens++
		adv(1)
		return item(TokOp, "(")
	case ')':
		s.parens--
		adv(1)
		return item(TokOp, ")")
	case '+', '*', '/', '^', '=':
		adv(1)
		return item(TokOp, string(r))
	case ',':
		adv(1)
		if s.comma {
			s.fail(col, 1, "with the decimal comma set, ',' marks the decimal: separate arguments with ';', as in parallel(2,2 kΩ; 4,7 kΩ)")
			return item(TokIllegal, ",")
		}
		return item(TokOp, ",")
	case ';':
		adv(1)
		if !s.comma {
			s.fail(col, 1, "';' separates arguments only with the decimal comma set: write ',', as in parallel(2.2 kΩ, 4.7 kΩ)")
			return item(TokIllegal, ";")
		}
		s.since = max(s.since, 3)
		return item(TokOp, ",")
	case '-', '−':
		adv(1)
		return item(TokOp, "-")
	case '·', '×':
		adv(1)
		return item(TokOp, "*")
	case '÷':
		adv(1)
		return item(TokOp, "/")
	case '∠', '@':
		adv(1)
		return item(TokOp, "∠")
	case '‖':
		adv(1)
		return item(TokOp, "||")
	case '|':
		if s.byteAt(s.off+1) == '|' {
			adv(2)
			return item(TokOp, "||")
		}
		adv(1)
		s.fail(col, 1, "a single '|': write || for parallel")
		return item(TokIllegal, "|")
	case '<', '>', '!':
		adv(1)
		if s.byteAt(s.off) == '=' {
			adv(1)
		}
		return item(TokOp, s.src[start:s.off])
	}
	adv(1)
	s.fail(col, 1, "unexpected "+quoteRune(r))
	return item(TokIllegal, string(r))
}

// isSpace reports the characters read as a space between tokens: the
// ASCII ones and the no-break (U+00A0), narrow no-break (U+202F) and thin
// (U+2009) spaces that phones and word processors put between a number
// and its unit.
func isSpace(r rune) bool {
	switch r {
	case ' ', '\t', '\r', '\n', '\u00a0', '\u202f', '\u2009':
		return true
	}
	return false
}

// quoteRune names a refused character for a message: by code point when
// it cannot be seen (controls, format characters such as a zero-width
// space or a byte-order mark, other spaces), else quoted.
func quoteRune(r rune) string {
	if r < 0x20 || r == 0x7f || unicode.IsControl(r) || unicode.Is(unicode.Cf, r) || unicode.IsSpace(r) ||
		unicode.Is(unicode.Zs, r) || unicode.Is(unicode.Co, r) || !unicode.IsGraphic(r) {
		name := "U+" + hex4(int(r))
		if r > 0xffff {
			name = fmt.Sprintf("U+%X", r)
		}
		return "invisible character " + name
	}
	return "character '" + string(r) + "'"
}

func hex4(n int) string {
	const h = "0123456789ABCDEF"
	return string([]byte{h[n>>12&15], h[n>>8&15], h[n>>4&15], h[n&15]})
}

func (s *Scanner) byteAt(i int) byte {
	if i < len(s.src) {
		return s.src[i]
	}
	return 0
}

func (s *Scanner) digitAt(i int) bool { return isDigit(rune(s.byteAt(i))) }

func (s *Scanner) identPartAt(i int) bool {
	r, _ := s.peekRune(i)
	return r >= 0 && isIdentPart(r)
}

// number scans digits, a fraction and an exponent. An "e" not followed by
// digits is left for the next token (it may start a unit word).
func (s *Scanner) number() {
	own, _ := s.mark()
	n := 0
	for s.digitAt(s.off) {
		s.off++
		s.col++
		n++
	}
	if n > 0 && n <= 3 {
		s.groups()
	}
	if s.byteAt(s.off) == own && s.digitAt(s.off+1) {
		s.off++
		s.col++
		for s.digitAt(s.off) {
			s.off++
			s.col++
		}
	} else if s.byteAt(s.off) == '.' && own == '.' && !s.identPartAt(s.off+1) {
		s.off++ // "5." is five
		s.col++
	}
	if c := s.byteAt(s.off); c == 'e' || c == 'E' {
		n := 1
		if d := s.byteAt(s.off + 1); d == '+' || d == '-' {
			n = 2
		}
		if s.digitAt(s.off + n) {
			s.off += n
			s.col += n
			for s.digitAt(s.off) {
				s.off++
				s.col++
			}
		}
	}
}

// timesTen reads a power-of-ten factor written after a number's digits,
// ×10^-21 or in ASCII *10^-21, as part of the number: that is how a size
// beyond the SI prefixes is shown (10.00×10^-21), and what is shown reads
// back as the one number it is, unit and all (j314.2×10^300 Ω). A power
// followed by another ^ or a point is left to the operators.
func (s *Scanner) timesTen() {
	rest := s.src[s.off:]
	var n int
	switch {
	case strings.HasPrefix(rest, "×10^"):
		n = len("×10^")
	case strings.HasPrefix(rest, "*10^"):
		n = len("*10^")
	default:
		return
	}
	i := s.off + n
	if c := s.byteAt(i); c == '-' || c == '+' {
		i++
	}
	j := i
	for s.digitAt(j) {
		j++
	}
	if j == i || j-i > 4 {
		return
	}
	if c := s.byteAt(j); c == '^' || c == '.' || c == ',' && s.comma && s.digitAt(j+1) {
		return
	}
	s.col += utf8.RuneCountInString(s.src[s.off:j])
	s.off = j
}

// groups reads the digit groups of a whole number written with a space
// between groups of three, as the SI Brochure (9th ed. §5.4.4) writes
// 1 000 000: a space followed by exactly three digits continues the number.
// The first group (already read) has one to three digits.
func (s *Scanner) groups() {
	for {
		r, w := s.peekRune(s.off)
		if r != ' ' && r != '\u00a0' && r != '\u202f' && r != '\u2009' {
			return
		}
		at := s.off + w
		if !s.digitAt(at) || !s.digitAt(at+1) || !s.digitAt(at+2) || s.digitAt(at+3) {
			return
		}
		s.off = at + 3
		s.col += 4
	}
}

// otherAt reports the decimal marker not in force at byte i, with a digit
// after it: 2,2 under the decimal point.
func (s *Scanner) otherAt(i int) bool {
	_, other := s.mark()
	return s.byteAt(i) == other && s.digitAt(i+1)
}

// numText is the text of a number as the parser reads it: digit groups
// joined and the decimal marker a point.
func (s *Scanner) numText(t string) string {
	if i := strings.Index(t, "10^"); i > 0 && (strings.HasSuffix(t[:i], "×") || strings.HasSuffix(t[:i], "*")) {
		// m×10^e is the number me±e
		k := strings.LastIndexAny(t[:i], "×*")
		t = t[:k] + "e" + t[i+len("10^"):]
	}
	if strings.ContainsAny(t, " \u00a0\u202f\u2009") {
		t = strings.Map(func(r rune) rune {
			if isSpace(r) {
				return -1
			}
			return r
		}, t)
	}
	if s.comma && strings.Contains(t, ",") {
		t = strings.ReplaceAll(t, ",", ".")
		s.since = max(s.since, 3)
	}
	return t
}

// otherMark refuses a number written with the decimal marker not in force
// (2,2 under the decimal point, 2.2 under the decimal comma), the marker
// at byte at, and says what to type. A marker followed by exactly three
// digits (1,000) may also be a digit group, so both readings are listed:
// the SI Brochure (9th ed. §5.4.4) writes digit groups with a space, never
// with a point or a comma.
func (s *Scanner) otherMark(start, col int, space bool, at int) Item {
	own, other := s.mark()
	// the digits before the marker, and the text of the token before them
	run := at
	for run > start && s.digitAt(run-1) {
		run--
	}
	head := s.src[start:run]
	// the run of digits and markers as typed: 1,000,000 or 2,2 or 1,000.5
	groups := []string{s.src[run:at]}
	if groups[0] == "" {
		groups[0] = "0"
	}
	var seps []byte
	i := at
	for {
		c := s.byteAt(i)
		if (c == other || c == own) && s.digitAt(i+1) {
			seps = append(seps, c)
			j := i + 1
			for s.digitAt(j) {
				j++
			}
			groups = append(groups, s.src[i+1:j])
			i = j
			continue
		}
		break
	}
	s.off = i
	typed := s.src[start:s.off]
	n := utf8.RuneCountInString(typed)
	s.col = col + n
	unit := ""
	if sc := *s; true {
		sc.err = nil
		if t := sc.Scan(); t.Tok == TokIdent && isIdentStart([]rune(t.Text)[0]) {
			unit = " " + t.Text
		}
	}
	setting := "decimal comma"
	if s.comma {
		setting = "decimal point"
	}
	bad := Item{Tok: TokIllegal, Text: typed, Off: start, End: s.off, Col: col, Space: space}
	if !s.comma && s.err == nil {
		// language 2 read 2,2 as two numbers; the refusal is language 3's
		defer func() {
			if s.err != nil {
				s.err.Since = 3
			}
		}()
	}
	// groups of three after the first, each marked with the other marker
	// (the last may be the own marker, as in 1,000.5): digit groups
	grouped := head == "" && len(groups[0]) <= 3
	for k, sp := range seps {
		if sp != other && k != len(seps)-1 || sp == other && len(groups[k+1]) != 3 {
			grouped = false
		}
	}
	switch {
	case strings.HasSuffix(head, string(own)):
		// 1.5,2: the number already has its decimal part
		sep := ","
		if s.comma {
			sep = ";"
		}
		s.fail(col, n, fmt.Sprintf("%q has two decimal markers: for two arguments write %s%s%s %s", typed, head, groups[0], sep, groups[1]))
	case len(seps) == 1 && len(groups[1]) == 3 && head == "":
		// 1,000: one, or one thousand
		a, b := groups[0], groups[1]
		s.fail(col, n, fmt.Sprintf("%q reads two ways: %s%c%s%s with a %s, or %s %s%s with the %c grouping digits (digit groups are written with a space, SI Brochure §5.4.4): write the one you mean, or set %s for the first",
			typed+unit, a, own, b, unit, setting, a, b, unit, other, setting))
	case grouped && len(seps) > 1:
		whole := strings.Join(groups[:len(groups)-1], " ")
		last := groups[len(groups)-1]
		if seps[len(seps)-1] == own {
			whole += string(own) + last
		} else {
			whole += " " + last
		}
		s.fail(col, n, fmt.Sprintf("digit groups are written with a space (SI Brochure §5.4.4): write %s%s", whole, unit))
	default:
		// 2,2: a decimal written with the other marker
		a, b := groups[0], groups[1]
		msg := fmt.Sprintf("%s? write %s%s%c%s%s, or set %s", setting, head, a, own, b, unit, setting)
		if !s.comma && s.parens > 0 && head == "" {
			msg += fmt.Sprintf(" (for two arguments write %s, %s)", a, b)
		}
		s.fail(col, n, msg)
	}
	return bad
}

// rect extends a number just scanned into a rectangular literal when a sign
// and an imaginary part follow with no space between: 3+j4, 3-j4.5, 3+4j.
// Written that way an engineer reads one complex number, so it binds as
// one: 2*3+j4 is 2·(3+j4). With spaces, 3 + j4 is a sum as usual.
func (s *Scanner) rect() bool {
	c := s.byteAt(s.off)
	if c != '+' && c != '-' {
		return false
	}
	save := *s
	s.off++
	s.col++
	if d := s.byteAt(s.off); (d == 'j' || d == 'i') && (s.digitAt(s.off+1) || s.byteAt(s.off+1) == '.' && s.digitAt(s.off+2)) {
		s.off++
		s.col++
		s.number()
		if !s.identPartAt(s.off) || !s.imagSuffixAt(s.off) {
			return true
		}
	} else if s.digitAt(s.off) || d == '.' && s.digitAt(s.off+1) {
		s.number()
		if c, w := s.peekRune(s.off); (c == 'j' || c == 'i') && !s.identPartAt(s.off+w) {
			s.off += w
			s.col++
			return true
		}
	}
	*s = save
	return false
}

// imagSuffixAt reports a j or i right after the digits of j4 (as in j4j),
// which makes the text no rectangular literal.
func (s *Scanner) imagSuffixAt(i int) bool {
	c := s.byteAt(i)
	return (c == 'j' || c == 'i') && !s.identPartAt(i+1)
}

// ChangeMarker rewrites a statement typed under one decimal marker for the
// other: under the comma, 2.2 becomes 2,2 and the ',' between arguments
// ';'; and back. Names, units and the rest, even what the scanner refuses,
// are kept as typed: a number written with the other marker already stays
// refused.
func ChangeMarker(src string, fromComma bool) string {
	s := NewScannerComma(src, 1, fromComma)
	own, other := s.mark()
	sep, osep := byte(','), byte(';')
	if fromComma {
		sep, osep = ';', ','
	}
	var b strings.Builder
	last := 0
	for i := 0; i <= MaxLine; i++ {
		t := s.Scan()
		if t.Tok == TokEOF {
			break
		}
		b.WriteString(src[last:t.Off])
		text := src[t.Off:t.End]
		switch t.Tok {
		case TokNumber, TokImag, TokRect:
			if text[len(text)-1] == own {
				text = text[:len(text)-1] // "5." is five
			}
			text = strings.ReplaceAll(text, string(own), string(other))
		case TokOp:
			if text == string(sep) {
				text = string(osep)
			}
		}
		b.WriteString(text)
		last = t.End
	}
	b.WriteString(src[last:])
	return b.String()
}
