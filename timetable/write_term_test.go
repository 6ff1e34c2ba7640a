package timetable_test

import (
	"bytes"
	"encoding/csv"
	"errors"
	"flag"
	"io/fs"
	"os"
	"path/filepath"
	"reflect"
	"strconv"
	"strings"
	"testing"
	"time"
	"unicode"
	"unicode/utf8"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/xuri/excelize/v2"

	"github.com/termwright/termwright/samples"
	"github.com/termwright/termwright/timetable"
)

// The -update flag rewrites golden files. Another test file of this package
// may define it too; whichever runs first defines it and the other looks it
// up.
func init() {
	if flag.Lookup("update") == nil {
		flag.Bool("update", false, "rewrite golden files under testdata/")
	}
}

func updating() bool {
	f := flag.Lookup("update")
	return f != nil && f.Value.String() == "true"
}

// handTerm is a small term that uses every column and every special form of
// the writer: holidays, a lunch gap, optional limits left blank, a cohort
// without size, no-room, fixed meetings with and without room, odd, even
// and ranged weeks, Min days 0 and 2, allowed rooms, whole-day and timed,
// hard and weighted unavailability, every relation strength, and weights.
func handTerm() *timetable.Term {
	d := func(m time.Month, day int) time.Time { return time.Date(2027, m, day, 0, 0, 0, 0, time.UTC) }
	t := &timetable.Term{
		Name: "Autumn 2027", FirstDay: d(9, 13), LastDay: d(12, 3), TimeZone: "Europe/Dublin",
		Holidays: []time.Time{d(10, 25), d(11, 1)},
		Rooms: []timetable.Room{
			{ID: "ALD.001", Capacity: 40, Features: []string{"projector", "step-free"}, Building: "Alder Court"},
			{ID: "ALD.102", Capacity: 24, Features: []string{"lab"}, Building: "Alder Court"},
			{ID: "BEA.010", Capacity: 120, Building: "Beacon Hall"},
		},
		Staff: []timetable.Staff{
			{ID: "S-1001", Name: "Hélène Lefèvre", Email: "h.lefevre@quillmere.example", MaxPerDay: 4, MaxConsecutive: 3},
			{ID: "S-1002", Name: "Łukasz Wróbel"},
			{ID: "S-1003", Name: "Σοφία Αλεξίου", Email: "s.alexiou@quillmere.example", MaxPerDay: 5},
		},
		Cohorts: []timetable.Cohort{{ID: "CHM-1A", Name: "Applied Chemistry, year 1, group A", Size: 22}, {ID: "CHM-1B", Name: "Applied Chemistry, year 1, group B"}},
		Sections: []timetable.Section{
			{ID: "CHM101-L", Title: "Spectroscopy, \"with\" quotes, commas", Staff: []string{"S-1001"}, Cohorts: []string{"CHM-1A", "CHM-1B"},
				Size: 40, Meetings: 2, Length: 1, Needs: []string{"projector"}, Weeks: 0xfff,
				Fixed: []timetable.Fixed{{Day: time.Tuesday, Start: 600, Room: "ALD.001", Text: "Tue 10:00 ALD.001"}, {Day: time.Thursday, Start: 600, Text: "Thu 10:00"}}},
			{ID: "CHM101-P1", Title: "Spectroscopy — laboratory", Staff: []string{"S-1001", "S-1002"}, Cohorts: []string{"CHM-1A"},
				Size: 22, Meetings: 1, Length: 3, Needs: []string{"lab"}, Rooms: []string{"ALD.102"}, Weeks: 0x555},
			{ID: "CHM101-P2", Title: "Spectroscopy — laboratory", Staff: []string{"S-1002"}, Cohorts: []string{"CHM-1B"},
				Size: 20, Meetings: 1, Length: 3, Needs: []string{"lab"}, Weeks: 0xaaa},
			{ID: "CHM102-T1", Title: "Tutorial", Staff: []string{"S-1003"}, Cohorts: []string{"CHM-1A"},
				Size: 22, Meetings: 3, Length: 1, Weeks: 0b111101111110, SameDay: true, MinDays: 2},
			{ID: "CHM103-E", Title: "Online elective", Staff: []string{"S-1003"}, Size: 30, Meetings: 2, Length: 1,
				NoRoom: true, Weeks: 0xfff, SameDay: true},
		},
		Enrolments: []timetable.Enrolment{{Student: "Q2700001", Section: "CHM101-L"}, {Student: "Q2700001", Section: "CHM103-E"}},
		Unavailable: []timetable.Unavailability{
			{Who: "S-1002", Kind: timetable.WhoStaff, Day: time.Friday, From: 0, To: 24 * 60, Hard: true, Reason: "Research day"},
			{Who: "ALD.102", Kind: timetable.WhoRoom, Day: time.Wednesday, From: 13 * 60, To: 15 * 60, Weight: 3, Reason: "Cleaning"},
			{Who: "CHM-1A", Kind: timetable.WhoCohort, Day: time.Monday, From: 8 * 60, To: 10 * 60, Hard: true},
		},
		Relations: []timetable.Relation{
			{Kind: timetable.SameTime, Sections: []string{"CHM101-P1", "CHM101-P2"}, Hard: true},
			{Kind: timetable.Before, Sections: []string{"CHM101-L", "CHM101-P1", "CHM102-T1"}, Weight: 2},
			{Kind: timetable.NotSameTime, Sections: []string{"CHM101-L", "CHM103-E"}, Weight: 0},
		},
		Weights: map[string]timetable.Weight{
			timetable.CritStaffGaps:    {Weight: 2, Level: 1},
			timetable.CritStudentClash: {Weight: 10, Level: 2},
			timetable.CritEarly:        {Weight: 0, Level: 0},
		},
	}
	for d := time.Monday; d <= time.Friday; d++ {
		for _, h := range []int{9, 10, 11, 13, 14, 15} {
			t.Periods = append(t.Periods, timetable.Period{Index: len(t.Periods), Day: d, Start: timetable.Clock(h * 60), End: timetable.Clock(h*60 + 60)})
		}
	}
	return t
}

