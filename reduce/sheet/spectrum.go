package sheet

import (
	"errors"
	"fmt"
	"path/filepath"
	"sort"
	"strconv"
	"strings"
	"unicode/utf8"

	"argand/calc"
	"argand/reduce/harmonic"
)

// spectrumDef is a spectrum defined in the worksheet.
type spectrumDef struct {
	s    harmonic.Spectrum
	line int
}

// Spectrum returns the spectrum called name, for the app and tests.
func (s *Sheet) Spectrum(name string) (harmonic.Spectrum, bool) {
	d, ok := s.spectra[name]
	if !ok {
		return harmonic.Spectrum{}, false
	}
	return d.s, true
}

// SpectrumNames lists the spectra defined, sorted.
func (s *Sheet) SpectrumNames() []string {
	out := make([]string, 0, len(s.spectra))
	for n := range s.spectra {
		out = append(out, n)
	}
	sort.Strings(out)
	return out
}

// spectrumFunc returns a function that reads spectra, bound to this
// worksheet's spectra: their names are the bare words it accepts.
func (s *Sheet) spectrumFunc(name string) (*calc.Func, bool) {
	look := func(n string) (harmonic.Spectrum, bool) { return s.Spectrum(n) }
	for _, f := range harmonic.Funcs(look, s.SpectrumNames()) {
		if f.Name == name {
			f := f
			return &f, true
		}
	}
	return nil, false
}

// spectrumOrders are the orders of a spectrum statement as given, each
// with the column it was typed at (for an error that names one order),
// and a note on where they came from.
type spectrumOrders struct {
	entries []harmonic.Entry
	cols    []int
	note    string
}

// stmtSpectrum runs:
//
//	spectrum NAME h1 230 V, h3 6.9 V ∠ 10, h5 4 % ∠ -120, …
//	spectrum NAME from FILE
//
// Each order's value is its RMS magnitude with a unit or a percentage of
// the fundamental, with an optional angle after ∠.
func (s *Sheet) stmtSpectrum(p *calc.Parser) error {
	p.Next()
	nameTok := p.Next()
	if err := s.spectrumName(p, nameTok); err != nil {
		return err
	}
	var ord spectrumOrders
	if p.IsWord("from") {
		path, col, err := spectrumPath(p, nameTok.Text)
		if err != nil {
			return err
		}
		if s.limits.NoFiles {
			return lineErr(s.line, col, utf8.RuneCountInString(path), "spectrum %s from: files cannot be read here (this argand serves sessions over the network); type the orders on the line", nameTok.Text)
		}
		if s.dry {
			return nil
		}
		if ord, err = s.spectrumFile(path, col); err != nil {
			return err
		}
	} else {
		var err error
		if ord, err = s.spectrumList(p, nameTok.Text); err != nil {
			return err
		}
	}
	return s.defineSpectrum(p, nameTok, ord)
}

// spectrumName checks the name a spectrum statement gives: a spectrum may
// be given again under its name, but no other value or network may share
// it, nor another spectrum a name that differs only in case, which a
// reader would take for the same.
func (s *Sheet) spectrumName(p *calc.Parser, nameTok calc.Item) error {
	if _, again := s.spectra[nameTok.Text]; !again || nameTok.Tok != calc.TokIdent {
		if !s.validName(p, nameTok) {
			return p.Err()
		}
	}
	name := nameTok.Text
	if d, ok := s.byName[name]; ok {
		p.Failf(nameTok, "%s is already a named value (line %d)", name, d.line)
		return p.Err()
	}
	if _, ok := s.nets[name]; ok {
		p.Failf(nameTok, "%s is a network", name)
		return p.Err()
	}
	for other := range s.spectra {
		if other != name && strings.EqualFold(other, name) {
			p.Failf(nameTok, "spectrum %s differs from spectrum %s only in case; choose another name", name, other)
			return p.Err()
		}
	}
	return nil
}

// spectrumPath reads the file name after from: the rest of the line as
// typed (a path is not tokens), and the column it starts at.
func spectrumPath(p *calc.Parser, name string) (string, int, error) {
	from := p.Next()
	rest := p.Source()[from.End:]
	path := strings.TrimSpace(rest)
	col := from.Col + 4 + utf8.RuneCountInString(rest[:len(rest)-len(strings.TrimLeft(rest, " \t"))])
	if path == "" {
		p.FailAt(col, 1, "spectrum %s from: the file name is missing", name)
		return "", col, p.Err()
	}
	return path, col, nil
}

// spectrumFile reads a spectrum's orders from a file; an error names the
// file at the column of its name.
func (s *Sheet) spectrumFile(path string, col int) (spectrumOrders, error) {
	// a relative name is read from beside the worksheet (SetDir), as a
	// readings file is, wherever argand was started
	full := path
	if !filepath.IsAbs(path) && s.dir != "" {
		full = filepath.Join(s.dir, path)
	}
	entries, err := readSpectrumFile(full)
	if err != nil {
		return spectrumOrders{}, lineErr(s.line, col, utf8.RuneCountInString(path), "%s: %v", calc.Printable(full), err)
	}
	ord := spectrumOrders{entries: entries}
	for range entries {
		ord.cols = append(ord.cols, col)
	}
	ord.note = "read from " + calc.Printable(full) + " (" + strconv.Itoa(len(entries)) + " orders)"
	return ord, nil
}

