package encode

import (
	"context"
	"fmt"

	"github.com/termwright/termwright/timetable"
)

// PlacesOf lists every start where a meeting of section id could go with
// every requirement of term t holding, in grid order, each proved by a
// timetable of the term (the same search as the places of a refused
// request, with no request). For a section with meeting patterns it lists
// every (pattern, room) a timetable passing timetable.Check gives it,
// cheapest first (Place.Cost). complete is false when a check ran out of
// budget or ctx ended first; the places found so far are still returned.
func PlacesOf(ctx context.Context, t *timetable.Term, id string, opt ExplainOptions) (places []Place, complete bool, err error) {
	x, err := NewExplainer(t, nil, opt)
	if err != nil {
		return nil, false, err
	}
	s, ok := x.work.SectionIndex()[id]
	if !ok {
		return nil, false, fmt.Errorf("there is no section %q in the term", id)
	}
	return x.placesOf(ctx, s, -1, x.allOn())
}
