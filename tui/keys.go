package tui

import "github.com/charmbracelet/bubbles/key"

// mode says which part of the screen has the keyboard. Each mode has its
// own set of bindings; no key means two things within one mode.
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

// KeyMap holds every binding of the app with its help text. Bindings are
// grouped by the mode they act in.
type KeyMap struct {
	// entries table
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

	// entry line and questions
	Run, Leave, Left, Right, Home, End  key.Binding
	Back, Del, Kill, Clear, Prev, Next  key.Binding
	LineHelp, LineQuit, Accept, Cancel  key.Binding
	PromptLeft, PromptRight, PromptBack key.Binding
	PromptDel, PromptClear, PromptQuit  key.Binding
	PromptHome, PromptEnd               key.Binding

	// network view
	NetUp, NetDown, StepOn, StepBack key.Binding
	TakeV, TakeI, TakeS, NetThev     key.Binding
	NetNext, NetClose, NetClip       key.Binding
	NetHelp, NetQuit                 key.Binding

	// export choice
	ExMarkdown, ExText, ExSheet, ExCancel key.Binding

	// help screen
	HelpUp, HelpDown, HelpClose, HelpQuit key.Binding

	// session in use
	LockRead, LockSeparate, LockQuit key.Binding

	// the trail in full
	FullUp, FullDown, FullPageUp, FullPageDown key.Binding
	FullTop, FullEnd, FullClose, FullQuit      key.Binding

	// while a statement runs off the update loop
	Stop key.Binding
}

func kb(keys []string, k, desc string) key.Binding {
	return key.NewBinding(key.WithKeys(keys...), key.WithHelp(k, desc))
}

