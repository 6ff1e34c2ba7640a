package timetable

import (
	"strconv"
	"strings"
	"time"
)

// ptSec is one pattern section of a hand-made test term: it has a single
// acceptable meeting time, chosen by its placement, in room Room ("" for a
// section that takes no room).
type ptSec struct {
	ID      string
	Days    string // "Mon Wed Fri"
	Start   string // "09:00"
	Minutes int
	Weeks   WeekSet // 0 = every teaching week
	Room    string
	Staff   string // "" = none
	Cohort  string // "" = none
}

// ptWeeks builds a week set from 1-based weeks and ranges "1-6".
func ptWeeks(spec string) WeekSet {
	var w WeekSet
	for _, part := range strings.Fields(spec) {
		lo, hi, ok := strings.Cut(part, "-")
		a, _ := strconv.Atoi(lo)
		b := a
		if ok {
			b, _ = strconv.Atoi(hi)
		}
		for n := a; n <= b; n++ {
			w |= 1 << (n - 1)
		}
	}
	return w
}

// ptOdd and ptEven are the odd and even weeks of the 12-week test term.
var (
	ptOdd  = ptWeeks("1 3 5 7 9 11")
	ptEven = ptWeeks("2 4 6 8 10 12")
)

func ptClock(s string) Clock {
	h, m, _ := strings.Cut(s, ":")
	hh, _ := strconv.Atoi(h)
	mm, _ := strconv.Atoi(m)
	return Clock(hh*60 + mm)
}

func ptDays(s string) DaySet {
	var d DaySet
	for _, f := range strings.Fields(s) {
		for w := time.Sunday; w <= time.Saturday; w++ {
			if DayName(w) == f {
				d |= DaysOf(w)
			}
		}
	}
	return d
}

// ptTerm is an invented 12-week term (Mon 2027-09-13 to Fri 2027-12-03)
// with the ckTerm grid (Mon–Wed, 09:00, 10:00, 11:00, 13:00, 14:00), rooms
// R1 (North, 60 seats), R2 (South, 60), R3 (North, 20), staff S1, S2 and
// cohorts C1, C2, and the given pattern sections, each placed at its one
// meeting time.
func ptTerm(secs ...ptSec) (*Term, *Schedule) {
	t := ckTerm()
	t.LastDay = time.Date(2027, 12, 3, 0, 0, 0, 0, time.UTC)
	t.Sections, t.Enrolments, t.Unavailable, t.Relations = nil, nil, nil, nil
	s := &Schedule{}
	for k, p := range secs {
		w := p.Weeks
		if w == 0 {
			w = t.AllWeeks()
		}
		sec := Section{ID: p.ID, Size: 10, Meetings: 1, Length: 1, Weeks: t.AllWeeks(), NoRoom: p.Room == "",
			Times: []TimeChoice{{Days: ptDays(p.Days), Start: ptClock(p.Start), Minutes: p.Minutes, Weeks: w}},
			Src:   Source{"Sections", k + 2}}
		if p.Staff != "" {
			sec.Staff = []string{p.Staff}
		}
		if p.Cohort != "" {
			sec.Cohorts = []string{p.Cohort}
		}
		t.Sections = append(t.Sections, sec)
		s.Placements = append(s.Placements, Placement{Section: p.ID, Meeting: 1, Period: -1, Time: 1, Room: p.Room})
	}
	return t, s
}
