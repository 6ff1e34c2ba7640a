package main

import (
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"strings"
	"time"
	"unicode"
	"unicode/utf8"

	"github.com/spf13/cobra"
	"github.com/termwright/termwright/encode"
	"github.com/termwright/termwright/export"
	"github.com/termwright/termwright/timetable"
)

func init() { register("explain", newExplainCmd) }

// explainOptions are the flags of `termwright explain`.
type explainOptions struct {
	section      string        // requested section
	at           string        // requested start, "Tue 10:00"
	room         string        // requested room (optional)
	requests     string        // file of requests (.csv or .xlsx with a Requests sheet)
	alternatives int           // relaxations to list
	json         bool          // print JSON
	out          string        // timetable workbook to write when the answer is yes
	force        bool          // replace an existing output file
	timeLimit    time.Duration // whole run
	seed         int64         // engine seed
	budget       int64         // conflicts per check
	student      string        // explain one student's clashes on a timetable (explain_student.go)
}

func newExplainCmd(e *env) *cobra.Command {
	o := &explainOptions{}
	cmd := &cobra.Command{
		Use:   "explain TERM [--section S --at \"Tue 10:00\" [--room R] | --requests FILE | TIMETABLE --student ID]",
		Short: "Say why a term (or a requested slot) has no timetable, and what would have to give",
		Long: "explain reads a term workbook (or folder of CSV files) and answers one question.\n\n" +
			"Without requests: does a timetable meeting every hard requirement exist? If not,\n" +
			"it names a smallest set of requirements that cannot all hold — drop any one and\n" +
			"the rest can — each as a sentence with the workbook rows it comes from, and the\n" +
			"sections involved; then the cheapest ways out: sets of requirements whose\n" +
			"relaxation makes a timetable possible, preferences and day patterns before\n" +
			"fixed meetings, availability and rooms.\n\n" +
			"With a request (--section, --at and optionally --room) or a file of them\n" +
			"(--requests: a CSV file or an .xlsx workbook with a sheet named Requests, columns\n" +
			"Section, At and Room): can they all be granted together? If yes, a full\n" +
			"timetable that grants them is found and checked (-o writes it); if not, the\n" +
			"reasons, what would have to give, and the times where the section could meet\n" +
			"instead. For a section with meeting times, --at names one of them as the\n" +
			"Meeting times sheet writes it (\"Tue Thu 10:30\": exactly those days), or one\n" +
			"day and start (\"Tue 10:30\": any of its meeting times on that day at that\n" +
			"start); the other places are its meeting times and rooms, cheapest first.\n\n" +
			"With a timetable and --student: can the student get a section of every part of\n" +
			"every course they asked for (Course requests sheet) without a clash on that\n" +
			"timetable? If not, a smallest set of their requests that cannot be combined,\n" +
			"and the clashes (overlaps, too little travel time) and full sections that rule\n" +
			"out every choice, each section with its times and rows.\n\n" +
			"Problems the term check finds at once (a cohort or staff member needing more\n" +
			"periods than they have, too many simultaneous fixed meetings) are printed first.\n" +
			"Exit status: 0 a timetable exists / the requests are granted, 2 none exists /\n" +
			"refused (explained), 1 error or no answer within the time limit.",
		Args: cobra.RangeArgs(1, 2),
		RunE: e.runner(o, func(cmd *cobra.Command, args []string) error {
			switch {
			case o.student != "" && len(args) == 2:
				return runExplainStudent(e, o, args[0], args[1])
			case o.student != "":
				return withCode(exitError, "--student needs the timetable to judge: termwright explain TERM TIMETABLE --student ID")
			case len(args) == 2:
				return withCode(exitError, "a second file (a timetable) is only read with --student ID")
			}
			return runExplain(cmd.Context(), e, o, args[0])
		}),
	}
	f := cmd.Flags()
	f.StringVar(&o.section, "section", "", "section of a request (with --at)")
	f.StringVar(&o.at, "at", "", `requested start of one meeting, like "Tue 10:00", or a meeting time's days and start, like "Mon Wed Fri 9:00" (with --section)`)
	f.StringVar(&o.room, "room", "", "requested room (optional, with --section and --at)")
	f.StringVar(&o.requests, "requests", "", "file of requests: .csv, or .xlsx with a Requests sheet (columns Section, At, Room)")
	f.IntVar(&o.alternatives, "alternatives", 3, "how many ways out to list (0 for none)")
	f.BoolVar(&o.json, "json", false, "print the answer as JSON")
	f.StringVarP(&o.out, "out", "o", "", "when the answer is yes, write the timetable to this workbook (.xlsx)")
	f.BoolVar(&o.force, "force", false, "replace an existing output file")
	f.DurationVar(&o.timeLimit, "time-limit", 2*time.Minute, "stop after this long and report what was found (0 for no limit)")
	f.Int64Var(&o.seed, "seed", 1, "seed of the search; the same seed gives the same answer")
	f.Int64Var(&o.budget, "budget", encode.DefaultCheckConflicts, "search conflicts allowed per check; a check that runs out leaves an answer marked not minimal")
	f.StringVar(&o.student, "student", "", "with a TIMETABLE: why this student cannot get all requested courses without a clash")
	addColumnsFlag(cmd, e)
	return cmd
}

