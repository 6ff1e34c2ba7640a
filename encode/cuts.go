package encode

import "github.com/termwright/termwright/solver"

// Cuts: what Decode learns about rooms, written into the program it
// decoded a model of. A Search passes them on to its live engine.

// addHallFamilies adds the room sets of a Hall violation to program p as
// room families (Hall bounds over every period and week scope, each family
// its own requirement group) and returns how many were new.
func (c *Catalog) addHallFamilies(p *solver.Program, herr *HallError) int {
	b := c.extender(p)
	n := 0
	for _, set := range herr.sets {
		if _, added := b.addFamily(set, true); added {
			n++
		}
	}
	return n
}

// forbidRooms adds to program p one integrity constraint per start
// combination of a room conflict, in the given group (-1 for none) and
// bound kind, holding while every literal of guard holds.
func (c *Catalog) forbidRooms(p *solver.Program, rerr *RoomConflictError, group int, kind string, guard []solver.Lit) {
	b := c.extender(p)
	b.in(group, kind)
	for _, ng := range rerr.nogoods {
		body := make([]solver.Lit, 0, len(ng)+len(guard))
		for _, l := range ng {
			body = append(body, l.Not())
		}
		b.rule(0, append(body, guard...)...)
	}
}
