package main

import (
	"bufio"
	"encoding/json"
	"fmt"
	"io"
	"net/http"
	"net/http/cookiejar"
	"net/url"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
	"syscall"
	"testing"
	"time"

	"github.com/chromedp/chromedp"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/extract/termbase"
)

// reviewServer is a running `glossmith review`.
type reviewServer struct {
	cmd    *exec.Cmd
	url    string // with the token
	origin string // scheme://host:port
	token  string
	stderr *strings.Builder
}

func startReview(t *testing.T, tbPath string, inputs ...string) *reviewServer {
	t.Helper()
	args := append([]string{"review", "-q", "--termbase", tbPath}, inputs...)
	cmd := exec.Command(binary, args...)
	cmd.Dir = "../.."
	stdout, err := cmd.StdoutPipe()
	require.NoError(t, err)
	var stderr strings.Builder
	cmd.Stderr = &stderr
	require.NoError(t, cmd.Start())
	lines := make(chan string, 1)
	go func() {
		sc := bufio.NewScanner(stdout)
		if sc.Scan() {
			lines <- sc.Text()
		}
		close(lines)
		io.Copy(io.Discard, stdout)
	}()
	s := &reviewServer{cmd: cmd, stderr: &stderr}
	t.Cleanup(func() { s.stop(t) })
	select {
	case line, ok := <-lines:
		require.True(t, ok, "review printed no address; stderr: %s", stderr.String())
		s.url = line
	case <-time.After(60 * time.Second):
		t.Fatalf("review printed no address in a minute; stderr: %s", stderr.String())
	}
	u, err := url.Parse(s.url)
	require.NoError(t, err, "first line of stdout: %q", s.url)
	s.origin, s.token = u.Scheme+"://"+u.Host, u.Query().Get("t")
	require.Len(t, s.token, 48, "the address carries the token")
	return s
}

// client returns an HTTP client holding the session's cookie, as the
// browser does once it has opened the address.
func (s *reviewServer) client(t *testing.T) *http.Client {
	t.Helper()
	jar, err := cookiejar.New(nil)
	require.NoError(t, err)
	c := &http.Client{Jar: jar}
	resp, err := c.Get(s.url)
	require.NoError(t, err)
	resp.Body.Close()
	return c
}

// stop sends Ctrl-C and waits for a clean exit.
func (s *reviewServer) stop(t *testing.T) {
	if s.cmd == nil {
		return
	}
	cmd := s.cmd
	s.cmd = nil
	_ = cmd.Process.Signal(syscall.SIGINT)
	done := make(chan error, 1)
	go func() { done <- cmd.Wait() }()
	select {
	case err := <-done:
		assert.NoError(t, err, "review after Ctrl-C; stderr: %s", s.stderr.String())
	case <-time.After(20 * time.Second):
		cmd.Process.Kill()
		t.Errorf("review did not stop on Ctrl-C")
	}
}

