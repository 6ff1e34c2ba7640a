// Package sectioning places students who asked for courses
// (timetable.Term.Requests) into sections of a finished timetable: one
// section of every part of one arrangement of each course (the seating
// rule of timetable.Course), within section limits, with as few clashes
// as it can find, and — given an earlier timetable — moving as few
// students as it can. It knows the domain only (package timetable); the
// timetable itself comes from the engine.
//
// # Objective
//
// Lexicographic (score.go): fewest unplaced requests; then, among as
// many, the less important ones left out (priority 1 before 2 … before 0);
// then alternatives used only where the course itself cannot be placed;
// then criteria "moved students" and "student clashes" by their weights
// and levels in the term. Clashes are counted exactly as the criterion
// defines them (clash.go), travel time included for pattern sections.
//
// # Method
//
// In the spirit of batch sectioning with later improvement (Müller and
// Murray 2010, "Comprehensive approach to student sectioning", Annals of
// Operations Research 181), in our own design:
//   - keep.go: with Options.Keep, kept students are seated first in the
//     option and, where room and rules allow, the sections they had;
//   - greedy.go: requests by priority, students hardest first, each
//     request in its cheapest enrollment with room;
//   - enroll.go: an enrollment is found part by part (parents' parts
//     first) by branch and bound, never as the product of the parts;
//   - repair.go: a request with no room gets a seat by an augmenting path
//     of moves of other students (Kuhn's method; Hall's theorem);
//   - priority.go: an unplaced request takes the place of a less
//     important one when no repair can seat it;
//   - student.go: a student move re-seats all of one student's courses at
//     once by branch and bound (Müller and Murray's per-student search);
//   - improve.go: rounds of retries of unplaced requests, student moves
//     and swaps of two students' enrollments, until nothing improves or
//     the context ends; a student is looked at again only when their
//     seating changed or a section that was full for them opened;
//   - exact.go: small terms are then searched exhaustively.
//
// # Representation
//
// problem (model.go) holds sections, parts, arrangements and courses as
// dense int32 indexes (section indexes are Term.Sections positions; -1
// means none); state (state.go) holds each request's option and sectioned
// sections (an enrollment without the student's fixed sections) and every
// section's load (fixed enrolments included). Everything is deterministic
// for equal seeds: the seed orders ties among students and the local
// search's visits.
//
// Report (report.go) is the registrar's summary that export and cmd
// render.
package sectioning
