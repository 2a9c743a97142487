package calc

import "testing"

func TestCaretUnderEscapes(t *testing.T) {
	for _, src := range []string{"\n", "\r", "\nA", "x\x1b + 1/", "\u202e1 +", "\t)"} {
		if _, err := ParseExpr(src, 1); err != nil {
			checkErr(t, src, err)
		}
	}
}
