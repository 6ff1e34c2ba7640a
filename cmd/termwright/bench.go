package main

import (
	"bytes"
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"math"
	"os"
	"path/filepath"
	"sort"
	"strconv"
	"strings"
	"text/tabwriter"
	"time"

	"github.com/spf13/cobra"
	"github.com/termwright/termwright/encode"
	"github.com/termwright/termwright/planning"
	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
	"github.com/termwright/termwright/timetable/benchfmt"
)

func init() { register("bench", newBenchCmd) }

// benchOptions are the flags of `termwright bench`.
type benchOptions struct {
	timeLimit time.Duration // per instance, compile and search together
	best      string        // CSV of best-known results; "" = none
	out       string        // folder for <instance>.sol files; "" = none
	json      bool          // print the results as JSON
	jsonOut   string        // also write the JSON results to this file; "" = no
	seed      int64         // engine seed
	threads   int           // parallel searches per instance
	force     bool          // replace existing .sol files
}

// benchSolve is the pipeline under measurement — planning.Plan, the same
// timetabling and student sectioning as solve, cut off by the instance's
// time limit; the schedule carries the sectioned students. Tests replace it.
var benchSolve = func(ctx context.Context, t *timetable.Term, seed int64, threads int) (*encode.OptimizeResult, error) {
	res, err := planning.Plan(ctx, t, planning.Options{OptimizeOptions: encode.OptimizeOptions{Seed: seed}, Threads: threads})
	if res == nil {
		return nil, err
	}
	return res.OptimizeResult, err
}

func newBenchCmd(e *env) *cobra.Command {
	o := &benchOptions{}
	cmd := &cobra.Command{
		Use:   "bench DIR",
		Short: "Measure the solver on a folder of public benchmark instances (.ctt, .xml)",
		Long: "bench runs every .ctt file in DIR (the ITC-2007 curriculum-based course\n" +
			"timetabling format) through the same compile, search, verify and check steps\n" +
			"as a real term, with --time-limit per instance. It prints one row per\n" +
			"instance: size (courses/meetings/rooms/curricula), whether the timetable meets\n" +
			"every hard constraint, its cost under the competition's definition, the lower\n" +
			"bound proved (\"-\" when none), the time to the first feasible timetable and\n" +
			"the time of the best. With --best, each cost is compared with the best known\n" +
			"and the geometric means of cost/best and of (cost+1)/(best+1) are printed.\n" +
			"With --out, each timetable is written as SOLDIR/<instance>.sol in the\n" +
			"competition's solution format (\"course room day period\" per meeting), never\n" +
			"over an existing file unless --force is given. It exits with status 1 when a\n" +
			"file cannot be read or a run fails, and 0 otherwise (instances left without a\n" +
			"timetable show in the table).\n\n" +
			"Every .xml file in DIR (the ITC-2019 course timetabling format) runs the same\n" +
			"way as a term of meeting patterns and room choices, its students sectioned into\n" +
			"the classes of the courses they want; its table gives whether the solution is\n" +
			"valid (\"no (N seating)\" counts broken student rules: a wanted course not\n" +
			"taken as one class of each part of one arrangement with its parents, a class\n" +
			"over its limit), the cost by the competition's definition and its time, room,\n" +
			"relation and student parts (the student part counts clashing pairs of a\n" +
			"student's classes). With --best (a table with instance, best, time, room and\n" +
			"distribution columns, and student_conflicts) each cost is compared with the\n" +
			"best known as (cost+1)/(best+1), and without the student part on both sides\n" +
			"as (cost-students+1)/(reference+1), the reference being the best known's\n" +
			"time, room and relation parts. With --out, each solution, students included,\n" +
			"is written as OUT/<instance>.solution.xml in the competition's format.",
		Args: cobra.ExactArgs(1),
		RunE: e.runner(o, func(cmd *cobra.Command, args []string) error { return runBench(cmd.Context(), e, o, args[0]) }),
	}
	f := cmd.Flags()
	f.DurationVar(&o.timeLimit, "time-limit", 60*time.Second, "time allowed per instance")
	f.StringVar(&o.best, "best", "", "CSV of best-known costs (columns instance,best[,lower_bound,source])")
	f.StringVar(&o.out, "out", "", "folder to write <instance>.sol (or .solution.xml) solutions to")
	f.BoolVar(&o.json, "json", false, "print the results as JSON")
	f.StringVar(&o.jsonOut, "json-out", "", "also write the results as JSON to this file")
	f.Int64Var(&o.seed, "seed", 1, "engine seed (the same seed repeats a run)")
	f.IntVar(&o.threads, "threads", 1, "cores per instance: improvement on two, each further one a differently seeded search")
	f.BoolVar(&o.force, "force", false, "replace existing solution files in --out")
	return cmd
}

