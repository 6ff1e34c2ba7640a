package benchfmt

import (
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// Every expected value below is worked out by hand from the competition's
// published rules (ITC 2019 format description, https://www.itc2019.org/format,
// section "Distribution Constraints": each formula is quoted in the comment
// of its case; a soft pairwise constraint costs its penalty per violating
// pair; MaxDays costs penalty x days over D; MaxDayLoad, MaxBreaks and
// MaxBlock cost penalty x excess / nrWeeks with the integer division last).
// The instance has 4 weeks; slots are 5 minutes; times are "days start
// length weeks".
func TestXMLDistributionCosts(t *testing.T) {
	all := "1111"
	mon, tue, wed := "1000000", "0100000", "0010000"
	cases := []struct {
		name    string
		typ     string
		penalty string
		classes []tc
		want    int // distribution part
	}{
		// Ci.start = Cj.start: (1,3) and (2,3) differ: 2 pairs x 2.
		{"same start", "SameStart", "2", []tc{{mon, 100, 10, all, ""}, {tue, 100, 12, all, ""}, {mon, 110, 10, all, ""}}, 4},
		// one inside the other: (1,2) 105-115 inside 100-120; (1,3) and (2,3) not: 2 x 1.
		{"same time", "SameTime", "1", []tc{{mon, 100, 20, all, ""}, {tue, 105, 10, all, ""}, {wed, 110, 15, all, ""}}, 2},
		// Ci.end <= Cj.start or Cj.end <= Ci.start: touching (1,2) holds; (1,3) overlap in the day: 1.
		{"different time", "DifferentTime", "1", []tc{{mon, 100, 10, all, ""}, {tue, 110, 10, all, ""}, {wed, 105, 3, all, ""}}, 1},
		// days of one within the other's: MWF, MF hold; Tue breaks with both: 2 x 3.
		{"same days", "SameDays", "3", []tc{{"1010100", 100, 10, all, ""}, {"1000100", 120, 10, all, ""}, {tue, 140, 10, all, ""}}, 6},
		// (Ci.days and Cj.days) = 0: MWF and Fri share Friday: 1.
		{"different days", "DifferentDays", "1", []tc{{"1010100", 100, 10, all, ""}, {"0101000", 100, 10, all, ""}, {"0000100", 120, 10, all, ""}}, 1},
		// weeks of one within the other's: 1010 and 0101 neither: 1.
		{"same weeks", "SameWeeks", "1", []tc{{mon, 100, 10, "1111", ""}, {tue, 100, 10, "1010", ""}, {wed, 100, 10, "0101", ""}}, 1},
		// (Ci.weeks and Cj.weeks) = 0: 0110 meets both others: 2.
		{"different weeks", "DifferentWeeks", "1", []tc{{mon, 100, 10, "1100", ""}, {mon, 100, 10, "0011", ""}, {mon, 100, 10, "0110", ""}}, 2},
		// overlap in time, days and weeks: only (1,2) overlap; the Tuesday class overlaps neither: 2.
		{"overlap", "Overlap", "1", []tc{{mon, 100, 10, all, ""}, {mon, 105, 10, "1000", ""}, {tue, 100, 10, all, ""}}, 2},
		// the complement of overlap: only (1,2) break it: 1.
		{"not overlap", "NotOverlap", "1", []tc{{mon, 100, 10, all, ""}, {mon, 105, 10, "1000", ""}, {tue, 100, 10, all, ""}}, 1},
		// Ci.room = Cj.room: R1, R1, R2: 2.
		{"same room", "SameRoom", "1", []tc{{mon, 100, 10, all, "R1"}, {tue, 100, 10, all, "R1"}, {wed, 100, 10, all, "R2"}}, 2},
		// Ci.room != Cj.room: 1.
		{"different room", "DifferentRoom", "1", []tc{{mon, 100, 10, all, "R1"}, {tue, 100, 10, all, "R1"}, {wed, 100, 10, all, "R2"}}, 1},
		// Ci.end + travel <= Cj.start (or the reverse), or no common day/week;
		// travel R1-R2 is 3: 110+3 > 112 breaks (1,2); (2,3) 120+3 <= 123 holds; Tuesday holds: 1.
		{"same attendees", "SameAttendees", "1", []tc{{mon, 100, 10, all, "R1"}, {mon, 112, 8, all, "R2"}, {mon, 123, 7, all, "R1"}, {tue, 100, 10, all, "R2"}}, 1},
		// first week, then first day, then Ci.end <= Cj.start, for i < j in list order:
		// (1,2) week 2 after week 1 breaks; (1,3) Mon before Tue holds; (2,3) week 1 first holds;
		// (1,4) same week and day, 110 > 105 breaks; (2,4) holds; (3,4) Tue after Mon breaks: 3.
		{"precedence", "Precedence", "1", []tc{{mon, 100, 10, "0100", ""}, {mon, 100, 10, "1000", ""}, {tue, 90, 10, "0100", ""}, {mon, 105, 10, "0100", ""}}, 3},
		// max(end) - min(start) <= S on a common day: 130-100 = 30 > 24 breaks; 124-100 = 24 holds; 130-105 = 25 breaks: 2.
		{"work day", "WorkDay(24)", "1", []tc{{mon, 100, 10, all, ""}, {mon, 120, 10, all, ""}, {mon, 105, 19, all, ""}}, 2},
		// Ci.end + G <= Cj.start on a common day: gap 4 < 5 breaks (1,2); gap 5 holds: 1.
		{"min gap", "MinGap(5)", "1", []tc{{mon, 100, 10, all, ""}, {mon, 114, 6, all, ""}, {mon, 125, 5, all, ""}}, 1},
		// countNonzeroBits(days or ...) = Mon Wed Fri Sun = 4, 2 over D = 2: 2 x 3.
		{"max days", "MaxDays(2)", "3", []tc{{"1010000", 100, 10, all, ""}, {"0010100", 120, 10, all, ""}, {"0000001", 100, 10, all, ""}}, 6},
		// DayLoad over S = 20: Mondays of weeks 1 and 2 hold 15+10 (5 over each), the
		// Tuesday of week 1 holds 32 (12 over): 22 slots; (2 x 22) / 4 = 11 (not 2 x (22/4) = 10).
		{"max day load", "MaxDayLoad(20)", "2", []tc{{mon, 100, 15, all, ""}, {mon, 200, 10, "1100", ""}, {tue, 100, 32, "1000", ""}}, 11},
		// blocks (gap <= S = 2 merges) over R + 1 = 2: week 1 has 100-115, 120-125, 130-135 = 3
		// blocks, one over; other weeks 2 blocks: (6 x 1) / 4 = 1 (not 6 x (1/4) = 0).
		{"max breaks", "MaxBreaks(1,2)", "6", []tc{{mon, 100, 10, all, ""}, {mon, 111, 4, all, ""}, {mon, 120, 5, all, ""}, {mon, 130, 5, "1000", ""}}, 1},
		// blocks of two or more classes longer than M = 20 (gap <= S = 2 merges): Monday
		// 100-125 every week (4); a lone 30-slot Tuesday class counts not; Wednesday
		// 100-125 in week 1 (1): 5 blocks; (5 x 5) / 4 = 6 (not 5 x (5/4) = 5).
		{"max block", "MaxBlock(20,2)", "5", []tc{{mon, 100, 10, all, ""}, {mon, 111, 14, all, ""}, {tue, 100, 30, all, ""}, {wed, 100, 10, "1000", ""}, {wed, 112, 13, "1000", ""}}, 6},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			soft := readHand(t, handInstance(c.classes, distXML(c.typ, len(c.classes), `penalty="`+c.penalty+`"`)))
			total, parts := XMLCost(soft, forcedSolution(soft))
			assert.Equal(t, c.want, parts.Distribution, "soft cost")
			assert.Equal(t, c.want, total, "total (weights 1; no time, room or student penalties)")
			assert.Zero(t, XMLHardViolations(soft, forcedSolution(soft)).Distributions)

			hard := readHand(t, handInstance(c.classes, distXML(c.typ, len(c.classes), `required="true"`)))
			h := XMLHardViolations(hard, forcedSolution(hard))
			wantHard := 0
			if c.want > 0 {
				wantHard = 1
			}
			assert.Equal(t, wantHard, h.Distributions, "a required distribution is broken when its soft twin costs")
			_, hp := XMLCost(hard, forcedSolution(hard))
			assert.Zero(t, hp.Distribution, "a required distribution adds no cost")
		})
	}
}