// The review page on the demo corpus with a new termbase: decisions by
// click and by key, a merge, an undo, a definition, a reload and a
// restart; what the termbase holds afterwards; the checks on every
// request; document text that looks like markup shown as text.
func TestReviewPageInBrowser(t *testing.T) {
	tbPath := filepath.Join(t.TempDir(), "review.gtb")
	shots := t.TempDir()
	inputs := []string{"testdata/demo", "testdata/review/markup-in-text.txt"}
	srv := startReview(t, tbPath, inputs...)
	w := &pageWatch{allow: func(u string) bool { return strings.HasPrefix(u, srv.origin+"/") }}
	ctx := newBrowser(t, w)

	ready := chromedp.WaitVisible(chromedp.CSS(`body[data-ready="yes"]`))
	require.NoError(t, chromedp.Do(ctx, chromedp.Navigate(srv.url), ready))
	loc, err := chromedp.Run(ctx, chromedp.Location())
	require.NoError(t, err)
	assert.NotContains(t, loc, srv.token, "the token leaves the address bar for the cookie")

	// Accept by click, reject by key, accept by key, defer by click.
	steps := []struct{ term, how, want string }{
		{"irrigation zone", "#gs-do-accept", "accepted"},
		{"climate controller", "n", "rejected"},
		{"root-zone temperature", "y", "accepted"},
		{"drip emitter", "#gs-do-defer", "deferred"},
	}
	for _, s := range steps {
		act := chromedp.KeyEvent(s.how)
		if strings.HasPrefix(s.how, "#") {
			act = chromedp.Click(chromedp.CSS(s.how))
		}
		require.NoError(t, chromedp.Do(ctx, showTerm(s.term), act,
			chromedp.WaitVisible(rowXPath(s.term)+fmt.Sprintf(`/td[3]/span[text()=%q]`, s.want))),
			"%s by %s", s.term, s.how)
	}
	counter, err := chromedp.Run(ctx, chromedp.Text(chromedp.ID("gs-counter")))
	require.NoError(t, err)
	assert.True(t, strings.HasPrefix(counter, "4 / "), "reviewed counter: %q", counter)

	// Accepting the acronym "VPD" makes its full form's row say so at once,
	// and the detail view names the entry.
	require.NoError(t, chromedp.Do(ctx, showTerm("VPD"), chromedp.Click(chromedp.CSS("#gs-do-accept")),
		chromedp.WaitVisible(rowXPath("VPD")+`/td[3]/span[text()="accepted"]`), idle,
		chromedp.Evaluate[chromedp.Void](`(() => { const q = document.getElementById('gs-q'); q.value = 'vapour pressure deficit'; q.dispatchEvent(new Event('input')); })()`),
		chromedp.WaitVisible(rowXPath("vapour pressure deficit")+`/td[3]/span[text()="full form"][@title="full form of VPD"]`),
		showTerm("vapour pressure deficit"),
		chromedp.WaitVisible(`//div[@class="gs-facts"][contains(text(), "full form of “VPD”")]`)), "the full form of an accepted acronym")

	// A variant admitted by key: v, then its number in the list.
	require.NoError(t, chromedp.Do(ctx, showTerm("irrigation zone"), chromedp.KeyEvent("v"),
		chromedp.WaitVisible(`//ol[@id="gs-choices"]/li[2][starts-with(text(), "irrigation zones (")]`),
		chromedp.KeyEvent("2"),
		chromedp.WaitVisible(`//table[@class="gs-variants"]//tr[td[1][text()="irrigation zones"]]//span[text()="admitted"]`)), "admit a variant")

	// "?" lists the keys; Escape closes the list.
	require.NoError(t, chromedp.Do(ctx, chromedp.KeyEvent("?"), chromedp.WaitVisible(chromedp.ID("gs-help"))))
	keys, err := chromedp.Run(ctx, chromedp.Text(chromedp.ID("gs-help")))
	require.NoError(t, err)
	for _, k := range []string{"accept", "reject", "defer", "preferred form", "admitted", "deprecated", "merge", "definition", "note", "part of speech", "undo"} {
		assert.Contains(t, keys, k, "the key list")
	}
	require.NoError(t, chromedp.Do(ctx, chromedp.KeyEvent("\x1b"), chromedp.WaitNotPresent(chromedp.ID("gs-help"))))

	// Merge "dripper" with "emitter" by key (g, a few letters, Enter);
	// undo it by key; merge again by the button. The g's character comes
	// half a second after its keydown and must not reach the search field.
	// Each step waits for what the server answered to be on the page.
	merged := `//div[@class="gs-facts"][contains(text(), "one concept with “emitter”")]`
	mergeWith := func(open chromedp.Action[chromedp.Void]) chromedp.Action[chromedp.Void] {
		return chromedp.Steps(open, chromedp.WaitVisible(chromedp.ID("gs-ask")),
			chromedp.SendKeys(chromedp.ID("gs-ask"), "emitter"),
			chromedp.WaitVisible(`//ol[@id="gs-choices"]/li[1][starts-with(text(), "emitter (")]`),
			chromedp.KeyEvent("\r"),
			chromedp.WaitNotPresent(chromedp.ID("gs-ask")),
			idle, chromedp.WaitVisible(merged))
	}
	require.NoError(t, chromedp.Do(ctx, showTerm("dripper"), mergeWith(lateKey('g', 500*time.Millisecond))), "merge by key")
	// The toast hides itself after a while: its text stays, so the check
	// does not depend on catching it on screen.
	require.NoError(t, chromedp.Do(ctx, chromedp.KeyEvent("z"), idle,
		chromedp.WaitReady(`//div[@id="gs-toast"][text()="undone"]`), chromedp.WaitNotPresent(merged)), "undo by key")
	require.NoError(t, chromedp.Do(ctx, mergeWith(chromedp.Click(chromedp.ID("gs-do-merge")))), "merge by the button")
	// A definition through its dialog, opened by a key whose character
	// comes late.
	const def = "Emitter that drips water onto one plant."
	require.NoError(t, chromedp.Do(ctx, lateKey('e', 500*time.Millisecond), chromedp.WaitVisible(chromedp.ID("gs-ask")),
		chromedp.SendKeys(chromedp.ID("gs-ask"), def),
		chromedp.Click(chromedp.ID("gs-ask-ok")), idle,
		chromedp.WaitVisible(fmt.Sprintf(`//dl[@class="gs-notes"]/dd[text()=%q]`, def))), "definition")
	// The whole table with a term in the detail view, for docs/review.png.
	require.NoError(t, chromedp.Do(ctx,
		chromedp.Evaluate[chromedp.Void](`(() => { const q = document.getElementById('gs-q'); q.value = ''; q.dispatchEvent(new Event('input')); q.blur(); })()`),
		chromedp.Click(rowXPath("solenoid valve")), chromedp.WaitVisible(`//h2/span[@id="gs-term"][text()="solenoid valve"]`)))
	screenshot(ctx, shots, "review.png")

	// After a reload the page shows what the termbase holds.
	require.NoError(t, chromedp.Do(ctx, chromedp.Reload(), ready))
	for _, s := range steps {
		require.NoError(t, chromedp.Do(ctx, showTerm(s.term)))
		st, err := rowStatus(ctx, s.term)
		require.NoError(t, err)
		assert.Equal(t, s.want, st, "%s after a reload", s.term)
	}

	// Document text that looks like markup is shown as text and runs nothing.
	require.NoError(t, chromedp.Do(ctx, showTerm("dosing pump panel"), chromedp.WaitVisible(chromedp.CSS("#gs-kwic .gs-line"))))
	kwic, err := chromedp.Run(ctx, chromedp.Text(chromedp.ID("gs-kwic")))
	require.NoError(t, err)
	injected, err := chromedp.Run(ctx, chromedp.Evaluate[string](`String(window.gsInjected)`))
	require.NoError(t, err)
	elems, err := chromedp.Run(ctx, chromedp.Evaluate[int](`document.querySelectorAll('#gs-detail img, #gs-detail script').length`))
	require.NoError(t, err)
	assert.Equal(t, "undefined", injected, "a document's markup ran")
	assert.Zero(t, elems, "a document's markup became elements")
	assert.Contains(t, kwic, "<script>window.gsInjected = 1</script>")
	assert.Contains(t, kwic, `<img src=x onerror="window.gsInjected = 2">`)
	w.check(t)

	checkRequests(t, srv)

	// Stopped, the termbase holds the decisions.
	srv.stop(t)
	tb, err := termbase.Open(tbPath)
	require.NoError(t, err)
	find := func(text string) (*termbase.Entry, *termbase.Term) {
		es, err := tb.Lookup(text)
		require.NoError(t, err)
		for _, e := range es {
			for _, x := range e.Terms {
				if x.Text == text {
					return e, x
				}
			}
		}
		t.Errorf("%q is not in the termbase", text)
		return &termbase.Entry{}, &termbase.Term{}
	}
	ez, x := find("irrigation zone")
	assert.Equal(t, termbase.Preferred, x.Status)
	ev, x := find("irrigation zones")
	assert.Equal(t, termbase.Admitted, x.Status, "the admitted variant")
	assert.Equal(t, ez.ID, ev.ID, "the variant is a term of the same entry")
	_, x = find("climate controller")
	assert.Equal(t, termbase.Rejected, x.Status)
	_, x = find("root-zone temperature")
	assert.Equal(t, termbase.Preferred, x.Status)
	_, x = find("drip emitter")
	assert.True(t, x.Status == termbase.Candidate && x.Deferred, "drip emitter deferred: %s %v", x.Status, x.Deferred)
	e1, _ := find("dripper")
	e2, _ := find("emitter")
	assert.True(t, e1.ID != 0 && e1.ID == e2.ID, "merged candidates are one entry: %d, %d", e1.ID, e2.ID)
	assert.Equal(t, def, e1.Definition)
	require.NoError(t, tb.Close())

	// Restarted on the same termbase, the page shows them again.
	srv2 := startReview(t, tbPath, inputs...)
	w.mu.Lock()
	w.allow = func(u string) bool { return strings.HasPrefix(u, srv2.origin+"/") }
	w.mu.Unlock()
	require.NoError(t, chromedp.Do(ctx, chromedp.Navigate(srv2.url), ready))
	for _, s := range steps {
		require.NoError(t, chromedp.Do(ctx, showTerm(s.term)))
		st, err := rowStatus(ctx, s.term)
		require.NoError(t, err)
		assert.Equal(t, s.want, st, "%s after a restart", s.term)
	}
	require.NoError(t, chromedp.Do(ctx, showTerm("emitter")))
	facts, err := chromedp.Run(ctx, chromedp.Text(chromedp.CSS(".gs-facts")))
	require.NoError(t, err)
	assert.Contains(t, facts, "one concept with “dripper”", "the merge after a restart")
	assert.Contains(t, facts, "mostly within “drip emitter”", "the candidate it mostly occurs in")
	w.check(t)
	t.Logf("screenshots in %s", shots)
}

