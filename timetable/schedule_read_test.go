package timetable

import (
	"bytes"
	"encoding/csv"
	"errors"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/xuri/excelize/v2"
)

// ckTimetableRows renders s as the rows of a Timetable sheet (header first),
// the way the export package writes it.
func ckTimetableRows(t *Term, s *Schedule) [][]string {
	rows := [][]string{append([]string(nil), TimetableColumns...)}
	secs := t.SectionIndex()
	for _, p := range s.Placements {
		sec := t.Sections[secs[p.Section]]
		per := t.Periods[p.Period]
		span, _ := t.Span(p.Period, occLength(&sec))
		rows = append(rows, []string{sec.ID, sec.Title, strconv.Itoa(p.Meeting), DayName(per.Day), per.Start.String(),
			t.Periods[span[len(span)-1]].End.String(), p.Room, strings.Join(sec.Staff, ", "), strings.Join(sec.Cohorts, ", ")})
	}
	return rows
}

// ckCSV encodes rows as CSV bytes.
func ckCSV(rows [][]string) []byte {
	var b bytes.Buffer
	w := csv.NewWriter(&b)
	_ = w.WriteAll(rows)
	return b.Bytes()
}

// ckXLSX encodes rows as a workbook with the given sheet; cells are text
// unless cellValue says otherwise.
func ckXLSX(t testing.TB, sheet string, rows [][]string, cellValue func(r, c int, v string) any) []byte {
	f := excelize.NewFile()
	defer f.Close()
	require.NoError(t, f.SetSheetName("Sheet1", sheet))
	for r, row := range rows {
		for c, v := range row {
			cell, err := excelize.CoordinatesToCellName(c+1, r+1)
			require.NoError(t, err)
			var val any = v
			if cellValue != nil {
				val = cellValue(r, c, v)
			}
			require.NoError(t, f.SetCellValue(sheet, cell, val))
		}
	}
	var b bytes.Buffer
	_, err := f.WriteTo(&b)
	require.NoError(t, err)
	return b.Bytes()
}

// ckWrite writes data to a new file name in a temporary folder.
func ckWrite(t testing.TB, name string, data []byte) string {
	p := filepath.Join(t.TempDir(), name)
	require.NoError(t, os.WriteFile(p, data, 0o644))
	return p
}

// ckBare drops the Src of every placement.
func ckBare(s *Schedule) []Placement {
	out := make([]Placement, len(s.Placements))
	for i, p := range s.Placements {
		p.Src = Source{}
		out[i] = p
	}
	return out
}

func TestReadScheduleRoundTrip(t *testing.T) {
	tm, want := ckTerm(), ckSchedule()
	rows := ckTimetableRows(tm, want)
	timeCells := func(r, c int, v string) any { // Start and End as spreadsheet time cells, Meeting as a number
		if r == 0 {
			return v
		}
		switch c {
		case 2:
			n, _ := strconv.Atoi(v)
			return n
		case 4, 5:
			k, _ := ParseClock(v)
			return float64(k) / (24 * 60)
		}
		return v
	}
	for name, path := range map[string]string{
		"csv":        ckWrite(t, "timetable.csv", ckCSV(rows)),
		"xlsx":       ckWrite(t, "timetable.xlsx", ckXLSX(t, TimetableSheet, rows, nil)),
		"xlsx cells": ckWrite(t, "cells.xlsx", ckXLSX(t, TimetableSheet, rows, timeCells)),
		"one sheet":  ckWrite(t, "other.xlsx", ckXLSX(t, "Sheet1", rows, nil)),
	} {
		t.Run(name, func(t *testing.T) {
			got, ps, err := ReadSchedule(path, tm)
			require.NoError(t, err)
			assert.Empty(t, ps)
			assert.Equal(t, ckBare(want), ckBare(got))
			for i, p := range got.Placements {
				assert.Equal(t, i+2, p.Src.Row)
			}
			assert.Empty(t, Check(tm, got))
		})
	}
}

func TestReadScheduleSources(t *testing.T) {
	tm := ckTerm()
	rows := ckTimetableRows(tm, ckSchedule())
	s, _, err := ReadSchedule(ckWrite(t, "t.xlsx", ckXLSX(t, TimetableSheet, rows, nil)), tm)
	require.NoError(t, err)
	assert.Equal(t, Source{Sheet: TimetableSheet, Row: 3}, s.Placements[1].Src)
	s, _, err = ReadSchedule(ckWrite(t, "week7.csv", ckCSV(rows)), tm)
	require.NoError(t, err)
	assert.Equal(t, Source{Sheet: "week7", Row: 3}, s.Placements[1].Src)
}

