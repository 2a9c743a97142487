package cli

import (
	"encoding/csv"
	"io"
	"math"
	"math/cmplx"
	"slices"
	"strconv"
	"strings"

	"argand/calc"
)

// CSV output (--csv) writes the work of a run as tables of RFC 4180
// records for a spreadsheet or another program:
//
//   - A step's table (a sweep, a network's elements, a spread's corners,
//     a spectrum's orders) is one table: a header record, then a record a
//     row. The first column is the row's own value where it stands for one
//     (a sweep point's frequency, "f (Hz)"), else its name. Each column
//     carries its unit in the header, as "|v| (V)". A complex column is
//     four: "re v (V)", "im v (V)", "|v| (V)" and "arg v (°)"; re and im are
//     the value itself, magnitude and angle (always in degrees) are
//     derived for convenience. A column of signed reals (P, Q, a count)
//     is one. Phasors on a peak basis say so: "(V peak)".
//   - The results of steps without a table go one a record into a results
//     table with the fields of a JSON result: line, kind, name, re, im,
//     mag, deg, unit, quantity, basis.
//   - Checks go into a checks table: line, check (the statement), verdict.
//
// Consecutive tables with the same header are one table. Tables are
// separated by one empty line; no field ever holds a line break (input
// text is made printable first), so splitting on empty lines finds every
// table. Records end in CRLF and fields holding a comma or a quote are
// quoted, quotes doubled (RFC 4180). Numbers are written in the shortest
// form that reads back to the same float64 (strconv 'g', -1), always with
// a decimal point whatever the decimal setting; a value that is not a
// finite number is an empty field. A text field starting with = + - @ tab
// or CR is prefixed with an apostrophe so that a spreadsheet does not run
// it as a formula (common practice); numbers are never prefixed. The text
// is UTF-8 in every locale, as JSON is, without a byte order mark.
type csvOut struct {
	w      *csv.Writer
	header []string // the header of the table being written
}

func newCSV(w io.Writer) *csvOut {
	cw := csv.NewWriter(w)
	cw.UseCRLF = true
	return &csvOut{w: cw}
}

// WriteCSV writes steps as CSV tables, as --csv does.
func WriteCSV(w io.Writer, steps []calc.Step) error { return newCSV(w).Steps(steps) }

// Steps writes the steps' tables and flushes them.
func (c *csvOut) Steps(steps []calc.Step) error {
	for i := range steps {
		st := &steps[i]
		if st.Check != nil {
			c.table([]string{"line", "check", "verdict"}, [][]string{checkRecord(st)})
			continue
		}
		if len(st.Results) > 0 {
			c.table(resultsHeader, resultRecords(st))
		}
		if len(st.Rows) > 0 {
			h, recs := rowTable(st)
			c.table(h, recs)
		}
	}
	c.w.Flush()
	return c.w.Error()
}

// table writes records under header, starting a new table when the
// header differs from the one being written.
func (c *csvOut) table(header []string, records [][]string) {
	if len(records) == 0 {
		return
	}
	if !slices.Equal(header, c.header) {
		if c.header != nil {
			c.w.Write(nil) // an empty line between tables
		}
		c.w.Write(header)
		c.header = header
	}
	for _, r := range records {
		c.w.Write(r)
	}
}

// resultsHeader names the fields of a results record: those of a JSON
// result (shared DESIGN.md), with the line and the step's kind first.
var resultsHeader = []string{"line", "kind", "name", "re", "im", "mag", "deg", "unit", "quantity", "basis"}

func resultRecords(st *calc.Step) [][]string {
	out := make([][]string, 0, len(st.Results))
	for _, o := range st.Results {
		q := o.Value
		re, im := real(q.V), imag(q.V)
		deg, unit := calc.Deg(q.V), calc.UnitSymbol(q.Dim, q.Kind, false)
		if isAngle(q) {
			// as in JSON: re in radians, deg in degrees
			deg, unit = re*180/math.Pi, "rad"
		}
		out = append(out, []string{lineField(st.Line), csvText(st.Kind), csvText(o.Name),
			csvNum(re), csvNum(im), csvNum(cmplx.Abs(q.V)), csvNum(deg),
			csvText(unit), calc.QuantityName(q), st.Basis.String()})
	}
	return out
}

func checkRecord(st *calc.Step) []string {
	verdict := "pass"
	if !st.Check.Pass {
		verdict = "fail"
	}
	return []string{lineField(st.Line), csvText(st.Source), verdict}
}

func lineField(n int) string {
	if n <= 0 {
		return ""
	}
	return strconv.Itoa(n)
}

func isAngle(q calc.Quantity) bool {
	return q.Kind == calc.KindAngle && q.Dim.IsDimensionless() && q.IsReal()
}

