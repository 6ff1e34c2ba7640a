package timetable

import (
	"archive/zip"
	"bytes"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"sort"
	"strconv"
	"strings"
	"time"

	"github.com/xuri/excelize/v2"
)

// This file writes a Term in the layout of docs/workbook.md: as an .xlsx
// workbook (WriteTermWorkbook) or as a folder of CSV files (WriteTermCSV).
// Both render the same tables, so the two forms always agree. Output is
// deterministic: the same Term gives the same bytes.

// wtTable is one sheet of the term workbook: its name, headers and rows.
// Cells are string or int values (ints become number cells in xlsx).
type wtTable struct {
	name   string
	header []string
	rows   [][]any
}

// wtFixedTime is the creation and modification time written into workbook
// properties, so that equal terms give byte-identical files.
const wtFixedTime = "2000-01-01T00:00:00Z"

// WriteTermWorkbook writes t as a term workbook (.xlsx) to w: every sheet of
// docs/workbook.md with its header row frozen, one row per record. Dates are
// ISO text (YYYY-MM-DD), times HH:MM text, lists comma-separated, Weeks
// "all"/"odd"/"even" or ranges, Strength "hard" or the weight. The optional
// sheets Enrolments, Unavailable, Relations and Weights are always written
// (possibly with headers only); the Meeting times, Room choices, Travel and
// Course requests sheets, and the columns of weekly limits, lunch breaks,
// unavailable weeks, relation numbers and courses (Course, Arrangement,
// Part, Parent section, Limit), only when the term uses them. The same Term always
// gives the same bytes.
// Sources (Src fields) are not written.
func WriteTermWorkbook(t *Term, w io.Writer) error {
	f := excelize.NewFile()
	defer f.Close()
	f.SetZipWriter(func(w io.Writer) excelize.ZipWriter { return &wtSortedZip{w: w} })
	if err := f.SetDocProps(&excelize.DocProperties{
		Created:        wtFixedTime,
		Modified:       wtFixedTime,
		Creator:        "termwright",
		LastModifiedBy: "termwright",
		Title:          t.Name,
		Description:    "Term workbook (see docs/workbook.md)",
	}); err != nil {
		return fmt.Errorf("write term workbook: %w", err)
	}
	bold, err := f.NewStyle(&excelize.Style{Font: &excelize.Font{Bold: true}})
	if err != nil {
		return fmt.Errorf("write term workbook: %w", err)
	}
	for i, tb := range wtTables(t, false) {
		if i == 0 {
			if err := f.SetSheetName("Sheet1", tb.name); err != nil {
				return fmt.Errorf("write term workbook: sheet %s: %w", tb.name, err)
			}
		} else if _, err := f.NewSheet(tb.name); err != nil {
			return fmt.Errorf("write term workbook: sheet %s: %w", tb.name, err)
		}
		if err := wtWriteSheet(f, tb, bold); err != nil {
			return fmt.Errorf("write term workbook: sheet %s: %w", tb.name, err)
		}
	}
	if _, err := f.WriteTo(w); err != nil {
		return fmt.Errorf("write term workbook: %w", err)
	}
	return nil
}

// wtWriteSheet streams one table into its (existing) sheet.
func wtWriteSheet(f *excelize.File, tb wtTable, headerStyle int) error {
	sw, err := f.NewStreamWriter(tb.name)
	if err != nil {
		return err
	}
	for c, h := range tb.header {
		width := float64(len(h)) + 4
		for _, r := range tb.rows {
			if s, ok := r[c].(string); ok && float64(len([]rune(s)))+2 > width {
				width = float64(len([]rune(s))) + 2
			}
		}
		if err := sw.SetColWidth(c+1, c+1, min(width, 60)); err != nil {
			return err
		}
	}
	if err := sw.SetPanes(&excelize.Panes{Freeze: true, YSplit: 1, TopLeftCell: "A2", ActivePane: "bottomLeft"}); err != nil {
		return err
	}
	head := make([]any, len(tb.header))
	for i, h := range tb.header {
		head[i] = excelize.Cell{StyleID: headerStyle, Value: h}
	}
	if err := sw.SetRow("A1", head); err != nil {
		return err
	}
	for i, r := range tb.rows {
		cell, err := excelize.CoordinatesToCellName(1, i+2)
		if err != nil {
			return err
		}
		if err := sw.SetRow(cell, r); err != nil {
			return err
		}
	}
	return sw.Flush()
}

