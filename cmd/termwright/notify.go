package main

import (
	"fmt"
	"io"
	"os"
	"path/filepath"

	"github.com/spf13/cobra"
	"github.com/termwright/termwright/export"
	"github.com/termwright/termwright/timetable"
)

func init() { register("notify", newNotifyCmd) }

// notifyOptions are the flags of `termwright notify`.
type notifyOptions struct {
	out string // output directory, new or empty
}

func newNotifyCmd(e *env) *cobra.Command {
	o := &notifyOptions{}
	cmd := &cobra.Command{
		Use:   "notify TERM OLD NEW -o DIR",
		Short: "Write a change notice and an updated calendar for everyone a new timetable affects",
		Long: "notify compares two timetables of a term (as diff does) and writes, for every\n" +
			"staff member, cohort and (with enrolments) student whose meetings changed, and\n" +
			"for every student who changed section (a sectioned term: the timetables' Class\n" +
			"lists sheets):\n\n" +
			"  {staff,cohorts,students}/NAME.txt  a short plain text to paste into an e-mail:\n" +
			"                                     what changed, old → new, with the dates\n" +
			"  {staff,cohorts,students}/NAME.ics  their updated calendar (RFC 5545): the same\n" +
			"                                     event identifiers as publish's calendars and\n" +
			"                                     a higher sequence number, so importing it\n" +
			"                                     updates the events people already have\n\n" +
			"NEW must fit TERM and break no hard requirement. DIR must be new or empty;\n" +
			"nothing is overwritten.",
		Args: cobra.ExactArgs(3),
		RunE: e.runner(o, func(cmd *cobra.Command, args []string) error { return runNotify(e, o, args[0], args[1], args[2]) }),
	}
	cmd.Flags().StringVarP(&o.out, "out", "o", "", "directory to write the notices into (required; new or empty)")
	addColumnsFlag(cmd, e)
	return cmd
}

func runNotify(e *env, o *notifyOptions, termPath, oldPath, newPath string) error {
	if o.out == "" {
		return withCode(exitError, "notify needs an output directory: add -o DIR")
	}
	if err := checkPublishDir(o.out, false, termPath); err != nil {
		return err
	}
	d, err := loadDiff(e, oldPath, newPath, termPath)
	if err != nil {
		return err
	}
	if n := len(d.newHard); n > 0 {
		for _, v := range d.newHard {
			fmt.Fprintf(e.stderr, "%s: %s\n", v.Rule, v.Msg)
		}
		return withCode(exitError, fmt.Sprintf("%s breaks %s, so no notices were written; fix the timetable first", newPath, checkCount(n, "hard requirement")))
	}
	notices, err := export.NewNotices(d.term, d.newSched, d.cmp)
	if err != nil {
		return wrapCode(exitError, err)
	}
	notices.SetSectionChanges(d.moves)
	moves := map[string]int{}
	for _, mv := range d.moves {
		moves[mv.Student]++
	}
	jobs := notifyJobs(d.affected)
	if len(jobs) == 0 {
		fmt.Fprintln(e.stdout, "No one is affected: no notices written.")
		return nil
	}
	opt := export.Options{Generated: e.now()}
	var made []string // files and folders this run created, removed again when it fails
	fail := func(err error) error {
		for i := len(made) - 1; i >= 0; i-- {
			os.Remove(made[i]) // a folder goes only when empty: nothing of anyone else's
		}
		return err
	}
	mkdir := func(dir string) error {
		if err := os.Mkdir(dir, 0o755); err == nil {
			made = append(made, dir)
		} else if !os.IsExist(err) {
			return failf(exitError, "cannot create %s: %w", dir, err)
		}
		return nil
	}
	if err := mkdir(o.out); err != nil {
		return err
	}
	for _, j := range jobs {
		dir := filepath.Join(o.out, j.dir)
		if err := mkdir(dir); err != nil {
			return fail(err)
		}
		ics := j.stem + ".ics"
		txt, err := writeOutput(filepath.Join(dir, j.stem+".txt"), false, func(w io.Writer) error {
			return notices.Text(w, j.a, ics)
		})
		if txt != "" {
			made = append(made, txt)
		}
		if err != nil {
			return fail(wrapCode(exitError, err))
		}
		cal, err := writeOutput(filepath.Join(dir, ics), false, func(w io.Writer) error {
			return notices.Calendar(w, j.who, j.cancelled(d.cmp), opt)
		})
		if cal != "" {
			made = append(made, cal)
		}
		if err != nil {
			return fail(wrapCode(exitError, err))
		}
		n := len(j.a.Changes)
		if j.a.Kind == timetable.SubjectStudent {
			n += moves[j.a.ID]
		}
		fmt.Fprintf(e.stdout, "%s  %s: %s\n", txt, j.a.ID, checkCount(n, "change"))
	}
	fmt.Fprintf(e.stdout, "Wrote %s and their calendars to %s.\n", checkCount(len(jobs), "notice"), o.out)
	return nil
}

// notifyJob is one affected person's or cohort's pair of files.
type notifyJob struct {
	a    timetable.Affected
	who  export.Subject
	dir  string // staff, cohorts or students
	stem string // file name without extension
}

// cancelled lists the earlier meetings the job's subject no longer attends.
func (j notifyJob) cancelled(c *timetable.Comparison) []timetable.Meeting {
	var out []timetable.Meeting
	for _, sc := range j.a.Changes {
		if ch := c.Changes[sc.Change]; sc.Kind == timetable.ChangeDropped && ch.Old != nil {
			out = append(out, *ch.Old)
		}
	}
	return out
}

// notifyJobs lists the notices to write (rooms get none), with file names
// from export.SafeFileNames, unique within each folder.
func notifyJobs(affected []timetable.Affected) []notifyJob {
	dirs := map[string]string{timetable.SubjectStaff: "staff", timetable.SubjectCohort: "cohorts", timetable.SubjectStudent: "students"}
	var jobs []notifyJob
	ids := map[string][]string{}
	for _, a := range affected {
		if who, ok := export.NoticeSubject(a); ok {
			jobs = append(jobs, notifyJob{a: a, who: who, dir: dirs[a.Kind]})
			ids[a.Kind] = append(ids[a.Kind], a.ID)
		}
	}
	names := map[string][]string{}
	for k, list := range ids {
		names[k] = export.SafeFileNames(list)
	}
	next := map[string]int{}
	for i := range jobs {
		k := jobs[i].a.Kind
		jobs[i].stem = names[k][next[k]]
		next[k]++
	}
	return jobs
}
