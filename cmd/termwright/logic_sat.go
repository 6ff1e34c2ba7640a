package main

import (
	"bufio"
	"context"
	"fmt"
	"strconv"
	"time"

	"github.com/spf13/cobra"
	"github.com/termwright/termwright/solver"
)

// logicSatOptions are the flags of `termwright logic sat`.
type logicSatOptions struct {
	timeLimit time.Duration // give up after this long (0 = no limit)
	quiet     bool          // no "v" lines
}

func newLogicSatCmd(e *env) *cobra.Command {
	o := &logicSatOptions{}
	cmd := &cobra.Command{
		Use:   "sat FILE.cnf|-",
		Short: "Decide a CNF formula in the DIMACS format with the built-in engine",
		Long: "sat reads a CNF formula in the DIMACS format (\"p cnf VARS CLAUSES\", clauses of\n" +
			"non-zero integers ended by 0) as a program of free atoms and integrity\n" +
			"constraints, and decides it with the same engine that solves terms. It prints\n" +
			"\"s SATISFIABLE\" and the model as \"v\" lines (negative numbers are false\n" +
			"variables), \"s UNSATISFIABLE\", or \"s UNKNOWN\" when the time limit ran out;\n" +
			"the time taken and the engine's counters go to standard error. Every model is\n" +
			"checked by the independent verifier before it is printed. Use it to compare the\n" +
			"engine with other SAT solvers on files from compile --cnf.\n\n" +
			"Exit status: 0 satisfiable, 2 unsatisfiable, 1 on an error or time out.",
		Example: "  termwright compile term.xlsx --cnf -o term.cnf\n" +
			"  termwright logic sat term.cnf --time-limit 60s --quiet",
		Args: cobra.ExactArgs(1),
		RunE: e.runner(o, func(cmd *cobra.Command, args []string) error { return runLogicSat(cmd.Context(), e, o, args[0]) }),
	}
	cmd.Flags().DurationVar(&o.timeLimit, "time-limit", 0, "stop searching after this long, e.g. 10s or 2m (0 means no limit)")
	cmd.Flags().BoolVarP(&o.quiet, "quiet", "q", false, "print only the \"s\" line, not the model")
	return cmd
}

func runLogicSat(ctx context.Context, e *env, o *logicSatOptions, path string) error {
	if o.timeLimit < 0 {
		return withCode(exitError, "--time-limit must not be negative")
	}
	t0 := time.Now()
	var p *solver.Program
	var err error
	if path == "-" {
		p, err = solver.ReadDIMACS(e.stdin, "<stdin>")
	} else {
		f, ferr := openInput(path, "the formula")
		if ferr != nil {
			return wrapCode(exitError, ferr)
		}
		p, err = solver.ReadDIMACS(bufio.NewReaderSize(f, 1<<16), path)
		f.Close()
	}
	if err != nil {
		return wrapCode(exitError, err)
	}
	if ctx == nil {
		ctx = context.Background()
	}
	if o.timeLimit > 0 {
		var cancel context.CancelFunc
		ctx, cancel = context.WithTimeout(ctx, o.timeLimit)
		defer cancel()
	}
	t1 := time.Now()
	s, err := solver.New(p, solver.DefaultOptions())
	if err != nil {
		return failf(exitError, "cannot solve %s: %w", path, err)
	}
	st := s.Solve(ctx)
	t2 := time.Now()
	stats := s.Stats()
	fmt.Fprintf(e.stderr, "c read %.3f s, search %.3f s, total %.3f s; %d variables, %d clauses; %d conflicts, %d decisions, %d restarts\n",
		t1.Sub(t0).Seconds(), t2.Sub(t1).Seconds(), t2.Sub(t0).Seconds(), p.NumAtoms(), len(p.Rules),
		stats.Conflicts, stats.Decisions, stats.Restarts)
	w := bufio.NewWriter(e.stdout)
	defer w.Flush()
	switch st {
	case solver.Satisfiable:
		model := s.Model(nil)
		if err := solver.Verify(p, model); err != nil {
			return failf(exitError, "internal error: the engine returned an assignment that the verifier rejects (%w); please report this with the formula", err)
		}
		fmt.Fprintln(w, "s SATISFIABLE")
		if !o.quiet {
			logicSatPrintModel(w, p.NumAtoms(), model)
		}
		return nil
	case solver.Unsatisfiable:
		fmt.Fprintln(w, "s UNSATISFIABLE")
		return withCode(exitNone, "")
	}
	fmt.Fprintln(w, "s UNKNOWN")
	return withCode(exitError, "the search stopped before deciding the formula; try a longer --time-limit")
}

// logicSatPrintModel writes the model as "v" lines of at most ~20 literals,
// ended by 0.
func logicSatPrintModel(w *bufio.Writer, n int, model []solver.Atom) {
	val := make([]bool, n+1)
	for _, a := range model {
		val[a] = true
	}
	buf := []byte("v")
	for v := 1; v <= n; v++ {
		buf = append(buf, ' ')
		if !val[v] {
			buf = append(buf, '-')
		}
		buf = strconv.AppendInt(buf, int64(v), 10)
		if len(buf) > 70 {
			w.Write(append(buf, '\n'))
			buf = append(buf[:0], 'v')
		}
	}
	w.Write(append(buf, " 0\n"...))
}
