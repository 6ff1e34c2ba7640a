package encode

import (
	"sort"

	"github.com/termwright/termwright/timetable"
)

// countingConflict finds a staff member or cohort whose sections need, in
// some teaching week, more distinct periods than the grid leaves them (the
// periods not blocked by their hard Unavailable rows, at most MaxPerDay a
// day for staff), the counting argument of timetable.Validate's load check.
// Such a load is a proof that no timetable exists: every meeting period of
// those sections needs its own period of the week (no-overlap, and a
// section's own meetings never overlap), and there are too few. It returns
// the groups of that proof — the no-overlap group (with two or more
// sections), the availability and day-limit groups when they take periods
// away, and the fewest sections whose load already exceeds what is left
// (largest loads first; dropping any one of them brings the load within
// reach) — or nil when no load is too high. Engines that learn clauses
// need exponentially long proofs for such pigeonhole conflicts (Haken
// 1985), so an explanation starts from this set rather than from a search.
func (x *Explainer) countingConflict() []int {
	t := x.work
	var best []int
	consider := func(kind, id string, secs []int, blocked []bool, perDay int, availKind string, limitGroup int) {
		have := availablePeriods(t, blocked, perDay)
		for w := 1; w <= 64; w++ {
			var active []int
			need := 0
			for _, s := range secs {
				sec := &t.Sections[s]
				if x.cat.IsPattern(s) {
					continue // its minutes are not periods of the grid
				}
				if x.cat.secs[s].weeks.Has(w) {
					active = append(active, s)
					need += sec.Meetings * sec.Length
				}
			}
			if need <= have {
				continue
			}
			sort.SliceStable(active, func(i, j int) bool {
				a, b := &t.Sections[active[i]], &t.Sections[active[j]]
				return a.Meetings*a.Length > b.Meetings*b.Length
			})
			var set []int
			sum := 0
			for _, s := range active {
				set = append(set, x.secGroup[s])
				sum += t.Sections[s].Meetings * t.Sections[s].Length
				if sum > have {
					break
				}
			}
			if len(set) >= 2 {
				g, ok := x.cat.groupKey[kind+"\x00"+id]
				if !ok {
					return
				}
				set = append(set, g)
			}
			if blocked != nil {
				if g, ok := x.cat.groupKey[availKind+"\x00"+id]; ok {
					set = append(set, g)
				}
			}
			if limitGroup >= 0 {
				set = append(set, limitGroup)
			}
			if best == nil || len(set) < len(best) {
				best = set
			}
			return
		}
	}
	staffSecs := make([][]int, len(t.Staff))
	cohortSecs := make([][]int, len(t.Cohorts))
	staffIdx, cohortIdx := t.StaffIndex(), t.CohortIndex()
	for s, sec := range t.Sections {
		for _, id := range uniq(sec.Staff) {
			staffSecs[staffIdx[id]] = append(staffSecs[staffIdx[id]], s)
		}
		for _, id := range uniq(sec.Cohorts) {
			cohortSecs[cohortIdx[id]] = append(cohortSecs[cohortIdx[id]], s)
		}
	}
	u := x.hardBlocked()
	for i, st := range t.Staff {
		limit := -1
		if st.MaxPerDay > 0 {
			if g, ok := x.cat.groupKey[KindStaffDayLimit+"\x00"+st.ID]; ok {
				limit = g
			}
		}
		perDay := 0
		if limit >= 0 {
			perDay = st.MaxPerDay
		}
		consider(KindStaffNoOverlap, st.ID, staffSecs[i], u["s"+st.ID], perDay, KindStaffAvailability, limit)
	}
	for i, co := range t.Cohorts {
		consider(KindCohortNoOverlap, co.ID, cohortSecs[i], u["c"+co.ID], 0, KindCohortAvailability, -1)
	}
	return best
}

// hardBlocked maps "s"+staff ID and "c"+cohort ID to the periods their hard
// Unavailable rows block.
func (x *Explainer) hardBlocked() map[string][]bool {
	t := x.work
	out := map[string][]bool{}
	for _, u := range t.Unavailable {
		var key string
		switch {
		case !u.Hard:
			continue
		case u.Kind == timetable.WhoStaff:
			key = "s" + u.Who
		case u.Kind == timetable.WhoCohort:
			key = "c" + u.Who
		default:
			continue
		}
		for p, per := range t.Periods {
			if u.Covers(per) {
				if out[key] == nil {
					out[key] = make([]bool, len(t.Periods))
				}
				out[key][p] = true
			}
		}
	}
	return out
}

// availablePeriods counts the periods not blocked, at most perDay of them
// on any one day (0 = no limit).
func availablePeriods(t *timetable.Term, blocked []bool, perDay int) int {
	byDay := map[int]int{}
	for p, per := range t.Periods {
		if blocked == nil || !blocked[p] {
			byDay[int(per.Day)]++
		}
	}
	n := 0
	for _, c := range byDay {
		if perDay > 0 {
			c = min(c, perDay)
		}
		n += c
	}
	return n
}
