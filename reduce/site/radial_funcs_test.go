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

// faultcurrent says that it takes the source as a pure reactance with
// c = 1 when the source is given by its fault level, rather than doing so
// silently.
func TestFaultCurrentSourceNote(t *testing.T) {
	f := findFunc(t, "faultcurrent")
	for _, src := range []calc.Arg{pw(250e6), q(0.5, calc.DimImpedance)} {
		args := []calc.Arg{pw(1e6), q(11e3, calc.DimVoltage), q(415, calc.DimVoltage), n(5), n(6), src}
		r, err := f.Call(&calc.Context{Freq: 50}, args)
		if err != nil {
			t.Fatal(err)
		}
		var notes []string
		for _, st := range r.Steps {
			notes = append(notes, st.Notes...)
		}
		said := strings.Contains(strings.Join(notes, " "), "pure reactance (X/R infinite)")
		if said != (src.Q.Dim == calc.DimPower) {
			t.Errorf("source %v: pure-reactance note %v", src.Q, said)
		}
	}
}
