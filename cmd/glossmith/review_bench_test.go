package main

import (
	"bufio"
	"fmt"
	"net"
	"net/http"
	"os/exec"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"

	"github.com/chromedp/chromedp"
	"github.com/stretchr/testify/require"

	"glossmith/extract/review"
	"glossmith/extract/review/tbstore"
	"glossmith/extract/review/web"
	"glossmith/extract/termbase"
	"glossmith/extract/terms"
)

// syntheticDataset makes n candidates over 200 documents, each with the
// detail a real one has (variants, spread, four contexts, collocates), for
// the page's speed with many candidates.
func syntheticDataset(n int) *review.Dataset {
	words := strings.Fields("valve sensor zone pump panel emitter line cable relay filter nozzle probe meter board fan heater vent screen tank hose")
	ds := &review.Dataset{Source: fmt.Sprintf("%d synthetic candidates", n)}
	for d := range 200 {
		ds.Docs = append(ds.Docs, fmt.Sprintf("manual-%03d.md", d))
		ds.DocSizes = append(ds.DocSizes, 5000)
	}
	for i := range n {
		term := fmt.Sprintf("%s %s %d", words[i%len(words)], words[(i/len(words))%len(words)], i)
		ds.Candidates = append(ds.Candidates, review.Candidate{ID: i, Rank: i + 1, Term: term, POS: "NOUN NOUN NUM", Words: 3,
			Freq: 1 + (n-i)/50, Docs: 1 + i%7, Score: float64(n-i) / 100, Keyness: 12.5, Weirdness: 40, CValue: 3, DP: 0.5})
		det := review.Detail{Variants: []terms.Variant{{Form: term, Count: 2}, {Form: strings.ToUpper(term[:1]) + term[1:], Count: 1}}}
		for k := range 4 {
			det.PerDoc = append(det.PerDoc, [2]int{(i + 37*k) % 200, 1 + k})
			det.Contexts = append(det.Contexts, review.Context{Doc: (i + k) % 200, Line: 10 + k,
				Text: "Check that the " + term + " is fitted before the controller is switched on again."})
		}
		det.Collocates = []review.Collocate{{Relation: "adj_noun", Word: "main", Head: words[i%len(words)], Freq: 3, LogDice: 11.2}}
		ds.Details = append(ds.Details, det)
	}
	return ds
}

// serveDataset serves ds with decisions in a new termbase, in process.
func serveDataset(b *testing.B, ds *review.Dataset) (addr, origin, token string) {
	tb, err := termbase.Open(filepath.Join(b.TempDir(), "bench.gtb"))
	require.NoError(b, err)
	b.Cleanup(func() { tb.Close() })
	srv, err := web.New(ds, tbstore.New(tb, ds))
	require.NoError(b, err)
	ln, addr, err := srv.Listen("127.0.0.1:0")
	require.NoError(b, err)
	hs := &http.Server{Handler: srv.Handler()}
	go hs.Serve(ln)
	b.Cleanup(func() { hs.Close() })
	return addr, "http://" + ln.Addr().(*net.TCPAddr).String(), srv.Token()
}

// BenchmarkReviewFirstPaint loads the review page of 10,000 candidates in
// chromium and reports the time from the navigation to the first frame
// with the table (ms/paint). Run with -benchtime 5x.
func BenchmarkReviewFirstPaint(b *testing.B) {
	addr, origin, _ := serveDataset(b, syntheticDataset(10000))
	w := &pageWatch{allow: func(u string) bool { return strings.HasPrefix(u, origin+"/") }}
	ctx := newBrowser(b, w)
	require.NoError(b, chromedp.Do(ctx, chromedp.Navigate(addr), chromedp.WaitVisible(chromedp.CSS(`body[data-ready="yes"]`))))
	var total float64
	b.ResetTimer()
	for range b.N {
		require.NoError(b, chromedp.Do(ctx, chromedp.Navigate(origin+"/"), chromedp.WaitVisible(chromedp.CSS(`body[data-ready="yes"]`))))
		ms, err := chromedp.Run(ctx, chromedp.Evaluate[float64](`window.gsReadyAt`))
		require.NoError(b, err)
		total += ms
	}
	b.ReportMetric(total/float64(b.N), "ms/paint")
	w.check(b)
}

// BenchmarkReviewAction posts decisions to the review server as the page
// does — accept and reject in turn — each saved in the termbase (one
// transaction) and read back: the round trip of one action, over 10,000
// candidates.
func BenchmarkReviewAction(b *testing.B) {
	ds := syntheticDataset(10000)
	_, origin, token := serveDataset(b, ds)
	c := &http.Client{}
	kinds := []string{"accept", "reject"}
	b.ResetTimer()
	for i := range b.N {
		body := fmt.Sprintf(`{"id":%d,"kind":%q}`, i%200, kinds[(i/200)%2])
		req, _ := http.NewRequest("POST", origin+"/api/act", strings.NewReader(body))
		req.Header.Set("Content-Type", "application/json")
		req.Header.Set("X-Glossmith-Token", token)
		req.AddCookie(&http.Cookie{Name: "glossmith_review", Value: token})
		resp, err := c.Do(req)
		require.NoError(b, err)
		resp.Body.Close()
		require.Equal(b, 200, resp.StatusCode)
	}
}

// BenchmarkReviewReady starts `glossmith review` on the demo corpus with a
// new termbase and times it to the address on its first line: extraction,
// termbase and server ready.
func BenchmarkReviewReady(b *testing.B) {
	for range b.N {
		b.StopTimer()
		cmd := exec.Command(binary, "review", "-q", "--termbase", filepath.Join(b.TempDir(), "r.gtb"), "testdata/demo")
		cmd.Dir = "../.."
		out, err := cmd.StdoutPipe()
		require.NoError(b, err)
		b.StartTimer()
		require.NoError(b, cmd.Start())
		sc := bufio.NewScanner(out)
		require.True(b, sc.Scan(), "no address")
		b.StopTimer()
		require.True(b, strings.HasPrefix(sc.Text(), "http://127.0.0.1:"))
		cmd.Process.Signal(syscall.SIGINT)
		done := make(chan error, 1)
		go func() { done <- cmd.Wait() }()
		select {
		case <-done:
		case <-time.After(10 * time.Second):
			cmd.Process.Kill()
		}
		b.StartTimer()
	}
}
