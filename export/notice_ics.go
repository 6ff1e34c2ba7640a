package export

import (
	"io"
	"strconv"
	"time"

	"github.com/termwright/termwright/timetable"
)

// Calendar writes who's updated calendar: exactly what WriteICS writes
// for the term and the renumbered new timetable, plus, for each meeting in
// cancelled (meetings of the earlier timetable that who no longer
// attends), a VEVENT with that meeting's UID (the UID an earlier calendar
// of the same term gave it), STATUS:CANCELLED (RFC 5545 §3.8.1.11) and
// the SEQUENCE of this publication, so that a calendar program importing
// the file marks the earlier event cancelled instead of keeping it. A
// cancelled event has one occurrence, the first date of the term on the
// meeting's weekday, as §3.6.1 requires DTSTART in a calendar without
// METHOD.
func (n *Notices) Calendar(w io.Writer, who Subject, cancelled []timetable.Meeting, opt Options) error {
	v := n.cal
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
	// The same header as writeICS (ical.go).
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
	for i := range cancelled {
		v.writeCancelled(iw, cal, &cancelled[i], who, gen)
	}
	iw.line("END:VCALENDAR")
	return iw.flush()
}

// writeCancelled writes the VEVENT that cancels an earlier meeting m.
func (v *view) writeCancelled(w *icsWriter, c *calendarInfo, m *timetable.Meeting, who Subject, gen time.Time) {
	first := civil(v.t.FirstDay)
	d := first.AddDate(0, 0, (int(m.Day)-int(first.Weekday())+7)%7)
	tz := ";TZID=" + icsParam(c.tzid)
	w.line("BEGIN:VEVENT")
	w.line("UID:" + eventUID(v.t.Name, m.Section, m.Number, who))
	w.line("DTSTAMP:" + gen.Format("20060102T150405Z"))
	w.line("SEQUENCE:" + strconv.FormatInt(sequence(gen), 10))
	w.line("DTSTART" + tz + ":" + wall(d, m.Start))
	if m.End > m.Start { // §3.8.2.2: DTEND after DTSTART; without it the event is an instant
		w.line("DTEND" + tz + ":" + wall(d, m.End))
	}
	w.prop("SUMMARY", "Cancelled: "+m.Section+" "+m.Title)
	w.prop("DESCRIPTION", "This meeting of "+m.Section+" is no longer in the timetable.")
	w.line("STATUS:CANCELLED")
	w.line("TRANSP:TRANSPARENT")
	w.line("END:VEVENT")
}