// explainReport is the stable JSON form of an explanation.
type explainReport struct {
	*encode.Explanation
	TermCheck []checkProblem `json:"term_check"` // errors the term check finds at once
	Output    string         `json:"output,omitempty"`
	Caution   string         `json:"caution,omitempty"`
}

// explainCaution is shown when a way out relaxes rooms or workload limits.
const explainCaution = "Room capacities, room features such as step-free access, and staff workload limits " +
	"come from your term data: relax them only within each room's posted legal occupancy, accessibility " +
	"needs, local agreements and institution policy."

func runExplain(ctx context.Context, e *env, o *explainOptions, termPath string) error {
	reqs, err := explainRequests(e, o)
	if err != nil {
		return err
	}
	if o.out != "" {
		if err := checkOutput(o.out, o.force, ".xlsx", termPath, o.requests); err != nil {
			return err
		}
	}
	term, found, err := explainLoad(e, termPath)
	if err != nil {
		return err
	}
	rep := explainReport{TermCheck: []checkProblem{}}
	for _, p := range found {
		rep.TermCheck = append(rep.TermCheck, checkProblem{Where: p.Pos.String(), Severity: p.Severity.String(), Message: p.Msg})
	}
	if !o.json {
		explainHeader(e.stdout, term, reqs, rep.TermCheck)
	}
	if ctx == nil {
		ctx = context.Background()
	}
	if o.timeLimit > 0 {
		var cancel context.CancelFunc
		ctx, cancel = context.WithTimeout(ctx, o.timeLimit)
		defer cancel()
	}
	alt := o.alternatives
	if alt <= 0 {
		alt = -1
	}
	ex, err := encode.Explain(ctx, term, reqs, encode.ExplainOptions{Seed: o.seed, CheckConflicts: o.budget, Alternatives: alt})
	if err != nil {
		var re encode.RequestError
		if errors.As(err, &re) {
			return wrapCode(exitError, re)
		}
		return wrapCode(exitError, err)
	}
	rep.Explanation = ex
	if explainNeedsCaution(ex) {
		rep.Caution = explainCaution
	}
	yes := ex.Status == encode.StatusFeasible || ex.Status == encode.StatusGranted
	var outErr error
	if yes && o.out != "" {
		written, err := writeOutput(o.out, o.force, func(w io.Writer) error {
			return export.WriteTimetableWorkbook(w, term, ex.Schedule, export.Options{Generated: e.now()})
		})
		if written == "" {
			return wrapCode(exitError, err)
		}
		rep.Output = written
		outErr = err // written under another name: said after the answer
	}
	if o.json {
		enc := json.NewEncoder(e.stdout)
		enc.SetIndent("", "  ")
		if err := enc.Encode(rep); err != nil {
			return err
		}
	} else {
		explainText(e.stdout, rep, o)
	}
	switch ex.Status {
	case encode.StatusFeasible, encode.StatusGranted:
		if outErr != nil {
			return wrapCode(exitError, outErr)
		}
		return nil
	case encode.StatusInfeasible, encode.StatusRefused:
		if o.out != "" {
			fmt.Fprintf(e.stderr, "termwright: %s was not written: there is no timetable to write\n", o.out)
		}
		return withCode(exitNone, "")
	}
	if ctx.Err() != nil && !errors.Is(ctx.Err(), context.DeadlineExceeded) {
		return withCode(exitError, "interrupted before an answer was found")
	}
	return withCode(exitError, fmt.Sprintf("no answer within the limits (%v, %d conflicts per check) — allow more with --time-limit or --budget", o.timeLimit, o.budget))
}

