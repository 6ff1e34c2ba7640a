package benchfmt

import (
	"math"
	"math/big"
	"math/rand/v2"
	"slices"
	"strconv"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/timetable"
)

// The expected values below are worked out by hand from the competition's
// cost definition (Di Gaspero, McCollum, Schaerf 2007, "soft constraints":
// RoomCapacity 1 per student over capacity per meeting; MinimumWorkingDays
// 5 per day below the minimum; CurriculumCompactness 2 per isolated
// meeting; RoomStability 1 per room beyond the first). The tiny instance
// (testdata/ctt/tiny.ctt) has 2 days of 3 periods, rooms big (35) and small
// (25), courses alg (Ada, 2 meetings, min 2 days, 40 students), geo (Bo, 2,
// min 1, 20) and his (Ada, 1, min 1, 30); curricula y1 = {alg, geo},
// y2 = {his}; geo is unavailable on day 0 period 0.
var tinyCosts = []struct {
	sol   string
	parts CTTParts
	hard  CTTHard
}{
	// tiny-a: alg big 0 0, alg small 0 1, geo small 0 2, his big 1 0, geo big 1 2.
	//   RoomCapacity: alg in big 40-35 = 5, alg in small 40-25 = 15; others fit: 20.
	//   MinWorkingDays: alg uses 1 day of 2: 1*5 = 5; geo 2 days >= 1, his 1 >= 1.
	//   Compactness: y1 busy (0,0) (0,1) (0,2) (1,2): only (1,2) isolated; y2
	//   busy (1,0) isolated: 2 meetings * 2 = 4.
	//   RoomStability: alg {big, small} 1, geo {small, big} 1: 2.
	//   Total 20 + 5 + 4 + 2 = 31.
	{"tiny-a", CTTParts{RoomCapacity: 20, MinWorkingDays: 5, CurriculumCompactness: 4, RoomStability: 2}, CTTHard{}},
	// tiny-b: alg big 0 0 twice, geo small 0 0, his small 1 1 (geo's second meeting missing).
	//   Hard: Meetings 2 (alg twice in one period, geo one missing), Conflicts 1
	//   (alg and geo share y1 at (0,0)), Availability 1 (geo at (0,0)),
	//   RoomOccupancy 1 (big holds 2 meetings at (0,0)).
	//   RoomCapacity: alg 5 + 5, his in small 30-25 = 5: 15.
	//   MinWorkingDays: alg 1 day of 2: 5.
	//   Compactness: y1 has 3 meetings at (0,0), isolated: 3*2 = 6; y2 (1,1): 2. Total 8.
	//   RoomStability: 0. Total 15 + 5 + 8 = 28.
	{"tiny-b", CTTParts{RoomCapacity: 15, MinWorkingDays: 5, CurriculumCompactness: 8}, CTTHard{Meetings: 2, Conflicts: 1, Availability: 1, RoomOccupancy: 1}},
	// tiny-c: alg big 0 2, alg big 1 0, geo small 1 2, geo small 1 1, his big 0 0.
	//   RoomCapacity: alg 5 + 5 = 10. MinWorkingDays: alg days {0,1}: 0.
	//   Compactness: y1 busy (0,2), (1,0), (1,1), (1,2): (0,2) is isolated because
	//   the last period of day 0 and the first of day 1 are not adjacent;
	//   y2 (0,0) isolated: 2 * 2 = 4. RoomStability 0. Total 14.
	{"tiny-c", CTTParts{RoomCapacity: 10, CurriculumCompactness: 4}, CTTHard{}},
}

func TestITCCostHandComputed(t *testing.T) {
	term := readTiny(t)
	for _, tc := range tinyCosts {
		t.Run(tc.sol, func(t *testing.T) {
			s := readTinySolution(t, term, tc.sol)
			total, parts := CTTCost(term, s)
			assert.Equal(t, tc.parts, parts)
			assert.Equal(t, tc.parts.Total(), total)
			assert.Equal(t, tc.hard, CTTHardViolations(term, s))
		})
	}
}

func TestITCCostSkipsUnknown(t *testing.T) {
	term := readTiny(t)
	s := &timetable.Schedule{Placements: []timetable.Placement{
		{Section: "zz", Meeting: 1, Period: 0, Room: "big"},
		{Section: "alg", Meeting: 1, Period: 9, Room: "big"},
		{Section: "alg", Meeting: 1, Period: 0, Room: "hall"},
	}}
	total, _ := CTTCost(term, s)
	// Nothing placed counts, so only the minimum working days remain:
	// alg 2 days missing (10) + geo 1 (5) + his 1 (5) = 20.
	assert.Equal(t, 20, total)
	h := CTTHardViolations(term, s)
	// 3 unusable placements + 5 meetings missing (alg 2, geo 2, his 1).
	assert.Equal(t, CTTHard{Meetings: 8}, h)
}

func TestITCHardTeacherConflict(t *testing.T) {
	term := readTiny(t)
	// alg and his share teacher Ada but no curriculum.
	s := &timetable.Schedule{Placements: []timetable.Placement{
		{Section: "alg", Meeting: 1, Period: 1, Room: "big"},
		{Section: "alg", Meeting: 2, Period: 4, Room: "big"},
		{Section: "geo", Meeting: 1, Period: 2, Room: "small"},
		{Section: "geo", Meeting: 2, Period: 5, Room: "small"},
		{Section: "his", Meeting: 1, Period: 1, Room: "small"},
	}}
	assert.Equal(t, CTTHard{Conflicts: 1}, CTTHardViolations(term, s))
}

