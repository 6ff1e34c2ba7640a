package timetable

import (
	"strings"
	"time"
)

// Meeting is one meeting of a timetable as a comparison sees it: where and
// when it takes place and who attends, whether that came from a term or
// from the timetable's own cells.
type Meeting struct {
	Section    string       // section ID
	Number     int          // 1-based meeting number within the section
	Title      string       // section title
	Day        time.Weekday // day of the meeting (the first of Days for a meeting pattern)
	Days       DaySet       // every day of a meeting pattern ("Mon Wed Fri"); 0 for a meeting on one day
	Start      Clock        // start time
	End        Clock        // end time; 0 when the timetable does not say
	Room       string       // room ID; "" for meetings without a room
	Weeks      string       // teaching weeks in workbook form: "all", "odd", "even" or "1-6, 9"
	Staff      []string     // staff IDs
	StaffNames []string     // display names, in the order of Staff
	Cohorts    []string     // cohort IDs
	Src        Source       // the timetable row it was read from
}

// ReadMeetings reads the meetings of a timetable file (the workbook or CSV
// that ReadSchedule reads). With t nil it relies on the file alone: day,
// start, end, room, weeks, title, staff (IDs and names) and cohorts as the
// cells give them, and the schedule is nil. With a term, the file must fit
// it: the file is read as ReadSchedule reads it (the schedule, with the
// sectioned students of its class-list sheet, and the problems are
// exactly ReadSchedule's, so a day or time outside the grid is an error), and title, end, staff and cohorts come from the term's
// Sections sheet for every section it has. The Weeks cell is taken from
// the file even with a term, when it is filled in and readable: a
// timetable written before the term's weeks changed still says the weeks
// it was published with, which is what a comparison must see. When the
// problems hold an error the meetings are nil. The error is non-nil, and
// wraps ErrUnreadable, only when the file cannot be read; the file is
// read once.
func ReadMeetings(path string, t *Term) ([]Meeting, *Schedule, Problems, error) {
	main, lists, err := schedFileSheets(path)
	if err != nil {
		return nil, nil, nil, err
	}
	ms, ps := meetingsFromCells(main.name, main.rows, main.lines)
	if t == nil {
		for i := range ms {
			if ms[i].Weeks == "" {
				ms[i].Weeks = "all"
			}
		}
		ps.Sort()
		if len(ps.Errors()) > 0 {
			return nil, nil, ps, nil
		}
		return ms, nil, ps, nil
	}
	s, ps := schedFromSheets(t, main, lists) // ReadSchedule on the same sheets
	if len(ps.Errors()) > 0 {
		return nil, s, ps, nil
	}
	return meetingsFromTerm(t, s, ms), s, ps, nil
}

// meetingsFromCells reads every row from its own cells; rows whose
// section, day or start cannot be read are reported and left out.
func meetingsFromCells(sheet string, rows [][]string, lines []int) ([]Meeting, Problems) {
	var ps Problems
	if len(rows) == 0 {
		ps.errorf(Position{Sheet: sheet}, "the sheet is empty — it needs the header row %s and one row per meeting", strings.Join(TimetableColumns, ", "))
		return nil, ps
	}
	col, ok := schedHeader(sheet, rows[0], lines[0], &ps)
	if !ok {
		return nil, ps
	}
	s := &Schedule{}
	var ms []Meeting
	var blank []int
	for r := 1; r < len(rows); r++ {
		row, line := rows[r], lines[r]
		cell := schedCell(sheet, col, row, line)
		m, isBlank, ok := meetingRow(cell, &ps)
		if !ok {
			continue
		}
		m.Src = Source{Sheet: sheet, Row: line}
		if isBlank {
			blank = append(blank, len(ms))
		}
		ms = append(ms, m)
		s.Placements = append(s.Placements, Placement{Section: m.Section, Meeting: m.Number})
	}
	schedNumber(s, blank) // the same numbers ReadSchedule gives
	for i := range ms {
		ms[i].Number = s.Placements[i].Meeting
	}
	return ms, ps
}

