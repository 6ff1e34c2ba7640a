package encode

import (
	"context"
	"testing"
	"time"

	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

func timesOf(cs ...timetable.TimeChoice) func(*timetable.Section) {
	return func(s *timetable.Section) { s.Times, s.Length = cs, 0 }
}

func mon(h, m, mins int) timetable.TimeChoice {
	return timetable.TimeChoice{Days: timetable.DaysOf(time.Monday), Start: timetable.Clock(60*h + m), Minutes: mins}
}

// mixedTerm: grid periods Mon/Tue 09:00-12:00; grid section G (staff T1,
// room R1 only) can meet only Mon 09:00 (T1 is away on Tuesday, G's
// cohort from 10:00 on Monday); pattern section P of T1 in room R1 has the
// given patterns.
func mixedTerm(pats ...timetable.TimeChoice) *timetable.Term {
	tb := newTerm(2, 3).room("R1", 30).room("R2", 30)
	tb.section("G", staffOf("T1"), cohortsOf("K1"), roomsOf("R1"))
	tb.section("P", staffOf("T1"), roomsOf("R1", "R2"), timesOf(pats...))
	tb.unavailable(timetable.WhoStaff, "T1", time.Tuesday, 8, 13)
	tb.unavailable(timetable.WhoCohort, "K1", time.Monday, 10, 13)
	for i := range tb.t.Sections[1].Times {
		tb.t.Sections[1].Times[i].Weeks = tb.t.AllWeeks()
	}
	return tb.t
}

// TestMixedGridAndPattern: a grid meeting and a pattern meeting of one
// staff member take part in the same bounds. Worked by hand: G must meet
// Mon 09:00-10:00, so P cannot take Mon 09:30-10:20 and must take Mon
// 10:00 (half-open meetings only touch); with only the 09:30 pattern there
// is no timetable. The timetable passes timetable.Check.
func TestMixedGridAndPattern(t *testing.T) {
	tm := mixedTerm(mon(9, 30, 50), mon(10, 0, 50))
	res, err := Solve(context.Background(), tm, SolveOptions{Seed: 3})
	require.NoError(t, err)
	require.Equal(t, solver.Satisfiable, res.Status)
	require.Empty(t, timetable.HardViolations(timetable.Check(tm, res.Schedule)))
	var got timetable.Placement
	for _, pl := range res.Schedule.Placements {
		if pl.Section == "P" {
			got = pl
		}
	}
	require.Equal(t, 2, got.Time)
	require.Equal(t, -1, got.Period)

	res, err = Solve(context.Background(), mixedTerm(mon(9, 30, 50)), SolveOptions{Seed: 3})
	require.NoError(t, err)
	require.Equal(t, solver.Unsatisfiable, res.Status)
}

// TestMixedRoomShared: a grid section whose only room is R1 and a pattern
// section that may use R1 or R2 at the same time: the pattern section
// must take R2 (worked by hand). With R1 and R2 both open to the grid
// section (explicit grid rooms, rooms_grid.go), one takes each room
// (worked by hand: two rooms, two meetings at Mon 09:00).
func TestMixedRoomShared(t *testing.T) {
	tb := newTerm(1, 3).room("R1", 30).room("R2", 30)
	tb.section("G", roomsOf("R1"), fixedAt(time.Monday, 9, ""))
	tb.section("P", roomsOf("R1", "R2"), timesOf(mon(9, 0, 60)))
	tb.t.Sections[1].Times[0].Weeks = tb.t.AllWeeks()
	res, err := Solve(context.Background(), tb.t, SolveOptions{Seed: 1})
	require.NoError(t, err)
	require.Equal(t, solver.Satisfiable, res.Status)
	require.Empty(t, timetable.HardViolations(timetable.Check(tb.t, res.Schedule)))
	for _, pl := range res.Schedule.Placements {
		if pl.Section == "P" {
			require.Equal(t, "R2", pl.Room)
		}
	}
	tb.t.Sections[0].Rooms = []string{"R1", "R2"}
	res, err = Solve(context.Background(), tb.t, SolveOptions{Seed: 1})
	require.NoError(t, err)
	require.Equal(t, solver.Satisfiable, res.Status)
	require.Empty(t, timetable.HardViolations(timetable.Check(tb.t, res.Schedule)))
	rooms := map[string]string{}
	for _, pl := range res.Schedule.Placements {
		rooms[pl.Section] = pl.Room
	}
	require.NotEqual(t, rooms["G"], rooms["P"])
	// A third section that needs one of the two rooms then leaves none.
	tb.section("Q", roomsOf("R1", "R2"), timesOf(mon(9, 30, 30)))
	tb.t.Sections[2].Times[0].Weeks = tb.t.AllWeeks()
	res, err = Solve(context.Background(), tb.t, SolveOptions{Seed: 1})
	require.NoError(t, err)
	require.Equal(t, solver.Unsatisfiable, res.Status)
}

// TestPatternKeep: re-planning with the timetable itself kept moves
// nothing ("moved meetings" is the top level); keeping a timetable whose
// one section now has a pattern forbidden moves exactly that section, and
// Moves reports it as moved (another meeting time or room).
func TestPatternKeep(t *testing.T) {
	for seed := int64(1); seed <= 12; seed++ {
		tm := patternTerm(seed, 6, 4, 3)
		first, err := Solve(context.Background(), tm, SolveOptions{Seed: seed})
		if err != nil || first.Status != solver.Satisfiable {
			continue
		}
		res, err := Optimize(context.Background(), tm, OptimizeOptions{Seed: seed, Keep: first.Schedule, MaxStall: 10})
		require.NoError(t, err)
		require.Empty(t, res.Moves, "seed %d", seed)
		// Forbid the kept pattern of the first section by a hard row of the
		// section on its first day.
		pl := first.Schedule.Placements[0]
		s := tm.SectionIndex()[pl.Section]
		tc := tm.Sections[s].Times[pl.Time-1]
		d, _ := tc.Days.First()
		tm.Unavailable = append(tm.Unavailable, timetable.Unavailability{Who: pl.Section, Kind: timetable.WhoSection,
			Day: d, From: tc.Start, To: tc.End(), Hard: true, Src: timetable.Source{Sheet: "Unavailable", Row: 99}})
		res, err = Optimize(context.Background(), tm, OptimizeOptions{Seed: seed, Keep: first.Schedule, MaxStall: 10})
		if err != nil {
			var ce CompileError
			require.ErrorAs(t, err, &ce) // that was its only possible time
			continue
		}
		if res.Status != solver.Satisfiable {
			continue
		}
		require.Empty(t, timetable.HardViolations(timetable.Check(tm, res.Schedule)))
		require.NotEmpty(t, res.Moves)
		require.Equal(t, pl.Section, res.Moves[0].Section)
		require.Equal(t, ChangeMoved, res.Moves[0].Change)
	}
}
