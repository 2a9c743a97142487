package site

import (
	"math"
	"math/cmplx"
	"testing"

	"argand/calc"
)

// A bolted fault behind a source of fault level S_sc and a line Z: the
// current in per unit is 1/(j·S_base/S_sc + Z/Z_base) and in amperes
// I_pu·S_base/(√3·V_base) (per-unit method, common practice).
func TestRadialFunc(t *testing.T) {
	f := radialFunc()
	sb, vb := 10e6, 11e3
	zl := complex(0.5, 0.8)
	args := []calc.Arg{
		{Q: calc.Real(sb, calc.DimPower)}, {Q: calc.Real(vb, calc.DimVoltage)}, {Word: "fault"},
		{Q: calc.Real(250e6, calc.DimPower), Text: "250 MVA"}, {Q: calc.Q(zl, calc.DimImpedance), Text: "0.5+j0.8 Ω"},
	}
	r, err := f.Call(&calc.Context{Freq: 50}, args)
	if err != nil {
		t.Fatal(err)
	}
	want := 1 / (complex(0, sb/250e6) + zl/complex(vb*vb/sb, 0))
	if d := cmplx.Abs(r.Value.V-want) / cmplx.Abs(want); d > 1e-12 {
		t.Errorf("I_pu = %v, want %v", r.Value.V, want)
	}
	ia := want * complex(sb/(math.Sqrt(3)*vb), 0)
	if got := r.Extra[0].Value.V; cmplx.Abs(got-ia)/cmplx.Abs(ia) > 1e-12 {
		t.Errorf("I = %v A, want %v A", got, ia)
	}
	if last := r.Extra[len(r.Extra)-1].Value.V; last != 0 {
		t.Errorf("voltage at a bolted fault = %v, want 0", last)
	}
	if _, err := f.Call(&calc.Context{Freq: 50}, []calc.Arg{args[0], args[1], args[2], {Q: calc.Real(1, calc.DimCurrent), Text: "1 A"}}); err == nil {
		t.Error("a current as a section: no error")
	}
}
