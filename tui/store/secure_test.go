//go:build linux || darwin || freebsd || netbsd || openbsd || dragonfly

package store

import (
	"errors"
	"io/fs"
	"os"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"
)

func mkfifo(path string) error { return syscall.Mkfifo(path, 0o600) }

// nobody is a user ID that is not the test's own, for files that belong
// to another user (65534 is the conventional "nobody", from memory).
const nobody = 65534

// asOtherUser chowns path to another user; only root can, so without
// root the case is skipped.
func asOtherUser(t *testing.T, path string) {
	t.Helper()
	if os.Geteuid() != 0 {
		t.Skip("needs root to give a file to another user")
	}
	if err := os.Lchown(path, nobody, nobody); err != nil {
		t.Fatal(err)
	}
}

// TestLockRefuses is the catalogue of lock files and state directories
// that Lock must refuse without touching anything else: each case failed
// on the code before it (a link was followed and its target truncated;
// the state directory was used whoever owned it).
func TestLockRefuses(t *testing.T) {
	cases := []struct {
		name  string
		setup func(t *testing.T, dir, path string)
		want  string // in the message
	}{
		{"symbolic link at the lock", func(t *testing.T, dir, path string) {
			target := filepath.Join(t.TempDir(), "precious")
			if err := os.WriteFile(target, []byte("keep me"), 0o600); err != nil {
				t.Fatal(err)
			}
			if err := os.Symlink(target, path+".lock"); err != nil {
				t.Fatal(err)
			}
			t.Cleanup(func() {
				if b, _ := os.ReadFile(target); string(b) != "keep me" {
					t.Errorf("the link's target was changed to %q", b)
				}
			})
		}, "symbolic link"},
		{"dangling link at the lock", func(t *testing.T, dir, path string) {
			target := filepath.Join(t.TempDir(), "made")
			if err := os.Symlink(target, path+".lock"); err != nil {
				t.Fatal(err)
			}
			t.Cleanup(func() {
				if _, err := os.Lstat(target); !errors.Is(err, fs.ErrNotExist) {
					t.Errorf("a file was created through the link")
				}
			})
		}, "symbolic link"},
		{"directory at the lock", func(t *testing.T, dir, path string) {
			if err := os.Mkdir(path+".lock", 0o700); err != nil {
				t.Fatal(err)
			}
		}, "directory"},
		{"FIFO at the lock", func(t *testing.T, dir, path string) {
			if err := mkfifo(path + ".lock"); err != nil {
				t.Skip(err)
			}
		}, "not a regular file"},
		{"lock file of another user", func(t *testing.T, dir, path string) {
			if err := os.WriteFile(path+".lock", nil, 0o600); err != nil {
				t.Fatal(err)
			}
			asOtherUser(t, path+".lock")
		}, "another user"},
		{"state directory of another user", func(t *testing.T, dir, path string) {
			asOtherUser(t, dir)
		}, "another user"},
		{"state directory is a file", func(t *testing.T, dir, path string) {
			if err := os.Remove(dir); err != nil {
				t.Fatal(err)
			}
			if err := os.WriteFile(dir, nil, 0o600); err != nil {
				t.Fatal(err)
			}
		}, "not a directory"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			dir := filepath.Join(t.TempDir(), "argand")
			if err := os.Mkdir(dir, 0o700); err != nil {
				t.Fatal(err)
			}
			path := filepath.Join(dir, "session.json")
			c.setup(t, dir, path)
			lk, err := Lock(path)
			if err == nil {
				lk.Unlock()
				t.Fatal("Lock succeeded")
			}
			if errors.Is(err, ErrLocked) {
				t.Errorf("reported as held by another process: %v", err)
			}
			if !strings.Contains(err.Error(), c.want) {
				t.Errorf("message %q, want %q in it", err, c.want)
			}
		})
	}
}

// TestPrepareDir: a new state directory is private; one that others can
// write to is tightened and said so; a private one is left as it is.
func TestPrepareDir(t *testing.T) {
	base := t.TempDir()
	fresh := filepath.Join(base, "a", "argand")
	note, err := PrepareDir(fresh)
	if err != nil || note != "" {
		t.Fatalf("new directory: %q, %v", note, err)
	}
	if fi, _ := os.Stat(fresh); fi.Mode().Perm() != 0o700 {
		t.Errorf("new directory mode %o, want 0700", fi.Mode().Perm())
	}
	open := filepath.Join(base, "open")
	if err := os.Mkdir(open, 0o700); err != nil {
		t.Fatal(err)
	}
	os.Chmod(open, 0o777)
	note, err = PrepareDir(open)
	if err != nil || !strings.Contains(note, "now private") || !strings.Contains(note, "0777") {
		t.Errorf("open directory: %q, %v", note, err)
	}
	if fi, _ := os.Stat(open); fi.Mode().Perm() != 0o700 {
		t.Errorf("open directory left at mode %o", fi.Mode().Perm())
	}
	// readable by the group but not writable: not a risk to the session
	// being changed, so left alone
	shared := filepath.Join(base, "shared")
	os.Mkdir(shared, 0o750)
	os.Chmod(shared, 0o750)
	if note, err := PrepareDir(shared); err != nil || note != "" {
		t.Errorf("0750 directory: %q, %v", note, err)
	}
	// the lock says what it changed
	os.Chmod(open, 0o757)
	lk, err := Lock(filepath.Join(open, "session.json"))
	if err != nil {
		t.Fatal(err)
	}
	defer lk.Unlock()
	if n := lk.Notes(); len(n) != 1 || !strings.Contains(n[0], "now private") {
		t.Errorf("lock notes %q", n)
	}
}

