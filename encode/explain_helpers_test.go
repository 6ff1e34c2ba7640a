package encode

import (
	"context"
	"fmt"
	"math/rand/v2"
	"slices"
	"testing"
	"time"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// xTerm builds small terms for the explanation tests.
type xTerm struct{ t *timetable.Term }

// newXTerm makes days × perDay one-hour periods from 09:00, consecutive
// within a day, over a twelve-week term.
func newXTerm(days, perDay int) *xTerm {
	t := &timetable.Term{
		Name:     "Explain test",
		FirstDay: time.Date(2027, 9, 6, 0, 0, 0, 0, time.UTC),
		LastDay:  time.Date(2027, 11, 26, 0, 0, 0, 0, time.UTC),
	}
	for d := 0; d < days; d++ {
		for k := 0; k < perDay; k++ {
			start := timetable.Clock(9*60 + 60*k)
			t.Periods = append(t.Periods, timetable.Period{Index: len(t.Periods), Day: time.Weekday(1 + d),
				Start: start, End: start + 60, Src: timetable.Source{Sheet: "Periods", Row: len(t.Periods) + 2}})
		}
	}
	return &xTerm{t: t}
}

func (b *xTerm) room(id string, capacity int, features ...string) *xTerm {
	b.t.Rooms = append(b.t.Rooms, timetable.Room{ID: id, Capacity: capacity, Features: features,
		Src: timetable.Source{Sheet: "Rooms", Row: len(b.t.Rooms) + 2}})
	return b
}

// sec adds a section of one one-period meeting for 10 students; opts
// adjust it. Staff and cohorts it names are created.
func (b *xTerm) sec(id string, opts ...func(*timetable.Section)) *xTerm {
	s := timetable.Section{ID: id, Title: "Course " + id, Size: 10, Meetings: 1, Length: 1,
		Src: timetable.Source{Sheet: "Sections", Row: len(b.t.Sections) + 2}}
	for _, o := range opts {
		o(&s)
	}
	for _, st := range s.Staff {
		if !slices.ContainsFunc(b.t.Staff, func(x timetable.Staff) bool { return x.ID == st }) {
			b.t.Staff = append(b.t.Staff, timetable.Staff{ID: st, Name: "Staff " + st,
				Src: timetable.Source{Sheet: "Staff", Row: len(b.t.Staff) + 2}})
		}
	}
	for _, c := range s.Cohorts {
		if !slices.ContainsFunc(b.t.Cohorts, func(x timetable.Cohort) bool { return x.ID == c }) {
			b.t.Cohorts = append(b.t.Cohorts, timetable.Cohort{ID: c, Name: "Cohort " + c,
				Src: timetable.Source{Sheet: "Cohorts", Row: len(b.t.Cohorts) + 2}})
		}
	}
	b.t.Sections = append(b.t.Sections, s)
	return b
}

func (b *xTerm) unavail(kind timetable.WhoKind, who string, day time.Weekday, from, to int) *xTerm {
	b.t.Unavailable = append(b.t.Unavailable, timetable.Unavailability{Who: who, Kind: kind, Day: day,
		From: timetable.Clock(from * 60), To: timetable.Clock(to * 60), Hard: true,
		Src: timetable.Source{Sheet: "Unavailable", Row: len(b.t.Unavailable) + 2}})
	return b
}

func (b *xTerm) rel(kind timetable.RelationKind, secs ...string) *xTerm {
	b.t.Relations = append(b.t.Relations, timetable.Relation{Kind: kind, Sections: secs, Hard: true,
		Src: timetable.Source{Sheet: "Relations", Row: len(b.t.Relations) + 2}})
	return b
}

func xStaff(ids ...string) func(*timetable.Section) {
	return func(s *timetable.Section) { s.Staff = ids }
}
func xCohort(ids ...string) func(*timetable.Section) {
	return func(s *timetable.Section) { s.Cohorts = ids }
}
func xNeeds(f ...string) func(*timetable.Section) { return func(s *timetable.Section) { s.Needs = f } }
func xSize(n int) func(*timetable.Section)        { return func(s *timetable.Section) { s.Size = n } }
func xMeet(m, length int) func(*timetable.Section) {
	return func(s *timetable.Section) { s.Meetings, s.Length = m, length }
}
func xFixed(day time.Weekday, hour int, room string) func(*timetable.Section) {
	return func(s *timetable.Section) {
		s.Fixed = append(s.Fixed, timetable.Fixed{Day: day, Start: timetable.Clock(hour * 60), Room: room,
			Text: fmt.Sprintf("%s %02d:00 %s", timetable.DayName(day), hour, room)})
	}
}

// newTestExplainer compiles t for explanation with model verification on.
func newTestExplainer(tb testing.TB, t *timetable.Term, reqs ...Request) *Explainer {
	tb.Helper()
	x, err := NewExplainer(t, reqs, ExplainOptions{Seed: 1, VerifyModels: true})
	if err != nil {
		tb.Fatalf("NewExplainer: %v", err)
	}
	return x
}

// status checks the groups as given (every other group off) and returns
// the outcome.
func (x *Explainer) statusOf(tb testing.TB, on []bool) solver.Status {
	tb.Helper()
	r, err := x.check(context.Background(), on, nil)
	if err != nil {
		tb.Fatal(err)
	}
	return r.status
}

// assertMinimalConflict checks that set cannot hold (every other group
// off) and that switching off any one member makes the rest hold: the
// definition of a minimal unsatisfiable subset.
func assertMinimalConflict(tb testing.TB, x *Explainer, set []int) {
	tb.Helper()
	if st := x.statusOf(tb, x.onlyOn(set)); st != solver.Unsatisfiable {
		tb.Fatalf("conflict %v: %v, want unsatisfiable", x.names(set), st)
	}
	for _, g := range set {
		rest := slices.DeleteFunc(slices.Clone(set), func(h int) bool { return h == g })
		if st := x.statusOf(tb, x.onlyOn(rest)); st != solver.Satisfiable {
			tb.Fatalf("conflict %v without %q: %v, want satisfiable (not minimal)", x.names(set), x.cat.Groups[g].Sentence, st)
		}
	}
}

// names lists the selector names of groups, for messages.
func (x *Explainer) names(groups []int) []string {
	out := make([]string, len(groups))
	for i, g := range groups {
		out[i] = x.p.Name(x.cat.Groups[g].Selector)
	}
	return out
}

// xRand is a seeded source for the random terms.
func xRand(seed uint64) *rand.Rand { return rand.New(rand.NewPCG(seed, 0x5eed)) }

// randomXTerm makes a small random term, often infeasible: one or two
// days of three or four periods, two or three rooms (one maybe a lab),
// three to five sections with shared staff and cohorts, hard unavailable
// rows, fixed meetings and relations.
func randomXTerm(rng *rand.Rand) *timetable.Term {
	b := newXTerm(1+rng.IntN(2), 4+rng.IntN(2))
	nRooms := 2 + rng.IntN(2)
	for r := 0; r < nRooms; r++ {
		if r == 0 && rng.IntN(2) == 0 {
			b.room("LAB", 20+10*rng.IntN(2), "lab")
		} else {
			b.room(fmt.Sprintf("R%d", r+1), 15+10*rng.IntN(3))
		}
	}
	days := b.t.Days()
	nSec := 3 + rng.IntN(3)
	for i := 0; i < nSec; i++ {
		var opts []func(*timetable.Section)
		opts = append(opts, xStaff(fmt.Sprintf("T%d", rng.IntN(3))), xCohort(fmt.Sprintf("C%d", rng.IntN(3))))
		if rng.IntN(3) == 0 {
			opts = append(opts, xMeet(2, 1))
			if len(days) == 1 || rng.IntN(3) == 0 {
				opts = append(opts, func(s *timetable.Section) { s.SameDay = true })
			}
		} else if rng.IntN(5) == 0 {
			opts = append(opts, xMeet(1, 2))
		}
		if rng.IntN(4) == 0 && (b.t.Rooms[0].ID == "LAB" || rng.IntN(4) == 0) {
			opts = append(opts, xNeeds("lab"))
		}
		opts = append(opts, xSize(10+5*rng.IntN(4)))
		if rng.IntN(5) == 0 {
			d := days[rng.IntN(len(days))]
			opts = append(opts, xFixed(d, 9+rng.IntN(2), ""))
		}
		b.sec(fmt.Sprintf("S%d", i+1), opts...)
	}
	for k := rng.IntN(4); k > 0; k-- {
		d := days[rng.IntN(len(days))]
		from := 9 + rng.IntN(3)
		switch rng.IntN(3) {
		case 0:
			b.unavail(timetable.WhoStaff, fmt.Sprintf("T%d", rng.IntN(3)), d, from, from+1+rng.IntN(2))
		case 1:
			b.unavail(timetable.WhoCohort, fmt.Sprintf("C%d", rng.IntN(3)), d, from, from+1)
		default:
			b.unavail(timetable.WhoRoom, b.t.Rooms[rng.IntN(nRooms)].ID, d, from, from+2)
		}
	}
	if rng.IntN(3) == 0 && nSec >= 2 {
		kinds := []timetable.RelationKind{timetable.SameTime, timetable.NotSameTime, timetable.DifferentDays, timetable.Before}
		b.rel(kinds[rng.IntN(len(kinds))], "S1", "S2")
	}
	// Drop staff and cohorts named only by unavailability rows.
	known := map[string]bool{}
	for _, s := range b.t.Staff {
		known["s"+s.ID] = true
	}
	for _, c := range b.t.Cohorts {
		known["c"+c.ID] = true
	}
	b.t.Unavailable = slices.DeleteFunc(b.t.Unavailable, func(u timetable.Unavailability) bool {
		return (u.Kind == timetable.WhoStaff && !known["s"+u.Who]) || (u.Kind == timetable.WhoCohort && !known["c"+u.Who])
	})
	return b.t
}
