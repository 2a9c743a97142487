package sheet

import (
	"math"
	"strings"
	"testing"

	"argand/calc"
)

// TestReservedNames: constants, functions, statement keywords, f and w
// cannot name a quantity; defining one is a clear error. Unit symbols
// can: a unit only ever follows a number.
func TestReservedNames(t *testing.T) {
	reserved := []struct{ name, why string }{
		{"language", "keyword"}, {"pi", "constant"}, {"π", "constant"}, {"e", "constant"}, {"f", "working frequency"}, {"w", "angular frequency"},
		{"frequency", "keyword"}, {"check", "keyword"}, {"end", "keyword"}, {"mag", "function"}, {"zl", "function"}, {"sqrt", "function"},
	}
	for _, r := range reserved {
		s := New()
		_, _, err := s.Exec(r.name + " = 1")
		le, ok := err.(*calc.Error)
		if !ok {
			t.Errorf("%s = 1: error %v, want a located error", r.name, err)
			continue
		}
		if !strings.Contains(le.Msg, "reserved") || !strings.Contains(le.Msg, r.why) || le.Col != 1 {
			t.Errorf("%s = 1: %q at col %d; want reserved (%s) at col 1", r.name, le.Msg, le.Col, r.why)
		}
	}
	for _, ok := range []string{"Rload", "Vs", "mS1", "Z_a", "Ia", "kk", "x",
		"S", "V", "A", "H", "F", "W", "mS", "ms", "m", "kΩ", "Hz", "var", "VA", "C"} {
		s := New()
		if _, _, err := s.Exec(ok + " = 1"); err != nil {
			t.Errorf("%s = 1: %v", ok, err)
		}
	}
	// "i" and "j" read as the imaginary unit
	for _, n := range []string{"j", "i"} {
		if _, _, err := New().Exec(n + " = 1"); err == nil {
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
		if _, _, err := s.Exec(l); err != nil {
			t.Fatal(err)
		}
	}
	first := s.Steps()[len(s.Steps())-1]
	steps, _, err := s.Exec("frequency 60 Hz")
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

// TestNaturalNames: names a technician writes (issue 10) are accepted, a
// unit after a number stays a unit whatever a name means, and a name that
// is also a unit symbol says so once, on the line that defines it.
func TestNaturalNames(t *testing.T) {
	s := New()
	lines := []string{"capacitor C = 22 µF", "S = 230 V * 6.2 A", "m = 3", "A = 2 * m", "x = 10 A + 5 A", "y = S / 2"}
	notes := map[string]bool{}
	for _, l := range lines {
		steps, _, err := s.Exec(l)
		if err != nil {
			t.Fatalf("%s: %v", l, err)
		}
		for _, st := range steps {
			for _, n := range st.Notes {
				if strings.Contains(n, "also a unit symbol") {
					notes[l] = true
				}
			}
		}
	}
	for _, l := range []string{"capacitor C = 22 µF", "S = 230 V * 6.2 A", "m = 3", "A = 2 * m"} {
		if !notes[l] {
			t.Errorf("%s: no note that the name is also a unit symbol", l)
		}
	}
	if notes["x = 10 A + 5 A"] || notes["y = S / 2"] {
		t.Errorf("a note where no unit symbol is defined: %v", notes)
	}
	// S = V·I: 230 V × 6.2 A = 1426 VA (common practice); 10 A + 5 A is
	// 15 A even though A names 6 here; m is 3, A is 6
	want := map[string]complex128{"S": 1426, "m": 3, "A": 6, "x": 15, "y": 713}
	for n, v := range want {
		q, ok := s.Lookup(n)
		if !ok || cmplxAbs(q.V-v) > 1e-9*cmplxAbs(v) {
			t.Errorf("%s = %v, want %v", n, q.V, v)
		}
	}
	if q, _ := s.Lookup("x"); q.Dim != calc.DimCurrent {
		t.Errorf("x has dimension %v, want a current", q.Dim)
	}
	if q, _ := s.Lookup("C"); q.Dim != calc.DimImpedance {
		t.Errorf("capacitor C stands for its impedance, got %v", q.Dim)
	}
	// redefining keeps quiet: the note is said the first time only
	steps, _, err := s.Exec("m = 4")
	if err != nil {
		t.Fatal(err)
	}
	for _, st := range steps {
		for _, n := range st.Notes {
			if strings.Contains(n, "also a unit symbol") {
				t.Errorf("m = 4: note repeated: %s", n)
			}
		}
	}
}

func cmplxAbs(v complex128) float64 { return math.Hypot(real(v), imag(v)) }
