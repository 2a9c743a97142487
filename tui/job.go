package tui

import (
	"context"
	"errors"
	"fmt"
	"slices"
	"sync/atomic"
	"time"

	"argand/calc"
	"argand/reduce/sheet"

	"github.com/charmbracelet/bubbles/key"
	"github.com/charmbracelet/bubbles/spinner"
	tea "github.com/charmbracelet/bubbletea"
)

// DefaultWait is how long a statement may run on the update loop before
// it is moved off it and shown with a progress line.
const DefaultWait = 100 * time.Millisecond

// job is a change running off the update loop: its statements run on a
// working copy of the worksheet in their own goroutine, and the session
// takes the copy only when they all succeed. Its view is the progress
// line: a spinner, what runs, how far it has got when that is known, and
// the key that stops it.
type job struct {
	id      int
	what    string // the statement, or what the user asked for
	cancel  context.CancelFunc
	done    <-chan jobResult
	started time.Time
	// samples done and expected, written by the goroutine running the
	// statement and read by the view
	count, total atomic.Int64
	spin         spinner.Model
	then         func() // run after the change is taken
}

// jobResult is the outcome of a job's statements on the working copy.
type jobResult struct {
	id    int
	work  *sheet.Sheet
	steps []calc.Step
	// defined are the names the statements defined, in order
	defined []string
	err     error
}

// jobDoneMsg tells the app a job has finished.
type jobDoneMsg jobResult

// runStatements runs statements on sh as one change under a job: the
// first error stops them. It returns their steps and the names they
// defined, each once, in the order of their last definition.
func runStatements(j sheet.Job, sh *sheet.Sheet, stmts []string) ([]calc.Step, []string, error) {
	var steps []calc.Step
	var defined []string
	for _, st := range stmts {
		s, names, err := sh.ExecJob(j, st)
		if err != nil {
			return nil, nil, err
		}
		steps = append(steps, s...)
		for _, n := range names {
			defined = append(slices.DeleteFunc(defined, func(x string) bool { return x == n }), n)
		}
	}
	return steps, defined, nil
}

// startJob runs statements as one change. They run on a working copy in a
// goroutine; when they finish within the wait (opt.Wait, DefaultWait when
// zero) the change is taken at once and start reports whether it
// succeeded, then running then on success. Otherwise the job goes on off
// the update loop with a progress line, start reports false, and then
// runs when the job succeeds.
func (m *Model) startJob(what string, then func(), stmts ...string) bool {
	if m.s.readOnly {
		m.note(true, errText(m.s.errReadOnly()))
		return false
	}
	if m.job != nil {
		m.note(true, "a statement is still running: "+firstKey(m.keys.Stop)+" stops it")
		return false
	}
	m.jobs++
	ctx, cancel := context.WithCancel(context.Background())
	j := &job{id: m.jobs, what: what, cancel: cancel, started: time.Now(), then: then,
		spin: spinner.New(spinner.WithSpinner(spinner.Line))}
	if r := m.opt.Renderer; r != nil {
		j.spin.Style = j.spin.Style.Renderer(r)
	}
	if j.what == "" && len(stmts) > 0 {
		j.what = stmts[0]
	}
	done := make(chan jobResult, 1)
	j.done = done
	work := m.s.sh.Clone()
	sj := sheet.Job{Ctx: ctx, Copy: true, Progress: func(n, total int) {
		j.count.Store(int64(n))
		j.total.Store(int64(total))
	}}
	go func() {
		steps, defined, err := runStatements(sj, work, stmts)
		done <- jobResult{id: j.id, work: work, steps: steps, defined: defined, err: err}
	}()
	wait := m.opt.Wait
	if wait <= 0 {
		wait = DefaultWait
	}
	timer := time.NewTimer(wait)
	defer timer.Stop()
	select {
	case r := <-done:
		cancel()
		return m.finishJob(what, then, r)
	case <-timer.C:
	}
	m.job = j
	m.pending = append(m.pending, j.spin.Tick, j.wait)
	return false
}

// wait is the command that waits for the job's goroutine.
func (j *job) wait() tea.Msg { return jobDoneMsg(<-j.done) }

// finishJob takes the outcome of a job's statements: on success the
// working copy becomes the session (the sheet before it goes to the undo
// history) and then runs; on failure the session is as it was.
func (m *Model) finishJob(what string, then func(), r jobResult) bool {
	if r.err != nil {
		var ro *readOnlyError
		switch {
		case errors.As(r.err, &ro), what == "":
			m.note(true, errText(r.err))
		default:
			m.note(true, what+": "+errText(r.err))
		}
		return false
	}
	m.s.commit(r.work)
	m.applied(what, r.steps, r.defined)
	if then != nil {
		then()
	}
	return true
}

// jobDone takes the message of a finished job that ran off the loop.
func (m *Model) jobDone(msg jobDoneMsg) {
	j := m.job
	if j == nil || j.id != msg.id {
		return // a stopped job: its work is dropped
	}
	m.job = nil
	j.cancel()
	m.finishJob(j.what, j.then, jobResult(msg))
}

// stopJob stops the running job: the session stays exactly as it was
// before the statement, and the app takes keys again at once while the
// goroutine notices and ends.
func (m *Model) stopJob() {
	j := m.job
	if j == nil {
		return
	}
	m.job = nil
	j.cancel()
	m.note(false, fmt.Sprintf("stopped after %s, nothing changed: %s", elapsed(time.Since(j.started)), m.tr(short(j.what, 40))))
}

// maxAhead bounds the keys kept while a job runs.
const maxAhead = 256

// jobKey handles a key while a job runs: esc or ctrl+c stops it and drops
// the keys typed meanwhile; other keys wait for the job to finish, as
// they would in the terminal had it run on the update loop.
func (m *Model) jobKey(k tea.KeyMsg) tea.Cmd {
	switch {
	case key.Matches(k, m.keys.Stop):
		m.stopJob()
		m.ahead = nil
	case len(m.ahead) < maxAhead:
		m.ahead = append(m.ahead, k)
	default:
		m.note(false, "still running: "+firstKey(m.keys.Stop)+" stops it")
	}
	return nil
}

// jobSpin advances the spinner of the running job.
func (m *Model) jobSpin(msg spinner.TickMsg) tea.Cmd {
	if m.job == nil || msg.ID != m.job.spin.ID() {
		return nil
	}
	var cmd tea.Cmd
	m.job.spin, cmd = m.job.spin.Update(msg)
	return cmd
}

// jobView is the progress line of the running job.
func (m *Model) jobView() string {
	j := m.job
	n, total := j.count.Load(), j.total.Load()
	s := j.spin.View() + " running " + short(j.what, 30)
	if total > 0 {
		s += fmt.Sprintf(": %d of %d (%d %%)", n, total, min(100, 100*n/total))
	}
	s += ", " + elapsed(time.Since(j.started))
	return s
}

// elapsed writes a duration for the progress line.
func elapsed(d time.Duration) string {
	if d < 10*time.Second {
		return fmt.Sprintf("%.1f s", d.Seconds())
	}
	return fmt.Sprintf("%d s", int(d.Seconds()))
}
