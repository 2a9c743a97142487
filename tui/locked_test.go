package tui

import (
	"errors"
	"reflect"
	"strings"
	"testing"

	tea "github.com/charmbracelet/bubbletea"
)

// The session-in-use screen answers with its keys and says what happened
// in its own words, the keys from the bindings.
func TestLockScreen(t *testing.T) {
	tests := []struct {
		key  string
		want tea.Msg
	}{
		{"r", lockChoiceMsg{readOnly: true}},
		{"s", lockChoiceMsg{readOnly: false}},
		{"q", quitMsg{}},
		{"esc", quitMsg{}},
		{"x", nil},
	}
	l := newLockScreen(DefaultKeyMap(), testTheme(false), "/state/session.json", 4242, nil)
	for _, tt := range tests {
		if _, got := l.Update(keyMsg(tt.key)); !reflect.DeepEqual(got, tt.want) {
			t.Errorf("%q: %#v, want %#v", tt.key, got, tt.want)
		}
	}
	l.SetSize(80)
	v := l.View()
	for _, want := range []string{"your session is already open", "process 4242", "How do you want to go on?",
		"  r   look at it without changing anything", "  s   work in a new session of your own", "session file: /state/session.json"} {
		if !strings.Contains(v, want) {
			t.Errorf("view lacks %q:\n%s", want, v)
		}
	}
	l = newLockScreen(DefaultKeyMap(), testTheme(false), "/state/session.json", 0, errors.New("no locks on this file system"))
	if v := l.View(); !strings.Contains(v, "could not be locked") || !strings.Contains(v, "no locks on this file system") {
		t.Errorf("lock failed:\n%s", v)
	}
}

// The export chooser takes an entry of its table by its key, or cancels;
// its line of choices and its offer come from the bindings.
func TestExportMenu(t *testing.T) {
	x := newExportMenu(DefaultKeyMap(), testTheme(false))
	tests := []struct {
		key  string
		what exportWhat
		msg  tea.Msg // when not an entry
	}{
		{"m", exportMarkdown, nil},
		{"t", exportText, nil},
		{"w", exportSheet, nil},
		{"r", exportRecord, nil},
		{"c", exportCSV, nil},
		{"esc", 0, closeMsg{}},
		{"q", 0, closeMsg{}},
		{"z", 0, nil},
	}
	for _, tt := range tests {
		_, got := x.Update(keyMsg(tt.key))
		if c, ok := got.(exportMsg); ok {
			if c.choice.what != tt.what || tt.msg != nil {
				t.Errorf("%q chose %v", tt.key, c.choice.what)
			}
			continue
		}
		if !reflect.DeepEqual(got, tt.msg) {
			t.Errorf("%q: %#v, want %#v", tt.key, got, tt.msg)
		}
	}
	if v := x.View(); v != "m Markdown  t text  w worksheet  r record  c CSV  esc cancel" {
		t.Errorf("view %q", v)
	}
	if o := x.Offer(); o != "export: m Markdown, t text, w worksheet, r record, c CSV" {
		t.Errorf("offer %q", o)
	}
}
