package sectioning

import (
	"context"
	"math/rand/v2"
	"testing"

	"github.com/stretchr/testify/require"

	"github.com/termwright/termwright/timetable"
)

// medium is a term of some hundreds of students with every feature.
var medium = genSpec{students: 300, courses: 20, maxArrs: 2, maxParts: 4, maxSections: 5, perStudent: [2]int{2, 5},
	slack: 1.05, parents: true, alternatives: true, priorities: true, fixed: 60}

// TestSectionIsDeterministic: equal seeds give equal results.
func TestSectionIsDeterministic(t *testing.T) {
	for _, seed := range []int64{1, 2, 99} {
		term, sched := genTerm(rand.New(rand.NewPCG(uint64(seed), 1)), medium)
		a, err := Section(context.Background(), term, sched, Options{Seed: seed})
		require.NoError(t, err)
		b, err := Section(context.Background(), term, sched, Options{Seed: seed})
		require.NoError(t, err)
		require.Equal(t, a, b)
	}
}

// TestFixedEnrolmentsStay: fixed enrolments are never in the result
// (they stay in the term), a student fixed to a section of a course they
// requested is seated around it (seatingErrors would see a second section
// of the part), and a section the fixed enrolments fill takes no one.
func TestFixedEnrolmentsStay(t *testing.T) {
	g := medium
	g.fixed = 400
	term, sched := genTerm(rand.New(rand.NewPCG(4, 4)), g)
	res, err := Section(context.Background(), term, sched, Options{Seed: 4})
	require.NoError(t, err)
	require.Empty(t, seatingErrors(term, res))
	fixed := map[timetable.Enrolment]bool{}
	load := map[string]int{}
	for _, e := range term.Enrolments {
		if !fixed[timetable.Enrolment{Student: e.Student, Section: e.Section}] {
			load[e.Section]++
		}
		fixed[timetable.Enrolment{Student: e.Student, Section: e.Section}] = true
	}
	full := map[string]bool{}
	idx := term.SectionIndex()
	for sec, n := range load {
		if n >= term.SectionLimit(idx[sec]) {
			full[sec] = true
		}
	}
	aroundFixed := 0
	for _, e := range res.Enrolments {
		require.False(t, fixed[e], "%v is a fixed enrolment", e)
		require.False(t, full[e.Section], "%s was full with fixed enrolments", e.Section)
	}
	for _, e := range term.Enrolments {
		c := term.Sections[idx[e.Section]].Course
		for _, r := range res.Enrolments {
			if r.Student == e.Student && term.Sections[idx[r.Section]].Course == c {
				aroundFixed++
				break
			}
		}
	}
	require.Positive(t, aroundFixed, "the test term should seat someone around a fixed section")
}

// TestClashesAgreeWithCost: on grid terms, the clashes the sectioner
// counts (judge, from the criterion's words) equal timetable.Cost's
// "student clashes" over fixed and sectioned enrolments. Outside check:
// the domain's cost function.
func TestClashesAgreeWithCost(t *testing.T) {
	for seed := uint64(1); seed <= 4; seed++ {
		term, sched := genTerm(rand.New(rand.NewPCG(seed, 9)), medium)
		res, err := Section(context.Background(), term, sched, Options{Seed: int64(seed)})
		require.NoError(t, err)
		all := *term
		all.Enrolments = append(append([]timetable.Enrolment(nil), term.Enrolments...), res.Enrolments...)
		var cost int64
		for _, c := range timetable.Cost(&all, sched, nil).Criteria {
			if c.Name == timetable.CritStudentClash {
				cost = c.Count
			}
		}
		got := judge(term, sched, nil, res)
		require.Equal(t, cost, int64(got.clashes), "seed %d", seed)
		p := newProblem(term, sched)
		p.restoreFrom(res)
		require.Equal(t, cost, p.totals().clashes, "seed %d: the sectioner's own count", seed)
	}
}

// TestKeepWithoutChange: sectioning again against the same timetable
// with the first sectioning kept moves no one and keeps every placement.
func TestKeepWithoutChange(t *testing.T) {
	term, sched := genTerm(rand.New(rand.NewPCG(8, 8)), medium)
	first, err := Section(context.Background(), term, sched, Options{Seed: 8})
	require.NoError(t, err)
	kept := &timetable.Schedule{Placements: sched.Placements, Enrolments: first.Enrolments}
	again, err := Section(context.Background(), term, sched, Options{Seed: 9, Keep: kept})
	require.NoError(t, err)
	require.Empty(t, again.Moves)
	require.Equal(t, first.Enrolments, again.Enrolments)
	require.Equal(t, len(first.Unplaced), len(again.Unplaced))
}

