// Package web is the local web page of termwright serve: week grids per
// staff member, room, cohort and student, the master list, the broken
// hard requirements (timetable.Check) and the cost per preference
// (timetable.Cost), checked moves with undo, saving new timetable
// versions and comparing them (timetable.Compare, Affected), and "why
// not / where else" for a section at a cell (encode.Explain, over every
// timetable of the term, not only the one shown).
//
// Representation: a Server holds one term and the timetable being edited
// as a numbered state. Every edit (a move, an undo) names the version it
// was made on and is refused when that is not the current version, so two
// browser tabs never lose each other's edits. Saved versions are kept in
// memory with the file each was written to; files are only ever created
// (name-2.xlsx, name-3.xlsx, ...), never replaced, and only in the
// output folder given to New.
//
// Requests are answered only under a loopback Host (or the host named
// with --addr), and POST bodies only as JSON, against DNS rebinding and
// cross-site forms.
//
// The page itself (assets/) is hand-written HTML, CSS and JavaScript
// embedded in the binary: serving needs no network.
package web
