package timetable

import (
	"sort"
	"strings"
)

// chkWhere names rows grouped by sheet in first-seen order: "Sections rows
// 14 and 20; Staff row 4". Long row lists are cut after chkMaxRows rows.
func chkWhere(srcs []Source) string {
	var sheets []string
	rows := map[string][]int{}
	for _, s := range srcs {
		if s.Sheet == "" {
			continue
		}
		if _, ok := rows[s.Sheet]; !ok {
			sheets = append(sheets, s.Sheet)
		}
		if s.Row > 0 {
			rows[s.Sheet] = append(rows[s.Sheet], s.Row)
		} else if rows[s.Sheet] == nil {
			rows[s.Sheet] = []int{}
		}
	}
	parts := make([]string, 0, len(sheets))
	for _, sh := range sheets {
		rs := rows[sh]
		sort.Ints(rs)
		rs = chkCompactInts(rs)
		switch len(rs) {
		case 0:
			parts = append(parts, sh)
		case 1:
			parts = append(parts, sh+" row "+itoa(rs[0]))
		default:
			items := make([]string, 0, chkMaxRows+1)
			for i, r := range rs {
				if i == chkMaxRows {
					items = append(items, itoa(len(rs)-chkMaxRows)+" more")
					break
				}
				items = append(items, itoa(r))
			}
			parts = append(parts, sh+" rows "+chkJoin(items))
		}
	}
	return strings.Join(parts, "; ")
}

// chkMaxRows is how many rows of one sheet a message lists before "N more".
const chkMaxRows = 8

func chkCompactInts(xs []int) []int {
	out := xs[:0]
	for i, v := range xs {
		if i == 0 || v != xs[i-1] {
			out = append(out, v)
		}
	}
	return out
}

// chkJoin joins words as English: "a", "a and b", "a, b and c".
func chkJoin(items []string) string {
	switch len(items) {
	case 0:
		return ""
	case 1:
		return items[0]
	}
	return strings.Join(items[:len(items)-1], ", ") + " and " + items[len(items)-1]
}

// chkTimes names a set of period indexes in grid order, merging runs of
// consecutive periods: "Tue 10:00", "Tue 10:00–12:00 and Thu 09:00".
func chkTimes(t *Term, periods []int) string {
	ps := append([]int(nil), periods...)
	sort.Ints(ps)
	ps = chkCompactInts(ps)
	var items []string
	for i := 0; i < len(ps); {
		j := i
		for j+1 < len(ps) && ps[j+1] == ps[j]+1 && t.Consecutive(ps[j], ps[j+1]) {
			j++
		}
		if i == j {
			items = append(items, t.Periods[ps[i]].Label())
		} else {
			items = append(items, t.Periods[ps[i]].Label()+"–"+t.Periods[ps[j]].End.String())
		}
		i = j + 1
	}
	return chkJoin(items)
}

// chkRange names the periods first..last.
func chkRange(t *Term, first, last int) string {
	ps := make([]int, 0, last-first+1)
	for p := first; p <= last; p++ {
		ps = append(ps, p)
	}
	return chkTimes(t, ps)
}

// chkPerson labels a staff member or cohort: "Dr Ana Petrović (S-017)", or
// the bare ID when there is no distinct name.
func chkPerson(id, name string) string {
	if name == "" || name == id {
		return id
	}
	return name + " (" + id + ")"
}

func (x *occupancy) staffLabel(k int) string {
	return "staff " + chkPerson(x.t.Staff[k].ID, x.t.Staff[k].Name)
}

func (x *occupancy) cohortLabel(k int) string {
	return "cohort " + chkPerson(x.t.Cohorts[k].ID, x.t.Cohorts[k].Name)
}

// meetingLabel is "BIO-101 meeting 2".
func (x *occupancy) meetingLabel(i int) string {
	p := x.s.Placements[i]
	return p.Section + " meeting " + itoa(p.Meeting)
}

// unavailText names the time of an Unavailable row: "Tue 09:00–12:00" or
// "all day Tue", with its reason in brackets when given.
func chkUnavailText(t *Term, u Unavailability) string {
	var s string
	if u.From <= 0 && u.To >= 24*60 {
		s = "all day " + DayName(u.Day)
	} else {
		s = DayName(u.Day) + " " + u.From.String() + "–" + u.To.String()
	}
	if u.Weeks != 0 {
		s += chkInWeeks(t, u.Weeks)
	}
	if u.Reason != "" {
		s += " [" + u.Reason + "]"
	}
	return s
}