// TestXMLHardAndPenalties checks the rest of the published cost and the
// hard requirements (https://www.itc2019.org/format, sections "Rooms",
// "Times", "Solution"): the time and room penalties of the chosen
// assignments times their weights; two classes in one room overlapping in
// time, day and week; a class meeting while its room is unavailable; an
// assignment outside the listed times or rooms; and student conflicts (a
// pair of a student's classes overlapping, or with fewer slots between them
// than the travel time between their rooms).
func TestXMLHardAndPenalties(t *testing.T) {
	src := "<problem name=\"p\" nrDays=\"7\" slotsPerDay=\"288\" nrWeeks=\"2\">" +
		"<optimization time=\"2\" room=\"3\" distribution=\"5\" student=\"7\"/>" +
		"<rooms><room id=\"1\" capacity=\"20\"><unavailable days=\"1000000\" start=\"100\" length=\"20\" weeks=\"10\"/></room>" +
		"<room id=\"2\" capacity=\"30\"><travel room=\"1\" value=\"4\"/></room></rooms>" +
		"<courses><course id=\"1\"><config id=\"1\"><subpart id=\"1\">" +
		"<class id=\"a\" limit=\"10\"><room id=\"1\" penalty=\"0\"/><room id=\"2\" penalty=\"7\"/>" +
		"<time days=\"1000000\" start=\"100\" length=\"10\" weeks=\"01\" penalty=\"0\"/>" +
		"<time days=\"1000000\" start=\"100\" length=\"10\" weeks=\"11\" penalty=\"4\"/></class>" +
		"<class id=\"b\" limit=\"10\"><room id=\"1\" penalty=\"1\"/><room id=\"2\" penalty=\"0\"/>" +
		"<time days=\"1000000\" start=\"105\" length=\"10\" weeks=\"01\" penalty=\"1\"/>" +
		"<time days=\"1000000\" start=\"112\" length=\"10\" weeks=\"01\" penalty=\"0\"/></class>" +
		"</subpart></config></course></courses></problem>"
	in := readHand(t, src)
	as := func(class string, time int, room string, students ...string) XMLAssignment {
		c := in.Classes[in.classIndex()[class]]
		tm := c.Times[time]
		return XMLAssignment{Class: class, Days: tm.Days, Start: tm.Start, Weeks: tm.Weeks, Room: room, Students: students}
	}
	cases := []struct {
		name  string
		sol   []XMLAssignment
		parts XMLParts
		hard  XMLHard
	}{
		// a: week 2 only, room 1 (free in week 2); b at 112 in room 2: no clash.
		{"valid", []XMLAssignment{as("a", 0, "1"), as("b", 1, "2")}, XMLParts{}, XMLHard{}},
		// a's second time (penalty 4) meets in week 1 when room 1 is unavailable.
		{"unavailable room", []XMLAssignment{as("a", 1, "1"), as("b", 1, "2")}, XMLParts{Time: 4}, XMLHard{RoomUnavailable: 1}},
		// both in room 2 (a pays 7), 100-110 and 105-115 in week 2: one clash; b's time pays 1.
		{"room clash", []XMLAssignment{as("a", 0, "2"), as("b", 0, "2")}, XMLParts{Time: 1, Room: 7}, XMLHard{RoomClashes: 1}},
		// same times in different rooms: no clash; a student in both overlaps: one conflict.
		// (The instance has no students: each of the 3 listings breaks the
		// student rules, see TestXMLSectioningRules.)
		{"student overlap", []XMLAssignment{as("a", 0, "1", "s1", "s2"), as("b", 0, "2", "s1")}, XMLParts{Time: 1, Student: 1}, XMLHard{Sectioning: 3}},
		// 100-110 in room 1 then 112 in room 2: 2 slots < travel 4: a conflict per student.
		{"student travel", []XMLAssignment{as("a", 0, "1", "s1", "s2"), as("b", 1, "2", "s1", "s2")}, XMLParts{Student: 2}, XMLHard{Sectioning: 4}},
		// b missing; a in a room it does not list.
		{"unplaced and not listed", []XMLAssignment{{Class: "a", Days: 1, Start: 100, Weeks: 2, Room: "3"}}, XMLParts{}, XMLHard{Unplaced: 1, NotListed: 1}},
		// a at a time it does not list.
		{"time not listed", []XMLAssignment{{Class: "a", Days: 1, Start: 101, Weeks: 2, Room: "1"}, as("b", 1, "2")}, XMLParts{}, XMLHard{NotListed: 1}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			sol := &XMLSolution{Name: "p", Classes: c.sol}
			total, parts := XMLCost(in, sol)
			assert.Equal(t, c.parts, parts)
			assert.Equal(t, 2*c.parts.Time+3*c.parts.Room+7*c.parts.Student, total, "the weighted sum of the parts")
			assert.Equal(t, c.hard, XMLHardViolations(in, sol))
		})
	}
}

