package sheet

import (
	"strings"
	"testing"
)

func run(t *testing.T, lines ...string) (*Sheet, error) {
	t.Helper()
	s := New()
	for _, l := range lines {
		if _, _, err := s.Exec(l); err != nil {
			return s, err
		}
	}
	return s, nil
}

func TestForgetAndRename(t *testing.T) {
	tests := []struct {
		lines []string
		err   string // "" when the last line must succeed
	}{
		{[]string{"Z1 = 3+j4 Ω", "forget Z1"}, ""},
		{[]string{"Z1 = 3+j4 Ω", "Z2 = 2*Z1", "forget Z1"}, "Z2 depends on it"},
		{[]string{"x = thevenin(10 V, 1 Ω, 1 Ω)", "y = x.z", "forget x"}, "y depends on it"},
		{[]string{"x = thevenin(10 V, 1 Ω, 1 Ω)", "forget x.z"}, "result of x"},
		{[]string{"Z1 = 3+j4 Ω", "rename Z1 to Zq"}, ""},
		{[]string{"Z1 = 3+j4 Ω", "Z2 = 1 Ω", "rename Z1 to Z2"}, "already defined"},
		{[]string{"Z1 = 3+j4 Ω", "rename Z1 to pi"}, "reserved"},
		{[]string{"Z1 = 3+j4 Ω", "rename Z1 to S"}, ""}, // a unit symbol may name a value
		{[]string{"forget nothing"}, "no value named"},
		{[]string{"network n reference gnd", "voltage source V1 = 1 V from gnd to a", "resistor R1 = 1 Ω from a to gnd", "end", "forget R1"}, "element of network n"},
	}
	for _, tc := range tests {
		_, err := run(t, tc.lines...)
		switch {
		case tc.err == "" && err != nil:
			t.Errorf("%q: %v", tc.lines, err)
		case tc.err != "" && (err == nil || !strings.Contains(err.Error(), tc.err)):
			t.Errorf("%q: error %v, want one containing %q", tc.lines, err, tc.err)
		}
	}
	// a renamed value keeps its extras under the new name, and the
	// statements replay to the same names
	s, err := run(t, "x = thevenin(10 V, 1 Ω, 1 Ω)", "rename x to T")
	if err != nil {
		t.Fatal(err)
	}
	if _, ok := s.Lookup("T.z"); !ok {
		t.Error("T.z missing after rename")
	}
	if _, ok := s.Lookup("x"); ok {
		t.Error("x still defined after rename")
	}
	r, err := run(t, s.Statements()...)
	if err != nil {
		t.Fatal(err)
	}
	a, _ := s.Lookup("T.z")
	b, _ := r.Lookup("T.z")
	if a != b {
		t.Errorf("replay: T.z = %v, want %v", b, a)
	}
}
