package calc

import (
	"errors"
	"fmt"
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
// for a person to read: the line as given, then spaces and ^ marks.
func Caret(src string, e *Error) string {
	runes := []rune(src)
	col := e.Col
	if col < 1 {
		col = 1
	}
	if col > len(runes)+1 {
		col = len(runes) + 1
	}
	n := e.Len
	if n < 1 {
		n = 1
	}
	if col-1+n > len(runes)+1 {
		n = len(runes) + 1 - (col - 1)
	}
	pad := make([]rune, 0, col-1)
	for i := 0; i < col-1 && i < len(runes); i++ {
		if runes[i] == '\t' {
			pad = append(pad, '\t')
		} else {
			pad = append(pad, ' ')
		}
	}
	marks := ""
	for i := 0; i < n; i++ {
		marks += "^"
	}
	return src + "\n" + string(pad) + marks
}
