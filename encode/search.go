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

// Search owns the search of one compiled model (a program with its
// catalog): one live engine, solved under assumptions; every model through
// solver.Verify, Decode and timetable.Check (Gates); room problems that
// Decode finds turned into cuts (Cut) that are added to the program and to
// the live engine; and the phases of a new engine taken from a model
// (Prefer). Solve, the optimiser's phases and neighbourhood steps and every
// explanation check are short callers of it.
//
// The program is the record of what has been added: a cut is always
// written into it (so that Verify and every later engine see it), and an
// engine catches up with it before each call (sync): a new integrity
// constraint becomes a clause, a new fact atom (the selector of a room
// family added in normal mode) is dropped from the conditions it appears
// in and added to every model, a new bound (a room family's Hall bounds)
// becomes a native cardinality bound (solver.Solver.AddBound), and
// anything the live engine cannot take (a new choice or weak constraint:
// the selector of a family added in Explain mode) makes it rebuild,
// starting from the preferred model's phases.
//
// Several Searches may share one program (the optimiser's hard-only
// search and its whole-term search); each catches up on its own. A Search
// is not safe for concurrent use.
type Search struct {
	t     *timetable.Term
	p     *solver.Program
	cat   *Catalog
	view  func(*solver.Program) *solver.Program // the program the engine is built from; nil: p itself
	opts  solver.Options
	tally *Result // counters and timings, shared by the Searches of one run

	progress func(solver.Stats)
	improve  func(*timetable.Schedule) *timetable.Schedule

	s      *solver.Solver
	mark   programMark   // the part of p that s holds
	facts  []solver.Atom // atoms of p beyond s that are facts, added to every model
	isFact map[solver.Atom]bool
	prefer []solver.Atom // model whose start atoms a new engine tries first
	kept   []solver.Atom // the incumbent (Keep); nil: none
	builds int           // engines built
	index  stmtIndex     // statements by atom, for the programs of neighbourhood steps
}

// SearchOptions configure a Search.
type SearchOptions struct {
	Engine solver.Options // engine options (seed, conflict limit)
	// HardOnly builds engines from Catalog.HardProgram of the program: no
	// weak constraints and none of the soft criteria's auxiliary atoms.
	HardOnly bool
	Progress func(solver.Stats) // optional, given to every engine
	// Improve, when set, improves the rooms of every decoded timetable
	// before it is checked (the optimiser's room search).
	Improve func(*timetable.Schedule) *timetable.Schedule
	// Tally receives the search's counters and timings (Rounds, HallCuts,
	// Nogoods, Incomplete, Engine, Timings); nil keeps them private.
	Tally *Result
}

// Programs with more than largeProgram atoms (a whole university's term)
// are searched for a first timetable with rare restarts (Luby with unit
// largeLubyUnit conflicts): there every restart re-decides hundreds of
// thousands of atoms, and the first model needs only a few thousand
// conflicts. Measured on the 10,000-section generated term (shared 2-core
// machine): the default glucose restarts reached 42 restarts and no model
// in 5 minutes, Luby with unit 1000 found one after 74 s with 2 restarts.
const (
	largeProgram  = 500_000
	largeLubyUnit = 1000
)

// firstTimetableOptions tunes engine options for the search of a first
// timetable of program p.
func firstTimetableOptions(opts solver.Options, p *solver.Program) solver.Options {
	if p.NumAtoms() > largeProgram {
		opts.Restarts, opts.LubyUnit = solver.RestartLuby, largeLubyUnit
	}
	return opts
}

// programMark is how far into a program's statements an engine has read.
type programMark struct {
	atoms, rules, choices, bounds, weaks int
}

func markOf(p *solver.Program) programMark {
	return programMark{p.NumAtoms(), len(p.Rules), len(p.Choices), len(p.Bounds), len(p.Weaks)}
}

