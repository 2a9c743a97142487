package calc

import (
	"errors"
	"math"
	"math/cmplx"
	"strconv"
	"strings"
	"testing"

	"pgregory.net/rapid"
)

var propDims = []Dim{Dimensionless, DimVoltage, DimCurrent, DimImpedance, DimAdmittance, DimInductance,
	DimCapacitance, DimPower, DimFrequency, DimAngularFrequency, DimTime, DimLength, DimEnergy, DimCharge}

// genValue draws a complex value with magnitude in [1e-12, 1e12] and any
// angle, the range of everyday circuit quantities.
func genValue(t *rapid.T, label string) complex128 {
	e := rapid.Float64Range(-12, 12).Draw(t, label+".exp")
	m := math.Pow(10, e)
	deg := rapid.Float64Range(-180, 180).Draw(t, label+".deg")
	switch rapid.IntRange(0, 4).Draw(t, label+".axis") {
	case 0:
		return complex(m, 0)
	case 1:
		return complex(0, -m)
	}
	return cmplx.Rect(m, deg*math.Pi/180)
}

func genQuantity(t *rapid.T, label string) Quantity {
	d := rapid.SampledFrom(propDims).Draw(t, label+".dim")
	q := Q(genValue(t, label), d)
	if d == DimPower {
		q.Kind = rapid.SampledFrom([]Kind{KindApparent, KindActive, KindReactive}).Draw(t, label+".kind")
		if q.Kind != KindApparent {
			q.V = complex(real(q.V), 0)
			if q.V == 0 {
				q.V = 1
			}
		}
	}
	return q
}

// TestPropRectPolar: a value rebuilt from its magnitude and angle, written
// in full precision and parsed as m∠θ, is the value (to 1e-12 of |z|).
func TestPropRectPolar(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		v := genValue(t, "v")
		m, deg := cmplx.Abs(v), Deg(v)
		if deg <= -180 || deg > 180 {
			t.Fatalf("Deg(%v) = %v outside (−180, 180]", v, deg)
		}
		src := strconv.FormatFloat(m, 'g', -1, 64) + "∠" + strconv.FormatFloat(deg, 'g', -1, 64)
		q, err := evalString(newTestEnv(), src)
		if err != nil {
			t.Fatalf("%s: %v", src, err)
		}
		if !closeC(q.V, v, 1e-12) {
			t.Fatalf("%v → %s → %v", v, src, q.V)
		}
		back := cmplx.Rect(m, deg*math.Pi/180)
		if !closeC(back, v, 1e-12) {
			t.Fatalf("cmplx.Rect(|v|, ∠v) = %v, want %v", back, v)
		}
	})
}

// TestPropMulDiv: (a·b)/b = a to 1e-12 relative.
func TestPropMulDiv(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		a, b := genQuantity(t, "a"), genQuantity(t, "b")
		p, err := Mul(a, b)
		var ce *CycleError
		if errors.As(err, &ce) {
			t.Skip("Hz times a reactive element: refused by design")
		}
		if err != nil {
			t.Fatalf("Mul: %v", err)
		}
		r, err := Div(p, b)
		if err != nil {
			t.Fatalf("Div: %v", err)
		}
		if !closeC(r.V, a.V, 1e-12) {
			t.Fatalf("(a·b)/b = %v, a = %v", r.V, a.V)
		}
		if r.Dim != a.Dim {
			t.Fatalf("dimension of a·b/b = %v, of a = %v", r.Dim, a.Dim)
		}
	})
}

// TestPropParallel: a‖b = b‖a, and it matches 1/(1/a + 1/b) computed
// independently (common practice) where the sum is not near cancellation.
func TestPropParallel(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		d := rapid.SampledFrom([]Dim{DimImpedance, DimAdmittance, DimInductance}).Draw(t, "dim")
		a, b := Q(genValue(t, "a"), d), Q(genValue(t, "b"), d)
		ab, err1 := Parallel(a, b)
		ba, err2 := Parallel(b, a)
		if (err1 == nil) != (err2 == nil) {
			t.Fatalf("errors differ: %v vs %v", err1, err2)
		}
		if err1 != nil {
			if err1 != ErrOpenCircuit {
				t.Fatalf("Parallel: %v", err1)
			}
			return
		}
		if !closeC(ab.V, ba.V, 1e-15) || ab.Dim != d {
			t.Fatalf("a‖b = %v, b‖a = %v", ab.V, ba.V)
		}
		s := 1/a.V + 1/b.V
		if cmplx.Abs(s) > 1e-6*math.Max(cmplx.Abs(1/a.V), cmplx.Abs(1/b.V)) {
			if want := 1 / s; !closeC(ab.V, want, 1e-9) {
				t.Fatalf("a‖b = %v, 1/(1/a+1/b) = %v", ab.V, want)
			}
		}
	})
}

