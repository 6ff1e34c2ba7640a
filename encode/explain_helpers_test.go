package encode

import (
	"context"
	"fmt"
	"math/rand/v2"
	"slices"
	"testing"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

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
	b := newTerm(1+rng.IntN(2), 4+rng.IntN(2))
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
		opts = append(opts, staffOf(fmt.Sprintf("T%d", rng.IntN(3))), cohortsOf(fmt.Sprintf("C%d", rng.IntN(3))))
		if rng.IntN(3) == 0 {
			opts = append(opts, meetings(2, 1))
			if len(days) == 1 || rng.IntN(3) == 0 {
				opts = append(opts, func(s *timetable.Section) { s.SameDay = true })
			}
		} else if rng.IntN(5) == 0 {
			opts = append(opts, meetings(1, 2))
		}
		if rng.IntN(4) == 0 && (b.t.Rooms[0].ID == "LAB" || rng.IntN(4) == 0) {
			opts = append(opts, needs("lab"))
		}
		opts = append(opts, sized(10+5*rng.IntN(4)))
		if rng.IntN(5) == 0 {
			d := days[rng.IntN(len(days))]
			opts = append(opts, fixedAt(d, 9+rng.IntN(2), ""))
		}
		b.section(fmt.Sprintf("S%d", i+1), opts...)
	}
	for k := rng.IntN(4); k > 0; k-- {
		d := days[rng.IntN(len(days))]
		from := 9 + rng.IntN(3)
		switch rng.IntN(3) {
		case 0:
			b.unavailable(timetable.WhoStaff, fmt.Sprintf("T%d", rng.IntN(3)), d, from, from+1+rng.IntN(2))
		case 1:
			b.unavailable(timetable.WhoCohort, fmt.Sprintf("C%d", rng.IntN(3)), d, from, from+1)
		default:
			b.unavailable(timetable.WhoRoom, b.t.Rooms[rng.IntN(nRooms)].ID, d, from, from+2)
		}
	}
	if rng.IntN(3) == 0 && nSec >= 2 {
		kinds := []timetable.RelationKind{timetable.SameTime, timetable.NotSameTime, timetable.DifferentDays, timetable.Before}
		b.relation(kinds[rng.IntN(len(kinds))], "S1", "S2")
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
