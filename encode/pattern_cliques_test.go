package encode

import (
	"sort"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// cliqueTerm is a hand-worked interval example: one staff member teaches
// eight single-pattern sections in a 4-week term.
//
//	A Mon 09:00-10:00 all weeks     E Mon 13:00-14:00 all weeks
//	B Mon 09:30-11:00 all weeks     F Tue 09:00-10:00 all weeks
//	C Mon 10:00-10:30 all weeks     G Mon 09:00-09:45 odd weeks
//	D Mon 10:45-12:00 all weeks     H Mon 09:15-09:40 even weeks
//
// Worked by hand (meetings are half-open: A and C only touch): in odd
// weeks the points 09:30-09:45 lie in A, B, G; in even weeks 09:30-09:40
// lie in A, B, H; then 10:00-10:30 in B, C and 10:45-11:00 in B, D; E and
// F are alone. So the maximal cliques of two or more are {A,B,G},
// {A,B,H}, {B,C}, {B,D}: {A,B} is in no week a maximal clique. Every clique of an
// interval graph has a common point and the maximal cliques are found by
// a sweep (Gilmore and Hoffman 1964; Golumbic, Algorithmic Graph Theory,
// ch. 8).
func cliqueTerm() *timetable.Term {
	t := &timetable.Term{
		Name:     "Clique example",
		FirstDay: time.Date(2027, 9, 6, 0, 0, 0, 0, time.UTC),
		LastDay:  time.Date(2027, 10, 1, 0, 0, 0, 0, time.UTC),
		Staff:    []timetable.Staff{{ID: "T1", Src: timetable.Source{Sheet: "Staff", Row: 2}}},
	}
	all, odd, even := t.AllWeeks(), timetable.WeekSet(0b0101), timetable.WeekSet(0b1010)
	mon, tue := timetable.DaysOf(time.Monday), timetable.DaysOf(time.Tuesday)
	add := func(id string, d timetable.DaySet, h, m, mins int, w timetable.WeekSet) {
		t.Sections = append(t.Sections, timetable.Section{ID: id, Meetings: 1, NoRoom: true, Staff: []string{"T1"},
			Times: []timetable.TimeChoice{{Days: d, Start: timetable.Clock(60*h + m), Minutes: mins, Weeks: w}},
			Src:   timetable.Source{Sheet: "Sections", Row: len(t.Sections) + 2}})
	}
	add("A", mon, 9, 0, 60, all)
	add("B", mon, 9, 30, 90, all)
	add("C", mon, 10, 0, 30, all)
	add("D", mon, 10, 45, 75, all)
	add("E", mon, 13, 0, 60, all)
	add("F", tue, 9, 0, 60, all)
	add("G", mon, 9, 0, 45, odd)
	add("H", mon, 9, 15, 25, even)
	return t
}

func TestMaximalCliquesHandWorked(t *testing.T) {
	tm := cliqueTerm()
	b := newBuilder(tm, Options{HardOnly: true})
	b.initPatterns()
	b.initSections()
	for s := range tm.Sections {
		b.c.pats[s].times = []int{0}
	}
	occ := b.occupantsOf([]int{0, 1, 2, 3, 4, 5, 6, 7}, true)
	var got []string
	for _, c := range maximalCliques(occ, tm.TeachingWeeks()) {
		var ids []string
		for _, i := range c {
			ids = append(ids, tm.Sections[occ[i].s].ID)
		}
		sort.Strings(ids)
		got = append(got, strings.Join(ids, ""))
	}
	sort.Strings(got)
	require.Equal(t, []string{"ABG", "ABH", "BC", "BD"}, got)
}

// TestCliqueBoundsHandWorked: the compiled program has exactly one "at most
// 1" bound per maximal clique of two or more sections, over their time
// atoms, and one "exactly 1" per section; never a pairwise clause.
func TestCliqueBoundsHandWorked(t *testing.T) {
	tm := cliqueTerm()
	p, cat, err := Compile(tm, Options{HardOnly: true})
	require.NoError(t, err)
	var overlap, exactly []string
	for i, bd := range p.Bounds {
		var ids []string
		for _, l := range bd.Lits {
			ids = append(ids, tm.Sections[cat.AtomInfo(l.Atom()).Section].ID)
		}
		sort.Strings(ids)
		switch {
		case cat.boundKind[i] == KindStaffNoOverlap && bd.Upper == 1 && bd.Lower == solver.NoBound:
			overlap = append(overlap, strings.Join(ids, ""))
		case bd.Lower == 1 && bd.Upper == 1:
			exactly = append(exactly, strings.Join(ids, ""))
		default:
			t.Fatalf("unexpected bound %d: %+v (%s)", i, bd, cat.boundKind[i])
		}
	}
	sort.Strings(overlap)
	require.Equal(t, []string{"ABG", "ABH", "BC", "BD"}, overlap)
	require.Len(t, exactly, 8)
	for _, r := range p.Rules {
		if r.Head == 0 && len(r.Body) == 2 {
			t.Fatalf("pairwise clause %v", r.Body)
		}
	}
	// Every section has one pattern and A and B clash: no timetable.
	s, err := solver.New(p, solver.DefaultOptions())
	require.NoError(t, err)
	require.Equal(t, solver.Unsatisfiable, s.Solve(t.Context()))
}