// TestXMLBestReproducesTotals: the shared table's source says its
// components reproduce each published total with the instance's weights;
// check that claim for every instance present (the student part included).
func TestXMLBestReproducesTotals(t *testing.T) {
	dir := xmlDataDir(t)
	best := readSharedBest(t, dir)
	require.NotEmpty(t, best)
	for name, b := range best {
		in := readSharedXML(t, name)
		assert.Equal(t, b.Best, b.Parts.Weighted(in.Weights), name)
		assert.Less(t, b.Reference(in.Weights), b.Best+1, name)
	}
}

func TestReadXMLBestErrors(t *testing.T) {
	cases := []struct{ name, src, want string }{
		{"empty", "", "best.csv: the file is empty"},
		{"missing column", "instance,best,time,room\n", `best.csv:1: the header has no "distribution" column`},
		{"bad number", "instance,best,time,room,distribution\nx,1,a,0,0\n", `best.csv:2: time of x "a" is not a whole number`},
		{"duplicate", "instance,best,time,room,distribution\nx,1,1,0,0\nx,2,2,0,0\n", `best.csv:3: instance "x" is already listed on line 2`},
		{"optimal", "instance,best,time,room,distribution,proven_optimal\nx,1,1,0,0,maybe\n", "write yes or no"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			_, err := ReadXMLBest(strings.NewReader(c.src), "best.csv")
			require.Error(t, err)
			assert.ErrorIs(t, err, ErrXMLFormat)
			assert.Contains(t, err.Error(), c.want)
		})
	}
	got, err := ReadXMLBest(strings.NewReader("instance,best,lower_bound,proven_optimal,time,room,distribution,student_conflicts\nx,37,30,yes,1,2,3,4\n"), "best.csv")
	require.NoError(t, err)
	assert.Equal(t, XMLBest{Instance: "x", Best: 37, LowerBound: 30, Optimal: true, Parts: XMLParts{1, 2, 3, 4}, Line: 2}, got["x"])
	assert.Equal(t, 1*1+2*2+3*3, got["x"].Reference(XMLWeights{1, 2, 3, 4}), "time, room and distribution parts times their weights")
}
