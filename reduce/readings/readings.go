// Package readings reads a file of measured values, rows of
// name,value,unit in CSV (RFC 4180), for the worksheet's readings
// statement, and writes one back. A value is read as a literal of the
// worksheet language (calc): a number, rectangular or polar, with its
// unit; names, functions and arithmetic are refused, since a reading is
// a measurement, not a calculation.
package readings

import (
	"bytes"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"

	"argand/calc"
)

// Options are what reading a file needs from the worksheet.
type Options struct {
	// Comma reads a quoted value with a decimal comma ("229,6"), as under
	// the worksheet's decimal comma.
	Comma bool
	// Context holds the settings a value is read with (the angle unit of a
	// bare polar angle); nil is the default settings.
	Context *calc.Context
	// Reserved says why a name cannot name a value, or "" when it can.
	Reserved func(name string) string
}

func (o Options) context() *calc.Context {
	if o.Context != nil {
		c := *o.Context
		return &c
	}
	return &calc.Context{Format: calc.Format{Digits: calc.DefaultDigits}}
}

func (o Options) reserved(name string) string {
	if o.Reserved == nil {
		return ""
	}
	return o.Reserved(name)
}

// Bounds of a readings file: a site record of measured values is a few
// hundred rows; these stop a wrong or hostile file, not a real one.
const (
	MaxBytes = 1 << 20
	MaxRows  = 10000
)

// Reading is one measured value of a readings file.
type Reading struct {
	Name  string
	Value calc.Quantity
	Line  int // the file's line, 1-based
}

// Error is a bad row of a readings file, at a line and column
// (1-based, the column counted in characters).
type Error struct {
	Line, Col int
	Msg       string
}

func (e *Error) Error() string {
	return fmt.Sprintf("line %d, column %d: %s", e.Line, e.Col, e.Msg)
}

// readingsForm is what every message about a row says to type.
const readingsForm = "each row is name,value,unit as in V_R1,229.6,V or I_L1,\"1.18∠-38\",A"

// Parse reads a readings file: CSV (RFC 4180, CRLF or LF line ends, a
// byte order mark ignored) of rows name,value,unit. A first row
// name,value,unit (in any case) is a header and skipped; a line starting
// with # is a comment. A name is a worksheet name (not a reserved word,
// no '.'), once in the file. A value is a number as typed in the
// worksheet, with a decimal point, rectangular (3+j4) or polar (230∠-30),
// read with the unit after it; a value with a decimal comma must be
// quoted ("229,6") and is read so only under decimal comma, and only when
// it holds no point too. At most MaxBytes and MaxRows.
func Parse(data []byte, o Options) ([]Reading, error) {
	if len(data) > MaxBytes {
		return nil, fmt.Errorf("the file is larger than %d bytes, the most a readings file may hold: split it", MaxBytes)
	}
	data = bytes.TrimPrefix(data, []byte("\xef\xbb\xbf"))
	lines := bytes.Split(data, []byte("\n"))
	if err := badUTF8(lines); err != nil {
		return nil, err
	}
	r := csv.NewReader(bytes.NewReader(data))
	r.FieldsPerRecord = -1
	r.Comment = '#'
	r.ReuseRecord = true
	// the file's character column of a byte column on a line
	colOf := func(line, byteCol int) int {
		if line < 1 || line > len(lines) {
			return 1
		}
		l := lines[line-1]
		return utf8.RuneCount(l[:min(max(byteCol-1, 0), len(l))]) + 1
	}
	var out []Reading
	seen := map[string]int{}
	for rows := 0; ; rows++ {
		rec, err := r.Read()
		if err == io.EOF {
			break
		}
		var pe *csv.ParseError
		if errors.As(err, &pe) {
			return nil, &Error{Line: pe.Line, Col: colOf(pe.Line, pe.Column), Msg: csvHint(pe.Err)}
		}
		if err != nil {
			return nil, err
		}
		line, _ := r.FieldPos(0)
		if rows >= MaxRows {
			return nil, &Error{Line: line, Col: 1, Msg: fmt.Sprintf("more than %d rows, the most a readings file may hold: split it", MaxRows)}
		}
		if rows == 0 && isReadingsHeader(rec) {
			continue
		}
		at := func(i int) int { l, c := r.FieldPos(i); return colOf(l, c) }
		rd, rerr := o.row(rec, line, at)
		if rerr != nil {
			return nil, rerr
		}
		if first, dup := seen[rd.Name]; dup {
			return nil, &Error{Line: line, Col: at(0), Msg: fmt.Sprintf("%s is given twice (lines %d and %d): name each reading once", rd.Name, first, line)}
		}
		seen[rd.Name] = line
		out = append(out, rd)
	}
	if len(out) == 0 {
		return nil, fmt.Errorf("no readings in the file: %s", readingsForm)
	}
	return out, nil
}

