package main

import (
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"time"

	"github.com/spf13/cobra"
	"github.com/termwright/termwright/encode"
	"github.com/termwright/termwright/export"
	"github.com/termwright/termwright/planning"
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
	students  bool          // with publish: also a grid PDF and a calendar per student (as publish --students)
	quiet     bool          // no progress display
	keep      string        // earlier timetable to stay close to (minimal change)
	steps     int           // neighbourhood steps at most; 0 = no limit
	threads   int           // parallel searches (planning.Options.Threads)
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
			"bound: no timetable costs less. When students request courses (the Course\n" +
			"requests sheet), it also seats them in sections, writes the Class lists and\n" +
			"Sectioning sheets, and prints the requests not met with their reasons, the\n" +
			"full sections and the students with clashes. A term with errors is refused\n" +
			"with the list of errors. With --publish DIR it also writes every PDF, workbook\n" +
			"and calendar file into DIR (see termwright publish).\n\n" +
			"The search stops when the best timetable is proven, when it stops improving, at\n" +
			"--time-limit, or on Ctrl-C, SIGTERM or SIGHUP (a second one stops at once); the\n" +
			"best timetable found so far is checked and written. -o is checked before the\n" +
			"search (a new .xlsx name in a folder you may write to, outside the term's own\n" +
			"files; --force replaces only a regular file) and created at the end only if it\n" +
			"still does not exist (otherwise the timetable goes to NAME-2.xlsx and solve says\n" +
			"so). Progress goes to standard error: one line redrawn on a terminal, a plain\n" +
			"line every few seconds otherwise. With --keep LAST.xlsx it re-plans after late\n" +
			"edits while moving as few meetings of LAST as it can, and lists every meeting\n" +
			"that moved and who must be told; students stay in LAST's sections where they\n" +
			"can, and every student who changes section is listed (and on a Moved students\n" +
			"sheet).\n\n" +
			"Exit status: 0 when a timetable was written, 2 when no timetable exists (found\n" +
			"by the search, or at once by the term check's counting; run termwright explain\n" +
			"TERM to see why), 1 on errors or when the time limit or a stop signal ends the\n" +
			"search before the first timetable.",
		Args: cobra.ExactArgs(1),
		RunE: e.runner(o, func(cmd *cobra.Command, args []string) error { return runSolve(cmd.Context(), e, o, args[0]) }),
	}
	f := cmd.Flags()
	f.StringVarP(&o.out, "out", "o", "", "timetable workbook to write (.xlsx; required)")
	f.Int64Var(&o.seed, "seed", 1, "seed of the search; the same seed gives the same timetable")
	f.DurationVar(&o.timeLimit, "time-limit", 60*time.Second, "stop searching after this long (0 for no limit)")
	f.BoolVar(&o.json, "json", false, "print the report as JSON")
	f.BoolVar(&o.force, "force", false, "replace an existing output file (and an earlier publication)")
	f.StringVar(&o.publish, "publish", "", "also publish PDFs, workbook and calendars into this directory")
	f.BoolVar(&o.students, "students", false, "with --publish, also write a weekly grid PDF and a calendar per student")
	f.BoolVar(&o.quiet, "quiet", false, "show no progress while searching")
	f.StringVar(&o.keep, "keep", "", "earlier timetable (.xlsx or .csv) to change as little as possible")
	f.IntVar(&o.threads, "threads", 1, "use this many cores: improvement on two, each further one a differently seeded search; the best timetable is kept (more memory)")
	f.IntVar(&o.steps, "steps", 0, "stop improving after this many neighbourhood steps (0 for no limit); with --time-limit 0 the result depends only on the seed")
	addColumnsFlag(cmd, e)
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
	// Sectioning summarises where the requesting students were seated
	// (terms with course requests only).
	Sectioning *solveSectioning `json:"sectioning,omitempty"`
	Caution    string           `json:"caution,omitempty"`
	// Reasons are the counting proofs that no timetable exists, when the
	// term check finds them before any search.
	Reasons []checkProblem `json:"reasons,omitempty"`
	// Interrupted names the signal that ended the search early
	// ("Ctrl-C", "SIGTERM", "SIGHUP").
	Interrupted string `json:"interrupted,omitempty"`
	TimeLimit   string `json:"time_limit,omitempty"` // with status "unknown"
	Threads     int    `json:"threads,omitempty"`
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

