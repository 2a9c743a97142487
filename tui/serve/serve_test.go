package serve

import (
	"bytes"
	"context"
	"crypto/ed25519"
	"crypto/rand"
	"encoding/json"
	"fmt"
	"io"
	"log"
	"net"
	"os"
	"path/filepath"
	"strings"
	"sync"
	"testing"
	"time"

	gossh "golang.org/x/crypto/ssh"
)

// Every test here listens on 127.0.0.1 only, on a port the system picks,
// and bounds each wait; nothing is left running when a test ends.

// stall is the generous bound on any wait: it catches a hang, it does
// not time anything.
const stall = 60 * time.Second

// newKey makes a client key.
func newKey(t testing.TB) gossh.Signer {
	t.Helper()
	_, priv, err := ed25519.GenerateKey(rand.Reader)
	if err != nil {
		t.Fatal(err)
	}
	s, err := gossh.NewSignerFromKey(priv)
	if err != nil {
		t.Fatal(err)
	}
	return s
}

// authorize writes the keys into the authorized-keys file of dir.
func authorize(t testing.TB, dir string, keys ...gossh.Signer) {
	t.Helper()
	var b bytes.Buffer
	for _, k := range keys {
		b.Write(gossh.MarshalAuthorizedKey(k.PublicKey()))
	}
	if err := os.MkdirAll(dir, 0o700); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(filepath.Join(dir, "authorized_keys"), b.Bytes(), 0o600); err != nil {
		t.Fatal(err)
	}
}

// syncBuffer collects a session's output for the test to read.
type syncBuffer struct {
	mu sync.Mutex
	b  bytes.Buffer
}

func (s *syncBuffer) Write(p []byte) (int, error) {
	s.mu.Lock()
	defer s.mu.Unlock()
	return s.b.Write(p)
}

func (s *syncBuffer) String() string {
	s.mu.Lock()
	defer s.mu.Unlock()
	return s.b.String()
}

// logBuffer is a logger the test can read.
func logBuffer() (*log.Logger, *syncBuffer) {
	b := &syncBuffer{}
	return log.New(b, "", 0), b
}

// running is a server started for a test.
type running struct {
	srv  *Server
	addr string
	done chan error
}

// start runs a server on a loopback port until the test ends.
func start(t testing.TB, cfg Config) *running {
	t.Helper()
	srv, err := New(cfg)
	if err != nil {
		t.Fatal(err)
	}
	ln, err := net.Listen("tcp", "127.0.0.1:0")
	if err != nil {
		t.Fatal(err)
	}
	r := &running{srv: srv, addr: ln.Addr().String(), done: make(chan error, 1)}
	go func() { r.done <- srv.Serve(ln) }()
	t.Cleanup(func() { r.stop(t) })
	return r
}

func (r *running) stop(t testing.TB) {
	if r.srv == nil {
		return
	}
	ctx, cancel := context.WithTimeout(context.Background(), stall)
	defer cancel()
	if err := r.srv.Shutdown(ctx); err != nil {
		t.Errorf("shutdown: %v", err)
	}
	select {
	case <-r.done:
	case <-time.After(stall):
		t.Error("server did not stop")
	}
	r.srv = nil
}

// dial connects with key, trusting only the server's host key.
func dial(t testing.TB, addr string, key gossh.Signer, host gossh.PublicKey) (*gossh.Client, error) {
	t.Helper()
	return gossh.Dial("tcp", addr, &gossh.ClientConfig{
		User:            "anyone",
		Auth:            []gossh.AuthMethod{gossh.PublicKeys(key)},
		HostKeyCallback: gossh.FixedHostKey(host),
		Timeout:         stall,
	})
}

// app is one session of the app, driven by a script.
type app struct {
	t     testing.TB
	sess  *gossh.Session
	in    io.WriteCloser
	out   *syncBuffer
	ended chan error
}

// ready is on the app's last line once it has drawn its first screen.
const ready = " export"

