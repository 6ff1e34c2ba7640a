package timetable

import (
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// seatTerm is ckTerm with courses (invented data):
//
//	BIO, one arrangement: part Main BIO-101; part Lab PHY-110 (limit 1)
//	     and CHE-210 (limit 2), both with parent BIO-101
//	ART, arrangement A: ART-120 (limit 3; st1 and st2 are fixed in it);
//	     arrangement B: ONL-100
//
// and requests: st7 BIO, st7 ART, st8 BIO (or instead ART), st9 ART.
func seatTerm() *Term {
	t := ckTerm()
	set := func(id, course, arr, part, parent string, limit int) {
		i := t.SectionIndex()[id]
		s := &t.Sections[i]
		s.Course, s.Arrangement, s.Part, s.Parent, s.Limit = course, arr, part, parent, limit
	}
	set("BIO-101", "BIO", "", "Main", "", 0)
	set("PHY-110", "BIO", "", "Lab", "BIO-101", 1)
	set("CHE-210", "BIO", "", "Lab", "BIO-101", 2)
	set("ART-120", "ART", "A", "", "", 3)
	set("ONL-100", "ART", "B", "", "", 0)
	rq := func(row int, st, course string, alts ...string) Request {
		return Request{Student: st, Course: course, Alternatives: alts, Src: Source{"Course requests", row}}
	}
	t.Requests = []Request{rq(2, "st7", "BIO"), rq(3, "st7", "ART"), rq(4, "st8", "BIO", "ART"), rq(5, "st9", "ART")}
	return t
}

// seatEn is a sectioned enrolment read from Class lists row `row`.
func seatEn(row int, st, sec string) Enrolment {
	return Enrolment{Student: st, Section: sec, Src: Source{ClassListSheet, row}}
}

// seatSchedule is ckSchedule with a seating that keeps the rule:
// st7 BIO-101 + PHY-110 and ONL-100 (ART by arrangement B); st8 BIO-101 +
// CHE-210; st9 ART-120.
func seatSchedule() *Schedule {
	s := ckSchedule()
	s.Enrolments = []Enrolment{
		seatEn(2, "st7", "BIO-101"), seatEn(3, "st7", "PHY-110"), seatEn(4, "st7", "ONL-100"),
		seatEn(5, "st8", "BIO-101"), seatEn(6, "st8", "CHE-210"),
		seatEn(7, "st9", "ART-120"),
	}
	return s
}

// seatViolations keeps the violations of the seating rule.
func seatViolations(vs []Violation) []Violation {
	var out []Violation
	for _, v := range vs {
		if v.Rule == RuleSeating || v.Rule == RuleSectionLimit || v.Rule == RuleNotRequested {
			out = append(out, v)
		}
	}
	return out
}

// without drops the sectioned enrolment of student st in section sec.
func without(s *Schedule, st, sec string) {
	out := s.Enrolments[:0]
	for _, e := range s.Enrolments {
		if e.Student != st || e.Section != sec {
			out = append(out, e)
		}
	}
	s.Enrolments = out
}

// TestCheckSeating checks each part of the seating rule (Course's doc
// comment, the source of every expectation) on a hand-made change of a
// valid seating.
func TestCheckSeating(t *testing.T) {
	tm, s := seatTerm(), seatSchedule()
	require.Empty(t, HardViolations(Check(tm, s)), "the seating fixture is valid")

	cases := []struct {
		name   string
		mutate func(t *Term, s *Schedule)
		want   []string // rule: message part, one per expected violation
	}{
		{"alternative instead of the course", func(_ *Term, s *Schedule) {
			without(s, "st8", "BIO-101")
			without(s, "st8", "CHE-210")
			s.Enrolments = append(s.Enrolments, seatEn(8, "st8", "ONL-100")) // ART, st8's Or instead
		}, nil},
		{"unknown section", func(_ *Term, s *Schedule) { s.Enrolments = append(s.Enrolments, seatEn(8, "st9", "XYZ-1")) },
			[]string{"seating: student st9 is sectioned into XYZ-1, which is not a section of the term (Class lists row 8)"}},
		{"section of no course", func(t *Term, _ *Schedule) { t.Sections[3].Course, t.Sections[3].Arrangement = "", "" },
			[]string{"seating: student st7 is sectioned into ONL-100, which belongs to no course (its Course is blank) (Class lists row 4; Sections row 5)"}},
		{"two sections of one part", func(_ *Term, s *Schedule) { s.Enrolments = append(s.Enrolments, seatEn(8, "st7", "CHE-210")) },
			[]string{"seating: student st7 holds 2 sections of the part Lab of course BIO (CHE-210 and PHY-110); a student takes one (Class lists rows 2, 3 and 8)"}},
		{"no section of a part", func(_ *Term, s *Schedule) { without(s, "st8", "CHE-210") },
			[]string{"seating: student st8 takes course BIO but no section of its part Lab (one of CHE-210 or PHY-110) (Class lists row 5)"}},
		{"parent not held", func(_ *Term, s *Schedule) { without(s, "st8", "BIO-101") }, []string{
			"seating: student st8 takes course BIO but no section of its part Main (section BIO-101) (Class lists row 6)",
			"seating: student st8 holds CHE-210 of course BIO but not its parent section BIO-101 (Class lists row 6; Sections row 3)"}},
		{"two arrangements", func(_ *Term, s *Schedule) { s.Enrolments = append(s.Enrolments, seatEn(8, "st7", "ART-120")) }, []string{
			"seating: student st7 holds sections of two arrangements of course ART: ONL-100 (arrangement B) and ART-120 (arrangement A); a student takes one arrangement (Class lists rows 4 and 8)",
			// st1, st2 fixed + st9 + st7 = 4, limit 3.
			"section limit: section ART-120 of course ART holds 4 students (fixed and sectioned), more than its limit of 3 (Sections row 6)"}},
		// ART-120: st1, st2 fixed + st9 + st10 = 4 students, limit 3.
		{"over the limit", func(t *Term, s *Schedule) {
			t.Requests = append(t.Requests, Request{Student: "st10", Course: "ART"})
			s.Enrolments = append(s.Enrolments, seatEn(8, "st10", "ART-120"))
		}, []string{"section limit: section ART-120 of course ART holds 4 students (fixed and sectioned), more than its limit of 3 (Sections row 6)"}},
		{"limit falls back on the expected size", func(t *Term, s *Schedule) {
			t.Sections[0].Size = 1 // BIO-101: no Limit, so its Expected size, 1; st1, st2 fixed + st7, st8
		}, []string{"section limit: section BIO-101 of course BIO holds 4 students (fixed and sectioned), more than its limit of 1 (Sections row 2)"}},
		{"course not requested", func(_ *Term, s *Schedule) {
			s.Enrolments = append(s.Enrolments, seatEn(8, "st9", "BIO-101"), seatEn(9, "st9", "CHE-210"))
		}, []string{"not requested: student st9 is sectioned into course BIO, which no request of theirs names (as a course or under Or instead)"}},
		{"one request met by two courses", func(_ *Term, s *Schedule) { s.Enrolments = append(s.Enrolments, seatEn(8, "st8", "ONL-100")) },
			[]string{"not requested: student st8 is sectioned into courses BIO and ART, more than their requests name (each request is met by one course at most) (Course requests row 4)"}},
		{"fixed and sectioned", func(t *Term, s *Schedule) {
			t.Requests = append(t.Requests, Request{Student: "st1", Course: "BIO"})
			s.Enrolments = append(s.Enrolments, seatEn(8, "st1", "BIO-101"), seatEn(9, "st1", "PHY-110"))
		}, []string{
			"seating: student st1 is fixed in BIO-101 on the Enrolments sheet and sectioned into it again (Class lists row 8; Enrolments row 2)",
			"section limit: section PHY-110 of course BIO holds 2 students (fixed and sectioned), more than its limit of 1 (Sections row 4)"}},
		{"sectioned twice", func(_ *Term, s *Schedule) { s.Enrolments = append(s.Enrolments, seatEn(8, "st9", "ART-120")) },
			[]string{"seating: student st9 is sectioned into ART-120 twice (Class lists rows 7 and 8)"}},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			tm, s := seatTerm(), seatSchedule()
			tc.mutate(tm, s)
			var got []string
			for _, v := range seatViolations(Check(tm, s)) {
				assert.True(t, v.Hard, v.Msg)
				got = append(got, v.Rule+": "+v.Msg)
			}
			assert.ElementsMatch(t, tc.want, got)
		})
	}
}

