package main

import (
	"bufio"
	"fmt"
	"io"

	"github.com/spf13/cobra"
	"github.com/termwright/termwright/encode"
	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

func init() { register("compile", newCompileCmd) }

// compileOptions are the flags of `termwright compile`.
type compileOptions struct {
	out     string // output file; "" or "-" for standard output
	force   bool   // replace an existing output file
	explain bool   // free selectors, unpruned candidates
	cnf     bool   // write the completion as DIMACS CNF (compile_cnf.go)
	names   bool   // with cnf: comment lines naming the atoms
}

func newCompileCmd(e *env) *cobra.Command {
	o := &compileOptions{}
	cmd := &cobra.Command{
		Use:   "compile TERM [-o PROGRAM.lp]",
		Short: "Write the logic program that solve searches, with comments naming each requirement",
		Long: "compile reads a term workbook (or folder of CSV files) and writes the ground logic\n" +
			"program that solve hands to the engine, in the standard rule syntax\n" +
			"(\"a :- b, not c.\", \":- 2 {a; b; c}.\", \"{a; b} = 1.\"). Atoms read like\n" +
			"start(\"BIO-101\",tue_10_00) (a meeting of BIO-101 starts on Tuesday at 10:00);\n" +
			"every requirement — a staff member's availability, a cohort's no-overlap, a room\n" +
			"family's supply, a fixed meeting, a relation row — is preceded by a % comment\n" +
			"with its sentence and the workbook rows it comes from, and switched by a\n" +
			"selector atom req(...). Rooms are counted, not chosen: solve assigns them.\n\n" +
			"With --explain the selectors are free choices and candidates are not pruned by\n" +
			"requirements that can be switched off: the form used to explain infeasibility.\n" +
			"The program goes to -o (refused when the file exists, unless --force) or to\n" +
			"standard output; a size summary goes to standard error.",
		Args: cobra.ExactArgs(1),
		RunE: e.runner(o, func(cmd *cobra.Command, args []string) error { return runCompile(e, o, args[0]) }),
	}
	cmd.Flags().StringVarP(&o.out, "out", "o", "", "file to write the program to (default: standard output)")
	cmd.Flags().BoolVar(&o.force, "force", false, "replace an existing output file")
	cmd.Flags().BoolVar(&o.explain, "explain", false, "write the explanation form: free selectors, no pruning by requirements")
	addCompileCNFFlags(cmd, o)
	addColumnsFlag(cmd, e)
	return cmd
}

func runCompile(e *env, o *compileOptions, termPath string) error {
	toStdout := o.out == "" || o.out == "-"
	if !toStdout {
		if err := checkOutput(o.out, o.force, "", termPath); err != nil {
			return err
		}
	}
	term, err := loadCompileTerm(e, termPath)
	if err != nil {
		return err
	}
	p, cat, err := encode.Compile(term, encode.Options{Explain: o.explain})
	if err != nil {
		return wrapCode(exitError, err)
	}
	write := func(w io.Writer) error { return writeProgramDump(w, term, p, cat, o.explain) }
	if o.cnf {
		write = func(w io.Writer) error { return writeCNF(w, p, o.names) }
	}
	if toStdout {
		bw := bufio.NewWriter(e.stdout)
		if err := write(bw); err != nil {
			return failf(exitError, "cannot print the program: %w", err)
		}
		if err := bw.Flush(); err != nil {
			return err
		}
	} else if _, err := writeOutput(o.out, o.force, write); err != nil {
		return wrapCode(exitError, err)
	}
	st := cat.Stats(p)
	where := o.out
	if toStdout {
		where = "standard output"
	}
	fmt.Fprintf(e.stderr, "Wrote the program of %s to %s: %d atoms (%d start), %d rules, %d choices, %d bounds (%d literals), %d requirement groups, %d room families; per section %.1f atoms, %.1f rules, %.1f bounds.\n",
		termName(term), where, st.Atoms, st.StartAtoms, st.Rules, st.Choices, st.Bounds, st.BoundLits, st.Groups, st.RoomFamilies,
		st.AtomsPerSec, st.RulesPerSec, st.BoundsPerSec)
	return nil
}

// writeProgramDump writes a header and the program with group comments.
func writeProgramDump(w io.Writer, t *timetable.Term, p *solver.Program, cat *encode.Catalog, explain bool) error {
	c := timetable.Summary(t)
	mode := "solve form: selectors are facts, candidates pruned by availability"
	if explain {
		mode = "explain form: selectors are free choices to assume"
	}
	header := fmt.Sprintf("%% Ground program of term %q written by termwright compile (%s).\n"+
		"%% %s, %s, %s, %s, %s, %s.\n"+
		"%% start(S,P): a meeting of section S starts at period P; req(...): requirement selectors;\n"+
		"%% busy(T,P): staff member T teaches at P; meets(S,D): S meets on day D;\n"+
		"%% started_by(S,P): a meeting of S starts at or before P. Rooms are assigned after solving.\n"+
		"%% Any #atoms lines list every atom first, so that atom numbers are kept when the file is read back.\n",
		t.Name, mode, checkCount(c.Sections, "section"), checkCount(c.Meetings, "meeting"), checkCount(c.Periods, "period"),
		checkCount(c.Rooms, "room"), checkCount(c.Staff, "staff member"), checkCount(c.Cohorts, "cohort"))
	if _, err := io.WriteString(w, header); err != nil {
		return err
	}
	return solver.WriteProgramComments(w, p, cat.Commenter())
}

// loadTerm reads a term, prints its problems (errors first) on standard
// error, and refuses it when it has errors.
func loadTerm(e *env, path string) (*timetable.Term, error) {
	term, problems, err := readTerm(e, path)
	if err != nil {
		return nil, wrapCode(exitError, err)
	}
	errs := problems.Errors()
	for _, p := range append(errs, problems.Warnings()...) {
		fmt.Fprintln(e.stderr, p.String())
	}
	if len(errs) > 0 {
		return nil, withCode(exitError, fmt.Sprintf("%s has %s — fix them first (termwright check %s lists them)",
			path, checkCount(len(errs), "error"), path))
	}
	return term, nil
}

func termName(t *timetable.Term) string {
	if t.Name == "" {
		return "the term"
	}
	return fmt.Sprintf("%q", t.Name)
}
