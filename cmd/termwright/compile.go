package main

import (
	"bufio"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"

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
		RunE: func(cmd *cobra.Command, args []string) error { return runCompile(e, o, args[0]) },
	}
	cmd.Flags().StringVarP(&o.out, "out", "o", "", "file to write the program to (default: standard output)")
	cmd.Flags().BoolVar(&o.force, "force", false, "replace an existing output file")
	cmd.Flags().BoolVar(&o.explain, "explain", false, "write the explanation form: free selectors, no pruning by requirements")
	addCompileCNFFlags(cmd, o)
	return cmd
}

func runCompile(e *env, o *compileOptions, termPath string) error {
	toStdout := o.out == "" || o.out == "-"
	if !toStdout {
		if err := refuseOutput(o.out, termPath, o.force); err != nil {
			return err
		}
	}
	term, err := loadCompileTerm(e, termPath)
	if err != nil {
		return err
	}
	p, cat, err := encode.Compile(term, encode.Options{Explain: o.explain})
	if err != nil {
		return withCode(exitError, err.Error())
	}
	write := func(w io.Writer) error { return writeProgramDump(w, term, p, cat, o.explain) }
	if o.cnf {
		write = func(w io.Writer) error { return writeCNF(w, p, o.names) }
	}
	if toStdout {
		bw := bufio.NewWriter(e.stdout)
		if err := write(bw); err != nil {
			return withCode(exitError, "cannot print the program: "+err.Error())
		}
		if err := bw.Flush(); err != nil {
			return err
		}
	} else if err := writeFileAtomic(o.out, write); err != nil {
		return withCode(exitError, err.Error())
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
	term, problems, err := timetable.Load(path)
	if err != nil {
		return nil, withCode(exitError, err.Error())
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

// refuseOutput refuses to write over the input or, without force, over
// any existing file.
func refuseOutput(out, input string, force bool) error {
	if same, _ := samePath(out, input); same {
		return withCode(exitError, fmt.Sprintf("%s is the input term; choose another output file", out))
	}
	fi, err := os.Stat(out)
	switch {
	case err == nil && fi.IsDir():
		return withCode(exitError, fmt.Sprintf("%s is a folder; give a file name", out))
	case err == nil && !force:
		return withCode(exitError, fmt.Sprintf("%s already exists — choose another name, or add --force to replace it", out))
	case err != nil && !errors.Is(err, fs.ErrNotExist):
		return withCode(exitError, fmt.Sprintf("cannot use %s: %v", out, err))
	}
	return nil
}

// samePath reports whether two paths name the same file (or would, when
// neither exists yet).
func samePath(a, b string) (bool, error) {
	fa, errA := os.Stat(a)
	fb, errB := os.Stat(b)
	if errA == nil && errB == nil {
		return os.SameFile(fa, fb), nil
	}
	absA, err := filepath.Abs(a)
	if err != nil {
		return false, err
	}
	absB, err := filepath.Abs(b)
	if err != nil {
		return false, err
	}
	return absA == absB, nil
}

// writeFileAtomic writes through a temporary file beside path and renames
// it into place, so that a failure never leaves a half-written file.
func writeFileAtomic(path string, write func(io.Writer) error) error {
	tmp, err := os.CreateTemp(filepath.Dir(path), "."+filepath.Base(path)+".*.tmp")
	if err != nil {
		return fmt.Errorf("cannot write in %s: %v", filepath.Dir(path), err)
	}
	bw := bufio.NewWriter(tmp)
	werr := write(bw)
	if werr == nil {
		werr = bw.Flush()
	}
	werr = errors.Join(werr, tmp.Close())
	if werr == nil {
		werr = os.Chmod(tmp.Name(), 0o644)
	}
	if werr == nil {
		werr = os.Rename(tmp.Name(), path)
	}
	if werr != nil {
		os.Remove(tmp.Name())
		return fmt.Errorf("cannot write %s: %v", path, werr)
	}
	return nil
}