// open starts the app in a session on c with a terminal of 80×24 and the
// served starts a server with cfg in a fresh directory, for one new key,
// and opens the app over a connection closed at the end of the test,
// ready for keys; it returns the app, the directory and the key.
func served(t *testing.T, cfg Config) (a *app, dir string, key gossh.Signer) {
	t.Helper()
	cfg.Dir = t.TempDir()
	key = newKey(t)
	authorize(t, cfg.Dir, key)
	r := start(t, cfg)
	c, err := dial(t, r.addr, key, r.srv.HostKey())
	if err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() { c.Close() })
	a = open(t, c, nil)
	a.wait(ready)
	return a, cfg.Dir, key
}

// given environment (nil: a UTF-8 locale).
func open(t testing.TB, c *gossh.Client, env map[string]string) *app {
	t.Helper()
	if env == nil {
		env = map[string]string{"LANG": "C.UTF-8"}
	}
	sess, err := c.NewSession()
	if err != nil {
		t.Fatal(err)
	}
	for k, v := range env {
		if err := sess.Setenv(k, v); err != nil {
			t.Fatalf("setenv %s: %v", k, err)
		}
	}
	if err := sess.RequestPty("xterm-256color", 24, 80, gossh.TerminalModes{}); err != nil {
		t.Fatal(err)
	}
	a := &app{t: t, sess: sess, out: &syncBuffer{}, ended: make(chan error, 1)}
	sess.Stdout = a.out
	sess.Stderr = a.out
	if a.in, err = sess.StdinPipe(); err != nil {
		t.Fatal(err)
	}
	if err := sess.Shell(); err != nil {
		t.Fatal(err)
	}
	go func() { a.ended <- sess.Wait() }()
	return a
}

// wait polls the output until it holds want.
func (a *app) wait(want string) {
	a.t.Helper()
	end := time.Now().Add(stall)
	for time.Now().Before(end) {
		if strings.Contains(a.out.String(), want) {
			return
		}
		time.Sleep(20 * time.Millisecond)
	}
	a.t.Fatalf("output never showed %q; it ends:\n%q", want, tail(a.out.String(), 600))
}

// waitFor polls b until it holds want.
func waitFor(t testing.TB, b *syncBuffer, want string) {
	t.Helper()
	for end := time.Now().Add(stall); time.Now().Before(end); time.Sleep(20 * time.Millisecond) {
		if strings.Contains(b.String(), want) {
			return
		}
	}
	t.Fatalf("never saw %q in:\n%s", want, b.String())
}

func tail(s string, n int) string {
	if len(s) > n {
		return s[len(s)-n:]
	}
	return s
}

// send types keys, one write each, with a pause that lets the app read
// them as separate keys.
func (a *app) send(keys ...string) {
	a.t.Helper()
	for _, k := range keys {
		if _, err := a.in.Write([]byte(k)); err != nil {
			a.t.Fatalf("typing %q: %v", k, err)
		}
		time.Sleep(30 * time.Millisecond)
	}
}

// end waits for the session to end, and returns its output.
func (a *app) end() string {
	a.t.Helper()
	select {
	case <-a.ended:
	case <-time.After(stall):
		a.t.Fatal("the session did not end")
	}
	return a.out.String()
}

// statements reads the statements of the session saved for key.
func statements(t testing.TB, dir string, key gossh.Signer) []string {
	t.Helper()
	data, err := os.ReadFile(filepath.Join(dir, "keys", keyDir(key.PublicKey()), "session.json"))
	if err != nil {
		t.Fatal(err)
	}
	var f struct {
		Statements []string `json:"statements"`
	}
	if err := json.Unmarshal(data, &f); err != nil {
		t.Fatal(err)
	}
	return f.Statements
}

// enter types a statement into the app and waits for its result.
func (a *app) enter(stmt, shows string) {
	a.t.Helper()
	a.send("\t")
	a.send(stmt)
	a.send("\r")
	a.wait(shows)
	a.send("\x1b")
}

