package export

import (
	"bytes"
	"flag"
	"os"
	"path/filepath"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/timetable"
)

var update = flag.Bool("update", false, "rewrite golden files under testdata/")

// fixedClock is the publication time of every golden file.
var fixedClock = time.Date(2027, 8, 30, 14, 5, 0, 0, time.UTC)

func date(y int, m time.Month, d int) time.Time { return time.Date(y, m, d, 0, 0, 0, 0, time.UTC) }

// demoTerm is a small invented college term ("Kestrel Bay College") with
// names in several scripts, a holiday, a daylight-saving change inside the
// term (Europe/Dublin, 31 Oct 2027), a section without room, sections in
// disjoint weeks sharing a period (stacked) and overlapping differently
// (lanes), and a title that needs wrapping and escaping.
func demoTerm() (*timetable.Term, *timetable.Schedule) {
	t := &timetable.Term{
		Name:     "Autumn 2027 — Kestrel Bay College",
		FirstDay: date(2027, 9, 13),
		LastDay:  date(2027, 12, 10),
		TimeZone: "Europe/Dublin",
		Holidays: []time.Time{date(2027, 10, 25)},
	}
	starts := []timetable.Clock{9 * 60, 10 * 60, 11 * 60, 12 * 60, 14 * 60, 15 * 60, 16 * 60}
	for _, d := range []time.Weekday{time.Monday, time.Tuesday, time.Wednesday, time.Thursday, time.Friday} {
		for _, s := range starts {
			t.Periods = append(t.Periods, timetable.Period{Index: len(t.Periods), Day: d, Start: s, End: s + 60})
		}
	}
	t.Rooms = []timetable.Room{
		{ID: "R101", Capacity: 40, Building: "Main Building"},
		{ID: "L2", Capacity: 24, Features: []string{"lab"}, Building: "Science Wing"},
		{ID: "A1", Capacity: 120, Building: "Aula"},
		{ID: "R999", Capacity: 10},
	}
	t.Staff = []timetable.Staff{
		{ID: "S1", Name: "Zoë Ó Briain", Email: "zoe@kestrelbay.example"},
		{ID: "S2", Name: "Łukasz Wróbel"},
		{ID: "S3", Name: "Ελένη Παπαδοπούλου"},
		{ID: "S4", Name: "Дмитрий Соколов"},
		{ID: "S5", Name: "Grete Strauß"},
	}
	t.Cohorts = []timetable.Cohort{
		{ID: "C1", Name: "First year computing", Size: 35},
		{ID: "C2", Name: "Second year chemistry", Size: 20},
	}
	all := t.AllWeeks()
	first6 := timetable.WeekSet(1<<6 - 1)
	t.Sections = []timetable.Section{
		{ID: "CS101", Title: "Introduction to Programming", Staff: []string{"S1"}, Cohorts: []string{"C1"}, Size: 35, Meetings: 2, Length: 2, Weeks: all},
		{ID: "CS102", Title: "Discrete Mathematics; Sets, Logic, and Proof \\ Part I", Staff: []string{"S2"}, Cohorts: []string{"C1"}, Size: 35, Meetings: 1, Length: 1, Weeks: all},
		{ID: "CH201", Title: "Organic Chemistry Laboratory Techniques with a Very Long Title That Must Wrap Across Several Lines of the Block", Staff: []string{"S3"}, Cohorts: []string{"C2"}, Size: 20, Meetings: 1, Length: 3, Needs: []string{"lab"}, Weeks: first6},
		{ID: "CH202", Title: "Analytical Chemistry Laboratory", Staff: []string{"S4"}, Cohorts: []string{"C2"}, Size: 20, Meetings: 1, Length: 3, Needs: []string{"lab"}, Weeks: all &^ first6},
		{ID: "CH203", Title: "Safety Briefing", Staff: []string{"S3"}, Size: 20, Meetings: 1, Length: 1, Weeks: all &^ first6},
		{ID: "CS103", Title: "Online Seminar", Staff: []string{"S1", "S2"}, Cohorts: []string{"C1"}, Size: 35, Meetings: 1, Length: 1, NoRoom: true, Weeks: all},
	}
	t.Enrolments = []timetable.Enrolment{
		{Student: "st-001", Section: "CS101"}, {Student: "st-001", Section: "CS102"},
		{Student: "st-002", Section: "CH201"}, {Student: "st-002", Section: "CH202"},
		{Student: "../evil", Section: "CS101"},
	}
	at := func(d time.Weekday, h int) int { return t.PeriodAt(d, timetable.Clock(h*60)) }
	s := &timetable.Schedule{Placements: []timetable.Placement{
		{Section: "CS101", Meeting: 1, Period: at(time.Monday, 9), Room: "R101"},
		{Section: "CS101", Meeting: 2, Period: at(time.Wednesday, 10), Room: "R101"},
		{Section: "CS102", Meeting: 1, Period: at(time.Tuesday, 9), Room: "A1"},
		{Section: "CH201", Meeting: 1, Period: at(time.Thursday, 14), Room: "L2"},
		{Section: "CH202", Meeting: 1, Period: at(time.Thursday, 14), Room: "L2"},
		{Section: "CH203", Meeting: 1, Period: at(time.Thursday, 15), Room: "R101"},
		{Section: "CS103", Meeting: 1, Period: at(time.Friday, 12)},
	}}
	return t, s
}

