package tui

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"argand/calc"
	"argand/reduce/sheet"
	"argand/tui/sketch"

	"github.com/charmbracelet/bubbles/key"
	"github.com/charmbracelet/x/ansi"
)

// format returns the number format in force: the worksheet's digits and
// angle unit, the app's glyph set.
func (m *Model) format() calc.Format {
	f := m.s.sh.Context().Format
	f.ASCII = m.opt.ASCII
	return f
}

// statusView is the top line: the settings every number depends on.
func (m *Model) statusView() string {
	flags, parts := m.statusParts()
	s := m.th.label.Render("argand") + "  "
	if len(flags) > 0 {
		s += m.th.err.Render("["+strings.Join(flags, ", ")+"]") + "  "
	}
	return s + m.tr(strings.Join(parts, " · "))
}

// statusParts are the flags of the session (read-only, not saved, a
// network being written), written for the screen, and the settings in
// the order the top line shows them.
func (m *Model) statusParts() (flags, parts []string) {
	st := m.s.sh.Settings()
	f := m.format()
	ang := "degrees"
	if st.Radians {
		ang = "radians"
	}
	basis := "RMS"
	if st.Basis == calc.Peak {
		basis = "peak"
	}
	first := "rect first"
	if m.s.v.PolarFirst {
		first = "polar first"
	}
	dec := "point"
	if st.Comma {
		dec = "comma"
	}
	parts = []string{
		f.Mag(st.Freq, calc.DimFrequency, 0),
		"ω " + f.Mag(calc.Context{Freq: st.Freq}.Omega(), calc.DimAngularFrequency, calc.KindAngle),
		ang, strconv.Itoa(st.Digits) + " digits", basis, dec, first,
	}
	if m.s.readOnly {
		flags = append(flags, "READ-ONLY")
	}
	if m.s.saveErr != nil {
		flags = append(flags, "NOT SAVED")
	}
	if n := m.s.sh.OpenNetwork(); n != "" {
		flags = append(flags, m.tr("writing network "+n))
	}
	return flags, parts
}

// tableView is the entries table, newest at the top.
type tableView struct {
	top int // first row shown
}

func (t *tableView) view(m *Model, w, h int) []string {
	rows := m.s.rows()
	out := make([]string, 0, h)
	info := fmt.Sprintf("%d rows", len(rows))
	if n := len(m.s.v.Marks); n > 0 {
		info += ", marked " + strings.Join(m.s.v.Marks, " ")
	}
	if n := len(m.s.v.Hidden); n > 0 {
		info += fmt.Sprintf(", %d put away", n)
	}
	out = append(out, m.th.section("entries", m.tr(info), w))
	nameW := 8
	for _, r := range rows {
		nameW = max(nameW, min(14, ansi.StringWidth(r)))
	}
	h1, h2 := "rectangular", "polar"
	if m.s.v.PolarFirst {
		h1, h2 = h2, h1
	}
	body := h - 2
	sel := 0
	for i, r := range rows {
		if r == m.s.v.Selected {
			sel = i
		}
	}
	if sel < t.top {
		t.top = sel
	}
	if sel >= t.top+body {
		t.top = sel - body + 1
	}
	t.top = max(0, min(t.top, len(rows)-body))
	// format the rows shown, then size the columns to them
	f := m.format()
	omega := m.s.sh.Context().Omega()
	var shown []tableCells
	c1, c2 := ansi.StringWidth(h1), ansi.StringWidth(h2)
	for i := t.top; i < len(rows) && i < t.top+body; i++ {
		q, _ := m.s.sh.Lookup(rows[i])
		a, b := f.Rect(q), f.Polar(q)
		if m.s.v.PolarFirst {
			a, b = b, a
		}
		c := tableCells{rows[i], a, b, equivalent(f, q, omega)}
		c1 = max(c1, ansi.StringWidth(a))
		c2 = max(c2, ansi.StringWidth(b))
		shown = append(shown, c)
	}
	c1, c2 = min(c1, 30), min(c2, 26)
	freq := f.Mag(m.s.sh.Settings().Freq, calc.DimFrequency, 0)
	head := "    " + pad("name", nameW) + "  " + pad(h1, c1) + "  " + pad(h2, c2) + "  " + "at " + freq
	out = append(out, m.th.dim.Render(fit(m.tr(head), w)))
	if body < 1 {
		return out
	}
	if len(rows) == 0 {
		out = append(out, m.th.dim.Render(fit(m.tr("    no entries yet: tab, then type a value such as Z1 = 3+j4 Ω"), w)))
		return out
	}
	for _, c := range shown {
		out = append(out, m.tableLine(c, nameW, c1, c2, w))
	}
	return out
}

