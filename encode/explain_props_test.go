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

// randomTinyXTerm is a random term small enough for exhaustive search: one
// day of four or five periods, two or three rooms, three or four sections.
func randomTinyXTerm(rng *rand.Rand) *timetable.Term {
	for {
		t := randomXTerm(rng)
		if len(t.Days()) == 1 && len(t.Sections) <= 4 {
			return t
		}
	}
}

// xBrute calls fn for every timetable of t that timetable.Check accepts
// (no hard violation), trying every choice of start periods and rooms for
// every meeting, until fn returns false; a search this plain is the
// reference the engine answers are held to. Double bookings of staff,
// cohorts and rooms, hard unavailability and rooms that cannot hold a
// section prune early (they are always hard violations); everything else
// is left to Check.
func xBrute(t *timetable.Term, fn func(*timetable.Schedule) bool) {
	type key struct {
		kind byte
		id   string
		p    int
	}
	busy := map[key]bool{}
	for _, u := range t.Unavailable {
		if !u.Hard {
			continue
		}
		kind := map[timetable.WhoKind]byte{timetable.WhoStaff: 's', timetable.WhoCohort: 'c', timetable.WhoRoom: 'r', timetable.WhoSection: 'x'}[u.Kind]
		for p, per := range t.Periods {
			if u.Covers(per) {
				busy[key{kind, u.Who, p}] = true
			}
		}
	}
	stop := false
	var place []timetable.Placement
	var rec func(s int)
	occupy := func(sec *timetable.Section, p int, room string, on bool) bool {
		var keys []key
		span, _ := t.Span(p, sec.Length)
		for _, q := range span {
			if on && busy[key{'x', sec.ID, q}] {
				return false
			}
			for _, id := range sec.Staff {
				keys = append(keys, key{'s', id, q})
			}
			for _, id := range sec.Cohorts {
				keys = append(keys, key{'c', id, q})
			}
			if room != "" {
				keys = append(keys, key{'r', room, q})
			}
		}
		if on {
			for _, k := range keys {
				if busy[k] {
					return false
				}
			}
		}
		for _, k := range keys {
			busy[k] = on
		}
		return true
	}
	rec = func(s int) {
		if stop {
			return
		}
		if s == len(t.Sections) {
			sched := &timetable.Schedule{Placements: slices.Clone(place)}
			if len(timetable.HardViolations(timetable.Check(t, sched))) == 0 {
				stop = !fn(sched)
			}
			return
		}
		sec := &t.Sections[s]
		rooms := []string{""}
		if !sec.NoRoom {
			// Rooms that cannot hold the section are always a hard
			// violation (capacity, features, allowed rooms).
			rooms = rooms[:0]
			for i := range t.Rooms {
				r := &t.Rooms[i]
				if (t.SoftCapacity || r.Capacity >= sec.Size) && r.HasFeatures(sec.Needs) &&
					(len(sec.Rooms) == 0 || slices.Contains(sec.Rooms, r.ID)) {
					rooms = append(rooms, r.ID)
				}
			}
		}
		var meet func(m, from int)
		meet = func(m, from int) {
			if m > sec.Meetings {
				rec(s + 1)
				return
			}
			for p := from; p < len(t.Periods); p++ {
				if _, ok := t.Span(p, sec.Length); !ok {
					continue
				}
				for _, room := range rooms {
					if !occupy(sec, p, room, true) {
						continue
					}
					place = append(place, timetable.Placement{Section: sec.ID, Meeting: m, Period: p, Room: room})
					meet(m+1, p+1)
					place = place[:len(place)-1]
					occupy(sec, p, room, false)
				}
			}
		}
		meet(1, 0)
	}
	rec(0)
}

// TestExplainProperties: on many random small terms, a timetable exists
// exactly when exhaustive search finds one; every conflict reported cannot
// hold (re-solved with only its groups) and is minimal (dropping any member
// makes the rest hold); every relaxation makes the term feasible and is
// minimal (putting back any member makes it infeasible again).
func TestExplainProperties(t *testing.T) {
	n := 150
	if testing.Short() {
		n = 40
	}
	rng := xRand(6)
	infeasible, counted := 0, 0
	coreSum, musSum := 0, 0 // groups and sections in the engine's cores and in the shrunk sets
	var bruteTime time.Duration
	for i := 0; i < n; i++ {
		term := randomTinyXTerm(rng)
		t.Run(fmt.Sprint(i), func(t *testing.T) {
			found := false
			t0 := time.Now()
			xBrute(term, func(*timetable.Schedule) bool { found = true; return false })
			bruteTime += time.Since(t0)
			x := newTestExplainer(t, term)
			ctx := context.Background()
			r, err := x.check(ctx, x.allOn(), nil)
			if err != nil {
				t.Fatal(err)
			}
			if (r.status == solver.Satisfiable) != found {
				t.Fatalf("engine %v, exhaustive search found a timetable: %v\n%s", r.status, found, describeXTerm(term))
			}
			if r.status == solver.Satisfiable {
				if err := x.witness(r); err != nil {
					t.Fatal(err)
				}
				return
			}
			infeasible++
			if cc := x.countingConflict(); cc != nil {
				// A conflict proved by counting holds up to the engine
				// and shrinks to a minimal one without a search for it.
				counted++
				if st := x.statusOf(t, x.onlyOn(cc)); st != solver.Unsatisfiable {
					t.Fatalf("counting conflict %v: %v, want unsatisfiable", x.names(cc), st)
				}
				mus, minimal, err := x.shrinkFrom(ctx, cc, false)
				if err != nil || !minimal {
					t.Fatalf("shrinking a counting conflict: minimal %v, %v", minimal, err)
				}
				assertMinimalConflict(t, x, mus)
			}
			mus, minimal, err := x.shrink(ctx, r.core)
			coreSum += len(r.core)
			musSum += len(mus)
			if err != nil {
				t.Fatal(err)
			}
			if !minimal {
				t.Fatalf("shrinking ran out of budget on a tiny term")
			}
			assertMinimalConflict(t, x, mus)
			fixes, _, err := x.corrections(ctx, [][]int{mus}, 3)
			if err != nil {
				t.Fatal(err)
			}
			for _, h := range fixes {
				if st := x.statusOf(t, x.allOn(h...)); st != solver.Satisfiable {
					t.Fatalf("relaxing %v: %v, want satisfiable", x.names(h), st)
				}
				for _, g := range h {
					rest := slices.DeleteFunc(slices.Clone(h), func(e int) bool { return e == g })
					if st := x.statusOf(t, x.allOn(rest...)); st != solver.Unsatisfiable {
						t.Fatalf("relaxing %v is not minimal: without %q it is %v", x.names(h), x.p.Name(x.cat.Groups[g].Selector), st)
					}
				}
			}
		})
	}
	t.Logf("%d of %d terms infeasible (%d proved by counting); engine cores %d members in all, shrunk to %d; brute force %v", infeasible, n, counted, coreSum, musSum, bruteTime)
	if infeasible < n/5 {
		t.Fatalf("only %d of %d random terms were infeasible: the generator no longer tests explanations", infeasible, n)
	}
}

