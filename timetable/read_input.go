package timetable

import (
	"errors"
	"os"
)

// inputFile names, for the messages of readInput, a kind of file a
// reader takes beside the term workbook.
type inputFile struct {
	what string // "a timetable", in "larger than the 200 MB a timetable may be"
	give string // "a timetable workbook (.xlsx) or .csv file", in "give the path of ..."
}

// Input files of the readers of timetables, class lists and requests.
var (
	timetableInput = inputFile{what: "a timetable", give: "a timetable workbook (.xlsx) or .csv file"}
	classListInput = inputFile{what: "a class-list file", give: "a class-list .csv file"}
	requestsInput  = inputFile{what: "a requests file", give: "the requests .csv file or .xlsx workbook"}
)

// readInput reads a whole input file. A missing file, a folder, a device
// or pipe, a file larger than schedMaxBytes or one that cannot be read is
// refused with one sentence that wraps ErrUnreadable (and, where there is
// one, the file system's error, so errors.Is(err, fs.ErrNotExist) works).
func readInput(path string, in inputFile) ([]byte, error) {
	fi, err := os.Stat(path)
	switch {
	case errors.Is(err, os.ErrNotExist):
		return nil, unreadableCause(err, "%s does not exist — give the path of %s", path, in.give)
	case err != nil:
		return nil, unreadableCause(err, "%s cannot be opened (%v) — check the path and its permissions", path, err)
	case fi.IsDir():
		return nil, unreadablef("%s is a folder — give %s itself", path, in.give)
	case !fi.Mode().IsRegular():
		return nil, unreadablef("%s", notRegular(path, fi).Error())
	case fi.Size() > schedMaxBytes:
		return nil, unreadablef("%s is %d MB, larger than the %d MB %s may be", path, fi.Size()>>20, schedMaxBytes>>20, in.what)
	}
	data, err := os.ReadFile(path)
	if err != nil {
		return nil, unreadableCause(err, "%s cannot be read (%v) — check its permissions", path, err)
	}
	return data, nil
}
