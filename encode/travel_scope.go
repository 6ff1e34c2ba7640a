package encode

import (
	"fmt"
)

// travelScopeLimit is how many people a refusal of travel rows names.
const travelScopeLimit = 5

// compileTravelScope refuses a term whose travel times would reach grid
// meetings whose rooms are chosen after the search. Travel (Term.Travel)
// is hard for every meeting of a staff member or cohort; a grid section
// with one candidate room per meeting takes part in the travel constraints
// (compilePatternTravel), but a grid section that may meet in any of
// several rooms gets its rooms after the search (Hall bounds, then
// Decode), so the gap a pair of its meetings leaves cannot be tied to
// their rooms' distance during the search: a timetable would fail
// timetable.Check after the fact. Saying so at compile time, with the rows
// to change, is better than searching for a timetable that will be refused.
func (b *builder) compileTravelScope() {
	t := b.t
	if len(t.Travel) == 0 {
		return
	}
	if b.travelIndex().Most() <= 0 {
		return
	}
	named := 0
	check := func(kind, id string, secs []int) {
		grid, rooms := -1, 0
		for _, s := range secs {
			sec := &t.Sections[s]
			if sec.NoRoom {
				continue
			}
			rooms++
			if !sec.UsesTimes() && grid < 0 && !b.gridRoomsKnown(s) {
				grid = s
			}
		}
		if grid < 0 || rooms < 2 && !t.Sections[grid].SameDay {
			return
		}
		named++
		if named > travelScopeLimit {
			return
		}
		b.errorf(t.Travel[0].Src, "travel times are kept for grid sections with one room only, but %s %s teaches or attends grid section %s (%s), which may meet in any of several rooms, and other sections in rooms — give %s one room, or meeting times on the Meeting times sheet, or remove the travel rows", kind, id, t.Sections[grid].ID, t.Sections[grid].Src, t.Sections[grid].ID)
	}
	bySt, byCo := b.peopleSections()
	for k := range t.Staff {
		check("staff", t.Staff[k].ID, bySt[k])
	}
	for k := range t.Cohorts {
		check("cohort", t.Cohorts[k].ID, byCo[k])
	}
	if named > travelScopeLimit {
		b.errorf(t.Travel[0].Src, "%s more staff members or cohorts have grid sections that the travel rows would reach", fmt.Sprint(named-travelScopeLimit))
	}
}
