package samples

import (
	"fmt"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"github.com/termwright/termwright/timetable"
)

// TestWitnessFeasible is the generator's main promise: the term validates
// without errors, and the witness passes the independent domain checker
// (timetable.Check) with no hard violation, and our own clash count.
func TestWitnessFeasible(t *testing.T) {
	cases := []Config{
		DemoConfig,
		{Sections: 10, Seed: 1},
		{Sections: 300, Seed: 2},
		{Sections: 300, Seed: 3, Days: 4, PeriodsPerDay: 6},
		{Sections: 1500, Seed: 4},
	}
	for _, cfg := range cases {
		t.Run(fmt.Sprintf("%d/%d", cfg.Sections, cfg.Seed), func(t *testing.T) {
			if cfg.Sections > 1000 && testing.Short() {
				t.Skip("large term in -short mode")
			}
			term, w := GenerateWithWitness(cfg)
			require.Empty(t, timetable.Validate(term).Errors())
			meetings := 0
			for _, s := range term.Sections {
				meetings += s.Meetings
			}
			require.Len(t, w.Placements, meetings, "one placement per meeting")
			assert.Empty(t, timetable.HardViolations(timetable.Check(term, w)))
			assert.Empty(t, clashes(term, w))
		})
	}
}

// clashes is a simple clash finder independent of timetable.Check: it lists
// every staff member, cohort or room in two meetings at one period in a
// common week, and every room too small or lacking a needed feature.
func clashes(term *timetable.Term, w *timetable.Schedule) []string {
	secs := term.SectionIndex()
	rooms := term.RoomIndex()
	type slot struct {
		who    string
		period int
	}
	used := map[slot][]timetable.WeekSet{}
	var out []string
	for _, pl := range w.Placements {
		s := term.Sections[secs[pl.Section]]
		span, ok := term.Span(pl.Period, s.Length)
		if !ok {
			out = append(out, pl.Section+": meeting does not fit the grid")
			continue
		}
		who := bookedBy(s, pl.Room)
		if pl.Room != "" {
			r := term.Rooms[rooms[pl.Room]]
			if r.Capacity < s.Size {
				out = append(out, fmt.Sprintf("%s: %d students in %s of %d seats", s.ID, s.Size, r.ID, r.Capacity))
			}
			for _, n := range s.Needs {
				found := false
				for _, f := range r.Features {
					found = found || f == n
				}
				if !found {
					out = append(out, fmt.Sprintf("%s needs %s, %s lacks it", s.ID, n, r.ID))
				}
			}
		} else if !s.NoRoom {
			out = append(out, s.ID+": no room")
		}
		for _, p := range span {
			for _, x := range who {
				k := slot{x, p}
				for _, ws := range used[k] {
					if ws.Overlaps(s.Weeks) {
						out = append(out, fmt.Sprintf("%s twice at period %d", x, p))
					}
				}
				used[k] = append(used[k], s.Weeks)
			}
		}
	}
	return out
}

// TestClashesFindsClashes makes sure the clash finder above can fail.
func TestClashesFindsClashes(t *testing.T) {
	term, w := GenerateWithWitness(Config{Sections: 30, Seed: 1})
	bad := &timetable.Schedule{Placements: append([]timetable.Placement(nil), w.Placements...)}
	p0 := bad.Placements[0]
	bad.Placements = append(bad.Placements, timetable.Placement{Section: p0.Section, Meeting: 99, Period: p0.Period, Room: p0.Room})
	assert.NotEmpty(t, clashes(term, bad))
	assert.NotEmpty(t, timetable.HardViolations(timetable.Check(term, bad)))
}
