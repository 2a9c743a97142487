package site

import (
	"math"
	"strconv"

	"argand/calc"
)

// Series is one of the IEC 60063 preferred number series.
type Series struct {
	Name      string
	Tolerance float64 // the tolerance the series is usually paired with, ± %
	digits    int     // significant figures of the table entries
	values    []int   // one decade, in units of the last significant figure
}

// The tables of IEC 60063:2015. E6, E12 and E24 are checked in the tests
// against a published tabulation that follows the standard; E48 and E96
// against the rounding rule it states. E6, E12 and E24 are the
// historical values, which are not rounded powers of 10^(1/n): E24 has 2.7,
// 3.0, 3.3, 3.6, 3.9, 4.3, 4.7 and 8.2 where rounding would give 2.6, 2.9,
// 3.2, 3.5, 3.8, 4.2, 4.6 and 8.3. E48 is every other value of E96.
var (
	E6  = Series{"E6", 20, 2, []int{10, 15, 22, 33, 47, 68}}
	E12 = Series{"E12", 10, 2, []int{10, 12, 15, 18, 22, 27, 33, 39, 47, 56, 68, 82}}
	E24 = Series{"E24", 5, 2, []int{10, 11, 12, 13, 15, 16, 18, 20, 22, 24, 27, 30,
		33, 36, 39, 43, 47, 51, 56, 62, 68, 75, 82, 91}}
	E48 = Series{"E48", 2, 3, []int{100, 105, 110, 115, 121, 127, 133, 140, 147, 154, 162, 169,
		178, 187, 196, 205, 215, 226, 237, 249, 261, 274, 287, 301,
		316, 332, 348, 365, 383, 402, 422, 442, 464, 487, 511, 536,
		562, 590, 619, 649, 681, 715, 750, 787, 825, 866, 909, 953}}
	E96 = Series{"E96", 1, 3, []int{100, 102, 105, 107, 110, 113, 115, 118, 121, 124, 127, 130,
		133, 137, 140, 143, 147, 150, 154, 158, 162, 165, 169, 174,
		178, 182, 187, 191, 196, 200, 205, 210, 215, 221, 226, 232,
		237, 243, 249, 255, 261, 267, 274, 280, 287, 294, 301, 309,
		316, 324, 332, 340, 348, 357, 365, 374, 383, 392, 402, 412,
		422, 432, 442, 453, 464, 475, 487, 499, 511, 523, 536, 549,
		562, 576, 590, 604, 619, 634, 649, 665, 681, 698, 715, 732,
		750, 768, 787, 806, 825, 845, 866, 887, 909, 931, 953, 976}}
)

// SeriesByName returns the series named "E6", "E12", "E24", "E48" or "E96".
func SeriesByName(name string) (Series, bool) {
	for _, s := range []Series{E6, E12, E24, E48, E96} {
		if s.Name == name {
			return s, true
		}
	}
	return Series{}, false
}

// Len returns the number of values per decade.
func (s Series) Len() int { return len(s.values) }

// Value returns the i-th value of the decade [1, 10) as a float64.
func (s Series) Value(i int) float64 { return s.scaled(i, 0) }

// scaled returns values[i]·10^(exp − digits + 1), parsed from decimal text
// so that 4.7 kΩ comes out as exactly the float64 nearest 4700.
func (s Series) scaled(i, exp int) float64 {
	var n int
	switch {
	case i < 0:
		n = s.values[0]
	case i >= len(s.values):
		n = s.values[0] * 10
	default:
		n = s.values[i]
	}
	x, _ := strconv.ParseFloat(strconv.Itoa(n)+"e"+strconv.Itoa(exp-s.digits+1), 64)
	return x
}

// Preferred is the choice of preferred values around a computed one.
type Preferred struct {
	Below, Above, Nearest calc.Quantity
	// Errors of each choice relative to the computed value, in per cent:
	// (preferred − computed)/computed·100.
	BelowErr, AboveErr, NearestErr float64
	Step                           calc.Step
}

// Nearest returns the preferred values of series s just below and just
// above x (a positive real resistance, inductance, capacitance or any
// quantity), and the nearer of the two by relative error. A value that is
// itself in the series is both below and above.
func Nearest(x calc.Quantity, s Series) (Preferred, error) {
	if len(s.values) == 0 {
		return Preferred{}, errf("unknown preferred value series")
	}
	if !x.IsReal() || real(x.V) <= 0 {
		return Preferred{}, errf("a preferred value is chosen for a positive real value")
	}
	v := real(x.V)
	if err := finite([]string{"value"}, v); err != nil {
		return Preferred{}, err
	}
	if v < 1e-30 {
		return Preferred{}, errf("value too small for a preferred value (< 1e-30)")
	}
	exp := int(math.Floor(math.Log10(v)))
	// Log10 may land one decade off near exact powers of ten.
	if s.scaled(0, exp) > v {
		exp--
	} else if s.scaled(0, exp+1) <= v {
		exp++
	}
	below := s.scaled(0, exp)
	above := s.scaled(0, exp+1)
	for i := range s.values {
		c := s.scaled(i, exp)
		if c <= v {
			below = c
		}
		if c >= v {
			above = c
			break
		}
	}
	p := Preferred{
		Below:    calc.Quantity{V: complex(below, 0), Dim: x.Dim, Kind: x.Kind},
		Above:    calc.Quantity{V: complex(above, 0), Dim: x.Dim, Kind: x.Kind},
		BelowErr: (below - v) / v * 100,
		AboveErr: (above - v) / v * 100,
	}
	p.Nearest, p.NearestErr = p.Below, p.BelowErr
	if math.Abs(p.AboveErr) < math.Abs(p.BelowErr) {
		p.Nearest, p.NearestErr = p.Above, p.AboveErr
	}
	p.Step = calc.Step{
		Kind:    "preferred",
		Rule:    "nearest values of the " + s.Name + " series (IEC 60063), below and above, by relative error",
		Formula: "error = (preferred − computed)/computed",
		Inputs:  []calc.Operand{op("x", x)},
		Results: []calc.Operand{op("nearest", p.Nearest), op("below", p.Below), op("above", p.Above),
			op("nearest_err_pct", num(p.NearestErr)), op("below_err_pct", num(p.BelowErr)), op("above_err_pct", num(p.AboveErr))},
		Notes: []string{s.Name + " is usually paired with ±" + strconv.FormatFloat(s.Tolerance, 'g', -1, 64) + " % parts"},
	}
	return p, nil
}