// solveTimingMS are the times of a solve. Read, SearchWall and Write are
// wall-clock times one after the other, and Total is all of them (with the
// checks of the outputs); Compile, Search, Verify, Decode and Check are the
// engine phases inside SearchWall as encode measures them: the verify,
// decode and check of each timetable found run inside the engine's search
// callback (so they are part of Search too), and with several threads
// every phase is summed over the parallel searches.
type solveTimingMS struct {
	Compile    float64 `json:"compile"`
	Search     float64 `json:"search"`
	Verify     float64 `json:"verify"`
	Decode     float64 `json:"decode"`
	Check      float64 `json:"check"`
	Write      float64 `json:"write"`
	Read       float64 `json:"read"`        // reading and checking the term (and --keep)
	SearchWall float64 `json:"search_wall"` // wall time of compile, search and checks
	Total      float64 `json:"total"`       // wall time of the whole command
}

func runSolve(ctx context.Context, e *env, o *solveOptions, termPath string) error {
	if o.out == "" {
		return withCode(exitError, "solve needs an output file: add -o TIMETABLE.xlsx")
	}
	if ctx == nil {
		ctx = context.Background()
	}
	began := time.Now()
	if err := checkOutput(o.out, o.force, ".xlsx", termPath, o.keep); err != nil {
		return err
	}
	if o.students && o.publish == "" {
		return withCode(exitError, "--students writes per-student files into the publication: give --publish DIR too")
	}
	if o.publish != "" {
		if err := checkPublishDir(o.publish, o.force, termPath); err != nil {
			return err
		}
	}
	term, proofs, err := solveLoad(e, termPath)
	if err != nil {
		return err
	}
	if len(proofs) > 0 {
		return solveImpossible(e, o, term, termPath, proofs)
	}
	kept, err := solveReadKept(e, o.keep, term)
	if err != nil {
		return err
	}
	read := time.Since(began)
	sctx := ctx
	if o.timeLimit > 0 {
		var cancel context.CancelFunc
		sctx, cancel = context.WithTimeout(ctx, o.timeLimit)
		defer cancel()
	}
	progress := newSolveProgress(e, o.quiet || o.json, term)
	t0 := time.Now()
	res, err := planning.Plan(sctx, term, planning.Options{
		OptimizeOptions: encode.OptimizeOptions{Seed: o.seed, Keep: kept, MaxSteps: o.steps, Progress: progress.show},
		Threads:         max(o.threads, 1)})
	searched := time.Since(t0)
	progress.done()
	if err != nil {
		return wrapCode(exitError, err)
	}
	rep := solveBuildReport(term, &res.Result)
	rep.TimingsMS.Read, rep.TimingsMS.SearchWall = ms(read), ms(searched)
	rep.Threads = max(o.threads, 1)
	if sig := interruptedBy(ctx); sig != "" {
		rep.Interrupted = sig
	}
	if res.Status == solver.Satisfiable {
		rep.Quality = solveBuildQuality(term, res.OptimizeResult)
		rep.Sectioning = solveBuildSectioning(term, res)
		if rep.Interrupted != "" {
			rep.Quality.Stopped = "interrupted (" + rep.Interrupted + ")"
		}
	}
	finish := func() {
		rep.TimingsMS.Total = ms(time.Since(began))
	}
	switch res.Status {
	case solver.Unsatisfiable:
		rep.Status = "infeasible"
		finish()
		if err := solvePrint(e, o, rep); err != nil {
			return err
		}
		return withCode(exitNone, fmt.Sprintf("no timetable exists for %s: its hard requirements contradict each other — run `termwright explain %s` to see why", termPath, termPath))
	case solver.Unknown:
		rep.Status = "unknown"
		rep.TimeLimit = o.timeLimit.String()
		finish()
		if err := solvePrint(e, o, rep); err != nil {
			return err
		}
		switch {
		case rep.Interrupted != "":
			return withCode(exitError, fmt.Sprintf("the search was interrupted (%s) before the first timetable was found; nothing was written", rep.Interrupted))
		case res.Incomplete && sctx.Err() == nil:
			return withCode(exitError, "no timetable was found, but the search could not rule one out (a room assignment search ran out of budget); nothing was written")
		}
		return withCode(exitError, fmt.Sprintf("no timetable found within %v; nothing was written — allow more time with --time-limit", o.timeLimit))
	}
	tw := time.Now()
	extra, reasons := solveQualitySheets(term, res.OptimizeResult), solveReasons(res)
	var findings []export.Finding
	if rep.Sectioning != nil {
		findings = rep.Sectioning.Findings
		if res.Kept {
			extra = append(extra, solveMovedStudentsSheet(res.Sectioning))
		}
	}
	written, werr := writeOutput(o.out, o.force, func(w io.Writer) error {
		return export.WriteTimetableWorkbook(w, term, res.Schedule, export.Options{Generated: e.now(), Extra: extra, Reasons: reasons, Findings: findings})
	})
	if written == "" {
		return wrapCode(exitError, werr)
	}
	rep.Status, rep.Output = "solved", written
	if o.publish != "" && werr == nil {
		if _, err := export.Publish(o.publish, term, res.Schedule, export.Options{Generated: e.now(), Force: o.force, Students: o.students, Extra: extra, Reasons: reasons, Findings: findings}); err != nil {
			return failf(exitError, "the timetable was written to %s, but publishing failed: %w", written, err)
		}
		rep.Published = o.publish
	}
	rep.TimingsMS.Write = ms(time.Since(tw))
	finish()
	if err := solvePrint(e, o, rep); err != nil {
		return err
	}
	if werr != nil {
		return wrapCode(exitError, werr)
	}
	return nil
}

