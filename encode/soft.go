package encode

import (
	"math"
	"slices"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

func init() { registerPart("soft criteria", (*builder).compileSoft) }

// softModel records what the soft criteria added to a program: the
// criterion of every weak constraint they wrote, and the kept timetable's
// pairing for "moved meetings".
type softModel struct {
	crit []int8     // crit[i]: index into timetable.Criteria of Program.Weaks[i], -1 for weak constraints written by others
	subj []int32    // subj[i]: whom Program.Weaks[i] is about (see aboutSection), noSubject when unknown
	keep *keepModel // nil without Options.Keep
	// The statements the soft criteria added: Program.Rules[rules[0]:rules[1]],
	// and likewise for choices and bounds (they are contiguous: the soft
	// criteria are the last part of a compilation).
	rules, choices, bounds [2]int
}

// softBuilder writes the weak constraints of the soft criteria. It keeps
// the auxiliary atoms it makes so that each is made once.
type softBuilder struct {
	*builder
	m       *softModel
	subject int32                   // subject of the weak constraints being written
	occ     map[int][]solver.Lit    // occ[s][p]: "section s occupies p" (a start literal or an occupies atom), 0 when impossible
	attends map[int][]solver.Lit    // attends[c][p]: "cohort c has a meeting at p", 0 when impossible
	blocks  map[string][]solver.Lit // busy rows of blocks of sections (student clashes), by member list
}

// critIndex maps criterion names to positions in timetable.Criteria.
var critIndex = func() map[string]int8 {
	m := map[string]int8{}
	for i, c := range timetable.Criteria {
		m[c.Name] = int8(i)
	}
	return m
}()

// compileSoft writes every time-based soft criterion of
// timetable/criteria.go as weak constraints over the start atoms, with the
// term's weights and levels; criteria with weight 0 add nothing. Criteria
// that depend on concrete rooms (room stability, over capacity, wasted
// seats, travel, avoid times on room rows, same-room soft relations and the
// room half of moved meetings) are left to room assignment (soft_rooms.go).
// Explain mode adds nothing: explanations solve for feasibility only.
func (b *builder) compileSoft() {
	if b.opt.Explain {
		return
	}
	sb := &softBuilder{builder: b, m: &softModel{}, occ: map[int][]solver.Lit{},
		attends: map[int][]solver.Lit{}}
	b.c.soft = sb.m
	sb.m.crit = make([]int8, len(b.p.Weaks))
	sb.m.subj = make([]int32, len(b.p.Weaks))
	for i := range sb.m.crit {
		sb.m.crit[i], sb.m.subj[i] = -1, noSubject
	}
	sb.subject = noSubject
	sb.m.rules[0], sb.m.choices[0], sb.m.bounds[0] = len(b.p.Rules), len(b.p.Choices), len(b.p.Bounds)
	defer func() {
		sb.m.rules[1], sb.m.choices[1], sb.m.bounds[1] = len(b.p.Rules), len(b.p.Choices), len(b.p.Bounds)
	}()
	b.in(-1, "soft")
	sb.keepMeetings()
	sb.studentClashes()
	sb.patternStudentClashes() // soft_students.go
	sb.avoidTimes()
	sb.staffCriteria()
	sb.cohortCriteria()
	sb.spreadDays()
	sb.earlyLate()
	sb.softRelations()
	sb.patternSoft()
}

// weight returns the weak-constraint weight and level of criterion name
// for a unit of the given row weight, and false when the criterion is off.
func (sb *softBuilder) weight(name string, row int64) (int64, int, bool) {
	w, l := sb.t.CriterionWeight(name)
	if w == 0 || row == 0 {
		return 0, 0, false
	}
	return int64(w) * row, l, true
}

// weak adds ":~ body. [w@level]" for criterion name.
func (sb *softBuilder) weak(name string, w int64, level int, body ...solver.Lit) {
	sb.p.AddWeak(w, level, body...)
	sb.m.crit = append(sb.m.crit, critIndex[name])
	sb.m.subj = append(sb.m.subj, sb.subject)
}

// noSubject marks a weak constraint about nobody in particular.
const noSubject = math.MinInt32

// Subjects of weak constraints: a section index s as s, staff index i as
// -1-i, cohort index c as -1-len(Staff)-c.
func (sb *softBuilder) aboutSection(s int) { sb.subject = int32(s) }
func (sb *softBuilder) aboutStaff(i int)   { sb.subject = int32(-1 - i) }
func (sb *softBuilder) aboutCohort(c int)  { sb.subject = int32(-1 - len(sb.t.Staff) - c) }

// occupies returns the literal "section s occupies period p": the start
// literal itself when exactly one start covers p, an atom occupies(S,P)
// defined by the covering starts otherwise, and 0 when no meeting of s can
// occupy p. At most one covering start can hold (a section's meetings never
// overlap), so the atom counts meetings exactly.
func (sb *softBuilder) occupies(s, p int) solver.Lit {
	row, ok := sb.occ[s]
	if !ok {
		row = make([]solver.Lit, len(sb.t.Periods))
		var lits []solver.Lit
		sec := &sb.t.Sections[s]
		for q := range sb.t.Periods {
			lits = sb.coveringStarts(lits[:0], s, q)
			switch len(lits) {
			case 0:
			case 1:
				row[q] = lits[0]
			default:
				a := sb.newAtom("occupies("+quote(sec.ID)+","+periodName(sb.t.Periods[q])+")",
					AtomInfo{Kind: AtomAux, Section: s, Period: q, Staff: -1, Group: -1})
				for _, l := range lits {
					sb.rule(a, l)
				}
				row[q] = solver.Pos(a)
			}
		}
		sb.occ[s] = row
	}
	return row[p]
}

// cohortAttends returns, per period, "cohort c has a meeting at p":
// attends(C,P) atoms defined by the occupancy of the cohort's sections (any
// weeks), or the one occupancy literal when only one can hold there; 0 when
// none can.
func (sb *softBuilder) cohortAttends(c int) []solver.Lit {
	if row, ok := sb.attends[c]; ok {
		return row
	}
	t := sb.t
	id := t.Cohorts[c].ID
	var secs []int
	for s, sec := range t.Sections {
		if slices.Contains(sec.Cohorts, id) {
			secs = append(secs, s)
		}
	}
	row := sb.union(secs, func(p int) string { return "attends(" + quote(id) + "," + periodName(t.Periods[p]) + ")" })
	sb.attends[c] = row
	return row
}

// union returns per period the disjunction of the occupancy of secs: a
// single literal when only one section can occupy the period, else a new
// atom named by name(p).
func (sb *softBuilder) union(secs []int, name func(p int) string) []solver.Lit {
	row := make([]solver.Lit, len(sb.t.Periods))
	var lits []solver.Lit
	for p := range sb.t.Periods {
		lits = lits[:0]
		for _, s := range secs {
			if l := sb.occupies(s, p); l != 0 {
				lits = append(lits, l)
			}
		}
		switch len(lits) {
		case 0:
		case 1:
			row[p] = lits[0]
		default:
			a := sb.newAtom(name(p), AtomInfo{Kind: AtomAux, Section: -1, Period: p, Staff: -1, Group: -1})
			for _, l := range lits {
				sb.rule(a, l)
			}
			row[p] = solver.Pos(a)
		}
	}
	return row
}

// staffBusy returns busy(T,P) literals of staff member i (0 where no
// meeting can occupy P).
func (sb *softBuilder) staffBusy(i int) []solver.Lit {
	atoms := sb.busyAtoms(i)
	row := make([]solver.Lit, len(atoms))
	for p, a := range atoms {
		if a != 0 {
			row[p] = solver.Pos(a)
		}
	}
	return row
}

// orAtom returns a literal equivalent to the disjunction of lits: 0 for
// none, the literal itself for one, else a new atom named name.
func (sb *softBuilder) orAtom(name string, info AtomInfo, lits ...solver.Lit) solver.Lit {
	switch len(lits) {
	case 0:
		return 0
	case 1:
		return lits[0]
	}
	a := sb.newAtom(name, info)
	for _, l := range lits {
		sb.rule(a, l)
	}
	return solver.Pos(a)
}

// aux is the AtomInfo of an auxiliary atom.
func aux(section, period int) AtomInfo {
	return AtomInfo{Kind: AtomAux, Section: section, Period: period, Staff: -1, Group: -1}
}