// randomITCSchedule places every meeting of t at random, keeping the
// competition's hard constraints (distinct periods per course, one meeting
// per room and period, no curriculum or teacher clash, availability); it
// restarts when it paints itself into a corner.
func randomITCSchedule(rng *rand.Rand, t *timetable.Term) *timetable.Schedule {
	for {
		if s, ok := tryRandomITC(rng, t); ok {
			return s
		}
	}
}

func tryRandomITC(rng *rand.Rand, t *timetable.Term) (*timetable.Schedule, bool) {
	nP := len(t.Periods)
	blocks := newITCBlocks(t)
	roomBusy := map[[2]int]bool{}  // (room, period)
	keyBusy := map[string][]bool{} // "c:"cohort / "s:"staff / "x:"section -> per period
	busy := func(k string) []bool {
		if keyBusy[k] == nil {
			keyBusy[k] = make([]bool, nP)
		}
		return keyBusy[k]
	}
	var s timetable.Schedule
	order := rng.Perm(len(t.Sections))
	for _, si := range order {
		sec := &t.Sections[si]
		keys := []string{"x:" + sec.ID}
		for _, c := range sec.Cohorts {
			keys = append(keys, "c:"+c)
		}
		for _, st := range sec.Staff {
			keys = append(keys, "s:"+st)
		}
		for m := 1; m <= sec.Meetings; m++ {
			placed := false
			for _, p := range rng.Perm(nP) {
				free := !blocks.blocked(t, sec, timetable.Placement{Period: p})
				for _, k := range keys {
					free = free && !busy(k)[p]
				}
				if !free {
					continue
				}
				for _, r := range rng.Perm(len(t.Rooms)) {
					if roomBusy[[2]int{r, p}] {
						continue
					}
					roomBusy[[2]int{r, p}] = true
					for _, k := range keys {
						busy(k)[p] = true
					}
					s.Placements = append(s.Placements, timetable.Placement{Section: sec.ID, Meeting: m, Period: p, Room: t.Rooms[r].ID})
					placed = true
					break
				}
				if placed {
					break
				}
			}
			if !placed {
				return nil, false
			}
		}
	}
	return &s, true
}

func TestRandomITCSchedulesAreFeasible(t *testing.T) {
	term := readTiny(t)
	rng := rand.New(rand.NewPCG(1, 2))
	for range 50 {
		s := randomITCSchedule(rng, term)
		require.Equal(t, CTTHard{}, CTTHardViolations(term, s))
	}
}

func BenchmarkCTTCost(b *testing.B) {
	term := readShared(b, itcDataDir(b), "comp07")
	s := randomITCSchedule(rand.New(rand.NewPCG(7, 7)), term)
	b.ReportAllocs()
	b.ResetTimer()
	for b.Loop() {
		CTTCost(term, s)
	}
}

func BenchmarkCTTHardViolations(b *testing.B) {
	term := readShared(b, itcDataDir(b), "comp07")
	s := randomITCSchedule(rand.New(rand.NewPCG(7, 7)), term)
	b.ReportAllocs()
	b.ResetTimer()
	for b.Loop() {
		CTTHardViolations(term, s)
	}
}

// TestITCCostNoOverflow gives a course 2^63-1 students (a Term built in
// code; the reader refuses such a number) and checks the cost saturates at
// math.MaxInt instead of wrapping negative; the true sum, computed with
// math/big, is larger than any int.
func TestITCCostNoOverflow(t *testing.T) {
	term := readTiny(t)
	term.Sections[term.SectionIndex()["alg"]].Size = math.MaxInt
	s := readTinySolution(t, term, "tiny-a")
	total, parts := CTTCost(term, s)
	over := new(big.Int).Mul(big.NewInt(2), new(big.Int).Sub(big.NewInt(math.MaxInt64), big.NewInt(30))) // two meetings of alg, rooms 35 and 25
	require.False(t, over.IsInt64(), "the true room-capacity cost does not fit an int")
	assert.Equal(t, math.MaxInt, parts.RoomCapacity)
	assert.Equal(t, math.MaxInt, total)
}

// TestReadCTTNumberColumn checks that an out-of-range number is refused
// with its file:line:col position.
func TestReadCTTNumberColumn(t *testing.T) {
	src := strings.Join(withHeader("COURSES:", "a t 1 1 9223372036854775807", "b t 1 1 1", "ROOMS:", "r 1", "CURRICULA:", "q 1 a", "UNAVAILABILITY_CONSTRAINTS:", "END."), "\n")
	_, err := ReadCTT(strings.NewReader(src), "x.ctt")
	require.Error(t, err)
	lines := strings.Split(src, "\n")
	line := slices.Index(lines, "a t 1 1 9223372036854775807") + 1
	assert.Contains(t, err.Error(), "x.ctt:"+strconv.Itoa(line)+":9: students of course a is 9223372036854775807; it must be from 0 to 1000000")
}
