package encode

import (
	"context"
	"slices"
	"testing"

	"github.com/termwright/termwright/samples"
	"github.com/termwright/termwright/timetable"
)

// plantSameTime makes term t infeasible without any counting argument
// seeing it: two one-meeting sections of one cohort, taught by different
// people, must meet at the same time. It returns their IDs.
func plantSameTime(tb testing.TB, t *timetable.Term) (a, b string) {
	tb.Helper()
	for i := range t.Sections {
		for j := i + 1; j < len(t.Sections); j++ {
			x, y := &t.Sections[i], &t.Sections[j]
			if x.Meetings != 1 || y.Meetings != 1 || x.Length != y.Length || len(x.Fixed)+len(y.Fixed) > 0 ||
				x.Weeks != y.Weeks || len(x.Cohorts) == 0 || !slices.Contains(y.Cohorts, x.Cohorts[0]) {
				continue
			}
			shared := false
			for _, s := range x.Staff {
				shared = shared || slices.Contains(y.Staff, s)
			}
			if shared {
				continue
			}
			t.Relations = append(t.Relations, timetable.Relation{Kind: timetable.SameTime, Sections: []string{x.ID, y.ID}, Hard: true,
				Src: timetable.Source{Sheet: "Relations", Row: len(t.Relations) + 2}})
			return x.ID, y.ID
		}
	}
	tb.Fatal("no two one-meeting sections share a cohort")
	return "", ""
}

// refusedRequest returns a request for a one-period section during a hard
// unavailable row of its only teacher.
func refusedRequest(tb testing.TB, t *timetable.Term) Request {
	tb.Helper()
	for _, u := range t.Unavailable {
		if !u.Hard || u.Kind != timetable.WhoStaff {
			continue
		}
		for _, s := range t.Sections {
			if len(s.Staff) != 1 || s.Staff[0] != u.Who || len(s.Fixed) > 0 || s.Length != 1 {
				continue
			}
			for _, p := range t.Periods {
				if u.Covers(p) {
					return Request{Section: s.ID, Day: p.Day, Start: p.Start}
				}
			}
		}
	}
	tb.Fatal("no teacher with a hard unavailable row teaches a one-period section")
	return Request{}
}

// TestExplainDemoPlanted: the planted conflict in the demo is found and
// named exactly, with a minimal set.
func TestExplainDemoPlanted(t *testing.T) {
	if testing.Short() {
		t.Skip("compiles the demo term")
	}
	term := samples.Demo()
	a, b := plantSameTime(t, term)
	ex, err := Explain(context.Background(), term, nil, ExplainOptions{Seed: 1})
	if err != nil {
		t.Fatal(err)
	}
	if ex.Status != StatusInfeasible || ex.Conflict == nil || !ex.Conflict.Minimal {
		t.Fatalf("status %s, conflict %+v", ex.Status, ex.Conflict)
	}
	got := conflictSectionIDs(ex.Conflict)
	slices.Sort(got)
	want := []string{a, b}
	slices.Sort(want)
	if !slices.Equal(got, want) {
		t.Fatalf("sections involved %v, want %v", got, want)
	}
	if k := reasonKinds(ex.Conflict.Reasons); !slices.Equal(k, []string{KindCohortNoOverlap, KindRelation}) {
		t.Fatalf("reasons %v, want a cohort's no-overlap and the relation", k)
	}
}

// BenchmarkExplainDemoInfeasible: whole-term explanation of the demo with a
// planted conflict (compile, first check, shrinking, three relaxations).
func BenchmarkExplainDemoInfeasible(b *testing.B) {
	term := samples.Demo()
	plantSameTime(b, term)
	b.ReportAllocs()
	var ex *Explanation
	for b.Loop() {
		var err error
		ex, err = Explain(context.Background(), term, nil, ExplainOptions{Seed: 1})
		if err != nil || ex.Status != StatusInfeasible {
			b.Fatal(err, ex.Status)
		}
	}
	reportCore(b, ex)
}

