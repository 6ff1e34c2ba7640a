package benchfmt

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"github.com/termwright/termwright/timetable"
)

// sectioningCase is a hand-worked seating of courseXML's students (class ID
// to the students listed in it) and the student-rule breaks the
// competition's rules give it (Müller, Rudová, Müllerová, PATAT 2018: one
// configuration, one class of each of its subparts, parents held, limits
// kept; students only in courses they want).
type sectioningCase struct {
	name   string
	seats  map[string][]string
	broken int
}

// courseSeatings are the hand-worked cases. The valid base: 7 in 1, 3 (A's
// first configuration, lab 3 under main class 1) and 6 (B); 8 in 6; 9 in 2, 4.
var courseSeatings = []sectioningCase{
	{"valid", map[string][]string{"1": {"7"}, "3": {"7"}, "6": {"7", "8"}, "2": {"9"}, "4": {"9"}}, 0},
	{"valid other configuration", map[string][]string{"5": {"7"}, "6": {"7", "8"}, "2": {"9"}, "4": {"9"}}, 0},
	{"nobody seated", map[string][]string{}, 4},
	{"a wanted course missing", map[string][]string{"1": {"7"}, "3": {"7"}, "6": {"8"}, "2": {"9"}, "4": {"9"}}, 1},
	{"two configurations", map[string][]string{"1": {"7"}, "3": {"7"}, "5": {"7"}, "6": {"7", "8"}, "2": {"9"}, "4": {"9"}}, 1},
	{"a subpart missing", map[string][]string{"1": {"7"}, "6": {"7", "8"}, "2": {"9"}, "4": {"9"}}, 1},
	{"two classes of one subpart", map[string][]string{"1": {"7"}, "2": {"7", "9"}, "3": {"7"}, "6": {"7", "8"}, "4": {"9"}}, 1},
	{"parent not held", map[string][]string{"1": {"7"}, "4": {"7", "9"}, "6": {"7", "8"}, "2": {"9"}}, 1},
	{"course not wanted", map[string][]string{"1": {"7"}, "3": {"7"}, "6": {"7", "8"}, "2": {"9"}, "4": {"9"}, "5": {"8"}}, 1},
	{"student not in the instance", map[string][]string{"1": {"7"}, "3": {"7"}, "6": {"7", "8", "99"}, "2": {"9"}, "4": {"9"}}, 1},
	{"listed twice", map[string][]string{"1": {"7"}, "3": {"7"}, "6": {"7", "8", "8"}, "2": {"9"}, "4": {"9"}}, 1},
	// 7 and 9 both in class 5 (limit 1): one student over.
	{"over the limit", map[string][]string{"5": {"7", "9"}, "6": {"7", "8"}}, 1},
}

// TestXMLSectioningRules checks XMLHardViolations' student rules on the
// hand-worked seatings: each breaks one rule once (or none), and the
// student part of the cost stays apart from the hard count. timetable.Check
// on the mapped term agrees on each verdict (with "unplaced requests" at 0
// standing for the rules' requirement that every student is seated).
func TestXMLSectioningRules(t *testing.T) {
	in := readHand(t, courseXML)
	term := in.Term()
	for _, c := range courseSeatings {
		t.Run(c.name, func(t *testing.T) {
			sol := seatedSolution(in, c.seats)
			h := XMLHardViolations(in, sol)
			assert.Equal(t, c.broken, h.Sectioning)
			assert.Equal(t, c.broken, h.Total(), "only the student rules break")
			s, err := sol.Schedule(in)
			require.NoError(t, err)
			_, by := ownCost(term, s)
			ours := hardCount(term, s) == 0 && by[timetable.CritUnplaced] == 0
			assert.Equal(t, c.broken == 0, ours, "Check %v, unplaced %d", timetable.HardViolations(timetable.Check(term, s)), by[timetable.CritUnplaced])
		})
	}
}

// seatedSolution is the forced solution of in with the given students.
func seatedSolution(in *XMLInstance, seats map[string][]string) *XMLSolution {
	sol := forcedSolution(in)
	for i := range sol.Classes {
		sol.Classes[i].Students = seats[sol.Classes[i].Class]
	}
	return sol
}
