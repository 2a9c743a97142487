package tui

import (
	"fmt"
	"slices"
	"strings"
	"unicode/utf8"

	"argand/calc"

	"github.com/charmbracelet/bubbles/key"
	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/x/ansi"
)

// A terminal of narrowWidth to minWidth−1 columns and at least
// narrowHeight rows (an SSH client on a phone held upright is about 40 to
// 50 columns by 20 to 30 rows) takes the narrow layout: one pane at a
// time under the status line (the entries, the trail, the sketch or the
// network view), cycled by the pane key, with the entry line, the outcome
// and the hint line always on screen. Every value is written whole: one
// that does not fit beside its name goes on a line of its own, the
// second form under the first, and a line too long is cut between words,
// never inside a number.
const (
	narrowWidth  = 40
	narrowHeight = 20
)

// pane is what the body of a narrow screen shows. The network view is
// shown while it has the keyboard (modeNet), so it is no pane here: the
// pane key opens it after the sketch and closes it to the entries.
type pane int

const (
	paneTable pane = iota
	paneTrail
	paneSketch
)

var paneNames = [...]string{"entries", "trail", "sketch"}

// feedbackMax bounds the lines the outcome of an action may take on a
// narrow screen, where one line holds a few words only.
const feedbackMax = 4

// narrow reports whether the screen takes the narrow layout.
func (m *Model) narrow() bool {
	return m.width >= narrowWidth && m.width < minWidth && m.height >= narrowHeight
}

// tooSmallSize reports a screen too small for either layout.
func (m *Model) tooSmallSize() bool {
	if m.width >= minWidth && m.height >= minHeight {
		return false
	}
	return !m.narrow()
}

// trailWidth is the width the trail is written for in the layout in use.
func (m *Model) trailWidth() int {
	if m.narrow() {
		return m.width
	}
	_, _, sketchW := m.layout()
	return m.width - sketchW - 1
}

// paneKey handles the pane key of the entries table and the network
// view; ok is false for any other key.
func (m *Model) paneKey(k tea.KeyMsg) (cmd tea.Cmd, ok bool) {
	switch {
	case m.mode == modeRows && key.Matches(k, m.keys.Table.Pane):
	case m.mode == modeNet && key.Matches(k, m.keys.Net.Pane):
	default:
		return nil, false
	}
	if !m.narrow() {
		m.note(false, fmt.Sprintf("%s shows one pane after another on a screen under %d columns; here every pane is on screen",
			m.keys.Table.Pane.Help().Key, minWidth))
		return nil, true
	}
	m.nextPane()
	return nil, true
}

// nextPane shows the next pane: entries, trail, sketch, then the network
// last looked at (or the newest), then the entries again.
func (m *Model) nextPane() {
	switch {
	case m.mode == modeNet:
		m.mode = modeRows
		m.pane = paneTable
	case m.pane < paneSketch:
		m.pane++
	default:
		m.pane = paneTable
		names := m.s.sh.NetworkNames()
		if len(names) == 0 {
			m.note(false, "no network to show: network NAME reference NODE, its elements, then end make one")
			return
		}
		name := ""
		if m.net != nil && slices.Contains(names, m.net.name) {
			name = m.net.name
		}
		m.openNet(name)
	}
}

// netShown reports that the narrow screen shows the network view: while
// it has the keyboard, or asks a question for it.
func (m *Model) netShown() bool {
	return m.net != nil && (m.mode == modeNet || m.mode == modePrompt && m.back == modeNet)
}

// nextName names the pane the pane key shows next.
func (m *Model) nextName() string {
	switch {
	case m.netShown():
		return paneNames[paneTable]
	case m.pane < paneSketch:
		return paneNames[m.pane+1]
	case len(m.s.sh.NetworkNames()) > 0:
		return "network"
	}
	return paneNames[paneTable]
}

