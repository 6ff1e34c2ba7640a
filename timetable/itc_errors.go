package timetable

import (
	"errors"
	"sort"
	"strconv"
	"strings"
)

// ErrITCFormat is matched (with errors.Is) by every error that ReadCTT,
// ReadITCSolution and ReadITCBest return for bad input.
var ErrITCFormat = errors.New("not valid in the ITC-2007 curriculum-based course timetabling format")

// ITCError is one problem found in a benchmark file, at a 1-based line
// (0 when the problem concerns the whole file). Its text form is
// "file.ctt:12: what is wrong; what to do".
type ITCError struct {
	File string // file name as given to the reader
	Line int    // 1-based line number; 0 = the whole file
	Col  int    // 1-based column of the field concerned; 0 = the whole line
	Msg  string // what is wrong and what to do
}

// Error gives the documented text form "file:LINE: message", or
// "file:LINE:COL: message" when the field's column is known.
func (e *ITCError) Error() string {
	switch {
	case e.Line <= 0:
		return e.File + ": " + e.Msg
	case e.Col > 0:
		return e.File + ":" + strconv.Itoa(e.Line) + ":" + strconv.Itoa(e.Col) + ": " + e.Msg
	}
	return e.File + ":" + strconv.Itoa(e.Line) + ": " + e.Msg
}

// Unwrap makes every ITCError match ErrITCFormat.
func (e *ITCError) Unwrap() error { return ErrITCFormat }

// ITCErrors is every problem found in one read, sorted by line. A reader
// returns it as its error when it is not empty (never an empty list).
type ITCErrors []*ITCError

// maxITCErrors bounds how many problems one error message lists; a file
// that is not in the format at all would otherwise give one per line.
const maxITCErrors = 50

// Error lists the problems one per line, at most maxITCErrors of them.
func (l ITCErrors) Error() string {
	var b strings.Builder
	for i, e := range l {
		if i == maxITCErrors {
			b.WriteString("\n... and " + strconv.Itoa(len(l)-i) + " more problems")
			break
		}
		if i > 0 {
			b.WriteByte('\n')
		}
		b.WriteString(e.Error())
	}
	return b.String()
}

// Unwrap gives the members, so errors.Is and errors.As see each of them.
func (l ITCErrors) Unwrap() []error {
	out := make([]error, len(l))
	for i, e := range l {
		out[i] = e
	}
	return out
}

// itcErrs collects the problems of one read.
type itcErrs struct {
	file string
	list ITCErrors
}

func (c *itcErrs) add(line int, msg string) { c.addAt(line, 0, msg) }

// addAt records a problem at a line and column (0 = the whole line).
func (c *itcErrs) addAt(line, col int, msg string) {
	c.list = append(c.list, &ITCError{File: c.file, Line: line, Col: col, Msg: msg})
}

// err returns the sorted list, or nil when nothing was wrong.
func (c *itcErrs) err() error {
	if len(c.list) == 0 {
		return nil
	}
	sort.SliceStable(c.list, func(i, j int) bool { return c.list[i].Line < c.list[j].Line })
	return c.list
}
