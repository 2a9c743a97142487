package sheet

import (
	"encoding/json"
	"math"
	"strings"
	"testing"
	"unicode/utf8"

	"argand/calc"
)

var sheetSeeds = []string{
	"x = 3+j4 Ω\ny = x || 10 Ω\ncheck y is 4.4∠26.57 Ω within 1%",
	"frequency 60 Hz\ninductor L1 = 10 mH\nZ = L1 + 10 Ω\nfrequency 50 Hz",
	"capacitor C1 = 1 µF\nresistor R1 = 1 kΩ\nZt = R1 || C1\ndigits 6\nangles rad\nZt",
	"basis peak\nV1 = 325∠0 V\nI1 = V1 / (10 Ω)\nS1 = V1 * conj(I1) / 2",
	"network bench reference n\n  voltage source Vs = 230∠0 V from n to a\n  resistor R1 = 10 Ω from a b\nend",
	"network bench reference n\n  voltage source Vs = 230∠0 V from n to a\n  resistor R1 = 10 Ω from a to n\nend\nthevenin T = bench between a and n",
	"frequency 0 Hz", "S = 1", "x = (1+2", "1e308*1e308", "5∠", "j10 || -j10", "50 Hz * 10 mH",
	"sequence acb\nsequence abc", "tolerance R1 5%", "check 1 is 2 within 1%", "x = 1\nx = x + 1",
	"a = 1\nb = a\na = b", "sweep 1 Hz from 1 Hz to 10 Hz points 3", "\xff\xfe", "# comment only",
	"spectrum I h1 100 A ∠ -20, h3 35 % ∠ 60, h5 22 %\nthd(I)\ncrest(I)\nkfactor(I, 120 A)",
	"spectrum V h1 230 V, h5 3 % ∠ -60\nspectrum I h1 10 A ∠ -30, h5 20 % ∠ 40\nhpower(V, I)\navgmeter(V)",
	"spectrum I h1 100 %, h5 20 %, h5 3 %", "spectrum I from /nonexistent", "spectrum I from .",
	"readings /nonexistent", "readings .", "readings", "readings \"\"", "readings = 2", "x = readings",
	"detune(50 kvar, 400 V, 7 %, three, 440 V)\nbankout(60 kvar, 440 V, 400 V, 7 %)",
	"spectrum I h1 100 A, h5 22 %\nbankcheck(10 MVA, 400 kvar, I, 7 %)\nbankscan(10 MVA, 400 kvar, 400 V, 0.07, 8, 15)",
	"inductor L1 = 10 mH\ncapacitor C1 = 1 µF\nZ = 20 Ω + L1 + C1\nsweep Z from 500 Hz to 5 kHz points 21 db ref 1 Ω",
	"sweep 1/(1+j*f/(1 kHz)) from 10 Hz to 10 kHz points 9 db", "sweep 5 V from 1 Hz to 2 Hz points 2 db ref 0 V",
	"u = wye(l2l(400 V), 10 Ω, 20 Ω, 30 Ω, 2+j1 Ω)\nv = seq(u.va, u.vb, u.vc)\nv.vuf",
	"wyeunbal(l2n(230 V), 225∠-118 V, 236∠121 V, 10 Ω, 0 Ω, 30 Ω, floating)", "l2n(l2l(1 V))",
	// as technicians type them, and the language line
	"language 1\nresistor R1 = 4K7\ncapacitor C1 = 2u2\nZ = R1 || C1\nV = 230 v\nI = V / Z",
	"language 2\nR = 10k\nresistor R2 = 10k\nR2 = 12k\nZ = 4k7 || 10k\nZs = series(22 mH, 150 Ω)",
	"capacitor C = 22 µF\nS = 230 V * 6.2 A\nm = 3\nA = 2 * m\np = fromvi(230 V, 6.2 A, acos(0.78))",
	"language 99", "inductor L1 = 2.2m", "x = 2 mw", "\ufeffx = 1", "x = 10\u202fkΩ || 10 k\u2126",
	// the decimal comma (SI Brochure 9th ed. §5.4.4), and back
	"decimal comma\nL = 2,2 mH\nZ = parallel(2,2 kΩ; 4,7 kΩ)\ndecimal point\nx = 2,2\ny = max(2,2)",
	"decimal comma\ncheck 1,5 kΩ is 1 500 Ω within 0,1%\nfrequency 50,5 Hz\nV = 230∠-30,5 V", "1,000 V", "decimal dot",
}

// FuzzSheet runs arbitrary lines through the worksheet interpreter. An
// error lies inside its line and names it; every step shown as text or
// JSON is free of NaN and Inf, and the JSON is valid.
func FuzzSheet(f *testing.F) {
	for _, s := range sheetSeeds {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, src string) {
		lines := strings.Split(src, "\n")
		if len(lines) > 40 {
			lines = lines[:40]
		}
		s := New()
		for i, line := range lines {
			steps, _, err := s.Exec(line)
			if err != nil {
				le, ok := err.(*calc.Error)
				if !ok {
					t.Fatalf("line %d %q: error %T %v is not located", i+1, line, err, err)
				}
				// an error may name an earlier line, such as the line of
				// the network block that "end" closes
				if le.Line < 1 || le.Line > i+1 {
					t.Fatalf("line %d %q: error names line %d", i+1, line, le.Line)
				}
				at := lines[le.Line-1]
				if n := utf8.RuneCountInString(at); le.Col < 1 || le.Col > n+1 {
					t.Fatalf("line %d %q: column %d outside 1…%d: %s", le.Line, at, le.Col, n+1, le.Msg)
				}
				// a message may quote what was typed ("unknown name NaN")
				if (strings.Contains(le.Msg, "NaN") || strings.Contains(le.Msg, "Inf") || strings.Contains(le.Msg, "panic")) &&
					!strings.Contains(line, "NaN") && !strings.Contains(line, "Inf") && !strings.Contains(line, "panic") {
					t.Fatalf("line %q: message %q", line, le.Msg)
				}
				continue
			}
			f := s.Context().Format
			for _, st := range steps {
				for _, o := range append(append([]calc.Operand(nil), st.Inputs...), st.Results...) {
					if v := o.Value.V; math.IsNaN(real(v)) || math.IsNaN(imag(v)) || math.IsInf(real(v), 0) || math.IsInf(imag(v), 0) {
						t.Fatalf("line %q: %s = %v", line, o.Name, v)
					}
				}
				// values as shown (the step's text also quotes what was typed,
				// which may spell NaN, so look at the formatted values)
				for _, fm := range []calc.Format{f, {Digits: f.Digits, ASCII: true, Radians: f.Radians}} {
					_ = st.Text(fm, false)
					for _, o := range append(append([]calc.Operand(nil), st.Inputs...), st.Results...) {
						v := fm.Both(o.Value, false)
						if strings.Contains(v, "NaN") || strings.Contains(v, "Inf") || strings.Contains(v, "∠-180") || strings.Contains(v, "@-180") {
							t.Fatalf("line %q: %s shows as %s", line, o.Name, v)
						}
					}
				}
				js := st.JSON()
				if !json.Valid([]byte(js)) || strings.Contains(js, "NaN") || strings.Contains(js, "Inf") {
					t.Fatalf("line %q: JSON %s", line, js)
				}
			}
		}
	})
}
