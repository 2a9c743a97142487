package sheet

import (
	"fmt"

	"argand/reduce/sweep"
)

// Limits bound what one worksheet may hold and how much work one of its
// statements may take. The local app and the command line keep the
// defaults, which only stop a generated or hostile file; a server that
// keeps many worksheets in one process sets tighter ones, so that no one
// session can take the memory or the processor of the others.
type Limits struct {
	Names    int     // named quantities in the worksheet
	Bytes    int     // accepted statements, in bytes; 0 is no bound
	Points   int     // points of one sweep
	Elements int     // elements of one network block; 0 is no bound
	Budget   float64 // the largest budget a statement may set, seconds
	// NoFiles refuses the statements that read a file named in the
	// worksheet (readings): a server must not open its own files for
	// whoever types a path.
	NoFiles bool
	// Undo is the number of earlier states kept for undo by the app
	// holding the worksheet; 0 is no bound. Each is a whole copy of the
	// worksheet (about 200 bytes a name), so an unbounded history grows
	// as changes × names.
	Undo int
}

// DefaultLimits are the limits of a new worksheet.
func DefaultLimits() Limits {
	return Limits{Names: MaxNames, Points: sweep.MaxPoints, Budget: MaxBudget}
}

// SetLimits sets the worksheet's limits. A field at zero or below keeps
// its default, and none is raised beyond its default. The budget in force
// is lowered to the new largest budget if it is above it.
func (s *Sheet) SetLimits(l Limits) {
	d := DefaultLimits()
	if l.Names <= 0 || l.Names > d.Names {
		l.Names = d.Names
	}
	if l.Points <= 0 || l.Points > d.Points {
		l.Points = d.Points
	}
	if l.Budget <= 0 || l.Budget > d.Budget {
		l.Budget = d.Budget
	}
	l.Bytes, l.Elements, l.Undo = max(0, l.Bytes), max(0, l.Elements), max(0, l.Undo)
	s.limits = l
	s.budget = min(s.budget, l.Budget)
}

// Limits returns the worksheet's limits.
func (s *Sheet) Limits() Limits { return s.limits }

// fits reports the refusal of a statement of n bytes that would take the
// worksheet past its size, or nil.
func (s *Sheet) fits(n int) error {
	if s.limits.Bytes <= 0 {
		return nil
	}
	used := 0
	for _, st := range s.stmts {
		used += len(st)
	}
	if used+n > s.limits.Bytes {
		return fmt.Errorf("the worksheet is full: its statements hold %d bytes and the limit here is %d; export it and start a new one", used, s.limits.Bytes)
	}
	return nil
}
