package tui

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/lipgloss"
	"github.com/muesli/termenv"
)

// keptFiles returns the worksheet files kept beside the session file by a
// blank start.
func keptFiles(t *testing.T, path string) []string {
	t.Helper()
	kept, _ := filepath.Glob(strings.TrimSuffix(path, filepath.Ext(path)) + ".before-new-*.argand")
	return kept
}

// TestBlankStart: the statement "new session" and the key b start an
// empty session; the one in use is kept as a worksheet file beside the
// session file, the note says where, and undo brings it back.
func TestBlankStart(t *testing.T) {
	for _, how := range []string{"statement", "key"} {
		t.Run(how, func(t *testing.T) {
			m := newModel(t, Options{})
			typeLine(t, m, "Zkeep = 7 Ω")
			if how == "statement" {
				typeLine(t, m, "new session")
			} else {
				press(m, "esc", m.keys.Table.Blank.Keys()[0])
			}
			if n := len(m.s.sh.Statements()); n != 0 {
				t.Fatalf("%d statements after a blank start", n)
			}
			if rows := m.s.rows(); len(rows) != 0 {
				t.Errorf("rows %v after a blank start", rows)
			}
			kept := keptFiles(t, m.s.path)
			if len(kept) != 1 {
				t.Fatalf("kept files %v, want one", kept)
			}
			if !strings.Contains(m.msg, kept[0]) {
				t.Errorf("note %q does not say where the old session is", m.msg)
			}
			b, _ := os.ReadFile(kept[0])
			if !strings.HasPrefix(string(b), "language ") || !strings.Contains(string(b), "Zkeep = 7 Ω") {
				t.Errorf("kept file:\n%s", b)
			}
			// the session file is the empty one now
			if b, _ := os.ReadFile(m.s.path); strings.Contains(string(b), "Zkeep") {
				t.Errorf("session file still holds the old work:\n%s", b)
			}
			press(m, "esc", m.keys.Table.Undo.Keys()[0])
			if _, ok := m.s.sh.Lookup("Zkeep"); !ok {
				t.Errorf("undo did not bring the old session back")
			}
		})
	}
}

// TestNewFlag: --new starts a blank session even when one was saved, and
// keeps the saved one as a file beside it.
func TestNewFlag(t *testing.T) {
	dir := t.TempDir()
	m := New(Options{Dir: dir, Getenv: func(string) string { return "" }})
	m.Update(tea.WindowSizeMsg{Width: 80, Height: 24})
	typeLine(t, m, "Zkeep = 7 Ω")
	path := m.s.path
	m.Close()
	m2 := New(Options{Dir: dir, New: true, Getenv: func(string) string { return "" }})
	defer m2.Close()
	if _, ok := m2.s.sh.Lookup("Zkeep"); ok {
		t.Errorf("--new restored the old session")
	}
	if _, ok := m2.s.sh.Lookup("R1"); ok {
		t.Errorf("--new started the example, not a blank session")
	}
	kept := keptFiles(t, path)
	if len(kept) != 1 || !strings.Contains(m2.msg, kept[0]) {
		t.Errorf("kept %v, note %q", kept, m2.msg)
	}
	// with no session saved yet, --new is simply a blank start
	m3 := New(Options{Dir: t.TempDir(), New: true, Getenv: func(string) string { return "" }})
	defer m3.Close()
	if n := len(m3.s.sh.Statements()); n != 0 || !strings.Contains(m3.msg, "new, empty session") {
		t.Errorf("%d statements, note %q", n, m3.msg)
	}
}

// TestHelpName: help NAME in the app's entry line opens help with that
// name at the top; an unknown name is a message, not an empty screen.
func TestHelpName(t *testing.T) {
	m := newModel(t, Options{})
	enter := func(src string) {
		press(m, "tab")
		for _, r := range src {
			m.Update(keyMsg(string(r)))
		}
		press(m, "enter")
	}
	enter("help acos")
	if m.mode != modeHelp {
		t.Fatalf("mode %v after help acos", m.mode)
	}
	v := m.View()
	if !strings.Contains(v, "help acos") || !strings.Contains(v, "acos(x)") || !strings.Contains(v, "cosine") {
		t.Errorf("help screen does not show acos:\n%s", v)
	}
	press(m, "esc", "esc")
	enter("? frequency")
	if m.mode != modeHelp || !strings.Contains(m.View(), "frequency 60 Hz") {
		t.Errorf("? frequency: mode %v\n%s", m.mode, m.View())
	}
	press(m, "esc", "esc")
	enter("help nosuchthing")
	if m.mode == modeHelp || !strings.Contains(m.msg, "no help on") {
		t.Errorf("help nosuchthing: mode %v, note %q", m.mode, m.msg)
	}
}

