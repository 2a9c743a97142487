package sheet

import (
	"bufio"
	"errors"
	"io"

	"argand/calc"
)

// Summary is the outcome of running a worksheet.
type Summary struct {
	Lines  int
	Pass   int
	Fail   int
	Err    *calc.Error // the first bad line, nil when all ran
	ErrSrc string      // that line's text, for the caret
	// Interrupted is the line the job's context stopped, 0 when none
	// was; the lines before it have run.
	Interrupted int
}

// ReadLine reads one line of at most calc.MaxLine bytes. A longer line is
// read to its end and discarded, and reported by its length, so no line is
// ever cut short silently (as a fixed-buffer line scanner would).
func ReadLine(r *bufio.Reader) (line string, n int, err error) {
	var buf []byte
	for {
		chunk, isPrefix, e := r.ReadLine()
		if e != nil {
			if len(buf) > 0 || n > 0 {
				break
			}
			return "", 0, e
		}
		n += len(chunk)
		if len(buf) <= calc.MaxLine {
			buf = append(buf, chunk...)
		}
		if !isPrefix {
			break
		}
	}
	if n > calc.MaxLine {
		return "", n, nil
	}
	return string(buf), n, nil
}

// Run executes a worksheet from r line by line, calling emit with the steps
// of each line as it completes, and stops at the first bad line, whose
// error is in the summary. Steps of the lines before it have been emitted.
func (s *Sheet) Run(r io.Reader, emit func([]calc.Step)) (Summary, error) {
	return s.RunJob(Job{}, r, emit)
}

// RunJob is Run under a job: when the job's context ends, the line being
// run (or the next one) stops and the summary names it in Interrupted.
func (s *Sheet) RunJob(job Job, r io.Reader, emit func([]calc.Step)) (Summary, error) {
	br := bufio.NewReaderSize(r, 64*1024)
	done := func() bool { return job.Ctx != nil && job.Ctx.Err() != nil }
	var sum Summary
	// an error can name an earlier line (the element a network diagnostic
	// is about), so keep the text of each line for the caret
	first := s.line + 1
	var lines []string
	for {
		line, n, err := ReadLine(br)
		if done() {
			sum.Interrupted = s.line + 1
			break
		}
		if errors.Is(err, io.EOF) {
			break
		}
		if err != nil {
			return sum, err
		}
		sum.Lines++
		if n > calc.MaxLine {
			s.line++
			sum.Err = lineErr(s.line, 1, 1, "line too long: %d bytes (the limit is %d)", n, calc.MaxLine)
			break
		}
		lines = append(lines, line)
		steps, e := s.ExecJob(job, line)
		var stop *Interrupted
		if errors.As(e, &stop) {
			sum.Interrupted = stop.Line
			break
		}
		if e != nil {
			var le *calc.Error
			if !errors.As(e, &le) {
				le = lineErr(s.line, 1, 1, "%v", e)
			}
			sum.Err, sum.ErrSrc = le, line
			if k := le.Line - first; k >= 0 && k < len(lines) {
				sum.ErrSrc = lines[k]
			}
			break
		}
		if emit != nil && len(steps) > 0 {
			emit(steps)
		}
	}
	if sum.Err == nil && sum.Interrupted == 0 && s.open != nil {
		sum.Err = lineErr(s.line+1, 1, 1, "network %s is not closed: add a line with end", s.open.name)
	}
	sum.Pass, sum.Fail = s.pass, s.fail
	return sum, nil
}

// OpenNetwork returns the name of a network block still being written, or "".
func (s *Sheet) OpenNetwork() string {
	if s.open == nil {
		return ""
	}
	return s.open.name
}
