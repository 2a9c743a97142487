package sheet

import (
	"fmt"
	"math/cmplx"
	"strings"
	"testing"

	"argand/calc"
)

// TestFlatCompactChains: a chain of one operator is one level of the
// series-parallel form however long it is; only parentheses nest. Series
// resistances add and equal parallel ones divide (common practice).
func TestFlatCompactChains(t *testing.T) {
	for _, c := range []struct {
		name  string
		n     int
		value string
		op    string
		wantZ float64
	}{
		{"series of 250", 250, "1 Ω", " + ", 250},
		{"parallel of 250", 250, "250 Ω", " || ", 1},
		{"series of 2000", 2000, "1 Ω", " + ", 2000},
	} {
		t.Run(c.name, func(t *testing.T) {
			s := New()
			names := make([]string, c.n)
			for i := range names {
				names[i] = fmt.Sprintf("R%d", i+1)
				if _, _, err := s.Exec("resistor " + names[i] + " = " + c.value); err != nil {
					t.Fatal(err)
				}
			}
			if _, _, err := s.Exec("network N = " + strings.Join(names, c.op) + " fed by 10 V"); err != nil {
				t.Fatalf("flat chain refused: %v", err)
			}
			z, _ := s.Lookup("N.z")
			if cmplx.Abs(z.V-complex(c.wantZ, 0)) > 1e-9*c.wantZ {
				t.Errorf("N.z = %v, want %v Ω", z.V, c.wantZ)
			}
		})
	}
	// real nesting past the bound is still refused, with a message that
	// says what nests
	s := New()
	s.Exec("resistor Ra = 1 Ω")
	s.Exec("resistor Rb = 1 Ω")
	deep := strings.Repeat("(Ra || ", calc.MaxDepth/2+2) + "Rb" + strings.Repeat(")", calc.MaxDepth/2+2)
	_, _, err := s.Exec("network D = " + deep)
	if err == nil || !strings.Contains(err.Error(), "nested too deeply") {
		t.Errorf("deep nesting: %v", err)
	}
}

// TestSweepErrorOnce: the error at a sweep point says its cause once.
func TestSweepErrorOnce(t *testing.T) {
	for _, src := range []string{
		"sweep exp(1000*f/1 Hz) from 1 Hz to 10 Hz",
		"sweep ln(0*f/1 Hz) from 1 Hz to 10 Hz",
	} {
		_, _, err := New().Exec(src)
		if err == nil {
			t.Fatalf("%s: no error", src)
		}
		msg := err.(*calc.Error).Msg
		if !strings.HasPrefix(msg, "at ") {
			t.Errorf("%s: %q does not name the point", src, msg)
		}
		// no clause of the message comes twice
		seen := map[string]bool{}
		for _, part := range strings.Split(msg, ": ") {
			if seen[part] {
				t.Errorf("%s: %q repeats %q", src, msg, part)
			}
			seen[part] = true
		}
		if len(seen) < 3 {
			t.Errorf("%s: %q: want the point, the function and the reason", src, msg)
		}
	}
}
