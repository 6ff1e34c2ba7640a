package timetable

import (
	"slices"
	"sort"
	"strings"
)

// placements checks each placement on its own: known section, inside the
// grid, fitting one run of periods, and a room that suits the section.
func (c *checker) placements() {
	x := c.x
	t := x.t
	for i, p := range x.s.Placements {
		op := x.pl[i]
		if op.sec < 0 {
			c.add(RuleUnknownSection, true, []int{i}, nil,
				"section "+chkQuote(p.Section)+" is not in the Sections sheet; add it there or remove this meeting")
			continue
		}
		sec := &t.Sections[op.sec]
		switch {
		case op.pat:
			c.patternPlacement(i, sec)
		case p.Time != 0:
			c.add(RuleTimeChoice, true, []int{i}, []Source{sec.Src},
				x.meetingLabel(i)+" names meeting time "+itoa(p.Time)+", but "+sec.ID+" meets on the period grid; leave its time choice blank")
		}
		switch {
		case op.pat:
		case p.Period < 0 || p.Period >= len(t.Periods):
			c.add(RuleOutsideGrid, true, []int{i}, []Source{sec.Src},
				x.meetingLabel(i)+" starts at a time that is not in the Periods sheet")
		case !op.ok:
			c.add(RuleLength, true, []int{i}, []Source{sec.Src},
				x.meetingLabel(i)+" needs "+itoa(occLength(sec))+" consecutive periods from "+
					t.Periods[p.Period].Label()+", but the periods there break or end before that")
		}
		c.roomOf(i, sec)
	}
}

// roomOf checks the room of placement i of section sec.
func (c *checker) roomOf(i int, sec *Section) {
	x := c.x
	p := x.s.Placements[i]
	if sec.NoRoom {
		if p.Room != "" {
			c.add(RuleNoRoom, true, []int{i}, []Source{sec.Src},
				sec.ID+" takes no room (online or off-site) but "+x.meetingLabel(i)+" is in "+p.Room)
		}
		return
	}
	if p.Room == "" {
		c.add(RuleNoRoom, true, []int{i}, []Source{sec.Src}, x.meetingLabel(i)+" has no room")
		return
	}
	ri := x.pl[i].room
	if ri < 0 {
		c.add(RuleUnknownRoom, true, []int{i}, []Source{sec.Src},
			x.meetingLabel(i)+" is in room "+chkQuote(p.Room)+", which is not in the Rooms sheet")
		return
	}
	room := &x.t.Rooms[ri]
	srcs := []Source{sec.Src, room.Src}
	if len(sec.RoomChoices) > 0 {
		if _, ok := roomChoiceOf(sec, room.ID); !ok {
			var ids []string
			for _, rc := range sec.RoomChoices {
				ids = append(ids, rc.Room)
				srcs = append(srcs, rc.Src)
			}
			c.add(RuleRoomNotAllowed, true, []int{i}, srcs,
				x.meetingLabel(i)+" is in "+room.ID+" but the section may use only "+chkJoin(ids))
		}
	} else if len(sec.Rooms) > 0 && !slices.Contains(sec.Rooms, room.ID) {
		c.add(RuleRoomNotAllowed, true, []int{i}, srcs,
			x.meetingLabel(i)+" is in "+room.ID+" but the section may use only "+chkJoin(sec.Rooms))
	}
	var missing []string
	for _, f := range sec.Needs {
		if !chkHasFeature(room.Features, f) {
			missing = append(missing, f)
		}
	}
	if len(missing) > 0 {
		c.add(RuleFeatures, true, []int{i}, srcs,
			x.meetingLabel(i)+" needs "+chkJoin(sec.Needs)+" but room "+room.ID+" lacks "+chkJoin(missing))
	}
	if !x.t.SoftCapacity && sec.Size > room.Capacity {
		c.add(RuleCapacity, true, []int{i}, srcs,
			x.meetingLabel(i)+" expects "+itoa(sec.Size)+" students but room "+room.ID+" seats "+itoa(room.Capacity))
	}
}

// chkHasFeature compares features without regard to case or spaces.
func chkHasFeature(have []string, want string) bool {
	want = strings.ToLower(strings.TrimSpace(want))
	for _, h := range have {
		if strings.ToLower(strings.TrimSpace(h)) == want {
			return true
		}
	}
	return false
}

// chkQuote quotes an ID taken from a file.
func chkQuote(s string) string { return "\"" + s + "\"" }

