package calc

import (
	"strconv"
	"strings"
	"testing"
	"unicode/utf8"
)

// TestPrintable: the characters a terminal acts on are the C0 and C1
// control sets and DEL (ECMA-48), and the bidirectional formatting
// characters reorder the text around them (Unicode UAX #9); each becomes a
// visible escape, everything else is kept.
func TestPrintable(t *testing.T) {
	tests := []struct{ in, want string }{
		{"", ""},
		{"Z1 = 3+j4 Ω ∠36.87° µF ½", "Z1 = 3+j4 Ω ∠36.87° µF ½"},
		{"a\nb", "a\nb"},
		{"a\tb", "a b"},
		{"\x1b[2J", `\x1b[2J`},
		{"\x1b]52;c;aGVsbG8=\x07", `\x1b]52;c;aGVsbG8=\x07`},
		{"\x00\x01\x08\r\x7f", `\x00\x01\x08\x0d\x7f`},
		{"\u0080\u0085\u009b\u009f", `\u0080\u0085\u009b\u009f`},
		{"\u202a\u202b\u202c\u202d\u202e", `\u202a\u202b\u202c\u202d\u202e`},
		{"\u2066\u2067\u2068\u2069", `\u2066\u2067\u2068\u2069`},
		{"\u200e\u200f\u061c\u2028\u2029", `\u200e\u200f\u061c\u2028\u2029`},
		{"\u00a0\u2070", "\u00a0\u2070"}, // printable, kept
		// zero-width characters and the byte-order mark cannot be seen, so
		// a line that holds one would show nothing where the caret points
		{"\u200b\u200c\u200d\u2060\ufeff", `\u200b\u200c\u200d\u2060\ufeff`},
		{"ok\xff\x9b", `ok\xff\x9b`}, // bytes that are not UTF-8
		{"\xc2", `\xc2`},             // a cut sequence
		{`back\slash`, `back\slash`},
	}
	for _, tt := range tests {
		got := Printable(tt.in)
		if got != tt.want {
			t.Errorf("Printable(%q) = %q, want %q", tt.in, got, tt.want)
		}
		if again := Printable(got); again != got {
			t.Errorf("Printable not idempotent on %q: %q", got, again)
		}
	}
}

// FuzzPrintable: whatever the input, the output is valid UTF-8 with no
// control character but the line feed and no bidirectional formatting
// character, and the caret line never holds more than spaces and carets.
func FuzzPrintable(f *testing.F) {
	for _, s := range []string{"", "x = 1 # \x1b[2J", "\u202e\u009b\r\t\xff", "Ω\n\x7f"} {
		f.Add(s, 3, 2)
	}
	f.Fuzz(func(t *testing.T, s string, col, n int) {
		out := Printable(s)
		if !utf8.ValidString(out) {
			t.Fatalf("not UTF-8: %q", out)
		}
		for _, r := range out {
			if r < 0x20 && r != '\n' || r == 0x7f || r >= 0x80 && r <= 0x9f || r >= 0x202a && r <= 0x202e || r >= 0x2066 && r <= 0x2069 {
				t.Fatalf("control %U left in %q", r, out)
			}
		}
		c := Caret(s, &Error{Col: col, Len: n})
		line, marks, ok := strings.Cut(c, "\n")
		if !ok || strings.Contains(marks, "\n") || strings.Trim(marks, " ^") != "" || !strings.Contains(marks, "^") {
			t.Fatalf("caret %q", c)
		}
		if strings.ContainsAny(line, "\n\t") || line != strings.ReplaceAll(Printable(strings.ReplaceAll(s, "\n", "\x00")), `\x00`, `\x0a`) && !strings.Contains(s, "\x00") {
			t.Fatalf("caret line %q for %q", line, s)
		}
		if len(marks) > len(line)+1 {
			t.Fatalf("carets past the line: %q", c)
		}
	})
}

// BenchmarkPrintable: clean text takes the scan alone; text with controls
// is rebuilt once. Both are linear in the length.
func BenchmarkPrintable(b *testing.B) {
	for _, n := range []int{64, 4096, MaxLine} {
		rep := func(unit string) string { return strings.Repeat(unit, n/len(unit)+1)[:n] }
		clean, dirty := rep("Z1 = 3+j4 Ω "), rep("x\x1b[2J\u202e ")
		for _, c := range []struct {
			name, s string
		}{{"clean", clean}, {"controls", dirty}} {
			b.Run(c.name+"-"+strconv.Itoa(n), func(b *testing.B) {
				b.SetBytes(int64(len(c.s)))
				for b.Loop() {
					Printable(c.s)
				}
			})
		}
	}
}

// TestQuoted: a name quoted in a message carries each escape once.
func TestQuoted(t *testing.T) {
	for in, want := range map[string]string{
		"V1":        `"V1"`,
		"V\x1b[31m": `"V\x1b[31m"`,
		"Ω\u202e":   `"Ω\u202e"`,
	} {
		if got := Quoted(in); got != want {
			t.Errorf("Quoted(%q) = %s, want %s", in, got, want)
		}
	}
}
