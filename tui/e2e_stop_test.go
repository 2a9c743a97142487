package tui

import (
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
	"time"
)

// waitFor polls the screen until it contains want, for at most limit: a
// generous bound that catches a stall, not a measure of speed.
func (r *tmuxRun) waitFor(want string, limit time.Duration) string {
	r.t.Helper()
	var screen string
	for end := time.Now().Add(limit); time.Now().Before(end); time.Sleep(50 * time.Millisecond) {
		screen = r.tmux("capture-pane", "-p", "-t", r.name)
		if strings.Contains(screen, want) {
			return screen
		}
	}
	r.t.Fatalf("screen never showed %q:\n%s", want, screen)
	return ""
}

// stopSheet is the worksheet of the stop test (invented example data).
const stopSheet = `# example data for the stop test: an invented RLC branch
frequency 50 Hz
budget 600 s
resistor Rk = 10 Ω
inductor Lk = 10 mH
capacitor Ck = 10 µF
network nk = Rk + (Lk || Ck) fed by 230 V
`

// TestTmuxStopSweep starts a sweep sized by a short calibration run to
// take about 5 s, sees its progress line, stops it with esc, and finds the
// session unchanged and the app answering.
func TestTmuxStopSweep(t *testing.T) {
	if testing.Short() {
		t.Skip("builds the binary and runs tmux")
	}
	if _, err := exec.LookPath("tmux"); err != nil {
		t.Skip("tmux not installed; the end-to-end test needs it (CI installs it in .ci/run)")
	}
	dir := t.TempDir()
	bin := filepath.Join(dir, "argand")
	if out, err := exec.Command("go", "build", "-o", bin, "argand/cmd/argand").CombinedOutput(); err != nil {
		t.Fatalf("build: %v\n%s", err, out)
	}
	sheetFile := filepath.Join(dir, "stop.argand")
	if err := os.WriteFile(sheetFile, []byte(stopSheet), 0o644); err != nil {
		t.Fatal(err)
	}
	sweep := func(n int) string {
		return "sweep nk.Ck.v from 10 Hz to 10 kHz points " + strconv.Itoa(n)
	}
	// calibration: the time of a short sweep sets the points of a long one
	const probe = 3000
	cal := filepath.Join(dir, "cal.argand")
	if err := os.WriteFile(cal, []byte(stopSheet+sweep(probe)+"\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	t0 := time.Now()
	if out, err := exec.Command(bin, "run", cal).CombinedOutput(); err != nil {
		t.Fatalf("calibration run: %v\n%s", err, out)
	}
	n := int(float64(probe) * 5 / max(time.Since(t0).Seconds(), 1e-3))
	n = min(max(n, probe), 100000)

	state := filepath.Join(dir, "state")
	r := &tmuxRun{t: t, sock: filepath.Join(dir, "tmux.sock"), name: "stop"}
	cmdline := "env -i PATH=" + os.Getenv("PATH") + " HOME=" + dir + " XDG_STATE_HOME=" + state +
		" LANG=en_US.UTF-8 TERM=xterm-256color NO_COLOR=1 " + bin + " " + sheetFile
	r.tmux("new-session", "-d", "-s", r.name, "-x", "80", "-y", "24", cmdline)
	t.Cleanup(func() { exec.Command("tmux", "-S", r.sock, "kill-server").Run() })
	r.waitFor("opened", time.Minute)
	r.keys("e")
	r.text(sweep(n))
	r.keys("Enter")
	screen := r.waitFor("running", time.Minute)
	if !strings.Contains(screen, "of "+strconv.Itoa(n)) || !strings.Contains(screen, "stops it") {
		t.Errorf("the progress line lacks the fraction done or the way to stop:\n%s", screen)
	}
	// the screen goes on redrawing: the elapsed time moves on
	first := screen
	for end := time.Now().Add(30 * time.Second); screen == first && time.Now().Before(end); time.Sleep(100 * time.Millisecond) {
		screen = r.tmux("capture-pane", "-p", "-t", r.name)
	}
	if screen == first && strings.Contains(screen, "running") {
		t.Errorf("the screen did not change while the sweep ran:\n%s", screen)
	}
	r.keys("Escape")
	screen = r.waitFor("nothing changed", time.Minute)
	if strings.Contains(screen, "frequency sweep") {
		t.Errorf("the stopped sweep reached the trail:\n%s", screen)
	}
	// the app answers at once
	r.keys("C-u")
	r.text("Zok = 7 ohm")
	r.keys("Enter")
	r.waitFor("Zok = 7.000", time.Minute)
	r.keys("Escape", "q")
	// the session kept on disk has the new value and not the sweep
	var kept string
	for end := time.Now().Add(time.Minute); time.Now().Before(end); time.Sleep(100 * time.Millisecond) {
		filepath.Walk(state, func(p string, info os.FileInfo, err error) error {
			if err == nil && strings.HasSuffix(p, ".json") {
				if b, err := os.ReadFile(p); err == nil && strings.Contains(string(b), "Zok") {
					kept = string(b)
				}
			}
			return nil
		})
		if kept != "" {
			break
		}
	}
	if kept == "" || strings.Contains(kept, "sweep") {
		t.Errorf("session file after stopping the sweep:\n%s", kept)
	}
}