func TestWeeksText(t *testing.T) {
	term := &timetable.Term{FirstDay: time.Date(2027, 9, 13, 0, 0, 0, 0, time.UTC), LastDay: time.Date(2027, 12, 3, 0, 0, 0, 0, time.UTC)}
	require.Equal(t, 12, term.TeachingWeeks())
	oneWeek := &timetable.Term{FirstDay: term.FirstDay, LastDay: term.FirstDay.AddDate(0, 0, 4)}
	cases := []struct {
		name string
		term *timetable.Term
		w    timetable.WeekSet
		want string
	}{
		{"all", term, 0xfff, "all"},
		{"odd", term, 0x555, "odd"},
		{"even", term, 0xaaa, "even"},
		{"empty", term, 0, ""},
		{"single", term, 1 << 5, "6"},
		{"ranges", term, 0b111101111, "1-4, 6-9"},
		{"first and last", term, 1 | 1<<11, "1, 12"},
		{"beyond the term", term, 1 << 13, "14"},
		{"all of a one-week term", oneWeek, 1, "all"},
		{"odd but one", term, 0x155, "1, 3, 5, 7, 9"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			assert.Equal(t, c.want, c.term.WeeksText(c.w))
		})
	}
}

func TestFormatFixed(t *testing.T) {
	assert.Equal(t, "Tue 10:00 R204", timetable.FormatFixed(timetable.Fixed{Day: time.Tuesday, Start: 600, Room: "R204"}))
	assert.Equal(t, "Sun 08:05", timetable.FormatFixed(timetable.Fixed{Day: time.Sunday, Start: 485}))
}

