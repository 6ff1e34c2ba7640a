package encode

import (
	"github.com/termwright/termwright/solver"
)

// Stats describes the size of a compiled program.
type Stats struct {
	Sections       int            `json:"sections"`
	Atoms          int            `json:"atoms"`
	StartAtoms     int            `json:"start_atoms"`
	TimeAtoms      int            `json:"time_atoms,omitempty"`       // time(S,I) of pattern sections
	RoomAtoms      int            `json:"room_atoms,omitempty"`       // in(S,R) of pattern sections
	PatternSecs    int            `json:"pattern_sections,omitempty"` // sections with meeting times
	LazyRooms      int            `json:"lazy_rooms,omitempty"`       // rooms whose one-at-a-time Decode checks (pattern_lazy.go)
	SelectorAtoms  int            `json:"selector_atoms"`
	AuxAtoms       int            `json:"aux_atoms"` // busy, meets and started_by atoms
	Rules          int            `json:"rules"`     // normal rules, facts and integrity constraints
	Choices        int            `json:"choices"`
	Bounds         int            `json:"bounds"`
	BoundLits      int            `json:"bound_literals"`
	Groups         int            `json:"groups"`
	RoomFamilies   int            `json:"room_families"`
	LazyFamilies   int            `json:"lazy_room_families"` // room families added by Solve after a Hall violation
	BoundsByKind   map[string]int `json:"bounds_by_kind"`
	AtomsPerSec    float64        `json:"atoms_per_section"`
	RulesPerSec    float64        `json:"rules_per_section"`
	BoundsPerSec   float64        `json:"bounds_per_section"`
	BoundLitsPerSc float64        `json:"bound_literals_per_section"`
}

// Stats counts the atoms, rules and bounds of program p, compiled with this
// catalog (and possibly extended by Solve).
func (c *Catalog) Stats(p *solver.Program) Stats {
	st := Stats{
		Sections:     len(c.secs),
		Atoms:        p.NumAtoms(),
		Rules:        len(p.Rules),
		Choices:      len(p.Choices),
		Bounds:       len(p.Bounds),
		Groups:       len(c.Groups),
		RoomFamilies: len(c.rooms.families),
		BoundsByKind: map[string]int{},
	}
	for _, a := range c.atoms[1:] {
		switch a.Kind {
		case AtomStart:
			st.StartAtoms++
		case AtomTime:
			st.TimeAtoms++
		case AtomRoom:
			st.RoomAtoms++
		case AtomSelector:
			st.SelectorAtoms++
		case AtomBusy, AtomMeetsDay, AtomStartedBy, AtomAux:
			st.AuxAtoms++
		}
	}
	st.LazyRooms = c.LazyRooms()
	for i := range c.pats {
		if c.pats[i].on {
			st.PatternSecs++
		}
	}
	for i, b := range p.Bounds {
		st.BoundLits += len(b.Lits)
		kind := "other"
		if i < len(c.boundKind) {
			kind = c.boundKind[i]
		}
		st.BoundsByKind[kind]++
	}
	for _, f := range c.rooms.families {
		if f.lazy {
			st.LazyFamilies++
		}
	}
	if n := float64(st.Sections); n > 0 {
		st.AtomsPerSec = float64(st.Atoms) / n
		st.RulesPerSec = float64(st.Rules+st.Choices) / n
		st.BoundsPerSec = float64(st.Bounds) / n
		st.BoundLitsPerSc = float64(st.BoundLits) / n
	}
	return st
}
