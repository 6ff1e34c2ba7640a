package main

import (
	"bufio"
	"context"
	"encoding/json"
	"fmt"
	"os"
	"strconv"
	"strings"
	"time"

	"github.com/spf13/cobra"
	"github.com/termwright/termwright/encode"
	"github.com/termwright/termwright/samples"
	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

func init() { register("scale", newScaleCmd) }

// scaleOptions are the flags of `termwright scale`.
type scaleOptions struct {
	sizes      string        // comma-separated section counts
	seed       uint64        // generator seed
	firstLimit time.Duration // limit of the first-feasible search
	optLimit   time.Duration // limit of the optimisation (cost at this time)
	threads    int           // parallel searches in the optimisation
	json       bool          // JSON lines instead of a table
}

// scaleRow is the measurement of one synthetic term (JSON form).
type scaleRow struct {
	Sections     int     `json:"sections"`
	Meetings     int     `json:"meetings"`
	Atoms        int     `json:"atoms"`
	Rules        int     `json:"rules"`
	Bounds       int     `json:"bounds"`
	BoundLits    int     `json:"bound_literals"`
	GenerateS    float64 `json:"generate_s"`
	CompileS     float64 `json:"compile_s"`
	FirstStatus  string  `json:"first_status"`
	FirstS       float64 `json:"first_feasible_s"` // Solve wall time: compile, search rounds, verify, decode, check
	Rounds       int     `json:"rounds"`
	Conflicts    int64   `json:"conflicts"`
	VerifyS      float64 `json:"verify_s"` // solver.Verify in Solve
	CheckS       float64 `json:"check_s"`  // timetable.Check of the timetable, timed here
	OptStatus    string  `json:"opt_status,omitempty"`
	OptFirstS    float64 `json:"opt_first_s,omitempty"` // first verified timetable inside Optimize
	Cost         []int64 `json:"cost,omitempty"`        // per level, highest first, at the time limit
	Bound        []int64 `json:"bound,omitempty"`
	Stopped      string  `json:"stopped,omitempty"`
	PeakRSSBytes int64   `json:"peak_rss_bytes"` // of this process so far (VmHWM)
	Error        string  `json:"error,omitempty"`
}

func newScaleCmd(e *env) *cobra.Command {
	o := &scaleOptions{}
	cmd := &cobra.Command{
		Use:   "scale [--sections 300,2000,10000]",
		Short: "Measure compile, search, verification and memory on synthetic terms of growing size",
		Long: "scale generates synthetic terms (as termwright generate does, seed fixed) of the\n" +
			"given numbers of sections and, for each, measures the program size, the compile\n" +
			"time, the time to the first verified and checked timetable, the verification and\n" +
			"check times, the cost reached by optimising for --time-limit, and the peak memory\n" +
			"of the process so far. Sizes run in the order given; run one size per process\n" +
			"for a per-size peak memory. Progress goes to standard error, the table (or JSON\n" +
			"lines with --json) to standard output.",
		Example: "  termwright scale --sections 300,2000 --time-limit 60s\n" +
			"  termwright scale --sections 10000 --first-limit 10m --time-limit 0 --json",
		Args: cobra.NoArgs,
		RunE: e.runner(o, func(cmd *cobra.Command, args []string) error { return runScale(cmd.Context(), e, o) }),
	}
	f := cmd.Flags()
	f.StringVar(&o.sizes, "sections", "300,2000,10000", "comma-separated numbers of sections")
	f.Uint64Var(&o.seed, "seed", 1, "seed of the generator (the engine seed is 1)")
	f.DurationVar(&o.firstLimit, "first-limit", 10*time.Minute, "time limit of the search for the first timetable")
	f.DurationVar(&o.optLimit, "time-limit", 60*time.Second, "optimise for this long and report the cost (0 skips optimisation)")
	f.IntVar(&o.threads, "threads", 1, "parallel searches while optimising")
	f.BoolVar(&o.json, "json", false, "print one JSON object per size")
	return cmd
}

func runScale(ctx context.Context, e *env, o *scaleOptions) error {
	var sizes []int
	for _, s := range strings.Split(o.sizes, ",") {
		n, err := strconv.Atoi(strings.TrimSpace(s))
		if err != nil || n < 1 || n > samples.MaxSections {
			return withCode(exitError, fmt.Sprintf("--sections: %q is not a number of sections from 1 to %d; give a list like 300,2000", s, samples.MaxSections))
		}
		sizes = append(sizes, n)
	}
	if o.firstLimit <= 0 || o.optLimit < 0 || o.threads < 1 {
		return withCode(exitError, "--first-limit must be positive, --time-limit not negative and --threads at least 1")
	}
	if ctx == nil {
		ctx = context.Background()
	}
	w := bufio.NewWriter(e.stdout)
	defer w.Flush()
	if !o.json {
		fmt.Fprintf(w, "%-8s %-8s %-9s %-9s %-9s %-9s %-10s %-9s %-8s %-14s %-10s %s\n",
			"sections", "meetings", "atoms", "rules", "compile", "first", "verify", "check", "peak", "cost", "bound", "stopped")
	}
	for _, n := range sizes {
		row := scaleOne(ctx, e, o, n)
		if o.json {
			json.NewEncoder(w).Encode(row)
		} else {
			fmt.Fprintf(w, "%-8d %-8d %-9d %-9d %-9s %-9s %-10s %-9s %-8s %-14s %-10s %s\n",
				row.Sections, row.Meetings, row.Atoms, row.Rules, scaleSecs(row.CompileS),
				scaleFirst(row), scaleSecs(row.VerifyS), scaleSecs(row.CheckS), scaleMiB(row.PeakRSSBytes),
				scaleLevels(row.Cost), scaleLevels(row.Bound), row.Stopped+row.Error)
		}
		w.Flush()
		if ctx.Err() != nil {
			break
		}
	}
	return nil
}

// scaleOne generates, compiles, solves and optimises one synthetic term.
func scaleOne(ctx context.Context, e *env, o *scaleOptions, n int) scaleRow {
	row := scaleRow{Sections: n}
	t0 := time.Now()
	term := samples.Generate(samples.Config{Sections: n, Seed: o.seed})
	row.GenerateS = time.Since(t0).Seconds()
	for _, s := range term.Sections {
		row.Meetings += s.Meetings
	}
	fmt.Fprintf(e.stderr, "scale: %d sections, %d meetings generated in %s\n", n, row.Meetings, scaleSecs(row.GenerateS))

	t1 := time.Now()
	p, cat, err := encode.Compile(term, encode.Options{})
	row.CompileS = time.Since(t1).Seconds()
	if err != nil {
		row.Error = err.Error()
		return row
	}
	st := cat.Stats(p)
	row.Atoms, row.Rules, row.Bounds, row.BoundLits = st.Atoms, st.Rules, st.Bounds, st.BoundLits
	p, cat = nil, nil
	fmt.Fprintf(e.stderr, "scale: %d sections: %d atoms, %d rules, %d bounds compiled in %s; searching for a timetable\n",
		n, row.Atoms, row.Rules, row.Bounds, scaleSecs(row.CompileS))

	fctx, cancel := context.WithTimeout(ctx, o.firstLimit)
	t2 := time.Now()
	res, err := encode.Solve(fctx, term, encode.SolveOptions{Seed: 1})
	row.FirstS = time.Since(t2).Seconds()
	cancel()
	if err != nil {
		row.Error = err.Error()
		row.PeakRSSBytes = peakRSS()
		return row
	}
	row.FirstStatus = res.Status.String()
	row.Rounds, row.Conflicts = res.Rounds, res.Engine.Conflicts
	row.VerifyS = res.Timings.Verify.Seconds()
	if res.Status == solver.Satisfiable {
		t3 := time.Now()
		timetable.Check(term, res.Schedule)
		row.CheckS = time.Since(t3).Seconds()
	}
	res = nil
	row.PeakRSSBytes = peakRSS()
	fmt.Fprintf(e.stderr, "scale: %d sections: %s after %s\n", n, row.FirstStatus, scaleSecs(row.FirstS))
	if o.optLimit == 0 || row.FirstStatus != "satisfiable" {
		return row
	}
	octx, cancel := context.WithTimeout(ctx, o.optLimit)
	defer cancel()
	ores, err := optimizeFor(octx, term, encode.OptimizeOptions{Seed: 1}, o.threads)
	row.PeakRSSBytes = peakRSS()
	if err != nil {
		row.Error = err.Error()
		return row
	}
	row.OptStatus = ores.Status.String()
	row.Stopped = ores.Stopped
	if len(ores.History) > 0 {
		row.OptFirstS = ores.History[0].Elapsed.Seconds()
	}
	if ores.Status == solver.Satisfiable {
		row.Cost, row.Bound = ores.Total, ores.Bound
	}
	fmt.Fprintf(e.stderr, "scale: %d sections: cost %s after optimising for %s (%s)\n", n, scaleLevels(row.Cost), o.optLimit, row.Stopped)
	return row
}

// optimizeFor runs the optimiser, as a portfolio when threads > 1.
func optimizeFor(ctx context.Context, t *timetable.Term, opt encode.OptimizeOptions, threads int) (*encode.OptimizeResult, error) {
	return encode.OptimizePortfolio(ctx, t, opt, threads)
}

// peakRSS is the peak resident set size of this process (VmHWM on Linux),
// 0 when unknown.
func peakRSS() int64 {
	data, err := os.ReadFile("/proc/self/status")
	if err != nil {
		return 0
	}
	for _, line := range strings.Split(string(data), "\n") {
		if rest, ok := strings.CutPrefix(line, "VmHWM:"); ok {
			f := strings.Fields(rest)
			if len(f) >= 1 {
				kb, _ := strconv.ParseInt(f[0], 10, 64)
				return kb * 1024
			}
		}
	}
	return 0
}

func scaleSecs(s float64) string { return strconv.FormatFloat(s, 'f', 3, 64) + "s" }

func scaleMiB(b int64) string {
	if b == 0 {
		return "-"
	}
	return strconv.FormatInt(b>>20, 10) + "MiB"
}

func scaleFirst(r scaleRow) string {
	if r.FirstStatus == "satisfiable" {
		return scaleSecs(r.FirstS)
	}
	if r.FirstStatus == "" {
		return "-"
	}
	return r.FirstStatus
}

func scaleLevels(v []int64) string {
	if len(v) == 0 {
		return "-"
	}
	parts := make([]string, len(v))
	for i, x := range v {
		parts[i] = strconv.FormatInt(x, 10)
	}
	return strings.Join(parts, "/")
}