// TestWriteTermCSVGolden compares the CSV form of handTerm with the golden
// files in testdata/write_term (rewrite with -update).
func TestWriteTermCSVGolden(t *testing.T) {
	dir := t.TempDir()
	require.NoError(t, timetable.WriteTermCSV(handTerm(), dir))
	golden := filepath.Join("testdata", "write_term")
	for _, name := range timetable.TermCSVFiles() {
		got, err := os.ReadFile(filepath.Join(dir, name))
		if errors.Is(err, fs.ErrNotExist) {
			_, gerr := os.Stat(filepath.Join(golden, name))
			assert.True(t, errors.Is(gerr, fs.ErrNotExist), "%s is not written for a grid term, so it has no golden file", name)
			continue
		}
		require.NoError(t, err)
		if updating() {
			require.NoError(t, os.MkdirAll(golden, 0o755))
			require.NoError(t, os.WriteFile(filepath.Join(golden, name), got, 0o644))
			continue
		}
		want, err := os.ReadFile(filepath.Join(golden, name))
		require.NoError(t, err, "golden file missing; run go test ./timetable -run TestWriteTermCSVGolden -update")
		assert.Equal(t, string(want), string(got), name)
	}
	entries, err := os.ReadDir(dir)
	require.NoError(t, err)
	for _, e := range entries {
		assert.Contains(t, timetable.TermCSVFiles(), e.Name(), "no temporary files are left behind")
	}
}

func TestWriteTermWorkbookDeterministic(t *testing.T) {
	var a, b bytes.Buffer
	require.NoError(t, timetable.WriteTermWorkbook(handTerm(), &a))
	require.NoError(t, timetable.WriteTermWorkbook(handTerm(), &b))
	assert.True(t, bytes.Equal(a.Bytes(), b.Bytes()), "the same term must give the same bytes")
}

func TestWriteTermWorkbookLayout(t *testing.T) {
	f := openTermWorkbook(t, handTerm())
	assert.Equal(t, []string{"Term", "Periods", "Rooms", "Staff", "Cohorts", "Sections", "Enrolments", "Unavailable", "Relations", "Weights"}, f.GetSheetList())
	for _, sheet := range f.GetSheetList() {
		panes, err := f.GetPanes(sheet)
		require.NoError(t, err)
		assert.True(t, panes.Freeze, "%s: header row frozen", sheet)
		assert.Equal(t, 1, panes.YSplit, sheet)
	}
	rows, err := f.GetRows("Sections")
	require.NoError(t, err)
	assert.Equal(t, []string{"Section", "Title", "Staff", "Cohorts", "Expected size", "Meetings per week", "Periods per meeting", "Needs", "Rooms", "Fixed", "Weeks", "Min days"}, rows[0])
	assert.Equal(t, []string{"CHM101-L", "Spectroscopy, \"with\" quotes, commas", "S-1001", "CHM-1A, CHM-1B", "40", "2", "1", "projector", "", "Tue 10:00 ALD.001; Thu 10:00", "all"}, rows[1])
	assert.Equal(t, "odd", rows[2][10])
	assert.Equal(t, "2-7, 9-12", rows[4][10])
	assert.Equal(t, "2", rows[4][11])
	assert.Equal(t, "no room", rows[5][8])
	assert.Equal(t, "0", rows[5][11], "Min days 0 still marks meetings that may share a day")
	cell, err := f.GetCellType("Rooms", "B2")
	require.NoError(t, err)
	assert.Contains(t, []excelize.CellType{excelize.CellTypeNumber, excelize.CellTypeUnset}, cell, "capacities are number cells (no type attribute means number)")
	cell, err = f.GetCellType("Rooms", "A2")
	require.NoError(t, err)
	assert.Equal(t, excelize.CellTypeInlineString, cell, "IDs are text cells")
	un, err := f.GetRows("Unavailable")
	require.NoError(t, err)
	assert.Equal(t, []string{"S-1002", "Fri", "", "", "hard", "Research day"}, un[1], "a whole day leaves From and To blank")
	assert.Equal(t, []string{"ALD.102", "Wed", "13:00", "15:00", "3"}, un[2][:5])
}

