package main

import (
	"fmt"
	"io"
	"sort"
	"strings"

	"github.com/termwright/termwright/encode"
	"github.com/termwright/termwright/export"
	"github.com/termwright/termwright/timetable"
)

// solveQuality is the quality part of the solve report: the cost of the
// written timetable (timetable.Cost) by level and criterion, the lower
// bound, and with --keep what moved.
type solveQuality struct {
	Levels       []solveLevel              `json:"levels"`      // highest level (minimised first) first
	Proven       bool                      `json:"proven"`      // no timetable costs less
	TimeProven   bool                      `json:"time_proven"` // no timetable costs less on the criteria that do not depend on rooms
	Stopped      string                    `json:"stopped"`
	Steps        int                       `json:"neighbourhood_steps"`
	Restarts     int                       `json:"restarts,omitempty"` // neighbourhood search restarted after a stall
	Adopted      int                       `json:"adopted,omitempty"`  // with --threads: better timetables taken from another search
	Improvements int                       `json:"improvements"`
	Criteria     []timetable.CriterionCost `json:"criteria"`
	Keep         *solveKeep                `json:"keep,omitempty"`
}

type solveLevel struct {
	Level int   `json:"level"`
	Cost  int64 `json:"cost"`
	Bound int64 `json:"bound"` // no timetable costs less at this level (with the higher levels at their best)
}

// solveKeep lists what moved from the kept timetable and whom to tell.
type solveKeep struct {
	Moved    int               `json:"moved"`   // kept meetings no meeting of their section holds any more, replaced by one elsewhere
	Dropped  int               `json:"dropped"` // kept meetings with no meeting to replace them (a section removed or meeting fewer times)
	New      int               `json:"new"`     // meetings with no kept meeting (a new section or an extra meeting)
	Moves    []solveMove       `json:"moves"`
	Affected []encode.Affected `json:"affected"`
}

type solveMove struct {
	Section string   `json:"section"`
	Meeting int      `json:"meeting"` // the meeting number in the new timetable (in the kept one for dropped meetings)
	Change  string   `json:"change"`  // "moved", "new" or "dropped"
	From    string   `json:"from,omitempty"`
	To      string   `json:"to,omitempty"`
	Staff   []string `json:"staff"`
	Cohorts []string `json:"cohorts"`
}

func solveBuildQuality(t *timetable.Term, res *encode.OptimizeResult) *solveQuality {
	q := &solveQuality{Proven: res.Proven, TimeProven: res.TimeProven, Stopped: res.Stopped, Steps: res.Steps,
		Restarts: res.Restarts, Adopted: res.Adopted, Improvements: len(res.History), Criteria: termCriteria(t, res.Cost.Criteria), Levels: []solveLevel{}}
	for i, l := range res.Levels {
		q.Levels = append(q.Levels, solveLevel{Level: l, Cost: res.Total[i], Bound: res.Bound[i]})
	}
	if res.Kept {
		k := &solveKeep{Moves: []solveMove{}, Affected: encode.Affect(t, res.Moves)}
		secIdx := t.SectionIndex()
		for _, mv := range res.Moves {
			sm := solveMove{Section: mv.Section, Change: mv.Change, Staff: []string{}, Cohorts: []string{}}
			if mv.From != nil {
				sm.From, sm.Meeting = solveSlot(t, *mv.From), mv.From.Meeting
			}
			if mv.To != nil {
				sm.To, sm.Meeting = solveSlot(t, *mv.To), mv.To.Meeting
			}
			if s, ok := secIdx[mv.Section]; ok {
				sm.Staff = append(sm.Staff, t.Sections[s].Staff...)
				sm.Cohorts = append(sm.Cohorts, t.Sections[s].Cohorts...)
			}
			switch mv.Change {
			case encode.ChangeMoved:
				k.Moved++
			case encode.ChangeDropped:
				k.Dropped++
			case encode.ChangeNew:
				k.New++
			}
			k.Moves = append(k.Moves, sm)
		}
		if k.Affected == nil {
			k.Affected = []encode.Affected{}
		}
		q.Keep = k
	}
	return q
}

