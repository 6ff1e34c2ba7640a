package export

import (
	"bufio"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path"
	"path/filepath"
	"runtime"
	"sort"
	"strings"
	"sync"
	"time"

	"github.com/termwright/termwright/timetable"
)

// ManifestName is the file Publish writes last into its directory, listing
// everything it wrote. Its presence marks a directory as an earlier
// publication that Options.Force may replace.
const ManifestName = "manifest.json"

// Manifest lists what Publish wrote.
type Manifest struct {
	Dir       string         `json:"-"`         // the output directory as given
	Generator string         `json:"generator"` // always "termwright"
	Generated string         `json:"generated"` // RFC 3339 time of Options.Generated
	Term      string         `json:"term"`      // term name
	Files     []ManifestFile `json:"files"`     // every file but the manifest, sorted by Path
}

// ManifestFile is one file of a publication.
type ManifestFile struct {
	Path   string `json:"path"`   // slash-separated, relative to the directory
	Format string `json:"format"` // "pdf", "xlsx", "ics", "csv" or "json"
	Kind   string `json:"kind"`   // "staff", "room", "cohort", "student", or "all" for whole-timetable files
	ID     string `json:"id"`     // staff/room/cohort/student ID; "" for whole-timetable files
	Bytes  int64  `json:"bytes"`
}

// ManifestCount is how many files of one format and kind were written.
type ManifestCount struct {
	Format, Kind string
	Files        int
	Bytes        int64
}

// Counts summarises the manifest by format and kind, sorted.
func (m Manifest) Counts() []ManifestCount {
	at := map[[2]string]int{}
	var out []ManifestCount
	for _, f := range m.Files {
		k := [2]string{f.Format, f.Kind}
		i, ok := at[k]
		if !ok {
			i = len(out)
			at[k] = i
			out = append(out, ManifestCount{Format: f.Format, Kind: f.Kind})
		}
		out[i].Files++
		out[i].Bytes += f.Bytes
	}
	sort.Slice(out, func(i, j int) bool {
		if out[i].Format != out[j].Format {
			return out[i].Format < out[j].Format
		}
		return out[i].Kind < out[j].Kind
	})
	return out
}

// publishJob is one file to write.
type publishJob struct {
	file  ManifestFile
	write func(io.Writer) error
}

// Publish writes everything for a timetable into directory dir:
//
//	timetable.pdf, timetable.xlsx, timetable.csv, timetable.json
//	pdf/{staff,rooms,cohorts}/<name>.pdf
//	calendar/{staff,rooms,cohorts}/<name>.ics
//	pdf/students/<name>.pdf, calendar/students/<name>.ics
//	                               (opt.Students, when there are enrolments:
//	                               fixed and sectioned)
//	classlists.csv, classlists/staff/<name>.xlsx
//	                               (with sectioning: course requests in the
//	                               term or sectioned students in s; the CSV
//	                               of WriteClassListCSV and, per staff member
//	                               teaching a section with students,
//	                               WriteStaffClassLists)
//	manifest.json
//
// where <name> comes from SafeFileNames of the IDs (manifest.json maps
// files to IDs). It refuses an existing non-empty dir unless opt.Force, and
// even then replaces only a directory holding nothing but an earlier
// publication's files. Everything is written into a working directory
// .<dir>.partial-* next to dir, locked while this run lives, and put in
// place at the end (swapInto), so dir never holds a half-written
// publication; on error nothing of the user's is touched. Working
// directories of earlier runs that were killed are removed first
// (cleanLeftovers).
func Publish(dir string, t *timetable.Term, s *timetable.Schedule, opt Options) (Manifest, error) {
	m := Manifest{Dir: dir, Generator: "termwright", Term: t.Name}
	v, err := newView(t, s)
	if err != nil {
		return m, err
	}
	if _, err := paperSize(opt.Paper); err != nil {
		return m, err
	}
	if _, err := v.calendar(); err != nil { // also fills v.cal before the workers share v
		return m, err
	}
	parent, base := filepath.Split(filepath.Clean(dir))
	if parent == "" {
		parent = "."
	}
	cleanLeftovers(parent, base, dir) // first: it may move a publication back to dir
	if err := checkTarget(dir, opt.Force); err != nil {
		return m, err
	}
	opt.Generated = opt.generated()
	m.Generated = opt.Generated.Format("2006-01-02T15:04:05Z07:00")
	tmp, release, err := newWorkDir(parent, base)
	if err != nil {
		return m, fmt.Errorf("cannot create a working directory next to %s: %w", dir, err)
	}
	defer release()         // after the removal below: deferred calls run last first
	defer os.RemoveAll(tmp) // a no-op once renamed into place; the earlier publication after an exchange
	files, err := runJobs(tmp, v.publishJobs(opt))
	if err != nil {
		return m, err
	}
	m.Files = files
	if err := writeManifest(tmp, m); err != nil {
		return m, err
	}
	if err := os.Chmod(tmp, 0o755); err != nil {
		return m, err
	}
	return m, swapInto(tmp, dir)
}

