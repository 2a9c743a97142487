package calc

import (
	"strings"
	"testing"
)

// TestKindRules: the table of the package comment, row by row. Power
// quantities after IEC 60050-131 and IEEE Std 1459-2010 (S = V·I*,
// S = P + jQ, |S| = √(P² + Q²)); P = I²R, Q = I²X (common practice).
func TestKindRules(t *testing.T) {
	tests := []struct {
		src, quantity, unit string
		err                 string // non-empty: refused with this text
	}{
		{"mag(2 A)^2 * 50 Ω", "active-power", "W", ""},
		{"mag(Vs/Z)^2 * re(Z)", "active-power", "W", ""},
		{"mag(2 A)^2 * im(Z)", "reactive-power", "var", ""},
		{"mag(2 A)^2 * Z", "complex-power", "VA", ""},
		{"(2 A)^2 * 50 Ω", "active-power", "W", ""},
		{"(230 V)^2 / 50 Ω", "active-power", "W", ""},
		{"mag(Vs)^2 / im(Z)", "reactive-power", "var", ""},
		{"Vs * conj(Vs/Z)", "complex-power", "VA", ""},
		{"Vs * (Vs/Z)", "phasor-product", "V·A", ""},
		{"230 V * 10 A", "apparent-power", "VA", ""},
		{"mag(Vs) * mag(Vs/Z)", "apparent-power", "VA", ""},
		{"800 W + j600 var", "complex-power", "VA", ""},
		{"800 W + 600 var", "", "", "at right angles"},
		// P + jQ as written, with Q zero: still S = P + jQ
		{"10 W + j0 var", "complex-power", "VA", ""},
		{"0 W + j0 var", "complex-power", "VA", ""},
		{"j0 var + 10 W", "complex-power", "VA", ""},
		{"10 W - j5 var", "complex-power", "VA", ""},
		{"10 W + 0 var", "", "", "at right angles"},
		{"1 kvar + 1 kVA", "", "", "apparent power |S|"},
		{"1 kW + 1 kVA", "", "", "apparent power |S|"},
		{"(800+j600 VA) + 100 W", "complex-power", "VA", ""},
		{"(800+j600 VA) + 100 var", "", "", "Q adds as j·Q"},
		{"50 Ω + im(Z)", "", "", "write j·X"},
		{"Vs * (Vs/Z) + (800+j600 VA)", "", "", "use power(V, I) or V * conj(I)"},
		{"-mag(Vs)", "signed-real", "V", ""},
		{"2 * mag(2 A)^2 * 50 Ω", "active-power", "W", ""},
		{"mag(1 kW) * 1∠30", "complex-power", "VA", ""},
		{"re(800+j600 VA)", "active-power", "W", ""},
		{"im(800+j600 VA)", "reactive-power", "var", ""},
		{"re(Z)", "resistance", "Ω", ""},
		{"im(Z)", "reactance", "Ω", ""},
		{"re(recip(Z))", "conductance", "S", ""},
		{"im(recip(Z))", "susceptance", "S", ""},
		{"mag(Z)", "magnitude", "Ω", ""},
		{"mag(800+j600 VA)", "apparent-power", "VA", ""},
		{"sqrt(re(800+j600 VA)^2 + im(800+j600 VA)^2)", "apparent-power", "VA", ""},
		{"Vs", "phasor", "V", ""},
		{"3+j4 Ω", "impedance", "Ω", ""},
		// a rectangular form shown with a zero imaginary part reads back
		// as the complex value it was, not as a lone real of its unit
		{"10 + j0 VA", "complex-power", "VA", ""},
		{"10 + j0 Ω", "impedance", "Ω", ""},
		{"50 Ω", "resistance", "Ω", ""},
		{"j50 Ω", "impedance", "Ω", ""},
		{"10 mH", "signed-real", "H", ""},
		{"4.5%", "ratio", "", ""},
		{"30°", "angle", "", ""},
		{"1∠120", "complex-ratio", "", ""},
	}
	for _, tt := range tests {
		q, err := evalString(newTestEnv(), tt.src)
		if tt.err != "" {
			if err == nil || !strings.Contains(err.Msg, tt.err) {
				t.Errorf("%s: got %v, %v; want refusal %q", tt.src, q, err, tt.err)
			}
			continue
		}
		if err != nil {
			t.Errorf("%s: %v", tt.src, err)
			continue
		}
		if got := QuantityName(q); got != tt.quantity {
			t.Errorf("%s: quantity %s, want %s", tt.src, got, tt.quantity)
		}
		if got := UnitSymbol(q.Dim, q.Kind, false); got != tt.unit {
			t.Errorf("%s: unit %q, want %q", tt.src, got, tt.unit)
		}
	}
}

