package web

import (
	"bufio"
	"errors"
	"fmt"
	"io/fs"
	"net/http"
	"os"
	"path/filepath"
	"time"

	"github.com/termwright/termwright/export"
	"github.com/termwright/termwright/timetable"
)

// maxVersions bounds the names tried when saving (name-2 ... name-999).
const maxVersions = 999

// savedVersion is a timetable on file: the one the server was started
// with, or one it saved.
type savedVersion struct {
	ID    int       `json:"id"`   // 1, 2, ...: order of saving
	File  string    `json:"file"` // file name
	Path  string    `json:"path"` // full path
	Edit  int       `json:"edit"` // the edit version it holds
	Saved time.Time `json:"saved,omitzero"`
	Hard  int       `json:"hard"` // broken hard requirements
	sched *timetable.Schedule
}

type saveResult struct {
	Saved    savedVersion   `json:"saved"`
	Versions []savedVersion `json:"versions"`
}

func (s *Server) handleSave(w http.ResponseWriter, r *http.Request) {
	var req versionRequest
	if !s.beginEdit(w, r, &req, func() int { return req.Version }) {
		return
	}
	defer s.mu.Unlock()
	now := s.opt.Now()
	path, err := s.writeLocked(now)
	if err != nil {
		writeError(w, http.StatusInternalServerError, err.Error())
		return
	}
	v := savedVersion{ID: len(s.saved) + 1, File: filepath.Base(path), Path: path, Edit: s.version, Saved: now,
		Hard: len(timetable.HardViolations(timetable.Check(s.opt.Term, s.cur))), sched: cloneSchedule(s.cur)}
	s.saved = append(s.saved, v)
	writeJSON(w, http.StatusOK, saveResult{Saved: v, Versions: s.saved})
}

// writeLocked writes the current timetable as a new workbook in the
// output folder under the first free name BaseName-N.xlsx (N from 2;
// BaseName.xlsx first when the timetable was solved, not read),
// created exclusively: an existing file is never replaced. It returns the
// path written.
func (s *Server) writeLocked(now time.Time) (string, error) {
	first := 2
	if s.opt.Source == "" {
		first = 1 // a solved timetable has no file yet: BaseName.xlsx comes first
	}
	for n := first; n <= maxVersions; n++ {
		path := filepath.Join(s.opt.OutDir, fmt.Sprintf("%s-%d.xlsx", s.opt.BaseName, n))
		if n == 1 {
			path = filepath.Join(s.opt.OutDir, s.opt.BaseName+".xlsx")
		}
		f, err := os.OpenFile(path, os.O_WRONLY|os.O_CREATE|os.O_EXCL, 0o644)
		if errors.Is(err, fs.ErrExist) {
			continue
		}
		if err != nil {
			return "", fmt.Errorf("cannot save in %s (%v); check that the folder exists and may be written", s.opt.OutDir, err)
		}
		bw := bufio.NewWriter(f)
		werr := export.WriteTimetableWorkbook(bw, s.opt.Term, s.cur, export.Options{Generated: now})
		if werr == nil {
			werr = bw.Flush()
		}
		werr = errors.Join(werr, f.Close())
		if werr != nil {
			os.Remove(path) // our own half-written file, created above
			return "", fmt.Errorf("cannot save %s (%v); nothing was saved", path, werr)
		}
		return path, nil
	}
	return "", fmt.Errorf("%s already holds %s-2.xlsx to %s-%d.xlsx; move old versions elsewhere and save again", s.opt.OutDir, s.opt.BaseName, s.opt.BaseName, maxVersions)
}

func (s *Server) handleVersions(w http.ResponseWriter, r *http.Request) {
	s.mu.Lock()
	defer s.mu.Unlock()
	writeJSON(w, http.StatusOK, struct {
		Versions []savedVersion `json:"versions"`
		Current  int            `json:"current"`
	}{append([]savedVersion{}, s.saved...), s.version})
}
