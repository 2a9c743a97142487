package tui

import (
	"math"
	"reflect"
	"strings"
	"testing"

	"argand/calc"

	tea "github.com/charmbracelet/bubbletea"
)

func tableUpdate(t tableView, m tea.Msg) (tableView, tea.Msg) { return t.Update(m) }

// testRows are rows of example data: three impedances, newest first.
func testRows() tableData {
	vals := map[string]calc.Quantity{
		"Zc": {V: complex(5, 0), Dim: calc.DimImpedance},
		"Zb": {V: complex(10, -20), Dim: calc.DimImpedance},
		"Za": {V: complex(3, 4), Dim: calc.DimImpedance},
	}
	return tableData{Rows: []string{"Zc", "Zb", "Za"}, Selected: "Zb", Format: calc.Format{Digits: 4},
		Freq: 50, Omega: 2 * math.Pi * 50, Value: func(n string) calc.Quantity { return vals[n] }}
}

// The table moves its selection with arrows and Home/End, hands a bound
// key to the parent with its binding, and text typed or pasted to the
// entry line.
func TestTableUpdate(t *testing.T) {
	km := DefaultKeyMap().Table
	paste := tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune("Zq = 1"), Paste: true}
	tests := []struct {
		key  tea.KeyMsg
		want tea.Msg
	}{
		{keyMsg("up"), selectMsg{name: "Zc"}},
		{keyMsg("down"), selectMsg{name: "Za"}},
		{keyMsg("home"), selectMsg{name: "Zc"}},
		{keyMsg("end"), selectMsg{name: "Za"}},
		{keyMsg("p"), rowKeyMsg{binding: km.Parallel}},
		{keyMsg("z"), rowKeyMsg{binding: km.Undo}},
		{keyMsg("shift+up"), rowKeyMsg{binding: km.Raise}},
		{keyMsg(" "), rowKeyMsg{binding: km.Mark}},
		{keyMsg("tab"), rowKeyMsg{binding: km.Focus}},
		{keyMsg("7"), typeMsg{key: keyMsg("7")}},
		{paste, typeMsg{key: paste}},
		{keyMsg("%"), nil},
	}
	for _, tt := range tests {
		tv := newTableView(DefaultKeyMap(), testTheme(false))
		tv.SetData(testRows())
		_, got := tv.Update(tt.key)
		if rk, ok := got.(rowKeyMsg); ok {
			if w, ok := tt.want.(rowKeyMsg); !ok || !reflect.DeepEqual(rk.binding.Keys(), w.binding.Keys()) {
				t.Errorf("%q: %v, want %v", tt.key.String(), rk.binding.Keys(), tt.want)
			}
			continue
		}
		if !reflect.DeepEqual(got, tt.want) {
			t.Errorf("%q: %#v, want %#v", tt.key.String(), got, tt.want)
		}
	}
	// at the ends the selection stays
	tv := newTableView(DefaultKeyMap(), testTheme(false))
	d := testRows()
	d.Selected = "Zc"
	tv.SetData(d)
	if _, got := tv.Update(keyMsg("up")); got != (selectMsg{name: "Zc"}) {
		t.Errorf("up at the top: %#v", got)
	}
}

// The table draws both forms and the series equivalent at the working
// frequency: 10 − j20 Ω at 50 Hz is C = 1/(ωX) = 1/(2π·50·20) F =
// 159.2 µF (X_C = 1/(ωC), common practice); 3 + j4 Ω is L = X/ω =
// 4/(2π·50) H = 12.73 mH (X_L = ωL, common practice).
func TestTableView(t *testing.T) {
	tv := newTableView(DefaultKeyMap(), testTheme(false))
	d := testRows()
	d.Marks = []string{"Za"}
	tv.SetData(d)
	tv.SetSize(80, 6)
	ls := strings.Split(tv.View(), "\n")
	if len(ls) != 5 {
		t.Fatalf("%d lines:\n%s", len(ls), tv.View())
	}
	for i, want := range [][]string{
		{"entries", "3 rows, marked Za"},
		{"name", "rectangular", "polar", "at 50.00 Hz"},
		{"  Zc", "5.000 Ω", "R 5.000 Ω"},
		{"▸", "Zb", "10.00 - j20.00 Ω", "22.36 Ω ∠-63.43°", "R 10.00 Ω + C 159.2 µF"},
		{"◆1 Za", "3.000 + j4.000 Ω", "5.000 Ω ∠53.13°", "R 3.000 Ω + L 12.73 mH"},
	} {
		for _, w := range want {
			if !strings.Contains(ls[i], w) {
				t.Errorf("line %d %q lacks %q", i, ls[i], w)
			}
		}
	}
	// a table of one row shown scrolls to keep the selection in sight
	tv.SetSize(80, 3)
	if v := tv.View(); !strings.Contains(v, "Zb") || strings.Contains(v, "Zc ") {
		t.Errorf("scrolled to the selection:\n%s", v)
	}
	// an empty table says how to begin, with the key from the bindings
	tv.SetData(tableData{Format: calc.Format{Digits: 4}, Freq: 50})
	tv.SetSize(80, 6)
	if v := tv.View(); !strings.Contains(v, "no entries yet: tab, then type a value") {
		t.Errorf("empty table:\n%s", v)
	}
}
