package encode

import (
	"slices"
	"strconv"
	"strings"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// Relations between pattern sections (Section.Times) are stated over the
// time(S,I) and in(S,R) atoms of pattern_atoms.go, exactly as defined by
// the doc comments of timetable/term.go:
//
//   - a pairwise kind (or a consecutive-pair kind) is a compatibility
//     relation between the two sections' patterns, computed once from the
//     patterns' days, start, minutes and weeks (times_rel_pairs.go). For
//     each group of patterns of A with the same incompatible patterns of B
//     it states "A at one of these and B at one of those" as one body of
//     two interned any_time literals: near-linear, never all pairs of pairs.
//     Hard "no overlap", "not same time" and the overlap half of "same
//     people" are instead one bound "at most 1" per maximal clique of
//     overlapping candidate meetings (pattern_cliques.go);
//   - room kinds (same room, different rooms, the travel half of same
//     people) are stated over the room atoms (times_rel_rooms.go);
//   - day-based kinds (at most days, at most minutes a day, at most breaks,
//     longest block) split the teaching weeks into classes of weeks in which
//     the same patterns meet and state one bound or aux structure per class
//     and day (times_rel_days.go, times_rel_counted.go).
//
// A hard row becomes integrity constraints or bounds under its group's
// selector; a soft row (times_rel_soft.go) an atom broken(relation,R)
// defined by one rule per way the row can break, weighted once, or for the
// counted kinds weak constraints that sum to weight × count, exactly, also
// when the count is divided by the teaching weeks (a unary counter, or
// binary adders and a long division for large sums: times_rel_binary.go).
// So the engine's objective equals timetable.Cost on every row and the
// third gate (optimize_gate.go) compares "soft relations" on pattern terms.
//
// Staff weekly limits and lunch breaks of staff and cohorts are
// times_limits*.go.
//
// A row is handled here when it lists a pattern section or has one of the
// kinds added for pattern terms; its grid sections take part through their
// start atoms (times_rel_grid.go), except where their rooms are matched
// after the search (mixedRefusal). Rows of the first seven kinds over grid
// sections alone are relations.go's.

func init() {
	// Hard parts go before the optimiser's parts (so that Options.HardOnly
	// keeps them); the soft part right after the soft criteria.
	at := slices.IndexFunc(parts, func(p part) bool { return p.extra })
	if at < 0 {
		at = len(parts)
	}
	parts = slices.Insert(parts, at,
		part{"pattern relations", (*builder).compileTimesRelations, false},
		part{"pattern limits", (*builder).compileTimesLimits, false})
	registerPart("pattern soft relations", (*builder).compileTimesSoftRelations)
}

// timesRelation reports whether relation row rel is stated by this file
// (and so skipped by relations.go and soft_relations.go).
func (b *builder) timesRelation(rel *timetable.Relation) bool {
	if !rel.Kind.OnGrid() {
		return true
	}
	for _, id := range rel.Sections {
		if s, ok := b.secIdx[id]; ok && b.t.Sections[s].UsesTimes() {
			return true
		}
	}
	return false
}

// relSecs lists the known sections of a relation row in written order
// (each once unless the kind compares consecutive pairs), and false when
// the row cannot be stated (reported as an input error when report is set:
// the hard part reports every row, hard or soft, so that Solve and
// Optimize refuse the same terms). Grid sections take part through their
// start atoms (times_rel_grid.go); mixedRefusal names what is not covered.
func (b *builder) relSecs(rel *timetable.Relation, report bool) ([]int, bool) {
	ordered := consecutiveKind(rel.Kind)
	var secs []int
	for _, id := range rel.Sections {
		s, ok := b.secIdx[id]
		if !ok || (!ordered && slices.Contains(secs, s)) {
			continue
		}
		secs = append(secs, s)
	}
	if b.hasGrid(secs) {
		if why := b.mixedRefusal(rel, secs); why != "" {
			if report {
				b.errorf(rel.Src, "%s", why)
			}
			return nil, false
		}
	}
	return secs, true
}

// consecutiveKind reports whether the kind holds for each consecutive pair
// of the list (in order) rather than for every pair.
func consecutiveKind(k timetable.RelationKind) bool {
	return k == timetable.Before || k == timetable.BackToBack || k == timetable.FirstBefore
}

// compileTimesRelations states every hard relation row over pattern
// sections, one requirement group per row.
func (b *builder) compileTimesRelations() {
	t := b.t
	for ri := range t.Relations {
		rel := &t.Relations[ri]
		if !b.timesRelation(rel) {
			continue
		}
		secs, ok := b.relSecs(rel, true)
		if !ok || !rel.Hard || len(secs) < 2 && !rel.Kind.Counted() {
			continue
		}
		g := b.newGroup(KindRelation, []string{relKey(rel, ri)}, timesRelSentence(rel), []timetable.Source{rel.Src}, RelaxRelation)
		b.in(g, KindRelation)
		sel := b.sel(g)
		switch {
		case rel.Kind == timetable.DifferentRooms:
			b.hardDifferentRooms(secs, sel)
		case rel.Kind == timetable.MaxDays:
			b.hardMaxDays(secs, rel.N, sel)
		case rel.Kind == timetable.MaxDayMinutes, rel.Kind == timetable.MaxBreaks, rel.Kind == timetable.MaxBlock:
			b.hardDayKind(rel, secs, sel)
		case rel.Kind == timetable.NoOverlap, rel.Kind == timetable.NotSameTime, rel.Kind == timetable.SamePeople:
			// One meeting at a time among the sections: a bound per
			// maximal clique of overlapping patterns (pattern_cliques.go),
			// weeks ignored for "not same time"; then travel.
			occ := b.occupantsOf(secs, true)
			if rel.Kind == timetable.NotSameTime {
				for i := range occ {
					occ[i].weeks = t.AllWeeks()
				}
			}
			b.cliqueBounds(occ, -1, g, KindRelation)
			if rel.Kind == timetable.SamePeople {
				b.in(g, KindRelation)
				for _, body := range b.relTravelWays(secs) {
					b.rule(0, append(body, sel)...)
				}
			}
		default:
			for _, body := range b.relWays(rel, secs) {
				b.rule(0, append(body, sel)...)
			}
		}
		b.in(-1, "pattern relations")
	}
}

// relWays lists the ways a relation row of a non-counted kind can break:
// bodies over the sections' time, start and room atoms, one of which
// holds exactly when the row is broken.
func (b *builder) relWays(rel *timetable.Relation, secs []int) [][]solver.Lit {
	if b.hasGrid(secs) {
		return b.mixedWays(rel, secs)
	}
	switch rel.Kind {
	case timetable.SameRoom:
		return b.sameRoomWays(secs)
	case timetable.DifferentRooms:
		return b.differentRoomsWays(secs)
	case timetable.SamePeople:
		ways := b.pairWays(secs, rel.Kind, rel.N)
		return append(ways, b.travelWays(secs)...)
	}
	return b.pairWays(secs, rel.Kind, rel.N)
}

// timesRelSentence says in plain words what a relation row asks.
func timesRelSentence(rel *timetable.Relation) string {
	if rel.Kind < timetable.SameStart {
		return relationSentence(rel)
	}
	list := strings.Join(rel.Sections, ", ")
	n := strconv.Itoa(rel.N)
	switch rel.Kind {
	case timetable.SameStart:
		return "sections " + list + " start at one time of day"
	case timetable.WithinHours:
		return "of any two of sections " + list + ", one meets within the other's hours"
	case timetable.DifferentHours:
		return "no two of sections " + list + " meet at overlapping hours of the day"
	case timetable.DaysWithin:
		return "of any two of sections " + list + ", one meets only on days the other meets"
	case timetable.WeeksWithin:
		return "of any two of sections " + list + ", one meets only in weeks the other meets"
	case timetable.DifferentWeeks:
		return "no two of sections " + list + " meet in a common week"
	case timetable.OverlapRel:
		return "any two of sections " + list + " overlap at some time"
	case timetable.NoOverlap:
		return "no two of sections " + list + " overlap"
	case timetable.DifferentRooms:
		return "no two of sections " + list + " use a common room"
	case timetable.SamePeople:
		return "the same people can attend all of sections " + list + " (no overlap, and time to travel between rooms)"
	case timetable.FirstBefore:
		return "sections " + strings.Join(rel.Sections, " before ") + " by first meeting (week, then day, then time)"
	case timetable.DaySpan:
		return "on any day, meetings of any two of sections " + list + " lie within " + n + " minutes"
	case timetable.MinGap:
		return "meetings of any two of sections " + list + " on one day are at least " + n + " minutes apart"
	case timetable.MaxDays:
		return "sections " + list + " together meet on at most " + n + " days"
	case timetable.MaxDayMinutes:
		return "sections " + list + " together meet at most " + n + " minutes a day"
	case timetable.MaxBreaks:
		return "sections " + list + " leave at most " + n + " breaks (over " + strconv.Itoa(rel.M) + " minutes) a day"
	case timetable.MaxBlock:
		return "sections " + list + " meet in blocks (gaps up to " + strconv.Itoa(rel.M) + " minutes) of at most " + n + " minutes"
	}
	return rel.Kind.String() + ": " + list
}
