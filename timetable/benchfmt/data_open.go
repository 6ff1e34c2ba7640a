package benchfmt

import (
	"os"
	"path/filepath"

	"github.com/termwright/termwright/timetable"
)

// OpenCTT reads the curriculum-based instance name (the file name without
// ".ctt") from folder dir. A missing file gives an error that
// errors.Is(err, os.ErrNotExist) recognises, so optional tests and
// benchmarks can skip.
func OpenCTT(dir, name string) (*timetable.Term, error) {
	f, err := os.Open(filepath.Join(dir, name+".ctt"))
	if err != nil {
		return nil, err
	}
	defer f.Close()
	return ReadCTT(f, name+".ctt")
}

// OpenCTTBest reads dir/best-known.csv, the table of best known costs and
// lower bounds beside the instances (see ReadCTTBest).
func OpenCTTBest(dir string) (map[string]CTTBest, error) {
	f, err := os.Open(filepath.Join(dir, "best-known.csv"))
	if err != nil {
		return nil, err
	}
	defer f.Close()
	return ReadCTTBest(f, "best-known.csv")
}
