package timetable

import (
	"bytes"
	"context"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/xuri/excelize/v2"
)

// TestTemplateListsSurviveLibreOffice opens the template in a real
// spreadsheet program, headless LibreOffice Calc, saves it again as .xlsx,
// and checks that every drop-down list still offers exactly its values —
// the long Kind list by its range on the hidden Lists sheet, which stays
// hidden. It skips where soffice is not installed (scripts/test installs
// it) and in -short mode.
func TestTemplateListsSurviveLibreOffice(t *testing.T) {
	if testing.Short() {
		t.Skip("starts LibreOffice")
	}
	tool, err := exec.LookPath("soffice")
	if err != nil {
		t.Skip("soffice (LibreOffice) is not installed: apt-get install libreoffice-calc, or run scripts/test")
	}
	dir := t.TempDir()
	var buf bytes.Buffer
	require.NoError(t, WriteTemplate(&buf))
	in := filepath.Join(dir, "template.xlsx")
	require.NoError(t, os.WriteFile(in, buf.Bytes(), 0o644))
	out := filepath.Join(dir, "saved")
	ctx, cancel := context.WithTimeout(context.Background(), 5*time.Minute)
	defer cancel()
	profile := "file://" + filepath.ToSlash(filepath.Join(dir, "lo-profile"))
	msg, err := exec.CommandContext(ctx, tool, "--headless", "--norestore", "--nolockcheck", "-env:UserInstallation="+profile,
		"--convert-to", "xlsx:Calc MS Excel 2007 XML", "--outdir", out, in).CombinedOutput()
	require.NoError(t, err, "soffice: %s", msg)

	f, err := excelize.OpenFile(filepath.Join(out, "template.xlsx"))
	require.NoError(t, err)
	defer f.Close()
	visible, err := f.GetSheetVisible(shLists)
	require.NoError(t, err)
	assert.False(t, visible, "the Lists sheet stays hidden")
	for _, d := range dropDowns {
		dvs, err := f.GetDataValidations(d.sheet)
		require.NoError(t, err)
		letter := colLetter(indexOf(specFor(d.sheet).cols, d.col))
		found := false
		for _, dv := range dvs {
			if strings.HasPrefix(dv.Sqref, letter+"2:") {
				found = true
				assert.Equal(t, d.values, listValues(t, f, dv.Formula1), "%s.%s after LibreOffice", d.sheet, d.col)
			}
		}
		assert.True(t, found, "LibreOffice kept the drop-down of %s.%s", d.sheet, d.col)
	}
	_, ps, err := ReadWorkbook(bytes.NewReader(mustRead(t, filepath.Join(out, "template.xlsx"))), "saved.xlsx")
	require.NoError(t, err)
	assert.Empty(t, ps.Warnings(), "the saved template reads without warnings:\n%s", ps)
}

func mustRead(t *testing.T, path string) []byte {
	t.Helper()
	b, err := os.ReadFile(path)
	require.NoError(t, err)
	return b
}
