package tui

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"argand/tui/internal/controls"

	tea "github.com/charmbracelet/bubbletea"
)

// TestControlsOnScreen pushes each control sequence of the catalogue
// through the app: a worksheet opened with it in comments, in an
// accepted line (a lone carriage return ends a line) and in its file
// name; the trail, the table, the trail in full and help; the entry line
// echoing a paste; the message of a refused statement; the exports as
// text and Markdown; and the line mode. The screen may hold the app's own
// style sequences and nothing else that a terminal acts on.
func TestControlsOnScreen(t *testing.T) {
	for _, c := range controls.Catalogue(t) {
		t.Run(c.Name, func(t *testing.T) {
			dir := t.TempDir()
			name := "w.argand"
			if !strings.ContainsAny(c.Text, "\x00/") {
				name = "w" + c.Text + ".argand"
			}
			file := filepath.Join(dir, name)
			ws := "x = 3 # " + c.Text + "\n" +
				"a = 1 \r+ 2 # " + c.Text + "\n" +
				"y = 1/0 # " + c.Text + "\n"
			if err := os.WriteFile(file, []byte(ws), 0o600); err != nil {
				t.Fatal(err)
			}
			check := func(where, out string, sgr bool) {
				t.Helper()
				if err := controls.Check(out, sgr); err != nil {
					t.Errorf("%s: %v", where, err)
				}
			}
			for _, ascii := range []bool{false, true} {
				state := filepath.Join(dir, "state")
				if ascii {
					state += "-ascii"
				}
				m := newModel(t, Options{Dir: state, File: file, ASCII: ascii, Color: true})
				check("opened worksheet", m.View(), true)
				// the bad line is named (a lone CR in the text ends a line
				// of its own, which moves the bad one)
				if !strings.Contains(m.msg, "line 3") && !strings.Contains(m.msg, "line 4") && !strings.Contains(m.msg, "line 1: invalid UTF-8") &&
					!(strings.Contains(c.Text, "\r") && strings.Contains(m.msg, "line 2: ")) {
					t.Errorf("the bad line is not named: %q", m.msg)
				}
				press(m, "T")
				check("trail in full", m.View(), true)
				press(m, "esc", "?")
				check("help", m.View(), true)
				press(m, "esc", "tab")
				m.Update(tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune("z = 1 + " + c.Text), Paste: true})
				check("entry line", m.View(), true)
				press(m, "enter")
				check("message of a refused line", m.View(), true)
				m.run("", "q = 2 # "+c.Text, "r = 1 + "+c.Text)
				check("message of a refused change", m.View(), true)
				check("export as text", m.trailText(), false)
				check("export as Markdown", m.trailMarkdown(), false)
				check("export as HTML record", m.recordHTML(), false)
				m.Close()
			}
			var out bytes.Buffer
			t.Setenv("XDG_STATE_HOME", filepath.Join(dir, "plain"))
			Plain(Options{Getenv: func(string) string { return "" }},
				strings.NewReader("x = 3 # "+c.Text+"\nz = 1 + "+c.Text+"\nb = 1 \r+ 1\nlist\ntrail\nsave "+filepath.Join(dir, "s"+c.Text)+"\nquit\n"), &out)
			check("line mode", out.String(), false)
			if !strings.Contains(out.String(), controls.Escaped(c.Text)) && !strings.Contains(c.Text, "\r") {
				t.Errorf("line mode: the escape %q is not shown:\n%s", controls.Escaped(c.Text), out.String())
			}
		})
	}
}

// TestEntryCaretUnderEscape: in the entry line a bidirectional override is
// drawn as its escape, and the live error's marks stand under the whole
// escape, not one cell of it.
func TestEntryCaretUnderEscape(t *testing.T) {
	m := newModel(t, Options{})
	press(m, "tab")
	m.Update(tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune("z = 1 + \u202e2"), Paste: true})
	lines := strings.Split(m.View(), "\n")
	entry, fb := lines[len(lines)-3], lines[len(lines)-2]
	at := strings.Index(entry, `\u202e`)
	if at < 0 {
		t.Fatalf("escape not drawn: %q", entry)
	}
	col := len([]rune(entry[:at]))
	if got := strings.Index(fb, "^~~~~~"); got != col {
		t.Errorf("marks at %d, want 6 marks at %d:\n%s\n%s", got, col, entry, fb)
	}
}
