package calc

import (
	"math"
	"math/cmplx"
	"regexp"
	"strconv"
	"strings"
	"testing"
	"unicode/utf8"
)

// fuzzSeeds are expressions of every form the language has, and some that
// are wrong, as the starting corpus of the fuzz targets.
var fuzzSeeds = []string{
	"3+j4 Ω", "3-j4 kΩ", "j4", "-j4", "3+4j", "3+i4", "230∠-30 V", "230@-30° V", "10 mH", "4.7kΩ",
	"1 µF", "1 uF", "1 nF || 2 nF", "Z || Z2", "0 || Z", "j10 || -j10", "(3+j4)^2", "2^-1", "sqrt(-4)",
	"mag(Z)", "arg(Z)", "re(Z)", "im(Z)", "conj(Z)", "recip(Z)", "sin(30)", "cos(pi)", "tan(45°)",
	"atan2(4, 3)", "exp(j*pi)", "ln(e)", "log10(1000)", "deg(pi)", "rad(180)", "omega(50 Hz)",
	"zl(L1)", "zc(C1)", "zr(10 Ω)", "w*L1", "1/(w*C1)", "50 Hz * 10 mH", "1 V + 1 Ω", "1e308*1e308",
	"1/0", "5∠", "(1+2", "1 +", "foo(2)", "10 k", "S", "1 V·s/A", "1 A*1 s/1 V", "1 H/1 Ω",
	"Vs / (Z + Z2)", "-(-(-1))", "((((1))))", "1e-400", "1e400", "\xff", "π", "1 %", "10 ms", "10 mS",
	"10 m", "1 hp", "2 rad/s", "1∠0.5 rad", "3.3 kohm", "1 W + 1 var", "2 VA * 0.5", "1.5e3 Ω", ".5",
	"mag(z = Z)", "mag(z = Z, z = Z)", "mag(y = 1)", "sin(θ = 30)", "atan2(x = 3, y = 4)", "atan2(3, x = 4)",
	"atan2(y = 4, 3)", "mag(z =)", "mag(= 3)", "mag(2 A)^2 * 50 Ω", "1 kW + 1 kVA", "230 V * 10 A",
	// as technicians type them
	"4.7k || 10k", "330n * 2", "1M", "1.2k ohm", "47R", "0R1", "4K7", "4k7", "2M2", "4n7", "2µ2", "2u2",
	"4k7 || 10k", "230 v", "6.2 a", "50 hz", "2.2 mh", "1.2 kw", "5 kva", "300 VAr", "2 kVAr", "3 Ohm",
	"2 kOhm", "10 uf", "4.7 KΩ", "2 mw", "2 mva", "2 mvar", "2 mhz", "10E", "3P", "4.7K", "4.7R",
	"10 µF || 4.7 kΩ", "4.7 kΩ + 10 mH", "10\u00a0V", "10\u202fkΩ", "10\u2009V", "10 k\u2126", "4.7 \u00b5F",
	"3\u200b+4", "\ufeff3", "acos(0.78)", "asin(0.5)", "atan(1)", "acos(2)", "1/3 Ω", "2/3 kV", "1e-7 F",
	// the decimal comma and digit groups (SI Brochure 9th ed. §5.4.4)
	"2,2 mH", "1,000 V", "1,000,000", "1,000.5", "atan2(4,3)", "atan2(4; 3)", "3+j4,5 Ω", ",5", "1 000 V",
	"2,2e3", "j2,2", "2,2j", "1\u00a0000", "5,",
	// lines past caretSpan, shown around the place of their error
	strings.Repeat("1 + ", 60) + "foo + " + strings.Repeat("2 + ", 60) + "3",
	strings.Repeat("1+", 100) + "\x1b" + strings.Repeat("+Ω", 100),
	strings.Repeat("(", 150) + "1",
}

