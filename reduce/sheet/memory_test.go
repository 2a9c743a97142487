package sheet

import (
	"runtime"
	"strings"
	"testing"

	"argand/calc"
)

// liveAfterRun runs ws as argand run does (each line's steps emitted as it
// finishes) and returns the heap still in use per element once it is done,
// with the sheet alive, and the number of steps emitted.
func liveAfterRun(t *testing.T, ws string, n int, job Job) (perElement uint64, steps int) {
	t.Helper()
	var before, after runtime.MemStats
	runtime.GC()
	runtime.ReadMemStats(&before)
	s := New()
	sum, err := s.RunAll(job, strings.NewReader(ws), func(st []calc.Step) { steps += len(st) }, nil)
	if err != nil || sum.Err != nil {
		t.Fatalf("%v %v", err, sum.Err)
	}
	runtime.GC()
	runtime.ReadMemStats(&after)
	runtime.KeepAlive(s)
	live := int64(after.HeapAlloc) - int64(before.HeapAlloc)
	return uint64(max(live, 0)) / uint64(n), steps
}

// TestRunMemory: argand run of a node-block network keeps what later lines
// may read (the definitions and the network's solution) and not the steps
// it has printed. Heap in use after the run, per element, is bounded (it
// was about 2 800 bytes with the trail kept, about 1 650 without); the
// steps emitted are the same either way, and the trail is empty.
func TestRunMemory(t *testing.T) {
	const n = 10000
	ws := blockNetwork(n)
	tests := []struct {
		job   Job
		limit uint64 // bytes per element, 0 for no limit
	}{
		{Job{}, 0},
		{Job{NoTrail: true}, 2000},
	}
	var counts []int
	for _, tt := range tests {
		per, steps := liveAfterRun(t, ws, n, tt.job)
		t.Logf("NoTrail %v: %d bytes in use per element, %d steps emitted", tt.job.NoTrail, per, steps)
		if tt.limit > 0 && per > tt.limit {
			t.Errorf("NoTrail %v: %d bytes in use per element after the run, want at most %d", tt.job.NoTrail, per, tt.limit)
		}
		counts = append(counts, steps)
	}
	if counts[0] != counts[1] || counts[0] < n {
		t.Errorf("steps emitted: %d with the trail, %d without; want the same, at least %d", counts[0], counts[1], n)
	}
	s := New()
	if _, err := s.RunAll(Job{NoTrail: true}, strings.NewReader(blockNetwork(50)), nil, nil); err != nil {
		t.Fatal(err)
	}
	if len(s.Steps()) != 0 {
		t.Errorf("NoTrail: the trail holds %d steps after the run, want none", len(s.Steps()))
	}
	if v := valueOf(t, s, "big.R0.i"); v.V == 0 {
		t.Errorf("big.R0.i = 0 after a run without trail: the results must be kept")
	}
}
