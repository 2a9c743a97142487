package serve

import (
	"bufio"
	"encoding/base64"
	"fmt"
	"net"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"slices"
	"strings"
	"sync"
	"syscall"
	"testing"
	"time"

	"argand/reduce/sheet"

	gossh "golang.org/x/crypto/ssh"
)

// childEnv names the state directory when this test binary is started
// again as a server, for the test that kills it.
const childEnv = "ARGAND_SERVE_TEST_CHILD"

func TestMain(m *testing.M) {
	if dir := os.Getenv(childEnv); dir != "" {
		child(dir)
		return
	}
	os.Exit(m.Run())
}

// child serves dir on a loopback port, says which on its first line, and
// stops by itself after two minutes if no one kills it first.
func child(dir string) {
	srv, err := New(Config{Dir: dir})
	if err != nil {
		fmt.Println("error:", err)
		os.Exit(2)
	}
	ln, err := net.Listen("tcp", "127.0.0.1:0")
	if err != nil {
		fmt.Println("error:", err)
		os.Exit(2)
	}
	fmt.Println(ln.Addr().String())
	go func() {
		time.Sleep(2 * time.Minute)
		os.Exit(3)
	}()
	srv.Serve(ln)
}

// TestConcurrentSessions runs 50 sessions at once on 50 keys, each
// entering its own statement, copying its value and quitting; each key's
// session state and screen hold its own work and no one else's.
func TestConcurrentSessions(t *testing.T) {
	if testing.Short() {
		t.Skip("50 sessions")
	}
	const n = 50
	dir := t.TempDir()
	keys := make([]gossh.Signer, n)
	for i := range keys {
		keys[i] = newKey(t)
	}
	authorize(t, dir, keys...)
	lg, logs := logBuffer()
	r := start(t, Config{Dir: dir, MaxSessions: 64, Log: lg})
	host := r.srv.HostKey()

	began := time.Now()
	outs := make([]string, n)
	var wg sync.WaitGroup
	for i := 0; i < n; i++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			c, err := dial(t, r.addr, keys[i], host)
			if err != nil {
				t.Errorf("session %d: %v", i, err)
				return
			}
			defer c.Close()
			a := open(t, c, map[string]string{"LANG": "C.UTF-8"})
			a.wait(ready)
			a.enter(fmt.Sprintf("Zs%d = %d+j1 Ω", i, i+10), fmt.Sprintf("%d.00 + j1.000 Ω", i+10))
			a.send("\x0f") // ctrl+o: the value to the clipboard
			a.wait("\x1b]52;c;")
			a.send("q")
			outs[i] = a.end()
		}()
	}
	wg.Wait()
	t.Logf("%d sessions at once: all done in %s", n, time.Since(began).Round(time.Millisecond))
	if t.Failed() {
		return
	}
	other := regexp.MustCompile(`Zs[0-9]+`)
	osc := regexp.MustCompile("\x1b\\]52;c;([A-Za-z0-9+/=]*)\a")
	for i := 0; i < n; i++ {
		mine := fmt.Sprintf("Zs%d", i)
		st := statements(t, dir, keys[i])
		if last := st[len(st)-1]; last != fmt.Sprintf("Zs%d = %d+j1 Ω", i, i+10) {
			t.Errorf("session %d saved %q last", i, last)
		}
		for _, s := range st {
			if m := other.FindString(s); m != "" && m != mine {
				t.Errorf("session %d holds another's statement %q", i, s)
			}
		}
		for _, m := range other.FindAllString(outs[i], -1) {
			if m != mine {
				t.Errorf("session %d was shown %s", i, m)
				break
			}
		}
		// the clipboard request carries this session's value
		sm := osc.FindStringSubmatch(outs[i])
		if sm == nil {
			t.Errorf("session %d: no OSC 52 request", i)
			continue
		}
		text, err := base64.StdEncoding.DecodeString(sm[1])
		if err != nil || !strings.Contains(string(text), fmt.Sprintf("%d", i+10)) {
			t.Errorf("session %d copied %q (%v)", i, text, err)
		}
	}
	waitFor(t, logs, "reason=quit")
	if got := strings.Count(logs.String(), "connect fp="); got != 2*n {
		t.Errorf("%d connect and disconnect lines, want %d", got, 2*n)
	}
	if strings.Contains(logs.String(), "+j1") {
		t.Error("the log holds a value of the work")
	}
}

