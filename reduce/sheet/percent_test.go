package sheet

import (
	"math"
	"math/cmplx"
	"strings"
	"testing"

	"argand/calc"
)

// TestDipsAndRegulationInPercent: a motor start's voltage dips and a
// transformer's regulation and load shares are ratios read in per cent:
// each field holds the ratio (it computes as one) and is shown "5.417 %",
// in the step and the field alike. The dip is checked against a
// per-phase solution written out here (common practice: the stalled motor
// as Z_LR = (V/√3)/I_LR ∠acos PF_LR behind the series impedances).
func TestDipsAndRegulationInPercent(t *testing.T) {
	// independent: E = 400/√3, Z_LR at pf 0.3 lagging, I = E/(Zs+Zt+Zc+Z_LR)
	e := 400 / math.Sqrt(3)
	zlr := cmplx.Rect(e/600, math.Acos(0.3))
	i := complex(e, 0) / (0.01 + 0.02 + 0.03 + zlr)
	dip := 1 - cmplx.Abs(i*zlr)/e
	dipBus := 1 - cmplx.Abs(i*(0.03+zlr))/e

	s := New()
	lines := []string{
		"m = motorstart(Ilr = 600 A, pfLR = 0.3, V = 400 V, Zs = 0.01 Ω, Zt = 0.02 Ω, Zc = 0.03 Ω)",
		"r = xfmrreg(S = 630 kVA, V1 = 20 kV, V2 = 410 V, z = 4 %, xr = 6, load = 1, pf = 0.8, sense = lagging)",
		"sh = xfmrshare(400 V, 500 kVA, 4%, 6, 630 kVA, 5%, 7, 1000 kVA, 0.8, lagging)",
	}
	var text strings.Builder
	for _, l := range lines {
		steps, _, err := s.Exec(l)
		if err != nil {
			t.Fatalf("%s: %v", l, err)
		}
		for _, st := range steps {
			text.WriteString(st.Text(s.Context().Format, false))
		}
	}
	tests := []struct {
		name string
		want float64 // the ratio; < 0 when only the form is checked
	}{
		{"m.dip", dip}, {"m.dipbus", dipBus}, {"m.dipsupply", -1},
		{"m.approx", -1}, {"m.approxbus", -1}, {"m.approxsupply", -1},
		{"r", -1}, {"r.approx", -1}, {"r.second", -1},
		{"sh.pcta", -1}, {"sh.pctb", -1}, {"sh.approxa", -1}, {"sh.approxb", -1},
	}
	f := s.Context().Format
	for _, tt := range tests {
		q, ok := s.Lookup(tt.name)
		if !ok {
			t.Errorf("%s: not defined", tt.name)
			continue
		}
		if q.Kind != calc.KindPercent || !q.Dim.IsDimensionless() || !q.IsReal() {
			t.Errorf("%s = %v: kind %d dim %v, want a real ratio in per cent", tt.name, q.V, q.Kind, q.Dim)
		}
		shown := f.Short(q)
		if !strings.HasSuffix(shown, " %") {
			t.Errorf("%s shown %q, want … %%", tt.name, shown)
		}
		if !strings.Contains(text.String(), "→ "+tt.name+" = "+shown+"\n") {
			t.Errorf("%s = %s not in the steps", tt.name, shown)
		}
		if tt.want >= 0 && math.Abs(real(q.V)-tt.want) > 1e-9*tt.want {
			t.Errorf("%s = %.12g, want %.12g (relative 1e-9)", tt.name, real(q.V), tt.want)
		}
	}
	for _, want := range []string{"dip at the motor = ", "regulation = ", "load of A = "} {
		i := strings.Index(text.String(), want)
		if i < 0 {
			t.Errorf("no %q in the steps", want)
			continue
		}
		line := text.String()[i:]
		line = line[:strings.IndexByte(line, '\n')]
		if !strings.HasSuffix(line, " %") {
			t.Errorf("step line %q is not in per cent", line)
		}
	}
	// the ratio computes as one: 400 V less the dip at the motor
	if _, _, err := s.Exec("vm = 400 V * (1 - m.dip)"); err != nil {
		t.Fatal(err)
	}
	if vm, _ := s.Lookup("vm"); math.Abs(real(vm.V)-400*(1-dip)) > 1e-9*400 {
		t.Errorf("400 V · (1 − m.dip) = %v, want %v", vm.V, 400*(1-dip))
	}
}
