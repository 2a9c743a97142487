package tui

import (
	"fmt"
	"strings"

	"argand/calc"
	"argand/reduce/sheet"
	"argand/tui/cli"
)

// format returns the number format in force: the worksheet's digits and
// angle unit, the session's glyph set.
func (s *session) format() calc.Format {
	f := s.sh.Context().Format
	f.ASCII = s.ascii
	return f
}

// trailText is the whole trail as plain text.
func (s *session) trailText() string {
	var b strings.Builder
	f := s.format()
	for _, st := range s.sh.Steps() {
		b.WriteString(st.Text(f, s.v.PolarFirst))
	}
	return b.String()
}

// trailCSV is the whole trail's tables and results as CSV, as argand run
// --csv writes them.
func (s *session) trailCSV() string {
	var b strings.Builder
	_ = cli.WriteCSV(&b, s.sh.Steps()) // a strings.Builder takes every write
	return b.String()
}

// trailMarkdown is the whole trail as Markdown: each step a heading with
// its statement, the rule and formula, operands and results in a list.
func (s *session) trailMarkdown() string {
	var b strings.Builder
	f := s.format()
	set := s.sh.Settings()
	fmt.Fprintf(&b, "# argand trail\n\nWorking frequency %s, %s basis, %d significant figures, %s.\n\n",
		f.Mag(set.Freq, calc.DimFrequency, 0), strings.ToUpper(set.Basis.String()), set.Digits, sheet.DecimalLine(set.Comma))
	for i, st := range s.sh.Steps() {
		head := st.Source
		if head == "" {
			head = st.Kind
		}
		fmt.Fprintf(&b, "## %d. `%s`\n\n", i+1, strings.ReplaceAll(head, "`", "'"))
		if st.Rule != "" {
			b.WriteString(st.Rule)
			if st.Formula != "" {
				b.WriteString(": `" + st.Formula + "`")
			}
			b.WriteString("\n\n")
		}
		for _, o := range st.Inputs {
			b.WriteString("- " + o.Name + " = " + f.Both(o.Value, s.v.PolarFirst) + "\n")
		}
		for _, o := range st.Results {
			b.WriteString("- **" + o.Name + " = " + f.Both(o.Value, s.v.PolarFirst) + "**\n")
		}
		for _, r := range st.Rows {
			b.WriteString("- " + r.Name + ":")
			for _, v := range r.Values {
				b.WriteString(" " + v.Name + " = " + f.Polar(v.Value) + ";")
			}
			b.WriteString("\n")
		}
		if c := st.Check; c != nil {
			v := "PASS"
			if !c.Pass {
				v = "FAIL"
			}
			b.WriteString("- check " + v + ": got " + f.Both(c.Got, false) + ", expected " + f.Both(c.Want, false) + "\n")
		}
		for _, n := range st.Notes {
			b.WriteString("- note: " + n + "\n")
		}
		b.WriteString("\n")
	}
	b.WriteString("---\n\n" + calc.SafetyText + "\n")
	// a Markdown file is read on a terminal too
	return calc.Printable(b.String())
}

// worksheetText is the session as a worksheet: the accepted statements,
// which argand run replays to the same values.
func (s *session) worksheetText() string {
	var b strings.Builder
	// the first line says which reading of input the statements were
	// accepted in, so a later argand can list lines that read differently
	// and the decimal marker they begin in, so it replays the same under
	// any setting
	w := s.sh.Worksheet()
	b.WriteString(w[0] + "\n" + w[1] + "\n")
	b.WriteString("# argand worksheet saved from a session\n")
	for _, s := range w[2:] {
		b.WriteString(s + "\n")
	}
	return b.String()
}
