package calc

import (
	"strings"
	"testing"
)

// The SI Brochure (9th ed., BIPM 2019, §5.4.4) allows the point or the
// comma on the line as the decimal marker, and writes digit groups of
// three with a space, never with a point or a comma. These tests hold
// argand's two settings to that.

// TestDecimalCommaReads: under the decimal comma, ',' marks the decimal
// and ';' separates arguments; the values are those of the point forms.
func TestDecimalCommaReads(t *testing.T) {
	cases := []struct{ comma, point string }{
		{"2,2 mH", "2.2 mH"},
		{"0,95", "0.95"},
		{",5", ".5"},
		{"4,7e3 Ω", "4.7e3 Ω"},
		{"3+j4,5 Ω", "3+j4.5 Ω"},
		{"3,5-4,25j", "3.5-4.25j"},
		{"j2,5", "j2.5"},
		{"230∠-30,5 V", "230∠-30.5 V"},
		{"atan2(4,5; 3)", "atan2(4.5, 3)"},
		{"2,2k ohm", "2.2k ohm"},
		{"1 000 V", "1000 V"},
		{"1 000 000,5", "1000000.5"},
		{"12 345,678 9", "12345.678"}, // a group after the marker is not read: see below
	}
	for _, c := range cases[:len(cases)-1] {
		got, err := evalStringComma(newTestEnv(), c.comma, true)
		if err != nil {
			t.Errorf("%q under decimal comma: %v", c.comma, err)
			continue
		}
		want := mustEval(t, c.point)
		if got.V != want.V || got.Dim != want.Dim {
			t.Errorf("%q under decimal comma = %v %v, want %v %v (as %q)", c.comma, got.V, got.Dim, want.V, want.Dim, c.point)
		}
	}
	// digit groups are read in the whole part only: after the marker a
	// space still separates two numbers, which is refused
	if _, err := evalStringComma(newTestEnv(), cases[len(cases)-1].comma, true); err == nil {
		t.Errorf("%q: digits after a space in the fraction were read", cases[len(cases)-1].comma)
	}
}

// TestDigitGroups: a space between groups of three digits continues a
// whole number under either marker (SI Brochure §5.4.4); anything else
// after a space is not a group.
func TestDigitGroups(t *testing.T) {
	for _, comma := range []bool{false, true} {
		for src, want := range map[string]float64{
			"1 000":             1000,
			"12 345":            12345,
			"123 456 789":       123456789,
			"1\u2009000 V":      1000,
			"1\u202f000 V":      1000,
			"1\u00a0000\u00a0V": 1000,
		} {
			q, err := evalStringComma(newTestEnv(), src, comma)
			if err != nil {
				t.Errorf("%q (comma %v): %v", src, comma, err)
				continue
			}
			if real(q.V) != want {
				t.Errorf("%q (comma %v) = %v, want %v", src, comma, q.V, want)
			}
		}
		for _, src := range []string{"1 00", "1 0000", "1234 567", "1 000 00"} {
			if _, err := evalStringComma(newTestEnv(), src, comma); err == nil {
				t.Errorf("%q (comma %v): read as one number", src, comma)
			}
		}
	}
}

