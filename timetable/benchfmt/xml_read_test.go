package benchfmt

import (
	"bytes"
	"errors"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"github.com/termwright/termwright/timetable"
)

// TestReadXMLSmallInstances reads the four small shared instances. The
// class counts are those the competition publishes for them (ITC 2019
// instance table: bet-sum18 127, lums-sum17 20, pu-cs-fal07 174, wbg-fal10
// 150 classes); rooms, distributions and students are counted here
// independently of the reader, by a text search over the file.
func TestReadXMLSmallInstances(t *testing.T) {
	dir := xmlDataDir(t)
	cases := []struct {
		name    string
		classes int
	}{{"bet-sum18", 127}, {"lums-sum17", 20}, {"pu-cs-fal07", 174}, {"wbg-fal10", 150}}
	count := func(data []byte, re string) int { return len(regexp.MustCompile(re).FindAll(data, -1)) }
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			data, err := os.ReadFile(filepath.Join(dir, c.name+".xml"))
			if os.IsNotExist(err) {
				t.Skip("not in the shared folder")
			}
			require.NoError(t, err)
			require.True(t, bytes.HasPrefix(data, []byte("\ufeff")), "the shared files start with a byte-order mark")
			in, err := ReadXML(bytes.NewReader(data), c.name+".xml")
			require.NoError(t, err)
			assert.Equal(t, c.name, in.Name)
			assert.Len(t, in.Classes, c.classes)
			assert.Len(t, in.Rooms, count(data, `<room id="[^"]*" capacity=`))
			assert.Len(t, in.Distributions, count(data, `<distribution `))
			assert.Len(t, in.Students, count(data, `<student `))
			weeks := count(data, `nrWeeks="`)
			require.Equal(t, 1, weeks)

			term := in.Term()
			assert.Equal(t, in.Weeks, term.TeachingWeeks(), "the term has the instance's weeks")
			assert.Len(t, term.Sections, c.classes)
			assert.Len(t, term.Rooms, len(in.Rooms))
			for i, s := range term.Sections {
				cl := in.Classes[i]
				assert.Len(t, s.Times, len(cl.Times))
				assert.Equal(t, cl.NoRoom, s.NoRoom)
				for _, rc := range s.RoomChoices {
					assert.LessOrEqual(t, s.Size, term.Rooms[term.RoomIndex()[rc.Room]].Capacity, "every listed room of %s fits", s.ID)
				}
			}
			// Soft pairwise distributions split into one relation per pair;
			// counted kinds and required ones stay whole.
			want := 0
			for _, d := range in.Distributions {
				k := xmlRelation[d.Type]
				switch {
				case !d.Required && d.Penalty == 0:
				case k.Counted():
					want++
				case len(d.Classes) < 2:
				case d.Required:
					want++
				default:
					want += len(d.Classes) * (len(d.Classes) - 1) / 2
				}
			}
			assert.Len(t, term.Relations, want)
		})
	}
}

// TestXMLTermMapping checks the mapping on a hand-made instance: slots of 5
// minutes from midnight (slot 90 is 07:30), days Monday first, weeks as
// teaching weeks, room unavailability split per day with its weeks, travel
// in minutes, distribution kinds and numbers in minutes, and the weights.
func TestXMLTermMapping(t *testing.T) {
	in := readHand(t, handInstance([]tc{{"1010100", 90, 10, "1010", "R1"}, {"0000011", 100, 12, "0001", ""}},
		distXML("MaxBlock(20,2)", 2, `penalty="5"`)+distXML("SameAttendees", 2, `penalty="3"`)+distXML("WorkDay(24)", 2, `required="true"`)))
	in.Rooms[0].Unavailable = []XMLTime{{Days: 0b0000101, Start: 144, Length: 12, Weeks: 0b0011}}
	term := in.Term()
	assert.Equal(t, 4, term.TeachingWeeks())
	s := term.Sections[0]
	require.Len(t, s.Times, 1)
	assert.Equal(t, timetable.TimeChoice{Days: timetable.DaysOf(1, 3, 5), Start: 7*60 + 30, Minutes: 50, Weeks: 0b0101}, s.Times[0])
	assert.Equal(t, []timetable.RoomChoice{{Room: "R1"}}, s.RoomChoices)
	assert.Equal(t, timetable.DaysOf(6, 0), term.Sections[1].Times[0].Days, "the last two days are Saturday and Sunday")
	assert.True(t, term.Sections[1].NoRoom)
	assert.Equal(t, []timetable.Unavailability{
		{Who: "R1", Kind: timetable.WhoRoom, Day: 1, From: 12 * 60, To: 13 * 60, Hard: true, Weeks: 0b0011, Reason: "not available"},
		{Who: "R1", Kind: timetable.WhoRoom, Day: 3, From: 12 * 60, To: 13 * 60, Hard: true, Weeks: 0b0011, Reason: "not available"},
	}, term.Unavailable)
	assert.Equal(t, []timetable.Travel{{From: "R2", To: "R1", Minutes: 15}}, term.Travel)
	assert.Equal(t, 15, term.TravelMinutes("R1", "R2"))
	assert.Equal(t, []timetable.Relation{
		{Kind: timetable.MaxBlock, Sections: []string{"1", "2"}, Weight: 5, N: 100, M: 10},
		{Kind: timetable.SamePeople, Sections: []string{"1", "2"}, Weight: 3},
		{Kind: timetable.DaySpan, Sections: []string{"1", "2"}, Hard: true, N: 120},
	}, term.Relations)
	for _, c := range timetable.Criteria {
		want := 0
		switch c.Name {
		case timetable.CritTimeChoice, timetable.CritRoomChoice, timetable.CritSoftRelations, timetable.CritStudentClash, timetable.CritUnplaced:
			want = 1
		}
		w, _ := term.CriterionWeight(c.Name)
		assert.Equal(t, want, w, c.Name)
	}
}

