package improve_test

import (
	"os"
	"testing"
	"time"

	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/improve"
	"github.com/termwright/termwright/timetable"
)

// measureBudget is the time budget of an optional measurement, read from
// environment variable env (a Go duration such as "60s"); without it the
// test is skipped with a message that says what to set, ending in what.
func measureBudget(t *testing.T, env, what string) time.Duration {
	t.Helper()
	limit, err := time.ParseDuration(os.Getenv(env))
	if err != nil || limit <= 0 {
		t.Skipf("set %s to %s", env, what)
	}
	return limit
}

// requireSound checks a run's result against the independent checker: its
// best timetable passes timetable.Check and its reported cost is
// timetable.Cost of that timetable.
func requireSound(t *testing.T, term *timetable.Term, res improve.Result) {
	t.Helper()
	require.Empty(t, timetable.HardViolations(timetable.Check(term, res.Best)))
	require.Equal(t, timetable.Cost(term, res.Best, nil).ByLevel, res.Cost.ByLevel)
}
