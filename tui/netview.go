package tui

import (
	"fmt"
	"slices"
	"sort"
	"strings"

	"argand/calc"
	"argand/reduce/sheet"

	"github.com/charmbracelet/bubbles/key"
	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/x/ansi"
)

// netView shows one network of the worksheet: its elements and nodes, its
// reduction one combination at a time with the parts combined picked out,
// and every element's voltage, current and power. The worksheet hands it
// the network and its reduction as structure; the view only draws them.
// It is a component: Update moves the selection and the step shown and
// returns what the parent is to do (takeMsg, theveninMsg, nextNetMsg,
// clipMsg, closeMsg, helpMsg, quitMsg, noteMsg); View draws the view.
type netView struct {
	keys          NetKeys
	th            theme
	width, height int
	f             calc.Format
	polar         bool // the polar form first, where both are written

	name string
	v    *sheet.NetworkView
	step int // steps shown: 0 is the network as drawn
	sel  int // selected element
}

// takeMsg asks the parent to add the selected element's voltage, current
// or power (suffix v, i or s) as a row.
type takeMsg struct {
	elem         sheet.ViewElement
	suffix, what string
}

// theveninMsg asks the parent for the Thevenin equivalent between two
// nodes of the network shown.
type theveninMsg struct{}

// nextNetMsg asks the parent to show the next network.
type nextNetMsg struct{}

// clipMsg asks the parent to send text to the terminal clipboard.
type clipMsg struct{ what, text string }

func newNetView(km KeyMap, th theme, name string, v *sheet.NetworkView) netView {
	return netView{keys: km.Net, th: th, width: 80, height: 21, name: name, v: v}
}

// SetSize sets the view's size.
func (n *netView) SetSize(w, h int) { n.width, n.height = w, h }

// SetFormat sets how values are written.
func (n *netView) SetFormat(f calc.Format, polar bool) { n.f, n.polar = f, polar }

// keep keeps the step and selection of old when it shows the same
// network.
func (n *netView) keep(old *netView) {
	if old != nil && old.name == n.name {
		n.step = min(old.step, n.steps())
		n.sel = min(old.sel, len(n.v.Elements)-1)
	}
}

// steps counts the steps shown: the reductions, then the work back to
// every branch value, the powers and the balance.
func (n *netView) steps() int { return len(n.v.Steps) }

// merge returns the merge step k (1-based) shows, or nil.
func (n *netView) merge(k int) *sheet.ViewMerge {
	if k < 1 || k > len(n.v.Steps) {
		return nil
	}
	return n.v.Steps[k-1].Merge
}

// stepMarks is what the reduction step on show means for each row of
// the element table, the wide one and the narrow one alike.
type stepMarks struct {
	within map[string]string // the equivalent an element is now part of
	cur    *sheet.ViewMerge  // the combination the step makes, if any
	hot    map[string]bool   // the elements the step works on
}

func (n *netView) marks() stepMarks {
	return stepMarks{n.within(n.step), n.merge(n.step), n.hot(n.step)}
}

// cells gives an element row's selection mark, its step mark (two cells
// wide), and its value cell: the value, or the equivalent the element is
// inside ("in Z3", "→ Z3" when this step makes it); eq is that equivalent.
func (sm stepMarks) cells(g glyphs, selected bool, name, value string) (sel, hi, val, eq string) {
	sel, hi, val = " ", "  ", value
	if selected {
		sel = g.sel
	}
	if sm.hot[name] {
		hi = pad(g.hi, 2)
	}
	if eq = sm.within[name]; eq != "" {
		val = "in " + eq
		if sm.cur != nil && sm.hot[name] {
			val = "→ " + eq
		}
	}
	return sel, hi, val, eq
}

// hot returns the elements step k (1-based) works on.
func (n *netView) hot(k int) map[string]bool {
	out := map[string]bool{}
	if k < 1 || k > len(n.v.Steps) {
		return out
	}
	for _, e := range n.v.Steps[k-1].Hot {
		out[e] = true
	}
	return out
}

// within returns, for each element, the newest equivalent it has become
// part of in the first k steps.
func (n *netView) within(k int) map[string]string {
	out := map[string]string{}
	for i := 0; i < k && i < len(n.v.Steps); i++ {
		if mg := n.v.Steps[i].Merge; mg != nil {
			for _, e := range mg.Elements {
				out[e] = mg.Name
			}
		}
	}
	return out
}

