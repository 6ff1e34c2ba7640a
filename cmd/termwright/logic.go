package main

import (
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"strings"
	"time"

	"github.com/spf13/cobra"
	"github.com/termwright/termwright/solver"
)

func init() { register("logic", newLogicCmd) }

// logicOptions are the flags of `termwright logic solve` and `logic verify`.
type logicOptions struct {
	models    int           // solve: models to list (0 = all)
	count     bool          // solve: print only the number of models
	json      bool          // JSON lines instead of text
	timeLimit time.Duration // solve: give up after this long (0 = no limit)
	model     string        // verify: the candidate as a list of atoms
	modelFile string        // verify: read the candidate from this file (- = stdin)
}

func newLogicCmd(e *env) *cobra.Command {
	cmd := &cobra.Command{
		Use:   "logic",
		Short: "Solve or check ground logic programs in the standard rule syntax",
		Long: "logic works on ground logic programs written in the standard rule syntax\n" +
			"(a :- b, not c.  {a; b} = 1 :- c.  :- 2 {a; b; c}.  :~ a. [3@1]  #show a.),\n" +
			"the form termwright compiles a term into. solve finds stable models with the\n" +
			"built-in engine; verify checks a candidate model with the independent verifier.",
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			return withCode(exitError, "say what to do: termwright logic solve FILE, or termwright logic verify FILE --model ATOMS")
		},
	}
	cmd.AddCommand(newLogicSolveCmd(e), newLogicVerifyCmd(e), newLogicSatCmd(e))
	return cmd
}

func newLogicSolveCmd(e *env) *cobra.Command {
	o := &logicOptions{}
	cmd := &cobra.Command{
		Use:   "solve FILE|-",
		Short: "Find stable models of a ground program",
		Long: "solve reads a ground program from FILE (or standard input for -) and prints its\n" +
			"stable models: for each, a line \"Model N:\" and then its true atoms, separated\n" +
			"by spaces. Only atoms named in #show statements are printed (all named atoms\n" +
			"when there are none), and models that differ only in atoms not printed count\n" +
			"once. Every model is checked by the independent verifier before it is printed.\n\n" +
			"Exit status: 0 when a model was found, 2 when none exists, 1 on an error or\n" +
			"when the time limit ran out before any model was found.",
		Example: "  termwright logic solve queens.lp --models 0\n" +
			"  termwright logic solve - --count --time-limit 30s < big.lp",
		Args: cobra.ExactArgs(1),
		PreRun: func(cmd *cobra.Command, args []string) {
			if !cmd.Flags().Changed("models") && o.count {
				o.models = 0 // --count alone counts every model
			}
		},
		RunE: e.runner(o, func(cmd *cobra.Command, args []string) error {
			return runLogicSolve(cmd.Context(), e, o, args[0])
		}),
	}
	f := cmd.Flags()
	f.IntVar(&o.models, "models", 1, "list at most `N` models (0 lists all)")
	f.BoolVar(&o.count, "count", false, "print only the number of models (all of them unless --models is given)")
	f.BoolVar(&o.json, "json", false, "print one JSON object per model, then a summary object")
	f.DurationVar(&o.timeLimit, "time-limit", 0, "stop searching after this long, e.g. 10s or 2m (0 means no limit)")
	return cmd
}

