package encode

import (
	"fmt"
	"strings"
	"time"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// Requirement group kinds (Group.Kind).
const (
	KindStaffAvailability  = "staff availability"
	KindCohortAvailability = "cohort availability"
	KindSectionAvail       = "section availability"
	KindRoomAvailability   = "room availability"
	KindStaffNoOverlap     = "staff no-overlap"
	KindCohortNoOverlap    = "cohort no-overlap"
	KindRoomSupply         = "room supply"
	KindRoomFit            = "room fit"
	KindFixed              = "fixed meeting"
	KindSectionDays        = "section days"
	KindStaffDayLimit      = "staff day limit"
	KindStaffConsecutive   = "staff consecutive limit"
	KindRelation           = "relation"
	KindStaffTravel        = "staff travel"
	KindCohortTravel       = "cohort travel"
)

// Relax costs (Group.RelaxCost): how hard it is to give a requirement up,
// from a preference (1) to a physical impossibility. Explanations prefer to
// drop cheap groups. The order is common practice for registrars: a wish for
// a day pattern gives way before a relation between sections, which gives
// way before a pre-assigned meeting, before anyone's availability, before
// room supply, and nobody can be in two places at once.
const (
	RelaxPreference   = 1
	RelaxSectionDays  = 10
	RelaxDayLimit     = 20
	RelaxRelation     = 30
	RelaxFixed        = 40
	RelaxAvailability = 50
	RelaxRooms        = 60
	RelaxNoOverlap    = 80
)

// Group is one requirement group: every constraint that states it has the
// group's selector atom in its body (or bound condition), so that assuming
// the selector false switches the whole requirement off.
type Group struct {
	ID        int                // position in Catalog.Groups
	Kind      string             // one of the Kind... constants
	Selector  solver.Atom        // the selector atom: a fact normally, free in Explain mode
	Sentence  string             // plain words naming people, sections, rooms and periods
	Src       []timetable.Source // workbook rows the requirement comes from
	Hard      bool               // true for hard requirements (all groups so far)
	RelaxCost int                // how hard to give up (Relax... constants)
}

// AtomKind says what an atom of a compiled program means.
type AtomKind uint8

// Atom kinds.
const (
	AtomNone      AtomKind = iota // unknown atom (not made by Compile)
	AtomStart                     // start(S,P): a meeting of section S starts at period P
	AtomSelector                  // req(...): the selector of a requirement group
	AtomBusy                      // busy(T,P): staff member T teaches at period P
	AtomMeetsDay                  // meets(S,D): section S has a meeting on day D
	AtomStartedBy                 // started_by(S,P): a meeting of S starts at or before period P
	AtomAux                       // other auxiliary atoms
)

// String names the kind.
func (k AtomKind) String() string {
	switch k {
	case AtomStart:
		return "start"
	case AtomSelector:
		return "selector"
	case AtomBusy:
		return "busy"
	case AtomMeetsDay:
		return "meets"
	case AtomStartedBy:
		return "started by"
	case AtomAux:
		return "aux"
	case AtomTime:
		return "time"
	case AtomRoom:
		return "room"
	}
	return "none"
}

// AtomInfo is the meaning of one atom. Fields that do not apply are -1.
type AtomInfo struct {
	Kind    AtomKind
	Section int          // index into Term.Sections
	Period  int          // index into Term.Periods
	Staff   int          // index into Term.Staff
	Day     time.Weekday // for AtomMeetsDay
	Group   int          // for AtomSelector: index into Catalog.Groups
	Time    int          // for AtomTime: 1-based pattern index (as Placement.Time); 0 otherwise
	Room    int          // for AtomRoom: index into Term.Rooms
}

// Catalog maps a compiled program back to the term: every atom to its
// meaning, every requirement group to its selector, sentence and rows, and
// every statement to the group that stated it. Solve and Decode read the
// section and room models kept here.
type Catalog struct {
	Groups []Group // requirement groups by ID

	term        *timetable.Term
	explain     bool
	atoms       []AtomInfo             // atoms[a] for atom a; atoms[0] unused
	secs        []secModel             // per section of the term
	pats        []patModel             // per section of the term; on only for pattern sections (pattern_atoms.go)
	anyPat      bool                   // some section is a pattern section
	lazy        []bool                 // lazy[r]: room r's one-at-a-time is checked by Decode (pattern_lazy.go); nil: none
	gridRooms   map[int]*gridRoomModel // grid sections with explicit room atoms (rooms_grid.go); nil: none
	rooms       roomModel
	ruleGroup   []int32        // group of Program.Rules[i], -1 for none
	choiceGroup []int32        // group of Program.Choices[i]
	boundGroup  []int32        // group of Program.Bounds[i]
	boundKind   []string       // what Program.Bounds[i] counts, for Stats
	groupKey    map[string]int // group lookup by kind and key
	soft        *softModel     // weak constraints of the soft criteria (soft.go); nil in Explain mode
}

// secModel is what the catalog keeps of one section.
type secModel struct {
	start     []solver.Atom // start[p]: atom start(S,p), 0 when p is not a candidate
	starts    []int         // candidate start periods, ascending
	length    int           // periods per meeting
	meetings  int           // meetings per week
	weeks     timetable.WeekSet
	takesRoom bool
	cand      int         // effective candidate room set id (rooms.sets); -1 for no-room sections
	fixedCand map[int]int // start period -> room set id of a fixed-room meeting
	sameRoom  int         // index into rooms.sameRoom, -1 when in no same-room relation
}

// candAt is the room set id for the meeting of section s starting at p.
func (m *secModel) candAt(p int) int {
	if id, ok := m.fixedCand[p]; ok {
		return id
	}
	return m.cand
}

// GroupOf returns the group whose selector is sel.
func (c *Catalog) GroupOf(sel solver.Atom) (*Group, bool) {
	if int(sel) >= len(c.atoms) || c.atoms[sel].Kind != AtomSelector {
		return nil, false
	}
	return &c.Groups[c.atoms[sel].Group], true
}

// AtomInfo returns the meaning of atom a (Kind AtomNone for atoms the
// compiler did not make, such as atoms added later by other code).
func (c *Catalog) AtomInfo(a solver.Atom) AtomInfo {
	if int(a) >= len(c.atoms) || a == 0 {
		return AtomInfo{Kind: AtomNone, Section: -1, Period: -1, Staff: -1, Group: -1}
	}
	return c.atoms[a]
}

// Selectors lists the selector literal of every group, in group order: the
// assumptions of an Explain-mode solve that asks for every requirement.
func (c *Catalog) Selectors() []solver.Lit {
	out := make([]solver.Lit, len(c.Groups))
	for i, g := range c.Groups {
		out[i] = solver.Pos(g.Selector)
	}
	return out
}

// StartAtom returns the atom start(S,P) for section index s and period p, or
// 0 when p is not a candidate start of s.
func (c *Catalog) StartAtom(s, p int) solver.Atom {
	if s < 0 || s >= len(c.secs) || p < 0 || p >= len(c.secs[s].start) {
		return 0
	}
	return c.secs[s].start[p]
}

// Candidates lists the candidate start periods of section index s, ascending.
func (c *Catalog) Candidates(s int) []int { return c.secs[s].starts }

// Comment returns the group sentence of one statement of the compiled program
// (kind and index as in solver.WriteProgramComments), or "".
func (c *Catalog) Comment(kind string, index int) string {
	g := c.statementGroup(kind, index)
	if g < 0 {
		return ""
	}
	return c.groupHeading(g)
}

// Commenter returns a comment function for solver.WriteProgramComments that
// prints a group's heading once, before the first statement of a run of
// statements of that group.
func (c *Catalog) Commenter() func(kind string, index int) string {
	last := int32(-2)
	return func(kind string, index int) string {
		g := c.statementGroup(kind, index)
		if g == last {
			return ""
		}
		last = g
		if g < 0 {
			return ""
		}
		return c.groupHeading(g)
	}
}

func (c *Catalog) statementGroup(kind string, index int) int32 {
	var tab []int32
	switch kind {
	case solver.KindRule:
		tab = c.ruleGroup
	case solver.KindChoice:
		tab = c.choiceGroup
	case solver.KindBound:
		tab = c.boundGroup
	}
	if index < 0 || index >= len(tab) {
		return -1
	}
	return tab[index]
}

func (c *Catalog) groupHeading(g int32) string {
	gr := c.Groups[g]
	var b strings.Builder
	fmt.Fprintf(&b, "[%s] %s", gr.Kind, gr.Sentence)
	if src := sourcesText(gr.Src); src != "" {
		b.WriteString(" (" + src + ")")
	}
	return b.String()
}

// sourcesText lists sources compactly: "Sections row 4; Unavailable rows 7, 9".
func sourcesText(src []timetable.Source) string {
	var parts []string
	var sheet string
	var rows []string
	flush := func() {
		if sheet == "" {
			return
		}
		switch len(rows) {
		case 0:
			parts = append(parts, sheet)
		case 1:
			parts = append(parts, sheet+" row "+rows[0])
		default:
			if len(rows) > 8 {
				rows = append(rows[:8], fmt.Sprintf("and %d more", len(rows)-8))
			}
			parts = append(parts, sheet+" rows "+strings.Join(rows, ", "))
		}
		rows = nil
	}
	for _, s := range src {
		if s.Sheet == "" {
			continue
		}
		if s.Sheet != sheet {
			flush()
			sheet = s.Sheet
		}
		if s.Row > 0 {
			rows = append(rows, fmt.Sprint(s.Row))
		}
	}
	flush()
	return strings.Join(parts, "; ")
}
