package main

import (
	"bytes"
	"os"
	"path/filepath"
	"sort"
	"strconv"
	"strings"
	"testing"
	"time"

	ics "github.com/arran4/golang-ical"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/export"
	"github.com/termwright/termwright/samples"
	"github.com/termwright/termwright/timetable"
)

// notifyEnv is checkEnv with the clock set after the previous
// publication of diffFiles' old timetable (published 2028-01-03).
func notifyEnv() (*env, *bytes.Buffer, *bytes.Buffer) {
	e, out, errb := checkEnv()
	e.now = func() time.Time { return time.Date(2028, 1, 20, 14, 30, 0, 0, time.UTC) }
	return e, out, errb
}

func TestNotifyFiles(t *testing.T) {
	dir := t.TempDir()
	termPath, oldPath, newPath, _, _, _ := diffFiles(t, dir)
	outDir := filepath.Join(dir, "notices")
	e, out, errb := notifyEnv()
	require.Equal(t, exitOK, run([]string{"notify", termPath, oldPath, newPath, "-o", outDir}, e), errb.String())
	var files []string
	require.NoError(t, filepath.Walk(outDir, func(p string, fi os.FileInfo, err error) error {
		if err == nil && !fi.IsDir() {
			rel, _ := filepath.Rel(outDir, p)
			files = append(files, filepath.ToSlash(rel))
		}
		return err
	}))
	sort.Strings(files)
	// Worked out by hand from diffFiles: S1 (A, E), S2 (B, F), S3 (C, D),
	// cohort C1 (A, B), students P1 (A) and P2 (B): six; rooms get no notice.
	assert.Equal(t, []string{
		"cohorts/C1.ics", "cohorts/C1.txt",
		"staff/S1.ics", "staff/S1.txt", "staff/S2.ics", "staff/S2.txt", "staff/S3.ics", "staff/S3.txt",
		"students/P1.ics", "students/P1.txt", "students/P2.ics", "students/P2.txt",
	}, files)
	assert.Contains(t, out.String(), "Wrote 6 notices")

	// The texts, in one golden file.
	var all strings.Builder
	for _, f := range files {
		if strings.HasSuffix(f, ".txt") {
			b, err := os.ReadFile(filepath.Join(outDir, f))
			require.NoError(t, err)
			all.WriteString("==> " + f + " <==\n")
			all.Write(b)
		}
	}
	golden := filepath.Join("testdata", "notify.golden.txt")
	if updateGolden() {
		require.NoError(t, os.WriteFile(golden, []byte(all.String()), 0o644))
	}
	want, err := os.ReadFile(golden)
	require.NoError(t, err, "run go test -update to create the golden file")
	assert.Equal(t, string(want), all.String())

	// Dates worked out by hand: the term runs Mon 10 Jan – Fri 31 Mar 2028;
	// A's moved meeting is on Thursdays (13 Jan to 30 Mar); B meets in weeks
	// 1-6 on Mondays, and Mon 14 Feb (week 6) is a holiday, so it ends on 7 Feb.
	s1 := string(mustRead(t, filepath.Join(outDir, "staff", "S1.txt")))
	assert.Contains(t, s1, "Dear Dana Pell,")
	assert.Contains(t, s1, "  was: Wednesdays 09:00–10:00 in R1\n  now: Thursdays 09:00–10:00 in R1, from Thu 13 Jan 2028 to Thu 30 Mar 2028\n")
	s2 := string(mustRead(t, filepath.Join(outDir, "staff", "S2.txt")))
	assert.Contains(t, s2, "now: Mondays 10:00–11:00 in R2, Annexe, weeks 1-6, from Mon 10 Jan 2028 to Mon 7 Feb 2028\n")
	s3 := string(mustRead(t, filepath.Join(outDir, "staff", "S3.txt")))
	assert.Contains(t, s3, "C Ceramics (cancelled)\n  was: Tuesdays 09:00–10:00 in R1\n")
	assert.Contains(t, s3, "A cancelled meeting is in it as cancelled")
}

