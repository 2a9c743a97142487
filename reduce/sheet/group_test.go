package sheet

import "testing"

// An operand already in one pair of parentheses is not wrapped in a
// second in a formula; anything else is, so the formula reads as typed.
func TestGroup(t *testing.T) {
	for _, tt := range []struct{ in, want string }{
		{"Za", "(Za)"},
		{"10 Ω", "(10 Ω)"},
		{"(10 Ω + j5 Ω)", "(10 Ω + j5 Ω)"},
		{"(a) + (b)", "((a) + (b))"},
		{"(a)·(b)", "((a)·(b))"},
		{"((a))", "((a))"},
		{"(a", "((a)"},
		{"", "()"},
	} {
		if got := group(tt.in); got != tt.want {
			t.Errorf("group(%q) = %q, want %q", tt.in, got, tt.want)
		}
	}
	_, f := binaryRule("||", "(10 Ω + j5 Ω)", "4k7")
	if want := "(10 Ω + j5 Ω)·(4k7) / ((10 Ω + j5 Ω) + (4k7))"; f != want {
		t.Errorf("formula %q, want %q", f, want)
	}
}