// TestSessionLimit fills the server at the default limit of 32 and checks
// that the 33rd connection gets one line and ends, the others going on.
func TestSessionLimit(t *testing.T) {
	if testing.Short() {
		t.Skip("33 sessions")
	}
	dir := t.TempDir()
	keys := make([]gossh.Signer, DefaultMaxSessions+1)
	for i := range keys {
		keys[i] = newKey(t)
	}
	authorize(t, dir, keys...)
	lg, logs := logBuffer()
	r := start(t, Config{Dir: dir, Log: lg})
	host := r.srv.HostKey()

	apps := make([]*app, DefaultMaxSessions)
	var wg sync.WaitGroup
	for i := range apps {
		wg.Add(1)
		go func() {
			defer wg.Done()
			c, err := dial(t, r.addr, keys[i], host)
			if err != nil {
				t.Errorf("session %d: %v", i, err)
				return
			}
			t.Cleanup(func() { c.Close() })
			apps[i] = open(t, c, nil)
			apps[i].wait(ready)
		}()
	}
	wg.Wait()
	if t.Failed() {
		return
	}
	if got := r.srv.Sessions(); got != DefaultMaxSessions {
		t.Fatalf("%d sessions running, want %d", got, DefaultMaxSessions)
	}
	c, err := dial(t, r.addr, keys[DefaultMaxSessions], host)
	if err != nil {
		t.Fatal(err)
	}
	defer c.Close()
	extra := open(t, c, nil)
	got := extra.end()
	want := "argand: the server is full (32 sessions, its limit); try again later\r\n"
	if got != want {
		t.Errorf("connection 33 got %q, want %q", got, want)
	}
	// the others go on: each still answers a key, then quits
	for i, a := range apps {
		a.send("?")
		a.wait("help 1-")
		a.send("q", "q")
		if out := a.end(); strings.Contains(out, "server is full") {
			t.Errorf("session %d was told the server is full", i)
		}
	}
	waitFor(t, logs, "reason=limit-sessions")
}

// TestPerKeyLimit: a second session with one key is offered the choices
// of a second local instance; past the limit per key, one line.
func TestPerKeyLimit(t *testing.T) {
	dir := t.TempDir()
	key := newKey(t)
	authorize(t, dir, key)
	r := start(t, Config{Dir: dir, MaxPerKey: 2})
	host := r.srv.HostKey()
	c, err := dial(t, r.addr, key, host)
	if err != nil {
		t.Fatal(err)
	}
	defer c.Close()
	first := open(t, c, nil)
	first.wait(ready)
	second := open(t, c, nil)
	second.wait("your session is already open")
	second.wait("without changing anything")
	third := open(t, c, nil)
	if got, want := third.end(), "argand: this key already has 2 sessions open, the most allowed; close one and try again\r\n"; got != want {
		t.Errorf("third session got %q, want %q", got, want)
	}
	second.send("r")
	second.wait("READ-ONLY")
	second.send("q")
	second.end()
	first.send("q")
	first.end()
}

// TestIdle ends a session after the idle time; its work is kept and the
// next connection restores it without asking about a lock.
func TestIdle(t *testing.T) {
	dir := t.TempDir()
	key := newKey(t)
	authorize(t, dir, key)
	lg, logs := logBuffer()
	r := start(t, Config{Dir: dir, Idle: time.Second, Log: lg})
	host := r.srv.HostKey()
	c, err := dial(t, r.addr, key, host)
	if err != nil {
		t.Fatal(err)
	}
	defer c.Close()
	a := open(t, c, nil)
	a.wait(ready)
	began := time.Now()
	a.enter("Zidle = 4+j3 Ω", "4.000 + j3.000 Ω")
	out := a.end()
	t.Logf("idle session ended %s after its last key", time.Since(began).Round(time.Millisecond))
	if !strings.HasSuffix(out, "\r\nargand: no input for 1s; the session is closed and your work is saved\r\n") {
		t.Errorf("idle end: %q", tail(out, 200))
	}
	waitFor(t, logs, "reason=idle")
	if st := statements(t, dir, key); st[len(st)-1] != "Zidle = 4+j3 Ω" {
		t.Errorf("saved %q last", st[len(st)-1])
	}
	b := open(t, c, nil)
	b.wait("session restored")
	b.wait("Zidle")
	if strings.Contains(b.out.String(), "already open") {
		t.Error("the idle session's lock was not released")
	}
	b.send("q")
	b.end()
}

