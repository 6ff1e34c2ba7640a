package encode

import (
	"fmt"
	"math/rand/v2"
	"time"

	"github.com/termwright/termwright/timetable"
)

// syntheticTerm builds a random term of n sections with the proportions of
// a university (a room per 8 sections, a staff member per 3, a cohort per
// 7; Mon–Fri × 9 periods with a lunch break). It is for measuring the
// encoder's size and speed; it is not promised to be feasible.
func syntheticTerm(n int, seed uint64) *timetable.Term {
	rng := rand.New(rand.NewPCG(seed, 3))
	b := newTerm(0, 0)
	t := b.t
	for d := 0; d < 5; d++ {
		for k := 0; k < 9; k++ {
			start := timetable.Clock(8*60 + 60*k)
			if k >= 4 {
				start += 60 // lunch
			}
			t.Periods = append(t.Periods, timetable.Period{Index: len(t.Periods), Day: time.Weekday(1 + d), Start: start, End: start + 60})
		}
	}
	nRooms := n/8 + 2
	for r := 0; r < nRooms; r++ {
		var f []string
		switch {
		case r%10 == 0:
			f = []string{"lab"}
		case r%3 == 0:
			f = []string{"projector", "step-free"}
		case r%2 == 0:
			f = []string{"projector"}
		}
		b.room(fmt.Sprintf("R%03d", r), []int{20, 30, 40, 60, 80, 120, 200}[rng.IntN(7)], f...)
	}
	nStaff, nCohorts := n/3+1, n/7+1
	for i := 0; i < n; i++ {
		opts := []func(*timetable.Section){
			staffOf(fmt.Sprintf("T%03d", rng.IntN(nStaff))),
			cohortsOf(fmt.Sprintf("C%03d", rng.IntN(nCohorts))),
			sized(10 + rng.IntN(90)),
		}
		switch k := rng.IntN(10); {
		case k == 0:
			opts = append(opts, needs("lab"), meetings(1, 2+rng.IntN(2)))
		case k < 4:
			opts = append(opts, meetings(2, 1), needs("projector"))
		case k < 7:
			opts = append(opts, meetings(1+rng.IntN(3), 1))
		default:
			opts = append(opts, meetings(1, 2))
		}
		switch rng.IntN(12) {
		case 0:
			opts = append(opts, weeks(0x5555))
		case 1:
			opts = append(opts, weeks(0xaaaa))
		case 2:
			opts = append(opts, noRoom)
		}
		b.section(fmt.Sprintf("S%04d", i), opts...)
	}
	for i := 0; i < n/20; i++ {
		b.unavailable(timetable.WhoStaff, t.Staff[rng.IntN(len(t.Staff))].ID, time.Weekday(1+rng.IntN(5)), 8, 12)
	}
	for i := range t.Staff {
		if i%5 == 0 {
			t.Staff[i].MaxPerDay = 6
			t.Staff[i].MaxConsecutive = 3
		}
	}
	return t
}
