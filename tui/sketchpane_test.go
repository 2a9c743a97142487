package tui

import (
	"strings"
	"testing"

	"argand/calc"
)

// The sketch pane draws the rows it is given as arrows, one complex power
// alone as its power triangle, and names the rows with no angle rather
// than drawing them at 0°. The triangle's sides are P = 800 W and
// Q = 600 var, so S = √(P² + Q²) = 1000 VA and the power factor
// P/S = 0.8 lagging (Q > 0) (IEEE Std 1459-2010, S = P + jQ).
func TestSketchPane(t *testing.T) {
	v := func(name string, re, im float64, d calc.Dim, k calc.Kind) namedValue {
		return namedValue{name, calc.Quantity{V: complex(re, im), Dim: d, Kind: k}}
	}
	tests := []struct {
		name   string
		values []namedValue
		marked bool
		want   []string
		not    []string
	}{
		{"selected phasor", []namedValue{v("Va", 230, 0, calc.DimVoltage, 0)}, false,
			[]string{"sketch", "selected row; space marks more", "Va", "scale: + = 250 V"}, nil},
		{"marked phasors", []namedValue{v("Va", 230, 0, calc.DimVoltage, 0), v("Ia", 3, -4, calc.DimCurrent, 0)}, true,
			[]string{"marked rows", "Va", "Ia", "own scale per unit"}, nil},
		{"power triangle", []namedValue{v("S1", 800, 600, calc.DimPower, calc.KindApparent)}, false,
			[]string{"power triangle", "S1: P, Q and S", "S = 1.00 kVA", "pf 0.8 lagging"}, nil},
		{"no angle", []namedValue{v("Va", 230, 0, calc.DimVoltage, 0), v("P1", 800, 0, calc.DimPower, calc.KindActive)}, true,
			[]string{"P1: no angle, not drawn", "Va"}, []string{"P1 "}},
		{"nothing", nil, false, []string{"marked rows", "nothing to draw"}, nil},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			p := newSketchPane(DefaultKeyMap(), testTheme(false))
			p.SetSize(60, 14)
			p.SetValues(tt.values, tt.marked, false)
			got := p.View()
			if n := len(strings.Split(got, "\n")); n > 14 {
				t.Errorf("%d lines", n)
			}
			for _, w := range tt.want {
				if !strings.Contains(got, w) {
					t.Errorf("lacks %q:\n%s", w, got)
				}
			}
			for _, w := range tt.not {
				if strings.Contains(got, w) {
					t.Errorf("has %q:\n%s", w, got)
				}
			}
		})
	}
}