// TestRateAndLine: a flood of input ends the connection with one line.
func TestRateAndLine(t *testing.T) {
	dir := t.TempDir()
	key := newKey(t)
	authorize(t, dir, key)
	r := start(t, Config{Dir: dir, Rate: 1000, MaxLine: 4000})
	host := r.srv.HostKey()
	c, err := dial(t, r.addr, key, host)
	if err != nil {
		t.Fatal(err)
	}
	defer c.Close()

	a := open(t, c, nil)
	a.wait(ready)
	a.send("\t", strings.Repeat("x", 4001))
	if out := a.end(); !strings.HasSuffix(out, "\r\nargand: more than 4000 bytes of input in one line; the connection is closed and your work up to the last change is saved\r\n") {
		t.Errorf("long line: %q", tail(out, 200))
	}

	b := open(t, c, nil)
	b.wait(ready)
	b.send("\t")
	for i := 0; i < 10; i++ {
		b.in.Write([]byte(strings.Repeat("y", 900) + "\r"))
	}
	if out := b.end(); !strings.HasSuffix(out, "\r\nargand: input came faster than 1000 bytes a second; the connection is closed and your work up to the last change is saved\r\n") {
		t.Errorf("flood: %q", tail(out, 200))
	}
}

// TestKilledServer kills the server (SIGKILL) in the middle of a session
// and starts it again on the same state: the host key is the same, the
// work entered is there, the statement being typed is lost, and the lock
// died with the server.
func TestKilledServer(t *testing.T) {
	if testing.Short() {
		t.Skip("starts a server process")
	}
	dir := filepath.Join(t.TempDir(), "state")
	key := newKey(t)
	authorize(t, dir, key)

	first, addr := startChild(t, dir)
	hk, err := HostKey(dir)
	if err != nil {
		t.Fatal(err)
	}
	host := hk.PublicKey()
	c, err := dial(t, addr, key, host)
	if err != nil {
		t.Fatal(err)
	}
	a := open(t, c, nil)
	a.wait(ready)
	a.enter("Zkept = 2+j2 Ω", "2.000 + j2.000 Ω")
	a.send("\t", "Zlost = 9+j9 Ω") // typed, not entered: the change in flight
	a.wait("Zlost")
	began := time.Now()
	if err := first.Process.Signal(syscall.SIGKILL); err != nil {
		t.Fatal(err)
	}
	first.Wait()
	a.end()
	c.Close()

	_, addr = startChild(t, dir)
	t.Logf("killed and started again in %s", time.Since(began).Round(time.Millisecond))
	// FixedHostKey: the first start's key must still be the server's
	c, err = dial(t, addr, key, host)
	if err != nil {
		t.Fatalf("after the restart: %v", err)
	}
	defer c.Close()
	b := open(t, c, nil)
	b.wait("session restored")
	b.wait("Zkept")
	if strings.Contains(b.out.String(), "already open") {
		t.Error("the killed server's lock was still held")
	}
	st := statements(t, dir, key)
	if !slices.Contains(st, "Zkept = 2+j2 Ω") || slices.ContainsFunc(st, func(s string) bool { return strings.Contains(s, "Zlost") }) {
		t.Errorf("saved statements end %q", st[max(0, len(st)-3):])
	}
	b.send("q")
	b.end()
}

// startChild starts this test binary as a server on dir and returns it
// and its address; the test's end kills it.
func startChild(t *testing.T, dir string) (*exec.Cmd, string) {
	t.Helper()
	cmd := exec.Command(os.Args[0], "-test.run=^$")
	cmd.Env = append(os.Environ(), childEnv+"="+dir)
	stdout, err := cmd.StdoutPipe()
	if err != nil {
		t.Fatal(err)
	}
	if err := cmd.Start(); err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() {
		cmd.Process.Kill()
		cmd.Wait()
	})
	line := make(chan string, 1)
	go func() {
		l, _ := bufio.NewReader(stdout).ReadString('\n')
		line <- strings.TrimSpace(l)
	}()
	select {
	case l := <-line:
		if _, _, err := net.SplitHostPort(l); err != nil {
			t.Fatalf("server child said %q", l)
		}
		return cmd, l
	case <-time.After(stall):
		t.Fatal("server child did not start")
	}
	return nil, ""
}

