package improve

import "github.com/termwright/termwright/timetable"

// relBroken evaluates relation ri on the current meetings, following the
// definitions in timetable/term.go (week sets ignored).
func (x *State) relBroken(ri int32) bool {
	secs := x.relSecs[ri]
	switch x.rels[ri].Kind {
	case timetable.SameTime:
		for _, si := range secs[min(1, len(secs)):] {
			if !x.sameStarts(secs[0], si, false) {
				return true
			}
		}
	case timetable.SameDayRel:
		for _, si := range secs[min(1, len(secs)):] {
			if !x.sameStarts(secs[0], si, true) {
				return true
			}
		}
	case timetable.NotSameTime:
		for a := range secs {
			for b := a + 1; b < len(secs); b++ {
				if x.sharePeriod(secs[a], secs[b]) {
					return true
				}
			}
		}
	case timetable.DifferentDays:
		for a := range secs {
			for b := a + 1; b < len(secs); b++ {
				if x.shareDay(secs[a], secs[b]) {
					return true
				}
			}
		}
	case timetable.Before:
		for k := 0; k+1 < len(secs); k++ {
			la, fb := int32(-1), int32(-1)
			for _, m := range x.bySec[secs[k]] {
				la = max(la, x.mt[m].p+int32(x.secs[secs[k]].length)-1)
			}
			for _, m := range x.bySec[secs[k+1]] {
				if fb < 0 || x.mt[m].p < fb {
					fb = x.mt[m].p
				}
			}
			if la >= 0 && fb >= 0 && la >= fb {
				return true
			}
		}
	case timetable.BackToBack:
		for k := 0; k+1 < len(secs); k++ {
			a := secs[k]
			la := int32(x.secs[a].length)
			for _, j := range x.bySec[secs[k+1]] {
				start := x.mt[j].p
				ok := false
				for _, i := range x.bySec[a] {
					if x.mt[i].p+la == start && x.prevCons[start] {
						ok = true
						break
					}
				}
				if !ok {
					return true
				}
			}
		}
	case timetable.SameRoom:
		room := int32(-1)
		for _, si := range secs {
			for _, m := range x.bySec[si] {
				if r := x.mt[m].r; r >= 0 {
					if room >= 0 && r != room {
						return true
					}
					room = r
				}
			}
		}
	}
	return false
}

// sameStarts reports whether sections a and b have the same set of start
// periods (or, with days, of days).
func (x *State) sameStarts(a, b int32, days bool) bool {
	key := func(m int32) int32 {
		if days {
			return x.dayFirst[x.mt[m].p]
		}
		return x.mt[m].p
	}
	in := func(v int32, si int32) bool {
		for _, m := range x.bySec[si] {
			if key(m) == v {
				return true
			}
		}
		return false
	}
	for _, m := range x.bySec[a] {
		if !in(key(m), b) {
			return false
		}
	}
	for _, m := range x.bySec[b] {
		if !in(key(m), a) {
			return false
		}
	}
	return true
}

// sharePeriod reports whether sections a and b occupy a common period.
func (x *State) sharePeriod(a, b int32) bool {
	np := int32(x.np)
	for _, m := range x.bySec[b] {
		for q := x.mt[m].p; q < x.mt[m].p+int32(x.secs[b].length); q++ {
			if x.secOcc[a*np+q] > 0 {
				return true
			}
		}
	}
	return false
}

// shareDay reports whether sections a and b meet on a common day.
func (x *State) shareDay(a, b int32) bool {
	for _, m := range x.bySec[a] {
		for _, o := range x.bySec[b] {
			if x.dayFirst[x.mt[m].p] == x.dayFirst[x.mt[o].p] {
				return true
			}
		}
	}
	return false
}
