package calc

import (
	"math"
	"math/big"
	"math/cmplx"
	"strconv"
	"strings"
)

// Format holds the display settings shared by every view of a quantity.
type Format struct {
	Digits  int  // significant figures, 1 to 15; 0 means the default of 4
	ASCII   bool // ASCII glyphs only: "ohm", "u", "@", "deg"
	Radians bool // show angles in radians instead of degrees
	// Comma writes the decimal comma (2,2 mH) instead of the point; the
	// SI Brochure (9th ed. §5.4.4) allows either on the line. The input
	// is read the same way (NewParserComma), so what is shown reads back.
	Comma bool
}

// mark writes the decimal marker in force into a number formatted with a
// point.
func (f Format) mark(s string) string {
	if f.Comma {
		return strings.Replace(s, ".", ",", 1)
	}
	return s
}

// DefaultDigits is the number of significant figures shown when none is set.
const DefaultDigits = 4

// MaxDigits bounds the significant figures. 17 are enough to tell any two
// float64 values apart, so a value shown at 17 digits parses back exactly;
// beyond 15 the last figures show the binary value's decimal expansion
// rather than anything measured.
const MaxDigits = 17

func (f Format) digits() int {
	if f.Digits <= 0 {
		return DefaultDigits
	}
	if f.Digits > MaxDigits {
		return MaxDigits
	}
	return f.Digits
}

// Tiny is the relative size below which a part is a rounding leftover and
// shown as 0: of the other part of the same value (rounding noise in 3∠90°
// must not print as 1.837e-16 + j3), and of the largest term of a sum
// (Leftover).
const Tiny = 1e-12

const tiny = Tiny

// NormDeg reduces an angle in degrees to (−180, 180], turning −0 and −180
// into 0 and 180.
func NormDeg(d float64) float64 {
	d = math.Mod(d, 360)
	if d <= -180 {
		d += 360
	} else if d > 180 {
		d -= 360
	}
	if d == 0 {
		return 0 // also clears −0
	}
	return d
}

// Deg returns the angle of v in degrees, in (−180, 180]. A part below
// 1e-12 of the magnitude is treated as zero, so the angle of what is shown
// as a real number is exactly 0 or 180.
func Deg(v complex128) float64 {
	re, im := cleanParts(v)
	if re == 0 && im == 0 {
		return 0
	}
	return NormDeg(math.Atan2(im, re) * 180 / math.Pi)
}

// cleanParts returns the parts of v with any part below tiny·|v| set to 0.
func cleanParts(v complex128) (float64, float64) {
	re, im := real(v), imag(v)
	m := cmplx.Abs(v)
	if math.Abs(re) < tiny*m {
		re = 0
	}
	if math.Abs(im) < tiny*m {
		im = 0
	}
	return re + 0, im + 0 // + 0 turns −0 into 0
}

// engScale returns the exponent (a multiple of 3) and the number of decimals
// that show x (≥ 0) to the given significant figures in engineering form.
func engScale(x float64, digits int) (exp3, decimals int) {
	if x == 0 {
		return 0, digits - 1
	}
	e := decExp(x, digits)
	exp3 = int(math.Floor(float64(e) / 3))
	exp3 *= 3
	decimals = digits - 1 - (e - exp3)
	if decimals < 0 {
		decimals = 0
	}
	return exp3, decimals
}

// decExp returns the decimal exponent of x (≠ 0) rounded to the given
// significant figures, so that 999.96 at 4 digits has exponent 3. It reads
// the exponent from strconv's 'e' form, which is exact, rather than from
// math.Log10, which is off for subnormal numbers (Log10(1e-320) ≈ −307.95).
func decExp(x float64, digits int) int {
	s := strconv.FormatFloat(x, 'e', digits-1, 64)
	i := strings.LastIndexByte(s, 'e')
	e, _ := strconv.Atoi(s[i+1:])
	return e
}

func abs(n int) int {
	if n < 0 {
		return -n
	}
	return n
}

// scale10 returns x/10^e, in two steps where 10^e alone would be subnormal
// and lose digits.
func scale10(x float64, e int) float64 {
	if e < -290 {
		return x * 1e300 / math.Pow(10, float64(e+300))
	}
	return x / math.Pow(10, float64(e))
}

var prefixFor = map[int]string{-30: "q", -27: "r", -24: "y", -21: "z", -18: "a", -15: "f", -12: "p", -9: "n", -6: "µ", -3: "m",
	0: "", 3: "k", 6: "M", 9: "G", 12: "T", 15: "P", 18: "E", 21: "Z", 24: "Y", 27: "R", 30: "Q"}

