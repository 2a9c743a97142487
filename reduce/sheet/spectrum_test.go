package sheet

import (
	"math"
	"math/cmplx"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"argand/calc"
)

func runOn(t *testing.T, s *Sheet, lines ...string) {
	t.Helper()
	for _, l := range lines {
		if _, _, err := s.Exec(l); err != nil {
			t.Fatalf("%s: %v", l, err)
		}
	}
}

func value(t *testing.T, s *Sheet, name string) calc.Quantity {
	t.Helper()
	q, ok := s.Lookup(name)
	if !ok {
		t.Fatalf("%s is not defined", name)
	}
	return q
}

// TestSpectrumStatement enters a spectrum as a worksheet statement and
// checks what the functions read from it against the waveform sampled at
// 10⁴ points per period in the test (RMS and THD from the samples).
// Example data: an invented rectifier load.
func TestSpectrumStatement(t *testing.T) {
	s := New()
	runOn(t, s, "spectrum Iload h1 100 A ∠ -20, h3 35 % ∠ 60, h5 22 A ∠ 170, h7 12 % ∠ -40",
		"r = hrms(Iload)", "d = thd(Iload)", "td = tdd(Iload, 150 A)")
	type ord struct{ h, rms, deg float64 }
	os := []ord{{1, 100, -20}, {3, 35, 60}, {5, 22, 170}, {7, 12, -40}}
	const n = 10000
	var sum2 float64
	var c1 complex128
	for k := 0; k < n; k++ {
		th := 2 * math.Pi * float64(k) / n
		x := 0.0
		for _, o := range os {
			x += math.Sqrt2 * o.rms * math.Cos(o.h*th+o.deg*math.Pi/180)
		}
		sum2 += x * x
		c1 += complex(x, 0) * cmplx.Rect(1, -th)
	}
	rms := math.Sqrt(sum2 / n)
	x1 := cmplx.Abs(c1) * math.Sqrt2 / n
	xh := math.Sqrt(rms*rms - x1*x1)
	for _, c := range []struct {
		name string
		want float64
	}{{"r", rms}, {"r.h1", x1}, {"r.hh", xh}, {"d", xh / x1}, {"td", xh / 150}} {
		got := real(value(t, s, c.name).V)
		if math.Abs(got-c.want) > 1e-9*c.want {
			t.Errorf("%s = %.12g, want %.12g", c.name, got, c.want)
		}
	}
	// the spectrum's own step: a row per order and a plot
	var st *calc.Step
	for i := range s.Steps() {
		if s.Steps()[i].Kind == "spectrum" {
			st = &s.Steps()[i]
		}
	}
	if st == nil || len(st.Rows) != 4 || !strings.Contains(strings.Join(st.Notes, "\n"), "plot:") {
		t.Fatalf("spectrum step: %+v", st)
	}
	// redefining the spectrum re-evaluates what reads it
	runOn(t, s, "spectrum Iload h1 100 A ∠ -20, h5 10 %")
	if got := real(value(t, s, "d").V); math.Abs(got-0.1) > 1e-12 {
		t.Errorf("after the redefinition thd = %g, want 0.1", got)
	}
}

func TestSpectrumErrors(t *testing.T) {
	cs := []struct {
		pre  []string
		line string
		col  int
		want string
	}{
		{nil, "spectrum", 9, "expected a name"},
		{nil, "spectrum I", 11, "needs its orders"},
		{nil, "spectrum I h3 10 A", 10, "fundamental (h1) is missing"},
		{nil, "spectrum I h1 10 A, h5 1 A, h5 2 A", 29, "order 5 is given twice"},
		{nil, "spectrum I h1 10 A, k5 1 A", 21, "expected an order"},
		{nil, "spectrum I h1 10 A, h5", 23, "needs a value"},
		{nil, "spectrum I h1=10 A", 14, "without '='"},
		{nil, "spectrum I h1 10 A,", 20, "found the end of the line"},
		{nil, "spectrum I h1 10 A, h5 -2 %", 21, "positive number"},
		{nil, "spectrum I h1 10 A h5 2 A", 20, "expected ','"},
		{nil, "spectrum I h1 10 A, h5 2 V", 21, "order 5 is in V but"},
		{nil, "spectrum I h1 10 A, h500 2 A", 21, "outside 1 to 100"},
		{nil, "spectrum I h1 10 Ω", 12, "voltage or a current"},
		{nil, "spectrum f h1 10 A", 10, "reserved"},
		{[]string{"x = 3"}, "spectrum x h1 10 A", 10, "already a named value"},
		{[]string{"spectrum Ia h1 10 A"}, "spectrum IA h1 10 A", 10, "only in case"},
		{[]string{"spectrum Ia h1 10 A"}, "Ia = 3", 1, "a spectrum"},
		{nil, "spectrum I from", 16, "file name is missing"},
		{nil, "spectrum I from /nonexistent/file.csv", 17, "cannot open"},
		{[]string{"x = 3"}, "thd(x)", 1, "name of a spectrum"},
		{nil, "thd(I)", 5, "unknown name"},
		{[]string{"spectrum I h1 10 A, h5 2 A"}, "crest(I)", 1, "angle of order 5"},
		{[]string{"spectrum I h1 10 A", "y = thd(I)"}, "forget I", 8, "y depends on it"},
	}
	for _, c := range cs {
		s := New()
		runOn(t, s, c.pre...)
		before := len(s.Steps())
		_, _, err := s.Exec(c.line)
		le, ok := err.(*calc.Error)
		if !ok || le.Col != c.col || !strings.Contains(le.Msg, c.want) {
			t.Errorf("%q: error %v (col %d), want %q at column %d", c.line, err, colOf(err), c.want, c.col)
		}
		if len(s.Steps()) != before {
			t.Errorf("%q: a failed statement left steps", c.line)
		}
	}
}