// csvNum writes x so that it reads back exactly, with a decimal point;
// NaN and the infinities, which argand never shows, are an empty field.
func csvNum(x float64) string {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return ""
	}
	if x == 0 {
		return "0" // not -0
	}
	return strconv.FormatFloat(x, 'g', -1, 64)
}

// csvText makes a text field safe: control characters and line breaks
// shown as visible escapes (a tab as a space), and a leading character a spreadsheet would take for the start
// of a formula (= + - @ tab CR) guarded by an apostrophe.
func csvText(s string) string {
	// Printable keeps the line feed, the line break of text; a field
	// keeps none, so that tables are found by their empty lines
	s = strings.ReplaceAll(calc.Printable(s), "\n", `\x0a`)
	if s != "" && strings.ContainsRune("=+-@\t\r", rune(s[0])) {
		return "'" + s
	}
	return s
}

// column is one value column of a step's table.
type column struct {
	key     string
	unit    string // "" when dimensionless
	mixed   bool   // rows differ in unit: each row's unit in a column of its own
	complex bool   // some value has an angle: four fields
}

// rowTable builds the header and records of a step's rows.
func rowTable(st *calc.Step) ([]string, [][]string) {
	keyed, noted := true, false
	for _, r := range st.Rows {
		keyed = keyed && r.Key.Name != ""
		noted = noted || r.Note != ""
	}
	cols := columns(st)
	var header []string
	if keyed {
		header = append(header, headed(st.Rows[0].Key.Name, unitOf(st.Rows[0].Key.Value, st.Basis)))
	} else {
		header = append(header, "name")
	}
	for _, c := range cols {
		header = append(header, c.header()...)
	}
	if noted {
		header = append(header, "note")
	}
	recs := make([][]string, 0, len(st.Rows))
	for _, r := range st.Rows {
		var rec []string
		if keyed {
			rec = append(rec, csvNum(real(r.Key.Value.V)))
		} else {
			rec = append(rec, csvText(r.Name))
		}
		for _, c := range cols {
			rec = append(rec, c.fields(r, st.Basis)...)
		}
		if noted {
			rec = append(rec, csvText(r.Note))
		}
		recs = append(recs, rec)
	}
	return header, recs
}

// columns lists the value columns of a step's rows in the order they
// first appear, each with its unit and whether it needs an angle.
func columns(st *calc.Step) []column {
	var cols []column
	at := map[string]int{}
	for _, r := range st.Rows {
		for _, v := range r.Values {
			u := unitOf(v.Value, st.Basis)
			i, seen := at[v.Name]
			if !seen {
				at[v.Name] = len(cols)
				cols = append(cols, column{key: v.Name, unit: u})
				i = len(cols) - 1
			}
			c := &cols[i]
			c.mixed = c.mixed || c.unit != u
			c.complex = c.complex || !v.Value.Scalar()
		}
	}
	return cols
}

// unitOf is the unit a value is written in: its symbol, rad for an angle
// (held in radians), and "V peak" for a phasor on a peak basis.
func unitOf(q calc.Quantity, b calc.Basis) string {
	if isAngle(q) {
		return "rad"
	}
	u := calc.UnitSymbol(q.Dim, q.Kind, false)
	if b == calc.Peak && calc.QuantityName(q) == "phasor" {
		u += " peak"
	}
	return u
}

// headed writes a column's header: its name and, when it has one, its
// unit in parentheses.
func headed(name, unit string) string {
	if unit == "" {
		return csvText(name)
	}
	return csvText(name + " (" + unit + ")")
}

func (c column) header() []string {
	u := c.unit
	if c.mixed {
		u = ""
	}
	var h []string
	if c.complex {
		h = []string{headed("re "+c.key, u), headed("im "+c.key, u), headed("|"+c.key+"|", u), headed("arg "+c.key, "°")}
	} else {
		h = []string{headed(c.key, u)}
	}
	if c.mixed {
		h = append(h, csvText(c.key+" unit"))
	}
	return h
}

// fields writes the column's fields of one row: empty when the row has
// no such value.
func (c column) fields(r calc.Row, b calc.Basis) []string {
	n := 1
	if c.complex {
		n = 4
	}
	if c.mixed {
		n++
	}
	out := make([]string, n)
	for _, v := range r.Values {
		if v.Name != c.key {
			continue
		}
		q := v.Value
		out[0] = csvNum(real(q.V))
		if c.complex {
			out[1], out[2], out[3] = csvNum(imag(q.V)), csvNum(cmplx.Abs(q.V)), csvNum(calc.Deg(q.V))
		}
		if c.mixed {
			out[n-1] = csvText(unitOf(q, b))
		}
		break
	}
	return out
}
