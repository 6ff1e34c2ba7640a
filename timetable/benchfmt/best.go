package benchfmt

import "io"

// CTTBest is the published record for one benchmark instance.
type CTTBest struct {
	Instance   string // instance name, the .ctt file name without extension
	Best       int    // best known cost
	LowerBound int    // best published lower bound; -1 when not given
	Source     string // where the numbers were published
	Line       int    // line of the CSV file it came from
}

// cttBestTable is the shape of ReadCTTBest's table.
var cttBestTable = bestTable{
	need:    []string{"instance", "best"},
	needs:   "instance and best",
	columns: "instance,best[,lower_bound,source]",
}

// ReadCTTBest reads a CSV table of best-known results with a header row
// naming at least the columns "instance" and "best" (and optionally
// "lower_bound" and "source"; other columns are ignored), keyed by
// instance. Problems are reported as Errors "name:LINE: ...".
func ReadCTTBest(r io.Reader, name string) (map[string]CTTBest, error) {
	errs := &errList{file: name}
	return readBestTable(r, errs, cttBestTable, func(line int, instance string, field func(string) string) (CTTBest, bool) {
		b := CTTBest{Instance: instance, LowerBound: -1, Source: field("source"), Line: line}
		best, ok := cttInt(errs, line, 0, "best of "+clip(instance), field("best"), 0)
		if lb := field("lower_bound"); lb != "" {
			v, good := cttInt(errs, line, 0, "lower_bound of "+clip(instance), lb, 0)
			ok = ok && good
			b.LowerBound = v
		}
		b.Best = best
		return b, ok
	})
}
