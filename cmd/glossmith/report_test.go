package main

import (
	"encoding/csv"
	"encoding/json"
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
	// A termbase where the acronym "VPD" is accepted: the report shows its
	// full form's label.
	labels := filepath.Join(dir, "labels.gtb")
	r := run(t, "", "termbase", "--termbase", labels, "accept", "VPD")
	require.Equal(t, 0, r.code, r.stderr)
	r = run(t, "", append([]string{"terms", "-q", "--to", "html", "--termbase", labels, "-o", report}, inputs...)...)
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

	require.NoError(t, chromedp.Do(ctx, showTerm("vapour pressure deficit"),
		chromedp.WaitVisible(rowXPath("vapour pressure deficit")+`/td[3]/span[text()="full form"][@title="full form of VPD"]`),
		chromedp.WaitVisible(`//div[@class="gs-facts"][contains(text(), "full form of “VPD”")]`)), "the termbase's label")

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

// With a termbase, the report carries each candidate's label as terms'
// JSON Lines gives it — the full form of an accepted acronym is its
// `full form`, the acronym of an accepted full form its `acronym` — and
// --new keeps the same candidates. Invented texts defining "root zone
// moisture sensor (RMS)".
func TestReportLabelsLikeTerms(t *testing.T) {
	dir := t.TempDir()
	docs := acronymDocs(t, dir)
	for _, accept := range []string{"RMS", "root zone moisture sensor"} {
		tb := filepath.Join(dir, accept+".gtb")
		r := run(t, "", "termbase", "--termbase", tb, "accept", accept)
		require.Equal(t, 0, r.code, r.stderr)
		for _, extra := range [][]string{{"--all"}, {"--all", "--new"}} {
			report := filepath.Join(dir, "report.html")
			r = run(t, "", append(append([]string{"terms", "-q", "--termbase", tb, "-o", report}, extra...), docs)...)
			require.Equal(t, 0, r.code, r.stderr)
			got := reportLabels(t, report)
			want := statusOf(t, append(append([]string{"terms", "-q", "--termbase", tb, "--to", "jsonl"}, extra...), docs)...)
			require.NotEmpty(t, want)
			assert.Len(t, got, len(want), "%s accepted, %v: the same candidates", accept, extra)
			for term, w := range want {
				if w[1] == term {
					w[1] = "" // the report names the entry only when it is another term's
				}
				assert.Equal(t, w, got[term], "%s with %s accepted, %v", term, accept, extra)
			}
		}
		st := reportLabels(t, filepath.Join(dir, "report.html"))
		require.NoError(t, os.Remove(filepath.Join(dir, "report.html")))
		assert.NotContains(t, st, "RMS", "--new leaves out the acronym pair with %s accepted", accept)
	}
	r := run(t, "", "terms", "-q", "--termbase", filepath.Join(dir, "RMS.gtb"), "--all", "-o", filepath.Join(dir, "r.html"), docs)
	require.Equal(t, 0, r.code, r.stderr)
	st := reportLabels(t, filepath.Join(dir, "r.html"))
	assert.Equal(t, [2]string{"full form", "RMS"}, st["root zone moisture sensor"])
	assert.Equal(t, [2]string{"accepted", ""}, st["RMS"])
}

// reportLabels reads the data inlined in a report and returns each
// candidate's status and entry.
func reportLabels(t *testing.T, path string) map[string][2]string {
	t.Helper()
	b, err := os.ReadFile(path)
	require.NoError(t, err)
	_, data, ok := strings.Cut(string(b), `<script type="application/json" id="gs-data">`)
	require.True(t, ok, "the report's data element")
	data, _, ok = strings.Cut(data, "</script>")
	require.True(t, ok)
	var d struct {
		Cands []struct {
			Term   string `json:"term"`
			Status string `json:"status"`
			Entry  string `json:"entry"`
		} `json:"cands"`
	}
	require.NoError(t, json.Unmarshal([]byte(data), &d))
	out := map[string][2]string{}
	for _, c := range d.Cands {
		out[c.Term] = [2]string{c.Status, c.Entry}
	}
	return out
}
