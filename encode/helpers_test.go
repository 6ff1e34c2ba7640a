package encode

import (
	"context"
	"errors"
	"fmt"
	"testing"
	"time"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// termBuilder makes small hand-built terms for tests.
type termBuilder struct{ t *timetable.Term }

// newTerm makes a term with days × perDay one-hour periods from 09:00, all
// consecutive within a day, over a 12-week term.
func newTerm(days, perDay int) *termBuilder {
	t := &timetable.Term{
		Name:     "Test term",
		FirstDay: time.Date(2027, 9, 6, 0, 0, 0, 0, time.UTC), // a Monday
		LastDay:  time.Date(2027, 11, 26, 0, 0, 0, 0, time.UTC),
	}
	for d := 0; d < days; d++ {
		for k := 0; k < perDay; k++ {
			start := timetable.Clock(9*60 + 60*k)
			t.Periods = append(t.Periods, timetable.Period{
				Index: len(t.Periods), Day: time.Weekday(1 + d), Start: start, End: start + 60,
				Src: timetable.Source{Sheet: "Periods", Row: len(t.Periods) + 2},
			})
		}
	}
	return &termBuilder{t: t}
}

func (b *termBuilder) room(id string, capacity int, features ...string) *termBuilder {
	b.t.Rooms = append(b.t.Rooms, timetable.Room{ID: id, Capacity: capacity, Features: features,
		Src: timetable.Source{Sheet: "Rooms", Row: len(b.t.Rooms) + 2}})
	return b
}

func (b *termBuilder) hasStaff(id string) bool {
	for _, s := range b.t.Staff {
		if s.ID == id {
			return true
		}
	}
	return false
}

func (b *termBuilder) hasCohort(id string) bool {
	for _, c := range b.t.Cohorts {
		if c.ID == id {
			return true
		}
	}
	return false
}

// section adds a section: one meeting of one period, size 10, taking a
// room; opts adjust it. Staff and cohorts it names are created.
func (b *termBuilder) section(id string, opts ...func(*timetable.Section)) *termBuilder {
	s := timetable.Section{ID: id, Title: "Course " + id, Size: 10, Meetings: 1, Length: 1,
		Src: timetable.Source{Sheet: "Sections", Row: len(b.t.Sections) + 2}}
	for _, o := range opts {
		o(&s)
	}
	for _, st := range s.Staff {
		if !b.hasStaff(st) {
			b.t.Staff = append(b.t.Staff, timetable.Staff{ID: st, Name: "Staff " + st,
				Src: timetable.Source{Sheet: "Staff", Row: len(b.t.Staff) + 2}})
		}
	}
	for _, c := range s.Cohorts {
		if !b.hasCohort(c) {
			b.t.Cohorts = append(b.t.Cohorts, timetable.Cohort{ID: c, Name: "Cohort " + c,
				Src: timetable.Source{Sheet: "Cohorts", Row: len(b.t.Cohorts) + 2}})
		}
	}
	b.t.Sections = append(b.t.Sections, s)
	return b
}

func (b *termBuilder) unavailable(kind timetable.WhoKind, who string, day time.Weekday, from, to int) *termBuilder {
	b.t.Unavailable = append(b.t.Unavailable, timetable.Unavailability{Who: who, Kind: kind, Day: day,
		From: timetable.Clock(from * 60), To: timetable.Clock(to * 60), Hard: true,
		Src: timetable.Source{Sheet: "Unavailable", Row: len(b.t.Unavailable) + 2}})
	return b
}

func (b *termBuilder) relation(kind timetable.RelationKind, secs ...string) *termBuilder {
	b.t.Relations = append(b.t.Relations, timetable.Relation{Kind: kind, Sections: secs, Hard: true,
		Src: timetable.Source{Sheet: "Relations", Row: len(b.t.Relations) + 2}})
	return b
}

func staffOf(ids ...string) func(*timetable.Section) {
	return func(s *timetable.Section) { s.Staff = ids }
}
func cohortsOf(ids ...string) func(*timetable.Section) {
	return func(s *timetable.Section) { s.Cohorts = ids }
}
func meetings(m, length int) func(*timetable.Section) {
	return func(s *timetable.Section) { s.Meetings, s.Length = m, length }
}
func sized(n int) func(*timetable.Section) { return func(s *timetable.Section) { s.Size = n } }
func noRoom(s *timetable.Section)          { s.NoRoom = true }
func sameDay(s *timetable.Section)         { s.SameDay = true }
func roomsOf(ids ...string) func(*timetable.Section) {
	return func(s *timetable.Section) { s.Rooms = ids }
}
func needs(f ...string) func(*timetable.Section) { return func(s *timetable.Section) { s.Needs = f } }
func weeks(w timetable.WeekSet) func(*timetable.Section) {
	return func(s *timetable.Section) { s.Weeks = w }
}
func fixedAt(day time.Weekday, hour int, room string) func(*timetable.Section) {
	return func(s *timetable.Section) {
		s.Fixed = append(s.Fixed, timetable.Fixed{Day: day, Start: timetable.Clock(hour * 60), Room: room,
			Text: fmt.Sprintf("%s %02d:00 %s", timetable.DayName(day), hour, room)})
	}
}

// outcome is what a test solve found.
type outcome struct {
	feasible bool
	sched    *timetable.Schedule
	prog     *solver.Program
	cat      *Catalog
	rounds   int
	hallCuts int
	nogoods  int
}

// solveRef runs the Solve pipeline with the reference SAT library instead
// of the engine: compile, solve, decode (adding lazy Hall families and room
// nogoods), and checks every timetable with timetable.Check.
func solveRef(tb testing.TB, term *timetable.Term) outcome {
	tb.Helper()
	p, cat, err := Compile(term, Options{})
	if err != nil {
		tb.Fatalf("compile: %v", err)
	}
	out := outcome{prog: p, cat: cat}
	var extra [][]solver.Lit
	for round := 0; round < 200; round++ {
		out.rounds++
		model, ok := refSolve(p, extra)
		if !ok {
			return out
		}
		if err := solver.Verify(p, model); err != nil {
			tb.Fatalf("model fails the verifier: %v", err)
		}
		sched, err := Decode(term, cat, model)
		var herr *HallError
		var rerr *RoomConflictError
		switch {
		case errors.As(err, &herr):
			b := cat.extender(p)
			added := false
			for _, set := range herr.sets {
				if _, ok := b.addFamily(set, true); ok {
					out.hallCuts++
					added = true
				}
			}
			if !added {
				tb.Fatalf("Hall violation %v found again after its constraints were added", herr)
			}
			continue
		case errors.As(err, &rerr):
			extra = append(extra, rerr.nogoods...)
			out.nogoods += len(rerr.nogoods)
			continue
		case err != nil:
			tb.Fatalf("decode: %v", err)
		}
		if hard := timetable.HardViolations(timetable.Check(term, sched)); len(hard) > 0 {
			for _, v := range hard {
				tb.Errorf("check: %s", v.Msg)
			}
			tb.FailNow()
		}
		out.feasible, out.sched = true, sched
		return out
	}
	tb.Fatalf("too many rounds")
	return out
}

// solveEngine runs Solve (the project's engine); Solve itself verifies every
// model and checks every timetable, and solveEngine checks the result again.
func solveEngine(tb testing.TB, term *timetable.Term) outcome {
	tb.Helper()
	res, err := Solve(context.Background(), term, SolveOptions{Seed: 1})
	if err != nil {
		tb.Fatalf("solve: %v", err)
	}
	out := outcome{prog: res.Program, cat: res.Catalog, rounds: res.Rounds, hallCuts: res.HallCuts, nogoods: res.Nogoods}
	switch res.Status {
	case solver.Satisfiable:
		if hard := timetable.HardViolations(timetable.Check(term, res.Schedule)); len(hard) > 0 {
			tb.Fatalf("check: %s", hard[0].Msg)
		}
		out.feasible, out.sched = true, res.Schedule
	case solver.Unsatisfiable:
	default:
		tb.Fatalf("solve: status %v (incomplete=%v)", res.Status, res.Incomplete)
	}
	return out
}

// solveBoth solves with the engine and with the reference library and
// insists that they agree on feasibility; it returns the engine's outcome
// (with the number of lazy Hall families the reference pipeline needed).
func solveBoth(tb testing.TB, term *timetable.Term) outcome {
	tb.Helper()
	eng := solveEngine(tb, term)
	ref := solveRef(tb, term)
	if eng.feasible != ref.feasible {
		tb.Fatalf("engine says feasible=%v, reference library says %v", eng.feasible, ref.feasible)
	}
	eng.hallCuts += ref.hallCuts
	eng.nogoods += ref.nogoods
	return eng
}
