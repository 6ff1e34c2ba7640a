package encode

import (
	"fmt"
	"math/rand/v2"
	"slices"
	"testing"
	"time"

	"github.com/termwright/termwright/timetable"
)

// randomTinyTerm makes a small random term that mixes every requirement
// the encoder states: weeks, multi-period meetings, shared days, fixed
// meetings, rooms with features and capacities, unavailability, staff
// limits and every hard relation kind.
func randomTinyTerm(rng *rand.Rand) *timetable.Term {
	days, per := 1+rng.IntN(3), 2+rng.IntN(2)
	if days > 1 {
		days, per = 2, 2
	}
	b := newTerm(days, per)
	if per == 3 && rng.IntN(3) == 0 {
		gapDay(b)
	}
	b.t.SoftCapacity = rng.IntN(5) == 0
	nRooms := 1 + rng.IntN(3)
	for r := 0; r < nRooms; r++ {
		var feats []string
		if rng.IntN(2) == 0 {
			feats = append(feats, "lab")
		}
		b.room(fmt.Sprintf("R%d", r+1), []int{15, 30, 40}[rng.IntN(3)], feats...)
	}
	nSecs := 2 + rng.IntN(3)
	for s := 0; s < nSecs; s++ {
		var opts []func(*timetable.Section)
		opts = append(opts, staffOf(fmt.Sprintf("T%d", rng.IntN(2))))
		if rng.IntN(2) == 0 {
			opts = append(opts, cohortsOf(fmt.Sprintf("Y%d", rng.IntN(2))))
		}
		m, l := 1, 1
		if rng.IntN(3) == 0 {
			m = 2
		}
		if rng.IntN(3) == 0 {
			l = 2
		}
		opts = append(opts, meetings(m, l), sized([]int{5, 15, 25}[rng.IntN(3)]))
		switch rng.IntN(8) {
		case 0:
			opts = append(opts, noRoom)
		case 1:
			opts = append(opts, needs("lab"))
		case 2:
			opts = append(opts, roomsOf("R1"))
		}
		if rng.IntN(3) == 0 {
			opts = append(opts, sameDay)
		}
		switch rng.IntN(4) {
		case 0:
			opts = append(opts, weeks(0b0101010101))
		case 1:
			opts = append(opts, weeks(0b1010101010))
		}
		if rng.IntN(6) == 0 {
			room := ""
			if rng.IntN(2) == 0 {
				room = "R1"
			}
			opts = append(opts, fixedAt(time.Monday, int(b.t.Periods[rng.IntN(per)].Start)/60, room))
		}
		b.section(fmt.Sprintf("S%d", s), opts...)
	}
	for k := rng.IntN(3) - 1; k > 0; k-- {
		day := time.Weekday(1 + rng.IntN(days))
		from := 9 + rng.IntN(per)
		switch rng.IntN(4) {
		case 0:
			b.unavailable(timetable.WhoStaff, b.t.Staff[rng.IntN(len(b.t.Staff))].ID, day, from, from+1)
		case 1:
			b.unavailable(timetable.WhoRoom, "R1", day, from, from+1)
		case 2:
			b.unavailable(timetable.WhoSection, fmt.Sprintf("S%d", rng.IntN(nSecs)), day, from, from+1)
		case 3:
			if len(b.t.Cohorts) > 0 {
				b.unavailable(timetable.WhoCohort, b.t.Cohorts[0].ID, day, from, from+1)
			}
		}
	}
	for i := range b.t.Staff {
		if rng.IntN(5) == 0 {
			b.t.Staff[i].MaxPerDay = 2 + rng.IntN(2)
		}
		if rng.IntN(5) == 0 {
			b.t.Staff[i].MaxConsecutive = 1 + rng.IntN(2)
		}
	}
	if rng.IntN(2) == 0 {
		kind := timetable.RelationKinds[rng.IntN(7)].Kind // grid rows take the first seven kinds (times_rel.go)
		x, y := rng.IntN(nSecs), rng.IntN(nSecs-1)
		if y >= x {
			y++
		}
		if kind == timetable.SameTime {
			// Validation requires equal meetings and lengths.
			b.t.Sections[y].Meetings = b.t.Sections[x].Meetings
			b.t.Sections[y].Length = b.t.Sections[x].Length
		}
		b.relation(kind, fmt.Sprintf("S%d", x), fmt.Sprintf("S%d", y))
	}
	return b.t
}

