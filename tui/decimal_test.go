package tui

import (
	"os"
	"strings"
	"testing"
)

// TestDecimalKey: the key , switches the decimal marker by the statement
// the worksheet keeps; the status line shows it, values are shown and
// typed with it, the operations of the keys write ';' between arguments,
// and the saved worksheet states the marker after its language line.
func TestDecimalKey(t *testing.T) {
	m := newModel(t, Options{})
	if st := strings.SplitN(m.View(), "\n", 2)[0]; !strings.Contains(st, "point") {
		t.Fatalf("status line does not show the decimal point: %q", st)
	}
	press(m, ",")
	if !m.s.sh.Settings().Comma {
		t.Fatalf("the key did not set the decimal comma: %s", m.msg)
	}
	if st := strings.SplitN(m.View(), "\n", 2)[0]; !strings.Contains(st, "comma") {
		t.Errorf("status line does not show the decimal comma: %q", st)
	}
	typeLine(t, m, "Za = 2,2 kΩ")
	typeLine(t, m, "Zb = 4,7 kΩ")
	// series of three marked rows: a call with its arguments
	typeLine(t, m, "Zc = 1 kΩ")
	press(m, " ", "down", " ", "down", " ", "s")
	got := value(t, m, m.s.v.Selected)
	if want := complex(7900, 0); !near(got, want) {
		t.Fatalf("series under the comma = %v, want %v (%s)", got, want, m.msg)
	}
	if v := m.View(); !strings.Contains(v, "7,900 kΩ") {
		t.Errorf("the sum is not shown with the comma:\n%s", v)
	}
	// the entry line refuses the point, with the fix
	press(m, "tab")
	for _, r := range "Zd = 2.2 kΩ" {
		m.Update(keyMsg(string(r)))
	}
	press(m, "enter")
	if !m.msgErr || !strings.Contains(m.msg, "decimal point? write 2,2 kΩ, or set decimal point") {
		t.Errorf("point under the comma: %q", m.msg)
	}
	// the parameters shown under the line are separated as they are typed
	press(m, "ctrl+u")
	for _, r := range "x = atan2(4,5; " {
		m.Update(keyMsg(string(r)))
	}
	if h := m.line.Signature(); !strings.Contains(h, "atan2(y; ") || !strings.Contains(h, "«x»") {
		t.Errorf("parameters under the line: %q", h)
	}
	press(m, "ctrl+u", "esc")
	w := m.worksheetText()
	lines := strings.Split(w, "\n")
	if !strings.HasPrefix(lines[0], "language ") || lines[1] != "decimal point" {
		t.Fatalf("worksheet:\n%s", w)
	}
	if !strings.Contains(w, "decimal comma\nZa = 2,2 kΩ") || !strings.Contains(w, "series(") || !strings.Contains(w, "; ") {
		t.Errorf("worksheet:\n%s", w)
	}
	// back to the point
	press(m, ",")
	if m.s.sh.Settings().Comma {
		t.Errorf("the key did not set the decimal point back")
	}
}

// TestDecimalFlag: --decimal-comma sets the comma at once on a new session,
// and by the statement on a restored one, whose earlier statements keep
// reading as they were typed; the session keeps the setting.
func TestDecimalFlag(t *testing.T) {
	dir := t.TempDir()
	m := newModel(t, Options{Dir: dir, New: true})
	typeLine(t, m, "Zp = 2.2 kΩ")
	m.Close()
	m = newModel(t, Options{Dir: dir, Comma: true})
	if !m.s.sh.Settings().Comma {
		t.Fatalf("--decimal-comma not applied: %s", m.msg)
	}
	if q := value(t, m, "Zp"); q != 2200 {
		t.Errorf("a statement typed under the point reads %v after the flag", q)
	}
	typeLine(t, m, "Zq = 4,7 kΩ")
	m.Close()
	// restored without the flag, the session keeps the comma
	m = newModel(t, Options{Dir: dir})
	if !m.s.sh.Settings().Comma || value(t, m, "Zq") != 4700 || value(t, m, "Zp") != 2200 {
		t.Errorf("restored: comma %v, rows %v", m.s.sh.Settings().Comma, m.s.rows())
	}
	b, err := os.ReadFile(m.s.path)
	if err != nil || !strings.Contains(string(b), "decimal comma") {
		t.Errorf("session file (%v):\n%s", err, b)
	}
	// a blank start keeps the marker: it is how the user writes numbers
	typeLine(t, m, "new session")
	if !m.s.sh.Settings().Comma {
		t.Errorf("a new session dropped the decimal comma")
	}
}
