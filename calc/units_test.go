package calc

import (
	"math"
	"strings"
	"testing"
)

// TestPrefixes checks each SI prefix argand reads against its factor.
// Source: SI Brochure, 9th ed. (BIPM 2019), table 7; NIST SP 811 (2008),
// table 5. "u" for µ where the keyboard has none: NIST SP 811 §6.1.
func TestPrefixes(t *testing.T) {
	tests := []struct {
		src  string
		want float64
		dim  Dim
	}{
		{"1 fF", 1e-15, DimCapacitance},
		{"1 pF", 1e-12, DimCapacitance},
		{"1 nF", 1e-9, DimCapacitance},
		{"1 µF", 1e-6, DimCapacitance}, // U+00B5 micro sign
		{"1 μF", 1e-6, DimCapacitance}, // U+03BC Greek mu
		{"1 uF", 1e-6, DimCapacitance},
		{"1 mH", 1e-3, DimInductance},
		{"1 kΩ", 1e3, DimImpedance},
		{"1 Ω", 1, DimImpedance}, // U+2126 ohm sign
		{"1 kohm", 1e3, DimImpedance},
		{"2 ohms", 2, DimImpedance},
		{"1 MΩ", 1e6, DimImpedance},
		{"1 GHz", 1e9, DimFrequency},
		{"1 THz", 1e12, DimFrequency},
		{"4.7kΩ", 4.7e3, DimImpedance}, // no space: still the unit
		{"230 V", 230, DimVoltage},
		{"2.5 A", 2.5, DimCurrent},
		{"10 mS", 10e-3, DimAdmittance}, // millisiemens
		{"10 ms", 10e-3, DimTime},       // millisecond
		{"10 m", 10, DimLength},         // an exact unit wins over a prefix: ten metres
		{"1 W", 1, DimPower},
		{"1 var", 1, DimPower},
		{"1 kVA", 1e3, DimPower},
		{"50 Hz", 50, DimFrequency},
		{"314 rad/s", 314, DimAngularFrequency},
		{"3.142 krad/s", 3142, DimAngularFrequency}, // as ω is shown
		{"2 mrad", 2e-3, Dimensionless},
		{"1.5e3 Ω", 1500, DimImpedance},
		{".5 A", 0.5, DimCurrent},
		{"5. V", 5, DimVoltage},
		{"1E-3 F", 1e-3, DimCapacitance},
		{"1 H", 1, DimInductance},
		{"1 henry", 1, DimInductance},
		{"1 farad", 1, DimCapacitance},
		{"1 siemens", 1, DimAdmittance},
		{"3 volts", 3, DimVoltage},
		{"3 amps", 3, DimCurrent},
	}
	for _, tt := range tests {
		q := mustEval(t, tt.src)
		if q.Dim != tt.dim {
			t.Errorf("%s: dimension %v, want %v", tt.src, q.Dim, tt.dim)
		}
		if !closeC(q.V, complex(tt.want, 0), 1e-15) {
			t.Errorf("%s = %v, want %g", tt.src, q.V, tt.want)
		}
	}
}

// TestPowerKinds: W, var and VA share one dimension (V·A) and differ only
// in display. Source: SI Brochure 9th ed. table 4 (watt); IEC 60027-1 (var,
// VA as special names for reactive and apparent power), from memory.
func TestPowerKinds(t *testing.T) {
	tests := []struct {
		src  string
		kind Kind
		sym  string
	}{
		{"1 W", KindActive, "W"},
		{"1 var", KindReactive, "var"},
		{"1 VA", KindMagnitude, "VA"},                // a real VA alone is an apparent power |S|
		{"1 V * 1 A", KindMagnitude, "VA"},           // a product of sizes is |S|, not S
		{"(3+j4 V) * conj(1 A)", KindApparent, "VA"}, // S = V·I* (IEEE Std 1459-2010)
		{"(3+j4 V) * (1+j1 A)", KindProduct, "V·A"},  // V·I without the conjugate is no power
	}
	for _, tt := range tests {
		q := mustEval(t, tt.src)
		if q.Dim != DimPower || q.Kind != tt.kind {
			t.Errorf("%s: dim %v kind %v, want power kind %v", tt.src, q.Dim, q.Kind, tt.kind)
		}
		if s := UnitSymbol(q.Dim, q.Kind, false); s != tt.sym {
			t.Errorf("%s: symbol %q, want %q", tt.src, s, tt.sym)
		}
	}
}