// explainRequests reads the requests from the flags or the requests file;
// the file's problems, each at its place, go to stderr.
func explainRequests(e *env, o *explainOptions) ([]encode.Request, error) {
	one := o.section != "" || o.at != "" || o.room != ""
	switch {
	case one && o.requests != "":
		return nil, withCode(exitError, "give either --section/--at (one request) or --requests FILE, not both")
	case o.requests != "":
		rows, ps, err := timetable.ReadRequests(o.requests)
		if err != nil {
			return nil, wrapCode(exitError, err)
		}
		reqs, more := encode.RequestsOf(rows)
		ps = append(ps, more...)
		ps.Sort()
		for _, p := range ps {
			fmt.Fprintln(e.stderr, p.String())
		}
		if errs := ps.Errors(); len(errs) > 0 {
			return nil, withCode(exitError, fmt.Sprintf("%s has %s — correct them and run again", o.requests, checkCount(len(errs), "error")))
		}
		return reqs, nil
	case !one:
		return nil, nil
	case o.section == "" || o.at == "":
		return nil, withCode(exitError, `a request needs both --section and --at, like --section BIO-101 --at "Tue 10:00"`)
	}
	req, err := encode.NewRequest(o.section, o.at, o.room)
	if err != nil {
		return nil, failf(exitError, "--at: %w", err)
	}
	return []encode.Request{req}, nil
}

// explainLoad reads the term. Problems of reading (cells, sheets) stop the
// run; problems of meaning that Validate finds (a load above availability,
// clashing fixed meetings, ...) are instant explanations and are returned.
func explainLoad(e *env, path string) (*timetable.Term, timetable.Problems, error) {
	term, problems, err := readTerm(e, path)
	if err != nil {
		return nil, nil, wrapCode(exitError, err)
	}
	semantic := timetable.Validate(term).Errors()
	same := sameProblem
	var reading timetable.Problems
	for _, p := range problems.Errors() {
		found := false
		for _, q := range semantic {
			if same(p, q) {
				found = true
				break
			}
		}
		if !found {
			reading = append(reading, p)
		}
	}
	if len(reading) > 0 {
		for _, p := range reading {
			fmt.Fprintln(e.stderr, p.String())
		}
		return nil, nil, withCode(exitError, fmt.Sprintf("%s has %s that stop it being read as written — fix them first (termwright check %s lists them)",
			path, checkCount(len(reading), "error"), path))
	}
	var kept timetable.Problems
	for _, p := range problems.Errors() {
		if !containsProblem(kept, p, same) {
			kept = append(kept, p)
		}
	}
	return term, kept, nil
}

func containsProblem(ps timetable.Problems, p timetable.Problem, same func(a, b timetable.Problem) bool) bool {
	for _, q := range ps {
		if same(p, q) {
			return true
		}
	}
	return false
}

// explainNeedsCaution reports whether a way out relaxes a room or a
// workload requirement.
func explainNeedsCaution(ex *encode.Explanation) bool {
	for _, c := range ex.Corrections {
		for _, r := range c.Relax {
			switch r.Kind {
			case encode.KindRoomSupply, encode.KindRoomFit, encode.KindRoomAvailability, encode.KindRoomAssignment,
				encode.KindStaffDayLimit, encode.KindStaffConsecutive:
				return true
			}
		}
	}
	return false
}

// explainHeader prints what is asked and the instant findings, before any
// search starts.
func explainHeader(w io.Writer, t *timetable.Term, reqs []encode.Request, found []checkProblem) {
	name := t.Name
	if name == "" {
		name = "(unnamed term)"
	}
	fmt.Fprintf(w, "%s: %s, %s, %s, %s.\n", name, checkCount(len(t.Sections), "section"),
		checkCount(len(t.Staff), "staff member"), checkCount(len(t.Rooms), "room"), checkCount(len(t.Periods), "period"))
	for i, r := range reqs {
		fmt.Fprintf(w, "Request %d%s: %s.\n", i+1, explainFrom(r.Src.String()), r)
	}
	if len(found) > 0 {
		fmt.Fprintln(w, "\nFound at once by the term check:")
		for _, p := range found {
			line := p.Message
			if p.Where != "" {
				line = p.Where + ": " + line
			}
			fmt.Fprintln(w, "  - "+line)
		}
	}
}

func explainFrom(src string) string {
	if src == "" {
		return ""
	}
	return " (" + src + ")"
}

