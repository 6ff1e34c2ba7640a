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

	"github.com/termwright/termwright/timetable"
	"github.com/termwright/termwright/timetable/benchfmt"
)

// The ITC-2019 instances (*.xml) of a bench folder. They map to terms of
// pattern sections with courses and students (benchfmt.XMLInstance.Term)
// and go through the same planning as a real term (planning.Plan: the
// timetable and the students' sections); the solution is scored by the
// competition's rules, students included, and compared with the best
// known both in full and without the student part.

// benchPatternRow is the part of a result row only pattern instances have.
type benchPatternRow struct {
	Sections  int                `json:"sections"`
	Relations int                `json:"relations"` // constraints between sections in the instance
	Students  int                `json:"students"`  // students wanting courses
	Parts     *benchfmt.XMLParts `json:"cost_parts,omitempty"`
	Hard      *benchfmt.XMLHard  `json:"hard_counts,omitempty"`
	Reference *int               `json:"reference,omitempty"` // best known without the student part
	// TimetableValid says every hard rule but the student rules holds.
	TimetableValid bool `json:"timetable_valid"`
	// RatioNoStudents is (cost-students+1)/(reference+1), both sides
	// without the weighted student part, for a valid timetable.
	RatioNoStudents *float64 `json:"ratio_without_students,omitempty"`
}

// benchXMLName is the instance name of an .xml file.
func benchXMLName(path string) string { return strings.TrimSuffix(filepath.Base(path), ".xml") }

// benchXMLSolutionFile is where --out writes an instance's timetable.
func benchXMLSolutionFile(out, path string) string {
	return filepath.Join(out, benchXMLName(path)+".solution.xml")
}

// benchOneXML reads, solves, checks and writes one ITC-2019 instance.
// With a best-known record it also sets the reference and the ratio.
func benchOneXML(ctx context.Context, e *env, o *benchOptions, path string, best map[string]benchfmt.XMLBest) benchRow {
	row, w := benchRunXML(ctx, e, o, path)
	if b, ok := best[row.Instance]; ok && w != nil {
		benchXMLRatio(&row, b, *w)
	}
	return row
}

// benchRunXML runs one instance and gives its weights (nil when the file
// could not be read).
func benchRunXML(ctx context.Context, e *env, o *benchOptions, path string) (benchRow, *benchfmt.XMLWeights) {
	name := benchXMLName(path)
	row := benchRow{Instance: name, Format: "patterns", Status: "error", Pattern: &benchPatternRow{}}
	in, ok := benchRead(e, &row, path, benchfmt.ReadXML)
	if !ok {
		return row, nil
	}
	term := in.Term()
	w := &in.Weights
	row.Rooms = len(term.Rooms)
	row.Pattern.Sections, row.Pattern.Relations, row.Pattern.Students = len(term.Sections), len(in.Distributions), len(in.Students)
	fmt.Fprintf(e.stderr, "bench: %s: %d sections, %d rooms, %d relations; solving for up to %s\n", name, len(term.Sections), len(term.Rooms), len(term.Relations), o.timeLimit)
	res, elapsed := benchRunTerm(ctx, e, o, &row, term)
	if res == nil {
		return row, w
	}
	sol, err := benchfmt.XMLSolutionOf(in, res.Schedule, benchfmt.XMLRunInfo{
		Runtime: elapsed.Seconds(), Cores: max(o.threads, 1), Technique: "stable models with optimisation", Author: "termwright",
	})
	if err != nil {
		row.Status, row.Error = "error", err.Error()
		fmt.Fprintf(e.stderr, "bench: %s: the timetable does not fit the instance: %v\n", name, err)
		return row, w
	}
	benchScoreXML(e, &row, in, term, res.Schedule, sol, elapsed)
	benchTimes(&row, res, row.Pattern.TimetableValid)
	if o.out != "" {
		file := benchXMLSolutionFile(o.out, path)
		var buf bytes.Buffer
		err := benchfmt.WriteXMLSolution(&buf, in, sol)
		if err == nil {
			err = writeBytesAtomic(file, buf.Bytes())
		}
		if err != nil {
			row.Status, row.Error = "error", err.Error()
			fmt.Fprintf(e.stderr, "bench: %s: %v\n", name, err)
			return row, w
		}
		row.Solution = file
	}
	fmt.Fprintf(e.stderr, "bench: %s: cost %d (student part %d, %d students seated) after %s\n", name, *row.Cost, row.Pattern.Parts.Student, benchSeated(res.Schedule), benchDuration(elapsed))
	return row, w
}

// benchSeated is the number of distinct students s seats.
func benchSeated(s *timetable.Schedule) int {
	seen := map[string]bool{}
	for _, e := range s.Enrolments {
		seen[e.Student] = true
	}
	return len(seen)
}