// TestPropRecip: 1/(1/a) = a, and the dimension comes back.
func TestPropRecip(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		a := genQuantity(t, "a")
		r, err := Recip(a)
		if err != nil {
			t.Fatalf("Recip: %v", err)
		}
		rr, err := Recip(r)
		if err != nil {
			t.Fatalf("Recip twice: %v", err)
		}
		if !closeC(rr.V, a.V, 1e-15*4) || rr.Dim != a.Dim {
			t.Fatalf("1/(1/a) = %v %v, a = %v %v", rr.V, rr.Dim, a.V, a.Dim)
		}
	})
}

// TestPropDimension: the dimension of a×b÷b equals a's for any exponents,
// including combinations no table lists.
func TestPropDimension(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		var a, b Dim
		for i := range a {
			a[i] = int8(rapid.IntRange(-4, 4).Draw(t, "a"))
			b[i] = int8(rapid.IntRange(-4, 4).Draw(t, "b"))
		}
		if got := a.Mul(b).Div(b); got != a {
			t.Fatalf("dim a×b÷b = %v, a = %v", got, a)
		}
		qa, qb := Q(2, a), Q(3i, b)
		p, err := Mul(qa, qb)
		var ce *CycleError
		if errors.As(err, &ce) {
			return
		}
		if err != nil {
			t.Fatalf("Mul: %v", err)
		}
		r, err := Div(p, qb)
		if err != nil && !errors.As(err, &ce) {
			t.Fatalf("Div: %v", err)
		}
		if err == nil && r.Dim != a {
			t.Fatalf("Div(Mul(a, b), b).Dim = %v, want %v", r.Dim, a)
		}
	})
}

// shownBound is how far a value printed to n significant figures may lie
// from the true one: half a unit in the last place of the magnitude's
// leading digit for each part, with room for the angle's rounding, plus a
// part below 1e-12 of the magnitude, which is shown as 0 by design (at 13
// or more digits that rule is the coarser of the two).
func shownBound(m float64, digits int) float64 {
	if digits <= 0 {
		digits = DefaultDigits
	}
	if digits > MaxDigits {
		digits = MaxDigits
	}
	return m*math.Pow(10, float64(1-digits)) + 1.5*tiny*m + 1e-300
}

// roundTrip parses a formatted value back and reports whether it lies
// within the rounding of the digits shown.
func roundTrip(t interface{ Fatalf(string, ...any) }, text string, q Quantity, digits int) {
	roundTripIn(t, text, q, digits, false)
}

// roundTripIn is roundTrip with the decimal comma when comma is set: what
// is shown under a setting reads back under the same setting.
func roundTripIn(t interface{ Fatalf(string, ...any) }, text string, q Quantity, digits int, comma bool) {
	back, err := evalStringComma(newTestEnv(), text, comma)
	if err != nil {
		t.Fatalf("%q (from %v %v) does not parse back: %v", text, q.V, q.Dim, err)
	}
	if back.Dim != q.Dim {
		t.Fatalf("%q parses back as dimension %v, want %v", text, back.Dim, q.Dim)
	}
	if d := cmplx.Abs(back.V - q.V); d > shownBound(cmplx.Abs(q.V), digits) {
		t.Fatalf("%q parses back as %v, value %v, off by %g (> %g)", text, back.V, q.V, d, shownBound(cmplx.Abs(q.V), digits))
	}
}