// checkRequests sends requests a browser page of another site, or another
// program, could send, and checks each is refused — and that the right
// ones pass.
//
// wrongToken is token with its first character changed: "ab" + token[2:]
// was the token itself when it began with "ab" (1 run in 256).
func wrongToken(token string) string {
	if token[0] == '0' {
		return "1" + token[1:]
	}
	return "0" + token[1:]
}

func checkRequests(t *testing.T, srv *reviewServer) {
	client := &http.Client{CheckRedirect: func(*http.Request, []*http.Request) error { return http.ErrUseLastResponse }}
	port := srv.origin[strings.LastIndex(srv.origin, ":"):]
	act := `{"id":0,"kind":"note","text":"x"}`
	for _, c := range []struct {
		what                                        string
		method, path, host, cookie, token, ct, body string
		want                                        int
	}{
		{"page without the token", "GET", "/", "", "", "", "", "", 403},
		{"data without the token", "GET", "/api/data", "", "", "", "", "", 403},
		{"a wrong token in the address", "GET", "/?t=00", "", "", "", "", "", 403},
		{"a wrong cookie", "GET", "/api/data", "", wrongToken(srv.token), "", "", "", 403},
		{"a foreign Host (DNS rebinding)", "GET", "/api/data", "attacker.example" + port, srv.token, "", "", "", 421},
		{"the loopback address on another port", "GET", "/api/data", "127.0.0.1:1", srv.token, "", "", "", 421},
		{"a change by GET", "GET", "/api/act", "", srv.token, "", "", "", 405},
		{"a change without the token header", "POST", "/api/act", "", srv.token, "", "application/json", act, 403},
		{"a change with the header but no cookie", "POST", "/api/act", "", "", srv.token, "application/json", act, 403},
		{"a change as a form post", "POST", "/api/act", "", srv.token, srv.token, "application/x-www-form-urlencoded", act, 415},
		{"a body over the limit", "POST", "/api/act", "", srv.token, srv.token, "application/json", `{"id":0,"kind":"note","text":"` + strings.Repeat("x", 70<<10) + `"}`, 400},
		{"a file-system path", "GET", "/etc/passwd", "", srv.token, "", "", "", 404},
		{"a path out of the root, cleaned (then 404)", "GET", "/api/../../etc/passwd", "", srv.token, "", "", "", 307},
		{"the embedded folder", "GET", "/assets/app.js", "", srv.token, "", "", "", 404},
		{"with the token: the data", "GET", "/api/data", "", srv.token, "", "", "", 200},
		{"localhost names the loopback", "GET", "/api/data", "localhost" + port, srv.token, "", "", "", 200},
	} {
		req, err := http.NewRequest(c.method, srv.origin+c.path, strings.NewReader(c.body))
		require.NoError(t, err)
		if c.host != "" {
			req.Host = c.host
		}
		if c.cookie != "" {
			req.AddCookie(&http.Cookie{Name: "glossmith_review", Value: c.cookie})
		}
		if c.token != "" {
			req.Header.Set("X-Glossmith-Token", c.token)
		}
		if c.ct != "" {
			req.Header.Set("Content-Type", c.ct)
		}
		resp, err := client.Do(req)
		require.NoError(t, err)
		resp.Body.Close()
		assert.Equal(t, c.want, resp.StatusCode, c.what)
	}
}