// narrowView lays the narrow screen out: the status line, one pane, the
// entry line, the outcome (a few lines when it needs them) and the keys
// that fit. Help, the trail in full and the session-in-use question take
// the whole screen as on a wide one (screen draws them).
func (m *Model) narrowView() []string {
	fb := m.narrowFeedback()
	hint := m.narrowHint()
	entry := m.narrowEntry()
	bodyH := m.height - 2 - len(entry) - len(fb)
	var body []string
	switch {
	case m.netShown():
		body = m.narrowNet(bodyH)
	case m.pane == paneTrail:
		body = m.narrowTrail(bodyH)
	case m.pane == paneSketch:
		body = m.narrowSketch(bodyH)
	default:
		body = m.narrowTable(bodyH)
	}
	for len(body) < bodyH {
		body = append(body, "")
	}
	lines := make([]string, 0, m.height)
	lines = append(lines, m.narrowStatus())
	lines = append(lines, body[:bodyH]...)
	lines = append(lines, entry...)
	lines = append(lines, fb...)
	return append(lines, hint)
}

// narrowEntry is the entry line; a question too long to leave room for
// its answer beside it is asked on the lines above, wrapped, and answered
// on the line itself.
func (m *Model) narrowEntry() []string {
	if m.mode != modePrompt || m.ask == nil {
		return []string{m.entryView()}
	}
	label := m.ask.Label()
	if ansi.StringWidth(label)+12 <= m.width {
		return []string{m.entryView()}
	}
	var out []string
	for _, l := range capLines(wrapLine(label, m.width, 2), 3, m.width) {
		out = append(out, m.th.label.Render(l))
	}
	p := m.tr(linePrompt)
	return append(out, m.th.label.Render(p)+m.ask.Answer(m.width-ansi.StringWidth(p)))
}

// narrowStatus is the status line of a narrow screen: the flags of the
// session always, then the settings that fit whole, the ones every
// number depends on first.
func (m *Model) narrowStatus() string {
	flags, parts := m.statusParts()
	// the working frequency, the angle unit, digits, basis, decimal
	// marker and form; ω, which follows from the frequency, last
	parts = append(append(parts[:1:1], parts[2:]...), parts[1])
	var s string
	used := 0
	if len(flags) > 0 {
		f := fitWhole("["+strings.Join(flags, ", ")+"]", m.width)
		s, used = m.th.err.Render(f), ansi.StringWidth(f)
	}
	sep := ""
	if used > 0 {
		sep = "  "
	}
	for _, p := range parts {
		p = m.tr(sep + p)
		if used+ansi.StringWidth(p) > m.width {
			continue
		}
		s += p
		used += ansi.StringWidth(p)
		sep = " · "
	}
	return s
}

// paneHead is a pane's title line: its name, then as much of info as fits
// whole, and always which pane the pane key shows next.
func (m *Model) paneHead(label string, info []string) string {
	next := m.tr(m.keys.Table.Pane.Help().Key + " → " + m.nextName())
	label = m.tr(label)
	room := m.width - ansi.StringWidth(m.th.g.rule+m.th.g.rule+" "+label+" ") - 4
	label = fitWhole(label, m.width-ansi.StringWidth(next)-8)
	s := next
	for i := len(info) - 1; i >= 0; i-- {
		// the first parts of info matter most: drop from the end
		if t := m.tr(strings.Join(info[:i+1], ", ")+" · ") + next; ansi.StringWidth(t) <= room {
			s = t
			break
		}
	}
	return m.th.section(label, s, m.width)
}

// narrowHint is the hint line of a narrow screen: the keys most wanted
// next, each whole, as many as fit; help first, from which every key can
// be read.
func (m *Model) narrowHint() string {
	if m.job != nil {
		k := m.tr(m.keys.Stop.Help().Key)
		return m.th.key.Render(k) + fitWhole(m.tr(" stops it; the session stays as it was"), m.width-ansi.StringWidth(k))
	}
	if sig := m.line.Signature(); sig != "" {
		// the parameter typed is marked by brackets as well as by style
		return fitWhole(ansi.Strip(sig), m.width)
	}
	var hs []hintItem
	for _, b := range m.hintKeys() {
		if b.Help().Key == "" {
			// the operands of the next operation: left out when they do
			// not fit, the keys after them still offered
			hs = append(hs, hintItem{m.tr(b.Help().Desc), m.operandHint(), true})
			continue
		}
		hs = append(hs, m.bindingHint(b))
	}
	return m.joinHints(hs)
}

