//go:build !unix

package nodal

// CPUTime is not measured on this system.
func CPUTime() (int64, bool) { return 0, false }
