package encode

import "github.com/termwright/termwright/timetable"

type Move struct{}

func Moves(t *timetable.Term, kept, s *timetable.Schedule) []Move { return nil }
