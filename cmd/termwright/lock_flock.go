//go:build linux || darwin || freebsd || netbsd || openbsd || dragonfly

package main

import (
	"errors"
	"os"
	"syscall"
)

// lockFile takes an exclusive advisory lock (flock) on the file at path,
// held until release is called or the process ends in any way, kill -9
// included: the kernel drops the lock with the process. held reports that
// a live process holds it already.
func lockFile(path string) (release func(), held bool, err error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, false, err
	}
	if err := syscall.Flock(int(f.Fd()), syscall.LOCK_EX|syscall.LOCK_NB); err != nil {
		f.Close()
		if errors.Is(err, syscall.EWOULDBLOCK) {
			return nil, true, nil
		}
		return nil, false, err
	}
	return func() { f.Close() }, false, nil
}
