package sheet

import (
	"strings"
	"testing"
)

// TestNamedArgumentsSkipOptional: a call may leave out an optional
// parameter by naming a later one, and gets the value of the call that
// gives the left-out one at what it stands for when not given (zcable's
// n = 1 run, zfeeder's R_Q/X_Q = 0.1, ik1's Z_f = 0, bankscan's p and X/R
// of 0, zxfmr's u_Rr = 0). Functions whose
// optional parameters go together say which one is needed.
func TestNamedArgumentsSkipOptional(t *testing.T) {
	pairs := [][2]string{
		{"zcable(0.1 mΩ/m, 0.08 mΩ/m, 50 m, 1, 70)", "zcable(Rlen = 0.1 mΩ/m, Xlen = 0.08 mΩ/m, length = 50 m, thetae = 70)"},
		{"zcable(0.1 mΩ/m, 0.08 mΩ/m, 50 m, 1, 70)", "zcable(thetae = 70, length = 50 m, Xlen = 0.08 mΩ/m, Rlen = 0.1 mΩ/m)"},
		{"zfeeder(20 kV, 10 kA, 0.1, 1.05)", "zfeeder(UnQ = 20 kV, Ik = 10 kA, c = 1.05)"},
		{"zfeeder(20 kV, 10 kA, 0.2, 1.05)", "zfeeder(20 kV, 10 kA, 0.2, c = 1.05)"},
		{"zfeeder(20 kV, 10 kA, 20 kV, 400 V, 0.1, 1.05)", "zfeeder(20 kV, 10 kA, UrLV = 400 V, UrHV = 20 kV, c = 1.05)"},
		{"zfeeder(20 kV, 10 kA, 0.2)", "zfeeder(UnQ = 20 kV, Ik = 10 kA, rx = 0.2)"},
		{"ik1(400 V, 0.01+j0.05 Ω, 0.01+j0.05 Ω, 0.03+j0.1 Ω, 0 Ω, 1.05)", "ik1(Un = 400 V, Z1 = 0.01+j0.05 Ω, Z2 = 0.01+j0.05 Ω, Z0 = 0.03+j0.1 Ω, c = 1.05)"},
		{"ik2(400 V, 0.01+j0.05 Ω, 0.01+j0.05 Ω, 0.03+j0.1 Ω, 0 Ω, 1, min)", "ik2(400 V, 0.01+j0.05 Ω, 0.01+j0.05 Ω, 0.03+j0.1 Ω, limit = min, c = 1)"},
		{"bankscan(10 MVA, 100 kvar, 400 V, 0, 0, 9)", "bankscan(Ssc = 10 MVA, Qc = 100 kvar, V = 400 V, hmax = 9)"},
		{"bankscan(10 MVA, 100 kvar, 400 V, 0.07, 0, 9)", "bankscan(10 MVA, 100 kvar, 400 V, p = 0.07, hmax = 9)"},
		{"zxfmr(630 kVA, 20 kV, 400 V, 6%, 0%, 1.1)", "zxfmr(SrT = 630 kVA, UrHV = 20 kV, UrLV = 400 V, ukr = 6%, cmax = 1.1)"},
		{"zxfmr(630 kVA, 20 kV, 400 V, 6%, 0%, 1.1, hv)", "zxfmr(630 kVA, 20 kV, 400 V, 6%, side = hv, cmax = 1.1)"},
	}
	for _, p := range pairs {
		a, b := New(), New()
		if _, _, err := a.Exec("x = " + p[0]); err != nil {
			t.Errorf("%s: %v", p[0], err)
			continue
		}
		if _, _, err := b.Exec("x = " + p[1]); err != nil {
			t.Errorf("%s: %v", p[1], err)
			continue
		}
		qa, _ := a.Lookup("x")
		qb, _ := b.Lookup("x")
		if qa != qb {
			t.Errorf("%s = %v but %s = %v", p[0], qa, p[1], qb)
		}
	}
	errs := []struct{ src, want string }{
		{"faultcurrent(S = 500 kVA, V1 = 11 kV, V2 = 400 V, z = 4.5%, xr = 6, source = 250 MVA, length = 40 m)", "faultcurrent: length needs Rlen as well"},
		{"motorstart(Ilr = 600 A, pfLR = 0.3, V = 400 V, Zs = 0.01 Ω, Zt = 0.02 Ω, Zc = 0.03 Ω, setting = 0.65)", "motorstart: setting needs method as well"},
		{"zcable(Rlen = 0.1 mΩ/m, Xlen = 0.08 mΩ/m, thetae = 70)", "zcable: argument length (a length in m) is missing"},
		{"zcable(Rlen = 0.1 mΩ/m, Xlen = 0.08 mΩ/m, length = 50 m, runs = 2)", `zcable has no parameter "runs"; its parameters are Rlen, Xlen, length, n, thetae`},
		{"zfeeder(UnQ = 20 kV, Ik = 10 kA, UrLV = 400 V)", "the transformer needs both rated voltages"},
		{"zfeeder(20 kV, 10 kA, 0.2, 1.1, c = 1.05)", "cQ is given by name and 1.1 besides it"},
	}
	for _, tt := range errs {
		_, _, err := New().Exec("x = " + tt.src)
		if err == nil || !strings.Contains(err.Error(), tt.want) {
			t.Errorf("%s: %v, want %q", tt.src, err, tt.want)
		}
	}
}
