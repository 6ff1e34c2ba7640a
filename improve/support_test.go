package improve

import (
	"testing"

	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/samples"
	"github.com/termwright/termwright/timetable"
)

// TestCriteriaInStep keeps the annealer's criterion list equal to
// timetable.Criteria, in order (Cost reports them in that order).
func TestCriteriaInStep(t *testing.T) {
	require.Len(t, timetable.Criteria, int(nCrit))
	for i, c := range timetable.Criteria {
		require.Equal(t, c.Name, critNames[i], "criterion %d", i)
	}
}

// TestUnsupportedTerms: every part of the term model the annealer does not
// move or count makes New refuse the term with the reason.
func TestUnsupportedTerms(t *testing.T) {
	base, wit := samples.GenerateWithWitness(samples.Config{Sections: 15, Seed: 9, Weeks: 2})
	require.Empty(t, Unsupported(base))
	_, err := New(base, wit, nil)
	require.NoError(t, err)
	cases := []struct {
		name string
		edit func(t *timetable.Term)
		want string
	}{
		{"meeting times", func(t *timetable.Term) {
			t.Sections[0].Times = []timetable.TimeChoice{{Days: timetable.DaysOf(1), Start: 540, Minutes: 50, Weeks: 1}}
		}, "chooses among meeting times"},
		{"room choices", func(t *timetable.Term) {
			t.Sections[0].RoomChoices = []timetable.RoomChoice{{Room: t.Rooms[0].ID}}
		}, "room choices"},
		{"travel", func(t *timetable.Term) { t.Travel = []timetable.Travel{{From: "A", To: "B", Minutes: 10}} }, "travel times"},
		{"weekly limit", func(t *timetable.Term) { t.Staff[0].MaxWeekDays = 2 }, "weekly limits"},
		{"lunch", func(t *timetable.Term) { t.Cohorts[0].Lunch = timetable.LunchBreak{From: 720, To: 840, Minutes: 30} }, "lunch break"},
		{"some weeks", func(t *timetable.Term) {
			t.Unavailable = append(t.Unavailable, timetable.Unavailability{Who: t.Rooms[0].ID, Kind: timetable.WhoRoom, Day: 1, From: 540, To: 600, Hard: true, Weeks: 1})
		}, "some teaching weeks"},
		{"new relation", func(t *timetable.Term) {
			t.Relations = append(t.Relations, timetable.Relation{Kind: timetable.NoOverlap, Sections: []string{t.Sections[0].ID, t.Sections[1].ID}, Hard: true})
		}, `"no overlap"`},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			term := *base
			term.Sections = append([]timetable.Section(nil), base.Sections...)
			term.Staff = append([]timetable.Staff(nil), base.Staff...)
			term.Cohorts = append([]timetable.Cohort(nil), base.Cohorts...)
			term.Unavailable = append([]timetable.Unavailability(nil), base.Unavailable...)
			term.Relations = append([]timetable.Relation(nil), base.Relations...)
			c.edit(&term)
			require.Contains(t, Unsupported(&term), c.want)
		})
	}
}
