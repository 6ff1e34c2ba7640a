//go:build !(linux || darwin || freebsd || netbsd || openbsd || dragonfly)

package main

// lockFile has no advisory locks to take here. It reports every file as
// held, so that removeStaleTemps never removes another run's file on a
// guess; leftovers are cleaned only where locks exist.
func lockFile(path string) (release func(), held bool, err error) {
	return func() {}, true, nil
}
