// Package cli prints worksheet work for the command line: the steps of
// argand eval and argand run as text or as JSON lines, errors with a caret
// under their place, and the summary of the checks. It holds the exit-code
// contract of shared DESIGN.md.
package cli

import (
	"bufio"
	"context"
	"errors"
	"fmt"
	"io"
	"strings"

	"argand/calc"
	"argand/reduce/sheet"
)

// Exit codes (shared DESIGN.md).
const (
	ExitOK          = 0
	ExitCheckFail   = 1
	ExitBadInput    = 2
	ExitInterrupted = 130 // ctrl+c: 128 + SIGINT, as shells report it
)

// Interrupted writes the notice of a run stopped by ctrl+c.
func Interrupted(ew io.Writer, line int) int {
	fmt.Fprintf(ew, "interrupted at line %d\n", line)
	return ExitInterrupted
}

// Options are the output settings from the command line.
type Options struct {
	JSON       bool
	Digits     int // 0 keeps the worksheet's own setting
	ASCII      bool
	PolarFirst bool
	// Comma starts the worksheet under the decimal comma (--decimal-comma);
	// a worksheet's own decimal statement still rules from its line on.
	Comma bool
	// CSV writes the steps as CSV tables (--csv, see csvOut); the checks'
	// summary and errors go to the error stream as text.
	CSV bool
	// Dir is the directory a worksheet's readings and spectrum files are read relative
	// to: the worksheet file's own; "" is the working directory.
	Dir string
}

// Printer writes steps and errors in one of the two output forms.
type Printer struct {
	W   io.Writer // steps and, in JSON mode, errors
	Err io.Writer // errors in text and CSV mode
	O   Options
	csv *csvOut
}

func (p *Printer) format(s *sheet.Sheet) calc.Format {
	f := s.Context().Format
	f.ASCII = p.O.ASCII
	return f
}

// Steps writes steps.
func (p *Printer) Steps(s *sheet.Sheet, steps []calc.Step) {
	if p.O.CSV {
		if p.csv == nil {
			p.csv = newCSV(p.W)
		}
		p.csv.Steps(steps)
		return
	}
	f := p.format(s)
	for i := range steps {
		if p.O.JSON {
			fmt.Fprintln(p.W, steps[i].JSON())
			continue
		}
		fmt.Fprint(p.W, steps[i].Text(f, p.O.PolarFirst))
	}
}

// Error writes a located error: in JSON mode one object, in text mode the
// message, the line and a caret under the place.
func (p *Printer) Error(e *calc.Error, src, file string) {
	if p.O.JSON {
		fmt.Fprintln(p.W, calc.ErrorJSON(e.Msg, e.Line, e.Col))
		return
	}
	where := fmt.Sprintf("line %d, col %d", e.Line, e.Col)
	if file != "" {
		where = fmt.Sprintf("%s:%d:%d", calc.Printable(file), e.Line, e.Col)
	}
	msg := calc.Printable(e.Msg)
	if p.O.ASCII {
		msg = calc.ASCIIText(msg)
	}
	fmt.Fprintf(p.Err, "error: %s: %s\n", where, msg)
	if src != "" {
		c := calc.Caret(src, e)
		if p.O.ASCII {
			c = calc.ASCIIOnly(c)
		}
		for _, l := range strings.Split(c, "\n") {
			fmt.Fprintln(p.Err, "  "+l)
		}
	}
}

// Summary writes the checks' outcome.
func (p *Printer) Summary(pass, fail int) {
	if pass+fail == 0 {
		return
	}
	if p.O.CSV {
		// standard output holds only the tables
		fmt.Fprintf(p.Err, "checks: %d passed, %d failed\n", pass, fail)
		return
	}
	if p.O.JSON {
		fmt.Fprintf(p.W, "{\"kind\":\"summary\",\"checks_passed\":%d,\"checks_failed\":%d}\n", pass, fail)
		return
	}
	fmt.Fprintf(p.W, "checks: %d passed, %d failed\n", pass, fail)
}

// NewSheet returns a worksheet with the digits option applied.
func NewSheet(o Options) (*sheet.Sheet, error) {
	s := sheet.New()
	if o.Digits < 0 || o.Digits > calc.MaxDigits {
		return nil, fmt.Errorf("--digits takes a whole number from 1 to %d", calc.MaxDigits)
	}
	if o.Digits != 0 {
		s.Context().Format.Digits = o.Digits
	}
	// text the worksheet draws itself (a sweep's plot) is drawn in ASCII
	// from the start, not transliterated afterwards out of alignment
	s.Context().Format.ASCII = o.ASCII
	s.SetDecimalComma(o.Comma)
	s.SetDir(o.Dir)
	return s, nil
}

