package samples

import (
	"math/rand/v2"
	"slices"

	"github.com/termwright/termwright/timetable"
)

// GeneratePatterns builds the term of GeneratePatternsWithWitness.
func GeneratePatterns(cfg Config) *timetable.Term {
	t, _ := GeneratePatternsWithWitness(cfg)
	return t
}

// GeneratePatternsWithWitness builds the grid term of GenerateWithWitness
// and turns it into a term that mixes meeting patterns with the grid, with
// a witness that still meets every hard requirement:
//
//   - A section whose witness meetings all start at one time, in one room,
//     on different days, and that has no fixed meeting and is in no relation
//     of the grid kinds same time, before or back to back, becomes a pattern
//     section: its witness days, start and length are one of its meeting
//     times, beside up to three other times (other starts of the grid on the
//     same days, or the next days) that cost a weight of 1 to 3. Its allowed
//     rooms become room choices, the witness room at weight 0. The others
//     stay grid sections.
//   - Buildings get travel times: up to 15 minutes, but never more than the
//     shortest free time the witness leaves any staff member or cohort
//     between meetings in the two buildings.
//   - About one staff member in five gets a weekly minutes limit half an hour
//     above their busiest witness week.
//
// The result depends only on cfg, as for Generate.
func GeneratePatternsWithWitness(cfg Config) (*timetable.Term, *timetable.Schedule) {
	t, w := GenerateWithWitness(cfg)
	rng := rand.New(rand.NewPCG(cfg.Seed, 0x9a77e125))
	held := heldByGridRelations(t)
	byID := map[string][]timetable.Placement{}
	for _, pl := range w.Placements {
		byID[pl.Section] = append(byID[pl.Section], pl)
	}
	out := &timetable.Schedule{}
	for i := range t.Sections {
		s := &t.Sections[i]
		pls := byID[s.ID]
		if held[s.ID] || len(s.Fixed) > 0 {
			out.Placements = append(out.Placements, pls...)
			continue
		}
		c, ok := witnessChoice(t, s, pls)
		if !ok {
			out.Placements = append(out.Placements, pls...)
			continue
		}
		times := append([]timetable.TimeChoice{c}, alternatives(t, s, c, rng)...)
		rng.Shuffle(len(times), func(a, b int) { times[a], times[b] = times[b], times[a] })
		at := slices.IndexFunc(times, func(x timetable.TimeChoice) bool { return x == c })
		room := pls[0].Room
		s.Times, s.Meetings, s.Length, s.SameDay, s.MinDays = times, 1, 1, false, 0
		if len(s.Rooms) > 0 {
			for _, r := range s.Rooms {
				wt := 0
				if r != room {
					wt = rng.IntN(3)
				}
				s.RoomChoices = append(s.RoomChoices, timetable.RoomChoice{Room: r, Weight: wt})
			}
			s.Rooms = nil
		}
		out.Placements = append(out.Placements, timetable.Placement{Section: s.ID, Meeting: 1, Period: -1, Time: at + 1, Room: room})
	}
	t.Travel = witnessTravel(t, out)
	limitWeekMinutes(t, out, rng)
	return t, out
}

// heldByGridRelations lists the sections in relations whose wording needs
// the grid (same time compares meeting shapes; before and back to back
// speak of periods).
func heldByGridRelations(t *timetable.Term) map[string]bool {
	held := map[string]bool{}
	for _, r := range t.Relations {
		if r.Kind == timetable.SameTime || r.Kind == timetable.Before || r.Kind == timetable.BackToBack {
			for _, id := range r.Sections {
				held[id] = true
			}
		}
	}
	return held
}

// witnessChoice is the meeting time that stands for a grid section's
// witness meetings, when they start at one time, in one room, on
// different days.
func witnessChoice(t *timetable.Term, s *timetable.Section, pls []timetable.Placement) (timetable.TimeChoice, bool) {
	if len(pls) == 0 {
		return timetable.TimeChoice{}, false
	}
	var c timetable.TimeChoice
	for i, pl := range pls {
		occ := t.SectionOccurrences(s, pl)
		if len(occ) != 1 || pl.Room != pls[0].Room {
			return c, false
		}
		o := occ[0]
		if i == 0 {
			c = timetable.TimeChoice{Start: o.Start, Minutes: o.Minutes(), Weeks: s.Weeks}
		}
		if o.Start != c.Start || o.Minutes() != c.Minutes || c.Days.Has(o.Day) {
			return c, false
		}
		c.Days |= timetable.DaysOf(o.Day)
	}
	return c, c.Start%5 == 0 && c.Minutes%5 == 0
}

