package timetable

import (
	"math"
	"slices"
	"strconv"
	"strings"
	"time"
)

// schedRequired are the columns a timetable must have.
var schedRequired = []string{"Section", "Day", "Start", "Room"}

// schedKey identifies a period by day and start.
type schedKey struct {
	day   time.Weekday
	start Clock
}

// schedParse turns the non-blank rows of a timetable sheet (header first)
// into a schedule; lines holds each row's 1-based row number.
func schedParse(t *Term, sheet string, rows [][]string, lines []int) (*Schedule, Problems) {
	s := &Schedule{}
	var ps Problems
	if len(rows) == 0 {
		ps.errorf(Position{Sheet: sheet}, "the sheet is empty — it needs the header row %s and one row per meeting", strings.Join(TimetableColumns, ", "))
		return s, ps
	}
	col, ok := schedHeader(sheet, rows[0], lines[0], &ps)
	if !ok {
		return s, ps
	}
	periods := map[schedKey]int{}
	for i, p := range t.Periods {
		if _, dup := periods[schedKey{p.Day, p.Start}]; !dup {
			periods[schedKey{p.Day, p.Start}] = i
		}
	}
	secs := t.SectionIndex()
	var blankMeeting []int // placements whose Meeting cell was blank
	for r := 1; r < len(rows); r++ {
		row, line := rows[r], lines[r]
		cell := schedCell(sheet, col, row, line)
		p, blank, ok := schedRow(t, periods, secs, cell, &ps)
		if !ok {
			continue
		}
		p.Src = Source{Sheet: sheet, Row: line}
		if si, known := secs[p.Section]; known && !t.Sections[si].UsesTimes() {
			schedReadOnlyCells(t, &t.Sections[si], p, cell, &ps)
		} else if known {
			schedReadOnlyPeople(&t.Sections[si], cell, &ps)
		}
		if blank {
			blankMeeting = append(blankMeeting, len(s.Placements))
		}
		s.Placements = append(s.Placements, p)
	}
	schedNumber(s, blankMeeting)
	return s, ps
}

// schedHeader maps the known headers to column indexes, warning about
// unknown columns; ok is false when a required column is missing.
func schedHeader(sheet string, header []string, line int, ps *Problems) (map[string]int, bool) {
	return readListHeader(timetableList, sheet, header, line, ps)
}

// timetableList is the header of a timetable sheet.
var timetableList = listColumns{noun: "timetable", needs: "the timetable needs the columns", columns: TimetableColumns, required: schedRequired}

// schedRow reads one data row; blank reports a blank Meeting cell, and ok
// is false when a cell could not be read (the problem is recorded).
func schedRow(t *Term, periods map[schedKey]int, secs map[string]int, cell func(string) (string, Position), ps *Problems) (p Placement, blank, ok bool) {
	ok = true
	sec, pos := cell("Section")
	if sec == "" {
		ps.errorf(pos, "the Section is blank — write the section ID from the Sections sheet, or delete the row")
		ok = false
	}
	p.Section = sec
	if v, pos := cell("Meeting"); v == "" {
		blank = true
	} else if n, good := schedWhole(v); !good || n < 1 {
		ps.errorf(pos, "meeting %q is not a whole number from 1 up — number a section's meetings 1, 2, 3, ...", v)
		ok = false
	} else {
		p.Meeting = n
	}
	if si, known := secs[sec]; known && t.Sections[si].UsesTimes() {
		ok = schedPatternRow(t, &t.Sections[si], &p, cell, ps) && ok
		p.Room, _ = cell("Room")
		return p, blank, ok
	}
	dv, dpos := cell("Day")
	day, goodDay := ParseDay(dv)
	switch days, many := parseDaySet(dv); {
	case goodDay:
	case many && days.Count() > 1 && p.Section != "":
		ps.errorf(dpos, "%q names the days of a meeting pattern, but %s meets on the period grid, one meeting a row — write one day, or give the section meeting times on the meeting times sheet", dv, p.Section)
		ok = false
	default:
		ps.errorf(dpos, "%q is not a day — write Mon, Tue, Wed, Thu, Fri, Sat or Sun", dv)
		ok = false
	}
	sv, spos := cell("Start")
	start, err := ParseClock(sv)
	switch {
	case sv == "":
		ps.errorf(spos, "the Start is blank — write the start time of the meeting, e.g. 09:00")
		ok = false
	case err != nil:
		ps.errorf(spos, "start %s", err.Error())
		ok = false
	case goodDay && schedStarts(t, day) == "":
		ps.errorf(dpos, "the grid has no periods on %s — use a day from the Periods sheet (%s)", DayName(day), schedDays(t))
		ok = false
	case goodDay:
		i, found := periods[schedKey{day, start}]
		if !found {
			ps.errorf(spos, "no period starts at %s %s — use a start time from the Periods sheet (%s: %s)", DayName(day), start, DayName(day), schedStarts(t, day))
			ok = false
		}
		p.Period = i
	}
	p.Room, _ = cell("Room")
	return p, blank, ok
}

