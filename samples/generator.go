package samples

import (
	"math/bits"
	"math/rand/v2"
	"slices"
	"time"

	"github.com/termwright/termwright/timetable"
)

// Generate builds a synthetic term for cfg (see Config and the package
// documentation). It panics only on a config that fails Config.Validate;
// callers that take sizes from users validate first.
func Generate(cfg Config) *timetable.Term {
	t, _ := GenerateWithWitness(cfg)
	return t
}

// GenerateWithWitness builds the term of Generate together with the hidden
// reference timetable it was derived from. The witness places every meeting
// of every section and satisfies every hard requirement of the term (clashes
// with week sets, room capacity and features, allowed rooms, hard
// unavailability, fixed meetings, hard relations, staff limits, meetings of a
// section on different days), so it proves the term feasible.
func GenerateWithWitness(cfg Config) (*timetable.Term, *timetable.Schedule) {
	if err := cfg.Validate(); err != nil {
		panic("samples: " + err.Error())
	}
	g := newGen(cfg.withDefaults())
	g.build()
	return g.term(), g.witness()
}

// build runs the generator's steps in order: the grid, the catalogue,
// staff, rooms, the witness placement, enrolments and the derived rows.
func (g *gen) build() {
	g.buildGrid()
	g.buildCatalogue()
	g.assignStaff()
	g.buildRooms()
	g.placeAll()
	g.enrol()
	g.derive()
}

// gen holds the whole generation state. Indexes into its slices stand for
// the records; string IDs are made once and copied into the Term at the end.
type gen struct {
	cfg     Config
	rng     *rand.Rand
	periods []timetable.Period // the grid, as it goes into the Term
	days    []time.Weekday     // days of the grid in week order
	maxRun  int                // longest run of consecutive periods
	capLoad int                // most periods a week given to one cohort or staff member
	all     timetable.WeekSet  // every teaching week

	depts     []dept
	courses   []course
	secs      []sec
	cohorts   []cohort
	staff     []staffer
	rooms     []room
	bySize    []int // room indexes by capacity (ties by index); rebuilt when rooms are added or sorted
	buildings []building

	occStaff, occCohort, occRoom [][]timetable.WeekSet // witness occupancy [resource][period]

	students    []student
	unavailable []timetable.Unavailability
	relations   []timetable.Relation
	weights     map[string]timetable.Weight
	holidays    []time.Time
	stats       genStats
}

// genStats counts the repairs the generator needed; tests keep them rare.
type genStats struct {
	addedRooms int // rooms added because the witness could not place a section
	relaxed    int // sections whose shape was simplified to place them
	unpaired   int // same-time or back-to-back pairs dropped because they did not fit
}

type dept struct {
	sub      subject
	building int      // home building
	courseNo [5]int   // courses made so far per year (1..4)
	groupNo  [5]int   // cohorts made so far per year
	titles   []string // distinct course titles so far (at most 50: 5 topics × 10 forms)
}

type course struct {
	dept, year int
	title      string
	plenary    int   // section index of the plenary, -1 for none
	groups     []int // section indexes of its laboratory/tutorial sections
}

// Section kinds.
const (
	kindPlenary  = 'L'
	kindLab      = 'P' // practical (laboratory)
	kindTutorial = 'T'
	kindElective = 'E'
)

type sec struct {
	id, title string
	dept      int
	course    int  // index into courses; -1 for electives
	kind      byte // kindPlenary ...
	staff     []int
	cohorts   []int
	size      int
	meetings  int
	length    int
	needs     []string // sorted room features
	noRoom    bool
	weeks     timetable.WeekSet
	sameDay   bool
	minDays   int
	fixed     []timetable.Fixed
	allowed   []int // allowed rooms; nil = any that fits

	starts []int // witness: start period per meeting, ascending
	rooms  []int // witness: room per meeting (-1 for no room)

	partner int // same-time partner to copy the starts of, -1 for none
	follows int // back-to-back predecessor to start right after, -1 for none
}

func (s *sec) load() int { return s.meetings * s.length }

type cohort struct {
	id, name string
	dept     int
	year     int
	size     int
	secs     []int
	load     int // periods a week of its sections
}

