package sheet

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"argand/calc"
)

// writeFile writes a test file into dir.
func writeFile(t *testing.T, dir, name, body string) string {
	t.Helper()
	p := filepath.Join(dir, name)
	if err := os.WriteFile(p, []byte(body), 0o644); err != nil {
		t.Fatal(err)
	}
	return p
}

// TestReadingsStatement: the file is read relative to the worksheet's
// folder, its names are checked against the worksheet, and the error
// names the file, line and column. A check reads a reading like any name.
func TestReadingsStatement(t *testing.T) {
	dir := t.TempDir()
	writeFile(t, dir, "site.csv", "name,value,unit\nV_R1,9.449,V\n")
	writeFile(t, dir, "clash.csv", "R1,1,Ω\n")
	writeFile(t, dir, "bad.csv", "V_R1,9.449,V\nI_R1,x y,A\n")
	s := New()
	s.SetDir(dir)
	runOn(t, s, "resistor R1 = 10 Ω", "I1 = 944.9 mA", "V1 = R1 * I1", `readings "site.csv"`)
	steps := execOK(t, s, "check V1 is V_R1 within 0.01%")
	if c := steps[len(steps)-1].Check; c == nil || !c.Pass {
		t.Errorf("check against the reading: %+v", c)
	}
	_, _, err := s.Exec("readings clash.csv")
	if err == nil || !strings.Contains(err.Error(), "clash.csv: line 1, column 1: R1 is an element") {
		t.Errorf("a reading named as an element: %v", err)
	}
	_, _, err = s.Exec("readings bad.csv")
	le, ok := err.(*calc.Error)
	if !ok || !strings.Contains(le.Msg, "bad.csv: line 2, column 6") || le.Col != 10 {
		t.Errorf("bad row: %v", err)
	}
	if _, ok := s.Lookup("I_R1"); ok {
		t.Error("a refused file defined a name")
	}
	// names are the worksheet's: its keywords, constants and read-only
	// names are refused
	for _, name := range []string{"readings", "frequency", "pi", "f", "ω"} {
		writeFile(t, dir, "reserved.csv", name+",1,V\n")
		if _, _, err := s.Exec("readings reserved.csv"); err == nil || !strings.Contains(err.Error(), "is reserved") {
			t.Errorf("a reading named %s: %v", name, err)
		}
	}
	runOn(t, s, "capacitor C9 = 1 µF", "network N9 = R1 + C9 fed by 1 V", "spectrum H9 h1 1 A")
	for _, name := range []string{"N9", "H9", "sqrt", "N9.R1.v"} {
		writeFile(t, dir, "taken.csv", name+",1,V\n")
		if _, _, err := s.Exec("readings taken.csv"); err == nil {
			t.Errorf("a reading named %s was accepted", name)
		}
	}
	for _, line := range []string{"readings", "readings missing.csv", "readings ."} {
		if _, _, err := s.Exec(line); err == nil {
			t.Errorf("%s: accepted", line)
		}
	}
	srv := New()
	srv.SetLimits(Limits{NoFiles: true})
	srv.SetDir(dir)
	if _, _, err := srv.Exec("readings site.csv"); err == nil || !strings.Contains(err.Error(), "cannot be read here") {
		t.Errorf("a server read a file: %v", err)
	}
}

// TestReadingsAgain: reading a changed file again replaces the values and
// re-evaluates what depends on them.
func TestReadingsAgain(t *testing.T) {
	dir := t.TempDir()
	p := writeFile(t, dir, "r.csv", "Vm,10,V\n")
	s := New()
	s.SetDir(dir)
	runOn(t, s, "readings r.csv", "P = Vm * Vm / (10 Ω)")
	writeFile(t, dir, "r.csv", "Vm,20,V\n")
	runOn(t, s, "readings "+filepath.Base(p))
	if got := real(value(t, s, "P").V); got != 40 {
		t.Errorf("P = %g W after the new reading, want 40 W (V²/R)", got)
	}
}
