package benchfmt

import (
	"fmt"
	"math/rand/v2"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"github.com/termwright/termwright/timetable"
)

// ownCost is timetable.Cost's total on a mapped term.
func ownCost(term *timetable.Term, s *timetable.Schedule) (int64, map[string]int64) {
	var total int64
	by := map[string]int64{}
	for _, c := range timetable.Cost(term, s, nil).Criteria {
		total += c.Cost
		by[c.Name] += c.Cost
	}
	return total, by
}

// TestXMLCostAgreesWithCost: the competition's cost of a timetable (XMLCost,
// from the published rules) equals timetable.Cost on the mapped term, for
// random placements (any listed time and room; clashes left to chance) on
// the four small shared instances, and part by part: time choice = time
// part x weight, room choice = room part x weight, soft relations =
// distribution part x weight (students unseated here; see
// TestXMLStudentCostAgreesWithCost for the student part).
func TestXMLCostAgreesWithCost(t *testing.T) {
	xmlDataDir(t)
	for _, name := range []string{"bet-sum18", "lums-sum17", "pu-cs-fal07", "wbg-fal10"} {
		t.Run(name, func(t *testing.T) {
			in := readSharedXML(t, name)
			term := in.Term()
			r := rand.New(rand.NewPCG(7, uint64(len(name))))
			for round := 0; round < 5; round++ {
				s := randomSchedule(term, r)
				sol, err := XMLSolutionOf(in, s, XMLRunInfo{})
				require.NoError(t, err)
				want, parts := XMLCost(in, sol)
				got, by := ownCost(term, s)
				assert.Equal(t, int64(parts.Time*in.Weights.Time), by[timetable.CritTimeChoice], "time part, round %d", round)
				assert.Equal(t, int64(parts.Room*in.Weights.Room), by[timetable.CritRoomChoice], "room part, round %d", round)
				assert.Equal(t, int64(parts.Distribution*in.Weights.Distribution), by[timetable.CritSoftRelations], "relation part, round %d", round)
				// Nobody is seated: our "unplaced requests" counts every
				// request (the rules make seating a requirement, not a cost).
				assert.Equal(t, int64(len(term.Requests)), by[timetable.CritUnplaced], "unplaced requests, round %d", round)
				assert.Equal(t, int64(want), got-by[timetable.CritUnplaced], "total, round %d", round)
			}
		})
	}
}

