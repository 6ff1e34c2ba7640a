// Package improve is the fast improvement phase: local search that works on
// a timetable directly, keeps it legal after every move, and evaluates every
// soft criterion of timetable.Criteria incrementally.
//
// Representation. A State holds a Term's static facts (valid start periods of
// each section after hard unavailability, allowed rooms, week sets, the
// people of each section, pairs of sections that share students) and the
// moving part: one meeting per placement of the schedule (same order), its
// start period and room, and per-resource occupancy lists (resource ×
// period → meetings occupying it) for staff, cohorts and rooms, plus a
// per-section period count, and per person and day a bit mask of the busy
// periods (when days have at most 64 periods and there are at most 64
// days). The running cost is kept per criterion as raw
// units and row-weighted units, exactly as timetable.Cost counts them.
//
// Invariants. Between moves the schedule passes every hard requirement of
// timetable.Check, and the running cost equals timetable.Cost of the
// schedule criterion by criterion. A move is a list of (meeting, new start,
// new room); it is applied by removing the meetings, inserting them at their
// new places with the clash, availability and room checks done at insertion,
// then checking the rules that span several meetings (different days, staff
// limits, hard relations) on the touched sections and staff days only. A
// move that fails any rule is undone. A move that keeps every start and
// names every room lifts and puts back the rooms only (roomonly.go): its
// people's busy periods and every time rule stay as they are, and their
// days are recosted only when rooms name buildings (travel). When no
// moving section has a relation, such a move is decided before anything
// changes (roompeek.go): its new rooms are checked against the meetings
// that stay and costed with the new rooms written in, so a refused room
// move changes nothing at all. Before anything is lifted, a move whose
// target start, room or person is held by a meeting outside the move is
// refused without costing it (apply.go, blocked).
//
// Deltas. Per-meeting criteria (avoid times, over capacity, wasted seats,
// early and late periods) and student clashes change by exact deltas at
// insertion and removal. Criteria of a section (moved meetings, spread
// days, room stability), of a person's day (staff and cohort gaps, staff
// days, isolated cohort periods, travel) and of a relation (soft
// relations) are recomputed for the touched sections, person-days and
// relations only, before and after the move; a person-day's gaps, days
// and isolated periods come from its busy mask in O(1) (travel is counted
// only when some room names a building), a section's days from a day mask.
//
// Moves (moves.go): relocate a meeting to another start, with its room or
// another, swapping with the one meeting holding that room then; change a
// meeting's room, swapping likewise; swap the starts and rooms of two
// meetings (Lü and Hao 2010); a Kempe chain that exchanges the
// meetings of two starts linked by shared staff or cohorts (Thompson and
// Dowsland 1998), rooms kept where free; put every meeting of a section
// in one room, swapping with the meetings holding it; and an aimed move
// (aimed.go) that draws a meeting carrying cost (an isolated cohort period,
// a section on too few days, a section in several rooms) and moves it where
// that cost goes (beside the cohort's other meetings, to a free day, into
// a room the section already uses, at its time or at a time that room is
// free); the isolated periods and short sections it aims at are found by
// scanning cohort-days and sections from a random one. A meeting whose
// start changes keeps its room where that is free, else takes the best
// free room of up to 16 by its own room criteria (roompick.go). A shift move
// (shift.go) brings the cohort's other meetings to an isolated period
// instead: the nearest run of the cohort's consecutive meetings that day
// shifted as a block to end beside it, or one other meeting of the cohort
// pulled beside it.
//
// Search (anneal.go): Run is simulated annealing (Kirkpatrick, Gelatt,
// Vecchi 1983) with a measured starting temperature, geometric cooling, a
// temperature ended early once a share of its moves was accepted (Bellio,
// Ceschia, Di Gaspero, Schaerf 2016) and reheats from the best timetable;
// with a deadline or a move limit the cooling cycles are planned to grow
// (each three times the one before, the last 0.6 of the budget), so that
// the first results come fast and the longest cycle gives quality, and the
// search uses all the time it is given. Levels stay lexicographic.
//
// Workers (parallel.go): with Options.Workers above one, each worker
// anneals its own replica of the State at the first worker's temperature;
// a move one accepts is kept only when its worker had applied every move
// the others kept before, and the others then apply it with the rooms it
// chose. Every replica goes through the same timetables in the same order,
// so the invariants above hold on each, and the cooling plan costs about
// Workers times as many moves in its time.
//
// Names: m is a meeting (placement index), si a section index, p a period,
// r a room index (-1 for none), res a resource (staff k, then cohorts, then
// rooms, in one numbering).
package improve
