package tui

import (
	"reflect"
	"strings"
	"testing"

	tea "github.com/charmbracelet/bubbletea"
)

func helpUpdate(h helpScreen, m tea.Msg) (helpScreen, tea.Msg) { return h.Update(m) }

// The help screen scrolls by half a screen, never past its last page, and
// gives the keyboard back.
func TestHelpScreenUpdate(t *testing.T) {
	const height = 20
	base := newHelpScreen(DefaultKeyMap(), testTheme(false), newHelp(nil))
	base.SetSize(80, height)
	last := len(base.lines()) - (height - 1)
	tests := []struct {
		keys []string
		top  int
		msg  tea.Msg
	}{
		{[]string{"down"}, 10, nil},
		{[]string{" "}, 10, nil},
		{[]string{"pgdown", "up"}, 0, nil},
		{[]string{"up"}, 0, nil},
		{[]string{"down", "down", "down", "down", "down", "down", "down", "down", "down", "down", "down", "down", "down", "down", "down", "down", "down", "down", "down", "down"}, last, nil},
		{[]string{"esc"}, 0, closeMsg{}},
		{[]string{"?"}, 0, closeMsg{}},
		{[]string{"q"}, 0, closeMsg{}},
		{[]string{"ctrl+c"}, 0, quitMsg{}},
	}
	for _, tt := range tests {
		h, msgs := drive(base, helpUpdate, tt.keys...)
		if h.top != tt.top || !reflect.DeepEqual(msgs[len(msgs)-1], tt.msg) {
			t.Errorf("%v: top %d, message %#v; want %d, %#v", tt.keys, h.top, msgs[len(msgs)-1], tt.top, tt.msg)
		}
	}
}

// The help screen draws a page and a footer saying which lines; a topic
// asked about comes first; every part's keys and the safety text are in
// it, ASCII where asked.
func TestHelpScreenView(t *testing.T) {
	tests := []struct {
		name  string
		topic string
		ascii bool
		first string
	}{
		{"general", "", false, "argand: AC phasor work, step by step   (esc closes; ↑↓ scroll)"},
		{"topic", "pfc", false, "help pfc   (esc closes; ↑↓ scroll)"},
		{"ASCII", "", true, "argand: AC phasor work, step by step   (esc closes; up/down scroll)"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			h := newHelpScreen(DefaultKeyMap(), testTheme(tt.ascii), newHelp(nil))
			h.SetSize(80, 24)
			h.Open(tt.topic, "")
			ls := strings.Split(h.View(), "\n")
			if len(ls) != 24 || ls[0] != tt.first || !strings.HasPrefix(ls[23], "help 1-23 of ") {
				t.Errorf("first %q, footer %q, %d lines", ls[0], ls[len(ls)-1], len(ls))
			}
			all := strings.Join(h.lines(), "\n")
			for _, md := range allModes {
				if !strings.Contains(all, "keys: "+md.String()) {
					t.Errorf("no keys of %s", md)
				}
			}
			if !strings.Contains(all, "lethal") {
				t.Errorf("no safety text")
			}
			for _, r := range all {
				if tt.ascii && r >= 0x80 {
					t.Errorf("not ASCII: %q", r)
					break
				}
			}
		})
	}
}
