package tui

import (
	"fmt"
	"strings"

	"github.com/charmbracelet/bubbles/key"
	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/x/ansi"
)

// question is one thing asked: a role of an operation, a name, a file.
type question struct {
	label string
	def   string // offered answer, taken when the answer is left empty
	names bool   // the answer names rows: checked before going on
	list  bool   // several names, separated by commas
}

// questions asks a sequence of questions in the entry line. It is a
// component: Update takes a key and returns answeredMsg with every answer
// once the last is given, closeMsg when the questions are cancelled,
// noteMsg when an answer is refused, quitMsg; View draws the question
// asked and its answer so far.
type questions struct {
	keys  AskKeys
	edit  EditKeys
	th    theme
	width int
	known func(string) bool // whether a row of that name exists

	title string
	qs    []question
	i     int
	ans   []string
	f     field
}

// answeredMsg carries the answers to every question, in order.
type answeredMsg struct{ answers []string }

func newQuestions(km KeyMap, th theme, title string, qs []question, known func(string) bool) questions {
	return questions{keys: km.Ask, edit: km.Edit, th: th, width: 80, known: known, title: title, qs: qs}
}

// SetSize sets the width the question is drawn in.
func (q *questions) SetSize(w int) { q.width = w }

// Title is what the questions are for, shown under the line.
func (q questions) Title() string { return q.th.tr(q.title) }

// View draws the question asked, its place in the sequence, the answer
// offered and the answer typed so far.
func (q questions) View() string {
	label := q.Label()
	return q.th.label.Render(label) + q.Answer(q.width-ansi.StringWidth(label))
}

// Label is the question asked, with its number and the offered answer.
func (q questions) Label() string {
	cur := q.qs[q.i]
	label := cur.label
	if len(q.qs) > 1 {
		label = fmt.Sprintf("%d/%d %s", q.i+1, len(q.qs), label)
	}
	if cur.def != "" {
		label += " [" + cur.def + "]"
	}
	return q.th.tr(label) + ": "
}

// Answer draws the answer being typed in w cells (at least 4).
func (q questions) Answer(w int) string {
	s, _ := q.f.render(max(4, w), func(c string) string { return q.th.cursor.Render(c) })
	return s
}

// Update handles a key while a question is open.
func (q questions) Update(msg tea.Msg) (questions, tea.Msg) {
	k, ok := msg.(tea.KeyMsg)
	if !ok || q.f.edit(k, q.edit) {
		return q, nil
	}
	switch {
	case key.Matches(k, q.keys.Accept):
		return q.accept()
	case key.Matches(k, q.keys.Cancel):
		return q, closeMsg{}
	case key.Matches(k, q.keys.Quit):
		return q, quitMsg{}
	case k.Type == tea.KeyRunes || k.Type == tea.KeySpace:
		if _, err := q.f.insert(keyRunes(k)); err != nil {
			return q, noteMsg{text: err.Error(), err: true}
		}
	}
	return q, nil
}

// accept takes the answer typed (or the one offered) and goes on to the
// next question; an answer naming a row that does not exist is refused.
func (q questions) accept() (questions, tea.Msg) {
	a := strings.TrimSpace(q.f.String())
	cur := q.qs[q.i]
	if a == "" {
		a = cur.def
	}
	if cur.names && a != "" && q.known != nil {
		for _, n := range splitNames(a) {
			if !q.known(n) {
				return q, noteMsg{text: fmt.Sprintf("no row named %q; type a name from the table", n), err: true}
			}
		}
	}
	q.ans = append(q.ans, a)
	q.f.clear()
	q.i++
	if q.i == len(q.qs) {
		return q, answeredMsg{answers: q.ans}
	}
	return q, nil
}
