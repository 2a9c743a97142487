package sheet

import (
	"fmt"
	"strings"
	"testing"
	"time"
)

// generated returns a worksheet of n lines of mixed statements: element
// values, definitions built on earlier ones, checks, comments and a
// frequency change every 1000 lines (invented example data).
func generated(n int) string {
	var b strings.Builder
	b.WriteString("# generated worksheet, invented example data\n")
	for k := 10; k < n+9; k++ {
		if k%1000 == 999 {
			fmt.Fprintf(&b, "frequency %d Hz\n", 50+10*(k/1000%2))
			continue
		}
		switch k % 10 {
		case 0:
			fmt.Fprintf(&b, "resistor R%d = %d Ω\n", k, 10+k%90)
		case 1:
			fmt.Fprintf(&b, "inductor L%d = %d mH\n", k, 1+k%50)
		case 2:
			fmt.Fprintf(&b, "capacitor C%d = %d µF\n", k, 1+k%20)
		case 3:
			fmt.Fprintf(&b, "Z%d = R%d + L%d || C%d\n", k, k-3, k-2, k-1)
		case 4:
			fmt.Fprintf(&b, "V%d = 230∠-%d V\n", k, k%90)
		case 5:
			fmt.Fprintf(&b, "I%d = V%d / Z%d\n", k, k-1, k-2)
		case 6:
			fmt.Fprintf(&b, "check mag(I%d) is mag(V%d / Z%d) within 0.1%%\n", k-1, k-2, k-3)
		case 7:
			fmt.Fprintf(&b, "S%d = V%d * conj(I%d)\n", k, k-3, k-2)
		case 8:
			b.WriteString("# a comment line\n")
		case 9:
			fmt.Fprintf(&b, "(3+j4 Ω) * %d\n", k)
		}
	}
	return b.String()
}

// BenchmarkRun10k runs a generated 10 000-line worksheet.
func BenchmarkRun10k(b *testing.B) {
	ws := generated(10000)
	b.SetBytes(int64(len(ws)))
	for b.Loop() {
		s := New()
		sum, err := s.Run(strings.NewReader(ws), nil)
		if err != nil || sum.Err != nil || sum.Fail != 0 {
			b.Fatalf("run: %v %v fail %d", err, sum.Err, sum.Fail)
		}
	}
}

// TestRun10kNoStall runs the same worksheet once, with a generous bound
// that only catches a stall (the figure itself comes from the benchmark).
func TestRun10kNoStall(t *testing.T) {
	ws := generated(10000)
	start := time.Now()
	s := New()
	sum, err := s.Run(strings.NewReader(ws), nil)
	if err != nil || sum.Err != nil {
		t.Fatalf("run: %v %v", err, sum.Err)
	}
	if sum.Lines != 10000 || sum.Fail != 0 || sum.Pass < 990 {
		t.Errorf("lines %d, checks %d passed %d failed", sum.Lines, sum.Pass, sum.Fail)
	}
	if d := time.Since(start); d > 20*time.Second {
		t.Errorf("10 000 lines took %v", d)
	}
}