type staffer struct {
	id, name, email string
	dept            int
	secs            []int
	load            int // periods a week
	want            int // number of sections this person is meant to teach (1-4)
	maxPerDay       int
	maxConsecutive  int
}

type room struct {
	id       string
	building int
	floor    int
	capacity int
	features []string // sorted
}

type building struct {
	name, code string
}

type student struct {
	id     string
	cohort int
	extra  int // elective section index, -1 for none
}

func newGen(cfg Config) *gen {
	return &gen{
		cfg: cfg,
		rng: rand.New(rand.NewPCG(cfg.Seed, 0x7465726d77726974)), // second word: "termwrit"
	}
}

// chance reports true with probability p.
func (g *gen) chance(p float64) bool { return g.rng.Float64() < p }

// between returns a whole number in [lo, hi].
func (g *gen) between(lo, hi int) int { return lo + g.rng.IntN(hi-lo+1) }

// pick returns a random element's index by weights.
func (g *gen) pickWeighted(weights []int) int {
	total := 0
	for _, w := range weights {
		total += w
	}
	r := g.rng.IntN(total)
	for i, w := range weights {
		if r < w {
			return i
		}
		r -= w
	}
	return len(weights) - 1
}

// shuffled returns 0..n-1 in random order.
func (g *gen) shuffled(n int) []int {
	p := make([]int, n)
	for i := range p {
		p[i] = i
	}
	g.rng.Shuffle(n, func(i, j int) { p[i], p[j] = p[j], p[i] })
	return p
}

// buildGrid makes the weekly grid: PeriodsPerDay one-hour periods a day from
// 08:00, with a lunch hour after the fourth period (or after the first half
// when there are fewer than six periods).
func (g *gen) buildGrid() {
	n := g.cfg.PeriodsPerDay
	morning := 4
	if n < 6 {
		morning = (n + 1) / 2
	}
	for d := 0; d < g.cfg.Days; d++ {
		day := time.Weekday((d + 1) % 7)
		g.days = append(g.days, day)
		for i := 0; i < n; i++ {
			start := timetable.Clock(8*60 + i*60)
			if i >= morning {
				start += 60
			}
			g.periods = append(g.periods, timetable.Period{Index: len(g.periods), Day: day, Start: start, End: start + 60})
		}
	}
	g.maxRun = max(morning, n-morning)
	g.capLoad = max(1, len(g.periods)*3/5)
	g.all = g.termShell().AllWeeks()
}

// termShell is the Term with its calendar only, for week arithmetic.
func (g *gen) termShell() *timetable.Term {
	return &timetable.Term{FirstDay: g.cfg.FirstDay, LastDay: g.lastDay()}
}

// lastDay is the last grid day of the last teaching week.
func (g *gen) lastDay() time.Time {
	first := g.cfg.FirstDay
	monday := first.AddDate(0, 0, -timetable.WeekOrder(first.Weekday()))
	return monday.AddDate(0, 0, 7*(g.cfg.Weeks-1)+g.cfg.Days-1)
}

// span returns the periods a meeting of length starting at p occupies.
func (g *gen) span(p, length int) ([]int, bool) {
	if p < 0 || p+length > len(g.periods) {
		return nil, false
	}
	for i := p + 1; i < p+length; i++ {
		a, b := g.periods[i-1], g.periods[i]
		if a.Day != b.Day || a.End != b.Start {
			return nil, false
		}
	}
	out := make([]int, length)
	for i := range out {
		out[i] = p + i
	}
	return out, true
}

// sortedStrings returns a sorted copy without duplicates.
func sortedStrings(xs []string) []string {
	out := slices.Clone(xs)
	slices.Sort(out)
	return slices.Compact(out)
}

// weekCount is the number of weeks in w.
func weekCount(w timetable.WeekSet) int { return bits.OnesCount64(uint64(w)) }

// weeksRange is the set of weeks a to b (1-based, inclusive).
func weeksRange(a, b int) timetable.WeekSet {
	var w timetable.WeekSet
	for n := a; n <= b && n <= 64; n++ {
		w |= 1 << (n - 1)
	}
	return w
}
