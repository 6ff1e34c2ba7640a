package timetable

// TravelIndex answers Term.TravelMinutes in O(1) per pair: the largest
// Travel row for each unordered pair of places, looked up for the two rooms
// and their buildings (the four pairings TravelMinutes's scan matches).
// Build it once per term with NewTravelIndex; Check and the encoder share
// this one definition.
type TravelIndex struct {
	building map[string]string // room ID -> its building ("" when none)
	minutes  map[[2]string]int
	most     int
}

// NewTravelIndex indexes the travel rows of t.
func NewTravelIndex(t *Term) *TravelIndex {
	ti := &TravelIndex{building: make(map[string]string, len(t.Rooms)), minutes: make(map[[2]string]int, len(t.Travel))}
	for i := range t.Rooms {
		if _, dup := ti.building[t.Rooms[i].ID]; !dup {
			ti.building[t.Rooms[i].ID] = t.Rooms[i].Building
		}
	}
	for _, tr := range t.Travel {
		k := placePair(tr.From, tr.To)
		ti.minutes[k] = max(ti.minutes[k], tr.Minutes)
		ti.most = max(ti.most, tr.Minutes)
	}
	return ti
}

// Most is the largest travel time of the term (0 without travel rows).
func (ti *TravelIndex) Most() int { return ti.most }

// Between is the travel time between rooms a and b, as Term.TravelMinutes.
func (ti *TravelIndex) Between(a, b string) int {
	if a == "" || b == "" || a == b || len(ti.minutes) == 0 {
		return 0
	}
	pa, pb := []string{a}, []string{b}
	if bd := ti.building[a]; bd != "" {
		pa = append(pa, bd)
	}
	if bd := ti.building[b]; bd != "" {
		pb = append(pb, bd)
	}
	best := 0
	for _, u := range pa {
		for _, v := range pb {
			best = max(best, ti.minutes[placePair(u, v)])
		}
	}
	return best
}

func placePair(a, b string) [2]string {
	if b < a {
		a, b = b, a
	}
	return [2]string{a, b}
}
