package sweep

import (
	"testing"

	"argand/calc"
)

// TestRefineEvaluations: locating a finding between two points costs a
// few evaluations, not one per halving of the interval, so the work of
// reading a sweep does not outweigh a short sweep's own. Brent's methods
// (R. P. Brent, Algorithms for Minimization without Derivatives, 1973,
// ch. 4 and 5) converge superlinearly on a smooth function; the bound of
// 20 per finding is generous (bisection to 1e-14 takes about 45, a
// golden-section search to 1e-9 about 40). The findings themselves stay
// to the tolerances of TestFindingsAgainstClosedForms.
func TestRefineEvaluations(t *testing.T) {
	for _, rc := range rlcCases {
		f0, _, f1, f2 := rc.closed()
		tab := rc.table(t, f0)
		calls := 0
		fd := Find(tab, func(hz float64) (calc.Quantity, error) {
			calls++
			return rc.eval(hz)
		})
		// one resonance, one interior extreme, a band of two edges: four
		// findings; the extreme under the band is located once
		if want := 4 * 20; calls > want {
			t.Errorf("%s: %d evaluations to read the sweep, want at most %d", rc.name, calls, want)
		}
		if len(fd.Resonances) != 1 || len(fd.Bands) != 1 {
			t.Fatalf("%s: %d resonances, %d bands", rc.name, len(fd.Resonances), len(fd.Bands))
		}
		if r := fd.Resonances[0]; !relClose(r.Freq, f0, 1e-12) {
			t.Errorf("%s: resonance %v Hz, want %v (1e-12)", rc.name, r.Freq, f0)
		}
		if b := fd.Bands[0]; !relClose(b.F1, f1, 1e-9) || !relClose(b.F2, f2, 1e-9) {
			t.Errorf("%s: band %v … %v Hz, want %v … %v", rc.name, b.F1, b.F2, f1, f2)
		}
	}
}