// hintItem is one hint of a hint line: its text, the same styled, and
// whether the hints after it may be offered without it.
type hintItem struct {
	text, styled string
	optional     bool
}

// bindingHint names a binding by its first key (tab of tab/e), then
// what it does.
func (m *Model) bindingHint(b key.Binding) hintItem { return m.th.bindingHint(b) }

// bindingHint is Model.bindingHint in the theme's look.
func (t theme) bindingHint(b key.Binding) hintItem {
	k, d := t.tr(firstKey(b)), t.tr(b.Help().Desc)
	return hintItem{text: k + " " + d, styled: t.key.Render(k) + " " + d}
}

// hintFit is a hint line of the bindings bs, as many as fit width whole.
func (t theme) hintFit(bs []key.Binding, width int) string {
	hs := make([]hintItem, len(bs))
	for i, b := range bs {
		hs[i] = t.bindingHint(b)
	}
	return joinHints(hs, width)
}

// joinHints writes the hints that fit the width whole, in order: after
// one that does not fit only optional ones are left out, since the rest
// would read as if they were all.
func (m *Model) joinHints(hs []hintItem) string { return joinHints(hs, m.width) }

// joinHints writes the hints that fit width whole, in order, as
// Model.joinHints.
func joinHints(hs []hintItem, width int) string {
	var parts []string
	used := -2
	for _, h := range hs {
		w := ansi.StringWidth(h.text) + 2
		if used+w > width {
			if h.optional {
				continue
			}
			break
		}
		parts = append(parts, h.styled)
		used += w
	}
	return strings.Join(parts, "  ")
}

// hintKeys are the keys the narrow hint line offers, in order: help, the
// pane key, then the part's own short help. In the entries table an
// empty binding stands for the operands of the next operation.
func (m *Model) hintKeys() []key.Binding {
	switch m.mode {
	case modeRows:
		short := m.keys.Table.ShortHelp()
		tk := m.keys.Table
		switch m.pane {
		case paneTrail:
			// the trail pane is read: its own keys first
			return []key.Binding{short[0], brief(tk.Pane, "pane"), brief(tk.TrailBack, "back"), brief(tk.TrailOn, "on"),
				brief(tk.TrailLast, "latest"), brief(tk.TrailFull, "in full"), short[1]}
		case paneSketch:
			return []key.Binding{short[0], brief(tk.Pane, "pane"), brief(tk.Mark, "mark"), brief(tk.Down, "row"), brief(tk.Unmark, "clear"), short[1]}
		}
		bs := []key.Binding{short[0], brief(tk.Pane, "pane"), short[1]}
		if h := m.operandText(); h != "" {
			var b key.Binding
			b.SetHelp("", h)
			bs = append(bs, b)
		}
		return append(bs, short[2:]...)
	case modeNet:
		short := m.keys.Net.ShortHelp()
		help := short[len(short)-1]
		return append([]key.Binding{help, brief(m.keys.Net.Pane, "pane")}, short[:len(short)-1]...)
	}
	var first, rest []key.Binding
	for _, b := range m.keys.For(m.mode).ShortHelp() {
		if b.Help().Desc == "help" {
			first = append(first, b)
		} else {
			rest = append(rest, b)
		}
	}
	return append(first, rest...)
}

// operandText names the rows the next operation takes and its keys, as
// the entries table's hint line does; "" when there are none.
func (m *Model) operandText() string {
	ops := m.operands(2)
	if len(ops) != 2 {
		return ""
	}
	var keys []string
	for _, b := range m.keys.Table.operations() {
		keys = append(keys, b.Help().Key)
	}
	return "on " + ops[0] + ", " + ops[1] + ": " + strings.Join(keys, " ")
}

