package main

import (
	"fmt"
	"sort"
	"strings"
	"sync"
	"time"

	"github.com/termwright/termwright/encode"
	"github.com/termwright/termwright/timetable"
)

// solveLogEvery is how often solve writes a progress line when standard
// error is not a terminal (a log file, a pipe, a scheduler's job output).
const solveLogEvery = 5 * time.Second

// solveProgress shows solve's progress on stderr: on a terminal one status
// line redrawn in place; otherwise a plain line when the phase changes and
// at most every e.logEvery (default solveLogEvery) in between. Each line
// gives the phase, the cost and lower bound of every priority level by
// name, the elapsed time and the neighbourhood steps. A nil *solveProgress
// shows nothing (--quiet, --json).
type solveProgress struct {
	e      *env
	legend string // "level 2: staff gaps, cohort gaps; level 1: ...", written once
	mu     sync.Mutex
	drawn  bool      // a terminal line is on screen
	shown  bool      // the legend has been written
	phase  string    // phase of the last line logged
	last   time.Time // when the last line was logged
}

func newSolveProgress(e *env, quiet bool, t *timetable.Term) *solveProgress {
	if quiet {
		return nil
	}
	return &solveProgress{e: e, legend: solveLevelLegend(t)}
}

// show takes one progress report (the encode.OptimizeOptions callback,
// which parallel searches may call at once).
func (p *solveProgress) show(pr encode.Progress) {
	if p == nil {
		return
	}
	p.mu.Lock()
	defer p.mu.Unlock()
	if !p.shown {
		p.shown = true
		if p.legend != "" {
			fmt.Fprintf(p.e.stderr, "Priority levels (highest first): %s.\n", p.legend)
		}
	}
	if p.e.stderrIsTerminal {
		fmt.Fprintf(p.e.stderr, "\r\033[K%s", solveProgressLine(pr))
		p.drawn = true
		return
	}
	now := p.e.now()
	every := p.e.logEvery
	if every <= 0 {
		every = solveLogEvery
	}
	if pr.Phase == p.phase && now.Sub(p.last) < every {
		return
	}
	p.phase, p.last = pr.Phase, now
	fmt.Fprintf(p.e.stderr, "progress: %s\n", solveProgressLine(pr))
}

// done ends the terminal status line.
func (p *solveProgress) done() {
	if p == nil {
		return
	}
	p.mu.Lock()
	defer p.mu.Unlock()
	if p.drawn {
		fmt.Fprintln(p.e.stderr)
		p.drawn = false
	}
}

// solveProgressLine is
// "whole term  level 2: cost 23 (bound 0)  level 1: cost 20 (bound 4)  1.2 s  340 steps".
func solveProgressLine(pr encode.Progress) string {
	var b strings.Builder
	fmt.Fprintf(&b, "%-16s", pr.Phase)
	switch {
	case pr.Cost == nil:
		b.WriteString(" no timetable yet")
	case len(pr.Levels) == 0:
		b.WriteString(" timetable found (no preference is weighted)")
	}
	for i, l := range pr.Levels {
		fmt.Fprintf(&b, "  level %d:", l)
		if i < len(pr.Cost) {
			fmt.Fprintf(&b, " cost %d", pr.Cost[i])
		}
		if i < len(pr.Bound) {
			fmt.Fprintf(&b, " (bound %d)", pr.Bound[i])
		}
	}
	fmt.Fprintf(&b, "  %.1f s", pr.Elapsed.Seconds())
	if pr.Steps > 0 {
		fmt.Fprintf(&b, "  %d steps", pr.Steps)
	}
	return b.String()
}

// solveLevelLegend names the weighted preferences of each priority level,
// highest level first: "level 2: staff gaps, cohort gaps; level 1: room
// stability". It is "" when no preference is weighted.
func solveLevelLegend(t *timetable.Term) string {
	byLevel := map[int][]string{}
	for _, c := range timetable.Criteria {
		if w, l := t.CriterionWeight(c.Name); w != 0 {
			byLevel[l] = append(byLevel[l], c.Name)
		}
	}
	levels := make([]int, 0, len(byLevel))
	for l := range byLevel {
		levels = append(levels, l)
	}
	sort.Sort(sort.Reverse(sort.IntSlice(levels)))
	parts := make([]string, len(levels))
	for i, l := range levels {
		names := byLevel[l] // in the order of timetable.Criteria
		parts[i] = fmt.Sprintf("level %d: %s", l, strings.Join(names, ", "))
	}
	return strings.Join(parts, "; ")
}
