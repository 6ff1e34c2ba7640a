package encode

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/samples"
	"github.com/termwright/termwright/timetable"
)

// TestTravelScope: travel rows that would reach grid meetings stop the
// compile with the row and what to change (the search could not keep
// them, and timetable.Check would refuse the result); on a term of
// meeting patterns only (the second demo, with travel between its two
// campuses) they compile.
func TestTravelScope(t *testing.T) {
	grid := samples.Generate(samples.Config{Sections: 15, Seed: 9, Weeks: 2})
	grid.Travel = []timetable.Travel{{From: grid.Rooms[0].ID, To: grid.Rooms[1].ID, Minutes: 15, Src: timetable.Source{Sheet: "Travel", Row: 2}}}
	_, _, err := Compile(grid, Options{})
	require.Error(t, err)
	assert.Contains(t, err.Error(), "Travel row 2: travel times are kept for grid sections with one room only")

	campus := samples.Campus()
	require.NotEmpty(t, campus.Travel)
	_, _, err = Compile(campus, Options{})
	require.NoError(t, err)
}
