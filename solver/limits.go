package solver

// SetConflictLimit changes Options.ConflictLimit for the following Solve,
// Enumerate and Optimize calls: at most n conflicts per call, 0 for no
// limit (negative values count as 0). Callers that run many short searches
// on one solver, such as large-neighbourhood search, give each its budget
// this way instead of building a new solver.
func (s *Solver) SetConflictLimit(n int64) {
	s.opts.ConflictLimit = max(n, 0)
}

// SetCoreBudget changes Options.CoreBudget for the following Optimize
// calls: the conflicts spent per level on core-guided lower bounds, 0 for
// the default and negative to skip that phase.
func (s *Solver) SetCoreBudget(n int64) {
	if n == 0 {
		n = DefaultOptions().CoreBudget
	}
	s.opts.CoreBudget = n
}
