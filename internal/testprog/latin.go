package testprog

import (
	"fmt"

	"github.com/termwright/termwright/solver"
)

// LatinSquare fills an n×n grid with symbols 1..n, each once in every row
// and every column: atom x(r,c,v) says cell (r,c) holds v. Each cell takes
// exactly one symbol (a choice with bounds); each symbol occurs at most
// once per row and per column (bounds). When reduced, the first row and
// the first column are fixed to 1..n in order by constraints. Known
// counts: 576 Latin squares of order 4 (OEIS A002860); 56 reduced ones of
// order 5 (OEIS A000315). No auxiliary atoms.
func LatinSquare(n int, reduced bool) *solver.Program {
	p := solver.NewProgram()
	x := make([][][]solver.Atom, n)
	for r := range x {
		x[r] = make([][]solver.Atom, n)
		for c := range x[r] {
			x[r][c] = make([]solver.Atom, n)
			for v := range x[r][c] {
				x[r][c][v] = p.NewAtom(fmt.Sprintf("x(%d,%d,%d)", r+1, c+1, v+1))
			}
			p.AddChoice(x[r][c], 1, 1)
		}
	}
	for v := 0; v < n; v++ {
		for i := 0; i < n; i++ {
			row := make([]solver.Lit, n)
			col := make([]solver.Lit, n)
			for j := 0; j < n; j++ {
				row[j] = solver.Pos(x[i][j][v])
				col[j] = solver.Pos(x[j][i][v])
			}
			p.AddBound(row, solver.NoBound, 1)
			p.AddBound(col, solver.NoBound, 1)
		}
	}
	if reduced {
		for i := 0; i < n; i++ {
			p.AddConstraint(solver.Neg(x[0][i][i]))
			p.AddConstraint(solver.Neg(x[i][0][i]))
		}
	}
	return p
}
