//go:build linux || darwin || freebsd || netbsd || openbsd || dragonfly

package export

import (
	"errors"
	"os"
	"syscall"
)

// haveLocks says whether lockDir takes real locks here.
const haveLocks = true

// lockDir takes an exclusive advisory lock (flock) on directory dir, held
// until release is called or the process ends in any way, kill -9
// included: the kernel drops the lock with the process. held reports that
// a live process holds the lock already.
func lockDir(dir string) (release func(), held bool, err error) {
	f, err := os.Open(dir)
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