// --run reviews a run recorded with terms --record: its candidates, as
// the page's data, without reading the documents again.
func TestReviewRecordedRun(t *testing.T) {
	tbPath := filepath.Join(t.TempDir(), "runs.gtb")
	rec := run(t, "", "terms", "-q", "--termbase", tbPath, "--record", "v1", "--to", "tsv", "testdata/demo")
	require.Equal(t, 0, rec.code, rec.stderr)
	bad := run(t, "", "review", "--termbase", tbPath, "--run", "v1", "testdata/demo")
	assert.Equal(t, 2, bad.code, "--run with inputs: %s", bad.stderr)
	srv := startReview(t, tbPath, "--run", "v1")
	c := srv.client(t)
	resp, err := c.Get(srv.origin + "/api/data")
	require.NoError(t, err)
	defer resp.Body.Close()
	var data struct {
		Source string `json:"source"`
		Cands  []struct {
			Term string `json:"term"`
			Freq int    `json:"freq"`
		} `json:"cands"`
	}
	require.NoError(t, json.NewDecoder(resp.Body).Decode(&data))
	assert.Contains(t, data.Source, `run "v1"`)
	require.NotEmpty(t, data.Cands)
	assert.Equal(t, "valve", data.Cands[0].Term, "the most frequent candidate first")
	recorded := 0 // the frequency terms --record printed (columns rank, term, score, freq, …)
	for _, line := range strings.Split(rec.stdout, "\n") {
		if f := strings.Split(line, "\t"); len(f) > 3 && f[1] == "valve" {
			recorded, _ = strconv.Atoi(f[3])
		}
	}
	require.NotZero(t, recorded, "valve in the recorded run's output:\n%s", rec.stdout)
	assert.Equal(t, recorded, data.Cands[0].Freq, "the frequency of the recorded run")
}

