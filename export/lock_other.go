//go:build !(linux || darwin || freebsd || netbsd || openbsd || dragonfly)

package export

// HaveLocks says whether TryLock takes real locks here.
const HaveLocks = false

// TryLock has no advisory locks to take here. It reports every path as
// held, so that no one removes another run's leftovers on a guess;
// leftovers are cleaned only where locks exist.
func TryLock(path string) (release func(), held bool, err error) {
	return func() {}, true, nil
}