// TestCostSeating computes each sectioning criterion by hand from its
// definition in criteria.go on seatTerm.
func TestCostSeating(t *testing.T) {
	cases := []struct {
		name   string
		mutate func(t *Term, s *Schedule)
		kept   func(k *Schedule) // changes a copy of seatSchedule used as the kept timetable; nil = none
		crit   string
		count  int64
	}{
		{"all requests placed", func(*Term, *Schedule) {}, nil, CritUnplaced, 0},
		// st9's only request, ART, is met by nothing any more → 1.
		{"one unplaced", func(_ *Term, s *Schedule) { without(s, "st9", "ART-120") }, nil, CritUnplaced, 1},
		// st8 asked for BIO or instead ART and holds ONL-100 (ART): met → 0.
		{"met by the alternative", func(_ *Term, s *Schedule) {
			without(s, "st8", "BIO-101")
			without(s, "st8", "CHE-210")
			s.Enrolments = append(s.Enrolments, seatEn(8, "st8", "ONL-100"))
		}, nil, CritUnplaced, 0},
		// st1 is fixed in BIO-101: a request of st1 for BIO is met (placed = holds a section) → 0; one for a course nobody teaches → 1.
		{"met by a fixed enrolment, unknown course not", func(t *Term, _ *Schedule) {
			t.Requests = append(t.Requests, Request{Student: "st1", Course: "BIO"}, Request{Student: "st1", Course: "GEO"})
		}, nil, CritUnplaced, 1},
		// Nobody sectioned: st7 (2), st8 (1), st9 (1) → 4.
		{"nobody sectioned", func(_ *Term, s *Schedule) { s.Enrolments = nil }, nil, CritUnplaced, 4},
		{"moved none", func(*Term, *Schedule) {}, func(*Schedule) {}, CritMovedStudents, 0},
		// st8 CHE-210 → PHY-110: kept (st8, CHE-210) still in BIO, not in CHE-210 → 1; (st8, BIO-101) kept → 0.
		{"moved one lab", func(_ *Term, s *Schedule) {
			without(s, "st8", "CHE-210")
			s.Enrolments = append(s.Enrolments, seatEn(8, "st8", "PHY-110"))
		}, func(*Schedule) {}, CritMovedStudents, 1},
		// st7 ONL-100 → ART-120 (the other arrangement of ART) → 1.
		{"moved to another arrangement", func(_ *Term, s *Schedule) {
			without(s, "st7", "ONL-100")
			s.Enrolments = append(s.Enrolments, seatEn(8, "st7", "ART-120"))
		}, func(*Schedule) {}, CritMovedStudents, 1},
		// st8 loses BIO altogether: not "still placed in that section's course" → 0 moved (1 unplaced instead).
		{"dropped is not moved", func(_ *Term, s *Schedule) {
			without(s, "st8", "BIO-101")
			without(s, "st8", "CHE-210")
		}, func(*Schedule) {}, CritMovedStudents, 0},
		// Fixed enrolments never count: the kept file's st1 rows are not sectioned ones.
		{"no kept class lists", func(*Term, *Schedule) {}, func(k *Schedule) { k.Enrolments = nil }, CritMovedStudents, 0},
		// PHY-110 to Mon 09:00 (period 0, with BIO-101 m1): st7 takes both → 1 student × 1 period.
		{"clash of a sectioned student", func(_ *Term, s *Schedule) { ckPlace(s, 3, 0, "R3") }, nil, CritStudentClash, 1},
		// CHE-210 on Mon 09:00–11:00 (periods 0, 1) meets BIO-101 m1 (p0) and PHY-110 (p1):
		// st8 (BIO-101, CHE-210) 1 period; st7 is in PHY-110 and BIO-101 but not CHE-210 → 0. Total 1.
		{"only the shared sections count", func(_ *Term, s *Schedule) { ckPlace(s, 2, 0, "R2") }, nil, CritStudentClash, 1},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			tm, s := seatTerm(), seatSchedule()
			tc.mutate(tm, s)
			var kept *Schedule
			if tc.kept != nil {
				kept = seatSchedule()
				tc.kept(kept)
			}
			got := Cost(tm, s, kept).Criterion(tc.crit)
			assert.Equal(t, tc.count, got.Count, "count")
			assert.Equal(t, tc.count, got.Cost, "cost (default weight 1)")
		})
	}
}

