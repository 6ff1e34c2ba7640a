package timetable_test

import (
	"math/rand"
	"slices"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/samples"
	"github.com/termwright/termwright/timetable"
)

// TestCompareDemoProperties compares the demo term's reference timetable
// (samples.DemoConfig) with edited copies whose differences are known by
// construction.
func TestCompareDemoProperties(t *testing.T) {
	term, s := samples.GenerateWithWitness(samples.DemoConfig)
	base := timetable.MeetingsOf(term, s)
	require.Len(t, base, len(s.Placements))

	t.Run("same timetable", func(t *testing.T) {
		c := timetable.Compare(base, base)
		assert.Equal(t, len(base), c.Count(timetable.ChangeUnchanged))
		assert.Empty(t, c.Affected(nil))
	})
	t.Run("meeting numbers reversed within each section", func(t *testing.T) {
		n := map[string]int{}
		for _, p := range s.Placements {
			n[p.Section]++
		}
		r := cloneSchedule(s)
		for i := range r.Placements {
			r.Placements[i].Meeting = n[r.Placements[i].Section] + 1 - r.Placements[i].Meeting
		}
		c := timetable.Compare(base, timetable.MeetingsOf(term, r))
		assert.Equal(t, len(base), c.Count(timetable.ChangeUnchanged))
		renum := c.Renumber(r)
		assert.Equal(t, s.Placements, renum.Placements, "Renumber restores the old numbers")
	})
	t.Run("ten meetings moved to a free period", func(t *testing.T) {
		rng := rand.New(rand.NewSource(11))
		r := cloneSchedule(s)
		moved := map[int]bool{}
		usedBy := map[string][]int{} // section -> periods its meetings start at
		for _, p := range r.Placements {
			usedBy[p.Section] = append(usedBy[p.Section], p.Period)
		}
		touched := map[string]bool{}
		for len(moved) < 10 {
			i := rng.Intn(len(r.Placements))
			p := &r.Placements[i]
			if touched[p.Section] {
				continue
			}
			to := rng.Intn(len(term.Periods))
			if slices.Contains(usedBy[p.Section], to) {
				continue
			}
			touched[p.Section] = true
			p.Period = to
			moved[i] = true
		}
		c := timetable.Compare(base, timetable.MeetingsOf(term, r))
		assert.Equal(t, 10, c.Count(timetable.ChangeMoved))
		assert.Equal(t, len(base)-10, c.Count(timetable.ChangeUnchanged))
		assert.Zero(t, c.Count(timetable.ChangeAdded)+c.Count(timetable.ChangeDropped))
		for _, ch := range c.Changes {
			if ch.Kind == timetable.ChangeMoved {
				assert.True(t, touched[ch.Section])
				assert.NotContains(t, ch.What, timetable.ChangedRoom, "rooms were kept")
			}
		}
		// Every staff member of a moved section hears of it.
		heard := map[string]bool{}
		for _, a := range c.Affected(nil) {
			if a.Kind == timetable.SubjectStaff {
				heard[a.ID] = true
			}
		}
		for _, sec := range term.Sections {
			if touched[sec.ID] {
				for _, id := range sec.Staff {
					assert.True(t, heard[id], "staff %s of moved %s", id, sec.ID)
				}
			}
		}
	})
	t.Run("a section dropped", func(t *testing.T) {
		gone := s.Placements[0].Section
		r := &timetable.Schedule{}
		for _, p := range s.Placements {
			if p.Section != gone {
				r.Placements = append(r.Placements, p)
			}
		}
		c := timetable.Compare(base, timetable.MeetingsOf(term, r))
		assert.Equal(t, len(s.Placements)-len(r.Placements), c.Count(timetable.ChangeDropped))
		assert.Equal(t, len(r.Placements), c.Count(timetable.ChangeUnchanged))
	})
}

func cloneSchedule(s *timetable.Schedule) *timetable.Schedule {
	return &timetable.Schedule{Placements: slices.Clone(s.Placements)}
}

// BenchmarkCompare compares a 5,000-section synthetic timetable with a copy
// in which every twentieth meeting moved by one period.
func BenchmarkCompare(b *testing.B) {
	term, s := samples.GenerateWithWitness(samples.Config{Sections: 5000, Seed: 3})
	r := cloneSchedule(s)
	for i := 0; i < len(r.Placements); i += 20 {
		r.Placements[i].Period = (r.Placements[i].Period + 1) % len(term.Periods)
	}
	old, cur := timetable.MeetingsOf(term, s), timetable.MeetingsOf(term, r)
	students := map[string][]string{}
	for _, e := range term.Enrolments {
		students[e.Section] = append(students[e.Section], e.Student)
	}
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		c := timetable.Compare(old, cur)
		_ = c.Affected(students)
	}
}
