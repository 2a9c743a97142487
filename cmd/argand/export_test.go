package main

import (
	"bytes"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
)

// TestExportCommandLine: argand export's forms and its mistakes.
func TestExportCommandLine(t *testing.T) {
	dir := t.TempDir()
	out := filepath.Join(dir, "r.html")
	tests := []struct {
		name string
		args []string
		code int
		out  string
		err  string
	}{
		{"record", []string{"export", "--html", out, "--date", "2026-03-14", ws("motor.argand")}, 0, "checks: 3 passed, 0 failed", ""},
		{"record of a failed check", []string{"export", "--date=2026-03-14", "--html=" + out, ws("checkfail.argand")}, 1, "1 failed", ""},
		{"bad line: no record", []string{"export", "--html", filepath.Join(dir, "bad.html"), ws("error.argand")}, 2, "", "no record written"},
		{"bad date", []string{"export", "--html", out, "--date", "14/03/2026", ws("motor.argand")}, 2, "", "YYYY-MM-DD"},
		{"no html", []string{"export", ws("motor.argand")}, 2, "", "export takes --html"},
		{"html without a value", []string{"export", "--html"}, 2, "", "--html needs a value"},
		{"both", []string{"export", "--html", out, "--source", out}, 2, "", "export takes --html"},
		{"two worksheets", []string{"export", "--html", out, ws("motor.argand"), ws("motor.argand")}, 2, "", "at most one worksheet"},
		{"html elsewhere", []string{"run", "--html", out, ws("motor.argand")}, 2, "", "belong to argand export"},
		{"source of a non-record", []string{"export", "--source", ws("motor.argand")}, 2, "", "no worksheet in it"},
		{"source missing", []string{"export", "--source", filepath.Join(dir, "none.html")}, 2, "", "no such file"},
		{"to stdout", []string{"export", "--html", "-", "--date", "2026-03-14", ws("motor.argand")}, 0, "<!DOCTYPE html>", ""},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			code, o, e := argand(t, utf8Lang, "", tt.args...)
			if code != tt.code || !strings.Contains(o, tt.out) || !strings.Contains(e, tt.err) {
				t.Errorf("exit %d (want %d)\nstdout %.300s (want %q)\nstderr %.300s (want %q)", code, tt.code, o, tt.out, e, tt.err)
			}
		})
	}
	if _, err := os.Stat(filepath.Join(dir, "bad.html")); err == nil {
		t.Error("a record was written for a worksheet with a bad line")
	}
}

// TestExportRoundTrip: the worksheet taken out of a record with
// export --source runs with argand run to the same output, line for line,
// as the worksheet the record was made from.
func TestExportRoundTrip(t *testing.T) {
	dir := t.TempDir()
	for _, name := range []string{"motor.argand", "checkfail.argand"} {
		rec := filepath.Join(dir, name+".html")
		argand(t, utf8Lang, "", "export", "--html", rec, "--date", "2026-03-14", ws(name))
		code, src, e := argand(t, utf8Lang, "", "export", "--source", rec)
		if code != 0 {
			t.Fatalf("%s: export --source: exit %d: %s", name, code, e)
		}
		c1, want, _ := argand(t, utf8Lang, "", "run", ws(name))
		c2, got, _ := argand(t, utf8Lang, src, "run", "-")
		if c1 != c2 || got != want {
			t.Errorf("%s: replay exit %d (want %d), output differs:\n%s\n---\n%s", name, c2, c1, got, want)
		}
	}
}

// TestExportSession: with no worksheet named, export writes the record of
// the saved session, found where the app keeps it.
func TestExportSession(t *testing.T) {
	state := t.TempDir()
	run := func(args ...string) (int, string, string) {
		cmd := exec.Command(bin, args...)
		cmd.Env = append(env(utf8Lang), "XDG_STATE_HOME="+state)
		var o, e bytes.Buffer
		cmd.Stdout, cmd.Stderr = &o, &e
		err := cmd.Run()
		code := 0
		if ee, ok := err.(*exec.ExitError); ok {
			code = ee.ExitCode()
		}
		return code, o.String(), e.String()
	}
	if code, _, e := run("export", "--html", "-"); code != 2 || !strings.Contains(e, "no saved session") {
		t.Errorf("no session: exit %d, %s", code, e)
	}
	// the line mode works on the saved session, as the app does
	if code, _, e := run("--plain", "--new"); code != 0 {
		t.Fatalf("--plain: exit %d: %s", code, e)
	}
	cmd := exec.Command(bin, "--plain")
	cmd.Env = append(env(utf8Lang), "XDG_STATE_HOME="+state)
	cmd.Stdin = strings.NewReader("title Session job (example data)\nZq = 3+j4 Ω\n")
	if b, err := cmd.CombinedOutput(); err != nil {
		t.Fatalf("--plain: %v\n%s", err, b)
	}
	code, o, e := run("export", "--html", "-", "--date", "2026-03-14")
	if code != 0 || !strings.Contains(o, "<h1>Session job (example data)</h1>") || !strings.Contains(o, "Zq = 3+j4 Ω") {
		t.Errorf("exit %d: %s\n%.2000s", code, e, o)
	}
}
