package tui

import (
	"reflect"
	"strings"
	"testing"

	"argand/calc"
	"argand/reduce/sheet"

	tea "github.com/charmbracelet/bubbletea"
)

func netUpdate(n netView, m tea.Msg) (netView, tea.Msg) { return n.Update(m) }

// ladderView is a network of example data: 12 V across 100 Ω and 220 Ω in
// series.
func ladderView(t *testing.T) netView {
	t.Helper()
	sh := sheet.New()
	for _, l := range []string{"network ladder reference n", "voltage source V9 = 12 V from n to p",
		"resistor Rx = 100 Ω from p to q", "resistor Ry = 220 Ω from q to n", "end"} {
		if _, _, err := sh.Exec(l); err != nil {
			t.Fatal(err)
		}
	}
	v, err := sh.NetworkView("ladder")
	if err != nil {
		t.Fatal(err)
	}
	n := newNetView(DefaultKeyMap(), testTheme(false), "ladder", v)
	n.SetSize(80, 21)
	n.SetFormat(calc.Format{Digits: 4}, false)
	return n
}

// The network view moves its selection and the step shown itself, says
// when a move cannot be made, and hands the rest to the parent.
func TestNetViewUpdate(t *testing.T) {
	base := ladderView(t)
	steps := base.steps()
	elem := func(i int) sheet.ViewElement { return base.v.Elements[i] }
	tests := []struct {
		name      string
		keys      []string
		sel, step int
		last      tea.Msg
	}{
		{"down", []string{"down"}, 1, 0, nil},
		{"down and up", []string{"down", "down", "up"}, 1, 0, nil},
		{"up at the top", []string{"up"}, 0, 0, nil},
		{"step on and back", []string{"right", "right", "left"}, 0, 1, nil},
		{"space steps on", []string{" "}, 0, 1, nil},
		{"before the first step", []string{"left"}, 0, 0, noteMsg{text: "at the network as drawn"}},
		{"take a voltage", []string{"down", "v"}, 1, 0, takeMsg{elem: elem(1), suffix: "v", what: "voltage"}},
		{"take a current", []string{"i"}, 0, 0, takeMsg{elem: elem(0), suffix: "i", what: "current"}},
		{"take a power", []string{"s"}, 0, 0, takeMsg{elem: elem(0), suffix: "s", what: "complex power"}},
		{"Thevenin", []string{"t"}, 0, 0, theveninMsg{}},
		{"next network", []string{"tab"}, 0, 0, nextNetMsg{}},
		{"back", []string{"esc"}, 0, 0, closeMsg{}},
		{"back with q", []string{"q"}, 0, 0, closeMsg{}},
		{"help", []string{"?"}, 0, 0, helpMsg{}},
		{"quit", []string{"ctrl+c"}, 0, 0, quitMsg{}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			n, msgs := drive(base, netUpdate, tt.keys...)
			if last := msgs[len(msgs)-1]; n.sel != tt.sel || n.step != tt.step || !reflect.DeepEqual(last, tt.last) {
				t.Errorf("sel %d, step %d, message %#v; want %d, %d, %#v", n.sel, n.step, last, tt.sel, tt.step, tt.last)
			}
		})
	}
	keys := make([]string, steps+1)
	for i := range keys {
		keys[i] = "right"
	}
	n, msgs := drive(base, netUpdate, keys...)
	if n.step != steps || msgs[steps] != (noteMsg{text: "reduction complete: every branch value is listed"}) {
		t.Errorf("past the last step: step %d of %d, %#v", n.step, steps, msgs[steps])
	}
}

// The view lists every element with its branch values. Ohm's law (common
// practice): I = 12 V / (100 Ω + 220 Ω) = 37.50 mA through both
// resistors, V = 3.750 V across Rx and 8.250 V across Ry, S = V·I =
// 140.6 mVA in Rx; the clipboard gets the selected element's values.
func TestNetViewView(t *testing.T) {
	n := ladderView(t)
	v := n.View()
	if ls := strings.Split(v, "\n"); len(ls) != 21 || !strings.Contains(ls[0], "network ladder") {
		t.Fatalf("%d lines:\n%s", len(ls), v)
	}
	for _, want := range []string{"Rx", "Ry", "V9", "37.50 mA", "3.750 V", "8.250 V", "140.6 mVA", "0 of"} {
		if !strings.Contains(v, want) {
			t.Errorf("view lacks %q:\n%s", want, v)
		}
	}
	n, msgs := drive(n, netUpdate, "down", "ctrl+o")
	c, ok := msgs[1].(clipMsg)
	if !ok || !strings.HasPrefix(c.text, n.v.Elements[1].Name+": V = ") || !strings.Contains(c.text, "I = 37.50 mA") {
		t.Errorf("clipboard: %#v", msgs[1])
	}
	n, _ = drive(n, netUpdate, "right")
	if v := n.View(); !strings.Contains(v, "step 1 of") || !strings.Contains(v, "»") {
		t.Errorf("step 1:\n%s", v)
	}
}