// benchScoreXML fills validity and cost from the competition's rules and
// compares them with termwright's own Check and Cost.
func benchScoreXML(e *env, row *benchRow, in *benchfmt.XMLInstance, term *timetable.Term, s *timetable.Schedule, sol *benchfmt.XMLSolution, elapsed time.Duration) {
	hard := benchfmt.XMLHardViolations(in, sol)
	checked := benchFeasible(e, row, term, s, hard.Total())
	if only := hard.Total() - hard.Sectioning; only > 0 && checked == 0 {
		fmt.Fprintf(e.stderr, "bench: %s: the competition's rules find %d hard violations Check does not (%d unplaced, %d at unlisted times or rooms, %d room clashes, %d in unavailable rooms, %d relations); please report this\n",
			row.Instance, only, hard.Unplaced, hard.NotListed, hard.RoomClashes, hard.RoomUnavailable, hard.Distributions)
	}
	if hard.Sectioning > 0 {
		// Our unplaced requests are a cost, the competition's a rule: say
		// which side sees the broken seating.
		fmt.Fprintf(e.stderr, "bench: %s: %d student rules broken (students not seated in a wanted course, or classes over their limit); Check finds %d hard violations\n", row.Instance, hard.Sectioning, checked)
	}
	total, parts := benchfmt.XMLCost(in, sol)
	row.Cost, row.Pattern.Parts, row.Pattern.Hard = &total, &parts, &hard
	row.Pattern.TimetableValid = hard.Total()-hard.Sectioning == 0
	benchOwnCost(e, row, term, s, total, elapsed, row.Pattern.TimetableValid)
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

// benchXMLRatio sets the best known and the ratio (cost+1)/(best+1) for a
// valid solution, and the reference (the best known's time, room and
// relation parts times the instance's weights) and the ratio without the
// student part (cost-students+1)/(reference+1) for a valid timetable.
func benchXMLRatio(row *benchRow, b benchfmt.XMLBest, w benchfmt.XMLWeights) {
	ref := b.Reference(w)
	row.BestKnown, row.Pattern.Reference = &b.Best, &ref
	if row.Cost == nil || row.Pattern.Parts == nil {
		return
	}
	if row.Feasible {
		r := float64(*row.Cost+1) / float64(b.Best+1)
		row.Ratio = &r
	}
	if row.Pattern.TimetableValid {
		r := float64(*row.Cost-row.Pattern.Parts.Student*w.Student+1) / float64(ref+1)
		row.Pattern.RatioNoStudents = &r
	}
}

// benchXMLValid is the valid column: benchValid's word, with the number of
// broken student rules when there are any.
func benchXMLValid(r benchRow) string {
	v := benchValid(r)
	if h := r.Pattern.Hard; h != nil && h.Sectioning > 0 {
		v += fmt.Sprintf(" (%d seating)", h.Sectioning)
	}
	return v
}

// benchWriteXMLTable prints the pattern instances' results: cost is the
// competition's total, students included; time, room, relations and
// students are its unweighted parts ("-" for students when the instance
// has none).
func benchWriteXMLTable(w io.Writer, rows []benchRow, withBest bool) {
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	head := "instance\tsections/rooms/relations/students\tvalid\tcost\ttime\troom\trelations\tstudents\tfirst valid\tbest at"
	if withBest {
		head += "\tbest known\tratio\tratio w/o students"
	}
	fmt.Fprintln(tw, head)
	for _, r := range rows {
		p := r.Pattern
		parts := []string{"-", "-", "-", "-"}
		if p.Parts != nil {
			parts = []string{strconv.Itoa(p.Parts.Time), strconv.Itoa(p.Parts.Room), strconv.Itoa(p.Parts.Distribution), strconv.Itoa(p.Parts.Student)}
			if p.Students == 0 {
				parts[3] = "-"
			}
		}
		line := strings.Join(append([]string{
			r.Instance, fmt.Sprintf("%d/%d/%d/%d", p.Sections, r.Rooms, p.Relations, p.Students), benchXMLValid(r), intOrDash(r.Cost),
		}, append(parts, msOrDash(r.FirstMS), msOrDash(r.BestMS))...), "\t")
		if withBest {
			line += "\t" + intOrDash(r.BestKnown) + "\t" + ratioOrDash(r.Ratio) + "\t" + ratioOrDash(p.RatioNoStudents)
		}
		fmt.Fprintln(tw, line)
	}
	tw.Flush()
}

// benchWriteXMLMeans prints the geometric means of both ratios over the n
// pattern instances.
func benchWriteXMLMeans(w io.Writer, rep benchReport, n int) {
	if rep.PatternGeoMean == nil {
		fmt.Fprintln(w, "geometric mean of (cost+1)/(best known+1): - (no instance with a valid solution and a best known)")
	} else {
		fmt.Fprintf(w, "geometric mean of (cost+1)/(best known+1): %.2f over %d of %d instances\n", *rep.PatternGeoMean, rep.PatternRatioCount, n)
	}
	if rep.PatternGeoMeanNoStudents == nil {
		fmt.Fprintln(w, "geometric mean without students, (cost-students+1)/(reference+1): - (no instance with a valid timetable and a best known)")
	} else {
		fmt.Fprintf(w, "geometric mean without students, (cost-students+1)/(reference+1): %.2f over %d of %d instances\n", *rep.PatternGeoMeanNoStudents, rep.PatternRatioCountNoStudents, n)
	}
}
