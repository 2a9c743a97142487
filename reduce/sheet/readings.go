package sheet

import (
	"bytes"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"

	"argand/calc"
)

// Bounds of a readings file: a site record of measured values is a few
// hundred rows; these stop a wrong or hostile file, not a real one.
const (
	MaxReadingsBytes = 1 << 20
	MaxReadingsRows  = 10000
)

// Reading is one measured value of a readings file.
type Reading struct {
	Name  string
	Value calc.Quantity
	Line  int // the file's line, 1-based
}

// ReadingsError is a bad row of a readings file, at a line and column
// (1-based, the column counted in characters).
type ReadingsError struct {
	Line, Col int
	Msg       string
}

func (e *ReadingsError) Error() string {
	return fmt.Sprintf("line %d, column %d: %s", e.Line, e.Col, e.Msg)
}

// readingsForm is what every message about a row says to type.
const readingsForm = "each row is name,value,unit as in V_R1,229.6,V or I_L1,\"1.18∠-38\",A"

// SetDir sets the directory a readings file named by a relative path is
// read from: the worksheet file's own. "" is the working directory.
func (s *Sheet) SetDir(dir string) { s.dir = dir }

// stmtReadings runs: readings FILE — the named measured values of a CSV
// file of rows name,value,unit, defined as names for check … reads … and
// check … is …. See ParseReadings for the file's form.
func (s *Sheet) stmtReadings(p *calc.Parser) error {
	kw := p.Next()
	rest := p.Source()[kw.End:]
	path := strings.TrimSpace(rest)
	col := kw.Col + utf8.RuneCountInString(kw.Text) + utf8.RuneCountInString(rest[:len(rest)-len(strings.TrimLeft(rest, " \t"))])
	if len(path) >= 2 && path[0] == '"' && path[len(path)-1] == '"' {
		path = path[1 : len(path)-1] // a name with spaces may be quoted
	}
	if path == "" {
		p.FailAt(col, 1, "readings needs a file name, as in: readings site-2026-03.csv")
		return p.Err()
	}
	n := utf8.RuneCountInString(path)
	if s.limits.NoFiles {
		return lineErr(s.line, col, n, "readings: files cannot be read here (this argand serves sessions over the network); type the values as names, as in V_R1 = 229.6 V")
	}
	if s.dry {
		return nil
	}
	full := path
	if !filepath.IsAbs(path) && s.dir != "" {
		full = filepath.Join(s.dir, path)
	}
	data, err := readBounded(full, MaxReadingsBytes)
	if err == nil {
		var rs []Reading
		if rs, err = s.ParseReadings(data); err == nil {
			err = s.defineReadings(p, rs, path)
		}
	}
	if err != nil {
		return lineErr(s.line, col, n, "%s: %v", calc.Printable(path), err)
	}
	return nil
}

// defineReadings checks every reading's name against the worksheet, then
// defines them all and records one step; a refusal defines none.
func (s *Sheet) defineReadings(p *calc.Parser, rs []Reading, path string) error {
	fresh := 0
	for _, r := range rs {
		d, ok := s.byName[r.Name]
		switch {
		case !ok:
			fresh++
		case d.elem != nil:
			return &ReadingsError{Line: r.Line, Col: 1, Msg: fmt.Sprintf("%s is an element (line %d); give the reading another name, as in %s_read", r.Name, d.line, r.Name)}
		case d.owner != "":
			return &ReadingsError{Line: r.Line, Col: 1, Msg: fmt.Sprintf("%s is a result of %s; give the reading another name", r.Name, d.owner)}
		}
	}
	if len(s.byName)+fresh > s.limits.Names {
		return fmt.Errorf("%d readings would take the worksheet past its %d names", len(rs), s.limits.Names)
	}
	changed := map[string]bool{}
	st := calc.Step{Kind: "readings", Source: p.Source(),
		Rule: "measured values read from " + calc.Printable(path) + " (" + strconv.Itoa(len(rs)) + " readings)"}
	for _, r := range rs {
		if _, ok := s.byName[r.Name]; ok {
			changed[r.Name] = true
		}
		d := &def{name: r.Name, src: p.Source(), line: s.line, value: r.Value, deps: map[string]bool{}}
		if err := s.setValue(d); err != nil {
			return err
		}
		st.Results = append(st.Results, calc.Operand{Name: r.Name, Value: r.Value})
	}
	s.record(st)
	if len(changed) > 0 {
		return s.reevaluate(changed, "readings read again")
	}
	return nil
}

