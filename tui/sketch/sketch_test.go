package sketch

import (
	"argand/tui/internal/golden"

	"math"
	"math/cmplx"
	"path/filepath"
	"strings"
	"testing"

	"github.com/mattn/go-runewidth"
	"pgregory.net/rapid"
)

// Example data (invented): a supply voltage, a load current lagging it and
// two impedances.
var example = []Item{
	{"V", 230, "V"},
	{"I", cmplx.Rect(8, -36.87*math.Pi/180), "A"},
	{"Z₁", complex(3, 4), "Ω"},
	{"Z₂", complex(-3, 4), "Ω"},
}

func checkGolden(t *testing.T, name string, lines []string) {
	t.Helper()
	golden.Check(t, filepath.Join("testdata", name+".golden"), strings.Join(lines, "\n")+"\n")
}

func TestGolden(t *testing.T) {
	if runewidth.RuneWidth('·') != 1 || runewidth.RuneWidth('Ω') != 1 {
		t.Skip("East Asian width setting: the Unicode golden files assume narrow ·")
	}
	many := make([]Item, 0, 16)
	for k := 0; k < 16; k++ {
		many = append(many, Item{Label: "I" + string(rune('a'+k)), V: cmplx.Rect(float64(1+k%4), float64(k)*22.5*math.Pi/180), Unit: "A"})
	}
	tests := []struct {
		name  string
		items []Item
		w, h  int
		opt   Options
	}{
		{"example_60x20", example, 60, 20, Options{}},
		{"example_ascii_40x12", example, 40, 12, Options{ASCII: true}},
		{"one_unit_60x16", []Item{{"Ia", 10, "A"}, {"Ib", cmplx.Rect(10, -120*math.Pi/180), "A"}, {"Ic", cmplx.Rect(10, 120*math.Pi/180), "A"}}, 60, 16, Options{ASCII: true}},
		{"zero_and_tiny", []Item{{"I0", 0, "A"}, {"big", complex(0, 100), "A"}, {"tiny", complex(0.01, 0), "A"}}, 40, 12, Options{ASCII: true}},
		{"many_labels", many, 60, 20, Options{ASCII: true}},
		{"not_finite", []Item{{"ok", complex(1, 1), "V"}, {"bad", complex(math.Inf(1), 0), "V"}, {"nan", complex(math.NaN(), 1), "V"}}, 40, 12, Options{ASCII: true}},
		{"empty", nil, 30, 8, Options{ASCII: true}},
		{"too_small", example, 12, 4, Options{}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			checkGolden(t, tt.name, Render(tt.items, tt.w, tt.h, tt.opt))
		})
	}
	tri := []struct {
		name string
		p, q float64
		w, h int
		opt  Options
	}{
		// 8 kW, 6 kvar: S = 10 kVA, φ = 36.87°, pf 0.8, the 3-4-5
		// triangle (common practice).
		{"triangle_lagging", 8000, 6000, 60, 14, Options{}},
		{"triangle_leading_ascii", 8000, -6000, 40, 12, Options{ASCII: true}},
		{"triangle_negative_p", -3000, 4000, 60, 14, Options{ASCII: true}},
		{"triangle_unity", 5000, 0, 40, 8, Options{ASCII: true}},
	}
	for _, tt := range tri {
		t.Run(tt.name, func(t *testing.T) {
			checkGolden(t, tt.name, Triangle(tt.p, tt.q, tt.w, tt.h, tt.opt))
		})
	}
}

func TestEng(t *testing.T) {
	// SI prefixes and the space between number and unit: SI Brochure,
	// 9th ed., and NIST SP 811.
	tests := []struct {
		x      float64
		unit   string
		digits int
		ascii  bool
		want   string
	}{
		{2500, "V", 3, false, "2.50 kV"},
		{230, "V", 3, false, "230 V"},
		{999.96, "V", 3, false, "1.00 kV"},
		{0.0125, "A", 3, false, "12.5 mA"},
		{4.7e-6, "F", 2, false, "4.7 µF"},
		{4.7e-6, "F", 2, true, "4.7 uF"},
		{-6000, "var", 3, false, "-6.00 kvar"},
		{0, "W", 3, false, "0 W"},
		{1e20, "V", 3, false, "100×10^18 V"},
		{12345, "", 3, false, "12.3×10^3"},
		{math.NaN(), "V", 3, false, "not finite"},
	}
	for _, tt := range tests {
		if got := Eng(tt.x, tt.unit, tt.digits, tt.ascii); got != tt.want {
			t.Errorf("Eng(%g, %q, %d, %v) = %q, want %q", tt.x, tt.unit, tt.digits, tt.ascii, got, tt.want)
		}
	}
}

