package calc

import (
	"math"
	"strings"
	"testing"
)

// evalRead evaluates src and returns its value and the notes said.
func evalRead(t *testing.T, env Env, src string) (Quantity, []string, *Error) {
	t.Helper()
	x, err := ParseExpr(src, 1)
	if err != nil {
		return Quantity{}, nil, err
	}
	ev := &Evaluator{Env: env, Src: src, Line: 1}
	r, err := ev.Eval(x)
	if err != nil {
		return Quantity{}, nil, err
	}
	return r.Value, r.Notes, nil
}

// TestReadAsTyped: numbers as technicians type them (issue 10). Each case
// gives the value and dimension it must read as, and a piece of the note
// that says how it was read ("" when it reads exactly as written).
func TestReadAsTyped(t *testing.T) {
	tests := []struct {
		src    string
		want   complex128
		dim    Dim
		note   string
		source string // the published source or "common practice"
	}{
		// bare SI prefixes scale a plain number (SI Brochure 9th ed., table 7)
		{"1M", 1e6, Dimensionless, "", "SI Brochure 9th ed., table 7"},
		{"330n * 2", 660e-9, Dimensionless, "", "SI Brochure 9th ed., table 7"},
		{"4.7k || 10k", 4.7e3 * 10e3 / 14.7e3, Dimensionless, "", "common practice: R1·R2/(R1+R2)"},
		{"2.2µ", 2.2e-6, Dimensionless, "", "SI Brochure 9th ed., table 7"},
		{"100p", 100e-12, Dimensionless, "", "SI Brochure 9th ed., table 7"},
		{"3G", 3e9, Dimensionless, "", "SI Brochure 9th ed., table 7"},
		{"2T", 2e12, Dimensionless, "", "SI Brochure 9th ed., table 7"},
		{"5f", 5e-15, Dimensionless, "", "SI Brochure 9th ed., table 7"},
		{"7u", 7e-6, Dimensionless, "", "NIST SP 811: u for µ where µ cannot be typed"},
		// a prefix, a space, then the unit
		{"1.2k ohm", 1.2e3, DimImpedance, `read "1.2k ohm" as 1.2 kΩ`, "SI Brochure 9th ed., §3"},
		{"1.2k V", 1.2e3, DimVoltage, "as 1.2 kV", "SI Brochure 9th ed., §3"},
		// letter-and-digit codes: the letter is the decimal sign and the
		// multiplier; R K M G T give Ω, p n µ m give F (IEC 60062)
		{"47R", 47, DimImpedance, "IEC 60062", "IEC 60062"},
		{"0R1", 0.1, DimImpedance, "as 0.1 Ω", "IEC 60062"},
		{"4R7", 4.7, DimImpedance, "", "IEC 60062"},
		{"4K7", 4.7e3, DimImpedance, "as 4.7 kΩ", "IEC 60062"},
		{"47K", 47e3, DimImpedance, "", "IEC 60062"},
		{"2M2", 2.2e6, DimImpedance, "as 2.2 MΩ", "IEC 60062"},
		{"1G5", 1.5e9, DimImpedance, "", "IEC 60062"},
		{"1T0", 1e12, DimImpedance, "", "IEC 60062"},
		{"4n7", 4.7e-9, DimCapacitance, "as 4.7 nF", "IEC 60062"},
		{"2µ2", 2.2e-6, DimCapacitance, "as 2.2 µF", "IEC 60062"},
		{"6p8", 6.8e-12, DimCapacitance, "", "IEC 60062"},
		{"1m5", 1.5e-3, DimCapacitance, "", "IEC 60062"},
		{"4k7", 4.7e3, DimImpedance, "as 4.7 kΩ", "common practice (lower-case k)"},
		{"2u2", 2.2e-6, DimCapacitance, "as 2.2 µF", "common practice (u for µ)"},
		// a code beside a bare prefix: the bare one takes Ω with a note
		{"4k7 || 10k", 4.7e3 * 10e3 / 14.7e3, DimImpedance, `read "10k" as 10.00 kΩ`, "IEC 60062; common practice R1·R2/(R1+R2)"},
		{"10k + 4K7", 14.7e3, DimImpedance, `read "10k"`, "IEC 60062"},
		// units in another case: the unit matched without case, the prefix
		// keeping its own (SI Brochure 9th ed., §5.2 for the symbols)
		{"230 v", 230, DimVoltage, `read "230 v" as 230 V`, "SI Brochure 9th ed., table 4"},
		{"6.2 a", 6.2, DimCurrent, "as 6.2 A", "SI Brochure 9th ed., table 2"},
		{"50 hz", 50, DimFrequency, "as 50 Hz", "SI Brochure 9th ed., table 4"},
		{"2.2 mh", 2.2e-3, DimInductance, "m is milli", "SI Brochure 9th ed., table 7"},
		{"2 mv", 2e-3, DimVoltage, "m is milli", "SI Brochure 9th ed., table 7"},
		{"3 ma", 3e-3, DimCurrent, "m is milli", "SI Brochure 9th ed., table 7"},
		{"1.2 kw", 1.2e3, DimPower, "as 1.2 kW", "SI Brochure 9th ed., table 4"},
		{"5 kva", 5e3, DimPower, "as 5 kVA", "IEC 60027-1: VA for apparent power"},
		{"300 VAr", 300, DimPower, "as 300 var", "IEC 60027-1: var for reactive power"},
		{"2 kVAr", 2e3, DimPower, "as 2 kvar", "IEC 60027-1: var for reactive power"},
		{"3 Ohm", 3, DimImpedance, "as 3 Ω", "SI Brochure 9th ed., table 4"},
		{"2 kOhm", 2e3, DimImpedance, "as 2 kΩ", "SI Brochure 9th ed., table 4"},
		{"10 uf", 10e-6, DimCapacitance, "as 10 µF", "NIST SP 811: u for µ"},
		{"4.7 KΩ", 4.7e3, DimImpedance, "kilo is a lower-case k", "SI Brochure 9th ed., table 7"},
		{"3 KV", 3e3, DimVoltage, "kilo is a lower-case k", "SI Brochure 9th ed., table 7"},
		{"3 MHZ", 3e6, DimFrequency, "as 3 MHz", "SI Brochure 9th ed., table 7"},
		// exact units are read as written, with no note
		{"5 mW", 5e-3, DimPower, "", "SI Brochure 9th ed., table 7"},
		{"5 MW", 5e6, DimPower, "", "SI Brochure 9th ed., table 7"},
		{"5m", 5, DimLength, "", "SI Brochure 9th ed., table 2: m is the metre"},
		{"2 ms", 2e-3, DimTime, "", "SI Brochure 9th ed., table 2"},
		{"2 mS", 2e-3, DimAdmittance, "", "SI Brochure 9th ed., table 4"},
		// characters phones and other programs send (Unicode: U+2126 OHM
		// SIGN is canonically U+03A9; U+00B5 MICRO SIGN beside U+03BC)
		{"10 k\u2126", 10e3, DimImpedance, "", "Unicode: OHM SIGN ≡ GREEK CAPITAL OMEGA"},
		{"10 \u2126", 10, DimImpedance, "", "Unicode: OHM SIGN ≡ GREEK CAPITAL OMEGA"},
		{"4.7 \u00b5F", 4.7e-6, DimCapacitance, "", "Unicode: MICRO SIGN"},
		{"4.7 \u03bcF", 4.7e-6, DimCapacitance, "", "Unicode: GREEK SMALL LETTER MU"},
		{"10\u00a0V", 10, DimVoltage, "", "SI Brochure 9th ed., §5.4.3: a space between number and unit"},
		{"10\u202fV", 10, DimVoltage, "", "SI Brochure 9th ed., §5.4.3 (narrow no-break space)"},
		{"10\u2009V", 10, DimVoltage, "", "SI Brochure 9th ed., §5.4.3 (thin space)"},
		// part values combined with an impedance take their impedance at
		// the working frequency, 50 Hz here (X = ωL, X = −1/(ωC), common
		// practice)
		{"4.7 kΩ + 10 mH", complex(4.7e3, 2*math.Pi*50*10e-3), DimImpedance, "10.00 mH at 50.00 Hz: j3.142 Ω", "common practice: X_L = ωL"},
		{"10 µF || 4.7 kΩ", par(complex(0, -1/(2*math.Pi*50*10e-6)), 4.7e3), DimImpedance, "10.00 µF at 50.00 Hz: -j318.3 Ω", "common practice: X_C = −1/(ωC)"},
		{"10 mH + 5 mH", 15e-3, DimInductance, "", "common practice: inductances in series add"},
	}
	for _, tc := range tests {
		q, notes, err := evalRead(t, newTestEnv(), tc.src)
		if err != nil {
			t.Errorf("%s (%s): %v", tc.src, tc.source, err)
			continue
		}
		if !closeC(q.V, tc.want, 1e-12) || q.Dim != tc.dim {
			t.Errorf("%s (%s) = %v %v, want %v %v", tc.src, tc.source, q.V, DimName(q.Dim, false), tc.want, DimName(tc.dim, false))
		}
		all := strings.Join(notes, " | ")
		if tc.note != "" && !strings.Contains(all, tc.note) {
			t.Errorf("%s: notes %q, want one containing %q", tc.src, all, tc.note)
		}
	}
}

