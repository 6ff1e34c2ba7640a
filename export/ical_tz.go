package export

import (
	"fmt"
	"time"
	_ "time/tzdata" // time zones work even where the system has no zoneinfo

	"github.com/termwright/termwright/timetable"
)

// termLocation loads the term's time zone ("UTC" when blank).
func termLocation(t *timetable.Term) (*time.Location, string, error) {
	name := t.TimeZone
	if name == "" {
		name = "UTC"
	}
	loc, err := time.LoadLocation(name)
	if err != nil {
		return nil, "", fmt.Errorf("the term's time zone %q is not a time zone name such as Europe/Dublin or America/New_York; fix the Time zone key of the Term sheet", name)
	}
	return loc, name, nil
}

// observance is one STANDARD or DAYLIGHT sub-component of a VTIMEZONE.
type observance struct {
	daylight bool
	start    string // local wall time of the onset, in the offset before it
	from, to int    // UTC offsets in seconds before and after the onset
	name     string // zone abbreviation after the onset
}

// observances lists the zone's offsets from the start of the year of first
// to the end of the year of last, each as a one-time observance with the
// exact onset Go's zone data gives (no RRULE, so past and future rule
// changes cannot make it wrong for the term). An observance whose offset is
// larger than the one before (or, for the first, than the next) is
// DAYLIGHT; this also holds for zones whose data marks winter as the
// "daylight" time, such as Europe/Dublin.
func observances(loc *time.Location, first, last time.Time) []observance {
	begin := time.Date(first.Year(), 1, 1, 0, 0, 0, 0, loc)
	end := time.Date(last.Year()+1, 1, 1, 0, 0, 0, 0, loc)
	name, off := begin.Zone()
	zs, _ := begin.ZoneBounds()
	var out []observance
	if zs.IsZero() {
		out = append(out, observance{start: "19700101T000000", from: off, to: off, name: name})
	} else {
		_, before := zs.Add(-time.Second).Zone()
		out = append(out, observance{start: localStamp(zs, before), from: before, to: off, name: name})
	}
	for at := begin; ; {
		_, ze := at.ZoneBounds()
		if ze.IsZero() || !ze.Before(end) {
			break
		}
		name, next := ze.Zone()
		if next != off || name != out[len(out)-1].name {
			out = append(out, observance{start: localStamp(ze, off), from: off, to: next, name: name, daylight: next > off})
		}
		off, at = next, ze
	}
	if len(out) > 1 {
		out[0].daylight = out[0].to > out[1].to
	}
	return out
}

// localStamp formats instant t as the local wall time of a zone with UTC
// offset off seconds.
func localStamp(t time.Time, off int) string {
	return t.In(time.FixedZone("", off)).Format("20060102T150405")
}

// offsetText formats a UTC offset as RFC 5545 UTC-OFFSET (+0100, -0330).
func offsetText(off int) string {
	sign := '+'
	if off < 0 {
		sign, off = '-', -off
	}
	s := fmt.Sprintf("%c%02d%02d", sign, off/3600, off/60%60)
	if off%60 != 0 {
		s += fmt.Sprintf("%02d", off%60)
	}
	return s
}

// writeVTimezone writes the VTIMEZONE component for tzid.
func writeVTimezone(w *icsWriter, tzid string, obs []observance) {
	w.line("BEGIN:VTIMEZONE")
	w.line("TZID:" + tzid)
	for _, o := range obs {
		kind := "STANDARD"
		if o.daylight {
			kind = "DAYLIGHT"
		}
		w.line("BEGIN:" + kind)
		w.line("DTSTART:" + o.start)
		w.line("TZOFFSETFROM:" + offsetText(o.from))
		w.line("TZOFFSETTO:" + offsetText(o.to))
		if o.name != "" {
			w.prop("TZNAME", o.name)
		}
		w.line("END:" + kind)
	}
	w.line("END:VTIMEZONE")
}
