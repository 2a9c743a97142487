package site

import (
	"math"
	"math/cmplx"
	"strings"
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
	// A section typed as a per-unit value or in Ω may be a transformer:
	// it is not labelled a line.
	for _, st := range r.Steps {
		if strings.Contains(st.Rule, "(line)") {
			t.Errorf("a typed section labelled a line: %q", st.Rule)
		}
	}
	if _, err := f.Call(&calc.Context{Freq: 50}, []calc.Arg{args[0], args[1], args[2], {Q: calc.Real(1, calc.DimCurrent), Text: "1 A"}}); err == nil {
		t.Error("a current as a section: no error")
	}
}

// faultcurrent says when it takes the source as a pure reactance, and
// takes the source X/R when given: Z_s = (V1²/S_sc)∠atan(X/R) referred by
// 1/a² (common practice).
func TestFaultCurrentSourceXR(t *testing.T) {
	f := findFunc(t, "faultcurrent")
	base := []calc.Arg{pw(1e6), q(11e3, calc.DimVoltage), q(415, calc.DimVoltage), n(5), n(6), pw(250e6)}
	r, err := f.Call(&calc.Context{Freq: 50}, base)
	if err != nil {
		t.Fatal(err)
	}
	var notes []string
	for _, st := range r.Steps {
		notes = append(notes, st.Notes...)
	}
	if !strings.Contains(strings.Join(notes, " "), "pure reactance (X/R infinite)") {
		t.Error("no note that the source is taken as a pure reactance")
	}
	withXR := append(append([]calc.Arg{}, base...), n(10), q(0.32e-3, perMetre), q(0.08e-3, perMetre), q(60, calc.DimLength))
	r, err = f.Call(&calc.Context{Freq: 50}, withXR)
	if err != nil {
		t.Fatal(err)
	}
	a := 11e3 / 415
	want := cmplx.Rect(11e3*11e3/250e6, math.Atan(10)) / complex(a*a, 0)
	var zs complex128
	for _, e := range r.Extra {
		if e.Name == "zsource" {
			zs = e.Value.V
		}
	}
	if cmplx.Abs(zs-want) > 1e-12*cmplx.Abs(want) {
		t.Errorf("source on the secondary = %v, want %v", zs, want)
	}
	if _, err := f.Call(&calc.Context{Freq: 50}, append(base[:5:5], q(1, calc.DimImpedance), n(10))); err == nil {
		t.Error("a source X/R beside an impedance Zs: no error")
	}
}
