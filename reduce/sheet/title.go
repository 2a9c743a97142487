package sheet

import (
	"strings"
	"unicode/utf8"

	"argand/calc"
)

// MaxTitle bounds a job title, in characters: a title heads a record and
// a screen, it is not a place for the job's notes.
const MaxTitle = 200

// stmtTitle names the job: the rest of the line after the word, as
// written (a # still starts a comment). The title heads the record that
// argand export --html writes; a later title statement replaces it.
func (s *Sheet) stmtTitle(p *calc.Parser) error {
	kw := p.Next()
	src := p.Source()
	// the words are taken as written, not as tokens: a title may hold
	// anything a person writes (Bay 3 – feeder "B", 11/2026)
	text := strings.TrimSpace(src[min(kw.End, len(src)):])
	if text == "" {
		p.FailAt(kw.Col+utf8.RuneCountInString(kw.Text), 1, "title needs the job's title after it, as in: title Workshop supply, bay 3")
		return p.Err()
	}
	if n := utf8.RuneCountInString(text); n > MaxTitle {
		p.FailAt(kw.Col, utf8.RuneCountInString(src), "a title holds at most %d characters, this one %d", MaxTitle, n)
		return p.Err()
	}
	if calc.Printable(text) != text {
		// a title is shown on screens and in records as it is written
		p.FailAt(kw.Col, utf8.RuneCountInString(src), "a title holds no control, invisible or direction-changing character (it shows here as %s)", calc.Printable(text))
		return p.Err()
	}
	s.title = text
	s.record(calc.Step{Kind: "setting", Source: src, Rule: "job title: " + text})
	return nil
}

// Title returns the job's title, "" until a title statement sets it.
func (s *Sheet) Title() string { return s.title }
