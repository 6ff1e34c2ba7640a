// Package sectioning places students who asked for courses
// (timetable.Term.Requests) into sections of a finished timetable: one
// section of every part of one arrangement of each course (the seating
// rule of timetable.Course), within section limits, with as few clashes
// as it can find, and — given an earlier timetable — moving as few
// students as it can. It knows the domain only (package timetable); the
// timetable itself comes from the engine.
package sectioning
