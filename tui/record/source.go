package record

import (
	"errors"
	"html"
	"io"
	"strings"

	"argand/calc"
)

// anchor is the id of a caution topic's paragraph.
func anchor(c calc.Caution) string {
	return strings.ReplaceAll(c.String(), " ", "-")
}

// cautions writes the whole text of each caution topic the results carry,
// each topic once, in the order first met.
func (p *page) cautions(steps []calc.Step) {
	var topics []calc.Caution
	seen := map[calc.Caution]bool{}
	for i := range steps {
		for _, c := range steps[i].Cautions {
			if !seen[c.Topic] {
				seen[c.Topic] = true
				topics = append(topics, c.Topic)
			}
		}
	}
	p.b.WriteString("<section id=\"cautions\">\n<h2>Cautions</h2>\n")
	if len(topics) == 0 {
		p.b.WriteString("<p>No result of this worksheet carries a caution; the general one is at the end.</p>\n")
	}
	for _, t := range topics {
		p.mains = p.mains || t == calc.CautionMains
		p.printf("<p class=\"caution\" id=\"caution-%s\"><strong>%s.</strong> %s</p>\n", anchor(t), esc(upperFirst(t.String())), esc(t.Text()))
	}
	p.b.WriteString("</section>\n")
}

func upperFirst(s string) string {
	if s == "" {
		return s
	}
	return strings.ToUpper(s[:1]) + s[1:]
}

// Worksheet returns src as a record embeds it: one line feed at each line
// end, no byte-order mark, each line printable (a control character is
// written as its visible escape, and a tab as a space). A worksheet that
// ran keeps its meaning: argand reads such characters only in comments.
func Worksheet(src string) string {
	src = strings.TrimPrefix(src, "\ufeff")
	src = strings.ReplaceAll(src, "\r\n", "\n")
	src = strings.ReplaceAll(src, "\r", "\n")
	src = calc.Printable(src)
	if src != "" && !strings.HasSuffix(src, "\n") {
		src += "\n"
	}
	return src
}

const (
	sourceOpen  = "<pre id=\"" + SourceID + "\" class=\"source\">\n"
	sourceClose = "</pre>"
)

// source writes the worksheet, escaped, with how to take it out again.
// The line feed after the opening tag is the one an HTML parser drops, so
// the text reads back exactly whatever its first line.
func (p *page) source(src string) {
	p.b.WriteString("<section id=\"worksheet\">\n<h2>Worksheet</h2>\n")
	p.b.WriteString("<p>The worksheet these steps came from. To replay it, save it from this record and run it: " +
		"<code>argand export --source RECORD.html &gt; job.argand</code> then <code>argand run job.argand</code> " +
		"(or copy the text below into a file).</p>\n")
	p.b.WriteString(sourceOpen + html.EscapeString(Worksheet(src)) + sourceClose + "\n</section>\n</main>\n")
}

// MaxRecord bounds the size of a record Extract reads.
const MaxRecord = 64 << 20

// Extract returns the worksheet embedded in a record written by Write:
// the text of the element with id SourceID, unescaped.
func Extract(r io.Reader) (string, error) {
	b, err := io.ReadAll(io.LimitReader(r, MaxRecord+1))
	if err != nil {
		return "", err
	}
	if len(b) > MaxRecord {
		return "", errors.New("larger than a record argand writes")
	}
	doc := string(b)
	i := strings.Index(doc, sourceOpen)
	if i < 0 {
		return "", errors.New("no worksheet in it (not a record made by argand export --html)")
	}
	doc = doc[i+len(sourceOpen):]
	j := strings.Index(doc, sourceClose)
	if j < 0 {
		return "", errors.New("the worksheet in it is cut short")
	}
	return html.UnescapeString(doc[:j]), nil
}
