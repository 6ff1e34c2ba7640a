package encode

import (
	gs "github.com/crillab/gophersat/solver"

	"github.com/termwright/termwright/solver"
)

// refSolve finds a model of a tight program with a general-purpose SAT
// library (github.com/crillab/gophersat) through Clark completion (Clark
// 1978; for tight programs completion models are the stable models, Fages
// 1994). It is an independent reference for the encoding, and lets the
// encoder's tests run without the project's own engine. extra clauses are
// added as they are (over atoms, Pos = true).
func refSolve(p *solver.Program, extra [][]solver.Lit) ([]solver.Atom, bool) {
	n := p.NumAtoms()
	next := n
	fresh := func() int { next++; return next }
	lit := func(l solver.Lit) int {
		if l.IsNeg() {
			return -int(l.Atom())
		}
		return int(l.Atom())
	}
	var cs []gs.PBConstr
	clause := func(ls ...int) { cs = append(cs, gs.PropClause(ls...)) }
	// and returns a literal equivalent to the conjunction of body.
	and := func(body []solver.Lit) (int, bool) {
		switch len(body) {
		case 0:
			return 0, true // always true
		case 1:
			return lit(body[0]), false
		}
		v := fresh()
		all := []int{v}
		for _, l := range body {
			clause(-v, lit(l))
			all = append(all, -lit(l))
		}
		clause(all...)
		return v, false
	}
	support := make([][]int, n+1)
	always := make([]bool, n+1)
	for _, r := range p.Rules {
		b, yes := and(r.Body)
		if r.Head == 0 {
			if yes {
				clause() // empty clause: unsatisfiable
				continue
			}
			clause(-b)
			continue
		}
		if yes {
			clause(int(r.Head))
			always[r.Head] = true
			continue
		}
		clause(-b, int(r.Head))
		support[r.Head] = append(support[r.Head], b)
	}
	for _, c := range p.Choices {
		b, yes := and(c.Body)
		for _, h := range c.Heads {
			if yes {
				always[h] = true
			} else {
				support[h] = append(support[h], b)
			}
		}
	}
	for a := 1; a <= n; a++ {
		if always[a] {
			continue
		}
		clause(append([]int{-a}, support[a]...)...)
	}
	for _, bd := range p.Bounds {
		g, yes := and(bd.Cond)
		ls := make([]int, len(bd.Lits))
		for i, l := range bd.Lits {
			ls[i] = lit(l)
		}
		k := len(ls)
		if bd.Upper != solver.NoBound && bd.Upper < k {
			if yes {
				cs = append(cs, gs.AtMost(append([]int(nil), ls...), bd.Upper))
			} else {
				w := make([]int, k+1)
				for i := range w {
					w[i] = 1
				}
				w[k] = k - bd.Upper
				cs = append(cs, gs.LtEq(append(append([]int(nil), ls...), g), w, k))
			}
		}
		if bd.Lower != solver.NoBound && bd.Lower > 0 {
			if yes {
				cs = append(cs, gs.AtLeast(append([]int(nil), ls...), bd.Lower))
			} else {
				w := make([]int, k+1)
				for i := range w {
					w[i] = 1
				}
				w[k] = bd.Lower
				cs = append(cs, gs.GtEq(append(append([]int(nil), ls...), -g), w, bd.Lower))
			}
		}
	}
	for _, c := range extra {
		ls := make([]int, len(c))
		for i, l := range c {
			ls[i] = lit(l)
		}
		clause(ls...)
	}
	// Mention every variable so the problem has them all.
	clause(next, -next)
	pb := gs.ParsePBConstrs(cs)
	s := gs.New(pb)
	if s.Solve() != gs.Sat {
		return nil, false
	}
	m := s.Model()
	var model []solver.Atom
	for a := 1; a <= n; a++ {
		if m[a-1] {
			model = append(model, solver.Atom(a))
		}
	}
	return model, true
}
