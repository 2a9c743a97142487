package store

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"strconv"
	"strings"
)

// ErrLocked is wrapped by the *LockedError that Lock returns when another
// process (or another open of the same file) holds the session.
var ErrLocked = errors.New("session in use")

// LockedError reports a session held by someone else.
type LockedError struct {
	Path string // the lock file
	PID  int    // process ID written by the holder; 0 if unknown
}

func (e *LockedError) Error() string {
	if e.PID > 0 {
		return fmt.Sprintf("%v by process %d (%s)", ErrLocked, e.PID, e.Path)
	}
	return fmt.Sprintf("%v (%s)", ErrLocked, e.Path)
}

func (e *LockedError) Unwrap() error { return ErrLocked }

// FileLock is a held session lock.
type FileLock struct {
	f *os.File
}

// Lock takes an exclusive, non-blocking lock on path + ".lock", creating it
// (and its directory, as Save would) if needed, and writes this process's
// ID into it. The directory is made here so that the very first start,
// before any session was saved, is locked like every later one. If the
// lock is held elsewhere it returns a *LockedError (errors.Is(err, ErrLocked)) naming
// the holder's PID, so the app can offer a read-only view or a separate
// session.
//
// The lock is flock(2): it belongs to the open file description, so it is
// released when the holder calls Unlock, exits or is killed, and two opens
// within one process exclude each other. The lock file is never removed:
// removing it would let one process lock the old file while another locks
// a new one. flock is advisory and may not work on network file systems.
func Lock(path string) (*FileLock, error) {
	name := path + ".lock"
	if err := os.MkdirAll(filepath.Dir(name), 0o700); err != nil {
		return nil, fmt.Errorf("lock %s: %w", name, err)
	}
	f, err := os.OpenFile(name, os.O_RDWR|os.O_CREATE, 0o600)
	if err != nil {
		return nil, fmt.Errorf("lock %s: %w", name, err)
	}
	held, err := tryLock(f)
	if err != nil {
		f.Close()
		return nil, fmt.Errorf("lock %s: %w", name, err)
	}
	if !held {
		pid := readPID(f)
		f.Close()
		return nil, &LockedError{Path: name, PID: pid}
	}
	// Record the holder for the message a second instance shows.
	err = f.Truncate(0)
	if err == nil {
		_, err = f.WriteAt([]byte(strconv.Itoa(os.Getpid())+"\n"), 0)
	}
	if err == nil {
		err = f.Sync()
	}
	if err != nil {
		unlock(f)
		f.Close()
		return nil, fmt.Errorf("lock %s: %w", name, err)
	}
	return &FileLock{f: f}, nil
}

// readPID reads the holder's process ID; 0 when it cannot be read, as
// while the holder is still writing it.
func readPID(f *os.File) int {
	buf := make([]byte, 32)
	n, _ := f.ReadAt(buf, 0)
	pid, err := strconv.Atoi(strings.TrimSpace(string(buf[:n])))
	if err != nil || pid <= 0 {
		return 0
	}
	return pid
}

// Unlock releases the lock. Calling it again, or on nil, does nothing.
func (l *FileLock) Unlock() error {
	if l == nil || l.f == nil {
		return nil
	}
	err := unlock(l.f)
	if cerr := l.f.Close(); err == nil {
		err = cerr
	}
	l.f = nil
	return err
}
