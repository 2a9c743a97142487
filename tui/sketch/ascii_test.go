package sketch

import "testing"

// TestASCIISubst: the ASCII spellings of the characters likely in labels
// and units, every one of them, and the SI prefixes f to T (SI Brochure
// 9th ed., table 7) by power of ten.
func TestASCIISubst(t *testing.T) {
	want := map[rune]string{
		'Ω': "ohm", 'µ': "u", 'μ': "u", '°': "deg", 'φ': "phi", 'θ': "theta",
		'∠': "@", '·': ".", '−': "-", '×': "x",
		'₀': "0", '₁': "1", '₂': "2", '₃': "3", '₄': "4", '₅': "5", '₆': "6", '₇': "7", '₈': "8", '₉': "9",
		'⁰': "0", '¹': "1", '²': "2", '³': "3", '⁴': "4", '⁵': "5", '⁶': "6", '⁷': "7", '⁸': "8", '⁹': "9",
	}
	for r, w := range want {
		if got, ok := asciiSubst(r); !ok || got != w {
			t.Errorf("asciiSubst(%q) = %q, %v; want %q", r, got, ok, w)
		}
	}
	for _, r := range []rune{'⁺', '₊', 'ⁱ', '∞', 'é', '⁽'} {
		if got, ok := asciiSubst(r); ok {
			t.Errorf("asciiSubst(%q) = %q, want none", r, got)
		}
	}
	prefixes := map[int]string{-15: "f", -12: "p", -9: "n", -6: "µ", -3: "m", 0: "", 3: "k", 6: "M", 9: "G", 12: "T"}
	for e := -21; e <= 18; e++ {
		got, ok := prefix(e)
		w, has := prefixes[e]
		if ok != has || got != w {
			t.Errorf("prefix(%d) = %q, %v; want %q, %v", e, got, ok, w, has)
		}
	}
}
