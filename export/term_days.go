package export

import (
	"fmt"
	"sort"
	"strings"
	"time"

	"github.com/termwright/termwright/timetable"
)

// teachingDay reports whether date d (midnight UTC) is a day of teaching:
// within the term, a day of the weekly grid and not a holiday.
func (v *view) teachingDay(d time.Time, holidays map[string]bool) bool {
	t := v.t
	return !d.Before(civil(t.FirstDay)) && !d.After(civil(t.LastDay)) &&
		v.dayCol[d.Weekday()] >= 0 && !holidays[d.Format("2006-01-02")]
}

// holidaySet is the term's holidays as "2006-01-02" dates.
func (v *view) holidaySet() map[string]bool {
	out := make(map[string]bool, len(v.t.Holidays))
	for _, h := range v.t.Holidays {
		out[h.Format("2006-01-02")] = true
	}
	return out
}

// weeksWithTeaching counts the calendar weeks (Monday to Sunday, week 1
// holding the first day) of the term that have at least one day of
// teaching: a week of holidays does not count. 0 without term dates.
func (v *view) weeksWithTeaching() int {
	t := v.t
	if t.FirstDay.IsZero() || t.LastDay.Before(t.FirstDay) {
		return 0
	}
	hol := v.holidaySet()
	n := 0
	first, last := civil(t.FirstDay), civil(t.LastDay)
	monday := first.AddDate(0, 0, -timetable.WeekOrder(first.Weekday()))
	for wk := monday; !wk.After(last); wk = wk.AddDate(0, 0, 7) {
		for i := 0; i < 7; i++ {
			if v.teachingDay(wk.AddDate(0, 0, i), hol) {
				n++
				break
			}
		}
	}
	return n
}

// dayRange is a run of holidays: first and last date (midnight UTC).
type dayRange struct{ from, to time.Time }

// holidayRanges groups the term's holidays into runs: two holidays belong
// to one run when every day between them is a holiday too or a day
// without teaching anyway (a weekend, a day without periods), so a break
// from Monday to the next Monday is one run.
func (v *view) holidayRanges() []dayRange {
	hs := make([]time.Time, 0, len(v.t.Holidays))
	for _, h := range v.t.Holidays {
		hs = append(hs, civil(h))
	}
	sort.Slice(hs, func(i, j int) bool { return hs[i].Before(hs[j]) })
	hol := v.holidaySet()
	var out []dayRange
	for _, h := range hs {
		if n := len(out); n > 0 {
			if !h.After(out[n-1].to) {
				continue // the same date twice
			}
			joined := true
			for d := out[n-1].to.AddDate(0, 0, 1); d.Before(h); d = d.AddDate(0, 0, 1) {
				if v.dayCol[d.Weekday()] >= 0 && !hol[d.Format("2006-01-02")] {
					joined = false
					break
				}
			}
			if joined {
				out[n-1].to = h
				continue
			}
		}
		out = append(out, dayRange{h, h})
	}
	return out
}

// text is a run as people write it: "25 Oct", "13–17 Mar",
// "29 Oct – 2 Nov", "28 Dec 2027 – 3 Jan 2028"; withYear adds the year.
func (r dayRange) text(withYear bool) string {
	year := func(d time.Time) string {
		if withYear {
			return fmt.Sprintf(" %d", d.Year())
		}
		return ""
	}
	a, b := r.from, r.to
	switch {
	case a.Equal(b):
		return a.Format("2 Jan") + year(a)
	case a.Year() != b.Year():
		return a.Format("2 Jan 2006") + " – " + b.Format("2 Jan 2006")
	case a.Month() == b.Month():
		return fmt.Sprintf("%d–%d %s", a.Day(), b.Day(), a.Format("Jan")) + year(a)
	}
	return a.Format("2 Jan") + " – " + b.Format("2 Jan") + year(a)
}

// holidayTexts lists the runs of holidays as text; the year is written
// when the term's dates span more than one year.
func (v *view) holidayTexts() []string {
	withYear := v.t.FirstDay.Year() != v.t.LastDay.Year()
	var out []string
	for _, r := range v.holidayRanges() {
		out = append(out, r.text(withYear))
	}
	return out
}

// teachingWeeksValue is the cover's count of teaching weeks, with the
// numbering explained when some numbered weeks have no teaching:
// "12 (weeks 1–13, 1 without teaching)".
func (v *view) teachingWeeksValue() string {
	n, all := v.weeksWithTeaching(), v.t.TeachingWeeks()
	s := fmt.Sprint(n)
	if n < all {
		s += fmt.Sprintf(" (weeks 1–%d, %d without teaching)", all, all-n)
	}
	return s
}

func plural(n int) string {
	if n == 1 {
		return ""
	}
	return "s"
}

// listThatFits joins as many items as fit in width (as measured by
// width) behind prefix, ending in "and n more" when some are left out.
func listThatFits(prefix string, items []string, max float64, width func(string) float64) string {
	for k := len(items); k > 0; k-- {
		s := prefix + strings.Join(items[:k], ", ")
		if k < len(items) {
			s += fmt.Sprintf(" and %d more", len(items)-k)
		}
		if width(s) <= max || k == 1 {
			return s
		}
	}
	return prefix
}
