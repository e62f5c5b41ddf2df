package main

import (
	"encoding/csv"
	"fmt"
	"glossmith/extract/termbase"
	"glossmith/internal/testenv"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/chromedp/cdproto/browser"
	"github.com/chromedp/chromedp"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// The static report opens from file:// with no server: every candidate is
// a row, nothing is fetched, nothing is logged as an error; a decision and
// a remark download as CSV with the import header.
func TestReportInBrowser(t *testing.T) {
	dir := t.TempDir()
	report := filepath.Join(dir, "report.html")
	inputs := []string{"testdata/demo", "testdata/review/markup-in-text.txt"}
	r := run(t, "", append([]string{"terms", "-q", "--to", "html", "-o", report}, inputs...)...)
	require.Equal(t, 0, r.code, r.stderr)
	tsv := run(t, "", append([]string{"terms", "-q", "--to", "tsv"}, inputs...)...)
	require.Equal(t, 0, tsv.code, tsv.stderr)
	lines := strings.Split(strings.TrimSuffix(tsv.stdout, "\n"), "\n")
	want := len(lines) - 1

	w := &pageWatch{allow: func(u string) bool { return strings.HasPrefix(u, "file://") }}
	ctx := newBrowser(t, w)
	_, err := chromedp.CallBrowser(ctx, browser.SetDownloadBehavior, browser.SetDownloadBehaviorParams{
		Behavior: browser.SetDownloadBehaviorBehaviorAllowAndName, DownloadPath: dir, EventsEnabled: new(true)})
	require.NoError(t, err)
	require.NoError(t, chromedp.Do(ctx, chromedp.Navigate("file://"+report), chromedp.WaitVisible(chromedp.CSS(`body[data-ready="yes"]`))))
	shown, err := chromedp.Run(ctx, chromedp.Text(chromedp.ID("gs-shown")))
	require.NoError(t, err)
	assert.Equal(t, fmt.Sprintf("%d of %d shown", want, want), shown, "every candidate of terms is a row")
	first, err := chromedp.Run(ctx, chromedp.Text(chromedp.CSS(`#gs-rows tr:first-child td:nth-child(2)`)))
	require.NoError(t, err)
	assert.Equal(t, strings.Split(lines[1], "\t")[1], first, "the first row is terms' first")

	// A decision by key and a remark.
	const remark = `The panel, not the pump, "as labelled".`
	require.NoError(t, chromedp.Do(ctx, showTerm("dosing pump panel"), chromedp.KeyEvent("y"),
		chromedp.WaitVisible(rowXPath("dosing pump panel")+`/td[3]/span[text()="accepted"]`),
		showTerm("dosing pump panel"),
		chromedp.SendKeys(chromedp.ID("gs-remark"), remark),
		chromedp.Evaluate[chromedp.Void](`document.getElementById('gs-remark').dispatchEvent(new Event('change'))`)))
	kwic, err := chromedp.Run(ctx, chromedp.Text(chromedp.ID("gs-kwic")))
	require.NoError(t, err)
	injected, err := chromedp.Run(ctx, chromedp.Evaluate[string](`String(window.gsInjected)`))
	require.NoError(t, err)
	assert.Equal(t, "undefined", injected, "a document's markup ran")
	assert.Contains(t, kwic, "<script>window.gsInjected = 1</script>")

	downloads := chromedp.BrowserEvents(ctx, browser.DownloadProgress)
	require.NoError(t, chromedp.Do(ctx, chromedp.Click(chromedp.ID("gs-download"))))
	var guid string
	for ev, err := range downloads {
		require.NoError(t, err, "waiting for the download")
		if ev.State == browser.DownloadProgressStateCompleted {
			guid = ev.GUID
			break
		}
	}
	b, err := os.ReadFile(filepath.Join(dir, guid))
	require.NoError(t, err)
	got, err := csv.NewReader(strings.NewReader(string(b))).ReadAll()
	require.NoError(t, err)
	assert.Equal(t, [][]string{{"term", "decision", "comment"}, {"dosing pump panel", "accept", remark}}, got)
	screenshot(ctx, dir, "report.png")
	w.check(t)

	// termbase import reads the remarks back as decisions.
	csvPath := filepath.Join(dir, "remarks.csv")
	require.NoError(t, os.WriteFile(csvPath, b, 0o644))
	tbPath := filepath.Join(dir, "expert.gtb")
	imp := run(t, "", "termbase", "import", "--termbase", tbPath, csvPath)
	require.Equal(t, 0, imp.code, imp.stderr)
	tb, err := termbase.Open(tbPath)
	require.NoError(t, err)
	defer tb.Close()
	es, err := tb.Lookup("dosing pump panel")
	require.NoError(t, err)
	require.Len(t, es, 1, "the remark's term is in the termbase")
	assert.Equal(t, termbase.Preferred, es[0].Terms[0].Status)
}

// The report of the wind-energy texts of the ACTER gold data (some 2,800
// candidates) stays small enough to send by mail: at most 3 MB.
func TestReportSizeWind(t *testing.T) {
	texts := testenv.SharedDir(t, "data/term-gold-en/wind/texts")
	report := filepath.Join(t.TempDir(), "wind.html")
	r := run(t, "", "terms", "-q", "-o", report, texts)
	require.Equal(t, 0, r.code, r.stderr)
	fi, err := os.Stat(report)
	require.NoError(t, err)
	assert.LessOrEqual(t, fi.Size(), int64(3_000_000), "report size")
	t.Logf("wind report: %d bytes", fi.Size())
}
