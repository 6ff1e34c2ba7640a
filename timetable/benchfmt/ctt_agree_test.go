package benchfmt

import (
	"math/rand/v2"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/timetable"
)

// costParts reads the ITC components out of a CostReport of a term read by
// ReadCTT, and the total over every criterion.
func costParts(r timetable.CostReport) (CTTParts, int) {
	total := 0
	for _, c := range r.Criteria {
		total += int(c.Cost)
	}
	return CTTParts{
		RoomCapacity:          int(r.Criterion(timetable.CritOverCapacity).Cost),
		MinWorkingDays:        int(r.Criterion(timetable.CritSpreadDays).Cost),
		CurriculumCompactness: int(r.Criterion(timetable.CritCohortIsolated).Cost),
		RoomStability:         int(r.Criterion(timetable.CritRoomStability).Cost),
	}, total
}

// Cost under the ITC mapping must equal the competition's definition
// (Di Gaspero, McCollum, Schaerf 2007), here evaluated by CTTCost, on every
// hard-feasible timetable. On infeasible ones the two may differ: the
// competition counts each clashing meeting as isolated, Cost counts the
// busy period once.
func TestCostAgreesWithITCOnTiny(t *testing.T) {
	term := readTiny(t)
	for _, name := range []string{"tiny-a", "tiny-c"} {
		t.Run(name, func(t *testing.T) {
			s := readTinySolution(t, term, name)
			require.Empty(t, timetable.HardViolations(timetable.Check(term, s)))
			total, parts := CTTCost(term, s)
			got, gotTotal := costParts(timetable.Cost(term, s, nil))
			assert.Equal(t, parts, got)
			assert.Equal(t, total, gotTotal)
		})
	}
}

func TestCostAgreesWithITCOnRandomSchedules(t *testing.T) {
	terms := map[string]*timetable.Term{"tiny": readTiny(t)}
	if dir := itcDataDirOrEmpty(); dir != "" {
		terms["toy"] = readShared(t, dir, "toy")
		if !testing.Short() {
			terms["comp01"] = readShared(t, dir, "comp01")
		}
	}
	for name, term := range terms {
		t.Run(name, func(t *testing.T) {
			require.Empty(t, timetable.Validate(term).Errors(), "the ITC term passes validation")
			rng := rand.New(rand.NewPCG(2007, 3))
			for i := range 40 {
				s := randomITCSchedule(rng, term)
				require.Equal(t, CTTHard{}, CTTHardViolations(term, s))
				require.Empty(t, timetable.HardViolations(timetable.Check(term, s)), "schedule %d passes Check", i)
				total, parts := CTTCost(term, s)
				got, gotTotal := costParts(timetable.Cost(term, s, nil))
				require.Equal(t, parts, got, "schedule %d", i)
				require.Equal(t, total, gotTotal, "schedule %d", i)
			}
		})
	}
}

// Every hard violation in the competition's sense is one for Check too.
func TestCheckSeesITCHardViolations(t *testing.T) {
	term := readTiny(t)
	s := readTinySolution(t, term, "tiny-b")
	rules := map[string]bool{}
	for _, v := range timetable.HardViolations(timetable.Check(term, s)) {
		rules[v.Rule] = true
	}
	// tiny-b's room double-booking is alg twice in big at one period, which
	// Check names as the section overlapping itself.
	for _, r := range []string{timetable.RuleMeetings, timetable.RuleCohortClash, timetable.RuleUnavailable, timetable.RuleSelfOverlap} {
		assert.True(t, rules[r], "Check reports %q", r)
	}
}

// A zero-cost timetable of the competition's toy instance, made by hand
// (best-known.csv gives 0 for toy). Rooms: A (32 seats) holds SceCosC (30)
// and Geotec (18), B (50) holds ArcTec (42) and TecCos (40), so nothing is
// over capacity and each course keeps one room. Days: SceCosC 0, 2, 4 (3 of
// 3); ArcTec 0, 1, 3 (>= 2); TecCos every day (>= 4); Geotec every day
// (>= 4). Curriculum Cur1 {SceCosC, ArcTec, TecCos} per day: d0 p0-p2,
// d1 p0-p1, d2 p1-p2, d3 p1-p2, d4 p0-p1, each a run of two or three, so no
// meeting is isolated; Cur2 {TecCos, Geotec}: d0 p1-p2, d1 p1-p2, d2 p2-p3,
// d3 p0-p1, d4 p1-p2. TecCos avoids d2 p0-p1 and d3 p2-p3, ArcTec avoids d4.
const toyZero = `SceCosC A 0 0
SceCosC A 2 1
SceCosC A 4 0
ArcTec B 0 2
ArcTec B 1 0
ArcTec B 3 2
TecCos B 0 1
TecCos B 1 1
TecCos B 2 2
TecCos B 3 1
TecCos B 4 1
Geotec A 0 2
Geotec A 1 2
Geotec A 2 3
Geotec A 3 0
Geotec A 4 2
`

func TestToyZeroCostSolution(t *testing.T) {
	term := readShared(t, itcDataDir(t), "toy")
	s, err := ReadCTTSolution(strings.NewReader(toyZero), "toy.sol", term)
	require.NoError(t, err)
	assert.Equal(t, CTTHard{}, CTTHardViolations(term, s))
	assert.Empty(t, timetable.HardViolations(timetable.Check(term, s)))
	total, parts := CTTCost(term, s)
	assert.Equal(t, 0, total, "%+v", parts)
	_, own := costParts(timetable.Cost(term, s, nil))
	assert.Equal(t, 0, own)
}