func par(a, b complex128) complex128 { return a * b / (a + b) }

// TestReadExactNoNote: a number written exactly as the SI Brochure writes
// it reads without any note, so notes only ever flag a guess.
func TestReadExactNoNote(t *testing.T) {
	for _, src := range []string{"230 V", "4.7 kΩ", "10 µF", "2.2 mH", "5 kVA", "300 var", "50 Hz", "5 mW", "1.2 kW", "10 ohm", "3 kohm"} {
		_, notes, err := evalRead(t, newTestEnv(), src)
		if err != nil || len(notes) != 0 {
			t.Errorf("%s: notes %q, error %v; want none", src, notes, err)
		}
	}
}

// TestReadRefused: readings argand will not guess, each with a message that
// gives the thing to type, at the word's column.
func TestReadRefused(t *testing.T) {
	tests := []struct {
		src, msg string
		col      int
	}{
		// site usage writes m for mega as often as for milli (common practice)
		{"2 mw", "write mW for milli or MW for mega", 3},
		{"2 mva", "write mVA for milli or MVA for mega", 3},
		{"2 mvar", "Mvar for mega", 3},
		{"2 mhz", "write mHz for milli or MHz for mega", 3},
		// the rare prefixes are never read alone (SI Brochure 9th ed.,
		// table 7 lists them; input reads only the common ones)
		{"2a5", "unknown unit", 2},
		{"10E", "not read as a prefix", 3},
		{"3P", "not read as a prefix", 2},
		{"3Z", "not read as a prefix", 2},
		{"3Y", "not read as a prefix", 2},
		{"3Q", "not read as a prefix", 2},
		{"3q", "not read as a prefix", 2},
		{"3r", "not read as a prefix", 2},
		{"3z", "not read as a prefix", 2},
		{"3y", "not read as a prefix", 2},
		{"4.7K", "K is no SI prefix", 4},
		{"4.7R", "code letter for Ω (IEC 60062)", 4},
		{"3 $ 4", "unexpected character '$'", 3},
		{"3\u200b+4", "invisible character U+200B", 2},
		{"3+\ufeff4", "invisible character U+FEFF", 3},
		{"3+\u2060 4", "invisible character U+2060", 3},
		{"10 k", "must follow the number directly", 4},
	}
	for _, tc := range tests {
		_, _, err := evalRead(t, newTestEnv(), tc.src)
		if err == nil || !strings.Contains(err.Msg, tc.msg) || err.Col != tc.col {
			t.Errorf("%q: error %v, want %q at col %d", tc.src, err, tc.msg, tc.col)
		}
		if err != nil && strings.ContainsAny(err.Msg, "\u200b\ufeff\u2060") {
			t.Errorf("%q: message prints the invisible character raw: %q", tc.src, err.Msg)
		}
	}
}

