package sheet

import (
	"strings"
	"testing"
)

// TestLimits: each limit refuses the statement that would pass it, with a
// message naming the limit, and leaves the worksheet as it was.
func TestLimits(t *testing.T) {
	for _, c := range []struct {
		name  string
		lim   Limits
		setup []string
		stmt  string
		want  string
	}{
		{"names", Limits{Names: 2}, []string{"a = 1 Ω", "b = 2 Ω"}, "c = 3 Ω", "too many names (the limit is 2)"},
		{"bytes", Limits{Bytes: 20}, []string{"a = 1 Ω", "b = 2 Ω"}, "cc = 3 Ω", "the worksheet is full: its statements hold 16 bytes and the limit here is 20"},
		{"points", Limits{Points: 100}, []string{"resistor Rx = 1 kΩ", "capacitor Cx = 1 µF", "Zx = Rx + Cx"}, "sweep Zx from 10 Hz to 1 kHz points 101", "points takes a whole number from 2 to 100"},
		{"elements", Limits{Elements: 2}, []string{"network n reference g", "voltage source Vs = 1 V from g to a", "resistor R1 = 1 Ω from a to b"}, "resistor R2 = 1 Ω from b to g", "network n has 2 elements, the most allowed here"},
		{"budget", Limits{Budget: 30}, nil, "budget 60 s", "a budget lies from 0.1 s to 30 s here"},
	} {
		t.Run(c.name, func(t *testing.T) {
			s := New()
			s.SetLimits(c.lim)
			for i, st := range c.setup {
				if _, _, err := s.ExecLine(st, i+1); err != nil {
					t.Fatalf("%q: %v", st, err)
				}
			}
			before := strings.Join(s.Statements(), "\n")
			_, _, err := s.ExecLine(c.stmt, len(c.setup)+1)
			if err == nil || !strings.Contains(err.Error(), c.want) {
				t.Fatalf("%q gave %v, want %q", c.stmt, err, c.want)
			}
			if after := strings.Join(s.Statements(), "\n"); after != before {
				t.Errorf("the refused statement changed the worksheet")
			}
			// one below the limit passes: the bound is where it says
			s2 := New()
			l := c.lim
			l.Names, l.Bytes, l.Points, l.Elements, l.Budget = 0, 0, 0, 0, 0
			s2.SetLimits(l)
			for i, st := range append(c.setup, c.stmt) {
				if _, _, err := s2.ExecLine(st, i+1); err != nil {
					t.Fatalf("without the limit %q: %v", st, err)
				}
			}
		})
	}
}

// TestSetLimits: limits never rise above the defaults, and a lower
// largest budget lowers the budget in force.
func TestSetLimits(t *testing.T) {
	s := New()
	s.SetLimits(Limits{Names: MaxNames * 2, Budget: 5})
	l := s.Limits()
	if l.Names != MaxNames || l.Budget != 5 || l.Points != DefaultLimits().Points {
		t.Errorf("limits %+v", l)
	}
	if got := s.Settings().Budget; got != 5 {
		t.Errorf("budget in force %g, want 5", got)
	}
	c := s.Clone()
	if c.Limits() != l {
		t.Error("a copy lost the limits")
	}
}
