package tui

import (
	"math"
	"os"
	"path/filepath"
	"testing"
)

// TestWorksheetFilesBesideIt: a worksheet opened in the app reads the
// files it names (spectrum NAME from FILE) from its own directory, as
// argand run does, wherever argand was started; so does a statement typed
// afterwards.
func TestWorksheetFilesBesideIt(t *testing.T) {
	root := t.TempDir()
	dir := filepath.Join(root, "site", "board2")
	if err := os.MkdirAll(dir, 0o755); err != nil {
		t.Fatal(err)
	}
	// example data: an invented current spectrum, 100 A with 20 % fifth
	// and 10 % seventh
	for name, text := range map[string]string{
		"ib.csv":     "order,value\n1,100 A\n5,20 A\n",
		"ic.csv":     "order,value\n1,100 A\n7,10 A\n",
		"job.argand": "spectrum Ib from ib.csv\nd = thd(Ib)\n",
	} {
		if err := os.WriteFile(filepath.Join(dir, name), []byte(text), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	t.Chdir(t.TempDir()) // started somewhere else
	m := newModel(t, Options{File: filepath.Join(dir, "job.argand")})
	if m.msgErr {
		t.Fatalf("opening: %s", m.msg)
	}
	if d, ok := m.s.sh.Lookup("d"); !ok || math.Abs(real(d.V)-0.2) > 1e-12 {
		t.Errorf("d = %v (%v), want THD 0.2", d.V, ok)
	}
	typeLine(t, m, "spectrum Ic from ic.csv")
	typeLine(t, m, "d7 = thd(Ic)")
	if d, ok := m.s.sh.Lookup("d7"); !ok || math.Abs(real(d.V)-0.1) > 1e-12 {
		t.Errorf("d7 = %v (%v), want THD 0.1", d.V, ok)
	}
}