// publishJobs lists every file of a publication, largest first so that the
// workers finish together.
func (v *view) publishJobs(opt Options) []publishJob {
	all := func(p, format string, write func(io.Writer) error) publishJob {
		return publishJob{ManifestFile{Path: p, Format: format, Kind: "all"}, write}
	}
	jobs := []publishJob{
		all("timetable.pdf", "pdf", func(w io.Writer) error { return v.writeCombinedPDF(w, opt) }),
		all("timetable.xlsx", "xlsx", func(w io.Writer) error { return v.writeWorkbook(w, opt) }),
		all("timetable.csv", "csv", func(w io.Writer) error { return writeCSV(w, v) }),
		all("timetable.json", "json", func(w io.Writer) error { return writeJSON(w, v) }),
	}
	if v.sectioning() {
		jobs = append(jobs, all("classlists.csv", "csv", func(w io.Writer) error { return writeClassListCSV(w, v) }))
		staff := v.classListStaff()
		for i, name := range SafeFileNames(staff) {
			id := staff[i]
			jobs = append(jobs, publishJob{
				ManifestFile{Path: path.Join("classlists", "staff", name+".xlsx"), Format: "xlsx", Kind: "staff", ID: id},
				func(w io.Writer) error { return v.writeStaffClassLists(w, id, opt) }})
		}
	}
	groups := [][]Subject{}
	for _, k := range []timetable.WhoKind{timetable.WhoStaff, timetable.WhoRoom, timetable.WhoCohort} {
		var g []Subject
		for _, who := range v.gridSubjects() {
			if who.Kind == k {
				g = append(g, who)
			}
		}
		groups = append(groups, g)
	}
	if opt.Students && len(v.students) > 0 {
		g := make([]Subject, len(v.students))
		for i, id := range v.students {
			g[i] = Subject{WhoStudent, id}
		}
		groups = append(groups, g)
	}
	for _, g := range groups {
		ids := make([]string, len(g))
		for i, who := range g {
			ids[i] = who.ID
		}
		names := SafeFileNames(ids)
		for i, who := range g {
			who, kind := who, kindWord(who.Kind)
			jobs = append(jobs, publishJob{
				ManifestFile{Path: path.Join("pdf", kindDir(who.Kind), names[i]+".pdf"), Format: "pdf", Kind: kind, ID: who.ID},
				func(w io.Writer) error { return v.writePersonPDF(w, who, opt) }})
			jobs = append(jobs, publishJob{
				ManifestFile{Path: path.Join("calendar", kindDir(who.Kind), names[i]+".ics"), Format: "ics", Kind: kind, ID: who.ID},
				func(w io.Writer) error { return v.writeICS(w, who, opt, nil) }})
		}
	}
	return jobs
}

// runJobs writes every job's file under root with one worker per CPU and
// returns the manifest entries sorted by path; it stops at the first error.
func runJobs(root string, jobs []publishJob) ([]ManifestFile, error) {
	var (
		wg    sync.WaitGroup
		mu    sync.Mutex
		first error
		next  int
	)
	files := make([]ManifestFile, len(jobs))
	worker := func() {
		defer wg.Done()
		for {
			mu.Lock()
			if first != nil || next == len(jobs) {
				mu.Unlock()
				return
			}
			i := next
			next++
			mu.Unlock()
			n, err := writeFile(filepath.Join(root, filepath.FromSlash(jobs[i].file.Path)), jobs[i].write)
			mu.Lock()
			if err != nil && first == nil {
				first = fmt.Errorf("%s: %w", jobs[i].file.Path, err)
			}
			files[i] = jobs[i].file
			files[i].Bytes = n
			mu.Unlock()
		}
	}
	for range min(runtime.GOMAXPROCS(0), max(len(jobs), 1)) {
		wg.Add(1)
		go worker()
	}
	wg.Wait()
	if first != nil {
		return nil, first
	}
	sort.Slice(files, func(i, j int) bool { return files[i].Path < files[j].Path })
	return files, nil
}