// solveSlot is "Tue 10:00 R204" (the room left out when there is none).
func solveSlot(t *timetable.Term, p timetable.Placement) string {
	s := fmt.Sprintf("period %d", p.Period)
	if p.Period >= 0 && p.Period < len(t.Periods) {
		s = t.Periods[p.Period].Label()
	}
	if p.Room != "" {
		s += " " + p.Room
	}
	return s
}

// solvePrintQuality prints the cost breakdown, the bound and the moves.
func solvePrintQuality(w io.Writer, q *solveQuality) {
	if len(q.Levels) == 0 {
		fmt.Fprintln(w, "No preference is switched on (every weight is 0).")
	} else {
		fmt.Fprintln(w, "Cost by priority level (lower is better; a higher level counts before any lower one):")
		for _, l := range q.Levels {
			fmt.Fprintf(w, "  level %d: cost %d, and no timetable costs less than %d\n", l.Level, l.Cost, l.Bound)
		}
		fmt.Fprintln(w, "Cost by preference (weight × units):")
		for _, c := range q.Criteria {
			if c.Weight == 0 {
				continue
			}
			fmt.Fprintf(w, "  %-20s level %d  weight %-3d %6d units  cost %d\n", c.Name, c.Level, c.Weight, c.Count, c.Cost)
		}
		switch {
		case q.Proven:
			fmt.Fprintln(w, "This timetable is optimal: the bound proves that no timetable costs less.")
		case q.TimeProven:
			fmt.Fprintf(w, "Not proven optimal (search stopped: %s). The bound covers every preference but the room\n"+
				"choices (room stability, capacity, wasted seats, travel, and rooms in avoid times, same-room\n"+
				"relations and moved meetings): on the others no timetable does better; rooms were chosen\n"+
				"by local search and, on small terms, exactly for the times found.\n", q.Stopped)
		default:
			fmt.Fprintf(w, "Not proven optimal (search stopped: %s).\n", q.Stopped)
		}
	}
	if q.Keep == nil {
		return
	}
	k := q.Keep
	if len(k.Moves) == 0 {
		fmt.Fprintln(w, "Nothing moved from the kept timetable.")
		return
	}
	fmt.Fprintf(w, "Changes from the kept timetable (%s):\n", keepCounts(k))
	for _, m := range k.Moves {
		fmt.Fprintf(w, "  %s\n", solveMoveText(m))
	}
	fmt.Fprintln(w, "Who to tell:")
	for _, a := range k.Affected {
		name := a.What + " " + a.ID
		if a.Name != "" && a.Name != a.ID {
			name += " (" + a.Name + ")"
		}
		parts := make([]string, len(a.Moves))
		for i, mi := range a.Moves {
			parts[i] = solveMoveText(k.Moves[mi])
		}
		fmt.Fprintf(w, "  %s: %s\n", name, strings.Join(parts, "; "))
	}
}

func solveMoveText(m solveMove) string {
	head := fmt.Sprintf("%s meeting %d", m.Section, m.Meeting)
	switch m.Change {
	case encode.ChangeNew:
		return head + ": new, " + m.To
	case encode.ChangeDropped:
		return head + ": dropped (was " + m.From + ")"
	}
	return head + ": " + m.From + " → " + m.To
}

