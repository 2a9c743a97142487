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
	TokOp            // + - * / ^ ( ) , = ∠ || and their Unicode forms
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
}

// NewScanner returns a scanner over src, reporting errors on the given line.
func NewScanner(src string, line int) *Scanner {
	return &Scanner{src: src, col: 1, line: line}
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
	switch {
	case isDigit(r) || (r == '.' && s.digitAt(s.off+1)):
		s.number()
		text := s.src[start:s.off]
		// 4j or 4.5i: an imaginary literal, unless a longer word follows.
		// The text is normalised to the j4 form, which the parser reads.
		if c, w := s.peekRune(s.off); (c == 'j' || c == 'i') && !s.identPartAt(s.off+w) {
			s.off += w
			s.col++
			return item(TokImag, "j"+text)
		}
		if s.rect() {
			return item(TokRect, s.src[start:s.off])
		}
		return item(TokNumber, text)
	case (r == 'j' || r == 'i') && (s.digitAt(s.off+1) || (s.byteAt(s.off+1) == '.' && s.digitAt(s.off+2))):
		s.off++
		s.col++
		s.number()
		return item(TokImag, "j"+s.src[start+1:s.off])
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
	case '+', '*', '/', '^', '(', ')', ',', '=':
		adv(1)
		return item(TokOp, string(r))
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
	for s.digitAt(s.off) {
		s.off++
		s.col++
	}
	if s.byteAt(s.off) == '.' && s.digitAt(s.off+1) {
		s.off++
		s.col++
		for s.digitAt(s.off) {
			s.off++
			s.col++
		}
	} else if s.byteAt(s.off) == '.' && !s.identPartAt(s.off+1) {
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