func newLogicVerifyCmd(e *env) *cobra.Command {
	o := &logicOptions{}
	cmd := &cobra.Command{
		Use:   "verify FILE|- (--model ATOMS | --model-file FILE)",
		Short: "Check whether a set of atoms is a stable model, and say why not",
		Long: "verify reads a ground program from FILE (or standard input for -) and checks\n" +
			"the candidate given as its true atoms, separated by commas or blanks. It builds\n" +
			"the reduct of the program by the candidate, computes its least model, and\n" +
			"checks constraints and count bounds; every reason the candidate fails is\n" +
			"printed: atoms without support, atoms that rules derive but the candidate\n" +
			"lacks, violated constraints and bounds. For a stable model it prints the\n" +
			"cost of its weak constraints per priority level.\n\n" +
			"Exit status: 0 for a stable model, 2 when the candidate is not one, 1 on an\n" +
			"error.",
		Example: "  termwright logic verify prog.lp --model \"a, start(s12,3)\"\n" +
			"  termwright logic verify prog.lp --model-file answer.txt",
		Args: cobra.ExactArgs(1),
		RunE: e.runner(o, func(cmd *cobra.Command, args []string) error {
			return runLogicVerify(e, o, args[0], cmd.Flags().Changed("model"))
		}),
	}
	f := cmd.Flags()
	f.StringVar(&o.model, "model", "", "the candidate's true atoms, e.g. \"a, b, p(1,2)\" (\"\" for none)")
	f.StringVar(&o.modelFile, "model-file", "", "read the candidate's true atoms from `FILE` (- for standard input)")
	f.BoolVar(&o.json, "json", false, "print the result as one JSON object")
	return cmd
}

// logicRead reads the program at path ("-" for stdin), printing syntax
// errors to stderr.
func logicRead(e *env, path string) (*solver.Program, error) {
	var r io.Reader = e.stdin
	name := "<stdin>"
	if path != "-" {
		f, err := openInput(path, "the program")
		if err != nil {
			return nil, wrapCode(exitError, err)
		}
		defer f.Close()
		r, name = f, path
	}
	p, err := solver.ReadProgram(r, name)
	return p, logicInputError(e, err, "the program")
}

// logicInputError prints each syntax error on its own line to stderr and
// turns err into an exit code.
func logicInputError(e *env, err error, what string) error {
	if err == nil {
		return nil
	}
	var list solver.SyntaxErrors
	if !errors.As(err, &list) {
		return wrapCode(exitError, err)
	}
	for _, se := range list {
		fmt.Fprintln(e.stderr, se.Error())
	}
	return wrapMsg(exitError, fmt.Sprintf("%d error%s in %s; nothing was done", len(list), logicPlural(len(list)), what), err)
}

func logicPlural(n int) string {
	if n == 1 {
		return ""
	}
	return "s"
}

// logicShown returns the atoms printed for a model, and the atoms models
// are projected onto (nil when every atom is printed).
func logicShown(p *solver.Program) (shown []solver.Atom, project []solver.Atom) {
	if len(p.Shows) > 0 {
		seen := make(map[solver.Atom]bool, len(p.Shows))
		for _, a := range p.Shows {
			if !seen[a] {
				seen[a] = true
				shown = append(shown, a)
			}
		}
		return shown, shown
	}
	anonymous := false
	for a := solver.Atom(1); int(a) <= p.NumAtoms(); a++ {
		if p.Name(a) != "" {
			shown = append(shown, a)
		} else {
			anonymous = true
		}
	}
	if anonymous {
		if shown == nil {
			shown = []solver.Atom{}
		}
		return shown, shown
	}
	return shown, nil
}

// logicName is the printed name of a: its name or the reserved _aN form.
func logicName(p *solver.Program, a solver.Atom) string {
	if n := p.Name(a); n != "" {
		return n
	}
	return fmt.Sprintf("_a%d", a)
}

// logicStats is the JSON form of the engine's work counters.
type logicStats struct {
	Conflicts    int64 `json:"conflicts"`
	Decisions    int64 `json:"decisions"`
	Propagations int64 `json:"propagations"`
	Restarts     int64 `json:"restarts"`
	Learned      int64 `json:"learned"`
	LoopFormulas int64 `json:"loop_formulas"`
	Deleted      int64 `json:"deleted"`
}

// logicSummary is the last JSON object of `logic solve --json`.
type logicSummary struct {
	Result   string     `json:"result"`   // satisfiable, unsatisfiable or unknown
	Models   int        `json:"models"`   // models listed (or counted)
	Complete bool       `json:"complete"` // true when no other model exists
	Stats    logicStats `json:"stats"`
}

