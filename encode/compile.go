package encode

import (
	"fmt"
	"sort"
	"strings"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// Options control a compilation.
type Options struct {
	// Explain makes every selector a free atom ("{sel}.") for the caller to
	// assume, and stops pruning start candidates by requirements that can be
	// switched off (availability, fixed meetings), so that assuming a
	// selector false really removes its requirement.
	Explain bool
	// Keep is the previous timetable for minimal-change re-planning; the
	// parts that use it are added by the optimiser.
	Keep *timetable.Schedule
	// HardOnly leaves out the parts added with registerPart (the
	// optimiser's weak constraints and their helper atoms): the program of
	// a feasibility search, as Solve uses.
	HardOnly bool
}

// part is one stage of a compilation. Parts run in order; later parts may
// use the atoms earlier parts made (start atoms, room sets).
type part struct {
	name  string
	run   func(b *builder)
	extra bool // added with registerPart; left out by Options.HardOnly
}

// parts is the compilation pipeline. The optimiser appends parts for weak
// constraints with registerPart from its own files.
var parts = []part{
	{"rooms", (*builder).compileRoomSets, false},
	{"pattern choices", (*builder).compilePatternChoices, false},
	{"starts", (*builder).compileStarts, false},
	{"fixed", (*builder).compileFixed, false},
	{"section days", (*builder).compileSectionDays, false},
	{"availability", (*builder).compileAvailability, false},
	{"no-overlap", (*builder).compileNoOverlap, false},
	{"pattern no-overlap", (*builder).compilePatternNoOverlap, false},
	{"pattern travel", (*builder).compilePatternTravel, false},
	{"travel scope", (*builder).compileTravelScope, false},
	{"staff limits", (*builder).compileStaffLimits, false},
	{"relations", (*builder).compileRelations, false},
	{"room supply", (*builder).compileRoomSupply, false},
}

// registerPart appends a stage to the compilation pipeline (call from init).
func registerPart(name string, run func(b *builder)) {
	parts = append(parts, part{name, run, true})
}

// InputError is one problem of the term that stops compilation.
type InputError struct {
	Src timetable.Source // the row at fault; zero when unknown
	Msg string           // what is wrong and what to do
}

// CompileError lists every problem found while compiling, sorted by row.
type CompileError []InputError

// Error lists every problem, one per line, each with its row.
func (e CompileError) Error() string {
	lines := make([]string, len(e))
	for i, x := range e {
		if s := x.Src.String(); s != "" {
			lines[i] = s + ": " + x.Msg
		} else {
			lines[i] = x.Msg
		}
	}
	return "the term cannot be compiled:\n  " + strings.Join(lines, "\n  ")
}

func (b *builder) errorf(src timetable.Source, format string, args ...any) {
	b.errs = append(b.errs, InputError{Src: src, Msg: fmt.Sprintf(format, args...)})
}

// Compile turns a term into a ground program whose stable models are exactly
// the term's timetables up to room assignment (rooms are counted by Hall
// constraints and assigned by Decode; see the package documentation), and a
// catalog that maps the program back to the term. The term should have
// passed timetable.Validate; references Compile cannot resolve are returned
// as a CompileError.
func Compile(t *timetable.Term, opt Options) (*solver.Program, *Catalog, error) {
	b := newBuilder(t, opt)
	b.checkReferences()
	b.buildUnavail()
	b.initPatterns()
	b.initSections()
	if len(b.errs) > 0 {
		return nil, nil, b.compileError()
	}
	for _, pt := range parts {
		if pt.extra && opt.HardOnly {
			continue
		}
		b.in(-1, pt.name)
		pt.run(b)
	}
	if len(b.errs) > 0 {
		return nil, nil, b.compileError()
	}
	return b.p, b.c, nil
}

func (b *builder) compileError() error {
	errs := append(CompileError(nil), b.errs...)
	sort.SliceStable(errs, func(i, j int) bool {
		if errs[i].Src.Sheet != errs[j].Src.Sheet {
			return errs[i].Src.Sheet < errs[j].Src.Sheet
		}
		return errs[i].Src.Row < errs[j].Src.Row
	})
	return errs
}

func newBuilder(t *timetable.Term, opt Options) *builder {
	b := &builder{
		t:         t,
		opt:       opt,
		p:         solver.NewProgram(),
		staffIdx:  t.StaffIndex(),
		cohortIdx: t.CohortIndex(),
		roomIdx:   t.RoomIndex(),
		secIdx:    t.SectionIndex(),
		fits:      map[int][]bool{},
		group:     -1,
	}
	b.c = &Catalog{
		term:     t,
		explain:  opt.Explain,
		atoms:    []AtomInfo{{Kind: AtomNone, Section: -1, Period: -1, Staff: -1, Group: -1}},
		secs:     make([]secModel, len(t.Sections)),
		groupKey: map[string]int{},
	}
	return b
}

// checkReferences reports references the compiler cannot resolve.
func (b *builder) checkReferences() {
	t := b.t
	grid := 0
	for i := range t.Sections {
		if !t.Sections[i].UsesTimes() {
			grid++
		}
	}
	if len(t.Periods) == 0 && (grid > 0 || len(t.Sections) == 0) {
		b.errorf(timetable.Source{Sheet: "Periods"}, "the grid has no periods: add the teaching periods of the week")
	}
	for i, p := range t.Periods {
		if p.Index != i {
			b.errorf(p.Src, "period %s is out of order: periods must be sorted by day and start", p.Label())
		}
	}
	for _, sec := range t.Sections {
		for _, id := range sec.Staff {
			if _, ok := b.staffIdx[id]; !ok {
				b.errorf(sec.Src, "section %s: staff %q is not on the Staff sheet", sec.ID, id)
			}
		}
		for _, id := range sec.Cohorts {
			if _, ok := b.cohortIdx[id]; !ok {
				b.errorf(sec.Src, "section %s: cohort %q is not on the Cohorts sheet", sec.ID, id)
			}
		}
		for _, id := range sec.Rooms {
			if _, ok := b.roomIdx[id]; !ok {
				b.errorf(sec.Src, "section %s: room %q is not on the Rooms sheet", sec.ID, id)
			}
		}
		if !sec.UsesTimes() && (sec.Meetings < 1 || sec.Length < 1) {
			b.errorf(sec.Src, "section %s: meetings per week and periods per meeting must be at least 1", sec.ID)
		}
		for _, f := range sec.Fixed {
			if t.PeriodAt(f.Day, f.Start) < 0 {
				b.errorf(sec.Src, "section %s: fixed meeting %q is not at the start of a period of the grid", sec.ID, f.Text)
			}
			if f.Room != "" {
				if _, ok := b.roomIdx[f.Room]; !ok {
					b.errorf(sec.Src, "section %s: fixed meeting %q names room %q, which is not on the Rooms sheet", sec.ID, f.Text, f.Room)
				}
			}
		}
	}
	for _, r := range t.Relations {
		for _, id := range r.Sections {
			if _, ok := b.secIdx[id]; !ok {
				b.errorf(r.Src, "relation %q names section %q, which is not on the Sections sheet", r.Kind, id)
			}
		}
	}
}

// fitsFor returns, for meetings of the given length, which start periods
// keep the meeting inside one run of consecutive periods (Term.Span).
func (b *builder) fitsFor(length int) []bool {
	if f, ok := b.fits[length]; ok {
		return f
	}
	f := make([]bool, len(b.t.Periods))
	for p := range f {
		_, f[p] = b.t.Span(p, length)
	}
	b.fits[length] = f
	return f
}

// weeksOf is the section's week set; a zero set means every week.
func (b *builder) weeksOf(sec *timetable.Section) timetable.WeekSet {
	if sec.Weeks == 0 {
		return b.t.AllWeeks()
	}
	return sec.Weeks
}