// bruteFeasible searches every schedule of a tiny term (every set of start
// periods of every section, every room for every meeting) for one that
// timetable.Check accepts. It shares nothing with the encoder.
func bruteFeasible(t *timetable.Term) (bool, int) {
	opts := bruteOptions(t)
	leaves := 0
	var dfs func(s int, pl []timetable.Placement) bool
	dfs = func(s int, pl []timetable.Placement) bool {
		vs := timetable.HardViolations(timetable.Check(t, &timetable.Schedule{Placements: pl}))
		if s == len(t.Sections) {
			leaves++
			return len(vs) == 0
		}
		for _, v := range vs {
			if bruteMonotone[v.Rule] {
				return false
			}
		}
		for _, o := range opts[s] {
			if dfs(s+1, append(pl[:len(pl):len(pl)], o...)) {
				return true
			}
		}
		return false
	}
	return dfs(0, nil), leaves
}

// TestAgainstBruteForce: on random tiny terms, the encoder finds a timetable
// exactly when exhaustive search finds one that the independent domain
// checker accepts; every timetable found passes Check, and the engine and
// the reference library agree (solveBoth).
var bruteSeed uint64 = 7

func TestAgainstBruteForce(t *testing.T) {
	n := 150
	if testing.Short() {
		n = 40
	}
	rng := rand.New(rand.NewPCG(bruteSeed, 11))
	feasible := 0
	for i := 0; i < n; i++ {
		term := randomTinyTerm(rng)
		want, leaves := bruteFeasible(term)
		out := solveBoth(t, term)
		if out.feasible != want {
			t.Fatalf("instance %d (%d schedules searched): encoder says feasible=%v, brute force %v\n%s", i, leaves, out.feasible, want, describeTerm(term))
		}
		if want {
			feasible++
		}
	}
	t.Logf("%d of %d random terms feasible", feasible, n)
	if feasible == 0 || feasible == n {
		t.Fatalf("the generator should make both feasible and infeasible terms")
	}
}

func newRand(seed uint64) *rand.Rand { return rand.New(rand.NewPCG(seed, 11)) }

func describeTerm(t *timetable.Term) string {
	s := fmt.Sprintf("periods: %d (%d days); soft capacity %v\n", len(t.Periods), len(t.Days()), t.SoftCapacity)
	for _, p := range t.Periods {
		s += fmt.Sprintf("  %s-%s\n", p.Label(), p.End)
	}
	for _, r := range t.Rooms {
		s += fmt.Sprintf("room %s cap %d %v\n", r.ID, r.Capacity, r.Features)
	}
	for _, st := range t.Staff {
		s += fmt.Sprintf("staff %s perday %d consec %d\n", st.ID, st.MaxPerDay, st.MaxConsecutive)
	}
	for _, sec := range t.Sections {
		s += fmt.Sprintf("section %s staff %v cohorts %v m=%d l=%d size=%d needs=%v rooms=%v noroom=%v sameday=%v weeks=%b fixed=%v\n",
			sec.ID, sec.Staff, sec.Cohorts, sec.Meetings, sec.Length, sec.Size, sec.Needs, sec.Rooms, sec.NoRoom, sec.SameDay, sec.Weeks, sec.Fixed)
	}
	for _, u := range t.Unavailable {
		s += fmt.Sprintf("unavailable %s %s %s %s-%s\n", u.Kind, u.Who, timetable.DayName(u.Day), u.From, u.To)
	}
	for _, r := range t.Relations {
		s += fmt.Sprintf("relation %s %v\n", r.Kind, r.Sections)
	}
	return s
}

// bruteOptions lists, per section of a tiny term, every way to place all
// its meetings: each set of Meetings start periods where a meeting fits,
// with every room (or none for sections that take none) for each meeting.
func bruteOptions(t *timetable.Term) [][][]timetable.Placement {
	opts := make([][][]timetable.Placement, len(t.Sections))
	for s, sec := range t.Sections {
		var starts []int
		for p := range t.Periods {
			if _, ok := t.Span(p, sec.Length); ok {
				starts = append(starts, p)
			}
		}
		rooms := []string{""}
		if !sec.NoRoom {
			rooms = nil
			for _, r := range t.Rooms {
				rooms = append(rooms, r.ID)
			}
		}
		var sets func(from int, chosen []int)
		sets = func(from int, chosen []int) {
			if len(chosen) == sec.Meetings {
				var withRooms func(k int, pl []timetable.Placement)
				withRooms = func(k int, pl []timetable.Placement) {
					if k == len(chosen) {
						opts[s] = append(opts[s], slices.Clone(pl))
						return
					}
					for _, r := range rooms {
						withRooms(k+1, append(pl, timetable.Placement{Section: sec.ID, Meeting: k + 1, Period: chosen[k], Room: r}))
					}
				}
				withRooms(0, nil)
				return
			}
			for i := from; i < len(starts); i++ {
				sets(i+1, append(chosen, starts[i]))
			}
		}
		sets(0, nil)
	}
	return opts
}
