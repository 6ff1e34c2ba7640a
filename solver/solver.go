package solver

import (
	"fmt"
	"math/rand/v2"
	"slices"
)

// Solver searches for stable models of one program and grows between
// searches (AddClause, AddBound, AddWeightSum, AddAtoms). It is not safe for
// concurrent use; clones are independent of it. Create it with New or
// Clone.
type Solver struct {
	opts Options    // validated tuning constants
	pcg  *rand.PCG  // state of rng's source (copied by Clone)
	rng  *rand.Rand // random choices: initial activities, random decisions

	numAtoms int    // the program's atoms are variables 1..numAtoms
	added    []bool // per variable up to the last atom made by AddAtoms: true for those atoms (empty when none)
	numVars  int    // variables are 1..numVars: atoms, body variables, auxiliaries
	ok       bool   // false once the clauses are unsatisfiable at level 0 (permanent)
	building bool   // true inside New: watches and card occurrences are indexed once at the end

	// Assignment.
	vals     []int8   // per literal: +1 true, -1 false, 0 unassigned; vals[p] == -vals[p^1]
	level    []int32  // per variable: decision level of its assignment (valid while assigned)
	reason   []uint32 // per variable: why it was implied (reason.go); 0 for decisions and after compaction at level 0
	trailPos []int32  // per variable: index of its literal in trail (valid while assigned)
	trail    []Lit    // assigned literals in assignment order
	trailLim []int32  // trailLim[d-1] is the trail index where decision level d starts
	qhead    int      // trail[:qhead] has been propagated through clauses and cardinality counters

	// Clauses.
	arena      []Lit     // clause arena (arena.go); offsets 0 and 1 are unused so that 0 means "no clause"
	watches    [][]watch // per literal p: clauses whose first or second literal is p
	learnts    []uint32  // offsets of deletable learned clauses, oldest first
	numClauses int       // live clauses in the arena (original and learned)
	wasted     int       // arena words held by deleted clauses, reclaimed by compaction

	// Branching.
	activity []float64 // per variable: VSIDS activity (scaled by varInc)
	varInc   float64   // current bump amount; grows by 1/VarDecay per conflict
	order    varHeap   // unassigned decision variables by activity (may also hold assigned ones)
	polarity []bool    // per variable: saved phase, true = try the positive literal first

	// Cardinality constraints (cardinality.go).
	cards    []card     // counting constraints
	cardLits []Lit      // members of all cards, card k owns cardLits[cards[k].start:][:cards[k].n]
	cardOcc  [][]uint32 // per literal p: occurrences k<<2|tag of constraints affected when p becomes true

	// Weighted sums for optimisation (weightsum.go).
	sums   []wsum     // weighted-sum upper bounds
	parts  sumParts   // members of the weighted sums
	sumOcc [][]uint32 // per literal p: member index i<<1 of every member p, and k<<1|1 for sums with condition p

	// Unfounded sets (unfounded.go); nil when the program is tight.
	ufs *unfounded

	// Conflict analysis scratch (analyze.go).
	conflict       []Lit    // literals of the current conflict, all false
	seen           []uint8  // per variable: analysis marks, cleared through analyzeToClear
	analyzeLearnt  []Lit    // the clause being learned; [0] is the asserting literal
	analyzeStack   []Lit    // work stack of litRedundant
	analyzeToClear []Lit    // literals whose seen mark must be reset
	levelStamp     []uint32 // per decision level: last stamp for counting distinct levels (LBD)
	stamp          uint32   // current stamp for levelStamp
	explArena      []Lit    // lazily built explanations: a length word then the literals
	explIndex      []uint32 // per variable: 1 + offset of its explanation in explArena, 0 = none
	explVars       []uint32 // variables with an explanation in explArena (to reset explIndex)

	// Assumptions and results.
	assumptions []Lit     // assumptions of the current search, user ones first
	pending     []Lit     // assumptions given by Assume for the next call
	err         error     // misuse found by the last Solve, Enumerate or Optimize call (see Err)
	userAssume  int       // assumptions[:userAssume] came from the caller
	core        []Lit     // after Unsatisfiable under assumptions: failed user assumptions
	failed      []Lit     // after a failed assumption: every assumption literal involved (user and internal)
	model       []bool    // per atom (program atoms, then up to the last added atom): value in the last model
	hasModel    bool      // model holds a model
	trueLit     Lit       // a literal true at level 0 (0 until needed)
	weaks       []weakLit // weak constraints as literals (completion.go)
	levels      []int     // distinct levels of the program's weak constraints, highest first

	// Optimisation results (optimize.go).
	lower  []int64 // proven lower bound per level of the last Optimize call
	proven bool    // the last Optimize call proved its best cost optimal

	// Restarts and reductions (search.go, reduce.go).
	lbdQueue     []int   // LBDs of the most recent learned clauses (ring buffer)
	lbdQueueHead int     // next slot of lbdQueue
	lbdQueueFull bool    // lbdQueue holds GlucoseWindow values
	lbdQueueSum  int64   // sum of lbdQueue
	lbdSum       float64 // sum of all LBDs learned
	lbdCount     int64   // number of LBDs in lbdSum
	lubyIndex    int     // restarts done by the Luby policy
	nextReduce   int64   // conflict count of the next learned-clause reduction
	reduceIncr   int64   // current interval between reductions
	simpTrail    int     // level-0 trail length at the last compaction
	budgetEnd    int64   // Stats.Conflicts value at which search returns Unknown (0 = no limit)

	stats    Stats       // counters since creation
	progress func(Stats) // called at restarts (may be nil)
}

