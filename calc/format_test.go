package calc

import (
	"math"
	"math/cmplx"
	"strings"
	"testing"
	"unicode/utf8"
)

// TestFormatEngineering: engineering notation with an SI prefix and the
// unit symbol, one space between number and unit (SI Brochure 9th ed.
// §5.4.3; NIST SP 811 §7.2), prefixes in steps of 10³ (SI Brochure table 7).
func TestFormatEngineering(t *testing.T) {
	f := Format{}
	tests := []struct {
		q         Quantity
		rect, pol string
	}{
		{Q(3+4i, DimImpedance), "3.000 + j4.000 Ω", "5.000 Ω ∠53.13°"},
		{Q(3e3-4e3i, DimImpedance), "3.000 - j4.000 kΩ", "5.000 kΩ ∠-53.13°"},
		{Real(4700, DimImpedance), "4.700 kΩ", "4.700 kΩ ∠0°"},
		{Real(4.7e-6, DimCapacitance), "4.700 µF", "4.700 µF"},
		{Real(100e-9, DimCapacitance), "100.0 nF", "100.0 nF"},
		{Real(0.01, DimInductance), "10.00 mH", "10.00 mH"},
		{Real(230, DimVoltage), "230.0 V", "230.0 V ∠0°"},
		{Real(11e3, DimVoltage), "11.00 kV", "11.00 kV ∠0°"},
		{Real(2.5e6, DimPower), "2.500 MVA", "2.500 MVA ∠0°"},
		{Quantity{V: 1500, Dim: DimPower, Kind: KindActive}, "1.500 kW", "1.500 kW"},
		{Quantity{V: -300, Dim: DimPower, Kind: KindReactive}, "-300.0 var", "-300.0 var"}, // a signed real: no angle (IEEE Std 1459-2010, Q < 0 is leading),
		{Real(1e-15, DimCapacitance), "1.000 fF", "1.000 fF"},
		{Real(1e12, DimImpedance), "1.000 TΩ", "1.000 TΩ ∠0°"},
		{Real(50, DimFrequency), "50.00 Hz", "50.00 Hz"},
		{Real(999.96, DimImpedance), "1.000 kΩ", "1.000 kΩ ∠0°"}, // rounding carries into the next prefix
		{Real(999.94, DimImpedance), "999.9 Ω", "999.9 Ω ∠0°"},
		{Q(10i, DimVoltage), "j10.00 V", "10.00 V ∠90.00°"},
		{Q(-10i, DimVoltage), "-j10.00 V", "10.00 V ∠-90.00°"},
		{Number(2), "2.000", "2.000"},
		{Real(0, DimVoltage), "0.000 V", "0.000 V"}, // a zero phasor has no angle
		{Number(0), "0.000", "0.000"},
		{Quantity{V: 2 * math.Pi * 500, Dim: DimAngularFrequency, Kind: KindAngle}, "3.142 krad/s", "3.142 krad/s"},
		{Real(2000, DimAngularFrequency), "2.000 /ms", "2.000 /ms"}, // a rate that is not angular; the prefix binds to s (SI Brochure 9th ed., §5.4.1)
		{Real(1e-3, Dim{BaseAmpere: -1}), "1.000 /kA", "1.000 /kA"}, // a prefix on the unit of a reciprocal, no exponent
	}
	for _, tt := range tests {
		if got := f.Rect(tt.q); got != tt.rect {
			t.Errorf("Rect(%v %v) = %q, want %q", tt.q.V, tt.q.Dim, got, tt.rect)
		}
		if got := f.Polar(tt.q); got != tt.pol {
			t.Errorf("Polar(%v %v) = %q, want %q", tt.q.V, tt.q.Dim, got, tt.pol)
		}
	}
}

