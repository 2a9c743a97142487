//go:build !(linux || darwin || freebsd || netbsd || openbsd || dragonfly)

package serve

// Where the system has no O_NOFOLLOW links are followed.
const noFollow = 0
