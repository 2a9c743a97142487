//go:build linux || darwin || freebsd || netbsd || openbsd || dragonfly

package store

import (
	"io/fs"
	"os"
	"syscall"
)

// noFollow makes an open fail on a symbolic link in the last part of the
// name (open(2), O_NOFOLLOW), and nonBlock keeps an open of a FIFO put in
// the place of a file from waiting for a writer.
const (
	noFollow = syscall.O_NOFOLLOW
	nonBlock = syscall.O_NONBLOCK
)

// ownerOf returns the user ID that owns the file described by fi.
func ownerOf(fi fs.FileInfo) (uid int, known bool) {
	st, ok := fi.Sys().(*syscall.Stat_t)
	if !ok {
		return 0, false
	}
	return int(st.Uid), true
}

// me is the user the files must belong to: the effective user, whose
// rights the process uses.
func me() int { return os.Geteuid() }
