// Package testprog generates classic ground logic programs for tests and
// benchmarks of the solver package: N-queens, pigeonhole, Hamiltonian cycles
// with reachability (non-tight), Latin squares, random 3-SAT written as a
// program, and random small programs that mix every construct.
//
// Every generator is deterministic (random ones take a seed), names its
// atoms with ground terms such as q(3,5) so that programs print and read
// back, and returns the atoms that identify a solution when the encoding
// has auxiliary atoms (project enumeration onto them). Known solution
// counts are documented on each generator with their source.
package testprog
