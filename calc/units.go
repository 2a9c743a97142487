package calc

import (
	"math"
	"strconv"
	"strings"
)

// unitDef is one unit symbol or spelled name.
type unitDef struct {
	scale      float64
	dim        Dim
	kind       Kind
	prefixable bool
}

// units lists every unit word argand reads. Spelled names are accepted on
// input; output always uses the symbol (SI Brochure, 9th ed., §5.2).
// Lookups never write to it.
var units = map[string]unitDef{
	"Ω":       {1, DimImpedance, KindPlain, true},
	"ohm":     {1, DimImpedance, KindPlain, true},
	"ohms":    {1, DimImpedance, KindPlain, true},
	"S":       {1, DimAdmittance, KindPlain, true},
	"siemens": {1, DimAdmittance, KindPlain, false},
	"H":       {1, DimInductance, KindPlain, true},
	"henry":   {1, DimInductance, KindPlain, false},
	"F":       {1, DimCapacitance, KindPlain, true},
	"farad":   {1, DimCapacitance, KindPlain, false},
	"V":       {1, DimVoltage, KindPlain, true},
	"volt":    {1, DimVoltage, KindPlain, false},
	"volts":   {1, DimVoltage, KindPlain, false},
	"A":       {1, DimCurrent, KindPlain, true},
	"amp":     {1, DimCurrent, KindPlain, false},
	"amps":    {1, DimCurrent, KindPlain, false},
	"ampere":  {1, DimCurrent, KindPlain, false},
	"W":       {1, DimPower, KindActive, true},
	"watt":    {1, DimPower, KindActive, false},
	"watts":   {1, DimPower, KindActive, false},
	"var":     {1, DimPower, KindReactive, true},
	"VA":      {1, DimPower, KindApparent, true},
	"J":       {1, DimEnergy, KindPlain, true},
	"C":       {1, DimCharge, KindPlain, true},
	"Wb":      {1, Dim{BaseVolt: 1, BaseSecond: 1}, KindPlain, true},
	"Hz":      {1, DimFrequency, KindPlain, true},
	"s":       {1, DimTime, KindPlain, true},
	"m":       {1, DimLength, KindPlain, true},
	"rad":     {1, Dimensionless, KindAngle, true}, // mrad; krad/s as shown for ω
	"deg":     {math.Pi / 180, Dimensionless, KindAngle, false},
	"°":       {math.Pi / 180, Dimensionless, KindAngle, false},
	"%":       {0.01, Dimensionless, KindPlain, false},
	// a count of cycles, as f·t gives: 50 Hz × 20 ms = 1 cycle
	"cycle":  {1, Dim{BaseCycle: 1}, KindPlain, true},
	"cycles": {1, Dim{BaseCycle: 1}, KindPlain, false},
	// mechanical horsepower, 550 ft·lbf/s = 745.699 871 582 270 22 W
	// (NIST SP 811, appendix B.8, from memory)
	"hp": {745.69987158227022, DimPower, KindActive, false},
	// metric horsepower, 75 kgf·m/s = 75 × 9.806 65 W = 735.498 75 W
	// (NIST SP 811, appendix B.8, "horsepower, metric", from memory); a
	// name of its own so that the two are never confused
	"hp_metric": {735.49875, DimPower, KindActive, false},
}

// prefixes are the SI prefixes argand reads (SI Brochure, 9th ed., table 7).
// "u" stands in for µ where the keyboard has none, as NIST SP 811 allows
// only in such cases; both the micro sign U+00B5 and Greek mu U+03BC count.
var prefixes = map[string]float64{
	"f": 1e-15, "p": 1e-12, "n": 1e-9, "u": 1e-6, "µ": 1e-6, "μ": 1e-6,
	"m": 1e-3, "k": 1e3, "M": 1e6, "G": 1e9, "T": 1e12,
}

// lookupUnit resolves one unit word, with an optional prefix. An exact unit
// name wins over a prefix reading, so "m" is the metre and "mS" is the
// millisiemens while "ms" is the millisecond.
func lookupUnit(word string) (unitDef, bool) {
	if u, ok := units[word]; ok {
		return u, true
	}
	for p, f := range prefixes {
		if !strings.HasPrefix(word, p) {
			continue
		}
		u, ok := units[word[len(p):]]
		if !ok || !u.prefixable {
			continue
		}
		u.scale *= f
		return u, true
	}
	return unitDef{}, false
}

// IsUnit reports whether word reads as a unit, with or without a prefix.
func IsUnit(word string) bool {
	_, ok := lookupUnit(word)
	return ok
}

// unitName is the display symbol for a dimension and kind.
type unitName struct {
	sym   string // UTF-8 symbol
	ascii string // ASCII stand-in
}

