package timetable

import (
	"strings"
)

// parseDaySet reads a Day cell: one day ("Tue") or the days of a meeting
// pattern separated by spaces, commas or slashes ("Mon Wed Fri",
// "Tue, Thu"), each as ParseDay reads it. ok is false for a blank cell, an
// unknown day or a day named twice.
func parseDaySet(s string) (DaySet, bool) {
	words := strings.FieldsFunc(s, func(r rune) bool { return r == ' ' || r == ',' || r == '/' || r == ';' || r == '\t' })
	if len(words) == 0 {
		return 0, false
	}
	var set DaySet
	for _, w := range words {
		d, ok := ParseDay(w)
		if !ok || set.Has(d) {
			return 0, false
		}
		set |= DaysOf(d)
	}
	return set, true
}

// schedPatternRow reads the Day, Start, End and Weeks cells of a row of a
// pattern section and finds the meeting time (Section.Times) they name:
// the one with these days and start, and with this end and these weeks
// where the cells are filled in. It sets p.Time (and p.Period to -1); ok
// is false, with an error at the first cell that no meeting time
// matches, when there is none or more than one.
func schedPatternRow(t *Term, sec *Section, p *Placement, cell func(string) (string, Position), ps *Problems) bool {
	p.Period = -1
	dv, dpos := cell("Day")
	days, good := parseDaySet(dv)
	if !good {
		ps.errorf(dpos, "%q is not a day or a list of days — write the days of one of %s's meeting times, such as %s", dv, sec.ID, sec.Times[0].Days)
		return false
	}
	sv, spos := cell("Start")
	start, err := ParseClock(sv)
	switch {
	case sv == "":
		ps.errorf(spos, "the Start is blank — write the start time of the meeting, e.g. 09:00")
		return false
	case err != nil:
		ps.errorf(spos, "start %s", err.Error())
		return false
	}
	ev, epos := cell("End")
	var end Clock
	if ev != "" {
		if end, err = ParseClock(ev); err != nil {
			ps.errorf(epos, "end %s", err.Error())
			return false
		}
	}
	all := t.AllWeeks()
	wv, wpos := cell("Weeks")
	var weeks WeekSet
	if wv != "" {
		if weeks, err = parseWeeks(wv, all); err != nil {
			ps.errorf(wpos, "weeks %s", err.Error())
			return false
		}
	}
	// Narrow the choices cell by cell, so the error names the first cell
	// that fits none of them.
	steps := []struct {
		pos  Position
		used bool
		fits func(c TimeChoice) bool
		what string
	}{
		{dpos, true, func(c TimeChoice) bool { return c.Days == days }, "on " + days.String()},
		{spos, true, func(c TimeChoice) bool { return c.Start == start }, "starting at " + start.String()},
		{epos, ev != "", func(c TimeChoice) bool { return c.End() == end }, "ending at " + end.String()},
		{wpos, wv != "", func(c TimeChoice) bool { return c.Weeks&all == weeks&all }, "in weeks " + Quote(wv)},
	}
	cand := make([]int, len(sec.Times))
	for i := range cand {
		cand[i] = i
	}
	var said []string
	for _, st := range steps {
		if !st.used {
			continue
		}
		said = append(said, st.what)
		var next []int
		for _, i := range cand {
			if st.fits(sec.Times[i]) {
				next = append(next, i)
			}
		}
		if len(next) == 0 {
			ps.errorf(st.pos, "%s has no meeting time %s — use one of its meeting times (%s), or add this one to the section's rows of the meeting times sheet",
				sec.ID, strings.Join(said, ", "), t.choiceList(sec))
			return false
		}
		cand = next
	}
	if len(cand) > 1 {
		ps.errorf(dpos, "%s has %d meeting times %s — fill in the End and Weeks cells to say which one (%s)", sec.ID, len(cand), strings.Join(said, ", "), t.choiceList(sec))
		return false
	}
	p.Time = cand[0] + 1
	return true
}

// choiceList lists a section's meeting times as the timetable writes them:
// "Mon Wed Fri 09:00–09:50 all weeks; Tue Thu 10:00–11:15 weeks 1-7".
func (t *Term) choiceList(sec *Section) string {
	const most = 6
	var out []string
	for i, c := range sec.Times {
		if i == most {
			out = append(out, "and "+itoa(len(sec.Times)-most)+" more")
			break
		}
		out = append(out, t.ChoiceText(c))
	}
	return strings.Join(out, "; ")
}

// ChoiceText is a meeting time in plain words: "Mon Wed Fri 09:00–09:50"
// followed by "all weeks", "odd weeks", "even weeks" or "weeks 1-7".
func (t *Term) ChoiceText(c TimeChoice) string {
	s := c.Days.String() + " " + c.Start.String() + "–" + c.End().String()
	switch w := t.WeeksText(c.Weeks & t.AllWeeks()); w {
	case "all", "odd", "even":
		return s + " " + w + " weeks"
	default:
		return s + " weeks " + w
	}
}
