package benchfmt

import (
	"errors"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/timetable"
)

// readTiny reads testdata/ctt/tiny.ctt, a hand-made instance.
func readTiny(t testing.TB) *timetable.Term {
	t.Helper()
	f, err := os.Open(filepath.Join("testdata", "ctt", "tiny.ctt"))
	require.NoError(t, err)
	defer f.Close()
	term, err := ReadCTT(f, "tiny.ctt")
	require.NoError(t, err)
	return term
}

func TestReadCTTMapping(t *testing.T) {
	term := readTiny(t)
	assert.Equal(t, "Tiny", term.Name)
	assert.True(t, term.SoftCapacity)
	assert.Equal(t, time.Monday, term.FirstDay.Weekday())
	assert.Equal(t, 1, term.TeachingWeeks())
	assert.Equal(t, time.Tuesday, term.LastDay.Weekday(), "two days")

	t.Run("grid", func(t *testing.T) {
		require.Len(t, term.Periods, 6)
		want := []struct {
			day        time.Weekday
			start, end timetable.Clock
		}{
			{time.Monday, 480, 540}, {time.Monday, 540, 600}, {time.Monday, 600, 660},
			{time.Tuesday, 480, 540}, {time.Tuesday, 540, 600}, {time.Tuesday, 600, 660},
		}
		for i, w := range want {
			p := term.Periods[i]
			assert.Equal(t, i, p.Index)
			assert.Equal(t, w.day, p.Day)
			assert.Equal(t, w.start, p.Start)
			assert.Equal(t, w.end, p.End)
		}
		// The competition's adjacent periods are Term.Consecutive: within a
		// day only (Di Gaspero, McCollum, Schaerf 2007, curriculum compactness).
		assert.True(t, term.Consecutive(0, 1))
		assert.True(t, term.Consecutive(1, 2))
		assert.False(t, term.Consecutive(2, 3), "last period of Monday and first of Tuesday")
	})

	t.Run("sections", func(t *testing.T) {
		require.Len(t, term.Sections, 3)
		alg := term.Sections[0]
		assert.Equal(t, timetable.Section{
			ID: "alg", Title: "alg", Staff: []string{"Ada"}, Cohorts: []string{"y1"}, Size: 40,
			Meetings: 2, Length: 1, SameDay: true, MinDays: 2, Weeks: term.AllWeeks(),
			Src: timetable.Source{Sheet: "tiny.ctt", Row: 10},
		}, alg)
		assert.Equal(t, []string{"y2"}, term.Sections[2].Cohorts)
		assert.Equal(t, timetable.WeekSet(1), alg.Weeks)
	})

	t.Run("people and rooms", func(t *testing.T) {
		assert.Equal(t, []timetable.Staff{
			{ID: "Ada", Name: "Ada", Src: timetable.Source{Sheet: "tiny.ctt", Row: 10}},
			{ID: "Bo", Name: "Bo", Src: timetable.Source{Sheet: "tiny.ctt", Row: 11}},
		}, term.Staff)
		assert.Equal(t, []timetable.Room{
			{ID: "big", Capacity: 35, Src: timetable.Source{Sheet: "tiny.ctt", Row: 15}},
			{ID: "small", Capacity: 25, Src: timetable.Source{Sheet: "tiny.ctt", Row: 16}},
		}, term.Rooms)
		assert.Equal(t, []timetable.Cohort{
			{ID: "y1", Name: "y1", Src: timetable.Source{Sheet: "tiny.ctt", Row: 19}},
			{ID: "y2", Name: "y2", Src: timetable.Source{Sheet: "tiny.ctt", Row: 20}},
		}, term.Cohorts)
	})

	t.Run("unavailability covers exactly its period", func(t *testing.T) {
		require.Len(t, term.Unavailable, 1)
		u := term.Unavailable[0]
		assert.Equal(t, timetable.WhoSection, u.Kind)
		assert.Equal(t, "geo", u.Who)
		assert.True(t, u.Hard)
		assert.Equal(t, timetable.Source{Sheet: "tiny.ctt", Row: 23}, u.Src)
		for i, p := range term.Periods {
			assert.Equal(t, i == 0, u.Covers(p), "period %d", i)
		}
	})

	t.Run("weights", func(t *testing.T) {
		// Weights of the competition's soft constraints (Di Gaspero,
		// McCollum, Schaerf 2007): 1, 5, 2, 1; every other criterion off.
		want := map[string]int{timetable.CritOverCapacity: 1, timetable.CritSpreadDays: 5, timetable.CritCohortIsolated: 2, timetable.CritRoomStability: 1}
		require.Len(t, term.Weights, len(timetable.Criteria))
		for _, c := range timetable.Criteria {
			w, ok := term.Weights[c.Name]
			require.True(t, ok, c.Name)
			assert.Equal(t, want[c.Name], w.Weight, c.Name)
			assert.Equal(t, CTTLevel, w.Level, c.Name)
		}
	})
}