// writeFile creates path (and its directory) and fills it with write,
// returning the bytes written.
func writeFile(p string, write func(io.Writer) error) (int64, error) {
	if err := os.MkdirAll(filepath.Dir(p), 0o755); err != nil {
		return 0, err
	}
	f, err := os.OpenFile(p, os.O_WRONLY|os.O_CREATE|os.O_EXCL, 0o644)
	if err != nil {
		return 0, err
	}
	cw := &countWriter{w: f}
	bw := bufio.NewWriterSize(cw, 64<<10)
	err = write(bw)
	if err == nil {
		err = bw.Flush()
	}
	if cerr := f.Close(); err == nil {
		err = cerr
	}
	return cw.n, err
}

type countWriter struct {
	w io.Writer
	n int64
}

func (c *countWriter) Write(p []byte) (int, error) {
	n, err := c.w.Write(p)
	c.n += int64(n)
	return n, err
}

func writeManifest(dir string, m Manifest) error {
	b, err := json.MarshalIndent(m, "", "  ")
	if err != nil {
		return err
	}
	return os.WriteFile(filepath.Join(dir, ManifestName), append(b, '\n'), 0o644)
}

// checkTarget accepts a missing or empty dir, and with force a directory
// holding only the files its manifest lists; never a symbolic link.
func checkTarget(dir string, force bool) error {
	fi, err := os.Lstat(dir)
	if errors.Is(err, fs.ErrNotExist) {
		return nil
	}
	if err != nil {
		return fmt.Errorf("cannot publish: %w", err)
	}
	if fi.Mode()&fs.ModeSymlink != 0 {
		// Swapping a new folder in would replace the link itself.
		return fmt.Errorf("%s is a symbolic link; give the folder it points to, or a new folder name", dir)
	}
	if !fi.IsDir() {
		return fmt.Errorf("%s exists and is not a directory; choose a new directory name", dir)
	}
	entries, err := os.ReadDir(dir)
	if err != nil {
		return fmt.Errorf("cannot publish: %w", err)
	}
	if len(entries) == 0 {
		return nil
	}
	if !force {
		return fmt.Errorf("%s already holds files; choose a new or empty directory, or use --force to replace an earlier publication", dir)
	}
	b, err := os.ReadFile(filepath.Join(dir, ManifestName))
	var old Manifest
	if err == nil {
		err = json.Unmarshal(b, &old)
	}
	if err != nil || old.Generator != "termwright" {
		return fmt.Errorf("%s was not written by termwright publish (no valid %s), so --force will not replace it; choose a new or empty directory", dir, ManifestName)
	}
	known := map[string]bool{ManifestName: true}
	for _, f := range old.Files {
		known[f.Path] = true
	}
	var strangers []string
	err = filepath.WalkDir(dir, func(p string, d fs.DirEntry, err error) error {
		if err != nil {
			return err
		}
		rel, _ := filepath.Rel(dir, p)
		rel = filepath.ToSlash(rel)
		if !d.IsDir() && !known[rel] {
			strangers = append(strangers, rel)
		}
		return nil
	})
	if err != nil {
		return fmt.Errorf("cannot publish: %w", err)
	}
	if len(strangers) > 0 {
		if len(strangers) > 5 {
			strangers = append(strangers[:5], fmt.Sprintf("and %d more", len(strangers)-5))
		}
		return fmt.Errorf("%s holds files the earlier publication did not write (%s); move them away or choose another directory", dir, strings.Join(strangers, ", "))
	}
	return nil
}

// partialInfix follows ".<base>" in the names of working directories.
const partialInfix = ".partial-"

// newWorkDir creates a working directory .<base>.partial-* in parent and
// locks it for as long as this run lives (TryLock). Between its creation
// and its lock another run's cleanLeftovers may take it for a leftover;
// that run then holds the lock and removes it, so a new one is made. On a
// file system without locks the directory is used unlocked (and other runs
// leave it alone, as they cannot lock it either).
func newWorkDir(parent, base string) (string, func(), error) {
	for range 8 {
		tmp, err := os.MkdirTemp(parent, "."+base+partialInfix)
		if err != nil {
			return "", nil, err
		}
		release, held, err := TryLock(tmp)
		switch {
		case err == nil && !held:
			if _, serr := os.Lstat(tmp); serr == nil {
				return tmp, release, nil
			}
			release()
		case err != nil:
			if _, serr := os.Lstat(tmp); serr == nil {
				return tmp, func() {}, nil // no locks here
			}
		case !HaveLocks:
			return tmp, func() {}, nil
		}
	}
	return "", nil, errors.New("other runs kept taking the working directory")
}