// Eval runs each argument as one statement (usually an expression) and
// prints its steps; it stops at the first bad one.
func Eval(args []string, w, ew io.Writer, o Options) int {
	return EvalContext(context.Background(), args, w, ew, o)
}

// EvalContext is Eval stopped by ctx (ctrl+c): a statement running when
// ctx ends stops, and the exit code is ExitInterrupted.
func EvalContext(ctx context.Context, args []string, w, ew io.Writer, o Options) int {
	p := &Printer{W: w, Err: ew, O: o}
	s, err := NewSheet(o)
	if err != nil {
		fmt.Fprintln(ew, "error:", err)
		return ExitBadInput
	}
	for i, a := range args {
		if strings.TrimSpace(a) == "" {
			// a blank argument is a slip (an unset shell variable, say)
			p.Error(&calc.Error{Line: i + 1, Col: 1, Len: 1, Msg: "empty input: nothing to evaluate"}, a, "argument")
			return ExitBadInput
		}
		s.SetLine(i)
		steps, _, err := s.ExecJob(sheet.Job{Ctx: ctx}, a)
		var stop *sheet.Interrupted
		if errors.As(err, &stop) {
			return Interrupted(ew, i+1)
		}
		if err != nil {
			e, ok := err.(*calc.Error)
			if !ok {
				e = &calc.Error{Line: i + 1, Col: 1, Len: 1, Msg: err.Error()}
			}
			e.Line = i + 1
			p.Error(e, a, "argument")
			return ExitBadInput
		}
		p.Steps(s, steps)
	}
	pass, fail := s.Checks()
	p.Summary(pass, fail)
	if fail > 0 {
		return ExitCheckFail
	}
	return ExitOK
}

// Run runs a worksheet, printing each line's steps as it completes and
// each bad or skipped line in its place, then a summary: errors, skipped
// lines and failed checks with their line numbers. The exit code is 2 if
// any line failed, else 1 if a check failed.
func Run(r io.Reader, file string, w, ew io.Writer, o Options) int {
	return RunContext(context.Background(), r, file, w, ew, o)
}

// RunContext is Run stopped by ctx (ctrl+c): the line running when ctx
// ends stops, "interrupted at line N" goes to ew and the exit code is
// ExitInterrupted. The steps of each line are written as it finishes.
func RunContext(ctx context.Context, r io.Reader, file string, w, ew io.Writer, o Options) int {
	p := &Printer{W: w, Err: ew, O: o}
	s, err := NewSheet(o)
	if err != nil {
		fmt.Fprintln(ew, "error:", err)
		return ExitBadInput
	}
	bw := bufio.NewWriter(w)
	p.W = bw
	defer bw.Flush()
	sum, err := s.RunAll(sheet.Job{Ctx: ctx, NoTrail: true}, stoppable(ctx, r), func(steps []calc.Step) {
		p.Steps(s, steps)
		bw.Flush()
	}, func(pr sheet.Problem) {
		bw.Flush() // the error in its place among the steps
		p.Problem(pr, file)
	})
	if sum.Interrupted > 0 {
		bw.Flush()
		return Interrupted(ew, sum.Interrupted)
	}
	if err != nil {
		bw.Flush()
		fmt.Fprintf(ew, "error: %s: %s\n", calc.Printable(file), calc.Printable(err.Error()))
		return ExitBadInput
	}
	p.RunSummary(sum)
	switch {
	case sum.Errors() > 0:
		return ExitBadInput
	case sum.Fail > 0:
		return ExitCheckFail
	}
	return ExitOK
}

// stoppable returns a reader of r whose Read returns when ctx ends, so
// that ctrl+c stops a run waiting on standard input. A read still blocked
// then is left to end with the process.
func stoppable(ctx context.Context, r io.Reader) io.Reader {
	if ctx.Done() == nil {
		return r
	}
	return &ctxReader{ctx: ctx, r: r}
}

type ctxReader struct {
	ctx context.Context
	r   io.Reader
}

type readResult struct {
	n   int
	err error
}

