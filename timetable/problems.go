package timetable

import (
	"cmp"
	"errors"
	"fmt"
	"sort"
	"strings"
)

// ErrUnreadable is wrapped by the error that readers return when a file or
// folder cannot be read at all (not a workbook, damaged, password-protected,
// too large). Test for it with errors.Is.
var ErrUnreadable = errors.New("term workbook cannot be read")

// unreadable is an ErrUnreadable with a one-sentence message for the user,
// keeping the file system's error (when there is one) for errors.Is, such as
// fs.ErrNotExist.
type unreadable struct {
	msg   string
	cause error
}

func (u *unreadable) Error() string        { return u.msg }
func (u *unreadable) Is(target error) bool { return target == ErrUnreadable }
func (u *unreadable) Unwrap() error        { return u.cause }

// unreadableCause is unreadablef keeping cause in the error's chain.
func unreadableCause(cause error, format string, args ...any) error {
	return &unreadable{msg: fmt.Sprintf(format, shortArgs(args)...), cause: cause}
}

// unreadablef makes an error wrapping ErrUnreadable whose text is exactly
// the formatted sentence.
func unreadablef(format string, args ...any) error {
	return &unreadable{msg: fmt.Sprintf(format, shortArgs(args)...)}
}

// Position says where in a workbook a problem is: a sheet (or CSV file stem),
// a 1-based row (the header is row 1; 0 = the whole sheet) and a column
// letter ("" = the whole row). The zero Position means "no particular place".
//
// Every message of the tool names a place in the one text form String
// gives: a cell as "Sections!D14", a whole row as "Sections row 14", a whole
// sheet as "Sections". Source (a record's row) prints the same way.
type Position struct {
	Sheet string // sheet name as the registrar sees it, e.g. "Sections"
	Row   int    // 1-based row; 0 when the problem concerns the whole sheet
	Col   string // column letter such as "D"; "" when it concerns the whole row
}

// String gives the documented text form: "Sections!D14" for a cell,
// "Sections row 14" for a whole row, "Sections" for a whole sheet, "" for
// the zero Position.
func (p Position) String() string {
	switch {
	case p.Sheet == "":
		return ""
	case p.Row == 0:
		return p.Sheet
	case p.Col == "":
		return p.Sheet + " row " + itoa(p.Row)
	default:
		return p.Sheet + "!" + p.Col + itoa(p.Row)
	}
}

// posOf is the position of a record's source, optionally at a column.
func posOf(src Source, col string) Position {
	if src.Row == 0 {
		col = ""
	}
	return Position{Sheet: src.Sheet, Row: src.Row, Col: col}
}

// Severity says whether a problem stops the term from being used.
type Severity int

// Severities, most serious first.
const (
	Error   Severity = iota + 1 // the term cannot be scheduled as written
	Warning                     // probably a mistake, but the term can be used
)

// String gives "error" or "warning".
func (s Severity) String() string {
	if s == Warning {
		return "warning"
	}
	return "error"
}

// Problem is one mistake found in a term: where, how serious, and a message
// that says what is wrong and what to do.
type Problem struct {
	Pos      Position
	Severity Severity
	Msg      string
}

// String gives "Sections!D14: message" for errors and
// "Sections!D14: warning: message" for warnings; without a position the
// prefix is left out.
func (p Problem) String() string {
	var b strings.Builder
	if s := p.Pos.String(); s != "" {
		b.WriteString(s)
		b.WriteString(": ")
	}
	if p.Severity == Warning {
		b.WriteString("warning: ")
	}
	b.WriteString(p.Msg)
	return b.String()
}

// Problems is a list of problems. Readers and Validate return them sorted.
type Problems []Problem

// add appends a problem.
func (ps *Problems) add(pos Position, sev Severity, format string, args ...any) {
	*ps = append(*ps, Problem{Pos: pos, Severity: sev, Msg: fmt.Sprintf(format, shortArgs(args)...)})
}

// errorf appends an error.
func (ps *Problems) errorf(pos Position, format string, args ...any) {
	ps.add(pos, Error, format, args...)
}

