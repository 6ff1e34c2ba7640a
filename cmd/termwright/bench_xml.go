package main

import (
	"bytes"
	"context"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"text/tabwriter"
	"time"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
	"github.com/termwright/termwright/timetable/benchfmt"
)

// The ITC-2019 instances (*.xml) of a bench folder. They map to terms of
// pattern sections (benchfmt.XMLInstance.Term) and go through the same
// solve as the .ctt files; students are not sectioned yet, so the cost is
// the time, room and relation parts, and the ratio is taken against the
// best-known solution's same parts.

// benchPatternRow is the part of a result row only pattern instances have.
type benchPatternRow struct {
	Sections  int                `json:"sections"`
	Relations int                `json:"relations"` // constraints between sections in the instance
	Students  int                `json:"students"`  // students wanting courses (not sectioned)
	Parts     *benchfmt.XMLParts `json:"cost_parts,omitempty"`
	Hard      *benchfmt.XMLHard  `json:"hard_counts,omitempty"`
	Reference *int               `json:"reference,omitempty"` // best known without the student part
}

// benchXMLName is the instance name of an .xml file.
func benchXMLName(path string) string { return strings.TrimSuffix(filepath.Base(path), ".xml") }

// benchXMLSolutionFile is where --out writes an instance's timetable.
func benchXMLSolutionFile(out, path string) string {
	return filepath.Join(out, benchXMLName(path)+".solution.xml")
}

// benchOneXML reads, solves, checks and writes one ITC-2019 instance.
func benchOneXML(ctx context.Context, e *env, o *benchOptions, path string) benchRow {
	name := benchXMLName(path)
	row := benchRow{Instance: name, Format: "patterns", Status: "error", Pattern: &benchPatternRow{}}
	data, err := os.ReadFile(path)
	if err != nil {
		row.Error = err.Error()
		fmt.Fprintf(e.stderr, "bench: %s: %v\n", name, err)
		return row
	}
	in, err := benchfmt.ReadXML(bytes.NewReader(data), filepath.Base(path))
	if err != nil {
		row.Error = "cannot read the instance"
		fmt.Fprintf(e.stderr, "bench: %v\n", err)
		return row
	}
	term := in.Term()
	row.Rooms = len(term.Rooms)
	row.Pattern.Sections, row.Pattern.Relations, row.Pattern.Students = len(term.Sections), len(in.Distributions), len(in.Students)
	fmt.Fprintf(e.stderr, "bench: %s: %d sections, %d rooms, %d relations; solving for up to %s\n", name, len(term.Sections), len(term.Rooms), len(term.Relations), o.timeLimit)
	ictx, cancel := context.WithTimeout(ctx, o.timeLimit)
	defer cancel()
	start := e.now()
	res, err := benchSolve(ictx, term, o.seed, o.threads)
	elapsed := e.now().Sub(start)
	row.TotalMS = elapsed.Milliseconds()
	if err != nil {
		row.Error = err.Error()
		fmt.Fprintf(e.stderr, "bench: %s: %v\n", name, err)
		return row
	}
	row.Status = res.Status.String()
	if res.Status != solver.Satisfiable || res.Schedule == nil {
		fmt.Fprintf(e.stderr, "bench: %s: %s after %s\n", name, row.Status, benchDuration(elapsed))
		return row
	}
	sol, err := benchfmt.XMLSolutionOf(in, res.Schedule, benchfmt.XMLRunInfo{
		Runtime: elapsed.Seconds(), Cores: max(o.threads, 1), Technique: "stable models with optimisation", Author: "termwright",
	})
	if err != nil {
		row.Status, row.Error = "error", err.Error()
		fmt.Fprintf(e.stderr, "bench: %s: the timetable does not fit the instance: %v\n", name, err)
		return row
	}
	benchScoreXML(e, &row, in, term, res.Schedule, sol, elapsed)
	benchTimes(&row, res)
	if o.out != "" {
		file := benchXMLSolutionFile(o.out, path)
		var buf bytes.Buffer
		if err := benchfmt.WriteXMLSolution(&buf, in, sol); err == nil {
			err = writeBytesAtomic(file, buf.Bytes())
		}
		if err != nil {
			row.Status, row.Error = "error", err.Error()
			fmt.Fprintf(e.stderr, "bench: %s: %v\n", name, err)
			return row
		}
		row.Solution = file
	}
	fmt.Fprintf(e.stderr, "bench: %s: cost %d without students after %s\n", name, *row.Cost, benchDuration(elapsed))
	return row
}

