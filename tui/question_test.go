package tui

import (
	"reflect"
	"testing"

	tea "github.com/charmbracelet/bubbletea"
)

func askUpdate(q questions, m tea.Msg) (questions, tea.Msg) { return q.Update(m) }

// Questions take an answer each (the offered one when left empty), refuse
// a name that is not a row, and end with every answer, or with closeMsg
// when cancelled.
func TestQuestionsUpdate(t *testing.T) {
	rows := map[string]bool{"Za": true, "Zb": true}
	known := func(n string) bool { return rows[n] }
	qs := []question{{label: "source", def: "Za", names: true}, {label: "others", names: true, list: true}, {label: "name", def: "T1"}}
	tests := []struct {
		name string
		keys []string
		last tea.Msg
		at   int // question asked after the keys
	}{
		{"defaults and a list", []string{"enter", "Z", "a", ",", "Z", "b", "enter", "enter"}, answeredMsg{answers: []string{"Za", "Za,Zb", "T1"}}, 3},
		{"an answer typed", []string{"Z", "b", "enter"}, nil, 1},
		{"no such row", []string{"Z", "q", "enter"}, noteMsg{text: `no row named "Zq"; type a name from the table`, err: true}, 0},
		{"one name of a list unknown", []string{"enter", "Z", "a", ";", "X", "enter"}, noteMsg{text: `no row named "X"; type a name from the table`, err: true}, 1},
		{"cancel", []string{"enter", "esc"}, closeMsg{}, 1},
		{"quit", []string{"ctrl+c"}, quitMsg{}, 0},
		{"editing", []string{"Z", "x", "backspace", "b", "enter"}, nil, 1},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			q := newQuestions(DefaultKeyMap(), testTheme(false), "test", qs, known)
			q, msgs := drive(q, askUpdate, tt.keys...)
			if last := msgs[len(msgs)-1]; !reflect.DeepEqual(last, tt.last) || q.i != tt.at {
				t.Errorf("message %#v at question %d; want %#v at %d", last, q.i, tt.last, tt.at)
			}
		})
	}
}

// A question draws its place in the sequence, the answer offered and the
// answer typed, and its title apart.
func TestQuestionsView(t *testing.T) {
	qs := []question{{label: "first node", def: "a"}, {label: "name"}}
	tests := []struct {
		name  string
		keys  []string
		ascii bool
		view  string
	}{
		{"first", nil, false, "1/2 first node [a]:  "},
		{"typed", []string{"b", "c"}, false, "1/2 first node [a]: bc "},
		{"second", []string{"enter", "Z"}, false, "2/2 name: Z "},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			q := newQuestions(DefaultKeyMap(), testTheme(tt.ascii), "Thevenin → between nodes", qs, nil)
			q.SetSize(60)
			q, _ = drive(q, askUpdate, tt.keys...)
			if got := q.View(); got != tt.view {
				t.Errorf("view %q, want %q", got, tt.view)
			}
		})
	}
	q := newQuestions(DefaultKeyMap(), testTheme(true), "Thevenin → between nodes", qs, nil)
	if got := q.Title(); got != "Thevenin -> between nodes" {
		t.Errorf("ASCII title %q", got)
	}
}
