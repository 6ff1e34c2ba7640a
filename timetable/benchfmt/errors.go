package benchfmt

import (
	"errors"
	"sort"
	"strconv"
	"strings"
)

// ErrCTTFormat is matched (with errors.Is) by every error that ReadCTT,
// ReadCTTSolution and ReadCTTBest return for bad input.
var ErrCTTFormat = errors.New("not valid in the ITC-2007 curriculum-based course timetabling format")

// ErrXMLFormat is matched (with errors.Is) by every error that ReadXML,
// ReadXMLSolution and ReadXMLBest return for bad input.
var ErrXMLFormat = errors.New("not valid in the ITC-2019 course timetabling format")

// Error is one problem found in a benchmark file, at a 1-based line
// (0 when the problem concerns the whole file). Its text form is
// "file.ctt:12: what is wrong; what to do".
type Error struct {
	File string // file name as given to the reader
	Line int    // 1-based line number; 0 = the whole file
	Col  int    // 1-based column of the field concerned; 0 = the whole line
	Msg  string // what is wrong and what to do

	format error // the format's sentinel; nil = ErrCTTFormat
}

// Error gives the documented text form "file:LINE: message", or
// "file:LINE:COL: message" when the field's column is known.
func (e *Error) Error() string {
	switch {
	case e.Line <= 0:
		return e.File + ": " + e.Msg
	case e.Col > 0:
		return e.File + ":" + strconv.Itoa(e.Line) + ":" + strconv.Itoa(e.Col) + ": " + e.Msg
	}
	return e.File + ":" + strconv.Itoa(e.Line) + ": " + e.Msg
}

// Unwrap makes every Error match its format's sentinel, ErrCTTFormat or
// ErrXMLFormat.
func (e *Error) Unwrap() error {
	if e.format == nil {
		return ErrCTTFormat
	}
	return e.format
}

// Errors is every problem found in one read, sorted by line. A reader
// returns it as its error when it is not empty (never an empty list).
type Errors []*Error

// maxErrors bounds how many problems one error message lists; a file
// that is not in the format at all would otherwise give one per line.
const maxErrors = 50

// Error lists the problems one per line, at most maxErrors of them.
func (l Errors) Error() string {
	var b strings.Builder
	for i, e := range l {
		if i == maxErrors {
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
func (l Errors) Unwrap() []error {
	out := make([]error, len(l))
	for i, e := range l {
		out[i] = e
	}
	return out
}

// errList collects the problems of one read.
type errList struct {
	file   string
	format error // nil = ErrCTTFormat
	list   Errors
}

func (c *errList) add(line int, msg string) { c.addAt(line, 0, msg) }

// addAt records a problem at a line and column (0 = the whole line).
func (c *errList) addAt(line, col int, msg string) {
	c.list = append(c.list, &Error{File: c.file, Line: line, Col: col, Msg: msg, format: c.format})
}

// err returns the sorted list, or nil when nothing was wrong.
func (c *errList) err() error {
	if len(c.list) == 0 {
		return nil
	}
	sort.SliceStable(c.list, func(i, j int) bool { return c.list[i].Line < c.list[j].Line })
	return c.list
}
