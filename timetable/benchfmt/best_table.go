package benchfmt

import (
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"strings"
)

// bestTable says what one best-known CSV table must hold; ReadCTTBest and
// ReadXMLBest differ only in these columns and in how a row becomes a
// record.
type bestTable struct {
	need    []string // columns the header must name, "instance" first
	needs   string   // the same in words, for the empty-file message
	columns string   // every column it reads, as the user should write them
}

// readBestTable reads a CSV table of best-known results into errs: the
// header row (case- and space-insensitive names; other columns ignored),
// then one row per instance, keyed by instance. row turns the fields of one
// row of a named, not yet listed instance into its record; it reports its
// own problems into errs and returns false to leave the row out. A row left
// out does not count as listed for the duplicate check.
func readBestTable[T any](r io.Reader, errs *errList, t bestTable, row func(line int, instance string, field func(string) string) (T, bool)) (map[string]T, error) {
	cr := csv.NewReader(r)
	cr.FieldsPerRecord = -1
	header, err := cr.Read()
	if err != nil {
		if errors.Is(err, io.EOF) {
			errs.add(0, "the file is empty; it needs a header row with "+t.needs+" columns")
		} else {
			errs.add(1, "cannot read the header row: "+csvReason(err))
		}
		return nil, errs.err()
	}
	col := map[string]int{}
	for i, h := range header {
		col[strings.ToLower(strings.TrimSpace(h))] = i
	}
	for _, need := range t.need {
		if _, ok := col[need]; !ok {
			errs.add(1, fmt.Sprintf("the header has no %q column; name the columns %s", need, t.columns))
		}
	}
	if e := errs.err(); e != nil {
		return nil, e
	}
	out := map[string]T{}
	listed := map[string]int{} // instance -> line of the row kept for it
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
		field := func(name string) string {
			if i, ok := col[name]; ok && i < len(rec) {
				return strings.TrimSpace(rec[i])
			}
			return ""
		}
		line, _ := cr.FieldPos(0)
		instance := field("instance")
		if instance == "" {
			errs.add(line, "the instance name is blank; fill it in or delete the row")
			continue
		}
		if prev, dup := listed[instance]; dup {
			errs.add(line, fmt.Sprintf("instance %q is already listed on line %d; keep one row", clip(instance), prev))
			continue
		}
		if b, ok := row(line, instance, field); ok {
			out[instance] = b
			listed[instance] = line
		}
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
