package sheet

import (
	"math"
	"math/cmplx"
	"strings"
	"testing"

	"argand/calc"
)

// Every three-phase voltage parameter says in help whether it takes a
// line-to-line or a line-to-neutral voltage.
func TestThreePhaseVoltagesNamed(t *testing.T) {
	want := map[string]string{
		"balanced": "VLL", "delta": "VLL", "wattmeters": "VLL", "motor": "VLL",
		"wye": "VLN", "wyeunbal": "line-to-neutral", "deltaunbal": "line-to-line",
		"current": "line-to-line", "pfc": "line-to-line", "pfcload": "line-to-line",
		"cabledrop": "line-to-line", "xfmr": "line-to-line", "faultcurrent": "line-to-line",
		"pubase": "VLL", "rebase": "line-to-line", "radial": "line-to-line",
	}
	seen := map[string]bool{}
	for _, f := range Functions() {
		w, ok := want[f.Name]
		if !ok {
			continue
		}
		seen[f.Name] = true
		if !strings.Contains(f.Args+" "+f.Doc, w) {
			t.Errorf("%s%s: help does not name %q: %s", f.Name, f.Args, w, f.Doc)
		}
	}
	for name := range want {
		if !seen[name] {
			t.Errorf("no function %s", name)
		}
	}
}

func execOK(t *testing.T, s *Sheet, line string) []calc.Step {
	t.Helper()
	steps, _, err := s.Exec(line)
	if err != nil {
		t.Fatalf("%s: %v", line, err)
	}
	return steps
}

func valueOf(t *testing.T, s *Sheet, name string) calc.Quantity {
	t.Helper()
	steps := execOK(t, s, name)
	r, ok := steps[len(steps)-1].Result()
	if !ok {
		t.Fatalf("%s: no result", name)
	}
	return r.Value
}

// A marked voltage is checked against the parameter: converted where the
// other form is asked (with a note), refused where converting makes no
// sense. Expected values come from the phasors themselves: for a balanced
// ABC set V_ab = V_an − V_bn with V_bn = V_an∠−120° (common practice), and
// the three-phase line current I = |S|/(√3·|V_LL|) (common practice).
func TestMarkedVoltages(t *testing.T) {
	s := New()
	van := complex(230, 0)
	vab := van - van*cmplx.Rect(1, -2*math.Pi/3)
	close := func(name string, got, want complex128) {
		t.Helper()
		if cmplx.Abs(got-want) > 1e-9*cmplx.Abs(want) {
			t.Errorf("%s = %v, want %v", name, got, want)
		}
	}
	execOK(t, s, "z = 10+j5 Ω")
	// balanced takes V_ab: a line-to-neutral value is converted as a phasor
	a := valueOf(t, s, "balanced(l2n(230 V), z, wye)")
	b := valueOf(t, s, "balanced(345+j199.18584287042088 V, z, wye)")
	close("balanced from l2n", a.V, b.V)
	execOK(t, s, "vm = l2n(230 V)")
	close("vm.ll", valueOf(t, s, "vm.ll").V, vab)
	// wye takes V_an: a line-to-line value is converted
	execOK(t, s, "ya = wye(l2l(400 V), 10 Ω, 20 Ω, 30 Ω, floating)")
	execOK(t, s, "yb = wye(400 V/(sqrt(3)*1∠30), 10 Ω, 20 Ω, 30 Ω, floating)")
	close("wye from l2l", valueOf(t, s, "ya.ia").V, valueOf(t, s, "yb.ia").V)
	// current uses magnitudes: 10 kVA/(√3·√3·230 V)
	close("current", valueOf(t, s, "current(10 kVA, l2n(230 V), three)").V, complex(10e3/(3*230), 0))
	close("current unmarked", valueOf(t, s, "current(10 kVA, 400 V, three)").V, complex(10e3/(math.Sqrt(3)*400), 0))
	// single-phase takes the value as marked
	close("current single", valueOf(t, s, "current(10 kVA, l2n(230 V), single)").V, complex(10e3/230, 0))
	// every three-phase step shows both forms
	steps := execOK(t, s, "balanced(400 V, z, delta)")
	found := false
	for _, st := range steps {
		if strings.Contains(st.Rule, "400.0 V line-to-line = 230.9 V line-to-neutral") {
			found = true
		}
	}
	if !found {
		t.Errorf("balanced(400 V …) shows no line-to-line = line-to-neutral step")
	}
	steps = execOK(t, s, "cabledrop(l2n(230 V), 32 A, 0.9, lagging, 1.83 Ω/km, 0.09 Ω/km, 45 m, three)")
	note := false
	for _, st := range steps {
		for _, n := range st.Notes {
			if strings.Contains(n, "was marked line-to-neutral") && strings.Contains(n, "converted") {
				note = true
			}
		}
	}
	if !note {
		t.Errorf("cabledrop: no note of the conversion")
	}
	close("cabledrop", valueOf(t, s, "cabledrop(l2n(230 V), 32 A, 0.9, lagging, 1.83 Ω/km, 0.09 Ω/km, 45 m, three)").V,
		valueOf(t, s, "cabledrop(398.37168574084177 V, 32 A, 0.9, lagging, 1.83 Ω/km, 0.09 Ω/km, 45 m, three)").V)
	// refusals, each with a message that names the marking
	for _, bad := range []struct{ line, msg string }{
		{"l2n(l2l(400 V))", "already marked line-to-line"},
		{"line2phase(l2n(230 V), wye)", "marked line-to-neutral already"},
		{"phase2line(l2l(400 V), wye)", "marked line-to-line already"},
		{"wyeunbal(l2l(400 V), 230∠-120 V, 230∠120 V, 10 Ω, 10 Ω, 10 Ω, neutral)", "marked line-to-line"},
		{"l2l(3 A)", "takes a voltage"},
	} {
		if _, _, err := s.Exec(bad.line); err == nil || !strings.Contains(err.Error(), bad.msg) {
			t.Errorf("%s: %v, want an error saying %q", bad.line, err, bad.msg)
		}
	}
	// line2phase marks its result, so passing it on is consistent
	close("line2phase chain", valueOf(t, s, "wye(line2phase(400 V, wye), 10 Ω, 10 Ω, 10 Ω, 5 Ω)").V, 0)
	// arithmetic drops the marking: 1.05·l2n(230 V) is a new, unmarked value
	close("arithmetic", valueOf(t, s, "current(10 kVA, 1.05*l2n(230 V), three)").V, complex(10e3/(math.Sqrt(3)*1.05*230), 0))
}