func mustRead(t *testing.T, p string) []byte {
	t.Helper()
	b, err := os.ReadFile(p)
	require.NoError(t, err)
	return b
}

// calEvent is what the calendar tests compare of one VEVENT.
type calEvent struct {
	start  string // DTSTART value
	seq    int64  // SEQUENCE
	status string // STATUS, "" when absent
}

// calEvents parses a calendar with the independent library
// github.com/arran4/golang-ical and returns its events by UID with
// their DTSTART and SEQUENCE, after the checks RFC 5545 asks of every
// calendar (§3.6: VERSION 2.0 and PRODID; §3.6.1: UID and DTSTAMP in each
// VEVENT; §3.3.8: SEQUENCE an INTEGER; §3.1: lines end in CRLF and are at
// most 75 octets).
func calEvents(t *testing.T, data []byte) map[string]calEvent {
	t.Helper()
	for _, line := range strings.SplitAfter(string(data), "\n") {
		if line == "" {
			continue
		}
		require.True(t, strings.HasSuffix(line, "\r\n"), "RFC 5545 §3.1: CRLF line ends")
		require.LessOrEqual(t, len(line)-2, 75, "RFC 5545 §3.1: at most 75 octets a line")
	}
	cal, err := ics.ParseCalendar(bytes.NewReader(data))
	require.NoError(t, err)
	props := map[string]string{}
	for _, p := range cal.CalendarProperties {
		props[p.IANAToken] = p.Value
	}
	require.Equal(t, "2.0", props["VERSION"])
	require.NotEmpty(t, props["PRODID"])
	out := map[string]calEvent{}
	for _, ev := range cal.Events() {
		uid := ev.GetProperty(ics.ComponentPropertyUniqueId)
		require.NotNil(t, uid)
		require.NotNil(t, ev.GetProperty(ics.ComponentPropertyDtstamp))
		seq, err := strconv.ParseInt(ev.GetProperty(ics.ComponentPropertySequence).Value, 10, 32)
		require.NoError(t, err)
		_, dup := out[uid.Value]
		require.False(t, dup, "UID repeated")
		status := ""
		if p := ev.GetProperty(ics.ComponentPropertyStatus); p != nil {
			status = p.Value
		}
		out[uid.Value] = calEvent{ev.GetProperty(ics.ComponentPropertyDtStart).Value, seq, status}
	}
	return out
}

