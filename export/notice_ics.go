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
// METHOD. A meeting pattern has one such event per day; when a pattern
// moved to fewer days a week, the days it no longer meets are cancelled
// the same way.
func (n *Notices) Calendar(w io.Writer, who Subject, cancelled []timetable.Meeting, opt Options) error {
	v := n.cal
	items, err := v.of(who)
	if err != nil {
		return err
	}
	attends := map[noticeKey]bool{}
	for _, i := range items {
		attends[noticeKey{v.meetings[i].sec.ID, v.meetings[i].num}] = true
	}
	return v.writeICS(w, who, opt, func(iw *icsWriter, cal *calendarInfo, gen time.Time) {
		for i := range cancelled {
			v.writeCancelled(iw, cal, &cancelled[i], who, gen, 0)
		}
		if who.Kind == WhoStudent {
			for _, mv := range n.moves[who.ID] {
				for _, m := range n.oldMeetings(mv.From) {
					v.writeCancelled(iw, cal, m, who, gen, 0)
				}
			}
		}
		// A meeting pattern moved to fewer days a week keeps the events of
		// its first days (same UIDs); the events of the days it lost are
		// cancelled.
		for _, ch := range n.c.Changes {
			if ch.Old != nil && ch.New != nil && attends[noticeKey{ch.Section, ch.Old.Number}] {
				if keep := ch.New.AllDays().Count(); ch.Old.AllDays().Count() > keep {
					v.writeCancelled(iw, cal, ch.Old, who, gen, keep)
				}
			}
		}
	})
}

// writeCancelled writes the VEVENTs that cancel an earlier meeting m: one,
// or one per day of a meeting pattern from its day from (0-based) on, each
// with the UID that day's event had.
func (v *view) writeCancelled(w *icsWriter, c *calendarInfo, m *timetable.Meeting, who Subject, gen time.Time, from int) {
	for k, day := range m.AllDays().List() {
		if k < from {
			continue
		}
		uid := eventUID(v.t.Name, m.Section, m.Number, who)
		if k > 0 {
			uid = partUID(v.t.Name, m.Section, m.Number, k, who)
		}
		v.writeCancelledDay(w, c, m, day, uid, gen)
	}
}

// writeCancelledDay writes the VEVENT that cancels meeting m's event uid
// on weekday day.
func (v *view) writeCancelledDay(w *icsWriter, c *calendarInfo, m *timetable.Meeting, day time.Weekday, uid string, gen time.Time) {
	first := civil(v.t.FirstDay)
	d := first.AddDate(0, 0, (int(day)-int(first.Weekday())+7)%7)
	tz := ";TZID=" + icsParam(c.tzid)
	w.line("BEGIN:VEVENT")
	w.line("UID:" + uid)
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