// spectrumList reads and evaluates the orders typed on the line: h5 22 %
// ∠ 170, separated by commas.
func (s *Sheet) spectrumList(p *calc.Parser, name string) (spectrumOrders, error) {
	var ord spectrumOrders
	if p.Peek().Tok == calc.TokEOF {
		return ord, perr(p, "spectrum %s needs its orders, as in: spectrum %s h1 230 V, h5 4 %%, h7 3 %% ∠ 40   (or: spectrum %s from FILE)", name, name, name)
	}
	for {
		t := p.Next()
		order, ok := orderWord(t)
		switch {
		case t.Tok == calc.TokEOF:
			p.FailAt(t.Col, 1, "expected an order such as h5 after the comma, found the end of the line")
			return ord, p.Err()
		case !ok:
			p.Failf(t, "expected an order such as h1, h5 or h7, found %q", t.Text)
			return ord, p.Err()
		case p.IsOp("="):
			p.Failf(p.Peek(), "write the value right after the order, without '=': h%d 100 A", order)
			return ord, p.Err()
		}
		if p.Peek().Tok == calc.TokEOF || p.IsOp(",") {
			return ord, perr(p, "order h%d needs a value: a magnitude with its unit or a percentage of the fundamental", order)
		}
		e := p.Expr()
		if err := p.Err(); err != nil {
			return ord, err
		}
		if len(ord.entries) >= harmonic.MaxOrder {
			p.Failf(t, "a spectrum holds at most %d orders", harmonic.MaxOrder)
			return ord, p.Err()
		}
		r, err := s.eval(p, e)
		if err != nil {
			return ord, err
		}
		ord.entries = append(ord.entries, harmonic.Entry{Order: order, Value: r.Value, Percent: percentOf(e), HasAngle: hasAngle(e, r.Value)})
		ord.cols = append(ord.cols, t.Col)
		if p.Peek().Tok == calc.TokEOF {
			return ord, nil
		}
		if !p.IsOp(",") {
			return ord, perr(p, "expected ',' before the next order, found %q", p.Peek().Text)
		}
		p.Next()
	}
}

// defineSpectrum builds the spectrum from its orders and keeps it under
// its name; what reads a spectrum given again is evaluated again.
func (s *Sheet) defineSpectrum(p *calc.Parser, nameTok calc.Item, ord spectrumOrders) error {
	name := nameTok.Text
	sp, err := harmonic.Build(ord.entries)
	if err != nil {
		var ee *harmonic.EntryError
		col, n := nameTok.Col, utf8.RuneCountInString(name)
		if errors.As(err, &ee) && ee.Index >= 0 && ee.Index < len(ord.cols) {
			col, n = ord.cols[ee.Index], 1
		}
		return lineErr(s.line, col, n, "spectrum %s: %v", name, err)
	}
	if s.dry {
		return nil
	}
	if s.spectra == nil {
		s.spectra = map[string]*spectrumDef{}
	}
	_, existed := s.spectra[name]
	if existed {
		s.keep()
	}
	s.spectra[name] = &spectrumDef{s: sp, line: s.line}
	st := harmonic.Describe(p.Source(), name, sp, &s.ctx)
	if ord.note != "" {
		st.Notes = append([]string{ord.note}, st.Notes...)
	}
	s.record(st)
	if existed {
		if err := s.reevaluate(map[string]bool{name: true}, "spectrum "+name+" redefined"); err != nil {
			return err
		}
	}
	return nil
}

// orderWord reads h1, h5, … as a harmonic order.
func orderWord(t calc.Item) (int, bool) {
	if t.Tok != calc.TokIdent || len(t.Text) < 2 || (t.Text[0] != 'h' && t.Text[0] != 'H') {
		return 0, false
	}
	n, err := strconv.Atoi(t.Text[1:])
	if err != nil || n < 0 || t.Text[1] == '+' || t.Text[1] == '-' {
		return 0, false
	}
	return n, true
}

// percentOf reports a value written as a percentage: 4 %, 4 % ∠ 30, or
// 4∠30 %.
func percentOf(e calc.Expr) bool {
	switch n := e.(type) {
	case *calc.Paren:
		return percentOf(n.X)
	case *calc.Lit:
		return n.Unit == "%"
	case *calc.Unary:
		return percentOf(n.X)
	case *calc.Polar:
		return n.Unit == "%" || percentOf(n.Mag)
	}
	return false
}

// hasAngle reports a value written with an angle (polar or complex).
func hasAngle(e calc.Expr, v calc.Quantity) bool {
	for {
		pe, ok := e.(*calc.Paren)
		if !ok {
			break
		}
		e = pe.X
	}
	if _, ok := e.(*calc.Polar); ok {
		return true
	}
	return !v.IsReal()
}

// readSpectrumFile reads a spectrum file of at most harmonic.MaxFile bytes.
func readSpectrumFile(path string) ([]harmonic.Entry, error) {
	data, err := readBounded(path, harmonic.MaxFile, "spectrum")
	if err != nil {
		return nil, err
	}
	entries, lines, err := harmonic.ParseCSV(data)
	if err != nil {
		return nil, err
	}
	// Build names an entry by index; check here too so the line is named
	if _, berr := harmonic.Build(entries); berr != nil {
		var ee *harmonic.EntryError
		if errors.As(berr, &ee) && ee.Index >= 0 && ee.Index < len(lines) {
			return nil, fmt.Errorf("line %d: %v", lines[ee.Index], berr)
		}
		return nil, berr
	}
	return entries, nil
}
