package timetable

import (
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// patternSheets is goodSheets with a pattern section SEC-5 (meeting times,
// room choices), travel between the two buildings, the new Staff, Cohorts,
// Unavailable and Relations columns, and a relation with a number. It is a
// valid term (no errors, no warnings).
func patternSheets(t testing.TB) []testSheet {
	return applyEdits(t, goodSheets(),
		e("Sections", "A6", "SEC-5"), e("Sections", "B6", "Patterned Class"), e("Sections", "C6", "S-2"),
		e("Sections", "D6", "C-2"), e("Sections", "E6", "30"), e("Sections", "H6", "projector"),
		e("Meeting times", "A1", "Section"), e("Meeting times", "B1", "Days"), e("Meeting times", "C1", "Start"),
		e("Meeting times", "D1", "Minutes"), e("Meeting times", "E1", "Weeks"), e("Meeting times", "F1", "Weight"),
		e("Meeting times", "A2", "SEC-5"), e("Meeting times", "B2", "Mon Wed Fri"), e("Meeting times", "C2", "09:00"), e("Meeting times", "D2", "50"),
		e("Meeting times", "A3", "SEC-5"), e("Meeting times", "B3", "Tue, Thu"), e("Meeting times", "C3", "09:30"), e("Meeting times", "D3", "75"),
		e("Meeting times", "E3", "odd"), e("Meeting times", "F3", "2"),
		e("Room choices", "A1", "Section"), e("Room choices", "B1", "Room"), e("Room choices", "C1", "Weight"),
		e("Room choices", "A2", "SEC-5"), e("Room choices", "B2", "R101"),
		e("Room choices", "A3", "SEC-5"), e("Room choices", "B3", "H1"), e("Room choices", "C3", "1"),
		e("Travel", "A1", "From"), e("Travel", "B1", "To"), e("Travel", "C1", "Minutes"),
		e("Travel", "A2", "North"), e("Travel", "B2", "South"), e("Travel", "C2", "10"),
		e("Staff", "F1", "Max periods per week"), e("Staff", "G1", "Max minutes per week"), e("Staff", "H1", "Max days per week"),
		e("Staff", "I1", "Lunch from"), e("Staff", "J1", "Lunch to"), e("Staff", "K1", "Lunch minutes"),
		e("Staff", "G3", "600"), e("Staff", "H3", "4"),
		e("Cohorts", "D1", "Lunch from"), e("Cohorts", "E1", "Lunch to"), e("Cohorts", "F1", "Lunch minutes"),
		e("Cohorts", "D2", "11:30"), e("Cohorts", "E2", "14:00"), e("Cohorts", "F2", "30"),
		e("Unavailable", "G1", "Weeks"), e("Unavailable", "G3", "1-4"),
		e("Relations", "D1", "N"), e("Relations", "E1", "M"),
		e("Relations", "A3", "day span"), e("Relations", "B3", "SEC-1, SEC-5"), e("Relations", "C3", "2"), e("Relations", "D3", "300"),
	)
}

// TestPatternSheetsRead: the base reads clean, through the workbook and the
// CSV folder alike, with every new sheet and column in the Term.
func TestPatternSheetsRead(t *testing.T) {
	term, ps := readSheets(t, patternSheets(t))
	require.Empty(t, ps, "the base is clean")
	s := term.Sections[term.SectionIndex()["SEC-5"]]
	require.Len(t, s.Times, 2)
	assert.Equal(t, "Mon Wed Fri", s.Times[0].Days.String())
	assert.Equal(t, Clock(9*60), s.Times[0].Start)
	assert.Equal(t, term.AllWeeks(), s.Times[0].Weeks, "blank Weeks: the section's weeks")
	assert.Equal(t, TimeChoice{Days: DaysOf(2, 4), Start: 570, Minutes: 75, Weeks: term.AllWeeks() & oddWeeks, Weight: 2, Src: Source{Sheet: "Meeting times", Row: 3}}, s.Times[1])
	assert.Equal(t, []RoomChoice{{Room: "R101", Src: Source{"Room choices", 2}}, {Room: "H1", Weight: 1, Src: Source{"Room choices", 3}}}, s.RoomChoices)
	assert.Equal(t, 1, s.Meetings, "a pattern section has one placement")
	assert.Equal(t, []Travel{{From: "North", To: "South", Minutes: 10, Src: Source{"Travel", 2}}}, term.Travel)
	assert.Equal(t, 10, term.TravelMinutes("R101", "H1"))
	assert.Equal(t, 600, term.Staff[1].MaxWeekMinutes)
	assert.Equal(t, 4, term.Staff[1].MaxWeekDays)
	assert.Equal(t, LunchBreak{From: 690, To: 840, Minutes: 30}, term.Cohorts[0].Lunch)
	assert.Equal(t, WeekSet(0b1111), term.Unavailable[1].Weeks)
	assert.Equal(t, WeekSet(0), term.Unavailable[0].Weeks, "blank Weeks: every week")
	assert.Equal(t, Relation{Kind: DaySpan, Sections: []string{"SEC-1", "SEC-5"}, Weight: 2, N: 300, Src: Source{"Relations", 3}}, term.Relations[1])

	fromCSV, ps, err := ReadCSVDir(csvDir(t, patternSheets(t)))
	require.NoError(t, err)
	require.Empty(t, ps)
	assert.Equal(t, term.Sections, fromCSV.Sections, "the CSV folder reads the same sheets")
	assert.Equal(t, term.Travel, fromCSV.Travel)
}

// TestPatternProblemsAtCells plants one mistake per case into the pattern
// base and checks that the problem is reported at exactly the planted cell.
func TestPatternProblemsAtCells(t *testing.T) {
	cases := []plantCase{
		// meeting times
		{"unknown section", []cellEdit{e("Meeting times", "A3", "SEC-9")}, "", Error, `section "SEC-9" is not on the Sections sheet — correct the ID or add the section`},
		{"blank section", []cellEdit{e("Meeting times", "A3", "")}, "", Error, "Section is blank"},
		{"no days", []cellEdit{e("Meeting times", "B3", "")}, "", Error, "Days is blank — write the days it meets, e.g. Mon Wed Fri"},
		{"days run together", []cellEdit{e("Meeting times", "B3", "MWF")}, "", Error, `Days "MWF" is not a list of days — write day names separated by spaces`},
		{"full day names", []cellEdit{e("Meeting times", "B3", "tuesday / THURSDAY")}, "", 0, ""},
		{"blank start", []cellEdit{e("Meeting times", "C3", "")}, "", Error, "Start is blank"},
		{"blank minutes", []cellEdit{e("Meeting times", "D3", "")}, "", Error, "Minutes is blank"},
		{"too short", []cellEdit{e("Meeting times", "D3", "3")}, "", Error, "a meeting of 3 minutes is too short — meetings last at least 5 minutes, in 5-minute steps"},
		{"not a 5-minute length", []cellEdit{e("Meeting times", "D3", "47")}, "", Error, "Minutes 47 is not a multiple of 5 — meeting times go in 5-minute steps; write 45 or 50"},
		{"not a 5-minute start", []cellEdit{e("Meeting times", "C3", "09:32")}, "", Error, "the start 09:32 is not on a 5-minute step — write 09:30 or 09:35"},
		{"after midnight", []cellEdit{e("Meeting times", "C3", "23:30"), e("Meeting times", "D3", "60")}, "", Error, "a meeting from 23:30 for 60 minutes would end after midnight"},
		{"minutes beyond a day", []cellEdit{e("Meeting times", "D3", "2000")}, "", Error, "Minutes 2000 is out of range"},
		{"weeks outside the term", []cellEdit{e("Meeting times", "E3", "1, 13-16")}, "", Error, "weeks 15-16 are outside the term, which has 14 teaching weeks"},
		{"bad weeks", []cellEdit{e("Meeting times", "E3", "0-3")}, "", Error, `Weeks "0-3" is not a list of teaching weeks`},
		{"negative time weight", []cellEdit{e("Meeting times", "F3", "-1")}, "", Error, "weight -1 is negative"},
		{"meeting time twice", []cellEdit{e("Meeting times", "A4", "SEC-5"), e("Meeting times", "B4", "Mon Wed Fri"), e("Meeting times", "C4", "09:00"), e("Meeting times", "D4", "50")}, "Meeting times!B4", Error, `the meeting time Mon Wed Fri 09:00 for 50 minutes is listed twice for section "SEC-5" (row 2)`},
		{"cannot be placed", []cellEdit{e("Unavailable", "A4", "C-2"), e("Unavailable", "B4", "Tue"), e("Unavailable", "C4", "09:00"), e("Unavailable", "D4", "10:00")}, "Sections!A6", Error,
			`section "SEC-5" cannot be placed: every one of its 2 meeting times falls in a hard unavailability (the first, Mon Wed Fri 09:00 for 50 minutes (row 2) when staff "S-2" is unavailable)`},
		{"unavailable in other weeks only", []cellEdit{e("Unavailable", "A4", "C-2"), e("Unavailable", "B4", "Tue"), e("Unavailable", "G4", "even")}, "", 0, ""},
		{"no room free", []cellEdit{
			e("Meeting times", "B2", "Tue"), e("Unavailable", "A4", "R101"), e("Unavailable", "B4", "Tue"), e("Unavailable", "A5", "H1"), e("Unavailable", "B5", "Tue"),
		}, "Sections!A6", Error, "(the first, Tue 09:00 for 50 minutes (row 2) when no room that can hold it is free)"},

		// Sections cells a pattern section ignores
		{"meetings per week disagrees", []cellEdit{e("Sections", "F6", "3")}, "", Warning, "Meetings per week 3 is ignored: the section's meeting time in Meeting times row 3 meets 2 days a week"},
		{"periods per meeting ignored", []cellEdit{e("Sections", "G6", "2")}, "", Warning, "Periods per meeting is ignored"},
		{"min days ignored", []cellEdit{e("Sections", "L6", "2")}, "", Warning, "Min days is ignored"},
		{"fixed on a pattern section", []cellEdit{e("Sections", "J6", "Mon 09:00")}, "", Error, "fixed meetings are for sections on the Periods grid"},

		// room choices
		{"room choice unknown", []cellEdit{e("Room choices", "B3", "R999")}, "", Error, `room "R999" is not on the Rooms sheet`},
		{"room choice too small", []cellEdit{e("Room choices", "B3", "R102")}, "", Error, `room "R102" cannot hold section "SEC-5": it seats 25, fewer than the 30 expected — choose another room`},
		{"room choice lacks a feature", []cellEdit{e("Sections", "H6", "step-free")}, "Room choices!B2", Error, `room "R101" cannot hold section "SEC-5": it lacks step-free`},
		{"room choice twice", []cellEdit{e("Room choices", "A4", "SEC-5"), e("Room choices", "B4", "R101")}, "", Error, `room "R101" is listed again for section "SEC-5" (row 2)`},
		{"room choice of a no-room section", []cellEdit{e("Sections", "I6", "no room")}, "Room choices!B2", Error, `section "SEC-5" takes no room`},
		{"rooms list beside room choices", []cellEdit{e("Sections", "I6", "R101")}, "", Warning, "the Rooms list is not used"},
		{"negative room weight", []cellEdit{e("Room choices", "C3", "-2")}, "", Error, "weight -2 is negative"},
		{"blank room", []cellEdit{e("Room choices", "B3", "")}, "", Error, "Room is blank"},
		{"room choices on a grid section", []cellEdit{e("Room choices", "A4", "SEC-2"), e("Room choices", "B4", "R101")}, "", Error, `room "R101" cannot hold section "SEC-2": it lacks lab`},

		// travel
		{"travel to an unknown place", []cellEdit{e("Travel", "B2", "West")}, "", Error, `"West" is neither a room nor a building on the Rooms sheet`},
		{"travel given twice", []cellEdit{e("Travel", "A3", "South"), e("Travel", "B3", "North"), e("Travel", "C3", "5")}, "Travel!A3", Error, `the travel time between "South" and "North" is given again (row 2)`},
		{"negative travel", []cellEdit{e("Travel", "C2", "-5")}, "", Error, "travel time -5 is out of range"},
		{"travel from a room to itself", []cellEdit{e("Travel", "A2", "R101"), e("Travel", "B2", "R101")}, "", Error, "has no effect"},
		{"travel inside a building", []cellEdit{e("Travel", "A3", "North"), e("Travel", "B3", "North"), e("Travel", "C3", "4")}, "", 0, ""},
		{"travel between rooms", []cellEdit{e("Travel", "A3", "R101"), e("Travel", "B3", "H1"), e("Travel", "C3", "12")}, "", 0, ""},

		// staff, cohorts, unavailable
		{"weekly days out of range", []cellEdit{e("Staff", "H2", "9")}, "", Error, "Max days per week 9 is out of range — use a whole number from 1 to 7"},
		{"weekly minutes exceeded", []cellEdit{e("Staff", "G3", "100")}, "", Error, `staff "S-2" must teach at least 270 minutes in teaching week 1 but Max minutes per week is 100`}, // SEC-2: 2 periods of 60 minutes in odd weeks; SEC-5: 3 x 50 or 2 x 75

		{"weekly minutes kept by a shorter choice", []cellEdit{e("Staff", "G3", "200"), e("Meeting times", "A4", "SEC-5"), e("Meeting times", "B4", "Sat"), e("Meeting times", "C4", "10:00"), e("Meeting times", "D4", "30")}, "", 0, ""}, // 120 + 30
		{"weekly periods exceeded", []cellEdit{e("Staff", "F2", "4")}, "", Error, `staff "S-1" must teach 5 periods in some week but Max periods per week is 4`},
		{"lunch minutes without a window", []cellEdit{e("Staff", "K2", "30")}, "Staff!I2", Error, "Lunch from is blank but a lunch break is given"},
		{"lunch window without minutes", []cellEdit{e("Cohorts", "F2", "")}, "", Error, "Lunch minutes is blank but a lunch window is given"},
		{"lunch longer than its window", []cellEdit{e("Cohorts", "E2", "11:50")}, "Cohorts!F2", Error, "30 minutes of lunch do not fit in the window 11:30–11:50"},
		{"lunch window backwards", []cellEdit{e("Cohorts", "E2", "11:00")}, "", Error, "the lunch window 11:30–11:00 does not end after it starts"},
		{"unavailable weeks outside the term", []cellEdit{e("Unavailable", "G3", "20")}, "", Error, "weeks 20 are outside the term"},
		{"unavailable weeks unreadable", []cellEdit{e("Unavailable", "G3", "soon")}, "", Error, `Weeks "soon" is not a list of teaching weeks`},
		{"unavailable on a pattern-only day", []cellEdit{e("Unavailable", "B3", "Sat")}, "", Warning, "no period and no meeting time is on Sat"},

		// relations
		{"new relation kind", []cellEdit{e("Relations", "A2", "no overlap")}, "", 0, ""},
		{"relation number missing", []cellEdit{e("Relations", "D3", "")}, "", Error, "N is blank — a day span relation needs a number of minutes in N"},
		{"relation number extra", []cellEdit{e("Relations", "D2", "5")}, "", Error, "a not same time relation takes no N — clear the cell (only day span, minimum gap, at most days, at most minutes a day, at most breaks and longest block take it)"},
		{"relation second number missing", []cellEdit{e("Relations", "A3", "longest block")}, "Relations!E3", Error, "M is blank — a longest block relation needs the longest gap in minutes"},
		{"relation second number extra", []cellEdit{e("Relations", "E3", "10")}, "", Error, "a day span relation takes no M"},
		{"relation number out of range", []cellEdit{e("Relations", "D3", "2000")}, "", Error, "N 2000 is out of range for a day span relation"},
		{"relation days out of range", []cellEdit{e("Relations", "A3", "at most days"), e("Relations", "D3", "8")}, "", Error, "N 8 is out of range for a at most days relation — write the most days, from 0 to 7"},
		{"relation number not a number", []cellEdit{e("Relations", "D3", "long")}, "", Error, `N "long" is not a whole number`},
		{"same time with a pattern section", []cellEdit{e("Relations", "A2", "same time"), e("Relations", "B2", "SEC-4, SEC-5")}, "", 0, ""},

		// columns sheet renames a new column
		{"renamed new column", []cellEdit{e("Meeting times", "B1", "Pattern"),
			e("Columns", "A1", "Sheet"), e("Columns", "B1", "Their column"), e("Columns", "C1", "Our column"),
			e("Columns", "A2", "Meeting times"), e("Columns", "B2", "Pattern"), e("Columns", "C2", "Days")}, "", 0, ""},

		// counting checks leave pattern sections alone
		{"pattern time is not grid time", []cellEdit{e("Staff", "D2", "1"),
			e("Sections", "A7", "SEC-6"), e("Sections", "C7", "S-1"), e("Sections", "E7", "10"), e("Sections", "H7", "no room"),
			e("Meeting times", "A4", "SEC-6"), e("Meeting times", "B4", "Mon Tue Wed Thu Fri"), e("Meeting times", "C4", "13:00"), e("Meeting times", "D4", "120")}, "", 0, ""},
		{"grid term without periods", []cellEdit{{sheet: "Periods", remove: true}}, "Periods", Error, "the workbook has no Periods sheet"},
	}
	runPlantCases(t, patternSheets(t), cases)
}

// patternBuilt is builtTerm with every section a pattern section and no
// period grid, as the benchmark adapter builds one.
func patternBuilt() *Term {
	t := builtTerm()
	t.Periods = nil
	all := t.AllWeeks()
	for i := range t.Sections {
		t.Sections[i].Meetings, t.Sections[i].Length = 1, 1
		t.Sections[i].Times = []TimeChoice{
			{Days: DaysOf(time.Monday, time.Wednesday), Start: 9 * 60, Minutes: 80, Weeks: all},
			{Days: DaysOf(time.Tuesday), Start: 14*60 + 5, Minutes: 90, Weeks: all & oddWeeks, Weight: 1},
		}
	}
	return t
}

// TestValidateBuiltPatternTerm: Validate and Impossible on terms made in
// code — a pattern term needs no periods, a grid term still does, and the
// new fields are checked without a workbook.
func TestValidateBuiltPatternTerm(t *testing.T) {
	require.Empty(t, Validate(patternBuilt()), "no periods: every section is a pattern section")
	assert.Empty(t, Impossible(patternBuilt()))
	for _, tc := range []struct {
		name string
		edit func(*Term)
		msg  string
	}{
		{"a grid section needs periods", func(t *Term) { t.Sections[0].Times = nil; t.Sections[0].Meetings = 2 }, "the term has no periods"},
		{"no sections needs periods", func(t *Term) { t.Sections = nil }, "the term has no periods"},
		{"pattern with no days", func(t *Term) { t.Sections[0].Times[0].Days = 0 }, "the meeting time has no days"},
		{"pattern in no week", func(t *Term) { t.Sections[0].Times[1].Weeks = 0 }, "the meeting time is in no teaching week"},
		{"relation with a stray number", func(t *Term) {
			t.Relations = []Relation{{Kind: NoOverlap, Sections: []string{"S1", "S2"}, Hard: true, M: 3}}
		}, "a no overlap relation takes no M but has 3"},
		{"relation number out of range", func(t *Term) {
			t.Relations = []Relation{{Kind: MaxBreaks, Sections: []string{"S1", "S2"}, Hard: true, N: 101, M: 10}}
		}, "N 101 is out of range for a at most breaks relation"},
		{"negative weekly minutes", func(t *Term) { t.Staff[0].MaxWeekMinutes = -1 }, "Max minutes per week -1 is out of range"},
		{"lunch with no minutes", func(t *Term) { t.Cohorts[0].Lunch = LunchBreak{From: 690, To: 780} }, "the lunch break has 0 free minutes"},
		{"unknown travel place", func(t *Term) { t.Travel = []Travel{{From: "R1", To: "Annex", Minutes: 5}} }, `"Annex" is neither a room nor a building`},
		{"room choice of an unknown room", func(t *Term) { t.Sections[0].RoomChoices = []RoomChoice{{Room: "R9"}} }, `room "R9" is not on the Rooms sheet`},
	} {
		t.Run(tc.name, func(t *testing.T) {
			term := patternBuilt()
			tc.edit(term)
			ps := Validate(term)
			for _, p := range ps {
				if p.Severity == Error && strings.Contains(p.Msg, tc.msg) {
					return
				}
			}
			t.Errorf("want an error %q, got:\n%s", tc.msg, ps)
		})
	}
}

// TestSummaryCountsPatternMeetings: a pattern section counts the fewest days
// of its meeting times as its meetings a week (Mon Wed Fri or Tue Thu: 2).
func TestSummaryCountsPatternMeetings(t *testing.T) {
	term, ps := readSheets(t, patternSheets(t))
	require.Empty(t, ps)
	assert.Equal(t, 2+1+3+1+2, Summary(term).Meetings, "SEC-1..SEC-4 on the grid, SEC-5 at 2 or 3 days")
}
