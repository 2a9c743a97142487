package sheet

import (
	"bufio"
	"errors"
	"fmt"
	"io"
	"strings"

	"argand/calc"
)

// Summary is the outcome of running a worksheet.
type Summary struct {
	Lines  int
	Pass   int
	Fail   int
	Err    *calc.Error // the first bad line, nil when all ran
	ErrSrc string      // that line's text, for the caret
	// Problems lists every bad or skipped line in order.
	Problems []Problem
	// Failed lists the lines of the checks that failed.
	Failed []int
	// Changed lists the lines whose reading changed since the language
	// version the worksheet declares (see calc.Language).
	Changed []int
	// Interrupted is the line the job's context stopped, 0 when none
	// was; the lines before it have run.
	Interrupted int
}

// Errors counts the lines that failed (not those skipped).
func (m Summary) Errors() int {
	n := 0
	for _, p := range m.Problems {
		if p.DependsOn == 0 {
			n++
		}
	}
	return n
}

// Problem is a line that failed, or one that was not run because it reads
// a name that a failed (or skipped) line would have defined.
type Problem struct {
	Err *calc.Error // where and why; for a skipped line, at its column 1
	Src string      // the line's text, for the caret
	// DependsOn is the line whose failure made this one skipped, 0 for a
	// line that failed itself; Root is the failed line at the start of
	// the chain.
	DependsOn, Root int
}

// ReadLine reads one line of at most calc.MaxLine bytes. A line ends at a
// line feed, a CR LF pair, or a lone CR (as some programs and phones still
// write). A longer line is read to its end and discarded, and reported by
// its length, so no line is ever cut short silently (as a fixed-buffer
// line scanner would).
func ReadLine(r *bufio.Reader) (line string, n int, err error) {
	var buf []byte
	got := false
	for {
		c, e := r.ReadByte()
		if e != nil {
			if got {
				break
			}
			return "", 0, e
		}
		got = true
		if c == '\n' {
			break
		}
		if c == '\r' {
			if next, e := r.Peek(1); e == nil && next[0] == '\n' {
				r.ReadByte()
			}
			break
		}
		n++
		if n <= calc.MaxLine {
			buf = append(buf, c)
		}
	}
	if n > calc.MaxLine {
		return "", n, nil
	}
	return string(buf), n, nil
}

// Run executes a worksheet from r line by line, calling emit with the steps
// of each line as it completes. A bad line does not stop it: its error is
// kept, the lines that read a name it would have defined are skipped, and
// every other line runs, so that one run reports every mistake.
func (s *Sheet) Run(r io.Reader, emit func([]calc.Step)) (Summary, error) {
	return s.RunAll(Job{}, r, emit, nil)
}

// RunJob is Run under a job: when the job's context ends, the line being
// run (or the next one) stops and the summary names it in Interrupted.
func (s *Sheet) RunJob(job Job, r io.Reader, emit func([]calc.Step)) (Summary, error) {
	return s.RunAll(job, r, emit, nil)
}

// RunAll is RunJob that also calls bad with each failed or skipped line as
// it is met, so a printer can show it in place.
func (s *Sheet) RunAll(job Job, r io.Reader, emit func([]calc.Step), bad func(Problem)) (Summary, error) {
	br := bufio.NewReaderSize(r, 64*1024)
	done := func() bool { return job.Ctx != nil && job.Ctx.Err() != nil }
	ru := s.runner(job, emit, bad)
	for {
		line, n, err := ReadLine(br)
		if done() {
			ru.sum.Interrupted = s.line + 1
			break
		}
		if errors.Is(err, io.EOF) {
			break
		}
		if err != nil {
			return ru.sum, err
		}
		if ru.sum.Lines == 0 {
			line = strings.TrimPrefix(line, "\ufeff") // a byte-order mark
		}
		if n > calc.MaxLine {
			ru.sum.Lines++
			s.line++
			ru.lines = append(ru.lines, "")
			ru.report(Problem{Err: lineErr(s.line, 1, 1, "line too long: %d bytes (the limit is %d)", n, calc.MaxLine)})
			continue
		}
		if !ru.run(line) {
			break
		}
	}
	return ru.finish(), nil
}

// Replay runs statements as the lines of a worksheet, by the rules of Run:
// every statement that can run does, and the summary lists the others.
// A session is restored this way.
func (s *Sheet) Replay(stmts []string) Summary {
	ru := s.runner(Job{}, nil, nil)
	for _, st := range stmts {
		ru.run(st)
	}
	// a block still open was being written when the session was left
	ru.endFailed = true
	return ru.finish()
}

// lost is a name that a failed or skipped line would have defined, with
// that line and the failed line at the start of the chain.
type lost struct{ line, root int }

// runner runs lines one at a time for Run and Replay.
type runner struct {
	s      *Sheet
	job    Job
	sum    Summary
	emit   func([]calc.Step)
	bad    func(Problem)
	failed map[string]lost
	// an error can name an earlier line (the element a network diagnostic
	// is about), so the text of each line is kept for the caret
	first     int
	lines     []string
	endFailed bool
}

