package site

import (
	"math"
	"slices"
	"strings"
	"testing"

	"argand/calc"
)

func qa(text string, v complex128, d calc.Dim) calc.Arg {
	return calc.Arg{Q: calc.Q(v, d), Text: text}
}

func wa(w string) calc.Arg { return calc.Arg{Word: w, Text: w} }

// The worksheet functions reach the same figures as the Go API: the
// IEC TR 60909-4 §3 feeder and transformer T1 (published-examples.md; seen
// as transcribed in an open-source test suite), then a fault through them.
func TestShortFuncs(t *testing.T) {
	ctx := &calc.Context{Freq: 50, Sequence: 1}
	kw := func(x float64) calc.Quantity {
		return calc.Quantity{V: complex(x, 0), Dim: calc.DimPower, Kind: calc.KindActive}
	}
	kva := func(x float64) calc.Quantity {
		return calc.Quantity{V: complex(x, 0), Dim: calc.DimPower, Kind: calc.KindApparent}
	}
	zq, err := findFunc(t, "zfeeder").Call(ctx, []calc.Arg{qa("20 kV", 20e3, calc.DimVoltage), qa("10 kA", 10e3, calc.DimCurrent),
		qa("0.1", 0.1, calc.Dimensionless), qa("20 kV", 20e3, calc.DimVoltage), qa("410 V", 410, calc.DimVoltage)})
	if err != nil {
		t.Fatal(err)
	}
	if !printedAs(real(zq.Value.V)*1e3, 0.053, 3) || !printedAs(imag(zq.Value.V)*1e3, 0.531, 3) {
		t.Errorf("zfeeder = %v, printed 0.053 + j0.531 mΩ", zq.Value.V)
	}
	zt, err := findFunc(t, "zxfmr").Call(ctx, []calc.Arg{{Q: kva(630e3), Text: "630 kVA"}, qa("20 kV", 20e3, calc.DimVoltage),
		qa("410 V", 410, calc.DimVoltage), qa("4", 4, calc.Dimensionless), {Q: kw(6.5e3), Text: "6.5 kW"}})
	if err != nil {
		t.Fatal(err)
	}
	if !printedAs(real(zt.Extra[0].Value.V), 0.974894, 6) {
		t.Errorf("zxfmr .kt = %v, printed 0.974894", zt.Extra[0].Value.V)
	}
	k, err := findFunc(t, "ik3").Call(ctx, []calc.Arg{qa("400 V", 400, calc.DimVoltage), {Q: zq.Value, Text: "zq"}, {Q: zt.Value, Text: "zt"}})
	if err != nil {
		t.Fatal(err)
	}
	want := 1.05 * 400 / (math.Sqrt(3) * math.Hypot(real(zq.Value.V+zt.Value.V), imag(zq.Value.V+zt.Value.V)))
	if math.Abs(real(k.Value.V)-want) > 1e-12*want {
		t.Errorf("ik3 = %v, want %v", k.Value.V, want)
	}
	kmin, err := findFunc(t, "ik3").Call(ctx, []calc.Arg{qa("400 V", 400, calc.DimVoltage), {Q: zq.Value, Text: "zq"}, {Q: zt.Value, Text: "zt"}, wa("min")})
	if err != nil || math.Abs(real(kmin.Value.V)-want*0.95/1.05) > 1e-9*want {
		t.Errorf("ik3 min = %v %v", kmin.Value.V, err)
	}
	// an explicit c overrides the table
	kc, err := findFunc(t, "ik3").Call(ctx, []calc.Arg{qa("400 V", 400, calc.DimVoltage), {Q: zq.Value, Text: "zq"}, {Q: zt.Value, Text: "zt"}, qa("1.1", 1.1, calc.Dimensionless)})
	if err != nil || math.Abs(real(kc.Value.V)-want*1.1/1.05) > 1e-9*want {
		t.Errorf("ik3 c 1.1 = %v %v", kc.Value.V, err)
	}
	for _, r := range []calc.Result{zq, zt, k} {
		if !slices.ContainsFunc(r.Cautions, func(c calc.StepCaution) bool { return c.Topic == calc.CautionFault }) {
			t.Error("a fault function result without the fault caution")
		}
	}
}

