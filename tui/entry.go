package tui

import (
	"strings"

	"argand/calc"
	"argand/reduce/sheet"

	"github.com/charmbracelet/bubbles/key"
	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/x/ansi"
)

// entryLine is the line where statements are typed, with live feedback:
// each change is checked (by check, which the parent sets to the
// worksheet's Validate) so an error and its place show before enter is
// pressed. It is a component: Update takes a key and returns what the
// parent is to do as a message (runMsg, pasteMsg, passKeyMsg, editedMsg,
// closeMsg, helpMsg, quitMsg, noteMsg), View draws the line.
type entryLine struct {
	keys LineKeys
	edit EditKeys
	wake key.Binding // the entries table's key that gives the line the keyboard
	th   theme

	width   int
	focused bool
	network string // the network block open, shown in the prompt
	comma   bool   // the decimal comma: the example and separators follow it
	check   func(string) *calc.Error

	f       field
	err     *calc.Error
	checked string
	history []string
	hpos    int
}

// runMsg asks the parent to run the statement typed.
type runMsg struct{ src string }

// pasteMsg asks the parent to run pasted text of several lines, after the
// line's own text, as one change.
type pasteMsg struct{ text string }

// passKeyMsg gives a key back to the entries table: esc and a key
// arriving together on a slow link read as alt+key.
type passKeyMsg struct{ key tea.KeyMsg }

// editedMsg tells the parent the text changed and nothing else happened:
// an outcome shown of an earlier line no longer applies.
type editedMsg struct{}

func newEntryLine(km KeyMap, th theme, check func(string) *calc.Error) entryLine {
	return entryLine{keys: km.Line, edit: km.Edit, wake: km.Table.Focus, th: th, check: check, width: 80}
}

// SetSize sets the width the line is drawn in.
func (e *entryLine) SetSize(w int) { e.width = w }

// SetFocus says whether the line has the keyboard; the line is checked
// when it has.
func (e *entryLine) SetFocus(on bool) {
	e.focused = on
	if on {
		e.validate()
	}
}

// SetContext sets what the line is typed in: the network block open ("" for
// none) and the decimal marker.
func (e *entryLine) SetContext(network string, comma bool) { e.network, e.comma = network, comma }

// Value returns the text typed.
func (e entryLine) Value() string { return e.f.String() }

// SetValue replaces the text, the cursor at its end.
func (e *entryLine) SetValue(s string) { e.f.set(s) }

// Accept keeps src in the history of lines typed and clears the line.
func (e *entryLine) Accept(src string) {
	e.history = append(e.history, src)
	e.hpos = len(e.history)
	e.f.clear()
}

// Clear empties the line.
func (e *entryLine) Clear() { e.f.clear() }

// validate checks the text when it changed since the last check.
func (e *entryLine) validate() {
	s := e.f.String()
	if s == e.checked {
		return
	}
	e.checked = s
	e.err = nil
	if strings.TrimSpace(s) != "" && e.check != nil {
		e.err = e.check(s)
	}
}

// Update handles a key while the line has the keyboard.
func (e entryLine) Update(msg tea.Msg) (entryLine, tea.Msg) {
	k, ok := msg.(tea.KeyMsg)
	if !ok {
		return e, nil
	}
	before := e.f.String()
	out := e.key(k)
	if out == nil && e.f.String() != before {
		out = editedMsg{}
	}
	e.validate()
	return e, out
}

