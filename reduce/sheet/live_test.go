package sheet

import (
	"strings"
	"testing"
)

// A value taken from a function's or a statement's named result follows
// it when the frequency changes (X_L = ωL, common practice, moves with f).
func TestExtrasFollowFrequency(t *testing.T) {
	src := `network nw reference g
voltage source V1 = 10 V from g to a
resistor Ra = 10 Ω from a to b
inductor Lb = 10 mH from b to g
end
thevenin T = nw between b and g
z1 = T.zth
th = thevenin(10 V, 10 Ω, zl(10 mH))
thz = th.z
frequency 60 Hz
check z1 is T.zth within 1e-12 Ω
check thz is th.z within 1e-12 Ω
`
	s := New()
	sum, err := s.Run(strings.NewReader(src), nil)
	if err != nil || sum.Err != nil {
		t.Fatal(err, sum.Err)
	}
	if sum.Fail != 0 || sum.Pass != 2 {
		t.Errorf("checks: %d passed, %d failed; want 2, 0", sum.Pass, sum.Fail)
	}
}
