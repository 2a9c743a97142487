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
	r := &lineRun{m: m, w: w, ctx: ctx, width: plainWidth(m.opt.Getenv),
		p: &cli.Printer{W: w, Err: w, O: cli.Options{ASCII: opt.ASCII}}}
	if m.mode == modeLocked && !m.plainLocked(br, r.say) {
		return cli.ExitOK
	}
	r.greet()
	lines := plainReader(ctx, br)
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
			fmt.Fprintln(w)
			return cli.Interrupted(w, m.s.sh.Line()+1)
		}
		if got.err != nil {
			fmt.Fprintln(w)
			return cli.ExitOK
		}
		if got.n > calc.MaxLine {
			r.say(fmt.Sprintf("error: line too long: %d bytes (the limit is %d)", got.n, calc.MaxLine))
			continue
		}
		if done, code := r.line(got.text); done {
			return code
		}
	}
}

// plainReader reads lines in a goroutine of their own, so that ctrl+c at
// the prompt is seen while a read waits.
func plainReader(ctx context.Context, br *bufio.Reader) <-chan plainLine {
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
	return lines
}

// lineRun is one run of the line mode: the app's controller without its
// screen, and where its output goes.
type lineRun struct {
	m     *Model
	w     io.Writer
	p     *cli.Printer
	ctx   context.Context
	width int // steps wrap between words at this width
}

// say writes a message. Messages are not wrapped, so that a file name in
// one stays whole for copying.
func (r *lineRun) say(s string) { fmt.Fprintln(r.w, r.m.tr(s)) }

// greet says what the line mode reads, the outcome of opening the
// session, and where it is kept.
func (r *lineRun) greet() {
	m := r.m
	r.say("argand line mode: type a statement, or " + plainCommands + ".")
	if m.msg != "" {
		if m.msgErr && !strings.HasPrefix(m.msg, "read-only:") {
			r.say("error: " + m.msg)
		} else {
			r.say(m.msg)
		}
	}
	m.plainWhere(r.say)
}

// line runs one line: a command of the line mode or a statement. It
// reports whether the line mode is done, with its exit code.
func (r *lineRun) line(line string) (bool, int) {
	word, arg, _ := strings.Cut(strings.TrimSpace(line), " ")
	switch word {
	case "":
		return false, 0
	case "quit", "exit":
		return true, cli.ExitOK
	case "help", "?":
		r.help(strings.TrimSpace(arg))
		return false, 0
	case "new":
		if strings.TrimSpace(arg) == "session" {
			r.say(r.m.blankStart())
			r.m.plainSaveErr(r.say)
			return false, 0
		}
	case "list":
		r.m.plainList(r.say)
		return false, 0
	case "trail":
		fmt.Fprint(r.w, wrapText(r.m.trailText(), r.width))
		return false, 0
	case "undo", "redo":
		if arg == "" {
			r.undo(word)
			return false, 0
		}
	case "save":
		r.save(strings.TrimSpace(arg))
		return false, 0
	}
	return r.statement(line)
}

// help writes help on a name (a function or a statement word), or the
// whole help when there is none.
func (r *lineRun) help(name string) {
	if name == "" {
		cli.Help(nil, r.w, r.w, r.p.O)
		r.say("line mode: " + plainCommands + "; the session is saved after every change.")
		return
	}
	t, ok := cli.Topic(name)
	if !ok {
		r.say(fmt.Sprintf("no help on %q: try a function name (help functions lists them) or a statement word", calc.Printable(name)))
		return
	}
	fmt.Fprint(r.w, r.m.tr(t))
}

// undo undoes or redoes the last change.
func (r *lineRun) undo(word string) {
	m := r.m
	switch {
	case m.s.readOnly:
		r.say(m.s.errReadOnly().Error())
	case word == "undo" && m.s.doUndo():
		r.say(fmt.Sprintf("undone (%d more to undo; redo brings it back)", len(m.s.undo)))
	case word == "redo" && m.s.doRedo():
		r.say("redone")
	default:
		r.say("nothing to " + word)
	}
	m.plainSaveErr(r.say)
}

// save writes the session as a worksheet.
func (r *lineRun) save(name string) {
	if name == "" {
		r.say("save needs a file name: save FILE")
		return
	}
	if err := store.Save(name, []byte(r.m.worksheetText())); err != nil {
		r.say("error: could not write " + name + ": " + err.Error())
		return
	}
	abs, _ := filepath.Abs(name)
	r.say("saved " + abs + " (argand run " + name + " replays it)")
}

// statement runs a statement through the controller and writes its steps
// or its error; ctrl+c while it runs ends the line mode.
func (r *lineRun) statement(line string) (bool, int) {
	m := r.m
	steps, err := m.apply(sheet.Job{Ctx: r.ctx}, "", line)
	if err != nil {
		var e *calc.Error
		var ro *readOnlyError
		var stop *sheet.Interrupted
		switch {
		case errors.As(err, &stop):
			fmt.Fprintln(r.w) // after the ^C the terminal echoed
			return true, cli.Interrupted(r.w, stop.Line)
		case errors.As(err, &ro):
			r.say(ro.Error())
		case errors.As(err, &e):
			r.p.Error(e, line, "")
		default:
			r.say("error: " + err.Error())
		}
		return false, 0
	}
	f := m.format()
	for i := range steps {
		fmt.Fprint(r.w, wrapText(steps[i].Text(f, m.s.v.PolarFirst), r.width))
	}
	m.plainSaveErr(r.say)
	return false, 0
}

// plainLocked asks what to do with a session held by another argand. It
// reports false when the user chose to quit.
func (m *Model) plainLocked(br *bufio.Reader, say func(string)) bool {
	title, why := lockedText(m.lockPID, m.lockErr)
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
