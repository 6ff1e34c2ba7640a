package encode

import (
	"context"
	"fmt"
	"math/rand"
	"testing"
	"time"

	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// clashStudentTerm is patternTerm with two buildings 25 minutes apart (travel
// rows on every seed), students enrolled in 2 or 3 random sections each,
// and, when grid is set, one grid section on a small grid that students
// share with the pattern sections.
func clashStudentTerm(seed int64, nSec int, grid bool) *timetable.Term {
	tm := patternTerm(seed, nSec, 3, 3)
	rng := rand.New(rand.NewSource(seed * 31))
	for r := range tm.Rooms {
		tm.Rooms[r].Building = []string{"North", "South"}[r%2]
	}
	tm.Travel = []timetable.Travel{{From: "North", To: "South", Minutes: 25, Src: timetable.Source{Sheet: "Travel", Row: 2}}}
	if grid {
		tm.Periods = nil
		for _, d := range []int{1, 3} { // Mon, Wed
			for h := 8; h < 12; h++ {
				tm.Periods = append(tm.Periods, timetable.Period{Day: time.Weekday(d), Start: timetable.Clock(h * 60), End: timetable.Clock(h*60 + 50)})
			}
		}
		tm.Sections = append(tm.Sections, timetable.Section{ID: "G01", Meetings: 2, Length: 1, Size: 10, NoRoom: true,
			Weeks: tm.AllWeeks(), Src: timetable.Source{Sheet: "Sections", Row: 40}})
	}
	for st := 0; st < 6; st++ {
		for _, s := range rng.Perm(len(tm.Sections))[:2+rng.Intn(2)] {
			tm.Enrolments = append(tm.Enrolments, timetable.Enrolment{Student: fmt.Sprintf("P%d", st+1),
				Section: tm.Sections[s].ID, Src: timetable.Source{Sheet: "Enrolments", Row: len(tm.Enrolments) + 2}})
		}
	}
	return tm
}

// TestPatternStudentClashesAgreeWithCost enumerates every timetable of
// seeded tiny pattern terms (every combination of candidate time and room
// per section, and of grid starts for the grid section) and, for each one
// timetable.Check accepts, asks the engine for the model that places the
// meetings so: it must exist, and its weak-constraint cost must equal
// timetable.Cost of the timetable criterion by criterion (the third gate),
// "student clashes" included. The reference is timetable.Cost, which
// evaluates criteria.go's definition independently of the encoder.
func TestPatternStudentClashesAgreeWithCost(t *testing.T) {
	checked, clashing := 0, 0
	for seed := int64(1); seed <= 24; seed++ {
		tm := clashStudentTerm(seed, 4, seed%4 == 0)
		p, cat, err := Compile(tm, Options{})
		if err != nil {
			continue // a section with no possible time or room
		}
		base, err := solver.New(p, solver.DefaultOptions())
		require.NoError(t, err)
		forEachTimetable(tm, cat, func(sched *timetable.Schedule, assume []solver.Lit) {
			if len(timetable.HardViolations(timetable.Check(tm, sched))) > 0 {
				return
			}
			s := base.Clone()
			s.Assume(assume...)
			require.Equal(t, solver.Satisfiable, s.Solve(context.Background()), "seed %d: the engine rejects a valid timetable %v", seed, sched.Placements)
			model := s.Model(nil)
			got, err := Decode(tm, cat, model)
			require.NoError(t, err)
			require.NoError(t, cat.thirdGate(tm, p, model, got, nil), "seed %d: %v", seed, got.Placements)
			want := TimeCost(tm, got, nil).Criterion(timetable.CritStudentClash).Cost
			require.Equal(t, want, cat.EngineCost(p, model)[critIndex[timetable.CritStudentClash]])
			checked++
			if want > 0 {
				clashing++
			}
		})
	}
	t.Logf("%d timetables checked, %d with student clashes", checked, clashing)
	require.Greater(t, checked, 100)
	require.Greater(t, clashing, 20)
}

// forEachTimetable calls fn with every combination of candidate decisions
// of the compiled term: a time and a room (when it takes one) per pattern
// section, a set of Meetings start periods per grid section, as a
// schedule and as the assumptions that fix those decisions.
func forEachTimetable(tm *timetable.Term, cat *Catalog, fn func(*timetable.Schedule, []solver.Lit)) {
	type choice struct {
		pls    []timetable.Placement
		assume []solver.Lit
	}
	opts := make([][]choice, len(tm.Sections))
	for s := range tm.Sections {
		sec := &tm.Sections[s]
		if cat.IsPattern(s) {
			for _, i := range cat.TimeCandidates(s) {
				rooms := cat.RoomCandidates(s)
				if len(rooms) == 0 {
					opts[s] = append(opts[s], choice{[]timetable.Placement{{Section: sec.ID, Meeting: 1, Period: -1, Time: i + 1}},
						[]solver.Lit{solver.Pos(cat.TimeAtom(s, i))}})
				}
				for _, r := range rooms {
					opts[s] = append(opts[s], choice{[]timetable.Placement{{Section: sec.ID, Meeting: 1, Period: -1, Time: i + 1, Room: tm.Rooms[r].ID}},
						[]solver.Lit{solver.Pos(cat.TimeAtom(s, i)), solver.Pos(cat.RoomAtom(s, r))}})
				}
			}
			continue
		}
		starts := cat.Candidates(s)
		var rec func(k int, c choice)
		rec = func(k int, c choice) {
			if len(c.pls) == sec.Meetings {
				opts[s] = append(opts[s], choice{append([]timetable.Placement(nil), c.pls...), append([]solver.Lit(nil), c.assume...)})
				return
			}
			for ; k < len(starts); k++ {
				p := starts[k]
				rec(k+1, choice{append(c.pls, timetable.Placement{Section: sec.ID, Meeting: len(c.pls) + 1, Period: p}),
					append(c.assume, solver.Pos(cat.StartAtom(s, p)))})
			}
		}
		rec(0, choice{})
	}
	pick := make([]choice, len(tm.Sections))
	var rec func(s int)
	rec = func(s int) {
		if s == len(tm.Sections) {
			sched := &timetable.Schedule{}
			var assume []solver.Lit
			for _, c := range pick {
				sched.Placements = append(sched.Placements, c.pls...)
				assume = append(assume, c.assume...)
			}
			fn(sched, assume)
			return
		}
		for _, c := range opts[s] {
			pick[s] = c
			rec(s + 1)
		}
	}
	rec(0)
}

// BenchmarkCompileStudentClashes compiles a random pattern term of 150
// sections with 3,000 students in 4 to 6 sections each, with travel: the
// cost of writing the pattern student clashes (compare the atoms and
// rules per section reported with those of the same term without
// enrolments).
func BenchmarkCompileStudentClashes(b *testing.B) {
	tm := clashStudentTerm(3, 150, false)
	rng := rand.New(rand.NewSource(9))
	tm.Enrolments = nil
	for r := range tm.Rooms {
		tm.Rooms[r].Capacity = 1000
	}
	tm.Unavailable = nil
	for st := 0; st < 3000; st++ {
		for _, s := range rng.Perm(len(tm.Sections))[:4+rng.Intn(3)] {
			tm.Enrolments = append(tm.Enrolments, timetable.Enrolment{Student: fmt.Sprintf("P%d", st), Section: tm.Sections[s].ID})
		}
	}
	b.ReportAllocs()
	for b.Loop() {
		p, cat, err := Compile(tm, Options{})
		if err != nil {
			b.Fatal(err)
		}
		st := cat.Stats(p)
		b.ReportMetric(st.AtomsPerSec, "atoms/section")
		b.ReportMetric(st.RulesPerSec, "rules/section")
		b.ReportMetric(float64(len(p.Weaks)), "weaks")
	}
}
