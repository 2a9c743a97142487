package tui

import (
	"fmt"
	"path/filepath"
	"slices"
	"strings"

	"argand/calc"
	"argand/reduce/sheet"
	"argand/tui/cli"
	"argand/tui/clip"
	"argand/tui/store"

	tea "github.com/charmbracelet/bubbletea"
)

// The parts of the screen are components that do not know the Model: each
// takes its keys in Update and returns a message saying what the Model is
// to do, and the Model turns it into calls on the session. The messages
// several parts send are these.

// quitMsg asks the app to quit.
type quitMsg struct{}

// closeMsg gives the keyboard back: help closes, a question is cancelled,
// the network view or the entry line goes back to the entries.
type closeMsg struct{}

// helpMsg opens the help screen.
type helpMsg struct{}

// noteMsg is an outcome to show under the entry line.
type noteMsg struct {
	text string
	err  bool
}

// sync hands the parts what they draw and their sizes: the session's
// rows, steps and settings, and the layout of the screen.
func (m *Model) sync() {
	tableH, lowerH, sketchW := m.layout()
	f := m.format()
	st := m.s.sh.Settings()
	m.table.SetSize(m.width, tableH)
	m.table.SetData(tableData{Rows: m.s.rows(), Selected: m.s.v.Selected, Marks: m.s.v.Marks, Hidden: len(m.s.v.Hidden),
		PolarFirst: m.s.v.PolarFirst, Format: f, Freq: st.Freq, Omega: m.s.sh.Context().Omega(),
		Value: func(n string) calc.Quantity { q, _ := m.s.sh.Lookup(n); return q }})
	steps := m.s.sh.Steps()
	m.trail.SetSize(m.trailWidth(), lowerH)
	m.trail.SetSteps(m.s.sh, steps, f, m.s.v.PolarFirst)
	m.full.SetSize(m.width, m.height)
	m.full.SetSteps(m.s.sh, steps, f, m.s.v.PolarFirst)
	m.sketch.SetSize(sketchW, lowerH)
	m.sketch.SetValues(m.sketchValues(), len(m.s.v.Marks) > 0, st.Comma)
	m.line.SetSize(m.width)
	m.line.SetContext(m.s.sh.OpenNetwork(), st.Comma)
	m.line.SetFocus(m.mode == modeLine)
	if m.ask != nil {
		m.ask.SetSize(m.width)
	}
	if m.net != nil {
		m.net.SetSize(m.width, m.height-3)
		m.net.SetFormat(f, m.s.v.PolarFirst)
	}
	m.helpScr.SetSize(m.width, m.height)
	m.lockScr.SetSize(m.width)
}

// sketchValues are the rows the sketch draws: the marked rows, else the
// selected one.
func (m *Model) sketchValues() []namedValue {
	names := m.s.v.Marks
	if len(names) == 0 && m.s.v.Selected != "" {
		names = []string{m.s.v.Selected}
	}
	var out []namedValue
	for _, n := range names {
		if q, ok := m.s.sh.Lookup(n); ok {
			out = append(out, namedValue{n, q})
		}
	}
	return out
}

// key hands a key to the part that has the keyboard and acts on what it
// returns.
func (m *Model) key(k tea.KeyMsg) tea.Cmd {
	m.sync()
	if cmd, ok := m.paneKey(k); ok {
		return cmd
	}
	var out tea.Msg
	switch m.mode {
	case modeLocked:
		m.lockScr, out = m.lockScr.Update(k)
	case modeHelp:
		m.helpScr, out = m.helpScr.Update(k)
	case modeLine:
		m.line, out = m.line.Update(k)
		return m.lineDid(out)
	case modePrompt:
		*m.ask, out = m.ask.Update(k)
		return m.askDid(out)
	case modeNet:
		*m.net, out = m.net.Update(k)
		return m.netDid(out)
	case modeExport:
		m.export, out = m.export.Update(k)
	case modeTrail:
		m.full, out = m.full.Update(k)
	default:
		m.table, out = m.table.Update(k)
		return m.tableDid(out)
	}
	return m.did(out)
}