// solveQualitySheets are the extra sheets of the timetable workbook: the
// Quality sheet (per level, criterion, staff member, cohort and section)
// and, with --keep, the Changes sheet.
func solveQualitySheets(t *timetable.Term, res *encode.OptimizeResult) []export.ExtraSheet {
	rep := res.Cost
	q := export.ExtraSheet{Name: "Quality", Header: []string{"Part", "Name", "Level", "Weight", "Units", "Cost", "Lower bound"}}
	for i, l := range res.Levels {
		q.Rows = append(q.Rows, []any{"level", fmt.Sprintf("level %d", l), l, "", "", res.Total[i], res.Bound[i]})
	}
	for _, c := range termCriteria(t, rep.Criteria) {
		q.Rows = append(q.Rows, []any{"criterion", c.Name, c.Level, c.Weight, c.Count, c.Cost, ""})
	}
	names := map[string]string{}
	for _, st := range t.Staff {
		names["staff\x00"+st.ID] = st.Name
	}
	for _, co := range t.Cohorts {
		names["cohort\x00"+co.ID] = co.Name
	}
	for _, part := range []struct {
		kind string
		m    map[string]int64
	}{{"staff", rep.PerStaff}, {"cohort", rep.PerCohort}, {"section", rep.PerSection}, {"room", rep.PerRoom}} {
		ids := make([]string, 0, len(part.m))
		for id, c := range part.m {
			if c != 0 {
				ids = append(ids, id)
			}
		}
		sort.Slice(ids, func(i, j int) bool {
			if part.m[ids[i]] != part.m[ids[j]] {
				return part.m[ids[i]] > part.m[ids[j]]
			}
			return ids[i] < ids[j]
		})
		for _, id := range ids {
			label := id
			if n := names[part.kind+"\x00"+id]; n != "" && n != id {
				label += " " + n
			}
			q.Rows = append(q.Rows, []any{part.kind, label, "", "", "", part.m[id], ""})
		}
	}
	sheets := []export.ExtraSheet{q}
	if res.Kept {
		qual := solveBuildQuality(t, res)
		ch := export.ExtraSheet{Name: "Changes", Header: []string{"Section", "Meeting", "Change", "From", "To", "Staff", "Cohorts"}}
		for _, m := range qual.Keep.Moves {
			ch.Rows = append(ch.Rows, []any{m.Section, m.Meeting, m.Change, m.From, m.To, strings.Join(m.Staff, ", "), strings.Join(m.Cohorts, ", ")})
		}
		sheets = append(sheets, ch)
	}
	return sheets
}

// solveReadKept reads the --keep timetable; problems that leave rows out
// are errors (a partial timetable would count its missing meetings as
// moved).
func solveReadKept(e *env, path string, t *timetable.Term) (*timetable.Schedule, error) {
	if path == "" {
		return nil, nil
	}
	s, ps, err := timetable.ReadSchedule(path, t)
	if err != nil {
		return nil, wrapCode(exitError, err)
	}
	for _, p := range ps.Warnings() {
		fmt.Fprintln(e.stderr, "warning:", p.String())
	}
	if errs := ps.Errors(); len(errs) > 0 {
		for _, p := range errs {
			fmt.Fprintln(e.stderr, p.String())
		}
		return nil, withCode(exitError, fmt.Sprintf("%s has %s that cannot be read — correct them, or leave out --keep", path, checkCount(len(errs), "row")))
	}
	return s, nil
}

// keepCounts says how many kept meetings moved or were dropped and how
// many meetings are new: "3 meetings moved, 1 dropped".
func keepCounts(k *solveKeep) string {
	parts := []string{checkCount(k.Moved, "meeting") + " moved"}
	if k.Dropped > 0 {
		parts = append(parts, fmt.Sprintf("%d dropped", k.Dropped))
	}
	if k.New > 0 {
		parts = append(parts, fmt.Sprintf("%d new", k.New))
	}
	return strings.Join(parts, ", ")
}

// termCriteria are the criteria of a cost report that apply to t
// (timetable.Term.CriterionApplies): a term without course requests
// reports as it did before the sectioning criteria existed.
func termCriteria(t *timetable.Term, cs []timetable.CriterionCost) []timetable.CriterionCost {
	out := make([]timetable.CriterionCost, 0, len(cs))
	for _, c := range cs {
		if t.CriterionApplies(c.Name) {
			out = append(out, c)
		}
	}
	return out
}