func runLogicSolve(ctx context.Context, e *env, o *logicOptions, path string) error {
	if o.models < 0 {
		return withCode(exitError, fmt.Sprintf("--models must be 0 (all) or more, not %d", o.models))
	}
	if o.timeLimit < 0 {
		return withCode(exitError, "--time-limit must not be negative")
	}
	p, err := logicRead(e, path)
	if err != nil {
		return err
	}
	s, err := solver.New(p, solver.DefaultOptions())
	if err != nil {
		return failf(exitError, "cannot solve %s: %w", path, err)
	}
	if ctx == nil {
		ctx = context.Background()
	}
	if o.timeLimit > 0 {
		var cancel context.CancelFunc
		ctx, cancel = context.WithTimeout(ctx, o.timeLimit)
		defer cancel()
	}
	shown, project := logicShown(p)
	inShown := make([]bool, p.NumAtoms()+1)
	for _, a := range shown {
		inShown[a] = true
	}

	// Ask for one model more than listed, to know whether more exist.
	limit := 0
	if o.models > 0 {
		limit = o.models + 1
	}
	listed, more := 0, false
	var full []solver.Atom
	var verr error
	enc := json.NewEncoder(e.stdout)
	_, complete := s.Enumerate(ctx, limit, project, func([]solver.Atom) bool {
		if o.models > 0 && listed == o.models {
			more = true
			return false
		}
		full = s.Model(full[:0])
		if err := solver.Verify(p, full); err != nil {
			verr = err
			return false
		}
		listed++
		if !o.count {
			logicPrintModel(e, enc, o, p, full, inShown, listed)
		}
		return true
	})
	if verr != nil {
		return failf(exitError, "internal error: the engine returned a candidate that the verifier rejects (%w); please report this with the program", verr)
	}
	complete = complete && !more
	stopped := !complete && !more
	st := s.Stats()
	sum := logicSummary{Models: listed, Complete: complete, Stats: logicStats{
		Conflicts: st.Conflicts, Decisions: st.Decisions, Propagations: st.Propagations, Restarts: st.Restarts,
		Learned: st.Learned, LoopFormulas: st.LoopFormulas, Deleted: st.Deleted,
	}}
	switch {
	case listed > 0:
		sum.Result = "satisfiable"
	case complete:
		sum.Result = "unsatisfiable"
	default:
		sum.Result = "unknown"
	}
	switch {
	case o.json:
		enc.Encode(sum)
	case o.count:
		fmt.Fprintln(e.stdout, listed)
	default:
		fmt.Fprintln(e.stdout, logicSentence(listed, complete, more))
	}
	why := "the search was interrupted"
	if errors.Is(ctx.Err(), context.DeadlineExceeded) {
		why = fmt.Sprintf("the time limit of %v ran out", o.timeLimit)
	}
	if stopped && listed > 0 {
		fmt.Fprintf(e.stderr, "termwright: %s after %d model%s; there may be more\n", why, listed, logicPlural(listed))
	}
	switch sum.Result {
	case "satisfiable":
		return nil
	case "unsatisfiable":
		return withCode(exitNone, "")
	}
	return withCode(exitError, why+" before any model was found; try a longer --time-limit")
}

// logicPrintModel prints one model's shown atoms, as text or JSON.
func logicPrintModel(e *env, enc *json.Encoder, o *logicOptions, p *solver.Program, full []solver.Atom, inShown []bool, n int) {
	names := []string{}
	for _, a := range full {
		if inShown[a] {
			names = append(names, logicName(p, a))
		}
	}
	if o.json {
		enc.Encode(struct {
			Model []string `json:"model"`
		}{names})
		return
	}
	fmt.Fprintf(e.stdout, "Model %d:\n%s\n", n, strings.Join(names, " "))
}

