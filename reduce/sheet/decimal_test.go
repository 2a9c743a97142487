package sheet

import (
	"strings"
	"testing"
)

// The decimal comma (SI Brochure 9th ed., §5.4.4: the point or the comma
// on the line) as a worksheet setting.

func mustRun(t *testing.T, s *Sheet, lines ...string) {
	t.Helper()
	for _, l := range lines {
		if _, _, err := s.Exec(l); err != nil {
			t.Fatalf("%q: %v", l, err)
		}
	}
}

func TestDecimalStatement(t *testing.T) {
	pt, cm := New(), New()
	mustRun(t, pt, "L = 2.2 mH", "Z = parallel(2.2 kΩ, 4.7 kΩ)", "p = 0.95", "x = atan2(4.5, 3)")
	mustRun(t, cm, "decimal comma", "L = 2,2 mH", "Z = parallel(2,2 kΩ; 4,7 kΩ)", "p = 0,95", "x = atan2(4,5; 3)")
	for _, n := range []string{"L", "Z", "p", "x"} {
		a, _ := pt.Lookup(n)
		b, _ := cm.Lookup(n)
		if a != b {
			t.Errorf("%s: %v under the point, %v under the comma", n, a, b)
		}
	}
	if !cm.Settings().Comma || pt.Settings().Comma {
		t.Errorf("settings: comma %v, point %v", cm.Settings().Comma, pt.Settings().Comma)
	}
	// the value shown in the step uses the marker in force
	st, _, err := cm.Exec("L")
	if err != nil {
		t.Fatal(err)
	}
	if txt := st[0].Text(cm.Context().Format, false); !strings.Contains(txt, "2,200 mH") {
		t.Errorf("shown under the comma:\n%s", txt)
	}
	// refused under the point, everywhere, with the exact suggestion
	for src, msg := range map[string]string{
		"L2 = 2,2 mH":       "decimal comma? write 2.2 mH, or set decimal comma",
		"y = max(2,2)":      "decimal comma? write 2.2, or set decimal comma (for two arguments write 2, 2)",
		"frequency 50,5 Hz": "decimal comma? write 50.5 Hz, or set decimal comma",
	} {
		_, _, err := pt.Exec(src)
		if err == nil || !strings.Contains(err.Error(), msg) {
			t.Errorf("%q: %v, want %q", src, err, msg)
		}
	}
	if _, _, err := pt.Exec("decimal = 3"); err == nil || !strings.Contains(err.Error(), "reserved") {
		t.Errorf("decimal as a name: %v", err)
	}
	if _, _, err := pt.Exec("decimal dot"); err == nil || !strings.Contains(err.Error(), "comma or point") {
		t.Errorf("decimal dot: %v", err)
	}
}

// TestDecimalSaved: a worksheet begun under the comma states it, so that it
// replays the same whatever marker the replaying worksheet starts in.
func TestDecimalSaved(t *testing.T) {
	s := New()
	s.SetDecimalComma(true)
	mustRun(t, s, "R = 4,7 kΩ", "decimal point", "Cp = 2.2 µF", "decimal comma", "Z = series(R; 1 kΩ)")
	if s.SetDecimalComma(false) {
		t.Error("the marker changed without a statement after statements ran")
	}
	w := s.Worksheet()
	if w[0] != LanguageLine() || w[1] != "decimal comma" {
		t.Fatalf("worksheet begins %q", w[:2])
	}
	if st := s.Statements(); st[0] != "decimal comma" || len(st) != 6 {
		t.Fatalf("statements %q", st)
	}
	for _, start := range []bool{false, true} {
		r := New()
		r.SetDecimalComma(start)
		mustRun(t, r, w...)
		for _, n := range []string{"R", "Cp", "Z"} {
			a, _ := s.Lookup(n)
			b, _ := r.Lookup(n)
			if a != b {
				t.Errorf("replayed from comma=%v: %s = %v, want %v", start, n, b, a)
			}
		}
		// saved again, it is the same worksheet
		if got := strings.Join(r.Worksheet(), "\n"); got != strings.Join(w, "\n") {
			t.Errorf("saved again:\n%s\nwant\n%s", got, strings.Join(w, "\n"))
		}
	}
	// a worksheet begun under the point says so too
	p := New()
	mustRun(t, p, "R = 1 kΩ")
	if w := p.Worksheet(); w[1] != "decimal point" {
		t.Errorf("point worksheet begins %q", w[:2])
	}
	if st := p.Statements(); st[0] != "R = 1 kΩ" {
		t.Errorf("point statements %q", st)
	}
}

// TestChangeMarker: the rewriting used to run a worksheet under the other
// marker, against forms written by hand.
func TestChangeMarker(t *testing.T) {
	for point, comma := range map[string]string{
		"Z = parallel(2.2 kΩ, 4.7 kΩ)  # two, in parallel": "Z = parallel(2,2 kΩ; 4,7 kΩ)  # two, in parallel",
		"V = 230∠-30.5 V":       "V = 230∠-30,5 V",
		"x = 3+j4.5 Ω":          "x = 3+j4,5 Ω",
		"T1.z * 2.5":            "T1.z * 2,5",
		"decimal point":         "decimal comma",
		"y = 5. * 4k7":          "y = 5 * 4k7",
		"check Z = 1.5 kΩ ± 1%": "check Z = 1,5 kΩ ± 1%",
	} {
		got := ChangeMarker(point, false)
		if got != comma {
			t.Errorf("%q → %q, want %q", point, got, comma)
		}
		if point == "y = 5. * 4k7" {
			continue
		}
		back := ChangeMarker(comma, true)
		if back != point {
			t.Errorf("%q → %q, want %q", comma, back, point)
		}
	}
}
