package store

import (
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"time"
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
	f     *os.File
	notes []string
}

// Notes returns what taking the lock changed that the user should know:
// a state directory made private, leftover temporary files removed.
func (l *FileLock) Notes() []string {
	if l == nil {
		return nil
	}
	return l.notes
}

// StaleAge is how old a leftover temporary file of a save must be before
// Lock removes it: a save writes its file in well under a second, so one
// older than this belongs to a run that was killed.
const StaleAge = time.Minute

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
//
// The directory is prepared by PrepareDir (private, this user's), and the
// lock file is opened without following a symbolic link and must be this
// user's regular file, so that a link planted in its place cannot have
// another file truncated. Once the lock is held, temporary files of saves
// older than StaleAge, left by a run that was killed, are removed; Notes
// says what was done.
func Lock(path string) (*FileLock, error) {
	name := path + ".lock"
	note, err := PrepareDir(filepath.Dir(name))
	if err != nil {
		return nil, plainPathErr(err)
	}
	f, err := os.OpenFile(name, os.O_RDWR|os.O_CREATE|noFollow|nonBlock, 0o600)
	if err != nil {
		if isLoop(err) {
			return nil, &UnsafeError{Path: name, Why: "is a symbolic link; argand does not follow links in its state directory"}
		}
		return nil, plainPathErr(err)
	}
	fi, err := f.Stat()
	if err == nil {
		err = checkOwn(name, fi, false)
	}
	if err != nil {
		f.Close()
		return nil, plainPathErr(err)
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
	lk := &FileLock{f: f}
	if note != "" {
		lk.notes = append(lk.notes, note)
	}
	if n := removeStale(path, StaleAge, time.Now()); n > 0 {
		lk.notes = append(lk.notes, fmt.Sprintf("removed %d temporary file(s) of an interrupted save", n))
	}
	return lk, nil
}

// removeStale removes the temporary files of saves of path (tempPattern)
// last changed more than age before now; it is called only while the
// lock is held, so no save of this session can be under way. Only this
// user's regular files are touched. It returns how many were removed.
func removeStale(path string, age time.Duration, now time.Time) int {
	// read the directory rather than glob it: the path may hold a glob's
	// special characters
	dir := filepath.Dir(path)
	ents, err := os.ReadDir(dir)
	if err != nil {
		return 0
	}
	pat := tempPattern(path)
	prefix := pat[:len(pat)-1]
	n := 0
	for _, e := range ents {
		if !strings.HasPrefix(e.Name(), prefix) || len(e.Name()) == len(prefix) {
			continue
		}
		name := filepath.Join(dir, e.Name())
		fi, err := os.Lstat(name)
		if err != nil || !fi.Mode().IsRegular() || now.Sub(fi.ModTime()) <= age {
			continue
		}
		if uid, ok := ownerOf(fi); ok && uid != me() {
			continue
		}
		if os.Remove(name) == nil {
			n++
		}
	}
	return n
}

// plainPathErr writes a failed file operation as the path and what went
// wrong ("…/session.json.lock: permission denied"), without the name of
// the system call, keeping the cause for errors.Is.
func plainPathErr(err error) error {
	var pe *fs.PathError
	if errors.As(err, &pe) {
		return fmt.Errorf("%s: %w", pe.Path, pe.Err)
	}
	return err
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
