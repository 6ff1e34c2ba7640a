package samples

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"github.com/termwright/termwright/timetable"
)

// TestCampusFiles regenerates the second demo term and compares it byte for
// byte with the checked-in workbook and CSV folder (rewrite with -update).
func TestCampusFiles(t *testing.T) {
	checkTermFiles(t, Campus(), CampusWorkbook, CampusCSVDir, "Campus()", "TestCampusFiles")
}

// TestCampusReadsClean loads the checked-in second demo with both readers:
// no errors and no warnings, no period grid, and every feature the demo is
// there to show (issue 14: MWF 50 minutes, TuTh 75 minutes, an
// every-other-week lab, a block course in weeks 3-6, room lists with
// preferences, two campuses with travel time, some of the new relations;
// issue 15: courses in parts and arrangements, and course requests).
func TestCampusReadsClean(t *testing.T) {
	assert.Empty(t, timetable.Validate(Campus()), "Campus() validates")
	for _, path := range []string{CampusWorkbook, CampusCSVDir} {
		t.Run(path, func(t *testing.T) {
			term, ps, err := timetable.Load(path)
			require.NoError(t, err)
			assert.Empty(t, ps, "problems:\n%s", ps)
			assert.Empty(t, term.Periods, "a term of meeting patterns only")
			var mwf50, tuth75, alternate, block, preferred int
			for _, s := range term.Sections {
				require.True(t, s.UsesTimes(), "%s is a pattern section", s.ID)
				for _, c := range s.Times {
					switch {
					case c.Days.String() == "Mon Wed Fri" && c.Minutes == 50:
						mwf50++
					case c.Days.String() == "Tue Thu" && c.Minutes == 75:
						tuth75++
					}
					if c.Weeks == term.AllWeeks()&0x5555555555555555 || c.Weeks == term.AllWeeks()&^0x5555555555555555 {
						alternate++
					}
					if c.Weeks == 0b111100 {
						block++
					}
				}
				for _, r := range s.RoomChoices {
					if r.Weight > 0 {
						preferred++
					}
				}
			}
			assert.Positive(t, mwf50, "Mon Wed Fri 50-minute times")
			assert.Positive(t, tuth75, "Tue Thu 75-minute times")
			assert.Positive(t, alternate, "every-other-week labs")
			assert.Positive(t, block, "a block course in weeks 3-6")
			assert.Positive(t, preferred, "room choices with preferences")
			assert.Equal(t, 25, term.TravelMinutes("ASH-101", "CED-1"), "the campuses are 25 minutes apart")
			assert.Equal(t, 0, term.TravelMinutes("ASH-101", "ASH-102"), "no travel time inside a building")
			kinds := map[timetable.RelationKind]bool{}
			for _, r := range term.Relations {
				kinds[r.Kind] = true
			}
			for _, k := range []timetable.RelationKind{timetable.SameStart, timetable.MinGap, timetable.MaxDays, timetable.MaxBlock} {
				assert.True(t, kinds[k], "a %s relation", k)
			}
			// Issue 15: courses in parts with parallel labs tied to their main
			// class, a course of two arrangements, and course requests.
			courses := map[string]timetable.Course{}
			for _, c := range term.Courses() {
				courses[c.ID] = c
			}
			require.Len(t, courses, 5)
			bio := courses["BIO101"].Arrangements
			require.Len(t, bio, 1)
			require.Len(t, bio[0].Parts, 2)
			assert.Equal(t, "Lab", bio[0].Parts[1].ID)
			for _, si := range bio[0].Parts[1].Sections {
				assert.Equal(t, "BIO101-L", term.Sections[si].Parent, "each lab belongs to the main class")
			}
			assert.Len(t, bio[0].Parts[1].Sections, 2, "two parallel labs")
			assert.Len(t, courses["HIS220"].Arrangements, 2, "History Methods in two ways")
			assert.Len(t, term.Requests, 44*3-8)
			alternatives := 0
			for _, r := range term.Requests {
				alternatives += len(r.Alternatives)
			}
			assert.Positive(t, alternatives, "some requests name a course to take instead")
		})
	}
}
