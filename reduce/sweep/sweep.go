// Package sweep evaluates a quantity over a range of frequencies and draws
// the result as a text plot, and works the resonance of series and
// parallel RLC circuits: resonant frequency, quality factor, −3 dB
// bandwidth and the unity-power-factor frequency of a tank whose inductor
// has resistance. Every operation returns its results with its steps.
package sweep

import (
	"errors"
	"fmt"
	"math"
	"strings"

	"argand/calc"
)

// MaxPoints bounds the number of points in one sweep.
const MaxPoints = 100000

// Marks recorded on a sweep point whose evaluation has no finite value.
const (
	Open      = "open circuit" // the quantity is infinite because admittances cancel
	Short     = "short"        // a division by zero, such as by an impedance that vanishes
	Undefined = "undefined"    // the evaluation gave no finite number
)

// ErrShort may be returned (or wrapped) by an evaluation to mark a point
// as a short rather than fail the sweep.
var ErrShort = errors.New("short circuit: division by a zero impedance")

// Points returns n frequencies from start to stop inclusive, evenly spaced
// or, when log is set, in geometric progression (equal steps of
// log10 f). A log sweep needs start > 0; a linear one start ≥ 0. One point
// gives just start.
func Points(start, stop float64, n int, log bool) ([]float64, error) {
	switch {
	case n < 1 || n > MaxPoints:
		return nil, fmt.Errorf("number of points must be between 1 and %d, not %d", MaxPoints, n)
	case !finite(start) || !finite(stop):
		return nil, fmt.Errorf("sweep limits must be finite numbers")
	case log && (start <= 0 || stop <= 0):
		return nil, fmt.Errorf("a log sweep needs frequencies above 0 Hz")
	case start < 0 || stop < 0:
		return nil, fmt.Errorf("a sweep needs frequencies of 0 Hz or more")
	case n > 1 && stop <= start:
		return nil, fmt.Errorf("the sweep must rise: stop (%g Hz) must exceed start (%g Hz)", stop, start)
	}
	if n == 1 {
		return []float64{start}, nil
	}
	p := make([]float64, n)
	last := float64(n - 1)
	if log {
		l0, l1 := math.Log(start), math.Log(stop)
		for k := range p {
			p[k] = math.Exp(l0 + (l1-l0)*float64(k)/last)
		}
	} else {
		for k := range p {
			p[k] = start + (stop-start)*float64(k)/last
		}
	}
	p[0], p[n-1] = start, stop
	for k := 1; k < n; k++ {
		if p[k] <= p[k-1] {
			return nil, fmt.Errorf("the range %g Hz to %g Hz is too narrow for %d distinct points", start, stop, n)
		}
	}
	return p, nil
}

// Point is one row of a sweep: the frequency, the value there, and a mark
// (Open, Short or Undefined) when the value is not finite; a marked point
// holds a zero Value.
type Point struct {
	Freq  float64 // Hz
	Value calc.Quantity
	Mark  string
}

// Table is the result of a sweep. Dim and Kind are those of the values;
// Log says the points are log spaced, so plots use a log frequency axis.
type Table struct {
	Points []Point
	Dim    calc.Dim
	Kind   calc.Kind
	Log    bool
}

// Run evaluates eval at each frequency (Hz). The points must be finite,
// non-negative and strictly rising, at most MaxPoints of them. A point
// whose evaluation reports an open circuit (calc.ErrOpenCircuit), a short
// (ErrShort) or a division by zero, or returns a value that is not finite,
// is recorded with a mark instead of failing the sweep; any other error
// ends the sweep, naming the frequency. All values must share a unit.
func Run(points []float64, eval func(freqHz float64) (calc.Quantity, error)) (*Table, error) {
	if len(points) == 0 {
		return nil, fmt.Errorf("a sweep needs at least one point")
	}
	if len(points) > MaxPoints {
		return nil, fmt.Errorf("a sweep has at most %d points, not %d", MaxPoints, len(points))
	}
	if eval == nil {
		return nil, fmt.Errorf("nothing to evaluate")
	}
	for k, f := range points {
		if !finite(f) || f < 0 {
			return nil, fmt.Errorf("sweep point %d is not a frequency of 0 Hz or more", k+1)
		}
		if k > 0 && f <= points[k-1] {
			return nil, fmt.Errorf("sweep points must rise: point %d (%g Hz) follows %g Hz", k+1, f, points[k-1])
		}
	}
	t := &Table{Points: make([]Point, len(points)), Log: geometric(points)}
	haveDim := false
	for k, f := range points {
		p := Point{Freq: f}
		v, err := eval(f)
		if err == nil {
			v, err = v.Check("sweep")
			if err != nil {
				p.Mark = Undefined
				err = nil
			}
		} else if m := markFor(err); m != "" {
			p.Mark = m
			err = nil
		}
		if err != nil {
			return nil, fmt.Errorf("at %s: %w", freqLabel(f, false), err)
		}
		if p.Mark == "" {
			p.Value = v
			switch {
			case !haveDim:
				t.Dim, t.Kind, haveDim = v.Dim, v.Kind, true
			case v.Dim != t.Dim:
				return nil, fmt.Errorf("at %s: the swept quantity changed unit from %s to %s",
					freqLabel(f, false), calc.DimName(t.Dim, false), calc.DimName(v.Dim, false))
			}
		} else {
			p.Value = calc.Quantity{}
		}
		t.Points[k] = p
	}
	for k := range t.Points {
		if t.Points[k].Mark != "" {
			t.Points[k].Value.Dim = t.Dim
		}
	}
	return t, nil
}