func TestNiceCeil(t *testing.T) {
	tests := []struct{ x, want float64 }{
		{230, 250}, {8, 8}, {8.1, 10}, {1, 1}, {0.011, 0.015}, {1.7e308, 1.7e308},
	}
	for _, tt := range tests {
		if got := niceCeil(tt.x); math.Abs(got-tt.want) > 1e-12*tt.want {
			t.Errorf("niceCeil(%g) = %g, want %g", tt.x, got, tt.want)
		}
	}
}

func TestGlyphs(t *testing.T) {
	tests := []struct {
		deg         float64
		shaft, head rune
	}{
		{0, '-', '>'}, {45, '/', '^'}, {90, '|', '^'}, {135, '\\', '^'},
		{180, '-', '<'}, {-45, '\\', 'v'}, {-90, '|', 'v'}, {-135, '/', 'v'}, {150, '\\', '<'},
		{30, '/', '>'}, {-170, '-', '<'},
	}
	for _, tt := range tests {
		if g := shaftGlyph(tt.deg); g != tt.shaft {
			t.Errorf("shaftGlyph(%g) = %q, want %q", tt.deg, g, tt.shaft)
		}
		if g := headGlyph(tt.deg); g != tt.head {
			t.Errorf("headGlyph(%g) = %q, want %q", tt.deg, g, tt.head)
		}
	}
}

func TestLegendSeparatesUnits(t *testing.T) {
	out := Render(example, 80, 24, Options{ASCII: true})
	last := strings.Join(out[len(out)-2:], " ")
	for _, want := range []string{"own scale per unit", "250 V", "8.00 A", "5.00 ohm"} {
		if !strings.Contains(last, want) {
			t.Errorf("legend %q lacks %q", last, want)
		}
	}
	one := Render([]Item{{"a", 3, "A"}, {"b", 4i, "A"}}, 40, 12, Options{ASCII: true})
	if got := one[len(one)-1]; got != "scale: + = 4.00 A" {
		t.Errorf("single-unit legend %q", got)
	}
}

func TestFormatOption(t *testing.T) {
	opt := Options{ASCII: true, Format: func(x float64, unit string) string { return "<" + unit + ">µ" }}
	out := Render([]Item{{"a", 3, "Ω"}}, 40, 12, opt)
	if got := out[len(out)-1]; got != "scale: + = <ohm>u" {
		t.Errorf("legend with custom format: %q", got)
	}
}

// genItems draws items with awkward labels and values.
func genItems(t *rapid.T) []Item {
	runes := []rune("abcXYZ019 _-Ω₁µφ°∠界\u0301\x07\t😀")
	vals := []float64{0, 1, -1, 0.5, 1e-300, 5e-324, 1e300, 1e308, -7.25, math.NaN(), math.Inf(1)}
	units := []string{"V", "A", "Ω", "", "var"}
	n := rapid.IntRange(0, 30).Draw(t, "n")
	items := make([]Item, n)
	for i := range items {
		lab := rapid.SliceOfN(rapid.SampledFrom(runes), 0, 20).Draw(t, "label")
		re := rapid.OneOf(rapid.SampledFrom(vals), rapid.Float64Range(-1e3, 1e3)).Draw(t, "re")
		im := rapid.OneOf(rapid.SampledFrom(vals), rapid.Float64Range(-1e3, 1e3)).Draw(t, "im")
		items[i] = Item{Label: string(lab), V: complex(re, im), Unit: rapid.SampledFrom(units).Draw(t, "unit")}
	}
	return items
}

