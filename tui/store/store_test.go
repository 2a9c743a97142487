package store

import (
	"bufio"
	"bytes"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"math/rand/v2"
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
	"syscall"
	"testing"
	"time"
)

// childEnv selects a helper role when the test binary runs itself as a
// child process (the os/exec self-exec pattern).
const childEnv = "ARGAND_STORE_TEST_CHILD"

func TestMain(m *testing.M) {
	switch os.Getenv(childEnv) {
	case "lock":
		childLock(os.Getenv("ARGAND_STORE_TEST_PATH"))
		return
	case "save":
		childSave(os.Getenv("ARGAND_STORE_TEST_PATH"))
		return
	}
	os.Exit(m.Run())
}

// childLock takes the lock, says so, and holds it until stdin closes.
func childLock(path string) {
	l, err := Lock(path)
	if err != nil {
		fmt.Println("error:", err)
		os.Exit(3)
	}
	fmt.Println("locked")
	io.Copy(io.Discard, os.Stdin)
	l.Unlock()
	os.Exit(0)
}

// childSave saves numbered versions of a large file until killed.
func childSave(path string) {
	for n := 1; ; n++ {
		if err := Save(path, version(n)); err != nil {
			fmt.Println("error:", err)
			os.Exit(3)
		}
		if n == 1 {
			fmt.Println("saving")
		}
	}
}

// version is the content of save number n: a header line and a body that
// repeats n, so a torn or mixed file is detectable.
func version(n int) []byte {
	line := fmt.Sprintf("entry %d\n", n)
	return []byte("version " + strconv.Itoa(n) + "\n" + strings.Repeat(line, 20000))
}

func checkVersion(data []byte) (int, error) {
	head, body, ok := bytes.Cut(data, []byte("\n"))
	if !ok {
		return 0, errors.New("no header")
	}
	n, err := strconv.Atoi(strings.TrimPrefix(string(head), "version "))
	if err != nil {
		return 0, err
	}
	if !bytes.Equal(append(append([]byte{}, head...), append([]byte("\n"), body...)...), version(n)) {
		return n, fmt.Errorf("version %d: body does not match", n)
	}
	return n, nil
}

func TestDir(t *testing.T) {
	t.Setenv("HOME", "/home/someone")
	tests := []struct{ xdg, want string }{
		{"/var/state", "/var/state/argand"},
		{"", "/home/someone/.local/state/argand"},
		// Relative paths are ignored (XDG Base Directory Specification).
		{"relative/state", "/home/someone/.local/state/argand"},
	}
	for _, tt := range tests {
		t.Setenv("XDG_STATE_HOME", tt.xdg)
		got, err := Dir()
		if err != nil || got != tt.want {
			t.Errorf("XDG_STATE_HOME=%q: Dir() = %q, %v; want %q", tt.xdg, got, err, tt.want)
		}
	}
}

// A file the user asks for by name (a record, an export) is readable by
// others; the session's own files stay private. Chmod on the temporary
// file sets the mode whatever the umask.
func TestPublishMode(t *testing.T) {
	dir := t.TempDir()
	for _, tt := range []struct {
		save func(string, []byte) error
		want os.FileMode
	}{{Publish, 0o644}, {Save, 0o600}} {
		path := filepath.Join(dir, fmt.Sprintf("f%o", tt.want))
		for range 2 { // a new file, then one replaced
			if err := tt.save(path, []byte("job\n")); err != nil {
				t.Fatal(err)
			}
			fi, err := os.Stat(path)
			if err != nil {
				t.Fatal(err)
			}
			if fi.Mode().Perm() != tt.want {
				t.Errorf("%s: mode %v, want %v", path, fi.Mode().Perm(), tt.want)
			}
		}
	}
}

func TestSaveLoad(t *testing.T) {
	path := filepath.Join(t.TempDir(), "sub", "session.argand")
	for _, data := range [][]byte{[]byte("first\n"), {}, []byte("second, longer than the first\n"), []byte("3")} {
		if err := Save(path, data); err != nil {
			t.Fatal(err)
		}
		got, err := Load(path)
		if err != nil || !bytes.Equal(got, data) {
			t.Fatalf("Load = %q, %v; want %q", got, err, data)
		}
	}
	fi, err := os.Stat(path)
	if err != nil {
		t.Fatal(err)
	}
	if fi.Mode().Perm() != 0o600 {
		t.Errorf("mode %v, want 0600", fi.Mode().Perm())
	}
	entries, _ := os.ReadDir(filepath.Dir(path))
	if len(entries) != 1 {
		t.Errorf("directory holds %d files, want only the session", len(entries))
	}
}

