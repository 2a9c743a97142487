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
	s := openSession(opt, lineWays())
	defer s.close()
	br := bufio.NewReader(in)
	r := &lineRun{s: s, th: theme{ascii: opt.ASCII}, w: w, ctx: ctx, width: plainWidth(opt.Getenv),
		p: &cli.Printer{W: w, Err: w, O: cli.Options{ASCII: opt.ASCII}}}
	if s.held != nil && !r.locked(br) {
		return cli.ExitOK
	}
	r.greet()
	lines := plainReader(ctx, br)
	for {
		prompt := "> "
		if n := s.sh.OpenNetwork(); n != "" {
			prompt = n + "> "
		}
		fmt.Fprint(w, r.th.tr(prompt))
		var got plainLine
		select {
		case got = <-lines:
		case <-ctx.Done():
			fmt.Fprintln(w)
			return cli.Interrupted(w, s.sh.Line()+1)
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
	s     *session
	th    theme // tr: text made printable, and ASCII where asked
	w     io.Writer
	p     *cli.Printer
	ctx   context.Context
	width int // steps wrap between words at this width
}

// say writes a message. Messages are not wrapped, so that a file name in
// one stays whole for copying.
func (r *lineRun) say(s string) { fmt.Fprintln(r.w, r.th.tr(s)) }

// greet says what the line mode reads, the outcome of opening the
// session, and where it is kept.
func (r *lineRun) greet() {
	s := r.s
	r.say("argand line mode: type a statement, or " + plainCommands + ".")
	if s.msg != "" {
		if s.msgErr && !strings.HasPrefix(s.msg, "read-only:") {
			r.say("error: " + s.msg)
		} else {
			r.say(s.msg)
		}
	}
	r.where()
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
			msg, _ := r.s.blankStart()
			r.say(msg)
			r.saveErr()
			return false, 0
		}
	case "list":
		r.list()
		return false, 0
	case "trail":
		fmt.Fprint(r.w, wrapText(r.s.trailText(), r.width))
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
		r.say(fmt.Sprintf("no help on %s: try a function name (help functions lists them) or a statement word", calc.Quoted(name)))
		return
	}
	fmt.Fprint(r.w, r.th.tr(t))
}

// undo undoes or redoes the last change.
func (r *lineRun) undo(word string) {
	s := r.s
	switch {
	case s.readOnly:
		r.say(s.errReadOnly().Error())
	case word == "undo" && s.doUndo():
		r.say(fmt.Sprintf("undone (%d more to undo; redo brings it back)", len(s.undo)))
	case word == "redo" && s.doRedo():
		r.say("redone")
	case word == "undo":
		r.say(s.nothingToUndo())
	default:
		r.say("nothing to " + word)
	}
	r.saveErr()
}

// save writes the session as a worksheet.
func (r *lineRun) save(name string) {
	if name == "" {
		r.say("save needs a file name: save FILE")
		return
	}
	if err := store.Publish(name, []byte(r.s.worksheetText())); err != nil {
		r.say("error: could not write " + name + ": " + err.Error())
		return
	}
	abs, _ := filepath.Abs(name)
	r.say("saved " + abs + " (argand run " + name + " replays it)")
}

// statement runs a statement through the controller and writes its steps
// or its error; ctrl+c while it runs ends the line mode.
func (r *lineRun) statement(line string) (bool, int) {
	s := r.s
	steps, defined, err := s.exec(sheet.Job{Ctx: r.ctx}, line)
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
	s.bringUp(defined)
	f := s.format()
	for i := range steps {
		fmt.Fprint(r.w, wrapText(steps[i].Text(f, s.v.PolarFirst), r.width))
	}
	r.saveErr()
	return false, 0
}

// locked asks what to do with a session held by another argand. It
// reports false when the user chose to quit.
func (r *lineRun) locked(br *bufio.Reader) bool {
	h := r.s.held
	title, why := lockedText(h.pid, h.err)
	r.say("argand: " + title)
	for _, l := range why {
		r.say(l)
	}
	r.say("session file: " + h.path)
	r.say("How do you want to go on?")
	for _, b := range DefaultKeyMap().Lock.FullHelp()[0] {
		r.say("  " + pad(b.Help().Key, 3) + b.Help().Desc)
	}
	for {
		r.say("r, s or q?")
		line, _, err := sheet.ReadLine(br)
		if err != nil {
			return false
		}
		switch strings.TrimSpace(line) {
		case "r":
			r.s.choose(true)
			return true
		case "s":
			r.s.choose(false)
			return true
		case "q", "quit", "exit":
			return false
		}
	}
}

// where says where the session is kept.
func (r *lineRun) where() {
	s := r.s
	switch {
	case s.readOnly:
		r.say(s.errReadOnly().Error())
	case s.path == "":
		r.say("the session is not saved (no place to keep it); save FILE keeps a worksheet")
	default:
		r.say("the session is saved after every change, in " + s.path)
	}
}

// saveErr reports a failed save of the session.
func (r *lineRun) saveErr() {
	if r.s.saveErr != nil {
		r.say("error: the session could not be saved: " + r.s.saveErr.Error())
	}
}

// list prints the rows, newest first, in both forms.
func (r *lineRun) list() {
	s := r.s
	rows := s.rows()
	if len(rows) == 0 {
		r.say("no entries yet")
		return
	}
	f := s.format()
	for _, n := range rows {
		q, _ := s.sh.Lookup(n)
		r.say(fmt.Sprintf("  %-10s %s", n, f.Both(q, s.v.PolarFirst)))
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