// TestPartValueNeedsFrequency: with no working frequency a part value in
// impedance arithmetic is an error that says to set one.
func TestPartValueNeedsFrequency(t *testing.T) {
	env := newTestEnv()
	env.ctx.Freq = 0
	_, _, err := evalRead(t, env, "10 µF || 4.7 kΩ")
	if err == nil || !strings.Contains(err.Msg, "set a working frequency") || err.Col != 1 {
		t.Errorf("error %v, want one saying to set a working frequency at col 1", err)
	}
}

// TestLiteralSince: a literal read by a rule new in language 2 says so,
// so a worksheet written for language 1 can list the lines that changed.
func TestLiteralSince(t *testing.T) {
	for src, want := range map[string]int{"230 V": 0, "4k7": 2, "10k": 2, "230 v": 2, "1.2k ohm": 2, "3 KV": 2, "10 kΩ": 0} {
		p := NewParser(src, 1)
		p.Expr()
		if p.Err() != nil || p.Since() != want {
			t.Errorf("%s: since %d (error %v), want %d", src, p.Since(), p.Err(), want)
		}
	}
	x, _ := ParseExpr("10 µF || 4.7 kΩ", 1)
	ev := &Evaluator{Env: newTestEnv(), Src: "10 µF || 4.7 kΩ", Line: 1}
	if _, err := ev.Eval(x); err != nil || ev.Since != 2 {
		t.Errorf("part value: since %d, error %v; want 2", ev.Since, err)
	}
}

