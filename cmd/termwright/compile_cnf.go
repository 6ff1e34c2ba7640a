package main

import (
	"bufio"
	"io"
	"os"
	"path/filepath"
	"strings"

	"github.com/spf13/cobra"
	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
	"github.com/termwright/termwright/timetable/benchfmt"
)

// addCompileCNFFlags adds --cnf and --cnf-names to `termwright compile`.
func addCompileCNFFlags(cmd *cobra.Command, o *compileOptions) {
	cmd.Flags().BoolVar(&o.cnf, "cnf", false, "write the completion of the program as a CNF formula in the DIMACS format instead (weak constraints left out)")
	cmd.Flags().BoolVar(&o.names, "cnf-names", false, "with --cnf: add a comment line \"c atom N NAME\" for every named atom")
}

// writeCNF writes p's completion in the DIMACS format.
func writeCNF(w io.Writer, p *solver.Program, names bool) error {
	return solver.WriteDIMACSWith(w, p, solver.DIMACSOptions{Names: names})
}

// loadCompileTerm reads the term to compile: a term workbook or folder, or
// a benchmark instance in the ITC-2007 .ctt format (so that the same
// instances bench solves can be written as CNF).
func loadCompileTerm(e *env, path string) (*timetable.Term, error) {
	if !strings.EqualFold(filepath.Ext(path), ".ctt") {
		return loadTerm(e, path)
	}
	f, err := os.Open(path)
	if err != nil {
		return nil, failf(exitError, "cannot open the instance: %w", err)
	}
	defer f.Close()
	term, err := benchfmt.ReadCTT(bufio.NewReader(f), filepath.Base(path))
	if err != nil {
		return nil, wrapCode(exitError, err)
	}
	return term, nil
}