// did acts on a message of the locked screen, help, the export chooser
// and the trail in full, and on the messages every part may send.
func (m *Model) did(msg tea.Msg) tea.Cmd {
	switch msg := msg.(type) {
	case quitMsg:
		m.quitting = true
		return tea.Quit
	case helpMsg:
		m.openHelp("")
	case noteMsg:
		m.note(msg.err, msg.text)
	case lockChoiceMsg:
		m.chooseLocked(msg.readOnly)
	case exportMsg:
		m.exportTo(msg.choice)
	case clipMsg:
		return m.copyCmd(msg.what, msg.text)
	case closeMsg:
		switch m.mode {
		case modeHelp:
			m.mode = m.back
		case modeExport:
			m.mode = modeRows
			m.note(false, "nothing exported")
		default:
			m.mode = modeRows
		}
	}
	return nil
}

// tableDid acts on a message of the entries table.
func (m *Model) tableDid(msg tea.Msg) tea.Cmd {
	switch msg := msg.(type) {
	case selectMsg:
		m.s.v.Selected = msg.name
	case rowKeyMsg:
		for _, a := range m.rowActions() {
			if slices.Equal(a.b.Keys(), msg.binding.Keys()) {
				return a.do(m)
			}
		}
	case typeMsg:
		m.mode = modeLine
		m.sync()
		return m.key(msg.key)
	}
	return nil
}

// lineDid acts on a message of the entry line.
func (m *Model) lineDid(msg tea.Msg) tea.Cmd {
	switch msg := msg.(type) {
	case runMsg:
		m.submit(msg.src)
	case pasteMsg:
		m.pasteLines(msg.text)
	case passKeyMsg:
		m.mode = modeRows
		m.sync()
		return m.key(msg.key)
	case editedMsg:
		// the outcome shown was of an earlier line: an error left under
		// a new statement would read as that statement's
		m.note(false, "")
	case closeMsg:
		m.mode = modeRows
	default:
		return m.did(msg)
	}
	return nil
}

// askDid acts on a message of the question asked.
func (m *Model) askDid(msg tea.Msg) tea.Cmd {
	switch msg := msg.(type) {
	case answeredMsg:
		done := m.askDone
		m.ask, m.askDone = nil, nil
		m.mode = m.back
		m.note(false, "")
		done(msg.answers)
	case closeMsg:
		m.ask, m.askDone = nil, nil
		m.mode = m.back
		m.note(false, "cancelled")
	default:
		return m.did(msg)
	}
	return nil
}

// netDid acts on a message of the network view.
func (m *Model) netDid(msg tea.Msg) tea.Cmd {
	switch msg := msg.(type) {
	case takeMsg:
		m.takeBranch(msg.elem, msg.suffix, msg.what)
	case theveninMsg:
		m.netThevenin()
	case nextNetMsg:
		names := m.s.sh.NetworkNames()
		next := names[(slices.Index(names, m.net.name)+1)%len(names)]
		m.net = nil
		m.openNet(next)
	case closeMsg:
		m.mode = modeRows
		m.note(false, "")
	default:
		return m.did(msg)
	}
	return nil
}

// startAsk opens questions in the entry line; done takes the answers.
func (m *Model) startAsk(title string, qs []question, done func([]string)) {
	q := newQuestions(m.keys, m.th, title, qs, func(n string) bool { _, ok := m.s.sh.Lookup(n); return ok })
	q.SetSize(m.width)
	m.ask, m.askDone = &q, done
	m.back = m.mode
	if m.back == modePrompt || m.back == modeHelp {
		m.back = modeRows
	}
	m.mode = modePrompt
}

// openHelp shows the help screen, on topic ("" for the general help).
func (m *Model) openHelp(topic string) {
	cut := m.cutMessage()
	m.back = m.mode
	m.mode = modeHelp
	m.helpScr.Open(topic, cut)
}

// openFull shows the whole trail at the full width of the screen, at the
// latest step, so that a long caution or a plot can be read whole.
func (m *Model) openFull() {
	m.mode = modeTrail
	m.full.Latest()
}

// openExport opens the export chooser.
func (m *Model) openExport() {
	m.mode = modeExport
	m.note(false, m.export.Offer())
}