// TestStaleTemps: leftover temporary files of a killed save are removed
// when the lock is taken, and only those: older than StaleAge, of this
// session, regular files.
func TestStaleTemps(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "session.json")
	old := time.Now().Add(-2 * StaleAge)
	mk := func(name string, mtime time.Time) string {
		p := filepath.Join(dir, name)
		if err := os.WriteFile(p, []byte("partial"), 0o600); err != nil {
			t.Fatal(err)
		}
		os.Chtimes(p, mtime, mtime)
		return p
	}
	stale1 := mk(".session.json.tmp-abc", old)
	stale2 := mk(".session.json.tmp-123", old)
	recent := mk(".session.json.tmp-new", time.Now())
	other := mk(".session-2.json.tmp-abc", old)
	plain := mk("session.json.tmp-abc", old)
	target := mk("elsewhere", old)
	link := filepath.Join(dir, ".session.json.tmp-link")
	os.Symlink(target, link)

	lk, err := Lock(path)
	if err != nil {
		t.Fatal(err)
	}
	defer lk.Unlock()
	for _, p := range []string{stale1, stale2} {
		if _, err := os.Lstat(p); !errors.Is(err, fs.ErrNotExist) {
			t.Errorf("%s not removed", filepath.Base(p))
		}
	}
	for _, p := range []string{recent, other, plain, target, link} {
		if _, err := os.Lstat(p); err != nil {
			t.Errorf("%s removed: %v", filepath.Base(p), err)
		}
	}
	if n := lk.Notes(); len(n) != 1 || !strings.Contains(n[0], "removed 2 temporary file(s) of an interrupted save") {
		t.Errorf("lock notes %q", n)
	}
	// a second lock is refused and removes nothing: only the holder may
	mk(".session.json.tmp-late", old)
	if _, err := Lock(path); !errors.Is(err, ErrLocked) {
		t.Fatalf("second lock: %v", err)
	}
	if _, err := os.Lstat(filepath.Join(dir, ".session.json.tmp-late")); err != nil {
		t.Errorf("a lock that was not taken removed a file: %v", err)
	}
}

// TestLoadCheckedUnreadable: a session file that exists but cannot be
// read is reported with its path and left where it is; only damaged
// content is moved aside.
func TestLoadCheckedUnreadable(t *testing.T) {
	check := func([]byte) error { return nil }
	cases := []struct {
		name  string
		setup func(t *testing.T, path string)
		want  string
	}{
		{"no permission", func(t *testing.T, path string) {
			if os.Geteuid() == 0 {
				t.Skip("root reads any file")
			}
			os.WriteFile(path, []byte("ok"), 0o600)
			os.Chmod(path, 0)
		}, "permission denied"},
		{"directory", func(t *testing.T, path string) {
			os.Mkdir(path, 0o700)
		}, "not a regular file"},
		{"symbolic link", func(t *testing.T, path string) {
			target := filepath.Join(t.TempDir(), "x")
			os.WriteFile(target, []byte("ok"), 0o600)
			os.Symlink(target, path)
		}, "symbolic link"},
		{"another user's", func(t *testing.T, path string) {
			os.WriteFile(path, []byte("ok"), 0o600)
			asOtherUser(t, path)
		}, "another user"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			dir := t.TempDir()
			path := filepath.Join(dir, "session.json")
			c.setup(t, path)
			_, err := LoadChecked(path, check)
			var ue *UnreadableError
			if !errors.As(err, &ue) || ue.Path != path {
				t.Fatalf("err = %v, want *UnreadableError for %s", err, path)
			}
			if !strings.Contains(err.Error(), path) || !strings.Contains(err.Error(), c.want) {
				t.Errorf("message %q lacks the path or %q", err, c.want)
			}
			if moved, _ := filepath.Glob(path + ".corrupt-*"); len(moved) > 0 {
				t.Errorf("moved aside: %v", moved)
			}
			if _, err := os.Lstat(path); err != nil {
				t.Errorf("the file is gone: %v", err)
			}
		})
	}
}
