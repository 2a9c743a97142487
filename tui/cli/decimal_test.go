package cli

import (
	"context"
	"strings"
	"testing"
)

// TestEvalDecimalComma: --decimal-comma reads and shows the comma (SI
// Brochure 9th ed., §5.4.4), and the JSON output is the same object for
// object as the point form's.
func TestEvalDecimalComma(t *testing.T) {
	var out, errb strings.Builder
	if code := Eval([]string{"L = 2,2 mH", "Z = parallel(2,2 kΩ; 4,7 kΩ)"}, &out, &errb, Options{Comma: true}); code != ExitOK {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	if !strings.Contains(out.String(), "→ L = 2,200 mH") || !strings.Contains(out.String(), "→ Z = 1,499 kΩ") {
		t.Errorf("output:\n%s", out.String())
	}
	var pj, cj, e1, e2 strings.Builder
	Eval([]string{"L = 2.2 mH", "Z = parallel(2.2 kΩ, 4.7 kΩ)"}, &pj, &e1, Options{JSON: true})
	Eval([]string{"L = 2,2 mH", "Z = parallel(2,2 kΩ; 4,7 kΩ)"}, &cj, &e2, Options{JSON: true, Comma: true})
	pv, cv := jsonValues(t, pj.String()), jsonValues(t, cj.String())
	if len(pv) < 2 || strings.Join(pv, "\n") != strings.Join(cv, "\n") {
		t.Errorf("JSON differs:\n%s\n%s", pj.String(), cj.String())
	}
	// the point form under the comma is refused with the fix, exit 2
	out.Reset()
	errb.Reset()
	if code := Eval([]string{"2.2 mH"}, &out, &errb, Options{Comma: true}); code != ExitBadInput || !strings.Contains(errb.String(), "decimal point? write 2,2 mH, or set decimal point") {
		t.Errorf("exit %d: %s", code, errb.String())
	}
}

// TestExampleDecimalComma: the built-in example, written for the comma,
// runs under --decimal-comma to the same values as under the point.
func TestExampleDecimalComma(t *testing.T) {
	var pj, cj, e1, e2 strings.Builder
	pc := BatchContext(context.Background(), "", nil, &pj, &e1, Options{JSON: true})
	cc := BatchContext(context.Background(), "", nil, &cj, &e2, Options{JSON: true, Comma: true})
	if pc != cc || pc == ExitBadInput {
		t.Fatalf("exit %d under the point, %d under the comma: %s %s", pc, cc, e1.String(), e2.String())
	}
	if p, c := jsonValues(t, pj.String()), jsonValues(t, cj.String()); strings.Join(p, "\n") != strings.Join(c, "\n") {
		t.Errorf("example differs under the comma")
	}
	if ExampleIn(true) == Example {
		t.Errorf("the example has no decimals to rewrite")
	}
}

// TestHelpDecimal: help on the statement gives the whole paragraph, with
// both settings, the flag and the key.
func TestHelpDecimal(t *testing.T) {
	txt, ok := Topic("decimal")
	if !ok {
		t.Fatal("no help on decimal")
	}
	for _, want := range []string{"decimal point (the default)", "--decimal-comma", "key ,", "parallel(2,2 kΩ; 4,7 kΩ)", "1 000 000 V", "JSON output never changes"} {
		if !strings.Contains(txt, want) {
			t.Errorf("help decimal lacks %q:\n%s", want, txt)
		}
	}
}