// TestKeepAfterChange: after some sections move and some limits drop
// below their students, sectioning with the kept sectioning moves fewer
// students than sectioning afresh, keeps the seating rule, and lists
// exactly the changed parts as moves.
func TestKeepAfterChange(t *testing.T) {
	rng := rand.New(rand.NewPCG(12, 12))
	term, sched := genTerm(rng, medium)
	first, err := Section(context.Background(), term, sched, Options{Seed: 12})
	require.NoError(t, err)
	kept := &timetable.Schedule{Placements: sched.Placements, Enrolments: first.Enrolments}
	changed := &timetable.Schedule{Placements: append([]timetable.Placement(nil), sched.Placements...)}
	for i := range changed.Placements {
		if rng.IntN(5) == 0 {
			changed.Placements[i].Period = rng.IntN(len(term.Periods))
		}
	}
	load := map[string]int{}
	for _, e := range first.Enrolments {
		load[e.Section]++
	}
	later := *term
	later.Sections = append([]timetable.Section(nil), term.Sections...)
	for i := range later.Sections {
		if s := &later.Sections[i]; load[s.ID] > 2 && rng.IntN(8) == 0 {
			s.Limit = load[s.ID] - 2
		}
	}
	term = &later
	withKeep, err := Section(context.Background(), term, changed, Options{Seed: 12, Keep: kept})
	require.NoError(t, err)
	fresh, err := Section(context.Background(), term, changed, Options{Seed: 12})
	require.NoError(t, err)
	require.Empty(t, seatingErrors(term, withKeep))
	jk, jf := judge(term, changed, kept, withKeep), judge(term, changed, kept, fresh)
	require.Less(t, jk.moved, jf.moved)
	require.LessOrEqual(t, jk.unplaced, jf.unplaced)
	require.NotEmpty(t, withKeep.Moves)
	// every move names a real change of the student's section in a part
	before := map[[2]string]bool{}
	for _, e := range first.Enrolments {
		before[[2]string{e.Student, e.Section}] = true
	}
	after := map[[2]string]bool{}
	for _, e := range withKeep.Enrolments {
		after[[2]string{e.Student, e.Section}] = true
	}
	for _, m := range withKeep.Moves {
		require.NotEqual(t, m.From, m.To)
		if m.From != "" {
			require.True(t, before[[2]string{m.Student, m.From}], "%v", m)
			require.False(t, after[[2]string{m.Student, m.From}], "%v", m)
		}
		if m.To != "" {
			require.True(t, after[[2]string{m.Student, m.To}], "%v", m)
			require.False(t, before[[2]string{m.Student, m.To}], "%v", m)
		}
	}
	t.Logf("moved students: %d with keep, %d afresh; unplaced %d and %d; clashes %d and %d", jk.moved, jf.moved, jk.unplaced, jf.unplaced, jk.clashes, jf.clashes)
}

// TestSeatingErrorsCatchPlantedMistakes makes sure the rule checker used
// above is not blind: each planted mistake is reported.
func TestSeatingErrorsCatchPlantedMistakes(t *testing.T) {
	term, sched := genTerm(rand.New(rand.NewPCG(3, 3)), medium)
	res, err := Section(context.Background(), term, sched, Options{Seed: 3})
	require.NoError(t, err)
	require.Empty(t, seatingErrors(term, res))
	idx := term.SectionIndex()
	plants := []struct {
		name  string
		plant func(r *Result)
	}{
		{"drop one section", func(r *Result) { r.Enrolments = r.Enrolments[1:] }},
		{"a second section of a part", func(r *Result) {
			e := r.Enrolments[0]
			si := idx[e.Section]
			for _, c := range term.Courses() {
				for _, a := range c.Arrangements {
					for _, p := range a.Parts {
						if len(p.Sections) > 1 && p.Sections[0] != si && term.Sections[si].Course == c.ID {
							r.Enrolments = append(r.Enrolments, timetable.Enrolment{Student: e.Student, Section: term.Sections[p.Sections[0]].ID})
							return
						}
					}
				}
			}
		}},
		{"an unrequested course", func(r *Result) {
			r.Enrolments = append(r.Enrolments, timetable.Enrolment{Student: "nobody", Section: term.Sections[0].ID})
		}},
		{"an unplaced request not reported", func(r *Result) { r.Unplaced = nil; r.Enrolments = r.Enrolments[:len(r.Enrolments)/2] }},
		{"over a limit", func(r *Result) {
			for k := range term.Sections[0].Limit + 1 {
				r.Enrolments = append(r.Enrolments, timetable.Enrolment{Student: "x" + string(rune('a'+k%26)) + string(rune('a'+k/26)), Section: term.Sections[0].ID})
			}
		}},
	}
	for _, pl := range plants {
		t.Run(pl.name, func(t *testing.T) {
			r := &Result{Enrolments: append([]timetable.Enrolment(nil), res.Enrolments...), Unplaced: append([]Unplaced(nil), res.Unplaced...)}
			pl.plant(r)
			require.NotEmpty(t, seatingErrors(term, r))
		})
	}
}
