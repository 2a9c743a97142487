package tui

import (
	"strings"

	"github.com/charmbracelet/bubbles/help"
	"github.com/charmbracelet/bubbles/key"
)

// mode says which part of the screen has the keyboard. Each part has its
// own KeyMap; no key means two things within one part.
type mode int

const (
	modeRows   mode = iota // the entries table
	modeLine               // the entry line
	modePrompt             // a question: a name, a role, a file
	modeNet                // a network
	modeExport             // choosing what to export
	modeHelp               // the help screen
	modeLocked             // the session is held by another argand
	modeTrail              // the whole trail at full width
)

var modeNames = [...]string{"entries", "entry line", "question", "network", "export", "help", "session in use", "trail in full"}

func (m mode) String() string { return modeNames[m] }

func kb(keys []string, k, desc string) key.Binding {
	return key.NewBinding(key.WithKeys(keys...), key.WithHelp(k, desc))
}

// firstKey is the first name of b's keys as help writes them ("tab" of
// "tab/e"), for messages and hints that name the key.
func firstKey(b key.Binding) string {
	k, _, _ := strings.Cut(b.Help().Key, "/")
	return k
}

// brief returns b with a shorter description, for the hint line: the keys
// and their spelling stay those of the binding.
func brief(b key.Binding, desc string) key.Binding {
	b.SetHelp(b.Help().Key, desc)
	return b
}

// TableKeys are the keys of the entries table.
type TableKeys struct {
	Up, Down, Top, Bottom         key.Binding
	Mark, Unmark, Focus, Recall   key.Binding
	Add, Sub, Mul, Div            key.Binding
	Recip, Conj, Neg              key.Binding
	Series, Parallel              key.Binding
	VDiv, IDiv, Thevenin          key.Binding
	DeltaY, YDelta                key.Binding
	Rename, Copy, Delete          key.Binding
	Raise, Lower                  key.Binding
	Freq, Form, Fewer, More       key.Binding
	Basis, Angles, Decimal        key.Binding
	Undo, Redo, Blank             key.Binding
	Networks, Export              key.Binding
	Clip, ClipTrail               key.Binding
	TrailBack, TrailOn, TrailLast key.Binding
	TrailFull, Help, Quit         key.Binding
	// Pane shows the next pane on a narrow screen, where one pane shows
	// at a time.
	Pane key.Binding
}

// ShortHelp implements help.KeyMap.
func (k TableKeys) ShortHelp() []key.Binding {
	return []key.Binding{brief(k.Help, "help"), brief(k.Focus, "type"), brief(k.Mark, "mark"),
		brief(k.Undo, "undo"), brief(k.Quit, "quit"), brief(k.TrailFull, "trail in full"),
		brief(k.Networks, "networks"), brief(k.Export, "export")}
}

// FullHelp implements help.KeyMap: the groups are the rows of the key
// table in the README.
func (k TableKeys) FullHelp() [][]key.Binding {
	return [][]key.Binding{
		{k.Focus, k.Recall},
		{k.Up, k.Down, k.Top, k.Bottom, k.Mark, k.Unmark},
		{k.Add, k.Sub, k.Mul, k.Div, k.Recip, k.Conj, k.Neg},
		{k.Series, k.Parallel},
		{k.VDiv, k.IDiv, k.Thevenin},
		{k.DeltaY, k.YDelta},
		{k.Networks},
		{k.Undo, k.Redo},
		{k.Freq, k.Fewer, k.More, k.Basis, k.Angles, k.Decimal, k.Form},
		{k.Blank},
		{k.Rename, k.Copy, k.Delete, k.Raise, k.Lower},
		{k.Clip, k.ClipTrail, k.Export},
		{k.TrailBack, k.TrailOn, k.TrailLast},
		{k.Pane},
		{k.TrailFull, k.Help, k.Quit},
	}
}

// operations are the keys that take the two operands shown on the hint
// line.
func (k TableKeys) operations() []key.Binding {
	return []key.Binding{k.Parallel, k.Series, k.Add, k.Sub, k.Mul, k.Div}
}

// EditKeys edit a line of text: the entry line and the answer to a
// question, bound once for both.
type EditKeys struct {
	Left, Right, Home, End, Back, Del, Kill, Clear key.Binding
}