// TestPlainHelpAndNew: the line mode's greeting names ? and help NAME,
// and both work, as does new session.
func TestPlainHelpAndNew(t *testing.T) {
	t.Setenv("XDG_STATE_HOME", t.TempDir())
	out := plainRun(t, "?\nhelp acos\n? thevenin\nhelp nosuch\nZq = 5 Ω\nnew session\nlist\n")
	for _, want := range []string{"? or help [NAME]", "usage:", "acos(x)", "cosine", "thevenin(V, Zseries, Zshunt)", `no help on "nosuch"`, "a new, empty session", "kept in ", "no entries yet"} {
		if !strings.Contains(out, want) {
			t.Errorf("line mode output lacks %q:\n%s", want, out)
		}
	}
}

// TestSignatureHint: typing a function name and "(" in the entry line
// shows its parameters under the line with the one being typed marked, by
// position and by name; outside a call nothing is shown.
func TestSignatureHint(t *testing.T) {
	m := newModel(t, Options{})
	press(m, "tab")
	typ := func(s string) {
		for _, r := range s {
			m.Update(keyMsg(string(r)))
		}
	}
	hint := func() string {
		lines := strings.Split(m.View(), "\n")
		return lines[len(lines)-1]
	}
	typ("x = atan2(")
	if h := hint(); !strings.Contains(h, "atan2(«y», x)") {
		t.Errorf("after atan2(: hint %q", h)
	}
	typ("1 V, ")
	if h := hint(); !strings.Contains(h, "atan2(y, «x»)") {
		t.Errorf("after the first argument: hint %q", h)
	}
	press(m, "ctrl+u")
	typ("x = atan2(x = 1 V, y = mag(")
	if h := hint(); !strings.Contains(h, "mag(«") {
		t.Errorf("inside a nested call: hint %q", h)
	}
	typ("3), ")
	press(m, "ctrl+u")
	typ("x = atan2(x = ")
	if h := hint(); !strings.Contains(h, "atan2(y, «x»)") {
		t.Errorf("by name: hint %q", h)
	}
	press(m, "ctrl+u")
	typ("x = 3 + 4")
	if h := hint(); strings.Contains(h, "«") {
		t.Errorf("outside a call: hint %q", h)
	}
	// under the decimal comma, ';' separates and 2,5 is one argument
	if f, a, _, ok := callAt("series(1; fromvi(2,5; 3", len("series(1; fromvi(2,5; 3"), true); !ok || f != "fromvi" || a != 1 {
		t.Errorf("callAt under the comma = %q %d %v", f, a, ok)
	}
	if f, a, n, ok := callAt("series(1, fromvi(2, 3", len("series(1, fromvi(2, 3"), false); !ok || f != "fromvi" || a != 1 || n != "" {
		t.Errorf("callAt = %q %d %q %v", f, a, n, ok)
	}
}

// TestHelpStylesKept: the help screen's headings keep their style; they
// are not shown as the escapes of their style sequences, in either
// character set.
func TestHelpStylesKept(t *testing.T) {
	// styles as the app draws them without colour (NO_COLOR): bold and
	// underline remain
	lipgloss.SetColorProfile(termenv.ANSI)
	defer lipgloss.SetColorProfile(termenv.Ascii)
	for _, ascii := range []bool{false, true} {
		m := newModel(t, Options{Color: true, ASCII: ascii})
		press(m, "?")
		if v := m.View(); strings.Contains(v, `\x1b`) {
			t.Errorf("ascii %v: help shows style sequences as text:\n%s", ascii, v)
		}
	}
}

// TestOpenOlderLanguage: a worksheet that declares an older language is
// opened with a message listing the lines that read differently now.
func TestOpenOlderLanguage(t *testing.T) {
	dir := t.TempDir()
	file := filepath.Join(dir, "old.argand")
	if err := os.WriteFile(file, []byte("language 1\nR1 = 4k7\nR2 = 4.7 kΩ\nV1 = 230 v\n"), 0o600); err != nil {
		t.Fatal(err)
	}
	m := newModel(t, Options{Dir: filepath.Join(dir, "state"), File: file})
	if !strings.Contains(m.msg, "written in language 1, lines 2, 4 read differently now") {
		t.Errorf("message %q does not list lines 2 and 4", m.msg)
	}
}
