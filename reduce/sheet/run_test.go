package sheet

import (
	"bufio"
	"fmt"
	"math"
	"reflect"
	"strings"
	"testing"

	"argand/calc"
)

// TestRunReportsEveryError: a run does not stop at a bad line. Every bad
// line is reported with its place, lines reading a name a bad line would
// have defined are skipped with the line they depend on, and every other
// line runs.
func TestRunReportsEveryError(t *testing.T) {
	ws := strings.Join([]string{
		"V1 = 10 V",            // 1 ok
		"Z1 = V1 / 0",          // 2 error: division by zero
		"I1 = V1 / Z1",         // 3 skipped: reads Z1
		"P1 = I1 * V1",         // 4 skipped: reads I1, itself skipped
		"check V1 is 11 V",     // 5 a failed check
		"Z2 = 3+j4 Ω",          // 6 ok
		"nosuch + 1",           // 7 error: unknown name
		"Z1 = 5 Ω",             // 8 ok: Z1 now defined
		"I2 = V1 / Z1",         // 9 ok: reads the new Z1
		"check I2 is 2 A",      // 10 passes: 10 V / 5 Ω = 2 A (Ohm's law)
		"T1 = thevenin(1 V, )", // 11 error
		"Zt = T1.z",            // 12 skipped: reads a result of T1
	}, "\n")
	s := New()
	var ran []int
	sum, err := s.Run(strings.NewReader(ws), func(st []calc.Step) { ran = append(ran, st[0].Line) })
	if err != nil {
		t.Fatal(err)
	}
	type prob struct{ line, dep, root int }
	var got []prob
	for _, p := range sum.Problems {
		got = append(got, prob{p.Err.Line, p.DependsOn, p.Root})
	}
	want := []prob{{2, 0, 2}, {3, 2, 2}, {4, 3, 2}, {7, 0, 7}, {11, 0, 11}, {12, 11, 11}}
	if !reflect.DeepEqual(got, want) {
		t.Errorf("problems %v, want %v", got, want)
	}
	if !reflect.DeepEqual(ran, []int{1, 5, 6, 8, 9, 10}) {
		t.Errorf("lines run %v, want 1 5 6 8 9 10", ran)
	}
	if sum.Errors() != 3 || sum.Pass != 1 || sum.Fail != 1 || !reflect.DeepEqual(sum.Failed, []int{5}) {
		t.Errorf("errors %d, checks %d/%d, failed %v", sum.Errors(), sum.Pass, sum.Fail, sum.Failed)
	}
	if sum.Err == nil || sum.Err.Line != 2 || sum.Err.Col != 9 || sum.ErrSrc != "Z1 = V1 / 0" {
		t.Errorf("first error %v in %q, want line 2 col 9", sum.Err, sum.ErrSrc)
	}
	if !strings.Contains(sum.Problems[2].Err.Msg, "skipped: depends on line 3 (which depends on line 2)") {
		t.Errorf("skip message %q", sum.Problems[2].Err.Msg)
	}
}

// TestReadLineBreaks: a line ends at LF, CR LF or a lone CR; a byte-order
// mark at the start of a file is dropped.
func TestReadLineBreaks(t *testing.T) {
	in := "a\nb\r\nc\rd\r\re"
	br := bufio.NewReader(strings.NewReader(in))
	var got []string
	for {
		l, _, err := ReadLine(br)
		if err != nil {
			break
		}
		got = append(got, l)
	}
	if want := []string{"a", "b", "c", "d", "", "e"}; !reflect.DeepEqual(got, want) {
		t.Errorf("lines %q, want %q", got, want)
	}
	s := New()
	sum, err := s.Run(strings.NewReader("\ufeffV1 = 230 V\rI1 = 2 A\r\nS1 = V1 * I1\r"), nil)
	if err != nil || sum.Err != nil || sum.Lines != 3 {
		t.Fatalf("run: %v %v, %d lines", err, sum.Err, sum.Lines)
	}
	// S = V·I* = 460 VA for in-phase V and I (IEEE Std 1459-2010)
	if q, ok := s.Lookup("S1"); !ok || q.V != 460 {
		t.Errorf("S1 = %v, want 460 VA", q.V)
	}
}