// TestFormatDigits: settable significant figures.
func TestFormatDigits(t *testing.T) {
	q := Q(3+4i, DimImpedance)
	tests := []struct {
		digits    int
		rect, pol string
	}{
		{0, "3.000 + j4.000 Ω", "5.000 Ω ∠53.13°"}, // 0: the default of 4
		{1, "3 + j4 Ω", "5 Ω ∠53°"},                // an angle keeps its whole degrees
		{2, "3.0 + j4.0 Ω", "5.0 Ω ∠53°"},
		{3, "3.00 + j4.00 Ω", "5.00 Ω ∠53.1°"},
		{6, "3.00000 + j4.00000 Ω", "5.00000 Ω ∠53.1301°"},
		{10, "3.000000000 + j4.000000000 Ω", "5.000000000 Ω ∠53.13010235°"},
		{15, "3.00000000000000 + j4.00000000000000 Ω", "5.00000000000000 Ω ∠53.1301023541560°"},
		// 17 figures tell any two float64 values apart; the angle is the
		// float64 computed for atan(4/3) in degrees, whose exact expansion
		// 53.13010235415598003…° (read with Python's decimal module)
		// rounds to …55980 at 17 figures
		{17, "3.0000000000000000 + j4.0000000000000000 Ω", "5.0000000000000000 Ω ∠53.130102354155980°"},
		{99, "3.0000000000000000 + j4.0000000000000000 Ω", "5.0000000000000000 Ω ∠53.130102354155980°"}, // capped at 17
	}
	for _, tt := range tests {
		f := Format{Digits: tt.digits}
		if got := f.Rect(q); got != tt.rect {
			t.Errorf("digits %d: Rect = %q, want %q", tt.digits, got, tt.rect)
		}
		if got := f.Polar(q); got != tt.pol {
			t.Errorf("digits %d: Polar = %q, want %q", tt.digits, got, tt.pol)
		}
	}
}

// TestAngleRange: angles shown in (−180°, 180°], never −0° and never −180°
// (atan2 of a −0 imaginary part gives −180°).
func TestAngleRange(t *testing.T) {
	tests := []struct {
		v    complex128
		want float64
	}{
		{complex(-1, 0), 180},
		{complex(-1, math.Copysign(0, -1)), 180}, // atan2(−0, −1) = −π
		{complex(1, math.Copysign(0, -1)), 0},    // atan2(−0, 1) = −0
		{complex(math.Copysign(0, -1), math.Copysign(0, -1)), 0},
		{complex(-1, -1e-13), 180}, // below 1e-12 of |v|: shown as real
		{complex(-1, 1e-13), 180},
		{complex(1, -1e-13), 0},
		{complex(0, -1), -90},
		{complex(0, 1), 90},
		{complex(-1, -1e-9), -179.99999994270422}, // above the threshold it stays
	}
	for _, tt := range tests {
		d := Deg(tt.v)
		if d != tt.want || math.Signbit(d) && d == 0 {
			t.Errorf("Deg(%v) = %v, want %v", tt.v, d, tt.want)
		}
		if d <= -180 || d > 180 {
			t.Errorf("Deg(%v) = %v outside (−180, 180]", tt.v, d)
		}
	}
	for _, in := range []float64{-180, 180, 540, -540, 360, -360, 0, math.Copysign(0, -1), 720.5, -179.5, 179.99999} {
		d := NormDeg(in)
		if d <= -180 || d > 180 || (d == 0 && math.Signbit(d)) {
			t.Errorf("NormDeg(%v) = %v", in, d)
		}
	}
	f := Format{}
	for _, v := range []complex128{complex(-1, math.Copysign(0, -1)), complex(-5, -1e-14), complex(1, math.Copysign(0, -1)), complex(math.Copysign(0, -1), 0)} {
		for _, s := range []string{f.Polar(Q(v, DimVoltage)), f.Rect(Q(v, DimVoltage)), Format{ASCII: true}.Polar(Q(v, DimVoltage))} {
			if strings.Contains(s, "-0°") || strings.Contains(s, "-180") || strings.Contains(s, "-0 deg") || strings.Contains(s, "-0.000") {
				t.Errorf("%v formats as %q", v, s)
			}
		}
	}
}