// The neutral argument of wye and wyeunbal: a word or an impedance, and a
// clear refusal otherwise.
func TestWyeNeutralArgument(t *testing.T) {
	s := New()
	for _, bad := range []struct{ line, msg string }{
		{"wye(230 V, 10 Ω, 10 Ω, 10 Ω, 5 A)", "the neutral"},
		{"wye(230 V, 10 Ω, 10 Ω, 10 Ω, 10 Ω, neutral)", "takes 5 argument"},
		{"wyeunbal(230 V, 230 V, 10 Ω, 10 Ω, 10 Ω, 10 Ω, neutral)", "VcN takes a voltage"},
	} {
		if _, _, err := s.Exec(bad.line); err == nil || !strings.Contains(err.Error(), bad.msg) {
			t.Errorf("%s: %v, want an error saying %q", bad.line, err, bad.msg)
		}
	}
	// a 0 Ω neutral impedance is a solid neutral
	a := valueOf(t, s, "wye(230 V, 10 Ω, 20 Ω, 30 Ω, 0 Ω)")
	b := valueOf(t, s, "wye(230 V, 10 Ω, 20 Ω, 30 Ω, neutral)")
	if cmplx.Abs(a.V-b.V) > 1e-12*cmplx.Abs(b.V) {
		t.Errorf("Z_N = 0: %v, solid neutral %v", a.V, b.V)
	}
}

// Named arguments carry the line-to-line or line-to-neutral name of the
// parameter, and the marking is checked the same way.
func TestNamedThreePhaseArguments(t *testing.T) {
	s := New()
	a := valueOf(t, s, "balanced(VLL = l2n(230 V), Zph = 10 Ω, conn = wye)")
	b := valueOf(t, s, "balanced(l2n(230 V), 10 Ω, wye)")
	if a.V != b.V {
		t.Errorf("named %v, positional %v", a.V, b.V)
	}
	c := valueOf(t, s, "wye(VLN = 230 V, Za = 8 Ω, Zb = 15 Ω, Zc = 40 Ω, neutral = 0.8+j0.2 Ω)")
	d := valueOf(t, s, "wye(230 V, 8 Ω, 15 Ω, 40 Ω, 0.8+j0.2 Ω)")
	if c.V != d.V {
		t.Errorf("named %v, positional %v", c.V, d.V)
	}
	if _, _, err := s.Exec("balanced(Vline = 400 V, Zph = 10 Ω, conn = wye)"); err == nil || !strings.Contains(err.Error(), "VLL") {
		t.Errorf("an old parameter name: %v", err)
	}
}
