package sheet

import (
	"strings"
	"testing"
)

func TestTitle(t *testing.T) {
	long := "title " + strings.Repeat("x", MaxTitle+1)
	tests := []struct {
		lines []string
		want  string // the title after the lines
		err   string // "" when every line must succeed
	}{
		{[]string{"title Workshop supply, bay 3"}, "Workshop supply, bay 3", ""},
		{[]string{"title   Bay 3 – feeder \"B\"  # a comment"}, "Bay 3 – feeder \"B\"", ""},
		{[]string{"title first", "title second"}, "second", ""},
		{[]string{"title <b>&amp;</b> 50 %"}, "<b>&amp;</b> 50 %", ""},
		{[]string{"title"}, "", "needs the job's title"},
		{[]string{"title # only a comment"}, "", "needs the job's title"},
		{[]string{long}, "", "at most 200 characters"},
		{[]string{"title = 3"}, "", "reserved"},
		{[]string{"title bay\x1b[2J 3"}, "", "no control"},
		{[]string{"title bay \u202e3"}, "", "no control"},
		{[]string{"Z = 3+j4 Ω"}, "", ""},
	}
	for _, tc := range tests {
		s, err := run(t, tc.lines...)
		switch {
		case tc.err == "" && err != nil:
			t.Errorf("%q: %v", tc.lines, err)
		case tc.err != "" && (err == nil || !strings.Contains(err.Error(), tc.err)):
			t.Errorf("%q: error %v, want one containing %q", tc.lines, err, tc.err)
		}
		if s.Title() != tc.want {
			t.Errorf("%q: title %q, want %q", tc.lines, s.Title(), tc.want)
		}
	}
}

// TestTitleReplays: the title is a statement of the worksheet, so a saved
// worksheet brings it back and a copy keeps it.
func TestTitleReplays(t *testing.T) {
	s, err := run(t, "title Pump room, example data", "Z = 3+j4 Ω")
	if err != nil {
		t.Fatal(err)
	}
	r := New()
	if sum := r.Replay(s.Worksheet()); len(sum.Problems) > 0 {
		t.Fatalf("replay: %v", sum.Problems[0].Err)
	}
	if r.Title() != "Pump room, example data" || r.Clone().Title() != r.Title() {
		t.Errorf("replayed title %q, copy %q", r.Title(), r.Clone().Title())
	}
}