// TestDerivedDimensions: combinations nobody listed get their dimension
// from the exponents alone. Coherent derived units: SI Brochure 9th ed.,
// table 4 (H = Wb/A = V·s/A, F = C/V = A·s/V, S = A/V = 1/Ω).
func TestDerivedDimensions(t *testing.T) {
	tests := []struct {
		src  string
		want Dim
		sym  string
	}{
		{"1 V * 1 s / 1 A", DimInductance, "H"},
		{"1 A * 1 s / 1 V", DimCapacitance, "F"},
		{"1 H / 1 Ω", DimTime, "s"},
		{"1 F * 1 Ω", DimTime, "s"}, // RC time constant
		{"1 V / 1 Ω", DimCurrent, "A"},
		{"1 V * 1 A", DimPower, "VA"},
		{"1 / 1 Ω", DimAdmittance, "S"},
		{"1 / 1 S", DimImpedance, "Ω"},
		{"1 A * 1 Ω", DimVoltage, "V"},
		{"1 V * 1 s", Dim{BaseVolt: 1, BaseSecond: 1}, "Wb"},
		{"1 W * 1 s", DimEnergy, "J"},
		{"1 A * 1 s", DimCharge, "C"},
		{"1 V·s/A", DimInductance, "H"}, // compound unit written on the number
		{"2 rad/s * 1 H", DimImpedance, "Ω"},
		{"w * L1", DimImpedance, "Ω"},        // X_L = ωL (common practice)
		{"1 / (w * C1)", DimImpedance, "Ω"},  // X_C = 1/(ωC) (common practice)
		{"1 / 1 s", DimAngularFrequency, ""}, // 1/s carries no cycle
		{"sqrt(1 H / 1 F)", DimImpedance, "Ω"},
		{"(3 Ω)^2", Dim{BaseVolt: 2, BaseAmpere: -2}, "Ω²"},
		{"(2 mH)^2", DimInductance.Pow(2), "H²"},
		{"mag(3+j4 Ω)^2 * 1 Ω", DimImpedance.Pow(3), "Ω³"},
		{"(2 S)^2", DimAdmittance.Pow(2), "S²"},
	}
	for _, tt := range tests {
		q := mustEval(t, tt.src)
		if q.Dim != tt.want {
			t.Errorf("%s: dimension %v, want %v", tt.src, q.Dim, tt.want)
		}
		if tt.sym != "" {
			if s := UnitSymbol(q.Dim, q.Kind, false); s != tt.sym {
				t.Errorf("%s: unit symbol %q, want %q", tt.src, s, tt.sym)
			}
		}
	}
}

// TestReactance checks the element impedances against the standard
// formulas X_L = ωL, X_C = −1/(ωC), ω = 2πf (common practice).
func TestReactance(t *testing.T) {
	env := newTestEnv()
	tests := []struct {
		freq float64
		src  string
		want complex128
	}{
		{50, "zl(10 mH)", complex(0, 2*math.Pi*50*10e-3)},
		{60, "zl(10 mH)", complex(0, 2*math.Pi*60*10e-3)},
		{50, "zc(1 µF)", complex(0, -1/(2*math.Pi*50*1e-6))},
		{1e3, "zc(100 nF)", complex(0, -1/(2*math.Pi*1e3*100e-9))},
		{50, "zr(4.7 kΩ)", 4700},
		{50, "j * w * L1", complex(0, 2*math.Pi*50*10e-3)},
		{50, "omega(fq) * L1 * j", complex(0, 2*math.Pi*50*10e-3)},
		{50, "1 / (j * w * C1)", complex(0, -1/(2*math.Pi*50*1e-6))},
		// series RLC at resonance f0 = 1/(2π√(LC)): X_L + X_C = 0 (common practice)
		{1 / (2 * math.Pi * math.Sqrt(10e-3*1e-6)), "zl(10 mH) + zc(1 µF)", 0},
	}
	for _, tt := range tests {
		env.ctx.Freq = tt.freq
		q, err := evalString(env, tt.src)
		if err != nil {
			t.Errorf("%s at %g Hz: %v", tt.src, tt.freq, err)
			continue
		}
		if q.Dim != DimImpedance {
			t.Errorf("%s: dimension %v, want Ω", tt.src, q.Dim)
		}
		if tt.want == 0 {
			if math.Abs(imag(q.V)) > 1e-9*2*math.Pi*tt.freq*10e-3 {
				t.Errorf("%s at resonance = %v, want 0", tt.src, q.V)
			}
			continue
		}
		if !closeC(q.V, tt.want, 1e-12) {
			t.Errorf("%s at %g Hz = %v, want %v", tt.src, tt.freq, q.V, tt.want)
		}
	}
}