// ShortHelp implements help.KeyMap.
func (k EditKeys) ShortHelp() []key.Binding { return nil }

// FullHelp implements help.KeyMap.
func (k EditKeys) FullHelp() [][]key.Binding {
	return [][]key.Binding{{k.Left, k.Right, k.Home, k.End, k.Back, k.Del, k.Kill, k.Clear}}
}

// LineKeys are the entry line's own keys; it edits with EditKeys.
type LineKeys struct {
	Run, Leave, Prev, Next, Help, Quit key.Binding
}

// ShortHelp implements help.KeyMap.
func (k LineKeys) ShortHelp() []key.Binding {
	return []key.Binding{brief(k.Run, "run"), brief(k.Leave, "back to rows"), brief(k.Prev, "earlier lines"), brief(k.Help, "help")}
}

// FullHelp implements help.KeyMap.
func (k LineKeys) FullHelp() [][]key.Binding {
	return [][]key.Binding{{k.Run, k.Leave, k.Prev, k.Next, k.Help, k.Quit}}
}

// AskKeys are a question's own keys; its answer edits with EditKeys.
type AskKeys struct {
	Accept, Cancel, Quit key.Binding
}

// ShortHelp implements help.KeyMap.
func (k AskKeys) ShortHelp() []key.Binding {
	return []key.Binding{brief(k.Accept, "accept"), brief(k.Cancel, "cancel")}
}

// FullHelp implements help.KeyMap.
func (k AskKeys) FullHelp() [][]key.Binding { return [][]key.Binding{{k.Accept, k.Cancel, k.Quit}} }

// NetKeys are the keys of the network view.
type NetKeys struct {
	Up, Down, StepOn, StepBack key.Binding
	TakeV, TakeI, TakeS        key.Binding
	Thevenin, Next, Clip       key.Binding
	Close, Help, Quit          key.Binding
	Pane                       key.Binding // the next pane, on a narrow screen
}

// ShortHelp implements help.KeyMap.
func (k NetKeys) ShortHelp() []key.Binding {
	return []key.Binding{brief(k.StepOn, "step"), brief(k.Down, "element"), brief(k.TakeV, "take V"),
		brief(k.TakeI, "I"), brief(k.TakeS, "S"), brief(k.Thevenin, "Thevenin"), brief(k.Close, "back"), brief(k.Help, "help")}
}

// FullHelp implements help.KeyMap.
func (k NetKeys) FullHelp() [][]key.Binding {
	return [][]key.Binding{{k.Up, k.Down, k.StepOn, k.StepBack, k.TakeV, k.TakeI, k.TakeS, k.Thevenin, k.Next, k.Clip, k.Close, k.Pane, k.Help, k.Quit}}
}

// ExportKeys choose what to export.
type ExportKeys struct {
	Markdown, Text, Sheet, HTML, CSV, Cancel key.Binding
}

// ShortHelp implements help.KeyMap.
func (k ExportKeys) ShortHelp() []key.Binding {
	return []key.Binding{brief(k.Markdown, "Markdown"), brief(k.Text, "text"), brief(k.Sheet, "worksheet"), brief(k.HTML, "record"), brief(k.CSV, "CSV"), brief(k.Cancel, "cancel")}
}

// FullHelp implements help.KeyMap.
func (k ExportKeys) FullHelp() [][]key.Binding {
	return [][]key.Binding{{k.Markdown, k.Text, k.Sheet, k.HTML, k.CSV, k.Cancel}}
}

// HelpKeys scroll and close the help screen.
type HelpKeys struct {
	Up, Down, Close, Quit key.Binding
}

// ShortHelp implements help.KeyMap.
func (k HelpKeys) ShortHelp() []key.Binding { return []key.Binding{k.Up, k.Down, k.Close} }

// FullHelp implements help.KeyMap.
func (k HelpKeys) FullHelp() [][]key.Binding { return [][]key.Binding{{k.Up, k.Down, k.Close, k.Quit}} }

// LockKeys answer the screen shown when another argand has the session.
type LockKeys struct {
	Read, Separate, Quit key.Binding
}

// ShortHelp implements help.KeyMap.
func (k LockKeys) ShortHelp() []key.Binding { return []key.Binding{k.Read, k.Separate, k.Quit} }

