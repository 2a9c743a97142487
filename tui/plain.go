package tui

import (
	"bufio"
	"context"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strconv"
	"strings"

	"argand/calc"
	"argand/reduce/sheet"
	"argand/tui/cli"
	"argand/tui/store"
)

// plainCommands are the words of the line mode besides statements.
const plainCommands = "? or help [NAME], list, trail, undo, redo, save FILE, new session, quit"

// Plain is the line mode, for terminals that cannot address the screen
// (TERM=dumb, or --plain): a prompt, then each statement's steps or its
// error as lines. It works on the same session as the app: the same file
// and lock, restored on start (the built-in example on first start) and
// saved after every change, so that the app and the line mode take up
// each other's work. Besides statements it reads the words of
// plainCommands. It returns the exit code for the command line.
func Plain(opt Options, in io.Reader, w io.Writer) int {
	return PlainContext(context.Background(), opt, in, w)
}

// plainLine is a line read by the line mode's reader.
type plainLine struct {
	text string
	n    int
	err  error
}

// PlainContext is Plain stopped by ctx (ctrl+c): at the prompt, or while
// a statement runs, it writes "interrupted at line N" and returns
// cli.ExitInterrupted; the statement stopped is not kept.
func PlainContext(ctx context.Context, opt Options, in io.Reader, w io.Writer) int {
	m := New(opt)
	defer m.Close()
	br := bufio.NewReader(in)
	p := &cli.Printer{W: w, Err: w, O: cli.Options{ASCII: opt.ASCII}}
	// steps are wrapped between words; messages are not, so that a file
	// name in one stays whole for copying
	width := plainWidth(m.opt.Getenv)
	say := func(s string) { fmt.Fprintln(w, m.tr(s)) }
	if m.mode == modeLocked {
		if !m.plainLocked(br, say) {
			return cli.ExitOK
		}
	}
	say("argand line mode: type a statement, or " + plainCommands + ".")
	if m.msg != "" {
		if m.msgErr && !strings.HasPrefix(m.msg, "read-only:") {
			say("error: " + m.msg)
		} else {
			say(m.msg)
		}
	}
	m.plainWhere(say)
	// lines are read in their own goroutine, so that ctrl+c at the prompt
	// is seen while a read waits
	lines := make(chan plainLine)
	go func() {
		for {
			text, n, err := sheet.ReadLine(br)
			select {
			case lines <- plainLine{text, n, err}:
			case <-ctx.Done():
				return
			}
			if err != nil {
				return
			}
		}
	}()
	interrupted := func() int {
		fmt.Fprintln(w)
		return cli.Interrupted(w, m.s.sh.Line()+1)
	}
	for {
		prompt := "> "
		if n := m.s.sh.OpenNetwork(); n != "" {
			prompt = n + "> "
		}
		fmt.Fprint(w, m.tr(prompt))
		var got plainLine
		select {
		case got = <-lines:
		case <-ctx.Done():
			return interrupted()
		}
		line, n, err := got.text, got.n, got.err
		if err != nil {
			fmt.Fprintln(w)
			return cli.ExitOK
		}
		if n > calc.MaxLine {
			say(fmt.Sprintf("error: line too long: %d bytes (the limit is %d)", n, calc.MaxLine))
			continue
		}
		cmd := strings.TrimSpace(line)
		word, arg, _ := strings.Cut(cmd, " ")
		switch word {
		case "":
			continue
		case "quit", "exit":
			return cli.ExitOK
		case "help", "?":
			if name := strings.TrimSpace(arg); name != "" {
				t, ok := cli.Topic(name)
				if !ok {
					say(fmt.Sprintf("no help on %q: try a function name (help functions lists them) or a statement word", calc.Printable(name)))
					continue
				}
				fmt.Fprint(w, m.tr(t))
				continue
			}
			cli.Help(nil, w, w, p.O)
			say("line mode: " + plainCommands + "; the session is saved after every change.")
			continue
		case "new":
			if strings.TrimSpace(arg) != "session" {
				break
			}
			say(m.blankStart())
			m.plainSaveErr(say)
			continue
		case "list":
			m.plainList(say)
			continue
		case "trail":
			fmt.Fprint(w, wrapText(m.trailText(), width))
			continue
		case "undo", "redo":
			if arg != "" {
				break
			}
			switch {
			case m.s.readOnly:
				say(m.s.errReadOnly().Error())
			case word == "undo" && m.s.doUndo():
				say(fmt.Sprintf("undone (%d more to undo; redo brings it back)", len(m.s.undo)))
			case word == "redo" && m.s.doRedo():
				say("redone")
			default:
				say("nothing to " + word)
			}
			m.plainSaveErr(say)
			continue
		case "save":
			name := strings.TrimSpace(arg)
			if name == "" {
				say("save needs a file name: save FILE")
				continue
			}
			if err := store.Save(name, []byte(m.worksheetText())); err != nil {
				say("error: could not write " + name + ": " + err.Error())
				continue
			}
			abs, _ := filepath.Abs(name)
			say("saved " + abs + " (argand run " + name + " replays it)")
			continue
		}
		steps, err := m.apply(sheet.Job{Ctx: ctx}, "", line)
		if err != nil {
			var e *calc.Error
			var ro *readOnlyError
			var stop *sheet.Interrupted
			switch {
			case errors.As(err, &stop):
				fmt.Fprintln(w) // after the ^C the terminal echoed
				return cli.Interrupted(w, stop.Line)
			case errors.As(err, &ro):
				say(ro.Error())
			case errors.As(err, &e):
				p.Error(e, line, "")
			default:
				say("error: " + err.Error())
			}
			continue
		}
		f := m.format()
		for i := range steps {
			fmt.Fprint(w, wrapText(steps[i].Text(f, m.s.v.PolarFirst), width))
		}
		m.plainSaveErr(say)
	}
}