// TestTinyParts: a part below 1e-12 of the magnitude shows as 0.
func TestTinyParts(t *testing.T) {
	f := Format{}
	tests := []struct {
		v         complex128
		rect, pol string
	}{
		{complex(3, 1e-15), "3.000 V", "3.000 V ∠0°"},
		{complex(1.8369701987210297e-16, 3), "j3.000 V", "3.000 V ∠90.00°"}, // 3∠90° via sin/cos
		{complex(-2, 1e-13), "-2.000 V", "2.000 V ∠180.0°"},
		{complex(1, 1e-11), "1.000 + j0.000 V", "1.000 V ∠573.0×10^-12°"}, // above the threshold: kept
	}
	for _, tt := range tests {
		q := Q(tt.v, DimVoltage)
		if got := f.Rect(q); got != tt.rect {
			t.Errorf("Rect(%v) = %q, want %q", tt.v, got, tt.rect)
		}
		if got := f.Polar(q); got != tt.pol {
			t.Errorf("Polar(%v) = %q, want %q", tt.v, got, tt.pol)
		}
	}
	// JSON writes the parts as shown
	if js := JSONValue("x", Q(complex(3, 1e-15), DimVoltage), RMS); !strings.Contains(js, `"im":0,`) || !strings.Contains(js, `"deg":0,`) {
		t.Errorf("JSONValue keeps a tiny part: %s", js)
	}
}

// TestASCII: ASCII mode changes only what a person reads. NIST SP 811 §6.1
// allows "u" for µ where the symbol is unavailable, and "ohm" spelled out.
func TestASCII(t *testing.T) {
	f := Format{ASCII: true}
	tests := []struct {
		q         Quantity
		rect, pol string
	}{
		{Q(3+4i, DimImpedance), "3.000 + j4.000 ohm", "5.000 ohm @53.13 deg"},
		{Real(4.7e-6, DimCapacitance), "4.700 uF", "4.700 uF"},
		{Q(-2.2e3i, DimImpedance), "-j2.200 kohm", "2.200 kohm @-90.00 deg"},
		{Real(1, Dim{BaseVolt: 2, BaseAmpere: -2}), "1.000 ohm^2", "1.000 ohm^2"}, // a named unit squared
		{Real(1, Dim{BaseVolt: 2, BaseAmpere: -1}), "1.000 V^2/A", "1.000 V^2/A"},
	}
	for _, tt := range tests {
		for _, got := range []string{f.Rect(tt.q), f.Polar(tt.q), f.Both(tt.q, false), f.Both(tt.q, true)} {
			if !isASCII(got) {
				t.Errorf("ASCII format of %v gives non-ASCII %q", tt.q, got)
			}
		}
		if got := f.Rect(tt.q); got != tt.rect {
			t.Errorf("Rect = %q, want %q", got, tt.rect)
		}
		if got := f.Polar(tt.q); got != tt.pol {
			t.Errorf("Polar = %q, want %q", got, tt.pol)
		}
	}
	// a whole step: no ∠ Ω µ ° or box drawing in ASCII text, UTF-8 in JSON
	st := Step{Kind: "eval", Source: "Z1 = 3+j4 Ω ∥ 1 µF", Rule: "parallel", Formula: "Z = Z₁·Z₂/(Z₁+Z₂) ∠ ω √ π ─│",
		Inputs:  []Operand{{Name: "Z₁", Value: Q(3+4i, DimImpedance)}},
		Results: []Operand{{Name: "Z", Value: Q(3+4i, DimImpedance)}}, Notes: []string{"θ ≤ 90°"},
		Check: &CheckOutcome{Pass: true, Got: Real(1e-6, DimCapacitance), Want: Real(1e-6, DimCapacitance), Tolerance: "1 %"}}
	txt := st.Text(f, false)
	for _, bad := range []string{"∠", "Ω", "µ", "°", "─", "│", "→"} {
		if strings.Contains(txt, bad) {
			t.Errorf("ASCII step text contains %q:\n%s", bad, txt)
		}
	}
	js := st.JSON()
	if !strings.Contains(js, `"unit":"Ω"`) || !utf8.ValidString(js) {
		t.Errorf("JSON should carry the UTF-8 unit symbol: %s", js)
	}
}

func isASCII(s string) bool {
	for i := 0; i < len(s); i++ {
		if s[i] >= 0x80 {
			return false
		}
	}
	return true
}