func (s *Sheet) runner(job Job, emit func([]calc.Step), bad func(Problem)) *runner {
	return &runner{s: s, job: job, emit: emit, bad: bad, failed: map[string]lost{}, first: s.line + 1}
}

func (ru *runner) report(pr Problem) {
	if ru.sum.Err == nil && pr.DependsOn == 0 {
		ru.sum.Err, ru.sum.ErrSrc = pr.Err, pr.Src
	}
	ru.sum.Problems = append(ru.sum.Problems, pr)
	if ru.bad != nil {
		ru.bad(pr)
	}
}

// run runs one line, or skips it when it reads a name a failed line would
// have defined. It reports false when the job stopped the line.
func (ru *runner) run(line string) bool {
	s := ru.s
	ru.sum.Lines++
	ru.lines = append(ru.lines, line)
	// the names a line defines and reads matter only once a line has
	// failed: until then a line is read once, by the statement's parser
	var defines, reads []string
	named := len(ru.failed) > 0
	if named {
		defines, reads = namesOf(line)
	}
	dep := lost{}
	for _, nm := range reads {
		if i := strings.IndexByte(nm, '.'); i > 0 {
			nm = nm[:i] // T1.z reads T1
		}
		if l, ok := ru.failed[nm]; ok && (dep.line == 0 || l.line < dep.line) {
			dep = l
		}
	}
	if dep.line != 0 {
		s.line++
		msg := fmt.Sprintf("skipped: depends on line %d", dep.line)
		if dep.root != dep.line {
			msg += fmt.Sprintf(" (which depends on line %d)", dep.root)
		}
		ru.report(Problem{Err: lineErr(s.line, 1, 1, "%s", msg), Src: line, DependsOn: dep.line, Root: dep.root})
		for _, nm := range defines {
			ru.failed[nm] = lost{s.line, dep.root}
		}
		return true
	}
	fails := s.fail
	steps, _, e := s.ExecJob(ru.job, line)
	var stop *Interrupted
	if errors.As(e, &stop) {
		ru.sum.Interrupted = stop.Line
		return false
	}
	if e != nil {
		var le *calc.Error
		if !errors.As(e, &le) {
			le = lineErr(s.line, 1, 1, "%v", e)
		}
		src := line
		if k := le.Line - ru.first; k >= 0 && k < len(ru.lines) {
			src = ru.lines[k]
		}
		ru.report(Problem{Err: le, Src: src, Root: s.line})
		if s.changedLine == s.line {
			ru.sum.Changed = append(ru.sum.Changed, s.line)
		}
		f := strings.Fields(line)
		ru.endFailed = len(f) > 0 && f[0] == "end"
		if !named {
			defines, _ = namesOf(line)
		}
		for _, nm := range defines {
			ru.failed[nm] = lost{s.line, s.line}
		}
		return true
	}
	ru.endFailed = false
	for _, nm := range defines {
		delete(ru.failed, nm)
	}
	if s.fail > fails {
		ru.sum.Failed = append(ru.sum.Failed, s.line)
	}
	if s.changedLine == s.line {
		ru.sum.Changed = append(ru.sum.Changed, s.line)
	}
	if ru.emit != nil && len(steps) > 0 {
		ru.emit(steps)
	}
	if ru.job.NoTrail {
		s.steps = nil
	}
	return true
}

func (ru *runner) finish() Summary {
	s := ru.s
	// a block whose end failed has had its error; do not report it twice
	if s.open != nil && !ru.endFailed && ru.sum.Interrupted == 0 {
		ru.report(Problem{Err: lineErr(s.line+1, 1, 1, "network %s is not closed: add a line with end", s.open.name)})
	}
	ru.sum.Pass, ru.sum.Fail = s.pass, s.fail
	return ru.sum
}

// namesOf returns the names a line would define (the name before its
// first "=", or the name after "network" or "spectrum") and the names it
// reads (every other word). It looks at tokens only, so it works on a line
// that fails; the runner asks only for a line that failed or follows a
// failure.
func namesOf(line string) (defines, reads []string) {
	if i := strings.IndexByte(line, '#'); i >= 0 {
		line = line[:i]
	}
	sc := calc.NewScanner(line, 0)
	var toks []calc.Item
	for len(toks) < 10000 {
		t := sc.Scan()
		if t.Tok == calc.TokEOF {
			break
		}
		toks = append(toks, t)
	}
	eq := -1
	for i, t := range toks {
		if t.Tok == calc.TokOp && t.Text == "=" {
			eq = i
			break
		}
	}
	for i, t := range toks {
		if t.Tok != calc.TokIdent {
			continue
		}
		switch {
		case eq > 0 && i == eq-1:
			defines = append(defines, t.Text)
		case i == 1 && toks[0].Tok == calc.TokIdent && (toks[0].Text == "network" || toks[0].Text == "spectrum"):
			defines = append(defines, t.Text)
		default:
			reads = append(reads, t.Text)
		}
	}
	return defines, reads
}

// OpenNetwork returns the name of a network block still being written, or "".
func (s *Sheet) OpenNetwork() string {
	if s.open == nil {
		return ""
	}
	return s.open.name
}
