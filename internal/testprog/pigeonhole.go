package testprog

import (
	"fmt"

	"github.com/termwright/termwright/solver"
)

// Pigeonhole puts each of pigeons pigeons into exactly one of holes holes,
// at most one pigeon per hole: atom in(i,h). With more pigeons than holes
// it has no stable model (the pigeonhole principle); with pairwise true the
// holes are limited by binary constraints ":- in(i,h), in(j,h)." instead of
// bounds, the form whose refutation by resolution is exponentially long
// (Haken 1985), which makes it a hard benchmark.
func Pigeonhole(pigeons, holes int, pairwise bool) *solver.Program {
	p := solver.NewProgram()
	in := make([][]solver.Atom, pigeons)
	for i := range in {
		in[i] = make([]solver.Atom, holes)
		for h := range in[i] {
			in[i][h] = p.NewAtom(fmt.Sprintf("in(%d,%d)", i+1, h+1))
		}
		p.AddChoice(in[i], 1, 1)
	}
	for h := 0; h < holes; h++ {
		if pairwise {
			for i := 0; i < pigeons; i++ {
				for j := i + 1; j < pigeons; j++ {
					p.AddConstraint(solver.Pos(in[i][h]), solver.Pos(in[j][h]))
				}
			}
			continue
		}
		col := make([]solver.Lit, pigeons)
		for i := range col {
			col[i] = solver.Pos(in[i][h])
		}
		p.AddBound(col, solver.NoBound, 1)
	}
	return p
}
