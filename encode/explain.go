package encode

import (
	"errors"
	"fmt"
	"slices"
	"strings"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// Group kinds that an Explainer adds to those of Compile.
const (
	// KindRequest is a registrar's request: a section meets at a given
	// start period (and room). It is never relaxed.
	KindRequest = "request"
	// KindSection says that a section is scheduled at all: its meetings per
	// week. It is never relaxed; minimal conflicts use it to name exactly
	// the sections involved.
	KindSection = "section"
	// KindRoomAssignment covers the room combinations that Decode proved
	// impossible (meetings that need one room for several periods, week
	// patterns, same-room relations); see RoomConflictError.
	KindRoomAssignment = "room assignment"
)

// groupRole says how an explanation treats a group.
type groupRole uint8

const (
	roleRequirement groupRole = iota // a requirement of the term: may be relaxed
	roleRequest                      // a request: part of the question; a correction may drop it
	roleSection                      // a section is scheduled: never relaxed
)

// ExplainOptions control an Explainer.
type ExplainOptions struct {
	// Seed seeds the engine; equal seeds give equal explanations.
	Seed int64
	// CheckConflicts bounds the engine's conflicts in one satisfiability
	// check; a check that runs out counts as "unknown" (a shrinking step
	// then keeps its member and the set may not be minimal). 0 means
	// DefaultCheckConflicts.
	CheckConflicts int64
	// Alternatives is the number of relaxations ("what would have to
	// give") to list; 0 means 3, negative means none.
	Alternatives int
	// NoPlaces skips the search for other periods where a refused request's
	// section could meet.
	NoPlaces bool
	// NoCost skips pricing a granted request: the optimiser's best
	// timetable with the requests against its best without them.
	NoCost bool
	// VerifyModels passes every model of every check through solver.Verify
	// (tests use it); models that become timetables are always verified.
	VerifyModels bool
}

// DefaultCheckConflicts is the default conflict budget of one check.
const DefaultCheckConflicts = 50000

// maxCheckRounds caps the solve–decode rounds of one check (each round adds
// room families or room nogoods that the previous model broke).
const maxCheckRounds = 50

// Explainer answers "why not" questions about one term and an optional
// list of requests: it compiles the term in Explain mode (every requirement
// group behind a selector, see Options.Explain), adds a selector per
// request and per section, and runs satisfiability checks under
// assumptions: which groups hold, which are switched off. It is not safe for
// concurrent use.
//
// Switching a group off removes its constraints, with these exceptions of
// the aggregated room model (see the package documentation): a fixed
// meeting's room, a requested room and a same-room relation narrow the
// rooms a meeting may use even while their group is off, so a set found
// with one of them switched off can be stricter than the words say.
// Switching a section off removes it from every constraint (constraints
// that would need its meetings get its selector, see guardAbsent). A
// staff member's weekly minutes count every meeting (docs/workbook.md);
// timetable.Check counts busy minutes, the same unless two meetings
// overlap, which only a check with that staff member's no-overlap
// switched off allows.
type Explainer struct {
	term *timetable.Term // the term as given: timetables are checked against it
	work *timetable.Term // term with requested rooms added as fixed meetings (== term when none)
	reqs []Request
	opt  ExplainOptions

	p      *solver.Program
	cat    *Catalog
	search *Search // every check's search; the program grows with its cuts
	tally  Result  // the search's counters

	roles      []groupRole // per group; groups added later (room families) are requirements
	reqGroup   []int       // group of each request
	reqStart   []int       // requested start period of each request (index into Periods)
	reqSec     []int       // section index of each request
	reqTimes   [][]int     // requested patterns (0-based) of each request on a pattern section; nil for the grid
	secGroup   []int       // "section is scheduled" group of each section
	roomAssign int         // group guarding room nogoods
	raSecs     []int       // sections named by room nogoods, in order of discovery
	incomplete bool        // an unproved room nogood was added: "no" may be too strict
	stats      ExplainStats
}

// ExplainStats counts the work of an Explainer.
type ExplainStats struct {
	Checks    int   `json:"checks"`    // satisfiability checks
	Sat       int   `json:"sat"`       // checks with a model
	Unsat     int   `json:"unsat"`     // checks without
	Unknown   int   `json:"unknown"`   // checks that ran out of budget or time
	Rebuilds  int   `json:"rebuilds"`  // engines built after room families were added
	Families  int   `json:"families"`  // room families added after Hall violations
	Nogoods   int   `json:"nogoods"`   // room combinations forbidden
	Conflicts int64 `json:"conflicts"` // engine conflicts, all checks
}

// add sums the counters of another explainer's work.
func (st *ExplainStats) add(o ExplainStats) {
	st.Checks += o.Checks
	st.Sat += o.Sat
	st.Unsat += o.Unsat
	st.Unknown += o.Unknown
	st.Rebuilds += o.Rebuilds
	st.Families += o.Families
	st.Nogoods += o.Nogoods
	st.Conflicts += o.Conflicts
}

// NewExplainer compiles term t in Explain mode with the given requests. It
// returns a *RequestError when a request names something the term does not
// have, and a CompileError when the term cannot be compiled.
func NewExplainer(t *timetable.Term, reqs []Request, opt ExplainOptions) (*Explainer, error) {
	if opt.CheckConflicts <= 0 {
		opt.CheckConflicts = DefaultCheckConflicts
	}
	x := &Explainer{term: t, reqs: reqs, opt: opt}
	plan, err := planRequests(t, reqs)
	if err != nil {
		return nil, err
	}
	x.work = plan.work
	x.p, x.cat, err = Compile(x.work, Options{Explain: true})
	if err != nil {
		return nil, err
	}
	x.roles = make([]groupRole, len(x.cat.Groups))
	if err := x.addRequests(plan); err != nil {
		return nil, err
	}
	b := x.cat.extender(x.p)
	x.roomAssign = b.newGroup(KindRoomAssignment, nil,
		"every meeting gets one room for all of its periods and weeks (sections in a same-room relation share one)",
		nil, RelaxRooms)
	x.setRole(x.roomAssign, roleRequirement)
	if err := x.addSectionSelectors(); err != nil {
		return nil, err
	}
	eopts := solver.DefaultOptions()
	eopts.Seed = opt.Seed
	eopts.ConflictLimit = opt.CheckConflicts
	x.search = NewSearch(x.work, x.p, x.cat, SearchOptions{Engine: eopts, Tally: &x.tally})
	if _, err := x.search.Engine(); err != nil {
		return nil, err
	}
	return x, nil
}

func (x *Explainer) setRole(g int, r groupRole) {
	for len(x.roles) <= g {
		x.roles = append(x.roles, roleRequirement)
	}
	x.roles[g] = r
}

// role is the role of group g (requirements for groups made after setup).
func (x *Explainer) role(g int) groupRole {
	if g < len(x.roles) {
		return x.roles[g]
	}
	return roleRequirement
}

// addSectionSelectors gives every section a group "the section is
// scheduled": its selector joins the condition of the section's
// meetings-per-week bound and the body of its choice rule, so that with the
// selector false the section has no meetings at all and takes part in no
// constraint. Every check assumes the selectors of the sections it keeps.
func (x *Explainer) addSectionSelectors() error {
	t := x.work
	b := x.cat.extender(x.p)
	x.secGroup = make([]int, len(t.Sections))
	for s := range t.Sections {
		sec := &t.Sections[s]
		g := b.newGroup(KindSection, []string{sec.ID}, sectionSentence(t, s), []timetable.Source{sec.Src}, 0)
		x.secGroup[s] = g
		x.setRole(g, roleSection)
	}
	// Grid sections only: a pattern section's group is already the body of
	// its time and room choices (patSectionBody, made by Compile).
	var grid []int
	for s := range t.Sections {
		if !x.cat.IsPattern(s) {
			grid = append(grid, s)
		}
	}
	k := 0
	for i := range x.p.Bounds {
		if i >= len(x.cat.boundKind) || x.cat.boundKind[i] != "meetings per week" {
			continue
		}
		if k >= len(grid) {
			return errors.New("internal error: more meetings-per-week bounds than grid sections")
		}
		bd := &x.p.Bounds[i]
		if len(bd.Lits) > 0 && x.cat.AtomInfo(bd.Lits[0].Atom()).Section != grid[k] {
			return errors.New("internal error: meetings-per-week bounds are not in section order")
		}
		bd.Cond = append(bd.Cond, b.sel(x.secGroup[grid[k]]))
		k++
	}
	if k != len(grid) {
		return fmt.Errorf("internal error: %d meetings-per-week bounds for %d grid sections", k, len(grid))
	}
	for i := range x.p.Choices {
		ch := &x.p.Choices[i]
		if len(ch.Heads) == 0 {
			continue
		}
		if info := x.cat.AtomInfo(ch.Heads[0]); info.Kind == AtomStart {
			ch.Body = append(ch.Body, b.sel(x.secGroup[info.Section]))
		}
	}
	x.guardAbsent()
	return nil
}

// guardAbsent keeps switching a section off a pure relaxation: a constraint
// that a missing section would break — one that asks for a meeting
// (a negated start, meets or started-by atom of the section: a fixed
// meeting, a request, same time, same day, back to back) or a fixed
// meeting or request that can never hold — gets the section's selector in
// its body, so it only applies while the section is scheduled.
func (x *Explainer) guardAbsent() {
	groupSec := map[int]int{}
	secIdx := x.work.SectionIndex()
	for key, g := range x.cat.groupKey {
		kind, rest, ok := strings.Cut(key, "\x00")
		if !ok || kind != KindFixed {
			continue
		}
		id, _, _ := strings.Cut(rest, "\x00")
		if s, ok := secIdx[id]; ok {
			groupSec[g] = s
		}
	}
	for i, g := range x.reqGroup {
		groupSec[g] = x.reqSec[i]
	}
	var secs []int
	for i := range x.p.Rules {
		r := &x.p.Rules[i]
		if r.Head != 0 {
			continue
		}
		secs = secs[:0]
		for _, l := range r.Body {
			if !l.IsNeg() {
				continue
			}
			switch info := x.cat.AtomInfo(l.Atom()); info.Kind {
			case AtomStart, AtomMeetsDay, AtomStartedBy, AtomTime, AtomRoom:
				secs = append(secs, info.Section)
			case AtomAux:
				// Helper atoms of one pattern section (any_time, room_time):
				// asking for one asks for a meeting of that section.
				if x.cat.IsPattern(info.Section) {
					secs = append(secs, info.Section)
				}
			}
		}
		if i < len(x.cat.ruleGroup) {
			if s, ok := groupSec[int(x.cat.ruleGroup[i])]; ok {
				secs = append(secs, s)
			}
		}
		for _, s := range secs {
			sel := solver.Pos(x.cat.Groups[x.secGroup[s]].Selector)
			if !slices.Contains(r.Body, sel) {
				r.Body = append(r.Body, sel)
			}
		}
	}
}

// sectionSentence says what scheduling section s asks for.
func sectionSentence(t *timetable.Term, s int) string {
	sec := &t.Sections[s]
	if sec.UsesTimes() {
		return fmt.Sprintf("section %s meets at one of its %d acceptable meeting times", sectionTitled(sec), len(sec.Times))
	}
	what := fmt.Sprintf("%d meeting(s) a week of %d period(s)", sec.Meetings, sec.Length)
	if sec.Meetings == 1 {
		what = fmt.Sprintf("1 meeting a week of %d period(s)", sec.Length)
	}
	return fmt.Sprintf("section %s has %s", sectionTitled(sec), what)
}

// sectionTitled is "BIO-101 (Cell biology)", or the ID alone.
func sectionTitled(sec *timetable.Section) string {
	if sec.Title != "" {
		return sec.ID + " (" + sec.Title + ")"
	}
	return sec.ID
}

// Program returns the explanation program (it grows as room families and
// room nogoods are found) and its catalog.
func (x *Explainer) Program() (*solver.Program, *Catalog) { return x.p, x.cat }

// Stats returns the work counters so far.
func (x *Explainer) Stats() ExplainStats {
	st := x.stats
	st.Rebuilds = x.search.Builds() - 1
	st.Conflicts = x.tally.Engine.Conflicts
	return st
}
