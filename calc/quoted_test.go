package calc

import (
	"strings"
	"testing"
)

// TestErrorQuotesTyped: a parse error quotes the token as it was typed, so
// the text it names can be found in the input (a bare j is not "j1", 4j is
// not "j4").
func TestErrorQuotesTyped(t *testing.T) {
	tests := []struct {
		src, want string
	}{
		{"(1000 j", `found "j"`},
		{"(2 4j", `found "4j"`},
		{"exp(1000 j)", `found "j"`},
		{"exp(2 3j)", `found "3j"`},
		{"5 j", `unexpected "j"`},
		{"(3 i", `found "i"`},
	}
	for _, tt := range tests {
		_, err := evalString(newTestEnv(), tt.src)
		if err == nil {
			t.Errorf("%s: no error", tt.src)
			continue
		}
		if !strings.Contains(err.Msg, tt.want) {
			t.Errorf("%s: error %q, want it to contain %s", tt.src, err.Msg, tt.want)
		}
		// every quoted piece of the message is text of the input
		parts := strings.Split(err.Msg, `"`)
		for i := 1; i < len(parts); i += 2 {
			if !strings.Contains(tt.src, parts[i]) {
				t.Errorf("%s: error quotes %q, which was not typed", tt.src, parts[i])
			}
		}
	}
}
