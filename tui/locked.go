package tui

import (
	"fmt"
	"strings"

	"github.com/charmbracelet/bubbles/key"
	tea "github.com/charmbracelet/bubbletea"
)

// lockScreen is shown when another argand holds the session, or when it
// cannot be locked at all: what happened, why it matters, and the ways
// on, each with its key from the bindings. It is a component: Update
// returns lockChoiceMsg or quitMsg, View draws the screen.
type lockScreen struct {
	keys   LockKeys
	th     theme
	width  int
	path   string // the session file
	holder int    // the process holding it, when known
	err    error  // why the lock could not be taken, when no one holds it
}

// lockChoiceMsg is the answer: look at the session read-only, or work in
// a separate one.
type lockChoiceMsg struct{ readOnly bool }

func newLockScreen(km KeyMap, th theme, path string, holder int, err error) lockScreen {
	return lockScreen{keys: km.Lock, th: th, width: 80, path: path, holder: holder, err: err}
}

// SetSize sets the width the screen is drawn in.
func (l *lockScreen) SetSize(w int) { l.width = w }

// Update takes the answer.
func (l lockScreen) Update(msg tea.Msg) (lockScreen, tea.Msg) {
	k, ok := msg.(tea.KeyMsg)
	if !ok {
		return l, nil
	}
	switch {
	case key.Matches(k, l.keys.Read):
		return l, lockChoiceMsg{readOnly: true}
	case key.Matches(k, l.keys.Separate):
		return l, lockChoiceMsg{readOnly: false}
	case key.Matches(k, l.keys.Quit):
		return l, quitMsg{}
	}
	return l, nil
}

// View draws the screen.
func (l lockScreen) View() string {
	title, why := lockedText(l.holder, l.err)
	out := []string{l.th.section(l.th.tr(title), "", l.width), ""}
	for _, s := range why {
		out = append(out, wrapLine(l.th.tr(s), l.width, 0)...)
	}
	out = append(out, "", l.th.heading.Render(l.th.tr("How do you want to go on?")))
	for _, b := range l.keys.FullHelp()[0] {
		k := l.th.key.Render(l.th.tr(pad(b.Help().Key, 3)))
		// a narrow screen has each way on whole, wrapped beside its key
		for i, s := range wrapLine(l.th.tr(b.Help().Desc), l.width-6, 0) {
			if i == 0 {
				out = append(out, "  "+k+" "+s)
			} else {
				out = append(out, "      "+s)
			}
		}
	}
	out = append(out, "")
	for _, s := range wrapLine(l.th.tr("session file: "+l.path), l.width, 2) {
		out = append(out, l.th.dim.Render(s))
	}
	return strings.Join(out, "\n")
}

// lockedText is the question asked when the session is held by another
// argand (holder, when known) or cannot be locked at all (err): a title
// and the lines that explain it, the same in the app and in the line
// mode.
func lockedText(holder int, err error) (title string, why []string) {
	if err != nil {
		return "the session could not be locked", []string{
			"The lock that keeps two argands from saving one session failed:",
			err.Error(),
			"Without it another argand could save over this one's work.",
		}
	}
	who := "Another argand"
	if holder > 0 {
		who = fmt.Sprintf("Another argand, process %d,", holder)
	}
	return "your session is already open", []string{
		who + " is working on it, perhaps in another login or window.",
		"Only one argand saves a session at a time, so that neither loses the other's work.",
	}
}
