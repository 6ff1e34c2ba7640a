package timetable

import (
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// builtTerm is a small valid term made in code (no Sources), as a generator
// or the benchmark reader makes one.
func builtTerm() *Term {
	t := &Term{
		Name: "Built", TimeZone: "UTC",
		FirstDay: time.Date(2027, 1, 4, 0, 0, 0, 0, time.UTC), LastDay: time.Date(2027, 3, 26, 0, 0, 0, 0, time.UTC),
		Rooms:   []Room{{ID: "R1", Capacity: 30}, {ID: "R2", Capacity: 60, Features: []string{"lab"}}},
		Staff:   []Staff{{ID: "A"}, {ID: "B"}},
		Cohorts: []Cohort{{ID: "Y1", Size: 25}},
	}
	for d := time.Monday; d <= time.Friday; d++ {
		for h := 9; h < 13; h++ {
			t.Periods = append(t.Periods, Period{Index: len(t.Periods), Day: d, Start: Clock(h * 60), End: Clock(h*60 + 60)})
		}
	}
	all := t.AllWeeks()
	t.Sections = []Section{
		{ID: "S1", Staff: []string{"A"}, Cohorts: []string{"Y1"}, Size: 25, Meetings: 2, Length: 1, Weeks: all},
		{ID: "S2", Staff: []string{"B"}, Cohorts: []string{"Y1"}, Size: 25, Meetings: 1, Length: 2, Needs: []string{"lab"}, Weeks: all},
	}
	return t
}

func TestValidateBuiltTerm(t *testing.T) {
	require.Empty(t, Validate(builtTerm()))

	for _, tc := range []struct {
		name string
		edit func(*Term)
		msg  string
	}{
		{"unknown staff", func(t *Term) { t.Sections[0].Staff = []string{"Z"} }, `section "S1": staff "Z" is not on the Staff sheet`},
		{"unknown criterion", func(t *Term) { t.Weights = map[string]Weight{"luck": {Weight: 1}} }, `criterion "luck" is not known`},
		{"negative weight", func(t *Term) { t.Weights = map[string]Weight{CritTravel: {Weight: -1}} }, `criterion "travel": weight -1 is negative`},
		{"unsorted periods", func(t *Term) { t.Periods[0], t.Periods[1] = t.Periods[1], t.Periods[0] }, "Index"},
		{"unknown relation kind", func(t *Term) { t.Relations = []Relation{{Kind: 99, Sections: []string{"S1", "S2"}}} }, "the kind is not a relation"},
		{"zero meetings", func(t *Term) { t.Sections[1].Meetings = 0 }, `section "S2": meetings per week and periods per meeting must be at least 1`},
		{"empty weeks", func(t *Term) { t.Sections[1].Weeks = 0 }, "meets in no teaching week"},
		{"unavailability of unknown kind", func(t *Term) {
			t.Unavailable = []Unavailability{{Who: "A", Kind: WhoRoom, Day: time.Monday, To: 600, Hard: true}}
		}, `room "A" is not on the Rooms sheet`},
		{"blank room ID", func(t *Term) { t.Rooms[0].ID = "" }, "a room has a blank ID"},
		{"zero capacity", func(t *Term) { t.Rooms[0].Capacity = 0 }, "capacity 0 is not a number of seats"},
		{"no periods", func(t *Term) { t.Periods = nil }, "the term has no periods"},
		{"no rooms", func(t *Term) { t.Rooms = nil }, "the term has no rooms but 2 sections need one"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			term := builtTerm()
			tc.edit(term)
			ps := Validate(term)
			found := false
			for _, p := range ps {
				assert.Equal(t, Position{}, p.Pos, "a built term has no positions")
				found = found || strings.Contains(p.Msg, tc.msg)
			}
			assert.True(t, found, "want %q in\n%s", tc.msg, ps)
		})
	}
}

// TestEveryPlantedErrorAtOnce plants several unrelated mistakes and expects
// all of them in one run.
func TestEveryPlantedErrorAtOnce(t *testing.T) {
	planted := []cellEdit{
		e("Term", "B5", "Nowhere/Town"),
		e("Periods", "B9", "25:00"),
		e("Rooms", "B3", "lots"),
		e("Staff", "D3", "-2"),
		e("Sections", "C3", "S-404"),
		e("Sections", "K4", "99"),
		e("Enrolments", "B3", "SEC-0"),
		e("Unavailable", "B2", "Someday"),
		e("Relations", "B2", "SEC-1"),
		e("Weights", "A2", "joy"),
	}
	_, ps := readSheets(t, applyEdits(t, goodSheets(), planted...))
	errs := ps.Errors()
	at := map[string]bool{}
	for _, p := range errs {
		at[p.Pos.String()] = true
	}
	for _, ed := range planted {
		assert.True(t, at[ed.sheet+"!"+ed.cell], "no error at %s!%s in\n%s", ed.sheet, ed.cell, ps)
	}
}