// DefaultKeyMap returns argand's key scheme. ASCII mode spells the
// symbols used in the help text in ASCII.
func DefaultKeyMap() KeyMap {
	return KeyMap{
		Up:        kb([]string{"up", "k"}, "↑/k", "select the row above"),
		Down:      kb([]string{"down", "j"}, "↓/j", "select the row below"),
		Top:       kb([]string{"home", "g"}, "home/g", "select the newest row"),
		Bottom:    kb([]string{"end", "G"}, "end/G", "select the oldest row"),
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
		Raise:     kb([]string{"K", "shift+up"}, "K/shift+↑", "move the selected row up"),
		Lower:     kb([]string{"J", "shift+down"}, "J/shift+↓", "move the selected row down"),
		Freq:      kb([]string{"f"}, "f", "set the working frequency"),
		Form:      kb([]string{"o"}, "o", "show polar or rectangular form first"),
		Fewer:     kb([]string{"<"}, "<", "one significant figure fewer"),
		More:      kb([]string{">"}, ">", "one significant figure more"),
		Basis:     kb([]string{"B"}, "B", "switch phasor basis RMS ↔ peak"),
		Angles:    kb([]string{"a"}, "a", "switch angles degrees ↔ radians"),
		Decimal:   kb([]string{","}, ",", "switch the decimal marker point ↔ comma (2.2 ↔ 2,2)"),
		Undo:      kb([]string{"u", "ctrl+z"}, "u", "undo the last change"),
		Redo:      kb([]string{"U", "ctrl+y"}, "U", "redo"),
		Blank:     kb([]string{"b"}, "b", "a new, empty session (the old one kept as a file)"),
		Networks:  kb([]string{"N"}, "N", "open a network: structure, reduction, branch values"),
		Export:    kb([]string{"x"}, "x", "export the trail (Markdown, text) or save as worksheet"),
		Clip:      kb([]string{"y"}, "y", "copy the selected value to the clipboard (OSC 52)"),
		ClipTrail: kb([]string{"Y"}, "Y", "copy the whole trail to the clipboard (OSC 52)"),
		TrailBack: kb([]string{"pgup", "["}, "pgup/[", "scroll the trail back"),
		TrailOn:   kb([]string{"pgdown", "]"}, "pgdn/]", "scroll the trail on"),
		TrailLast: kb([]string{"L"}, "L", "trail: jump to the latest step"),
		TrailFull: kb([]string{"T"}, "T", "read the trail in full: every step whole, at full width"),
		Help:      kb([]string{"?", "f1"}, "?", "this help"),
		Quit:      kb([]string{"q", "ctrl+c"}, "q", "quit (the session is already saved)"),

		Run:      kb([]string{"enter"}, "enter", "run the statement"),
		Leave:    kb([]string{"esc", "tab"}, "esc/tab", "back to the entries (the text stays)"),
		Left:     kb([]string{"left", "ctrl+b"}, "←", "cursor left"),
		Right:    kb([]string{"right", "ctrl+f"}, "→", "cursor right"),
		Home:     kb([]string{"home", "ctrl+a"}, "home", "cursor to the start"),
		End:      kb([]string{"end", "ctrl+e"}, "end", "cursor to the end"),
		Back:     kb([]string{"backspace"}, "backspace", "delete before the cursor"),
		Del:      kb([]string{"delete", "ctrl+d"}, "del", "delete at the cursor"),
		Kill:     kb([]string{"ctrl+k"}, "ctrl+k", "delete to the end"),
		Clear:    kb([]string{"ctrl+u"}, "ctrl+u", "clear the line"),
		Prev:     kb([]string{"up"}, "↑", "earlier statement typed"),
		Next:     kb([]string{"down"}, "↓", "later statement typed"),
		LineHelp: kb([]string{"f1"}, "f1", "help"),
		LineQuit: kb([]string{"ctrl+c"}, "ctrl+c", "quit"),

		Accept:      kb([]string{"enter"}, "enter", "accept the answer (empty: the offered default)"),
		Cancel:      kb([]string{"esc"}, "esc", "cancel the question"),
		PromptLeft:  kb([]string{"left"}, "←", "cursor left"),
		PromptRight: kb([]string{"right"}, "→", "cursor right"),
		PromptHome:  kb([]string{"home", "ctrl+a"}, "home", "cursor to the start"),
		PromptEnd:   kb([]string{"end", "ctrl+e"}, "end", "cursor to the end"),
		PromptBack:  kb([]string{"backspace"}, "backspace", "delete before the cursor"),
		PromptDel:   kb([]string{"delete"}, "del", "delete at the cursor"),
		PromptClear: kb([]string{"ctrl+u"}, "ctrl+u", "clear the answer"),
		PromptQuit:  kb([]string{"ctrl+c"}, "ctrl+c", "quit"),

		NetUp:    kb([]string{"up", "k"}, "↑/k", "select the element above"),
		NetDown:  kb([]string{"down", "j"}, "↓/j", "select the element below"),
		StepOn:   kb([]string{"right", "l", " "}, "→/l/space", "next reduction step"),
		StepBack: kb([]string{"left", "h"}, "←/h", "previous reduction step"),
		TakeV:    kb([]string{"v"}, "v", "add the element's voltage as an entry"),
		TakeI:    kb([]string{"i"}, "i", "add the element's current as an entry"),
		TakeS:    kb([]string{"s"}, "s", "add the element's complex power as an entry"),
		NetThev:  kb([]string{"t"}, "t", "Thevenin equivalent between two nodes (asks)"),
		NetNext:  kb([]string{"tab"}, "tab", "next network"),
		NetClip:  kb([]string{"y"}, "y", "copy the element's values to the clipboard"),
		NetClose: kb([]string{"esc", "q"}, "esc/q", "back to the entries"),
		NetHelp:  kb([]string{"?", "f1"}, "?", "help"),
		NetQuit:  kb([]string{"ctrl+c"}, "ctrl+c", "quit"),

		ExMarkdown: kb([]string{"m"}, "m", "trail as Markdown file"),
		ExText:     kb([]string{"t"}, "t", "trail as plain text file"),
		ExSheet:    kb([]string{"w"}, "w", "session as a worksheet (argand run replays it)"),
		ExCancel:   kb([]string{"esc", "q"}, "esc", "cancel"),

		HelpUp:    kb([]string{"up", "k", "pgup"}, "↑/k", "scroll help up"),
		HelpDown:  kb([]string{"down", "j", "pgdown", " "}, "↓/j", "scroll help down"),
		HelpClose: kb([]string{"esc", "?", "q", "f1"}, "esc/?", "close help"),
		HelpQuit:  kb([]string{"ctrl+c"}, "ctrl+c", "quit"),

		LockRead:     kb([]string{"r"}, "r", "open the session read-only"),
		LockSeparate: kb([]string{"s"}, "s", "start a separate session"),
		LockQuit:     kb([]string{"q", "ctrl+c", "esc"}, "q", "quit"),

		FullUp:       kb([]string{"up", "k"}, "↑/k", "scroll up a line"),
		FullDown:     kb([]string{"down", "j"}, "↓/j", "scroll down a line"),
		FullPageUp:   kb([]string{"pgup", "["}, "pgup/[", "scroll up a page"),
		FullPageDown: kb([]string{"pgdown", "]", " "}, "pgdn/]/space", "scroll down a page"),
		FullTop:      kb([]string{"home", "g"}, "home/g", "the first step"),
		FullEnd:      kb([]string{"end", "G"}, "end/G", "the latest step"),
		FullClose:    kb([]string{"esc", "q", "T"}, "esc/q/T", "back to the entries"),
		FullQuit:     kb([]string{"ctrl+c"}, "ctrl+c", "quit"),
		Stop:         kb([]string{"esc", "ctrl+c"}, "esc/ctrl+c", "stop it: the session stays exactly as before the statement"),
	}
}