// TestReadScheduleProblems marks the cell each problem is expected at with
// a leading "!" in the input (the marker is removed before reading).
func TestReadScheduleProblems(t *testing.T) {
	header := []string{"Section", "Title", "Meeting", "Day", "Start", "End", "Room", "Staff", "Cohorts"}
	good := []string{"BIO-101", "Cells", "1", "Mon", "09:00", "10:00", "R1", "S1", "C1"}
	with := func(col int, v string) []string {
		r := append([]string(nil), good...)
		r[col] = v
		return r
	}
	cases := []struct {
		name   string
		rows   [][]string
		placed int    // placements read
		sev    string // "error" or "warning" for every marked cell
	}{
		{"blank section", [][]string{header, with(0, "!")}, 0, "error"},
		{"bad day", [][]string{header, with(3, "!Funday")}, 0, "error"},
		{"bad start", [][]string{header, with(4, "!9am")}, 0, "error"},
		{"blank start", [][]string{header, with(4, "!")}, 0, "error"},
		{"start not in the grid", [][]string{header, with(4, "!09:30")}, 0, "error"},
		{"day not in the grid", [][]string{header, with(3, "!Sat")}, 0, "error"},
		{"bad meeting", [][]string{header, with(2, "!first")}, 0, "error"},
		{"meeting zero", [][]string{header, with(2, "!0")}, 0, "error"},
		{"two bad rows", [][]string{header, with(3, "!Funday"), good, with(4, "!25:00")}, 1, "error"},
		{"end disagrees", [][]string{header, with(5, "!11:00")}, 1, "warning"},
		{"staff disagrees", [][]string{header, with(7, "!S2")}, 1, "warning"},
		{"cohorts disagree", [][]string{header, with(8, "!C1, C2")}, 1, "warning"},
		{"unknown column", [][]string{append(header[:9:9], "!Notes"), append(good[:9:9], "moved by hand")}, 1, "warning"},
		{"weeks agree", [][]string{append(header[:9:9], "Weeks"), append(good[:9:9], "all")}, 1, ""},
		{"weeks disagree", [][]string{append(header[:9:9], "Weeks"), append(good[:9:9], "!odd")}, 1, "warning"},
		{"weeks unreadable", [][]string{append(header[:9:9], "Weeks"), append(good[:9:9], "!fortnightly")}, 1, "warning"},
		{"unknown section kept for Check", [][]string{header, with(0, "NEW-1")}, 1, ""},
		{"unknown room kept for Check", [][]string{header, with(6, "R99")}, 1, ""},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			var want []string
			rows := make([][]string, len(tc.rows))
			for r, row := range tc.rows {
				rows[r] = make([]string, len(row))
				for c, v := range row {
					if strings.HasPrefix(v, "!") {
						want = append(want, TimetableSheet+"!"+colLetter(c)+strconv.Itoa(r+1))
						v = v[1:]
					}
					rows[r][c] = v
				}
			}
			s, ps, err := ReadSchedule(ckWrite(t, "t.xlsx", ckXLSX(t, TimetableSheet, rows, nil)), ckTerm())
			require.NoError(t, err)
			var got []string
			for _, p := range ps {
				got = append(got, p.Pos.String())
				assert.Equal(t, tc.sev, p.Severity.String(), p.String())
				assert.NotEmpty(t, p.Msg)
			}
			assert.Equal(t, want, got, "%v", ps)
			assert.Len(t, s.Placements, tc.placed)
		})
	}
}

func TestReadScheduleMessages(t *testing.T) {
	rows := [][]string{
		{"section", " DAY ", "Start", "Room"},
		{"BIO-101", "Mon", "09:30", "R1"},
	}
	_, ps, err := ReadSchedule(ckWrite(t, "t.csv", ckCSV(rows)), ckTerm())
	require.NoError(t, err)
	require.Len(t, ps, 1)
	assert.Equal(t, "t!C2: no period starts at Mon 09:30 — use a start time from the Periods sheet (Mon: 09:00, 10:00, 11:00, 13:00, 14:00)", ps[0].String())
}

