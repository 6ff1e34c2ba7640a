package testprog

import (
	"fmt"

	"github.com/termwright/termwright/solver"
)

// Queens places n non-attacking queens on an n×n board: atom q(r,c) says a
// queen stands in row r, column c (1-based). Each row holds exactly one
// queen (a choice with bounds); each column and each diagonal at most one
// (bounds). Its stable models are the solutions: 92 for n = 8 and 724 for
// n = 10 (OEIS A000170). The program is tight and has no auxiliary atoms.
func Queens(n int) *solver.Program {
	p := solver.NewProgram()
	q := make([][]solver.Atom, n)
	for r := range q {
		q[r] = make([]solver.Atom, n)
		for c := range q[r] {
			q[r][c] = p.NewAtom(fmt.Sprintf("q(%d,%d)", r+1, c+1))
		}
	}
	for r := 0; r < n; r++ {
		p.AddChoice(q[r], 1, 1)
	}
	for c := 0; c < n; c++ {
		col := make([]solver.Lit, n)
		for r := 0; r < n; r++ {
			col[r] = solver.Pos(q[r][c])
		}
		p.AddBound(col, solver.NoBound, 1)
	}
	// Diagonals r-c = d and anti-diagonals r+c = s with at least two squares.
	for d := -(n - 2); d <= n-2; d++ {
		var diag []solver.Lit
		for r := 0; r < n; r++ {
			if c := r - d; c >= 0 && c < n {
				diag = append(diag, solver.Pos(q[r][c]))
			}
		}
		p.AddBound(diag, solver.NoBound, 1)
	}
	for s := 1; s <= 2*n-3; s++ {
		var diag []solver.Lit
		for r := 0; r < n; r++ {
			if c := s - r; c >= 0 && c < n {
				diag = append(diag, solver.Pos(q[r][c]))
			}
		}
		p.AddBound(diag, solver.NoBound, 1)
	}
	return p
}
