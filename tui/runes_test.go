package tui

import (
	"strings"
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

// Letters that arrive in one read (typing over a slow SSH link, a
// terminal without paste brackets) do what the same letters typed one at
// a time do, even when together they spell the name of a key: "end"
// typed on the entry line is the statement end, not the End key.
func TestRunesTogetherAreText(t *testing.T) {
	tests := []struct {
		name string
		mode mode
		text string
	}{
		{"end on the line", modeLine, "end"},
		{"home on the line", modeLine, "home"},
		{"up on the line", modeLine, "up"},
		{"a statement on the line", modeLine, "Zq = 2 Ω"},
		{"end over the rows", modeRows, "end"},
		{"left over the rows", modeRows, "left"},
	}
	start := func(t *testing.T, md mode) *Model {
		m := newModel(t, Options{})
		if md == modeLine {
			press(m, "tab")
			press(m, "ctrl+u")
		} else {
			press(m, "esc")
		}
		return m
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			one := start(t, tt.mode)
			for _, r := range tt.text {
				one.Update(tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune{r}})
			}
			burst := start(t, tt.mode)
			burst.Update(tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune(tt.text)})
			if burst.mode != one.mode || burst.line.f.String() != one.line.f.String() {
				t.Errorf("in one read: mode %v, line %q; one at a time: mode %v, line %q",
					burst.mode, burst.line.f.String(), one.mode, one.line.f.String())
			}
			if burst.s.v.Selected != one.s.v.Selected {
				t.Errorf("selection %q in one read, %q one at a time", burst.s.v.Selected, one.s.v.Selected)
			}
			if tt.mode == modeLine && burst.line.f.String() != tt.text {
				t.Errorf("line %q, want the text %q", burst.line.f.String(), tt.text)
			}
		})
	}
	// one character is still a key: q over the rows quits
	m := newModel(t, Options{})
	press(m, "esc")
	if _, cmd := m.Update(tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune("q")}); cmd == nil || !m.quitting {
		t.Errorf("q over the rows did not quit")
	}
}

// A statement that defines no name still says what it did under the
// entry line, rather than leaving it blank.
func TestOutcomeWithoutName(t *testing.T) {
	m := newModel(t, Options{})
	typeLine(t, m, "inductor Lq = 10 mH")
	pressText(m, "tab", "sweep Lq from 10 Hz to 1 kHz points 5", "enter")
	if m.msgErr || !strings.Contains(m.msg, "frequency sweep of Lq") || !strings.Contains(m.msg, "steps in the trail") {
		t.Errorf("outcome %q (error %v), want what the sweep did", m.msg, m.msgErr)
	}
}
