package samples

import (
	"bytes"
	"regexp"
	"slices"
	"strconv"
	"strings"
	"testing"
	"time"
	"unicode"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"github.com/termwright/termwright/timetable"
)

func TestConfigValidate(t *testing.T) {
	cases := []struct {
		name string
		cfg  Config
		want string // "" = valid
	}{
		{"demo", DemoConfig, ""},
		{"one section", Config{Sections: 1}, ""},
		{"largest", Config{Sections: MaxSections}, ""},
		{"no sections", Config{}, "sections must be from 1 to 100000, not 0"},
		{"too many sections", Config{Sections: MaxSections + 1}, "sections must be from 1"},
		{"eight days", Config{Sections: 5, Days: 8}, "days must be from 1 to 7"},
		{"negative days", Config{Sections: 5, Days: -1}, "days must be"},
		{"one period a day", Config{Sections: 5, PeriodsPerDay: 1}, "periods per day must be from 2 to 13"},
		{"fourteen periods", Config{Sections: 5, PeriodsPerDay: 14}, "periods per day"},
		{"53 weeks", Config{Sections: 5, Weeks: 53}, "weeks must be from 1 to 52"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			err := c.cfg.Validate()
			if c.want == "" {
				assert.NoError(t, err)
				return
			}
			require.Error(t, err)
			assert.Contains(t, err.Error(), c.want)
		})
	}
}

func TestGenerateDeterministic(t *testing.T) {
	cfg := Config{Sections: 120, Seed: 99}
	a, wa := GenerateWithWitness(cfg)
	b, wb := GenerateWithWitness(cfg)
	assert.Equal(t, a, b)
	assert.Equal(t, wa, wb)
	var xa, xb bytes.Buffer
	require.NoError(t, timetable.WriteTermWorkbook(a, &xa))
	require.NoError(t, timetable.WriteTermWorkbook(b, &xb))
	assert.True(t, bytes.Equal(xa.Bytes(), xb.Bytes()), "equal configs give byte-identical workbooks")

	c := Generate(Config{Sections: 120, Seed: 100})
	assert.NotEqual(t, a.Sections, c.Sections, "another seed gives another term")
}

// TestProportions checks the sizes the issue asks for: about 30 rooms, 70
// staff and 25 cohorts for 150 sections; 200-300 rooms, about 700 staff and
// about 300 cohorts for 2,000.
func TestProportions(t *testing.T) {
	cases := []struct {
		sections                     int
		rooms, staff, cohorts, studs [2]int
	}{
		{150, [2]int{24, 40}, [2]int{55, 85}, [2]int{18, 34}, [2]int{250, 900}},
		{2000, [2]int{180, 320}, [2]int{600, 850}, [2]int{250, 400}, [2]int{4000, 11000}},
	}
	for _, c := range cases {
		t.Run(strconv.Itoa(c.sections), func(t *testing.T) {
			if c.sections > 1000 && testing.Short() {
				t.Skip("large term in -short mode")
			}
			for _, seed := range []uint64{1, 2, 3} {
				term := Generate(Config{Sections: c.sections, Seed: seed})
				n := timetable.Summary(term)
				assert.Equal(t, c.sections, n.Sections)
				assert.Equal(t, 45, n.Periods)
				inRange(t, "rooms", n.Rooms, c.rooms)
				inRange(t, "staff", n.Staff, c.staff)
				inRange(t, "cohorts", n.Cohorts, c.cohorts)
				inRange(t, "students", n.Students, c.studs)
			}
		})
	}
}

func inRange(t *testing.T, what string, got int, r [2]int) {
	t.Helper()
	assert.True(t, got >= r[0] && got <= r[1], "%s: %d not in [%d, %d]", what, got, r[0], r[1])
}

