package timetable

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"
	"time"
)

// Serial-number conventions of ECMA-376 Part 1 §18.17.4 (Date Representation).
const (
	maxSerial1900 = 2958465 // 9999-12-31 in the 1900 date base system
	maxSerial1904 = 2957003 // 9999-12-31 in the 1904 date base system
	secondsPerDay = 86400
)

var (
	epoch1900 = time.Date(1899, 12, 31, 0, 0, 0, 0, time.UTC) // serial 0 ("1900-01-00"); serial 1 is 1900-01-01
	epoch1904 = time.Date(1904, 1, 1, 0, 0, 0, 0, time.UTC)   // serial 0 of the 1904 date base system
)

// ExcelSerialToTime converts a spreadsheet serial value of the 1900 date base
// system (ECMA-376 Part 1 §18.17.4.1) to a UTC time: the whole part counts
// days with serial 1 = 1900-01-01, and the fraction is the time of day
// (0.375 = 09:00), rounded to the nearest second. For legacy reasons the
// system treats 1900 as a leap year: serial 59 is 1900-02-28, 60 the
// non-existent 1900-02-29 (an error here) and 61 is 1900-03-01. Values in
// [0, 1) are pure times on day 0, returned on 1899-12-31. Values below 0 or
// above 2,958,465 (9999-12-31) plus a day are errors.
func ExcelSerialToTime(v float64) (time.Time, error) {
	return excelSerialToTime(v, false)
}

// ExcelSerial1904ToTime is ExcelSerialToTime for workbooks that use the 1904
// date base system, where serial 0 is 1904-01-01 and there is no leap-year
// quirk.
func ExcelSerial1904ToTime(v float64) (time.Time, error) {
	return excelSerialToTime(v, true)
}

func excelSerialToTime(v float64, date1904 bool) (time.Time, error) {
	limit := float64(maxSerial1900 + 1)
	if date1904 {
		limit = maxSerial1904 + 1
	}
	if math.IsNaN(v) || v < 0 || v >= limit {
		return time.Time{}, fmt.Errorf("serial value %g is outside the spreadsheet date range", v)
	}
	days := math.Floor(v)
	secs := int64(math.Round((v - days) * secondsPerDay))
	if date1904 {
		return epoch1904.AddDate(0, 0, int(days)).Add(time.Duration(secs) * time.Second), nil
	}
	d := int(days)
	switch {
	case d == 60:
		return time.Time{}, errors.New("serial value 60 is 1900-02-29, a date that does not exist")
	case d > 60:
		d-- // skip the fictitious 1900-02-29
	}
	return epoch1900.AddDate(0, 0, d).Add(time.Duration(secs) * time.Second), nil
}

// ParseClock reads a time of day. Accepted: "H:MM" or "HH:MM" on the 24-hour
// clock, optionally with ":00" seconds ("9:00", "09:00", "13:30:00",
// "24:00" for the end of the day), and a number in [0, 1), which is how a
// spreadsheet stores a time cell (a fraction of a day, ECMA-376 Part 1
// §18.17.4: 0.375 is 09:00), rounded to the minute. Anything else, such as
// "9.00", "9am" or "9", is refused, because it is ambiguous.
func ParseClock(s string) (Clock, error) {
	s = strings.TrimSpace(s)
	if s == "" {
		return 0, errors.New("is blank")
	}
	if !strings.Contains(s, ":") {
		v, err := strconv.ParseFloat(s, 64)
		if err != nil || math.IsNaN(v) || v < 0 || v >= 1 {
			return 0, fmt.Errorf("%s is not a time — write it as HH:MM on the 24-hour clock, e.g. 09:00 or 13:30", Quote(s))
		}
		return Clock(math.Round(v * 24 * 60)), nil
	}
	parts := strings.Split(s, ":")
	if len(parts) > 3 || len(parts[0]) < 1 || len(parts[0]) > 2 || len(parts[1]) != 2 ||
		(len(parts) == 3 && parts[2] != "00") {
		return 0, fmt.Errorf("%s is not a time — write it as HH:MM on the 24-hour clock, e.g. 09:00 or 13:30", Quote(s))
	}
	h, err1 := strconv.Atoi(parts[0])
	m, err2 := strconv.Atoi(parts[1])
	if err1 != nil || err2 != nil || h < 0 || m < 0 || m > 59 || h > 24 || (h == 24 && m != 0) {
		return 0, fmt.Errorf("%s is not a time of day — write it as HH:MM between 00:00 and 24:00", Quote(s))
	}
	return Clock(h*60 + m), nil
}

// parseDate reads a date: "YYYY-MM-DD", or a spreadsheet date serial (its
// time of day, if any, is dropped). The result is midnight UTC.
func parseDate(s string, date1904 bool) (time.Time, error) {
	s = strings.TrimSpace(s)
	if s == "" {
		return time.Time{}, errors.New("is blank")
	}
	if d, err := time.Parse("2006-01-02", s); err == nil {
		return d, nil
	}
	if v, err := strconv.ParseFloat(s, 64); err == nil && v >= 1 {
		t, err := excelSerialToTime(v, date1904)
		if err == nil {
			return time.Date(t.Year(), t.Month(), t.Day(), 0, 0, 0, 0, time.UTC), nil
		}
	}
	return time.Time{}, fmt.Errorf("%s is not a date — write it as YYYY-MM-DD, e.g. 2027-09-13, or use a date cell", Quote(s))
}