// FullHelp implements help.KeyMap.
func (k LockKeys) FullHelp() [][]key.Binding { return [][]key.Binding{k.ShortHelp()} }

// FullKeys move through the trail in full.
type FullKeys struct {
	Up, Down, PageUp, PageDown key.Binding
	Top, End, Close, Quit      key.Binding
}

// ShortHelp implements help.KeyMap.
func (k FullKeys) ShortHelp() []key.Binding {
	return []key.Binding{brief(k.Close, "back"), brief(k.Down, "line"), brief(k.PageDown, "page"), brief(k.Top, "first"), brief(k.End, "latest")}
}

// FullHelp implements help.KeyMap.
func (k FullKeys) FullHelp() [][]key.Binding {
	return [][]key.Binding{{k.Up, k.Down, k.PageUp, k.PageDown, k.Top, k.End, k.Close, k.Quit}}
}

// KeyMap holds every part's keys. A key is bound in the part that acts on
// it; the hint line, the help screen, the session-in-use screen and the
// README's key table are written from these bindings.
type KeyMap struct {
	Table  TableKeys
	Edit   EditKeys
	Line   LineKeys
	Ask    AskKeys
	Net    NetKeys
	Export ExportKeys
	Help   HelpKeys
	Lock   LockKeys
	Full   FullKeys
	// Stop stops a statement running off the update loop.
	Stop key.Binding
}

// paneHelp is the help of the key that cycles the panes, the same in
// the entries table and the network view.
const paneHelp = "under 60 columns: show the next pane (entries, trail, sketch, network)"

