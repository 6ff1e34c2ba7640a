package sectioning

import (
	"context"
	"errors"
	"math/rand/v2"

	"github.com/termwright/termwright/timetable"
)

// Options control Section.
type Options struct {
	Seed int64 // tie-breaking; the same term, timetable, options and seed give the same result
	// Keep is an earlier timetable: its sectioned students stay in their
	// sections where the rules and the new times allow ("moved students").
	Keep *timetable.Schedule
}

// Result is a sectioning of one timetable.
type Result struct {
	Enrolments []timetable.Enrolment // for Schedule.Enrolments, sorted by student then section
	Unplaced   []Unplaced            // requests met neither by their course nor by an alternative
	Moves      []Move                // with Keep: sectioned students whose section changed
}

// Unplaced is a request the sectioner could not meet, with the reason in
// one plain sentence (for example that every section of a part is full,
// or that each arrangement clashes with the student's other courses).
type Unplaced struct {
	Request int // index into Term.Requests
	Reason  string
}

// Move is one student's change of section in one course part against the
// kept timetable; From or To is "" when the student was not, or is no
// longer, in a section of that part.
type Move struct {
	Student, Course, From, To string
}

// Section seats the students of t's requests in the sections of s (whose
// Enrolments it ignores), honouring fixed enrolments (Term.Enrolments)
// and every seating rule, for the objective the package doc states
// (unplaced requests, priorities, alternatives, then moved students and
// clashes by the term's weights). It stops early, with the best
// sectioning so far, when ctx ends; the first seating (greedy with
// repair) is always completed. Small terms are solved exactly. The same
// term, timetable, options and seed give the same result.
func Section(ctx context.Context, t *timetable.Term, s *timetable.Schedule, opt Options) (*Result, error) {
	return section(ctx, t, s, opt, config{exact: true})
}

// config holds switches the tests use to reach one phase alone.
type config struct {
	exact bool // search small terms exhaustively after the heuristic
}

func section(ctx context.Context, t *timetable.Term, s *timetable.Schedule, opt Options, cfg config) (*Result, error) {
	if t == nil || s == nil {
		return nil, errors.New("sectioning: a term and a finished timetable are needed")
	}
	p := newProblem(t, s)
	if opt.Keep != nil {
		p.setKept(opt.Keep)
	}
	rng := rand.New(rand.NewPCG(uint64(opt.Seed), 0x5ec7))
	sr := newSearcher(p)
	rep := newRepairer(p, sr)
	p.seatKept(sr)
	p.greedy(sr, rng, rep)
	p.improve(ctx, sr, rep, rng)
	if cfg.exact {
		p.exact(ctx)
	}
	return p.result(opt.Keep), nil
}