// readBounded reads a regular file of at most limit bytes.
func readBounded(path string, limit int) ([]byte, error) {
	f, err := os.Open(path)
	if err != nil {
		var pe *os.PathError
		if errors.As(err, &pe) {
			err = pe.Err
		}
		return nil, fmt.Errorf("cannot open the file: %v", err)
	}
	defer f.Close()
	if st, err := f.Stat(); err != nil || !st.Mode().IsRegular() {
		return nil, fmt.Errorf("not a regular file")
	}
	data, err := io.ReadAll(io.LimitReader(f, int64(limit)+1))
	if err != nil {
		return nil, fmt.Errorf("cannot read the file: %v", err)
	}
	if len(data) > limit {
		return nil, fmt.Errorf("the file is larger than %d bytes, the most a readings file may hold: split it", limit)
	}
	return data, nil
}

// ParseReadings reads a readings file: CSV (RFC 4180, CRLF or LF line
// ends, a byte order mark ignored) of rows name,value,unit. A first row
// name,value,unit (in any case) is a header and skipped; a line starting
// with # is a comment. A name is a worksheet name (not a reserved word,
// no '.'), once in the file. A value is a number as typed in the
// worksheet, with a decimal point, rectangular (3+j4) or polar (230∠-30)
// and read with the unit after it; a value with a decimal comma must be
// quoted ("229,6") and is read so only under decimal comma, and only
// when it holds no point too. At most MaxReadingsBytes and
// MaxReadingsRows.
func (s *Sheet) ParseReadings(data []byte) ([]Reading, error) {
	if len(data) > MaxReadingsBytes {
		return nil, fmt.Errorf("the file is larger than %d bytes, the most a readings file may hold: split it", MaxReadingsBytes)
	}
	data = bytes.TrimPrefix(data, []byte("\xef\xbb\xbf"))
	lines := bytes.Split(data, []byte("\n"))
	if !utf8.Valid(data) {
		for i, l := range lines {
			if !utf8.Valid(l) {
				good := 0
				for len(l) > 0 {
					r, w := utf8.DecodeRune(l)
					if r == utf8.RuneError && w == 1 {
						break
					}
					l, good = l[w:], good+1
				}
				return nil, &ReadingsError{Line: i + 1, Col: good + 1, Msg: "invalid UTF-8 byte: save the file as UTF-8"}
			}
		}
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
			return nil, &ReadingsError{Line: pe.Line, Col: colOf(pe.Line, pe.Column), Msg: csvHint(pe.Err)}
		}
		if err != nil {
			return nil, err
		}
		line, _ := r.FieldPos(0)
		if rows >= MaxReadingsRows {
			return nil, &ReadingsError{Line: line, Col: 1, Msg: fmt.Sprintf("more than %d rows, the most a readings file may hold: split it", MaxReadingsRows)}
		}
		if rows == 0 && isReadingsHeader(rec) {
			continue
		}
		at := func(i int) int { l, c := r.FieldPos(i); return colOf(l, c) }
		rd, rerr := s.readingRow(rec, line, at)
		if rerr != nil {
			return nil, rerr
		}
		if first, dup := seen[rd.Name]; dup {
			return nil, &ReadingsError{Line: line, Col: at(0), Msg: fmt.Sprintf("%s is given twice (lines %d and %d): name each reading once", rd.Name, first, line)}
		}
		seen[rd.Name] = line
		out = append(out, rd)
	}
	if len(out) == 0 {
		return nil, fmt.Errorf("no readings in the file: %s", readingsForm)
	}
	return out, nil
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

