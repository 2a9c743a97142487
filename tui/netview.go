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
type netView struct {
	name string
	v    *sheet.NetworkView
	step int // steps shown: 0 is the network as drawn
	sel  int // selected element
}

// openNet opens the named network, or the newest one.
func (m *Model) openNet(name string) {
	names := m.s.sh.NetworkNames()
	if len(names) == 0 {
		m.note(true, "no networks in this worksheet: type network NAME reference NODE, its elements, then end (argand help networks)")
		return
	}
	if name == "" {
		name = names[len(names)-1]
	}
	v, err := m.s.sh.NetworkView(name)
	if err != nil {
		m.note(true, err.Error())
		return
	}
	if len(v.Elements) == 0 {
		m.note(true, "network "+name+" has no elements")
		return
	}
	nv := &netView{name: name, v: v}
	if m.net != nil && m.net.name == name {
		nv.step = min(m.net.step, nv.steps())
		nv.sel = min(m.net.sel, len(v.Elements)-1)
	}
	m.net = nv
	m.mode = modeNet
	m.note(false, fmt.Sprintf("network %s: → steps through its reduction, v i s take a branch value as a row", name))
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

func (m *Model) netKey(k tea.KeyMsg) tea.Cmd {
	km := m.keys.Net
	n := m.net
	if msg, ok := n.update(k, km); ok {
		if msg != "" {
			m.note(false, msg)
		}
		return nil
	}
	switch {
	case key.Matches(k, km.TakeV):
		m.takeBranch("v", "voltage")
	case key.Matches(k, km.TakeI):
		m.takeBranch("i", "current")
	case key.Matches(k, km.TakeS):
		m.takeBranch("s", "complex power")
	case key.Matches(k, km.Thevenin):
		m.netThevenin()
	case key.Matches(k, km.Next):
		names := m.s.sh.NetworkNames()
		next := names[(slices.Index(names, n.name)+1)%len(names)]
		m.net = nil
		m.openNet(next)
	case key.Matches(k, km.Clip):
		if e, ok := n.selected(); ok {
			return m.copyCmd(e.Name+"'s values", m.branchText(e, true))
		}
	case key.Matches(k, km.Close):
		m.mode = modeRows
		m.note(false, "")
	case key.Matches(k, km.Help):
		m.openHelp()
	case key.Matches(k, km.Quit):
		m.quitting = true
		return tea.Quit
	}
	return nil
}

// update moves within the view: the selected element and the reduction
// step shown. It reports whether k was such a key, with a message when
// the move could not be made.
func (n *netView) update(k tea.KeyMsg, km NetKeys) (string, bool) {
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

// takeBranch asks a name for the selected element's voltage, current or
// power (suffix v, i or s) and defines it as a new row.
func (m *Model) takeBranch(suffix, what string) {
	n := m.net
	e, ok := n.selected()
	if !ok {
		return
	}
	src := n.name + "." + e.Name + "." + suffix
	if _, ok := m.s.sh.Lookup(src); !ok {
		m.note(true, "no "+what+" for "+e.Name+" (the network has no solution)")
		return
	}
	def := suffix + e.Name
	if _, taken := m.s.sh.Lookup(def); taken {
		def, _ = m.newName(src)
	}
	m.startAsk(what+" of "+e.Name+" as a new row", []question{{label: "name", def: def}}, func(a []string) {
		m.run(what+" of "+e.Name, strings.TrimSpace(a[0])+" = "+src)
	})
}

// netThevenin asks for two nodes and a name, and defines the Thevenin
// equivalent between them with its impedance as a row of its own.
func (m *Model) netThevenin() {
	n := m.net
	if n.v.Compact != "" {
		m.note(true, "network "+n.name+" is a compact form and has no named nodes: a Thevenin equivalent needs a node block")
		return
	}
	a, b := "", n.v.Reference
	for _, x := range n.v.Nodes {
		if x != b {
			a = x
		}
	}
	def, _ := m.newName("0 V")
	def = "T" + strings.TrimPrefix(def, "V")
	m.startAsk("Thevenin equivalent of "+n.name+" between two nodes ("+strings.Join(n.v.Nodes, " ")+")",
		[]question{{label: "first node", def: a}, {label: "second node", def: b}, {label: "name", def: def}},
		func(ans []string) {
			st := "thevenin " + ans[2] + " = " + n.name + " between " + ans[0] + " and " + ans[1]
			z := "Z" + ans[2] + " = " + ans[2] + ".zth"
			c := m.s.sh.Clone()
			if _, _, err := c.Exec(st); err != nil {
				m.note(true, "Thevenin: "+errText(err))
				return
			}
			if _, _, err := c.Exec(z); err == nil {
				m.run("Thevenin equivalent (V_th is "+ans[2]+", Z_th is Z"+ans[2]+")", st, z)
			} else {
				m.run("equivalent", st)
			}
		})
	m.back = modeNet
}

// branchText is an element's solved values as text.
func (m *Model) branchText(e sheet.ViewElement, both bool) string {
	return e.Name + ": " + m.branchValues(e, both)
}

// branchValues is an element's voltage, current and power as text.
func (m *Model) branchValues(e sheet.ViewElement, both bool) string {
	if !e.Solved {
		return "no solution (the network has no source)"
	}
	f := m.format()
	var parts []string
	for _, x := range []struct {
		l string
		q calc.Quantity
	}{{"V", e.V}, {"I", e.I}, {"S", e.S}} {
		v := f.Polar(x.q)
		if both {
			v = f.Both(x.q, m.s.v.PolarFirst)
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
func (m *Model) fitColumns(c netCols, w int) netCols {
	f := m.format()
	sv, si, ss := 7, 7, 5
	for _, e := range m.net.v.Elements {
		if e.Solved {
			sv = max(sv, ansi.StringWidth(m.tr(f.Polar(e.V))))
			si = max(si, ansi.StringWidth(m.tr(f.Polar(e.I))))
			ss = max(ss, ansi.StringWidth(m.tr(f.Polar(e.S))))
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

// netPane draws the network view in w × h cells: the element table, the
// selected element's values, and the reduction step shown.
func (m *Model) netPane(w, h int) []string {
	n := m.net
	kind := "node block, reference " + n.v.Reference + ", nodes " + strings.Join(n.v.Nodes, " ")
	if n.v.Compact != "" {
		kind = "compact form " + n.v.Compact
	}
	out := make([]string, 0, h)
	out = append(out, m.th.section(m.tr("network "+n.name), m.tr(kind), w))
	cols := m.fitColumns(netColumns(w, n.v.Compact != ""), w)
	out = append(out, m.th.dim.Render(fit(m.tr("   "+cols.row("element", "kind", "nodes", "value", "in", "voltage", "current", "power")), w)))
	// leave room for the reduction step below the element table
	listH := max(3, min(len(n.v.Elements), h-2-8))
	out = append(out, m.netRows(cols, w, listH)...)
	for len(out) < 2+listH {
		out = append(out, "")
	}
	if n.sel >= 0 && n.sel < len(n.v.Elements) {
		e := n.v.Elements[n.sel]
		out = append(out, fit(m.tr(m.th.g.sel+" "+e.Name+" "+kindWord(e.Kind)+" "+e.ValueText(m.format())+"  "+m.branchValues(e, false)), w))
	}
	title, body := m.netStep()
	out = append(out, m.th.section(title, "", w))
	for _, b := range body {
		if len(out) >= h {
			break
		}
		out = append(out, fit(m.tr(b), w))
	}
	for len(out) < h {
		out = append(out, "")
	}
	return out[:h]
}

// netRows draws the rows of the element table around the selection.
func (m *Model) netRows(cols netCols, w, listH int) []string {
	n := m.net
	f := m.format()
	within := n.within(n.step)
	cur := n.merge(n.step)
	hot := n.hot(n.step)
	var out []string
	top := max(0, min(n.sel-listH/2, len(n.v.Elements)-listH))
	for i := top; i < len(n.v.Elements) && i < top+listH; i++ {
		e := n.v.Elements[i]
		sel, hi := " ", "  "
		if i == n.sel {
			sel = m.th.g.sel
		}
		if hot[e.Name] {
			hi = m.th.g.hi
			if ansi.StringWidth(hi) < 2 {
				hi += " "
			}
		}
		val, eq := e.ValueText(f), within[e.Name]
		if eq != "" {
			val = "in " + eq
			if cur != nil && hot[e.Name] {
				val = "→ " + eq
			}
		}
		v, c, s := "-", "-", "-"
		if e.Solved {
			v, c, s = f.Polar(e.V), f.Polar(e.I), f.Polar(e.S)
		}
		line := fit(m.tr(sel+hi+cols.row(e.Name, kindWord(e.Kind), e.From+m.th.g.arrow+e.To, val, eq, v, c, s)), w)
		switch {
		case i == n.sel:
			line = m.th.sel.Render(pad(line, w))
		case hot[e.Name]:
			line = m.th.hi.Render(line)
		}
		out = append(out, line)
	}
	return out
}

// netStep returns the title and lines of the reduction step shown.
func (m *Model) netStep() (string, []string) {
	n := m.net
	f := m.format()
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
		body = append(body, fmt.Sprintf("%s %s = %s  (marked %s above)", m.th.g.hi, cur.Name, strings.Join(cur.Parts, " with "), m.th.g.hi))
	} else {
		title = fmt.Sprintf("working back, step %d of %d", n.step, n.steps())
		names := slices.Clone(st.Hot)
		sort.Strings(names)
		if len(names) > 0 {
			body = append(body, fmt.Sprintf("%s %s (marked %s above)", m.th.g.hi, strings.Join(names, ", "), m.th.g.hi))
		}
	}
	body = append(body, strings.Split(strings.TrimRight(st.Step.Text(f, m.s.v.PolarFirst), "\n"), "\n")[1:]...)
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