// TestInverseTrig: acos, asin and atan return angles (exact values of the
// unit circle, common practice), and refuse what has no real angle.
func TestInverseTrig(t *testing.T) {
	tests := []struct {
		src string
		deg float64
	}{
		{"acos(0.5)", 60}, {"acos(0)", 90}, {"acos(1)", 0}, {"acos(-1)", 180},
		{"asin(0.5)", 30}, {"asin(-1)", -90}, {"atan(1)", 45}, {"atan(-1)", -45},
		{"atan(sqrt(3))", 60}, {"cos(acos(0.78))*100", 78},
	}
	for _, tc := range tests {
		q, _, err := evalRead(t, newTestEnv(), tc.src)
		if err != nil {
			t.Errorf("%s: %v", tc.src, err)
			continue
		}
		got := real(q.V) * 180 / math.Pi
		if strings.HasPrefix(tc.src, "cos(") {
			got = real(q.V)
		} else if q.Kind != KindAngle {
			t.Errorf("%s: kind %v, want an angle", tc.src, q.Kind)
		}
		if math.Abs(got-tc.deg) > 1e-9*math.Max(1, tc.deg) {
			t.Errorf("%s = %.12g, want %g", tc.src, got, tc.deg)
		}
	}
	for src, msg := range map[string]string{"acos(2)": "from −1 to 1", "asin(-1.5)": "from −1 to 1", "acos(1 V)": "plain real number", "atan(j)": "real number", "acos(30°)": "plain real number"} {
		_, _, err := evalRead(t, newTestEnv(), src)
		if err == nil || !strings.Contains(err.Msg, strings.TrimPrefix(msg, "not ")) {
			t.Errorf("%s: error %v, want %q", src, err, msg)
		}
	}
}

// funcEnv adds one function to the test environment.
type funcEnv struct {
	*testEnv
	f Func
}