// TestRectangularForms: a+jb, a-jb, jb, a+bj, and i for j.
// j as the imaginary unit in electrical technology: IEC 60027-1.
func TestRectangularForms(t *testing.T) {
	tests := []struct {
		src  string
		want complex128
		dim  Dim
	}{
		{"3+j4", 3 + 4i, Dimensionless},
		{"3-j4", 3 - 4i, Dimensionless},
		{"j4", 4i, Dimensionless},
		{"-j4", -4i, Dimensionless},
		{"3+4j", 3 + 4i, Dimensionless},
		{"3+4i", 3 + 4i, Dimensionless},
		{"3+i4", 3 + 4i, Dimensionless},
		{"2.5j", 2.5i, Dimensionless},
		{"j", 1i, Dimensionless},
		{"3+j4 Ω", 3 + 4i, DimImpedance},
		{"3-j4 kΩ", 3e3 - 4e3i, DimImpedance},
		{"3+4j Ω", 3 + 4i, DimImpedance},
		{"(3+j4) * 1 Ω", 3 + 4i, DimImpedance},
		{"1e3j V", 1e3i, DimVoltage},
	}
	for _, tt := range tests {
		q := mustEval(t, tt.src)
		if q.V != tt.want || q.Dim != tt.dim {
			t.Errorf("%s = %v %v, want %v %v", tt.src, q.V, q.Dim, tt.want, tt.dim)
		}
	}
}

// TestPolarForms: ∠ and its ASCII stand-in @, degrees by default, ° and rad.
func TestPolarForms(t *testing.T) {
	tests := []struct {
		src  string
		want complex128
		dim  Dim
	}{
		{"10∠90", 10i, Dimensionless}, // exact axis, no 6e-16 real part
		{"10∠-90", -10i, Dimensionless},
		{"10∠180", -10, Dimensionless},
		{"10∠-180", -10, Dimensionless},
		{"10∠0", 10, Dimensionless},
		{"230∠-30 V", complex(230*math.Cos(-math.Pi/6), 230*math.Sin(-math.Pi/6)), DimVoltage},
		{"230@-30 V", complex(230*math.Cos(-math.Pi/6), 230*math.Sin(-math.Pi/6)), DimVoltage},
		{"230∠-30° V", complex(230*math.Cos(-math.Pi/6), 230*math.Sin(-math.Pi/6)), DimVoltage},
		{"230 V∠-30", complex(230*math.Cos(-math.Pi/6), 230*math.Sin(-math.Pi/6)), DimVoltage},
		{"1∠0.5 rad", complex(math.Cos(0.5), math.Sin(0.5)), Dimensionless},
		{"5∠53.13010235415598", 3 + 4i, Dimensionless},
	}
	for _, tt := range tests {
		q := mustEval(t, tt.src)
		if q.Dim != tt.dim || !closeC(q.V, tt.want, 1e-15) {
			t.Errorf("%s = %v %v, want %v %v", tt.src, q.V, q.Dim, tt.want, tt.dim)
		}
	}
	// the exact axes must be exact, not merely close
	for _, src := range []string{"10∠90", "10∠-90", "10∠180", "10∠270"} {
		q := mustEval(t, src)
		if real(q.V) != 0 && imag(q.V) != 0 {
			t.Errorf("%s = %v: a part should be exactly 0", src, q.V)
		}
	}
}

