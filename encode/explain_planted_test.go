package encode

import (
	"context"
	"fmt"
	"slices"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// reasonKinds lists the kinds of the reasons, sorted.
func reasonKinds(rs []Reason) []string {
	out := make([]string, len(rs))
	for i, r := range rs {
		out[i] = r.Kind
	}
	slices.Sort(out)
	return out
}

func conflictSectionIDs(c *Conflict) []string {
	out := make([]string, len(c.Sections))
	for i, s := range c.Sections {
		out[i] = s.ID
	}
	return out
}

// TestPlantedConflicts plants conflicts whose minimal cause is known and
// checks that the explanation names exactly it.
func TestPlantedConflicts(t *testing.T) {
	const mon, tue = time.Monday, time.Tuesday
	for _, k := range []int{2, 3, 4} {
		// Pigeonhole (Dirichlet's box principle): k+1 sections of cohort C,
		// each allowed only the same k periods by its own Unavailable rows,
		// cannot all meet at different times. Two more sections of C are
		// free and must not be blamed.
		t.Run(fmt.Sprintf("pigeonhole k=%d", k), func(t *testing.T) {
			b := newTerm(2, k+2).room("R1", 30).room("R2", 30)
			var want []string
			for i := 1; i <= k+1; i++ {
				id := fmt.Sprintf("P%d", i)
				want = append(want, id)
				b.section(id, staffOf(fmt.Sprintf("T%d", i)), cohortsOf("C"))
				b.unavailable(timetable.WhoSection, id, mon, 9+k, 9+k+2) // the last two periods of Monday
				b.unavailable(timetable.WhoSection, id, tue, 9, 9+k+2)   // all of Tuesday
			}
			b.section("F1", staffOf("U1"), cohortsOf("C")).section("F2", staffOf("U2"), cohortsOf("C"))
			ex, err := Explain(context.Background(), b.t, nil, ExplainOptions{Seed: 1, VerifyModels: true})
			require.NoError(t, err)
			require.Equal(t, StatusInfeasible, ex.Status)
			c := ex.Conflict
			assert.True(t, c.Minimal)
			assert.Equal(t, want, conflictSectionIDs(c))
			wantKinds := []string{KindCohortNoOverlap}
			for range k + 1 {
				wantKinds = append(wantKinds, KindSectionAvail)
			}
			slices.Sort(wantKinds)
			assert.Equal(t, wantKinds, reasonKinds(c.Reasons))
			var rows []string
			for _, r := range c.Reasons {
				if r.Kind == KindSectionAvail {
					rows = append(rows, r.Sources[1:]...) // after the section's own row
				}
			}
			assert.Len(t, rows, 2*(k+1), "every Unavailable row of the blamed sections")
			// Relaxing: the cheapest fix drops one section's availability.
			require.NotEmpty(t, ex.Corrections)
			assert.Equal(t, []string{KindSectionAvail}, reasonKinds(ex.Corrections[0].Relax))
		})
	}
	for _, k := range []int{1, 2, 3} {
		// Hall's condition (Hall 1935): k+1 sections needing a lab, all
		// fixed at Monday 09:00, with k labs, cannot all get a room.
		t.Run(fmt.Sprintf("hall k=%d", k), func(t *testing.T) {
			b := newTerm(1, 3).room("BIG", 100)
			for i := 1; i <= k; i++ {
				b.room(fmt.Sprintf("LAB%d", i), 30, "lab")
			}
			var want []string
			for i := 1; i <= k+1; i++ {
				id := fmt.Sprintf("L%d", i)
				want = append(want, id)
				b.section(id, staffOf(fmt.Sprintf("T%d", i)), needs("lab"), fixedAt(mon, 9, ""))
			}
			b.section("X", staffOf("T1"), fixedAt(mon, 10, ""))
			ex, err := Explain(context.Background(), b.t, nil, ExplainOptions{Seed: 1, VerifyModels: true})
			require.NoError(t, err)
			require.Equal(t, StatusInfeasible, ex.Status)
			c := ex.Conflict
			assert.True(t, c.Minimal)
			assert.Equal(t, want, conflictSectionIDs(c))
			var wantKinds []string
			for range k + 1 {
				wantKinds = append(wantKinds, KindFixed)
			}
			wantKinds = append(wantKinds, KindRoomSupply)
			slices.Sort(wantKinds)
			assert.Equal(t, wantKinds, reasonKinds(c.Reasons))
			for _, r := range c.Reasons {
				if r.Kind == KindRoomSupply {
					assert.Len(t, r.Sources, k, "the lab rows")
				}
			}
		})
	}
	// A fixed meeting at a time its teacher is unavailable.
	t.Run("fixed meets unavailability", func(t *testing.T) {
		b := newTerm(2, 3).room("R1", 30).
			section("A", staffOf("T"), fixedAt(tue, 10, "")).
			section("B", staffOf("T")).section("C", staffOf("V")).
			unavailable(timetable.WhoStaff, "V", mon, 9, 12).
			unavailable(timetable.WhoStaff, "T", tue, 10, 11)
		ex, err := Explain(context.Background(), b.t, nil, ExplainOptions{Seed: 1, VerifyModels: true})
		require.NoError(t, err)
		require.Equal(t, StatusInfeasible, ex.Status)
		c := ex.Conflict
		assert.True(t, c.Minimal)
		assert.Equal(t, []string{"A"}, conflictSectionIDs(c))
		require.Len(t, c.Reasons, 2)
		assert.Equal(t, KindFixed, c.Reasons[0].Kind, "most specific first")
		assert.Equal(t, KindStaffAvailability, c.Reasons[1].Kind)
		assert.Equal(t, []string{"Staff row 2", "Unavailable row 3"}, c.Reasons[1].Sources)
		assert.Contains(t, c.Reasons[1].Sentence, "Staff T (T)")
		// Two ways out, the cheaper first: move the fixed meeting (40)
		// or lift the unavailability (50).
		require.Len(t, ex.Corrections, 2)
		assert.Equal(t, []string{KindFixed}, reasonKinds(ex.Corrections[0].Relax))
		assert.Equal(t, []string{KindStaffAvailability}, reasonKinds(ex.Corrections[1].Relax))
		assert.True(t, ex.CorrectionsComplete)
	})
	t.Run("feasible", func(t *testing.T) {
		b := newTerm(1, 3).room("R1", 30).section("A", staffOf("T")).section("B", staffOf("T"))
		ex, err := Explain(context.Background(), b.t, nil, ExplainOptions{Seed: 1, VerifyModels: true})
		require.NoError(t, err)
		assert.Equal(t, StatusFeasible, ex.Status)
		require.NotNil(t, ex.Schedule)
		assert.Empty(t, timetable.HardViolations(timetable.Check(b.t, ex.Schedule)))
		assert.Nil(t, ex.Conflict)
	})
}

// TestConflictingRequests: two requests that each fit alone but not
// together are both named, with the shared teacher; the ways out are to
// drop either request (cheapest) or to let the teacher be in two places.
func TestConflictingRequests(t *testing.T) {
	b := newTerm(1, 3).room("R1", 30).room("R2", 30).
		section("A", staffOf("T")).section("B", staffOf("T")).section("C", staffOf("U"))
	reqs := []Request{
		{Section: "A", Day: time.Monday, Start: 9 * 60, Src: timetable.Source{Sheet: "Requests", Row: 2}},
		{Section: "B", Day: time.Monday, Start: 9 * 60, Src: timetable.Source{Sheet: "Requests", Row: 3}},
	}
	ex, err := Explain(context.Background(), b.t, reqs, ExplainOptions{Seed: 1, VerifyModels: true, Alternatives: 4})
	require.NoError(t, err)
	require.Equal(t, StatusRefused, ex.Status)
	assert.False(t, ex.TermInfeasible)
	for _, r := range ex.Requests {
		assert.False(t, r.Granted)
		assert.True(t, r.GrantedAlone, "request %d alone", r.Number)
		assert.Empty(t, r.Places, "no places for a request that works alone")
	}
	assert.Equal(t, []string{KindRequest, KindRequest, KindStaffNoOverlap}, reasonKinds(ex.Conflict.Reasons))
	assert.Equal(t, 1, ex.Conflict.Reasons[0].Request)
	assert.Equal(t, []string{"Requests row 2"}, ex.Conflict.Reasons[0].Sources)
	assert.Equal(t, []string{"A", "B"}, conflictSectionIDs(ex.Conflict))
	require.Len(t, ex.Corrections, 3, "%+v", ex.Corrections)
	var dropped []string
	for _, c := range ex.Corrections[:2] {
		require.Len(t, c.Relax, 1)
		assert.Equal(t, KindRequest, c.Relax[0].Kind)
		dropped = append(dropped, c.Relax[0].Sentence)
	}
	slices.Sort(dropped)
	assert.Equal(t, []string{"drop request 1: section A meets at Mon 09:00", "drop request 2: section B meets at Mon 09:00"}, dropped)
	assert.Equal(t, []string{KindStaffNoOverlap}, reasonKinds(ex.Corrections[2].Relax))
	assert.Less(t, ex.Corrections[1].Cost, ex.Corrections[2].Cost, "dropping a request is cheaper than double-booking")
	assert.True(t, ex.CorrectionsComplete)
	// Each way out works: the term with the other request alone has a timetable.
	for i := range reqs {
		other, err := Explain(context.Background(), b.t, reqs[1-i:2-i], ExplainOptions{Seed: 1, VerifyModels: true, NoCost: true})
		require.NoError(t, err)
		assert.Equal(t, StatusGranted, other.Status)
	}
}

// TestRequestAgainstItsOwnSection: a one-meeting section asked for twice
// can only drop one of the requests (no requirement's relaxation helps); a
// request for a start that cannot hold the meeting names only the request.
func TestRequestAgainstItsOwnSection(t *testing.T) {
	b := newTerm(1, 3).room("R1", 30).section("A", staffOf("T")).section("L", staffOf("U"), meetings(1, 2))
	reqs := []Request{{Section: "A", Day: time.Monday, Start: 9 * 60}, {Section: "A", Day: time.Monday, Start: 10 * 60}}
	ex, err := Explain(context.Background(), b.t, reqs, ExplainOptions{Seed: 1, VerifyModels: true})
	require.NoError(t, err)
	require.Equal(t, StatusRefused, ex.Status)
	assert.Equal(t, []string{KindRequest, KindRequest}, reasonKinds(ex.Conflict.Reasons))
	// Dropping the 10:00 request leaves A at 09:00 and room R1 free for L
	// at 10:00-12:00; dropping the 09:00 one leaves A at 10:00, where L
	// needs R1 too, so the room supply must give as well.
	require.Len(t, ex.Corrections, 2)
	assert.Equal(t, []string{KindRequest}, reasonKinds(ex.Corrections[0].Relax))
	assert.Equal(t, 2, ex.Corrections[0].Relax[0].Request)
	assert.Equal(t, []string{KindRequest, KindRoomSupply}, reasonKinds(ex.Corrections[1].Relax))
	assert.Equal(t, 1, ex.Corrections[1].Relax[0].Request)
	assert.True(t, ex.CorrectionsComplete, "no other relaxation exists, and that is certain")

	ex, err = Explain(context.Background(), b.t, []Request{{Section: "L", Day: time.Monday, Start: 11 * 60}}, ExplainOptions{Seed: 1, VerifyModels: true})
	require.NoError(t, err)
	require.Equal(t, StatusRefused, ex.Status)
	require.Len(t, ex.Conflict.Reasons, 1)
	assert.Contains(t, ex.Conflict.Reasons[0].Sentence, "cannot start there")
	assert.Equal(t, []Place{{At: "Mon 09:00", Period: 0, Room: "R1"}, {At: "Mon 10:00", Period: 1, Room: "R1"}}, ex.Requests[0].Places)
}

// TestSectionThatCannotFit: a section whose meeting is longer than any day
// is its own reason.
func TestSectionThatCannotFit(t *testing.T) {
	b := newTerm(2, 2).room("R1", 30).section("A", staffOf("T")).section("LONG", staffOf("U"), meetings(1, 3))
	ex, err := Explain(context.Background(), b.t, nil, ExplainOptions{Seed: 1, VerifyModels: true})
	require.NoError(t, err)
	require.Equal(t, StatusInfeasible, ex.Status)
	assert.Equal(t, []string{"LONG"}, conflictSectionIDs(ex.Conflict))
	require.Len(t, ex.Conflict.Reasons, 1)
	assert.Equal(t, KindSection, ex.Conflict.Reasons[0].Kind)
	assert.Contains(t, ex.Conflict.Reasons[0].Sentence, "no run of consecutive periods")
	assert.Empty(t, ex.Corrections)
	assert.True(t, ex.CorrectionsComplete)
}

// TestTinyBudget: with a budget too small to decide anything the answer is
// "unknown" or a conflict marked not minimal, never a wrong claim.
func TestTinyBudget(t *testing.T) {
	b := newTerm(1, 5)
	for i := 0; i < 5; i++ {
		b.room(fmt.Sprintf("R%d", i), 30)
	}
	for i := 0; i < 6; i++ {
		b.section(fmt.Sprintf("S%d", i), staffOf(fmt.Sprintf("T%d", i)), cohortsOf("C"))
	}
	ex, err := Explain(context.Background(), b.t, nil, ExplainOptions{Seed: 1, CheckConflicts: 1})
	require.NoError(t, err)
	switch ex.Status {
	case StatusUnknown:
		assert.Nil(t, ex.Conflict)
	case StatusInfeasible:
		// Pigeonhole: six sections of one cohort in five periods; if the
		// budget sufficed to prove it, what is named must hold up.
		x := newTestExplainer(t, b.t)
		var set []int
		for _, s := range ex.Conflict.Sections {
			set = append(set, x.secGroup[slices.IndexFunc(b.t.Sections, func(sec timetable.Section) bool { return sec.ID == s.ID })])
		}
		set = append(set, x.cat.groupKey[KindCohortNoOverlap+"\x00C"])
		assert.Equal(t, solver.Unsatisfiable, x.statusOf(t, x.onlyOn(set)))
	default:
		t.Fatalf("status %s: the term has no timetable", ex.Status)
	}
	// Cancelled before it starts: the counting proof needs no search, but
	// nothing confirms that the set is minimal.
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	ex, err = Explain(ctx, b.t, nil, ExplainOptions{Seed: 1})
	require.NoError(t, err)
	require.Equal(t, StatusInfeasible, ex.Status)
	assert.True(t, ex.Conflict.Counted)
	assert.False(t, ex.Conflict.Minimal)
	// Without a counting proof a cancelled run decides nothing.
	other := newTerm(2, 3).room("R1", 30).
		section("A", staffOf("T"), fixedAt(time.Tuesday, 10, "")).
		unavailable(timetable.WhoStaff, "T", time.Tuesday, 10, 11)
	ex, err = Explain(ctx, other.t, nil, ExplainOptions{Seed: 1})
	require.NoError(t, err)
	assert.Equal(t, StatusUnknown, ex.Status)
}

// TestCountedOverload: a teacher with six one-period sections and five
// free periods is a pigeonhole (Dirichlet's box principle) proved by
// counting, without a search for the proof; any five of the sections
// would fit, so the conflict names exactly six sections, the teacher's
// no-overlap and availability.
func TestCountedOverload(t *testing.T) {
	b := newTerm(2, 4)
	for i := 0; i < 6; i++ {
		b.room(fmt.Sprintf("R%d", i), 30)
	}
	for i := 0; i < 6; i++ {
		b.section(fmt.Sprintf("S%d", i), staffOf("T"), cohortsOf(fmt.Sprintf("C%d", i)))
	}
	b.section("OTHER", staffOf("U"), cohortsOf("C0"))
	b.unavailable(timetable.WhoStaff, "T", time.Tuesday, 9, 12)
	ex, err := Explain(context.Background(), b.t, nil, ExplainOptions{Seed: 1, VerifyModels: true})
	require.NoError(t, err)
	require.Equal(t, StatusInfeasible, ex.Status)
	c := ex.Conflict
	assert.True(t, c.Counted)
	assert.True(t, c.Minimal)
	assert.Equal(t, []string{"S0", "S1", "S2", "S3", "S4", "S5"}, conflictSectionIDs(c))
	assert.Equal(t, []string{KindStaffAvailability, KindStaffNoOverlap}, reasonKinds(c.Reasons))
	require.NotEmpty(t, ex.Corrections)
	assert.Equal(t, []string{KindStaffAvailability}, reasonKinds(ex.Corrections[0].Relax))
}

// TestLazyRoomFamily: eleven sections fixed at one time with ten rooms. The
// ten rooms are lightly loaded over the week, so the compiler leaves their
// Hall constraint for Decode to find; the explanation adds it when a model
// overfills them, rebuilds the engine and names it.
func TestLazyRoomFamily(t *testing.T) {
	b := newTerm(2, 4)
	for i := 0; i < 10; i++ {
		b.room(fmt.Sprintf("R%02d", i), 30)
	}
	for i := 0; i < 11; i++ {
		b.section(fmt.Sprintf("S%02d", i), staffOf(fmt.Sprintf("T%d", i)), fixedAt(time.Monday, 9, ""))
	}
	ex, err := Explain(context.Background(), b.t, nil, ExplainOptions{Seed: 1, VerifyModels: true})
	require.NoError(t, err)
	require.Equal(t, StatusInfeasible, ex.Status)
	assert.GreaterOrEqual(t, ex.Stats.Families, 1, "a room family was added")
	assert.GreaterOrEqual(t, ex.Stats.Rebuilds, 1)
	c := ex.Conflict
	assert.True(t, c.Minimal)
	assert.Len(t, c.Sections, 11)
	kinds := reasonKinds(c.Reasons)
	assert.Equal(t, 11, strings.Count(strings.Join(kinds, ","), KindFixed))
	assert.Contains(t, kinds, KindRoomSupply)
}

// TestRoomAssignmentConflict: every period on its own has rooms enough,
// but a two-period meeting would have to change rooms halfway: the room
// nogood that Decode proves is named as the room assignment requirement.
func TestRoomAssignmentConflict(t *testing.T) {
	roomsOnly := func(ids ...string) func(*timetable.Section) {
		return func(s *timetable.Section) { s.Rooms = ids }
	}
	b := newTerm(1, 3).room("R1", 30).room("R2", 30).
		section("A", staffOf("TA"), meetings(1, 2), fixedAt(time.Monday, 9, "")).
		section("B", staffOf("TB"), roomsOnly("R1"), fixedAt(time.Monday, 9, "")).
		section("C", staffOf("TC"), roomsOnly("R2"), fixedAt(time.Monday, 10, ""))
	ex, err := Explain(context.Background(), b.t, nil, ExplainOptions{Seed: 1, VerifyModels: true})
	require.NoError(t, err)
	require.Equal(t, StatusInfeasible, ex.Status)
	assert.GreaterOrEqual(t, ex.Stats.Nogoods, 1)
	c := ex.Conflict
	assert.True(t, c.Minimal)
	assert.Equal(t, []string{"A", "B", "C"}, conflictSectionIDs(c))
	assert.Contains(t, reasonKinds(c.Reasons), KindRoomAssignment)
	for _, r := range c.Reasons {
		if r.Kind == KindRoomAssignment {
			assert.Contains(t, r.Sentence, "sections A, B, C")
		}
	}
}

// TestReasonsInWorkbookOrder (issue 12, item 23): reasons of one kind and
// the corrections of equal cost come in workbook row order — "Pair 2 before
// Pair 10" on Relations row 3 before "Pair 10 before Pair 11" on row 11 —
// although their sentences sort the other way.
func TestReasonsInWorkbookOrder(t *testing.T) {
	b := newTerm(1, 2)
	for _, id := range []string{"Pair 2", "Pair 10", "Pair 11"} {
		b.section(id, staffOf("T"+id), noRoom)
	}
	rel := func(row int, secs ...string) timetable.Relation {
		return timetable.Relation{Kind: timetable.Before, Sections: secs, Hard: true, Src: timetable.Source{Sheet: "Relations", Row: row}}
	}
	b.t.Relations = []timetable.Relation{rel(11, "Pair 10", "Pair 11"), rel(3, "Pair 2", "Pair 10")}
	ex, err := Explain(context.Background(), b.t, nil, ExplainOptions{Seed: 1, VerifyModels: true})
	require.NoError(t, err)
	require.Equal(t, StatusInfeasible, ex.Status)
	var rows []string
	for _, r := range ex.Conflict.Reasons {
		rows = append(rows, r.Sources...)
	}
	assert.Equal(t, []string{"Relations row 3", "Relations row 11"}, rows)
	require.Len(t, ex.Corrections, 2)
	assert.Equal(t, []string{"Relations row 3"}, ex.Corrections[0].Relax[0].Sources)
	assert.Equal(t, []string{"Relations row 11"}, ex.Corrections[1].Relax[0].Sources)
}
