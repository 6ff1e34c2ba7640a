package export

import "sort"

// cluster is a group of a subject's meetings on one day whose grid rows
// overlap (directly or through each other). In a valid timetable a cluster
// of more than one meeting holds sections that meet in disjoint weeks.
type cluster struct {
	col    int   // day column
	r0, r1 int   // first and last grid row covered by any member
	items  []int // meetings (indexes into view.meetings), by start row
}

// box places one meeting inside its cluster's area: a horizontal lane and a
// vertical stack slot, both as fractions of the cluster's area.
type box struct {
	item   int     // index into view.meetings
	r0, r1 int     // grid rows of the meeting itself
	x0, x1 float64 // horizontal fraction of the day column, 0..1
	y0, y1 float64 // vertical fraction of the rows r0..r1, 0..1
}

// clusters groups a subject's meetings (indexes into v.meetings) into
// clusters, in column then row order.
func (v *view) clusters(items []int) []cluster {
	sorted := append([]int(nil), items...)
	sort.SliceStable(sorted, func(i, j int) bool {
		a, b := &v.meetings[sorted[i]], &v.meetings[sorted[j]]
		ca, cb := v.dayCol[a.day], v.dayCol[b.day]
		if ca != cb {
			return ca < cb
		}
		return a.r0 < b.r0
	})
	var out []cluster
	for _, i := range sorted {
		m := &v.meetings[i]
		col, r0, r1 := v.dayCol[m.day], m.r0, m.r1
		if n := len(out); n > 0 && out[n-1].col == col && r0 <= out[n-1].r1 {
			c := &out[n-1]
			c.items = append(c.items, i)
			c.r1 = max(c.r1, r1)
			continue
		}
		out = append(out, cluster{col: col, r0: r0, r1: r1, items: []int{i}})
	}
	return out
}

// boxes lays out a cluster's members: members covering identical rows are
// stacked top to bottom in the shared area; otherwise each member keeps its
// own rows and members share the column in side-by-side lanes.
func (v *view) boxes(c cluster) []box {
	n := len(c.items)
	same := true
	for _, i := range c.items {
		m := &v.meetings[i]
		if m.r0 != c.r0 || m.r1 != c.r1 {
			same = false
			break
		}
	}
	out := make([]box, 0, n)
	if same {
		for k, i := range c.items {
			out = append(out, box{item: i, r0: c.r0, r1: c.r1, x0: 0, x1: 1,
				y0: float64(k) / float64(n), y1: float64(k+1) / float64(n)})
		}
		return out
	}
	var laneEnd []int // last row used in each lane
	lanes := make([]int, n)
	for k, i := range c.items {
		m := &v.meetings[i]
		r0 := m.r0
		lane := -1
		for l, end := range laneEnd {
			if end < r0 {
				lane = l
				break
			}
		}
		if lane < 0 {
			lane = len(laneEnd)
			laneEnd = append(laneEnd, 0)
		}
		laneEnd[lane] = m.r1
		lanes[k] = lane
	}
	w := 1 / float64(len(laneEnd))
	for k, i := range c.items {
		m := &v.meetings[i]
		out = append(out, box{item: i, r0: m.r0, r1: m.r1,
			x0: float64(lanes[k]) * w, x1: float64(lanes[k]+1) * w, y0: 0, y1: 1})
	}
	return out
}
