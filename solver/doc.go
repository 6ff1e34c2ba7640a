// Package solver finds stable models of ground normal logic programs.
//
// A Program (program.go) holds normal rules, integrity constraints, choice
// rules, cardinality bounds and weak constraints over atoms numbered densely
// from 1. New translates it by Clark completion into clauses over the atoms
// and one extra variable per distinct rule body (completion.go), adds a
// native counting propagator for every bound (cardinality.go), and, when the
// positive dependency graph has cycles (scc.go), an unfounded-set checker with
// source pointers that learns Lin–Zhao loop formulas (unfounded.go). Search
// is conflict-driven clause learning (propagate.go, analyze.go, search.go):
// two watched literals with blockers, first-UIP learning with recursive
// minimisation, VSIDS branching on an indexed heap (heap.go), phase saving,
// Luby or LBD-driven restarts and learned-clause deletion by literal block
// distance (reduce.go). Assumptions are the first decision levels; a failed
// assumption yields a core. Enumerate blocks each model; Optimize minimises
// weak-constraint costs lexicographically by level (optimize.go,
// weightsum.go).
//
// # Representation
//
// Variables are dense uint32 numbers: 1..NumAtoms are the program's atoms,
// then body variables, then auxiliary variables (enumeration and
// optimisation). A literal (Lit) is the variable shifted left by one with the
// low bit set for the negative literal, so Pos(v) and Neg(v) double as
// internal literals. The value 0 means "none" everywhere (no literal, no
// reason, no clause), so zeroed tables are valid.
//
// Clauses live in one flat arena ([]Lit) addressed by uint32 offsets; a
// clause is two header words (size and flags; literal block distance)
// followed by its literals. The two watched literals are always the first
// two. A watch is a value (clause offset, blocker literal). Deleted clauses
// are marked and reclaimed by compaction at decision level 0, which rebuilds
// every watch list and rewrites every reference in one pass.
//
// A reason (why a variable was implied) is a uint32: 0 for decisions and
// facts, a clause offset, or a constraint index tagged in the top three bits
// (reason.go); constraint reasons are explained lazily when conflict
// analysis asks for them.
//
// # Local naming
//
// p, q are literals; v a variable; c a clause offset; k a constraint index;
// "level" is a decision level; level 0 holds facts and permanent
// consequences. Scratch buffers are named after the function that uses them.
//
// # Invariants
//
//   - vals[l] == -vals[l^1] for every literal l.
//   - Every trail entry below qhead has been propagated through clauses and
//     cardinality counters; counters count exactly those entries.
//   - For every clause in the watch lists, its first two literals are watched.
//   - When the program is not tight, every cyclic atom that is not false and
//     not queued for re-sourcing has a source body that is not false and whose
//     positive atoms in the same component have sources (acyclic).
//
// The engine knows nothing of timetables; it uses only the standard library.
package solver
