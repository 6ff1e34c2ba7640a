package web

import (
	"context"
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/chromedp/cdproto/cdp"
	"github.com/chromedp/cdproto/emulation"
	"github.com/chromedp/chromedp"
	"github.com/chromedp/chromedp/kb"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/timetable"
)

// chromium finds the headless browser (Debian's chromium package); the
// test is skipped when there is none or under -short.
func chromium(t *testing.T) string {
	for _, name := range []string{"chromium", "chromium-browser", "google-chrome"} {
		if p, err := exec.LookPath(name); err == nil {
			if testing.Short() {
				t.Skip("the browser test is skipped with -short")
			}
			return p
		}
	}
	t.Skip("chromium is not installed (Debian package chromium; scripts/test installs it): the browser test is skipped")
	return ""
}

// browser is a headless Chromium driven by chromedp, with screenshots
// written to $SCREENSHOT_DIR (a temporary folder when unset).
type browser struct {
	ctx  context.Context
	shot func(name string)
	text func(sel string) string
	eval func(js string) string
	save func(name string, png []byte)
}

func newBrowser(t *testing.T, exe string) *browser {
	t.Helper()
	shots := os.Getenv("SCREENSHOT_DIR")
	if shots == "" {
		shots = t.TempDir()
	}
	opts := []chromedp.ExecAllocatorOption{
		chromedp.ExecPath(exe),
		chromedp.Flag("headless", true),
		chromedp.NoSandbox,
		chromedp.DisableGPU,
		chromedp.Flag("disable-background-networking", true),
		chromedp.Flag("disable-component-update", true),
		chromedp.Flag("disable-sync", true),
		chromedp.NoFirstRun,
		chromedp.UserDataDir(t.TempDir()),
		chromedp.WindowSize(1400, 1200),
	}
	actx, cancel := chromedp.NewExecAllocator(context.Background(), opts...)
	t.Cleanup(cancel)
	ctx, cancel := chromedp.NewContext(actx)
	t.Cleanup(cancel)
	ctx, cancel = context.WithTimeout(ctx, 150*time.Second)
	t.Cleanup(cancel)
	b := &browser{ctx: ctx}
	b.save = func(name string, png []byte) {
		t.Helper()
		p := filepath.Join(shots, name+".png")
		require.NoError(t, os.WriteFile(p, png, 0o644))
		t.Logf("screenshot %s", p)
	}
	b.shot = func(name string) {
		t.Helper()
		buf, err := chromedp.Run(ctx, chromedp.FullScreenshot(100))
		require.NoError(t, err)
		b.save(name, buf)
	}
	b.text = func(sel string) string {
		t.Helper()
		s, err := chromedp.Run(ctx, chromedp.Text(sel))
		require.NoError(t, err)
		return s
	}
	b.eval = func(js string) string {
		t.Helper()
		s, err := chromedp.Run(ctx, chromedp.Evaluate[string](js))
		require.NoError(t, err)
		return s
	}
	return b
}

