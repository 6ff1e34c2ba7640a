package benchfmt

import (
	"bufio"
	"fmt"
	"io"
	"strconv"
	"strings"
	"unicode"

	"github.com/termwright/termwright/timetable"
)

// WriteCTT writes t in the .ctt format ReadCTT reads, so that read → write
// → read gives the same Term (up to source rows) and write → read → write
// the same bytes. Only terms in the competition's model can be written:
// every day has the same number of periods; every section has exactly one
// staff member, periods of length 1, no fixed meetings, needs, room lists or
// "no room"; unavailability is hard and per section (one line per covered
// period); there are no relations or enrolments; IDs have no spaces.
// Anything else is an error that names the first record that does not fit.
func WriteCTT(w io.Writer, t *timetable.Term) error {
	perDay, err := cttCheckWritable(t)
	if err != nil {
		return err
	}
	g := newITCGrid(t)
	type unav struct {
		who       string
		day, slot int
	}
	var lines []unav
	for _, u := range t.Unavailable {
		for i, p := range t.Periods {
			if u.Covers(p) {
				lines = append(lines, unav{u.Who, g.day[i], g.slot[i]})
			}
		}
	}
	bw := bufio.NewWriter(w)
	fmt.Fprintf(bw, "Name: %s\nCourses: %d\nRooms: %d\nDays: %d\nPeriods_per_day: %d\nCurricula: %d\nConstraints: %d\n\n",
		t.Name, len(t.Sections), len(t.Rooms), g.days, perDay, len(t.Cohorts), len(lines))
	bw.WriteString(cttCourses + "\n")
	for _, s := range t.Sections {
		fmt.Fprintf(bw, "%s %s %d %d %d\n", s.ID, s.Staff[0], s.Meetings, s.MinDays, s.Size)
	}
	bw.WriteString("\n" + cttRooms + "\n")
	for _, r := range t.Rooms {
		fmt.Fprintf(bw, "%s %d\n", r.ID, r.Capacity)
	}
	bw.WriteString("\n" + cttCurricula + "\n")
	for _, c := range t.Cohorts {
		var members []string
		for _, s := range t.Sections {
			for _, sc := range s.Cohorts {
				if sc == c.ID {
					members = append(members, s.ID)
					break
				}
			}
		}
		bw.WriteString(c.ID + " " + strconv.Itoa(len(members)))
		for _, m := range members {
			bw.WriteString(" " + m)
		}
		bw.WriteByte('\n')
	}
	bw.WriteString("\n" + cttUnavail + "\n")
	for _, u := range lines {
		fmt.Fprintf(bw, "%s %d %d\n", u.who, u.day, u.slot)
	}
	bw.WriteString("\n" + cttEnd + "\n")
	return bw.Flush()
}

// cttCheckWritable says why t cannot be written as .ctt, or returns the
// number of periods per day.
func cttCheckWritable(t *timetable.Term) (int, error) {
	bad := func(format string, a ...any) (int, error) {
		return 0, fmt.Errorf("write .ctt: "+format, a...)
	}
	if strings.TrimSpace(t.Name) == "" || strings.Contains(t.Name, "\n") || t.Name != strings.TrimSpace(t.Name) {
		return bad("the term name %q must be one line without surrounding spaces", t.Name)
	}
	if len(t.Periods) == 0 {
		return bad("the term has no periods")
	}
	g := newITCGrid(t)
	if g.days > cttMaxDays {
		return bad("the grid has %d days; at most %d fit", g.days, cttMaxDays)
	}
	if g.perDay[0] > cttMaxSlots {
		return bad("a day has %d periods; at most %d fit", g.perDay[0], cttMaxSlots)
	}
	for d, n := range g.perDay {
		if n != g.perDay[0] {
			return bad("day %d has %d periods but day 0 has %d; the format needs the same number every day", d, n, g.perDay[0])
		}
	}
	if len(t.Relations) > 0 || len(t.Enrolments) > 0 {
		return bad("relations and enrolments have no place in the format")
	}
	noSpace := func(id string) bool { return id != "" && strings.IndexFunc(id, unicode.IsSpace) < 0 }
	for _, s := range t.Sections {
		switch {
		case !noSpace(s.ID):
			return bad("section %q: IDs must be non-empty without spaces", s.ID)
		case len(s.Staff) != 1 || !noSpace(s.Staff[0]):
			return bad("section %q needs exactly one staff ID without spaces", s.ID)
		case s.Length != 1 || s.Meetings < 1:
			return bad("section %q: meetings must be one period long, at least one a week", s.ID)
		case len(s.Fixed) > 0 || len(s.Needs) > 0 || len(s.Rooms) > 0 || s.NoRoom:
			return bad("section %q has fixed meetings, needs, room lists or no room, which the format cannot say", s.ID)
		case s.Size < 0 || s.MinDays < 0:
			return bad("section %q has a negative size or minimum of days", s.ID)
		}
	}
	for _, r := range t.Rooms {
		if !noSpace(r.ID) || r.Capacity < 0 {
			return bad("room %q: IDs must be non-empty without spaces and capacities not negative", r.ID)
		}
	}
	for _, c := range t.Cohorts {
		if !noSpace(c.ID) {
			return bad("cohort %q: IDs must be non-empty without spaces", c.ID)
		}
	}
	for _, u := range t.Unavailable {
		if !u.Hard || u.Kind != timetable.WhoSection {
			return bad("unavailability of %s %q: only hard unavailability of a section fits the format", u.Kind, u.Who)
		}
	}
	return g.perDay[0], nil
}
