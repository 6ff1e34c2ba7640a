package planning

import (
	"context"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/termwright/termwright/encode"
	"github.com/termwright/termwright/sectioning"
	"github.com/termwright/termwright/timetable"
	"github.com/termwright/termwright/timetable/benchfmt"
)

// readITC reads a shared ITC-2019 instance as a term (skips when absent).
func readITC(t *testing.T, name string) *timetable.Term {
	_, term := readITCInstance(t, name)
	return term
}

// readITCInstance reads a shared ITC-2019 instance and its term.
func readITCInstance(t *testing.T, name string) (*benchfmt.XMLInstance, *timetable.Term) {
	t.Helper()
	dir := benchfmt.DataDir("itc2019", ".xml")
	f, err := os.Open(filepath.Join(dir, name+".xml"))
	if dir == "" || err != nil {
		t.Skip("no ITC-2019 instance " + name)
	}
	defer f.Close()
	in, err := benchfmt.ReadXML(f, name)
	if err != nil {
		t.Fatal(err)
	}
	return in, in.Term()
}

// TestITCPlanMeasure measures Plan on shared ITC-2019 instances named in
// $TERMWRIGHT_PLAN_ITC ("name:seconds,name:seconds"; skipped when unset;
// $TERMWRIGHT_PLAN_ROUNDS sets Options.Rounds):
// the program size without and with the sectioned students' clashes, and
// the full cost (students included) of each round of the loop. It asserts
// only what must hold whatever the time: the result passes Check and its
// Cost is timetable.Cost of its Schedule. Timings depend on the machine's
// load.
func TestITCPlanMeasure(t *testing.T) {
	spec := os.Getenv("TERMWRIGHT_PLAN_ITC")
	if spec == "" {
		t.Skip("set TERMWRIGHT_PLAN_ITC=name:seconds,... to measure")
	}
	for _, item := range strings.Split(spec, ",") {
		name, secs, _ := strings.Cut(item, ":")
		n, _ := strconv.Atoi(secs)
		n = max(n, 10)
		in, term := readITCInstance(t, name)
		ctx, cancel := context.WithTimeout(context.Background(), time.Duration(n)*time.Second)
		t0 := time.Now()
		rounds, _ := strconv.Atoi(os.Getenv("TERMWRIGHT_PLAN_ROUNDS")) // -1: no loop
		if v := os.Getenv("TERMWRIGHT_PLAN_SKIPGLOBAL"); v != "" {
			skipLaterGlobal = v == "1"
		}
		res, err := Plan(ctx, term, Options{OptimizeOptions: encode.OptimizeOptions{Seed: 1}, Rounds: rounds})
		cancel()
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		if res.Schedule == nil {
			t.Logf("%s: no timetable in %d s", name, n)
			continue
		}
		if hard := timetable.HardViolations(timetable.Check(term, res.Schedule)); len(hard) > 0 {
			t.Fatalf("%s: %d hard violations, first %s", name, len(hard), hard[0].Msg)
		}
		cost := timetable.Cost(term, res.Schedule, nil)
		if cost.ByLevel[1] != res.Cost.ByLevel[1] {
			t.Fatalf("%s: Cost differs", name)
		}
		t.Logf("%s (%d s, shared 2-core machine): %d sections, %d requests, %d sectioned enrolments, %d unplaced; levels %v total %v bound %v; student clashes %d units; elapsed %v",
			name, n, len(term.Sections), len(term.Requests), len(res.Schedule.Enrolments), len(res.Sectioning.Unplaced),
			res.Levels, res.Total, res.Bound, cost.Criterion(timetable.CritStudentClash).Count, time.Since(t0).Round(time.Second))
		sol, err := benchfmt.XMLSolutionOf(in, res.Schedule, benchfmt.XMLRunInfo{})
		if err != nil {
			t.Fatal(err)
		}
		total, parts := benchfmt.XMLCost(in, sol)
		t.Logf("  competition cost %d (time %d, room %d, distribution %d, student %d); its hard violations %+v",
			total, parts.Time, parts.Room, parts.Distribution, parts.Student, benchfmt.XMLHardViolations(in, sol))
		for i, r := range res.Rounds {
			t.Logf("  round %d: total %v, student clash units %d, kept %v, same seating %v, at %v", i, r.Total, r.Clashes, r.Kept, r.SameSeating, r.At.Round(time.Second))
		}
		for _, c := range cost.Criteria {
			if c.Cost != 0 {
				t.Logf("  %s: %d units, cost %d", c.Name, c.Count, c.Cost)
			}
		}
		sizes(t, name, term, res)
	}
}

// sizes logs the program size of the term's working copy without students
// and with the result's sectioned students taken as fixed.
func sizes(t *testing.T, name string, term *timetable.Term, res *Result) {
	for _, seated := range [][]timetable.Enrolment{nil, res.Schedule.Enrolments} {
		w := workingTerm(term, seated)
		t0 := time.Now()
		p, cat, err := encode.Compile(w, encode.Options{})
		if err != nil {
			t.Fatal(err)
		}
		st := cat.Stats(p)
		t.Logf("  %s with %d student enrolments: %d atoms (%.0f/section), %d rules+choices (%.0f/section), %d bounds, %d weak constraints, compiled in %v",
			name, len(w.Enrolments), st.Atoms, st.AtomsPerSec, st.Rules+st.Choices, st.RulesPerSec, st.Bounds, len(p.Weaks), time.Since(t0).Round(time.Millisecond))
	}
}

// TestITCSizes logs, for the instances of $TERMWRIGHT_SIZE_ITC (names,
// comma-separated; skipped when unset), the program size without students
// and with the students seated by the sectioner in a first timetable
// found in 30 s (shared machine).
func TestITCSizes(t *testing.T) {
	spec := os.Getenv("TERMWRIGHT_SIZE_ITC")
	if spec == "" {
		t.Skip("set TERMWRIGHT_SIZE_ITC=name,... to measure")
	}
	for _, name := range strings.Split(spec, ",") {
		term := readITC(t, name)
		ctx, cancel := context.WithTimeout(context.Background(), 30*time.Second)
		res, err := encode.Optimize(ctx, workingTerm(term, nil), encode.OptimizeOptions{Seed: 1, MaxStall: -1})
		cancel()
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		sched := res.Schedule
		if sched == nil {
			// The size depends on which sections share students, not on
			// their times: seat them in a rough placement instead.
			t.Logf("%s: no timetable in 30 s; students seated in every section's first time and room", name)
			sched = roughSchedule(term)
		}
		t0 := time.Now()
		sec, err := sectioning.Section(context.Background(), term, sched, sectioning.Options{Seed: 1})
		if err != nil {
			t.Fatal(err)
		}
		t.Logf("%s: %d students' requests, %d sectioned enrolments, %d unplaced, sectioned in %v", name, len(term.Requests), len(sec.Enrolments), len(sec.Unplaced), time.Since(t0).Round(time.Millisecond))
		sizes(t, name, term, &Result{OptimizeResult: &encode.OptimizeResult{Result: encode.Result{Schedule: withEnrolments(sched, sec.Enrolments)}}})
	}
}

// roughSchedule places every pattern section at its first time and first
// room (not a timetable: the hard rules are ignored).
func roughSchedule(term *timetable.Term) *timetable.Schedule {
	s := &timetable.Schedule{}
	for _, sec := range term.Sections {
		pl := timetable.Placement{Section: sec.ID, Meeting: 1, Period: -1, Time: 1}
		if len(sec.RoomChoices) > 0 {
			pl.Room = sec.RoomChoices[0].Room
		}
		s.Placements = append(s.Placements, pl)
	}
	return s
}
