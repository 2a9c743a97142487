package threephase

import (
	"math"
	"strings"
	"testing"

	"argand/calc"
)

// Converting a marked voltage: as a phasor, V_ab is formed directly as
// V_an − V_bn of the balanced set (V_bn = V_an∠∓120° for ABC/ACB, common
// practice); as a magnitude only √3 applies and the angle is kept.
func TestVoltageMarkings(t *testing.T) {
	for _, seq := range []Sequence{ABC, ACB} {
		van := polar(230, 12)
		set := phaseSet(van, seq)
		vab := set[0] - set[1]
		ln, _, err := Mark(V(van), calc.LineToNeutral)
		if err != nil {
			t.Fatal(err)
		}
		got, steps, err := Voltage(ln, calc.LineToLine, "VLL", seq, true)
		if err != nil || !close(got.V, vab) || got.Ref != calc.LineToLine {
			t.Fatalf("%v: l2n → VLL phasor = %v (%v), want %v", seq, got, err, vab)
		}
		if len(steps) != 1 || !strings.Contains(strings.Join(steps[0].Notes, " "), "was marked line-to-neutral") {
			t.Errorf("%v: no note of the conversion: %+v", seq, steps)
		}
		// and back: a line-to-line value where line-to-neutral is asked
		ll, _, _ := Mark(V(vab), calc.LineToLine)
		back, _, err := Voltage(ll, calc.LineToNeutral, "VLN", seq, true)
		if err != nil || !close(back.V, van) {
			t.Errorf("%v: l2l → VLN = %v, want %v", seq, back.V, van)
		}
		// magnitudes: 400 V line-to-line is 230.9 V line-to-neutral
		mag, steps, err := Voltage(V(400), calc.LineToLine, "V", seq, false)
		if err != nil || mag.V != 400 {
			t.Fatalf("unmarked 400 V: %v, %v", mag, err)
		}
		if r := steps[0].Results[1].Value.V; !close(r, complex(400/math.Sqrt(3), 0)) {
			t.Errorf("V_LN of 400 V = %v", r)
		}
		if !strings.Contains(steps[0].Rule, "400.0 V line-to-line = 230.9 V line-to-neutral") {
			t.Errorf("rule %q", steps[0].Rule)
		}
	}
	if _, _, err := Mark(I(1), calc.LineToLine); err == nil {
		t.Error("a current marked line-to-line: no error")
	}
	ll, _, _ := Mark(V(400), calc.LineToLine)
	if _, _, err := Mark(ll, calc.LineToNeutral); err == nil || !strings.Contains(err.Error(), "already marked line-to-line") {
		t.Errorf("re-marking: %v", err)
	}
	// not a voltage: left for the caller's own check
	if q, st, err := Voltage(I(2), calc.LineToLine, "V", ABC, false); err != nil || st != nil || q.V != 2 {
		t.Errorf("a current passed through: %v %v %v", q, st, err)
	}
}
