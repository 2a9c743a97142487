package sheet

import (
	"math/cmplx"
	"strings"
	"testing"
)

// TestVoltageMarksEveryFunction: every function that takes a three-phase
// voltage reads the l2l and l2n marks (a value marked the other way is
// converted by √3, common practice: |V_LL| = √3·|V_LN|), so the same
// voltage written either way gives the same results, field by field, to
// 1e-9; an unmarked value of a function that is three-phase by definition
// is stated in both forms in a step, as xfmr does.
func TestVoltageMarksEveryFunction(t *testing.T) {
	const ln400 = "l2n(400 V / sqrt(3))"
	tests := []struct {
		plain, marked string
		fields        []string
		states        bool // an unmarked value is stated line-to-line = line-to-neutral
	}{
		{"bankout(350 kvar, 480 V, 400 V, 14 %)", "bankout(350 kvar, 480 V, " + ln400 + ", 14 %)", []string{"uc"}, false},
		{"bankout(350 kvar, 480 V, 400 V, 14 %)", "bankout(350 kvar, l2n(480 V / sqrt(3)), 400 V, 14 %)", []string{"uc"}, false},
		{"bankscan(8 MVA, 300 kvar, 400 V, 14 %, 8, 9)", "bankscan(8 MVA, 300 kvar, " + ln400 + ", 14 %, 8, 9)", nil, false},
		{"detune(300 kvar, 400 V, 14 %, three, 480 V)", "detune(300 kvar, " + ln400 + ", 14 %, three, 480 V)", []string{"c", "uc", "qr"}, true},
		{"detune(300 kvar, 400 V, 14 %, three, 480 V)", "detune(300 kvar, 400 V, 14 %, three, l2n(480 V / sqrt(3)))", []string{"c", "uc", "qr"}, true},
		{"detune(30 kvar, 230 V, 14 %, single)", "detune(30 kvar, l2n(230 V), 14 %, single)", []string{"c", "uc"}, false},
		{"rerate(100 kvar, 400 V, 440 V)", "rerate(100 kvar, " + ln400 + ", 440 V)", nil, false},
		{"lrmultiple(194 A, 7.2, 400 V)", "lrmultiple(194 A, 7.2, " + ln400 + ")", []string{"sa"}, true},
		{"lrkva(150 hp_metric, 6.3 kVA/hp_metric, 400 V)", "lrkva(150 hp_metric, 6.3 kVA/hp_metric, " + ln400 + ")", []string{"sa"}, true},
		{"motorstart(1.4 kA, 0.3, 400 V, 1 mΩ, 8 mΩ, 10 mΩ)", "motorstart(1.4 kA, 0.3, " + ln400 + ", 1 mΩ, 8 mΩ, 10 mΩ)", []string{"dip", "vbus", "i", "sa"}, true},
		{"xfmrreg(1 MVA, 11 kV, 400 V, 5, 6, 80 %, 0.85, lagging, three)", "xfmrreg(1 MVA, 11 kV, " + ln400 + ", 5, 6, 80 %, 0.85, lagging, three)", []string{"v", "i"}, true},
		{"xfmrshare(400 V, 1 MVA, 5, 6, 630 kVA, 4.5, 4, 1.4 MVA, 0.85, lagging, 0.5)", "xfmrshare(" + ln400 + ", 1 MVA, 5, 6, 630 kVA, 4.5, 4, 1.4 MVA, 0.85, lagging, 0.5)", []string{"vbus", "ia", "ic"}, true},
		{"zfeeder(20 kV, 10 kA)", "zfeeder(l2n(20 kV / sqrt(3)), 10 kA)", []string{"r", "x"}, true},
		{"zfeeder(20 kV, 10 kA, 20 kV, 400 V)", "zfeeder(20 kV, 10 kA, 20 kV, " + ln400 + ")", []string{"r", "x"}, true},
		{"zxfmr(630 kVA, 20 kV, 400 V, 6%)", "zxfmr(630 kVA, 20 kV, " + ln400 + ", 6%)", []string{"kt", "zt"}, true},
		{"ik3(400 V, 10 mΩ)", "ik3(" + ln400 + ", 10 mΩ)", []string{"sk", "ip"}, true},
		{"ik1(400 V, 10 mΩ, 10 mΩ, 30 mΩ)", "ik1(" + ln400 + ", 10 mΩ, 10 mΩ, 30 mΩ)", []string{"ia", "va"}, true},
		{"ik2(400 V, 10 mΩ, 10 mΩ, 30 mΩ)", "ik2(" + ln400 + ", 10 mΩ, 10 mΩ, 30 mΩ)", []string{"ib"}, true},
		{"ik2e(400 V, 10 mΩ, 10 mΩ, 30 mΩ)", "ik2e(" + ln400 + ", 10 mΩ, 10 mΩ, 30 mΩ)", []string{"ie"}, true},
		{"zsloop(230 V, 0.35 Ω, 20 mΩ/m, 20 m, 70)", "zsloop(l2l(230 V * sqrt(3)), 0.35 Ω, 20 mΩ/m, 20 m, 70)", []string{"if"}, true},
	}
	for _, tt := range tests {
		a, b := New(), New()
		sa, _, err := a.Exec("x = " + tt.plain)
		if err != nil {
			t.Errorf("%s: %v", tt.plain, err)
			continue
		}
		if _, _, err := b.Exec("x = " + tt.marked); err != nil {
			t.Errorf("%s: %v", tt.marked, err)
			continue
		}
		for _, name := range append([]string{"x"}, tt.fields...) {
			if name != "x" {
				name = "x." + name
			}
			qa, oka := a.Lookup(name)
			qb, okb := b.Lookup(name)
			if !oka || !okb {
				t.Errorf("%s: %s not defined", tt.plain, name)
				continue
			}
			if cmplx.Abs(qa.V-qb.V) > 1e-9*cmplx.Abs(qa.V) || qa.Dim != qb.Dim {
				t.Errorf("%s: %s = %v, but %v with %s", tt.plain, name, qa.V, qb.V, tt.marked)
			}
		}
		var text strings.Builder
		for _, st := range sa {
			text.WriteString(st.Text(a.Context().Format, false))
		}
		stated := strings.Contains(text.String(), " line-to-line = ") && strings.Contains(text.String(), " line-to-neutral")
		if stated != tt.states {
			t.Errorf("%s: voltage stated in both forms = %v, want %v:\n%s", tt.plain, stated, tt.states, text.String())
		}
	}
}
