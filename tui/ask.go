package tui

import (
	"fmt"
	"path/filepath"
	"strings"

	"argand/calc"
	"argand/tui/cli"
	"argand/tui/clip"
	"argand/tui/store"

	"github.com/charmbracelet/bubbles/key"
	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/x/ansi"
)

// question is one thing asked: a role of an operation, a name, a file.
type question struct {
	label string
	def   string // offered answer, taken when the answer is left empty
	names bool   // the answer names rows: checked before going on
	list  bool   // several names, separated by commas
}

// questions asks a sequence of questions in the entry line, then hands the
// answers on.
type questions struct {
	title string
	qs    []question
	i     int
	ans   []string
	f     field
	done  func([]string)
}

func (m *Model) startAsk(title string, qs []question, done func([]string)) {
	m.ask = &questions{title: title, qs: qs, done: done}
	m.back = m.mode
	if m.back == modePrompt || m.back == modeHelp {
		m.back = modeRows
	}
	m.mode = modePrompt
}

func (q *questions) view(m *Model, w int) string {
	label := q.label(m)
	return m.th.label.Render(label) + q.answer(m, w-ansi.StringWidth(label))
}

// label is the question asked, with its number and the offered answer.
func (q *questions) label(m *Model) string {
	cur := q.qs[q.i]
	label := cur.label
	if len(q.qs) > 1 {
		label = fmt.Sprintf("%d/%d %s", q.i+1, len(q.qs), label)
	}
	if cur.def != "" {
		label += " [" + cur.def + "]"
	}
	return m.tr(label) + ": "
}

// answer draws the answer being typed in w cells (at least 4).
func (q *questions) answer(m *Model, w int) string {
	s, _ := q.f.render(max(4, w), func(c string) string { return m.th.cursor.Render(c) })
	return s
}

// askKey handles a key while a question is open.
func (m *Model) askKey(k tea.KeyMsg) tea.Cmd {
	q := m.ask
	km := m.keys.Ask
	if q.f.edit(k, m.keys.Edit) {
		return nil
	}
	switch {
	case key.Matches(k, km.Accept):
		a := strings.TrimSpace(q.f.String())
		cur := q.qs[q.i]
		if a == "" {
			a = cur.def
		}
		if cur.names && a != "" {
			for _, n := range splitNames(a) {
				if _, ok := m.s.sh.Lookup(n); !ok {
					m.note(true, fmt.Sprintf("no row named %q; type a name from the table", n))
					return nil
				}
			}
		}
		q.ans = append(q.ans, a)
		q.f.clear()
		q.i++
		if q.i == len(q.qs) {
			m.ask = nil
			m.mode = m.back
			m.note(false, "")
			q.done(q.ans)
		}
	case key.Matches(k, km.Cancel):
		m.ask = nil
		m.mode = m.back
		m.note(false, "cancelled")
	case key.Matches(k, km.Quit):
		m.quitting = true
		return tea.Quit
	default:
		if k.Type == tea.KeyRunes || k.Type == tea.KeySpace {
			if _, err := q.f.insert(keyRunes(k)); err != nil {
				m.note(true, err.Error())
			}
		}
	}
	return nil
}

func keyRunes(k tea.KeyMsg) []rune {
	if k.Type == tea.KeySpace {
		return []rune{' '}
	}
	return k.Runes
}

// lineKey handles a key while the entry line has the keyboard.
func (m *Model) lineKey(k tea.KeyMsg) tea.Cmd {
	km := m.keys.Line
	l := &m.line
	before := l.f.String()
	ran := false // the line ran: its outcome is the message now
	switch {
	case l.f.edit(k, m.keys.Edit):
	case key.Matches(k, km.Run):
		m.submit()
		ran = true
	case key.Matches(k, km.Leave):
		m.mode = modeRows
	case key.Matches(k, km.Prev):
		if l.hpos > 0 {
			l.hpos--
			l.f.set(l.history[l.hpos])
		}
	case key.Matches(k, km.Next):
		if l.hpos < len(l.history) {
			l.hpos++
			if l.hpos == len(l.history) {
				l.f.clear()
			} else {
				l.f.set(l.history[l.hpos])
			}
		}
	case key.Matches(k, km.Help):
		m.openHelp()
	case key.Matches(k, km.Quit):
		m.quitting = true
		return tea.Quit
	default:
		if k.Alt && !k.Paste {
			// esc and a key arriving together (a slow link) read as
			// alt+key: leave the line, then act on the key
			m.mode = modeRows
			k.Alt = false
			return m.rowsKey(k)
		}
		if k.Type == tea.KeyRunes || k.Type == tea.KeySpace {
			rs := keyRunes(k)
			if k.Paste && strings.ContainsAny(string(rs), "\n\r") {
				m.pasteLines(string(rs))
				ran = true
				break
			}
			if _, err := l.f.insert(rs); err != nil {
				// the refusal is the outcome of this key: kept below
				m.note(true, err.Error())
				ran = true
			}
		}
	}
	if !ran && l.f.String() != before {
		// the outcome shown was of an earlier line: an error left under
		// a new statement would read as that statement's
		m.note(false, "")
	}
	l.validate(m)
	return nil
}