// TestWriteTermReadBack writes terms in both forms and reads them back with
// the workbook readers: the hand-made term and generated terms must come
// back equal (apart from Src, which the readers fill in) and without any
// problem.
func TestWriteTermReadBack(t *testing.T) {
	cases := []struct {
		name string
		term *timetable.Term
	}{
		{"hand-made", handTerm()},
		{"generated 60", samples.Generate(samples.Config{Sections: 60, Seed: 11})},
		{"generated demo", samples.Generate(samples.DemoConfig)},
		{"campus demo (meeting patterns)", samples.Campus()},
		{"mixed grid and patterns", mixedTerm()},
		{"courses and requests", courseTerm()},
		{"generated odd grid", samples.Generate(samples.Config{Sections: 40, Seed: 5, Days: 6, PeriodsPerDay: 5, Weeks: 7,
			FirstDay: time.Date(2028, 1, 12, 0, 0, 0, 0, time.UTC)})},
	}
	if !testing.Short() {
		cases = append(cases, struct {
			name string
			term *timetable.Term
		}{"generated 600", samples.Generate(samples.Config{Sections: 600, Seed: 1})})
	}
	for _, c := range cases {
		t.Run(c.name+"/xlsx", func(t *testing.T) {
			var buf bytes.Buffer
			require.NoError(t, timetable.WriteTermWorkbook(c.term, &buf))
			got, ps, err := timetable.ReadWorkbook(&buf, "term.xlsx")
			require.NoError(t, err)
			assert.Empty(t, ps, "problems:\n%s", ps)
			assertSameTerm(t, c.term, got)
		})
		t.Run(c.name+"/csv", func(t *testing.T) {
			dir := t.TempDir()
			require.NoError(t, timetable.WriteTermCSV(c.term, dir))
			got, ps, err := timetable.ReadCSVDir(dir)
			require.NoError(t, err)
			assert.Empty(t, ps, "problems:\n%s", ps)
			assertSameTerm(t, c.term, got)
		})
	}
}

// openTermWorkbook writes term with WriteTermWorkbook and opens the bytes
// with excelize; the file is closed when the test ends.
func openTermWorkbook(t *testing.T, term *timetable.Term) *excelize.File {
	t.Helper()
	var buf bytes.Buffer
	require.NoError(t, timetable.WriteTermWorkbook(term, &buf))
	f, err := excelize.OpenReader(&buf)
	require.NoError(t, err)
	t.Cleanup(func() { f.Close() })
	return f
}

// assertSameTerm compares two terms field by field, ignoring Src and the
// difference between nil and empty.
func assertSameTerm(t *testing.T, want, got *timetable.Term) {
	t.Helper()
	w, g := normalTerm(want), normalTerm(got)
	assert.Equal(t, w.Name, g.Name)
	assert.True(t, w.FirstDay.Equal(g.FirstDay) && w.LastDay.Equal(g.LastDay), "dates %v..%v vs %v..%v", w.FirstDay, w.LastDay, g.FirstDay, g.LastDay)
	assert.Equal(t, w.TimeZone, g.TimeZone)
	assert.Equal(t, w.Holidays, g.Holidays)
	assert.Equal(t, w.Periods, g.Periods)
	assert.Equal(t, w.Rooms, g.Rooms)
	assert.Equal(t, w.Staff, g.Staff)
	assert.Equal(t, w.Cohorts, g.Cohorts)
	assert.Equal(t, w.Sections, g.Sections)
	assert.Equal(t, w.Enrolments, g.Enrolments)
	assert.Equal(t, w.Requests, g.Requests)
	assert.Equal(t, w.Unavailable, g.Unavailable)
	assert.Equal(t, w.Relations, g.Relations)
	assert.Equal(t, w.Travel, g.Travel)
	assert.Equal(t, w.Weights, g.Weights)
	assert.Equal(t, w.SoftCapacity, g.SoftCapacity)
}

