package timetable_test

import (
	"bytes"
	"fmt"
	"math/rand/v2"
	"os"
	"path/filepath"
	"sort"
	"strconv"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/xuri/excelize/v2"

	"github.com/termwright/termwright/samples"
	"github.com/termwright/termwright/timetable"
)

// perturb moves n random meetings of a copy of w to random periods and
// rooms, making clashes of every kind.
func perturb(term *timetable.Term, w *timetable.Schedule, n int, seed uint64) *timetable.Schedule {
	rng := rand.New(rand.NewPCG(seed, 7))
	s := &timetable.Schedule{Placements: append([]timetable.Placement(nil), w.Placements...)}
	for range n {
		i := rng.IntN(len(s.Placements))
		s.Placements[i].Period = rng.IntN(len(term.Periods))
		if s.Placements[i].Room != "" {
			s.Placements[i].Room = term.Rooms[rng.IntN(len(term.Rooms))].ID
		}
	}
	return s
}

// clashKey is a double booking as a rule and a pair of placements.
type clashKey struct {
	rule string
	i, j int
}

// naiveClashes is the reference for Check's double bookings: every pair of
// placements, every shared staff member, cohort and room, period by period.
// Quadratic, obviously correct, independent of Check's sweep.
func naiveClashes(term *timetable.Term, s *timetable.Schedule) []clashKey {
	secs := term.SectionIndex()
	rooms := term.RoomIndex()
	occ := make([][]int, len(s.Placements))
	for i, p := range s.Placements {
		if k, ok := secs[p.Section]; ok {
			occ[i], _ = term.Span(p.Period, max(1, term.Sections[k].Length))
		}
	}
	shared := func(a, b []string) int {
		n := 0
		seen := map[string]bool{}
		for _, x := range a {
			for _, y := range b {
				if x == y && !seen[x] {
					seen[x] = true
					n++
				}
			}
		}
		return n
	}
	var out []clashKey
	for i := range s.Placements {
		for j := i + 1; j < len(s.Placements); j++ {
			if occ[i] == nil || occ[j] == nil {
				continue
			}
			common := false
			for _, p := range occ[i] {
				for _, q := range occ[j] {
					common = common || p == q
				}
			}
			if !common {
				continue
			}
			a, b := term.Sections[secs[s.Placements[i].Section]], term.Sections[secs[s.Placements[j].Section]]
			if a.ID == b.ID {
				out = append(out, clashKey{timetable.RuleSelfOverlap, i, j})
				continue
			}
			if !a.Weeks.Overlaps(b.Weeks) {
				continue
			}
			for range shared(a.Staff, b.Staff) {
				out = append(out, clashKey{timetable.RuleStaffClash, i, j})
			}
			for range shared(a.Cohorts, b.Cohorts) {
				out = append(out, clashKey{timetable.RuleCohortClash, i, j})
			}
			if r := s.Placements[i].Room; r != "" && r == s.Placements[j].Room {
				if _, ok := rooms[r]; ok {
					out = append(out, clashKey{timetable.RuleRoomClash, i, j})
				}
			}
		}
	}
	return out
}

func sortClashes(ks []clashKey) {
	sort.Slice(ks, func(a, b int) bool {
		if ks[a].rule != ks[b].rule {
			return ks[a].rule < ks[b].rule
		}
		if ks[a].i != ks[b].i {
			return ks[a].i < ks[b].i
		}
		return ks[a].j < ks[b].j
	})
}

// naiveStudentClashes counts, per student and pair of their distinct
// sections with overlapping weeks, the periods both occupy.
func naiveStudentClashes(term *timetable.Term, s *timetable.Schedule) int64 {
	secs := term.SectionIndex()
	periods := map[string]map[int]bool{}
	for _, p := range s.Placements {
		k, ok := secs[p.Section]
		if !ok {
			continue
		}
		span, ok := term.Span(p.Period, term.Sections[k].Length)
		if !ok {
			continue
		}
		if periods[p.Section] == nil {
			periods[p.Section] = map[int]bool{}
		}
		for _, q := range span {
			periods[p.Section][q] = true
		}
	}
	by := map[string]map[string]bool{}
	for _, e := range term.Enrolments {
		if by[e.Student] == nil {
			by[e.Student] = map[string]bool{}
		}
		by[e.Student][e.Section] = true
	}
	var n int64
	for _, set := range by {
		var list []string
		for id := range set {
			list = append(list, id)
		}
		for a := range list {
			for b := a + 1; b < len(list); b++ {
				sa, sb := term.Sections[secs[list[a]]], term.Sections[secs[list[b]]]
				if !sa.Weeks.Overlaps(sb.Weeks) {
					continue
				}
				for q := range periods[list[a]] {
					if periods[list[b]][q] {
						n++
					}
				}
			}
		}
	}
	return n
}