// DefaultKeyMap returns argand's key scheme: arrows, Home/End and
// PgUp/PgDn move; letters act.
func DefaultKeyMap() KeyMap {
	return KeyMap{
		Table: TableKeys{
			Up:        kb([]string{"up"}, "↑", "select the row above"),
			Down:      kb([]string{"down"}, "↓", "select the row below"),
			Top:       kb([]string{"home"}, "home", "select the newest row"),
			Bottom:    kb([]string{"end"}, "end", "select the oldest row"),
			Mark:      kb([]string{" "}, "space", "mark or unmark the row (operations take marks in order)"),
			Unmark:    kb([]string{"esc"}, "esc", "clear all marks"),
			Focus:     kb([]string{"tab", "e"}, "tab/e", "type a statement in the entry line"),
			Recall:    kb([]string{"enter"}, "enter", "recall the row's statement into the entry line"),
			Add:       kb([]string{"+"}, "+", "add: first + second"),
			Sub:       kb([]string{"-"}, "-", "subtract: first − second"),
			Mul:       kb([]string{"*"}, "*", "multiply: first · second"),
			Div:       kb([]string{"/"}, "/", "divide: first ÷ second"),
			Recip:     kb([]string{"r"}, "r", "reciprocal 1/x of the selected row (Z ↔ Y)"),
			Conj:      kb([]string{"~"}, "~", "complex conjugate of the selected row"),
			Neg:       kb([]string{"n"}, "n", "negate the selected row"),
			Series:    kb([]string{"s"}, "s", "series: impedances add"),
			Parallel:  kb([]string{"p"}, "p", "parallel: Z₁·Z₂/(Z₁+Z₂)"),
			VDiv:      kb([]string{"v"}, "v", "voltage divider (asks: source, across which, the rest)"),
			IDiv:      kb([]string{"c"}, "c", "current divider (asks: source, branch, other branches)"),
			Thevenin:  kb([]string{"t"}, "t", "Thevenin equivalent (asks: source, series, shunt)"),
			DeltaY:    kb([]string{"w"}, "w", "Δ → Y: three Δ sides to star arms"),
			YDelta:    kb([]string{"W"}, "W", "Y → Δ: three star arms to Δ sides"),
			Rename:    kb([]string{"R"}, "R", "rename the selected row"),
			Copy:      kb([]string{"C"}, "C", "copy the selected row under a new name"),
			Delete:    kb([]string{"d", "delete"}, "d/del", "delete the row (put away if others use it)"),
			Raise:     kb([]string{"shift+up", "ctrl+up"}, "shift+↑", "move the selected row up"),
			Lower:     kb([]string{"shift+down", "ctrl+down"}, "shift+↓", "move the selected row down"),
			Freq:      kb([]string{"f"}, "f", "set the working frequency"),
			Form:      kb([]string{"o"}, "o", "show polar or rectangular form first"),
			Fewer:     kb([]string{"<"}, "<", "one significant figure fewer"),
			More:      kb([]string{">"}, ">", "one significant figure more"),
			Basis:     kb([]string{"B"}, "B", "switch phasor basis RMS ↔ peak"),
			Angles:    kb([]string{"a"}, "a", "switch angles degrees ↔ radians"),
			Decimal:   kb([]string{","}, ",", "switch the decimal marker point ↔ comma (2.2 ↔ 2,2)"),
			Blank:     kb([]string{"b"}, "b", "a new, empty session (the old one kept as a file)"),
			Undo:      kb([]string{"z", "ctrl+z"}, "z", "undo the last change"),
			Redo:      kb([]string{"Z", "ctrl+y"}, "Z", "redo what was undone"),
			Networks:  kb([]string{"N"}, "N", "open the newest network: structure, reduction, branch values"),
			Export:    kb([]string{"x"}, "x", "export the trail (Markdown, text, HTML record, CSV) or save as worksheet"),
			Clip:      kb([]string{"ctrl+o"}, "ctrl+o", "send the selected value to the terminal clipboard (OSC 52)"),
			ClipTrail: kb([]string{"ctrl+t"}, "ctrl+t", "send the whole trail to the terminal clipboard (OSC 52)"),
			TrailBack: kb([]string{"pgup", "["}, "pgup/[", "scroll the trail back"),
			TrailOn:   kb([]string{"pgdown", "]"}, "pgdn/]", "scroll the trail on"),
			TrailLast: kb([]string{"L"}, "L", "trail: jump to the latest step"),
			TrailFull: kb([]string{"T"}, "T", "read the trail in full: every step whole, at full width"),
			Help:      kb([]string{"?", "f1"}, "?", "this help"),
			Quit:      kb([]string{"q", "ctrl+c"}, "q", "quit (the session is already saved)"),
			Pane:      kb([]string{"m"}, "m", paneHelp),
		},
		Edit: EditKeys{
			Left:  kb([]string{"left", "ctrl+b"}, "←", "cursor left"),
			Right: kb([]string{"right", "ctrl+f"}, "→", "cursor right"),
			Home:  kb([]string{"home", "ctrl+a"}, "home", "cursor to the start"),
			End:   kb([]string{"end", "ctrl+e"}, "end", "cursor to the end"),
			Back:  kb([]string{"backspace"}, "backspace", "delete before the cursor"),
			Del:   kb([]string{"delete", "ctrl+d"}, "del", "delete at the cursor"),
			Kill:  kb([]string{"ctrl+k"}, "ctrl+k", "delete to the end"),
			Clear: kb([]string{"ctrl+u"}, "ctrl+u", "clear the line"),
		},
		Line: LineKeys{
			Run:   kb([]string{"enter"}, "enter", "run the statement"),
			Leave: kb([]string{"esc", "tab"}, "esc/tab", "back to the entries (the text stays)"),
			Prev:  kb([]string{"up"}, "↑", "earlier statement typed"),
			Next:  kb([]string{"down"}, "↓", "later statement typed"),
			Help:  kb([]string{"f1"}, "f1", "help"),
			Quit:  kb([]string{"ctrl+c"}, "ctrl+c", "quit"),
		},
		Ask: AskKeys{
			Accept: kb([]string{"enter"}, "enter", "accept the answer (empty: the offered default)"),
			Cancel: kb([]string{"esc"}, "esc", "cancel the question"),
			Quit:   kb([]string{"ctrl+c"}, "ctrl+c", "quit"),
		},
		Net: NetKeys{
			Up:       kb([]string{"up"}, "↑", "select the element above"),
			Down:     kb([]string{"down"}, "↓", "select the element below"),
			StepOn:   kb([]string{"right", " "}, "→/space", "next reduction step"),
			StepBack: kb([]string{"left"}, "←", "previous reduction step"),
			TakeV:    kb([]string{"v"}, "v", "add the element's voltage as an entry"),
			TakeI:    kb([]string{"i"}, "i", "add the element's current as an entry"),
			TakeS:    kb([]string{"s"}, "s", "add the element's complex power as an entry"),
			Thevenin: kb([]string{"t"}, "t", "Thevenin equivalent between two nodes (asks)"),
			Next:     kb([]string{"tab"}, "tab", "next network"),
			Clip:     kb([]string{"ctrl+o"}, "ctrl+o", "send the element's values to the terminal clipboard"),
			Close:    kb([]string{"esc", "q"}, "esc/q", "back to the entries"),
			Pane:     kb([]string{"m"}, "m", paneHelp),
			Help:     kb([]string{"?", "f1"}, "?", "help"),
			Quit:     kb([]string{"ctrl+c"}, "ctrl+c", "quit"),
		},
		Export: ExportKeys{
			Markdown: kb([]string{"m"}, "m", "trail as Markdown file"),
			Text:     kb([]string{"t"}, "t", "trail as plain text file"),
			Sheet:    kb([]string{"w"}, "w", "session as a worksheet (argand run replays it)"),
			HTML:     kb([]string{"r"}, "r", "job record: one HTML file, steps, diagrams, checks and the worksheet"),
			CSV:      kb([]string{"c"}, "c", "tables and results as a CSV file, as argand run --csv writes them"),
			Cancel:   kb([]string{"esc", "q"}, "esc", "cancel"),
		},
		Help: HelpKeys{
			Up:    kb([]string{"up", "pgup"}, "↑/pgup", "scroll help up"),
			Down:  kb([]string{"down", "pgdown", " "}, "↓/pgdn", "scroll help down"),
			Close: kb([]string{"esc", "?", "q", "f1"}, "esc/?", "close help"),
			Quit:  kb([]string{"ctrl+c"}, "ctrl+c", "quit"),
		},
		Lock: LockKeys{
			Read:     kb([]string{"r"}, "r", "look at it without changing anything: nothing you do is saved"),
			Separate: kb([]string{"s"}, "s", "work in a new session of your own, kept in its own file"),
			Quit:     kb([]string{"q", "ctrl+c", "esc"}, "q", "leave argand"),
		},
		Full: FullKeys{
			Up:       kb([]string{"up"}, "↑", "scroll up a line"),
			Down:     kb([]string{"down"}, "↓", "scroll down a line"),
			PageUp:   kb([]string{"pgup", "["}, "pgup/[", "scroll up a page"),
			PageDown: kb([]string{"pgdown", "]", " "}, "pgdn/]/space", "scroll down a page"),
			Top:      kb([]string{"home"}, "home", "the first step"),
			End:      kb([]string{"end"}, "end", "the latest step"),
			Close:    kb([]string{"esc", "q", "T"}, "esc/q/T", "back to the entries"),
			Quit:     kb([]string{"ctrl+c"}, "ctrl+c", "quit"),
		},
		Stop: kb([]string{"esc", "ctrl+c"}, "esc/ctrl+c", "stop it: the session stays exactly as before the statement"),
	}
}