// submit runs the entry line.
func (m *Model) submit(text string) {
	src := strings.TrimSpace(text)
	if src == "" {
		m.mode = modeRows
		return
	}
	if word, arg, _ := strings.Cut(src, " "); word == "help" || word == "?" {
		// help on a name, in the app as in the line mode
		name := strings.TrimSpace(arg)
		if name != "" {
			if _, ok := cli.Topic(name); !ok {
				m.note(true, fmt.Sprintf("no help on %q: try a function name or a statement word (%s: all help)", name, firstKey(m.keys.Line.Help)))
				return
			}
		}
		m.line.Accept(src)
		m.openHelp(name)
		return
	}
	if src == "new session" {
		m.line.Accept(src)
		m.blankStart()
		return
	}
	m.runThen("", func() {
		m.line.Accept(src)
		if m.s.sh.OpenNetwork() != "" {
			m.note(false, "network block open: type its elements, then end")
		}
	}, src)
}

// pasteLines runs pasted text of several lines as one change: every line
// or none.
func (m *Model) pasteLines(text string) {
	text = strings.ReplaceAll(text, "\r\n", "\n")
	text = strings.ReplaceAll(text, "\r", "\n")
	var stmts []string
	if cur := strings.TrimSpace(m.line.Value()); cur != "" {
		stmts = append(stmts, cur)
	}
	for _, l := range strings.Split(text, "\n") {
		if strings.TrimSpace(l) != "" {
			stmts = append(stmts, l)
		}
	}
	if len(stmts) == 0 {
		return
	}
	m.runThen(fmt.Sprintf("pasted %d lines", len(stmts)), func() { m.line.Clear() }, stmts...)
}

// exportTo asks for the file of the export chosen and writes it.
func (m *Model) exportTo(c exportChoice) {
	def := c.file
	if c.what == exportSheet {
		def = m.s.worksheet
		if def == "" {
			def = "session.argand"
		}
	}
	m.startAsk(c.title, []question{{label: "file", def: def}}, func(a []string) {
		path := a[0]
		if path == "" {
			m.note(true, "no file named")
			return
		}
		if err := store.Publish(path, []byte(m.exportText(c.what))); err != nil {
			m.note(true, "could not write "+path+": "+err.Error())
			return
		}
		abs, _ := filepath.Abs(path)
		m.note(false, "wrote "+abs)
	})
	m.back = modeRows
}

// exportText is the text an export writes.
func (m *Model) exportText(what exportWhat) string {
	switch what {
	case exportMarkdown:
		return m.trailMarkdown()
	case exportText:
		return m.trailText()
	case exportRecord:
		return m.recordHTML()
	case exportCSV:
		return m.trailCSV()
	}
	return m.worksheetText()
}

// copiedMsg reports the outcome of a clipboard request.
type copiedMsg struct {
	what string
	err  error
}

// copyCmd writes the OSC 52 request for text to the terminal, outside the
// renderer (bubbletea has no way to pass an escape sequence through).
func (m *Model) copyCmd(what, text string) tea.Cmd {
	// what is pasted later must not act on a terminal either
	text = calc.Printable(text)
	if m.opt.ASCII {
		text = m.tr(text)
	}
	seq, err := clip.Sequence(text, m.opt.Getenv)
	if err != nil {
		m.note(true, "copy: "+err.Error())
		return nil
	}
	w := m.opt.Out
	m.note(false, "sending "+what+" to the terminal clipboard…")
	return func() tea.Msg {
		_, err := w.Write([]byte(seq))
		return copiedMsg{what: what, err: err}
	}
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
	nv := newNetView(m.keys, m.th, name, v)
	nv.keep(m.net)
	m.net = &nv
	m.mode = modeNet
	k := m.keys.Net
	m.note(false, fmt.Sprintf("network %s: %s steps through its reduction, %s %s %s take a branch value as a row",
		name, firstKey(k.StepOn), firstKey(k.TakeV), firstKey(k.TakeI), firstKey(k.TakeS)))
}

// takeBranch asks a name for element e's voltage, current or power
// (suffix v, i or s) and defines it as a new row.
func (m *Model) takeBranch(e sheet.ViewElement, suffix, what string) {
	n := m.net
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