// fixed formats x/10^exp3 with the given decimals, never as "-0.000".
// Beyond 15 significant figures the division by 10^exp3 would round in
// binary first, so there the exact decimal value of x is scaled instead,
// and the figures shown are those of x itself.
func fixed(x float64, exp3, decimals int) string {
	var s string
	// (the scaled value has at most three figures before its point)
	if exp3 != 0 && x != 0 && decimals > 12 && decimals+max(0, decExp(math.Abs(x), 15)-exp3+1) > 15 {
		r := new(big.Rat).SetFloat64(x)
		p := new(big.Rat).SetFrac(big.NewInt(1), new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(abs(exp3))), nil))
		if exp3 < 0 {
			p.Inv(p)
		}
		s = r.Mul(r, p).FloatString(decimals)
	} else {
		s = strconv.FormatFloat(scale10(x, exp3), 'f', decimals, 64)
	}
	if strings.HasPrefix(s, "-") && strings.Trim(s, "-0.") == "" {
		s = s[1:]
	}
	return s
}

// scaled chooses how to write numbers of size m with unit sym: an SI prefix
// (q … Q) on a named unit; on a unit written as a product of base units
// (V², /s, V·s/A) a prefix on its first unit, which binds before that
// unit's power (kV² is 10⁶ V², SI Brochure 9th ed., §5.4.1), so the
// number may fall below 1 (0.05290 kV²). Only a size beyond the prefixes'
// range takes an exponent. Numbers are written without digit groups so that
// what is shown reads back.
func (f Format) scaled(m float64, d Dim, k Kind) (exp3, decimals int, unit, expo string) {
	exp3, decimals = engScale(m, f.digits())
	sym := UnitSymbol(d, k, f.ASCII)
	e := 0
	if m != 0 {
		e = decExp(m, f.digits())
	}
	if sym == "" && k == KindCount && m == math.Trunc(m) && m < 1e15 {
		return 0, 0, "", "" // a count is a whole number as it is
	}
	if k == KindPercent && d.IsDimensionless() {
		// a ratio read in per cent: the figures of 100·m, scaled by
		// exp3 = −2, with the sign % (which reads back as 0.01); a size
		// far from 1 % keeps the plain ratio's form
		pe := 0
		if m != 0 {
			pe = decExp(m*100, f.digits())
		}
		if m == 0 || pe >= -3 && pe < f.digits()+2 {
			return -2, max(0, f.digits()-1-pe), " %", ""
		}
	}
	if sym == "" && (m == 0 || e >= -3 && e < f.digits()) {
		// plain numbers read better without an exponent, as long as no
		// more figures show than are significant (30002 at 4 figures is
		// 30.00×10^3, not 30002) and not many zeros lead
		decimals = f.digits() - 1 - e
		if decimals < 0 {
			decimals = 0
		}
		return 0, decimals, "", ""
	}
	p, ok := prefixFor[exp3]
	if ok && sym == "var" && p == "m" {
		// "mvar" is refused on input (mega or milli?), so it is never shown
		return 0, decimals + 3, " " + sym, ""
	}
	if ok && sym != "" && prefixable(d) && !strings.HasPrefix(sym, "/") {
		if p == "µ" && f.ASCII {
			p = "u"
		}
		return exp3, decimals, " " + p + sym, ""
	}
	if sym != "" && m != 0 {
		if scale, u, ok := basePrefix(m, d, k, f.ASCII); ok {
			y := scale10(m, scale)
			dec := f.digits() - 1 - decExp(y, f.digits())
			if dec < 0 {
				dec = 0
			}
			return scale, dec, " " + u, ""
		}
	}
	if exp3 != 0 {
		expo = f.timesTen(exp3)
	}
	if sym != "" {
		unit = " " + sym
	}
	return exp3, decimals, unit, expo
}

// timesTen writes the power of ten that a size beyond the SI prefixes, or
// a plain number far from 1, is shown with: ×10^-21 (ASCII *10^-21). It is
// read back as part of the number; e-notation is not shown to people.
func (f Format) timesTen(e int) string {
	if f.ASCII {
		return "*10^" + strconv.Itoa(e)
	}
	return "×10^" + strconv.Itoa(e)
}

