package tui

import (
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"

	"argand/calc"

	"github.com/charmbracelet/bubbles/key"
	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/x/ansi"
)

// tableData is what the entries table draws, set by the parent: the rows
// shown (newest at the top), the selection and marks, and how values are
// written.
type tableData struct {
	Rows       []string
	Selected   string
	Marks      []string // in the order marked
	Hidden     int      // rows put away
	PolarFirst bool
	Format     calc.Format
	Freq       float64 // the working frequency, in Hz
	Omega      float64 // ω = 2πf, from the worksheet
	Value      func(name string) calc.Quantity
}

// tableView is the entries table, newest at the top. It is a component:
// Update moves the selection (selectMsg), hands a key bound to an
// operation to the parent (rowKeyMsg) and text typed or pasted to the
// entry line (typeMsg); View draws the table.
type tableView struct {
	keys          TableKeys
	th            theme
	width, height int
	top           int // first row shown
	d             tableData
}

// selectMsg selects a row.
type selectMsg struct{ name string }

// rowKeyMsg is a key of the entries table bound to an action the parent
// takes: the binding it matched.
type rowKeyMsg struct{ binding key.Binding }

// typeMsg gives a key to the entry line: a paste, or the first character
// of a statement.
type typeMsg struct{ key tea.KeyMsg }

func newTableView(km KeyMap, th theme) tableView {
	return tableView{keys: km.Table, th: th, width: 80, height: 10}
}

// SetSize sets the table's size, its heading lines included.
func (t *tableView) SetSize(w, h int) {
	t.width, t.height = w, h
	t.follow()
}

// SetData sets what the table draws, and scrolls it to keep the selected
// row in sight.
func (t *tableView) SetData(d tableData) {
	t.d = d
	t.follow()
}

// follow scrolls the table so that the selected row is shown.
func (t *tableView) follow() {
	body := t.height - 2
	sel := max(0, slices.Index(t.d.Rows, t.d.Selected))
	if sel < t.top {
		t.top = sel
	}
	if sel >= t.top+body {
		t.top = sel - body + 1
	}
	t.top = max(0, min(t.top, len(t.d.Rows)-body))
}

// Update handles a key while the table has the keyboard: arrows and
// Home/End select, another bound key goes to the parent, a paste or the
// first character of a statement goes to the entry line.
func (t tableView) Update(msg tea.Msg) (tableView, tea.Msg) {
	k, ok := msg.(tea.KeyMsg)
	if !ok {
		return t, nil
	}
	for _, mv := range []struct {
		b     key.Binding
		by    int
		bound bool
	}{{t.keys.Up, -1, false}, {t.keys.Down, 1, false}, {t.keys.Top, 0, true}, {t.keys.Bottom, -1, true}} {
		if key.Matches(k, mv.b) {
			return t, t.move(mv.by, mv.bound)
		}
	}
	for _, g := range t.keys.FullHelp() {
		for _, b := range g {
			if key.Matches(k, b) {
				return t, rowKeyMsg{binding: b}
			}
		}
	}
	if k.Paste {
		// a paste is text for the entry line, wherever the keyboard was
		return t, typeMsg{key: k}
	}
	if k.Type == tea.KeyRunes && !k.Alt {
		if rs := k.Runes; len(rs) > 0 && startsStatement(rs[0]) {
			return t, typeMsg{key: k}
		}
	}
	return t, nil
}

// move selects the row by rows from the selected one, or row by from the
// top (0) or the bottom (−1) when to is set.
func (t tableView) move(by int, to bool) tea.Msg {
	rows := t.d.Rows
	if len(rows) == 0 {
		return nil
	}
	i := slices.Index(rows, t.d.Selected) + by
	if to {
		i = by
		if by < 0 {
			i = len(rows) - 1
		}
	}
	return selectMsg{name: rows[max(0, min(i, len(rows)-1))]}
}

// startsStatement reports characters that no binding takes and that begin
// a statement: digits, letters not bound, '(' and '#'.
func startsStatement(r rune) bool {
	return r >= '0' && r <= '9' || r == '(' || r == '.' || r >= 0x80
}

// tableCells are the formatted cells of one row of the table.
type tableCells struct{ name, a, b, eq string }

