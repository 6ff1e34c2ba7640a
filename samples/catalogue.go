package samples

import (
	"fmt"
	"slices"

	"github.com/termwright/termwright/timetable"
)

// The catalogue: departments, their year groups of cohorts, courses and the
// sections that make them up, and electives.

// cohortSizes gives the range of one cohort's size by year of study.
var cohortSizes = [5][2]int{{}, {16, 32}, {14, 28}, {10, 24}, {8, 20}}

// buildCatalogue makes departments and fills them with year groups until the
// section count is reached, about 8% of it being electives.
func (g *gen) buildCatalogue() {
	n := g.cfg.Sections
	main := n - electiveCount(n)
	for _, i := range g.shuffled(len(subjects))[:departmentCount(n)] {
		g.depts = append(g.depts, dept{sub: subjects[i]})
	}
	for d, y := 0, 1; len(g.secs) < main; {
		g.yearGroup(d, y, main)
		if d++; d == len(g.depts) {
			d, y = 0, y%4+1
		}
	}
	for len(g.secs) < n {
		g.elective()
	}
}

// yearGroup makes one to three cohorts of one year of a department and
// courses for them until each cohort takes six to eight sections, or the
// budget of sections runs out.
func (g *gen) yearGroup(d, year, budget int) {
	var members []int
	for range []int{1, 1, 1, 2, 2, 3}[g.rng.IntN(6)] {
		members = append(members, g.newCohort(d, year))
	}
	target := g.between(6, 8)
	for tries := 0; tries < 12 && len(g.secs) < budget; tries++ {
		done := true
		for _, c := range members {
			done = done && len(g.cohorts[c].secs) >= target
		}
		if done || g.course(d, year, members, budget) == 0 {
			return
		}
	}
}

func (g *gen) newCohort(d, year int) int {
	dp := &g.depts[d]
	letter := letters(dp.groupNo[year])
	dp.groupNo[year]++
	size := g.between(cohortSizes[year][0], cohortSizes[year][1])
	g.cohorts = append(g.cohorts, cohort{
		id:   fmt.Sprintf("%s-%d%s", dp.sub.code, year, letter),
		name: fmt.Sprintf("%s, year %d, group %s", dp.sub.name, year, letter),
		dept: d, year: year, size: size,
	})
	return len(g.cohorts) - 1
}

// letters names the n-th group: A..Z, AA, AB, ...
func letters(n int) string {
	s := ""
	for n++; n > 0; n = (n - 1) / 26 {
		s = string(rune('A'+(n-1)%26)) + s
	}
	return s
}

// course adds a course for members: a plenary for all of them (sometimes
// joined by a cohort of another department), and per cohort maybe a
// laboratory or tutorial section. It returns the number of sections added.
func (g *gen) course(d, year int, members []int, budget int) int {
	meetings, length := g.plenaryShape()
	if !g.cohortsFit(members, meetings*length) {
		meetings, length = 1, 1
		if !g.cohortsFit(members, 1) {
			return 0
		}
	}
	dp := &g.depts[d]
	dp.courseNo[year]++
	code := fmt.Sprintf("%s%d%02d", dp.sub.code, year, dp.courseNo[year])
	ci := len(g.courses)
	g.courses = append(g.courses, course{dept: d, year: year, title: g.courseTitle(d), plenary: -1})
	co := &g.courses[ci]

	lecCohorts := slices.Clone(members)
	if g.chance(0.15) {
		if other := g.guestCohort(d, year, meetings*length); other >= 0 {
			lecCohorts = append(lecCohorts, other)
		}
	}
	plen := g.newSection(sec{id: code + "-L", title: co.title, dept: d, course: ci, kind: kindPlenary,
		cohorts: lecCohorts, meetings: meetings, length: length, weeks: g.all})
	if g.chance(0.4) {
		g.secs[plen].needs = append(g.secs[plen].needs, "projector")
	}
	if g.chance(0.02) {
		g.secs[plen].noRoom = true
		g.secs[plen].title += " (online)"
	}
	if meetings >= 2 && g.chance(0.05) {
		g.secs[plen].sameDay, g.secs[plen].minDays = true, meetings
	}
	g.courses[ci].plenary = plen
	added := 1

	labs, tuts := 0, 0
	fortnightly := g.chance(0.35)
	for gi, c := range members {
		if len(g.secs) >= budget {
			break
		}
		var s sec
		switch {
		case dp.sub.lab && g.chance(0.55):
			labs++
			s = sec{id: fmt.Sprintf("%s-P%d", code, labs), title: co.title + " — laboratory", kind: kindLab,
				meetings: 1, length: min(g.maxRun, 2+g.boolInt(g.chance(0.3))), needs: []string{"lab"}, weeks: g.all}
			if fortnightly && g.cfg.Weeks >= 2 {
				s.weeks = g.parityWeeks(gi%2 == 0)
			}
		case g.chance(0.45):
			tuts++
			s = sec{id: fmt.Sprintf("%s-T%d", code, tuts), title: co.title + " — tutorial", kind: kindTutorial,
				meetings: 1, length: 1, weeks: g.tutorialWeeks()}
		default:
			continue
		}
		if !g.cohortsFit([]int{c}, s.load()) {
			continue
		}
		s.dept, s.course, s.cohorts = d, ci, []int{c}
		g.courses[ci].groups = append(g.courses[ci].groups, g.newSection(s))
		added++
	}
	return added
}