func TestLoadMissing(t *testing.T) {
	_, err := Load(filepath.Join(t.TempDir(), "none"))
	if !errors.Is(err, fs.ErrNotExist) {
		t.Errorf("err = %v, want fs.ErrNotExist", err)
	}
}

func TestLoadTooLarge(t *testing.T) {
	path := filepath.Join(t.TempDir(), "big")
	f, err := os.Create(path)
	if err != nil {
		t.Fatal(err)
	}
	if err := f.Truncate(MaxSize + 1); err != nil {
		t.Fatal(err)
	}
	f.Close()
	if _, err := Load(path); err == nil {
		t.Error("Load of an oversized file succeeded")
	}
}

// TestInterruptedSave stops a save after the temporary file is written and
// before the rename, as a crash would: the old content stays intact.
func TestInterruptedSave(t *testing.T) {
	path := filepath.Join(t.TempDir(), "session")
	old := []byte("old content\n")
	if err := Save(path, old); err != nil {
		t.Fatal(err)
	}
	tmp, err := writeTemp(path, []byte("new content that never landed\n"), 0o600)
	if err != nil {
		t.Fatal(err)
	}
	if filepath.Dir(tmp) != filepath.Dir(path) {
		t.Errorf("temporary file %s not beside %s", tmp, path)
	}
	got, err := Load(path)
	if err != nil || !bytes.Equal(got, old) {
		t.Errorf("after interrupted save: %q, %v; want %q", got, err, old)
	}
	// A later save still works with the stale temporary file present.
	if err := Save(path, []byte("next")); err != nil {
		t.Fatal(err)
	}
	if got, _ := Load(path); string(got) != "next" {
		t.Errorf("got %q after next save", got)
	}
}

// TestKilledWhileSaving kills a child that saves in a loop at random
// moments; the file always holds one complete version.
func TestKilledWhileSaving(t *testing.T) {
	if testing.Short() {
		t.Skip("starts child processes")
	}
	path := filepath.Join(t.TempDir(), "session")
	rng := rand.New(rand.NewPCG(1, 2))
	most := 0
	for i := 0; i < 20; i++ {
		cmd := exec.Command(os.Args[0], "-test.run=^$")
		cmd.Env = append(os.Environ(), childEnv+"=save", "ARGAND_STORE_TEST_PATH="+path)
		out, err := cmd.StdoutPipe()
		if err != nil {
			t.Fatal(err)
		}
		if err := cmd.Start(); err != nil {
			t.Fatal(err)
		}
		line, _ := bufio.NewReader(out).ReadString('\n')
		if line != "saving\n" {
			cmd.Process.Kill()
			cmd.Wait()
			t.Fatalf("child said %q", line)
		}
		time.Sleep(time.Duration(rng.IntN(100000)) * time.Microsecond)
		cmd.Process.Signal(syscall.SIGKILL)
		cmd.Wait()
		data, err := Load(path)
		if err != nil {
			t.Fatalf("kill %d: %v", i, err)
		}
		n, err := checkVersion(data)
		if err != nil {
			t.Fatalf("kill %d: %v", i, err)
		}
		most = max(most, n)
	}
	t.Logf("highest version seen after a kill: %d", most)
}

func TestMoveAside(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "session")
	var names []string
	for i := 0; i < 3; i++ {
		content := []byte("garbage " + strconv.Itoa(i))
		if err := Save(path, content); err != nil {
			t.Fatal(err)
		}
		moved, err := MoveAside(path)
		if err != nil {
			t.Fatal(err)
		}
		if !strings.HasPrefix(moved, path+".corrupt-") {
			t.Errorf("moved to %s", moved)
		}
		if got, err := os.ReadFile(moved); err != nil || !bytes.Equal(got, content) {
			t.Errorf("moved file holds %q, %v", got, err)
		}
		if _, err := os.Stat(path); !errors.Is(err, fs.ErrNotExist) {
			t.Errorf("session still present after MoveAside: %v", err)
		}
		names = append(names, moved)
	}
	// Within one second the names must still differ.
	if names[0] == names[1] || names[1] == names[2] || names[0] == names[2] {
		t.Errorf("names collide: %v", names)
	}
}

func TestLoadChecked(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "session")
	check := func(b []byte) error {
		if !bytes.HasPrefix(b, []byte("ok")) {
			return errors.New("bad header")
		}
		return nil
	}
	if _, err := LoadChecked(path, check); !errors.Is(err, fs.ErrNotExist) {
		t.Errorf("missing: err = %v", err)
	}
	Save(path, []byte("ok fine"))
	if got, err := LoadChecked(path, check); err != nil || string(got) != "ok fine" {
		t.Errorf("valid: %q, %v", got, err)
	}
	Save(path, []byte("\x00\xff junk"))
	_, err := LoadChecked(path, check)
	var ce *CorruptError
	if !errors.As(err, &ce) {
		t.Fatalf("corrupt: err = %v, want *CorruptError", err)
	}
	if ce.Err.Error() != "bad header" || ce.Path != path {
		t.Errorf("CorruptError = %+v", ce)
	}
	if got, _ := os.ReadFile(ce.MovedTo); string(got) != "\x00\xff junk" {
		t.Errorf("moved content %q", got)
	}
	if _, err := os.Stat(path); !errors.Is(err, fs.ErrNotExist) {
		t.Errorf("corrupt file still in place")
	}
}