// operandHint is operandText with its keys styled.
func (m *Model) operandHint() string {
	text := m.operandText()
	i := strings.LastIndex(text, ": ")
	return m.tr(text[:i+2]) + m.th.key.Render(m.tr(text[i+2:]))
}

// narrowFeedback is the outcome under the entry line on a narrow screen:
// the same as on a wide one, wrapped to at most feedbackMax lines rather
// than cut. A live error keeps its caret under its place, and the message
// follows on the lines below.
func (m *Model) narrowFeedback() []string {
	w := m.width
	if m.job != nil {
		return []string{m.th.label.Render(fitWhole(m.tr(m.jobView()), w))}
	}
	if col, marks, msg, ok := m.line.Caret(); ok {
		out := []string{strings.Repeat(" ", col) + m.th.err.Render(marks)}
		for _, l := range m.cutTo(wrapLine(msg, w, 2), feedbackMax-1, w) {
			out = append(out, m.th.err.Render(l))
		}
		return out
	}
	style := func(s ...string) string { return strings.Join(s, " ") }
	var ls []string
	switch {
	case m.mode == modePrompt && m.ask != nil && m.msgErr && m.msg != "":
		ls, style = wrapLine("error: "+m.tr(m.msg), w, 2), m.th.err.Render
	case m.mode == modePrompt && m.ask != nil:
		ls, style = wrapLine(m.ask.Title(), w, 2), m.th.dim.Render
	case m.caution != 0 && !m.msgErr:
		return m.narrowCaution()
	default:
		ls = m.msgLines()
		if m.msgErr {
			style = m.th.err.Render
		}
	}
	if len(ls) == 0 {
		return []string{""}
	}
	out := m.cutTo(ls, feedbackMax, w)
	for i := range out {
		out[i] = style(out[i])
	}
	return out
}

// narrowCaution is the caution of the last statement in feedbackMax
// lines at most, with where to read it whole always shown.
func (m *Model) narrowCaution() []string {
	suffix := m.cautionSuffix()
	ls := wrapLine("caution: "+m.tr(m.caution.Line())+suffix, m.width, 2)
	if n := feedbackMax; len(ls) > n {
		ls = ls[:n]
		ls[n-1] = fitWhole(ls[n-1]+" "+strings.Repeat("x", m.width), m.width-ansi.StringWidth(suffix)) + suffix
	}
	for i := range ls {
		ls[i] = m.th.err.Render(ls[i])
	}
	return ls
}

// capLines keeps at most n of the wrapped lines ls; when some are left
// out, the last kept ends in "…" after a whole word.
func capLines(ls []string, n, w int) []string {
	if len(ls) <= n {
		return ls
	}
	out := slices.Clone(ls[:n])
	out[n-1] = fitWhole(out[n-1]+" "+strings.TrimLeft(ls[n], " "), w)
	return out
}

// fitWhole cuts plain text s to w cells between words, ending in "…",
// so that no number (nor any word) is cut; a single word wider than the
// line is cut by cells, but not inside a run of digits when it can be
// helped.
func fitWhole(s string, w int) string {
	if ansi.StringWidth(s) <= w {
		return s
	}
	if w < 2 {
		return ansi.Truncate(s, w, "")
	}
	head := ansi.Truncate(s, w-1, "")
	if i := strings.LastIndexByte(head, ' '); i > 0 && strings.TrimSpace(head[:i]) != "" {
		kept := strings.TrimRight(head[:i], " ")
		// a number before "…" reads as one cut short: end on a word
		for {
			r, _ := utf8.DecodeLastRuneInString(kept)
			j := strings.LastIndexByte(kept, ' ')
			if !numberRune(r) || j <= 0 || strings.TrimSpace(kept[:j]) == "" {
				break
			}
			kept = strings.TrimRight(kept[:j], " ")
		}
		return kept + "…"
	}
	return backOffNumber(head, s[len(head):]) + "…"
}