func (c *ctxReader) Read(p []byte) (int, error) {
	if err := c.ctx.Err(); err != nil {
		return 0, err
	}
	buf := make([]byte, len(p))
	ch := make(chan readResult, 1)
	go func() {
		n, err := c.r.Read(buf)
		ch <- readResult{n, err}
	}()
	select {
	case res := <-ch:
		copy(p, buf[:res.n])
		return res.n, res.err
	case <-c.ctx.Done():
		return 0, c.ctx.Err()
	}
}

// Problem writes a failed line as an error, or a skipped one as a line
// that says which line it depends on.
func (p *Printer) Problem(pr sheet.Problem, file string) {
	if pr.DependsOn == 0 {
		p.Error(pr.Err, pr.Src, file)
		return
	}
	if p.O.JSON {
		fmt.Fprintf(p.W, "{\"kind\":\"skipped\",\"line\":%d,\"depends_on\":%d,\"error_line\":%d}\n", pr.Err.Line, pr.DependsOn, pr.Root)
		return
	}
	where := fmt.Sprintf("line %d", pr.Err.Line)
	if file != "" {
		where = fmt.Sprintf("%s:%d", calc.Printable(file), pr.Err.Line)
	}
	fmt.Fprintf(p.Err, "%s: %s\n", where, calc.Printable(pr.Err.Msg))
	if pr.Src != "" {
		src := calc.Printable(pr.Src)
		if p.O.ASCII {
			src = calc.ASCIIOnly(src)
		}
		fmt.Fprintln(p.Err, "  "+src)
	}
}

// RunSummary writes the outcome of a worksheet run: the checks, and when
// anything went wrong, the lines of each error, skipped line and failed
// check, so a reader sees every mistake of the run at once.
func (p *Printer) RunSummary(sum sheet.Summary) {
	var errs, skipped []int
	for _, pr := range sum.Problems {
		if pr.DependsOn == 0 {
			errs = append(errs, pr.Err.Line)
		} else {
			skipped = append(skipped, pr.Err.Line)
		}
	}
	if len(errs)+len(skipped)+len(sum.Changed) == 0 {
		p.Summary(sum.Pass, sum.Fail)
		return
	}
	if p.O.CSV {
		q := *p
		q.W, q.O.CSV = p.Err, false
		q.RunSummary(sum)
		return
	}
	if p.O.JSON {
		fmt.Fprintf(p.W, "{\"kind\":\"summary\",\"checks_passed\":%d,\"checks_failed\":%d,\"failed_checks\":%s,\"errors\":%s,\"skipped\":%s,\"reading_changed\":%s}\n",
			sum.Pass, sum.Fail, jsonInts(sum.Failed), jsonInts(errs), jsonInts(skipped), jsonInts(sum.Changed))
		return
	}
	fmt.Fprintln(p.W, "summary:")
	if len(errs) > 0 {
		fmt.Fprintf(p.W, "  %s: %s\n", plural(len(errs), "error", "errors"), lineList(errs))
	}
	if len(skipped) > 0 {
		fmt.Fprintf(p.W, "  %s skipped (depending on a line in error): %s\n", plural(len(skipped), "line", "lines"), lineList(skipped))
	}
	if sum.Pass+sum.Fail > 0 {
		fmt.Fprintf(p.W, "  checks: %d passed, %d failed", sum.Pass, sum.Fail)
		if len(sum.Failed) > 0 {
			fmt.Fprintf(p.W, " (%s)", lineList(sum.Failed))
		}
		fmt.Fprintln(p.W)
	}
	if len(sum.Changed) > 0 {
		fmt.Fprintf(p.W, "  read differently since the worksheet's language version: %s\n", lineList(sum.Changed))
	}
}

func plural(n int, one, many string) string {
	if n == 1 {
		return "1 " + one
	}
	return fmt.Sprintf("%d %s", n, many)
}

// lineList writes line numbers as "line 3" or "lines 3, 7, 12".
func lineList(ls []int) string {
	parts := make([]string, len(ls))
	for i, l := range ls {
		parts[i] = fmt.Sprint(l)
	}
	if len(ls) == 1 {
		return "line " + parts[0]
	}
	return "lines " + strings.Join(parts, ", ")
}

func jsonInts(xs []int) string {
	parts := make([]string, len(xs))
	for i, x := range xs {
		parts[i] = fmt.Sprint(x)
	}
	return "[" + strings.Join(parts, ",") + "]"
}
