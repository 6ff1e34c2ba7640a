package benchfmt

import (
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"strings"
)

// CTTBest is the published record for one benchmark instance.
type CTTBest struct {
	Instance   string // instance name, the .ctt file name without extension
	Best       int    // best known cost
	LowerBound int    // best published lower bound; -1 when not given
	Source     string // where the numbers were published
	Line       int    // line of the CSV file it came from
}

// ReadCTTBest reads a CSV table of best-known results with a header row
// naming at least the columns "instance" and "best" (and optionally
// "lower_bound" and "source"; other columns are ignored), keyed by
// instance. Problems are reported as Errors "name:LINE: ...".
func ReadCTTBest(r io.Reader, name string) (map[string]CTTBest, error) {
	errs := &errList{file: name}
	cr := csv.NewReader(r)
	cr.FieldsPerRecord = -1
	header, err := cr.Read()
	if err != nil {
		if errors.Is(err, io.EOF) {
			errs.add(0, "the file is empty; it needs a header row with instance and best columns")
		} else {
			errs.add(1, "cannot read the header row: "+csvReason(err))
		}
		return nil, errs.err()
	}
	col := map[string]int{}
	for i, h := range header {
		col[strings.ToLower(strings.TrimSpace(h))] = i
	}
	for _, need := range []string{"instance", "best"} {
		if _, ok := col[need]; !ok {
			errs.add(1, fmt.Sprintf("the header has no %q column; name the columns instance,best[,lower_bound,source]", need))
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
	out := map[string]CTTBest{}
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
		b := CTTBest{Instance: field(rec, "instance"), LowerBound: -1, Source: field(rec, "source"), Line: line}
		if b.Instance == "" {
			errs.add(line, "the instance name is blank; fill it in or delete the row")
			continue
		}
		if prev, dup := out[b.Instance]; dup {
			errs.add(line, fmt.Sprintf("instance %q is already listed on line %d; keep one row", clip(b.Instance), prev.Line))
			continue
		}
		best, ok := cttInt(errs, line, 0, "best of "+clip(b.Instance), field(rec, "best"), 0)
		if lb := field(rec, "lower_bound"); lb != "" {
			v, good := cttInt(errs, line, 0, "lower_bound of "+clip(b.Instance), lb, 0)
			ok = ok && good
			b.LowerBound = v
		}
		if !ok {
			continue
		}
		b.Best = best
		out[b.Instance] = b
	}
	if e := errs.err(); e != nil {
		return nil, e
	}
	return out, nil
}

// csvReason gives the reason of a CSV error without its position, which
// the caller reports in its own form.
func csvReason(err error) string {
	var pe *csv.ParseError
	if errors.As(err, &pe) {
		return pe.Err.Error()
	}
	return err.Error()
}
