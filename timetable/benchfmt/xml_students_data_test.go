package benchfmt

import (
	"context"
	"math/rand/v2"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"github.com/termwright/termwright/encode"
	"github.com/termwright/termwright/timetable"
)

// smallXML are the four small shared instances.
var smallXML = []string{"bet-sum18", "lums-sum17", "pu-cs-fal07", "wbg-fal10"}

// firstFitSeating seats the students of term (its requests in order) in
// first fit: for each request, the first arrangement and in it, part by
// part with parents' parts first, the first section under its limit whose
// parent the student holds (backtracking within the course when a part
// has no such section). A request that cannot be seated so is left out.
// It knows nothing of times: students' clashes are left to chance.
func firstFitSeating(term *timetable.Term) []timetable.Enrolment {
	idx := term.SectionIndex()
	held := make([]int, len(term.Sections))
	courses := map[string]timetable.Course{}
	for _, c := range term.Courses() {
		courses[c.ID] = c
	}
	var out []timetable.Enrolment
	for _, r := range term.Requests {
		for _, a := range courses[r.Course].Arrangements {
			parts := parentsFirst(term, a.Parts, idx)
			chosen := map[string]bool{}
			var pick []int
			var try func(k int) bool
			try = func(k int) bool {
				if k == len(parts) {
					return true
				}
				for _, si := range parts[k].Sections {
					s := term.Sections[si]
					if held[si] >= term.SectionLimit(si) || (s.Parent != "" && !chosen[s.Parent]) {
						continue
					}
					chosen[s.ID] = true
					pick = append(pick, si)
					if try(k + 1) {
						return true
					}
					chosen[s.ID] = false
					pick = pick[:len(pick)-1]
				}
				return false
			}
			if try(0) {
				for _, si := range pick {
					held[si]++
					out = append(out, timetable.Enrolment{Student: r.Student, Section: term.Sections[si].ID})
				}
				break
			}
		}
	}
	return out
}

// parentsFirst orders parts so that the part of every parent section comes
// before the parts of its children.
func parentsFirst(term *timetable.Term, parts []timetable.Part, idx map[string]int) []timetable.Part {
	partOf := map[string]int{}
	for pi, p := range parts {
		for _, si := range p.Sections {
			partOf[term.Sections[si].ID] = pi
		}
	}
	done := make([]bool, len(parts))
	var out []timetable.Part
	for len(out) < len(parts) {
		progress := false
		for pi, p := range parts {
			if done[pi] {
				continue
			}
			ready := true
			for _, si := range p.Sections {
				if par := term.Sections[si].Parent; par != "" {
					if _, ok := idx[par]; ok && !done[partOf[par]] {
						ready = false
					}
				}
			}
			if ready {
				done[pi], progress = true, true
				out = append(out, p)
			}
		}
		if !progress { // a cycle of parents: keep the rest in order
			for pi, p := range parts {
				if !done[pi] {
					out = append(out, p)
				}
			}
			break
		}
	}
	return out
}

// solvedTimetable is a first valid timetable of term from the engine.
func solvedTimetable(t *testing.T, term *timetable.Term) *timetable.Schedule {
	t.Helper()
	ctx, cancel := context.WithTimeout(context.Background(), 5*time.Minute)
	defer cancel()
	res, err := encode.Solve(ctx, term, encode.SolveOptions{Seed: 1})
	require.NoError(t, err)
	require.NotNil(t, res.Schedule, "a first timetable within 5 minutes")
	return res.Schedule
}

// hardCount is the number of hard violations timetable.Check finds.
func hardCount(term *timetable.Term, s *timetable.Schedule) int {
	return len(timetable.HardViolations(timetable.Check(term, s)))
}

// TestXMLStudentCostAgreesWithCost: on the four small shared instances
// with first-fit seatings over random timetables, the competition's
// student part (XMLCost, from the published rules: 1 per student per pair
// of classes sharing a day and a week whose times overlap or leave less
// than the travel time between their rooms) times the student weight
// equals timetable.Cost's "student clashes" on the mapped term.
func TestXMLStudentCostAgreesWithCost(t *testing.T) {
	xmlDataDir(t)
	for _, name := range smallXML {
		t.Run(name, func(t *testing.T) {
			in := readSharedXML(t, name)
			term := in.Term()
			r := rand.New(rand.NewPCG(11, uint64(len(name))))
			for round := 0; round < 3; round++ {
				s := randomSchedule(term, r)
				s.Enrolments = firstFitSeating(term)
				sol, err := XMLSolutionOf(in, s, XMLRunInfo{})
				require.NoError(t, err)
				total, parts := XMLCost(in, sol)
				got, by := ownCost(term, s)
				assert.Equal(t, int64(parts.Student*in.Weights.Student), by[timetable.CritStudentClash], "student part, round %d", round)
				assert.Equal(t, int64(total), got-by[timetable.CritUnplaced], "total without unplaced requests, round %d", round)
			}
		})
	}
}