// For returns the keys of the part that has the keyboard in mode md. The
// entry line and a question list their editing keys after their own.
func (k KeyMap) For(md mode) help.KeyMap {
	switch md {
	case modeLine:
		return joined{k.Line, k.Edit}
	case modePrompt:
		return joined{k.Ask, k.Edit}
	case modeNet:
		return k.Net
	case modeExport:
		return k.Export
	case modeHelp:
		return k.Help
	case modeLocked:
		return k.Lock
	case modeTrail:
		return k.Full
	}
	return k.Table
}

// joined is a part's own keys followed by shared ones.
type joined [2]help.KeyMap

func (j joined) ShortHelp() []key.Binding { return append(j[0].ShortHelp(), j[1].ShortHelp()...) }

func (j joined) FullHelp() [][]key.Binding { return append(j[0].FullHelp(), j[1].FullHelp()...) }

// Mode returns every binding that acts in mode m, in the order help
// lists them.
func (k KeyMap) Mode(m mode) []key.Binding {
	var out []key.Binding
	for _, g := range k.For(m).FullHelp() {
		out = append(out, g...)
	}
	return out
}

// allModes lists every mode, for help and tests.
var allModes = []mode{modeRows, modeLine, modePrompt, modeNet, modeExport, modeTrail, modeHelp, modeLocked}