// sameProblem says two problems are one: the reader's positions have
// column letters, and for whole-sheet problems sheet names, that
// Validate's lack, so the message and row decide, and the sheet where both
// know it.
func sameProblem(a, b timetable.Problem) bool {
	sheet := a.Pos.Sheet == b.Pos.Sheet || a.Pos.Sheet == "" || b.Pos.Sheet == ""
	return sheet && a.Pos.Row == b.Pos.Row && a.Msg == b.Msg
}

// solveLoad reads the term like loadTerm, except that a term whose only
// errors are counting proofs that no timetable exists
// (timetable.Impossible) is returned with those errors: that is an answer
// (exit 2), not a mistake in the data.
func solveLoad(e *env, path string) (*timetable.Term, timetable.Problems, error) {
	term, problems, err := readTerm(e, path)
	if err != nil {
		return nil, nil, wrapCode(exitError, err)
	}
	errs := problems.Errors()
	for _, p := range problems.Warnings() {
		fmt.Fprintln(e.stderr, p.String())
	}
	if len(errs) == 0 {
		return term, nil, nil
	}
	proofs := timetable.Impossible(term)
	other := 0
	for _, p := range errs {
		if !containsProblem(proofs, p, sameProblem) {
			other++
		}
	}
	if other == 0 {
		return term, errs, nil
	}
	for _, p := range errs {
		fmt.Fprintln(e.stderr, p.String())
	}
	return nil, nil, withCode(exitError, fmt.Sprintf("%s has %s — fix them first (termwright check %s lists them)",
		path, checkCount(len(errs), "error"), path))
}