// TestNotifyCalendarUpdatesPrevious publishes the old timetable's
// calendars as publish would (an earlier date), runs notify, and checks
// each new calendar against the earlier one with RFC 5545 §3.8.4.7 (UID:
// the same event keeps its UID) and §3.8.7.4 (SEQUENCE: a revision has a
// greater one). A's meetings were renumbered in the new timetable (its
// Monday meeting is meeting 2 there): the Monday event must still keep
// its UID, and the moved Wednesday event becomes a Thursday one under its
// old UID.
func TestNotifyCalendarUpdatesPrevious(t *testing.T) {
	dir := t.TempDir()
	termPath, oldPath, newPath, _, old, _ := diffFiles(t, dir)
	oldTerm := diffTerm()
	outDir := filepath.Join(dir, "notices")
	e, _, errb := notifyEnv()
	require.Equal(t, exitOK, run([]string{"notify", termPath, oldPath, newPath, "-o", outDir}, e), errb.String())
	cases := []struct {
		file string
		who  export.Subject
		// DTSTART of each previous event -> DTSTART of the event with its
		// UID now, with " CANCELLED" for a cancelled one, worked out by
		// hand from diffFiles.
		want map[string]string
	}{
		{"staff/S1.ics", export.Subject{Kind: timetable.WhoStaff, ID: "S1"}, map[string]string{
			"20280110T090000": "20280110T090000", // A Monday: unchanged
			"20280112T090000": "20280113T090000", // A Wednesday -> Thursday
			"20280114T090000": "20280114T090000", // E Friday: room changed only
		}},
		{"staff/S3.ics", export.Subject{Kind: timetable.WhoStaff, ID: "S3"}, map[string]string{
			"20280111T090000": "20280111T090000 CANCELLED", // C cancelled: Tue 11 Jan is the term's first Tuesday
		}},
		{"students/P1.ics", export.Subject{Kind: export.WhoStudent, ID: "P1"}, map[string]string{
			"20280110T090000": "20280110T090000",
			"20280112T090000": "20280113T090000",
		}},
	}
	for _, tc := range cases {
		t.Run(tc.file, func(t *testing.T) {
			var prev bytes.Buffer
			require.NoError(t, export.WriteICS(&prev, oldTerm, old, tc.who, export.Options{Generated: time.Date(2028, 1, 3, 9, 0, 0, 0, time.UTC)}))
			before := calEvents(t, prev.Bytes())
			after := calEvents(t, mustRead(t, filepath.Join(outDir, filepath.FromSlash(tc.file))))
			got := map[string]string{}
			for uid, ev := range before {
				now, ok := after[uid]
				require.True(t, ok, "RFC 5545 §3.8.4.7: the event of %s keeps its UID", ev.start)
				assert.Empty(t, ev.status)
				got[ev.start] = strings.TrimSpace(now.start + " " + now.status)
				assert.Greater(t, now.seq, ev.seq, "RFC 5545 §3.8.7.4: SEQUENCE of a revision is greater")
			}
			assert.Equal(t, tc.want, got)
		})
	}
}

func TestNotifyRefuses(t *testing.T) {
	dir := t.TempDir()
	termPath, oldPath, newPath, term, _, cur := diffFiles(t, dir)
	occupied := filepath.Join(dir, "occupied")
	require.NoError(t, os.MkdirAll(occupied, 0o755))
	require.NoError(t, os.WriteFile(filepath.Join(occupied, "keep.txt"), []byte("keep me"), 0o644))
	// A clash: E moved onto F's room and time.
	clash := &timetable.Schedule{Placements: append([]timetable.Placement(nil), cur.Placements...)}
	for i := range clash.Placements {
		if clash.Placements[i].Section == "E" {
			clash.Placements[i].Room = "R1"
		}
	}
	var b bytes.Buffer
	require.NoError(t, export.WriteTimetableWorkbook(&b, term, clash, export.Options{}))
	clashPath := filepath.Join(dir, "clash.xlsx")
	require.NoError(t, os.WriteFile(clashPath, b.Bytes(), 0o644))
	cases := []struct {
		name   string
		args   []string
		stderr string
	}{
		{"no output", []string{"notify", termPath, oldPath, newPath}, "-o DIR"},
		{"folder not empty", []string{"notify", termPath, oldPath, newPath, "-o", occupied}, "not empty"},
		{"new timetable breaks a hard requirement", []string{"notify", termPath, oldPath, clashPath, "-o", filepath.Join(dir, "n2")}, "no notices were written"},
		{"two arguments", []string{"notify", termPath, oldPath}, "Usage:"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			e, _, errb := notifyEnv()
			assert.Equal(t, exitError, run(tc.args, e))
			assert.Contains(t, errb.String(), tc.stderr)
		})
	}
	assert.Equal(t, "keep me", string(mustRead(t, filepath.Join(occupied, "keep.txt"))), "nothing of the user's is touched")
	_, err := os.Stat(filepath.Join(dir, "n2"))
	assert.True(t, os.IsNotExist(err), "a refused run creates no folder")
}

func TestDiffNotifyHelp(t *testing.T) {
	for _, name := range []string{"diff", "notify"} {
		t.Run(name, func(t *testing.T) {
			e, out, _ := checkEnv()
			require.Equal(t, exitOK, run([]string{name, "--help"}, e))
			path := filepath.Join("testdata", name+"-help.golden")
			if updateGolden() {
				require.NoError(t, os.WriteFile(path, out.Bytes(), 0o644))
			}
			want, err := os.ReadFile(path)
			require.NoError(t, err)
			assert.Equal(t, string(want), out.String())
		})
	}
}

