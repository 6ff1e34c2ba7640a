package web

import (
	"net/http"
	"slices"
	"sort"
	"strings"

	"github.com/termwright/termwright/timetable"
)

// stateJSON is the current timetable with its check and cost.
type stateJSON struct {
	Version  int           `json:"version"`
	CanUndo  bool          `json:"can_undo"`
	Locked   int           `json:"locked"` // locked meetings
	Meetings []meetingJSON `json:"meetings"`
	Hard     []problemJSON `json:"hard"` // broken hard requirements
	Soft     []problemJSON `json:"soft"` // student clashes (a preference)
	Cost     costJSON      `json:"cost"`
	// Students and Enrolled are the students of this timetable (fixed and
	// sectioned enrolments, Term.StudentEnrolments) when the term has
	// course requests: sectioned students change with the timetable, so
	// they come with each state rather than with the term.
	Students []subjectJSON       `json:"students,omitempty"`
	Enrolled map[string][]string `json:"enrolled,omitempty"`
}

// meetingJSON is one placement as the page draws it.
type meetingJSON struct {
	Index   int      `json:"index"` // index into the schedule's placements
	Section string   `json:"section"`
	Meeting int      `json:"meeting"`
	Title   string   `json:"title"`
	Period  int      `json:"period"`         // first grid period; -1 for a meeting pattern
	Time    int      `json:"time,omitempty"` // 1-based meeting pattern (Section.Times)
	Periods []int    `json:"periods"`        // every grid period it occupies
	Day     string   `json:"day"`            // "Tue", or "Mon Wed" for a pattern
	Start   string   `json:"start"`
	End     string   `json:"end"`
	Room    string   `json:"room"`
	NoRoom  bool     `json:"no_room,omitempty"`
	Staff   []string `json:"staff"`
	Cohorts []string `json:"cohorts"`
	Weeks   string   `json:"weeks,omitempty"`
	Locked  bool     `json:"locked"`
	// Occ is every weekly occurrence by clock time, which the grid draws
	// in the rows it overlaps.
	Occ []occJSON `json:"occ"`
}

// occJSON is one occurrence: a day and minutes since midnight.
type occJSON struct {
	Day  string `json:"day"`
	From int    `json:"from"`
	To   int    `json:"to"`
}

type problemJSON struct {
	Rule string `json:"rule"`
	Msg  string `json:"msg"`
}

type costJSON struct {
	Criteria []timetable.CriterionCost `json:"criteria"` // criteria with a weight
	Levels   []levelJSON               `json:"levels"`   // highest first
}

type levelJSON struct {
	Level int   `json:"level"`
	Cost  int64 `json:"cost"`
}

func (s *Server) handleState(w http.ResponseWriter, r *http.Request) {
	s.mu.Lock()
	defer s.mu.Unlock()
	writeJSON(w, http.StatusOK, s.stateLocked())
}

func (s *Server) stateLocked() stateJSON {
	t := s.opt.Term
	out := stateJSON{Version: s.version, CanUndo: len(s.undo) > 0, Meetings: meetingsOf(t, s.cur, s.locks), Locked: len(s.locks)}
	for _, v := range timetable.Check(t, s.cur) {
		if v.Hard {
			out.Hard = append(out.Hard, problemJSON{v.Rule, v.Msg})
		} else {
			out.Soft = append(out.Soft, problemJSON{v.Rule, v.Msg})
		}
	}
	out.Cost = costOf(timetable.Cost(t, s.cur, nil))
	if len(t.Requests) > 0 || len(s.cur.Enrolments) > 0 {
		out.Students, out.Enrolled = studentsJSON(t.StudentEnrolments(s.cur))
	}
	return out
}

// studentsJSON lists the students of enrolments (sorted by ID) and each
// one's sections, each section once.
func studentsJSON(ens []timetable.Enrolment) ([]subjectJSON, map[string][]string) {
	students := []subjectJSON{}
	enrolled := map[string][]string{}
	for _, en := range ens {
		list, ok := enrolled[en.Student]
		if !ok {
			students = append(students, subjectJSON{ID: en.Student})
		}
		if !slices.Contains(list, en.Section) {
			enrolled[en.Student] = append(list, en.Section)
		}
	}
	sort.Slice(students, func(i, j int) bool { return students[i].ID < students[j].ID })
	return students, enrolled
}

func costOf(c timetable.CostReport) costJSON {
	out := costJSON{Criteria: []timetable.CriterionCost{}}
	for _, cr := range c.Criteria {
		if cr.Weight != 0 {
			out.Criteria = append(out.Criteria, cr)
		}
	}
	for _, l := range c.Levels() {
		out.Levels = append(out.Levels, levelJSON{l, c.ByLevel[l]})
	}
	return out
}

func meetingsOf(t *timetable.Term, s *timetable.Schedule, locks map[meetingKey]bool) []meetingJSON {
	secs := t.SectionIndex()
	out := make([]meetingJSON, 0, len(s.Placements))
	for i, p := range s.Placements {
		m := meetingJSON{Index: i, Section: p.Section, Meeting: p.Meeting, Period: p.Period, Time: p.Time, Room: p.Room,
			Staff: []string{}, Cohorts: []string{}, Periods: []int{}, Occ: []occJSON{}, Locked: locks[meetingKey{p.Section, p.Meeting}]}
		k, ok := secs[p.Section]
		if !ok {
			out = append(out, m)
			continue
		}
		sec := t.Sections[k]
		m.Title, m.NoRoom = sec.Title, sec.NoRoom
		m.Staff = append(m.Staff, sec.Staff...)
		m.Cohorts = append(m.Cohorts, sec.Cohorts...)
		weeks := sec.Weeks
		switch {
		case sec.UsesTimes():
			if p.Time >= 1 && p.Time <= len(sec.Times) {
				c := sec.Times[p.Time-1]
				m.Day, m.Start, m.End, weeks = c.Days.String(), c.Start.String(), c.End().String(), c.Weeks
			}
		default:
			if span, ok := t.Span(p.Period, sec.Length); ok {
				m.Periods = span
				first, last := t.Periods[span[0]], t.Periods[span[len(span)-1]]
				m.Day, m.Start, m.End = timetable.DayName(first.Day), first.Start.String(), last.End.String()
			}
		}
		if weeks != 0 && weeks != t.AllWeeks() {
			m.Weeks = weeksText(weeks)
		}
		for _, o := range t.SectionOccurrences(&sec, p) {
			m.Occ = append(m.Occ, occJSON{timetable.DayName(o.Day), int(o.Start), int(o.End)})
		}
		out = append(out, m)
	}
	return out
}

// weeksText is "1-6, 9" for a week set.
func weeksText(w timetable.WeekSet) string {
	var parts []string
	for n := 1; n <= 64; n++ {
		if !w.Has(n) {
			continue
		}
		end := n
		for end+1 <= 64 && w.Has(end+1) {
			end++
		}
		if end > n {
			parts = append(parts, itoa(n)+"-"+itoa(end))
		} else {
			parts = append(parts, itoa(n))
		}
		n = end
	}
	return strings.Join(parts, ", ")
}
