// Package record writes a job record: one self-contained HTML file of a
// worksheet's work, for a job file or a commissioning record. It holds the
// job's title and date, every step in rectangular and polar form with its
// rule, formula and inputs, phasor diagrams and power triangles drawn as
// inline SVG from the values, each check with its verdict and difference,
// the cautions of the results, and the worksheet itself, so that the
// record replays with argand run (see Extract).
//
// The file loads nothing from elsewhere and runs no script: it reads the
// same offline, on a phone and on paper. Every name and text that comes
// from the worksheet is made printable (calc.Printable) and HTML-escaped.
package record

import (
	"fmt"
	"html"
	"io"
	"strings"
	"time"

	"argand/calc"
	"argand/reduce/sheet"
)

// SourceID is the id of the element that holds the worksheet in a record:
// <pre id="argand-worksheet">, its text HTML-escaped after one line feed.
const SourceID = "argand-worksheet"

// Job is what a record is made of.
type Job struct {
	// Sheet is the worksheet after it ran: its steps, title and settings.
	Sheet *sheet.Sheet
	// Source is the worksheet text the steps came from, embedded whole.
	Source string
	// Date is the record's date, YYYY-MM-DD.
	Date string
	// PolarFirst lists the polar form before the rectangular one.
	PolarFirst bool
}

// ValidDate reports an error unless d is a date written YYYY-MM-DD.
func ValidDate(d string) error {
	if _, err := time.Parse("2006-01-02", d); err != nil || len(d) != 10 {
		return fmt.Errorf("the date is written YYYY-MM-DD, as in 2026-03-14, not %s", calc.Quoted(d))
	}
	return nil
}

// Write writes the record of j to w as one HTML document.
func Write(w io.Writer, j Job) error {
	if j.Sheet == nil {
		return fmt.Errorf("record: no worksheet")
	}
	if err := ValidDate(j.Date); err != nil {
		return err
	}
	f := j.Sheet.Context().Format
	// the record is UTF-8 whatever the terminal: Ω, µ and ∠ as they are
	f.ASCII = false
	p := &page{f: f, polarFirst: j.PolarFirst}
	p.head(j)
	p.steps(j.Sheet.Steps())
	p.checks(j.Sheet.Steps())
	p.cautions(j.Sheet.Steps())
	p.source(j.Source)
	p.foot()
	_, err := io.WriteString(w, p.b.String())
	return err
}

// page builds the document.
type page struct {
	b          strings.Builder
	f          calc.Format
	polarFirst bool
	figures    int // figures drawn so far, for their ids
	mains      bool
}

// esc is text from the worksheet (or any text) as HTML: printable first,
// so a control character shows as its escape, then escaped.
func esc(s string) string { return html.EscapeString(calc.Printable(s)) }

func (p *page) printf(format string, a ...any) { fmt.Fprintf(&p.b, format, a...) }

func (p *page) head(j Job) {
	title := j.Sheet.Title()
	shown := title
	if shown == "" {
		shown = "Untitled job (no title statement)"
	}
	pass, fail := j.Sheet.Checks()
	p.b.WriteString("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\" />\n")
	p.b.WriteString("<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\" />\n")
	p.b.WriteString("<meta name=\"generator\" content=\"argand\" />\n")
	p.printf("<title>%s · %s</title>\n<style>%s</style>\n</head>\n<body>\n", esc(shown), esc(j.Date), style)
	p.printf("<header>\n<h1>%s</h1>\n", esc(shown))
	p.printf("<p class=\"meta\">Job record made by argand on <time datetime=\"%s\">%s</time>. ", esc(j.Date), esc(j.Date))
	p.printf("%d steps; checks: %d passed, %d failed.</p>\n", len(j.Sheet.Steps()), pass, fail)
	st := j.Sheet.Settings()
	p.printf("<p class=\"meta\">Settings at the end of the worksheet: working frequency %s, %s phasors, %d significant figures, %s, phase sequence %s.</p>\n",
		esc(p.f.Mag(st.Freq, calc.DimFrequency, 0)), strings.ToUpper(st.Basis.String()), st.Digits, sheet.DecimalLine(st.Comma), sequence(st.Sequence))
	p.b.WriteString("<nav><p>Contents: <a href=\"#steps\">steps</a> · <a href=\"#checks\">checks</a> · <a href=\"#cautions\">cautions</a> · <a href=\"#worksheet\">worksheet</a></p></nav>\n</header>\n")
}

func sequence(n int) string {
	if n < 0 {
		return "ACB"
	}
	return "ABC"
}

func (p *page) foot() {
	p.b.WriteString("<footer>\n")
	if !p.mains {
		p.printf("<p class=\"safety\">%s</p>\n", esc(calc.SafetyText))
	}
	p.b.WriteString("<p>Made by argand, a calculation aid; the worksheet above replays every value with argand run.</p>\n</footer>\n</body>\n</html>\n")
}
