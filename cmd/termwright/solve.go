package main

import (
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"os"
	"time"

	"github.com/spf13/cobra"
	"github.com/termwright/termwright/encode"
	"github.com/termwright/termwright/export"
	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

func init() { register("solve", newSolveCmd) }

// solveOptions are the flags of `termwright solve`.
type solveOptions struct {
	out       string        // timetable workbook to write
	seed      int64         // engine seed
	timeLimit time.Duration // 0 = none
	json      bool          // print the report as JSON
	force     bool          // replace existing outputs
	publish   string        // also publish everything into this directory
	quiet     bool          // no progress display
	keep      string        // earlier timetable to stay close to (minimal change)
	steps     int           // neighbourhood steps at most; 0 = no limit
	threads   int           // parallel searches (encode.OptimizePortfolio)
}

func newSolveCmd(e *env) *cobra.Command {
	o := &solveOptions{}
	cmd := &cobra.Command{
		Use:   "solve TERM -o TIMETABLE.xlsx",
		Short: "Build the best conflict-free timetable for a term and write it as a workbook",
		Long: "solve reads a term workbook (or folder of CSV files), compiles it into a logic\n" +
			"program, searches for a timetable that meets every hard requirement and then for\n" +
			"better and better ones by the preferences of the Weights sheet, checks each\n" +
			"result — with the engine's own verifier, an independent check of the timetable\n" +
			"against the term and an independent evaluation of its cost — and writes the best\n" +
			"timetable workbook (a Timetable sheet, a weekly grid per staff member, room and\n" +
			"cohort, and a Quality sheet). It prints the cost of each preference and a lower\n" +
			"bound: no timetable costs less. A term with errors is refused with the list of\n" +
			"errors. With --publish DIR it also writes every PDF, workbook and calendar file\n" +
			"into DIR (see termwright publish).\n\n" +
			"The search stops when the best timetable is proven, when it stops improving, at\n" +
			"--time-limit, or on Ctrl-C; the best timetable found so far is written. With\n" +
			"--keep LAST.xlsx it re-plans after late edits while moving as few meetings of\n" +
			"LAST as it can, and lists every meeting that moved and who must be told.\n\n" +
			"Exit status: 0 when a timetable was written, 2 when no timetable exists (run\n" +
			"termwright explain TERM to see why), 1 on errors or when the time limit or\n" +
			"Ctrl-C ends the search before the first timetable.",
		Args: cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error { return runSolve(cmd.Context(), e, o, args[0]) },
	}
	f := cmd.Flags()
	f.StringVarP(&o.out, "out", "o", "", "timetable workbook to write (.xlsx; required)")
	f.Int64Var(&o.seed, "seed", 1, "seed of the search; the same seed gives the same timetable")
	f.DurationVar(&o.timeLimit, "time-limit", 60*time.Second, "stop searching after this long (0 for no limit)")
	f.BoolVar(&o.json, "json", false, "print the report as JSON")
	f.BoolVar(&o.force, "force", false, "replace an existing output file (and an earlier publication)")
	f.StringVar(&o.publish, "publish", "", "also publish PDFs, workbook and calendars into this directory")
	f.BoolVar(&o.quiet, "quiet", false, "show no progress while searching")
	f.StringVar(&o.keep, "keep", "", "earlier timetable (.xlsx or .csv) to change as little as possible")
	f.IntVar(&o.threads, "threads", 1, "run this many differently seeded searches in parallel and keep the best timetable (more memory)")
	f.IntVar(&o.steps, "steps", 0, "stop improving after this many neighbourhood steps (0 for no limit); with --time-limit 0 the result depends only on the seed")
	return cmd
}

// solveReport is the stable JSON form of a solve.
type solveReport struct {
	Term      string        `json:"term"`
	Status    string        `json:"status"` // "solved", "infeasible" or "unknown"
	Output    string        `json:"output,omitempty"`
	Published string        `json:"published,omitempty"`
	Sections  int           `json:"sections"`
	Meetings  int           `json:"meetings"` // meetings placed
	Program   solveProgram  `json:"program"`
	Engine    solveEngine   `json:"engine"`
	Rounds    int           `json:"rounds"`
	HallCuts  int           `json:"room_families_added"`
	Nogoods   int           `json:"room_conflicts_forbidden"`
	TimingsMS solveTimingMS `json:"timings_ms"`
	Quality   *solveQuality `json:"quality,omitempty"`
	Caution   string        `json:"caution,omitempty"`
}

type solveProgram struct {
	Atoms        int `json:"atoms"`
	StartAtoms   int `json:"start_atoms"`
	Rules        int `json:"rules"`
	Choices      int `json:"choices"`
	Bounds       int `json:"bounds"`
	BoundLits    int `json:"bound_literals"`
	Groups       int `json:"requirement_groups"`
	RoomFamilies int `json:"room_families"`
}

type solveEngine struct {
	Conflicts    int64 `json:"conflicts"`
	Decisions    int64 `json:"decisions"`
	Propagations int64 `json:"propagations"`
	Restarts     int64 `json:"restarts"`
}

type solveTimingMS struct {
	Compile float64 `json:"compile"`
	Search  float64 `json:"search"`
	Verify  float64 `json:"verify"`
	Decode  float64 `json:"decode"`
	Check   float64 `json:"check"`
	Write   float64 `json:"write"`
}

func runSolve(ctx context.Context, e *env, o *solveOptions, termPath string) error {
	if o.out == "" {
		return withCode(exitError, "solve needs an output file: add -o TIMETABLE.xlsx")
	}
	if err := refuseOutput(o.out, termPath, o.force); err != nil {
		return err
	}
	if o.publish != "" {
		if err := refusePublishDir(o.publish, o.force); err != nil {
			return err
		}
	}
	term, err := loadTerm(e, termPath)
	if err != nil {
		return err
	}
	kept, err := solveReadKept(e, o.keep, term)
	if err != nil {
		return err
	}
	if ctx == nil {
		ctx = context.Background()
	}
	if o.timeLimit > 0 {
		var cancel context.CancelFunc
		ctx, cancel = context.WithTimeout(ctx, o.timeLimit)
		defer cancel()
	}
	progress := newSolveProgress(e, o.quiet || o.json)
	res, err := encode.OptimizePortfolio(ctx, term, encode.OptimizeOptions{Seed: o.seed, Keep: kept, MaxSteps: o.steps, Progress: progress.show}, max(o.threads, 1))
	progress.done()
	if err != nil {
		return withCode(exitError, err.Error())
	}
	rep := solveBuildReport(term, &res.Result)
	if res.Status == solver.Satisfiable {
		rep.Quality = solveBuildQuality(term, res)
	}
	switch res.Status {
	case solver.Unsatisfiable:
		rep.Status = "infeasible"
		if err := solvePrint(e, o, rep); err != nil {
			return err
		}
		return withCode(exitNone, fmt.Sprintf("no timetable exists for %s: its hard requirements contradict each other — run `termwright explain %s` to see why", termPath, termPath))
	case solver.Unknown:
		rep.Status = "unknown"
		if err := solvePrint(e, o, rep); err != nil {
			return err
		}
		if res.Incomplete && ctx.Err() == nil {
			return withCode(exitError, "no timetable was found, but the search could not rule one out (a room assignment search ran out of budget); nothing was written")
		}
		if ctx.Err() != nil && !errors.Is(ctx.Err(), context.DeadlineExceeded) {
			return withCode(exitError, "interrupted before a timetable was found; nothing was written")
		}
		return withCode(exitError, fmt.Sprintf("no timetable found within %v; nothing was written — allow more time with --time-limit", o.timeLimit))
	}
	t0 := time.Now()
	err = writeFileAtomic(o.out, func(w io.Writer) error {
		return export.WriteTimetableWorkbook(w, term, res.Schedule, export.Options{Generated: e.now(), Extra: solveQualitySheets(term, res)})
	})
	if err != nil {
		return withCode(exitError, err.Error())
	}
	rep.Status, rep.Output = "solved", o.out
	if o.publish != "" {
		if _, err := export.Publish(o.publish, term, res.Schedule, export.Options{Generated: e.now(), Force: o.force, Extra: solveQualitySheets(term, res)}); err != nil {
			return withCode(exitError, fmt.Sprintf("the timetable was written to %s, but publishing failed: %v", o.out, err))
		}
		rep.Published = o.publish
	}
	rep.TimingsMS.Write = ms(time.Since(t0))
	return solvePrint(e, o, rep)
}

// refusePublishDir refuses a non-empty publication directory without
// --force (export.Publish decides what --force may replace).
func refusePublishDir(dir string, force bool) error {
	entries, err := os.ReadDir(dir)
	if err == nil && len(entries) > 0 && !force {
		return withCode(exitError, fmt.Sprintf("%s is not empty — choose a new folder, or add --force to replace an earlier publication", dir))
	}
	if err == nil || errors.Is(err, os.ErrNotExist) {
		return nil
	}
	return withCode(exitError, fmt.Sprintf("cannot use %s: %v", dir, err))
}

func ms(d time.Duration) float64 { return float64(d.Microseconds()) / 1000 }

func solveBuildReport(t *timetable.Term, res *encode.Result) solveReport {
	st := res.Size
	rep := solveReport{
		Term:     t.Name,
		Sections: len(t.Sections),
		Program: solveProgram{Atoms: st.Atoms, StartAtoms: st.StartAtoms, Rules: st.Rules, Choices: st.Choices,
			Bounds: st.Bounds, BoundLits: st.BoundLits, Groups: st.Groups, RoomFamilies: st.RoomFamilies},
		Engine: solveEngine{Conflicts: res.Engine.Conflicts, Decisions: res.Engine.Decisions,
			Propagations: res.Engine.Propagations, Restarts: res.Engine.Restarts},
		Rounds: res.Rounds, HallCuts: res.HallCuts, Nogoods: res.Nogoods,
		TimingsMS: solveTimingMS{Compile: ms(res.Timings.Compile), Search: ms(res.Timings.Solve),
			Verify: ms(res.Timings.Verify), Decode: ms(res.Timings.Decode), Check: ms(res.Timings.Check)},
		Caution: verifyCaution,
	}
	if res.Schedule != nil {
		rep.Meetings = len(res.Schedule.Placements)
	}
	return rep
}

func solvePrint(e *env, o *solveOptions, rep solveReport) error {
	if o.json {
		enc := json.NewEncoder(e.stdout)
		enc.SetIndent("", "  ")
		return enc.Encode(rep)
	}
	w := e.stdout
	name := rep.Term
	if name == "" {
		name = "the term"
	}
	switch rep.Status {
	case "solved":
		fmt.Fprintf(w, "Solved %s: %s, %s placed; timetable written to %s.\n", name,
			checkCount(rep.Sections, "section"), checkCount(rep.Meetings, "meeting"), rep.Output)
		if rep.Published != "" {
			fmt.Fprintf(w, "Published every schedule to %s.\n", rep.Published)
		}
		if rep.Quality != nil {
			solvePrintQuality(w, rep.Quality)
		}
	case "infeasible":
		fmt.Fprintf(w, "No timetable exists for %s (%s).\n", name, checkCount(rep.Sections, "section"))
	default:
		fmt.Fprintf(w, "No timetable found for %s in the time allowed.\n", name)
	}
	p := rep.Program
	fmt.Fprintf(w, "Program: %d atoms (%d start), %d rules, %d choices, %d bounds (%d literals), %s, %d room famil%s.\n",
		p.Atoms, p.StartAtoms, p.Rules, p.Choices, p.Bounds, p.BoundLits,
		checkCount(p.Groups, "requirement group"), p.RoomFamilies, plural(p.RoomFamilies, "y", "ies"))
	fmt.Fprintf(w, "Search: %s, %d decisions, %s", checkCount(int(rep.Engine.Conflicts), "conflict"), rep.Engine.Decisions, checkCount(rep.Rounds, "round"))
	if rep.HallCuts > 0 || rep.Nogoods > 0 {
		fmt.Fprintf(w, " (%d room famil%s added, %s forbidden)", rep.HallCuts, plural(rep.HallCuts, "y", "ies"), checkCount(rep.Nogoods, "room conflict"))
	}
	fmt.Fprintln(w, ".")
	tm := rep.TimingsMS
	fmt.Fprintf(w, "Time: compile %s, search %s, verify %s, decode %s, check %s, write %s.\n",
		msText(tm.Compile), msText(tm.Search), msText(tm.Verify), msText(tm.Decode), msText(tm.Check), msText(tm.Write))
	if rep.Status == "solved" {
		fmt.Fprintln(w, "Both checks passed: the engine's verifier and the independent timetable check (and the engine's cost agrees with the independent cost evaluation).")
		fmt.Fprintln(w, rep.Caution)
	}
	return nil
}

func msText(v float64) string {
	switch {
	case v >= 1000:
		return fmt.Sprintf("%.1f s", v/1000)
	case v >= 10:
		return fmt.Sprintf("%.0f ms", v)
	}
	return fmt.Sprintf("%.1f ms", v)
}

func plural(n int, one, many string) string {
	if n == 1 {
		return one
	}
	return many
}