// benchRow is the result for one instance; its JSON form is stable.
type benchRow struct {
	Instance string `json:"instance"`
	// Format is "curriculum" for a .ctt instance, "patterns" for an .xml one.
	Format    string `json:"format"`
	Courses   int    `json:"courses"`
	Meetings  int    `json:"meetings"`
	Rooms     int    `json:"rooms"`
	Curricula int    `json:"curricula"`
	// Status is the engine's outcome: "satisfiable", "unsatisfiable",
	// "unknown" (time limit) or "error".
	Status   string             `json:"status"`
	Feasible bool               `json:"feasible"` // a timetable with no hard violation (Check and the competition's rules)
	Cost     *int               `json:"cost"`     // competition cost; null without a timetable
	Parts    *benchfmt.CTTParts `json:"parts,omitempty"`
	Hard     *benchfmt.CTTHard  `json:"hard,omitempty"`
	Bound    *int               `json:"lower_bound"` // proved lower bound; null when none
	// FirstMS and BestMS are wall-clock milliseconds from the start of the
	// instance to the first feasible and to the best timetable.
	FirstMS   *int64   `json:"first_feasible_ms"`
	BestMS    *int64   `json:"best_ms"`
	TotalMS   int64    `json:"total_ms"`
	BestKnown *int     `json:"best_known,omitempty"`
	Ratio     *float64 `json:"ratio,omitempty"` // cost / best known, when the best known is positive
	// Shifted is (cost+1)/(best known+1) on the same rows as Ratio: a
	// measure that an instance near zero cost does not dominate.
	Shifted  *float64 `json:"shifted_ratio,omitempty"`
	Solution string   `json:"solution,omitempty"`
	Error    string   `json:"error,omitempty"`
	// Pattern holds what only pattern instances have; Ratio is then
	// (cost+1)/(reference+1).
	Pattern *benchPatternRow `json:"patterns,omitempty"`
}

// benchReport is the JSON output of bench.
type benchReport struct {
	TimeLimitMS int64      `json:"time_limit_ms"`
	Seed        int64      `json:"seed"`
	Instances   []benchRow `json:"instances"`
	// GeoMeanRatio is the geometric mean of Ratio over the instances that
	// have one; null when none has.
	GeoMeanRatio *float64 `json:"geomean_ratio"`
	RatioCount   int      `json:"ratio_count"` // instances in the geometric mean
	// ShiftedGeoMean is the geometric mean of Shifted over the same
	// instances; omitted when none has one.
	ShiftedGeoMean *float64 `json:"geomean_shifted_ratio,omitempty"`
	// PatternGeoMean is the geometric mean of (cost+1)/(best known+1) over
	// the pattern instances that have one (students included on both
	// sides).
	PatternGeoMean    *float64 `json:"patterns_geomean_ratio,omitempty"`
	PatternRatioCount int      `json:"patterns_ratio_count,omitempty"`
	// PatternGeoMeanNoStudents is the geometric mean of the ratios without
	// the student part, (cost-students+1)/(reference+1).
	PatternGeoMeanNoStudents    *float64 `json:"patterns_geomean_ratio_without_students,omitempty"`
	PatternRatioCountNoStudents int      `json:"patterns_ratio_count_without_students,omitempty"`
}

