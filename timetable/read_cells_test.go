package timetable

import (
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// TestExcelSerialToTime checks the serial-number convention of ECMA-376
// Part 1, §18.17.4.1 (Date Representation, 1900 date base system): serial 1
// is 1900-01-01, the system treats 1900 as a leap year (59 = 1900-02-28,
// 60 = the non-existent 1900-02-29, 61 = 1900-03-01), 2,958,465 is
// 9999-12-31, and the fraction of a day is the time (0.375 = 09:00). The
// DATEVALUE examples of the standard give 3687 for 1910-02-03 and 38749 for
// 2006-02-01.
func TestExcelSerialToTime(t *testing.T) {
	day := func(y int, m time.Month, d, h, min int) time.Time { return time.Date(y, m, d, h, min, 0, 0, time.UTC) }
	for _, tc := range []struct {
		serial float64
		want   time.Time
	}{
		{1, day(1900, 1, 1, 0, 0)},
		{59, day(1900, 2, 28, 0, 0)},
		{61, day(1900, 3, 1, 0, 0)},
		{3687, day(1910, 2, 3, 0, 0)},
		{38749, day(2006, 2, 1, 0, 0)},
		{2958465, day(9999, 12, 31, 0, 0)},
		{0.375, day(1899, 12, 31, 9, 0)},
		{0.5, day(1899, 12, 31, 12, 0)},
		{38749.75, day(2006, 2, 1, 18, 0)},
		{46643.5625, day(2027, 9, 13, 13, 30)},
	} {
		got, err := ExcelSerialToTime(tc.serial)
		require.NoError(t, err, "serial %v", tc.serial)
		assert.Equal(t, tc.want, got, "serial %v", tc.serial)
	}
	for _, bad := range []float64{-1, 60, 60.5, 2958466} {
		_, err := ExcelSerialToTime(bad)
		assert.Error(t, err, "serial %v", bad)
	}
}

// TestExcelSerial1904 checks the 1904 date base system of ECMA-376 Part 1
// §18.17.4.1: serial 0 is 1904-01-01; DATEVALUE examples 2225 = 1910-02-03,
// 37287 = 2006-02-01, 2,957,003 = 9999-12-31.
func TestExcelSerial1904(t *testing.T) {
	for serial, want := range map[float64]time.Time{
		0:       time.Date(1904, 1, 1, 0, 0, 0, 0, time.UTC),
		2225:    time.Date(1910, 2, 3, 0, 0, 0, 0, time.UTC),
		37287:   time.Date(2006, 2, 1, 0, 0, 0, 0, time.UTC),
		2957003: time.Date(9999, 12, 31, 0, 0, 0, 0, time.UTC),
	} {
		got, err := ExcelSerial1904ToTime(serial)
		require.NoError(t, err)
		assert.Equal(t, want, got, "serial %v", serial)
	}
}

func TestParseClock(t *testing.T) {
	for _, tc := range []struct {
		in   string
		want Clock
		ok   bool
	}{
		{"9:00", 540, true},
		{"09:00", 540, true},
		{" 13:30 ", 810, true},
		{"13:30:00", 810, true},
		{"00:00", 0, true},
		{"24:00", 1440, true},
		{"0.375", 540, true},               // ECMA-376 Part 1 §18.17.4: a time cell is a fraction of a day
		{"0.5625", 810, true},              // 13:30
		{"0.395833333333333", 570, true},   // 09:30, as stored with float rounding
		{"0.41666666666666669", 600, true}, // 10:00
		{"9.00", 0, false},
		{"9", 0, false},
		{"9am", 0, false},
		{"25:00", 0, false},
		{"24:30", 0, false},
		{"9:5", 0, false},
		{"12:60", 0, false},
		{"1.5", 0, false},
		{"-0.1", 0, false},
		{"", 0, false},
		{"NaN", 0, false},
	} {
		t.Run(tc.in, func(t *testing.T) {
			got, err := ParseClock(tc.in)
			if !tc.ok {
				assert.Error(t, err)
				return
			}
			require.NoError(t, err)
			assert.Equal(t, tc.want, got)
		})
	}
}

func TestParseDate(t *testing.T) {
	d, err := parseDate("2027-09-13", false)
	require.NoError(t, err)
	assert.Equal(t, time.Date(2027, 9, 13, 0, 0, 0, 0, time.UTC), d)
	d, err = parseDate("46643.75", false) // a date-time cell: the time is dropped
	require.NoError(t, err)
	assert.Equal(t, time.Date(2027, 9, 13, 0, 0, 0, 0, time.UTC), d)
	d, err = parseDate("45181", true) // 1904 system: 1462 less than the 1900 serial, as the standard's DATEVALUE examples for 2006-02-01 show (38749 - 37287)
	require.NoError(t, err)
	assert.Equal(t, time.Date(2027, 9, 13, 0, 0, 0, 0, time.UTC), d)
	for _, bad := range []string{"", "13/09/2027", "2027-02-30", "0.5", "tomorrow", "1e300"} {
		_, err := parseDate(bad, false)
		assert.Error(t, err, bad)
	}
}

func TestParseWhole(t *testing.T) {
	for _, tc := range []struct {
		in   string
		want int
		ok   bool
	}{
		{"3", 3, true}, {" 3 ", 3, true}, {"3.0", 3, true}, {"2.9999999999999996", 3, true},
		{"3.5", 0, false}, {"x", 0, false}, {"0", 0, false}, {"101", 0, false}, {"1e20", 0, false}, {"Inf", 0, false},
	} {
		got, err := parseWhole(tc.in, 1, 100)
		if tc.ok {
			require.NoError(t, err, tc.in)
			assert.Equal(t, tc.want, got, tc.in)
		} else {
			assert.Error(t, err, tc.in)
		}
	}
}

func TestParseWeeks(t *testing.T) {
	all := WeekSet(1<<14 - 1)
	for _, tc := range []struct {
		in   string
		want WeekSet
		ok   bool
	}{
		{"", all, true},
		{"All", all, true},
		{"odd", 0b01010101010101, true},
		{"even", 0b10101010101010, true},
		{"1-4, 6, 9-12", 0b111100101111, true},
		{"1;3", 0b101, true},
		{"64", 1 << 63, true},
		{"0", 0, false},
		{"65", 0, false},
		{"4-1", 0, false},
		{"weekly", 0, false},
	} {
		t.Run(tc.in, func(t *testing.T) {
			got, err := parseWeeks(tc.in, all)
			if !tc.ok {
				assert.Error(t, err)
				return
			}
			require.NoError(t, err)
			assert.Equal(t, tc.want, got)
		})
	}
}

func TestParseStrengthAndFixed(t *testing.T) {
	hard, w, err := parseStrength(" Hard ")
	assert.True(t, hard)
	assert.Zero(t, w)
	assert.NoError(t, err)
	hard, w, err = parseStrength("7")
	assert.False(t, hard)
	assert.Equal(t, 7, w)
	assert.NoError(t, err)
	_, _, err = parseStrength("soft")
	assert.Error(t, err)

	f, err := parseFixed("tue 9:00 Lab 3")
	require.NoError(t, err)
	assert.Equal(t, Fixed{Day: time.Tuesday, Start: 540, Room: "Lab 3", Text: "tue 9:00 Lab 3"}, f)
	for _, bad := range []string{"Tue", "Tuesday morning", "10:00 Tue"} {
		_, err := parseFixed(bad)
		assert.Error(t, err, bad)
	}
}

func TestColLetter(t *testing.T) {
	for i, want := range map[int]string{0: "A", 3: "D", 25: "Z", 26: "AA", 27: "AB", 701: "ZZ", 702: "AAA"} {
		assert.Equal(t, want, colLetter(i), "column %d", i)
	}
}

func TestSplitListAndNormWords(t *testing.T) {
	assert.Equal(t, []string{"a", "b c", "d"}, splitList(" a, b c ;; d ,"))
	assert.Empty(t, splitList(" , ; "))
	assert.Equal(t, "back to back", normWords(" Back-to_back "))
}