// backOffNumber shortens head, the start of a word whose rest follows,
// to before the number the cut falls in, when the word holds anything
// else to show.
func backOffNumber(head, rest string) string {
	r, _ := utf8.DecodeRuneInString(rest)
	if !numberRune(r) {
		return head
	}
	i := len(head)
	for i > 0 {
		p, n := utf8.DecodeLastRuneInString(head[:i])
		if !numberRune(p) {
			break
		}
		i -= n
	}
	if i == 0 {
		return head
	}
	return head[:i]
}

// numberRune reports a rune that can be part of a written number.
func numberRune(r rune) bool {
	return r >= '0' && r <= '9' || r == '.' || r == ','
}

// narrowTrail is the trail across the whole narrow screen, at the
// latest step or scrolled back.
func (m *Model) narrowTrail(h int) []string {
	w := m.width
	tl := m.trail.lines()
	back := m.trail.clamp(m.trail.back)
	info := []string{fmt.Sprintf("%d steps", len(m.s.sh.Steps())), m.keys.Table.TrailFull.Help().Key + " in full"}
	if back > 0 {
		info = []string{fmt.Sprintf("%d lines back", back)}
	}
	out := []string{m.paneHead("trail", info)}
	end := len(tl) - back
	for i := max(0, end-(h-1)); i < end; i++ {
		l := tl[i]
		s := l.text
		if l.pre {
			s = fitWhole(s, w)
		}
		if l.head {
			s = m.th.label.Render(s)
		}
		out = append(out, s)
	}
	if len(tl) == 0 {
		out = append(out, m.th.dim.Render("no steps yet"))
	}
	return out
}

// narrowSketch is the sketch (or power triangle) across the narrow
// screen, under a title line of the narrow layout.
func (m *Model) narrowSketch(h int) []string {
	m.sketch.SetSize(m.width, h-1)
	ls := lines(m.sketch.View())
	title, info := m.sketch.Heading()
	// what is drawn (and how to mark more) has a line of its own: the
	// title line has room for the pane key only
	out := []string{m.paneHead(title, nil), m.th.dim.Render(fitWhole(info, m.width))}
	return append(out, ls[1:]...)
}

// narrowTable is the entries table on a narrow screen: a row is its
// name with the first form, and the second form under it, so that both
// are whole; the rows scroll to keep the selected one on screen.
func (m *Model) narrowTable(h int) []string {
	rows := m.s.rows()
	info := []string{fmt.Sprintf("%d rows", len(rows))}
	if len(m.s.v.Marks) > 0 {
		info = append(info, "marked "+strings.Join(m.s.v.Marks, " "))
	}
	if n := len(m.s.v.Hidden); n > 0 {
		info = append(info, fmt.Sprintf("%d put away", n))
	}
	out := []string{m.paneHead("entries", info)}
	if len(rows) == 0 {
		for _, l := range wrapLine(m.tr("no entries yet: tab, then type a value such as Z1 = 3+j4 Ω"), m.width, 4) {
			out = append(out, m.th.dim.Render(l))
		}
		return out
	}
	nameW := 4
	for _, r := range rows[max(0, m.paneTop-h):min(len(rows), m.paneTop+2*h)] {
		nameW = max(nameW, min(narrowName, ansi.StringWidth(m.tr(r))))
	}
	h1, h2 := "rectangular", "polar"
	if m.s.v.PolarFirst {
		h1, h2 = h2, h1
	}
	out = append(out, m.th.dim.Render(fitWhole(m.tr("    "+pad("name", nameW)+"  "+h1+", then "+h2), m.width)))
	blocks := map[int][]string{}
	block := func(i int) []string {
		if b, ok := blocks[i]; ok {
			return b
		}
		blocks[i] = m.rowBlock(rows[i], nameW)
		return blocks[i]
	}
	body := h - 2
	m.paneTop = narrowTop(slices.Index(rows, m.s.v.Selected), m.paneTop, body, len(rows), func(i int) int { return len(block(i)) })
	for i := m.paneTop; i < len(rows); i++ {
		b := block(i)
		if len(out)-2+len(b) > body && i > m.paneTop {
			break
		}
		out = append(out, b...)
	}
	return out
}

