// Package golden compares test output with golden files, and rewrites
// them when the tests run with -update (go test ./tui/... -update). It is
// imported by tests only.
package golden

import (
	"flag"
	"os"
	"testing"
)

// update is the -update flag of every test binary that imports golden.
var update = flag.Bool("update", false, "rewrite the golden files in testdata")

// Updating reports whether the tests run with -update.
func Updating() bool { return *update }

// Check compares got with the file at path; with -update it writes got
// there instead.
func Check(t testing.TB, path, got string) {
	t.Helper()
	if *update {
		if err := os.WriteFile(path, []byte(got), 0o644); err != nil {
			t.Fatal(err)
		}
		return
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("%v (go test with -update creates it)", err)
	}
	if got != string(want) {
		t.Errorf("%s differs from the golden file (go test with -update rewrites it)\n--- got\n%s\n--- want\n%s", path, got, want)
	}
}
