package sheet

import (
	"context"
	"errors"
	"fmt"
	"strings"

	"argand/calc"
)

// Job is how a statement that may run long learns that it should stop and
// reports how far it has got. The zero Job never stops and reports
// nothing.
type Job struct {
	// Ctx stops the statement when it is done; nil never stops it.
	Ctx context.Context
	// Progress, when set, is called from the goroutine running the
	// statement with the samples done and the samples expected (0 when
	// the amount is not known).
	Progress func(done, total int)
	// Copy says that the worksheet is a working copy which the caller
	// drops when the statement is interrupted: then Ctx stops every
	// factorisation, the re-solving of networks a changed value feeds
	// included, since nothing half changed is kept.
	Copy bool
	// NoTrail hands each line's steps to the run's emit and keeps none of
	// them in the worksheet's trail, nor a network's reduction for the
	// app's view: a run that prints as it goes needs none of them again,
	// and a network of 10⁵ elements has as many steps.
	NoTrail bool
}

// Interrupted is the error of a statement stopped by its Job's context.
// The worksheet is as it was before the statement.
type Interrupted struct {
	Line int
}

func (e *Interrupted) Error() string { return fmt.Sprintf("interrupted at line %d", e.Line) }

// errStop is what a working copy returns from a sample once its job is
// done; the statement turns it into an *Interrupted error.
var errStop = errors.New("stopped")

// ExecJob runs one statement as the next line, like Exec, under job: a
// sweep or a tolerance range checks job.Ctx at every sample and reports
// its progress. When the context ends the statement the error is an
// *Interrupted and the worksheet is unchanged, its line count included.
//
// The context is read between samples of the work that runs on working
// copies (sweep points, tolerance samples), and within the factorisation
// of a network's equations when the network is being defined or its
// Thevenin or Norton equivalent found, or on a working copy (job.Copy); otherwise the other work of a statement
// (re-solving the networks a changed value feeds) runs to its end, so
// that it never leaves the worksheet half changed.
func (s *Sheet) ExecJob(job Job, src string) ([]calc.Step, []string, error) {
	line := s.line
	if job.Ctx != nil && job.Ctx.Err() != nil {
		return nil, nil, &Interrupted{Line: line + 1}
	}
	s.job = &job
	defer func() { s.job = nil }()
	steps, defined, err := s.Exec(src)
	if err != nil && job.Ctx != nil && job.Ctx.Err() != nil {
		s.line = line
		return nil, nil, &Interrupted{Line: line + 1}
	}
	return steps, defined, err
}

// stopped reports errStop when the job of a working copy is done.
func (s *Sheet) stopped() error {
	if !s.quiet || s.job == nil || s.job.Ctx == nil {
		return nil
	}
	if s.job.Ctx.Err() != nil {
		return errStop
	}
	return nil
}

// jobCtx is the context of the statement's job, for work that polls it
// within one step (a network's factorisation): that of a working copy,
// which a stop discards, or of a network being defined, which a failed
// statement drops. Background when there is none, and while networks are
// re-solved on a worksheet that is not a working copy (see resolving and
// Job.Copy).
func (s *Sheet) jobCtx() context.Context {
	if s.job == nil || s.job.Ctx == nil || (s.resolving && !s.quiet && !s.job.Copy) {
		return context.Background()
	}
	return s.job.Ctx
}

// progress reports the samples done of those expected.
func (s *Sheet) progress(done, total int) {
	if s.job != nil && s.job.Progress != nil {
		s.job.Progress(done, total)
	}
}

// sampler returns a working copy of the worksheet for evaluating samples:
// it records no steps, reuses one built network per network, and stops
// when the statement's job is done.
func (s *Sheet) sampler() *Sheet {
	c := s.Clone()
	c.quiet = true
	c.dry = false
	return c
}

// needs returns the definitions and networks e reads, directly or through
// others (their names, networks as "net:NAME"): the part of the worksheet
// a sample of e must bring to the new frequency.
func (s *Sheet) needs(e calc.Expr) map[string]bool {
	need := map[string]bool{}
	var queue []string
	for k := range depsOf(e) {
		queue = append(queue, k)
	}
	for len(queue) > 0 {
		n := queue[0]
		queue = queue[1:]
		if need[n] {
			continue
		}
		if name, ok := strings.CutPrefix(n, "net:"); ok {
			nw, ok := s.nets[name]
			if !ok {
				continue
			}
			need[n] = true
			for k := range nw.deps {
				queue = append(queue, k)
			}
			continue
		}
		d, ok := s.byName[n]
		if !ok {
			continue
		}
		need[n] = true
		for k := range d.deps {
			queue = append(queue, k)
		}
		if d.owner != "" {
			if _, ok := s.nets[d.owner]; ok {
				queue = append(queue, "net:"+d.owner)
			} else {
				queue = append(queue, d.owner)
			}
		}
	}
	return need
}

// restrict keeps, in a sampler, only the definitions and networks e reads:
// each sample then re-evaluates what the value depends on and nothing of
// the rest of the worksheet, whose size would otherwise set the cost of
// every point. Lookups of the others still answer (byName is kept), but
// nothing e reads can reach them.
func (c *Sheet) restrict(e calc.Expr) {
	need := c.needs(e)
	defs := make([]*def, 0, len(need))
	for _, d := range c.defs {
		if need[d.name] {
			defs = append(defs, d)
		}
	}
	order := make([]string, 0, len(c.order))
	for _, n := range c.order {
		if need["net:"+n] {
			order = append(order, n)
		}
	}
	c.defs, c.order = defs, order
}
