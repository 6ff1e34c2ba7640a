package export

import (
	"crypto/sha256"
	"encoding/hex"
	"errors"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
	"time"

	"github.com/termwright/termwright/timetable"
)

// icsProdID identifies the producer of our calendars (RFC 5545 §3.7.3).
const icsProdID = "-//termwright//termwright timetable//EN"

// sequenceEpoch is the origin of SEQUENCE numbers: SEQUENCE is the number
// of whole seconds from it to Options.Generated, so a publication made a
// second or more after another carries a higher SEQUENCE for the same
// event (RFC 5545 §3.8.7.4). SEQUENCE is an INTEGER, at most 2147483647
// (§3.3.8), which seconds from 2020 reach only in 2088.
var sequenceEpoch = time.Date(2020, 1, 1, 0, 0, 0, 0, time.UTC)

// sequence is the SEQUENCE of every event published at gen.
func sequence(gen time.Time) int64 {
	return min(max(int64(gen.Sub(sequenceEpoch)/time.Second), 0), math.MaxInt32)
}

// WriteICS writes who's calendar as an RFC 5545 VCALENDAR: one weekly
// recurring VEVENT per meeting in the term's time zone (with a VTIMEZONE
// built from Go's zone data), from the first date the meeting takes place
// to the last, holidays and weeks outside the section's weeks excluded with
// EXDATE. See the package documentation for the exact properties.
func WriteICS(w io.Writer, t *timetable.Term, s *timetable.Schedule, who Subject, opt Options) error {
	v, err := newView(t, s)
	if err != nil {
		return err
	}
	return v.writeICS(w, who, opt, nil)
}

// writeICS writes who's calendar; more, when not nil, adds events after
// the meetings' own (the cancellations of a change notice).
func (v *view) writeICS(w io.Writer, who Subject, opt Options, more func(iw *icsWriter, cal *calendarInfo, gen time.Time)) error {
	items, err := v.of(who)
	if err != nil {
		return err
	}
	cal, err := v.calendar()
	if err != nil {
		return err
	}
	gen := opt.generated().UTC()
	iw := newICSWriter(w)
	iw.line("BEGIN:VCALENDAR")
	iw.line("VERSION:2.0")
	iw.line("PRODID:" + icsProdID)
	iw.line("CALSCALE:GREGORIAN")
	name := v.title(who)
	if v.t.Name != "" {
		name += " — " + v.t.Name
	}
	iw.prop("NAME", name) // RFC 7986 §5.1
	iw.prop("X-WR-CALNAME", name)
	iw.prop("X-WR-TIMEZONE", cal.tzid)
	writeVTimezone(iw, cal.tzid, cal.obs)
	for _, i := range items {
		v.writeEvent(iw, cal, &v.meetings[i], who, gen)
	}
	if more != nil {
		more(iw, cal, gen)
	}
	iw.line("END:VCALENDAR")
	return iw.flush()
}

// calendarInfo is what every calendar of a term shares.
type calendarInfo struct {
	loc      *time.Location
	tzid     string
	obs      []observance
	holidays map[string]bool // "2006-01-02" dates without teaching
	monday   time.Time       // Monday of teaching week 1 (UTC midnight)
}

// calendar computes (once per view) the time zone and term dates.
func (v *view) calendar() (*calendarInfo, error) {
	if v.cal != nil {
		return v.cal, nil
	}
	loc, tzid, err := termLocation(v.t)
	if err != nil {
		return nil, err
	}
	c, err := v.termDays()
	if err != nil {
		return nil, err
	}
	c.loc, c.tzid = loc, tzid
	c.obs = observances(loc, v.t.FirstDay, v.t.LastDay)
	v.cal = c
	return c, nil
}

// termDays gives the date part of calendarInfo (no time zone needed).
func (v *view) termDays() (*calendarInfo, error) {
	if v.t.FirstDay.IsZero() || v.t.LastDay.Before(v.t.FirstDay) {
		return nil, errors.New("calendars need the first and the last day of the term, the last on or after the first; fill in the First day and Last day keys of the Term sheet")
	}
	c := &calendarInfo{holidays: map[string]bool{}}
	for _, h := range v.t.Holidays {
		c.holidays[h.Format("2006-01-02")] = true
	}
	first := civil(v.t.FirstDay)
	c.monday = first.AddDate(0, 0, -timetable.WeekOrder(first.Weekday()))
	return c, nil
}

// civil is the calendar date of d as midnight UTC (term dates are dates).
func civil(d time.Time) time.Time {
	return time.Date(d.Year(), d.Month(), d.Day(), 0, 0, 0, 0, time.UTC)
}

// occurrences splits the weekly dates of a meeting between the term's
// first and last day into the dates it takes place and the dates it does
// not (holidays, weeks outside the section's weeks) after the first one.
// Dates are midnight UTC.
func (v *view) occurrences(c *calendarInfo, m *meeting) (on, off []time.Time) {
	first, last := civil(v.t.FirstDay), civil(v.t.LastDay)
	d := first.AddDate(0, 0, (int(m.day)-int(first.Weekday())+7)%7)
	weeks := m.weeks
	if weeks == 0 {
		weeks = v.allWeeks
	}
	for ; !d.After(last); d = d.AddDate(0, 0, 7) {
		week := int(d.Sub(c.monday).Hours()/24)/7 + 1
		if weeks.Has(week) && !c.holidays[d.Format("2006-01-02")] {
			on = append(on, d)
		} else if len(on) > 0 {
			off = append(off, d)
		}
	}
	// Dates left out after the last occurrence are beyond UNTIL anyway.
	for len(off) > 0 && len(on) > 0 && off[len(off)-1].After(on[len(on)-1]) {
		off = off[:len(off)-1]
	}
	return on, off
}

