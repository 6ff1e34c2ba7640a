package timetable

import "sort"

// TravelClash is a pair of sections a student takes that never meet
// together but leave too little free time between two of their meetings,
// on a common day in a common week, for the travel between their rooms:
// the travel part of the "student clashes" criterion (meeting patterns
// only). Cost counts it and Check reports it; this lists it per student.
type TravelClash struct {
	Student string // student ID
	First   string // section ID, the earlier of the two in the Sections sheet
	Second  string // the other section's ID
	Src     Source // the first section's row
	// At is the first such time in week order, with the minutes free and
	// needed: "Mon 09:50–10:00 (10 minutes to get from R1 to R2, which
	// takes 15 minutes)".
	At string
}

// TravelClashes lists the travel clashes of every student of s (fixed and
// sectioned enrolments), sorted by student ID, then by the sections' order
// in the Sections sheet. It is empty when the term has no travel times.
func TravelClashes(t *Term, s *Schedule) []TravelClash {
	if len(t.Travel) == 0 {
		return nil
	}
	x := newOccupancy(t, s)
	ens := x.seats().ens
	var out []TravelClash
	for k, cp := range x.studentClashes() {
		if !cp.travel {
			continue
		}
		for _, ei := range cp.students {
			out = append(out, TravelClash{Student: ens[ei].Student, First: t.Sections[k.a].ID, Second: t.Sections[k.b].ID,
				Src: t.Sections[k.a].Src, At: cp.at})
		}
	}
	idx := t.SectionIndex()
	sort.Slice(out, func(i, j int) bool {
		a, b := out[i], out[j]
		if a.Student != b.Student {
			return a.Student < b.Student
		}
		if idx[a.First] != idx[b.First] {
			return idx[a.First] < idx[b.First]
		}
		return idx[a.Second] < idx[b.Second]
	})
	return out
}