// normalTerm returns a copy of t with every Src zeroed, empty slices and
// maps made nil, and dates in UTC.
func normalTerm(t *timetable.Term) timetable.Term {
	c := *t
	c.FirstDay, c.LastDay = c.FirstDay.UTC(), c.LastDay.UTC()
	c.Holidays = nil
	for _, h := range t.Holidays {
		c.Holidays = append(c.Holidays, h.UTC())
	}
	c.Periods = clearSrc(t.Periods)
	c.Rooms = clearSrc(t.Rooms)
	c.Staff = clearSrc(t.Staff)
	c.Cohorts = clearSrc(t.Cohorts)
	c.Sections = clearSrc(t.Sections)
	c.Enrolments = clearSrc(t.Enrolments)
	c.Requests = clearSrc(t.Requests)
	c.Unavailable = clearSrc(t.Unavailable)
	c.Relations = clearSrc(t.Relations)
	c.Travel = clearSrc(t.Travel)
	c.Weights = nil
	for k, w := range t.Weights {
		if c.Weights == nil {
			c.Weights = map[string]timetable.Weight{}
		}
		w.Src = timetable.Source{}
		c.Weights[k] = w
	}
	return c
}

// clearSrc copies xs with each element's Src field zeroed and its empty
// slice fields made nil.
func clearSrc[T any](xs []T) []T {
	if len(xs) == 0 {
		return nil
	}
	out := make([]T, len(xs))
	for i, x := range xs {
		v := reflect.ValueOf(&x).Elem()
		for f := 0; f < v.NumField(); f++ {
			fv := v.Field(f)
			switch {
			case v.Type().Field(f).Name == "Src":
				fv.Set(reflect.Zero(fv.Type()))
			case fv.Kind() == reflect.Slice && fv.Len() == 0:
				fv.Set(reflect.Zero(fv.Type()))
			case fv.Kind() == reflect.Slice && fv.Type().Elem().Kind() == reflect.Struct:
				fv.Set(reflect.ValueOf(clearSrcValue(fv.Interface())))
			}
		}
		out[i] = x
	}
	return out
}

// clearSrcValue applies clearSrc to the nested record slices a Section
// holds (meeting times, room choices).
func clearSrcValue(xs any) any {
	switch v := xs.(type) {
	case []timetable.TimeChoice:
		return clearSrc(v)
	case []timetable.RoomChoice:
		return clearSrc(v)
	}
	return xs
}

// BenchmarkWriteTermWorkbook measures writing a generated 2,000-section
// term (about 50,000 enrolment rows) as an .xlsx workbook.
func BenchmarkWriteTermWorkbook(b *testing.B) {
	term := samples.Generate(samples.Config{Sections: 2000, Seed: 7})
	b.ReportAllocs()
	for b.Loop() {
		var buf bytes.Buffer
		if err := timetable.WriteTermWorkbook(term, &buf); err != nil {
			b.Fatal(err)
		}
	}
}

// FuzzWriteTermRoundTrip writes a small term whose free text, week set and
// Min days come from the fuzzer, in both forms, and reads it back: it must
// come back equal and clean. Text is limited to what a cell holds as
// written: printable, without surrounding spaces.
func FuzzWriteTermRoundTrip(f *testing.F) {
	f.Add(uint64(0x555), "Spectroscopy", "Hélène Lefèvre", "Research day", 2)
	f.Add(uint64(0b1011), "Σύνοψη, \"quoted\"; semi", "Олена Коваленко", "Ó Dálaigh's day", 0)
	f.Add(uint64(1<<11), "=1+2", "Łukasz", "", 7)
	f.Add(uint64(3), "@SUM(A1)", "-Łukasz", "'=quoted", 1)
	f.Add(^uint64(0), "Fúnmiláyọ̀ — ½ ‰ 😀", "x", "y", -1)
	f.Fuzz(func(t *testing.T, weeks uint64, title, name, reason string, minDays int) {
		for _, s := range []string{title, name, reason} {
			if !utf8.ValidString(s) || strings.TrimSpace(s) != s || strings.IndexFunc(s, func(r rune) bool { return !unicode.IsPrint(r) }) >= 0 || len(s) > 200 {
				t.Skip("not text a cell holds as written")
			}
		}
		term := handTerm()
		w := timetable.WeekSet(weeks) & term.AllWeeks()
		if w == 0 {
			w = 1
		}
		term.Sections[0].Title = title
		term.Sections[0].Weeks = w
		term.Sections[3].MinDays = max(0, minDays%8)
		term.Staff[1].Name = name
		term.Unavailable[0].Reason = reason

		var buf bytes.Buffer
		require.NoError(t, timetable.WriteTermWorkbook(term, &buf))
		got, ps, err := timetable.ReadWorkbook(&buf, "fuzz.xlsx")
		require.NoError(t, err)
		require.Empty(t, ps.Errors(), "errors:\n%s", ps)
		assertSameTerm(t, term, got)

		dir := t.TempDir()
		require.NoError(t, timetable.WriteTermCSV(term, dir))
		got, ps, err = timetable.ReadCSVDir(dir)
		require.NoError(t, err)
		require.Empty(t, ps.Errors(), "errors:\n%s", ps)
		assertSameTerm(t, term, got)
	})
}

