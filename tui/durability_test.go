package tui

import (
	"bufio"
	"errors"
	"fmt"
	"io/fs"
	"math/rand/v2"
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
	"time"

	"argand/tui/store"
)

// childEnv names the state directory of a child process running a
// scripted session for TestDurability.
const childEnv = "ARGAND_TEST_DURABILITY_DIR"

// durabilityChild types "Dk = k Ω" for k = 1, 2, ... into a fresh app and
// reports each change on standard output once Update has returned (the
// session is saved inside Update).
func durabilityChild() int {
	m := New(Options{Dir: os.Getenv(childEnv), File: "", Getenv: func(string) string { return "" }})
	fmt.Println("ready")
	for k := 1; k <= 100000; k++ {
		press(m, "tab")
		for _, r := range fmt.Sprintf("D%d = %d Ω", k, k) {
			m.Update(keyMsg(string(r)))
		}
		press(m, "enter", "esc")
		if m.msgErr {
			fmt.Println("error", m.msg)
			return 1
		}
		fmt.Println("done", k)
	}
	return 0
}

// TestDurability kills a child running a scripted session at 100 random
// moments. Every time, the session file must load and must hold every
// change the child reported, and at most the one in flight besides.
func TestDurability(t *testing.T) {
	if testing.Short() {
		t.Skip("starts 100 processes")
	}
	exe, err := os.Executable()
	if err != nil {
		t.Skip("cannot find the test binary:", err)
	}
	rng := rand.New(rand.NewPCG(1, 2))
	for run := 0; run < 100; run++ {
		dir := t.TempDir()
		cmd := exec.Command(exe, "-test.run=^$")
		cmd.Env = append(os.Environ(), childEnv+"="+dir)
		out, err := cmd.StdoutPipe()
		if err != nil {
			t.Fatal(err)
		}
		if err := cmd.Start(); err != nil {
			t.Fatal(err)
		}
		last := -1 // -1: not ready, 0: ready, k: change k saved
		lines := make(chan string)
		go func() {
			sc := bufio.NewScanner(out)
			for sc.Scan() {
				lines <- sc.Text()
			}
			close(lines)
		}()
		deadline := time.After(time.Duration(rng.IntN(400)) * time.Millisecond)
	read:
		for {
			select {
			case l, ok := <-lines:
				if !ok {
					break read
				}
				switch {
				case l == "ready":
					last = 0
				case strings.HasPrefix(l, "done "):
					last, _ = strconv.Atoi(l[5:])
				default:
					t.Fatalf("child: %s", l)
				}
			case <-deadline:
				break read
			}
		}
		cmd.Process.Kill()
		// what the child wrote before it was killed still counts: a
		// "ready" read only now, then a change saved but not reported,
		// is a file holding one change more than reported
		for l := range lines {
			switch {
			case l == "ready":
				last = max(last, 0)
			case strings.HasPrefix(l, "done "):
				last, _ = strconv.Atoi(l[5:])
			}
		}
		cmd.Wait()
		path := filepath.Join(dir, "session.json")
		data, err := store.Load(path)
		if errors.Is(err, fs.ErrNotExist) && last < 0 {
			continue // killed before the first save
		}
		if err != nil {
			t.Fatalf("run %d: %v", run, err)
		}
		sh, _, _, err := decode(data, false)
		if err != nil {
			t.Fatalf("run %d: session does not load: %v", run, err)
		}
		n := 0
		for k := 1; ; k++ {
			if _, ok := sh.Lookup(fmt.Sprintf("D%d", k)); !ok {
				break
			}
			n = k
		}
		if n < last || n > last+1 {
			t.Fatalf("run %d: the file holds %d changes, the child reported %d", run, n, last)
		}
	}
}