// WriteTermCSV writes t as a folder of CSV files, one per sheet of
// docs/workbook.md (Term.csv, Periods.csv, ...), with the same headers and
// cells as WriteTermWorkbook, except that a cell a spreadsheet would take
// for a formula is written with a single quote in front (SafeCSVCell;
// ReadCSVDir removes it). dir is created when missing. Each file is
// written to a temporary file in dir and renamed into place, replacing a file
// of the same name: callers that must not overwrite check first (see
// TermCSVFiles).
func WriteTermCSV(t *Term, dir string) error { return writeTermCSV(t, dir, false) }

// WriteTemplateCSV writes the CSV-folder form of an empty term into dir:
// every file of TermCSVFiles with every column of docs/workbook.md in its
// header (the Term file with its Name and Time zone rows), as
// WriteTermCSV writes them.
func WriteTemplateCSV(dir string) error { return writeTermCSV(&Term{}, dir, true) }

func writeTermCSV(t *Term, dir string, full bool) error {
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return fmt.Errorf("write term CSV: %w", err)
	}
	for _, tb := range wtTables(t, full) {
		var buf bytes.Buffer
		cw := csv.NewWriter(&buf)
		rec := make([]string, len(tb.header))
		_ = cw.Write(tb.header)
		for _, r := range tb.rows {
			for i, v := range r {
				rec[i] = SafeCSVCell(wtText(v))
			}
			_ = cw.Write(rec)
		}
		cw.Flush()
		if err := cw.Error(); err != nil {
			return fmt.Errorf("write term CSV %s: %w", tb.name, err)
		}
		if err := wtWriteFileAtomic(filepath.Join(dir, tb.name+".csv"), buf.Bytes()); err != nil {
			return fmt.Errorf("write term CSV: %w", err)
		}
	}
	return nil
}

// TermCSVFiles lists the file names WriteTermCSV may write, in sheet order
// (the files of meeting times, room choices, travel and course requests
// only when the term has such rows).
func TermCSVFiles() []string {
	names := make([]string, len(wtSheetNames))
	for i, n := range wtSheetNames {
		names[i] = n + ".csv"
	}
	return names
}

// wtSheetNames are the sheets of docs/workbook.md in writing order.
var wtSheetNames = []string{"Term", "Periods", "Rooms", "Staff", "Cohorts", "Sections", "Enrolments", "Unavailable", "Relations", "Weights", shTimes, shRoomChoices, shTravel, shRequests}

func wtWriteFileAtomic(path string, data []byte) error {
	tmp, err := os.CreateTemp(filepath.Dir(path), "."+filepath.Base(path)+".tmp*")
	if err != nil {
		return err
	}
	_, werr := tmp.Write(data)
	if err := errors.Join(werr, tmp.Close(), os.Chmod(tmp.Name(), 0o644)); err != nil {
		os.Remove(tmp.Name())
		return err
	}
	if err := os.Rename(tmp.Name(), path); err != nil {
		os.Remove(tmp.Name())
		return err
	}
	return nil
}

// wtText renders a cell value as CSV text.
func wtText(v any) string {
	switch v := v.(type) {
	case string:
		return v
	case int:
		return strconv.Itoa(v)
	}
	return fmt.Sprint(v)
}

// wtTables renders every sheet of t in workbook order. Unless full, the
// columns and sheets that meeting patterns brought are left out when the
// term does not use them, so that a grid term gives the same bytes as
// before they existed.
func wtTables(t *Term, full bool) []wtTable {
	tabs := []wtTable{
		wtTermTable(t),
		wtPeriodsTable(t),
		wtRoomsTable(t),
		wtStaffTable(t, full),
		wtCohortsTable(t, full),
		wtSectionsTable(t, full),
		wtEnrolmentsTable(t),
		wtUnavailableTable(t, full),
		wtRelationsTable(t, full),
		wtWeightsTable(t),
	}
	for _, tb := range []wtTable{wtTimesTable(t), wtRoomChoicesTable(t), wtTravelTable(t), wtRequestsTable(t)} {
		if full || len(tb.rows) > 0 {
			tabs = append(tabs, tb)
		}
	}
	return tabs
}

