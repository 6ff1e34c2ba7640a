package samples

import (
	"fmt"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"github.com/termwright/termwright/timetable"
)

// TestPatternWitnessFeasible: a generated pattern term validates without
// errors, mixes pattern and grid sections, and its witness places every
// section once per meeting (pattern sections once) without a clash of
// staff, cohort or room, with the travel time between buildings kept and
// weekly minute limits kept, by an independent minute-by-minute check.
func TestPatternWitnessFeasible(t *testing.T) {
	for _, cfg := range []Config{{Sections: 60, Seed: 1}, {Sections: 300, Seed: 2}, DemoConfig} {
		t.Run(fmt.Sprintf("%d/%d", cfg.Sections, cfg.Seed), func(t *testing.T) {
			term, w := GeneratePatternsWithWitness(cfg)
			require.Empty(t, timetable.Validate(term).Errors())
			patterns, grid, want := 0, 0, 0
			for _, s := range term.Sections {
				if s.UsesTimes() {
					patterns++
					want++
				} else {
					grid++
					want += s.Meetings
				}
			}
			assert.Positive(t, patterns, "pattern sections")
			assert.Positive(t, grid, "grid sections stay")
			t.Logf("%d pattern sections, %d grid sections, %d travel rows", patterns, grid, len(term.Travel))
			if cfg.Sections >= 150 {
				assert.NotEmpty(t, term.Travel, "travel between buildings")
			}
			require.Len(t, w.Placements, want)
			assert.Empty(t, occurrenceClashes(term, w))
		})
	}
}

// TestGeneratePatternsDeterministic: equal configs give equal terms.
func TestGeneratePatternsDeterministic(t *testing.T) {
	a, b := GeneratePatterns(Config{Sections: 80, Seed: 9}), GeneratePatterns(Config{Sections: 80, Seed: 9})
	assert.Equal(t, a, b)
}

// occurrenceClashes lists, by the minutes of the placements' occurrences,
// every staff member, cohort or room in two meetings at once in a common
// week, every staff member or cohort with less free time between two
// meetings than the travel time between their rooms, and every weekly
// minutes limit broken.
func occurrenceClashes(term *timetable.Term, w *timetable.Schedule) []string {
	secs := term.SectionIndex()
	type use struct {
		occ  timetable.Occurrence
		room string
		sec  string
	}
	byWho := map[string][]use{}
	var out []string
	for _, pl := range w.Placements {
		s := term.Sections[secs[pl.Section]]
		occ := term.Occurrences(pl)
		if len(occ) == 0 {
			out = append(out, fmt.Sprintf("%s: placement %+v names no valid time", s.ID, pl))
		}
		for _, o := range occ {
			for _, k := range bookedBy(s, pl.Room) {
				byWho[k] = append(byWho[k], use{o, pl.Room, s.ID})
			}
		}
	}
	for who, uses := range byWho {
		for i := range uses {
			for j := i + 1; j < len(uses); j++ {
				a, b := uses[i], uses[j]
				if a.occ.Day != b.occ.Day || !a.occ.Weeks.Overlaps(b.occ.Weeks) {
					continue
				}
				if a.occ.Overlaps(b.occ) {
					out = append(out, fmt.Sprintf("%s: %s and %s overlap", who, a.sec, b.sec))
					continue
				}
				if who[:4] == "room" {
					continue
				}
				if b.occ.Start < a.occ.Start {
					a, b = b, a
				}
				if gap := int(b.occ.Start - a.occ.End); gap < term.TravelMinutes(a.room, b.room) {
					out = append(out, fmt.Sprintf("%s: %d minutes from %s to %s, travel needs %d", who, gap, a.room, b.room, term.TravelMinutes(a.room, b.room)))
				}
			}
		}
	}
	for _, st := range term.Staff {
		if st.MaxWeekMinutes == 0 {
			continue
		}
		var weeks [64]int
		for _, u := range byWho["staff "+st.ID] {
			for wk := 1; wk <= 64; wk++ {
				if u.occ.Weeks.Has(wk) {
					weeks[wk-1] += u.occ.Minutes()
				}
			}
		}
		for wk, m := range weeks {
			if m > st.MaxWeekMinutes {
				out = append(out, fmt.Sprintf("staff %s: %d minutes in week %d, limit %d", st.ID, m, wk+1, st.MaxWeekMinutes))
			}
		}
	}
	return out
}
