package sheet

import (
	"math"
	"strings"
	"testing"

	"argand/calc"
)

// TestReservedNames: units (with any prefix), constants, functions and
// statement keywords cannot name a quantity, so "10 mS" and a quantity
// called mS can never be confused; defining one is a clear error.
func TestReservedNames(t *testing.T) {
	reserved := []struct{ name, why string }{
		{"S", "unit"}, {"V", "unit"}, {"A", "unit"}, {"H", "unit"}, {"F", "unit"}, {"W", "unit"},
		{"mS", "unit"}, {"ms", "unit"}, {"m", "unit"}, {"kΩ", "unit"}, {"Hz", "unit"}, {"var", "unit"}, {"VA", "unit"},
		{"pi", "constant"}, {"π", "constant"}, {"e", "constant"}, {"f", "working frequency"}, {"w", "angular frequency"},
		{"frequency", "keyword"}, {"check", "keyword"}, {"end", "keyword"}, {"mag", "function"}, {"zl", "function"}, {"sqrt", "function"},
	}
	for _, r := range reserved {
		s := New()
		_, err := s.Exec(r.name + " = 1")
		le, ok := err.(*calc.Error)
		if !ok {
			t.Errorf("%s = 1: error %v, want a located error", r.name, err)
			continue
		}
		if !strings.Contains(le.Msg, "reserved") || !strings.Contains(le.Msg, r.why) || le.Col != 1 {
			t.Errorf("%s = 1: %q at col %d; want reserved (%s) at col 1", r.name, le.Msg, le.Col, r.why)
		}
	}
	for _, ok := range []string{"Rload", "Vs", "mS1", "Z_a", "Ia", "kk", "x"} {
		s := New()
		if _, err := s.Exec(ok + " = 1"); err != nil {
			t.Errorf("%s = 1: %v", ok, err)
		}
	}
	// "i" and "j" read as the imaginary unit
	for _, n := range []string{"j", "i"} {
		if _, err := New().Exec(n + " = 1"); err == nil {
			t.Errorf("%s = 1 accepted", n)
		}
	}
}

// TestFrequencyRecompute: an inductor remembers its value, so a new
// working frequency re-evaluates its impedance (X_L = ωL, ω = 2πf, common
// practice) and what depends on it, in one step; earlier steps keep the
// values they showed.
func TestFrequencyRecompute(t *testing.T) {
	s := New()
	for _, l := range []string{"inductor L1 = 10 mH", "Zs = L1 + 10 Ω"} {
		if _, err := s.Exec(l); err != nil {
			t.Fatal(err)
		}
	}
	first := s.Steps()[len(s.Steps())-1]
	steps, err := s.Exec("frequency 60 Hz")
	if err != nil {
		t.Fatal(err)
	}
	var rec *calc.Step
	for i := range steps {
		if steps[i].Kind == "recompute" {
			rec = &steps[i]
		}
	}
	if rec == nil {
		t.Fatalf("no recompute step among %d steps", len(steps))
	}
	changed := map[string]complex128{}
	for _, o := range rec.Results {
		changed[o.Name] = o.Value.V
	}
	wantL := complex(0, 2*math.Pi*60*10e-3)
	if v, ok := changed["L1"]; !ok || math.Abs(imag(v)-imag(wantL)) > 1e-12 {
		t.Errorf("L1 after 60 Hz = %v, want %v", v, wantL)
	}
	if v, ok := changed["Zs"]; !ok || v != 10+wantL {
		t.Errorf("Zs after 60 Hz = %v, want %v", v, 10+wantL)
	}
	// history: the step made at 50 Hz still shows the 50 Hz value
	r, _ := first.Result()
	if want := complex(10, 2*math.Pi*50*10e-3); math.Abs(imag(r.Value.V)-imag(want)) > 1e-12 {
		t.Errorf("the earlier step now shows %v, want %v", r.Value.V, want)
	}
}