func runBench(ctx context.Context, e *env, o *benchOptions, dir string) error {
	if ctx == nil {
		ctx = context.Background()
	}
	if o.timeLimit <= 0 {
		return withCode(exitError, "--time-limit must be positive, e.g. 60s")
	}
	files, err := filepath.Glob(filepath.Join(dir, "*.ctt"))
	xmlFiles, xerr := filepath.Glob(filepath.Join(dir, "*.xml"))
	if err != nil || xerr != nil || len(files)+len(xmlFiles) == 0 {
		if _, serr := os.Stat(dir); serr != nil {
			return failf(exitError, "cannot read %s: %w", dir, serr)
		}
		return withCode(exitError, fmt.Sprintf("%s holds no .ctt or .xml files; give the folder of benchmark instances", dir))
	}
	sort.Strings(files)
	sort.Strings(xmlFiles)
	var best map[string]benchfmt.CTTBest
	var xmlBest map[string]benchfmt.XMLBest
	if len(files) > 0 {
		if best, err = benchReadBest(o.best); err != nil {
			return wrapCode(exitError, err)
		}
	}
	if len(xmlFiles) > 0 {
		if xmlBest, err = benchReadXMLBest(o.best); err != nil {
			return wrapCode(exitError, err)
		}
	}
	if err := benchPrepareOut(o, files, xmlFiles); err != nil {
		return wrapCode(exitError, err)
	}
	if o.jsonOut != "" && !o.force {
		if _, err := os.Stat(o.jsonOut); err == nil {
			return withCode(exitError, fmt.Sprintf("%s already exists — choose another --json-out file, or add --force to replace it", o.jsonOut))
		}
	}
	rep := benchReport{TimeLimitMS: o.timeLimit.Milliseconds(), Seed: o.seed}
	failed := false
	for _, path := range files {
		if ctx.Err() != nil {
			fmt.Fprintln(e.stderr, "bench: interrupted; results so far follow")
			break
		}
		row := benchOne(ctx, e, o, path)
		if b, ok := best[row.Instance]; ok {
			row.BestKnown = &b.Best
			if row.Cost != nil && row.Feasible && b.Best > 0 {
				r := float64(*row.Cost) / float64(b.Best)
				sh := float64(*row.Cost+1) / float64(b.Best+1)
				row.Ratio, row.Shifted = &r, &sh
			}
		}
		failed = failed || row.Status == "error"
		rep.Instances = append(rep.Instances, row)
	}
	for _, path := range xmlFiles {
		if ctx.Err() != nil {
			fmt.Fprintln(e.stderr, "bench: interrupted; results so far follow")
			break
		}
		row := benchOneXML(ctx, e, o, path, xmlBest)
		failed = failed || row.Status == "error"
		rep.Instances = append(rep.Instances, row)
	}
	var ctt, pat []benchRow
	for _, r := range rep.Instances {
		if r.Pattern != nil {
			pat = append(pat, r)
		} else {
			ctt = append(ctt, r)
		}
	}
	ratio := func(r benchRow) *float64 { return r.Ratio }
	rep.GeoMeanRatio, rep.RatioCount = benchGeoMean(ctt, ratio)
	rep.ShiftedGeoMean, _ = benchGeoMean(ctt, func(r benchRow) *float64 { return r.Shifted })
	rep.PatternGeoMean, rep.PatternRatioCount = benchGeoMean(pat, ratio)
	rep.PatternGeoMeanNoStudents, rep.PatternRatioCountNoStudents = benchGeoMean(pat, func(r benchRow) *float64 { return r.Pattern.RatioNoStudents })
	var js bytes.Buffer
	enc := json.NewEncoder(&js)
	enc.SetIndent("", "  ")
	if err := enc.Encode(rep); err != nil {
		return err
	}
	if o.jsonOut != "" {
		if err := writeBytesAtomic(o.jsonOut, js.Bytes()); err != nil {
			return wrapCode(exitError, err)
		}
	}
	if o.json {
		if _, err := e.stdout.Write(js.Bytes()); err != nil {
			return err
		}
	} else {
		if len(ctt) > 0 {
			benchWriteTable(e.stdout, benchReport{Instances: ctt, GeoMeanRatio: rep.GeoMeanRatio, RatioCount: rep.RatioCount, ShiftedGeoMean: rep.ShiftedGeoMean}, o.best != "")
		}
		if len(pat) > 0 {
			if len(ctt) > 0 {
				fmt.Fprintln(e.stdout)
			}
			benchWriteXMLTable(e.stdout, pat, o.best != "")
			if o.best != "" {
				benchWriteXMLMeans(e.stdout, rep, len(pat))
			}
		}
	}
	if failed {
		return withCode(exitError, "some instances could not be run; see the error column")
	}
	return nil
}

