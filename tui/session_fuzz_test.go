package tui

import (
	"testing"
)

// FuzzDecode feeds arbitrary bytes to the session-file reader: it must
// return an error or a worksheet, never panic, and a worksheet it accepts
// must encode to a file that decodes again to the same statements (the
// round trip a restart relies on).
func FuzzDecode(f *testing.F) {
	f.Add([]byte(`{"version":1,"statements":["Z1 = 3+j4 Ω","Z2 = Z1 || 10 Ω"],"view":{}}`))
	f.Add([]byte(`{"version":1,"statements":["frequency 0 Hz"]}`))
	f.Add([]byte(`{"version":99}`))
	f.Add([]byte(`not json`))
	f.Add([]byte{})
	f.Fuzz(func(t *testing.T, data []byte) {
		if len(data) > 1<<16 {
			return
		}
		sh, file, _, err := decode(data, false)
		if err != nil {
			return
		}
		s := newSession(false)
		s.sh, s.v = sh, file.View
		again, _, _, err := decode(s.encode(), false)
		if err != nil {
			t.Fatalf("a decoded session does not decode again: %v", err)
		}
		a, b := sh.Statements(), again.Statements()
		if len(a) != len(b) {
			t.Fatalf("round trip: %d statements, then %d", len(a), len(b))
		}
		for i := range a {
			if a[i] != b[i] {
				t.Fatalf("round trip: statement %d %q became %q", i, a[i], b[i])
			}
		}
	})
}
