// Package store keeps the app's session on disk so that nothing is lost:
// every save replaces the file atomically, a file that cannot be read back
// is moved aside instead of blocking start-up, and a lock keeps a second
// instance from overwriting the first.
package store

import (
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"time"
)

// MaxSize bounds the size of a session file Load accepts. Sessions are
// text worksheets of a few kilobytes; a file far larger is not one of ours.
const MaxSize = 64 << 20

// Dir returns the directory for session state: $XDG_STATE_HOME/argand, or
// ~/.local/state/argand when XDG_STATE_HOME is unset or not absolute (the
// XDG Base Directory Specification says relative paths are to be ignored).
// It does not create the directory; Save does.
func Dir() (string, error) {
	if d := os.Getenv("XDG_STATE_HOME"); d != "" && filepath.IsAbs(d) {
		return filepath.Join(d, "argand"), nil
	}
	home, err := os.UserHomeDir()
	if err != nil {
		return "", fmt.Errorf("no directory for the session: %w", err)
	}
	return filepath.Join(home, ".local", "state", "argand"), nil
}

// tempPattern names the temporary file of a save; the leading dot keeps it
// out of plain directory listings.
func tempPattern(path string) string {
	return "." + filepath.Base(path) + ".tmp-*"
}

// Save replaces the file at path with data so that, whatever moment the
// process or the machine stops, path holds either the old content or the
// new, never a mixture: the data goes to a temporary file in the same
// directory, which is synced, renamed over path (rename is atomic within a
// file system, POSIX rename(2)) and then the directory is synced so the
// rename itself is durable. The directory is created (mode 0700) if needed.
func Save(path string, data []byte) error {
	dir := filepath.Dir(path)
	if err := os.MkdirAll(dir, 0o700); err != nil {
		return fmt.Errorf("save %s: %w", path, err)
	}
	tmp, err := writeTemp(path, data)
	if err != nil {
		return fmt.Errorf("save %s: %w", path, err)
	}
	if err := os.Rename(tmp, path); err != nil {
		os.Remove(tmp)
		return fmt.Errorf("save %s: %w", path, err)
	}
	if err := syncDir(dir); err != nil {
		return fmt.Errorf("save %s: %w", path, err)
	}
	return nil
}

// writeTemp writes data to a new synced temporary file beside path and
// returns its name; on error nothing is left behind.
func writeTemp(path string, data []byte) (string, error) {
	f, err := os.CreateTemp(filepath.Dir(path), tempPattern(path))
	if err != nil {
		return "", err
	}
	name := f.Name()
	_, err = f.Write(data)
	if err == nil {
		err = f.Chmod(0o600)
	}
	if err == nil {
		err = f.Sync()
	}
	if cerr := f.Close(); err == nil {
		err = cerr
	}
	if err != nil {
		os.Remove(name)
		return "", err
	}
	return name, nil
}

func syncDir(dir string) error {
	d, err := os.Open(dir)
	if err != nil {
		return err
	}
	err = d.Sync()
	if cerr := d.Close(); err == nil {
		err = cerr
	}
	return err
}

// Load reads the file at path, refusing one larger than MaxSize. A missing
// file gives an error for which errors.Is(err, fs.ErrNotExist) holds.
func Load(path string) ([]byte, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	if fi, err := f.Stat(); err == nil && fi.Size() > MaxSize {
		return nil, fmt.Errorf("load %s: file larger than %d bytes", path, MaxSize)
	}
	data, err := io.ReadAll(io.LimitReader(f, MaxSize+1))
	if err != nil {
		return nil, fmt.Errorf("load %s: %w", path, err)
	}
	if len(data) > MaxSize {
		return nil, fmt.Errorf("load %s: file larger than %d bytes", path, MaxSize)
	}
	return data, nil
}

// MoveAside renames the file at path to path + ".corrupt-" + a UTC time
// stamp (with a counter if that name is taken), so that a session file the
// app cannot use is kept for inspection and the app can start afresh. It
// returns the new name.
func MoveAside(path string) (string, error) {
	stamp := time.Now().UTC().Format("20060102T150405Z")
	for i := 0; i < 1000; i++ {
		name := path + ".corrupt-" + stamp
		if i > 0 {
			name += fmt.Sprintf("-%d", i)
		}
		if _, err := os.Lstat(name); err == nil {
			continue
		} else if !errors.Is(err, fs.ErrNotExist) {
			return "", fmt.Errorf("move aside %s: %w", path, err)
		}
		if err := os.Rename(path, name); err != nil {
			return "", fmt.Errorf("move aside %s: %w", path, err)
		}
		if err := syncDir(filepath.Dir(path)); err != nil {
			return name, fmt.Errorf("move aside %s: %w", path, err)
		}
		return name, nil
	}
	return "", fmt.Errorf("move aside %s: too many files moved aside already", path)
}

// CorruptError reports a session file that failed the caller's check and
// was moved aside.
type CorruptError struct {
	Path    string // the session file
	MovedTo string // where its content now is
	Err     error  // why it was refused
}

func (e *CorruptError) Error() string {
	return fmt.Sprintf("session %s could not be used (%v); kept as %s", e.Path, e.Err, e.MovedTo)
}

func (e *CorruptError) Unwrap() error { return e.Err }

// LoadChecked loads path and passes the content to check. Content that
// check refuses, or that cannot be read, is moved aside and a
// *CorruptError is returned, so the caller can tell the user and start
// with an empty session. A missing file is returned as Load returns it.
func LoadChecked(path string, check func([]byte) error) ([]byte, error) {
	data, err := Load(path)
	if errors.Is(err, fs.ErrNotExist) {
		return nil, err
	}
	if err == nil {
		err = check(data)
		if err == nil {
			return data, nil
		}
	}
	moved, merr := MoveAside(path)
	if merr != nil {
		return nil, errors.Join(err, merr)
	}
	return nil, &CorruptError{Path: path, MovedTo: moved, Err: err}
}
