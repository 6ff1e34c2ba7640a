package timetable

import (
	"fmt"
	"strings"
)

// This file reads the sheets of meeting patterns, room choices and travel
// times (docs/workbook.md), which attach to sections read before them.

// parseDays reads a Days cell: day names (Mon or Monday, any case)
// separated by spaces, commas, semicolons or slashes, e.g. "Mon Wed Fri".
// A day named twice is kept once.
func parseDays(s string) (DaySet, error) {
	f := strings.FieldsFunc(s, func(r rune) bool {
		return r == ' ' || r == ',' || r == ';' || r == '/' || r == '\t'
	})
	if len(f) == 0 {
		return 0, fmt.Errorf("is blank — write the days it meets, e.g. Mon Wed Fri")
	}
	var set DaySet
	for _, w := range f {
		d, ok := ParseDay(w)
		if !ok {
			return 0, fmt.Errorf("%s is not a list of days — write day names separated by spaces, e.g. Mon Wed Fri or Tue Thu", Quote(strings.TrimSpace(s)))
		}
		set |= DaysOf(d)
	}
	return set, nil
}

// sectionOf finds the section a row of a sheet that attaches rows to
// sections names (the first of a repeated ID wins, as elsewhere).
func (r *termReader) sectionOf(t *table, row tableRow) (*Section, bool) {
	id := t.get(row, "Section")
	if id == "" {
		r.ps.errorf(t.pos(row, "Section"), "Section is blank — write the ID of a section on the Sections sheet, or delete the row")
		return nil, false
	}
	i, ok := r.secIdx[id]
	if !ok {
		r.ps.errorf(t.pos(row, "Section"), "section %q is not on the Sections sheet — correct the ID or add the section", id)
		return nil, false
	}
	return &r.t.Sections[i], true
}

// readMeetingTimes reads the Meeting times sheet into Section.Times.
func (r *termReader) readMeetingTimes() {
	all := r.t.AllWeeks()
	r.rows(shTimes, func(t *table, row tableRow) {
		s, okS := r.sectionOf(t, row)
		days, err := parseDays(t.get(row, "Days"))
		if err != nil {
			r.ps.errorf(t.pos(row, "Days"), "Days %v", err)
		}
		start, okT := r.clock(t, row, "Start", 0, true)
		okM := true
		if t.get(row, "Minutes") == "" {
			r.ps.errorf(t.pos(row, "Minutes"), "Minutes is blank — write the length of each meeting in minutes, a multiple of 5 such as 50 or 75")
			okM = false
		}
		minutes := r.whole(t, row, "Minutes", 0, 24*60, -1)
		okM = okM && minutes >= 0
		c := TimeChoice{Days: days, Start: start, Minutes: minutes, Src: rowSource(t, row)}
		c.Weight = r.whole(t, row, "Weight", -maxWeight, maxWeight, 0)
		weeks := all
		if okS {
			weeks = s.Weeks
		}
		if w := t.get(row, "Weeks"); w != "" {
			ws, werr := parseWeeks(w, all)
			if werr != nil {
				r.ps.errorf(t.pos(row, "Weeks"), "Weeks %v", werr)
				return
			}
			weeks = ws
		}
		c.Weeks = weeks
		if okS && err == nil && okT && okM {
			s.Times = append(s.Times, c)
		}
	})
}

// readRoomChoices reads the Room choices sheet into Section.RoomChoices.
func (r *termReader) readRoomChoices() {
	r.rows(shRoomChoices, func(t *table, row tableRow) {
		s, ok := r.sectionOf(t, row)
		room := t.get(row, "Room")
		if room == "" {
			r.ps.errorf(t.pos(row, "Room"), "Room is blank — write a room from the Rooms sheet, or delete the row")
			ok = false
		}
		w := r.whole(t, row, "Weight", -maxWeight, maxWeight, 0)
		if ok {
			s.RoomChoices = append(s.RoomChoices, RoomChoice{Room: room, Weight: w, Src: rowSource(t, row)})
		}
	})
}

// readTravel reads the Travel sheet into Term.Travel.
func (r *termReader) readTravel() {
	r.rows(shTravel, func(t *table, row tableRow) {
		from := r.id(t, row, "From", "travel row's starting room or building")
		to := r.id(t, row, "To", "travel row's other room or building")
		if t.get(row, "Minutes") == "" {
			r.ps.errorf(t.pos(row, "Minutes"), "Minutes is blank — write the minutes needed to get from one place to the other")
			return
		}
		m, err := parseWhole(t.get(row, "Minutes"), -maxWeight, maxWeight)
		if err != nil {
			r.ps.errorf(t.pos(row, "Minutes"), "Minutes %v", err)
			return
		}
		if from == "" || to == "" {
			return
		}
		r.t.Travel = append(r.t.Travel, Travel{From: from, To: to, Minutes: m, Src: rowSource(t, row)})
	})
}

// lunch reads the three lunch columns of a Staff or Cohorts row: all blank
// gives no break; a partly filled set is an error at the blank cell.
func (r *termReader) lunch(t *table, row tableRow) LunchBreak {
	fromS, toS, minS := t.get(row, "Lunch from"), t.get(row, "Lunch to"), t.get(row, "Lunch minutes")
	if fromS == "" && toS == "" && minS == "" {
		return LunchBreak{}
	}
	ok := true
	for _, h := range []string{"Lunch from", "Lunch to"} {
		if t.get(row, h) == "" {
			r.ps.errorf(t.pos(row, h), "%s is blank but a lunch break is given — write the window, e.g. Lunch from 11:30 and Lunch to 14:00, or clear the lunch cells", h)
			ok = false
		}
	}
	if minS == "" {
		r.ps.errorf(t.pos(row, "Lunch minutes"), "Lunch minutes is blank but a lunch window is given — write the free minutes to guarantee, e.g. 30, or clear the lunch cells")
		return LunchBreak{}
	}
	from, okF := r.clock(t, row, "Lunch from", 0, false)
	to, okT := r.clock(t, row, "Lunch to", 0, false)
	m := r.whole(t, row, "Lunch minutes", 1, 24*60, 0)
	if !ok || !okF || !okT || m == 0 {
		return LunchBreak{}
	}
	return LunchBreak{From: from, To: to, Minutes: m}
}