// dropColumns removes the named columns from a table unless keep.
func (tb wtTable) dropColumns(keep bool, names ...string) wtTable {
	if keep {
		return tb
	}
	var idx []int
	var header []string
	for i, h := range tb.header {
		if !listHas(names, h) {
			idx = append(idx, i)
			header = append(header, h)
		}
	}
	out := wtTable{name: tb.name, header: header}
	for _, r := range tb.rows {
		row := make([]any, len(idx))
		for j, i := range idx {
			row[j] = r[i]
		}
		out.rows = append(out.rows, row)
	}
	return out
}

func wtTermTable(t *Term) wtTable {
	tb := wtTable{name: "Term", header: []string{"Key", "Value"}}
	tb.rows = append(tb.rows, []any{"Name", t.Name})
	if !t.FirstDay.IsZero() {
		tb.rows = append(tb.rows, []any{"First day", wtDate(t.FirstDay)})
	}
	if !t.LastDay.IsZero() {
		tb.rows = append(tb.rows, []any{"Last day", wtDate(t.LastDay)})
	}
	tz := t.TimeZone
	if tz == "" {
		tz = "UTC"
	}
	tb.rows = append(tb.rows, []any{"Time zone", tz})
	for _, h := range t.Holidays {
		tb.rows = append(tb.rows, []any{"Holiday", wtDate(h)})
	}
	return tb
}

func wtDate(d time.Time) string { return d.Format(time.DateOnly) }

func wtPeriodsTable(t *Term) wtTable {
	tb := wtTable{name: "Periods", header: []string{"Day", "Start", "End"}}
	for _, p := range t.Periods {
		tb.rows = append(tb.rows, []any{DayName(p.Day), p.Start.String(), p.End.String()})
	}
	return tb
}

func wtRoomsTable(t *Term) wtTable {
	tb := wtTable{name: "Rooms", header: []string{"Room", "Capacity", "Features", "Building"}}
	for _, r := range t.Rooms {
		tb.rows = append(tb.rows, []any{r.ID, r.Capacity, wtList(r.Features), r.Building})
	}
	return tb
}

func wtStaffTable(t *Term, full bool) wtTable {
	tb := wtTable{name: "Staff", header: []string{"Staff ID", "Name", "Email", "Max periods per day", "Max consecutive periods",
		"Max periods per week", "Max minutes per week", "Max days per week", "Lunch from", "Lunch to", "Lunch minutes"}}
	weekly, lunch := full, full
	for _, s := range t.Staff {
		weekly = weekly || s.MaxWeekPeriods > 0 || s.MaxWeekMinutes > 0 || s.MaxWeekDays > 0
		lunch = lunch || s.Lunch.Set()
		row := []any{s.ID, s.Name, s.Email, wtLimit(s.MaxPerDay), wtLimit(s.MaxConsecutive),
			wtLimit(s.MaxWeekPeriods), wtLimit(s.MaxWeekMinutes), wtLimit(s.MaxWeekDays)}
		tb.rows = append(tb.rows, append(row, wtLunch(s.Lunch)...))
	}
	return tb.dropColumns(weekly, "Max periods per week", "Max minutes per week", "Max days per week").
		dropColumns(lunch, "Lunch from", "Lunch to", "Lunch minutes")
}

// wtLunch writes a lunch break's three cells, blank when none is given.
func wtLunch(l LunchBreak) []any {
	if !l.Set() {
		return []any{"", "", ""}
	}
	return []any{l.From.String(), l.To.String(), l.Minutes}
}

// wtLimit writes an optional limit: blank when 0 ("no limit").
func wtLimit(n int) any {
	if n <= 0 {
		return ""
	}
	return n
}

func wtCohortsTable(t *Term, full bool) wtTable {
	tb := wtTable{name: "Cohorts", header: []string{"Cohort", "Name", "Size", "Lunch from", "Lunch to", "Lunch minutes"}}
	lunch := full
	for _, c := range t.Cohorts {
		lunch = lunch || c.Lunch.Set()
		tb.rows = append(tb.rows, append([]any{c.ID, c.Name, wtLimit(c.Size)}, wtLunch(c.Lunch)...))
	}
	return tb.dropColumns(lunch, "Lunch from", "Lunch to", "Lunch minutes")
}

// NoRoomText is how the workbook writer marks a section that takes no room
// (in the Rooms column of the Sections sheet).
const NoRoomText = "no room"