// key acts on k and returns the message for the parent, if any.
func (e *entryLine) key(k tea.KeyMsg) tea.Msg {
	switch {
	case e.f.edit(k, e.edit):
	case key.Matches(k, e.keys.Run):
		return runMsg{src: e.f.String()}
	case key.Matches(k, e.keys.Leave):
		return closeMsg{}
	case key.Matches(k, e.keys.Prev):
		if e.hpos > 0 {
			e.hpos--
			e.f.set(e.history[e.hpos])
		}
	case key.Matches(k, e.keys.Next):
		if e.hpos < len(e.history) {
			e.hpos++
			if e.hpos == len(e.history) {
				e.f.clear()
			} else {
				e.f.set(e.history[e.hpos])
			}
		}
	case key.Matches(k, e.keys.Help):
		return helpMsg{}
	case key.Matches(k, e.keys.Quit):
		return quitMsg{}
	case k.Alt && !k.Paste:
		k.Alt = false
		return passKeyMsg{key: k}
	case k.Type == tea.KeyRunes || k.Type == tea.KeySpace:
		rs := keyRunes(k)
		if k.Paste && strings.ContainsAny(string(rs), "\n\r") {
			return pasteMsg{text: string(rs)}
		}
		if _, err := e.f.insert(rs); err != nil {
			// the refusal is the outcome of this key
			return noteMsg{text: err.Error(), err: true}
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

const linePrompt = "› "

// prompt is the prompt drawn before the text.
func (e entryLine) prompt() string {
	p := linePrompt
	if e.network != "" {
		p = e.network + " › "
	}
	return e.th.tr(p)
}

// View draws the line: with the cursor when it has the keyboard, dimmed
// with an example when it has not.
func (e entryLine) View() string {
	p := e.prompt()
	w := e.width - ansi.StringWidth(p)
	if !e.focused {
		if e.f.String() == "" {
			example := "Zc = 1/(j·ω·4.7 µF)"
			if e.comma {
				example = "Zc = 1/(j·ω·4,7 µF)"
			}
			wake := strings.ReplaceAll(e.wake.Help().Key, "/", " or ")
			hint := e.th.tr(wake + ": type a statement, such as " + example)
			if ansi.StringWidth(p+hint) > e.width {
				// a narrow screen: the example whole or not at all
				hint = e.th.tr(wake + ": type a statement")
			}
			return e.th.dim.Render(p + hint)
		}
		s, _ := e.f.render(w, func(c string) string { return c })
		return e.th.dim.Render(p + s)
	}
	s, _ := e.f.render(w, func(c string) string { return e.th.cursor.Render(c) })
	return e.th.label.Render(p) + s
}

// Caret places the live parse error under the line: the column of the
// caret (in cells, on the screen), the marks and the message.
func (e entryLine) Caret() (col int, marks, msg string, ok bool) {
	if !e.focused || e.err == nil {
		return 0, "", "", false
	}
	er := e.err
	p := e.prompt()
	start := e.f.window(e.width - ansi.StringWidth(p))
	col = ansi.StringWidth(p)
	text := e.f.text
	for i := start; i < er.Col-1 && i < len(text); i++ {
		col += cellWidth(text[i])
	}
	if er.Col-1 > len(text) {
		col++
	}
	// the marks cover the marked characters as drawn: an escape is wider
	n := 0
	for i := max(er.Col-1, 0); i < er.Col-1+max(er.Len, 1) && i < len(text); i++ {
		n += cellWidth(text[i])
	}
	n = max(1, min(n, 20))
	col = max(0, min(col, e.width-1))
	n = min(n, e.width-col)
	marks = e.th.g.caret + strings.Repeat("~", n-1)
	return col, marks, "error: " + e.th.tr(er.Msg), true
}

// sep is the separator of a function's arguments as the user types it:
// ", ", or "; " under the decimal comma.
func (e entryLine) sep() string {
	if e.comma {
		return "; "
	}
	return ", "
}

// Signature is the line shown under the entry line while the cursor is
// in a call: the function's parameters with the one being typed marked
// (by brackets, not by colour alone), and what that one takes.
func (e entryLine) Signature() string {
	if !e.focused {
		return ""
	}
	src := string(e.f.text[:e.f.pos])
	name, arg, named, ok := callAt(src, len(src), e.comma)
	if !ok {
		return ""
	}
	var fn *calc.Func
	for _, x := range sheet.Functions() {
		if x.Name == name {
			x := x
			fn = &x
			break
		}
	}
	if fn == nil {
		return ""
	}
	if len(fn.Params) == 0 {
		return e.th.tr(fn.Name + fn.ArgList())
	}
	cur := paramAt(fn, arg, named)
	line := e.paramList(fn, cur)
	if cur >= 0 {
		p := fn.Params[cur]
		what := p.Name
		if p.Kind != calc.ParamAny {
			what += ": " + p.Kind.String()
		}
		if p.Doc != "" {
			what += "; " + p.Doc
		}
		line += e.th.tr("   " + what)
	}
	return line
}

// paramAt is the parameter of fn being typed: the one named, or the one
// at position arg; −1 when there are more arguments than it takes.
func paramAt(fn *calc.Func, arg int, named string) int {
	if named != "" {
		cur := -1
		for i, p := range fn.Params {
			if p.Name == named {
				cur = i
			}
		}
		return cur
	}
	if arg >= len(fn.Params) && fn.Max >= 0 && fn.Max <= len(fn.Params) {
		return -1 // more arguments than it takes: none is marked
	}
	return min(arg, len(fn.Params)-1)
}

// paramList writes fn(a, «b», [c]) with parameter cur marked.
func (e entryLine) paramList(fn *calc.Func, cur int) string {
	open, closeMark := "«", "»"
	if e.th.ascii {
		open, closeMark = "<", ">"
	}
	parts := make([]string, len(fn.Params))
	for i, p := range fn.Params {
		s := p.Name
		if p.Optional {
			s = "[" + s + "]"
		}
		if i == cur {
			s = e.th.key.Render(e.th.tr(open + s + closeMark))
		} else {
			s = e.th.tr(s)
		}
		parts[i] = s
	}
	// the separator the user types: ';' under the decimal comma
	line := e.th.tr(fn.Name+"(") + strings.Join(parts, e.th.tr(e.sep()))
	if fn.Max < 0 || fn.Max > len(fn.Params) {
		line += e.th.tr(e.sep() + "...")
	}
	return line + e.th.tr(")")
}
