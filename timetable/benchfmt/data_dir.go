package benchfmt

import (
	"os"
	"path/filepath"
)

// DataDir finds a folder of shared benchmark instances for tests and
// benchmarks (the instances are never copied into the repository):
// $TERMWRIGHT_DATA/SET or $TERMWRIGHT_DATA itself, else shared/data/SET in
// the nearest directory above the working directory that has it. A folder
// counts when it holds at least one file ending in ext (".ctt", ".xml").
// It returns "" when none does.
func DataDir(set, ext string) string {
	var tries []string
	if d := os.Getenv("TERMWRIGHT_DATA"); d != "" {
		tries = append(tries, filepath.Join(d, set), d)
	}
	if wd, err := os.Getwd(); err == nil {
		for dir := wd; ; dir = filepath.Dir(dir) {
			tries = append(tries, filepath.Join(dir, "shared", "data", set))
			if filepath.Dir(dir) == dir {
				break
			}
		}
	}
	for _, d := range tries {
		if m, _ := filepath.Glob(filepath.Join(d, "*"+ext)); len(m) > 0 {
			return d
		}
	}
	return ""
}