// solveImpossible reports a term that the counting checks prove has no
// timetable: the reasons, and where to look next.
func solveImpossible(e *env, o *solveOptions, t *timetable.Term, path string, proofs timetable.Problems) error {
	rep := solveReport{Term: t.Name, Status: "infeasible", Sections: len(t.Sections), Reasons: []checkProblem{}}
	for _, p := range proofs {
		rep.Reasons = append(rep.Reasons, checkProblem{Where: p.Pos.String(), Severity: p.Severity.String(), Message: p.Msg})
	}
	if o.json {
		if err := solvePrint(e, o, rep); err != nil {
			return err
		}
	} else {
		name := t.Name
		if name == "" {
			name = "the term"
		}
		fmt.Fprintf(e.stdout, "No timetable exists for %s (%s): counting alone proves it, before any search:\n", name, checkCount(rep.Sections, "section"))
		for _, p := range proofs {
			fmt.Fprintln(e.stdout, "  - "+p.String())
		}
	}
	return withCode(exitNone, fmt.Sprintf("no timetable exists for %s — run `termwright explain %s` to see the requirements that cannot all hold and what would have to give", path, path))
}

// checkPublishDir refuses, before the search, a publication folder that
// cannot be used: a non-empty one without --force (export.Publish decides
// what --force may replace), the input's own folder or one inside it, and
// one whose parent folder termwright cannot create in.
func checkPublishDir(dir string, force bool, input string) error {
	if err := refuseInsideInput(filepath.Join(dir, export.ManifestName), input); err != nil {
		return err
	}
	entries, err := os.ReadDir(dir)
	switch {
	case err == nil && len(entries) > 0 && !force:
		return withCode(exitError, fmt.Sprintf("%s is not empty — choose a new folder, or add --force to replace an earlier publication", dir))
	case err != nil && !errors.Is(err, fs.ErrNotExist):
		return failf(exitError, "cannot use %s: %w", dir, err)
	}
	return probeFolder(filepath.Dir(filepath.Clean(dir)))
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
		if rep.Sectioning != nil {
			solvePrintSectioning(w, rep.Sectioning)
		}
	case "infeasible":
		fmt.Fprintf(w, "No timetable exists for %s (%s).\n", name, checkCount(rep.Sections, "section"))
		if rep.Reasons != nil {
			return nil // solveImpossible prints the reasons; nothing was compiled
		}
	case "unknown":
		if rep.Interrupted != "" {
			fmt.Fprintf(w, "No timetable found for %s: the search was interrupted (%s) before the first timetable.\n", name, rep.Interrupted)
		} else {
			fmt.Fprintf(w, "No timetable found for %s in the time allowed (%s).\n", name, rep.TimeLimit)
		}
	}
	if rep.Status == "solved" && rep.Interrupted != "" {
		fmt.Fprintf(w, "The search was interrupted (%s); the best timetable found until then was checked and written.\n", rep.Interrupted)
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
	solvePrintTimes(w, rep)
	if rep.Status == "solved" {
		fmt.Fprintln(w, "Both checks passed: the engine's verifier and the independent timetable check (and the engine's cost agrees with the independent cost evaluation).")
		fmt.Fprintln(w, rep.Caution)
	}
	return nil
}

// solvePrintTimes prints the wall times, which add up to the whole, and
// then the engine's phases inside the search, which overlap.
func solvePrintTimes(w io.Writer, rep solveReport) {
	tm := rep.TimingsMS
	fmt.Fprintf(w, "Time: %s in all: read and check the term %s, compile and search %s, write %s.\n",
		msText(tm.Total), msText(tm.Read), msText(tm.SearchWall), msText(tm.Write))
	summed := ""
	if rep.Threads > 1 {
		summed = fmt.Sprintf("; each is summed over the searches the %d threads ran", rep.Threads)
	}
	fmt.Fprintf(w, "  Inside compile and search: compile %s, engine %s, verify %s, decode and rooms %s, check %s (these overlap: most timetables are verified, decoded and checked while the engine searches%s).\n",
		msText(tm.Compile), msText(tm.Search), msText(tm.Verify), msText(tm.Decode), msText(tm.Check), summed)
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