// TestShape checks the rules the generator promises: staff teach one to four
// sections, cohorts take at most eight and carry well under the grid,
// sections have 1-3 meetings of 1-3 periods, labs need "lab", sizes fit
// some room, cohort sizes add up to section sizes, enrolments follow
// cohorts, and repairs were rare.
func TestShape(t *testing.T) {
	for _, cfg := range []Config{DemoConfig, {Sections: 800, Seed: 4}} {
		g := newGen(cfg.withDefaults())
		g.build()
		term := g.term()
		assert.LessOrEqual(t, g.stats.addedRooms+g.stats.relaxed, max(1, cfg.Sections/100), "repairs stay rare: %+v", g.stats)

		teaches := map[string]int{}
		cohortSecs := map[string][]string{}
		sizes := map[string]int{}
		for _, c := range term.Cohorts {
			sizes[c.ID] = c.Size
		}
		maxCap := 0
		for _, r := range term.Rooms {
			maxCap = max(maxCap, r.Capacity)
		}
		for _, s := range term.Sections {
			require.NotEmpty(t, s.Staff, s.ID)
			for _, p := range s.Staff {
				teaches[p]++
			}
			sum := 0
			for _, c := range s.Cohorts {
				cohortSecs[c] = append(cohortSecs[c], s.ID)
				sum += sizes[c]
			}
			if len(s.Cohorts) > 0 {
				assert.Equal(t, sum, s.Size, "%s: size is the sum of its cohorts", s.ID)
			}
			assert.True(t, s.Meetings >= 1 && s.Meetings <= 3, "%s meetings %d", s.ID, s.Meetings)
			assert.True(t, s.Length >= 1 && s.Length <= 3, "%s length %d", s.ID, s.Length)
			if strings.Contains(s.ID, "-P") {
				assert.Contains(t, s.Needs, "lab", s.ID)
			}
			assert.LessOrEqual(t, s.Size, maxCap, s.ID)
		}
		for _, st := range term.Staff {
			assert.True(t, teaches[st.ID] >= 1 && teaches[st.ID] <= 4, "%s teaches %d sections", st.ID, teaches[st.ID])
		}
		for _, c := range term.Cohorts {
			assert.LessOrEqual(t, len(cohortSecs[c.ID]), 8, c.ID)
		}
		for _, c := range g.cohorts {
			assert.LessOrEqual(t, c.load, len(term.Periods)*3/5, "%s carries %d periods", c.id, c.load)
		}
		// Enrolments: each student takes exactly their cohort's sections plus at most one elective.
		byStudent := map[string][]string{}
		for _, e := range term.Enrolments {
			byStudent[e.Student] = append(byStudent[e.Student], e.Section)
		}
		for _, st := range g.students {
			want := slices.Clone(cohortSecs[g.cohorts[st.cohort].id])
			if st.extra >= 0 {
				want = append(want, g.secs[st.extra].id)
			}
			slices.Sort(want)
			assert.Equal(t, want, byStudent[st.id], st.id)
		}
	}
}

// TestVariety checks that the demo exercises every feature of the workbook.
func TestVariety(t *testing.T) {
	term := Demo()
	kinds := map[timetable.RelationKind]int{}
	soft := 0
	for _, r := range term.Relations {
		kinds[r.Kind]++
		if !r.Hard {
			soft++
		}
	}
	for _, k := range timetable.RelationKinds {
		if k.Kind <= timetable.SameRoom { // the grid kinds; the pattern demo has the others
			assert.Positive(t, kinds[k.Kind], "a %s relation", k.Name)
		}
	}
	assert.Positive(t, soft, "a weighted relation")

	count := func(f func(s timetable.Section) bool) int {
		n := 0
		for _, s := range term.Sections {
			if f(s) {
				n++
			}
		}
		return n
	}
	all := term.AllWeeks()
	assert.Positive(t, count(func(s timetable.Section) bool { return len(s.Fixed) > 0 }), "fixed meetings")
	assert.Positive(t, count(func(s timetable.Section) bool { return s.NoRoom }), "no-room sections")
	assert.Positive(t, count(func(s timetable.Section) bool { return s.SameDay }), "sections whose meetings may share a day")
	assert.Positive(t, count(func(s timetable.Section) bool { return len(s.Rooms) > 0 }), "allowed-room lists")
	assert.Positive(t, count(func(s timetable.Section) bool { return slices.Contains(s.Needs, "step-free") }), "step-free needs")
	assert.Positive(t, count(func(s timetable.Section) bool { return s.Weeks == all&0x5555555555555555 }), "odd weeks")
	assert.Positive(t, count(func(s timetable.Section) bool { return s.Weeks == all&^0x5555555555555555 }), "even weeks")
	assert.Positive(t, count(func(s timetable.Section) bool { return len(s.Title) > 50 }), "long titles")
	assert.Positive(t, count(func(s timetable.Section) bool { return len(s.Staff) > 1 }), "co-taught sections")

	hard, weighted := map[timetable.WhoKind]int{}, 0
	for _, u := range term.Unavailable {
		if u.Hard {
			hard[u.Kind]++
		} else {
			weighted++
		}
	}
	assert.Positive(t, hard[timetable.WhoStaff], "hard staff unavailability")
	assert.Positive(t, weighted, "weighted unavailability")
	assert.NotEmpty(t, term.Weights)
	assert.NotEmpty(t, term.Holidays)
	limits := 0
	for _, s := range term.Staff {
		if s.MaxPerDay > 0 || s.MaxConsecutive > 0 {
			limits++
		}
	}
	assert.Positive(t, limits, "staff limits")

	var names strings.Builder
	for _, s := range term.Staff {
		names.WriteString(s.Name + " ")
	}
	has := func(tab *unicode.RangeTable) bool {
		return strings.IndexFunc(names.String(), func(r rune) bool { return unicode.Is(tab, r) }) >= 0
	}
	assert.True(t, has(unicode.Greek), "a Greek name")
	assert.True(t, has(unicode.Cyrillic), "a Cyrillic name")
	assert.True(t, strings.ContainsAny(names.String(), "éèêëóöüáíñłßøåç"), "Latin letters with marks")
}

