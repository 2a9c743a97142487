package calc

import (
	"errors"
	"fmt"
	"strings"
	"unicode/utf8"
)

// ErrOpenCircuit reports a parallel combination whose admittances cancel:
// the equivalent impedance is infinite, which is an open circuit rather than
// an arithmetic failure.
var ErrOpenCircuit = errors.New("open circuit: the admittances cancel (parallel resonance), so the impedance is infinite")

// DimError reports + or − (or ‖) of unlike dimensions.
type DimError struct {
	Op   string
	A, B Dim
}

func (e *DimError) Error() string {
	if e.Op == "," {
		return fmt.Sprintf("cannot combine %s and %s: the units differ", DimName(e.A, false), DimName(e.B, false))
	}
	return fmt.Sprintf("cannot combine %s %s %s: the units differ", DimName(e.A, false), e.Op, DimName(e.B, false))
}

// openCircuit is an open circuit with a message of its own, such as a
// 0 F capacitor; errors.Is(err, ErrOpenCircuit) holds for it.
type openCircuit string

func (e openCircuit) Error() string        { return string(e) }
func (e openCircuit) Is(target error) bool { return target == ErrOpenCircuit }

// CycleError reports a product of a frequency in Hz with a quantity that
// would otherwise give an impedance, admittance or plain number.
type CycleError struct {
	Op   string
	A, B Dim
}

func (e *CycleError) Error() string {
	return fmt.Sprintf("%s %s %s is not a reactance: Hz counts cycles; use omega(f) (ω = 2π·f in rad/s), or w for the working ω",
		DimName(e.A, false), e.Op, DimName(e.B, false))
}

type plainError string

func (e plainError) Error() string { return string(e) }

func errorf(format string, args ...any) error {
	return plainError(fmt.Sprintf(format, args...))
}

// Error is an error located in a worksheet line or an expression: Line and
// Col are 1-based, Col counts characters (runes), and Len is the width of
// the offending text for the caret.
type Error struct {
	Line, Col, Len int
	Msg            string
	Err            error // the cause, such as ErrOpenCircuit, when there is one
	// Since is the language version (see Language) that began to refuse
	// what the error refuses, 0 when it always was: a worksheet written
	// in an older version lists the line as one that reads differently.
	Since int
}

// Unwrap returns the cause, so that errors.Is(err, ErrOpenCircuit) holds
// for an open circuit met while evaluating a line.
func (e *Error) Unwrap() error { return e.Err }

func (e *Error) Error() string {
	if e.Line > 0 {
		return fmt.Sprintf("line %d, col %d: %s", e.Line, e.Col, e.Msg)
	}
	return fmt.Sprintf("col %d: %s", e.Col, e.Msg)
}

// Caret returns the source line and a caret line under the error's place,
// for a person to read: the line as Printable shows it, then spaces and ^
// marks. Each character escaped by Printable takes as many columns as its
// escape, so the caret stays under the character it marks; any other
// character takes one column. A line feed inside the line is escaped too,
// so that the caret follows the one line it marks.
func Caret(src string, e *Error) string {
	// the shown form of each character, as Col counts them (an invalid
	// byte is one character)
	var cells []string
	for i := 0; i < len(src); {
		r, n := utf8.DecodeRuneInString(src[i:])
		c := src[i : i+n]
		switch {
		case r == '\n':
			c = `\x0a`
		default:
			if esc := escapeOf(r, n, src[i]); esc != "" {
				c = esc
			}
		}
		cells = append(cells, c)
		i += n
	}
	col := e.Col
	if col < 1 {
		col = 1
	}
	if col > len(cells)+1 {
		col = len(cells) + 1
	}
	n := e.Len
	if n < 1 {
		n = 1
	}
	if col-1+n > len(cells)+1 {
		n = len(cells) + 1 - (col - 1)
	}
	// width in columns of the characters [from, to); the end of the line
	// counts one, for a caret after the last character
	width := func(from, to int) int {
		w := 0
		for i := from; i < to; i++ {
			if i >= len(cells) || len(cells[i]) == 1 || cells[i][0] != '\\' {
				w++
				continue
			}
			w += len(cells[i])
		}
		return w
	}
	// A line longer than caretSpan characters is shown around the place
	// only, cut ends marked "…": a pasted line of 70 000 characters is
	// not written out again under its error.
	from, to, head, tail := 0, len(cells), "", ""
	if len(cells) > caretSpan {
		from = max(0, col-1-caretSpan/3)
		to = min(len(cells), max(col-1+min(n, caretSpan/3), from+caretSpan))
		n = min(n, to+1-(col-1))
		if from > 0 {
			head = "…"
		}
		if to < len(cells) {
			tail = "…"
		}
	}
	pad := utf8.RuneCountInString(head) + width(from, col-1)
	return head + strings.Join(cells[from:to], "") + tail + "\n" + strings.Repeat(" ", pad) + strings.Repeat("^", width(col-1, col-1+n))
}

// caretSpan is the most characters of a line Caret shows.
const caretSpan = 120