// TestLanguageChanged: a worksheet that declares an older language lists
// the lines that read differently now, and only those; a newer one than
// this build reads is refused.
func TestLanguageChanged(t *testing.T) {
	ws := "language 1\nR1 = 4k7\nR2 = 4.7 kΩ\nV1 = 230 v\nZ1 = 10 µF || R2\nx = 3 * 2\n"
	s := New()
	sum, err := s.Run(strings.NewReader(ws), nil)
	if err != nil || sum.Err != nil {
		t.Fatalf("%v %v", err, sum.Err)
	}
	if want := []int{2, 4, 5}; !reflect.DeepEqual(sum.Changed, want) {
		t.Errorf("changed lines %v, want %v", sum.Changed, want)
	}
	// the same worksheet at the current language lists nothing
	sum, _ = New().Run(strings.NewReader(strings.Replace(ws, "language 1", LanguageLine(), 1)), nil)
	if len(sum.Changed) != 0 {
		t.Errorf("at language %d: changed %v", calc.Language, sum.Changed)
	}
	if _, _, err := New().Exec("language 99"); err == nil || !strings.Contains(err.Error(), "newer argand") {
		t.Errorf("language 99: %v", err)
	}
	// a saved worksheet gets the current language line afresh
	if st := s.Statements(); len(st) == 0 || st[0] == "language 1" {
		t.Errorf("statements %q keep the old language line", st)
	}
}

// TestPowerFromAcos: the example, fromvi(230 V, 6.2 A, acos(0.78)):
// P = V·I·pf = 230 × 6.2 × 0.78 = 1112.28 W and S = 1426 VA (common
// practice).
func TestPowerFromAcos(t *testing.T) {
	s := New()
	if _, _, err := s.Exec("p = fromvi(230 V, 6.2 A, acos(0.78))"); err != nil {
		t.Fatal(err)
	}
	var q calc.Quantity
	ok := false
	for _, n := range s.Names() {
		if v, _ := s.Lookup(n); strings.HasPrefix(n, "p.") && v.Dim == calc.DimPower && v.Kind == calc.KindActive {
			q, ok = v, true
		}
	}
	if !ok || math.Abs(real(q.V)-1112.28) > 1e-9*1112.28 {
		t.Errorf("P = %v, want 1112.28 W", q.V)
	}
}

// TestPartValuesInSeries: series(22 mH, 150 Ω) uses the inductor's
// impedance at the working frequency, X_L = ωL = 2π·50 Hz·22 mH (common
// practice), and says so in a note; the same at 60 Hz follows the setting.
func TestPartValuesInSeries(t *testing.T) {
	for _, f := range []float64{50, 60} {
		s := New()
		if _, _, err := s.Exec(fmt.Sprintf("frequency %g Hz", f)); err != nil {
			t.Fatal(err)
		}
		steps, _, err := s.Exec("Zs = series(22 mH, 150 Ω)")
		if err != nil {
			t.Fatal(err)
		}
		q, _ := s.Lookup("Zs")
		want := complex(150, 2*math.Pi*f*22e-3)
		if q.Dim != calc.DimImpedance || math.Abs(real(q.V)-real(want)) > 1e-9 || math.Abs(imag(q.V)-imag(want)) > 1e-9*imag(want) {
			t.Errorf("at %g Hz: Zs = %v, want %v Ω", f, q.V, want)
		}
		noted := false
		for _, st := range steps {
			for _, n := range st.Notes {
				noted = noted || strings.Contains(n, "22.00 mH at ")
			}
		}
		if !noted {
			t.Errorf("at %g Hz: no note on the inductor's impedance", f)
		}
	}
}

// TestElementTakesItsUnit: a number scaled by a prefix alone, or a
// letter-and-digit code (IEC 60062), given to an element takes the
// element's unit, with a note; a changed value too. X_C = −1/(ωC) at
// 50 Hz (common practice).
func TestElementTakesItsUnit(t *testing.T) {
	s := New()
	for _, l := range []string{"resistor R1 = 10k", "capacitor C1 = 100n", "inductor L1 = 2.2 mh", "resistor R2 = 4K7", "capacitor C2 = 4n7", "R1 = 12k"} {
		steps, _, err := s.Exec(l)
		if err != nil {
			t.Fatalf("%s: %v", l, err)
		}
		if len(steps) == 0 || len(steps[len(steps)-1].Notes) == 0 && len(steps[0].Notes) == 0 {
			t.Errorf("%s: no note on how the value was read", l)
		}
	}
	want := map[string]complex128{
		"R1": 12e3, "R2": 4.7e3,
		"C1": complex(0, -1/(2*math.Pi*50*100e-9)), "C2": complex(0, -1/(2*math.Pi*50*4.7e-9)),
		"L1": complex(0, 2*math.Pi*50*2.2e-3),
	}
	for n, v := range want {
		q, _ := s.Lookup(n)
		if q.Dim != calc.DimImpedance || cmplxAbs(q.V-v) > 1e-9*cmplxAbs(v) {
			t.Errorf("%s = %v, want %v Ω", n, q.V, v)
		}
	}
	_, _, err := s.Exec("inductor L2 = 2.2m")
	if err == nil || !strings.Contains(err.Error(), "m after a number is the metre") {
		t.Errorf("inductor L2 = 2.2m: %v", err)
	}
}