// Update handles a key while the network view has the keyboard.
func (n netView) Update(msg tea.Msg) (netView, tea.Msg) {
	k, ok := msg.(tea.KeyMsg)
	if !ok {
		return n, nil
	}
	km := n.keys
	if note, ok := n.move(k); ok {
		if note != "" {
			return n, noteMsg{text: note}
		}
		return n, nil
	}
	e, ok := n.selected()
	switch {
	case key.Matches(k, km.TakeV) && ok:
		return n, takeMsg{elem: e, suffix: "v", what: "voltage"}
	case key.Matches(k, km.TakeI) && ok:
		return n, takeMsg{elem: e, suffix: "i", what: "current"}
	case key.Matches(k, km.TakeS) && ok:
		return n, takeMsg{elem: e, suffix: "s", what: "complex power"}
	case key.Matches(k, km.Thevenin):
		return n, theveninMsg{}
	case key.Matches(k, km.Next):
		return n, nextNetMsg{}
	case key.Matches(k, km.Clip) && ok:
		return n, clipMsg{what: e.Name + "'s values", text: e.Name + ": " + n.values(e, true)}
	case key.Matches(k, km.Close):
		return n, closeMsg{}
	case key.Matches(k, km.Help):
		return n, helpMsg{}
	case key.Matches(k, km.Quit):
		return n, quitMsg{}
	}
	return n, nil
}

// move moves within the view: the selected element and the reduction
// step shown. It reports whether k was such a key, with a message when
// the move could not be made.
func (n *netView) move(k tea.KeyMsg) (string, bool) {
	km := n.keys
	switch {
	case key.Matches(k, km.Up):
		n.sel = max(0, n.sel-1)
	case key.Matches(k, km.Down):
		n.sel = min(len(n.v.Elements)-1, n.sel+1)
	case key.Matches(k, km.StepOn):
		if n.step == n.steps() {
			return "reduction complete: every branch value is listed", true
		}
		n.step++
	case key.Matches(k, km.StepBack):
		if n.step == 0 {
			return "at the network as drawn", true
		}
		n.step--
	default:
		return "", false
	}
	return "", true
}

// selected returns the selected element.
func (n *netView) selected() (sheet.ViewElement, bool) {
	if n.sel < 0 || n.sel >= len(n.v.Elements) {
		return sheet.ViewElement{}, false
	}
	return n.v.Elements[n.sel], true
}

// values is an element's voltage, current and power as text, each in
// both forms when both is set.
func (n netView) values(e sheet.ViewElement, both bool) string {
	if !e.Solved {
		return "no solution (the network has no source)"
	}
	var parts []string
	for _, x := range []struct {
		l string
		q calc.Quantity
	}{{"V", e.V}, {"I", e.I}, {"S", e.S}} {
		v := n.f.Polar(x.q)
		if both {
			v = n.f.Both(x.q, n.polar)
		}
		parts = append(parts, x.l+" = "+v)
	}
	return strings.Join(parts, "; ")
}

// netCols are the widths of the network table's columns; a width of 0
// leaves the column out.
type netCols struct{ name, kind, nodes, value, in, v, i int }

// netColumns chooses the columns for w cells. Below 100 columns the kind
// and the component value give way (the value is on the line under the
// table for the selected element), and a narrow column names the
// equivalent an element has become part of, so that voltage, current and
// power keep their angles at 80 columns.
func netColumns(w int, compact bool) netCols {
	c := netCols{name: 7, kind: 9, nodes: 8, value: 14, v: 18, i: 18}
	if w < 100 {
		c = netCols{name: 7, nodes: 7, in: 4, v: 18, i: 18}
	}
	if compact {
		c.name += c.nodes
		c.nodes = 0
	}
	return c
}

// fitColumns sizes the voltage and current columns to the values shown
// (ASCII angles are longer: "@-21.15 deg"), and where the line would
// still pass w, leaves out the column of equivalents, so that the power
// column is never cut.
func (n netView) fitColumns(c netCols, w int) netCols {
	f := n.f
	sv, si, ss := 7, 7, 5
	for _, e := range n.v.Elements {
		if e.Solved {
			sv = max(sv, ansi.StringWidth(n.th.tr(f.Polar(e.V))))
			si = max(si, ansi.StringWidth(n.th.tr(f.Polar(e.I))))
			ss = max(ss, ansi.StringWidth(n.th.tr(f.Polar(e.S))))
		}
	}
	c.v, c.i = min(sv, 22), min(si, 22)
	width := func() int {
		n := 3 + c.name + 1 + c.v + 1 + c.i + 1 + ss
		for _, x := range []int{c.kind, c.nodes, c.value, c.in} {
			if x > 0 {
				n += x + 1
			}
		}
		return n
	}
	if width() > w && c.in > 0 {
		c.in = 0
	}
	if width() > w && c.kind > 0 {
		c.kind = 0
	}
	return c
}