// Wrong kinds and shapes of argument are refused with the argument named.
func TestShortFuncErrors(t *testing.T) {
	ctx := &calc.Context{Freq: 50, Sequence: 1}
	v := qa("400 V", 400, calc.DimVoltage)
	z := qa("1+j2 Ω", complex(1e-3, 2e-3), calc.DimImpedance)
	for _, c := range []struct {
		fn   string
		args []calc.Arg
		msg  string
	}{
		{"zfeeder", []calc.Arg{v, qa("5 Ω", 5, calc.DimImpedance)}, "I\"_kQ"},
		{"zfeeder", []calc.Arg{v, qa("10 kA", 1e4, calc.DimCurrent), qa("20 kV", 2e4, calc.DimVoltage)}, "both rated voltages"},
		{"zxfmr", []calc.Arg{{Q: calc.Quantity{V: 630e3, Dim: calc.DimPower, Kind: calc.KindActive}, Text: "630 kW"}, qa("20 kV", 2e4, calc.DimVoltage), v, qa("4", 4, calc.Dimensionless)}, "apparent power"},
		{"zxfmr", []calc.Arg{qa("630 kVA", 630e3, calc.DimPower), v, qa("20 kV", 2e4, calc.DimVoltage), qa("4", 4, calc.Dimensionless)}, "high voltage first"},
		{"zcable", []calc.Arg{qa("R'", 1e-4, perMetre), qa("X'", 1e-4, perMetre), qa("10 m", 10, calc.DimLength), qa("1.5", 1.5, calc.Dimensionless)}, "whole number"},
		{"ik3", []calc.Arg{v, qa("10 A", 10, calc.DimCurrent)}, "neither an impedance"},
		{"ik3", []calc.Arg{v, z, wa("max"), wa("min")}, "not both"},
		{"ik1", []calc.Arg{v, z, z, qa("3", 3, calc.Dimensionless)}, "Z0"},
		{"ik2", []calc.Arg{v, z, z, z, z, qa("2", 2, calc.Dimensionless)}, "voltage factor"},
		{"zsloop", []calc.Arg{qa("230 V", 230, calc.DimVoltage), z, qa("R'", 0.02, perMetre), qa("25 m", 25, calc.DimLength), qa("70", 70, calc.Dimensionless), qa("5 V", 5, calc.DimVoltage)}, "limit"},
	} {
		_, err := findFunc(t, c.fn).Call(ctx, c.args)
		if err == nil || !strings.Contains(err.Error(), c.msg) {
			t.Errorf("%s%v: error %v, want one mentioning %q", c.fn, c.args, err, c.msg)
		}
	}
}

// Under basis peak the phasors of an unsymmetrical fault are peak values
// (√2 times RMS); I"_k stays the RMS value the standard defines.
func TestUnsymFuncPeak(t *testing.T) {
	args := []calc.Arg{qa("400 V", 400, calc.DimVoltage), qa("Z1", complex(3e-3, 11e-3), calc.DimImpedance),
		qa("Z2", complex(3e-3, 11e-3), calc.DimImpedance), qa("Z0", complex(9e-3, 14e-3), calc.DimImpedance)}
	rms, err := findFunc(t, "ik1").Call(&calc.Context{Freq: 50, Sequence: 1}, args)
	if err != nil {
		t.Fatal(err)
	}
	pk, err := findFunc(t, "ik1").Call(&calc.Context{Freq: 50, Sequence: 1, Basis: calc.Peak}, args)
	if err != nil {
		t.Fatal(err)
	}
	if pk.Value.V != rms.Value.V {
		t.Errorf("I\"_k changed with the basis: %v, %v", pk.Value.V, rms.Value.V)
	}
	if got, want := pk.Extra[0].Value.V, rms.Extra[0].Value.V*complex(math.Sqrt2, 0); got != want {
		t.Errorf("peak .ia = %v, want %v", got, want)
	}
}
