package tui

import (
	"strings"
	"unicode"
	"unicode/utf8"

	"github.com/charmbracelet/x/ansi"
)

// wrapLine breaks a line of plain text (no escape sequences) into lines of
// at most width cells. Continuation lines start with indent spaces. Breaks
// fall between words, but never inside a value: a unit or an angle stays
// with its number, and "=" or a lone sign stays with what follows, so that
// "= 709.7 mA ∠-41.99°" is never split. A piece longer than a whole line
// is cut by cells.
func wrapLine(s string, width, indent int) []string {
	if width < 1 {
		return []string{s}
	}
	if ansi.StringWidth(s) <= width {
		return []string{s}
	}
	if indent > width/2 {
		indent = width / 2
	}
	lead := len(s) - len(strings.TrimLeft(s, " "))
	if lead > width/2 {
		lead = width / 2
	}
	chunks := loosen(glue(strings.Fields(s)), width-indent)
	var out []string
	cur := strings.Repeat(" ", lead)
	curW := lead
	empty := true // nothing but the indent on the current line
	prefix := strings.Repeat(" ", indent)
	for _, c := range chunks {
		cw := ansi.StringWidth(c)
		sep := 1
		if empty {
			sep = 0
		}
		if curW+sep+cw <= width {
			if !empty {
				cur += " "
			}
			cur += c
			curW += sep + cw
			empty = false
			continue
		}
		if !empty {
			out = append(out, cur)
			cur, curW, empty = prefix, indent, true
		}
		// a piece wider than the room left is cut into parts
		for curW+cw > width {
			part := cut(c, width-curW)
			// before a number, not inside it, when the piece holds
			// something else
			part = backOffNumber(part, c[len(part):])
			if part == "" { // a wide rune that does not fit at all
				_, n := utf8.DecodeRuneInString(c)
				part = c[:n]
			}
			out = append(out, cur+part)
			c = c[len(part):]
			// only the part is measured again: measuring the rest at each
			// cut made a long piece cost its length squared
			cw -= ansi.StringWidth(part)
			cur, curW = prefix, indent
		}
		if c != "" {
			cur += c
			curW += cw
			empty = false
		}
	}
	if !empty {
		out = append(out, cur)
	}
	return out
}

// loosen splits again the glued pieces wider than room: a value with its
// angle too long for a line breaks before the angle (and between the
// parts of a sum) rather than inside a number, a unit staying with its
// number.
func loosen(chunks []string, room int) []string {
	var out []string
	for _, c := range chunks {
		if ansi.StringWidth(c) <= room || !strings.Contains(c, " ") {
			out = append(out, c)
			continue
		}
		for _, w := range strings.Fields(c) {
			if n := len(out); n > 0 && isUnitWord(w) && endsInNumber(out[n-1]) && ansi.StringWidth(out[n-1]+" "+w) <= room {
				out[n-1] += " " + w
				continue
			}
			out = append(out, w)
		}
	}
	return out
}

// glue joins the words that must stay on one line: a unit or an angle
// with the number before it, and "=", "+", "−" or "-" with the word after
// it.
func glue(words []string) []string {
	var out []string
	joinNext := false
	for _, w := range words {
		switch {
		case len(out) > 0 && joinNext:
			sign := out[len(out)-1]
			out[len(out)-1] += " " + w
			if n := len(out); n > 1 && isImag(w) && (sign == "+" || sign == "-" || sign == "−") && endsInNumber(out[n-2]) {
				// the imaginary part stays with the real part:
				// "3.000 + j4.000" is one value
				out[n-2] += " " + out[n-1]
				out = out[:n-1]
			}
		case len(out) > 0 && isAngle(w):
			out[len(out)-1] += " " + w
		case len(out) > 0 && isUnitWord(w) && endsInNumber(out[len(out)-1]):
			out[len(out)-1] += " " + w
		default:
			out = append(out, w)
		}
		joinNext = w == "=" || w == "+" || w == "-" || w == "−" || w == "·"
	}
	return out
}

// isImag reports the imaginary part of a value written in rectangular
// form, "j4.000".
func isImag(w string) bool {
	return len(w) > 1 && w[0] == 'j' && (w[1] >= '0' && w[1] <= '9' || w[1] == '.')
}

// isAngle reports the angle of a polar value, "∠36.87°" or in ASCII
// "@36.87": it belongs with the magnitude before it.
func isAngle(w string) bool {
	if strings.HasPrefix(w, "∠") {
		return true
	}
	return (w[0] == '@' || w[0] == '<') && len(w) > 1 && (w[1] == '-' || w[1] >= '0' && w[1] <= '9')
}

// isUnitWord reports a word that may be a unit: short, beginning with a
// letter or a unit's symbol.
func isUnitWord(w string) bool {
	if utf8.RuneCountInString(w) > 5 {
		return false
	}
	r, _ := utf8.DecodeRuneInString(w)
	return unicode.IsLetter(r) || r == 'Ω' || r == 'µ' || r == '%' || r == '°'
}

func endsInNumber(w string) bool {
	r, _ := utf8.DecodeLastRuneInString(w)
	return r >= '0' && r <= '9' || r == '°' || r == '%'
}

// hangIndent is the indent for the continuation lines of a trail line: two
// more than the line's own, or aligned after "note: " for a note.
func hangIndent(s string) int {
	t := strings.TrimLeft(s, " ")
	lead := len(s) - len(t)
	if strings.HasPrefix(t, "note: ") {
		return lead + len("note: ")
	}
	if i := strings.Index(t, ": "); i > 0 && i <= 4 && strings.Trim(t[:i], "0123456789") == "" {
		return lead + i + 2 // "46: Z3 = …" continues under the statement
	}
	return lead + 2
}

// cut returns the longest start of s at most room cells wide. It looks at
// a bounded start of s (a cell takes at most a few bytes), so that cutting
// a long piece into lines costs its length, not its length times the
// number of lines; it falls back to all of s when zero-width runes or
// escape sequences fill that start.
func cut(s string, room int) string {
	limit := 8*room + 64
	if len(s) <= limit {
		return ansi.Truncate(s, room, "")
	}
	for limit < len(s) && !utf8.RuneStart(s[limit]) {
		limit++
	}
	head := s[:limit]
	part := ansi.Truncate(head, room, "")
	if len(part) == len(head) {
		return ansi.Truncate(s, room, "")
	}
	return part
}
