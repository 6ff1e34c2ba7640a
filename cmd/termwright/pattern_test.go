package main

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	ics "github.com/arran4/golang-ical"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/export"
	"github.com/termwright/termwright/timetable"
)

// patternFiles writes diffTerm with two sections placed by meeting
// patterns (and a room R3 for them) and two timetables for it into dir,
// worked by hand: G (taught by S4) moves from Mon Wed Fri 09:00-09:50 to
// Tue Thu 10:00-11:15 in R3, H (S4, odd weeks) stays on Wed 11:00-11:50
// but moves from R3 to R2; the grid sections stay where they are.
func patternFiles(t *testing.T, dir string) (termPath, oldPath, newPath string) {
	t.Helper()
	term := diffTerm()
	term.Rooms = append(term.Rooms, timetable.Room{ID: "R3", Capacity: 30})
	term.Staff = append(term.Staff, timetable.Staff{ID: "S4", Name: "Noor Achterberg"})
	all := term.AllWeeks()
	odd := timetable.WeekSet(0x5555) & all
	term.Sections = append(term.Sections,
		timetable.Section{ID: "G", Title: "Geometry", Staff: []string{"S4"}, Size: 20, Times: []timetable.TimeChoice{
			{Days: timetable.DaysOf(time.Monday, time.Wednesday, time.Friday), Start: 9 * 60, Minutes: 50, Weeks: all},
			{Days: timetable.DaysOf(time.Tuesday, time.Thursday), Start: 10 * 60, Minutes: 75, Weeks: all},
		}},
		timetable.Section{ID: "H", Title: "Harmony", Staff: []string{"S4"}, Size: 20, Times: []timetable.TimeChoice{
			{Days: timetable.DaysOf(time.Wednesday), Start: 11 * 60, Minutes: 50, Weeks: odd},
		}},
	)
	M, Tu, W, F := time.Monday, time.Tuesday, time.Wednesday, time.Friday
	grid := func(sec string, n, period int, room string) timetable.Placement {
		return timetable.Placement{Section: sec, Meeting: n, Period: period, Room: room}
	}
	pat := func(sec string, choice int, room string) timetable.Placement {
		return timetable.Placement{Section: sec, Meeting: 1, Period: -1, Time: choice, Room: room}
	}
	base := []timetable.Placement{
		grid("A", 1, at(M, 9), "R1"), grid("A", 2, at(W, 9), "R1"), grid("B", 1, at(M, 10), "R2"),
		grid("C", 1, at(Tu, 9), "R1"), grid("D", 1, at(Tu, 11), "R2"), grid("E", 1, at(F, 9), "R1"), grid("F", 1, at(F, 9), "R2"),
	}
	old := &timetable.Schedule{Placements: append(append([]timetable.Placement(nil), base...), pat("G", 1, "R3"), pat("H", 1, "R3"))}
	cur := &timetable.Schedule{Placements: append(append([]timetable.Placement(nil), base...), pat("G", 2, "R3"), pat("H", 1, "R2"))}
	for _, s := range []*timetable.Schedule{old, cur} {
		require.Empty(t, timetable.HardViolations(timetable.Check(term, s)))
	}
	var buf bytes.Buffer
	require.NoError(t, timetable.WriteTermWorkbook(term, &buf))
	termPath = filepath.Join(dir, "term.xlsx")
	require.NoError(t, os.WriteFile(termPath, buf.Bytes(), 0o644))
	write := func(name string, s *timetable.Schedule) string {
		var b bytes.Buffer
		require.NoError(t, export.WriteTimetableWorkbook(&b, term, s, export.Options{Generated: time.Date(2028, 1, 3, 9, 0, 0, 0, time.UTC)}))
		path := filepath.Join(dir, name)
		require.NoError(t, os.WriteFile(path, b.Bytes(), 0o644))
		return path
	}
	return termPath, write("old.xlsx", old), write("new.xlsx", cur)
}

// TestDiffPatterns compares two timetables of a term with pattern
// sections, with and without the term: G moved day and time (another
// meeting time), H moved room; both say their whole pattern, old and new.
func TestDiffPatterns(t *testing.T) {
	dir := t.TempDir()
	termPath, oldPath, newPath := patternFiles(t, dir)
	for name, args := range map[string][]string{"with term": {"diff", oldPath, newPath, termPath}, "alone": {"diff", oldPath, newPath}} {
		t.Run(name, func(t *testing.T) {
			e, out, errb := checkEnv()
			require.Equal(t, exitOK, run(args, e), errb.String())
			got := out.String()
			assert.Contains(t, got, ": 2 moved, 0 added, 0 dropped, 7 unchanged\n")
			assert.Contains(t, got, "  G Geometry\n    moved (day, time): meeting 1, Mon Wed Fri 09:00–09:50 in R3 → Tue Thu 10:00–11:15 in R3\n")
			assert.Contains(t, got, "  H Harmony\n    moved (room): meeting 1, Wed 11:00–11:50 in R3, weeks odd → Wed 11:00–11:50 in R2, weeks odd\n")
		})
	}
	e, out, errb := checkEnv()
	require.Equal(t, exitOK, run([]string{"diff", "--json", oldPath, newPath, termPath}, e), errb.String())
	var rep diffReport
	require.NoError(t, json.Unmarshal(out.Bytes(), &rep))
	var g *diffChange
	for _, s := range rep.Sections {
		if s.ID == "G" {
			g = &s.Changes[0]
		}
	}
	require.NotNil(t, g)
	assert.Equal(t, "Mon Wed Fri", g.From.Day)
	assert.Equal(t, "Tue Thu", g.To.Day)
	assert.Equal(t, "11:15", g.To.End)
}

