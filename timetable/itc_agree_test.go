package timetable

import (
	"math/rand/v2"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// costParts reads the ITC components out of a CostReport of a term read by
// ReadCTT, and the total over every criterion.
func costParts(r CostReport) (ITCParts, int) {
	total := 0
	for _, c := range r.Criteria {
		total += int(c.Cost)
	}
	return ITCParts{
		RoomCapacity:          int(r.Criterion(CritOverCapacity).Cost),
		MinWorkingDays:        int(r.Criterion(CritSpreadDays).Cost),
		CurriculumCompactness: int(r.Criterion(CritCohortIsolated).Cost),
		RoomStability:         int(r.Criterion(CritRoomStability).Cost),
	}, total
}

// Cost under the ITC mapping must equal the competition's definition
// (Di Gaspero, McCollum, Schaerf 2007), here evaluated by ITCCost, on every
// hard-feasible timetable. On infeasible ones the two may differ: the
// competition counts each clashing lecture as isolated, Cost counts the
// busy period once.
func TestCostAgreesWithITCOnTiny(t *testing.T) {
	term := readTiny(t)
	for _, name := range []string{"tiny-a", "tiny-c"} {
		t.Run(name, func(t *testing.T) {
			s := readTinySolution(t, term, name)
			require.Empty(t, HardViolations(Check(term, s)))
			total, parts := ITCCost(term, s)
			got, gotTotal := costParts(Cost(term, s, nil))
			assert.Equal(t, parts, got)
			assert.Equal(t, total, gotTotal)
		})
	}
}

func TestCostAgreesWithITCOnRandomSchedules(t *testing.T) {
	terms := map[string]*Term{"tiny": readTiny(t)}
	if dir := itcDataDirOrEmpty(); dir != "" {
		terms["toy"] = readShared(t, dir, "toy")
		if !testing.Short() {
			terms["comp01"] = readShared(t, dir, "comp01")
		}
	}
	for name, term := range terms {
		t.Run(name, func(t *testing.T) {
			require.Empty(t, Validate(term).Errors(), "the ITC term passes validation")
			rng := rand.New(rand.NewPCG(2007, 3))
			for i := range 40 {
				s := randomITCSchedule(rng, term)
				require.Equal(t, ITCHard{}, ITCHardViolations(term, s))
				require.Empty(t, HardViolations(Check(term, s)), "schedule %d passes Check", i)
				total, parts := ITCCost(term, s)
				got, gotTotal := costParts(Cost(term, s, nil))
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
	for _, v := range HardViolations(Check(term, s)) {
		rules[v.Rule] = true
	}
	// tiny-b's room double-booking is alg twice in big at one period, which
	// Check names as the section overlapping itself.
	for _, r := range []string{RuleMeetings, RuleCohortClash, RuleUnavailable, RuleSelfOverlap} {
		assert.True(t, rules[r], "Check reports %q", r)
	}
}
