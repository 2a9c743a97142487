package tui

import (
	"fmt"
	"slices"
	"sort"
	"strings"

	"argand/calc"
	"argand/reduce"
	"argand/reduce/sheet"

	"github.com/charmbracelet/bubbles/key"
	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/x/ansi"
)

// netView shows one network of the worksheet: its elements and nodes, its
// reduction one combination at a time with the parts combined picked out,
// and every element's voltage, current and power.
type netView struct {
	name  string
	net   *reduce.Network
	red   *reduce.Reduction
	why   string // why there is no step-by-step reduction
	step  int    // merges shown: 0 is the network as drawn
	sel   int    // selected element
	nodes []string
}

// openNet opens the named network, or the first one.
func (m *Model) openNet(name string) {
	infos := m.s.sh.Networks()
	if len(infos) == 0 {
		m.note(true, "no networks in this worksheet: type network NAME reference NODE, its elements, then end (argand help networks)")
		return
	}
	if name == "" {
		name = infos[0].Name
		if m.net != nil {
			name = m.net.name
		}
	}
	net, err := m.s.sh.Network(name)
	if err != nil {
		m.note(true, err.Error())
		return
	}
	nv := &netView{name: name, net: net}
	red, err := reduce.ReduceNetwork(net, m.s.sh.Settings().Basis)
	if err != nil {
		nv.why = err.Error()
	} else {
		nv.red = red
	}
	seen := map[string]bool{}
	for _, e := range net.Elements {
		for _, n := range []string{e.From, e.To} {
			if !seen[n] {
				seen[n] = true
				nv.nodes = append(nv.nodes, n)
			}
		}
	}
	sort.Strings(nv.nodes)
	if m.net != nil && m.net.name == name {
		nv.step = min(m.net.step, nv.steps())
		nv.sel = min(m.net.sel, len(net.Elements)-1)
	}
	m.net = nv
	m.mode = modeNet
	m.note(false, fmt.Sprintf("network %s: → steps through its reduction, v i s take a branch value as a row", name))
}

// steps counts the steps shown: the reductions, then the work back to
// every branch value, the powers and the balance.
func (n *netView) steps() int {
	if n.red == nil {
		return 0
	}
	return len(n.red.Steps)
}

// merged counts the merges done by step k.
func (n *netView) merged(k int) int {
	c := 0
	for _, mg := range n.red.Merges {
		if mg.Step < k {
			c++
		}
	}
	return c
}

// hot returns the elements step k (1-based) works on: the parts a merge
// combines, or the element or equivalent whose values a step of the work
// back finds (its results are named like V(Ra) or I(Zeq1)).
func (n *netView) hot(k int) map[string]bool {
	out := map[string]bool{}
	if n.red == nil || k < 1 || k > len(n.red.Steps) {
		return out
	}
	eq := map[string][]string{}
	for _, mg := range n.red.Merges {
		eq[mg.Name] = mg.Elements
		if mg.Step == k-1 {
			for _, e := range mg.Elements {
				out[e] = true
			}
			return out
		}
	}
	for _, r := range n.red.Steps[k-1].Results {
		name := r.Name
		if i := strings.IndexByte(name, '('); i >= 0 && strings.HasSuffix(name, ")") {
			name = name[i+1 : len(name)-1]
		}
		if els, ok := eq[name]; ok {
			for _, e := range els {
				out[e] = true
			}
		} else {
			out[name] = true
		}
	}
	return out
}

// within returns, for each element, the newest equivalent it has become
// part of after the first k merges.
func (n *netView) within(k int) map[string]string {
	out := map[string]string{}
	if n.red == nil {
		return out
	}
	for i := 0; i < k && i < len(n.red.Merges); i++ {
		mg := n.red.Merges[i]
		for _, e := range mg.Elements {
			out[e] = mg.Name
		}
	}
	return out
}