// schedStarts lists the start times of day in the grid ("" when none).
func schedStarts(t *Term, day time.Weekday) string {
	var out []string
	for _, p := range t.Periods {
		if p.Day == day {
			out = append(out, p.Start.String())
		}
	}
	return strings.Join(out, ", ")
}

// schedDays lists the days of the grid.
func schedDays(t *Term) string {
	var out []string
	for _, d := range t.Days() {
		out = append(out, DayName(d))
	}
	return strings.Join(out, ", ")
}

// schedReadOnlyCells warns when End, Weeks, Staff or Cohorts of a grid
// section's row disagree with the term: the term decides them and the
// cells are ignored. (For a pattern section End and Weeks pick the
// meeting time; see schedPatternRow.)
func schedReadOnlyCells(t *Term, sec *Section, p Placement, cell func(string) (string, Position), ps *Problems) {
	if v, pos := cell("Weeks"); v != "" {
		got, err := parseWeeks(v, t.AllWeeks())
		if want := sec.Weeks; err != nil || got != want {
			ps.warnf(pos, "weeks %s differ from the Sections sheet: %s meets in weeks %q; the Sections sheet decides the weeks, so change them there — this cell is ignored",
				Quote(v), sec.ID, t.WeeksText(want))
		}
	}
	if v, pos := cell("End"); v != "" {
		end, err := ParseClock(v)
		if span, fits := t.Span(p.Period, occLength(sec)); err == nil && fits {
			if want := t.Periods[span[len(span)-1]].End; end != want {
				ps.warnf(pos, "end %s does not match: %s meets for %d period(s) from %s, ending at %s; the Sections sheet decides the length, so this cell is ignored",
					end, sec.ID, occLength(sec), t.Periods[p.Period].Label(), want)
			}
		}
	}
	schedReadOnlyPeople(sec, cell, ps)
}

// schedReadOnlyPeople warns when Staff or Cohorts disagree with the term.
func schedReadOnlyPeople(sec *Section, cell func(string) (string, Position), ps *Problems) {
	for _, c := range []struct {
		col  string
		want []string
		what string
	}{{"Staff", sec.Staff, "who teaches"}, {"Cohorts", sec.Cohorts, "who attends"}} {
		v, pos := cell(c.col)
		if v == "" {
			continue
		}
		if got := schedList(v); !schedSameSet(got, c.want) {
			ps.warnf(pos, "%s %q differs from the Sections sheet (%s); %s comes from the term workbook, so change it there — this cell is ignored",
				strings.ToLower(c.col), v, strings.Join(c.want, ", "), c.what)
		}
	}
}

// schedNumber gives each placement in blank the lowest meeting number its
// section does not use yet, in row order.
func schedNumber(s *Schedule, blank []int) {
	if len(blank) == 0 {
		return
	}
	used := map[string]map[int]bool{}
	isBlank := map[int]bool{}
	for _, i := range blank {
		isBlank[i] = true
	}
	for i, p := range s.Placements {
		if isBlank[i] {
			continue
		}
		if used[p.Section] == nil {
			used[p.Section] = map[int]bool{}
		}
		used[p.Section][p.Meeting] = true
	}
	for _, i := range blank {
		sec := s.Placements[i].Section
		if used[sec] == nil {
			used[sec] = map[int]bool{}
		}
		n := 1
		for used[sec][n] {
			n++
		}
		used[sec][n] = true
		s.Placements[i].Meeting = n
	}
}

// schedWhole reads a whole number, also in the "3.0" form spreadsheets use.
func schedWhole(s string) (int, bool) {
	if n, err := strconv.Atoi(s); err == nil {
		return n, true
	}
	v, err := strconv.ParseFloat(s, 64)
	if err != nil || math.IsNaN(v) || math.IsInf(v, 0) || math.Abs(v-math.Round(v)) > 1e-9 || math.Abs(v) > 1e9 {
		return 0, false
	}
	return int(math.Round(v)), true
}

// schedList splits a list cell on commas and semicolons.
func schedList(s string) []string {
	var out []string
	for _, f := range strings.FieldsFunc(s, func(r rune) bool { return r == ',' || r == ';' }) {
		if f = strings.TrimSpace(f); f != "" {
			out = append(out, f)
		}
	}
	return out
}

// schedSameSet compares two lists as sets.
func schedSameSet(a, b []string) bool {
	a, b = slices.Clone(a), slices.Clone(b)
	slices.Sort(a)
	slices.Sort(b)
	return slices.Equal(slices.Compact(a), slices.Compact(b))
}

// schedCell reads the cells of one timetable row by header name: the
// trimmed value and its position, or "" and the zero Position when the
// sheet has no such column.
func schedCell(sheet string, col map[string]int, row []string, line int) func(string) (string, Position) {
	return func(name string) (string, Position) {
		i, ok := col[name]
		if !ok {
			return "", Position{}
		}
		v := ""
		if i < len(row) {
			v = strings.TrimSpace(row[i])
		}
		return v, Position{Sheet: sheet, Row: line, Col: colLetter(i)}
	}
}
