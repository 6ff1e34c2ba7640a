package encode

import (
	"slices"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// softRelations writes "soft relations": for each soft Relations row, an
// atom broken(relation,R) defined by one rule per way the row can break
// (exactly the definitions of timetable/term.go, as timetable.Cost reads
// them), and a weak constraint of the row's weight times the criterion's
// on it. Same-room rows depend on rooms and are left to room assignment.
func (sb *softBuilder) softRelations() {
	t := sb.t
	for ri := range t.Relations {
		rel := &t.Relations[ri]
		if rel.Hard || rel.Kind == timetable.SameRoom || sb.timesRelation(rel) { // pattern rows: times_rel_soft.go
			continue
		}
		w, l, ok := sb.weight(timetable.CritSoftRelations, int64(rel.Weight))
		if !ok {
			continue
		}
		unique := rel.Kind != timetable.Before && rel.Kind != timetable.BackToBack
		var secs []int
		for _, id := range rel.Sections {
			s, known := sb.secIdx[id]
			if !known || (unique && slices.Contains(secs, s)) {
				continue
			}
			secs = append(secs, s)
		}
		if len(secs) < 2 {
			continue
		}
		var ways [][]solver.Lit
		switch rel.Kind {
		case timetable.SameTime:
			ways = sb.relDiffer(secs, func(s int) []solver.Lit { return sb.startLits(s) })
		case timetable.SameDayRel:
			ways = sb.relDiffer(secs, func(s int) []solver.Lit { return atomLits(sb.meetsAtoms(s)) })
		case timetable.NotSameTime:
			ways = sb.relShare(secs, func(s int) []solver.Lit { return sb.occRow(s) })
		case timetable.DifferentDays:
			ways = sb.relShare(secs, func(s int) []solver.Lit { return atomLits(sb.meetsAtoms(s)) })
		case timetable.Before:
			for k := 0; k+1 < len(secs); k++ {
				ways = append(ways, sb.relBeforeWays(secs[k], secs[k+1])...)
			}
		case timetable.BackToBack:
			for k := 0; k+1 < len(secs); k++ {
				ways = append(ways, sb.relBackToBackWays(secs[k], secs[k+1])...)
			}
		default:
			continue
		}
		if len(ways) == 0 {
			continue
		}
		sb.aboutSection(secs[0])
		a := sb.newAtom("broken(relation,"+quote(relKey(rel, ri))+")", aux(-1, -1))
		for _, body := range ways {
			sb.rule(a, body...)
		}
		sb.weak(timetable.CritSoftRelations, w, l, solver.Pos(a))
	}
}

// startLits is the start literal of section s per period (0 when p is no
// candidate).
func (sb *softBuilder) startLits(s int) []solver.Lit {
	return atomLits(sb.c.secs[s].start)
}

// occRow is the occupancy literal of section s per period.
func (sb *softBuilder) occRow(s int) []solver.Lit {
	row := make([]solver.Lit, len(sb.t.Periods))
	for p := range row {
		row[p] = sb.occupies(s, p)
	}
	return row
}

// atomLits turns atoms into positive literals (0 stays 0).
func atomLits(atoms []solver.Atom) []solver.Lit {
	out := make([]solver.Lit, len(atoms))
	for i, a := range atoms {
		if a != 0 {
			out[i] = solver.Pos(a)
		}
	}
	return out
}

// relDiffer: the row breaks when some section's set (of starts or days,
// given per index by set) differs from the first section's.
func (sb *softBuilder) relDiffer(secs []int, set func(int) []solver.Lit) [][]solver.Lit {
	var ways [][]solver.Lit
	first := set(secs[0])
	for _, s := range secs[1:] {
		other := set(s)
		for i := range first {
			x, y := first[i], other[i]
			switch {
			case x != 0 && y != 0:
				ways = append(ways, []solver.Lit{x, y.Not()}, []solver.Lit{y, x.Not()})
			case x != 0:
				ways = append(ways, []solver.Lit{x})
			case y != 0:
				ways = append(ways, []solver.Lit{y})
			}
		}
	}
	return ways
}

// relShare: the row breaks when two sections both hold at one index (a
// period occupied, or a day met).
func (sb *softBuilder) relShare(secs []int, set func(int) []solver.Lit) [][]solver.Lit {
	var ways [][]solver.Lit
	rows := make([][]solver.Lit, len(secs))
	for i, s := range secs {
		rows[i] = set(s)
	}
	for i := range rows {
		for j := i + 1; j < len(rows); j++ {
			for k := range rows[i] {
				if x, y := rows[i][k], rows[j][k]; x != 0 && y != 0 {
					ways = append(ways, []solver.Lit{x, y})
				}
			}
		}
	}
	return ways
}

// relBeforeWays: "a before c" breaks when a meeting of a starting at p
// still meets when some meeting of c has started (started_by(c, last
// period of the meeting)).
func (sb *softBuilder) relBeforeWays(a, c int) [][]solver.Lit {
	var ways [][]solver.Lit
	by := sb.startedByAtoms(c)
	ma := &sb.c.secs[a]
	for _, p := range ma.starts {
		if q := by[p+ma.length-1]; q != 0 {
			ways = append(ways, []solver.Lit{solver.Pos(ma.start[p]), solver.Pos(q)})
		}
	}
	return ways
}

// relBackToBackWays: "a then c" breaks when a meeting of c starts at q and
// no meeting of a ends in the period right before (consecutive, same day).
func (sb *softBuilder) relBackToBackWays(a, c int) [][]solver.Lit {
	var ways [][]solver.Lit
	ma, mc := &sb.c.secs[a], &sb.c.secs[c]
	for _, q := range mc.starts {
		p := q - ma.length
		if p >= 0 && sb.t.Consecutive(q-1, q) && ma.start[p] != 0 {
			ways = append(ways, []solver.Lit{solver.Pos(mc.start[q]), solver.Neg(ma.start[p])})
		} else {
			ways = append(ways, []solver.Lit{solver.Pos(mc.start[q])})
		}
	}
	return ways
}
