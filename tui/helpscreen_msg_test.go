package tui

import (
	"strings"
	"testing"
)

// TestLongMessageWhole: an error longer than the two lines the screen
// gives it at 80×24 ends its second line with the help key, and the help
// screen shows it whole first, its end (the way out) included; one that
// fits shows no such pointer, and the help screen opens on the help.
func TestLongMessageWhole(t *testing.T) {
	m := newModel(t, Options{})
	typeLine(t, m, "budget 0.1 s")
	pressText(m, "tab", "sweep Zload from 10 Hz to 100 kHz points 10000", "enter")
	if !m.msgErr || !strings.Contains(m.msg, "raise the budget with: budget") {
		t.Fatalf("want the budget refusal, got %q", m.msg)
	}
	screen := m.View()
	if !strings.Contains(screen, "has it whole)") {
		t.Errorf("the cut message does not say where it is whole:\n%s", screen)
	}
	press(m, "f1")
	help := m.View()
	if !strings.Contains(help, "the last message, whole") || !strings.Contains(help, "raise the budget with") || strings.Contains(help, "error: error:") {
		t.Errorf("the help screen does not show the message whole:\n%s", help)
	}
	press(m, "esc")

	m2 := newModel(t, Options{})
	pressText(m2, "tab", "1 V + 1 A", "enter")
	if s := m2.View(); !m2.msgErr || strings.Contains(s, "has it whole)") {
		t.Errorf("a short error: %q, %v\n%s", m2.msg, m2.msgErr, s)
	}
	press(m2, "f1")
	if strings.Contains(m2.View(), "the last message, whole") {
		t.Error("the help screen repeats a message the screen showed whole")
	}
}
