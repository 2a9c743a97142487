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
		if _, _, err := s.Exec(line); err != nil {
			t.Fatal(line, err)
		}
	}
	steps, _, err := s.Exec("sweep Z from 500 Hz to 5 kHz points 41 db ref 1 Ω")
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
	if _, _, err := s.Exec("sweep Z from 500 Hz to 5 kHz points 5 db"); err == nil || !strings.Contains(err.Error(), "db ref") {
		t.Errorf("db without a reference: %v", err)
	}
	if _, _, err := s.Exec("sweep Z from 500 Hz to 5 kHz points 5 db ref 1 V"); err == nil || !strings.Contains(err.Error(), "unit of the swept value") {
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
		if _, _, err := s.Exec(line); err != nil {
			t.Fatal(line, err)
		}
	}
	steps, _, err := s.Exec("sweep Zp from 1 kHz to 3 kHz points 101 linear")
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

// A sweep re-evaluates only what its expression reads: a worksheet with
// networks and frequency-dependent definitions it does not read gives the
// same points, and the same estimate of the work, as a worksheet with only
// what it reads; one it does read (through a network and a Thevenin
// equivalent) is followed at every point.
func TestSweepRestricted(t *testing.T) {
	base := []string{"resistor Rf = 1 kΩ", "capacitor Cf = 1 µF", "Zrc = Rf + Cf"}
	extra := []string{
		"frequency 1 kHz",
		"network bridge reference gnd",
		"  voltage source Vx = 5∠0 V from gnd to top",
		"  resistor R1 = 1 kΩ from top to left",
		"  resistor R2 = 1 kΩ from top to right",
		"  resistor R3 = 1.02 kΩ from left to gnd",
		"  capacitor C4 = 160 nF from right to gnd",
		"  resistor Rm = 10 kΩ from left to right",
		"end",
		"thevenin T = bridge between left and right",
		"inductor Lx = 3 mH",
		"Zx = Lx + C4 * 2",
	}
	tests := []struct {
		name, expr string
		stmts      []string
	}{
		{name: "unrelated network", expr: "Zrc", stmts: extra},
		{name: "through the network", expr: "bridge.Rm.i", stmts: extra},
		{name: "through the Thevenin equivalent", expr: "T.zth + Zrc", stmts: extra},
		{name: "through a definition", expr: "Zx", stmts: extra},
	}
	for _, tc := range tests {
		full := New()
		for _, st := range append(append([]string(nil), base...), tc.stmts...) {
			if _, _, err := full.Exec(st); err != nil {
				t.Fatalf("%s: %s: %v", tc.name, st, err)
			}
		}
		stmt := "sweep " + tc.expr + " from 10 Hz to 100 kHz points 41 log"
		if _, _, err := full.Exec(stmt); err != nil {
			t.Fatalf("%s: %v", tc.name, err)
		}
		sw := full.Sweeps()[len(full.Sweeps())-1]
		// each point against the worksheet evaluated whole at that frequency
		e := calc.NewParser(tc.expr, 1).Expr()
		for _, pt := range sw.Table.Points {
			want, err := full.AtFrequency(tc.expr, e, pt.Freq)
			if err != nil {
				t.Fatalf("%s at %v Hz: %v", tc.name, pt.Freq, err)
			}
			if pt.Value.V != want.V {
				t.Errorf("%s at %v Hz: %v, want %v", tc.name, pt.Freq, pt.Value.V, want.V)
			}
		}
	}
	// the estimate does not grow with what the sweep does not read
	small, big := New(), New()
	for _, st := range base {
		small.Exec(st)
	}
	for _, st := range append(append([]string(nil), base...), extra...) {
		big.Exec(st)
	}
	e := calc.NewParser("Zrc", 1).Expr()
	f := []string{"f", "w", "ω"}
	if a, b := small.sampleCost(f, e, small.needs(e)), big.sampleCost(f, e, big.needs(e)); a != b {
		t.Errorf("estimate per point %v with unrelated parts, %v without", b, a)
	}
	// 100000 points of a sweep that takes about 0.5 s fit the default budget
	if _, _, err := big.Exec("sweep Zrc from 10 Hz to 100 kHz points 100000 log"); err != nil {
		t.Errorf("100000 points refused: %v", err)
	}
}
