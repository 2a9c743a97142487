package tui

import (
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
	"time"
)

// tmuxRun drives the built binary in a detached tmux session of 80×24.
type tmuxRun struct {
	t    *testing.T
	sock string
	name string
}

func (r *tmuxRun) tmux(args ...string) string {
	r.t.Helper()
	out, err := exec.Command("tmux", append([]string{"-S", r.sock}, args...)...).CombinedOutput()
	if err != nil {
		r.t.Fatalf("tmux %v: %v\n%s", args, err, out)
	}
	return string(out)
}

func (r *tmuxRun) keys(keys ...string) {
	r.t.Helper()
	for _, k := range keys {
		r.tmux("send-keys", "-t", r.name, k)
		time.Sleep(60 * time.Millisecond)
	}
}

func (r *tmuxRun) text(s string) {
	r.t.Helper()
	r.tmux("send-keys", "-t", r.name, "-l", s)
	time.Sleep(60 * time.Millisecond)
}

// wait polls the screen until it contains want (generous bound: a stall,
// not speed, is what fails).
func (r *tmuxRun) wait(want string) string {
	r.t.Helper()
	var screen string
	for end := time.Now().Add(30 * time.Second); time.Now().Before(end); {
		screen = r.tmux("capture-pane", "-p", "-t", r.name)
		if strings.Contains(screen, want) {
			return screen
		}
		time.Sleep(50 * time.Millisecond)
	}
	r.t.Fatalf("screen never showed %q:\n%s", want, screen)
	return ""
}

// buildForTmux builds the binary into dir for an end-to-end test, or
// skips the test where it cannot run.
func buildForTmux(t *testing.T, dir string) string {
	t.Helper()
	if testing.Short() {
		t.Skip("builds the binary and runs tmux")
	}
	if _, err := exec.LookPath("tmux"); err != nil {
		t.Skip("tmux not installed; the end-to-end test needs it (CI installs it in .ci/run)")
	}
	bin := filepath.Join(dir, "argand")
	build := exec.Command("go", "build", "-o", bin, "argand/cmd/argand")
	if out, err := build.CombinedOutput(); err != nil {
		t.Fatalf("build: %v\n%s", err, out)
	}
	return bin
}

// starter returns a function that starts bin in a fresh tmux session of
// w×h cells, its home and state directory in dir.
func (r *tmuxRun) starter(bin, dir string, w, h int) func() {
	state := filepath.Join(dir, "state")
	r.t.Cleanup(func() { exec.Command("tmux", "-S", r.sock, "kill-server").Run() })
	return func() {
		cmdline := "env -i PATH=" + os.Getenv("PATH") + " HOME=" + dir + " XDG_STATE_HOME=" + state +
			" LANG=en_US.UTF-8 TERM=xterm-256color NO_COLOR=1 " + bin
		r.tmux("new-session", "-d", "-s", r.name, "-x", fmt.Sprint(w), "-y", fmt.Sprint(h), cmdline)
	}
}

func TestTmuxEndToEnd(t *testing.T) {
	dir := t.TempDir()
	bin := buildForTmux(t, dir)
	r := &tmuxRun{t: t, sock: filepath.Join(dir, "tmux.sock"), name: "e2e"}
	start := r.starter(bin, dir, 80, 24)

	start()
	r.wait("example data")
	// two impedances, typed in the entry line
	r.keys("e")
	r.text("Zm = 40+j30 ohm")
	r.keys("Enter")
	r.wait("Zm ")
	r.text("Zn = 50 ohm")
	r.keys("Enter")
	r.wait("Zn ")
	r.keys("Escape", "p")
	// (40+j30)·50/(90+j30) = 25 + j8.333 Ω, product over sum (common practice)
	screen := r.wait("parallel of Zm, Zn")
	if !strings.Contains(screen, "25.00 + j8.33") {
		t.Errorf("parallel result not shown:\n%s", screen)
	}
	// a divider: source, across which, rest
	r.keys("e")
	r.text("Vq = 100 V")
	r.keys("Enter", "Escape", "v")
	r.wait("source voltage [Vq]")
	r.keys("Enter", "Enter", "Enter")
	screen = r.wait("voltage divider")
	if !strings.Contains(screen, "vdiv(Vq") {
		t.Errorf("divider statement not in the trail:\n%s", screen)
	}
	// undo the divider
	r.keys("z")
	screen = r.wait("undone")
	if strings.Contains(screen, "vdiv(Vq") {
		t.Errorf("undo left the divider:\n%s", screen)
	}
	// mark the parallel result and Zm: the sketch draws them
	r.keys("Down", "Space", "Down", "Down", "Space")
	screen = r.wait("marked rows")
	if !strings.Contains(screen, "scale") || !strings.Contains(screen, "Re") {
		t.Errorf("no sketch:\n%s", screen)
	}
	r.keys("q")
	time.Sleep(300 * time.Millisecond)
	exec.Command("tmux", "-S", r.sock, "kill-session", "-t", r.name).Run()

	// start again: the state is restored
	start()
	screen = r.wait("session restored")
	for _, want := range []string{"Zm", "Zn", "Vq", "marked"} {
		if !strings.Contains(screen, want) {
			t.Errorf("restored screen lacks %q:\n%s", want, screen)
		}
	}
	if strings.Contains(screen, "vdiv(Vq") {
		t.Errorf("the undone divider came back:\n%s", screen)
	}
	r.keys("q")
}

// At 40×20, a phone's terminal held upright: a statement typed, the
// panes cycled with the pane key, and the result read whole in the
// table. (40+j30)·50/(90+j30) = 25 + j8.333 Ω = 26.35 Ω ∠18.43°,
// product over sum (common practice).
func TestTmuxNarrow(t *testing.T) {
	dir := t.TempDir()
	bin := buildForTmux(t, dir)
	r := &tmuxRun{t: t, sock: filepath.Join(dir, "tmux.sock"), name: "narrow"}
	r.starter(bin, dir, 40, 20)()
	r.wait("── entries")
	r.keys("e")
	r.text("Zp = parallel(40+j30 ohm, 50 ohm)")
	r.keys("Enter", "Escape")
	screen := r.wait("Zp ")
	for _, want := range []string{"25.00 + j8.333 Ω", "26.35 Ω ∠18.43°"} {
		if !strings.Contains(screen, want) {
			t.Errorf("result %q not on the screen:\n%s", want, screen)
		}
	}
	// the panes in turn: the trail has the statement, the sketch the
	// selected row, then the network of the example, then the entries
	r.keys("m")
	screen = r.wait("── trail")
	if !strings.Contains(screen, "parallel(40+j30") {
		t.Errorf("the trail lacks the statement:\n%s", screen)
	}
	r.keys("m")
	r.wait("── sketch")
	r.keys("m")
	r.wait("── network")
	r.keys("m")
	r.wait("── entries")
	// help opens and closes
	r.keys("?")
	r.wait("keys: entries")
	r.keys("Escape")
	r.wait("── entries")
	for _, l := range strings.Split(r.tmux("capture-pane", "-p", "-t", r.name), "\n") {
		if n := len([]rune(l)); n > 40 {
			t.Errorf("line of %d cells at 40 columns: %q", n, l)
		}
	}
	r.keys("q")
}
