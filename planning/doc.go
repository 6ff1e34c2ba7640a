// Package planning runs the whole search for a term's timetable: the
// engine's optimisation (package encode) and, when students ask for
// courses, their sectioning (package sectioning) in turns, so that the
// timetable is improved for the students it seats. Every timetable it
// returns has passed the engine's verifier and timetable.Check.
package planning
