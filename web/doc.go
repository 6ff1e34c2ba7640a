// Package web is the local web page of termwright serve: week grids per
// staff member, room, cohort and student, the master list, the broken
// hard requirements (timetable.Check) and the cost per preference
// (timetable.Cost), checked moves with undo, locked meetings and
// "re-plan the rest" (planning.Plan with the current timetable kept and
// the locked meetings fixed), "where else" for a meeting (encode.PlacesOf:
// every start, each proved by a timetable of the term) and "why not" for a
// section at a cell (encode.Explain), saving new timetable versions,
// comparing them (timetable.Compare, Affected) and change notices with
// updated calendars (export.Notices).
//
// Representation: a Server holds one term and the timetable being edited
// with its locked meetings as a numbered state. Every edit (a move, a
// lock, an undo, keeping a re-plan) names the version it was made on and
// is refused when that is not the current version, so two browser tabs
// never lose each other's edits; a re-plan remembers the version it
// started from and can be kept only while that is still current. Saved
// versions are kept in memory with the file each was written to; files
// are only ever created (name-2.xlsx, name-3.xlsx, ...), never replaced,
// and only in the output folder given to New.
//
// Searches that take seconds (re-plan, where else) run as jobs: started
// by one request, polled by the page (GET /api/job) for their progress,
// stopped on request or by Close; one search, explanation included, runs
// at a time. The engine's encoding does not handle meeting patterns in
// this build, so on a term with pattern sections the searches say so
// instead of answering; pattern meetings are drawn by clock time and
// moved to another of their patterns and rooms, judged by
// timetable.Check.
//
// Terms with course requests: the timetable's sectioned students
// (Schedule.Enrolments) change with it, so each state carries the
// students and their sections (fixed and sectioned) for the student
// grids; a re-plan seats them again (planning.Plan) and lists who changes
// section, and comparisons and notices tell students of their changes of
// section (export.SectionChanges). A student's week also answers "can
// they get every course they asked for without a clash on this version,
// and if not, why not" (GET /api/student, encode.ExplainStudent: the
// timetable fixed, no engine search, so it is not a job).
//
// Requests are answered only under a loopback Host (or the host named
// with --addr), and POST bodies only as JSON, against DNS rebinding and
// cross-site forms.
//
// The page itself (assets/) is hand-written HTML, CSS and JavaScript
// embedded in the binary, with no library: serving needs no network.
package web