// benchScoreXML fills validity and cost from the competition's rules and
// compares them with termwright's own Check and Cost.
func benchScoreXML(e *env, row *benchRow, in *benchfmt.XMLInstance, term *timetable.Term, s *timetable.Schedule, sol *benchfmt.XMLSolution, elapsed time.Duration) {
	hard := benchfmt.XMLHardViolations(in, sol)
	checked := timetable.HardViolations(timetable.Check(term, s))
	row.Feasible = hard.Total() == 0 && len(checked) == 0
	switch {
	case hard.Total() == 0 && len(checked) > 0:
		fmt.Fprintf(e.stderr, "bench: %s: Check reports %d hard violations the competition's rules do not: %s\n", row.Instance, len(checked), checked[0].Msg)
	case hard.Total() > 0 && len(checked) == 0:
		fmt.Fprintf(e.stderr, "bench: %s: the competition's rules find %d hard violations Check does not (%+v); please report this\n", row.Instance, hard.Total(), hard)
	}
	total, parts := benchfmt.XMLCost(in, sol) // no students enrolled: the student part is 0
	row.Cost, row.Pattern.Parts, row.Pattern.Hard = &total, &parts, &hard
	if row.Feasible {
		var own int64
		for _, c := range timetable.Cost(term, s, nil).Criteria {
			own += c.Cost
		}
		if own != int64(total) {
			fmt.Fprintf(e.stderr, "bench: %s: termwright's cost %d differs from the competition's %d; please report this\n", row.Instance, own, total)
		}
		ms := elapsed.Milliseconds()
		row.FirstMS, row.BestMS = &ms, &ms
	}
}

// benchReadXMLBest reads the best-known table of ITC-2019 instances.
func benchReadXMLBest(path string) (map[string]benchfmt.XMLBest, error) {
	if path == "" {
		return nil, nil
	}
	data, err := os.ReadFile(path)
	if err != nil {
		return nil, fmt.Errorf("cannot read --best: %w", err)
	}
	return benchfmt.ReadXMLBest(bytes.NewReader(data), filepath.Base(path))
}

// benchXMLRatio sets the reference (the best known's time, room and
// relation parts times the instance's weights) and the ratio
// (cost+1)/(reference+1).
func benchXMLRatio(row *benchRow, b benchfmt.XMLBest, w benchfmt.XMLWeights) {
	ref := b.Reference(w)
	row.BestKnown, row.Pattern.Reference = &b.Best, &ref
	if row.Cost != nil && row.Feasible {
		r := float64(*row.Cost+1) / float64(ref+1)
		row.Ratio = &r
	}
}

// benchXMLWeights reads just the weights of an instance (for the ratio).
func benchXMLWeights(path string) (benchfmt.XMLWeights, error) {
	f, err := os.Open(path)
	if err != nil {
		return benchfmt.XMLWeights{}, err
	}
	defer f.Close()
	in, err := benchfmt.ReadXML(f, filepath.Base(path))
	if err != nil {
		return benchfmt.XMLWeights{}, err
	}
	return in.Weights, nil
}

// benchWriteXMLTable prints the pattern instances' results.
func benchWriteXMLTable(w io.Writer, rows []benchRow, withBest bool) {
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	head := "instance\tsections/rooms/relations\tvalid\tcost\ttime\troom\trelations\tstudents\tfirst valid\tbest at"
	if withBest {
		head += "\treference\tratio"
	}
	fmt.Fprintln(tw, head)
	for _, r := range rows {
		p := r.Pattern
		valid := "no"
		switch {
		case r.Status == "error":
			valid = "error"
		case r.Feasible:
			valid = "yes"
		case r.Status != solver.Satisfiable.String():
			valid = "no (" + r.Status + ")"
		}
		parts := []string{"-", "-", "-"}
		if p.Parts != nil {
			parts = []string{strconv.Itoa(p.Parts.Time), strconv.Itoa(p.Parts.Room), strconv.Itoa(p.Parts.Distribution)}
		}
		line := strings.Join(append([]string{
			r.Instance, fmt.Sprintf("%d/%d/%d", p.Sections, r.Rooms, p.Relations), valid, intOrDash(r.Cost),
		}, append(parts, "not sectioned", msOrDash(r.FirstMS), msOrDash(r.BestMS))...), "\t")
		if withBest {
			ratio := "-"
			if r.Ratio != nil {
				ratio = strconv.FormatFloat(*r.Ratio, 'f', 2, 64)
			}
			line += "\t" + intOrDash(p.Reference) + "\t" + ratio
		}
		fmt.Fprintln(tw, line)
	}
	tw.Flush()
}