// badUTF8 locates the first byte of the file that is not UTF-8, or nil.
func badUTF8(lines [][]byte) error {
	for i, l := range lines {
		if utf8.Valid(l) {
			continue
		}
		good := 0
		for len(l) > 0 {
			r, w := utf8.DecodeRune(l)
			if r == utf8.RuneError && w == 1 {
				break
			}
			l, good = l[w:], good+1
		}
		return &Error{Line: i + 1, Col: good + 1, Msg: "invalid UTF-8 byte: save the file as UTF-8"}
	}
	return nil
}

// csvHint turns a CSV syntax error into what to type.
func csvHint(err error) string {
	switch {
	case errors.Is(err, csv.ErrBareQuote):
		return "a quote inside a field that is not quoted: write the field in double quotes and double the quote, as in \"say \"\"hi\"\"\""
	case errors.Is(err, csv.ErrQuote):
		return "a quoted field does not end with a quote followed by a comma or the line end: close the quote"
	}
	return err.Error() + ": " + readingsForm
}

// isReadingsHeader reports the optional header row name,value,unit.
func isReadingsHeader(rec []string) bool {
	want := []string{"name", "value", "unit"}
	if len(rec) != len(want) {
		return false
	}
	for i, w := range want {
		if !strings.EqualFold(strings.TrimSpace(rec[i]), w) {
			return false
		}
	}
	return true
}

// row reads one row; at gives the column of a field.
func (o Options) row(rec []string, line int, at func(int) int) (Reading, error) {
	bad := func(field int, format string, a ...any) error {
		return &Error{Line: line, Col: at(field), Msg: fmt.Sprintf(format, a...)}
	}
	if len(rec) != 3 {
		return Reading{}, bad(0, "%d fields where 3 belong: %s", len(rec), readingsForm)
	}
	name, val, unit := strings.TrimSpace(rec[0]), strings.TrimSpace(rec[1]), strings.TrimSpace(rec[2])
	if why := o.name(name); why != "" {
		return Reading{}, bad(0, "%s", why)
	}
	if val == "" {
		return Reading{}, bad(1, "the value of %s is missing: %s", name, readingsForm)
	}
	comma := strings.ContainsRune(val, ',')
	switch {
	case comma && strings.ContainsRune(val, '.'):
		return Reading{}, bad(1, "%s holds both a comma and a point: write the value with one decimal marker and no thousands separator", calc.Quoted(val))
	case comma && !o.Comma:
		return Reading{}, bad(1, "%s has a decimal comma: write %s, or put decimal comma before the readings line", calc.Quoted(val), calc.Quoted(strings.ReplaceAll(val, ",", ".")))
	}
	q, field, msg := o.value(val, unit, comma, line)
	if msg != "" {
		return Reading{}, bad(field, "%s: %s", msg, readingsForm)
	}
	// a reading is of one quantity, whose unit a record written back
	// (Format) can name: not a compound such as V·s or /C
	sym := unitOf(q)
	if back, _, msg := o.value("1", sym, false, line); msg != "" || back.Dim != q.Dim {
		field := 2
		if unit == "" {
			field = 1 // the unit was written in the value field
		}
		return Reading{}, bad(field, "%s is not in a unit of one measured quantity: write the value in V, A, W, var, VA, Ω, S, Hz, F, H, s, rad or ° (or no unit for a ratio)", calc.Quoted(strings.TrimSpace(val+" "+unit)))
	}
	return Reading{Name: name, Value: q, Line: line}, nil
}

