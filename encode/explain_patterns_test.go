package encode

import (
	"context"
	"fmt"
	"slices"
	"sort"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// Explanations on pattern terms, checked against brute force: every
// timetable of the small terms below is enumerated (every meeting time and
// every acceptable room of every section) and judged by timetable.Check,
// which shares no code with the encoder. A requirement group counts as
// "switched off" in the brute force when the violations it stands for are
// ignored (patViolationOf maps a violation to the reasons it breaks).

// patTerm is a pattern-only term of four teaching weeks.
func patTerm() *termBuilder {
	return &termBuilder{t: &timetable.Term{
		Name:     "Pattern explain term",
		FirstDay: time.Date(2027, 9, 6, 0, 0, 0, 0, time.UTC),
		LastDay:  time.Date(2027, 10, 1, 0, 0, 0, 0, time.UTC),
	}}
}

// at is a meeting time on the given days at h:m for mins minutes, every
// week, from Meeting times row row.
func at(days timetable.DaySet, h, m, mins, row int) timetable.TimeChoice {
	return timetable.TimeChoice{Days: days, Start: timetable.Clock(60*h + m), Minutes: mins,
		Src: timetable.Source{Sheet: "Meeting times", Row: row}}
}

var (
	dMon   = timetable.DaysOf(time.Monday)
	dTue   = timetable.DaysOf(time.Tuesday)
	dMonWe = timetable.DaysOf(time.Monday, time.Wednesday)
)

// patTimes sets a section's meeting times (every week of the term).
func patTimes(t *timetable.Term, cs ...timetable.TimeChoice) func(*timetable.Section) {
	return func(s *timetable.Section) {
		for i := range cs {
			cs[i].Weeks = t.AllWeeks()
		}
		s.Times, s.Length = cs, 1
	}
}

func roomChoices(ids ...string) func(*timetable.Section) {
	return func(s *timetable.Section) {
		for _, id := range ids {
			s.RoomChoices = append(s.RoomChoices, timetable.RoomChoice{Room: id})
		}
	}
}

// patCase is a small pattern term with one request whose refusal has one
// minimal reason, known by construction.
type patCase struct {
	name  string
	term  func() *timetable.Term
	req   Request
	kinds []string // kinds of the minimal conflict's reasons, sorted
	secs  []string // sections involved, in term order
}

func patCases() []patCase {
	return []patCase{
		{
			name: "staff away",
			term: func() *timetable.Term {
				b := patTerm().room("R1", 30)
				b.section("A", staffOf("T1"), patTimes(b.t, at(dMon, 9, 0, 50, 2), at(dTue, 9, 0, 50, 3)))
				b.unavailable(timetable.WhoStaff, "T1", time.Monday, 8, 12)
				return b.t
			},
			req:   Request{Section: "A", Day: time.Monday, Start: 9 * 60},
			kinds: []string{KindRequest, KindStaffAvailability},
			secs:  []string{"A"},
		},
		{
			name: "staff clash",
			term: func() *timetable.Term {
				b := patTerm().room("R1", 30).room("R2", 30)
				b.section("A", staffOf("T1"), patTimes(b.t, at(dMon, 9, 0, 50, 2), at(dTue, 9, 0, 50, 3)))
				b.section("B", staffOf("T1"), patTimes(b.t, at(dMon, 9, 30, 50, 4)))
				b.section("C", staffOf("T2"), patTimes(b.t, at(dMon, 9, 0, 50, 5)))
				return b.t
			},
			req:   Request{Section: "A", Day: time.Monday, Start: 9 * 60},
			kinds: []string{KindRequest, KindStaffNoOverlap},
			secs:  []string{"A", "B"},
		},
		{
			name: "room too small",
			term: func() *timetable.Term {
				b := patTerm().room("R1", 30).room("R2", 50)
				b.section("A", sized(40), patTimes(b.t, at(dMon, 9, 0, 50, 2)))
				return b.t
			},
			req:   Request{Section: "A", Day: time.Monday, Start: 9 * 60, Room: "R1"},
			kinds: []string{KindRequest, KindRoomFit},
			secs:  []string{"A"},
		},
		{
			name: "room taken",
			term: func() *timetable.Term {
				b := patTerm().room("R1", 30).room("R2", 30)
				b.section("A", roomChoices("R1", "R2"), patTimes(b.t, at(dMon, 9, 0, 50, 2), at(dTue, 9, 0, 50, 3)))
				b.section("B", roomChoices("R1"), patTimes(b.t, at(dMon, 9, 0, 50, 4)))
				return b.t
			},
			req:   Request{Section: "A", Day: time.Monday, Start: 9 * 60, Room: "R1"},
			kinds: []string{KindRequest, KindRoomSupply},
			secs:  []string{"A", "B"},
		},
		{
			name: "room closed",
			term: func() *timetable.Term {
				b := patTerm().room("R1", 30).room("R2", 30)
				b.section("A", roomChoices("R1", "R2"), patTimes(b.t, at(dMon, 9, 0, 50, 2)))
				b.unavailable(timetable.WhoRoom, "R1", time.Monday, 9, 10)
				return b.t
			},
			req:   Request{Section: "A", Day: time.Monday, Start: 9 * 60, Room: "R1"},
			kinds: []string{KindRequest, KindRoomAvailability},
			secs:  []string{"A"},
		},
		{
			name: "different days",
			term: func() *timetable.Term {
				b := patTerm().room("R1", 30).room("R2", 30)
				b.section("A", patTimes(b.t, at(dMon, 9, 0, 50, 2), at(dTue, 9, 0, 50, 3)))
				b.section("B", patTimes(b.t, at(dMon, 14, 0, 50, 4)))
				b.relation(timetable.DifferentDays, "A", "B")
				return b.t
			},
			req:   Request{Section: "A", Day: time.Monday, Start: 9 * 60},
			kinds: []string{KindRelation, KindRequest},
			secs:  []string{"A", "B"},
		},
		{
			name: "travel",
			term: func() *timetable.Term {
				b := patTerm().room("N1", 30).room("S1", 30)
				b.t.Rooms[0].Building, b.t.Rooms[1].Building = "North", "South"
				b.t.Travel = []timetable.Travel{{From: "North", To: "South", Minutes: 30, Src: timetable.Source{Sheet: "Travel", Row: 2}}}
				b.section("A", staffOf("T1"), roomChoices("N1"), patTimes(b.t, at(dMon, 9, 0, 50, 2), at(dTue, 9, 0, 50, 3)))
				b.section("B", staffOf("T1"), roomChoices("S1"), patTimes(b.t, at(dMon, 10, 0, 50, 4)))
				return b.t
			},
			req:   Request{Section: "A", Day: time.Monday, Start: 9 * 60},
			kinds: []string{KindRequest, KindStaffTravel},
			secs:  []string{"A", "B"},
		},
		{
			name: "weekly limit",
			term: func() *timetable.Term {
				b := patTerm().room("R1", 30)
				b.section("A", staffOf("T1"), patTimes(b.t, at(dMonWe, 9, 0, 60, 2), at(dMon, 9, 0, 60, 3)))
				b.t.Staff[0].MaxWeekMinutes = 100
				return b.t
			},
			req:   Request{Section: "A", Day: time.Monday, Days: dMonWe, Start: 9 * 60},
			kinds: []string{KindRequest, KindStaffWeekLimit},
			secs:  []string{"A"},
		},
		{
			name: "lunch",
			term: func() *timetable.Term {
				b := patTerm().room("R1", 30)
				b.section("A", staffOf("T1"), patTimes(b.t, at(dMon, 11, 30, 90, 2), at(dMon, 9, 0, 90, 3)))
				b.t.Staff[0].Lunch = timetable.LunchBreak{From: 11*60 + 30, To: 13*60 + 30, Minutes: 45}
				return b.t
			},
			req:   Request{Section: "A", Day: time.Monday, Start: 11*60 + 30},
			kinds: []string{KindRequest, KindStaffLunch},
			secs:  []string{"A"},
		},
	}
}

// TestPatternExplainMinimal: on each hand-built term the request is
// refused, the conflict names exactly the reasons and sections built in,
// brute force over every timetable confirms that set is a minimal
// unsatisfiable set (it cannot hold; without any one reason or section it
// can), and the places listed are exactly the meeting times and rooms
// that some full timetable without the request gives the section.
func TestPatternExplainMinimal(t *testing.T) {
	for _, tc := range patCases() {
		t.Run(tc.name, func(t *testing.T) {
			term := tc.term()
			require.Empty(t, timetable.Validate(term).Errors(), "the test term is valid")
			ex, err := Explain(context.Background(), term, []Request{tc.req}, ExplainOptions{Seed: 1, VerifyModels: true})
			require.NoError(t, err)
			require.Equal(t, StatusRefused, ex.Status)
			require.NotNil(t, ex.Conflict)
			require.True(t, ex.Conflict.Minimal)
			var kinds []string
			for _, r := range ex.Conflict.Reasons {
				kinds = append(kinds, r.Kind)
			}
			sort.Strings(kinds)
			assert.Equal(t, tc.kinds, kinds)
			var secs []string
			for _, s := range ex.Conflict.Sections {
				secs = append(secs, s.ID)
			}
			assert.Equal(t, tc.secs, secs)

			// Brute force: the request cannot hold with everything on...
			all := func(timetable.Violation) bool { return true }
			assert.False(t, patBruteFeasible(term, nil, all, &tc.req), "brute force: the request is refused")
			assert.True(t, patBruteFeasible(term, nil, all, nil), "brute force: the term alone has a timetable")
			// ...nor with only the conflict on, and any one member less lets it.
			reasons := ex.Conflict.Reasons
			keep := func(rs []Reason) func(timetable.Violation) bool {
				return func(v timetable.Violation) bool {
					return slices.ContainsFunc(rs, func(r Reason) bool { return patViolationOf(v, r) })
				}
			}
			req := &tc.req
			assert.False(t, patBruteFeasible(term, tc.secs, keep(reasons), req), "brute force: the conflict alone cannot hold")
			for i, r := range reasons {
				rest := slices.Delete(slices.Clone(reasons), i, i+1)
				q := req
				if r.Kind == KindRequest {
					q = nil
				}
				assert.True(t, patBruteFeasible(term, tc.secs, keep(rest), q), "brute force: without %q the rest can hold", r.Sentence)
			}
			for i := range tc.secs {
				rest := slices.Delete(slices.Clone(tc.secs), i, i+1)
				q := req
				if !slices.Contains(rest, req.Section) {
					q = nil
				}
				assert.True(t, patBruteFeasible(term, rest, keep(reasons), q), "brute force: without section %s the rest can hold", tc.secs[i])
			}

			// Places: exactly the (time, room) choices some full timetable
			// gives the section, other than what the request names.
			rr := ex.Requests[0]
			require.True(t, rr.PlacesComplete)
			var got []string
			for _, p := range rr.Places {
				got = append(got, fmt.Sprintf("%d/%s", p.Time, p.Room))
			}
			assert.ElementsMatch(t, patBrutePlaces(term, tc.req), got)
		})
	}
}

// patViolationOf reports whether violation v breaks the requirement of
// reason r (the rows tie them: a staff clash names the Staff row, an
// unavailability its Unavailable row, a relation its Relations row).
func patViolationOf(v timetable.Violation, r Reason) bool {
	var rules []string
	sheet := ""
	switch r.Kind {
	case KindStaffAvailability, KindCohortAvailability, KindSectionAvail, KindRoomAvailability:
		rules, sheet = []string{timetable.RuleUnavailable}, "Unavailable"
	case KindStaffNoOverlap:
		rules, sheet = []string{timetable.RuleStaffClash}, "Staff"
	case KindCohortNoOverlap:
		rules, sheet = []string{timetable.RuleCohortClash}, "Cohorts"
	case KindRoomSupply:
		rules, sheet = []string{timetable.RuleRoomClash}, "Rooms"
	case KindRoomFit:
		rules, sheet = []string{timetable.RuleCapacity, timetable.RuleFeatures}, "Sections"
	case KindRelation:
		rules, sheet = []string{timetable.RuleRelation}, "Relations"
	case KindStaffTravel:
		rules, sheet = []string{timetable.RuleTravel}, "Staff"
	case KindCohortTravel:
		rules, sheet = []string{timetable.RuleTravel}, "Cohorts"
	case KindStaffWeekLimit:
		rules, sheet = []string{ruleWeekSum}, "Staff"
	case KindStaffLunch:
		rules, sheet = []string{timetable.RuleLunch}, "Staff"
	default:
		return false
	}
	if !slices.Contains(rules, v.Rule) {
		return false
	}
	for _, s := range v.Sources {
		if s.Sheet == sheet && slices.Contains(r.Sources, s.String()) {
			return true
		}
	}
	return false
}

// patBruteChoices lists every (meeting time, room) placement of a pattern
// section: every pattern with every room it lists (every room when it
// lists none), or no room.
func patBruteChoices(t *timetable.Term, sec *timetable.Section) []timetable.Placement {
	var rooms []string
	switch {
	case sec.NoRoom:
		rooms = []string{""}
	case len(sec.RoomChoices) > 0:
		for _, rc := range sec.RoomChoices {
			rooms = append(rooms, rc.Room)
		}
	case len(sec.Rooms) > 0:
		rooms = sec.Rooms
	default:
		for _, r := range t.Rooms {
			rooms = append(rooms, r.ID)
		}
	}
	var out []timetable.Placement
	for k := range sec.Times {
		for _, r := range rooms {
			out = append(out, timetable.Placement{Section: sec.ID, Meeting: 1, Period: -1, Time: k + 1, Room: r})
		}
	}
	return out
}

// patBruteEach calls f with every timetable of the sections ids (nil: all),
// each section at each of its patBruteChoices; f returns false to stop.
func patBruteEach(t *timetable.Term, ids []string, f func(*timetable.Schedule) bool) {
	var opts [][]timetable.Placement
	for i := range t.Sections {
		if ids == nil || slices.Contains(ids, t.Sections[i].ID) {
			opts = append(opts, patBruteChoices(t, &t.Sections[i]))
		}
	}
	pick := make([]timetable.Placement, len(opts))
	var rec func(i int) bool
	rec = func(i int) bool {
		if i == len(opts) {
			return f(&timetable.Schedule{Placements: slices.Clone(pick)})
		}
		for _, o := range opts[i] {
			pick[i] = o
			if !rec(i + 1) {
				return false
			}
		}
		return true
	}
	rec(0)
}

// patBruteFeasible reports whether some timetable of the sections ids (nil:
// all) breaks no hard requirement that counts (per timetable.Check) and
// grants req (when given).
func patBruteFeasible(t *timetable.Term, ids []string, counts func(timetable.Violation) bool, req *Request) bool {
	if ids != nil {
		t = subTerm(t, ids)
	}
	found := false
	patBruteEach(t, ids, func(s *timetable.Schedule) bool {
		if req != nil && !patGrantsBrute(t, s, *req) {
			return true
		}
		for _, v := range append(timetable.HardViolations(timetable.Check(t, s)), weekSums(t, s)...) {
			if counts(v) && v.Rule != timetable.RuleMeetings {
				return true
			}
		}
		found = true
		return false
	})
	return found
}

// ruleWeekSum marks the weekly limits as docs/workbook.md defines them
// ("Max minutes per week (every meeting counted)", "Max days per week
// (days with a meeting)"), judged by weekSums. timetable.Check counts
// busy minutes (overlapping meetings once), which is the same whenever
// the staff member's meetings do not overlap, but not when an
// explanation switches their no-overlap off; the program counts every
// meeting.
const ruleWeekSum = "weekly limit, every meeting counted"

// weekSums lists, per staff member over a weekly limit of minutes (every
// meeting counted) or days in some teaching week of schedule s, one
// violation naming the Staff row.
func weekSums(t *timetable.Term, s *timetable.Schedule) []timetable.Violation {
	var out []timetable.Violation
	for _, st := range t.Staff {
		if st.MaxWeekMinutes <= 0 && st.MaxWeekDays <= 0 {
			continue
		}
		for w := 1; w <= t.TeachingWeeks(); w++ {
			mins := 0
			var days timetable.DaySet
			for _, pl := range s.Placements {
				sec := &t.Sections[t.SectionIndex()[pl.Section]]
				if !slices.Contains(sec.Staff, st.ID) {
					continue
				}
				for _, o := range t.SectionOccurrences(sec, pl) {
					if o.Weeks.Has(w) {
						mins += o.Minutes()
						days |= timetable.DaysOf(o.Day)
					}
				}
			}
			if st.MaxWeekMinutes > 0 && mins > st.MaxWeekMinutes || st.MaxWeekDays > 0 && days.Count() > st.MaxWeekDays {
				out = append(out, timetable.Violation{Rule: ruleWeekSum, Hard: true, Sources: []timetable.Source{st.Src}})
				break
			}
		}
	}
	return out
}

// subTerm is t with only the sections ids: the others are removed from
// the Sections sheet and from every relation row (a row left with no
// section is dropped), as if never written.
func subTerm(t *timetable.Term, ids []string) *timetable.Term {
	c := *t
	c.Sections = slices.DeleteFunc(slices.Clone(t.Sections), func(s timetable.Section) bool { return !slices.Contains(ids, s.ID) })
	c.Relations = nil
	for _, r := range t.Relations {
		r.Sections = slices.DeleteFunc(slices.Clone(r.Sections), func(id string) bool { return !slices.Contains(ids, id) })
		if len(r.Sections) > 0 {
			c.Relations = append(c.Relations, r)
		}
	}
	return &c
}

// patGrantsBrute reads a request by its words (request.go): several days name
// exactly those days, one day any pattern meeting that day; same start.
func patGrantsBrute(t *timetable.Term, s *timetable.Schedule, r Request) bool {
	sec := &t.Sections[t.SectionIndex()[r.Section]]
	for _, pl := range s.Placements {
		if pl.Section != r.Section {
			continue
		}
		tc := sec.Times[pl.Time-1]
		days := tc.Days.Has(r.Day)
		if r.Days.Count() > 1 {
			days = tc.Days == r.Days
		}
		return days && tc.Start == r.Start && (r.Room == "" || pl.Room == r.Room)
	}
	return false
}

// patBrutePlaces lists "time/room" for every placement of the request's
// section that some hard-clean full timetable has, except those the
// request itself names.
func patBrutePlaces(t *timetable.Term, r Request) []string {
	seen := map[string]bool{}
	patBruteEach(t, nil, func(s *timetable.Schedule) bool {
		if len(timetable.HardViolations(timetable.Check(t, s))) > 0 {
			return true
		}
		for _, pl := range s.Placements {
			if pl.Section != r.Section {
				continue
			}
			one := &timetable.Schedule{Placements: []timetable.Placement{pl}}
			if !patGrantsBrute(t, one, r) {
				seen[fmt.Sprintf("%d/%s", pl.Time, pl.Room)] = true
			}
		}
		return true
	})
	out := []string{}
	for k := range seen {
		out = append(out, k)
	}
	return out
}

// TestPatternExplainSelectors: in Explain mode every integrity constraint
// and every bound of a pattern term's explanation program is behind a
// selector (a requirement, a request or a section), so that switching
// selectors off can always drop it; checked on random pattern terms with
// travel, unavailability, room choices, every relation kind of pattern
// sections, weekly limits and lunch breaks.
func TestPatternExplainSelectors(t *testing.T) {
	for seed := int64(1); seed <= 12; seed++ {
		term := patternTerm(seed, 6, 4, 3)
		// Every hard relation kind of pattern terms, weekly limits and
		// lunch breaks.
		for i, k := range timetable.RelationKinds {
			if k.Kind.OnGrid() && k.Kind != timetable.SameTime && k.Kind != timetable.SameRoom {
				continue
			}
			a, c := (i+int(seed))%6, (i+int(seed)+1)%6
			term.Relations = append(term.Relations, timetable.Relation{Kind: k.Kind, Hard: true, N: 120, M: 15,
				Sections: []string{term.Sections[a].ID, term.Sections[c].ID}, Src: timetable.Source{Sheet: "Relations", Row: i + 2}})
		}
		term.Staff[0].MaxWeekMinutes, term.Staff[0].MaxWeekDays = 300, 3
		term.Staff[0].Lunch = timetable.LunchBreak{From: 11 * 60, To: 14 * 60, Minutes: 45}
		term.Cohorts[0].Lunch = timetable.LunchBreak{From: 11 * 60, To: 14 * 60, Minutes: 30}
		x, err := NewExplainer(term, nil, ExplainOptions{Seed: 1})
		require.NoError(t, err)
		p, cat := x.Program()
		isSel := func(l solver.Lit) bool { return !l.IsNeg() && cat.AtomInfo(l.Atom()).Kind == AtomSelector }
		for i, r := range p.Rules {
			if r.Head == 0 && !slices.ContainsFunc(r.Body, isSel) {
				t.Fatalf("seed %d: constraint %d (%s) has no selector", seed, i, ruleText(p, r))
			}
		}
		for i, b := range p.Bounds {
			if !slices.ContainsFunc(b.Cond, isSel) {
				t.Fatalf("seed %d: bound %d (%s) has no selector in its condition", seed, i, cat.boundKind[i])
			}
		}
	}
}

func ruleText(p *solver.Program, r solver.Rule) string {
	var parts []string
	for _, l := range r.Body {
		s := p.Name(l.Atom())
		if l.IsNeg() {
			s = "not " + s
		}
		parts = append(parts, s)
	}
	return ":- " + strings.Join(parts, ", ")
}

// TestPatternExplainFeasible: with every requirement holding, an
// explanation of a random pattern term agrees with brute force on whether
// a timetable exists; a timetable it returns passes timetable.Check, and
// a conflict it names is minimal by brute force.
func TestPatternExplainFeasible(t *testing.T) {
	infeasible := 0
	for seed := int64(1); seed <= 30; seed++ {
		term, _ := randomPatRequest(seed)
		ex, err := Explain(context.Background(), term, nil, ExplainOptions{Seed: 1, VerifyModels: true, Alternatives: -1})
		require.NoError(t, err)
		want := patBruteFeasible(term, nil, func(timetable.Violation) bool { return true }, nil)
		require.Equal(t, want, ex.Status == StatusFeasible, "seed %d: %s", seed, ex.Status)
		if want {
			require.Empty(t, timetable.HardViolations(timetable.Check(term, ex.Schedule)))
			continue
		}
		infeasible++
		require.NotNil(t, ex.Conflict)
		if ex.Conflict.Minimal {
			assertBruteMinimal(t, fmt.Sprintf("seed %d", seed), term, ex.Conflict, Request{})
		}
	}
	t.Logf("%d of 30 terms have no timetable", infeasible)
}

// TestPatternExplainRandomBrute: random small pattern terms with random
// hard relations and one random request. Brute force over every
// timetable decides whether the request can be granted; a granted
// request's timetable passes timetable.Check and grants it; a refused
// one's conflict is a minimal unsatisfiable set by brute force, and its
// places are exactly those of brute force.
func TestPatternExplainRandomBrute(t *testing.T) {
	refused := 0
	const n = 100 // 400 passed too (a few seconds)
	for seed := int64(1); seed <= n; seed++ {
		term, req := randomPatRequest(seed)
		name := fmt.Sprintf("seed %d: %s", seed, req)
		ex, err := Explain(context.Background(), term, []Request{req}, ExplainOptions{Seed: 1, VerifyModels: true, Alternatives: -1})
		require.NoError(t, err, name)
		all := func(timetable.Violation) bool { return true }
		want := patBruteFeasible(term, nil, all, &req)
		require.Equal(t, want, ex.Status == StatusGranted, "%s: %s", name, ex.Status)
		if want {
			require.Empty(t, timetable.HardViolations(timetable.Check(term, ex.Schedule)), name)
			require.True(t, patGrantsBrute(term, ex.Schedule, req), name)
			continue
		}
		refused++
		require.NotNil(t, ex.Conflict, name)
		if !ex.Conflict.Minimal {
			continue
		}
		assertBruteMinimal(t, name, term, ex.Conflict, req)
		if !ex.TermInfeasible {
			rr := ex.Requests[0]
			require.True(t, rr.PlacesComplete, name)
			var got []string
			for _, p := range rr.Places {
				got = append(got, fmt.Sprintf("%d/%s", p.Time, p.Room))
			}
			assert.ElementsMatch(t, patBrutePlaces(term, req), got, name)
		}
	}
	t.Logf("%d of %d requests refused", refused, n)
	require.Greater(t, refused, 3, "the random terms exercise refusals")
}

// randomPatRequest is a random pattern term (patternTerm: four sections)
// with up to two random hard relation rows between them (kinds of pattern
// terms, counted ones included), often a lunch break or a weekly limit
// for the first staff member, and a request
// for one of the meeting times of a random section, half the time in one
// of its rooms.
func randomPatRequest(seed int64) (*timetable.Term, Request) {
	kinds := []struct {
		k    timetable.RelationKind
		n, m int
	}{
		{timetable.DifferentDays, 0, 0}, {timetable.NoOverlap, 0, 0}, {timetable.SameStart, 0, 0},
		{timetable.MinGap, 30, 0}, {timetable.SameDayRel, 0, 0}, {timetable.DifferentRooms, 0, 0},
		{timetable.SameRoom, 0, 0}, {timetable.MaxDays, 1, 0}, {timetable.DaySpan, 150, 0},
		{timetable.FirstBefore, 0, 0}, {timetable.MaxDayMinutes, 100, 0}, {timetable.MaxBreaks, 0, 15},
		{timetable.MaxBlock, 100, 15}, {timetable.SamePeople, 0, 0}, {timetable.DifferentWeeks, 0, 0},
	}
	term := patternTerm(seed, 4, 3, 2)
	rng := xRand(uint64(seed))
	for k := rng.IntN(3); k > 0; k-- {
		a, c := rng.IntN(4), rng.IntN(4)
		if a == c {
			continue
		}
		kd := kinds[rng.IntN(len(kinds))]
		rel := timetable.Relation{Kind: kd.k, Hard: true, N: kd.n, M: kd.m,
			Sections: []string{term.Sections[a].ID, term.Sections[c].ID},
			Src:      timetable.Source{Sheet: "Relations", Row: len(term.Relations) + 2}}
		term.Relations = append(term.Relations, rel)
	}
	switch rng.IntN(4) {
	case 0:
		term.Staff[0].Lunch = timetable.LunchBreak{From: 11 * 60, To: 13 * 60, Minutes: 60}
	case 1:
		term.Staff[0].MaxWeekMinutes = 100
	case 2:
		term.Staff[0].MaxWeekDays = 1
	}
	sec := &term.Sections[rng.IntN(4)]
	tc := sec.Times[rng.IntN(len(sec.Times))]
	req := Request{Section: sec.ID, Start: tc.Start}
	req.Day, _ = tc.Days.First()
	if tc.Days.Count() > 1 {
		req.Days = tc.Days
	}
	if opts := patBruteChoices(term, sec); !sec.NoRoom && rng.IntN(2) == 0 {
		req.Room = opts[rng.IntN(len(opts))].Room
	}
	return term, req
}

// assertBruteMinimal checks by brute force that conflict c is a minimal
// unsatisfiable set: with only its reasons and sections it cannot hold,
// and without any one reason or section it can.
func assertBruteMinimal(t *testing.T, name string, term *timetable.Term, c *Conflict, req Request) {
	t.Helper()
	var secs []string
	for _, s := range c.Sections {
		secs = append(secs, s.ID)
	}
	keep := func(rs []Reason) func(timetable.Violation) bool {
		return func(v timetable.Violation) bool {
			return slices.ContainsFunc(rs, func(r Reason) bool { return patViolationOf(v, r) })
		}
	}
	hasReq := func(rs []Reason, ss []string) *Request {
		if slices.ContainsFunc(rs, func(r Reason) bool { return r.Kind == KindRequest }) && slices.Contains(ss, req.Section) {
			return &req
		}
		return nil
	}
	reasons := c.Reasons
	require.False(t, patBruteFeasible(term, secs, keep(reasons), hasReq(reasons, secs)), "%s: the conflict alone holds by brute force: %v", name, reasons)
	for i, r := range reasons {
		rest := slices.Delete(slices.Clone(reasons), i, i+1)
		require.True(t, patBruteFeasible(term, secs, keep(rest), hasReq(rest, secs)), "%s: without %q the conflict still cannot hold", name, r.Sentence)
	}
	for i := range secs {
		rest := slices.Delete(slices.Clone(secs), i, i+1)
		require.True(t, patBruteFeasible(term, rest, keep(reasons), hasReq(reasons, rest)), "%s: without section %s the conflict still cannot hold", name, secs[i])
	}
}

// TestPatternPlacesOfBrute: PlacesOf on random pattern terms lists
// exactly the (meeting time, room) choices that some timetable passing
// timetable.Check gives the section (brute force), cheapest first.
func TestPatternPlacesOfBrute(t *testing.T) {
	for seed := int64(1); seed <= 12; seed++ {
		term, req := randomPatRequest(seed)
		if !patBruteFeasible(term, nil, func(timetable.Violation) bool { return true }, nil) {
			continue
		}
		places, complete, err := PlacesOf(context.Background(), term, req.Section, ExplainOptions{Seed: 1})
		require.NoError(t, err)
		require.True(t, complete)
		var got []string
		for i, p := range places {
			got = append(got, fmt.Sprintf("%d/%s", p.Time, p.Room))
			if i > 0 {
				assert.LessOrEqual(t, places[i-1].Cost, p.Cost, "seed %d: cheapest first", seed)
			}
		}
		none := Request{Section: req.Section, Start: -1} // names no meeting time
		assert.ElementsMatch(t, patBrutePlaces(term, none), got, "seed %d", seed)
	}
}

// FuzzParseWhen: what ParseWhen reads, written back as days and start,
// reads the same (a round trip).
func FuzzParseWhen(f *testing.F) {
	for _, s := range []string{"Tue 10:00", "Mon Wed Fri 9:00", "tuesday 9.30", "Mon,Wed/Fri 13:05", "Sun 0:00", "x 10:00", "Mon 25:00", ""} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		days, start, err := ParseWhen(s)
		if err != nil {
			return
		}
		again := days.String() + " " + start.String()
		d2, s2, err := ParseWhen(again)
		require.NoError(t, err, "%q read as %q", s, again)
		require.Equal(t, days, d2)
		require.Equal(t, start, s2)
		r, err := NewRequest("S", s, "")
		require.NoError(t, err)
		require.Equal(t, days.Count() > 1, r.Days != 0)
		require.True(t, days.Has(r.Day))
	})
}