// submit runs the entry line.
func (m *Model) submit() {
	l := &m.line
	src := strings.TrimSpace(l.f.String())
	if src == "" {
		m.mode = modeRows
		return
	}
	if word, arg, _ := strings.Cut(src, " "); word == "help" || word == "?" {
		// help on a name, in the app as in the line mode
		name := strings.TrimSpace(arg)
		if name != "" {
			if _, ok := cli.Topic(name); !ok {
				m.note(true, fmt.Sprintf("no help on %q: try a function name or a statement word (f1: all help)", name))
				return
			}
		}
		l.history = append(l.history, src)
		l.hpos = len(l.history)
		l.f.clear()
		m.openHelp()
		m.helpTopic = name
		return
	}
	if src == "new session" {
		l.history = append(l.history, src)
		l.hpos = len(l.history)
		l.f.clear()
		m.blankStart()
		return
	}
	m.runThen("", func() {
		l.history = append(l.history, src)
		l.hpos = len(l.history)
		l.f.clear()
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
	if cur := strings.TrimSpace(m.line.f.String()); cur != "" {
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
	m.runThen(fmt.Sprintf("pasted %d lines", len(stmts)), func() { m.line.f.clear() }, stmts...)
}

// exportKey handles the choice of what to export.
func (m *Model) exportKey(k tea.KeyMsg) tea.Cmd {
	km := m.keys.Export
	write := func(title, def string, text func() string) {
		m.startAsk(title, []question{{label: "file", def: def}}, func(a []string) {
			path := a[0]
			if path == "" {
				m.note(true, "no file named")
				return
			}
			if err := store.Save(path, []byte(text())); err != nil {
				m.note(true, "could not write "+path+": "+err.Error())
				return
			}
			abs, _ := filepath.Abs(path)
			m.note(false, "wrote "+abs)
		})
		m.back = modeRows
	}
	switch {
	case key.Matches(k, km.Markdown):
		write("export the trail as Markdown", "argand-trail.md", m.trailMarkdown)
	case key.Matches(k, km.Text):
		write("export the trail as plain text", "argand-trail.txt", m.trailText)
	case key.Matches(k, km.Sheet):
		def := m.s.worksheet
		if def == "" {
			def = "session.argand"
		}
		write("save the session as a worksheet (argand run FILE replays it)", def, m.worksheetText)
	case key.Matches(k, km.CSV):
		write("export the tables and results as CSV (as argand run --csv)", "argand-trail.csv", m.trailCSV)
	case key.Matches(k, km.HTML):
		write("write a job record (HTML: steps, diagrams, checks, the worksheet)", "argand-record.html", m.recordHTML)
	case key.Matches(k, km.Cancel):
		m.mode = modeRows
		m.note(false, "nothing exported")
	}
	return nil
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

// helpLines is the help screen: every binding of every mode, by bubbles
// help, then the safety caution.
func (m *Model) helpLines() []string {
	// tr goes on the plain text before styling: a styled line holds
	// escape sequences of its own, which tr would show as escapes
	para := func(text string, indent int) []string { return wrapLine(m.tr(text), m.width, indent) }
	var out []string
	if m.helpTopic != "" {
		if t, ok := cli.Topic(m.helpTopic); ok {
			out = append(out, m.helpTitle("help "+m.helpTopic)...)
			for _, l := range strings.Split(strings.TrimRight(t, "\n"), "\n") {
				out = append(out, para(l, 4)...)
			}
			out = append(out, "")
		}
	}
	out = append(out, m.helpTitle("argand: AC phasor work, step by step")...)
	out = append(out, para("Rows are named values, newest at the top. Operations take the marked rows in the "+
		"order marked, else the two newest (older first), which the hint line names before you press the key. "+
		"Each becomes a worksheet statement. "+m.keys.Table.TrailFull.Help().Key+" shows the trail in full, every step whole.", 0)...)
	out = append(out, "")
	for _, md := range allModes {
		out = append(out, m.th.heading.Render(m.tr("keys: "+md.String())))
		out = append(out, m.helpKeys(m.keys.Mode(md))...)
		out = append(out, "")
	}
	// a heading too long for a narrow screen wraps, each line styled
	for _, l := range wrapLine(m.tr("keys: while a statement runs (after about 0.1 s it shows a progress line)"), m.width, 2) {
		out = append(out, m.th.heading.Render(l))
	}
	out = append(out, m.helpKeys([]key.Binding{m.keys.Stop})...)
	out = append(out, "", m.th.heading.Render(m.tr("safety")))
	out = append(out, para(calc.SafetyText, 0)...)
	for _, c := range calc.Cautions() {
		if c != calc.CautionMains {
			out = append(out, para(c.String()+": "+c.Text(), 2)...)
		}
	}
	out = append(out, "")
	out = append(out, para("Statements: see argand help language; functions: argand help functions.", 0)...)
	return out
}

// helpTitle is a title of the help screen with how to close and scroll
// it, on a line of its own when the two do not fit on one.
func (m *Model) helpTitle(title string) []string {
	title, how := m.tr(title), m.tr("(esc closes; ↑↓ scroll)")
	if ansi.StringWidth(title)+3+ansi.StringWidth(how) > m.width {
		return []string{m.th.label.Render(title), how}
	}
	return []string{m.th.label.Render(title) + "   " + how}
}

// helpKeys lists bindings with their help, by bubbles help, each key and
// description made printable (and ASCII where asked) before it is styled;
// a description too long for a narrow screen continues under itself.
func (m *Model) helpKeys(bs []key.Binding) []string {
	shown := make([]key.Binding, len(bs))
	for i, b := range bs {
		shown[i] = b
		shown[i].SetHelp(m.tr(b.Help().Key), m.tr(b.Help().Desc))
	}
	hm := m.help
	// no width: the help component would give up on a group wider than
	// the screen; the lines are wrapped below instead
	hm.Width = 0
	var out []string
	for _, l := range strings.Split(hm.FullHelpView([][]key.Binding{shown}), "\n") {
		l = strings.TrimRight(l, " ")
		c := descCol(l)
		if c == 0 || c > m.width/2 || ansi.StringWidth(l) <= m.width {
			out = append(out, wrapLine(l, m.width, min(c, 16))...)
			continue
		}
		// the description wraps in its own column, the keys beside it
		desc := strings.TrimLeft(l[strings.Index(l, "  "):], " ")
		for i, d := range wrapLine(desc, m.width-c, 0) {
			lead := l[:len(l)-len(desc)]
			if i > 0 {
				lead = strings.Repeat(" ", c)
			}
			out = append(out, lead+d)
		}
	}
	return out
}

func (m *Model) helpView() []string {
	all := m.helpLines()
	h := m.height - 1
	m.helpTop = max(0, min(m.helpTop, len(all)-h))
	end := min(len(all), m.helpTop+h)
	out := append([]string(nil), all[m.helpTop:end]...)
	for len(out) < h {
		out = append(out, "")
	}
	out = append(out, m.th.dim.Render(fmt.Sprintf("help %d-%d of %d lines", m.helpTop+1, end, len(all))))
	return out
}

// lockedText is the question asked when the session is held by another
// argand or cannot be locked at all: a title and the lines that explain
// it, the same in the app and in the line mode.
func (m *Model) lockedText() (title string, why []string) {
	if m.lockErr != nil {
		return "the session could not be locked", []string{
			"The lock that keeps two argands from saving one session failed:",
			m.lockErr.Error(),
			"Without it another argand could save over this one's work.",
		}
	}
	who := "Another argand"
	if m.lockPID > 0 {
		who = fmt.Sprintf("Another argand, process %d,", m.lockPID)
	}
	return "your session is already open", []string{
		who + " is working on it, perhaps in another login or window.",
		"Only one argand saves a session at a time, so that neither loses the other's work.",
	}
}

// lockedView says that another argand holds the session, why that
// matters, and the ways on, each with its key from the bindings.
func (m *Model) lockedView() []string {
	title, why := m.lockedText()
	out := []string{m.th.section(m.tr(title), "", m.width), ""}
	for _, l := range why {
		out = append(out, wrapLine(m.tr(l), m.width, 0)...)
	}
	out = append(out, "", m.th.heading.Render(m.tr("How do you want to go on?")))
	for _, b := range m.keys.Lock.FullHelp()[0] {
		key := m.th.key.Render(m.tr(pad(b.Help().Key, 3)))
		// a narrow screen has each way on whole, wrapped beside its key
		for i, l := range wrapLine(m.tr(b.Help().Desc), m.width-6, 0) {
			if i == 0 {
				out = append(out, "  "+key+" "+l)
			} else {
				out = append(out, "      "+l)
			}
		}
	}
	out = append(out, "")
	for _, l := range wrapLine(m.tr("session file: "+m.lockPath), m.width, 2) {
		out = append(out, m.th.dim.Render(l))
	}
	return out
}

// descCol is the cell where the description of a help line starts: after
// the first run of two or more spaces.
func descCol(l string) int {
	i := strings.Index(l, "  ")
	if i < 0 {
		return 0
	}
	rest := strings.TrimLeft(l[i:], " ")
	return ansi.StringWidth(l[:len(l)-len(rest)])
}
