package timetable

import (
	"fmt"
	"os"
	"regexp"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// TestCriteriaDocumented keeps docs/criteria.md in step with Criteria:
// one entry per criterion, under the name the Weights sheet takes, in
// table order, stating the default weight and level of the table and
// giving a unit and a worked example; and docs/workbook.md links to it.
func TestCriteriaDocumented(t *testing.T) {
	raw, err := os.ReadFile("../docs/criteria.md")
	require.NoError(t, err)
	doc := string(raw)
	heading := regexp.MustCompile("(?m)^### `([^`]+)`\n")
	idx := heading.FindAllStringSubmatchIndex(doc, -1)
	var names []string
	entry := map[string]string{}
	for i, m := range idx {
		name := doc[m[2]:m[3]]
		end := len(doc)
		if i+1 < len(idx) {
			end = idx[i+1][0]
		}
		names = append(names, name)
		entry[name] = doc[m[1]:end]
	}
	var want []string
	for _, c := range Criteria {
		want = append(want, c.Name)
	}
	require.Equal(t, want, names, "docs/criteria.md has one entry per criterion, in the order of Criteria")
	for _, c := range Criteria {
		body := entry[c.Name]
		weight := fmt.Sprint(c.Weight)
		if c.Weight == 0 {
			weight += " (off)"
		}
		assert.True(t, strings.HasPrefix(body, fmt.Sprintf("Default: weight %s, level %d.\n", weight, c.Level)),
			"%s: the entry starts with its defaults (weight %d, level %d): %.60q", c.Name, c.Weight, c.Level, body)
		assert.Contains(t, body, "**Unit:**", c.Name)
		assert.Contains(t, body, "*Example.*", c.Name)
		assert.Equal(t, c.Name, normWords(c.Name), "%s is written as the Weights sheet reads it", c.Name)
	}
	wb, err := os.ReadFile("../docs/workbook.md")
	require.NoError(t, err)
	assert.Contains(t, string(wb), "](criteria.md)", "the workbook page links to the criteria page")
}
