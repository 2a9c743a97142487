package tui

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestLockFailureNeverTwoWriters: a session whose lock cannot be taken
// (here a directory stands where the lock file goes; a lock file of mode
// 0400 does the same for a user other than root) is not saved to. The
// user is told why and chooses a read-only view or a separate session,
// and no "restored" note takes the place of the failure. Before, the app
// said "saving anyway", the note was replaced at once, and two instances
// saved over each other.
func TestLockFailureNeverTwoWriters(t *testing.T) {
	dir := t.TempDir()
	first := newModel(t, Options{Dir: dir})
	typeLine(t, first, "Zkeep = 7 Ω")
	path := first.s.path
	first.Close()
	before, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	if err := os.Remove(path + ".lock"); err != nil {
		t.Fatal(err)
	}
	if err := os.Mkdir(path+".lock", 0o700); err != nil {
		t.Fatal(err)
	}

	m := newModel(t, Options{Dir: dir})
	v := m.View()
	if m.mode != modeLocked || !strings.Contains(v, "could not be locked") || !strings.Contains(v, "r   look at it without changing anything") {
		t.Fatalf("lock failure not asked about:\n%s", v)
	}
	press(m, "r")
	v = m.View()
	if !m.s.readOnly || !strings.Contains(v, "READ-ONLY") || !strings.HasPrefix(m.msg, "read-only:") {
		t.Fatalf("not read-only, or not said (%q):\n%s", m.msg, v)
	}
	if _, ok := m.s.sh.Lookup("Zkeep"); !ok {
		t.Errorf("the read-only view does not show the session")
	}
	press(m, "tab")
	for _, r := range "Zlost = 5 Ω" {
		m.Update(keyMsg(string(r)))
	}
	press(m, "enter")
	if fb := m.feedbackView(); !strings.HasPrefix(fb, "read-only: the session could not be locked") {
		t.Errorf("refusal reads %q", fb)
	}
	if after, _ := os.ReadFile(path); string(after) != string(before) {
		t.Errorf("the session file changed:\n%s", after)
	}

	sep := newModel(t, Options{Dir: dir})
	press(sep, "s")
	if sep.s.readOnly || sep.s.path == path || !strings.Contains(sep.msg, "separate session") {
		t.Fatalf("separate session: path %s, message %q", sep.s.path, sep.msg)
	}
	typeLine(t, sep, "Zsep = 2 Ω")
	if after, _ := os.ReadFile(path); string(after) != string(before) {
		t.Errorf("the separate session wrote into the first")
	}
}

// TestUnreadableSessionReadOnly: a session file that exists but cannot be
// read is reported with its path, left where it is, and the session opens
// read-only, so nothing is saved over it. Before, it was moved aside as
// corrupt.
func TestUnreadableSessionReadOnly(t *testing.T) {
	for _, c := range []struct {
		name  string
		setup func(t *testing.T, path string)
	}{
		{"a directory in its place", func(t *testing.T, path string) {
			os.Remove(path)
			os.Mkdir(path, 0o700)
		}},
		{"no permission", func(t *testing.T, path string) {
			if os.Geteuid() == 0 {
				// root reads any file: give it to another user instead,
				// which is refused the same way
				if err := os.Lchown(path, 65534, 65534); err != nil {
					t.Fatal(err)
				}
				return
			}
			os.Chmod(path, 0)
		}},
	} {
		t.Run(c.name, func(t *testing.T) {
			dir := t.TempDir()
			first := newModel(t, Options{Dir: dir})
			typeLine(t, first, "Zkeep = 7 Ω")
			path := first.s.path
			first.Close()
			c.setup(t, path)
			m := newModel(t, Options{Dir: dir})
			if !m.s.readOnly || !m.msgErr || !strings.Contains(m.msg, path) || !strings.HasPrefix(m.msg, "read-only:") {
				t.Fatalf("read-only %v, message %q", m.s.readOnly, m.msg)
			}
			if !strings.Contains(m.View(), "READ-ONLY") {
				t.Errorf("not shown read-only:\n%s", m.View())
			}
			if m.run("", "Zlost = 5 Ω") {
				t.Errorf("a read-only session took a change")
			}
			if moved, _ := filepath.Glob(path + ".corrupt-*"); len(moved) > 0 {
				t.Errorf("moved aside: %v", moved)
			}
			if _, err := os.Lstat(path); err != nil {
				t.Errorf("the session file is gone: %v", err)
			}
			// the lock is let go: this instance writes nothing
			other := newModel(t, Options{Dir: dir})
			if other.mode == modeLocked && other.lockScr.err == nil {
				t.Errorf("a read-only instance still holds the lock")
			}
		})
	}
}

// TestStateDirTightened: a state directory others can write to is made
// private on start, and the note says so beside "session restored".
func TestStateDirTightened(t *testing.T) {
	dir := t.TempDir()
	first := newModel(t, Options{Dir: dir})
	typeLine(t, first, "Zkeep = 7 Ω")
	first.Close()
	if err := os.Chmod(dir, 0o777); err != nil {
		t.Fatal(err)
	}
	m := newModel(t, Options{Dir: dir})
	if !strings.Contains(m.msg, "restored") || !strings.Contains(m.msg, "now private") {
		t.Errorf("message %q", m.msg)
	}
	if fi, _ := os.Stat(dir); fi.Mode().Perm() != 0o700 {
		t.Errorf("mode %o", fi.Mode().Perm())
	}
}

// TestPlainLockFailure: the line mode asks the same question.
func TestPlainLockFailure(t *testing.T) {
	state := t.TempDir()
	t.Setenv("XDG_STATE_HOME", state)
	if err := os.MkdirAll(filepath.Join(state, "argand", "session.json.lock"), 0o700); err != nil {
		t.Fatal(err)
	}
	out := plainRun(t, "r\nZz = 1 Ω\nquit\n")
	if !strings.Contains(out, "could not be locked") || !strings.Contains(out, "read-only: the session could not be locked; nothing is saved") {
		t.Errorf("line mode:\n%s", out)
	}
	if strings.Contains(out, "→ Zz") {
		t.Errorf("a change was taken:\n%s", out)
	}
}