// warnf appends a warning.
func (ps *Problems) warnf(pos Position, format string, args ...any) {
	ps.add(pos, Warning, format, args...)
}

// sheetRank orders the sheets of the workbook layout; other sheets follow.
func sheetRank(name string) int {
	n := strings.ToLower(name)
	for i, s := range sheetSpecs {
		if strings.ToLower(s.name) == n {
			return i
		}
	}
	return len(sheetSpecs)
}

// Compare orders sources as a reader of the workbook meets them: by sheet
// in workbook order (other sheets after, by name), then by row; a source
// without a sheet comes last. It returns -1, 0 or +1.
func (s Source) Compare(o Source) int {
	switch {
	case s.Sheet == "" || o.Sheet == "":
		return cmp.Compare(boolRank(s.Sheet == ""), boolRank(o.Sheet == ""))
	case sheetRank(s.Sheet) != sheetRank(o.Sheet):
		return cmp.Compare(sheetRank(s.Sheet), sheetRank(o.Sheet))
	case s.Sheet != o.Sheet:
		return strings.Compare(s.Sheet, o.Sheet)
	}
	return cmp.Compare(s.Row, o.Row)
}

func boolRank(b bool) int {
	if b {
		return 1
	}
	return 0
}

// Sort orders the problems by sheet (in workbook order), row, column and
// severity, keeping the original order otherwise, then removes repeats: an
// identical problem is kept once, and a cell (a position with a column) keeps
// only its first error, since later ones are usually consequences of it.
func (ps *Problems) Sort() {
	p := *ps
	sort.SliceStable(p, func(i, j int) bool {
		a, b := p[i].Pos, p[j].Pos
		if ra, rb := sheetRank(a.Sheet), sheetRank(b.Sheet); ra != rb {
			return ra < rb
		}
		if a.Sheet != b.Sheet {
			return a.Sheet < b.Sheet
		}
		if a.Row != b.Row {
			return a.Row < b.Row
		}
		if len(a.Col) != len(b.Col) {
			return len(a.Col) < len(b.Col)
		}
		if a.Col != b.Col {
			return a.Col < b.Col
		}
		return p[i].Severity < p[j].Severity
	})
	out := p[:0]
	for i, q := range p {
		if i > 0 && dupProblem(out[len(out)-1], q) {
			continue
		}
		out = append(out, q)
	}
	*ps = out
}

// dupProblem reports whether q (sorted right after prev) adds nothing.
func dupProblem(prev, q Problem) bool {
	if prev == q {
		return true
	}
	return prev.Pos == q.Pos && q.Pos.Col != "" && q.Pos.Row != 0 &&
		prev.Severity == Error && q.Severity == Error
}

// Errors returns the problems of severity Error, in order.
func (ps Problems) Errors() Problems { return ps.filter(Error) }

// Warnings returns the problems of severity Warning, in order.
func (ps Problems) Warnings() Problems { return ps.filter(Warning) }

func (ps Problems) filter(s Severity) Problems {
	var out Problems
	for _, p := range ps {
		if p.Severity == s {
			out = append(out, p)
		}
	}
	return out
}

// Err returns nil when there are no errors (warnings do not count), and
// otherwise an error whose text counts the errors and lists each on its own
// line.
func (ps Problems) Err() error {
	errs := ps.Errors()
	if len(errs) == 0 {
		return nil
	}
	return &problemsError{errs: errs}
}

type problemsError struct{ errs Problems }

func (e *problemsError) Error() string {
	noun := "errors"
	if len(e.errs) == 1 {
		noun = "error"
	}
	return fmt.Sprintf("the term has %d %s:\n%s", len(e.errs), noun, e.errs.String())
}

// String lists the problems one per line (without a final newline).
func (ps Problems) String() string {
	var b strings.Builder
	for i, p := range ps {
		if i > 0 {
			b.WriteByte('\n')
		}
		b.WriteString(p.String())
	}
	return b.String()
}
