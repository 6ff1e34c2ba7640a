package timetable

import (
	"time"
	_ "time/tzdata" // time zone names must validate on machines without a zone database
)

// checkTerm checks the Term sheet: dates, time zone and holidays.
func (v *validator) checkTerm() {
	t := v.t
	first, last := t.FirstDay, t.LastDay
	if first.IsZero() {
		v.missingDate("first day", "First day")
	}
	if last.IsZero() {
		v.missingDate("last day", "Last day")
	}
	if !first.IsZero() && !last.IsZero() {
		switch {
		case last.Before(first):
			v.ps.errorf(v.lay.term("last day"), "the last day %s is before the first day %s — swap or correct the dates", dateText(last), dateText(first))
		case int(last.Sub(mondayOf(first)).Hours()/24)/7+1 > 64:
			v.ps.errorf(v.lay.term("last day"), "the term runs for more than 64 weeks (%s to %s) — a term of at most 64 teaching weeks is supported; check the year", dateText(first), dateText(last))
		default:
			v.datesOK = true
		}
	}
	if t.TimeZone != "" {
		if _, err := time.LoadLocation(t.TimeZone); err != nil || t.TimeZone == "Local" {
			v.ps.errorf(v.lay.term("time zone"), "time zone %q is not known — write an IANA name such as Europe/Dublin or America/Chicago", t.TimeZone)
		}
	}
	for i, h := range t.Holidays {
		pos := Position{}
		if v.lay != nil && i < len(v.lay.holidays) {
			pos = v.lay.holidays[i]
		}
		if v.datesOK && (h.Before(first) || h.After(last)) {
			v.ps.errorf(pos, "holiday %s is outside the term (%s to %s) — correct the date or remove it", dateText(h), dateText(first), dateText(last))
		}
	}
}

func dateText(d time.Time) string { return d.Format("2006-01-02") }

// checkPeriods checks the grid: times in order, no overlaps, sorted, and
// computes the runs of consecutive periods.
func (v *validator) checkPeriods() {
	ps := v.t.Periods
	if len(ps) == 0 && !patternOnly(v.t) {
		v.ps.errorf(v.sheetPos(shPeriods), "the term has no periods — list the weekly periods (Day, Start, End) on the Periods sheet")
	}
	var latest Period // the period of the current day that ends last so far
	for i, p := range ps {
		if p.Index != i {
			v.ps.errorf(posOf(p.Src, ""), "period %s has Index %d but is number %d in the list — number periods by their place in Term.Periods", p.Label(), p.Index, i)
		}
		if p.Day < time.Sunday || p.Day > time.Saturday {
			v.ps.errorf(v.at(p.Src, "Day"), "period has an invalid day — use Mon to Sun")
		}
		if p.Start < 0 || p.Start >= 24*60 || p.End > 24*60 {
			v.ps.errorf(v.at(p.Src, "Start"), "period %s–%s is not within one day — use times from 00:00 to 24:00", p.Start, p.End)
			continue
		}
		if p.End <= p.Start {
			v.ps.errorf(v.at(p.Src, "End"), "period %s ends at %s, not after it starts — End must be later than Start", p.Label(), p.End)
		}
		if i == 0 {
			latest = p
			continue
		}
		q := ps[i-1]
		if latest.Day != p.Day {
			latest = p
		}
		switch {
		case WeekOrder(q.Day) > WeekOrder(p.Day) || (q.Day == p.Day && q.Start > p.Start):
			v.ps.errorf(posOf(p.Src, ""), "periods are not in order (%s comes after %s) — sort Term.Periods by day and start", p.Label(), q.Label())
		case q.Day == p.Day && q.Start == p.Start:
			v.ps.errorf(v.at(p.Src, "Start"), "period %s is listed twice%s — delete one of them", p.Label(), rowNote(q.Src))
		case latest.Day == p.Day && latest.Index != p.Index && p.Start < latest.End:
			v.ps.errorf(v.at(p.Src, "Start"), "period %s–%s overlaps period %s–%s%s — periods of one day must not overlap", p.Label(), p.End, latest.Label(), latest.End, rowNote(latest.Src))
		}
		if p.End > latest.End {
			latest = p
		}
	}
	v.runs = make([]int, len(ps))
	for i := len(ps) - 1; i >= 0; i-- {
		v.runs[i] = 1
		if i+1 < len(ps) && v.t.Consecutive(i, i+1) {
			v.runs[i] = v.runs[i+1] + 1
		}
		v.maxRun = max(v.maxRun, v.runs[i])
	}
}

// rowNote gives " (row 7)" for a record with a row, else "".
func rowNote(src Source) string {
	if src.Row == 0 {
		return ""
	}
	return " (row " + itoa(src.Row) + ")"
}

// sheetPos names a whole sheet for a read Term, nothing for a built one.
func (v *validator) sheetPos(sheet string) Position {
	if v.lay == nil {
		return Position{}
	}
	for name := range v.lay.cols {
		if normHeader(name) == normHeader(sheet) {
			return Position{Sheet: name}
		}
	}
	return Position{Sheet: sheet}
}

// daysWithRun counts the days that have a run of at least n consecutive periods.
func (v *validator) daysWithRun(n int) int {
	days := map[time.Weekday]bool{}
	for i, r := range v.runs {
		if r >= n {
			days[v.t.Periods[i].Day] = true
		}
	}
	return len(days)
}

// missingDate reports a term date that is missing: blank in its row, or
// without a row.
func (v *validator) missingDate(key, label string) {
	if v.lay != nil {
		if p, ok := v.lay.termKey[key]; ok {
			v.ps.errorf(p, "the term has no %s: %s is blank — write the date as YYYY-MM-DD", key, label)
			return
		}
	}
	v.ps.errorf(v.lay.term(key), "the term has no %s — add a row with Key %q and the date (YYYY-MM-DD) in Value", key, label)
}