// meetingCounts checks that each section has meetings 1..Meetings once each.
func (c *checker) meetingCounts() {
	x := c.x
	for si := range x.t.Sections {
		sec := &x.t.Sections[si]
		want := sec.Meetings
		if want < 1 || sec.UsesTimes() {
			want = 1
		}
		how := chkTimesAWeek(want)
		if sec.UsesTimes() {
			how = "at one of its meeting times (one placement)"
		}
		byNum := map[int][]int{}
		for _, i := range x.bySection[si] {
			n := x.s.Placements[i].Meeting
			byNum[n] = append(byNum[n], i)
		}
		nums := make([]int, 0, len(byNum))
		for n := range byNum {
			nums = append(nums, n)
		}
		sort.Ints(nums)
		for _, n := range nums {
			pls := byNum[n]
			switch {
			case n < 1 || n > want:
				c.add(RuleMeetings, true, pls, []Source{sec.Src},
					sec.ID+" has a meeting numbered "+itoa(n)+" but meets "+how+"; number meetings 1 to "+itoa(want))
			case len(pls) > 1:
				c.add(RuleMeetings, true, pls, []Source{sec.Src},
					sec.ID+" meeting "+itoa(n)+" appears "+itoa(len(pls))+" times; keep one")
			}
		}
		var missing []string
		for n := 1; n <= want; n++ {
			if len(byNum[n]) == 0 {
				missing = append(missing, itoa(n))
			}
		}
		if len(missing) > 0 {
			what := "meeting " + missing[0] + " is"
			if len(missing) > 1 {
				what = "meetings " + chkJoin(missing) + " are"
			}
			c.add(RuleMeetings, true, nil, []Source{sec.Src},
				sec.ID+" meets "+how+" but "+what+" not in the timetable")
		}
	}
}

// chkTimesAWeek is "once a week", "3 times a week".
func chkTimesAWeek(n int) string {
	if n == 1 {
		return "once a week"
	}
	return itoa(n) + " times a week"
}

// sameDay checks that meetings of a section without SameDay fall on
// different days.
func (c *checker) sameDay() {
	x := c.x
	t := x.t
	for si := range t.Sections {
		sec := &t.Sections[si]
		if sec.SameDay {
			continue
		}
		byDay := map[int][]int{} // first period of the day -> placements
		var days []int
		for _, i := range x.sectionOK(si) {
			d := x.dayFirst[x.pl[i].first]
			if len(byDay[d]) == 0 {
				days = append(days, d)
			}
			byDay[d] = append(byDay[d], i)
		}
		sort.Ints(days)
		for _, d := range days {
			pls := byDay[d]
			if len(pls) < 2 {
				continue
			}
			var nums []string
			for _, i := range pls {
				nums = append(nums, itoa(x.s.Placements[i].Meeting))
			}
			c.add(RuleSameDay, true, pls, []Source{sec.Src},
				sec.ID+" meets "+itoa(len(pls))+" times on "+DayName(t.Periods[d].Day)+" (meetings "+chkJoin(nums)+
					"); its meetings must fall on different days")
		}
	}
}

// fixed checks that each Fixed entry of a section is matched by a distinct
// meeting at its day and start (and room when given): a maximum bipartite
// matching between entries and placements (augmenting paths; sections have
// a handful of meetings).
func (c *checker) fixed() {
	x := c.x
	t := x.t
	for si := range t.Sections {
		sec := &t.Sections[si]
		if len(sec.Fixed) == 0 {
			continue
		}
		if sec.UsesTimes() {
			c.fixedPattern(si)
			continue
		}
		pls := x.sectionOK(si)
		fits := func(f Fixed, i int) bool {
			p := x.s.Placements[i]
			per := t.Periods[p.Period]
			return per.Day == f.Day && per.Start == f.Start && (f.Room == "" || f.Room == p.Room)
		}
		owner := make([]int, len(pls)) // placement slot -> fixed entry + 1
		var try func(f int, seen []bool) bool
		try = func(f int, seen []bool) bool {
			for k, i := range pls {
				if seen[k] || !fits(sec.Fixed[f], i) {
					continue
				}
				seen[k] = true
				if owner[k] == 0 || try(owner[k]-1, seen) {
					owner[k] = f + 1
					return true
				}
			}
			return false
		}
		for f, fx := range sec.Fixed {
			if try(f, make([]bool, len(pls))) {
				continue
			}
			want, text := fx.wanted()
			further := ""
			for _, i := range pls {
				if fits(fx, i) {
					further = "further "
				}
			}
			c.add(RuleFixed, true, nil, []Source{sec.Src},
				sec.ID+" is fixed at "+chkQuote(text)+" but the timetable has no "+further+"meeting of it at "+want)
		}
	}
}

// wanted gives, for the messages about a Fixed entry that the timetable
// does not meet, the time (and room) it asks for, "Tue 10:00 in R204", and
// its text as written in the workbook (the former when none was kept).
func (f Fixed) wanted() (want, text string) {
	want = DayName(f.Day) + " " + f.Start.String()
	if f.Room != "" {
		want += " in " + f.Room
	}
	text = f.Text
	if text == "" {
		text = want
	}
	return want, text
}