func TestReadCTTLongDays(t *testing.T) {
	// 20 periods a day do not fit as hours after 08:00; they share the 16
	// hours to midnight (48 minutes each) and still touch.
	src := "Name: Long\nCourses: 1\nRooms: 1\nDays: 1\nPeriods_per_day: 20\nCurricula: 0\nConstraints: 0\n\nCOURSES:\nc t 1 1 1\n\nROOMS:\nr 1\n\nCURRICULA:\n\nUNAVAILABILITY_CONSTRAINTS:\n\nEND.\n"
	term, err := ReadCTT(strings.NewReader(src), "long.ctt")
	require.NoError(t, err)
	require.Len(t, term.Periods, 20)
	last := term.Periods[19]
	assert.LessOrEqual(t, int(last.End), 24*60)
	for i := 1; i < 20; i++ {
		assert.True(t, term.Consecutive(i-1, i))
	}
}

// markedCTT builds a file from lines; a line starting with "!" is expected
// to carry an error (the mark is removed). It returns the text and the
// marked 1-based line numbers.
func markedCTT(lines ...string) (string, []int) {
	var marks []int
	for i, l := range lines {
		if strings.HasPrefix(l, "!") {
			lines[i] = l[1:]
			marks = append(marks, i+1)
		}
	}
	return strings.Join(lines, "\n") + "\n", marks
}

// goodHeader is a header for 2 courses, 1 room, 2 days of 2 periods,
// 1 curriculum and 1 constraint (lines 1-8).
var goodHeader = []string{"Name: T", "Courses: 2", "Rooms: 1", "Days: 2", "Periods_per_day: 2", "Curricula: 1", "Constraints: 1", ""}

func withHeader(rest ...string) []string { return append(slices.Clone(goodHeader), rest...) }

