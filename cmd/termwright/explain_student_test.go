package main

import (
	"bytes"
	"os"
	"path/filepath"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/export"
	"github.com/termwright/termwright/timetable"
)

// studentFiles writes a small invented term with courses and one
// student's requests, and a timetable of it, as workbooks in a temporary
// folder. By construction (worked by hand): BIO's labs belong to their
// main classes; MTH-1 meets with BIO-L1 on Monday at 09:00; CHM-1 starts ten
// minutes after BIO-LAB2 ends, in the other building, 25 minutes away; so
// BIO, MTH and CHM cannot be combined, and ART (Friday) is free.
func studentFiles(t *testing.T) (termPath, schedPath string) {
	t.Helper()
	tm := &timetable.Term{Name: "Harrow Fen College — Spring", FirstDay: time.Date(2028, 1, 10, 0, 0, 0, 0, time.UTC), LastDay: time.Date(2028, 2, 4, 0, 0, 0, 0, time.UTC)}
	tm.Rooms = []timetable.Room{{ID: "N1", Capacity: 40, Building: "North"}, {ID: "S1", Capacity: 40, Building: "South"}}
	tm.Travel = []timetable.Travel{{From: "North", To: "South", Minutes: 25}}
	tm.Staff = []timetable.Staff{{ID: "HF-1", Name: "Edda Marlowe"}}
	add := func(id, course, part, parent, room string, day time.Weekday, h int) {
		tm.Sections = append(tm.Sections, timetable.Section{ID: id, Title: course + " " + part, Staff: []string{"HF-1"}, Size: 20, Meetings: 1, Length: 1,
			Course: course, Part: part, Parent: parent, Limit: 30, Weeks: tm.AllWeeks(),
			RoomChoices: []timetable.RoomChoice{{Room: room}},
			Times:       []timetable.TimeChoice{{Days: timetable.DaysOf(day), Start: timetable.Clock(60 * h), Minutes: 50, Weeks: tm.AllWeeks()}}})
	}
	add("BIO-L1", "BIO", "Main", "", "N1", time.Monday, 9)
	add("BIO-L2", "BIO", "Main", "", "N1", time.Tuesday, 9)
	add("BIO-LAB1", "BIO", "Lab", "BIO-L1", "N1", time.Monday, 14)
	add("BIO-LAB2", "BIO", "Lab", "BIO-L2", "N1", time.Wednesday, 14)
	add("MTH-1", "MTH", "", "", "S1", time.Monday, 11)
	add("CHM-1", "CHM", "", "", "S1", time.Wednesday, 15)
	add("ART-1", "ART", "", "", "S1", time.Friday, 9)
	tm.Sections[4].Times[0].Start = 9 * 60 // MTH-1 with BIO-L1; another staff member teaches it
	tm.Staff = append(tm.Staff, timetable.Staff{ID: "HF-2", Name: "Ilse Brandt"})
	tm.Sections[4].Staff = []string{"HF-2"}
	for _, c := range []string{"BIO", "MTH", "CHM", "ART"} {
		tm.Requests = append(tm.Requests, timetable.Request{Student: "HF-S01", Course: c})
	}
	tm.Requests = append(tm.Requests, timetable.Request{Student: "HF-S02", Course: "BIO"}, timetable.Request{Student: "HF-S02", Course: "ART"})
	sched := &timetable.Schedule{}
	for _, s := range tm.Sections {
		sched.Placements = append(sched.Placements, timetable.Placement{Section: s.ID, Meeting: 1, Period: -1, Time: 1, Room: s.RoomChoices[0].Room})
	}
	dir := t.TempDir()
	var buf bytes.Buffer
	require.NoError(t, timetable.WriteTermWorkbook(tm, &buf))
	termPath = filepath.Join(dir, "term.xlsx")
	require.NoError(t, os.WriteFile(termPath, buf.Bytes(), 0o644))
	buf.Reset()
	require.NoError(t, export.WriteTimetableWorkbook(&buf, tm, sched, export.Options{Generated: time.Date(2028, 1, 3, 9, 0, 0, 0, time.UTC)}))
	schedPath = filepath.Join(dir, "timetable.xlsx")
	require.NoError(t, os.WriteFile(schedPath, buf.Bytes(), 0o644))
	return termPath, schedPath
}

// TestExplainStudent: the student's clashes as golden text and JSON; a
// student who fits gets a clash-free choice; usage mistakes are refused.
func TestExplainStudent(t *testing.T) {
	termPath, schedPath := studentFiles(t)
	code, stdout, stderr := runExplainCmd(termPath, schedPath, "--student", "HF-S01")
	require.Equal(t, exitNone, code, stderr)
	explainGolden(t, "student-clashes.golden.txt", stdout)
	code, stdout, stderr = runExplainCmd(termPath, schedPath, "--student", "HF-S01", "--json")
	require.Equal(t, exitNone, code, stderr)
	explainGolden(t, "student-clashes.golden.json", stdout)
	m := explainJSON(t, stdout)
	assert.Equal(t, "clashes", m["status"])
	assert.Len(t, m["clashes"], 2)

	code, stdout, stderr = runExplainCmd(termPath, schedPath, "--student", "HF-S02")
	require.Equal(t, exitOK, code, stderr)
	explainGolden(t, "student-fits.golden.txt", stdout)

	code, _, stderr = runExplainCmd(termPath, schedPath, "--student", "NOBODY")
	assert.Equal(t, exitError, code)
	assert.Contains(t, stderr, `student "NOBODY" has no row on the Course requests or Enrolments sheets`)
	code, _, stderr = runExplainCmd(termPath, "--student", "HF-S01")
	assert.Equal(t, exitError, code)
	assert.Contains(t, stderr, "--student needs the timetable")
	code, _, stderr = runExplainCmd(termPath, schedPath)
	assert.Equal(t, exitError, code)
	assert.Contains(t, stderr, "only read with --student")
}
