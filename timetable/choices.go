package timetable

import (
	"strings"
	"time"
)

// A choice is one value of a column with a fixed list of values: its
// spellings, the canonical one first. The reader accepts exactly these
// spellings, in any case and with surrounding spaces; the template's
// drop-down list offers exactly these spellings. Both are derived from the
// tables below, so that they agree (template_test.go checks it).
type choice []string

// dayChoices are the days, in time.Weekday order (Sunday first).
var dayChoices = func() []choice {
	out := make([]choice, 7)
	for d := time.Sunday; d <= time.Saturday; d++ {
		out[d] = choice{dayNames[d], d.String()}
	}
	return out
}()

// relationChoices are the relation kinds, parallel to RelationKinds.
var relationChoices = func() []choice {
	out := make([]choice, len(RelationKinds))
	for i, k := range RelationKinds {
		out[i] = withHyphens(k.Name)
	}
	return out
}()

// criterionChoices are the soft criteria, parallel to Criteria.
var criterionChoices = func() []choice {
	out := make([]choice, len(Criteria))
	for i, c := range Criteria {
		out[i] = withHyphens(c.Name)
	}
	return out
}()

// withHyphens gives a name of several words and, for the names people
// write hyphenated ("back-to-back"), the hyphenated spelling.
func withHyphens(name string) choice {
	if name == "back to back" {
		return choice{name, strings.ReplaceAll(name, " ", "-")}
	}
	return choice{name}
}

// pickChoice returns the index of the choice that text spells, or -1.
func pickChoice(choices []choice, text string) int {
	text = strings.ToLower(strings.TrimSpace(text))
	for i, c := range choices {
		for _, sp := range c {
			if text == strings.ToLower(sp) { // not EqualFold: "ſun" is no day
				return i
			}
		}
	}
	return -1
}

// spellings lists every spelling of every choice, in order (the template's
// drop-down list).
func spellings(choices []choice) []string {
	var out []string
	for _, c := range choices {
		out = append(out, c...)
	}
	return out
}

// mondayFirst orders day choices Monday first, as the template lists them.
func mondayFirst(days []choice) []choice {
	return append(append([]choice{}, days[1:]...), days[0])
}