// TestStudentClashTravel checks the travel part of "student clashes" for
// pattern sections (criteria.go): two meetings on a common day in a common
// week with less free time between them than the travel between their
// rooms count 1 per student for the pair; enough time, different weeks or
// one room count nothing.
func TestStudentClashTravel(t *testing.T) {
	base := func() (*Term, *Schedule) {
		tm := ckTerm()
		all := tm.AllWeeks()
		tm.Sections = []Section{
			{ID: "MAT-150", Size: 10, Meetings: 1, Length: 1, Weeks: all, Src: Source{"Sections", 2},
				Times: []TimeChoice{{Days: DaysOf(1), Start: 9 * 60, Minutes: 50, Weeks: all}}},
			{ID: "ECO-210", Size: 10, Meetings: 1, Length: 1, Weeks: all, Src: Source{"Sections", 3},
				Times: []TimeChoice{{Days: DaysOf(1, 3), Start: 10 * 60, Minutes: 50, Weeks: all}}},
		}
		tm.Relations, tm.Unavailable = nil, nil
		tm.Travel = []Travel{{From: "North", To: "South", Minutes: 15}}
		tm.Enrolments = []Enrolment{{Student: "st1", Section: "MAT-150"}, {Student: "st1", Section: "ECO-210"}, {Student: "st2", Section: "ECO-210"}}
		s := &Schedule{Placements: []Placement{
			{Section: "MAT-150", Meeting: 1, Period: -1, Time: 1, Room: "R1"}, // North, Mon 09:00–09:50
			{Section: "ECO-210", Meeting: 1, Period: -1, Time: 1, Room: "R2"}, // South, Mon Wed 10:00–10:50
		}}
		return tm, s
	}
	cases := []struct {
		name   string
		mutate func(t *Term, s *Schedule)
		want   int64
	}{
		// Mon 09:50 → 10:00 is 10 free minutes, North → South takes 15: st1 → 1 (st2 takes one of the two only).
		{"too little time", func(*Term, *Schedule) {}, 1},
		{"enough time", func(t *Term, _ *Schedule) { t.Travel[0].Minutes = 10 }, 0},
		{"one building", func(_ *Term, s *Schedule) { s.Placements[1].Room = "R3" }, 0}, // R3 is North too
		{"different weeks", func(t *Term, _ *Schedule) {
			t.Sections[0].Times[0].Weeks, t.Sections[1].Times[0].Weeks = 0x5555&t.AllWeeks(), 0xaaaa&t.AllWeeks()
		}, 0},
		{"sectioned students count too", func(t *Term, s *Schedule) {
			for i := range t.Sections {
				t.Sections[i].Course = t.Sections[i].ID
			}
			t.Requests = []Request{{Student: "st3", Course: "MAT-150"}, {Student: "st3", Course: "ECO-210"}}
			s.Enrolments = []Enrolment{{Student: "st3", Section: "MAT-150"}, {Student: "st3", Section: "ECO-210"}}
		}, 2},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			tm, s := base()
			tc.mutate(tm, s)
			assert.Equal(t, tc.want, Cost(tm, s, nil).Criterion(CritStudentClash).Count)
			// TravelClashes lists what Cost counts: one per student and pair.
			tcs := TravelClashes(tm, s)
			require.Len(t, tcs, int(tc.want))
			for i, c := range tcs {
				assert.Equal(t, []string{"MAT-150", "ECO-210"}, []string{c.First, c.Second})
				assert.Equal(t, Source{"Sections", 2}, c.Src)
				assert.Equal(t, "Mon 09:50–10:00 (10 minutes to get from R1 to R2, which takes 15 minutes)", c.At)
				if i > 0 {
					assert.Less(t, tcs[i-1].Student, c.Student, "sorted by student")
				}
			}
			var clashes []string
			for _, v := range Check(tm, s) {
				if v.Rule == RuleStudentClash {
					clashes = append(clashes, v.Msg)
				}
			}
			if tc.want == 0 {
				assert.Empty(t, clashes)
				return
			}
			require.Len(t, clashes, 1)
			assert.True(t, strings.Contains(clashes[0], "which leave too little time between them at Mon 09:50–10:00 (10 minutes to get from R1 to R2, which takes 15 minutes)"), clashes[0])
		})
	}
}
