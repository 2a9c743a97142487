//go:build !(linux || darwin || freebsd || netbsd || openbsd || dragonfly)

package store

import "io/fs"

// Where the system has no O_NOFOLLOW or POSIX owners the checks that use
// them are skipped; the lock itself is not available there either (see
// flock_other.go), so the app opens sessions read-only.
const (
	noFollow = 0
	nonBlock = 0
)

func ownerOf(fs.FileInfo) (int, bool) { return 0, false }

func me() int { return -1 }