// TestExactValues compares with values computed independently: 3+j4 has
// magnitude 5 (Pythagoras) and angle atan2(4,3) = 53.13010235415598°.
func TestExactValues(t *testing.T) {
	deg := math.Atan2(4, 3) * 180 / math.Pi // 53.13010235415598
	tests := []struct {
		src      string
		mag, deg float64
	}{
		{"3+j4", 5, deg},
		{"3-j4", 5, -deg},
		{"-3+j4", 5, 180 - deg},
		{"-3-j4", 5, -(180 - deg)},
		{"(3+j4)^2", 25, 2 * deg},
		{"(3+j4) * (3-j4)", 25, 0},
		{"1/(3+j4)", 0.2, -deg},
		{"sqrt(-4)", 2, 90},
		{"conj(3+j4)", 5, -deg},
		{"mag(3+j4)", 5, 0},
		{"exp(j*pi)", 1, 180},
		{"Z || Z", 2.5, deg}, // two equal branches halve
		{"Z + Z2", math.Hypot(13, -1), math.Atan2(-1, 13) * 180 / math.Pi},
	}
	for _, tt := range tests {
		q := mustEval(t, tt.src)
		if m := q.Mag(); math.Abs(m-tt.mag) > 1e-12*tt.mag {
			t.Errorf("%s: |z| = %.17g, want %.17g", tt.src, m, tt.mag)
		}
		if d := Deg(q.V); math.Abs(d-tt.deg) > 1e-9 {
			t.Errorf("%s: angle %.17g°, want %.17g°", tt.src, d, tt.deg)
		}
	}
	if math.Abs(deg-53.130102354) > 1e-9 {
		t.Errorf("atan2(4,3) = %.12g°, want 53.130102354° (exact to 9 decimals)", deg)
	}
}

// TestCycleError: Hz × H is no impedance. Hz counts cycles, rad/s does not;
// ω = 2πf (common practice). The message hints at ω.
func TestCycleError(t *testing.T) {
	for _, src := range []string{"50 Hz * 10 mH", "10 mH * 50 Hz", "fq * L1", "f * C1", "1 / (fq * C1)", "fq * L1 * 1"} {
		_, err := evalString(newTestEnv(), src)
		if err == nil {
			t.Errorf("%s: no error, want a hint to use ω", src)
			continue
		}
		if !strings.Contains(err.Msg, "omega") || !strings.Contains(err.Msg, "Hz") {
			t.Errorf("%s: message %q does not point to ω", src, err.Msg)
		}
	}
	// with ω it works
	q := mustEval(t, "omega(50 Hz) * 10 mH")
	if q.Dim != DimImpedance || !closeC(q.V, complex(2*math.Pi*50*10e-3, 0), 1e-15) {
		t.Errorf("omega(50 Hz) * 10 mH = %v %v", q.V, q.Dim)
	}
}

// TestUnlikeDimensions: + and − of unlike dimensions is an error naming both.
func TestUnlikeDimensions(t *testing.T) {
	tests := []struct {
		src      string
		a, b, op string
	}{
		{"1 V + 1 Ω", "V", "Ω", "+"},
		{"1 A - 1 V", "A", "V", "−"},
		{"Z - Vs", "Ω", "V", "−"},
		{"1 H + 1 F", "H", "F", "+"},
		{"1 Hz + 1 rad/s", "Hz", "rad/s", "+"},
		{"1 S + 1 s", "S", "s", "+"},
		{"1 V || 1 A", "V", "A", "||"},
	}
	for _, tt := range tests {
		_, err := evalString(newTestEnv(), tt.src)
		if err == nil {
			t.Errorf("%s: no error", tt.src)
			continue
		}
		m := err.Msg
		ia, ib := strings.Index(m, tt.a), strings.LastIndex(m, tt.b)
		if ia < 0 || ib < 0 || !strings.Contains(m, tt.op) {
			t.Errorf("%s: message %q should name %s and %s", tt.src, m, tt.a, tt.b)
		}
	}
}

