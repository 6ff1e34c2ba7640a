package samples

import (
	"fmt"
	"math"
	"slices"
	"strings"
)

// Room size classes: the capacity ceilings of teaching rooms and of
// laboratories (common practice for a mixed estate: seminar rooms,
// classrooms, tiered halls; laboratories of 24 to 48 places).
var (
	roomClasses = []int{20, 30, 40, 60, 90, 130, 200, 300}
	labClasses  = []int{24, 32, 40, 48}
)

// roomKey groups sections that need the same kind of room.
type roomKey struct {
	lab   bool
	class int // index into the class list; len(list) for larger than all
}

// buildRooms makes buildings and rooms sized to the sections: per kind of
// room, enough rooms that the sections needing that kind keep them busy for
// about roomUtilisation of the week; then features are adjusted so that
// every section's needs are met by some room large enough.
func (g *gen) buildRooms() {
	demand := map[roomKey]float64{}
	biggest := map[roomKey]int{}
	var keys []roomKey
	for _, s := range g.secs {
		if s.noRoom {
			continue
		}
		k := g.roomKeyOf(s.size, slices.Contains(s.needs, "lab"))
		if _, seen := demand[k]; !seen {
			keys = append(keys, k)
		}
		demand[k] += float64(s.load()) * float64(weekCount(s.weeks)) / float64(weekCount(g.all))
		biggest[k] = max(biggest[k], s.size)
	}
	slices.SortFunc(keys, func(a, b roomKey) int {
		if a.lab != b.lab {
			return g.boolInt(a.lab) - g.boolInt(b.lab)
		}
		return a.class - b.class
	})
	per := float64(len(g.periods)) * roomUtilisation(g.cfg.Sections)
	total := 0
	counts := make([]int, len(keys))
	for i, k := range keys {
		counts[i] = max(1, int(math.Ceil(demand[k]/per)))
		total += counts[i]
	}
	g.buildBuildings(total)
	for i, k := range keys {
		for range counts[i] {
			g.newRoom(k, biggest[k], g.rng.IntN(len(g.buildings)))
		}
	}
	g.coverNeeds()
	slices.SortFunc(g.rooms, func(a, b room) int { return strings.Compare(a.id, b.id) })
	g.bySize = nil
}

// roomKeyOf is the kind of room a section of size needs.
func (g *gen) roomKeyOf(size int, lab bool) roomKey {
	list := roomClasses
	if lab {
		list = labClasses
	}
	c := 0
	for c < len(list) && list[c] < size {
		c++
	}
	return roomKey{lab: lab, class: c}
}

// buildBuildings makes about one building per ten rooms and gives each
// department a home building.
func (g *gen) buildBuildings(rooms int) {
	n := max(1, int(math.Round(float64(rooms)/10)))
	for i := range n {
		name := buildingNames[i%len(buildingNames)]
		code := strings.ToUpper(name[:3])
		if round := i / len(buildingNames); round > 0 {
			name = fmt.Sprintf("%s %d", name, round+1)
			code = fmt.Sprintf("%s%d", code, round+1)
		}
		g.buildings = append(g.buildings, building{name: name, code: code})
	}
	for d := range g.depts {
		g.depts[d].building = d % n
	}
}

// newRoom adds a room of kind k in building b that seats at least need.
func (g *gen) newRoom(k roomKey, need, b int) int {
	list := roomClasses
	if k.lab {
		list = labClasses
	}
	lo, hi := 10, 0
	if k.class < len(list) {
		hi = list[k.class]
		if k.class > 0 {
			lo = list[k.class-1] + 1
		}
	} else {
		hi = (need + 9) / 10 * 10
	}
	lo = max(lo, need, 1)
	hi = max(hi, lo)
	capacity := g.between(lo, hi)
	big := !k.lab && capacity > 60
	floor := g.between(0, 4)
	if big && g.chance(0.9) {
		floor = 0
	}
	var features []string
	if k.lab {
		features = append(features, "lab")
	}
	if big || k.lab && g.chance(0.5) || !k.lab && g.chance(0.85) {
		features = append(features, "projector")
	}
	if floor == 0 || g.chance(0.6) {
		features = append(features, "step-free")
	}
	r := room{building: b, floor: floor, capacity: capacity, features: sortedStrings(features)}
	r.id = g.roomID(b, floor)
	g.rooms = append(g.rooms, r)
	return len(g.rooms) - 1
}

// roomID numbers rooms per building and floor: "ALD.104" is the fourth room
// on floor 1 of Alder Court.
func (g *gen) roomID(b, floor int) string {
	prefix := fmt.Sprintf("%s.%d", g.buildings[b].code, floor)
	n := 1
	for _, r := range g.rooms {
		if r.building == b && r.floor == floor {
			n++
		}
	}
	return fmt.Sprintf("%s%02d", prefix, n)
}

// coverNeeds makes sure every section has at least one room that seats it
// and has its features, adding the missing features to the smallest room of
// the right kind that is large enough.
func (g *gen) coverNeeds() {
	for _, s := range g.secs {
		if s.noRoom || len(g.fittingRooms(&s)) > 0 {
			continue
		}
		lab := slices.Contains(s.needs, "lab")
		best := -1
		for i, r := range g.rooms {
			if r.capacity >= s.size && slices.Contains(r.features, "lab") == lab &&
				(best < 0 || r.capacity < g.rooms[best].capacity) {
				best = i
			}
		}
		if best < 0 {
			best = g.newRoom(g.roomKeyOf(s.size, lab), s.size, g.depts[s.dept].building)
		}
		g.rooms[best].features = sortedStrings(append(g.rooms[best].features, s.needs...))
	}
}

// fittingRooms lists the rooms that seat s, have its features and are
// allowed for it, smallest first (ties in room order); laboratories come
// last for sections that do not need one.
func (g *gen) fittingRooms(s *sec) []int {
	if len(g.bySize) != len(g.rooms) {
		g.bySize = g.bySize[:0]
		for i := range g.rooms {
			g.bySize = append(g.bySize, i)
		}
		slices.SortStableFunc(g.bySize, func(a, b int) int { return g.rooms[a].capacity - g.rooms[b].capacity })
	}
	var out, labs []int
	needsLab := slices.Contains(s.needs, "lab")
	for _, i := range g.bySize {
		r := &g.rooms[i]
		if r.capacity < s.size || !hasAll(r.features, s.needs) {
			continue
		}
		if s.allowed != nil && !containsInt(s.allowed, i) {
			continue
		}
		if !needsLab && slices.Contains(r.features, "lab") {
			labs = append(labs, i)
		} else {
			out = append(out, i)
		}
	}
	return append(out, labs...)
}

// addRoomFor adds a room that fits s in its department's building.
func (g *gen) addRoomFor(s *sec) int {
	lab := slices.Contains(s.needs, "lab")
	r := g.newRoom(g.roomKeyOf(s.size, lab), s.size, g.depts[s.dept].building)
	g.rooms[r].features = sortedStrings(append(g.rooms[r].features, s.needs...))
	g.occRoom = append(g.occRoom, make([]weekSet, len(g.periods)))
	g.stats.addedRooms++
	return r
}

// hasAll reports whether have contains every element of want.
func hasAll(have, want []string) bool {
	for _, w := range want {
		if !slices.Contains(have, w) {
			return false
		}
	}
	return true
}
