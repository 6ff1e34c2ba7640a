package main

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/export"
	"github.com/termwright/termwright/timetable"
)

// diffTerm is a small invented term: Mon–Fri 09:00–12:00 in hours, two
// rooms, three staff, one cohort, sections A (two meetings), B, C, D, E,
// F, and students P1 (in A) and P2 (in B).
func diffTerm() *timetable.Term {
	t := &timetable.Term{
		Name:     "Spring 2028",
		FirstDay: time.Date(2028, 1, 10, 0, 0, 0, 0, time.UTC),
		LastDay:  time.Date(2028, 3, 31, 0, 0, 0, 0, time.UTC),
		TimeZone: "Europe/Dublin",
		Holidays: []time.Time{time.Date(2028, 2, 14, 0, 0, 0, 0, time.UTC)},
		Rooms:    []timetable.Room{{ID: "R1", Capacity: 40}, {ID: "R2", Capacity: 40, Building: "Annexe"}},
		Staff:    []timetable.Staff{{ID: "S1", Name: "Dana Pell"}, {ID: "S2", Name: "Omar Vint"}, {ID: "S3", Name: "Lia Morrow"}},
		Cohorts:  []timetable.Cohort{{ID: "C1", Name: "Year one", Size: 20}},
		Enrolments: []timetable.Enrolment{
			{Student: "P1", Section: "A"}, {Student: "P2", Section: "B"},
		},
	}
	for _, d := range []time.Weekday{time.Monday, time.Tuesday, time.Wednesday, time.Thursday, time.Friday} {
		for h := 9; h < 12; h++ {
			t.Periods = append(t.Periods, timetable.Period{Index: len(t.Periods), Day: d, Start: timetable.Clock(h * 60), End: timetable.Clock(h*60 + 60)})
		}
	}
	sec := func(id, title, staff string, meetings int, cohorts ...string) timetable.Section {
		return timetable.Section{ID: id, Title: title, Staff: []string{staff}, Cohorts: cohorts, Size: 20, Meetings: meetings, Length: 1, Weeks: t.AllWeeks()}
	}
	t.Sections = []timetable.Section{
		sec("A", "Drawing", "S1", 2, "C1"), sec("B", "Botany", "S2", 1, "C1"), sec("C", "Ceramics", "S3", 1),
		sec("D", "Dance", "S3", 1), sec("E", "Etching", "S1", 1), sec("F", "Film", "S2", 1),
	}
	return t
}

// at is the index of the period on day d at hour h in diffTerm.
func at(d time.Weekday, h int) int { return (timetable.WeekOrder(d))*3 + h - 9 }

// diffFiles writes diffTerm and two timetables for it into dir, worked by
// hand: A's Wednesday meeting moves to Thursday (its Monday one stays), E
// and F swap rooms, C is dropped and D added, B's weeks become 1-6 (the
// new timetable is written for a term where B meets in weeks 1-6 only and
// C is cancelled: the new timetable is valid for it).
// It returns the paths and the term the new timetable was written for.
func diffFiles(t *testing.T, dir string) (termPath, oldPath, newPath string, term *timetable.Term, old, cur *timetable.Schedule) {
	t.Helper()
	M, Tu, W, Th, F := time.Monday, time.Tuesday, time.Wednesday, time.Thursday, time.Friday
	p := func(sec string, n, period int, room string) timetable.Placement {
		return timetable.Placement{Section: sec, Meeting: n, Period: period, Room: room}
	}
	old = &timetable.Schedule{Placements: []timetable.Placement{
		p("A", 1, at(M, 9), "R1"), p("A", 2, at(W, 9), "R1"), p("B", 1, at(M, 10), "R2"),
		p("C", 1, at(Tu, 9), "R1"), p("E", 1, at(F, 9), "R1"), p("F", 1, at(F, 9), "R2"),
	}}
	cur = &timetable.Schedule{Placements: []timetable.Placement{
		p("A", 1, at(Th, 9), "R1"), p("A", 2, at(M, 9), "R1"), p("B", 1, at(M, 10), "R2"),
		p("D", 1, at(Tu, 11), "R2"), p("E", 1, at(F, 9), "R2"), p("F", 1, at(F, 9), "R1"),
	}}
	oldTerm, newTerm := diffTerm(), diffTerm()
	newTerm.Sections[1].Weeks = 0b111111
	newTerm.Sections = append(newTerm.Sections[:2], newTerm.Sections[3:]...) // C is cancelled
	var buf bytes.Buffer
	require.NoError(t, timetable.WriteTermWorkbook(newTerm, &buf))
	termPath = filepath.Join(dir, "term.xlsx")
	require.NoError(t, os.WriteFile(termPath, buf.Bytes(), 0o644))
	write := func(name string, tt *timetable.Term, s *timetable.Schedule) string {
		var b bytes.Buffer
		require.NoError(t, export.WriteTimetableWorkbook(&b, tt, s, export.Options{Generated: time.Date(2028, 1, 3, 9, 0, 0, 0, time.UTC)}))
		path := filepath.Join(dir, name)
		require.NoError(t, os.WriteFile(path, b.Bytes(), 0o644))
		return path
	}
	return termPath, write("old.xlsx", oldTerm, old), write("new.xlsx", newTerm, cur), newTerm, old, cur
}