// tableCells are the formatted cells of one row of the table.
type tableCells struct{ name, a, b, eq string }

// tableLine draws one row of the table: selection and mark, name, both
// forms and what the value is at the working frequency.
func (m *Model) tableLine(c tableCells, nameW, c1, c2, w int) string {
	name := c.name
	selMark, mark := m.rowMarks(name)
	line := selMark + mark + " " + pad(m.tr(name), nameW) + "  " + pad(c.a, c1) + "  " + pad(c.b, c2) + "  "
	eq := c.eq
	if _, lc, ok := strings.Cut(eq, " + "); ok && ansi.StringWidth(line+eq) > w {
		// R is the real part, already in the rectangular form: the
		// L or C alone, whole, says more than both cut
		eq = lc
	}
	line = fit(line+eq, w)
	switch {
	case name == m.s.v.Selected:
		return m.th.sel.Render(pad(line, w))
	case mark != "  ":
		return m.th.marked.Render(line)
	}
	return line
}

// rowMarks are the signs before a row's name: the selection marker or a
// space, and the mark with its number in the order marked or two spaces.
func (m *Model) rowMarks(name string) (sel, mark string) {
	sel, mark = " ", "  "
	if name == m.s.v.Selected {
		sel = m.th.g.sel
	}
	if k := m.s.markIndex(name); k >= 0 {
		mark = m.th.g.mark + strconv.Itoa(k+1)
		if k >= 9 {
			mark = m.th.g.mark + "+"
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

// trailView is the step trail, scrollable through the whole session.
type trailView struct {
	back  int // lines scrolled back from the latest
	key   trailKey
	lines []trailLine
}

type trailKey struct {
	sh    *sheet.Sheet
	n     int
	f     calc.Format
	polar bool
	width int
}

type trailLine struct {
	text string
	head bool
	pre  bool // a line of a plot: cut, never wrapped, at narrow widths
}

// build renders every step of the session once for width cells; the trail
// only grows while the sheet stays the same, so new steps are appended.
func (t *trailView) build(m *Model, width int) {
	steps := m.s.sh.Steps()
	k := trailKey{sh: m.s.sh, n: len(steps), f: m.format(), polar: m.s.v.PolarFirst, width: width}
	if k == t.key {
		return
	}
	from := 0
	if t.key.sh == k.sh && t.key.f == k.f && t.key.polar == k.polar && t.key.width == k.width && t.key.n <= k.n {
		from = t.key.n
	} else {
		t.lines = t.lines[:0]
	}
	for i := from; i < len(steps); i++ {
		t.lines = append(t.lines, stepLines(m, &steps[i], k.f, k.polar, width)...)
	}
	t.key = k
}

// stepLines writes one step as trail lines wrapped to width: continuation
// lines hang under their line, notes wrap word by word, and a note of
// several lines (a plot) keeps its shape.
func stepLines(m *Model, st *calc.Step, f calc.Format, polar bool, width int) []trailLine {
	c := *st
	c.Notes = nil
	var out []trailLine
	wrapped := func(l string, head bool) {
		l = m.tr(l)
		for _, w := range wrapLine(l, width, hangIndent(l)) {
			out = append(out, trailLine{text: w, head: head})
		}
	}
	for j, l := range strings.Split(strings.TrimRight(c.Text(f, polar), "\n"), "\n") {
		wrapped(l, j == 0)
	}
	for _, n := range st.Notes {
		n = strings.TrimRight(n, "\n")
		if f.ASCII {
			n = calc.ASCIIText(n)
		}
		first, rest, _ := strings.Cut(n, "\n")
		wrapped("    note: "+first, false)
		if rest == "" {
			continue
		}
		// a note of several lines (a plot) keeps its shape
		for _, l := range strings.Split(rest, "\n") {
			out = append(out, trailLine{text: m.tr("      " + l), pre: true})
		}
	}
	return out
}

func (t *trailView) scroll(m *Model, by int) {
	t.build(m, m.trailWidth())
	t.back = max(0, min(t.back+by, len(t.lines)-1))
}

func (t *trailView) view(m *Model, w, h int) []string {
	t.build(m, w)
	t.back = max(0, min(t.back, len(t.lines)-1))
	n := len(m.s.sh.Steps())
	info := fmt.Sprintf("%d steps, T in full", n)
	if t.back > 0 {
		info = fmt.Sprintf("%d lines back (L: latest)", t.back)
	}
	out := make([]string, 0, h)
	out = append(out, m.th.section("trail", info, w))
	body := h - 1
	end := len(t.lines) - t.back
	start := max(0, end-body)
	for i := start; i < end; i++ {
		l := t.lines[i]
		s := fitWhole(l.text, w) // a plot's line is cut between its words, not inside a number
		if l.head {
			s = m.th.label.Render(s)
		}
		out = append(out, s)
	}
	if len(t.lines) == 0 {
		out = append(out, m.th.dim.Render("no steps yet"))
	}
	return out
}

// sketchPane draws the marked rows (or the selected one) as arrows.
type sketchPane struct {
	key   string
	lines []string
	// title and info of the lines' first line, for a layout that writes
	// its own
	title, info string
}

func (p *sketchPane) view(m *Model, w, h int) []string {
	names := m.s.v.Marks
	what := "marked rows"
	if len(names) == 0 && m.s.v.Selected != "" {
		names = []string{m.s.v.Selected}
		what = "selected row; space marks more"
	}
	k := fmt.Sprintf("%p|%d|%s|%d|%d|%v", m.s.sh, len(m.s.sh.Steps()), strings.Join(names, ","), w, h, m.opt.ASCII)
	if k == p.key {
		return p.lines
	}
	items := make([]sketch.Item, 0, len(names))
	var skipped []string
	for _, n := range names {
		q, ok := m.s.sh.Lookup(n)
		if !ok {
			continue
		}
		if !drawable(q) {
			// a magnitude, a signed real or a count has no angle: an
			// arrow at 0° would claim one
			skipped = append(skipped, n)
			continue
		}
		items = append(items, sketch.Item{Label: n, V: sketchValue(q), Unit: calc.UnitSymbol(q.Dim, q.Kind, m.opt.ASCII)})
	}
	// one complex power on its own is drawn as its power triangle
	if len(names) == 1 {
		if q, ok := m.s.sh.Lookup(names[0]); ok && q.Dim == calc.DimPower && q.Kind == calc.KindApparent && q.V != 0 {
			p.title, p.info = "power triangle", m.tr(names[0]+": P, Q and S")
			out := []string{m.th.section(p.title, p.info, w)}
			out = append(out, sketch.Triangle(real(q.V), imag(q.V), w, h-1, sketch.Options{ASCII: m.opt.ASCII, Comma: m.s.sh.Settings().Comma})...)
			p.key, p.lines = k, out
			return out
		}
	}
	p.title, p.info = "sketch", m.tr(what)
	out := []string{m.th.section(p.title, p.info, w)}
	rows := h - 1
	var note string
	if len(skipped) > 0 {
		note = m.tr(strings.Join(skipped, ", ") + ": no angle, not drawn")
		if len([]rune(note)) > w {
			note = string([]rune(note)[:w])
		}
		rows--
	}
	if len(items) == 0 {
		out = append(out, m.th.dim.Render("nothing to draw"))
	} else {
		out = append(out, sketch.Render(items, w, rows, sketch.Options{ASCII: m.opt.ASCII, Comma: m.s.sh.Settings().Comma})...)
	}
	if note != "" {
		out = append(out, m.th.dim.Render(note))
	}
	p.key, p.lines = k, out
	return out
}

// drawable reports a quantity that has a direction in the complex plane:
// a phasor or complex quantity. A real number of a kind that is real by
// meaning (an active or reactive power, a resistance, a magnitude) has no
// angle, and an arrow along an axis would claim one.
func drawable(q calc.Quantity) bool {
	return !q.Scalar() && q.Kind != calc.KindAngle
}

// sketchValue is where a quantity is drawn in the complex plane. A
// reactive power kept as a real number of var is the imaginary part of
// S = P + jQ, so it is drawn as j·Q; an active power stays on the real
// axis, where P lies.
func sketchValue(q calc.Quantity) complex128 {
	if q.Dim == calc.DimPower && q.Kind == calc.KindReactive && imag(q.V) == 0 {
		return complex(0, real(q.V))
	}
	return q.V
}

// entryLine is the line where statements are typed, with live feedback:
// each change is checked by the worksheet (parsed and tried on a copy) so
// an error and its place show before enter is pressed.
type entryLine struct {
	f       field
	err     *calc.Error
	checked string
	history []string
	hpos    int
}

func (e *entryLine) validate(m *Model) {
	s := e.f.String()
	if s == e.checked {
		return
	}
	e.checked = s
	e.err = nil
	if strings.TrimSpace(s) != "" {
		e.err = m.s.sh.Validate(s)
	}
}

const linePrompt = "› "

func (m *Model) promptText() string {
	p := linePrompt
	if n := m.s.sh.OpenNetwork(); n != "" {
		p = n + " › "
	}
	return m.tr(p)
}

func (m *Model) entryView() string {
	if m.mode == modePrompt && m.ask != nil {
		return m.ask.view(m, m.width)
	}
	p := m.promptText()
	w := m.width - ansi.StringWidth(p)
	if m.mode != modeLine {
		if m.line.f.String() == "" {
			example := "Zc = 1/(j·ω·4.7 µF)"
			if m.s.sh.Settings().Comma {
				example = "Zc = 1/(j·ω·4,7 µF)"
			}
			hint := m.tr("tab or e: type a statement, such as " + example)
			if ansi.StringWidth(p+hint) > m.width {
				// a narrow screen: the example whole or not at all
				hint = m.tr("tab or e: type a statement")
			}
			return m.th.dim.Render(p + hint)
		}
		s, _ := m.line.f.render(w, func(c string) string { return c })
		return m.th.dim.Render(p + s)
	}
	s, _ := m.line.f.render(w, func(c string) string { return m.th.cursor.Render(c) })
	return m.th.label.Render(p) + s
}

// feedbackView is the line under the entry line: the live parse error
// with a caret under its place, or the outcome of the last action.
func (m *Model) feedbackView() string {
	if m.job != nil {
		return m.th.label.Render(m.tr(m.jobView()))
	}
	if col, marks, msg, ok := m.caret(); ok {
		// the caret stays under its column; the message follows it when
		// it fits, else it takes the hint line below in full
		if col+ansi.StringWidth(marks)+1+ansi.StringWidth(msg) <= m.width {
			return strings.Repeat(" ", col) + m.th.err.Render(marks+" "+msg)
		}
		return strings.Repeat(" ", col) + m.th.err.Render(marks)
	}
	if m.mode == modePrompt && m.ask != nil {
		if m.msgErr && m.msg != "" {
			// a refused answer says why in place of the title
			return m.th.err.Render(fit("error: "+m.tr(m.msg), m.width))
		}
		return m.th.dim.Render(m.tr(m.ask.title))
	}
	if m.caution != 0 && !m.msgErr {
		return m.th.err.Render(m.cautionLine())
	}
	ls := m.msgLines()
	if len(ls) == 0 {
		return ""
	}
	if m.msgErr {
		return m.th.err.Render(ls[0])
	}
	return ls[0]
}

// msgLines is the outcome of the last action as text, wrapped to the
// width: a message too long for the feedback line goes on in the hint
// line, so that its end (where a file went, what to do) is not cut off.
func (m *Model) msgLines() []string {
	if m.msg == "" {
		return nil
	}
	s := m.tr(m.msg)
	// a read-only refusal is not a fault: it says why in its own words
	if m.msgErr && !strings.HasPrefix(m.msg, "read-only:") {
		s = "error: " + s
	}
	return wrapLine(s, m.width, 0)
}

// cautionSuffix tells where a caution shown in one line is read whole:
// the help screen, which has every caution's whole text, opened by the
// help key of the part that has the keyboard.
func (m *Model) cautionSuffix() string {
	k := m.keys.Table.Help
	if m.mode == modeLine {
		k = m.keys.Line.Help
	}
	return " (" + m.tr(k.Help().Key) + " has it whole)"
}

// cautionLine is the caution of the last statement on one line, cut to
// the width with the way to read it in full always shown.
func (m *Model) cautionLine() string {
	head := "caution: "
	suffix := m.cautionSuffix()
	room := m.width - ansi.StringWidth(head) - ansi.StringWidth(suffix)
	return head + ansi.Truncate(m.tr(m.caution.Line()), max(1, room), "…") + suffix
}

// caret places the live parse error under the entry line: the column
// of the caret (in cells, on the screen), the marks and the message.
func (m *Model) caret() (col int, marks, msg string, ok bool) {
	if m.mode != modeLine || m.line.err == nil {
		return 0, "", "", false
	}
	e := m.line.err
	p := m.promptText()
	start := m.line.f.window(m.width - ansi.StringWidth(p))
	col = ansi.StringWidth(p)
	text := m.line.f.text
	for i := start; i < e.Col-1 && i < len(text); i++ {
		col += cellWidth(text[i])
	}
	if e.Col-1 > len(text) {
		col++
	}
	// the marks cover the marked characters as drawn: an escape is wider
	n := 0
	for i := max(e.Col-1, 0); i < e.Col-1+max(e.Len, 1) && i < len(text); i++ {
		n += cellWidth(text[i])
	}
	n = max(1, min(n, 20))
	col = max(0, min(col, m.width-1))
	n = min(n, m.width-col)
	marks = m.th.g.caret + strings.Repeat("~", n-1)
	return col, marks, "error: " + m.tr(e.Msg), true
}

// hintView is one line of the keys most likely wanted next.
func (m *Model) hintView() string {
	if m.job != nil {
		return m.th.key.Render(m.tr(m.keys.Stop.Help().Key)) + m.tr(" stops it; the session stays as it was")
	}
	if sig := m.signature(); sig != "" {
		// inside a call the parameters matter more than the complaint
		// that the call is not closed yet
		return sig
	}
	if col, marks, msg, ok := m.caret(); ok {
		if col+ansi.StringWidth(marks)+1+ansi.StringWidth(msg) > m.width {
			// the message did not fit beside its caret: it has this line
			return m.th.err.Render(msg)
		}
	} else if m.mode != modePrompt && (m.caution == 0 || m.msgErr) {
		if ls := m.msgLines(); len(ls) > 1 {
			// the rest of a long outcome has this line
			if m.msgErr {
				return m.th.err.Render(ls[1])
			}
			return ls[1]
		}
	}
	// tr goes on the plain pieces, before styling: styled text holds
	// escape sequences of its own
	// the hint line names each binding by its first key (tab of tab/e),
	// the help screen by all of them
	k := func(b key.Binding) string {
		first, _, _ := strings.Cut(b.Help().Key, "/")
		return m.th.key.Render(m.tr(first)) + " " + m.tr(b.Help().Desc)
	}
	var parts []string
	if m.mode != modeRows {
		for _, b := range m.keys.For(m.mode).ShortHelp() {
			parts = append(parts, k(b))
		}
		return strings.Join(parts, "  ")
	}
	return m.tableHint(k)
}

// tableHint is the hint line of the entries table: the most wanted keys
// always, the others in order while the line has room, each in its place.
// Before an operation takes its default operands, the hint names them.
func (m *Model) tableHint(k func(key.Binding) string) string {
	type hint struct {
		text string
		must bool
	}
	short := m.keys.Table.ShortHelp()
	hs := []hint{{k(short[0]), true}, {k(short[1]), false}, {k(short[2]), false}}
	if ops := m.operands(2); len(ops) == 2 {
		var keys []string
		for _, b := range m.keys.Table.operations() {
			keys = append(keys, b.Help().Key)
		}
		hs = append(hs, hint{m.tr("on "+ops[0]+", "+ops[1]+": ") + m.th.key.Render(m.tr(strings.Join(keys, " "))), true})
	}
	for i, b := range short[3:] {
		hs = append(hs, hint{k(b), i < 2})
	}
	take := make([]bool, len(hs))
	used := -2
	for pass := 0; pass < 2; pass++ {
		for i, h := range hs {
			if take[i] || h.must != (pass == 0) {
				continue
			}
			w := ansi.StringWidth(h.text) + 2
			if pass == 0 || used+w <= m.width {
				take[i] = true
				used += w
			}
		}
	}
	var parts []string
	for i, h := range hs {
		if take[i] {
			parts = append(parts, h.text)
		}
	}
	return strings.Join(parts, "  ")
}
