package tui

import (
	"reflect"
	"strings"
	"testing"

	"argand/calc"

	tea "github.com/charmbracelet/bubbletea"
)

// testTheme is the look of the component tests: no colour, UTF-8 or
// ASCII.
func testTheme(ascii bool) theme { return newTheme(Options{ASCII: ascii}) }

// drive sends keys to a component's Update one by one and returns the
// component and the message of each key.
func drive[C any](c C, update func(C, tea.Msg) (C, tea.Msg), keys ...string) (C, []tea.Msg) {
	var out []tea.Msg
	for _, k := range keys {
		var msg tea.Msg
		c, msg = update(c, keyMsg(k))
		out = append(out, msg)
	}
	return c, out
}

func lineUpdate(e entryLine, m tea.Msg) (entryLine, tea.Msg) { return e.Update(m) }

// The entry line edits with its keys and says what the parent is to do:
// run the text, leave, help, quit, hand back an alt+key, run a paste of
// several lines, or note a refusal; an edit alone says the text changed.
func TestEntryLineUpdate(t *testing.T) {
	alt := keyMsg("x")
	alt.Alt = true
	paste := tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune("A = 1\nB = 2"), Paste: true}
	tests := []struct {
		name  string
		keys  []string
		key   *tea.KeyMsg // sent after keys, when set
		value string
		last  tea.Msg
	}{
		{"typing", []string{"Z", "1"}, nil, "Z1", editedMsg{}},
		{"run", []string{"Z", "=", "1", "enter"}, nil, "Z=1", runMsg{src: "Z=1"}},
		{"leave keeps the text", []string{"a", "esc"}, nil, "a", closeMsg{}},
		{"tab leaves too", []string{"a", "tab"}, nil, "a", closeMsg{}},
		{"help", []string{"f1"}, nil, "", helpMsg{}},
		{"quit", []string{"ctrl+c"}, nil, "", quitMsg{}},
		{"editing keys", []string{"a", "b", "c", "ctrl+a", "ctrl+f", "ctrl+d"}, nil, "ac", editedMsg{}},
		{"cursor moves, text the same", []string{"a", "b", "left"}, nil, "ab", nil},
		{"kill to the end", []string{"a", "b", "c", "left", "left", "ctrl+k"}, nil, "a", editedMsg{}},
		{"clear", []string{"a", "b", "ctrl+u"}, nil, "", editedMsg{}},
		{"alt+key goes back to the table", []string{"a"}, &alt, "a", passKeyMsg{key: keyMsg("x")}},
		{"a paste of lines runs", []string{"q"}, &paste, "q", pasteMsg{text: "A = 1\nB = 2"}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			e := newEntryLine(DefaultKeyMap(), testTheme(false), nil)
			e.SetFocus(true)
			e, msgs := drive(e, lineUpdate, tt.keys...)
			last := msgs[len(msgs)-1]
			if tt.key != nil {
				e, last = e.Update(*tt.key)
			}
			if e.Value() != tt.value || !reflect.DeepEqual(last, tt.last) {
				t.Errorf("value %q, message %#v; want %q, %#v", e.Value(), last, tt.value, tt.last)
			}
		})
	}
}

// Earlier lines come back with the arrows, and a line too long for a
// statement is refused whole with a note.
func TestEntryLineHistoryAndLimit(t *testing.T) {
	e := newEntryLine(DefaultKeyMap(), testTheme(false), nil)
	e.SetFocus(true)
	e.Accept("Za = 1 Ω")
	e.Accept("Zb = 2 Ω")
	e, _ = drive(e, lineUpdate, "up", "up")
	if e.Value() != "Za = 1 Ω" {
		t.Errorf("two lines back: %q", e.Value())
	}
	e, _ = drive(e, lineUpdate, "down", "down")
	if e.Value() != "" {
		t.Errorf("back past the latest: %q", e.Value())
	}
	e.SetValue(strings.Repeat("x", calc.MaxLine))
	e, msg := e.Update(keyMsg("y"))
	if n, ok := msg.(noteMsg); !ok || !n.err || !strings.Contains(n.text, "not inserted") || len(e.Value()) != calc.MaxLine {
		t.Errorf("over the limit: %#v, %d bytes", msg, len(e.Value()))
	}
}

// The line draws its prompt (with the network block open), the text with
// the cursor, an example when it is empty and not focused, and a caret
// under the place of the error its check reports.
func TestEntryLineView(t *testing.T) {
	check := func(s string) *calc.Error {
		if i := strings.Index(s, "?"); i >= 0 {
			return &calc.Error{Col: i + 1, Len: 1, Msg: "unexpected ?"}
		}
		return nil
	}
	tests := []struct {
		name    string
		focused bool
		network string
		comma   bool
		ascii   bool
		text    string
		view    string
		caret   int // column of the caret; -1 for none
	}{
		{"empty, not focused", false, "", false, false, "", "› tab or e: type a statement, such as Zc = 1/(j·ω·4.7 µF)", -1},
		{"decimal comma example", false, "", true, false, "", "› tab or e: type a statement, such as Zc = 1/(j·ω·4,7 µF)", -1},
		{"ASCII", false, "", false, true, "", "> tab or e: type a statement, such as Zc = 1/(j*w*4.7 uF)", -1},
		{"focused", true, "", false, false, "Z = 1", "› Z = 1 ", -1},
		{"network open", true, "ckt", false, false, "R1", "ckt › R1 ", -1},
		{"error placed", true, "", false, false, "Z = ?", "› Z = ? ", 6},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			e := newEntryLine(DefaultKeyMap(), testTheme(tt.ascii), check)
			e.SetSize(80)
			e.SetContext(tt.network, tt.comma)
			e.SetValue(tt.text)
			e.SetFocus(tt.focused)
			if got := e.View(); got != tt.view {
				t.Errorf("view %q, want %q", got, tt.view)
			}
			col, marks, msg, ok := e.Caret()
			if tt.caret < 0 {
				if ok {
					t.Errorf("caret at %d", col)
				}
				return
			}
			if !ok || col != tt.caret || marks != "^" || msg != "error: unexpected ?" {
				t.Errorf("caret %d %q %q %v, want at %d", col, marks, msg, ok, tt.caret)
			}
		})
	}
}

// Inside a call the line shows the function's parameters with the one
// being typed marked, separated as the user types them.
func TestEntryLineSignature(t *testing.T) {
	tests := []struct {
		text  string
		comma bool
		want  string // a part of the signature line; "" for none
	}{
		{"x = atan2(4, ", false, "atan2(y, «x»)"},
		{"x = atan2(4; ", true, "atan2(y; «x»)"},
		{"x = atan2(", false, "atan2(«y», x)"},
		{"x = 4 + 5", false, ""},
	}
	for _, tt := range tests {
		e := newEntryLine(DefaultKeyMap(), testTheme(false), nil)
		e.SetContext("", tt.comma)
		e.SetValue(tt.text)
		e.SetFocus(true)
		got := e.Signature()
		if tt.want == "" && got != "" || !strings.Contains(got, tt.want) {
			t.Errorf("%q: signature %q, want it to hold %q", tt.text, got, tt.want)
		}
	}
}
