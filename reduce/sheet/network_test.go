package sheet

import (
	"errors"
	"strings"
	"testing"

	"argand/calc"
)

// Bad networks get one clear error that names the worksheet line of the
// element concerned (or of the statement), never a NaN or a panic.
func TestBadNetworks(t *testing.T) {
	const head = "network n reference gnd\n"
	tests := []struct {
		name, src string
		line      int
		want      string
	}{
		{"duplicate name", head + "resistor R1 = 1 Ω from a to gnd\nresistor R1 = 2 Ω from a to gnd\n", 3, "already defined"},
		{"no elements", head + "end\n", 2, "no elements"},
		{"unknown reference", "network n reference zz\nvoltage source V1 = 1 V from gnd to a\nresistor R1 = 1 Ω from a to gnd\nend\n", 4, "reference node zz"},
		{"floating part", head + "voltage source V1 = 1 V from gnd to a\nresistor R1 = 1 Ω from a to gnd\nresistor R2 = 1 Ω from b to c\nend\n", 4, "no path to the reference"},
		{"voltage source loop", head + "voltage source V1 = 1 V from gnd to a\nvoltage source V2 = 2 V from gnd to a\nend\n", 2, "form a loop"},
		{"short across a source", head + "voltage source V1 = 1 V from gnd to a\nresistor R1 = 0 Ω from a to gnd\nend\n", 2, "short"},
		{"current source with no path", head + "current source I1 = 1 A from gnd to a\nresistor R1 = 1 Ω from a to gnd\ncurrent source I2 = 1 A from a to c\nend\n", 4, "no path for its current"},
		{"unknown node for Thevenin", head + "voltage source V1 = 1 V from gnd to a\nresistor R1 = 1 Ω from a to gnd\nend\nthevenin T = n between a and q\n", 5, `no node "q"`},
		{"unknown network", "thevenin T = nope between a and b\n", 1, "no network"},
		{"element outside a block", "resistor R1 = 1 Ω from a to b\n", 1, "inside a network block"},
		{"unclosed block", head + "voltage source V1 = 1 V from gnd to a\n", 3, "not closed"},
		{"wrong unit", head + "inductor L1 = 5 Ω from a to gnd\n", 2, "an inductor takes a value in H"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			sum, err := New().Run(strings.NewReader(tc.src), nil)
			if err != nil {
				t.Fatal(err)
			}
			if sum.Err == nil {
				t.Fatalf("no error")
			}
			if sum.Err.Line != tc.line || !strings.Contains(sum.Err.Msg, tc.want) {
				t.Errorf("line %d: %s; want line %d and %q", sum.Err.Line, sum.Err.Msg, tc.line, tc.want)
			}
			if strings.Contains(sum.Err.Msg, "NaN") || strings.Contains(sum.Err.Msg, "Inf") {
				t.Errorf("message shows a non-number: %s", sum.Err.Msg)
			}
		})
	}
	// a shorted current source is legal (common practice): all its current
	// flows in the short and nothing else carries any
	s := New()
	sum, _ := s.Run(strings.NewReader(head+"current source I1 = 2 A from gnd to a\nresistor R0 = 0 Ω from a to gnd\nresistor R1 = 5 Ω from a to gnd\nend\n"), nil)
	if sum.Err != nil {
		t.Fatalf("shorted current source: %v", sum.Err)
	}
	if q, _ := s.Lookup("n.R1.i"); q.V != 0 {
		t.Errorf("current in R1 beside the short = %v, want 0", q.V)
	}
	var le *calc.Error
	if !errors.As(error(sum.Err), &le) && sum.Err != nil {
		t.Error("error is not located")
	}
}
