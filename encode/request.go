package encode

import (
	"fmt"
	"strconv"
	"strings"
	"time"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// Request asks for one meeting of a section to start at a given day and
// time, optionally in a given room: "BIO-101 on Tue 10:00 in L2".
//
// For a section with meeting patterns (Section.Times) the request names
// one of them as the Meeting times sheet writes it: with several days
// ("CHEM-110 at Tue Thu 10:30"), the patterns with exactly those days and
// that start; with one day ("CHEM-110 on Tue at 10:30"), every pattern
// that meets on that day at that start. See request_patterns.go.
type Request struct {
	Section string           // section ID
	Day     time.Weekday     // day of the requested start (the first of Days when several)
	Start   timetable.Clock  // requested start time: the start of a period of the grid, or of a meeting pattern
	Room    string           // requested room ID; "" for any suitable room
	Src     timetable.Source // Requests row; zero for the command line
	// Days, when it holds two days or more, is the requested pattern's set
	// of days (pattern sections only); 0 or one day: Day alone.
	Days timetable.DaySet
	// Time, when above 0, names one meeting pattern of a pattern section
	// exactly, by its 1-based position (as Placement.Time); Day, Days and
	// Start then only word it.
	Time int
}

// At is the requested start as "Tue 10:00", or the requested pattern's
// days and start as "Tue Thu 10:30".
func (r Request) At() string {
	if r.Days.Count() > 1 {
		return r.Days.String() + " " + r.Start.String()
	}
	return timetable.DayName(r.Day) + " " + r.Start.String()
}

// String is "section BIO-101 at Tue 10:00 in room L2".
func (r Request) String() string {
	s := "section " + r.Section + " at " + r.At()
	if r.Room != "" {
		s += " in room " + r.Room
	}
	return s
}

// ParseAt reads a day and start time such as "Tue 10:00", "tuesday 9:30"
// or "Tue 10.00".
func ParseAt(s string) (time.Weekday, timetable.Clock, error) {
	f := strings.Fields(s)
	if len(f) != 2 {
		return 0, 0, fmt.Errorf("%q is not a day and a time: write it like \"Tue 10:00\"", s)
	}
	days, c, err := ParseWhen(s)
	if err != nil {
		return 0, 0, err
	}
	day, _ := days.First()
	return day, c, nil
}

// ParseWhen reads one or more days and a start time: "Tue 10:00" (a grid
// start, or a pattern meeting on Tuesday at 10:00) or, for a meeting
// pattern, its days as the Meeting times sheet writes them, "Mon Wed Fri
// 9:00" (days separated by spaces, commas or slashes).
func ParseWhen(s string) (timetable.DaySet, timetable.Clock, error) {
	f := strings.FieldsFunc(s, func(r rune) bool { return r == ' ' || r == ',' || r == '/' || r == '\t' })
	if len(f) < 2 {
		return 0, 0, fmt.Errorf("%q is not a day and a time: write it like \"Tue 10:00\" (or, for a meeting pattern, \"Mon Wed Fri 9:00\")", s)
	}
	var days timetable.DaySet
	for _, w := range f[:len(f)-1] {
		d, ok := timetable.ParseDay(w)
		if !ok {
			return 0, 0, fmt.Errorf("%q does not start with day names: write it like \"Tue 10:00\" (or \"Mon Wed Fri 9:00\")", s)
		}
		days |= timetable.DaysOf(d)
	}
	c, ok := parseRequestClock(f[len(f)-1])
	if !ok {
		return 0, 0, fmt.Errorf("%q has no valid 24-hour time: write it like \"Tue 10:00\"", s)
	}
	return days, c, nil
}

// NewRequest is the request "section at when (in room)", when read by
// ParseWhen.
func NewRequest(section, when, room string) (Request, error) {
	days, start, err := ParseWhen(when)
	if err != nil {
		return Request{}, err
	}
	return requestAt(section, days, start, room), nil
}

func requestAt(section string, days timetable.DaySet, start timetable.Clock, room string) Request {
	day, _ := days.First()
	r := Request{Section: section, Day: day, Start: start, Room: room}
	if days.Count() > 1 {
		r.Days = days
	}
	return r
}

// parseRequestClock reads "10:00", "9:30" or "10.00" (24-hour).
func parseRequestClock(s string) (timetable.Clock, bool) {
	i := strings.IndexAny(s, ":.")
	if i < 1 || i > 2 || len(s)-i-1 != 2 {
		return 0, false
	}
	h, err1 := strconv.Atoi(s[:i])
	m, err2 := strconv.Atoi(s[i+1:])
	if err1 != nil || err2 != nil || h < 0 || h > 23 || m < 0 || m > 59 || s[0] == '+' || s[0] == '-' {
		return 0, false
	}
	return timetable.Clock(h*60 + m), true
}

// RequestError lists requests that name something the term does not have.
type RequestError []InputError

// Error lists the problems, one per line, each with its row.
func (e RequestError) Error() string {
	lines := make([]string, len(e))
	for i, x := range e {
		if s := x.Src.String(); s != "" {
			lines[i] = s + ": " + x.Msg
		} else {
			lines[i] = x.Msg
		}
	}
	if len(lines) == 1 {
		return "the request cannot be read: " + lines[0]
	}
	return "the requests cannot be read:\n  " + strings.Join(lines, "\n  ")
}

// requestPlan is how the requests enter the program: requests with a room
// become fixed meetings of a copy of the term (the room model narrows a
// fixed meeting's rooms), the others plain constraints on start atoms.
type requestPlan struct {
	work  *timetable.Term
	fixed []int   // per request: index into work.Sections[s].Fixed, or -1
	sec   []int   // per request: section index
	start []int   // per request: start period (-1 for a pattern section)
	times [][]int // per request: the requested patterns (0-based) of a pattern section; nil for the grid
}

// planRequests checks the requests against the term and plans them.
func planRequests(t *timetable.Term, reqs []Request) (*requestPlan, error) {
	plan := &requestPlan{work: t}
	if len(reqs) == 0 {
		return plan, nil
	}
	secIdx, roomIdx := t.SectionIndex(), t.RoomIndex()
	var errs RequestError
	bad := func(r Request, format string, args ...any) {
		src := r.Src
		msg := fmt.Sprintf(format, args...)
		if src.Sheet == "" {
			msg = "request " + r.String() + ": " + msg
		}
		errs = append(errs, InputError{Src: src, Msg: msg})
	}
	for _, r := range reqs {
		s, ok := secIdx[r.Section]
		if !ok {
			bad(r, "section %q is not on the Sections sheet — correct the section ID", r.Section)
			continue
		}
		if t.Sections[s].UsesTimes() {
			if _, msg := matchTimes(&t.Sections[s], r); msg != "" {
				bad(r, "%s", msg)
			}
		} else if r.Days.Count() > 1 || r.Time > 0 {
			bad(r, "section %s meets on the period grid, one meeting at a time — give one day and start time, like \"Tue 10:00\"", r.Section)
		} else if t.PeriodAt(r.Day, r.Start) < 0 {
			bad(r, "%s is not the start of a period of the grid — use a day and start time from the Periods sheet", r.At())
		}
		if r.Room != "" {
			if _, ok := roomIdx[r.Room]; !ok {
				bad(r, "room %q is not on the Rooms sheet — correct the room ID or leave the room out", r.Room)
			} else if t.Sections[s].NoRoom {
				bad(r, "section %s takes no room (online or off-site) — leave the room out of the request", r.Section)
			}
		}
	}
	if len(errs) > 0 {
		return nil, errs
	}
	work := *t
	work.Sections = append([]timetable.Section(nil), t.Sections...)
	copied := map[int]bool{}
	for _, r := range reqs {
		s := secIdx[r.Section]
		plan.sec = append(plan.sec, s)
		plan.fixed = append(plan.fixed, -1)
		if t.Sections[s].UsesTimes() {
			// A pattern request is a constraint on time and room atoms
			// (addPatternRequest); it does not touch the room model.
			idx, _ := matchTimes(&t.Sections[s], r)
			plan.start = append(plan.start, -1)
			plan.times = append(plan.times, idx)
			continue
		}
		p := t.PeriodAt(r.Day, r.Start)
		plan.start = append(plan.start, p)
		plan.times = append(plan.times, nil)
		if r.Room == "" {
			continue
		}
		sec := &work.Sections[s]
		if !copied[s] {
			sec.Fixed = append([]timetable.Fixed(nil), sec.Fixed...)
			copied[s] = true
		}
		same := -1
		for i, f := range sec.Fixed {
			if t.PeriodAt(f.Day, f.Start) == p {
				same = i
				break
			}
		}
		switch {
		case same >= 0 && sec.Fixed[same].Room == r.Room:
			// Already fixed there in that room: the request adds the time only.
		case same >= 0 && sec.Fixed[same].Room == "":
			// A fixed time without a room: the request names its room.
			sec.Fixed[same].Room = r.Room
			sec.Fixed[same].Text += " in " + r.Room + ", as requested"
		default:
			sec.Fixed = append(sec.Fixed, timetable.Fixed{Day: r.Day, Start: r.Start, Room: r.Room,
				Text: r.At() + ", as requested"})
			plan.fixed[len(plan.fixed)-1] = len(sec.Fixed) - 1
		}
	}
	plan.work = &work
	return plan, nil
}

// addRequests makes one group per request: the fixed-meeting group of a
// request planned as a fixed meeting is renamed, the others get a new
// group forbidding every model without a meeting at the requested start.
func (x *Explainer) addRequests(plan *requestPlan) error {
	b := x.cat.extender(x.p)
	for i, r := range x.reqs {
		s, p := plan.sec[i], plan.start[i]
		x.reqSec = append(x.reqSec, s)
		x.reqStart = append(x.reqStart, p)
		x.reqTimes = append(x.reqTimes, plan.times[i])
		src := []timetable.Source{r.Src}
		if r.Src.Sheet == "" {
			src = nil
		}
		var g int
		if x.work.Sections[s].UsesTimes() {
			g = x.addPatternRequest(b, i, s, plan.times[i], src)
			x.reqGroup = append(x.reqGroup, g)
			x.setRole(g, roleRequest)
			continue
		}
		sentence := requestSentence(x.work, r, i+1, s, p)
		if fi := plan.fixed[i]; fi >= 0 {
			key := KindFixed + "\x00" + r.Section + "\x00" + strconv.Itoa(fi+1)
			var ok bool
			if g, ok = x.cat.groupKey[key]; !ok {
				return fmt.Errorf("internal error: no group for requested meeting %d of section %s", fi+1, r.Section)
			}
			gr := &x.cat.Groups[g]
			gr.Kind, gr.Sentence, gr.Src, gr.RelaxCost = KindRequest, sentence, src, 0
		} else {
			g = b.newGroup(KindRequest, []string{strconv.Itoa(i + 1)}, sentence, src, 0)
			b.in(g, KindRequest)
			if a := x.cat.StartAtom(s, p); a != 0 {
				b.rule(0, solver.Neg(a), b.sel(g))
			} else {
				b.rule(0, b.sel(g))
			}
		}
		x.reqGroup = append(x.reqGroup, g)
		x.setRole(g, roleRequest)
	}
	return nil
}

// requestSentence states request number n in plain words, saying so when
// the requested start cannot hold a whole meeting.
func requestSentence(t *timetable.Term, r Request, n, s, p int) string {
	sec := &t.Sections[s]
	out := fmt.Sprintf("request %d: section %s meets at %s", n, r.Section, r.At())
	if r.Room != "" {
		out += " in room " + r.Room
	}
	if _, ok := t.Span(p, sec.Length); !ok {
		out += fmt.Sprintf(", but a meeting of %d periods cannot start there without crossing a break or the end of the day", sec.Length)
	}
	return out
}
