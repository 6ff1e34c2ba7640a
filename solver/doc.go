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
// # A live solver
//
// A Solver grows between searches (live.go): AddClause, AddBound (a
// cardinality bound exactly like Program.AddBound) and AddWeightSum (a
// weighted sum at most a limit) add permanent constraints at decision level
// 0 over existing atoms, with the same propagators and lazily built
// explanations as the constraints New makes; AddAtoms makes free atoms for
// activation literals. A conjunctive condition of two or more literals gets
// a fresh variable defined by clauses. Learned clauses stay valid, since
// additions only remove models. A contradiction found while adding makes
// every later search Unsatisfiable; literals naming no atom are errors
// wrapping ErrProgram.
//
// Clone (clone.go) copies a solver at level 0 in one pass over its tables,
// much cheaper than New, which redoes the completion, so that a
// neighbourhood step can add unit clauses to a copy and leave the original
// untouched. Only the unfounded-set checker's support graph and the weak
// constraints, read-only after New, are shared. For one Solve, assumptions
// or an assumed activation literal on the one solver cost less than a
// clone; for Optimize, whose many searches re-propagate every assumption,
// units in a clone (simplified away at level 0) cost far less.
//
// Misuse is reported the same way by every search call: an assumption
// naming no atom makes Solve, Enumerate and Optimize return without
// searching, and Err (Optimize: also its error result) says why.
//
// # Representation
//
// Variables are dense uint32 numbers: 1..NumAtoms are the program's atoms,
// then body variables, then auxiliary variables (enumeration, optimisation,
// conditions of added constraints) interleaved, in creation order, with the
// atoms of AddAtoms, which a per-variable table (added) marks as usable by
// callers. A literal (Lit) is the variable shifted left by one with the
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
