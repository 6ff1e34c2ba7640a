package timetable

import (
	"cmp"
	"slices"
)

// Subject kinds of a comparison, in the order Affected lists them.
const (
	SubjectStaff   = "staff"
	SubjectRoom    = "room"
	SubjectCohort  = "cohort"
	SubjectStudent = "student"
)

var subjectRank = map[string]int{SubjectStaff: 0, SubjectRoom: 1, SubjectCohort: 2, SubjectStudent: 3}

// Affected is one staff member, room, cohort or student whose timetable
// changed, with what changed for them.
type Affected struct {
	Kind    string // SubjectStaff, SubjectRoom, SubjectCohort or SubjectStudent
	ID      string
	Name    string // staff names as the timetables give them; "" otherwise
	Changes []SubjectChange
}

// SubjectChange is one change as one subject sees it. Kind is the
// subject's view: a meeting that moved from room A to room B is
// ChangeDropped for A and ChangeAdded for B (and ChangeMoved for its staff);
// a meeting whose staff changed is dropped for the one and added for the
// other even when it stayed in place.
type SubjectChange struct {
	Kind   string // ChangeMoved, ChangeAdded or ChangeDropped
	Change int    // index into Comparison.Changes
}

// Affected lists everyone a change touches, staff first, then rooms,
// cohorts and students, each by ID. students maps a section ID to its
// enrolled students (nil when there are no enrolments).
func (c *Comparison) Affected(students map[string][]string) []Affected {
	type key struct{ kind, id string }
	by := map[key]*Affected{}
	add := func(k key, kind string, i int, m *Meeting) {
		a := by[k]
		if a == nil {
			a = &Affected{Kind: k.kind, ID: k.id}
			by[k] = a
		}
		if k.kind == SubjectStaff && m != nil {
			if j := slices.Index(m.Staff, k.id); j >= 0 && j < len(m.StaffNames) && m.StaffNames[j] != k.id {
				a.Name = m.StaffNames[j]
			}
		}
		a.Changes = append(a.Changes, SubjectChange{Kind: kind, Change: i})
	}
	// subjects lists who a meeting concerns, each once, with the set of them.
	subjects := func(m *Meeting) ([]key, map[key]bool) {
		if m == nil {
			return nil, nil
		}
		var out []key
		set := map[key]bool{}
		put := func(kind, id string) {
			if k := (key{kind, id}); id != "" && !set[k] {
				set[k] = true
				out = append(out, k)
			}
		}
		for _, id := range m.Staff {
			put(SubjectStaff, id)
		}
		put(SubjectRoom, m.Room)
		for _, id := range m.Cohorts {
			put(SubjectCohort, id)
		}
		for _, id := range students[m.Section] {
			put(SubjectStudent, id)
		}
		return out, set
	}
	for i, ch := range c.Changes {
		if ch.Kind == ChangeUnchanged && (ch.Old == nil || ch.New == nil || sameAttendance(ch.Old, ch.New)) {
			continue // nobody's view of it changed
		}
		olds, oldSet := subjects(ch.Old)
		news, newSet := subjects(ch.New)
		for _, k := range olds {
			switch {
			case !newSet[k]:
				add(k, ChangeDropped, i, ch.Old)
			case ch.Kind == ChangeMoved:
				add(k, ChangeMoved, i, ch.New)
			}
		}
		for _, k := range news {
			if !oldSet[k] {
				add(k, ChangeAdded, i, ch.New)
			}
		}
	}
	out := make([]Affected, 0, len(by))
	for _, a := range by {
		out = append(out, *a)
	}
	slices.SortFunc(out, func(x, y Affected) int {
		return cmp.Or(cmp.Compare(subjectRank[x.Kind], subjectRank[y.Kind]), cmp.Compare(x.ID, y.ID))
	})
	return out
}

// sameAttendance reports whether two meetings of a section have the same
// staff and cohorts in the same order (students follow the section, rooms
// the place), the common case that needs no per-subject look.
func sameAttendance(x, y *Meeting) bool {
	return slices.Equal(x.Staff, y.Staff) && slices.Equal(x.Cohorts, y.Cohorts)
}