// checkErr asserts an error's place lies inside its line.
func checkErr(t *testing.T, src string, err *Error) {
	t.Helper()
	n := utf8.RuneCountInString(src)
	if err.Col < 1 || err.Col > n+1 {
		t.Fatalf("%q: error column %d outside 1…%d: %v", src, err.Col, n+1, err)
	}
	if err.Len < 1 {
		t.Fatalf("%q: error width %d", src, err.Len)
	}
	if err.Msg == "" {
		t.Fatalf("%q: empty error message", src)
	}
	for _, bad := range []string{"NaN", "Inf", "panic", "goroutine", "runtime error"} {
		// a message may quote what was typed ("unknown unit NaN")
		if strings.Contains(err.Msg, bad) && !strings.Contains(src, bad) {
			t.Fatalf("%q: message %q contains %q", src, err.Msg, bad)
		}
	}
	c := Caret(src, err)
	lines := strings.Split(c, "\n")
	caret := lines[len(lines)-1]
	// Each character before the column takes one cell, or the width of
	// its visible escape (a line break included), so the caret stays
	// under the character it marks.
	pad := 0
	for i, col := 0, 1; i < len(src) && col < err.Col; col++ {
		r, n := utf8.DecodeRuneInString(src[i:])
		shown := Printable(src[i : i+n])
		switch {
		case r == '\n':
			pad += len(`\x0a`)
		case shown != src[i:i+n] && strings.HasPrefix(shown, `\`):
			pad += len(shown)
		default:
			pad++
		}
		i += n
	}
	if !strings.HasSuffix(caret, "^") {
		t.Fatalf("%q: caret line %q has no caret", src, caret)
	}
	if n <= caretSpan {
		if len(strings.TrimRight(caret, "^")) != pad {
			t.Fatalf("%q: caret line %q does not start at column %d", src, caret, err.Col)
		}
		return
	}
	// a long line is shown around the place: the caret stands under the
	// marked character as shown
	rs := []rune(lines[0])
	off := len(strings.TrimRight(caret, "^"))
	if off > len(rs) {
		t.Fatalf("%q: caret at %d past the shown line of %d", src, off, len(rs))
	}
	if err.Col <= n {
		i := 0
		for col := 1; col < err.Col; col++ {
			_, w := utf8.DecodeRuneInString(src[i:])
			i += w
		}
		_, w := utf8.DecodeRuneInString(src[i:])
		want := Printable(src[i : i+w])
		if src[i] == '\n' {
			want = `\x0a`
		}
		if !strings.HasPrefix(string(rs[off:]), want) {
			t.Fatalf("%q: the caret at %d is not under %q in %q", src, off, want, lines[0])
		}
	}
	// at most caretSpan characters and the two "…", an escape (at most
	// \uHHHH) standing for one character
	if len(rs) > 6*caretSpan+2 {
		t.Fatalf("%q: %d characters shown of a long line", src, len(rs))
	}
}

// FuzzParse: the parser never panics, and an error lies inside the line.
func FuzzParse(f *testing.F) {
	for _, s := range fuzzSeeds {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, src string) {
		// under the decimal comma too, errors lie inside the line
		if _, err := ParseExprComma(src, 1, true); err != nil {
			checkErr(t, src, err)
		}
		x, err := ParseExpr(src, 1)
		if err != nil {
			if x != nil {
				t.Fatalf("%q: both an expression and an error", src)
			}
			if err.Line != 1 {
				t.Fatalf("%q: error on line %d, want 1", src, err.Line)
			}
			checkErr(t, src, err)
			return
		}
		Walk(x, func(e Expr) {
			pos, end, col := e.Span()
			if pos < 0 || end > len(src) || pos > end || col < 1 || col > utf8.RuneCountInString(src)+1 {
				t.Fatalf("%q: node %T has span %d…%d col %d", src, e, pos, end, col)
			}
		})
	})
}

// FuzzEval: parse and evaluate against a small environment. Nothing shown
// is NaN or Inf, an error lies inside the line, and a result formatted in
// either form at the digits shown parses back to the same value.
func FuzzEval(f *testing.F) {
	for _, s := range fuzzSeeds {
		f.Add(s, uint8(4))
	}
	f.Fuzz(func(t *testing.T, src string, digits uint8) {
		env := newTestEnv()
		q, err := evalString(env, src)
		if err != nil {
			checkErr(t, src, err)
			return
		}
		if !finite(q.V) {
			t.Fatalf("%q = %v: not finite", src, q.V)
		}
		d := int(digits%15) + 1
		for _, fm := range []Format{{Digits: d}, {Digits: d, ASCII: true}, {Digits: d, Radians: true}} {
			for _, s := range []string{fm.Rect(q), fm.Polar(q), fm.Both(q, false), JSONValue("x", q, RMS)} {
				if strings.Contains(s, "NaN") || strings.Contains(s, "Inf") {
					t.Fatalf("%q formats as %q", src, s)
				}
				if fm.ASCII && !isASCII(s) && !strings.HasPrefix(s, "{") {
					t.Fatalf("%q: ASCII format %q", src, s)
				}
			}
			if s := fm.Polar(q); strings.Contains(s, "∠-180") || strings.Contains(s, "-0°") || strings.Contains(s, "∠-0 ") {
				t.Fatalf("%q: polar %q", src, s)
			}
		}
		if parsesBack(q) {
			// shown under either decimal marker, a value reads back under
			// the same one
			for _, comma := range []bool{false, true} {
				fm := Format{Digits: d, Comma: comma}
				roundTripT(t, fm.Rect(q), q, d, comma)
				roundTripT(t, fm.Polar(q), q, d, comma)
			}
			fm := Format{Digits: d}
			halfUnit(t, fm.Rect(q), q)
			// at 17 figures what is shown is the value itself
			halfUnit(t, Format{Digits: 17}.Rect(q), q)
			exact17(t, q)
		}
	})
}

// rectText splits a rectangular form as shown ("3.000 + j4.000 kΩ",
// "-j318.3 Ω", "4.700e-6") into its numbers and unit word.
var rectText = regexp.MustCompile(`^(-?)(j?)(\d+)(?:\.(\d+))?(e-?\d+)?(?: ([+-]) j(\d+)(?:\.(\d+))?(e-?\d+)?)?(?: (.+))?$`)

// halfUnit checks the round-trip invariant of what is shown: each part of
// the rectangular form parses back to within half a unit in its last shown
// digit of the value (plus a few ulps of the magnitude for the binary
// arithmetic of parsing and scaling). The unit of the last digit is read
// from the text itself: its decimals, its exponent and its prefix.
func halfUnit(t *testing.T, text string, q Quantity) {
	t.Helper()
	m := rectText.FindStringSubmatch(text)
	if m == nil {
		return // a form this check does not read (an angle, a per-second rate)
	}
	prefix := 1.0
	if m[10] != "" {
		u, ok := lookupUnit(m[10])
		base, ok2 := lookupUnit(UnitSymbol(q.Dim, q.Kind, false))
		if !ok || !ok2 {
			return
		}
		prefix = u.scale / base.scale
	}
	unit := func(frac, exp string) float64 {
		e := 0
		if exp != "" {
			e, _ = strconv.Atoi(exp[1:])
		}
		return math.Pow10(e-len(frac)) * prefix
	}
	re, im := cleanParts(q.V)
	slack := 8 * 2.220446049250313e-16 * cmplx.Abs(q.V)
	back, err := evalString(newTestEnv(), text)
	if err != nil {
		t.Fatalf("%q does not parse back: %v", text, err)
	}
	if m[2] == "j" { // the imaginary part alone
		if d := math.Abs(imag(back.V) - im); d > unit(m[4], m[5])/2+slack {
			t.Fatalf("%q: imaginary part %v off %v by %g, more than half a unit (%g)", text, imag(back.V), im, d, unit(m[4], m[5])/2)
		}
		return
	}
	if d := math.Abs(real(back.V) - re); d > unit(m[4], m[5])/2+slack {
		t.Fatalf("%q: real part %v off %v by %g, more than half a unit (%g)", text, real(back.V), re, d, unit(m[4], m[5])/2)
	}
	if m[7] != "" {
		if d := math.Abs(imag(back.V) - im); d > unit(m[8], m[9])/2+slack {
			t.Fatalf("%q: imaginary part %v off %v by %g, more than half a unit (%g)", text, imag(back.V), im, d, unit(m[8], m[9])/2)
		}
	}
}

// exact17: at digits 17 the rectangular form parses back to the very same
// float64 parts, unless a part is below 1e-12 of the magnitude, which is
// shown as 0 by design (rounding noise, as in 3∠90°).
func exact17(t *testing.T, q Quantity) {
	t.Helper()
	re, im := cleanParts(q.V)
	if re != real(q.V) || im != imag(q.V) {
		return
	}
	text := Format{Digits: 17}.Rect(q)
	back, err := evalString(newTestEnv(), text)
	if err != nil {
		t.Fatalf("%q does not parse back: %v", text, err)
	}
	if back.V != q.V {
		t.Fatalf("digits 17: %q parses back as %v, not %v", text, back.V, q.V)
	}
}

// parsesBack reports whether the display unit of q is one the parser reads
// and the value is far enough from the float64 limit that its rounded form
// is still a finite number.
func parsesBack(q Quantity) bool {
	if q.Kind == KindAngle {
		return false // shown in degrees without wrapping; checked in the unit tests
	}
	m := cmplx.Abs(q.V)
	if m > 1e300 || (m < 1e-300 && m != 0) {
		return false
	}
	sym := UnitSymbol(q.Dim, q.Kind, false)
	if sym != "" && m != 0 && (m < 1e-15 || m >= 999.95e12) {
		// shown with a prefix a … q or P … Q, which input does not read
		// (DESIGN: input prefixes f … T)
		return false
	}
	return sym == "" || IsUnit(sym) || sym == "rad/s"
}

func roundTripT(t *testing.T, text string, q Quantity, digits int, comma bool) {
	t.Helper()
	back, err := evalStringComma(newTestEnv(), text, comma)
	if err != nil {
		t.Fatalf("%q (from %v %v) does not parse back: %v", text, q.V, q.Dim, err)
	}
	if back.Dim != q.Dim {
		t.Fatalf("%q parses back as dimension %v, want %v", text, back.Dim, q.Dim)
	}
	if d := cmplx.Abs(back.V - q.V); d > shownBound(cmplx.Abs(q.V), digits) {
		t.Fatalf("%q parses back as %v, value %v, off by %g", text, back.V, q.V, d)
	}
}
