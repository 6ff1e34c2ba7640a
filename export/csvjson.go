package export

import (
	"encoding/json"
	"io"

	"github.com/termwright/termwright/timetable"
)

// CSVColumns are the columns of WriteTimetableCSV: exactly the master
// Timetable sheet's columns (timetable.TimetableColumns), so that the CSV
// reads back with timetable.ReadSchedule. WriteTimetableJSON carries the
// rest (building, week numbers).
var CSVColumns = append([]string(nil), timetable.TimetableColumns...)

// WriteTimetableCSV writes the master timetable as RFC 4180 CSV (UTF-8,
// CRLF line ends, header row CSVColumns), one row per meeting sorted by
// day, start time, section and meeting number; cells as on the Timetable
// sheet, except that a cell a spreadsheet would take for a formula gets a
// single quote in front (timetable.SafeCSVCell, OWASP "CSV Injection");
// timetable.ReadSchedule takes it off again.
func WriteTimetableCSV(w io.Writer, t *timetable.Term, s *timetable.Schedule) error {
	v, err := newView(t, s)
	if err != nil {
		return err
	}
	return writeCSV(w, v)
}

func writeCSV(w io.Writer, v *view) error {
	items := v.masterItems()
	rows := make([][]string, len(items))
	for k, i := range items {
		rows[k] = v.masterRow(&v.meetings[i])
	}
	return writeSafeCSV(w, CSVColumns, rows)
}

// TimetableJSON is the document WriteTimetableJSON writes. Field names are
// stable; new fields may be added, none renamed or removed.
type TimetableJSON struct {
	Term     TermJSON      `json:"term"`
	Meetings []MeetingJSON `json:"meetings"`
}

// TermJSON describes the term in TimetableJSON.
type TermJSON struct {
	Name          string `json:"name"`
	FirstDay      string `json:"first_day"`      // YYYY-MM-DD
	LastDay       string `json:"last_day"`       // YYYY-MM-DD
	TimeZone      string `json:"time_zone"`      // IANA name
	TeachingWeeks int    `json:"teaching_weeks"` // weeks numbered 1..n from the first day's week to the last day's
	// WeeksWithTeaching counts the numbered weeks with at least one day of
	// teaching (a week of holidays does not count).
	WeeksWithTeaching int      `json:"weeks_with_teaching"`
	Holidays          []string `json:"holidays"` // YYYY-MM-DD
	Days              []string `json:"days"`     // grid days, "Mon" first
	PeriodsPerWeek    int      `json:"periods_per_week"`
}

// MeetingJSON is one meeting in TimetableJSON; meetings are sorted by day,
// start time, section and meeting number (in a term with pattern sections:
// day, start, end, section, meeting number).
type MeetingJSON struct {
	Section    string   `json:"section"`
	Title      string   `json:"title"`
	Meeting    int      `json:"meeting"` // 1-based meeting number within the section
	Day        string   `json:"day"`     // "Mon" .. "Sun"
	Start      string   `json:"start"`   // "HH:MM", local time of the term
	End        string   `json:"end"`     // "HH:MM"
	Room       string   `json:"room"`    // "" when the section takes no room
	Building   string   `json:"building"`
	Staff      []string `json:"staff"`       // staff IDs
	StaffNames []string `json:"staff_names"` // parallel to staff
	Cohorts    []string `json:"cohorts"`     // cohort IDs
	Weeks      []int    `json:"weeks"`       // teaching weeks (1-based) the meeting takes place
	// For a section placed by a meeting pattern, each day of the pattern is
	// one meeting; Time is the chosen meeting time (1-based, in the order
	// of the section's rows on the meeting times sheet) and Days all its
	// days. Both are left out for meetings on the period grid.
	Time int      `json:"time,omitempty"`
	Days []string `json:"days,omitempty"`
}

// WriteTimetableJSON writes the master timetable as an indented
// TimetableJSON document.
func WriteTimetableJSON(w io.Writer, t *timetable.Term, s *timetable.Schedule) error {
	v, err := newView(t, s)
	if err != nil {
		return err
	}
	return writeJSON(w, v)
}

func writeJSON(w io.Writer, v *view) error {
	t := v.t
	doc := TimetableJSON{Term: TermJSON{
		Name:              t.Name,
		TimeZone:          t.TimeZone,
		TeachingWeeks:     t.TeachingWeeks(),
		WeeksWithTeaching: v.weeksWithTeaching(),
		Holidays:          []string{},
		Days:              []string{},
		PeriodsPerWeek:    len(t.Periods),
	}, Meetings: make([]MeetingJSON, 0, len(v.meetings))}
	if !t.FirstDay.IsZero() {
		doc.Term.FirstDay = t.FirstDay.Format("2006-01-02")
		doc.Term.LastDay = t.LastDay.Format("2006-01-02")
	}
	for _, h := range t.Holidays {
		doc.Term.Holidays = append(doc.Term.Holidays, h.Format("2006-01-02"))
	}
	for _, d := range v.days {
		doc.Term.Days = append(doc.Term.Days, timetable.DayName(d))
	}
	for i := range v.meetings {
		m := &v.meetings[i]
		row := v.masterRow(m)
		doc.Meetings = append(doc.Meetings, MeetingJSON{
			Section:    m.sec.ID,
			Title:      m.sec.Title,
			Meeting:    m.num,
			Day:        timetable.DayName(m.day),
			Start:      row[4],
			End:        row[5],
			Room:       row[6],
			Building:   m.building(),
			Staff:      nonNil(m.sec.Staff),
			StaffNames: v.staffNames(m.sec),
			Cohorts:    nonNil(m.sec.Cohorts),
			Weeks:      nonNilInts(v.weekNumbers(m)),
			Time:       m.time,
			Days:       patternDays(m),
		})
	}
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	enc.SetEscapeHTML(false)
	return enc.Encode(doc)
}

// patternDays lists the days of a pattern meeting's placement ("Mon",
// "Wed", ...); nil for a grid meeting.
func patternDays(m *meeting) []string {
	if !m.pattern() {
		return nil
	}
	var out []string
	for _, d := range m.days.List() {
		out = append(out, timetable.DayName(d))
	}
	return out
}

func nonNil(s []string) []string {
	if s == nil {
		return []string{}
	}
	return s
}

func nonNilInts(s []int) []int {
	if s == nil {
		return []int{}
	}
	return s
}
