package sectioning

import (
	"context"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/require"
)

// itcNames are the shared ITC-2019 instances.
var itcNames = []string{"bet-fal17", "bet-sum18", "lums-spr18", "lums-sum17", "mary-spr17", "muni-fi-spr16", "muni-fi-spr17",
	"muni-fsps-spr17", "nbi-spr18", "pu-cs-fal07", "pu-d5-spr17", "tg-fal17", "wbg-fal10", "yach-fal17"}

// TestSectionITCInstances seats the students of every shared ITC-2019
// instance on a random timetable of it and passes the result through
// timetable.Check's seating rules and seatingErrors (skipped when the
// data is absent; -short runs the four small ones).
func TestSectionITCInstances(t *testing.T) {
	for _, name := range itcNames {
		t.Run(name, func(t *testing.T) {
			if testing.Short() && !strings.Contains("bet-sum18 lums-sum17 pu-cs-fal07 wbg-fal10", name) {
				t.Skip("-short")
			}
			term, sched := itcTerm(t, name)
			if len(term.Requests) == 0 {
				t.Skip("no students")
			}
			start := time.Now()
			res, err := Section(context.Background(), term, sched, Options{Seed: 1})
			took := time.Since(start)
			require.NoError(t, err)
			require.Empty(t, allSeatingErrors(term, sched, res))
			rep := NewReport(term, sched, res)
			t.Logf("%d requests, %d sections: %d unplaced, %d clashes, %v (machine shared)", len(term.Requests), len(term.Sections), len(res.Unplaced), rep.TotalClashes, took.Round(time.Millisecond))
		})
	}
}
