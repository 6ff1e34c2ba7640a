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
	require.Empty(t, allSeatingErrors(term, sched, res))
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

// TestClashesAgreeWithCost: the clashes the sectioner counts, and those
// judge counts from the criterion's words, equal timetable.Cost's
// "student clashes" over fixed and sectioned enrolments, on grid terms
// and on terms with meeting patterns and travel times. Outside check: the
// domain's cost function.
func TestClashesAgreeWithCost(t *testing.T) {
	for seed := uint64(1); seed <= 4; seed++ {
		g := medium
		g.patterns = seed%2 == 0
		term, sched := genTerm(rand.New(rand.NewPCG(seed, 9)), g)
		res, err := Section(context.Background(), term, sched, Options{Seed: int64(seed)})
		require.NoError(t, err)
		withStudents := &timetable.Schedule{Placements: sched.Placements, Enrolments: res.Enrolments}
		var cost int64
		for _, c := range timetable.Cost(term, withStudents, nil).Criteria {
			if c.Name == timetable.CritStudentClash {
				cost = c.Count
			}
		}
		require.Positive(t, cost)
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
	require.Empty(t, allSeatingErrors(term, changed, withKeep))
	jk, jf := judge(term, changed, kept, withKeep), judge(term, changed, kept, fresh)
	require.Less(t, jk.moved, jf.moved)
	// the moved students as timetable.Cost counts them (outside check)
	for _, c := range timetable.Cost(term, &timetable.Schedule{Placements: changed.Placements, Enrolments: withKeep.Enrolments}, kept).Criteria {
		if c.Name == timetable.CritMovedStudents {
			require.Equal(t, int64(jk.moved), c.Count)
		}
	}
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

// TestSeatingErrorsCatchPlantedMistakes makes sure the rule checkers used
// above are not blind: each planted mistake is reported by seatingErrors
// and (except unplaced requests, which it does not see) by timetable.Check.
func TestSeatingErrorsCatchPlantedMistakes(t *testing.T) {
	term, sched := genTerm(rand.New(rand.NewPCG(3, 3)), medium)
	res, err := Section(context.Background(), term, sched, Options{Seed: 3})
	require.NoError(t, err)
	require.Empty(t, allSeatingErrors(term, sched, res))
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
			if pl.name != "an unplaced request not reported" { // Check does not see Result.Unplaced
				require.Greater(t, len(allSeatingErrors(term, sched, r)), len(seatingErrors(term, r)), "timetable.Check should see it too")
			}
		})
	}
}

// TestPriorityTakesScarcePlaces: a course with one place, held in the kept
// sectioning by a student whose request has priority 3, goes to a new
// student asking with priority 1; the other is left unplaced with a
// reason (the number of unplaced requests is the same either way).
func TestPriorityTakesScarcePlaces(t *testing.T) {
	term := &timetable.Term{Periods: []timetable.Period{{Day: 1, Start: 540, End: 600}},
		Sections: []timetable.Section{{ID: "A-1", Course: "A", Meetings: 1, Length: 1, NoRoom: true, Limit: 1, Weeks: 1}},
		Requests: []timetable.Request{{Student: "late", Course: "A", Priority: 3}, {Student: "first", Course: "A", Priority: 1}},
	}
	sched := &timetable.Schedule{Placements: []timetable.Placement{{Section: "A-1", Meeting: 1, Period: 0}}}
	kept := &timetable.Schedule{Placements: sched.Placements, Enrolments: []timetable.Enrolment{{Student: "late", Section: "A-1"}}}
	for _, exact := range []bool{false, true} {
		res, err := section(context.Background(), term, sched, Options{Keep: kept}, config{exact: exact})
		require.NoError(t, err)
		require.Equal(t, []timetable.Enrolment{{Student: "first", Section: "A-1"}}, res.Enrolments, "exact phase %v", exact)
		require.Len(t, res.Unplaced, 1)
		require.Equal(t, 0, res.Unplaced[0].Request)
		require.Equal(t, "Course A is full (every section has reached its limit).", res.Unplaced[0].Reason)
		require.Equal(t, []Move{{Student: "late", Course: "A", From: "A-1"}}, res.Moves)
	}
}

// TestCancelledContextStillSeats: with its context already ended the
// sectioner skips the improvement and returns the first seating, which
// keeps every rule and is no better than the full run.
func TestCancelledContextStillSeats(t *testing.T) {
	term, sched := genTerm(rand.New(rand.NewPCG(5, 5)), medium)
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	quick, err := Section(ctx, term, sched, Options{Seed: 5})
	require.NoError(t, err)
	require.Empty(t, allSeatingErrors(term, sched, quick))
	full, err := Section(context.Background(), term, sched, Options{Seed: 5})
	require.NoError(t, err)
	jq, jf := judge(term, sched, nil, quick), judge(term, sched, nil, full)
	require.False(t, jq.less(jf), "quick %v, full %v", jq, jf)
	require.True(t, jf.less(jq), "the improvement should pay on this term: %v", jf)
}

// TestOddInputs: requests for unknown courses, the same course asked
// twice, sections with no room at all, a kept timetable naming sections
// and students the term no longer has: the sectioner keeps every rule
// and says why each unmet request is unmet.
func TestOddInputs(t *testing.T) {
	rng := rand.New(rand.NewPCG(31, 31))
	term, sched := genTerm(rng, medium)
	term.Requests = append(term.Requests,
		timetable.Request{Student: "S00001", Course: "NOPE"},
		timetable.Request{Student: "S00002", Course: term.Requests[0].Course, Alternatives: []string{"NOPE"}},
		timetable.Request{Student: term.Requests[0].Student, Course: term.Requests[0].Course})
	fixed := map[string]bool{}
	for _, e := range term.Enrolments {
		fixed[e.Section] = true
	}
	for i := range term.Sections {
		if rng.IntN(15) == 0 && !fixed[term.Sections[i].ID] {
			term.Sections[i].Limit, term.Sections[i].Size = 0, 0
		}
	}
	kept := &timetable.Schedule{Enrolments: []timetable.Enrolment{{Student: "gone", Section: term.Sections[0].ID}, {Student: "S00003", Section: "gone"}}}
	res, err := Section(context.Background(), term, sched, Options{Seed: 31, Keep: kept})
	require.NoError(t, err)
	require.Empty(t, allSeatingErrors(term, sched, res))
	n := len(term.Requests)
	reasons := map[int]string{}
	for _, u := range res.Unplaced {
		require.NotEmpty(t, u.Reason)
		reasons[u.Request] = u.Reason
	}
	require.Contains(t, reasons[n-3], "is not offered")
	require.Contains(t, reasons[n-1], "through another request")
	rep := NewReport(term, sched, res)
	require.Len(t, rep.Unplaced, len(res.Unplaced))
}
