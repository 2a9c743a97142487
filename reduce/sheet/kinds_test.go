package sheet

import (
	"strings"
	"testing"

	"argand/calc"
)

// TestFieldMeanings: a field name means one thing in every function
// (.s is the complex power S, .sa the apparent power |S|, .p the active
// power, .q the reactive power), as IEC 60050-131 and IEEE Std 1459-2010
// name them. The calls use invented example data.
func TestFieldMeanings(t *testing.T) {
	calls := []string{
		"power(230 V, 10∠-30 A)",
		"load(8 kW, 0.8, lagging)",
		"loadva(10 kVA, 0.8, lagging)",
		"loads(load(8 kW, 0.8, lagging), 2 kW)",
		"motor(7.5 kW, 0.9, 0.85, three, 400 V)",
		"balanced(400 V, 10+j5 Ω, wye)",
		"fromwattmeters(3 kW, 1 kW)",
		"fromvi(230 V, 4.2 A, 30°)",
		"fromvip(230 V, 4.2 A, 820 W, lagging)",
		"frompf(820 W, 0.85, 230 V, lagging)",
		"wye(230 V, 10 Ω, 20 Ω, 10+j10 Ω, neutral)",
		"delta(400 V, 10 Ω, 20 Ω, 10+j10 Ω)",
		"lrmultiple(150 A, 7, 400 V)",
		"lrkva(75 kW, 6 kVA/kW, 400 V)",
		"motorstart(1 kA, 0.3, 400 V, 150 MVA, 1.3+j7.9 mΩ, 8+j6.4 mΩ)",
		"xfmrshare(400 V, 1 MVA, 5, 6, 630 kVA, 4.5, 4, 1.4 MVA, 0.85, lagging, 0.5)",
	}
	want := map[string]string{"s": "complex-power", "sa": "apparent-power", "p": "active-power", "q": "reactive-power"}
	for _, c := range calls {
		s := New()
		if _, _, err := s.Exec("x = " + c); err != nil {
			t.Errorf("%s: %v", c, err)
			continue
		}
		for field, kind := range want {
			q, ok := s.Lookup("x." + field)
			if !ok {
				continue
			}
			if got := calc.QuantityName(q); got != kind {
				// a P or Q field of exactly 0 is still its kind
				t.Errorf("%s: .%s is %s, want %s", c, field, got, kind)
			}
		}
		if _, ok := s.Lookup("x.s"); ok {
			if _, ok := s.Lookup("x.sa"); !ok {
				t.Errorf("%s: has .s but no .sa", c)
			}
		}
	}
}

// TestParamKindsRefused: a function's parameter refuses the wrong kind of
// power with a message naming the right one (IEC 60050-131: active,
// reactive and apparent power are different quantities).
func TestParamKindsRefused(t *testing.T) {
	tests := []struct{ src, want string }{
		{"load(10 kVA, 0.8, lagging)", "load: P takes an active power in W, got an apparent power in VA; for an apparent power use loadva"},
		{"loadva(10 kW, 0.8, lagging)", "loadva: S takes an apparent power in VA, got an active power in W"},
		{"pfc(10 kVA, 0.7, 0.95, 400 V, three)", "pfc: P takes an active power in W"},
		{"xfmr(500 kW, 11 kV, 400 V, 4.5%)", "xfmr: S takes an apparent power in VA, got an active power in W"},
		{"pf((230 V) * (10∠-30 A))", "pf: S takes a complex power in VA (P + jQ), or a W or var alone, got a phasor product in V·A; for a product of phasors use power(V, I) or V * conj(I)"},
		{"rerate(10 kW, 400 V, 415 V)", "rerate: Qr takes a reactive power in var"},
		{"xfmr(S = 500 kVA, V1 = 11 kV, V2 = 400 V)", "argument z (a plain real number) is missing"},
		{"xfmr(S = 500 kVA, V1 = 11 kV, V2 = 400 V, z = 4.5%, zr = 6)", `xfmr has no parameter "zr"`},
	}
	for _, tt := range tests {
		_, _, err := New().Exec(tt.src)
		if err == nil {
			t.Errorf("%s: accepted, want %q", tt.src, tt.want)
			continue
		}
		if !strings.Contains(err.Error(), tt.want) {
			t.Errorf("%s: %v, want %q", tt.src, err, tt.want)
		}
	}
}

