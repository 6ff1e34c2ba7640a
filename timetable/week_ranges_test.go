package timetable

import "testing"

// TestWeekSetRanges: consecutive weeks join into ranges, single weeks
// stand alone, and the ends of the 64-week set are reached.
func TestWeekSetRanges(t *testing.T) {
	tests := []struct {
		w    WeekSet
		want string
	}{
		{0, ""},
		{0b1, "1"},
		{0b1011111, "1-5, 7"},
		{0b101, "1, 3"},
		{1<<63 | 1<<62, "63-64"},
		{^WeekSet(0), "1-64"},
	}
	for _, tc := range tests {
		if got := tc.w.Ranges(); got != tc.want {
			t.Errorf("%b: Ranges() = %q, want %q", uint64(tc.w), got, tc.want)
		}
	}
}
