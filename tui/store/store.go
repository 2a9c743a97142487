// Package store keeps the app's session on disk so that nothing is lost:
// every save replaces the file atomically, a file whose content is damaged
// is moved aside instead of blocking start-up, a file that cannot be read
// (permissions) is reported and left alone, and a lock keeps a second
// instance from overwriting the first. The state directory is private
// (0700), files in it are opened without following symbolic links, and a
// directory or file that belongs to another user is refused.
package store

import (
	"errors"
	"fmt"
	"io"
	"io/fs"
	"math/rand/v2"
	"os"
	"path/filepath"
	"strconv"
	"syscall"
	"time"
)

// isLoop reports the error of an O_NOFOLLOW open of a symbolic link.
// Linux and most systems say ELOOP; FreeBSD says EMLINK.
func isLoop(err error) bool { return errors.Is(err, syscall.ELOOP) || errors.Is(err, syscall.EMLINK) }

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
	return save(path, data, 0o600)
}

// Publish saves as Save does, for a file the user asked for by name to
// share or keep with the job (a record, an export, a worksheet): it is
// left readable by others (mode 0644), where the session's own files are
// private (0600).
func Publish(path string, data []byte) error {
	return save(path, data, 0o644)
}

func save(path string, data []byte, mode os.FileMode) error {
	dir := filepath.Dir(path)
	if err := os.MkdirAll(dir, 0o700); err != nil {
		return fmt.Errorf("save %s: %w", path, err)
	}
	tmp, err := writeTemp(path, data, mode)
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

// createTemp creates a new file beside path named by tempPattern, mode
// 0600. O_EXCL with O_NOFOLLOW: a name already taken, by a file or a
// symbolic link, is never opened, so a link planted under a guessed name
// cannot redirect the write.
func createTemp(path string) (*os.File, error) {
	dir, pat := filepath.Dir(path), tempPattern(path)
	prefix := pat[:len(pat)-1]
	for range 100 {
		name := filepath.Join(dir, prefix+strconv.FormatUint(rand.Uint64(), 36))
		f, err := os.OpenFile(name, os.O_RDWR|os.O_CREATE|os.O_EXCL|noFollow, 0o600)
		if errors.Is(err, fs.ErrExist) {
			continue
		}
		return f, err
	}
	return nil, fmt.Errorf("no free temporary name in %s", dir)
}

// writeTemp writes data to a new synced temporary file of the given mode
// beside path and returns its name; on error nothing is left behind.
func writeTemp(path string, data []byte, mode os.FileMode) (string, error) {
	f, err := createTemp(path)
	if err != nil {
		return "", err
	}
	name := f.Name()
	_, err = f.Write(data)
	if err == nil {
		err = f.Chmod(mode)
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

// errTooLarge marks a file too large to be a session: damaged content.
// Its message is written when it is read, so start-up formats nothing.
var errTooLarge error = tooLarge{}

type tooLarge struct{}

func (tooLarge) Error() string { return "file larger than " + strconv.Itoa(MaxSize) + " bytes" }

// Load reads the session file at path, refusing one larger than MaxSize.
// A missing file gives an error for which errors.Is(err, fs.ErrNotExist)
// holds. A symbolic link, anything but a regular file, and a file that
// belongs to another user give an *UnsafeError.
func Load(path string) ([]byte, error) {
	f, err := os.OpenFile(path, os.O_RDONLY|noFollow|nonBlock, 0)
	if err != nil {
		if isLoop(err) {
			return nil, &UnsafeError{Path: path, Why: "is a symbolic link; argand does not follow links in its state directory"}
		}
		return nil, err
	}
	defer f.Close()
	fi, err := f.Stat()
	if err != nil {
		return nil, fmt.Errorf("load %s: %w", path, err)
	}
	if err := checkOwn(path, fi, false); err != nil {
		return nil, err
	}
	if fi.Size() > MaxSize {
		return nil, fmt.Errorf("load %s: %w", path, errTooLarge)
	}
	data, err := io.ReadAll(io.LimitReader(f, MaxSize+1))
	if err != nil {
		return nil, fmt.Errorf("load %s: %w", path, err)
	}
	if len(data) > MaxSize {
		return nil, fmt.Errorf("load %s: %w", path, errTooLarge)
	}
	return data, nil
}

// UnsafeError reports a state directory or file that argand refuses to
// use: a symbolic link where a file belongs, something other than a
// regular file or directory, or one that belongs to another user (who
// could then read the session or change it under the user's name).
type UnsafeError struct {
	Path string
	Why  string
}

func (e *UnsafeError) Error() string { return e.Path + " " + e.Why }

// checkOwn checks that fi, the file or directory (dir) at path, is one
// argand may use: of the right type and owned by this user.
func checkOwn(path string, fi fs.FileInfo, dir bool) error {
	switch {
	case dir && !fi.IsDir():
		return &UnsafeError{Path: path, Why: "is not a directory"}
	case !dir && !fi.Mode().IsRegular():
		return &UnsafeError{Path: path, Why: "is not a regular file"}
	}
	if uid, ok := ownerOf(fi); ok && uid != me() {
		return &UnsafeError{Path: path, Why: fmt.Sprintf("belongs to another user (uid %d, not %d); argand will not use it", uid, me())}
	}
	return nil
}

// PrepareDir makes the state directory dir, mode 0700, when it is missing,
// and checks it: a directory (a symbolic link to one is followed, as a
// user may keep state elsewhere, and its target is checked), owned by this
// user. A directory that others may write to is tightened to 0700, and
// the note returned says so.
func PrepareDir(dir string) (note string, err error) {
	if err := os.MkdirAll(dir, 0o700); err != nil {
		return "", err
	}
	fi, err := os.Stat(dir)
	if err != nil {
		return "", err
	}
	if err := checkOwn(dir, fi, true); err != nil {
		return "", err
	}
	if fi.Mode().Perm()&0o022 != 0 {
		if err := os.Chmod(dir, 0o700); err != nil {
			return "", fmt.Errorf("%s can be written by other users and could not be made private: %w", dir, err)
		}
		// short: it shares the start-up line with the session's own note
		return fmt.Sprintf("state directory was writable by others (mode %04o): now private, 0700", fi.Mode().Perm()), nil
	}
	return "", nil
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

// UnreadableError reports a session file that exists but cannot be read:
// no permission, not a regular file, a link, another user's, or a failing
// disk. The file is left where it is, untouched.
type UnreadableError struct {
	Path string
	Err  error
}

func (e *UnreadableError) Error() string {
	var ue *UnsafeError
	if errors.As(e.Err, &ue) {
		return ue.Error()
	}
	var pe *fs.PathError
	if errors.As(e.Err, &pe) {
		return fmt.Sprintf("%s cannot be read: %v", e.Path, pe.Err)
	}
	return fmt.Sprintf("%s cannot be read: %v", e.Path, e.Err)
}

func (e *UnreadableError) Unwrap() error { return e.Err }

// LoadChecked loads path and passes the content to check. Damaged content
// (refused by check, or too large to be a session) is moved aside and a
// *CorruptError is returned, so the caller can tell the user and start
// with an empty session. A file that cannot be read at all is left alone
// and reported as an *UnreadableError: its content may be fine, and the
// caller must not save over it. A missing file is returned as Load
// returns it.
func LoadChecked(path string, check func([]byte) error) ([]byte, error) {
	data, err := Load(path)
	if errors.Is(err, fs.ErrNotExist) {
		return nil, err
	}
	if err != nil && !errors.Is(err, errTooLarge) {
		return nil, &UnreadableError{Path: path, Err: err}
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