func TestReadXMLErrors(t *testing.T) {
	head := `<problem name="p" nrDays="7" slotsPerDay="288" nrWeeks="2">` + "\n"
	class := func(attrs, body string) string {
		return head + `<courses><course id="1"><config id="1"><subpart id="1">` + "\n" +
			`<class id="1" limit="5"` + attrs + ">" + body + "</class>\n</subpart></config></course></courses></problem>"
	}
	okTime := `<time days="1000000" start="1" length="2" weeks="11"/>`
	cases := []struct{ name, src, want string }{
		{"not xml", "<problem name=\"p\"", "p.xml:1: the file is not well-formed XML"},
		{"text only", "hello", "p.xml: the file holds no instance"},
		{"empty", "", "p.xml: the file holds no instance"},
		{"other root", "<timetable/>", "p.xml:1: element <timetable> is not expected here"},
		{"weeks", `<problem name="p" nrDays="7" slotsPerDay="288" nrWeeks="x"/>`, `p.xml:1: the instance has number of weeks "x"; it must be a whole number`},
		{"too many weeks", `<problem name="p" nrDays="7" slotsPerDay="288" nrWeeks="65"/>`, "at most 64"},
		{"days length", class("", `<time days="100" start="1" length="2" weeks="11"/>`), `p.xml:3: a time of class "1" has days "100" of 3 characters; it must have 7`},
		{"bits", class("", `<time days="1000000" start="1" length="2" weeks="1x"/>`), "use only 0 and 1"},
		{"past midnight", class("", `<time days="1000000" start="280" length="10" weeks="11"/>`), "ends at slot 290, after the day's 288 slots"},
		{"no time", class("", ""), `p.xml:3: class "1" has no time`},
		{"unknown room", class("", `<room id="9" penalty="0"/>`+okTime), `class "1" may use room "9", which is not given`},
		{"room flag", class(` room="maybe"`, okTime), `class "1" has room "maybe"; write true or false`},
		{"negative limit", head + `<courses><course id="1"><config id="1"><subpart id="1"><class id="1" limit="-1">` + okTime + `</class></subpart></config></course></courses></problem>`, "limit \"-1\"; it must be a whole number from 0"},
		{"unknown type", head + `<distributions><distribution type="Sometimes" required="true"/></distributions></problem>`, `type "Sometimes", which the ITC-2019 rules do not define`},
		{"missing numbers", head + `<distributions><distribution type="MaxBlock" required="true"/></distributions></problem>`, "takes 2 numbers in parentheses"},
		{"wrong count", head + `<distributions><distribution type="MaxBlock(3)" required="true"/></distributions></problem>`, "takes 2 numbers but has 1"},
		{"no penalty", head + `<distributions><distribution type="SameRoom"/></distributions></problem>`, "a constraint has no penalty"},
		{"unknown class", head + `<distributions><distribution type="SameRoom" required="true"><class id="7"/></distribution></distributions></problem>`, `names class "7", which is not given`},
		{"stray text", head + "words</problem>", `text "words" stands outside any attribute`},
		{"two rooms", head + `<rooms><room id="1" capacity="1"/><room id="1" capacity="2"/></rooms></problem>`, `room "1" is given twice`},
		{"unknown course", head + `<students><student id="5"><course id="9"/></student></students></problem>`, `p.xml:2: student "5" wants course "9", which is not given`},
		{"course twice", strings.TrimSuffix(class("", okTime), "</problem>") + `<students><student id="5"><course id="1"/><course id="1"/></student></students></problem>`, `student "5" wants course "1" twice`},
		{"student twice", head + `<students><student id="5"/><student id="5"/></students></problem>`, `student "5" is given twice`},
		{"parent same part", class(` parent="1"`, okTime), `class "1" has parent "1", which is not of another part of its configuration`},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			_, err := ReadXML(strings.NewReader(c.src), "p.xml")
			require.Error(t, err)
			assert.ErrorIs(t, err, ErrXMLFormat)
			assert.False(t, errors.Is(err, ErrCTTFormat))
			var list Errors
			require.True(t, errors.As(err, &list))
			assert.Contains(t, err.Error(), c.want)
		})
	}
}

