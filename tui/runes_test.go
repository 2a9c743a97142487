package tui

import (
	"testing"

	tea "github.com/charmbracelet/bubbletea"
)

// Letters that arrive in one read act as the same letters pressed one at
// a time: each a command while the entries table has the keyboard, and
// the rest typed whole once the entry line has it.
func TestRunesInOneRead(t *testing.T) {
	m := newModel(t, Options{})
	before := len(m.s.rows())
	top := m.s.rows()[0]
	q0 := value(t, m, top)

	// n negates the selected row: two in one read make two rows, the
	// second the first negated again, which is the original value
	m.Update(tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune("nn")})
	rows := m.s.rows()
	if len(rows) != before+2 {
		t.Fatalf("nn in one read made %d rows, want 2; rows %v", len(rows)-before, rows)
	}
	if got := value(t, m, rows[0]); !near(got, q0) {
		t.Errorf("-(-%s) = %v, want %v", top, got, q0)
	}
	if got := value(t, m, rows[1]); !near(got, -q0) {
		t.Errorf("-%s = %v, want %v", top, got, -q0)
	}

	// e opens the entry line; what follows in the same read is text
	m.Update(tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune("eZq = 3 + j4 Ω")})
	if m.mode != modeLine {
		t.Fatalf("mode %v after e and text, want the entry line", m.mode)
	}
	press(m, "enter")
	if m.msgErr {
		t.Fatalf("entry line: %s", m.msg)
	}
	if got := value(t, m, "Zq"); !near(got, 3+4i) {
		t.Errorf("Zq = %v, want 3+j4", got)
	}

	// a paste is text wherever it lands, never a string of commands
	press(m, "esc")
	n := len(m.s.rows())
	m.Update(tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune("nn"), Paste: true})
	if got := len(m.s.rows()); got != n {
		t.Errorf("a pasted nn made %d rows; a paste is never commands", got-n)
	}
}