// weakLit is a weak constraint reduced to one literal that holds iff its
// body holds.
type weakLit struct {
	lit    Lit   // body literal (0: the body is always true)
	weight int64 // cost when lit holds (positive)
	level  int   // priority level
}

// value returns +1, -1 or 0 for literal p.
func (s *Solver) value(p Lit) int8 { return s.vals[p] }

func (s *Solver) decisionLevel() int { return len(s.trailLim) }

// newVar adds a variable and returns it; all per-variable and per-literal
// tables grow.
func (s *Solver) newVar() uint32 {
	s.numVars++
	v := uint32(s.numVars)
	s.vals = append(s.vals, 0, 0)
	s.level = append(s.level, 0)
	s.reason = append(s.reason, 0)
	s.trailPos = append(s.trailPos, 0)
	s.watches = append(s.watches, nil, nil)
	s.activity = append(s.activity, 0)
	s.polarity = append(s.polarity, false)
	s.cardOcc = append(s.cardOcc, nil, nil)
	s.sumOcc = append(s.sumOcc, nil, nil)
	s.seen = append(s.seen, 0)
	s.explIndex = append(s.explIndex, 0)
	s.levelStamp = append(s.levelStamp, 0)
	if s.opts.Seed != 0 {
		s.activity[v] = s.rng.Float64() * 1e-5
	}
	s.order.grow(v)
	s.order.insert(v)
	if cap(s.trail) < s.numVars {
		t := make([]Lit, len(s.trail), 2*s.numVars)
		copy(t, s.trail)
		s.trail = t
	}
	return v
}

// reserve makes room for n variables in every per-variable and per-literal
// table so that creating them does not copy the tables repeatedly.
func (s *Solver) reserve(n int) {
	s.vals = slices.Grow(s.vals, 2*n+2-len(s.vals))
	s.level = slices.Grow(s.level, n+1-len(s.level))
	s.reason = slices.Grow(s.reason, n+1-len(s.reason))
	s.trailPos = slices.Grow(s.trailPos, n+1-len(s.trailPos))
	s.watches = slices.Grow(s.watches, 2*n+2-len(s.watches))
	s.activity = slices.Grow(s.activity, n+1-len(s.activity))
	s.polarity = slices.Grow(s.polarity, n+1-len(s.polarity))
	s.cardOcc = slices.Grow(s.cardOcc, 2*n+2-len(s.cardOcc))
	s.sumOcc = slices.Grow(s.sumOcc, 2*n+2-len(s.sumOcc))
	s.seen = slices.Grow(s.seen, n+1-len(s.seen))
	s.explIndex = slices.Grow(s.explIndex, n+1-len(s.explIndex))
	s.levelStamp = slices.Grow(s.levelStamp, n+1-len(s.levelStamp))
	s.order.index = slices.Grow(s.order.index, n+1-len(s.order.index))
	s.order.heap = slices.Grow(s.order.heap, n-len(s.order.heap))
	s.trail = slices.Grow(s.trail, n-len(s.trail))
}

// initTables sizes the tables for variable 0 (unused).
func (s *Solver) initTables() {
	s.vals = make([]int8, 2, 1024)
	s.level = []int32{0}
	s.reason = []uint32{0}
	s.trailPos = []int32{0}
	s.watches = make([][]watch, 2)
	s.activity = []float64{0}
	s.polarity = []bool{false}
	s.cardOcc = make([][]uint32, 2)
	s.sumOcc = make([][]uint32, 2)
	s.seen = []uint8{0}
	s.explIndex = []uint32{0}
	s.levelStamp = []uint32{0}
	s.order.activity = &s.activity
	s.order.grow(0)
	s.arena = make([]Lit, 2, 1024)
	s.varInc = 1
}

// assign makes p true with the given reason at the current level.
func (s *Solver) assign(p Lit, r uint32) {
	v := p >> 1
	s.vals[p] = 1
	s.vals[p^1] = -1
	s.level[v] = int32(len(s.trailLim))
	s.reason[v] = r
	s.trailPos[v] = int32(len(s.trail))
	s.trail = append(s.trail, p)
}

func (s *Solver) newDecisionLevel() { s.trailLim = append(s.trailLim, int32(len(s.trail))) }