// narrowName is the widest name given a column of its own on a narrow
// screen; a longer name has the line to itself, the values under it.
const narrowName = 10

// narrowTop returns the first row to show so that the selected row sel
// is on screen whole, moving top as little as it can; height gives the
// lines of row i, body the lines there are.
func narrowTop(sel, top, body, n int, height func(int) int) int {
	if sel < 0 {
		return max(0, min(top, n-1))
	}
	if sel < top {
		return sel
	}
	// the first row from which sel still fits: counted back from sel, so
	// a jump to the oldest row costs a screen of rows, not all of them
	first, used := sel, height(sel)
	for first > top && used+height(first-1) <= body {
		first--
		used += height(first)
	}
	return first
}

// rowBlock writes one row of the narrow entries table: the marks, the
// name and the first form, the second form under the first, and what the
// value is at the working frequency where it fits (for the selected row,
// on a line of its own if need be). A value that does not fit beside the
// name takes its own line, whole.
func (m *Model) rowBlock(name string, nameW int) []string {
	f := m.format()
	q, _ := m.s.sh.Lookup(name)
	a, b := m.tr(f.Rect(q)), m.tr(f.Polar(q))
	if m.s.v.PolarFirst {
		a, b = b, a
	}
	eq := m.tr(equivalent(f, q, m.s.sh.Context().Omega()))
	sel, mark := rowMarks(m.th.g, name, m.s.v.Selected, m.s.v.Marks)
	w, nm := m.width, m.tr(name)
	indent := 4 + nameW + 2
	var ls []string
	first := sel + mark + " " + pad(nm, nameW) + "  "
	if ansi.StringWidth(nm) > nameW {
		ls = wrapLine(sel+mark+" "+nm, w, 4)
		first = strings.Repeat(" ", indent)
	}
	place := func(prefix, v string) {
		if ansi.StringWidth(prefix)+ansi.StringWidth(v) <= w {
			ls = append(ls, prefix+v)
			return
		}
		if strings.TrimSpace(prefix) != "" {
			ls = append(ls, strings.TrimRight(prefix, " "))
		}
		// whole on a line of its own; wider still, between its parts
		ls = append(ls, wrapLine("    "+v, w, 6)...)
	}
	place(first, a)
	place(strings.Repeat(" ", indent), b)
	if last := ls[len(ls)-1]; eq != "" && ansi.StringWidth(last)+2+ansi.StringWidth(eq) <= w {
		ls[len(ls)-1] = last + "  " + eq
	} else if eq != "" && name == m.s.v.Selected {
		ls = append(ls, wrapLine(strings.Repeat(" ", indent)+eq, w, 6)...)
	}
	for i, l := range ls {
		switch {
		case name == m.s.v.Selected:
			ls[i] = m.th.sel.Render(pad(l, w))
		case mark != "  ":
			ls[i] = m.th.marked.Render(l)
		}
	}
	return ls
}

// narrowNet is the network view on a narrow screen: a line per element
// (name, nodes, its value or the equivalent it is in), the selected
// element's voltage, current and power a line each, and the reduction
// step shown, its first line and its result kept when it must be cut.
func (m *Model) narrowNet(h int) []string {
	n := m.net
	w := m.width
	kind := "reference " + n.v.Reference
	if n.v.Compact != "" {
		kind = "compact form " + n.v.Compact
	}
	out := []string{m.paneHead("network "+n.name, []string{kind})}
	detail := m.netDetail()
	title, body := m.net.stepShown()
	var step [][]string
	lines := 0
	for _, b := range body {
		step = append(step, wrapLine(m.tr(b), w, hangIndent(b)))
		lines += len(step[len(step)-1])
	}
	listH := max(3, min(len(n.v.Elements), h-1-len(detail)-len(m.titleLines(title))-lines))
	out = append(out, m.narrowNetRows(listH)...)
	for len(out) < 1+listH {
		out = append(out, "")
	}
	out = append(out, detail...)
	out = append(out, m.titleLines(title)...)
	return append(out, keepEnds(step, h-len(out))...)
}

