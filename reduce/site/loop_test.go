package site

import (
	"math"
	"strings"
	"testing"

	"argand/calc"
)

// An invented final circuit (example data): Z_e 0.35 Ω, R1 + R2 =
// 19.51 mΩ/m at 20 °C, 25 m, copper at 70 °C, U0 230 V. By hand (common
// practice): F = 1 + 0.00393·50 = 1.1965; (R1 + R2)·L·F = 0.01951·25·1.1965
// = 0.583593... Ω; Z_s = 0.933593... Ω; I_f = 230/0.933593... = 246.36 A.
func TestEarthLoop(t *testing.T) {
	base := Loop{U0: 230, Ze: 0.35, R12: 19.51e-3, Length: 25, Theta: 70, Material: Copper}
	r, err := EarthLoop(base)
	if err != nil {
		t.Fatal(err)
	}
	f := 1 + 0.00393*50
	zs := 0.35 + 19.51e-3*25*f
	for _, c := range []struct {
		name      string
		got, want float64
	}{
		{"F", real(r.Factor.V), 1.1965},
		{"Z_s", real(r.Zs.V), zs},
		{"I_f", real(r.If.V), 230 / zs},
	} {
		if math.Abs(c.got-c.want) > 1e-12*c.want {
			t.Errorf("%s = %.12g, want %.12g", c.name, c.got, c.want)
		}
	}
	if math.Abs(real(r.If.V)-246.36) > 0.005 {
		t.Errorf("I_f = %.4f A, by hand 246.36 A", real(r.If.V))
	}
	if r.Checked {
		t.Error("a verdict without a limit")
	}
	notes := strings.Join(r.Steps[1].Notes, " ")
	for _, c := range r.Steps[1].Cautions {
		notes += " " + c.Topic.Text()
	}
	for _, want := range []string{calc.CautionLoop.Text(), calc.CautionFault.Text(), calc.SafetyText, "no limit given"} {
		if !strings.Contains(notes, want) {
			t.Errorf("notes lack %q", want)
		}
	}
	for _, c := range []struct {
		maxZs, minI float64
		within      bool
		word        string
	}{
		{1.0, 0, true, "within"}, {0.9, 0, false, "EXCEEDS"},
		{0, 200, true, "reaches"}, {0, 250, false, "BELOW"},
	} {
		l := base
		l.MaxZs, l.MinI = c.maxZs, c.minI
		r, err := EarthLoop(l)
		if err != nil {
			t.Fatal(err)
		}
		if !r.Checked || r.Within != c.within || !strings.Contains(strings.Join(r.Steps[1].Notes, " "), c.word) {
			t.Errorf("limit %g Ω / %g A: within %v, notes %q", c.maxZs, c.minI, r.Within, r.Steps[1].Notes)
		}
	}
	// aluminium uses its own α20
	l := base
	l.Material = Aluminium
	if r, _ := EarthLoop(l); math.Abs(real(r.Factor.V)-(1+0.00403*50)) > 1e-15 {
		t.Errorf("aluminium F = %g", real(r.Factor.V))
	}
}

func TestEarthLoopErrors(t *testing.T) {
	base := Loop{U0: 230, Ze: 0.35, R12: 19.51e-3, Length: 25, Theta: 70}
	for name, mod := range map[string]func(*Loop){
		"U0 0":        func(l *Loop) { l.U0 = 0 },
		"Ze negative": func(l *Loop) { l.Ze = -1 },
		"R12 0":       func(l *Loop) { l.R12 = 0 },
		"length NaN":  func(l *Loop) { l.Length = math.NaN() },
		"θ 900":       func(l *Loop) { l.Theta = 900 },
		"two limits":  func(l *Loop) { l.MaxZs, l.MinI = 1, 1 },
		"Inf limit":   func(l *Loop) { l.MaxZs = math.Inf(1) },
	} {
		l := base
		mod(&l)
		if _, err := EarthLoop(l); err == nil {
			t.Errorf("%s: no error", name)
		}
	}
}
