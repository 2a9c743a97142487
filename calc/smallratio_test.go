package calc

import "testing"

func TestSmallRatio(t *testing.T) {
	for _, c := range []struct {
		x    float64
		want string
	}{
		{8.8e-16, "8.8×10^-16"},
		{1.2e-9, "1.2×10^-9"},
		{-3.06e-13, "-3.1×10^-13"},
		{0.5, "0.5"},
		{0.012, "0.012"},
		{2.5e6, "2.5×10^6"},
		{0, "0"},
	} {
		if got := SmallRatio(c.x); got != c.want {
			t.Errorf("SmallRatio(%g) = %q, want %q", c.x, got, c.want)
		}
	}
}