func TestReadCTTErrors(t *testing.T) {
	body := func(courses, rooms, curricula, unav []string) []string {
		out := withHeader("COURSES:")
		out = append(out, courses...)
		out = append(out, "", "ROOMS:")
		out = append(out, rooms...)
		out = append(out, "", "CURRICULA:")
		out = append(out, curricula...)
		out = append(out, "", "UNAVAILABILITY_CONSTRAINTS:")
		out = append(out, unav...)
		return append(out, "", "END.")
	}
	okCourses := []string{"a t1 2 1 10", "b t2 1 1 10"}
	okRooms := []string{"r 10"}
	okCur := []string{"q 2 a b"}
	okUnav := []string{"a 0 0"}
	tests := []struct {
		name  string
		lines []string
		want  []string // substrings of the message, one per marked line
	}{
		{"course with 4 fields", body([]string{"!a t1 2 1", "b t2 1 1 10"}, okRooms, okCur, okUnav), []string{"5 fields"}},
		{"meetings not a number", body([]string{"!a t1 two 1 10", "b t2 1 1 10"}, okRooms, okCur, okUnav), []string{"not a whole number"}},
		{"zero meetings", body([]string{"!a t1 0 1 10", "b t2 1 1 10"}, okRooms, okCur, okUnav), []string{"it must be from 1 to 1000000"}},
		{"students beyond int64", body([]string{"!a t1 1 1 99999999999999999999", "b t2 1 1 10"}, okRooms, okCur, okUnav), []string{"students of course a is 99999999999999999999; it must be from 0 to 1000000"}},
		{"students 2^63-1", body([]string{"!a t1 1 1 9223372036854775807", "b t2 1 1 10"}, okRooms, okCur, okUnav), []string{"students of course a is 9223372036854775807"}},
		{"duplicate course", body([]string{"a t1 2 1 10", "!a t2 1 1 10"}, okRooms, []string{"q 1 a"}, okUnav), []string{"already defined on line 10"}},
		{"negative capacity", body(okCourses, []string{"!r -3"}, okCur, okUnav), []string{"it must be from 0 to 1000000"}},
		{"curriculum count wrong", body(okCourses, okRooms, []string{"!q 3 a b"}, okUnav), []string{"says it has 3 courses but lists 2"}},
		{"curriculum unknown course", body(okCourses, okRooms, []string{"!q 2 a zz"}, okUnav), []string{"not in COURSES"}},
		{"curriculum repeats a course", body(okCourses, okRooms, []string{"!q 2 a a"}, okUnav), []string{"twice"}},
		{"unavailability day out of range", body(okCourses, okRooms, okCur, []string{"!a 2 0"}), []string{"outside the week"}},
		{"unavailability period out of range", body(okCourses, okRooms, okCur, []string{"!a 0 2"}), []string{"outside the day"}},
		{"unavailability unknown course", body(okCourses, okRooms, okCur, []string{"!zz 0 0"}), []string{"not in COURSES"}},
		{"two problems on two lines", body([]string{"!a t1 x 1 10", "!b t2 1 1"}, okRooms, okCur, okUnav), []string{"not a whole number", "5 fields"}},
		{"count differs from header", func() []string {
			l := body([]string{"a t1 2 1 10"}, okRooms, []string{"q 1 a"}, okUnav)
			l[8] = "!" + l[8] // COURSES: line
			return l
		}(), []string{"has 1 lines but the header says Courses: 2"}},
		{"unknown header key", append([]string{"!Teachers: 3"}, body(okCourses, okRooms, okCur, okUnav)...), []string{"unknown header key"}},
		{"header value missing", func() []string {
			l := body(okCourses, okRooms, okCur, okUnav)
			l[3] = "!Days:"
			return l
		}(), []string{"has no value"}},
		{"days beyond a week", func() []string {
			l := body(okCourses, okRooms, okCur, okUnav)
			l[3] = "!Days: 8"
			return l
		}(), []string{"at most 7"}},
		{"repeated header key", func() []string {
			l := body(okCourses, okRooms, okCur, okUnav)
			l[7] = "!Rooms: 1"
			return l
		}(), []string{"appears again (first on line 3)"}},
		{"extended section", func() []string {
			l := body(okCourses, okRooms, okCur, okUnav)
			return append(l[:7], append([]string{"!ROOM_CONSTRAINTS:"}, l[7:]...)...)
		}(), []string{"not part of the ITC-2007"}},
		{"text after END", append(body(okCourses, okRooms, okCur, okUnav), "!a t 1 1 1"), []string{"text after END."}},
		{"no END", func() []string {
			l := body(okCourses, okRooms, okCur, okUnav)
			l = l[:len(l)-2]
			l[len(l)-1] = "!" + l[len(l)-1]
			return l
		}(), []string{"without the END. line"}},
		{"section repeated", func() []string {
			l := body(okCourses, okRooms, okCur, okUnav)
			return append(l[:len(l)-1], "!ROOMS:", "END.")
		}(), []string{"appears again"}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			src, marks := markedCTT(slices.Clone(tc.lines)...)
			term, err := ReadCTT(strings.NewReader(src), "bad.ctt")
			require.Error(t, err)
			assert.Nil(t, term)
			assert.True(t, errors.Is(err, ErrCTTFormat))
			var list Errors
			require.True(t, errors.As(err, &list), "error is %T", err)
			var got []int
			for _, e := range list {
				got = append(got, e.Line)
				assert.True(t, strings.HasPrefix(e.Error(), "bad.ctt:"), e.Error())
			}
			require.Equal(t, marks, got, "lines with errors; message:\n%v", err)
			for i, w := range tc.want {
				assert.Contains(t, list[i].Msg, w)
			}
		})
	}
}

func TestReadCTTMissingSection(t *testing.T) {
	src := strings.Join(withHeader("COURSES:", "a t 1 1 1", "b t 1 1 1", "ROOMS:", "r 1", "CURRICULA:", "q 1 a", "END."), "\n")
	_, err := ReadCTT(strings.NewReader(src), "x.ctt")
	require.Error(t, err)
	assert.Contains(t, err.Error(), "x.ctt:16: section UNAVAILABILITY_CONSTRAINTS: is missing")
}

func TestReadCTTManyErrorsListedOnce(t *testing.T) {
	var b strings.Builder
	for range 200 {
		b.WriteString("garbage line\n")
	}
	_, err := ReadCTT(strings.NewReader(b.String()), "junk.ctt")
	require.Error(t, err)
	var list Errors
	require.True(t, errors.As(err, &list))
	assert.Len(t, list, 201, "each line plus the missing END.")
	assert.Contains(t, err.Error(), "... and 151 more problems")
}
