// Package tui is argand's interactive terminal app: a table of named
// phasors, one-key reductions, a step trail, a phasor sketch and an entry
// line, built on bubbletea.
//
// Every change the user makes is a statement of the worksheet language run
// through package sheet: an operation key on the rows Z1 and Z2 becomes
// "Z3 = Z1 || Z2", a new frequency "frequency 60 Hz". The session is
// therefore a worksheet, and saving it, restoring it, undoing a change and
// exporting a worksheet that argand run replays all follow from the
// accepted statements. What is not part of the worksheet (marks, the order
// of the rows, rows put away, which form is shown first) is kept beside it
// in the session file.
//
// The session (session.go, open.go) is the controller without a screen:
// it opens and locks the session, runs statements on a copy of the
// worksheet, keeps the undo history, names and orders the rows and saves;
// the app and the line mode (plain.go) both drive it. Each part of the
// screen is a small component (entryLine, questions, tableView, trailView,
// sketchPane, netView, helpScreen, lockScreen, exportMenu) with its own
// KeyMap from keys.go (a help.KeyMap, from which the hint line, the help
// screen and the session-in-use screen are written), its own Update and
// View, and the data the Model hands it; none sees the Model. The Model
// routes a key to the part that has the keyboard (mode), turns what the
// part returns into calls on the session (route.go) and lays the parts
// out. The engine reaches the app only through reduce/sheet.
package tui

import (
	"fmt"
	"io"
	"os"
	"strings"
	"time"

	"argand/calc"
	"argand/reduce/sheet"

	"github.com/charmbracelet/bubbles/key"
	"github.com/charmbracelet/bubbles/spinner"
	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/lipgloss"
)

// Options configure the app.
type Options struct {
	ASCII      bool // ASCII glyphs only (--ascii or a non-UTF-8 locale)
	Color      bool // colour allowed (false under NO_COLOR)
	PolarFirst bool // show the polar form first on a new session
	Digits     int  // significant figures for a new session; 0 keeps the worksheet's
	// Comma sets the decimal comma (--decimal-comma): at once on a new
	// session, and by the statement decimal comma on a restored one.
	Comma bool
	File  string // worksheet to open; "" restores the last session
	// New starts a blank session (--new); the last one is kept as a
	// worksheet file beside the session file.
	New bool
	Dir string // state directory; "" is store.Dir()
	// Out receives clipboard requests (OSC 52), written outside the
	// screen renderer; nil discards them.
	Out    io.Writer
	Getenv func(string) string // environment; nil is os.Getenv
	// Wait is how long a statement runs on the update loop before it
	// moves off it with a progress line; 0 is DefaultWait.
	Wait time.Duration
	// Renderer draws the styles. A server runs many apps at once, each on
	// its client's terminal, so each brings its own; nil is lipgloss's
	// default renderer, which the local app sets up in Run.
	Renderer *lipgloss.Renderer
	// Limits bound each worksheet of the session; the zero value keeps
	// the worksheet's defaults.
	Limits sheet.Limits
}

// Minimum terminal size for the full screen, every pane at once; a
// narrower one takes the narrow layout (narrow.go), and one smaller still
// a short notice.
const (
	minWidth  = 60
	minHeight = 16
)

// Model is the app's top-level bubbletea model: it composes the parts,
// routes a key to the part that has the keyboard, acts on what the part
// returns through the session, and lays the parts out.
type Model struct {
	opt    Options
	keys   KeyMap
	th     theme
	s      *session
	mode   mode
	back   mode // mode to return to from help or a question
	width  int
	height int

	line    entryLine
	table   tableView
	trail   trailView
	full    trailView // the trail in full, at the screen's width
	sketch  sketchPane
	pane    pane           // the pane a narrow screen shows
	paneTop int            // the first row a narrow screen's table shows
	ask     *questions     // the questions asked, if any
	askDone func([]string) // takes the answers
	net     *netView       // the network shown, if any
	helpScr helpScreen
	lockScr lockScreen
	export  exportMenu

	msg    string // last outcome, shown under the entry line
	msgErr bool
	// caution of the last statement's steps, shown on one line in place
	// of the outcome so that it is seen without scrolling the trail
	caution calc.Caution

	quitting bool

	job     *job         // the change running off the update loop, if any
	jobs    int          // jobs started, to tell a stopped job's late result
	pending []tea.Cmd    // commands a key's handling started (a job's wait)
	ahead   []tea.KeyMsg // keys typed while a job runs, for after it
}