// TestParallelLimits: a zero branch is a short; branches whose admittances
// cancel make an open circuit, reported as such (common practice).
func TestParallelLimits(t *testing.T) {
	z := Q(3+4i, DimImpedance)
	for _, tt := range []struct {
		a, b Quantity
	}{
		{Number(0), z}, {z, Number(0)}, {Q(0, DimImpedance), z}, {z, Q(0, DimImpedance)},
	} {
		r, err := Parallel(tt.a, tt.b)
		if err != nil || r.V != 0 || r.Dim != DimImpedance {
			t.Errorf("Parallel(%v, %v) = %v, %v; want 0 Ω", tt.a, tt.b, r, err)
		}
	}
	for _, src := range []string{"0 || Z", "Z || 0", "(0) || (3+j4 Ω)"} {
		q := mustEval(t, src)
		if q.V != 0 {
			t.Errorf("%s = %v, want 0 (a short)", src, q.V)
		}
	}
	for _, src := range []string{"j10 || -j10", "j10 Ω || -j10 Ω", "zl(10 mH) || -(j*w*(10 mH))"} {
		_, err := evalString(newTestEnv(), src)
		if err == nil || !strings.Contains(err.Msg, "open circuit") {
			t.Errorf("%s: error %v, want an open-circuit message", src, err)
		}
		if err != nil && strings.Contains(err.Msg, "division by zero") {
			t.Errorf("%s: reported as division by zero: %v", src, err)
		}
	}
	if _, err := Parallel(Q(10i, DimImpedance), Q(-10i, DimImpedance)); err != ErrOpenCircuit {
		t.Errorf("Parallel(j10, -j10) error %v, want ErrOpenCircuit", err)
	}
}

// TestNamesAndUnits: an exact unit wins over a prefix reading; a prefix is
// no unit; units cannot be used as names (the check of definitions is in
// reduce/sheet; here: which words read as units).
func TestNamesAndUnits(t *testing.T) {
	units := []string{"S", "V", "mS", "ms", "m", "kΩ", "uF", "µF", "Hz", "kHz", "var", "kvar", "VA", "MVA", "ohm", "kohm"}
	for _, w := range units {
		if !IsUnit(w) {
			t.Errorf("IsUnit(%q) = false, want true", w)
		}
	}
	notUnits := []string{"k", "u", "Vs", "Zload", "x", "R1", "mm2", "kk", "", "ohmm", "µ"}
	for _, w := range notUnits {
		if IsUnit(w) {
			t.Errorf("IsUnit(%q) = true, want false", w)
		}
	}
	// a prefix alone after a number scales a plain number (issue 10); the
	// rare prefixes are never read alone and say so
	for _, src := range []string{"10E", "3P", "2q"} {
		_, err := evalString(newTestEnv(), src)
		if err == nil || !strings.Contains(err.Msg, "prefix") {
			t.Errorf("%s: error %v, want a prefix message", src, err)
		}
	}
	// "m" after a number is the metre, an exact unit before a prefix
	if q := mustEval(t, "5m*2"); q.Dim != DimLength || real(q.V) != 10 {
		t.Errorf("5 m*2 = %v %v, want 10 m", q.V, q.Dim)
	}
}

// TestPowerLimits: powers that leave the float64 range or the range of
// unit exponents are errors that say so, never NaN and never a panic.
func TestPowerLimits(t *testing.T) {
	tests := []struct{ src, msg string }{
		{"2^10000", "overflow"},
		{"2^1024", "overflow"},
		{"10^309", "overflow"},
		{"exp(710)", "overflow"},
		{"e^710", "overflow"},
		{"(1 A)^(2^100)", "out of range"}, // once a division by zero inside the root case
		{"((1 V)^6)^43", "out of range"},  // int8 exponents would wrap to V²
		{"(1 V)^100", "out of range"},
		{"(1 V)^(1e-40)", "no whole unit"},
		{"(1 V)^0.5", "no whole unit"},
	}
	for _, tt := range tests {
		_, err := evalString(newTestEnv(), tt.src)
		if err == nil || !strings.Contains(err.Msg, tt.msg) {
			t.Errorf("%s: error %v, want %q", tt.src, err, tt.msg)
		}
	}
	for _, src := range []string{"2^1023", "10^308", "e^709", "(4 Ω^2)^0.5", "(1 V)^60"} {
		if _, err := evalString(newTestEnv(), src); err != nil {
			t.Errorf("%s: %v", src, err)
		}
	}
}