// TestReadXMLByteOrderMark: a file with and without the mark reads the same.
func TestReadXMLByteOrderMark(t *testing.T) {
	src := handInstance([]tc{{"1000000", 90, 10, "1111", "R1"}}, "")
	with, err := ReadXML(strings.NewReader(src), "a.xml")
	require.NoError(t, err)
	without, err := ReadXML(strings.NewReader(strings.TrimPrefix(src, "\ufeff")), "b.xml")
	require.NoError(t, err)
	assert.Equal(t, with, without)
}

// courseXML is a hand-made instance with course A in two configurations
// (config 1: a main class subpart with classes 1, 2 and a lab subpart with
// classes 3, 4 whose parents are 1 and 2; config 2: one class 5) and
// course B with one class 6, and students 7 (A, B), 8 (B) and 9 (A).
// Student weight 4.
const courseXML = `<problem name="c" nrDays="5" slotsPerDay="288" nrWeeks="1">
<optimization time="1" room="1" distribution="1" student="4"/>
<courses>
<course id="A"><config id="1"><subpart id="L">
<class id="1" limit="30" room="false"><time days="10000" start="100" length="10" weeks="1"/></class>
<class id="2" limit="30" room="false"><time days="01000" start="100" length="10" weeks="1"/></class>
</subpart><subpart id="P">
<class id="3" limit="12" parent="1" room="false"><time days="00100" start="100" length="10" weeks="1"/></class>
<class id="4" limit="12" parent="2" room="false"><time days="00010" start="100" length="10" weeks="1"/></class>
</subpart></config><config id="2"><subpart id="X">
<class id="5" limit="1" room="false"><time days="00001" start="100" length="10" weeks="1"/></class>
</subpart></config></course>
<course id="B"><config id="3"><subpart id="Y">
<class id="6" limit="20" room="false"><time days="10000" start="200" length="10" weeks="1"/></class>
</subpart></config></course>
</courses>
<students><student id="7"><course id="A"/><course id="B"/></student><student id="8"><course id="B"/></student><student id="9"><course id="A"/></student></students>
</problem>`

// TestXMLTermCourses checks the course structure and the students in the
// mapped term: course, configuration, subpart, parent and limit per
// section, Term.Courses as the instance lists them, one request per
// wanted course, and the student weight on "student clashes".
func TestXMLTermCourses(t *testing.T) {
	in := readHand(t, courseXML)
	term := in.Term()
	type sec struct {
		course, arr, part, parent string
		limit                     int
	}
	var got []sec
	for _, s := range term.Sections {
		got = append(got, sec{s.Course, s.Arrangement, s.Part, s.Parent, s.Limit})
	}
	assert.Equal(t, []sec{
		{"A", "1", "L", "", 30}, {"A", "1", "L", "", 30}, {"A", "1", "P", "1", 12}, {"A", "1", "P", "2", 12},
		{"A", "2", "X", "", 1}, {"B", "3", "Y", "", 20},
	}, got)
	assert.Equal(t, []timetable.Course{
		{ID: "A", Arrangements: []timetable.Arrangement{
			{ID: "1", Parts: []timetable.Part{{ID: "L", Sections: []int{0, 1}}, {ID: "P", Sections: []int{2, 3}}}},
			{ID: "2", Parts: []timetable.Part{{ID: "X", Sections: []int{4}}}},
		}},
		{ID: "B", Arrangements: []timetable.Arrangement{{ID: "3", Parts: []timetable.Part{{ID: "Y", Sections: []int{5}}}}}},
	}, term.Courses())
	assert.Equal(t, []timetable.Request{{Student: "7", Course: "A"}, {Student: "7", Course: "B"}, {Student: "8", Course: "B"}, {Student: "9", Course: "A"}}, term.Requests)
	w, _ := term.CriterionWeight(timetable.CritStudentClash)
	assert.Equal(t, 4, w)
	assert.Equal(t, 12, term.SectionLimit(2))
}