// parseWhole reads a whole number between lo and hi. Spreadsheets may store
// whole numbers as "3" or "3.0000000000000004"; both are 3.
func parseWhole(s string, lo, hi int) (int, error) {
	s = strings.TrimSpace(s)
	n, err := strconv.Atoi(s)
	if err != nil {
		v, ferr := strconv.ParseFloat(s, 64)
		if ferr != nil || math.IsNaN(v) || math.IsInf(v, 0) || math.Abs(v-math.Round(v)) > 1e-9 {
			return 0, fmt.Errorf("%s is not a whole number", Quote(s))
		}
		if v < float64(lo) || v > float64(hi) {
			return 0, fmt.Errorf("%s is out of range — use a whole number from %d to %d", Quote(s), lo, hi)
		}
		n = int(math.Round(v))
	}
	if n < lo || n > hi {
		return 0, fmt.Errorf("%d is out of range — use a whole number from %d to %d", n, lo, hi)
	}
	return n, nil
}

// splitList splits a cell list on commas and semicolons, trimming spaces and
// dropping empty items.
func splitList(s string) []string {
	f := strings.FieldsFunc(s, func(r rune) bool { return r == ',' || r == ';' })
	out := make([]string, 0, len(f))
	for _, x := range f {
		if x = strings.TrimSpace(x); x != "" {
			out = append(out, x)
		}
	}
	return out
}

// normWords lower-cases s, turns '-' and '_' into spaces and collapses runs
// of white space, so that "Back-to-back " matches "back to back".
func normWords(s string) string {
	s = strings.Map(func(r rune) rune {
		if r == '-' || r == '_' {
			return ' '
		}
		return r
	}, strings.ToLower(s))
	return strings.Join(strings.Fields(s), " ")
}

// normHeader is the canonical form of a column header or sheet name.
func normHeader(s string) string { return strings.Join(strings.Fields(strings.ToLower(s)), " ") }

// noRoomMarker in Needs or Rooms marks a section that takes no room.
const noRoomMarker = "no room"

// oddWeeks has bit i set for odd teaching weeks (weeks 1, 3, 5, ...).
const oddWeeks WeekSet = 0x5555555555555555

// parseWeeks reads a Weeks cell: blank or "all", "odd", "even", or a list of
// weeks and ranges such as "1-4, 6, 9-12". all is the term's AllWeeks.
// Weeks beyond the term are kept (Validate reports them); weeks beyond 64 are
// an error here.
func parseWeeks(s string, all WeekSet) (WeekSet, error) {
	switch normWords(s) {
	case "", "all":
		return all, nil
	case "odd":
		return all & oddWeeks, nil
	case "even":
		return all &^ oddWeeks, nil
	}
	var w WeekSet
	for _, item := range splitList(s) {
		lo, hi, ok := strings.Cut(item, "-")
		if !ok {
			hi = lo
		}
		a, err1 := parseWhole(lo, 1, 64)
		b, err2 := parseWhole(hi, 1, 64)
		if err1 != nil || err2 != nil || b < a {
			return 0, fmt.Errorf("%s is not a list of teaching weeks — write all, odd, even or weeks and ranges from 1 to 64 such as 1-4, 6, 9-12", Quote(item))
		}
		for n := a; n <= b; n++ {
			w |= 1 << (n - 1)
		}
	}
	return w, nil
}

// parseStrength reads a Strength cell: blank or "hard", or a whole-number
// weight of a preference.
func parseStrength(s string) (hard bool, weight int, err error) {
	switch normWords(s) {
	case "", "hard":
		return true, 0, nil
	}
	w, err := parseWhole(s, 0, 1_000_000)
	if err != nil {
		return false, 0, fmt.Errorf("%s is neither hard nor a weight — write hard, or a whole number from 0 to 1000000 for a preference", Quote(strings.TrimSpace(s)))
	}
	return false, w, nil
}

// parseFixed reads one fixed meeting "Tue 10:00 R204" (room optional).
func parseFixed(s string) (Fixed, error) {
	f := strings.Fields(s)
	bad := fmt.Errorf("%s is not a fixed meeting — write day, start time and optionally a room, e.g. Tue 10:00 R204", Quote(s))
	if len(f) < 2 {
		return Fixed{}, bad
	}
	d, ok := ParseDay(f[0])
	if !ok {
		return Fixed{}, bad
	}
	c, err := ParseClock(f[1])
	if err != nil {
		return Fixed{}, bad
	}
	return Fixed{Day: d, Start: c, Room: strings.Join(f[2:], " "), Text: strings.TrimSpace(s)}, nil
}

// colLetter is the spreadsheet letter of the 0-based column index i ("A",
// "Z", "AA", ...).
func colLetter(i int) string {
	var b []byte
	for i++; i > 0; i = (i - 1) / 26 {
		b = append([]byte{byte('A' + (i-1)%26)}, b...)
	}
	return string(b)
}