// New creates the app: it takes the session lock, restores the last
// session (or opens opt.File, or the built-in example on first start). A
// session held by another argand leaves the app asking what to do.
func New(opt Options) *Model {
	if opt.Getenv == nil {
		opt.Getenv = os.Getenv
	}
	if opt.Out == nil {
		opt.Out = io.Discard
	}
	m := &Model{opt: opt, keys: DefaultKeyMap(), th: newTheme(opt), width: 80, height: 24}
	m.line = newEntryLine(m.keys, m.th, func(src string) *calc.Error { return m.s.sh.Validate(src) })
	m.table = newTableView(m.keys, m.th)
	m.trail = newTrailView(m.keys, m.th, false)
	m.full = newTrailView(m.keys, m.th, true)
	m.sketch = newSketchPane(m.keys, m.th)
	m.helpScr = newHelpScreen(m.keys, m.th, newHelp(opt.Renderer))
	m.export = newExportMenu(m.keys, m.th)
	t := m.keys.Table
	m.s = openSession(opt, ways{undo: m.undoKey(), help: t.Help.Help().Key, save: t.Export.Help().Key + " " + m.keys.Export.Sheet.Help().Key})
	m.told()
	if h := m.s.held; h != nil {
		m.mode = modeLocked
		m.lockScr = newLockScreen(m.keys, m.th, h.path, h.pid, h.err)
	}
	return m
}

// Close releases the session lock.
func (m *Model) Close() { m.s.close() }

// chooseLocked acts on the answer to a session held elsewhere.
func (m *Model) chooseLocked(readOnly bool) {
	m.mode = modeRows
	m.s.choose(readOnly)
	m.told()
}

// blankStart starts a new, empty session and says so; the undo key
// brings the old one back.
func (m *Model) blankStart() {
	if msg, ok := m.s.blankStart(); ok {
		m.note(false, msg)
	}
}

// told shows what the session said it did.
func (m *Model) told() { m.note(m.s.msgErr, m.s.msg) }

func (m *Model) note(isErr bool, s string) {
	m.msg = s
	m.msgErr = isErr
	m.caution = 0
}

// Init implements tea.Model.
func (m *Model) Init() tea.Cmd { return nil }

// Update implements tea.Model.
func (m *Model) Update(msg tea.Msg) (tea.Model, tea.Cmd) {
	switch msg := msg.(type) {
	case tea.WindowSizeMsg:
		m.width, m.height = msg.Width, msg.Height
		return m, nil
	case copiedMsg:
		if msg.err != nil {
			m.note(true, "copy failed: "+msg.err.Error())
		} else {
			// the terminal gives no answer: say what was done, not that
			// it worked
			m.note(false, "sent "+msg.what+" to the terminal clipboard (OSC 52)")
		}
		return m, nil
	case jobDoneMsg:
		m.jobDone(msg)
		cmds := []tea.Cmd{m.takePending()}
		// keys typed while it ran follow, as if it had run on the loop
		for len(m.ahead) > 0 && m.job == nil {
			k := m.ahead[0]
			m.ahead = m.ahead[1:]
			cmds = append(cmds, m.keys1(k))
		}
		return m, tea.Batch(cmds...)
	case spinner.TickMsg:
		return m, m.jobSpin(msg)
	case tea.KeyMsg:
		if m.width > 0 && m.height > 0 && m.tooSmallSize() {
			// the screen shows only the notice: a key acting on rows or
			// the entry line the user cannot see would change work unseen.
			// A size of 0 is a terminal that reports none (keys piped
			// through ssh -tt): keys act there as they always did.
			if key.Matches(msg, m.keys.Table.Quit) {
				m.quitting = true
				return m, tea.Quit
			}
			return m, nil
		}
		if m.job != nil {
			return m, m.jobKey(msg)
		}
		return m, m.keys1(msg)
	}
	return m, nil
}

