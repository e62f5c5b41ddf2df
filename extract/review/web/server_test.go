package web

import (
	"bytes"
	"crypto/sha256"
	"encoding/base64"
	"encoding/json"
	"net/http"
	"net/url"
	"regexp"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/extract/review"
	"glossmith/extract/terms"
)

// memStore keeps decisions in memory, with a history for Undo: enough to
// test the server's handling; the termbase itself is tested with the page
// in cmd/glossmith.
type memStore struct {
	d       map[string]review.Decision
	history []map[string]review.Decision
}

func (m *memStore) Lookup(names []string) (map[string]review.Decision, error) {
	out := map[string]review.Decision{}
	for _, n := range names {
		if d, ok := m.d[n]; ok {
			out[n] = d
		}
	}
	return out, nil
}

func (m *memStore) Apply(a review.Action) error {
	old := map[string]review.Decision{}
	for k, v := range m.d {
		old[k] = v
	}
	m.history = append(m.history, old)
	d := m.d[a.Term]
	switch a.Kind {
	case review.Accept:
		d.Status = review.Accepted
	case review.Reject:
		d.Status = review.Rejected
	case review.Note:
		d.Note = a.Text
	case review.Merge:
		m.d[a.Other] = review.Decision{Status: review.Variant, Entry: a.Term}
	}
	m.d[a.Term] = d
	return nil
}

func (m *memStore) Undo() (bool, error) {
	if len(m.history) == 0 {
		return false, nil
	}
	m.d = m.history[len(m.history)-1]
	m.history = m.history[:len(m.history)-1]
	return true, nil
}

func testDataset() *review.Dataset {
	ds := &review.Dataset{Docs: []string{"a.txt"}, DocSizes: []int{10}}
	for i, term := range []string{"valve", "solenoid valve", "valve <b>box</b>"} {
		ds.Candidates = append(ds.Candidates, review.Candidate{ID: i, Rank: i + 1, Term: term, Freq: 3 - i, Docs: 1})
		ds.Details = append(ds.Details, review.Detail{Variants: []terms.Variant{{Form: term, Count: 3 - i}},
			Contexts: []review.Context{{Doc: 0, Line: 1, Text: "The " + term + " </script><script>alert(1)</script> closes."}}})
	}
	return ds
}

// session is a server on a free loopback port and a client holding its
// cookie.
func session(t *testing.T, st review.Store) (base, token string, c *http.Client) {
	srv, err := New(testDataset(), st)
	require.NoError(t, err)
	ln, addr, err := srv.Listen("127.0.0.1:0")
	require.NoError(t, err)
	hs := &http.Server{Handler: srv.Handler()}
	go hs.Serve(ln)
	t.Cleanup(func() { hs.Close() })
	jar := &cookieJar{}
	c = &http.Client{Jar: jar}
	resp, err := c.Get(addr)
	require.NoError(t, err)
	resp.Body.Close()
	require.Equal(t, 200, resp.StatusCode)
	require.NotEmpty(t, jar.cookies, "the token became a cookie")
	return strings.TrimSuffix(addr[:strings.Index(addr, "?")], "/"), srv.Token(), c
}

type cookieJar struct{ cookies []*http.Cookie }

func (j *cookieJar) SetCookies(_ *url.URL, cs []*http.Cookie) { j.cookies = append(j.cookies, cs...) }
func (j *cookieJar) Cookies(*url.URL) []*http.Cookie          { return j.cookies }

func post(t *testing.T, c *http.Client, url, token string, body any) (int, review.Decision, int) {
	b, _ := json.Marshal(body)
	req, _ := http.NewRequest("POST", url, bytes.NewReader(b))
	req.Header.Set("Content-Type", "application/json")
	req.Header.Set(tokenHeader, token)
	resp, err := c.Do(req)
	require.NoError(t, err)
	defer resp.Body.Close()
	var ch change
	if resp.StatusCode == 200 {
		require.NoError(t, json.NewDecoder(resp.Body).Decode(&ch))
	}
	return resp.StatusCode, ch.Changed[0], ch.Reviewed
}

