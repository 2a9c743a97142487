// Package controls holds the catalogue of control sequences that tests
// push through every output path, and the check that none reaches a
// terminal as a control character. It is imported by tests only.
package controls

import (
	"fmt"
	"os"
	"path/filepath"
	"runtime"
	"strconv"
	"strings"
	"testing"
	"unicode/utf8"
)

// Case is one control sequence of the catalogue.
type Case struct {
	Name string
	Text string
}

// Catalogue reads testdata/controls.txt at the top of the module.
func Catalogue(t testing.TB) []Case {
	t.Helper()
	_, here, _, _ := runtime.Caller(0)
	path := filepath.Join(filepath.Dir(here), "..", "..", "..", "testdata", "controls.txt")
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	var out []Case
	for i, l := range strings.Split(string(b), "\n") {
		if l == "" || strings.HasPrefix(l, "#") {
			continue
		}
		name, lit, ok := strings.Cut(l, "\t")
		text, err := strconv.Unquote(lit)
		if !ok || err != nil {
			t.Fatalf("%s:%d: want NAME<tab>\"literal\": %q", path, i+1, l)
		}
		out = append(out, Case{Name: name, Text: text})
	}
	if len(out) < 10 {
		t.Fatalf("%s: only %d cases", path, len(out))
	}
	return out
}

// Check reports the first character of out that a terminal would act on:
// a C0 control other than the line feed, DEL, a C1 control, a byte that is
// not UTF-8, a bidirectional formatting character or a line separator.
// When sgr is set, the style sequences ESC [ digits ; m of the app's own
// styling are allowed.
func Check(out string, sgr bool) error {
	for i := 0; i < len(out); {
		if sgr && out[i] == 0x1b && i+1 < len(out) && out[i+1] == '[' {
			j := i + 2
			for j < len(out) && (out[j] >= '0' && out[j] <= '9' || out[j] == ';' || out[j] == ':') {
				j++
			}
			if j < len(out) && out[j] == 'm' {
				i = j + 1
				continue
			}
		}
		r, n := utf8.DecodeRuneInString(out[i:])
		bad := r == utf8.RuneError && n == 1 ||
			r < 0x20 && r != '\n' || r == 0x7f || r >= 0x80 && r <= 0x9f ||
			r >= 0x202a && r <= 0x202e || r >= 0x2066 && r <= 0x2069 || r == 0x2028 || r == 0x2029
		if bad {
			lo, hi := max(0, i-20), min(len(out), i+20)
			return fmt.Errorf("control %q at byte %d, in %q", out[i:i+n], i, out[lo:hi])
		}
		i += n
	}
	return nil
}

// Escaped is the visible form that the rules of argand's printable text
// give text: written here again, apart from the code under test, so that
// a test can say what the reader must see.
func Escaped(s string) string {
	var b strings.Builder
	for i := 0; i < len(s); {
		r, n := utf8.DecodeRuneInString(s[i:])
		switch {
		case r == utf8.RuneError && n == 1:
			fmt.Fprintf(&b, `\x%02x`, s[i])
		case r == '\t':
			b.WriteByte(' ')
		case r == '\n':
			b.WriteByte('\n')
		case r < 0x20 || r == 0x7f:
			fmt.Fprintf(&b, `\x%02x`, r)
		case r >= 0x80 && r <= 0x9f, r >= 0x202a && r <= 0x202e, r >= 0x2066 && r <= 0x2069,
			r == 0x200e, r == 0x200f, r == 0x061c, r == 0x2028, r == 0x2029:
			fmt.Fprintf(&b, `\u%04x`, r)
		default:
			b.WriteString(s[i : i+n])
		}
		i += n
	}
	return b.String()
}
