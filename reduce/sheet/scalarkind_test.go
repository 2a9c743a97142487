package sheet

import (
	"testing"

	"argand/calc"
)

// TestScalarResultsKeepKind: a function whose result is a real number by
// meaning gives it that kind, so it is shown as a number with its unit and
// never as a phasor at 0° (shared DESIGN.md, quantity kinds). The discharge
// resistor R = t/(C·ln(V0/V_safe)) is a resistance (common practice); a
// base impedance Z_base = V²/S is a size (common practice). Invented
// example data.
func TestScalarResultsKeepKind(t *testing.T) {
	tests := []struct {
		line, name, want string
	}{
		{"r = discharge(100 µF, 400 V, 50 V, 30 s)", "r", "resistance"},
		{"x = xfmr(500 kVA, 11 kV, 400 V, 5 %)", "x.zbase1", "magnitude"},
		{"x = xfmr(500 kVA, 11 kV, 400 V, 5 %)", "x.zbase2", "magnitude"},
	}
	for _, tt := range tests {
		s := New()
		execOK(t, s, tt.line)
		q := valueOf(t, s, tt.name)
		if got := calc.QuantityName(q); got != tt.want {
			t.Errorf("%s: %s is %s, want %s", tt.line, tt.name, got, tt.want)
		}
		if !q.Scalar() {
			t.Errorf("%s: %s = %v is shown with an angle", tt.line, tt.name, q.V)
		}
	}
}

// TestNetworkResistorOperand: a resistor taken into a series or parallel
// step is a resistance there too, not an impedance at 0°.
func TestNetworkResistorOperand(t *testing.T) {
	s := New()
	var steps []calc.Step
	for _, l := range []string{"network bench reference n", "voltage source Vs = 230∠0 V from n to a",
		"resistor R1 = 10 Ω from a to b", "inductor L1 = 0.1 H from b to n", "end"} {
		steps = append(steps, execOK(t, s, l)...)
	}
	seen := 0
	for _, st := range steps {
		for _, op := range st.Inputs {
			want := "impedance"
			switch op.Name {
			case "R1":
				want = "resistance"
			case "L1":
			default:
				continue
			}
			seen++
			if got := calc.QuantityName(op.Value); got != want {
				t.Errorf("%s step: %s is %s, want %s", st.Kind, op.Name, got, want)
			}
		}
	}
	if seen == 0 {
		t.Fatal("no step took R1 or L1 as an input")
	}
}

// TestFlagShownWhole: a pass/fail result is a count (shared DESIGN.md,
// quantity kinds), shown 1 or 0 rather than 1.000. Invented example data.
func TestFlagShownWhole(t *testing.T) {
	tests := []struct {
		line, name, want string
	}{
		{"zs1 = zsloop(230 V, 0.21 Ω, 7.41 mΩ/m + 12.1 mΩ/m, 32 m, 70, copper, 1.2 Ω)", "zs1.ok", "1"},
		{"zs2 = zsloop(230 V, 0.21 Ω, 7.41 mΩ/m + 12.1 mΩ/m, 32 m, 70, copper, 320 A)", "zs2.ok", "0"},
	}
	for _, tt := range tests {
		s := New()
		execOK(t, s, tt.line)
		q := valueOf(t, s, tt.name)
		if got := (calc.Format{}).Both(q, false); got != tt.want {
			t.Errorf("%s = %q, want %q", tt.name, got, tt.want)
		}
	}
}
