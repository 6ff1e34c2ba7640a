package export

import (
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// TestHolidayRanges: days without teaching are grouped into runs across
// days that have no teaching anyway (weekends), and written as people
// write date ranges ("13–17 Mar", with an en dash: common practice).
func TestHolidayRanges(t *testing.T) {
	cases := []struct {
		name     string
		first    time.Time
		last     time.Time
		holidays []time.Time
		want     []string
		weeks    int // weeks with at least one teaching day
	}{
		{"none", date(2027, 9, 13), date(2027, 12, 10), nil, nil, 13},
		{"one day", date(2027, 9, 13), date(2027, 12, 10), []time.Time{date(2027, 10, 25)}, []string{"25 Oct"}, 13},
		{"break week", date(2028, 1, 10), date(2028, 4, 28),
			[]time.Time{date(2028, 3, 13), date(2028, 3, 14), date(2028, 3, 15), date(2028, 3, 16), date(2028, 3, 17)}, []string{"13–17 Mar"}, 15},
		{"over a weekend, unsorted, twice", date(2027, 9, 13), date(2027, 12, 10),
			[]time.Time{date(2027, 11, 1), date(2027, 10, 29), date(2027, 10, 29), date(2027, 12, 8)}, []string{"29 Oct – 1 Nov", "8 Dec"}, 13},
		{"not joined over a teaching day", date(2027, 9, 13), date(2027, 12, 10),
			[]time.Time{date(2027, 10, 25), date(2027, 10, 27)}, []string{"25 Oct", "27 Oct"}, 13},
		{"across the new year", date(2027, 11, 1), date(2028, 2, 25),
			[]time.Time{date(2027, 12, 27), date(2027, 12, 28), date(2027, 12, 29), date(2027, 12, 30), date(2027, 12, 31), date(2028, 1, 3), date(2028, 1, 4), date(2028, 1, 5), date(2028, 1, 6), date(2028, 1, 7), date(2028, 2, 1)},
			[]string{"27 Dec 2027 – 7 Jan 2028", "1 Feb 2028"}, 15},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			term, s := demoTerm()
			term.FirstDay, term.LastDay, term.Holidays = c.first, c.last, c.holidays
			v, err := newView(term, s)
			require.NoError(t, err)
			assert.Equal(t, c.want, v.holidayTexts())
			assert.Equal(t, c.weeks, v.weeksWithTeaching())
		})
	}
}
