// Package samples builds terms for demonstration and measurement: the demo
// workbook of an invented institution (Quillmere Polytechnic, see
// demo-term.xlsx and the demo folder of CSV files), a second demo term
// scheduled by meeting patterns on two campuses (Vellmoor University, see
// Campus, campus-term.xlsx and the campus folder), and a seeded generator of
// synthetic grid terms of any size.
//
// # The second demo
//
// Campus is written by hand, not generated: twenty pattern sections
// (Mon Wed Fri 50 minutes, Tue Thu 75 minutes, labs in alternate weeks, a
// block course in weeks 3-6, an online section), room choices with
// preferences, travel times between the buildings of two campuses, weekly
// limits and lunch breaks, unavailability in some weeks only, and a few of
// the relation kinds that take numbers. It has no period grid.
//
// # Generator
//
// Generate and GenerateWithWitness take a Config (section count and seed,
// plus optional grid and calendar sizes) and return a timetable.Term with
// realistic proportions: departments with year groups of cohorts, courses
// made of a plenary and per-cohort laboratory or tutorial sections, electives,
// staff who teach one to four sections, rooms in buildings with features
// (lab, projector, step-free) sized to the sections, students enrolled through
// their cohort plus sometimes an elective, unavailabilities, fixed meetings,
// relations and criterion weights.
//
// Feasibility is by construction. The generator first places every section
// in a hidden reference timetable (the witness) that respects rooms,
// capacities, features, week sets and clashes of staff, cohorts and rooms,
// and only then derives everything that restricts a timetable — hard
// unavailabilities, fixed meetings, hard relations, staff limits, allowed
// room lists — from what the witness leaves free. So the witness satisfies
// every hard requirement of the term it comes with, and the term is feasible.
//
// GeneratePatterns and GeneratePatternsWithWitness turn a generated grid
// term into one that mixes meeting patterns with the grid: sections whose
// witness meetings share one start time and room become pattern sections
// (the witness time among up to three weighted alternatives, allowed rooms
// as room choices), buildings get travel times the witness keeps, and some
// staff a weekly minutes limit. The witness stays feasible.
//
// # Determinism
//
// Output depends only on the Config: randomness comes from a PCG source
// seeded with Config.Seed, no map is iterated to build output, and nothing
// reads the clock. Equal configs give equal terms and byte-identical
// workbooks. Changing the generator's code changes the output; the demo
// workbook test catches that and `go generate ./samples` (or
// `go test ./samples -run TestDemo -update`) rewrites the files.
//
// # Local names
//
// In this package "plan" data (dept, yearGroup, secInfo) describe how a
// section came to be; "occ" is witness occupancy: per resource and period,
// the set of teaching weeks in use; "busy" is that occupancy with weeks
// ignored.
//
// Room capacities generated here are invented. Real capacities must not
// exceed each room's posted legal occupancy, and staff limits follow local
// agreements and institution policy.
package samples