// basePrefix finds a prefix for the first unit of a product of base units
// such that the number before it is at least 1 and below 1000 to the power
// of that unit's exponent. It returns the decimal scale and the unit.
func basePrefix(m float64, d Dim, k Kind, ascii bool) (int, string, bool) {
	if sym := UnitSymbol(d, k, ascii); sym != strings.TrimPrefix(d.baseString(ascii), "1") {
		return 0, "", false
	}
	idx := -1
	for i, x := range d {
		if x > 0 && i != BaseCycle {
			idx = i
			break
		}
	}
	if idx < 0 {
		for i, x := range d {
			if x < 0 && i != BaseCycle {
				idx = i
				break
			}
		}
	}
	if idx < 0 {
		return 0, "", false
	}
	n := int(d[idx])
	abs := n
	if abs < 0 {
		abs = -abs
	}
	// the number before the unit in [1, 1000) where a prefix gives it,
	// else in [0.001, 1), else anything the range allows
	windows := [][2]float64{{1, 1000}, {1e-3, 1}, {1, math.Pow(10, float64(3*abs))}}
	for _, win := range windows {
		for p := -30; p <= 30; p += 3 {
			y := scale10(m, n*p)
			if y < win[0] || y >= win[1] {
				continue
			}
			pre := prefixFor[p]
			if pre == "µ" && ascii {
				pre = "u"
			}
			var ps [numBase]string
			ps[idx] = pre
			// a reciprocal is written /ms, as it is read back
			return n * p, strings.TrimPrefix(d.baseStringPrefixed(ascii, ps), "1"), true
		}
	}
	return 0, "", false
}

// Rect formats q in rectangular form, both parts to one prefix chosen from
// the magnitude: "3.000 + j4.000 Ω".
func (f Format) Rect(q Quantity) string {
	if q.Kind == KindAngle && q.IsReal() && q.Dim.IsDimensionless() {
		return f.AngleValue(real(q.V))
	}
	re, im := cleanParts(q.V)
	m := cmplx.Abs(q.V)
	exp3, dec, unit, expo := f.scaled(m, q.Dim, q.Kind)
	// the smaller part keeps its own figures, up to three more decimals,
	// so 10 Ω − j31.83 kΩ reads 0.01000 − j31.83 kΩ rather than 0.01
	partDec := func(x float64) int {
		if x == 0 {
			return dec
		}
		d := f.digits() - 1 - (decExp(math.Abs(x), f.digits()) - exp3)
		if d > dec+3 && f.digits() < MaxDigits {
			// (at the most figures every part shows its own, so that what
			// is shown is the value itself)
			return dec // too small to show its figures: it reads as 0
		}
		return max(d, dec)
	}
	var b strings.Builder
	switch {
	case im == 0:
		b.WriteString(f.mark(fixed(re, exp3, dec)) + expo)
	case re == 0:
		s := f.mark(fixed(im, exp3, dec))
		if strings.HasPrefix(s, "-") {
			b.WriteString("-j" + s[1:] + expo)
		} else {
			b.WriteString("j" + s + expo)
		}
	default:
		b.WriteString(f.mark(fixed(re, exp3, partDec(re))) + expo)
		s := f.mark(fixed(im, exp3, partDec(im)))
		if im < 0 && !strings.HasPrefix(s, "-") {
			// a negative part too small for the figures shown keeps its
			// sign, as the angle shows it (−1.000 − j0.000, ∠-179.99°)
			s = "-" + s
		}
		if strings.HasPrefix(s, "-") {
			b.WriteString(" - j" + s[1:] + expo)
		} else {
			b.WriteString(" + j" + s + expo)
		}
	}
	b.WriteString(unit)
	return b.String()
}

// Polar formats q as magnitude and angle: "5.000 Ω ∠53.13°".
func (f Format) Polar(q Quantity) string {
	if q.Kind == KindAngle && q.IsReal() && q.Dim.IsDimensionless() {
		return f.AngleValue(real(q.V))
	}
	if !q.HasAngle() {
		// a magnitude, a signed real, a real ratio or a zero has no angle
		// to show
		return f.Rect(q)
	}
	m := cmplx.Abs(q.V)
	exp3, dec, unit, expo := f.scaled(m, q.Dim, q.Kind)
	s := f.mark(fixed(m, exp3, dec)) + expo + unit
	if f.ASCII {
		return s + " @" + f.angle(Deg(q.V))
	}
	return s + " ∠" + f.angle(Deg(q.V))
}

// Mag formats a real magnitude with unit: "5.000 Ω".
func (f Format) Mag(x float64, d Dim, k Kind) string {
	exp3, dec, unit, expo := f.scaled(math.Abs(x), d, k)
	return f.mark(fixed(x, exp3, dec)) + expo + unit
}

