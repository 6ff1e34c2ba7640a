package timetable

import (
	"strconv"
	"time"
)

var dayNames = [7]string{"Sun", "Mon", "Tue", "Wed", "Thu", "Fri", "Sat"}

// DayName gives the three-letter English name of a weekday ("Mon").
func DayName(d time.Weekday) string { return dayNames[d%7] }

// ParseDay reads a day name: three-letter or full English names ("Mon",
// "Monday"), any case, with surrounding spaces ignored.
func ParseDay(s string) (time.Weekday, bool) {
	if i := pickChoice(dayChoices, s); i >= 0 {
		return time.Weekday(i), true
	}
	return 0, false
}

// WeekOrder is the position of a day in a Monday-first week (Mon=0 .. Sun=6).
func WeekOrder(d time.Weekday) int { return (int(d) + 6) % 7 }

func itoa(n int) string { return strconv.Itoa(n) }
