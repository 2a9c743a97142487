package tui

import (
	"slices"
	"strconv"
	"strings"

	"argand/calc"

	"github.com/charmbracelet/bubbles/key"
	"github.com/charmbracelet/x/ansi"
)

// format returns the number format in force: the worksheet's digits and
// angle unit, the app's glyph set.
func (m *Model) format() calc.Format { return m.s.format() }

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

// entryView is the entry line, or the question asked in its place.
func (m *Model) entryView() string {
	if m.mode == modePrompt && m.ask != nil {
		return m.ask.View()
	}
	return m.line.View()
}

// feedbackView is the line under the entry line: the live parse error
// with a caret under its place, or the outcome of the last action.
func (m *Model) feedbackView() string {
	if m.job != nil {
		return m.th.label.Render(m.tr(m.jobView()))
	}
	if col, marks, msg, ok := m.line.Caret(); ok {
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
		return m.th.dim.Render(m.ask.Title())
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

// cutTo is ls in at most n lines of width w: past that, the rest joins
// the last line, cut between words, which then ends with the key of the
// help screen, where the message is shown whole first (cutMessage). The
// way out an error names (fewer points, a budget) comes at its end.
func (m *Model) cutTo(ls []string, n, w int) []string {
	if len(ls) <= n {
		return ls
	}
	suffix := m.cautionSuffix()
	out := slices.Clone(ls[:n])
	rest := out[n-1]
	for _, l := range ls[n:] {
		rest += " " + strings.TrimLeft(l, " ")
	}
	out[n-1] = fitWhole(rest, max(2, w-ansi.StringWidth(suffix))) + suffix
	return out
}

// cutMessage is the message the screen shows only in part, whole, for
// the help screen to show first: a live error, or the outcome of the
// last action, past the lines the layout gives it. "" when all shows.
func (m *Model) cutMessage() string {
	caretLines, msgLines := 1, 2
	if m.narrow() {
		caretLines, msgLines = feedbackMax-1, feedbackMax
	}
	if _, _, msg, ok := m.line.Caret(); ok {
		if len(wrapLine(msg, m.width, 2)) > caretLines {
			if !strings.HasPrefix(msg, "error: ") {
				msg = "error: " + msg
			}
			return msg
		}
		return ""
	}
	if ls := m.msgLines(); len(ls) > msgLines {
		return strings.Join(ls, " ")
	}
	return ""
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

// hintView is one line of the keys most likely wanted next.
func (m *Model) hintView() string {
	if m.job != nil {
		return m.th.key.Render(m.tr(m.keys.Stop.Help().Key)) + m.tr(" stops it; the session stays as it was")
	}
	if sig := m.line.Signature(); sig != "" {
		// inside a call the parameters matter more than the complaint
		// that the call is not closed yet
		return sig
	}
	if col, marks, msg, ok := m.line.Caret(); ok {
		if col+ansi.StringWidth(marks)+1+ansi.StringWidth(msg) > m.width {
			// the message did not fit beside its caret: it has this
			// line, and the help screen has it whole if it needs more
			return m.th.err.Render(m.cutTo(wrapLine(msg, m.width, 2), 1, m.width)[0])
		}
	} else if m.mode != modePrompt && (m.caution == 0 || m.msgErr) {
		if ls := m.cutTo(m.msgLines(), 2, m.width); len(ls) > 1 {
			// the rest of a long outcome has this line
			if m.msgErr {
				return m.th.err.Render(ls[1])
			}
			return ls[1]
		}
	}
	// the hint line names each binding by its first key (tab of tab/e),
	// the help screen by all of them
	switch m.mode {
	case modeRows:
		return m.tableHint(m.th.hintKey)
	case modeExport:
		return m.export.View()
	}
	return m.th.hint(m.keys.For(m.mode).ShortHelp())
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
