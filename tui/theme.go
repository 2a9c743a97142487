package tui

import (
	"errors"
	"strings"
	"unicode/utf8"

	"argand/calc"
	"argand/tui/store"

	"github.com/charmbracelet/bubbles/help"
	"github.com/charmbracelet/bubbles/key"
	"github.com/charmbracelet/lipgloss"
	"github.com/charmbracelet/x/ansi"
)

// glyphs are the characters that draw the screen's structure, in a
// UTF-8 and an ASCII set.
type glyphs struct {
	rule, vbar, sel, mark, hi, arrow, caret string
}

var (
	utf8Glyphs  = glyphs{rule: "─", vbar: "│", sel: "▸", mark: "◆", hi: "»", arrow: "→", caret: "^"}
	asciiGlyphs = glyphs{rule: "-", vbar: "|", sel: ">", mark: "*", hi: ">>", arrow: "->", caret: "^"}
)

// theme is argand's restrained look: no boxes, thin rules with a label,
// one warm accent for what needs attention. Every distinction drawn by
// style is also drawn by a character (the selection marker, mark numbers,
// "error:" before an error), so nothing depends on colour or on bold.
type theme struct {
	g       glyphs
	label   lipgloss.Style // section labels
	rule    lipgloss.Style
	sel     lipgloss.Style // selected row
	marked  lipgloss.Style
	hi      lipgloss.Style // highlighted elements of a reduction step
	err     lipgloss.Style
	dim     lipgloss.Style
	key     lipgloss.Style // key names in the hint line
	cursor  lipgloss.Style
	heading lipgloss.Style
	// ascii spells every symbol in ASCII (tr)
	ascii bool
}

func newTheme(o Options) theme {
	t := theme{g: utf8Glyphs, ascii: o.ASCII}
	if o.ASCII {
		t.g = asciiGlyphs
	}
	style := lipgloss.NewStyle
	if o.Renderer != nil {
		style = o.Renderer.NewStyle
	}
	t.label = style().Bold(true)
	t.rule = style().Faint(true)
	t.sel = style().Reverse(true)
	t.marked = style().Bold(true)
	t.hi = style().Bold(true).Underline(true)
	t.err = style().Bold(true)
	t.dim = style().Faint(true)
	t.key = style().Bold(true)
	t.cursor = style().Reverse(true)
	t.heading = style().Bold(true).Underline(true)
	if o.Color {
		// amber accent and a muted brick for errors: ANSI 256 colours that
		// read on dark and light backgrounds alike
		t.label = t.label.Foreground(lipgloss.Color("172"))
		t.marked = t.marked.Foreground(lipgloss.Color("172"))
		t.hi = t.hi.Foreground(lipgloss.Color("172"))
		t.err = t.err.Foreground(lipgloss.Color("167"))
		t.key = t.key.Foreground(lipgloss.Color("109"))
	}
	return t
}

// newHelp returns the key help drawn by r (nil: the default renderer).
// The component makes its styles on the default renderer; an app with a
// renderer of its own moves them to it, so that the colour profile and
// background are its terminal's.
func newHelp(r *lipgloss.Renderer) help.Model {
	h := help.New()
	if r == nil {
		return h
	}
	st := &h.Styles
	for _, s := range []*lipgloss.Style{&st.Ellipsis, &st.ShortKey, &st.ShortDesc, &st.ShortSeparator, &st.FullKey, &st.FullDesc, &st.FullSeparator} {
		*s = s.Renderer(r)
	}
	return h
}

// section draws a rule with a label: "── entries ───── 12 rows".
func (t theme) section(label, info string, width int) string {
	head := t.g.rule + t.g.rule + " "
	s := t.rule.Render(head) + t.label.Render(label) + " "
	used := ansi.StringWidth(head) + ansi.StringWidth(label) + 1
	infoW := ansi.StringWidth(info)
	if info != "" && used+infoW+4 <= width {
		n := width - used - infoW - 2
		return s + t.rule.Render(strings.Repeat(t.g.rule, n)) + " " + info
	}
	if width > used {
		s += t.rule.Render(strings.Repeat(t.g.rule, width-used))
	}
	return s
}

// fit cuts s (which may hold escape sequences) to width cells.
func fit(s string, width int) string {
	if ansi.StringWidth(s) <= width {
		return s
	}
	return ansi.Truncate(s, width, "…")
}