// TestNoNaNInf: no NaN or infinity is ever shown; arithmetic that would
// make one is an error saying what happened.
func TestNoNaNInf(t *testing.T) {
	bad := []string{"1e308*1e308", "1/0", "1 V / 0", "(1e200 Ω)^2", "exp(1000)", "ln(0)", "0^-1", "tan(90)", "1e308 V + 1e308 V", "recip(0)", "zc(0 F)"}
	for _, src := range bad {
		q, err := evalString(newTestEnv(), src)
		if err == nil {
			t.Errorf("%s = %v: want an error", src, q.V)
			continue
		}
		if strings.Contains(err.Msg, "NaN") || strings.Contains(err.Msg, "Inf") {
			t.Errorf("%s: message %q shows NaN/Inf", src, err.Msg)
		}
	}
	for _, src := range []string{"1/0", "1 V / 0"} {
		_, err := evalString(newTestEnv(), src)
		if err == nil || !strings.Contains(err.Msg, "division by zero") {
			t.Errorf("%s: %v, want division by zero", src, err)
		}
	}
	_, err := evalString(newTestEnv(), "1e308*1e308")
	if err == nil || !strings.Contains(err.Msg, "overflow") {
		t.Errorf("1e308*1e308: %v, want overflow", err)
	}
}

// TestAngleRoundsToMinus180: an angle just above −180° that rounds to
// −180° at the digits shown keeps up to three more figures (−179.99°), so
// that its sign agrees with the imaginary part in rectangular form; only
// beyond those is it written as 180° (the same direction). Never −180°.
func TestAngleRoundsToMinus180(t *testing.T) {
	q := Q(cmplx.Rect(1, -179.99*math.Pi/180), DimVoltage)
	for d := 1; d <= 4; d++ {
		for _, f := range []Format{{Digits: d}, {Digits: d, ASCII: true}, {Digits: d, Radians: true}} {
			s := f.Polar(q)
			if strings.Contains(s, "-180") || strings.Contains(s, "-3.14 ") || strings.Contains(s, "-3.1 ") || strings.Contains(s, "-3 rad") {
				t.Errorf("digits %d: %q shows −180°", d, s)
			}
		}
	}
	if got := (Format{Digits: 4}).Polar(q); got != "1.000 V ∠-179.99°" {
		t.Errorf("got %q, want 1.000 V ∠-179.99°", got)
	}
	if got := (Format{Digits: 4}).Rect(q); got != "-1.000 - j0.000 V" {
		t.Errorf("got %q, want -1.000 - j0.000 V (the sign of the angle)", got)
	}
	if got := (Format{Digits: 4}).Polar(Q(cmplx.Rect(1, -179.97*math.Pi/180), DimVoltage)); got != "1.000 V ∠-179.97°" {
		t.Errorf("got %q, want 1.000 V ∠-179.97°", got)
	}
	if got := (Format{Digits: 2}).Polar(Q(cmplx.Rect(1, -179.9999*math.Pi/180), DimVoltage)); got != "1.0 V ∠180.00°" {
		t.Errorf("got %q, want 1.0 V ∠180.00° (beyond three more figures)", got)
	}
	if got := (Format{Digits: 5}).Polar(q); got != "1.0000 V ∠-179.99°" {
		t.Errorf("got %q, want 1.0000 V ∠-179.99°", got)
	}
}

// TestNoENotation: engineering notation with SI prefixes q … Q (SI
// Brochure 9th ed., table 7); a prefix binds to the unit before its power
// (kV² = 10⁶ V², SI Brochure 9th ed., §5.4.1), so V² shows as 0.05290 kV².
func TestNoENotation(t *testing.T) {
	f := Format{}
	tests := []struct {
		q    Quantity
		want string
	}{
		{Real(13.88e-18, DimCurrent), "13.88 aA"},
		{Real(52.9e3, DimVoltage.Pow(2)), "0.05290 kV²"},
		{Real(1.927e-34, DimCurrent.Pow(2)), "192.7 aA²"},
		{Real(1e20, DimFrequency), "100.0 EHz"},
		{Real(3e-28, DimCharge), "300.0 qC"},
		{Real(2e29, DimPower), "200.0 RVA"},
		{Real(123456789, DimInductance.Mul(DimLength)), "123.5 MV·s·m/A"},
		// a plain number beyond its figures or below 0.001 takes ×10^
		{Number(1e9), "1.000×10^9"},
		{Number(1.5e-5), "15.00×10^-6"},
		{Number(30002), "30.00×10^3"},
		{Number(1e-20), "10.00×10^-21"},
		{Number(1e-13), "100.0×10^-15"},
		{Number(1234), "1234"},
		{Number(0.001234), "0.001234"},
		{Real(314.2e300, DimImpedance), "314.2×10^300 Ω"},
	}
	for _, tt := range tests {
		got := f.Rect(tt.q)
		if got != tt.want {
			t.Errorf("Rect(%v %v) = %q, want %q", tt.q.V, tt.q.Dim, got, tt.want)
		}
		if strings.ContainsAny(got, "e") && !strings.Contains(tt.want, "e") {
			t.Errorf("%q has an exponent", got)
		}
	}
}

