package encode

import "github.com/termwright/termwright/solver"

// compileStarts makes the decision atoms: start(S,P) for every section S and
// every candidate start period P, and one choice rule per section choosing
// exactly Meetings of them (the section's set of starts; meetings are
// numbered in period order when decoded, so no two atom sets describe the
// same timetable).
//
// A candidate keeps the whole meeting inside one run of consecutive periods.
// Normally candidates are also pruned by hard unavailability of the
// section's staff, cohorts and the section itself, by rooms (some candidate
// room must be available in every period of the meeting) and by fixed
// meetings (a section whose every meeting is fixed has only those starts).
// In Explain mode only the run condition prunes, and the other requirements
// become constraints with selectors.
func (b *builder) compileStarts() {
	t := b.t
	nP := len(t.Periods)
	for s := range t.Sections {
		sec := &t.Sections[s]
		m := &b.c.secs[s]
		m.start = make([]solver.Atom, nP)
		if b.c.pats[s].on {
			continue // pattern_atoms.go
		}
		fits := b.fitsFor(sec.Length)
		fixedOnly := b.fixedPeriods(s)
		if len(fixedOnly) < sec.Meetings || b.opt.Explain {
			fixedOnly = nil
		}
		var heads []solver.Atom
		for p := 0; p < nP; p++ {
			if !fits[p] {
				continue
			}
			if !b.opt.Explain {
				if fixedOnly != nil && !fixedOnly[p] {
					continue
				}
				if b.blockedStart(s, p) || !b.roomPossible(s, p) {
					continue
				}
			}
			a := b.newAtom("start("+quote(sec.ID)+","+periodName(t.Periods[p])+")",
				AtomInfo{Kind: AtomStart, Section: s, Period: p, Staff: -1, Group: -1})
			m.start[p] = a
			m.starts = append(m.starts, p)
			heads = append(heads, a)
		}
		b.in(-1, "meetings per week")
		b.choice(heads, sec.Meetings, sec.Meetings)
	}
}

// fixedPeriods returns the set of fixed start periods of section s (nil
// when it has no fixed meetings), indexed by period.
func (b *builder) fixedPeriods(s int) map[int]bool {
	sec := &b.t.Sections[s]
	if len(sec.Fixed) == 0 {
		return nil
	}
	out := map[int]bool{}
	for _, f := range sec.Fixed {
		if p := b.t.PeriodAt(f.Day, f.Start); p >= 0 {
			out[p] = true
		}
	}
	return out
}

// span lists the periods of a meeting of section s starting at p (p must
// be a fitting start).
func (b *builder) span(s, p int) (lo, hi int) {
	return p, p + b.t.Sections[s].Length - 1
}

// blockedStart reports whether a meeting of section s starting at p would
// meet during hard unavailability of its staff, cohorts or itself.
func (b *builder) blockedStart(s, p int) bool {
	sec := &b.t.Sections[s]
	lo, hi := b.span(s, p)
	for q := lo; q <= hi; q++ {
		if b.unavail.section[s].blocked(q) {
			return true
		}
		for _, id := range sec.Staff {
			if b.unavail.staff[b.staffIdx[id]].blocked(q) {
				return true
			}
		}
		for _, id := range sec.Cohorts {
			if b.unavail.cohort[b.cohortIdx[id]].blocked(q) {
				return true
			}
		}
	}
	return false
}

// roomPossible reports whether some candidate room of the meeting of
// section s starting at p is available in every period of the meeting (true
// for sections that take no room).
func (b *builder) roomPossible(s, p int) bool {
	m := &b.c.secs[s]
	if !m.takesRoom {
		return true
	}
	cand := b.c.rooms.sets.sets[m.candAt(p)]
	lo, hi := b.span(s, p)
	ok := false
	cand.each(func(r int) {
		if ok {
			return
		}
		for q := lo; q <= hi; q++ {
			if b.unavail.room[r].blocked(q) {
				return
			}
		}
		ok = true
	})
	return ok
}

// coveringStarts appends the start atoms of section s whose meetings occupy
// period p.
func (b *builder) coveringStarts(dst []solver.Lit, s, p int) []solver.Lit {
	m := &b.c.secs[s]
	for q := p - m.length + 1; q <= p; q++ {
		if q >= 0 && m.start[q] != 0 {
			dst = append(dst, solver.Pos(m.start[q]))
		}
	}
	return dst
}