func TestReadScheduleHeader(t *testing.T) {
	cases := []struct {
		name string
		rows [][]string
		want string
	}{
		{"missing room", [][]string{{"Section", "Meeting", "Day", "Start"}}, "Timetable row 1: the header row has no Room column"},
		{"repeated column", [][]string{{"Section", "Day", "Start", "Room", "Day"}}, "Timetable!E1: column Day appears twice"},
		{"empty sheet", nil, "Timetable: the sheet is empty"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			data := ckXLSX(t, TimetableSheet, tc.rows, nil)
			_, ps, err := ReadSchedule(ckWrite(t, "t.xlsx", data), ckTerm())
			require.NoError(t, err)
			require.NotEmpty(t, ps)
			assert.True(t, strings.HasPrefix(ps[0].String(), tc.want), ps.String())
			assert.Equal(t, Error, ps[0].Severity)
		})
	}
}

func TestReadScheduleBlankMeetingsAreNumbered(t *testing.T) {
	rows := [][]string{
		{"Section", "Meeting", "Day", "Start", "Room"},
		{"BIO-101", "", "Wed", "09:00", "R1"},
		{"BIO-101", "1", "Mon", "09:00", "R1"},
		{"CHE-210", "", "Tue", "09:00", "R2"},
	}
	s, ps, err := ReadSchedule(ckWrite(t, "t.csv", ckCSV(rows)), ckTerm())
	require.NoError(t, err)
	assert.Empty(t, ps)
	require.Len(t, s.Placements, 3)
	assert.Equal(t, []int{2, 1, 1}, []int{s.Placements[0].Meeting, s.Placements[1].Meeting, s.Placements[2].Meeting})
}

func TestReadScheduleUnreadable(t *testing.T) {
	dir := t.TempDir()
	twoSheets := func() []byte {
		f := excelize.NewFile()
		defer f.Close()
		_, _ = f.NewSheet("Other")
		var b bytes.Buffer
		_, _ = f.WriteTo(&b)
		return b.Bytes()
	}()
	cases := map[string]struct {
		path string
		want string
	}{
		"missing":        {filepath.Join(dir, "nope.xlsx"), "does not exist"},
		"folder":         {dir, "is a folder"},
		"not a workbook": {ckWrite(t, "x.xlsx", []byte("hello")), "is not an .xlsx workbook"},
		"damaged zip":    {ckWrite(t, "y.xlsx", []byte("PK\x03\x04garbage")), "damaged"},
		"no such sheet":  {ckWrite(t, "z.xlsx", twoSheets), "has no Timetable sheet"},
		"broken csv":     {ckWrite(t, "b.csv", []byte("a,\"b\nc")), "is not a readable CSV file"},
	}
	for name, tc := range cases {
		t.Run(name, func(t *testing.T) {
			_, _, err := ReadSchedule(tc.path, ckTerm())
			require.Error(t, err)
			assert.True(t, errors.Is(err, ErrUnreadable))
			assert.Contains(t, err.Error(), tc.want)
			assert.NotContains(t, err.Error(), "\n")
		})
	}
}

// TestReadScheduleDamaged rewrites the Timetable sheet's XML (an unknown
// entity between rows, rows out of order) and expects one sentence naming
// the sheet instead of a timetable with rows missing; a FIFO is refused.
func TestReadScheduleDamaged(t *testing.T) {
	term := ckTerm()
	s := ckSchedule()
	book := ckXLSX(t, TimetableSheet, ckTimetableRows(term, s), nil)
	part := demoPart(t, book, TimetableSheet)
	for name, tc := range map[string]struct {
		edit func([]byte) []byte
		want string
	}{
		"unknown entity":    {func(b []byte) []byte { return bytes.Replace(b, []byte("</row>"), []byte("</row>&bogus;"), 1) }, `the "Timetable" sheet is damaged: its XML has an error`},
		"rows out of order": {swapRows, `the "Timetable" sheet stores row 2 after row 3, out of order`},
	} {
		t.Run(name, func(t *testing.T) {
			path := ckWrite(t, "t.xlsx", rewritePart(t, book, part, tc.edit))
			_, _, err := ReadSchedule(path, term)
			require.Error(t, err)
			assert.True(t, errors.Is(err, ErrUnreadable))
			assert.Contains(t, err.Error(), "t.xlsx: "+tc.want)
			assert.NotContains(t, err.Error(), "\n")
		})
	}
	fifo := filepath.Join(t.TempDir(), "t.csv")
	if err := mkfifo(fifo); err != nil {
		t.Skipf("cannot make a FIFO here: %v", err)
	}
	_, _, err := ReadSchedule(fifo, term)
	require.Error(t, err)
	assert.Contains(t, err.Error(), "is a pipe (FIFO), not a regular file")
}
