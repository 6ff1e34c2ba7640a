package export

import (
	"slices"
	"sort"
	"strings"

	"github.com/termwright/termwright/timetable"
)

// SectionChange is one student's change of section in one part of a
// course between two timetables of a term.
type SectionChange struct {
	Student string `json:"student"`
	Course  string `json:"course"`
	Part    string `json:"part,omitempty"` // the part ("Tutorial"), with its arrangement first when it has one
	From    string `json:"from,omitempty"` // the section before; "" when the student was in none of that part
	To      string `json:"to,omitempty"`   // the section now; "" when the student is in none of that part any more
}

// SectionChanges compares the students of two timetables of t, part by
// part of each course (a section's Course, Arrangement and Part): fixed
// enrolments are the same on both sides, so what differs are the
// sectioned students (Schedule.Enrolments). Sections t does not know are
// left out (their course is unknown). The result is sorted by student,
// course and part; nil when nothing changed.
func SectionChanges(t *timetable.Term, old, new *timetable.Schedule) []SectionChange {
	type key struct{ student, course, part string }
	secIdx := t.SectionIndex()
	collect := func(s *timetable.Schedule) map[key][]string {
		out := map[key][]string{}
		for _, e := range t.StudentEnrolments(s) {
			si, ok := secIdx[e.Section]
			if !ok || t.Sections[si].Course == "" {
				continue
			}
			sec := &t.Sections[si]
			k := key{e.Student, sec.Course, strings.TrimSpace(sec.Arrangement + " " + sec.Part)}
			if !containsString(out[k], e.Section) {
				out[k] = append(out[k], e.Section)
			}
		}
		for _, list := range out {
			sort.Strings(list)
		}
		return out
	}
	was, now := collect(old), collect(new)
	keys := map[key]bool{}
	for k := range was {
		keys[k] = true
	}
	for k := range now {
		keys[k] = true
	}
	var out []SectionChange
	for k := range keys {
		from, to := strings.Join(was[k], ", "), strings.Join(now[k], ", ")
		if from != to {
			out = append(out, SectionChange{Student: k.student, Course: k.course, Part: k.part, From: from, To: to})
		}
	}
	sort.Slice(out, func(i, j int) bool {
		a, b := out[i], out[j]
		if a.Student != b.Student {
			return a.Student < b.Student
		}
		if a.Course != b.Course {
			return a.Course < b.Course
		}
		return a.Part < b.Part
	})
	return out
}

// StayingStudents maps each section to the students it has in both
// timetables (fixed enrolments and the sectioned students of old and of
// new): those whom a change of the section's meetings concerns, for
// timetable.Comparison.Affected. A student who joined or left a section is
// told by their SectionChange instead. Nil when neither has students.
func StayingStudents(t *timetable.Term, old, new *timetable.Schedule) map[string][]string {
	type pair struct{ sec, st string }
	before := map[pair]bool{}
	for _, e := range t.StudentEnrolments(old) {
		before[pair{e.Section, e.Student}] = true
	}
	var out map[string][]string
	seen := map[pair]bool{}
	for _, e := range t.StudentEnrolments(new) {
		p := pair{e.Section, e.Student}
		if !before[p] || seen[p] {
			continue
		}
		seen[p] = true
		if out == nil {
			out = map[string][]string{}
		}
		out[e.Section] = append(out[e.Section], e.Student)
	}
	return out
}

// WithSectionChanges adds to affected (timetable.Comparison.Affected) an
// entry without meeting changes for every student in changes who has
// none, keeping Affected's order (staff, rooms, cohorts, then students by
// ID).
func WithSectionChanges(affected []timetable.Affected, changes []SectionChange) []timetable.Affected {
	have := map[string]bool{}
	for _, a := range affected {
		if a.Kind == timetable.SubjectStudent {
			have[a.ID] = true
		}
	}
	out := slices.Clone(affected)
	added := false
	for _, c := range changes {
		if !have[c.Student] {
			have[c.Student] = true
			out = append(out, timetable.Affected{Kind: timetable.SubjectStudent, ID: c.Student})
			added = true
		}
	}
	if added {
		rank := map[string]int{timetable.SubjectStaff: 0, timetable.SubjectRoom: 1, timetable.SubjectCohort: 2, timetable.SubjectStudent: 3}
		sort.SliceStable(out, func(i, j int) bool {
			if out[i].Kind != out[j].Kind {
				return rank[out[i].Kind] < rank[out[j].Kind]
			}
			return out[i].ID < out[j].ID
		})
	}
	return out
}

func containsString(list []string, s string) bool {
	for _, x := range list {
		if x == s {
			return true
		}
	}
	return false
}
