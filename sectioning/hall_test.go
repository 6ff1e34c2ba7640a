package sectioning

import (
	"context"
	"fmt"
	"math/rand/v2"
	"testing"

	"github.com/stretchr/testify/require"

	"github.com/termwright/termwright/timetable"
)

// hallTerm builds one-part courses with limits and students with one
// request each (a course and alternatives): a bipartite matching of
// requests to seats.
func hallTerm(rng *rand.Rand, courses, students int) *timetable.Term {
	t := &timetable.Term{Periods: []timetable.Period{{Day: 1, Start: 540, End: 600}}}
	for c := range courses {
		for k := range 1 + rng.IntN(3) {
			t.Sections = append(t.Sections, timetable.Section{ID: fmt.Sprintf("C%d-%d", c, k), Course: fmt.Sprintf("C%d", c),
				Meetings: 1, Length: 1, NoRoom: true, Limit: 1 + rng.IntN(6), Weeks: 1})
		}
	}
	for k := range students {
		perm := rng.Perm(courses)[:1+rng.IntN(min(3, courses))]
		r := timetable.Request{Student: fmt.Sprintf("S%d", k), Course: fmt.Sprintf("C%d", perm[0])}
		for _, a := range perm[1:] {
			r.Alternatives = append(r.Alternatives, fmt.Sprintf("C%d", a))
		}
		t.Requests = append(t.Requests, r)
	}
	return t
}

// hallDeficiency is the number of requests no seating can meet, by the
// defect form of Hall's theorem (P. Hall 1935, "On representatives of
// subsets"; Ore's defect version): the largest, over sets T of courses,
// of the requests whose courses all lie in T minus the seats of T, or 0.
func hallDeficiency(t *timetable.Term, courses int) int {
	seats := make([]int, courses)
	for _, s := range t.Sections {
		var c int
		fmt.Sscanf(s.Course, "C%d", &c)
		seats[c] += s.Limit
	}
	masks := make([]int, len(t.Requests))
	for i, r := range t.Requests {
		for _, name := range append([]string{r.Course}, r.Alternatives...) {
			var c int
			fmt.Sscanf(name, "C%d", &c)
			masks[i] |= 1 << c
		}
	}
	worst := 0
	for T := 0; T < 1<<courses; T++ {
		need, have := 0, 0
		for _, m := range masks {
			if m&^T == 0 {
				need++
			}
		}
		for c := range courses {
			if T&(1<<c) != 0 {
				have += seats[c]
			}
		}
		worst = max(worst, need-have)
	}
	return worst
}

// TestHallsTheorem checks that the sectioner, without its exhaustive
// phase (greedy and repair only, as on large terms), leaves exactly as
// many requests unplaced as Hall's theorem says must be: none when the
// requests fit the limits, and exactly one after adding one request to a
// set of courses the limits fill. Source: P. Hall 1935, "On
// representatives of subsets", J. London Math. Soc. 10.
func TestHallsTheorem(t *testing.T) {
	for seed := uint64(1); seed <= 60; seed++ {
		rng := rand.New(rand.NewPCG(seed, 3))
		courses := 2 + rng.IntN(5)
		term := hallTerm(rng, courses, 5+rng.IntN(40))
		want := hallDeficiency(term, courses)
		res, err := section(context.Background(), term, &timetable.Schedule{}, Options{Seed: int64(seed)}, config{})
		require.NoError(t, err)
		require.Empty(t, allSeatingErrors(term, &timetable.Schedule{}, res))
		require.Len(t, res.Unplaced, want, "seed %d", seed)
	}
}

// TestHallOneMore fills the limits exactly (every request placed) and
// then adds one request more, which must leave exactly one unplaced.
func TestHallOneMore(t *testing.T) {
	for seed := uint64(1); seed <= 40; seed++ {
		rng := rand.New(rand.NewPCG(seed, 5))
		courses := 2 + rng.IntN(4)
		term := hallTerm(rng, courses, 0)
		total := 0
		for _, s := range term.Sections {
			total += s.Limit
		}
		// exactly total requests: one per seat of course c, asking for c
		// and another course in random order, so that a seating of all
		// exists (each request in "its" seat) but first choices collide
		seats := map[string]int{}
		for _, s := range term.Sections {
			seats[s.Course] += s.Limit
		}
		k := 0
		for c := range courses {
			name := fmt.Sprintf("C%d", c)
			for range seats[name] {
				other := fmt.Sprintf("C%d", (c+1+rng.IntN(courses-1))%courses)
				r := timetable.Request{Student: fmt.Sprintf("S%d", k), Course: name, Alternatives: []string{other}}
				if rng.IntN(2) == 0 {
					r.Course, r.Alternatives[0] = other, name
				}
				term.Requests = append(term.Requests, r)
				k++
			}
		}
		rng.Shuffle(len(term.Requests), func(i, j int) { term.Requests[i], term.Requests[j] = term.Requests[j], term.Requests[i] })
		require.Zero(t, hallDeficiency(term, courses))
		res, err := section(context.Background(), term, &timetable.Schedule{}, Options{Seed: int64(seed)}, config{})
		require.NoError(t, err)
		require.Empty(t, res.Unplaced, "seed %d: %d requests fit %d seats", seed, len(term.Requests), total)
		term.Requests = append(term.Requests, timetable.Request{Student: "extra", Course: fmt.Sprintf("C%d", rng.IntN(courses))})
		require.Equal(t, 1, hallDeficiency(term, courses))
		res, err = section(context.Background(), term, &timetable.Schedule{}, Options{Seed: int64(seed)}, config{})
		require.NoError(t, err)
		require.Len(t, res.Unplaced, 1, "seed %d", seed)
		require.Empty(t, allSeatingErrors(term, &timetable.Schedule{}, res))
	}
}
