package encode

import (
	"context"
	"slices"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/samples"
	"github.com/termwright/termwright/timetable"
)

// keepBase solves the demo once (a short, reproducible run) for the
// minimal-change tests.
func keepBase(t *testing.T) (*timetable.Term, *timetable.Schedule) {
	t.Helper()
	term := samples.Demo()
	res, err := Optimize(context.Background(), term, OptimizeOptions{Seed: 1, MaxSteps: 2})
	require.NoError(t, err)
	checkOptimized(t, term, nil, res)
	return term, res.Schedule
}

// TestKeepNoEdits: re-planning an unchanged term against its own timetable
// moves nothing.
func TestKeepNoEdits(t *testing.T) {
	term, last := keepBase(t)
	res, err := Optimize(context.Background(), term, OptimizeOptions{Seed: 9, Keep: last, MaxSteps: 2})
	require.NoError(t, err)
	checkOptimized(t, term, last, res)
	assert.Empty(t, res.Moves)
	assert.Zero(t, res.Cost.Criterion(timetable.CritMoved).Count)
	assert.True(t, res.Kept)
}

// TestKeepRoomClosed: when one room closes for the whole week, exactly the
// meetings held in it move (to other rooms, at their old times when they
// can), and every person and room touched is listed.
func TestKeepRoomClosed(t *testing.T) {
	term, last := keepBase(t)
	// Close the room with the fewest meetings (at least one).
	count := map[string]int{}
	for _, p := range last.Placements {
		if p.Room != "" {
			count[p.Room]++
		}
	}
	closed := ""
	for _, r := range term.Rooms {
		if n := count[r.ID]; n > 0 && (closed == "" || n < count[closed]) {
			closed = r.ID
		}
	}
	require.NotEmpty(t, closed)
	for _, d := range term.Days() {
		term.Unavailable = append(term.Unavailable, timetable.Unavailability{Who: closed, Kind: timetable.WhoRoom, Day: d,
			From: 0, To: 24 * 60, Hard: true, Reason: "closed for repairs", Src: timetable.Source{Sheet: "Unavailable", Row: 99}})
	}
	res, err := Optimize(context.Background(), term, OptimizeOptions{Seed: 9, Keep: last, MaxSteps: 2})
	require.NoError(t, err)
	checkOptimized(t, term, last, res)
	require.Len(t, res.Moves, count[closed], "only the meetings of the closed room move: %+v", res.Moves)
	for _, mv := range res.Moves {
		assert.Equal(t, ChangeMoved, mv.Change)
		assert.Equal(t, closed, mv.From.Room)
		assert.NotEqual(t, closed, mv.To.Room)
	}
	aff := Affect(term, res.Moves)
	var rooms []string
	for _, a := range aff {
		if a.Kind == timetable.WhoRoom {
			rooms = append(rooms, a.ID)
		}
	}
	assert.Contains(t, rooms, closed, "the closed room's list names its meetings")
}

// TestMovesAndAffect: pairing by start order, new and dropped meetings,
// and the people and rooms to tell.
func TestMovesAndAffect(t *testing.T) {
	b := newTerm(1, 4).room("R1", 30).room("R2", 30)
	b.section("A", staffOf("T1"), cohortsOf("Y"), meetings(2, 1), sameDay).section("B", staffOf("T2"))
	term := b.t
	kept := &timetable.Schedule{Placements: []timetable.Placement{
		{Section: "A", Meeting: 2, Period: 2, Room: "R1"}, {Section: "A", Meeting: 1, Period: 0, Room: "R1"},
		{Section: "OLD", Meeting: 1, Period: 1, Room: "R2"},
	}}
	now := &timetable.Schedule{Placements: []timetable.Placement{
		{Section: "A", Meeting: 1, Period: 0, Room: "R1"}, {Section: "A", Meeting: 2, Period: 3, Room: "R1"},
		{Section: "B", Meeting: 1, Period: 1, Room: "R2"},
	}}
	moves := Moves(term, kept, now)
	require.Len(t, moves, 3)
	assert.Equal(t, Move{Section: "A", Change: ChangeMoved, From: &kept.Placements[0], To: &now.Placements[1]}, moves[0])
	assert.Equal(t, ChangeNew, moves[1].Change)
	assert.Equal(t, "B", moves[1].Section)
	assert.Equal(t, ChangeDropped, moves[2].Change)
	assert.Equal(t, "OLD", moves[2].Section)
	aff := Affect(term, moves)
	var got []string
	for _, a := range aff {
		got = append(got, a.What+" "+a.ID)
	}
	assert.Equal(t, []string{"staff T1", "staff T2", "cohort Y", "room R1", "room R2"}, got)
	assert.Equal(t, []int{0}, aff[0].Moves)
	assert.Equal(t, []int{1, 2}, aff[4].Moves, "R2 gains B and loses OLD")
	assert.Nil(t, Moves(term, nil, now))
}

// TestKeepObjectiveEqualsReport: on the solved demo with one meeting of a
// two-meeting section made impossible at its time, the optimiser's moved
// meetings (timetable.Cost of the written timetable) equal what the move
// report lists, the engine's half never exceeds it, no reported move
// starts from a place its section still holds, and the level's bound is
// below the cost.
func TestKeepObjectiveEqualsReport(t *testing.T) {
	term, last := keepBase(t)
	count := map[string]int{}
	for _, p := range last.Placements {
		count[p.Section]++
	}
	var hit *timetable.Placement
	for i, p := range last.Placements {
		if count[p.Section] >= 2 {
			hit = &last.Placements[i]
			break
		}
	}
	require.NotNil(t, hit, "the demo has a section that meets twice")
	per := term.Periods[hit.Period]
	term.Unavailable = append(term.Unavailable, timetable.Unavailability{Who: hit.Section, Kind: timetable.WhoSection, Day: per.Day,
		From: per.Start, To: per.End, Hard: true, Reason: "test", Src: timetable.Source{Sheet: "Unavailable", Row: 99}})
	res, err := Optimize(context.Background(), term, OptimizeOptions{Seed: 9, Keep: last, MaxSteps: 2})
	require.NoError(t, err)
	checkOptimized(t, term, last, res)
	crit := res.Cost.Criterion(timetable.CritMoved)
	held := map[[2]int]map[string]bool{}
	secIdx := term.SectionIndex()
	for _, p := range res.Schedule.Placements {
		k := [2]int{secIdx[p.Section], p.Period}
		if held[k] == nil {
			held[k] = map[string]bool{}
		}
		held[k][p.Room] = true
	}
	var report int64
	for _, mv := range res.Moves {
		if mv.Change == ChangeNew {
			continue
		}
		report++
		assert.False(t, held[[2]int{secIdx[mv.Section], mv.From.Period}][mv.From.Room], "%s meeting %d is reported moved but still held", mv.Section, mv.From.Meeting)
	}
	assert.GreaterOrEqual(t, report, int64(1), "the blocked meeting moves")
	assert.Equal(t, crit.Count, report, "moves: %+v", res.Moves)
	ci := slices.IndexFunc(timetable.Criteria, func(c timetable.Criterion) bool { return c.Name == timetable.CritMoved })
	assert.LessOrEqual(t, res.EngineCost[ci], crit.Count*int64(crit.Weight), "the engine's half is part of the count")
	li := slices.Index(res.Levels, crit.Level)
	require.GreaterOrEqual(t, li, 0)
	assert.LessOrEqual(t, res.Bound[li], res.Total[li])
}
