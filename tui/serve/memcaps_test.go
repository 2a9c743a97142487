package serve

import (
	"fmt"
	"strings"
	"testing"

	"argand/reduce/sheet"
)

// TestMemoryLimits: over SSH, each bound on what drives a session's memory
// holds at the value the server was given: a statement that would take the
// worksheet past its size, its names or a network past its elements is
// refused with the app's message and the session goes on (nothing
// entered is lost), and undo keeps the last changes it is allowed, saying
// so when they run out.
func TestMemoryLimits(t *testing.T) {
	a, dir, key := served(t, Config{Limits: sheet.Limits{Names: 40, Bytes: 1500, Elements: 2, Undo: 2}})
	// a blank session, so that the bounds count only what is typed here
	a.enter("new session", "new, empty session")
	a.enter("Za = 1 Ω", "→ Za = 1.000 Ω")
	a.enter("Zb = 2 Ω", "→ Zb = 2.000 Ω")
	a.enter("Zc = 3 Ω", "→ Zc = 3.000 Ω")
	// undo keeps the last two changes: the third press says so
	a.send("z")
	a.wait("undone (1 more to undo")
	a.send("z")
	a.wait("undone (0 more to undo")
	a.send("z")
	a.wait("nothing more to undo: the last 2 changes are kept here")
	a.send("Z", "Z") // redo both: Za, Zb, Zc again
	a.wait("redone")
	// a network of two elements at most
	a.send("\t", "network n reference g", "\r")
	a.send("voltage source V1 = 1 V from g to a", "\r")
	a.send("resistor R1 = 1 Ω from a to g", "\r")
	a.send("resistor R2 = 1 Ω from a to g", "\r")
	a.wait("network n has 2 elements, the most allowed here")
	fresh(a, "end")
	a.wait("network n")
	// names: forty at most, whatever the network defined
	for i := range 40 {
		fresh(a, fmt.Sprintf("Zn%d = 1 Ω", i))
	}
	a.wait("too many names (the limit is 40)")
	// the worksheet's size: a check (no new name) of 1614 bytes takes it past 1500
	long := "check 1" + strings.Repeat(" + 1", 400) + " is 401"
	fresh(a, long)
	a.wait("the worksheet is full")
	a.send("\x15", "\x1b")
	a.send("q")
	if out := a.end(); strings.Contains(out, "\r\nargand: ") {
		t.Errorf("the session was ended: %q", tail(out, 200))
	}
	st := statements(t, dir, key)
	for _, want := range []string{"Za = 1 Ω", "Zb = 2 Ω", "Zc = 3 Ω", "end"} {
		if !slicesContains(st, want) {
			t.Errorf("saved %q: %q lost", st, want)
		}
	}
	for _, not := range []string{"Zn39 = 1 Ω", "resistor R2 = 1 Ω from a to g", long} {
		if slicesContains(st, not) {
			t.Errorf("saved %q: the refused %q kept", st, not)
		}
	}
}

// fresh types stmt on an empty entry line, whatever the line held: the
// entry keeps a refused statement for correcting.
func fresh(a *app, stmt string) {
	a.t.Helper()
	a.send("\x1b", "\t", "\x15", stmt, "\r")
}

func slicesContains(s []string, x string) bool {
	for _, y := range s {
		if y == x {
			return true
		}
	}
	return false
}