// name says why name cannot name a reading, or "".
func (o Options) name(name string) string {
	if name == "" {
		return "the name is missing: " + readingsForm
	}
	p := calc.NewParser(name, 1)
	t := p.Next()
	r, _ := utf8.DecodeRuneInString(name)
	switch {
	case t.Tok != calc.TokIdent || p.Peek().Tok != calc.TokEOF || !(unicode.IsLetter(r) || r == '_'):
		return fmt.Sprintf("%s is not a name: a name starts with a letter and holds letters, digits and _, as in V_R1", calc.Quoted(name))
	case strings.Contains(name, "."):
		return fmt.Sprintf("%s: a name cannot contain '.': dotted names are results (such as N.R1.v); write N_R1_v", name)
	}
	if why := o.reserved(name); why != "" {
		return fmt.Sprintf("%q is reserved (%s) and cannot name a reading", name, why)
	}
	return ""
}

// value reads a value and its unit as one literal of the worksheet
// language: the value alone first, so that a refusal of it points at the
// value field (1), then with the unit, whose refusal points at the field
// the column falls in (1 or 2).
func (o Options) value(val, unit string, comma bool, line int) (calc.Quantity, int, string) {
	e, perr := calc.ParseExprComma(val, line, comma)
	if perr != nil {
		return calc.Quantity{}, 1, perr.Msg
	}
	var off calc.Expr
	calc.Walk(e, func(x calc.Expr) {
		switch n := x.(type) {
		case *calc.Lit, *calc.Unary, *calc.Paren, *calc.Polar:
			return
		case *calc.Binary:
			if n.Op == "+" || n.Op == "-" {
				return
			}
		}
		if off == nil {
			off = x
		}
	})
	if off != nil {
		pos, end, _ := off.Span()
		return calc.Quantity{}, 1, fmt.Sprintf("%s is not a number with a unit (a reading is a measured value: no names, functions or arithmetic)", calc.Quoted(val[pos:end]))
	}
	src := val
	if unit != "" {
		src += " " + unit
	}
	field := func(col int) int {
		if col > utf8.RuneCountInString(val) {
			return 2
		}
		return 1
	}
	if e, perr = calc.ParseExprComma(src, line, comma); perr != nil {
		return calc.Quantity{}, field(perr.Col), perr.Msg
	}
	ev := &calc.Evaluator{Env: env{o.context()}, Src: src, Line: line}
	res, err := ev.Eval(e)
	if err != nil {
		return calc.Quantity{}, field(err.Col), err.Msg
	}
	return res.Value, 0, ""
}

// env evaluates a reading: no names and no functions, only the
// worksheet's settings (the angle unit of a bare polar angle).
type env struct{ ctx *calc.Context }

func (env) Lookup(string) (calc.Quantity, bool) { return calc.Quantity{}, false }
func (env) Func(string) (*calc.Func, bool)      { return nil, false }
func (e env) Context() *calc.Context            { return e.ctx }

// Format writes readings as a readings file that Parse
// reads back to the same values: a header, then a row each, the value in
// rectangular form in the unit's coherent SI symbol with every digit a
// float64 needs, CRLF line ends.
func Format(rs []Reading) []byte {
	var b bytes.Buffer
	w := csv.NewWriter(&b)
	w.UseCRLF = true
	w.Write([]string{"name", "value", "unit"})
	for _, r := range rs {
		q := r.Value
		v := strconv.FormatFloat(real(q.V), 'g', -1, 64)
		if im := imag(q.V); im > 0 {
			v += "+j" + strconv.FormatFloat(im, 'g', -1, 64)
		} else if im < 0 {
			v += "-j" + strconv.FormatFloat(-im, 'g', -1, 64)
		}
		w.Write([]string{r.Name, v, unitOf(q)})
	}
	w.Flush()
	return b.Bytes()
}

// unitOf is the unit a reading is written back in: the coherent SI
// symbol of its dimension and kind, rad for an angle (held in radians).
func unitOf(q calc.Quantity) string {
	if q.Kind == calc.KindAngle && q.Dim.IsDimensionless() {
		return "rad"
	}
	return calc.UnitSymbol(q.Dim, q.Kind, false)
}
