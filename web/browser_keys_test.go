package web

import (
	"strconv"
	"strings"
	"testing"

	"github.com/chromedp/chromedp"
	"github.com/chromedp/chromedp/kb"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/timetable"
)

// TestBrowserKeyboard works the page with the keyboard only (focus moves
// by Tab and the arrow keys, actions by Enter and letter keys; no mouse
// click): finds a staff member, walks the grid to a meeting and hears its
// label, locks it (L), asks where else another meeting could go (W),
// re-plans the rest and keeps the result, moves a meeting with Enter,
// and makes the change notices.
func TestBrowserKeyboard(t *testing.T) {
	exe := chromium(t)
	d := newDemo(t)
	m, legal, _, staff := d.legalAndIllegal(t)
	b := newBrowser(t, exe)
	ctx := b.ctx
	name := d.staffName(staff)
	keys := func(k ...string) {
		t.Helper()
		for _, x := range k {
			require.NoError(t, chromedp.Do(ctx, chromedp.KeyEvent(x)))
		}
	}
	active := func() string {
		return b.eval(`(document.activeElement.getAttribute("aria-label") || document.activeElement.id || document.activeElement.textContent).trim()`)
	}
	waitFor := func(js string) {
		t.Helper()
		_, err := chromedp.Run(ctx, chromedp.Poll[bool](js))
		require.NoError(t, err, js)
	}
	// cellOf is the grid row and column of a meeting's first cell.
	cellOf := func(p timetable.Placement) (int, int) {
		s := b.eval(`(() => { const b = document.querySelector('button.mtg[data-section="` + p.Section + `"][data-meeting="` + strconv.Itoa(p.Meeting) + `"]'); const td = b.closest("td"); return td.dataset.row + "," + td.dataset.col; })()`)
		r, c, _ := strings.Cut(s, ",")
		ri, _ := strconv.Atoi(r)
		ci, _ := strconv.Atoi(c)
		return ri, ci
	}
	// walk moves the focus from the cell it is on to (r, c) with arrows.
	walk := func(r, c int) {
		t.Helper()
		at := b.eval(`document.activeElement.dataset.row + "," + document.activeElement.dataset.col`)
		fr, fc, _ := strings.Cut(at, ",")
		r0, _ := strconv.Atoi(fr)
		c0, _ := strconv.Atoi(fc)
		for ; r0 < r; r0++ {
			keys(kb.ArrowDown)
		}
		for ; r0 > r; r0-- {
			keys(kb.ArrowUp)
		}
		for ; c0 < c; c0++ {
			keys(kb.ArrowRight)
		}
		for ; c0 > c; c0-- {
			keys(kb.ArrowLeft)
		}
		require.Equal(t, strconv.Itoa(r)+","+strconv.Itoa(c), b.eval(`document.activeElement.dataset.row + "," + document.activeElement.dataset.col`))
	}
	label := func(p timetable.Placement) string {
		return p.Section + " meeting " + strconv.Itoa(p.Meeting)
	}

	// Find the staff member: type, Tab to the first match, Enter.
	require.NoError(t, chromedp.Do(ctx,
		chromedp.Navigate(d.ts.URL+"/"),
		chromedp.WaitVisible(`#master tbody tr`),
		chromedp.Focus(`#find`),
	))
	keys(name, kb.Tab, kb.Enter)
	require.NoError(t, chromedp.Do(ctx, chromedp.WaitVisible(`#grid`)))
	assert.Equal(t, "grid-h", active(), "choosing a week moves the focus to its heading")
	// Tab enters the grid: one tab stop, the first cell.
	keys(kb.Tab)
	first := d.term.Periods[0]
	assert.True(t, strings.HasPrefix(active(), timetable.DayName(first.Day)+" "+first.Start.String()+"–"+first.End.String()+": "), active())
	r, c := cellOf(m)
	walk(r, c)
	heard := active()
	assert.Contains(t, heard, label(m)+" (", "a screen reader hears the meeting in the cell")
	assert.Contains(t, heard, d.term.Periods[m.Period].Start.String(), "and its time")
	b.shot("k1-cell-focus")

	// L locks the meeting; the grid keeps the focus; "Locked" is written
	// on it (not shown by colour alone).
	keys("l")
	waitFor(`document.getElementById("locked-count").textContent.startsWith("1 meeting locked")`)
	assert.Contains(t, active(), ", locked")
	btn := `button.mtg[data-section="` + m.Section + `"][data-meeting="` + strconv.Itoa(m.Meeting) + `"]`
	assert.Contains(t, b.text(btn), "Locked")
	// As drawn: the tag's colour on the button's background, WCAG 2.1 SC 1.4.3.
	fg := b.eval(`getComputedStyle(document.querySelector('` + btn + ` .lock-tag')).color`)
	bg := b.eval(`getComputedStyle(document.querySelector('` + btn + `')).backgroundColor`)
	assert.GreaterOrEqual(t, contrast(t, fg, bg), 4.5, "%s on %s", fg, bg)
	// Enter picks it: a locked meeting offers no cells to move to.
	keys(kb.Enter)
	require.NoError(t, chromedp.Do(ctx, chromedp.WaitVisible(`#picked`)))
	assert.Contains(t, b.text(`#picked-text`), "It is locked")
	assert.Equal(t, "0", b.eval(`String(document.querySelectorAll("#grid td[data-target]").length)`))
	b.shot("k2-locked")
	keys(kb.Escape)
	waitFor(`document.getElementById("picked").hidden`)

	// Another meeting of the week: pick it with Enter, W asks where else.
	var other timetable.Placement
	secs := d.term.SectionIndex()
	for _, p := range d.sched.Placements {
		if p.Section != m.Section && contains(d.term.Sections[secs[p.Section]].Staff, staff) && d.term.Sections[secs[p.Section]].Length == 1 {
			other = p
			break
		}
	}
	require.NotEmpty(t, other.Section)
	r, c = cellOf(other)
	walk(r, c)
	keys(kb.Enter)
	waitFor(`!document.getElementById("picked").hidden && document.getElementById("picked-text").textContent.includes("` + label(other) + `")`)
	keys("w")
	waitFor(`!!document.getElementById("where-list") || document.getElementById("where").textContent.includes("Problem")`)
	where := b.text(`#where`)
	assert.Contains(t, where, "Where else "+label(other))
	assert.Contains(t, where, "Every start was tried")
	b.shot("k3-where-else")
	// Force it onto the locked meeting's cell (a staff clash): Enter on
	// the cell is refused, "Place it anyway" forces it.
	r, c = cellOf(m)
	walk(r, c)
	keys(kb.Enter)
	waitFor(`!!document.querySelector("#verdict.illegal")`)
	require.NoError(t, chromedp.Do(ctx, chromedp.Focus(`#force`)))
	keys(kb.Enter)
	waitFor(`document.getElementById("hard").textContent.includes("broken")`)

	// Re-plan the rest: Tab from the seconds box to the button, Enter;
	// the page shows the answer and puts the focus on "Keep".
	require.NoError(t, chromedp.Do(ctx, chromedp.Focus(`#replan-seconds`)))
	keys("600", kb.Tab) // focus selects the field: typing replaces it
	assert.Equal(t, "replan", active())
	keys(kb.Enter)
	// Progress shows; once it has a timetable, Stop keeps the best so far
	// (no wait on the machine's speed).
	waitFor(`document.getElementById("replan-out").textContent.includes("Best cost so far") || !!document.getElementById("replan-keep")`)
	b.shot("k4-replan-progress")
	if b.eval(`String(!!document.querySelector("#replan-out .stop"))`) == "true" {
		require.NoError(t, chromedp.Do(ctx, chromedp.Focus(`#replan-out .stop`)))
		keys(kb.Enter)
	}
	waitFor(`!!document.getElementById("replan-keep") || document.getElementById("replan-out").textContent.includes("Problem")`)
	replanned := b.text(`#replan-out`)
	assert.Contains(t, replanned, "A new timetable was found")
	assert.NotContains(t, replanned, " 0 meetings move", "the clash makes a meeting move")
	assert.Equal(t, "replan-keep", active())
	b.shot("k5-replan-result")
	keys(kb.Enter)
	waitFor(`document.getElementById("notice").textContent.includes("kept")`)
	assert.Contains(t, b.text(`#hard`), "All hard requirements hold.")
	kept := d.current(t)
	p, ok := placementOf(kept, m.Section, m.Meeting)
	require.True(t, ok)
	assert.Equal(t, m.Period, p.Period, "the locked meeting stayed")
	assert.Empty(t, timetable.HardViolations(timetable.Check(d.term, kept)))

	// Unlock (L) and move it with Enter to a free cell of the same week.
	require.NoError(t, chromedp.Do(ctx, chromedp.Focus(`#grid td[tabindex="0"]`)))
	p, _ = placementOf(kept, m.Section, m.Meeting)
	r, c = cellOf(p)
	walk(r, c)
	keys("l")
	waitFor(`document.getElementById("locked-count").textContent.startsWith("No meeting")`)
	keys(kb.Enter)
	waitFor(`document.querySelectorAll("#grid td[data-target]").length > 0`)
	target := -1
	for per := range d.term.Periods {
		next := cloneSchedule(kept)
		for i := range next.Placements {
			if next.Placements[i].Section == m.Section && next.Placements[i].Meeting == m.Meeting {
				next.Placements[i].Period = per
			}
		}
		if per != p.Period && len(timetable.HardViolations(timetable.Check(d.term, next))) == 0 {
			target = per
			break
		}
	}
	if target < 0 {
		target = legal
	}
	tr, tc := b.eval(`(() => { const td = document.querySelector('#grid td[data-period="`+strconv.Itoa(target)+`"]'); return td.dataset.row + "," + td.dataset.col; })()`), ""
	rs, cs, _ := strings.Cut(tr, ",")
	tr, tc = rs, cs
	ri, _ := strconv.Atoi(tr)
	ci, _ := strconv.Atoi(tc)
	walk(ri, ci)
	assert.Contains(t, active(), "Press Enter to move "+label(m)+" (")
	keys(kb.Enter)
	waitFor(`document.getElementById("verdict").textContent.includes("` + label(m) + `: ")`)
	assert.True(t, strings.HasPrefix(b.text(`#verdict`), "Allowed."), b.text(`#verdict`))

	// Change notices from the loaded version to the current one.
	require.NoError(t, chromedp.Do(ctx, chromedp.Focus(`#cmp-new`)))
	keys(kb.Tab, kb.Tab)
	assert.Equal(t, "notices", active())
	keys(kb.Enter)
	waitFor(`!!document.querySelector("#notices-out details") || document.getElementById("notices-out").textContent.includes("Problem")`)
	text := b.eval(`document.getElementById("notice-0").value`)
	assert.True(t, strings.HasPrefix(text, "Subject: Timetable change for "), text)
	href := b.eval(`document.querySelector("#notices-out a.download").getAttribute("href")`)
	assert.True(t, strings.HasPrefix(href, "/api/notices/calendar?"), href)
	resp, body := d.raw(t, href)
	assert.Equal(t, 200, resp.StatusCode)
	assert.True(t, strings.HasPrefix(body, "BEGIN:VCALENDAR\r\n"))
	// Open the first notice (Enter on its summary), Tab past the text to
	// "Copy text".
	require.NoError(t, chromedp.Do(ctx, chromedp.Focus(`#notices-out summary`)))
	keys(kb.Enter, kb.Tab)
	assert.True(t, strings.HasPrefix(active(), "Notice for "), active())
	keys(kb.Tab)
	assert.Equal(t, "Copy text", active())
	keys(kb.Enter)
	waitFor(`document.querySelector("#notices-out .copied").textContent !== ""`)
	b.shot("k6-notices")
	buf, err := chromedp.Run(ctx, chromedp.Screenshot(`#notices-out`))
	require.NoError(t, err)
	b.save("k7-notices-part", buf)
}
