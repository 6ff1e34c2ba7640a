package encode

import (
	"context"
	"slices"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/timetable"
)

// TestPlacesOfAgainstReference checks PlacesOf against brute force with
// the reference SAT library (solveRef): a start is listed exactly when the
// term with one more meeting of the section fixed there has a timetable.
func TestPlacesOfAgainstReference(t *testing.T) {
	for _, c := range []struct {
		name string
		term *timetable.Term
		sec  string
	}{
		{"one meeting, staff and room limits", newTerm(2, 3).room("R1", 20).
			section("A", staffOf("S1")).section("B", staffOf("S1")).section("C", staffOf("S2")).
			unavailable(timetable.WhoStaff, "S1", time.Monday, 9, 11).t, "A"},
		{"two meetings on different days", newTerm(3, 2).room("R1", 20).
			section("A", staffOf("S1"), meetings(2, 1)).section("B", cohortsOf("C1"), staffOf("S1")).
			unavailable(timetable.WhoStaff, "S1", time.Wednesday, 9, 10).t, "A"},
		{"two-period meetings", newTerm(2, 3).room("R1", 20).
			section("A", meetings(1, 2)).section("B", fixedAt(time.Monday, 10, "R1")).t, "A"},
	} {
		t.Run(c.name, func(t *testing.T) {
			got, complete, err := PlacesOf(context.Background(), c.term, c.sec, ExplainOptions{Seed: 1})
			require.NoError(t, err)
			require.True(t, complete)
			var listed []int
			for _, p := range got {
				listed = append(listed, p.Period)
				assert.Equal(t, c.term.Periods[p.Period].Label(), p.At)
			}
			assert.NotEmpty(t, listed)
			assert.Less(t, len(listed), len(c.term.Periods), "each case rules some start out")
			k := c.term.SectionIndex()[c.sec]
			for per, p := range c.term.Periods {
				work := *c.term
				work.Sections = slices.Clone(c.term.Sections)
				work.Sections[k].Fixed = append(slices.Clone(work.Sections[k].Fixed), timetable.Fixed{Day: p.Day, Start: p.Start})
				ok := false
				if _, fits := c.term.Span(per, work.Sections[k].Length); fits {
					ok = solveRef(t, &work).feasible
				}
				assert.Equal(t, ok, slices.Contains(listed, per), "%s at %s", c.sec, p.Label())
			}
		})
	}
	_, _, err := PlacesOf(context.Background(), newTerm(1, 1).room("R1", 5).section("A").t, "NOPE", ExplainOptions{})
	assert.ErrorContains(t, err, `no section "NOPE"`)
}
