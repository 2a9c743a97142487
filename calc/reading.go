package calc

import (
	"fmt"
	"strings"
	"unicode/utf8"
)

// Language is the version of the input language this build reads. A
// worksheet that declares another version with a "language N" line is
// replayed with a list of the lines whose reading changed since then.
//
//   - 1: units exactly as the SI Brochure writes them, a prefix only
//     directly before a unit symbol.
//   - 2: also bare prefixes (4.7k), the letter-and-digit codes of IEC 60062
//     (4K7, 0R1, 4n7), units typed in another case (230 v, kw) and part
//     values inside impedance arithmetic.
//   - 3: the decimal comma: under "decimal comma" 2,2 is two point two and
//     ';' separates arguments; under the decimal point a comma with
//     digits on both sides and no space (2,2 or 1,000) is refused, where
//     language 2 read it as two arguments. The decimal statement is new.
const Language = 3

// reading says how a word after a number was read, when it was not read
// exactly as written: why (added to the note shown in the step), and the
// language version that introduced the reading (0 for an exact reading).
type reading struct {
	why   string
	since int
}

// bareOK are the prefixes read on their own after a number (4.7k, 100n):
// the common ones on parts and drawings. The rare ones (a, z, y, r, q, E,
// P, Z, Y, R, Q) would turn slips into huge or tiny numbers.
var bareOK = map[string]float64{
	"f": 1e-15, "p": 1e-12, "n": 1e-9, "u": 1e-6, "µ": 1e-6, "μ": 1e-6,
	"m": 1e-3, "k": 1e3, "M": 1e6, "G": 1e9, "T": 1e12,
}

// foldUnits maps a unit symbol or spelled name, in lower case, to the
// symbol it stands for, for units typed in another case. Symbols that
// differ only by case (s for second, S for siemens) are left out, so a
// lower-case s is only ever the second.
var foldUnits = map[string]string{
	"v": "V", "a": "A", "w": "W", "va": "VA", "var": "var", "hz": "Hz",
	"h": "H", "f": "F", "ohm": "Ω", "ohms": "Ω", "j": "J", "c": "C",
	"wb": "Wb", "volt": "V", "volts": "V", "amp": "A", "amps": "A",
	"ampere": "A", "watt": "W", "watts": "W", "henry": "H", "farad": "F",
	"siemens": "S", "hp": "hp",
}

// megaLoose are the units whose lower-case "m" site usage writes for mega
// as often as for milli, so neither is assumed.
var megaLoose = map[string]bool{"W": true, "VA": true, "var": true, "Hz": true}

// readUnit reads a word written after a number as a unit, in the order the
// README gives: the exact unit; an exact prefix and unit; a prefix and a
// unit typed in another case (with a note). It returns ok false when the
// word is no unit, and a message when it is refused outright.
func readUnit(word string) (u unitDef, sym string, rd reading, refuse string, ok bool) {
	if word == "mvar" {
		return unitDef{}, "", reading{}, `"mvar" could be milli or mega: write Mvar for mega, or the value in var for milli (as in 0.002 var)`, true
	}
	if d, ok := lookupUnit(word); ok {
		return d, word, reading{}, "", true
	}
	// a unit in another case, with or without a prefix whose case is kept
	// (not a lone f: after a number that is femto or the working frequency)
	if s, ok := foldUnits[strings.ToLower(word)]; ok && word != "f" {
		d := units[s]
		return d, s, reading{since: 2}, "", true
	}
	_, n := utf8.DecodeRuneInString(word)
	if n == 0 || n == len(word) {
		return unitDef{}, "", reading{}, "", false
	}
	p, rest := word[:n], word[n:]
	s, ok := foldUnits[strings.ToLower(rest)]
	if !ok {
		if _, exact := units[rest]; exact && p == "K" {
			s, ok = rest, true
		}
	}
	if !ok {
		return unitDef{}, "", reading{}, "", false
	}
	d := units[s]
	if !d.prefixable {
		return unitDef{}, "", reading{}, "", false
	}
	switch {
	case p == "K":
		d.scale *= 1e3
		return d, "k" + s, reading{why: "the prefix kilo is a lower-case k", since: 2}, "", true
	case p == "m" && megaLoose[s]:
		return unitDef{}, "", reading{}, fmt.Sprintf("%q could be milli or mega: write m%s for milli or M%s for mega", word, s, s), true
	}
	f, isPrefix := prefixes[p]
	if !isPrefix {
		return unitDef{}, "", reading{}, "", false
	}
	d.scale *= f
	rd = reading{since: 2}
	if p == "u" {
		p = "µ"
	}
	if p == "m" {
		rd.why = "m is milli; mega is M"
	}
	return d, p + s, rd, "", true
}

// symbolOf is the symbol of a unit written by its spelled name (ohm is Ω),
// for notes that say how a number was read.
func symbolOf(word string) string {
	if s, ok := foldUnits[strings.ToLower(word)]; ok && len(word) > 2 {
		return s
	}
	return word
}

// readCode reads a letter-and-digit code written directly after digits, as
// printed on parts and drawings (IEC 60062): the letter stands for the
// decimal sign and the multiplier. R K M G T mark resistance (47R, 0R1,
// 4K7, 2M2); p n µ m mark capacitance (4n7, 2µ2). A lower-case k and u are
// accepted as common practice (4k7, 2u2). The word is the text after the
// leading digits; it returns the multiplier, the unit symbol and the
// digits after the letter.
func readCode(word string) (scale float64, pre, sym, frac string, ok bool) {
	r, n := utf8.DecodeRuneInString(word)
	frac = word[n:]
	for i := 0; i < len(frac); i++ {
		if !isDigit(rune(frac[i])) {
			return 0, "", "", "", false
		}
	}
	switch r {
	case 'R':
		return 1, "", "Ω", frac, true
	case 'K', 'k':
		if r == 'k' && frac == "" {
			return 0, "", "", "", false // 10k is a bare prefix
		}
		return 1e3, "k", "Ω", frac, true
	}
	if frac == "" {
		return 0, "", "", "", false // 1M, 100n: bare prefixes
	}
	switch r {
	case 'M':
		return 1e6, "M", "Ω", frac, true
	case 'G':
		return 1e9, "G", "Ω", frac, true
	case 'T':
		return 1e12, "T", "Ω", frac, true
	case 'p':
		return 1e-12, "p", "F", frac, true
	case 'n':
		return 1e-9, "n", "F", frac, true
	case 'u', 'µ', 'μ':
		return 1e-6, "µ", "F", frac, true
	case 'm':
		return 1e-3, "m", "F", frac, true
	}
	return 0, "", "", "", false
}