// at is the instant of clock c on date d in loc.
func at(d time.Time, c timetable.Clock, loc *time.Location) time.Time {
	return time.Date(d.Year(), d.Month(), d.Day(), int(c)/60, int(c)%60, 0, 0, loc)
}

// wall formats the local wall time of date d at clock c (DATE-TIME form 2).
func wall(d time.Time, c timetable.Clock) string {
	return fmt.Sprintf("%04d%02d%02dT%02d%02d00", d.Year(), int(d.Month()), d.Day(), int(c)/60, int(c)%60)
}

// eventUID is the stable UID of a meeting in a subject's calendar: it
// depends only on the term name, section, meeting number and subject, so
// publishing again updates the event instead of adding a second one.
func eventUID(term string, sec string, num int, who Subject) string {
	h := sha256.Sum256([]byte(strings.Join([]string{term, sec, strconv.Itoa(num), kindWord(who.Kind), who.ID}, "\x1f")))
	return hex.EncodeToString(h[:16]) + "@termwright"
}

// meetingUID is the UID of meeting m in who's calendar: eventUID for a
// grid meeting and for the first day of a pattern placement, and for its
// later days the same with the day's place in the pattern ("1.2" for the
// second day of meeting 1), so that a placement moved to other days of
// the week keeps updating the same events.
func (v *view) meetingUID(m *meeting, who Subject) string {
	if m.part == 0 {
		return eventUID(v.t.Name, m.sec.ID, m.num, who)
	}
	return partUID(v.t.Name, m.sec.ID, m.num, m.part, who)
}

// partUID is the UID of day part (0-based, at least 1) of a pattern
// placement; part 0 is eventUID.
func partUID(term, sec string, num, part int, who Subject) string {
	n := strconv.Itoa(num) + "." + strconv.Itoa(part+1)
	h := sha256.Sum256([]byte(strings.Join([]string{term, sec, n, kindWord(who.Kind), who.ID}, "\x1f")))
	return hex.EncodeToString(h[:16]) + "@termwright"
}

// writeEvent writes one meeting's VEVENT (nothing when it never takes place).
func (v *view) writeEvent(w *icsWriter, c *calendarInfo, m *meeting, who Subject, gen time.Time) {
	on, off := v.occurrences(c, m)
	if len(on) == 0 {
		return
	}
	tz := ";TZID=" + icsParam(c.tzid)
	w.line("BEGIN:VEVENT")
	w.line("UID:" + v.meetingUID(m, who))
	w.line("DTSTAMP:" + gen.Format("20060102T150405Z"))
	w.line("SEQUENCE:" + strconv.FormatInt(sequence(gen), 10))
	w.line("DTSTART" + tz + ":" + wall(on[0], m.from))
	w.line("DTEND" + tz + ":" + wall(on[0], m.to))
	// RFC 5545 §3.3.10: with a local DTSTART and a TZID, UNTIL is in UTC.
	w.line("RRULE:FREQ=WEEKLY;UNTIL=" + at(on[len(on)-1], m.from, c.loc).UTC().Format("20060102T150405Z"))
	if len(off) > 0 {
		dates := make([]string, len(off))
		for i, d := range off {
			dates[i] = wall(d, m.from)
		}
		w.line("EXDATE" + tz + ":" + strings.Join(dates, ","))
	}
	w.prop("SUMMARY", m.sec.ID+" "+m.sec.Title)
	if m.room != nil {
		w.prop("LOCATION", roomText(m.room))
	}
	w.prop("DESCRIPTION", v.describe(m))
	w.line("TRANSP:OPAQUE")
	w.line("END:VEVENT")
}

// describe is the DESCRIPTION of a meeting: section, title, staff, cohorts,
// weeks, one per line.
func (v *view) describe(m *meeting) string {
	head := fmt.Sprintf("Section %s, meeting %d of %d", m.sec.ID, m.num, max(m.sec.Meetings, 1))
	if m.pattern() {
		head = fmt.Sprintf("Section %s, meets %s %s–%s", m.sec.ID, m.days, m.from, m.to)
	}
	lines := []string{head, m.sec.Title}
	if names := v.staffNames(m.sec); len(names) > 0 {
		lines = append(lines, "Staff: "+strings.Join(names, ", "))
	}
	if len(m.sec.Cohorts) > 0 {
		lines = append(lines, "Cohorts: "+strings.Join(m.sec.Cohorts, ", "))
	}
	if m.room == nil && m.sec.NoRoom {
		lines = append(lines, "No room: online or off-site")
	}
	if wk := v.weekRanges(m); wk != "" {
		lines = append(lines, "Teaching weeks: "+wk)
	}
	return strings.Join(lines, "\n")
}