// NewSearch makes the search of program p compiled from term t with
// catalog cat. The engine is built on first use.
func NewSearch(t *timetable.Term, p *solver.Program, cat *Catalog, opt SearchOptions) *Search {
	x := &Search{t: t, p: p, cat: cat, opts: opt.Engine, tally: opt.Tally, progress: opt.Progress, improve: opt.Improve}
	if x.tally == nil {
		x.tally = &Result{}
	}
	if opt.HardOnly {
		x.view = cat.HardProgram
	}
	return x
}

// Program returns the program searched (it grows with cuts) and its catalog.
func (x *Search) Program() (*solver.Program, *Catalog) { return x.p, x.cat }

// Builds is the number of engines built so far.
func (x *Search) Builds() int { return x.builds }

// Prefer makes every engine built from now on try the start atoms of model
// first (true for those in it, false for the others): most of a timetable
// stays right after a cut.
func (x *Search) Prefer(model []solver.Atom) { x.prefer = model }

// Keep records model as the incumbent: a timetable that passed every
// gate, rooms included. Forbid then leaves out the start combinations
// the incumbent itself holds — an unproved room conflict on them is
// refuted by the incumbent's rooms — so the program never loses the
// incumbent (the steps of neighbourhood search assume it is a model).
func (x *Search) Keep(model []solver.Atom) { x.kept = model }

// refutedByIncumbent reports whether the incumbent, as atom values,
// breaks clause (every literal false in it).
func refutedByIncumbent(kept []bool, clause []solver.Lit) bool {
	for _, l := range clause {
		a := int(l.Atom())
		v := a < len(kept) && kept[a]
		if v != l.IsNeg() {
			return false
		}
	}
	return true
}

// Engine returns the live engine, caught up with the program: built when
// there is none or when the program grew in a way the engine cannot take.
func (x *Search) Engine() (*solver.Solver, error) {
	if x.s != nil {
		ok, err := x.sync()
		if err != nil {
			return nil, err
		}
		if ok {
			return x.s, nil
		}
	}
	if err := x.build(); err != nil {
		return nil, err
	}
	return x.s, nil
}

// build makes a new engine from the program (or its view).
func (x *Search) build() error {
	t0 := time.Now()
	defer func() {
		x.tally.Timings.Solve += time.Since(t0)
		x.tally.Timings.Build += time.Since(t0)
	}()
	q := x.p
	if x.view != nil {
		q = x.view(x.p)
	}
	s, err := solver.New(q, x.opts)
	if err != nil {
		return fmt.Errorf("internal error: the engine rejects the compiled program: %w", err)
	}
	if x.progress != nil {
		s.SetProgress(x.progress)
	}
	if x.prefer != nil {
		setStartPhases(s, x.cat, x.p.NumAtoms(), x.prefer)
	}
	x.s, x.mark, x.facts, x.isFact = s, markOf(x.p), nil, nil
	x.builds++
	return nil
}

// setStartPhases makes engine s try model's start atoms first.
func setStartPhases(s *solver.Solver, cat *Catalog, numAtoms int, model []solver.Atom) {
	in := make([]bool, numAtoms+1)
	for _, a := range model {
		if int(a) <= numAtoms {
			in[a] = true
		}
	}
	n := min(numAtoms, s.NumAtoms())
	for a := solver.Atom(1); int(a) <= n; a++ {
		if isDecision(cat.AtomInfo(a).Kind) {
			s.SetPhase(a, in[a])
		}
	}
}