// benchOne reads, solves, checks and writes one instance.
func benchOne(ctx context.Context, e *env, o *benchOptions, path string) benchRow {
	name := strings.TrimSuffix(filepath.Base(path), ".ctt")
	row := benchRow{Instance: name, Format: "curriculum", Status: "error"}
	term, ok := benchRead(e, &row, path, benchfmt.ReadCTT)
	if !ok {
		return row
	}
	row.Courses, row.Rooms, row.Curricula = len(term.Sections), len(term.Rooms), len(term.Cohorts)
	for _, s := range term.Sections {
		row.Meetings += s.Meetings
	}
	fmt.Fprintf(e.stderr, "bench: %s: %d courses, %d meetings; solving for up to %s\n", name, row.Courses, row.Meetings, o.timeLimit)
	res, elapsed := benchRunTerm(ctx, e, o, &row, term)
	if res == nil {
		return row
	}
	benchScore(e, &row, term, res.Schedule, elapsed)
	benchTimes(&row, res, row.Feasible)
	if o.out != "" {
		file := filepath.Join(o.out, name+".sol")
		if err := benchWriteSolution(file, term, res.Schedule); err != nil {
			row.Status, row.Error = "error", err.Error()
			fmt.Fprintf(e.stderr, "bench: %s: %v\n", name, err)
			return row
		}
		row.Solution = file
	}
	fmt.Fprintf(e.stderr, "bench: %s: cost %d after %s\n", name, *row.Cost, benchDuration(elapsed))
	return row
}

// benchScore fills feasibility, cost and times for a timetable found after
// elapsed; benchTimes then refines the times from the optimiser's history.
func benchScore(e *env, row *benchRow, term *timetable.Term, s *timetable.Schedule, elapsed time.Duration) {
	hard := benchfmt.CTTHardViolations(term, s)
	benchFeasible(e, row, term, s, hard.Total())
	total, parts := benchfmt.CTTCost(term, s)
	row.Cost, row.Parts, row.Hard = &total, &parts, &hard
	benchOwnCost(e, row, term, s, total, elapsed, row.Feasible)
}

// benchTimes fills the lower bound and, for a valid timetable, the times
// of the first and the best timetable from the optimiser's history, when
// it has one (the instance's clock starts before compiling).
func benchTimes(row *benchRow, res *encode.OptimizeResult, valid bool) {
	if n := len(res.History); n > 0 && valid {
		first, best := res.History[0].Elapsed.Milliseconds(), res.History[n-1].Elapsed.Milliseconds()
		row.FirstMS, row.BestMS = &first, &best
	}
	if res.Bound != nil {
		// Every competition criterion is on one level (benchfmt.CTTLevel)
		// and all others weigh 0, so the sum is a bound on the total.
		var b int64
		for _, v := range res.Bound {
			b += v
		}
		bound := int(b)
		row.Bound = &bound
	}
}

// benchReadBest reads the best-known table, or nothing when path is "".
func benchReadBest(path string) (map[string]benchfmt.CTTBest, error) {
	if path == "" {
		return nil, nil
	}
	f, err := os.Open(path)
	if err != nil {
		return nil, fmt.Errorf("cannot read --best: %w", err)
	}
	defer f.Close()
	return benchfmt.ReadCTTBest(f, filepath.Base(path))
}

// benchPrepareOut makes the solution folder and refuses, before any
// instance runs, to replace existing solutions without --force.
func benchPrepareOut(o *benchOptions, files, xmlFiles []string) error {
	if o.out == "" {
		return nil
	}
	if err := os.MkdirAll(o.out, 0o755); err != nil {
		return fmt.Errorf("cannot make the solution folder: %w", err)
	}
	if o.force {
		return nil
	}
	var exist []string
	sols := make([]string, 0, len(files)+len(xmlFiles))
	for _, f := range files {
		sols = append(sols, filepath.Join(o.out, strings.TrimSuffix(filepath.Base(f), ".ctt")+".sol"))
	}
	for _, f := range xmlFiles {
		sols = append(sols, benchXMLSolutionFile(o.out, f))
	}
	for _, sol := range sols {
		if _, err := os.Stat(sol); err == nil {
			exist = append(exist, sol)
		} else if !errors.Is(err, fs.ErrNotExist) {
			return fmt.Errorf("cannot use %s: %w", sol, err)
		}
	}
	if len(exist) > 0 {
		return fmt.Errorf("%s already exists (and %d more) — choose another --out folder, or add --force to replace them", exist[0], len(exist)-1)
	}
	return nil
}