// The page's data labels a candidate linked to an accepted acronym the
// way terms --termbase does: accepting "RMS" on the page makes "root zone
// moisture sensor" its full form at once (in the reply to the action, not
// only after a reload), and not a variant of it.
func TestReviewLabelsAcronymPairs(t *testing.T) {
	dir := t.TempDir()
	docs := acronymDocs(t, dir)
	tbPath := filepath.Join(dir, "pair.gtb")
	srv := startReview(t, tbPath, "--all", docs)
	c := srv.client(t)
	const full, acr = "root zone moisture sensor", "RMS"
	ids, decs := pageDecisions(t, srv, c)
	require.Contains(t, ids, full)
	require.Contains(t, ids, acr)
	assert.Equal(t, "new", decs[ids[full]].Status)

	req, err := http.NewRequest("POST", srv.origin+"/api/act", strings.NewReader(fmt.Sprintf(`{"id":%d,"kind":"accept"}`, ids[acr])))
	require.NoError(t, err)
	req.Header.Set("Content-Type", "application/json")
	req.Header.Set("X-Glossmith-Token", srv.token)
	resp, err := c.Do(req)
	require.NoError(t, err)
	var ch struct {
		Changed map[int]decision `json:"changed"`
	}
	require.NoError(t, json.NewDecoder(resp.Body).Decode(&ch))
	resp.Body.Close()
	require.Equal(t, http.StatusOK, resp.StatusCode)
	assert.Equal(t, decision{"accepted", ""}, ch.Changed[ids[acr]])
	assert.Equal(t, decision{"full form", acr}, ch.Changed[ids[full]], "the full form's label in the reply to the accept")
	_, decs = pageDecisions(t, srv, c)
	assert.Equal(t, decision{"full form", acr}, decs[ids[full]])
	srv.stop(t)

	st := statusOf(t, "terms", "--termbase", tbPath, "--to", "jsonl", "--all", docs)
	assert.Equal(t, [2]string{"full form", acr}, st[full], "terms --termbase on the termbase the page wrote")
	assert.Equal(t, "accepted", st[acr][0])
}