// swapInto puts the finished directory tmp at dir.
//
// A new dir is one rename. An earlier publication at dir is exchanged with
// tmp in one step where the file system can (exchange): dir holds the
// earlier publication until the instant it holds the new one, never
// nothing, and the earlier one, now at tmp, is removed by Publish. Where it
// cannot, the earlier one is moved aside to tmp+".old" (locked first, so
// that no other run takes it for a leftover) and tmp renamed in; a kill
// between those two renames leaves dir missing with both complete
// publications beside it, and the next Publish moves the newer one back
// (cleanLeftovers).
func swapInto(tmp, dir string) error {
	if _, err := os.Lstat(dir); errors.Is(err, fs.ErrNotExist) {
		if err := os.Rename(tmp, dir); err != nil {
			return fmt.Errorf("moving the publication into %s: %w", dir, err)
		}
		return nil
	}
	if err := exchange(tmp, dir); err == nil {
		return nil
	}
	if release, held, err := TryLock(dir); err == nil && !held {
		defer release()
	}
	old := tmp + ".old"
	if err := os.Rename(dir, old); err != nil {
		return fmt.Errorf("moving the earlier %s aside: %w", dir, err)
	}
	if err := os.Rename(tmp, dir); err != nil {
		if rerr := os.Rename(old, dir); rerr != nil {
			return fmt.Errorf("moving the publication into %s: %v; the earlier one is in %s", dir, err, old)
		}
		return fmt.Errorf("moving the publication into %s: %w", dir, err)
	}
	return os.RemoveAll(old)
}

// cleanLeftovers removes what earlier runs publishing to dir (= parent/base)
// left behind when they were killed: directories in parent named
// .<base>.partial-* (working directories, and earlier publications moved
// aside, ending in .old) that no live run holds locked. A run's lock dies
// with it, kill -9 included, so an unlocked one is a leftover. Nothing
// else is touched. When dir itself is
// missing — a kill between the two renames of swapInto's fallback — the
// newest complete publication among them (one with a manifest, which
// Publish writes last) is moved back to dir instead of being removed.
// Failures are ignored: a leftover that cannot be removed is no reason to
// refuse a publication.
func cleanLeftovers(parent, base, dir string) {
	entries, err := os.ReadDir(parent)
	if err != nil {
		return
	}
	type leftover struct {
		path    string
		release func()
	}
	var stale []leftover
	defer func() {
		for _, l := range stale {
			l.release()
		}
	}()
	prefix := "." + base + partialInfix
	for _, en := range entries {
		if !en.IsDir() || !strings.HasPrefix(en.Name(), prefix) {
			continue
		}
		p := filepath.Join(parent, en.Name())
		if fi, err := os.Lstat(p); err != nil || !fi.IsDir() {
			continue
		}
		release, held, err := TryLock(p)
		if err != nil || held {
			continue
		}
		stale = append(stale, leftover{p, release})
	}
	if _, err := os.Lstat(dir); errors.Is(err, fs.ErrNotExist) {
		best, bestTime := "", time.Time{}
		for _, l := range stale {
			fi, err := os.Stat(filepath.Join(l.path, ManifestName))
			if err == nil && isPublication(l.path) && (best == "" || fi.ModTime().After(bestTime)) {
				best, bestTime = l.path, fi.ModTime()
			}
		}
		if best != "" && os.Rename(best, dir) == nil {
			for i, l := range stale {
				if l.path == best {
					l.release()
					stale = append(stale[:i], stale[i+1:]...)
					break
				}
			}
		}
	}
	for _, l := range stale {
		os.RemoveAll(l.path)
	}
}

// isPublication reports whether dir holds a valid manifest written by
// termwright.
func isPublication(dir string) bool {
	b, err := os.ReadFile(filepath.Join(dir, ManifestName))
	var m Manifest
	return err == nil && json.Unmarshal(b, &m) == nil && m.Generator == "termwright"
}
