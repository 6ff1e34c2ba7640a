package main

import (
	"fmt"
	"strconv"
	"strings"

	"github.com/termwright/termwright/encode"
)

// solveProgress draws one status line on stderr while solve searches:
// phase, best cost, lower bound, neighbourhood steps and elapsed time. It
// draws only when stderr is a terminal and --quiet is not given; a nil
// *solveProgress draws nothing.
type solveProgress struct {
	e     *env
	drawn bool
}

func newSolveProgress(e *env, quiet bool) *solveProgress {
	if quiet || !e.stderrIsTerminal {
		return nil
	}
	return &solveProgress{e: e}
}

// show redraws the status line (the encode.OptimizeOptions callback).
func (p *solveProgress) show(pr encode.Progress) {
	if p == nil {
		return
	}
	fmt.Fprintf(p.e.stderr, "\r\033[K%s", solveProgressLine(pr))
	p.drawn = true
}

// done ends the status line.
func (p *solveProgress) done() {
	if p != nil && p.drawn {
		fmt.Fprintln(p.e.stderr)
	}
}

// solveProgressLine is "whole term  cost 0/23/20  bound 0/0/0  1.2 s  340 steps".
func solveProgressLine(pr encode.Progress) string {
	cost := "none yet"
	if pr.Cost != nil {
		cost = solveVector(pr.Cost)
	}
	line := fmt.Sprintf("%-16s cost %s  bound %s  %5.1f s", pr.Phase, cost, solveVector(pr.Bound), pr.Elapsed.Seconds())
	if pr.Steps > 0 {
		line += fmt.Sprintf("  %d steps", pr.Steps)
	}
	return line
}

// solveVector writes a cost vector as "0/23/20" (highest level first).
func solveVector(v []int64) string {
	parts := make([]string, len(v))
	for i, x := range v {
		parts[i] = strconv.FormatInt(x, 10)
	}
	if len(parts) == 0 {
		return "0"
	}
	return strings.Join(parts, "/")
}