// BenchmarkExplainRequest2000: a refused request on the 2,000-section
// synthetic term (compile, checks, shrinking, relaxations, other times).
func BenchmarkExplainRequest2000(b *testing.B) {
	term := samples.Generate(samples.Config{Sections: 2000, Seed: 2027})
	req := refusedRequest(b, term)
	b.ReportAllocs()
	var ex *Explanation
	for b.Loop() {
		var err error
		ex, err = Explain(context.Background(), term, []Request{req}, ExplainOptions{Seed: 1})
		if err != nil || ex.Status != StatusRefused {
			b.Fatal(err, ex.Status)
		}
	}
	reportCore(b, ex)
}

// BenchmarkExplainWhole2000: whole-term explanation of the 2,000-section
// synthetic term with a planted conflict.
func BenchmarkExplainWhole2000(b *testing.B) {
	term := samples.Generate(samples.Config{Sections: 2000, Seed: 2027})
	plantSameTime(b, term)
	b.ReportAllocs()
	var ex *Explanation
	for b.Loop() {
		var err error
		ex, err = Explain(context.Background(), term, nil, ExplainOptions{Seed: 1})
		if err != nil || ex.Status != StatusInfeasible {
			b.Fatal(err, ex.Status)
		}
	}
	reportCore(b, ex)
}

func reportCore(b *testing.B, ex *Explanation) {
	c := ex.Conflict
	b.ReportMetric(float64(c.CoreGroups), "core-reasons")
	b.ReportMetric(float64(c.CoreSections), "core-sections")
	b.ReportMetric(float64(len(c.Reasons)), "mus-reasons")
	b.ReportMetric(float64(len(c.Sections)), "mus-sections")
	b.ReportMetric(float64(ex.Stats.Checks), "checks")
}

// BenchmarkMinHittingSet: twenty overlapping conflicts over sixty groups.
func BenchmarkMinHittingSet(b *testing.B) {
	rng := xRand(3)
	var sets [][]int
	for range 20 {
		var s []int
		for range 4 + rng.IntN(4) {
			s = append(s, rng.IntN(60))
		}
		sets = append(sets, s)
	}
	cost := func(g int) int { return 1 + g%7*10 }
	b.ReportAllocs()
	for b.Loop() {
		if _, ok, _ := minHittingSet(sets, nil, cost); !ok {
			b.Fatal("no hitting set")
		}
	}
}

// plantOverload leaves the cohort with the most weekly periods one period
// short: hard Unavailable rows cover every period but load-1 of them (a
// pigeonhole among all its sections, which the term check's counting also
// reports). It returns the cohort ID and its load.
func plantOverload(tb testing.TB, t *timetable.Term) (string, int) {
	tb.Helper()
	load := map[string]int{}
	for _, s := range t.Sections {
		for _, c := range s.Cohorts {
			load[c] += s.Meetings * s.Length
		}
	}
	best := ""
	for _, c := range t.Cohorts {
		if best == "" || load[c.ID] > load[best] {
			best = c.ID
		}
	}
	// Keep the first load-1 periods of the grid in day order free, spread
	// over the days so that sections meeting on different days still fit.
	days := t.Days()
	keep := map[int]bool{}
	for k := 0; len(keep) < load[best]-1 && k < len(t.Periods); k++ {
		for _, d := range days {
			n := 0
			for p, per := range t.Periods {
				if per.Day != d {
					continue
				}
				if n == k && len(keep) < load[best]-1 {
					keep[p] = true
				}
				n++
			}
		}
	}
	for p, per := range t.Periods {
		if !keep[p] {
			t.Unavailable = append(t.Unavailable, timetable.Unavailability{Who: best, Kind: timetable.WhoCohort, Day: per.Day,
				From: per.Start, To: per.End, Hard: true, Src: timetable.Source{Sheet: "Unavailable", Row: 1000 + p}})
		}
	}
	return best, load[best]
}

// BenchmarkExplainDemoOverload: whole-term explanation of the demo with a
// cohort one period short of its weekly load: a conflict among many
// sections, so the engine's first core and the shrinking have real work.
func BenchmarkExplainDemoOverload(b *testing.B) {
	term := samples.Demo()
	plantOverload(b, term)
	b.ReportAllocs()
	var ex *Explanation
	for b.Loop() {
		var err error
		ex, err = Explain(context.Background(), term, nil, ExplainOptions{Seed: 1})
		if err != nil || ex.Status != StatusInfeasible {
			b.Fatal(err, ex.Status)
		}
	}
	reportCore(b, ex)
}