func colOf(err error) int {
	if le, ok := err.(*calc.Error); ok {
		return le.Col
	}
	return 0
}

func TestSpectrumFile(t *testing.T) {
	dir := t.TempDir()
	good := filepath.Join(dir, "bus.csv")
	// example data: an invented bus voltage
	if err := os.WriteFile(good, []byte("order,value,angle\n1,230 V,0\n5,3 %,-60\n7,1.5 %,30\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	bad := filepath.Join(dir, "bad.csv")
	if err := os.WriteFile(bad, []byte("1,230 V\n5,3 %\n5,2 %\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	s := New()
	runOn(t, s, "spectrum Vbus from "+good, "d = thd(Vbus)")
	want := math.Hypot(0.03, 0.015)
	if got := real(value(t, s, "d").V); math.Abs(got-want) > 1e-12 {
		t.Errorf("thd = %g, want %g", got, want)
	}
	_, _, err := s.Exec("spectrum Vb from " + bad)
	if err == nil || !strings.Contains(err.Error(), "line 3") || !strings.Contains(err.Error(), "given twice") {
		t.Errorf("bad file: %v", err)
	}
	if _, _, err := s.Exec("spectrum Vd from " + dir); err == nil || !strings.Contains(err.Error(), "not a regular file") {
		t.Errorf("a directory: %v", err)
	}
}

// TestSpectrumSession: a clone does not see spectra defined after it, a
// check-as-you-type validation defines nothing, and forget removes one.
func TestSpectrumSession(t *testing.T) {
	s := New()
	runOn(t, s, "spectrum A1 h1 10 A")
	c := s.Clone()
	runOn(t, c, "spectrum B1 h1 5 A")
	if _, ok := s.Spectrum("B1"); ok {
		t.Error("a clone's spectrum reached the original")
	}
	if err := s.Validate("spectrum C1 h1 5 A, h3 2 A"); err != nil {
		t.Errorf("validate: %v", err)
	}
	if err := s.Validate("spectrum C1 h1 5 A, h3"); err == nil {
		t.Error("validate accepted a missing value")
	}
	if _, ok := s.Spectrum("C1"); ok {
		t.Error("validation defined a spectrum")
	}
	runOn(t, s, "forget A1")
	if _, ok := s.Spectrum("A1"); ok {
		t.Error("forget left the spectrum")
	}
	// a replayed worksheet rebuilds its spectra
	s2 := New()
	runOn(t, s2, c.Statements()...)
	if names := s2.SpectrumNames(); len(names) != 2 {
		t.Errorf("replayed spectra %v", names)
	}
}

// TestSpectrumKinds: the powers of IEEE Std 1459-2010 keep their kinds
// through the worksheet: W for active, var for reactive and distortion
// powers, VA for apparent powers; ratios carry no unit.
func TestSpectrumKinds(t *testing.T) {
	s := New()
	runOn(t, s, "spectrum U h1 230 V, h5 3 % ∠ -60", "spectrum I h1 10 A ∠ -30, h5 20 % ∠ 40", "pw = hpower(U, I)")
	want := map[string]string{"pw": "VA", "pw.p": "W", "pw.p1": "W", "pw.ph": "W", "pw.q1": "var", "pw.n": "var",
		"pw.di": "var", "pw.dv": "var", "pw.dh": "var", "pw.s1": "VA", "pw.sn": "VA", "pw.sh": "VA", "pw.pf": "", "pw.pf1": ""}
	for name, unit := range want {
		q := value(t, s, name)
		if got := calc.UnitSymbol(q.Dim, q.Kind, false); got != unit || !q.IsReal() {
			t.Errorf("%s in %q (real %v), want %q", name, got, q.IsReal(), unit)
		}
	}
	js := s.Steps()[len(s.Steps())-1].JSON()
	for _, frag := range []string{`"name":"pw.p","re":`, `"unit":"var"`, `"unit":"W"`} {
		if !strings.Contains(js, frag) {
			t.Errorf("JSON lacks %s: %s", frag, js)
		}
	}
}

// TestSpectrumNamedArguments: the harmonic and bank functions take their
// arguments by name in any order, and refuse an argument of the wrong kind
// before they run.
func TestSpectrumNamedArguments(t *testing.T) {
	s := New()
	runOn(t, s, "spectrum I h1 100 A ∠ -20, h5 22 % ∠ 170",
		"a = tdd(I, 150 A)", "b = tdd(IL = 150 A, I = I)",
		"c = bankcheck(10 MVA, 400 kvar, I, 7 %)", "d = bankcheck(Qc = 400 kvar, X = I, p = 7 %, Ssc = 10 MVA)",
		"e1 = detune(50 kvar, 400 V, 7 %, three)", "g = detune(phases = three, p = 7 %, V = 400 V, Qc = 50 kvar)")
	for _, pair := range [][2]string{{"a", "b"}, {"c", "d"}, {"e1", "g"}} {
		if x, y := value(t, s, pair[0]), value(t, s, pair[1]); x != y {
			t.Errorf("%s = %v but %s = %v", pair[0], x.V, pair[1], y.V)
		}
	}
	for _, c := range []struct{ line, want string }{
		{"tdd(I, 150 V)", "IL takes a current in A"},
		{"bankcheck(10 kW, 400 kvar, I)", "Ssc takes an apparent power in VA"},
		{"detune(50 kW, 400 V, 7 %, three)", "Qc takes a reactive power in var"},
		{"bankout(60 kvar, 440 V, 400 A)", "V takes a voltage in V"},
	} {
		_, _, err := s.Exec(c.line)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: %v, want %q", c.line, err, c.want)
		}
	}
}
