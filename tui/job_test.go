package tui

import (
	"fmt"
	"strings"
	"testing"
	"time"

	"github.com/charmbracelet/bubbles/spinner"
	tea "github.com/charmbracelet/bubbletea"
)

// sessionState is what a statement could change in the session.
func sessionState(m *Model) string {
	var b strings.Builder
	for _, st := range m.s.sh.Statements() {
		fmt.Fprintln(&b, st)
	}
	for _, n := range m.s.sh.Names() {
		q, _ := m.s.sh.Lookup(n)
		fmt.Fprintln(&b, n, q.V)
	}
	fmt.Fprintln(&b, len(m.s.sh.Steps()), m.s.v.Order, m.s.v.Selected, len(m.s.sh.Sweeps()))
	return b.String()
}

// longSweep is a sweep that runs far longer than the wait of the tests
// below (invented example data).
const longSweep = "sweep C1 || (R1 + L1) from 10 Hz to 10 kHz points 100000"

// TestJobStops runs a statement off the update loop, sees its progress
// line, stops it with esc and with ctrl+c, and finds the session as it
// was and the app taking keys.
func TestJobStops(t *testing.T) {
	for _, stopKey := range []string{"esc", "ctrl+c"} {
		m := newModel(t, Options{Wait: time.Nanosecond})
		before := sessionState(m)
		undo := len(m.s.undo)
		press(m, "tab")
		for _, r := range longSweep {
			m.Update(keyMsg(string(r)))
		}
		cmd := press(m, "enter")
		if m.job == nil {
			t.Fatalf("the sweep ran on the update loop")
		}
		if cmd == nil {
			t.Fatal("no command waits for the running statement")
		}
		// the spinner turns while it runs
		_, tick := m.Update(m.job.spin.Tick())
		if tick == nil {
			t.Error("the spinner does not go on turning")
		}
		if v := m.View(); !strings.Contains(v, "running") || !strings.Contains(v, "stops it") {
			t.Errorf("no progress line while the sweep runs:\n%s", v)
		}
		press(m, "x") // any other key waits for the statement
		if m.job == nil || m.mode != modeLine || len(m.ahead) != 1 {
			t.Fatal("a key other than esc acted while the sweep ran")
		}
		press(m, stopKey)
		if m.job != nil {
			t.Fatalf("%s did not stop the sweep", stopKey)
		}
		if m.quitting {
			t.Fatalf("%s while a statement ran quit the app", stopKey)
		}
		if after := sessionState(m); after != before || len(m.s.undo) != undo {
			t.Errorf("stopping the sweep changed the session:\n%s\n---\n%s", before, after)
		}
		if !strings.Contains(m.msg, "nothing changed") {
			t.Errorf("after stopping: %q", m.msg)
		}
		if m.line.f.String() != longSweep {
			t.Errorf("the stopped statement left the entry line: %q", m.line.f.String())
		}
		// the app answers at once: a statement runs and is taken
		m.line.f.clear()
		for _, r := range "Zq = 5 Ω" {
			m.Update(keyMsg(string(r)))
		}
		press(m, "enter")
		deadline := time.Now().Add(time.Minute) // a stall bound only
		for m.job != nil && time.Now().Before(deadline) {
			m.Update(tea.Msg(jobDoneMsg(<-m.job.done)))
		}
		if _, ok := m.s.sh.Lookup("Zq"); !ok || m.msgErr {
			t.Fatalf("after stopping, the next statement did not run: %q", m.msg)
		}
	}
}

// TestJobFinishes lets a statement that moved off the loop finish and
// finds it taken as one change, undone by one undo.
func TestJobFinishes(t *testing.T) {
	m := newModel(t, Options{Wait: time.Nanosecond})
	before := sessionState(m)
	undo := len(m.s.undo)
	typeIn := func(src string) {
		press(m, "tab")
		for _, r := range src {
			m.Update(keyMsg(string(r)))
		}
		press(m, "enter")
	}
	typeIn("sweep C1 || (R1 + L1) from 10 Hz to 10 kHz points 2000")
	if m.job == nil {
		t.Fatalf("the sweep did not move off the loop: %q", m.msg)
	}
	// a late spinner tick of another spinner is ignored; keys typed while
	// the sweep runs follow it
	m.Update(spinner.TickMsg{ID: -1})
	for _, r := range "Zw = 2 Ω" {
		m.Update(keyMsg(string(r)))
	}
	m.Update(keyMsg("enter"))
	for m.job != nil {
		m.Update(tea.Msg(jobDoneMsg(<-m.job.done)))
	}
	if q, ok := m.s.sh.Lookup("Zw"); !ok || real(q.V) != 2 {
		t.Fatalf("keys typed while the sweep ran were lost: %q", m.msg)
	}
	if m.job != nil || m.msgErr {
		t.Fatalf("job %v, message %q", m.job, m.msg)
	}
	if len(m.s.sh.Sweeps()) != 1 || len(m.s.undo) != undo+2 || m.line.f.String() != "" {
		t.Errorf("sweeps %d, undo %d (was %d), entry line %q", len(m.s.sh.Sweeps()), len(m.s.undo), undo, m.line.f.String())
	}
	press(m, "esc", "z", "z") // the typed statement, then the sweep
	if after := sessionState(m); after != before {
		t.Errorf("undo did not restore the session:\n%s\n---\n%s", before, after)
	}
}