func TestActionsRoundTrip(t *testing.T) {
	st := &memStore{d: map[string]review.Decision{}}
	base, token, c := session(t, st)
	code, d, n := post(t, c, base+"/api/act", token, map[string]any{"id": 0, "kind": "accept"})
	require.Equal(t, 200, code)
	assert.Equal(t, review.Accepted, d.Status)
	assert.Equal(t, 1, n, "reviewed")
	code, _, _ = post(t, c, base+"/api/act", token, map[string]any{"id": 0, "kind": "merge", "other": 1})
	require.Equal(t, 200, code)
	assert.Equal(t, review.Variant, st.d["solenoid valve"].Status)
	code, _, _ = post(t, c, base+"/api/act", token, map[string]any{"id": 9, "kind": "accept"})
	assert.Equal(t, 404, code, "no such candidate")
	code, _, _ = post(t, c, base+"/api/act", token, map[string]any{"id": 0, "kind": "erase"})
	assert.Equal(t, 400, code, "no such action")
	code, _, _ = post(t, c, base+"/api/act", "wrong", map[string]any{"id": 0, "kind": "reject"})
	assert.Equal(t, 403, code, "a wrong token header")
	code, _, n = post(t, c, base+"/api/undo", token, struct{}{})
	require.Equal(t, 200, code)
	assert.Equal(t, 1, n, "the merge undone, the acceptance kept")
	_, there := st.d["solenoid valve"]
	assert.False(t, there, "the merge undone")
}

func TestCookieAndHeaders(t *testing.T) {
	srv, err := New(testDataset(), &memStore{d: map[string]review.Decision{}})
	require.NoError(t, err)
	ln, addr, err := srv.Listen("127.0.0.1:0")
	require.NoError(t, err)
	hs := &http.Server{Handler: srv.Handler()}
	go hs.Serve(ln)
	defer hs.Close()
	c := &http.Client{CheckRedirect: func(*http.Request, []*http.Request) error { return http.ErrUseLastResponse }}
	resp, err := c.Get(addr)
	require.NoError(t, err)
	resp.Body.Close()
	assert.Equal(t, http.StatusSeeOther, resp.StatusCode)
	assert.Equal(t, "/", resp.Header.Get("Location"), "the token leaves the address")
	set := resp.Header.Get("Set-Cookie")
	assert.Contains(t, set, "HttpOnly")
	assert.Contains(t, set, "SameSite=Strict")
	assert.Contains(t, resp.Header.Get("Content-Security-Policy"), "default-src 'none'")
	assert.Equal(t, "no-referrer", resp.Header.Get("Referrer-Policy"))
}

// The report's data cannot end its script element, whatever the documents
// say, and the script the page runs is the one its policy names by hash.
func TestReportEscapesAndPins(t *testing.T) {
	var b bytes.Buffer
	require.NoError(t, WriteReport(&b, testDataset()))
	page := b.String()
	assert.NotContains(t, page, "<script>alert(1)")
	assert.NotContains(t, page, "<b>box</b>")
	assert.Equal(t, 2, strings.Count(page, "</script>"), "only the page's own two script elements end")
	m := regexp.MustCompile(`(?s)<script>(.*?)</script>`).FindStringSubmatch(page)
	require.NotNil(t, m)
	sum := sha256.Sum256([]byte(m[1]))
	assert.Contains(t, page, "script-src 'sha256-"+base64.StdEncoding.EncodeToString(sum[:])+"'")
	assert.Contains(t, page, "connect-src 'none'")
}

// A reload of the page shows decisions made since by others (termbase
// commands, another page), not those the server saw at its start.
func TestDataReadsTheStoreAgain(t *testing.T) {
	st := &memStore{d: map[string]review.Decision{}}
	base, _, c := session(t, st)
	get := func() []review.Decision {
		resp, err := c.Get(base + "/api/data")
		require.NoError(t, err)
		defer resp.Body.Close()
		require.Equal(t, 200, resp.StatusCode)
		var d dataReply
		require.NoError(t, json.NewDecoder(resp.Body).Decode(&d))
		return d.Decisions
	}
	assert.Equal(t, review.New, get()[1].Status)
	st.d["solenoid valve"] = review.Decision{Status: review.Rejected} // decided elsewhere
	assert.Equal(t, review.Rejected, get()[1].Status)
}
