package main

import (
	"bytes"
	"os/exec"
	"strconv"
	"strings"
	"testing"
)

// TestStartupBuildsNothingForEval: argand eval does not build, at start-up,
// what only the app uses. The Go runtime reports each package's
// initialisation with GODEBUG=inittrace=1 (runtime package documentation):
// the app's packages must allocate nothing there; what they need is built
// when the app runs. The packages eval itself uses (calc, reduce/...) may
// build their tables.
func TestStartupBuildsNothingForEval(t *testing.T) {
	appOnly := []string{"argand/tui", "argand/tui/store", "argand/tui/sketch", "argand/tui/termbg", "argand/tui/serve", "argand/tui/record", "argand/tui/clip"}
	cmd := exec.Command(bin, "eval", "1")
	cmd.Env = append(env(utf8Lang), "GODEBUG=inittrace=1")
	var errb bytes.Buffer
	cmd.Stderr = &errb
	if err := cmd.Run(); err != nil {
		t.Fatalf("argand eval 1: %v\n%s", err, errb.String())
	}
	seen := map[string]int{}
	for _, line := range strings.Split(errb.String(), "\n") {
		// init PKG @T ms, C ms clock, B bytes, A allocs
		f := strings.Fields(line)
		if len(f) < 11 || f[0] != "init" || f[10] != "allocs" {
			continue
		}
		n, err := strconv.Atoi(f[9])
		if err != nil {
			t.Fatalf("cannot read %q", line)
		}
		seen[f[1]] = n
	}
	if len(seen) == 0 {
		t.Fatalf("no init trace in:\n%s", errb.String())
	}
	for _, p := range appOnly {
		if n := seen[p]; n > 0 {
			t.Errorf("%s allocates %d times at start-up, for the app alone", p, n)
		}
	}
}
