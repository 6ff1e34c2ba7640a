//go:build linux || darwin || freebsd || netbsd || openbsd || dragonfly

package export

import (
	"errors"
	"os"
	"syscall"
)

// HaveLocks says whether TryLock takes real locks here.
const HaveLocks = true

// TryLock takes an exclusive advisory lock (flock) on the file or
// directory at path, held until release is called or the process ends in
// any way, kill -9 included: the kernel drops the lock with the process.
// held reports that a live process holds the lock already. Publishing
// marks its working folders with it, and the command line its temporary
// files, so that leftovers of killed runs can be told from live work.
func TryLock(path string) (release func(), held bool, err error) {
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