func (m *Model) netKey(k tea.KeyMsg) tea.Cmd {
	km := m.keys
	n := m.net
	elem := func() (reduce.Element, bool) {
		if n.sel < 0 || n.sel >= len(n.net.Elements) {
			return reduce.Element{}, false
		}
		return n.net.Elements[n.sel], true
	}
	take := func(suffix, letter, what string) {
		e, ok := elem()
		if !ok {
			return
		}
		src := n.name + "." + e.Name + "." + suffix
		if _, ok := m.s.sh.Lookup(src); !ok {
			m.note(true, "no "+what+" for "+e.Name+" (the network has no solution)")
			return
		}
		def := letter + e.Name
		if _, taken := m.s.sh.Lookup(def); taken {
			def, _ = m.newName(src)
		}
		m.startAsk(what+" of "+e.Name+" as a new row", []question{{label: "name", def: def}}, func(a []string) {
			m.run(what+" of "+e.Name, strings.TrimSpace(a[0])+" = "+src)
		})
	}
	switch {
	case key.Matches(k, km.NetUp):
		n.sel = max(0, n.sel-1)
	case key.Matches(k, km.NetDown):
		n.sel = min(len(n.net.Elements)-1, n.sel+1)
	case key.Matches(k, km.StepOn):
		if n.step < n.steps() {
			n.step++
		} else {
			m.note(false, "reduction complete: every branch value is listed")
		}
	case key.Matches(k, km.StepBack):
		if n.step > 0 {
			n.step--
		} else {
			m.note(false, "at the network as drawn")
		}
	case key.Matches(k, km.TakeV):
		take("v", "v", "voltage")
	case key.Matches(k, km.TakeI):
		take("i", "i", "current")
	case key.Matches(k, km.TakeS):
		take("s", "s", "complex power")
	case key.Matches(k, km.NetThev):
		a, b := "", n.net.Reference
		for _, x := range n.nodes {
			if x != b {
				a = x
			}
		}
		def, _ := m.newName("0 V")
		def = "T" + strings.TrimPrefix(def, "V")
		m.startAsk("Thevenin equivalent of "+n.name+" between two nodes ("+strings.Join(n.nodes, " ")+")",
			[]question{{label: "first node", def: a}, {label: "second node", def: b}, {label: "name", def: def}},
			func(ans []string) {
				st := "thevenin " + ans[2] + " = " + n.name + " between " + ans[0] + " and " + ans[1]
				z := "Z" + ans[2] + " = " + ans[2] + ".zth"
				if _, err := m.s.sh.Clone().Exec(st); err != nil {
					m.note(true, "Thevenin: "+errText(err))
					return
				}
				c := m.s.sh.Clone()
				c.Exec(st)
				if _, err := c.Exec(z); err == nil {
					m.run("Thevenin equivalent (V_th is "+ans[2]+", Z_th is Z"+ans[2]+")", st, z)
				} else {
					m.run("equivalent", st)
				}
			})
		m.back = modeNet
	case key.Matches(k, km.NetNext):
		infos := m.s.sh.Networks()
		i := slices.IndexFunc(infos, func(x sheet.NetworkInfo) bool { return x.Name == n.name })
		next := infos[(i+1)%len(infos)].Name
		m.net = nil
		m.openNet(next)
	case key.Matches(k, km.NetClip):
		e, ok := elem()
		if !ok {
			break
		}
		return m.copyCmd(e.Name+"'s values", m.branchText(e.Name, true))
	case key.Matches(k, km.NetClose):
		m.mode = modeRows
		m.note(false, "")
	case key.Matches(k, km.NetHelp):
		m.openHelp()
	case key.Matches(k, km.NetQuit):
		m.quitting = true
		return tea.Quit
	}
	return nil
}

// branchText is an element's solved values as text.
func (m *Model) branchText(name string, both bool) string {
	f := m.format()
	var parts []string
	for _, x := range []string{"v", "i", "s"} {
		if q, ok := m.s.sh.Lookup(m.net.name + "." + name + "." + x); ok {
			v := f.Polar(q)
			if both {
				v = f.Both(q, m.s.v.PolarFirst)
			}
			parts = append(parts, strings.ToUpper(x)+" = "+v)
		}
	}
	return name + ": " + strings.Join(parts, "; ")
}