// readingRow reads one row; at gives the column of a field.
func (s *Sheet) readingRow(rec []string, line int, at func(int) int) (Reading, error) {
	bad := func(field int, format string, a ...any) error {
		return &ReadingsError{Line: line, Col: at(field), Msg: fmt.Sprintf(format, a...)}
	}
	if len(rec) != 3 {
		return Reading{}, bad(0, "%d fields where 3 belong: %s", len(rec), readingsForm)
	}
	name, val, unit := strings.TrimSpace(rec[0]), strings.TrimSpace(rec[1]), strings.TrimSpace(rec[2])
	if why := s.readingName(name); why != "" {
		return Reading{}, bad(0, "%s", why)
	}
	if val == "" {
		return Reading{}, bad(1, "the value of %s is missing: %s", name, readingsForm)
	}
	comma := strings.ContainsRune(val, ',')
	switch {
	case comma && strings.ContainsRune(val, '.'):
		return Reading{}, bad(1, "%q holds both a comma and a point: write the value with one decimal marker and no thousands separator", calc.Printable(val))
	case comma && !s.ctx.Format.Comma:
		return Reading{}, bad(1, "%q has a decimal comma: write %q, or put decimal comma before the readings line", calc.Printable(val), strings.ReplaceAll(calc.Printable(val), ",", "."))
	}
	q, field, msg := s.readingValue(val, unit, comma, line)
	if msg != "" {
		return Reading{}, bad(field, "%s: %s", msg, readingsForm)
	}
	// a reading is of one quantity, whose unit a record written back
	// (FormatReadings) can name: not a compound such as V·s or /C
	sym := readingUnit(q)
	if back, _, msg := s.readingValue("1", sym, false, line); msg != "" || back.Dim != q.Dim {
		field := 2
		if unit == "" {
			field = 1 // the unit was written in the value field
		}
		return Reading{}, bad(field, "%q is not in a unit of one measured quantity: write the value in V, A, W, var, VA, Ω, S, Hz, F, H, s, rad or ° (or no unit for a ratio)", calc.Printable(strings.TrimSpace(val+" "+unit)))
	}
	return Reading{Name: name, Value: q, Line: line}, nil
}

// readingName says why name cannot name a reading, or "".
func (s *Sheet) readingName(name string) string {
	if name == "" {
		return "the name is missing: " + readingsForm
	}
	p := calc.NewParser(name, 1)
	t := p.Next()
	r, _ := utf8.DecodeRuneInString(name)
	switch {
	case t.Tok != calc.TokIdent || p.Peek().Tok != calc.TokEOF || !(unicode.IsLetter(r) || r == '_'):
		return fmt.Sprintf("%q is not a name: a name starts with a letter and holds letters, digits and _, as in V_R1", calc.Printable(name))
	case strings.Contains(name, "."):
		return fmt.Sprintf("%s: a name cannot contain '.': dotted names are results (such as N.R1.v); write N_R1_v", name)
	}
	if why := s.Reserved(name); why != "" {
		return fmt.Sprintf("%q is reserved (%s) and cannot name a reading", name, why)
	}
	return ""
}

// readingValue reads a value and its unit as one literal of the worksheet
// language: the value alone first, so that a refusal of it points at the
// value field (1), then with the unit, whose refusal points at the field
// the column falls in (1 or 2).
func (s *Sheet) readingValue(val, unit string, comma bool, line int) (calc.Quantity, int, string) {
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
		return calc.Quantity{}, 1, fmt.Sprintf("%q is not a number with a unit (a reading is a measured value: no names, functions or arithmetic)", calc.Printable(val[pos:end]))
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
	ctx := s.ctx
	ev := &calc.Evaluator{Env: readingEnv{&ctx}, Src: src, Line: line}
	res, err := ev.Eval(e)
	if err != nil {
		return calc.Quantity{}, field(err.Col), err.Msg
	}
	return res.Value, 0, ""
}

// readingEnv evaluates a reading: no names and no functions, only the
// worksheet's settings (the angle unit of a bare polar angle).
type readingEnv struct{ ctx *calc.Context }

func (readingEnv) Lookup(string) (calc.Quantity, bool) { return calc.Quantity{}, false }
func (readingEnv) Func(string) (*calc.Func, bool)      { return nil, false }
func (r readingEnv) Context() *calc.Context            { return r.ctx }

// FormatReadings writes readings as a readings file that ParseReadings
// reads back to the same values: a header, then a row each, the value in
// rectangular form in the unit's coherent SI symbol with every digit a
// float64 needs, CRLF line ends.
func FormatReadings(rs []Reading) []byte {
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
		w.Write([]string{r.Name, v, readingUnit(q)})
	}
	w.Flush()
	return b.Bytes()
}

// readingUnit is the unit a reading is written back in: the coherent SI
// symbol of its dimension and kind, rad for an angle (held in radians).
func readingUnit(q calc.Quantity) string {
	if q.Kind == calc.KindAngle && q.Dim.IsDimensionless() {
		return "rad"
	}
	return calc.UnitSymbol(q.Dim, q.Kind, false)
}
