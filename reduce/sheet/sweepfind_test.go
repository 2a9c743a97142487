package sheet

import (
	"math"
	"strings"
	"testing"

	"argand/calc"
)

// The sweep statement reports what it found, checked against the closed
// forms of a series RLC circuit (common practice): f0 = 1/(2π·√(L·C)),
// Q = (1/R)·√(L/C), f1,2 = f0·(√(1 + 1/(4Q²)) ∓ 1/(2Q)).
func TestSweepFindings(t *testing.T) {
	s := New()
	for _, line := range []string{
		"resistor R1 = 20 Ω", "inductor L1 = 10 mH", "capacitor C1 = 1 µF", "Z = R1 + L1 + C1",
	} {
		if _, err := s.Exec(line); err != nil {
			t.Fatal(line, err)
		}
	}
	steps, err := s.Exec("sweep Z from 500 Hz to 5 kHz points 41 db ref 1 Ω")
	if err != nil {
		t.Fatal(err)
	}
	var found *calc.Step
	for i := range steps {
		if steps[i].Kind == "sweep-findings" {
			found = &steps[i]
		}
	}
	if found == nil {
		t.Fatalf("no findings step in %d steps", len(steps))
	}
	got := map[string]complex128{}
	for _, r := range found.Results {
		got[r.Name] = r.Value.V
	}
	f0 := 1 / (2 * math.Pi * math.Sqrt(10e-3*1e-6))
	q := math.Sqrt(10e-3/1e-6) / 20
	h := 1 / (2 * q)
	want := map[string]float64{"f_r1": f0, "f(min)": f0, "f1_1": f0 * (math.Sqrt(1+h*h) - h), "f2_1": f0 * (math.Sqrt(1+h*h) + h), "Q_1": q, "x(min)": 20}
	for k, w := range want {
		if g, ok := got[k]; !ok || math.Abs(real(g)-w) > 1e-9*w || math.Abs(imag(g)) > 1e-9*w {
			t.Errorf("%s = %v, want %v", k, g, w)
		}
	}
	// the dB column is 20·log10(|Z|/1 Ω)
	for _, st := range steps {
		if st.Kind != "sweep" {
			continue
		}
		for _, row := range st.Rows {
			if len(row.Values) != 2 || row.Values[1].Name != "dB" {
				t.Fatalf("row %q: %+v", row.Name, row.Values)
			}
			if d := 20 * math.Log10(abs(row.Values[0].Value.V)); math.Abs(real(row.Values[1].Value.V)-d) > 1e-9 {
				t.Errorf("row %s: %v dB, want %v", row.Name, row.Values[1].Value.V, d)
			}
		}
	}
	// dB of a value with a unit needs its reference
	if _, err := s.Exec("sweep Z from 500 Hz to 5 kHz points 5 db"); err == nil || !strings.Contains(err.Error(), "db ref") {
		t.Errorf("db without a reference: %v", err)
	}
	if _, err := s.Exec("sweep Z from 500 Hz to 5 kHz points 5 db ref 1 V"); err == nil || !strings.Contains(err.Error(), "unit of the swept value") {
		t.Errorf("db ref in the wrong unit: %v", err)
	}
}

func abs(v complex128) float64 { return math.Hypot(real(v), imag(v)) }

// A parallel RLC through the worksheet: the peak of |Z| is R at
// f0 = 1/(2π·√(L·C)) and the band where |Z| = R/√2 has f2 − f1 = f0/Q with
// Q = R·√(C/L) (common practice).
func TestSweepFindingsParallel(t *testing.T) {
	s := New()
	for _, line := range []string{"resistor Rp = 2.5 kΩ", "inductor Lp = 10 mH", "capacitor Cp = 1 µF", "Zp = Rp || Lp || Cp"} {
		if _, err := s.Exec(line); err != nil {
			t.Fatal(line, err)
		}
	}
	steps, err := s.Exec("sweep Zp from 1 kHz to 3 kHz points 101 linear")
	if err != nil {
		t.Fatal(err)
	}
	got := map[string]complex128{}
	for _, st := range steps {
		if st.Kind == "sweep-findings" {
			for _, r := range st.Results {
				got[r.Name] = r.Value.V
			}
		}
	}
	f0 := 1 / (2 * math.Pi * math.Sqrt(10e-3*1e-6))
	q := 2500 * math.Sqrt(1e-6/10e-3)
	for k, w := range map[string]float64{"f_r1": f0, "f(max)": f0, "x(max)": 2500, "B_1": f0 / q, "Q_1": q} {
		if g, ok := got[k]; !ok || math.Abs(real(g)-w) > 1e-9*w {
			t.Errorf("%s = %v, want %v", k, g, w)
		}
	}
}
