package cli

import (
	"bytes"
	"strings"
	"testing"

	"argand/tui/internal/controls"
)

// TestControlsNeverReachTheTerminal pushes each control sequence of the
// catalogue through every output path of the command line: the echo of a
// failing line (in a comment, in an expression, as the start of a name),
// step text, the error of an evaluated argument, the file name, JSON, and
// the help of a topic name. No output may hold a control character, and
// each sequence must show as its visible escape.
func TestControlsNeverReachTheTerminal(t *testing.T) {
	for _, c := range controls.Catalogue(t) {
		t.Run(c.Name, func(t *testing.T) {
			visible := controls.Escaped(c.Text)
			worksheets := map[string]string{
				"comment of a failing line": "x = 3\ny = 1/0 # " + c.Text + "\n",
				"inside an expression":      "x = 3\nz = 1 + " + c.Text + " 2\n",
				"start of a name":           c.Text + "n = 3\n",
				"comment of a good line":    "x = 3 # " + c.Text + "\n",
			}
			for where, ws := range worksheets {
				for _, o := range []Options{{}, {ASCII: true}, {JSON: true}} {
					var out, errb bytes.Buffer
					Run(strings.NewReader(ws), "w"+c.Text+".argand", &out, &errb, o)
					if err := controls.Check(out.String()+errb.String(), false); err != nil {
						t.Errorf("%s, %+v: %v", where, o, err)
					}
					if !o.JSON && strings.Contains(where, "failing") && !strings.Contains(errb.String(), visible) {
						t.Errorf("%s: the escape %q is not shown:\n%s", where, visible, errb.String())
					}
				}
			}
			var out, errb bytes.Buffer
			Eval([]string{"1 + 2 " + c.Text}, &out, &errb, Options{})
			if err := controls.Check(out.String()+errb.String(), false); err != nil {
				t.Errorf("eval: %v", err)
			}
			out.Reset()
			errb.Reset()
			Help([]string{c.Text}, &out, &errb, Options{})
			if err := controls.Check(out.String()+errb.String(), false); err != nil {
				t.Errorf("help of a topic name: %v", err)
			}
		})
	}
}

// TestCaretUnderEscapes: the caret stays under the character it marks when
// characters before it are shown as longer escapes, and a marked control
// character is underlined over its whole escape.
func TestCaretUnderEscapes(t *testing.T) {
	cases := []struct {
		src, marked string // the line, and the shown text the carets must cover
	}{
		{"z = 1 \r+ $", "$"},            // a carriage return is read as a space
		{"z = 1 \r\r+\t\r $", "$"},      // several, and a tab
		{"z = 1 + \x1b[2J", `\x1b`},     // the control itself is marked
		{"z = \r1 + \u202e1", `\u202e`}, // after an escape, on an escape
		{"z = \r1 + \u009b1", `\u009b`}, // a C1 control
		{"z = \r1 + \x7f", `\x7f`},      // DEL
		{"z = \r1 + \xff", `\xff`},      // a byte that is not UTF-8
		{"φé = \r1 + \x01", `\x01`},     // characters of two bytes before
	}
	for _, c := range cases {
		// as an argument: in a file a lone CR ends the line (issue 10)
		var out, errb bytes.Buffer
		Eval([]string{c.src}, &out, &errb, Options{})
		lines := strings.Split(strings.TrimRight(errb.String(), "\n"), "\n")
		if len(lines) != 3 {
			t.Errorf("%q: stderr %q", c.src, errb.String())
			continue
		}
		shown, carets := []rune(lines[1]), lines[2]
		col := strings.Index(carets, "^")
		n := strings.Count(carets, "^")
		want := strings.LastIndex(lines[1], c.marked)
		want = len([]rune(lines[1][:want]))
		if col != want || n != len([]rune(c.marked)) {
			t.Errorf("%q: carets at %d×%d, want under %q at %d:\n%s\n%s", c.src, col, n, c.marked, want, string(shown), carets)
		}
	}
}