// markFor maps an evaluation error to a mark, or "" for an error that
// should end the sweep. Division by zero is recognised by its message
// since package calc reports it as a plain error.
func markFor(err error) string {
	switch {
	case errors.Is(err, calc.ErrOpenCircuit):
		return Open
	case errors.Is(err, ErrShort), strings.Contains(err.Error(), "division by zero"):
		return Short
	}
	return ""
}

// geometric reports whether three or more positive points stand in a
// constant ratio.
func geometric(p []float64) bool {
	if len(p) < 3 || p[0] <= 0 {
		return false
	}
	r := math.Log(p[1] / p[0])
	for k := 2; k < len(p); k++ {
		if math.Abs(math.Log(p[k]/p[k-1])-r) > 1e-9*math.Abs(r)+1e-12 {
			return false
		}
	}
	return true
}

func finite(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }

// freqLabel writes a frequency with an SI prefix and trailing zeros
// removed, such as "15.9 kHz".
func freqLabel(f float64, ascii bool) string {
	return trimZeros(calc.Format{Digits: 3, ASCII: ascii}.Mag(f, calc.DimFrequency, calc.KindPlain))
}

// trimZeros removes trailing zeros after a decimal point: "1.00 kHz"
// becomes "1 kHz".
func trimZeros(s string) string {
	num, unit, _ := strings.Cut(s, " ")
	if strings.Contains(num, ".") && !strings.ContainsAny(num, "eE") {
		num = strings.TrimRight(strings.TrimRight(num, "0"), ".")
	}
	if unit == "" {
		return num
	}
	return num + " " + unit
}

// DB returns 20·log10(x) for a magnitude ratio x > 0. A zero ratio has no
// value in dB (it is unbounded below), so it is an error that says the
// output is zero.
func DB(x float64) (float64, error) {
	switch {
	case !finite(x) || x < 0:
		return 0, fmt.Errorf("a gain in dB needs a finite magnitude ratio of 0 or more")
	case x == 0:
		return 0, fmt.Errorf("the output is zero: the gain has no value in dB (it is unbounded below)")
	}
	return 20 * math.Log10(x), nil
}

// Text writes the table for a person: frequency, value in polar and
// rectangular form and, when dB is set, 20·log10 of the magnitude.
func (t *Table) Text(f calc.Format, dB bool) string {
	var b strings.Builder
	for _, p := range t.Points {
		b.WriteString(fmt.Sprintf("%12s  ", freqLabel(p.Freq, f.ASCII)))
		if p.Mark != "" {
			b.WriteString("(" + p.Mark + ")\n")
			continue
		}
		b.WriteString(f.Both(p.Value, true))
		if dB {
			if d, err := DB(p.Value.Mag()); err == nil {
				b.WriteString(fmt.Sprintf("  %.2f dB", d))
			} else {
				b.WriteString("  (zero: no dB value)")
			}
		}
		b.WriteString("\n")
	}
	return b.String()
}

// Step records the sweep: one row per point with the columns "f" and
// "value", and a note for each marked point.
func (t *Table) Step(source string) calc.Step {
	spacing := "linear"
	if t.Log {
		spacing = "log"
	}
	st := calc.Step{Kind: "sweep", Source: source}
	if n := len(t.Points); n > 0 {
		st.Rule = fmt.Sprintf("sweep over %d %s-spaced points from %s to %s", n, spacing,
			freqLabel(t.Points[0].Freq, false), freqLabel(t.Points[n-1].Freq, false))
	}
	for _, p := range t.Points {
		row := calc.Row{Name: freqLabel(p.Freq, false), Values: []calc.Operand{{Name: "f", Value: calc.Real(p.Freq, calc.DimFrequency)}}}
		if p.Mark == "" {
			row.Values = append(row.Values, calc.Operand{Name: "value", Value: p.Value})
		} else {
			st.Notes = append(st.Notes, fmt.Sprintf("at %s: %s (no finite value)", freqLabel(p.Freq, false), p.Mark))
		}
		st.Rows = append(st.Rows, row)
	}
	return st
}
