package sketch

import (
	"strings"
	"testing"
)

// TestComma: with the decimal comma set, the legend and the power
// triangle's labels write 2,50 kW, not 2.50 kW, as the worksheet does.
func TestComma(t *testing.T) {
	tri := strings.Join(Triangle(2500, 1200, 40, 12, Options{Comma: true}), "\n")
	// P 2.5 kW, Q 1.2 kvar: S = 2773 VA, φ = 25.64°, pf 0.902 (common
	// practice: S = √(P² + Q²), pf = P/S)
	for _, want := range []string{"2,50 kW", "1,20 kvar", "2,77 kVA", "25,64", "pf 0,902"} {
		if !strings.Contains(tri, want) {
			t.Errorf("triangle lacks %q:\n%s", want, tri)
		}
	}
	if pt := strings.Join(Triangle(2500, 1200, 40, 12, Options{}), "\n"); !strings.Contains(pt, "2.50 kW") || strings.Contains(pt, "2,50") {
		t.Errorf("triangle under the point:\n%s", pt)
	}
}