func TestHostKeyKept(t *testing.T) {
	dir := filepath.Join(t.TempDir(), "state")
	k1, err := HostKey(dir)
	if err != nil {
		t.Fatal(err)
	}
	fi, err := os.Stat(filepath.Join(dir, hostKeyName))
	if err != nil {
		t.Fatal(err)
	}
	if fi.Mode().Perm() != 0o600 {
		t.Errorf("host key mode %04o, want 0600", fi.Mode().Perm())
	}
	if k1.PublicKey().Type() != gossh.KeyAlgoED25519 {
		t.Errorf("host key type %s", k1.PublicKey().Type())
	}
	k2, err := HostKey(dir)
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(k1.PublicKey().Marshal(), k2.PublicKey().Marshal()) {
		t.Error("the host key changed on the second start")
	}
	// a key others can read is refused, not replaced
	if err := os.Chmod(filepath.Join(dir, hostKeyName), 0o644); err != nil {
		t.Fatal(err)
	}
	if _, err := HostKey(dir); err == nil || !strings.Contains(err.Error(), "read by others") {
		t.Errorf("a host key of mode 0644 gave %v", err)
	}
	// not a key at all
	if err := os.WriteFile(filepath.Join(dir, hostKeyName), []byte("not a key"), 0o600); err != nil {
		t.Fatal(err)
	}
	if _, err := HostKey(dir); err == nil {
		t.Error("a damaged host key was accepted")
	}
}

func TestAuthorizedKeys(t *testing.T) {
	dir := t.TempDir()
	in, out := newKey(t), newKey(t)
	line := string(gossh.MarshalAuthorizedKey(in.PublicKey()))
	withOpts := `command="/bin/sh" ` + string(gossh.MarshalAuthorizedKey(out.PublicKey()))
	path := filepath.Join(dir, "authorized_keys")
	if err := os.WriteFile(path, []byte("# team\n\n"+line+withOpts+"garbage line\n"), 0o600); err != nil {
		t.Fatal(err)
	}
	if ok, err := authorized(path, in.PublicKey()); !ok || err != nil {
		t.Errorf("listed key: %v %v", ok, err)
	}
	// a line with options is not honoured by this server, so it lets no one in
	if ok, _ := authorized(path, out.PublicKey()); ok {
		t.Error("a key listed with options was let in")
	}
	n, skipped := ParseKeys([]byte("# team\n\n" + line + withOpts + "garbage line\n"))
	if n != 1 || fmt.Sprint(skipped) != "[4 5]" {
		t.Errorf("ParseKeys: %d keys, skipped %v; want 1 and [4 5]", n, skipped)
	}
	if _, err := authorized(filepath.Join(dir, "none"), in.PublicKey()); err == nil {
		t.Error("a missing file gave no error")
	}
}

