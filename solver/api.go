package solver

// This file fixes the public API of the engine so that encode, the CLI and
// tests can be written against it. Search lives in other files.

// Status is the outcome of a Solve call.
type Status int

// Outcomes of Solve.
const (
	Unknown       Status = iota // budget exhausted or cancelled
	Satisfiable                 // a stable model was found
	Unsatisfiable               // no stable model exists (under the assumptions)
)

// String names the status in lower case ("satisfiable").
func (s Status) String() string {
	switch s {
	case Satisfiable:
		return "satisfiable"
	case Unsatisfiable:
		return "unsatisfiable"
	}
	return "unknown"
}

// Stats counts the work of the engine since it was created.
type Stats struct {
	Conflicts    int64
	Decisions    int64
	Propagations int64
	Restarts     int64
	Learned      int64 // learned clauses added (including loop formulas)
	LoopFormulas int64 // loop formulas added by unfounded-set checks
	Deleted      int64 // learned clauses deleted
}

// Add returns the field-wise sum of s and o (work of several solvers).
func (s Stats) Add(o Stats) Stats {
	s.Conflicts += o.Conflicts
	s.Decisions += o.Decisions
	s.Propagations += o.Propagations
	s.Restarts += o.Restarts
	s.Learned += o.Learned
	s.LoopFormulas += o.LoopFormulas
	s.Deleted += o.Deleted
	return s
}

// Since returns the work done since an earlier snapshot before of the same
// solver (field-wise s - before).
func (s Stats) Since(before Stats) Stats {
	s.Conflicts -= before.Conflicts
	s.Decisions -= before.Decisions
	s.Propagations -= before.Propagations
	s.Restarts -= before.Restarts
	s.Learned -= before.Learned
	s.LoopFormulas -= before.LoopFormulas
	s.Deleted -= before.Deleted
	return s
}