// TestBrowserEndToEnd opens the page in headless Chromium on the demo
// term: finds a staff member, moves a meeting onto another meeting of
// theirs with the mouse (refused: a staff clash), then to a free cell
// with the keyboard (allowed), saves, and checks the saved workbook with
// timetable.Check. Screenshots go to $SCREENSHOT_DIR when set.
func TestBrowserEndToEnd(t *testing.T) {
	exe := chromium(t)
	d := newDemo(t)
	m, legal, clash, staff := d.legalAndIllegal(t)
	b := newBrowser(t, exe)
	ctx, shot, text := b.ctx, b.shot, b.text
	name := d.staffName(staff)
	mtg := `button.mtg[data-section="` + m.Section + `"][data-meeting="` + strconv.Itoa(m.Meeting) + `"]`
	here := func(p int) string { return `button.here[data-period="` + strconv.Itoa(p) + `"]` }
	require.NoError(t, chromedp.Do(ctx,
		chromedp.Navigate(d.ts.URL+"/"),
		chromedp.WaitVisible(`#master tbody tr`),
		chromedp.SendKeys(`#find`, name),
		chromedp.Click(`#matches button[data-kind="staff"][data-id="`+staff+`"]`),
		chromedp.WaitVisible(`#grid`),
	))
	shot("1-staff-week")
	// Mouse: pick the meeting, then the cell of another of their meetings.
	require.NoError(t, chromedp.Do(ctx,
		chromedp.Click(mtg),
		chromedp.WaitVisible(here(clash)),
		chromedp.Click(here(clash)),
		chromedp.WaitVisible(`#verdict .tag`),
	))
	verdict := text(`#verdict`)
	shot("2-refused")
	assert.Contains(t, verdict, "Not allowed.")
	assert.Contains(t, verdict, timetable.RuleStaffClash)
	assert.Contains(t, verdict, "not moved")

	// Why not: the explanation engine answers for every timetable of the term.
	require.NoError(t, chromedp.Do(ctx, chromedp.Click(`#ask-why`)))
	_, err := chromedp.Run(ctx, chromedp.Poll[bool](`(() => { const w = document.getElementById("whynot"); return w && w.textContent.includes("timetable of the term") && !w.textContent.startsWith("Searching"); })()`))
	require.NoError(t, err)
	why := text(`#whynot`)
	shot("2b-why-not")
	assert.Contains(t, why, "section "+m.Section+" at "+d.term.Periods[clash].Label())

	// Keyboard: the meeting is still picked; focus the free cell and press Enter.
	require.NoError(t, chromedp.Do(ctx,
		chromedp.Focus(here(legal)),
		chromedp.KeyEvent(kb.Enter),
		chromedp.WaitVisible(`#verdict.legal`),
	))
	verdict, hard := text(`#verdict`), text(`#hard`)
	shot("3-moved")
	require.NoError(t, chromedp.Do(ctx, chromedp.Click(`#save`)))
	_, err = chromedp.Run(ctx, chromedp.Poll[bool](`document.getElementById("notice").textContent.includes("Saved as")`))
	require.NoError(t, err)
	notice := text(`#notice`)
	shot("4-saved")
	assert.True(t, strings.HasPrefix(verdict, "Allowed."), verdict)
	assert.Contains(t, verdict, "done")
	assert.Contains(t, hard, "All hard requirements hold.")
	assert.Contains(t, notice, "autumn-2.xlsx")

	// Print: the controls go, the week and the lists stay.
	printMedia := func(ctx context.Context, tg *chromedp.Target) (chromedp.Void, error) {
		_, err := cdp.Call(ctx, tg, emulation.SetEmulatedMedia, emulation.SetEmulatedMediaParams{Media: "print"})
		return chromedp.Void{}, err
	}
	require.NoError(t, chromedp.Do(ctx, printMedia))
	shot("5-print")
	hidden, err := chromedp.Run(ctx, chromedp.Evaluate[bool](`["save", "undo", "find", "filter"].every((id) => document.getElementById(id).getClientRects().length === 0)`))
	require.NoError(t, err)
	assert.True(t, hidden, "print hides the controls")
	gridShown, err := chromedp.Run(ctx, chromedp.Evaluate[bool](`document.getElementById("grid").getClientRects().length > 0 && document.getElementById("master").getClientRects().length > 0`))
	require.NoError(t, err)
	assert.True(t, gridShown, "print keeps the week grid")

	saved, ps, err := timetable.ReadSchedule(filepath.Join(d.dir, "autumn-2.xlsx"), d.term)
	require.NoError(t, err)
	require.Empty(t, ps.Errors())
	assert.Empty(t, timetable.HardViolations(timetable.Check(d.term, saved)), "the saved workbook passes timetable.Check")
	for _, p := range saved.Placements {
		if p.Section == m.Section && p.Meeting == m.Meeting {
			assert.Equal(t, legal, p.Period, "the saved workbook holds the move")
		}
	}
}