// TestWriteTermCSVFormulaSafe writes a term whose free text begins with
// the formula triggers of OWASP's "CSV Injection" guidance (= + - @ tab
// CR): no cell of the CSV files may start with one (a plain number such as
// -5 may), the workbook keeps them as string cells (a formula is only made
// by a cell of formula type, ECMA-376 Part 1 §18.3.1.40 <f>), and both forms
// read back exactly.
func TestWriteTermCSVFormulaSafe(t *testing.T) {
	term := handTerm()
	hostile := []string{`=HYPERLINK("http://evil.example","click")`, "@SUM(A1)", "+cmd|' /C calc'!A0", "-2+3", "'=already quoted"}
	term.Sections[0].Title = hostile[0]
	term.Sections[1].Title = hostile[1]
	term.Staff[1].Name = hostile[2]
	term.Cohorts[1].Name = hostile[3]
	term.Unavailable[0].Reason = hostile[4]

	dir := t.TempDir()
	require.NoError(t, timetable.WriteTermCSV(term, dir))
	for _, name := range timetable.TermCSVFiles() {
		data, err := os.ReadFile(filepath.Join(dir, name))
		if errors.Is(err, fs.ErrNotExist) {
			continue // a sheet the term does not use
		}
		require.NoError(t, err)
		rows, err := csv.NewReader(bytes.NewReader(data)).ReadAll()
		require.NoError(t, err, name)
		for r, row := range rows {
			for c, cell := range row {
				if cell != "" && strings.ContainsRune("=+-@\t\r", rune(cell[0])) {
					_, numErr := strconv.ParseFloat(cell, 64)
					assert.NoError(t, numErr, "%s row %d column %d starts a formula: %q", name, r+1, c+1, cell)
				}
			}
		}
	}
	got, ps, err := timetable.ReadCSVDir(dir)
	require.NoError(t, err)
	assert.Empty(t, ps, "problems:\n%s", ps)
	assertSameTerm(t, term, got)

	var buf bytes.Buffer
	require.NoError(t, timetable.WriteTermWorkbook(term, &buf))
	f, err := excelize.OpenReader(bytes.NewReader(buf.Bytes()))
	require.NoError(t, err)
	defer f.Close()
	for _, sheet := range f.GetSheetList() {
		rows, err := f.GetRows(sheet)
		require.NoError(t, err)
		for r, row := range rows {
			for c := range row {
				cell, _ := excelize.CoordinatesToCellName(c+1, r+1)
				formula, err := f.GetCellFormula(sheet, cell)
				require.NoError(t, err)
				assert.Empty(t, formula, "%s!%s holds a formula", sheet, cell)
			}
		}
	}
	got, ps, err = timetable.ReadWorkbook(bytes.NewReader(buf.Bytes()), "term.xlsx")
	require.NoError(t, err)
	assert.Empty(t, ps, "problems:\n%s", ps)
	assertSameTerm(t, term, got)
}
