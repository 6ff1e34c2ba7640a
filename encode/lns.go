package encode

import (
	"fmt"
	"math/rand/v2"
	"slices"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// Large-neighbourhood search (Shaw 1998). The incumbent is the best
// verified timetable. Each step frees a neighbourhood of sections and
// optimises them within a conflict budget on an engine of its own
// (Search.Derive): the part of the program the freed sections can change,
// partially evaluated on the incumbent's values of everything else (the
// other sections' starts and what depends on them alone), with only the
// weak constraints the freed sections can reach. Every model the engine finds
// goes through the gates, and one whose total cost is lower becomes the
// incumbent; room problems become cuts of the whole program. The neighbourhood size adapts: when the engine proves a
// neighbourhood optimal the next one grows, when the budget runs out first
// it shrinks. While the incumbent pays room cost, every other step is a
// room neighbourhood (lns_roomhood.go); after a stall the search restarts
// (lns_restart.go) or stops.

// Bounds of the neighbourhood size (sections).
const (
	lnsMinSize = 2
	lnsMaxSize = 60
)

// Neighbourhood kinds, tried in turn.
const (
	hoodCost    = iota // sections of a costly weak constraint's subject, plus related ones
	hoodPerson         // a staff member's or cohort's sections, chosen by their share of the cost
	hoodRelated        // a random section and the sections related to it
	hoodDay            // sections meeting on one day
	hoodRandom         // random sections
	hoodKinds
)

// lnsStream is the stream of neighbourhood search's random source before
// the first restart; restart k uses lnsStream+k (lns_restart.go).
const lnsStream = 0x6e656967

// lnsState is what neighbourhood search keeps between steps, and between
// the turns it takes with local search (so that a new turn goes on with
// the random stream and size where the last one stopped).
type lnsState struct {
	rng     *rand.Rand
	size    int
	base    int     // the starting size: restarts multiply it
	related [][]int // section -> sections sharing staff, cohorts, students or a relation
	people  [][]int // staff (then cohorts) -> sections
	nStaff  int
	restartState
}

// lnsInit returns the neighbourhood search state of the run, made on
// first use.
func (o *optRun) lnsInit() *lnsState {
	if o.ls != nil {
		return o.ls
	}
	n := len(o.t.Sections)
	ls := &lnsState{rng: rand.New(rand.NewPCG(uint64(o.opt.Seed), lnsStream)), nStaff: len(o.t.Staff)}
	ls.base = min(max(lnsMinSize, n/40), 12, n)
	ls.size, ls.factor = ls.base, 1
	o.indexRelated(ls)
	o.ls = ls
	return ls
}

// lns runs neighbourhood steps until ctx ends, the incumbent meets the
// bound, the step limit is reached, or the steps stall (MaxStall steps in
// a row without improvement) when no restart is allowed (mayRestart).
func (o *optRun) lns() error {
	n := len(o.t.Sections)
	if n < 2 {
		return nil
	}
	ls := o.lnsInit()
	stall := 0
	for {
		if stall >= o.stallLimit() {
			if !o.mayRestart() {
				break
			}
			o.restart(ls)
			stall = 0
		}
		if o.ctx.Err() != nil {
			o.res.Stopped = o.ctxStopped()
			return nil
		}
		if slices.Equal(o.best.total, o.bound) {
			o.res.Stopped = "optimal" // the bound is met: nothing can be better
			return nil
		}
		if o.opt.MaxSteps > 0 && o.res.Steps >= o.opt.MaxSteps {
			o.res.Stopped = "step limit"
			return nil
		}
		if stall >= shareStall || o.res.Steps%shareEvery == 0 {
			adopted, err := o.fromBoard()
			if err != nil {
				return err
			}
			if adopted {
				stall = 0
			}
		}
		o.res.Steps++
		kind := o.res.Steps % hoodKinds
		var secs, only []int
		if o.res.Steps%2 == 0 && o.roomPart() {
			secs, only = o.roomHood(ls) // every other step, while the incumbent pays room cost
		}
		if len(secs) == 0 {
			secs = o.neighbourhood(ls, kind)
		}
		before := o.best
		st, proven, complete, err := o.step(ls, secs, only)
		if err != nil {
			return err
		}
		if !complete {
			continue
		}
		if o.best != before {
			stall = 0
		} else {
			stall++
		}
		maxSize := ls.maxSize()
		switch {
		case st == solver.Satisfiable && proven:
			ls.size = min(ls.size+1+ls.size/8, maxSize)
		case ls.size > lnsMinSize:
			ls.size = max(ls.size-1-ls.size/8, lnsMinSize)
		}
		o.note(false)
	}
	o.res.Stopped = "no improvement"
	return nil
}

// step re-optimises the given sections with every other section fixed as
// in the incumbent, and reports whether the engine proved the
// neighbourhood's optimum.
func (o *optRun) step(ls *lnsState, free, only []int) (st solver.Status, proven, complete bool, err error) {
	isFree := make([]bool, len(o.t.Sections))
	for _, s := range free {
		isFree[s] = true
	}
	// Weak constraints the freed sections cannot reach are constants of
	// the step: leaving them out keeps the engine's weighted sums (and the
	// explanations of their propagations) to what can change.
	reach := o.reachable(isFree)
	keepWeak := func(i int) bool {
		for _, l := range o.p.Weaks[i].Body {
			if reach[l.Atom()] {
				return true
			}
		}
		return false
	}
	s, err := o.x.Derive(reach, keepWeak, o.opt.Seed+int64(o.res.Steps), o.best.model)
	if err != nil {
		return solver.Unknown, false, false, err
	}
	perturb := ls.perturb > 0
	if perturb || o.roomPart() {
		var rng *rand.Rand
		if perturb {
			ls.perturb--
			rng = ls.rng
		}
		if err := o.forbidIncumbent(s, only, rng); err != nil {
			return solver.Unknown, false, false, fmt.Errorf("internal error: %w", err)
		}
	}
	o.lastOnly, o.pending = len(o.p.Weaks) > GlobalWeakLimit, nil // on large terms the gates cost more than a step
	st, complete, err = o.x.Improve(o.ctx, s, nil, o.opt.StepConflicts*int64(max(ls.factor, 1)), -1, o.onModel)
	o.lastOnly = false
	if err == nil && o.pending != nil {
		ok, err := o.x.Settle(o.ctx, o.take(o.pending))
		if err != nil {
			return st, false, false, err
		}
		complete = complete && ok
	}
	return st, s.Proven(), complete, err
}

// reachable marks the atoms whose value may change when the free sections
// move: their start atoms, every atom of a choice rule that is not a start
// atom, and, through the rules, every head with such an atom in its body.
func (o *optRun) reachable(isFree []bool) []bool {
	n := o.p.NumAtoms()
	if o.uses == nil || len(o.uses) != n+1 {
		o.uses = make([][]int32, n+1)
		for i, r := range o.p.Rules {
			if r.Head == 0 {
				continue
			}
			for _, l := range r.Body {
				o.uses[l.Atom()] = append(o.uses[l.Atom()], int32(i))
			}
		}
	}
	reach := make([]bool, n+1)
	var queue []solver.Atom
	mark := func(a solver.Atom) {
		if !reach[a] {
			reach[a] = true
			queue = append(queue, a)
		}
	}
	for _, ch := range o.p.Choices {
		for _, a := range ch.Heads {
			if info := o.cat.AtomInfo(a); !isDecision(info.Kind) || isFree[info.Section] {
				mark(a)
			}
		}
	}
	for len(queue) > 0 {
		a := queue[len(queue)-1]
		queue = queue[:len(queue)-1]
		for _, i := range o.uses[a] {
			mark(o.p.Rules[i].Head)
		}
	}
	return reach
}

// indexRelated builds, once, the relatedness lists of neighbourhood search.
func (o *optRun) indexRelated(ls *lnsState) {
	t := o.t
	n := len(t.Sections)
	staffIdx, cohIdx := t.StaffIndex(), t.CohortIndex()
	ls.people = make([][]int, len(t.Staff)+len(t.Cohorts))
	for s, sec := range t.Sections {
		for _, id := range uniq(sec.Staff) {
			ls.people[staffIdx[id]] = append(ls.people[staffIdx[id]], s)
		}
		for _, id := range uniq(sec.Cohorts) {
			k := len(t.Staff) + cohIdx[id]
			ls.people[k] = append(ls.people[k], s)
		}
	}
	sets := make([]map[int]bool, n)
	link := func(a, b int) {
		if a == b {
			return
		}
		if sets[a] == nil {
			sets[a] = map[int]bool{}
		}
		if sets[b] == nil {
			sets[b] = map[int]bool{}
		}
		sets[a][b], sets[b][a] = true, true
	}
	for _, secs := range ls.people {
		for i := range secs {
			for _, b := range secs[i+1:] {
				link(secs[i], b)
			}
		}
	}
	secIdx := t.SectionIndex()
	byStudent := map[string][]int{}
	for _, e := range t.Enrolments {
		if s, ok := secIdx[e.Section]; ok {
			byStudent[e.Student] = append(byStudent[e.Student], s)
		}
	}
	for _, e := range t.Enrolments { // enrolment order keeps this deterministic
		secs := byStudent[e.Student]
		for i := range secs {
			for _, b := range secs[i+1:] {
				link(secs[i], b)
			}
		}
		delete(byStudent, e.Student)
	}
	for _, r := range t.Relations {
		for i, a := range r.Sections {
			for _, b := range r.Sections[i+1:] {
				sa, oka := secIdx[a]
				sb, okb := secIdx[b]
				if oka && okb {
					link(sa, sb)
				}
			}
		}
	}
	ls.related = make([][]int, n)
	for s, set := range sets {
		for b := range set {
			ls.related[s] = append(ls.related[s], b)
		}
		slices.Sort(ls.related[s])
	}
}

// neighbourhood picks ls.size sections by the given kind.
func (o *optRun) neighbourhood(ls *lnsState, kind int) []int {
	var seed []int
	switch kind {
	case hoodCost:
		seed = o.costlySubject(ls)
	case hoodPerson:
		seed = o.costlyPerson(ls)
	case hoodDay:
		seed = o.dayHood(ls)
	case hoodRandom:
		return ls.randomSections(len(o.t.Sections), ls.size)
	}
	if len(seed) == 0 {
		seed = []int{ls.rng.IntN(len(o.t.Sections))}
	}
	return ls.grow(seed, ls.size)
}

// grow returns up to size sections: a random part of seed, then sections
// related to those chosen (breadth first, random order), then random ones.
func (ls *lnsState) grow(seed []int, size int) []int {
	seed = slices.Clone(seed)
	ls.rng.Shuffle(len(seed), func(i, j int) { seed[i], seed[j] = seed[j], seed[i] })
	in := map[int]bool{}
	var out []int
	add := func(s int) {
		if !in[s] && len(out) < size {
			in[s] = true
			out = append(out, s)
		}
	}
	for _, s := range seed {
		add(s)
	}
	for i := 0; i < len(out) && len(out) < size; i++ {
		rel := slices.Clone(ls.related[out[i]])
		ls.rng.Shuffle(len(rel), func(a, b int) { rel[a], rel[b] = rel[b], rel[a] })
		for _, s := range rel {
			add(s)
		}
	}
	for _, s := range ls.randomSections(len(ls.related), size) {
		add(s)
	}
	return out
}

// randomSections picks k distinct sections out of n.
func (ls *lnsState) randomSections(n, k int) []int {
	k = min(k, n)
	perm := ls.rng.Perm(n)
	return perm[:k]
}

// costlySubject picks one weak constraint that the incumbent pays, with
// the highest level first and heavier weights more often, and returns the
// sections it is about.
func (o *optRun) costlySubject(ls *lnsState) []int {
	soft := o.cat.soft
	if soft == nil {
		return nil
	}
	in := make([]bool, o.p.NumAtoms()+1)
	for _, a := range o.best.model {
		in[a] = true
	}
	bestLevel := -1 << 31
	var total int64
	var picks []int
	for i, w := range o.p.Weaks {
		if i >= len(soft.subj) || soft.subj[i] == noSubject || w.Weight <= 0 || w.Level < bestLevel {
			continue
		}
		holds := true
		for _, l := range w.Body {
			if in[l.Atom()] == l.IsNeg() {
				holds = false
				break
			}
		}
		if !holds {
			continue
		}
		if w.Level > bestLevel {
			bestLevel, total, picks = w.Level, 0, picks[:0]
		}
		picks = append(picks, i)
		total += w.Weight
	}
	if total == 0 {
		return nil
	}
	r := ls.rng.Int64N(total)
	for _, i := range picks {
		if r -= o.p.Weaks[i].Weight; r < 0 {
			return ls.subjectSections(soft.subj[i])
		}
	}
	return nil
}

// subjectSections lists the sections of a weak constraint's subject.
func (ls *lnsState) subjectSections(subj int32) []int {
	if subj >= 0 {
		return []int{int(subj)}
	}
	return ls.people[-1-int(subj)]
}

// costlyPerson picks a staff member, cohort or section with a share of the
// incumbent's cost at its most important level (rooms included), heavier
// shares more often, and returns their sections.
func (o *optRun) costlyPerson(ls *lnsState) []int {
	rep := o.best.cost
	t := o.t
	type share struct {
		secs []int
		cost int64
	}
	var shares []share
	var total int64
	staffIdx, cohIdx, secIdx := t.StaffIndex(), t.CohortIndex(), t.SectionIndex()
	for _, id := range sortedKeys(rep.PerStaff) {
		if c := rep.PerStaff[id]; c > 0 {
			shares = append(shares, share{ls.people[staffIdx[id]], c})
			total += c
		}
	}
	for _, id := range sortedKeys(rep.PerCohort) {
		if c := rep.PerCohort[id]; c > 0 {
			shares = append(shares, share{ls.people[len(t.Staff)+cohIdx[id]], c})
			total += c
		}
	}
	for _, id := range sortedKeys(rep.PerSection) {
		if c := rep.PerSection[id]; c > 0 {
			shares = append(shares, share{[]int{secIdx[id]}, c})
			total += c
		}
	}
	if total == 0 {
		return nil
	}
	r := ls.rng.Int64N(total)
	for _, sh := range shares {
		if r -= sh.cost; r < 0 {
			return sh.secs
		}
	}
	return nil
}

// dayHood returns the sections meeting on a random day of the grid (or of
// the pattern sections' days). On terms with pattern sections, every other
// call keeps only the sections in one room that day (a room's meetings
// compete for it).
func (o *optRun) dayHood(ls *lnsState) []int {
	t := o.t
	var present timetable.DaySet
	for _, d := range t.Days() {
		present |= 1 << uint(d)
	}
	secIdx := t.SectionIndex()
	meets := func(pl timetable.Placement, s int) timetable.DaySet {
		if pl.Time > 0 {
			return t.Sections[s].Times[pl.Time-1].Days
		}
		if pl.Period >= 0 && pl.Period < len(t.Periods) {
			return 1 << uint(t.Periods[pl.Period].Day)
		}
		return 0
	}
	if o.cat.hasPatterns() {
		for _, pl := range o.best.sched.Placements {
			if s, ok := secIdx[pl.Section]; ok {
				present |= meets(pl, s)
			}
		}
	}
	var days []int
	if o.cat.hasPatterns() {
		for d := 0; d < 7; d++ {
			if present&(1<<uint(d)) != 0 {
				days = append(days, d)
			}
		}
	} else {
		for _, d := range t.Days() { // grid order, as before pattern sections
			days = append(days, int(d))
		}
	}
	if len(days) == 0 {
		return nil
	}
	d := days[ls.rng.IntN(len(days))]
	room := ""
	if o.cat.hasPatterns() && ls.rng.IntN(2) == 0 && len(o.best.sched.Placements) > 0 {
		room = o.best.sched.Placements[ls.rng.IntN(len(o.best.sched.Placements))].Room
	}
	var out []int
	for _, pl := range o.best.sched.Placements {
		s, ok := secIdx[pl.Section]
		if !ok || meets(pl, s)&(1<<uint(d)) == 0 || (room != "" && pl.Room != room) {
			continue
		}
		if !slices.Contains(out, s) {
			out = append(out, s)
		}
	}
	return out
}

// sortedKeys lists a map's keys in order (for deterministic choices).
func sortedKeys(m map[string]int64) []string {
	keys := make([]string, 0, len(m))
	for k := range m {
		keys = append(keys, k)
	}
	slices.Sort(keys)
	return keys
}
