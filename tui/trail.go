package tui

import (
	"fmt"
	"strings"

	"argand/calc"

	"github.com/charmbracelet/bubbles/key"
	tea "github.com/charmbracelet/bubbletea"
)

// trailView is the step trail, scrollable through the whole session: the
// pane beside the sketch, and the trail in full at the screen's width. It
// is a component: the parent sets the steps (SetSteps) and scrolls the
// pane with the entries table's keys (ScrollBy, Latest); the trail in
// full moves with its own keys in Update, which returns closeMsg or
// quitMsg. View draws it.
type trailView struct {
	keys          FullKeys
	th            theme
	full          bool   // the trail in full, not the pane
	fullKey       string // the key that shows the trail in full
	latestKey     string // the key that goes back to the latest step
	width, height int
	back          int // lines scrolled back from the latest

	owner any // the worksheet the steps are of: a new one redraws all
	steps []calc.Step
	f     calc.Format
	polar bool
	c     *trailCache
}

// trailCache is the trail drawn as lines, kept across draws: the trail
// only grows while the worksheet stays the same, so new steps are added.
type trailCache struct {
	key   trailKey
	lines []trailLine
}

type trailKey struct {
	owner any
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

func newTrailView(km KeyMap, th theme, full bool) trailView {
	return trailView{keys: km.Full, th: th, full: full, fullKey: km.Table.TrailFull.Help().Key,
		latestKey: km.Table.TrailLast.Help().Key, width: 80, height: 10, c: &trailCache{}}
}

// SetSize sets the trail's size, its heading (and footer) included.
func (t *trailView) SetSize(w, h int) { t.width, t.height = w, h }

// SetSteps sets the steps drawn: those of the worksheet owner, written in
// format f with the polar form first when polar is set.
func (t *trailView) SetSteps(owner any, steps []calc.Step, f calc.Format, polar bool) {
	t.owner, t.steps, t.f, t.polar = owner, steps, f, polar
}

// page is the number of trail lines shown.
func (t trailView) page() int {
	if t.full {
		return max(1, t.height-2)
	}
	return t.height - 1
}

// lines returns every step as lines at the trail's width, drawing only
// the steps not drawn before.
func (t trailView) lines() []trailLine {
	c := t.c
	k := trailKey{owner: t.owner, n: len(t.steps), f: t.f, polar: t.polar, width: t.width}
	if k == c.key {
		return c.lines
	}
	from := 0
	if c.key.owner == k.owner && c.key.f == k.f && c.key.polar == k.polar && c.key.width == k.width && c.key.n <= k.n {
		from = c.key.n
	} else {
		c.lines = c.lines[:0]
	}
	for i := from; i < len(t.steps); i++ {
		c.lines = append(c.lines, stepLines(t.th, &t.steps[i], k.f, k.polar, k.width)...)
	}
	c.key = k
	return c.lines
}

// ScrollBy scrolls the trail back by n lines (on, for n < 0).
func (t *trailView) ScrollBy(n int) { t.back = t.clamp(t.back + n) }

// Latest scrolls the trail to its latest step.
func (t *trailView) Latest() { t.back = 0 }

// clamp bounds back: the first line at the top at most.
func (t trailView) clamp(back int) int {
	n := len(t.lines())
	if t.full {
		return max(0, min(back, n-t.page()))
	}
	return max(0, min(back, n-1))
}

// Update moves through the trail in full.
func (t trailView) Update(msg tea.Msg) (trailView, tea.Msg) {
	k, ok := msg.(tea.KeyMsg)
	if !ok {
		return t, nil
	}
	page, last := t.page(), t.clamp(len(t.lines()))
	switch {
	case key.Matches(k, t.keys.Up):
		t.back++
	case key.Matches(k, t.keys.Down):
		t.back--
	case key.Matches(k, t.keys.PageUp):
		t.back += page - 1
	case key.Matches(k, t.keys.PageDown):
		t.back -= page - 1
	case key.Matches(k, t.keys.Top):
		t.back = last
	case key.Matches(k, t.keys.End):
		t.back = 0
	case key.Matches(k, t.keys.Close):
		return t, closeMsg{}
	case key.Matches(k, t.keys.Quit):
		return t, quitMsg{}
	}
	t.back = t.clamp(t.back)
	return t, nil
}

// View draws the trail: a heading, then the lines that end back lines
// before the latest; the trail in full adds a footer of its keys.
func (t trailView) View() string {
	ls := t.lines()
	back := t.clamp(t.back)
	end := len(ls) - back
	start := max(0, end-t.page())
	var out []string
	switch {
	case t.full:
		info := fmt.Sprintf("%d steps, lines %d-%d of %d", len(t.steps), start+1, end, len(ls))
		out = append(out, t.th.section("trail in full", info, t.width))
	case back > 0:
		out = append(out, t.th.section("trail", fmt.Sprintf("%d lines back (%s: latest)", back, t.latestKey), t.width))
	default:
		out = append(out, t.th.section("trail", fmt.Sprintf("%d steps, %s in full", len(t.steps), t.fullKey), t.width))
	}
	for i := start; i < end; i++ {
		s := fitWhole(ls[i].text, t.width) // a plot's line is cut between its words, not inside a number
		if ls[i].head {
			s = t.th.label.Render(s)
		}
		out = append(out, s)
	}
	if !t.full {
		if len(ls) == 0 {
			out = append(out, t.th.dim.Render("no steps yet"))
		}
		return strings.Join(out, "\n")
	}
	for len(out) < t.page()+1 {
		out = append(out, "")
	}
	return strings.Join(append(out, t.th.hintFit(t.keys.ShortHelp(), t.width)), "\n")
}

// stepLines writes one step as trail lines wrapped to width: continuation
// lines hang under their line, notes wrap word by word, and a note of
// several lines (a plot) keeps its shape.
func stepLines(th theme, st *calc.Step, f calc.Format, polar bool, width int) []trailLine {
	c := *st
	c.Notes = nil
	var out []trailLine
	wrapped := func(l string, head bool) {
		l = th.tr(l)
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
			out = append(out, trailLine{text: th.tr("      " + l), pre: true})
		}
	}
	return out
}
