package tui

import (
	"fmt"
	"strings"

	"argand/calc"
	"argand/tui/cli"

	"github.com/charmbracelet/bubbles/help"
	"github.com/charmbracelet/bubbles/key"
	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/x/ansi"
)

// helpScreen is the help screen: a topic asked about with help NAME, then
// every binding of every part (listed by bubbles help from the KeyMap),
// then the safety text. It is a component: Update scrolls and returns
// closeMsg or quitMsg, View draws the screen.
type helpScreen struct {
	keys          HelpKeys
	all           KeyMap
	th            theme
	hm            help.Model
	width, height int
	top           int    // first line shown
	topic         string // the name asked about; "" for the general help
	message       string // the last message, shown first when the screen had only part of it
}

func newHelpScreen(km KeyMap, th theme, hm help.Model) helpScreen {
	return helpScreen{keys: km.Help, all: km, th: th, hm: hm, width: 80, height: 24}
}

// SetSize sets the screen's size.
func (h *helpScreen) SetSize(w, ht int) { h.width, h.height = w, ht }

// Open shows the help from its first line, on topic ("" for the general
// help), after message, the last message whole, when it is not "".
func (h *helpScreen) Open(topic, message string) { h.top, h.topic, h.message = 0, topic, message }

// page is the number of lines of help shown: all but the footer.
func (h helpScreen) page() int { return h.height - 1 }

// Update scrolls by half a screen, or closes.
func (h helpScreen) Update(msg tea.Msg) (helpScreen, tea.Msg) {
	k, ok := msg.(tea.KeyMsg)
	if !ok {
		return h, nil
	}
	step := max(1, h.height/2)
	switch {
	case key.Matches(k, h.keys.Up):
		h.top = max(0, h.top-step)
	case key.Matches(k, h.keys.Down):
		h.top = max(0, min(h.top+step, len(h.lines())-h.page()))
	case key.Matches(k, h.keys.Close):
		return h, closeMsg{}
	case key.Matches(k, h.keys.Quit):
		return h, quitMsg{}
	}
	return h, nil
}

// View draws a screenful of help and a footer saying where it is.
func (h helpScreen) View() string {
	all := h.lines()
	ht := h.page()
	top := max(0, min(h.top, len(all)-ht))
	end := min(len(all), top+ht)
	out := append([]string(nil), all[top:end]...)
	for len(out) < ht {
		out = append(out, "")
	}
	out = append(out, h.th.dim.Render(fmt.Sprintf("help %d-%d of %d lines", top+1, end, len(all))))
	return strings.Join(out, "\n")
}

// lines is the whole help: the topic, every binding of every part, then
// the safety caution.
func (h helpScreen) lines() []string {
	// tr goes on the plain text before styling: a styled line holds
	// escape sequences of its own, which tr would show as escapes
	para := func(text string, indent int) []string { return wrapLine(h.th.tr(text), h.width, indent) }
	var out []string
	if h.message != "" {
		// the screen had only part of it; text from input was made
		// printable where the message was made
		out = append(out, h.title("the last message, whole")...)
		out = append(out, para(h.message, 2)...)
		out = append(out, "")
	}
	if h.topic != "" {
		if t, ok := cli.Topic(h.topic); ok {
			out = append(out, h.title("help "+h.topic)...)
			for _, l := range strings.Split(strings.TrimRight(t, "\n"), "\n") {
				out = append(out, para(l, 4)...)
			}
			out = append(out, "")
		}
	}
	out = append(out, h.title("argand: AC phasor work, step by step")...)
	out = append(out, para("Rows are named values, newest at the top. Operations take the marked rows in the "+
		"order marked, else the two newest (older first), which the hint line names before you press the key. "+
		"Each becomes a worksheet statement. "+h.all.Table.TrailFull.Help().Key+" shows the trail in full, every step whole.", 0)...)
	out = append(out, "")
	for _, md := range allModes {
		out = append(out, h.th.heading.Render(h.th.tr("keys: "+md.String())))
		out = append(out, h.bindings(h.all.Mode(md))...)
		out = append(out, "")
	}
	// a heading too long for a narrow screen wraps, each line styled
	for _, l := range wrapLine(h.th.tr("keys: while a statement runs (after about 0.1 s it shows a progress line)"), h.width, 2) {
		out = append(out, h.th.heading.Render(l))
	}
	out = append(out, h.bindings([]key.Binding{h.all.Stop})...)
	out = append(out, "", h.th.heading.Render(h.th.tr("safety")))
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

// bindings lists bindings with their help, by bubbles help, each key and
// description made printable (and ASCII where asked) before it is styled;
// a description too long for a narrow screen continues under itself.
func (h helpScreen) bindings(bs []key.Binding) []string {
	shown := make([]key.Binding, len(bs))
	for i, b := range bs {
		shown[i] = b
		shown[i].SetHelp(h.th.tr(b.Help().Key), h.th.tr(b.Help().Desc))
	}
	hm := h.hm
	// no width: the help component would give up on a group wider than
	// the screen; the lines are wrapped below instead
	hm.Width = 0
	var out []string
	for _, l := range strings.Split(hm.FullHelpView([][]key.Binding{shown}), "\n") {
		l = strings.TrimRight(l, " ")
		c := descCol(l)
		if c == 0 || c > h.width/2 || ansi.StringWidth(l) <= h.width {
			out = append(out, wrapLine(l, h.width, min(c, 16))...)
			continue
		}
		// the description wraps in its own column, the keys beside it
		desc := strings.TrimLeft(l[strings.Index(l, "  "):], " ")
		for i, d := range wrapLine(desc, h.width-c, 0) {
			lead := l[:len(l)-len(desc)]
			if i > 0 {
				lead = strings.Repeat(" ", c)
			}
			out = append(out, lead+d)
		}
	}
	return out
}

// title is a title of the help screen with how to close and scroll it,
// on a line of its own when the two do not fit on one.
func (h helpScreen) title(title string) []string {
	title, how := h.th.tr(title), h.th.tr("("+firstKey(h.keys.Close)+" closes; ↑↓ scroll)")
	if ansi.StringWidth(title)+3+ansi.StringWidth(how) > h.width {
		return []string{h.th.label.Render(title), how}
	}
	return []string{h.th.label.Render(title) + "   " + how}
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