// pad cuts or pads s to exactly width cells.
func pad(s string, width int) string {
	w := ansi.StringWidth(s)
	if w > width {
		return ansi.Truncate(s, width, "…")
	}
	return s + strings.Repeat(" ", width-w)
}

// asciiApp spells the app's own symbols in ASCII; calc.ASCIIText does the
// rest. Written out rather than a strings.Replacer held in a package
// variable, so that nothing is built at start-up for commands that never
// draw the app; like a Replacer it takes, at each place, the first of the
// forms below that matches, the pairs before their single arrows.
func asciiApp(s string) string {
	var b strings.Builder
	for i := 0; i < len(s); {
		if s[i] < utf8.RuneSelf {
			b.WriteByte(s[i])
			i++
			continue
		}
		switch {
		case strings.HasPrefix(s[i:], "↑↓"):
			b.WriteString("up/down")
			i += len("↑↓")
			continue
		case strings.HasPrefix(s[i:], "→←"):
			b.WriteString("right/left")
			i += len("→←")
			continue
		}
		r, n := utf8.DecodeRuneInString(s[i:])
		switch r {
		case '›', '▸':
			b.WriteString(">")
		case '↑':
			b.WriteString("up")
		case '↓':
			b.WriteString("down")
		case '←':
			b.WriteString("<-")
		case '◆':
			b.WriteString("*")
		case '»':
			b.WriteString("]")
		case '…':
			b.WriteString("~")
		case '×':
			b.WriteString("x")
		case '├', '└':
			b.WriteString("+")
		default:
			b.WriteString(s[i : i+n])
		}
		i += n
	}
	return b.String()
}

// tr writes text for the screen: characters a terminal would act on are
// shown as their escapes (calc.Printable), and in ASCII mode every symbol
// argand uses is spelled in ASCII, before widths are measured. It takes
// plain text only: styled text holds escape sequences of its own.
func (t theme) tr(s string) string {
	s = calc.Printable(s)
	if !t.ascii {
		return s
	}
	return calc.ASCIIText(asciiApp(s))
}

// tr is the theme's tr, for the parts of the screen the Model draws.
func (m *Model) tr(s string) string { return m.th.tr(s) }

// hint writes bindings as the hint line names them: each by its first
// key (tab of tab/e) and its description, two spaces apart. tr goes on
// the plain pieces, before styling: styled text holds escape sequences of
// its own.
func (t theme) hint(bs []key.Binding) string {
	parts := make([]string, len(bs))
	for i, b := range bs {
		parts[i] = t.hintKey(b)
	}
	return strings.Join(parts, "  ")
}

// hintKey writes one binding for the hint line.
func (t theme) hintKey(b key.Binding) string {
	return t.key.Render(t.tr(firstKey(b))) + " " + t.tr(b.Help().Desc)
}

// screenSafe is the last guard before the screen: the style sequences
// (SGR, ESC [ … m) that the app's own styles write are kept, and any other
// control character, which could only have come from input that missed
// tr, is shown as its escape. Lines are kept.
func screenSafe(s string) string {
	var b strings.Builder
	clean := true
	for i := 0; i < len(s); i++ {
		c := s[i]
		if c >= 0x20 && c != 0x7f || c == '\n' {
			continue
		}
		if c == 0x1b && i+1 < len(s) && s[i+1] == '[' {
			j := i + 2
			for j < len(s) && (s[j] >= '0' && s[j] <= '9' || s[j] == ';' || s[j] == ':') {
				j++
			}
			if j < len(s) && s[j] == 'm' {
				i = j
				continue
			}
		}
		clean = false
		break
	}
	if clean && calc.Printable(s) == s {
		return s
	}
	for i := 0; i < len(s); {
		if s[i] == 0x1b && i+1 < len(s) && s[i+1] == '[' {
			j := i + 2
			for j < len(s) && (s[j] >= '0' && s[j] <= '9' || s[j] == ';' || s[j] == ':') {
				j++
			}
			if j < len(s) && s[j] == 'm' {
				b.WriteString(s[i : j+1])
				i = j + 1
				continue
			}
		}
		k := i + 1
		for k < len(s) && s[k] != 0x1b {
			k++
		}
		b.WriteString(calc.Printable(s[i:k]))
		i = k
	}
	return b.String()
}

// lockedBy reports whether err says the session is held elsewhere, and
// the holder's process ID when known.
func lockedBy(err error) (pid int, locked bool) {
	var le *store.LockedError
	if errors.As(err, &le) {
		return le.PID, true
	}
	return 0, errors.Is(err, store.ErrLocked)
}