// plainLocked asks what to do with a session held by another argand. It
// reports false when the user chose to quit.
func (m *Model) plainLocked(br *bufio.Reader, say func(string)) bool {
	title, why := m.lockedText()
	say("argand: " + title)
	for _, l := range why {
		say(l)
	}
	say("session file: " + m.lockPath)
	say("How do you want to go on?")
	for _, b := range m.keys.Lock.FullHelp()[0] {
		say("  " + pad(b.Help().Key, 3) + b.Help().Desc)
	}
	for {
		say("r, s or q?")
		line, _, err := sheet.ReadLine(br)
		if err != nil {
			return false
		}
		switch strings.TrimSpace(line) {
		case "r":
			m.chooseLocked(true)
			return true
		case "s":
			m.chooseLocked(false)
			return true
		case "q", "quit", "exit":
			return false
		}
	}
}

// plainWhere says where the session is kept.
func (m *Model) plainWhere(say func(string)) {
	switch {
	case m.s.readOnly:
		say(m.s.errReadOnly().Error())
	case m.s.path == "":
		say("the session is not saved (no place to keep it); save FILE keeps a worksheet")
	default:
		say("the session is saved after every change, in " + m.s.path)
	}
}

// plainSaveErr reports a failed save of the session.
func (m *Model) plainSaveErr(say func(string)) {
	if m.s.saveErr != nil {
		say("error: the session could not be saved: " + m.s.saveErr.Error())
	}
}

// plainList prints the rows, newest first, in both forms.
func (m *Model) plainList(say func(string)) {
	rows := m.s.rows()
	if len(rows) == 0 {
		say("no entries yet")
		return
	}
	f := m.format()
	for _, n := range rows {
		q, _ := m.s.sh.Lookup(n)
		say(fmt.Sprintf("  %-10s %s", n, f.Both(q, m.s.v.PolarFirst)))
	}
}

// plainWidth is the width the line mode wraps to: COLUMNS when it is set
// to a sensible number, else 80.
func plainWidth(getenv func(string) string) int {
	if getenv == nil {
		getenv = os.Getenv
	}
	if n, err := strconv.Atoi(getenv("COLUMNS")); err == nil && n >= 20 && n <= 1000 {
		return n
	}
	return 80
}

// wrapText wraps each line of text to width between words, a continued
// line hanging under its own, so that a terminal never breaks a word or a
// value.
func wrapText(text string, width int) string {
	var b strings.Builder
	for _, l := range strings.SplitAfter(text, "\n") {
		body, nl := strings.CutSuffix(l, "\n")
		if body == "" && !nl {
			continue
		}
		b.WriteString(strings.Join(wrapLine(body, width, hangIndent(body)), "\n"))
		if nl {
			b.WriteByte('\n')
		}
	}
	return b.String()
}
