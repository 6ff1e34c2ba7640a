//go:build linux

package export

import "golang.org/x/sys/unix"

// exchange swaps the directories at a and b in one step (renameat2 with
// RENAME_EXCHANGE, Linux 3.15 and later): at every moment each name holds
// one complete directory. File systems without it give an error, and the
// caller falls back to two renames.
func exchange(a, b string) error {
	return unix.Renameat2(unix.AT_FDCWD, a, unix.AT_FDCWD, b, unix.RENAME_EXCHANGE)
}
