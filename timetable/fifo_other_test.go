//go:build !unix

package timetable

import "errors"

func mkfifo(string) error { return errors.New("no FIFOs on this system") }