// TestLockSameProcess: flock belongs to the open file description, so two
// opens in one process exclude each other (flock(2) manual page).
func TestLockSameProcess(t *testing.T) {
	path := filepath.Join(t.TempDir(), "session")
	a, err := Lock(path)
	if err != nil {
		t.Fatal(err)
	}
	_, err = Lock(path)
	var le *LockedError
	if !errors.As(err, &le) || !errors.Is(err, ErrLocked) {
		t.Fatalf("second Lock: err = %v, want *LockedError", err)
	}
	if le.PID != os.Getpid() {
		t.Errorf("holder PID %d, want %d", le.PID, os.Getpid())
	}
	if err := a.Unlock(); err != nil {
		t.Fatal(err)
	}
	if err := a.Unlock(); err != nil {
		t.Errorf("second Unlock: %v", err)
	}
	b, err := Lock(path)
	if err != nil {
		t.Fatalf("Lock after Unlock: %v", err)
	}
	b.Unlock()
}

// TestLockNewDir locks a session whose directory does not exist yet, as on
// the very first start with an empty state directory.
func TestLockNewDir(t *testing.T) {
	path := filepath.Join(t.TempDir(), "state", "argand", "session.json")
	a, err := Lock(path)
	if err != nil {
		t.Fatalf("Lock in a new directory: %v", err)
	}
	defer a.Unlock()
	if _, err := Lock(path); !errors.Is(err, ErrLocked) {
		t.Errorf("second Lock: err = %v, want ErrLocked", err)
	}
}

func TestLockOtherProcess(t *testing.T) {
	if testing.Short() {
		t.Skip("starts a child process")
	}
	path := filepath.Join(t.TempDir(), "session")
	cmd := exec.Command(os.Args[0], "-test.run=^$")
	cmd.Env = append(os.Environ(), childEnv+"=lock", "ARGAND_STORE_TEST_PATH="+path)
	stdin, err := cmd.StdinPipe()
	if err != nil {
		t.Fatal(err)
	}
	stdout, err := cmd.StdoutPipe()
	if err != nil {
		t.Fatal(err)
	}
	if err := cmd.Start(); err != nil {
		t.Fatal(err)
	}
	defer cmd.Process.Kill()
	line, _ := bufio.NewReader(stdout).ReadString('\n')
	if line != "locked\n" {
		t.Fatalf("child said %q", line)
	}
	_, err = Lock(path)
	var le *LockedError
	if !errors.As(err, &le) {
		t.Fatalf("Lock while child holds it: err = %v", err)
	}
	if le.PID != cmd.Process.Pid {
		t.Errorf("holder PID %d, want child %d", le.PID, cmd.Process.Pid)
	}
	if !strings.Contains(err.Error(), strconv.Itoa(cmd.Process.Pid)) {
		t.Errorf("message %q does not name the holder", err)
	}
	stdin.Close()
	if err := cmd.Wait(); err != nil {
		t.Fatal(err)
	}
	l, err := Lock(path)
	if err != nil {
		t.Fatalf("Lock after child released: %v", err)
	}
	l.Unlock()
}

// TestLockReleasedOnKill: a crashed holder does not keep the session
// locked, because the kernel drops flock locks when the file closes.
func TestLockReleasedOnKill(t *testing.T) {
	if testing.Short() {
		t.Skip("starts a child process")
	}
	path := filepath.Join(t.TempDir(), "session")
	cmd := exec.Command(os.Args[0], "-test.run=^$")
	cmd.Env = append(os.Environ(), childEnv+"=lock", "ARGAND_STORE_TEST_PATH="+path)
	stdin, _ := cmd.StdinPipe()
	defer stdin.Close()
	stdout, _ := cmd.StdoutPipe()
	if err := cmd.Start(); err != nil {
		t.Fatal(err)
	}
	line, _ := bufio.NewReader(stdout).ReadString('\n')
	if line != "locked\n" {
		cmd.Process.Kill()
		t.Fatalf("child said %q", line)
	}
	cmd.Process.Signal(syscall.SIGKILL)
	cmd.Wait()
	l, err := Lock(path)
	if err != nil {
		t.Fatalf("Lock after holder was killed: %v", err)
	}
	l.Unlock()
}