// sync gives the live engine what was added to the program since it read
// it. It reports false when the engine must be rebuilt instead.
func (x *Search) sync() (bool, error) {
	p, m := x.p, x.mark
	if markOf(p) == m {
		return true, nil
	}
	if len(p.Choices) != m.choices || len(p.Weaks) != m.weaks {
		return false, nil
	}
	n := solver.Atom(x.s.NumAtoms())
	for _, r := range p.Rules[m.rules:] {
		if r.Head != 0 {
			if r.Head > n && len(r.Body) == 0 {
				if x.isFact == nil {
					x.isFact = map[solver.Atom]bool{}
				}
				x.isFact[r.Head] = true
				x.facts = append(x.facts, r.Head)
				continue
			}
			return false, nil
		}
		clause, need, ok := x.liveLits(r.Body, n)
		if !ok {
			return false, nil
		}
		if !need {
			continue
		}
		for i, l := range clause {
			clause[i] = l.Not()
		}
		if err := x.s.AddClause(clause...); err != nil {
			return false, fmt.Errorf("internal error: adding a cut: %w", err)
		}
	}
	for _, b := range p.Bounds[m.bounds:] {
		cond, need, ok := x.liveLits(b.Cond, n)
		if !ok {
			return false, nil
		}
		if !need {
			continue
		}
		if err := x.s.AddBound(b.Lits, b.Lower, b.Upper, cond...); err != nil {
			return false, fmt.Errorf("internal error: adding a room family: %w", err)
		}
	}
	x.mark = markOf(p)
	return true, nil
}

// liveLits rewrites a conjunction for the live engine: a literal on a fact
// atom it lacks is dropped when positive (it holds) and makes the whole
// conjunction false when negative (need is then false). ok is false when a
// literal names an atom the engine lacks that is no fact.
func (x *Search) liveLits(lits []solver.Lit, n solver.Atom) (out []solver.Lit, need, ok bool) {
	out = make([]solver.Lit, 0, len(lits))
	for _, l := range lits {
		if l.Atom() <= n {
			out = append(out, l)
			continue
		}
		if !x.isFact[l.Atom()] {
			return nil, false, false
		}
		if l.IsNeg() {
			return nil, false, true
		}
	}
	return out, true, true
}

// Solve runs one engine call under the given assumptions (not counted as
// a round: Find's rounds and Improve's calls are).
func (x *Search) Solve(ctx context.Context, assume ...solver.Lit) (solver.Status, error) {
	s, err := x.Engine()
	if err != nil {
		return solver.Unknown, err
	}
	t0 := time.Now()
	before := s.Stats()
	s.Assume(assume...)
	st := s.Solve(ctx)
	x.tally.Timings.Solve += time.Since(t0)
	x.tally.Engine = x.tally.Engine.Add(s.Stats().Since(before))
	return st, nil
}

// optimizeOn runs solver.Optimize on engine s (the live one or one
// derived from it), counting its work in the tally.
func (x *Search) optimizeOn(ctx context.Context, s *solver.Solver, assume []solver.Lit, conflicts, coreBudget int64, onModel func(cost []int64, model []solver.Atom)) (solver.Status, error) {
	s.SetConflictLimit(conflicts)
	s.SetCoreBudget(coreBudget)
	s.Assume(assume...)
	t0 := time.Now()
	before := s.Stats()
	x.tally.Rounds++
	live := s == x.s // a derived engine holds every atom of the program
	st, _, err := s.Optimize(ctx, func(cost []int64, model []solver.Atom) {
		if live {
			model = x.withFacts(model)
		}
		onModel(cost, model)
	})
	x.tally.Timings.Solve += time.Since(t0)
	x.tally.Engine = x.tally.Engine.Add(s.Stats().Since(before))
	if err != nil {
		return st, fmt.Errorf("internal error: %w", err)
	}
	return st, nil
}

