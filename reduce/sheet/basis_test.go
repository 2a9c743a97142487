package sheet

import (
	"strings"
	"testing"

	"argand/calc"
)

// samples is one call of every function, with invented example data.
var samples = map[string]string{
	"mag": "mag(3+j4 Ω)", "arg": "arg(3+j4 Ω)", "re": "re(3+j4 Ω)", "im": "im(3+j4 Ω)", "conj": "conj(3+j4 Ω)",
	"recip": "recip(3+j4 Ω)", "sqrt": "sqrt(4)", "sin": "sin(30)", "cos": "cos(30)", "tan": "tan(30)",
	"atan2": "atan2(1 V, 1 V)", "asin": "asin(0.5)", "acos": "acos(0.78)", "atan": "atan(1)", "exp": "exp(1)", "ln": "ln(2)", "log10": "log10(2)", "deg": "deg(1 rad)",
	"rad": "rad(90)", "omega": "omega(50 Hz)", "zr": "zr(10 Ω)", "zl": "zl(10 mH)", "zc": "zc(10 uF)",
	"admittance": "admittance(3+j4 Ω)", "series": "series(3 Ω, j4 Ω)", "parallel": "parallel(3 Ω, j4 Ω)",
	"vdiv": "vdiv(230 V, 3 Ω, j4 Ω)", "idiv": "idiv(10 A, 3 Ω, j4 Ω)", "thevenin": "thevenin(230 V, 3 Ω, j4 Ω)",
	"norton": "norton(230 V, 3+j4 Ω)", "delta2y": "delta2y(3 Ω, j4 Ω, 5 Ω)", "y2delta": "y2delta(3 Ω, j4 Ω, 5 Ω)",
	"power": "power(230 V, 10∠-30 A)", "pf": "pf(800+j600 VA)", "load": "load(8 kW, 0.8, lagging)",
	"loadva": "loadva(10 kVA, 0.8, lagging)", "motor": "motor(7.5 kW, 0.9, 0.85, three, 400 V)",
	"loads": "loads(800+j600 VA, 1 kW)", "current": "current(800+j600 VA, 230 V, single)",
	"pfc": "pfc(10 kW, 0.7, 0.95, 400 V, three)", "pfcload": "pfcload(8+j6 kVA, 0.95, 230 V, single)",
	"rerate": "rerate(10 kvar, 400 V, 415 V)", "harmonic": "harmonic(10 MVA, 100 kvar)",
	"discharge": "discharge(100 uF, 400 V, 50 V, 60 s)", "dischargetime": "dischargetime(10 kΩ, 100 uF, 400 V, 50 V)",
	"rms": "rms(325 V)", "peak": "peak(230 V)", "rectavg": "rectavg(325 V)", "rectpeak": "rectpeak(207 V)",
	"fromvi": "fromvi(230 V, 4.2 A, 30°)", "fromvip": "fromvip(230 V, 4.2 A, 820 W, lagging)",
	"frompf": "frompf(820 W, 0.85, 230 V, lagging)", "pp2rms": "pp2rms(651 V)", "delay2phase": "delay2phase(1.2 ms, 50 Hz)",
	"rotation": "rotation(0, -118, 121)", "preferred": "preferred(2.87 kΩ, E24)",
	"cabledrop": "cabledrop(230 V, 32 A, 0.9, lagging, 1.83 Ω/km, 0.09 Ω/km, 45 m, single)",
	"rtemp":     "rtemp(1.83 Ω/km, 20, 70, copper)", "refer": "refer(10 Ω, 10, secondary)",
	"xfmr":         "xfmr(500 kVA, 11 kV, 400 V, 4.5, 6, three)",
	"faultcurrent": "faultcurrent(500 kVA, 11 kV, 400 V, 4.5, 6, 250 MVA, 0.32 Ω/km, 0.08 Ω/km, 60 m, three)",
	"lrmultiple":   "lrmultiple(150 A, 7, 400 V)",
	"lrkva":        "lrkva(75 kW, 6 kVA/kW, 400 V)",
	"motorstart":   "motorstart(1 kA, 0.3, 400 V, 150 MVA, 1.3+j7.9 mΩ, 8+j6.4 mΩ, stardelta)",
	"xfmrreg":      "xfmrreg(1 MVA, 11 kV, 400 V, 5, 10.5 kW, 80 %, 0.85, lagging)",
	"xfmreff":      "xfmreff(1 MVA, 1.1 kW, 10.5 kW, 80 %, 0.85)",
	"xfmrshare":    "xfmrshare(400 V, 1 MVA, 5, 6, 630 kVA, 4.5, 4, 1.4 MVA, 0.85, lagging, 0.5)",
	"vgroup":       "vgroup(11 kV, 11, tolv, 27.5)",
	"pubase":       "pubase(10 MVA, 11 kV)", "rebase": "rebase(0.05+j0.3, 2 MVA, 11 kV, 10 MVA, 11 kV)",
	"ct": "ct(4.1 A, 200 A, 5 A)", "ctsec": "ctsec(150 A, 200 A, 5 A)", "vt": "vt(110 V, 11 kV, 110 V)",
	"vtsec": "vtsec(11 kV, 11 kV, 110 V)", "readcheck": "readcheck(229 V, 1, 2, 0.1 V, 220 V, 240 V)",
	"radial":     "radial(10 MVA, 11 kV, fault, 250 MVA, 0.05+j0.3, 0.5+j0.8 Ω)",
	"line2phase": "line2phase(400 V, wye)", "phase2line": "phase2line(230 V, wye)",
	"seq": "seq(230 V, 230∠-120 V, 230∠120 V)", "phases": "phases(0 V, 230 V, 0 V)",
	"wye": "wye(230 V, 10 Ω, 20 Ω, 10+j10 Ω, neutral)", "delta": "delta(400 V, 10 Ω, 20 Ω, 10+j10 Ω)",
	"balanced": "balanced(400 V, 10+j5 Ω, wye)", "wattmeters": "wattmeters(400 V, 20 A, 0.8, lagging)",
	"fromwattmeters": "fromwattmeters(3 kW, 1 kW)", "resonance": "resonance(10 mH, 10 uF)",
	"qseries": "qseries(10 Ω, 10 mH, 10 uF)", "qparallel": "qparallel(10 kΩ, 10 mH, 10 uF)",
	"bandwidth": "bandwidth(1 kHz, 10)", "tank": "tank(10 mH, 1 Ω, 10 uF)", "db": "db(0.5)",
	"transfer": "transfer(1∠-45 V, 2 V)",
	"hrms":     "hrms(Ib)", "thd": "thd(Ib)", "tdd": "tdd(Ib, 150 A)", "crest": "crest(Ib)", "fhl": "fhl(Ib)",
	"kfactor": "kfactor(Ib, 120 A)", "avgmeter": "avgmeter(Ib)", "hpower": "hpower(Ub, Ib)",
	"bankcheck": "bankcheck(10 MVA, 400 kvar, Ib, 7 %)", "detune": "detune(50 kvar, 400 V, 7 %, three, 440 V)",
	"bankout": "bankout(60 kvar, 440 V, 400 V, 7 %)", "bankscan": "bankscan(10 MVA, 400 kvar, 400 V, 7 %, 8, 13)",
	"zfeeder": "zfeeder(20 kV, 10 kA, 20 kV, 410 V)", "zxfmr": "zxfmr(630 kVA, 20 kV, 410 V, 4, 6.5 kW)",
	"zcable": "zcable(0.077 Ω/km, 0.079 Ω/km, 10 m, 2, 80)", "ik3": "ik3(400 V, 0.05+j0.53 mΩ, 2.7+j10 mΩ)",
	"ik1": "ik1(400 V, 3+j11 mΩ, 3+j11 mΩ, 9+j14 mΩ)", "ik2": "ik2(400 V, 3+j11 mΩ, 3+j11 mΩ, 9+j14 mΩ)",
	"ik2e":   "ik2e(400 V, 3+j11 mΩ, 3+j11 mΩ, 9+j14 mΩ, 50 mΩ)",
	"zsloop": "zsloop(230 V, 0.35 Ω, 19.5 mΩ/m, 25 m, 70, 1.2 Ω)",
	"l2l":    "l2l(400 V)", "l2n": "l2n(230 V)",
	"wyeunbal":   "wyeunbal(232 V, 221∠-121 V, 236∠118 V, 8 Ω, 15 Ω, 40 Ω, 0.8+j0.2 Ω)",
	"deltaunbal": "deltaunbal(400 V, 395∠-121 V, -(400 V + 395∠-121 V), 10 Ω, 12 Ω, 15 Ω)",
}

