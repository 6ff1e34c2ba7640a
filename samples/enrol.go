package samples

import "fmt"

// enrol makes the students: each cohort has Size students, each enrolled in
// every section of the cohort; about three in ten also take one elective
// whose witness meetings do not clash with their cohort's, while the
// elective has seats left.
func (g *gen) enrol() {
	var electives []int
	for i, s := range g.secs {
		if s.kind == kindElective {
			electives = append(electives, i)
		}
	}
	seats := make([]int, len(g.secs))
	for _, e := range electives {
		seats[e] = g.secs[e].size
	}
	year := g.cfg.FirstDay.Year() % 100
	for c := range g.cohorts {
		for range g.cohorts[c].size {
			st := student{id: fmt.Sprintf("Q%02d%05d", year, len(g.students)+1), cohort: c, extra: -1}
			if len(electives) > 0 && g.chance(0.3) {
				for range 8 {
					e := electives[g.rng.IntN(len(electives))]
					if seats[e] > 0 && g.fitsCohort(e, c) {
						st.extra = e
						seats[e]--
						break
					}
				}
			}
			g.students = append(g.students, st)
		}
	}
}

// fitsCohort reports whether section e's witness meetings leave cohort c's
// witness meetings alone (in the weeks both run).
func (g *gen) fitsCohort(e, c int) bool {
	s := &g.secs[e]
	for _, st := range s.starts {
		for p := st; p < st+s.length; p++ {
			if g.occCohort[c][p]&s.weeks != 0 {
				return false
			}
		}
	}
	return true
}
