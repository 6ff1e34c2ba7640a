package timetable

import (
	"strconv"
	"strings"
	"testing"

	"github.com/stretchr/testify/require"
)

// FuzzReadScheduleCSV reads arbitrary bytes as a timetable CSV: never a
// panic, and whatever reads without errors prints and reads back to the same
// placements (print → read → same).
func FuzzReadScheduleCSV(f *testing.F) {
	tm := ckTerm()
	f.Add(ckCSV(ckTimetableRows(tm, ckSchedule())))
	f.Add([]byte("Section,Meeting,Day,Start,Room\nBIO-101,,Mon,09:00,R1\nBIO-101,,Wed,0.375,R1\n"))
	f.Add([]byte("\xef\xbb\xbfsection,day,start,room\nX,tue,10:00,\n"))
	f.Add([]byte("Section,Day,Start,Room\n\"a,b\",Mon,9:00,\"R 1\"\n,,,\n"))
	f.Add([]byte("Section,Day,Start,Room,Day\n"))
	f.Add([]byte("a,\"b"))
	f.Fuzz(func(t *testing.T, data []byte) {
		s, ps, err := ReadSchedule(ckWrite(t, "t.csv", data), tm)
		if err != nil {
			require.Nil(t, s)
			return
		}
		require.NotNil(t, s)
		if len(ps.Errors()) > 0 {
			return
		}
		rows := [][]string{{"Section", "Meeting", "Day", "Start", "Room"}}
		for _, p := range s.Placements {
			if strings.ContainsRune(p.Section+p.Room, '\r') {
				return // CSV folds \r\n inside quoted cells into \n
			}
			per := tm.Periods[p.Period]
			rows = append(rows, []string{p.Section, strconv.Itoa(p.Meeting), DayName(per.Day), per.Start.String(), p.Room})
		}
		again, ps2, err := ReadSchedule(ckWrite(t, "u.csv", ckCSV(rows)), tm)
		require.NoError(t, err)
		require.Empty(t, ps2.Errors())
		require.Equal(t, ckBare(s), ckBare(again))
	})
}

// FuzzReadScheduleXLSX reads arbitrary bytes as a timetable workbook: a
// sentence or a schedule, never a panic.
func FuzzReadScheduleXLSX(f *testing.F) {
	tm := ckTerm()
	f.Add(ckXLSX(f, TimetableSheet, ckTimetableRows(tm, ckSchedule()), nil))
	f.Add(ckXLSX(f, "Sheet1", [][]string{{"Section", "Day", "Start", "Room"}, {"BIO-101", "Mon", "0.375", "R1"}}, nil))
	f.Add([]byte("PK\x03\x04"))
	f.Add([]byte{})
	f.Add(ckWorkbook(f, testSheet{TimetableSheet, ckTimetableRows(tm, ckSchedule())}, testSheet{ClassListSheet, ckClassRows()}))
	f.Add(ckWorkbook(f, testSheet{TimetableSheet, ckTimetableRows(tm, ckSchedule())}, testSheet{ClassListSheet, [][]string{{"student", "SECTION", "Student"}, {"", "X"}}}))
	f.Fuzz(func(t *testing.T, data []byte) {
		s, ps, err := ReadSchedule(ckWrite(t, "t.xlsx", data), tm)
		if err != nil {
			require.Nil(t, s)
			require.NotContains(t, err.Error(), "\n")
			return
		}
		require.NotNil(t, s)
		for _, p := range s.Placements {
			require.True(t, p.Period >= 0 && p.Period < len(tm.Periods))
		}
		for _, p := range ps {
			require.NotEmpty(t, p.Msg)
		}
		secs := tm.SectionIndex()
		for _, e := range s.Enrolments {
			require.NotEmpty(t, e.Student)
			require.Contains(t, secs, e.Section)
		}
	})
}

// FuzzReadClassListCSV reads arbitrary bytes as a class-list CSV: never a
// panic, no enrolment with a blank student or unknown section, and
// whatever reads without errors prints and reads back to the same
// enrolments (print → read → same).
func FuzzReadClassListCSV(f *testing.F) {
	tm := ckClassTerm()
	f.Add(ckCSV(ckClassRows()))
	f.Add([]byte("Student,Section\nst1,BIO-101\nst1,BIO-101\n,ART-120\nst2,NOPE\n"))
	f.Add([]byte("\xef\xbb\xbfSECTION , student,Course\n\"BIO-101\",\"a,b\",X\n"))
	f.Add([]byte("Section,Section,Student\n"))
	f.Fuzz(func(t *testing.T, data []byte) {
		es, ps, err := ReadClassListCSV(ckWrite(t, "c.csv", data), tm)
		if err != nil {
			require.ErrorIs(t, err, ErrUnreadable)
			return
		}
		secs := tm.SectionIndex()
		for _, e := range es {
			require.NotEmpty(t, strings.TrimSpace(e.Student))
			require.Contains(t, secs, e.Section)
		}
		if len(ps.Errors()) > 0 {
			return
		}
		rows := [][]string{{"Student", "Section"}}
		for _, e := range es {
			if strings.ContainsRune(e.Student, '\r') {
				return // CSV folds \r\n inside quoted cells into \n
			}
			rows = append(rows, []string{e.Student, e.Section})
		}
		again, ps2, err := ReadClassListCSV(ckWrite(t, "d.csv", ckCSV(rows)), tm)
		require.NoError(t, err)
		require.Empty(t, ps2.Errors())
		require.Equal(t, len(es), len(again))
		for i := range es {
			require.Equal(t, [2]string{es[i].Student, es[i].Section}, [2]string{again[i].Student, again[i].Section})
		}
	})
}