// keys1 hands a key message to the part that has the keyboard. Letters
// that arrive in one read (typed fast, or sent by a script or a phone's
// keyboard) come as one message; where a letter is a command each is a
// key of its own, so they are taken one at a time until a part that
// takes text has the keyboard, which gets the rest whole.
func (m *Model) keys1(msg tea.KeyMsg) tea.Cmd {
	if msg.Type != tea.KeyRunes || msg.Paste || len(msg.Runes) < 2 {
		return tea.Batch(m.key(msg), m.takePending())
	}
	var cmds []tea.Cmd
	rs := msg.Runes
	for len(rs) > 0 && !m.quitting {
		if m.job != nil {
			cmds = append(cmds, m.jobKey(tea.KeyMsg{Type: tea.KeyRunes, Runes: rs}))
			break
		}
		if m.mode == modeLine || m.mode == modePrompt {
			// marked as a paste: together the letters may spell a key's
			// name ("end", "home") and would match its binding
			cmds = append(cmds, m.key(tea.KeyMsg{Type: tea.KeyRunes, Runes: rs, Paste: true}), m.takePending())
			break
		}
		cmds = append(cmds, m.key(tea.KeyMsg{Type: tea.KeyRunes, Runes: rs[:1]}), m.takePending())
		rs = rs[1:]
	}
	return tea.Batch(cmds...)
}

// takePending returns the commands started while handling a message.
func (m *Model) takePending() tea.Cmd {
	if len(m.pending) == 0 {
		return nil
	}
	cmds := m.pending
	m.pending = nil
	return tea.Batch(cmds...)
}

// View implements tea.Model.
func (m *Model) View() string {
	if m.quitting {
		return ""
	}
	if m.tooSmallSize() {
		return m.tooSmall()
	}
	m.sync()
	return m.finish(m.screen())
}

// screen chooses the layout for the part that has the keyboard and
// returns its lines: a part of its own on the whole screen (at any
// width, written for it), the narrow layout, the network view between
// the status and the feedback lines, or the main layout.
func (m *Model) screen() []string {
	switch m.mode {
	case modeLocked:
		return lines(m.lockScr.View())
	case modeHelp:
		return lines(m.helpScr.View())
	case modeTrail:
		return lines(m.full.View())
	}
	if m.narrow() {
		return m.narrowView()
	}
	switch m.mode {
	case modeNet:
		out := append([]string{m.statusView()}, lines(m.net.View())...)
		return append(out, m.feedbackView(), m.hintView())
	}
	return m.mainView()
}

// lines splits a part's view into its lines.
func lines(view string) []string { return strings.Split(view, "\n") }

// finish fits the lines to the screen: exactly height lines, none wider
// than the width, ASCII only when asked.
func (m *Model) finish(lines []string) string {
	if len(lines) > m.height {
		lines = lines[:m.height]
	}
	var b strings.Builder
	b.Grow(m.width * m.height)
	for i, l := range lines {
		if i > 0 {
			b.WriteByte('\n')
		}
		b.WriteString(fit(screenSafe(l), m.width))
	}
	for i := len(lines); i < m.height; i++ {
		b.WriteByte('\n')
	}
	out := b.String()
	if m.opt.ASCII {
		out = calc.ASCIIOnly(strings.ReplaceAll(out, "…", "~"))
	}
	return out
}

func (m *Model) tooSmall() string {
	lines := []string{
		"argand: terminal too small",
		fmt.Sprintf("%d×%d; needs %d×%d", m.width, m.height, narrowWidth, narrowHeight),
		fmt.Sprintf("(%d×%d: every pane at once)", minWidth, minHeight),
		"enlarge the window,",
		"or run argand --plain",
		"q quits; work is saved",
	}
	var out []string
	for i := 0; i < m.height && i < len(lines); i++ {
		out = append(out, fit(lines[i], m.width))
	}
	s := strings.Join(out, "\n")
	if m.opt.ASCII {
		s = calc.ASCIIOnly(calc.ASCIIText(s))
	}
	return s
}

// layout splits the height between the table and the lower panes.
func (m *Model) layout() (tableH, lowerH, sketchW int) {
	rest := m.height - 4 // status, entry line, feedback, hint
	tableH = max(5, rest*45/100)
	lowerH = rest - tableH
	sketchW = m.width * 42 / 100
	return
}

func (m *Model) mainView() []string {
	_, lowerH, sketchW := m.layout()
	lines := make([]string, 0, m.height)
	lines = append(lines, m.statusView())
	lines = append(lines, strings.Split(m.table.View(), "\n")...)
	trailW := m.width - sketchW - 1
	tl := strings.Split(m.trail.View(), "\n")
	sk := strings.Split(m.sketch.View(), "\n")
	sep := m.th.rule.Render(m.th.g.vbar)
	for i := 0; i < lowerH; i++ {
		a, b := "", ""
		if i < len(tl) {
			a = tl[i]
		}
		if i < len(sk) {
			b = sk[i]
		}
		lines = append(lines, pad(a, trailW)+sep+b)
	}
	lines = append(lines, m.entryView(), m.feedbackView(), m.hintView())
	return lines
}
