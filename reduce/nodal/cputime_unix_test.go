//go:build unix

package nodal

import "syscall"

// CPUTime returns the user and system CPU time the test process has used,
// in nanoseconds, and true. On a machine shared with other work the wall
// time of a benchmark says more about the neighbours than about the code;
// the CPU time does not.
func CPUTime() (int64, bool) {
	var ru syscall.Rusage
	if err := syscall.Getrusage(syscall.RUSAGE_SELF, &ru); err != nil {
		return 0, false
	}
	return ru.Utime.Nano() + ru.Stime.Nano(), true
}