// cancelUntil undoes every assignment above decision level lvl, restoring
// counters of the propagators, saving phases and re-queueing variables.
func (s *Solver) cancelUntil(lvl int) {
	if s.decisionLevel() <= lvl {
		return
	}
	start := int(s.trailLim[lvl])
	for i := len(s.trail) - 1; i >= start; i-- {
		p := s.trail[i]
		v := uint32(p >> 1)
		if i < s.qhead {
			s.undoCounters(p)
		}
		s.vals[p] = 0
		s.vals[p^1] = 0
		s.polarity[v] = p&1 == 0
		s.order.insert(v)
		if s.ufs != nil && int(v) <= s.numAtoms {
			s.ufs.unassigned(v)
		}
	}
	s.trail = s.trail[:start]
	s.trailLim = s.trailLim[:lvl]
	if s.qhead > start {
		s.qhead = start
	}
}

// undoCounters reverts the counter updates made when p was propagated.
func (s *Solver) undoCounters(p Lit) {
	for _, o := range s.cardOcc[p] {
		c := &s.cards[o>>2]
		switch o & 3 {
		case occTrue:
			c.nTrue--
		case occFalse:
			c.nFalse--
		}
	}
	for _, o := range s.sumOcc[p] {
		if o&1 == 0 {
			s.sums[s.parts.of[o>>1]].sumTrue -= s.parts.w[o>>1]
		}
	}
}

// Assume sets assumptions for the next Solve, Enumerate or Optimize call
// only: Pos(a) assumes a true, Neg(a) assumes a false. Calls accumulate until
// the next search call consumes them.
func (s *Solver) Assume(lits ...Lit) { s.pending = append(s.pending, lits...) }

// takeAssumptions returns and clears the pending user assumptions, checking
// their atoms, and sets s.err: an error wrapping ErrProgram when one refers
// to no atom (then the returned slice is nil and the last model and core
// are forgotten, as by a call that found nothing), nil otherwise. call
// names the public method for the message.
func (s *Solver) takeAssumptions(call string) ([]Lit, error) {
	a := append([]Lit(nil), s.pending...)
	s.pending = s.pending[:0]
	s.err = nil
	for _, p := range a {
		if !s.isAtom(p.Atom()) {
			s.err = fmt.Errorf("%w: %s: an assumption refers to atom %d, which is neither an atom of the program (it has %d) nor one made by AddAtoms",
				ErrProgram, call, p.Atom(), s.numAtoms)
			s.core = s.core[:0]
			s.hasModel = false
			return nil, s.err
		}
	}
	return a, nil
}

// Err returns the misuse found by the last Solve, Enumerate or Optimize
// call, nil when there was none: an error wrapping ErrProgram when an
// assumption named no atom (that call then returned without searching:
// Unknown, or 0 and false from Enumerate). Optimize also returns it
// directly.
func (s *Solver) Err() error { return s.err }

// isAtom reports whether a is an atom of the program or one made by
// AddAtoms.
func (s *Solver) isAtom(a Atom) bool {
	return a >= 1 && (int(a) <= s.numAtoms || int(a) < len(s.added) && s.added[a])
}

// Model appends the true atoms of the program in the last stable model to
// dst in ascending order (atoms made by AddAtoms are left out: read them
// with Value), so the result can be checked with Verify against the
// program. It appends nothing when no model was found by the last call.
func (s *Solver) Model(dst []Atom) []Atom {
	if !s.hasModel {
		return dst
	}
	for a := 1; a <= s.numAtoms; a++ {
		if s.model[a] {
			dst = append(dst, Atom(a))
		}
	}
	return dst
}

// Value reports whether atom a (of the program or made by AddAtoms) is true
// in the last model (false when there is none or a names no atom).
func (s *Solver) Value(a Atom) bool {
	return s.hasModel && s.isAtom(a) && int(a) < len(s.model) && s.model[a]
}

// Core appends to dst, after a call that returned Unsatisfiable under
// assumptions, a subset of those assumptions that is unsatisfiable by
// itself. It appends nothing when the program has no model at all.
func (s *Solver) Core(dst []Lit) []Lit { return append(dst, s.core...) }

// Stats returns a copy of the work counters.
func (s *Solver) Stats() Stats { return s.stats }

// SetPhase sets the polarity tried first when branching on atom a (of the
// program or made by AddAtoms; value true tries a true). Later phase saving
// may change it. Other values of a are ignored.
func (s *Solver) SetPhase(a Atom, value bool) {
	if s.isAtom(a) {
		s.polarity[a] = value
	}
}

// SetProgress installs a callback called at every restart with the current
// statistics; nil removes it.
func (s *Solver) SetProgress(fn func(Stats)) { s.progress = fn }

// NumAtoms returns the number of atoms of the program the solver was built
// from (atoms made by AddAtoms are not counted: they are numbered after
// the engine's internal variables).
func (s *Solver) NumAtoms() int { return s.numAtoms }

// saveModel copies the atom values of the current total assignment: the
// program's atoms and, when there are added atoms, every variable up to the
// last of them (internal variables among them are copied but never read).
func (s *Solver) saveModel() {
	n := max(s.numAtoms, len(s.added)-1)
	if len(s.model) != n+1 {
		s.model = make([]bool, n+1)
	}
	for a := 1; a <= n; a++ {
		s.model[a] = s.vals[Pos(Atom(a))] == 1
	}
	s.hasModel = true
}