// TestNotifyOptions checks flag parsing alone (env.parsed).
func TestNotifyOptions(t *testing.T) {
	e, _, _ := checkEnv()
	var got *notifyOptions
	var args []string
	e.parsed = func(o any, a []string) { got, args = o.(*notifyOptions), a }
	require.Equal(t, exitOK, run([]string{"notify", "t.xlsx", "a.xlsx", "b.xlsx", "-o", "out"}, e))
	assert.Equal(t, &notifyOptions{out: "out"}, got)
	assert.Equal(t, []string{"t.xlsx", "a.xlsx", "b.xlsx"}, args)
}

// TestNotifyDemo moves three meetings of the demo term's reference
// timetable (samples.DemoConfig) to other rooms where timetable.Check
// still passes, and expects one notice per staff member, cohort and
// enrolled student of those three sections (counted from the term
// here), each calendar readable by github.com/arran4/golang-ical.
func TestNotifyDemo(t *testing.T) {
	if testing.Short() {
		t.Skip("writes a few hundred notices")
	}
	term, s := samples.GenerateWithWitness(samples.DemoConfig)
	dir := t.TempDir()
	cur := &timetable.Schedule{Placements: append([]timetable.Placement(nil), s.Placements...)}
	moved := map[string]bool{}
	for i := 0; i < len(cur.Placements) && len(moved) < 3; i += 7 {
		p := &cur.Placements[i]
		if moved[p.Section] || p.Room == "" {
			continue
		}
		was := p.Room
		for _, r := range term.Rooms {
			if r.ID == was {
				continue
			}
			p.Room = r.ID
			if len(timetable.HardViolations(timetable.Check(term, cur))) == 0 {
				moved[p.Section] = true
				break
			}
			p.Room = was
		}
	}
	require.Len(t, moved, 3)
	want := map[string]bool{}
	for _, sec := range term.Sections {
		if moved[sec.ID] {
			for _, id := range sec.Staff {
				want["staff/"+id] = true
			}
			for _, id := range sec.Cohorts {
				want["cohorts/"+id] = true
			}
		}
	}
	for _, en := range term.Enrolments {
		if moved[en.Section] {
			want["students/"+en.Student] = true
		}
	}
	termPath := filepath.Join(dir, "term.xlsx")
	var b bytes.Buffer
	require.NoError(t, timetable.WriteTermWorkbook(term, &b))
	require.NoError(t, os.WriteFile(termPath, b.Bytes(), 0o644))
	paths := map[string]*timetable.Schedule{"old.xlsx": s, "new.xlsx": cur}
	for name, sc := range paths {
		b.Reset()
		require.NoError(t, export.WriteTimetableWorkbook(&b, term, sc, export.Options{}))
		require.NoError(t, os.WriteFile(filepath.Join(dir, name), b.Bytes(), 0o644))
	}
	out := filepath.Join(dir, "notices")
	e, _, errb := notifyEnv()
	require.Equal(t, exitOK, run([]string{"notify", termPath, filepath.Join(dir, "old.xlsx"), filepath.Join(dir, "new.xlsx"), "-o", out}, e), errb.String())
	got := map[string]bool{}
	for kind := range map[string]bool{"staff": true, "cohorts": true, "students": true} {
		entries, _ := os.ReadDir(filepath.Join(out, kind))
		for _, en := range entries {
			stem := strings.TrimSuffix(en.Name(), filepath.Ext(en.Name()))
			got[kind+"/"+stem] = true
			if strings.HasSuffix(en.Name(), ".ics") {
				calEvents(t, mustRead(t, filepath.Join(out, kind, en.Name())))
			}
		}
	}
	assert.Equal(t, want, got)
}