func (e funcEnv) Func(name string) (*Func, bool) {
	if name == e.f.Name {
		return &e.f, true
	}
	return nil, false
}

// TestArgumentsAsParamsExpect: a number scaled by a prefix alone takes the
// unit its parameter expects, and a part value given for an impedance is
// its impedance at the working frequency (X_L = ωL, common practice);
// with no working frequency that is an error saying to set one.
func TestArgumentsAsParamsExpect(t *testing.T) {
	sum := Func{Name: "zsum", Params: []Param{{Name: "Z", Kind: ParamImpedance}}, Min: 1, Max: -1,
		Call: func(c *Context, args []Arg) (Result, error) {
			var v complex128
			for _, a := range args {
				v += a.Q.V
			}
			return Value(Quantity{V: v, Dim: DimImpedance}), nil
		}}
	env := funcEnv{newTestEnv(), sum}
	q, notes, err := evalRead(t, env, "zsum(22 mH, 150 Ω, 10k)")
	want := complex(150+10e3, 2*math.Pi*50*22e-3)
	if err != nil || !closeC(q.V, want, 1e-12) {
		t.Fatalf("zsum(22 mH, 150 Ω, 10k) = %v (%v), want %v", q.V, err, want)
	}
	all := strings.Join(notes, " | ")
	for _, n := range []string{"22.00 mH at 50.00 Hz: j6.912 Ω", `read "10k" as 10.00 kΩ (the unit Z takes)`} {
		if !strings.Contains(all, n) {
			t.Errorf("notes %q lack %q", all, n)
		}
	}
	// zc takes a capacitance: 100n is 100 nF, X_C = −1/(ωC) (common practice)
	q, _, err = evalRead(t, newTestEnv(), "zc(100n)")
	if err != nil || !closeC(q.V, complex(0, -1/(2*math.Pi*50*100e-9)), 1e-12) {
		t.Errorf("zc(100n) = %v (%v)", q.V, err)
	}
	env.ctx.Freq = 0
	if _, _, err := evalRead(t, env, "zsum(22 mH, 150 Ω)"); err == nil || !strings.Contains(err.Msg, "set a working frequency") || err.Col != 6 {
		t.Errorf("with no frequency: %v, want an error at col 6 saying to set one", err)
	}
}

// TestBarePrefixNote: a number scaled by a prefix alone (SI Brochure 9th
// ed., table 7) has one line in the step saying how it was read: as a
// plain number where it stays one, or, where it takes a unit from what it
// is combined with, that reading alone (never both).
func TestBarePrefixNote(t *testing.T) {
	tests := []struct {
		src   string
		notes []string
	}{
		{"4.7k", []string{`read "4.7k" as 4.7×10^3, a plain number`}},
		{"1M", []string{`read "1M" as 1×10^6, a plain number`}},
		{"330n * 2", []string{`read "330n" as 330×10^-9, a plain number`}},
		{"7u", []string{`read "7u" as 7×10^-6, a plain number`}},
		{"-2.2µ", []string{`read "2.2µ" as 2.2×10^-6, a plain number`}},
		{"4.7k || 10k", []string{`read "4.7k" as 4.7×10^3, a plain number`, `read "10k" as 10×10^3, a plain number`}},
		{"4k7 || 10k", []string{`read "4k7" as 4.7 kΩ (IEC 60062 code)`, `read "10k" as 10.00 kΩ (combined with an impedance)`}},
		{"10k + 4.7 kΩ", []string{`read "10k" as 10.00 kΩ (combined with an impedance)`}},
		{"10 mH + 5 mH", nil},
	}
	for _, tc := range tests {
		_, notes, err := evalRead(t, newTestEnv(), tc.src)
		if err != nil {
			t.Errorf("%s: %v", tc.src, err)
			continue
		}
		if strings.Join(notes, "\n") != strings.Join(tc.notes, "\n") {
			t.Errorf("%s: notes %q, want %q", tc.src, notes, tc.notes)
		}
	}
}
