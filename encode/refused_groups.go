package encode

import (
	"strconv"
	"strings"
)

// refusedGroup is a set of rows that refuse the same columns.
type refusedGroup struct{ rows, bad []int }

// groupByRefused groups rows by the set of cols each refuses (refuses(r,
// c) for r in rows, c in cols): one group per distinct non-empty set, in
// the order first seen. A relation between two sections then needs one
// rule per group instead of one per pair of choices.
func groupByRefused(rows, cols []int, refuses func(r, c int) bool) []*refusedGroup {
	var groups []*refusedGroup
	byKey := map[string]*refusedGroup{}
	var key strings.Builder
	for _, r := range rows {
		var bad []int
		key.Reset()
		for _, c := range cols {
			if refuses(r, c) {
				bad = append(bad, c)
				key.WriteString(strconv.Itoa(c))
				key.WriteByte(',')
			}
		}
		if len(bad) == 0 {
			continue
		}
		g := byKey[key.String()]
		if g == nil {
			g = &refusedGroup{bad: bad}
			byKey[key.String()] = g
			groups = append(groups, g)
		}
		g.rows = append(g.rows, r)
	}
	return groups
}

// upTo lists 0, 1, …, n-1.
func upTo(n int) []int {
	out := make([]int, n)
	for i := range out {
		out[i] = i
	}
	return out
}