// TestRequestsAgainstBruteForce: on random tiny terms, a request for a
// section at a start period (and, in a second round, in a room) is granted
// exactly when exhaustive search finds a timetable that honours it.
func TestRequestsAgainstBruteForce(t *testing.T) {
	n := 60
	if testing.Short() {
		n = 15
	}
	rng := xRand(11)
	granted, refused := 0, 0
	for i := 0; i < n; i++ {
		term := randomTinyXTerm(rng)
		possible := map[string]bool{} // "S1@3" and "S1@3@R2"
		xBrute(term, func(s *timetable.Schedule) bool {
			for _, pl := range s.Placements {
				possible[fmt.Sprintf("%s@%d", pl.Section, pl.Period)] = true
				possible[fmt.Sprintf("%s@%d@%s", pl.Section, pl.Period, pl.Room)] = true
			}
			return true
		})
		for _, sec := range term.Sections {
			for p, per := range term.Periods {
				rooms := []string{""}
				if !sec.NoRoom && rng.IntN(3) == 0 {
					rooms = append(rooms, term.Rooms[rng.IntN(len(term.Rooms))].ID)
				}
				for _, room := range rooms {
					req := Request{Section: sec.ID, Day: per.Day, Start: per.Start, Room: room}
					key := fmt.Sprintf("%s@%d", sec.ID, p)
					if room != "" {
						key += "@" + room
					}
					ex, err := Explain(context.Background(), term, []Request{req}, ExplainOptions{Seed: 1, VerifyModels: true, Alternatives: -1, NoCost: true})
					if err != nil {
						t.Fatal(err)
					}
					if got := ex.Status == StatusGranted; got != possible[key] {
						t.Fatalf("term %d, request %s: granted=%v, exhaustive search %v\n%s", i, req, got, possible[key], describeXTerm(term))
					}
					if ex.Status == StatusRefused && !ex.TermInfeasible {
						// The other places are exactly the starts where
						// exhaustive search meets the section.
						var want, got []int
						for q := range term.Periods {
							if possible[fmt.Sprintf("%s@%d", sec.ID, q)] && (q != p || room != "") {
								want = append(want, q)
							}
						}
						for _, pl := range ex.Requests[0].Places {
							got = append(got, pl.Period)
						}
						if !ex.Requests[0].PlacesComplete || !slices.Equal(got, want) {
							t.Fatalf("term %d, request %s: places %v (complete %v), exhaustive search %v\n%s", i, req, got, ex.Requests[0].PlacesComplete, want, describeXTerm(term))
						}
					}
					if possible[key] {
						granted++
					} else {
						refused++
					}
				}
			}
		}
	}
	if granted < n || refused < n {
		t.Fatalf("%d requests granted and %d refused: the generator no longer tests both answers", granted, refused)
	}
	t.Logf("%d requests granted, %d refused, as exhaustive search says", granted, refused)
}

// describeXTerm prints a term for failure messages.
func describeXTerm(t *timetable.Term) string {
	out := fmt.Sprintf("%d periods on %d day(s)\n", len(t.Periods), len(t.Days()))
	for _, r := range t.Rooms {
		out += fmt.Sprintf("room %s cap %d %v\n", r.ID, r.Capacity, r.Features)
	}
	for _, s := range t.Sections {
		out += fmt.Sprintf("section %s staff %v cohorts %v size %d meetings %dx%d needs %v fixed %v\n",
			s.ID, s.Staff, s.Cohorts, s.Size, s.Meetings, s.Length, s.Needs, s.Fixed)
	}
	for _, u := range t.Unavailable {
		out += fmt.Sprintf("unavailable %s %s %s %s-%s\n", u.Kind, u.Who, timetable.DayName(u.Day), u.From, u.To)
	}
	for _, r := range t.Relations {
		out += fmt.Sprintf("relation %s %v\n", r.Kind, r.Sections)
	}
	return out
}
