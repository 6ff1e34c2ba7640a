package encode

import (
	"sort"

	"github.com/termwright/termwright/timetable"
)

// weekScopes splits a list of week sets into scopes for counting: for every
// teaching week, the indexes of the sets that contain it; weeks with the same
// members form one elementary class, and only classes whose member list is
// not contained in another class's are kept (a count over a subset is
// implied by the count over its superset). Two sets share a scope exactly
// when they overlap, so "at most one per scope" is "no two overlapping".
// Scopes are returned in a deterministic order, members ascending.
func weekScopes(sets []timetable.WeekSet) [][]int {
	if len(sets) == 0 {
		return nil
	}
	same := true
	for _, w := range sets[1:] {
		if w != sets[0] {
			same = false
			break
		}
	}
	if same {
		all := make([]int, len(sets))
		for i := range all {
			all[i] = i
		}
		return [][]int{all}
	}
	byKey := map[string][]int{}
	var keys []string
	for wk := 0; wk < 64; wk++ {
		bit := timetable.WeekSet(1) << wk
		var members []int
		key := make([]byte, 0, len(sets))
		for i, w := range sets {
			if w&bit != 0 {
				members = append(members, i)
				key = append(key, '1')
			} else {
				key = append(key, '0')
			}
		}
		if len(members) == 0 {
			continue
		}
		k := string(key)
		if _, ok := byKey[k]; !ok {
			keys = append(keys, k)
			byKey[k] = members
		}
	}
	// Drop classes contained in another.
	sort.SliceStable(keys, func(i, j int) bool { return len(byKey[keys[i]]) > len(byKey[keys[j]]) })
	var out [][]int
	var outKeys []string
	for _, k := range keys {
		dominated := false
		for _, o := range outKeys {
			if contains(o, k) {
				dominated = true
				break
			}
		}
		if !dominated {
			out = append(out, byKey[k])
			outKeys = append(outKeys, k)
		}
	}
	return out
}

// contains reports whether membership key a includes every member of b.
func contains(a, b string) bool {
	for i := 0; i < len(b); i++ {
		if b[i] == '1' && a[i] != '1' {
			return false
		}
	}
	return true
}