// benchWriteSolution writes the timetable in the competition's format.
func benchWriteSolution(path string, term *timetable.Term, s *timetable.Schedule) error {
	var buf bytes.Buffer
	if err := benchfmt.WriteCTTSolution(&buf, term, s); err != nil {
		return err
	}
	return writeBytesAtomic(path, buf.Bytes())
}

// benchGeoMean is the geometric mean of one ratio of the rows (ratio
// gives it, nil for none) and how many rows have one.
func benchGeoMean(rows []benchRow, ratio func(benchRow) *float64) (*float64, int) {
	sum, n, zero := 0.0, 0, false
	for _, r := range rows {
		v := ratio(r)
		if v == nil {
			continue
		}
		n++
		if *v == 0 {
			zero = true // a zero cost against a positive best makes the mean 0
			continue
		}
		sum += math.Log(*v)
	}
	if n == 0 {
		return nil, 0
	}
	g := 0.0
	if !zero {
		g = math.Exp(sum / float64(n))
	}
	return &g, n
}

// benchWriteTable prints the results as an aligned table.
func benchWriteTable(w io.Writer, rep benchReport, withBest bool) {
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	head := "instance\tcourses/meetings/rooms/curricula\tfeasible\tcost\tlower bound\tfirst feasible\tbest at"
	if withBest {
		head += "\tbest known\tratio"
	}
	fmt.Fprintln(tw, head)
	for _, r := range rep.Instances {
		line := strings.Join([]string{
			r.Instance,
			fmt.Sprintf("%d/%d/%d/%d", r.Courses, r.Meetings, r.Rooms, r.Curricula),
			benchValid(r), intOrDash(r.Cost), intOrDash(r.Bound), msOrDash(r.FirstMS), msOrDash(r.BestMS),
		}, "\t")
		if withBest {
			line += "\t" + intOrDash(r.BestKnown) + "\t" + ratioOrDash(r.Ratio)
		}
		fmt.Fprintln(tw, line)
	}
	tw.Flush()
	if withBest {
		if rep.GeoMeanRatio == nil {
			fmt.Fprintln(w, "geometric mean of cost / best known: - (no instance with a feasible timetable and a positive best known)")
		} else {
			fmt.Fprintf(w, "geometric mean of cost / best known: %.2f over %d of %d instances\n", *rep.GeoMeanRatio, rep.RatioCount, len(rep.Instances))
		}
		if rep.ShiftedGeoMean != nil {
			fmt.Fprintf(w, "geometric mean of (cost+1)/(best known+1): %.2f over the same instances\n", *rep.ShiftedGeoMean)
		}
	}
}

// benchValid is the table's word for whether a row's timetable meets every
// hard constraint: "yes", "no", "no (STATUS)" when the engine found no
// timetable, or "error".
func benchValid(r benchRow) string {
	switch {
	case r.Status == "error":
		return "error"
	case r.Feasible:
		return "yes"
	case r.Status != solver.Satisfiable.String():
		return "no (" + r.Status + ")"
	}
	return "no"
}

// ratioOrDash prints a ratio with two decimals, or "-" when there is none.
func ratioOrDash(v *float64) string {
	if v == nil {
		return "-"
	}
	return strconv.FormatFloat(*v, 'f', 2, 64)
}

func intOrDash(v *int) string {
	if v == nil {
		return "-"
	}
	return strconv.Itoa(*v)
}

func msOrDash(v *int64) string {
	if v == nil {
		return "-"
	}
	return benchDuration(time.Duration(*v) * time.Millisecond)
}

// benchDuration prints a duration in seconds with two decimals ("1.25s").
func benchDuration(d time.Duration) string {
	return strconv.FormatFloat(d.Seconds(), 'f', 2, 64) + "s"
}
