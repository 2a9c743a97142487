package sheet

import (
	"slices"
	"testing"
)

// Exec returns the names a statement defined, not those re-evaluated
// because they read one, nor the dotted results of a function or network.
func TestExecDefined(t *testing.T) {
	s := New()
	for _, c := range []struct {
		src  string
		want []string
	}{
		{"Za = 3+j4 Ω", []string{"Za"}},
		{"Zb = Za * 2", []string{"Zb"}},
		{"Za = 6 Ω", []string{"Za"}}, // Zb follows, but was not defined here
		{"Za + Zb", []string{"Z1"}},
		{"frequency 60 Hz", nil},
		{"resistor R1 = 10 Ω", []string{"R1"}},
		{"Qc = pfc(10 kW, 0.7, 0.95, 400 V, three)", []string{"Qc"}},
		{"network n1 reference gnd", nil},
		{"voltage source V0 = 10 V from gnd to a", []string{"V0"}},
		{"resistor R2 = 5 Ω from a to gnd", []string{"R2"}},
		{"end", nil},
		{"thevenin T = n1 between a and gnd", []string{"T"}},
		{"rename Qc to Qbank", []string{"Qbank"}},
	} {
		_, got, err := s.Exec(c.src)
		if err != nil {
			t.Fatalf("%s: %v", c.src, err)
		}
		if !slices.Equal(got, c.want) {
			t.Errorf("%s: defined %v, want %v", c.src, got, c.want)
		}
	}
	if _, got, err := s.Exec("Zc = nothing"); err == nil || got != nil {
		t.Errorf("a failed statement defined %v (error %v)", got, err)
	}
}