// explainText prints the answer in plain sentences, most specific first.
func explainText(w io.Writer, rep explainReport, o *explainOptions) {
	ex := rep.Explanation
	fmt.Fprintln(w)
	switch ex.Status {
	case encode.StatusFeasible:
		fmt.Fprintln(w, "A timetable meeting every hard requirement exists; it was found and checked.")
	case encode.StatusGranted:
		if len(ex.Requests) == 1 {
			fmt.Fprintln(w, "The request can be granted: a full timetable that grants it was found and checked.")
		} else {
			fmt.Fprintf(w, "All %d requests can be granted together: a full timetable that grants them was found and checked.\n", len(ex.Requests))
		}
	case encode.StatusInfeasible:
		fmt.Fprintln(w, "No timetable meets every hard requirement.")
	case encode.StatusRefused:
		explainRefusal(w, ex)
	default:
		fmt.Fprintln(w, "No answer was reached within the limits.")
	}
	if ex.Cost != nil {
		explainCost(w, ex.Cost)
	}
	if rep.Output != "" {
		fmt.Fprintf(w, "The timetable was written to %s.\n", rep.Output)
	} else if ex.Schedule != nil && o.out == "" {
		fmt.Fprintln(w, "Add -o TIMETABLE.xlsx to write it.")
	}
	if c := ex.Conflict; c != nil {
		fmt.Fprintln(w, "\nWhy not — these cannot all hold (drop any one and the rest can):")
		for i, r := range c.Reasons {
			fmt.Fprintf(w, "  %d. %s\n", i+1, explainSentence(r))
		}
		if len(c.Sections) > 0 {
			var ids []string
			for _, s := range c.Sections {
				ids = append(ids, s.ID)
			}
			fmt.Fprintf(w, "  Sections involved: %s.\n", strings.Join(ids, ", "))
		}
		if !c.Minimal {
			fmt.Fprintln(w, "  (The search ran out of budget while shrinking, so a smaller set may exist.)")
		}
	}
	explainPlaces(w, ex)
	if len(ex.Corrections) > 0 {
		fmt.Fprintln(w, "\nWhat would have to give — relax one of these sets (cheapest first):")
		for i, c := range ex.Corrections {
			letter := string(rune('A' + i%26))
			for j, r := range c.Relax {
				prefix := "     "
				if j == 0 {
					prefix = "  " + letter + "."
				}
				fmt.Fprintf(w, "%s %s\n", prefix, explainSentence(r))
			}
		}
		if ex.CorrectionsComplete {
			fmt.Fprintln(w, "  There is no other way out.")
		}
	} else if ex.Conflict != nil && ex.CorrectionsComplete && o.alternatives > 0 {
		fmt.Fprintln(w, "\nNo relaxation of the term's requirements helps: the requests contradict each other or the sections themselves.")
	}
	if ex.Uncertain != "" {
		fmt.Fprintln(w, "\nNote: "+ex.Uncertain+".")
	}
	if rep.Caution != "" {
		fmt.Fprintln(w, "\nCaution: "+rep.Caution)
	}
	if c := ex.Conflict; c != nil && c.Counted {
		fmt.Fprintf(w, "\n(Proved by counting, not by search: %s and %s; %s.)\n",
			checkCount(c.CoreGroups, "reason"), checkCount(c.CoreSections, "section"), checkCount(ex.Stats.Checks, "check"))
	} else if c != nil {
		fmt.Fprintf(w, "\n(%s and %s in the engine's first core; %s and %s after shrinking; %s.)\n",
			checkCount(c.CoreGroups, "reason"), checkCount(c.CoreSections, "section"),
			checkCount(len(c.Reasons), "reason"), checkCount(len(c.Sections), "section"),
			checkCount(ex.Stats.Checks, "check"))
	}
}

// explainRefusal says which requests are refused.
func explainRefusal(w io.Writer, ex *encode.Explanation) {
	switch {
	case ex.TermInfeasible:
		fmt.Fprintln(w, "The requests cannot be granted: the term has no timetable even without them.")
	case len(ex.Requests) == 1:
		fmt.Fprintln(w, "The request cannot be granted.")
	default:
		fmt.Fprintln(w, "The requests cannot all be granted together.")
		for _, r := range ex.Requests {
			verdict := "can be granted on its own"
			if !r.GrantedAlone {
				verdict = "cannot be granted even on its own"
			}
			fmt.Fprintf(w, "  Request %d (section %s at %s) %s.\n", r.Number, r.Section, r.At, verdict)
		}
	}
}