func checkShape(t *rapid.T, out []string, width, height int, ascii bool) {
	want := max(min(height, MaxDim), 0)
	if len(out) != want {
		t.Fatalf("%d lines, want %d", len(out), want)
	}
	for i, l := range out {
		if w := runewidth.StringWidth(l); w > max(width, 0) {
			t.Fatalf("line %d is %d cells wide, more than %d: %q", i, w, width, l)
		}
		if ascii {
			for j := 0; j < len(l); j++ {
				if l[j] >= 0x80 {
					t.Fatalf("line %d has byte %#x in ASCII mode: %q", i, l[j], l)
				}
			}
		}
		for _, bad := range []string{"NaN", "Inf", "\x1b", "\t"} {
			if strings.Contains(l, bad) {
				t.Fatalf("line %d contains %q: %q", i, bad, l)
			}
		}
	}
}

func TestRenderShape(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		items := genItems(t)
		w := rapid.IntRange(-2, 200).Draw(t, "w")
		h := rapid.IntRange(-2, 80).Draw(t, "h")
		ascii := rapid.Bool().Draw(t, "ascii")
		checkShape(t, Render(items, w, h, Options{ASCII: ascii}), w, h, ascii)
	})
}

func TestTriangleShape(t *testing.T) {
	vals := []float64{0, 1, -1, 1e-300, 1e300, 1e308, -1e308, math.NaN(), math.Inf(-1)}
	rapid.Check(t, func(t *rapid.T) {
		p := rapid.OneOf(rapid.SampledFrom(vals), rapid.Float64Range(-1e6, 1e6)).Draw(t, "p")
		q := rapid.OneOf(rapid.SampledFrom(vals), rapid.Float64Range(-1e6, 1e6)).Draw(t, "q")
		w := rapid.IntRange(-2, 200).Draw(t, "w")
		h := rapid.IntRange(-2, 80).Draw(t, "h")
		ascii := rapid.Bool().Draw(t, "ascii")
		checkShape(t, Triangle(p, q, w, h, Options{ASCII: ascii}), w, h, ascii)
	})
}

func TestHugeSize(t *testing.T) {
	out := Render(example, 1<<30, 1<<30, Options{})
	if len(out) != MaxDim {
		t.Errorf("%d lines, want MaxDim = %d", len(out), MaxDim)
	}
}

// TestQuadrant: a single phasor at angle θ has its tip in θ's quadrant,
// read off the output: the origin is at column (w−1)/2 of the row that
// ends in "Re", and the tip is the arrow head.
func TestQuadrant(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		deg := rapid.Float64Range(-179.9, 180).Draw(t, "deg")
		mag := rapid.Float64Range(1e-6, 1e6).Draw(t, "mag")
		w := rapid.IntRange(minWidth, 120).Draw(t, "w")
		h := rapid.IntRange(minHeight+1, 50).Draw(t, "h")
		rad := deg * math.Pi / 180
		out := Render([]Item{{"P", cmplx.Rect(mag, rad), "V"}}, w, h, Options{ASCII: true})
		if strings.Contains(out[0], "too small") {
			return
		}
		cx := (w - 1) / 2
		cy := -1
		tr, tc := -1, -1
		for r, l := range out {
			if strings.HasSuffix(l, "Re") {
				cy = r
			}
			if i := strings.IndexAny(l, "<>^v"); i >= 0 && !strings.HasPrefix(l, "scale") {
				tr, tc = r, i
			}
		}
		if cy < 0 || tr < 0 {
			t.Fatalf("origin (%d,%d) or tip (%d,%d) not found:\n%s", cy, cx, tr, tc, strings.Join(out, "\n"))
		}
		c, s := math.Cos(rad), math.Sin(rad)
		// A component of at least half the magnitude must show strictly;
		// a smaller one may round onto the axis but never to the wrong side.
		check := func(comp float64, d int, name string) {
			switch {
			case comp >= 0.5 && d <= 0, comp <= -0.5 && d >= 0,
				comp > 0 && d < 0, comp < 0 && d > 0:
				t.Fatalf("θ = %g°: tip %s offset %d, component %g:\n%s", deg, name, d, comp, strings.Join(out, "\n"))
			}
		}
		check(c, tc-cx, "column")
		check(s, cy-tr, "row")
	})
}

func BenchmarkRender(b *testing.B) {
	items := make([]Item, 10)
	for k := range items {
		unit := "V"
		if k%2 == 1 {
			unit = "A"
		}
		items[k] = Item{Label: "X" + string(rune('a'+k)), V: cmplx.Rect(float64(1+k), float64(k)*37*math.Pi/180), Unit: unit}
	}
	for b.Loop() {
		Render(items, 60, 20, Options{})
	}
}
