package tui

import (
	"fmt"

	"github.com/charmbracelet/bubbles/key"
	tea "github.com/charmbracelet/bubbletea"
)

// openFull shows the whole trail at the full width of the screen, at the
// latest step, so that a long caution or a plot can be read whole.
func (m *Model) openFull() {
	m.mode = modeTrail
	m.full.back = 0
}

// fullPage is the number of trail lines the full view shows.
func (m *Model) fullPage() int { return max(1, m.height-2) }

// fullKey handles a key while the trail is shown in full.
func (m *Model) fullKey(k tea.KeyMsg) tea.Cmd {
	km := m.keys.Full
	t := &m.full
	t.build(m, m.width)
	page := m.fullPage()
	last := max(0, len(t.lines)-page) // back at which the first line is on top
	switch {
	case key.Matches(k, km.Up):
		t.back++
	case key.Matches(k, km.Down):
		t.back--
	case key.Matches(k, km.PageUp):
		t.back += page - 1
	case key.Matches(k, km.PageDown):
		t.back -= page - 1
	case key.Matches(k, km.Top):
		t.back = last
	case key.Matches(k, km.End):
		t.back = 0
	case key.Matches(k, km.Close):
		m.mode = modeRows
	case key.Matches(k, km.Quit):
		m.quitting = true
		return tea.Quit
	}
	t.back = max(0, min(t.back, last))
	return nil
}

func (m *Model) fullView() []string {
	t := &m.full
	t.build(m, m.width)
	page := m.fullPage()
	t.back = max(0, min(t.back, len(t.lines)-page))
	end := len(t.lines) - t.back
	start := max(0, end-page)
	info := fmt.Sprintf("%d steps, lines %d-%d of %d", len(m.s.sh.Steps()), start+1, end, len(t.lines))
	out := []string{m.th.section("trail in full", info, m.width)}
	for i := start; i < end; i++ {
		l := t.lines[i]
		s := fitWhole(l.text, m.width) // a plot's line is cut between its words, not inside a number
		if l.head {
			s = m.th.label.Render(s)
		}
		out = append(out, s)
	}
	for len(out) < page+1 {
		out = append(out, "")
	}
	return append(out, m.keyHints(m.keys.Full.ShortHelp()))
}
