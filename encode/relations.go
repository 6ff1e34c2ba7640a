package encode

import (
	"fmt"
	"strings"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// compileRelations states the hard relations of the Relations sheet, each
// row one group, exactly as defined in timetable/term.go. Same-room rows are
// part of the room model (rooms.go). Soft rows are the optimiser's.
func (b *builder) compileRelations() {
	t := b.t
	for ri := range t.Relations {
		rel := &t.Relations[ri]
		if !rel.Hard || rel.Kind == timetable.SameRoom || b.timesRelation(rel) { // pattern rows: times_rel.go
			continue
		}
		secs := make([]int, 0, len(rel.Sections))
		for _, id := range rel.Sections {
			secs = append(secs, b.secIdx[id])
		}
		if len(secs) < 2 {
			continue
		}
		g := b.newGroup(KindRelation, []string{relKey(rel, ri)}, relationSentence(rel), []timetable.Source{rel.Src}, RelaxRelation)
		b.in(g, KindRelation)
		switch rel.Kind {
		case timetable.SameTime:
			b.relSameTime(secs, g)
		case timetable.NotSameTime:
			b.relNotSameTime(secs, g)
		case timetable.DifferentDays:
			b.relDifferentDays(secs, g)
		case timetable.SameDayRel:
			b.relSameDay(secs, g)
		case timetable.Before:
			for i := 0; i+1 < len(secs); i++ {
				b.relBefore(secs[i], secs[i+1], g)
			}
		case timetable.BackToBack:
			for i := 0; i+1 < len(secs); i++ {
				b.relBackToBack(secs[i], secs[i+1], g)
			}
		default:
			b.errorf(rel.Src, "relation kind %q is not known: use one of the kinds listed for the Relations sheet", rel.Kind)
		}
	}
}

// relKey names a relation row for its selector: the row number, or "#n" for
// rows made in code.
func relKey(rel *timetable.Relation, ri int) string {
	if rel.Src.Row > 0 {
		return fmt.Sprint(rel.Src.Row)
	}
	return fmt.Sprintf("#%d", ri+1)
}

func relationSentence(rel *timetable.Relation) string {
	list := strings.Join(rel.Sections, ", ")
	switch rel.Kind {
	case timetable.SameTime:
		return "sections " + list + " meet at the same times"
	case timetable.NotSameTime:
		return "no two of sections " + list + " meet at the same time"
	case timetable.DifferentDays:
		return "no two of sections " + list + " meet on the same day"
	case timetable.SameDayRel:
		return "sections " + list + " meet on the same days"
	case timetable.Before:
		return "sections " + strings.Join(rel.Sections, " before ") + " (each one's meetings end before the next one's first meeting starts)"
	case timetable.BackToBack:
		return "sections " + strings.Join(rel.Sections, " then ") + " back to back (each meeting of the later one starts right after a meeting of the earlier one)"
	case timetable.SameRoom:
		return "sections " + list + " use one room"
	}
	return rel.Kind.String() + ": " + list
}

// relSameTime: every section has the same set of starts as the first.
func (b *builder) relSameTime(secs []int, g int) {
	sel := b.sel(g)
	a := &b.c.secs[secs[0]]
	for _, s := range secs[1:] {
		o := &b.c.secs[s]
		for p := range b.t.Periods {
			x, y := a.start[p], o.start[p]
			switch {
			case x != 0 && y != 0:
				b.rule(0, solver.Pos(x), solver.Neg(y), sel)
				b.rule(0, solver.Pos(y), solver.Neg(x), sel)
			case x != 0:
				b.rule(0, solver.Pos(x), sel)
			case y != 0:
				b.rule(0, solver.Pos(y), sel)
			}
		}
	}
}

// relNotSameTime: at each period at most one meeting among the sections.
func (b *builder) relNotSameTime(secs []int, g int) {
	var lits []solver.Lit
	for p := range b.t.Periods {
		lits = lits[:0]
		n := 0
		for _, s := range secs {
			k := len(lits)
			lits = b.coveringStarts(lits, s, p)
			if len(lits) > k {
				n++
			}
		}
		if n >= 2 {
			b.bound(lits, solver.NoBound, 1, b.sel(g))
		}
	}
}

// meetsAtoms returns meets(S,D) for section s, one per grid day (0 when
// the section has no candidate that day), defined by meets(S,D) :- start(S,P)
// for the day's starts.
func (b *builder) meetsAtoms(s int) []solver.Atom {
	if b.meets == nil {
		b.meets = map[int][]solver.Atom{}
	}
	if a, ok := b.meets[s]; ok {
		return a
	}
	sec := &b.t.Sections[s]
	m := &b.c.secs[s]
	atoms := make([]solver.Atom, len(b.days))
	saveG, saveK := b.group, b.boundKind
	b.in(-1, "meets")
	for d, day := range b.days {
		for _, p := range day {
			if m.start[p] == 0 {
				continue
			}
			if atoms[d] == 0 {
				wd := b.t.Periods[day[0]].Day
				atoms[d] = b.newAtom("meets("+quote(sec.ID)+","+strings.ToLower(timetable.DayName(wd))+")",
					AtomInfo{Kind: AtomMeetsDay, Section: s, Period: -1, Staff: -1, Day: wd, Group: -1})
			}
			b.rule(atoms[d], solver.Pos(m.start[p]))
		}
	}
	b.group, b.boundKind = saveG, saveK
	b.meets[s] = atoms
	return atoms
}

// relDifferentDays: on each day at most one of the sections meets.
func (b *builder) relDifferentDays(secs []int, g int) {
	var lits []solver.Lit
	for d := range b.days {
		lits = lits[:0]
		for _, s := range secs {
			if a := b.meetsAtoms(s)[d]; a != 0 {
				lits = append(lits, solver.Pos(a))
			}
		}
		if len(lits) >= 2 {
			b.in(g, KindRelation)
			b.bound(lits, solver.NoBound, 1, b.sel(g))
		}
	}
}

// relSameDay: every section meets on exactly the days the first one does.
func (b *builder) relSameDay(secs []int, g int) {
	first := b.meetsAtoms(secs[0])
	for _, s := range secs[1:] {
		other := b.meetsAtoms(s)
		b.in(g, KindRelation)
		for d := range b.days {
			x, y := first[d], other[d]
			switch {
			case x != 0 && y != 0:
				b.rule(0, solver.Pos(x), solver.Neg(y), b.sel(g))
				b.rule(0, solver.Pos(y), solver.Neg(x), b.sel(g))
			case x != 0:
				b.rule(0, solver.Pos(x), b.sel(g))
			case y != 0:
				b.rule(0, solver.Pos(y), b.sel(g))
			}
		}
	}
}

// startedByAtoms returns started_by(S,P) for section s: true when some
// meeting of s starts at period P or earlier; defined by the chain
// started_by(S,P) :- start(S,P). started_by(S,P) :- started_by(S,P-1).
// Entries are 0 before the first candidate.
func (b *builder) startedByAtoms(s int) []solver.Atom {
	if b.startedBy == nil {
		b.startedBy = map[int][]solver.Atom{}
	}
	if a, ok := b.startedBy[s]; ok {
		return a
	}
	sec := &b.t.Sections[s]
	m := &b.c.secs[s]
	atoms := make([]solver.Atom, len(b.t.Periods))
	saveG, saveK := b.group, b.boundKind
	b.in(-1, "started by")
	var prev solver.Atom
	for p := range b.t.Periods {
		if m.start[p] == 0 && prev == 0 {
			continue
		}
		a := b.newAtom("started_by("+quote(sec.ID)+","+periodName(b.t.Periods[p])+")",
			AtomInfo{Kind: AtomStartedBy, Section: s, Period: p, Staff: -1, Group: -1})
		if m.start[p] != 0 {
			b.rule(a, solver.Pos(m.start[p]))
		}
		if prev != 0 {
			b.rule(a, solver.Pos(prev))
		}
		atoms[p] = a
		prev = a
	}
	b.group, b.boundKind = saveG, saveK
	b.startedBy[s] = atoms
	return atoms
}

// relBefore: every period section a occupies comes before every start of
// section c: no meeting of c starts at or before the last period of any
// meeting of a.
func (b *builder) relBefore(a, c, g int) {
	sb := b.startedByAtoms(c)
	ma := &b.c.secs[a]
	b.in(g, KindRelation)
	for _, p := range ma.starts {
		last := p + ma.length - 1
		if sb[last] != 0 {
			b.rule(0, solver.Pos(ma.start[p]), solver.Pos(sb[last]), b.sel(g))
		}
	}
}

// relBackToBack: every meeting of section c starts right after (next period,
// same run) the last period of some meeting of section a.
func (b *builder) relBackToBack(a, c, g int) {
	ma, mc := &b.c.secs[a], &b.c.secs[c]
	b.in(g, KindRelation)
	for _, q := range mc.starts {
		p := q - ma.length
		if p >= 0 && q >= 1 && b.t.Consecutive(q-1, q) && ma.start[p] != 0 {
			b.rule(0, solver.Pos(mc.start[q]), solver.Neg(ma.start[p]), b.sel(g))
		} else {
			b.rule(0, solver.Pos(mc.start[q]), b.sel(g))
		}
	}
}
