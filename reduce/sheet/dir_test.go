package sheet

import (
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestSpectrumFileBesideWorksheet: a relative file name in "spectrum NAME
// from FILE" is read from the worksheet's directory (SetDir), an absolute
// one as it is, and with no directory set from the working directory.
func TestSpectrumFileBesideWorksheet(t *testing.T) {
	root := t.TempDir()
	jobs := filepath.Join(root, "jobs")
	if err := os.MkdirAll(filepath.Join(jobs, "data"), 0o755); err != nil {
		t.Fatal(err)
	}
	// example data: an invented current spectrum, 100 A with 20 % fifth
	csv := []byte("order,value\n1,100 A\n5,20 A\n")
	for _, p := range []string{filepath.Join(jobs, "i.csv"), filepath.Join(jobs, "data", "i.csv")} {
		if err := os.WriteFile(p, csv, 0o644); err != nil {
			t.Fatal(err)
		}
	}
	tests := []struct {
		name, dir, file string
		ok              bool
		read            string // the file the step says it read
	}{
		{"beside the worksheet", jobs, "i.csv", true, filepath.Join(jobs, "i.csv")},
		{"in a folder beside it", jobs, "data/i.csv", true, filepath.Join(jobs, "data", "i.csv")},
		{"absolute", filepath.Join(root, "elsewhere"), filepath.Join(jobs, "i.csv"), true, filepath.Join(jobs, "i.csv")},
		{"not beside the worksheet", root, "i.csv", false, filepath.Join(root, "i.csv")},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			s := New()
			s.SetDir(tt.dir)
			steps, _, err := s.Exec("spectrum I from " + tt.file)
			if !tt.ok {
				if err == nil || !strings.Contains(err.Error(), tt.read) || !strings.Contains(err.Error(), "cannot open") {
					t.Errorf("err = %v, want cannot open naming %s", err, tt.read)
				}
				return
			}
			if err != nil {
				t.Fatal(err)
			}
			var notes string
			for _, st := range steps {
				notes += strings.Join(st.Notes, "\n")
			}
			if !strings.Contains(notes, "read from "+tt.read) {
				t.Errorf("notes %q, want read from %s", notes, tt.read)
			}
			if _, _, err := s.Exec("d = thd(I)"); err != nil {
				t.Fatal(err)
			}
			if d, _ := s.Lookup("d"); math.Abs(real(d.V)-0.2) > 1e-12 {
				t.Errorf("thd = %v, want 0.2 (20 A of 100 A)", d.V)
			}
		})
	}
	// with no directory set, a relative name is read from the working
	// directory, as before
	t.Chdir(jobs)
	if _, _, err := New().Exec("spectrum I from i.csv"); err != nil {
		t.Errorf("no directory set: %v", err)
	}
}

// TestSpectrumFailedDependants: a line that reads a spectrum whose file
// could not be read is skipped as depending on it, as for any name a
// failed line would have defined, rather than reported as a second error.
func TestSpectrumFailedDependants(t *testing.T) {
	s := New()
	s.SetDir(t.TempDir())
	sum, err := s.Run(strings.NewReader("spectrum I from missing.csv\nd = thd(I)\nx = 2 * 3\n"), nil)
	if err != nil {
		t.Fatal(err)
	}
	if len(sum.Problems) != 2 {
		t.Fatalf("problems %v, want the file and its dependant", sum.Problems)
	}
	if p := sum.Problems[1]; p.Err.Line != 2 || p.DependsOn != 1 || !strings.Contains(p.Err.Msg, "skipped: depends on line 1") {
		t.Errorf("line 2: %+v %q", p, p.Err.Msg)
	}
	if _, ok := s.Lookup("x"); !ok {
		t.Errorf("line 3 did not run")
	}
}