func (g *gen) boolInt(b bool) int {
	if b {
		return 1
	}
	return 0
}

// plenaryShape draws meetings per week and periods per meeting of a plenary.
func (g *gen) plenaryShape() (meetings, length int) {
	meetings = []int{1, 2, 2, 3}[g.rng.IntN(4)]
	length = 1
	if meetings < 3 && g.chance(0.35) {
		length = 2
	}
	return min(meetings, len(g.days)), min(length, g.maxRun)
}

// parityWeeks is the odd (or even) teaching weeks.
func (g *gen) parityWeeks(odd bool) timetable.WeekSet {
	const oddBits = timetable.WeekSet(0x5555555555555555)
	if odd {
		return g.all & oddBits
	}
	return g.all &^ oddBits
}

// tutorialWeeks is usually every week, sometimes from week 2, or one half of
// the term.
func (g *gen) tutorialWeeks() timetable.WeekSet {
	n := weekCount(g.all)
	if n < 4 || !g.chance(0.15) {
		return g.all
	}
	switch g.rng.IntN(3) {
	case 0:
		return g.all &^ 1
	case 1:
		return weeksRange(1, n/2)
	}
	return weeksRange(n/2+1, n)
}

// cohortsFit reports whether each cohort can take load more periods a week
// and one more section.
func (g *gen) cohortsFit(cs []int, load int) bool {
	for _, c := range cs {
		if g.cohorts[c].load+load > g.capLoad || len(g.cohorts[c].secs) >= 8 {
			return false
		}
	}
	return true
}

// guestCohort finds a cohort of the same year in another department that
// can join a plenary of load periods, or -1.
func (g *gen) guestCohort(d, year, load int) int {
	for range 10 {
		c := g.rng.IntN(len(g.cohorts))
		co := g.cohorts[c]
		if co.dept != d && co.year == year && len(co.secs) < 7 && g.cohortsFit([]int{c}, load) {
			return c
		}
	}
	return -1
}

// newSection adds s, links it to its cohorts and sets its size from them.
func (g *gen) newSection(s sec) int {
	i := len(g.secs)
	s.partner, s.follows = -1, -1
	for _, c := range s.cohorts {
		g.cohorts[c].secs = append(g.cohorts[c].secs, i)
		g.cohorts[c].load += s.load()
		s.size += g.cohorts[c].size
	}
	if g.chance(0.03) {
		s.needs = append(s.needs, "step-free")
	}
	s.needs = sortedStrings(s.needs)
	g.secs = append(g.secs, s)
	return i
}

// elective adds a section open to students of any cohort.
func (g *gen) elective() {
	d := g.rng.IntN(len(g.depts))
	dp := &g.depts[d]
	year := g.between(2, 4)
	dp.courseNo[year]++
	code := fmt.Sprintf("%s%d%02d", dp.sub.code, year, dp.courseNo[year])
	ci := len(g.courses)
	g.courses = append(g.courses, course{dept: d, year: year, title: g.courseTitle(d), plenary: len(g.secs)})
	meetings := min(g.between(1, 2), len(g.days))
	length := 1
	if meetings == 1 && g.chance(0.5) {
		length = min(2, g.maxRun)
	}
	s := sec{id: code + "-E", title: g.courses[ci].title + " (elective)", dept: d, course: ci, kind: kindElective,
		meetings: meetings, length: length, weeks: g.all, size: g.between(12, 45)}
	if g.chance(0.3) {
		s.needs = []string{"projector"}
	}
	if g.chance(0.04) {
		s.noRoom, s.title = true, g.courses[ci].title+" (online elective)"
	}
	if g.chance(0.1) {
		s.weeks = g.tutorialWeeks()
	}
	g.newSection(s)
}

// courseTitle makes a title from one of the department's topics, avoiding
// titles the department already has while a few tries allow.
func (g *gen) courseTitle(d int) string {
	sub := g.depts[d].sub
	var title string
	for try := 0; try == 0 || g.titleUsed(d, title) && try < 6; try++ {
		topic := sub.topics[g.rng.IntN(len(sub.topics))]
		title = fmt.Sprintf(titleForms[g.rng.IntN(len(titleForms))], topic)
	}
	if !g.titleUsed(d, title) {
		g.depts[d].titles = append(g.depts[d].titles, title)
	}
	return title
}

func (g *gen) titleUsed(d int, title string) bool {
	for _, t := range g.depts[d].titles {
		if t == title {
			return true
		}
	}
	return false
}
