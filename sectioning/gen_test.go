package sectioning

import (
	"fmt"
	"math/rand/v2"
	"slices"
	"time"

	"github.com/termwright/termwright/timetable"
)

// genSpec shapes a generated term (shared by tests and benchmarks).
type genSpec struct {
	students, courses  int
	maxArrs, maxParts  int     // 1..maxArrs arrangements, 1..maxParts parts each
	maxSections        int     // 1..maxSections sections per part
	perStudent         [2]int  // requests per student, min..max
	slack              float64 // limits: requests × slack spread over a part's sections
	parents            bool    // later parts' sections name a parent in the first part
	alternatives       bool    // some requests name an alternative course
	priorities         bool    // some requests have a priority
	patterns           bool    // half the courses' sections use meeting patterns, with travel between buildings
	fixed              int     // fixed enrolments to add (a student in a random section)
	meetings, dayHours int     // meetings of a grid section; periods per day
}

// genTerm builds a random term and a complete timetable of it: a period
// grid Monday to Friday of one-hour periods, sections that take no room
// (grid) or a room in one of two buildings (patterns).
func genTerm(rng *rand.Rand, g genSpec) (*timetable.Term, *timetable.Schedule) {
	if g.dayHours == 0 {
		g.dayHours = 8
	}
	if g.meetings == 0 {
		g.meetings = 2
	}
	t := &timetable.Term{Name: "generated", FirstDay: time.Date(2027, 1, 4, 0, 0, 0, 0, time.UTC), LastDay: time.Date(2027, 3, 26, 0, 0, 0, 0, time.UTC)}
	for d := time.Monday; d <= time.Friday; d++ {
		for h := 0; h < g.dayHours; h++ {
			t.Periods = append(t.Periods, timetable.Period{Index: len(t.Periods), Day: d, Start: timetable.Clock(540 + 60*h), End: timetable.Clock(600 + 60*h)})
		}
	}
	if g.patterns {
		t.Rooms = []timetable.Room{{ID: "N1", Capacity: 1000, Building: "North"}, {ID: "S1", Capacity: 1000, Building: "South"}}
		t.Travel = []timetable.Travel{{From: "North", To: "South", Minutes: 20}}
	}
	s := &timetable.Schedule{}
	all := t.AllWeeks()
	type partRef struct{ secs []int }
	var coursesParts [][]partRef // course -> parts (all arrangements)
	for c := 0; c < g.courses; c++ {
		cid := fmt.Sprintf("C%03d", c)
		pattern := g.patterns && c%2 == 1
		var cps []partRef
		nArr := 1 + rng.IntN(g.maxArrs)
		for a := 0; a < nArr; a++ {
			aid := ""
			if nArr > 1 {
				aid = fmt.Sprintf("A%d", a)
			}
			nParts := 1 + rng.IntN(g.maxParts)
			var first []int
			for pt := 0; pt < nParts; pt++ {
				pid := ""
				if nParts > 1 {
					pid = []string{"Main", "Lab", "Tutorial", "Seminar"}[pt%4] + fmt.Sprint(pt/4+1)
				}
				nSec := 1 + rng.IntN(g.maxSections)
				child := g.parents && pt > 0 && len(first) > 0
				if child { // every parent gets one or two children in this part
					nSec = len(first) * (1 + rng.IntN(2))
				}
				var secs []int
				for k := 0; k < nSec; k++ {
					sec := timetable.Section{
						ID: fmt.Sprintf("%s-%s%s-%d", cid, aid, pid, k+1), Title: "Course " + cid,
						Size: 1, Meetings: 1, Length: 1, NoRoom: true, Weeks: all,
						Course: cid, Arrangement: aid, Part: pid,
					}
					if child {
						sec.Parent = t.Sections[first[k%len(first)]].ID
					}
					si := len(t.Sections)
					if pattern {
						days := timetable.DaysOf(time.Weekday(1 + rng.IntN(5)))
						start := timetable.Clock(540 + 30*rng.IntN(2*g.dayHours-2))
						sec.Times = []timetable.TimeChoice{{Days: days, Start: start, Minutes: 50 + 25*rng.IntN(2), Weeks: all}}
						sec.NoRoom = false
						room := t.Rooms[rng.IntN(2)].ID
						t.Sections = append(t.Sections, sec)
						s.Placements = append(s.Placements, timetable.Placement{Section: sec.ID, Meeting: 1, Period: -1, Time: 1, Room: room})
					} else {
						sec.Meetings = 1 + rng.IntN(g.meetings)
						t.Sections = append(t.Sections, sec)
						days := rng.Perm(5)[:sec.Meetings]
						for m, d := range days {
							s.Placements = append(s.Placements, timetable.Placement{Section: sec.ID, Meeting: m + 1, Period: d*g.dayHours + rng.IntN(g.dayHours)})
						}
					}
					secs = append(secs, si)
				}
				if pt == 0 {
					first = secs
				}
				cps = append(cps, partRef{secs})
			}
		}
		coursesParts = append(coursesParts, cps)
	}
	demand := make([]float64, g.courses)
	for k := 0; k < g.students; k++ {
		sid := fmt.Sprintf("S%05d", k)
		n := g.perStudent[0] + rng.IntN(g.perStudent[1]-g.perStudent[0]+1)
		picked := rng.Perm(g.courses)[:min(n, g.courses)]
		for i, c := range picked {
			r := timetable.Request{Student: sid, Course: fmt.Sprintf("C%03d", c)}
			demand[c]++
			if g.alternatives && rng.IntN(3) == 0 {
				alt := rng.IntN(g.courses)
				if !slices.Contains(picked, alt) {
					r.Alternatives = []string{fmt.Sprintf("C%03d", alt)}
				}
			}
			if g.priorities && rng.IntN(2) == 0 {
				r.Priority = 1 + rng.IntN(3)
			}
			_ = i
			t.Requests = append(t.Requests, r)
		}
	}
	// limits: the first part of an arrangement shares the course's demand
	// times slack; a child section shares its parent's limit with its
	// siblings (parents come first in cps)
	idx := t.SectionIndex()
	for c, cps := range coursesParts {
		for _, pr := range cps {
			lim := int(demand[c]*g.slack/float64(len(pr.secs)) + 0.999)
			for _, si := range pr.secs {
				sec := &t.Sections[si]
				sec.Limit = max(lim, 1)
				if sec.Parent != "" {
					par := idx[sec.Parent]
					sib := 0
					for _, sj := range pr.secs {
						if t.Sections[sj].Parent == sec.Parent {
							sib++
						}
					}
					sec.Limit = max((t.Sections[par].Limit+sib-1)/sib, 1)
				}
				sec.Size = sec.Limit
			}
		}
	}
	// fixed enrolments, distinct; a section's limit is raised to hold its
	// fixed students (a term over its limits by fixed enrolments alone is
	// bad data, not a sectioning problem)
	fixed := map[timetable.Enrolment]bool{}
	count := map[int]int{}
	for f := 0; f < g.fixed; f++ {
		si := rng.IntN(len(t.Sections))
		e := timetable.Enrolment{Student: fmt.Sprintf("S%05d", rng.IntN(max(g.students, 1))), Section: t.Sections[si].ID}
		if fixed[e] {
			continue
		}
		fixed[e] = true
		count[si]++
		t.Enrolments = append(t.Enrolments, e)
		t.Sections[si].Limit = max(t.Sections[si].Limit, count[si])
		t.Sections[si].Size = t.Sections[si].Limit
	}
	return t, s
}