// golden compares got with testdata/name, rewriting it under -update.
func golden(t *testing.T, name string, got []byte) {
	t.Helper()
	path := filepath.Join("testdata", name)
	if *update {
		require.NoError(t, os.MkdirAll(filepath.Dir(path), 0o755))
		require.NoError(t, os.WriteFile(path, got, 0o644))
		return
	}
	want, err := os.ReadFile(path)
	require.NoError(t, err, "run go test ./export -update to create %s", path)
	if !bytes.Equal(want, got) {
		t.Errorf("%s differs from the golden file; run with -update if the change is intended\n--- got ---\n%s", path, got)
	}
}

// busyTerm is demoTerm with what a real term has more of: a whole week
// without teaching (25-29 Oct 2027, joined to Monday 1 Nov over the
// weekend) and another holiday, unavailable times for room R101 (hard and
// a preference) and staff S1, two sections in odd and even weeks stacked
// in one one-hour period, and a section taught by three people.
func busyTerm() (*timetable.Term, *timetable.Schedule) {
	t, s := demoTerm()
	t.Holidays = []time.Time{date(2027, 10, 25), date(2027, 10, 26), date(2027, 10, 27), date(2027, 10, 28), date(2027, 10, 29),
		date(2027, 11, 1), date(2027, 12, 8)}
	t.Unavailable = []timetable.Unavailability{
		{Who: "R101", Kind: timetable.WhoRoom, Day: time.Tuesday, From: 9 * 60, To: 12 * 60, Hard: true, Reason: "Maintenance"},
		{Who: "R101", Kind: timetable.WhoRoom, Day: time.Wednesday, From: 14 * 60, To: 17 * 60, Weight: 2, Reason: "Open day"},
		{Who: "S1", Kind: timetable.WhoStaff, Day: time.Friday, From: 14 * 60, To: 17 * 60, Hard: true, Reason: "Research"},
	}
	all := t.AllWeeks()
	odd := timetable.WeekSet(0x5555) & all
	t.Sections = append(t.Sections,
		timetable.Section{ID: "CH210", Title: "Organic Synthesis Workshop", Staff: []string{"S3", "S5"}, Cohorts: []string{"C2"}, Size: 20, Meetings: 1, Length: 1, Needs: []string{"lab"}, Weeks: odd},
		timetable.Section{ID: "CH211", Title: "Spectroscopy Problem Class", Staff: []string{"S4"}, Cohorts: []string{"C2"}, Size: 20, Meetings: 1, Length: 1, Needs: []string{"lab"}, Weeks: all &^ odd},
		timetable.Section{ID: "CS104", Title: "Team-taught Project Studio", Staff: []string{"S1", "S2", "S5"}, Cohorts: []string{"C1"}, Size: 35, Meetings: 1, Length: 2, Weeks: all},
	)
	at := func(d time.Weekday, h int) int { return t.PeriodAt(d, timetable.Clock(h*60)) }
	s.Placements = append(s.Placements,
		timetable.Placement{Section: "CH210", Meeting: 1, Period: at(time.Monday, 11), Room: "L2"},
		timetable.Placement{Section: "CH211", Meeting: 1, Period: at(time.Monday, 11), Room: "L2"},
		timetable.Placement{Section: "CS104", Meeting: 1, Period: at(time.Tuesday, 14), Room: "A1"},
	)
	return t, s
}

// writeTimetableXLSX writes the timetable workbook of s (generated at
// fixedClock) as dir/timetable.xlsx and gives its path.
func writeTimetableXLSX(t *testing.T, dir string, term *timetable.Term, s *timetable.Schedule) string {
	t.Helper()
	var b bytes.Buffer
	require.NoError(t, WriteTimetableWorkbook(&b, term, s, Options{Generated: fixedClock}))
	path := filepath.Join(dir, "timetable.xlsx")
	require.NoError(t, os.WriteFile(path, b.Bytes(), 0o644))
	return path
}

// writeTimetableFiles writes the timetable workbook and the CSV of s as
// dir/timetable.xlsx and dir/timetable.csv and gives their paths.
func writeTimetableFiles(t *testing.T, dir string, term *timetable.Term, s *timetable.Schedule) (xlsx, csvPath string) {
	t.Helper()
	xlsx = writeTimetableXLSX(t, dir, term, s)
	var b bytes.Buffer
	require.NoError(t, WriteTimetableCSV(&b, term, s))
	csvPath = filepath.Join(dir, "timetable.csv")
	require.NoError(t, os.WriteFile(csvPath, b.Bytes(), 0o644))
	return xlsx, csvPath
}

// assertReadsBack reads each file back with timetable.ReadSchedule: no
// problem is reported and the placements of s come back.
func assertReadsBack(t *testing.T, term *timetable.Term, s *timetable.Schedule, paths ...string) {
	t.Helper()
	for _, p := range paths {
		t.Run(filepath.Ext(p), func(t *testing.T) {
			got, problems, err := timetable.ReadSchedule(p, term)
			require.NoError(t, err)
			assert.Empty(t, problems)
			assert.Equal(t, placements(s), placements(got))
		})
	}
}

// gridSheets lists the view's grid subjects and the names of their sheets
// in the timetable workbook.
func gridSheets(v *view) ([]Subject, []string) {
	subjects := v.gridSubjects()
	titles := make([]string, len(subjects))
	for i, who := range subjects {
		titles[i] = v.sheetTitle(who)
	}
	return subjects, SheetNames(titles, timetable.TimetableSheet, LoadSheet)
}
