package harmonic

import (
	"fmt"
	"math"
	"strconv"
	"strings"
	"unicode/utf8"

	"argand/calc"
)

// MaxFile bounds the size of a spectrum file, in bytes.
const MaxFile = 1 << 20

// LineError is an error at a line (and column, from 1) of a spectrum file.
type LineError struct {
	Line, Col int
	Msg       string
}

func (e *LineError) Error() string {
	return fmt.Sprintf("line %d, column %d: %s", e.Line, e.Col, e.Msg)
}

// ParseCSV reads a spectrum file: one order a line as
//
//	order, value[, angle]
//
// with the value an RMS magnitude with its unit (230 V, 4.1 A) or a
// percentage of the fundamental (4.2 %), and the angle in degrees. Fields
// are separated by commas or tabs; blank lines and lines starting with #
// are skipped, and so is a first line of column titles. It returns the
// entries and, for each, its line number; Build then makes the spectrum
// (its errors name an entry, whose line the caller finds in lines).
func ParseCSV(data []byte) (entries []Entry, lines []int, err error) {
	if len(data) > MaxFile {
		return nil, nil, &LineError{Line: 1, Col: 1, Msg: fmt.Sprintf("the file is larger than %d bytes", MaxFile)}
	}
	if !utf8.Valid(data) {
		ln := 1 + strings.Count(string(data[:firstInvalid(data)]), "\n")
		return nil, nil, &LineError{Line: ln, Col: 1, Msg: "invalid UTF-8 in the file"}
	}
	text := strings.TrimPrefix(string(data), "\ufeff")
	titled := false
	for n, raw := range strings.Split(text, "\n") {
		ln := n + 1
		line := strings.TrimRight(raw, "\r")
		trim := strings.TrimSpace(line)
		if trim == "" || strings.HasPrefix(trim, "#") {
			continue
		}
		for i, r := range line {
			if r < 0x20 && r != '\t' || r == 0x7f {
				return nil, nil, &LineError{Line: ln, Col: utf8.RuneCountInString(line[:i]) + 1, Msg: "control character in the file"}
			}
		}
		fields, cols := split(line)
		if len(fields) < 2 || len(fields) > 3 {
			return nil, nil, &LineError{Line: ln, Col: 1, Msg: fmt.Sprintf("expected order, value[, angle]; found %d field(s)", len(fields))}
		}
		ord, perr := strconv.Atoi(fields[0])
		if perr != nil {
			if !titled && len(entries) == 0 && !startsNumeric(fields[0]) {
				titled = true // a line of column titles
				continue
			}
			return nil, nil, &LineError{Line: ln, Col: cols[0], Msg: fmt.Sprintf("the order must be a whole number from 1 to %d, found %q", MaxOrder, clip(fields[0]))}
		}
		if ord < 1 || ord > MaxOrder {
			return nil, nil, &LineError{Line: ln, Col: cols[0], Msg: fmt.Sprintf("the order must be a whole number from 1 to %d, found %d", MaxOrder, ord)}
		}
		if len(entries) >= MaxOrder {
			return nil, nil, &LineError{Line: ln, Col: 1, Msg: fmt.Sprintf("a spectrum holds at most %d orders", MaxOrder)}
		}
		q, pct, lerr := magnitude(fields[1])
		if lerr != "" {
			return nil, nil, &LineError{Line: ln, Col: cols[1], Msg: lerr}
		}
		e := Entry{Order: ord, Value: q, Percent: pct}
		if len(fields) == 3 && fields[2] != "" {
			deg, err := strconv.ParseFloat(fields[2], 64)
			if err != nil || math.IsInf(deg, 0) || math.IsNaN(deg) || math.Abs(deg) > 1e6 {
				return nil, nil, &LineError{Line: ln, Col: cols[2], Msg: fmt.Sprintf("the angle must be a number of degrees, found %q", clip(fields[2]))}
			}
			s, c := math.Sincos(deg * math.Pi / 180)
			m := real(q.V)
			e.Value.V = complex(m*c, m*s)
			e.HasAngle = true
		}
		entries = append(entries, e)
		lines = append(lines, ln)
	}
	if len(entries) == 0 {
		return nil, nil, &LineError{Line: 1, Col: 1, Msg: "the file holds no orders (expected lines such as 1, 230 V, 0)"}
	}
	return entries, lines, nil
}

func firstInvalid(b []byte) int {
	for i := 0; i < len(b); {
		r, w := utf8.DecodeRune(b[i:])
		if r == utf8.RuneError && w == 1 {
			return i
		}
		i += w
	}
	return len(b)
}

// split cuts a line at commas or tabs and trims each field; cols holds the
// column (from 1, in characters) where each field starts.
func split(line string) (fields []string, cols []int) {
	start := 0
	for i := 0; i <= len(line); i++ {
		if i == len(line) || line[i] == ',' || line[i] == '\t' {
			f := line[start:i]
			lead := len(f) - len(strings.TrimLeft(f, " "))
			fields = append(fields, strings.TrimSpace(f))
			cols = append(cols, utf8.RuneCountInString(line[:start+lead])+1)
			start = i + 1
		}
	}
	return fields, cols
}

func startsNumeric(s string) bool {
	return s != "" && (s[0] >= '0' && s[0] <= '9' || s[0] == '-' || s[0] == '+' || s[0] == '.')
}

// clip shortens a field quoted in a message.
func clip(s string) string {
	if utf8.RuneCountInString(s) > 24 {
		r := []rune(s)
		return string(r[:24]) + "…"
	}
	return s
}

// magnitude reads a non-negative real number with a unit, or a
// percentage: the value of a spectrum file.
func magnitude(text string) (calc.Quantity, bool, string) {
	e, perr := calc.ParseExpr(text, 1)
	if perr != nil {
		return calc.Quantity{}, false, "the value: " + perr.Msg
	}
	l, ok := e.(*calc.Lit)
	if !ok {
		return calc.Quantity{}, false, fmt.Sprintf("the value must be a number with its unit (230 V, 4.1 A) or a percentage (4.2 %%), found %q", clip(text))
	}
	ev := &calc.Evaluator{Env: litEnv{}, Src: text, Line: 1}
	r, eerr := ev.Eval(l)
	if eerr != nil {
		return calc.Quantity{}, false, "the value: " + eerr.Msg
	}
	q := r.Value
	if !q.IsReal() || real(q.V) < 0 {
		return calc.Quantity{}, false, "the value is a magnitude (0 or more); give the angle in the third column"
	}
	return q, l.Unit == "%", ""
}

// litEnv is the empty environment a literal is evaluated in: no names, no
// functions, the default settings.
type litEnv struct{}

func (litEnv) Lookup(string) (calc.Quantity, bool) { return calc.Quantity{}, false }
func (litEnv) Func(string) (*calc.Func, bool)      { return nil, false }
func (litEnv) Context() *calc.Context {
	return &calc.Context{Freq: 50, Sequence: 1, Format: calc.Format{Digits: calc.DefaultDigits}}
}