// TestWorksheetLimits: a worksheet limit refuses the statement with the
// app's own message and the session goes on; a readings file is refused.
func TestWorksheetLimits(t *testing.T) {
	a, dir, key := served(t, Config{Limits: sheet.Limits{Points: 50, Budget: 20}})
	a.send("\t", "sweep Zb from 10 Hz to 1 kHz points 51", "\r")
	a.wait("points takes a whole number from 2 to 50")
	a.send("\x15", "budget 60 s", "\r")
	a.wait("a budget lies from 0.1 s to 20 s here")
	// a served session opens no file on the server, whatever the limits
	a.send("\x15", "readings /etc/hostname", "\r")
	a.wait("files cannot be read here")
	a.send("\x15", "\x1b")
	a.enter("Zlim = 1+j1 Ω", "1.000 + j1.000 Ω")
	a.send("q")
	if out := a.end(); strings.Contains(out, "\r\nargand: ") {
		t.Errorf("the session was ended: %q", tail(out, 200))
	}
	if st := statements(t, dir, key); st[len(st)-1] != "Zlim = 1+j1 Ω" || slices.ContainsFunc(st, func(s string) bool { return strings.Contains(s, "points 51") }) {
		t.Errorf("saved %q", st[max(0, len(st)-2):])
	}
}

// TestClientLook: the look comes from each client's TERM, NO_COLOR and
// LANG, never from the server's environment (set here to the opposite).
func TestClientLook(t *testing.T) {
	t.Setenv("NO_COLOR", "1")
	t.Setenv("LANG", "C")
	t.Setenv("LC_ALL", "C")
	dir := t.TempDir()
	colour, plain := newKey(t), newKey(t)
	authorize(t, dir, colour, plain)
	r := start(t, Config{Dir: dir})
	run := func(key gossh.Signer, env map[string]string) string {
		c, err := dial(t, r.addr, key, r.srv.HostKey())
		if err != nil {
			t.Fatal(err)
		}
		defer c.Close()
		a := open(t, c, env)
		a.wait(ready)
		a.send("q")
		return a.end()
	}
	out := run(colour, map[string]string{"LANG": "en_GB.UTF-8"})
	if !strings.Contains(out, "\x1b[1;38;5;") || !strings.Contains(out, "∠") {
		t.Errorf("a UTF-8 colour client got no colour or no UTF-8: %q", tail(out, 300))
	}
	out = run(plain, map[string]string{"LANG": "C", "NO_COLOR": "1"})
	if strings.Contains(out, "38;5;") {
		t.Error("a NO_COLOR client got colour")
	}
	for i := 0; i < len(out); i++ {
		if out[i] >= 0x80 {
			t.Errorf("a client in the C locale got a byte %#x: %q", out[i], out[max(0, i-40):min(len(out), i+40)])
			break
		}
	}
	if !strings.Contains(out, "ohm") {
		t.Error("a client in the C locale got no ASCII units")
	}
}

// TestWindowAndTerminal: a window change reaches the app; a terminal that
// cannot address the screen is refused with one line, its name made safe.
func TestWindowAndTerminal(t *testing.T) {
	dir := t.TempDir()
	key := newKey(t)
	authorize(t, dir, key)
	r := start(t, Config{Dir: dir})
	c, err := dial(t, r.addr, key, r.srv.HostKey())
	if err != nil {
		t.Fatal(err)
	}
	defer c.Close()
	a := open(t, c, nil)
	a.wait(ready)
	if err := a.sess.WindowChange(10, 40); err != nil {
		t.Fatal(err)
	}
	a.wait("40×10; needs 40×20")
	// a phone's terminal held upright: the narrow layout, one pane
	if err := a.sess.WindowChange(20, 40); err != nil {
		t.Fatal(err)
	}
	a.wait("m → trail")
	if err := a.sess.WindowChange(30, 100); err != nil {
		t.Fatal(err)
	}
	a.wait(strings.Repeat("─", 60)) // a rule only a wider screen has
	a.send("q")
	a.end()

	for _, c2 := range []struct{ term, want string }{
		{"dumb", "argand: argand needs a terminal that can address the screen (TERM is dumb)\r\n"},
		{"", "argand: argand needs a terminal that can address the screen (TERM is not set)\r\n"},
	} {
		s, err := c.NewSession()
		if err != nil {
			t.Fatal(err)
		}
		if err := s.RequestPty(c2.term, 24, 80, gossh.TerminalModes{}); err != nil {
			t.Fatal(err)
		}
		var out syncBuffer
		s.Stdout = &out
		if err := s.Shell(); err != nil {
			t.Fatal(err)
		}
		s.Wait()
		if out.String() != c2.want {
			t.Errorf("TERM %q: %q, want %q", c2.term, out.String(), c2.want)
		}
	}
	if got := printableTerm("xterm\x1b]0;x\a"); got != "xterm??0?x?" {
		t.Errorf("printableTerm: %q", got)
	}
}
