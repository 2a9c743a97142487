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
	return fmt.Sprintf("cannot combine %s %s %s: the units differ", DimName(e.A, false), e.Op, DimName(e.B, false))
}

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
}

func (e *Error) Error() string {
	if e.Line > 0 {
		return fmt.Sprintf("line %d, col %d: %s", e.Line, e.Col, e.Msg)
	}
	return fmt.Sprintf("col %d: %s", e.Col, e.Msg)
}
