package encode

import (
	"context"
	"errors"
	"fmt"
	"strings"
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
	Solve   time.Duration `json:"solve"` // engine construction and search, all rounds
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
	var s *solver.Solver
	var last []solver.Atom
	build := func() error {
		t1 := time.Now()
		defer func() { res.Timings.Solve += time.Since(t1) }()
		if s != nil {
			res.Engine = res.Engine.Add(s.Stats())
		}
		var err error
		s, err = solver.New(p, eopts)
		if err != nil {
			return fmt.Errorf("internal error: the engine rejects the compiled program: %w", err)
		}
		if opt.Progress != nil {
			s.SetProgress(opt.Progress)
		}
		if last != nil {
			// Start from the previous model: most of it stays right.
			in := make(map[solver.Atom]bool, len(last))
			for _, a := range last {
				in[a] = true
			}
			for a := solver.Atom(1); int(a) <= p.NumAtoms(); a++ {
				if cat.AtomInfo(a).Kind == AtomStart {
					s.SetPhase(a, in[a])
				}
			}
		}
		return nil
	}
	if err := build(); err != nil {
		return nil, err
	}
	finish := func() *Result {
		res.Engine = res.Engine.Add(s.Stats())
		res.Size = cat.Stats(p)
		return res
	}
	for res.Rounds < maxRounds {
		if ctx.Err() != nil {
			res.Status = solver.Unknown // out of time before this round
			return finish(), nil
		}
		res.Rounds++
		t1 := time.Now()
		st := s.Solve(ctx)
		res.Timings.Solve += time.Since(t1)
		if st != solver.Satisfiable {
			res.Status = st
			if st == solver.Unsatisfiable && res.Incomplete {
				res.Status = solver.Unknown
			}
			return finish(), nil
		}
		model := s.Model(nil)
		t2 := time.Now()
		verr := solver.Verify(p, model)
		res.Timings.Verify += time.Since(t2)
		if verr != nil {
			return nil, fmt.Errorf("internal error: the engine's model fails the verifier: %w", verr)
		}
		t3 := time.Now()
		sched, derr := Decode(t, cat, model)
		res.Timings.Decode += time.Since(t3)
		var herr *HallError
		var rerr *RoomConflictError
		switch {
		case errors.As(derr, &herr):
			b := cat.extender(p)
			for _, set := range herr.sets {
				if _, added := b.addFamily(set, true); added {
					res.HallCuts++
				}
			}
			last = model
			if err := build(); err != nil {
				return nil, err
			}
			continue
		case errors.As(derr, &rerr):
			for _, ng := range rerr.nogoods {
				starts := make([]solver.Lit, len(ng))
				for i, l := range ng {
					starts[i] = l.Not()
				}
				b := cat.extender(p)
				b.in(-1, "room conflict")
				b.rule(0, starts...)
				if err := s.AddClause(ng...); err != nil {
					return nil, fmt.Errorf("internal error: adding a room conflict: %w", err)
				}
				res.Nogoods++
			}
			if rerr.Incomplete {
				res.Incomplete = true
			}
			continue
		case derr != nil:
			return nil, fmt.Errorf("internal error: %w", derr)
		}
		t4 := time.Now()
		hard := timetable.HardViolations(timetable.Check(t, sched))
		res.Timings.Check += time.Since(t4)
		if len(hard) > 0 {
			msgs := make([]string, 0, len(hard))
			for i, v := range hard {
				if i == 10 {
					msgs = append(msgs, fmt.Sprintf("and %d more", len(hard)-10))
					break
				}
				msgs = append(msgs, v.Msg)
			}
			return nil, fmt.Errorf("%w:\n  %s", ErrCheckFailed, strings.Join(msgs, "\n  "))
		}
		res.Status = solver.Satisfiable
		res.Schedule = sched
		return finish(), nil
	}
	res.Status = solver.Unknown
	return finish(), nil
}
