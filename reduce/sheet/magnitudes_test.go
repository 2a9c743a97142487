package sheet

import (
	"strings"
	"testing"

	"argand/calc"
)

// TestCombinedResistances: resistances combined by ||, series() or
// parallel() are a resistance, as R1 + R2 already is: shown with its unit
// and no angle, JSON quantity "resistance" (conductances likewise). Once
// any operand is complex the combination is an impedance with its angle.
// R = R1·R2/(R1 + R2) and R = R1 + R2 (common practice). Invented example
// data.
func TestCombinedResistances(t *testing.T) {
	tests := []struct {
		line, quantity, shown string
	}{
		{"z = 2.2 kΩ + 4.7 kΩ", "resistance", "6.900 kΩ"},
		{"z = 2.2 kΩ || 4.7 kΩ", "resistance", "1.499 kΩ"},
		{"z = 2.2 kΩ || 4.7 kΩ || 10 kΩ", "resistance", "1.303 kΩ"},
		{"z = parallel(2.2 kΩ, 4.7 kΩ)", "resistance", "1.499 kΩ"},
		{"z = parallel(2.2 kΩ, 4.7 kΩ, 10 kΩ)", "resistance", "1.303 kΩ"},
		{"z = series(2.2 kΩ, 4.7 kΩ)", "resistance", "6.900 kΩ"},
		{"z = series(2.2 kΩ, 4.7 kΩ || 4.7 kΩ)", "resistance", "4.550 kΩ"},
		{"z = 4k7 || 10k", "resistance", "3.197 kΩ"},
		{"z = 10k + 4K7", "resistance", "14.70 kΩ"},
		{"z = series(10k, 4K7)", "resistance", "14.70 kΩ"},
		{"z = parallel(1 mS, 2 mS)", "conductance", "3.000 mS"},
		{"z = series(1 mS, 2 mS)", "conductance", "666.7 µS"},
		{"z = 2.2 kΩ || j4.7 kΩ", "impedance", "∠25.08°"},
		{"z = parallel(2.2 kΩ, 4.7 kΩ + j1 kΩ)", "impedance", "∠"},
		{"z = series(2.2 kΩ, 10 mH)", "impedance", "∠0.08182°"},
		{"z = series(2.2 kΩ, 4.7 kΩ - j1 kΩ)", "impedance", "∠"},
	}
	for _, tt := range tests {
		s := New()
		execOK(t, s, tt.line)
		q := valueOf(t, s, "z")
		if got := calc.QuantityName(q); got != tt.quantity {
			t.Errorf("%s: quantity %s, want %s", tt.line, got, tt.quantity)
		}
		shown := calc.Format{}.Both(q, true)
		if !strings.Contains(shown, tt.shown) {
			t.Errorf("%s: shown %q, want it to hold %q", tt.line, shown, tt.shown)
		}
		if hasAngle := strings.Contains(shown, "∠"); hasAngle != (tt.quantity == "impedance") {
			t.Errorf("%s: shown %q: angle shown %v for a %s", tt.line, shown, hasAngle, tt.quantity)
		}
	}
}

// TestReadingIsMagnitude: a meter reading in a reading check is an RMS
// magnitude (IEC 60050-131: the RMS value has no phase), shown in the
// step without an angle and named "magnitude" in JSON, whatever form it
// was typed in. Invented example data.
func TestReadingIsMagnitude(t *testing.T) {
	setup := []string{
		"frequency 50 Hz",
		"resistor Ra = 100 Ω",
		"capacitor Cb = 10 µF",
		"tolerance Ra 5%",
		"network n2 = Ra + Cb fed by 1 V",
	}
	tests := []struct {
		check, shown string
	}{
		{"check n2.Cb.v reads 0.9 V within 1% + 2 digits of 0.01 V", "900.0 mV"},
		{"check n2.Cb.v reads 954 mV within 1%", "954.0 mV"},
		{"check n2.Cb.v reads 0.95∠-17° V", "950.0 mV"},
	}
	for _, tt := range tests {
		s := New()
		for _, l := range setup {
			execOK(t, s, l)
		}
		seen := false
		for _, st := range execOK(t, s, tt.check) {
			for _, op := range st.Inputs {
				if op.Name != "reading" {
					continue
				}
				seen = true
				if got := calc.QuantityName(op.Value); got != "magnitude" {
					t.Errorf("%s: reading is %s, want magnitude", tt.check, got)
				}
				if got := (calc.Format{}).Both(op.Value, true); got != tt.shown {
					t.Errorf("%s: reading shown %q, want %q", tt.check, got, tt.shown)
				}
			}
			if st.Check != nil && calc.QuantityName(st.Check.Got) != "magnitude" {
				t.Errorf("%s: the check's reading is %s, want magnitude", tt.check, calc.QuantityName(st.Check.Got))
			}
		}
		if !seen {
			t.Errorf("%s: no step took the reading as an input", tt.check)
		}
	}
}

// TestMagnitudeNamed: a result that is a magnitude |V| or |I| (a current
// from |S| and |V|, whose angle cannot be known) is named as one, magI1 or
// magV1 after mag(), never I1 or V1 as a phasor would be; a current whose
// angle is known keeps the phasor's name. Invented example data.
func TestMagnitudeNamed(t *testing.T) {
	tests := []struct {
		line, name, quantity string
	}{
		{"current(10 kVA, 230 V, single)", "magI1", "magnitude"},
		{"mag(3+j4 V)", "magV1", "magnitude"},
		{"mag(2 A)", "magI1", "magnitude"},
		{"current(8 kW + j6 kvar, 230 V, single)", "I1", "phasor"},
		{"230 V", "V1", "phasor"},
	}
	for _, tt := range tests {
		s := New()
		steps := execOK(t, s, tt.line)
		r, ok := steps[len(steps)-1].Result()
		if !ok {
			t.Fatalf("%s: no result", tt.line)
		}
		if r.Name != tt.name {
			t.Errorf("%s: named %s, want %s", tt.line, r.Name, tt.name)
		}
		if got := calc.QuantityName(r.Value); got != tt.quantity {
			t.Errorf("%s: quantity %s, want %s", tt.line, got, tt.quantity)
		}
	}
}