func TestDiffGolden(t *testing.T) {
	dir := t.TempDir()
	termPath, oldPath, newPath, _, _, _ := diffFiles(t, dir)
	cases := []struct {
		name, golden string
		args         []string
	}{
		{"with term, text", "diff.golden.txt", []string{"diff", oldPath, newPath, termPath}},
		{"with term, json", "diff.golden.json", []string{"diff", "--json", oldPath, newPath, termPath}},
		{"alone, text", "diff-alone.golden.txt", []string{"diff", oldPath, newPath}},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			e, out, errb := checkEnv()
			require.Equal(t, exitOK, run(tc.args, e), errb.String())
			got := strings.ReplaceAll(out.String(), dir+string(filepath.Separator), "")
			golden := filepath.Join("testdata", tc.golden)
			if updateGolden() {
				require.NoError(t, os.WriteFile(golden, []byte(got), 0o644))
			}
			want, err := os.ReadFile(golden)
			require.NoError(t, err, "run go test -update to create the golden file")
			assert.Equal(t, string(want), got)
		})
	}
}

// TestDiffJSONHand checks the JSON against the changes worked out by hand
// in diffFiles, independently of the golden file.
func TestDiffJSONHand(t *testing.T) {
	dir := t.TempDir()
	termPath, oldPath, newPath, _, _, _ := diffFiles(t, dir)
	e, out, errb := checkEnv()
	require.Equal(t, exitOK, run([]string{"diff", "--json", oldPath, newPath, termPath}, e), errb.String())
	var rep diffReport
	require.NoError(t, json.Unmarshal(out.Bytes(), &rep))
	// A: Mon stays (numbers swapped), Wed -> Thu; B: weeks; C dropped; D added; E, F rooms.
	assert.Equal(t, diffSummary{Unchanged: 1, Moved: 4, Added: 1, Dropped: 1}, rep.Summary)
	got := map[string]string{}
	for _, s := range rep.Sections {
		for _, c := range s.Changes {
			got[s.ID] += c.Change + strings.Join(c.What, "+") + ";"
		}
	}
	assert.Equal(t, map[string]string{"A": "movedday;", "B": "movedweeks;", "C": "dropped;", "D": "added;", "E": "movedroom;", "F": "movedroom;"}, got)
	subjects := map[string]int{}
	for _, a := range rep.Affected {
		subjects[a.Kind+" "+a.ID] = len(a.Changes)
	}
	assert.Equal(t, map[string]int{
		"staff S1": 2, "staff S2": 2, "staff S3": 2, // A, E; B, F; C, D
		"room R1": 4, "room R2": 4, // R1: A moved within it, C and E out, F in; R2: B moved within it, D and E in, F out
		"cohort C1": 2, "student P1": 1, "student P2": 1,
	}, subjects)
	assert.Contains(t, errb.String(), "old.xlsx names 1 section or room that", "the cancelled section is noted, not refused")
}

func TestDiffErrors(t *testing.T) {
	dir := t.TempDir()
	termPath, oldPath, newPath, _, _, _ := diffFiles(t, dir)
	// A term without section D: the new timetable does not fit it.
	small := diffTerm()
	small.Sections = append(small.Sections[:3], small.Sections[4:]...)
	var buf bytes.Buffer
	require.NoError(t, timetable.WriteTermWorkbook(small, &buf))
	smallPath := filepath.Join(dir, "small.xlsx")
	require.NoError(t, os.WriteFile(smallPath, buf.Bytes(), 0o644))
	cases := []struct {
		name   string
		args   []string
		stderr string
	}{
		{"missing file", []string{"diff", filepath.Join(dir, "nope.xlsx"), newPath}, "does not exist"},
		{"does not fit the term", []string{"diff", oldPath, newPath, smallPath}, "does not fit"},
		{"a term is no timetable", []string{"diff", termPath, newPath}, "no Timetable sheet"},
		{"one argument", []string{"diff", oldPath}, "Usage:"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			e, _, errb := checkEnv()
			assert.Equal(t, exitError, run(tc.args, e))
			assert.Contains(t, errb.String(), tc.stderr)
		})
	}
}

func TestDiffSame(t *testing.T) {
	dir := t.TempDir()
	_, oldPath, _, _, _, _ := diffFiles(t, dir)
	e, out, errb := checkEnv()
	require.Equal(t, exitOK, run([]string{"diff", oldPath, oldPath}, e), errb.String())
	assert.Contains(t, out.String(), "0 moved, 0 added, 0 dropped, 6 unchanged\nNo differences.")
}