// netPane draws the network view in w × h cells.
func (m *Model) netPane(w, h int) []string {
	n := m.net
	f := m.format()
	out := make([]string, 0, h)
	kind := "node block"
	for _, in := range m.s.sh.Networks() {
		if in.Name == n.name && in.Compact != "" {
			kind = "compact form " + in.Compact
		}
	}
	info := fmt.Sprintf("%s, reference %s, nodes %s", kind, n.net.Reference, strings.Join(n.nodes, " "))
	out = append(out, m.th.section(m.tr("network "+n.name), m.tr(info), w))
	within := map[string]string{}
	var cur *reduce.Merge
	if n.red != nil && n.step > 0 {
		done := n.merged(n.step)
		within = n.within(done)
		if done > 0 && n.red.Merges[done-1].Step == n.step-1 {
			cur = &n.red.Merges[done-1]
		}
	}
	hot := n.hot(n.step)
	// below 100 columns the kind gives way, so that voltage and current
	// keep their angles (the value's unit tells the kind)
	wide := w >= 100
	head := fmt.Sprintf("   %-7s %-8s %-14s %-18s %-18s %s", "element", "nodes", "value", "voltage", "current", "power")
	if wide {
		head = fmt.Sprintf("   %-7s %-9s %-8s %-14s %-18s %-18s %s", "element", "kind", "nodes", "value", "voltage", "current", "power")
	}
	out = append(out, m.th.dim.Render(fit(m.tr(head), w)))
	// leave room for the reduction step below the element table
	listH := max(3, min(len(n.net.Elements), h-2-8))
	top := max(0, min(n.sel-listH/2, len(n.net.Elements)-listH))
	for i := top; i < len(n.net.Elements) && i < top+listH; i++ {
		e := n.net.Elements[i]
		sel := " "
		if i == n.sel {
			sel = m.th.g.sel
		}
		hi := "  "
		if hot[e.Name] {
			hi = m.th.g.hi
			if ansi.StringWidth(hi) < 2 {
				hi += " "
			}
		}
		val := elementValue(f, e)
		if eq := within[e.Name]; eq != "" {
			val = "in " + eq
			if cur != nil && hot[e.Name] {
				val = "→ " + eq
			}
		}
		get := func(x string) string {
			if q, ok := m.s.sh.Lookup(n.name + "." + e.Name + "." + x); ok {
				return f.Polar(q)
			}
			return "-"
		}
		kw := ""
		if wide {
			kw = pad(kindWord(e.Kind), 9) + " "
		}
		line := sel + hi + pad(e.Name, 7) + " " + kw + pad(e.From+m.th.g.arrow+e.To, 8) + " " +
			pad(m.tr(val), 14) + " " + pad(get("v"), 18) + " " + pad(get("i"), 18) + " " + get("s")
		line = fit(m.tr(line), w)
		switch {
		case i == n.sel:
			line = m.th.sel.Render(pad(line, w))
		case hot[e.Name]:
			line = m.th.hi.Render(line)
		}
		out = append(out, line)
	}
	for len(out) < 2+listH {
		out = append(out, "")
	}
	if n.sel >= 0 && n.sel < len(n.net.Elements) {
		out = append(out, fit(m.tr(m.th.g.sel+" "+m.branchText(n.net.Elements[n.sel].Name, false)), w))
	}
	// the reduction step
	title := "reduction"
	var body []string
	switch {
	case n.red == nil:
		title = "no step-by-step reduction"
		body = append(body, n.why, "The values above come from the nodal solution of the worksheet.")
	case n.step == 0:
		title = fmt.Sprintf("reduction: the network as drawn (0 of %d steps)", n.steps())
		body = append(body, fmt.Sprintf("→ combines parts one step at a time (%d reductions), then works back to every branch.", len(n.red.Merges)),
			"The source sees "+f.Both(n.red.Z, false)+".")
	default:
		st := n.red.Steps[n.step-1]
		if cur != nil {
			title = fmt.Sprintf("reduction step %d of %d", n.step, n.steps())
			body = append(body, fmt.Sprintf("%s %s = %s  (marked %s above)", m.th.g.hi, cur.Name, strings.Join(cur.Parts, " with "), m.th.g.hi))
		} else {
			title = fmt.Sprintf("working back, step %d of %d", n.step, n.steps())
			var names []string
			for x := range hot {
				names = append(names, x)
			}
			sort.Strings(names)
			if len(names) > 0 {
				body = append(body, fmt.Sprintf("%s %s (marked %s above)", m.th.g.hi, strings.Join(names, ", "), m.th.g.hi))
			}
		}
		body = append(body, strings.Split(strings.TrimRight(st.Text(f, m.s.v.PolarFirst), "\n"), "\n")[1:]...)
	}
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

// kindWord names an element kind in at most nine cells.
func kindWord(k reduce.ElementKind) string {
	switch k {
	case reduce.VoltageSource:
		return "V source"
	case reduce.CurrentSource:
		return "I source"
	}
	return k.String()
}

// elementValue writes an element's component value.
func elementValue(f calc.Format, e reduce.Element) string {
	switch e.Kind {
	case reduce.Resistor:
		return f.Mag(real(e.Raw), calc.DimImpedance, 0)
	case reduce.Inductor:
		return f.Mag(real(e.Raw), calc.DimInductance, 0)
	case reduce.Capacitor:
		return f.Mag(real(e.Raw), calc.DimCapacitance, 0)
	case reduce.VoltageSource:
		return f.Polar(calc.Q(e.Value, calc.DimVoltage))
	case reduce.CurrentSource:
		return f.Polar(calc.Q(e.Value, calc.DimCurrent))
	}
	return f.Rect(calc.Q(e.Z, calc.DimImpedance))
}
