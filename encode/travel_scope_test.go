package encode

import (
	"context"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/samples"
	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// TestTravelScope: travel rows reaching grid meetings with several
// candidate rooms give those sections explicit rooms (rooms_grid.go), so a
// grid term with travel compiles and solves to a timetable that passes
// timetable.Check (which judges travel for every meeting); so does the
// second demo (meeting patterns, two campuses).
func TestTravelScope(t *testing.T) {
	grid := samples.Generate(samples.Config{Sections: 15, Seed: 9, Weeks: 2})
	grid.Travel = []timetable.Travel{{From: grid.Rooms[0].ID, To: grid.Rooms[1].ID, Minutes: 15, Src: timetable.Source{Sheet: "Travel", Row: 2}}}
	_, cat, err := Compile(grid, Options{})
	require.NoError(t, err)
	assert.NotEmpty(t, cat.gridRooms)
	res, err := Solve(context.Background(), grid, SolveOptions{Seed: 1})
	require.NoError(t, err)
	require.Equal(t, solver.Satisfiable, res.Status)
	assert.Empty(t, timetable.HardViolations(timetable.Check(grid, res.Schedule)))

	campus := samples.Campus()
	require.NotEmpty(t, campus.Travel)
	_, _, err = Compile(campus, Options{})
	require.NoError(t, err)
}