func wtSectionsTable(t *Term, full bool) wtTable {
	tb := wtTable{name: "Sections", header: []string{"Section", "Title", "Staff", "Cohorts", "Expected size",
		"Meetings per week", "Periods per meeting", "Needs", "Rooms", "Fixed", "Weeks", "Min days",
		"Course", "Arrangement", "Part", "Parent section", "Limit"}}
	courses := full
	for _, s := range t.Sections {
		courses = courses || s.Course != "" || s.Arrangement != "" || s.Part != "" || s.Parent != "" || s.Limit != 0
		rooms := wtList(s.Rooms)
		if s.NoRoom {
			rooms = NoRoomText
		}
		fixed := make([]string, len(s.Fixed))
		for i, f := range s.Fixed {
			fixed[i] = FormatFixed(f)
		}
		var minDays any = ""
		if s.SameDay {
			minDays = s.MinDays // any number, even 0, marks SameDay
		}
		var meetings, length any = s.Meetings, s.Length
		if s.UsesTimes() {
			meetings, length = "", "" // the Meeting times sheet gives them
		}
		var limit any = ""
		if s.Limit != 0 {
			limit = s.Limit
		}
		tb.rows = append(tb.rows, []any{s.ID, s.Title, wtList(s.Staff), wtList(s.Cohorts), s.Size,
			meetings, length, wtList(s.Needs), rooms, strings.Join(fixed, "; "), t.WeeksText(s.Weeks), minDays,
			s.Course, s.Arrangement, s.Part, s.Parent, limit})
	}
	return tb.dropColumns(courses, "Course", "Arrangement", "Part", "Parent section", "Limit")
}

func wtEnrolmentsTable(t *Term) wtTable {
	tb := wtTable{name: "Enrolments", header: []string{"Student", "Section"}}
	for _, e := range t.Enrolments {
		tb.rows = append(tb.rows, []any{e.Student, e.Section})
	}
	return tb
}

func wtUnavailableTable(t *Term, full bool) wtTable {
	tb := wtTable{name: "Unavailable", header: []string{"Who", "Day", "From", "To", "Strength", "Reason", "Weeks"}}
	weeks := full
	for _, u := range t.Unavailable {
		from, to := u.From.String(), u.To.String()
		if u.From == 0 && u.To == 24*60 {
			from, to = "", "" // blank From/To means the whole day
		}
		weeks = weeks || u.Weeks != 0
		tb.rows = append(tb.rows, []any{u.Who, DayName(u.Day), from, to, wtStrength(u.Hard, u.Weight), u.Reason, t.WeeksText(u.Weeks)})
	}
	return tb.dropColumns(weeks, "Weeks")
}

func wtStrength(hard bool, weight int) any {
	if hard {
		return "hard"
	}
	return weight
}

func wtRelationsTable(t *Term, full bool) wtTable {
	tb := wtTable{name: "Relations", header: []string{"Kind", "Sections", "Strength", "N", "M"}}
	numbers := full
	for _, r := range t.Relations {
		var n, m any = "", ""
		if r.Kind.Params() > 0 || r.N != 0 {
			n = r.N
		}
		if r.Kind.Params() > 1 || r.M != 0 {
			m = r.M
		}
		numbers = numbers || n != "" || m != ""
		tb.rows = append(tb.rows, []any{r.Kind.String(), wtList(r.Sections), wtStrength(r.Hard, r.Weight), n, m})
	}
	return tb.dropColumns(numbers, "N", "M")
}

func wtTimesTable(t *Term) wtTable {
	tb := wtTable{name: shTimes, header: []string{"Section", "Days", "Start", "Minutes", "Weeks", "Weight"}}
	for _, s := range t.Sections {
		for _, c := range s.Times {
			weeks := t.WeeksText(c.Weeks)
			if c.Weeks == s.Weeks {
				weeks = "" // blank means the section's weeks
			}
			tb.rows = append(tb.rows, []any{s.ID, c.Days.String(), c.Start.String(), c.Minutes, weeks, wtWeight(c.Weight)})
		}
	}
	return tb
}

func wtRoomChoicesTable(t *Term) wtTable {
	tb := wtTable{name: shRoomChoices, header: []string{"Section", "Room", "Weight"}}
	for _, s := range t.Sections {
		for _, c := range s.RoomChoices {
			tb.rows = append(tb.rows, []any{s.ID, c.Room, wtWeight(c.Weight)})
		}
	}
	return tb
}

func wtTravelTable(t *Term) wtTable {
	tb := wtTable{name: shTravel, header: []string{"From", "To", "Minutes"}}
	for _, tr := range t.Travel {
		tb.rows = append(tb.rows, []any{tr.From, tr.To, tr.Minutes})
	}
	return tb
}