// explainPlaces lists where refused requests' sections could meet instead.
func explainPlaces(w io.Writer, ex *encode.Explanation) {
	for _, r := range ex.Requests {
		if r.Granted || (r.GrantedAlone && len(ex.Requests) > 1) || ex.TermInfeasible {
			continue
		}
		if len(r.Places) == 0 {
			if r.PlacesComplete {
				fmt.Fprintf(w, "\nSection %s cannot meet at any other time either, with everything else as it is.\n", r.Section)
			}
			continue
		}
		if r.Places[0].Time > 0 {
			explainPatternPlaces(w, r)
			continue
		}
		// One line per day: "Mon 13:00, 14:00; Tue 08:00".
		var days []string
		for i, p := range r.Places {
			day, clock, _ := strings.Cut(p.At, " ")
			if i > 0 && strings.HasPrefix(r.Places[i-1].At, day+" ") {
				days[len(days)-1] += ", " + clock
			} else {
				days = append(days, p.At)
			}
		}
		fmt.Fprintf(w, "\nSection %s could meet instead at: %s.\n", r.Section, strings.Join(days, "; "))
		for _, p := range r.Places {
			if r.Room != "" && p.At == r.At && p.Room != "" {
				fmt.Fprintf(w, "  At %s itself it could meet in room %s instead of %s.\n", p.At, p.Room, r.Room)
			}
		}
		fmt.Fprintln(w, "  (A full timetable with a room was found for each of these; --json lists the rooms.)")
		if !r.PlacesComplete {
			fmt.Fprintln(w, "  (Some times were not decided within the budget.)")
		}
	}
}

// explainPatternPlaces lists the meeting times and rooms where a refused
// request's pattern section could meet instead, cheapest first, one line
// per meeting time: "Mon Wed Fri 09:00-09:50 in ASH-101 or CED-1 (preference
// cost 1 in CED-1)".
func explainPatternPlaces(w io.Writer, r encode.RequestResult) {
	fmt.Fprintf(w, "\nSection %s could meet instead at (cheapest first):\n", r.Section)
	type line struct {
		at    string
		rooms []string
		costs []string
		cost  int
	}
	var lines []*line
	byTime := map[int]*line{}
	for _, p := range r.Places {
		l, ok := byTime[p.Time]
		if !ok {
			l = &line{at: p.At, cost: p.Cost}
			byTime[p.Time] = l
			lines = append(lines, l)
		}
		if p.Room != "" {
			l.rooms = append(l.rooms, p.Room)
		}
		if p.Cost > 0 {
			l.costs = append(l.costs, fmt.Sprintf("%d in %s", p.Cost, roomOrNone(p.Room)))
		}
	}
	for _, l := range lines {
		text := "  " + l.at
		if len(l.rooms) > 0 {
			text += " in " + strings.Join(l.rooms, " or ")
		}
		if len(l.costs) > 0 {
			text += " (preference cost " + strings.Join(l.costs, ", ") + ")"
		}
		fmt.Fprintln(w, text)
	}
	fmt.Fprintln(w, "  (A full timetable passing the timetable check was found for each meeting time and room.)")
	if !r.PlacesComplete {
		fmt.Fprintln(w, "  (Some meeting times or rooms were not decided within the budget.)")
	}
}

func roomOrNone(room string) string {
	if room == "" {
		return "no room"
	}
	return room
}

// explainCost prints the preference cost of a granted timetable, beside
// the best timetable without the requests when both were optimised.
func explainCost(w io.Writer, c *encode.CostComparison) {
	same := true
	var parts []string
	for _, l := range c.Levels {
		same = same && l.With == l.Without
		var items []string
		for _, k := range c.Criteria {
			if k.Level != l.Level {
				continue
			}
			if c.Compared {
				items = append(items, fmt.Sprintf("%s %d vs %d", k.Name, k.With, k.Without))
			} else {
				items = append(items, fmt.Sprintf("%s %d", k.Name, k.With))
			}
		}
		part := fmt.Sprintf("level %d: %d", l.Level, l.With)
		if c.Compared {
			part = fmt.Sprintf("level %d: %d vs %d", l.Level, l.With, l.Without)
		}
		if len(items) > 0 {
			part += " (" + strings.Join(items, ", ") + ")"
		}
		parts = append(parts, part)
	}
	if len(parts) == 0 {
		return
	}
	list := strings.Join(parts, "; ")
	switch {
	case !c.Compared:
		fmt.Fprintf(w, "Preferences of this timetable (not optimised; most important level first): %s.\n", list)
	case same:
		fmt.Fprintf(w, "Granting costs nothing in preferences: the best timetables found with and without the requests cost the same (%s).\n", list)
	default:
		fmt.Fprintf(w, "Preferences, best timetable found with the requests vs without them (within a small budget; most important level first): %s.\n", list)
	}
}

// explainSentence is a reason as a sentence with its rows.
func explainSentence(r encode.Reason) string {
	s := capitalise(r.Sentence)
	if !strings.HasSuffix(s, ".") {
		s += "."
	}
	if where := r.Where(); where != "" {
		s += " [" + where + "]"
	}
	return s
}

func capitalise(s string) string {
	r, n := utf8.DecodeRuneInString(s)
	if n == 0 {
		return s
	}
	return string(unicode.ToUpper(r)) + s[n:]
}
