package encode

import (
	"strings"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// staffCriteria writes "staff gaps" and "staff days" for every staff
// member with at least one section.
func (sb *softBuilder) staffCriteria() {
	gw, gl, gaps := sb.weight(timetable.CritStaffGaps, 1)
	dw, dl, days := sb.weight(timetable.CritStaffDays, 1)
	if gaps && !sb.someDayLonger(2) {
		gaps = false // a gap needs a busy period on each side
	}
	if !gaps && !days {
		return
	}
	teaches := make([]bool, len(sb.t.Staff))
	for _, sec := range sb.t.Sections {
		for _, id := range sec.Staff {
			teaches[sb.staffIdx[id]] = true
		}
	}
	for i, st := range sb.t.Staff {
		if !teaches[i] {
			continue
		}
		sb.aboutStaff(i)
		busy := sb.staffBusy(i)
		if gaps {
			sb.gaps(timetable.CritStaffGaps, gw, gl, busy, "busy_before("+quote(st.ID), "busy_after("+quote(st.ID))
		}
		if days {
			for _, day := range sb.days {
				var lits []solver.Lit
				for _, p := range day {
					if busy[p] != 0 {
						lits = append(lits, busy[p])
					}
				}
				name := "teaches_on(" + quote(st.ID) + "," + strings.ToLower(timetable.DayName(sb.t.Periods[day[0]].Day)) + ")"
				if l := sb.orAtom(name, aux(-1, day[0]), lits...); l != 0 {
					sb.weak(timetable.CritStaffDays, dw, dl, l)
				}
			}
		}
	}
}

// cohortCriteria writes "cohort gaps" and "cohort isolated" for every
// cohort with at least one section.
func (sb *softBuilder) cohortCriteria() {
	gw, gl, gaps := sb.weight(timetable.CritCohortGaps, 1)
	iw, il, iso := sb.weight(timetable.CritCohortIsolated, 1)
	if gaps && !sb.someDayLonger(2) {
		gaps = false
	}
	if !gaps && !iso {
		return
	}
	for c, co := range sb.t.Cohorts {
		sb.aboutCohort(c)
		busy := sb.cohortAttends(c)
		if gaps {
			sb.gaps(timetable.CritCohortGaps, gw, gl, busy, "attends_before("+quote(co.ID), "attends_after("+quote(co.ID))
		}
		if iso {
			sb.isolated(iw, il, busy)
		}
	}
}

// gaps charges w for every period p of a day that is not busy while some
// earlier and some later period of the same day are: before(P) holds when
// a period of the day before P is busy (a chain of rules from the day's
// first period), after(P) likewise from its last. Periods count in grid
// order whether or not they are consecutive, as the definition reads.
// befName and aftName are the atom name prefixes (up to the first
// argument).
func (sb *softBuilder) gaps(crit string, w int64, level int, busy []solver.Lit, befName, aftName string) {
	for _, day := range sb.days {
		n := len(day)
		if n < 3 {
			continue
		}
		bef := make([]solver.Lit, n)
		aft := make([]solver.Lit, n)
		for k := 1; k < n; k++ {
			p := day[k]
			var lits []solver.Lit
			if l := busy[day[k-1]]; l != 0 {
				lits = append(lits, l)
			}
			if l := bef[k-1]; l != 0 {
				lits = append(lits, l)
			}
			if k < n-1 { // the last period can never be a gap
				bef[k] = sb.orAtom(befName+","+periodName(sb.t.Periods[p])+")", aux(-1, p), lits...)
			}
		}
		for k := n - 2; k >= 1; k-- {
			p := day[k]
			var lits []solver.Lit
			if l := busy[day[k+1]]; l != 0 {
				lits = append(lits, l)
			}
			if l := aft[k+1]; l != 0 {
				lits = append(lits, l)
			}
			aft[k] = sb.orAtom(aftName+","+periodName(sb.t.Periods[p])+")", aux(-1, p), lits...)
		}
		for k := 1; k < n-1; k++ {
			if bef[k] == 0 || aft[k] == 0 {
				continue
			}
			body := []solver.Lit{bef[k], aft[k]}
			if l := busy[day[k]]; l != 0 {
				body = append(body, l.Not())
			}
			sb.weak(crit, w, level, body...)
		}
	}
}

// isolated charges w for every busy period of a cohort whose neighbours
// (the periods right before and right after, consecutive on the same day)
// are both free.
func (sb *softBuilder) isolated(w int64, level int, busy []solver.Lit) {
	t := sb.t
	for p, l := range busy {
		if l == 0 {
			continue
		}
		body := []solver.Lit{l}
		if p > 0 && t.Consecutive(p-1, p) && busy[p-1] != 0 {
			body = append(body, busy[p-1].Not())
		}
		if p+1 < len(t.Periods) && t.Consecutive(p, p+1) && busy[p+1] != 0 {
			body = append(body, busy[p+1].Not())
		}
		sb.weak(timetable.CritCohortIsolated, w, level, body...)
	}
}

// someDayLonger reports whether some grid day has more than n periods.
func (sb *softBuilder) someDayLonger(n int) bool {
	for _, day := range sb.days {
		if len(day) > n {
			return true
		}
	}
	return false
}
