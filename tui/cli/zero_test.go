package cli

import (
	"encoding/json"
	"strings"
	"testing"
)

// TestEvalZeroHasNoAngle: a zero phasor has no direction, so eval's text
// shows it without an angle in either order and in ASCII, while JSON keeps
// every number of the contract (shared DESIGN.md: re, im, mag, deg on every
// result), mag 0 saying that deg carries no meaning.
func TestEvalZeroHasNoAngle(t *testing.T) {
	tests := []struct {
		expr string
		opt  Options
		want string // the result line
	}{
		{"0 V", Options{}, "→ V1 = 0.000 V\n"},
		{"1 V - 1 V", Options{}, "→ V1 = 0.000 V\n"},
		{"230 V ∠120° + 230 V ∠-120° + 230 V", Options{}, "→ V1 = 0.000 V\n"},
		{"(3+j4 Ω) - (3+j4 Ω)", Options{}, "→ Z1 = 0.000 Ω\n"},
		{"0 A * 5", Options{PolarFirst: true}, "→ I1 = 0.000 A\n"},
		{"1 V - 1 V", Options{ASCII: true}, "-> V1 = 0.000 V\n"},
	}
	for _, tt := range tests {
		var out, errb strings.Builder
		if code := Eval([]string{tt.expr}, &out, &errb, tt.opt); code != ExitOK {
			t.Errorf("%s: exit %d: %s", tt.expr, code, errb.String())
			continue
		}
		if !strings.Contains(out.String(), tt.want) {
			t.Errorf("%s: want %q in:\n%s", tt.expr, tt.want, out.String())
		}
		for _, l := range strings.Split(out.String(), "\n") {
			if strings.Contains(l, "1 = ") && strings.ContainsAny(l, "∠@") {
				t.Errorf("%s: the result shows an angle: %q", tt.expr, l)
			}
		}
		var js, je strings.Builder
		opt := tt.opt
		opt.JSON = true
		Eval([]string{tt.expr}, &js, &je, opt)
		lines := strings.Split(strings.TrimSpace(js.String()), "\n")
		var r map[string]any
		if err := json.Unmarshal([]byte(lines[len(lines)-1]), &r); err != nil {
			t.Fatalf("%s: %v in %q", tt.expr, err, js.String())
		}
		for _, k := range []string{"re", "im", "mag", "deg"} {
			if v, ok := r[k]; !ok || v != 0.0 {
				t.Errorf("%s: JSON %s = %v, want 0 present", tt.expr, k, v)
			}
		}
	}
}