// decision is the status and entry the page's data gives a candidate.
type decision struct {
	Status string `json:"status"`
	Entry  string `json:"entry"`
}

// pageDecisions reads the page's data: each candidate's id by its term,
// and the decisions by id.
func pageDecisions(t *testing.T, srv *reviewServer, c *http.Client) (ids map[string]int, decs []decision) {
	t.Helper()
	resp, err := c.Get(srv.origin + "/api/data")
	require.NoError(t, err)
	defer resp.Body.Close()
	var d struct {
		Cands []struct {
			ID   int    `json:"id"`
			Term string `json:"term"`
		} `json:"cands"`
		Decisions []decision `json:"decisions"`
	}
	require.NoError(t, json.NewDecoder(resp.Body).Decode(&d))
	ids = map[string]int{}
	for _, x := range d.Cands {
		ids[x.Term] = x.ID
	}
	return ids, d.Decisions
}

// The page of a run recorded with terms --record labels an acronym pair
// as terms --termbase does: the run keeps the link, so with "RMS"
// accepted, "root zone moisture sensor" is its full form, and with the
// full form accepted, "RMS" is its acronym.
func TestReviewRecordedRunLabelsAcronymPairs(t *testing.T) {
	dir := t.TempDir()
	docs := acronymDocs(t, dir)
	const full, acr = "root zone moisture sensor", "RMS"
	for _, tc := range []struct {
		accept    string
		full, acr decision
	}{
		{acr, decision{"full form", acr}, decision{"accepted", ""}},
		{full, decision{"accepted", ""}, decision{"acronym", full}},
	} {
		tbPath := filepath.Join(dir, tc.accept+".gtb")
		rec := run(t, "", "terms", "-q", "--termbase", tbPath, "--record", "v1", "--all", "--max-words", "5", "--to", "tsv", docs)
		require.Equal(t, 0, rec.code, rec.stderr)
		r := run(t, "", "termbase", "--termbase", tbPath, "accept", tc.accept)
		require.Equal(t, 0, r.code, r.stderr)
		want := statusOf(t, "terms", "--termbase", tbPath, "--to", "jsonl", "--all", "--max-words", "5", docs)

		srv := startReview(t, tbPath, "--run", "v1")
		ids, decs := pageDecisions(t, srv, srv.client(t))
		require.Contains(t, ids, full)
		require.Contains(t, ids, acr)
		assert.Equal(t, tc.full, decs[ids[full]], "%s with %s accepted", full, tc.accept)
		assert.Equal(t, tc.acr, decs[ids[acr]], "%s with %s accepted", acr, tc.accept)
		assert.Equal(t, want[full][0], decs[ids[full]].Status, "terms --termbase labels %s alike", full)
		assert.Equal(t, want[acr][0], decs[ids[acr]].Status, "terms --termbase labels %s alike", acr)
		srv.stop(t)
	}
}
