package main

import (
	"bytes"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
)

// TestRunReadsFilesBesideWorksheet: "argand run dir/job.txt" and
// "argand dir/job.txt" (not on a terminal) read a file the worksheet
// names from the worksheet's directory, wherever argand is started.
func TestRunReadsFilesBesideWorksheet(t *testing.T) {
	root := t.TempDir()
	dir := filepath.Join(root, "site", "board2")
	if err := os.MkdirAll(dir, 0o755); err != nil {
		t.Fatal(err)
	}
	// example data: an invented current spectrum, 100 A with 20 % fifth
	if err := os.WriteFile(filepath.Join(dir, "ib.csv"), []byte("order,value\n1,100 A\n5,20 A\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	job := "spectrum Ib from ib.csv\nd = thd(Ib)\ncheck d is 0.2 within 0.01%\n"
	if err := os.WriteFile(filepath.Join(dir, "job.txt"), []byte(job), 0o644); err != nil {
		t.Fatal(err)
	}
	tests := []struct {
		name string
		cwd  string
		args []string
	}{
		{"run from the root", root, []string{"run", filepath.Join("site", "board2", "job.txt")}},
		{"run from elsewhere, absolute", t.TempDir(), []string{"run", filepath.Join(dir, "job.txt")}},
		{"run from its own directory", dir, []string{"run", "job.txt"}},
		{"open, not on a terminal", root, []string{filepath.Join("site", "board2", "job.txt")}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			cmd := exec.Command(bin, tt.args...)
			cmd.Env = env(utf8Lang)
			cmd.Dir = tt.cwd
			var out, errb bytes.Buffer
			cmd.Stdout, cmd.Stderr = &out, &errb
			err := cmd.Run()
			if err != nil || !strings.Contains(out.String(), "checks: 1 passed, 0 failed") {
				t.Errorf("argand %v in %s: %v\n%s\n%s", tt.args, tt.cwd, err, out.String(), errb.String())
			}
		})
	}
}