// wtRequestsTable writes the Course requests sheet (a blank Priority
// when it is 0, "not given").
func wtRequestsTable(t *Term) wtTable {
	tb := wtTable{name: shRequests, header: []string{"Student", "Course", "Priority", "Or instead"}}
	for _, r := range t.Requests {
		tb.rows = append(tb.rows, []any{r.Student, r.Course, wtWeight(r.Priority), wtList(r.Alternatives)})
	}
	return tb
}

// wtWeight writes a preference weight: blank when 0 (fully acceptable).
func wtWeight(w int) any {
	if w == 0 {
		return ""
	}
	return w
}

func wtWeightsTable(t *Term) wtTable {
	tb := wtTable{name: "Weights", header: []string{"Criterion", "Weight", "Level"}}
	names := make([]string, 0, len(t.Weights))
	for n := range t.Weights {
		names = append(names, n)
	}
	sort.Slice(names, func(i, j int) bool {
		oi, oj := wtCriterionOrder(names[i]), wtCriterionOrder(names[j])
		return oi < oj || oi == oj && names[i] < names[j]
	})
	for _, n := range names {
		w := t.Weights[n]
		tb.rows = append(tb.rows, []any{n, w.Weight, w.Level})
	}
	if _, listed := t.Weights[CritOverCapacity]; t.SoftCapacity && !listed {
		w, l := t.CriterionWeight(CritOverCapacity)
		tb.rows = append(tb.rows, []any{CritOverCapacity, w, l})
	}
	return tb
}

// wtCriterionOrder is a criterion's position in Criteria (unknown names last).
func wtCriterionOrder(name string) int {
	for i, c := range Criteria {
		if c.Name == name {
			return i
		}
	}
	return len(Criteria)
}

func wtList(xs []string) string { return strings.Join(xs, ", ") }

// FormatFixed writes a fixed meeting in workbook form: "Tue 10:00 R204", or
// "Thu 10:00" when only the time is fixed.
func FormatFixed(f Fixed) string {
	s := DayName(f.Day) + " " + f.Start.String()
	if f.Room != "" {
		s += " " + f.Room
	}
	return s
}

// WeeksText writes a week set in workbook form: "all" when it equals
// AllWeeks, "odd" or "even" when it is exactly the odd or even teaching
// weeks, otherwise a list of weeks and ranges such as "1-4, 6, 9-12".
// The empty set gives "".
func (t *Term) WeeksText(w WeekSet) string {
	all := t.AllWeeks()
	const odd = WeekSet(0x5555555555555555) // weeks 1, 3, 5, ...
	switch {
	case w == 0:
		return ""
	case w == all:
		return "all"
	case w == odd&all:
		return "odd"
	case w == ^odd&all:
		return "even"
	}
	return w.Ranges()
}

// wtSortedZip is an excelize.ZipWriter that buffers every entry and writes
// them in name order on Close ("[Content_Types].xml" first), with zero
// modification times, so that the archive's bytes do not depend on map
// iteration order inside excelize.
type wtSortedZip struct {
	w       io.Writer
	entries []*wtZipEntry
}

type wtZipEntry struct {
	name string
	data bytes.Buffer
}

// Create starts a new entry; its data is kept until Close.
func (z *wtSortedZip) Create(name string) (io.Writer, error) {
	e := &wtZipEntry{name: name}
	z.entries = append(z.entries, e)
	return &e.data, nil
}

// AddFS adds every regular file of fsys as an entry.
func (z *wtSortedZip) AddFS(fsys fs.FS) error {
	return fs.WalkDir(fsys, ".", func(path string, d fs.DirEntry, err error) error {
		if err != nil || d.IsDir() {
			return err
		}
		b, err := fs.ReadFile(fsys, path)
		if err != nil {
			return err
		}
		w, _ := z.Create(path)
		_, err = w.Write(b)
		return err
	})
}

// Close writes the archive.
func (z *wtSortedZip) Close() error {
	sort.SliceStable(z.entries, func(i, j int) bool { return z.entries[i].name < z.entries[j].name })
	zw := zip.NewWriter(z.w)
	for _, e := range z.entries {
		fw, err := zw.CreateHeader(&zip.FileHeader{Name: e.name, Method: zip.Deflate})
		if err != nil {
			return err
		}
		if _, err := fw.Write(e.data.Bytes()); err != nil {
			return err
		}
	}
	return zw.Close()
}