// TestCheckAgreesWithNaiveReference perturbs generated feasible timetables
// and compares Check's double bookings, and Cost's student clashes, with
// the quadratic references above.
func TestCheckAgreesWithNaiveReference(t *testing.T) {
	for _, cfg := range []samples.Config{{Sections: 120, Seed: 5}, {Sections: 300, Seed: 6, Days: 4, PeriodsPerDay: 6}} {
		term, w := samples.GenerateWithWitness(cfg)
		require.Empty(t, timetable.HardViolations(timetable.Check(term, w)), "the witness is feasible")
		for seed := range uint64(5) {
			t.Run(fmt.Sprintf("%d/%d/%d", cfg.Sections, cfg.Seed, seed), func(t *testing.T) {
				s := perturb(term, w, 40, seed)
				want := naiveClashes(term, s)
				var got []clashKey
				for _, v := range timetable.Check(term, s) {
					switch v.Rule {
					case timetable.RuleStaffClash, timetable.RuleCohortClash, timetable.RuleRoomClash, timetable.RuleSelfOverlap:
						require.Len(t, v.Placements, 2)
						got = append(got, clashKey{v.Rule, v.Placements[0], v.Placements[1]})
					}
				}
				sortClashes(want)
				sortClashes(got)
				assert.NotEmpty(t, want, "the perturbation made clashes")
				assert.Equal(t, want, got)
				assert.Equal(t, naiveStudentClashes(term, s), timetable.Cost(term, s, nil).Criterion(timetable.CritStudentClash).Count)
			})
		}
	}
}

// BenchmarkCheck checks the generator's feasible 2,000-section timetable.
func BenchmarkCheck(b *testing.B) {
	term, w := samples.GenerateWithWitness(samples.Config{Sections: 2000, Seed: 1})
	b.ReportAllocs()
	b.ResetTimer()
	for range b.N {
		if vs := timetable.HardViolations(timetable.Check(term, w)); len(vs) > 0 {
			b.Fatal(vs[0].Msg)
		}
	}
}

// BenchmarkCheckClashes checks the same timetable with 200 meetings moved
// at random, so that messages are built too.
func BenchmarkCheckClashes(b *testing.B) {
	term, w := samples.GenerateWithWitness(samples.Config{Sections: 2000, Seed: 1})
	s := perturb(term, w, 200, 1)
	b.ReportAllocs()
	b.ResetTimer()
	for range b.N {
		timetable.Check(term, s)
	}
}

// BenchmarkCost evaluates every criterion on the 2,000-section timetable.
func BenchmarkCost(b *testing.B) {
	term, w := samples.GenerateWithWitness(samples.Config{Sections: 2000, Seed: 1})
	b.ReportAllocs()
	b.ResetTimer()
	for range b.N {
		timetable.Cost(term, w, w)
	}
}

// BenchmarkReadSchedule reads the 2,000-section timetable back from a
// workbook with one row per meeting (written here with plain text cells).
func BenchmarkReadSchedule(b *testing.B) {
	term, w := samples.GenerateWithWitness(samples.Config{Sections: 2000, Seed: 1})
	f := excelize.NewFile()
	require.NoError(b, f.SetSheetName("Sheet1", timetable.TimetableSheet))
	sw, err := f.NewStreamWriter(timetable.TimetableSheet)
	require.NoError(b, err)
	row := func(r int, cells ...string) {
		vals := make([]any, len(cells))
		for i, c := range cells {
			vals[i] = c
		}
		cell, _ := excelize.CoordinatesToCellName(1, r)
		require.NoError(b, sw.SetRow(cell, vals))
	}
	row(1, "Section", "Meeting", "Day", "Start", "Room")
	for i, p := range w.Placements {
		per := term.Periods[p.Period]
		row(i+2, p.Section, strconv.Itoa(p.Meeting), timetable.DayName(per.Day), per.Start.String(), p.Room)
	}
	require.NoError(b, sw.Flush())
	var buf bytes.Buffer
	_, err = f.WriteTo(&buf)
	require.NoError(b, err)
	path := filepath.Join(b.TempDir(), "timetable.xlsx")
	require.NoError(b, os.WriteFile(path, buf.Bytes(), 0o644))
	b.ReportAllocs()
	b.ResetTimer()
	for range b.N {
		s, ps, err := timetable.ReadSchedule(path, term)
		if err != nil || len(ps) > 0 || len(s.Placements) != len(w.Placements) {
			b.Fatal(err, ps)
		}
	}
}
