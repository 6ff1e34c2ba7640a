package web

import (
	"strings"
	"testing"

	"github.com/chromedp/chromedp"
	"github.com/chromedp/chromedp/kb"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// TestBrowserPatternTerm opens the page on a term with a pattern section
// (newPatternDemo): its room's week shows the meeting on both days of its
// pattern by clock time (09:10–10:25 spans the 09:00 and 10:00 rows), the
// master list names both days, and choosing the evening pattern with the
// keyboard moves it into the evening rows; re-plan names the relation rows the
// engine cannot take yet.
func TestBrowserPatternTerm(t *testing.T) {
	exe := chromium(t)
	d, sec := newPatternDemo(t)
	room := d.term.Rooms[0].ID
	b := newBrowser(t, exe)
	ctx := b.ctx
	btn := `#grid button.mtg[data-section="` + sec + `"]`
	require.NoError(t, chromedp.Do(ctx,
		chromedp.Navigate(d.ts.URL+"/?find="+room),
		chromedp.WaitVisible(`#master tbody tr`),
		chromedp.Click(`#matches button[data-kind="room"][data-id="`+room+`"]`),
		chromedp.WaitVisible(`#grid`),
	))
	days := b.eval(`[...document.querySelectorAll('` + btn + `')].map((x) => document.querySelector("#grid thead tr").children[Number(x.closest("td").dataset.col) + 1].textContent).join(" ")`)
	assert.Equal(t, "Mon Wed", days, "one button per day of the pattern")
	cont := b.eval(`String(document.querySelectorAll("#grid td .cont").length)`)
	assert.NotEqual(t, "0", cont, "the 10:00 rows say it continues")
	assert.Contains(t, b.eval(`[...document.querySelectorAll("#master tbody tr")].find((r) => r.cells[0].textContent === "`+sec+`").textContent`), "Mon Wed")
	b.shot("p1-pattern-week")

	require.NoError(t, chromedp.Do(ctx, chromedp.Click(btn)))
	require.NoError(t, chromedp.Do(ctx, chromedp.WaitVisible(`#pattern-choice`)))
	assert.Contains(t, b.text(`#picked-text`), "meets by a pattern")
	require.NoError(t, chromedp.Do(ctx, chromedp.Focus(`#pattern-choice`), chromedp.KeyEvent(kb.ArrowDown), chromedp.Focus(`#pattern-move`), chromedp.KeyEvent(kb.Enter)))
	_, err := chromedp.Run(ctx, chromedp.Poll[bool](`document.getElementById("verdict").textContent.includes("Tue Thu 18:30")`))
	require.NoError(t, err)
	b.shot("p2-pattern-moved")
	verdict := b.text(`#verdict`)
	if strings.Contains(verdict, "not moved") {
		require.NoError(t, chromedp.Do(ctx, chromedp.Focus(`#force`), chromedp.KeyEvent(kb.Enter)))
	}
	_, err = chromedp.Run(ctx, chromedp.Poll[bool](`[...document.querySelectorAll('`+btn+`')].length === 2 && document.querySelector('`+btn+`').textContent.includes("18:30")`))
	require.NoError(t, err)
	rows := b.eval(`[...document.querySelectorAll('` + btn + `')].map((x) => x.closest("tr").firstChild.textContent).join(" ")`)
	assert.Equal(t, "18:00–19:00 18:00–19:00", rows, "the evening pattern is drawn in its own rows")

	require.NoError(t, chromedp.Do(ctx, chromedp.Focus(`#replan`), chromedp.KeyEvent(kb.Enter)))
	_, err = chromedp.Run(ctx, chromedp.Poll[bool](`!!document.getElementById("replan-keep") || document.getElementById("replan-out").textContent.includes("Problem")`))
	require.NoError(t, err)
	// This fixture mixes a pattern section into relations with grid
	// sections, which the encoder states (encode/times_rel_grid.go); what
	// it still refuses is named with its row (re-planning a pattern term:
	// TestReplanPatternLock).
	assert.Contains(t, b.text(`#replan-out`), "Sections row")
	assert.NotContains(t, b.text(`#replan-out`), "mixes sections with meeting times and sections on the period grid")
	b.shot("p3-pattern-replan")
}