// TestNamedArgumentsAgree: a call with named arguments in any order gives
// the same value as the call in order.
func TestNamedArgumentsAgree(t *testing.T) {
	pairs := [][2]string{
		{"xfmr(500 kVA, 11 kV, 400 V, 4.5%, 6)", "xfmr(S = 500 kVA, V1 = 11 kV, V2 = 400 V, z = 4.5%, xr = 6)"},
		{"xfmr(500 kVA, 11 kV, 400 V, 4.5%, 6)", "xfmr(xr = 6, z = 4.5%, V2 = 400 V, S = 500 kVA, V1 = 11 kV)"},
		{"xfmr(500 kVA, 11 kV, 400 V, 4.5%, 6, three)", "xfmr(500 kVA, 11 kV, V2 = 400 V, z = 4.5%, phases = three, xr = 6)"},
		{"load(8 kW, 0.8, lagging)", "load(pf = 0.8, sense = lagging, P = 8 kW)"},
	}
	for _, p := range pairs {
		a, b := New(), New()
		if _, _, err := a.Exec("x = " + p[0]); err != nil {
			t.Fatalf("%s: %v", p[0], err)
		}
		if _, _, err := b.Exec("x = " + p[1]); err != nil {
			t.Fatalf("%s: %v", p[1], err)
		}
		qa, _ := a.Lookup("x")
		qb, _ := b.Lookup("x")
		if qa != qb {
			t.Errorf("%s = %v but %s = %v", p[0], qa, p[1], qb)
		}
	}
}

// TestFrequencyOverflow: a frequency whose ω = 2π·f overflows is refused
// with the reason, never shown as Inf (IEEE 754 range, common practice).
func TestFrequencyOverflow(t *testing.T) {
	_, _, err := New().Exec("frequency 1e308 Hz")
	if err == nil || !strings.Contains(err.Error(), "ω = 2π·f would overflow") {
		t.Errorf("frequency 1e308 Hz: %v", err)
	}
}

// TestCheckComparesKinds: a check compares kinds as well as values (an
// active power is not a complex power, IEC 60050-131), and its step says
// exactly what it compared and with which angle tolerance.
func TestCheckComparesKinds(t *testing.T) {
	s := New()
	if _, _, err := s.Exec("x = 800+j600 VA"); err != nil {
		t.Fatal(err)
	}
	if _, _, err := s.Exec("check x is 600 W within 1%"); err == nil || !strings.Contains(err.Error(), "the kinds differ") {
		t.Errorf("check of VA against W: %v", err)
	}
	tests := []struct{ src, want string }{
		{"check x is 800+j600 VA within 1%", "1% on the magnitude and ±0.573° on the angle (the relative tolerance taken as radians)"},
		{"check x is 800+j600 VA within 1% and 0.1°", "1% and 0.1° (magnitude, then angle)"},
		{"check re(x) is 800 W within 1%", "1% on the value (active power: no angle to compare)"},
		{"check im(x) is -600 var within 1%", "on the value"},
	}
	for _, tt := range tests {
		steps, _, err := s.Exec(tt.src)
		if err != nil {
			t.Errorf("%s: %v", tt.src, err)
			continue
		}
		c := steps[len(steps)-1].Check
		if c == nil || !strings.Contains(c.Tolerance, tt.want) {
			t.Errorf("%s: tolerance %+v, want %q", tt.src, c, tt.want)
		}
	}
	// a signed real is compared with its sign: 600 var is not −600 var
	steps, _, err := s.Exec("check im(x) is -600 var within 1%")
	if err != nil || steps[len(steps)-1].Check.Pass {
		t.Errorf("600 var passed as −600 var: %v", err)
	}
}

// TestElementPower: |I|²·R with R a resistor element is an active power in
// W (P = I²R, common practice; IEC 60050-131).
func TestElementPower(t *testing.T) {
	s := New()
	for _, l := range []string{"resistor R = 10 Ω", "Vs = 230 V", "Zs = 3+j4 Ω", "p = mag(Vs/Zs)^2*R"} {
		if _, _, err := s.Exec(l); err != nil {
			t.Fatalf("%s: %v", l, err)
		}
	}
	q, _ := s.Lookup("p")
	if calc.QuantityName(q) != "active-power" || calc.UnitSymbol(q.Dim, q.Kind, false) != "W" {
		t.Errorf("mag(Vs/Zs)^2*R is %s in %s, want an active power in W", calc.QuantityName(q), calc.UnitSymbol(q.Dim, q.Kind, false))
	}
}