// Improve runs one solver.Optimize call under the given assumptions and
// budgets (conflicts; coreBudget as solver.Solver.SetCoreBudget) on the
// live engine, or on d when given (an engine from Derive), and puts every
// improving model (as a model of the program) through gate. A gate error stops the call: a room
// problem becomes a cut, an ended ctx ends it, any other error is
// returned. complete reports that the call ran to its end.
func (x *Search) Improve(ctx context.Context, d *Derived, assume []solver.Lit, conflicts, coreBudget int64, gate Gate) (st solver.Status, complete bool, err error) {
	if d == nil {
		s, err := x.Engine()
		if err != nil {
			return solver.Unknown, false, err
		}
		d = &Derived{s: s}
	}
	cctx, cancel := context.WithCancel(ctx)
	defer cancel()
	var stop error
	st, err = x.optimizeOn(cctx, d.s, assume, conflicts, coreBudget, func(_ []int64, model []solver.Atom) {
		if stop == nil {
			if stop = gate(ctx, d.whole(model)); stop != nil {
				cancel()
			}
		}
	})
	if err != nil {
		return st, false, err
	}
	ok, err := x.Settle(ctx, stop)
	return st, ok && ctx.Err() == nil, err
}

// Settle handles a gate's verdict outside Find: nil settles it; a room
// problem becomes a cut and an ended ctx ends the search (both unsettled,
// no error); any other error is returned.
func (x *Search) Settle(ctx context.Context, err error) (bool, error) {
	switch {
	case err == nil:
		return true, nil
	case errors.Is(err, errSearchAgain) || x.Cut(err):
		return false, nil
	case ctx.Err() != nil && errors.Is(err, ctx.Err()):
		return false, nil
	}
	return false, err
}

// Model returns the live engine's last model as a model of the program.
func (x *Search) Model() []solver.Atom { return x.withFacts(x.s.Model(nil)) }

// withFacts adds the facts the engine lacks to one of its models.
func (x *Search) withFacts(model []solver.Atom) []solver.Atom {
	if len(x.facts) == 0 {
		return model
	}
	return append(model, x.facts...)
}

// Value reports atom a's value in the live engine's last model.
func (x *Search) Value(a solver.Atom) bool {
	if int(a) > x.s.NumAtoms() {
		return x.isFact[a]
	}
	return x.s.Value(a)
}

// Core returns the live engine's last unsatisfiable core.
func (x *Search) Core() []solver.Lit { return x.s.Core(nil) }

// Gates puts a model through solver.Verify, Decode (within ctx: the exact
// room searches stop when it ends), the Improve option and
// timetable.Check. Room problems come
// back as *HallError or *RoomConflictError (Cut turns them into cuts), an
// ended ctx as its error, a failed check as an error wrapping
// ErrCheckFailed.
func (x *Search) Gates(ctx context.Context, model []solver.Atom) (*timetable.Schedule, error) {
	t0 := time.Now()
	verr := solver.Verify(x.p, model)
	x.tally.Timings.Verify += time.Since(t0)
	if verr != nil {
		return nil, fmt.Errorf("internal error: the engine's model fails the verifier: %w", verr)
	}
	t1 := time.Now()
	sched, err := DecodeContext(ctx, x.t, x.cat, model)
	if err == nil && x.improve != nil {
		sched = x.improve(sched)
	}
	x.tally.Timings.Decode += time.Since(t1)
	var herr *HallError
	var rerr *RoomConflictError
	switch {
	case err == nil:
	case errors.As(err, &herr), errors.As(err, &rerr), ctx.Err() != nil && errors.Is(err, ctx.Err()):
		return nil, err
	default:
		return nil, fmt.Errorf("internal error: %w", err)
	}
	return sched, x.Check(sched)
}

// Check runs timetable.Check on a decoded timetable; a hard violation is
// an error wrapping ErrCheckFailed.
func (x *Search) Check(sched *timetable.Schedule) error {
	t0 := time.Now()
	hard := timetable.HardViolations(timetable.Check(x.t, sched))
	x.tally.Timings.Check += time.Since(t0)
	if len(hard) == 0 {
		return nil
	}
	msgs := make([]string, 0, len(hard))
	for i, v := range hard {
		if i == 10 {
			msgs = append(msgs, fmt.Sprintf("and %d more", len(hard)-10))
			break
		}
		msgs = append(msgs, v.Msg)
	}
	return fmt.Errorf("%w:\n  %s", ErrCheckFailed, strings.Join(msgs, "\n  "))
}

