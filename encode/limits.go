package encode

import (
	"fmt"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// busyAtoms returns busy(T,P) for staff index i, made on first use by the
// rules busy(T,P) :- start(S,Q) for every section S of T and start Q whose
// meeting occupies P. Entries are 0 where no meeting can occupy P.
func (b *builder) busyAtoms(i int) []solver.Atom {
	if b.busy == nil {
		b.busy = map[int][]solver.Atom{}
	}
	if a, ok := b.busy[i]; ok {
		return a
	}
	t := b.t
	st := &t.Staff[i]
	var secs []int
	for s, sec := range t.Sections {
		for _, id := range sec.Staff {
			if id == st.ID {
				secs = append(secs, s)
				break
			}
		}
	}
	atoms := make([]solver.Atom, len(t.Periods))
	saveG, saveK := b.group, b.boundKind
	b.in(-1, "busy")
	var lits []solver.Lit
	for p := range t.Periods {
		lits = lits[:0]
		for _, s := range secs {
			lits = b.coveringStarts(lits, s, p)
		}
		if len(lits) == 0 {
			continue
		}
		a := b.newAtom("busy("+quote(st.ID)+","+periodName(t.Periods[p])+")",
			AtomInfo{Kind: AtomBusy, Section: -1, Period: p, Staff: i, Group: -1})
		atoms[p] = a
		for _, l := range lits {
			b.rule(a, l)
		}
	}
	b.group, b.boundKind = saveG, saveK
	b.busy[i] = atoms
	return atoms
}

// compileStaffLimits: a staff member's busy periods per day are at most
// MaxPerDay (a bound over the day's busy atoms), and no MaxConsecutive+1
// consecutive periods are all busy (one constraint per window). Busy
// periods count whatever the weeks.
func (b *builder) compileStaffLimits() {
	t := b.t
	var lits []solver.Lit
	for i := range t.Staff {
		st := &t.Staff[i]
		if st.MaxPerDay <= 0 && st.MaxConsecutive <= 0 {
			continue
		}
		busy := b.busyAtoms(i)
		if st.MaxPerDay > 0 {
			g := -1
			for _, day := range b.days {
				lits = lits[:0]
				for _, p := range day {
					if busy[p] != 0 {
						lits = append(lits, solver.Pos(busy[p]))
					}
				}
				if len(lits) <= st.MaxPerDay {
					continue
				}
				if g < 0 {
					g = b.newGroup(KindStaffDayLimit, []string{st.ID},
						fmt.Sprintf("staff %s teaches at most %d periods a day", staffName(st), st.MaxPerDay),
						[]timetable.Source{st.Src}, RelaxDayLimit)
					b.in(g, KindStaffDayLimit)
				}
				b.bound(lits, solver.NoBound, st.MaxPerDay, b.sel(g))
			}
		}
		if k := st.MaxConsecutive; k > 0 {
			g := -1
			for p := range t.Periods {
				// Window p .. p+k: k+1 consecutive periods, all busy-able.
				if p+k >= len(t.Periods) {
					break
				}
				lits = lits[:0]
				ok := true
				for q := p; q <= p+k; q++ {
					if busy[q] == 0 || (q > p && !t.Consecutive(q-1, q)) {
						ok = false
						break
					}
					lits = append(lits, solver.Pos(busy[q]))
				}
				if !ok {
					continue
				}
				if g < 0 {
					g = b.newGroup(KindStaffConsecutive, []string{st.ID},
						fmt.Sprintf("staff %s teaches at most %d consecutive periods", staffName(st), k),
						[]timetable.Source{st.Src}, RelaxDayLimit)
					b.in(g, KindStaffConsecutive)
				}
				b.rule(0, append(lits, b.sel(g))...)
			}
		}
	}
}
