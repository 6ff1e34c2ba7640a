package main

import (
	"bytes"
	"context"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"time"

	"github.com/termwright/termwright/encode"
	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// The steps benchOne (.ctt) and benchRunXML (.xml) share: read an instance,
// solve it within the time limit, and hold the timetable against Check and
// termwright's own cost.

// benchRead reads the instance at path with read, which is given the file's
// base name for its messages. When the file cannot be read or parsed it
// fills row.Error, reports the problem on stderr and gives false.
func benchRead[T any](e *env, row *benchRow, path string, read func(io.Reader, string) (T, error)) (T, bool) {
	data, err := os.ReadFile(path)
	if err != nil {
		row.Error = err.Error()
		fmt.Fprintf(e.stderr, "bench: %s: %v\n", row.Instance, err)
		var none T
		return none, false
	}
	in, err := read(bytes.NewReader(data), filepath.Base(path))
	if err != nil {
		row.Error = "cannot read the instance"
		fmt.Fprintf(e.stderr, "bench: %v\n", err)
		return in, false
	}
	return in, true
}

// benchRunTerm solves term within --time-limit (the clock starts before
// compiling) and fills the row's status and total time. It gives the result
// and the time taken; the result is nil, after the reason is reported on
// stderr, when the run failed (row.Error is set) or found no timetable.
func benchRunTerm(ctx context.Context, e *env, o *benchOptions, row *benchRow, term *timetable.Term) (*encode.OptimizeResult, time.Duration) {
	ictx, cancel := context.WithTimeout(ctx, o.timeLimit)
	defer cancel()
	start := e.now()
	res, err := benchSolve(ictx, term, o.seed, o.threads)
	elapsed := e.now().Sub(start)
	row.TotalMS = elapsed.Milliseconds()
	if err != nil {
		row.Error = err.Error()
		fmt.Fprintf(e.stderr, "bench: %s: %v\n", row.Instance, err)
		return nil, elapsed
	}
	row.Status = res.Status.String()
	if res.Status != solver.Satisfiable || res.Schedule == nil {
		fmt.Fprintf(e.stderr, "bench: %s: %s after %s\n", row.Instance, row.Status, benchDuration(elapsed))
		return nil, elapsed
	}
	return res, elapsed
}

// benchFeasible sets row.Feasible: the competition's rules count hard
// violations in s and Check finds none either. It warns when only Check
// finds some, and gives how many Check found.
func benchFeasible(e *env, row *benchRow, term *timetable.Term, s *timetable.Schedule, hard int) int {
	checked := timetable.HardViolations(timetable.Check(term, s))
	row.Feasible = hard == 0 && len(checked) == 0
	if hard == 0 && len(checked) > 0 {
		fmt.Fprintf(e.stderr, "bench: %s: Check reports %d hard violations the competition's rules do not: %s\n", row.Instance, len(checked), checked[0].Msg)
	}
	return len(checked)
}

// benchOwnCost, for a valid timetable s found after elapsed, warns when
// timetable.Cost differs from the competition's total and sets the first
// and best times to elapsed (benchTimes refines them from the optimiser's
// history). Unplaced requests are left out of our side: the competition
// makes seating every student a rule (its hard count), not a cost.
func benchOwnCost(e *env, row *benchRow, term *timetable.Term, s *timetable.Schedule, total int, elapsed time.Duration, valid bool) {
	if !valid {
		return
	}
	var own int64
	for _, c := range timetable.Cost(term, s, nil).Criteria {
		if c.Name != timetable.CritUnplaced {
			own += c.Cost
		}
	}
	if own != int64(total) {
		fmt.Fprintf(e.stderr, "bench: %s: termwright's cost %d differs from the competition's %d; please report this\n", row.Instance, own, total)
	}
	ms := elapsed.Milliseconds()
	row.FirstMS, row.BestMS = &ms, &ms
}
