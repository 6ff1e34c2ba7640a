package planning

import "github.com/termwright/termwright/timetable"

// workingTerm is the copy of t the engine optimises: no requests, and as
// fixed enrolments t's own followed by seated (the sectioned students of an
// earlier round), so that the engine's student clashes count them. The
// copy shares everything else with t (it is read only).
func workingTerm(t *timetable.Term, seated []timetable.Enrolment) *timetable.Term {
	w := *t
	w.Requests = nil
	if len(seated) > 0 {
		w.Enrolments = make([]timetable.Enrolment, 0, len(t.Enrolments)+len(seated))
		w.Enrolments = append(w.Enrolments, t.Enrolments...)
		w.Enrolments = append(w.Enrolments, seated...)
	}
	return &w
}

// workingKeep is the kept timetable without its sectioned students: on
// the working term "moved students" is not the engine's business (the
// sectioner keeps students; Plan counts the criterion on the real term).
func workingKeep(keep *timetable.Schedule) *timetable.Schedule {
	if keep == nil || len(keep.Enrolments) == 0 {
		return keep
	}
	return &timetable.Schedule{Placements: keep.Placements}
}

// withEnrolments is a copy of s (its placements shared) carrying the
// sectioned students e.
func withEnrolments(s *timetable.Schedule, e []timetable.Enrolment) *timetable.Schedule {
	return &timetable.Schedule{Placements: s.Placements, Enrolments: e}
}