// TestPropFormatRoundTrip: a formatted result parses back to the same
// value at the digits shown, in rectangular and polar form, UTF-8 and ASCII.
func TestPropFormatRoundTrip(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		q := genQuantity(t, "q")
		if q.Dim == DimEnergy || q.Dim == DimCharge || q.Dim == DimAngularFrequency || q.Dim == DimLength {
			q.Dim = DimVoltage // "J", "C", "m" are fine too, but keep the test to phasor units
		}
		f := Format{Digits: rapid.IntRange(1, 15).Draw(t, "digits"), ASCII: rapid.Bool().Draw(t, "ascii"), Comma: rapid.Bool().Draw(t, "comma")}
		roundTripIn(t, f.Rect(q), q, f.Digits, f.Comma)
		roundTripIn(t, f.Polar(q), q, f.Digits, f.Comma)
	})
}

// genExpr draws a small expression of circuit quantities: literals with
// units, the names of the test environment, mag, re, im and conj, and the
// four operations.
func genExpr(t *rapid.T, depth int) string {
	leaves := []string{"230 V", "10∠-30 A", "2 A", "50 Ω", "3+j4 Ω", "j20 Ω", "800 W", "j600 var", "600 var",
		"5 kVA", "3+j4 kVA", "Z", "Z2", "Vs", "0.8", "2", "10 mS", "1∠120"}
	if depth <= 0 || rapid.IntRange(0, 2).Draw(t, "leaf") == 0 {
		return rapid.SampledFrom(leaves).Draw(t, "lit")
	}
	switch rapid.IntRange(0, 3).Draw(t, "form") {
	case 0:
		f := rapid.SampledFrom([]string{"mag", "re", "im", "conj"}).Draw(t, "fn")
		return f + "(" + genExpr(t, depth-1) + ")"
	case 1:
		return "(" + genExpr(t, depth-1) + ")^2"
	}
	op := rapid.SampledFrom([]string{"+", "-", "*", "/"}).Draw(t, "op")
	return "(" + genExpr(t, depth-1) + ") " + op + " (" + genExpr(t, depth-1) + ")"
}

// TestPropKindDisplayJSON: over random expressions, what the text shows
// agrees with the JSON: the same unit, and an angle shown exactly when the
// JSON kind is one that has an angle (the kinds of IEC 60050-131 and IEEE
// Std 1459-2010 as the package comment lists them).
func TestPropKindDisplayJSON(t *testing.T) {
	withAngle := map[string]bool{"phasor": true, "impedance": true, "admittance": true, "complex-power": true,
		"phasor-product": true, "complex": true, "complex-ratio": true}
	rapid.Check(t, func(t *rapid.T) {
		src := genExpr(t, 3)
		q, err := evalString(newTestEnv(), src)
		if err != nil {
			return // refused with a message: nothing shown
		}
		js := JSONValue("x", q, RMS)
		kind := jsonField(js, "quantity")
		unit := jsonField(js, "unit")
		text := Format{}.Both(q, false)
		if kind == "angle" {
			return // shown in degrees, held in rad
		}
		first := strings.SplitN(text, " = ", 2)[0]
		if unit != "" && !sameUnit(first[strings.LastIndexByte(first, ' ')+1:], unit) {
			t.Fatalf("%s: text %q does not end in the JSON unit %q (%s)", src, text, unit, kind)
		}
		hasAngle := strings.Contains(text, "∠")
		if hasAngle && !withAngle[kind] {
			t.Fatalf("%s: text %q shows an angle for a %s", src, text, kind)
		}
		if !hasAngle && withAngle[kind] && !q.IsReal() {
			t.Fatalf("%s: text %q shows no angle for a complex %s", src, text, kind)
		}
	})
}

// jsonField reads a string field from one JSON object written by JSONValue.
func jsonField(js, key string) string {
	i := strings.Index(js, `"`+key+`":"`)
	if i < 0 {
		return ""
	}
	rest := js[i+len(key)+4:]
	return rest[:strings.IndexByte(rest, '"')]
}

// sameUnit reports whether a shown unit is the JSON unit, perhaps with an
// SI prefix on its first symbol (kV² for V², /kA for /A).
func sameUnit(shown, unit string) bool {
	if shown == unit {
		return true
	}
	slash := strings.HasPrefix(shown, "/")
	shown, unit = strings.TrimLeft(shown, "/("), strings.TrimLeft(unit, "/(")
	for _, p := range []string{"q", "r", "y", "z", "a", "f", "p", "n", "µ", "m", "k", "M", "G", "T", "P", "E", "Z", "Y", "R", "Q"} {
		if strings.HasPrefix(shown, p) && shown[len(p):] == unit {
			return true
		}
	}
	return slash && shown == unit
}