// checkPatternColumns warns about Sections cells that a pattern section
// ignores, and refuses fixed meetings, which belong to the grid.
func (r *termReader) checkPatternColumns() {
	t := r.tabs[shSections]
	if t == nil {
		return
	}
	rowOf := map[int]tableRow{}
	for _, row := range t.rows {
		rowOf[row.num] = row
	}
	for i := range r.t.Sections {
		s := &r.t.Sections[i]
		row, ok := rowOf[s.Src.Row]
		if !ok || !s.UsesTimes() {
			continue
		}
		if t.get(row, "Meetings per week") != "" {
			for _, c := range s.Times {
				if n := c.Days.Count(); n != s.Meetings && n > 0 {
					r.ps.warnf(t.pos(row, "Meetings per week"), "Meetings per week %d is ignored: the section's meeting time in %s meets %s a week — clear the cell or correct it", s.Meetings, c.Src, countNoun(n, "day"))
					break
				}
			}
		}
		if t.get(row, "Periods per meeting") != "" {
			r.ps.warnf(t.pos(row, "Periods per meeting"), "Periods per meeting is ignored: the section has rows on the %s sheet, whose Minutes give the length — clear the cell", shTimes)
		}
		if t.get(row, "Min days") != "" {
			r.ps.warnf(t.pos(row, "Min days"), "Min days is ignored: the section has rows on the %s sheet, which give its days — clear the cell", shTimes)
			s.SameDay, s.MinDays = false, 0
		}
		s.Meetings, s.Length = 1, 1
	}
}

// requirePeriods reports a missing Periods sheet unless every section is a
// pattern section (a term with meeting times only needs no grid).
func (r *termReader) requirePeriods() {
	if r.tabs[shPeriods] != nil || r.patternOnly() {
		return
	}
	spec := specFor(shPeriods)
	r.ps.errorf(Position{Sheet: shPeriods}, "the workbook has no %s sheet — add a sheet named %q with the headers %s, or give every section meeting times on the %s sheet", shPeriods, shPeriods, quoteList(spec.cols), shTimes)
}

// patternOnly reports whether the term has sections and all of them are
// pattern sections.
func (r *termReader) patternOnly() bool { return patternOnly(r.t) }

func patternOnly(t *Term) bool {
	for i := range t.Sections {
		if !t.Sections[i].UsesTimes() {
			return false
		}
	}
	return len(t.Sections) > 0
}

// relationNumbers reads the N and M cells of a Relations row for kind.
func (r *termReader) relationNumbers(t *table, row tableRow, kind RelationKind) (n, m int, ok bool) {
	ok = true
	for i, h := range []string{"N", "M"} {
		text := t.get(row, h)
		switch {
		case i < kind.Params() && text == "":
			r.ps.errorf(t.pos(row, h), "%s is blank — a %s relation needs %s in %s", h, kind, paramWhat(kind, i), h)
			ok = false
		case i >= kind.Params() && text != "":
			r.ps.errorf(t.pos(row, h), "a %s relation takes no %s — clear the cell (only %s take it)", kind, h, kindsTaking(i))
			ok = false
		case text != "":
			x, err := parseWhole(text, -maxWeight, maxWeight)
			if err != nil {
				r.ps.errorf(t.pos(row, h), "%s %v", h, err)
				ok = false
			}
			if i == 0 {
				n = x
			} else {
				m = x
			}
		}
	}
	return n, m, ok
}

// paramWhat says what number i (0 for N, 1 for M) of a kind counts.
func paramWhat(k RelationKind, i int) string {
	if i == 1 {
		return "the longest gap in minutes that still joins two meetings into one block"
	}
	switch k {
	case MaxDays:
		return "the most days"
	case MaxBreaks:
		return "the most breaks"
	case MinGap:
		return "the least free minutes between meetings"
	}
	return "a number of minutes"
}

// paramRange gives the accepted range of number i of kind k.
func paramRange(k RelationKind, i int) (lo, hi int) {
	switch {
	case i == 0 && k == MaxDays:
		return 0, 7
	case i == 0 && k == MaxBreaks:
		return 0, 100
	}
	return 0, 24 * 60
}

// kindsTaking lists the kinds that take number i.
func kindsTaking(i int) string {
	var names []string
	for _, k := range RelationKinds {
		if k.Kind.Params() > i {
			names = append(names, k.Name)
		}
	}
	return joinAnd(names)
}

// joinAnd joins words as "a, b and c".
func joinAnd(words []string) string {
	if len(words) < 2 {
		return strings.Join(words, "")
	}
	return strings.Join(words[:len(words)-1], ", ") + " and " + words[len(words)-1]
}

// dayListText is a day set for messages, "Mon Wed Fri", or "no days".
func dayListText(d DaySet) string {
	if d == 0 {
		return "no days"
	}
	return d.String()
}

// choiceLabel names a meeting time in messages: "Mon Wed Fri 09:00 for 50
// minutes".
func choiceLabel(c TimeChoice) string {
	return dayListText(c.Days) + " " + c.Start.String() + " for " + countNoun(c.Minutes, "minute")
}