// TestRefusals checks what the server will not do, with the library's
// own client: an unknown key, passwords, a command, a subsystem, agent
// and port forwarding.
func TestRefusals(t *testing.T) {
	dir := t.TempDir()
	key, stranger := newKey(t), newKey(t)
	authorize(t, dir, key)
	lg, logs := logBuffer()
	r := start(t, Config{Dir: dir, Log: lg})
	host := r.srv.HostKey()

	if c, err := dial(t, r.addr, stranger, host); err == nil {
		c.Close()
		t.Error("an unknown key was let in")
	}
	pw := &gossh.ClientConfig{User: "anyone", Auth: []gossh.AuthMethod{gossh.Password("secret"),
		gossh.KeyboardInteractive(func(string, string, []string, []bool) ([]string, error) { return []string{"secret"}, nil })},
		HostKeyCallback: gossh.FixedHostKey(host), Timeout: stall}
	if c, err := gossh.Dial("tcp", r.addr, pw); err == nil {
		c.Close()
		t.Error("a password was accepted")
	}

	c, err := dial(t, r.addr, key, host)
	if err != nil {
		t.Fatal(err)
	}
	defer c.Close()
	for _, req := range []struct {
		name string
		do   func(*gossh.Session) error
	}{
		{"exec", func(s *gossh.Session) error { return s.Start("cat /etc/passwd") }},
		{"subsystem", func(s *gossh.Session) error { return s.RequestSubsystem("sftp") }},
		{"agent", func(s *gossh.Session) error {
			ok, err := s.SendRequest("auth-agent-req@openssh.com", true, nil)
			if err == nil && !ok {
				return fmt.Errorf("refused")
			}
			return err
		}},
		{"x11", func(s *gossh.Session) error {
			ok, err := s.SendRequest("x11-req", true, gossh.Marshal(struct {
				Single        bool
				Proto, Cookie string
				Screen        uint32
			}{false, "MIT-MAGIC-COOKIE-1", "00", 0}))
			if err == nil && !ok {
				return fmt.Errorf("refused")
			}
			return err
		}},
	} {
		s, err := c.NewSession()
		if err != nil {
			t.Fatal(err)
		}
		if err := req.do(s); err == nil {
			t.Errorf("%s was accepted", req.name)
		}
		s.Close()
	}
	// local forwarding (a direct-tcpip channel) and remote forwarding (a
	// tcpip-forward request); the target is this test's own listener
	ln, err := net.Listen("tcp", "127.0.0.1:0")
	if err != nil {
		t.Fatal(err)
	}
	defer ln.Close()
	if fc, err := c.Dial("tcp", ln.Addr().String()); err == nil {
		fc.Close()
		t.Error("local port forwarding was accepted")
	}
	if rl, err := c.Listen("tcp", "127.0.0.1:0"); err == nil {
		rl.Close()
		t.Error("remote port forwarding was accepted")
	}
	// without a terminal: one line, nothing run
	s, err := c.NewSession()
	if err != nil {
		t.Fatal(err)
	}
	var out bytes.Buffer
	s.Stdout = &out
	if err := s.Shell(); err != nil {
		t.Fatal(err)
	}
	s.Wait()
	if got := out.String(); got != "argand: argand needs a terminal; connect with ssh -t\r\n" {
		t.Errorf("a shell without a terminal gave %q", got)
	}
	c.Close()
	for _, want := range []string{"reason=unknown-key", "request=exec", "request=subsystem", "request=auth-agent-req@openssh.com", "reason=no-terminal"} {
		waitFor(t, logs, want)
	}
	if strings.Contains(logs.String(), "passwd") {
		t.Error("the log holds the refused command's text")
	}
}

// TestUnauthenticated: a connection that never logs in is dropped after
// the handshake time, and beyond twice the session limit and eight more,
// connections are closed unanswered.
func TestUnauthenticated(t *testing.T) {
	dir := t.TempDir()
	authorize(t, dir, newKey(t))
	lg, logs := logBuffer()
	r := start(t, Config{Dir: dir, MaxSessions: 1, Handshake: 500 * time.Millisecond, Log: lg})
	var conns []net.Conn
	defer func() {
		for _, c := range conns {
			c.Close()
		}
	}()
	banner := func(c net.Conn) string {
		c.SetReadDeadline(time.Now().Add(stall))
		b := make([]byte, 64)
		n, _ := c.Read(b)
		return string(b[:n])
	}
	for i := 0; i < 2*1+8; i++ {
		c, err := net.Dial("tcp", r.addr)
		if err != nil {
			t.Fatal(err)
		}
		conns = append(conns, c)
		if got := banner(c); !strings.HasPrefix(got, "SSH-2.0-argand") {
			t.Fatalf("connection %d: %q", i+1, got)
		}
	}
	extra, err := net.Dial("tcp", r.addr)
	if err != nil {
		t.Fatal(err)
	}
	defer extra.Close()
	if got := banner(extra); got != "" {
		t.Errorf("connection 11 was answered: %q", got)
	}
	waitFor(t, logs, "reason=too-many-connections")
	// the silent ones are dropped: a read ends, well before the stall bound
	began := time.Now()
	b := make([]byte, 256)
	conns[0].SetReadDeadline(time.Now().Add(stall))
	for {
		if _, err := conns[0].Read(b); err != nil {
			break
		}
	}
	if time.Since(began) >= stall {
		t.Error("a silent connection was kept")
	}
	t.Logf("a silent connection was dropped %s after its banner", time.Since(began).Round(time.Millisecond))
}