// Cut turns a room problem found by Decode into a cut: the room sets of a
// *HallError become room families, the start combinations of a
// *RoomConflictError become clauses. It reports whether err was such a
// problem; the cut reaches the engine before its next call.
func (x *Search) Cut(err error) bool {
	var herr *HallError
	var rerr *RoomConflictError
	switch {
	case errors.As(err, &herr):
		x.AddFamilies(herr)
		return true
	case errors.As(err, &rerr):
		x.Forbid(rerr, -1, "room conflict", nil)
		return true
	}
	return false
}

// AddFamilies adds the room sets of a Hall violation as room families
// (each its own requirement group) and returns how many were new.
func (x *Search) AddFamilies(herr *HallError) int {
	n := x.cat.addHallFamilies(x.p, herr)
	x.tally.HallCuts += n
	return n
}

// Forbid adds a clause per start combination of a room conflict, in the
// given group (-1 for none) and bound kind, holding while every literal of
// guard holds.
func (x *Search) Forbid(rerr *RoomConflictError, group int, kind string, guard []solver.Lit) {
	if x.kept != nil {
		// Forbid is rare (a room cut), accepting a timetable is not: the
		// incumbent's values are laid out here, not in Keep.
		kept := make([]bool, x.p.NumAtoms()+1)
		for _, a := range x.kept {
			if int(a) < len(kept) {
				kept[a] = true
			}
		}
		keep := rerr.nogoods[:0:0]
		for _, ng := range rerr.nogoods {
			if !refutedByIncumbent(kept, ng) {
				keep = append(keep, ng)
			}
		}
		if len(keep) < len(rerr.nogoods) {
			x.tally.Incomplete = true // the conflict was not what it claimed
			cp := *rerr
			cp.nogoods = keep
			rerr = &cp
		}
	}
	x.cat.forbidRooms(x.p, rerr, group, kind, guard)
	x.tally.Nogoods += len(rerr.nogoods)
	if rerr.Incomplete {
		x.tally.Incomplete = true
	}
}

// Gate is a caller's test of a model in Find: nil accepts it; a room
// problem (*HallError, *RoomConflictError) makes Find cut and search
// again, and so does errSearchAgain (the gate added its own cuts); an
// ended ctx's error makes Find report Unknown; any other error ends Find.
type Gate func(ctx context.Context, model []solver.Atom) error

// errSearchAgain is returned by a Gate that has added cuts itself.
var errSearchAgain = errors.New("search again")

// Find searches until a model passes the gate: solve under the literals
// assume returns (nil: none), then
// the gate; after a room problem it cuts, prefers the model's starts for a
// rebuilt engine and searches again, for at most maxRounds rounds
// (Unknown after that). It returns Satisfiable with the accepted model,
// or the engine's Unsatisfiable or Unknown.
func (x *Search) Find(ctx context.Context, assume func() []solver.Lit, gate Gate, maxRounds int) (solver.Status, []solver.Atom, error) {
	for round := 0; round < maxRounds; round++ {
		if ctx.Err() != nil {
			return solver.Unknown, nil, nil
		}
		x.tally.Rounds++
		var lits []solver.Lit
		if assume != nil {
			lits = assume() // again each round: cuts may add groups to assume
		}
		st, err := x.Solve(ctx, lits...)
		if err != nil || st != solver.Satisfiable {
			return st, nil, err
		}
		model := x.Model()
		err = gate(ctx, model)
		switch {
		case err == nil:
			return solver.Satisfiable, model, nil
		case errors.Is(err, errSearchAgain) || x.Cut(err):
			x.Prefer(model)
		case ctx.Err() != nil && errors.Is(err, ctx.Err()):
			return solver.Unknown, nil, nil
		default:
			return solver.Unknown, nil, err
		}
	}
	return solver.Unknown, nil, nil
}
