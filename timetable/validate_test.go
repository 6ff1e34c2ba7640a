package timetable

import (
	"testing"
)

// e is a cell edit; the last edit of a case also marks where the expected
// problem is, unless the case names another position.
func e(sheet, cell, value string) cellEdit { return cellEdit{sheet: sheet, cell: cell, value: value} }

// TestProblemsAtCells plants one mistake per case into the clean base term
// and checks that a problem with the expected message is reported at
// exactly the planted cell (sheet, column letter and row).
func TestProblemsAtCells(t *testing.T) {
	cases := []plantCase{
		// references and IDs
		{"unknown staff", []cellEdit{e("Sections", "C2", "S-117")}, "", Error, `staff "S-117" is not on the Staff sheet — add them to Staff or correct the ID`},
		{"unknown staff in a list", []cellEdit{e("Sections", "C4", "S-1, S-8, S-9")}, "", Error, `staff "S-8" and "S-9" are not on the Staff sheet`},
		{"unknown cohort", []cellEdit{e("Sections", "D3", "C-9")}, "", Error, `cohort "C-9" is not on the Cohorts sheet`},
		{"unknown allowed room", []cellEdit{e("Sections", "I4", "R101, R999")}, "", Error, `room "R999" is not on the Rooms sheet`},
		{"duplicate section", []cellEdit{e("Sections", "A3", "SEC-1")}, "", Error, `section ID "SEC-1" is already used in row 2`},
		{"duplicate room", []cellEdit{e("Rooms", "A4", "R101")}, "", Error, `room ID "R101" is already used in row 2`},
		{"duplicate staff", []cellEdit{e("Staff", "A4", "S-1")}, "", Error, `staff ID "S-1" is already used in row 2`},
		{"blank section ID", []cellEdit{e("Sections", "A3", "")}, "", Error, "Section is blank"},
		{"enrolment in unknown section", []cellEdit{e("Enrolments", "B2", "SEC-99")}, "", Error, `section "SEC-99" is not on the Sections sheet`},
		{"repeated enrolment", []cellEdit{e("Enrolments", "A5", "ST1"), e("Enrolments", "B5", "SEC-1")}, "", Warning, `student "ST1" is enrolled in section "SEC-1" again (first in row 2)`},
		{"unavailable unknown who", []cellEdit{e("Unavailable", "A2", "Nobody")}, "", Error, `"Nobody" is not a staff ID, room, cohort or section`},
		{"staff without sections", []cellEdit{e("Staff", "A5", "S-4")}, "", Warning, `staff "S-4" teaches no section`},
		{"cohort without sections", []cellEdit{e("Cohorts", "A4", "C-3")}, "", Warning, `cohort "C-3" attends no section`},

		// sheets and columns
		{"missing sheet", []cellEdit{{sheet: "Cohorts", remove: true}}, "Cohorts", Error, `the workbook has no Cohorts sheet — add a sheet named "Cohorts" with the headers "Cohort", "Name", "Size"`},
		{"missing column", []cellEdit{e("Rooms", "B1", "Seats")}, "Rooms row 1", Error, `the Rooms sheet has no "Capacity" column — add a column headed "Capacity"`},
		{"unknown column", []cellEdit{e("Rooms", "B1", "Seats")}, "Rooms!B1", Warning, `column "Seats" is not part of the Rooms sheet and is ignored`},
		{"headers in any case", []cellEdit{e("Rooms", "B1", "  CAPACITY ")}, "", 0, ""},
		{"unknown sheet", []cellEdit{e("Notes", "A1", "anything")}, "Notes", Warning, `sheet "Notes" is not part of the term workbook`},

		// cells
		{"capacity not a number", []cellEdit{e("Rooms", "B2", "many")}, "", Error, `Capacity "many" is not a whole number`},
		{"capacity blank", []cellEdit{e("Rooms", "B3", "")}, "", Error, "Capacity is blank"},
		{"large room", []cellEdit{e("Rooms", "B4", "900")}, "", Warning, "check the posted legal occupancy"},
		{"meetings not a number", []cellEdit{e("Sections", "F2", "x")}, "", Error, `Meetings per week "x" is not a whole number`},
		{"meetings zero", []cellEdit{e("Sections", "F2", "0")}, "", Error, "Meetings per week 0 is out of range — use a whole number from 1 to 100"},
		{"bad day", []cellEdit{e("Periods", "A2", "Funday")}, "", Error, `Day "Funday" is not a day`},
		{"time with a dot", []cellEdit{e("Periods", "B2", "9.00")}, "", Error, `Start "9.00" is not a time — write it as HH:MM`},
		{"blank time", []cellEdit{e("Periods", "C2", "")}, "", Error, "End is blank"},
		{"bad date", []cellEdit{e("Term", "B3", "2027-13-01")}, "", Error, `First day "2027-13-01" is not a date`},
		{"blank first day", []cellEdit{e("Term", "B3", "")}, "", Error, "the term has no first day"},
		{"repeated key", []cellEdit{e("Term", "A7", "Name"), e("Term", "B7", "Spring")}, "Term!A7", Error, `key "Name" appears again (first in row 2)`},
		{"unknown key", []cellEdit{e("Term", "A7", "Colour"), e("Term", "B7", "blue")}, "Term!A7", Warning, `key "Colour" is not known`},
		{"bad weeks", []cellEdit{e("Sections", "K3", "0-3")}, "", Error, `Weeks "0-3" is not a list of teaching weeks`},
		{"bad fixed text", []cellEdit{e("Sections", "J3", "Tuesday morning")}, "", Error, `Fixed "Tuesday morning" is not a fixed meeting`},
		{"bad strength", []cellEdit{e("Unavailable", "E3", "soft")}, "", Error, `Strength "soft" is neither hard nor a weight`},
		{"unknown relation kind", []cellEdit{e("Relations", "A2", "sometimes")}, "", Error, `Kind "sometimes" is not a relation — choose one from the Kind drop-down list (the 24 kinds are listed in docs/workbook.md, Relations)`},
		{"relation kind in another case", []cellEdit{e("Relations", "A2", " Not Same TIME ")}, "", 0, ""},
		{"relation kind spelled off the list", []cellEdit{e("Relations", "A2", "Not-Same  Time")}, "", Error, `Kind "Not-Same  Time" is not a relation`},
		{"unknown criterion", []cellEdit{e("Weights", "A2", "happiness")}, "", Error, `Criterion "happiness" is not known — write one of "moved meetings", "student clashes"`},

		// term
		{"last day before first", []cellEdit{e("Term", "B4", "2027-09-01")}, "", Error, "the last day 2027-09-01 is before the first day 2027-09-13"},
		{"term too long", []cellEdit{e("Term", "B4", "2029-09-01")}, "", Error, "more than 64 weeks"},
		{"bad time zone", []cellEdit{e("Term", "B5", "Mars/Olympus")}, "", Error, `time zone "Mars/Olympus" is not known`},
		{"holiday outside term", []cellEdit{e("Term", "B6", "2028-01-10")}, "", Error, "holiday 2028-01-10 is outside the term"},

		// periods
		{"end before start", []cellEdit{e("Periods", "C3", "09:30")}, "", Error, "period Mon 10:00 ends at 09:30, not after it starts"},
		{"overlapping periods", []cellEdit{e("Periods", "B4", "10:30")}, "", Error, "period Mon 10:30–12:00 overlaps period Mon 10:00–11:00 (row 3)"},
		{"period twice", []cellEdit{e("Periods", "B4", "10:00"), e("Periods", "C4", "11:00")}, "Periods!B4", Error, "period Mon 10:00 is listed twice (row 3)"},

		// sections
		{"meeting longer than any run", []cellEdit{e("Sections", "G3", "4")}, "", Error, "a meeting of 4 periods does not fit: the longest run of consecutive periods is 3"},
		{"more meetings than days", []cellEdit{e("Sections", "F2", "6")}, "", Error, "6 meetings must fall on different days but only 5 days have room for a 1-period meeting"},
		{"no room big enough", []cellEdit{e("Sections", "E2", "150")}, "", Error, "no suitable room holds 150 students (the largest seats 120)"},
		{"soft capacity allows it", []cellEdit{e("Sections", "E2", "150"), e("Sections", "J2", "Mon 09:00"), e("Weights", "A3", "room over capacity"), e("Weights", "B3", "1")}, "", 0, ""},
		{"no room has the features", []cellEdit{e("Sections", "H3", "lab, step-free")}, "", Error, "no room has lab, step-free"},
		{"no allowed room has the features", []cellEdit{e("Sections", "H4", "lab")}, "Sections!I4", Error, "none of the allowed rooms has lab"},
		{"weeks outside the term", []cellEdit{e("Sections", "K3", "1, 13-16")}, "", Error, "weeks 15-16 are outside the term, which has 14 teaching weeks"},
		{"min days above meetings", []cellEdit{e("Sections", "L4", "5")}, "", Warning, "Min days 5 is more than the 3 meetings"},

		// fixed meetings
		{"fixed not at a period start", []cellEdit{e("Sections", "J2", "Mon 09:30")}, "", Error, `fixed meeting "Mon 09:30" is not at the start of a period`},
		{"fixed outside the grid", []cellEdit{e("Sections", "J2", "Sun 09:00")}, "", Error, `fixed meeting "Sun 09:00" is not at the start of a period`},
		{"fixed runs past the run", []cellEdit{e("Sections", "J3", "Mon 11:00")}, "", Error, `fixed meeting "Mon 11:00" cannot hold 2 periods in a row from 11:00`},
		{"fixed room unknown", []cellEdit{e("Sections", "J2", "Mon 09:00 R999")}, "", Error, `names room "R999", which is not on the Rooms sheet`},
		{"fixed room too small", []cellEdit{e("Sections", "J2", "Mon 09:00 R102")}, "", Error, `names room "R102", which cannot hold the section: it seats 25, fewer than the 100 expected`},
		{"fixed room lacks features", []cellEdit{e("Sections", "J3", "Mon 09:00 H1")}, "", Error, "it lacks lab"},
		{"fixed room not allowed", []cellEdit{e("Sections", "J4", "Mon 09:00 R102")}, "", Error, "it is not in the section's Rooms list"},
		{"fixed room for no-room section", []cellEdit{e("Sections", "J5", "Tue 09:00 R101")}, "", Error, "the section takes no room"},
		{"more fixed than meetings", []cellEdit{e("Sections", "J2", "Mon 09:00; Tue 09:00; Wed 09:00")}, "", Error, "3 meetings are fixed but the section has only 2 meetings"},
		{"fixed on one day", []cellEdit{e("Sections", "J2", "Mon 09:00; Mon 10:00")}, "", Error, `fixed meetings "Mon 09:00" and "Mon 10:00" are on the same day`},
		{"fixed when staff unavailable", []cellEdit{e("Sections", "J3", "Fri 09:00")}, "", Error, `falls in a time when staff "S-2" is unavailable (hard)`},
		{"fixed when room unavailable", []cellEdit{e("Unavailable", "E3", "hard"), e("Sections", "J4", "Wed 13:00 R101")}, "", Error, `is in room "R101" when the room is unavailable (hard)`},
		{"fixed meetings clash", []cellEdit{e("Sections", "J4", "Mon 09:00")}, "", Error, `fixed meeting "Mon 09:00" clashes with the fixed meeting "Mon 09:00 H1" of section "SEC-1" at Mon 09:00: both need staff "S-1"`},
		{"more fixed than rooms", []cellEdit{
			e("Sections", "A6", "X1"), e("Sections", "J6", "Tue 09:00"),
			e("Sections", "A7", "X2"), e("Sections", "J7", "Tue 09:00"),
			e("Sections", "A8", "X3"), e("Sections", "J8", "Tue 09:00"),
			e("Sections", "A9", "X4"), e("Sections", "J9", "Tue 09:00"),
		}, "", Error, "4 fixed meetings take place at Tue 09:00 but only 3 rooms can hold them"},

		// unavailability, relations, weights
		{"unavailable ends before it starts", []cellEdit{e("Unavailable", "D3", "12:00")}, "", Error, "the time ends at 12:00, not after it starts at 13:00"},
		{"unavailable on a day without periods", []cellEdit{e("Unavailable", "B3", "Sun")}, "", Warning, "there are no periods on Sun, so this row has no effect"},
		{"relation of one section", []cellEdit{e("Relations", "B2", "SEC-1")}, "", Error, "a not same time relation needs at least two sections but lists 1"},
		{"relation with unknown section", []cellEdit{e("Relations", "B2", "SEC-1, SEC-77")}, "", Error, `section "SEC-77" is not on the Sections sheet`},
		{"same time with different shapes", []cellEdit{e("Relations", "A2", "same time")}, "Relations!B2", Error, `sections "SEC-1" (2 × 1 periods) and "SEC-4" (1 × 1 periods) cannot meet at the same time`},
		{"negative weight", []cellEdit{e("Weights", "B2", "-3")}, "", Error, "weight -3 is negative"},

		// counting arguments
		{"staff needs more periods than available", []cellEdit{e("Staff", "D2", "1"), e("Sections", "F2", "5")}, "Staff!A2", Error, `staff "S-1" must teach 8 periods in some week but is available for only 5`},
		{"cohort needs more periods than available", []cellEdit{
			e("Unavailable", "A4", "C-2"), e("Unavailable", "B4", "Mon"),
			e("Unavailable", "A5", "C-2"), e("Unavailable", "B5", "Tue"),
			e("Unavailable", "A6", "C-2"), e("Unavailable", "B6", "Wed"),
			e("Unavailable", "A7", "C-2"), e("Unavailable", "B7", "Thu"),
			e("Unavailable", "A8", "C-2"), e("Unavailable", "B8", "Fri"), e("Unavailable", "C8", "09:00"), e("Unavailable", "D8", "12:00"),
		}, "Cohorts!A3", Error, `cohort "C-2" must attend 5 periods in some week but is available for only 2`},
	}
	runPlantCases(t, goodSheets(), cases)
}