// TestTimesTenReadsBack: a size beyond the SI prefixes (SI Brochure 9th
// ed., table 7) or a plain number far from 1 is shown m×10^e, in ASCII
// m*10^e, never in e-notation, and what is shown reads back as the same
// number, unit and j included.
func TestTimesTenReadsBack(t *testing.T) {
	tests := []struct {
		q     Quantity
		ascii bool
		want  string
	}{
		{Number(1e-20), false, "10.00×10^-21"},
		{Number(1e15), false, "1.000×10^15"},
		{Number(1e15), true, "1.000*10^15"},
		{Q(complex(0, 314.2e300), DimImpedance), false, "j314.2×10^300 Ω"},
		{Q(complex(0, 314.2e300), DimImpedance), true, "j314.2*10^300 ohm"},
		{Number(complex(1e-16, 1e-16)), false, "100.0×10^-18 + j100.0×10^-18"},
		{Real(1e-320, DimVoltage), false, "10.00×10^-321 V"},
	}
	for _, tt := range tests {
		f := Format{ASCII: tt.ascii}
		got := f.Rect(tt.q)
		if got != tt.want {
			t.Errorf("Rect(%v) = %q, want %q", tt.q.V, got, tt.want)
		}
		if strings.Contains(got, "e") {
			t.Errorf("%q has e-notation", got)
		}
		back, err := evalString(newTestEnv(), got)
		if err != nil {
			t.Errorf("%q does not read back: %v", got, err.Msg)
			continue
		}
		if !closeC(back.V, tt.q.V, 1e-3) || back.Dim != tt.q.Dim {
			t.Errorf("%q reads back as %v %v, want %v %v", got, back.V, back.Dim, tt.q.V, tt.q.Dim)
		}
	}
	// the operators keep their meaning where the power is not the number's
	for src, want := range map[string]complex128{"2*10^3^2": 2e9, "(3+j4)*10^2": complex(300, 400), "3+j4*10^2": complex(300, 400)} {
		q, err := evalString(newTestEnv(), src)
		if err != nil || !closeC(q.V, want, 1e-12) {
			t.Errorf("%s = %v (%v), want %v", src, q.V, err, want)
		}
	}
}

// TestZeroHasNoAngle: a zero phasor or complex value has no direction, so
// every form shows it as a number with its unit and no angle (the angle of
// 0 is undefined; common practice), while a value that is only small keeps
// its angle.
func TestZeroHasNoAngle(t *testing.T) {
	tests := []struct {
		name  string
		q     Quantity
		ascii bool
		want  string // Rect, Polar, Short and Both alike
	}{
		{"zero voltage", Real(0, DimVoltage), false, "0.000 V"},
		{"zero current", Real(0, DimCurrent), false, "0.000 A"},
		{"zero impedance", Q(0, DimImpedance), false, "0.000 Ω"},
		{"zero complex power", Quantity{V: 0, Dim: DimPower, Kind: KindApparent}, false, "0.000 VA"},
		{"zero phasor product", Quantity{V: 0, Dim: DimPower, Kind: KindProduct}, false, "0.000 V·A"},
		{"zero in ASCII", Real(0, DimVoltage), true, "0.000 V"},
	}
	for _, tt := range tests {
		f := Format{ASCII: tt.ascii}
		if tt.q.HasAngle() {
			t.Errorf("%s: HasAngle() = true, want false", tt.name)
		}
		for form, got := range map[string]string{
			"Rect": f.Rect(tt.q), "Polar": f.Polar(tt.q), "Short": f.Short(tt.q),
			"Both": f.Both(tt.q, false), "Both polar first": f.Both(tt.q, true),
		} {
			if got != tt.want {
				t.Errorf("%s: %s = %q, want %q", tt.name, form, got, tt.want)
			}
			if strings.ContainsAny(got, "∠@") || strings.Contains(got, "deg") {
				t.Errorf("%s: %s = %q shows an angle", tt.name, form, got)
			}
		}
	}
	// a small value is not zero: it keeps its direction
	small := Q(-1e-15, DimVoltage)
	if !small.HasAngle() {
		t.Errorf("HasAngle(-1 fV) = false, want true")
	}
	if got, want := (Format{}).Polar(small), "1.000 fV ∠180.0°"; got != want {
		t.Errorf("Polar(-1 fV) = %q, want %q", got, want)
	}
}