// TestSubnormalFormat: math.Log10 is off for subnormal numbers, so the
// exponent shown must come from elsewhere; 1e-320 is not "0.00e-309".
func TestSubnormalFormat(t *testing.T) {
	tests := []struct {
		x    float64
		want string
	}{
		{1e-320, "10.00×10^-321 V"},
		{1e-310, "100.0×10^-312 V"},
		{1e-300, "1.000×10^-300 V"},
	}
	for _, tt := range tests {
		if got := (Format{}).Rect(Real(tt.x, DimVoltage)); got != tt.want {
			t.Errorf("Rect(%g V) = %q, want %q", tt.x, got, tt.want)
		}
	}
}

// TestParallelPrecedenceHint: || binds tighter than + and −, so a spaced
// "3 + j4 Ω || 10 Ω" adds a plain 3 to an impedance; the message says why.
func TestParallelPrecedenceHint(t *testing.T) {
	_, err := evalString(newTestEnv(), "3 + j4 Ω || 10 Ω")
	if err == nil || !strings.Contains(err.Msg, "|| binds tighter") || !strings.Contains(err.Msg, "(3 + j4 Ω) ||") {
		t.Errorf("error %v, want the precedence hint", err)
	}
}

// TestPowerQuadrature: real and reactive power are at right angles,
// S = P + jQ and |S|² = P² + Q² (IEEE Std 1459-2010). Adding 800 W and
// 600 var as plain numbers would give 1400 silently; it is an error that
// shows the right form, which gives 1000 VA ∠36.87°.
func TestPowerQuadrature(t *testing.T) {
	for _, src := range []string{"800 W + 600 var", "800 W - 600 var", "600 var + 800 W"} {
		_, err := evalString(newTestEnv(), src)
		if err == nil || !strings.Contains(err.Msg, "P + j·Q") {
			t.Errorf("%s: error %v, want the P + jQ hint", src, err)
		}
	}
	q := mustEval(t, "800 W + j*600 var")
	if q.Mag() != 1000 || math.Abs(Deg(q.V)-math.Atan2(600, 800)*180/math.Pi) > 1e-12 || q.Kind != KindApparent {
		t.Errorf("800 W + j·600 var = %v kind %v, want 1000 VA ∠36.87°", q.V, q.Kind)
	}
	if q := mustEval(t, "100 var + 50 var"); q.V != 150 || q.Kind != KindReactive {
		t.Errorf("100 var + 50 var = %v kind %v", q.V, q.Kind)
	}
}

// TestHorsepowers: the mechanical horsepower, 550 ft·lbf/s, and the metric
// one, 75 kgf·m/s with g_n = 9.806 65 m/s², have names of their own
// (NIST SP 811, appendix B.8: 7.456 999 E+02 W and 7.354 988 E+02 W,
// from memory); both are active powers.
func TestHorsepowers(t *testing.T) {
	for _, c := range []struct {
		src  string
		want float64
	}{{"1 hp", 550 * 0.3048 * 0.45359237 * 9.80665}, {"1 hp_metric", 75 * 9.80665}, {"10 hp_metric", 7354.9875}} {
		q := mustEval(t, c.src)
		if q.Dim != DimPower || q.Kind != KindActive || math.Abs(real(q.V)-c.want) > 1e-12*c.want {
			t.Errorf("%s = %v (dim %v, kind %v), want %.12g W", c.src, q.V, q.Dim, q.Kind, c.want)
		}
	}
	if got, want := real(mustEval(t, "1 hp/hp_metric").V), 550*0.3048*0.45359237/75; math.Abs(got-want) > 1e-12 {
		t.Errorf("hp/hp_metric = %.14g", got)
	}
}