// TestIDs checks that IDs are unique across staff, rooms, cohorts and
// sections (so an Unavailable row's Who is never ambiguous) and that
// e-mail addresses are unique ASCII addresses at the reserved domain.
func TestIDs(t *testing.T) {
	term := Generate(Config{Sections: 3000, Seed: 8})
	seen := map[string]string{}
	add := func(kind, id string) {
		if prev, dup := seen[id]; dup {
			t.Errorf("ID %q is both a %s and a %s", id, prev, kind)
		}
		seen[id] = kind
	}
	for _, s := range term.Staff {
		add("staff member", s.ID)
	}
	for _, r := range term.Rooms {
		add("room", r.ID)
	}
	for _, c := range term.Cohorts {
		add("cohort", c.ID)
	}
	for _, s := range term.Sections {
		add("section", s.ID)
	}
	email := regexp.MustCompile(`^[a-z]\.[a-z]+[0-9]*@quillmere\.example$`)
	emails := map[string]bool{}
	for _, s := range term.Staff {
		assert.Regexp(t, email, s.Email, s.Name)
		assert.False(t, emails[s.Email], "duplicate %s", s.Email)
		emails[s.Email] = true
	}
}

// TestNameLists checks that every Latin-script name folds to ASCII letters,
// that is, that foldTable covers every marked letter the lists use.
func TestNameLists(t *testing.T) {
	letters := regexp.MustCompile(`^[A-Za-z' ]+$`)
	check := func(name, ascii string) {
		if ascii != "" {
			assert.Regexp(t, letters, ascii, name)
			return
		}
		assert.Regexp(t, letters, asciiFold(name), "%s: add its letters to foldTable", name)
	}
	for _, c := range cultures {
		for _, g := range c.given {
			check(g.name, g.ascii)
		}
		for _, f := range c.family {
			check(f.male, f.ascii)
			if f.female != "" {
				check(f.female, f.asciiFemale)
			}
		}
	}
	assert.Equal(t, "Strauss", asciiFold("Strauß"))
	assert.Equal(t, "Lukasz", asciiFold("Łukasz"))
	assert.Equal(t, "Funmilayo", asciiFold("Fúnmiláyọ̀"), "combining marks are dropped")
	codes := map[string]bool{}
	for _, s := range subjects {
		assert.Len(t, s.code, 3, s.name)
		assert.False(t, codes[s.code], "duplicate code %s", s.code)
		codes[s.code] = true
		assert.Len(t, s.topics, 5, s.name)
	}
}

// TestSmallAndOddConfigs runs the generator at the edges of Config.
func TestSmallAndOddConfigs(t *testing.T) {
	cases := []Config{
		{Sections: 1, Seed: 1},
		{Sections: 2, Seed: 2, Days: 1, PeriodsPerDay: 2, Weeks: 1},
		{Sections: 25, Seed: 3, Days: 3, PeriodsPerDay: 4, Weeks: 2},
		{Sections: 60, Seed: 4, Days: 7, PeriodsPerDay: 13, Weeks: 52},
		{Sections: 40, Seed: 5, Days: 6, PeriodsPerDay: 5, Weeks: 7, FirstDay: time.Date(2028, 1, 12, 15, 4, 0, 0, time.UTC)},
	}
	for _, cfg := range cases {
		t.Run(strconv.Itoa(cfg.Sections), func(t *testing.T) {
			term, w := GenerateWithWitness(cfg)
			full := cfg.withDefaults()
			assert.Len(t, term.Sections, cfg.Sections)
			assert.Len(t, term.Periods, full.Days*full.PeriodsPerDay)
			assert.Equal(t, full.Weeks, term.TeachingWeeks())
			assert.Empty(t, timetable.Validate(term).Errors())
			assert.Empty(t, timetable.HardViolations(timetable.Check(term, w)))
		})
	}
}
