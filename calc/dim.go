package calc

import "strings"

// Base dimensions. Electrical work is expressed in volts and amperes rather
// than kilograms and metres so that a derived dimension can be written back
// in the units an engineer reads (V·s/A rather than kg·m²·s⁻²·A⁻²). The
// cycle is a base dimension of its own: Hz counts cycles per second while
// rad/s does not, so f·L can never pass for an impedance.
const (
	BaseVolt = iota
	BaseAmpere
	BaseSecond
	BaseMetre
	BaseCycle
	numBase
)

// Dim is a physical dimension as integer exponents of the base dimensions.
// Products add exponents and quotients subtract them, so any combination
// gets its dimension without a table of pairs.
type Dim [numBase]int8

// Common dimensions.
var (
	Dimensionless       = Dim{}
	DimVoltage          = Dim{BaseVolt: 1}
	DimCurrent          = Dim{BaseAmpere: 1}
	DimTime             = Dim{BaseSecond: 1}
	DimLength           = Dim{BaseMetre: 1}
	DimImpedance        = Dim{BaseVolt: 1, BaseAmpere: -1}
	DimAdmittance       = Dim{BaseVolt: -1, BaseAmpere: 1}
	DimInductance       = Dim{BaseVolt: 1, BaseAmpere: -1, BaseSecond: 1}
	DimCapacitance      = Dim{BaseVolt: -1, BaseAmpere: 1, BaseSecond: 1}
	DimPower            = Dim{BaseVolt: 1, BaseAmpere: 1}
	DimEnergy           = Dim{BaseVolt: 1, BaseAmpere: 1, BaseSecond: 1}
	DimCharge           = Dim{BaseAmpere: 1, BaseSecond: 1}
	DimFrequency        = Dim{BaseSecond: -1, BaseCycle: 1}
	DimAngularFrequency = Dim{BaseSecond: -1}
)

// Mul returns the dimension of a product.
func (d Dim) Mul(e Dim) Dim {
	var r Dim
	for i := range d {
		r[i] = d[i] + e[i]
	}
	return r
}

// Div returns the dimension of a quotient.
func (d Dim) Div(e Dim) Dim {
	var r Dim
	for i := range d {
		r[i] = d[i] - e[i]
	}
	return r
}

// Pow returns the dimension raised to the integer power n.
func (d Dim) Pow(n int) Dim {
	var r Dim
	for i := range d {
		r[i] = d[i] * int8(n)
	}
	return r
}

// Root returns the dimension of the n-th root and whether it exists
// (every exponent divisible by n).
func (d Dim) Root(n int) (Dim, bool) {
	var r Dim
	for i := range d {
		if int(d[i])%n != 0 {
			return Dim{}, false
		}
		r[i] = d[i] / int8(n)
	}
	return r, true
}

// IsDimensionless reports whether all exponents are zero.
func (d Dim) IsDimensionless() bool { return d == Dim{} }

// fits reports whether exponents stay in a range where int8 cannot wrap.
func (d Dim) fits() bool {
	for _, e := range d {
		if e > 60 || e < -60 {
			return false
		}
	}
	return true
}

var baseSymbols = [numBase]string{"V", "A", "s", "m", "cycle"}

// baseString writes the dimension as a product of base units, for example
// "V·s/A"; ascii selects "*" for the multiplication dot and "^" powers.
func (d Dim) baseString(ascii bool) string {
	return d.baseStringPrefixed(ascii, [numBase]string{})
}

// baseStringPrefixed is baseString with a prefix before some units; the
// power written after a unit applies to the prefixed unit (kV² = 10⁶ V²).
func (d Dim) baseStringPrefixed(ascii bool, prefix [numBase]string) string {
	dot := "·"
	if ascii {
		dot = "*"
	}
	var num, den []string
	for i, e := range d {
		if e == 0 {
			continue
		}
		n := int(e)
		if n < 0 {
			n = -n
		}
		s := prefix[i] + baseSymbols[i]
		if n != 1 {
			s += powString(n, ascii)
		}
		if e > 0 {
			num = append(num, s)
		} else {
			den = append(den, s)
		}
	}
	out := strings.Join(num, dot)
	if out == "" && len(den) > 0 {
		out = "1"
	}
	if len(den) == 1 {
		out += "/" + den[0]
	} else if len(den) > 1 {
		out += "/(" + strings.Join(den, dot) + ")"
	}
	return out
}

func powString(n int, ascii bool) string {
	if ascii {
		return "^" + itoa(n)
	}
	const sup = "⁰¹²³⁴⁵⁶⁷⁸⁹"
	digits := []rune(sup)
	s := ""
	for _, c := range itoa(n) {
		s += string(digits[c-'0'])
	}
	return s
}

func itoa(n int) string {
	if n == 0 {
		return "0"
	}
	neg := n < 0
	if neg {
		n = -n
	}
	var b []byte
	for n > 0 {
		b = append([]byte{byte('0' + n%10)}, b...)
		n /= 10
	}
	if neg {
		return "-" + string(b)
	}
	return string(b)
}