// alternatives gives up to three other meeting times of the shape of c:
// other grid starts on the same days where the meeting fits the grid, and
// the same start on the grid days one step later.
func alternatives(t *timetable.Term, s *timetable.Section, c timetable.TimeChoice, rng *rand.Rand) []timetable.TimeChoice {
	var cands []timetable.TimeChoice
	first, _ := c.Days.First()
	for _, p := range t.Periods {
		if p.Day != first || p.Start == c.Start {
			continue
		}
		alt := c
		alt.Start = p.Start
		if fitsGrid(t, alt, s.Length) {
			cands = append(cands, alt)
		}
	}
	days := t.Days()
	var shifted timetable.DaySet
	for i, d := range days {
		if c.Days.Has(d) {
			shifted |= timetable.DaysOf(days[(i+1)%len(days)])
		}
	}
	if shifted.Count() == c.Days.Count() && shifted != c.Days {
		alt := c
		alt.Days = shifted
		if fitsGrid(t, alt, s.Length) {
			cands = append(cands, alt)
		}
	}
	rng.Shuffle(len(cands), func(a, b int) { cands[a], cands[b] = cands[b], cands[a] })
	cands = cands[:min(3, len(cands))]
	for i := range cands {
		cands[i].Weight = 1 + rng.IntN(3)
	}
	return cands
}

// fitsGrid reports whether choice c covers a run of length grid periods on
// each of its days, so that it is a time the registrar's grid offers.
func fitsGrid(t *timetable.Term, c timetable.TimeChoice, length int) bool {
	for _, d := range c.Days.List() {
		p := t.PeriodAt(d, c.Start)
		if p < 0 {
			return false
		}
		span, ok := t.Span(p, length)
		if !ok || t.Periods[span[len(span)-1]].End != c.End() {
			return false
		}
	}
	return true
}

// witnessTravel gives each pair of buildings a travel time of up to 15
// minutes (in 5-minute steps) that the witness keeps: no staff member or
// cohort has less free time between meetings in the two buildings.
func witnessTravel(t *timetable.Term, w *timetable.Schedule) []timetable.Travel {
	building := map[string]string{}
	var names []string
	for _, r := range t.Rooms {
		building[r.ID] = r.Building
		if r.Building != "" && !slices.Contains(names, r.Building) {
			names = append(names, r.Building)
		}
	}
	slices.Sort(names)
	type stop struct {
		occ      timetable.Occurrence
		building string
	}
	byWho := map[string][]stop{}
	var order []string
	secs := t.SectionIndex()
	for _, pl := range w.Placements {
		b := building[pl.Room]
		if b == "" {
			continue
		}
		s := &t.Sections[secs[pl.Section]]
		for _, o := range t.SectionOccurrences(s, pl) {
			for _, who := range append(prefixed("s:", s.Staff), prefixed("c:", s.Cohorts)...) {
				if byWho[who] == nil {
					order = append(order, who)
				}
				byWho[who] = append(byWho[who], stop{o, b})
			}
		}
	}
	const most = 15
	gap := map[[2]string]int{}
	for _, who := range order {
		stops := byWho[who]
		for i := range stops {
			for j := range stops {
				a, b := stops[i], stops[j]
				if a.building == b.building || a.occ.Day != b.occ.Day || !a.occ.Weeks.Overlaps(b.occ.Weeks) || a.occ.End > b.occ.Start {
					continue
				}
				k := [2]string{min(a.building, b.building), max(a.building, b.building)}
				if g, seen := gap[k]; !seen || int(b.occ.Start-a.occ.End) < g {
					gap[k] = int(b.occ.Start - a.occ.End)
				}
			}
		}
	}
	var out []timetable.Travel
	for i, a := range names {
		for _, b := range names[i+1:] {
			m := most
			if g, seen := gap[[2]string{a, b}]; seen {
				m = min(m, g/5*5)
			}
			if m > 0 {
				out = append(out, timetable.Travel{From: a, To: b, Minutes: m})
			}
		}
	}
	return out
}

func prefixed(p string, ids []string) []string {
	out := make([]string, len(ids))
	for i, id := range ids {
		out[i] = p + id
	}
	return out
}

// limitWeekMinutes gives about one staff member in five a weekly minutes
// limit half an hour above their busiest witness week.
func limitWeekMinutes(t *timetable.Term, w *timetable.Schedule, rng *rand.Rand) {
	secs := t.SectionIndex()
	busiest := map[string]*[64]int{}
	for _, pl := range w.Placements {
		s := &t.Sections[secs[pl.Section]]
		for _, o := range t.SectionOccurrences(s, pl) {
			for _, id := range s.Staff {
				if busiest[id] == nil {
					busiest[id] = new([64]int)
				}
				for wk := 1; wk <= 64; wk++ {
					if o.Weeks.Has(wk) {
						busiest[id][wk-1] += o.Minutes()
					}
				}
			}
		}
	}
	for i := range t.Staff {
		st := &t.Staff[i]
		if rng.IntN(5) != 0 || busiest[st.ID] == nil {
			continue
		}
		st.MaxWeekMinutes = slices.Max(busiest[st.ID][:]) + 30
	}
}
