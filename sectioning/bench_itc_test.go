package sectioning

import (
	"context"
	"math/rand/v2"
	"os"
	"path/filepath"
	"testing"

	"github.com/termwright/termwright/timetable"
	"github.com/termwright/termwright/timetable/benchfmt"
)

// itcTerm reads a shared ITC-2019 instance with its students, or skips
// when the shared data is absent. Its timetable is random: each class at
// one of its times and rooms (the sectioner does not need a valid one).
func itcTerm(tb testing.TB, name string) (*timetable.Term, *timetable.Schedule) {
	tb.Helper()
	dir := benchfmt.DataDir("itc2019", ".xml")
	if dir == "" {
		tb.Skip("shared ITC-2019 data not found")
	}
	f, err := os.Open(filepath.Join(dir, name+".xml"))
	if err != nil {
		tb.Skip(err)
	}
	defer f.Close()
	in, err := benchfmt.ReadXML(f, name)
	if err != nil {
		tb.Fatal(err)
	}
	t := in.Term()
	rng := rand.New(rand.NewPCG(1, 2))
	s := &timetable.Schedule{}
	for i := range t.Sections {
		sec := &t.Sections[i]
		pl := timetable.Placement{Section: sec.ID, Meeting: 1, Period: -1}
		if len(sec.Times) > 0 {
			pl.Time = 1 + rng.IntN(len(sec.Times))
		}
		if len(sec.RoomChoices) > 0 && !sec.NoRoom {
			pl.Room = sec.RoomChoices[rng.IntN(len(sec.RoomChoices))].Room
		}
		s.Placements = append(s.Placements, pl)
	}
	return t, s
}

// BenchmarkSectionITC sections the largest public ITC-2019 instance with
// students (pu-d5-spr17) on a random timetable of it.
func BenchmarkSectionITC(b *testing.B) {
	term, sched := itcTerm(b, "pu-d5-spr17")
	b.Logf("%d requests, %d sections", len(term.Requests), len(term.Sections))
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		res, err := Section(context.Background(), term, sched, Options{Seed: int64(i)})
		if err != nil {
			b.Fatal(err)
		}
		if i == 0 {
			p := newProblem(term, sched)
			p.restoreFrom(res)
			b.ReportMetric(float64(len(res.Unplaced)), "unplaced")
			b.ReportMetric(float64(p.totals().clashes), "clashes")
		}
	}
}