// row lays out one line of the table from its cells; value is the
// component value or the equivalent the element is in, eq that
// equivalent alone.
func (c netCols) row(name, kind, nodes, value, eq, v, i, s string) string {
	line := pad(name, c.name) + " "
	for _, x := range []struct {
		w    int
		text string
	}{{c.kind, kind}, {c.nodes, nodes}, {c.value, value}, {c.in, eq}} {
		if x.w > 0 {
			line += pad(x.text, x.w) + " "
		}
	}
	return line + pad(v, c.v) + " " + pad(i, c.i) + " " + s
}

// View draws the network view in its width and height: the element
// table, the selected element's values, and the reduction step shown.
func (n netView) View() string {
	w, h := n.width, n.height
	kind := "node block, reference " + n.v.Reference + ", nodes " + strings.Join(n.v.Nodes, " ")
	if n.v.Compact != "" {
		kind = "compact form " + n.v.Compact
	}
	out := make([]string, 0, h)
	out = append(out, n.th.section(n.th.tr("network "+n.name), n.th.tr(kind), w))
	cols := n.fitColumns(netColumns(w, n.v.Compact != ""), w)
	out = append(out, n.th.dim.Render(fit(n.th.tr("   "+cols.row("element", "kind", "nodes", "value", "in", "voltage", "current", "power")), w)))
	// leave room for the reduction step below the element table
	listH := max(3, min(len(n.v.Elements), h-2-8))
	out = append(out, n.rows(cols, w, listH)...)
	for len(out) < 2+listH {
		out = append(out, "")
	}
	if n.sel >= 0 && n.sel < len(n.v.Elements) {
		e := n.v.Elements[n.sel]
		out = append(out, fit(n.th.tr(n.th.g.sel+" "+e.Name+" "+kindWord(e.Kind)+" "+e.ValueText(n.f)+"  "+n.values(e, false)), w))
	}
	title, body := n.stepShown()
	out = append(out, n.th.section(title, "", w))
	for _, b := range body {
		if len(out) >= h {
			break
		}
		out = append(out, fit(n.th.tr(b), w))
	}
	for len(out) < h {
		out = append(out, "")
	}
	return strings.Join(out[:h], "\n")
}

// netRows draws the rows of the element table around the selection.
func (n netView) rows(cols netCols, w, listH int) []string {
	f := n.f
	sm := n.marks()
	var out []string
	top := max(0, min(n.sel-listH/2, len(n.v.Elements)-listH))
	for i := top; i < len(n.v.Elements) && i < top+listH; i++ {
		e := n.v.Elements[i]
		sel, hi, val, eq := sm.cells(n.th.g, i == n.sel, e.Name, e.ValueText(f))
		v, c, s := "-", "-", "-"
		if e.Solved {
			v, c, s = f.Polar(e.V), f.Polar(e.I), f.Polar(e.S)
		}
		line := fit(n.th.tr(sel+hi+cols.row(e.Name, kindWord(e.Kind), e.From+n.th.g.arrow+e.To, val, eq, v, c, s)), w)
		switch {
		case i == n.sel:
			line = n.th.sel.Render(pad(line, w))
		case sm.hot[e.Name]:
			line = n.th.hi.Render(line)
		}
		out = append(out, line)
	}
	return out
}

// netStep returns the title and lines of the reduction step shown.
func (n netView) stepShown() (string, []string) {
	f := n.f
	switch {
	case len(n.v.Steps) == 0:
		return "no step-by-step reduction", []string{n.v.Why, "The values above come from the nodal solution of the worksheet."}
	case n.step == 0:
		merges := 0
		for _, st := range n.v.Steps {
			if st.Merge != nil {
				merges++
			}
		}
		return fmt.Sprintf("reduction: the network as drawn (0 of %d steps)", n.steps()),
			[]string{fmt.Sprintf("→ combines parts one step at a time (%d reductions), then works back to every branch.", merges),
				"The source sees " + f.Both(n.v.Z, false) + "."}
	}
	st := n.v.Steps[n.step-1]
	var title string
	var body []string
	if cur := st.Merge; cur != nil {
		title = fmt.Sprintf("reduction step %d of %d", n.step, n.steps())
		body = append(body, fmt.Sprintf("%s %s = %s  (marked %s above)", n.th.g.hi, cur.Name, strings.Join(cur.Parts, " with "), n.th.g.hi))
	} else {
		title = fmt.Sprintf("working back, step %d of %d", n.step, n.steps())
		names := slices.Clone(st.Hot)
		sort.Strings(names)
		if len(names) > 0 {
			body = append(body, fmt.Sprintf("%s %s (marked %s above)", n.th.g.hi, strings.Join(names, ", "), n.th.g.hi))
		}
	}
	body = append(body, strings.Split(strings.TrimRight(st.Step.Text(f, n.polar), "\n"), "\n")[1:]...)
	return title, body
}

// kindWord names an element kind in at most nine cells.
func kindWord(k string) string {
	switch k {
	case "voltage source":
		return "V source"
	case "current source":
		return "I source"
	}
	return k
}