// TestNotifyPatterns writes the change notices of the pattern timetables:
// S4's text says the old and new pattern in plain words with the new
// meeting's first and last dates (the term runs Mon 10 Jan to Fri 31 Mar
// 2028: the first Tuesday is 11 Jan, the last Thursday 30 Mar), and S4's
// calendar, read with an independent parser (github.com/arran4/golang-ical),
// keeps the UIDs of G's first two days for its two new days (Tue, Thu) and
// cancels the third old day's event (RFC 5545 §3.8.1.11 STATUS:CANCELLED),
// so that no Friday event is left behind in an imported calendar.
func TestNotifyPatterns(t *testing.T) {
	dir := t.TempDir()
	termPath, oldPath, newPath := patternFiles(t, dir)
	outDir := filepath.Join(dir, "notices")
	e, out, errb := notifyEnv()
	require.Equal(t, exitOK, run([]string{"notify", termPath, oldPath, newPath, "-o", outDir}, e), errb.String())
	assert.Contains(t, out.String(), "Wrote 1 notice")
	text := string(mustRead(t, filepath.Join(outDir, "staff", "S4.txt")))
	assert.Contains(t, text, "G Geometry (changed)\n  was: Mondays, Wednesdays and Fridays 09:00–09:50 in R3\n"+
		"  now: Tuesdays and Thursdays 10:00–11:15 in R3, from Tue 11 Jan 2028 to Thu 30 Mar 2028\n")
	assert.Contains(t, text, "H Harmony (changed)\n  was: Wednesdays 11:00–11:50 in R3, weeks odd\n"+
		"  now: Wednesdays 11:00–11:50 in R2, Annexe, weeks odd, from Wed 12 Jan 2028 to Wed 22 Mar 2028\n") // odd weeks of 12: the last is week 11

	cal, err := ics.ParseCalendar(bytes.NewReader(mustRead(t, filepath.Join(outDir, "staff", "S4.ics"))))
	require.NoError(t, err)
	type ev struct{ start, status string }
	byUID := map[string]ev{}
	for _, x := range cal.Events() {
		st := ""
		if p := x.GetProperty(ics.ComponentPropertyStatus); p != nil {
			st = p.Value
		}
		if strings.Contains(x.GetProperty(ics.ComponentPropertySummary).Value, "G Geometry") {
			byUID[x.GetProperty(ics.ComponentPropertyUniqueId).Value] = ev{x.GetProperty(ics.ComponentPropertyDtStart).Value, st}
		}
	}
	// The UIDs the old calendar gave G's Monday, Wednesday and Friday events.
	e2, _, _ := notifyEnv()
	pub := filepath.Join(dir, "old-pub")
	require.Equal(t, exitOK, run([]string{"publish", termPath, oldPath, "-o", pub}, e2))
	oc, err := ics.ParseCalendar(bytes.NewReader(mustRead(t, filepath.Join(pub, "calendar", "staff", "S4.ics"))))
	require.NoError(t, err)
	var oldUIDs []string
	for _, x := range oc.Events() {
		if strings.Contains(x.GetProperty(ics.ComponentPropertySummary).Value, "G Geometry") {
			oldUIDs = append(oldUIDs, x.GetProperty(ics.ComponentPropertyUniqueId).Value)
		}
	}
	require.Len(t, oldUIDs, 3)
	require.Len(t, byUID, 3)
	assert.Equal(t, ev{"20280111T100000", ""}, byUID[oldUIDs[0]], "Monday's event becomes Tuesday's")
	assert.Equal(t, ev{"20280113T100000", ""}, byUID[oldUIDs[1]], "Wednesday's becomes Thursday's")
	assert.Equal(t, "CANCELLED", byUID[oldUIDs[2]].status, "Friday's is cancelled")
}

// TestPublishPatterns publishes the new pattern timetable: the CSV has one
// row per pattern placement with its days, and S4's calendar one event per
// day of G's pattern plus H's.
func TestPublishPatterns(t *testing.T) {
	dir := t.TempDir()
	termPath, _, newPath := patternFiles(t, dir)
	pub := filepath.Join(dir, "pub")
	e, out, errb := notifyEnv()
	require.Equal(t, exitOK, run([]string{"publish", termPath, newPath, "-o", pub}, e), errb.String())
	assert.Contains(t, out.String(), "Published ")
	csv := string(mustRead(t, filepath.Join(pub, "timetable.csv")))
	assert.Contains(t, csv, "G,Geometry,1,Tue Thu,10:00,11:15,R3,S4,,all,Noor Achterberg\r\n")
	assert.Contains(t, csv, "H,Harmony,1,Wed,11:00,11:50,R2,S4,,odd,Noor Achterberg\r\n")
	cal := string(mustRead(t, filepath.Join(pub, "calendar", "staff", "S4.ics")))
	assert.Equal(t, 3, strings.Count(cal, "BEGIN:VEVENT"))
	_, err := os.Stat(filepath.Join(pub, "pdf", "staff", "S4.pdf"))
	assert.NoError(t, err)
}
