package encode

import (
	"context"
	"errors"
	"time"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// SolveOptions control Solve.
type SolveOptions struct {
	Seed          int64                // engine seed; the same seed gives the same timetable; 0 means 1
	ConflictLimit int64                // per engine call; 0 = none (use ctx for a time limit)
	Compile       Options              // compile options (Explain must be false)
	Progress      func(s solver.Stats) // optional, called by the engine at restarts
	// MaxRounds caps the solve–decode rounds (lazy room constraints); 0
	// means 1000.
	MaxRounds int
}

// Timings are the wall-clock times of the phases of Solve.
type Timings struct {
	Compile time.Duration `json:"compile"`
	Solve   time.Duration `json:"solve"`  // engine construction and search, all rounds
	Build   time.Duration `json:"build"`  // construction of the live engines (part of Solve)
	Derive  time.Duration `json:"derive"` // construction of neighbourhood steps' engines (part of Solve)
	Verify  time.Duration `json:"verify"`
	Decode  time.Duration `json:"decode"`
	Check   time.Duration `json:"check"`
}

// Result is the outcome of Solve.
type Result struct {
	Status   solver.Status       // Satisfiable with a Schedule, Unsatisfiable, or Unknown (time or budget)
	Schedule *timetable.Schedule // nil unless Satisfiable
	Program  *solver.Program     // the program solved, with any lazy constraints
	Catalog  *Catalog
	Size     Stats        // size of Program at the end
	Engine   solver.Stats // engine work, summed over rounds
	Timings  Timings
	Rounds   int // engine solve calls
	HallCuts int // room families added after Hall violations
	Nogoods  int // room combinations forbidden after room conflicts
	// Incomplete is set when an unproved room conflict was forbidden; an
	// Unsatisfiable outcome is then reported as Unknown.
	Incomplete bool
}

// ErrCheckFailed wraps a hard violation found by timetable.Check in a
// timetable that the engine and its verifier accepted: a defect of the
// encoder, never a result.
var ErrCheckFailed = errors.New("internal error: the timetable fails the domain check")

// Solve compiles the term, searches for a stable model, verifies it with
// solver.Verify, decodes it (adding the Hall constraints of any room set that
// turns out short and forbidding room conflicts, then searching again), and
// checks the timetable with timetable.Check. A timetable is returned only
// when both gates pass; a hard violation after them is returned as an error
// wrapping ErrCheckFailed.
func Solve(ctx context.Context, t *timetable.Term, opt SolveOptions) (*Result, error) {
	if opt.Compile.Explain {
		return nil, errors.New("encode.Solve: Explain mode programs are solved under assumptions by the caller")
	}
	maxRounds := opt.MaxRounds
	if maxRounds <= 0 {
		maxRounds = 1000
	}
	res := &Result{}
	t0 := time.Now()
	copt := opt.Compile
	copt.HardOnly = true // weak constraints are the optimiser's (Optimize)
	p, cat, err := Compile(t, copt)
	res.Timings.Compile = time.Since(t0)
	if err != nil {
		return nil, err
	}
	res.Program, res.Catalog = p, cat
	eopts := solver.DefaultOptions()
	eopts.Seed = opt.Seed
	if eopts.Seed == 0 {
		// Without random tie-breaking the engine tries atoms in numbering
		// order, keeps each section's last candidates, and piles meetings
		// into the last periods of the week.
		eopts.Seed = 1
	}
	eopts.ConflictLimit = opt.ConflictLimit
	x := NewSearch(t, p, cat, SearchOptions{Engine: firstTimetableOptions(eopts, p), Progress: opt.Progress, Tally: res})
	var sched *timetable.Schedule
	st, _, err := x.Find(ctx, nil, func(ctx context.Context, model []solver.Atom) error {
		var err error
		sched, err = x.Gates(ctx, model)
		return err
	}, maxRounds)
	if err != nil {
		return nil, err
	}
	res.Status = st
	if st == solver.Unsatisfiable && res.Incomplete {
		res.Status = solver.Unknown
	}
	if st == solver.Satisfiable {
		res.Schedule = sched
	}
	res.Size = cat.Stats(p)
	return res, nil
}
