package planning

import (
	"context"
	"time"

	"github.com/termwright/termwright/encode"
	"github.com/termwright/termwright/sectioning"
	"github.com/termwright/termwright/timetable"
)

// Options control Plan.
type Options struct {
	encode.OptimizeOptions     // Keep also keeps the earlier timetable's sectioned students where it can
	Threads                int // parallel searches (encode.OptimizePortfolio); 0 means 1
	// Rounds is the number of improvement rounds after the first
	// sectioning (re-optimise the timetable for the seated students, seat
	// them again); 0 means DefaultRounds, negative means none. With a
	// deadline the rounds share the time, and more rounds follow while
	// more than a tenth of Plan's time is left.
	Rounds int
}

// DefaultRounds is the number of improvement rounds when Options.Rounds is 0.
const DefaultRounds = 3

// Result is the outcome of Plan: the optimiser's result for the best
// timetable, whose Schedule carries the sectioned students and whose Cost
// and Total include them, and the sectioning of that timetable.
//
// With requests, Cost is timetable.Cost of Schedule on the term (with
// Keep): it counts "unplaced requests", "moved students" and the student
// clashes of fixed and sectioned students. EngineCost is the engine's cost
// on its working copy of the term (sectioned students taken as fixed), so
// it need not equal Cost there. Bound is what is truly known: the bound
// the engine proved on the term with its fixed students only, which is a
// bound on every level because seating students only adds cost, with 0 on
// the levels only requests have; Proven is set only when Total meets it.
// Stopped is "optimal" (Proven), "time limit", "interrupted" or "rounds
// done" (the rounds ended by themselves).
type Result struct {
	*encode.OptimizeResult
	Sectioning *sectioning.Result // nil when the term has no requests
	Rounds     []Round            // with requests: one entry per timetable sectioned, the first one first
}

// Round is one timetable of the planning loop and the full cost of its
// sectioning.
type Round struct {
	Total   []int64       // timetable.Cost of the sectioned timetable per level of Result.Levels
	Clashes int64         // its "student clashes" units
	Kept    bool          // it became the best so far
	At      time.Duration // when it was sectioned, from the start of Plan
	// SameSeating: the round kept the seating it started from, which cost
	// less on its new timetable than seating the students again.
	SameSeating bool
}

// Plan finds the best timetable for t it can before ctx ends. Without
// requests it is encode.OptimizePortfolio. With requests it optimises the
// timetable for the fixed students, seats the requesting students in its
// sections (sectioning.Section), then, in rounds, re-optimises the
// timetable with the seated students taken as fixed and seats them again,
// keeping the best timetable by the full cost (a decomposition in the
// spirit of Müller & Murray 2010, Annals of OR 181).
func Plan(ctx context.Context, t *timetable.Term, opt Options) (*Result, error) {
	if len(t.Requests) == 0 {
		res, err := encode.OptimizePortfolio(ctx, t, opt.OptimizeOptions, max(opt.Threads, 1))
		return &Result{OptimizeResult: res}, err
	}
	return planWithRequests(ctx, t, opt)
}
