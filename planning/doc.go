// Package planning runs the whole search for a term's timetable: the
// engine's optimisation (package encode) and, when students ask for
// courses, their sectioning (package sectioning) in turns, so that the
// timetable is improved for the students it seats. Every timetable it
// returns has passed the engine's verifier and timetable.Check.
//
// The turns are a decomposition (in our words, after the published
// approach surveyed by Müller & Murray 2010, Annals of OR 181): optimise
// the timetable for the fixed students, seat the requesting students in
// it, then in rounds re-optimise the timetable on a working copy of the
// term whose fixed enrolments include the seated students (the engine
// counts their clashes, pattern sections included), warm-started from the
// best timetable, and seat the students again. Each sectioned timetable
// is judged on the real term by timetable.Check and timetable.Cost, and
// the best by that full cost is kept.
package planning
