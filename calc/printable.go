package calc

import (
	"strconv"
	"strings"
	"unicode/utf8"
)

// Printable returns s as text that a terminal shows and never acts on:
// every character that a terminal would take as a command, or that would
// reorder the text around it, is written as a visible escape. C0 controls
// other than the line feed, DEL and invalid UTF-8 bytes become \xHH (ESC
// is \x1b); C1 controls (U+0080 to U+009F, among them U+009B, the
// one-character form of CSI), the bidirectional formatting characters
// (U+202A to U+202E, U+2066 to U+2069, U+200E, U+200F, U+061C) and the
// Unicode line and paragraph separators, and the invisible zero-width
// characters (U+200B to U+200D, U+2060, and U+FEFF, the byte-order mark)
// become \uHHHH. A tab becomes a
// space. The line feed stays: it is the line break of every text argand
// writes. Text from input passes through here on every human-readable
// output path, so that a worksheet cannot move the cursor, clear the
// screen, set the clipboard or reverse a line on the reader's terminal.
// Printable(Printable(s)) == Printable(s).
func Printable(s string) string {
	i := 0
	for i < len(s) {
		if c := s[i]; c >= 0x20 && c < 0x7f {
			i++ // printable ASCII, the usual case
			continue
		}
		r, n := utf8.DecodeRuneInString(s[i:])
		if escapeOf(r, n, s[i]) != "" {
			break
		}
		i += n
	}
	if i == len(s) {
		return s
	}
	var b strings.Builder
	b.Grow(len(s) + 8)
	b.WriteString(s[:i])
	for i < len(s) {
		r, n := utf8.DecodeRuneInString(s[i:])
		if e := escapeOf(r, n, s[i]); e != "" {
			b.WriteString(e)
		} else {
			b.WriteString(s[i : i+n])
		}
		i += n
	}
	return b.String()
}

// Quoted is s made Printable between double quotes, for naming a piece of
// input in a message. It does not quote as strconv.Quote does: applied to
// Printable's output that would write each escape's backslash twice.
func Quoted(s string) string { return `"` + Printable(s) + `"` }

// PrintableRune is Printable of the one character r.
func PrintableRune(r rune) string {
	if r < utf8.RuneSelf {
		if e := escapeOf(r, 1, byte(r)); e != "" {
			return e
		}
		return string(r)
	}
	return Printable(string(r))
}

// escapeOf returns the visible form of the character r (n bytes, first
// byte b), or "" when it is shown as it is.
func escapeOf(r rune, n int, b byte) string {
	switch {
	case r == utf8.RuneError && n == 1:
		return hexEscape(`\x`, uint32(b), 2)
	case r == '\n':
		return ""
	case r == '\t':
		return " "
	case r < 0x20 || r == 0x7f:
		return hexEscape(`\x`, uint32(r), 2)
	case r < 0x80:
		return ""
	case r <= 0x9f,
		r >= 0x202a && r <= 0x202e,
		r >= 0x2066 && r <= 0x2069,
		r == 0x200e, r == 0x200f, r == 0x061c,
		r == 0x2028, r == 0x2029,
		r >= 0x200b && r <= 0x200d, r == 0x2060, r == 0xfeff:
		return hexEscape(`\u`, uint32(r), 4)
	}
	return ""
}

func hexEscape(prefix string, v uint32, digits int) string {
	h := strconv.FormatUint(uint64(v), 16)
	for len(h) < digits {
		h = "0" + h
	}
	return prefix + h
}