// meetingRow reads one row's cells without a term.
func meetingRow(cell func(string) (string, Position), ps *Problems) (m Meeting, blank, ok bool) {
	ok = true
	var pos Position
	if m.Section, pos = cell("Section"); m.Section == "" {
		ps.errorf(pos, "the Section is blank — write the section ID, or delete the row")
		ok = false
	}
	if v, pos := cell("Meeting"); v == "" {
		blank = true
	} else if n, good := schedWhole(v); !good || n < 1 {
		ps.errorf(pos, "meeting %q is not a whole number from 1 up — number a section's meetings 1, 2, 3, ...", v)
		ok = false
	} else {
		m.Number = n
	}
	dv, dpos := cell("Day")
	days, good := parseDaySet(dv)
	if !good {
		ps.errorf(dpos, "%q is not a day — write Mon, Tue, Wed, Thu, Fri, Sat or Sun, or the days of a meeting pattern such as Mon Wed Fri", dv)
		ok = false
	}
	m.Day, _ = days.First()
	if days.Count() > 1 {
		m.Days = days
	}
	sv, spos := cell("Start")
	start, err := ParseClock(sv)
	if err != nil {
		ps.errorf(spos, "start %s — write the start time of the meeting, e.g. 09:00", err.Error())
		ok = false
	}
	m.Start = start
	if ev, epos := cell("End"); ev != "" {
		end, err := ParseClock(ev)
		if err != nil || end <= start {
			ps.warnf(epos, "end %q is not a time after the start and is ignored — write it as HH:MM, e.g. 10:00", ev)
		} else {
			m.End = end
		}
	}
	m.Room, _ = cell("Room")
	m.Title, _ = cell("Title")
	wv, wpos := cell("Weeks")
	m.Weeks = cellWeeks(wv, wpos, ps)
	sv, _ = cell("Staff")
	m.Staff = schedList(sv)
	nv, _ := cell("Staff names")
	m.StaffNames = schedList(nv)
	cv, _ := cell("Cohorts")
	m.Cohorts = schedList(cv)
	return m, blank, ok
}

// cellWeeks puts a Weeks cell read without a term in workbook form: a
// list of weeks is normalised ("1-3,5" and "1, 2, 3, 5" both give
// "1-3, 5"); blank stays "". An unreadable cell is kept as written, with
// a warning.
func cellWeeks(v string, pos Position, ps *Problems) string {
	switch w := normWords(v); w {
	case "":
		return ""
	case "all", "odd", "even":
		return w
	}
	set, err := parseWeeks(v, ^WeekSet(0))
	if err != nil {
		ps.warnf(pos, "weeks %s; the text is compared as written", err.Error())
		return strings.TrimSpace(v)
	}
	return set.Ranges()
}

// meetingsFromTerm makes the meetings of s, read for t, with the term's
// title, end, staff and cohorts; cells holds the same rows read from their
// own cells (for the Weeks column and for sections the term lacks).
func meetingsFromTerm(t *Term, s *Schedule, cells []Meeting) []Meeting {
	byRow := make(map[Source]*Meeting, len(cells))
	for i := range cells {
		byRow[cells[i].Src] = &cells[i]
	}
	secs, staff := t.SectionIndex(), t.StaffIndex()
	all := t.AllWeeks()
	out := make([]Meeting, 0, len(s.Placements))
	for _, p := range s.Placements {
		m := Meeting{Section: p.Section, Number: p.Meeting, Room: p.Room, Src: p.Src}
		if c := byRow[p.Src]; c != nil {
			m = *c
			m.Number, m.Room = p.Meeting, p.Room
		}
		if p.Period >= 0 && p.Period < len(t.Periods) {
			m.Day, m.Start = t.Periods[p.Period].Day, t.Periods[p.Period].Start
		}
		si, known := secs[p.Section]
		if !known {
			out = append(out, m)
			continue
		}
		sec := &t.Sections[si]
		var choice *TimeChoice
		if sec.UsesTimes() && p.Time >= 1 && p.Time <= len(sec.Times) {
			choice = &sec.Times[p.Time-1]
			m.Day, _ = choice.Days.First()
			m.Days, m.Start, m.End = 0, choice.Start, choice.End()
			if choice.Days.Count() > 1 {
				m.Days = choice.Days
			}
		}
		m.Title, m.Staff, m.Cohorts = sec.Title, sec.Staff, sec.Cohorts
		m.StaffNames = make([]string, len(sec.Staff))
		for i, id := range sec.Staff {
			m.StaffNames[i] = id
			if k, ok := staff[id]; ok && t.Staff[k].Name != "" {
				m.StaffNames[i] = t.Staff[k].Name
			}
		}
		if span, fits := t.Span(p.Period, occLength(sec)); fits && choice == nil {
			m.End = t.Periods[span[len(span)-1]].End
		}
		weeks := sec.Weeks & all
		if choice != nil {
			weeks = choice.Weeks & all
		} else if sec.Weeks == 0 {
			weeks = all
		}
		m.Weeks = t.WeeksText(weeks)
		if c := byRow[p.Src]; c != nil && c.Weeks != "" {
			if w, err := parseWeeks(c.Weeks, all); err == nil {
				m.Weeks = t.WeeksText(w & all)
			}
		}
		out = append(out, m)
	}
	return out
}

// MeetingsOf gives the meetings of a schedule for term t, with the term's
// titles, times, weeks, staff and cohorts: the in-memory counterpart of
// ReadMeetings, for comparing two versions that are not files.
func MeetingsOf(t *Term, s *Schedule) []Meeting { return meetingsFromTerm(t, s, nil) }
