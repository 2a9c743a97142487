package termbg

import (
	"bytes"
	"errors"
	"io"
	"os"
	"os/exec"
	"path/filepath"
	"testing"
	"time"

	"github.com/creack/pty"
)

func TestDark(t *testing.T) {
	// COLORFGBG: "fg;bg" with ANSI colour indexes, as exported by several
	// terminal emulators (common practice); 7 (white) and 9–15 (bright
	// colours) are light backgrounds, 0–6 and 8 dark.
	tests := []struct {
		env  map[string]string
		dark bool
	}{
		{nil, true},
		{map[string]string{EnvVar: "light"}, false},
		{map[string]string{EnvVar: "LIGHT "}, false},
		{map[string]string{EnvVar: "dark"}, true},
		{map[string]string{EnvVar: "purple"}, true},
		{map[string]string{"COLORFGBG": "0;15"}, false},
		{map[string]string{"COLORFGBG": "15;0"}, true},
		{map[string]string{"COLORFGBG": "0;default;7"}, false},
		{map[string]string{"COLORFGBG": "7;8"}, true},
		{map[string]string{"COLORFGBG": "garbage"}, true},
		{map[string]string{"COLORFGBG": "0;99"}, true},
		{map[string]string{"COLORFGBG": "0;15", EnvVar: "dark"}, true},
		{map[string]string{"COLORFGBG": "15;0", EnvVar: "light"}, false},
	}
	for _, tt := range tests {
		got := Dark(func(k string) string { return tt.env[k] })
		if got != tt.dark {
			t.Errorf("Dark(%v) = %v, want %v", tt.env, got, tt.dark)
		}
	}
}

// TestNoStall builds a program that imports this package and the UI library
// and runs it in a pseudo-terminal that never answers. Without the early
// SetHasDarkBackground the library's init waits about 5 s for a reply and
// writes an OSC 11 query; the bound of 2 s only catches that stall.
func TestNoStall(t *testing.T) {
	if testing.Short() {
		t.Skip("builds a binary")
	}
	// the go command that runs this test is on PATH, as for the other
	// tests that build a binary
	goTool, err := exec.LookPath("go")
	if err != nil {
		t.Skipf("go tool not found: %v", err)
	}
	bin := filepath.Join(t.TempDir(), "nostall")
	build := exec.Command(goTool, "build", "-o", bin, "./testdata/nostall")
	if out, err := build.CombinedOutput(); err != nil {
		t.Fatalf("build: %v\n%s", err, out)
	}
	for _, bg := range []string{"", "light"} {
		cmd := exec.Command(bin)
		cmd.Env = append(os.Environ(), "TERM=xterm-256color", EnvVar+"="+bg, "COLORFGBG=")
		start := time.Now()
		f, err := pty.Start(cmd)
		if err != nil {
			t.Skipf("no pseudo-terminal: %v", err)
		}
		var out bytes.Buffer
		done := make(chan error, 1)
		go func() {
			_, err := io.Copy(&out, f)
			done <- err
		}()
		werr := cmd.Wait()
		select {
		case <-done:
		case <-time.After(10 * time.Second):
			t.Fatal("output not closed")
		}
		f.Close()
		elapsed := time.Since(start)
		if werr != nil {
			var ee *exec.ExitError
			if !errors.As(werr, &ee) {
				t.Fatal(werr)
			}
			t.Fatalf("exit: %v\n%q", werr, out.Bytes())
		}
		if elapsed > 2*time.Second {
			t.Errorf("ARGAND_BACKGROUND=%q: took %v, want < 2 s", bg, elapsed)
		}
		if bytes.IndexByte(out.Bytes(), 0x1b) >= 0 {
			t.Errorf("ARGAND_BACKGROUND=%q: output holds an escape byte: %q", bg, out.Bytes())
		}
		want := "dark: true"
		if bg == "light" {
			want = "dark: false"
		}
		if !bytes.Contains(out.Bytes(), []byte(want)) {
			t.Errorf("ARGAND_BACKGROUND=%q: output %q, want %q", bg, out.Bytes(), want)
		}
	}
}
