package encode

import (
	"math"

	"github.com/termwright/termwright/timetable"
)

// bruteBest enumerates every choice of meeting pattern and room of a
// pattern-only term by backtracking, checks the hard requirements directly
// from their definitions in timetable/term.go and pattern.go (no encoder
// code), and returns the least cost of the criteria "time choice" and "room
// choice" and "avoid times" (summed: all at level 1 by default) and whether any timetable
// exists.
func bruteBest(t *timetable.Term) (int, bool) {
	opts := patBruteOptions(t)
	best, found := math.MaxInt, false
	pick := make([]bruteOpt, len(t.Sections))
	var rec func(s, cost int)
	rec = func(s, cost int) {
		if cost >= best {
			return
		}
		if s == len(t.Sections) {
			best, found = cost, true
			return
		}
		for _, o := range opts[s] {
			ok := true
			for q := 0; q < s && ok; q++ {
				ok = bruteCompatible(t, s, o, q, pick[q])
			}
			if ok {
				pick[s] = o
				rec(s+1, cost+o.cost)
			}
		}
	}
	rec(0, 0)
	return best, found
}

// bruteOpt is one (pattern, room) choice of a section that meets its own
// hard requirements (availability, capacity, features).
type bruteOpt struct {
	time, room int // 0-based pattern; room index or -1
	occ        []timetable.Occurrence
	cost       int
}

// patBruteOptions lists every legal choice of every section of a pattern term.
func patBruteOptions(t *timetable.Term) [][]bruteOpt {
	type opt = bruteOpt
	wt, _ := t.CriterionWeight(timetable.CritTimeChoice)
	wr, _ := t.CriterionWeight(timetable.CritRoomChoice)
	roomIdx := t.RoomIndex()
	wa, _ := t.CriterionWeight(timetable.CritAvoidTimes)
	hit := func(row timetable.Unavailability, o timetable.Occurrence) bool {
		return row.Day == o.Day && o.Start < row.To && row.From < o.End &&
			(row.Weeks == 0 || row.Weeks&o.Weeks != 0)
	}
	opts := make([][]opt, len(t.Sections))
	for s := range t.Sections {
		sec := &t.Sections[s]
		type rc struct{ r, w int }
		var rooms []rc
		if !sec.NoRoom {
			cand := map[int]int{}
			switch {
			case len(sec.RoomChoices) > 0:
				for _, c := range sec.RoomChoices {
					cand[roomIdx[c.Room]] = c.Weight
				}
			case len(sec.Rooms) > 0:
				for _, id := range sec.Rooms {
					cand[roomIdx[id]] = 0
				}
			default:
				for r := range t.Rooms {
					cand[r] = 0
				}
			}
			for r, w := range cand {
				if t.Rooms[r].Capacity >= sec.Size && t.Rooms[r].HasFeatures(sec.Needs) {
					rooms = append(rooms, rc{r, w})
				}
			}
		} else {
			rooms = []rc{{-1, 0}}
		}
		for i := range sec.Times {
			occ := t.Occurrences(timetable.Placement{Section: sec.ID, Meeting: 1, Period: -1, Time: i + 1})
			for _, r := range rooms {
				ok, avoid := true, 0
				for _, row := range t.Unavailable {
					who := row.Who
					mine := (row.Kind == timetable.WhoSection && who == sec.ID) ||
						(row.Kind == timetable.WhoRoom && r.r >= 0 && who == t.Rooms[r.r].ID)
					for _, id := range sec.Staff {
						mine = mine || (row.Kind == timetable.WhoStaff && who == id)
					}
					for _, id := range sec.Cohorts {
						mine = mine || (row.Kind == timetable.WhoCohort && who == id)
					}
					for _, o := range occ {
						if mine && hit(row, o) {
							if row.Hard {
								ok = false
							} else {
								avoid += wa * row.Weight // one per day of the pattern (criteria.go)
							}
						}
					}
				}
				if ok {
					opts[s] = append(opts[s], opt{i, r.r, occ, wt*sec.Times[i].Weight + wr*r.w + avoid})
				}
			}
		}
	}
	return opts
}

// bruteCompatible reports whether choice o of section s and choice p of
// section q can hold together: no common staff member, cohort or room in
// overlapping occurrences, and enough travel time for common people.
func bruteCompatible(t *timetable.Term, s int, o bruteOpt, q int, p bruteOpt) bool {
	a, b := &t.Sections[s], &t.Sections[q]
	people := false
	for _, x := range a.Staff {
		for _, y := range b.Staff {
			people = people || x == y
		}
	}
	for _, x := range a.Cohorts {
		for _, y := range b.Cohorts {
			people = people || x == y
		}
	}
	sameRoom := o.room >= 0 && o.room == p.room
	if !people && !sameRoom {
		return true
	}
	for _, x := range o.occ {
		for _, y := range p.occ {
			if x.Overlaps(y) {
				return false
			}
			if people && x.Day == y.Day && x.Weeks&y.Weeks != 0 && o.room >= 0 && p.room >= 0 {
				gap := int(y.Start - x.End)
				if x.Start >= y.End {
					gap = int(x.Start - y.End)
				}
				if gap < t.TravelMinutes(t.Rooms[o.room].ID, t.Rooms[p.room].ID) {
					return false
				}
			}
		}
	}
	return true
}

// bruteCheck checks a schedule of a pattern term against the same
// definitions: every section placed once with a legal choice, every pair
// compatible. It returns the total choice cost and the problems found.
func bruteCheck(t *timetable.Term, sched *timetable.Schedule) (int, []string) {
	opts := patBruteOptions(t)
	roomIdx := t.RoomIndex()
	pick := make([]bruteOpt, len(t.Sections))
	seen := make([]bool, len(t.Sections))
	var probs []string
	cost := 0
	secIdx := t.SectionIndex()
	for _, pl := range sched.Placements {
		s, ok := secIdx[pl.Section]
		if !ok || seen[s] {
			probs = append(probs, "unknown or repeated section "+pl.Section)
			continue
		}
		seen[s] = true
		r := -1
		if pl.Room != "" {
			r = roomIdx[pl.Room]
		}
		found := false
		for _, o := range opts[s] {
			if o.time == pl.Time-1 && o.room == r {
				pick[s], found = o, true
			}
		}
		if !found {
			probs = append(probs, "illegal choice for "+pl.Section)
			continue
		}
		cost += pick[s].cost
	}
	for s := range t.Sections {
		if !seen[s] {
			probs = append(probs, "section not placed: "+t.Sections[s].ID)
		}
		for q := 0; q < s; q++ {
			if seen[s] && seen[q] && !bruteCompatible(t, s, pick[s], q, pick[q]) {
				probs = append(probs, "clash: "+t.Sections[s].ID+" and "+t.Sections[q].ID)
			}
		}
	}
	return cost, probs
}
