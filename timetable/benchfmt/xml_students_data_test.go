package benchfmt

import (
	"context"
	"math/rand/v2"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"github.com/termwright/termwright/encode"
	"github.com/termwright/termwright/sectioning"
	"github.com/termwright/termwright/timetable"
)

// smallXML are the four small shared instances.
var smallXML = []string{"bet-sum18", "lums-sum17", "pu-cs-fal07", "wbg-fal10"}

// seated is s with its students seated by the sectioner.
func seated(t *testing.T, term *timetable.Term, s *timetable.Schedule) *timetable.Schedule {
	t.Helper()
	res, err := sectioning.Section(context.Background(), term, s, sectioning.Options{Seed: 1})
	require.NoError(t, err)
	c := *s
	c.Enrolments = res.Enrolments
	return &c
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
// with the sectioner's seatings over random timetables, the competition's
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
				s := seated(t, term, randomSchedule(term, r))
				sol, err := XMLSolutionOf(in, s, XMLRunInfo{})
				require.NoError(t, err)
				total, parts := XMLCost(in, sol)
				got, by := ownCost(term, s)
				assert.Equal(t, int64(parts.Student*in.Weights.Student), by[timetable.CritStudentClash], "student part, round %d", round)
				if len(term.Requests) > 0 {
					assert.Positive(t, parts.Student, "random timetables make students clash, round %d", round)
				}
				assert.Equal(t, int64(total), got-by[timetable.CritUnplaced], "total without unplaced requests, round %d", round)
			}
		})
	}
}

// TestXMLSectioningAgreesWithCheck: on the four small shared instances, a
// valid timetable from the engine with the sectioner's seating is valid by the
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
			s := seated(t, term, solvedTimetable(t, term))
			verdicts := func(what string, s *timetable.Schedule) {
				t.Helper()
				sol, err := XMLSolutionOf(in, s, XMLRunInfo{})
				require.NoError(t, err)
				h := XMLHardViolations(in, sol)
				_, by := ownCost(term, s)
				ours := hardCount(term, s) == 0 && by[timetable.CritUnplaced] == 0
				assert.Equal(t, h.Total() == 0, ours, "%s: competition %+v, Check %v, unplaced %d", what, h, timetable.HardViolations(timetable.Check(term, s)), by[timetable.CritUnplaced])
			}
			verdicts("sectioned", s)
			for _, m := range seatingBreaks(term, s) {
				verdicts(m.name, m.sched)
				sol, err := XMLSolutionOf(in, m.sched, XMLRunInfo{})
				require.NoError(t, err)
				assert.Positive(t, XMLHardViolations(in, sol).Sectioning, m.name)
			}
			// A limit lowered below the students seated in the fullest
			// section, in the instance and in the term alike.
			if i, n := fullest(s); n > 0 {
				lowIn, lowTerm := *in, *term
				lowIn.Classes = append([]XMLClass(nil), in.Classes...)
				lowTerm.Sections = append([]timetable.Section(nil), term.Sections...)
				ci := in.classIndex()[i]
				lowIn.Classes[ci].Limit = n - 1
				lowTerm.Sections[term.SectionIndex()[i]].Limit = n - 1
				if n == 1 {
					lowTerm.Sections[term.SectionIndex()[i]].Size = 0 // Limit 0 means Size
				}
				sol, err := XMLSolutionOf(&lowIn, s, XMLRunInfo{})
				require.NoError(t, err)
				h := XMLHardViolations(&lowIn, sol)
				assert.Equal(t, 1, h.Sectioning, "one student over the limit")
				assert.Positive(t, hardCount(&lowTerm, s), "Check sees the section over its limit: %v", timetable.HardViolations(timetable.Check(&lowTerm, s)))
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
// parent they do not hold.
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
	asked := map[[2]string]bool{}
	for _, e := range s.Enrolments {
		held[e] = true
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
	return out
}

// fullest is the section with the most seated students and their number.
func fullest(s *timetable.Schedule) (string, int) {
	count := map[string]int{}
	best, n := "", 0
	for _, e := range s.Enrolments {
		count[e.Section]++
		if c := count[e.Section]; c > n || (c == n && e.Section < best) {
			best, n = e.Section, c
		}
	}
	return best, n
}