// TestDecimalMarkerRefused: the marker not in force, with digits on both
// sides, is refused everywhere with the exact thing to type.
func TestDecimalMarkerRefused(t *testing.T) {
	cases := []struct {
		src   string
		comma bool
		col   int
		msg   string
	}{
		{"2,2 mH", false, 1, "decimal comma? write 2.2 mH, or set decimal comma"},
		{"0,95", false, 1, "decimal comma? write 0.95, or set decimal comma"},
		{"max(2,2)", false, 5, "decimal comma? write 2.2, or set decimal comma (for two arguments write 2, 2)"},
		{"parallel(2,2 kΩ, 4,7 kΩ)", false, 10, "decimal comma? write 2.2 kΩ, or set decimal comma (for two arguments write 2, 2)"},
		{"3+j4,5 Ω", false, 1, "decimal comma? write 3+j4.5 Ω, or set decimal comma"},
		{"1,000 V", false, 1, `"1,000 V" reads two ways: 1.000 V with a decimal comma, or 1 000 V with the , grouping digits (digit groups are written with a space, SI Brochure §5.4.4): write the one you mean, or set decimal comma for the first`},
		{"1,000,000 V", false, 1, "digit groups are written with a space (SI Brochure §5.4.4): write 1 000 000 V"},
		{"1,000.5 V", false, 1, "digit groups are written with a space (SI Brochure §5.4.4): write 1 000.5 V"},
		{"2.2 mH", true, 1, "decimal point? write 2,2 mH, or set decimal point"},
		{"1.000 V", true, 1, `"1.000 V" reads two ways: 1,000 V with a decimal point, or 1 000 V with the . grouping digits (digit groups are written with a space, SI Brochure §5.4.4): write the one you mean, or set decimal point for the first`},
		{"1.000.000", true, 1, "digit groups are written with a space (SI Brochure §5.4.4): write 1 000 000"},
		{".5", true, 1, "decimal point? write 0,5, or set decimal point"},
		{"max(2, 3)", true, 6, "with the decimal comma set, ',' marks the decimal: separate arguments with ';', as in parallel(2,2 kΩ; 4,7 kΩ)"},
		{"max(1.5,2)", false, 5, `"1.5,2" has two decimal markers: for two arguments write 1.5, 2`},
		{"max(1,5.2)", true, 5, `"1,5.2" has two decimal markers: for two arguments write 1,5; 2`},
		{"max(2; 3)", false, 6, "';' separates arguments only with the decimal comma set: write ',', as in parallel(2.2 kΩ, 4.7 kΩ)"},
	}
	for _, c := range cases {
		_, err := ParseExprComma(c.src, 1, c.comma)
		if err == nil {
			t.Errorf("%q (comma %v): accepted", c.src, c.comma)
			continue
		}
		if err.Msg != c.msg || err.Col != c.col {
			t.Errorf("%q (comma %v):\n got col %d %q\nwant col %d %q", c.src, c.comma, err.Col, err.Msg, c.col, c.msg)
		}
		checkErr(t, c.src, err)
	}
	// a comma after a space is the argument separator, as it always was
	for _, src := range []string{"max(2, 2)", "atan2(4 ,3)", "max(2 ,2)"} {
		if _, err := ParseExpr(src, 1); err != nil {
			t.Errorf("%q: %v", src, err)
		}
	}
}

// TestDecimalCommaShown: values are written with the marker in force, and
// the comma never appears in a value written with the point.
func TestDecimalCommaShown(t *testing.T) {
	q := Q(3+4.5i, DimImpedance)
	pt, cm := Format{Digits: 4}, Format{Digits: 4, Comma: true}
	for _, c := range []struct{ got, want string }{
		{cm.Rect(q), "3,000 + j4,500 Ω"},
		{pt.Rect(q), "3.000 + j4.500 Ω"},
		{cm.Polar(q), "5,408 Ω ∠56,31°"},
		{cm.Mag(2.2e-3, DimInductance, KindPlain), "2,200 mH"},
		{cm.AngleValue(-0.5), "-28,65°"},
		{Format{Digits: 4, Comma: true, Radians: true}.AngleValue(1), "1,000 rad"},
	} {
		if c.got != c.want {
			t.Errorf("got %q, want %q", c.got, c.want)
		}
	}
	if s := pt.Both(q, false); strings.Contains(s, ",") {
		t.Errorf("point format %q has a comma", s)
	}
	// JSON numbers are the same whatever the setting: JSONValue takes no
	// format at all
	if j := JSONValue("z", q, RMS); !strings.Contains(j, `"re":3,"im":4.5`) {
		t.Errorf("JSON %s", j)
	}
}
