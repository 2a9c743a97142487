package record

import (
	"math"
	"math/cmplx"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"argand/calc"
	"argand/tui/internal/golden"
)

func testPage() *page { return &page{f: calc.Format{Digits: 4}} }

func phasor(mag, deg float64, d calc.Dim) calc.Quantity {
	return calc.Quantity{V: cmplx.Rect(mag, deg*math.Pi/180), Dim: d}
}

var (
	lineRe    = regexp.MustCompile(`<line x1="([-\d.]+)" y1="([-\d.]+)" x2="([-\d.]+)" y2="([-\d.]+)"`)
	polygonRe = regexp.MustCompile(`<polygon points="([-\d.]+),([-\d.]+) `)
)

func atof(t *testing.T, s string) float64 {
	x, err := strconv.ParseFloat(s, 64)
	if err != nil {
		t.Fatal(err)
	}
	return x
}

// TestPhasorGeometry: each arrow's tip lies at its angle, counter-clockwise
// from the +1 axis with +j up, at a length proportional to its magnitude
// within its kind (x = c + r·cos θ, y = c − r·sin θ, the page's y running
// down: plane geometry, common practice). The drawing is kept as a golden.
func TestPhasorGeometry(t *testing.T) {
	arrows := []arrow{
		{"Vs", phasor(230, 0, calc.DimVoltage)},
		{"Vl", phasor(115, 90, calc.DimVoltage)},
		{"I", phasor(10, -30, calc.DimCurrent)},
		{"Ib", phasor(5, 120, calc.DimCurrent)},
		{"a_long_name", phasor(8, -150, calc.DimCurrent)},
		{"I0", phasor(0, 0, calc.DimCurrent)},
	}
	svg, caption := testPage().phasorSVG(arrows)
	tips := polygonRe.FindAllStringSubmatch(svg, -1)
	want := []struct{ r, deg float64 }{{100, 0}, {50, 90}, {100, -30}, {50, 120}, {80, -150}}
	if len(tips) != len(want) {
		t.Fatalf("%d arrows drawn, want %d (the zero one is not drawn)", len(tips), len(want))
	}
	for i, w := range want {
		x, y := atof(t, tips[i][1]), atof(t, tips[i][2])
		wx, wy := 160+w.r*math.Cos(w.deg*math.Pi/180), 160-w.r*math.Sin(w.deg*math.Pi/180)
		if math.Abs(x-wx) > 0.051 || math.Abs(y-wy) > 0.051 {
			t.Errorf("%s: tip at (%v, %v), want (%.2f, %.2f)", arrows[i].name, x, y, wx, wy)
		}
	}
	for _, want := range []string{"voltages (solid) to 230.0 V", "currents (dashed) to 10.00 A", "Zero, not drawn: I0"} {
		if !strings.Contains(caption, want) {
			t.Errorf("caption %q lacks %q", caption, want)
		}
	}
	if !strings.Contains(svg, ">a_long_na…</text>") || !strings.Contains(svg, "<title>a_long_name</title>") {
		t.Error("a long name is not shortened at the tip and kept whole in the title")
	}
	golden.Check(t, "testdata/phasors.svg", svg+"<!-- "+caption+" -->\n")
}

// TestTriangleGeometry: the hypotenuse leaves the origin at the angle of
// S = P + jQ (one scale on both axes), P lies along the horizontal, and the
// caption's power factor is cos φ = P/|S| (IEEE Std 1459-2010); a 3-4-5
// triangle gives 0.6. The drawings are kept as goldens.
func TestTriangleGeometry(t *testing.T) {
	tests := []struct {
		name   string
		s      complex128
		golden string
		want   string
	}{
		{"Slag", complex(3000, 4000), "triangle-lagging.svg", "cos φ = 0.6000 lagging"},
		{"Slead", complex(3000, -4000), "triangle-leading.svg", "cos φ = 0.6000 leading"},
		{"Sgen", complex(-3000, 4000), "triangle-delivering.svg", "cos φ = -0.6000 lagging"},
		{"Sunity", complex(2500, 0), "triangle-unity.svg", "cos φ = 1.000 unity"},
	}
	for _, tc := range tests {
		q := calc.Quantity{V: tc.s, Dim: calc.DimPower}
		svg, caption := testPage().triangleSVG(calc.Operand{Name: tc.name, Value: q})
		sides := lineRe.FindAllStringSubmatch(svg, -1)
		if len(sides) != 3 {
			t.Fatalf("%s: %d sides", tc.name, len(sides))
		}
		p, hyp := sides[0], sides[2]
		if atof(t, p[2]) != atof(t, p[4]) {
			t.Errorf("%s: P is not horizontal: %v", tc.name, p[0])
		}
		dx, dy := atof(t, hyp[3])-atof(t, hyp[1]), -(atof(t, hyp[4]) - atof(t, hyp[2]))
		if got, want := math.Atan2(dy, dx), cmplx.Phase(tc.s); math.Abs(got-want) > 0.002 {
			t.Errorf("%s: hypotenuse at %.4f rad, want %.4f", tc.name, got, want)
		}
		for _, c := range sides {
			for _, v := range c[1:] {
				if x := atof(t, v); x < 0 || x > triW {
					t.Errorf("%s: %v outside the box", tc.name, c[0])
				}
			}
		}
		if !strings.Contains(caption, tc.want) {
			t.Errorf("%s: caption %q lacks %q", tc.name, caption, tc.want)
		}
		golden.Check(t, "testdata/"+tc.golden, svg+"<!-- "+caption+" -->\n")
	}
}
