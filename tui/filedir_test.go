package tui

import (
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// siteFiles writes a worksheet and the files it reads into root/site/board2
// of a fresh directory root. Example data: invented current spectra, 100 A
// with 20 % fifth and with 10 % seventh, and a meter reading.
func siteFiles(t *testing.T) (root, dir string) {
	t.Helper()
	root = t.TempDir()
	dir = filepath.Join(root, "site", "board2")
	if err := os.MkdirAll(dir, 0o755); err != nil {
		t.Fatal(err)
	}
	for name, text := range map[string]string{
		"ib.csv":     "order,value\n1,100 A\n5,20 A\n",
		"ic.csv":     "order,value\n1,100 A\n7,10 A\n",
		"meter.csv":  "name,value,unit\nVm,229.5,V\n",
		"job.argand": "spectrum Ib from ib.csv\nd = thd(Ib)\n",
	} {
		if err := os.WriteFile(filepath.Join(dir, name), []byte(text), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	return root, dir
}

// TestWorksheetFilesBesideIt: a worksheet opened in the app reads the
// files it names (spectrum NAME from FILE) from its own directory, as
// argand run does, wherever argand was started; so does a statement typed
// afterwards.
func TestWorksheetFilesBesideIt(t *testing.T) {
	_, dir := siteFiles(t)
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

// TestRestoredSessionFilesBesideWorksheet: the session of a worksheet
// opened by a relative name, restored later by an argand started in
// another directory (the worksheet named another way), still reads the
// files its statements name from the worksheet's directory: nothing of
// it is left out.
func TestRestoredSessionFilesBesideWorksheet(t *testing.T) {
	root, dir := siteFiles(t)
	sess := t.TempDir()
	t.Chdir(root)
	m := newModel(t, Options{Dir: sess, File: filepath.Join("site", "board2", "job.argand")})
	typeLine(t, m, "spectrum Ic from ic.csv")
	typeLine(t, m, "d7 = thd(Ic)")
	typeLine(t, m, "readings meter.csv")
	if m.msgErr {
		t.Fatalf("typing: %s", m.msg)
	}
	m.Close()

	// started again somewhere else, the worksheet named another way
	t.Chdir(t.TempDir())
	r := newModel(t, Options{Dir: sess, File: filepath.Join(dir, "job.argand")})
	if !strings.Contains(r.msg, "restored your session") || r.msgErr {
		t.Fatalf("restoring: %s", r.msg)
	}
	for name, want := range map[string]float64{"d": 0.2, "d7": 0.1, "Vm": 229.5} {
		if v, ok := r.s.sh.Lookup(name); !ok || math.Abs(real(v.V)-want) > 1e-12 {
			t.Errorf("%s = %v (%v), want %g", name, v.V, ok, want)
		}
	}
}
