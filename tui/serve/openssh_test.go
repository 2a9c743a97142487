package serve

import (
	"bytes"
	"context"
	"crypto/ed25519"
	"crypto/rand"
	"encoding/base64"
	"encoding/pem"
	"io"
	"net"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
	"time"

	gossh "golang.org/x/crypto/ssh"
)

// keyFile makes a client key and writes its private half where the
// OpenSSH client can read it (0600).
func keyFile(t *testing.T, dir, name string) (gossh.Signer, string) {
	t.Helper()
	_, priv, err := ed25519.GenerateKey(rand.Reader)
	if err != nil {
		t.Fatal(err)
	}
	block, err := gossh.MarshalPrivateKey(priv, "")
	if err != nil {
		t.Fatal(err)
	}
	path := filepath.Join(dir, name)
	if err := os.WriteFile(path, pem.EncodeToMemory(block), 0o600); err != nil {
		t.Fatal(err)
	}
	s, err := gossh.NewSignerFromKey(priv)
	if err != nil {
		t.Fatal(err)
	}
	return s, path
}

// TestOpenSSHClient is the smoke test with the OpenSSH client: an unknown
// key is refused, a command, a subsystem and port forwarding are refused,
// OSC 52 reaches the client, and the host key is the same after a
// restart.
func TestOpenSSHClient(t *testing.T) {
	if testing.Short() {
		t.Skip("runs the OpenSSH client")
	}
	sshPath, err := exec.LookPath("ssh")
	if err != nil {
		t.Skip("the OpenSSH client (ssh) is not installed; .ci/run installs it (openssh-client)")
	}
	work := t.TempDir()
	dir := filepath.Join(work, "state")
	key, keyPath := keyFile(t, work, "key")
	_, strangerPath := keyFile(t, work, "stranger")
	authorize(t, dir, key)
	knownHosts := filepath.Join(work, "known_hosts")

	lg, logs := logBuffer()
	r := start(t, Config{Dir: dir, Log: lg})
	_, port, _ := net.SplitHostPort(r.addr)

	// ssh runs the client against the server, bounded in time; strict
	// is the host key checking: accept-new on the first contact, yes
	// after. The alias keeps one known-hosts entry whatever the port.
	ssh := func(strict string, stdin io.Reader, args ...string) (string, int) {
		t.Helper()
		ctx, cancel := context.WithTimeout(context.Background(), stall)
		defer cancel()
		base := []string{"-F", "/dev/null", "-p", port,
			"-o", "BatchMode=yes", "-o", "IdentitiesOnly=yes", "-o", "IdentityAgent=none",
			"-o", "PasswordAuthentication=no", "-o", "KbdInteractiveAuthentication=no",
			"-o", "UserKnownHostsFile=" + knownHosts, "-o", "GlobalKnownHostsFile=/dev/null",
			"-o", "HostKeyAlias=argand-test", "-o", "StrictHostKeyChecking=" + strict,
			"-o", "ConnectTimeout=10", "-o", "LogLevel=ERROR"}
		cmd := exec.CommandContext(ctx, sshPath, append(base, args...)...)
		cmd.Env = append(os.Environ(), "TERM=xterm-256color", "LANG=C.UTF-8")
		cmd.Stdin = stdin
		var out bytes.Buffer
		cmd.Stdout, cmd.Stderr = &out, &out
		err := cmd.Run()
		code := 0
		if ee, ok := err.(*exec.ExitError); ok {
			code = ee.ExitCode()
		} else if err != nil {
			t.Fatalf("ssh: %v", err)
		}
		return out.String(), code
	}

	// the first contact records the host key
	out, code := ssh("accept-new", nil, "-i", strangerPath, "127.0.0.1")
	if code != 255 || !strings.Contains(out, "Permission denied (publickey)") {
		t.Errorf("unknown key: exit %d, %q", code, out)
	}
	for _, c := range []struct {
		what string
		args []string
		want string
	}{
		{"a command", []string{"127.0.0.1", "cat", "/etc/passwd"}, "exec request failed"},
		{"a subsystem", []string{"-s", "127.0.0.1", "sftp"}, "subsystem request failed"},
		{"forwarding to a port", []string{"-W", r.addr, "127.0.0.1"}, "forwarding failed"},
		{"forwarding from a port", []string{"-N", "-o", "ExitOnForwardFailure=yes", "-R", "127.0.0.1:0:" + r.addr, "127.0.0.1"}, "forwarding failed"},
	} {
		out, code := ssh("yes", nil, append([]string{"-i", keyPath}, c.args...)...)
		if code == 0 || !strings.Contains(out, c.want) {
			t.Errorf("%s: exit %d, %q; want a refusal (%q)", c.what, code, out, c.want)
		}
		if strings.Contains(out, "root:") {
			t.Errorf("%s ran", c.what)
		}
	}

	// the app: copy the selected row and quit; the keys come through a
	// pipe, so -tt asks for a terminal all the same
	pr, pw, err := os.Pipe()
	if err != nil {
		t.Fatal(err)
	}
	go func() {
		time.Sleep(1500 * time.Millisecond) // the first screen is drawn
		pw.Write([]byte("\x0f"))            // ctrl+o: the value to the clipboard
		time.Sleep(1500 * time.Millisecond) // the copy is sent
		pw.Write([]byte("q"))
	}()
	out, code = ssh("yes", pr, "-tt", "-i", keyPath, "127.0.0.1")
	pr.Close()
	pw.Close()
	if code != 0 {
		t.Errorf("the app over ssh: exit %d", code)
	}
	m := regexp.MustCompile("\x1b\\]52;c;([A-Za-z0-9+/=]+)\a").FindStringSubmatch(out)
	if m == nil {
		t.Errorf("no OSC 52 request reached the client; output ends %q", tail(out, 300))
	} else if text, err := base64.StdEncoding.DecodeString(m[1]); err != nil || len(text) == 0 {
		t.Errorf("OSC 52 payload %q: %v", m[1], err)
	}

	// a restart on the same state directory keeps the host key: strict
	// checking against the entry made on the first contact lets us in
	hostBefore := r.srv.HostKey().Marshal()
	r.stop(t)
	r = start(t, Config{Dir: dir, Log: lg})
	_, port, _ = net.SplitHostPort(r.addr)
	if !bytes.Equal(hostBefore, r.srv.HostKey().Marshal()) {
		t.Error("the host key changed on restart")
	}
	out, code = ssh("yes", strings.NewReader("q"), "-tt", "-i", keyPath, "127.0.0.1")
	if code != 0 || strings.Contains(out, "HOST IDENTIFICATION HAS CHANGED") {
		t.Errorf("after the restart: exit %d, %q", code, tail(out, 300))
	}
	waitFor(t, logs, "request=exec")
	waitFor(t, logs, "request=subsystem")
}
