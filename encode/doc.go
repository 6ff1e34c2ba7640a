// Package encode compiles a term (package timetable) into a ground logic
// program (package solver) whose stable models are the term's timetables,
// decodes models back into schedules, and runs the whole pipeline in Solve:
// compile, search, solver.Verify, decode, timetable.Check. It is the only
// package that knows both the domain and the engine.
//
// # Decisions
//
// A section's meetings are interchangeable, so the decision is the section's
// set of start periods: an atom start(S,P) for every candidate start P and
// one choice rule choosing exactly Meetings of them. Meetings are numbered in
// period order when decoded. One atom set per meeting would let the search
// see m! copies of every timetable.
//
// A candidate start keeps the meeting inside one run of consecutive periods
// (Term.Span). Normally candidates are also pruned by hard unavailability of
// the section's staff, cohorts and the section, by room availability (some
// candidate room free in every period of the meeting) and by fixed meetings.
// In Explain mode they are not: those requirements become constraints with
// selectors instead, so that switching a selector off really drops them.
//
// # Constraints
//
//   - No staff member or cohort in two places: for each of them, each period
//     and each week scope, one cardinality bound "at most 1" over the start
//     atoms whose meetings occupy the period. Week scopes: the elementary
//     classes of the week sets involved (weeks with the same members), keeping
//     only maximal ones, so sections in disjoint weeks may share a period.
//   - A section's meetings on different days: at most one start per day
//     (unless it may share days); its own meetings never overlap.
//   - Staff limits: busy(T,P) atoms defined by rules from the starts (only
//     for staff with limits); a bound over a day's busy atoms for the
//     periods-per-day limit; one constraint per window of k+1 consecutive
//     periods for a limit of k consecutive periods.
//   - Hard relations exactly as defined in timetable/term.go, with helper
//     atoms meets(S,D) (section S meets on day D) and started_by(S,P) (a
//     meeting of S starts at or before P, a chain of rules) so that "before"
//     is linear in the candidates.
//
// # Rooms: aggregated, never one atom per meeting, period and room
//
// Each section has a candidate room set: the allowed list (or all rooms)
// with the needed features and, unless capacity is soft, enough seats.
// Sections tied by a hard same-room relation share the intersection of their
// sets (and any fixed room among them); a fixed meeting with a room has just
// that room. The program counts instead of choosing: for a room family U and
// a period p, the meetings occupying p whose candidate set lies inside U, plus
// the rooms of U unavailable at p, number at most |U|. By Hall's theorem
// (Hall 1935) these bounds over every U are exactly the condition for a
// room assignment in each period; for nested sets (rooms that differ only by
// size) the sets themselves suffice. Compile states them for every distinct
// candidate set, the union of each connected component of sets, and unions of
// overlapping pairs (at most maxFamilies per component), and leaves out bounds
// that can never be exceeded.
//
// Decode assigns concrete rooms: it matches the meetings of every period and
// week scope to their rooms (Hopcroft–Karp); if a matching falls short, the
// set Z of meetings reachable from an unmatched one by alternating paths and
// the union U of their candidate sets form a Hall violator (König's theorem),
// returned as a *HallError; the search (Search.Cut) adds U as a new family
// (for every period) and searches again — lazy room constraints. Otherwise
// rooms are assigned in grid order by augmenting paths that try the
// section's room so far first (room stability), then the best fit.
// Meetings that span several periods, week patterns and same-room groups
// need one room for all they cover, which per-period counting cannot
// promise. When the fast assignment fails, it runs again ranking rooms by
// pressure (the demand that can go nowhere else: laboratories stay free
// for the meetings that need one). When that fails too, Decode repairs
// (roomassign.go), with explicit room atoms solved by the engine and
// everything else staying put: each failed meeting with the meetings
// holding its rooms (same-room groups whole, a small conflict budget);
// then the failed meetings' room family whole (roomfamily_repair.go: the
// meetings that can use only the rooms of the union U of their candidate
// sets, solved exactly on their own, the others moved out of U and placed
// around them; no assignment is a proved conflict); then, for the
// meetings still failed, the smallest neighbourhood of them solved on its
// own (when it has no assignment, no repair can help: the engine's
// unsatisfiable core becomes a clause forbidding that combination of
// starts, *RoomConflictError); then all of them with their blockers
// (widened up to three times, while the set stays below the largest
// component searched); then growing neighbourhoods on their own. Whole
// components are searched only as a last resort and only when small; a
// conflict that is not proved within the effort limits (roomEffort) is
// still forbidden but marked Incomplete, and Solve then reports "unknown"
// rather than "no timetable". The exact searches run within the caller's
// context (DecodeContext): when it ends, Decode returns its error and
// forbids nothing.
//
// # The search loop (search.go, cuts.go)
//
// One type, Search, owns the search of a compiled program: solve under
// assumptions on one live engine, solver.Verify, Decode, timetable.Check
// (Gates), room problems turned into cuts (Cut: a *HallError's sets become
// room families, a *RoomConflictError's start combinations integrity
// constraints), and the phases of a new engine taken from a model
// (Prefer). Find runs that loop until a caller's gate accepts a model.
// Cuts are written into the program first, so Verify and every later
// engine see them; the live engine catches up before its next call: new
// constraints become clauses, a new family's Hall bounds native bounds
// (solver.Solver.AddBound: a lazy round costs a propagation, not a
// rebuild), the selector facts of families added in normal mode are
// dropped from conditions and added to every model, and what it cannot
// take (a new choice: a family's selector in Explain mode) makes it
// rebuild from the preferred phases. Solve, the
// optimiser (first timetable, whole term, neighbourhood steps through
// Search.Derive and Search.Improve) and every explanation check are short
// callers. A first timetable of a very large program (over 500,000
// atoms) is searched with rare restarts: each restart there re-decides
// hundreds of thousands of atoms.
//
// # Solve
//
// Solve compiles the hard requirements only (Options.HardOnly: the soft
// criteria are Optimize's) and runs Search.Find with the gates as its
// test. Seed 0 is taken as 1: without random tie-breaking the engine tries
// atoms in numbering order, keeps each section's last candidates and piles
// meetings into the last periods of the week.
//
// Explicit room atoms for grid meetings are needed only where rooms meet
// the pattern part of the model (below): grid-only terms handle same-room
// relations and fixed rooms by narrowing candidate sets plus exact
// assignment at decode. The price is a limitation in Explain mode: the
// narrowing by a same-room relation is part of the room model and is not
// switched off by the relation's selector.
//
// # Selectors and the catalog
//
// Every requirement group — a staff member's availability, a cohort's
// no-overlap, a room family's supply, a fixed meeting, a relation row, a
// section's days, a staff member's day limit, ... — has a selector atom
// req(kind,key) in the body or condition of each of its constraints. Normally
// selectors are facts; in Explain mode they are free ({sel}.) and the caller
// assumes them. "Exactly Meetings meetings" has no selector. The Catalog maps
// every atom to its meaning, every group to its sentence and workbook rows,
// and every statement of the program to its group (the compile dump prints
// them as % comments).
//
// # Soft criteria (soft*.go, keep.go)
//
// The criteria of timetable/criteria.go whose value depends only on times
// are weak constraints of the program, exactly as defined there, with the
// weights and levels of Term.CriterionWeight (weight 0 adds nothing):
// avoid times (soft rows of staff, cohorts and sections), staff gaps and
// days, cohort gaps and isolated periods, spread days, student clashes,
// early and late periods, soft relations and, with Options.Keep, the time
// half of moved meetings. Auxiliary atoms keep them near-linear:
// occupies(S,P) per section and period, attends(C,P) per cohort and
// period (busy(T,P) for staff), before/after chains per person and day for
// gaps, short_of_days(S,K) pinned by two bounds for spread days,
// starts_upto(S,P,J) counters for the sorted pairing of kept meetings, one
// broken(relation,R) atom per soft row. Student clashes group students with
// equal sections and split their sections into blocks that can never meet
// at once (a shared staff member or cohort in common weeks), so one weak
// constraint per pair of blocks and period counts the clashing pairs.
// Explain mode adds none of this.
//
// The criteria that depend on concrete rooms — room stability, room over
// capacity, wasted seats, travel, avoid times on room rows, same-room soft
// relations and the room half of moved meetings — are not in the program:
// Decode assigns rooms, then a local search (soft_rooms.go) lowers them by
// moving a section's meetings into one room, single meetings into free
// rooms, and a meeting into a room whose holder moves elsewhere, never
// leaving a meeting's candidate rooms. When the room program is small
// enough (soft_rooms_exact.go), the engine then chooses rooms exactly for
// the times found: explicit atoms in(meeting, room), at most one meeting
// per room, period and week scope, and weak constraints for every room
// criterion (times being fixed, travel is known pair by pair). So on small
// terms each timetable considered gets its best rooms, and a cost that
// meets the engine's bound is proven optimal.
//
// # The three gates and the reported cost
//
// Every timetable Optimize keeps has passed solver.Verify, timetable.Check
// and a third gate: the engine's weak-constraint cost of the model,
// criterion by criterion, equals timetable.Cost of the timetable and the
// kept timetable with every room left blank (TimeCost), which is exactly
// the part of the objective the program encodes — with rooms blank every
// room-dependent unit is zero. The cost reported is always timetable.Cost of
// the written timetable, rooms included. The lower bound is the engine's
// (core-guided and model-improving, per level); the room part is never
// negative, so it bounds the whole cost, lexicographically. A timetable is
// proven optimal only when its whole cost meets that bound.
//
// # Optimisation (optimize*.go, lns*.go, portfolio*.go)
//
// Optimize finds a first verified timetable (a Search over the hard
// program, each model completed on the whole program's Search by assuming
// its starts), runs solver.Optimize on the whole term within a conflict
// budget, and then large-neighbourhood search (Shaw 1998): for each step
// Search.Derive makes an engine of the part of the program that the
// neighbourhood can change — the atoms that depend only on the other
// sections' starts form a splitting set (Lifschitz and Turner 1994), so
// the program is partially evaluated on the best timetable's values of
// them (derive.go), visiting only the statements the free atoms occur in;
// its models joined with the fixed part are models of the whole program.
// So building a step's engine costs what the neighbourhood touches, not
// the term. The neighbourhood (the subject of a costly
// weak constraint, a person with a share of the cost, related sections, a
// day, random sections) is re-optimised within a conflict budget, and
// every model the engine finds goes through the gates; the best whole cost
// wins. The neighbourhood grows after a proven step and
// shrinks after one that ran out of budget. While the best timetable pays
// room cost (which the engine does not see), every other step frees a
// section that pays it with its room competitors and must move one of
// them (lns_roomhood.go). When the steps stall with time left,
// neighbourhood search restarts from the incumbent with a new random
// stream, neighbourhoods 1, 2, 4 or 8 times the starting size, a budget
// grown alike and a few perturbed steps (lns_restart.go; the Horizon
// option allows restarts without a deadline, for tests).
//
// OptimizePortfolio gives two cores to the first member's annealing where
// local search runs (improve.Options.Workers: both cost moves of one
// cooling plan) and each further core to a member with another seed;
// members share a board (portfolio_share.go): each new best verified
// timetable and proven bound is published; a stalled member adopts a
// better timetable through its own engine and gates; a timetable at the
// best bound stops them all. The second member is the engine member (no
// local search), later ones take shorter local-search runs
// (memberLocalShare), so that their timetables reach the board sooner.
//
// The lower bound starts at timetable.CountingBound, what every legal
// timetable must pay counted from the term alone, and the engine's
// core-guided bounds raise it level by level (optimize_bound.go); the
// whole-term phase keeps the bound it proved when its turn ends.
//
// With a deadline, a warm-up comes right after the first timetable: short
// local-search runs, each followed by a short neighbourhood turn, while
// the neighbourhood turns improve (optimize_turns.go); a small term is
// often proven optimal there. After it, the whole-term phase ends once it
// stops improving the incumbent (optimize_stall.go). Then, and again each
// time a neighbourhood turn ends, a local-search run (package improve: simulated annealing with legal
// moves and incremental cost on the timetable itself, rooms included)
// starts from the incumbent (optimize_local.go). Its best timetable is
// adopted only through the engine: every start atom is fixed to it as
// assumptions, the engine's model (propagation only) must pass
// solver.Verify, the timetable with its own rooms timetable.Check, and the
// model's cost must equal the timetable's time cost (the third gate); a
// timetable the program refuses is not adopted. With a deadline each run
// takes LocalShare of the time left; without one, a move budget. A
// warm-up run keeps improve's growing cooling cycles (early results);
// every later run cools once over its whole time (longRunCycles).
//
// All budgets count conflicts or moves, so a one-thread run without a
// deadline that ends by itself (proof, stall after Horizon restarts or
// step limit) depends only on the term, the options and the seed; a time limit or Ctrl-C ends it with the best
// verified timetable so far, and the search never stops early while time
// remains.
//
// # Pattern sections (pattern_*.go)
//
// A section with meeting patterns (Section.Times) is decided by atoms
// time(S,I), one per acceptable pattern, and in(S,R), one per acceptable
// room (RoomChoices, else Rooms, else every room that fits), each set with
// an "exactly one" choice; a section that takes no room has no room atoms.
// Patterns that meet during hard unavailability of the section, its staff
// or cohorts (minutes and teaching weeks exact) are left out; a (pattern,
// room) pair that meets the room's unavailability is one integrity
// constraint. The grid parts see such a section as one with no meetings
// and no room, so a grid term compiles exactly as before.
//
// One meeting at a time, for every staff member, cohort and room of a
// pattern section: candidate meetings are intervals on a day in teaching
// weeks; per week and day a sweep over the sorted endpoints yields the
// maximal cliques (Gilmore and Hoffman 1964; Golumbic, Algorithmic Graph
// Theory, ch. 8), identical member lists are swept once and identical
// cliques stated once, and each clique of two or more sections is one
// bound "at most 1" over one literal per section: any_time(S,K) (the
// section meets at one of its patterns in the clique; the time atom
// itself for one pattern), interned and shared by every bound. Grid starts
// of the same people take part as intervals. Rooms need time and room
// together: room_time(S,R,N) :- in(S,R), any_time(S,K), interned by
// section, room and time literal (the time literal alone when R is the
// section's only room). Per section this costs its patterns, its rooms,
// and one any_time per distinct stabbing set of its patterns and one
// room_time per (room, stabbing set); on the public ITC-2019 instances
// 40–1,650 atoms per section, relations included (room_time dominates where
// sections have dozens of rooms and patterns each). Above lazyRoomBudget
// room_time atoms per section the dearest rooms get no bounds: Decode
// finds their clashes and the search forbids each clashing pair of
// sections that room at every overlapping pair of their patterns
// (pattern_lazy.go; integrity constraints the live engine takes as
// clauses). A grid section takes part in a room's bounds through its start
// atoms when that room is its meeting's only candidate, and otherwise
// through explicit atoms grid_in(S,P,R), exactly one per chosen start
// (under a travel-class atom grid_at(S,P,C) when travel needs it), made
// for the grid sections whose rooms pattern sections, travel times or room
// relations with pattern sections reach, closed under sharing rooms
// (rooms_grid.go); Decode takes their rooms from the model and room
// improvement leaves them there.
//
// Travel (Term.Travel, hard) between two meetings of one staff member or
// cohort: for each pair of candidate meetings (patterns, grid starts) on a
// common day and week with a gap below the longest travel time, and each
// pair of their rooms (per travel class of rooms for grid meetings)
// farther apart than the gap, one integrity constraint. Relation rows
// listing grid sections state every kind on their candidate starts seen as
// one-day meetings (times_rel_grid.go). Decode reads one placement per
// pattern section (Period -1, Time, Room). The soft
// criteria time choice, room choice, avoid times, wasted seats, room over
// capacity and (with Keep: another pattern or room) moved meetings are
// weak constraints on these atoms; relations, weekly limits and lunch
// breaks of pattern sections are in times_rel*.go and times_limits*.go.
// Optimize skips local search on such terms (package improve moves grid
// meetings only; OptimizeResult.Local.Skipped says so); neighbourhoods
// free pattern sections like grid ones. Explain mode keeps every pattern
// and room of a pattern section and states what normally prunes them
// (hard unavailability, room fit, room unavailability) as constraints
// under the grid's groups (explain_patterns.go); the section's
// "scheduled" selector is the body of its time and room choices.
//
// # Naming
//
// Atoms print as ground terms of the standard rule syntax: start("BIO-101",
// tue_10_00), busy("S-017",tue_10_00), meets("BIO-101",tue),
// started_by("BIO-101",tue_10_00), req(staff_no_overlap,"S-017").
//
// # Extending
//
// Compile runs a list of parts (compile.go); the soft criteria are the last
// part, registered by soft.go. Options.Keep is the kept timetable of
// minimal-change re-planning.
package encode