var dimNames = map[Dim]unitName{
	DimImpedance:                 {"Ω", "ohm"},
	DimAdmittance:                {"S", "S"},
	DimInductance:                {"H", "H"},
	DimCapacitance:               {"F", "F"},
	DimVoltage:                   {"V", "V"},
	DimCurrent:                   {"A", "A"},
	DimEnergy:                    {"J", "J"},
	DimCharge:                    {"C", "C"},
	DimFrequency:                 {"Hz", "Hz"},
	DimAngularFrequency:          {"rad/s", "rad/s"},
	DimTime:                      {"s", "s"},
	DimLength:                    {"m", "m"},
	{BaseVolt: 1, BaseSecond: 1}: {"Wb", "Wb"},
	{BaseVolt: 1, BaseAmpere: -1, BaseMetre: -1}:                {"Ω/m", "ohm/m"},
	{BaseVolt: 1, BaseAmpere: -1, BaseSecond: 1, BaseMetre: -1}: {"H/m", "H/m"},
	{BaseVolt: -1, BaseAmpere: 1, BaseSecond: 1, BaseMetre: -1}: {"F/m", "F/m"},
	{BaseVolt: 1, BaseMetre: -1}:                                {"V/m", "V/m"},
	{BaseAmpere: -1}:                                            {"/A", "/A"},
	{BaseVolt: -1}:                                              {"/V", "/V"},
}

// poweredNames are the named units whose square or cube is written with
// the name (Ω², H²), in a fixed order; V, A, s and m are base units and
// are written so already.
var poweredNames = [...]Dim{DimImpedance, DimAdmittance, DimInductance, DimCapacitance}

// UnitSymbol returns the symbol shown for a quantity: "" for a plain number,
// "VA", "W" or "var" for power by kind, otherwise the unit of its dimension
// or a product of base units.
func UnitSymbol(d Dim, k Kind, ascii bool) string {
	if d == DimPower {
		switch k {
		case KindActive:
			return "W"
		case KindReactive:
			return "var"
		case KindProduct:
			// V·I without the conjugate: its unit is V·A but it is not a
			// power, so it is not written VA
			if ascii {
				return "V*A"
			}
			return "V·A"
		}
		return "VA"
	}
	if d.IsDimensionless() {
		return ""
	}
	// s⁻¹ is rad/s only for an angular rate; 1/(20 ms) is fifty per second
	if d == DimAngularFrequency && k != KindAngle {
		return "/s"
	}
	if n, ok := dimNames[d]; ok {
		if ascii {
			return n.ascii
		}
		return n.sym
	}
	// the square or cube of a named unit is written as that: Ω², not V²/A²
	for _, nd := range poweredNames {
		for n := 2; n <= 3; n++ {
			if d == nd.Pow(n) {
				sym := dimNames[nd].sym
				if ascii {
					return dimNames[nd].ascii + "^" + strconv.Itoa(n)
				}
				return sym + [...]string{2: "²", 3: "³"}[n]
			}
		}
	}
	// a pure reciprocal is written /A², as it reads back, not 1/A²
	b := d.baseString(ascii)
	if strings.HasPrefix(b, "1/") {
		return b[1:]
	}
	return b
}

// prefixable reports whether a display unit may carry an SI prefix: the
// named units may, base-unit products built by baseString may not, since
// "kV·s²" would be ambiguous to read.
func prefixable(d Dim) bool {
	if d == DimPower {
		return true
	}
	n, ok := dimNames[d]
	// "k/A" would read as kilo-per-ampere: a reciprocal takes an exponent
	return ok && !strings.HasPrefix(n.sym, "/")
}

// DimName names a dimension for messages: its unit symbol, or
// "dimensionless".
func DimName(d Dim, ascii bool) string {
	if d.IsDimensionless() {
		return "a plain number"
	}
	if d == DimAngularFrequency {
		return "rad/s"
	}
	s := UnitSymbol(d, KindPlain, ascii)
	return s
}

// DimWord names the physical quantity of a dimension for messages, such
// as "an impedance (Ω)", falling back to its unit symbol.
func DimWord(d Dim) string {
	switch d {
	case DimImpedance:
		return "an impedance (Ω)"
	case DimAdmittance:
		return "an admittance (S)"
	case DimVoltage:
		return "a voltage (V)"
	case DimCurrent:
		return "a current (A)"
	case DimPower:
		return "a power (W, var or VA)"
	case DimInductance:
		return "an inductance (H)"
	case DimCapacitance:
		return "a capacitance (F)"
	case DimFrequency:
		return "a frequency (Hz)"
	}
	return DimName(d, false)
}
