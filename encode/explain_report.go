package encode

import (
	"fmt"
	"slices"
	"sort"
	"strings"
	"time"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// Outcomes of an explanation (Explanation.Status).
const (
	StatusFeasible   = "feasible"   // no requests; a timetable exists
	StatusGranted    = "granted"    // the requests can all be granted together
	StatusInfeasible = "infeasible" // no requests; no timetable exists
	StatusRefused    = "refused"    // the requests cannot all be granted together
	StatusUnknown    = "unknown"    // the budget or time ran out before an answer
)

// Explanation answers "is there a timetable (that grants these requests),
// and if not, why not and what would have to give". Its JSON form is
// stable: fields are only ever added.
type Explanation struct {
	Term     string          `json:"term"`
	Status   string          `json:"status"`
	Requests []RequestResult `json:"requests"`
	// TermInfeasible is set when, with requests, the term has no timetable
	// even without them.
	TermInfeasible bool `json:"term_infeasible,omitempty"`
	// Conflict is a minimal set of reasons that cannot all hold (when the
	// answer is no).
	Conflict *Conflict `json:"conflict,omitempty"`
	// Corrections are the cheapest relaxations found, cheapest first.
	Corrections []Correction `json:"corrections"`
	// CorrectionsComplete is set when no other relaxation exists beyond
	// those listed (or none exists at all).
	CorrectionsComplete bool `json:"corrections_complete"`
	// Cost compares the preferences of a granted timetable with a
	// timetable without the requests.
	Cost *CostComparison `json:"cost,omitempty"`
	// Uncertain says why a "no" may be too strict, when it may.
	Uncertain string       `json:"uncertain,omitempty"`
	Stats     ExplainStats `json:"stats"`
	// Schedule is a verified timetable when the answer is yes.
	Schedule *timetable.Schedule `json:"-"`
}

// Reason is one requirement group (or request, or section) in words.
type Reason struct {
	Kind      string   `json:"kind"`
	Sentence  string   `json:"sentence"`
	Sources   []string `json:"sources"`    // workbook rows, e.g. "Unavailable row 7"
	RelaxCost int      `json:"relax_cost"` // how hard it is to give up (Relax... constants)
	Request   int      `json:"request,omitempty"`
	where     string
	src       []timetable.Source // the rows, for ordering
}

// Where lists the reason's rows compactly: "Staff row 9; Unavailable rows
// 7, 8".
func (r Reason) Where() string { return r.where }

// Conflict is a set of reasons that cannot all hold.
type Conflict struct {
	Reasons  []Reason     `json:"reasons"`  // requirements and requests, most specific first
	Sections []SectionRef `json:"sections"` // exactly the sections involved
	// CoreGroups and CoreSections size the engine's first core, before
	// shrinking; Reasons and Sections size the shrunk set.
	CoreGroups   int  `json:"core_groups"`
	CoreSections int  `json:"core_sections"`
	Minimal      bool `json:"minimal"` // false when a shrinking check ran out of budget
	// Counted is set when the conflict was proved by counting (a load
	// above the periods left), not by search; the core sizes are then
	// those of the counting argument.
	Counted bool `json:"counted,omitempty"`
}

// SectionRef names a section and its row.
type SectionRef struct {
	ID     string `json:"id"`
	Title  string `json:"title,omitempty"`
	Source string `json:"source,omitempty"`
}

// Correction is a set of requirements whose relaxation makes the answer
// yes; no proper subset does.
type Correction struct {
	Cost  int      `json:"cost"` // summed relax costs
	Relax []Reason `json:"relax"`
}

// RequestResult is the answer for one request.
type RequestResult struct {
	Number  int    `json:"number"` // 1-based, in the order given
	Section string `json:"section"`
	At      string `json:"at"`
	Room    string `json:"room,omitempty"`
	Source  string `json:"source,omitempty"`
	Granted bool   `json:"granted"` // granted together with all the other requests
	// GrantedAlone is whether this request alone (without the others) can
	// be granted.
	GrantedAlone bool `json:"granted_alone"`
	// Places lists where the section could meet instead (refused requests).
	Places         []Place `json:"places,omitempty"`
	PlacesComplete bool    `json:"places_complete,omitempty"`
}

// CostComparison sets the preference cost of the granted timetable beside
// a timetable without the requests.
type CostComparison struct {
	// Basis says how both timetables were found: "optimised" (best found
	// within the budget by the engine's optimiser) or "first found".
	Basis string `json:"basis"`
	// Compared is false when only the granted timetable's cost is known
	// (the program has no preferences to optimise, so a timetable without
	// the requests would say nothing); Without values are then 0.
	Compared bool            `json:"compared"`
	Levels   []LevelCost     `json:"levels"`   // highest level first
	Criteria []CriterionCost `json:"criteria"` // criteria with a cost in either timetable
}

// LevelCost is the summed cost of one priority level.
type LevelCost struct {
	Level   int   `json:"level"`
	With    int64 `json:"with"`
	Without int64 `json:"without"`
}

// CriterionCost is the cost of one criterion with and without the
// requests.
type CriterionCost struct {
	Name    string `json:"name"`
	Level   int    `json:"level"`
	With    int64  `json:"with"`
	Without int64  `json:"without"`
}

// reason describes group g.
func (x *Explainer) reason(g int) Reason {
	gr := &x.cat.Groups[g]
	r := Reason{Kind: gr.Kind, Sentence: gr.Sentence, Sources: []string{}, RelaxCost: gr.RelaxCost, where: sourcesText(gr.Src), src: gr.Src}
	for _, s := range gr.Src {
		if str := s.String(); str != "" {
			r.Sources = append(r.Sources, str)
		}
	}
	if i := slices.Index(x.reqGroup, g); i >= 0 {
		r.Request = i + 1
	}
	switch gr.Kind {
	case KindStaffAvailability, KindCohortAvailability, KindSectionAvail, KindRoomAvailability:
		if times := x.unavailableTimes(gr.Src); times != "" {
			r.Sentence += " (" + times + ")"
		}
	case KindRoomFit:
		r.Sentence += x.requestedRooms(g)
	}
	if g == x.roomAssign && len(x.raSecs) > 0 {
		r.Sentence += " — here for the meetings of sections " + sectionList(x.work, x.raSecs)
		var src []timetable.Source
		for _, s := range x.raSecs {
			src = append(src, x.work.Sections[s].Src)
			r.Sources = append(r.Sources, x.work.Sections[s].Src.String())
		}
		r.where, r.src = sourcesText(src), src
	}
	return r
}

// unavailableTimes lists the hard Unavailable rows among src as times,
// touching or overlapping rows of a day merged: "Mon 08:00-12:00, Fri all
// day". The rows' reasons are left out: they may be personal.
func (x *Explainer) unavailableTimes(src []timetable.Source) string {
	type span struct {
		day      time.Weekday
		from, to timetable.Clock
		weeks    timetable.WeekSet // 0: every week
	}
	var spans []span
	for _, u := range x.work.Unavailable {
		if u.Hard && u.Src.Sheet != "" && slices.Contains(src, u.Src) {
			w := u.Weeks
			if w == x.work.AllWeeks() {
				w = 0
			}
			spans = append(spans, span{u.Day, u.From, u.To, w})
		}
	}
	sort.Slice(spans, func(i, j int) bool {
		a, b := spans[i], spans[j]
		if a.day != b.day {
			return timetable.WeekOrder(a.day) < timetable.WeekOrder(b.day)
		}
		return a.from < b.from
	})
	var merged []span
	for _, sp := range spans {
		if n := len(merged); n > 0 && merged[n-1].day == sp.day && merged[n-1].weeks == sp.weeks && sp.from <= merged[n-1].to {
			merged[n-1].to = max(merged[n-1].to, sp.to)
			continue
		}
		merged = append(merged, sp)
	}
	var parts []string
	for _, sp := range merged {
		first, last := timetable.Clock(24*60), timetable.Clock(0)
		for _, p := range x.work.Periods {
			if p.Day == sp.day {
				first, last = min(first, p.Start), max(last, p.End)
			}
		}
		text := timetable.DayName(sp.day) + " " + sp.from.String() + "-" + sp.to.String()
		if first < last && sp.from <= first && sp.to >= last {
			text = timetable.DayName(sp.day) + " all day"
		}
		if sp.weeks != 0 {
			text += " in weeks " + sp.weeks.Ranges()
		}
		parts = append(parts, text)
	}
	return strings.Join(parts, ", ")
}

// requestedRooms describes the rooms requested for the section of room
// fit group g: "; room LAB1 has 24 seats and features lab".
func (x *Explainer) requestedRooms(g int) string {
	out := ""
	roomIdx := x.work.RoomIndex()
	for i, r := range x.reqs {
		if r.Room == "" || x.cat.rooms.fitGroup[x.reqSec[i]] != g || strings.Contains(out, "room "+r.Room+" ") {
			continue
		}
		room := &x.work.Rooms[roomIdx[r.Room]]
		out += fmt.Sprintf("; room %s has %d seats", room.ID, room.Capacity)
		if len(room.Features) > 0 {
			out += " and features " + strings.Join(room.Features, ", ")
		} else {
			out += " and no listed features"
		}
	}
	return out
}

// reasons describes groups, most specific first, then in workbook order
// of their rows (sheet order, then row number: "Relations row 2" before
// "Relations row 10", whatever the sentences say).
func (x *Explainer) reasons(groups []int) []Reason {
	gs := slices.Clone(groups)
	sort.SliceStable(gs, func(i, j int) bool {
		a, b := &x.cat.Groups[gs[i]], &x.cat.Groups[gs[j]]
		if sa, sb := reasonSpecificity(a.Kind), reasonSpecificity(b.Kind); sa != sb {
			return sa > sb
		}
		if c := compareRows(a.Src, b.Src); c != 0 {
			return c < 0
		}
		return a.Sentence < b.Sentence
	})
	out := make([]Reason, 0, len(gs))
	for _, g := range gs {
		out = append(out, x.reason(g))
	}
	return out
}

// compareRows orders two lists of workbook rows by their rows in
// workbook order (timetable.Source.Compare), each list read from its
// first row on; a list that is a prefix of the other comes first.
func compareRows(a, b []timetable.Source) int {
	sa, sb := slices.Clone(a), slices.Clone(b)
	slices.SortFunc(sa, timetable.Source.Compare)
	slices.SortFunc(sb, timetable.Source.Compare)
	return slices.CompareFunc(sa, sb, timetable.Source.Compare)
}

// sortCorrections orders corrections cheapest first and, at equal cost,
// by the workbook rows of their reasons (each correction's reasons are
// already in reasons order).
func sortCorrections(cs []Correction) {
	sort.SliceStable(cs, func(i, j int) bool {
		if cs[i].Cost != cs[j].Cost {
			return cs[i].Cost < cs[j].Cost
		}
		return slices.CompareFunc(cs[i].Relax, cs[j].Relax, func(a, b Reason) int { return compareRows(a.src, b.src) }) < 0
	})
}

// conflict describes a shrunk set: the requirements and requests as
// reasons, the section groups as the sections involved.
func (x *Explainer) conflict(mus, core []int, minimal bool) *Conflict {
	c := &Conflict{Sections: []SectionRef{}, Minimal: minimal}
	var groups []int
	var secs []int
	for _, g := range mus {
		if x.role(g) == roleSection {
			secs = append(secs, g)
		} else {
			groups = append(groups, g)
		}
	}
	for _, g := range core {
		if x.role(g) == roleSection {
			c.CoreSections++
		} else {
			c.CoreGroups++
		}
	}
	c.Reasons = x.reasons(groups)
	if len(groups) == 0 {
		// Sections that cannot be scheduled even with every requirement
		// off: their own shape is the reason.
		for _, g := range secs {
			r := x.reason(g)
			s := slices.Index(x.secGroup, g)
			if x.cat.IsPattern(s) {
				r.Sentence += ", but none of them can hold"
			} else if len(x.cat.Candidates(s)) == 0 {
				r.Sentence += ", but no run of consecutive periods in the grid can hold one meeting"
			} else {
				r.Sentence += ", but the grid has too few starts for them"
			}
			c.Reasons = append(c.Reasons, r)
		}
	}
	for s, g := range x.secGroup {
		if slices.Contains(secs, g) {
			sec := &x.work.Sections[s]
			c.Sections = append(c.Sections, SectionRef{ID: sec.ID, Title: sec.Title, Source: sec.Src.String()})
		}
	}
	return c
}

// correction describes a relaxation; a request in it reads "drop request
// N: ...".
func (x *Explainer) correction(groups []int) Correction {
	c := Correction{Relax: x.reasons(groups)}
	for i, r := range c.Relax {
		if r.Request > 0 {
			c.Relax[i].Sentence = "drop " + r.Sentence
			c.Relax[i].RelaxCost = max(1, r.RelaxCost)
		}
	}
	for _, g := range groups {
		c.Cost += x.relaxCost(g)
	}
	return c
}

// requestResults lists the requests, not yet answered.
func (x *Explainer) requestResults() []RequestResult {
	out := make([]RequestResult, len(x.reqs))
	for i, r := range x.reqs {
		out[i] = RequestResult{Number: i + 1, Section: r.Section, At: r.At(), Room: r.Room, Source: r.Src.String()}
	}
	return out
}

// compareCost fills a comparison from the cost reports of the timetable
// with and without the requests.
func compareCost(basis string, with, without timetable.CostReport) *CostComparison {
	c := &CostComparison{Basis: basis, Levels: []LevelCost{}, Criteria: []CriterionCost{}}
	for _, l := range with.Levels() {
		c.Levels = append(c.Levels, LevelCost{Level: l, With: with.ByLevel[l], Without: without.ByLevel[l]})
	}
	for _, w := range with.Criteria {
		o := without.Criterion(w.Name)
		if w.Weight == 0 || (w.Cost == 0 && o.Cost == 0) {
			continue
		}
		c.Criteria = append(c.Criteria, CriterionCost{Name: w.Name, Level: w.Level, With: w.Cost, Without: o.Cost})
	}
	return c
}

// witness verifies a timetable found by a check with every group holding:
// the model is a stable model of the program (solver.Verify), the timetable
// breaks no hard requirement of the term (timetable.Check), and every
// request is honoured.
func (x *Explainer) witness(r explainCheck) error {
	if err := solver.Verify(x.p, r.model); err != nil {
		return fmt.Errorf("internal error: the engine's model fails the verifier: %w", err)
	}
	if r.sched == nil {
		return fmt.Errorf("internal error: a model with every requirement holding has no room assignment")
	}
	if hard := timetable.HardViolations(timetable.Check(x.term, r.sched)); len(hard) > 0 {
		msgs := make([]string, 0, 3)
		for i, v := range hard {
			if i == 3 {
				break
			}
			msgs = append(msgs, v.Msg)
		}
		return fmt.Errorf("%w: %s", ErrCheckFailed, strings.Join(msgs, "; "))
	}
	for _, req := range x.reqs {
		if !grantsRequest(x.term, r.sched, req) {
			return fmt.Errorf("internal error: the timetable found does not grant the request %s", req)
		}
	}
	return nil
}

// grantsRequest reports whether schedule s has a meeting as request r asks.
func grantsRequest(t *timetable.Term, s *timetable.Schedule, r Request) bool {
	if i, ok := t.SectionIndex()[r.Section]; ok && t.Sections[i].UsesTimes() {
		return grantsPatternRequest(t, s, r)
	}
	p := t.PeriodAt(r.Day, r.Start)
	for _, pl := range s.Placements {
		if pl.Section == r.Section && pl.Period == p && (r.Room == "" || pl.Room == r.Room) {
			return true
		}
	}
	return false
}
