package encode

import (
	"context"
	"slices"
	"testing"

	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/samples"
	"github.com/termwright/termwright/timetable"
)

// costVector is timetable.Cost per level of termLevels.
func costVector(t *timetable.Term, s, kept *timetable.Schedule) []int64 {
	rep := timetable.Cost(t, s, kept)
	levels := termLevels(t)
	out := make([]int64, len(levels))
	for i, l := range levels {
		out[i] = rep.ByLevel[l]
	}
	return out
}

// TestRoomSearchDeltas: for every meeting and every free candidate room,
// the change of the room search's local cost equals the change of
// timetable.Cost of the whole timetable; and improveRooms never makes a
// timetable worse or breaks a hard requirement.
func TestRoomSearchDeltas(t *testing.T) {
	n := 40
	if testing.Short() {
		n = 10
	}
	rng := newRand(41)
	checked := 0
	for k := 0; k < n; k++ {
		term := randomSoftTerm(rng, false)
		res, err := Optimize(context.Background(), term, OptimizeOptions{Seed: 1, GlobalConflicts: -1, MaxStall: -1})
		require.NoError(t, err)
		if res.Schedule == nil {
			continue
		}
		var kept *timetable.Schedule
		if k%2 == 0 {
			kept = res.Schedule
			if other, err := Optimize(context.Background(), term, OptimizeOptions{Seed: 7, MaxSteps: 3}); err == nil {
				kept = other.Schedule
			}
		}
		checked += roomDeltas(t, term, res.Catalog, res.Schedule, kept)
	}
	demo := samples.Demo()
	res, err := Optimize(context.Background(), demo, OptimizeOptions{Seed: 1, GlobalConflicts: -1, MaxStall: -1})
	require.NoError(t, err)
	checked += roomDeltas(t, demo, res.Catalog, res.Schedule, nil)
	t.Logf("%d moves checked", checked)
	require.Greater(t, checked, n)
}

func roomDeltas(t *testing.T, term *timetable.Term, cat *Catalog, sched, kept *timetable.Schedule) int {
	t.Helper()
	rs := newRoomSearch(term, cat, sched, kept)
	if rs == nil {
		return 0
	}
	current := func() *timetable.Schedule {
		out := &timetable.Schedule{Placements: slices.Clone(sched.Placements)}
		for _, m := range rs.ms {
			out.Placements[m.pl].Room = term.Rooms[m.room].ID
		}
		return out
	}
	checked := 0
	for i := range rs.ms {
		if checked > 400 {
			break
		}
		from := rs.ms[i].room
		for _, r := range rs.ms[i].cands {
			if j := rs.blocker(r, i); r != from && j >= 0 {
				// Two meetings move: j out of r, i into r.
				for _, r2 := range rs.ms[j].cands {
					if r2 == r || !rs.free(r2, j, i) || !rs.free(r, i, j) {
						continue
					}
					moved := []int{i, j}
					before, fullBefore := rs.cost(moved), costVector(term, current(), kept)
					rs.setRoom(j, r2)
					rs.setRoom(i, r)
					after, fullAfter := rs.cost(moved), costVector(term, current(), kept)
					rs.setRoom(i, from)
					rs.setRoom(j, r)
					require.Equal(t, diff(fullAfter, fullBefore), diff(after, before), "meeting %d to %s, %d to %s", i, term.Rooms[r].ID, j, term.Rooms[r2].ID)
					checked++
				}
			}
			if r == from || !rs.free(r, i) {
				continue
			}
			before, fullBefore := rs.cost([]int{i}), costVector(term, current(), kept)
			rs.setRoom(i, r)
			after, fullAfter := rs.cost([]int{i}), costVector(term, current(), kept)
			rs.setRoom(i, from)
			require.Equal(t, diff(fullAfter, fullBefore), diff(after, before), "meeting %d to room %s", i, term.Rooms[r].ID)
			checked++
		}
	}
	better := improveRooms(term, cat, sched, kept)
	require.Empty(t, timetable.HardViolations(timetable.Check(term, better)))
	require.LessOrEqual(t, slices.Compare(costVector(term, better, kept), costVector(term, sched, kept)), 0)
	return checked
}

// TestExactRoomsAgainstBruteForce: with the times of a timetable fixed,
// the engine's exact room choice, when proven, costs exactly the least
// timetable.Cost over every room assignment that passes timetable.Check
// (exhaustive search on random tiny terms), and never more than the local
// search's.
func TestExactRoomsAgainstBruteForce(t *testing.T) {
	n := 40
	if testing.Short() {
		n = 10
	}
	rng := newRand(43)
	proven := 0
	for k := 0; k < n; k++ {
		term := randomSoftTerm(rng, false)
		res, err := Optimize(context.Background(), term, OptimizeOptions{Seed: 1, GlobalConflicts: -1, MaxStall: -1})
		require.NoError(t, err)
		if res.Schedule == nil {
			continue
		}
		var kept *timetable.Schedule
		if k%2 == 0 {
			if other, err := Optimize(context.Background(), term, OptimizeOptions{Seed: 7, MaxSteps: 3}); err == nil && other.Schedule != nil {
				kept = other.Schedule
			}
		}
		local := improveRooms(term, res.Catalog, res.Schedule, kept)
		exact, ok := exactRooms(context.Background(), term, res.Catalog, local, kept, 1)
		require.Empty(t, timetable.HardViolations(timetable.Check(term, exact)))
		got := costVector(term, exact, kept)
		require.LessOrEqual(t, slices.Compare(got, costVector(term, local, kept)), 0)
		want := bruteRooms(term, res.Schedule, kept)
		require.LessOrEqual(t, slices.Compare(want, got), 0, "instance %d", k)
		if ok {
			proven++
			require.Equal(t, want, got, "instance %d: proven but not the least cost\n%s", k, describeTerm(term))
		}
	}
	t.Logf("%d exact room choices proven", proven)
	require.Greater(t, proven, 0)
}

// bruteRooms is the least cost vector over every room assignment of s's
// meetings (times kept) that passes timetable.Check.
func bruteRooms(t *timetable.Term, s, kept *timetable.Schedule) []int64 {
	pl := slices.Clone(s.Placements)
	secIdx := t.SectionIndex()
	var best []int64
	var dfs func(i int)
	dfs = func(i int) {
		if i == len(pl) {
			sched := &timetable.Schedule{Placements: pl}
			if len(timetable.HardViolations(timetable.Check(t, sched))) > 0 {
				return
			}
			if v := costVector(t, sched, kept); best == nil || slices.Compare(v, best) < 0 {
				best = v
			}
			return
		}
		if t.Sections[secIdx[pl[i].Section]].NoRoom {
			dfs(i + 1)
			return
		}
		for _, r := range t.Rooms {
			pl[i].Room = r.ID
			dfs(i + 1)
		}
	}
	dfs(0)
	return best
}
