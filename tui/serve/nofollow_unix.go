//go:build linux || darwin || freebsd || netbsd || openbsd || dragonfly

package serve

import "syscall"

// noFollow makes an open fail on a symbolic link in the last part of the
// name, so a link planted in the state directory cannot stand in for the
// host key or the authorized keys.
const noFollow = syscall.O_NOFOLLOW