// keepEnds returns the lines of the groups (a line of text each, wrapped)
// that fit in room lines: all when they fit, else the last (a step's
// result), the first (what it combines) and as many before the last as
// fit, each group whole or not at all.
func keepEnds(groups [][]string, room int) []string {
	n := 0
	for _, g := range groups {
		n += len(g)
	}
	if n <= room {
		return slices.Concat(groups...)
	}
	last := groups[len(groups)-1]
	if len(last) > room {
		return nil
	}
	room -= len(last)
	rest := groups[:len(groups)-1]
	var head []string
	if len(rest) > 0 && len(rest[0]) <= room {
		head, room, rest = rest[0], room-len(rest[0]), rest[1:]
	}
	var tail [][]string
	for i := len(rest) - 1; i >= 0 && len(rest[i]) <= room; i-- {
		tail = append([][]string{rest[i]}, tail...)
		room -= len(rest[i])
	}
	return slices.Concat(append(append([][]string{head}, tail...), last)...)
}

// narrowNetRows are the element lines of the narrow network view, around
// the selected element.
func (m *Model) narrowNetRows(listH int) []string {
	n := m.net
	f := m.format()
	sm := n.marks()
	nameW, nodeW := 4, 5
	for _, e := range n.v.Elements {
		nameW = max(nameW, min(8, ansi.StringWidth(m.tr(e.Name))))
		nodeW = max(nodeW, min(9, ansi.StringWidth(m.tr(e.From+m.th.g.arrow+e.To))))
	}
	var out []string
	top := max(0, min(n.sel-listH/2, len(n.v.Elements)-listH))
	for i := top; i < len(n.v.Elements) && i < top+listH; i++ {
		e := n.v.Elements[i]
		sel, hi, val, _ := sm.cells(m.th.g, i == n.sel, e.Name, e.ValueText(f))
		line := fitWhole(m.tr(sel+hi+pad(e.Name, nameW)+" "+pad(e.From+m.th.g.arrow+e.To, nodeW)+" "+val), m.width)
		switch {
		case i == n.sel:
			line = m.th.sel.Render(pad(line, m.width))
		case sm.hot[e.Name]:
			line = m.th.hi.Render(line)
		}
		out = append(out, line)
	}
	return out
}

// netDetail is the selected element of the narrow network view: its
// kind and value, then its voltage, current and power a line each.
func (m *Model) netDetail() []string {
	e, ok := m.net.selected()
	if !ok {
		return nil
	}
	w := m.width
	f := m.format()
	out := wrapLine(m.tr(m.th.g.sel+" "+e.Name+" "+kindWord(e.Kind)+" "+e.ValueText(f)), w, 4)
	if !e.Solved {
		return append(out, wrapLine(m.tr("  no solution (the network has no source)"), w, 4)...)
	}
	for _, x := range []struct {
		l string
		q calc.Quantity
	}{{"V", e.V}, {"I", e.I}, {"S", e.S}} {
		out = append(out, wrapLine(m.tr("  "+x.l+" = "+f.Polar(x.q)), w, 6)...)
	}
	return out
}

// titleLines writes a section title for the narrow screen: on its rule
// when it fits, else wrapped between words, the rule after its first
// line.
func (m *Model) titleLines(title string) []string {
	ls := wrapLine(m.tr(title), m.width-4, 2)
	out := []string{m.th.section(ls[0], "", m.width)}
	for _, l := range ls[1:] {
		out = append(out, m.th.label.Render(l))
	}
	return out
}
