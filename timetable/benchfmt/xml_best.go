package benchfmt

import (
	"fmt"
	"io"
	"strings"
)

// XMLBest is the published record of one ITC-2019 instance: the best known
// total, its parts (unweighted), and the best lower bound.
type XMLBest struct {
	Instance   string
	Best       int
	LowerBound int  // -1 when not given
	Optimal    bool // the best is proven optimal
	Parts      XMLParts
	Source     string
	Line       int
}

// Reference is the best solution's cost without the student part (its
// time, room and distribution parts times the weights), the reference for
// a cost taken without the student part too.
func (b XMLBest) Reference(w XMLWeights) int {
	p := b.Parts
	p.Student = 0
	return p.Weighted(w)
}

// xmlBestTable is the shape of ReadXMLBest's table.
var xmlBestTable = bestTable{
	need:    []string{"instance", "best", "time", "room", "distribution"},
	needs:   "instance, best, time, room and distribution",
	columns: "instance,best,time,room,distribution[,lower_bound,proven_optimal,student_conflicts,source]",
}

// ReadXMLBest reads a CSV table of best-known ITC-2019 results with a
// header naming at least instance, best, time, room and distribution (and
// optionally lower_bound, proven_optimal, student_conflicts and source;
// other columns are ignored), keyed by instance. Problems are reported as
// Errors "name:LINE: ..." matching ErrXMLFormat.
func ReadXMLBest(r io.Reader, name string) (map[string]XMLBest, error) {
	errs := &errList{file: name, format: ErrXMLFormat}
	return readBestTable(r, errs, xmlBestTable, func(line int, instance string, field func(string) string) (XMLBest, bool) {
		b := XMLBest{Instance: instance, LowerBound: -1, Source: field("source"), Line: line}
		ok := true
		num := func(key string, dst *int, required bool) {
			v := field(key)
			if v == "" && !required {
				return
			}
			n, good := cttInt(errs, line, 0, key+" of "+clip(instance), v, 0)
			ok = ok && good
			*dst = n
		}
		num("best", &b.Best, true)
		num("lower_bound", &b.LowerBound, false)
		num("time", &b.Parts.Time, true)
		num("room", &b.Parts.Room, true)
		num("distribution", &b.Parts.Distribution, true)
		num("student_conflicts", &b.Parts.Student, false)
		switch strings.ToLower(field("proven_optimal")) {
		case "yes", "true":
			b.Optimal = true
		case "", "no", "false":
		default:
			errs.add(line, fmt.Sprintf("proven_optimal of %s is %q; write yes or no", clip(instance), clip(field("proven_optimal"))))
			ok = false
		}
		return b, ok
	})
}
