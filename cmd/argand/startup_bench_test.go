package main

import (
	"io"
	"os/exec"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"
)

// BenchmarkEvalStartup is argand eval of one product in the process, from
// the command line to the printed steps: the start-up of a worksheet and
// one statement.
func BenchmarkEvalStartup(b *testing.B) {
	for b.Loop() {
		if code := run([]string{"eval", "(3+j4)*(1-j2)"}, strings.NewReader(""), io.Discard, io.Discard); code != 0 {
			b.Fatalf("exit %d", code)
		}
	}
}

// BenchmarkEvalProcess runs the built argand eval of one product as a
// process, start-up included, and reports the processor time of each run.
func BenchmarkEvalProcess(b *testing.B) {
	bin := filepath.Join(b.TempDir(), "argand")
	if out, err := exec.Command("go", "build", "-o", bin, ".").CombinedOutput(); err != nil {
		b.Fatalf("build: %v\n%s", err, out)
	}
	before := childCPU()
	for b.Loop() {
		if out, err := exec.Command(bin, "eval", "(3+j4)*(1-j2)").CombinedOutput(); err != nil {
			b.Fatalf("%v\n%s", err, out)
		}
	}
	b.ReportMetric(float64((childCPU()-before).Microseconds())/float64(b.N), "cpu-µs/run")
}

// childCPU is the processor time of the finished child processes.
func childCPU() time.Duration {
	var ru syscall.Rusage
	if syscall.Getrusage(syscall.RUSAGE_CHILDREN, &ru) != nil {
		return 0
	}
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano())
}
