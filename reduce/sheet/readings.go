package sheet

import (
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"unicode/utf8"

	"argand/calc"
	"argand/reduce/readings"
)

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
	data, err := readBounded(full, readings.MaxBytes, "readings")
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
		_, isNet := s.nets[r.Name]
		switch {
		case isNet:
			return &readings.Error{Line: r.Line, Col: 1, Msg: fmt.Sprintf("%s is a network; give the reading another name", r.Name)}
		case !ok:
			fresh++
		case d.elem != nil:
			return &readings.Error{Line: r.Line, Col: 1, Msg: fmt.Sprintf("%s is an element (line %d); give the reading another name, as in %s_read", r.Name, d.line, r.Name)}
		case d.owner != "":
			return &readings.Error{Line: r.Line, Col: 1, Msg: fmt.Sprintf("%s is a result of %s; give the reading another name", r.Name, d.owner)}
		}
	}
	if len(s.byName)+fresh > s.limits.Names {
		return fmt.Errorf("%d readings would take the worksheet past its %d names", len(rs), s.limits.Names)
	}
	if fresh < len(rs) {
		s.keep() // before the new names too, which a refusal also undoes
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

// readBounded reads a regular file of at most limit bytes; what names the
// kind of file in the message when it is larger.
func readBounded(path string, limit int, what string) ([]byte, error) {
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
		return nil, fmt.Errorf("the file is larger than %d bytes, the most a %s file may hold: split it", limit, what)
	}
	return data, nil
}

// Reading is one measured value of a readings file.
type Reading = readings.Reading

// ParseReadings reads a readings file (see readings.Parse) as this
// worksheet would: its names checked against the worksheet's reserved
// words, a decimal comma read under decimal comma.
func (s *Sheet) ParseReadings(data []byte) ([]Reading, error) {
	return readings.Parse(data, readings.Options{Comma: s.ctx.Format.Comma, Context: &s.ctx, Reserved: s.Reserved})
}

// FormatReadings writes readings as a file ParseReadings reads back to
// the same values (see readings.Format).
func FormatReadings(rs []Reading) []byte { return readings.Format(rs) }