// TestScalarsHaveNoAngle: a magnitude, a signed real, a ratio or a count
// is shown as a signed number with its unit, never as a phasor at 0° or
// 180° (the kinds of IEC 60050-131 and IEEE Std 1459-2010).
func TestScalarsHaveNoAngle(t *testing.T) {
	f := Format{}
	tests := []struct {
		q    Quantity
		want string
	}{
		{Quantity{V: 43.48, Dim: DimCurrent, Kind: KindMagnitude}, "43.48 A"},
		{Quantity{V: 23.21, Dim: DimImpedance, Kind: KindSigned}, "23.21 Ω"},
		{Quantity{V: -28.89, Dim: DimImpedance, Kind: KindSigned}, "-28.89 Ω"},
		{Quantity{V: -3000, Dim: DimPower, Kind: KindReactive}, "-3.000 kvar"},
		{Quantity{V: 12500, Dim: DimPower, Kind: KindMagnitude}, "12.50 kVA"},
		{Quantity{V: 3, Kind: KindCount}, "3"}, // a count is whole
	}
	for _, tt := range tests {
		for name, got := range map[string]string{"Both": f.Both(tt.q, true), "Short": f.Short(tt.q), "Polar": f.Polar(tt.q)} {
			if got != tt.want {
				t.Errorf("%s(%v) = %q, want %q", name, tt.q, got, tt.want)
			}
		}
	}
}

// TestKindNotes: a result whose kind a reader could take for another
// carries a note saying what it is: |S| from a product of sizes, a phasor
// product (S = V·I*, IEEE Std 1459-2010), and a frequency typed without Hz
// (X_L = 2π·f·L, common practice).
func TestKindNotes(t *testing.T) {
	tests := []struct{ src, want string }{
		{"230 V * 10 A", "apparent power |S|"},
		{"Vs * (Vs/Z)", "phasor product, not a complex power"},
		{"2*pi*50*22 mH", "50 has no unit; with 50 Hz this is an impedance (Ω): 6.912 Ω"},
		{"1/(2*pi*50*10uF)", "50 has no unit; with 50 Hz this is an impedance (Ω): 318.3 Ω"},
	}
	for _, tt := range tests {
		x, perr := ParseExpr(tt.src, 1)
		if perr != nil {
			t.Fatalf("%s: %v", tt.src, perr)
		}
		ev := &Evaluator{Env: newTestEnv(), Src: tt.src, Line: 1}
		r, err := ev.Eval(x)
		if err != nil {
			t.Fatalf("%s: %v", tt.src, err)
		}
		if !strings.Contains(strings.Join(r.Notes, "\n"), tt.want) {
			t.Errorf("%s: notes %q, want %q", tt.src, r.Notes, tt.want)
		}
	}
	x, _ := ParseExpr("Vs * Vs / Z", 1)
	ev := &Evaluator{Env: newTestEnv(), Src: "Vs * Vs / Z", Line: 1}
	if r, _ := ev.Eval(x); len(r.Notes) == 0 {
		t.Errorf("Vs * Vs / Z (|V|²/Z is S*, a phasor product): no note")
	}
}

// TestParallelScaled: a‖b = a·b/(a + b) of two equal branches is half of
// one (common practice), even where |b|² overflows float64.
func TestParallelScaled(t *testing.T) {
	for _, z := range []complex128{1e308 + 1e308i, 1e-308 + 1e-308i, 3 + 4i} {
		r, err := Parallel(Q(z, DimImpedance), Q(z, DimImpedance))
		if err != nil {
			t.Errorf("%v || %v: %v", z, z, err)
			continue
		}
		if !closeC(r.V, z/2, 1e-15) {
			t.Errorf("%v || %v = %v, want %v", z, z, r.V, z/2)
		}
	}
}

// TestLeftoverRule: one rule for rounding leftovers: a part below 1e-12
// of the largest term that produced it is 0; a value small because its
// inputs are small keeps its figures (common practice of floating-point
// work: cancellation leaves noise at the scale of the terms).
func TestLeftoverRule(t *testing.T) {
	if got := Leftover(1e-13+1i, 1, 1i); got != 1i {
		t.Errorf("Leftover = %v, want j1", got)
	}
	if got := LeftoverReal(489.9e-15, 8e3, -8e3+489.9e-15); got != 0 {
		t.Errorf("LeftoverReal = %v, want 0", got)
	}
	q := mustEval(t, "(1 mV)^2 / 10 GΩ")
	if !closeC(q.V, 1e-16, 1e-12) {
		t.Errorf("(1 mV)²/10 GΩ = %v, want 1e-16 W", q.V)
	}
	if q := mustEval(t, "j1 Ω + -j0.9999999999999997 Ω"); q.V != 0 {
		t.Errorf("j1 − j0.9999999999999997 = %v, want 0", q.V)
	}
}