// TestXMLSectioningAgreesWithCheck: on the four small shared instances, a
// valid timetable from the engine with a first-fit seating is valid by the
// competition's rules (XMLHardViolations 0) exactly when timetable.Check
// accepts it and every request is placed (our "unplaced requests" is a
// cost, the rules make it a requirement); and each way of breaking a
// student rule (dropping a student's section, adding a second section of
// one part, moving a student to a section whose parent they lack,
// overfilling a section, seating a student in a course they did not ask
// for) is caught by both.
func TestXMLSectioningAgreesWithCheck(t *testing.T) {
	xmlDataDir(t)
	for _, name := range smallXML {
		t.Run(name, func(t *testing.T) {
			in := readSharedXML(t, name)
			term := in.Term()
			s := solvedTimetable(t, term)
			s.Enrolments = firstFitSeating(term)
			verdicts := func(what string, s *timetable.Schedule) {
				t.Helper()
				sol, err := XMLSolutionOf(in, s, XMLRunInfo{})
				require.NoError(t, err)
				h := XMLHardViolations(in, sol)
				_, by := ownCost(term, s)
				ours := hardCount(term, s) == 0 && by[timetable.CritUnplaced] == 0
				assert.Equal(t, h.Total() == 0, ours, "%s: competition %+v, Check %v, unplaced %d", what, h, timetable.HardViolations(timetable.Check(term, s)), by[timetable.CritUnplaced])
			}
			verdicts("first fit", s)
			for _, m := range seatingBreaks(term, s) {
				verdicts(m.name, m.sched)
				sol, err := XMLSolutionOf(in, m.sched, XMLRunInfo{})
				require.NoError(t, err)
				assert.Positive(t, XMLHardViolations(in, sol).Sectioning, m.name)
			}
		})
	}
}

// seatingBreak is a seating with one student rule broken.
type seatingBreak struct {
	name  string
	sched *timetable.Schedule
}

// partKey names one part of one arrangement of one course.
type partKey struct{ course, arr, part string }

func partOf(s timetable.Section) partKey { return partKey{s.Course, s.Arrangement, s.Part} }

// seatingBreaks derives from s one seating per broken rule, where the
// instance allows it (no students: none): the first enrolment dropped; a
// second section of its part added; a section of a course the student did
// not ask for added; a student moved within a part to a section whose
// parent they do not hold; a student moved within a part into a full
// section.
func seatingBreaks(term *timetable.Term, s *timetable.Schedule) []seatingBreak {
	if len(s.Enrolments) == 0 {
		return nil
	}
	idx := term.SectionIndex()
	sections := map[partKey][]string{}
	for _, sec := range term.Sections {
		if sec.Course != "" {
			sections[partOf(sec)] = append(sections[partOf(sec)], sec.ID)
		}
	}
	held := map[timetable.Enrolment]bool{}
	count := map[string]int{}
	asked := map[[2]string]bool{}
	for _, e := range s.Enrolments {
		held[e] = true
		count[e.Section]++
	}
	for _, r := range term.Requests {
		asked[[2]string{r.Student, r.Course}] = true
	}
	with := func(name string, change func(es []timetable.Enrolment) []timetable.Enrolment) seatingBreak {
		c := *s
		c.Enrolments = change(append([]timetable.Enrolment(nil), s.Enrolments...))
		return seatingBreak{name, &c}
	}
	first := s.Enrolments[0]
	fsec := term.Sections[idx[first.Section]]
	out := []seatingBreak{with("a section dropped", func(es []timetable.Enrolment) []timetable.Enrolment { return es[1:] })}
	for _, id := range sections[partOf(fsec)] {
		if id != first.Section {
			out = append(out, with("a second section of one part", func(es []timetable.Enrolment) []timetable.Enrolment {
				return append(es, timetable.Enrolment{Student: first.Student, Section: id})
			}))
			break
		}
	}
	for _, sec := range term.Sections {
		if sec.Course != "" && !asked[[2]string{first.Student, sec.Course}] {
			out = append(out, with("a course not asked for", func(es []timetable.Enrolment) []timetable.Enrolment {
				return append(es, timetable.Enrolment{Student: first.Student, Section: sec.ID})
			}))
			break
		}
	}
	move := func(name string, ok func(e timetable.Enrolment, to timetable.Section) bool) {
		for i, e := range s.Enrolments {
			for _, id := range sections[partOf(term.Sections[idx[e.Section]])] {
				if to := term.Sections[idx[id]]; id != e.Section && ok(e, to) {
					out = append(out, with(name, func(es []timetable.Enrolment) []timetable.Enrolment {
						es[i].Section = id
						return es
					}))
					return
				}
			}
		}
	}
	move("parent not held", func(e timetable.Enrolment, to timetable.Section) bool {
		return to.Parent != "" && !held[timetable.Enrolment{Student: e.Student, Section: to.Parent}]
	})
	move("a section over its limit", func(e timetable.Enrolment, to timetable.Section) bool {
		return count[to.ID] >= term.SectionLimit(idx[to.ID])
	})
	return out
}