// View draws the table: a heading, the column heads and the rows shown.
func (t tableView) View() string {
	d, w, h := t.d, t.width, t.height
	out := make([]string, 0, h)
	info := fmt.Sprintf("%d rows", len(d.Rows))
	if len(d.Marks) > 0 {
		info += ", marked " + strings.Join(d.Marks, " ")
	}
	if d.Hidden > 0 {
		info += fmt.Sprintf(", %d put away", d.Hidden)
	}
	out = append(out, t.th.section("entries", t.th.tr(info), w))
	nameW := 8
	for _, r := range d.Rows {
		nameW = max(nameW, min(14, ansi.StringWidth(r)))
	}
	h1, h2 := "rectangular", "polar"
	if d.PolarFirst {
		h1, h2 = h2, h1
	}
	// format the rows shown, then size the columns to them
	body := h - 2
	var shown []tableCells
	c1, c2 := ansi.StringWidth(h1), ansi.StringWidth(h2)
	for i := t.top; i < len(d.Rows) && i < t.top+body; i++ {
		c := t.cells(d.Rows[i])
		c1 = max(c1, ansi.StringWidth(c.a))
		c2 = max(c2, ansi.StringWidth(c.b))
		shown = append(shown, c)
	}
	c1, c2 = min(c1, 30), min(c2, 26)
	freq := d.Format.Mag(d.Freq, calc.DimFrequency, 0)
	head := "    " + pad("name", nameW) + "  " + pad(h1, c1) + "  " + pad(h2, c2) + "  " + "at " + freq
	out = append(out, t.th.dim.Render(fit(t.th.tr(head), w)))
	switch {
	case body < 1:
	case len(d.Rows) == 0:
		wake := strings.Fields(strings.ReplaceAll(t.keys.Focus.Help().Key, "/", " "))[0]
		out = append(out, t.th.dim.Render(fit(t.th.tr("    no entries yet: "+wake+", then type a value such as Z1 = 3+j4 Ω"), w)))
	default:
		for _, c := range shown {
			out = append(out, t.line(c, nameW, c1, c2))
		}
	}
	return strings.Join(out, "\n")
}

// cells formats one row: both forms, the first as the user chose, and
// what the value is at the working frequency.
func (t tableView) cells(name string) tableCells {
	q := t.d.Value(name)
	a, b := t.d.Format.Rect(q), t.d.Format.Polar(q)
	if t.d.PolarFirst {
		a, b = b, a
	}
	return tableCells{name, a, b, equivalent(t.d.Format, q, t.d.Omega)}
}

// line draws one row of the table: selection and mark, name, both forms
// and what the value is at the working frequency.
func (t tableView) line(c tableCells, nameW, c1, c2 int) string {
	w := t.width
	selMark, mark := rowMarks(t.th.g, c.name, t.d.Selected, t.d.Marks)
	line := selMark + mark + " " + pad(t.th.tr(c.name), nameW) + "  " + pad(c.a, c1) + "  " + pad(c.b, c2) + "  "
	eq := c.eq
	if _, lc, ok := strings.Cut(eq, " + "); ok && ansi.StringWidth(line+eq) > w {
		// R is the real part, already in the rectangular form: the
		// L or C alone, whole, says more than both cut
		eq = lc
	}
	line = fit(line+eq, w)
	switch {
	case c.name == t.d.Selected:
		return t.th.sel.Render(pad(line, w))
	case mark != "  ":
		return t.th.marked.Render(line)
	}
	return line
}

// rowMarks are the signs before a row's name: the selection marker or a
// space, and the mark with its number in the order marked or two spaces.
func rowMarks(g glyphs, name, selected string, marks []string) (sel, mark string) {
	sel, mark = " ", "  "
	if name == selected {
		sel = g.sel
	}
	if k := slices.Index(marks, name); k >= 0 {
		mark = g.mark + strconv.Itoa(k+1)
		if k >= 9 {
			mark = g.mark + "+"
		}
	}
	return sel, mark
}

// equivalent describes what an impedance or admittance is at the working
// frequency: series R with L or C (Z = R + jωL, or R − j/(ωC)), or for an
// admittance the parallel G with C or L (Y = G + jωC, or G − j/(ωL)).
func equivalent(f calc.Format, q calc.Quantity, omega float64) string {
	if omega <= 0 || math.IsInf(omega, 0) || math.IsNaN(omega) {
		return ""
	}
	if q.Kind == calc.KindMagnitude || q.Kind == calc.KindSigned {
		// a size or a signed real is not an element: |Z| is no resistance
		return ""
	}
	re, im := real(q.V), imag(q.V)
	switch q.Dim {
	case calc.DimImpedance:
		var parts []string
		if re != 0 || im == 0 {
			parts = append(parts, "R "+f.Mag(re, calc.DimImpedance, 0))
		}
		switch {
		case im > 0:
			parts = append(parts, "L "+f.Mag(im/omega, calc.DimInductance, 0))
		case im < 0:
			parts = append(parts, "C "+f.Mag(-1/(omega*im), calc.DimCapacitance, 0))
		}
		return strings.Join(parts, " + ")
	case calc.DimAdmittance:
		s := "G " + f.Mag(re, calc.DimAdmittance, 0)
		switch {
		case im > 0:
			s += " ‖ C " + f.Mag(im/omega, calc.DimCapacitance, 0)
		case im < 0:
			s += " ‖ L " + f.Mag(-1/(omega*im), calc.DimInductance, 0)
		}
		if f.ASCII {
			s = calc.ASCIIText(s)
		}
		return s
	}
	return ""
}