// before holds statements a sample call needs first: the spectra that the
// harmonic functions read (invented example data).
var before = []string{
	"spectrum Ib h1 100 A ∠ -20, h3 35 % ∠ 60, h5 22 % ∠ 170, h7 12 % ∠ -40",
	"spectrum Ub h1 230 V, h3 2 % ∠ 160, h5 3 % ∠ -60",
}

// TestEveryFunctionBothBases: every function has parameters and runs on
// both phasor bases; where it turns voltages or currents into powers (or
// back), its steps under basis peak say how the basis enters (S = ½·V·I*
// for peak phasors, IEEE Std 1459-2010) or that a rating is RMS by
// definition.
func TestEveryFunctionBothBases(t *testing.T) {
	for _, f := range Functions() {
		src, ok := samples[f.Name]
		if !ok {
			t.Errorf("%s: no sample call in this test", f.Name)
			continue
		}
		if len(f.Params) == 0 {
			t.Errorf("%s: no Params", f.Name)
		}
		var peakText string
		var mixes bool
		for _, basis := range []string{"rms", "peak"} {
			s := New()
			for _, l := range append([]string{"basis " + basis}, before...) {
				if _, _, err := s.Exec(l); err != nil {
					t.Fatal(err)
				}
			}
			steps, _, err := s.Exec("x = " + src)
			if err != nil {
				t.Errorf("%s on basis %s: %v", src, basis, err)
				continue
			}
			var power, field bool
			var b strings.Builder
			for _, st := range steps {
				b.WriteString(st.Rule + " " + st.Formula + " " + strings.Join(st.Notes, " ") + " ")
				for _, o := range append(append([]calc.Operand{}, st.Inputs...), st.Results...) {
					switch o.Value.Dim {
					case calc.DimPower:
						power = true
					case calc.DimVoltage, calc.DimCurrent:
						field = true
					}
				}
			}
			if basis == "peak" {
				peakText, mixes = b.String(), power && field
			}
		}
		if mixes && !strings.Contains(peakText, "peak") && !strings.Contains(peakText, "½") && !strings.Contains(peakText, "RMS by definition") {
			t.Errorf("%s: relates powers to voltages or currents but its steps under basis peak do not say how the basis enters", src)
		}
	}
}