// TestPercent: a ratio read in per cent (a voltage dip, a regulation) is
// shown as 100 times its value with the sign % (SI Brochure 9th ed.,
// §5.4.7, from memory: a space between the number and %), reads back to the same
// ratio, and is a ratio in arithmetic.
func TestPercent(t *testing.T) {
	pc := func(x float64) Quantity { return Quantity{V: complex(x, 0), Kind: KindPercent} }
	tests := []struct {
		q     Quantity
		f     Format
		want  string
		value float64 // what the shown text reads back as, ±half a unit in the last place
	}{
		{pc(0.05417), Format{}, "5.417 %", 0.05417},
		{pc(0.1234), Format{}, "12.34 %", 0.1234},
		{pc(-0.0031), Format{}, "-0.3100 %", -0.0031},
		{pc(1.5), Format{}, "150.0 %", 1.5},
		{pc(0), Format{}, "0.000 %", 0},
		{pc(0.05417), Format{Digits: 6}, "5.41700 %", 0.05417},
		{pc(0.05417), Format{ASCII: true}, "5.417 %", 0.05417},
		{pc(0.05417), Format{Comma: true}, "5,417 %", 0.05417},
	}
	for _, tt := range tests {
		for form, got := range map[string]string{"Rect": tt.f.Rect(tt.q), "Polar": tt.f.Polar(tt.q), "Both": tt.f.Both(tt.q, true), "Short": tt.f.Short(tt.q)} {
			if got != tt.want {
				t.Errorf("%s(%v) = %q, want %q", form, tt.q.V, got, tt.want)
			}
		}
		if tt.f.Comma {
			continue
		}
		back := mustEval(t, tt.want)
		if math.Abs(real(back.V)-tt.value) > 5e-4*math.Abs(tt.value)+1e-15 || !back.Dim.IsDimensionless() {
			t.Errorf("%q reads back as %v, want %v", tt.want, back.V, tt.value)
		}
	}
	if got := QuantityName(pc(0.05)); got != "ratio" {
		t.Errorf("QuantityName(5 %%) = %q, want ratio", got)
	}
	// arithmetic: a ratio, whose kind follows it only while it stays one
	v := Real(400, DimVoltage)
	kinds := []struct {
		name string
		op   func() (Quantity, error)
		want Kind
		val  float64
	}{
		{"5 % × 400 V", func() (Quantity, error) { return Mul(pc(0.05), v) }, KindPlain, 20},
		{"5 % × 2", func() (Quantity, error) { return Mul(pc(0.05), Number(2)) }, KindPercent, 0.1},
		{"5 % × 5 %", func() (Quantity, error) { return Mul(pc(0.05), pc(0.05)) }, KindPlain, 0.0025},
		{"5 % / 10 %", func() (Quantity, error) { return Div(pc(0.05), pc(0.1)) }, KindPlain, 0.5},
		{"5 % + 1 %", func() (Quantity, error) { return Add(pc(0.05), pc(0.01)) }, KindPercent, 0.06},
		{"5 % + 1", func() (Quantity, error) { return Add(pc(0.05), Number(1)) }, KindPlain, 1.05},
		{"1/(5 %)", func() (Quantity, error) { return Recip(pc(0.05)) }, KindPlain, 20},
		{"−5 %", func() (Quantity, error) { return Neg(pc(0.05)), nil }, KindPercent, -0.05},
	}
	for _, k := range kinds {
		q, err := k.op()
		if err != nil {
			t.Errorf("%s: %v", k.name, err)
			continue
		}
		if q.Kind != k.want || math.Abs(real(q.V)-k.val) > 1e-12*math.Abs(k.val) {
			t.Errorf("%s = %v kind %d, want %v kind %d", k.name, q.V, q.Kind, k.val, k.want)
		}
	}
}
