//go:build !(linux || darwin || freebsd || netbsd || openbsd || dragonfly)

package store

import (
	"errors"
	"os"
)

func tryLock(f *os.File) (bool, error) { return false, errors.ErrUnsupported }

func unlock(f *os.File) error { return nil }
