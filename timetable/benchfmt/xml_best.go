package benchfmt

import (
	"encoding/csv"
	"errors"
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
// time, room and distribution parts times the weights), the reference for a
// timetable whose students are not sectioned.
func (b XMLBest) Reference(w XMLWeights) int {
	p := b.Parts
	p.Student = 0
	return p.Weighted(w)
}

// ReadXMLBest reads a CSV table of best-known ITC-2019 results with a
// header naming at least instance, best, time, room and distribution (and
// optionally lower_bound, proven_optimal, student_conflicts and source;
// other columns are ignored), keyed by instance. Problems are reported as
// Errors "name:LINE: ..." matching ErrXMLFormat.
func ReadXMLBest(r io.Reader, name string) (map[string]XMLBest, error) {
	errs := &errList{file: name, format: ErrXMLFormat}
	cr := csv.NewReader(r)
	cr.FieldsPerRecord = -1
	header, err := cr.Read()
	if err != nil {
		if errors.Is(err, io.EOF) {
			errs.add(0, "the file is empty; it needs a header row with instance, best, time, room and distribution columns")
		} else {
			errs.add(1, "cannot read the header row: "+csvReason(err))
		}
		return nil, errs.err()
	}
	col := map[string]int{}
	for i, h := range header {
		col[strings.ToLower(strings.TrimSpace(h))] = i
	}
	for _, need := range []string{"instance", "best", "time", "room", "distribution"} {
		if _, ok := col[need]; !ok {
			errs.add(1, fmt.Sprintf("the header has no %q column; name the columns instance,best,time,room,distribution[,lower_bound,proven_optimal,student_conflicts,source]", need))
		}
	}
	if e := errs.err(); e != nil {
		return nil, e
	}
	field := func(rec []string, name string) string {
		if i, ok := col[name]; ok && i < len(rec) {
			return strings.TrimSpace(rec[i])
		}
		return ""
	}
	out := map[string]XMLBest{}
	for {
		rec, err := cr.Read()
		if errors.Is(err, io.EOF) {
			break
		}
		if err != nil {
			var pe *csv.ParseError
			if !errors.As(err, &pe) || len(errs.list) >= maxErrors {
				errs.add(0, "cannot read the file: "+err.Error())
				break
			}
			errs.add(pe.StartLine, "cannot read the row: "+csvReason(err)+"; check the quotes")
			continue
		}
		line, _ := cr.FieldPos(0)
		b := XMLBest{Instance: field(rec, "instance"), LowerBound: -1, Source: field(rec, "source"), Line: line}
		if b.Instance == "" {
			errs.add(line, "the instance name is blank; fill it in or delete the row")
			continue
		}
		if prev, dup := out[b.Instance]; dup {
			errs.add(line, fmt.Sprintf("instance %q is already listed on line %d; keep one row", clip(b.Instance), prev.Line))
			continue
		}
		ok := true
		num := func(key string, dst *int, required bool) {
			v := field(rec, key)
			if v == "" && !required {
				return
			}
			n, good := cttInt(errs, line, 0, key+" of "+clip(b.Instance), v, 0)
			ok = ok && good
			*dst = n
		}
		num("best", &b.Best, true)
		num("lower_bound", &b.LowerBound, false)
		num("time", &b.Parts.Time, true)
		num("room", &b.Parts.Room, true)
		num("distribution", &b.Parts.Distribution, true)
		num("student_conflicts", &b.Parts.Student, false)
		switch strings.ToLower(field(rec, "proven_optimal")) {
		case "yes", "true":
			b.Optimal = true
		case "", "no", "false":
		default:
			errs.add(line, fmt.Sprintf("proven_optimal of %s is %q; write yes or no", clip(b.Instance), clip(field(rec, "proven_optimal"))))
			ok = false
		}
		if ok {
			out[b.Instance] = b
		}
	}
	if e := errs.err(); e != nil {
		return nil, e
	}
	return out, nil
}
