package main

import (
	"os"
	"path/filepath"
	"time"

	"github.com/termwright/termwright/export"
)

// staleAfter is how old an unlocked temporary file must be before it
// counts as a killed run's leftover.
const staleAfter = time.Minute

// removeStaleTemps removes what killed runs left beside an output: the
// temporary files of writeOutput (".NAME.*.tmp") and of probeFolder
// (".termwright-probe-*"). A live run holds a lock on each of its own
// (export.TryLock), so only files whose run has ended are removed; nothing else
// is touched. A file younger than staleAfter is left too: a run holds no
// lock yet between creating its file and locking it, and a concurrent run
// must not remove it in that instant. Errors are ignored: a leftover is
// untidy, not harmful.
func removeStaleTemps(dir, base string) {
	for _, pattern := range []string{"." + escapeGlob(base) + ".*.tmp", ".termwright-probe-*"} {
		names, _ := filepath.Glob(filepath.Join(escapeGlob(dir), pattern))
		for _, name := range names {
			if fi, err := os.Lstat(name); err != nil || !fi.Mode().IsRegular() || time.Since(fi.ModTime()) < staleAfter {
				continue
			}
			release, held, err := export.TryLock(name)
			if err != nil || held {
				continue
			}
			os.Remove(name)
			release()
		}
	}
}

// escapeGlob quotes the pattern characters of a literal path part.
func escapeGlob(s string) string {
	out := make([]rune, 0, len(s))
	for _, r := range s {
		switch r {
		case '*', '?', '[', '\\':
			out = append(out, '\\')
		}
		out = append(out, r)
	}
	return string(out)
}