// TestXMLCostAgreesPerKind: on the hand-worked example of every
// distribution kind (TestXMLDistributionCosts), soft and required, the
// competition's cost and hard verdict equal timetable.Cost's soft relations
// and timetable.Check's relation violations on the mapped term.
func TestXMLCostAgreesPerKind(t *testing.T) {
	all := "1111"
	mon, tue, wed := "1000000", "0100000", "0010000"
	kinds := []struct {
		typ     string
		classes []tc
	}{
		{"SameStart", []tc{{mon, 100, 10, all, ""}, {tue, 100, 12, all, ""}, {mon, 110, 10, all, ""}}},
		{"SameTime", []tc{{mon, 100, 20, all, ""}, {tue, 105, 10, all, ""}, {wed, 110, 15, all, ""}}},
		{"DifferentTime", []tc{{mon, 100, 10, all, ""}, {tue, 110, 10, all, ""}, {wed, 105, 3, all, ""}}},
		{"SameDays", []tc{{"1010100", 100, 10, all, ""}, {"1000100", 120, 10, all, ""}, {tue, 140, 10, all, ""}}},
		{"DifferentDays", []tc{{"1010100", 100, 10, all, ""}, {"0101000", 100, 10, all, ""}, {"0000100", 120, 10, all, ""}}},
		{"SameWeeks", []tc{{mon, 100, 10, "1111", ""}, {tue, 100, 10, "1010", ""}, {wed, 100, 10, "0101", ""}}},
		{"DifferentWeeks", []tc{{mon, 100, 10, "1100", ""}, {tue, 100, 10, "0011", ""}, {wed, 100, 10, "0110", ""}}},
		{"Overlap", []tc{{mon, 100, 10, all, ""}, {mon, 105, 10, "1000", ""}, {tue, 100, 10, all, ""}}},
		{"NotOverlap", []tc{{mon, 100, 10, all, ""}, {mon, 105, 10, "1000", ""}, {tue, 100, 10, all, ""}}},
		{"SameRoom", []tc{{mon, 100, 10, all, "R1"}, {tue, 100, 10, all, "R1"}, {wed, 100, 10, all, "R2"}}},
		{"DifferentRoom", []tc{{mon, 100, 10, all, "R1"}, {tue, 100, 10, all, "R1"}, {wed, 100, 10, all, "R2"}}},
		{"SameAttendees", []tc{{mon, 100, 10, all, "R1"}, {mon, 112, 8, all, "R2"}, {mon, 123, 7, all, "R1"}, {tue, 100, 10, all, "R2"}}},
		{"Precedence", []tc{{mon, 100, 10, "0100", ""}, {mon, 100, 10, "1000", ""}, {tue, 90, 10, "0100", ""}, {mon, 105, 10, "0100", ""}}},
		{"WorkDay(24)", []tc{{mon, 100, 10, all, ""}, {mon, 120, 10, all, ""}, {mon, 105, 19, all, ""}}},
		{"MinGap(5)", []tc{{mon, 100, 10, all, ""}, {mon, 114, 6, all, ""}, {mon, 125, 5, all, ""}}},
		{"MaxDays(2)", []tc{{"1010000", 100, 10, all, ""}, {"0010100", 120, 10, all, ""}, {"0000001", 100, 10, all, ""}}},
		{"MaxDayLoad(20)", []tc{{mon, 100, 15, all, ""}, {mon, 200, 10, "1100", ""}, {tue, 100, 32, "1000", ""}}},
		{"MaxBreaks(1,2)", []tc{{mon, 100, 10, all, ""}, {mon, 111, 4, all, ""}, {mon, 120, 5, all, ""}, {mon, 130, 5, "1000", ""}}},
		{"MaxBlock(20,2)", []tc{{mon, 100, 10, all, ""}, {mon, 111, 14, all, ""}, {tue, 100, 30, all, ""}, {wed, 100, 10, "1000", ""}, {wed, 112, 13, "1000", ""}}},
	}
	for _, k := range kinds {
		for _, penalty := range []int{1, 5} {
			t.Run(fmt.Sprintf("%s/%d", k.typ, penalty), func(t *testing.T) {
				in := readHand(t, handInstance(k.classes, distXML(k.typ, len(k.classes), fmt.Sprintf(`penalty="%d"`, penalty))))
				term := in.Term()
				sol := forcedSolution(in)
				s, err := sol.Schedule(in)
				require.NoError(t, err)
				want, _ := XMLCost(in, sol)
				_, by := ownCost(term, s)
				assert.Equal(t, int64(want), by[timetable.CritSoftRelations],
					"soft cost (for at most minutes a day, at most breaks and longest block term.go's contract, as the published rules: Weight x excess / teaching weeks with the division last, minutes in 5-minute steps)")
			})
		}
		t.Run(k.typ+"/required", func(t *testing.T) {
			in := readHand(t, handInstance(k.classes, distXML(k.typ, len(k.classes), `required="true"`)))
			term := in.Term()
			sol := forcedSolution(in)
			s, err := sol.Schedule(in)
			require.NoError(t, err)
			broken := 0
			for _, p := range timetable.HardViolations(timetable.Check(term, s)) {
				if p.Rule == timetable.RuleRelation {
					broken++
				}
			}
			assert.Equal(t, XMLHardViolations(in, sol).Distributions > 0, broken > 0, "hard verdict")
		})
	}
}
