package main

import (
	"context"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"sync"
	"testing"
	"time"

	"github.com/chromedp/cdproto/cdp"
	"github.com/chromedp/cdproto/input"
	"github.com/chromedp/cdproto/network"
	"github.com/chromedp/chromedp"
	"github.com/chromedp/chromedp/kb"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// findChromium returns the browser the page tests drive. Without one they
// skip, except under CI=true, where .ci/run installs Debian's chromium.
func findChromium(t testing.TB) string {
	t.Helper()
	for _, name := range []string{"chromium", "chromium-browser", "google-chrome"} {
		if p, err := exec.LookPath(name); err == nil {
			return p
		}
	}
	if os.Getenv("CI") == "true" {
		t.Fatal("no chromium on PATH under CI: .ci/run installs the Debian package chromium")
	}
	t.Skip("no chromium on PATH: install it (apt-get install chromium) to run the browser tests")
	return ""
}

// pageWatch records what a page did that it must not: console errors and
// warnings (the browser logs a blocked request or a broken policy there),
// uncaught exceptions, and requests to anywhere but the allowed places.
type pageWatch struct {
	mu       sync.Mutex
	errors   []string
	requests []string
	allow    func(string) bool
}

func (w *pageWatch) request(ev any) {
	if e, ok := ev.(*network.EventRequestWillBeSent); ok {
		w.mu.Lock()
		defer w.mu.Unlock()
		if !w.allow(e.Request.URL) {
			w.requests = append(w.requests, e.Request.URL)
		}
	}
}

func (w *pageWatch) console(m chromedp.ConsoleMessage) {
	if m.Type == chromedp.ConsoleError || m.Type == chromedp.ConsoleWarning || m.IsException() {
		w.mu.Lock()
		defer w.mu.Unlock()
		w.errors = append(w.errors, m.String())
	}
}

func (w *pageWatch) check(t testing.TB) {
	t.Helper()
	w.mu.Lock()
	defer w.mu.Unlock()
	assert.Empty(t, w.errors, "console errors, warnings or exceptions")
	assert.Empty(t, w.requests, "requests to other places")
}

// newBrowser starts a headless chromium with an empty profile and the flags
// this machine needs, and returns a tab's context, watched by w.
func newBrowser(t testing.TB, w *pageWatch) context.Context {
	t.Helper()
	exe := findChromium(t)
	opts := []chromedp.ExecAllocatorOption{
		chromedp.ExecPath(exe),
		chromedp.Flag("headless", true),
		chromedp.Flag("no-sandbox", true),
		chromedp.Flag("disable-gpu", true),
		chromedp.Flag("disable-quic", true),
		chromedp.Flag("no-first-run", true),
		chromedp.Flag("disable-background-networking", true),
		chromedp.Flag("disable-component-update", true),
		chromedp.Flag("disable-sync", true),
		chromedp.UserDataDir(t.TempDir()),
		chromedp.WindowSize(1400, 900),
	}
	actx, cancelA := chromedp.NewExecAllocator(context.Background(), opts...)
	ctx, cancelC := chromedp.NewContext(actx, chromedp.WithListener(w.request))
	t.Cleanup(func() { cancelC(); cancelA() })
	require.NoError(t, chromedp.Do(ctx), "starting chromium")
	messages := chromedp.Console(ctx)
	go func() {
		for m, err := range messages {
			if err != nil {
				return
			}
			w.console(m)
		}
	}()
	// A hang fails the test instead of the whole run (the browser's own
	// context has no deadline: it would end the browser).
	tctx, cancelT := context.WithTimeout(ctx, 120*time.Second)
	t.Cleanup(cancelT)
	return tctx
}

// rowStatus returns the status chip of the candidate row with this term.
func rowStatus(ctx context.Context, term string) (string, error) {
	return chromedp.Run(ctx, chromedp.Evaluate[string](fmt.Sprintf(`(() => {
		for (const tr of document.querySelectorAll('#gs-rows tr')) {
			if (tr.children[1].textContent === %q) return tr.children[2].textContent;
		}
		return '';
	})()`, term)))
}

// rowXPath finds the table row of a term.
func rowXPath(term string) string {
	return fmt.Sprintf(`//tbody[@id="gs-rows"]/tr[td[2][text()=%q]]`, term)
}

// idle waits until the page has no request on its way and has drawn what
// the answers changed (the page sets body[data-idle] for this): what an
// action changed on the server is then on the page, whatever the load.
var idle = chromedp.WaitReady(chromedp.CSS(`body[data-idle="yes"]`))

// showTerm filters the table down to the candidate, selects it and takes
// the focus from the filter so that keys go to the page. The click starts
// the detail request at once, so idle after it means the detail shown is
// this candidate's, even when the pane showed the same term before.
func showTerm(term string) chromedp.Action[chromedp.Void] {
	return chromedp.Steps(
		chromedp.Evaluate[chromedp.Void](fmt.Sprintf(`(() => { const q = document.getElementById('gs-q'); q.value = %q; q.dispatchEvent(new Event('input')); })()`, term)),
		chromedp.Click(rowXPath(term)),
		idle,
		chromedp.WaitVisible(fmt.Sprintf(`//h2/span[@id="gs-term"][text()=%q]`, term)),
		chromedp.Evaluate[chromedp.Void](`document.activeElement.blur()`),
	)
}

// lateKey types a printable key whose character event comes late after its
// keydown, as it does when the process sending them is short of CPU: the
// page must not tell the two apart by time.
func lateKey(r rune, late time.Duration) chromedp.Action[chromedp.Void] {
	return chromedp.Func(func(ctx context.Context, t *chromedp.Target) error {
		for i, k := range kb.Encode(r) {
			if k.Type == kb.KeyChar && i > 0 {
				time.Sleep(late)
			}
			if _, err := cdp.Call(ctx, t, input.DispatchKeyEvent, *k); err != nil {
				return err
			}
		}
		return nil
	})
}

// screenshot saves the page as a PNG in dir, or in $GLOSSMITH_SCREENSHOTS
// when set (to look at it, or to update the one in docs/).
func screenshot(ctx context.Context, dir, name string) {
	if d := os.Getenv("GLOSSMITH_SCREENSHOTS"); d != "" {
		dir = d
	}
	if png, err := chromedp.Run(ctx, chromedp.CaptureScreenshot()); err == nil {
		_ = os.WriteFile(filepath.Join(dir, name), png, 0o644)
	}
}