// angle formats an angle given in degrees in the display unit. An angle
// just above −180° that rounds to −180° at the digits shown is written as
// 180°, the same direction, so that no angle is ever shown as −180°.
func (f Format) angle(deg float64) string {
	n := f.digits()
	var s string
	if f.Radians {
		s = f.mark(sigFixed(deg*math.Pi/180, n))
		if s == f.mark(sigFixed(-math.Pi, n)) {
			s = f.mark(sigFixed(math.Pi, n))
		}
		return s + " rad"
	}
	// an angle near the negative real axis that rounds to ±180° keeps up
	// to three more figures, so that it agrees in sign with the imaginary
	// part shown in rectangular form (−179.97°, not 180.0°)
	for m, top := n, n+3; m < top && m < MaxDigits && math.Abs(deg) != 180 &&
		(sigFixed(deg, m) == sigFixed(-180, m) || sigFixed(deg, m) == sigFixed(180, m)); m++ {
		n = m + 1
	}
	s = f.mark(f.sig(deg, n))
	if s == f.mark(sigFixed(-180, n)) {
		s = f.mark(sigFixed(180, n))
	}
	if f.ASCII {
		return s + " deg"
	}
	return s + "°"
}

// AngleValue formats an angle held in radians.
//
// An angle of more than half a turn either way (2π, 540°) is a count of
// turns rather than a direction: it is shown in radians as it is, since
// reducing it to (−180°, 180°] would hide the turns.
func (f Format) AngleValue(rad float64) string {
	if rad > math.Pi || rad <= -math.Pi {
		if rad == -math.Pi {
			return f.angle(180)
		}
		return f.mark(sigFixed(rad, f.digits())) + " rad"
	}
	return f.angle(rad * 180 / math.Pi)
}

// Angle formats the angle of v in the display unit, for example "53.13°".
func (f Format) Angle(v complex128) string { return f.angle(Deg(v)) }

// sig writes x to the given significant figures as sigFixed does, except
// that a value below 0.0001 in size (a leftover of rounding, as an angle of
// −1.421×10^-14°) is written m×10^e with an engineering exponent rather
// than behind a run of zeros.
func (f Format) sig(x float64, digits int) string {
	a := math.Abs(x)
	if a == 0 || a < 1e-15 || a >= 1e-4 {
		return sigFixed(x, digits)
	}
	exp3, dec := engScale(a, digits)
	return fixed(x, exp3, dec) + f.timesTen(exp3)
}

// sigFixed writes x to the given significant figures without an exponent
// where that stays readable, and with one (which parses back) where x is
// very small.
func sigFixed(x float64, digits int) string {
	if x == 0 {
		return "0"
	}
	a := math.Abs(x)
	if a < 1e-15 {
		return "0" // a leftover of rounding, not an angle or a per cent
	}
	e := decExp(a, digits)
	dec := digits - 1 - e
	if dec < 0 {
		dec = 0
	}
	s := strconv.FormatFloat(x, 'f', dec, 64)
	if strings.HasPrefix(s, "-") && strings.Trim(s, "-0.") == "" {
		s = s[1:]
	}
	return s
}

// Both formats q in rectangular and polar form separated by " = ", polar
// first when polarFirst is set; a real quantity, or a zero, prints once.
func (f Format) Both(q Quantity, polarFirst bool) string {
	r, p := f.Rect(q), f.Polar(q)
	if !q.HasAngle() {
		return r
	}
	if polarFirst {
		return p + " = " + r
	}
	return r + " = " + p
}

// phasorDim reports dimensions whose angle means something to a reader even
// when it is 0: voltages, currents, impedances, admittances, powers.
func phasorDim(d Dim) bool {
	switch d {
	case DimVoltage, DimCurrent, DimImpedance, DimAdmittance, DimPower:
		return true
	}
	return false
}

// Short formats q in one form for a table: polar for a phasor, the plain
// signed number for a real quantity that is not one (P in W, Q in var, a
// count), so that a leading load's −3 kvar is not shown as 3 kvar ∠180°.
func (f Format) Short(q Quantity) string {
	if !q.HasAngle() {
		return f.Rect(q)
	}
	return f.Polar(q)
}

// SmallRatio writes a dimensionless ratio, such as a residual relative to
// the largest term, to two significant figures as m×10^e (no spaces, so
// a wrapped line never splits it): SI prefixes
// belong to units, not to ratios, and e-notation is not shown to people.
// Ratios from 0.01 to 1000 are written plainly.
func SmallRatio(x float64) string {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return "undefined"
	}
	if x == 0 {
		return "0"
	}
	ax := math.Abs(x)
	if ax >= 0.01 && ax < 1000 {
		return strconv.FormatFloat(x, 'g', 2, 64)
	}
	s := strconv.FormatFloat(x, 'e', 1, 64) // m.me±XX
	i := strings.IndexByte(s, 'e')
	exp, _ := strconv.Atoi(s[i+1:])
	return s[:i] + "×10^" + strconv.Itoa(exp)
}