// logicSentence is the closing line of the text output.
func logicSentence(listed int, complete, more bool) string {
	switch {
	case listed == 0 && complete:
		return "No stable model exists."
	case listed == 0:
		return "No stable model found before the search stopped."
	case complete:
		return fmt.Sprintf("%d stable model%s; no other exists.", listed, logicPlural(listed))
	case more:
		return fmt.Sprintf("%d stable model%s listed; more exist (--models 0 lists all).", listed, logicPlural(listed))
	}
	return fmt.Sprintf("%d stable model%s listed; the search stopped, so there may be more.", listed, logicPlural(listed))
}

// logicVerdict is the JSON form of `logic verify --json`.
type logicVerdict struct {
	Stable   bool           `json:"stable"`
	Problems []logicProblem `json:"problems"`
	Cost     []logicCost    `json:"cost"`
}

type logicProblem struct {
	Kind    string `json:"kind"`
	Atom    string `json:"atom,omitempty"`
	Message string `json:"message"`
}

type logicCost struct {
	Level int   `json:"level"`
	Cost  int64 `json:"cost"`
}

func runLogicVerify(e *env, o *logicOptions, path string, modelGiven bool) error {
	if modelGiven == (o.modelFile != "") {
		return withCode(exitError, "give the candidate with exactly one of --model \"a, b\" or --model-file FILE")
	}
	if path == "-" && o.modelFile == "-" {
		return withCode(exitError, "the program and the candidate cannot both come from standard input")
	}
	p, err := logicRead(e, path)
	if err != nil {
		return err
	}
	var r io.Reader = strings.NewReader(o.model)
	name := "--model"
	switch o.modelFile {
	case "":
	case "-":
		r, name = e.stdin, "<stdin>"
	default:
		f, err := openInput(o.modelFile, "the candidate")
		if err != nil {
			return wrapCode(exitError, err)
		}
		defer f.Close()
		r, name = f, o.modelFile
	}
	model, err := solver.ReadModel(r, p, name)
	if err := logicInputError(e, err, "the candidate"); err != nil {
		return err
	}
	verdict := logicVerdict{Problems: []logicProblem{}, Cost: []logicCost{}}
	err = solver.Verify(p, model)
	var ve *solver.VerifyError
	switch {
	case err == nil:
		verdict.Stable = true
		cost, err := solver.CheckedCost(p, model)
		if err != nil {
			return wrapCode(exitError, err)
		}
		for i, l := range solver.Levels(p) {
			verdict.Cost = append(verdict.Cost, logicCost{Level: l, Cost: cost[i]})
		}
	case errors.As(err, &ve):
		for _, pr := range ve.Problems {
			lp := logicProblem{Kind: pr.Kind.String(), Message: pr.Msg}
			if pr.Atom != 0 && int(pr.Atom) <= p.NumAtoms() {
				lp.Atom = logicName(p, pr.Atom)
			}
			verdict.Problems = append(verdict.Problems, lp)
		}
	default:
		return wrapCode(exitError, err)
	}
	if o.json {
		json.NewEncoder(e.stdout).Encode(verdict)
	} else {
		logicPrintVerdict(e, verdict)
	}
	if !verdict.Stable {
		return withCode(exitNone, "")
	}
	return nil
}

func logicPrintVerdict(e *env, v logicVerdict) {
	if v.Stable {
		fmt.Fprintln(e.stdout, "The candidate is a stable model.")
		for _, c := range v.Cost {
			fmt.Fprintf(e.stdout, "Cost at level %d: %d\n", c.Level, c.Cost)
		}
		return
	}
	fmt.Fprintf(e.stdout, "The candidate is not a stable model (%d problem%s):\n", len(v.Problems), logicPlural(len(v.Problems)))
	for i, pr := range v.Problems {
		if i == logicMostProblems {
			fmt.Fprintf(e.stdout, "  and %d more (--json lists all)\n", len(v.Problems)-i)
			break
		}
		fmt.Fprintf(e.stdout, "  - %s\n", pr.Message)
	}
}

// logicMostProblems is how many problems the text output of verify lists.
const logicMostProblems = 50