// Mode returns the bindings that act in mode m, in the order help lists
// them.
func (k KeyMap) Mode(m mode) []key.Binding {
	switch m {
	case modeRows:
		return []key.Binding{k.Up, k.Down, k.Top, k.Bottom, k.Mark, k.Unmark, k.Focus, k.Recall,
			k.Add, k.Sub, k.Mul, k.Div, k.Recip, k.Conj, k.Neg, k.Series, k.Parallel,
			k.VDiv, k.IDiv, k.Thevenin, k.DeltaY, k.YDelta,
			k.Rename, k.Copy, k.Delete, k.Raise, k.Lower,
			k.Freq, k.Form, k.Fewer, k.More, k.Basis, k.Angles, k.Decimal, k.Undo, k.Redo, k.Blank,
			k.Networks, k.Export, k.Clip, k.ClipTrail, k.TrailBack, k.TrailOn, k.TrailLast, k.TrailFull, k.Help, k.Quit}
	case modeLine:
		return []key.Binding{k.Run, k.Leave, k.Left, k.Right, k.Home, k.End, k.Back, k.Del, k.Kill, k.Clear, k.Prev, k.Next, k.LineHelp, k.LineQuit}
	case modePrompt:
		return []key.Binding{k.Accept, k.Cancel, k.PromptLeft, k.PromptRight, k.PromptHome, k.PromptEnd, k.PromptBack, k.PromptDel, k.PromptClear, k.PromptQuit}
	case modeNet:
		return []key.Binding{k.NetUp, k.NetDown, k.StepOn, k.StepBack, k.TakeV, k.TakeI, k.TakeS, k.NetThev, k.NetNext, k.NetClip, k.NetClose, k.NetHelp, k.NetQuit}
	case modeExport:
		return []key.Binding{k.ExMarkdown, k.ExText, k.ExSheet, k.ExCancel}
	case modeHelp:
		return []key.Binding{k.HelpUp, k.HelpDown, k.HelpClose, k.HelpQuit}
	case modeLocked:
		return []key.Binding{k.LockRead, k.LockSeparate, k.LockQuit}
	case modeTrail:
		return []key.Binding{k.FullUp, k.FullDown, k.FullPageUp, k.FullPageDown, k.FullTop, k.FullEnd, k.FullClose, k.FullQuit}
	}
	return nil
}

// allModes lists every mode, for help and tests.
var allModes = []mode{modeRows, modeLine, modePrompt, modeNet, modeExport, modeTrail, modeHelp, modeLocked}
