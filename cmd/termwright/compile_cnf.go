package main

import (
	"io"

	"github.com/spf13/cobra"
	"github.com/termwright/termwright/solver"
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
